"""Khovanov homology by the full cube of resolutions: the slow, obviously-correct route.

A direct transcription of the definition in Bar-Natan's conventions [1]_, exponential
in the number of crossings, meant for diagrams with at most ~10 crossings.  The fast
route (:mod:`.tangle`) is tested against it.

Conventions
-----------
At a crossing ``(a, b, c, d)`` (contract PD order) the 0-smoothing is the Kauffman
A-smoothing, joining ``a–b`` and ``c–d`` (as in :mod:`pipeline.invariants.jones.frontier`);
the 1-smoothing joins ``a–d`` and ``b–c``.  A state ``s`` with ``r`` 1-smoothings and
``k`` loops carries ``V^{⊗k}``, ``V = span(v₊, v₋)`` with ``deg v± = ±1``.  A generator
sits in homological degree ``i = r − n₋`` and quantum degree
``j = Σ deg + r + n₊ − 2n₋``.  The edge ``s → s'`` changing crossing ``c`` from 0 to 1
is a merge ``m`` (``v₊v₊ ↦ v₊``, ``v₊v₋, v₋v₊ ↦ v₋``, ``v₋v₋ ↦ 0``) or a split ``Δ``
(``v₊ ↦ v₊v₋ + v₋v₊``, ``v₋ ↦ v₋v₋``), with sign ``(−1)^(number of 1s of s before c)``.
Then ``Σ (−1)^i q^j rank Kh^{i,j} = (q + q⁻¹)·V(t)`` at ``t^½ = −q``.

Ranks are exact: over Q by python-flint ``fmpz_mat.rank``, over F_p by ``nmod_mat.rank``,
one matrix per (homological, quantum) degree.

References
----------
.. [1] D. Bar-Natan, "On Khovanov's categorification of the Jones polynomial",
   Algebr. Geom. Topol. 2 (2002), 337–370.
.. [2] M. Khovanov, "A categorification of the Jones polynomial", Duke Math. J. 101 (2000).
.. [3] M. Khovanov, "Patterns in knot cohomology I", Experiment. Math. 12 (2003).
"""

from __future__ import annotations

import itertools
from collections import defaultdict

import flint

from ...diagrams.diagram import Diagram

__all__ = ["cube_khovanov", "cube_khovanov_z"]


def _loops(pd, state) -> tuple[list[frozenset], dict[int, int]]:
    """Loops of a state as label sets, and the loop index of every label."""
    parent: dict[int, int] = {}

    def find(x):
        while parent.setdefault(x, x) != x:
            x = parent[x]
        return x

    for (a, b, c, d), bit in zip(pd, state):
        for u, v in (((a, b), (c, d)) if bit == 0 else ((a, d), (b, c))):
            parent[find(u)] = find(v)
    groups: dict[int, set] = defaultdict(set)
    for x in pd:
        for v in x:
            groups[find(v)].add(v)
    loops = sorted((frozenset(g) for g in groups.values()), key=min)
    where = {v: k for k, g in enumerate(loops) for v in g}
    return loops, where


def cube_khovanov(diagram: Diagram, *, modulus: int = 0, reduced: bool = False) -> dict[tuple[int, int], int]:
    """Ranks of Kh^{i,j} from the full cube of resolutions (Bar-Natan's conventions [1]_).

    Parameters
    ----------
    diagram : Diagram
    modulus : int, optional
        0 for ranks over Q (default), a prime p for ranks over F_p.
    reduced : bool, optional
        The reduced theory [3]_: the subcomplex in which the loop through the first
        label of the first crossing carries v₋, quantum degrees raised by one (the
        unknot has rank 1 at (0, 0)).  Needs at least one crossing.

    Returns
    -------
    dict
        ``{(i, j): rank}``, nonzero ranks only.
    """
    index, entries = _cube_complex(diagram, reduced)
    ranks = {}
    for key, ent in entries.items():
        rows = len(index[(key[0] + 1, key[1])])
        cols = len(index[key])
        ranks[key] = _rank(rows, cols, ent, modulus)
    out = {}
    for (i, j), gens in index.items():
        h = len(gens) - ranks.get((i, j), 0) - ranks.get((i - 1, j), 0)
        if h:
            out[(i, j)] = h
    return out


