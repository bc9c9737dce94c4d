"""The census store: schema-checked parts, atomic commits, cleanup, exactness."""

from __future__ import annotations

import json
from pathlib import Path

import pyarrow as pa
import pyarrow.parquet as pq
import pytest

from pipeline.census.spec import iter_items, parse_spec
from pipeline.census.store import CensusStore, StoreError, part_name, read_table, to_arrow
from pipeline.census.worker import compute_chunk
from pipeline.census.schemas import SCHEMAS

IDENTITY = {"spec_sha256": "x", "chunk_size": 2, "options": {}, "n_items": 4, "input_files": {},
            "versions": {"knotledger": "test"}}


def _store(tmp_path, shard=None) -> CensusStore:
    s = CensusStore(tmp_path / "c", shard=shard)
    s.create(IDENTITY, {})
    s.prepare()
    return s


def _chunk(spec_text: str, chunk: int = 0) -> dict:
    items = list(iter_items(parse_spec(spec_text)))
    return compute_chunk(chunk, items, {"max_modulus": 5})


def test_every_table_has_a_schema_part_even_when_empty(tmp_path):
    s = _store(tmp_path)
    for table, schema in SCHEMAS.items():
        t = pq.read_table(s.dir / table)
        assert t.num_rows == 0 and t.schema.remove_metadata().equals(schema)


def test_unknown_column_is_refused():
    with pytest.raises(StoreError, match="not in schemas"):
        to_arrow("rejects", [{"row_id": 1, "family": "file", "family_index": 0, "source": "x",
                              "reason": "r", "colour": 3}], {})


def test_chunk_round_trip_and_manifest_checksums(tmp_path):
    s = _store(tmp_path)
    res = _chunk('[[family]]\nkind = "torus"\np = 2\nq = [3, 4]\n')
    entry = s.write_chunk(0, res)
    back = read_table(s.dir, "diagrams").to_pylist()
    assert [r["notation"] for r in back] == ["torus:2,3", "torus:2,4"]
    assert back[0]["jones"] == "[[1,1],[3,1],[4,-1]]"  # positive trefoil (README.md pin)
    assert back[0]["jones_terms"] == [{"e2": 2, "c": "1"}, {"e2": 6, "c": "1"}, {"e2": 8, "c": "-1"}]
    assert entry["parts"]["diagrams"]["rows"] == 2
    assert "rejects" not in entry["parts"]  # no empty parts per chunk
    manifest = json.loads(s.manifest_path.read_text())
    assert manifest["chunks"]["0"] == entry
    assert s.verify() == []
    with (s.dir / part_name("diagrams", 0)).open("r+b") as fh:  # corrupt one byte
        fh.seek(10)
        fh.write(b"\x00")
    assert s.verify() and "checksum" in s.verify()[0]
    meta = pq.read_schema(s.dir / part_name("diagrams", 0)).metadata
    assert json.loads(meta[b"knotledger.versions"]) == {"knotledger": "test"}


def test_prepare_deletes_unlisted_parts_and_temp_files(tmp_path):
    s = _store(tmp_path)
    s.write_chunk(0, _chunk('[[family]]\nkind = "torus"\np = 2\nq = 3\n'))
    stray = s.dir / part_name("diagrams", 1)
    stray.write_bytes((s.dir / part_name("diagrams", 0)).read_bytes())  # renamed, never committed
    (s.dir / "_tmp" / "main-half-written").write_bytes(b"PAR1")
    again = CensusStore(s.dir)
    again.resume(IDENTITY, {})
    again.prepare()
    assert not stray.exists() and not list((s.dir / "_tmp").iterdir())
    assert again.committed() == {0} and read_table(s.dir, "diagrams").num_rows == 1


