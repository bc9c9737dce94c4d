"""Coordinates for a diagram picture, computed from the PD code alone.

The PD code fixes the counterclockwise order of the four edges at every crossing, i.e. a
combinatorial planar embedding (a rotation system) of the 4-valent diagram graph.  We
never ask a planarity test for an embedding (it may return the reflected one and the
picture would show the mirror image); the rotation system is read off the PD tuples.

Construction, for each connected piece of the diagram:

1. Subdivide every edge twice: one vertex per crossing slot ``(i, s)`` next to crossing
   ``i``, so an edge with label ``v`` between slots ``(i, s)`` and ``(j, t)`` becomes the
   path ``X_i - S(i,s) - S(j,t) - X_j``.  Kinks (loops) and bigons (parallel edges) become
   paths in a simple graph.
2. Trace the faces with :attr:`Diagram.faces` and put a *ring* inside every face: one new
   vertex per corner of the face walk, joined to its corner vertex and the next one and to
   its two ring neighbours; inner faces also get a centre joined to the whole ring.  Each
   corner gets its own ring vertex, so a face that touches a crossing twice (a nugatory
   crossing) does not pinch the drawing.
3. The largest face is the outer face; its ring is pinned, counterclockwise in face-walk
   order, on the unit circle, and every other vertex is placed at the average of its
   neighbours (Tutte's barycentric embedding, one sparse linear solve).  Three more solves
   with weights proportional to the current edge lengths give crowded inner regions more
   room (positive weights keep the drawing planar, ref. 2).
4. Each edge is drawn as a cubic Hermite curve through its four points.  At a crossing the
   tangent of the strand ``a -> c`` is the direction of ``u_c - u_a`` and that of ``b -> d``
   is ``u_d - u_b`` (``u_s`` the unit vector towards slot ``s``), so the drawn strands leave
   a crossing in the same counterclockwise order ``a, b, c, d`` as the PD tuple.  If the
   smoothing ever makes two edges meet away from a crossing, those edges fall back to the
   straight Tutte polyline.

References
----------
1. W. T. Tutte, "How to draw a graph", Proc. London Math. Soc. (3) 13 (1963) 743-767:
   barycentric embedding of a 3-connected planar graph with a convex outer face.
2. S. J. Gortler, C. Gotsman, D. Thurston, "Discrete one-forms on meshes and applications
   to 3D mesh parameterization", Computer Aided Geometric Design 23 (2006) 83-112: the
   barycentric embedding stays planar for any positive edge weights (from memory).
3. L. H. Kauffman, "State models and the Jones polynomial", Topology 26 (1987): a link
   diagram as a 4-valent plane graph with over/under information at the vertices.
"""

from __future__ import annotations

import math
from typing import Any

from ...diagrams.diagram import Diagram, Slot
from .intersections import stray_intersections

__all__ = ["layout"]

_SAMPLES = 8  # points per Hermite segment (three segments per edge)
_REWEIGHT_ROUNDS = 3  # Tutte solves with length-proportional weights after the first


# ----------------------------------------------------------------------------- embedding
def _piece_positions(diagram: Diagram, piece: list[int]) -> dict[Any, tuple[float, float]]:
    """Tutte coordinates of crossings ("x", i) and slot vertices ("s", i, s) of one piece."""
    import numpy as np

    in_piece = set(piece)
    index: dict[Any, int] = {}

    def vid(key: Any) -> int:
        if key not in index:
            index[key] = len(index)
        return index[key]

    edges: list[tuple[int, int]] = []
    for i in piece:
        for s in range(4):
            edges.append((vid(("x", i)), vid(("s", i, s))))
            j, t = diagram.twin((i, s))
            if (i, s) < (j, t):
                edges.append((vid(("s", i, s)), vid(("s", j, t))))
    faces = [f for f in diagram.faces if f[0][0] in in_piece]
    # face walks in the subdivided graph: X_i, S(i,s), S(twin) for every leaving slot
    walks = []
    for f in faces:
        w = []
        for (i, s) in f:
            j, t = diagram.twin((i, s))
            w += [index[("x", i)], index[("s", i, s)], index[("s", j, t)]]
        walks.append(w)
    outer = max(range(len(walks)), key=lambda k: (len(walks[k]), -k))
    pinned: dict[int, tuple[float, float]] = {}
    counter = len(index)
    for k, w in enumerate(walks):
        ring = list(range(counter, counter + len(w)))
        counter += len(w)
        L = len(w)
        for r in range(L):
            edges += [(w[r], ring[r]), (w[(r + 1) % L], ring[r]), (ring[r], ring[(r + 1) % L])]
        if k == outer:
            for r in range(L):  # counterclockwise in walk order (the outer walk runs ccw)
                ang = 2 * math.pi * r / L
                pinned[ring[r]] = (math.cos(ang), math.sin(ang))
        else:
            centre = counter
            counter += 1
            edges += [(centre, q) for q in ring]
    pos = _tutte(counter, edges, [1.0] * len(edges), pinned)
    for _ in range(_REWEIGHT_ROUNDS):
        # any positive weights keep the embedding planar (ref. 2); stiffening long
        # edges gives the crowded inner regions of a plain Tutte drawing more room
        lengths = np.hypot(*(pos[[a for a, _ in edges]] - pos[[b for _, b in edges]]).T)
        mean = float(lengths.mean()) or 1.0
        pos = _tutte(counter, edges, list(np.maximum(lengths / mean, 1e-3)), pinned)
    return {key: (float(pos[v, 0]), float(pos[v, 1])) for key, v in index.items()}


