"""Benchmark of the prime alternating enumeration: canonical augmentation against levels.

``new`` = :func:`pipeline.diagrams.families.alternating.codes` (depth-first canonical
augmentation, a type emitted from its canonical member only); ``old`` = the former
route, kept here as a reference: every level of shadows below n held in memory and
deduplicated by alternating map code, the last level grouped into flype classes by a
union-find over one-step flypes.  Each (route, n) runs in a fresh subprocess (spawn),
so the lower levels are rebuilt and counted; the child reports the count, the wall
time and its peak resident memory (``ru_maxrss``) minus the resident memory after
importing the package (the baseline).  Both routes must give the same codes in the
same order (checked by a digest).

Usage::

    nice -n 10 python tests/benchmarks/bench_alternating_enum.py [--max-n 13] [--old-max-n 13]
        [--out reports/bench_alternating_enum.md]
"""

from __future__ import annotations

import argparse
import hashlib
import multiprocessing as mp
import os
import platform
import resource
import sys
import time


# ---------------------------------------------------------------------- the former route
def _old_codes(n: int) -> list[str]:
    """The level-by-level route (before canonical augmentation), knots only."""
    from functools import lru_cache

    from pipeline.diagrams.canonical import canonical_text
    from pipeline.diagrams.families.alternating import _hopf
    from pipeline.diagrams.flype import _order
    from pipeline.diagrams.shadow import (alternating_codes, alternating_over, apply_shadow_flype,
                                          extensions, n_components, prime_reduced, shadow_flypes,
                                          to_diagram)
    from pipeline.diagrams.flype_circuits import twist_count as twist_region_count

    def key(tw):
        return min(alternating_codes(tw, alternating_over(tw)))

    @lru_cache(maxsize=None)
    def level(m):
        if m == 2:
            return (tuple(_hopf()),)
        found = {}
        for tw in level(m - 1):
            for new in extensions(list(tw)):
                if prime_reduced(new):
                    found.setdefault(key(new), tuple(new))
        return tuple(found[k] for k in sorted(found))

    shadows, seen = [], set()
    for tw in level(n - 1):
        for new in extensions(list(tw)):
            if n_components(new) == 1 and prime_reduced(new):
                k = key(new)
                if k not in seen:
                    seen.add(k)
                    shadows.append(new)
    keys, best = {}, {}
    for tw in shadows:
        over = alternating_over(tw)
        c0, c1 = alternating_codes(tw, over)
        k = min(c0, c1)
        keys[k] = (tw, over)
        tc = twist_region_count(tw)
        best[k] = ((tc, c0), False) if c0 <= c1 else ((tc, c1), True)
    parent = {k: k for k in keys}

    def find(k):
        while parent[k] != k:
            parent[k] = parent[parent[k]]
            k = parent[k]
        return k

    for k, (tw, over) in keys.items():
        for m in shadow_flypes(tw):
            a, b = find(k), find(key(apply_shadow_flype(tw, over, m)[0]))
            if a != b:
                parent[max(a, b)] = min(a, b)
    out = {}
    for k in keys:
        r = find(k)
        if r not in out or best[k] < best[out[r]]:
            out[r] = k
    codes = []
    for k in out.values():
        tw, over = keys[k]
        flip = best[k][1]
        codes.append(canonical_text(to_diagram(tw, [o != flip for o in over])))
    return sorted(codes, key=_order)


# ---------------------------------------------------------------------- one measurement
def _child(route: str, n: int, q) -> None:
    import pipeline  # noqa: F401  (the baseline includes the package)
    from pipeline.diagrams.families import alternating
    base = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
    t0 = time.perf_counter()
    codes = alternating.codes(n) if route == "new" else _old_codes(n)
    dt = time.perf_counter() - t0
    peak = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss
    if route == "old":  # the former route names a type by a member's pd: text; compare by ft: code
        from pipeline.diagrams.flype import _order, diagram_of_code, flype_codes
        codes = sorted((min(flype_codes(diagram_of_code(c)), key=_order) for c in codes), key=_order)
    digest = hashlib.sha256("\n".join(codes).encode()).hexdigest()[:12]
    size = sum(len(c) for c in codes)
    q.put((len(codes), dt, base, peak, digest, size))


def measure(route: str, n: int):
    ctx = mp.get_context("spawn")
    q = ctx.Queue()
    p = ctx.Process(target=_child, args=(route, n, q))
    p.start()
    out = q.get()
    p.join()
    return out


def main(argv=None) -> int:
    ap = argparse.ArgumentParser()
    ap.add_argument("--min-n", type=int, default=3)
    ap.add_argument("--max-n", type=int, default=12)
    ap.add_argument("--old-max-n", type=int, default=12)
    ap.add_argument("--out", default="reports/bench_alternating_enum.md")
    args = ap.parse_args(argv)
    load0 = os.getloadavg()
    rows = []
    for n in range(args.min_n, args.max_n + 1):
        new = measure("new", n)
        old = measure("old", n) if n <= args.old_max_n else None
        rows.append((n, new, old))
        print(n, new, old, flush=True)
    load1 = os.getloadavg()
    mb = 1 / 1024  # ru_maxrss is in KiB on Linux
    lines = [
        "# Benchmark: prime alternating enumeration (canonical augmentation against levels)",
        "",
        f"Script: `tests/benchmarks/bench_alternating_enum.py`. Machine: {platform.machine()}, "
        f"{os.cpu_count()} cores shared with other jobs (one core used), Python {platform.python_version()}; "
        f"load average {load0[0]:.1f} at the start, {load1[0]:.1f} at the end (run under `nice -n 10`).",
        "",
        "Each (route, n) in a fresh process. `new` = `alternating.codes(n)` (depth first, canonical "
        "augmentation, a type emitted from its canonical member); `old` = the former level-by-level "
        "route (kept in the script). RSS = peak resident memory of the child minus its resident memory "
        "after importing the package (MB); `codes` = the size of the sorted code texts that `new` "
        "holds (kB). `same` = both routes returned the same codes in the same order (digest).",
        "",
        "| n | knots | new s | new RSS (MB) | codes (kB) | old s | old RSS (MB) | old / new time | same |",
        "|---:|---:|---:|---:|---:|---:|---:|---:|:-:|",
    ]
    for n, new, old in rows:
        count, dt, base, peak, digest, size = new
        cells = [str(n), str(count), f"{dt:.2f}", f"{(peak - base) * mb:.1f}", f"{size / 1000:.0f}"]
        if old is None:
            cells += ["—", "—", "—", "—"]
        else:
            ocount, odt, obase, opeak, odigest, _ = old
            cells += [f"{odt:.2f}", f"{(opeak - obase) * mb:.1f}",
                      f"{odt / dt:.2f}" if dt > 0.05 else "—",
                      "yes" if (ocount, odigest) == (count, digest) else "NO"]
        lines.append("| " + " | ".join(cells) + " |")
    lines.append("")
    os.makedirs(os.path.dirname(args.out) or ".", exist_ok=True)
    with open(args.out, "w", encoding="utf-8") as fh:
        fh.write("\n".join(lines))
    print("\n".join(lines))
    return 0


if __name__ == "__main__":
    sys.path.insert(0, os.getcwd())
    sys.exit(main())
