"""``knotledger query DIR SQL``: read-only SQL over the tables of a census.

The four tables appear as DuckDB views ``diagrams``, ``colorings``, ``knots`` and
``rejects`` over the Parquet part files of the census directory.

Read-only is enforced in two layers:

1. The SQL text is split into statements by DuckDB's own parser
   (:func:`duckdb.extract_statements`); exactly one statement is accepted and its
   statement type must be ``SELECT`` (which covers ``WITH ... SELECT``, ``FROM t``,
   ``DESCRIBE`` and ``SUMMARIZE``).  CREATE, INSERT, UPDATE, DELETE, COPY, ATTACH,
   PRAGMA, SET, CALL, LOAD/INSTALL, EXPORT, EXPLAIN ... are refused before anything runs.
   (DuckDB's sandbox settings alone would still let ``COPY ... TO`` write inside DIR.)
2. The statement runs in an in-memory database whose file access is limited to DIR
   (``enable_external_access = false`` with ``allowed_directories = [DIR]``), with
   extension auto-loading off and the configuration locked, so a query cannot read
   other files or undo the settings.

Output formats: ``table`` (aligned text), ``csv``, ``json`` (a list of objects; integers
exact) and ``latex`` (a ``tabular`` for papers).
"""

from __future__ import annotations

import argparse
import csv
import io
import json
import sys
from decimal import Decimal
from pathlib import Path
from typing import Any, Sequence

from ..census.reader import TABLES, census_path, table_files
from ..errors import QueryError

__all__ = ["FORMATS", "check_read_only", "connect", "run_query", "format_result",
           "add_arguments", "main"]

FORMATS = ("table", "csv", "json", "latex")


#: computed columns added to the views: ``duplicate_of`` is the row_id of the first row of
#: the census with the same diagram_id (the same diagram up to relabelling; null for the first)
_VIEW_COLUMNS = {
    "diagrams": "*, CASE WHEN diagram_id IS NOT NULL AND min(row_id) OVER (PARTITION BY diagram_id) < row_id "
                "THEN min(row_id) OVER (PARTITION BY diagram_id) END AS duplicate_of",
}


def check_read_only(sql: str) -> str:
    """Return the single SELECT statement of ``sql``, or raise :class:`QueryError`.

    The text is split and classified by DuckDB's parser, never by pattern matching.

    Raises
    ------
    QueryError
        If the SQL does not parse, holds no statement or several, or the statement
        is not a SELECT (e.g. ``COPY ... TO``: "refused: COPY statement (only SELECT/WITH
        queries are allowed)").
    """
    import duckdb

    try:
        statements = duckdb.extract_statements(sql)
    except duckdb.Error as err:
        raise QueryError(f"bad SQL: {_one_line(err)}") from err
    if not statements:
        raise QueryError("bad SQL: no statement given")
    if len(statements) > 1:
        raise QueryError(f"refused: {len(statements)} statements given (one SELECT/WITH query per call)")
    stmt = statements[0]
    kind = getattr(stmt.type, "name", str(stmt.type))
    if kind != "SELECT":
        raise QueryError(f"refused: {kind} statement (only SELECT/WITH queries are allowed)")
    return stmt.query


def connect(directory: str | Path):
    """An in-memory DuckDB connection with read-only views over the census tables.

    File access is limited to the census directory and the configuration is locked
    after the views are created.
    """
    import duckdb

    path = census_path(directory)
    con = duckdb.connect(":memory:", config={"autoinstall_known_extensions": False,
                                             "autoload_known_extensions": False})
    root = str(path) + "/"
    con.execute("SET allowed_directories = [" + _sql_string(root) + "]")
    con.execute("SET enable_external_access = false")
    for table in TABLES:
        files = table_files(path, table)
        if files:
            listed = ", ".join(_sql_string(str(f)) for f in files)  # the committed parts only
            source = f"read_parquet([{listed}], union_by_name = true)"
            con.execute(f"CREATE VIEW {table} AS SELECT {_VIEW_COLUMNS.get(table, '*')} FROM {source}")
    con.execute("SET lock_configuration = true")
    return con


