"""Every prime alternating knot (and, optionally, link) with n crossings, one diagram each.

Method (4-regular planar maps with our own canonical form)
-----------------------------------------------------------
A *shadow* is a connected 4-valent map on the sphere; it is the medial graph of its
checkerboard (Tait) graph G, and the alternating diagram on it is unique up to mirror
image.  The alternating diagram is reduced and visibly prime iff G is 2-connected
(a loop or bridge of G is a nugatory crossing, a cut vertex of G or of its dual a
circle meeting the diagram twice).  For a 2-connected G with at least three edges
and every edge e, G − e or G / e is 2-connected (W. T. Tutte, "Graph theory",
Addison-Wesley 1984, ch. III: deletion/contraction of 2-connected graphs), and both
correspond to *smoothing* the crossing of e in the medial.  So every prime reduced
shadow with n crossings arises from one with n − 1 crossings by the inverse move:
inside a face, pull two of its boundary edges together into a new crossing.  We grow
all prime reduced shadows from the Hopf shadow (G = two parallel edges), level by
level, and deduplicate by the canonical text of the alternating diagram
(:func:`pipeline.diagrams.canonical.canonical_text`, minimised with its mirror, so a
shadow is taken up to every homeomorphism of the sphere).

At the last level the one-component shadows (or all, for links) are grouped into
flype classes up to mirror image: two shadows are joined when a flype
(:mod:`pipeline.diagrams.flype`) or the mirror takes one alternating diagram to the
other.  By the flyping theorem (W. Menasco, M. Thistlethwaite, Annals of Math. 138,
1993) the groups are exactly the prime alternating link types up to mirror image,
and every flype of an enumerated diagram is again an enumerated diagram, so the
union of one-step flypes finds whole classes.

Order (documented, deterministic)
---------------------------------
Each type is given by ``code`` = the smaller (shortest, then as a string) of the
flype codes of the type and of its mirror (:func:`pipeline.diagrams.flype.flype_codes`);
its diagram is the diagram of that code.  Types are sorted by code and numbered
from 1: ``diagram(n, i)`` is the i-th.  With ``links=True`` the knots come first in
the same order, then the links (components > 1) sorted by code.  The order depends
only on the codes, not on the generation.

Counts checked in the tests: 1, 1, 2, 3, 7, 18, 41, 123 prime alternating knots for
n = 3…10 (J. Hoste, M. Thistlethwaite, J. Weeks, "The first 1,701,936 knots",
Math. Intelligencer 20, 1998).

Memory: the levels below n are held in memory (a few MB through 11 crossings); the
classes of the last level are formed before the first row is yielded, so this is
not a constant-memory stream (see reports/bench_flype.md).

References
----------
1. W. Menasco, M. Thistlethwaite, "The classification of alternating links",
   Annals of Math. 138 (1993) 113–171.
2. J. Hoste, M. Thistlethwaite, J. Weeks, "The first 1,701,936 knots",
   Math. Intelligencer 20 (1998) 33–48.
3. W. T. Tutte, "Graph theory", Addison-Wesley (1984).
"""

from __future__ import annotations

from functools import lru_cache
from typing import Iterator

from ...errors import NotationError
from ..builder import PlanarBuilder
from ..canonical import canonical_text
from ..diagram import Diagram
from ..flype import _order, diagram_of_code, flypes

__all__ = ["MIN_CROSSINGS", "MAX_CROSSINGS", "codes", "diagrams", "diagram", "from_notation"]

MIN_CROSSINGS = 1
MAX_CROSSINGS = 16


# ---------------------------------------------------------------------- shadows
def _faces(tw: list[int]) -> list[int]:
    """Face index of every flat slot (walk: along the edge, then the next slot ccw)."""
    face = [-1] * len(tw)
    k = 0
    for h0 in range(len(tw)):
        if face[h0] >= 0:
            continue
        h = h0
        while face[h] < 0:
            face[h] = k
            g = tw[h]
            h = (g & ~3) | ((g + 1) & 3)
        k += 1
    return face


def _prime_reduced(tw: list[int]) -> bool:
    """No nugatory crossing and no two faces sharing two edges."""
    face = _faces(tw)
    for b in range(0, len(tw), 4):
        if face[b] == face[b + 2] or face[b + 1] == face[b + 3]:
            return False
    pairs = set()
    for h, g in enumerate(tw):
        if h < g:
            p = (face[h], face[g]) if face[h] < face[g] else (face[g], face[h])
            if p in pairs:
                return False
            pairs.add(p)
    return True


def _n_components(tw: list[int]) -> int:
    seen = [False] * len(tw)
    k = 0
    for h0 in range(len(tw)):
        if seen[h0]:
            continue
        k += 1
        h = h0
        while not seen[h]:
            seen[h] = seen[h ^ 2] = True
            h = tw[h ^ 2]
    return k


def _extensions(tw: list[int]) -> Iterator[list[int]]:
    """Every shadow with one more crossing pulled out of two edges of one face."""
    face = _faces(tw)
    cycles: dict[int, list[int]] = {}
    for h, f in enumerate(face):
        cycles.setdefault(f, [])
    for f in cycles:
        h0 = face.index(f)
        h, cyc = h0, []
        while True:
            cyc.append(h)
            g = tw[h]
            h = (g & ~3) | ((g + 1) & 3)
            if h == h0:
                break
        cycles[f] = cyc
    x = len(tw)
    for cyc in cycles.values():
        for a in range(len(cyc)):
            for b in range(a + 1, len(cyc)):
                ha, hb = cyc[a], cyc[b]
                ga, gb = tw[ha], tw[hb]
                if hb in (ga, ha) or {ha, ga} & {hb, gb}:
                    continue
                new = tw + [0, 0, 0, 0]
                for p, q in ((ha, x), (gb, x + 1), (hb, x + 2), (ga, x + 3)):
                    new[p], new[q] = q, p
                yield new


