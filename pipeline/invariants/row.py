"""The typed census row: what :func:`~pipeline.invariants.all.compute_row` hands on.

Two frozen dataclasses replace the half-built dict that used to travel between
``compute_all``, the bounds, the chirality verdict and the consistency checks (where a
missing key silently dropped a check):

* :class:`InvariantValues` — the computed invariants the relations read (every field
  present; ``None`` means "not computed": skipped by a budget or failed);
* :class:`CensusRow` — the whole row of one diagram; :meth:`CensusRow.to_record` gives
  the dict the census writer stores (the same keys and values as always).

:meth:`InvariantValues.from_record` is the one adapter from a stored row (a dict read
back from Parquet: polynomials as JSON lists or JSON text, factors as strings).

Adding a field: give :class:`CensusRow` a new field with a default (``None``), fill it
in :func:`~pipeline.invariants.all.compute_row`; :meth:`CensusRow.to_record` then
carries it (the worker stores keys it has no column for under ``extras``).  An input of
the relations also goes into :class:`InvariantValues` and :meth:`CensusRow.values`.
"""

from __future__ import annotations

import json
from dataclasses import dataclass, field, fields
from typing import Any, Mapping, Optional

from .poly import Laurent

# ---- strength (issue 12): HOMFLY-PT, Khovanov, Tristram–Levine readers
from .homfly.hpoly import HPoly


def _json(v: Any) -> Any:
    if _missing(v):
        return None
    return json.loads(v) if isinstance(v, str) else v


def _hpoly(v: Any) -> Optional[HPoly]:
    v = _json(v)
    return v if v is None or isinstance(v, HPoly) else HPoly.from_json(v)


def _rank_dict(v: Any) -> Optional[dict]:
    """Khovanov ranks {(i, j): rank} from the [[i, j, rank]] list, JSON text or a dict."""
    v = _json(v)
    if v is None or isinstance(v, dict):
        return v
    return {(int(i), int(j)): int(r) for i, j, r in v}


def _torsion_dict(v: Any) -> Optional[dict]:
    """Torsion of integral Kh {(i, j): {m: multiplicity}} from [[i, j, m, mult]], JSON text
    or a dict."""
    v = _json(v)
    if v is None or isinstance(v, dict):
        return v
    out: dict = {}
    for i, j, m, c in v:
        out.setdefault((int(i), int(j)), {})[int(m)] = int(c)
    return out
# ---- end strength readers

__all__ = ["InvariantValues", "CensusRow"]


def _missing(v: Any) -> bool:
    """None, or a table library's missing marker (NaN, pandas' NA)."""
    return v is None or (isinstance(v, float) and v != v) or type(v).__name__ == "NAType"


def _laurent(v: Any) -> Optional[Laurent]:
    """A Laurent polynomial from a Laurent, a README.md JSON list or JSON text."""
    if _missing(v):
        return None
    if isinstance(v, Laurent):
        return v
    if isinstance(v, str):
        v = json.loads(v)
    return Laurent.from_json(v)


def _int_or_none(v: Any) -> Optional[int]:
    return None if _missing(v) else int(v)


def _factor_tuple(v: Any) -> Optional[tuple[int, ...]]:
    if _missing(v):
        return None
    if isinstance(v, str):
        v = json.loads(v)
    return tuple(int(x) for x in v)


