"""Dotted cobordisms between crossingless matchings, in normal form.

The morphisms of Bar-Natan's category of dotted cobordisms [1]_ [2]_ between two
crossingless matchings ``M₁, M₂`` of the same boundary points, modulo the local
relations of the Bar-Natan theory over a field k with a formal variable h
(sphere = 0, dotted sphere = 1, two dots = h·dot, neck cutting
``tube = dot₁ + dot₂ − h``), form the free k[h]-module with basis: one disk per cycle
of ``M₁ ∪ M₂``, each disk with or without a dot [2, §4].  A morphism is stored as
``{frozenset(dotted cycles): coefficient}``, a cycle named by its smallest boundary
point.  Everything is graded (``deg h = −2``, a dot −2, a cobordism C has degree
``χ(C) − #points/2``) and every map in the complexes is homogeneous of degree 0, so
the power of h of a term is fixed by the gradings of its ends; it is never stored.

Reduction.  A connected surface of genus g with d dots and k boundary circles is the
element ``Δ^(k−1)(x^d (2x − h)^g)`` of ``A^{⊗k}``, ``A = k[h][x]/(x² − hx)``
(a dotted disk on a circle is ``x``, a plain disk ``1``).  Since ``x² = hx`` and
``(2x − h)² = h²``, ``x^d (2x − h)^g`` is ``h^(d−1+g)·x`` for ``d ≥ 1``, ``h^g·1`` for
``d = 0`` and g even, ``h^(g−1)·(2x − h)`` for ``d = 0`` and g odd; and
``Δ^(k−1)(1) = Σ_{|T| ≤ k−1} (−h)^(k−1−|T|) x^T``, ``Δ^(k−1)(x) = x^{⊗k}``.
At ``h = 0`` this is Khovanov's theory; over Q the theory with h gives Rasmussen's s
(Khovanov [3]_; Mackaay–Turner–Vaz [4]_).

References
----------
.. [1] D. Bar-Natan, "Khovanov's homology for tangles and cobordisms",
   Geom. Topol. 9 (2005), 1443–1499.
.. [2] D. Bar-Natan, "Fast Khovanov homology computations", JKTR
   16 (2007), 243–255.
.. [3] M. Khovanov, "Link homology and Frobenius extensions", Fund. Math. 190 (2006).
.. [4] M. Mackaay, P. Turner, P. Vaz, "A remark on Rasmussen's invariant of knots",
   JKTR 16 (2007).
"""

from __future__ import annotations

import itertools
from functools import lru_cache

__all__ = ["Matching", "cycles", "reduce_component", "add_term", "expand", "compose_topology", "compose"]

#: A crossingless matching: sorted tuple of sorted pairs of boundary points.
Matching = tuple[tuple[int, int], ...]


@lru_cache(maxsize=50_000)
def cycles(m1: Matching, m2: Matching) -> tuple[tuple[int, ...], ...]:
    """The cycles of ``m1 ∪ m2`` as sorted point tuples, ordered by their smallest point."""
    nxt1, nxt2 = {}, {}
    for a, b in m1:
        nxt1[a], nxt1[b] = b, a
    for a, b in m2:
        nxt2[a], nxt2[b] = b, a
    seen, out = set(), []
    for p in sorted(nxt1):
        if p in seen:
            continue
        cyc, x, use1 = [], p, True
        while True:
            seen.add(x)
            cyc.append(x)
            x = nxt1[x] if use1 else nxt2[x]
            use1 = not use1
            if x == p and use1:
                break
        out.append(tuple(sorted(set(cyc))))
    return tuple(out)


