"""Seifert matrix of any oriented diagram by Seifert's algorithm.

Method (H. Seifert, "Über das Geschlecht von Knoten", Math. Ann. 110 (1935); textbook
treatment: W. B. R. Lickorish, Springer GTM 175 (1997),
ch. 6; G. Burde, H. Zieschang, *Knots*, de Gruyter (1985), ch. 8).  Smoothing every
crossing along the orientation gives the Seifert circles; each bounds a disc (nested discs
stacked, inner ones higher) and every crossing becomes a half-twisted band joining the two
circles through it.  The surface F retracts onto the Seifert graph (circles = vertices,
crossings = edges).

Basis of H_1(F).  The Seifert circles cut the sphere into regions; the chords (crossings)
inside a region R cut it into faces of the diagram, and the boundary cycles γ_f of all but
one face per region form a basis of H_1 of the Seifert graph (Euler's formula in each
region), hence of H_1(F): c − s + 1 classes for a connected diagram with c crossings and
s circles, i.e. 2g + μ − 1.  γ_f runs once around the face f (f on its left), on the disc
side of every circle arc of ∂f, through the band of every crossing where ∂f changes
circle.  The face chosen as unbounded (which fixes the nesting) is the first face of each
piece; another choice changes V only by a change of surface, never Δ or σ.

Seifert form.  V_fg = lk(γ_f, γ_g⁺), γ_g⁺ the push-off of a parallel copy of γ_g to the
positive side (boundary orientation = link orientation; a counterclockwise circle's disc
has its positive normal up).  Along the circle arcs between crossings all curves run
parallel at fixed depths (the curve of the face on the disc side of the arc deeper than
the curve of the face on the other side), so every crossing of the projections of γ_f
and γ_g⁺ lies in a small box around a crossing of the diagram, where only the four
corner faces take part.  For each of the six kinds of box (crossing sign × whether the
band joins sibling circles or a parent and its child, the parent's disc lying under the
band and folding at its rim) the box is written down as explicit polygonal curves on a
polygonal model of the surface, and lk(a, b⁺) = Σ sign over the crossings where a passes
over b⁺ is counted exactly (rational coordinates): a table of local contributions,
computed once, summed over the crossings.  Proof status: the table is a direct count on
an embedded model of the surface; the tests check the resulting V against the Alexander
polynomial (Fox calculus) and the signature (Gordon–Litherland) on random diagrams.

Split diagrams and free loops.  The surface of a split diagram (or one with free loops)
is disconnected; it is made connected by tubes, each adding one class (a tube's meridian)
that links nothing.  So V is the block sum of the pieces' matrices followed by k − 1 zero
rows and columns, k = number of pieces + free loops (``tubes=False`` omits them).  Then Δ
is 0 for a split link, as it must be, and σ is additive.  Conventions are those of
:mod:`pipeline.invariants.seifert`: sign(V + Vᵀ) = σ, Δ = det(t^−½V − t^½Vᵀ).
"""

from __future__ import annotations

from fractions import Fraction
from functools import lru_cache

from ..diagrams.diagram import Diagram
from ..numbers import UnionFind

__all__ = ["seifert_matrix", "seifert_circles", "seifert_matrix_size"]

SL, SR, BLO, BHI = "SL", "SR", "BLO", "BHI"

# Per crossing sign: the slots (in, out) of the left and right smoothing arcs and the
# corner roles, in the frame where both arcs run up (module docstring).
_FRAME = {
    1: {"L": (3, 2), "R": (0, 1), "corners": (BLO, SR, BHI, SL)},
    -1: {"L": (0, 3), "R": (1, 2), "corners": (SL, BLO, SR, BHI)},
}


def seifert_circles(diagram: Diagram) -> list[list[int]]:
    """The Seifert circles of the diagram's crossings, as sorted lists of edge labels
    (free loops not included)."""
    return sorted(sorted(g) for g in _circle_classes(diagram).groups().values())


def _circle_classes(diagram: Diagram) -> UnionFind:
    uf = UnionFind(diagram.labels)
    for x, s in zip(diagram.pd, diagram.signs):
        fr = _FRAME[s]
        for side in ("L", "R"):
            i, o = fr[side]
            uf.union(x[i], x[o])
    return uf


