"""Tests of pipeline.diagrams.primality (split pieces, visible summands, prime verdict).

Outside checks: the Jones polynomial and the determinant are multiplicative under
connected sum (V. F. R. Jones, Bull. AMS 12, 1985; det = |Δ(−1)| and Δ is multiplicative,
J. W. Alexander 1928); one zero entry of a pretzel gives the connected sum of the
T(2, p_j), e.g. P(3,0,3) = T(2,3) # T(2,3) (tests/SOURCES.md, families item 5); two
zero entries a split link.  A reduced alternating diagram is prime iff visibly prime
(W. Menasco, Topology 23, 1984).  The 2-edge cut search is compared with brute force
over all pairs of edges.
"""

from __future__ import annotations

import itertools
import random

import pytest

from _moves import complicate, connected_sum
from pipeline.diagrams.diagram import Diagram
from pipeline.diagrams.notation import parse
from pipeline.diagrams.primality import (cut_along, decompose, is_visibly_prime, split_pieces,
                                         two_edge_cut, visible_summands)
from pipeline.invariants.coloring import determinant
from pipeline.invariants.jones import jones_polynomial

KNOTS = ["conway:3", "conway:2 2", "conway:3 2", "conway:5", "conway:4 2", "conway:3 1 2",
         "conway:2 1 1 2", "pretzel:3,3,3", "torus:2,7"]


def _product(polys):
    out = polys[0]
    for p in polys[1:]:
        out = out * p
    return out


def _brute_cut(d: Diagram) -> bool:
    """Slow route: some pair of edges whose removal disconnects the diagram graph."""
    labels = d.labels
    for e1, e2 in itertools.combinations(labels, 2):
        adj: dict[int, set] = {i: set() for i in range(d.n_crossings)}
        for v, ends in d._slots_of.items():
            if v in (e1, e2):
                continue
            (i, _), (j, _) = ends
            adj[i].add(j)
            adj[j].add(i)
        seen, stack = {0}, [0]
        while stack:
            for j in adj[stack.pop()]:
                if j not in seen:
                    seen.add(j)
                    stack.append(j)
        if len(seen) < d.n_crossings:
            return True
    return False


@pytest.mark.parametrize("notation,pieces", [
    ("pretzel:3,0,3", [3, 3]), ("pretzel:3,0,-3", [3, 3]), ("pretzel:3,0,5", [3, 5]),
    ("pretzel:3,0,3,5", [3, 3, 5]), ("pretzel:2,0,3", [2, 3])])
def test_pretzel_zero_entry_is_a_connected_sum(notation, pieces):
    # P(.., 0, ..) = # T(2, p_j) (SOURCES.md families 5); Jones and det multiply
    d = parse(notation)
    r = decompose(d)
    assert r.prime is False
    assert sorted(s.diagram.n_crossings for s in r.summands) == pieces
    assert all(s.prime for s in r.summands)          # reduced alternating: Menasco
    assert _product([jones_polynomial(s.diagram) for s in r.summands]) == jones_polynomial(d)
    dets = [determinant(s.diagram) for s in r.summands]
    assert _product(dets) == determinant(d)
    assert sorted(dets) == pieces                    # det T(2, p) = p (SOURCES.md families 4)


@pytest.mark.parametrize("notation", KNOTS + ["torus:2,4", "pretzel:3,-3,3"])
def test_reduced_alternating_prime_diagrams(notation):
    d = parse(notation)
    r = decompose(d)
    assert is_visibly_prime(d)
    if d.is_alternating():
        assert r.prime is True and "Menasco" in r.reason
    assert len(r.summands) == 1


