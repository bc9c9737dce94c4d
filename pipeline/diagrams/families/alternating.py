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
from typing import Iterator

from ...errors import NotationError
from ..diagram import Diagram
from ..flype import _order, diagram_of_code, flype_codes
from ..shadow import alternating_codes, alternating_over, extensions, n_components, prime_reduced, to_diagram, twins
from ..shadow_canonical import NEW_SMOOTHING, one_flype_fewer_regions, shadow_code, smoothing

__all__ = ["MIN_CROSSINGS", "MAX_CROSSINGS", "codes", "diagrams", "diagram", "from_notation",
           "random_diagram"]

MIN_CROSSINGS = 1
MAX_CROSSINGS = 16


# ---------------------------------------------------------------------- shadows
def _hopf() -> list[int]:
    """The Hopf shadow (two crossings, Tait graph two parallel edges)."""
    return twins(Diagram.from_pd([(4, 1, 3, 2), (2, 3, 1, 4)]))


def _smoothing_type(ref: int, eps: int, tp: int) -> int:
    """The smoothing type (:func:`smoothing`'s t) joining the labelled slot positions
    (tp, tp + 1) and (tp + 2, tp + 3) of a crossing with entry slot ``ref``."""
    return (ref + tp) & 1 if eps == 1 else (ref - tp - 1) & 1


def _canonical_child(tw: list[int], x: int) -> tuple[tuple[int, ...], bool]:
    """(shadow code, whether smoothing crossing ``x`` back is the canonical deletion).

    The canonical deletion is the first (crossing, smoothing) in the canonical
    labelling (crossing number, then labelled type 0, 1) whose smoothing is prime and
    reduced; the added crossing qualifies iff some best start labels it so.
    """
    code, labels = shadow_code(tw)
    order, ref, eps = labels[0]
    for q in range(len(order)):
        for tp in (0, 1):
            s = smoothing(tw, order[q], _smoothing_type(ref[q], eps, tp))
            if s is not None and prime_reduced(s):
                return code, any(o[q] == x and _smoothing_type(r[q], e, tp) == NEW_SMOOTHING
                                 for o, r, e in labels)
    return code, False  # no prime reduced smoothing: impossible for >= 3 crossings (Tutte)


def _shadows(n: int, keep=None) -> Iterator[tuple[list[int], tuple[int, ...]]]:
    """(twins, shadow code) of every prime reduced shadow with n >= 2 crossings, once each.

    Depth first by canonical augmentation (module notes); ``keep`` filters the last
    level before the canonical test (e.g. one component).
    """
    if n == 2:
        tw = _hopf()
        if keep is None or keep(tw):
            yield tw, shadow_code(tw)[0]
        return

    def grow(tw: list[int]):
        m = len(tw) // 4 + 1
        seen = set()          # the accepted children of this parent (automorphic extensions)
        for new in extensions(tw):
            if m == n and keep is not None and not keep(new):
                continue
            if not prime_reduced(new):
                continue
            code, ok = _canonical_child(new, m - 1)
            if not ok or code in seen:
                continue
            seen.add(code)
            if m == n:
                yield new, code
            else:
                yield from grow(new)

    yield from grow(_hopf())


def _class_code(tw: list[int], code: tuple[int, ...]) -> str | None:
    """The type's code when the shadow ``tw`` (shadow code ``code``) is its canonical
    member (the shadow of the code's diagram), else None.

    Shadows that one flype takes to fewer twist regions are passed over without a
    flype search; that is only a shortcut if the canonical member never is such a
    shadow, which is checked on every code found (a code's diagram that fails it
    raises, instead of a type silently missing).
    """
    if one_flype_fewer_regions(tw):
        return None
    a, b = flype_codes(to_diagram(tw, alternating_over(tw)))
    if a != b:
        da, db = diagram_of_code(a), diagram_of_code(b)
        if alternating_codes(twins(db), [True] * db.n_crossings)[0] < \
                alternating_codes(twins(da), [True] * da.n_crossings)[0]:
            a = b
    best = twins(diagram_of_code(a))
    if one_flype_fewer_regions(best):
        raise AssertionError("alternating: a class code's diagram is not a fewest-twist-region member "
                             "(the shortcut of _class_code no longer holds)")
    return a if shadow_code(best)[0] == code else None


_CACHE: dict[tuple[int, bool], tuple[str, ...]] = {}


def _codes(n: int, one_component: bool) -> tuple[str, ...]:
    """The sorted codes of the knots (``one_component``) or links with n crossings."""
    if (n, one_component) not in _CACHE:
        knots, links = [], []
        keep = (lambda tw: n_components(tw) == 1) if one_component else None
        for tw, code in (_shadows(n, keep) if n >= 2 else ()):
            c = _class_code(tw, code)
            if c is not None:
                (knots if n_components(tw) == 1 else links).append(c)
        _CACHE[n, True] = tuple(sorted(knots, key=_order))
        if not one_component:
            _CACHE[n, False] = tuple(sorted(links, key=_order))
    return _CACHE[n, one_component]


def _check_n(n: int) -> None:
    if isinstance(n, bool) or not isinstance(n, int) or not MIN_CROSSINGS <= n <= MAX_CROSSINGS:
        raise NotationError(
            f"alternating: crossings = {n!r} is outside [{MIN_CROSSINGS}, {MAX_CROSSINGS}]")


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
    tw = _hopf()
    while len(tw) < 4 * n:
        options = list(extensions(tw))
        rng.shuffle(options)
        tw = next(e for e in options if prime_reduced(e))
    return to_diagram(tw, alternating_over(tw))
