"""Benchmark of Khovanov homology (Bar-Natan's local algorithm) -> reports/bench_khovanov.md.

Times ``khovanov_homology`` over F₂ (and Q) on 20-crossing knots (goal < 5 s over F₂),
on T(3,q) up to 40 crossings with a fitted growth exponent, and the local algorithm
against the brute-force cube of resolutions on diagrams of ≤ 8 crossings in the same run
(ratios, values checked equal).  Every diagram is built before the clock starts; every
timed call starts from empty memo tables (cold) and each time is the best of ``--repeat``.

Usage::

    python tests/benchmarks/bench_khovanov.py [--repeat 3] [--out reports/bench_khovanov.md]
"""

from __future__ import annotations

import argparse
import os
import platform
import random
import sys
import time

import flint

from pipeline.diagrams.families import braid
from pipeline.diagrams.notation import parse
from pipeline.invariants.jones.frontier import frontier_width
from pipeline.invariants.khovanov import cube_khovanov, khovanov_data, khovanov_homology
from pipeline.invariants.khovanov.tangle import clear_caches

sys.path.insert(0, os.path.dirname(os.path.abspath(__file__)))
from _bench import best_time, fit_exponent  # noqa: E402


def random_knot_word(rng: random.Random, strands: int, length: int) -> list[int]:
    """A random braid word whose closure is a knot (rejection sampling)."""
    while True:
        w = [rng.choice([1, -1]) * rng.randint(1, strands - 1) for _ in range(length)]
        if all(abs(w[k]) != abs(w[k - 1]) or w[k] == w[k - 1] for k in range(1, len(w))):
            d = braid.diagram(w, strands=strands)
            if d.n_components == 1 and d.n_crossings == length:
                return w


def twenty_crossing_knots() -> list[tuple[str, str]]:
    rng = random.Random(2026)
    out = [("T(3,10)", "torus:3,10"),
           ("two-bridge, conway 2 3 2 3 2 3 2 3 (alternating)", "conway:2 3 2 3 2 3 2 3"),
           ("pretzel P(-4,7,9)", "pretzel:-4,7,9")]
    for k in range(3):  # 20 transpositions are even: 3 or 5 strands can close to a knot
        w = random_knot_word(rng, 5 if k else 3, 20)
        out.append((f"random {5 if k else 3}-braid knot #{k + 1}", "braid:" + ",".join(map(str, w))))
    out.append(("(σ1σ2⁻¹)^10 (alternating, det 15125)", "braid:" + ",".join(["1,-2"] * 10)))
    return out


SIDE_BY_SIDE = ["torus:2,3", "conway:2 2", "torus:2,7", "torus:3,4", "pretzel:-2,3,3",
                "braid:1,-2,1,-2,1,-2,1,-2", "braid:1,2,-3,2,-1,2,3,2", "conway:2 1 1 2 2"]


def cold(fn):
    def run():
        clear_caches()
        return fn()
    return run


