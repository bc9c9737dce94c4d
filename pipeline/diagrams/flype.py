"""Flypes of alternating diagrams and a canonical code of a flype class.

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

``flype_code(D)`` = the smallest :func:`pipeline.diagrams.canonical.canonical_text`
over the flype orbit of ``D``

is a normal form: equal codes iff the same link.  ``canonical_text`` already
identifies relabelling, sphere isotopy, turning the diagram over (a rotation by π of
3-space) and reversal of any components, so the code names the *unoriented* link
type (keys name unoriented types, DESIGN.md); the mirror image is not identified.
The mirror's code is computed from the mirrored orbit (the mirror of a flype is a
flype), and a type is amphichiral iff both codes agree.

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

Orbit search
------------
The orbit is searched breadth-first with one canonical text per diagram.  Its size is
the product of the number of positions of every flype circuit's crossings, which is
small for most diagrams but grows fast for Montesinos-like ones with long horizontal
twist regions among many tangles; the ``budget`` (orbit members) turns a hopeless
search into ``BudgetExceeded('flype', budget)``, never a wrong answer.

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
from typing import Iterator, NamedTuple

from ..errors import BudgetExceeded, KnotLedgerError
from .builder import PlanarBuilder
from .canonical import canonical_text
from .diagram import Diagram

__all__ = [
    "FLYPE_BUDGET",
    "NotReducedAlternating",
    "FlypeMove",
    "check_reduced_prime_alternating",
    "flype_moves",
    "apply_flype",
    "flypes",
    "flype_orbit",
    "flype_code",
    "flype_codes",
    "is_amphichiral",
    "diagram_of_code",
]

#: Default budget: the most diagrams one flype orbit may have before giving up.
FLYPE_BUDGET = 20000


class NotReducedAlternating(KnotLedgerError, ValueError):
    """The diagram is not a reduced, visibly prime, alternating diagram with one piece."""


class FlypeMove(NamedTuple):
    """A flype: crossing ``c``, its slot ``s`` (slots s, s+1 go into the tangle),
    the tangle's other two end edges ``x`` (beside slot s+1) and ``y`` (beside s),
    and the crossings of the tangle."""

    c: int
    s: int
    x: int
    y: int
    tangle: frozenset


# ---------------------------------------------------------------------- faces
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
def _tangle(d: Diagram, c: int, s: int, cut: tuple[int, ...]) -> frozenset | None:
    """Crossings inside the circle through the edges ``cut``, or None when the
    circle does not cut off exactly those four edges from ``c``."""
    pd = d.pd
    start = {d.twin((c, s))[0], d.twin((c, (s + 1) % 4))[0]}
    if c in start:
        return None
    inside, stack = set(start), list(start)
    while stack:
        i = stack.pop()
        for r in range(4):
            if pd[i][r] in cut:
                continue
            j = d.twin((i, r))[0]
            if j == c:
                return None
            if j not in inside:
                inside.add(j)
                stack.append(j)
    boundary = [v for v in cut if sum(1 for (i, _) in d._slots_of[v] if i in inside) != 1]
    return None if boundary else frozenset(inside)


def flype_moves(diagram: Diagram) -> Iterator[FlypeMove]:
    """Every nontrivial flype of a reduced alternating diagram (see the module notes)."""
    d = diagram
    face_of, adj = _face_data(d)
    n = len(d.pd)
    for c in range(n):
        c_edges = set(d.pd[c])
        for s in range(4):
            f0 = face_of[(c, (s + 1) % 4)]
            f1 = face_of[(c, (s + 2) % 4)]
            f3 = face_of[(c, s)]
            f4 = face_of[(c, (s + 3) % 4)]
            for f2, xs in adj[f1].items():
                if f2 in (f0, f1, f3, f4) or f2 not in adj[f3]:
                    continue
                for x in xs:
                    for y in adj[f3][f2]:
                        if x == y or x in c_edges or y in c_edges:
                            continue
                        cut = (d.pd[c][s], d.pd[c][(s + 1) % 4], x, y)
                        t = _tangle(d, c, s, cut)
                        if t is not None and 1 < len(t) < n - 1:
                            yield FlypeMove(c, s, x, y, t)


def apply_flype(diagram: Diagram, move: FlypeMove) -> Diagram:
    """The diagram after the flype ``move`` (from :func:`flype_moves`).

    Picture: ``c`` has slots s = SE, s+1 = NE joined to the tangle's SW and NW ends,
    ``x`` is the tangle's NE end and ``y`` its SE end.  The tangle is rotated by π
    about the horizontal axis (its rotation system reflected, every crossing
    changed) and a crossing drawn like ``c`` joins its new east ends to the old
    ends of ``x`` and ``y``.
    """
    d = diagram
    c, s, x, y, t = move
    pd = d.pd
    b = PlanarBuilder()
    node = {}
    for i in range(len(pd)):
        if i != c:  # every PD crossing has its over-strand on slots 1, 3
            node[i] = b.crossing(over_odd=(i not in t))
    cn = b.crossing(over_odd=True)

    def at(slot):
        i, r = slot
        return (node[i], (-r) % 4) if i in t else (node[i], r)

    cs = [(c, (s + k) % 4) for k in range(4)]  # SE, NE, NW, SW
    special = {pd[c][r] for r in range(4)} | {x, y}
    for v, (p, q) in d._slots_of.items():
        if v not in special:
            b.join(at(p), at(q))
    t_sw, t_nw = d.twin(cs[0]), d.twin(cs[1])
    o_nw, o_sw = d.twin(cs[2]), d.twin(cs[3])
    xp, xq = d._slots_of[x]
    x_in, x_out = (xp, xq) if xp[0] in t else (xq, xp)
    yp, yq = d._slots_of[y]
    y_in, y_out = (yp, yq) if yp[0] in t else (yq, yp)
    b.join(at(o_nw), at(t_sw))
    b.join(at(o_sw), at(t_nw))
    b.join(at(y_in), (cn, (s + 2) % 4))
    b.join(at(x_in), (cn, (s + 3) % 4))
    b.join((cn, (s + 1) % 4), at(x_out))
    b.join((cn, s), at(y_out))
    return b.diagram()


def flypes(diagram: Diagram) -> Iterator[Diagram]:
    """The diagrams one nontrivial flype away from ``diagram``."""
    for m in flype_moves(diagram):
        yield apply_flype(diagram, m)


# ---------------------------------------------------------------------- codes
def diagram_of_code(code: str) -> Diagram:
    """The diagram named by a code (a ``pd:`` text without free loops)."""
    return Diagram.from_pd(json.loads(code[3:]))


def flype_orbit(diagram: Diagram, *, budget: int = FLYPE_BUDGET) -> list[str]:
    """Canonical texts of every diagram in the flype orbit, sorted.

    Raises
    ------
    NotReducedAlternating
        The input is not reduced prime alternating (one line).
    BudgetExceeded
        ``BudgetExceeded('flype', budget)`` when the orbit has more than ``budget``
        diagrams.
    """
    check_reduced_prime_alternating(diagram)
    first = canonical_text(diagram)
    seen = {first}
    queue = deque([diagram])
    while queue:
        d = queue.popleft()
        for e in flypes(d):
            code = canonical_text(e)
            if code not in seen:
                if len(seen) >= budget:
                    raise BudgetExceeded("flype", budget)
                seen.add(code)
                queue.append(e)
    return sorted(seen, key=_order)


def _order(code: str):
    return (len(code), code)


def flype_codes(diagram: Diagram, *, budget: int = FLYPE_BUDGET) -> tuple[str, str]:
    """(code of the flype class, code of the mirror image's flype class).

    Both are ``pd:`` texts (valid notation strings); the code is the smallest
    canonical text of the orbit, shortest first, then as a string.
    """
    orbit = flype_orbit(diagram, budget=budget)
    mirrored = [canonical_text(diagram_of_code(t).mirror()) for t in orbit]
    return orbit[0], min(mirrored, key=_order)


def flype_code(diagram: Diagram, *, budget: int = FLYPE_BUDGET) -> str:
    """Canonical code of the flype class of a reduced prime alternating diagram.

    Parameters
    ----------
    diagram : Diagram
        Reduced, visibly prime, alternating, one piece.
    budget : int
        Most orbit members searched.

    Returns
    -------
    str
        A ``pd:`` text; two such diagrams have the same code iff they are diagrams
        of the same unoriented link (flyping theorem, Menasco–Thistlethwaite 1993).

    Examples
    --------
    >>> from pipeline.diagrams.notation import parse
    >>> flype_code(parse("conway:2 2")) == flype_code(parse("braid:1,-2,1,-2"))
    True
    """
    return flype_orbit(diagram, budget=budget)[0]


def is_amphichiral(diagram: Diagram, *, budget: int = FLYPE_BUDGET) -> bool:
    """True iff the link equals its mirror image (same flype class as the mirror)."""
    a, b = flype_codes(diagram, budget=budget)
    return a == b
