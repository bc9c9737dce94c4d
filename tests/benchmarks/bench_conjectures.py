"""Conjecture-hunting benchmark: query / check / fit / open_census on a large synthetic table.

Run:  python tests/benchmarks/bench_conjectures.py [--rows 100000] [--out reports/bench_conjectures.md]

The tables are synthetic (two-bridge-like rows with determinant = alpha, invariant
factors (alpha), colourings for n = 2..16 from the Fox count formula) so that the
sizes can be large without running a census; only the reading and evaluation paths are
timed.  The same question is answered side by side by ``knotledger check`` (the safe
expression language, row by row in Python) and by one DuckDB query, and the ratio is
reported.
"""

from __future__ import annotations

import argparse
import json
import tempfile
import time
from math import gcd
from pathlib import Path


def _write(directory: Path, rows: int) -> None:
    import pyarrow as pa
    import pyarrow.parquet as pq

    alphas, betas = [], []
    a = 3
    while len(alphas) < rows:
        for b in range(1, a):
            if gcd(a, b) == 1:
                alphas.append(a)
                betas.append(b)
                if len(alphas) == rows:
                    break
        a += 1
    ids = list(range(rows))
    d = pa.table({
        "row_id": pa.array(ids, pa.int64()),
        "family": pa.array(["two_bridge"] * rows),
        "params": pa.array([json.dumps({"alpha": x, "beta": y}) for x, y in zip(alphas, betas)]),
        "notation": pa.array([f"rational:{x}/{y}" for x, y in zip(alphas, betas)]),
        "crossings": pa.array([0] * rows, pa.int32()),
        "components": pa.array([1 if x % 2 else 2 for x in alphas], pa.int32()),
        "determinant": pa.array(alphas, pa.int64()),
        "determinant_text": pa.array([str(x) for x in alphas]),
        "invariant_factors": pa.array([[str(x)] for x in alphas], pa.list_(pa.string())),
    })
    mods = list(range(2, 17))
    c = pa.table({
        "row_id": pa.array([i for i in ids for _ in mods], pa.int64()),
        "modulus": pa.array(mods * rows, pa.int32()),
        "count": pa.array([n * gcd(n, x) for x in alphas for n in mods], pa.int64()),
    })
    for name, table in (("diagrams", d), ("colorings", c)):
        (directory / name).mkdir(parents=True)
        pq.write_table(table, directory / name / "part-0.parquet")
    for name in ("knots", "rejects"):
        (directory / name).mkdir(parents=True)


def _time(fn):
    t0 = time.perf_counter()
    out = fn()
    return time.perf_counter() - t0, out


def main() -> None:
    parser = argparse.ArgumentParser()
    parser.add_argument("--rows", type=int, default=100_000)
    parser.add_argument("--out", default="reports/bench_conjectures.md")
    args = parser.parse_args()
    from pipeline.census.reader import open_census
    from pipeline.explore.claims import check_claim
    from pipeline.explore.fit import fit_family
    from pipeline.explore.query import run_query

    with tempfile.TemporaryDirectory() as tmp:
        census_dir = Path(tmp) / "c"
        _write(census_dir, args.rows)
        results = []
        t_open, census = _time(lambda: open_census(census_dir))
        results.append(("open_census (pandas)", t_open, ""))
        t_q, (_, rows) = _time(lambda: run_query(census_dir, "SELECT count(*) FILTER (WHERE determinant = "
                                                 "CAST(json_extract(params, '$.alpha') AS BIGINT)) FROM diagrams"))
        results.append(("query: det = alpha (DuckDB)", t_q, f"{rows[0][0]} rows hold"))
        t_c, r = _time(lambda: check_claim(census, "determinant == alpha", family="two_bridge"))
        results.append(("check: det = alpha (safe language)", t_c, f"{r.held} held; {t_c / t_q:.1f}x the query"))
        t_c7, r7 = _time(lambda: check_claim(census, "colorable(7) == (determinant % 7 == 0)"))
        results.append(("check: colorable(7) iff 7 divides det", t_c7, f"{r7.held} held"))
        t_f, (_, classes, _) = _time(lambda: fit_family(census, "two_bridge", "determinant"))
        results.append(("fit: det in alpha, beta", t_f, classes[0].formula("determinant")))
    lines = [f"# Conjecture-hunting benchmark ({args.rows} synthetic rows, one machine, one run)", "",
             "| step | seconds | note |", "|---|---|---|"]
    lines += [f"| {name} | {sec:.2f} | {note} |" for name, sec, note in results]
    text = "\n".join(lines) + "\n"
    Path(args.out).write_text(text)
    print(text)


if __name__ == "__main__":
    main()
