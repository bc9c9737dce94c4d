"""Benchmark of the Tristram–Levine signature function of any diagram.

Times :func:`pipeline.invariants.tristram_levine.signature_function` without a notation
(Seifert's algorithm on the diagram, then the exact signature function) on two-bridge
chains conway:2 2 … 2 and conway:3 3 … 3 and on pretzel knots P(−2, 3, q) and links
P(a, a, a, a), up to about 100 crossings, split into the Seifert matrix and the signature
function of it, and fits the growth exponent k of time ≈ C·n^k (least squares on log-log,
n ≥ 20).  Each timing is the best of ``--repeat`` runs on a freshly parsed diagram.

Side by side in the same run: the general route against the braid route
(``notation="torus:…"``) on torus knots, as ratios.

Usage::

    python tests/benchmarks/bench_seifert.py [--repeat 3] [--out reports/bench_seifert.md]
"""

from __future__ import annotations

import argparse
import os
import platform
import sys

import flint

from pipeline.diagrams.notation import parse
from pipeline.invariants.seifert_surface import seifert_matrix
from pipeline.invariants.tristram_levine import _cos_index, signature_function, tristram_levine

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from _bench import best_time, fit_exponent, short  # noqa: E402

FAMILIES = {
    "conway 2 2 ... 2": ["conway:" + " ".join(["2"] * k) for k in (6, 12, 25, 50)],
    "conway 3 3 ... 3": ["conway:" + " ".join(["3"] * k) for k in (4, 8, 17, 33)],
    "P(−2,3,q)": [f"pretzel:-2,3,{q}" for q in (7, 19, 45, 95)],
    "P(a,a,a,a)": [f"pretzel:{a},{a},{a},{a}" for a in (3, 6, 12, 25)],
}
SIDE_BY_SIDE = ["torus:2,21", "torus:3,10", "torus:3,20", "torus:4,13", "torus:5,12"]


def timed(text: str, repeat: int, notation: str | None = None) -> float:
    def run():
        _cos_index.cache_clear()
        signature_function(parse(text), notation=notation)
    return best_time(run, repeat)


def main(argv: list[str] | None = None) -> int:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--repeat", type=int, default=3)
    ap.add_argument("--out", default="reports/bench_seifert.md")
    args = ap.parse_args(argv)

    rows, fits = [], {}
    for family, texts in FAMILIES.items():
        points = []
        for text in texts:
            d = parse(text)
            V = seifert_matrix(d)
            t_matrix = best_time(lambda: seifert_matrix(parse(text)), args.repeat)
            total = timed(text, args.repeat)
            f = tristram_levine(V)
            rows.append((family, short(text), d.n_crossings, d.n_components, len(V), len(f.jumps),
                         f.at_minus_one, t_matrix, total))
            points.append((d.n_crossings, total))
            print(f"{family:18} {short(text):22} n={d.n_crossings:4d} m={len(V):4d} {total * 1000:9.2f} ms",
                  file=sys.stderr)
        fits[family] = fit_exponent([p for p in points if p[0] >= 20])

    side = []
    for text in SIDE_BY_SIDE:
        d = parse(text)
        general, braid = timed(text, args.repeat), timed(text, args.repeat, notation=text)
        assert signature_function(d) == signature_function(d, notation=text), text
        side.append((text, d.n_crossings, general, braid))

    lines = [
        "# Benchmark: Tristram–Levine signature function by Seifert's algorithm",
        "",
        f"Script: `tests/benchmarks/bench_seifert.py` (best of {args.repeat} runs, each from a freshly "
        f"parsed diagram). Machine: {platform.machine()}, {os.cpu_count()} cores (shared with other "
        f"jobs during the run), Python {platform.python_version()}, python-flint {flint.__version__}.",
        "",
        "Method: Seifert matrix from Seifert's algorithm on the diagram (H. Seifert, Math. Ann. 110 "
        "(1935)), face basis, local linking table; then σ_ω exactly (A. G. Tristram 1969, J. Levine "
        "1969): jump points from det(V − tVᵀ) by exact interpolation, values by exact Hermitian "
        "inertia at rational points. No floating point.",
        "",
        "## Growth exponent of the total time (time ≈ C·n^k, least squares on log-log, n ≥ 20)",
        "",
        "| family | k |",
        "|---|---|",
    ]
    lines += [f"| {f} | {k:.2f} |" for f, k in fits.items()]
    lines += [
        "",
        "## Timings",
        "",
        "| family | diagram | crossings | components | size of V | jumps | σ | Seifert matrix (ms) "
        "| signature function, total (ms) |",
        "|---|---|---|---|---|---|---|---|---|",
    ]
    lines += [f"| {f} | `{t}` | {n} | {c} | {m} | {j} | {s} | {tm * 1000:.2f} | {tt * 1000:.2f} |"
              for f, t, n, c, m, j, s, tm, tt in rows]
    lines += [
        "",
        "## Side by side: Seifert's algorithm on the diagram vs the braid route (same function)",
        "",
        "| diagram | crossings | general (ms) | braid route (ms) | ratio |",
        "|---|---|---|---|---|",
    ]
    lines += [f"| `{t}` | {n} | {g * 1000:.2f} | {b * 1000:.2f} | {g / b:.2f}× |" for t, n, g, b in side]
    lines.append("")
    os.makedirs(os.path.dirname(args.out) or ".", exist_ok=True)
    with open(args.out, "w") as fh:
        fh.write("\n".join(lines))
    print(f"wrote {args.out}", file=sys.stderr)
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
