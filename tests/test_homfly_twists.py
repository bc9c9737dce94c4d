"""Tests of the twist-region step of the HOMFLY-PT skein route (issue 12, speed).

Normalisation v⁻¹P(L₊) − vP(L₋) = zP(L₀), P(unknot) = 1.  Checked against:
* the slow reference: the same memoised skein tree one crossing at a time
  (``homfly_general(d, twists=False)``) on random braids, pretzels, two-bridge and
  Montesinos rows with random crossing changes, alternating knots and diagrams made
  bigger by inverse Reidemeister moves (tests/_moves.py) — links with their own orientation;
* published values: positive trefoil P = 2v² − v⁴ + v²z² (REFERENCES, derived from the
  skein relation), figure-eight P = v⁻² − 1 + v² − z² *(memory)*; P(−2,3,3) = T(3,4) and
  P(−2,3,5) = T(3,5) (SOURCES.md 5);
* the specialisations V(t) = P(t, t^½ − t^−½) (Jones route) and ∇(z) = P(1, z) (Conway
  route) on whole families of up to 30 crossings, where the reference tree is too slow;
* the Hecke route on T(2,n) and T(3,n) as braids and, for knots, as rational/conway/pretzel
  rows (P of a knot does not depend on its orientation);
* the closed forms of the twist coefficients against the recurrence they solve, and the
  sign facts of tangle bigons (pipeline/diagrams/bigons.py) on random diagrams.
"""

from __future__ import annotations

import random
from math import gcd

import pytest
from hypothesis import HealthCheck, assume, example, given, settings
from hypothesis import strategies as st

from pipeline.diagrams.bigons import bigons, twist_chains
from pipeline.diagrams.families import braid, torus
from pipeline.diagrams.notation import parse
from pipeline.diagrams.plane import trace_faces
from pipeline.errors import BudgetExceeded
from pipeline.invariants.alexander import conway_polynomial
from pipeline.invariants.homfly import DELTA, HPoly, homfly_braid, homfly_general, homfly_polynomial
from pipeline.invariants.homfly.skein import antiparallel_twist_coefficients, parallel_twist_coefficients
from pipeline.invariants.jones import jones_polynomial

from _moves import complicate

TREFOIL = HPoly({(2, 0): 2, (4, 0): -1, (2, 2): 1})  # REFERENCES: derived from the skein relation
FIGURE_EIGHT = HPoly({(-2, 0): 1, (0, 0): -1, (2, 0): 1, (0, 2): -1})  # (memory)
ONE = HPoly.monomial()

SETTINGS = settings(max_examples=60, deadline=None,
                    suppress_health_check=[HealthCheck.too_slow, HealthCheck.filter_too_much])
SMALL = 11  # the reference tree stays well under a second a diagram up to here


# ---------------------------------------------------------------- generators
def _nonzero(lo: int, hi: int):
    return st.integers(lo, hi).filter(bool)


@st.composite
def braid_rows(draw):
    n = draw(st.integers(2, 4))
    word = draw(st.lists(st.integers(1, n - 1).flatmap(lambda i: st.sampled_from([i, -i])), max_size=10))
    return braid.diagram(word, strands=n)


@st.composite
def pretzel_rows(draw):
    entries = draw(st.lists(st.integers(-6, 6), min_size=1, max_size=5))
    return parse("pretzel:" + ",".join(map(str, entries)))


@st.composite
def two_bridge_rows(draw):
    if draw(st.booleans()):
        terms = draw(st.lists(_nonzero(-5, 5), min_size=1, max_size=5))
        return parse("conway:" + " ".join(map(str, terms)))
    alpha = draw(st.integers(1, 60))
    beta = draw(st.integers(-60, 60))
    assume(gcd(alpha, beta) == 1)
    return parse(f"rational:{alpha}/{beta}")


@st.composite
def montesinos_rows(draw):
    fr = [f"{draw(_nonzero(-7, 7))}/{draw(st.integers(1, 7))}" for _ in range(draw(st.integers(2, 4)))]
    return parse("montesinos:" + ",".join(fr))


