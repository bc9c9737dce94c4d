"""Torus knots and links T(p, q).

For p, q > 0, T(p, q) is the closure of the positive braid (σ1 σ2 ⋯ σ_{p−1})^q on p
strands (README.md: ``torus:2,3`` is the positive trefoil).  A negative parameter
gives the mirror image; two negative parameters cancel.  gcd(p, q) components.

References
----------
1. D. Rolfsen, *Knots and Links* (1976), ch. 3 and 7.
2. G. Burde, H. Zieschang, *Knots*, de Gruyter, ch. 3.
"""

from __future__ import annotations

from ..diagram import Diagram
from ...errors import NotationError
from . import braid

__all__ = ["diagram", "word"]


def word(p: int, q: int) -> list[int]:
    """The braid word of T(p, q) on |p| strands (signs give the mirror)."""
    sign = 1 if (p > 0) == (q > 0) else -1
    return [sign * i for _ in range(abs(q)) for i in range(1, abs(p))]


def diagram(p: int, q: int) -> Diagram:
    """T(p, q) as a closed braid on |p| strands with |q|(|p|−1) crossings.

    Raises NotationError for p = 0 or q = 0.
    """
    if p == 0 or q == 0:
        raise NotationError(f"torus: parameter {'p' if p == 0 else 'q'} = 0 (T(p,q) needs p, q nonzero)")
    return braid.diagram(word(p, q), strands=abs(p))
