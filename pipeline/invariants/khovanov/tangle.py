"""Bar-Natan's local algorithm: tangle complexes built one crossing at a time.

The processed crossings form a tangle T whose boundary points are the frontier edges
(the edges with exactly one processed end).  Its formal complex [1]_ is kept as a list
of objects ``(matching, homological degree i, quantum shift q)`` and a sparse
differential whose entries are dotted cobordisms in normal form
(:mod:`.cobordism`).  Adding a crossing X is the tensor product of the complex of T
with the two-term complex ``X₀ → X₁{1}`` of X (shifted by ``[−n₋]{n₊ − 2n₋}`` for
its sign), with the sign rule ``d(x ⊗ y) = dx ⊗ y + (−1)^|x| x ⊗ dy``; every closed
loop this creates is removed by *delooping* ``○ ≅ ∅{+1} ⊕ ∅{−1}`` and every
isomorphism (an invertible scalar times an identity: any nonzero scalar over a field,
±1 over Z) is removed by *Gaussian elimination* ``[[φ, δ], [γ, ε]] ≃ ε − γφ⁻¹δ`` [2]_.
The gluing itself is :mod:`.glue`.  The crossings are taken in the frontier order of
:func:`pipeline.invariants.jones.frontier.crossing_order`, so the boundary and the
complexes stay small.

All maps are homogeneous, so the computation is carried out in the Bar-Natan theory
with the formal variable h kept implicit (:mod:`.cobordism`); the end result is a
complex of free k[h]-modules with zero differential at h = 0 over a field (its objects
are a basis of Khovanov homology over k) whose h-torsion structure gives Rasmussen's s
over Q.  Over Z the final complex keeps its non-unit scalar entries; its homology is
taken by a Smith normal form (:mod:`.integral`).

References
----------
.. [1] D. Bar-Natan, "Khovanov's homology for tangles and cobordisms",
   Geom. Topol. 9 (2005), 1443–1499.
.. [2] D. Bar-Natan, "Fast Khovanov homology computations", JKTR 16
   (2007), 243–255.
"""

from __future__ import annotations

from typing import Optional

from ...diagrams.diagram import Diagram
from ..jones.frontier import crossing_order
from .cobordism import compose, cycles
from .glue import add_crossing, clear_glue_caches

__all__ = ["TangleComplex", "reduced_complex", "close_cut", "clear_caches"]

_EMPTY = frozenset()


class TangleComplex:
    """A formal complex over dotted cobordisms (mutable, private to this computation)."""

    def __init__(self, one, h0: bool = False, modulus: Optional[int] = None) -> None:
        self.one = one
        self.h0 = h0  # drop every term with a positive power of h (Khovanov's theory)
        # coefficients: flint.fmpq (modulus None), Python ints (modulus 0: the integers,
        # only ±1 is a unit) or Python ints reduced mod a prime p (modulus p: F_p)
        self.modulus = modulus
        self.objs: dict[int, tuple] = {0: ((), 0, 0)}   # id -> (matching, i, q)
        self.out: dict[int, dict[int, dict]] = {0: {}}  # id -> {target id: morphism}
        self.inc: dict[int, set[int]] = {0: set()}      # id -> set of source ids
        self.next_id = 1

    def add_object(self, m, i, q) -> int:
        k = self.next_id
        self.next_id += 1
        self.objs[k] = (m, i, q)
        self.out[k] = {}
        self.inc[k] = set()
        return k

    def add_arc(self, p: int, r: int) -> None:
        """Disjoint union with one plain arc p–r (morphisms are unchanged)."""
        pair = (min(p, r), max(p, r))
        self.objs = {k: (tuple(sorted(m + (pair,))), i, q) for k, (m, i, q) in self.objs.items()}

    def _is_iso(self, a: int, b: int) -> bool:
        ma, _, qa = self.objs[a]
        mb, _, qb = self.objs[b]
        if qa != qb or ma != mb:
            return False
        c = self.out[a][b].get(_EMPTY)
        return c is not None and (self.modulus != 0 or c == 1 or c == -1)

    def new_like(self) -> "TangleComplex":
        """An empty complex (no objects) over the same coefficients and theory."""
        new = TangleComplex(self.one, self.h0, self.modulus)
        new.objs, new.out, new.inc = {}, {}, {}
        return new

    def _neg_inverse(self, phi):
        """``−1/φ`` for a unit φ of the coefficient ring."""
        if phi == 1 or phi == -1:  # stays a Python int (entries over Q may be ints)
            return -phi
        if self.modulus is None:
            return -self.one / phi
        return -pow(phi, -1, self.modulus) % self.modulus

    def eliminate(self) -> None:
        """Gaussian elimination of every isomorphism until none is left.

        The isomorphisms present at the start are cancelled cheapest first (least
        fill-in); an isomorphism created by a cancellation is cancelled next.
        """
        objs, inc, any_unit = self.objs, self.inc, self.modulus != 0
        cands = []
        for a, t in self.out.items():  # _is_iso, inlined: this scan visits every entry
            ma, _, qa = objs[a]
            for b, f in t.items():
                mb, _, qb = objs[b]
                if qa == qb and ma == mb:
                    c = f.get(_EMPTY)
                    if c is not None and (any_unit or c == 1 or c == -1):
                        cands.append(((len(t) - 1) * (len(inc[b]) - 1), a, b))
        cands.sort(reverse=True)
        stack = [(a, b) for _, a, b in cands]
        while stack:
            a, b = stack.pop()
            if a in self.out and b in self.out[a] and self._is_iso(a, b):
                stack.extend(self._cancel(a, b))

    def _cancel(self, a: int, b: int) -> list[tuple[int, int]]:
        """Cancel the isomorphism a → b; return the new isomorphisms it creates."""
        phi = self.out[a][b][_EMPTY]
        scale = self._neg_inverse(phi)
        m = self.objs[a][0]
        sources = [x for x in self.inc[b] if x != a]
        targets = [(y, g) for y, g in self.out[a].items() if y != b]
        created = []
        for x in sources:
            gamma = self.out[x][b]
            mx = self.objs[x][0]
            for y, delta in targets:
                extra = compose(mx, m, self.objs[y][0], gamma, delta, scale)
                if extra:
                    self._add_to(x, y, extra)
                    if y in self.out[x] and self._is_iso(x, y):
                        created.append((x, y))
        for k in (a, b):
            for y in self.out[k]:
                self.inc[y].discard(k)
            for x in self.inc[k]:
                self.out[x].pop(k, None)
            del self.out[k], self.inc[k], self.objs[k]
        return created

    def _add_to(self, x: int, y: int, extra: dict, filtered: bool = False) -> None:
        """``d[x → y] += extra``; at h = 0 the terms with a positive power of h are dropped
        first unless ``filtered`` says the caller has done so."""
        if self.h0 and not filtered:
            (mx, _, qx), (my, _, qy) = self.objs[x], self.objs[y]
            top = len(cycles(mx, my)) - len(mx) + qy - qx  # deg C + q_y − q_x = 2·(power of h) + 2|D|
            extra = {ds: c for ds, c in extra.items() if 2 * len(ds) == top}
        p = self.modulus
        if p:
            extra = {ds: c % p for ds, c in extra.items() if c % p}
        if not extra:
            return
        cur = self.out[x].get(y)
        if cur is None:
            self.out[x][y] = extra
            self.inc[y].add(x)
            return
        for ds, c in extra.items():
            new = cur.get(ds, 0) + c
            if p:
                new %= p
            if new:
                cur[ds] = new
            else:
                del cur[ds]
        if not cur:
            del self.out[x][y]
            self.inc[y].discard(x)


