"""Run (or resume) a census in a child process and SIGKILL it at a chosen point.

``python tests/_driver.py SPEC OUT [--resume] [--shard I/N] [--pause S] [--kill POINT:N:WHEN]``

POINT names a function of the write path (see ``POINTS``); the process kills itself
with SIGKILL on the N-th call, ``before`` the call or ``after`` it returned.  Used by
tests/test_faults.py and tests/test_run.py (a kill -9 at a controlled moment).
"""

from __future__ import annotations

import argparse
import os
import signal
import sys
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[1]))
sys.path.insert(0, str(Path(__file__).resolve().parent))

import pyarrow.ipc  # noqa: E402
import pyarrow.parquet  # noqa: E402

import pipeline.census.store as store  # noqa: E402
import pipeline.identify.classify as classify  # noqa: E402

#: point -> (object, attribute) patched in this process only
POINTS = {
    "write_table": (pyarrow.parquet, "write_table"),       # a part (or knots table) written
    "replace": (os, "replace"),                            # a part or manifest renamed in
    "manifest": (store, "_write_json_atomic"),             # a manifest write
    "write_chunk": (store.CensusStore, "write_chunk"),     # one chunk commit
    "merge": (store.CensusStore, "_merge"),                # merging one shard manifest
    "spill": (pyarrow.ipc, "new_file"),                    # knots build: spilling a batch
    "classify": (classify, "build_knots_table"),           # knots build: one batch classified
}


def _arm(point: str, n: int, when: str) -> None:
    obj, attr = POINTS[point]
    original = getattr(obj, attr)
    calls = [0]

    def wrapper(*args, **kwargs):
        calls[0] += 1
        if calls[0] == n and when == "before":
            os.kill(os.getpid(), signal.SIGKILL)
        out = original(*args, **kwargs)
        if calls[0] == n and when == "after":
            os.kill(os.getpid(), signal.SIGKILL)
        return out

    setattr(obj, attr, wrapper)


def main() -> int:
    from pipeline.census.run import parse_shard, run_census
    from pipeline.census.spec import load_spec
    from _faults import Pause
    ap = argparse.ArgumentParser()
    ap.add_argument("spec")
    ap.add_argument("out")
    ap.add_argument("--resume", action="store_true")
    ap.add_argument("--shard")
    ap.add_argument("--pause", type=float, default=0.0)
    ap.add_argument("--kill")
    args = ap.parse_args()
    if args.kill:
        point, n, when = args.kill.split(":")
        _arm(point, int(n), when)
    run_census(load_spec(args.spec), args.out, resume=args.resume, shard=parse_shard(args.shard),
               quiet=True, fault=Pause(args.pause) if args.pause else None)
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
