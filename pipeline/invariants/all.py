"""One census row: every invariant of one diagram, each computed in isolation.

:func:`compute_all` is what ``knotledger show`` prints and what a census worker stores.
A budget overrun or a failure in one invariant never loses the others: the value is
``None`` and the reason is appended to ``status`` (``ok`` when nothing went wrong).
"""

from __future__ import annotations

import time
from dataclasses import replace
from typing import TYPE_CHECKING, Any, Callable, Optional

from ..diagrams.diagram import Diagram
from ..errors import BudgetExceeded
from ..numbers import primes_upto
from .row import CensusRow, InvariantValues

if TYPE_CHECKING:
    from ..diagrams.notation import Notation

__all__ = ["compute_all", "compute_row", "ALGORITHM_VERSIONS", "DEFAULT_HOMFLY_BUDGET",
           "DEFAULT_KHOVANOV_BUDGET"]

#: Bumped whenever a change alters stored values; written into Parquet metadata.
ALGORITHM_VERSIONS = {
    "coloring": "1",
    "alexander": "1",
    "jones": "1",
    "signature": "1",
    "checks": "2",  # strength: HOMFLY-PT / Khovanov / s / σ_ω relations
    "chirality": "2",  # strength: chiral (homfly), chiral (khovanov)
    # --- begin: issue 11 (simplification, primality, flype normal form in the rows) ---
    "simplify": "1",
    "flype": "2",  # 2: compositional ft: code (flype_tree) instead of the orbit pd: text
    # --- end: issue 11 ---
    # ---- strength (issue 12)
    "homfly": "1",
    "khovanov": "2",  # 2: one run over Z (torsion; F₂ by universal coefficients above 12 crossings)
    "tristram_levine": "1",
    # ---- end strength
}

DEFAULT_MIN_COLORS_BUDGET = 10_000
# ---- strength (issue 12): default per-diagram budgets (census/spec.py documents them)
#: Diagrams expanded by the HOMFLY-PT skein route (also the bound on n!·length of the
#: braid route).
DEFAULT_HOMFLY_BUDGET = 20_000
#: Largest number of objects of the Khovanov tangle complex after any crossing.
DEFAULT_KHOVANOV_BUDGET = 20_000
# ---- end strength


def _attempt(problems: list[str], timings: dict, name: str, fn: Callable[[], Any]) -> Any:
    t0 = time.perf_counter()
    try:
        return fn()
    except BudgetExceeded as err:
        problems.append(str(err))
    except Exception as err:  # one invariant failing must not lose the row
        problems.append(f"error in {name}: {type(err).__name__}: {str(err).splitlines()[0] if str(err) else ''}".rstrip(": "))
    finally:
        timings[name] = time.perf_counter() - t0
    return None


def compute_all(diagram: Diagram, *, max_modulus: int = 16, jones_budget: Optional[int] = None,
                min_colors_budget: Optional[int] = None, notation: Optional[str] = None,
                homfly_budget: Optional[int] = DEFAULT_HOMFLY_BUDGET,
                khovanov_budget: Optional[int] = DEFAULT_KHOVANOV_BUDGET) -> dict:
    """Every invariant of ``diagram`` as a dict (the census row before storage).

    The dict is :meth:`CensusRow.to_record` of :func:`compute_row` (same arguments).

    Keys: ``crossings``, ``components``, ``free_loops``, ``writhe``, ``alternating``,
    ``determinant``, ``invariant_factors``, ``colorings`` ({n: count}),
    ``colorable_moduli``, ``witnesses`` ({p: colours per arc}), ``min_colors``
    ({p: int or None}), ``alexander``, ``conway``, ``jones`` (Laurent or None),
    ``signature``, ``nullity``, ``bounds`` (dict), ``chirality``, ``chirality_reason``,
    ``checks`` ({name: bool}), ``checks_failed`` (list of names), ``status``,
    ``timings`` (seconds per invariant); and (issue 12) ``homfly`` (HPoly or None),
    ``khovanov``, ``khovanov_f2``, ``khovanov_reduced`` ([[i, j, rank]] or None),
    ``rasmussen_s``, ``kh_width`` (int or None), ``tristram_levine`` (dict or None),
    ``khovanov_torsion`` ([[i, j, m, multiplicity]] or None).
    """
    return compute_row(diagram, max_modulus=max_modulus, jones_budget=jones_budget,
                       min_colors_budget=min_colors_budget, notation=notation,
                       homfly_budget=homfly_budget, khovanov_budget=khovanov_budget).to_record()


