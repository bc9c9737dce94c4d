"""Compositional canonical code of the flype class of a reduced prime alternating diagram.

The code is computed bottom-up over the decomposition of the Tait graph into its
3-connected components, so the freedom of every flype circuit is quotiented where it
lives instead of enumerated as a product over circuits (the orbit search of
:mod:`pipeline.diagrams.flype`).  No search, no budget: O(n²) with small constants.

Set-up
------
``D`` reduced prime alternating, ``G`` its Tait graph on the A-corner faces
(:func:`pipeline.diagrams.flype_spqr.tait_graph`).  (F1) ``D`` is the medial map of ``G``
with the crossings fixed by the A-rule, so *``D`` up to homeomorphisms of S² preserving
orientation = ``G`` up to the same*; turning ``D`` over (reflect the plane and change every
crossing) keeps the A-faces and reflects ``G``; the mirror image swaps the colours, i.e.
is the dual ``G*``.  (F2) ``D`` reduced and visibly prime iff ``G`` is 2-connected and
loopless (docstring of :mod:`pipeline.diagrams.families.alternating`).  (F3) ``G`` has a
unique decomposition into bonds ``P``, cycles ``S`` and rigid 3-connected skeletons ``R``
glued along virtual edges (W. T. Tutte, "Connectivity in graphs", 1966; J. E. Hopcroft,
R. E. Tarjan, SIAM J. Comput. 2, 1973; :func:`pipeline.diagrams.flype_spqr.decompose`);
a rigid skeleton has one embedding up to reflection (H. Whitney, "2-isomorphic graphs",
Amer. J. Math. 55, 1933), and the decomposition of ``G*`` is that of ``G`` with bonds and
cycles exchanged.  A *piece* is the side of a virtual edge: a 2-pole plane graph; its
rotations by π about the three axes of its Conway circle form a Klein four-group: the
*bond twist* τ_P (poles exchanged, reflected: a Whitney twist), the *cycle twist* τ_S
(poles kept, reflected), and their product.

Lemma 1 (flypes are local moves; proved here)
---------------------------------------------
A flype ``(c, T)`` is a Conway circle through the faces F0, F1, F2, F3 (F1, F3 the
corners of ``c`` beside F0; :mod:`pipeline.diagrams.flype`); the colours alternate round
it.  If F1, F3 are A-faces ``u, v``, then ``c`` is an edge ``uv`` of ``G`` and the circle
meets ``G`` in ``u, v`` only, so ``T`` is a union of branches of ``G`` at ``{u, v}``,
consecutive around ``u`` and adjacent to ``c`` across F0; with at least two crossings on
either side there are at least three branches: ``c`` is a real edge of the bond of
``{u, v}`` and ``T`` a run of its elements next to ``c``.  The flype turns the disc of
``T`` about the axis through F0 and F2: every element of the run gets τ_P, their order
stays, and ``c`` passes to the far side of the run.  If F1, F3 are B-faces, the same
holds in ``G*``, i.e. ``c`` is a real edge of a cycle of ``G`` and every element of the
run gets τ_S.  Conversely every such move is a flype (or trivial across real edges
only).  So flypes keep the tree, the node types, the rigid skeletons, the number of
real edges of every node and the cyclic order of its virtual elements; they only move
real edges of bonds and cycles between gaps, twisting the subtrees they pass.

Lemma 2 (pieces; proved here)
-----------------------------
Read a piece from one pole ``p`` in sense ε (its edges at ``p`` in ε-order, starting
after the rest of the graph).  Its code is (i) unchanged by the flypes inside the piece
whose run avoids the rest of the graph and (ii) a complete description of the piece so
read, up to those flypes.  By induction on the subtree.  *Bond / cycle* with ``E`` real
edges and virtual children ``X_1 … X_m`` in reading order: gather every real edge into
the gap next to the rest, each crossing the children before it; the *normal form* is
``E`` real edges, then ``X_i`` turned once (τ_P resp. τ_S) per real edge read after it.
Moving one real edge across one child changes that child's count by one and turns it
once, and changes no other count, so the normal form — a member — is invariant;
code ``P E [codes of the turned X_i]`` (resp. ``S``).  *Rigid*: no move acts at the node;
the code is the map code of the skeleton from the dart of the rest (vertices numbered
breadth-first, every dart giving the far vertex and its position there, as in
L. Weinberg, IEEE Trans. Circuit Theory 13, 1966) with every child's code read from its
earlier-numbered pole in sense ε.

Lemma 3 (the whole diagram; proved here)
----------------------------------------
A flype whose run contains the rest of the graph (seen from a piece) and the flype of
the same crossing across the complementary run differ by a half-turn of the whole
sphere; a homeomorphism maps the tree to itself and flypes to flypes.  So, for a root
node fixed by every homeomorphism, every member of the orbit is a homeomorphic image of
a member reached by flypes at the root and flypes at other nodes whose runs avoid the
side of the root.  The root is the centre of the tree (one or two nodes; the tree is a
flype invariant, and a homeomorphism preserves its centre).  Its code is the
minimum over its symmetries: for a bond or cycle, the normal form with the real edges
gathered in the gap before each virtual element in each of the four readings (the
gathered member at a gap is unique up to the half-turn that turns every element, which
is one of the readings); for a rigid node, every start dart and both senses; for a bond
or cycle without virtual elements (``T(2, n)``), ``B n`` / ``C n``.  With two centres,
the smaller code.

Theorem
-------
For reduced prime alternating ``D1, D2``: ``tree_code(D1) == tree_code(D2)`` iff they are
diagrams of the same unoriented link.  (⇐) the flyping theorem (W. Menasco,
M. Thistlethwaite, "The classification of alternating links", Annals of Math. 138,
1993) and Lemmas 1–3 (the code is a function of the flype class; homeomorphisms and
turning over are absorbed by the minima).  (⇒) the code describes one member of the
class completely (:func:`pipeline.diagrams.flype_realize.realize` rebuilds it), so equal
codes give homeomorphic members of both classes.  The mirror's code is the same
construction on ``G*``; amphichiral iff both codes agree.

Checks (tests/test_flype_tree.py, reports/bench_flype.md): the partition agrees with the
whole-orbit reference on every alternating diagram of every prime reduced shadow with
n ≤ 11 crossings (both mirror images), the code is invariant under random flypes,
relabelling and turning over at 15–40 crossings, ``tree_code(realize(code)) == code``,
and the knot counts 1, 1, 2, 3, 7, 18, 41, 123, 367 (n = 3 … 11; J. Hoste,
M. Thistlethwaite, J. Weeks, "The first 1,701,936 knots", Math. Intelligencer 20, 1998).
"""

