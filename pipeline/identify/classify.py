"""Deduplication with proofs: knot keys, fingerprints, the knots table.

A census row gets a **knot key** naming its unoriented link type:

* from a **normal form** when its notation (or family parameters) is a torus,
  two-bridge, conway, pretzel or Montesinos presentation, or a braid word of the
  torus form (σ1⋯σ_{p−1})^q — see :mod:`pipeline.identify.normal_forms` for the theorems; the
  key then comes with ``proof = 'normal form'``, its mirror's key and a chirality
  verdict from the same theorem;
* otherwise from a **fingerprint** of its invariants (``proof = 'fingerprint only'``).

Fingerprints (:mod:`pipeline.identify.fingerprint`)
------------------------------------------
Knots: determinant, invariant factors, Alexander, Jones, signature; links: only
orientation-free data (determinant, invariant factors, components, the set of Jones
polynomials over all orientations).  Rows whose complete fingerprints differ are
proven distinct.  Equal fingerprints prove nothing: mutants such as P(2,3,3,5) and
P(2,3,5,3) share every invariant here and are told apart only by Bonahon–Siebenmann.
A fingerprint key names a class of rows, possibly containing a knot and its mirror
when their invariants agree; its mirror key is the fingerprint of the mirrored
invariants, and amphichirality stays unknown unless an invariant proves chirality.

The knots table (:func:`build_knots_table`) refuses to merge rows whose
orientation-free invariants differ (for knots: any invariant); that would be a bug
in a normal form or an invariant, and it raises :class:`KeyConflictError`.

References
----------
1. L. Kauffman, K. Murasugi, M. Thistlethwaite, Topology 26 (1987): a connected
   reduced alternating diagram has the minimal crossing number.
"""

from __future__ import annotations

import json
import re
from fractions import Fraction
from typing import Any, Optional, Sequence

from ..diagrams.canonical import canonical_text, diagram_id
from ..diagrams import simplify as _diagram_facts
from ..diagrams.diagram import Diagram
from ..diagrams.notation import parse_notation, split_notation
from ..errors import KnotLedgerError
from ..invariants.row import InvariantValues
from .fingerprint import (_factors, _invert, _poly, fingerprint, jones_orientation_set,
                          mirror_fingerprint)
from .normal_forms import (CN_ALT, NormalForm, montesinos_nf, pretzel_nf, torus_nf, two_bridge_nf)

__all__ = ["canonical_text", "diagram_id", "knot_key", "fingerprint", "build_knots_table",
           "mark_duplicates", "duplicate_of", "normal_form", "is_reduced", "jones_orientation_set", "KeyConflictError"]

class KeyConflictError(KnotLedgerError):
    """Two rows under one knot key have different invariants (a bug somewhere)."""


# ---------------------------------------------------------------------- normal forms
#: notation kinds with a normal form (a braid word only in the torus form)
_NF_KINDS = ("torus", "rational", "conway", "pretzel", "montesinos", "braid")


def normal_form(row: dict) -> Optional[NormalForm]:
    """The normal form of a row from its notation (or family parameters); None if none applies.

    The notation is read by :func:`pipeline.diagrams.notation.parse_notation` (the
    parser's numbers, no second reading of the string); a notation that does not parse
    has no normal form.
    """
    from ..diagrams.families.two_bridge import fraction_of
    notation = row.get("notation")
    try:
        if notation:
            kind, args = split_notation(notation)
        else:
            kind, args = _from_params(row)
        if kind not in _NF_KINDS:
            return None
        n = parse_notation(f"{kind}:{args}") if not notation else parse_notation(notation)
        vals = list(n.args)
        if kind == "torus":
            return torus_nf(*vals)
        if kind == "rational":
            return two_bridge_nf(*vals)
        if kind == "conway":
            f = fraction_of(vals)
            return None if f is None else two_bridge_nf(f.numerator, f.denominator)
        if kind == "pretzel":
            return pretzel_nf(vals)
        if kind == "montesinos":
            return montesinos_nf(vals)
        return _torus_braid(vals)
    except (ValueError, ZeroDivisionError, KnotLedgerError):
        return None


