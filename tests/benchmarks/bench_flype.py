"""Benchmark of the alternating enumeration and of the flype-class code.

1. ``alternating.codes(n)`` (prime alternating knots, n crossings) for n = 3 … N, each n
   in a fresh subprocess (so the lower levels are rebuilt and counted), wall time and
   peak resident memory (ru_maxrss of the child).
2. ``flype_codes`` on random reduced prime alternating diagrams of 20, 30, 40 crossings
   (``alternating.random_diagram``, 10 seeds each) by the three routes in the same run:
   the compositional code (``route="tree"``, the default), the gathered search and the
   whole-orbit reference; median and worst time, and whether the routes name the same
   classes (the orbit and gathered routes return the same text; the tree route another
   text, so agreement is checked as a partition in the validation).
3. The same on structured diagrams with long twist regions (two-bridge chains, pretzel,
   Montesinos).
4. ``--validate N`` (one-off): the partition of every alternating diagram of every
   prime reduced shadow with n <= N crossings by the tree code against the flype orbits,
   and invariance on a few hundred random and structured diagrams
   (:func:`validation_section`).

Usage::

    python tests/benchmarks/bench_flype.py [--max-n 12] [--validate 11] [--out reports/bench_flype.md]
"""

from __future__ import annotations

import argparse
import multiprocessing as mp
import platform
import random
import resource
import statistics
import sys
import time

from pipeline import parse
from pipeline.diagrams.canonical import turn_over_pd
from pipeline.diagrams.diagram import Diagram
from pipeline.diagrams.families import alternating
from pipeline.diagrams.families.alternating import _shadows
from pipeline.diagrams.flype import (_codes_of, _fewest_regions, _gathered, _orbit_states, diagram_of_code,
                                     flype_code, flypes, orbit_roots)
from pipeline.diagrams.flype_circuits import gathered_states
from pipeline.diagrams.flype_spqr import decompose, tait_graph
from pipeline.diagrams.flype_tree import tree_codes, tree_codes_of
from pipeline.diagrams.shadow import alternating_codes, alternating_over, n_components, to_diagram
from pipeline.errors import BudgetExceeded


BUDGET = 1000  # members searched per route (the default is FLYPE_BUDGET)
STRUCTURED = ["conway:" + " ".join(["3", "2", "2"] * 6) + " 4", "pretzel:5,5,5,5,5,5,5,5",
              "montesinos:3/10,5/13,4/11,2/7", "montesinos:2/5,3/7,4/9,5/11,3/8",
              "conway:" + " ".join(["2", "1", "3"] * 5)]
OVER = 300  # validation: orbits with more members than this are counted as out of the reference's reach
REPEAT = 5  # the tree route is timed as the median of this many runs (it is fast)



def _level(n):
    """Every prime reduced shadow with n crossings (the enumeration's depth-first route)."""
    return [tw for tw, _ in _shadows(n)]

def _child(n: int, q) -> None:
    t0 = time.perf_counter()
    count = len(alternating.codes(n))
    q.put((count, time.perf_counter() - t0, resource.getrusage(resource.RUSAGE_SELF).ru_maxrss))


def enumeration_row(n: int):
    ctx = mp.get_context("spawn")
    q = ctx.Queue()
    p = ctx.Process(target=_child, args=(n, q))
    p.start()
    out = q.get()
    p.join()
    return out


def _with_codes(states, pick):
    """(number of members searched, (code, mirror code))."""
    return len(states), _codes_of(pick(states))


def _timed(fn):
    """(result of fn or 'over budget', milliseconds)."""
    t0 = time.perf_counter()
    try:
        res = fn()
    except BudgetExceeded:
        res = "over budget"
    return res, 1000 * (time.perf_counter() - t0)


def _size(res) -> str:
    return res if isinstance(res, str) else str(res[0])


def _tree_ms(d):
    times = []
    for _ in range(REPEAT):
        res, ms = _timed(lambda: tree_codes(d))
        times.append(ms)
    return res, statistics.median(times)


