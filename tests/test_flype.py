"""Flype moves and the flype-class code (pipeline.diagrams.flype).

Outside checks: H. Schubert's classification of two-bridge links ("Knoten mit zwei
Brücken", Math. Z. 65, 1956: b(α,β) = b(α,β') unoriented iff β' ≡ β^{±1} mod α; mirror
b(α,−β); amphichiral iff β² ≡ −1 mod α), invariance of the Jones polynomial and the
determinant under flypes (they are isotopies), and the Kauffman–Murasugi–Thistlethwaite
theorem (1987) that a flype keeps a reduced alternating diagram reduced alternating.
"""

import random
from math import gcd

import pytest

from pipeline import parse
from pipeline.diagrams.canonical import canonical_text, turn_over_pd
from pipeline.diagrams.diagram import Diagram
from pipeline.diagrams.flype import (
    NotReducedAlternating, check_reduced_prime_alternating, flype_code, flype_code_by_orbit,
    flype_codes, flype_codes_by_orbit, flype_orbit, flypes, is_amphichiral)
from pipeline.diagrams.flype_circuits import block_flypes, twist_count
from pipeline.diagrams.shadow import to_diagram, twins
from pipeline.errors import BudgetExceeded, KnotLedgerError
from pipeline.invariants.coloring import determinant
from pipeline.invariants.jones import jones_polynomial

SAMPLES = [
    "conway:3 1 2", "conway:2 1 1 2", "conway:3 2 1 1 2", "pretzel:3,3,4", "pretzel:3,3,3",
    "montesinos:1/3,2/5,2/7", "montesinos:1/3,2/5,1/4", "montesinos:2/3,3/5,1/2,1/3",
    "montesinos:1/2,1/3,2/5", "pretzel:2,3,5", "conway:2 2 2 2", "pretzel:3,3,3,3",
]


def _shuffled(d: Diagram, rng: random.Random) -> Diagram:
    """The same diagram with labels rotated along each component and crossings reordered."""
    m = {}
    for comp in d.components:
        k = rng.randrange(len(comp))
        for j, v in enumerate(comp):
            m[v] = comp[(j + k) % len(comp)]
    pd = [tuple(m[v] for v in x) for x in d.pd]
    rng.shuffle(pd)
    return Diagram.from_pd(pd)


def _unit_free(poly):
    """Jones polynomial up to ±t^k (a component reversal multiplies V by t^{3λ})."""
    t = poly.terms
    k0, sign = t[0][0], 1 if t[0][1] > 0 else -1
    return tuple((k - k0, sign * c) for k, c in t)


def test_conway_and_braid_forms_of_the_figure_eight_share_a_code():
    # conway:2 2 and braid:1,-2,1,-2 are both the figure-eight knot (b(5,2)).
    assert flype_code(parse("conway:2 2")) == flype_code(parse("braid:1,-2,1,-2"))


@pytest.mark.parametrize("text", SAMPLES)
def test_flypes_keep_reduced_alternating_and_the_invariants(text):
    d = parse(text)
    det, jones = determinant(d), jones_polynomial(d)
    moved = list(flypes(d))
    assert moved, text
    for e in moved:
        check_reduced_prime_alternating(e)
        assert e.n_crossings == d.n_crossings
        assert determinant(e) == det
        if d.n_components == 1:
            assert jones_polynomial(e) == jones
        else:
            assert _unit_free(jones_polynomial(e)) == _unit_free(jones)


def test_code_is_invariant_under_random_flypes_relabelling_turning_over_and_double_mirror():
    rng = random.Random(11)
    from pipeline.diagrams.families.alternating import diagrams
    pool = [d for n in range(3, 9) for d in diagrams(n, links=True)]
    pool += [parse(t) for t in SAMPLES]
    checked = 0
    for d in pool:
        code = flype_code(d)
        e = d
        for _ in range(3):
            nxt = list(flypes(e))
            if nxt:
                e = rng.choice(nxt)
        variants = [e, _shuffled(e, rng), e.relabel(), Diagram.from_pd(turn_over_pd(e)),
                    e.mirror().mirror()]
        for v in variants:
            assert flype_code(v) == code
            checked += 1
    assert checked >= 300


def test_mirror_swaps_the_two_codes():
    for text in SAMPLES:
        d = parse(text)
        a, b = flype_codes(d)
        assert flype_codes(d.mirror()) == (b, a)


def _schubert_class(alpha, beta):
    """Representatives of b(α,β) as an unoriented link: β^{±1} mod α."""
    b = beta % alpha
    return min(b, pow(b, -1, alpha))


@pytest.mark.parametrize("alpha", [*range(3, 13), *(pytest.param(a, marks=pytest.mark.slow) for a in range(13, 20))])
def test_two_bridge_codes_follow_schubert(alpha):
    # Schubert 1956: b(α,β) = b(α,β') (unoriented, mirror not identified) iff β' ≡ β^{±1} mod α;
    # amphichiral iff β² ≡ -1 mod α.
    betas = [b for b in range(-alpha + 1, alpha) if b and gcd(alpha, b) == 1]
    codes = {b: flype_code(parse(f"rational:{alpha}/{b}")) for b in betas}
    for b1 in betas:
        for b2 in betas:
            same = _schubert_class(alpha, b1) == _schubert_class(alpha, b2)
            assert (codes[b1] == codes[b2]) == same, (alpha, b1, b2)
    for b in betas:
        if b > 0:
            d = parse(f"rational:{alpha}/{b}")
            assert is_amphichiral(d) == ((b * b + 1) % alpha == 0), (alpha, b)


