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
form (:func:`.surgery.normal_key`), and processed in decreasing order of (crossings, bad crossings), which every
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

Twist regions (``twists=True``, the default).  Before the single-crossing step a
diagram is reduced at a removable bigon (Reidemeister II, free: an isotopy) or at its
longest twist region (:func:`pipeline.diagrams.bigons.twist_chains`: k ≥ 2 crossings of
one sign ε joined by bigons).  Write u = v^ε, w = εz; the skein relation at a crossing of
sign ε reads P(D) = u²P(D switched) + uw·P(D smoothed).

* Parallel strands (σ^k): switching one crossing and cancelling it against a neighbour
  (Reidemeister II) leaves σ^(k−2), smoothing it leaves σ^(k−1), so
  x_k = u²x_(k−2) + uw·x_(k−1) with x_k = P(D with k crossings in the region).  Put
  x_k = u^(k−1)y_k: then y_k = y_(k−2) + w·y_(k−1), the Fibonacci polynomials
  F_0 = 0, F_1 = 1, F_n = wF_(n−1) + F_(n−2), F_n(w) = Σ_j C(n−1−j, j) w^(n−1−2j).
  Hence the closed form

      P(σ^k) = A_k·P(σ^1) + B_k·P(σ^0),  A_k = u^(k−1) F_k(w),  B_k = u^k F_(k−1)(w),

  (A_0, B_0) = (0, 1), (A_1, B_1) = (1, 0); σ^1 and σ^0 are the region with k − 1,
  respectively all k, crossings smoothed.
* Antiparallel strands (T_k): smoothing any crossing gives the same diagram D_∞ (the
  region replaced by the other smoothing; its remaining crossings are kinks), switching
  one and cancelling it against a neighbour leaves T_(k−2).  With m = ⌊k/2⌋,

      P(T_k) = u^(2m)·P(T_(k mod 2)) + uw(1 + u² + … + u^(2m−2))·P(D_∞),

  where T_(k mod 2) is the region with m neighbouring pairs removed straight through.

