"""Alexander and Conway polynomials, checked against published values, relations with
other invariants, and a slow independent route (reduced Burau matrices in sympy)."""

from __future__ import annotations

from math import gcd

import pytest
import sympy
from flint import fmpz_poly
from hypothesis import HealthCheck, assume, example, given, settings
from hypothesis import strategies as st

from pipeline import parse
from pipeline.diagrams.diagram import Diagram
from pipeline.errors import KnotLedgerError
from pipeline.diagrams.families import braid
from pipeline.invariants.alexander.fox import (alexander_polynomial, conway_from_alexander,
                                           conway_polynomial, crossing_change, smoothing)
from pipeline.invariants.poly import Laurent

ONE = Laurent({0: 1})


def z_poly(*coeffs: int) -> Laurent:
    """c0 + c1 z + c2 z² + … as a Laurent in z (doubled exponents 2k)."""
    return Laurent({2 * k: c for k, c in enumerate(coeffs) if c})


def centred(coeffs: list[int]) -> Laurent:
    """±t^k·Σ c_j t^j centred at exponent 0 (the Conway symmetric position)."""
    while coeffs and coeffs[0] == 0:
        coeffs = coeffs[1:]
    while coeffs and coeffs[-1] == 0:
        coeffs = coeffs[:-1]
    d = len(coeffs) - 1
    return Laurent({2 * j - d: c for j, c in enumerate(coeffs) if c})


def knot_normal(coeffs: list[int]) -> Laurent:
    """Normalise a knot's Alexander polynomial given up to ±t^k: symmetric, Δ(1) = 1."""
    p = centred(coeffs)
    return p if p.at_one() == 1 else -p


def at_minus_one(p: Laurent) -> tuple[int, int]:
    """Δ(−1) with t^½ = i, as the exact Gaussian integer (re, im); im = 0 for knots."""
    re = im = 0
    for k, c in p.terms:
        r = k % 4                      # i^k
        re += c * (1 if r == 0 else -1 if r == 2 else 0)
        im += c * (1 if r == 1 else -1 if r == 3 else 0)
    return re, im


def norm(g: tuple[int, int]) -> int:
    return g[0] ** 2 + g[1] ** 2


