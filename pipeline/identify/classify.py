"""Deduplication with proofs: knot keys, fingerprints, the knots table.

A census row gets a **knot key** naming its unoriented link type.

Key precedence
--------------
The first rule that applies *with a proof* gives the key; a rule that cannot decide
(no theorem applies, or a budget ran out) falls to the next one, never to a guess.
Rules (a) and (c) live in :mod:`pipeline.identify.flype_keys`.

(a) **split / composite diagrams**: the diagram is simplified
    (:func:`pipeline.diagrams.simplify.simplify`) and cut into split pieces and
    visible summands (:func:`pipeline.diagrams.primality.decompose`).  When there is
    more than one piece or summand and every summand is reduced alternating (prime,
    Menasco 1984) with a key by rule (c), the key is
    :func:`~pipeline.identify.normal_forms.connected_sum_nf` of the summands (knots
    only: unique prime decomposition, H. Schubert 1949) and
    :func:`~pipeline.identify.normal_forms.split_nf` of the pieces.  A diagram that
    simplifies to one crossingless loop is the unknot.
(b) **family normal forms**, from the notation or the family parameters: torus,
    Schubert two-bridge (``rational``, ``conway``), Bonahon–Siebenmann Montesinos and
    pretzel, a braid word of the torus form — see :mod:`pipeline.identify.normal_forms`.
(b′) **alternating Montesinos family rows** (``montesinos:`` / ``pretzel:`` with a
    ``mont:`` normal form whose tangles can be given one sign,
    :func:`~pipeline.identify.normal_forms.alternating_montesinos`): the key is the one
    rule (c) gives the reduced alternating Montesinos diagram of those tangles — the
    flype key (it is never two-bridge; the same two-bridge test as (c) runs) — so the
    family row and the same knot typed in as a braid, PD or DT code get one key.  The
    Bonahon–Siebenmann key is kept as ``bs_key`` (and ``bs_mirror_key``) and
    cross-checked: the amphichirality verdicts must agree here, and in the knots table
    same ``bs_key`` iff same knot key
    (:func:`pipeline.identify.knots_table.check_montesinos_keys`).  Over the flype budget
    the row keeps its ``mont:`` key (the reason says so; never a guess).  Montesinos
    links with tangles of both signs in every reduced Montesinos diagram are not
    alternating (Lickorish–Thistlethwaite 1988), so they keep the ``mont:`` key and no
    typed-in alternating diagram can be of their type.
(c) **reduced prime alternating diagrams** (after simplification), rows not keyed by
    (b): two-bridge links are recognised first by comparing flype codes with every
    rational candidate of equal determinant, crossing count and Jones polynomial
    (exhaustive, so a miss proves "not two-bridge") and get the Schubert key; the
    others get the flype key ``alt:<24 hex digits of sha256(flype code)>`` (flyping
    theorem, Menasco–Thistlethwaite, Annals of Math. 138, 1993), its mirror key from
    the mirror's flype code, a chirality verdict from the same theorem and the
    certified crossing number of the reduced alternating diagram.
(d) otherwise a **fingerprint** of the invariants (``proof = 'fingerprint only'``);
    ``key_reason`` says which budget or missing theorem sent the row here.

Every key from (a)–(c) has ``proof = 'normal form'``.  For rows carrying a diagram
the result also has ``simplified_crossings``, ``simplified_notation`` (None when not
smaller), ``prime`` / ``prime_reason`` and ``flype_code`` (the diagram's flype code
when it simplifies to a reduced prime alternating diagram, for the knots-table check
that no two normal-form keys share a flype class).

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
2. F. Bonahon, L. Siebenmann, "New geometric splittings of classical knots and the
   classification and symmetries of arborescent knots" (monograph, 1979–2010).
3. W. B. R. Lickorish, M. B. Thistlethwaite, "Some links with non-trivial polynomials
   and their crossing-numbers", Comment. Math. Helv. 63 (1988) *(memory)*.
"""

from __future__ import annotations

import json
import re
from fractions import Fraction
from typing import Optional, Sequence

from ..diagrams.canonical import canonical_text, diagram_id
from ..diagrams import simplify as _diagram_facts
from ..diagrams.diagram import Diagram
from ..diagrams.families.two_bridge import fraction_of
from ..diagrams.notation import parse, parse_notation, split_notation
from ..errors import BudgetExceeded, KnotLedgerError
from ..invariants.row import InvariantValues
from .fingerprint import fingerprint, jones_orientation_set, mirror_fingerprint
from .normal_forms import (CN_ALT, NormalForm, alternating_montesinos, montesinos_nf, pretzel_nf,
                           torus_nf, two_bridge_nf)
