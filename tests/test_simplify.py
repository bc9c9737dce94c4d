"""Tests of pipeline.diagrams.simplify (Reidemeister simplification).

Outside checks: Reidemeister moves are isotopies (K. Reidemeister, Abh. Math. Sem.
Hamburg 5, 1927), so every invariant must survive: Jones (Kauffman bracket state sum),
determinant (Fox colourings), Conway-normalised Alexander / Conway polynomial,
signature, linking numbers, component count.  A reduced alternating diagram has the
fewest crossings (Kauffman; Murasugi; Thistlethwaite, Topology 26, 1987), so the
simplifier must leave its crossing count alone.  The diagrams made bigger by
``complicate`` (tests/_moves.py) are built by inverse R1/R2 moves written directly on PD codes,
independently of the simplifier's code, and validated after every step.
"""

from __future__ import annotations

import random

import pytest

from pipeline.diagrams.diagram import Diagram
from pipeline.diagrams.notation import parse
from pipeline.diagrams.simplify import (alternating_crossing_number, is_reduced,
                                        nugatory_crossings, simplify)
from pipeline.errors import BudgetExceeded, DiagramError
from pipeline.invariants.alexander import conway_polynomial
from pipeline.invariants.bounds import linking_numbers
from pipeline.invariants.coloring import determinant
from pipeline.invariants.jones import jones_polynomial
from pipeline.invariants.signature import signature


from _moves import complicate, connected_sum, inverse_r1  # noqa: E402


