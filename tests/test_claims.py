"""knotledger check: the safe expression language and claims over a census."""

from __future__ import annotations

import json
from pathlib import Path

import pytest

from _census_fixture import shared_census
from pipeline.explore import claims as claims_mod
from pipeline.census.reader import open_census
from pipeline.explore.claims import check_claim
from pipeline.cli import main as cli
from pipeline.errors import ClaimError
from pipeline.explore.safe_expr import Null, compile_expression


@pytest.fixture(scope="module")
def census(tmp_path_factory) -> Path:
    return shared_census(tmp_path_factory)


class Env:
    """A bare row environment for language tests."""

    def __init__(self, **values):
        self.values = values

    def value(self, name):
        v = self.values.get(name)
        if v is None:
            raise Null()
        return v

    def call(self, fname, args):
        raise AssertionError("no row functions here")


# ------------------------------------------------------------------ refused constructs
REFUSED = {
    "attribute": ("determinant.bit_length()", "attribute access"),
    "attribute-escape": ("p.__class__.__mro__", "attribute access|dunder"),
    "import-statement": ("import os", "import statement"),
    "from-import": ("from os import system", "import statement"),
    "dunder-import": ("__import__('os')", "dunder name"),
    "dunder-import-attribute": ("__import__('os').system('true')", "dunder name|attribute access"),
    "dunder-name": ("__builtins__", "dunder name"),
    "lambda": ("(lambda x: x)(1) == 1", "lambda"),
    "list-comprehension": ("[x for x in factors] == []", "comprehension"),
    "generator": ("sum(x for x in factors) == 0", "comprehension"),
    "dict-comprehension": ("{x: 1 for x in factors}", "comprehension"),
    "subscript": ("factors[0] == 3", "subscript"),
    "fstring": ("f'{p}' == '3'", "f-string"),
    "walrus": ("(x := 3) == 3", "assignment expression"),
    "starred": ("max(*factors) == 3", "starred"),
    "keyword": ("max(1, 2, key=abs) == 2", "keyword argument"),
    "unlisted-call": ("eval('1') == 1", "call of 'eval'"),
    "open": ("open('/etc/passwd') == 1", "call of 'open'"),
    "assignment": ("p = 3", "assignment"),
    "float": ("determinant == 1.5", "float literal"),
    "bitshift": ("1 << 100 == 0", "operator <<"),
    "is": ("p is 3", "operator is"),
    "set": ("{1, 2} == 0", "set literal"),
}


@pytest.mark.parametrize("text,why", REFUSED.values(), ids=REFUSED.keys())
def test_refused_constructs_name_the_construct(text, why):
    with pytest.raises(ClaimError, match=why):
        compile_expression(text)


@pytest.mark.parametrize("text", [v[0] for v in REFUSED.values()], ids=REFUSED.keys())
def test_refused_claim_never_opens_the_census(text, monkeypatch, tmp_path):
    def boom(*a, **k):
        raise AssertionError("census opened for a refused claim")
    monkeypatch.setattr(claims_mod, "open_census", boom)
    with pytest.raises(ClaimError):
        check_claim(tmp_path, text)


def test_refused_claim_via_cli_is_one_line_exit_2(census, capsys):
    assert cli(["check", str(census), "--claim", "determinant.real == 1"]) == 2
    err = capsys.readouterr().err
    assert err.count("\n") == 1 and "attribute access" in err


# ------------------------------------------------------------------ the language itself
def test_exact_big_integer_arithmetic():
    big = 10 ** 83 + 1
    e = compile_expression("determinant * determinant - 1 == (determinant - 1) * (determinant + 1)")
    assert e.evaluate(Env(determinant=big)) is True
    assert compile_expression("1/3 + 1/6 == 1/2").evaluate(Env()) is True  # exact fractions
    assert compile_expression("2 ** 200 % 1000 == 376").evaluate(Env()) is True  # 2^200 = ...376


def test_exponent_is_bounded():
    with pytest.raises(ClaimError, match="exponent"):
        compile_expression("2 ** 100000 > 0").evaluate(Env())


def test_chained_comparisons_boolean_and_if():
    e = compile_expression("0 < p < q and not (p == q) and (1 if odd(p) else 2) == 1")
    assert e.evaluate(Env(p=3, q=5)) is True
    assert e.evaluate(Env(p=5, q=3)) is False


def test_functions_gcd_divides_is_prime_mod():
    e = compile_expression("gcd(12, 18) == 6 and lcm(4, 6) == 12 and divides(7, 21) and not divides(0, 5)"
                           " and is_prime(101) and not is_prime(91) and mod(-1, 7) == 6 and min(factors) == 3")
    assert e.evaluate(Env(factors=(3, 9))) is True


def test_null_makes_the_row_undecided_but_short_circuit_does_not():
    e = compile_expression("signature == 0")
    with pytest.raises(Null):
        e.evaluate(Env(signature=None))
    assert compile_expression("p == 1 or signature == 0").evaluate(Env(p=1, signature=None)) is True


def test_unknown_name_is_an_error(census):
    with pytest.raises(ClaimError, match="unknown name 'nonsense'"):
        check_claim(census, "nonsense == 1")


