"""The knots table: one row per knot key, from diagram rows carrying keys.

:func:`build_knots_table` runs six steps, each a small function here:

1. **grouping** (:func:`group_rows`): rows read back from the store are completed
   (:func:`_stored_row`), keyed by :func:`pipeline.identify.classify.knot_key` when they
   carry no key, and grouped by key, members ordered by crossings then row_id;
2. **conflicts** (:func:`check_invariants`, :func:`amphichirality`): rows under one key
   must agree on every orientation-free invariant (for knots: on every invariant) and on
   amphichirality — a disagreement is a bug in a normal form or an invariant and raises
   :class:`KeyConflictError`;
3. **crossing-number arbitration** (:func:`crossing_number`): the certified crossing
   numbers of the members must agree and may not exceed the crossing count of any
   diagram of the type; the Kauffman–Murasugi–Thistlethwaite certificate is preferred
   as the source when several certify the same value;
4. **notes** (:func:`add_notes`): keys sharing a fingerprint with other keys get
   ``fingerprint_shared_with`` and a ``distinctness_note`` saying which theorem, if any,
   separates them; a fingerprint-only key with a diagram identical (same
   ``diagram_id``) to one of a normal-form key is noted as the same type;
5. **flype classes** (:func:`check_flype_classes`): the rows of one key have at most one
   flype code, and no two normal-form keys share a flype code (equal codes are one
   link by the flyping theorem, Menasco–Thistlethwaite 1993);
6. **Montesinos cross-check** (:func:`check_montesinos_keys`): alternating Montesinos
   family rows carry their Bonahon–Siebenmann key as ``bs_key`` beside the flype key
   (:mod:`pipeline.identify.classify` rule (b′)): same ``bs_key`` iff same knot key.

References
----------
1. L. Kauffman, "State models and the Jones polynomial", Topology 26 (1987);
   K. Murasugi, "Jones polynomials and classical conjectures" (title abridged),
   Topology 26 (1987); M. Thistlethwaite, "A spanning tree expansion of the Jones
   polynomial", Topology 26 (1987): a connected reduced alternating diagram has the
   minimal crossing number.
2. F. Bonahon, L. Siebenmann, "New geometric splittings of classical knots and the
   classification and symmetries of arborescent knots" (1979-2010 preprint):
   Montesinos knots of one family with different normal forms are distinct.
"""

from __future__ import annotations

import json
from typing import Any, Optional

from ..errors import KnotLedgerError
from .fingerprint import _factors, _poly, base_fingerprint, separating_invariants
from .normal_forms import CN_ALT

__all__ = ["build_knots_table", "group_rows", "check_invariants", "amphichirality",
           "crossing_number", "add_notes", "check_flype_classes", "check_montesinos_keys", "KeyConflictError"]

_UNKNOWN = "unknown: invariants do not decide"


class KeyConflictError(KnotLedgerError):
    """Two rows under one knot key have different invariants (a bug somewhere)."""


def build_knots_table(rows: list[dict]) -> list[dict]:
    """One row per knot key (see README.md ``knots``) from diagram rows carrying keys.

    Each input row needs ``row_id``, ``notation``, ``crossings``, ``components``, the
    invariants, and the :func:`pipeline.identify.classify.knot_key` fields (``proof``
    may be named ``knot_proof``); rows without ``knot_key`` are keyed here.  Rows
    whose status is not ``ok`` are still counted if they have a key.

    Returns
    -------
    list of dict
        Sorted by key, with the README.md columns ``knot_key``, ``representative``
        (notation of the row with fewest crossings, ties by row_id), ``n_diagrams``,
        ``proof``, ``mirror_key``, ``amphichiral`` (True / False / None),
        ``amphichiral_reason``, ``min_crossings_seen``, ``crossing_number``,
        ``crossing_number_source``, and further: ``n_distinct_diagrams`` (distinct
        ``diagram_id``), ``fingerprint_shared_with`` (other keys whose rows have the same
        fingerprint) and ``distinctness_note`` (why those keys are, or are not known to
        be, different types: e.g. mutants are distinct by Bonahon-Siebenmann, a
        fingerprint-only key is "possibly the same type as" a normal-form key).

    Raises
    ------
    KeyConflictError
        When two rows under one key differ in an orientation-free invariant
        (components, determinant, invariant factors) or, for knots, in Alexander,
        Jones or signature; when rows disagree on amphichirality or on a certified
        crossing number; when a certified crossing number exceeds the crossing count
        of a diagram of the type.

    Examples
    --------
    >>> rows = [{"row_id": 0, "notation": "torus:2,3", "crossings": 3, "components": 1},
    ...         {"row_id": 1, "notation": "rational:3/1", "crossings": 3, "components": 1}]
    >>> [(k["knot_key"], k["n_diagrams"]) for k in build_knots_table(rows)]
    [('torus:2,3', 2)]
    """
    groups = group_rows(rows)
    out = []
    for key in sorted(groups):
        members, metas = groups[key]
        check_invariants(key, members)
        amph, reason = amphichirality(key, metas)
        crossings = [r.get("crossings") for r in members if r.get("crossings") is not None]
        cn, src = crossing_number(key, metas, crossings)
        did = {r.get("diagram_id") for r in members if r.get("diagram_id")}
        out.append({
            "knot_key": key,
            "representative": members[0].get("notation"),
            "n_diagrams": len(members),
            "n_distinct_diagrams": len(did) if did else None,
            "proof": "normal form" if any(_proof(m) == "normal form" for m in metas) else "fingerprint only",
            "mirror_key": metas[0].get("mirror_key"),
            "amphichiral": amph,
            "amphichiral_reason": reason,
            "min_crossings_seen": min(crossings) if crossings else None,
            "crossing_number": cn,
            "crossing_number_source": src,
            "flype_code": _flype_code(key, members, metas),
            "_fps": {m.get("fingerprint") for m in metas if m.get("fingerprint")},
            "_dids": did,
            # strength (issue 12): the older fingerprint data (knots: the new invariants
            # are in knot fingerprints only) and a row to compare
            "_base_fps": {base_fingerprint(m) for m in members if m.get("components") == 1},
            "_example": members[0],
        })
    add_notes(out)
    check_flype_classes(out)
    check_montesinos_keys(out, {key: groups[key][1] for key in groups})
    return out


