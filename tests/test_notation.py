"""Notations (README.md contract): parsing, handedness pins, round trips, bad input."""

from __future__ import annotations

import random

import pytest
from hypothesis import given, settings, strategies as st

from pipeline import parse
from pipeline.errors import NotationError
from pipeline.invariants.poly import Laurent
from slow_routes import state_sum_jones

POSITIVE_TREFOIL = Laurent.from_exponents([(1, 1), (3, 1), (4, -1)])  # README.md: V = t + t³ − t⁴


# Handedness pins of README.md, each checked with the Jones polynomial (chirality-sensitive),
# computed by the all-states Kauffman sum (Kauffman, Topology 26 (1987)).
@pytest.mark.parametrize("text", ["torus:2,3", "conway:3", "rational:3/1", "braid:1,1,1",
                                  "pd:[[1,5,2,4],[3,1,4,6],[5,3,6,2]]", "pretzel:1,2", "dt:4 6 2"])
def test_positive_trefoil_pins(text):
    assert state_sum_jones(parse(text)) == POSITIVE_TREFOIL


@pytest.mark.parametrize("text", ["torus:-2,3", "torus:2,-3", "rational:3/-1", "conway:-3",
                                  "pretzel:-1,-2", "dt:-4 -6 -2", "montesinos:3"])
def test_negative_trefoil(text):
    assert state_sum_jones(parse(text)) == POSITIVE_TREFOIL.invert()


def test_pretzel_minus2_3_3_is_torus_3_4():
    # README.md pin; SOURCES.md item 5: P(−2,3,3) = T(3,4) *(memory: Burde–Zieschang ch. 12)*
    assert state_sum_jones(parse("pretzel:-2,3,3")) == state_sum_jones(parse("torus:3,4"))


@pytest.mark.parametrize("p,q", [(1, 2), (2, 3), (3, 2), (1, 4), (-1, 4), (2, -5), (3, 3)])
def test_two_column_pretzel_is_torus_2_n(p, q):
    # SOURCES.md item 5: P(p,q) is T(2,p+q)
    assert state_sum_jones(parse(f"pretzel:{p},{q}")) == state_sum_jones(parse(f"torus:2,{p + q}"))


@pytest.mark.parametrize("entries", ["3,5,7", "-2,3,3", "2,-3,1", "1,1,1,1"])
def test_pretzel_is_montesinos_of_reciprocals(entries):
    # README.md notation table: pretzel:p1,...,pk is montesinos:1/p1,...,1/pk
    ps = entries.split(",")
    assert parse("pretzel:" + entries) == parse("montesinos:" + ",".join(f"1/{p}" for p in ps))


@pytest.mark.parametrize("a", [3, 5, 7, 9])
def test_rational_a_over_1_is_torus_2_a(a):
    # README.md: rational:a/1 is torus:2,a (knots; for even a the two are the same unoriented
    # link but the diagrams may orient the components differently, which changes Jones)
    assert state_sum_jones(parse(f"rational:{a}/1")) == state_sum_jones(parse(f"torus:2,{a}"))


@pytest.mark.parametrize("alpha,beta", [(5, 2), (7, 2), (7, 3), (9, 2), (11, 3)])
def test_rational_negative_beta_is_mirror(alpha, beta):
    # SOURCES.md item 1: the mirror of b(α,β) is b(α,−β) (Schubert 1956)
    v = state_sum_jones(parse(f"rational:{alpha}/{beta}"))
    assert state_sum_jones(parse(f"rational:{alpha}/{-beta}")) == v.invert()


@pytest.mark.parametrize("terms,frac", [("3 2", "7/2"), ("2 2", "5/2"), ("3 1 2", "11/4"), ("2 1 1 2", "13/5")])
def test_conway_equals_rational_of_its_fraction(terms, frac):
    # SOURCES.md item 2: [a1..an] is b(α,β) with α/β = a1 + 1/(a2 + ...) (Conway 1970)
    assert state_sum_jones(parse("conway:" + terms)) == state_sum_jones(parse("rational:" + frac))


def test_torus_negative_parameter_mirrors():
    d = parse("torus:3,4")
    assert parse("torus:-3,4").writhe == -d.writhe == parse("torus:3,-4").writhe
    assert parse("torus:-3,-4").writhe == d.writhe


def test_free_loops_from_braid_and_pd():
    d = parse("braid:2")          # σ2 on three strands: strand 1 never crosses
    assert d.free_loops == 1 and d.n_components == 2
    assert parse("pd:[] loops=1").n_components == 1
    assert parse("torus:1,5").n_crossings == 0


ALL_EXAMPLES = ["pd:[[1,5,2,4],[3,1,4,6],[5,3,6,2]]", "dt:4 6 8 2", "braid:1,-2,1,-2", "torus:3,5",
                "torus:4,6", "pretzel:3,-5,7", "pretzel:2,0,3", "rational:13/5", "conway:2 1 1 2",
                "montesinos:1/3,2/5,-1/2", "montesinos:1/2,1/2,2", "braid:1,1", "braid:2"]


@pytest.mark.parametrize("text", ALL_EXAMPLES)
def test_every_notation_round_trips_through_pd(text):
    d = parse(text)
    again = parse(d.to_notation())
    assert again == d
    assert again.to_notation() == d.to_notation()