def _tutte(n: int, edges: list[tuple[int, int]], weights: list[float],
           pinned: dict[int, tuple[float, float]]):
    """Positions (n x 2 array) with every free vertex at the weighted mean of its neighbours."""
    import numpy as np

    free = [v for v in range(n) if v not in pinned]
    pos_free = {v: k for k, v in enumerate(free)}
    diag = [0.0] * n
    rows, cols, vals = [], [], []
    rhs = np.zeros((len(free), 2))
    for (a, b), w in zip(edges, weights):
        diag[a] += w
        diag[b] += w
        for u, x in ((a, b), (b, a)):
            if u in pos_free:
                if x in pos_free:
                    rows.append(pos_free[u])
                    cols.append(pos_free[x])
                    vals.append(-w)
                else:
                    rhs[pos_free[u]] += w * np.asarray(pinned[x])
    for k, v in enumerate(free):
        rows.append(k)
        cols.append(k)
        vals.append(diag[v])
    A = np.zeros((len(free), len(free)))
    for r, c, v in zip(rows, cols, vals):
        A[r, c] += v
    sol = np.linalg.solve(A, rhs)
    pos = np.zeros((n, 2))
    pos[free] = np.asarray(sol).reshape(len(free), 2)
    for v, xy in pinned.items():
        pos[v] = xy
    return pos


# ----------------------------------------------------------------------------- curves
def _unit(x: float, y: float) -> tuple[float, float]:
    r = math.hypot(x, y)
    return (x / r, y / r) if r > 0 else (1.0, 0.0)


def _out_directions(pos: dict, i: int) -> list[tuple[float, float]]:
    """Directions in which the four strands leave crossing i, slots 0..3 (ccw order)."""
    X = pos[("x", i)]
    u = [_unit(pos[("s", i, s)][0] - X[0], pos[("s", i, s)][1] - X[1]) for s in range(4)]
    t1 = _unit(u[2][0] - u[0][0], u[2][1] - u[0][1])
    d1 = _unit(u[1][0] - u[3][0], u[1][1] - u[3][1])
    return [(-t1[0], -t1[1]), d1, t1, (-d1[0], -d1[1])]


def _hermite(p0, p1, m0, m1, n: int) -> list[tuple[float, float]]:
    out = []
    for k in range(1, n + 1):
        t = k / n
        h00, h10 = 2 * t ** 3 - 3 * t ** 2 + 1, t ** 3 - 2 * t ** 2 + t
        h01, h11 = -2 * t ** 3 + 3 * t ** 2, t ** 3 - t ** 2
        out.append((h00 * p0[0] + h10 * m0[0] + h01 * p1[0] + h11 * m1[0],
                    h00 * p0[1] + h10 * m0[1] + h01 * p1[1] + h11 * m1[1]))
    return out


def _smooth(P: list[tuple[float, float]], d0, d3) -> list[tuple[float, float]]:
    """Hermite spline through P[0..3], leaving P[0] along d0 and arriving at P[3] along -d3."""
    def sub(a, b):
        return (a[0] - b[0], a[1] - b[1])

    l0 = math.dist(P[0], P[1])
    l2 = math.dist(P[2], P[3])
    m = [(d0[0] * l0, d0[1] * l0),
         tuple(0.5 * c for c in sub(P[2], P[0])),
         tuple(0.5 * c for c in sub(P[3], P[1])),
         (-d3[0] * l2, -d3[1] * l2)]
    pts = [P[0]]
    for k in range(3):
        pts += _hermite(P[k], P[k + 1], m[k], m[k + 1], _SAMPLES)
    return pts


# ----------------------------------------------------------------------------- layout
def _head_slots(diagram: Diagram) -> set[Slot]:
    """Slots at which an edge enters its crossing: ``a``, and ``d`` (positive) or ``b`` (negative).

    By the PD convention the under-strand enters at ``a`` and the over-strand runs
    ``d -> b`` at a positive crossing and ``b -> d`` at a negative one.
    """
    return {slot for i, sign in enumerate(diagram.signs) for slot in ((i, 0), (i, 3 if sign > 0 else 1))}