# ---------------------------------------------------------------------- flype classes
def _flype_code(key: str, members: list[dict], metas: list[dict]) -> Optional[str]:
    """The one flype code of a key's rows (None if no row has one)."""
    codes = {m.get("flype_code") for m in list(members) + list(metas) if m.get("flype_code")}
    if len(codes) > 1:
        raise KeyConflictError(f"knot key {key!r}: rows have {len(codes)} different flype codes "
                               "(two link types under one key: a normal form is wrong)")
    return next(iter(codes), None)


def check_flype_classes(out: list[dict]) -> None:
    """Raise :class:`KeyConflictError` when two normal-form keys share a flype code
    (equal flype codes are one link by the flyping theorem, so one of the keys is wrong)."""
    by_code: dict[str, list[dict]] = {}
    for row in out:
        if row.get("flype_code") and row["proof"] == "normal form":
            by_code.setdefault(row["flype_code"], []).append(row)
    for rows in by_code.values():
        if len(rows) > 1:
            names = ", ".join(sorted(r["knot_key"] for r in rows))
            raise KeyConflictError(f"knot keys {names} share a flype class (the same link by the "
                                   "flyping theorem): a normal form or the flype code is wrong")


def check_montesinos_keys(out: list[dict], metas_of: dict[str, list[dict]]) -> None:
    """The Bonahon–Siebenmann cross-check of alternating Montesinos rows.

    A family row keyed by its flype class (classify rule (b′)) keeps its ``mont:`` key as
    ``bs_key``; two classification theorems name the same types, so rows with the same
    ``bs_key`` must have the same knot key and one knot key may not carry two ``bs_key``
    values (:class:`KeyConflictError` otherwise).  A row that kept its ``mont:`` key
    (over the flype budget) while another row of the same ``bs_key`` has the flype key
    is one type under two keys, not an error: both rows get a note.
    """
    keys_of_bs: dict[str, set] = {}
    for key, metas in metas_of.items():
        bs = {m["bs_key"] for m in metas if m.get("bs_key")}
        if len(bs) > 1:
            raise KeyConflictError(f"knot key {key!r}: rows have the Bonahon-Siebenmann keys "
                                   f"{', '.join(sorted(bs))} (two types under one key)")
        for b in bs:
            keys_of_bs.setdefault(b, set()).add(key)
    rows = {r["knot_key"]: r for r in out}
    for b, keys in keys_of_bs.items():
        if len(keys) > 1:
            raise KeyConflictError(f"Bonahon-Siebenmann key {b} has the knot keys {', '.join(sorted(keys))} "
                                   "(the flype class and the Montesinos classification disagree)")
        (key,) = keys
        if b in rows:
            for k, other in ((key, b), (b, key)):
                note = (f"the same type as {other}: Bonahon-Siebenmann key {b} (an alternating Montesinos "
                        "row kept its family key, over the flype budget)")
                r = rows[k]
                r["distinctness_note"] = note if not r.get("distinctness_note") else r["distinctness_note"] + "; " + note