def test_shard_prepare_leaves_other_shards_parts(tmp_path):
    a = _store(tmp_path, shard=(1, 2))
    b = CensusStore(a.dir, shard=(2, 2))
    b.create(IDENTITY, {})
    b.write_chunk(1, _chunk('[[family]]\nkind = "torus"\np = 2\nq = 3\n', chunk=1))
    a.prepare()
    assert (a.dir / part_name("diagrams", 1)).exists()


def test_create_never_overwrites(tmp_path):
    s = _store(tmp_path)
    with pytest.raises(StoreError, match="use --resume"):
        CensusStore(s.dir).create(IDENTITY, {})
    other = tmp_path / "other"
    other.mkdir()
    (other / "notes.txt").write_text("mine")
    with pytest.raises(StoreError, match="not empty"):
        CensusStore(other).create(IDENTITY, {})
    with pytest.raises(StoreError, match="spec_sha256 differs"):
        CensusStore(s.dir).resume({**IDENTITY, "spec_sha256": "y"}, {})


def test_determinant_beyond_int64_is_exact_text_and_null_int():
    # conway:1 1 ... 1 (100 ones) is b(F_101, F_100): det = α = F_101 (Schubert; Conway 1970)
    from pipeline.census.spec import WorkItem
    item = WorkItem(0, "file", 0, "conway:" + " ".join(["1"] * 100), "{}", None, "x:1", False)
    # 100 crossings: HOMFLY-PT (skein route) and Khovanov are skipped by budget 0 here
    row = compute_chunk(0, [item], {"max_modulus": 3, "homfly_budget": 0, "khovanov_budget": 0})["diagrams"][0]
    a, b = 1, 1
    for _ in range(99):
        a, b = b, a + b
    assert row["determinant_text"] == str(b) and b > 2 ** 63 and row["determinant"] is None
    assert row["invariant_factors"] == [str(b)] and row["invariant_factors_int"] is None
    t = to_arrow("diagrams", [row], {})
    assert t.column("determinant_text").to_pylist() == [str(b)]
    assert t.schema.field("invariant_factors").type == pa.list_(pa.string())


def test_a_failed_commit_removes_the_chunks_parts_and_keeps_the_manifest(tmp_path, monkeypatch):
    import errno
    import os
    import pipeline.census.store as store_mod
    s = _store(tmp_path)
    res = _chunk('[[family]]\nkind = "torus"\np = 2\nq = [3, 4]\n')
    before = s.manifest_path.read_bytes()
    real = store_mod.os.replace

    def replace(src, dst):
        if Path(dst).name == "manifest.json":      # the parts are in, the manifest write fails
            raise OSError(errno.ENOSPC, os.strerror(errno.ENOSPC))
        return real(src, dst)

    monkeypatch.setattr(store_mod.os, "replace", replace)
    with pytest.raises(OSError) as info:
        s.write_chunk(0, res)
    assert info.value.errno == errno.ENOSPC and info.value.filename == str(s.manifest_path)
    monkeypatch.undo()
    assert s.manifest_path.read_bytes() == before and s.committed() == set()
    assert not (s.dir / part_name("diagrams", 0)).exists()
    assert not (s.dir / part_name("colorings", 0)).exists()
    assert not list(s.dir.glob(".manifest*")) and not list((s.dir / "_tmp").iterdir())
    s.write_chunk(0, res)                           # the cause gone, the same chunk commits
    assert read_table(s.dir, "diagrams").num_rows == 2


def test_lock_file_alone_does_not_make_a_directory_foreign_and_spill_dirs_are_cleaned(tmp_path):
    from pipeline.census.lock import census_lock
    d = tmp_path / "c"
    with census_lock(d):
        s = CensusStore(d)
        s.create(IDENTITY, {})
    (d / "_tmp" / "knots-build").mkdir()
    (d / "_tmp" / "knots-build" / "batch-0.arrow").write_bytes(b"x")
    s.prepare()
    assert not list((d / "_tmp").iterdir())
    s.close()
    assert not (d / "_tmp").exists()
