"""Closures of braid words.

The braid is drawn upwards on ``strands`` positions; generator ``i`` (σ_i) crosses
positions i and i+1 with the strand from position i passing *over* (bottom-left to
top-right), which is a positive crossing when both strands are oriented upwards;
``-i`` is σ_i⁻¹.  The closure joins the top of each position to its bottom.
Strands that never cross become unknotted free loops.

References
----------
1. J. W. Alexander, "A lemma on systems of knotted curves", PNAS 9 (1923):
   every link is the closure of a braid.
2. J. S. Birman, *Braids, Links, and Mapping Class Groups*, Ann. Math. Studies 82 (1974).
"""

from __future__ import annotations

from typing import Optional, Sequence

from ..builder import PlanarBuilder
from ..diagram import Diagram
from ...errors import NotationError

__all__ = ["diagram"]


def diagram(word: Sequence[int], *, strands: Optional[int] = None) -> Diagram:
    """The closure of the braid ``word`` (nonzero integers; i is σ_i, -i is σ_i⁻¹).

    ``strands`` defaults to max|i| + 1 and may be larger (extra free loops).

    Example: ``diagram([1, 1, 1])`` is the positive trefoil (writhe +3).
    """
    word = [int(g) for g in word]
    if any(g == 0 for g in word):
        raise NotationError("braid: generator 0 is not allowed (use i or -i with i >= 1)")
    need = max((abs(g) for g in word), default=0) + 1
    n = need if strands is None else int(strands)
    if n < need:
        raise NotationError(f"braid: {n} strands cannot carry generator {need - 1}")
    if n < 1:
        raise NotationError("braid: a braid needs at least one strand")
    b = PlanarBuilder()
    bottoms = [b.wire() for _ in range(n)]
    tops = [(w, 1) for w in bottoms]
    entries = []
    for g in word:
        i = abs(g) - 1
        x = b.crossing(over_odd=(g < 0))  # slots 0=SW 1=SE 2=NE 3=NW; σ_i: over SW->NE
        b.join(tops[i], (x, 0))
        b.join(tops[i + 1], (x, 1))
        tops[i], tops[i + 1] = (x, 3), (x, 2)
        entries.append((x, 0))
    for w, top in zip(bottoms, tops):
        b.join(top, (w, 0))
    return b.diagram(entries=entries)
