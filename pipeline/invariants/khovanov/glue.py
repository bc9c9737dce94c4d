"""Gluing one crossing to a tangle complex: tensor product, delooping of the new loops.

Part of Bar-Natan's local algorithm (:mod:`.tangle`; D. Bar-Natan, "Fast Khovanov homology
computations", JKTR 16 (2007), 243–255, §5): the complex of T ∪ X is the tensor product of
the complex of T with the two-term complex ``X₀ → X₁{1}`` of the crossing, with the sign
rule ``d(x ⊗ y) = dx ⊗ y + (−1)^|x| x ⊗ dy``; every closed loop it creates is removed by
delooping ``○ ≅ ∅{+1} ⊕ ∅{−1}`` as the objects are made.  The local pieces (glued
objects, topology of glued cobordisms, their delooped normal forms) are memoised.
"""

from __future__ import annotations

import itertools
from functools import lru_cache
from typing import TYPE_CHECKING, Optional

from ...errors import BudgetExceeded
from .cobordism import cycles, expand, reduce_component

if TYPE_CHECKING:
    from .tangle import TangleComplex

__all__ = ["add_crossing", "clear_glue_caches"]

_EMPTY = frozenset()


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


def _glued_table(topo, dots: frozenset, n_src: int, n_tgt: int, top0: Optional[int],
                 modulus: Optional[int]) -> tuple:
    """Every nonzero delooped entry of one glued term: ``((src eps index, tgt eps index,
    terms), ...)``, the eps in ``itertools.product((1, −1), ...)`` order.

    ``top0`` None keeps every power of h; otherwise only the terms without h are kept,
    ``top0 + Σε_tgt − Σε_src`` being twice the number of dots of such a term.  With a
    prime ``modulus`` the coefficients are reduced mod p.
    """
    out = []
    tgt_eps = list(itertools.product((1, -1), repeat=n_tgt))
    for i1, e1 in enumerate(itertools.product((1, -1), repeat=n_src)):
        s1 = sum(e1)
        for i2, e2 in enumerate(tgt_eps):
            terms = _glued_terms(topo, dots, e1, e2)
            if top0 is not None:
                top = top0 + sum(e2) - s1
                terms = tuple((ds, c) for ds, c in terms if 2 * len(ds) == top)
            if modulus:
                terms = tuple((ds, c % modulus) for ds, c in terms if c % modulus)
            if terms:
                out.append((i1, i2, terms))
    return tuple(out)


@lru_cache(maxsize=200_000)
def _entries(m1, m2, smooth, saddle, dots: frozenset, dq: int, h0: bool, modulus: Optional[int]) -> tuple:
    """:func:`_glued_table` of one term (T-side disks of ``m1 ∪ m2`` dotted at ``dots``).

    ``saddle`` None: a term of T's differential ``m1 → m2`` beside the smoothing
    ``smooth`` of the crossing; otherwise ``m1 = m2`` and the identity of T beside the
    saddle with boundary ``saddle`` between the smoothings ``smooth = (X₀, X₁)``.  ``dq``
    is the difference of the quantum shifts of the two objects before delooping.  One
    memo key of small tuples per term, the glued objects and topology looked up inside.
    """
    if saddle is None:
        t_pieces, x_pieces = tuple((c[0], c) for c in cycles(m1, m2)), _strips(smooth)
        g1, g2 = _glue_object(m1, smooth), _glue_object(m2, smooth)
    else:
        t_pieces, x_pieces = _strips(m1), ((None, saddle),)
        g1, g2 = _glue_object(m1, smooth[0]), _glue_object(m1, smooth[1])
    topo = _glue_topology(t_pieces, x_pieces, g1, g2)
    top0 = len(cycles(g1[0], g2[0])) - len(g1[0]) + dq if h0 else None
    return _glued_table(topo, dots, len(g1[1]), len(g2[1]), top0, modulus)


