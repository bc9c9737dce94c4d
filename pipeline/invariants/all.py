"""One census row: every invariant of one diagram, each computed in isolation.

:func:`compute_all` is what ``knotledger show`` prints and what a census worker stores.
A budget overrun or a failure in one invariant never loses the others: the value is
``None`` and the reason is appended to ``status`` (``ok`` when nothing went wrong).
"""

from __future__ import annotations

import time
from typing import TYPE_CHECKING, Any, Callable, Optional

from ..diagrams.diagram import Diagram
from ..errors import BudgetExceeded
from ..numbers import primes_upto
from .row import CensusRow, InvariantValues

if TYPE_CHECKING:
    from ..diagrams.notation import Notation

__all__ = ["compute_all", "compute_row", "ALGORITHM_VERSIONS"]

#: Bumped whenever a change alters stored values; written into Parquet metadata.
ALGORITHM_VERSIONS = {
    "coloring": "1",
    "alexander": "1",
    "jones": "1",
    "signature": "1",
    "checks": "1",
    "chirality": "1",
    # --- begin: issue 11 (simplification, primality, flype normal form in the rows) ---
    "simplify": "1",
    "flype": "1",
    # --- end: issue 11 ---
}

DEFAULT_MIN_COLORS_BUDGET = 10_000


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
                min_colors_budget: Optional[int] = None, notation: Optional[str] = None) -> dict:
    """Every invariant of ``diagram`` as a dict (the census row before storage).

    The dict is :meth:`CensusRow.to_record` of :func:`compute_row` (same arguments).

    Keys: ``crossings``, ``components``, ``free_loops``, ``writhe``, ``alternating``,
    ``determinant``, ``invariant_factors``, ``colorings`` ({n: count}),
    ``colorable_moduli``, ``witnesses`` ({p: colours per arc}), ``min_colors``
    ({p: int or None}), ``alexander``, ``conway``, ``jones`` (Laurent or None),
    ``signature``, ``nullity``, ``bounds`` (dict), ``chirality``, ``chirality_reason``,
    ``checks`` ({name: bool}), ``checks_failed`` (list of names), ``status``,
    ``timings`` (seconds per invariant).
    """
    return compute_row(diagram, max_modulus=max_modulus, jones_budget=jones_budget,
                       min_colors_budget=min_colors_budget, notation=notation).to_record()


def compute_row(diagram: Diagram, *, max_modulus: int = 16, jones_budget: Optional[int] = None,
                min_colors_budget: Optional[int] = None,
                notation: "Optional[str | Notation]" = None) -> CensusRow:
    """Every invariant of ``diagram`` as a typed :class:`~pipeline.invariants.row.CensusRow`.

    ``notation``, when given, must be the string ``diagram`` was parsed from (or its
    :class:`~pipeline.diagrams.notation.Notation`); for the tangle families (``conway``,
    ``rational``, ``pretzel``, ``montesinos``) the Jones polynomial is then taken from
    the linear-time bracket of rational tangles
    (:mod:`pipeline.invariants.jones.tangle_bracket`), which the tests cross-check
    against the general frontier programme.
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
    values = InvariantValues(components=diagram.n_components, determinant=colour.get("determinant"),
                             invariant_factors=colour.get("invariant_factors"), alexander=alex,
                             conway=conway, jones=jones_poly, signature=sig, nullity=null)
    found_bounds = _attempt(problems, timings, "bounds", lambda: bounds.all_bounds(diagram, values))
    verdict = _attempt(problems, timings, "chirality",
                       lambda: chirality.chirality(diagram, jones=jones_poly, signature=sig))
    found_checks = _attempt(problems, timings, "checks", lambda: checks.run_checks(diagram, values)) or {}
    chir, reason = verdict or ("unknown", "not computed")
    return CensusRow(
        crossings=diagram.n_crossings, components=diagram.n_components,
        free_loops=diagram.free_loops, writhe=diagram.writhe,
        alternating=diagram.is_alternating() if diagram.n_crossings else None,
        **colour, alexander=alex, conway=conway, jones=jones_poly, signature=sig, nullity=null,
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

