"""Per-row certification: relations every computed row must satisfy.

:func:`run_checks` evaluates every relation below whose inputs are present and that
applies to the row (knot-only relations are omitted for links, relations needing a
skipped value are omitted — never reported as passed).  c is the number of
components (free loops included), n the number of crossings, det the determinant,
σ the signature, Δ the Conway-normalised Alexander polynomial (Δ(t) = ∇(t^½ − t^−½)),
∇ the Conway polynomial, V the Jones polynomial, a₂ the z² coefficient of ∇.

============================  ==========  ===============================================  ======================================
name                          applies to  relation                                         source
============================  ==========  ===============================================  ======================================
determinant_product           all         det = Π invariant factors                        README.md (definition)
determinant_odd               knots       det is odd                                       common practice
alexander_at_one              knots       Δ(1) = 1                                         Conway 1970 normalisation
alexander_symmetric           all         Δ(1/t) = (−1)^(c−1) Δ(t)                         Conway 1970; Kauffman 1981
alexander_det                 all         |Δ(−1)| = det                                    Jones 1985; Goeritz 1933
alexander_signed_det          all         Δ(−1) = i^(−σ) · det   (t^½ = i)                 common practice (Seifert matrix; see below)
conway_at_zero                all         ∇(0) = 1 for knots, 0 for links                  Conway 1970
conway_alexander_agree        all         Δ(t) = ∇(t^½ − t^−½)                             Conway 1970
jones_at_one                  all         V(1) = (−2)^(c−1)                                common practice
jones_exponent_parity         all         exponents of V lie in (c−1)/2 + Z                common practice
jones_det                     all         |V(−1)| = det                                    Jones 1985
jones_signed_det              all         V(−1) = (−1)^(c−1) i^(−σ) · det   (t^½ = i)       Jones 1985 with the sign above
jones_alexander_at_minus_one  all         V(−1) = (−1)^(c−1) Δ(−1)   (t^½ = i)              Jones 1985
jones_at_cube_root            all         V(e^{2πi/3}) = 1   (t^½ = e^{4πi/3})             Jones 1985
jones_derivative              all         V'(1) = −3 (−2)^(c−2) Σ_{i<j} lk(K_i, K_j)       Jones 1985 (knots: 0); Murakami 1986 (memory)
jones_second_derivative       knots       V''(1) = −6 a₂                                   Jones 1985 (memory)
jones_at_sixth_root           all         |V(e^{iπ/3})|² = 3^d, d = #factors divisible    Lickorish–Millett 1986
                                          by 3 (zeros included)
jones_at_i_arf                knots       V(i) = (−1)^Arf, Arf = 0 iff det ≡ ±1 (mod 8)    Levine 1966; Murakami 1986
jones_span_bound              all         span V ≤ n + (pieces + free loops − 1)           Kauffman 1987, Murasugi 1987
jones_span_alternating        connected   span V = n for a reduced alternating diagram     Kauffman, Murasugi, Thistlethwaite 1987
signature_mod_four            knots       σ ≡ 0 (4) iff det ≡ 1 (4), σ ≡ 2 (4) iff det ≡ 3   Murasugi 1965
signature_alexander_span      knots       |σ| ≤ span Δ                                     Murasugi 1965
signature_parity              all         σ + nullity ≡ c − 1 (mod 2)                      common practice (size of V + Vᵀ)
nullity_zero_factors          all         nullity = number of zero invariant factors       common practice (b₁ of Σ₂)
goeritz_det                   all         |det Goeritz| = det                              Goeritz 1933; Gordon–Litherland 1978
============================  ==========  ===============================================  ======================================

The HOMFLY-PT, Khovanov, Rasmussen s and Tristram–Levine relations (``homfly_jones``,
``khovanov_euler_jones``, ``rasmussen_alternating``, ...) are listed with their sources
in :mod:`pipeline.invariants.strength_checks`.

The signed relations.  Take a Seifert matrix V of size m = 2g + c − 1 with
V_ij = lk(a_i, a_j⁺), so σ = sign(V + Vᵀ) (the positive trefoil has σ = −2) and the
Conway-normalised polynomial is Δ(t) = det(t^−½V − t^½Vᵀ) (this orientation of the
formula gives ∇ = z for the positive Hopf link, V = (−1)).  At t^½ = i,
Δ(−1) = det(−i(V + Vᵀ)) = (−i)^m (−1)^{(m−σ)/2} det when det ≠ 0, which simplifies
to i^(−σ)·det; both sides vanish when det = 0.  Jones' identity V_L(t) at t^½ = i
equals ∇(−2i) = (−1)^(c−1) ∇(2i) (from the two skein relations), giving the Jones
form.  For knots both reduce to Δ(−1) = V(−1) = (−1)^{σ/2}·det.  The tests check
these on hundreds of knots and links against independent implementations.

Roots of unity are handled exactly: a Laurent polynomial in s = t^½ is evaluated at
s = ζ_m^k by reducing Σ c_j x^{(j·k) mod m} modulo the cyclotomic polynomial Φ_m with
python-flint integer polynomials; |w|² is w(ζ)·w(ζ⁻¹) reduced the same way (integer
coefficients, so w(ζ⁻¹) is the complex conjugate).  The square root of t is fixed
per relation as shown in the table (for knots all exponents are integers and the
choice does not matter; for |V| it never matters).

References
----------
1. V. F. R. Jones, "A polynomial invariant for knots via von Neumann algebras",
   Bull. AMS 12 (1985).
2. W. B. R. Lickorish, K. C. Millett, "Some evaluations of link polynomials",
   Comment. Math. Helv. 61 (1986).
3. K. Murasugi, "On a certain numerical invariant of link types", Trans. AMS 117 (1965).
4. J. Levine, Ann. of Math. 84 (1966); H. Murakami, J. Math. Soc. Japan 38 (1986).
5. H. Murakami, "On derivatives of the Jones polynomial", Kobe J. Math. 3 (1986).
6. L. H. Kauffman, Topology 26 (1987); K. Murasugi, Topology 26 (1987);
   M. B. Thistlethwaite, Topology 26 (1987).
7. C. McA. Gordon, R. A. Litherland, Invent. Math. 47 (1978); L. Goeritz, Math. Z. 36 (1933).
"""

