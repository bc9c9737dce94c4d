"""Reidemeister moves on a mutable working copy of a PD code.

:class:`Work` holds the crossings of a diagram as mutable 4-lists in the PD
convention (slot 0 the incoming under-strand, slots counterclockwise), the crossing
signs, and for every edge label its two slots.  A move replaces a few crossings and
splices edges by merging labels; labels need not stay consecutive while moves run,
:meth:`Work.to_diagram` numbers the edges again along every component and validates
the result.  Every move here keeps the slot convention (slot 0 stays the incoming
under-strand), the sign of every surviving crossing and the orientation of every
component, so the output is a diagram of the same oriented link.

Moves (K. Reidemeister, "Elementare Begründung der Knotentheorie", Abh. Math. Sem.
Univ. Hamburg 5, 1927):

* R1: a crossing with a one-edge loop (a label twice at one crossing) is removed;
* R2: a bigon face whose two edges are one over-strand and one under-strand at both
  corners is removed (two crossings);
* R3: a triangle face that is not alternating (one strand over, or under, at both of
  its corners) is flipped: every strand's two crossings swap their order along it;
* nugatory crossings (a face meets the crossing at two opposite corners, so a circle
  meets the diagram only there) are removed by turning one side over (reflection of
  the plane together with the exchange of over and under, an isotopy), which keeps
  the sign of every crossing on that side.

A face is traced as in :attr:`Diagram.faces`: leave along slot ``(i, s)``, arrive at
the twin ``(j, t)``, continue from ``(j, t + 1)``.
"""

from __future__ import annotations

from typing import Optional

from ..errors import DiagramError
from .diagram import Diagram

__all__ = ["Work"]


