"""Tests of Khovanov homology (pipeline/invariants/khovanov/).

Checked against the outside: the slow cube of resolutions on random diagrams (over Q and
F₂), published values (sources beside each check, collected in SOURCES.md), the Jones
polynomial (Euler characteristic), the mirror rule, Lee's theorem for alternating knots
with the signature and determinant, Rasmussen's values of s, and invariance under
random Markov moves on braids.
"""

from __future__ import annotations

import random

import pytest
from hypothesis import HealthCheck, example, given, settings
from hypothesis import strategies as st

from pipeline.diagrams.diagram import Diagram
from pipeline.diagrams.families import braid
from pipeline.diagrams.notation import parse
from pipeline.errors import BudgetExceeded, DiagramError
from pipeline.invariants.coloring import determinant
from pipeline.invariants.jones import jones_polynomial
from pipeline.invariants.khovanov import (cube_khovanov, jones_from_khovanov, kh_width, khovanov_data,
                                          khovanov_homology, mirror_ranks, ranks_from_json,
                                          ranks_to_json, rasmussen_s, reduced_khovanov)
from pipeline.invariants.signature import signature


def kh(text_or_diagram, field: int = 0):
    d = parse(text_or_diagram) if isinstance(text_or_diagram, str) else text_or_diagram
    return khovanov_homology(d, field=field)


# ----------------------------------------------------------------- published values
TREFOIL = {(0, 1): 1, (0, 3): 1, (2, 5): 1, (3, 9): 1}


def test_positive_trefoil_by_both_routes():
    # Bar-Natan, AGT 2 (2002), conventions; REFERENCES.md *(memory)*; verified here by the cube
    assert kh("torus:2,3") == TREFOIL
    assert cube_khovanov(parse("torus:2,3")) == TREFOIL
    assert kh("braid:1,1,1") == TREFOIL
    assert kh("torus:-2,3") == {(0, -1): 1, (0, -3): 1, (-2, -5): 1, (-3, -9): 1}


def test_figure_eight():
    # 4_1: rank 1 at (−2,−5), (−1,−1), (0,−1), (0,1), (1,1), (2,5) over Q *(memory:
    # Bar-Natan, AGT 2 (2002), table of small knots)*; also by the cube
    want = {(-2, -5): 1, (-1, -1): 1, (0, -1): 1, (0, 1): 1, (1, 1): 1, (2, 5): 1}
    assert kh("conway:2 2") == want == cube_khovanov(parse("conway:2 2"))


