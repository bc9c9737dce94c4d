"""Tests of pipeline.invariants.checks: the relations hold on published values and on
computed rows, each check can fail on a corrupted value, and checks that do not apply
are omitted.  Sources are named beside each value (SOURCES.md)."""

from __future__ import annotations

import random
from fractions import Fraction
from math import gcd

import pytest
import sympy

from pipeline.diagrams.notation import parse
from pipeline.invariants.poly import Laurent
from pipeline.invariants.alexander import fox as alexander
from pipeline.invariants.coloring import spectrum as coloring
from pipeline.invariants.jones import frontier as jones
from pipeline.invariants.checks import CHECK_NAMES, evaluate_at_root, run_checks
from pipeline.invariants.signature import nullity, signature

from test_signature import brieskorn_signature


def L(*pairs) -> Laurent:
    return Laurent.from_exponents(pairs)


# ---------------------------------------------------------------- published rows
TREFOIL = {  # positive trefoil: README.md contract (V, σ); Δ, ∇, det: common practice
    "components": 1, "determinant": 3, "invariant_factors": [3], "nullity": 0,
    "jones": L((1, 1), (3, 1), (4, -1)), "alexander": L((-1, 1), (0, -1), (1, 1)),
    "conway": Laurent({0: 1, 4: 1}), "signature": -2,
}
FIGURE_EIGHT = {  # 4_1: V = t^-2 - t^-1 + 1 - t + t^2, Δ = -t + 3 - 1/t, det 5, σ 0 (common practice)
    "components": 1, "determinant": 5, "invariant_factors": [5], "nullity": 0,
    "jones": L((-2, 1), (-1, -1), (0, 1), (1, -1), (2, 1)), "alexander": L((-1, -1), (0, 3), (1, -1)),
    "conway": Laurent({0: 1, 4: -1}), "signature": 0,
}
HOPF = {  # positive Hopf link: V = -t^{1/2} - t^{5/2}, ∇ = z, σ = -1, factors (2) (README.md)
    "components": 2, "determinant": 2, "invariant_factors": [2], "nullity": 0,
    "jones": L((Fraction(1, 2), -1), (Fraction(5, 2), -1)), "alexander": L((Fraction(-1, 2), -1), (Fraction(1, 2), 1)),
    "conway": Laurent({2: 1}), "signature": -1,
}
PUBLISHED = [("torus:2,3", TREFOIL), ("conway:2 2", FIGURE_EIGHT), ("torus:2,2", HOPF)]


@pytest.mark.parametrize("notation,values", PUBLISHED, ids=[p[0] for p in PUBLISHED])
def test_every_check_passes_on_published_values(notation, values):
    result = run_checks(parse(notation), values)
    assert result and all(result.values()), result
    assert set(result) <= set(CHECK_NAMES)


def test_knot_checks_are_all_present_for_a_full_knot_row():
    result = run_checks(parse("torus:2,3"), TREFOIL)
    assert set(result) == set(CHECK_NAMES)  # every relation applies to a full knot row


