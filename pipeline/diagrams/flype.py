"""Flypes of alternating diagrams and canonical codes of a flype class.

A *flype* (P. G. Tait's move, named by Menasco–Thistlethwaite) acts on a tangle
picture ``[c] T`` made of one crossing ``c`` beside a 4-ended tangle ``T`` (two ends
of ``T`` joined to ``c``): ``T`` is rotated by π about the horizontal axis and the
crossing reappears, drawn the same way, on the other side: ``T' [c]``.  It is an
isotopy, and it keeps a reduced prime alternating diagram reduced, prime and
alternating.

Theorem licensing the key
-------------------------
W. Menasco, M. Thistlethwaite, "The classification of alternating links", Annals of
Math. 138 (1993) 113–171 (the flyping theorem): two reduced alternating diagrams of
prime links on S² represent the same (unoriented) link iff they are related by a
finite sequence of flypes (and isotopies of S²).  Hence the *flype class* of a
reduced prime alternating diagram is a complete invariant of the link type, and

any function of the flype class that separates classes names the link.  Three routes:

``route="tree"`` (the default, used for knot keys ``alt:``): the compositional code of
:mod:`pipeline.diagrams.flype_tree` (``ft:`` text), computed bottom-up over the
3-connected components of the Tait graph without any search; that it is a complete
invariant of the flype class is proved there (Lemmas 1–3 and the flyping theorem), and
checked against the orbit route.  :func:`diagram_of_code` rebuilds the member it
describes (:func:`pipeline.diagrams.flype_realize.realize`), so
``flype_code(diagram_of_code(code)) == code``.

``route="orbit"`` (the reference): :func:`pipeline.diagrams.canonical.canonical_text`
of the orbit member with the fewest twist regions (maximal chains of bigons) and, among
those, the smallest alternating map code (:func:`pipeline.diagrams.shadow.alternating_codes`),
by a breadth-first search of the whole orbit — a normal form because the whole orbit is
searched (a ``pd:`` text).

``route="gathered"`` (not used for keys): the same rule searched over block flypes only
(:mod:`pipeline.diagrams.flype_circuits`); sound, but its completeness is not proven
(equal to the orbit route on every diagram tested).

Every code names the *unoriented* link type (relabelling, sphere isotopy, turning the
diagram over and reversal of components are identified; keys name unoriented types,
DESIGN.md); the mirror image is not identified.  The mirror's code comes from the
mirrored members (the mirror of a flype is a flype), and a type is amphichiral iff both
codes agree.

How flypes are found
--------------------
A flype tangle ``T`` at crossing ``c`` is cut out by a circle meeting the diagram in
four points, two on the edges from ``c`` into ``T``.  In the dual picture the circle
runs through four faces: the corner face ``F0`` of ``c`` between those two edges, the
two corner faces ``F1``, ``F3`` of ``c`` on either side of ``F0`` (opposite corners of
``c``), and a fourth face ``F2`` sharing an edge ``x`` with ``F1`` and an edge ``y``
with ``F3``.  So every flype is found by scanning, per crossing and corner, the faces
adjacent to both ``F1`` and ``F3``: O(n · face degree) candidates, each checked by a
search that the circle cuts off exactly the four edges.  Flypes whose tangle is one
crossing only slide a crossing along its own twist region (the same diagram) and
are skipped.

Orbit search (reference)
------------------------
The whole orbit is searched breadth-first with one alternating map code per diagram
(:func:`pipeline.diagrams.shadow.alternating_codes`, on flat twin arrays).  Its size is
the product of the number of positions of every flype circuit's crossings, which is
small for most diagrams but grows fast for Montesinos-like ones with long horizontal
twist regions among many tangles; the ``budget`` (orbit members) turns a hopeless
search into ``BudgetExceeded('flype', budget)``, never a wrong answer.  The
gathered search has the same budget (members recorded over its restarts).

References
----------
1. W. Menasco, M. Thistlethwaite, "The classification of alternating links",
   Annals of Math. 138 (1993) 113–171.
2. W. Menasco, "Closed incompressible surfaces in alternating knot and link
   complements", Topology 23 (1984): a reduced alternating diagram is prime iff it
   is visibly prime.
3. L. H. Kauffman, "State models and the Jones polynomial", Topology 26 (1987):
   reduced alternating diagrams have minimal crossing number.
"""

