"""``knotledger run SPEC --out DIR``: the census, chunk by chunk, resumable and sharded.

The work list (:mod:`pipeline.census.spec`) is cut into chunks of the spec's ``chunk_size``
(never derived from ``--jobs``, so every machine cuts the same chunks).  Locally the
chunks run in worker processes of joblib's loky executor (``--jobs N``,
:mod:`pipeline.census.local`); with ``--scheduler ADDRESS`` they run on a
dask.distributed cluster through joblib's dask backend.  The parent only schedules,
writes parts and commits them (:mod:`pipeline.census.store`); it never computes an
invariant.

One writer per directory: the whole run -- opening, every chunk, the merge of shard
manifests and the knots build -- holds the census lock (:mod:`pipeline.census.lock`),
exclusively for the whole census and shared for a shard (``--shard I/N``), so shards
run side by side while a merge waits for them.  A busy lock refuses the run with one
line naming the holder, or waits for it with ``--wait``.

Isolation and timeouts: see :mod:`pipeline.census.worker` (a diagram failure is its
row's status; the chunk ``timeout`` inside the worker) and :mod:`pipeline.census.local`
(a worker past ``timeout + max(5, timeout / 2)`` seconds is killed; a dead worker's
chunk is retried alone once).  On a dask cluster only the in-worker timeout applies,
checked between diagrams (dask runs tasks in worker threads, where no ``SIGALRM`` can
be delivered), and dask itself reschedules the chunk of a worker process that died.

Exit codes of ``knotledger run``: 0 the census is complete (or the shard is done);
1 the run failed or could not start -- an OS error while writing (full disk, read-only
or vanished directory, permission denied), the lock held by another writer, chunks still
missing -- with one line on stderr; what was committed stays and ``--resume`` completes
the census once the cause is gone; 2 bad input or usage (spec, input files, options,
a directory that is not this census).
"""

from __future__ import annotations

import argparse
import hashlib
import json
import sys
import time
from pathlib import Path
from typing import Callable, Iterator, Optional

from ..errors import KnotLedgerError, SpecError
from .lock import LockBusy, census_lock
from .spec import Spec, count_items, iter_chunks, load_spec

__all__ = ["add_arguments", "main", "run_census", "parse_shard", "versions", "RunFailed",
           "CLASSIFY_VERSION"]

#: Version of the knot keys and the knots table (pipeline.identify.classify); part of
#: the census identity.  Bump it when knot keys or knots rows change.
CLASSIFY_VERSION = "2"   # 2: key precedence with simplification, summands, flype keys


class RunFailed(KnotLedgerError):
    """The run stopped before the census was complete; what was committed stays (exit 1)."""


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
    parser.add_argument("--wait", action="store_true",
                        help="wait for another writer of the directory to finish instead of refusing")
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
    return {"knotledger": __version__, "schema": SCHEMA_VERSION,
            "algorithms": dict(ALGORITHM_VERSIONS), "classify": CLASSIFY_VERSION}


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


def _run_dask(pending: Iterator, opts: dict, address: str, commit,
              fault: Optional[Callable] = None) -> None:
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
                delayed(compute_chunk)(chunk, items, opts, fault=fault) for chunk, items in pending)
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


def os_error_line(err: OSError) -> str:
    """One line naming the path and the cause of an OS error."""
    import errno as errno_mod
    import os
    code = err.errno
    cause = os.strerror(code) if code else (err.strerror or str(err).splitlines()[0])
    tag = f" ({errno_mod.errorcode.get(code, code)})" if code else ""
    if err.filename is None:
        return f"{cause}{tag}"
    return f"{err.filename}: {cause}{tag}"


