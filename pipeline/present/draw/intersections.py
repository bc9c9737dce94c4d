"""Where drawn polylines meet: the check that a picture has no stray intersections.

:func:`~pipeline.present.draw.geometry.layout` smooths every edge into a curve and uses
:func:`stray_intersections` to find edges that then meet somewhere other than at a
crossing (those fall back to straight Tutte polylines, which never meet off the
crossings).  Plain segment-intersection tests by orientation signs, bucketed on a grid
(T. H. Cormen, C. E. Leiserson, R. L. Rivest, C. Stein, *Introduction to Algorithms*,
MIT Press, 3rd ed. 2009, section 33.1: segment intersection by cross products).
"""

from __future__ import annotations

import math
from typing import Any

__all__ = ["stray_intersections"]


def _segments_cross(p, q, r, s) -> bool:
    """True when closed segments pq and rs share a point."""
    def orient(a, b, c):
        v = (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0])
        return 0 if abs(v) < 1e-15 else (1 if v > 0 else -1)

    def on(a, b, c):
        return min(a[0], b[0]) - 1e-12 <= c[0] <= max(a[0], b[0]) + 1e-12 and \
            min(a[1], b[1]) - 1e-12 <= c[1] <= max(a[1], b[1]) + 1e-12

    o1, o2, o3, o4 = orient(p, q, r), orient(p, q, s), orient(r, s, p), orient(r, s, q)
    if o1 != o2 and o3 != o4:
        return True
    return (o1 == 0 and on(p, q, r)) or (o2 == 0 and on(p, q, s)) or \
        (o3 == 0 and on(r, s, p)) or (o4 == 0 and on(r, s, q))


def stray_intersections(polylines: dict[Any, list[tuple[float, float]]],
                        allowed: set[tuple[float, float]]) -> list[tuple[Any, Any]]:
    """Pairs of polylines (keys) that meet somewhere other than a point of ``allowed``.

    Consecutive segments of one polyline may share their common vertex; two segments
    that both end at a point of ``allowed`` (the crossings) may meet there.  Uses a grid
    of buckets so large pictures stay fast.
    """
    segs = []
    for key, pts in polylines.items():
        for k in range(len(pts) - 1):
            segs.append((key, k, pts[k], pts[k + 1]))
    if not segs:
        return []
    xs = [c for s in segs for c in (s[2][0], s[3][0])]
    ys = [c for s in segs for c in (s[2][1], s[3][1])]
    span = max(max(xs) - min(xs), max(ys) - min(ys), 1e-9)
    cell = span / max(1.0, 2.0 * math.sqrt(len(segs)))
    x0, y0 = min(xs), min(ys)
    grid: dict[tuple[int, int], list[int]] = {}
    for n, (_, _, p, q) in enumerate(segs):
        for gx in range(int((min(p[0], q[0]) - x0) / cell), int((max(p[0], q[0]) - x0) / cell) + 1):
            for gy in range(int((min(p[1], q[1]) - y0) / cell), int((max(p[1], q[1]) - y0) / cell) + 1):
                grid.setdefault((gx, gy), []).append(n)
    boxes = [(min(p[0], q[0]), min(p[1], q[1]), max(p[0], q[0]), max(p[1], q[1])) for _, _, p, q in segs]
    bad, seen = set(), set()
    for bucket in grid.values():
        for a in range(len(bucket)):
            for b in range(a + 1, len(bucket)):
                m, n = bucket[a], bucket[b]
                if (m, n) in seen:
                    continue
                seen.add((m, n))
                bm, bn = boxes[m], boxes[n]
                if bm[0] > bn[2] or bn[0] > bm[2] or bm[1] > bn[3] or bn[1] > bm[3]:
                    continue  # bounding boxes apart
                k1, i1, p, q = segs[m]
                k2, i2, r, s = segs[n]
                if k1 == k2 and abs(i1 - i2) == 1:
                    continue
                shared = {p, q} & {r, s}
                if shared and all(pt in allowed for pt in shared):
                    # they meet at a crossing: allowed unless they also overlap elsewhere
                    if not _overlap_beyond(p, q, r, s):
                        continue
                if k1 == k2 and abs(i1 - i2) == len(polylines[k1]) - 2 and shared:
                    if not _overlap_beyond(p, q, r, s):
                        continue  # first and last segment of a closed curve
                if _segments_cross(p, q, r, s):
                    bad.add((k1, k2) if str(k1) <= str(k2) else (k2, k1))
    return sorted(bad, key=str)


def _overlap_beyond(p, q, r, s) -> bool:
    """Two segments sharing an endpoint overlap along a stretch (collinear, same side)."""
    common = p if p in (r, s) else q
    a = q if common == p else p
    b = s if common == r else r
    cross = (a[0] - common[0]) * (b[1] - common[1]) - (a[1] - common[1]) * (b[0] - common[0])
    dot = (a[0] - common[0]) * (b[0] - common[0]) + (a[1] - common[1]) * (b[1] - common[1])
    return abs(cross) < 1e-15 and dot > 0