@st.composite
def changed(draw, rows, limit: int = SMALL):
    """A row of ``rows`` with up to three crossings switched (twist regions then hold
    Reidemeister II bigons and mixed signs)."""
    d = draw(rows)
    assume(1 <= d.n_crossings <= limit)
    flips = draw(st.sets(st.integers(0, d.n_crossings - 1), max_size=3))
    return d.change_crossings(flips) if flips else d


@st.composite
def complicated(draw):
    """An alternating knot or a small family row made bigger by inverse R1/R2 moves."""
    if draw(st.booleans()):
        n = draw(st.integers(3, 7))   # prime alternating knots: 1, 1, 2, 3, 7 of them
        d = parse(f"alt:{n}:{draw(st.integers(1, {3: 1, 4: 1, 5: 2, 6: 3, 7: 7}[n]))}")
    else:
        d = draw(changed(st.one_of(pretzel_rows(), two_bridge_rows()), limit=6))
    return complicate(d, draw(st.integers(1, 3)), draw(st.integers(0, 10 ** 6)))


ALL_SMALL = st.one_of(changed(braid_rows()), changed(pretzel_rows()), changed(two_bridge_rows()),
                      changed(montesinos_rows()), complicated())


# ---------------------------------------------------------------- the slow reference
@SETTINGS
@given(changed(braid_rows()))
@example(braid.diagram([1, 1, 1, 1], strands=2))        # a parallel cycle: T(2,4) closure
@example(braid.diagram([1, -1], strands=2))              # Reidemeister II to two free loops
def test_twist_route_matches_reference_on_braids(d):
    assert homfly_general(d) == homfly_general(d, twists=False)


@SETTINGS
@given(changed(pretzel_rows()))
@example(parse("pretzel:2,2,2"))                          # antiparallel columns
@example(parse("pretzel:1,1,1,1"))                         # columns merge into one twist
@example(parse("pretzel:3,0,3"))
def test_twist_route_matches_reference_on_pretzels(d):
    assert homfly_general(d) == homfly_general(d, twists=False)


@SETTINGS
@given(changed(two_bridge_rows()))
def test_twist_route_matches_reference_on_two_bridge_rows(d):
    assert homfly_general(d) == homfly_general(d, twists=False)


@SETTINGS
@given(changed(montesinos_rows()))
def test_twist_route_matches_reference_on_montesinos_rows(d):
    assert homfly_general(d) == homfly_general(d, twists=False)


@SETTINGS
@given(complicated())
def test_twist_route_matches_reference_on_complicated_diagrams(d):
    assert homfly_general(d) == homfly_general(d, twists=False)


# ---------------------------------------------------------------- published values
def test_published_values_by_the_twist_route():
    for text in ("torus:2,3", "conway:3", "pretzel:-1,-1,-1", "rational:3/1"):
        assert homfly_general(parse(text)) == TREFOIL, text
    for text in ("conway:2 2", "rational:5/2", "pretzel:2,1,1"):
        assert homfly_general(parse(text)) == FIGURE_EIGHT, text
    assert homfly_general(parse("torus:2,-3")) == TREFOIL.mirror()
    # SOURCES.md 5: P(−2,3,3) = T(3,4), P(−2,3,5) = T(3,5) (knots: orientation-free)
    assert homfly_general(parse("pretzel:-2,3,3")) == homfly_braid(torus.word(3, 4), strands=3)
    assert homfly_general(parse("pretzel:-2,3,5")) == homfly_braid(torus.word(3, 5), strands=3)


