"""The census reader: only the parts a manifest commits are read, by every reader.

The crash of interest is a real one: a child run is SIGKILLed after a chunk's parts were
renamed into place and before the manifest recorded them (tests/_driver.py).
"""

from __future__ import annotations

import json
import os
import shutil
import subprocess
import sys
from pathlib import Path

import pytest

from pipeline.census.reader import exact_int, open_census, parse_params, table_files
from pipeline.census.run import run_census
from pipeline.census.spec import load_spec
from pipeline.census.store import part_name, read_table
from pipeline.errors import QueryError
from pipeline.explore.query import run_query

SPEC = '[census]\nchunk_size = 4\nmax_modulus = 5\n[[family]]\nkind = "two_bridge"\nalpha = [3, 9]\n'
N_ROWS = 2 + 2 + 4 + 2 + 6 + 4 + 6   # Σ φ(α), α = 3..9
DRIVER = Path(__file__).with_name("_driver.py")


def _spec(tmp: Path) -> Path:
    tmp.mkdir(parents=True, exist_ok=True)
    (tmp / "census.toml").write_text(SPEC)
    return tmp / "census.toml"


@pytest.fixture(scope="module")
def clean(tmp_path_factory) -> Path:
    tmp = tmp_path_factory.mktemp("clean")
    run_census(load_spec(_spec(tmp)), tmp / "out", quiet=True)
    return tmp / "out"


def _crashed_before_manifest(tmp: Path, nth: int) -> Path:
    """A census whose run died right before its nth manifest write (1 = the create)."""
    out = tmp / "out"
    with open(os.devnull, "w") as null:
        proc = subprocess.Popen([sys.executable, str(DRIVER), str(_spec(tmp)), str(out),
                                 "--kill", f"manifest:{nth}:before"], stdout=null, stderr=null,
                                start_new_session=True)
        rc = proc.wait(timeout=300)
    try:
        os.killpg(proc.pid, 9)       # the orphaned loky worker
    except ProcessLookupError:
        pass
    assert rc == -9
    return out


def _counts(out: Path) -> dict:
    census = open_census(out)
    return {"open_census": len(census.diagrams),
            "query": run_query(out, "select count(*) from diagrams")[1][0][0],
            "read_table": read_table(out, "diagrams").num_rows}


def test_uncommitted_part_is_read_by_no_reader(tmp_path):
    out = _crashed_before_manifest(tmp_path, 4)       # chunks 0, 1 committed; 2 renamed only
    manifest = json.loads((out / "manifest.json").read_text())
    assert sorted(manifest["chunks"]) == ["0", "1"]
    assert (out / part_name("diagrams", 2)).is_file(), "the crash did not leave a renamed part"
    committed = sum(e["parts"]["diagrams"]["rows"] for e in manifest["chunks"].values())
    assert committed == 8
    assert _counts(out) == {"open_census": 8, "query": 8, "read_table": 8}
    assert [p.name for p in table_files(out, "diagrams")] == [
        "part-c00000000.parquet", "part-c00000001.parquet", "part-schema.parquet"]
    run_census(load_spec(tmp_path / "census.toml"), out, resume=True, quiet=True)
    assert _counts(out) == {"open_census": N_ROWS, "query": N_ROWS, "read_table": N_ROWS}


def test_check_fit_and_report_read_through_the_same_reader(tmp_path, capsys):
    # check/fit/report open the census with open_census (the one reader) ...
    from pipeline.explore import claims, fit
    from pipeline.present import report
    for mod in (claims, fit, report):
        assert mod.open_census is open_census
    # ... so `check` after the crash sees the committed chunk 0 only (4 rows), not chunk 1
    out = _crashed_before_manifest(tmp_path, 3)
    from pipeline.cli import main as cli
    capsys.readouterr()
    assert cli(["check", str(out), "--claim", "determinant == alpha"]) == 0  # Schubert 1956
    assert "selected: 4 rows" in capsys.readouterr().out


def test_a_part_of_the_wrong_size_is_not_committed(clean, tmp_path):
    out = tmp_path / "copy"
    shutil.copytree(clean, out)
    part = out / part_name("diagrams", 1)
    part.write_bytes(part.read_bytes()[:-10])         # truncated after the commit
    assert part not in table_files(out, "diagrams")
    assert len(open_census(out).diagrams) == N_ROWS - 4


def test_shard_parts_are_read_before_the_merge(tmp_path):
    spec = load_spec(_spec(tmp_path))
    out = tmp_path / "out"
    run_census(spec, out, shard=(1, 2), quiet=True)
    # shard 1 of 2 owns chunks 0, 2, 4, 6 of 7 (4 rows each but the last, 2 rows)
    assert len(open_census(out).diagrams) == 4 + 4 + 4 + 2
    assert not table_files(out, "knots") or [p.name for p in table_files(out, "knots")] == [
        "part-schema.parquet"]


def test_knots_part_only_once_the_manifest_records_it(clean, tmp_path):
    out = tmp_path / "copy"
    shutil.copytree(clean, out)
    assert (out / "knots" / "part-knots.parquet") in table_files(out, "knots")
    manifest = json.loads((out / "manifest.json").read_text())
    manifest["knots"] = None
    (out / "manifest.json").write_text(json.dumps(manifest))
    assert [p.name for p in table_files(out, "knots")] == ["part-schema.parquet"]
    assert open_census(out).knots.empty


def test_unreadable_manifest_is_one_line_query_error(clean, tmp_path):
    out = tmp_path / "copy"
    shutil.copytree(clean, out)
    (out / "manifest.json").write_text("{not json")
    with pytest.raises(QueryError, match="cannot read .*manifest.json"):
        open_census(out)


def test_no_module_lists_parquet_files_itself():
    # one reader: nothing but census/reader.py (and the writer, store.py) globs for parts
    root = Path(__file__).resolve().parents[1] / "pipeline"
    offenders = [str(p.relative_to(root)) for p in root.rglob("*.py")
                 if p.name not in ("reader.py", "store.py") and "*.parquet" in p.read_text()]
    assert offenders == []


def test_exact_int_prefers_text_and_parse_params_keeps_types():
    big = 2 ** 80 + 1
    assert exact_int(None, str(big)) == big and exact_int(7) == 7 and exact_int(None) is None
    assert parse_params('{"alpha": 5, "t1": "3/5"}') == {"alpha": 5, "t1": "3/5"}
    assert parse_params(None) == {} and parse_params("") == {}
    with pytest.raises(QueryError, match="not a JSON object"):
        parse_params("[1, 2]")