def reduce_component(circles: tuple[int, ...], chi: int, dots: int) -> list[tuple[frozenset, int]]:
    """Normal form of a connected surface: ``[(dotted circles, integer coefficient), ...]``.

    ``circles`` are its boundary circles (possibly none: a closed surface, a scalar),
    ``chi`` its Euler characteristic, ``dots`` its number of dots (module docstring).
    """
    k = len(circles)
    twice_g = 2 - chi - k
    if twice_g < 0 or twice_g % 2:
        raise ArithmeticError(f"khovanov: surface with chi={chi} and {k} boundary circles")
    g = twice_g // 2
    if dots:
        a, b = 0, 1
    elif g % 2 == 0:
        a, b = 1, 0
    else:
        a, b = -1, 2
    if k == 0:
        return [(frozenset(), b)] if b else []
    out = [(frozenset(circles), b)] if b else []
    if a:
        for size in range(k):
            c = a if (k - 1 - size) % 2 == 0 else -a
            out.extend((frozenset(t), c) for t in itertools.combinations(circles, size))
    return out


def add_term(into: dict, key, value) -> None:
    """``into[key] += value``, keeping only nonzero coefficients."""
    new = into.get(key, 0) + value
    if new:
        into[key] = new
    else:
        into.pop(key, None)


def expand(parts: list[list[tuple[frozenset, int]]], scale, into: dict) -> None:
    """Add ``scale · Π parts`` (a product of per-component normal forms) into ``into``."""
    for combo in itertools.product(*parts):
        coeff = scale
        dots = frozenset()
        for ds, c in combo:
            coeff = coeff * c
            if ds:
                dots = dots | ds
        if coeff:
            add_term(into, dots, coeff)


@lru_cache(maxsize=50_000)
def compose_topology(m1: Matching, m2: Matching, m3: Matching):
    """Connected components of (cobordism m1→m2) ∘ (cobordism m2→m3) in disk normal form.

    Returns a tuple of components ``(cycles of m1∪m2, cycles of m2∪m3, chi,
    cycles of m1∪m3)``; cycles are named by their smallest point.
    """
    c12, c23, c13 = cycles(m1, m2), cycles(m2, m3), cycles(m1, m3)
    at12 = {p: cyc[0] for cyc in c12 for p in cyc}
    at23 = {p: cyc[0] for cyc in c23 for p in cyc}
    parent = {("a", c[0]): ("a", c[0]) for c in c12}
    parent.update({("b", c[0]): ("b", c[0]) for c in c23})

    def find(x):
        while parent[x] != x:
            x = parent[x]
        return x

    for p, _ in m2:  # glue along every arc of m2
        ra, rb = find(("a", at12[p])), find(("b", at23[p]))
        if ra != rb:
            parent[ra] = rb
    comps: dict = {}
    for c in c12:
        comps.setdefault(find(("a", c[0])), [[], [], 0, []])[0].append(c[0])
    for c in c23:
        comps.setdefault(find(("b", c[0])), [[], [], 0, []])[1].append(c[0])
    arcs: dict = {}
    for p, _ in m2:
        r = find(("a", at12[p]))
        arcs[r] = arcs.get(r, 0) + 1
    for c in c13:
        comps[find(("a", at12[c[0]]))][3].append(c[0])
    return tuple((frozenset(a), frozenset(b), len(a) + len(b) - arcs.get(r, 0), tuple(c))
                 for r, (a, b, _, c) in comps.items())


@lru_cache(maxsize=100_000)
def _compose_terms(m1: Matching, m2: Matching, m3: Matching, d1: frozenset, d2: frozenset) -> tuple:
    """Normal form of (disks of m1∪m2 dotted at d1) then (disks of m2∪m3 dotted at d2)."""
    parts = [reduce_component(circ, chi, len(d1 & a) + len(d2 & b))
             for a, b, chi, circ in compose_topology(m1, m2, m3)]
    if not all(parts):
        return ()
    out: dict = {}
    expand(parts, 1, out)
    return tuple(out.items())


def compose(m1: Matching, m2: Matching, m3: Matching, f: dict, g: dict, scale) -> dict:
    """``scale · (g ∘ f)`` for ``f: m1 → m2`` and ``g: m2 → m3`` in normal form."""
    if not m2:  # scalars (matchings of no points)
        return {frozenset(): scale * f[frozenset()] * g[frozenset()]}
    out: dict = {}
    for d1, c1 in f.items():
        for d2, c2 in g.items():
            sc = scale * c1 * c2
            for ds, v in _compose_terms(m1, m2, m3, d1, d2):
                add_term(out, ds, sc * v)
    return out
