"""Tests of the Seifert matrix of braid closures and the Tristram–Levine signature function.

Checked against:
* the stored signature (Gordon–Litherland, pipeline.invariants.signature): σ_(−1) = σ on
  torus knots and links and on random braids;
* Brieskorn's count for σ(T(p,q)) (E. Brieskorn, Invent. Math. 2, 1966) and Litherland's
  formula for the whole function: for ω = e^(2πiξ), 0 < ξ < 1 off the jumps,
  σ_ω(T(p,q)) = #{x ∉ [ξ, ξ+1]} − #{ξ < x < ξ + 1} over x = i/p + j/q, 1 ≤ i < p,
  1 ≤ j < q (R. A. Litherland, "Signatures of iterated torus knots", LNM 722, 1979)
  *(memory; at ξ = 1/2 it is Brieskorn's count)*;
* the Alexander polynomial (Fox calculus, pipeline.invariants.alexander): the Seifert matrix
  gives the Conway-normalised Δ, and every jump point is a root of Δ on the circle;
* a slow route: the signature of the Hermitian matrix (1 − ω)V + (1 − ω̄)Vᵀ at rational
  points of the circle by Descartes' rule on its sympy characteristic polynomial (real-rooted);
* Seifert's algorithm on any diagram (signature_function): σ_(−1) = σ on families and random
  diagrams, the same function as the braid route on braid/torus rows;
* relations: mirror negates σ_ω; σ near ω = 1 is 0 for knots; jumps of a knot are at most 2·multiplicity.
"""

from __future__ import annotations

from fractions import Fraction
from math import gcd

import pytest
import sympy
from hypothesis import HealthCheck, example, given, settings
from hypothesis import strategies as st

from _moves import complicate
from pipeline.diagrams.families import braid, torus
from pipeline.diagrams.notation import parse
from pipeline.invariants.alexander import alexander_polynomial
from pipeline.invariants.seifert import (SeifertSurfaceError, braid_seifert_matrix, seifert_alexander,
                                         seifert_matrix_of_notation)
from pipeline.invariants.signature import signature
from pipeline.invariants.tristram_levine import signature_function, tristram_levine, tristram_levine_at


def litherland(p: int, q: int, xi: Fraction) -> int:
    """σ_(e^(2πiξ)) of the positive torus knot T(p,q) by Litherland's count (module docstring)."""
    out = 0
    for i in range(1, p):
        for j in range(1, q):
            x = Fraction(i, p) + Fraction(j, q)
            if xi < x < xi + 1:
                out -= 1
            elif x < xi or x > xi + 1:
                out += 1
    return out


def slow_hermitian_signature(V, s: Fraction) -> int:
    """Signature of (1 − ω)V + (1 − ω̄)Vᵀ at ω = ((1 − s²) + 2si)/(1 + s²), by Descartes' rule."""
    m = len(V)
    if m == 0:
        return 0
    w = (1 - sympy.Rational(s) ** 2 + 2 * sympy.Rational(s) * sympy.I) / (1 + sympy.Rational(s) ** 2)
    Vm = sympy.Matrix(V)
    H = (1 - w) * Vm + (1 - sympy.conjugate(w)) * Vm.T
    lam = sympy.Symbol("lam")
    cp = sympy.Poly(sympy.expand(H.charpoly(lam).as_expr()), lam).all_coeffs()
    cp = [sympy.nsimplify(sympy.expand(c)) for c in cp]
    assert all(sympy.im(c) == 0 for c in cp)
    cp = [sympy.re(c) for c in cp]

    def changes(c):
        c = [v for v in c if v != 0]
        return sum(1 for a, b in zip(c, c[1:]) if a * b < 0)

    n = len(cp) - 1
    return changes(cp) - changes([c * (-1) ** (n - k) for k, c in enumerate(cp)])


