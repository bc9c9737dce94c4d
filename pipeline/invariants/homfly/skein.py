"""General route: HOMFLY-PT by a skein tree down to descending diagrams.

Method (L. H. Kauffman, *On Knots*, Ann. of Math. Studies 115 (1987), ch. on the skein
calculus; the descending-diagram argument of P. Freyd, D. Yetter, J. Hoste,
W. B. R. Lickorish, K. Millett, A. Ocneanu, "A new polynomial invariant of knots and
links", Bull. AMS 12 (1985)).  Order the components by smallest label and walk each
from its smallest label.  A diagram in which every crossing is first met on the
over-strand is *descending*: its components lie at separate heights and each is
monotone, so it is the unlink of c components, P = δ^(c−1) with δ = (v⁻¹ − v)/z.
Otherwise take the first crossing first met on the under-strand and apply the skein
relation v⁻¹P(L₊) − vP(L₋) = zP(L₀):

    sign +1:  P(D) = v²  P(D') + v z P(D₀)
    sign −1:  P(D) = v⁻² P(D') − v⁻¹z P(D₀)

(D' the crossing switched, D₀ its oriented smoothing).  The walk of D' is the walk of
D, so D' has one bad crossing fewer; D₀ has one crossing fewer.  Kinks (Reidemeister I)
are removed for free (P is an isotopy invariant).

Memoisation: diagrams are merged in a table keyed by an orientation-respecting normal
form, and processed in decreasing order of (crossings, bad crossings), which every
child lowers, so each diagram is expanded once with all its coefficients collected (no
recursion).  The key is the PD code relabelled along the components; for a diagram with
one component (plus free loops) it is :func:`pipeline.diagrams.canonical.canonical_pd`,
which also identifies relabelling, re-listing, reversal of the orientation and turning
the diagram over: all three preserve P (reversing *every* component preserves P, FYPHLMO
1985; turning over is an isotopy); of its cyclic relabellings the one with the fewest bad
crossings is kept (a smaller tree: T(3,7) needs 16 times fewer expansions).  For several
components canonical_pd is not used, as it also reverses single components, which
changes P; the labels are chosen by a deterministic search over the order of the
components and their base points for the fewest bad crossings instead.

Budget: the number of diagrams expanded; over it raises BudgetExceeded('homfly', budget).
"""

from __future__ import annotations

import heapq
from itertools import permutations
from typing import Optional

from ...diagrams.canonical import canonical_pd
from ...diagrams.diagram import Diagram
from ...errors import BudgetExceeded
from .hpoly import DELTA, HPoly

__all__ = ["homfly_general"]

# A crossing is (a, b, c, d, sign): the PD tuple plus its sign, so orientation is explicit.
Cross = tuple[int, int, int, int, int]


def _moves(xs: list[Cross]) -> dict[int, tuple[int, bool, int]]:
    """label -> (crossing, entered on the over-strand?, outgoing label)."""
    nxt = {}
    for i, (a, b, c, d, s) in enumerate(xs):
        nxt[a] = (i, False, c)
        if s > 0:
            nxt[d] = (i, True, b)
        else:
            nxt[b] = (i, True, d)
    return nxt


def _components(xs: list[Cross]) -> list[list[int]]:
    """Labels of each component in walk order, from its smallest label, ordered by it."""
    nxt = _moves(xs)
    seen, comps = set(), []
    for start in sorted(nxt):
        if start in seen:
            continue
        comp, e = [], start
        while e not in seen:
            seen.add(e)
            comp.append(e)
            e = nxt[e][2]
        comps.append(comp)
    return comps


def _relabel(xs: list[Cross]) -> tuple[Cross, ...]:
    m, k = {}, 1
    for comp in _components(xs):
        for e in comp:
            m[e] = k
            k += 1
    return tuple(sorted((m[a], m[b], m[c], m[d], s) for a, b, c, d, s in xs))


