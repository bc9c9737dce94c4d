"""Knot keys of alternating diagrams: one type, one key (issue 11).

Checks against the outside:
* counts of prime alternating knots with 3…8 crossings: 1, 1, 2, 3, 7, 18 (J. Hoste,
  M. Thistlethwaite, J. Weeks, "The first 1,701,936 knots", Math. Intelligencer 20, 1998);
* amphichiral prime knots with 3…8 crossings: 0, 1, 0, 1, 0, 5 (4_1; 6_3; 8_3, 8_9, 8_12,
  8_17, 8_18 — Rolfsen's table *(memory)*);
* two-bridge b(α, β) is amphichiral iff β² ≡ −1 (mod α) (H. Schubert, Math. Z. 65, 1956);
* b(α, β) = b(α, β') iff β' ≡ β^{±1} (mod α) (Schubert 1956): the existing normal form
  :func:`two_bridge_nf` is the reference for every PD of a rational diagram;
* the flyping theorem (Menasco–Thistlethwaite 1993) is what makes different diagrams
  (braid, PD, DT, conway, alt:N:I) of one knot get one key; invariants must agree
  within a key (asserted), which is a relation with independent code (Jones, Alexander,
  colourings).
Sources also in tests/SOURCES.md.
"""

from __future__ import annotations

import json
from math import gcd
from pathlib import Path

import pytest

from pipeline import cli
from pipeline.census.run import run_census
from pipeline.census.spec import parse_spec
from pipeline.census.store import read_table
from pipeline.diagrams.notation import parse
from pipeline.errors import SpecError
from pipeline.identify.classify import build_knots_table, knot_key
from pipeline.identify.knots_table import KeyConflictError
from pipeline.identify.normal_forms import connected_sum_nf, split_nf, two_bridge_nf
from pipeline.invariants.all import compute_all


def _row(text: str, d=None, row_id: int = 0, **budgets) -> dict:
    d = d if d is not None else parse(text)
    inv = compute_all(d, max_modulus=5, notation=text)
    row = {**inv, "row_id": row_id, "notation": text, "diagram": d}
    row.update(knot_key(row, **budgets))
    return row


def _pair(row: dict) -> frozenset:
    return frozenset((row["knot_key"], row["mirror_key"]))


def _same_invariants(rows: list[dict]) -> None:
    """Invariants equal within a key (knots: Jones up to nothing; the key names the type)."""
    ref = rows[0]
    for r in rows[1:]:
        assert r["knot_key"] == ref["knot_key"], (r["notation"], ref["notation"])
        assert r["determinant"] == ref["determinant"]
        assert list(r["invariant_factors"]) == list(ref["invariant_factors"])
        if r["components"] == 1:
            assert r["jones"] == ref["jones"] and r["alexander"] == ref["alexander"]


# ---------------------------------------------------------------------- one type, one key
def test_figure_eight_conway_braid_pd_dt_alt_one_key():
    texts = ["conway:2 2", "braid:1,-2,1,-2", "rational:5/2", "dt:4 6 8 2", "alt:4:1"]
    rows = [_row(t) for t in texts]
    f8 = parse("conway:2 2")
    rows += [_row(f8.to_notation(), f8), _row(f8.mirror().to_notation(), f8.mirror())]
    assert {r["knot_key"] for r in rows} == {"2b:5/2"}
    assert all(r["proof"] == "normal form" and r["chirality"] == "amphichiral (normal form)" for r in rows)
    _same_invariants(rows)


