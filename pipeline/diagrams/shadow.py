"""Fast flat-array form of diagrams as 4-valent maps, for flypes and the enumeration.

A diagram with n crossings is held as a *twin array* ``tw`` of length 4n (flat slot
``4i + r`` is slot r, counterclockwise, of crossing i; ``tw[h]`` is the slot at the
other end of its edge) plus ``over[i]`` = True when the over-strand of crossing i
uses slots 1, 3.  Every PD crossing has its over-strand on slots 1, 3; the builder
turns an array back into a :class:`Diagram`.  These helpers avoid building and
validating a PD code per step in the inner loops of the flype orbit search and the
enumeration; :mod:`pipeline.diagrams.flype` documents the mathematics.

The *alternating code* of a connected alternating diagram is a map code in the sense
of L. Weinberg (IEEE Trans. Circuit Theory 13, 1966): from a start dart and a sense of
rotation (counterclockwise, or clockwise = the reflected map) the crossings are
numbered breadth-first and each dart emits (number of the far crossing, its slot
relative to that crossing's entry slot); the smallest code over all starts wins.
For an alternating diagram the crossing information is fixed by the map and one bit:
whether the start dart is over, XOR whether the rotation is reflected.  Turning the
diagram over reflects the plane and changes every crossing, which keeps the bit, so
the smallest code among starts with bit 0 (``code0``) names the diagram up to sphere
isotopy and turning over; the mirror image (every crossing changed) swaps the bits,
so its code is ``code1``.  Orientations are not part of the map: the code names the
unoriented diagram.
"""

from __future__ import annotations

from typing import Iterator, NamedTuple

from .builder import PlanarBuilder
from .diagram import Diagram

__all__ = [
    "twins", "faces", "prime_reduced", "n_components", "alternating_over", "to_diagram",
    "alternating_codes", "walk", "ShadowFlype", "shadow_flypes", "apply_shadow_flype", "extensions",
]


def twins(d: Diagram) -> list[int]:
    """The twin array of a diagram (its over-strands are on slots 1, 3)."""
    tw = [0] * (4 * len(d.pd))
    for (i, s), (j, t) in d._slots_of.values():
        tw[4 * i + s], tw[4 * j + t] = 4 * j + t, 4 * i + s
    return tw


def _next_in_face(tw: list[int], h: int) -> int:
    g = tw[h]
    return (g & ~3) | ((g + 1) & 3)


def faces(tw: list[int]) -> list[int]:
    """Face number of every slot: walk along the edge, then to the next slot ccw.

    The corner between slots t and t+1 of crossing j lies in the face of slot (j, t+1).
    """
    face = [-1] * len(tw)
    k = 0
    for h0 in range(len(tw)):
        if face[h0] < 0:
            h = h0
            while face[h] < 0:
                face[h] = k
                h = _next_in_face(tw, h)
            k += 1
    return face


def prime_reduced(tw: list[int]) -> bool:
    """No nugatory crossing and no two faces sharing two edges (visibly prime)."""
    face = faces(tw)
    for b in range(0, len(tw), 4):
        if face[b] == face[b + 2] or face[b + 1] == face[b + 3]:
            return False
    pairs = set()
    for h, g in enumerate(tw):
        if h < g:
            p = (face[h], face[g]) if face[h] < face[g] else (face[g], face[h])
            if p in pairs:
                return False
            pairs.add(p)
    return True


def n_components(tw: list[int]) -> int:
    """Number of link components (straight-through circuits)."""
    seen = [False] * len(tw)
    k = 0
    for h0 in range(len(tw)):
        if not seen[h0]:
            k += 1
            h = h0
            while not seen[h]:
                seen[h] = seen[h ^ 2] = True
                h = tw[h ^ 2]
    return k


def alternating_over(tw: list[int]) -> list[bool]:
    """Over flags of the alternating diagram on a connected shadow (one of the pair).

    Faces are checkerboard coloured; crossing i has its over-strand on slots 1, 3 iff its
    corner (0, 1) is coloured 0, the same rotational rule at every crossing.
    """
    face = faces(tw)
    beside: dict[int, list[int]] = {}
    for h, g in enumerate(tw):
        beside.setdefault(face[h], []).append(face[g])
    colour = {face[0]: 0}
    stack = [face[0]]
    while stack:
        f = stack.pop()
        for g in beside[f]:
            if g not in colour:
                colour[g] = 1 - colour[f]
                stack.append(g)
    return [colour[face[h + 1]] == 0 for h in range(0, len(tw), 4)]


