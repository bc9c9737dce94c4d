"""The census directory: Parquet parts committed atomically, recorded in a manifest.

Layout (README.md, "Store layout")::

    DIR/manifest.json                      the census (or manifest.shard-I-of-N.json)
    DIR/.knotledger.lock                   the writer lock (pipeline.census.lock)
    DIR/diagrams/part-schema.parquet       zero rows, carries the schema (always there)
    DIR/diagrams/part-c00000017.parquet    the rows of chunk 17
    DIR/colorings/...  DIR/rejects/...     likewise
    DIR/knots/part-knots.parquet           built after every chunk is in
    DIR/_tmp/                              parts being written (never read; removed
                                           when a run ends)

Commit protocol for a chunk: write each non-empty part to ``_tmp/``, ``fsync``,
``os.replace`` it into its table directory, then rewrite the manifest (temp file +
``os.replace``) with the chunk's row counts, byte sizes and SHA-256 checksums.  A
chunk is committed exactly when the manifest lists it: readers list only the parts a
manifest commits (:func:`pipeline.census.reader.table_files`), and
:meth:`CensusStore.prepare` (every start and resume) deletes the parts the manifest
does not list, so after a SIGKILL at any moment a reader never sees a chunk twice or an
uncommitted one, and a resume recomputes exactly the uncommitted chunks.  A write that
fails (a full disk, a read-only or vanished directory) removes what this chunk had
already published and re-raises, leaving the manifest as it was.  The knots table is
written beside (``_tmp/``) and renamed into place, so a reader sees the old table or
the new one, never half of one.  Shards keep their own manifest, touch only the
parts of their own chunks, and are merged (idempotently) by a later plain resume.
"""

from __future__ import annotations

import hashlib
import json
import os
import re
import shutil
from pathlib import Path
from typing import Iterable, Optional

import pyarrow as pa
import pyarrow.parquet as pq

from ..errors import KnotLedgerError
from .lock import LOCK_NAME
from .schemas import SCHEMA_VERSION, SCHEMAS

__all__ = ["CensusStore", "StoreError", "WriteError", "part_name", "read_table", "FORMAT"]

FORMAT = "knotledger-census/1"
CHUNK_TABLES = ("diagrams", "colorings", "rejects")
_PART = re.compile(r"^part-c(\d{8})\.parquet$")


class StoreError(KnotLedgerError):
    """A census directory is missing, foreign, or would be overwritten."""


class WriteError(StoreError):
    """Rows could not be converted to their table's Arrow schema (a failed run, not bad input)."""


def part_name(table: str, chunk: int) -> str:
    """Deterministic relative path of the part of ``table`` for ``chunk``."""
    return f"{table}/part-c{chunk:08d}.parquet"


def _sha256(path: Path) -> str:
    h = hashlib.sha256()
    with path.open("rb") as fh:
        for block in iter(lambda: fh.read(1 << 20), b""):
            h.update(block)
    return h.hexdigest()


_ERRNO = re.compile(r"\[errno (\d+)\]", re.IGNORECASE)


def _named(err: OSError, path: Path) -> OSError:
    """``err`` with a file name (write errors and Arrow's IO errors carry none)."""
    if err.filename is not None:
        return err
    code = err.errno
    if code is None:
        m = _ERRNO.search(str(err))
        code = int(m.group(1)) if m else None
    if code is None:
        return OSError(f"{path}: {err}")
    new = OSError(code, os.strerror(code), str(path))
    new.__cause__ = err
    return new


def _leftover(name: str) -> bool:
    """Files a killed start may leave in a directory that holds no census yet."""
    return name == LOCK_NAME or (name.startswith(".manifest") and ".tmp-" in name)


def _write_json_atomic(path: Path, obj: dict) -> None:
    tmp = path.with_name(f".{path.name}.tmp-{os.getpid()}")
    try:
        with tmp.open("w", encoding="utf-8") as fh:
            json.dump(obj, fh, indent=1, sort_keys=True)
            fh.write("\n")
            fh.flush()
            os.fsync(fh.fileno())
        os.replace(tmp, path)
    except OSError as err:
        raise _named(err, path) from err
    finally:
        try:
            tmp.unlink(missing_ok=True)
        except OSError:  # the directory itself may be gone
            pass


def to_arrow(table: str, rows: list[dict], metadata: dict[str, str]) -> pa.Table:
    """Rows -> Arrow table of the declared schema (unknown columns are an error)."""
    schema = SCHEMAS[table]
    names = set(schema.names)
    for row in rows:
        extra = set(row) - names
        if extra:
            raise StoreError(f"{table}: column(s) {', '.join(sorted(extra))} are not in schemas/tables.py")
    return pa.Table.from_pylist(rows, schema=schema.with_metadata(metadata))


