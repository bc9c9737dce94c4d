"""Census spec: keys, errors with line numbers, and the deterministic work list."""

from __future__ import annotations

import json
from math import gcd
from pathlib import Path

import pytest

from pipeline.cli import main as cli_main
from pipeline.errors import SpecError
from pipeline.diagrams.notation import parse
from pipeline.census.spec import (braid_components, count_items, iter_chunks, iter_items, load_spec,
                           parse_spec, pretzel_is_knot)


def _spec(tmp_path: Path, text: str) -> Path:
    p = tmp_path / "census.toml"
    p.write_text(text)
    return p


def test_torus_family_enumerates_p_then_q_and_skips_zero():
    spec = parse_spec('[[family]]\nkind = "torus"\np = [-1, 2]\nq = [0, 2]\n')
    items = list(iter_items(spec))
    assert [i.notation for i in items] == ["torus:-1,1", "torus:-1,2", "torus:1,1", "torus:1,2",
                                           "torus:2,1", "torus:2,2"]
    assert [i.row_id for i in items] == list(range(6))
    assert json.loads(items[1].params) == {"p": -1, "q": 2}


def test_two_bridge_family_has_every_coprime_beta():
    # every β with 0 < β < α, gcd(α, β) = 1 (README.md "Spec file"): Euler's φ(α) rows per α
    spec = parse_spec('[[family]]\nkind = "two_bridge"\nalpha = [3, 30]\n')
    items = list(iter_items(spec))
    phi = lambda a: sum(1 for b in range(1, a) if gcd(a, b) == 1)  # noqa: E731
    assert len(items) == sum(phi(a) for a in range(3, 31))
    assert items[0].notation == "rational:3/1" and json.loads(items[0].params) == {"alpha": 3, "beta": 1}
    assert all(gcd(*json.loads(i.params).values()) == 1 for i in items)


def test_pretzel_family_ordered_tuples_zero_only_when_asked():
    spec = parse_spec('[[family]]\nkind = "pretzel"\nlength = 2\nentries = [-1, 1]\n')
    assert [i.notation for i in iter_items(spec)] == ["pretzel:-1,-1", "pretzel:-1,1",
                                                     "pretzel:1,-1", "pretzel:1,1"]
    spec = parse_spec('[[family]]\nkind = "pretzel"\nlength = 2\nentries = [0, 1]\nzero = true\n')
    items = list(iter_items(spec))
    assert len(items) == 4 and json.loads(items[1].params) == {"p1": 0, "p2": 1}


def test_pretzel_knot_rule_matches_components():
    # P(p1..pk) is a knot iff exactly one p_i is even, or k and all p_i are odd
    # (SOURCES.md §3, common practice); checked against the built diagrams.
    import itertools
    for k in (1, 2, 3):
        for t in itertools.product([-3, -2, -1, 0, 1, 2, 3], repeat=k):
            d = parse("pretzel:" + ",".join(map(str, t)))
            assert pretzel_is_knot(t) == (d.n_components == 1), t


def test_braid_component_count_matches_closure():
    import random
    rng = random.Random(7)
    for _ in range(200):
        word = [rng.choice([1, -1, 2, -2, 3, -3]) for _ in range(rng.randint(1, 9))]
        assert braid_components(word) == parse("braid:" + ",".join(map(str, word))).n_components


def test_knots_only_decided_from_parameters():
    text = ('[census]\nknots_only = true\n'
            '[[family]]\nkind = "torus"\np = [2, 4]\nq = [2, 6]\n'
            '[[family]]\nkind = "two_bridge"\nalpha = [2, 9]\n'
            '[[family]]\nkind = "pretzel"\nlength = 3\nentries = [-2, 2]\n'
            '[[family]]\nkind = "braid"\nword = "1^a 2^b"\na = [1, 3]\nb = [1, 3]\n')
    items = list(iter_items(parse_spec(text)))
    assert items and all(parse(i.notation).n_components == 1 for i in items)
    # nothing that is a knot was dropped: torus knots with gcd 1 in the range
    torus = [i for i in items if i.family == "torus"]
    assert len(torus) == sum(1 for p in range(2, 5) for q in range(2, 7) if gcd(p, q) == 1)


