"""The issue-12 census columns: HOMFLY-PT, Khovanov homology (Q, F₂, reduced), s, width,
Tristram–Levine, and the relations they satisfy on whole families.

Outside checks (SOURCES.md):
* s(T(p, q)) = (p − 1)(q − 1) for positive torus knots (J. Rasmussen, Invent. Math. 182
  (2010)); s(K*) = −s(K).
* Alternating knots: s = −σ (project sign, σ(positive trefoil) = −2), Kh over Q on
  j − 2i = −σ ± 1, total rank det + 1 (E. S. Lee, Adv. Math. 197 (2005)).
* V = P(t, t^½ − t^−½), ∇ = P(1, z) (Freyd et al., Bull. AMS 12 (1985)).
* The thin shortcut for s is compared with the independent Q[h] computation on random
  knots (slow route vs fast route).
"""

from __future__ import annotations

import json
import random
from pathlib import Path

import pytest

from pipeline.census.run import run_census
from pipeline.census.spec import load_spec, parse_spec
from pipeline.census.store import read_table
from pipeline.diagrams.notation import parse
from pipeline.invariants.all import compute_all
from pipeline.invariants.homfly import HPoly
from pipeline.invariants.khovanov import (khovanov_data, mirror_ranks, ranks_from_json, rasmussen_s,
                                          thin_s)
from pipeline.invariants.strength_checks import STRENGTH_CHECK_NAMES, seifert_circle_count

SPEC = """\
family = [{kind = "torus", p = [2, 3], q = [-7, 7]},
          {kind = "pretzel", length = 3, entries = [-3, 3]},
          {kind = "two_bridge", alpha = [3, 17]}]

[census]
name = "strength"
max_modulus = 5
chunk_size = 8
"""

STRENGTH = ("homfly", "khovanov", "khovanov_f2", "khovanov_reduced", "rasmussen_s", "kh_width",
            "tristram_levine", "khovanov_torsion")


@pytest.fixture(scope="module")
def census(tmp_path_factory):
    tmp = tmp_path_factory.mktemp("strength")
    (tmp / "census.toml").write_text(SPEC)
    run_census(load_spec(tmp / "census.toml"), tmp / "out", jobs=1, quiet=True)
    CENSUS_DIR.append(tmp / "out")
    return read_table(tmp / "out", "diagrams").to_pylist()


CENSUS_DIR: list[Path] = []


def test_new_columns_filled_and_every_strength_check_passes(census):
    assert len(census) > 150
    seen: set[str] = set()
    for row in census:
        assert row["status"] == "ok", (row["notation"], row["status"])
        assert row["homfly"] is not None and row["khovanov"] is not None
        assert row["khovanov_f2"] is not None and row["kh_width"] is not None
        knot = row["components"] == 1
        assert (row["rasmussen_s"] is not None) == knot
        assert (row["khovanov_reduced"] is not None) == knot
        checks = json.loads(row["checks"])
        seen |= set(checks) & set(STRENGTH_CHECK_NAMES)
        assert not row["checks_failed"], (row["notation"], row["checks_failed"])
        P = HPoly.from_json(json.loads(row["homfly"]))
        assert [[t["v"], t["z"], int(t["c"])] for t in row["homfly_terms"]] == P.to_json()
    # every relation was exercised somewhere in the three families
    assert seen == set(STRENGTH_CHECK_NAMES)


def test_torus_knots_have_published_s_and_mirror_relations(census):
    torus = {r["notation"]: r for r in census if r["family"] == "torus" and r["components"] == 1}
    assert len(torus) >= 12
    for text, row in torus.items():
        p, q = (int(x) for x in text.split(":")[1].split(","))
        if abs(p) == 1 or abs(q) == 1:  # unknots
            continue
        sign = 1 if p * q > 0 else -1
        assert row["rasmussen_s"] == sign * (abs(p) - 1) * (abs(q) - 1), text  # Rasmussen 2010
        mirror = torus.get(f"torus:{p},{-q}")
        if mirror is not None:
            kh, kh_m = ranks_from_json(json.loads(row["khovanov"])), ranks_from_json(json.loads(mirror["khovanov"]))
            assert kh_m == mirror_ranks(kh)
            P, P_m = (HPoly.from_json(json.loads(r["homfly"])) for r in (row, mirror))
            assert P_m == P.mirror()
            assert mirror["rasmussen_s"] == -row["rasmussen_s"]
            assert row["chirality"].startswith("chiral")