@pytest.mark.parametrize("family, others", [
    ("rational:13/5", ["conway:2 1 1 2", "braid:-1,2,2,-1,-1,2", "alt:6:3"]),        # 6_3
    ("rational:7/2", ["conway:3 2", "braid:1,1,1,2,-1,2"]),                           # 5_2
    ("torus:2,5", ["braid:1,1,1,1,1", "alt:5:1", "dt:6 8 10 2 4"]),                  # 5_1
    ("conway:3 1 3", ["rational:15/4"]),                                              # 7_4
])
def test_two_bridge_knots_one_key_whatever_the_notation(family, others):
    ref = _row(family)
    assert ref["proof"] == "normal form"
    for t in others:
        r = _row(t)
        # a DT code and a braid fix the knot up to mirror image only by our choice of
        # picture: the unordered pair {key, mirror key} names the pair of types
        assert _pair(r) == _pair(ref), t
        assert r["proof"] == "normal form" and r["crossing_number"] == ref["crossing_number"]
        d = parse(t)
        pd = _row(d.to_notation(), d)
        assert pd["knot_key"] == r["knot_key"], t


def test_non_two_bridge_alternating_knot_8_18():
    # 8_18 is the closure of (σ1 σ2⁻¹)^4 (Rolfsen's table, braid words *(memory)*); it is
    # not two-bridge (det 45 with invariant factors (3, 15): not cyclic).
    b = _row("braid:1,-2,1,-2,1,-2,1,-2")
    assert b["knot_key"].startswith("alt:") and b["amphichiral"] is True
    assert list(b["invariant_factors"]) == [3, 15]
    alts = [_row(f"alt:8:{i}") for i in range(1, 19)]
    same = [r for r in alts if r["knot_key"] == b["knot_key"]]
    assert len(same) == 1
    _same_invariants([b, same[0]])
    d = parse("braid:1,-2,1,-2,1,-2,1,-2")
    assert _row(d.mirror().to_notation(), d.mirror())["knot_key"] == b["knot_key"]


def test_non_two_bridge_mirror_keys_are_the_keys_of_mirror_diagrams():
    # the chiral non-two-bridge 8-crossing alternating knots: 8_5, 8_10, 8_15, 8_16
    # (Rolfsen's table, memory) -- found by their keys, not by their index in the order
    chiral_alt = [i for i in range(1, 19)
                  if (r := _row(f"alt:8:{i}"))["knot_key"].startswith("alt:")
                  and r["mirror_key"] != r["knot_key"]]
    assert len(chiral_alt) == 4
    for i in chiral_alt:
        r = _row(f"alt:8:{i}")
        m = parse(f"alt:8:{i}").mirror()
        rm = _row(m.to_notation(), m)
        assert rm["knot_key"] == r["mirror_key"] and rm["mirror_key"] == r["knot_key"]
        assert r["chirality"] == "chiral (normal form)" and "Menasco" in r["chirality_reason"]
        assert r["crossing_number"] == 8


def _rational_pds_get_the_schubert_key(lo: int, top: int) -> None:
    for a in range(lo, top + 1):
        for b in range(1, a):
            if gcd(a, b) != 1 or (a > 11 and b in (1, a - 1)):
                continue    # T(2, a) beyond 11 crossings: slow flype orbits (long twist region)
            d = parse(f"rational:{a}/{b}")
            r = knot_key({"notation": d.to_notation(), "components": d.n_components, "diagram": d})
            nf = two_bridge_nf(a, b)
            assert (r["knot_key"], r["mirror_key"]) == (nf.key, nf.mirror_key), (a, b)
            assert r["amphichiral"] == ((b * b + 1) % a == 0)          # Schubert 1956


def test_every_rational_pd_gets_the_schubert_key():
    # keys agree with the existing normal form on every two-bridge member up to α = 13
    _rational_pds_get_the_schubert_key(3, 13)


@pytest.mark.slow
def test_every_rational_pd_gets_the_schubert_key_slow():
    _rational_pds_get_the_schubert_key(14, 21)


