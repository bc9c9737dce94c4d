"""Fox colourings modulo a prime: a witness colouring and the fewest colours.

The p-colourings are the nullspace of the colouring matrix over Z/p (:mod:`.matrix`),
found by the same sparse elimination as the Smith form (:mod:`.sparse_elimination`).

References
----------
1. R. H. Fox (1962); R. H. Crowell, R. H. Fox, introductory textbook, Ginn (1963).
2. T. Nakamura, Y. Nakanishi, S. Satoh, "The pallet graph of a Fox coloring",
   Yokohama Math. J. 59 (2013): the fewest colours on one diagram can exceed the
   knot's minimum.
"""

from __future__ import annotations

from functools import lru_cache
from typing import Optional

import numpy as np

from ...diagrams.diagram import Diagram
from ...numbers import is_prime
from .matrix import _sparse_matrix
from .sparse_elimination import eliminate

__all__ = ["witness_coloring", "min_colors"]


def _check_prime(p: int) -> None:
    if not is_prime(p):
        raise ValueError(f"modulus {p!r} is not a prime")


@lru_cache(maxsize=64)
def _nullspace_mod_p(diagram: Diagram, p: int) -> tuple[tuple[int, ...], ...]:
    """A basis (b_0, b_1, …, b_k) of the p-colourings, with b_0 + … + b_k = (1, …, 1).

    Sparse elimination over Z/p; b_f is 1 on free column f, 0 on the other free
    columns, and solves the pivot rows by back-substitution (last pivot first).
    """
    rows, ncols = _sparse_matrix(diagram)
    elim = eliminate(rows, ncols, modulus=p)
    pivot_cols = {c for _, c in elim.pivots}
    free = [c for c in range(ncols) if c not in pivot_cols]
    basis = []
    for f in free:
        x = [0] * ncols
        x[f] = 1
        for r, c in reversed(elim.pivots):
            x[c] = -sum(a * x[c2] for c2, a in r.items()) % p
        basis.append(tuple(x))
    return tuple(basis)


def _is_coloring(diagram: Diagram, colors: tuple[int, ...], p: int) -> bool:
    rows, _ = _sparse_matrix(diagram)
    return all(sum(v * colors[c] for c, v in r.items()) % p == 0 for r in rows)


def _normalise(colors: list[int], p: int) -> tuple[int, ...]:
    """Translate so column 0 has colour 0, then scale so the first nonzero colour is 1."""
    shift = colors[0]
    x = [(v - shift) % p for v in colors]
    lead = next((v for v in x if v), 1)
    inv = pow(lead, -1, p)
    return tuple(v * inv % p for v in x)


def witness_coloring(diagram: Diagram, p: int) -> Optional[tuple[int, ...]]:
    """A nontrivial Fox p-colouring of ``diagram`` (p prime), or None if none exists.

    Parameters
    ----------
    diagram : Diagram
    p : int
        A prime.

    Returns
    -------
    tuple of int or None
        One colour in Z/p per column of the colouring matrix (the arcs in
        ``diagram.arcs`` order, then one per free loop), normalised so the first column
        has colour 0 and the first nonzero colour is 1.  The colouring is checked against
        every crossing relation 2·over ≡ under_in + under_out (mod p) before it is
        returned.

    Raises
    ------
    ValueError
        If ``p`` is not a prime.
    RuntimeError
        If the colouring found fails the check (an internal error, never expected).

    Notes
    -----
    Linear algebra over Z/p: sparse elimination, then the first nullspace vector that is
    not constant (Fox 1962; Crowell–Fox 1963).
    """
    _check_prime(p)
    basis = _nullspace_mod_p(diagram, p)
    for b in basis[1:]:
        if len(set(b)) > 1:
            w = _normalise(list(b), p)
            if not _is_coloring(diagram, w, p) or len(set(w)) < 2:
                raise RuntimeError(f"witness {p}-colouring failed the crossing check (internal error)")
            return w
    return None


def min_colors(diagram: Diagram, p: int, *, budget: int = 10_000) -> Optional[int]:
    """Fewest distinct colours used by a nontrivial Fox p-colouring of this diagram.

    Parameters
    ----------
    diagram : Diagram
    p : int
        A prime.
    budget : int, default 10000
        Largest number of candidate colourings to look at.

    Returns
    -------
    int or None
        The minimum; None when there is no nontrivial p-colouring or when the
        (p^k − 1)/(p − 1) candidates exceed ``budget`` (the caller records
        "skipped: min_colors budget N").

    Notes
    -----
    The number of distinct colours is unchanged by x ↦ a·x + b (a ≠ 0), so it suffices
    to look at one nonzero vector per line of the p-colouring space modulo constants,
    of dimension k: (p^k − 1)/(p − 1) candidates, each the first-nonzero-coordinate-1
    combination of the k non-constant basis vectors.  On one fixed diagram this can
    exceed the minimum over all diagrams of the knot (Nakamura–Nakanishi–Satoh 2013).
    """
    _check_prime(p)
    basis = _nullspace_mod_p(diagram, p)
    k = len(basis) - 1
    if k < 1:
        return None
    n_candidates = (p ** k - 1) // (p - 1)
    if n_candidates > budget:
        return None
    w = np.array(basis[1:], dtype=np.int64)  # k × columns
    best = None
    for lead in range(k):
        tail = k - 1 - lead
        count = p ** tail
        coeffs = np.zeros((count, k), dtype=np.int64)
        coeffs[:, lead] = 1
        idx = np.arange(count, dtype=np.int64)
        for t in range(tail):
            coeffs[:, lead + 1 + t] = (idx // p ** t) % p
        vecs = (coeffs @ w) % p
        vecs.sort(axis=1)
        distinct = 1 + (np.diff(vecs, axis=1) != 0).sum(axis=1)
        m = int(distinct.min())
        best = m if best is None else min(best, m)
    return best