def _linking(d: Diagram) -> list[int]:
    # free loops link nothing: pad with zeros to all pairs of components
    n = d.n_components
    vals = list(linking_numbers(d).values())
    return sorted(vals + [0] * (n * (n - 1) // 2 - len(vals)))


def _invariants(d: Diagram):
    return (d.n_components, jones_polynomial(d), determinant(d), conway_polynomial(d),
            signature(d), _linking(d))


def _words(n, seed):
    rng = random.Random(seed)
    out = []
    for _ in range(n):
        k, m = rng.randint(2, 4), rng.randint(1, 12)
        out.append([rng.choice([1, -1]) * rng.randint(1, k - 1 if k > 2 else 1) for _ in range(m)])
    return out


# ---------------------------------------------------------------------- tests
def test_complicate_makes_valid_bigger_diagrams_of_the_same_link():
    # the test helper itself is checked against the invariants (Reidemeister 1927)
    for k, start in enumerate(["torus:2,3", "conway:2 2", "braid:1,-2,1", "torus:2,4"]):
        d = parse(start)
        c = complicate(d, 6, seed=k)
        assert c.n_crossings > d.n_crossings
        assert _invariants(c) == _invariants(d)


@pytest.mark.parametrize("seed", range(8))
def test_invariants_survive_simplifying_random_braids(seed):
    for w in _words(6, seed):
        d = parse("braid:" + ",".join(map(str, w)))
        r = simplify(d, seed=seed)
        assert r.diagram.n_crossings <= d.n_crossings
        assert r.complete and sum(r.moves.values()) >= (d.n_crossings - r.crossings) // 2
        assert _invariants(r.diagram) == _invariants(d), w


@pytest.mark.parametrize("seed", range(6))
def test_invariants_survive_simplifying_complicated_diagrams(seed):
    rng = random.Random(100 + seed)
    for start in ["conway:3 2", "pretzel:3,-2,3", "torus:3,4", "braid:1,-2,1,2,-3,2", "torus:2,4"]:
        d = parse(start)
        c = complicate(d, rng.randint(3, 8), seed=rng.randrange(10 ** 6))
        r = simplify(c, seed=seed)
        assert r.diagram.n_crossings < c.n_crossings
        assert _invariants(r.diagram) == _invariants(d), (start, c)


@pytest.mark.parametrize("seed", range(10))
def test_kinked_unknots_reduce_to_no_crossing(seed):
    # an unknot built by inverse R1 moves only: every kink goes (Reidemeister 1927)
    rng = random.Random(seed)
    d = Diagram.from_pd([[1, 2, 2, 1]])
    for _ in range(rng.randint(1, 12)):
        d = inverse_r1(d, rng)
    r = simplify(d, seed=seed)
    assert r.diagram.n_crossings == 0 and r.diagram.free_loops == 1 and r.minimal


def test_r1_r2_unknots_mostly_reduce_and_stay_unknots():
    zero = 0
    for seed in range(20):
        d = complicate(Diagram.from_pd([[1, 2, 2, 1]]), 5, seed)
        r = simplify(d, seed=seed)
        assert jones_polynomial(r.diagram) == jones_polynomial(d)
        assert r.diagram.n_components == 1
        zero += r.diagram.n_crossings == 0
    assert zero >= 15   # the R3 search is heuristic; most of these must still untangle


@pytest.mark.parametrize("notation,crossings", [
    ("torus:2,3", 3), ("conway:2 2", 4), ("conway:3 2", 5), ("conway:2 1 1 2", 6),
    ("conway:3 1 3", 7), ("pretzel:3,3,3", 9), ("pretzel:2,3,5", 10), ("torus:2,8", 8),
    ("braid:1,-2,1,-2,1,-2", 6), ("pretzel:3,0,3", 6)])
def test_reduced_alternating_diagrams_keep_their_crossings(notation, crossings):
    # Kauffman / Murasugi / Thistlethwaite 1987: a reduced alternating diagram is minimal
    d = parse(notation)
    assert d.is_alternating() and is_reduced(d) and d.n_crossings == crossings
    r = simplify(d)
    assert r.diagram.n_crossings == crossings and r.minimal and r.moves["R3"] == 0


def test_reduced_alternating_after_complicating_comes_back():
    for seed in range(10):
        d = complicate(parse("conway:2 2"), 3, seed)
        r = simplify(d, seed=seed)
        if r.diagram.n_crossings == 4:
            assert r.minimal and r.diagram.is_alternating()
        assert r.diagram.n_crossings >= 4      # never below the crossing number


def test_named_examples():
    r = simplify(parse("braid:1,-1"))        # the 2-component unlink (two strands)
    assert (r.diagram.n_crossings, r.diagram.free_loops, r.moves["R2"]) == (0, 2, 1)
    assert simplify(parse("torus:2,3")).diagram.n_crossings == 3
    r = simplify(parse("braid:1,1,-1"))      # 2 strands, σ1: an unknot with a kink
    assert (r.diagram.n_crossings, r.diagram.free_loops) == (0, 1)
    assert simplify(parse("braid:1,2")).diagram.n_crossings == 0   # nugatory crossings
    assert simplify(parse("torus:3,2")).diagram.n_crossings == 3   # T(3,2) = T(2,3), 4 -> 3


def test_orientation_and_signs_are_kept():
    # a crossing between two components keeps its sign: linking numbers (checked above);
    # here the writhe of a reduced alternating result equals the input's minus removed kinks
    d = complicate(parse("torus:2,4"), 5, seed=3)
    r = simplify(d)
    assert sorted(linking_numbers(r.diagram).values()) == [2]       # T(2,4): lk = 2
    assert r.diagram.n_crossings == 4 and r.diagram.writhe == 4


def test_deterministic_for_a_seed():
    d = complicate(parse("pretzel:3,-2,3"), 10, seed=7)
    assert simplify(d, seed=5).diagram == simplify(d, seed=5).diagram


def test_budget_best_so_far_or_raise():
    d = complicate(parse("torus:2,5"), 8, seed=1)
    full = simplify(d)
    part = simplify(d, budget=2)
    assert not part.complete and sum(part.moves.values()) == 2
    assert full.diagram.n_crossings <= part.diagram.n_crossings < d.n_crossings
    assert _invariants(part.diagram) == _invariants(d)     # best so far is still correct
    with pytest.raises(BudgetExceeded, match="skipped: simplify budget 2"):
        simplify(d, budget=2, strict=True)
    with pytest.raises(DiagramError, match="budget"):
        simplify(d, budget=-1)
    with pytest.raises(DiagramError, match="patience"):
        simplify(d, patience="many")
    with pytest.raises(DiagramError, match="expected a Diagram"):
        simplify("pd:[[1,5,2,4],[3,1,4,6],[5,3,6,2]]")
    assert simplify(d, budget=0).diagram is d       # nothing done: the input itself


def test_split_and_free_loops():
    d = parse("braid:1,1,1,3,-3")             # trefoil beside a kinked unlink piece
    r = simplify(d)
    assert r.diagram.n_crossings == 3 and r.diagram.free_loops == 2
    assert _invariants(r.diagram) == _invariants(d)


def test_nugatory_and_reduced():
    d = parse("braid:1,2,2,2")                # first crossing nugatory (a 3-strand closure)
    assert nugatory_crossings(d) == [0] and not is_reduced(d)
    assert alternating_crossing_number(parse("conway:3 2")) == 5
    assert alternating_crossing_number(d) is None
    assert alternating_crossing_number(parse("braid:1,1,1,3,3,3")) is None   # split


def knotted_kink(seed: int = 0) -> Diagram:
    """A trefoil with a kink whose loop has a second trefoil tied in: the kink crossing
    is nugatory but not an R1 kink (each side of it is knotted)."""
    d = inverse_r1(parse("torus:2,3"), random.Random(seed))
    x = d.pd[-1]
    loop = next(v for v in x if x.count(v) == 2)
    return connected_sum(d, loop, parse("torus:2,3"), 1)


@pytest.mark.parametrize("seed", range(4))
def test_nugatory_crossing_with_knotted_sides_is_removed(seed):
    d = knotted_kink(seed)
    assert d.n_crossings == 7 and nugatory_crossings(d) == [3]
    r = simplify(d, r3=False)
    assert r.moves["nugatory"] == 1 and r.moves["R1"] == 0
    assert r.diagram.n_crossings == 6 and is_reduced(r.diagram)
    assert _invariants(r.diagram) == _invariants(d)
    # trefoil # trefoil = P(3,0,3) (tests/SOURCES.md, families item 5)
    assert jones_polynomial(r.diagram) == jones_polynomial(parse("pretzel:3,0,3")) or \
        jones_polynomial(r.diagram) == jones_polynomial(parse("pretzel:-3,0,-3"))


@pytest.mark.slow
def test_invariants_survive_many_random_braids():
    for seed in range(40):
        for w in _words(10, 1000 + seed):
            d = parse("braid:" + ",".join(map(str, w)))
            r = simplify(d, seed=seed)
            assert _invariants(r.diagram) == _invariants(d)