def _from_params(row: dict) -> tuple[str, str]:
    params = row.get("params") or {}
    if isinstance(params, str):
        params = json.loads(params)
    fam = row.get("family")
    if fam == "torus":
        return "torus", f"{params['p']},{params['q']}"
    if fam == "two_bridge":
        return "rational", f"{params['alpha']}/{params['beta']}"
    if fam == "pretzel":
        k = len([n for n in params if re.fullmatch(r"p\d+", n)])
        return "pretzel", ",".join(str(params[f"p{i}"]) for i in range(1, k + 1))
    if fam == "montesinos":
        k = len([n for n in params if re.fullmatch(r"t\d+", n)])
        return "montesinos", ",".join(str(params[f"t{i}"]) for i in range(1, k + 1))
    return "", ""


def _torus_braid(word: list[int]) -> Optional[NormalForm]:
    """(σ1⋯σ_{p−1})^q with one sign is T(p, ±q) (README.md, torus notation)."""
    if not word:
        return None
    n1 = max(abs(g) for g in word)
    s = 1 if word[0] > 0 else -1
    block = [s * i for i in range(1, n1 + 1)]
    if len(word) % n1 or word != block * (len(word) // n1):
        return None
    return torus_nf(n1 + 1, s * len(word) // n1)


# ---------------------------------------------------------------------- crossing numbers
def is_reduced(diagram: Diagram) -> bool:
    """True when no crossing is nugatory: the four corners of every crossing lie in
    four different faces (:func:`pipeline.diagrams.simplify.is_reduced`)."""
    return _diagram_facts.is_reduced(diagram)


def _alternating_cn(row: dict) -> Optional[int]:
    """Crossing count of a connected reduced alternating diagram, else None."""
    d = row.get("diagram")
    alt, red, connected = row.get("alternating"), row.get("reduced"), row.get("connected")
    if isinstance(d, Diagram):
        if alt is None and red is None and connected is None:
            cn = _diagram_facts.alternating_crossing_number(d)
            return None if cn is None else int(row.get("crossings") or cn)
        if d.n_crossings == 0:
            return None
        alt = d.is_alternating() if alt is None else alt
        red = _diagram_facts.is_reduced(d) if red is None else red
        connected = _diagram_facts.is_connected(d) if connected is None else connected
    if alt and red and connected:
        if row.get("crossings") is not None:
            return int(row["crossings"])
        return d.n_crossings if isinstance(d, Diagram) else None
    return None


# ---------------------------------------------------------------------- keys
def knot_key(row: dict) -> dict:
    """Knot key of one diagram row.

    Parameters
    ----------
    row : dict
        ``notation`` (and/or ``family`` + ``params``), ``components``, the invariants
        (``determinant``, ``invariant_factors``, ``alexander``, ``jones``,
        ``signature``; Laurent, JSON list or JSON text; None if missing) and optionally
        ``diagram`` (a :class:`Diagram`, for link fingerprints and crossing numbers).

    Returns
    -------
    dict
        ``knot_key``, ``mirror_key``, ``proof`` (``normal form`` / ``fingerprint only``),
        ``amphichiral`` (True / False / None), ``amphichiral_reason``, ``crossing_number``
        (certified or None), ``crossing_number_source``, ``fingerprint``; and, when a
        normal form decides, ``chirality`` / ``chirality_reason`` in the README.md
        vocabulary (``amphichiral (normal form)`` / ``chiral (normal form)``).

    Examples
    --------
    >>> knot_key({"notation": "rational:3/1", "components": 1})["knot_key"]
    'torus:2,3'
    """
    nf = normal_form(row)
    comps = row.get("components")
    if nf is not None and comps is not None and int(comps) != nf.components:
        nf = None   # the normal form disagrees with the diagram: never key by it (a bug to report)
    alt_cn = _alternating_cn(row)
    fp = fingerprint(row)
    if nf is not None:
        out = {"knot_key": nf.key, "mirror_key": nf.mirror_key, "proof": "normal form",
               "amphichiral": nf.amphichiral, "amphichiral_reason": nf.amphichiral_reason,
               "crossing_number": nf.crossing_number, "crossing_number_source": nf.crossing_number_source,
               "fingerprint": fp,
               "chirality": "amphichiral (normal form)" if nf.amphichiral else "chiral (normal form)",
               "chirality_reason": nf.amphichiral_reason}
        if out["crossing_number"] is None and alt_cn is not None:
            out["crossing_number"], out["crossing_number_source"] = alt_cn, CN_ALT
        return out
    mfp = mirror_fingerprint(row)
    amph, reason = None, "unknown: invariants do not decide"
    values = InvariantValues.from_record(row)
    if values.components == 1:
        j = values.jones
        if j is not None and j != j.invert():
            amph, reason = False, "chiral (jones): V(t) != V(1/t)"
        elif values.signature not in (None, 0):
            amph, reason = False, "chiral (signature): signature != 0"
    elif fp.startswith("fp:") and mfp != fp:
        amph, reason = False, "chiral (jones): the sets of Jones polynomials over orientations differ"
    return {"knot_key": fp, "mirror_key": mfp, "proof": "fingerprint only", "amphichiral": amph,
            "amphichiral_reason": reason, "crossing_number": alt_cn,
            "crossing_number_source": CN_ALT if alt_cn is not None else None, "fingerprint": fp}


# ---------------------------------------------------------------------- tables
def duplicate_of(row_ids: Sequence[int], diagram_ids: Sequence[Optional[str]]) -> list[Optional[int]]:
    """The ``duplicate_of`` column: for each row, the smallest row_id with the same
    ``diagram_id`` when that is smaller than its own, else None (also for no diagram_id).

    The one Python implementation, used for lists of rows (:func:`mark_duplicates`) and
    for census frames read back (:mod:`pipeline.census.reader`); the SQL views of
    :mod:`pipeline.explore.query` compute the same column in SQL.

    Examples
    --------
    >>> duplicate_of([1, 2, 3], ["x", "y", "x"])
    [None, None, 1]
    """
    first: dict = {}
    get = first.get
    for r, d in zip(row_ids, diagram_ids):
        f = get(d)
        if f is None or r < f:
            first[d] = r                    # (a None key is collected too, and never read)
    return [None if d is None or (f := first[d]) >= r else f for r, d in zip(row_ids, diagram_ids)]


def mark_duplicates(rows: list[dict]) -> list[Optional[int]]:
    """For each row, the row_id of the first row (smallest row_id) with the same
    ``diagram_id``, or None if it is that first row (or has no diagram_id)."""
    return duplicate_of([r["row_id"] for r in rows], [r.get("diagram_id") for r in rows])


_ALWAYS = ("components", "determinant", "invariant_factors")
_KNOT_ONLY = ("alexander", "jones", "signature")


def _comparable(row: dict) -> dict:
    out = {"components": row.get("components"),
           "determinant": None if row.get("determinant") is None else int(row["determinant"]),
           "invariant_factors": _factors(row.get("invariant_factors"))}
    if row.get("components") == 1:
        out.update(alexander=_poly(row.get("alexander")), jones=_poly(row.get("jones")),
                   signature=None if row.get("signature") is None else int(row["signature"]))
    return out


def build_knots_table(rows: list[dict]) -> list[dict]:
    """One row per knot key (see README.md ``knots``) from diagram rows carrying keys.

    Each input row needs ``row_id``, ``notation``, ``crossings``, ``components``, the
    invariants, and the :func:`knot_key` fields (``proof`` may be named ``knot_proof``);
    rows without ``knot_key`` are keyed here.  Rows whose status is not ``ok`` are
    still counted if they have a key.

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
    """
    groups: dict[str, list[dict]] = {}
    info: dict[int, dict] = {}
    rows = [_stored_row(r) for r in rows]
    for r in rows:
        k = r.get("knot_key")
        meta = r if k is not None else {**r, **knot_key(r)}
        if meta.get("knot_key") is None:
            continue
        info[id(r)] = meta
        groups.setdefault(meta["knot_key"], []).append(r)
    out = []
    fp_of_key: dict[str, set] = {}
    for key in sorted(groups):
        members = sorted(groups[key], key=lambda r: (r.get("crossings") if r.get("crossings") is not None else 10**12, r["row_id"]))
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
        metas = [info[id(r)] for r in members]
        proof = "normal form" if any((m.get("proof") or m.get("knot_proof")) == "normal form" for m in metas) else "fingerprint only"
        cns = {(m.get("crossing_number"), m.get("crossing_number_source")) for m in metas if m.get("crossing_number") is not None}
        values = {int(c) for c, _ in cns}
        if len(values) > 1:
            raise KeyConflictError(f"knot key {key!r}: certified crossing numbers disagree: {sorted(values)}")
        cn, src = (min(cns, key=lambda t: (t[1] != CN_ALT, str(t[1]))) if cns else (None, None))
        amph = [m.get("amphichiral") for m in metas if m.get("amphichiral") is not None]
        if len(set(amph)) > 1:
            raise KeyConflictError(f"knot key {key!r}: rows disagree on amphichirality")
        reasons = [m.get("amphichiral_reason") for m in metas if m.get("amphichiral") is not None]
        crossings = [r.get("crossings") for r in members if r.get("crossings") is not None]
        if cn is not None and crossings and int(cn) > min(crossings):
            raise KeyConflictError(f"knot key {key!r}: certified crossing number {cn} exceeds the "
                                   f"{min(crossings)} crossings of a diagram of it")
        did = {r.get("diagram_id") for r in members if r.get("diagram_id")}
        fps = {m.get("fingerprint") for m in metas if m.get("fingerprint")}
        for f in fps:
            fp_of_key.setdefault(f, set()).add(key)
        out.append({
            "knot_key": key,
            "representative": members[0].get("notation"),
            "n_diagrams": len(members),
            "n_distinct_diagrams": len(did) if did else None,
            "proof": proof,
            "mirror_key": metas[0].get("mirror_key"),
            "amphichiral": amph[0] if amph else None,
            "amphichiral_reason": reasons[0] if reasons else "unknown: invariants do not decide",
            "min_crossings_seen": min(crossings) if crossings else None,
            "crossing_number": cn,
            "crossing_number_source": src,
            "_fps": fps,
            "_dids": did,
        })
    proofs = {r["knot_key"]: r["proof"] for r in out}
    keys_of_did: dict[str, set] = {}
    for row in out:
        for d in row["_dids"]:
            keys_of_did.setdefault(d, set()).add(row["knot_key"])
    for row in out:
        shared = set()
        for f in row.pop("_fps"):
            shared |= fp_of_key.get(f, set())
        shared.discard(row["knot_key"])
        row["fingerprint_shared_with"] = sorted(shared)
        row["distinctness_note"] = _distinctness_note(row, sorted(shared), proofs)
        same_diagram = sorted({k for d in row.pop("_dids") for k in keys_of_did[d]
                               if k != row["knot_key"] and proofs.get(k) == "normal form"})
        if row["proof"] != "normal form" and same_diagram:
            # an identical diagram (equal diagram_id, see pipeline.diagrams.canonical) is an isotopy
            row["distinctness_note"] = ("the same type as " + ", ".join(same_diagram) +
                                        ": an identical diagram (same diagram_id) has that key")
    return out


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


def _short(v: Any) -> str:
    s = json.dumps(v)
    return s if len(s) <= 60 else s[:57] + "..."
