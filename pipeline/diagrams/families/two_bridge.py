"""Two-bridge (rational) knots and links b(α, β) and Conway's continued fractions.

b(α, β) is the numerator closure N(T) of the rational tangle T of fraction α/β,
built from the continued fraction α/β = a1 + 1/(a2 + 1/(⋯ + 1/an)) by alternating
horizontal and vertical twists (``builder.rational_tangle``).  The crossing picture
is fixed so that ``rational:3/1`` = ``conway:3`` = ``torus:2,3`` (the positive
trefoil).  Sign convention: b(α, −β) is the mirror of b(α, β); det b(α, β) = α.

References
----------
1. H. Schubert, "Knoten mit zwei Brücken", Math. Z. 65 (1956).
2. J. H. Conway, "An enumeration of knots and links" (1970).
3. L. H. Kauffman, S. Lambropoulou, "On the classification of rational knots",
   L'Enseignement Math. 49 (2003).
"""

from __future__ import annotations

from fractions import Fraction
from math import gcd
from typing import Sequence

from ..builder import PlanarBuilder, numerator_closure, rational_tangle
from ..diagram import Diagram
from ...errors import NotationError

__all__ = ["continued_fraction", "fraction_of", "diagram", "conway_diagram"]

#: Crossing picture of rational tangles (see builder._crossing_tangle).
PICTURE = 1


def continued_fraction(num: int, den: int) -> list[int]:
    """Terms [a1, ..., an] with num/den = a1 + 1/(a2 + ...), all of the sign of num/den.

    Euclid's algorithm on |num/den|, then every term negated for a negative fraction,
    so the rational tangle built from it is alternating with Σ|a_i| crossings.
    ``den`` = 0 gives the empty list (the ∞ tangle).
    """
    if den == 0:
        return []
    if den < 0:
        num, den = -num, -den
    if num < 0:
        return [-a for a in continued_fraction(-num, den)]
    out = []
    while den:
        a = num // den
        out.append(a)
        num, den = den, num - a * den
    return out


def fraction_of(terms: Sequence[int]) -> Fraction | None:
    """a1 + 1/(a2 + 1/(... + 1/an)); None when it is ∞ (a zero denominator)."""
    val: Fraction | None = None  # None means ∞
    for a in reversed(list(terms)):
        if val is None:
            val = Fraction(a)
        elif val == 0:
            val = None
        else:
            val = a + 1 / val
    return val


def diagram(alpha: int, beta: int) -> Diagram:
    """b(α, β) for α ≥ 1, gcd(α, β) = 1 (β = 0 only with α = 1, the unknot)."""
    if alpha < 1:
        raise NotationError(f"rational: α = {alpha} must be a positive integer")
    if gcd(alpha, beta) != 1:
        raise NotationError(f"rational: gcd({alpha}, {beta}) = {gcd(alpha, beta)} (α and β must be coprime)")
    return conway_diagram(continued_fraction(alpha, beta)) if beta else _closure([])


def conway_diagram(terms: Sequence[int]) -> Diagram:
    """The rational link N([a1 ... an]) with fraction a1 + 1/(a2 + ...)."""
    terms = [int(a) for a in terms]
    if not terms:
        raise NotationError("conway: no terms given")
    return _closure(terms)


def _closure(terms: list[int]) -> Diagram:
    b = PlanarBuilder()
    numerator_closure(rational_tangle(b, terms, PICTURE))
    return b.diagram()
