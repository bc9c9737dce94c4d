"""A census that survives faults: full disk, read-only or vanished directory, permission
denied, missing inputs, concurrent writers, a reader during the knots build, and kill -9
at random points of the write path (chunks, knots build, merge of shards).

Every fault must give one line on stderr naming the path and the cause (no traceback),
exit 1 (failed run) or 2 (bad input), leave nothing half-written, and leave a census that
``--resume`` completes -- with every column of every table equal to a clean run.
"""

from __future__ import annotations

import errno
import io
import json
import os
import random
import shutil
import subprocess
import sys
import tempfile
import time
from pathlib import Path

import pytest

from pipeline.census import store as store_mod
from pipeline.census.lock import census_lock
from pipeline.census.reader import table_files
from pipeline.census.run import RunFailed, run_census
from pipeline.census.spec import load_spec
from pipeline.census.store import read_table
from pipeline.cli import main as cli
from pipeline.errors import SpecError

SPEC = """\
[census]
chunk_size = 4
max_modulus = 5

[[family]]
kind = "two_bridge"
alpha = [3, 9]

[[family]]
kind = "file"
path = "rows.txt"
"""
ROWS = "torus:2,5\nconway:2 2\npd:[[1,2,3]]\n"   # the last one is a reject
TABLES = ("diagrams", "colorings", "rejects", "knots")
ROOT = Path(__file__).resolve().parents[1]
DRIVER = Path(__file__).with_name("_driver.py")


def _spec(tmp: Path) -> Path:
    tmp.mkdir(parents=True, exist_ok=True)
    (tmp / "rows.txt").write_text(ROWS)
    (tmp / "census.toml").write_text(SPEC)
    return tmp / "census.toml"


def _contents(out: Path) -> dict:
    return {t: read_table(out, t).to_pylist() for t in TABLES}


@pytest.fixture(scope="module")
def clean(tmp_path_factory):
    tmp = tmp_path_factory.mktemp("clean")
    run_census(load_spec(_spec(tmp)), tmp / "out", quiet=True)
    return tmp / "out", _contents(tmp / "out")


def _nothing_half_written(out: Path) -> None:
    """No temp file, and every part in a table directory is committed by a manifest."""
    assert not (out / "_tmp").exists() or not list((out / "_tmp").rglob("*"))
    for table in TABLES:
        listed = set(table_files(out, table))
        present = set((out / table).glob("*.parquet")) if (out / table).is_dir() else set()
        assert present <= listed, f"half-written parts left in {table}/: {present - listed}"
    assert not list(out.glob(".manifest*.tmp-*"))


def _one_line(err: str) -> str:
    assert "Traceback" not in err and err.count("\n") == 1, err
    return err


def _cli_run(spec: Path, out: Path, *extra: str) -> list[str]:
    return ["run", str(spec), "--out", str(out), "--quiet", *extra]


# ------------------------------------------------------------------ a full disk (patched writer)
class _Budget:
    """A Parquet writer that raises ENOSPC once ``left`` bytes have been written."""

    def __init__(self, left: int) -> None:
        self.left = left
        self.real = store_mod.pq.write_table

    def __call__(self, table, where, **kw):
        budget = self

        class Sink(io.FileIO):
            def write(self, b):
                if len(b) > budget.left:
                    raise OSError(errno.ENOSPC, os.strerror(errno.ENOSPC))
                budget.left -= len(b)
                return super().write(b)

        with Sink(str(where), "wb") as fh:
            self.real(table, fh, **kw)


def _bytes(out: Path) -> dict:
    m = json.loads((out / "manifest.json").read_text())
    chunks = sum(p["bytes"] for e in m["chunks"].values() for p in e["parts"].values())
    schema = sum((out / t / "part-schema.parquet").stat().st_size for t in TABLES)
    return {"chunks": chunks, "schema": schema, "knots": m["knots"]["bytes"]}