def x_polynomial_of_alexander(delta) -> sympy.Poly:
    """A knot's symmetric Δ(t) = c_0 + Σ c_k (t^k + t^−k) written in x = t + 1/t."""
    x = sympy.Symbol("x")
    coeffs = {k // 2: c for k, c in delta.terms}
    # t^k + t^−k = T_k in x: T_0 = 2, T_1 = x, T_(k+1) = x T_k − T_(k−1)
    T = [sympy.Integer(2), x]
    top = max(coeffs)
    while len(T) <= top:
        T.append(sympy.expand(x * T[-1] - T[-2]))
    expr = coeffs.get(0, 0) + sum(coeffs.get(k, 0) * T[k] for k in range(1, top + 1))
    return sympy.Poly(expr, x)


TORUS = [(p, q) for q in range(3, 10) for p in range(2, min(q, 6)) if gcd(p, q) == 1]


@pytest.mark.parametrize("p,q", TORUS, ids=[f"T({p},{q})" for p, q in TORUS])
def test_torus_knots_match_litherland_and_brieskorn(p, q):
    V = braid_seifert_matrix(torus.word(p, q))
    f = tristram_levine(V)
    assert f.at_minus_one == signature(torus.diagram(p, q)) == litherland(p, q, Fraction(1, 2))
    # every jump of a torus knot is at a root of unity: ξ = i/p + j/q mod 1
    angles = [j.angle for j in f.jumps]
    assert None not in angles and angles == sorted(angles)
    expected = sorted({(Fraction(i, p) + Fraction(j, q)) % 1 for i in range(1, p) for j in range(1, q)}
                      - {Fraction(0)})
    assert angles == [a for a in expected if a < Fraction(1, 2)]
    bounds = [Fraction(0)] + angles + [Fraction(1, 2)]
    for k, v in enumerate(f.values):
        assert v == litherland(p, q, (bounds[k] + bounds[k + 1]) / 2)
    # mirror image: T(−p, q) negates the function
    g = tristram_levine(braid_seifert_matrix(torus.word(-p, q)))
    assert g.values == tuple(-v for v in f.values) and g.at_minus_one == -f.at_minus_one


def test_trefoil_jump_at_a_sixth_of_a_turn():
    # the roots of Δ = t − 1 + t⁻¹ are e^(±iπ/3): x = 1, factor x − 1
    f = tristram_levine(braid_seifert_matrix([1, 1, 1]))
    (j,) = f.jumps
    assert j.factor == (-1, 1) and j.interval == (1, 1) and j.angle == Fraction(1, 6)
    assert f.values == (0, -2) and f.to_json()["jumps"][0]["angle"] == "1/6"


def test_disconnected_surface_is_refused():
    with pytest.raises(SeifertSurfaceError):
        braid_seifert_matrix([1, 1, 3, 3])
    assert seifert_matrix_of_notation("braid:1,1,3,3") is None
    assert seifert_matrix_of_notation("pretzel:3,3,3") is None
    assert seifert_matrix_of_notation("torus:9,2") == braid_seifert_matrix(torus.word(2, 9))


words = st.integers(2, 4).flatmap(lambda n: st.lists(
    st.integers(1, n - 1).flatmap(lambda g: st.sampled_from([g, -g])), min_size=n - 1, max_size=9
).filter(lambda w: {abs(g) for g in w} == set(range(1, n))))
SETTINGS = settings(max_examples=50, deadline=None, suppress_health_check=[HealthCheck.too_slow])


@SETTINGS
@given(words)
@example([1, 1])
@example([1, -1])
@example([1, -2, 1, -2])
@example([1, 1, 2, -1, 2, 2])
def test_seifert_matrix_gives_alexander_and_signature(word):
    d = braid.diagram(word)
    V = braid_seifert_matrix(word)
    assert seifert_alexander(V) == alexander_polynomial(d)
    assert tristram_levine_at(V, None) == signature(d)


@SETTINGS
@given(words)
@example([1, -1, 1, -1])
def test_signature_function_at_minus_one_and_jumps(word):
    d = braid.diagram(word)
    V = braid_seifert_matrix(word)
    f = tristram_levine(V)
    assert f.at_minus_one == signature(d)
    if d.n_components == 1:
        assert f.values[0] == 0  # near ω = 1 for a knot (H(ω) -> 0 with V − Vᵀ unimodular)
    mirror = tristram_levine(braid_seifert_matrix([-g for g in word]))
    assert mirror.values == tuple(-v for v in f.values)
    if d.n_components == 1:
        px = x_polynomial_of_alexander(alexander_polynomial(d))
        x = sympy.Symbol("x")
        for j, (a, b) in zip(f.jumps, zip(f.values, f.values[1:])):
            fac = sympy.Poly(list(reversed(j.factor)), x)
            assert px.rem(fac).is_zero
            assert abs(a - b) <= 2 * j.multiplicity


@settings(max_examples=25, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(words, st.fractions(min_value=Fraction(1, 12), max_value=20, max_denominator=12))
def test_exact_hermitian_signature_matches_descartes(word, s):
    V = braid_seifert_matrix(word)
    assert tristram_levine_at(V, s) == slow_hermitian_signature(V, s)


# ------------------------------------------------ signature_function on any row (Seifert's algorithm)
BRIESKORN = {(2, 3): -2, (3, 4): -6, (3, 5): -8, (3, 7): -8}   # /shared REFERENCES.md (Brieskorn 1966)


@pytest.mark.parametrize("p,q", sorted(BRIESKORN), ids=[f"T({p},{q})" for p, q in sorted(BRIESKORN)])
def test_general_route_on_torus_knots_matches_brieskorn_and_litherland(p, q):
    d = torus.diagram(p, q)
    f = signature_function(d)                         # Seifert's algorithm on the diagram
    g = signature_function(d, notation=f"torus:{p},{q}")   # the braid route
    assert f.at_minus_one == BRIESKORN[(p, q)] == litherland(p, q, Fraction(1, 2)) == signature(d)
    assert f == g
    angles = [Fraction(0)] + [j.angle for j in f.jumps] + [Fraction(1, 2)]
    assert [litherland(p, q, (a + b) / 2) for a, b in zip(angles, angles[1:])] == list(f.values)


ROWS = ["pretzel:3,3,3", "pretzel:-2,3,7", "pretzel:2,3,-4", "pretzel:2,2,2", "pretzel:-3,5,5",
        "rational:7/3", "rational:13/5", "rational:8/3", "conway:2 2", "conway:3 1 2",
        "montesinos:1/3,2/5,-1/2", "torus:2,4", "braid:1,1,3,3", "pd:[[1,5,2,4],[3,1,4,6],[5,3,6,2]] loops=1"]


@pytest.mark.parametrize("text", ROWS)
def test_signature_function_at_minus_one_is_the_signature_on_families(text):
    d = parse(text)
    f = signature_function(d, notation=text)
    assert f.at_minus_one == signature(d)
    assert signature_function(d.mirror()).at_minus_one == -f.at_minus_one
    if d.n_components == 1:
        assert f.values[0] == 0


@SETTINGS
@given(st.integers(2, 4).flatmap(lambda n: st.tuples(st.just(n), st.lists(
    st.integers(1, n - 1).flatmap(lambda g: st.sampled_from([g, -g])), min_size=1, max_size=7))),
    st.integers(0, 4), st.integers(0, 10 ** 6))
def test_signature_function_on_random_small_diagrams(nw, moves, seed):
    n, word = nw
    d = complicate(braid.diagram(word, strands=n), moves, seed)
    f = signature_function(d)
    assert f.at_minus_one == signature(d)
    text = "braid:" + ",".join(map(str, word))
    if {abs(g) for g in word} == set(range(1, n)) and moves == 0:
        assert signature_function(d, notation=text) == f   # braid route, same function
