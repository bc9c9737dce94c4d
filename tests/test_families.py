"""Family generators: sizes, component counts and the published parity rules."""

from __future__ import annotations

from math import gcd

import pytest

from pipeline import parse
from pipeline.diagrams.families import braid, two_bridge
from pipeline.diagrams.families.two_bridge import continued_fraction, fraction_of
from fractions import Fraction


@pytest.mark.parametrize("p", range(1, 7))
@pytest.mark.parametrize("q", range(1, 9))
def test_torus_sizes_and_components(p, q):
    # T(p,q) has gcd(p,q) components (Rolfsen ch. 3); the braid diagram has q(p−1) crossings
    d = parse(f"torus:{p},{q}")
    assert d.n_crossings == q * (p - 1)
    assert d.n_components == gcd(p, q)
    assert d.writhe == q * (p - 1)          # positive braid


@pytest.mark.parametrize("entries", [(3, 5, 7), (2, 3, 5), (2, 4, 5), (3, 3, 3, 3), (-3, 5, 2, 7), (2, 2, 3), (1, 1)])
def test_pretzel_knot_parity_rule(entries):
    # SOURCES.md item 3: P(p1..pk) is a knot iff exactly one p_i is even, or k and all p_i
    # are odd *(common practice)*
    evens = sum(1 for p in entries if p % 2 == 0)
    is_knot = evens == 1 or (evens == 0 and len(entries) % 2 == 1)
    d = parse("pretzel:" + ",".join(map(str, entries)))
    assert (d.n_components == 1) == is_knot
    assert d.n_crossings == sum(map(abs, entries))


@pytest.mark.parametrize("alpha", range(1, 30))
def test_two_bridge_components(alpha):
    # b(α,β) is a knot for α odd and a 2-component link for α even (Schubert 1956)
    for beta in range(-alpha + 1, alpha):
        if gcd(alpha, beta) != 1 or beta == 0:
            continue
        d = parse(f"rational:{alpha}/{beta}")
        assert d.n_components == (1 if alpha % 2 else 2)


@pytest.mark.parametrize("num,den", [(7, 2), (13, 5), (-11, 4), (3, 7), (1, 1), (100, 37)])
def test_continued_fraction_inverts(num, den):
    assert fraction_of(continued_fraction(num, den)) == Fraction(num, den)


def test_reduced_alternating_two_bridge_crossings():
    # with all-positive terms the rational diagram has Σ a_i crossings and is alternating
    d = parse("conway:3 1 2")
    assert d.n_crossings == 6 and d.is_alternating()


def test_braid_strands_default_and_extra():
    assert braid.diagram([1, 1, 1], strands=4).free_loops == 2
    with pytest.raises(Exception, match="cannot carry"):
        braid.diagram([3], strands=2)


def test_montesinos_integer_tangle():
    # an integer entry n is the tangle n/1 (README.md)
    assert parse("montesinos:1/3,2") == parse("montesinos:1/3,2/1")
