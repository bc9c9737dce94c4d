"""Integral Khovanov homology: free ranks and torsion ``Z/m`` at every bidegree.

Bar-Natan's local algorithm [1]_ runs over Z unchanged except that Gaussian elimination
is done only along isomorphisms ``±1·id``: delooping ``○ ≅ ∅{+1} ⊕ ∅{−1}`` and the
elimination lemma ``[[φ, δ], [γ, ε]] ≃ ε − γφ⁻¹δ`` hold in any additive category as long
as φ is invertible [1, Lemmas 4.1, 4.2], and over Z a scalar multiple of the identity is
invertible exactly when the scalar is ±1.  The final complex (Khovanov's theory, h = 0)
is a complex of free abelian groups whose differential has no unit entry left; its
homology is read off the Smith normal form of each block ``d^{i,j}: C^{i,j} → C^{i+1,j}``
(:func:`pipeline.invariants.coloring.spectrum.sparse_smith`): with ``r^{i,j}`` the rank
and ``m₁ | m₂ | …`` the invariant factors ≠ 1 of ``d^{i,j}``,

* free rank of ``Kh^{i,j}`` = ``dim C^{i,j} − r^{i,j} − r^{i−1,j}``,
* torsion of ``Kh^{i+1,j}`` = ``⊕ Z/m_k`` (invariant factor decomposition).

Universal coefficients (A. Hatcher, *Algebraic Topology*, CUP 2002, Thm. 3.2, for a
cochain complex of free abelian groups): ``Kh^{i,j}(F₂) ≅ Kh^{i,j} ⊗ F₂ ⊕ Tor(Kh^{i+1,j}, F₂)``,
so ``dim Kh^{i,j}(F₂) = free^{i,j} + t₂^{i,j} + t₂^{i+1,j}`` with ``t₂`` the number of
invariant factors of even order (:func:`uct_ranks`); over Q only the free part is left.

Mirror: the cube complex of the mirror ``D*`` is the dual ``Hom(C(D), Z)`` regraded by
``(i, j) ↦ (−i, −j)`` (M. Khovanov, "A categorification of the Jones polynomial", Duke
Math. J. 101 (2000), §7.3).  The dual of a block ``d^{i,j}`` has the same Smith form and
its cokernel sits at ``Hom(C^{i,j})``, i.e. at ``(−i, −j)`` of the mirror, one step below
the place ``(i + 1, j)`` of the torsion of ``d^{i,j}`` in ``Kh(D)``.  Hence torsion at
``(i, j)`` of D moves to ``(1 − i, −j)`` of ``D*`` and free ranks to ``(−i, −j)``
(:func:`mirror_integral`; a proof, checked in the tests).

The torsion column is a JSON list ``[[i, j, m, multiplicity], ...]`` sorted, one entry
per bidegree and invariant factor m > 1; ``[]`` means torsion-free.

References
----------
.. [1] D. Bar-Natan, "Fast Khovanov homology computations", JKTR 16 (2007), 243–255.
.. [2] A. Shumakovitch, "Torsion of Khovanov homology", Fund. Math. 225 (2014):
   Kh of a non-split alternating link has only ``Z/2`` torsion (a test relation here).
"""

from __future__ import annotations

from collections import Counter, defaultdict
from dataclasses import dataclass
from typing import Optional

from ...diagrams.diagram import Diagram
from ..coloring.spectrum import sparse_smith
from .homology import _check_budget
from .tangle import TangleComplex, reduced_complex

__all__ = ["IntegralKhovanov", "integral_khovanov", "integral_from_complex", "uct_ranks",
           "torsion_to_json", "torsion_from_json", "mirror_integral", "add_free_loops"]

Ranks = dict[tuple[int, int], int]
#: ``{(i, j): {m: multiplicity}}``: torsion summands ``(Z/m)^multiplicity``, m > 1.
Torsion = dict[tuple[int, int], dict[int, int]]


@dataclass(frozen=True)
class IntegralKhovanov:
    """Integral Khovanov homology: ``Kh^{i,j} ≅ Z^free ⊕ ⊕_m (Z/m)^mult``."""

    free: Ranks
    torsion: Torsion

    def over_q(self) -> Ranks:
        """Ranks over Q (the free ranks)."""
        return dict(self.free)

    def over_f2(self) -> Ranks:
        """Ranks over F₂ by universal coefficients (:func:`uct_ranks`)."""
        return uct_ranks(self.free, self.torsion, 2)


