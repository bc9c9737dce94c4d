"""Tait graph of an alternating diagram and its decomposition into 3-connected components.

The proof that uses this decomposition is in :mod:`pipeline.diagrams.flype_tree`; this
module only builds it.

Tait graph
----------
For a connected alternating diagram on flat twin arrays (:mod:`pipeline.diagrams.shadow`)
the faces meeting a crossing in its two *A-corners* (swept when the over-strand turns
counterclockwise onto the under-strand) all have one checkerboard colour (the bracket
states of L. H. Kauffman, "State models and the Jones polynomial", Topology 26, 1987).
:func:`tait_graph` returns the plane multigraph ``G`` with those faces as vertices and
one edge per crossing, its rotation system read from the face walks (one rule for every
face, so one orientation of the sphere), and the vertex sets of its faces (the faces of
the other colour).  The other colour gives the dual graph, which is the Tait graph of the
mirror image.

Decomposition
-------------
:func:`decompose` splits a 2-connected plane multigraph into the 3-connected components
of W. T. Tutte ("Connectivity in graphs", Toronto 1966; J. E. Hopcroft, R. E. Tarjan,
"Dividing a graph into triconnected components", SIAM J. Comput. 2, 1973): *bonds*
``P`` (two poles, at least three elements), *cycles* ``S`` and *rigid* nodes ``R``
(3-connected skeletons), glued along virtual edges, the tree being unique.  The method is
the definition, applied top-down to a *piece* (a set of edges with two poles ``s, t``
whose complement is attached at ``s, t`` only):

1. the edges split at ``{s, t}`` into two or more branches (edges joined through
   vertices other than ``s, t``): a ``P`` node, one element per branch;
2. otherwise, if a vertex separates ``s`` from ``t`` in the piece, the cut vertices
   cut it into a chain: an ``S`` node, one element per link of the chain;
3. otherwise an ``R`` node: the piece plus the virtual edge ``st`` is 2-connected, and
   its maximal proper 2-separated sides (a pair ``{a, b}`` whose removal cuts off two
   or more edges from ``st``) become virtual elements, the other edges stay real.

Only vertex pairs lying together on two faces of ``G`` can separate a 2-connected plane
graph (a separating pair is joined by a closed curve through two faces), so step 3
tests those pairs only.  Every element of a node is a set of edges of ``G`` (for the
element towards the rest of the graph: the complement), so the node's skeleton and its
rotation at each vertex are read off ``G``'s rotation by mapping each edge to its
element (the edges of one element are consecutive around each pole, by planarity).
"""

from __future__ import annotations

from .shadow import faces

__all__ = ["tait_graph", "Node", "decompose"]


def tait_graph(tw: list[int], over: list[bool], colour: int):
    """(number of vertices, ends of each edge, rotation at each vertex, face vertex sets).

    ``colour`` 0: vertices are the A-corner faces; 1: the other colour (the mirror's
    Tait graph).  Edge ``i`` is crossing ``i``.
    """
    face = faces(tw)
    n = len(tw) >> 2
    vert_of: dict[int, int] = {}
    ends = []
    sides = []
    for i in range(n):
        a = 0 if over[i] != bool(colour) else 1        # slots a, a+2 are one colour's corners
        f1, f2 = face[4 * i + a], face[4 * i + a + 2]
        g1, g2 = face[4 * i + a + 1], face[4 * i + (a + 3) % 4]
        for f in (f1, f2):
            vert_of.setdefault(f, len(vert_of))
        ends.append((vert_of[f1], vert_of[f2]))
        sides.append((g1, g2))
    rot: list[list[int]] = [[] for _ in vert_of]
    seen = [False] * len(tw)
    for h0 in range(len(tw)):
        if seen[h0] or face[h0] not in vert_of:
            continue
        v, h = vert_of[face[h0]], h0
        while not seen[h]:
            seen[h] = True
            rot[v].append(h >> 2)                       # slot h: corner (h-1, h) of crossing h>>2
            g = tw[h]
            h = (g & ~3) | ((g + 1) & 3)
    fv: dict[int, set] = {}
    for i, (g1, g2) in enumerate(sides):
        for g in (g1, g2):
            fv.setdefault(g, set()).update(ends[i])
    return len(vert_of), ends, rot, list(fv.values())


class Node:
    """A node: ``kind`` in P, S, R; ``els`` = [(edges frozenset, a, b, real)];
    ``link[j]`` = (neighbour node, its element index) for virtual elements;
    ``cycle`` (S only) = [(vertex, element)] in cyclic order, element k joining vertex k
    to vertex k+1."""

    __slots__ = ("kind", "els", "link", "cycle", "elmap", "_rot")

    def __init__(self, kind, els, cycle=None):
        self.kind, self.els, self.cycle = kind, els, cycle
        self.link: dict[int, tuple[int, int]] = {}
        self.elmap = None
        self._rot: dict[int, tuple[list[int], dict[int, int]]] = {}

    def rotation(self, g_rot, w: int):
        """(elements around vertex w in G's rotation order, element -> position)."""
        got = self._rot.get(w)
        if got is None:
            seq: list[int] = []
            for e in g_rot[w]:
                k = self.elmap[e]
                if not seq or seq[-1] != k:
                    seq.append(k)
            if len(seq) > 1 and seq[0] == seq[-1]:
                seq.pop()
            pos = {k: j for j, k in enumerate(seq)}
            if len(pos) != len(seq):
                raise AssertionError("flype tree: an element is not consecutive around a pole")
            got = self._rot[w] = (seq, pos)
        return got