def to_diagram(tw: list[int], over: list[bool]) -> Diagram:
    """The :class:`Diagram` of a twin array with over flags (labels by the builder)."""
    b = PlanarBuilder()
    for o in over:
        b.crossing(over_odd=o)
    for h, g in enumerate(tw):
        if h < g:
            b.join((h >> 2, h & 3), (g >> 2, g & 3))
    return b.diagram()


def walk(tw: list[int], h: int, eps: int, best):
    """Map code from dart ``h`` in rotation sense ``eps``, with the crossings in the order
    met and the slot each was entered by: ``(code, order, ref, less)``, ``less`` = code <
    ``best``; None as soon as the code exceeds ``best`` (None: no bound)."""
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
    return code, order, ref, less


def _walk(tw: list[int], h: int, eps: int, best):
    """Map code from dart ``h`` in rotation sense ``eps``; None unless smaller than best."""
    w = walk(tw, h, eps, best)
    return w[0] if w is not None and w[3] else None


_NONE = float("inf")  # above every start invariant


def alternating_codes(tw: list[int], over: list[bool]) -> tuple[tuple[int, ...], tuple[int, ...]]:
    """(code0, code1): the codes of the alternating diagram and of its mirror image.

    Only the starts whose local picture is smallest are walked: the degrees of the
    four corner faces at the start crossing and at the far end of the start dart,
    read in the rotation sense of the walk (an isomorphism-invariant choice, so the
    minimum stays canonical).
    """
    face = faces(tw)
    deg = [0] * (max(face) + 1)
    for f in face:
        deg[f] += 1
    dg = [deg[f] for f in face]  # dg[4i + k]: degree of corner (k-1, k) of crossing i
    size = len(tw)
    # rot[4i + r]: the four corner degrees at crossing i from slot r, ccw and cw
    ccw, cw = [0] * size, [0] * size
    for q in range(0, size, 4):
        d0, d1, d2, d3 = dg[q], dg[q + 1], dg[q + 2], dg[q + 3]
        ccw[q] = ((d1 * 64 + d2) * 64 + d3) * 64 + d0
        ccw[q + 1] = ((d2 * 64 + d3) * 64 + d0) * 64 + d1
        ccw[q + 2] = ((d3 * 64 + d0) * 64 + d1) * 64 + d2
        ccw[q + 3] = ((d0 * 64 + d1) * 64 + d2) * 64 + d3
        cw[q] = ((d0 * 64 + d3) * 64 + d2) * 64 + d1
        cw[q + 1] = ((d1 * 64 + d0) * 64 + d3) * 64 + d2
        cw[q + 2] = ((d2 * 64 + d1) * 64 + d0) * 64 + d3
        cw[q + 3] = ((d3 * 64 + d2) * 64 + d1) * 64 + d0
    # bit of a start (h, eps): (slot h over) XOR (eps reflected)
    par = [((h & 1) == 1) == over[h >> 2] for h in range(size)]
    inv_ccw = [ccw[h] * 16777216 + ccw[tw[h]] for h in range(size)]
    inv_cw = [cw[h] * 16777216 + cw[tw[h]] for h in range(size)]
    out = []
    for b in (0, 1):
        want = b == 1  # ccw starts with par == want, cw starts with par != want
        low = min(min((inv_ccw[h] for h in range(size) if par[h] == want), default=_NONE),
                  min((inv_cw[h] for h in range(size) if par[h] != want), default=_NONE))
        best = None
        for eps, inv, sel in ((1, inv_ccw, want), (-1, inv_cw, not want)):
            for h in range(size):
                if par[h] == sel and inv[h] == low:
                    code = _walk(tw, h, eps, best)
                    if code is not None:
                        best = code
        out.append(tuple(best))
    return out[0], out[1]


class ShadowFlype(NamedTuple):
    """A flype at crossing ``c``: its slots s, s+1 go into the tangle; ``x``, ``y`` are
    (inside slot, outside slot) of the tangle's other two ends (x beside slot s+1)."""

    c: int
    s: int
    x: tuple[int, int]
    y: tuple[int, int]
    tangle: frozenset


def _tangle(tw: list[int], c: int, s: int, cut: set[int]) -> frozenset | None:
    """Crossings cut off from ``c`` by the four edges ``cut`` (edge id = smaller slot)."""
    start = {tw[4 * c + s] >> 2, tw[4 * c + (s + 1) % 4] >> 2}
    if c in start:
        return None
    inside, stack = set(start), list(start)
    while stack:
        i = stack.pop()
        for h in range(4 * i, 4 * i + 4):
            g = tw[h]
            if min(h, g) in cut:
                continue
            j = g >> 2
            if j == c:
                return None
            if j not in inside:
                inside.add(j)
                stack.append(j)
    leaving = 0
    for i in inside:
        for h in range(4 * i, 4 * i + 4):
            if (tw[h] >> 2) not in inside:
                if min(h, tw[h]) not in cut:
                    return None
                leaving += 1
    return frozenset(inside) if leaving == 4 else None


