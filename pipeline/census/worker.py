"""The census worker: one chunk of the work list in, plain Python rows out.

This module runs inside the worker processes (loky or dask).  It imports the diagram
core (:mod:`pipeline.diagrams`), the invariants (:mod:`pipeline.invariants.all`) and the
knot keys (:mod:`pipeline.identify.classify`) -- never sympy, pandas, duckdb, matplotlib
or pyarrow; rows travel back to the parent as lists of dicts, which the parent checks
against the Arrow schemas (:mod:`pipeline.census.schemas`) and writes.

Isolation: every diagram is computed on its own.  A notation that does not parse
becomes a ``rejects`` row with the parser's reason; an exception or a budget overrun
becomes the row's ``status``.  The chunk ``timeout`` (seconds) is enforced with a
``SIGALRM`` interval timer when the chunk runs in the worker's main thread (loky), and
otherwise only between diagrams (a dask worker thread); when it fires, the row being
computed and the remaining rows carry only the cheap columns and the status
``skipped: chunk timeout N s``.  A worker stuck where no signal reaches it is killed by
the parent (see :mod:`pipeline.census.local`).

``compute_chunk`` takes an optional ``fault`` callable, called with each work item
before its invariants are computed; it exists so that tests can inject slowness, hangs
and crashes explicitly.  Production runs pass none.
"""

from __future__ import annotations

import json
import signal
import threading
import time
from typing import Any, Callable, Optional, Sequence

from ..errors import KnotLedgerError

__all__ = ["compute_chunk", "ChunkTimeout", "diagram_row_skeleton", "timeout_row", "reject_row",
           "given_up_result"]

INT64_MIN, INT64_MAX = -(2 ** 63), 2 ** 63 - 1
#: compute_all keys that land in their own columns or are deliberately not stored
#: (witnesses can be recomputed by ``knotledger show``; timings are not reproducible).
_CONSUMED = {"crossings", "components", "free_loops", "writhe", "alternating", "determinant",
             "invariant_factors", "colorings", "colorable_moduli", "witnesses", "min_colors",
             "alexander", "conway", "jones", "signature", "nullity", "chirality",
             "chirality_reason", "checks", "checks_failed", "status", "timings",
             # strength (issue 12)
             "homfly", "khovanov", "khovanov_f2", "khovanov_reduced", "rasmussen_s", "kh_width",
             "tristram_levine", "khovanov_torsion"}


class ChunkTimeout(BaseException):
    """The chunk's time budget ran out (a BaseException so `except Exception` can't eat it)."""


def _int64(v: Optional[int]) -> Optional[int]:
    return v if v is not None and INT64_MIN <= v <= INT64_MAX else None


def _poly(p) -> tuple[Optional[str], Optional[list]]:
    if p is None:
        return None, None
    return (json.dumps(p.to_json(), separators=(",", ":")),
            [{"e2": int(k), "c": str(int(c))} for k, c in p.terms])


def _jsonable(v: Any) -> Any:
    if hasattr(v, "to_json") and hasattr(v, "terms"):
        return v.to_json()
    if isinstance(v, dict):
        return {str(k): _jsonable(x) for k, x in v.items()}
    if isinstance(v, (list, tuple)):
        return [_jsonable(x) for x in v]
    if isinstance(v, (str, bool, float)) or v is None:
        return v
    try:
        return int(v)
    except (TypeError, ValueError):
        return str(v)


def _diagram_id(d) -> str:
    from ..identify.classify import diagram_id
    return diagram_id(d)


def diagram_row_skeleton(item, d=None) -> dict:
    """The diagrams row with only the cheap columns filled (status still to be set)."""
    row = {"row_id": item.row_id, "family": item.family, "family_index": item.family_index,
           "params": item.params, "labels": item.labels, "source": item.source,
           "notation": item.notation, "diagram_id": None, "crossings": None,
           "components": None, "free_loops": None, "writhe": None}
    row["mirror_by_convention"] = _mirror_by_convention(item.notation)
    if d is not None:
        row.update(diagram_id=_diagram_id(d), crossings=d.n_crossings,
                   components=d.n_components, free_loops=d.free_loops, writhe=d.writhe)
    return row


def _mirror_by_convention(notation: str) -> bool:
    """True for DT codes: they fix a knot only up to mirror image (see pipeline.diagrams.dt)."""
    return notation.strip().lower().startswith("dt:")


def _invariants(d, opts: dict, notation: str) -> dict:
    from ..invariants.all import compute_all
    from ..invariants.all import DEFAULT_HOMFLY_BUDGET, DEFAULT_KHOVANOV_BUDGET
    return compute_all(d, max_modulus=opts["max_modulus"], jones_budget=opts.get("jones_budget"),
                       min_colors_budget=opts.get("min_colors_budget"), notation=notation,
                       homfly_budget=opts.get("homfly_budget", DEFAULT_HOMFLY_BUDGET),
                       khovanov_budget=opts.get("khovanov_budget", DEFAULT_KHOVANOV_BUDGET))


