"""Benchmark: Alexander polynomial on family members up to ~400 crossings.

Run from the repository root:  python tests/benchmarks/bench_alexander.py
Writes reports/bench_alexander.md.  Families: T(3,q), T(4,q), pretzel P(a,a,a,a),
two-bridge chains conway:2 2 … 2 and conway:3 3 … 3.  For each family the growth
exponent is the least-squares slope of log(time) against log(crossings) over the
members with at least 50 crossings.  A side-by-side run compares the fast path
(sparse unit-pivot elimination, then Bareiss) with Bareiss on the whole minor.
"""

from __future__ import annotations

import math
import os
import platform
import sys
import time
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[2]))

from pipeline import parse  # noqa: E402
from pipeline.diagrams.diagram import Diagram  # noqa: E402
from pipeline.invariants.alexander.fox import _signed_delta, alexander_polynomial  # noqa: E402
from pipeline.invariants.alexander.matrix import _bareiss, alexander_rows, det_up_to_units  # noqa: E402
from _bench import best_time, fit_exponent

SIZES = [25, 50, 100, 200, 400]


def families():
    def torus(p):
        return lambda n: f"torus:{p},{_coprime_near(p, max(2, round(n / (p - 1))))}"
    return {
        "T(3,q)": torus(3),
        "T(4,q)": torus(4),
        "P(a,a,a,a)": lambda n: "pretzel:" + ",".join([str(_odd(n / 4))] * 4),
        "conway:2 2 ... 2": lambda n: "conway:" + " ".join(["2"] * max(1, n // 2)),
        "conway:3 3 ... 3": lambda n: "conway:" + " ".join(["3"] * max(1, n // 3)),
    }


def _coprime_near(p: int, q: int) -> int:
    while math.gcd(p, q) != 1:
        q += 1
    return q


def _odd(x: float) -> int:
    k = max(1, round(x))
    return k if k % 2 else k + 1



def time_alexander(d: Diagram, repeat: int = 3) -> float:
    """Best time of alexander_polynomial on a fresh copy of ``d`` (validated outside the
    timer), with the per-diagram result cache cleared, so derived data (arcs) and the
    sign computation are timed every time."""
    best = float("inf")
    for _ in range(repeat):
        fresh = Diagram.from_pd(d.pd, free_loops=d.free_loops)
        _signed_delta.cache_clear()
        t0 = time.perf_counter()
        alexander_polynomial(fresh)
        best = min(best, time.perf_counter() - t0)
    return best


def slope(points):
    pts = [(n, t) for n, t in points if n >= 50 and t > 0]
    return fit_exponent(pts) if len(pts) >= 2 else float("nan")


def dense_only(d):
    rows, n = alexander_rows(d)
    m = n - 1
    from flint import fmpz_poly
    dense = [[fmpz_poly()] * m for _ in range(m)]
    for i, r in enumerate(rows[:-1]):
        for c, v in r.items():
            if c:
                dense[i][c - 1] = v
    return _bareiss(dense)


def fast_only(d):
    rows, n = alexander_rows(d)
    return det_up_to_units([{c - 1: v for c, v in r.items() if c} for r in rows[:-1]], n - 1)


def main() -> int:
    lines = ["# Benchmark: Alexander polynomial", "",
             f"Machine: {platform.machine()}, {os.cpu_count()} cores shared, Python "
             f"{platform.python_version()}; best of 3 runs; times in seconds; "
             "`alexander_polynomial` end to end on a",
             "validated diagram (arcs, Alexander matrix, determinant, normalisation; for links the sign",
             "from the linking cofactor or the skein relation); result cache cleared each run.", ""]
    lines += ["| family | notation | crossings | components | time (s) | span Δ |",
              "|---|---|---|---|---|---|"]
    fits = {}
    for name, make in families().items():
        pts = []
        for n in SIZES:
            text = make(n)
            d = parse(text)
            t = time_alexander(d)
            delta = alexander_polynomial(d)
            pts.append((d.n_crossings, t))
            shown = text if len(text) < 40 else text[:37] + "..."
            lines.append(f"| {name} | `{shown}` | {d.n_crossings} | {d.n_components} | "
                         f"{t:.4f} | {delta.span()} |")
            print(name, d.n_crossings, f"{t:.4f}", flush=True)
        fits[name] = slope(pts)
    lines += ["", "Fitted growth exponent (slope of log time vs log crossings, crossings ≥ 50):", "",
              "| family | exponent |", "|---|---|"]
    lines += [f"| {k} | {v:.2f} |" for k, v in fits.items()]
    lines += ["", "Side by side (same run): sparse unit-pivot elimination + Bareiss on the rest "
              "versus Bareiss on the whole (n−1)×(n−1) minor, determinant only.", "",
              "| notation | crossings | fast (s) | dense Bareiss (s) | ratio |", "|---|---|---|---|---|"]
    for text in ["torus:3,10", "torus:4,11", "pretzel:7,7,7,7", "conway:3 3 3 3 3 3 3 3 3 3 3 3 3",
                 "torus:3,20"]:
        d = parse(text)
        tf = best_time(lambda: fast_only(d))
        td = best_time(lambda: dense_only(d), repeat=1)
        lines.append(f"| `{text}` | {d.n_crossings} | {tf:.4f} | {td:.4f} | {td / tf:.0f}× |")
        print(text, tf, td, flush=True)
    lines += ["", "Notes: the Alexander matrix has three entries per row and every row carries the "
              "units t and −1 of Z[t^±1], so almost all of it is eliminated on monomial pivots; "
              "what remains for Bareiss is a small block.  Timings at these sizes are a few "
              "milliseconds to a few tenths of a second, so the fitted exponents are rough "
              "(noise from the shared machine is of the same order at the small sizes)."]
    out = Path(__file__).resolve().parents[2] / "reports" / "bench_alexander.md"
    out.parent.mkdir(exist_ok=True)
    out.write_text("\n".join(lines) + "\n")
    print("wrote", out)
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
