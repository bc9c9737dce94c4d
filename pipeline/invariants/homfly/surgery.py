"""Surgery on signed crossing lists for the skein tree, and its memo keys.

A diagram in the skein tree is a list of crossings ``(a, b, c, d, sign)``: the PD tuple
in the README contract (slot 0 the incoming under-strand, counterclockwise) plus its
sign, so the orientation stays explicit while labels are merged and stop being
consecutive; free loops are counted beside it.  Moves here: crossing switch, oriented
smoothing (one crossing or several at once), removal of crossings "straight through"
(each strand's ends joined: a Reidemeister II pair, or pairs of an antiparallel twist
after a switch), Reidemeister I kinks; and the orientation-respecting normal form used as
the memo key (see :mod:`.skein` for why it is a normal form of the oriented diagram).
"""

from __future__ import annotations

from itertools import permutations
from typing import Optional

from ...diagrams.canonical import canonical_pd
from ...diagrams.diagram import Diagram
from ...numbers import UnionFind

__all__ = ["Cross", "merge", "reduce_kinks", "normal_key", "first_bad", "switch",
           "smooth", "smooth_all", "straight_through"]

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


def merge(xs: list[Cross], pairs, removed: set[int]) -> tuple[list[Cross], int]:
    """Drop crossings ``removed``, identify the label pairs; return (crossings, new free loops)."""
    uf = UnionFind()
    for u, w in pairs:
        uf.union(u, w)
    find = uf.find
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


def reduce_kinks(xs: list[Cross], loops: int) -> tuple[list[Cross], int, bool]:
    """Remove Reidemeister I kinks until none is left."""
    changed = False
    while (i := _kink(xs)) is not None:
        x = xs[i]
        k = next(k for k in range(4) if x[k] == x[(k + 1) % 4])
        p, q = x[(k + 2) % 4], x[(k + 3) % 4]
        xs, extra = merge(xs, [(p, x[k]), (x[k], q)], {i})
        loops += extra
        changed = True
    return xs, loops, changed


def normal_key(xs: list[Cross], loops: int) -> tuple[tuple[Cross, ...], int]:
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
                bad = first_bad(ys)[1]
                if choice is None or bad < choice[0]:
                    choice = (bad, r)
            shifts.append(choice[1])
        ys = _label_walk(xs, comps, order, shifts)
        bad = first_bad(ys)[1]
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
        bad = first_bad(ys)[1]
        if best is None or bad < best[0]:
            best = (bad, ys)
    return tuple(sorted(best[1]))


def first_bad(xs: list[Cross]) -> tuple[Optional[int], int, int]:
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


def switch(x: Cross) -> Cross:
    a, b, c, d, s = x
    return (d, a, b, c, -1) if s > 0 else (b, c, d, a, 1)


def smooth(xs: list[Cross], i: int) -> tuple[list[Cross], int]:
    a, b, c, d, s = xs[i]
    return merge(xs, [(a, b), (d, c)] if s > 0 else [(a, d), (b, c)], {i})



def smooth_all(xs: list[Cross], crossings) -> tuple[list[Cross], int]:
    """Oriented smoothing of every crossing in ``crossings`` at once; (crossings, new loops)."""
    pairs = []
    for i in crossings:
        a, b, c, d, s = xs[i]
        pairs += [(a, b), (d, c)] if s > 0 else [(a, d), (b, c)]
    return merge(xs, pairs, set(crossings))


def straight_through(xs: list[Cross], crossings) -> tuple[list[Cross], int]:
    """Remove ``crossings`` joining each strand's ends (a ↔ c, b ↔ d); (crossings, new loops).

    An isotopy when the crossings are removable Reidemeister II pairs; used also on pairs
    of an antiparallel twist, where it is the diagram with one crossing of each pair switched
    and the pair removed by Reidemeister II.
    """
    pairs = []
    for i in crossings:
        a, b, c, d, _ = xs[i]
        pairs += [(a, c), (b, d)]
    return merge(xs, pairs, set(crossings))
