"""Seifert matrices from Seifert's algorithm on closed braids, and their Alexander polynomial.

Seifert's algorithm on the closure of an n-strand braid (H. Seifert, "Über das Geschlecht
von Knoten", Math. Ann. 110 (1935)): the Seifert circles are the n closed strands, each
bounding a disc D_1, …, D_n (stacked), and every letter σ_i^ε is a half-twisted band of
sign ε joining D_i and D_(i+1).  When every generator occurs the surface is connected and
H_1 has one loop per pair of consecutive bands in the same column: the loop γ_(i,k) runs up
D_i from the k-th to the (k+1)-th band of column i and back down D_(i+1).  The Seifert form
V(a, b) = lk(a, b⁺) of these loops is local (J. Collins, "An algorithm for computing the
Seifert matrix of a link from a braid representation", 2007 preprint, *(memory)*):

* V(γ, γ) = −(ε₁ + ε₂)/2 for the loop through bands of signs ε₁, ε₂;
* consecutive loops γ_(i,k), γ_(i,k+1) sharing a band of sign ε:
  V(γ_(i,k), γ_(i,k+1)) = 1, V(γ_(i,k+1), γ_(i,k)) = 0 when ε = +1, and 0, −1 when ε = −1;
* loops in adjacent columns i, i+1 through bands at positions a < b and c < d:
  V(γ_i, γ_(i+1)) = −1 when a < c < b < d and +1 when c < a < d < b, V(γ_(i+1), γ_i) = 0;
* all other entries 0.

Sign conventions.  With these rules sign(V + Vᵀ) is the project's signature σ (positive
trefoil −2; :mod:`pipeline.invariants.signature`), and the Conway-normalised Alexander
polynomial (∇(positive Hopf link) = z) is det(t^−½V − t^½Vᵀ), i.e. the usual
det(t^½W − t^−½Wᵀ) for W = −V; for knots (even size) the two agree.  The asymmetric
rules (which of V_xy, V_yx carries the entry) were fixed among the candidates allowed by
the symmetrised form by testing: only these (and transposes of them) give the Alexander
polynomial of :mod:`pipeline.invariants.alexander` on random braids, links included;
V − Vᵀ is then the intersection form of the surface (unimodular for a knot).
"""

from __future__ import annotations

from typing import Optional, Sequence

from flint import fmpq, fmpq_poly, fmpz_mat, fmpz_poly

from ..diagrams.families import torus
from ..diagrams.notation import Notation, parse_notation
from ..errors import KnotLedgerError, NotationError
from .poly import Laurent

__all__ = ["braid_seifert_matrix", "seifert_alexander", "SeifertSurfaceError", "interpolate_integer_poly",
           "braid_of_notation", "seifert_matrix_of_notation", "seifert_det_poly"]


class SeifertSurfaceError(KnotLedgerError):
    """The Seifert surface of the braid closure is disconnected (a generator is missing)."""


def braid_seifert_matrix(word: Sequence[int], *, strands: Optional[int] = None) -> list[list[int]]:
    """Seifert matrix V of the closure of a braid word (module docstring for the rules).

    Parameters
    ----------
    word : sequence of nonzero int
        Braid word, i = σ_i, −i = σ_i⁻¹.
    strands : int, optional
        Number of strands (default max|i| + 1).

    Returns
    -------
    list of lists of int
        V, of size length − strands + 1, rows and columns ordered by column, then position.

    Raises
    ------
    SeifertSurfaceError
        If some generator 1..strands−1 does not occur (the surface is disconnected).
    """
    word = [int(g) for g in word]
    if any(g == 0 for g in word):
        raise NotationError("braid: generator 0 is not allowed (use i or -i with i >= 1)")
    n = max((abs(g) for g in word), default=0) + 1 if strands is None else int(strands)
    missing = sorted(set(range(1, n)) - {abs(g) for g in word})
    if missing:
        raise SeifertSurfaceError(f"seifert: generator {missing[0]} does not occur (disconnected surface)")
    cols: dict[int, list[tuple[int, int]]] = {}
    for pos, g in enumerate(word):
        cols.setdefault(abs(g), []).append((pos, 1 if g > 0 else -1))
    loops = [(i, cr[k], cr[k + 1]) for i, cr in sorted(cols.items()) for k in range(len(cr) - 1)]
    m = len(loops)
    V = [[0] * m for _ in range(m)]
    for x, (i, (a, ea), (b, eb)) in enumerate(loops):
        V[x][x] = -(ea + eb) // 2
        for y, (j, (c, _), (d, _)) in enumerate(loops):
            if i == j and b == c:  # consecutive loops sharing band b
                if eb > 0:
                    V[x][y] = 1
                else:
                    V[y][x] = -1
            elif j == i + 1:
                if a < c < b < d:
                    V[x][y] = -1
                elif c < a < d < b:
                    V[x][y] = 1
    return V


