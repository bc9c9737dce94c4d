"""Benchmark of the signature (Goeritz matrix + Gordon–Litherland, exact inertia).

Times ``signature`` on the families of the Jones benchmark — torus knots T(3,q),
T(4,q), pretzel links P(a,a,a,a), two-bridge chains conway:2 2 ... 2 and
conway:3 3 ... 3 — with up to about 400 crossings, and fits the growth exponent k
of time ≈ C·n^k (least squares on log-log, n ≥ 50).  Each timing starts from a
freshly parsed diagram (parsing untimed; faces, colouring, Goeritz matrix and the
elimination timed) and is the best of ``--repeat`` runs.

Side by side in the same run: the sparse fmpq elimination against a dense
Fraction LDLᵀ of the same Goeritz matrix (the obviously-correct route), as ratios.

Usage::

    python tests/benchmarks/bench_signature.py [--repeat 3] [--out reports/bench_signature.md]
"""

from __future__ import annotations

import argparse
import math
import os
import platform
import sys
import time
from fractions import Fraction

import flint

from pipeline.invariants import signature as sigmod
from pipeline.diagrams.notation import parse
from _bench import fit_exponent, short

FAMILIES = {
    "T(3,q)": [f"torus:3,{q}" for q in (13, 25, 50, 100, 200)],
    "T(4,q)": [f"torus:4,{q}" for q in (9, 17, 33, 67, 133)],
    "P(a,a,a,a)": [f"pretzel:{a},{a},{a},{a}" for a in (6, 12, 25, 50, 100)],
    "conway 2 2 ... 2": ["conway:" + " ".join(["2"] * k) for k in (13, 25, 50, 100, 200)],
    "conway 3 3 ... 3": ["conway:" + " ".join(["3"] * k) for k in (9, 17, 33, 67, 133)],
}
SIDE_BY_SIDE = ["torus:3,25", "torus:4,33", "pretzel:25,25,25,25", "conway:" + " ".join(["2"] * 50),
                "torus:3,100"]


def dense_fraction_inertia(m: list[list[int]]) -> tuple[int, int]:
    """(positive, negative) by dense symmetric elimination over Fraction (slow route)."""
    a = [[Fraction(v) for v in row] for row in m]
    n, pos, neg = len(a), 0, 0
    alive = list(range(n))
    while alive:
        piv = next((i for i in alive if a[i][i] != 0), None)
        if piv is None:
            pair = next(((i, j) for i in alive for j in alive if a[i][j] != 0), None)
            if pair is None:
                break
            i, j = pair
            for k in alive:  # row/col op e_i += e_j makes a_ii = 2 a_ij ≠ 0
                a[i][k] += a[j][k]
            for k in alive:
                a[k][i] += a[k][j]
            piv = i
        p = a[piv][piv]
        pos, neg = (pos + 1, neg) if p > 0 else (pos, neg + 1)
        alive.remove(piv)
        for j in alive:
            f = a[j][piv] / p
            if f:
                for k in alive:
                    a[j][k] -= f * a[piv][k]
    return pos, neg


def timed(fn, repeat: int) -> float:
    best = math.inf
    for _ in range(repeat):
        t0 = time.perf_counter()
        fn()
        best = min(best, time.perf_counter() - t0)
    return best


def time_signature(text: str, repeat: int) -> tuple[float, int]:
    best, value = math.inf, None
    for _ in range(repeat):
        d = parse(text)
        sigmod.signature_data.cache_clear()
        t0 = time.perf_counter()
        value = sigmod.signature(d)
        best = min(best, time.perf_counter() - t0)
    return best, value




def main(argv: list[str] | None = None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--repeat", type=int, default=3)
    ap.add_argument("--out", default="reports/bench_signature.md")
    args = ap.parse_args(argv)

    rows, fits = [], {}
    for family, texts in FAMILIES.items():
        points = []
        for text in texts:
            d = parse(text)
            secs, value = time_signature(text, args.repeat)
            size = len(sigmod.goeritz_matrix(d))
            rows.append((family, short(text), d.n_crossings, d.n_components, size, value, secs))
            points.append((d.n_crossings, secs))
            print(f"{family:18} {short(text):22} n={d.n_crossings:4d} σ={value:5d} {secs * 1000:9.2f} ms",
                  file=sys.stderr)
        fits[family] = fit_exponent([p for p in points if p[0] >= 50])

    side = []
    for text in SIDE_BY_SIDE:
        d = parse(text)
        g = sigmod.goeritz_matrix(d)
        fast = timed(lambda: sigmod.symmetric_inertia(g), args.repeat)
        t0 = time.perf_counter()
        slow_pn = dense_fraction_inertia(g)
        slow = time.perf_counter() - t0
        p, n, _, _ = sigmod.symmetric_inertia(g)
        assert slow_pn == (p, n), text
        side.append((short(text), d.n_crossings, len(g), fast, slow))

    lines = [
        "# Benchmark: signature by Goeritz matrix and Gordon–Litherland correction",
        "",
        f"Script: `tests/benchmarks/bench_signature.py` (best of {args.repeat} runs; each run starts "
        "from a freshly parsed diagram, so faces, checkerboard colouring, Goeritz matrix and the exact "
        f"elimination are all timed). Machine: {platform.machine()}, {os.cpu_count()} cores (shared "
        f"with other jobs during the run), Python {platform.python_version()}, python-flint "
        f"{flint.__version__}.",
        "",
        "Method: σ = sign(G) − μ (C. McA. Gordon, R. A. Litherland, \"On the signature of a link\", "
        "Invent. Math. 47 (1978)); sign(G) by sparse symmetric elimination over Q with python-flint "
        "`fmpq` entries and least-fill pivots (exact; no floating point).",
        "",
        "## Growth exponent (time ≈ C·n^k, least squares on log-log, n ≥ 50)",
        "",
        "| family | k |",
        "|---|---|",
    ]
    lines += [f"| {f} | {k:.2f} |" for f, k in fits.items()]
    lines += [
        "",
        "## Timings",
        "",
        "| family | diagram | crossings | components | Goeritz size | σ | time (ms) |",
        "|---|---|---|---|---|---|---|",
    ]
    lines += [f"| {f} | `{t}` | {n} | {c} | {g} | {s} | {secs * 1000:.2f} |" for f, t, n, c, g, s, secs in rows]
    lines += [
        "",
        "## Side by side: sparse fmpq elimination vs dense Fraction LDLᵀ (same Goeritz matrix)",
        "",
        "| diagram | crossings | Goeritz size | sparse (ms) | dense Fraction (ms) | ratio |",
        "|---|---|---|---|---|---|",
    ]
    lines += [f"| `{t}` | {n} | {g} | {f * 1000:.2f} | {s * 1000:.2f} | {s / f:.1f}× |"
              for t, n, g, f, s in side]
    lines.append("")
    os.makedirs(os.path.dirname(args.out) or ".", exist_ok=True)
    with open(args.out, "w") as fh:
        fh.write("\n".join(lines))
    print(f"wrote {args.out}", file=sys.stderr)
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
