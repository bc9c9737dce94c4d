"""The enumeration of prime alternating knots and links (pipeline.diagrams.families.alternating).

Sources: knot counts 1, 1, 2, 3, 7, 18, 41, 123 for n = 3…10 — J. Hoste, M. Thistlethwaite,
J. Weeks, "The first 1,701,936 knots", Math. Intelligencer 20 (1998). Jones span = crossing
number for a reduced alternating diagram — L. H. Kauffman, "State models and the Jones
polynomial", Topology 26 (1987); K. Murasugi, Topology 26 (1987); M. Thistlethwaite,
Topology 26 (1987).
"""

import pytest

from pipeline.diagrams.families import alternating as alt
from pipeline.diagrams.flype import check_reduced_prime_alternating, diagram_of_code, flype_code, flype_codes, flypes
from pipeline.errors import KnotLedgerError
from pipeline.invariants.coloring import determinant
from pipeline.invariants.jones import jones_polynomial

# Hoste–Thistlethwaite–Weeks 1998, alternating prime knots by crossing number.
KNOTS = {1: 0, 2: 0, 3: 1, 4: 1, 5: 2, 6: 3, 7: 7, 8: 18, 9: 41, 10: 123}
# Prime alternating links with >= 2 components: 1 (n=2), 0, 1, 1, 5, 7, 21 (n=8)
# *(memory: the link table's alternating entries 2a1, 4a1, 5a1, 6a1-6a5, 7a1-7a7, 8a1-8a21)*.
LINKS = {2: 1, 3: 0, 4: 1, 5: 1, 6: 5, 7: 7, 8: 21}
LINKS_SLOW = {9: 55, 10: 174}  # *(memory: 9a1-9a55, 10a1-10a174)*
# Amphichiral prime alternating knots: 4_1; 6_3; 8_3, 8_9, 8_12, 8_17, 8_18
# *(memory: standard knot tables, e.g. D. Rolfsen, Knots and Links, 1976, appendix)*.
AMPHICHIRAL = {3: 0, 4: 1, 5: 0, 6: 1, 7: 0, 8: 5}


def _span(poly):
    t = poly.terms
    return (t[-1][0] - t[0][0]) // 2


@pytest.mark.parametrize("n", range(1, 10))
def test_knot_counts_match_the_published_table(n):
    assert sum(1 for _ in alt.diagrams(n)) == KNOTS[n]


@pytest.mark.slow
def test_knot_count_at_ten_crossings():
    assert len(alt.codes(10)) == KNOTS[10]


@pytest.mark.parametrize("n", [*sorted(LINKS), *(pytest.param(n, marks=pytest.mark.slow) for n in LINKS_SLOW)])
def test_link_counts(n):
    assert len(alt.codes(n, links=True)) - len(alt.codes(n)) == {**LINKS, **LINKS_SLOW}[n]


@pytest.mark.parametrize("n", [*range(3, 10), pytest.param(10, marks=pytest.mark.slow)])
def test_every_diagram_is_reduced_alternating_with_jones_span_n(n):
    for d in alt.diagrams(n, links=n <= 8):
        check_reduced_prime_alternating(d)
        assert d.n_crossings == n
        assert _span(jones_polynomial(d)) == n  # Kauffman/Murasugi/Thistlethwaite 1987


@pytest.mark.parametrize("n", range(3, 9))
def test_each_row_is_the_smaller_flype_code_of_its_chiral_pair(n):
    for code in alt.codes(n, links=True):
        d = diagram_of_code(code)
        # the rows are named by their ft: flype code, the smaller of the chiral pair;
        # the code rebuilt into a diagram gives the code back
        assert flype_code(d) == code
        pair = flype_codes(d)
        assert code in pair and code == min(pair, key=lambda c: (len(c), c))
        # the mirror's code rebuilt into a diagram gives the same chiral pair back
        assert set(flype_codes(diagram_of_code(pair[1]))) == set(pair)


@pytest.mark.parametrize("n", range(3, 9))
def test_amphichiral_counts(n):
    found = sum(1 for d in alt.diagrams(n) if len(set(flype_codes(d))) == 1)
    assert found == AMPHICHIRAL[n]


@pytest.mark.parametrize("n", range(3, 9))
def test_knots_up_to_eight_crossings_have_distinct_jones_up_to_mirror(n):
    # The Jones polynomial separates the prime knots with <= 9 crossings up to mirror image
    # *(memory: V. F. R. Jones, Ann. of Math. 126 (1987), table to 10 crossings)*; with the
    # determinant that is a check that no type is listed twice.
    seen = set()
    for d in alt.diagrams(n):
        v = jones_polynomial(d).terms
        key = (min(v, tuple(sorted((-k, c) for k, c in v))), determinant(d))
        assert key not in seen
        seen.add(key)


