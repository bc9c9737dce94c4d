"""Chunk-timeout benchmark: how long a census waits for a slow row and a stuck row.

Formerly a timed assertion in tests/test_run.py (``test_chunk_timeout_marks_rows_and_run_continues``
asserted the run took under 25 s); the test keeps the statuses, the time is measured here.

Run:  python tests/benchmarks/bench_timeout.py [--repeat 3] [--out reports/bench_timeout.md]

The same 41-row two-bridge census (chunks of 6, ``timeout = 1``, ``--jobs 2``) runs twice in
one process, side by side: clean, and with row 8 sleeping 30 s in Python (interruptible:
SIGALRM ends the chunk) and row 20 sleeping 30 s deaf to SIGALRM (the parent kills the
worker).  Without timeouts the faulty run would take over 60 s; the ratio to the clean run
and the excess over the two 1 s budgets are what to watch.
"""

from __future__ import annotations

import argparse
import inspect
import os
import platform
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parents[2]
sys.path[:0] = [str(ROOT), str(ROOT / "tests")]

from pipeline.census.run import run_census  # noqa: E402
from pipeline.census.spec import load_spec  # noqa: E402

SPEC = ('[census]\nchunk_size = 6\ntimeout = 1\nmax_modulus = 5\n'
        '[[family]]\nkind = "two_bridge"\nalpha = [2, 11]\n')   # 41 rows, 7 chunks


def _fresh_workers() -> None:
    from joblib.externals.loky import get_reusable_executor
    get_reusable_executor(max_workers=2, kill_workers=True).shutdown(wait=True, kill_workers=True)


def _run(tmp: Path, *, faulty: bool) -> float:
    spec = tmp / "census.toml"
    spec.write_text(SPEC)
    out = tmp / f"out-{time.perf_counter_ns()}"
    kwargs: dict = {}
    env_hooks = {}
    if faulty:
        if "fault" in inspect.signature(run_census).parameters:       # fault objects (tests/_faults.py)
            from _faults import Each, SlowRow, StuckRow
            kwargs["fault"] = Each(SlowRow(8, 30), StuckRow(20, 30))
        else:                                                          # environment test hooks
            env_hooks = {"KNOTLEDGER_TEST_SLOW_ROW": "8:30", "KNOTLEDGER_TEST_STUCK_ROW": "20:30"}
    os.environ.update(env_hooks)
    _fresh_workers()
    try:
        t0 = time.perf_counter()
        run_census(load_spec(spec), out, jobs=2, quiet=True, **kwargs)
        return time.perf_counter() - t0
    finally:
        for k in env_hooks:
            del os.environ[k]
        _fresh_workers()     # workers spawned with the hooks must not be reused


def main() -> None:
    ap = argparse.ArgumentParser()
    ap.add_argument("--repeat", type=int, default=3)
    ap.add_argument("--out", default="reports/bench_timeout.md")
    args = ap.parse_args()
    with tempfile.TemporaryDirectory() as tmp:
        clean = min(_run(Path(tmp), faulty=False) for _ in range(args.repeat))
        faulty = min(_run(Path(tmp), faulty=True) for _ in range(args.repeat))
    lines = ["# Chunk timeouts", "",
             f"Script: `tests/benchmarks/bench_timeout.py` (best of {args.repeat} runs each, --jobs 2, "
             "41 two-bridge rows in chunks of 6, `timeout = 1`; "
             f"{platform.machine()}, {os.cpu_count()} cores, Python {platform.python_version()}).", "",
             "| run | seconds | ratio to clean |", "| --- | ---: | ---: |",
             f"| clean | {clean:.2f} | 1.00 |",
             f"| slow row 8 + stuck row 20 (30 s each) | {faulty:.2f} | {faulty / clean:.2f} |", "",
             f"Excess of the faulty run over clean + the two 1 s budgets: {faulty - clean - 2:.2f} s "
             "(worker kill and respawn).  Without the timeouts it would exceed 60 s.", ""]
    Path(args.out).parent.mkdir(parents=True, exist_ok=True)
    Path(args.out).write_text("\n".join(lines))
    print("\n".join(lines))


if __name__ == "__main__":
    main()
