"""Dowker–Thistlethwaite codes of knot diagrams and their planar realisation.

A DT code of an n-crossing knot diagram is a sequence of n signed even integers
e_1, …, e_n: walking along the knot and numbering the passages through crossings
1, 2, …, 2n, crossing i is met at the odd passage 2i − 1 and at the even passage
|e_i|.  Sign convention used here: e_i > 0 means the odd passage 2i − 1 runs *over*
and the even passage under; e_i < 0 the reverse (so an alternating diagram has all
entries positive).

The code fixes the over/under data and the Gauss word but not the planar
embedding: at each crossing the even strand may cross the odd one from right to
left or from left to right.  Realisation rule (deterministic, documented contract):
the choices are read as a binary number b_1 b_2 … b_n with b_1 = 0 (the even strand
crosses the first crossing from right to left, which fixes the reflection of the
plane, hence the mirror image) and the *smallest* such number whose embedding is
planar (every connected diagram with n crossings has n + 2 faces) is taken.  For a
prime knot diagram the planar embedding is unique up to reflection, so only the
mirror image is a convention; for composite diagrams the rule also picks one of the
planar realisations.  Rows built from DT codes record that their chirality is fixed
by this convention (``mirror_by_convention``).

References
----------
1. C. H. Dowker, M. B. Thistlethwaite, "Classification of knot projections",
   Topology Appl. 16 (1983).
"""

from __future__ import annotations

from typing import Sequence

from .diagram import Diagram
from .plane import trace_faces
from ..errors import NotationError

__all__ = ["diagram", "MAX_DT_CROSSINGS", "MIRROR_BY_CONVENTION"]

#: Realisation is a search over 2^(n-1) embeddings; longer codes are refused.
MAX_DT_CROSSINGS = 18

#: A DT code fixes the knot only up to mirror image (see module docstring).
MIRROR_BY_CONVENTION = True


def _validate(code: Sequence[int]) -> int:
    n = len(code)
    if n == 0:
        raise NotationError("dt: empty code")
    seen = set()
    for e in code:
        a = abs(e)
        if e == 0 or a % 2:
            raise NotationError(f"dt: entry {e} is not a nonzero even integer")
        if a > 2 * n:
            raise NotationError(f"dt: entry {e} exceeds 2n = {2 * n} for a code of {n} entries")
        if a in seen:
            raise NotationError(f"dt: entry {e} is repeated (each even passage appears once)")
        seen.add(a)
    if n > MAX_DT_CROSSINGS:
        raise NotationError(f"dt: {n} crossings exceed the realisation limit {MAX_DT_CROSSINGS}; give a PD code")
    return n


def _slots(code: Sequence[int], bits: int) -> list[list[int]]:
    """Edge labels around each crossing, counterclockwise from the odd strand's incoming edge.

    Edge k runs from passage k to passage k + 1 (edge 2n wraps to passage 1).
    """
    n = len(code)
    m = 2 * n
    out = []
    for i, e in enumerate(code):
        odd, even = 2 * i + 1, abs(e)
        odd_in, odd_out = (odd - 2) % m + 1, odd
        even_in, even_out = (even - 2) % m + 1, even
        if (bits >> (n - 1 - i)) & 1 == 0:   # even strand from right to left
            out.append([odd_in, even_in, odd_out, even_out])
        else:
            out.append([odd_in, even_out, odd_out, even_in])
    return out


def _face_count(slots: list[list[int]]) -> int:
    return len(trace_faces(slots))


def diagram(code: Sequence[int]) -> Diagram:
    """Realise a DT code as a :class:`Diagram` (see the module docstring for the rule).

    Raises
    ------
    NotationError
        Malformed code, or no planar realisation exists.

    Examples
    --------
    >>> diagram([4, 6, 2]).n_crossings
    3
    """
    code = [int(e) for e in code]
    n = _validate(code)
    for bits in range(2 ** (n - 1)):
        slots = _slots(code, bits)
        if _face_count(slots) == n + 2:
            return _to_pd(code, slots, bits)
    raise NotationError(f"dt: {' '.join(map(str, code))} has no planar realisation")


def _to_pd(code: Sequence[int], slots: list[list[int]], bits: int) -> Diagram:
    """Rotate each crossing to start at its incoming under-strand (PD contract)."""
    n = len(code)
    pd = []
    for i, (e, row) in enumerate(zip(code, slots)):
        if e > 0:  # odd passage over: the even strand is under; start at its incoming edge
            k = 1 if (bits >> (n - 1 - i)) & 1 == 0 else 3
            pd.append(tuple(row[k:] + row[:k]))
        else:      # odd passage under: already starts at the odd incoming edge
            pd.append(tuple(row))
    return Diagram.from_pd(pd)