def flype_code_section() -> list[str]:
    lines = ["## Flype-class code: compositional code against the searches", "",
             "`tree` = `flype_codes` (the default, used for knot keys: the compositional `ft:` code over the "
             f"3-connected components of the Tait graph, no search; median of {REPEAT} runs); `gathered` = "
             "`route=\"gathered\"` (block-flype search of the members with the fewest twist regions, not proven); "
             "`orbit` = `route=\"orbit\"` (breadth-first search of the whole orbit, the reference). "
             f"Budget {BUDGET} members for each search; `g = o`: gathered and orbit returned the same codes "
             "(— when one is over budget). Every time is for both codes (the diagram's and its mirror's).", "",
             "| diagram | crossings | members gathered / orbit | tree ms | gathered ms | orbit ms | orbit / tree | g = o |",
             "|---|---:|---|---:|---:|---:|---:|:-:|"]
    groups = {}
    cases = [(f"random {n}, seed {s}", alternating.random_diagram(n, seed=s), n)
             for n in (20, 30, 40) for s in range(10)]
    cases += [(f"`{t}`", parse(t), "structured") for t in STRUCTURED]
    for name, d, group in cases:
        _, tt = _tree_ms(d)
        fast, tf = _timed(lambda: _with_codes(_gathered(d, BUDGET), lambda st: st))
        slow, ts = _timed(lambda: _with_codes(_orbit_states(d, BUDGET), _fewest_regions))
        same = "—" if isinstance(slow, str) or isinstance(fast, str) else \
            ("yes" if fast[1] == slow[1] else "NO")
        groups.setdefault(group, []).append((tt, tf, ts))
        lines.append(f"| {name} | {d.n_crossings} | {_size(fast)} / {_size(slow)} | {tt:.1f} | {tf:.0f} | "
                     f"{ts:.0f} | {ts / tt:.0f} | {same} |")
        print(lines[-1], flush=True)
    lines += ["", "| group | tree median ms | tree worst ms | gathered median ms | gathered worst ms | "
              "orbit median ms | orbit worst ms |", "|---|---:|---:|---:|---:|---:|---:|"]
    for group, rows in groups.items():
        cols = []
        for k in range(3):
            vals = [r[k] for r in rows]
            cols += [statistics.median(vals), max(vals)]
        lines.append(f"| {group} | " + " | ".join(f"{v:.1f}" if k < 2 else f"{v:.0f}"
                                                   for k, v in enumerate(cols)) + " |")
    lines.append("")
    lines.append("(Searches over budget are timed until they give up: their times are lower bounds.)")
    lines.append("")
    return lines


def _nested_even(tw, over) -> bool:
    """A bond or cycle with an even number >= 2 of real edges, a rigid neighbour and at
    least one other virtual element (a circuit with an even twist region in a rigid part)."""
    for colour in (0, 1):
        nodes = decompose(*tait_graph(tw, over, colour))
        for nd in nodes:
            real = sum(1 for el in nd.els if el[3])
            kinds = [nodes[c].kind for c, _ in nd.link.values()]
            if nd.kind in "PS" and real >= 2 and real % 2 == 0 and "R" in kinds and len(kinds) >= 2:
                return True
    return False