@dataclass(frozen=True)
class InvariantValues:
    """The invariants the bounds, chirality and checks read; None = not computed.

    ``components`` None means "take the diagram's" (``diagram.n_components``).
    """

    components: Optional[int] = None
    determinant: Optional[int] = None
    invariant_factors: Optional[tuple[int, ...]] = None
    alexander: Optional[Laurent] = None
    conway: Optional[Laurent] = None
    jones: Optional[Laurent] = None
    signature: Optional[int] = None
    nullity: Optional[int] = None
    # ---- strength (issue 12)
    homfly: Optional[HPoly] = None
    khovanov: Optional[dict] = None          # {(i, j): rank over Q}
    khovanov_f2: Optional[dict] = None       # {(i, j): rank over F2}
    khovanov_reduced: Optional[dict] = None  # knots: reduced ranks over Q
    rasmussen_s: Optional[int] = None
    tristram_levine: Optional[dict] = None   # SignatureFunction.to_json()
    khovanov_torsion: Optional[dict] = None  # {(i, j): {m: multiplicity}} of integral Kh
    # ---- end strength

    @classmethod
    def from_record(cls, row: Mapping[str, Any]) -> "InvariantValues":
        """The typed values of a row dict (computed or read back from the store).

        Polynomials may be :class:`Laurent`, JSON lists or JSON text; invariant factors
        ints, strings of digits or JSON text; missing keys are None.  (The determinant
        is the ``determinant`` value as stored; a row whose determinant only fits
        ``determinant_text`` keeps None here, exactly as the fingerprints always read it.)
        """
        g = row.get
        return cls(components=_int_or_none(g("components")), determinant=_int_or_none(g("determinant")),
                   invariant_factors=_factor_tuple(g("invariant_factors")),
                   alexander=_laurent(g("alexander")), conway=_laurent(g("conway")),
                   jones=_laurent(g("jones")), signature=_int_or_none(g("signature")),
                   nullity=_int_or_none(g("nullity")),
                   # strength (issue 12)
                   homfly=_hpoly(g("homfly")), khovanov=_rank_dict(g("khovanov")),
                   khovanov_f2=_rank_dict(g("khovanov_f2")),
                   khovanov_reduced=_rank_dict(g("khovanov_reduced")),
                   rasmussen_s=_int_or_none(g("rasmussen_s")),
                   tristram_levine=_json(g("tristram_levine")),
                   khovanov_torsion=_torsion_dict(g("khovanov_torsion")))

    @classmethod
    def coerce(cls, values: "InvariantValues | Mapping[str, Any]") -> "InvariantValues":
        """``values`` itself, or :meth:`from_record` of a mapping."""
        return values if isinstance(values, InvariantValues) else cls.from_record(values)


@dataclass(frozen=True)
class CensusRow:
    """Every invariant of one diagram (see :func:`~pipeline.invariants.all.compute_all`
    for the meaning of each field).  Field order is the order of :meth:`to_record`."""

    crossings: int
    components: int
    free_loops: int
    writhe: int
    alternating: Optional[bool]
    determinant: Optional[int] = None
    invariant_factors: Optional[tuple[int, ...]] = None
    colorings: Optional[dict] = None
    colorable_moduli: Optional[tuple[int, ...]] = None
    witnesses: Optional[dict] = None
    min_colors: Optional[dict] = None
    alexander: Optional[Laurent] = None
    conway: Optional[Laurent] = None
    jones: Optional[Laurent] = None
    signature: Optional[int] = None
    nullity: Optional[int] = None
    # ---- strength (issue 12): JSON forms of schemas/README.md
    homfly: Optional[HPoly] = None
    khovanov: Optional[list] = None
    khovanov_f2: Optional[list] = None
    rasmussen_s: Optional[int] = None
    kh_width: Optional[int] = None
    khovanov_reduced: Optional[list] = None
    tristram_levine: Optional[dict] = None
    khovanov_torsion: Optional[list] = None
    # ---- end strength
    bounds: Optional[dict] = None
    chirality: str = "unknown"
    chirality_reason: str = "not computed"
    checks: dict = field(default_factory=dict)
    checks_failed: tuple[str, ...] = ()
    status: str = "ok"
    timings: dict = field(default_factory=dict)

    def values(self) -> InvariantValues:
        """The invariants as the relations read them."""
        return InvariantValues(components=self.components, determinant=self.determinant,
                               invariant_factors=self.invariant_factors, alexander=self.alexander,
                               conway=self.conway, jones=self.jones, signature=self.signature,
                               nullity=self.nullity,
                               # strength (issue 12)
                               homfly=self.homfly, khovanov=_rank_dict(self.khovanov),
                               khovanov_f2=_rank_dict(self.khovanov_f2),
                               khovanov_reduced=_rank_dict(self.khovanov_reduced),
                               rasmussen_s=self.rasmussen_s, tristram_levine=self.tristram_levine,
                               khovanov_torsion=_torsion_dict(self.khovanov_torsion))

    def to_record(self) -> dict[str, Any]:
        """The row as the dict the census writer stores (lists for sequences, copies of
        the dicts), keys in field order."""
        out: dict[str, Any] = {}
        for f in fields(self):
            v = getattr(self, f.name)
            if isinstance(v, tuple):
                v = list(v)
            elif isinstance(v, dict):
                v = dict(v)
            out[f.name] = v
        return out
