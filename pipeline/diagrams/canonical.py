"""Canonical form of a diagram: the same diagram on the sphere gets the same text.

Which diagrams count as "the same"
----------------------------------
A PD code is combinatorial: the counterclockwise order of the four slots of each
crossing is a rotation system, so a PD code *is* a 4-valent map on the oriented
sphere with over/under data.  :func:`canonical_text` identifies two codes when

1. the edges are relabelled (any bijection of labels);
2. the crossings are listed in another order, or a component is started elsewhere;
3. any subset of the components has its orientation reversed (the canonical form
   describes the *unoriented* diagram; orientations are re-chosen canonically);
4. an orientation-preserving homeomorphism of the sphere carries one diagram to the
   other (automatic: a PD code cannot see one), e.g. the rotation by π in the plane
   that takes the pretzel diagram P(3,5,7) to P(7,5,3), or the sphere move that
   takes P(3,5,7) to P(5,7,3);
5. the diagram is *turned over*: reflect the projection plane **and** change every
   crossing.  That composite is a rotation by π of 3-space about an axis in the
   plane, an isotopy, and it is the same picture seen from the other side of the
   sphere.

Not identified: a reflection of the plane that keeps over/under.  It is the
restriction of an orientation-reversing map of 3-space, so it produces a diagram of
the *mirror* link (equivalently: changing every crossing alone gives the mirror).
A diagram and its mirror therefore get different ids unless the diagram itself has
that symmetry.

Split diagrams: a PD code does not record in which face of one piece another piece
lies, so each connected piece is canonicalised on its own (including its own
turn-over) and the pieces are sorted; free loops are counted.

Method
------
For every directed start (a slot entered, 4 per crossing) of a piece, and for the
piece and its turn-over, the piece is walked deterministically: along the current
component straight through each crossing; a component met for the first time at a
crossing is oriented so that it enters through the slot counterclockwise after the
one we entered by, and is queued (components are taken in order of first meeting).
Each passage emits one integer (first-visit index of the crossing, over/under, and on
which side the other strand enters); this signed extended Gauss code determines the
map (the local rotation is recovered from over/under and side).  The smallest code
wins, compared lazily so most starts stop after a few steps.  When a start ties with
the best so far, the correspondence of the two walks is an automorphism of the map;
starts in a cycle of that automorphism through an already seen start are skipped, so
highly symmetric diagrams (torus knots) do not cost n² work per symmetry.  Worst case
O(n²) per piece: long twist regions, where walks from neighbouring starts agree until
the end of the region (measured: P(500,500,500,500), 2000 crossings, about 4 s; torus
and two-bridge diagrams of 800 crossings in 20-50 ms, reports/bench_classify.md).

The canonical text is the PD code relabelled by the best walk (labels 1, 2, … along
each component in walk order, crossings sorted), so it is itself a valid ``pd:``
notation string; ``diagram_id`` is its sha256 hex digest.

References
----------
1. L. H. Kauffman, the paper introducing virtual knots, European J. Combin. 20 (1999): a signed
   Gauss code with over/under determines the diagram on its surface.
2. L. Weinberg, "A simple and efficient algorithm for determining isomorphism of
   planar triply connected graphs", IEEE Trans. Circuit Theory 13 (1966): canonical
   codes of maps by trying every starting dart.
"""

from __future__ import annotations

import hashlib
import json

from .diagram import Diagram

__all__ = ["canonical_text", "diagram_id", "turn_over_pd", "canonical_pd"]


def turn_over_pd(pd) -> list[tuple[int, int, int, int]]:
    """The PD code of the diagram turned over (plane reflected and every crossing changed).

    The labels, orientations and crossing signs are kept: (a,b,c,d) positive becomes
    (d,c,b,a), negative becomes (b,a,d,c).
    """
    d = Diagram.from_pd(pd) if not isinstance(pd, Diagram) else pd
    out = []
    for (a, b, c, e), s in zip(d.pd, d.signs):
        out.append((e, c, b, a) if s > 0 else (b, a, e, c))
    return out


def _twins(pd) -> list[int]:
    """twin[4i+s] = flat slot at the other end of the edge at slot (i, s)."""
    where: dict[int, list[int]] = {}
    for i, x in enumerate(pd):
        for s, v in enumerate(x):
            where.setdefault(v, []).append(4 * i + s)
    tw = [0] * (4 * len(pd))
    for a, b in where.values():
        tw[a], tw[b] = b, a
    return tw


def _reference(tw) -> tuple[list[int], list[bool]]:
    """(component id, is-entry in a reference orientation) for every flat slot."""
    n4 = len(tw)
    comp = [-1] * n4
    entry = [False] * n4
    c = 0
    for s0 in range(n4):
        if comp[s0] >= 0:
            continue
        s = s0
        while True:
            i, r = divmod(s, 4)
            out = 4 * i + (r + 2) % 4
            comp[s] = comp[out] = c
            entry[s] = True
            s = tw[out]
            if s == s0:
                break
        c += 1
    return comp, entry


