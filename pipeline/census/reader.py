"""Read a census directory back into Python: :func:`open_census`.

A census directory (written by ``knotledger run``) holds one directory of Parquet part
files per table -- ``diagrams/``, ``colorings/``, ``knots/``, ``rejects/`` -- and a
``manifest.json`` (or, while shards are still running, one ``manifest.shard-I-of-N.json``
per shard).  A part file counts only when a manifest commits it (same name, same size):
:func:`table_files` is the one place that lists the parts of a table, and every reader
(``open_census``, ``query``, ``check``, ``fit``, ``report``) goes through it, so a part
renamed into place by a run that died before its manifest write is never read.  Exact integers stay exact: a column ``X`` that
overflows int64 has a text twin ``X_text`` and :func:`exact_int` prefers it.

Example
-------
>>> census = open_census("harbour")                               # doctest: +SKIP
>>> census.diagrams.query("family == 'torus'")[["notation", "determinant"]]  # doctest: +SKIP
"""

from __future__ import annotations

import json
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any, Optional

from ..errors import QueryError

__all__ = ["TABLES", "Census", "open_census", "table_files", "census_path", "exact_int",
           "parse_params"]

#: The four tables of a census, in the order the report presents them.
TABLES = ("diagrams", "colorings", "knots", "rejects")


def census_path(directory: str | Path) -> Path:
    """Return ``directory`` resolved, after checking that it holds a census.

    Raises
    ------
    QueryError
        If the directory does not exist or has no ``diagrams/`` table.
    """
    path = Path(directory).expanduser().resolve()
    if not path.is_dir():
        raise QueryError(f"census: {directory} is not a directory")
    if not (path / "diagrams").is_dir():
        raise QueryError(f"census: {directory} has no diagrams/ table (run `knotledger run` first)")
    return path


def _manifests(directory: Path) -> list[dict]:
    """The parsed manifests of a census directory: ``manifest.json`` first, then shards."""
    paths = sorted(directory.glob("manifest*.json"), key=lambda p: (p.name != "manifest.json", p.name))
    out = []
    for path in paths:
        try:
            out.append(json.loads(path.read_text(encoding="utf-8")))
        except (OSError, ValueError) as err:
            raise QueryError(f"census: cannot read {path} ({err})") from err
    return out


def _committed(path: Path, meta: dict) -> bool:
    try:
        return path.is_file() and path.stat().st_size == meta.get("bytes")
    except OSError:
        return False


def table_files(directory: str | Path, table: str) -> list[Path]:
    """The Parquet part files of ``table`` that a manifest commits, sorted by name.

    The zero-row ``part-schema.parquet`` (which carries the schema) is always included
    when present; a chunk part counts when a manifest lists it with its byte size; the
    knots part when ``manifest.json`` records the knots table.  Files in the table
    directory that no manifest lists (a crash between a rename and the manifest write)
    are ignored.
    """
    if table not in TABLES:
        raise QueryError(f"census: unknown table {table!r} (tables: {', '.join(TABLES)})")
    directory = Path(directory)
    tdir = directory / table
    if not tdir.is_dir():
        return []
    files = {tdir / "part-schema.parquet"} if (tdir / "part-schema.parquet").is_file() else set()
    manifests = _manifests(directory)
    for manifest in manifests:
        for key, entry in (manifest.get("chunks") or {}).items():
            meta = (entry.get("parts") or {}).get(table)
            path = tdir / f"part-c{int(key):08d}.parquet"
            if meta and _committed(path, meta):
                files.add(path)
    knots = manifests[0].get("knots") if manifests and table == "knots" else None
    if knots and knots.get("rows") and _committed(tdir / "part-knots.parquet", knots):
        files.add(tdir / "part-knots.parquet")
    return sorted(files)


def _read_table(directory: Path, table: str):
    import pandas as pd
    import pyarrow as pa
    import pyarrow.parquet as pq

    files = table_files(directory, table)
    if not files:
        return pd.DataFrame()
    try:
        tables = [pq.read_table(f) for f in files]
        merged = pa.concat_tables(tables, promote_options="default")
    except Exception as err:  # a damaged part file: one line, not a traceback
        raise QueryError(f"census: cannot read {table}/ ({type(err).__name__}: {err})") from err
    # types_mapper keeps nullable integers exact (no silent int -> float on nulls)
    return merged.to_pandas(types_mapper=_nullable_types)