def integral_from_complex(cx: TangleComplex, *, arcs: bool = False) -> IntegralKhovanov:
    """Homology of a simplified complex over Z (Smith normal form of every block).

    ``cx`` has scalar entries ``{∅: c}`` between objects of equal quantum degree (a
    closed complex at h = 0), or with ``arcs`` it is a cut-open complex whose objects
    are the one arc and the reduced complex is taken: each entry ``c₀ + c₁·x`` is
    replaced by ``c₀`` (the complex modulo x, see
    :func:`pipeline.invariants.khovanov.homology.reduced_khovanov`).
    """
    groups: dict[tuple[int, int], list[int]] = defaultdict(list)
    for a, (_, i, q) in cx.objs.items():
        groups[(i, q)].append(a)
    ranks: dict[tuple[int, int], int] = {}
    torsion: Torsion = {}
    empty = frozenset()
    for (i, q), sources in groups.items():
        target = {b: k for k, b in enumerate(groups.get((i + 1, q), ()))}
        rows, col_rows = [], defaultdict(set)
        for a in sources:
            row = {}
            for b, f in cx.out[a].items():
                c = f.get(empty, 0)
                if not arcs and (set(f) - {empty} or cx.objs[b][2] != q):
                    raise ArithmeticError("khovanov: the integral complex is not closed at h = 0")
                if c and b in target:
                    row[target[b]] = int(c)
            if row:
                for col in row:
                    col_rows[col].add(len(rows))
                rows.append(row)
        if not rows:
            continue
        factors, rank = sparse_smith(rows, col_rows)
        ranks[(i, q)] = rank
        if factors:
            torsion[(i + 1, q)] = dict(sorted(Counter(factors).items()))
    free = {}
    for (i, q), objs in groups.items():
        r = len(objs) - ranks.get((i, q), 0) - ranks.get((i - 1, q), 0)
        if r:
            free[(i, q)] = r
    return IntegralKhovanov(dict(sorted(free.items())), dict(sorted(torsion.items())))


def add_free_loops(kh: IntegralKhovanov, loops: int) -> IntegralKhovanov:
    """``Kh(D ⊔ O) = Kh(D) ⊗ Z[q + q⁻¹]`` (Künneth, the unknot's Kh is free) per free loop."""
    free, torsion = dict(kh.free), {k: dict(v) for k, v in kh.torsion.items()}
    for _ in range(loops):
        nf: Counter = Counter()
        for (i, q), r in free.items():
            nf[(i, q + 1)] += r
            nf[(i, q - 1)] += r
        nt: dict = defaultdict(Counter)
        for (i, q), ms in torsion.items():
            for m, c in ms.items():
                nt[(i, q + 1)][m] += c
                nt[(i, q - 1)][m] += c
        free, torsion = dict(nf), {k: dict(sorted(v.items())) for k, v in nt.items()}
    return IntegralKhovanov(dict(sorted(free.items())), dict(sorted(torsion.items())))


def integral_khovanov(diagram: Diagram, *, budget: Optional[int] = None) -> IntegralKhovanov:
    """Integral Khovanov homology of a diagram (module docstring).

    Raises
    ------
    BudgetExceeded
        ``skipped: khovanov budget N`` when a tangle complex grows past ``budget``.

    Examples
    --------
    >>> from pipeline.diagrams.notation import parse
    >>> kh = integral_khovanov(parse("torus:2,3"))
    >>> kh.free, kh.torsion
    ({(0, 1): 1, (0, 3): 1, (2, 5): 1, (3, 9): 1}, {(3, 7): {2: 1}})
    """
    _check_budget(budget)
    cx = reduced_complex(diagram, 1, budget=budget, h0=True, modulus=0)
    return add_free_loops(integral_from_complex(cx), diagram.free_loops)


def uct_ranks(free: Ranks, torsion: Torsion, p: int) -> Ranks:
    """Ranks over F_p from integral homology: ``free^{i,j} + t_p^{i,j} + t_p^{i+1,j}``,
    ``t_p`` the number of invariant factors divisible by p (universal coefficients,
    Hatcher Thm. 3.2; the differential raises i)."""
    tp = Counter({k: sum(c for m, c in ms.items() if m % p == 0) for k, ms in torsion.items()})
    out: Counter = Counter(free)
    for (i, j), t in tp.items():
        if t:
            out[(i, j)] += t
            out[(i - 1, j)] += t
    return {k: r for k, r in sorted(out.items()) if r}


def mirror_integral(kh: IntegralKhovanov) -> IntegralKhovanov:
    """Integral Kh of the mirror: free ranks at ``(−i, −j)``, torsion at ``(1 − i, −j)``."""
    return IntegralKhovanov(dict(sorted(((-i, -j), r) for (i, j), r in kh.free.items())),
                            dict(sorted(((1 - i, -j), dict(ms)) for (i, j), ms in kh.torsion.items())))


def torsion_to_json(torsion: Torsion) -> list[list[int]]:
    """``[[i, j, m, multiplicity], ...]`` sorted (the JSON form of ``khovanov_torsion``)."""
    return [[i, j, m, c] for (i, j), ms in sorted(torsion.items()) for m, c in sorted(ms.items()) if c]


def torsion_from_json(data: list) -> Torsion:
    """Inverse of :func:`torsion_to_json`."""
    out: Torsion = {}
    for i, j, m, c in data:
        out.setdefault((int(i), int(j)), {})[int(m)] = int(c)
    return out
