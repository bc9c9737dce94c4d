"""Twist regions, whole-twist-region flypes and the gathered members of a flype orbit.

Flype circuits
--------------
By W. Menasco, M. Thistlethwaite ("The classification of alternating links", Annals of
Math. 138, 1993, §2) the crossings that flypes can move form *flype circuits*: a
cyclic chain of tangles ``T_1 … T_k`` whose gaps hold horizontal twists, and a flype
carries one crossing of a gap across a run of the chain's tangles into another gap
(turning the tangles it passes over).  The orbit of a diagram is therefore (up to
the turning over that the code identifies) the product over circuits of the ways of
spreading each circuit's crossings among its gaps — which explodes for long twist
regions among several tangles (two-bridge chains, Montesinos rings).  The crossings
in one gap form one *twist region* (a maximal chain of bigon faces), so the members
of the orbit with the **fewest twist regions** are exactly those in which every
circuit's crossings are gathered in one gap (see also J. Calvo, "Knot enumeration
through flypes and twisted splices", JKTR 6, 1997, and C. Sundberg,
M. Thistlethwaite, "The rate of growth of the number of prime alternating links and
tangles", Pacific J. Math. 182, 1998, for such standard forms).

Block flypes
------------
A *block flype* carries a whole twist region ``R`` across a flype tangle ``T``
(disjoint from ``R``): the crossing of ``R`` beside ``T`` is flyped across, then the
next one (now beside the turned-over ``T``), and so on — ``|R|`` ordinary flypes, so
the result lies in the same flype class.  A block flype moves a whole gap's
crossings to another gap: into an empty gap it keeps the number of twist regions,
into an occupied one it merges two regions.

:func:`gathered_states` searches the orbit by block flypes only, restarting whenever
a member with fewer twist regions appears, and returns every member it reached with
the fewest.  Soundness is unconditional (every block flype is a product of flypes).
That it reaches *all* gathered members follows from the circuit structure above
(gathering a circuit and walking its gathered crossings from gap to gap are block
flypes); this completeness is what :mod:`pipeline.diagrams.flype` relies on, and it
is checked against the whole-orbit search on random diagrams in tests/test_flype.py.

What is left
------------
The gathered members are still a product over circuits of the gap that holds each
circuit's crossings (two for a lone crossing beside a tangle, which turns the tangle
over as it moves), so diagrams with many circuits keep hundreds or thousands of
gathered members (reports/bench_flype.md).  Choosing each circuit's gap independently,
bottom-up over the nesting of the circuits, is what :mod:`pipeline.diagrams.flype_tree`
does (the default route); this search is kept as a non-key comparison route.
"""

from __future__ import annotations

from array import array
from collections import deque

from ..errors import BudgetExceeded
from .shadow import ShadowFlype, alternating_codes, apply_shadow_flype, faces, shadow_flypes

__all__ = ["twist_regions", "twist_count", "block_flype", "block_flypes", "gathered_states"]


def twist_regions(tw: list[int]) -> list[int]:
    """Twist-region number of every crossing: crossings joined by bigon faces share one.

    Numbers are the smallest crossing index of each region (so the list is canonical
    for the labelled array, not for the diagram).
    """
    face = faces(tw)
    deg: dict[int, int] = {}
    for f in face:
        deg[f] = deg.get(f, 0) + 1
    n = len(tw) >> 2
    par = list(range(n))

    def find(a: int) -> int:
        while par[a] != a:
            par[a] = par[par[a]]
            a = par[a]
        return a

    for h, g in enumerate(tw):
        # slot h and the slot after g's crossing-mate lie on the face of h; a bigon face
        # has exactly two slots, on the two crossings of the edge h-g
        if deg[face[h]] == 2:
            a, b = find(h >> 2), find(g >> 2)
            if a != b:
                par[max(a, b)] = min(a, b)
    return [find(i) for i in range(n)]


def twist_count(tw: list[int]) -> int:
    """Number of twist regions (maximal chains of bigons; a lone crossing counts one)."""
    reg = twist_regions(tw)
    return sum(1 for i, r in enumerate(reg) if i == r)


def _chain(tw: list[int], reg: list[int], c: int) -> list[int]:
    """The crossings of c's twist region in chain order, starting at c (an end)."""
    order, seen = [c], {c}
    k = 0
    while k < len(order):
        i = order[k]
        k += 1
        for h in range(4 * i, 4 * i + 4):
            j = tw[h] >> 2
            if j not in seen and reg[j] == reg[c]:
                seen.add(j)
                order.append(j)
    return order


def _flype_at(tw: list[int], c: int, tangle: frozenset) -> ShadowFlype | None:
    for m in shadow_flypes(tw, only=c):
        if m.tangle == tangle:
            return m
    return None


def block_flype(tw: list[int], over: list[bool], chain: list[int], tangle: frozenset):
    """(twins, over) after flyping the twist region ``chain`` (end beside ``tangle`` first)
    across ``tangle``; None if a step finds no flype (not a block flype)."""
    for c in chain:
        m = _flype_at(tw, c, tangle)
        if m is None:
            return None
        tw, over = apply_shadow_flype(tw, over, m)
    return tw, over


def block_flypes(tw: list[int], over: list[bool]):
    """Every distinct block flype of the diagram: yields (twins, over) after each."""
    reg = twist_regions(tw)
    size: dict[int, int] = {}
    for r in reg:
        size[r] = size.get(r, 0) + 1
    n = len(reg)
    done: set = set()
    for m in shadow_flypes(tw):
        r = reg[m.c]
        if any(reg[i] == r for i in m.tangle):
            continue
        # flyping across the rest of the diagram instead gives the same diagram turned
        # over (every tangle of the circuit turned over): keep the smaller side only
        rest = n - len(m.tangle) - size[r]
        if rest >= 2 and len(m.tangle) > rest:
            continue
        key = (r, m.tangle)
        if key in done:
            continue
        done.add(key)
        chain = _chain(tw, reg, m.c)
        if len(chain) == 1:
            yield apply_shadow_flype(tw, over, m)
            continue
        out = apply_shadow_flype(tw, over, m)
        out = block_flype(*out, chain[1:], m.tangle)
        if out is not None:
            yield out


def gathered_states(tw: list[int], over: list[bool], budget: int) -> dict:
    """{code0: (twins, over)}: the orbit members with the fewest twist regions.

    Breadth-first search by block flypes, restarted from any member with fewer twist
    regions; ``budget`` bounds the members recorded over all restarts
    (``BudgetExceeded('flype', budget)``).  Block flypes of different circuits commute
    and keep the crossing labels, so the same labelled array is often met again: its
    (twist count, code) is remembered by the exact array (never a guess).
    """
    level = twist_count(tw)
    states = {alternating_codes(tw, over)[0]: (tw, over)}
    queue = deque([(tw, over)])
    used = 1
    known: dict[bytes, tuple] = {}
    while queue:
        tw, over = queue.popleft()
        for tw2, over2 in block_flypes(tw, over):
            key = array("l", tw2).tobytes() + bytes(over2)
            got = known.get(key)
            if got is None:
                k = twist_count(tw2)
                got = known[key] = (k, alternating_codes(tw2, over2)[0] if k <= level else None)
            k, code = got
            if k > level:  # the level only goes down, so such an entry stays above it
                continue
            if k == level and code in states:
                continue
            used += 1
            if used > budget:
                raise BudgetExceeded("flype", budget)
            if k < level:
                level, states, queue = k, {}, deque()
            states[code] = (tw2, over2)
            queue.append((tw2, over2))
    return states