@pytest.mark.parametrize("n", [2, 3, 4, 5, 8, 13, 20, 31])
def test_two_strand_torus_links_from_the_closed_form(n):
    # σ1^n on two strands is one parallel twist region: P = A_n·P(unknot) + B_n·δ,
    # and the Hecke route (a different method) must agree
    a, b = parallel_twist_coefficients(n, 1)
    assert homfly_braid([1] * n, strands=2) == a + b * DELTA == homfly_general(parse(f"torus:2,{n}"))
    a, b = parallel_twist_coefficients(n, -1)
    assert homfly_braid([-1] * n, strands=2) == a + b * DELTA


@pytest.mark.parametrize("n", [3, 5, 7, 9, 15, 21])
def test_hecke_route_equals_twist_route_on_t2n_rows(n):
    hecke = homfly_braid([1] * n, strands=2)
    # README pins rational:a/1 = torus:2,a; the pretzel/Montesinos picture is the mirror
    # of the two-bridge one (families/montesinos.py: montesinos:3 is the negative trefoil),
    # and P(1, …, 1) = M(1, …, 1) = M(n)
    for text in (f"braid:{','.join(['1'] * n)}", f"torus:2,{n}", f"rational:{n}/1", f"conway:{n}",
                 "pretzel:" + ",".join(["-1"] * n), f"montesinos:{-n}"):
        assert homfly_general(parse(text)) == hecke, text
    for text in (f"rational:{n}/-1", f"conway:{-n}", "pretzel:" + ",".join(["1"] * n)):
        assert homfly_general(parse(text)) == hecke.mirror(), text


@pytest.mark.parametrize("q", [1, 2, 4, 5, 7, 8])
def test_hecke_route_equals_twist_route_on_t3n(q):
    word = torus.word(3, q)
    hecke = homfly_braid(word, strands=3)
    assert homfly_general(braid.diagram(word, strands=3)) == hecke
    assert homfly_general(parse(f"torus:3,{q}")) == hecke
    assert homfly_general(parse(f"torus:-3,{q}")) == hecke.mirror()


# ---------------------------------------------------------------- specialisations on whole families
FAMILY_ROWS = ([f"pretzel:{p},{q},{r}" for p in (-5, 2, 3, 7) for q in (-4, 3, 5) for r in (3, -6, 9)]
               + [f"pretzel:{p},{q},{r},{s}" for p, q, r, s in
                  [(3, 3, 3, 3), (2, -3, 5, 7), (-4, 5, 5, -5), (6, 6, -7, 3), (2, 3, 5, 3)]]
               + [f"conway:{' '.join(map(str, t))}" for t in
                  [(5, 5, 5), (2, -3, 4, -5, 6), (7, 1, 7), (3, 4, 5, 6, 7), (1, 1, 1, 1, 1, 1, 1, 1, 1, 1)]]
               + [f"rational:{a}/{b}" for a, b in [(377, 144), (1001, 300), (512, 97), (99, -35)]]
               + ["montesinos:1/3,2/5,-3/7", "montesinos:3/7,-5/13,4/9", "montesinos:2/3,3/4,-5/6,1/2",
                  "montesinos:-1/5,1/5,2/7,3"])


@pytest.mark.parametrize("text", FAMILY_ROWS)
def test_specialises_to_jones_and_conway_on_families(text):
    d = parse(text)
    P = homfly_general(d, budget=20_000)
    assert P.jones() == jones_polynomial(d)
    assert P.conway() == conway_polynomial(d)
    c = d.n_components
    assert all((a - c + 1) % 2 == 0 and (b - c + 1) % 2 == 0 for (a, b), _ in P.terms)


@settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(changed(st.one_of(pretzel_rows(), two_bridge_rows(), montesinos_rows()), limit=30))
def test_specialisations_and_mirror_on_larger_random_rows(d):
    P = homfly_general(d)
    assert P.jones() == jones_polynomial(d)
    assert P.conway() == conway_polynomial(d)
    assert homfly_general(d.mirror()) == P.mirror()


