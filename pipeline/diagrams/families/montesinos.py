"""Montesinos links: rational tangles in a row, closed by the numerator closure.

M(β1/α1, …, βr/αr) = N(T1 + ⋯ + Tr), Ti the rational tangle of Conway fraction
βi/αi (an integer n is the tangle n/1, the Euler-number twists).  Its determinant
is |Σ_i βi Π_{j≠i} αj|.  The pretzel link P(p1, …, pk) is M(1/p1, …, 1/pk).

The crossing picture is ``PICTURE`` = −1, fixed by README.md's pins ``pretzel:-2,3,3``
= ``torus:3,4`` and P(p, q) = T(2, p+q) (checked with the Jones polynomial in the
tests).  It is the mirror of the two-bridge picture, so a Montesinos fraction f reads
as −f in ``rational:`` terms: ``montesinos:3`` = ``rational:3/-1`` is the *negative*
trefoil, and M(f1, …, fr) = N(T(−f1) + ⋯ + T(−fr)) in the two-bridge convention.

References
----------
1. J. M. Montesinos, "Seifert manifolds that are ramified two-sheeted cyclic
   coverings", Bol. Soc. Mat. Mexicana 18 (1973).
2. G. Burde, H. Zieschang, *Knots*, de Gruyter, ch. 12.
"""

from __future__ import annotations

from fractions import Fraction
from typing import Sequence

from ..builder import PlanarBuilder, numerator_closure, rational_tangle, tangle_sum
from ..diagram import Diagram
from ...errors import NotationError
from .two_bridge import continued_fraction

__all__ = ["diagram", "PICTURE"]

PICTURE = -1


def diagram(fractions: Sequence[Fraction]) -> Diagram:
    """N(T1 + ... + Tr) for tangle fractions β/α (a Fraction; 1/0 = ∞ is allowed as
    ``None``)."""
    if not fractions:
        raise NotationError("montesinos: no tangles given")
    b = PlanarBuilder()
    tangles = []
    for f in fractions:
        terms = [] if f is None else continued_fraction(f.numerator, f.denominator)
        tangles.append(rational_tangle(b, terms, PICTURE))
    numerator_closure(tangle_sum(tangles))
    return b.diagram()