def _mark_duplicates(diagrams) -> None:
    """Add ``duplicate_of``: the row_id of the first row with the same diagram_id (else NA),
    the same computed column as the SQL view in :mod:`pipeline.explore.query`."""
    if diagrams.empty or "diagram_id" not in diagrams:
        return
    import pandas as pd
    from ..identify.classify import duplicate_of
    did = diagrams["diagram_id"]
    ids = did.astype(object).where(did.notna(), None).tolist()
    dup = duplicate_of(diagrams["row_id"].astype("int64").tolist(), ids)
    diagrams["duplicate_of"] = pd.array(dup, dtype=pd.Int64Dtype())


def _nullable_types(arrow_type):
    import pandas as pd
    import pyarrow as pa

    mapping = {pa.int8(): pd.Int8Dtype(), pa.int16(): pd.Int16Dtype(),
               pa.int32(): pd.Int32Dtype(), pa.int64(): pd.Int64Dtype(),
               pa.uint8(): pd.UInt8Dtype(), pa.uint16(): pd.UInt16Dtype(),
               pa.uint32(): pd.UInt32Dtype(), pa.uint64(): pd.UInt64Dtype(),
               pa.bool_(): pd.BooleanDtype()}
    return mapping.get(arrow_type)


@dataclass
class Census:
    """The tables of one census directory as pandas DataFrames.

    Attributes
    ----------
    path : Path
        The census directory.
    diagrams, colorings, knots, rejects : pandas.DataFrame
        One DataFrame per table (empty when the table has no part files).
        Integer columns use pandas' nullable integer dtypes, so a null never turns a
        column into floats.
    manifest : dict
        The parsed ``manifest.json`` (empty if absent).
    """

    path: Path
    diagrams: Any
    colorings: Any
    knots: Any
    rejects: Any
    manifest: dict = field(default_factory=dict)

    def row(self, row_id: int) -> dict:
        """Diagram row ``row_id`` as a dict (nulls as ``None``), with ``"colorings"``: its
        colouring rows as dicts, and ``"knot"``: its knots-table record (``{}`` if none)."""
        d = self.diagrams
        hit = d[d["row_id"] == row_id] if len(d) else d
        if not len(hit):
            raise QueryError(f"census: no diagram row {row_id}")
        def plain(rec: dict) -> dict:
            return {k: None if _is_missing(v) else v for k, v in rec.items()}
        out = plain(hit.iloc[0].to_dict())
        col, k = self.colorings, self.knots
        out["colorings"] = [plain(r) for r in col[col["row_id"] == row_id].to_dict("records")] if len(col) else []
        match = k[k["knot_key"] == out.get("knot_key")].to_dict("records") if len(k) else []
        out["knot"] = plain(match[0]) if match else {}
        return out


def open_census(directory: str | Path) -> Census:
    """Open a census directory and read its four tables into pandas DataFrames.

    Parameters
    ----------
    directory : str or Path
        A directory written by ``knotledger run``.

    Returns
    -------
    Census
        With attributes ``diagrams``, ``colorings``, ``knots``, ``rejects`` and ``manifest``.

    Raises
    ------
    QueryError
        If the directory is not a census or a part file cannot be read.
    """
    path = census_path(directory)
    frames = {t: _read_table(path, t) for t in TABLES}
    _mark_duplicates(frames["diagrams"])
    manifest: dict = {}
    mpath = path / "manifest.json"
    if mpath.is_file():
        try:
            manifest = json.loads(mpath.read_text())
        except ValueError as err:
            raise QueryError(f"census: manifest.json is not valid JSON ({err})") from err
    return Census(path=path, manifest=manifest, **frames)


def exact_int(value: Any, text: Any = None) -> Optional[int]:
    """The exact Python int of a stored integer, preferring its decimal-text twin.

    ``exact_int(None, "1234...")`` parses the text (used when the int64 column is null
    on overflow); a missing value on both sides gives ``None``.
    """
    if text is not None and not _is_missing(text):
        return int(str(text))
    if value is None or _is_missing(value):
        return None
    return int(value)


def _is_missing(value: Any) -> bool:
    try:
        import pandas as pd
        res = pd.isna(value)
        return bool(res) if not hasattr(res, "__len__") else False
    except (TypeError, ValueError):
        return False


def parse_params(text: Any) -> dict:
    """The family parameters of a row (``params`` column, JSON text) as a dict.

    Integers stay ints; fractions stored as text (``"3/5"``) stay text.  A missing or
    empty value gives ``{}``.
    """
    if text is None or _is_missing(text) or text == "":
        return {}
    if isinstance(text, dict):
        return dict(text)
    try:
        value = json.loads(text)
    except ValueError as err:
        raise QueryError(f"census: params is not JSON: {str(text)[:60]!r}") from err
    if not isinstance(value, dict):
        raise QueryError(f"census: params is not a JSON object: {str(text)[:60]!r}")
    return value
