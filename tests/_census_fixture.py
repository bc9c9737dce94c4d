"""A small census directory for the query/claim/fit/report tests.

If ``knotledger run`` is available it builds the census with it (the real writer);
otherwise it writes the four tables itself with pyarrow, computing the colouring
invariants straight from the definition (colouring matrix of the family diagram ->
Smith normal form by python-flint), so the values are genuine, not typed in.
"""

from __future__ import annotations

import hashlib
import json
from math import gcd
from pathlib import Path

SPEC = """\
[census]
name = "test-conjectures"
max_modulus = 11

[[family]]
kind = "torus"
p = [2, 5]
q = [2, 9]

[[family]]
kind = "pretzel"
length = 3
entries = [-3, 3]

[[family]]
kind = "two_bridge"
alpha = [3, 21]
"""

MAX_MODULUS = 11


def _real_run_available() -> bool:
    try:
        import pipeline.run  # noqa: F401
        import pipeline.store  # noqa: F401
    except ImportError:
        return False
    return True


def build_census(tmp: Path) -> Path:
    """Write the test census under ``tmp`` and return its directory."""
    out = tmp / "census"
    if _real_run_available():
        from pipeline.cli import main
        spec = tmp / "spec.toml"
        spec.write_text(SPEC)
        rc = main(["run", str(spec), "--out", str(out), "--jobs", "1"])
        assert rc == 0, "knotledger run failed on the test spec"
        return out
    return _write_fixture(out)


# ------------------------------------------------------------ fallback writer
def _colouring_invariants(d):
    """(invariant factors, determinant) from the colouring matrix (DESIGN.md definition)."""
    import flint

    arc = d.arc_of_label
    ncols = len(d.arcs) + d.free_loops
    rows = []
    for i, (a, b, c, dd) in enumerate(d.pd):
        row = [0] * ncols
        over = arc[b]
        row[over] += 2
        row[arc[a]] -= 1
        row[arc[c]] -= 1
        rows.append(row)
    if not rows:
        return [0] * (ncols - 1), 0 if ncols > 1 else 1
    m = flint.fmpz_mat(rows)
    s = m.snf()
    r = m.rank()
    diag = [int(s[i, i]) for i in range(r)]
    factors = [abs(x) for x in diag if abs(x) != 1] + [0] * (ncols - r - 1)
    det = 0 if 0 in factors else 1
    if det:
        for f in factors:
            det *= f
    return factors, det


def _write_fixture(out: Path) -> Path:
    import pyarrow as pa
    import pyarrow.parquet as pq
    from pipeline.families import pretzel, torus, two_bridge

    work = []
    for p in range(2, 6):
        for q in range(2, 10):
            work.append(("torus", {"p": p, "q": q}, lambda p=p, q=q: torus.diagram(p, q)))
    rng = [v for v in range(-3, 4) if v]
    for a in rng:
        for b in rng:
            for c in rng:
                work.append(("pretzel", {"p1": a, "p2": b, "p3": c},
                             lambda e=(a, b, c): pretzel.diagram(e)))
    for alpha in range(3, 22):
        for beta in range(1, alpha):
            if gcd(alpha, beta) == 1:
                work.append(("two_bridge", {"alpha": alpha, "beta": beta},
                             lambda a=alpha, b=beta: two_bridge.diagram(a, b)))
    diagrams, colorings = [], []
    for row_id, (family, params, make) in enumerate(work):
        d = make()
        factors, det = _colouring_invariants(d)
        key = "k" + hashlib.sha256(json.dumps(sorted(factors)).encode()).hexdigest()[:10]
        diagrams.append({
            "row_id": row_id, "diagram_id": hashlib.sha256(d.to_notation().encode()).hexdigest(),
            "family": family, "params": json.dumps(params), "notation": d.to_notation(),
            "crossings": d.n_crossings, "components": d.n_components, "writhe": d.writhe,
            "determinant": det, "determinant_text": str(det),
            "invariant_factors": [str(f) for f in factors], "signature": None,
            "alexander": None, "jones": None, "chirality": "unknown", "knot_key": key,
            "status": "ok", "checks_failed": [],
        })
        for n in range(2, MAX_MODULUS + 1):
            count = n
            for f in factors:
                count *= gcd(n, f) if f else n
            colorings.append({"row_id": row_id, "modulus": n, "count": count,
                              "count_text": str(count), "min_colors": None})
    keys = {}
    for r in diagrams:
        keys.setdefault(r["knot_key"], []).append(r)
    knots = [{"knot_key": k, "representative": v[0]["notation"], "n_diagrams": len(v),
              "proof": "fingerprint only", "mirror_key": k, "amphichiral": None}
             for k, v in sorted(keys.items())]
    schema_d = pa.schema([("row_id", pa.int64()), ("diagram_id", pa.string()), ("family", pa.string()),
                          ("params", pa.string()), ("notation", pa.string()), ("crossings", pa.int64()),
                          ("components", pa.int64()), ("writhe", pa.int64()), ("determinant", pa.int64()),
                          ("determinant_text", pa.string()), ("invariant_factors", pa.list_(pa.string())),
                          ("signature", pa.int64()), ("alexander", pa.string()), ("jones", pa.string()),
                          ("chirality", pa.string()), ("knot_key", pa.string()), ("status", pa.string()),
                          ("checks_failed", pa.list_(pa.string()))])
    schema_c = pa.schema([("row_id", pa.int64()), ("modulus", pa.int64()), ("count", pa.int64()),
                          ("count_text", pa.string()), ("min_colors", pa.int64())])
    schema_k = pa.schema([("knot_key", pa.string()), ("representative", pa.string()),
                          ("n_diagrams", pa.int64()), ("proof", pa.string()),
                          ("mirror_key", pa.string()), ("amphichiral", pa.bool_())])
    schema_r = pa.schema([("source", pa.string()), ("reason", pa.string())])
    half = len(diagrams) // 2
    for name, rows, schema, parts in [("diagrams", diagrams, schema_d, 2), ("colorings", colorings, schema_c, 1),
                                      ("knots", knots, schema_k, 1), ("rejects", [], schema_r, 1)]:
        (out / name).mkdir(parents=True, exist_ok=True)
        chunks = [rows[:half], rows[half:]] if parts == 2 else [rows]
        for j, chunk in enumerate(chunks):
            pq.write_table(pa.Table.from_pylist(chunk, schema=schema), out / name / f"part-{j:05d}.parquet")
    (out / "manifest.json").write_text(json.dumps({"chunks": [], "timings": {"total_seconds": 0.0}}))
    return out


_CACHE: dict = {}


def shared_census(tmp_path_factory) -> Path:
    """One census per test session (built on first use; tests must not modify it)."""
    if "dir" not in _CACHE:
        _CACHE["dir"] = build_census(tmp_path_factory.mktemp("shared"))
    return _CACHE["dir"]
