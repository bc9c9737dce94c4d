"""The census columns of Khovanov homology from as few runs as possible.

One run of Bar-Natan's local algorithm over Z (:mod:`.integral`) in Khovanov's theory
(h = 0) gives the integral homology, hence Kh over Q (the free ranks) and over F₂
(universal coefficients, A. Hatcher, *Algebraic Topology*, CUP 2002, Thm. 3.2), and, cut
open at the last crossing, reduced Kh over Q.  Rasmussen's s of a thin knot is read off
Kh over Q (:func:`.homology.thin_s`); only a thick knot gets the run over Q[h].
Measured in ``reports/bench_khovanov.md``: the run over Z costs less than the two runs
over Q and F₂ it replaces.

When the run over Z grows past the budget (it eliminates only ±1 isomorphisms, so its
complexes can be larger), the ranks come from separate runs over Q and F₂ under the
same budget, the torsion column is None and the reason is recorded
(``KhovanovData.skipped``).  With ``independent_f2`` (by default on diagrams of at most
:data:`INDEPENDENT_F2_CROSSINGS` crossings) the F₂ ranks come from their own run, so that
the universal coefficient relation between the integral and the F₂ results is a check
(``khovanov_uct`` in :mod:`pipeline.invariants.strength_checks`), not a construction.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Optional

import flint

from ...diagrams.diagram import Diagram
from ...errors import BudgetExceeded
from .homology import _check_budget, _ranks, _s_from_complex, kh_width, ranks_to_json, thin_s
from .integral import add_free_loops, integral_from_complex, torsion_to_json, uct_ranks
from .tangle import close_cut, reduced_complex

__all__ = ["KhovanovData", "khovanov_data", "INDEPENDENT_F2_CROSSINGS"]

#: Diagrams with at most this many crossings get their own run over F₂ by default
#: (cheap there), so the census checks universal coefficients on them.
INDEPENDENT_F2_CROSSINGS = 12


@dataclass(frozen=True)
class KhovanovData:
    """Everything one computation gives: the census columns of Khovanov homology.

    Attributes
    ----------
    khovanov : list of [i, j, rank]
        Ranks over Q, sorted, nonzero only (JSON column ``khovanov``).
    khovanov_f2 : list of [i, j, rank]
        Ranks over F₂ (JSON column ``khovanov_f2``).
    rasmussen_s : int or None
        Rasmussen's s over Q for a knot, None for a link.
    kh_width : int
        Number of diagonals ``j − 2i`` on which Kh over Q is supported.
    khovanov_reduced : list of [i, j, rank] or None
        Reduced Khovanov homology over Q for a knot (unknot: [[0, 0, 1]]), None for a link.
    khovanov_torsion : list of [i, j, m, multiplicity] or None
        Torsion of integral Kh, summands ``(Z/m)^multiplicity`` (m > 1 the invariant
        factors), sorted; ``[]`` torsion-free, None when the run over Z was over budget.
    f2_independent : bool
        True when ``khovanov_f2`` comes from its own run over F₂ (not from universal
        coefficients).
    skipped : tuple of str
        Reasons for the parts not computed (``skipped: khovanov budget N (integral)``).
    """

    khovanov: list
    khovanov_f2: list
    rasmussen_s: Optional[int]
    kh_width: int
    khovanov_reduced: Optional[list] = None
    khovanov_torsion: Optional[list] = None
    f2_independent: bool = False
    skipped: tuple = ()


def _f2_run(diagram: Diagram, budget: Optional[int]) -> dict:
    return _ranks(reduced_complex(diagram, 1, modulus=2, budget=budget, h0=True), diagram.free_loops)


def khovanov_data(diagram: Diagram, *, budget: Optional[int] = None,
                  independent_f2: Optional[bool] = None) -> KhovanovData:
    """Kh over Q, F₂ and Z, s and reduced Kh over Q (knots), width (module docstring).

    ``independent_f2`` None means: a run of its own over F₂ for diagrams of at most
    :data:`INDEPENDENT_F2_CROSSINGS` crossings, universal coefficients above.

    Raises
    ------
    BudgetExceeded
        ``skipped: khovanov budget N`` when the ranks over Q cannot be had within
        ``budget`` (the run over Z and the fallback run over Q both grew past it).
    """
    _check_budget(budget)
    if independent_f2 is None:
        independent_f2 = diagram.n_crossings <= INDEPENDENT_F2_CROSSINGS
    knot = diagram.n_components == 1
    skipped: tuple = ()
    try:
        cx = reduced_complex(diagram, 1, budget=budget, keep_cut=True, h0=True, modulus=0)
    except BudgetExceeded as err:
        skipped = (f"{err} (integral)",)
        cx = None
    reduced = [[0, 0, 1]] if knot else None
    torsion = None
    if cx is not None:
        if diagram.n_crossings:
            if knot:
                reduced = ranks_to_json(integral_from_complex(cx, arcs=True).free)
            cx = close_cut(cx)
        kh = add_free_loops(integral_from_complex(cx), diagram.free_loops)
        q_ranks = kh.free
        torsion = torsion_to_json(kh.torsion)
        f2 = _f2_run(diagram, budget) if independent_f2 else uct_ranks(kh.free, kh.torsion, 2)
    else:
        cx = reduced_complex(diagram, flint.fmpq(1), budget=budget, keep_cut=True, h0=True)
        if diagram.n_crossings:
            if knot:
                reduced = ranks_to_json(_ranks(cx, 0))
            cx = close_cut(cx)
        q_ranks = _ranks(cx, diagram.free_loops)
        f2 = _f2_run(diagram, budget)
    s = None
    if knot:
        s = thin_s(q_ranks)
        if s is None:
            s = _s_from_complex(reduced_complex(diagram, flint.fmpq(1), budget=budget))
    return KhovanovData(ranks_to_json(q_ranks), ranks_to_json(f2), s, kh_width(q_ranks), reduced,
                        torsion, independent_f2 or torsion is None, skipped)