def _groups(edges, ends, cut: set, extra=None):
    """Edges (and the extra pair ``extra`` = (a, b), id -1) grouped by connection through
    vertices outside ``cut``."""
    par: dict[int, int] = {}

    def find(x):
        while par[x] != x:
            par[x] = par[par[x]]
            x = par[x]
        return x

    first: dict[int, int] = {}
    items = [(e, ends[e]) for e in edges]
    if extra is not None:
        items.append((-1, extra))
    for e, (a, b) in items:
        par[e] = e
        for v in (a, b):
            if v in cut:
                continue
            f = first.get(v)
            if f is None:
                first[v] = e
            else:
                x, y = find(f), find(e)
                if x != y:
                    par[x] = y
    out: dict[int, list[int]] = {}
    for e, _ in items:
        out.setdefault(find(e), []).append(e)
    return list(out.values())


def _connected(edges, ends, s, t, avoid) -> bool:
    adj: dict[int, list[int]] = {}
    for e in edges:
        a, b = ends[e]
        adj.setdefault(a, []).append(b)
        adj.setdefault(b, []).append(a)
    seen, stack = {s}, [s]
    while stack:
        v = stack.pop()
        if v == t:
            return True
        for u in adj.get(v, ()):
            if u != avoid and u not in seen:
                seen.add(u)
                stack.append(u)
    return False


def _cut_vertices(edges, ends, s, t) -> list[int]:
    """Vertices separating s from t in the piece (candidates on one s-t path)."""
    adj: dict[int, list[int]] = {}
    for e in edges:
        a, b = ends[e]
        adj.setdefault(a, []).append(b)
        adj.setdefault(b, []).append(a)
    prev = {s: None}
    queue = [s]
    for v in queue:
        for u in adj[v]:
            if u not in prev:
                prev[u] = v
                queue.append(u)
    path, v = [], prev[t]
    while v is not None and v != s:
        path.append(v)
        v = prev[v]
    return [v for v in path if not _connected(edges, ends, s, t, v)]


def decompose(nv: int, ends, rot, face_vsets):
    """The 3-connected components of a 2-connected plane multigraph with >= 2 edges.

    Returns the list of :class:`Node`; node 0 contains edge 0 as a real element.
    """
    m = len(ends)
    pair_count: dict[tuple[int, int], int] = {}
    for vs in face_vsets:
        vs = sorted(vs)
        for i, a in enumerate(vs):
            for b in vs[i + 1:]:
                pair_count[(a, b)] = pair_count.get((a, b), 0) + 1
    pairs = [p for p, c in pair_count.items() if c >= 2]
    nodes: list[Node] = []
    allset = frozenset(range(m))

    def piece(F: frozenset, s: int, t: int, parent_real: bool) -> int:
        """Node of the piece F (poles s, t); its element 0 is the outside (virtual, or
        the real edge 0 at the top)."""
        rest = allset - F
        els = [(rest, s, t, parent_real)]
        groups = _groups(F, ends, {s, t})
        cycle = None
        if len(groups) >= 2:
            kind = "P"
            els += [(frozenset(g), s, t, len(g) == 1) for g in groups]
        else:
            cuts = _cut_vertices(F, ends, s, t)
            if cuts:
                kind = "S"
                cutset = set(cuts) | {s, t}
                byends: dict[frozenset, list[int]] = {}
                for g in _groups(F, ends, cutset):
                    vs = frozenset(v for e in g for v in ends[e] if v in cutset)
                    if len(vs) != 2:
                        raise AssertionError("flype tree: a chain link without two ends")
                    byends.setdefault(vs, []).extend(g)   # parallel parts: one link
                links: dict[int, list] = {}
                for vs, g in byends.items():
                    a, b = vs
                    links.setdefault(a, []).append((b, g))
                    links.setdefault(b, []).append((a, g))
                cycle, v, prev = [(t, 0)], s, t
                while v != t:
                    (b, g), = [x for x in links[v] if x[0] != prev]
                    els.append((frozenset(g), v, b, len(g) == 1))
                    cycle.append((v, len(els) - 1))
                    prev, v = v, b
            else:
                kind = "R"
                vset = {v for e in F for v in ends[e]}
                sides = []
                for a, b in pairs:
                    if a in vset and b in vset and {a, b} != {s, t}:
                        gs = _groups(F, ends, {a, b}, (s, t))
                        if len(gs) < 2:
                            continue
                        side = frozenset(e for g in gs if -1 not in g for e in g)
                        if len(side) >= 2:
                            sides.append((len(side), side, a, b))
                sides.sort(key=lambda x: -x[0])
                covered: set[int] = set()
                for _, side, a, b in sides:
                    if side & covered:
                        if not side <= covered:
                            raise AssertionError("flype tree: overlapping sides in a rigid node")
                        continue
                    covered |= side
                    els.append((side, a, b, False))
                els += [(frozenset((e,)), *ends[e], True) for e in sorted(F - covered)]
        k = len(nodes)
        node = Node(kind, els, cycle)
        nodes.append(node)
        for j, (g, a, b, real) in enumerate(els):
            if j and not real:
                c = piece(g, a, b, False)
                node.link[j] = (c, 0)
                nodes[c].link[0] = (k, j)
        return k

    s, t = ends[0]
    if m == 2:
        nodes.append(Node("P", [(frozenset((0,)), s, t, True), (frozenset((1,)), s, t, True)]))
    else:
        piece(allset - {0}, s, t, True)
    for node in nodes:
        em = [0] * m
        for j, (g, *_rest) in enumerate(node.els):
            for e in g:
                em[e] = j
        node.elmap = em
    return nodes