from __future__ import annotations

from .diagram import Diagram
from .flype_spqr import decompose, tait_graph
from .shadow import twins

__all__ = ["tree_codes", "tree_code", "tree_codes_of"]


class _Coder:
    """Codes of the pieces of one decomposition (memoised per direction and orientation)."""

    def __init__(self, nodes, rot):
        self.nodes, self.rot, self.memo = nodes, rot, {}

    def child(self, k: int, j: int, p: int, eps: int) -> str:
        """Code of the piece beyond element j of node k, read from pole p in sense eps."""
        c, back = self.nodes[k].link[j]
        key = (c, back, p, eps)
        got = self.memo.get(key)
        if got is None:
            got = self.memo[key] = self.piece(c, back, p, eps)
        return got

    # ---------------------------------------------------------------- P and S nodes
    def _gathered(self, k: int, items, tag: str, twist, eps: int) -> str:
        """items = [(element, first pole)] in reading order; the real elements are
        gathered at the start, each virtual child turned by ``twist`` once per real
        element read after it."""
        node = self.nodes[k]
        real = 0
        parts = []
        for el, w in reversed(items):
            g, a, b, is_real = node.els[el]
            if is_real:
                real += 1
                continue
            p, e = (w, 1) if real % 2 == 0 else twist(w, a, b)
            parts.append((el, p, e))
        out = [self.child(k, el, p, e * eps) for el, p, e in reversed(parts)]
        return f"{tag}{real}[{','.join(out)}]"

    def _p_items(self, k: int, start: int, p: int, eps: int, include_start: bool):
        seq, pos = self.nodes[k].rotation(self.rot, p)
        n, i0 = len(seq), pos[start]
        ks = range(0, n) if include_start else range(1, n)
        return [(seq[(i0 + eps * t) % n], p) for t in ks]

    def _s_items(self, k: int, start: int, forward: bool, include_start: bool):
        cyc = self.nodes[k].cycle
        n = len(cyc)
        i = next(x for x, (_, el) in enumerate(cyc) if el == start)
        ks = range(0, n) if include_start else range(1, n)
        if forward:
            return [(cyc[(i + t) % n][1], cyc[(i + t) % n][0]) for t in ks]
        return [(cyc[(i - t) % n][1], cyc[(i - t + 1) % n][0]) for t in ks]

    @staticmethod
    def _p_twist(w, a, b):      # rotation about the circuit axis of a bond: poles swapped, reflected
        return (b if w == a else a), -1

    @staticmethod
    def _s_twist(w, a, b):      # of a cycle: poles kept, reflected
        return w, -1

    # ---------------------------------------------------------------- R nodes
    def _rigid(self, k: int, start: int, p: int, eps: int, parent: bool) -> str:
        node, rot = self.nodes[k], self.rot
        num = {p: 0}
        order, refs = [p], [start]
        toks = []
        for x, w in enumerate(order):
            seq, pos = node.rotation(rot, w)
            n, r = len(seq), pos[refs[x]]
            for t in range(n):
                el = seq[(r + eps * t) % n]
                g, a, b, real = node.els[el]
                w2 = b if a == w else a
                y = num.get(w2)
                if y is None:
                    y = num[w2] = len(order)
                    order.append(w2)
                    refs.append(el)
                    rel = 0
                else:
                    seq2, pos2 = node.rotation(rot, w2)
                    rel = ((pos2[el] - pos2[refs[y]]) * eps) % len(seq2)
                lab = ""
                if x < y:
                    if parent and el == start:
                        lab = "^"
                    elif real:
                        lab = "e"
                    else:
                        lab = "(" + self.child(k, el, w, eps) + ")"
                toks.append(f"{y}.{rel}{lab}")
            toks.append("|")                              # end of vertex x's darts
        return "R[" + ",".join(toks[:-1]) + "]"

    # ---------------------------------------------------------------- entry points
    def piece(self, k: int, back: int, p: int, eps: int) -> str:
        node = self.nodes[k]
        if node.kind == "P":
            return self._gathered(k, self._p_items(k, back, p, eps, False), "P", self._p_twist, eps)
        if node.kind == "S":
            cyc = node.cycle
            i = next(x for x, (_, el) in enumerate(cyc) if el == back)
            forward = p == cyc[(i + 1) % len(cyc)][0]
            return self._gathered(k, self._s_items(k, back, forward, False), "S", self._s_twist, eps)
        return self._rigid(k, back, p, eps, True)

    def root(self, k: int) -> str:
        node = self.nodes[k]
        virtual = [j for j, el in enumerate(node.els) if not el[3]]
        best = None
        if node.kind in "PS" and not virtual:
            return ("B" if node.kind == "P" else "C") + str(len(node.els))
        for j in (virtual if node.kind in "PS" else range(len(node.els))):
            _, a, b, _ = node.els[j]
            for p in (a, b):
                for eps in (1, -1):
                    if node.kind == "R":
                        c = self._rigid(k, j, p, eps, False)
                    else:
                        if node.kind == "P":
                            items = self._p_items(k, j, p, eps, True)
                            twist = self._p_twist
                        else:
                            items = self._s_items(k, j, p == a, True)
                            twist = self._s_twist
                        while node.els[items[-1][0]][3]:      # the gap before j: read first
                            items.insert(0, items.pop())
                        c = self._gathered(k, items, node.kind, twist, eps)
                    if best is None or c < best:
                        best = c
        return best