# ---------------------------------------------------------------------- grouping
def group_rows(rows: list[dict]) -> dict[str, tuple[list[dict], list[dict]]]:
    """Rows by knot key: ``{key: (members, metas)}``.

    ``members`` are the stored rows ordered by (crossings, row_id), rows without a
    crossing count last; ``metas[i]`` is ``members[i]`` with its key fields (computed by
    :func:`pipeline.identify.classify.knot_key` when the row carries none).  Rows that
    get no key are left out.
    """
    from .classify import knot_key   # classify re-exports this module: import at call time
    groups: dict[str, list[tuple[dict, dict]]] = {}
    for r in map(_stored_row, rows):
        meta = r if r.get("knot_key") is not None else {**r, **knot_key(r)}
        if meta.get("knot_key") is not None:
            groups.setdefault(meta["knot_key"], []).append((r, meta))
    out = {}
    for key, pairs in groups.items():
        pairs.sort(key=lambda p: (p[0].get("crossings") if p[0].get("crossings") is not None else 10**12,
                                  p[0]["row_id"]))
        out[key] = ([p[0] for p in pairs], [p[1] for p in pairs])
    return out


def _proof(meta: dict) -> Optional[str]:
    return meta.get("proof") or meta.get("knot_proof")


def _stored_row(row: dict) -> dict:
    """A diagrams-table row read back from the store, with the knot_key fields that the
    worker put under ``extras['knot']`` and the determinant from ``determinant_text``."""
    out = dict(row)
    extras = row.get("extras")
    if isinstance(extras, str) and extras:
        try:
            knot = json.loads(extras).get("knot") or {}
        except (ValueError, AttributeError):
            knot = {}
        for k, v in knot.items():
            out.setdefault(k, v)
    if out.get("determinant") is None and out.get("determinant_text"):
        out["determinant"] = int(out["determinant_text"])
    if out.get("proof") is None and out.get("knot_proof") is not None:
        out["proof"] = out["knot_proof"]
    return out


# ---------------------------------------------------------------------- conflicts
def _comparable(row: dict) -> dict:
    out = {"components": row.get("components"),
           "determinant": None if row.get("determinant") is None else int(row["determinant"]),
           "invariant_factors": _factors(row.get("invariant_factors"))}
    if row.get("components") == 1:
        out.update(alexander=_poly(row.get("alexander")), jones=_poly(row.get("jones")),
                   signature=None if row.get("signature") is None else int(row["signature"]))
    return out


def check_invariants(key: str, members: list[dict]) -> None:
    """Raise :class:`KeyConflictError` when two members differ in a compared invariant
    (missing values are not compared)."""
    ref: dict[str, Any] = {}
    ref_row: dict[str, Any] = {}
    for r in members:
        for name, v in _comparable(r).items():
            if v is None:
                continue
            if name in ref and ref[name] != v:
                raise KeyConflictError(
                    f"knot key {key!r}: rows {ref_row[name]} and {r['row_id']} differ in {name} "
                    f"({_short(ref[name])} vs {_short(v)}); a normal form or an invariant is wrong")
            ref.setdefault(name, v)
            ref_row.setdefault(name, r["row_id"])


def amphichirality(key: str, metas: list[dict]) -> tuple[Optional[bool], str]:
    """The members' common amphichirality verdict and its reason (first decided member)."""
    decided = [m for m in metas if m.get("amphichiral") is not None]
    if len({m["amphichiral"] for m in decided}) > 1:
        raise KeyConflictError(f"knot key {key!r}: rows disagree on amphichirality")
    if not decided:
        return None, _UNKNOWN
    return decided[0]["amphichiral"], decided[0].get("amphichiral_reason")


def _short(v: Any) -> str:
    s = json.dumps(v)
    return s if len(s) <= 60 else s[:57] + "..."


# ---------------------------------------------------------------------- crossing numbers
def crossing_number(key: str, metas: list[dict], crossings: list[int]) -> tuple[Optional[int], Optional[str]]:
    """The certified crossing number of a key and its source, or (None, None).

    All certificates must name one value, at most the fewest crossings seen in a diagram
    of the key; of several sources the alternating-diagram one wins, then the first by name.
    """
    cns = {(m.get("crossing_number"), m.get("crossing_number_source")) for m in metas
           if m.get("crossing_number") is not None}
    values = {int(c) for c, _ in cns}
    if len(values) > 1:
        raise KeyConflictError(f"knot key {key!r}: certified crossing numbers disagree: {sorted(values)}")
    cn, src = min(cns, key=lambda t: (t[1] != CN_ALT, str(t[1]))) if cns else (None, None)
    if cn is not None and crossings and int(cn) > min(crossings):
        raise KeyConflictError(f"knot key {key!r}: certified crossing number {cn} exceeds the "
                               f"{min(crossings)} crossings of a diagram of it")
    return cn, src