class Work:
    """Mutable diagram for Reidemeister moves (crossing ids are stable ints)."""

    def __init__(self, diagram: Diagram) -> None:
        self.x: dict[int, list[int]] = {i: list(t) for i, t in enumerate(diagram.pd)}
        self.sign: dict[int, int] = dict(enumerate(diagram.signs))
        self.where: dict[int, list[tuple[int, int]]] = {}
        for i, t in self.x.items():
            for s, v in enumerate(t):
                self.where.setdefault(v, []).append((i, s))
        self.free_loops = diagram.free_loops

    @classmethod
    def from_parts(cls, crossings: dict[int, list[int]], signs: dict[int, int],
                   free_loops: int = 0) -> "Work":
        """A working copy from PD 4-lists (slot 0 incoming under) and their signs; each
        label must sit on exactly two slots (checked again by :meth:`to_diagram`)."""
        w = cls.__new__(cls)
        w.x = {i: list(t) for i, t in crossings.items()}
        w.sign = dict(signs)
        w.where = {}
        for i, t in w.x.items():
            for s, v in enumerate(t):
                w.where.setdefault(v, []).append((i, s))
        w.free_loops = free_loops
        return w

    # ------------------------------------------------------------------ basics
    def __len__(self) -> int:
        return len(self.x)

    def twin(self, i: int, s: int) -> tuple[int, int]:
        a, b = self.where[self.x[i][s]]
        return b if a == (i, s) else a

    def neighbours(self, i: int) -> set[int]:
        return {self.twin(i, s)[0] for s in range(4)}

    def _splice(self, dead: list[int], pairs: list[tuple[int, int]]) -> set[int]:
        """Delete crossings ``dead`` and join labels in ``pairs`` (each pair becomes one
        edge or, closing up, a free loop).  Returns the crossings touching new edges."""
        dead_set = set(dead)
        labels = {v for p in pairs for v in p}
        for i in dead:
            for v in self.x[i]:
                if v not in labels:
                    self.where.pop(v, None)   # an edge inside the removed crossings
            del self.x[i]
            del self.sign[i]
        parent: dict[int, int] = {}

        def find(v: int) -> int:
            while parent.get(v, v) != v:
                v = parent[v]
            return v

        for u, v in pairs:
            ru, rv = find(u), find(v)
            if ru != rv:
                parent[max(ru, rv)] = min(ru, rv)
        touched: set[int] = set()
        alive: dict[int, list[tuple[int, int]]] = {}
        for v in labels:
            slots = [sl for sl in self.where.pop(v) if sl[0] not in dead_set]
            alive.setdefault(find(v), []).extend((v, sl) for sl in slots)
        for r, ends in alive.items():
            if not ends:
                continue
            if len(ends) != 2:
                raise DiagramError(f"internal: splice left label {r} on {len(ends)} slots")
            self.where[r] = []
            for _, (i, s) in ends:
                self.x[i][s] = r
                self.where[r].append((i, s))
                touched.add(i)
        roots = {find(v) for v in labels}
        self.free_loops += sum(1 for r in roots if r not in alive or not alive[r])
        return touched

    # ------------------------------------------------------------------ R1
    def r1_at(self, i: int) -> Optional[int]:
        """Slot s with label at s and s+1 equal (a kink), else None."""
        t = self.x[i]
        for s in range(4):
            if t[s] == t[(s + 1) % 4]:
                return s
        return None

    def do_r1(self, i: int, s: int) -> set[int]:
        t = self.x[i]
        return self._splice([i], [(t[(s + 2) % 4], t[(s + 3) % 4])])

    # ------------------------------------------------------------------ R2
    def r2_at(self, i: int) -> Optional[tuple[int, int, int]]:
        """A removable bigon at crossing i: (s, j, t) with the bigon edges at (i, s-1),
        (i, s) and (j, t), (j, t+1); else None."""
        for s in range(4):
            j, t = self.twin(i, s)
            if j == i:
                continue
            k, u = self.twin(j, (t + 1) % 4)
            if k == i and (u + 1) % 4 == s and (s - t) % 2 == 0:
                return s, j, t
        return None

    def do_r2(self, i: int, s: int, j: int, t: int) -> set[int]:
        xi, xj = self.x[i], self.x[j]
        # strand through the bigon edge at (i, s) / (j, t): outer ends (i, s+2), (j, t+2)
        # strand through (i, s-1) / (j, t+1): outer ends (i, s+1), (j, t+3)
        pairs = [(xi[(s + 2) % 4], xj[(t + 2) % 4]), (xi[(s + 1) % 4], xj[(t + 3) % 4])]
        return self._splice([i, j], pairs)

    # ------------------------------------------------------------------ R3
    def triangle_at(self, i: int, s: int) -> Optional[tuple[int, int, int, int, int]]:
        """The triangle face through the corner leaving (i, s), as (i, x, j, y, k, z)
        without i: returns (x, j, y, k, z) with faces edges (i,x)-(j,y), (j,y+1)-(k,z),
        (k,z+1)-(i,x-1); None if that face is not a triangle of distinct crossings."""
        j, y = self.twin(i, s)
        k, z = self.twin(j, (y + 1) % 4)
        m, w = self.twin(k, (z + 1) % 4)
        if m != i or (w + 1) % 4 != s or len({i, j, k}) < 3:
            return None
        return s, j, y, k, z

    def r3_ok(self, i: int, x: int, j: int, y: int, k: int, z: int) -> bool:
        """A triangle admits R3 unless it is alternating (each strand over at one corner
        and under at the other).  Strand P: slots x (at i), y (at j); Q: y+1, z; R: z+1, x-1;
        a slot is over iff it is odd."""
        p = (x % 2) == (y % 2)
        q = ((y + 1) % 2) == (z % 2)
        r = ((z + 1) % 2) == ((x - 1) % 2)
        return p or q or r

    def do_r3(self, i: int, x: int, j: int, y: int, k: int, z: int) -> set[int]:
        X, Y, Z = self.x[i], self.x[j], self.x[k]
        L = lambda t, s: t[s % 4]  # noqa: E731
        ext = {"Z3": L(Z, z + 3), "Y2": L(Y, y + 2), "X2": L(X, x + 2), "Z2": L(Z, z + 2),
               "Y3": L(Y, y + 3), "X1": L(X, x + 1)}
        p, q, r = L(X, x), L(Y, y + 1), L(Z, z + 1)   # reuse the three inner labels
        new = {(i, x - 1): ext["Z3"], (i, x): ext["Y2"], (i, x + 1): r, (i, x + 2): p,
               (j, y): ext["X2"], (j, y + 1): ext["Z2"], (j, y + 2): p, (j, y + 3): q,
               (k, z): ext["Y3"], (k, z + 1): ext["X1"], (k, z + 2): q, (k, z + 3): r}
        labels = set(new.values())
        for v in labels:
            self.where[v] = [sl for sl in self.where[v] if sl[0] not in (i, j, k)]
        for (c, s), v in new.items():
            self.x[c][s % 4] = v
            self.where[v].append((c, s % 4))
        out = {i, j, k}
        for c in (i, j, k):
            out |= self.neighbours(c)
        return out

    # ------------------------------------------------------------------ nugatory
    def nugatory(self) -> list[int]:
        """Crossing ids met twice by one face (sorted), read from the validated diagram."""
        if not self.x:
            return []
        from .simplify import nugatory_crossings
        ids = sorted(self.x)
        return [ids[k] for k in nugatory_crossings(self.to_diagram())]

    def _side(self, i: int, s: int) -> set[int]:
        """Crossings reachable from the edge at (i, s) without passing crossing i."""
        start = self.twin(i, s)[0]
        seen, stack = {start}, [start]
        while stack:
            c = stack.pop()
            for u in range(4):
                d = self.twin(c, u)[0]
                if d != i and d not in seen:
                    seen.add(d)
                    stack.append(d)
        return seen

    def do_nugatory(self, i: int) -> set[int]:
        """Remove nugatory crossing i (no kink at i) by turning the smaller side over."""
        side = self._side(i, 0)
        reached = [s for s in range(4) if self.twin(i, s)[0] in side]
        if len(reached) != 2:
            raise DiagramError(f"internal: crossing {i} is not nugatory")
        other = self._side(i, next(s for s in range(4) if s not in reached))
        flip = side if len(side) <= len(other) else other
        labels = {v for c in flip for v in self.x[c]}
        for v in labels:
            self.where[v] = [sl for sl in self.where[v] if sl[0] not in flip]
        for c in flip:
            a, b, cc, d = self.x[c]
            self.x[c] = [d, cc, b, a] if self.sign[c] > 0 else [b, a, d, cc]
            for s, v in enumerate(self.x[c]):
                self.where[v].append((c, s))
        t = self.x[i]
        return self._splice([i], [(t[0], t[2]), (t[1], t[3])])

    # ------------------------------------------------------------------ output
    def to_diagram(self) -> Diagram:
        """Number the edges 1..2n component by component and validate.

        A component starts at the edge entering its lowest-listed crossing, so a
        component passing only over (two edges) gets the smaller label entering the
        first listed crossing it meets, as the PD contract asks.  Raises DiagramError
        if the result is not a valid diagram with the tracked crossing signs.
        """
        ids = sorted(self.x)
        pos = {c: n for n, c in enumerate(ids)}
        new_label: dict[int, int] = {}
        nxt = 1
        head: dict[int, tuple[int, int]] = {}      # label -> slot it enters
        for c in ids:
            t = self.x[c]
            ins = (0, 3) if self.sign[c] > 0 else (0, 1)
            for s in ins:
                head[t[s]] = (c, s)
        starts = sorted(((pos[c], s), v) for v, (c, s) in head.items())
        for (_, _), v in starts:
            if v in new_label:
                continue
            cur = v
            while cur not in new_label:
                new_label[cur] = nxt
                nxt += 1
                c, s = head[cur]
                cur = self.x[c][(s + 2) % 4]
        pd = [tuple(new_label[v] for v in self.x[c]) for c in ids]
        if not pd and self.free_loops == 0:
            raise DiagramError("internal: simplification emptied the diagram")
        d = Diagram.from_pd(pd, free_loops=self.free_loops)
        if tuple(self.sign[c] for c in ids) != d.signs:
            raise DiagramError("internal: crossing signs changed while simplifying")
        return d
