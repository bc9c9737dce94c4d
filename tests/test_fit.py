"""knotledger fit: exact polynomial fitting rediscovers published determinant formulas."""

from __future__ import annotations

import itertools
import random
from pathlib import Path

import pytest
import sympy

from _census_fixture import shared_census
from pipeline.cli import main as cli
from pipeline.explore.fit import fit_family, fit_polynomial


@pytest.fixture(scope="module")
def census(tmp_path_factory) -> Path:
    return shared_census(tmp_path_factory)


def _sym(text: str):
    return sympy.sympify(text)


def test_fit_recovers_two_bridge_determinant_alpha(census):
    # det b(alpha, beta) = alpha -- H. Schubert, Math. Z. 65 (1956)
    names, (c,), skipped = fit_family(census, "two_bridge", "determinant")
    assert names == ["alpha", "beta"] and skipped == 0
    assert c.exact and not c.squared and sympy.expand(c.fit.expr() - _sym("alpha")) == 0
    assert c.fit.points > c.fit.unknowns  # verified beyond the defining points


def test_fit_recovers_pretzel_determinant_as_absolute_value(census):
    # det P(p1,p2,p3) = |p1p2 + p2p3 + p1p3| *(memory: Kawauchi, survey monograph, 1996)*
    names, (c,), _ = fit_family(census, "pretzel", "determinant")
    assert names == ["p1", "p2", "p3"]
    assert c.exact and c.squared and c.root is not None
    q = _sym("p1*p2 + p2*p3 + p1*p3")
    assert sympy.expand(c.root - q) == 0 or sympy.expand(c.root + q) == 0
    assert c.formula("determinant") == "determinant = |p1*p2 + p1*p3 + p2*p3|"


def test_fit_recovers_torus_knot_determinant_rule_per_parity_class(census):
    # det T(p,q) (gcd 1) = q if p even, p if q even, 1 if both odd -- Rolfsen, Knots and Links, ch. 7
    names, classes, _ = fit_family(census, "torus", "determinant", by_parity=True, where="gcd(p, q) == 1")
    found = {c.label: c for c in classes}
    assert set(found) == {"p even, q odd", "p odd, q even", "p odd, q odd"}  # both even: never coprime
    assert all(c.exact for c in classes)
    assert sympy.expand(found["p even, q odd"].fit.expr() - _sym("q")) == 0
    assert sympy.expand(found["p odd, q even"].fit.expr() - _sym("p")) == 0
    assert found["p odd, q odd"].fit.expr() == 1


def test_torus_rule_without_filter_lists_the_torus_links_as_failing(census):
    # The rule is for knots; the non-coprime T(p,q) are links and must show up as failing rows.
    _, classes, _ = fit_family(census, "torus", "determinant", by_parity=True)
    odd_odd = next(c for c in classes if c.label == "p odd, q odd")
    assert odd_odd.fit.expr() == 1 and not odd_odd.exact
    from math import gcd
    for info in odd_odd.failing:
        assert gcd(info["params"]["p"], info["params"]["q"]) > 1


def test_torus_determinant_is_not_a_polynomial_without_parity_classes(census, capsys):
    rc = cli(["fit", str(census), "--family", "torus", "--target", "determinant",
              "--where", "gcd(p, q) == 1", "--max-degree", "2"])
    out = capsys.readouterr().out
    assert rc == 1 and "NOT exact" in out and "failing rows" in out


def test_fit_command_prints_formula_support_and_failing_rows(census, capsys):
    rc = cli(["fit", str(census), "--family", "two_bridge", "--target", "determinant"])
    out = capsys.readouterr().out
    assert rc == 0 and "exact: determinant = alpha" in out and "failing rows: none" in out


# ---------------------------------------------------------- the fitter on synthetic data
@pytest.mark.parametrize("formula", ["3*x - 2*y + 7", "x**2*y - x*y + 1", "x*y*(x + y)/2", "5"])
def test_fit_polynomial_recovers_random_polynomials(formula):
    x, y = sympy.symbols("x y")
    f = sympy.sympify(formula)
    pts = list(itertools.product(range(-4, 5), range(-3, 6)))
    vals = [int(f.subs({x: a, y: b})) for a, b in pts]
    fit = fit_polynomial(pts, vals, ["x", "y"], max_degree=3)
    assert fit.exact and sympy.expand(fit.expr() - f) == 0


def test_fit_polynomial_reports_planted_outliers():
    rng = random.Random(3)
    pts = [(a, b) for a in range(1, 9) for b in range(1, 9)]
    vals = [a * b + 1 for a, b in pts]
    bad = sorted(rng.sample(range(len(pts)), 3))
    for i in bad:
        vals[i] += 5
    fit = fit_polynomial(pts, vals, ["a", "b"], max_degree=2)
    assert not fit.exact and sorted(fit.failing) == bad
    assert sympy.expand(fit.expr() - _sym("a*b + 1")) == 0


def test_fit_is_not_claimed_exact_when_underdetermined():
    # 3 points, a degree-2 polynomial in one variable has 3 unknowns: interpolation, not evidence
    fit = fit_polynomial([(1,), (2,), (3,)], [1, 8, 27], ["n"], max_degree=2)
    assert not fit.exact


def test_fit_by_sign_finds_pretzel_crossings_as_sum_of_absolute_values(census):
    # the standard pretzel diagram has |p1| + |p2| + |p3| crossings (common practice)
    names, classes, _ = fit_family(census, "pretzel", "crossings", by_sign=True)
    assert len(classes) == 8 and all(c.exact for c in classes)
    p = sympy.symbols("p1 p2 p3")
    for c in classes:
        signs = [1 if f"{n} > 0" in c.label else -1 for n in names]
        assert sympy.expand(c.fit.expr() - sum(s * x for s, x in zip(signs, p))) == 0, c.label


def test_fit_torus_crossings_is_the_braid_length(census):
    # T(p,q) as the closure of (s1...s_{p-1})^q has (p-1)q crossings (README.md torus notation)
    _, (c,), _ = fit_family(census, "torus", "crossings")
    assert c.exact and sympy.expand(c.fit.expr() - _sym("(p - 1)*q")) == 0
