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
correspond to *smoothing* the crossing of e in the medial.  So every prime reduced shadow with
n >= 3 crossings arises from one with n − 1 crossings by the inverse move
(:func:`pipeline.diagrams.shadow.extensions`: inside a face, pull two of its boundary
edges together into a new crossing).

Canonical augmentation (B. D. McKay, "Isomorph-free exhaustive generation",
J. Algorithms 26 (1998) 306–324).  The shadows are grown depth first from the Hopf
shadow (G = two parallel edges) and nothing of a level is stored.  A child C (n
crossings, prime reduced) of a parent P is accepted iff (i) the pair (new crossing x,
the smoothing of x that gives P back) is, under an automorphism of C, the *canonical
deletion* of C, and (ii) no automorphic extension of the same P was accepted before
(a set of the accepted children's codes of this one parent).  The canonical deletion
is read off the canonical labelling of C
(:func:`pipeline.diagrams.shadow_canonical.shadow_code`: the smallest map code over
every start, with every start reaching it, i.e. one orbit of Aut(C)): among the pairs
whose smoothing is prime and reduced, those at crossings with the smallest invariant
of their starts (:func:`~pipeline.diagrams.shadow_canonical.start_invariants`, so most
children are rejected before any walk), and of these the first (crossing number,
smoothing type) in that labelling.  *Every shadow is produced exactly once*, by induction on n (n = 2: the Hopf
shadow alone):

* at least once: C has a prime reduced smoothing (the lemma above, n >= 3), so its
  canonical deletion (c*, t*) exists and smooths C to a prime reduced P*, which by
  induction is isomorphic to exactly one generated P; the isomorphism carries the
  inverse move to an extension of P that gives a copy of C whose added crossing is
  the image of c*, so (i) holds for it; (ii) can only drop it if an isomorphic child of
  the same P was accepted already;
* at most once: if C is accepted from P1 and from P2, both added pairs are in the
  orbit of the canonical deletion, so P1 ≅ P2 (smoothing an orbit of pairs gives one
  shadow up to isomorphism), hence P1 = P2 by induction, and (ii) keeps one child.

At the last level the one-component shadows (or all, for links) are taken.  A type's
*canonical member* is the shadow of its code's diagram (below); a shadow is emitted
only when it is the canonical member of its own flype class (its
:func:`pipeline.diagrams.flype.flype_codes` give the type's code, whose diagram's
shadow code equals its own), so classes need no table: each type is emitted from
exactly one shadow.  By the flyping theorem (W. Menasco, M. Thistlethwaite, Annals of
Math. 138, 1993) flype classes up to mirror image are exactly the prime alternating
link types up to mirror image.  The codes come from the compositional route of
:mod:`pipeline.diagrams.flype_tree` (no orbit search), a few milliseconds a shadow.

Order (documented, deterministic)
---------------------------------
Each type is given by ``code``: of the type's and its mirror image's
:func:`pipeline.diagrams.flype.flype_code` (``ft:`` texts) the smaller one, shortest
text first, then as a string (so ``flype_code(diagram_of_code(code)) == code`` and
``code`` is one of ``flype_codes(...)``); its diagram is the member that code
describes (:func:`pipeline.diagrams.flype.diagram_of_code`).  Types are sorted by
code (shortest text first, then as a string) and numbered from 1: ``diagram(n, i)``
is the i-th.  With ``links=True`` the knots come first in the same order, then the
links (components > 1) sorted the same way.  The order depends only on the codes,
not on the generation.

Counts checked in the tests: 1, 1, 2, 3, 7, 18, 41, 123 prime alternating knots for
n = 3…10; the benchmark also reaches 367, 1288, 4878 for n = 11, 12, 13 (J. Hoste,
M. Thistlethwaite, J. Weeks, "The first 1,701,936 knots", Math. Intelligencer 20,
1998).

Memory: the generation holds only the current path of the depth-first search (at
most n parents with their pending extensions and the codes of their accepted
children) — flat in n.  To sort the types, the codes of level n are held (a list of
``ft:`` texts, under 1 MB for the 4878 knots of n = 13) and cached per (n, links) for
:func:`diagram`; measured in reports/bench_alternating_enum.md.

References
----------
1. W. Menasco, M. Thistlethwaite, "The classification of alternating links",
   Annals of Math. 138 (1993) 113–171.
2. J. Hoste, M. Thistlethwaite, J. Weeks, "The first 1,701,936 knots",
   Math. Intelligencer 20 (1998) 33–48.
3. W. T. Tutte, "Graph theory", Addison-Wesley (1984).
4. B. D. McKay, "Isomorph-free exhaustive generation", J. Algorithms 26 (1998) 306–324.
"""

from __future__ import annotations

import random
from typing import Iterator

from ...errors import NotationError
from ..diagram import Diagram
from ..flype import _order, diagram_of_code, flype_codes
from ..shadow import alternating_over, extensions, n_components, prime_reduced, to_diagram, twins
from ..shadow_canonical import NEW_SMOOTHING, shadow_code, smoothing, start_invariants

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


def _canonical_child(tw: list[int], x: int) -> tuple[tuple[int, ...] | None, bool]:
    """(shadow code or None, whether smoothing crossing ``x`` back is the canonical deletion).

    The canonical deletion: among the (crossing, smoothing) pairs whose smoothing is
    prime and reduced, those at crossings with the smallest crossing invariant (the
    least :func:`~pipeline.diagrams.shadow_canonical.start_invariants` of its eight
    starts); of these the first in the canonical labelling (crossing number, then
    labelled type 0, 1).  The added crossing qualifies iff some best start labels it so.
    A child failing the cheap invariant test is rejected before any walk (code None).
    """
    inv = start_invariants(tw)
    n = len(tw) // 4
    ci = [min(inv[h, e] for h in range(4 * c, 4 * c + 4) for e in (1, -1)) for c in range(n)]
    types = {}

    def removable(c: int) -> list[int]:
        if c not in types:
            types[c] = [t for t in (0, 1) if (s := smoothing(tw, c, t)) is not None and prime_reduced(s)]
        return types[c]

    for c in sorted(range(n), key=ci.__getitem__):
        if ci[c] >= ci[x]:
            break
        if removable(c):
            return None, False                       # a smaller crossing invariant is removable
    low = ci[x]
    code, labels = shadow_code(tw, inv)
    order, ref, eps = labels[0]
    for q in range(n):
        if ci[order[q]] != low:
            continue
        for tp in (0, 1):
            if _smoothing_type(ref[q], eps, tp) in removable(order[q]):
                return code, any(o[q] == x and _smoothing_type(r[q], e, tp) == NEW_SMOOTHING
                                 for o, r, e in labels)
    return code, False  # unreachable: x itself is removable


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

    The type's code is the smaller (:func:`~pipeline.diagrams.flype._order`) of the two
    :func:`~pipeline.diagrams.flype.flype_codes` of the alternating diagram on ``tw``
    (the type's and its mirror's); :func:`~pipeline.diagrams.flype.diagram_of_code`
    rebuilds the member that code describes, and its shadow is the canonical member.
    Every shadow of the class gives the same code, so exactly one shadow emits it.
    """
    a, b = flype_codes(to_diagram(tw, alternating_over(tw)))
    best = min(a, b, key=_order)
    member = diagram_of_code(best)
    return best if shadow_code(twins(member))[0] == code else None


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
