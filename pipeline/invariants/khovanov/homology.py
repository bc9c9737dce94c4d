"""Khovanov homology over Q and F_p, Rasmussen's s, width and the Euler characteristic.

Public entry points over the one :class:`~pipeline.diagrams.diagram.Diagram` type.  The
homology is computed by Bar-Natan's local algorithm (:mod:`.tangle`); the slow cube of
resolutions (:mod:`.cube`) is its test oracle.

Conventions (Bar-Natan, AGT 2, 2002 [1]_): ``Σ (−1)^i q^j rank Kh^{i,j} = (q + q⁻¹)·V``
at ``t^½ = −q``, V in the normalisation of :func:`pipeline.invariants.jones.jones_polynomial`;
the positive trefoil ``torus:2,3`` has rank 1 at (0,1), (0,3), (2,5), (3,9).  Mirror:
``Kh^{i,j}(D*) ≅ Kh^{−i,−j}(D)`` over a field [1]_ (:func:`mirror_ranks`).

References
----------
.. [1] D. Bar-Natan, "On Khovanov's categorification of the Jones polynomial",
   Algebr. Geom. Topol. 2 (2002), 337–370.
.. [2] D. Bar-Natan, "Fast Khovanov homology computations", JKTR
   16 (2007), 243–255.
.. [3] J. Rasmussen, "Khovanov homology and the slice genus", Invent. Math. 182 (2010).
.. [4] E. S. Lee, "An endomorphism of the Khovanov invariant", Adv. Math. 197 (2005).
.. [5] M. Khovanov, "Link homology and Frobenius extensions", Fund. Math. 190 (2006).
.. [6] M. Mackaay, P. Turner, P. Vaz, "A remark on Rasmussen's invariant of knots",
   JKTR 16 (2007).
"""

from __future__ import annotations

from collections import Counter
from typing import Optional

import flint

from ...diagrams.diagram import Diagram
from ...errors import BudgetExceeded, DiagramError
from ..poly import Laurent
from .tangle import TangleComplex, reduced_complex

__all__ = ["khovanov_homology", "reduced_khovanov", "rasmussen_s",
           "kh_width", "thin_s",
           "ranks_to_json", "ranks_from_json", "mirror_ranks", "jones_from_khovanov"]

Ranks = dict[tuple[int, int], int]


def _check_budget(budget) -> None:
    if budget is not None and (isinstance(budget, bool) or not isinstance(budget, int) or budget < 0):
        raise ValueError(f"khovanov: budget {budget!r} must be a non-negative integer or None")
    if budget == 0:
        raise BudgetExceeded("khovanov", budget)


def _coefficients(field: int) -> dict:
    """Keyword arguments of :func:`.tangle.reduced_complex` for Q (field 0) or F_p:
    ``flint.fmpq`` over Q, Python ints reduced mod p over F_p (faster than ``nmod``)."""
    if isinstance(field, bool) or not isinstance(field, int) or field < 0 or field == 1:
        raise ValueError(f"khovanov: field {field!r} must be 0 (the rationals) or a prime")
    if field == 0:
        return {"one": flint.fmpq(1)}
    if any(field % d == 0 for d in range(2, int(field ** 0.5) + 1)):
        raise ValueError(f"khovanov: field {field} is not a prime")
    return {"one": 1, "modulus": field}


def _ranks(cx: TangleComplex, free_loops: int) -> Ranks:
    ranks = Counter((i, q) for _, i, q in cx.objs.values())
    for _ in range(free_loops):  # Kh(D ⊔ O) = Kh(D) ⊗ (q + q⁻¹)
        nxt: Counter = Counter()
        for (i, q), r in ranks.items():
            nxt[(i, q + 1)] += r
            nxt[(i, q - 1)] += r
        ranks = nxt
    return {k: r for k, r in sorted(ranks.items()) if r}


