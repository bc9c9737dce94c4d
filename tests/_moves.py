"""Test helpers: diagrams made bigger by inverse Reidemeister moves, and connected sums.

Written directly on PD codes, independently of pipeline.diagrams.simplify / reidemeister,
and validated (Diagram.from_pd) after every step.
"""

from __future__ import annotations

import random
from fractions import Fraction

from pipeline.diagrams.diagram import Diagram

def _rank(pd, loops):
    labels = sorted({v for x in pd for v in x})
    r = {v: k + 1 for k, v in enumerate(labels)}
    return Diagram.from_pd([tuple(r[v] for v in x) for x in pd], free_loops=loops)


def _gap(labels, v):
    above = [u for u in labels if u > v]
    nxt = min(above) if above else v + 1
    return (Fraction(nxt) - v) / 3


def _is_head(d: Diagram, i: int, s: int) -> bool:
    return s == 0 or s == (3 if d.signs[i] > 0 else 1)


def inverse_r1(d: Diagram, rng: random.Random) -> Diagram:
    """Insert a kink (one of the four kinds, chosen at random) on a random edge."""
    pd = [list(x) for x in d.pd]
    v = rng.choice(d.labels)
    (i, s), (j, t) = d._slots_of[v]
    if not _is_head(d, i, s):
        (i, s), (j, t) = (j, t), (i, s)      # (i, s) is now the head of edge v
    g = _gap(d.labels, v)
    e, loop, out = Fraction(v), v + g, v + 2 * g
    pd[i][s] = out
    kind = rng.randrange(4)
    pd.append([(e, loop, loop, out), (e, out, loop, loop),
               (loop, loop, out, e), (loop, e, out, loop)][kind])
    return _rank(pd, d.free_loops)


def inverse_r2(d: Diagram, rng: random.Random) -> Diagram:
    """Push one edge of a random face across another edge of the same face."""
    faces = [f for f in d.faces if len(f) >= 2]
    f = rng.choice(faces)
    a, c = rng.sample(range(len(f)), 2)
    pd = [list(x) for x in d.pd]
    A, C = f[a], f[c]
    B, D = d.twin(A), d.twin(C)
    ev, fv = d.pd[A[0]][A[1]], d.pd[C[0]][C[1]]
    ge, gf = _gap(d.labels, ev), _gap(d.labels, fv)
    e_fwd = _is_head(d, *B)            # e oriented A -> B
    f_fwd = _is_head(d, *D)
    e1, em, e3 = (ev, ev + ge, ev + 2 * ge) if e_fwd else (ev + 2 * ge, ev + ge, ev)
    f1, fm, f3 = (fv, fv + gf, fv + 2 * gf) if f_fwd else (fv + 2 * gf, fv + gf, fv)
    e1, em, e3, f1, fm, f3 = map(Fraction, (e1, em, e3, f1, fm, f3))
    pd[A[0]][A[1]], pd[B[0]][B[1]] = e1, e3
    pd[C[0]][C[1]], pd[D[0]][D[1]] = f1, f3
    p1 = [fm, e1, f3, em]              # counterclockwise from +x (derivation in notes)
    p2 = [f1, e3, fm, em]
    e_under = rng.random() < 0.5
    for x, (e_in, f_in) in ((p1, (e1 if e_fwd else em, fm if f_fwd else f3)),
                            (p2, (em if e_fwd else e3, f1 if f_fwd else fm))):
        start = x.index(e_in if e_under else f_in)
        pd.append(x[start:] + x[:start])
    return _rank(pd, d.free_loops)


def complicate(d: Diagram, moves: int, seed: int) -> Diagram:
    """Apply ``moves`` random inverse R1 / R2 moves; every step is a validated diagram."""
    rng = random.Random(seed)
    for _ in range(moves):
        if d.n_crossings == 0:
            d = inverse_r1(Diagram.from_pd([[1, 2, 2, 1]], free_loops=d.free_loops - 1), rng) \
                if d.free_loops else d
            continue
        d = inverse_r1(d, rng) if rng.random() < 0.4 else inverse_r2(d, rng)
    return d


# Notes on inverse_r2: the face lies to the right of each edge traced from a face slot to
# its twin (Diagram.faces turns counterclockwise).  Put e on y = 0 traced in +x and f on
# y = -1 traced in -x; e dips below f, meeting it at P1 = (-1,-1) then P2 = (1,-1).
# Counterclockwise from +x, P1 sees (f toward P2, e toward A, f toward D, e toward P2)
# and P2 sees (f toward C, e toward B, f toward P1, e toward P1).




def connected_sum(d1: Diagram, v: int, d2: Diagram, w: int) -> Diagram:
    """d1 # d2 along edge v of d1 and edge w of d2 (the strand runs v, then d2 from w on).

    Cutting both edges and joining tail(v) -> head(w), tail(w) -> head(v) is planar (the
    two edges are put side by side in a common face of the disjoint union).
    """
    comp = next(c for c in d2.components if w in c)
    k = comp.index(w)
    order = comp[k + 1:] + comp[:k]                # d2 edges after w, in orientation order
    L = len(comp)
    big = max(d1.labels) + 1
    m = {u: Fraction(v) + Fraction(j + 1, L) for j, u in enumerate(order)}
    vv = Fraction(v) + Fraction(L - 1, L) + Fraction(1, 2 * L)  # the edge back into d1
    m.update({u: big + u for u in d2.labels if u not in m and u != w})
    pd1 = [[Fraction(u) for u in x] for x in d1.pd]
    pd2 = [[m.get(u) for u in x] for x in d2.pd]
    (i, s), (j, t) = d1._slots_of[v]
    if not _is_head(d1, i, s):
        (i, s), (j, t) = (j, t), (i, s)
    pd1[i][s] = vv
    (p, q), (r, u) = d2._slots_of[w]
    if not _is_head(d2, p, q):
        (p, q), (r, u) = (r, u), (p, q)
    pd2[p][q], pd2[r][u] = Fraction(v), vv
    return _rank(pd1 + pd2, d1.free_loops + d2.free_loops)