@pytest.mark.parametrize("where", ["chunks", "knots"])
def test_full_disk_is_one_line_exit_1_and_resume_completes(clean, tmp_path, monkeypatch, capsys, where):
    ref_out, ref = clean
    sizes = _bytes(ref_out)
    # the Parquet bytes a run writes: schema parts, chunk parts, then the knots part
    left = sizes["schema"] + (sizes["chunks"] // 3 if where == "chunks"
                              else sizes["chunks"] + sizes["knots"] // 2)
    spec = _spec(tmp_path)
    out = tmp_path / "out"
    monkeypatch.setattr(store_mod.pq, "write_table", _Budget(left))
    capsys.readouterr()
    assert cli(_cli_run(spec, out)) == 1
    err = _one_line(capsys.readouterr().err)
    assert "No space left on device (ENOSPC)" in err and str(out) in err and "--resume" in err
    _nothing_half_written(out)
    m = json.loads((out / "manifest.json").read_text())
    assert m["knots"] is None
    if where == "chunks":
        assert 0 < len(m["chunks"]) < 8
    else:
        assert len(m["chunks"]) == 8
    monkeypatch.undo()                          # the cause is gone
    assert cli(_cli_run(spec, out, "--resume")) == 0
    assert _contents(out) == ref


# ------------------------------------------------------------------ a real small tmpfs
@pytest.fixture
def tmpfs(tmp_path):
    mnt = tmp_path / "mnt"
    mnt.mkdir()
    if os.geteuid() != 0 or shutil.which("mount") is None:
        pytest.skip("mounting a tmpfs needs root")
    proc = subprocess.run(["mount", "-t", "tmpfs", "-o", "size=600k", "tmpfs", str(mnt)],
                          capture_output=True)
    if proc.returncode:
        pytest.skip(f"cannot mount a tmpfs here: {proc.stderr.decode().strip()}")
    try:
        yield mnt
    finally:
        subprocess.run(["umount", "-l", str(mnt)], capture_output=True)


def test_full_tmpfs_then_read_only_then_resume(clean, tmp_path, tmpfs, capsys):
    _, ref = clean
    spec = _spec(tmp_path)
    out = tmpfs / "out"
    free = shutil.disk_usage(tmpfs).free
    filler = tmpfs / "filler"
    filler.write_bytes(b"\0" * (free - 48 * 1024))   # about 48 kB left: a few chunks fit
    capsys.readouterr()
    assert cli(_cli_run(spec, out)) == 1
    err = _one_line(capsys.readouterr().err)
    assert "No space left on device" in err and str(out) in err
    _nothing_half_written(out)
    filler.unlink()
    subprocess.run(["mount", "-o", "remount,ro", str(tmpfs)], check=True)
    try:
        assert cli(_cli_run(spec, out, "--resume")) == 1
        err = _one_line(capsys.readouterr().err)
        assert "Read-only file system" in err and str(out) in err
    finally:
        subprocess.run(["mount", "-o", "remount,rw", str(tmpfs)], check=True)
    assert cli(_cli_run(spec, out, "--resume")) == 0
    assert _contents(out) == ref
    _nothing_half_written(out)


# ------------------------------------------------------------------ permission, deletion, inputs
def test_permission_denied_on_rename_is_one_line_and_resumable(clean, tmp_path, monkeypatch, capsys):
    _, ref = clean
    spec = _spec(tmp_path)
    out = tmp_path / "out"
    real, calls = os.replace, [0]

    def replace(src, dst):
        calls[0] += 1
        if calls[0] == 9:      # a few chunks in: a part (or the manifest) cannot be renamed
            raise PermissionError(errno.EACCES, os.strerror(errno.EACCES), str(dst))
        return real(src, dst)

    monkeypatch.setattr(store_mod.os, "replace", replace)
    capsys.readouterr()
    assert cli(_cli_run(spec, out)) == 1
    err = _one_line(capsys.readouterr().err)
    assert "Permission denied (EACCES)" in err and str(out) in err
    monkeypatch.undo()
    _nothing_half_written(out)
    assert cli(_cli_run(spec, out, "--resume")) == 0
    assert _contents(out) == ref


class _DeleteDirectory:
    def __init__(self, row_id: int, path: Path) -> None:
        self.row_id, self.path = row_id, str(path)

    def __call__(self, item) -> None:
        if item.row_id == self.row_id:
            shutil.rmtree(self.path, ignore_errors=True)


def test_directory_deleted_under_a_run_is_one_line_exit_1(clean, tmp_path, capsys):
    _, ref = clean
    spec = _spec(tmp_path)
    out = tmp_path / "out"
    with pytest.raises(RunFailed) as info:
        run_census(load_spec(spec), out, quiet=True, fault=_DeleteDirectory(9, out))
    line = str(info.value)
    assert "\n" not in line and str(out) in line and "No such file or directory" in line
    run_census(load_spec(spec), out, quiet=True)       # start again: a clean census
    assert _contents(out) == ref


def test_missing_spec_and_missing_input_file_are_bad_input(tmp_path, capsys):
    capsys.readouterr()
    assert cli(["run", str(tmp_path / "nope.toml"), "--out", str(tmp_path / "o")]) == 2
    assert "nope.toml" in _one_line(capsys.readouterr().err)
    spec = load_spec(_spec(tmp_path))
    (tmp_path / "rows.txt").unlink()                   # gone after the spec was read
    with pytest.raises(SpecError, match=r"input file .*rows.txt: No such file or directory"):
        run_census(spec, tmp_path / "o2", quiet=True)


# ------------------------------------------------------------------ the lock
def _child_run(spec: Path, out: Path, *extra: str) -> subprocess.Popen:
    env = {**os.environ, "PYTHONPATH": str(ROOT)}
    return subprocess.Popen([sys.executable, "-m", "pipeline", *_cli_run(spec, out, *extra)],
                            env=env, stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)


def _driver(*args: str) -> tuple[int, str]:
    """Run tests/_driver.py; once it died, kill its orphaned loky worker too."""
    with open(os.devnull, "w") as null, tempfile.TemporaryFile("w+") as err:
        proc = subprocess.Popen([sys.executable, str(DRIVER), *args], stdout=null, stderr=err,
                                start_new_session=True, text=True)
        rc = proc.wait(timeout=300)
        try:
            os.killpg(proc.pid, 9)
        except ProcessLookupError:
            pass
        err.seek(0)
        return rc, err.read()


def _half_finished(tmp: Path) -> tuple[Path, Path]:
    spec = _spec(tmp)
    out = tmp / "out"
    rc, err = _driver(str(spec), str(out), "--kill", "write_chunk:4:before")
    assert rc == -9, err[-400:]
    return spec, out


def test_a_held_lock_refuses_with_one_line_naming_the_holder(clean, tmp_path):
    _, ref = clean
    spec, out = _half_finished(tmp_path)
    with census_lock(out, role="test holder"):
        proc = _child_run(spec, out, "--resume")
        _, err = proc.communicate(timeout=120)
        assert proc.returncode == 1
        _one_line(err)
        assert f"pid {os.getpid()}" in err and "test holder" in err and "--wait" in err
        # a shard takes the lock shared: it runs beside another shard, not beside a merge
        with pytest.raises(RunFailed, match="another writer holds the census lock"):
            run_census(load_spec(spec), out, shard=(1, 2), quiet=True)
    with census_lock(out, shared=True, role="shard 2/2"):
        run_census(load_spec(spec), out, shard=(1, 2), quiet=True)
    assert cli(_cli_run(spec, out, "--resume")) == 0
    assert _contents(out) == ref


def test_two_concurrent_resumes_one_waits_and_tables_equal_a_clean_run(clean, tmp_path):
    _, ref = clean
    spec, out = _half_finished(tmp_path)
    env = {**os.environ, "PYTHONPATH": str(ROOT)}
    logs = [tmp_path / f"resume-{i}.err" for i in (1, 2)]
    procs = []
    with census_lock(out, role="test holder"):      # both start while the lock is held ...
        for log in logs:
            with log.open("w") as fh:
                procs.append(subprocess.Popen([sys.executable, "-m", "pipeline",
                                               *_cli_run(spec, out, "--resume", "--wait")],
                                              env=env, stderr=fh, stdout=subprocess.DEVNULL))
        deadline = time.monotonic() + 120
        while time.monotonic() < deadline and not all(
                "waiting for the census lock" in log.read_text() for log in logs):
            time.sleep(0.05)
    # ... and each said whom it waited for, then they ran one after the other
    assert [p.wait(timeout=300) for p in procs] == [0, 0]
    for log in logs:
        err = log.read_text()
        assert "Traceback" not in err and "test holder" in err, err
    assert _contents(out) == ref
    _nothing_half_written(out)


def test_a_reader_during_the_knots_build_neither_blocks_nor_sees_half_a_table(clean, tmp_path, monkeypatch):
    _, ref = clean
    spec = _spec(tmp_path)
    out = tmp_path / "out"
    import pipeline.identify.classify as classify
    real, seen = classify.build_knots_table, []

    def build(rows):
        # the writer holds the lock here; a reader in another process must not wait for it
        env = {**os.environ, "PYTHONPATH": str(ROOT)}
        proc = subprocess.run([sys.executable, "-m", "pipeline", "query", str(out),
                               "select count(*) as n from knots", "--format", "csv"],
                              env=env, capture_output=True, text=True, timeout=120)
        seen.append((proc.returncode, proc.stdout.split()))
        return real(rows)

    monkeypatch.setattr(classify, "build_knots_table", build)
    run_census(load_spec(spec), out, quiet=True)
    run_census(load_spec(spec), out, resume=True, quiet=True)   # rebuilds beside, renames in
    assert [rc for rc, _ in seen] == [0, 0]
    n = len(ref["knots"])
    assert seen[0][1][-1] == "0" and seen[1][1][-1] == str(n)    # nothing, then the whole old table
    assert _contents(out) == ref


# ------------------------------------------------------------------ kill -9 at random points
#: (point, calls that surely happen) in a run from scratch of SPEC (8 chunks) ...
FRESH = [("write_table", 4 + 8 * 2 + 1), ("replace", 30), ("manifest", 9), ("write_chunk", 8),
         ("spill", 1), ("classify", 1)]
#: ... and in the merging --resume after two shards
MERGE = [("merge", 2), ("manifest", 3), ("write_table", 1), ("replace", 3), ("spill", 1),
         ("classify", 1)]


def _kill_cases(n: int, seed: int) -> list[tuple[str, str, int, str]]:
    rnd = random.Random(seed)
    cases = [("fresh", "spill", 1, "after"), ("merge", "merge", 1, "after")]  # always covered
    while len(cases) < n:
        mode = rnd.choice(["fresh", "fresh", "merge"])
        point, most = rnd.choice(FRESH if mode == "fresh" else MERGE)
        cases.append((mode, point, rnd.randint(1, most), rnd.choice(["before", "after"])))
    return cases[:n]


def _kill_and_resume(case, tmp: Path, ref: dict) -> None:
    mode, point, nth, when = case
    spec = _spec(tmp)
    out = tmp / "out"
    args = [str(spec), str(out), "--kill", f"{point}:{nth}:{when}"]
    if mode == "merge":
        for i in (1, 2):
            run_census(load_spec(spec), out, shard=(i, 2), quiet=True)
        args.append("--resume")
    rc, err = _driver(*args)
    assert rc == -9, (case, err[-400:])
    started = any(out.glob("manifest*.json"))
    if started:                           # what a reader sees after the crash is committed data
        for table in TABLES:
            read_table(out, table)
    # killed before the first manifest write: nothing to resume, a plain run starts it
    run_census(load_spec(spec), out, resume=started, quiet=True)
    assert _contents(out) == ref, case
    _nothing_half_written(out)


@pytest.mark.parametrize("case", _kill_cases(4, seed=13), ids=str)
def test_kill_at_a_random_point_then_resume_equals_clean(clean, tmp_path, case):
    _kill_and_resume(case, tmp_path, clean[1])


@pytest.mark.slow
@pytest.mark.parametrize("case", _kill_cases(20, seed=int(os.environ.get("KILL_SEED", "2026"))), ids=str)
def test_kill_at_20_random_points_then_resume_equals_clean(clean, tmp_path, case):
    _kill_and_resume(case, tmp_path, clean[1])


@pytest.mark.parametrize("nth", [1, 2])
def test_kill_while_starting_leaves_a_directory_run_or_resume_accepts(clean, tmp_path, nth):
    # os.replace 1 is the first manifest, 2 the first schema part (the layout comes after)
    spec = _spec(tmp_path)
    out = tmp_path / "out"
    rc, err = _driver(str(spec), str(out), "--kill", f"replace:{nth}:{'before' if nth == 1 else 'after'}")
    assert rc == -9, err[-400:]
    run_census(load_spec(spec), out, resume=any(out.glob("manifest*.json")), quiet=True)
    assert _contents(out) == clean[1]
