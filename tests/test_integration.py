"""Whole-pipeline details that span modules: duplicate diagrams, DT rows, show on a census row."""

from __future__ import annotations

import json
from pathlib import Path

import pipeline
from pipeline.cli import main as cli_main

SPEC = """
[census]
name = "integration"
max_modulus = 7
chunk_size = 3

[[family]]
kind = "file"
path = "typed.txt"
"""

TYPED = """pretzel:3,5,7
pretzel:5,7,3
pd:[[1,5,2,4],[3,1,4,6],[5,3,6,2]]
pd:[[4,2,5,1],[2,6,3,5],[6,4,1,3]]
dt:4 6 2
pretzel:3,5,-7
"""


def _census(tmp_path: Path) -> Path:
    (tmp_path / "spec.toml").write_text(SPEC)
    (tmp_path / "typed.txt").write_text(TYPED)
    out = tmp_path / "out"
    assert cli_main(["run", str(tmp_path / "spec.toml"), "--out", str(out), "--jobs", "1", "--quiet"]) == 0
    return out


def test_duplicates_and_dt_rows_are_marked(tmp_path, capsys):
    out = _census(tmp_path)
    census = pipeline.open_census(out)
    d = census.diagrams.set_index("row_id")
    # P(3,5,7) and P(5,7,3) are the same diagram on the sphere (a rotation of the columns)
    assert str(d.loc[0, "duplicate_of"]) == "<NA>" and d.loc[1, "duplicate_of"] == 0
    # the README example trefoil and torus:2,3 as built by the braid builder: same diagram, relabelled
    assert d.loc[3, "duplicate_of"] == 2
    # dt:4 6 2 realises the same 3-crossing diagram (with the convention's mirror choice)
    assert d.loc[4, "duplicate_of"] == 2
    # P(3,5,-7) is a different diagram
    assert str(d.loc[5, "duplicate_of"]) == "<NA>"
    assert bool(d.loc[4, "mirror_by_convention"]) and not bool(d.loc[0, "mirror_by_convention"])
    capsys.readouterr()
    assert cli_main(["query", str(out), "SELECT row_id, duplicate_of FROM diagrams ORDER BY row_id",
                     "--format", "json"]) == 0
    rows = json.loads(capsys.readouterr().out)
    assert [r["duplicate_of"] for r in rows] == [None, 0, None, 2, 2, None]


def test_typed_diagram_identical_to_a_family_member_is_named_in_the_knots_table(tmp_path):
    # The README trefoil PD code is the diagram of torus:2,3 relabelled: a reduced
    # alternating diagram, so it gets the Schubert key itself (flyping theorem, classify
    # rule (c)).  The PD of the non-alternating braid diagram of torus:3,4 only gets a
    # fingerprint, and the knots table says it is the same type (same diagram_id).
    from pipeline.diagrams.notation import parse
    (tmp_path / "spec.toml").write_text(SPEC + '\n[[family]]\nkind = "torus"\np = [2, 3]\nq = [3, 4]\n')
    (tmp_path / "typed.txt").write_text("pd:[[1,5,2,4],[3,1,4,6],[5,3,6,2]]\n"
                                        + parse("torus:3,4").to_notation() + "\n")
    out = tmp_path / "out"
    assert cli_main(["run", str(tmp_path / "spec.toml"), "--out", str(out), "--jobs", "1", "--quiet"]) == 0
    knots = pipeline.open_census(out).knots.set_index("knot_key")
    assert knots.loc["torus:2,3", "n_diagrams"] == 2
    fp = [k for k in knots.index if k.startswith("fp")]
    assert len(fp) == 1
    assert knots.loc[fp[0], "distinctness_note"].startswith("the same type as torus:3,4")


def test_show_names_the_knot_type_like_a_census_would(capsys):
    # P(−2,3,3) = T(3,4) (SOURCES.md families item 5 *(memory)*); figure-eight b(5,2) is
    # amphichiral since 2² ≡ −1 (mod 5) (Schubert 1956)
    assert cli_main(["show", "pretzel:-2,3,3", "--json"]) == 0
    obj = json.loads(capsys.readouterr().out)
    assert obj["knot"]["knot_key"] == "torus:3,4" and obj["knot"]["proof"] == "normal form"
    assert cli_main(["show", "conway:2 2", "--json"]) == 0
    obj = json.loads(capsys.readouterr().out)
    assert obj["knot"]["amphichiral"] is True and obj["chirality"] == "amphichiral (normal form)"
    assert cli_main(["show", "conway:2 2"]) == 0
    assert "knot key   2b:5/2 (normal form" in capsys.readouterr().out
