"""``knotledger run SPEC --out DIR``: the census, chunk by chunk, resumable and sharded.

The work list (:mod:`pipeline.census.spec`) is cut into chunks of the spec's ``chunk_size``
(never derived from ``--jobs``, so every machine cuts the same chunks).  Locally the
chunks run in worker processes of joblib's loky executor (``--jobs N``); with
``--scheduler ADDRESS`` they run on a dask.distributed cluster through joblib's dask
backend.  The parent only schedules, writes parts and commits them
(:mod:`pipeline.census.store`); it never computes an invariant.

Isolation: a diagram failure is its row's status (:mod:`pipeline.census.worker`); a chunk
past its ``timeout`` gives up its remaining rows inside the worker; a worker that
does not come back ``timeout/2 + 5`` seconds after that is killed with its process,
its chunk is committed with status ``skipped: chunk timeout`` rows, and the other
chunks that were in flight are resubmitted.  A worker that dies (segfault, OOM) has
its chunk retried alone once, then recorded as ``error: worker process died``.  On a
dask cluster only the in-worker timeout applies (threads cannot be killed; dask itself
restarts dead worker processes).
"""

from __future__ import annotations

import argparse
import hashlib
import json
import sys
import time
from concurrent.futures import FIRST_COMPLETED, wait
from pathlib import Path
from typing import Iterator, Optional

from ..errors import KnotLedgerError, SpecError
from .spec import Spec, WorkItem, count_items, iter_chunks, load_spec

__all__ = ["add_arguments", "main", "run_census", "parse_shard", "versions"]


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("spec", help="census spec file (TOML)")
    parser.add_argument("--out", required=True, help="census directory to create (or resume)")
    parser.add_argument("--jobs", type=int, default=1, help="worker processes (default 1)")
    parser.add_argument("--resume", action="store_true",
                        help="continue a census: drop uncommitted parts, compute missing chunks, "
                             "merge shard manifests, build the knots table")
    parser.add_argument("--shard", metavar="I/N", help="compute only chunks j with j mod N = I-1")
    parser.add_argument("--scheduler", metavar="ADDRESS",
                        help="run the chunks on a dask.distributed scheduler at ADDRESS")
    parser.add_argument("--jones-budget", type=int, help="override the spec's jones_budget")
    parser.add_argument("--min-colors-budget", type=int, help="override the spec's min_colors_budget")
    parser.add_argument("--timeout", type=float, help="override the spec's timeout (seconds per chunk)")
    parser.add_argument("--quiet", action="store_true", help="no progress output")


def parse_shard(text: Optional[str]) -> Optional[tuple[int, int]]:
    """``"I/N"`` (1-based) -> (I, N); SpecError on anything else."""
    if text is None:
        return None
    try:
        i, n = (int(x) for x in text.split("/"))
    except ValueError:
        raise SpecError(f"--shard {text!r} is not of the form I/N (e.g. 1/4)") from None
    if not 1 <= i <= n:
        raise SpecError(f"--shard {text!r}: need 1 <= I <= N")
    return i, n


def versions() -> dict:
    """Declared versions of the code that determines stored values."""
    from .. import __version__
    from ..invariants.all import ALGORITHM_VERSIONS
    from .schemas import SCHEMA_VERSION
    out = {"knotledger": __version__, "schema": SCHEMA_VERSION, "algorithms": dict(ALGORITHM_VERSIONS)}
    from ..identify import classify
    out["classify"] = str(getattr(classify, "ALGORITHM_VERSION", "1"))
    return out


def _source_hashes() -> dict:
    """SHA-256 (12 hex) of every pipeline module: informative, not part of the identity."""
    root = Path(__file__).resolve().parents[1]
    return {str(p.relative_to(root)): hashlib.sha256(p.read_bytes()).hexdigest()[:12]
            for p in sorted(root.rglob("*.py"))}


def _started_options(out: Path) -> dict:
    """The options recorded by an earlier writer of this census directory, if any."""
    for path in sorted(out.glob("manifest*.json")) if out.is_dir() else []:
        try:
            return dict(json.loads(path.read_text(encoding="utf-8"))["census"]["options"])
        except (OSError, ValueError, KeyError, TypeError):
            continue
    return {}


def _identity(spec: Spec, opts: dict) -> dict:
    files = {str(p): hashlib.sha256(p.read_bytes()).hexdigest() for p in spec.input_files()}
    return {"spec_sha256": spec.sha256, "chunk_size": spec.chunk_size, "options": opts,
            "n_items": count_items(spec), "input_files": files, "versions": versions()}