def layout(diagram: Diagram) -> dict:
    """Coordinates of a picture of ``diagram``: crossings, one polyline per edge, free loops.

    Parameters
    ----------
    diagram : Diagram

    Returns
    -------
    dict
        ``crossings``: list of (x, y), one per crossing in PD order.
        ``edges``: {label: {"points": polyline from the tail crossing to the head crossing
        (orientation direction), "tail": slot, "head": slot, "arc": arc number (1-based,
        ``diagram.arcs`` order), "component": index into ``diagram.components``,
        "drawn": list of polylines actually drawn (the points with gaps cut where the
        edge passes under a crossing)}}.
        ``gaps``: per crossing, the radius of the gap cut into the under-strand.
        ``directions``: per crossing, the four unit directions in which the strands at
        slots a, b, c, d leave it.
        ``loops``: list of {"center", "radius", "points", "column"} for free loops
        (``column`` is the 1-based colouring-matrix column, after the arcs).
        ``bounds``: (xmin, ymin, xmax, ymax).

    Examples
    --------
    >>> from pipeline import parse
    >>> geo = layout(parse("torus:2,3"))
    >>> len(geo["crossings"]), sorted(e["arc"] for e in geo["edges"].values())
    (3, [1, 1, 2, 2, 3, 3])

    Notes
    -----
    Tutte's barycentric embedding (Tutte 1963) of the twice-subdivided diagram graph with a
    ring of extra vertices in every face; see the module docstring.  Split pieces are laid
    out side by side, scaled by the square root of their crossing number.
    """
    heads = _head_slots(diagram)
    arc_of = diagram.arc_of_label
    comp_of = diagram.component_of_label
    crossings: list[tuple[float, float]] = [(0.0, 0.0)] * diagram.n_crossings
    directions: list[list[tuple[float, float]]] = [[]] * diagram.n_crossings
    gaps: list[float] = [0.0] * diagram.n_crossings
    edges: dict[int, dict] = {}
    x_cursor = 0.0
    for piece in diagram.pieces:
        pos = _piece_positions(diagram, piece)
        R = 1.2 * math.sqrt(len(piece)) + 0.8
        dx = x_cursor + R
        pos = {k: (dx + R * p[0], R * p[1]) for k, p in pos.items()}
        x_cursor += 2 * R + 0.6
        for i in piece:
            crossings[i] = pos[("x", i)]
            directions[i] = _out_directions(pos, i)
            gaps[i] = 0.45 * min(math.dist(pos[("x", i)], pos[("s", i, s)]) for s in range(4))
        for i in piece:
            for s in range(4):
                if (i, s) in heads:
                    continue
                v = diagram.pd[i][s]
                j, t = diagram.twin((i, s))
                P = [pos[("x", i)], pos[("s", i, s)], pos[("s", j, t)], pos[("x", j)]]
                edges[v] = {"points": _smooth(P, directions[i][s], directions[j][t]),
                            "straight": P, "tail": (i, s), "head": (j, t),
                            "arc": arc_of[v] + 1, "component": comp_of[v]}
    # fall back to straight polylines where smoothing made edges meet off the crossings
    allowed = set(crossings)
    straightened: set[int] = set()
    while True:
        bad = stray_intersections({v: e["points"] for v, e in edges.items()}, allowed)
        todo = {v for pair in bad for v in pair} - straightened
        if not todo:  # nothing left to straighten (straight Tutte edges never meet)
            break
        for v in todo:
            edges[v]["points"] = list(edges[v]["straight"])
        straightened |= todo
    for v, e in edges.items():
        e["drawn"] = _cut_gaps(e, gaps)
        del e["straight"]
    loops = []
    for k in range(diagram.free_loops):
        c = (x_cursor + 0.6, 0.0)
        x_cursor += 1.6
        pts = [(c[0] + 0.5 * math.cos(2 * math.pi * q / 48), c[1] + 0.5 * math.sin(2 * math.pi * q / 48))
               for q in range(49)]
        pts[-1] = pts[0]
        loops.append({"center": c, "radius": 0.5, "points": pts, "column": len(diagram.arcs) + k + 1})
    all_pts = [p for e in edges.values() for p in e["points"]] + [p for lp in loops for p in lp["points"]]
    bounds = (min(p[0] for p in all_pts), min(p[1] for p in all_pts),
              max(p[0] for p in all_pts), max(p[1] for p in all_pts))
    return {"crossings": crossings, "edges": edges, "gaps": gaps, "directions": directions,
            "loops": loops, "bounds": bounds}


def _cut_gaps(edge: dict, gaps: list[float]) -> list[list[tuple[float, float]]]:
    """The edge polyline with the ends removed within the gap radius of an under-crossing."""
    pts = list(edge["points"])
    (i, s), (j, t) = edge["tail"], edge["head"]
    if s % 2 == 0:  # leaves crossing i as its under-strand (slot c)
        pts = _trim_start(pts, gaps[i])
    if t % 2 == 0:  # enters crossing j as its under-strand (slot a)
        pts = _trim_start(pts[::-1], gaps[j])[::-1]
    return [pts] if len(pts) >= 2 else []


def _trim_start(pts: list[tuple[float, float]], r: float) -> list[tuple[float, float]]:
    c = pts[0]
    for k in range(1, len(pts)):
        if math.dist(c, pts[k]) >= r:
            a, b = pts[k - 1], pts[k]
            da, db = math.dist(c, a), math.dist(c, b)
            f = (r - da) / (db - da) if db > da else 0.0
            f = min(max(f, 0.0), 1.0)
            cut = (a[0] + f * (b[0] - a[0]), a[1] + f * (b[1] - a[1]))
            return [cut] + pts[k:]
    return pts[-1:]
