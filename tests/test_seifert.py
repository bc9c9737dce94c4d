"""Tests of the Seifert matrix of any diagram (Seifert's algorithm, pipeline.invariants.seifert_surface).

Checked against:
* the Alexander polynomial by Fox calculus (pipeline.invariants.alexander, Conway-normalised,
  0 for split links): det(t^−½V − t^½Vᵀ) = Δ on random diagrams (random braids, then random
  inverse Reidemeister I/II moves, so the Seifert circles nest in every way), on pretzel,
  two-bridge and Montesinos family members and on links;
* the signature by Gordon–Litherland (pipeline.invariants.signature): sign(V + Vᵀ) = σ;
* the size of the matrix: 2g + μ − 1 = crossings − circles + 1 for a connected diagram
  (Euler characteristic of the surface, Lickorish ch. 6), plus one zero class per tube for
  a split diagram; for a knot V − Vᵀ is unimodular (the intersection form of a surface
  with one boundary circle) *(common practice)*;
* the positive trefoil's Seifert matrix [[−1, 1], [0, −1]] up to congruence
  (W. B. R. Lickorish, GTM 175 (1997), ch. 6) *(memory)*;
* the braid route (pipeline.invariants.seifert.braid_seifert_matrix, J. Collins' rules):
  the same Alexander polynomial and the same whole signature function.
"""

from __future__ import annotations

from itertools import product

import pytest
from flint import fmpz_mat
from hypothesis import HealthCheck, example, given, settings
from hypothesis import strategies as st

from _moves import complicate
from pipeline.diagrams.diagram import Diagram
from pipeline.diagrams.families import braid
from pipeline.diagrams.notation import parse
from pipeline.invariants.alexander import alexander_polynomial
from pipeline.invariants.poly import Laurent
from pipeline.invariants.seifert import braid_seifert_matrix, seifert_alexander
from pipeline.invariants.seifert_surface import seifert_circles, seifert_matrix, seifert_matrix_size
from pipeline.invariants.signature import signature
from pipeline.invariants.tristram_levine import tristram_levine, tristram_levine_at

SETTINGS = settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.too_slow])

# random braid words on 2..4 strands, generators may be missing (split links, free loops)
words = st.integers(2, 4).flatmap(lambda n: st.tuples(st.just(n), st.lists(
    st.integers(1, n - 1).flatmap(lambda g: st.sampled_from([g, -g])), min_size=1, max_size=8)))


def check_against_fox_and_goeritz(d: Diagram) -> list[list[int]]:
    V = seifert_matrix(d)
    assert len(V) == seifert_matrix_size(d)
    assert seifert_alexander(V) == alexander_polynomial(d)
    assert tristram_levine_at(V, None) == signature(d)
    return V


@SETTINGS
@given(words, st.integers(0, 5), st.integers(0, 10 ** 6))
@example((2, [1, 1, 1]), 0, 0)
@example((3, [1, 1, -2]), 3, 1)
@example((4, [1, 1, 3, 3]), 2, 7)
def test_random_diagrams_give_alexander_and_signature(nw, moves, seed):
    n, word = nw
    d = complicate(braid.diagram(word, strands=n), moves, seed)
    check_against_fox_and_goeritz(d)


FAMILY = ["pretzel:3,3,3", "pretzel:-2,3,7", "pretzel:3,-5,7", "pretzel:2,3,-4", "pretzel:1,1,1,1",
          "pretzel:-3,-3,2", "rational:7/3", "rational:13/5", "rational:17/7", "rational:8/3",
          "conway:2 2", "conway:3 1 2", "conway:2 -3 2", "conway:4 4 1",
          "montesinos:1/3,2/5,-1/2", "montesinos:1/2,1/3,-1/5", "montesinos:2/5,-3/7,1/3",
          "torus:2,4", "torus:3,3", "pretzel:2,2,2", "pretzel:2,-2,2,2", "braid:1,1,2,2,1,1",
          "torus:2,-6"]


@pytest.mark.parametrize("text", FAMILY)
def test_family_members(text):
    d = parse(text)
    V = check_against_fox_and_goeritz(d)
    if len(d.pieces) == 1 and not d.free_loops:   # 2g + μ − 1 = c − s + 1
        assert len(V) == d.n_crossings - len(seifert_circles(d)) + 1
    if d.n_components == 1:
        A = fmpz_mat([[V[r][c] - V[c][r] for c in range(len(V))] for r in range(len(V))])
        assert len(V) % 2 == 0 and abs(int(A.det())) == 1


def test_split_diagrams_and_free_loops():
    trefoil = [[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]]
    d = Diagram.from_pd(trefoil, free_loops=2)
    V = check_against_fox_and_goeritz(d)
    assert len(V) == 2 + 2 and all(v == 0 for row in V[2:] for v in row)   # two tube classes
    assert len(seifert_matrix(d, tubes=False)) == 2
    assert seifert_matrix(Diagram.from_pd([], free_loops=1)) == []
    two = parse("braid:1,1,1,-3,-3,-3")   # trefoil ⊔ mirror trefoil
    V = check_against_fox_and_goeritz(two)
    assert len(V) == 5 and seifert_alexander(V) == Laurent({})   # a split link has Δ = 0


def test_positive_trefoil_matrix_up_to_congruence():
    """P V Pᵀ = [[−1, 1], [0, −1]] for some unimodular integer P (small search)."""
    V = seifert_matrix(parse("torus:2,3"))
    target = [[-1, 1], [0, -1]]
    found = False
    for a, b, c, e in product(range(-2, 3), repeat=4):
        if abs(a * e - b * c) != 1:
            continue
        P = [[a, b], [c, e]]
        PV = [[sum(P[i][k] * V[k][j] for k in range(2)) for j in range(2)] for i in range(2)]
        if [[sum(PV[i][k] * P[j][k] for k in range(2)) for j in range(2)] for i in range(2)] == target:
            found = True
            break
    assert found


def test_changing_the_outer_face_keeps_the_invariants():
    # rotating the crossing list changes which face is taken as unbounded
    for text in ("pretzel:3,-5,7", "montesinos:1/3,2/5,-1/2", "braid:1,-2,3,-2,1,3,2"):
        d = parse(text)
        for k in range(1, 4):
            e = Diagram.from_pd(d.pd[k:] + d.pd[:k], free_loops=d.free_loops)
            V = check_against_fox_and_goeritz(e)
            assert tristram_levine(V) == tristram_levine(seifert_matrix(d))


@settings(max_examples=20, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(st.integers(2, 4).flatmap(lambda n: st.lists(
    st.integers(1, n - 1).flatmap(lambda g: st.sampled_from([g, -g])), min_size=n - 1, max_size=8
).filter(lambda w: {abs(g) for g in w} == set(range(1, n)))))
@example([1, -2, 1, -2])
def test_agrees_with_the_braid_route(word):
    d = braid.diagram(word)
    V, W = seifert_matrix(d), braid_seifert_matrix(word)
    assert len(V) == len(W)
    assert seifert_alexander(V) == seifert_alexander(W)
    assert tristram_levine(V) == tristram_levine(W)
    # the mirror image negates the signature function
    m = tristram_levine(seifert_matrix(d.mirror()))
    assert m.values == tuple(-v for v in tristram_levine(V).values)