def validation_section(max_n: int) -> list[str]:
    lines = ["## Validation of the compositional code (one-off run)", "",
             "Partition: every alternating diagram (both mirror images) of every prime reduced shadow with n "
             "crossings, up to sphere homeomorphism and turning over; `orbits` = connected components of the "
             "one-flype graph (whole orbits: a flype keeps the shadow prime reduced). `split` = orbits with two "
             "tree codes, `merged` = tree codes shared by two orbits. `nested even` = diagrams with an even "
             "twist region in a flype circuit beside a rigid (3-connected) node; `g ≠ o` = those where the "
             "gathered and orbit routes differ (n <= 10).", "",
             "| n | diagrams | orbits | split | merged | knots up to mirror | nested even | g ≠ o | seconds |",
             "|---:|---:|---:|---:|---:|---:|---:|---:|---:|"]
    for n in range(3, max_n + 1):
        t0 = time.perf_counter()
        diags = {}
        for tw in _level(n):
            tw = list(tw)
            over = alternating_over(tw)
            for o in (over, [not x for x in over]):
                diags.setdefault(alternating_codes(tw, o)[0], (tw, o))
        roots = orbit_roots(diags)
        codes = {k: tree_codes_of(*st) for k, st in diags.items()}
        by_root, by_code = {}, {}
        for k in diags:
            by_root.setdefault(roots[k], set()).add(codes[k][0])
            by_code.setdefault(codes[k][0], set()).add(roots[k])
        knots = {min(codes[k]) for k, (tw, _) in diags.items() if n_components(tw) == 1}
        nested = [st for st in diags.values() if _nested_even(*st)]
        differ = "—"
        if n <= 10:
            differ = sum(1 for tw, o in nested if _codes_of(gathered_states(tw, o, 10 ** 5))
                         != _codes_of(_fewest_regions(_orbit_states(to_diagram(tw, o), 10 ** 5))))
        lines.append(f"| {n} | {len(diags)} | {len(by_root)} | {sum(len(v) > 1 for v in by_root.values())} | "
                     f"{sum(len(v) > 1 for v in by_code.values())} | {len(knots)} | {len(nested)} | {differ} | "
                     f"{time.perf_counter() - t0:.1f} |")
        print(lines[-1], flush=True)
    rng = random.Random(2026)
    pool = [(f"random {n}", alternating.random_diagram(n, seed=s)) for n in range(15, 41, 5) for s in range(40)]
    pool += [(t, parse(t)) for t in STRUCTURED]
    pool += [(t, parse(t)) for t in ("montesinos:1/3,2/5,3/7,4/9,5/11,6/13", "pretzel:3,5,7,9,11",
                                     "conway:" + " ".join(["4", "1", "2", "1"] * 6))]
    checked = bad = over = 0
    for name, d in pool:
        code = tree_codes(d)
        try:
            _orbit_states(d, OVER)
        except BudgetExceeded:
            over += 1
        e = d
        for _ in range(6):
            nxt = list(flypes(e))
            if nxt:
                e = rng.choice(nxt)
        for v in (e, e.relabel(), Diagram.from_pd(turn_over_pd(e))):
            checked += 1
            bad += tree_codes(v) != code
        checked += 1
        bad += tree_codes(d.mirror()) != (code[1], code[0])
        checked += 1
        bad += flype_code(diagram_of_code(code[0])) != code[0]
    lines += ["", f"Invariance: {len(pool)} diagrams (40 random of each size 15, 20, …, 40 and "
              f"{len(pool) - 240} structured; {over} of them have more than {OVER} orbit members), each "
              "after 6 random flypes, relabelled and turned over, the mirror (codes swapped) and the rebuilt "
              f"member (`flype_code(diagram_of_code(code)) == code`): {checked} checks, {bad} failures.", ""]
    print(lines[-2], flush=True)
    return lines


def main(argv=None) -> int:
    ap = argparse.ArgumentParser()
    ap.add_argument("--max-n", type=int, default=12)
    ap.add_argument("--out", default="reports/bench_flype.md")
    ap.add_argument("--validate", type=int, default=0,
                    help="also the one-off validation: orbit partition for n <= VALIDATE, random pool")
    args = ap.parse_args(argv)
    lines = ["# Benchmark: prime alternating enumeration and flype-class codes", "",
             f"Script: `tests/benchmarks/bench_flype.py`. Machine: {platform.machine()}, 2 cores shared "
             f"with other jobs (one core used), Python {sys.version.split()[0]}.", "",
             "## Enumeration of prime alternating knots (`alternating.codes(n)`)", "",
             "Each n in a fresh process: all prime reduced shadows up to n − 1 crossings are grown, "
             "the one-component shadows with n crossings formed and grouped into flype classes.", "",
             "| n | knots | seconds | peak RSS (MB) |", "|---:|---:|---:|---:|"]
    total = 0.0
    for n in range(3, args.max_n + 1) if args.max_n >= 3 else ():
        count, secs, rss = enumeration_row(n)
        total += secs
        lines.append(f"| {n} | {count} | {secs:.2f} | {rss / 1024:.0f} |")
        print(lines[-1], flush=True)
    lines += ["", f"Total 3…{args.max_n}: {total:.1f} s (each n from scratch; one process "
              f"building 3…{args.max_n} in turn reuses the levels and takes about the last row's time).", ""]
    lines += flype_code_section()
    if args.validate:
        lines += validation_section(args.validate)
    lines.append("")
    with open(args.out, "w") as fh:
        fh.write("\n".join(lines))
    return 0


if __name__ == "__main__":
    sys.exit(main())
