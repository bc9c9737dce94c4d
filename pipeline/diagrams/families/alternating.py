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
level, and deduplicate by the alternating map code of the shadow
(:func:`pipeline.diagrams.shadow.alternating_codes`, the smaller of the diagram's and
its mirror's, so a shadow is taken up to every homeomorphism of the sphere).

At the last level the one-component shadows (or all, for links) are grouped into
flype classes up to mirror image: two shadows are joined when a flype
(:mod:`pipeline.diagrams.flype`) or the mirror takes one alternating diagram to the
other.  By the flyping theorem (W. Menasco, M. Thistlethwaite, Annals of Math. 138,
1993) the groups are exactly the prime alternating link types up to mirror image,
and every flype of an enumerated diagram is again an enumerated diagram, so the
union of one-step flypes finds whole classes.

Order (documented, deterministic)
---------------------------------
Each type is given by ``code``: of the type and its mirror image, the
:func:`pipeline.diagrams.flype.flype_code` whose alternating map code is smaller (so
``flype_code(diagram_of_code(code)) == code`` and ``code`` is one of
``flype_codes(...)``); its diagram is the diagram of that code.  Types are sorted by
code (shortest text first, then as a string) and numbered from 1: ``diagram(n, i)``
is the i-th.  With ``links=True`` the knots come first in the same order, then the
links (components > 1) sorted the same way.  The order depends only on the codes,
not on the generation.

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

import random
from functools import lru_cache
from typing import Iterator

from ...errors import NotationError
from ..canonical import canonical_text
from ..diagram import Diagram
from ..flype import _order, diagram_of_code
from ..flype_circuits import twist_count
from ..shadow import (alternating_codes, alternating_over, apply_shadow_flype, extensions,
                      n_components, prime_reduced, shadow_flypes, to_diagram, twins)

__all__ = ["MIN_CROSSINGS", "MAX_CROSSINGS", "codes", "diagrams", "diagram", "from_notation",
           "random_diagram"]

MIN_CROSSINGS = 1
MAX_CROSSINGS = 16


# ---------------------------------------------------------------------- shadows
def _key(tw: list[int]) -> tuple[int, ...]:
    """The shadow up to every homeomorphism of the sphere (the smaller mirror code)."""
    return min(alternating_codes(tw, alternating_over(tw)))


@lru_cache(maxsize=None)
def _level(n: int) -> tuple[tuple[int, ...], ...]:
    """Every prime reduced shadow with n >= 2 crossings (twin arrays), by key."""
    if n == 2:
        return (tuple(twins(Diagram.from_pd([(4, 1, 3, 2), (2, 3, 1, 4)]))),)
    found: dict[tuple[int, ...], tuple[int, ...]] = {}
    for tw in _level(n - 1):
        for new in extensions(list(tw)):
            if prime_reduced(new):
                k = _key(new)
                if k not in found:
                    found[k] = tuple(new)
    return tuple(found[k] for k in sorted(found))


def _last_level(n: int, one_component: bool) -> Iterator[list[int]]:
    """The shadows of the last level with (or without) one component, deduplicated."""
    seen: set[tuple[int, ...]] = set()
    for tw in _level(n - 1):
        for new in extensions(list(tw)):
            if (n_components(new) == 1) == one_component and prime_reduced(new):
                k = _key(new)
                if k not in seen:
                    seen.add(k)
                    yield new


def _classes(shadows: list[list[int]]) -> list[str]:
    """Flype classes up to mirror of the alternating diagrams on ``shadows``.

    Returns the code of each class: the canonical text of the alternating diagram (or
    its mirror) with the fewest twist regions and then the smallest alternating map
    code in the class (the rule of :func:`pipeline.diagrams.flype.flype_code`).
    """
    keys = {}
    best = {}
    for tw in shadows:
        over = alternating_over(tw)
        c0, c1 = alternating_codes(tw, over)
        k = min(c0, c1)
        keys[k] = (tw, over)
        tc = twist_count(tw)  # the class code: fewest twist regions first (flype_code)
        best[k] = ((tc, c0), False) if c0 <= c1 else ((tc, c1), True)
    parent = {k: k for k in keys}

    def find(k):
        while parent[k] != k:
            parent[k] = parent[parent[k]]
            k = parent[k]
        return k

    for k, (tw, over) in keys.items():
        for m in shadow_flypes(tw):
            tw2, _ = apply_shadow_flype(tw, over, m)
            a, b = find(k), find(_key(tw2))
            if a != b:
                parent[max(a, b)] = min(a, b)
    out = {}
    for k in keys:
        r = find(k)
        if r not in out or best[k] < best[out[r]]:
            out[r] = k
    codes = []
    for k in out.values():
        tw, over = keys[k]
        flip = best[k][1]
        codes.append(canonical_text(to_diagram(tw, [o != flip for o in over])))
    return sorted(codes, key=_order)


def _check_n(n: int) -> None:
    if isinstance(n, bool) or not isinstance(n, int) or not MIN_CROSSINGS <= n <= MAX_CROSSINGS:
        raise NotationError(
            f"alternating: crossings = {n!r} is outside [{MIN_CROSSINGS}, {MAX_CROSSINGS}]")


@lru_cache(maxsize=None)
def _codes(n: int, one_component: bool) -> tuple[str, ...]:
    if n < 2:
        return ()
    if n == 2:
        return () if one_component else tuple(_classes([list(t) for t in _level(2)]))
    return tuple(_classes(list(_last_level(n, one_component))))


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


def random_diagram(n: int, *, seed: int = 0) -> Diagram:
    """A reduced prime alternating diagram with n >= 2 crossings, grown at random.

    From the Hopf shadow, repeatedly a random extension (:func:`extensions`) that stays
    prime and reduced is taken; deterministic in ``seed``, not uniformly distributed.
    Any size (no [1, 16] limit): meant for tests and benchmarks.
    """
    if isinstance(n, bool) or not isinstance(n, int) or n < 2:
        raise NotationError(f"alternating: random diagram size {n!r} must be an integer >= 2")
    rng = random.Random(seed)
    tw = list(_level(2)[0])
    while len(tw) < 4 * n:
        options = list(extensions(tw))
        rng.shuffle(options)
        tw = next(e for e in options if prime_reduced(e))
    return to_diagram(tw, alternating_over(tw))
