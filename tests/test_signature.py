"""Tests of pipeline.invariants.signature against outside values and slow routes.

Sources are named beside each check (SOURCES.md).  The slow routes written here:
* Brieskorn's count of the signature of a torus knot;
* a Seifert matrix of a braid closure (Seifert's algorithm on the closed braid:
  one disc per strand, one band per letter), symmetrised, with its signature found by
  Descartes' rule of signs on the sympy characteristic polynomial (exact: the
  characteristic polynomial of a real symmetric matrix has only real roots).
"""

from __future__ import annotations

from fractions import Fraction
from math import gcd

import pytest
import sympy
from hypothesis import example, given, settings
from hypothesis import strategies as st

from pipeline.diagrams.notation import parse
from pipeline.invariants.signature import (
    goeritz_determinant,
    goeritz_matrix,
    nullity,
    signature,
    signature_data,
    symmetric_inertia,
)


# ---------------------------------------------------------------- slow routes
def brieskorn_signature(p: int, q: int) -> int:
    """σ(T(p,q)) for the positive torus knot, by Brieskorn's count.

    E. Brieskorn, Invent. Math. 2 (1966); Gordon–Litherland–Murasugi, Canad. J.
    Math. 33 (1981): σ = #{i/p + j/q ∉ [1/2, 3/2]} − #{1/2 < i/p + j/q < 3/2}.
    """
    half, three_halves = Fraction(1, 2), Fraction(3, 2)
    out = 0
    for i in range(1, p):
        for j in range(1, q):
            x = Fraction(i, p) + Fraction(j, q)
            if x < half or x > three_halves:
                out += 1
            elif half < x < three_halves:
                out -= 1
    return out


def braid_seifert_form(word: list[int]) -> list[list[int]]:
    """V + Vᵀ for the Seifert surface of a braid closure (Seifert's algorithm).

    Discs D_1..D_n (one per strand), a half-twisted band of sign ε for every letter
    σ_i^ε joining D_i and D_{i+1}.  H_1 has one loop per pair of consecutive bands in
    the same column.  Symmetrised linking form: a loop through bands of signs ε1, ε2
    has −(ε1+ε2); two loops sharing a band of sign ε have ε; loops in adjacent
    columns i, i+1 with crossings at positions a<b and c<d have −1 when a<c<b<d,
    +1 when c<a<d<b, else 0 (sign fixed by Brieskorn's count on torus knots and by
    |det| = determinant; the opposite choice is congruent to it).
    Needs every generator 1..n-1 to occur (connected surface).
    """
    cols: dict[int, list[tuple[int, int]]] = {}
    for pos, g in enumerate(word):
        cols.setdefault(abs(g), []).append((pos, 1 if g > 0 else -1))
    loops = [(i, cr[k], cr[k + 1]) for i, cr in sorted(cols.items()) for k in range(len(cr) - 1)]
    n = len(loops)
    q = [[0] * n for _ in range(n)]
    for x, (i, (a, ea), (b, eb)) in enumerate(loops):
        q[x][x] = -(ea + eb)
        for y, (j, (c, _), (d, _)) in enumerate(loops):
            if x == y:
                continue
            if i == j:
                if b == c:
                    q[x][y] = eb
                elif d == a:
                    q[x][y] = ea
            elif j == i + 1:
                v = -1 if a < c < b < d else 1 if c < a < d < b else 0
                q[x][y] = q[y][x] = v
    return q


def descartes_inertia(matrix: list[list[int]]) -> tuple[int, int, int]:
    """(positive, negative, zero) eigenvalue counts by Descartes' rule on charpoly."""
    if not matrix:
        return 0, 0, 0
    x = sympy.Symbol("x")
    cp = [int(c) for c in sympy.Matrix(matrix).charpoly(x).all_coeffs()]
    n = len(cp) - 1

    def changes(c):
        c = [v for v in c if v]
        return sum(1 for a, b in zip(c, c[1:]) if a * b < 0)

    pos = changes(cp)
    neg = changes([c * (-1) ** (n - k) for k, c in enumerate(cp)])
    return pos, neg, n - pos - neg


def braid(word: list[int]):
    return parse("braid:" + ",".join(map(str, word)))


# ---------------------------------------------------------------- published values
TORUS_PAIRS = [(p, q) for q in range(3, 12) for p in range(2, q) if gcd(p, q) == 1]