from __future__ import annotations

from fractions import Fraction
from math import prod
from typing import Any, Mapping

from flint import fmpz_poly

from ..diagrams.diagram import Diagram
from .poly import Laurent
from . import bounds
from .linking import linking_numbers
from .row import InvariantValues

__all__ = ["run_checks", "evaluate_at_root", "CHECK_NAMES", "ALL_CHECK_NAMES"]

CHECK_NAMES = (
    "determinant_product", "determinant_odd", "alexander_at_one", "alexander_symmetric",
    "alexander_det", "alexander_signed_det", "conway_at_zero", "conway_alexander_agree",
    "jones_at_one", "jones_exponent_parity", "jones_det", "jones_signed_det",
    "jones_alexander_at_minus_one", "jones_at_cube_root", "jones_derivative",
    "jones_second_derivative", "jones_at_sixth_root", "jones_at_i_arf", "jones_span_bound",
    "jones_span_alternating", "signature_mod_four", "signature_alexander_span",
    "signature_parity", "nullity_zero_factors", "goeritz_det",
)
# ---- strength (issue 12): the relations of pipeline/invariants/strength_checks.py
from .strength_checks import STRENGTH_CHECK_NAMES, strength_checks  # noqa: E402

#: Every check name: the classical relations above and the issue-12 ones.
ALL_CHECK_NAMES = CHECK_NAMES + STRENGTH_CHECK_NAMES
# ---- end strength


# ---------------------------------------------------------------- exact evaluation
def evaluate_at_root(p: Laurent, m: int, k: int = 1) -> fmpz_poly:
    """p at t^½ = ζ_m^k, as a polynomial in ζ_m reduced modulo Φ_m (exact).

    ``p`` stores doubled exponents j (terms c·t^{j/2} = c·s^j), so s^j ↦ x^{(j·k) mod m}.
    """
    coeffs = [0] * m
    for j, c in p.terms:
        coeffs[(j * k) % m] += c
    return fmpz_poly(coeffs) % fmpz_poly.cyclotomic(m)


def _equals(value: fmpz_poly, target: int) -> bool:
    """True when the reduced cyclotomic value is the integer ``target``."""
    return value - fmpz_poly([target]) == 0


def _gaussian(p: Laurent) -> tuple[int, int]:
    """p at t^½ = i as a Gaussian integer (re, im)."""
    v = evaluate_at_root(p, 4, 1)
    cs = [int(c) for c in v.coeffs()] + [0, 0]
    return cs[0], cs[1]


def _i_power(e: int) -> tuple[int, int]:
    return ((1, 0), (0, 1), (-1, 0), (0, -1))[e % 4]


def _scale(g: tuple[int, int], n: int) -> tuple[int, int]:
    return g[0] * n, g[1] * n


def _derivatives_at_one(p: Laurent) -> tuple[Fraction, Fraction]:
    d1 = d2 = Fraction(0)
    for j, c in p.terms:
        e = Fraction(j, 2)
        d1 += c * e
        d2 += c * e * (e - 1)
    return d1, d2


def _conway_substitute(conway: Laurent) -> Laurent:
    """∇(t^½ − t^−½) by Horner's rule."""
    z = Laurent({1: 1, -1: -1})
    coeffs = dict(conway.terms)
    out = Laurent()
    if not coeffs:
        return out
    for j in range(max(coeffs), -1, -2):
        out = out * z + Laurent({0: coeffs.get(j, 0)})
    return out