def _torus_row(p: int, q: int) -> dict:
    """Values of the positive torus knot T(p,q) from closed formulas only.

    Jones 1987: V = t^{(p-1)(q-1)/2}(1 - t^{p+1} - t^{q+1} + t^{p+q})/(1 - t^2);
    Rolfsen ch. 7: Δ = (t^{pq}-1)(t-1)/((t^p-1)(t^q-1)), normalised symmetric;
    det = odd one of p, q or 1; σ by Brieskorn's count.
    """
    t = sympy.Symbol("t")
    v = sympy.cancel(t ** ((p - 1) * (q - 1) // 2) * (1 - t ** (p + 1) - t ** (q + 1) + t ** (p + q)) / (1 - t ** 2))
    a = sympy.cancel((t ** (p * q) - 1) * (t - 1) / ((t ** p - 1) * (t ** q - 1)))
    vp, ap = sympy.Poly(v, t), sympy.Poly(a, t)
    deg = ap.degree()
    alex = Laurent({2 * (k[0] - deg // 2): int(c) for k, c in zip(ap.monoms(), ap.coeffs())})
    if alex.at_one() != 1:
        alex = -alex
    det = 1 if p % 2 and q % 2 else (q if p % 2 == 0 else p)
    return {"components": 1, "determinant": det, "invariant_factors": [det] if det != 1 else [],
            "nullity": 0, "jones": Laurent({2 * k[0]: int(c) for k, c in zip(vp.monoms(), vp.coeffs())}),
            "alexander": alex, "conway": alexander.conway_from_alexander(alex),
            "signature": brieskorn_signature(p, q)}


TORUS = [(2, 3), (2, 5), (2, 7), (3, 4), (3, 5), (3, 7), (4, 5), (5, 6)]


@pytest.mark.parametrize("p,q", TORUS)
def test_every_check_passes_on_torus_knot_closed_formulas(p, q):
    result = run_checks(parse(f"torus:{p},{q}"), _torus_row(p, q))
    assert all(result.values()), {k: v for k, v in result.items() if not v}
    assert "jones_second_derivative" in result and "jones_at_sixth_root" in result


# ---------------------------------------------------------------- computed rows
def computed(d) -> dict:
    return {
        "components": d.n_components,
        "determinant": coloring.determinant(d),
        "invariant_factors": list(coloring.invariant_factors(d)),
        "alexander": alexander.alexander_polynomial(d),
        "conway": alexander.conway_polynomial(d),
        "jones": jones.jones_polynomial(d),
        "signature": signature(d),
        "nullity": nullity(d),
    }


def _random_braids(knots: int, links: int, seed: int):
    """Random braid closures on 2..5 strands with ≤ 10 letters: ``knots`` knots, ``links`` links."""
    rng = random.Random(seed)
    want = {True: knots, False: links}
    while want[True] or want[False]:
        n = rng.randint(2, 5)
        word = [rng.choice([1, -1]) * rng.randint(1, n - 1) for _ in range(rng.randint(1, 10))]
        d = parse("braid:" + ",".join(map(str, word)))
        is_knot = d.n_components == 1
        if want[is_knot]:
            want[is_knot] -= 1
            yield word, d


def test_every_check_passes_on_random_braid_closures():
    # 200 knots and 100 links (split or not, with kinks): the relations of SOURCES.md hold
    seen = set()
    for word, d in _random_braids(200, 100, seed=2026):
        result = run_checks(d, computed(d))
        assert all(result.values()), (word, {k: v for k, v in result.items() if not v})
        seen.update(result)
    assert seen == set(CHECK_NAMES)  # every check was exercised


FAMILY = ([f"torus:{p},{q}" for p in (2, 3, 4, 5) for q in range(2, 8) if p * q - q <= 20]
          + [f"pretzel:{a},{b},{c}" for a in (-3, 2, 3) for b in (-2, 3, 5) for c in (1, 3, -4, 5)]
          + [f"rational:{a}/{b}" for a in (7, 12, 17, 29, 41, 55) for b in range(1, a, 3) if gcd(a, b) == 1]
          + ["montesinos:1/3,2/5,-1/2", "pretzel:2,3,3,5", "pretzel:3,0,3", "pretzel:3,3,-3"])


@pytest.mark.parametrize("notation", FAMILY)
def test_every_check_passes_on_family_members(notation):
    d = parse(notation)
    result = run_checks(d, computed(d))
    assert all(result.values()), {k: v for k, v in result.items() if not v}


# ---------------------------------------------------------------- checks can fail
CORRUPTIONS = [
    # (what is changed, how, checks that must now fail)
    ("determinant", lambda v: v + 2, {"alexander_det", "jones_det", "goeritz_det", "determinant_product"}),
    ("determinant", lambda v: v + 1, {"determinant_odd"}),
    ("signature", lambda v: v + 2, {"signature_mod_four", "jones_signed_det", "alexander_signed_det"}),
    ("signature", lambda v: v + 1, {"signature_parity"}),
    ("jones", lambda v: v.shift(2), {"jones_derivative", "jones_signed_det"}),  # times t
    ("jones", lambda v: v + L((20, 1), (21, -2), (22, 1)), {"jones_span_bound", "jones_span_alternating"}),
    ("jones", lambda v: v + L((0, 1), (1, -2), (2, 1)), {"jones_second_derivative"}),  # + (1-t)^2
    ("jones", lambda v: v.shift(1), {"jones_exponent_parity"}),
    ("jones", lambda v: v + L((0, 1)), {"jones_at_one", "jones_at_cube_root"}),
    ("alexander", lambda v: v + L((0, 2)), {"alexander_at_one", "conway_alexander_agree"}),
    ("alexander", lambda v: v.shift(2), {"alexander_symmetric"}),
    ("conway", lambda v: v + Laurent({0: 1}), {"conway_at_zero"}),
    ("invariant_factors", lambda v: v + [3], {"jones_at_sixth_root"}),
    ("nullity", lambda v: v + 2, {"nullity_zero_factors"}),
]


@pytest.mark.parametrize("key,change,must_fail", CORRUPTIONS,
                         ids=[f"{k}-{'-'.join(sorted(m))}" for k, _, m in CORRUPTIONS])
def test_a_corrupted_value_makes_its_checks_fail(key, change, must_fail):
    d = parse("conway:5 2")  # 7_2: alternating, det 11 (Rolfsen table, memory)
    values = computed(d)
    assert all(run_checks(d, values).values())
    bad = dict(values, **{key: change(values[key])})
    result = run_checks(d, bad)
    failed = {k for k, ok in result.items() if not ok}
    assert must_fail <= failed, failed


def test_arf_check_fails_for_wrong_jones_at_i():
    # V(i) = (−1)^Arf (Levine; Murakami): trefoil Arf 1; the unknot's V = 1 has V(i) = 1
    result = run_checks(parse("torus:2,3"), dict(TREFOIL, jones=Laurent({0: 1})))
    assert result["jones_at_i_arf"] is False


# ---------------------------------------------------------------- omission
def test_checks_without_inputs_are_omitted_not_passed():
    d = parse("torus:2,3")
    assert run_checks(d, {}) == {}
    only_jones = run_checks(d, {"jones": TREFOIL["jones"]})
    assert set(only_jones) == {"jones_at_one", "jones_exponent_parity", "jones_at_cube_root",
                               "jones_derivative", "jones_span_bound", "jones_span_alternating"}
    skipped = run_checks(d, dict(TREFOIL, jones=None))
    assert not any(k.startswith("jones") for k in skipped)


def test_knot_only_checks_are_omitted_for_links():
    result = run_checks(parse("torus:2,2"), HOPF)
    for name in ("determinant_odd", "alexander_at_one", "signature_mod_four", "jones_at_i_arf",
                 "jones_second_derivative", "signature_alexander_span"):
        assert name not in result


# ---------------------------------------------------------------- exact evaluation
def test_evaluation_at_roots_of_unity_is_exact():
    # Hopf at t^½ = i: −i − i⁵ = −2i
    assert list(evaluate_at_root(HOPF["jones"], 4, 1).coeffs()) == [0, -2]
    # trefoil at t = e^{2πi/3}: 1 (Jones 1985)
    assert evaluate_at_root(TREFOIL["jones"], 3, 2) == 1
    # |V(e^{iπ/3})|² = 3 for the trefoil (Lickorish–Millett 1986): one factor 3
    w, wbar = evaluate_at_root(TREFOIL["jones"], 12, 1), evaluate_at_root(TREFOIL["jones"], 12, 11)
    import flint
    assert (w * wbar) % flint.fmpz_poly.cyclotomic(12) == 9 // 3