# ---------------------------------------------------------------------- notes
def add_notes(out: list[dict]) -> None:
    """Fill ``fingerprint_shared_with`` and ``distinctness_note`` of every knots row,
    consuming the private ``_fps`` (fingerprints) and ``_dids`` (diagram ids) fields."""
    proofs = {r["knot_key"]: r["proof"] for r in out}
    keys_of_fp: dict[str, set] = {}
    keys_of_did: dict[str, set] = {}
    for row in out:
        for f in row["_fps"]:
            keys_of_fp.setdefault(f, set()).add(row["knot_key"])
        for d in row["_dids"]:
            keys_of_did.setdefault(d, set()).add(row["knot_key"])
    # strength (issue 12): keys sharing the older fingerprint data
    keys_of_base: dict[str, set] = {}
    examples = {r["knot_key"]: r.get("_example") for r in out}
    for row in out:
        for f in row.get("_base_fps", ()):
            keys_of_base.setdefault(f, set()).add(row["knot_key"])
    for row in out:
        shared = set().union(*(keys_of_fp[f] for f in row.pop("_fps"))) - {row["knot_key"]}
        row["fingerprint_shared_with"] = sorted(shared)
        row["distinctness_note"] = _distinctness_note(row, sorted(shared), proofs)
        same_diagram = sorted({k for d in row.pop("_dids") for k in keys_of_did[d]
                               if k != row["knot_key"] and proofs.get(k) == "normal form"})
        _separated_note(row, keys_of_base, examples, keys_of_fp)
        if row["proof"] != "normal form" and same_diagram:
            # an identical diagram (equal diagram_id, see pipeline.diagrams.canonical) is an isotopy
            row["distinctness_note"] = ("the same type as " + ", ".join(same_diagram) +
                                        ": an identical diagram (same diagram_id) has that key")


def _separated_note(row: dict, keys_of_base: dict, examples: dict, keys_of_fp: dict) -> None:
    """Append to the note which issue-12 invariant separates keys sharing the older data.

    Different values of an invariant are a proof that the types differ.  Consumes the
    private ``_base_fps`` and ``_example`` fields.
    """
    key = row["knot_key"]
    base = row.pop("_base_fps", set())
    mine = row.pop("_example", None)
    older = sorted(set().union(*(keys_of_base[f] for f in base)) - {key} - set(row["fingerprint_shared_with"])) \
        if base else []
    parts = []
    for other in older:
        names = separating_invariants(mine or {}, examples.get(other) or {})
        if names:
            parts.append(f"distinct from {other} by {' and '.join(names)} (same determinant, "
                         f"Alexander, Jones and signature)")
    if parts:
        note = "; ".join(parts)
        row["distinctness_note"] = note if not row["distinctness_note"] else row["distinctness_note"] + "; " + note


def _family_of_key(k: str) -> str:
    fam = k.split(":", 1)[0]
    return "two-bridge/torus" if fam in ("2b", "torus") else fam


def _small_montesinos(key: str) -> bool:
    """True for ``mont:`` keys of three tangles with denominators (2,2,n), (2,3,3), (2,3,4)
    or (2,3,5): the elliptic cases outside the hypotheses of some statements of the
    Bonahon–Siebenmann classification, where distinctness is not claimed."""
    if not key.startswith("mont:"):
        return False
    fracs = key.split(":", 2)[2].split(",")
    if len(fracs) != 3:
        return False
    dens = sorted(int(f.split("/")[1]) if "/" in f else 1 for f in fracs)
    return dens[0] == 2 and (dens[1] == 2 or (dens[1] == 3 and dens[2] in (3, 4, 5)))


def _distinctness_note(row: dict, shared: list[str], proofs: dict[str, str]) -> Optional[str]:
    """Why this key is (or is not known to be) different from keys with the same invariants."""
    if not shared:
        return None
    if row["proof"] != "normal form":
        return "possibly the same type as " + ", ".join(shared) + " (same invariants, no normal form)"
    fp_only = [k for k in shared if proofs.get(k) != "normal form"]
    small = _small_montesinos(row["knot_key"])
    same = [k for k in shared if k not in fp_only and _family_of_key(k) == _family_of_key(row["knot_key"])
            and not (small or _small_montesinos(k))]
    other = [k for k in shared if k not in fp_only and k not in same]
    parts = []
    if same:
        parts.append("distinct from " + ", ".join(same) + " by the classification theorem "
                     "(these invariants cannot separate them, e.g. mutants)")
    if other:
        parts.append("distinctness from " + ", ".join(other) + " not proven (same invariants, "
                     "normal forms of different families or a small Montesinos case; only the coincidences "
                     "of tests/SOURCES.md, families item 5 are known)")
    if fp_only:
        parts.append("possibly the same type as " + ", ".join(fp_only) + " (fingerprint-only rows)")
    return "; ".join(parts)