def run_query(directory: str | Path, sql: str) -> tuple[list[str], list[tuple]]:
    """Run one read-only query on a census; return ``(column names, rows)``.

    Values are exact Python objects (ints, str, lists); nothing goes through floats
    unless the query itself asks for floating point.

    Raises
    ------
    QueryError
        If the SQL is refused (see :func:`check_read_only`) or fails.
    """
    import duckdb

    query = check_read_only(sql)
    con = connect(directory)
    try:
        cur = con.execute(query)
        names = [d[0] for d in cur.description or []]
        rows = cur.fetchall()
    except duckdb.Error as err:
        raise QueryError(f"query failed: {_one_line(err)}") from err
    finally:
        con.close()
    return names, rows


def _sql_string(text: str) -> str:
    return "'" + text.replace("'", "''") + "'"


def _one_line(err: BaseException) -> str:
    text = " ".join(str(err).split())
    return text[:300]


# ---------------------------------------------------------------- formatting
def _plain(value: Any) -> Any:
    """JSON-ready value: exact ints stay ints, decimals become exact text."""
    if isinstance(value, Decimal):
        return int(value) if value == value.to_integral_value() else str(value)
    if isinstance(value, (list, tuple)):
        return [_plain(v) for v in value]
    if isinstance(value, dict):
        return {str(k): _plain(v) for k, v in value.items()}
    if isinstance(value, (bytes, bytearray)):
        return value.hex()
    if isinstance(value, (str, int, float, bool)) or value is None:
        return value
    return str(value)


def _text(value: Any) -> str:
    value = _plain(value)
    if value is None:
        return ""
    if isinstance(value, (list, dict)):
        return json.dumps(value)
    return str(value)


def _latex_escape(text: str) -> str:
    repl = {"\\": r"\textbackslash{}", "&": r"\&", "%": r"\%", "$": r"\$", "#": r"\#",
            "_": r"\_", "{": r"\{", "}": r"\}", "~": r"\textasciitilde{}", "^": r"\textasciicircum{}"}
    return "".join(repl.get(ch, ch) for ch in text)


def format_result(names: Sequence[str], rows: Sequence[tuple], fmt: str = "table") -> str:
    """Render a query result as ``table``, ``csv``, ``json`` or ``latex`` text."""
    if fmt == "json":
        return json.dumps([{n: _plain(v) for n, v in zip(names, row)} for row in rows], indent=1) + "\n"
    if fmt == "csv":
        buf = io.StringIO()
        writer = csv.writer(buf, lineterminator="\n")
        writer.writerow(names)
        for row in rows:
            writer.writerow([_text(v) for v in row])
        return buf.getvalue()
    if fmt == "latex":
        numeric = [all(isinstance(_plain(r[i]), int) or r[i] is None for r in rows) and rows
                   for i in range(len(names))]
        spec = "".join("r" if num else "l" for num in numeric)
        lines = [r"\begin{tabular}{" + spec + "}", r"\hline",
                 " & ".join(_latex_escape(n) for n in names) + r" \\", r"\hline"]
        for row in rows:
            lines.append(" & ".join(_latex_escape(_text(v)) for v in row) + r" \\")
        lines += [r"\hline", r"\end{tabular}"]
        return "\n".join(lines) + "\n"
    if fmt != "table":
        raise QueryError(f"unknown format {fmt!r} (formats: {', '.join(FORMATS)})")
    cells = [[_text(v).replace("\r", "\\r").replace("\n", "\\n") for v in row] for row in rows]
    widths = [max([len(n)] + [len(r[i]) for r in cells]) for i, n in enumerate(names)]
    right = [all(isinstance(_plain(r[i]), int) or r[i] is None for r in rows) for i in range(len(names))]

    def line(values):
        return "  ".join(v.rjust(w) if rt else v.ljust(w)
                         for v, w, rt in zip(values, widths, right)).rstrip()

    out = [line(names), "  ".join("-" * w for w in widths)]
    out += [line(r) for r in cells]
    out.append(f"({len(rows)} row{'s' if len(rows) != 1 else ''})")
    return "\n".join(out) + "\n"


# ---------------------------------------------------------------- command
def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("directory", metavar="DIR", help="census directory")
    parser.add_argument("sql", metavar="SQL",
                        help="one SELECT/WITH query over diagrams, colorings, knots, rejects")
    parser.add_argument("--format", choices=FORMATS, default="table", help="output format (default table)")


def main(args: argparse.Namespace) -> int:
    names, rows = run_query(args.directory, args.sql)
    sys.stdout.write(format_result(names, rows, args.format))
    return 0
