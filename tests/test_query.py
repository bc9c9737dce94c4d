"""knotledger query: read-only SQL over the census views, and the open_census API."""

from __future__ import annotations

import hashlib
import json
from math import gcd
from pathlib import Path

import pytest

from _census_fixture import shared_census
from pipeline.census.reader import TABLES, open_census
from pipeline.cli import main as cli
from pipeline.errors import QueryError
from pipeline.explore.query import check_read_only, format_result, run_query


@pytest.fixture(scope="module")
def census(tmp_path_factory) -> Path:
    return shared_census(tmp_path_factory)


def _checksums(directory: Path) -> dict:
    return {str(p.relative_to(directory)): hashlib.sha256(p.read_bytes()).hexdigest()
            for p in sorted(directory.rglob("*")) if p.is_file()}


WRITING = {
    "create": "CREATE TABLE t AS SELECT * FROM diagrams",
    "insert": "INSERT INTO diagrams SELECT * FROM diagrams",
    "copy-to-inside-dir": "COPY (SELECT * FROM diagrams) TO '{dir}/diagrams/evil.parquet' (FORMAT parquet)",
    "copy-csv": "COPY diagrams TO '{dir}/leak.csv'",
    "attach": "ATTACH '{dir}/x.duckdb' AS x",
    "pragma": "PRAGMA version",
    "set": "SET enable_external_access = true",
    "update": "UPDATE diagrams SET determinant = 0",
    "delete": "DELETE FROM diagrams",
    "drop": "DROP VIEW diagrams",
    "export": "EXPORT DATABASE '{dir}/dump'",
    "install": "INSTALL httpfs",
    "two-statements": "SELECT 1; COPY (SELECT 1) TO '{dir}/y.csv'",
    "call": "CALL pragma_version()",
}


@pytest.mark.parametrize("sql", WRITING.values(), ids=WRITING.keys())
def test_writing_statement_fails_and_tables_are_unchanged(census, sql, capsys):
    before = _checksums(census)
    rc = cli(["query", str(census), sql.format(dir=census)])
    err = capsys.readouterr().err
    assert rc == 2
    assert err.count("\n") == 1 and "error" in err
    assert _checksums(census) == before


def test_refusal_names_the_statement_type():
    with pytest.raises(QueryError, match="refused: COPY statement"):
        check_read_only("COPY (SELECT 1) TO 'x.csv'")
    with pytest.raises(QueryError, match="refused: CREATE statement"):
        check_read_only("create table t(a int)")
    # a keyword inside a string literal is not a statement: the parser, not a regex, decides
    assert "COPY" in check_read_only("SELECT 'COPY x TO y; DROP TABLE z' AS s")


def test_reading_outside_the_census_directory_is_refused(census):
    with pytest.raises(QueryError, match="Permission|disabled"):
        run_query(census, "SELECT * FROM read_csv('/etc/passwd')")


def test_configuration_is_locked(census):
    with pytest.raises(QueryError):
        run_query(census, "SELECT * FROM query('SET enable_external_access = true')")


def test_bad_sql_is_one_line_exit_2(census, capsys):
    assert cli(["query", str(census), "SELEC nonsense"]) == 2
    assert capsys.readouterr().err.count("\n") == 1


def test_two_bridge_determinant_equals_alpha_by_sql(census):
    # det b(alpha, beta) = alpha -- Schubert, Math. Z. 65 (1956)
    names, rows = run_query(census, """
        WITH t AS (SELECT CAST(json_extract(params, '$.alpha') AS BIGINT) AS alpha, determinant
                   FROM diagrams WHERE family = 'two_bridge')
        SELECT count(*) AS n, count(*) FILTER (WHERE alpha = determinant) AS ok FROM t""")
    n, ok = rows[0]
    assert n > 50 and ok == n


def test_views_see_every_part_file(census):
    c = open_census(census)
    _, rows = run_query(census, "SELECT count(*) FROM diagrams")
    assert rows[0][0] == len(c.diagrams) > 0
    _, rows = run_query(census, "SELECT count(DISTINCT row_id) FROM diagrams")
    assert rows[0][0] == len(c.diagrams)  # no chunk seen twice


def test_open_census_returns_all_tables(census):
    c = open_census(census)
    for t in TABLES:
        assert hasattr(getattr(c, t), "columns")
    assert {"row_id", "family", "params", "notation", "determinant"} <= set(c.diagrams.columns)
    assert {"row_id", "modulus", "count"} <= set(c.colorings.columns)
    # Fox 3-colourings of the trefoil T(2,3): 9 (3 trivial) -- common practice
    row = c.diagrams[c.diagrams["params"].map(json.loads).map(lambda p: p == {"p": 2, "q": 3})
                     & (c.diagrams["family"] == "torus")]
    rid = int(row["row_id"].iloc[0])
    col = c.colorings[(c.colorings["row_id"] == rid) & (c.colorings["modulus"] == 3)]
    assert int(col["count"].iloc[0]) == 9


def test_open_census_on_a_missing_directory_is_a_one_line_error(tmp_path):
    with pytest.raises(QueryError, match="not a directory"):
        open_census(tmp_path / "nope")
    with pytest.raises(QueryError, match="no diagrams/ table"):
        open_census(tmp_path)


def test_formats_round_trip_exact_integers():
    big = 10 ** 83 + 7  # beyond int64 and DECIMAL(38): must stay exact
    names, rows = ["notation", "determinant_text", "n"], [("rational:3/1", str(big), 3), ("x_y", None, 5)]
    out = json.loads(format_result(names, rows, "json"))
    assert out[0]["determinant_text"] == str(big) and out[1]["n"] == 5
    csv_text = format_result(names, rows, "csv")
    assert csv_text.splitlines()[0] == "notation,determinant_text,n" and str(big) in csv_text
    latex = format_result(names, rows, "latex")
    assert latex.startswith(r"\begin{tabular}{llr}") and r"x\_y" in latex
    table = format_result(names, rows, "table")
    assert table.rstrip().endswith("(2 rows)")


def test_query_result_matches_pandas(census):
    c = open_census(census)
    names, rows = run_query(census, "SELECT family, sum(crossings) FROM diagrams GROUP BY family ORDER BY family")
    expected = c.diagrams.groupby("family")["crossings"].sum()
    assert {f: int(s) for f, s in rows} == {f: int(s) for f, s in expected.items()}


def test_colorings_table_matches_fox_count_formula(census):
    # col_n = n * prod gcd(n, d_i) -- Przytycki 1998 (memory)
    c = open_census(census)
    factors = {int(r): [int(x) for x in f] for r, f in zip(c.diagrams["row_id"], c.diagrams["invariant_factors"])}
    sample = c.colorings.head(300)
    for rid, n, count in zip(sample["row_id"], sample["modulus"], sample["count"]):
        expect = int(n)
        for d in factors[int(rid)]:
            expect *= gcd(int(n), d) if d else int(n)
        assert int(count) == expect
