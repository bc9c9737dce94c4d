"""Tristram–Levine signature function σ_ω of a Seifert matrix, exactly.

σ_ω = signature of the Hermitian matrix H(ω) = (1 − ω)V + (1 − ω̄)Vᵀ for ω on the unit
circle (A. G. Tristram, "Some cobordism invariants for links", Proc. Cambridge Philos. Soc.
66 (1969); J. Levine, "Knot cobordism groups in codimension two", Comment. Math. Helv. 44
(1969)).  σ_ω̄ = σ_ω (H(ω̄) is the complex conjugate of H(ω)), so the upper half circle
ω = e^(iθ), 0 ≤ θ ≤ π, carries everything; σ_1 = 0 and σ_(−1) = sign(V + Vᵀ) = σ.

Exact method.  Put ω = (1 + si)/(1 − si), s = tan(θ/2) ≥ 0 rational.  Then
H(ω) = 2s/(1 + s²)·(sS − iA) with S = V + Vᵀ, A = V − Vᵀ, so for s = p/q > 0 the
signature is that of the Hermitian matrix pS − iqA over Z[i], and that is half the
signature of the real symmetric matrix [[pS, qA], [−qA, pS]] (a Hermitian X + iY acts on
R^(2m) as [[X, −Y], [Y, X]], each eigenvalue twice), found by exact symmetric
elimination (:func:`pipeline.invariants.signature.symmetric_inertia`, Sylvester).

Jump points.  σ is constant on arcs where det H ≠ 0; det H(ω) vanishes exactly where
det(ωV − Vᵀ) = 0, at roots of the Alexander polynomial on the circle.  D(s) = det(sS − iA)
is a real polynomial with D(−s) = (−1)^m D(s); it equals (s − i)^m det(V − tVᵀ) at
t = −(s + i)/(s − i), so it is expanded exactly over Z[i] from det(V − tVᵀ) (exact
interpolation of integer determinants).  Writing
D(s) = s^r F(s²) and x = ω + ω̄ = 2cos θ, so that s² = (2 − x)/(2 + x), the jump points are
the roots in (−2, 2) of G(x) = (2 + x)^(deg F) F((2 − x)/(2 + x)), up to a constant the
Alexander polynomial Δ(t) written in x = t + 1/t.  Each is stored as an irreducible
integer factor of G with an exact rational isolating interval (Sturm sequences), its multiplicity,
and, when ω is a root of unity (the factor is the minimal polynomial of 2cos(2π/n),
python-flint ``cos_minpoly``), its angle θ/2π as a fraction.  The values on the arcs
between jumps are computed at rational sample points s.  No floating point anywhere.

Links with Δ = 0.  The common kernel of V and Vᵀ (inside every H(ω)) is removed first.  If
the pencil sS − iA is still singular, of generic rank r, σ can only change where the rank
drops below r, and there every principal r × r minor vanishes (for a Hermitian matrix the
rank is the largest order of a nonsingular principal minor); so D is replaced by the gcd of
the nonzero principal r × r minors (up to 24 tried).  Its roots are a superset of the
points where σ changes; the values between them are exact as always.
"""

from __future__ import annotations

from dataclasses import dataclass
from functools import lru_cache
from fractions import Fraction
from itertools import combinations
from math import gcd, isqrt
from typing import Optional, Sequence

from flint import fmpz_mat, fmpz_poly

from ..diagrams.diagram import Diagram
from ..diagrams.notation import Notation
from ..errors import KnotLedgerError
from .real_roots import halve as _halve, isolate as _isolate, sturm as _sturm
from .seifert import seifert_det_poly, seifert_matrix_of_notation
from .seifert_surface import seifert_matrix
from .signature import symmetric_inertia

_MINORS = 24

__all__ = ["JumpPoint", "SignatureFunction", "tristram_levine", "tristram_levine_at", "signature_function"]


@dataclass(frozen=True)
class JumpPoint:
    """A root x = ω + ω̄ ∈ (−2, 2) of the Alexander polynomial on the circle.

    Attributes
    ----------
    factor : tuple of int
        Coefficients (constant term first) of the irreducible factor of G(x) with this root.
    interval : (Fraction, Fraction)
        Isolating interval [lo, hi] of the root of ``factor`` (lo = hi for a rational root).
    multiplicity : int
        Multiplicity of ``factor`` in G.
    angle : Fraction or None
        θ/2π ∈ (0, 1/2) when ω = e^(iθ) is a root of unity, else None.
    """

    factor: tuple[int, ...]
    interval: tuple[Fraction, Fraction]
    multiplicity: int
    angle: Optional[Fraction]

    def to_json(self) -> dict:
        return {"factor": list(self.factor), "interval": [str(self.interval[0]), str(self.interval[1])],
                "multiplicity": self.multiplicity, "angle": None if self.angle is None else str(self.angle)}