def compute_row(diagram: Diagram, *, max_modulus: int = 16, jones_budget: Optional[int] = None,
                min_colors_budget: Optional[int] = None,
                notation: "Optional[str | Notation]" = None,
                homfly_budget: Optional[int] = DEFAULT_HOMFLY_BUDGET,
                khovanov_budget: Optional[int] = DEFAULT_KHOVANOV_BUDGET) -> CensusRow:
    """Every invariant of ``diagram`` as a typed :class:`~pipeline.invariants.row.CensusRow`.

    ``notation``, when given, must be the string ``diagram`` was parsed from (or its
    :class:`~pipeline.diagrams.notation.Notation`); for the tangle families (``conway``,
    ``rational``, ``pretzel``, ``montesinos``) the Jones polynomial is then taken from
    the linear-time bracket of rational tangles
    (:mod:`pipeline.invariants.jones.tangle_bracket`), which the tests cross-check
    against the general frontier programme.

    ``homfly_budget`` bounds the HOMFLY-PT skein route (and n!·length on the braid
    route), ``khovanov_budget`` the Khovanov complexes (every run: Z — or Q and F₂ when
    the run over Z is over budget —, F₂ again for diagrams of at most 12 crossings, and
    Q[h] for the s of a thick knot; :mod:`pipeline.invariants.khovanov.data`); None means
    no limit, 0 skips the invariant.  Over budget the value is None and ``status`` says
    ``skipped: homfly budget N`` / ``skipped: khovanov budget N`` (``skipped: khovanov
    budget N (integral)`` when only the torsion is missing); the checks needing it are
    omitted.
    """
    from . import bounds, checks, chirality, signature
    from .alexander import fox as alexander
    from .coloring import spectrum as coloring
    from .jones import frontier as jones

    problems: list[str] = []
    timings: dict[str, float] = {}
    budget = DEFAULT_MIN_COLORS_BUDGET if min_colors_budget is None else min_colors_budget

    def colouring_part():
        factors = coloring.invariant_factors(diagram)
        det = coloring.determinant(diagram)
        counts = coloring.coloring_counts(diagram, max_modulus=max_modulus)
        witnesses, fewest = {}, {}
        for p in primes_upto(max_modulus):
            if det % p == 0:
                w = coloring.witness_coloring(diagram, p)
                if w is not None:
                    witnesses[p] = list(w)
                    fewest[p] = coloring.min_colors(diagram, p, budget=budget)
                    if fewest[p] is None:
                        problems.append(f"skipped: min_colors budget {budget} (p={p})")
        return {
            "determinant": det,
            "invariant_factors": tuple(factors),
            "colorings": counts,
            "colorable_moduli": tuple(n for n, c in counts.items() if c > n),
            "witnesses": witnesses,
            "min_colors": fewest,
        }

    colour = _attempt(problems, timings, "coloring", colouring_part) or {}
    alex = _attempt(problems, timings, "alexander", lambda: alexander.alexander_polynomial(diagram))
    conway = _attempt(problems, timings, "conway", lambda: alexander.conway_polynomial(diagram))
    jones_poly = _attempt(problems, timings, "jones", lambda: _jones(jones, diagram, notation, jones_budget))
    sig = _attempt(problems, timings, "signature", lambda: signature.signature(diagram))
    null = _attempt(problems, timings, "nullity", lambda: signature.nullity(diagram))
    # ---- strength (issue 12): HOMFLY-PT, Khovanov homology, Tristram–Levine
    strong = _strength(diagram, notation, homfly_budget, khovanov_budget, problems, timings)
    # ---- end strength
    values = InvariantValues(components=diagram.n_components, determinant=colour.get("determinant"),
                             invariant_factors=colour.get("invariant_factors"), alexander=alex,
                             conway=conway, jones=jones_poly, signature=sig, nullity=null)
    values = replace(values, **_strength_values(strong))  # strength (issue 12)
    found_bounds = _attempt(problems, timings, "bounds", lambda: bounds.all_bounds(diagram, values))
    if found_bounds is not None and strong.get("rasmussen_s") is not None:
        # Rasmussen 2010: g₄ ≥ |s|/2 (a theorem; beside the signature's Murasugi bound)
        found_bounds["four_genus_lower_bound_s"] = abs(strong["rasmussen_s"]) // 2
    verdict = _attempt(problems, timings, "chirality",
                       lambda: chirality.chirality(diagram, jones=jones_poly, signature=sig,
                                                   homfly=strong.get("homfly"),
                                                   khovanov=values.khovanov,
                                                   rasmussen_s=strong.get("rasmussen_s")))
    found_checks = _attempt(problems, timings, "checks", lambda: checks.run_checks(diagram, values)) or {}
    chir, reason = verdict or ("unknown", "not computed")
    return CensusRow(
        crossings=diagram.n_crossings, components=diagram.n_components,
        free_loops=diagram.free_loops, writhe=diagram.writhe,
        alternating=diagram.is_alternating() if diagram.n_crossings else None,
        **colour, alexander=alex, conway=conway, jones=jones_poly, signature=sig, nullity=null,
        **strong,
        bounds=found_bounds, chirality=chir, chirality_reason=reason, checks=found_checks,
        checks_failed=tuple(sorted(k for k, ok in found_checks.items() if not ok)),
        status="; ".join(problems) if problems else "ok", timings=timings)