def khovanov_homology(diagram: Diagram, *, field: int = 0, budget: Optional[int] = None) -> Ranks:
    """Ranks of the Khovanov homology groups Kh^{i,j} over Q or F_p.

    Bar-Natan's local algorithm [2]_ in the conventions of [1]_ (module docstring).

    Parameters
    ----------
    diagram : Diagram
    field : int, optional
        0 for the rationals (default) or a prime p for F_p.
    budget : int, optional
        Largest number of objects the tangle complex may have after any crossing is
        added; None means no limit, 0 skips every diagram.

    Returns
    -------
    dict
        ``{(i, j): rank}`` sorted, nonzero ranks only.

    Raises
    ------
    BudgetExceeded
        ``skipped: khovanov budget N`` when the complex grows past ``budget``.
    ValueError
        When ``budget`` or ``field`` is not valid.

    Examples
    --------
    >>> from pipeline.diagrams.notation import parse
    >>> khovanov_homology(parse("torus:2,3"))
    {(0, 1): 1, (0, 3): 1, (2, 5): 1, (3, 9): 1}
    """
    ring = _coefficients(field)
    _check_budget(budget)
    return _ranks(reduced_complex(diagram, budget=budget, h0=True, **ring), diagram.free_loops)


def _free_degrees(cx: TangleComplex) -> list[tuple[int, int]]:
    """(i, q) of the free summands of the final complex over k[h] (deg h = −2).

    Every entry ``a → b`` of the final complex is ``c·h^k`` with ``k = (q_b − q_a)/2 ≥ 1``.
    Graded Smith reduction: the entry of least k divides every entry of its row and
    column, so it can be cancelled like an isomorphism (``ε − γφ⁻¹δ`` stays
    polynomial); each cancelled pair is an h-torsion summand ``k[h]/(h^k)``, the
    generators left over span the free part.
    """
    work = TangleComplex(cx.one)
    work.objs = dict(cx.objs)
    work.out = {a: {b: dict(f) for b, f in t.items()} for a, t in cx.out.items()}
    work.inc = {b: set(x) for b, x in cx.inc.items()}
    while True:  # the least power of h never decreases: cancel level by level
        level = [(work.objs[b][2] - work.objs[a][2], a, b) for a, t in work.out.items() for b in t]
        if not level:
            return sorted((i, q) for _, i, q in work.objs.values())
        least = min(level)[0]
        for k, a, b in level:
            if k == least and a in work.out and b in work.out[a]:
                work._cancel(a, b)  # ε − γφ⁻¹δ: polynomial since φ has the least power of h


def _s_from_complex(cx: TangleComplex) -> int:
    free = _free_degrees(cx)
    if len(free) != 2 or any(i != 0 for i, _ in free) or abs(free[0][1] - free[1][1]) != 2:
        raise ArithmeticError(f"khovanov: free part {free} is not that of a knot (Lee's theorem)")
    return (free[0][1] + free[1][1]) // 2


def _require_knot(diagram: Diagram, what: str = "rasmussen_s") -> None:
    if diagram.n_components != 1:
        raise DiagramError(f"{what}: the diagram has {diagram.n_components} components "
                           f"(defined here for knots only)")


def rasmussen_s(diagram: Diagram, *, budget: Optional[int] = None) -> int:
    """Rasmussen's s invariant of a knot, over Q.

    From the Bar-Natan deformation ``x² = hx`` over Q[h] (deg h = −2), computed by the same
    local algorithm: the homology is ``Q[h]{s−1} ⊕ Q[h]{s+1}`` in homological degree 0
    plus h-torsion, and s is the mean of the two free quantum degrees.  Over Q this theory
    gives Rasmussen's s (its filtered form is Lee's theory [4]_ after ``x ↦ x − h/2``;
    Khovanov [5]_, Mackaay–Turner–Vaz [6]_), normalised so that positive torus knots
    have ``s = (p − 1)(q − 1)`` [3]_: ``s = 2`` for ``torus:2,3``.

    Raises
    ------
    DiagramError
        When the diagram is not a knot.
    BudgetExceeded
        ``skipped: khovanov budget N``.

    Examples
    --------
    >>> from pipeline.diagrams.notation import parse
    >>> rasmussen_s(parse("torus:2,3")), rasmussen_s(parse("torus:-3,4"))
    (2, -6)
    """
    _require_knot(diagram)
    _check_budget(budget)
    return _s_from_complex(reduced_complex(diagram, flint.fmpq(1), budget=budget))


def kh_width(ranks: Ranks) -> int:
    """Number of diagonals ``δ = j − 2i`` that carry homology (thin knots: 2; 0 if empty)."""
    return len({j - 2 * i for (i, j), r in ranks.items() if r})


