"""Kauffman bracket and Jones polynomial by a frontier dynamic programme.

The crossings of the diagram are added one at a time.  After each step the
processed crossings form a region of the plane whose boundary is crossed by the
*frontier*: the edges with exactly one end at a processed crossing.  A Kauffman
state restricted to the processed crossings is a system of closed loops plus arcs
that pair the frontier edges off by a planar (crossingless) matching.  The
programme keeps one Laurent polynomial in A per matching: the sum of
``A^(#A - #B) · δ^(closed loops)`` over the partial states with that matching,
``δ = −A² − A⁻²``.  When every crossing is processed the frontier is empty, the
single remaining entry is ``δ · <D>`` and one exact division gives the bracket.

The crossings are ordered greedily: next comes the unprocessed crossing that
shrinks the frontier most (most slots on frontier edges), ties broken in favour of
the crossing that first touched the processed region earliest (breadth first);
several first crossings are tried and the order with the least estimated work
kept.  On the diagrams of the families (braid closures on few strands, pretzel,
two-bridge and Montesinos diagrams) the frontier stays short, the number of
planar matchings is bounded, and the work is polynomial in the crossing number.

Conventions
-----------
At a crossing ``(a, b, c, d)`` (contract PD order: counterclockwise from the
incoming under-strand) the A-smoothing joins ``a–b`` and ``c–d`` (the regions
swept counterclockwise by the over-strand, as in [1]), the B-smoothing joins
``a–d`` and ``b–c``.  ``<unknot> = 1``; each further loop multiplies by δ.
The Jones polynomial is ``V(L) = (−A³)^(−w) <L>`` at ``A = t^(−1/4)``, so the
positive trefoil has ``V = t + t³ − t⁴`` (README.md, normalisation contract).

Polynomials in A are stored as ``(offset, fmpz_poly)`` pairs meaning
``A^offset · p(A)`` (exact python-flint integer polynomials).  Their degrees are
bounded by 4·(crossings + loops) + 4, so no flint call is ever unbounded; the
``budget`` bounds the number of matchings kept at once.

Diagrams built from rational tangles (two-bridge, pretzel, Montesinos) also have
a linear-time route by bracket pairs, :mod:`pipeline.invariants.jones.tangle_bracket`;
:func:`jones_from_bracket` turns its bracket into V.  The tests check the two
routes against each other and against the 2^n state sum.

References
----------
1. L. H. Kauffman, "State models and the Jones polynomial", Topology 26 (1987).
2. V. F. R. Jones, "A polynomial invariant for knots via von Neumann algebras",
   Bull. AMS 12 (1985).
"""

from __future__ import annotations

import heapq
import math
from typing import Optional

import flint

from ...diagrams.diagram import Diagram
from ...errors import BudgetExceeded
from ..poly import Laurent

__all__ = ["kauffman_bracket", "jones_polynomial", "jones_from_bracket", "crossing_order", "frontier_width"]

_ONE = flint.fmpz_poly([1])
#: δ = −A² − A⁻² = A⁻² · (−1 − A⁴): stored as offset −2 and −1 − A⁴.
_DELTA = (-2, flint.fmpz_poly([-1, 0, 0, 0, -1]))
#: The two smoothings by slot pairs, with their weight exponent in A.
_SMOOTHINGS = (((0, 1), (2, 3), 1), ((0, 3), (1, 2), -1))


