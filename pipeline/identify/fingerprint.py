"""Fingerprints: knot keys from invariants, for rows without a normal form.

Knots: determinant, invariant factors, Alexander, Jones and signature (the Jones
polynomial and the signature distinguish a knot from its mirror; the mirror
fingerprint uses V(1/t) and −σ).  Links: only orientation-free data — determinant,
invariant factors, number of components, and, when the diagram is at hand, the *set*
of Jones polynomials over all orientations of the components, obtained from one of
them by Morton's reversal formula V(L') = t^{−3λ} V(L), λ = lk(K, L − K) for the
reversed sublink K [1].  A complete fingerprint has the prefix ``fp:``; a row missing
one of the invariants gets ``fp-partial:`` (it proves nothing against other rows).
The key is the first 24 hex digits of the sha256 of the canonical JSON of the data.

Knots also carry (issue 12) the HOMFLY-PT polynomial and the ranks of Khovanov homology
over Q and over F₂, all invariants of the unoriented knot; the mirror fingerprint uses
P(−v⁻¹, z) [2] and the ranks at (−i, −j) [3].  They are used for knots only: P and Kh
of a link depend on the orientations of its components, and no orientation set of them
is computed here, so link fingerprints keep the orientation-free data above.  A knot
whose HOMFLY-PT or Khovanov computation was skipped by a budget gets ``fp-partial:``.
:func:`base_fingerprint` is the fingerprint without these (what rows were keyed by
before); :func:`separating_invariants` names the new invariants on which two rows with
the same base fingerprint differ (the knots table's distinctness note).

2. P. Freyd et al., Bull. AMS 12 (1985).
3. M. Khovanov, Duke Math. J. 101 (2000); D. Bar-Natan, Algebr. Geom. Topol. 2 (2002).

References
----------
1. H. R. Morton, "The Jones polynomial for unoriented links", Quart. J. Math. Oxford
   37 (1986).
"""

from __future__ import annotations

import hashlib
import json
from typing import Any, Optional

from ..diagrams.diagram import Diagram
from ..invariants.linking import reversal_linkings
from ..invariants.poly import Laurent
from ..invariants.row import InvariantValues, _factor_tuple, _laurent

__all__ = ["fingerprint", "mirror_fingerprint", "jones_orientation_set", "MAX_ORIENTATION_COMPONENTS",
           "base_fingerprint", "separating_invariants", "STRENGTH_FINGERPRINT"]

#: The issue-12 invariants in knot fingerprints, in the order a note names them.
STRENGTH_FINGERPRINT = ("homfly", "khovanov", "khovanov_f2")

MAX_ORIENTATION_COMPONENTS = 10
def _poly(v: Any) -> Optional[list]:
    """A polynomial in README.md JSON form, from a Laurent, a JSON list or JSON text."""
    p = _laurent(v)
    return None if p is None else p.to_json()


def _factors(v: Any) -> Optional[list[int]]:
    f = _factor_tuple(v)
    return None if f is None else list(f)


def _invert(p: Optional[list]) -> Optional[list]:
    return None if p is None else Laurent.from_json(p).invert().to_json()


def jones_orientation_set(diagram: Diagram, jones: Laurent) -> Optional[list[list]]:
    """Jones polynomials of ``diagram`` over all orientations of its components (sorted JSON).

    Morton's formula: reversing the sublink K multiplies V by t^{−3 lk(K, L−K)}.
    None when the diagram has more than ``MAX_ORIENTATION_COMPONENTS`` components.
    """
    if len(diagram.components) > MAX_ORIENTATION_COMPONENTS:
        return None
    # reversing K or its complement gives the same λ: the sublinks of 1..c−1 suffice
    out = {json.dumps(jones.shift(-6 * lam).to_json()) for _, lam in reversal_linkings(diagram)}
    return sorted(json.loads(s) for s in out)


def _strength_data(values: InvariantValues, *, mirror: bool) -> dict[str, Any]:
    """HOMFLY-PT and Khovanov ranks of a knot as canonical JSON lists (None: not computed)."""
    P = values.homfly
    out: dict[str, Any] = {"homfly": None if P is None else (P.mirror() if mirror else P).to_json()}
    for name in ("khovanov", "khovanov_f2"):
        ranks = getattr(values, name)
        if ranks is not None and mirror:
            ranks = {(-i, -j): r for (i, j), r in ranks.items()}
        out[name] = None if ranks is None else [[i, j, r] for (i, j), r in sorted(ranks.items()) if r]
    return out


def _fingerprint_data(row: dict, *, mirror: bool = False, strength: bool = True) -> tuple[dict, bool]:
    """(data, complete) of the fingerprint (``strength``: with the issue-12 invariants)."""
    values = InvariantValues.from_record(row)      # the one reading of a (stored) row
    comps = values.components
    data: dict[str, Any] = {"components": comps, "determinant": values.determinant,
                            "invariant_factors": _factors(values.invariant_factors)}
    if comps == 1:
        jones = _poly(values.jones)
        sig = values.signature
        data["alexander"] = _poly(values.alexander)
        data["jones"] = _invert(jones) if mirror else jones
        data["signature"] = None if sig is None else (-sig if mirror else sig)
        if strength:
            data.update(_strength_data(values, mirror=mirror))
    else:
        js = row.get("jones_orientations")
        d, jones = row.get("diagram"), values.jones
        if js is None and isinstance(d, Diagram) and jones is not None:
            js = jones_orientation_set(d, jones)
        if js is not None and mirror:
            js = sorted(_invert(p) for p in js)
        data["jones_orientations"] = js
    return data, all(v is not None for v in data.values())


def _hash(data: dict, complete: bool) -> str:
    h = hashlib.sha256(json.dumps(data, sort_keys=True, separators=(",", ":")).encode()).hexdigest()
    return ("fp:" if complete else "fp-partial:") + h[:24]


def fingerprint(row: dict) -> str:
    """Fingerprint key of a row from its invariants (see the module docstring).

    Example: two diagrams of the figure-eight knot (conway:2 2 and its mirror) get the
    same fingerprint; the trefoil and its mirror get different ones.
    """
    return _hash(*_fingerprint_data(row))


def mirror_fingerprint(row: dict) -> str:
    """Fingerprint of the mirror image, from the row's invariants."""
    return _hash(*_fingerprint_data(row, mirror=True))


def base_fingerprint(row: dict) -> str:
    """The fingerprint without HOMFLY-PT and Khovanov ranks (the data used before them)."""
    return _hash(*_fingerprint_data(row, strength=False))


def separating_invariants(a: dict, b: dict) -> list[str]:
    """Names in :data:`STRENGTH_FINGERPRINT` computed on both knot rows and different.

    Different values of an invariant prove that the two rows are different knot types
    (or mirror images of different types, when compared with a mirror row).
    """
    va, vb = InvariantValues.from_record(a), InvariantValues.from_record(b)
    if va.components != 1 or vb.components != 1:
        return []
    da, db = _strength_data(va, mirror=False), _strength_data(vb, mirror=False)
    return [k for k in STRENGTH_FINGERPRINT if da[k] is not None and db[k] is not None and da[k] != db[k]]