def main() -> None:
    ap = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    ap.add_argument("--repeat", type=int, default=3)
    ap.add_argument("--out", default="reports/bench_khovanov.md")
    args = ap.parse_args()
    rep = args.repeat
    load0 = os.getloadavg()[0]
    t_start = time.perf_counter()
    lines = ["# Benchmark: Khovanov homology by Bar-Natan's local algorithm", ""]

    rows20 = []
    for label, text in twenty_crossing_knots():
        d = parse(text)
        assert d.n_crossings == 20 and d.n_components == 1, (text, d.n_crossings)
        r = 1 if "det 15125" in label else rep  # the slow row is timed once
        t2 = best_time(cold(lambda: khovanov_homology(d, field=2)), r)
        clear_caches()
        t0 = time.perf_counter()
        data = khovanov_data(d)
        tall = time.perf_counter() - t0
        rows20.append((label, text, frontier_width(d), sum(x[2] for x in data.khovanov),
                       sum(x[2] for x in data.khovanov_f2), data.kh_width, data.rasmussen_s, t2, tall))
        print(f"{label}: F2 {t2:.3f} s, all {tall:.3f} s", file=sys.stderr, flush=True)

    tq_rows = []
    for q in (4, 5, 7, 8, 10, 11, 13, 14, 16, 17, 19, 20):
        d = parse(f"torus:3,{q}")
        t2 = best_time(cold(lambda: khovanov_homology(d, field=2)), rep)
        tq = best_time(cold(lambda: khovanov_homology(d)), rep)
        tq_rows.append((q, d.n_crossings, sum(khovanov_homology(d).values()), t2, tq))
        print(f"T(3,{q}): F2 {t2:.4f} s, Q {tq:.4f} s", file=sys.stderr, flush=True)
    big = [(n, t) for _, n, _, t, _ in tq_rows if n >= 14]
    k2 = fit_exponent(big)
    kq = fit_exponent([(n, t) for _, n, _, _, t in tq_rows if n >= 14])

    side = []
    for text in SIDE_BY_SIDE:
        d = parse(text)
        for field in (0, 2):
            fast = khovanov_homology(d, field=field)
            slow = cube_khovanov(d, modulus=field)
            assert fast == slow, text
            tf = best_time(cold(lambda: khovanov_homology(d, field=field)), rep)
            ts = best_time(lambda: cube_khovanov(d, modulus=field), rep)
            side.append((text, d.n_crossings, "Q" if field == 0 else "F₂", sum(fast.values()), tf, ts))
            print(f"{text} field {field}: local {tf:.4f} s, cube {ts:.4f} s", file=sys.stderr, flush=True)
    load1 = os.getloadavg()[0]
    total = time.perf_counter() - t_start

    lines += [
        f"Script: `tests/benchmarks/bench_khovanov.py` (best of {rep} runs, each from empty memo "
        f"tables; diagrams built before timing). Machine: {platform.machine()}, {os.cpu_count()} cores "
        f"(shared with other jobs), Python {platform.python_version()}, python-flint {flint.__version__}; "
        f"1-minute load average {load0:.1f} before and {load1:.1f} after the run; whole run {total:.0f} s "
        "(the slowest 20-crossing row is timed once). "
        "Ratios within one run are the meaningful comparison.", "",
        "Method: D. Bar-Natan, \"Fast Khovanov homology computations\", JKTR 16 (2007): crossings "
        "added one at a time in the frontier order, dotted cobordisms in normal form, delooping and "
        "Gaussian elimination after every crossing, in the Bar-Natan theory with h implicit (the "
        "same run gives Kh and Rasmussen's s).", "",
        "## 20-crossing knots (goal: Kh over F₂ in < 5 s)", "",
        "| diagram | notation | max frontier | rank Kh(Q) | rank Kh(F₂) | width | s | Kh over F₂ (s) | "
        "khovanov_data: Q, F₂, s, reduced (s) |",
        "|---|---|---|---|---|---|---|---|---|"]
    for label, text, fw, rq, r2, w, s, t2, tq in rows20:
        lines.append(f"| {label} | `{text if len(text) < 50 else text[:47] + '...'}` | {fw} | {rq} | {r2} | "
                     f"{w} | {s} | {t2:.3f} | {tq:.3f} |")
    lines += ["", "The time grows with the size of the homology of the partial tangles, not with the "
              "crossing number alone: the alternating 3-braid (σ1σ2⁻¹)^10 has Kh of rank det + 1 = 15126 "
              "over Q (30250 over F₂) and is the slow row; its `khovanov_data` time is dominated by the run over Q[h] "
              "that s needs (rational coefficients and the h-terms keep those complexes far denser than "
              "over F₂).", "",
              f"## T(3,q) up to 40 crossings (fitted exponent, n ≥ 14: F₂ k = {k2:.2f}, Q k = {kq:.2f})", "",
              "| q | crossings | rank Kh(Q) | F₂ (ms) | Q (ms) |", "|---|---|---|---|---|"]
    for q, n, r, t2, tq in tq_rows:
        lines.append(f"| {q} | {n} | {r} | {1000 * t2:.1f} | {1000 * tq:.1f} |")
    lines += ["", "## Local algorithm vs the brute-force cube of resolutions (same run, values equal)", "",
              "| diagram | crossings | field | rank | local (ms) | cube (ms) | cube / local |",
              "|---|---|---|---|---|---|---|"]
    for text, n, f, r, tf, ts in side:
        lines.append(f"| `{text}` | {n} | {f} | {r} | {1000 * tf:.2f} | {1000 * ts:.2f} | {ts / tf:.1f} |")
    lines.append("")
    with open(args.out, "w", encoding="utf-8") as fh:
        fh.write("\n".join(lines))
    print("\n".join(lines))


if __name__ == "__main__":
    main()