def test_composite_and_split_diagrams_key_from_their_summands():
    # 3_1 # 4_1 as a 4-braid: σ1³ on strands 1-2, the figure-eight word on strands 2-4
    r = _row("braid:1,1,1,-2,3,-2,3")
    want = connected_sum_nf([two_bridge_nf(3, 1), two_bridge_nf(5, 2)])
    assert r["prime"] is False and r["proof"] == "normal form"
    assert _pair(r) == frozenset((want.key, want.mirror_key))
    assert r["crossing_number"] == 7            # additivity for reduced alternating summands
    # agrees with the family normal form of the same connected sum
    assert _row("pretzel:3,0,3")["knot_key"] == connected_sum_nf([two_bridge_nf(3, 1)] * 2).key
    s = _row("braid:1,1,1,-3,-3,-3")
    assert s["knot_key"] == split_nf([two_bridge_nf(3, 1), two_bridge_nf(3, -1)]).key
    assert s["prime"] is False


def test_links_hopf_and_torus_2_4():
    assert _row("altlink:2:1")["knot_key"] == "torus:2,2" == _row("torus:2,2")["knot_key"]
    r = _row("altlink:4:1")
    assert _pair(r) == _pair(_row("torus:2,4"))


# ---------------------------------------------------------------------- budgets
def test_budgets_give_fallbacks_never_other_keys():
    # the flype key is the compositional code (no search), so a tiny flype budget changes
    # nothing; a budget that runs out would give a fallback, never another key
    for i in range(1, 19):
        full = _row(f"alt:8:{i}")
        low = _row(f"alt:8:{i}", flype_budget=1)
        assert low["proof"] == "normal form" and low["knot_key"] == full["knot_key"]
    kink = _row("braid:1,1,1,2", simplify_budget=0)
    assert kink["proof"] == "fingerprint only" and "simplify budget 0" in kink["key_reason"]
    assert _row("braid:1,1,1,2")["knot_key"] == "torus:2,3"


def test_bad_crossings_range_is_refused_naming_the_key():
    for bad in ("[0, 5]", "[3, 17]", "[5, 3]", '"x"'):
        with pytest.raises(SpecError) as e:
            parse_spec(f'[[family]]\nkind = "alternating"\ncrossings = {bad}\n')
        assert "crossings" in str(e.value) and "\n" not in str(e.value)
    with pytest.raises(SpecError, match="links"):
        parse_spec('[[family]]\nkind = "alternating"\ncrossings = 3\nlinks = 1\n')


# ---------------------------------------------------------------------- the census
SPEC = """\
[census]
name = "alternating-3-8"
max_modulus = 5
chunk_size = 40
flype_budget = 2000

[[family]]
kind = "alternating"
crossings = [3, 8]
"""


@pytest.fixture(scope="module")
def census(tmp_path_factory) -> Path:
    out = tmp_path_factory.mktemp("alt") / "out"
    run_census(parse_spec(SPEC), out, jobs=1, quiet=True)
    return out


def test_census_counts_proofs_and_amphichirality(census):
    d = read_table(census, "diagrams").to_pandas()
    by_n = d.groupby(d["params"].map(lambda p: json.loads(p)["crossings"]))
    assert [len(g) for _, g in by_n] == [1, 1, 2, 3, 7, 18]           # Hoste-Thistlethwaite-Weeks
    assert set(d["knot_proof"]) == {"normal form"} and set(d["status"]) == {"ok"}
    amph = [int((g["chirality"] == "amphichiral (normal form)").sum()) for _, g in by_n]
    assert amph == [0, 1, 0, 1, 0, 5]                                  # Rolfsen's table (memory)
    assert d["knot_key"].is_unique and d["mirror_key"].notna().all()
    assert d["flype_code"].notna().all() and d["prime"].all()
    assert (d["simplified_crossings"] == d["crossings"]).all() and d["simplified_notation"].isna().all()
    for key, mkey, chir in zip(d["knot_key"], d["mirror_key"], d["chirality"]):
        if key.startswith("2b:"):
            a, b = map(int, key[3:].split("/"))
            assert (chir == "amphichiral (normal form)") == ((b * b + 1) % a == 0)   # Schubert
            assert two_bridge_nf(a, b).mirror_key == mkey
    k = read_table(census, "knots").to_pandas()
    assert len(k) == 32 and set(k["proof"]) == {"normal form"}
    assert (k["crossing_number"] == k["min_crossings_seen"]).all() and k["flype_code"].notna().all()