@dataclass(frozen=True)
class SignatureFunction:
    """σ_ω on the upper half circle: jump points by increasing θ and the values between.

    ``values[k]`` is σ on the open arc between jump k − 1 and jump k (θ from 0 to π), so
    ``len(values) == len(jumps) + 1``; ``at_minus_one`` is σ_(−1) = sign(V + Vᵀ) itself
    (it can differ from ``values[-1]`` when −1 is a root of Δ).
    """

    jumps: tuple[JumpPoint, ...]
    values: tuple[int, ...]
    at_minus_one: int

    def to_json(self) -> dict:
        """{"jumps": [...], "values": [...], "at_minus_one": int} (see :class:`JumpPoint`)."""
        return {"jumps": [j.to_json() for j in self.jumps], "values": list(self.values),
                "at_minus_one": self.at_minus_one}

    def max_abs(self) -> int:
        """max |σ_ω| over the circle away from the jump points (a slice-genus style bound input)."""
        return max([abs(v) for v in self.values] + [abs(self.at_minus_one)])


def _forms(V: Sequence[Sequence[int]]) -> tuple[list[list[int]], list[list[int]]]:
    m = len(V)
    S = [[V[r][c] + V[c][r] for c in range(m)] for r in range(m)]
    A = [[V[r][c] - V[c][r] for c in range(m)] for r in range(m)]
    return S, A


def _sig_sym(M: list[list[int]]) -> int:
    if not M:
        return 0
    p, n, _, _ = symmetric_inertia(M)
    return p - n


def _real_form(S, A, p: int, q: int) -> list[list[int]]:
    """[[pS, qA], [−qA, pS]]: the real symmetric form of the Hermitian q(sS − iA), s = p/q."""
    m = len(S)
    R = [[0] * (2 * m) for _ in range(2 * m)]
    for r in range(m):
        for c in range(m):
            R[r][c] = R[m + r][m + c] = p * S[r][c]
            R[r][m + c] = q * A[r][c]
            R[m + r][c] = -q * A[r][c]
    return R


def _hermitian_signature(S, A, s: Fraction) -> int:
    """Signature of q(sS − iA) for s = p/q ≥ 0, via the real 2m × 2m form."""
    return _sig_sym(_real_form(S, A, s.numerator, s.denominator)) // 2


def _restrict(V: Sequence[Sequence[int]]) -> list[list[int]]:
    """V on a complement of ker V ∩ ker Vᵀ (pivot coordinates of the stacked matrix)."""
    m = len(V)
    if m == 0:
        return []
    stacked = fmpz_mat([list(row) for row in V] + [[V[c][r] for c in range(m)] for r in range(m)])
    red, rank = stacked.rref()[0], stacked.rank()
    pivots, row = [], 0
    for col in range(m):
        if row < rank and red[row, col] != 0:
            pivots.append(col)
            row += 1
    return [[V[r][c] for c in pivots] for r in pivots]


def tristram_levine_at(V: Sequence[Sequence[int]], s: Fraction | int | None) -> int:
    """σ_ω for ω = (1 + si)/(1 − si) (s = tan(θ/2); ``None`` means s = ∞, ω = −1).

    ``V`` is a Seifert matrix in the sign convention where sign(V + Vᵀ) is the
    signature (:mod:`pipeline.invariants.seifert`).
    """
    S, A = _forms(V)
    if s is None:
        return _sig_sym(S)
    return _hermitian_signature(S, A, abs(Fraction(s)))


def _det_poly(W: Sequence[Sequence[int]]) -> fmpz_poly:
    """D(s) = det(sS − iA) = det((s − i)W + (s + i)Wᵀ) = (s − i)^m·det(W − tWᵀ) at
    t = −(s + i)/(s − i), i.e. Σ_k c_k (−1)^k (s + i)^k (s − i)^(m−k) for
    det(W − tWᵀ) = Σ c_k t^k; expanded over Z[i] as (real, imaginary) integer polynomials."""
    m = len(W)
    cs = [int(c) for c in seifert_det_poly(W).coeffs()] + [0] * (m + 1)
    s_ = fmpz_poly([0, 1])

    def times(z, sign):  # (re, im)·(s + sign·i)
        re, im = z
        return s_ * re - sign * im, s_ * im + sign * re

    plus = [(fmpz_poly([1]), fmpz_poly([]))]
    minus = [(fmpz_poly([1]), fmpz_poly([]))]
    for _ in range(m):
        plus.append(times(plus[-1], 1))
        minus.append(times(minus[-1], -1))
    re_total, im_total = fmpz_poly([]), fmpz_poly([])
    for k in range(m + 1):
        if cs[k]:
            (a, b), (c, d) = plus[k], minus[m - k]
            f = cs[k] * (-1) ** k
            re_total += f * (a * c - b * d)
            im_total += f * (a * d + b * c)
    if not im_total.is_zero():
        raise KnotLedgerError("tristram_levine: det(sS − iA) is not real")
    return re_total