def add_crossing(cx: TangleComplex, pts: tuple[int, int, int, int], sign: int,
                 budget: Optional[int]) -> TangleComplex:
    """The complex of T ∪ X for the crossing X with boundary points ``pts`` (PD order)."""
    p0, p1, p2, p3 = pts
    smooth = (tuple(sorted(((min(p0, p1), max(p0, p1)), (min(p2, p3), max(p2, p3))))),
              tuple(sorted(((min(p0, p3), max(p0, p3)), (min(p1, p2), max(p1, p2))))))
    heights = (0, 1) if sign > 0 else (-1, 0)
    qshift = (1, 2) if sign > 0 else (-2, -1)
    new = cx.new_like()
    ids: dict[tuple[int, int], list] = {}  # (old id, smoothing) -> new ids, eps in product order
    add = new.add_object
    for o, (m, i, q) in cx.objs.items():
        for k in (0, 1):
            g = _glue_object(m, smooth[k])
            ik, qk = i + heights[k], q + qshift[k]
            ids[(o, k)] = [add(g[0], ik, qk + sum(eps)) for eps in itertools.product((1, -1), repeat=len(g[1]))]
    if budget is not None and len(new.objs) > budget:
        raise BudgetExceeded("khovanov", budget)
    one = cx.one
    objs = cx.objs
    for o1, targets in cx.out.items():
        m1, _, q1 = objs[o1]
        for o2, f in targets.items():
            m2, _, q2 = objs[o2]
            for k in (0, 1):
                _connect(new, f, ids[(o1, k)], ids[(o2, k)], (m1, m2, smooth[k], None), q2 - q1, one)
    saddle = (p0, p1, p2, p3)
    unit = {_EMPTY: one}
    dq = qshift[1] - qshift[0]
    for o, (m, i, _) in objs.items():
        _connect(new, unit, ids[(o, 0)], ids[(o, 1)], (m, m, smooth, saddle), dq, -one if i % 2 else one)
    return new


def _connect(new: TangleComplex, f: dict, tab1: list, tab2: list, where: tuple, dq: int, scale) -> None:
    """Set the glued map ``scale · (f ⊔ X)`` between the delooped objects ``tab1``, ``tab2``.

    ``where`` is ``(m1, m2, smooth, saddle)`` of :func:`_entries`.  Every entry of the
    new complex is written by exactly one call (the entries from the differential of T
    join objects of the same smoothing, the saddles objects of the two smoothings of
    one old object), so entries are assigned, not accumulated.
    """
    out, inc, p, h0 = new.out, new.inc, new.modulus, new.h0
    m1, m2, smooth, saddle = where
    if len(f) == 1:
        ((dots, c),) = f.items()
        sc = scale * c
        if p:
            sc %= p
        for i1, i2, terms in _entries(m1, m2, smooth, saddle, dots, dq, h0, p):
            if sc == 1:
                mor = dict(terms)
            elif p:
                mor = {ds: sc * v % p for ds, v in terms}
            else:
                mor = {ds: sc * v for ds, v in terms}
            a, b = tab1[i1], tab2[i2]
            out[a][b] = mor
            inc[b].add(a)
        return
    acc: dict = {}
    for dots, c in f.items():
        sc = scale * c
        for i1, i2, terms in _entries(m1, m2, smooth, saddle, dots, dq, h0, p):
            mor = acc.setdefault((i1, i2), {})
            for ds, v in terms:
                mor[ds] = mor.get(ds, 0) + sc * v
    for (i1, i2), mor in acc.items():
        mor = {ds: c % p for ds, c in mor.items() if c % p} if p else {ds: c for ds, c in mor.items() if c}
        if mor:
            a, b = tab1[i1], tab2[i2]
            out[a][b] = mor
            inc[b].add(a)


def clear_glue_caches() -> None:
    """Empty the memo tables of local gluing."""
    for fn in (_glue_object, _glue_topology, _glued_terms, _entries):
        fn.cache_clear()
