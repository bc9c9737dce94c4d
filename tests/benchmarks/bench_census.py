"""Census benchmark: diagrams per second at --jobs 1 vs 2, and peak memory of the whole
process tree (parent + loky workers) at 10k and 100k diagrams.

Run:  python tests/benchmarks/bench_census.py [--out reports/bench_census.json]
      [--rate-size small|full] [--skip-memory] [--sizes 10000,100000]

Each census is a real ``knotledger run`` subprocess with every invariant on; a sampler
sums the RSS of the process and all its descendants (psutil) every 0.1 s.  Results go
to a JSON file (written after every measurement, so a long run can be cut short) and
reports/bench_census.md is written from it by hand.
"""

from __future__ import annotations

import argparse
import json
import os
import subprocess
import sys
import tempfile
import time
from pathlib import Path

import psutil

RATE_SPEC = """
[census]
name = "bench-rate"
chunk_size = 128

[[family]]
kind = "pretzel"
length = 3
entries = [5, 20]

[[family]]
kind = "pretzel"
length = 4
entries = [3, 8]

[[family]]
kind = "two_bridge"
alpha = [60, 160]

[[family]]
kind = "torus"
p = [2, 7]
q = [3, 30]

[[family]]
kind = "braid"
word = "1^a -2^b 1^c -2^d"
a = [1, 8]
b = [1, 8]
c = [1, 8]
d = [1, 8]

[[family]]
kind = "montesinos"
length = 4
fractions = ["1/3", "2/5", "-3/7", "3/4", "-2/9", "5/7"]
"""

#: memory census: a file of n small diagrams (3-8 crossings, Rolfsen's table by Conway
#: notation and small torus/pretzel/braid diagrams, cycled), so that 100k rows finish in
#: minutes; the pipeline (work list, chunks, parts, manifest) is exactly the same.
MEMORY_SPEC = """
[census]
name = "bench-memory-{n}"
chunk_size = 256

[[family]]
kind = "file"
path = "notebook.txt"
"""
SMALL = ["conway:3", "conway:2 2", "conway:5", "conway:3 2", "conway:4 2", "conway:3 1 2",
         "conway:2 1 1 2", "torus:2,7", "pretzel:-2,3,3", "braid:1,-2,1,-2,1,-2", "conway:7",
         "conway:5 2", "conway:4 3", "conway:3 1 3", "torus:3,4", "pretzel:3,3,-3"]


def tree_rss(proc: psutil.Process, per: dict) -> int:
    total = 0
    try:
        procs = [proc] + proc.children(recursive=True)
    except psutil.NoSuchProcess:
        return 0
    for p in procs:
        try:
            rss = p.memory_info().rss
            total += rss
            key = "parent" if p.pid == proc.pid else " ".join(p.cmdline()[-3:])[:60]
            per[key] = max(per.get(key, 0), rss)
        except psutil.NoSuchProcess:
            pass
    return total


def committed_items(out: Path) -> int:
    try:
        m = json.loads((out / "manifest.json").read_text())
    except (OSError, ValueError):
        return 0
    return sum(e.get("items", 0) for e in m["chunks"].values())


def run(spec_text: str, jobs: int, log, lines: int = 0) -> dict:
    with tempfile.TemporaryDirectory() as tmp:
        if lines:
            with open(Path(tmp) / "notebook.txt", "w") as fh:
                for i in range(lines):
                    fh.write(SMALL[i % len(SMALL)] + "\n")
        spec = Path(tmp) / "spec.toml"
        spec.write_text(spec_text)
        out = Path(tmp) / "out"
        t0 = time.monotonic()
        proc = subprocess.Popen([sys.executable, "-m", "pipeline", "run", str(spec), "--out", str(out),
                                 "--jobs", str(jobs), "--quiet"])
        ps = psutil.Process(proc.pid)
        peak, curve, last, per = 0, [], 0.0, {}
        while proc.poll() is None:
            peak = max(peak, tree_rss(ps, per))
            now = time.monotonic()
            if now - last > 30:
                last = now
                curve.append({"seconds": round(now - t0, 1), "diagrams_done": committed_items(out),
                              "peak_rss_mb": round(peak / 2**20, 1)})
                log(curve[-1])
            time.sleep(0.1)
        secs = time.monotonic() - t0
        if proc.returncode != 0:
            raise SystemExit(f"census failed with exit code {proc.returncode}")
        n = committed_items(out)
        return {"jobs": jobs, "diagrams": n, "seconds": round(secs, 2),
                "diagrams_per_s": round(n / secs, 2), "peak_rss_mb": round(peak / 2**20, 1),
                "peak_rss_mb_per_process": {k: round(v / 2**20, 1) for k, v in per.items()},
                "curve": curve}


def main() -> None:
    ap = argparse.ArgumentParser()
    ap.add_argument("--out", default="reports/bench_census.json")
    ap.add_argument("--sizes", default="10000,100000")
    ap.add_argument("--skip-rate", action="store_true")
    ap.add_argument("--skip-memory", action="store_true")
    args = ap.parse_args()
    results: dict = {"machine": {"cpus": os.cpu_count(),
                                 "memory_gb": round(psutil.virtual_memory().total / 2**30, 1)},
                     "rate": [], "memory": []}
    out = Path(args.out)

    def save(msg=None):
        if msg:
            print(json.dumps(msg), flush=True)
        out.write_text(json.dumps(results, indent=1) + "\n")

    if not args.skip_rate:
        for jobs in (1, 2):
            r = run(RATE_SPEC, jobs, save)
            results["rate"].append(r)
            save(r)
    if not args.skip_memory:
        for n in (int(s) for s in args.sizes.split(",")):
            r = run(MEMORY_SPEC.format(n=n), 2, save, lines=n)
            r["target"] = n
            results["memory"].append(r)
            save(r)


if __name__ == "__main__":
    main()