def torus_2n(n: int) -> dict:
    """Khovanov homology of T(2,n) over Q, n ≥ 3 odd: q^(n−2) + q^n + Σ_{k=1}^{(n−1)/2} (t^{2k} q^{n+4k−2} +
    t^{2k+1} q^{n+4k+2}) *(memory: M. Khovanov, Duke Math. J. 101 (2000), §6.2)*."""
    out = {(0, n - 2): 1, (0, n): 1}
    for k in range(1, (n - 1) // 2 + 1):
        out[(2 * k, n + 4 * k - 2)] = 1
        out[(2 * k + 1, n + 4 * k + 2)] = 1
    return out


@pytest.mark.parametrize("n", [3, 5, 7, 9, 11])
def test_two_strand_torus_knots_closed_form(n):
    assert kh(f"torus:2,{n}") == torus_2n(n)
    # F₂: each Q pair (2k, n+4k−2), (2k+1, n+4k+2) comes with Z/2 torsion at (2k+1, n+4k)
    # *(memory: same source)*, seen over F₂ at (2k, n+4k) and (2k+1, n+4k) (universal
    # coefficients)
    f2 = dict(torus_2n(n))
    for k in range(1, (n - 1) // 2 + 1):
        f2[(2 * k, n + 4 * k)] = f2[(2 * k + 1, n + 4 * k)] = 1
    assert kh(f"torus:2,{n}", 2) == f2


def test_t25_by_the_cube():
    assert cube_khovanov(parse("torus:2,5")) == torus_2n(5)
    assert cube_khovanov(parse("torus:2,5"), modulus=2) == kh("torus:2,5", 2)


# ----------------------------------------------------------------- fast route vs the cube
@st.composite
def braid_words(draw, max_len: int = 8):
    strands = draw(st.integers(2, 4))
    gens = st.integers(1, strands - 1).flatmap(lambda i: st.sampled_from([i, -i]))
    word = draw(st.lists(gens, min_size=1, max_size=max_len))
    return word, strands


@settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(braid_words())
@example(([1], 2))                 # a kink: one crossing, an edge with both ends there
@example(([1, 1], 4))              # Hopf link plus two free loops
@example(([1, -2, 1, -2], 3))      # figure-eight
@example(([1, 1, 1, 2, -1, 2, 2, 2], 3))
def test_fast_route_matches_the_cube_on_random_braids(wb):
    word, strands = wb
    d = braid.diagram(word, strands=strands)
    if d.n_crossings == 0:
        return
    for field in (0, 2):
        assert kh(d, field) == cube_khovanov(d, modulus=field)
        if d.n_components == 1:
            assert reduced_khovanov(d, field=field) == cube_khovanov(d, modulus=field, reduced=True)


def _random_pd_diagrams():
    # pretzel, rational and Montesinos diagrams of ≤ 8 crossings: other PD shapes than braids
    out = ["pretzel:1,1,1", "pretzel:2,-3,3", "pretzel:-1,2,3", "pretzel:3,-1,-3", "rational:7/3",
           "rational:13/5", "conway:2 1 1 2", "conway:3 -2 2", "montesinos:1/2,1/3,-1/2"]
    return out


@pytest.mark.parametrize("text", _random_pd_diagrams())
def test_fast_route_matches_the_cube_on_other_families(text):
    d = parse(text)
    for field in (0, 2, 3):
        assert kh(d, field) == cube_khovanov(d, modulus=field)


@pytest.mark.slow
@pytest.mark.parametrize("text", ["pretzel:-2,3,5", "braid:1,-2,1,-2,3,-2,1,-2,3,3"])
def test_fast_route_matches_the_cube_on_ten_crossings(text):
    d = parse(text)
    for field in (0, 2):
        assert kh(d, field) == cube_khovanov(d, modulus=field)


# ----------------------------------------------------------------- Euler characteristic = Jones
FAMILIES = ([f"torus:{p},{q}" for p, q in [(2, 3), (2, 4), (3, 4), (3, 5), (2, -7), (4, 5), (3, 8)]]
            + [f"pretzel:{a},{b},{c}" for a, b, c in [(-2, 3, 5), (3, 3, 3), (-3, 5, 7), (2, 2, 2)]]
            + ["rational:17/5", "conway:4 3 2", "braid:1,-2,3,1,-2,3,2,2", "braid:1,1,2,-1,2"])


@pytest.mark.parametrize("text", FAMILIES)
def test_euler_characteristic_is_jones(text):
    # Bar-Natan, AGT 2 (2002), Thm 1: Σ(−1)^i q^j rank Kh^{i,j} = (q + q⁻¹)·V at t^½ = −q
    d = parse(text)
    assert jones_from_khovanov(kh(d)) == jones_polynomial(d)
    assert jones_from_khovanov(kh(d, 2)) == jones_polynomial(d)


@settings(max_examples=25, deadline=None)
@given(braid_words(max_len=14))
def test_euler_characteristic_is_jones_on_random_braids(wb):
    word, strands = wb
    d = braid.diagram(word, strands=strands)
    assert jones_from_khovanov(kh(d)) == jones_polynomial(d)


# ----------------------------------------------------------------- mirror
@settings(max_examples=25, deadline=None)
@given(braid_words(max_len=12))
@example(([1, 1, 1], 2))
def test_mirror_negates_both_degrees(wb):
    # Kh^{i,j}(D*) ≅ Kh^{−i,−j}(D) over a field (Khovanov, Duke 101 (2000), Cor. 11)
    word, strands = wb
    d = braid.diagram(word, strands=strands)
    if d.n_crossings == 0:
        return
    for field in (0, 2):
        assert kh(d.mirror(), field) == mirror_ranks(kh(d, field))


def test_trefoil_is_told_from_its_mirror():
    assert kh("torus:2,3") != mirror_ranks(kh("torus:2,3"))
    assert kh("conway:2 2") == mirror_ranks(kh("conway:2 2"))  # 4_1 is amphichiral


# ----------------------------------------------------------------- alternating knots (Lee)
ALTERNATING = (["torus:2,3", "torus:-2,7", "conway:2 2", "conway:3 2", "conway:2 1 1 2", "conway:5 1 3", "conway:3 1 2",
                "rational:37/11", "pretzel:3,3,3", "pretzel:-3,-5,-7", "pretzel:1,1,5"]
               + ["braid:" + ",".join(["1,-2"] * k) for k in (4, 5, 7)])


@pytest.mark.parametrize("text", ALTERNATING)
def test_alternating_knots_are_thin_with_rank_det_plus_one(text):
    # E. S. Lee, Adv. Math. 197 (2005): Kh over Q of a (non-split) alternating knot lies on
    # j − 2i = −σ ± 1 and has total rank det + 1; J. Rasmussen, Invent. Math. 182 (2010): s = −σ
    d = parse(text)
    assert d.is_alternating() and d.n_components == 1, text  # the test's own premise
    ranks = kh(d)
    sigma = signature(d)
    assert {j - 2 * i for (i, j) in ranks} <= {-sigma - 1, -sigma + 1}
    assert kh_width(ranks) == 2
    assert sum(ranks.values()) == determinant(d) + 1
    assert rasmussen_s(d) == -sigma
    # reduced: one diagonal j − 2i = −σ, rank det (Khovanov, Experiment. Math. 12 (2003);
    # Lee 2005) *(memory)*
    red = reduced_khovanov(d)
    assert {j - 2 * i for (i, j) in red} == {-sigma}
    assert sum(red.values()) == determinant(d)


@settings(max_examples=20, deadline=None)
@given(braid_words(max_len=12))
@example(([1, 1, 1, 2, -1, 2, 2, 2], 3))
def test_reduced_homology_of_knots(wb):
    word, strands = wb
    d = braid.diagram(word, strands=strands)
    if d.n_components != 1:
        return
    red_q, red_2 = reduced_khovanov(d), reduced_khovanov(d, field=2)
    # Euler characteristic of the reduced theory is V at t^½ = −q (no factor q + q⁻¹):
    # multiply by q + q⁻¹ (i.e. tensor with V) and compare with Jones
    def times_v(r):
        out = {}
        for (i, j), n in r.items():
            for e in (1, -1):
                out[(i, j + e)] = out.get((i, j + e), 0) + n
        return out
    assert jones_from_khovanov(times_v(red_q)) == jones_polynomial(d)
    # over F₂, Kh ≅ Khr ⊗ (q + q⁻¹) *(memory: A. Shumakovitch, "Torsion of Khovanov
    # homology", Fund. Math. 225 (2014), Cor. 3.2.C)*
    assert kh(d, 2) == times_v(red_2)


# ----------------------------------------------------------------- Rasmussen's s
@pytest.mark.parametrize("p,q", [(2, 3), (2, 5), (3, 4), (3, 5), (3, 7), (4, 5), (2, 11)])
def test_s_of_positive_torus_knots(p, q):
    # Rasmussen, Invent. Math. 182 (2010): s(T(p,q)) = (p − 1)(q − 1) for p, q > 0;
    # s(mirror) = −s
    assert rasmussen_s(parse(f"torus:{p},{q}")) == (p - 1) * (q - 1)
    assert rasmussen_s(parse(f"torus:-{p},{q}")) == -(p - 1) * (q - 1)


def test_s_of_positive_diagrams_is_twice_the_seifert_genus():
    # for a knot with a positive diagram, s = 2g = 1 − χ of the canonical Seifert surface
    # = n − #Seifert circles + 1 *(memory: Rasmussen, Invent. Math. 182 (2010), §5.2, and
    # A. Shumakovitch, "Rasmussen invariant, slice-Bennequin inequality, and sliceness of
    # knots", JKTR 16 (2007))*; here on positive braid words (Seifert circles = strands)
    for word, strands in [([1, 1, 1, 2, 1, 2], 3), ([1, 1, 2, 1, 2, 2, 2, 2], 3),
                          ([1, 2, 3, 1, 2, 3, 1], 4), ([1, 2, 3, 1, 2, 3, 1, 2, 3, 2, 1], 4)]:
        d = braid.diagram(word, strands=strands)
        assert d.n_components == 1 and min(d.signs) > 0
        assert rasmussen_s(d) == len(word) - strands + 1


def test_khovanov_data_agrees_with_the_single_functions():
    d = parse("torus:3,4")
    data = khovanov_data(d)
    assert ranks_from_json(data.khovanov) == kh(d)
    assert ranks_from_json(data.khovanov_f2) == kh(d, 2)
    assert data.rasmussen_s == rasmussen_s(d) == 6
    assert data.kh_width == 3          # T(3,4) = 8_19 is Kh-thick
    assert ranks_from_json(data.khovanov_reduced) == reduced_khovanov(d)
    assert khovanov_data(parse("braid:1,1")).rasmussen_s is None
    assert khovanov_data(parse("braid:1,1")).khovanov_reduced is None


# ----------------------------------------------------------------- Markov moves
def _markov(word: list[int], strands: int, rng: random.Random) -> tuple[list[int], int]:
    """One random Markov move (or braid relation) that keeps the closure's link type."""
    move = rng.randrange(4)
    if move == 0 and word:                               # conjugation
        k = rng.randrange(len(word))
        return word[k:] + word[:k], strands
    if move == 1:                                        # stabilisation σ_n^{±1}
        return word + [rng.choice([strands, -strands])], strands + 1
    if move == 2:                                        # insert σ_i σ_i⁻¹
        i = rng.randint(1, strands - 1)
        k = rng.randint(0, len(word))
        return word[:k] + [i, -i] + word[k:], strands
    for k in range(len(word) - 2):                       # σ_i σ_{i+1} σ_i = σ_{i+1} σ_i σ_{i+1}
        a, b, c = word[k:k + 3]
        if a == c > 0 and abs(b) == a + 1 and b > 0:
            return word[:k] + [b, a, b] + word[k + 3:], strands
    return word, strands


@settings(max_examples=15, deadline=None)
@given(braid_words(max_len=6), st.integers(0, 10 ** 6))
@example(([1, 1, 1], 2), 7)
def test_invariance_under_random_markov_moves(wb, seed):
    word, strands = wb
    rng = random.Random(seed)
    w2, n2 = word, strands
    for _ in range(3):
        w2, n2 = _markov(w2, n2, rng)
    d1, d2 = braid.diagram(word, strands=strands), braid.diagram(w2, strands=n2)
    for field in (0, 2):
        assert kh(d1, field) == kh(d2, field)
    if d1.n_components == 1:
        assert rasmussen_s(d1) == rasmussen_s(d2)


def test_notation_braid_round_trip():
    assert kh("braid:1,-2,1") == kh("braid:-2,1,1") == kh("braid:1,1,-2")


# ----------------------------------------------------------------- JSON, width, errors
def test_json_form_is_sorted_triples():
    data = ranks_to_json(kh("torus:2,3"))
    assert data == [[0, 1, 1], [0, 3, 1], [2, 5, 1], [3, 9, 1]]
    assert all(isinstance(x, int) for row in data for x in row)


def test_unknot_and_free_loops():
    assert kh(Diagram.from_pd([], free_loops=1)) == {(0, -1): 1, (0, 1): 1}
    assert kh(Diagram.from_pd([], free_loops=2)) == {(0, -2): 1, (0, 0): 2, (0, 2): 1}
    assert kh(Diagram.from_pd([(1, 1, 2, 2)])) == {(0, -1): 1, (0, 1): 1}
    assert rasmussen_s(Diagram.from_pd([(1, 1, 2, 2)])) == 0
    assert reduced_khovanov(Diagram.from_pd([(1, 1, 2, 2)])) == {(0, 0): 1}
    assert reduced_khovanov(Diagram.from_pd([], free_loops=1)) == {(0, 0): 1}


@pytest.mark.parametrize("call,exc,match", [
    (lambda: khovanov_homology(parse("torus:3,4"), budget=3), BudgetExceeded, "skipped: khovanov budget 3"),
    (lambda: khovanov_homology(parse("torus:2,3"), budget=0), BudgetExceeded, "khovanov budget 0"),
    (lambda: khovanov_data(parse("torus:3,4"), budget=3), BudgetExceeded, "khovanov budget 3"),
    (lambda: rasmussen_s(parse("torus:3,4"), budget=3), BudgetExceeded, "khovanov budget 3"),
    (lambda: khovanov_homology(parse("torus:2,3"), budget=-1), ValueError, "budget -1"),
    (lambda: khovanov_homology(parse("torus:2,3"), field=4), ValueError, "field 4 is not a prime"),
    (lambda: khovanov_homology(parse("torus:2,3"), field=1), ValueError, "field 1"),
    (lambda: rasmussen_s(parse("torus:2,4")), DiagramError, "2 components"),
    (lambda: reduced_khovanov(parse("torus:2,4")), DiagramError, "reduced_khovanov: the diagram has 2"),
], ids=["budget-small", "budget-zero", "data-budget", "s-budget", "budget-negative", "field-4",
        "field-1", "s-of-a-link", "reduced-of-a-link"])
def test_documented_errors(call, exc, match):
    with pytest.raises(exc, match=match):
        call()


def test_width_of_thick_and_thin():
    assert kh_width(kh("torus:2,5")) == 2
    assert kh_width(kh("torus:3,4")) == 3   # 8_19 is thick *(memory: Bar-Natan, AGT 2 (2002))*
    assert kh_width({}) == 0
