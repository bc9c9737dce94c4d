"""The local scheduler: chunks on loky worker processes, with crash and timeout handling.

The seams, one method each: *scheduling* (:meth:`LocalScheduler._fill` keeps ``jobs``
chunks in flight, a chunk under suspicion runs alone), *crash detection*
(:meth:`LocalScheduler._collect` tells a dead worker from a finished chunk), *timeouts*
(:meth:`LocalScheduler._stuck`: a worker past the hard limit), *retries*
(:meth:`LocalScheduler._crashed`) and *commits* (the ``commit`` callable of the caller).

Timeouts: a chunk's ``timeout`` (seconds) is first enforced inside the worker
(:mod:`pipeline.census.worker`).  A worker that has not answered ``timeout +
max(5, timeout / 2)`` seconds after its chunk was submitted is killed with every other
worker of the pool; its chunk is committed with ``skipped: chunk timeout N s`` rows and
the other chunks that were in flight are resubmitted.  A worker that dies (segfault,
OOM, ``os._exit``) has its chunk retried alone once, then recorded as ``error: worker
process died (...)`` rows.

A failure of ``commit`` itself (a store error, a full disk, a directory deleted under
the run) is not a worker failure: the pool is shut down and the exception propagates
unchanged, so that the run stops with one line and stays resumable.
"""

from __future__ import annotations

import time
from concurrent.futures import FIRST_COMPLETED, wait
from typing import Callable, Iterable, Iterator, NamedTuple, Optional

__all__ = ["LocalScheduler", "hard_limit"]


class _Flight(NamedTuple):
    chunk: int
    items: list
    crashes: int
    started: float = 0.0


def hard_limit(timeout: Optional[float]) -> Optional[float]:
    """Seconds after which the parent kills a worker that has not answered."""
    return None if not timeout else timeout + max(5.0, timeout / 2)


class LocalScheduler:
    """Run chunks on ``jobs`` loky processes and hand every result to ``commit``."""

    def __init__(self, opts: dict, jobs: int, commit: Callable[[dict], None], *,
                 fault: Optional[Callable] = None) -> None:
        self.opts, self.jobs, self.commit, self.fault = opts, jobs, commit, fault
        self.timeout = opts.get("timeout")
        self.hard = hard_limit(self.timeout)
        self.retry: list[_Flight] = []
        self.in_flight: dict = {}      # future -> _Flight
        self.source: Iterator = iter(())
        self.exhausted = False
        self.executor = None

    # ------------------------------------------------------------ the loop
    def run(self, pending: Iterable[tuple[int, list]]) -> None:
        """Compute and commit every ``(chunk, items)`` of ``pending``."""
        self.source = iter(pending)
        self.executor = self._new_executor()
        try:
            while True:
                self._fill()
                if not self.in_flight:
                    return
                done, _ = wait(list(self.in_flight), timeout=0.5, return_when=FIRST_COMPLETED)
                broken = self._collect(done)
                stuck = self._stuck()
                if stuck or broken:
                    self._restart(stuck)
        except BaseException:
            self.executor.shutdown(wait=False, kill_workers=True)
            raise

    def _new_executor(self):
        from joblib.externals.loky import get_reusable_executor
        return get_reusable_executor(max_workers=self.jobs, reuse=True)

    # ------------------------------------------------------------ scheduling
    def _next(self) -> Optional[_Flight]:
        if self.retry:
            return self.retry.pop(0)
        nxt = next(self.source, None)
        if nxt is None:
            self.exhausted = True
            return None
        return _Flight(nxt[0], nxt[1], 0)

    def _fill(self) -> None:
        """Submit chunks up to the limit: ``jobs``, or 1 while a crashed chunk is retried."""
        from .worker import compute_chunk
        suspect = (any(f.crashes for f in self.in_flight.values())
                   or (self.retry and self.retry[0].crashes > 0))
        limit = 1 if suspect else self.jobs
        while len(self.in_flight) < limit and (self.retry or not self.exhausted):
            flight = self._next()
            if flight is None:
                return
            fut = self.executor.submit(compute_chunk, flight.chunk, flight.items, self.opts,
                                       fault=self.fault)
            self.in_flight[fut] = flight._replace(started=time.monotonic())
            if flight.crashes:
                return

    # ------------------------------------------------------------ crash detection + commits
    def _collect(self, done) -> bool:
        """Commit finished chunks; return True when a worker died (the pool is broken)."""
        broken = False
        for fut in done:
            flight = self.in_flight.pop(fut)
            try:
                result = fut.result()
            except Exception as err:  # noqa: BLE001 - the worker, not the commit, failed
                broken = True
                self._crashed(flight, err)
                continue
            self.commit(result)  # a write failure propagates: it is not a worker crash

        return broken

    # ------------------------------------------------------------ retries
    def _crashed(self, flight: _Flight, err: BaseException) -> None:
        """Retry a crashed chunk alone once; after a second crash record it as failed."""
        from .worker import given_up_result
        if flight.crashes >= 1:
            self.commit(given_up_result(flight.chunk, flight.items, self.timeout,
                                        f"error: worker process died ({type(err).__name__})"))
        else:
            self.retry.append(flight._replace(crashes=flight.crashes + 1))

    # ------------------------------------------------------------ timeouts
    def _stuck(self) -> list:
        if not self.hard:
            return []
        now = time.monotonic()
        return [fut for fut, f in self.in_flight.items() if now - f.started > self.hard]

    def _restart(self, stuck: list) -> None:
        """Kill the pool; commit the stuck chunks as timed out, resubmit the others first."""
        from .worker import given_up_result
        self.executor.shutdown(wait=False, kill_workers=True)
        for fut, flight in list(self.in_flight.items()):
            if fut in stuck:
                self.commit(given_up_result(flight.chunk, flight.items, self.timeout))
            else:
                self.retry.insert(0, flight)
        self.in_flight.clear()
        self.executor = self._new_executor()
