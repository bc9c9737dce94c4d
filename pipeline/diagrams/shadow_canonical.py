"""Canonical codes of shadows with their automorphism orbit, and smoothings.

Helpers of the canonical-augmentation enumeration in
:mod:`pipeline.diagrams.families.alternating` (B. D. McKay, "Isomorph-free exhaustive
generation", J. Algorithms 26 (1998) 306–324).  A shadow is a twin array
(:mod:`pipeline.diagrams.shadow`); its code here is the map code of
:func:`pipeline.diagrams.shadow.alternating_codes` minimised over every start and
both rotation senses, so it names the shadow up to every homeomorphism of the sphere.
"""

from __future__ import annotations

from .shadow import faces, walk

__all__ = ["NEW_SMOOTHING", "smoothing", "start_invariants", "shadow_code"]

#: The smoothing of the crossing added by :func:`pipeline.diagrams.shadow.extensions` that gives its parent back.
NEW_SMOOTHING = 1


def smoothing(tw: list[int], c: int, t: int) -> list[int] | None:
    """The shadow with crossing ``c`` smoothed (None when an edge of ``c`` returns to ``c``).

    ``t = 0`` joins the far ends of slots 0, 1 and of slots 2, 3; ``t = 1`` those of
    slots 1, 2 and 3, 0 (the two smoothings: in the Tait graph one deletes and one
    contracts the edge of ``c``).  The last crossing takes the number ``c``.
    """
    far = [tw[4 * c + k] for k in range(4)]
    if any(f >> 2 == c for f in far):
        return None
    new = list(tw)
    for a, b in ((0, 1), (2, 3)) if t == 0 else ((1, 2), (3, 0)):
        new[far[a]], new[far[b]] = far[b], far[a]
    last = len(tw) // 4 - 1
    if c != last:
        for k in range(4):
            g = new[4 * last + k]
            g = 4 * c + (g & 3) if g >> 2 == last else g
            new[4 * c + k] = g
            new[g] = 4 * c + k
    del new[4 * last:]
    return new


def start_invariants(tw: list[int]) -> dict[tuple[int, int], int]:
    """An isomorphism invariant of every start (dart h, rotation sense eps): the degrees
    of the four corner faces at h's crossing and at the far end of h, read from the
    start slot in the sense eps, as one integer (compared like the digit sequence)."""
    face = faces(tw)
    deg = [0] * (max(face) + 1)
    for f in face:
        deg[f] += 1
    dg = [deg[f] for f in face]
    base = max(dg) + 1
    size = len(tw)
    ccw, cw = [0] * size, [0] * size
    for h in range(size):
        q, r = h & ~3, h & 3
        x = y = 0
        for m in range(4):
            x = x * base + dg[q + ((r + m + 1) & 3)]
            y = y * base + dg[q + ((r - m) & 3)]
        ccw[h], cw[h] = x, y
    b4 = base ** 4
    inv = {}
    for h in range(size):
        g = tw[h]
        inv[h, 1] = ccw[h] * b4 + ccw[g]
        inv[h, -1] = cw[h] * b4 + cw[g]
    return inv


def shadow_code(tw: list[int], inv: dict | None = None
                ) -> tuple[tuple[int, ...], list[tuple[list[int], list[int], int]]]:
    """The canonical code of a connected shadow up to every homeomorphism of the sphere,
    and the labelling ``(order, ref, eps)`` of every start that reaches it.

    The code is the smallest map code (:func:`pipeline.diagrams.shadow.alternating_codes`'
    walk) over the starts with the smallest :func:`start_invariants` (``inv``, when
    already computed).  Two starts with the same code differ by an automorphism of the
    shadow and every automorphism maps a best start to a best start, so the labellings
    returned are exactly one orbit of the automorphism group: ``order[q]`` is the
    crossing numbered q, ``ref[q]`` its entry slot, ``eps`` the rotation sense.  (The
    pre-selection is not that of ``alternating_codes``: the two codes are different names.)
    """
    inv = start_invariants(tw) if inv is None else inv
    low = min(inv.values())
    best, found = None, []
    for (h, eps), v in inv.items():
        if v != low:
            continue
        w = walk(tw, h, eps, best)
        if w is None:
            continue
        if best is None or w[0] != best:
            best, found = w[0], []
        found.append((w[1], w[2], eps))
    return tuple(best), found