def _centre(nodes) -> list[int]:
    deg = [len(nd.link) for nd in nodes]
    alive = set(range(len(nodes)))
    leaves = [k for k in alive if deg[k] <= 1]
    while len(alive) > 2:
        nxt = []
        for k in leaves:
            alive.discard(k)
            for c, _ in nodes[k].link.values():
                if c in alive:
                    deg[c] -= 1
                    if deg[c] == 1:
                        nxt.append(c)
        leaves = nxt
    return sorted(alive)


def _graph_code(tw: list[int], over: list[bool], colour: int) -> str:
    nv, ends, rot, fvs = tait_graph(tw, over, colour)
    nodes = decompose(nv, ends, rot, fvs)
    coder = _Coder(nodes, rot)
    return "ft:" + min(coder.root(k) for k in _centre(nodes))


def tree_codes_of(tw: list[int], over: list[bool]) -> tuple[str, str]:
    """(code, mirror code) of the alternating diagram on a twin array (no checks)."""
    return _graph_code(tw, over, 0), _graph_code(tw, over, 1)


def tree_codes(diagram: Diagram) -> tuple[str, str]:
    """(code of the flype class, code of the mirror image's flype class)."""
    from .flype import check_reduced_prime_alternating
    check_reduced_prime_alternating(diagram)
    return tree_codes_of(twins(diagram), [True] * len(diagram.pd))


def tree_code(diagram: Diagram) -> str:
    """Compositional canonical code of the flype class (see the module notes)."""
    return tree_codes(diagram)[0]
