"""The plane graph of a PD code: faces, connected pieces, the planarity test.

A face is traced by leaving a crossing along the edge at slot ``(i, s)``, arriving at
its twin ``(j, t)`` and turning to the next slot counterclockwise ``(j, t+1)``.  A
connected plane 4-valent graph with c crossings has c + 2 faces (Euler's formula
V − E + F = 2 with E = 2V); a PD code whose traced faces miss that count is not
planar, i.e. it is a virtual diagram (L. Kauffman, European
J. Combin. 20 (1999)).

These functions work on the raw crossing tuples, so the DT realiser can test
candidate codes before a :class:`~pipeline.diagrams.diagram.Diagram` exists.
"""

from __future__ import annotations

from typing import Sequence

from ..errors import DiagramError
from ..numbers import UnionFind

__all__ = ["slots_of", "trace_faces", "connected_pieces", "check_planar"]

#: A crossing slot: (crossing index, position 0..3 in the counterclockwise tuple).
Slot = tuple[int, int]


def slots_of(pd: Sequence[Sequence[int]]) -> dict[int, list[Slot]]:
    """Map each edge label to the slots it occupies (two in a valid code)."""
    where: dict[int, list[Slot]] = {}
    for i, x in enumerate(pd):
        for s, v in enumerate(x):
            where.setdefault(v, []).append((i, s))
    return where


def trace_faces(pd: Sequence[Sequence[int]],
                where: dict[int, list[Slot]] | None = None) -> tuple[tuple[Slot, ...], ...]:
    """Faces of the plane graph of ``pd`` (every label on exactly two slots), each a
    cycle of slots, listed in order of their first slot (crossing, then position).

    Examples
    --------
    >>> len(trace_faces([(1, 5, 2, 4), (3, 1, 4, 6), (5, 3, 6, 2)]))   # trefoil: 3 + 2
    5
    """
    where = slots_of(pd) if where is None else where
    seen: set[Slot] = set()
    out = []
    for i in range(len(pd)):
        for s in range(4):
            if (i, s) in seen:
                continue
            cyc, h = [], (i, s)
            while h not in seen:
                seen.add(h)
                cyc.append(h)
                a, b = where[pd[h[0]][h[1]]]
                j, t = b if a == h else a
                h = (j, (t + 1) % 4)
            out.append(tuple(cyc))
    return tuple(out)


def connected_pieces(pd: Sequence[Sequence[int]],
                     where: dict[int, list[Slot]] | None = None) -> list[list[int]]:
    """Connected pieces of the diagram as sorted lists of crossing indices (sorted)."""
    where = slots_of(pd) if where is None else where
    uf = UnionFind(range(len(pd)))
    for ends in where.values():
        uf.union(ends[0][0], ends[1][0])
    return sorted(uf.groups().values())


def check_planar(pd: Sequence[Sequence[int]], pieces: list[list[int]],
                 faces: tuple[tuple[Slot, ...], ...]) -> None:
    """Raise :class:`DiagramError` unless each piece with c crossings has c + 2 faces."""
    piece_of = {i: p for p, xs in enumerate(pieces) for i in xs}
    faces_per_piece: dict[int, int] = {}
    for f in faces:
        p = piece_of[f[0][0]]
        faces_per_piece[p] = faces_per_piece.get(p, 0) + 1
    for p, xs in enumerate(pieces):
        if faces_per_piece.get(p, 0) != len(xs) + 2:
            raise DiagramError(
                f"pd: not planar: the piece with crossings {[i + 1 for i in sorted(xs)][:6]}"
                f"{'...' if len(xs) > 6 else ''} has {len(xs)} crossings but "
                f"{faces_per_piece.get(p, 0)} faces (a planar diagram has {len(xs) + 2}; "
                f"this is a virtual diagram)")