def reduced_khovanov(diagram: Diagram, *, field: int = 0, budget: Optional[int] = None) -> Ranks:
    """Reduced Khovanov homology of a knot over Q or F_p.

    The subcomplex in which the marked circle carries ``v₋``, quantum degrees raised by
    one (Khovanov, "Patterns in knot cohomology I", Experiment. Math. 12 (2003)), so the
    unknot has rank 1 at (0, 0) and ``Σ (−1)^i q^j rank = V`` at ``t^½ = −q``.  Computed as
    the simplified complex of the (1,1)-tangle cut open at the marked point: each of its
    objects is the arc, a free module over ``A = k[x]/(x²)``, and the reduced complex is
    that complex modulo x, whose differential vanishes after the simplification.  For
    a knot the result does not depend on the marked point.

    Raises
    ------
    DiagramError
        When the diagram is not a knot.
    BudgetExceeded
        ``skipped: khovanov budget N``.

    Examples
    --------
    >>> from pipeline.diagrams.notation import parse
    >>> reduced_khovanov(parse("torus:2,3"))
    {(0, 2): 1, (2, 6): 1, (3, 8): 1}
    """
    _require_knot(diagram, "reduced_khovanov")
    ring = _coefficients(field)
    _check_budget(budget)
    if diagram.n_crossings == 0:
        return {(0, 0): 1}
    return _ranks(reduced_complex(diagram, budget=budget, keep_cut=True, h0=True, **ring), 0)


def thin_s(ranks: Ranks) -> Optional[int]:
    """Rasmussen's s of a knot read off Kh over Q when it is thin, else None.

    Lee's spectral sequence from Kh over Q converges to Q in bidegrees (0, s − 1) and
    (0, s + 1) (E. S. Lee, "An endomorphism of the Khovanov invariant", Adv. Math. 197
    (2005); J. Rasmussen, Invent. Math. 182 (2010)), so those two groups are nonzero and
    lie on the diagonals ``j − 2i = s ± 1``.  When every rank lies on two adjacent
    diagonals ``δ − 1`` and ``δ + 1`` these must be them, so ``s = δ`` (a theorem, not a
    heuristic).  Returns None otherwise (thick: s needs the Q[h] computation).
    """
    diagonals = sorted({j - 2 * i for (i, j), r in ranks.items() if r})
    if len(diagonals) == 2 and diagonals[1] - diagonals[0] == 2:
        return diagonals[0] + 1
    return None


def ranks_to_json(ranks: Ranks) -> list[list[int]]:
    """``[[i, j, rank], ...]`` sorted, nonzero only (the JSON form of the columns)."""
    return [[i, j, r] for (i, j), r in sorted(ranks.items()) if r]


def ranks_from_json(data: list) -> Ranks:
    """Inverse of :func:`ranks_to_json`."""
    return {(int(i), int(j)): int(r) for i, j, r in data}


def mirror_ranks(ranks: Ranks) -> Ranks:
    """Ranks of the mirror over a field: ``Kh^{i,j}(D*) ≅ Kh^{−i,−j}(D)`` [1]_."""
    return {(-i, -j): r for (i, j), r in sorted(ranks.items(), reverse=True)}


def jones_from_khovanov(ranks: Ranks) -> Laurent:
    """V(t) recovered from the graded Euler characteristic ``χ = (q + q⁻¹)·V|_{t^½ = −q}``.

    Raises
    ------
    ArithmeticError
        When χ is not divisible by ``q + q⁻¹`` (not the homology of a diagram).
    """
    chi: dict[int, int] = {}
    for (i, j), r in ranks.items():
        chi[j] = chi.get(j, 0) + (-r if i % 2 else r)
    chi = {j: c for j, c in chi.items() if c}
    if not chi:
        return Laurent()
    lo = min(chi)
    poly = flint.fmpz_poly([chi.get(lo + e, 0) for e in range(max(chi) - lo + 1)])
    quo, rem = divmod(poly, flint.fmpz_poly([1, 0, 1]))  # q + q⁻¹ = q⁻¹ (1 + q²)
    if not rem.is_zero():
        raise ArithmeticError("khovanov: Euler characteristic not divisible by q + 1/q")
    # χ = q^lo · poly = q^(lo+1) · quo · (q + q⁻¹); V at q^e is (−1)^e t^(e/2)
    base = lo + 1
    return Laurent({base + e: (-int(c) if (base + e) % 2 else int(c))
                    for e, c in enumerate(quo.coeffs()) if c})