from __future__ import annotations

import json
from collections import deque
from typing import Iterator

from ..errors import BudgetExceeded, KnotLedgerError
from ..numbers import UnionFind
from .canonical import canonical_text
from .diagram import Diagram
from .flype_circuits import gathered_states, twist_count
from .flype_realize import realize
from .flype_tree import tree_codes
from .shadow import ShadowFlype, alternating_codes, apply_shadow_flype, shadow_flypes, to_diagram, twins

__all__ = [
    "FLYPE_BUDGET",
    "NotReducedAlternating",
    "FlypeMove",
    "check_reduced_prime_alternating",
    "flype_moves",
    "apply_flype",
    "flypes",
    "flype_orbit",
    "orbit_roots",
    "flype_code",
    "flype_codes",
    "flype_code_by_orbit",
    "flype_codes_by_orbit",
    "is_amphichiral",
    "diagram_of_code",
]

#: Default budget: the most members one flype search may record before giving up
#: (routes "orbit" and "gathered"; the default tree route does not search).
FLYPE_BUDGET = 2000


class NotReducedAlternating(KnotLedgerError, ValueError):
    """The diagram is not a reduced, visibly prime, alternating diagram with one piece."""


#: A flype move (see :class:`pipeline.diagrams.shadow.ShadowFlype`).
FlypeMove = ShadowFlype


# ---------------------------------------------------------------------- checks
def _face_data(d: Diagram):
    """(face index of every slot, per face: {neighbour face: [shared edge labels]})."""
    face_of: dict[tuple[int, int], int] = {}
    for k, f in enumerate(d.faces):
        for h in f:
            face_of[h] = k
    adj: list[dict[int, list[int]]] = [dict() for _ in d.faces]
    for v, ((i, s), (j, t)) in d._slots_of.items():
        f, g = face_of[(i, s)], face_of[(j, t)]  # the two faces beside edge v
        adj[f].setdefault(g, []).append(v)
        if g != f:
            adj[g].setdefault(f, []).append(v)
    return face_of, adj


def _structure_problem(d: Diagram) -> str | None:
    """Why ``d`` is not reduced prime alternating with one piece, or None."""
    if d.free_loops or not d.pd:
        return "it has crossingless components"
    if len(d.pieces) > 1:
        return "it is split (more than one connected piece)"
    if not d.is_alternating():
        return "it is not alternating"
    face_of, adj = _face_data(d)
    for i in range(len(d.pd)):
        if face_of[(i, 0)] == face_of[(i, 2)] or face_of[(i, 1)] == face_of[(i, 3)]:
            return f"crossing {i + 1} is nugatory (not reduced)"
    for f, nb in enumerate(adj):
        for g, edges in nb.items():
            if g != f and len(edges) >= 2:
                return (f"edges {sorted(edges)[:2]} bound the same two faces "
                        f"(a visible connected sum, not prime)")
    return None


def check_reduced_prime_alternating(diagram: Diagram) -> None:
    """Raise :class:`NotReducedAlternating` (one line) unless the diagram qualifies.

    A private minimal check: alternating, one connected piece, no free loops, no
    nugatory crossing (a face meeting a crossing at two opposite corners), and
    visibly prime (no two faces sharing two edges, i.e. no circle meeting the diagram
    in two points with crossings on both sides).  By Menasco (1984) visibly prime is
    prime for reduced alternating diagrams.
    """
    why = _structure_problem(diagram)
    if why:
        raise NotReducedAlternating(f"flype: the diagram is not reduced prime alternating: {why}")