from . import flype_keys

__all__ = ["canonical_text", "diagram_id", "knot_key", "fingerprint", "build_knots_table",
           "mark_duplicates", "duplicate_of", "normal_form", "is_reduced", "jones_orientation_set", "KeyConflictError"]


# ---------------------------------------------------------------------- normal forms
#: notation kinds with a normal form (a braid word only in the torus form)
_NF_KINDS = ("torus", "rational", "conway", "pretzel", "montesinos", "braid")


def _parsed(row: dict) -> Optional[tuple[str, list]]:
    """(kind, parsed arguments) of a row's notation or family parameters, for the kinds
    with a normal form; None otherwise (also for a notation that does not parse)."""
    notation = row.get("notation")
    try:
        kind, args = split_notation(notation) if notation else _from_params(row)
        if kind not in _NF_KINDS:
            return None
        n = parse_notation(f"{kind}:{args}") if not notation else parse_notation(notation)
        return kind, list(n.args)
    except (ValueError, ZeroDivisionError, KnotLedgerError):
        return None


def normal_form(row: dict) -> Optional[NormalForm]:
    """The normal form of a row from its notation (or family parameters); None if none applies.

    The notation is read by :func:`pipeline.diagrams.notation.parse_notation` (the
    parser's numbers, no second reading of the string); a notation that does not parse
    has no normal form.
    """
    got = _parsed(row)
    if got is None:
        return None
    kind, vals = got
    try:
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


def _tangles(row: dict) -> Optional[list]:
    """The Montesinos tangle fractions of a ``montesinos`` / ``pretzel`` row (None = ∞)."""
    got = _parsed(row)
    if got is None or got[0] not in ("pretzel", "montesinos"):
        return None
    kind, vals = got
    return [None if p == 0 else Fraction(1, p) for p in vals] if kind == "pretzel" else vals