def _tw_of(d: Diagram) -> list[int]:
    tw = [0] * (4 * len(d.pd))
    for (i, s), (j, t) in d._slots_of.values():
        tw[4 * i + s], tw[4 * j + t] = 4 * j + t, 4 * i + s
    return tw


def _alternating(tw: list[int]) -> Diagram:
    """The alternating diagram on a shadow (one of the mirror pair)."""
    face = _faces(tw)
    colour: dict[int, int] = {face[0]: 0}
    stack = [face[0]]
    beside: dict[int, list[int]] = {}
    for h, g in enumerate(tw):
        beside.setdefault(face[h], []).append(face[g])
    while stack:
        f = stack.pop()
        for g in beside[f]:
            if g not in colour:
                colour[g] = 1 - colour[f]
                stack.append(g)
    b = PlanarBuilder()
    n = len(tw) // 4
    for i in range(n):  # corner (0, 1) of crossing i is the face of slot (i, 1)
        b.crossing(over_odd=colour[face[4 * i + 1]] == 0)
    for h, g in enumerate(tw):
        if h < g:
            b.join((h // 4, h % 4), (g // 4, g % 4))
    return b.diagram()


def _key(d: Diagram) -> str:
    return min(canonical_text(d), canonical_text(d.mirror()), key=_order)


@lru_cache(maxsize=None)
def _level(n: int) -> tuple[tuple[int, ...], ...]:
    """Every prime reduced shadow with n >= 2 crossings (flat twin arrays), sorted."""
    if n == 2:
        return (tuple(_tw_of(Diagram.from_pd([(4, 1, 3, 2), (2, 3, 1, 4)]))),)
    found: dict[str, tuple[int, ...]] = {}
    for tw in _level(n - 1):
        for new in _extensions(list(tw)):
            if _prime_reduced(new):
                k = _key(_alternating(new))
                if k not in found:
                    found[k] = tuple(new)
    return tuple(found[k] for k in sorted(found, key=_order))


def _classes(keys: list[str]) -> list[str]:
    """Group shadow keys into flype classes up to mirror; the smallest key of each."""
    parent = {k: k for k in keys}

    def find(k: str) -> str:
        while parent[k] != k:
            parent[k] = parent[parent[k]]
            k = parent[k]
        return k

    for k in keys:
        for e in flypes(diagram_of_code(k)):
            a, b = find(k), find(_key(e))
            if a != b:
                if _order(a) < _order(b):
                    a, b = b, a
                parent[a] = b
    return sorted({find(k) for k in keys}, key=_order)


def _check_n(n: int) -> None:
    if isinstance(n, bool) or not isinstance(n, int) or not MIN_CROSSINGS <= n <= MAX_CROSSINGS:
        raise NotationError(
            f"alternating: crossings = {n!r} is outside [{MIN_CROSSINGS}, {MAX_CROSSINGS}]")


@lru_cache(maxsize=None)
def _codes(n: int, one_component: bool) -> tuple[str, ...]:
    if n < 2:
        return ()
    keys = []
    for tw in _level(n):
        if (_n_components(list(tw)) == 1) == one_component:
            keys.append(_key(_alternating(list(tw))))
    return tuple(_classes(keys))


def codes(n: int, *, links: bool = False) -> list[str]:
    """The codes of the prime alternating knots (then links) with n crossings, in order.

    Each code is the smaller of a type's flype code and its mirror's, a ``pd:`` text.

    Raises
    ------
    NotationError
        ``n`` outside [1, 16] (one line).
    """
    _check_n(n)
    out = list(_codes(n, True))
    if links:
        out += _codes(n, False)
    return out


def diagrams(n: int, *, links: bool = False) -> Iterator[Diagram]:
    """One reduced prime alternating diagram per type with n crossings, up to mirror.

    Parameters
    ----------
    n : int
        Crossing number, 1 <= n <= 16 (1 and 2 give no knots; 2 gives the Hopf link
        with ``links=True``).
    links : bool
        Also prime alternating links (after the knots).

    Yields
    ------
    Diagram
        The diagram of each type's code, in the documented order (index 1, 2, ...).
    """
    for code in codes(n, links=links):
        yield diagram_of_code(code)


def diagram(n: int, i: int, *, links: bool = False) -> Diagram:
    """The i-th (1-based) type of :func:`diagrams`."""
    cs = codes(n, links=links)
    if isinstance(i, bool) or not isinstance(i, int) or not 1 <= i <= len(cs):
        raise NotationError(
            f"alternating: index {i!r} is outside [1, {len(cs)}] for {n} crossings")
    return diagram_of_code(cs[i - 1])


def from_notation(args: str, *, links: bool = False) -> Diagram:
    """Parse ``N:I`` (the arguments of the notation ``alt:N:I``) to :func:`diagram`."""
    parts = args.strip().split(":")
    if len(parts) != 2 or not all(p.strip().isdigit() for p in parts):
        raise NotationError(f"alt: {args!r} is not N:I (crossings and a 1-based index)")
    return diagram(int(parts[0]), int(parts[1]), links=links)
