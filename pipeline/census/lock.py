"""One writer per census directory: an advisory ``fcntl.flock`` on ``DIR/.knotledger.lock``.

A whole-census run (a first run, a ``--resume``, the merge of shard manifests and the
knots build) holds the lock *exclusively*; a shard (``--shard I/N``) holds it *shared*,
so shards run side by side while a merge waits for all of them (and they for it).
The kernel drops a ``flock`` when its holder's process ends, however it ends (kill -9
included), so a lock is never stale: a file left behind by a dead holder locks nothing.
The file holds one line describing the last holder (pid, host, start time, role), used
only to name the holder in the refusal message.  Readers (``query``, ``check``, ``fit``,
``report``, ``open_census``) never take the lock.

``flock`` is advisory and local: writers on several machines sharing one directory over
a network file system are only excluded where that file system implements ``flock``.
"""

from __future__ import annotations

import errno
import fcntl
import os
import socket
import sys
import time
from contextlib import contextmanager
from pathlib import Path
from typing import Iterator

from ..errors import KnotLedgerError

__all__ = ["LOCK_NAME", "LockBusy", "census_lock", "holder"]

LOCK_NAME = ".knotledger.lock"


class LockBusy(KnotLedgerError):
    """Another writer holds the census directory."""


def holder(directory: str | Path) -> str:
    """The last holder's description from the lock file ('' if none or unreadable)."""
    try:
        return (Path(directory) / LOCK_NAME).read_text(encoding="utf-8").strip()
    except OSError:
        return ""


def _describe(role: str) -> str:
    stamp = time.strftime("%Y-%m-%dT%H:%M:%SZ", time.gmtime())
    return f"pid {os.getpid()} on host {socket.gethostname()} since {stamp} ({role})"


@contextmanager
def census_lock(directory: str | Path, *, shared: bool = False, wait: bool = False,
                role: str = "knotledger run") -> Iterator[None]:
    """Hold the writer lock of ``directory`` (created if missing) for the ``with`` block.

    Parameters
    ----------
    directory : str or Path
        The census directory.
    shared : bool
        Take a shared lock (a shard) instead of an exclusive one (the whole census).
    wait : bool
        Block until the lock is free (one line on stderr says who holds it) instead of
        raising :class:`LockBusy`.
    role : str
        Written into the lock file so that a refused writer can name this one.

    Raises
    ------
    LockBusy
        If another writer holds the lock and ``wait`` is false; the message names it.
    OSError
        If the directory or the lock file cannot be created.
    """
    directory = Path(directory)
    directory.mkdir(parents=True, exist_ok=True)
    path = directory / LOCK_NAME
    fd = os.open(path, os.O_RDWR | os.O_CREAT | os.O_CLOEXEC, 0o644)
    try:
        mode = fcntl.LOCK_SH if shared else fcntl.LOCK_EX
        try:
            fcntl.flock(fd, mode | fcntl.LOCK_NB)
        except OSError as err:
            if err.errno not in (errno.EWOULDBLOCK, errno.EAGAIN, errno.EACCES):
                raise
            who = holder(directory) or "another process"
            if not wait:
                raise LockBusy(f"{directory}: another writer holds the census lock ({who}); "
                               "wait for it to finish, or pass --wait") from None
            print(f"knotledger run: waiting for the census lock of {directory} ({who})",
                  file=sys.stderr, flush=True)
            fcntl.flock(fd, mode)
        try:  # informative only: a full disk must not stop a run that holds the lock
            os.ftruncate(fd, 0)
            os.pwrite(fd, (_describe(role) + "\n").encode(), 0)
        except OSError:
            pass
        yield
    finally:
        os.close(fd)  # closing the descriptor releases the lock