class _Progress:
    def __init__(self, total: int, done: int, quiet: bool, label: str) -> None:
        self.total, self.done, self.t0, self.last = total, done, time.monotonic(), 0.0
        self.start_done = done
        self.bar = None
        self.quiet, self.label = quiet, label
        if not quiet and sys.stderr.isatty():
            from tqdm import tqdm
            self.bar = tqdm(total=total, initial=done, unit="diagram", desc=label, smoothing=0.1)

    def update(self, n: int, chunks: int) -> None:
        self.done += n
        if self.bar is not None:
            self.bar.update(n)
            return
        now = time.monotonic()
        if self.quiet or (now - self.last < 5 and self.done < self.total):
            return
        self.last = now
        rate = (self.done - self.start_done) / max(now - self.t0, 1e-9)
        eta = (self.total - self.done) / rate if rate > 0 else float("inf")
        eta_s = time.strftime("%H:%M:%S", time.gmtime(eta)) if eta != float("inf") else "?"
        print(f"{self.label}: {self.done}/{self.total} diagrams, {chunks} chunks committed, "
              f"{rate:.1f} diagrams/s, ETA {eta_s}", file=sys.stderr, flush=True)

    def close(self) -> None:
        if self.bar is not None:
            self.bar.close()


def _timeout_result(chunk: int, items: list[WorkItem], timeout: float, why: str) -> dict:
    from .worker import _reject, timeout_row
    out = {"chunk": chunk, "diagrams": [], "colorings": [], "rejects": []}
    for item in items:
        if item.error is not None:
            out["rejects"].append(_reject(item, item.error))
        else:
            row = timeout_row(item, timeout)
            if why:
                row["status"] = why
            out["diagrams"].append(row)
    out["stats"] = {"items": len(items), "seconds": None, "timed_out": True, "skipped_links": 0}
    return out


def _run_local(pending: Iterator, opts: dict, jobs: int, commit) -> None:
    """Run chunks on loky worker processes, killing a worker stuck past the hard limit."""
    from joblib.externals.loky import get_reusable_executor
    from .worker import compute_chunk
    timeout = opts.get("timeout")
    hard = None if not timeout else timeout + max(5.0, timeout / 2)
    retry: list = []          # (chunk, items, crashes) to run again
    in_flight: dict = {}      # future -> (chunk, items, start, crashes)
    executor = get_reusable_executor(max_workers=jobs, reuse=True)
    source = iter(pending)
    exhausted = False
    while True:
        solo = any(c > 0 for _, _, _, c in in_flight.values()) or (retry and retry[0][2] > 0)
        limit = 1 if solo else jobs
        while len(in_flight) < limit and (retry or not exhausted):
            if retry:
                chunk, items, crashes = retry.pop(0)
            else:
                nxt = next(source, None)
                if nxt is None:
                    exhausted = True
                    break
                (chunk, items), crashes = nxt, 0
            fut = executor.submit(compute_chunk, chunk, items, opts)
            in_flight[fut] = (chunk, items, time.monotonic(), crashes)
            if crashes:
                break
        if not in_flight:
            return
        done, _ = wait(list(in_flight), timeout=0.5, return_when=FIRST_COMPLETED)
        broken = False
        for fut in done:
            chunk, items, _, crashes = in_flight.pop(fut)
            try:
                commit(fut.result())
            except Exception as err:  # a dead worker breaks the pool: retry alone, then give up
                broken = True
                if crashes >= 1:
                    commit(_timeout_result(chunk, items, timeout or 0,
                                           f"error: worker process died ({type(err).__name__})"))
                else:
                    retry.append((chunk, items, crashes + 1))
        now = time.monotonic()
        stuck = [f for f, (_, _, t0, _) in in_flight.items() if hard and now - t0 > hard]
        if stuck or broken:
            executor.shutdown(wait=False, kill_workers=True)
            for fut, (chunk, items, _, crashes) in list(in_flight.items()):
                if fut in stuck:
                    commit(_timeout_result(chunk, items, timeout, ""))
                else:
                    retry.insert(0, (chunk, items, crashes))
            in_flight.clear()
            executor = get_reusable_executor(max_workers=jobs, reuse=True)