def test_census_rows_match_typed_in_diagrams(census):
    d = read_table(census, "diagrams").to_pandas()
    rows = []
    for i, (note, key) in enumerate(zip(d["notation"], d["knot_key"])):
        g = parse(note)
        r = _row(g.to_notation(), g, row_id=i)        # the same diagram typed in as a PD
        assert r["knot_key"] == key
        rows.append(r)
    table = build_knots_table(rows)                   # invariants equal within a key (asserted there)
    assert len(table) == len(rows)


def test_report_and_show(census, capsys):
    from pipeline.present.report import build_report
    md, _, _ = build_report(census)
    text = md.read_text()
    assert "| 8 | 18 | 6 | 12 |" in text        # 6 non-two-bridge (flype keys), 12 two-bridge
    assert cli.main(["show", "alt:7:3"]) == 0
    out = capsys.readouterr().out
    assert "knot key   2b:" in out and "Primality: prime" in out
    assert cli.main(["show", "braid:1,1,1,2,-3,2,3", "--json"]) == 0
    obj = json.loads(capsys.readouterr().out)
    assert obj["simplified"]["crossings"] == 3 and obj["simplified"]["smaller"] is True
    assert obj["prime"]["prime"] is True and obj["knot"]["knot_key"] == "torus:2,3"


# ---------------------------------------------------------------------- the knots-table check
def test_knots_table_flype_class_check():
    # the enumeration's row of this chiral pair is the chirality with the smaller ft:
    # code, which is the picture of P(3,3,2) (its mirror P(-3,-3,-2) is keyed apart)
    m = _row("pretzel:3,3,2", row_id=0)
    assert _row("pretzel:-3,-3,-2")["knot_key"] == m["mirror_key"] != m["knot_key"]
    alt = [_row(f"alt:8:{i}", row_id=i) for i in range(1, 19)]
    twin = [r for r in alt if r["flype_code"] == m["flype_code"]]
    # the family row now has the flype key of its class (rule (b′)): one knots row
    assert len(twin) == 1 and m["knot_key"] == twin[0]["knot_key"] and m["knot_key"].startswith("alt:")
    assert m["bs_key"].startswith("mont:") and m["key_rule"] == "alternating"
    (one,) = build_knots_table([m, twin[0]])
    assert one["n_diagrams"] == 2 and one["flype_code"] == m["flype_code"]
    forged = dict(twin[0], knot_key="2b:99/7", mirror_key="2b:99/7", row_id=5)
    with pytest.raises(KeyConflictError, match="share a flype class"):
        build_knots_table([twin[0], {k: v for k, v in forged.items() if k != "diagram"}])
    # one key whose rows carry two flype codes: two types under one key
    other = {**{k: v for k, v in twin[0].items() if k != "diagram"}, "row_id": 7,
             "flype_code": alt[0]["flype_code"]}
    with pytest.raises(KeyConflictError, match="different flype codes"):
        build_knots_table([twin[0], other])


def test_links_option_of_the_family():
    from pipeline.census.spec import iter_items
    spec = parse_spec('[[family]]\nkind = "alternating"\ncrossings = [2, 6]\nlinks = true\n')
    items = list(iter_items(spec))
    links = [it.notation for it in items if it.notation.startswith("altlink:")]
    # prime alternating links with 2, 4, 5, 6 crossings: 1, 1, 1, 5 (Hopf; T(2,4); the
    # Whitehead link; L6a1–L6a5) *(memory: Thistlethwaite's link table)*
    assert [sum(1 for t in links if t.split(":")[1] == str(n)) for n in (2, 3, 4, 5, 6)] == [1, 0, 1, 1, 5]
    assert [json.loads(it.params) for it in items[:2]] == [{"crossings": 2, "index": 1},
                                                           {"crossings": 3, "index": 1}]
    keys = [_row(t)["knot_key"] for t in links]
    assert len(set(keys)) == len(keys)          # distinct types get distinct keys
    assert _row("altlink:6:1")["proof"] == "normal form"
    only = parse_spec('[[family]]\nkind = "alternating"\ncrossings = [2, 6]\nlinks = true\nknots_only = true\n')
    assert all(it.notation.startswith("alt:") for it in iter_items(only))


