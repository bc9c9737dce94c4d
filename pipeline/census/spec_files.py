"""Rows of a ``file`` family: CSV, JSON Lines or plain text, read lazily.

Each yielded row is ``(notation text, labels JSON or None, source, error or None)``.
``source`` is ``"<path as written in the spec>:<line>"``.  A row that is malformed
before any diagram parsing (an empty cell, a line that is not a JSON object, a
missing ``diagram`` field) carries an ``error`` and becomes a ``rejects`` row; rows
whose notation does not parse are rejected later, by the worker, with the parser's
one-line reason.  Blank lines (and, in text files, lines starting with ``#``) are
not rows.
"""

from __future__ import annotations

import csv
import json
from pathlib import Path
from typing import Iterator, Optional

__all__ = ["read_rows"]

Row = tuple[str, Optional[str], str, Optional[str]]


def _labels(d: dict) -> Optional[str]:
    return json.dumps(d, separators=(",", ":"), ensure_ascii=False) if d else None


def read_rows(path: Path, fmt: str, column: str, shown: str) -> Iterator[Row]:
    """Yield the rows of one input file in file order."""
    if fmt == "csv":
        yield from _csv_rows(path, column, shown)
    elif fmt == "jsonl":
        yield from _jsonl_rows(path, column, shown)
    else:
        yield from _text_rows(path, shown)


def _csv_rows(path: Path, column: str, shown: str) -> Iterator[Row]:
    with path.open(newline="", encoding="utf-8") as fh:
        reader = csv.reader(fh)
        header = next(reader, [])
        idx = header.index(column)
        line = reader.line_num
        for rec in reader:
            start, line = line + 1, reader.line_num
            if not rec or all(not c.strip() for c in rec):
                continue
            src = f"{shown}:{start}"
            labels = {h: (rec[k] if k < len(rec) else None)
                      for k, h in enumerate(header) if k != idx}
            if len(rec) != len(header):
                yield (",".join(rec), _labels(labels), src,
                       f"{len(rec)} fields where the header has {len(header)}")
                continue
            text = rec[idx].strip()
            yield text, _labels(labels), src, None if text else f"empty {column!r} cell"


def _jsonl_rows(path: Path, column: str, shown: str) -> Iterator[Row]:
    with path.open(encoding="utf-8") as fh:
        for no, line in enumerate(fh, 1):
            if not line.strip():
                continue
            src = f"{shown}:{no}"
            try:
                obj = json.loads(line)
            except ValueError as err:
                yield line.strip()[:200], None, src, f"not valid JSON ({err.msg})"
                continue
            if not isinstance(obj, dict):
                yield line.strip()[:200], None, src, "not a JSON object"
                continue
            text = obj.get(column)
            labels = _labels({k: v for k, v in obj.items() if k != column})
            if not isinstance(text, str) or not text.strip():
                yield line.strip()[:200], labels, src, f"no string field {column!r}"
                continue
            yield text.strip(), labels, src, None


def _text_rows(path: Path, shown: str) -> Iterator[Row]:
    with path.open(encoding="utf-8") as fh:
        for no, line in enumerate(fh, 1):
            text = line.strip()
            if not text or text.startswith("#"):
                continue
            yield text, None, f"{shown}:{no}", None
