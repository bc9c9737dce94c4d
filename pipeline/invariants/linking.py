"""Linking numbers of the components of a diagram, and their orientation changes.

lk(K_i, K_j) = ½ Σ sign(c) over the crossings c between K_i and K_j (either strand
over): the Gauss linking integral read off a diagram (Rolfsen, *Knots and Links*,
Publish or Perish (1976), ch. 5D, the crossing count definition).  Components are
indexed as in ``diagram.components``; free loops link nothing and are not indexed.

Reversing the orientation of a sublink K changes the Jones polynomial and the
signature through λ = lk(K, L − K) only (Morton, "The Jones polynomial for unoriented
links", Quart. J. Math. 37 (1986); Murasugi, Trans. AMS 117 (1965)), so the one loop
:func:`reversal_linkings` serves every caller that needs all orientations.
"""

from __future__ import annotations

from itertools import combinations

from ..diagrams.diagram import Diagram

__all__ = ["linking_matrix", "linking_numbers", "reversal_linkings"]


def _twice(diagram: Diagram) -> list[list[int]]:
    comp = diagram.component_of_label
    k = len(diagram.components)
    twice = [[0] * k for _ in range(k)]
    for x, s in zip(diagram.pd, diagram.signs):
        i, j = comp[x[0]], comp[x[1]]
        if i != j:
            twice[i][j] += s
            twice[j][i] += s
    return twice


def linking_matrix(diagram: Diagram) -> list[list[int]]:
    """The symmetric matrix of linking numbers lk(K_i, K_j), zero diagonal.

    Examples
    --------
    >>> from pipeline.diagrams.notation import parse
    >>> linking_matrix(parse("torus:2,4"))
    [[0, 2], [2, 0]]
    """
    return [[v // 2 for v in row] for row in _twice(diagram)]


def linking_numbers(diagram: Diagram) -> dict[tuple[int, int], int]:
    """Linking numbers of pairs of components (indices into ``diagram.components``).

    lk(K_i, K_j) = ½ Σ sign(c) over the crossings between K_i and K_j (i < j);
    every pair is listed, free loops are not (they link nothing).  Depends on the
    orientation of the components.

    Examples
    --------
    >>> from pipeline.diagrams.notation import parse
    >>> linking_numbers(parse("torus:2,4"))
    {(0, 1): 2}
    """
    m = linking_matrix(diagram)
    k = len(m)
    return {(i, j): m[i][j] for i in range(k) for j in range(i + 1, k)}


def reversal_linkings(diagram: Diagram) -> list[tuple[tuple[int, ...], int]]:
    """(K, lk(K, L − K)) for every sublink K of components 1..c−1 (the empty one first).

    These 2^(c−1) sublinks give every orientation of the diagram up to reversing all
    components at once (which changes neither V nor σ); reversing K multiplies V by
    t^(−3λ) and adds 2λ to σ, λ = lk(K, L − K).

    Examples
    --------
    >>> from pipeline.diagrams.notation import parse
    >>> reversal_linkings(parse("torus:2,4"))
    [((), 0), ((1,), 2)]
    """
    m = linking_matrix(diagram)
    k = len(m)
    out = []
    for r in range(max(k, 1)):   # no component with crossings: the empty sublink only
        for subset in combinations(range(1, k), r):
            rest = [j for j in range(k) if j not in subset]
            out.append((subset, sum(m[i][j] for i in subset for j in rest)))
    return out