@pytest.mark.parametrize("p,q", TORUS_PAIRS, ids=[f"T({p},{q})" for p, q in TORUS_PAIRS])
def test_signature_of_torus_knot_is_brieskorn_count(p, q):
    # Brieskorn 1966 / Gordon–Litherland–Murasugi 1981 (SOURCES.md, families 4)
    assert signature(parse(f"torus:{p},{q}")) == brieskorn_signature(p, q)
    assert signature(parse(f"torus:{q},{p}")) == brieskorn_signature(p, q)  # T(p,q) = T(q,p)


@pytest.mark.parametrize("p,q,value", [(2, 3, -2), (3, 4, -6), (3, 5, -8), (3, 7, -8)])
def test_brieskorn_count_matches_the_published_values(p, q, value):
    # SOURCES.md families 4: T(2,3) −2, T(3,4) −6, T(3,5) −8, T(3,7) −8
    assert brieskorn_signature(p, q) == value
    assert signature(parse(f"torus:{p},{q}")) == value


NAMED = {
    "torus:2,3": -2,        # positive trefoil (README.md contract)
    "torus:-2,3": 2,        # its mirror
    "conway:3": -2,         # = torus:2,3 (skeleton pin)
    "conway:2 2": 0,        # figure-eight: amphichiral, σ = 0 (common practice)
    "pretzel:-2,3,3": -6,   # = T(3,4) (SOURCES.md families 5)
    "pretzel:-2,3,5": -8,   # = T(3,5)
    "torus:2,2": -1,        # positive Hopf link (common practice)
    "torus:2,4": -3,        # T(2,4) with parallel strands (common practice)
    "braid:1": 0,           # unknot with one kink
    "braid:-1": 0,
    "braid:1,-2": 0,        # unknot, two kinks
    "braid:1,1,1,3,3,3": -4,  # split union of two positive trefoils: additive
    "braid:2,2,2": -2,      # trefoil plus a free loop
}


@pytest.mark.parametrize("notation,value", NAMED.items())
def test_signature_of_named_diagrams(notation, value):
    assert signature(parse(notation)) == value


@pytest.mark.parametrize("notation,value", [
    ("torus:2,3", 0), ("braid:1,1,1,3,3,3", 1), ("braid:2,2,2", 1),
    ("pretzel:2,-2", 1),    # T(2,0): two-component unlink in a twisted diagram
    ("braid:1,-1", 1),      # two-component unlink (Reidemeister II)
    ("torus:2,2", 0),
])
def test_nullity_counts_split_pieces(notation, value):
    # nullity = b1 of the double branched cover (Gordon–Litherland 1978)
    assert nullity(parse(notation)) == value


# Rolfsen's table by Conway notation (SOURCES.md, *(memory)*)
CONWAY_DETS = {"3": 3, "2 2": 5, "5": 5, "3 2": 7, "4 2": 9, "3 1 2": 11, "2 1 1 2": 13,
               "7": 7, "5 2": 11, "4 3": 13, "3 1 3": 15, "3 2 2": 17, "2 2 1 2": 19,
               "2 1 1 1 2": 21}


@pytest.mark.parametrize("conway,det", CONWAY_DETS.items())
def test_goeritz_determinant_matches_the_conway_table(conway, det):
    # D. Rolfsen, Knots and Links, table *(memory)*; Goeritz 1933: |det G| = det
    d = parse(f"conway:{conway}")
    assert abs(goeritz_determinant(d)) == det
    g = goeritz_matrix(d)
    assert abs(int(sympy.Matrix(g).det()) if g else 1) == det


@pytest.mark.parametrize("alpha", [3, 5, 7, 9, 11, 13, 21, 31, 41])
def test_two_bridge_goeritz_determinant_is_alpha_and_murasugi_mod_four(alpha):
    # Schubert 1956: det b(α,β) = α; Murasugi 1965: σ ≡ 0 (4) iff det ≡ 1 (4)
    for beta in range(1, alpha):
        if gcd(alpha, beta) != 1:
            continue
        d = parse(f"rational:{alpha}/{beta}")
        data = signature_data(d)
        assert abs(data.goeritz_determinant) == alpha
        assert (data.signature % 4 == 0) == (alpha % 4 == 1)
        assert data.signature % 4 in (0, 2)
        assert signature(d.mirror()) == -data.signature