@pytest.mark.parametrize("text, why", [
    ("pretzel:-2,3,3", "not alternating"),
    ("braid:1,1,1,-2", "nugatory"),
    ("braid:1,1,1,-2,-2,-2", "not prime"),
])
def test_refuses_diagrams_that_are_not_reduced_prime_alternating(text, why):
    with pytest.raises(NotReducedAlternating, match=why) as info:
        flype_code(parse(text))
    assert isinstance(info.value, KnotLedgerError)
    assert "\n" not in str(info.value)


def test_orbit_budget_raises_instead_of_guessing():
    d = parse("conway:3 2 1 1 2")
    assert len(flype_orbit(d)) > 1
    with pytest.raises(BudgetExceeded, match="flype budget 1"):
        flype_orbit(d, budget=1)


def test_gathered_search_budget_raises_instead_of_guessing():
    # conway:2 2 2 2 2 2 has four members with the fewest twist regions (whole-orbit count)
    d = parse("conway:2 2 2 2 2 2")
    orbit = flype_orbit(d)
    assert flype_code(d, route="gathered") == orbit[0]
    with pytest.raises(BudgetExceeded, match="flype budget 2"):
        flype_code(d, budget=2, route="gathered")


def test_orbit_members_are_diagrams_of_the_code_type():
    d = parse("montesinos:1/3,2/5,2/7")
    orbit = flype_orbit(d)
    assert canonical_text(d) in orbit
    assert flype_code(d, route="orbit") == orbit[0]


@pytest.mark.parametrize("seed", range(8))
def test_random_diagrams_keep_their_code_and_invariants_under_flypes(seed):
    from pipeline.diagrams.families.alternating import random_diagram
    rng = random.Random(seed)
    d = random_diagram(10 + seed % 4, seed=seed)
    code, det = flype_code(d), determinant(d)
    v = _unit_free(jones_polynomial(d))
    e = d
    for _ in range(4):
        nxt = list(flypes(e))
        if not nxt:
            break
        e = rng.choice(nxt)
        assert determinant(e) == det and _unit_free(jones_polynomial(e)) == v
    assert flype_code(_shuffled(e, rng)) == code
    assert flype_code(Diagram.from_pd(turn_over_pd(e))) == code


def test_random_diagram_refuses_tiny_sizes():
    from pipeline.diagrams.families.alternating import random_diagram
    with pytest.raises(KnotLedgerError, match="must be an integer >= 2"):
        random_diagram(1)


@pytest.mark.parametrize("text, regions", [
    ("conway:3 2", 2), ("conway:3 2 2", 3), ("pretzel:3,3,3", 3), ("pretzel:3,3,4", 3),
    ("conway:2 1 1 2", 4), ("montesinos:1/3,2/5,2/7", 5),
])
def test_twist_regions_of_standard_pictures(text, regions):
    # Counted by hand on the standard pictures: a Conway (4-plat) form a1 … ak has one twist
    # region per term; a pretzel form one per column; 2/5 = [2, 2] and 2/7 = [3, 2] as
    # continued fractions give two regions each (1 + 2 + 2) *(common practice: counted on the
    # standard pictures, J. H. Conway, "An enumeration of knots and links", 1970)*.
    assert twist_count(twins(parse(text))) == regions


@pytest.mark.parametrize("text", SAMPLES)
def test_block_flypes_are_isotopies(text):
    # A block flype is a product of flypes: the determinant and the Jones polynomial (up to
    # the unit a component reversal brings) stay, and the result is reduced alternating.
    d = parse(text)
    det, v = determinant(d), _unit_free(jones_polynomial(d))
    moved = [to_diagram(*st) for st in block_flypes(twins(d), [True] * len(d.pd))]
    for e in moved[:6]:
        check_reduced_prime_alternating(e)
        assert determinant(e) == det and _unit_free(jones_polynomial(e)) == v
    assert all(flype_code(e) == flype_code(d) for e in moved)


def _random_pool(sizes, seeds, rng):
    """Random diagrams plus a randomly flyped, relabelled copy of each (same class)."""
    from pipeline.diagrams.families.alternating import random_diagram
    pool = []
    for n in sizes:
        for seed in seeds:
            d = random_diagram(n, seed=seed)
            e = d
            for _ in range(3):
                nxt = list(flypes(e))
                if nxt:
                    e = rng.choice(nxt)
            pool += [d, _shuffled(e, rng), d.mirror()]
    return pool


def _check_fast_against_orbit(pool):
    fast = [flype_codes(d, route="gathered") for d in pool]
    slow = [flype_codes_by_orbit(d) for d in pool]
    for a, b in zip(fast, slow):
        assert a == b  # the same member is chosen, so the same text
    # hence the same partition: equal fast codes iff equal whole-orbit codes
    for i in range(len(pool)):
        for j in range(i):
            assert (fast[i][0] == fast[j][0]) == (slow[i][0] == slow[j][0])


def test_fast_code_equals_the_whole_orbit_search_on_random_diagrams():
    rng = random.Random(5)
    pool = _random_pool(range(5, 13), range(6), rng)
    pool += [parse(t) for t in SAMPLES]
    _check_fast_against_orbit(pool)


@pytest.mark.slow
def test_fast_code_equals_the_whole_orbit_search_on_larger_random_diagrams():
    rng = random.Random(6)
    _check_fast_against_orbit(_random_pool(range(13, 16), range(6, 10), rng))


def test_fast_code_equals_the_whole_orbit_search_on_two_bridge_chains():
    for text in ["conway:3 2 2 3 2", "conway:2 2 2 2 2 2", "conway:2 1 1 2 2", "conway:3 1 1 1 3"]:
        d = parse(text)
        assert flype_code(d, route="gathered") == flype_code_by_orbit(d), text