# --------------------------------------------------------------------- ordering
def crossing_order(diagram: Diagram, *, starts: int = 8) -> list[int]:
    """A processing order of the crossings that keeps the frontier short.

    Greedy: repeatedly take the unprocessed crossing whose addition changes the
    number of frontier edges least (most slots on frontier edges first), ties
    broken by the time the crossing first touched the processed region (breadth
    first).  A new connected piece is started only when nothing touches the
    processed region.  The greedy pass is run from ``starts`` evenly spaced first
    crossings and the order with the least estimated work is kept: the sum over
    the steps of Catalan(width / 2), the number of planar matchings of ``width``
    frontier edges.  Each pass is O(n log n).

    Parameters
    ----------
    diagram : Diagram
    starts : int, optional
        Number of first crossings tried (default 8).

    Returns
    -------
    list of int
        A permutation of ``range(diagram.n_crossings)``.
    """
    pd = diagram.pd
    n = len(pd)
    if n == 0:
        return []
    where: dict[int, list[int]] = {}
    for i, x in enumerate(pd):
        for v in x:
            where.setdefault(v, []).append(i)
    k = max(1, min(starts, n))
    best, best_cost = None, None
    for first in sorted({j * n // k for j in range(k)}):
        order = _greedy_order(pd, where, first)
        cost = sum(_catalan(w // 2) for w in _widths(pd, order))
        if best_cost is None or cost < best_cost:
            best, best_cost = order, cost
    return best


def _catalan(m: int) -> int:
    return math.comb(2 * m, m) // (m + 1)


def _widths(pd, order):
    """The number of frontier edges after each step of ``order``."""
    frontier: set[int] = set()
    out = []
    for i in order:
        for v in pd[i]:
            if v in frontier:
                frontier.discard(v)
            else:
                frontier.add(v)
        out.append(len(frontier))
    return out


def _greedy_order(pd, where: dict[int, list[int]], first: int) -> list[int]:
    """One greedy pass starting at crossing ``first`` (see :func:`crossing_order`)."""
    n = len(pd)
    # shared[i]: slots of i on frontier edges (other end processed);
    # fresh[i]: slots of i on edges whose other end is another unprocessed crossing.
    # Adding i changes the frontier size by fresh[i] - shared[i].
    shared = [0] * n
    fresh = [sum(1 for v in x if where[v][0] != where[v][1]) for x in pd]
    touched = [-1] * n
    done = [False] * n
    heap: list[tuple[int, int, int]] = []
    order: list[int] = []
    next_untouched = 0
    while len(order) < n:
        pick = -1
        while heap:
            change, _, i = heapq.heappop(heap)
            if not done[i] and change == fresh[i] - shared[i]:
                pick = i
                break
        if pick < 0:  # start a (new) connected piece
            if not order:
                pick = first
            else:
                while done[next_untouched]:
                    next_untouched += 1
                pick = next_untouched
        done[pick] = True
        order.append(pick)
        for v in pd[pick]:
            a, b = where[v]
            other = b if a == pick else a
            if other == pick or done[other]:
                continue
            shared[other] += 1
            fresh[other] -= 1
            if touched[other] < 0:
                touched[other] = len(order)
            heapq.heappush(heap, (fresh[other] - shared[other], touched[other], other))
    return order


def frontier_width(diagram: Diagram, order: Optional[list[int]] = None) -> int:
    """The largest number of frontier edges met along ``order`` (default: :func:`crossing_order`)."""
    if order is None:
        order = crossing_order(diagram)
    return max(_widths(diagram.pd, order), default=0)


# --------------------------------------------------------------------- the programme
def _add(acc: Optional[tuple[int, flint.fmpz_poly]], off: int, poly: flint.fmpz_poly):
    """A^o1·p1 + A^o2·p2 as one (offset, poly) pair."""
    if acc is None:
        return off, poly
    o1, p1 = acc
    if o1 <= off:
        return o1, p1 + poly.left_shift(off - o1)
    return off, poly + p1.left_shift(o1 - off)


def _slot_plan(pd, order: list[int]) -> tuple[int, list[tuple[tuple[int, int, int, int, int], ...]]]:
    """Give every frontier edge a fixed position ("slot") while it is open.

    Returns the number of slots W and, per step of ``order``, the two smoothings
    as ``(p1, q1, p2, q2, weight)``: the slots joined by the two smoothing arcs
    and the exponent of A.  An edge entering the frontier takes the smallest free
    slot; a kink edge (both ends at the crossing) takes a slot for this step only.
    """
    slot_of: dict[int, int] = {}
    free: list[int] = []
    width = 0
    plan = []
    for i in order:
        x = pd[i]
        here: dict[int, int] = {}
        released = []
        for v in x:
            if v in here:
                continue
            if v in slot_of:  # its other end is processed: the edge closes now
                here[v] = slot_of.pop(v)
                released.append(here[v])
            else:
                s = heapq.heappop(free) if free else width
                if s == width:
                    width += 1
                here[v] = s
                if x.count(v) == 2:  # a kink edge: open for this step only
                    released.append(s)
                else:
                    slot_of[v] = s
        for s in released:
            heapq.heappush(free, s)
        plan.append(tuple((here[x[a]], here[x[b]], here[x[c]], here[x[d]], weight)
                          for (a, b), (c, d), weight in _SMOOTHINGS))
    return width, plan


def _bracket_times_delta(diagram: Diagram, budget: Optional[int]) -> tuple[int, flint.fmpz_poly]:
    """Σ over all Kauffman states of A^(#A − #B) δ^(loops), as (offset, poly).

    A state of the programme is a tuple over the slots: the partner slot of each
    open frontier edge under the matching, −1 for an unused slot.
    """
    loop_factor = [(0, _ONE)]
    for _ in range(2):
        o, p = loop_factor[-1]
        loop_factor.append((o + _DELTA[0], p * _DELTA[1]))
    width, plan = _slot_plan(diagram.pd, crossing_order(diagram))
    states: dict[tuple[int, ...], tuple[int, flint.fmpz_poly]] = {(-1,) * width: (0, _ONE)}
    for smoothings in plan:
        new_states: dict[tuple[int, ...], tuple[int, flint.fmpz_poly]] = {}
        get = new_states.get
        for key, (off, poly) in states.items():
            for p1, q1, p2, q2, weight in smoothings:
                m = list(key)
                loops = 0
                for p, q in ((p1, q1), (p2, q2)):
                    if p == q:  # a kink edge closed by this smoothing arc
                        loops += 1
                        continue
                    mp, mq = m[p], m[q]
                    if mp == q:  # the arc closes a loop
                        m[p] = m[q] = -1
                        loops += 1
                        continue
                    if mp >= 0:  # p was open: it becomes interior, its partner the path end
                        m[p] = -1
                        ep = mp
                    else:
                        ep = p
                    if mq >= 0:
                        m[q] = -1
                        eq = mq
                    else:
                        eq = q
                    m[ep] = eq
                    m[eq] = ep
                new_key = tuple(m)
                if loops:
                    lo, lp = loop_factor[loops]
                    new_states[new_key] = _add(get(new_key), off + weight + lo, poly * lp)
                else:
                    new_states[new_key] = _add(get(new_key), off + weight, poly)
            if budget is not None and len(new_states) > budget:
                raise BudgetExceeded("jones", budget)
        states = new_states
    (off, poly), = states.values()
    for _ in range(diagram.free_loops):
        off, poly = off + _DELTA[0], poly * _DELTA[1]
    return off, poly


def _bracket_pair(diagram: Diagram, budget: Optional[int]) -> tuple[int, flint.fmpz_poly]:
    """<D> as (offset, poly) with <unknot> = 1."""
    if budget is not None:
        if isinstance(budget, bool) or not isinstance(budget, int) or budget < 0:
            raise ValueError(f"jones: budget {budget!r} must be a non-negative integer or None")
        if budget == 0:  # even the empty matching is one state: always skipped
            raise BudgetExceeded("jones", budget)
    off, poly = _bracket_times_delta(diagram, budget)
    quo, rem = divmod(poly, _DELTA[1])
    if not rem.is_zero():  # cannot happen: every state has at least one loop
        raise ArithmeticError("jones: state sum not divisible by the loop value")
    return off - _DELTA[0], quo


def kauffman_bracket(diagram: Diagram, *, budget: Optional[int] = None) -> Laurent:
    """The Kauffman bracket <D> of a diagram, a Laurent polynomial in A.

    Defined by ``<D> = Σ_S A^(#A(S) − #B(S)) δ^(|S| − 1)`` over the 2^n Kauffman
    states S (a choice of A- or B-smoothing at each crossing), ``|S|`` the number
    of loops of the state, ``δ = −A² − A⁻²``; so ``<unknot> = 1`` and each free
    loop multiplies by δ.  Computed by the frontier dynamic programme of the module
    docstring (not by enumerating states).

    Parameters
    ----------
    diagram : Diagram
    budget : int, optional
        Largest number of boundary matchings kept at once; None means no limit,
        0 skips every diagram.

    Returns
    -------
    Laurent
        The bracket with the Laurent's variable standing for A: the term
        ``c·A^k`` is stored as doubled exponent ``2k`` (so ``to_json`` lists the
        integer exponents of A).

    Raises
    ------
    BudgetExceeded
        ``skipped: jones budget N`` when more than ``budget`` matchings are needed.
    ValueError
        When ``budget`` is not a non-negative integer.

    Examples
    --------
    >>> from pipeline.diagrams.notation import parse
    >>> kauffman_bracket(parse("torus:2,3")).to_text("A")
    'A^(-7) - A^(-3) - A^5'

    References
    ----------
    1. L. H. Kauffman, "State models and the Jones polynomial", Topology 26 (1987).
    """
    off, poly = _bracket_pair(diagram, budget)
    return Laurent({2 * (off + j): int(c) for j, c in enumerate(poly.coeffs()) if c})


def jones_polynomial(diagram: Diagram, *, budget: Optional[int] = None) -> Laurent:
    """The Jones polynomial V(t) of the oriented link drawn by ``diagram``.

    ``V(L) = (−A³)^(−w) <L>`` evaluated at ``A = t^(−1/4)``, w the writhe [1, 2];
    equivalently the skein relation ``t⁻¹V(L₊) − tV(L₋) = (t^½ − t^−½)V(L₀)`` with
    ``V(unknot) = 1`` (README.md normalisation).

    Parameters
    ----------
    diagram : Diagram
    budget : int, optional
        Largest number of boundary matchings kept at once; None means no limit,
        0 skips every diagram.

    Returns
    -------
    Laurent
        V in t; exponents are half-integers for links with an even number of
        components.

    Raises
    ------
    BudgetExceeded
        ``skipped: jones budget N`` when more than ``budget`` matchings are needed.
    ValueError
        When ``budget`` is not a non-negative integer.

    Examples
    --------
    >>> from pipeline.diagrams.notation import parse
    >>> jones_polynomial(parse("torus:2,3")).to_text()
    't + t^3 - t^4'

    References
    ----------
    1. L. H. Kauffman, "State models and the Jones polynomial", Topology 26 (1987).
    2. V. F. R. Jones, "A polynomial invariant for knots via von Neumann algebras",
       Bull. AMS 12 (1985).
    """
    return jones_from_bracket(kauffman_bracket(diagram, budget=budget), diagram.writhe)


def jones_from_bracket(bracket: Laurent, writhe: int) -> Laurent:
    """``V = (−A³)^(−w) <D>`` at ``A = t^(−1/4)``, from a bracket in A (doubled exponents).

    Lets a fast bracket route (:mod:`pipeline.invariants.jones.tangle_bracket`) reuse the
    normalisation of :func:`jones_polynomial`.

    Raises
    ------
    ArithmeticError
        When an exponent of A does not become a half-integer power of t (the
        bracket does not belong to a diagram with this writhe).
    """
    sign = -1 if writhe % 2 else 1
    terms = {}
    for k2, c in bracket.terms:
        e = k2 // 2 - 3 * writhe  # exponent of A; A^e = t^(-e/4)
        if k2 % 2 or e % 2:
            raise ArithmeticError(f"jones: A-exponent {k2 / 2} with writhe {writhe} is not a power of t^(1/2)")
        terms[-e // 2] = sign * c
    return Laurent(terms)