def reduced_complex(diagram: Diagram, one, *, budget: Optional[int] = None,
                    keep_cut: bool = False, h0: bool = False,
                    modulus: Optional[int] = None) -> TangleComplex:
    """The simplified complex of the diagram over the coefficients of ``one``, ``modulus``.

    ``one`` is the unit of the coefficients: ``flint.fmpq(1)`` over Q (``modulus``
    None), or the Python int 1 with ``modulus`` a prime p (F_p, ints reduced mod p) or
    0 (the integers Z: only the isomorphisms ±1 are eliminated, so the final complex
    keeps its non-invertible scalar entries for a Smith normal form).  Free loops are not included (each multiplies the
    homology by ``q + q⁻¹``).  ``budget`` bounds the number of objects after any
    gluing step.

    The diagram is processed as the (1,1)-tangle obtained by cutting one edge of the
    last crossing; the tangle's simplified complex is returned when ``keep_cut`` is
    true (every object is then the arc between the two cut ends, see
    :func:`close_cut`), otherwise the cut is closed and simplified once more.
    With ``h0`` every term carrying a positive power of h is dropped as it appears:
    Khovanov's theory itself, sparser, enough for the ranks but not for s.
    """
    pd = diagram.pd
    signs = diagram.signs
    cx = TangleComplex(one, h0, modulus)
    order = crossing_order(diagram)
    for step, c in enumerate(order):
        pts = list(pd[c])
        if step == len(order) - 1:  # cut one edge at the last crossing
            single = [s for s in range(4) if pts.count(pts[s]) == 1]
            s = single[0] if single else max(s for s in range(4) if pts.index(pts[s]) != s)
            pts[s] = -pts[s] - 7 * 10 ** 9
        for s in range(4):
            if pts.index(pts[s]) != s:  # a kink edge: both ends at this crossing
                fresh = -pts[s] - 10 ** 9 * s
                cx.add_arc(pts[s], fresh)
                pts[s] = fresh
        cx = add_crossing(cx, tuple(pts), signs[c], budget)
        cx.eliminate()
    if keep_cut or not order:
        return cx
    return close_cut(cx)


def close_cut(cx: TangleComplex) -> TangleComplex:
    """Join the two cut ends of a (1,1)-tangle complex, deloop and simplify.

    An entry ``c₀ + c₁·x`` (plain and dotted disk on the arc's one cycle) becomes, on the
    delooped objects ``(a, +){q+1}`` and ``(a, −){q−1}``, the entries ``+→+ : c₀``,
    ``+→− : c₁``, ``−→− : c₀ + c₁h`` (``x² = hx``; h implicit), ``−→+ : 0``.
    """
    new = cx.new_like()
    pair = {}
    for a, (m, i, q) in cx.objs.items():
        pair[a] = (new.add_object((), i, q + 1), new.add_object((), i, q - 1))
    empty = frozenset()
    for a, targets in cx.out.items():
        m = cx.objs[a][0]
        dot = frozenset((m[0][0],))
        for b, f in targets.items():
            c0, c1 = f.get(empty, 0), f.get(dot, 0)
            (ap, am), (bp, bm) = pair[a], pair[b]
            for x, y, c in ((ap, bp, c0), (ap, bm, c1), (am, bm, c0 + c1)):
                if c:
                    new._add_to(x, y, {empty: c})
    new.eliminate()
    return new


def clear_caches() -> None:
    """Empty the memo tables of local gluing and composition (for cold timings)."""
    from . import cobordism
    clear_glue_caches()
    for fn in (cobordism.cycles, cobordism.compose_topology, cobordism._compose_terms):
        fn.cache_clear()