def cube_khovanov_z(diagram: Diagram) -> tuple[dict, dict]:
    """Integral Kh from the cube: ``({(i, j): free rank}, {(i, j): {m: multiplicity}})``.

    Each block ``d^{i,j}`` of the cube complex is put in Smith normal form by python-flint's
    dense ``fmpz_mat.snf``: its rank r and invariant factors m > 1 give the free rank
    ``dim C^{i,j} − r^{i,j} − r^{i−1,j}`` and the torsion ``⊕ Z/m`` of ``Kh^{i+1,j}``.
    """
    index, entries = _cube_complex(diagram, False)
    ranks, torsion = {}, {}
    for (i, j), ent in entries.items():
        mat = flint.fmpz_mat(len(index[(i + 1, j)]), len(index[(i, j)]))
        for (r, c), v in ent.items():
            mat[r, c] = v
        snf = mat.snf()
        diag = [abs(int(snf[k, k])) for k in range(min(snf.nrows(), snf.ncols()))]
        ranks[(i, j)] = sum(1 for d in diag if d)
        for d in diag:
            if d > 1:
                torsion.setdefault((i + 1, j), defaultdict(int))[d] += 1
    free = {}
    for (i, j), gens in index.items():
        h = len(gens) - ranks.get((i, j), 0) - ranks.get((i - 1, j), 0)
        if h:
            free[(i, j)] = h
    return dict(sorted(free.items())), {k: dict(sorted(v.items())) for k, v in sorted(torsion.items())}


def _cube_complex(diagram: Diagram, reduced: bool) -> tuple[dict, dict]:
    """Generators ``{(i, j): {(state, v₋ bits): index}}`` and the blocks of the
    differential ``{(i, j): {(row, col): ±1}}`` (``C^{i,j} → C^{i+1,j}``)."""
    pd = diagram.pd
    n = len(pd)
    signs = diagram.signs
    n_plus = sum(1 for s in signs if s > 0)
    n_minus = n - n_plus
    extra = diagram.free_loops
    # generators: (state, bits of v₋ per loop) ; index them per (i, j)
    index: dict[tuple[int, int], dict] = defaultdict(dict)
    info = {}
    mark = pd[0][0] if reduced else None
    shift = 1 if reduced else 0
    for state in itertools.product((0, 1), repeat=n):
        loops, where = _loops(pd, state)
        info[state] = (loops, where)
        r = sum(state)
        k = len(loops) + extra
        for minus in range(1 << k):
            if reduced and not minus >> where[mark] & 1:
                continue
            m = bin(minus).count("1")
            j = (k - 2 * m) + r + n_plus - 2 * n_minus + shift
            key = (r - n_minus, j)
            index[key][(state, minus)] = len(index[key])
    # differentials d: C^{i,j} -> C^{i+1,j}, as sparse {(row, col): value}
    entries: dict[tuple[int, int], dict] = defaultdict(dict)
    for state, (loops, where) in info.items():
        r = sum(state)
        k = len(loops) + extra
        for c in range(n):
            if state[c]:
                continue
            sign = -1 if sum(state[:c]) % 2 else 1
            t = state[:c] + (1,) + state[c + 1:]
            loops2, where2 = info[t]
            a, b, cc, d = pd[c]
            # loops of the target that do not pass through crossing c keep their label sets
            old_near = sorted({where[a], where[b], where[cc], where[d]})
            new_near = sorted({where2[a], where2[b], where2[cc], where2[d]})
            far_map = {}
            for idx, lp in enumerate(loops):
                if idx not in old_near:
                    far_map[idx] = where2[next(iter(lp))]
            for idx in range(len(loops), k):  # free loops follow the diagram's loops
                far_map[idx] = idx - len(loops) + len(loops2)
            for minus in range(1 << k):
                if reduced and not minus >> where[mark] & 1:
                    continue
                base = 0
                for idx, idx2 in far_map.items():
                    if minus >> idx & 1:
                        base |= 1 << idx2
                images = []
                if len(old_near) == 2:  # merge
                    x, y = ((minus >> old_near[0]) & 1), ((minus >> old_near[1]) & 1)
                    if x and y:
                        continue
                    images.append(base | ((x | y) << new_near[0]))
                else:  # split
                    x = (minus >> old_near[0]) & 1
                    p, q = new_near
                    if x:
                        images.append(base | (1 << p) | (1 << q))
                    else:
                        images.extend((base | (1 << p), base | (1 << q)))
                m = bin(minus).count("1")
                j = (k - 2 * m) + r + n_plus - 2 * n_minus + shift
                i = r - n_minus
                col = index[(i, j)][(state, minus)]
                for img in images:
                    row = index[(i + 1, j)][(t, img)]
                    entries[(i, j)][(row, col)] = sign
    return index, entries


def _rank(rows: int, cols: int, entries: dict, modulus: int) -> int:
    if not entries:
        return 0
    if modulus:
        mat = flint.nmod_mat(rows, cols, modulus)
        for (r, c), v in entries.items():
            mat[r, c] = v % modulus
        return mat.rank()
    mat = flint.fmpz_mat(rows, cols)
    for (r, c), v in entries.items():
        mat[r, c] = v
    return mat.rank()