def _breakpoint_poly(W, S, A) -> fmpz_poly:
    """D(s) = det(sS − iA), or for a singular pencil of generic rank r the gcd of its
    nonzero principal r × r minors (at most ``_MINORS`` of them are tried)."""
    m = len(S)
    D = _det_poly(W)
    if not D.is_zero():
        return D
    r = max(_hermitian_rank(S, A, Fraction(7, 3)), _hermitian_rank(S, A, Fraction(5, 11)))
    if r == 0:
        return fmpz_poly([1])
    g = fmpz_poly([])
    tried = 0
    for idx in combinations(range(m), r):
        d = _det_poly([[W[a][b] for b in idx] for a in idx])
        if d.is_zero():
            continue
        g = d if g.is_zero() else g.gcd(d)
        tried += 1
        if tried >= _MINORS or g.degree() == 0:
            break
    if g.is_zero():
        raise KnotLedgerError("tristram_levine: no nonsingular principal minor of the generic rank")
    return g


def _hermitian_rank(S, A, s: Fraction) -> int:
    return int(fmpz_mat(_real_form(S, A, s.numerator, s.denominator)).rank()) // 2 if S else 0


def _x_polynomial(D: fmpz_poly) -> fmpz_poly:
    """G(x) = (2 + x)^deg F · F((2 − x)/(2 + x)) where D(s) = s^r F(s²)."""
    cs = [int(c) for c in D.coeffs()]
    low = next(k for k, c in enumerate(cs) if c)
    cs = cs[low:]
    F = cs[::2] if all(c == 0 for c in cs[1::2]) else None
    if F is None:
        raise KnotLedgerError("tristram_levine: det(sS − iA) is not of the form s^r F(s²)")
    k = len(F) - 1
    two_minus, two_plus = fmpz_poly([2, -1]), fmpz_poly([2, 1])
    return sum((F[j] * two_minus ** j * two_plus ** (k - j) for j in range(k + 1)), fmpz_poly([]))