def _run_dask(pending: Iterator, opts: dict, address: str, commit) -> None:
    """Run chunks on a dask.distributed cluster through joblib's dask backend."""
    try:
        from dask.distributed import Client
    except ImportError as err:
        raise KnotLedgerError("--scheduler needs dask.distributed (pip install 'knotledger[cluster]')") from err
    from joblib import Parallel, delayed, parallel_config
    from .worker import compute_chunk
    try:
        client = Client(address, timeout=20)
    except (OSError, TimeoutError) as err:
        raise KnotLedgerError(f"--scheduler {address}: cannot connect ({err})") from err
    try:
        with parallel_config(backend="dask"):
            results = Parallel(return_as="generator_unordered", pre_dispatch="2*n_jobs")(
                delayed(compute_chunk)(chunk, items, opts) for chunk, items in pending)
            for result in results:
                commit(result)
    finally:
        client.close()


def build_knots(store) -> None:
    """The knots table from the committed diagrams rows (whole census only)."""
    from ..identify.classify import build_knots_table
    from .schemas import KNOTS
    from .knots_build import knots_rows
    knots = []
    for k in knots_rows(store.dir, build_knots_table):
        extra = {c: v for c, v in k.items() if c not in KNOTS.names}
        row = {c: v for c, v in k.items() if c in KNOTS.names}
        row["extras"] = json.dumps(extra, sort_keys=True, default=str) if extra else None
        knots.append(row)
    knots.sort(key=lambda r: str(r["knot_key"]))
    store.write_knots(knots, "built by pipeline.identify.classify.build_knots_table")


def run_census(spec: Spec, out: str | Path, *, jobs: int = 1, resume: bool = False,
               shard: Optional[tuple[int, int]] = None, scheduler: Optional[str] = None,
               overrides: Optional[dict] = None, quiet: bool = False) -> dict:
    """Run (or resume) a census; return the final manifest."""
    from .store import CensusStore
    if jobs < 1:
        raise SpecError(f"--jobs {jobs}: need at least 1")
    opts = {"max_modulus": spec.max_modulus, "jones_budget": spec.jones_budget,
            "min_colors_budget": spec.min_colors_budget, "timeout": spec.timeout}
    if resume or shard:  # budgets given on the command line at the start stay in force
        opts.update(_started_options(Path(out)))
    for key, val in (overrides or {}).items():
        if val is not None:
            opts[key] = val
    store = CensusStore(out, shard=shard)
    identity = _identity(spec, opts)
    info = {"spec_text": spec.text, "spec_name": spec.name, "code": _source_hashes()}
    (store.resume if resume else store.create)(identity, info)
    store.prepare()
    done = store.committed()
    label = f"knotledger run {spec.name}" + (f" [shard {shard[0]}/{shard[1]}]" if shard else "")
    total = sum(len(items) for j, items in iter_chunks(spec) if store.owns(j))
    done_items = sum(e.get("items", 0) for e in store.manifest["chunks"].values())
    progress = _Progress(total, done_items, quiet, label)
    pending = ((j, items) for j, items in iter_chunks(spec) if store.owns(j) and j not in done)
    t0 = time.time()

    def commit(result: dict) -> None:
        store.write_chunk(result["chunk"], result)
        progress.update(result["stats"]["items"], len(store.manifest["chunks"]))

    try:
        if scheduler:
            _run_dask(pending, opts, scheduler, commit)
        else:
            _run_local(pending, opts, jobs, commit)
    finally:
        progress.close()
    runs = store.manifest.setdefault("timings", [])
    runs.append({"started_unix": round(t0, 3), "seconds": round(time.time() - t0, 3),
                 "jobs": jobs, "scheduler": scheduler, "resume": resume})
    store.save()
    if shard is None:
        n_chunks = -(-identity["n_items"] // spec.chunk_size)
        missing = n_chunks - len(store.committed())
        if missing:
            raise KnotLedgerError(f"{out}: {missing} chunk(s) still missing; run --resume again")
        build_knots(store)
    return store.manifest


def main(args: argparse.Namespace) -> int:
    spec = load_spec(args.spec)
    overrides = {"jones_budget": args.jones_budget, "min_colors_budget": args.min_colors_budget,
                 "timeout": args.timeout}
    manifest = run_census(spec, args.out, jobs=args.jobs, resume=args.resume,
                          shard=parse_shard(args.shard), scheduler=args.scheduler,
                          overrides=overrides, quiet=args.quiet)
    if not args.quiet:
        rows = {t: sum(e["parts"].get(t, {}).get("rows", 0) for e in manifest["chunks"].values())
                for t in ("diagrams", "colorings", "rejects")}
        knots = (manifest.get("knots") or {}).get("rows", 0)
        print(f"knotledger run: {args.out}: {rows['diagrams']} diagrams, {rows['colorings']} "
              f"colouring rows, {rows['rejects']} rejects, {knots} knot types", file=sys.stderr)
    return 0