def _merge(xs: list[Cross], pairs, removed: set[int]) -> tuple[list[Cross], int]:
    """Drop crossings ``removed``, identify the label pairs; return (crossings, new free loops)."""
    parent: dict[int, int] = {}

    def find(u):
        while parent.get(u, u) != u:
            u = parent[u]
        return u

    for u, w in pairs:
        ru, rw = find(u), find(w)
        if ru != rw:
            parent[ru] = rw
    rest = [x for i, x in enumerate(xs) if i not in removed]
    new = [(find(a), find(b), find(c), find(d), s) for a, b, c, d, s in rest]
    present = {v for x in new for v in x[:4]}
    touched = {find(v) for i in removed for v in xs[i][:4]}
    return new, len(touched - present)


def _kink(xs: list[Cross]) -> Optional[int]:
    for i, x in enumerate(xs):
        for k in range(4):
            if x[k] == x[(k + 1) % 4]:
                return i
    return None


def _reduce(xs: list[Cross], loops: int) -> tuple[list[Cross], int, bool]:
    """Remove Reidemeister I kinks until none is left."""
    changed = False
    while (i := _kink(xs)) is not None:
        x = xs[i]
        k = next(k for k in range(4) if x[k] == x[(k + 1) % 4])
        p, q = x[(k + 2) % 4], x[(k + 3) % 4]
        xs, extra = _merge(xs, [(p, x[k]), (x[k], q)], {i})
        loops += extra
        changed = True
    return xs, loops, changed


def _normal(xs: list[Cross], loops: int) -> tuple[tuple[Cross, ...], int]:
    """Orientation-respecting normal form (see the module docstring)."""
    if not xs:
        return (), loops
    if len(_components(xs)) == 1:
        d = Diagram.from_pd([x[:4] for x in _relabel(xs)])
        pieces, _ = canonical_pd(d)
        c = Diagram.from_pd(pieces[0])
        return _best_base([x + (s,) for x, s in zip(c.pd, c.signs)]), loops
    return _best_link_walk(xs), loops


def _best_link_walk(xs: list[Cross]) -> tuple[Cross, ...]:
    """A deterministic relabelling of a link diagram (labels consecutive along each
    component) choosing the order of the components (all orders up to 4 components) and,
    greedily per component, the base point, for the fewest bad crossings."""
    comps = _components(xs)
    orders = list(permutations(range(len(comps)))) if len(comps) <= 4 else [tuple(range(len(comps)))]
    best = None
    for order in orders:
        shifts: list[int] = []
        for k in range(len(order)):
            choice = None
            for r in range(len(comps[order[k]])):
                ys = _label_walk(xs, comps, order[:k + 1], shifts + [r])
                bad = _first_bad(ys)[1]
                if choice is None or bad < choice[0]:
                    choice = (bad, r)
            shifts.append(choice[1])
        ys = _label_walk(xs, comps, order, shifts)
        bad = _first_bad(ys)[1]
        if best is None or bad < best[0]:
            best = (bad, ys)
    return tuple(sorted(best[1]))


def _label_walk(xs: list[Cross], comps: list[list[int]], order, shifts) -> list[Cross]:
    """Labels 1, 2, … along the components in ``order``, each started ``shifts`` steps in;
    components not yet placed keep labels after all placed ones (in their old order)."""
    m, k = {}, 1
    placed = list(order) + [i for i in range(len(comps)) if i not in order]
    for j, ci in enumerate(placed):
        comp = comps[ci]
        r = shifts[j] if j < len(shifts) else 0
        for t in range(len(comp)):
            m[comp[(r + t) % len(comp)]] = k
            k += 1
    return [(m[a], m[b], m[c], m[d], sg) for a, b, c, d, sg in xs]