def _alternating_montesinos_key(nf: NormalForm, row: dict, st, budget: int, jones):
    """Rule (b′): an alternating Montesinos family row gets the flype key (module notes).

    Returns (normal form, reason, extra fields) or None when the row is not an
    alternating Montesinos link; over the flype budget the ``mont:`` key is kept and the
    reason says so.
    """
    tangles = _tangles(row)
    fr = None if tangles is None else alternating_montesinos(tangles)
    if fr is None:
        return None
    d = parse("montesinos:" + ",".join(f"{f.numerator}/{f.denominator}" for f in fr))
    codes = (st.flype_code, st.mirror_code) if st is not None and st.flype_code else None
    try:
        alt, code, mcode, reason = flype_keys.alternating_nf(d, budget=budget, jones=jones, codes=codes)
    except BudgetExceeded as err:
        return nf, (f"family normal form (Bonahon-Siebenmann); the flype key of this alternating "
                    f"Montesinos link is not computed: {err}"), {}
    if alt.amphichiral != nf.amphichiral:
        raise KeyConflictError(f"{row.get('notation')}: the flype class and Bonahon-Siebenmann disagree "
                               "on amphichirality (a normal form or the flype code is wrong)")
    reason += (f"; an alternating Montesinos link: the reduced alternating diagram {d.to_notation()} "
               f"(Bonahon-Siebenmann key {nf.key} kept as bs_key, a cross-check)")
    return alt, reason, {"bs_key": nf.key, "bs_mirror_key": nf.mirror_key, "flype_code": code}


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
def knot_key(row: dict, *, simplify_budget: Optional[int] = None,
             flype_budget: Optional[int] = None) -> dict:
    """Knot key of one diagram row, by the precedence of the module docstring.

    Parameters
    ----------
    row : dict
        ``notation`` (and/or ``family`` + ``params``), ``components``, the invariants
        (``determinant``, ``invariant_factors``, ``alexander``, ``jones``,
        ``signature``; Laurent, JSON list or JSON text; None if missing) and optionally
        ``diagram`` (a :class:`Diagram`: needed for rules (a) and (c), link
        fingerprints and crossing numbers).
    simplify_budget, flype_budget : int, optional
        Move budget of the simplification and orbit budget of the flype normal form
        (defaults :data:`pipeline.identify.flype_keys.SIMPLIFY_BUDGET`,
        :data:`~pipeline.identify.flype_keys.FLYPE_BUDGET`).

    Returns
    -------
    dict
        ``knot_key``, ``mirror_key``, ``proof`` (``normal form`` / ``fingerprint only``),
        ``key_rule``, ``key_reason``, ``amphichiral`` (True / False / None),
        ``amphichiral_reason``, ``crossing_number`` (certified or None),
        ``crossing_number_source``, ``fingerprint``; when a normal form decides,
        ``chirality`` / ``chirality_reason`` in the README.md vocabulary
        (``amphichiral (normal form)`` / ``chiral (normal form)``); with a diagram also
        ``simplified_crossings``, ``simplified_notation``, ``simplify_moves``,
        ``prime``, ``prime_reason``, ``summands`` and ``flype_code``.

    Examples
    --------
    >>> knot_key({"notation": "rational:3/1", "components": 1})["knot_key"]
    'torus:2,3'
    """
    nf = normal_form(row)
    comps = row.get("components")
    if nf is not None and comps is not None and int(comps) != nf.components:
        nf = None   # the normal form disagrees with the diagram: never key by it (a bug to report)
    d = row.get("diagram")
    st = None
    if isinstance(d, Diagram):
        st = flype_keys.structure(
            d, simplify_budget=flype_keys.SIMPLIFY_BUDGET if simplify_budget is None else simplify_budget,
            flype_budget=flype_keys.FLYPE_BUDGET if flype_budget is None else flype_budget,
            jones=InvariantValues.from_record(row).jones if d.n_components == 1 else None,
            key=nf is None)
    extra = _structure_fields(d, st)
    rule, reason = None, None
    if st is not None and st.nf is not None and (nf is None or st.rule != "alternating"):
        nf, rule, reason = st.nf, st.rule, st.key_reason          # rule (a), or (c) without (b)
    elif nf is not None:
        rule, reason = "family", "family normal form (pipeline.identify.normal_forms)"   # rule (b)
        if nf.key.startswith("mont:"):                            # rule (b′)
            jones = InvariantValues.from_record(row).jones if nf.components == 1 else None
            got = _alternating_montesinos_key(
                nf, row, st, flype_keys.FLYPE_BUDGET if flype_budget is None else flype_budget, jones)
            if got is not None:
                nf, reason, more = got
                rule = "alternating" if more else rule
                extra.update(more)
    alt_cn = _alternating_cn(row)
    if alt_cn is None and st is not None and st.simplified is not None:
        alt_cn = _diagram_facts.alternating_crossing_number(st.simplified)
    fp = fingerprint(row)
    if nf is not None:
        out = {"knot_key": nf.key, "mirror_key": nf.mirror_key, "proof": "normal form",
               "key_rule": rule, "key_reason": reason,
               "amphichiral": nf.amphichiral, "amphichiral_reason": nf.amphichiral_reason,
               "crossing_number": nf.crossing_number, "crossing_number_source": nf.crossing_number_source,
               "fingerprint": fp,
               "chirality": "amphichiral (normal form)" if nf.amphichiral else "chiral (normal form)",
               "chirality_reason": nf.amphichiral_reason}
        if out["crossing_number"] is None and alt_cn is not None:
            out["crossing_number"], out["crossing_number_source"] = alt_cn, CN_ALT
        return {**out, **extra}
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
    why = "; ".join(st.notes) if st is not None and st.notes else "no classification theorem applies"
    return {"knot_key": fp, "mirror_key": mfp, "proof": "fingerprint only", "key_rule": "fingerprint",
            "key_reason": f"fingerprint only: {why}", "amphichiral": amph,
            "amphichiral_reason": reason, "crossing_number": alt_cn,
            "crossing_number_source": CN_ALT if alt_cn is not None else None, "fingerprint": fp, **extra}


def _structure_fields(d, st) -> dict:
    """The simplification / primality / flype fields of a row with a diagram."""
    if st is None or st.simplified is None:
        return {}
    s = st.simplified
    return {"simplified_crossings": s.n_crossings,
            "simplified_notation": s.to_notation() if st.simplified_smaller else None,
            "simplify_moves": dict(st.simplify_moves),
            "prime": st.prime, "prime_reason": st.prime_reason,
            "summands": [{"piece": k, "crossings": sd.n_crossings, "knot_key": sn.key}
                         for k, sd, sn in st.summands],
            "flype_code": st.flype_code}


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


# ---------------------------------------------------------------------- the knots table
# grouping, conflicts, crossing-number arbitration and notes live in .knots_table;
# re-exported here for callers of pipeline.identify.classify.build_knots_table.
from .knots_table import KeyConflictError, build_knots_table  # noqa: E402,F401