# ---------------------------------------------------------------- the checks
def run_checks(diagram: Diagram, values: "InvariantValues | Mapping[str, Any]") -> dict[str, bool]:
    """Evaluate every applicable relation (module table) on one row of values.

    Parameters
    ----------
    diagram : Diagram
    values : InvariantValues (or a mapping, read by ``InvariantValues.from_record``)
        Whatever was computed: ``determinant``, ``invariant_factors``, ``alexander``,
        ``conway``, ``jones`` (Laurent or None when skipped), ``signature``,
        ``nullity``, ``components``.  None values omit their checks; the Goeritz
        determinant check needs the signature too (the Goeritz matrix is the
        signature's input: when the signature could not be computed, neither could it).

    Returns
    -------
    dict of str to bool
        Check name → passed, sorted by name; only checks that apply are present.

    Examples
    --------
    >>> from pipeline.diagrams.notation import parse
    >>> from pipeline.invariants.poly import Laurent
    >>> v = Laurent.from_exponents([(1, 1), (3, 1), (4, -1)])
    >>> run_checks(parse("torus:2,3"), {"jones": v, "determinant": 3})["jones_det"]
    True
    """
    values = InvariantValues.coerce(values)
    out: dict[str, bool] = {}
    c = values.components
    c = diagram.n_components if c is None else c
    knot = c == 1
    n = diagram.n_crossings
    det, factors = values.determinant, values.invariant_factors
    alex, conway, jones = values.alexander, values.conway, values.jones
    sig, null = values.signature, values.nullity

    if det is not None and factors is not None:
        out["determinant_product"] = det == prod(factors)
    if det is not None and knot:
        out["determinant_odd"] = det % 2 == 1

    # Alexander and Conway
    if alex is not None:
        if knot:
            out["alexander_at_one"] = alex.at_one() == 1
        out["alexander_symmetric"] = alex.invert() == alex * (-1) ** (c - 1)
        d_alex = _gaussian(alex)
        if det is not None:
            out["alexander_det"] = d_alex[0] ** 2 + d_alex[1] ** 2 == det * det
            if sig is not None:
                out["alexander_signed_det"] = d_alex == _scale(_i_power(-sig), det)
        if knot and sig is not None:
            out["signature_alexander_span"] = abs(sig) <= alex.span()
    if conway is not None:
        out["conway_at_zero"] = dict(conway.terms).get(0, 0) == (1 if knot else 0)
        if alex is not None:
            out["conway_alexander_agree"] = _conway_substitute(conway) == alex

    # Jones
    if jones is not None:
        out["jones_at_one"] = jones.at_one() == (-2) ** (c - 1)
        out["jones_exponent_parity"] = all((j - (c - 1)) % 2 == 0 for j, _ in jones.terms)
        v_m1 = _gaussian(jones)
        if det is not None:
            out["jones_det"] = v_m1[0] ** 2 + v_m1[1] ** 2 == det * det
            if sig is not None:
                out["jones_signed_det"] = v_m1 == _scale(_i_power(-sig), det * (-1) ** (c - 1))
        if alex is not None:
            out["jones_alexander_at_minus_one"] = v_m1 == _scale(_gaussian(alex), (-1) ** (c - 1))
        out["jones_at_cube_root"] = _equals(evaluate_at_root(jones, 3, 2), 1)
        d1, d2 = _derivatives_at_one(jones)
        if knot:
            out["jones_derivative"] = d1 == 0
        else:
            lam = sum(linking_numbers(diagram).values())
            out["jones_derivative"] = d1 == Fraction(-3 * lam) * Fraction(-2) ** (c - 2)
        if knot:
            a2 = None
            if conway is not None:
                a2 = dict(conway.terms).get(4, 0)
            elif alex is not None:
                a2 = _derivatives_at_one(alex)[1] / 2  # Δ''(1) = 2 a₂ for a knot
            if a2 is not None:
                out["jones_second_derivative"] = d2 == -6 * a2
        if factors is not None:
            d = sum(1 for f in factors if f % 3 == 0)
            w, wbar = evaluate_at_root(jones, 12, 1), evaluate_at_root(jones, 12, 11)
            out["jones_at_sixth_root"] = _equals((w * wbar) % fmpz_poly.cyclotomic(12), 3 ** d)
        if knot and det is not None:
            arf = bounds.arf_invariant(det)
            if arf is not None:
                out["jones_at_i_arf"] = _equals(evaluate_at_root(jones, 8, 1), (-1) ** arf)
        extra = len(diagram.pieces) + diagram.free_loops - 1 if n else diagram.free_loops - 1
        out["jones_span_bound"] = jones.span() <= n + extra
        if n and bounds.is_connected(diagram) and diagram.is_alternating() and bounds.is_reduced(diagram):
            out["jones_span_alternating"] = jones.span() == n

    # signature
    if sig is not None:
        if knot and det is not None:
            out["signature_mod_four"] = (sig % 4 == 0 and det % 4 == 1) or (sig % 4 == 2 and det % 4 == 3)
        if null is not None:
            out["signature_parity"] = (sig + null - (c - 1)) % 2 == 0
    if null is not None and factors is not None:
        out["nullity_zero_factors"] = null == sum(1 for f in factors if f == 0)
    if det is not None and sig is not None:
        from .signature import goeritz_determinant
        out["goeritz_det"] = abs(goeritz_determinant(diagram)) == det
    # ---- strength (issue 12): HOMFLY-PT, Khovanov, s, Tristram–Levine (own module, own sources)
    out.update(strength_checks(diagram, values, knot=knot))
    return dict(sorted(out.items()))
