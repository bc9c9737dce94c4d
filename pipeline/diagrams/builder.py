"""Build PD codes from planar pieces: crossings wired together, plus tangle algebra.

Family generators never write PD labels by hand.  They place crossings, each with
four slots numbered counterclockwise, say which slot pair is the over-strand, and
wire slots together (possibly through crossingless pass-through *wires*).  The
builder then walks every component, numbers the edges consecutively along it and
rotates each crossing tuple to start at its incoming under-strand, which yields a
PD code in the contract convention (README.md) whose handedness is the geometric
one of the construction.

The tangle layer implements Conway's tangle calculus on 4-ended tangles with ends
NW, NE, SW, SE: horizontal twisting (fraction F -> F + n), vertical twisting
(1/F -> 1/F + n), tangle sum, and the numerator closure N(T) joining NW-NE and
SW-SE.  A rational tangle with fraction p/q closes to the two-bridge link of
determinant |p|; a sum of rational tangles closes to a Montesinos link.

References
----------
1. J. H. Conway, "An enumeration of knots and links, and some of their algebraic
   properties", Computational Problems in Abstract Algebra (1970).
2. L. H. Kauffman, S. Lambropoulou, "On the classification of rational knots",
   L'Enseignement Math. 49 (2003).
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Optional

from .diagram import Diagram

__all__ = ["PlanarBuilder", "Tangle", "rational_tangle", "tangle_sum", "numerator_closure"]

End = tuple[int, int]  # (node id, slot)


class PlanarBuilder:
    """Crossings and pass-through wires joined slot to slot.

    Node kinds: a crossing has slots 0..3 counterclockwise and an over pair
    (slots 1,3 or 0,2); a wire has slots 0 and 1 joined straight through.
    """

    def __init__(self) -> None:
        self.kind: list[str] = []          # "x" or "w"
        self.over_odd: list[bool] = []     # crossings: over-strand on slots 1,3
        self.link: dict[End, End] = {}

    def crossing(self, over_odd: bool) -> int:
        self.kind.append("x")
        self.over_odd.append(over_odd)
        return len(self.kind) - 1

    def wire(self) -> int:
        self.kind.append("w")
        self.over_odd.append(False)
        return len(self.kind) - 1

    def join(self, p: End, q: End) -> None:
        if p in self.link or q in self.link:
            raise RuntimeError(f"builder: slot joined twice ({p}, {q})")
        self.link[p] = q
        self.link[q] = p

    def _through(self, e: End) -> End:
        n, s = e
        return (n, (s + 2) % 4) if self.kind[n] == "x" else (n, 1 - s)

    def diagram(self, entries: Optional[list[End]] = None) -> Diagram:
        """Number the edges and return the :class:`Diagram`.

        ``entries`` lists preferred entry slots: a component through one of them is
        oriented to enter there (first match wins); other components enter the
        under-strand of their first crossing at its lowest free-slot position.
        """
        nodes = range(len(self.kind))
        xs = [n for n in nodes if self.kind[n] == "x"]
        entered: dict[End, bool] = {}
        prefs = list(entries or [])
        for n in nodes:
            for s in range(4 if self.kind[n] == "x" else 2):
                if (n, s) not in self.link:
                    raise RuntimeError(f"builder: slot {(n, s)} left open")
        # candidate starts: preferred entries, then every crossing slot in order
        starts = prefs + [(n, s) for n in xs for s in (0, 1)]
        label_at: dict[End, int] = {}
        next_label = 1
        free_loops = 0
        visited_nodes_slots: set[End] = set()
        for st in starts:
            if st in visited_nodes_slots or (st[0], (st[1] + 2) % 4) in visited_nodes_slots:
                continue
            # walk the component entering at st
            comp_edges: list[tuple[End, End]] = []  # (leave slot, enter slot) per edge
            cur = st
            while True:
                visited_nodes_slots.add(cur)
                out = self._through(cur)
                visited_nodes_slots.add(out)
                # follow wires until a crossing slot is entered
                nxt = self.link[out]
                while self.kind[nxt[0]] == "w":
                    visited_nodes_slots.add(nxt)
                    o2 = self._through(nxt)
                    visited_nodes_slots.add(o2)
                    nxt = self.link[o2]
                comp_edges.append((out, nxt))
                entered[nxt] = True
                cur = nxt
                if cur == st:
                    break
            # edge arriving at st is the last in comp_edges; label it first
            n_e = len(comp_edges)
            seq = [comp_edges[-1]] + comp_edges[:-1]
            for k, (leave, enter) in enumerate(seq):
                label_at[leave] = next_label + k
                label_at[enter] = next_label + k
            next_label += n_e
        # wire-only loops
        for n in nodes:
            if self.kind[n] == "w" and (n, 0) not in visited_nodes_slots:
                cur = (n, 0)
                while cur not in visited_nodes_slots:
                    visited_nodes_slots.add(cur)
                    o = self._through(cur)
                    visited_nodes_slots.add(o)
                    cur = self.link[o]
                free_loops += 1
        pd = []
        for n in xs:
            under = (0, 2) if self.over_odd[n] else (1, 3)
            start = under[0] if (n, under[0]) in entered else under[1]
            labels = [label_at[(n, (start + k) % 4)] for k in range(4)]
            pd.append(tuple(labels))
        return Diagram.from_pd(pd, free_loops=free_loops)


# ---------------------------------------------------------------------- tangles
@dataclass
class Tangle:
    """A 4-ended tangle inside a builder: the ends are builder slots."""

    b: PlanarBuilder
    nw: End
    ne: End
    sw: End
    se: End


def _crossing_tangle(b: PlanarBuilder, sign: int) -> Tangle:
    """One crossing seen as a tangle.  Slots counterclockwise: 0=SW, 1=SE, 2=NE, 3=NW.

    ``sign`` +1 draws the over-strand from NW to SE (slots 3-1), the picture that
    makes the horizontal twist [n], n > 0, close to the positive torus link T(2, n).
    """
    x = b.crossing(over_odd=(sign > 0))
    return Tangle(b, nw=(x, 3), ne=(x, 2), sw=(x, 0), se=(x, 1))


def _wire_tangle(b: PlanarBuilder, horizontal: bool) -> Tangle:
    w1, w2 = b.wire(), b.wire()
    if horizontal:  # the 0 tangle: arcs NW-NE and SW-SE
        return Tangle(b, nw=(w1, 0), ne=(w1, 1), sw=(w2, 0), se=(w2, 1))
    return Tangle(b, nw=(w1, 0), sw=(w1, 1), ne=(w2, 0), se=(w2, 1))  # the infinity tangle


def twist_horizontal(t: Tangle, n: int, picture: int = 1) -> Tangle:
    """Add |n| half-twists of the two right ends (NE, SE): fraction F -> F + n."""
    b = t.b
    s = picture * (1 if n > 0 else -1)
    for _ in range(abs(n)):
        c = _crossing_tangle(b, s)
        b.join(t.ne, c.nw)
        b.join(t.se, c.sw)
        t = Tangle(b, t.nw, c.ne, t.sw, c.se)
    return t


def twist_vertical(t: Tangle, n: int, picture: int = 1) -> Tangle:
    """Add |n| half-twists of the two bottom ends (SW, SE): 1/F -> 1/F + n."""
    b = t.b
    s = picture * (1 if n > 0 else -1)
    for _ in range(abs(n)):
        c = _crossing_tangle(b, s)
        b.join(t.sw, c.nw)
        b.join(t.se, c.ne)
        t = Tangle(b, t.nw, t.ne, c.sw, c.se)
    return t


def rational_tangle(b: PlanarBuilder, terms: list[int], picture: int = 1) -> Tangle:
    """The rational tangle with fraction a1 + 1/(a2 + 1/(... + 1/an)).

    Built from the innermost term outwards: a_k with k odd twists horizontally,
    with k even vertically (Conway 1970; Kauffman-Lambropoulou 2003, section 2).
    """
    n = len(terms)
    t = _wire_tangle(b, horizontal=(n % 2 == 1))
    for k in range(n, 0, -1):
        a = terms[k - 1]
        t = twist_horizontal(t, a, picture) if k % 2 == 1 else twist_vertical(t, a, picture)
    return t


def tangle_sum(tangles: list[Tangle]) -> Tangle:
    """Place tangles side by side, joining NE to the next NW and SE to the next SW."""
    t = tangles[0]
    for u in tangles[1:]:
        t.b.join(t.ne, u.nw)
        t.b.join(t.se, u.sw)
        t = Tangle(t.b, t.nw, u.ne, t.sw, u.se)
    return t


def numerator_closure(t: Tangle) -> None:
    """Join NW to NE (over the top) and SW to SE (under the bottom)."""
    t.b.join(t.nw, t.ne)
    t.b.join(t.sw, t.se)
