"""Exact polynomial fitting: the lowest-degree polynomial through integer data points.

For degree d = 0, 1, ..., D the values are matched against every polynomial with
rational coefficients in the monomials of total degree <= d: a set of data points with
linearly independent monomial vectors and the monomials the data separates are chosen by
exact row reduction over Q (:class:`sympy.polys.matrices.DomainMatrix`), the square
system is solved exactly, and the polynomial is then verified on *every* point with
exact integer/fraction arithmetic.  The first degree whose polynomial holds on every
point -- and is over-determined, i.e. checked on more points than it has unknowns -- is
the answer; otherwise the candidate confirmed on the most points (a robust refit ignores
the failing points once or twice).

:func:`square_root` recognises a fitted polynomial of the form c·Q² (sympy's
``factor_list``), for targets |Q| that are not polynomials themselves, and
:func:`abs_root_failing` re-verifies |Q| point by point.  The census layer is
:mod:`pipeline.explore.fit`.

References
----------
1. G. H. Golub, C. F. Van Loan, *Matrix Computations*, Johns Hopkins (1996), ch. 3:
   Gaussian elimination with pivoting (here exact, over Q).
"""

from __future__ import annotations

from collections import Counter, defaultdict
from dataclasses import dataclass
from fractions import Fraction
from itertools import combinations_with_replacement
from math import isqrt, lcm
from typing import Optional, Sequence

from ..errors import QueryError

__all__ = ["PolynomialFit", "fit_polynomial", "square_root", "abs_root_failing", "MAX_REFITS", "ATTEMPTS"]


MAX_REFITS = 2
#: Different bases tried per degree when the first one does not fit every row.
ATTEMPTS = 8


def _monomials(nvars: int, degree: int) -> list[tuple[int, ...]]:
    """Exponent tuples of total degree <= ``degree``, by degree then lexicographically."""
    out = []
    for d in range(degree + 1):
        level = []
        for combo in combinations_with_replacement(range(nvars), d):
            e = [0] * nvars
            for i in combo:
                e[i] += 1
            level.append(tuple(e))
        out += sorted(level, reverse=True)
    return out


def _mono_value(point: Sequence[int], exps: Sequence[int]) -> int:
    v = 1
    for x, e in zip(point, exps):
        if e:
            v *= x ** e
    return v


@dataclass
class PolynomialFit:
    """An exact polynomial in the parameters and how it fares on the data."""

    names: tuple
    coeffs: dict            # exponent tuple -> Fraction
    degree: int
    unknowns: int           # size of the solved system
    points: int             # distinct parameter points
    failing: list           # row indices (into the fitted rows) where it fails
    separated: bool = True  # False if the data did not separate all monomials of the degree

    def expr(self):
        """The polynomial as a sympy expression."""
        import sympy
        syms = sympy.symbols(self.names) if self.names else ()
        if len(self.names) == 1:
            syms = (syms if isinstance(syms, sympy.Symbol) else syms[0],)
        total = sympy.Integer(0)
        for e, c in self.coeffs.items():
            term = sympy.Rational(c.numerator, c.denominator)
            for s, k in zip(syms, e):
                term *= s ** k
            total += term
        return sympy.expand(total)

    @property
    def exact(self) -> bool:
        """True if it holds on every row and was checked beyond its defining points."""
        return not self.failing and self.points > self.unknowns