# ------------------------------------------------------------------ claims on the census
def test_two_bridge_determinant_is_alpha_on_whole_family(census):
    # det b(alpha, beta) = alpha -- H. Schubert, Math. Z. 65 (1956)
    r = check_claim(census, "determinant == alpha", family="two_bridge")
    assert r.selected > 50 and r.held == r.selected and r.n_counterexamples == 0 and r.exit_code == 0


def test_pretzel_determinant_formula_holds_on_whole_family(census):
    # det P(p1,p2,p3) = |p1p2 + p2p3 + p1p3| *(memory: Kawauchi, survey monograph, 1996)*
    r = check_claim(census, "determinant == abs(p1*p2 + p2*p3 + p1*p3)", family="pretzel")
    assert r.selected > 100 and r.held == r.selected and r.exit_code == 0


def test_torus_knot_determinant_rule(census):
    # det T(p,q) = 1 if p, q both odd, else the odd one (knots) -- Rolfsen, Knots and Links, ch. 7
    r = check_claim(census, "determinant == (1 if odd(p) and odd(q) else (q if even(p) else p))",
                    family="torus", where="gcd(p, q) == 1")
    assert r.selected > 10 and r.held == r.selected


def test_prime_colourability_iff_prime_divides_determinant(census):
    # nontrivially p-colourable iff p | det (p prime) -- Fox 1962; README.md "Colourings"
    for p in (3, 5, 7, 11):
        r = check_claim(census, f"colorable({p}) == (determinant % {p} == 0)")
        assert r.held == r.selected > 100, p


def test_planted_false_claim_is_caught_with_the_right_counterexample(census, capsys):
    # Planted: "every 3-pretzel has determinant = |p1 + p2 + p3|".  P(1,1,1) = T(2,3), det 3,
    # fits it by accident, but P(3,3,-3) has det 9 (invariant factors (3,3), Kawauchi (memory))
    # while |3+3-3| = 3, so it must be listed.
    r = check_claim(census, "determinant == abs(p1 + p2 + p3)", family="pretzel", limit=10_000)
    assert r.exit_code == 1 and r.n_counterexamples > 0
    bad = {tuple(c["params"][k] for k in ("p1", "p2", "p3")): c for c in r.counterexamples}
    assert (3, 3, -3) in bad
    assert bad[(3, 3, -3)]["values"]["determinant"] == 9
    assert bad[(3, 3, -3)]["notation"] in ("pretzel:3,3,-3",) or bad[(3, 3, -3)]["notation"].startswith("pd:")
    # every listed counterexample really violates the planted claim, every held row obeys it
    for (a, b, c), row in bad.items():
        assert row["values"]["determinant"] != abs(a + b + c)
    rc = cli(["check", str(census), "--family", "pretzel", "--claim", "determinant == abs(p1 + p2 + p3)", "--limit", "1000"])
    out = capsys.readouterr().out
    assert rc == 1 and "counterexamples:" in out and "pretzel:3,3,-3" in out


def test_planted_off_by_one_caught_exactly_where_planted(census):
    r = check_claim(census, "determinant == alpha + (1 if alpha == 13 and beta == 5 else 0)",
                    family="two_bridge")
    assert r.n_counterexamples == 1
    (c,) = r.counterexamples
    assert c["params"] == {"alpha": 13, "beta": 5} and c["values"]["determinant"] == 13


def test_no_row_selected_exits_2(census):
    assert check_claim(census, "1 == 1", family="no_such_family").exit_code == 2
    assert check_claim(census, "1 == 1", where="crossings < 0").exit_code == 2


def test_undecided_rows_are_counted(census):
    c = open_census(census)
    mods = set(int(m) for m in c.colorings["modulus"])
    beyond = max(mods) + 2
    r = check_claim(census, f"colorable({beyond}) or True", family="torus")
    assert r.undecided == r.selected and r.exit_code == 2


def test_where_filter_matches_pandas(census):
    c = open_census(census)
    knots = c.diagrams[(c.diagrams["family"] == "pretzel") & (c.diagrams["components"] == 1)]
    r = check_claim(census, "odd(determinant)", family="pretzel", where="components == 1")
    # det is odd for a knot -- common practice
    assert r.selected == len(knots) and r.held == r.selected


def test_factors_list_and_in(census):
    r = check_claim(census, "(9 in factors) == (colorings(9) > 9 * colorings(3) / 3)",
                    family="pretzel", where="components == 1")
    assert r.selected > 0 and r.exit_code in (0, 1)
    # P(3,3,-3): invariant factors (3, 3) -- Kawauchi (memory); 27 three-colourings
    r = check_claim(census, "factors == (3, 3) and colorings(3) == 27", family="pretzel",
                    where="p1 == 3 and p2 == 3 and p3 == -3")
    assert r.selected == 1 and r.held == 1