def _best_base(xs: list[Cross]) -> tuple[Cross, ...]:
    """Of the cyclic relabellings of a one-component diagram (labels 1..N along it), the
    one whose walk from label 1 meets the fewest crossings first from below (ties: the
    smallest shift).  A function of the canonical form, so still a normal form; fewer bad
    crossings means a smaller skein tree."""
    n = 2 * len(xs)
    best = None
    for r in range(n):
        ys = [tuple((v - 1 - r) % n + 1 for v in x[:4]) + (x[4],) for x in xs]
        bad = _first_bad(ys)[1]
        if best is None or bad < best[0]:
            best = (bad, ys)
    return tuple(sorted(best[1]))


def _first_bad(xs: list[Cross]) -> tuple[Optional[int], int, int]:
    """(first crossing met first on the under-strand, number of such, components)."""
    nxt = _moves(xs)
    comps = _components(xs)
    seen: set[int] = set()
    first, bad = None, 0
    for comp in comps:
        for e in comp:
            i, over, _ = nxt[e]
            if i not in seen:
                seen.add(i)
                if not over:
                    bad += 1
                    if first is None:
                        first = i
    return first, bad, len(comps)


def _switch(x: Cross) -> Cross:
    a, b, c, d, s = x
    return (d, a, b, c, -1) if s > 0 else (b, c, d, a, 1)


def _smooth(xs: list[Cross], i: int) -> tuple[list[Cross], int]:
    a, b, c, d, s = xs[i]
    return _merge(xs, [(a, b), (d, c)] if s > 0 else [(a, d), (b, c)], {i})


def homfly_general(diagram: Diagram, *, budget: Optional[int] = None) -> HPoly:
    """HOMFLY-PT polynomial of any diagram by the memoised skein tree (module docstring).

    Parameters
    ----------
    diagram : Diagram
        Oriented link diagram (orientation of each component matters for links).
    budget : int, optional
        Maximal number of diagrams expanded; exceeded -> ``BudgetExceeded('homfly', budget)``.

    Returns
    -------
    HPoly
        P(v, z) with v⁻¹P(L₊) − vP(L₋) = zP(L₀), P(unknot) = 1.
    """
    xs0 = [x + (s,) for x, s in zip(diagram.pd, diagram.signs)]
    xs0, loops0, _ = _reduce(xs0, diagram.free_loops)
    key0 = _normal(xs0, loops0)
    table: dict = {key0: HPoly.monomial()}
    heap: list = []

    def push(key, coeff: HPoly) -> None:
        if key in table:
            table[key] = table[key] + coeff
            return
        table[key] = coeff
        first, bad, _ = _first_bad(list(key[0]))
        heapq.heappush(heap, (-len(key[0]), -bad, key))

    first, bad, _ = _first_bad(list(key0[0]))
    heap.append((-len(key0[0]), -bad, key0))
    total = HPoly()
    expanded = 0
    while heap:
        _, _, key = heapq.heappop(heap)
        coeff = table.pop(key)
        if not coeff:
            continue
        expanded += 1
        if budget is not None and expanded > budget:
            raise BudgetExceeded("homfly", budget)
        xs, loops = list(key[0]), key[1]
        first, bad, ncomp = _first_bad(xs)
        if first is None:
            total = total + coeff * DELTA ** (ncomp + loops - 1)
            continue
        s = xs[first][4]
        sw = list(xs)
        sw[first] = _switch(xs[first])
        sw_r, sw_loops, changed = _reduce(sw, loops)
        sw_key = _normal(sw_r, sw_loops) if changed else (tuple(sorted(sw)), loops)
        sm, extra = _smooth(xs, first)
        sm, sm_loops, _ = _reduce(sm, loops + extra)
        sm_key = _normal(sm, sm_loops)
        if s > 0:
            push(sw_key, coeff.shift(2))
            push(sm_key, coeff.shift(1, 1))
        else:
            push(sw_key, coeff.shift(-2))
            push(sm_key, -coeff.shift(-1, 1))
    return total