def test_braid_template_exponents_letters_and_integers():
    spec = parse_spec('[[family]]\nkind = "braid"\nword = "1^a -2^b 1^2 2^-1"\na = [1, 2]\nb = 1\n')
    items = list(iter_items(spec))
    assert [i.notation for i in items] == ["braid:1,-2,1,1,-2", "braid:1,1,-2,1,1,-2"]
    assert json.loads(items[0].params) == {"a": 1, "b": 1}


def test_montesinos_tangles_and_length_fractions():
    spec = parse_spec('[[family]]\nkind = "montesinos"\ntangles = ["1/3", ["1/2", "-1/2"], 2]\n')
    items = list(iter_items(spec))
    assert [i.notation for i in items] == ["montesinos:1/3,1/2,2", "montesinos:1/3,-1/2,2"]
    assert json.loads(items[0].params) == {"t1": "1/3", "t2": "1/2", "t3": "2"}
    spec = parse_spec('[[family]]\nkind = "montesinos"\nlength = 2\nfractions = ["1/3", "2/5"]\n')
    assert count_items(spec) == 4


def test_file_families_csv_jsonl_text(tmp_path):
    (tmp_path / "a.csv").write_text('diagram,page\n"torus:2,3",12\n,13\n"torus:2,5",14,extra\n')
    (tmp_path / "b.jsonl").write_text('{"diagram": "conway:2 2", "who": "x"}\nnot json\n\n{"page": 3}\n')
    (tmp_path / "c.txt").write_text("# comment\nrational:5/2\n\nbraid:1,1,1\n")
    path = _spec(tmp_path, '[[family]]\nkind = "file"\npath = "a.csv"\n'
                           '[[family]]\nkind = "file"\npath = "b.jsonl"\n'
                           '[[family]]\nkind = "file"\npath = "c.txt"\n')
    items = list(iter_items(load_spec(path)))
    assert [(i.notation, i.source, i.error is None) for i in items] == [
        ("torus:2,3", "a.csv:2", True), ("", "a.csv:3", False), ("torus:2,5,14,extra", "a.csv:4", False),
        ("conway:2 2", "b.jsonl:1", True), ("not json", "b.jsonl:2", False), ('{"page": 3}', "b.jsonl:4", False),
        ("rational:5/2", "c.txt:2", True), ("braid:1,1,1", "c.txt:4", True)]
    assert json.loads(items[0].labels) == {"page": "12"}
    assert json.loads(items[3].labels) == {"who": "x"}
    assert "empty 'diagram' cell" in items[1].error


def test_work_list_is_deterministic_and_chunked():
    text = '[census]\nchunk_size = 7\n[[family]]\nkind = "two_bridge"\nalpha = [3, 20]\n'
    a = [(j, [i.notation for i in items]) for j, items in iter_chunks(parse_spec(text))]
    # the order itself is checked against a hand-written product in tests/test_worklist.py;
    # here the chunks must cut the unchunked list into consecutive slices of 7
    flat = [i.notation for i in iter_items(parse_spec(text))]
    assert [n for _, c in a for n in c] == flat and len(flat) == count_items(parse_spec(text))
    assert all(len(c) == 7 for _, c in a[:-1]) and [j for j, _ in a] == list(range(len(a)))