@pytest.mark.parametrize("entries", [(3, 5, 7), (-3, 5, 7), (3, 3, -3), (5, -3, 2), (2, 3, 3, 5)])
def test_pretzel_goeritz_determinant_formula(entries):
    # det P(p1..pk) = |Σ_i Π_{j≠i} p_j| *(memory: Kawauchi, survey monograph)*
    expected = 0
    for i in range(len(entries)):
        prod = 1
        for j, p in enumerate(entries):
            if j != i:
                prod *= p
        expected += prod
    d = parse("pretzel:" + ",".join(map(str, entries)))
    assert abs(goeritz_determinant(d)) == abs(expected)


@pytest.mark.parametrize("notation", ["torus:3,7", "pretzel:3,-5,7", "rational:37/11",
                                      "braid:1,-2,1,-2,3", "torus:2,6", "torus:3,3"])
def test_mirror_negates_signature(notation):
    # common practice: mirror image sends σ to −σ
    d = parse(notation)
    assert signature(d.mirror()) == -signature(d)
    assert nullity(d.mirror()) == nullity(d)


def test_crossingless_unlink():
    # unlink of k components: σ = 0, nullity k − 1 (common practice)
    from pipeline.diagrams.diagram import Diagram
    for k in (1, 2, 3):
        d = Diagram.from_pd([], free_loops=k)
        assert (signature(d), nullity(d)) == (0, k - 1)
        assert goeritz_matrix(d) == [[0] * (k - 1) for _ in range(k - 1)]


def test_signature_does_not_depend_on_labels():
    d = parse("pretzel:3,-5,7")
    assert signature(d.relabel()) == signature(d)


# ---------------------------------------------------------------- slow route: Seifert matrix
words = st.integers(2, 4).flatmap(lambda n: st.lists(
    st.integers(1, n - 1).flatmap(lambda g: st.sampled_from([g, -g])), min_size=n - 1, max_size=9
).filter(lambda w: {abs(g) for g in w} == set(range(1, n))))


@settings(max_examples=60, deadline=None)
@given(words)
@example([1, 1, 1])
@example([1, -2, 1, -2])
@example([1, 2, 1, 2, 1, 2, 1, 2])
def test_signature_matches_braid_seifert_matrix(word):
    # Seifert's algorithm on the closed braid, σ = sign(V + Vᵀ), exact by Descartes
    q = braid_seifert_form(word)
    pos, neg, zero = descartes_inertia(q)
    d = braid(word)
    data = signature_data(d)
    assert data.signature == pos - neg
    assert data.nullity == zero
    det = int(sympy.Matrix(q).det()) if q else 1
    assert abs(data.goeritz_determinant) == abs(det)


@settings(max_examples=60, deadline=None)
@given(words)
def test_both_checkerboard_shadings_give_the_same_signature(word):
    # Gordon–Litherland 1978: σ = sign(G_F) − μ(F) for either checkerboard surface F
    d = braid(word)
    a, b = signature_data(d), signature_data(d, other_shading=True)
    assert (a.signature, a.nullity, abs(a.goeritz_determinant)) == \
        (b.signature, b.nullity, abs(b.goeritz_determinant))


@pytest.mark.parametrize("notation", ["torus:3,7", "pretzel:3,-5,7,2", "montesinos:1/3,2/5,-1/2",
                                      "rational:55/21", "torus:4,6"])
def test_both_shadings_agree_on_family_members(notation):
    d = parse(notation)
    a, b = signature_data(d), signature_data(d, other_shading=True)
    assert (a.signature, a.nullity, abs(a.goeritz_determinant)) == \
        (b.signature, b.nullity, abs(b.goeritz_determinant))


# ---------------------------------------------------------------- exact inertia
small_symmetric = st.integers(1, 6).flatmap(lambda n: st.lists(
    st.integers(-3, 3), min_size=n * n, max_size=n * n).map(
    lambda xs: [[xs[min(i, j) * n + max(i, j)] for j in range(n)] for i in range(n)]))


@settings(max_examples=80, deadline=None)
@given(small_symmetric)
@example([[0, 1], [1, 0]])
@example([[0, 0], [0, 0]])
@example([[0, 2, 1], [2, 0, 3], [1, 3, 0]])
def test_symmetric_inertia_matches_descartes_and_sympy_det(m):
    pos, neg, zero, det = symmetric_inertia(m)
    assert (pos, neg, zero) == descartes_inertia(m)
    assert det == int(sympy.Matrix(m).det())
