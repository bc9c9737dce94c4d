"""Bar-Natan's local algorithm: tangle complexes built one crossing at a time.

The processed crossings form a tangle T whose boundary points are the frontier edges
(the edges with exactly one processed end).  Its formal complex [1]_ is kept as a list
of objects ``(matching, homological degree i, quantum shift q)`` and a sparse
differential whose entries are dotted cobordisms in normal form
(:mod:`.cobordism`).  Adding a crossing X is the tensor product of the complex of T
with the two-term complex ``X₀ → X₁{1}`` of X (shifted by ``[−n₋]{n₊ − 2n₋}`` for
its sign), with the sign rule ``d(x ⊗ y) = dx ⊗ y + (−1)^|x| x ⊗ dy``; every closed
loop this creates is removed by *delooping* ``○ ≅ ∅{+1} ⊕ ∅{−1}`` and every
isomorphism (a nonzero scalar times an identity) is removed by *Gaussian elimination*
``[[φ, δ], [γ, ε]] ≃ ε − γφ⁻¹δ`` [2]_.  The crossings are taken in the frontier order
of :func:`pipeline.invariants.jones.frontier.crossing_order`, so the boundary and the
complexes stay small.

All maps are homogeneous, so the computation is carried out in the Bar-Natan theory
with the formal variable h kept implicit (:mod:`.cobordism`); the end result is a
complex of free k[h]-modules with zero differential at h = 0 (its objects are a basis
of Khovanov homology over k) whose h-torsion structure gives Rasmussen's s over Q.

References
----------
.. [1] D. Bar-Natan, "Khovanov's homology for tangles and cobordisms",
   Geom. Topol. 9 (2005), 1443–1499.
.. [2] D. Bar-Natan, "Fast Khovanov homology computations", JKTR 16
   (2007), 243–255.
"""

from __future__ import annotations

import itertools
from functools import lru_cache
from typing import Optional

from ...diagrams.diagram import Diagram
from ...errors import BudgetExceeded
from ..jones.frontier import crossing_order
from .cobordism import add_term, compose, cycles, expand, reduce_component

__all__ = ["TangleComplex", "reduced_complex", "close_cut", "clear_caches"]


class TangleComplex:
    """A formal complex over dotted cobordisms (mutable, private to this computation)."""

    def __init__(self, one, h0: bool = False) -> None:
        self.one = one
        self.h0 = h0  # drop every term with a positive power of h (Khovanov's theory)
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
        return qa == qb and ma == mb and frozenset() in self.out[a][b]

    def eliminate(self) -> None:
        """Gaussian elimination of every isomorphism until none is left.

        The isomorphisms present at the start are cancelled cheapest first (least
        fill-in); an isomorphism created by a cancellation is cancelled next.
        """
        cands = [((len(t) - 1) * (len(self.inc[b]) - 1), a, b)
                 for a, t in self.out.items() for b in t if self._is_iso(a, b)]
        cands.sort(reverse=True)
        stack = [(a, b) for _, a, b in cands]
        while stack:
            a, b = stack.pop()
            if a in self.out and b in self.out[a] and self._is_iso(a, b):
                stack.extend(self._cancel(a, b))

    def _cancel(self, a: int, b: int) -> list[tuple[int, int]]:
        """Cancel the isomorphism a → b; return the new isomorphisms it creates."""
        phi = self.out[a][b][frozenset()]
        scale = -1 / phi
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

    def _add_to(self, x: int, y: int, extra: dict) -> None:
        if self.h0:
            (mx, _, qx), (my, _, qy) = self.objs[x], self.objs[y]
            top = len(cycles(mx, my)) - len(mx) + qy - qx  # deg C + q_y − q_x = 2·(power of h) + 2|D|
            extra = {ds: c for ds, c in extra.items() if 2 * len(ds) == top}
            if not extra:
                return
        cur = self.out[x].get(y)
        if cur is None:
            self.out[x][y] = extra
            self.inc[y].add(x)
            return
        for ds, c in extra.items():
            add_term(cur, ds, c)
        if not cur:
            del self.out[x][y]
            self.inc[y].discard(x)