# ---------------------------------------------------------------------- moves
def flype_moves(diagram: Diagram) -> Iterator[FlypeMove]:
    """Every nontrivial flype of a reduced alternating diagram (see the module notes)."""
    return shadow_flypes(twins(diagram))


def apply_flype(diagram: Diagram, move: FlypeMove) -> Diagram:
    """The diagram after the flype ``move`` (from :func:`flype_moves`); see
    :func:`pipeline.diagrams.shadow.apply_shadow_flype` for the picture."""
    return to_diagram(*apply_shadow_flype(twins(diagram), [True] * len(diagram.pd), move))


def flypes(diagram: Diagram) -> Iterator[Diagram]:
    """The diagrams one nontrivial flype away from ``diagram``."""
    tw = twins(diagram)
    over = [True] * len(diagram.pd)
    for m in shadow_flypes(tw):
        yield to_diagram(*apply_shadow_flype(tw, over, m))


# ---------------------------------------------------------------------- codes
def diagram_of_code(code: str) -> Diagram:
    """The diagram named by a code: a ``pd:`` text without free loops (orbit and
    gathered routes) or an ``ft:`` code (the member it describes, deterministic)."""
    if code.startswith("ft:"):
        return realize(code)
    return Diagram.from_pd(json.loads(code[3:]))


def _orbit_states(diagram: Diagram, budget: int) -> dict:
    """{code0: (twins, over)} over the whole flype orbit (the slow reference search)."""
    check_reduced_prime_alternating(diagram)
    tw = twins(diagram)
    over = [True] * len(diagram.pd)
    states = {alternating_codes(tw, over)[0]: (tw, over)}
    queue = deque([(tw, over)])
    while queue:
        tw, over = queue.popleft()
        for m in shadow_flypes(tw):
            tw2, over2 = apply_shadow_flype(tw, over, m)
            code = alternating_codes(tw2, over2)[0]
            if code not in states:
                if len(states) >= budget:
                    raise BudgetExceeded("flype", budget)
                states[code] = (tw2, over2)
                queue.append((tw2, over2))
    return states


def orbit_roots(diagrams: dict) -> dict:
    """{key: root}: the flype orbits of a set of diagrams closed under flypes.

    ``diagrams`` maps each alternating map code (``alternating_codes(...)[0]``) to its
    (twins, over); two keys get the same root iff one-flype steps join them (the
    reference partition of the tests and benchmarks; a key missing from ``diagrams``
    raises KeyError, i.e. the set was not closed).
    """
    uf = UnionFind(diagrams)
    for k, (tw, over) in diagrams.items():
        for m in shadow_flypes(tw):
            other = alternating_codes(*apply_shadow_flype(tw, over, m))[0]
            if other not in diagrams:
                raise KeyError(other)
            uf.union(k, other)
    return {k: uf.find(k) for k in diagrams}


def _gathered(diagram: Diagram, budget: int) -> dict:
    """{code0: (twins, over)} over the gathered members (fewest twist regions)."""
    check_reduced_prime_alternating(diagram)
    return gathered_states(twins(diagram), [True] * len(diagram.pd), budget)


def _codes_of(states: dict) -> tuple[str, str]:
    """(code, mirror code) of a set of members with equally many twist regions."""
    k0 = min(states)
    _, k1 = min((alternating_codes(*st)[1], k) for k, st in states.items())
    tw1, over1 = states[k1]
    return (canonical_text(to_diagram(*states[k0])),
            canonical_text(to_diagram(tw1, [not o for o in over1])))


def _fewest_regions(states: dict) -> dict:
    low = min(twist_count(tw) for tw, _ in states.values())
    return {k: st for k, st in states.items() if twist_count(st[0]) == low}