def test_sums_of_two_alternating_knots_split_back():
    rng = random.Random(4)
    for _ in range(12):
        a, b = rng.choice(KNOTS), rng.choice(KNOTS)
        da, db = parse(a), parse(b)
        if rng.random() < 0.5:
            db = db.mirror()
        d = connected_sum(da, rng.choice(da.labels), db, rng.choice(db.labels))
        r = decompose(d)
        assert r.prime is False
        got = sorted(str(jones_polynomial(s.diagram)) for s in r.summands)
        assert got == sorted([str(jones_polynomial(da)), str(jones_polynomial(db))])
        assert determinant(d) == determinant(da) * determinant(db)


def test_three_summands_and_complicated_input():
    d = connected_sum(parse("pretzel:3,0,3"), 2, parse("conway:2 2"), 3)
    c = complicate(d, 6, seed=2)
    r = decompose(c)
    assert r.prime is False and sorted(s.diagram.n_crossings for s in r.summands) == [3, 3, 4]
    assert _product([jones_polynomial(s.diagram) for s in r.summands]) == jones_polynomial(d)


def test_non_reduced_input_is_reduced_first():
    from test_simplify import knotted_kink
    d = knotted_kink(2)
    r = decompose(d)
    assert r.simplified.n_crossings == 6 and r.prime is False
    raw = visible_summands(d)          # without simplification: cut at the nugatory crossing too
    assert sum(s.n_crossings for s in raw) == 7


def test_split_links_and_free_loops():
    r = decompose(parse("braid:1,1,1,3,3,3"))     # two trefoils side by side
    assert r.prime is False and "split" in r.reason and len(r.pieces) == 2
    assert [jones_polynomial(p[0].diagram) for p in r.pieces] == [jones_polynomial(parse("torus:2,3"))] * 2
    two = parse("pretzel:3,0,3,0,3")                # two zero entries: split (SOURCES.md)
    r = decompose(two)
    assert r.prime is False and sorted(len(p) for p in r.pieces) == [1, 2]
    t = parse("torus:2,3")
    loose = Diagram.from_pd(t.pd, free_loops=1)
    assert [p.n_crossings for p in split_pieces(loose)] == [3, 0]
    assert decompose(loose).prime is False


def test_unknot_and_unknown():
    assert decompose(parse("braid:1")).prime is False            # the unknot is not prime
    r = decompose(parse("pretzel:-2,3,5"))   # visibly prime but not alternating: no theorem
    assert r.prime is None and len(r.summands) == 1
    s = connected_sum(parse("pretzel:-2,3,5"), 1, parse("conway:3"), 1)
    r = decompose(s)
    assert r.prime is None and len(r.summands) == 2   # only the trefoil is proven non-trivial
    s = connected_sum(parse("pretzel:-2,3,5"), 1, parse("torus:2,4"), 1)
    assert decompose(s).prime is None                # one summand proven, one unknown
    s = connected_sum(parse("pretzel:-2,3,5"), 1, parse("torus:2,4"), 1)
    s = connected_sum(s, 3, parse("torus:2,2"), 1)
    r = decompose(s)                                 # two link summands: not unknots
    assert r.prime is False and len(r.summands) == 3


def test_two_edge_cut_agrees_with_brute_force():
    rng = random.Random(9)
    diagrams = [parse(k) for k in KNOTS] + [parse("pretzel:3,0,3"), parse("pretzel:2,0,3,0,2")]
    for _ in range(15):
        w = [rng.choice([1, -1]) * rng.randint(1, 3) for _ in range(rng.randint(3, 9))]
        diagrams.append(parse("braid:" + ",".join(map(str, w))))
    for d in diagrams:
        for p in split_pieces(d):
            if p.n_crossings == 0:
                continue
            cut = two_edge_cut(p)
            assert (cut is not None) == _brute_cut(p), p
            if cut is not None:
                a, b = cut_along(p, *cut)
                assert a.n_crossings + b.n_crossings == p.n_crossings
                assert jones_polynomial(a) * jones_polynomial(b) == jones_polynomial(p)


def test_cut_along_refuses_non_cuts():
    d = parse("conway:2 2")
    with pytest.raises(ValueError, match="not a 2-edge cut"):
        cut_along(d, 1, 2)