# ---------------------------------------------------------------- coefficients and bigons
@pytest.mark.parametrize("sign", [1, -1])
def test_closed_forms_solve_the_twist_recurrences(sign):
    u, w = HPoly.monomial(sign), HPoly.monomial(0, 1, sign)
    # parallel: (A, B)_k = u²(A, B)_(k−2) + uw(A, B)_(k−1), (A, B)_0 = (0, 1), (A, B)_1 = (1, 0)
    prev, cur = (HPoly(), ONE), (ONE, HPoly())
    assert parallel_twist_coefficients(0, sign) == prev and parallel_twist_coefficients(1, sign) == cur
    for k in range(2, 25):
        prev, cur = cur, tuple(u * u * p + u * w * c for p, c in zip(prev, cur))
        assert parallel_twist_coefficients(k, sign) == cur, k
    # antiparallel: P(T_k) = u²P(T_(k−2)) + uw·P(D_∞), unrolled from T_k to T_(k mod 2)
    for k in range(0, 25):
        c, e = ONE, HPoly()
        for _ in range(k // 2):
            c, e = c * u * u, e + c * u * w
        assert antiparallel_twist_coefficients(k, sign) == (c, e), k


@SETTINGS
@given(ALL_SMALL)
def test_bigons_are_the_two_sided_faces_and_signs_follow_alternation(d):
    pd, signs = d.pd, d.signs
    found = bigons(pd)
    faces = [f for f in trace_faces(pd) if len(f) == 2 and f[0][0] != f[1][0]]
    assert len(found) == len(faces)
    for b in found:
        # removable (Reidemeister II) bigons join opposite signs, twist bigons equal ones
        assert (signs[b.i] == signs[b.j]) == (not b.removable)
    chains = twist_chains(pd, signs, found=found)
    assert [len(c.crossings) for c in chains] == sorted((len(c.crossings) for c in chains), reverse=True)
    in_chain = [i for c in chains for i in c.crossings]
    assert len(in_chain) == len(set(in_chain))
    twist_pairs = {frozenset((b.i, b.j)) for b in found if not b.removable}
    for c in chains:
        assert len(c.crossings) >= 2 and len({signs[i] for i in c.crossings}) == 1
        steps = list(zip(c.crossings, c.crossings[1:])) + ([(c.crossings[-1], c.crossings[0])] if c.cyclic else [])
        assert all(frozenset(p) in twist_pairs for p in steps)


def test_parallel_and_antiparallel_chains_on_known_rows():
    # σ1^5: one parallel cycle; T(2,4) with the braid orientation: parallel; pretzel columns
    # of P(2,2,2) (a link whose columns are antiparallel) and P(3,3,3) (knot: columns of odd
    # length in a 3-strand pretzel knot run antiparallel)
    d = braid.diagram([1] * 5, strands=2)
    (ch,) = twist_chains(d.pd, d.signs)
    assert len(ch.crossings) == 5 and ch.cyclic and ch.parallel
    d = parse("pretzel:3,3,3")
    chains = twist_chains(d.pd, d.signs)
    assert sorted(len(c.crossings) for c in chains) == [3, 3, 3]
    assert not any(c.parallel for c in chains)


def test_budget_counts_expanded_diagrams_on_both_routes():
    d = parse("pretzel:5,-3,5,3")
    with pytest.raises(BudgetExceeded) as err:
        homfly_general(d, budget=3)
    assert str(err.value) == "skipped: homfly budget 3"
    with pytest.raises(BudgetExceeded):
        homfly_general(d, budget=200, twists=False)
    assert homfly_polynomial(d, notation="pretzel:5,-3,5,3", budget=200) == homfly_general(d, twists=False)


def test_typed_in_pd_of_a_relabelled_row_gives_the_same_polynomial():
    rng = random.Random(5)
    for text in ("pretzel:3,-4,5", "conway:2 3 -2 4", "montesinos:1/3,-2/5,3/4"):
        d = parse(text)
        pd = list(d.pd)
        rng.shuffle(pd)
        typed = parse("pd:" + str([list(x) for x in pd]))
        assert homfly_general(typed) == homfly_general(d) == homfly_general(d.relabel())