def run_census(spec: Spec, out: str | Path, *, jobs: int = 1, resume: bool = False,
               shard: Optional[tuple[int, int]] = None, scheduler: Optional[str] = None,
               overrides: Optional[dict] = None, quiet: bool = False, wait: bool = False,
               fault: Optional[Callable] = None) -> dict:
    """Run (or resume) a census under the directory lock; return the final manifest.

    Parameters
    ----------
    spec : Spec
        The validated spec.
    out : str or Path
        The census directory.
    jobs, resume, shard, scheduler, overrides, quiet, wait
        As the command-line options of ``knotledger run``.
    fault : callable, optional
        Passed to :func:`pipeline.census.worker.compute_chunk` (tests inject faults).

    Raises
    ------
    SpecError, StoreError
        Bad input: the spec, an input file, options, a directory that is not this census.
    RunFailed
        The run stopped: an OS error while writing, the lock held (``LockBusy``), or
        chunks still missing.  Everything committed stays; ``--resume`` continues.
    """
    if jobs < 1:
        raise SpecError(f"--jobs {jobs}: need at least 1")
    out = Path(out)
    if resume and not out.is_dir():
        from .store import StoreError
        raise StoreError(f"{out}: no census manifest here; run without --resume to start one")
    from .store import WriteError
    inputs = {str(p) for p in spec.input_files()}
    try:
        with census_lock(out, shared=shard is not None, wait=wait,
                         role="shard %d/%d" % shard if shard else ("resume" if resume else "run")):
            return _locked_run(spec, out, jobs=jobs, resume=resume, shard=shard,
                               scheduler=scheduler, overrides=overrides, quiet=quiet, fault=fault)
    except (LockBusy, WriteError) as err:
        raise RunFailed(str(err)) from None
    except OSError as err:
        line = os_error_line(err)
        if err.filename is not None and str(err.filename) in inputs:
            raise SpecError(f"input file {line}") from None
        again = f"knotledger run {spec.path or 'SPEC'} --out {out}"
        again += f" --shard {shard[0]}/{shard[1]}" if shard else ""
        started = out.is_dir() and any(out.glob("manifest*.json"))
        raise RunFailed(f"{line}; nothing half-written was kept: fix the cause and run "
                        f"`{again}{' --resume' if started else ''}`") from None


def _locked_run(spec: Spec, out: Path, *, jobs: int, resume: bool,
                shard: Optional[tuple[int, int]], scheduler: Optional[str],
                overrides: Optional[dict], quiet: bool, fault: Optional[Callable]) -> dict:
    from .store import CensusStore
    opts = {"max_modulus": spec.max_modulus, "jones_budget": spec.jones_budget,
            "min_colors_budget": spec.min_colors_budget, "timeout": spec.timeout,
            "simplify_budget": spec.simplify_budget, "flype_budget": spec.flype_budget,
            "homfly_budget": spec.homfly_budget, "khovanov_budget": spec.khovanov_budget}
    if resume or shard:  # budgets given on the command line at the start stay in force
        opts.update(_started_options(out))
    for key, val in (overrides or {}).items():
        if val is not None:
            opts[key] = val
    store = CensusStore(out, shard=shard)
    identity = _identity(spec, opts)
    info = {"spec_text": spec.text, "spec_name": spec.name, "code": _source_hashes()}
    (store.resume if resume else store.create)(identity, info)
    try:
        store.prepare()
        _compute(spec, store, opts, jobs=jobs, resume=resume, scheduler=scheduler,
                 quiet=quiet, fault=fault)
        if shard is None:
            n_chunks = -(-identity["n_items"] // spec.chunk_size)
            missing = n_chunks - len(store.committed())
            if missing:
                raise RunFailed(f"{out}: {missing} chunk(s) still missing; run --resume again")
            build_knots(store)
    finally:
        store.close()
    return store.manifest


def _compute(spec: Spec, store, opts: dict, *, jobs: int, resume: bool,
             scheduler: Optional[str], quiet: bool, fault: Optional[Callable]) -> None:
    """Compute and commit every chunk this writer owns that is not committed yet."""
    from .local import LocalScheduler
    shard = store.shard
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
            _run_dask(pending, opts, scheduler, commit, fault)
        else:
            LocalScheduler(opts, jobs, commit, fault=fault).run(pending)
    finally:
        progress.close()
    runs = store.manifest.setdefault("timings", [])
    runs.append({"started_unix": round(t0, 3), "seconds": round(time.time() - t0, 3),
                 "jobs": jobs, "scheduler": scheduler, "resume": resume})
    store.save()


def main(args: argparse.Namespace) -> int:
    """``knotledger run``: exit 0 done, 1 run failed (resumable), 2 bad input."""
    spec = load_spec(args.spec)
    overrides = {"jones_budget": args.jones_budget, "min_colors_budget": args.min_colors_budget,
                 "timeout": args.timeout}
    try:
        manifest = run_census(spec, args.out, jobs=args.jobs, resume=args.resume,
                              shard=parse_shard(args.shard), scheduler=args.scheduler,
                              overrides=overrides, quiet=args.quiet, wait=args.wait)
    except RunFailed as err:
        sys.stderr.write(f"knotledger run: error: {err}\n")
        return 1
    if not args.quiet:
        rows = {t: sum(e["parts"].get(t, {}).get("rows", 0) for e in manifest["chunks"].values())
                for t in ("diagrams", "colorings", "rejects")}
        knots = (manifest.get("knots") or {}).get("rows", 0)
        print(f"knotledger run: {args.out}: {rows['diagrams']} diagrams, {rows['colorings']} "
              f"colouring rows, {rows['rejects']} rejects, {knots} knot types", file=sys.stderr)
    return 0