def _jones(jones, diagram: Diagram, notation: Optional[str], budget: Optional[int]):
    """Jones by the tangle route when the notation allows it, else the frontier programme."""
    if notation is not None and budget != 0:
        from .jones.tangle_bracket import bracket_of_notation
        bracket = bracket_of_notation(notation)
        if bracket is not None:
            return jones.jones_from_bracket(bracket, diagram.writhe)
    return jones.jones_polynomial(diagram, budget=budget)



# ---- strength (issue 12): HOMFLY-PT, Khovanov homology, Tristram–Levine signature function
def _strength(diagram: Diagram, notation, homfly_budget: Optional[int], khovanov_budget: Optional[int],
              problems: list[str], timings: dict) -> dict:
    """The issue-12 fields of the row (None where skipped or not computed)."""
    from .homfly import homfly_polynomial
    from .khovanov import khovanov_data
    from .tristram_levine import signature_function

    out: dict = dict.fromkeys(("homfly", "khovanov", "khovanov_f2", "rasmussen_s", "kh_width",
                               "khovanov_reduced", "tristram_levine", "khovanov_torsion"))
    out["homfly"] = _attempt(problems, timings, "homfly", lambda: homfly_polynomial(
        diagram, notation=notation, budget=homfly_budget, braid_budget=homfly_budget))
    kh = _attempt(problems, timings, "khovanov", lambda: khovanov_data(diagram, budget=khovanov_budget))
    if kh is not None:
        out.update(khovanov=kh.khovanov, khovanov_f2=kh.khovanov_f2, rasmussen_s=kh.rasmussen_s,
                   kh_width=kh.kh_width, khovanov_reduced=kh.khovanov_reduced,
                   khovanov_torsion=kh.khovanov_torsion)
        problems.extend(kh.skipped)  # e.g. the run over Z over budget: torsion not computed
    tl = _attempt(problems, timings, "tristram_levine",
                  lambda: signature_function(diagram, notation=notation))
    out["tristram_levine"] = None if tl is None else tl.to_json()
    return out


def _strength_values(strong: dict) -> dict:
    """The :class:`InvariantValues` fields of :func:`_strength`'s output."""
    from .row import _rank_dict, _torsion_dict
    return {"homfly": strong["homfly"], "khovanov": _rank_dict(strong["khovanov"]),
            "khovanov_f2": _rank_dict(strong["khovanov_f2"]),
            "khovanov_reduced": _rank_dict(strong["khovanov_reduced"]),
            "rasmussen_s": strong["rasmussen_s"], "tristram_levine": strong["tristram_levine"],
            "khovanov_torsion": _torsion_dict(strong["khovanov_torsion"])}
# ---- end strength