def _tiny_census(tmp_path: Path, rows: list[dict]) -> Path:
    """A hand-made census directory (two diagrams rows) for the int64-overflow path."""
    import pyarrow as pa
    import pyarrow.parquet as pq
    out = tmp_path / "tiny"
    schema = pa.schema([("row_id", pa.int64()), ("family", pa.string()), ("params", pa.string()),
                        ("notation", pa.string()), ("determinant", pa.int64()),
                        ("determinant_text", pa.string()), ("invariant_factors", pa.list_(pa.string()))])
    for t in ("diagrams", "colorings", "knots", "rejects"):
        (out / t).mkdir(parents=True)
    part = out / "diagrams" / "part-c00000000.parquet"
    pq.write_table(pa.Table.from_pylist(rows, schema=schema), part)
    # readers read only what a manifest commits (pipeline.census.reader.table_files)
    manifest = {"chunks": {"0": {"parts": {"diagrams": {"bytes": part.stat().st_size}}}}}
    (out / "manifest.json").write_text(json.dumps(manifest))
    return out


def test_determinant_beyond_int64_is_read_exactly_from_text(tmp_path):
    # a two-bridge knot b(alpha, 1) with alpha ~ 10^83: int64 column null, exact text beside it
    alpha = 10 ** 83 + 3
    rows = [{"row_id": 0, "family": "two_bridge", "params": json.dumps({"alpha": alpha, "beta": 1}),
             "notation": f"rational:{alpha}/1", "determinant": None, "determinant_text": str(alpha),
             "invariant_factors": [str(alpha)]},
            {"row_id": 1, "family": "two_bridge", "params": json.dumps({"alpha": alpha + 2, "beta": 1}),
             "notation": f"rational:{alpha + 2}/1", "determinant": None, "determinant_text": str(alpha + 1),
             "invariant_factors": [str(alpha + 1)]}]
    census = _tiny_census(tmp_path, rows)
    r = check_claim(census, "determinant == alpha and factors == (alpha,)", family="two_bridge")
    assert r.selected == 2 and r.held == 1 and r.n_counterexamples == 1
    (c,) = r.counterexamples
    assert c["row_id"] == 1 and c["values"]["determinant"] == alpha + 1  # exact, not rounded
    # a float route would lose this: alpha and alpha + 1 are the same double
    assert float(alpha) == float(alpha + 1)


# ------------------------------------------------------------------ randomised: language vs direct arithmetic
from hypothesis import given, settings, strategies as st  # noqa: E402


def _trees():
    leaf = st.one_of(st.integers(-30, 30).map(lambda n: (f"({n})", lambda x, y, n=n: n)),
                     st.just(("x", lambda x, y: x)), st.just(("y", lambda x, y: y)))

    def extend(sub):
        def combine(op, a, b):
            (sa, fa), (sb, fb) = a, b
            fn = {"+": lambda u, v: u + v, "-": lambda u, v: u - v, "*": lambda u, v: u * v,
                  "//": lambda u, v: u // v, "%": lambda u, v: u % v}[op]
            return f"({sa} {op} {sb})", lambda x, y: fn(fa(x, y), fb(x, y))
        return st.builds(combine, st.sampled_from(["+", "-", "*", "//", "%"]), sub, sub)
    return st.recursive(leaf, extend, max_leaves=12)


@settings(max_examples=150, deadline=None)
@given(_trees(), st.integers(-10 ** 30, 10 ** 30), st.integers(-50, 50))
def test_language_arithmetic_matches_direct_integer_arithmetic(tree, x, y):
    text, direct = tree
    try:
        expected = direct(x, y)
    except ZeroDivisionError:
        expected = None  # the language makes a division by zero undecided
    expr = compile_expression(text)
    try:
        got = expr.evaluate(Env(x=x, y=y))
    except Null:
        got = None
    assert got == expected, text


RELATIONS = {
    # |V(-1)| = det, V(1) = 1 for knots -- V. F. R. Jones, Bull. AMS 12 (1985)
    "jones-at-minus-one": "abs(jones_at(-1)) == determinant",
    "jones-at-one": "jones_at(1) == 1",
    # |Delta(-1)| = det, Delta(1) = 1 (Conway-normalised Alexander) -- common practice
    "alexander-at-minus-one": "abs(alexander_at(-1)) == determinant and alexander_at(1) == 1",
    # sigma = 0 mod 4 iff det = 1 mod 4 -- K. Murasugi, Trans. AMS 117 (1965)
    "murasugi": "(signature % 4 == 0) == (determinant % 4 == 1)",
    # det is odd for a knot -- common practice
    "odd-determinant": "odd(determinant)",
}


@pytest.mark.parametrize("claim", RELATIONS.values(), ids=RELATIONS.keys())
def test_published_relations_hold_on_every_knot_of_the_census(census, claim):
    r = check_claim(census, claim, where="components == 1")
    assert r.selected > 100 and r.n_counterexamples == 0 and r.held + r.undecided == r.selected
    assert r.held > 0.9 * r.selected


def test_row_functions_with_a_parameter_as_modulus(census):
    # prime q: nontrivially q-colourable iff q | det (Fox); the modulus is a parameter here,
    # not a literal, so the whole colourings table must be consulted
    r = check_claim(census, "not is_prime(q) or colorable(q) == divides(q, determinant)",
                    family="torus", where="q <= 11")
    assert r.selected > 20 and r.held == r.selected