def seifert_matrix_size(diagram: Diagram) -> int:
    """Size of :func:`seifert_matrix`: c − s + 2k − 1 for c crossings, s Seifert circles
    (free loops included) and k pieces plus free loops (c − s + 1 when connected)."""
    k = len(diagram.pieces) + diagram.free_loops
    s = len(seifert_circles(diagram)) + diagram.free_loops
    return diagram.n_crossings - s + 2 * k - 1


def seifert_matrix(diagram: Diagram, *, tubes: bool = True) -> list[list[int]]:
    """Seifert matrix V_fg = lk(γ_f, γ_g⁺) of the surface from Seifert's algorithm.

    Parameters
    ----------
    diagram : Diagram
        Any oriented diagram (split pieces, kinks and free loops allowed).
    tubes : bool, keyword-only
        Join the pieces of a disconnected surface by tubes (zero rows and columns, see the
        module docstring); default True.

    Returns
    -------
    list of lists of int
        V, one row per basis face (pieces in the order of ``diagram.pieces``), then the
        tube classes.
    """
    blocks = [_piece_matrix(diagram, piece) for piece in diagram.pieces]
    k = len(diagram.pieces) + diagram.free_loops
    extra = max(k - 1, 0) if tubes else 0
    n = sum(len(b) for b in blocks) + extra
    V = [[0] * n for _ in range(n)]
    at = 0
    for b in blocks:
        for r, row in enumerate(b):
            V[at + r][at:at + len(row)] = row
        at += len(b)
    return V


def _piece_matrix(diagram: Diagram, piece: list[int]) -> list[list[int]]:
    pd, signs = diagram.pd, diagram.signs
    circles = _circle_classes(diagram)
    face_of = {}
    for f, face in enumerate(diagram.faces):
        for slot in face:
            face_of[slot] = f
    faces = sorted({face_of[(i, s)] for i in piece for s in range(4)})
    # roles of the corner faces and the circles of the two strands, per crossing
    info = []
    regions = UnionFind(faces)
    for i in piece:
        fr = _FRAME[signs[i]]
        role = {r: face_of[(i, s)] for s, r in enumerate(fr["corners"])}
        cl, cr = circles.find(pd[i][fr["L"][0]]), circles.find(pd[i][fr["R"][0]])
        regions.union(role[BLO], role[BHI])
        info.append((role, cl, cr))
    region = {f: regions.find(f) for f in faces}
    # each circle separates two regions: (left of its direction, right of it)
    sides: dict = {}
    for role, cl, cr in info:
        gap = region[role[BLO]]
        sides[cl] = (region[role[SL]], gap)
        sides[cr] = (gap, region[role[SR]])
    interior = _interiors(sides, region[faces[0]])
    V: dict[tuple[int, int], int] = {}
    for i, (role, cl, cr) in zip(piece, info):
        gap = region[role[BLO]]
        table = _local_table(signs[i], interior[cl] == gap, interior[cr] == gap)
        for (p, q), v in table.items():
            key = (role[p], role[q])
            V[key] = V.get(key, 0) + v
    dropped, basis = set(), []
    for f in faces:  # keep all but the first face of every region
        if region[f] in dropped:
            basis.append(f)
        else:
            dropped.add(region[f])
    return [[V.get((f, g), 0) for g in basis] for f in basis]


def _interiors(sides: dict, root) -> dict:
    """Region on the disc side of every circle: the side away from the region of the
    unbounded face in the tree of regions (circles are its edges); iterative search."""
    nbrs: dict = {}
    for c, (a, b) in sides.items():
        nbrs.setdefault(a, []).append((c, b))
        nbrs.setdefault(b, []).append((c, a))
    interior, seen, stack = {}, {root}, [root]
    while stack:
        r = stack.pop()
        for c, other in nbrs.get(r, []):
            if other not in seen:
                seen.add(other)
                interior[c] = other
                stack.append(other)
    return interior


# ---------------------------------------------------------------- the local model
_W, _Y, _TAU, _DELTA = 100, 50, 10, Fraction(1, 10)
_LEVEL = {BLO: (-2, -1), BHI: (2, 1)}   # band levels of (curve, copy)