def _spread(n: int, k: int) -> list[int]:
    """k evenly spaced indices of range(n), the first included (deterministic)."""
    if k >= n:
        return list(range(n))
    return sorted({(i * (n - 1)) // (k - 1) for i in range(k)}) if k > 1 else [0]


def _solve(points: list, values: list, monos: list) -> tuple[dict, int]:
    """Exact solve on independent points/separated monomials: (coeffs, unknowns).

    Independent points are looked for in an evenly spread sample of a few times as many
    points as unknowns, grown until the rank stops short only because the data itself
    does not separate the monomials.
    """
    from sympy import QQ
    from sympy.polys.matrices import DomainMatrix

    n, m = len(points), len(monos)
    k = min(n, 4 * m + 8)
    while True:
        idx = _spread(n, k)
        rows = [[QQ(_mono_value(points[i], e)) for e in monos] for i in idx]
        a = DomainMatrix(rows, (len(idx), m), QQ)
        _, row_pivots = a.transpose().rref()        # independent data points
        if len(row_pivots) == m or k >= n:
            break
        k = min(n, 4 * k)
    sub = a.extract(list(row_pivots), list(range(m)))
    _, col_pivots = sub.rref()                       # monomials the data separates
    if not col_pivots:
        return {}, 0
    square = sub.extract(list(range(len(row_pivots))), list(col_pivots))
    rhs = DomainMatrix([[QQ(values[idx[i]])] for i in row_pivots], (len(row_pivots), 1), QQ)
    if len(row_pivots) != len(col_pivots):          # cannot happen for a rank-r selection
        raise QueryError("fit: internal rank mismatch")
    sol = square.lu_solve(rhs).to_Matrix()
    coeffs = {}
    for k, j in enumerate(col_pivots):
        c = sol[k, 0]
        if c != 0:
            coeffs[monos[j]] = Fraction(int(c.p), int(c.q))
    return coeffs, len(col_pivots)


def _failing(coeffs: dict, points: Sequence, values: Sequence) -> list[int]:
    """Indices where the polynomial differs from the value (exact, in integers)."""
    den = lcm(*[c.denominator for c in coeffs.values()]) if coeffs else 1
    terms = [(e, int(c * den)) for e, c in coeffs.items()]
    return [i for i, pt in enumerate(points)
            if sum(c * _mono_value(pt, e) for e, c in terms) != den * values[i]]


def _score(fit: PolynomialFit, n: int) -> int:
    """Rows confirmed beyond the defining points: support minus unknowns (prefers simple fits)."""
    return n - len(fit.failing) - fit.unknowns


def fit_polynomial(points: Sequence[Sequence[int]], values: Sequence[int], names: Sequence[str], *,
                   max_degree: int = 3, min_degree: int = 0, robust: bool = True) -> Optional[PolynomialFit]:
    """The lowest-degree exact polynomial through every (point, value), else the best one.

    Parameters
    ----------
    points : sequence of integer tuples
        Parameter values of each row.
    values : sequence of int
        Target value of each row (exact integers).
    names : sequence of str
        Parameter names (used for printing).
    max_degree, min_degree : int
        Degrees tried, in increasing order.
    robust : bool
        When a degree does not fit every row, also try other interpolation bases and
        refits without the failing points (slower; only needed for a best candidate).

    Returns
    -------
    PolynomialFit or None
        ``.exact`` is true when the polynomial holds on every row and is over-determined;
        otherwise the candidate confirmed on the most rows beyond its defining points
        (support minus unknowns), so a low-degree rule with a few exceptions beats a
        high-degree interpolation.  None when there are no rows.
    """
    if not points:
        return None
    by_point: dict = defaultdict(list)
    for i, pt in enumerate(points):
        by_point[tuple(pt)].append(i)
    best: Optional[PolynomialFit] = None
    all_points = list(by_point)
    n = len(points)

    def attempt(pts: list, degree: int, monos: list) -> PolynomialFit:
        vals = [Counter(values[i] for i in by_point[p]).most_common(1)[0][0] for p in pts]
        coeffs, unknowns = _solve(pts, vals, monos)
        failing = _failing(coeffs, points, values)
        return PolynomialFit(tuple(names), coeffs, degree, unknowns, len(by_point), failing,
                             separated=unknowns == len(monos))

    for degree in range(min_degree, max_degree + 1):
        monos = _monomials(len(names), degree)
        # The exact solve interpolates the first independent points of the order given;
        # rotating the order gives other bases (a deterministic consensus search).
        local: Optional[PolynomialFit] = None
        for k in range(ATTEMPTS if robust else 1):
            shift = (k * len(all_points)) // ATTEMPTS
            if k and shift == 0:
                break
            cand = attempt(all_points[shift:] + all_points[:shift], degree, monos)
            if cand.exact:
                return cand
            if local is None or _score(cand, n) > _score(local, n):
                local = cand
            if not cand.failing:
                break
        excluded: set = set()
        for _ in range(MAX_REFITS if robust else 0):
            if local is None or not local.failing or len(local.failing) * 2 > n:
                break
            excluded |= {tuple(points[i]) for i in local.failing}
            pts = [p for p in all_points if p not in excluded]
            if not pts:
                break
            cand = attempt(pts, degree, monos)
            if cand.exact:
                return cand
            if _score(cand, n) <= _score(local, n):
                break
            local = cand
        if local is not None and (best is None or _score(local, n) > _score(best, n)):
            best = local
    return best


def square_root(fit: PolynomialFit):
    """Q (sympy) with fit == Q**2 exactly, or None."""
    import sympy
    expr = fit.expr()
    if expr == 0:
        return sympy.Integer(0)
    coeff, factors = sympy.factor_list(expr)
    coeff = sympy.Rational(coeff)
    if coeff < 0 or any(e % 2 for _, e in factors):
        return None
    num, den = int(coeff.p), int(coeff.q)
    if isqrt(num) ** 2 != num or isqrt(den) ** 2 != den:
        return None
    q = sympy.Rational(isqrt(num), isqrt(den))
    for f, e in factors:
        q *= f ** (e // 2)
    q = sympy.expand(q)
    if q.could_extract_minus_sign():
        q = sympy.expand(-q)
    return q


def abs_root_failing(root, names: Sequence[str], points: list, values: list) -> list:
    """Indices where |root| (a sympy polynomial in ``names``) differs from the value (exact)."""
    import sympy
    syms = [sympy.Symbol(n) for n in names]
    poly = sympy.Poly(root, *syms) if syms else None
    terms = [(e, Fraction(int(c.p), int(c.q))) for e, c in poly.terms()] if poly is not None else []
    return [i for i, pt in enumerate(points)
            if abs(sum((c * _mono_value(pt, e) for e, c in terms), Fraction(0))) != values[i]]