Both are the skein of oriented rational tangles (the twist recursion of the tangle
calculus, J. H. Conway, "An enumeration of knots and links, and some of their algebraic
properties", Computational Problems in Abstract Algebra, Pergamon 1970) read on the
diagram: a two-bridge, pretzel or Montesinos diagram is a union of twist regions, each
reduced to at most one crossing in one step; regions that meet after a reduction (pretzel columns cut to one
crossing form a new twist) are reduced in turn.  Every child has fewer crossings, so the
processing order above stays valid and the memo keys are the same normal forms.
``twists=False`` is the plain single-crossing tree (the slow reference in the tests).

Budget: the number of diagrams expanded (a twist-region step, a Reidemeister II step and
a single-crossing step each count one); over it raises BudgetExceeded('homfly', budget).
"""

from __future__ import annotations

import heapq
from functools import lru_cache
from math import comb
from typing import Optional

from ...diagrams.bigons import bigons, twist_chains
from ...diagrams.diagram import Diagram
from ...errors import BudgetExceeded
from .hpoly import DELTA, HPoly
from .surgery import (Cross, first_bad, normal_key, reduce_kinks, smooth, smooth_all,
                      straight_through, switch)

__all__ = ["homfly_general", "parallel_twist_coefficients", "antiparallel_twist_coefficients"]


@lru_cache(maxsize=None)
def parallel_twist_coefficients(k: int, sign: int) -> tuple[HPoly, HPoly]:
    """(A_k, B_k) with P(σ^k) = A_k·P(σ^1) + B_k·P(σ^0) for k crossings of sign ``sign``
    on parallel strands: A_k = u^(k−1)F_k(w), B_k = u^k F_(k−1)(w), u = v^sign, w = sign·z
    (module docstring)."""
    def fib(n: int) -> HPoly:  # F_n(w) as a polynomial in z (the sign of w folded in)
        if n <= 0:  # F_0 = 0, F_(−1) = F_1 − wF_0 = 1
            return HPoly() if n == 0 else HPoly.monomial()
        return HPoly({(0, n - 1 - 2 * j): comb(n - 1 - j, j) * sign ** (n - 1 - 2 * j)
                      for j in range((n - 1) // 2 + 1)})
    return fib(k).shift(sign * (k - 1)), fib(k - 1).shift(sign * k)


@lru_cache(maxsize=None)
def antiparallel_twist_coefficients(k: int, sign: int) -> tuple[HPoly, HPoly]:
    """(C, E) with P(T_k) = C·P(T_(k mod 2)) + E·P(D_∞) for k crossings of sign ``sign``
    on antiparallel strands: C = u^(2m), E = uw·Σ_(i<m) u^(2i), m = ⌊k/2⌋, u = v^sign,
    w = sign·z (module docstring)."""
    m = k // 2
    return (HPoly.monomial(2 * sign * m),
            HPoly({(sign * (2 * i + 1), 1): sign for i in range(m)}))


def _twist_children(xs: list[Cross], loops: int):
    """[(child crossings, child loops, coefficient)] of the twist-region or Reidemeister II
    step at this diagram, or None when it has neither (module docstring)."""
    pd = [x[:4] for x in xs]
    found = bigons(pd)
    for b in found:
        if b.removable:
            ys, extra = straight_through(xs, (b.i, b.j))
            return [(ys, loops + extra, HPoly.monomial())]
    chains = twist_chains(pd, [x[4] for x in xs], found=found)
    if not chains:
        return None
    ch = chains[0].crossings
    k, sign = len(ch), xs[ch[0]][4]
    if chains[0].parallel:
        a, b = parallel_twist_coefficients(k, sign)
        one, e1 = smooth_all(xs, ch[:-1])
        zero, e0 = smooth_all(xs, ch)
        return [(one, loops + e1, a), (zero, loops + e0, b)]
    c, e = antiparallel_twist_coefficients(k, sign)
    rest, er = straight_through(xs, ch[:2 * (k // 2)])
    inf, ei = smooth(xs, ch[0])
    return [(rest, loops + er, c), (inf, loops + ei, e)]


def homfly_general(diagram: Diagram, *, budget: Optional[int] = None, twists: bool = True) -> HPoly:
    """HOMFLY-PT polynomial of any diagram by the memoised skein tree (module docstring).

    Parameters
    ----------
    diagram : Diagram
        Oriented link diagram (orientation of each component matters for links).
    budget : int, optional
        Maximal number of diagrams expanded; exceeded -> ``BudgetExceeded('homfly', budget)``.
    twists : bool
        Reduce whole twist regions (and Reidemeister II bigons) in one step (default);
        False: one crossing per step, the slow reference route.

    Returns
    -------
    HPoly
        P(v, z) with v⁻¹P(L₊) − vP(L₋) = zP(L₀), P(unknot) = 1.
    """
    xs0 = [x + (s,) for x, s in zip(diagram.pd, diagram.signs)]
    xs0, loops0, _ = reduce_kinks(xs0, diagram.free_loops)
    key0 = normal_key(xs0, loops0)
    table: dict = {key0: HPoly.monomial()}
    heap: list = []

    def push(key, coeff: HPoly) -> None:
        if key in table:
            table[key] = table[key] + coeff
            return
        table[key] = coeff
        heapq.heappush(heap, (-len(key[0]), -first_bad(list(key[0]))[1], key))

    heap.append((-len(key0[0]), -first_bad(list(key0[0]))[1], key0))
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
        first, bad, ncomp = first_bad(xs)
        if first is None:
            total = total + coeff * DELTA ** (ncomp + loops - 1)
            continue
        kids = _twist_children(xs, loops) if twists else None
        if kids is not None:
            for ys, ys_loops, c in kids:
                ys, ys_loops, _ = reduce_kinks(ys, ys_loops)
                push(normal_key(ys, ys_loops), coeff * c)
            continue
        s = xs[first][4]
        sw = list(xs)
        sw[first] = switch(xs[first])
        sw_r, sw_loops, changed = reduce_kinks(sw, loops)
        sw_key = normal_key(sw_r, sw_loops) if changed else (tuple(sorted(sw)), loops)
        sm, extra = smooth(xs, first)
        sm, sm_loops, _ = reduce_kinks(sm, loops + extra)
        sm_key = normal_key(sm, sm_loops)
        if s > 0:
            push(sw_key, coeff.shift(2))
            push(sm_key, coeff.shift(1, 1))
        else:
            push(sw_key, coeff.shift(-2))
            push(sm_key, -coeff.shift(-1, 1))
    return total
