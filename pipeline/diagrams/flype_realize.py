"""The diagram named by a compositional flype code (``ft:``; :mod:`pipeline.diagrams.flype_tree`).

A code describes one member of its flype class completely: every bond and cycle with its
real edges gathered in the gap it is read from, every rigid skeleton by its map code, and
every child by its own code in the orientation it is read in.  :func:`realize` rebuilds
that member as a plane multigraph (rotation system) piece by piece and returns the
alternating diagram whose Tait graph (A-corner faces) it is: the medial map, one crossing
per edge.  It is deterministic in the code, and the tests check
``tree_code(realize(code)) == code``.

A piece is built between two given vertices and returns, at each pole, the list of its
edges counterclockwise starting after the rest of the graph (the reading convention of
the encoder).  In the member a code describes, every child is read in the sense of its
parent (its twist is already in its own code), so everything is built in one sense.
"""

from __future__ import annotations

from ..errors import NotationError
from .diagram import Diagram
from .shadow import to_diagram

__all__ = ["realize", "medial"]


class _Bad(NotationError):
    pass


def medial(ends, rot) -> list[int]:
    """Twin array of the medial map of a plane multigraph, crossing i = edge i.

    Crossing i sits on edge (u, v) = ends[i]: slot 1 goes to the next edge around u,
    slot 2 to the previous one, slot 3 to the next around v, slot 0 to the previous
    (so the corners at u and v lie in the faces of slots 2 and 0).
    """
    tw = [0] * (4 * len(ends))
    for w, r in enumerate(rot):
        for i, e in enumerate(r):
            f = r[(i + 1) % len(r)]
            a = 4 * e + (1 if ends[e][0] == w else 3)
            b = 4 * f + (2 if ends[f][0] == w else 0)
            tw[a], tw[b] = b, a
    return tw


class _Builder:
    def __init__(self):
        self.ends: list[list[int]] = []
        self.rot: dict[int, list[int]] = {}
        self.nv = 0

    def vertex(self) -> int:
        self.nv += 1
        return self.nv - 1

    def edge(self, u: int, v: int) -> int:
        self.ends.append([u, v])
        return len(self.ends) - 1


class _Parser:
    def __init__(self, text: str):
        self.s, self.i = text, 0

    def peek(self) -> str:
        return self.s[self.i] if self.i < len(self.s) else ""

    def take(self, ch: str) -> None:
        if self.peek() != ch:
            raise _Bad(f"ft: expected {ch!r} at position {self.i}")
        self.i += 1

    def int(self) -> int:
        j = self.i
        while self.peek().isdigit():
            self.i += 1
        if j == self.i:
            raise _Bad(f"ft: expected a number at position {j}")
        return int(self.s[j:self.i])


def _piece(ps: _Parser, b: _Builder, p0: int, p1: int, root: bool):
    """Parse one code and build it between vertices p0, p1; returns the blocks
    (edges at p0, edges at p1), counterclockwise after the rest."""
    tag = ps.peek()
    ps.i += 1
    if tag and tag in "PS":
        real = ps.int()
        ps.take("[")
        items = [None] * real
        while ps.peek() != "]":
            items.append(ps.i)
            _skip(ps)
            if ps.peek() == ",":
                ps.i += 1
        ps.take("]")
        end = ps.i
        blocks = []
        if tag == "P":
            for it in items:
                blocks.append(_element(ps, b, it, p0, p1))
            ps.i = end
            b0 = [e for x, _ in blocks for e in x]
            b1 = [e for _, y in reversed(blocks) for e in y]
            return b0, b1
        verts = [p0] + [b.vertex() for _ in range(len(items) - 1)] + [p0 if root else p1]
        for k, it in enumerate(items):
            blocks.append(_element(ps, b, it, verts[k], verts[k + 1]))
        ps.i = end
        for k in range(1, len(items)):
            b.rot[verts[k]] = blocks[k - 1][1] + blocks[k][0]
        if root:
            return blocks[0][0] + blocks[-1][1], []
        return blocks[0][0], blocks[-1][1]
    if tag == "R":
        return _rigid(ps, b, p0, p1, root)
    raise _Bad(f"ft: unexpected {tag!r} at position {ps.i - 1}")


