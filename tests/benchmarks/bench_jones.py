"""Benchmark of the Jones polynomial (frontier dynamic programme) on the families.

Times ``jones_polynomial`` on torus knots T(3,q), T(4,q), pretzel links
P(a,a,a,a) and two-bridge chains conway:2 2 ... 2 and conway:3 3 ... 3 with up to
about 400 crossings, fits the growth exponent k of time ≈ C·n^k by least squares
on log-log scale (sizes n ≥ 50), and times T(2,401).  Every diagram is built
before the clock starts; each time is the best of ``--repeat`` runs.

Usage::

    python tests/benchmarks/bench_jones.py [--repeat 3] [--out reports/bench_jones.md]
"""

from __future__ import annotations

import argparse
import math
import os
import platform
import sys
import time

import flint

from fractions import Fraction

from pipeline.invariants.jones.tangle_bracket import montesinos_bracket, two_bridge_bracket
from pipeline.invariants.jones.frontier import frontier_width, jones_from_bracket, jones_polynomial
from pipeline.diagrams.notation import parse

sys.path.insert(0, os.path.join(os.path.dirname(os.path.abspath(__file__)), ".."))
from slow_routes import state_sum_jones  # noqa: E402  (the tests' 2^n reference route)
from _bench import fit_exponent, short

#: small diagrams timed side by side against the all-states sum (ratios)
SIDE_BY_SIDE = ["torus:2,9", "torus:3,5", "conway:2 2 2 2 2", "pretzel:3,3,-3,3", "torus:3,7"]

FAMILIES = {
    "T(3,q)": [f"torus:3,{q}" for q in (13, 25, 50, 100, 200)],
    "T(4,q)": [f"torus:4,{q}" for q in (9, 17, 33, 67, 133)],
    "P(a,a,a,a)": [f"pretzel:{a},{a},{a},{a}" for a in (6, 12, 25, 50, 100)],
    "conway 2 2 ... 2": ["conway:" + " ".join(["2"] * k) for k in (13, 25, 50, 100, 200)],
    "conway 3 3 ... 3": ["conway:" + " ".join(["3"] * k) for k in (9, 17, 33, 67, 133)],
}


def best_time(diagram, repeat: int, fn=jones_polynomial) -> float:
    best = math.inf
    for _ in range(repeat):
        t0 = time.perf_counter()
        fn(diagram)
        best = min(best, time.perf_counter() - t0)
    return best


def fast_route(text: str):
    """The tangle-pair route for a conway:/pretzel: string (None if it does not apply)."""
    if text.startswith("conway:"):
        terms = [int(a) for a in text[7:].split()]
        return lambda d: jones_from_bracket(two_bridge_bracket(terms), d.writhe)
    if text.startswith("pretzel:"):
        fr = [Fraction(1, int(p)) for p in text[8:].split(",")]
        return lambda d: jones_from_bracket(montesinos_bracket(fr), d.writhe)
    return None