def flype_orbit(diagram: Diagram, *, budget: int = FLYPE_BUDGET) -> list[str]:
    """Canonical texts of every diagram in the flype orbit, the class code first.

    The whole orbit is searched (slow; sorted by number of twist regions, then
    alternating map code).

    Raises
    ------
    NotReducedAlternating
        The input is not reduced prime alternating (one line).
    BudgetExceeded
        ``BudgetExceeded('flype', budget)`` when the orbit has more than ``budget``
        diagrams.
    """
    states = _orbit_states(diagram, budget)
    keys = sorted(states, key=lambda k: (twist_count(states[k][0]), k))
    return [canonical_text(to_diagram(*states[k])) for k in keys]


def _order(code: str):
    return (len(code), code)


def _states(diagram: Diagram, budget: int, route: str) -> dict:
    if route == "orbit":
        return _fewest_regions(_orbit_states(diagram, budget))
    if route == "gathered":
        return _gathered(diagram, budget)
    raise ValueError(f"flype: route {route!r} is not 'orbit' or 'gathered'")


def flype_codes(diagram: Diagram, *, budget: int = FLYPE_BUDGET,
                route: str = "tree") -> tuple[str, str]:
    """(code of the flype class, code of the mirror image's flype class).

    ``route="tree"`` (the default, used for knot keys): the compositional ``ft:`` code
    (:func:`pipeline.diagrams.flype_tree.tree_codes`; no search, ``budget`` unused);
    equal codes iff same link is a theorem (flyping theorem and the lemmas there).
    ``route="orbit"``: the :func:`canonical_text` of the orbit member with the fewest
    twist regions and then the smallest alternating map code, by a search of the whole
    orbit (the reference; the mirror's code from the same members with the crossing bit
    flipped).  ``route="gathered"``: the same rule over block flypes only
    (:func:`pipeline.diagrams.flype_circuits.gathered_states`), checked empirically
    against the orbit route, not proven — no key or verdict is built on it.
    """
    if route == "tree":
        return tree_codes(diagram)
    return _codes_of(_states(diagram, budget, route))


def flype_codes_by_orbit(diagram: Diagram, *, budget: int = FLYPE_BUDGET) -> tuple[str, str]:
    """:func:`flype_codes` by the whole-orbit search (the reference route)."""
    return flype_codes(diagram, budget=budget, route="orbit")


def flype_code(diagram: Diagram, *, budget: int = FLYPE_BUDGET, route: str = "tree") -> str:
    """Canonical code of the flype class of a reduced prime alternating diagram.

    Parameters
    ----------
    diagram : Diagram
        Reduced, visibly prime, alternating, one piece.
    budget : int
        Most orbit members recorded by a search (routes "orbit", "gathered").
    route : {"tree", "orbit", "gathered"}
        The compositional code (default; proven, no search), the whole-orbit search
        (proven, slow) or the gathered search (not proven); see :func:`flype_codes`.

    Returns
    -------
    str
        ``ft:`` code (tree) or ``pd:`` text of a member (orbit, gathered); two
        diagrams have the same code iff they are diagrams of the same unoriented link
        (flyping theorem, Menasco–Thistlethwaite 1993) — for the tree and orbit routes.

    Examples
    --------
    >>> from pipeline.diagrams.notation import parse
    >>> flype_code(parse("conway:2 2")) == flype_code(parse("braid:1,-2,1,-2"))
    True
    """
    if route == "tree":
        return tree_codes(diagram)[0]
    states = _states(diagram, budget, route)
    return canonical_text(to_diagram(*states[min(states)]))


def flype_code_by_orbit(diagram: Diagram, *, budget: int = FLYPE_BUDGET) -> str:
    """:func:`flype_code` by the whole-orbit search (the reference route)."""
    return flype_code(diagram, budget=budget, route="orbit")


def is_amphichiral(diagram: Diagram, *, budget: int = FLYPE_BUDGET) -> bool:
    """True iff the link equals its mirror image (same flype class as the mirror)."""
    a, b = flype_codes(diagram, budget=budget)
    return a == b