def _pieces(sign: int, left_parent: bool, right_parent: bool, copy: bool) -> dict:
    """Polygonal curves of the four corner faces in the box (or of their pushed copies).

    L runs up along x = 0, R along x = W, the band joins them at |y| ≤ 3 with a half
    twist (z = s·level at the middle, s = −sign).  A circle that is the parent of the
    other has its disc on the gap side, under the band, which folds at its rim."""
    sL = 1 if left_parent else -1            # disc side of L (x direction)
    sR = -1 if right_parent else 1           # disc side of R
    zL, zR = (0, 100) if left_parent else ((100, 0) if right_parent else (0, 0))
    nL = -1 if left_parent else 1            # positive normal of the disc at L (z sign)
    nR = 1 if right_parent else -1
    zbL = zL + (_TAU if left_parent else 0)  # band ends (above a folding parent disc)
    zbR = zR + (_TAU if right_parent else 0)
    s = -sign
    k = 1 if copy else 0
    dz = _DELTA if copy else 0

    def depth(own: bool) -> Fraction:
        return (2 if own else 1) + Fraction(k, 2)

    def disc_L(x, y):
        return ("p", (Fraction(x), Fraction(y), zL + dz * nL))

    def disc_R(x, y):
        return ("p", (Fraction(x), Fraction(y), zR + dz * nR))

    def band(lam, forward):
        def z(u):
            return zbL + (zbR - zbL) * u + s * lam * (1 - abs(1 - 2 * u)) + dz * (1 - 2 * u)
        return ("band", lam, forward, z)

    dS_L, dB_L = depth(sL == -1), depth(sL == 1)
    dS_R, dB_R = depth(sR == 1), depth(sR == -1)
    out = {}
    out[SL] = [disc_L(sL * dS_L, -_Y), disc_L(sL * dS_L, _Y)]
    out[SR] = [disc_R(_W + sR * dS_R, _Y), disc_R(_W + sR * dS_R, -_Y)]
    lo, hi = _LEVEL[BLO][k], _LEVEL[BHI][k]
    out[BLO] = [disc_R(_W + sR * dB_R, -_Y), disc_R(_W + sR * dB_R, -lo), disc_R(_W, -lo),
                band(lo, False), disc_L(0, lo), disc_L(sL * dB_L, lo), disc_L(sL * dB_L, -_Y)]
    out[BHI] = [disc_L(sL * dB_L, _Y), disc_L(sL * dB_L, hi), disc_L(0, hi), band(hi, True),
                disc_R(_W, -hi), disc_R(_W + sR * dB_R, -hi), disc_R(_W + sR * dB_R, _Y)]
    return {r: _segments(p) for r, p in out.items()}


def _segments(path):
    """Segments ((x0, y0), (x1, y1), z(t)) of a path of points and band traversals."""
    segs, prev = [], None
    for item in path:
        if item[0] == "band":
            _, lam, forward, z = item
            a, b = (Fraction(0), Fraction(lam)), (Fraction(_W), Fraction(-lam))
            if forward:
                segs.append((a, b, z))
            else:
                segs.append((b, a, lambda t, z=z: z(1 - t)))
            prev = None  # the band ends on the rim, where the next point starts
            continue
        p = item[1]
        if prev is not None and (prev[0], prev[1]) != (p[0], p[1]):
            z0, z1 = prev[2], p[2]
            segs.append(((prev[0], prev[1]), (p[0], p[1]), lambda t, z0=z0, z1=z1: z0 + (z1 - z0) * t))
        prev = p
    return segs


def _linking_over(a, b) -> int:
    """Σ sign over the crossings of the projections where polygon a passes over b."""
    total = 0
    for (p0, p1, za) in a:
        for (q0, q1, zb) in b:
            dx, dy = p1[0] - p0[0], p1[1] - p0[1]
            ex, ey = q1[0] - q0[0], q1[1] - q0[1]
            den = dx * ey - dy * ex
            if den == 0:
                continue
            t = ((q0[0] - p0[0]) * ey - (q0[1] - p0[1]) * ex) / den
            u = ((q0[0] - p0[0]) * dy - (q0[1] - p0[1]) * dx) / den
            if 0 < t < 1 and 0 < u < 1 and za(t) > zb(u):
                total += 1 if den > 0 else -1
    return total


@lru_cache(maxsize=None)
def _local_table(sign: int, left_parent: bool, right_parent: bool) -> dict:
    """{(role a, role b): contribution of this box to lk(γ_a, γ_b⁺)}."""
    a = _pieces(sign, left_parent, right_parent, False)
    b = _pieces(sign, left_parent, right_parent, True)
    out = {}
    for p in a:
        for q in b:
            v = _linking_over(a[p], b[q])
            if v:
                out[(p, q)] = v
    return out
