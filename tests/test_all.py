"""compute_all: one census row, each invariant isolated; the tangle route for Jones."""

from __future__ import annotations

import json

import pytest

from pipeline import parse
from pipeline.invariants import all as all_mod
from pipeline.invariants.all import compute_all
from slow_routes import state_sum_jones


@pytest.mark.parametrize("text", ["conway:3 1 2", "rational:13/5", "pretzel:-2,3,3", "pretzel:3,0,3",
                                  "montesinos:1/3,-2/5,1/2", "pretzel:2,2,-2", "rational:14/3"])
def test_tangle_route_equals_general_route_and_state_sum(text):
    d = parse(text)
    fast = compute_all(d, notation=text)["jones"]
    general = compute_all(d)["jones"]
    assert fast == general == state_sum_jones(d)   # Kauffman, Topology 26 (1987): all-states sum


def test_trefoil_row_values():
    row = compute_all(parse("torus:2,3"))
    # README conventions / common practice: det 3, 9 three-colourings, σ = −2, V = t + t³ − t⁴
    assert row["determinant"] == 3 and row["invariant_factors"] == [3]
    assert row["colorings"][3] == 9 and row["colorable_moduli"][:1] == [3]
    assert row["signature"] == -2
    assert row["jones"].to_json() == [[1, 1], [3, 1], [4, -1]]
    assert row["chirality"] == "chiral (jones)"
    assert row["status"] == "ok" and row["checks"] and not row["checks_failed"]


def test_budget_overrun_keeps_the_rest_of_the_row():
    # HOMFLY-PT and Khovanov skipped by budget 0 as well (48 crossings, no notation: the
    # skein route would be slow); tests/test_strength_columns.py covers their budgets
    row = compute_all(parse("torus:5,12"), jones_budget=3, homfly_budget=0, khovanov_budget=0)
    assert row["jones"] is None and row["homfly"] is None and row["khovanov"] is None
    assert "skipped: homfly budget 0" in row["status"] and "skipped: khovanov budget 0" in row["status"]
    assert "skipped: jones budget 3" in row["status"]
    assert row["determinant"] == 5    # T(5,12): q even, so det is the odd parameter 5 (Rolfsen ch. 7)


def test_a_failing_invariant_is_recorded_not_raised(monkeypatch):
    from pipeline.invariants import signature

    def broken(diagram):
        raise RuntimeError("deliberately broken")

    monkeypatch.setattr(signature, "signature", broken)
    row = compute_all(parse("conway:2 2"))
    assert row["signature"] is None
    assert "error in signature: RuntimeError: deliberately broken" in row["status"]
    assert row["determinant"] == 5 and row["jones"] is not None


# ---------------------------------------------------------------- the typed row
def test_typed_row_is_frozen_and_to_record_is_the_stored_dict():
    import dataclasses

    from pipeline.invariants.all import compute_row
    from pipeline.invariants.row import CensusRow, InvariantValues

    d = parse("pretzel:2,-3,5")
    row = compute_row(d, notation="pretzel:2,-3,5")
    assert isinstance(row, CensusRow)
    with pytest.raises(dataclasses.FrozenInstanceError):
        row.jones = None
    rec = row.to_record()
    assert list(rec) == [f.name for f in dataclasses.fields(CensusRow)]
    old = compute_all(d, notation="pretzel:2,-3,5")
    assert {k: v for k, v in rec.items() if k != "timings"} == {k: v for k, v in old.items() if k != "timings"}
    # the stored form (JSON lists, string factors) reads back to the same typed values
    stored = {"components": rec["components"], "determinant": rec["determinant"],
              "invariant_factors": [str(f) for f in rec["invariant_factors"]],
              "alexander": rec["alexander"].to_json(), "conway": None,
              "jones": __import__("json").dumps(rec["jones"].to_json()),
              "signature": rec["signature"], "nullity": rec["nullity"],
              # strength (issue 12): JSON text as the census stores it
              "homfly": json.dumps(rec["homfly"].to_json()), "khovanov": json.dumps(rec["khovanov"]),
              "khovanov_f2": rec["khovanov_f2"], "khovanov_reduced": rec["khovanov_reduced"],
              "rasmussen_s": rec["rasmussen_s"], "tristram_levine": rec["tristram_levine"],
              "khovanov_torsion": json.dumps(rec["khovanov_torsion"])}
    back = InvariantValues.from_record(stored)
    assert back == dataclasses.replace(row.values(), conway=None)


def test_every_check_of_a_full_row_runs_from_the_typed_values():
    # a typed row has every input field, so no check is dropped by a missing key:
    # a knot row with all invariants computed runs every relation of checks.ALL_CHECK_NAMES
    from pipeline.invariants.all import compute_row
    from pipeline.invariants.checks import ALL_CHECK_NAMES as CHECK_NAMES

    row = compute_row(parse("conway:3 2"))   # 5_2, alternating
    expected = set(CHECK_NAMES)
    if row.tristram_levine is None:  # σ_ω is computed for braid/torus rows only so far
        expected.discard("tristram_levine_at_minus_one")
    assert set(row.checks) == expected and all(row.checks.values())
    row = compute_row(parse("torus:2,5"), notation="torus:2,5")  # σ_ω from the braid surface
    assert set(row.checks) == set(CHECK_NAMES) \
        and all(row.checks.values())
