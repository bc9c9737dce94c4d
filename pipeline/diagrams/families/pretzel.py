"""Pretzel links P(p1, …, pk).

Column i is a vertical twist region of |p_i| crossings (the tangle 1/p_i); the
columns stand side by side and are closed top and bottom, i.e. P(p1, …, pk) =
M(1/p1, …, 1/pk).  A zero entry is a column with no crossings (the ∞ tangle).
Handedness is fixed by README.md: ``pretzel:-2,3,3`` = ``torus:3,4``; then
P(p, q) = T(2, p+q) and negating every entry gives the mirror.
det P(p1, …, pk) = |Σ_i Π_{j≠i} p_j|.

References
----------
1. A. Kawauchi, survey monograph, Birkhäuser (1996), ch. 2.
2. G. Burde, H. Zieschang, *Knots*, de Gruyter, ch. 12.
"""

from __future__ import annotations

from fractions import Fraction
from typing import Sequence

from ..diagram import Diagram
from ...errors import NotationError
from . import montesinos

__all__ = ["diagram"]


def diagram(entries: Sequence[int]) -> Diagram:
    """P(p1, ..., pk), k ≥ 1, any signs, zero entries allowed."""
    if not entries:
        raise NotationError("pretzel: no entries given")
    return montesinos.diagram([None if p == 0 else Fraction(1, p) for p in entries])