# ---------------------------------------------------------------------- alternating Montesinos rows
def _dt(d) -> str:
    """The DT code of a knot diagram, read off its PD code (slow and plain).

    Passages are numbered by the incoming edge along the one component (edges are
    numbered consecutively along it, README contract); each crossing is passed once at
    an odd and once at an even number; the even one is negated when it is the over
    passage (C. H. Dowker, M. B. Thistlethwaite, Topology Appl. 16, 1983; the sign
    convention only decides between the knot and its mirror).
    """
    n2 = 2 * len(d.pd)
    pairs = {}
    for a, b, c, e in d.pd:
        over_in = b if e == b % n2 + 1 else e
        pairs[a], pairs[over_in] = (over_in, False), (a, True)     # (partner, partner is over)
    out = []
    for odd in range(1, n2, 2):
        even, even_over = pairs[odd]
        assert even % 2 == 0
        out.append(-even if even_over else even)
    return "dt:" + " ".join(map(str, out))


def _alternating_montesinos(rng):
    """A random Montesinos notation with tangles of one sign (reduced alternating, at
    most 11 crossings) and the same link written with an integer moved between two
    tangles (tangles of both signs: the diagram is not alternating)."""
    from fractions import Fraction
    from pipeline.diagrams.families.two_bridge import continued_fraction
    while True:
        k = rng.choice([3, 3, 4])
        fr = []
        for _ in range(k):
            a = rng.randint(2, 5)
            fr.append(Fraction(rng.choice([b for b in range(1, a) if gcd(a, b) == 1]), a))
        sign = rng.choice([1, -1])
        fr = [sign * f for f in fr]
        if sum(sum(map(abs, continued_fraction(f.numerator, f.denominator))) for f in fr) <= 11:
            break
    m = rng.choice([1, -1])
    mixed = [fr[0] + m, fr[1] - m] + fr[2:]                      # an isotopy (Montesinos)
    return tuple("montesinos:" + ",".join(f"{f.numerator}/{f.denominator}" for f in x) for x in (fr, mixed))


def _pretzel(rng):
    while True:
        sign = rng.choice([1, -1])
        ps = [sign * rng.randint(2, 4) for _ in range(rng.choice([3, 3, 4]))]
        if sum(map(abs, ps)) <= 11:
            return "pretzel:" + ",".join(map(str, ps))