def read_table(directory: str | Path, table: str) -> pa.Table:
    """Every committed part of ``table`` as one Arrow table (sorted by row_id)."""
    import pyarrow.dataset as ds
    from .reader import table_files
    files = [str(p) for p in table_files(directory, table)]
    t = ds.dataset(files, format="parquet", schema=SCHEMAS[table]).to_table()
    if "row_id" in t.column_names and t.num_rows:
        t = t.sort_by([("row_id", "ascending")] + ([("modulus", "ascending")] if table == "colorings" else []))
    return t


class CensusStore:
    """One census directory, seen by one writer (the whole census or one shard)."""

    def __init__(self, directory: str | Path, *, shard: Optional[tuple[int, int]] = None) -> None:
        self.dir = Path(directory)
        self.shard = shard
        self.manifest: dict = {}

    # ------------------------------------------------------------ names
    @property
    def manifest_path(self) -> Path:
        if self.shard:
            return self.dir / f"manifest.shard-{self.shard[0]}-of-{self.shard[1]}.json"
        return self.dir / "manifest.json"

    def _manifests(self) -> list[Path]:
        return sorted(self.dir.glob("manifest*.json"))

    def owns(self, chunk: int) -> bool:
        """Does this writer compute ``chunk``? (shard I of N: chunk mod N = I - 1)"""
        return self.shard is None or chunk % self.shard[1] == self.shard[0] - 1

    # ------------------------------------------------------------ opening
    def create(self, identity: dict, info: dict) -> None:
        """Start a new census (or join one as a new shard); never overwrite."""
        existing = self._manifests() if self.dir.exists() else []
        if self.dir.exists() and any(not _leftover(p.name) for p in self.dir.iterdir()):
            if not existing:
                raise StoreError(f"{self.dir}: directory is not empty and holds no census manifest; "
                                 "choose a new --out directory")
            if not self.shard or self.manifest_path.exists():
                raise StoreError(f"{self.dir}: a census is already there; use --resume to continue it "
                                 "(nothing was overwritten)")
            self._check_identity(existing, identity)
        self.dir.mkdir(parents=True, exist_ok=True)
        self.manifest = {"format": FORMAT, "census": identity, **info, "chunks": {},
                         "shard": list(self.shard) if self.shard else None, "knots": None}
        # the manifest first: a run killed while laying out the tables can be resumed
        _write_json_atomic(self.manifest_path, self.manifest)
        self._ensure_layout()

    def resume(self, identity: dict, info: dict) -> None:
        """Reopen a census (merging shard manifests when this writer is the whole census)."""
        existing = self._manifests() if self.dir.is_dir() else []
        if not existing:
            raise StoreError(f"{self.dir}: no census manifest here; run without --resume to start one")
        self._check_identity(existing, identity)
        if self.manifest_path.exists():
            self.manifest = self._load(self.manifest_path)
        else:
            self.manifest = {"format": FORMAT, "census": identity, **info, "chunks": {},
                             "shard": list(self.shard) if self.shard else None, "knots": None}
        self.manifest.update(info)
        if self.shard is None:
            for path in existing:
                if path != self.manifest_path:
                    self._merge(self._load(path))
        self._ensure_layout()
        self._drop_broken()
        _write_json_atomic(self.manifest_path, self.manifest)

    def _load(self, path: Path) -> dict:
        try:
            data = json.loads(path.read_text(encoding="utf-8"))
        except (OSError, ValueError) as err:
            raise StoreError(f"{path}: unreadable manifest ({err})") from err
        if data.get("format") != FORMAT:
            raise StoreError(f"{path}: not a knotledger census manifest")
        return data

    def _check_identity(self, paths: Iterable[Path], identity: dict) -> None:
        for path in paths:
            theirs = self._load(path).get("census", {})
            for key in sorted(set(identity) | set(theirs)):
                if theirs.get(key) != identity.get(key):
                    raise StoreError(f"{path.name}: census {key} differs from this run "
                                     f"({theirs.get(key)!r} vs {identity.get(key)!r}); "
                                     "a census directory holds one spec with one code version")

    def _merge(self, other: dict) -> None:
        mine = self.manifest["chunks"]
        for key, entry in other.get("chunks", {}).items():
            if key not in mine and self._intact(int(key), entry):
                mine[key] = entry

    def _intact(self, chunk: int, entry: dict) -> bool:
        for table, meta in entry["parts"].items():
            path = self.dir / part_name(table, chunk)
            if not path.is_file() or path.stat().st_size != meta["bytes"]:
                return False
        return True

    def _drop_broken(self) -> None:
        chunks = self.manifest["chunks"]
        for key in [k for k, e in chunks.items() if not self._intact(int(k), e)]:
            del chunks[key]

    def _ensure_layout(self) -> None:
        (self.dir / "_tmp").mkdir(exist_ok=True)
        meta = self.metadata()
        for table in SCHEMAS:
            (self.dir / table).mkdir(exist_ok=True)
            if not (self.dir / table / "part-schema.parquet").exists():
                self._publish(to_arrow(table, [], meta), f"{table}/part-schema.parquet")

    def prepare(self) -> None:
        """Delete every part (and temp file) that the manifest does not list.

        A shard touches only its own chunks and temp files; the whole census all of them
        (it runs under the exclusive lock, so no shard is writing).
        """
        listed = {(t, int(k)) for k, e in self.manifest["chunks"].items() for t in e["parts"]}
        mine = ".manifest*.tmp-*" if self.shard is None else f".{self.manifest_path.name}.tmp-*"
        for f in self.dir.glob(mine):  # a manifest write that was killed
            f.unlink(missing_ok=True)
        tag = self._tmp_tag()
        for f in (self.dir / "_tmp").iterdir():
            if f.is_dir() and self.shard is None:  # a knots build that was killed
                shutil.rmtree(f)
            elif self.shard is None or f.name.startswith(tag):
                f.unlink(missing_ok=True)
        for table in CHUNK_TABLES:
            for f in (self.dir / table).iterdir():
                m = _PART.match(f.name)
                if m and self.owns(int(m.group(1))) and (table, int(m.group(1))) not in listed:
                    f.unlink()
        knots = self.dir / "knots" / "part-knots.parquet"
        if self.shard is None and knots.exists() and not self.manifest.get("knots"):
            knots.unlink()

    # ------------------------------------------------------------ writing
    def metadata(self) -> dict[str, str]:
        """Parquet key-value metadata: code, schema and algorithm versions."""
        c = self.manifest.get("census", {})
        return {"knotledger.format": FORMAT, "knotledger.schema_version": SCHEMA_VERSION,
                "knotledger.versions": json.dumps(c.get("versions", {}), sort_keys=True),
                "knotledger.spec_sha256": str(c.get("spec_sha256", ""))}

    def _tmp_tag(self) -> str:
        return f"s{self.shard[0]}of{self.shard[1]}-" if self.shard else "main-"

    def _publish(self, table: pa.Table, rel: str) -> dict:
        tmp = self.dir / "_tmp" / f"{self._tmp_tag()}{rel.replace('/', '-')}.{os.getpid()}"
        try:
            pq.write_table(table, tmp, compression="zstd")
            with tmp.open("rb") as fh:
                os.fsync(fh.fileno())
            os.replace(tmp, self.dir / rel)
        except OSError as err:
            raise _named(err, self.dir / rel) from err
        finally:
            try:
                tmp.unlink(missing_ok=True)
            except OSError:  # the directory itself may be gone
                pass
        path = self.dir / rel
        return {"rows": table.num_rows, "bytes": path.stat().st_size, "sha256": _sha256(path)}

    def committed(self) -> set[int]:
        """The chunks this writer's manifest commits."""
        return {int(k) for k in self.manifest["chunks"]}

    def write_chunk(self, chunk: int, result: dict) -> dict:
        """Publish one chunk's parts, then record it in the manifest (the commit)."""
        meta = self.metadata()
        parts: dict = {}
        try:
            for table in CHUNK_TABLES:
                rows = result[table]
                if rows:
                    try:
                        arrow = to_arrow(table, rows, meta)
                    except (pa.ArrowException, StoreError) as err:
                        raise WriteError(f"chunk {chunk}: {table} rows do not fit the schema "
                                         f"({type(err).__name__}: {str(err).splitlines()[0]})") from err
                    parts[table] = self._publish(arrow, part_name(table, chunk))
            entry = {"parts": parts, **result["stats"]}
            self.manifest["chunks"][str(chunk)] = entry
            _write_json_atomic(self.manifest_path, self.manifest)
        except BaseException:  # nothing of a failed chunk stays behind
            self.manifest["chunks"].pop(str(chunk), None)
            for table in parts:
                try:
                    (self.dir / part_name(table, chunk)).unlink(missing_ok=True)
                except OSError:
                    pass
            raise
        return entry

    def write_knots(self, rows: list[dict], note: str) -> None:
        """Publish the knots table (replacing any previous one) and record it."""
        if rows:
            entry = self._publish(to_arrow("knots", rows, self.metadata()), "knots/part-knots.parquet")
        else:
            (self.dir / "knots" / "part-knots.parquet").unlink(missing_ok=True)
            entry = {"rows": 0}
        self.manifest["knots"] = {**entry, "note": note}
        _write_json_atomic(self.manifest_path, self.manifest)

    def save(self) -> None:
        """Rewrite the manifest (atomically)."""
        _write_json_atomic(self.manifest_path, self.manifest)

    def close(self) -> None:
        """Remove ``_tmp/`` when no writer has anything in it (shards may still)."""
        try:
            (self.dir / "_tmp").rmdir()
        except OSError:
            pass

    def verify(self) -> list[str]:
        """Checksums of every committed part; returns the problems found (empty = intact)."""
        bad = []
        for key, entry in sorted(self.manifest["chunks"].items(), key=lambda kv: int(kv[0])):
            for table, meta in entry["parts"].items():
                path = self.dir / part_name(table, int(key))
                if not path.is_file() or _sha256(path) != meta["sha256"]:
                    bad.append(f"{part_name(table, int(key))}: missing or checksum mismatch")
        return bad
