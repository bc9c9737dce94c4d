"""Canonical codes of shadows with their automorphism orbit, and smoothings.

Helpers of the canonical-augmentation enumeration in
:mod:`pipeline.diagrams.families.alternating` (B. D. McKay, "Isomorph-free exhaustive
generation", J. Algorithms 26 (1998) 306–324).  A shadow is a twin array
(:mod:`pipeline.diagrams.shadow`); its code here is the map code of
:func:`pipeline.diagrams.shadow.alternating_codes` minimised over every start and
both rotation senses, so it names the shadow up to every homeomorphism of the sphere.
"""

from __future__ import annotations

from .shadow import alternating_codes, alternating_over, apply_shadow_flype, faces, shadow_flypes

__all__ = ["NEW_SMOOTHING", "smoothing", "shadow_code", "twist_region_count", "shadow_order_key",
           "flype_local_minimum"]

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


def _walk_full(tw: list[int], h: int, eps: int, best):
    """(code, order, ref) of the walk from (h, eps); None when its code exceeds ``best``."""
    num = {h >> 2: 0}
    order, ref = [h >> 2], [h & 3]
    code: list[int] = []
    less = best is None
    pos = k = 0
    while k < len(order):
        i, r0 = order[k], ref[k]
        k += 1
        for m in range(4):
            g = tw[4 * i + ((r0 + eps * m) & 3)]
            j = g >> 2
            q = num.get(j)
            if q is None:
                q = num[j] = len(order)
                order.append(j)
                ref.append(g & 3)
                tok = 4 * q
            else:
                tok = 4 * q + ((((g & 3) - ref[q]) * eps) & 3)
            if not less:
                bt = best[pos]
                if tok > bt:
                    return None
                if tok < bt:
                    less = True
            code.append(tok)
            pos += 1
    return code, order, ref


def shadow_code(tw: list[int]) -> tuple[tuple[int, ...], list[tuple[list[int], list[int], int]]]:
    """The canonical code of a connected shadow up to every homeomorphism of the sphere,
    and the labelling ``(order, ref, eps)`` of every start that reaches it.

    The code is the smallest map code (:func:`alternating_codes`' walk) over all starts
    and both rotation senses; the starts are pre-selected by the corner degrees of the
    start crossing and of the far end of the start dart (an invariant choice).  Two
    starts with the same code differ by an automorphism of the shadow and every
    automorphism maps a best start to a best start, so the labellings returned are
    exactly one orbit of the automorphism group: ``order[q]`` is the crossing numbered
    q, ``ref[q]`` its entry slot, ``eps`` the rotation sense.  (The pre-selection is
    not that of :func:`alternating_codes`, so the two codes are different names.)
    """
    face = faces(tw)
    deg = [0] * (max(face) + 1)
    for f in face:
        deg[f] += 1
    dg = [deg[f] for f in face]
    size = len(tw)
    inv = {}
    for h in range(size):
        q, r = h & ~3, h & 3
        g = tw[h]
        p, s = g & ~3, g & 3
        for eps in (1, -1):
            a = tuple(dg[q + ((r + eps * m + (1 if eps == 1 else 0)) & 3)] for m in range(4))
            b = tuple(dg[p + ((s + eps * m + (1 if eps == 1 else 0)) & 3)] for m in range(4))
            inv[h, eps] = (a, b)
    low = min(inv.values())
    best, found = None, []
    for (h, eps), v in inv.items():
        if v != low:
            continue
        w = _walk_full(tw, h, eps, best)
        if w is None:
            continue
        if best is None or w[0] != best:
            if best is not None and w[0] > best:
                continue
            best, found = w[0], []
        found.append((w[1], w[2], eps))
    return tuple(best), found


def twist_region_count(tw: list[int]) -> int:
    """Number of twist regions: classes of crossings joined by bigon faces (a lone
    crossing is a region of its own)."""
    face = faces(tw)
    corners: dict[int, list[int]] = {}
    for h, f in enumerate(face):
        corners.setdefault(f, []).append(h >> 2)
    parent = list(range(len(tw) // 4))

    def find(i: int) -> int:
        while parent[i] != i:
            parent[i] = parent[parent[i]]
            i = parent[i]
        return i

    regions = len(parent)
    for cs in corners.values():
        if len(cs) == 2:
            a, b = find(cs[0]), find(cs[1])
            if a != b:
                parent[a] = b
                regions -= 1
    return regions


def shadow_order_key(tw: list[int], over: list[bool]) -> tuple[int, tuple[int, ...]]:
    """(twist regions, smaller alternating map code of the two mirror diagrams): the order
    in which the class code of :func:`pipeline.diagrams.flype.flype_code` (up to mirror
    image) is the smallest member."""
    return twist_region_count(tw), min(alternating_codes(tw, over))


def flype_local_minimum(tw: list[int]) -> bool:
    """True when no one flype (:func:`pipeline.diagrams.shadow.shadow_flypes`) leads to a
    shadow smaller in :func:`shadow_order_key` (a necessary condition for the smallest
    member of a flype class)."""
    over = alternating_over(tw)
    here = shadow_order_key(tw, over)
    for m in shadow_flypes(tw):
        tw2, over2 = apply_shadow_flype(tw, over, m)
        tc = twist_region_count(tw2)
        if tc < here[0] or (tc == here[0] and min(alternating_codes(tw2, over2)) < here[1]):
            return False
    return True