BAD = {
    "no-kind": ("3,4", "no KIND"),
    "unknown-kind": ("knot:3_1", "unknown kind 'knot'"),
    "pd-not-json": ("pd:[[1,2,3,4]", "not a JSON"),
    "pd-short": ("pd:[[1,2,3]]", "has 3 labels"),
    "pd-label-thrice": ("pd:[[1,1,2,2],[1,3,4,4]]", "appears 3 times"),
    "pd-zero": ("pd:[[0,1,1,2]]", "not positive"),
    "pd-empty": ("pd:[]", "empty"),
    "pd-float": ("pd:[[1.5,5,2,4],[3,1,4,6],[5,3,6,2]]", "not an integer"),
    "pd-virtual": ("pd:[[1,4,2,5],[3,1,4,6],[5,3,6,2]]", "not planar"),
    "pd-orientation": ("pd:[[2,5,1,4],[3,1,4,6],[5,3,6,2]]", "orientation"),
    "braid-zero": ("braid:1,0,1", "generator 0"),
    "braid-word": ("braid:a,b", "'a' is not an integer"),
    "torus-one": ("torus:3", "two parameters"),
    "torus-zero": ("torus:0,3", "= 0"),
    "rational-coprime": ("rational:6/4", "coprime"),
    "rational-form": ("rational:7", "α/β"),
    "rational-alpha": ("rational:-3/1", "positive"),
    "conway-empty": ("conway:", "no arguments"),
    "montesinos-den0": ("montesinos:1/0", "denominator 0"),
    "montesinos-junk": ("montesinos:1/3,x", "'x'"),
    "dt-odd": ("dt:4 5 2", "even"),
    "dt-repeat": ("dt:4 4 2", "repeated"),
    "dt-big": ("dt:4 6 20", "exceeds"),
    "dt-nonplanar": ("dt:4 6 8 10 2", "no planar realisation"),
    "huge": ("torus:1000,1000", "limit"),
}


@pytest.mark.parametrize("text,match", list(BAD.values()), ids=list(BAD))
def test_bad_input_raises_one_line_notation_error(text, match):
    with pytest.raises(NotationError, match=match) as info:
        parse(text)
    assert "\n" not in str(info.value)


@settings(max_examples=300, deadline=None)
@given(st.text(max_size=40))
def test_fuzzed_strings_raise_only_notation_error(text):
    for candidate in (text, "pd:" + text, "braid:" + text, "montesinos:" + text, "dt:" + text,
                      "rational:" + text, "pretzel:" + text):
        try:
            parse(candidate)
        except NotationError as err:
            assert "\n" not in str(err)


def test_random_pd_mutations_raise_only_notation_error():
    rng = random.Random(7)
    base = [list(x) for x in parse("pretzel:3,-2,5").pd]
    for _ in range(300):
        pd = [row[:] for row in base]
        i, j = rng.randrange(len(pd)), rng.randrange(4)
        pd[i][j] = rng.choice([pd[rng.randrange(len(pd))][rng.randrange(4)], 0, -1, 99])
        try:
            parse("pd:" + str(pd))
        except NotationError:
            pass


# ---------------------------------------------------------------- the typed Notation value
from fractions import Fraction  # noqa: E402

from pipeline.diagrams.notation import Notation, parse_notation  # noqa: E402
from pipeline.invariants.jones import bracket_of_notation  # noqa: E402


@pytest.mark.parametrize("text,kind,args", [
    ("torus:2,-3", "torus", (2, -3)), ("rational: 7 / 3 ", "rational", (7, 3)),
    ("conway:2 1 2", "conway", (2, 1, 2)), ("pretzel:-2,3,3", "pretzel", (-2, 3, 3)),
    ("montesinos:1/3, -2, 2/-5", "montesinos", (Fraction(1, 3), Fraction(-2), Fraction(-2, 5))),
    ("braid:1,-2", "braid", (1, -2)), ("DT:4 6 2", "dt", (4, 6, 2)),
    ("pd:[[1,1,2,2]] loops=2", "pd", (((1, 1, 2, 2),), 2))])
def test_parse_notation_reads_the_numbers(text, kind, args):
    n = parse_notation(text)
    assert n == Notation(kind, args)
    assert n.diagram() == parse(text)          # the same diagram as the string route


@pytest.mark.parametrize("text", ["torus:2", "rational:3", "montesinos:", "montesinos:1/0",
                                  "pd:[[1,2,3]]", "braid:x", "dt:4 6 3", "pd:{}", "pd:[[1,2,1,2]]"])
def test_parse_and_parse_notation_refuse_the_same_way(text):
    with pytest.raises(NotationError) as a:
        parse(text)
    with pytest.raises(NotationError) as b:
        parse_notation(text).diagram()     # either step may refuse; the message is parse's
    assert str(b.value) == str(a.value)


@pytest.mark.parametrize("text", ["conway:2 1 2", "rational:13/5", "pretzel:2,-3,5",
                                  "montesinos:1/3,2/5,-1/2", "torus:2,5", "pd:[[1,1,2,2]]"])
def test_fast_bracket_takes_the_typed_value(text):
    assert bracket_of_notation(parse_notation(text)) == bracket_of_notation(text)