def _angle(factor: fmpz_poly, rank_from_top: int) -> Optional[Fraction]:
    """θ/2π when the factor is the minimal polynomial of 2cos(2π/n); the roots 2cos(2πk/n),
    gcd(k, n) = 1, decrease with k, so the j-th largest root has the j-th smallest k."""
    n = _cos_index(tuple(int(c) for c in factor.coeffs()))
    if n is None:
        return None
    ks = [k for k in range(1, n // 2 + 1) if gcd(k, n) == 1 and 2 * k != n]
    return Fraction(ks[rank_from_top], n)


@lru_cache(maxsize=4096)
def _cos_index(coeffs: tuple[int, ...]) -> Optional[int]:
    """The n ≥ 3 whose 2cos(2π/n) has this minimal polynomial, else None.  That polynomial
    has degree φ(n)/2 and φ(n) ≥ √(n/2), so only n ≤ 8d² with φ(n) = 2d are tried."""
    factor = fmpz_poly(list(coeffs))
    d = factor.degree()
    limit = 8 * d * d + 12
    for n in range(3, limit + 1):
        if _totients(limit)[n] == 2 * d:
            mp = fmpz_poly.cos_minpoly(n)
            if mp == factor or mp == -factor:
                return n
    return None


@lru_cache(maxsize=64)
def _totients(limit: int) -> list[int]:
    """Euler's φ(0..limit) by a sieve."""
    phi = list(range(limit + 1))
    for p in range(2, limit + 1):
        if phi[p] == p:
            for k in range(p, limit + 1, p):
                phi[k] -= phi[k] // p
    return phi


def _rational_s_between(u_lo: Fraction, u_hi: Fraction) -> Fraction:
    """A rational s > 0 with u_lo < s² < u_hi (0 ≤ u_lo < u_hi)."""
    b = 1
    while True:
        a = isqrt(int(u_lo * b * b)) + 1
        while Fraction(a, b) ** 2 <= u_lo:
            a += 1
        if Fraction(a, b) ** 2 < u_hi:
            return Fraction(a, b)
        b *= 2


def tristram_levine(V: Sequence[Sequence[int]]) -> SignatureFunction:
    """The Tristram–Levine signature function of a Seifert matrix (module docstring).

    Parameters
    ----------
    V : square list of lists of int
        A Seifert matrix, sign convention of :mod:`pipeline.invariants.seifert`
        (sign(V + Vᵀ) = σ; positive trefoil −2).

    Returns
    -------
    SignatureFunction
        Jump points in (−2, 2) as exact algebraic data, the values on the arcs between
        them, and σ_(−1).

    Raises
    ------
    KnotLedgerError
        Only on an internal inconsistency (a parity or rank property that cannot fail).
    """
    W = _restrict(V)
    S, A = _forms(W)
    at_minus_one = _sig_sym(S)
    if not W:
        return SignatureFunction((), (0,), at_minus_one)
    D = _breakpoint_poly(W, S, A)
    G = _x_polynomial(D)
    roots = []  # (lo, hi, factor, multiplicity, sturm sequence)
    _, factors = G.factor()
    for fac, mult in factors:
        if fac.degree() < 1:
            continue
        seq = _sturm(fac)
        for lo, hi in _isolate(seq):
            if lo == hi and abs(lo) == 2:
                continue
            roots.append([lo, hi, fac, mult, seq])
    # make the isolating intervals pairwise disjoint and away from ±2 (distinct roots)
    while True:
        roots.sort(key=lambda r: r[0])
        clash = any(a[1] >= b[0] for a, b in zip(roots, roots[1:])) or \
            any((r[0] <= -2 or r[1] >= 2) and r[0] != r[1] for r in roots)
        if not clash:
            break
        for r in roots:
            if r[0] != r[1]:
                r[0], r[1] = _halve(r[4], r[0], r[1])
    roots = [r for r in roots if -2 < r[0] <= r[1] < 2]
    roots.sort(key=lambda r: -r[0])  # θ increasing = x decreasing
    jumps = []
    for r in roots:
        same = sorted((q for q in roots if q[2] == r[2]), key=lambda q: -q[0])
        jumps.append(JumpPoint(tuple(int(c) for c in r[2].coeffs()), (r[0], r[1]), int(r[3]),
                               _angle(r[2], same.index(r))))
    # sample s between consecutive jumps: u = s² = (2 − x)/(2 + x), decreasing in x
    def u_of(xv: Fraction) -> Fraction:
        return (2 - xv) / (2 + xv)

    edges = [Fraction(2)] + [v for r in roots for v in (r[1], r[0])] + [Fraction(-2)]
    values = []
    for k in range(len(roots) + 1):
        x_hi, x_lo = edges[2 * k], edges[2 * k + 1]
        u_lo = u_of(x_hi) if x_hi < 2 else Fraction(0)
        if x_lo > -2:
            s = _rational_s_between(u_lo, u_of(x_lo))
        else:
            s = _rational_s_between(u_lo, u_lo + 1 + u_lo)  # any point past the last jump
        values.append(_hermitian_signature(S, A, s))
    return SignatureFunction(tuple(jumps), tuple(values), at_minus_one)


def signature_function(diagram: Diagram, *, notation: "str | Notation | None" = None) -> SignatureFunction:
    """The Tristram–Levine signature function of a diagram's link (any census row).

    Parameters
    ----------
    diagram : Diagram
        The row's diagram (its orientation is used).
    notation : str or Notation, optional, keyword-only
        The row's notation.  For ``braid:``/``torus:`` rows whose closed-braid surface is
        connected the Seifert matrix of the braid closure is used
        (:func:`pipeline.invariants.seifert.braid_seifert_matrix`); otherwise Seifert's
        algorithm on the diagram (:func:`pipeline.invariants.seifert_surface.seifert_matrix`).

    Returns
    -------
    SignatureFunction
        ``at_minus_one`` is the signature σ of :mod:`pipeline.invariants.signature`.

    Examples
    --------
    >>> from pipeline.diagrams.notation import parse
    >>> f = signature_function(parse("pretzel:-2,3,3"))   # T(3,4)
    >>> f.at_minus_one, f.values
    (-6, (0, -2, -4, -6))
    """
    V = seifert_matrix_of_notation(notation) if notation is not None else None
    if V is None:
        V = seifert_matrix(diagram)
    return tristram_levine(V)