# ------------------------------------------------------------------ gluing a crossing
@lru_cache(maxsize=50_000)
def _glue_object(m, s) -> tuple:
    """``m ∪ s`` as (new matching, loops): loops as sorted point tuples, by smallest point."""
    edges = m + s
    nbr: dict[int, list[tuple[int, int]]] = {}
    for e, (a, b) in enumerate(edges):
        nbr.setdefault(a, []).append((b, e))
        nbr.setdefault(b, []).append((a, e))
    seen: set[int] = set()

    def walk(p):
        pts, x, used = [p], p, -1
        while True:
            seen.add(x)
            step = [(y, e) for y, e in nbr[x] if e != used]
            if not step:
                return pts, x
            y, used = step[0]
            if y == p:
                return pts, None
            pts.append(y)
            x = y

    pairs, loops = [], []
    for p in sorted(nbr):
        if p not in seen and len(nbr[p]) == 1:
            _, end = walk(p)
            pairs.append((p, end))
    for p in sorted(nbr):
        if p not in seen:
            pts, _ = walk(p)
            loops.append(tuple(sorted(pts)))
    return tuple(sorted(pairs)), tuple(loops)


@lru_cache(maxsize=50_000)
def _glue_topology(t_pieces, x_pieces, src, tgt):
    """Components of a glued cobordism, before capping loops and choosing dots.

    ``t_pieces``/``x_pieces``: the disks of the T side (tagged by cycle name, or None)
    and of the crossing side, as point tuples; ``src``/``tgt``: the glued objects
    ``(matching, loops)``.  Returns per component ``(T cycle names, chi, new circles,
    source loop indices, target loop indices)``.
    """
    pieces = list(t_pieces) + list(x_pieces)
    owner: dict[int, list[int]] = {}
    for k, (_, pts) in enumerate(pieces):
        for p in pts:
            owner.setdefault(p, []).append(k)
    parent = list(range(len(pieces)))

    def find(x):
        while parent[x] != x:
            x = parent[x]
        return x

    internal = [p for p, ks in owner.items() if len(ks) == 2]
    for p in internal:
        ra, rb = find(owner[p][0]), find(owner[p][1])
        if ra != rb:
            parent[ra] = rb
    comps: dict[int, list] = {}
    for k, (tag, _) in enumerate(pieces):
        c = comps.setdefault(find(k), [[], 0, [], [], []])
        c[1] += 1
        if tag is not None:
            c[0].append(tag)
    for p in internal:
        comps[find(owner[p][0])][1] -= 1
    for circ in cycles(src[0], tgt[0]):
        comps[find(owner[circ[0]][0])][2].append(circ[0])
    for idx, loop in enumerate(src[1]):
        c = comps[find(owner[loop[0]][0])]
        c[1] += 1
        c[3].append(idx)
    for idx, loop in enumerate(tgt[1]):
        c = comps[find(owner[loop[0]][0])]
        c[1] += 1
        c[4].append(idx)
    return tuple((frozenset(a), chi, tuple(circ), tuple(sl), tuple(tl))
                 for a, chi, circ, sl, tl in comps.values())


@lru_cache(maxsize=100_000)
def _glued_terms(topo, dots: frozenset, eps_src, eps_tgt) -> tuple:
    """One term of a glued map, delooped at (eps_src, eps_tgt): ``((dotted circles, int), ...)``.

    Source loops are capped by a cup (ε = +) or a dotted cup (ε = −); target loops by
    a cap (ε = −) or by ``dotted cap − h·cap`` (ε = +), the delooping maps of [2]_.
    """
    parts = []
    for tids, chi, circ, sl, tl in topo:
        d = len(dots & tids) + sum(1 for k in sl if eps_src[k] < 0)
        plus_t = sum(1 for k in tl if eps_tgt[k] > 0)
        terms: dict = {}
        for extra in itertools.product((1, 0), repeat=plus_t):
            sign = -1 if (plus_t - sum(extra)) % 2 else 1
            for ds, c in reduce_component(circ, chi, d + sum(extra)):
                terms[ds] = terms.get(ds, 0) + sign * c
        comp = [(ds, c) for ds, c in terms.items() if c]
        if not comp:
            return ()
        parts.append(comp)
    out: dict = {}
    expand(parts, 1, out)
    return tuple(out.items())