def _fill(row: dict, inv: dict) -> list[dict]:
    """Copy compute_all's values into the row; return the colorings rows."""
    det = inv.get("determinant")
    factors = inv.get("invariant_factors")
    row["alternating"] = inv.get("alternating")
    row["determinant"] = _int64(None if det is None else int(det))
    row["determinant_text"] = None if det is None else str(int(det))
    if factors is not None:
        ints = [int(x) for x in factors]
        row["invariant_factors"] = [str(x) for x in ints]
        row["invariant_factors_int"] = None if any(_int64(x) is None for x in ints) else ints
    for name in ("signature", "nullity"):
        v = inv.get(name)
        row[name] = None if v is None else int(v)
    for name in ("alexander", "conway", "jones"):
        row[name], row[f"{name}_terms"] = _poly(inv.get(name))
    _fill_strength(row, inv)
    row["chirality"] = inv.get("chirality")
    row["chirality_reason"] = inv.get("chirality_reason")
    checks = inv.get("checks") or {}
    row["checks"] = json.dumps({str(k): bool(v) for k, v in sorted(checks.items())},
                               separators=(",", ":"))
    row["checks_failed"] = sorted(str(k) for k, ok in checks.items() if not ok)
    row["status"] = inv.get("status", "ok")
    extras = {k: _jsonable(v) for k, v in inv.items() if k not in _CONSUMED}
    row["extras"] = json.dumps(extras, separators=(",", ":"), sort_keys=True) if extras else None
    out = []
    counts = inv.get("colorings") or {}
    fewest = inv.get("min_colors") or {}
    for n in sorted(counts):
        c = int(counts[n])
        m = fewest.get(n)
        out.append({"row_id": row["row_id"], "modulus": int(n), "count": _int64(c),
                    "count_text": str(c), "nontrivial": c > int(n),
                    "min_colors": None if m is None else int(m)})
    return out


#: knot_key fields stored in columns of their own (the rest goes to extras['knot'])
_KEY_TEXT_COLUMNS = ("knot_key", "mirror_key", "knot_proof", "chirality", "chirality_reason")
# --- begin: simplification / primality / flype columns (issue 11) ---
_STRUCTURE_COLUMNS = ("simplified_crossings", "simplified_notation", "prime", "prime_reason",
                      "flype_code")
# --- end: simplification / primality / flype columns ---


# ---- strength (issue 12)
def _fill_strength(row: dict, inv: dict) -> None:
    """The HOMFLY-PT, Khovanov and Tristram–Levine columns (JSON text; None = not computed)."""
    def text(v):
        return None if v is None else json.dumps(v, separators=(",", ":"))

    P = inv.get("homfly")
    row["homfly"] = None if P is None else text(P.to_json())
    row["homfly_terms"] = None if P is None else [{"v": int(a), "z": int(b), "c": str(int(c))}
                                                  for (a, b), c in P.terms]
    for name in ("khovanov", "khovanov_f2", "khovanov_reduced", "tristram_levine", "khovanov_torsion"):
        row[name] = text(inv.get(name))
    for name in ("rasmussen_s", "kh_width"):
        v = inv.get(name)
        row[name] = None if v is None else int(v)
# ---- end strength


def _knot_key(row: dict, inv: dict, d, opts: Optional[dict] = None) -> None:
    from ..identify.classify import knot_key
    opts = opts or {}
    got = knot_key({**inv, **{k: v for k, v in row.items() if k not in inv}, "diagram": d},
                   simplify_budget=opts.get("simplify_budget"), flype_budget=opts.get("flype_budget"))
    extra = {}
    for k, v in (got or {}).items():
        col = {"proof": "knot_proof"}.get(k, k)
        if col in _KEY_TEXT_COLUMNS:
            row[col] = None if v is None else str(v)
        elif col in _STRUCTURE_COLUMNS:
            row[col] = v
        else:
            extra[k] = _jsonable(v)
    if extra:
        old = json.loads(row["extras"]) if row.get("extras") else {}
        old["knot"] = extra
        row["extras"] = json.dumps(old, separators=(",", ":"), sort_keys=True)