def z_to_minus_z(p: Laurent) -> Laurent:
    return Laurent({k: c * (-1) ** (k // 2) for k, c in p.terms})


# ----------------------------------------------------------------- named values

NAMED = {
    # README.md normalisation; SOURCES.md (Rolfsen, Knots and Links, table *(memory)*)
    "torus:2,3": Laurent({-2: 1, 0: -1, 2: 1}),              # trefoil t − 1 + t⁻¹
    "torus:-2,3": Laurent({-2: 1, 0: -1, 2: 1}),             # its mirror, same Δ
    "conway:2 2": Laurent({-2: -1, 0: 3, 2: -1}),            # figure-eight −t + 3 − t⁻¹
    "torus:2,5": Laurent({-4: 1, -2: -1, 0: 1, 2: -1, 4: 1}),  # 5_1
    "conway:3 2": Laurent({-2: 2, 0: -3, 2: 2}),             # 5_2: 2t − 3 + 2t⁻¹
    "conway:4 2": Laurent({-2: -2, 0: 5, 2: -2}),            # 6_1 (stevedore): −2t + 5 − 2t⁻¹
    "pd:[] loops=1": ONE,                                    # unknot, 0 crossings
    "braid:1": ONE,                                          # unknot with one kink
    "braid:1,2,-3": ONE,                                     # unknot, three kinks
    "braid:1,-1": Laurent(),                                 # unlink drawn with 2 crossings
    "pd:[] loops=2": Laurent(),                              # unlink, 0 crossings
}


@pytest.mark.parametrize("text", sorted(NAMED))
def test_alexander_of_named_diagrams(text):
    assert alexander_polynomial(parse(text)) == NAMED[text]


@pytest.mark.parametrize("text, nabla", [
    ("torus:2,3", z_poly(1, 0, 1)),      # positive trefoil ∇ = 1 + z² (Conway 1970)
    ("conway:2 2", z_poly(1, 0, -1)),    # figure-eight ∇ = 1 − z² (Conway 1970)
    ("torus:2,2", z_poly(0, 1)),         # positive Hopf link ∇ = z (skein, common practice)
    ("torus:-2,2", z_poly(0, -1)),       # negative Hopf link ∇ = −z
    ("braid:1,-2,1,-2,1,-2", z_poly(0, 0, 0, 0, 1)),  # Borromean rings ∇ = z⁴ *(memory, Conway 1970)*
])
def test_conway_of_named_diagrams(text, nabla):
    assert conway_polynomial(parse(text)) == nabla


# ----------------------------------------------------------------- closed formulas

def torus_formula(p: int, q: int) -> Laurent:
    # Δ = (t^{pq} − 1)(t − 1) / ((t^p − 1)(t^q − 1)), normalised
    # (Rolfsen, Knots and Links, ch. 7; Burde–Zieschang, Knots, ch. 9)
    tp = lambda n: fmpz_poly([-1] + [0] * (n - 1) + [1])
    num, den = tp(p * q) * tp(1), tp(p) * tp(q)
    quo = num // den
    assert quo * den == num
    return knot_normal([int(c) for c in quo.coeffs()])


COPRIME = [(p, q) for p in range(2, 12) for q in range(p + 1, 12) if gcd(p, q) == 1]


@pytest.mark.parametrize("p, q", COPRIME)
def test_torus_knot_alexander_matches_formula(p, q):
    expected = torus_formula(p, q)
    assert alexander_polynomial(parse(f"torus:{p},{q}")) == expected
    assert alexander_polynomial(parse(f"torus:{q},{p}")) == expected     # T(p,q) = T(q,p)
    if (p - 1) * q <= 40:
        assert alexander_polynomial(parse(f"torus:-{p},{q}")) == expected  # mirror


@pytest.mark.parametrize("n", range(1, 13))
def test_conway_of_torus_two_n_follows_skein(n):
    # ∇(T(2,n)) = ∇(T(2,n−2)) + z∇(T(2,n−1)), ∇(T(2,0)) = 0 (unlink), ∇(T(2,1)) = 1:
    # the skein relation ∇(L+) − ∇(L−) = z∇(L0) at one crossing (Conway 1970)
    seq = [Laurent(), ONE]
    for k in range(2, n + 1):
        seq.append(seq[k - 2] + z_poly(0, 1) * seq[k - 1])
    assert conway_polynomial(parse(f"braid:{','.join(['1'] * n)}")) == seq[n]
    assert conway_polynomial(parse(f"torus:-2,{n}")) == z_to_minus_z(seq[n])


ALPHA_BETA = [(a, b) for a in range(2, 41) for b in range(1, a) if gcd(a, b) == 1]


@pytest.mark.parametrize("alpha", range(2, 41))
def test_two_bridge_alexander_at_minus_one_is_alpha(alpha):
    # |Δ(−1)| = det b(α,β) = α (Schubert, Math. Z. 65 (1956); SOURCES.md item 1)
    for a, b in ALPHA_BETA:
        if a != alpha:
            continue
        d = parse(f"rational:{a}/{b}")
        delta = alexander_polynomial(d)
        assert norm(at_minus_one(delta)) == a * a, (a, b)
        if a % 2:                                   # knots: Δ(1) = 1, symmetric
            assert delta.at_one() == 1 and delta.is_symmetric()
        else:                                       # links: Δ(1/t) = −Δ(t), z-odd ∇
            assert delta.invert() == -delta


CONWAY_TABLE = {  # knot: (Conway notation, det) — Rolfsen, Knots and Links, table *(memory)*
    "3_1": ("3", 3), "4_1": ("2 2", 5), "5_1": ("5", 5), "5_2": ("3 2", 7),
    "6_1": ("4 2", 9), "6_2": ("3 1 2", 11), "6_3": ("2 1 1 2", 13), "7_1": ("7", 7),
    "7_2": ("5 2", 11), "7_3": ("4 3", 13), "7_4": ("3 1 3", 15), "7_5": ("3 2 2", 17),
    "7_6": ("2 2 1 2", 19), "7_7": ("2 1 1 1 2", 21),
}


@pytest.mark.parametrize("name", sorted(CONWAY_TABLE))
def test_conway_table_determinants(name):
    notation, det = CONWAY_TABLE[name]
    delta = alexander_polynomial(parse(f"conway:{notation}"))
    assert norm(at_minus_one(delta)) == det * det
    assert delta.at_one() == 1 and delta.is_symmetric()


@pytest.mark.parametrize("text, det", [
    ("torus:3,4", 3), ("torus:3,5", 1),        # 8_19 det 3, 10_124 det 1 (SOURCES.md *(memory)*)
    ("pretzel:-2,3,3", 3), ("pretzel:-2,3,5", 1),   # = T(3,4), T(3,5) (SOURCES.md item 5)
])
def test_more_table_determinants(text, det):
    assert norm(at_minus_one(alexander_polynomial(parse(text)))) == det * det


def test_pretzel_coincidences_with_torus_knots():
    # P(−2,3,3) = T(3,4), P(−2,3,5) = T(3,5), P(p,q) = T(2,p+q) (SOURCES.md item 5)
    A = lambda s: alexander_polynomial(parse(s))
    assert A("pretzel:-2,3,3") == A("torus:3,4")
    assert A("pretzel:-2,3,5") == A("torus:3,5")
    assert A("pretzel:3,4") == A("torus:2,7")
    assert conway_polynomial(parse("pretzel:3,3")) == conway_polynomial(parse("torus:2,6"))


# ----------------------------------------------------------------- relations

@pytest.mark.parametrize("text", ["pretzel:3,5,7", "pretzel:-3,5,7,2", "pretzel:2,3,5,3",
                                  "montesinos:1/3,2/5,-1/2", "torus:5,7", "conway:3 1 1 3",
                                  "braid:1,2,3,-1,2,-3,2"])
def test_knot_alexander_is_symmetric_with_value_one_at_one(text):
    # Δ(t) = Δ(1/t), Δ(1) = 1 for every knot (Conway normalisation; Alexander 1928)
    d = parse(text)
    assert d.n_components == 1
    delta = alexander_polynomial(d)
    assert delta.is_symmetric() and delta.at_one() == 1


@pytest.mark.parametrize("text", ["torus:3,4", "pretzel:2,3,5,3", "conway:3 1 2",
                                  "torus:2,4", "rational:8/3", "torus:3,3", "pretzel:2,2,2",
                                  "braid:1,-2,1,-2,1,-2", "pretzel:2,-4,3"])
def test_mirror_sends_z_to_minus_z(text):
    # ∇(mirror L)(z) = ∇(L)(−z); for knots Δ(mirror) = Δ (common practice; SOURCES.md)
    d = parse(text)
    assert conway_polynomial(d.mirror()) == z_to_minus_z(conway_polynomial(d))
    if d.n_components == 1:
        assert alexander_polynomial(d.mirror()) == alexander_polynomial(d)


def linking_number(d: Diagram) -> int:
    comp = d.component_of_label
    return sum(s for x, s in zip(d.pd, d.signs) if comp[x[0]] != comp[x[1]]) // 2


@pytest.mark.parametrize("alpha", range(2, 31, 2))
def test_first_conway_coefficient_of_two_component_link_is_linking_number(alpha):
    # a₁(L) = lk(K1, K2) for a 2-component link *(common practice; J. Hoste, "The first
    # coefficient of the Conway polynomial", Proc. AMS 95 (1985))*
    for beta in range(1, alpha):
        if gcd(alpha, beta) == 1:
            d = parse(f"rational:{alpha}/{beta}")
            nabla = dict(conway_polynomial(d).terms)
            assert nabla.get(2, 0) == linking_number(d)
            assert all(k % 4 == 2 for k in nabla)        # only odd powers of z


def test_determinant_matches_colouring_route():
    # |Δ(−1)| = det = product of the invariant factors (SOURCES.md "Relations")
    coloring = pytest.importorskip("pipeline.invariants.coloring.spectrum")
    for text in ["pretzel:3,3,-3", "pretzel:2,4,6", "torus:3,6", "torus:4,6", "rational:24/7",
                 "pretzel:5,-3,7,2", "braid:1,1,-2,1,3,-2,3", "montesinos:2/5,1/3,-3/7"]:
        d = parse(text)
        assert norm(at_minus_one(alexander_polynomial(d))) == coloring.determinant(d) ** 2, text


def test_split_links_have_zero_polynomial():
    # a split link bounds a disconnected Seifert surface: Δ = ∇ = 0 (common practice)
    trefoil = [[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]]
    two = Diagram.from_pd(trefoil + [[v + 6 for v in x] for x in trefoil])
    assert len(two.pieces) == 2
    for d in (two, parse("pd:[[1,5,2,4],[3,1,4,6],[5,3,6,2]] loops=1"), parse("braid:1,-1,2,-2"),
              parse("pretzel:3,0,0")):
        assert d.n_components > 1
        assert alexander_polynomial(d) == Laurent() and conway_polynomial(d) == Laurent()


def test_relabelled_diagram_has_same_polynomials():
    d = parse("pretzel:2,-3,5,3")
    assert alexander_polynomial(d.relabel()) == alexander_polynomial(d)
    assert conway_polynomial(parse("torus:3,3").relabel()) == conway_polynomial(parse("torus:3,3"))


def test_conway_from_alexander_rejects_a_polynomial_without_the_symmetry():
    with pytest.raises(KnotLedgerError, match="Conway-symmetric"):
        conway_from_alexander(Laurent({0: 1, 2: 1}))


# ----------------------------------------------------------------- slow routes

def burau_route(word: list[int], strands: int) -> list[int]:
    """det(I − ψ(β))·(1 − t)/(1 − t^s) with the reduced Burau representation ψ, in sympy.

    Reduced Burau matrices as in C. Kassel, V. Turaev, *Braid Groups* (2008), §3.3;
    the formula is Burau's (W. Burau, Abh. Math. Sem. Hamburg 11 (1936)).
    """
    t = sympy.Symbol("t")
    m = strands - 1

    def gen(i: int) -> sympy.Matrix:           # σ_i, 1 ≤ i ≤ m
        g = sympy.eye(m)
        k = i - 1
        g[k, k] = -t
        if k > 0:
            g[k, k - 1] = t
        if k < m - 1:
            g[k, k + 1] = 1
        return g

    b = sympy.eye(m)
    for g in word:
        mat = gen(abs(g))
        b = b * (mat if g > 0 else mat.inv())
    expr = sympy.cancel((sympy.eye(m) - b).det() * (1 - t) / (1 - t ** strands))
    num, den = sympy.fraction(sympy.together(expr))
    num, den = sympy.Poly(num, t), sympy.Poly(den, t)
    assert len(den.terms()) == 1            # a unit ±t^k
    return [int(c) for c in reversed(num.all_coeffs())]


def braid_words(max_len: int = 12):
    return st.integers(2, 5).flatmap(lambda s: st.tuples(
        st.just(s), st.lists(st.integers(1, s - 1).flatmap(lambda i: st.sampled_from([i, -i])),
                             min_size=1, max_size=max_len)))


def closure_components(word, strands) -> int:
    perm = list(range(strands))
    for g in word:
        i = abs(g) - 1
        perm[i], perm[i + 1] = perm[i + 1], perm[i]
    seen, cycles = set(), 0
    for s in range(strands):
        if s not in seen:
            cycles += 1
            while s not in seen:
                seen.add(s)
                s = perm[s]
    return cycles


@settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.filter_too_much])
@given(braid_words())
@example((3, [1, -2, 1, -2]))      # figure-eight
@example((2, [1, 1, 1]))           # trefoil
def test_random_braid_closures_agree_with_burau_route(sw):
    strands, word = sw
    d = braid.diagram(word, strands=strands)
    delta = alexander_polynomial(d)
    slow = burau_route(word, strands)
    if d.n_components == 1:
        assert delta == knot_normal(slow)
    else:                                    # links: equal up to sign
        assert delta in (centred(slow), -centred(slow))


@settings(max_examples=30, deadline=None, suppress_health_check=[HealthCheck.filter_too_much])
@given(braid_words(10), st.integers(0, 100))
def test_skein_relation_at_any_crossing(sw, pick):
    # ∇(L+) − ∇(L−) = z∇(L0) (Conway 1970) at a crossing chosen at random: for a self-crossing
    # of a knot this checks the signs fixed for the 2-component link L0 independently
    strands, word = sw
    d = braid.diagram(word, strands=strands)
    assume(d.n_crossings > 0)
    i = pick % d.n_crossings
    here = conway_polynomial(d)
    other = conway_polynomial(crossing_change(d, i))
    lower = conway_polynomial(smoothing(d, i))
    plus, minus = (here, other) if d.signs[i] > 0 else (other, here)
    assert plus - minus == z_poly(0, 1) * lower


def linking_matrix_minor(d: Diagram) -> int:
    """det of the linking Laplacian with the last row and column deleted (sympy)."""
    comp = d.component_of_label
    mu = len(d.components)
    lk = [[0] * mu for _ in range(mu)]
    for x, s in zip(d.pd, d.signs):
        i, j = comp[x[0]], comp[x[1]]
        if i != j:
            lk[i][j] += s
            lk[j][i] += s
    m = sympy.Matrix(mu, mu, lambda i, j: -lk[i][j] // 2 if i != j else 0)
    for i in range(mu):
        m[i, i] = -sum(m[i, j] for j in range(mu) if j != i)
    return int(m[:mu - 1, :mu - 1].det())


@pytest.mark.parametrize("text", ["torus:3,3", "torus:4,4", "torus:5,5", "torus:3,6", "torus:4,6",
                                  "pretzel:2,2,2", "pretzel:2,-4,6", "pretzel:2,2,2,2,2,2",
                                  "pretzel:4,-2,2,6", "braid:1,-2,1,-2,1,-2", "braid:1,1,2,2,-3,-3,2"])
def test_lowest_conway_coefficient_is_the_linking_determinant(text):
    # a_{μ−1}(L) = any (μ−1)-cofactor of the matrix with −lk(i,j) off the diagonal and
    # Σ_j lk(i,j) on it *(memory: J. Hoste, Proc. AMS 95 (1985); F. Hosokawa, Osaka Math.
    # J. 10 (1958))*; T(p,p) gives p^(p−2)
    d = parse(text)
    mu = d.n_components
    nabla = dict(conway_polynomial(d).terms)
    assert all(k >= 2 * (mu - 1) for k in nabla)
    assert nabla.get(2 * (mu - 1), 0) == linking_matrix_minor(d)


@settings(max_examples=25, deadline=None, suppress_health_check=[HealthCheck.filter_too_much])
@given(braid_words(10))
@example((3, [1, 1, 2, 2]))
def test_signed_alexander_at_minus_one_matches_signature(sw):
    # Δ(−1) = i^(−σ)·det with t^½ = i, from Δ = det(t^½V − t^−½Vᵀ) and σ = sign(V + Vᵀ)
    # (SOURCES.md "Relations", common practice): checks the sign of a link's Δ against the
    # signature computed from a Goeritz matrix (Gordon–Litherland), an unrelated route
    signature = pytest.importorskip("pipeline.invariants.signature")
    coloring = pytest.importorskip("pipeline.invariants.coloring.spectrum")
    strands, word = sw
    d = braid.diagram(word, strands=strands)
    det = coloring.determinant(d)
    assume(det != 0)
    sigma = signature.signature(d)
    value = at_minus_one(alexander_polynomial(d))
    unit = [(1, 0), (0, 1), (-1, 0), (0, -1)][-sigma % 4]   # i^(−σ)
    assert value == (unit[0] * det, unit[1] * det)


@settings(max_examples=30, deadline=None, suppress_health_check=[HealthCheck.filter_too_much])
@given(braid_words(12))
@example((3, [1, 1, 2, 2, 1, -2]))
def test_linking_cofactor_sign_agrees_with_skein_sign(sw):
    # the two ways the sign of a link's Δ is fixed must agree: the lowest Conway coefficient
    # (Hosokawa 1958; Hoste 1985) and the skein relation alone (Conway 1970)
    from pipeline.invariants.alexander.fox import _sign_by_skein, _unsigned_delta
    strands, word = sw
    d = braid.diagram(word, strands=strands)
    assume(d.n_components > 1)
    delta = _unsigned_delta(d)
    assume(bool(delta))
    assert _sign_by_skein(d, delta) == alexander_polynomial(d)