def _strips(m) -> tuple:
    return tuple((None, pair) for pair in m)


def add_crossing(cx: TangleComplex, pts: tuple[int, int, int, int], sign: int,
                 budget: Optional[int]) -> TangleComplex:
    """The complex of T ∪ X for the crossing X with boundary points ``pts`` (PD order)."""
    p0, p1, p2, p3 = pts
    smooth = (tuple(sorted(((min(p0, p1), max(p0, p1)), (min(p2, p3), max(p2, p3))))),
              tuple(sorted(((min(p0, p3), max(p0, p3)), (min(p1, p2), max(p1, p2))))))
    heights = (0, 1) if sign > 0 else (-1, 0)
    qshift = (1, 2) if sign > 0 else (-2, -1)
    new = TangleComplex(cx.one, cx.h0)
    new.objs, new.out, new.inc = {}, {}, {}
    ids: dict[tuple[int, int], tuple] = {}  # (old id, smoothing) -> (glued object, {eps: new id})
    for o, (m, i, q) in cx.objs.items():
        for k in (0, 1):
            g = _glue_object(m, smooth[k])
            table = {}
            for eps in itertools.product((1, -1), repeat=len(g[1])):
                table[eps] = new.add_object(g[0], i + heights[k], q + qshift[k] + sum(eps))
            ids[(o, k)] = (g, table)
    if budget is not None and len(new.objs) > budget:
        raise BudgetExceeded("khovanov", budget)
    one = cx.one
    for o1, targets in cx.out.items():
        m1 = cx.objs[o1][0]
        for o2, f in targets.items():
            m2 = cx.objs[o2][0]
            t_pieces = tuple((c[0], c) for c in cycles(m1, m2))
            for k in (0, 1):
                (g1, tab1), (g2, tab2) = ids[(o1, k)], ids[(o2, k)]
                topo = _glue_topology(t_pieces, _strips(smooth[k]), g1, g2)
                _connect(new, topo, f, tab1, tab2, one)
    saddle = ((None, (p0, p1, p2, p3)),)
    for o, (m, i, _) in cx.objs.items():
        (g1, tab1), (g2, tab2) = ids[(o, 0)], ids[(o, 1)]
        topo = _glue_topology(_strips(m), saddle, g1, g2)
        _connect(new, topo, {frozenset(): one}, tab1, tab2, -one if i % 2 else one)
    return new


def _connect(new: TangleComplex, topo, f: dict, tab1: dict, tab2: dict, scale) -> None:
    for e1, a in tab1.items():
        for e2, b in tab2.items():
            mor: dict = {}
            for dots, c in f.items():
                sc = scale * c
                for ds, v in _glued_terms(topo, dots, e1, e2):
                    add_term(mor, ds, sc * v)
            if mor:
                new._add_to(a, b, mor)


def reduced_complex(diagram: Diagram, one, *, budget: Optional[int] = None,
                    keep_cut: bool = False, h0: bool = False) -> TangleComplex:
    """The fully simplified complex of the diagram over the field of ``one``.

    ``one`` is the unit of the coefficient field (``flint.fmpq(1)`` or
    ``flint.nmod(1, p)``).  Free loops are not included (each multiplies the
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
    cx = TangleComplex(one, h0)
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
    new = TangleComplex(cx.one, cx.h0)
    new.objs, new.out, new.inc = {}, {}, {}
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
    for fn in (_glue_object, _glue_topology, _glued_terms, cobordism.cycles,
               cobordism.compose_topology, cobordism._compose_terms):
        fn.cache_clear()
