"""Benchmark of the diagram simplifier and the visible prime decomposition.

Times :func:`pipeline.diagrams.simplify.simplify` on closures of random braid words
(3 and 5 strands, n = 25 … 400 crossings, seeded), best of ``--repeat`` runs from a
freshly parsed diagram, and fits the growth exponent k of time ≈ C·n^k.  Side by side
in the same run: the greedy descent alone (R1, R2, nugatory; ``r3=False``) against the
full search, as crossings left and time ratio.  Also: reduced alternating two-bridge
chains made bigger by random inverse R1/R2 moves (tests/_moves.py) and brought back,
and :func:`pipeline.diagrams.primality.decompose` on connected sums.  Goal (issue 11):
a 100-crossing random braid closure in under 1 s.

Usage::

    python tests/benchmarks/bench_simplify.py [--repeat 3] [--out reports/bench_simplify.md]
"""

from __future__ import annotations

import argparse
import os
import platform
import random
import sys

sys.path.insert(0, os.path.join(os.path.dirname(__file__), ".."))

from _bench import best_time, fit_exponent  # noqa: E402
from _moves import complicate, connected_sum  # noqa: E402
from pipeline.diagrams.notation import parse  # noqa: E402
from pipeline.diagrams.primality import decompose  # noqa: E402
from pipeline.diagrams.simplify import simplify  # noqa: E402

SIZES = [25, 50, 100, 200, 400]


def braid(n: int, strands: int, seed: int):
    rng = random.Random(seed)
    w = [rng.choice([1, -1]) * rng.randint(1, strands - 1) for _ in range(n)]
    return parse("braid:" + ",".join(map(str, w)))


def main() -> None:
    ap = argparse.ArgumentParser()
    ap.add_argument("--repeat", type=int, default=3)
    ap.add_argument("--out", default="reports/bench_simplify.md")
    a = ap.parse_args()
    lines = ["# Simplification benchmark", "",
             f"Python {platform.python_version()} on {platform.machine()}, best of {a.repeat}; "
             "seeded inputs (seed = n), default budget and patience.", "",
             "## Random braid closures", "",
             "| strands | n | left (full) | left (R1/R2/nugatory) | moves R2 / R3 | time full (s) "
             "| time greedy (s) | full / greedy |",
             "|---|---|---|---|---|---|---|---|"]
    fits = {}
    for strands in (3, 5):
        pts = []
        for n in SIZES:
            d = braid(n, strands, n)
            full = simplify(d)
            greedy = simplify(d, r3=False)
            tf = best_time(lambda: simplify(d), a.repeat)
            tg = best_time(lambda: simplify(d, r3=False), a.repeat)
            pts.append((n, tf))
            lines.append(f"| {strands} | {n} | {full.crossings} | {greedy.crossings} | "
                         f"{full.moves['R2']} / {full.moves['R3']} | {tf:.4f} | {tg:.4f} | {tf / tg:.1f} |")
            print(strands, n, full.crossings, round(tf, 4), flush=True)
        fits[strands] = fit_exponent([p for p in pts if p[0] >= 50])
    lines += ["", "Growth exponent k (time ≈ C·n^k, n ≥ 50): "
              + ", ".join(f"{s} strands k = {k:.2f}" for s, k in fits.items()), ""]
    lines += ["## Reduced alternating chains after inverse R-moves", "",
              "| diagram | crossings | after inverse moves | after simplify | time (s) |",
              "|---|---|---|---|---|"]
    for k in (5, 10, 20, 40):
        base = parse("conway:" + " ".join(["2", "3"] * (k // 2)))
        c = complicate(base, k, seed=k)
        r = simplify(c)
        t = best_time(lambda: simplify(c), a.repeat)
        lines.append(f"| conway:2 3 … ({2 * (k // 2)} terms), {k} moves | {base.n_crossings} | {c.n_crossings} | "
                     f"{r.crossings} | {t:.4f} |")
    lines += ["", "## Visible prime decomposition", "",
              "| summands | crossings | summands found | time (s) |", "|---|---|---|---|"]
    for m in (2, 4, 8, 16):
        d = parse("conway:3 2")
        for j in range(m - 1):
            d = connected_sum(d, 1 + j, parse(["conway:3", "conway:2 2", "conway:3 2"][j % 3]), 1)
        r = decompose(d)
        t = best_time(lambda: decompose(d), a.repeat)
        lines.append(f"| {m} | {d.n_crossings} | {len(r.summands)} | {t:.4f} |")
    text = "\n".join(lines) + "\n"
    with open(a.out, "w", encoding="utf-8") as fh:
        fh.write(text)
    print(text)


if __name__ == "__main__":
    main()