def _element(ps, b, it, u, v):
    if it is None:
        e = b.edge(u, v)
        return [e], [e]
    ps.i = it
    return _piece(ps, b, u, v, False)


def _skip(ps: _Parser) -> None:
    depth = 0
    while True:
        ch = ps.peek()
        if ch == "":
            raise _Bad("ft: unbalanced brackets")
        if ch in "[(":
            depth += 1
        elif ch in "])":
            if depth == 0:
                return
            depth -= 1
        elif ch == "," and depth == 0:
            return
        ps.i += 1


def _rigid(ps, b, p0, p1, root):
    ps.take("[")
    darts: list[list] = [[]]
    while ps.peek() != "]":
        if ps.peek() == "|":
            ps.i += 1
            darts.append([])
        else:
            y = ps.int()
            ps.take(".")
            rel = ps.int()
            lab = None
            ch = ps.peek()
            if ch in "^e":
                lab = ch
                ps.i += 1
            elif ch == "(":
                ps.i += 1
                lab = ps.i
                _skip(ps)
                ps.take(")")
            darts[-1].append((y, rel, lab))
        if ps.peek() == ",":
            ps.i += 1
    ps.take("]")
    end = ps.i
    nv = len(darts)
    top = None if root else darts[0][0][0]
    vid = [p0 if x == 0 else p1 if x == top else b.vertex() for x in range(nv)]
    block: dict[tuple[int, int], list[int]] = {}
    for x, ds in enumerate(darts):
        for t, (y, rel, lab) in enumerate(ds):
            if x >= y:
                continue
            if lab == "^":
                block[(x, t)] = block[(y, rel)] = []
            elif lab == "e":
                e = b.edge(vid[x], vid[y])
                block[(x, t)], block[(y, rel)] = [e], [e]
            elif isinstance(lab, int):
                ps.i = lab
                block[(x, t)], block[(y, rel)] = _piece(ps, b, vid[x], vid[y], False)
            else:
                raise _Bad("ft: a rigid edge without a label")
    ps.i = end
    out = [None, None]
    for x, ds in enumerate(darts):
        seq = [block[(x, t)] for t in range(len(ds))]
        if x == 0 and not root:
            out[0] = [e for blk in seq[1:] for e in blk]
        elif x == top:
            r = darts[0][0][1]                              # the parent, seen from its far end
            out[1] = [e for blk in seq[r + 1:] + seq[:r] for e in blk]
        else:
            b.rot[vid[x]] = [e for blk in seq for e in blk]
    return out[0], out[1]


def realize(code: str) -> Diagram:
    """The alternating diagram of the member of the flype class that ``code`` describes.

    Raises
    ------
    NotationError
        ``code`` is not a well-formed ``ft:`` code (one line).
    """
    if not code.startswith("ft:"):
        raise _Bad(f"ft: {code[:20]!r} does not start with 'ft:'")
    body = code[3:]
    b = _Builder()
    if body[:1] and body[:1] in "BC" and body[1:].isdigit():
        k = int(body[1:])
        if body[0] == "B":
            u, v = b.vertex(), b.vertex()
            es = [b.edge(u, v) for _ in range(k)]
            b.rot[u], b.rot[v] = es, es[::-1]
        else:
            vs = [b.vertex() for _ in range(k)]
            es = [b.edge(vs[i], vs[(i + 1) % k]) for i in range(k)]
            for i in range(k):
                b.rot[vs[i]] = [es[i - 1], es[i]]
    else:
        ps = _Parser(body)
        p0 = b.vertex()
        p1 = b.vertex() if body[:1] == "P" else p0
        b0, b1 = _piece(ps, b, p0, p1, True)
        if body[:1] == "P":
            b.rot[p0], b.rot[p1] = b0, b1
        elif body[:1] == "S":
            b.rot[p0] = b0
        if ps.i != len(body):
            raise _Bad(f"ft: trailing text at position {ps.i}")
    rot = [b.rot[v] for v in range(b.nv)]
    return to_diagram(medial(b.ends, rot), [True] * len(b.ends))