def shadow_flypes(tw: list[int], *, only: int | None = None) -> Iterator[ShadowFlype]:
    """Every flype whose tangle has at least two crossings and leaves two outside
    (only those at crossing ``only`` when given)."""
    face = faces(tw)
    adj: dict[int, dict[int, list[int]]] = {}
    for h, g in enumerate(tw):
        if h < g:
            f, e = face[h], face[g]
            adj.setdefault(f, {}).setdefault(e, []).append(h)
            if e != f:
                adj.setdefault(e, {}).setdefault(f, []).append(h)
    n = len(tw) // 4
    for c in range(n) if only is None else (only,):
        c_edges = {min(h, tw[h]) for h in range(4 * c, 4 * c + 4)}
        for s in range(4):
            f0, f1 = face[4 * c + (s + 1) % 4], face[4 * c + (s + 2) % 4]
            f3, f4 = face[4 * c + s], face[4 * c + (s + 3) % 4]
            for f2, xs in adj[f1].items():
                if f2 in (f0, f1, f3, f4) or f2 not in adj[f3]:
                    continue
                for x in xs:
                    for y in adj[f3][f2]:
                        if x == y or x in c_edges or y in c_edges:
                            continue
                        cut = {min(4 * c + s, tw[4 * c + s]),
                               min(4 * c + (s + 1) % 4, tw[4 * c + (s + 1) % 4]), x, y}
                        t = _tangle(tw, c, s, cut)
                        if t is None or not 1 < len(t) < n - 1:
                            continue
                        xe = (x, tw[x]) if (x >> 2) in t else (tw[x], x)
                        ye = (y, tw[y]) if (y >> 2) in t else (tw[y], y)
                        yield ShadowFlype(c, s, xe, ye, t)


def apply_shadow_flype(tw: list[int], over: list[bool], move: ShadowFlype) -> tuple[list[int], list[bool]]:
    """(twins, over) after the flype: the tangle turned over, the crossing moved across.

    Picture: c's slots s = SE, s+1 = NE meet the tangle's SW, NW ends; x is the tangle's
    NE end, y its SE end.  The tangle's rotations are reflected and its crossings
    changed (a rotation by π about the horizontal axis); the crossing, drawn as before,
    now joins the tangle's new east ends to the old far ends of x and y.
    """
    c, s, (x_in, x_out), (y_in, y_out), t = move

    def at(h: int) -> int:
        i = h >> 2
        return 4 * i + ((-h) & 3) if i in t else h

    new = [0] * len(tw)

    def join(p: int, q: int) -> None:
        new[p], new[q] = q, p

    cs = [4 * c + (s + k) % 4 for k in range(4)]  # SE, NE, NW, SW
    special = {min(h, tw[h]) for h in cs} | {min(x_in, x_out), min(y_in, y_out)}
    for h, g in enumerate(tw):
        if h < g and h not in special:
            join(at(h), at(g))
    join(at(tw[cs[2]]), at(tw[cs[0]]))
    join(at(tw[cs[3]]), at(tw[cs[1]]))
    join(at(y_in), cs[2])
    join(at(x_in), cs[3])
    join(cs[1], at(x_out))
    join(cs[0], at(y_out))
    return new, [(not o) if i in t else o for i, o in enumerate(over)]


def extensions(tw: list[int]) -> Iterator[list[int]]:
    """Shadows with one more crossing: two edges of one face pulled into a crossing.

    The inverse of smoothing a crossing (deleting or contracting the edge of the Tait
    graph); the new crossing's slots, counterclockwise, face the old ends h_a, g_b, h_b,
    g_a, where the face is walked h_a -> g_a ... h_b -> g_b with the face on the right.
    """
    face = faces(tw)
    cycles: dict[int, list[int]] = {}
    for h, f in enumerate(face):
        if f not in cycles:
            cyc, k = [], h
            while True:
                cyc.append(k)
                k = _next_in_face(tw, k)
                if k == h:
                    break
            cycles[f] = cyc
    x = len(tw)
    for cyc in cycles.values():
        for a in range(len(cyc)):
            ha = cyc[a]
            ga = tw[ha]
            for b in range(a + 1, len(cyc)):
                hb = cyc[b]
                gb = tw[hb]
                if hb == ga or gb == ha:
                    continue
                new = tw + [0, 0, 0, 0]
                for p, q in ((ha, x), (gb, x + 1), (hb, x + 2), (ga, x + 3)):
                    new[p], new[q] = q, p
                yield new