def main(argv: list[str] | None = None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--repeat", type=int, default=3)
    ap.add_argument("--out", default="reports/bench_jones.md")
    args = ap.parse_args(argv)

    load_before = os.getloadavg()[0]
    rows, fits = [], {}
    for family, texts in FAMILIES.items():
        points, fast_points = [], []
        for text in texts:
            d = parse(text)
            secs = best_time(d, args.repeat)
            value = jones_polynomial(d)
            span = value.span()
            fast = fast_route(text)
            fast_secs = None
            if fast is not None:
                assert fast(d) == value, text
                fast_secs = best_time(d, args.repeat, fast)
                fast_points.append((d.n_crossings, fast_secs))
            rows.append((family, short(text), d.n_crossings, d.n_components, frontier_width(d), span, secs,
                         fast_secs))
            points.append((d.n_crossings, secs))
            print(f"{family:18} {short(text):22} n={d.n_crossings:4d} {secs * 1000:9.2f} ms", file=sys.stderr)
        fits[family] = (fit_exponent([p for p in points if p[0] >= 50]),
                        fit_exponent([p for p in fast_points if p[0] >= 50]) if fast_points else None)
    side = []
    for text in SIDE_BY_SIDE:
        d = parse(text)
        fast = best_time(d, args.repeat)
        t0 = time.perf_counter()
        slow_value = state_sum_jones(d)
        slow = time.perf_counter() - t0
        assert slow_value == jones_polynomial(d), text
        side.append((text, d.n_crossings, fast, slow))
    wide = []
    for p in range(4, 10):
        d = parse(f"torus:{p},{p + 1}")
        w = frontier_width(d)
        wide.append((p, d.n_crossings, w, math.comb(w, w // 2) // (w // 2 + 1), best_time(d, 1)))
    t2 = parse("torus:2,401")
    t2_secs = best_time(t2, args.repeat)
    t2_cold = parse("torus:2,401")
    t0 = time.perf_counter()
    jones_polynomial(t2_cold)
    t2_cold_secs = time.perf_counter() - t0

    lines = [
        "# Benchmark: Jones polynomial by the frontier dynamic programme",
        "",
        f"Script: `tests/benchmarks/bench_jones.py` (best of {args.repeat} runs per diagram, diagram "
        "built before timing). Machine: "
        f"{platform.machine()}, {os.cpu_count()} cores (shared with other jobs during the run), "
        f"Python {platform.python_version()}, python-flint {flint.__version__}; 1-minute load average "
        f"{load_before:.1f} before and {os.getloadavg()[0]:.1f} after the run (other jobs inflate the times; "
        "ratios within one run are the meaningful comparison).",
        "",
        "Method: Kauffman bracket by adding crossings in a greedy order that keeps the frontier short, "
        "one exact integer polynomial per planar matching of the frontier edges "
        "(L. H. Kauffman, \"State models and the Jones polynomial\", Topology 26 (1987)).",
        "",
        f"**T(2,401)** (401 crossings): {t2_secs * 1000:.1f} ms warm, {t2_cold_secs * 1000:.1f} ms "
        "on a fresh diagram (includes the writhe); goal < 2 s.",
        "",
        "## Growth exponent (time ≈ C·n^k, least squares on log-log, n ≥ 50; goal k ≤ 2.5)",
        "",
        "| family | k, general route | k, tangle route |",
        "|---|---|---|",
    ]
    lines += [f"| {f} | {k:.2f} | {'–' if k2 is None else f'{k2:.2f}'} |" for f, (k, k2) in fits.items()]
    lines += [
        "",
        "## Timings",
        "",
        "General route = frontier programme on the diagram; tangle route = bracket pairs "
        "(`bracket_fast.py`) for the same diagram, same run, values checked equal.",
        "",
        "| family | diagram | crossings | components | max frontier | span V | general (ms) | tangle route (ms) | ratio |",
        "|---|---|---|---|---|---|---|---|---|",
    ]
    for f, t, n, c, w, s, secs, fast_secs in rows:
        extra = "| – | –" if fast_secs is None else f"| {fast_secs * 1000:.2f} | {secs / fast_secs:.1f}x"
        lines.append(f"| {f} | `{t}` | {n} | {c} | {w} | {s} | {secs * 1000:.2f} {extra} |")
    lines += [
        "",
        "## Side by side with the all-states sum (same run; values checked equal)",
        "",
        "| diagram | crossings | programme (ms) | 2^n state sum (ms) | ratio |",
        "|---|---|---|---|---|",
    ]
    lines += [f"| `{t}` | {n} | {f * 1000:.2f} | {s * 1000:.1f} | {s / f:.0f}x |" for t, n, f, s in side]
    lines += [
        "",
        "## Frontier width: T(p, p+1), a braid closure on p strands",
        "",
        "The programme is polynomial for bounded frontier width and exponential in the width: "
        "a closed braid on p strands needs 2p frontier edges, up to Catalan(p) matchings.",
        "",
        "| p | crossings | max frontier | Catalan(frontier/2) | time (ms) |",
        "|---|---|---|---|---|",
    ]
    lines += [f"| {p} | {n} | {w} | {c} | {s * 1000:.1f} |" for p, n, w, c, s in wide]
    lines += [
        "",
        "## Notes",
        "",
        "- On torus knots with fixed p the number of matchings is fixed, the polynomials have small "
        "coefficients and degree O(n): the cost is dominated by Python work per crossing, close to linear.",
        "- Two-bridge chains and P(a,a,a,a) have frontier 4 to 6, but their coefficients grow with n "
        "(|V(−1)| = det, near 10^83 for a 400-crossing two-bridge diagram, so the largest coefficients "
        "have a number of bits proportional to n): the output can reach order n² bits and the time cannot "
        "stay linear there; once coefficients pass 62 bits "
        "python-flint stores them as separate big integers, which shows as a jump between 200 and 400 "
        "crossings.",
        "- The tangle route (`bracket_fast.py`) does one shifted polynomial addition per half-twist and is "
        "the faster route whenever the census knows the tangle parameters; the frontier programme stays the "
        "general route for any diagram and is what `jones_polynomial` uses.",
        "- Times are wall-clock on a shared machine; compare ratios within the run.",
        "",
    ]
    with open(args.out, "w", encoding="utf-8") as fh:
        fh.write("\n".join(lines))
    print("\n".join(lines))
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