def _one(item, opts: dict, out: dict, fault: Optional[Callable]) -> None:
    from ..diagrams.notation import parse
    if item.error is not None:
        out["rejects"].append(reject_row(item, item.error))
        return
    try:
        d = parse(item.notation)
    except KnotLedgerError as err:
        out["rejects"].append(reject_row(item, str(err)))
        return
    if item.check_knot and d.n_components != 1:
        out["skipped_links"] += 1
        return
    row = diagram_row_skeleton(item, d)
    out["diagrams"].append(row)
    row["status"] = "error: row not finished"
    try:
        if fault is not None:
            fault(item)
        inv = _invariants(d, opts, item.notation)
        out["colorings"].extend(_fill(row, inv))
        _knot_key(row, inv, d, opts)
    except (ChunkTimeout, KeyboardInterrupt, SystemExit):
        raise
    except BaseException as err:  # noqa: BLE001 - isolation: any failure is this row's status
        text = str(err).splitlines()[0] if str(err) else ""
        row["status"] = f"error: {type(err).__name__}: {text}".rstrip(": ")


def reject_row(item, reason: str) -> dict:
    """The rejects row of an item whose text could not be turned into a diagram."""
    return {"row_id": item.row_id, "family": item.family, "family_index": item.family_index,
            "source": item.source or f"family {item.family_index + 1} ({item.family})",
            "text": item.notation, "reason": reason}


def _on_alarm(signum, frame):
    raise ChunkTimeout()


def compute_chunk(chunk: int, items: Sequence, opts: dict, *,
                  fault: Optional[Callable] = None) -> dict:
    """Compute one chunk; return ``{"chunk", "diagrams", "colorings", "rejects", "stats"}``.

    ``opts``: ``max_modulus``, ``jones_budget``, ``min_colors_budget``, ``simplify_budget``,
    ``flype_budget`` (None: the defaults of :mod:`pipeline.identify.flype_keys`), ``timeout``
    (seconds for the whole chunk; ``None`` or 0 for none).  ``fault``: see the module
    docstring (tests only).
    """
    t0 = time.monotonic()
    out: dict = {"chunk": chunk, "diagrams": [], "colorings": [], "rejects": [], "skipped_links": 0}
    timeout = opts.get("timeout")
    use_alarm = bool(timeout) and threading.current_thread() is threading.main_thread()
    deadline = t0 + timeout if timeout else None
    timed_out = False
    old = signal.signal(signal.SIGALRM, _on_alarm) if use_alarm else None
    k = 0  # bound before the timer can fire: a timeout before the first item gives up all
    try:
        if use_alarm:
            signal.setitimer(signal.ITIMER_REAL, max(timeout - (time.monotonic() - t0), 1e-3))
        for k, item in enumerate(items):
            if deadline is not None and time.monotonic() > deadline:
                raise ChunkTimeout()
            _one(item, opts, out, fault)
        k = len(items)  # a timer firing after the last item gives up nothing
    except ChunkTimeout:
        timed_out = True
        _give_up(items, k, out, timeout)
    finally:
        if use_alarm:
            signal.setitimer(signal.ITIMER_REAL, 0)
            signal.signal(signal.SIGALRM, old)
    out["stats"] = {"items": len(items), "seconds": round(time.monotonic() - t0, 3),
                    "timed_out": timed_out, "skipped_links": out.pop("skipped_links")}
    return out


def _give_up(items: Sequence, k: int, out: dict, timeout) -> None:
    """Rows k.. of a timed-out chunk: cheap columns only, status says why."""
    if k >= len(items):
        return
    done = {r["row_id"] for r in out["diagrams"]}
    if items[k].row_id in done:  # the diagram being computed when time ran out
        out["colorings"] = [c for c in out["colorings"] if c["row_id"] != items[k].row_id]
        out["diagrams"] = [r for r in out["diagrams"] if r["row_id"] != items[k].row_id]
    for item in items[k:]:
        if item.error is not None:
            out["rejects"].append(reject_row(item, item.error))
        else:
            out["diagrams"].append(timeout_row(item, timeout))


def timeout_row(item, timeout) -> dict:
    """A diagrams row for an item whose chunk ran out of time (nothing parsed)."""
    row = diagram_row_skeleton(item)
    row["status"] = f"skipped: chunk timeout {timeout:g} s"
    return row


def given_up_result(chunk: int, items: Sequence, timeout: Optional[float], status: str = "") -> dict:
    """The result of a chunk whose worker never came back: every row is given up.

    Computed by the parent (no diagram is parsed).  ``status`` replaces the timeout
    status when non-empty (``error: worker process died ...``).
    """
    out: dict = {"chunk": chunk, "diagrams": [], "colorings": [], "rejects": []}
    for item in items:
        if item.error is not None:
            out["rejects"].append(reject_row(item, item.error))
        else:
            row = timeout_row(item, timeout or 0)
            if status:
                row["status"] = status
            out["diagrams"].append(row)
    out["stats"] = {"items": len(items), "seconds": None, "timed_out": True, "skipped_links": 0}
    return out
