"""Linking numbers (pipeline.invariants.linking): published values and an independent count.

lk(K_i, K_j) is computed as half the signed count of all crossings between the two
components; the tests compare it with the one-sided count "signs of the crossings
where K_i passes over K_j" (Rolfsen, Knots and Links (1976), 5.D: both equal the
linking number) and with published values *(common practice)*: the Hopf link has
lk = ±1, T(2, 2k) has lk = k, the Whitehead link b(8, 3) has lk = 0.
"""

from __future__ import annotations

import random

import pytest

from pipeline import parse
from pipeline.invariants.linking import linking_matrix, linking_numbers, reversal_linkings
from pipeline.invariants.chirality import reverse_components


def _over_count(d, i, j):
    """Σ sign(c) over the crossings where component i is the over-strand and j the under."""
    comp = d.component_of_label
    total = 0
    for k, x in enumerate(d.pd):
        under = comp[x[0]]
        over = comp[d.over_labels(k)[0]]
        if over == i and under == j:
            total += d.signs[k]
    return total


@pytest.mark.parametrize("text,lk", [("braid:1,1", 1), ("braid:-1,-1", -1),
                                     ("torus:2,2", 1), ("torus:2,4", 2), ("torus:2,6", 3),
                                     ("torus:2,-8", -4), ("rational:8/3", 0)])
def test_published_two_component_values(text, lk):
    # SOURCES.md (common practice): Hopf ±1, T(2,2k) lk = k, Whitehead link 0
    assert linking_numbers(parse(text)) == {(0, 1): lk}


LINKS = ["torus:3,3", "torus:2,6", "torus:4,6", "pretzel:2,2,2", "pretzel:2,-4,2,3",
         "braid:1,2,1,2,-3,2,-3", "braid:1,1,2,2,3,3", "montesinos:1/2,1/2,1/3",
         "conway:2 1 2", "braid:1,-2,1,-2,1,-2"]


@pytest.mark.parametrize("text", LINKS)
def test_half_count_equals_one_sided_count(text):
    d = parse(text)
    m = linking_matrix(d)
    k = len(d.components)
    for i in range(k):
        assert m[i][i] == 0
        for j in range(k):
            if i != j:
                assert m[i][j] == m[j][i] == _over_count(d, i, j) == _over_count(d, j, i)


@pytest.mark.parametrize("seed", range(6))
def test_reversal_linkings_match_recomputation_on_reversed_diagrams(seed):
    # λ = lk(K, L − K) is read off the reversed diagram independently: reversing K
    # changes every lk(K_i, K_j), i in K, j not in K, to its negative
    rng = random.Random(seed)
    d = parse(rng.choice(["torus:3,3", "torus:4,4", "pretzel:2,2,2", "braid:1,1,2,2,3,3"]))
    base = linking_numbers(d)
    for subset, lam in reversal_linkings(d):
        flipped = linking_numbers(reverse_components(d, subset)) if subset else base
        changed = sum(base[key] for key in base if (key[0] in subset) != (key[1] in subset))
        after = sum(flipped[key] for key in flipped if (key[0] in subset) != (key[1] in subset))
        assert lam == changed == -after


def test_reversal_linkings_of_a_knot_and_of_free_loops():
    assert reversal_linkings(parse("torus:2,3")) == [((), 0)]
    assert reversal_linkings(parse("pd:[] loops=2")) == [((), 0)]
    assert len(reversal_linkings(parse("torus:4,4"))) == 2 ** 3
