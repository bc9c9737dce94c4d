"""Tests of pipeline.census.worklist: the deterministic work list of a spec.

Checked against independent routes: the knots-only rules decided from the parameters
(torus: gcd(p, q) = 1; pretzel parity rule, SOURCES.md families item 3 *(common
practice)*; two-bridge: α odd, Schubert 1956; braid: the closure's components are the
cycles of the braid permutation *(common practice)*) against the number of components of
the diagram actually built by the parser; the two-bridge rows against Euler's totient
(sympy); the work list's order against the lexicographic product of the parameters
written out by hand (DESIGN.md: order of the work list).
"""

from __future__ import annotations

import itertools
import json
import random
from math import gcd

import pytest
from sympy import totient

from pipeline import parse
from pipeline.census.spec import parse_spec
from pipeline.census.worklist import braid_components, count_items, iter_chunks, iter_items, pretzel_is_knot


def _components(notation: str) -> int:
    d = parse(notation)
    return len(d.components) + d.free_loops


@pytest.mark.parametrize("entries", [e for k in (2, 3, 4) for e in itertools.product([-3, -2, 1, 2, 3, 4], repeat=k)][::7])
def test_pretzel_parity_rule_against_the_built_diagram(entries):
    assert pretzel_is_knot(entries) == (_components("pretzel:" + ",".join(map(str, entries))) == 1)


def test_braid_components_against_the_built_diagram():
    rng = random.Random(10)
    for _ in range(80):
        n = rng.randint(2, 5)
        word = [rng.choice([1, -1]) * rng.randint(1, n - 1) for _ in range(rng.randint(1, 9))]
        assert braid_components(word) == _components("braid:" + ",".join(map(str, word))), word


def test_knots_only_torus_and_two_bridge_rows_are_knots_and_none_is_missing():
    spec = parse_spec('[census]\nknots_only = true\n'
                      '[[family]]\nkind = "torus"\np = [2, 5]\nq = [-4, 7]\n'
                      '[[family]]\nkind = "two_bridge"\nalpha = [2, 15]\n')
    items = list(iter_items(spec))
    torus = [i for i in items if i.family == "torus"]
    expected = [(p, q) for p in range(2, 6) for q in range(-4, 8) if q and gcd(p, q) == 1]
    assert [tuple(json.loads(i.params).values()) for i in torus] == expected
    assert all(_components(i.notation) == 1 for i in items)
    # b(α, β) rows: every β coprime to α, for odd α only — φ(α) of them (sympy's totient)
    tb = [i for i in items if i.family == "two_bridge"]
    assert len(tb) == sum(int(totient(a)) for a in range(3, 16, 2))


def test_all_two_bridge_rows_count_is_the_totient_sum_and_links_appear():
    spec = parse_spec('[[family]]\nkind = "two_bridge"\nalpha = [2, 20]\n')
    items = list(iter_items(spec))
    assert len(items) == count_items(spec) == sum(int(totient(a)) for a in range(2, 21))
    assert {_components(i.notation) for i in items} == {1, 2}     # α even: two components


def test_order_ids_and_chunks_match_a_hand_written_product():
    spec = parse_spec('[census]\nchunk_size = 7\n'
                      '[[family]]\nkind = "pretzel"\nlength = 3\nentries = [-2, 2]\n'
                      '[[family]]\nkind = "torus"\np = 2\nq = [3, 5]\n')
    items = list(iter_items(spec))
    vals = [-2, -1, 1, 2]                                   # 0 skipped unless zero = true
    want = ["pretzel:%d,%d,%d" % t for t in itertools.product(vals, repeat=3)] + \
        ["torus:2,3", "torus:2,4", "torus:2,5"]
    assert [i.notation for i in items] == want
    assert [i.row_id for i in items] == list(range(len(want)))
    assert [i.family_index for i in items] == [0] * 64 + [1] * 3
    chunks = list(iter_chunks(spec))
    assert [j for j, _ in chunks] == list(range(-(-len(want) // 7)))
    assert all(len(block) == 7 for _, block in chunks[:-1])
    assert [i for _, block in chunks for i in block] == items


def test_braid_family_expands_letter_ranges():
    spec = parse_spec('[[family]]\nkind = "braid"\nword = "1^a -2^b"\na = [1, 2]\nb = [-1, 1]\n')
    got = [i.notation for i in iter_items(spec)]
    want = []
    for a in (1, 2):
        for b in (-1, 0, 1):
            w = [1] * a + ([-2] * b if b > 0 else [2] * -b)
            want.append("braid:" + ",".join(map(str, w)))
    assert got == want
