"""Benchmark of diagram identity (canonical form) and knot keys.

Times :func:`pipeline.diagrams.canonical.canonical_text` on torus knots T(3,q), T(2,q),
pretzel links P(a,a,a,a), two-bridge chains conway:2 2 ... 2 and asymmetric
Montesinos knots, up to about 1000 crossings, and fits the growth exponent k of
time ≈ C·n^k (least squares on log-log).  Side by side in the same run: the same
canonical form with the automorphism pruning switched off (identical output,
checked), as ratios.  Also times :func:`pipeline.identify.classify.knot_key` on normal-form
rows (no invariants needed).

Usage::

    python tests/benchmarks/bench_classify.py [--repeat 3] [--out reports/bench_classify.md]
"""

from __future__ import annotations

import argparse
import math
import platform
import sys
import time

from pipeline.diagrams.canonical import canonical_pd, canonical_text
from pipeline.identify.classify import knot_key
from pipeline.diagrams.notation import parse
from _bench import fit_exponent as slope

FAMILIES = {
    "T(3,q)": [f"torus:3,{q}" for q in (13, 25, 50, 100, 200, 400)],
    "T(2,q)": [f"torus:2,{q}" for q in (25, 51, 101, 201, 401, 801)],
    "P(a,a,a,a)": [f"pretzel:{a},{a},{a},{a}" for a in (6, 12, 25, 50, 100, 200)],
    "conway 2 2 ... 2": ["conway:" + " ".join(["2"] * k) for k in (13, 25, 50, 100, 200, 400)],
    "M(1/3,2/5,3/7,a)": [f"montesinos:1/3,2/5,3/7,{a}/{a + 1}" for a in (4, 8, 16, 32, 64)],
}
SIDE_BY_SIDE = ["torus:3,50", "torus:2,101", "pretzel:25,25,25,25", "conway:" + " ".join(["2"] * 50),
                "montesinos:1/3,2/5,3/7,16/17"]


def best_of(fn, repeat):
    best = math.inf
    for _ in range(repeat):
        t0 = time.perf_counter()
        fn()
        best = min(best, time.perf_counter() - t0)
    return best



def main(argv=None) -> int:
    ap = argparse.ArgumentParser()
    ap.add_argument("--repeat", type=int, default=3)
    ap.add_argument("--out", default="reports/bench_classify.md")
    args = ap.parse_args(argv)
    lines = ["# Benchmark: diagram identity (canonical form) and knot keys", "",
             f"Script: `tests/benchmarks/bench_classify.py` (best of {args.repeat} runs, diagrams parsed "
             f"untimed). Machine: {platform.machine()}, 2 cores shared with other jobs, Python "
             f"{sys.version.split()[0]}.", "",
             "Method: every directed start of each piece and of its turn-over is walked, codes compared "
             "lazily; equal codes give a map automorphism whose cycles are skipped.", "",
             "## Timings", "", "| family | diagram | crossings | time (ms) |", "|---|---|---|---|"]
    fits = []
    for fam, names in FAMILIES.items():
        pts = []
        for name in names:
            d = parse(name)
            t = best_of(lambda: canonical_text(d), args.repeat)
            pts.append((d.n_crossings, t))
            lines.append(f"| {fam} | `{name[:40]}` | {d.n_crossings} | {t * 1e3:.2f} |")
        fits.append((fam, slope([p for p in pts if p[0] >= 40])))
    lines += ["", "## Growth exponent (time ≈ C·n^k, n ≥ 40)", "", "| family | k |", "|---|---|"]
    lines += [f"| {fam} | {k:.2f} |" for fam, k in fits]
    lines += ["", "## Side by side: automorphism pruning on / off (same run, same output)", "",
              "| diagram | crossings | pruned (ms) | unpruned (ms) | ratio |", "|---|---|---|---|---|"]
    for name in SIDE_BY_SIDE:
        d = parse(name)
        assert canonical_pd(d, prune=True) == canonical_pd(d, prune=False)
        a = best_of(lambda: canonical_pd(d, prune=True), args.repeat)
        b = best_of(lambda: canonical_pd(d, prune=False), args.repeat)
        lines.append(f"| `{name[:40]}` | {d.n_crossings} | {a * 1e3:.2f} | {b * 1e3:.2f} | {b / a:.1f} |")
    rows = [{"notation": f"pretzel:{a},{b},{c},{e}", "components": None}
            for a in range(-5, 6) for b in range(-5, 6) for c in (3, 7) for e in (2, -9) if a and b]
    t = best_of(lambda: [knot_key(r) for r in rows], args.repeat)
    lines += ["", "## knot_key on normal-form rows", "",
              f"{len(rows)} pretzel rows (notation only): {t / len(rows) * 1e6:.1f} µs per row."]
    text = "\n".join(lines) + "\n"
    with open(args.out, "w") as fh:
        fh.write(text)
    print(text)
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