@pytest.mark.parametrize("n", range(3, 8))
def test_invariants_are_equal_within_a_flype_class(n):
    for d in alt.diagrams(n):
        det, v = determinant(d), jones_polynomial(d)
        for e in flypes(d):
            assert determinant(e) == det and jones_polynomial(e) == v


def test_order_is_deterministic_and_indexed_from_one():
    rows = list(alt.diagrams(7))
    assert [alt.diagram(7, i + 1) for i in range(len(rows))] == rows
    assert alt.from_notation("7:3") == rows[2]
    assert alt.diagram(3, 1).n_crossings == 3


@pytest.mark.parametrize("call, match", [
    (lambda: list(alt.diagrams(0)), r"outside \[1, 16\]"),
    (lambda: list(alt.diagrams(17)), r"outside \[1, 16\]"),
    (lambda: alt.diagram(5, 3), r"index 3 is outside \[1, 2\]"),
    (lambda: alt.diagram(5, 0), r"index 0"),
    (lambda: alt.from_notation("5"), "not N:I"),
    (lambda: alt.from_notation("x:1"), "not N:I"),
])
def test_bad_input_is_one_line_errors(call, match):
    with pytest.raises(KnotLedgerError, match=match) as info:
        call()
    assert "\n" not in str(info.value)


# ---------------------------------------------------------------------- canonical augmentation
def _relabelled(tw, rng):
    """The same shadow with crossings renumbered and their slots rotated at random."""
    n = len(tw) // 4
    perm = list(range(n))
    rng.shuffle(perm)
    rot = [rng.randrange(4) for _ in range(n)]

    def f(h):
        return 4 * perm[h >> 2] + (((h & 3) + rot[h >> 2]) & 3)

    out = [0] * len(tw)
    for h, g in enumerate(tw):
        out[f(h)] = f(g)
    return out


def _reflected(tw):
    """The mirror-image map (every rotation reversed): the same shadow up to homeomorphism."""
    return [4 * (g >> 2) + ((-(g & 3)) & 3) for g in (tw[4 * (h >> 2) + ((-(h & 3)) & 3)] for h in range(len(tw)))]


def test_shadow_code_names_the_shadow_up_to_homeomorphism():
    import random
    from pipeline.diagrams.shadow import twins
    from pipeline.diagrams.shadow_canonical import shadow_code
    rng = random.Random(3)
    for n in range(3, 26, 2):
        tw = twins(alt.random_diagram(n, seed=n))
        code, starts = shadow_code(tw)
        for _ in range(3):
            other = _relabelled(tw, rng)
            c2, s2 = shadow_code(other)
            assert c2 == code and len(s2) == len(starts)         # |Aut| does not depend on labels
        assert shadow_code(_reflected(tw))[0] == code


def test_smoothing_the_added_crossing_gives_the_parent_back():
    from pipeline.diagrams.shadow import extensions, twins
    from pipeline.diagrams.shadow_canonical import NEW_SMOOTHING, smoothing
    for n in (3, 6, 9):
        tw = twins(alt.random_diagram(n, seed=1))
        for new in extensions(tw):
            assert smoothing(new, n, NEW_SMOOTHING) == tw


def _levels_slow(top):
    """Every prime reduced shadow up to ``top`` crossings, level by level: all extensions
    of the level below, deduplicated by their shadow code (the obviously complete route)."""
    from pipeline.diagrams.shadow import extensions, prime_reduced
    from pipeline.diagrams.shadow_canonical import shadow_code
    level = {shadow_code(alt._hopf())[0]: alt._hopf()}
    out = {2: set(level)}
    for n in range(3, top + 1):
        nxt = {}
        for tw in level.values():
            for new in extensions(tw):
                if prime_reduced(new):
                    nxt.setdefault(shadow_code(new)[0], new)
        out[n] = set(nxt)
        level = nxt
    return out


def test_canonical_augmentation_yields_every_shadow_exactly_once():
    slow = _levels_slow(8)
    for n in range(2, 9):
        got = [code for _, code in alt._shadows(n)]
        assert len(got) == len(set(got))                         # no shadow twice
        assert set(got) == slow[n], n                             # and none missing


def test_knots_of_the_link_run_are_the_knots_run():
    # links=True walks all last-level shadows once; its knots must be the knots-only run's
    for n in range(2, 8):
        alt._CACHE.clear()
        both = alt.codes(n, links=True)
        alt._CACHE.clear()
        knots = alt.codes(n)
        assert both[:len(knots)] == knots and len(set(both)) == len(both)
        assert all(diagram_of_code(c).n_components > 1 for c in both[len(knots):])
