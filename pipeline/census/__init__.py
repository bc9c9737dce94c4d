"""Stage 4 — census: from a spec file to Parquet tables on disk.

Takes in: a TOML spec (and the input files it names).
Hands on: a census directory — Parquet parts per table, ``manifest.json`` — and, through
:func:`open_census`, the tables read back.

Modules: :mod:`.spec` and :mod:`.spec_files` (the spec), :mod:`.worklist` (the deterministic
work list), :mod:`.run` (chunks, resume, shards, exit codes), :mod:`.local` (the local scheduler:
crashes, timeouts, retries), :mod:`.lock` (one writer per directory), :mod:`.worker` (one
chunk of rows),
:mod:`.store` (atomic Parquet parts + manifest), :mod:`.knots_build` (the knots table in
bounded memory), :mod:`.reader` (reading a census back), :mod:`.schemas` (the Arrow
schemas).  Storage never computes invariants: the worker calls the stages below.
"""

from .reader import Census, open_census

__all__ = ["Census", "open_census"]