def test_alternating_montesinos_rows_get_the_key_of_the_typed_in_diagram():
    # Flyping theorem (Menasco–Thistlethwaite 1993) for the typed-in PD / DT codes,
    # Bonahon–Siebenmann for the family: the two classifications must agree.
    import random
    rng = random.Random(20)
    cases = [(_pretzel(rng), None) for _ in range(5)] + [_alternating_montesinos(rng) for _ in range(7)]
    rows = []
    for i, (t, mixed) in enumerate(cases):
        fam = _row(t, row_id=4 * i)
        assert fam["key_rule"] == "alternating" and fam["knot_key"].startswith("alt:"), t
        assert fam["bs_key"].startswith("mont:") and fam["proof"] == "normal form"
        d = parse(t)
        pd = _row(d.to_notation(), d, row_id=4 * i + 1)
        assert pd["knot_key"] == fam["knot_key"] and pd["mirror_key"] == fam["mirror_key"], t
        assert pd["amphichiral"] == fam["amphichiral"] and pd["crossing_number"] == fam["crossing_number"]
        rows += [fam, pd]
        if d.n_components == 1:
            dt = _row(_dt(d), row_id=4 * i + 2)
            assert _pair(dt) == _pair(fam), t                   # DT fixes the knot up to mirror
            rows.append(dt)
        if mixed is not None:
            mx = _row(mixed, row_id=4 * i + 3)
            assert (mx["knot_key"], mx["bs_key"]) == (fam["knot_key"], fam["bs_key"]), mixed
            rows.append(mx)
    table = {t["knot_key"]: t for t in build_knots_table(rows)}
    assert sorted(table) == sorted({r["knot_key"] for r in rows})
    assert all(table[r["knot_key"]]["n_diagrams"] >= 2 for r in rows if r.get("bs_key"))   # family + PD
    assert set(table) <= {k for r in rows if r.get("bs_key") for k in (r["knot_key"], r["mirror_key"])}
    # the cross-check: same Bonahon–Siebenmann key iff same flype key
    fams = [r for r in rows if r.get("bs_key")]
    for a in fams:
        for b in fams:
            assert (a["bs_key"] == b["bs_key"]) == (a["knot_key"] == b["knot_key"]), (a["notation"], b["notation"])
            assert (a["bs_key"] == b["bs_mirror_key"]) == (a["knot_key"] == b["mirror_key"])


def test_mutant_pretzels_keep_distinct_flype_keys():
    # P(2,3,3,5) and P(2,3,5,3) are mutants, distinct by Bonahon–Siebenmann; the flyping
    # theorem must separate them too (same determinant, Jones and Alexander polynomial).
    a, b = _row("pretzel:2,3,3,5"), _row("pretzel:2,3,5,3", row_id=1)
    assert a["jones"] == b["jones"] and a["determinant"] == b["determinant"]
    assert a["knot_key"] != b["knot_key"] and a["bs_key"] != b["bs_key"]
    assert a["knot_key"].startswith("alt:") and b["knot_key"].startswith("alt:")
    assert _row("pretzel:3,5,3,2")["knot_key"] == b["knot_key"]          # a rotation: the same link


def test_montesinos_cross_check_and_budget_fallback(monkeypatch):
    a = _row("montesinos:2/5,1/3,1/2")
    # the compositional flype code never searches, so a budget of 1 changes nothing ...
    assert _row("montesinos:2/5,1/3,1/2", row_id=1, flype_budget=1)["knot_key"] == a["knot_key"]
    # ... but a flype route that gives up (BudgetExceeded) must keep the family key, never guess
    from pipeline.errors import BudgetExceeded
    from pipeline.identify import flype_keys

    def over_budget(*args, **kwargs):
        raise BudgetExceeded("flype", 1)

    monkeypatch.setattr(flype_keys, "alternating_nf", over_budget)
    low = _row("montesinos:2/5,1/3,1/2", row_id=1, flype_budget=1)
    monkeypatch.undo()
    low["flype_code"] = None   # a route that gave up has no flype code to store
    assert low["knot_key"] == a["bs_key"] and "budget" in low["key_reason"]
    table = {t["knot_key"]: t for t in build_knots_table([a, low])}
    assert "the same type as" in table[a["knot_key"]]["distinctness_note"]
    assert "the same type as" in table[low["knot_key"]]["distinctness_note"]
    # a forged row: one flype key with two Bonahon–Siebenmann keys
    forged = {**{k: v for k, v in a.items() if k != "diagram"}, "row_id": 2, "bs_key": "mont:0:1/3,1/3,1/3"}
    with pytest.raises(KeyConflictError, match="Bonahon-Siebenmann"):
        build_knots_table([a, forged])
    # a non-alternating Montesinos link keeps its Bonahon–Siebenmann key
    n = _row("montesinos:2/5,1/3,-1/2")
    assert n["knot_key"].startswith("mont:") and n["key_rule"] == "family" and "bs_key" not in n
