"""HOMFLY-PT polynomial, normalised by v⁻¹P(L₊) − vP(L₋) = zP(L₀), P(unknot) = 1.

So V(t) = P(v = t, z = t^½ − t^−½) and ∇(z) = P(1, z); the positive trefoil has
P = 2v² − v⁴ + v²z².  Routes:

``skein``   general route, any diagram: memoised skein tree to descending diagrams,
            a whole twist region (closed forms for parallel / antiparallel strands) or
            a Reidemeister II bigon per step, one crossing per step when neither is left
``surgery`` the signed crossing lists of the skein tree: smoothing, switching,
            straight-through removal, kinks, and the orientation-respecting memo keys
``hecke``   braid closures (``braid:``, ``torus:``): Hecke-algebra transfer matrix with
            the Ocneanu trace, polynomial in the length for a fixed number of strands
``hpoly``   the exact two-variable Laurent polynomial type and its specialisations

:func:`homfly_polynomial` picks the route from the notation when one is given.
"""

from __future__ import annotations

from typing import Optional

from ...diagrams.diagram import Diagram
from ...diagrams.notation import Notation, parse_notation
from ..seifert import braid_of_notation
from .hecke import MAX_STRANDS, basis_trace, homfly_braid
from .hpoly import DELTA, HPoly
from .skein import homfly_general

__all__ = ["HPoly", "DELTA", "homfly_polynomial", "homfly_general", "homfly_braid",
           "homfly_of_notation", "basis_trace", "MAX_STRANDS"]


def homfly_of_notation(text: "str | Notation", *, budget: Optional[int] = None) -> Optional[HPoly]:
    """P by the braid route for ``braid:`` and ``torus:`` notation; None for other kinds.

    ``text`` is a notation string or a parsed
    :class:`~pipeline.diagrams.notation.Notation` (read by
    :func:`~pipeline.diagrams.notation.parse_notation` through
    :func:`~pipeline.invariants.seifert.braid_of_notation`).

    Also None when the braid has more than ``MAX_STRANDS`` strands.  ``budget`` bounds
    n!·length (see :func:`homfly_braid`).
    """
    wb = braid_of_notation(text)
    if wb is None:
        wb = _two_strand_knot(text)
    if wb is None:
        return None
    word, n = wb
    if n > MAX_STRANDS:
        return None
    return homfly_braid(word, strands=n, budget=budget)


def _two_strand_knot(text: "str | Notation") -> Optional[tuple[list[int], int]]:
    """(σ1^±a, 2) when a ``rational:``/``conway:`` row is the torus knot T(2, ±a), a odd.

    b(α, β) with β ≡ 1 (mod α) is T(2, α) and with β ≡ −1 its mirror (Schubert; the README
    pins ``rational:a/1`` = ``torus:2,a``); ``conway:a`` is ``rational:a/1``.  Only knots
    (a odd): P of a knot does not depend on its orientation, while the 4-plat picture of
    T(2, a) for even a may orient the two components otherwise than the braid closure.
    The Hecke route is linear in a (the skein route needs its twist step for this one region).
    """
    note = parse_notation(text) if isinstance(text, str) else text
    if note.kind == "rational":
        alpha, beta = (int(v) for v in note.args)
        alpha = abs(alpha)
        sign = 1 if beta % alpha == 1 % alpha else (-1 if beta % alpha == alpha - 1 else 0)
    elif note.kind == "conway" and len(note.args) == 1:
        alpha, sign = abs(int(note.args[0])), (1 if int(note.args[0]) > 0 else -1)
    else:
        return None
    if sign == 0 or alpha < 3 or alpha % 2 == 0:
        return None
    return [sign] * alpha, 2


def homfly_polynomial(diagram: Diagram, *, notation: "Optional[str | Notation]" = None,
                      budget: Optional[int] = None, braid_budget: Optional[int] = None) -> HPoly:
    """HOMFLY-PT polynomial P(v, z) of an oriented link diagram.

    Parameters
    ----------
    diagram : Diagram
        The diagram (used by the general route).
    notation : str, optional
        The row's notation; ``braid:``/``torus:`` rows take the Hecke route.
    budget : int, optional
        ``homfly_budget``: diagrams expanded by the skein route; exceeded ->
        ``BudgetExceeded('homfly', budget)``.
    braid_budget : int, optional
        Bound on n!·length for the braid route (exceeded -> ``BudgetExceeded('homfly',
        braid_budget)``); None: no bound beyond ``MAX_STRANDS``.

    Examples
    --------
    >>> from pipeline import parse
    >>> homfly_polynomial(parse("torus:2,3")).to_json()
    [[2, 0, 2], [2, 2, 1], [4, 0, -1]]

    References
    ----------
    P. Freyd, D. Yetter, J. Hoste, W. B. R. Lickorish, K. Millett, A. Ocneanu, "A new
    polynomial invariant of knots and links", Bull. AMS 12 (1985); J. H. Przytycki,
    P. Traczyk, "Invariants of links of Conway type", Kobe J. Math. 4 (1987).
    """
    if notation is not None:
        fast = homfly_of_notation(notation, budget=braid_budget)
        if fast is not None:
            return fast
    return homfly_general(diagram, budget=budget)