BAD_SPECS = [
    ("unknown-census-key", '[census]\nname = "x"\nmax_modulo = 5\n[[family]]\nkind = "torus"\np = 2\nq = 3\n',
     r"line 3: unknown key 'max_modulo'"),
    ("unknown-family-key", '[[family]]\nkind = "torus"\np = 2\nr = 3\nq = 3\n', r"line 4: unknown key 'r'"),
    ("ill-typed-range", '[[family]]\nkind = "pretzel"\nlength = 3\nentries = "1..3"\n',
     r"line 4: entries = '1..3' must be an inclusive range"),
    ("ill-typed-bool", '[[family]]\nkind = "pretzel"\nlength = 2\nentries = [1, 3]\nzero = 1\n', r"line 5: zero = 1"),
    ("empty-range", '[[family]]\nkind = "torus"\np = [5, 2]\nq = 3\n', r"line 3: p = \[5, 2\] is empty"),
    ("unknown-kind", '[[family]]\nkind = "knotty"\n', r"line 2: unknown family kind 'knotty'"),
    ("missing-key", '[[family]]\nkind = "two_bridge"\n', r"needs alpha"),
    ("braid-letter-undeclared", '[[family]]\nkind = "braid"\nword = "1^a"\n', r"uses 'a' but gives no range"),
    ("braid-bad-token", '[[family]]\nkind = "braid"\nword = "0^2"\n', r"token '0\^2'"),
    ("bad-fraction", '[[family]]\nkind = "montesinos"\ntangles = ["1/x"]\n', r"'1/x' is not a fraction"),
    ("no-family", '[census]\nname = "x"\n', r"no \[\[family\]\] tables"),
    ("bad-toml", '[census\n', r"not valid TOML"),
    ("chunk-size-type", '[census]\nchunk_size = 2.5\n[[family]]\nkind = "torus"\np = 2\nq = 3\n',
     r"line 2: chunk_size = 2.5 must be an int"),
    ("missing-file", '[[family]]\nkind = "file"\npath = "nope.csv"\n', r"line 3: input file 'nope.csv' not found"),
]


@pytest.mark.parametrize("text,match", [b[1:] for b in BAD_SPECS], ids=[b[0] for b in BAD_SPECS])
def test_bad_spec_raises_spec_error_naming_key_and_line(tmp_path, text, match):
    with pytest.raises(SpecError, match=match):
        load_spec(_spec(tmp_path, text))


def test_bad_spec_exits_2_with_one_line(tmp_path, capsys):
    path = _spec(tmp_path, '[[family]]\nkind = "torus"\np = 2\nqq = 3\n')
    assert cli_main(["run", str(path), "--out", str(tmp_path / "out")]) == 2
    err = capsys.readouterr().err.strip()
    assert len(err.splitlines()) == 1 and "'qq'" in err and "line 4" in err
    assert not (tmp_path / "out").exists()


def test_csv_without_diagram_column_is_a_spec_error(tmp_path):
    (tmp_path / "x.csv").write_text("notation\ntorus:2,3\n")
    with pytest.raises(SpecError, match="no column 'diagram'"):
        load_spec(_spec(tmp_path, '[[family]]\nkind = "file"\npath = "x.csv"\n'))


def test_montesinos_tangles_with_signed_or_padded_denominators_are_accepted(tmp_path, capsys):
    # montesinos:1/-3 is valid notation (the tangle -1/3 written with the sign below);
    # the spec must hand it on instead of failing on Fraction("1/-3").  The parser is the
    # outside check: the notation each row carries builds a diagram with the crossings of
    # the tangles |β| (continued-fraction length) summed: 1/-3 -> 3, 1/05 -> 5, 1/3 -> 3.
    spec = parse_spec('[[family]]\nkind = "montesinos"\ntangles = ["1/-3", "1/05", "-1/-3"]\n')
    (item,) = iter_items(spec)
    assert item.notation == "montesinos:1/-3,1/05,-1/-3"
    assert parse(item.notation).n_crossings == 3 + 5 + 3
    path = _spec(tmp_path, '[[family]]\nkind = "montesinos"\ntangles = ["1/-3", "2/5", "1/3"]\n')
    assert count_items(load_spec(path)) == 1


@pytest.mark.parametrize("tok", ["1/0", "3/-0", "2/ 00"])
def test_montesinos_denominator_zero_is_refused_by_value(tok):
    with pytest.raises(SpecError, match="denominator 0"):
        parse_spec(f'[[family]]\nkind = "montesinos"\ntangles = ["{tok}", "1/3"]\n')


def test_montesinos_bad_tangle_in_cli_is_one_line_exit_2(tmp_path, capsys):
    path = _spec(tmp_path, '[[family]]\nkind = "montesinos"\ntangles = ["1/-0", "1/3"]\n')
    assert cli_main(["run", str(path), "--out", str(tmp_path / "o")]) == 2
    err = capsys.readouterr().err
    assert err.count("\n") == 1 and "denominator 0" in err and "Traceback" not in err
