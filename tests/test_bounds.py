"""Tests of pipeline.invariants.bounds against published values (SOURCES.md)."""

from __future__ import annotations

from math import gcd

import pytest

from pipeline.diagrams.notation import parse
from pipeline.invariants.alexander import fox as alexander
from pipeline.invariants.coloring import spectrum as coloring
from pipeline.invariants.jones import frontier as jones
from pipeline.invariants.bounds import (
    all_bounds,
    arf_invariant,
    bridge_lower_bound,
    crossing_number_bound,
    four_genus_lower_bound,
    genus_lower_bound,
    is_reduced,
    linking_numbers,
    nugatory_crossings,
    slice_obstructed,
    unknotting_lower_bound,
)
from pipeline.invariants.signature import signature

# Rolfsen's table by Conway notation: name -> (notation, crossing number, det) *(memory)*
ROLFSEN = {"3_1": ("3", 3, 3), "4_1": ("2 2", 4, 5), "5_1": ("5", 5, 5), "5_2": ("3 2", 5, 7),
           "6_1": ("4 2", 6, 9), "6_2": ("3 1 2", 6, 11), "6_3": ("2 1 1 2", 6, 13),
           "7_1": ("7", 7, 7), "7_2": ("5 2", 7, 11), "7_3": ("4 3", 7, 13), "7_4": ("3 1 3", 7, 15),
           "7_5": ("3 2 2", 7, 17), "7_6": ("2 2 1 2", 7, 19), "7_7": ("2 1 1 1 2", 7, 21)}


@pytest.mark.parametrize("name", ROLFSEN)
def test_crossing_number_is_certified_on_the_conway_table(name):
    # Kauffman / Murasugi / Thistlethwaite 1987; crossing numbers from the knot names
    notation, crossings, _ = ROLFSEN[name]
    d = parse(f"conway:{notation}")
    assert crossing_number_bound(d) == (crossings, True)
    # KMT: the Jones span of such a diagram equals its crossings
    assert jones.jones_polynomial(d).span() == crossings


def test_nugatory_crossings_are_found_and_removed_from_the_bound():
    assert nugatory_crossings(parse("braid:1")) == [0]          # unknot with a kink
    assert crossing_number_bound(parse("braid:1,-2")) == (0, False)
    assert crossing_number_bound(parse("braid:1,1,1,2")) == (3, False)  # trefoil + kink
    assert is_reduced(parse("torus:2,3")) and is_reduced(parse("pretzel:3,0,3"))


def test_non_alternating_and_split_diagrams_are_not_certified():
    # T(3,4) = 8_19 has crossing number 8 (memory, Rolfsen); the braid diagram is not
    # alternating, so only the upper bound 8 is claimed
    assert crossing_number_bound(parse("torus:3,4")) == (8, False)
    assert crossing_number_bound(parse("braid:1,1,1,3,3,3")) == (6, False)  # split
    assert crossing_number_bound(parse("braid:2,2,2")) == (3, False)        # free loop


@pytest.mark.parametrize("det,arf", [(1, 0), (3, 1), (5, 1), (7, 0), (9, 0), (15, 0), (11, 1), (2, None)])
def test_arf_invariant_from_determinant(det, arf):
    # Levine 1966 / Murakami 1986: Arf = 0 iff Δ(−1) ≡ ±1 (mod 8); trefoil and 4_1 have
    # Arf 1, 6_1 (det 9) Arf 0 (common practice)
    assert arf_invariant(det) == arf


@pytest.mark.parametrize("k", [1, 2, 3, 4])
def test_linking_number_of_torus_link_t_2_2k_is_k(k):
    # T(2,2k) with parallel strands: lk = k (common practice); mirror −k
    d = parse(f"torus:2,{2 * k}")
    assert linking_numbers(d) == {(0, 1): k}
    assert linking_numbers(d.mirror()) == {(0, 1): -k}


def test_linking_numbers_of_other_links():
    assert linking_numbers(parse("rational:8/3")) == {(0, 1): 0}   # Whitehead link (common practice)
    assert linking_numbers(parse("torus:3,3")) == {(0, 1): 1, (0, 2): 1, (1, 2): 1}
    assert linking_numbers(parse("torus:2,3")) == {}


TORUS = [(p, q) for q in range(3, 10) for p in range(2, q) if gcd(p, q) == 1]


@pytest.mark.parametrize("p,q", TORUS)
def test_genus_bound_is_the_torus_knot_genus(p, q):
    # Seifert genus of T(p,q) is (p−1)(q−1)/2 = span Δ / 2 (Rolfsen ch. 7, Seifert 1935)
    d = parse(f"torus:{p},{q}")
    assert genus_lower_bound(alexander.alexander_polynomial(d)) == (p - 1) * (q - 1) // 2
    # 4-genus bound |σ|/2 never exceeds the genus (Murasugi 1965)
    assert four_genus_lower_bound(signature(d)) <= (p - 1) * (q - 1) // 2


def test_genus_bound_for_links_and_split_links():
    # T(2,4): ∇ = z³ + 2z, span Δ = 3 = 2g + 1, g = 1 (common practice)
    assert genus_lower_bound(alexander.alexander_polynomial(parse("torus:2,4")), 2) == 1
    assert genus_lower_bound(alexander.alexander_polynomial(parse("braid:1,-1")), 2) == 0


@pytest.mark.parametrize("det,obstructed", [(1, False), (3, True), (9, False), (25, False), (5, True)])
def test_fox_milnor_determinant_square(det, obstructed):
    # Fox–Milnor 1966: slice ⇒ det square; 6_1 (det 9) and 8_20 (det 9) are slice (memory)
    assert slice_obstructed(det) is obstructed


@pytest.mark.parametrize("notation,u,b", [
    ("pretzel:3,0,3", 2, 3),   # 3_1 # 3_1: factors (3,3); u = 2, b = 3 (common practice)
    ("pretzel:3,3,-3", 2, 3),  # factors (3,3) (SOURCES.md, memory)
    ("torus:2,3", 1, 2),
    ("torus:3,5", 0, 1),       # det 1: Wendt's bound says nothing
])
def test_wendt_bounds(notation, u, b):
    factors = coloring.invariant_factors(parse(notation))
    assert unknotting_lower_bound(factors) == u
    assert bridge_lower_bound(factors) == b


def test_wendt_bridge_bound_never_exceeds_two_for_two_bridge_knots():
    # two-bridge knots have cyclic H1(Σ2) (Schubert): bound ≤ 2
    for alpha in range(3, 40, 2):
        factors = coloring.invariant_factors(parse(f"rational:{alpha}/1"))
        assert bridge_lower_bound(factors) == 2


def test_all_bounds_collects_what_applies():
    d = parse("torus:2,3")
    row = {"components": 1, "determinant": 3, "invariant_factors": [3], "signature": -2,
           "alexander": alexander.alexander_polynomial(d)}
    out = all_bounds(d, row)
    assert out == {"alternating": True, "reduced": True, "nugatory": 0, "crossing_number": 3,
                   "crossing_number_certified": True, "arf": 1, "slice_obstructed": True,
                   "genus_lower_bound": 1, "four_genus_lower_bound": 1,
                   "unknotting_lower_bound": 1, "bridge_lower_bound": 2}
    link = all_bounds(parse("torus:2,4"), {})
    assert link["linking_numbers"] == {"0-1": 2} and "arf" not in link