def braid_of_notation(text: "str | Notation") -> Optional[tuple[list[int], int]]:
    """(word, strands) of a ``braid:`` or ``torus:`` row (torus on min(|p|, |q|) strands,
    T(p,q) = T(q,p), Rolfsen ch. 3); None for any other kind.

    ``text`` is the notation string (validated by
    :func:`~pipeline.diagrams.notation.parse_notation`, the one notation parser) or an
    already parsed :class:`~pipeline.diagrams.notation.Notation`.
    """
    nota = text if isinstance(text, Notation) else parse_notation(text)
    if nota.kind == "braid":
        vals = [int(g) for g in nota.args]
        return vals, max(abs(g) for g in vals) + 1
    if nota.kind != "torus":
        return None
    p, q = (int(x) for x in nota.args)
    if abs(q) < abs(p):
        p, q = q, p
    return torus.word(p, q), abs(p)


def seifert_matrix_of_notation(text: "str | Notation") -> Optional[list[list[int]]]:
    """Seifert matrix of a ``braid:``/``torus:`` row whose closed-braid surface is connected,
    else None (other kinds, or a generator missing: then the link is split or the braid
    can be shortened)."""
    wb = braid_of_notation(text)
    if wb is None:
        return None
    word, strands = wb
    if {abs(g) for g in word} != set(range(1, strands)):
        return None
    return braid_seifert_matrix(word, strands=strands)


def seifert_alexander(V: Sequence[Sequence[int]]) -> Laurent:
    """det(t^−½V − t^½Vᵀ) as a :class:`Laurent` in t (doubled exponents), exactly.

    The Conway-normalised Alexander polynomial for V in this module's sign convention
    (module docstring).  det(V − tVᵀ) is found by exact interpolation at t = 0, 1, …, m
    from python-flint integer determinants; multiplying by t^(−m/2) normalises.
    """
    m = len(V)
    coeffs = seifert_det_poly(V).coeffs()
    return Laurent({2 * k - m: int(c) for k, c in enumerate(coeffs) if c})


def seifert_det_poly(V: Sequence[Sequence[int]]) -> fmpz_poly:
    """det(V − tVᵀ) as an integer polynomial in t, by exact interpolation at t = 0, …, m."""
    m = len(V)
    if m == 0:
        return fmpz_poly([1])
    pts = list(range(m + 1))
    vals = [int(fmpz_mat([[V[r][c] - t * V[c][r] for c in range(m)] for r in range(m)]).det()) for t in pts]
    return interpolate_integer_poly(pts, vals)


def interpolate_integer_poly(points: Sequence[int], values: Sequence[int]) -> fmpz_poly:
    """The polynomial of degree < len(points) through integer data known to have an
    integer-coefficient interpolant (Lagrange over Q, checked integral)."""
    poly = fmpq_poly([0])
    for k, (tk, yk) in enumerate(zip(points, values)):
        term = fmpq_poly([yk])
        for j, tj in enumerate(points):
            if j != k:
                term = term * fmpq_poly([-tj, 1]) / (tk - tj)
        poly += term
    if any(fmpq(c).q != 1 for c in poly.coeffs()):
        raise ArithmeticError("seifert: interpolated determinant is not integral")
    return fmpz_poly([int(fmpq(c).p) for c in poly.coeffs()])
