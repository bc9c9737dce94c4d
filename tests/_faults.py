"""Fault hooks for the census tests, passed explicitly as ``run_census(..., fault=...)``.

Each hook is a small picklable object called by the worker with every work item before
its invariants are computed (see :mod:`pipeline.census.worker`).  They live in an
importable module so that loky and dask worker processes unpickle them by reference.
"""

from __future__ import annotations

import os
import signal
import threading
import time
from pathlib import Path


class SlowRow:
    """Sleep ``seconds`` on row ``row_id`` (interruptible by the chunk timer)."""

    def __init__(self, row_id: int, seconds: float) -> None:
        self.row_id, self.seconds = row_id, seconds

    def __call__(self, item) -> None:
        if item.row_id == self.row_id:
            time.sleep(self.seconds)


class StuckRow:
    """On row ``row_id`` ignore SIGALRM and spin ``seconds`` (like a long C call)."""

    def __init__(self, row_id: int, seconds: float) -> None:
        self.row_id, self.seconds = row_id, seconds

    def __call__(self, item) -> None:
        if item.row_id != self.row_id:
            return
        main = threading.current_thread() is threading.main_thread()
        old = signal.signal(signal.SIGALRM, signal.SIG_IGN) if main else None
        end = time.monotonic() + self.seconds
        while time.monotonic() < end:
            time.sleep(0.05)
        if main:
            signal.signal(signal.SIGALRM, old)


class Each:
    """Call every hook in turn."""

    def __init__(self, *hooks) -> None:
        self.hooks = hooks

    def __call__(self, item) -> None:
        for h in self.hooks:
            h(item)


class Pause:
    """Sleep ``seconds`` before every item (makes a run slow enough to interrupt)."""

    def __init__(self, seconds: float) -> None:
        self.seconds = seconds

    def __call__(self, item) -> None:
        time.sleep(self.seconds)


class DieOnce:
    """Kill the worker process on row ``row_id`` the first time only (marker file)."""

    def __init__(self, row_id: int, marker: str | Path) -> None:
        self.row_id, self.marker = row_id, str(marker)

    def __call__(self, item) -> None:
        if item.row_id == self.row_id and not os.path.exists(self.marker):
            Path(self.marker).write_text(str(os.getpid()))
            os._exit(17)


class DieAlways:
    """Kill the worker process on row ``row_id`` every time."""

    def __init__(self, row_id: int) -> None:
        self.row_id = row_id

    def __call__(self, item) -> None:
        if item.row_id == self.row_id:
            os._exit(17)