def test_torsion_column_end_to_end(census):
    """khovanov_torsion as stored: T(2,n) has Z/2 at (2k+1, n+4k) *(memory: Khovanov, Duke
    Math. J. 101 (2000), §6.2)*, the mirror moves torsion to (1 − i, −j) (dual complex),
    and universal coefficients (Hatcher 2002, Thm. 3.2) give the stored F₂ ranks."""
    from pipeline.invariants.khovanov import torsion_from_json, uct_ranks
    rows = {r["notation"]: r for r in census}
    assert all(r["khovanov_torsion"] is not None for r in census)
    for n in (3, 5, 7):
        tors = torsion_from_json(json.loads(rows[f"torus:2,{n}"]["khovanov_torsion"]))
        assert tors == {(2 * k + 1, n + 4 * k): {2: 1} for k in range(1, (n - 1) // 2 + 1)}
        mirror = torsion_from_json(json.loads(rows[f"torus:2,{-n}"]["khovanov_torsion"]))
        assert mirror == {(1 - i, -j): ms for (i, j), ms in tors.items()}
    for r in census:
        free = ranks_from_json(json.loads(r["khovanov"]))
        tors = torsion_from_json(json.loads(r["khovanov_torsion"]))
        assert uct_ranks(free, tors, 2) == ranks_from_json(json.loads(r["khovanov_f2"])), r["notation"]


def test_alternating_two_bridge_knots_s_is_minus_signature(census):
    rows = [r for r in census if r["family"] == "two_bridge" and r["components"] == 1]
    assert len(rows) > 40
    for r in rows:
        assert r["rasmussen_s"] == -r["signature"]
        assert r["kh_width"] == 2


def test_budget_skip_keeps_the_row_with_status(tmp_path):
    spec = parse_spec(SPEC.replace('chunk_size = 8', 'chunk_size = 8\nkhovanov_budget = 3\nhomfly_budget = 0'))
    assert spec.khovanov_budget == 3 and spec.homfly_budget == 0
    d = parse("pretzel:3,3,-3")
    row = compute_all(d, notation="pretzel:3,3,-3", khovanov_budget=3, homfly_budget=0)
    assert "skipped: khovanov budget 3" in row["status"]
    assert "skipped: homfly budget 0" in row["status"]
    assert row["khovanov"] is None and row["homfly"] is None and row["rasmussen_s"] is None
    assert row["jones"] is not None and row["determinant"] == 9
    assert not any(k.startswith(("khovanov", "homfly", "rasmussen")) for k in row["checks"])
    assert not row["checks_failed"]


def test_spec_rejects_negative_budgets():
    from pipeline.errors import SpecError
    with pytest.raises(SpecError, match="khovanov_budget"):
        parse_spec(SPEC.replace('chunk_size = 8', 'chunk_size = 8\nkhovanov_budget = -1'))
    assert parse_spec(SPEC).khovanov_budget == 20_000


def _random_knot(rng: random.Random):
    while True:
        strands = rng.randint(2, 4)
        word = [rng.choice([1, -1]) * rng.randint(1, strands - 1) for _ in range(rng.randint(3, 11))]
        if {abs(g) for g in word} != set(range(1, strands)):
            continue
        d = parse("braid:" + ",".join(map(str, word)))
        if d.n_components == 1:
            return d


def test_thin_shortcut_agrees_with_the_q_h_route_on_random_knots():
    rng = random.Random(12)
    thin = 0
    for _ in range(25):
        d = _random_knot(rng)
        data = khovanov_data(d, budget=20_000)
        assert data.rasmussen_s == rasmussen_s(d, budget=20_000)
        thin += thin_s(ranks_from_json(data.khovanov)) is not None
    assert thin >= 5


def test_chirality_by_homfly_where_jones_and_signature_fail():
    """Each new verdict on its own (the older inputs missing), and nothing decides for the
    amphichiral figure-eight knot 4_1 (amphichirality: Rolfsen, Knots and Links, 1976)."""
    from pipeline.invariants.chirality import chirality
    d = parse("torus:2,3")
    P = HPoly.from_json([[2, 0, 2], [2, 2, 1], [4, 0, -1]])
    assert chirality(d, jones=None, signature=None, homfly=P)[0] == "chiral (homfly)"
    kh = {(0, 1): 1, (0, 3): 1, (2, 5): 1, (3, 9): 1}
    assert chirality(d, jones=None, signature=None, khovanov=kh)[0] == "chiral (khovanov)"
    assert chirality(d, jones=None, signature=None, rasmussen_s=2)[0] == "chiral (khovanov)"
    amph = parse("rational:5/2")  # 4_1: amphichiral, nothing decides
    row = compute_all(amph, notation="rational:5/2")
    assert row["chirality"] == "unknown" and "homfly" in row["chirality_reason"]


def test_seifert_circles_of_closed_braids_are_the_strands():
    for text, n in (("braid:1,1,1", 2), ("braid:1,-2,1,-2", 3), ("braid:1,2,3,1,2,3", 4)):
        assert seifert_circle_count(parse(text)) == n


def test_claims_see_the_new_columns(census):
    from pipeline.explore.claims import check_claim
    out = CENSUS_DIR[-1]
    # Lee 2005 / Rasmussen 2010: s = −σ for alternating knots (every two-bridge knot)
    r = check_claim(out, "rasmussen_s == -signature", family="two_bridge", where="components == 1")
    assert r.selected > 40 and r.held == r.selected and not r.n_counterexamples
    # a false claim is caught: s = σ fails on every two-bridge knot with σ ≠ 0
    r = check_claim(out, "rasmussen_s == signature", family="two_bridge", where="components == 1")
    assert r.n_counterexamples > 0
    r = check_claim(out, "kh_width >= 2", family="torus")
    assert r.held == r.selected > 0


def test_distinctness_note_names_the_separating_invariant():
    """Rows built by hand: the same classical values and HOMFLY-PT, different Khovanov ranks
    over Q, so the note names khovanov (different invariants prove different types)."""
    from pipeline.identify.fingerprint import base_fingerprint, fingerprint
    from pipeline.identify.knots_table import add_notes
    base = {"components": 1, "determinant": 3, "invariant_factors": [3], "alexander": [[-1, 1], [0, -1], [1, 1]],
            "jones": [[1, 1], [3, 1], [4, -1]], "signature": -2, "homfly": [[2, 0, 2], [2, 2, 1], [4, 0, -1]],
            "khovanov_f2": [[0, 1, 1]]}
    a = {**base, "khovanov": [[0, 1, 1], [0, 3, 1], [2, 5, 1], [3, 9, 1]]}
    b = {**base, "khovanov": [[0, 1, 1], [0, 3, 1], [2, 5, 1], [3, 9, 2]]}
    assert base_fingerprint(a) == base_fingerprint(b) and fingerprint(a) != fingerprint(b)
    out = [{"knot_key": k, "proof": "fingerprint only", "_fps": {fingerprint(r)}, "_dids": set(),
            "_base_fps": {base_fingerprint(r)}, "_example": r} for k, r in (("fp:a", a), ("fp:b", b))]
    add_notes(out)
    assert out[0]["fingerprint_shared_with"] == []
    assert out[0]["distinctness_note"] == ("distinct from fp:b by khovanov (same determinant, Alexander, "
                                           "Jones and signature)")
    assert "_example" not in out[0] and "_base_fps" not in out[1]


def test_fit_finds_s_of_positive_torus_knots(census):
    """s(T(p, q)) = (p − 1)(q − 1) for positive torus knots (Rasmussen 2010): on the rows
    with p = 3, q > 0 that are knots, the fit is 2q − 2."""
    import sympy
    from pipeline.explore.fit import fit_family
    names, (c,), _ = fit_family(CENSUS_DIR[-1], "torus", "rasmussen_s", where="p == 3 and q > 1 and components == 1")
    assert c.exact and sympy.expand(c.fit.expr() - (2 * sympy.Symbol("q") - 2)) == 0