def _walk(tw, comp, ref, start: int, best: list[int] | None):
    """Code of the walk from entry slot ``start``; stop early when it exceeds ``best``.

    Returns (code, entries, status) where status is -1 (smaller than best, or no
    best), 0 (equal), 1 (larger; code truncated).  ``entries`` lists the entered
    slots in walk order, with None between components.  A component's direction is
    +1 (reference orientation) or -1, fixed where the walk first meets it.
    """
    direction = {comp[start]: 1 if ref[start] else -1}
    order: dict[int, int] = {}     # crossing -> first visit index
    code: list[int] = []
    entries: list[int | None] = []
    queue = [start]
    qi = 0
    pos = 0
    state = -1 if best is None else 0
    while qi < len(queue):
        s0 = queue[qi]
        qi += 1
        if qi > 1:
            tok = -1
            if state == 0:
                b = best[pos] if pos < len(best) else None
                if b is None or tok > b:
                    return code, entries, 1
                if tok < b:
                    state = -1
            code.append(tok)
            entries.append(None)
            pos += 1
        s = s0
        while True:
            i, r = divmod(s, 4)
            left = 4 * i + (r + 1) % 4
            c = comp[left]
            dc = direction.get(c)
            if dc is None:                   # meet a new component: orient and queue it
                dc = direction[c] = 1 if ref[left] else -1
                queue.append(left)
            other_left = 1 if ref[left] == (dc == 1) else 0
            k = order.setdefault(i, len(order))
            tok = 4 * k + 2 * (r % 2) + other_left
            if state == 0:
                b = best[pos] if pos < len(best) else None
                if b is None or tok > b:
                    return code, entries, 1
                if tok < b:
                    state = -1
            code.append(tok)
            entries.append(s)
            pos += 1
            s = tw[4 * i + (r + 2) % 4]
            if s == s0:
                break
    if state == 0 and pos < len(best):
        state = -1
    return code, entries, state


def _best_code(pd, slots: list[int], prune: bool = True):
    """(code, entries) minimal over all starts in ``slots`` (one piece)."""
    tw = _twins(pd)
    comp, ref = _reference(tw)
    best = best_entries = None
    skip: set[int] = set()
    seen: list[int] = []
    for st in slots:
        if st in skip:
            continue
        code, entries, status = _walk(tw, comp, ref, st, best)
        if status < 0:
            best, best_entries = code, entries
        elif status == 0 and prune:
            _skip_by_automorphism(best_entries, entries, seen + [st], skip)
        seen.append(st)
        skip.add(st)
    return best, best_entries


def _skip_by_automorphism(ea, eb, seen: list[int], skip: set[int]) -> None:
    """Two walks with equal codes differ by a map automorphism phi; skip the
    starts on phi-cycles through already seen starts."""
    phi: dict[int, int] = {}
    for a, b in zip(ea, eb):
        if a is None:
            continue
        ia, ra = divmod(a, 4)
        ib, rb = divmod(b, 4)
        for t in range(4):
            phi[4 * ia + (ra + t) % 4] = 4 * ib + (rb + t) % 4
    for s in seen:
        x = phi.get(s)
        while x is not None and x not in skip:
            skip.add(x)
            x = phi.get(x)


def _relabelled(pd, entries) -> list[tuple[int, int, int, int]]:
    """PD code with labels in walk order; ``entries`` from :func:`_walk`."""
    label: dict[int, int] = {}     # flat slot -> label
    comps: list[list[int]] = [[]]
    for e in entries:
        if e is None:
            comps.append([])
        else:
            comps[-1].append(e)
    k = 0
    under_entry: dict[int, int] = {}
    for comp in comps:
        n = len(comp)
        for j, s in enumerate(comp):
            i, r = divmod(s, 4)
            label[s] = k + j + 1
            label[4 * i + (r + 2) % 4] = k + (j + 1) % n + 1
            if r % 2 == 0:
                under_entry[i] = r
        k += n
    out = []
    for i in range(len(pd)):
        u = under_entry[i]  # every under-passage is walked exactly once
        out.append(tuple(label[4 * i + (u + t) % 4] for t in range(4)))
    return out


def canonical_pd(diagram: Diagram, *, prune: bool = True) -> tuple[list[list[tuple[int, int, int, int]]], int]:
    """(canonical PD code of each piece, sorted; number of free loops).

    ``prune=False`` switches the automorphism pruning off (same result, slower on
    symmetric diagrams; used by the benchmark and the tests).
    """
    pd = diagram.pd
    turned = turn_over_pd(diagram) if pd else []
    pieces = []
    for piece in diagram.pieces:
        local = {i: k for k, i in enumerate(piece)}
        sub = [pd[i] for i in piece]
        sub_t = [turned[i] for i in piece]
        slots = [4 * local[i] + r for i in piece for r in range(4)]
        c1, e1 = _best_code(sub, slots, prune)
        c2, e2 = _best_code(sub_t, slots, prune)
        if c2 < c1:
            pieces.append((c2, _relabelled(sub_t, e2)))
        else:
            pieces.append((c1, _relabelled(sub, e1)))
    pieces.sort(key=lambda p: (len(p[0]), p[0]))
    out, shift = [], 0
    for _, code in pieces:
        out.append(sorted(tuple(v + shift for v in x) for x in code))
        shift += 2 * len(code)
    return out, diagram.free_loops


def canonical_text(diagram: Diagram) -> str:
    """Canonical ``pd:`` text of ``diagram`` (see the module docstring for the symmetries).

    Parameters
    ----------
    diagram : Diagram

    Returns
    -------
    str
        ``pd:[...]`` with labels renumbered by the canonical walk, crossings sorted,
        pieces in canonical order, and `` loops=k`` when there are free loops.

    Examples
    --------
    >>> from pipeline.diagrams.notation import parse
    >>> canonical_text(parse("pretzel:3,5,7")) == canonical_text(parse("pretzel:5,7,3"))
    True
    """
    pieces, loops = canonical_pd(diagram)
    flat = [list(x) for p in pieces for x in p]
    text = "pd:" + json.dumps(flat, separators=(",", ":"))
    if loops:
        text += f" loops={loops}"
    return text


def diagram_id(diagram: Diagram) -> str:
    """sha256 hex digest of :func:`canonical_text`."""
    return hashlib.sha256(canonical_text(diagram).encode()).hexdigest()
