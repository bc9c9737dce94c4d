"""Fox colourings: colouring matrix, invariant factors, determinant, colouring counts.

Definitions (README.md, contract):

* **Colouring matrix** M: one row per crossing (PD order), one column per arc (maximal
  over-strand, in ``diagram.arcs`` order) and then one zero column per free loop.  The
  row of a crossing is 2·over − under_in − under_out, so at a kink it collapses to
  (1, −1), (2, −2) or 0.  M need not be square.
* **Invariant factors**: if M has rank r and Smith form diag(d_1, …, d_r, 0, …) with
  d_1 | d_2 | … | d_r, the invariant factors are the d_i ≠ 1 in ascending order followed
  by (columns − r − 1) zeros.  The cokernel of M is Z ⊕ H_1(Σ_2), Σ_2 the double branched
  cover; for a knot the factors are the Smith form of M with one row and one column
  deleted.
* **Determinant**: the product of the invariant factors (1 if none, 0 if any is 0).
* **Colourings**: col_n = n · Π gcd(n, d_i), with gcd(n, 0) = n, counts all Fox
  n-colourings including the n constant ones.

The Smith form is computed by eliminating ±1 pivots sparsely (small fill-in first by a
Markowitz threshold sweep, :mod:`.sparse_elimination`), dividing out a common factor of
what is left and eliminating again, and handing the small dense remainder to
python-flint's ``fmpz_mat.snf``.  The matrix itself is built in :mod:`.matrix`; colourings mod a prime
(witnesses, fewest colours) come from the same sparse elimination over Z/p in :mod:`.mod_p`;
both are re-exported here.

References
----------
1. R. H. Fox, "A quick trip through ..." (survey article), in *Topology of 3-Manifolds and
   Related Topics*, Prentice-Hall (1962): colourings of arcs, 2·over = under_1 + under_2.
2. R. H. Crowell, R. H. Fox, introductory textbook, Ginn (1963): the
   colouring (Alexander at t = −1) matrix and its elementary ideals.
3. J. H. Przytycki, "3-coloring and other elementary invariants of knots", Banach
   Center Publ. 42 (1998): col_n = n · Π gcd(n, d_i) (cited from memory).
"""

from __future__ import annotations

from collections import Counter
from functools import lru_cache
from math import gcd, lcm, prod

from flint import fmpz_mat

from ...diagrams.diagram import Diagram
from .matrix import _rows_and_columns, _sparse_matrix, coloring_matrix
from .mod_p import min_colors, witness_coloring
from .sparse_elimination import diagonalise, eliminate_units, smith_of_diagonal

__all__ = [
    "coloring_matrix",
    "invariant_factors",
    "determinant",
    "coloring_counts",
    "count_colorings",
    "nontrivially_colorable",
    "has_generating_coloring",
    "witness_coloring",
    "min_colors",
]


# ---------------------------------------------------------------------------- Smith form
#: A remainder with at most this many rows goes straight to dense ``fmpz_mat.snf``.
DENSE_LIMIT = 24


@lru_cache(maxsize=64)
def _smith(diagram: Diagram) -> tuple[tuple[int, ...], int, int]:
    """(Smith diagonal entries ≠ 1 ascending, rank, columns) of the colouring matrix
    (:func:`sparse_smith`)."""
    rows, col_rows = _rows_and_columns(diagram)
    factors, rank = sparse_smith(rows, col_rows)
    return factors, rank, len(col_rows)


def sparse_smith(rows: list[dict[int, int]], col_rows) -> tuple[tuple[int, ...], int]:
    """(Smith invariant factors ≠ 1 ascending, rank) of a sparse integer matrix.

    ``rows``: sparse rows without zero entries; ``col_rows``: the row indices of every
    column (list or dict, as in :func:`.sparse_elimination.eliminate_units`); both are
    consumed.  Stages, each keeping the Smith form: ±1 pivots eliminated sparsely;
    while the entries left have a common factor g > 1, divide it out
    (Smith(g·A) = g·Smith(A)) and eliminate the ±1 pivots that appear; if more than
    ``DENSE_LIMIT`` rows remain, sparse Euclidean diagonalisation (stopped if fill-in
    grows past eight times the start); the rest by dense ``fmpz_mat.snf``.  The diagonal
    entries collected are put in Smith order by a coprime base.
    """
    rest, pivots = eliminate_units(rows, col_rows)  # the rows are ours: eliminated in place
    rank = len(pivots)
    entries: list[int] = []
    scale = 1  # the remainder stands for scale · rest
    while rest:
        g = 0
        for r in rest:
            g = gcd(g, *r.values())
            if g == 1:
                break
        if g == 1:
            break
        scale *= g
        rows = [{c: v // g for c, v in r.items()} for r in rest]
        col_sets: dict[int, set[int]] = {c: set() for r in rows for c in r}  # columns in use
        for i, r in enumerate(rows):
            for c in r:
                col_sets[c].add(i)
        rest, pivots = eliminate_units(rows, col_sets)
        entries.extend([scale] * len(pivots))
    found: list[int] = []
    if len(rest) > DENSE_LIMIT:
        found, rest = diagonalise(rest, max_nnz=8 * sum(len(r) for r in rest) + 1000)
    if rest:
        found.extend(_dense_smith_diagonal(rest))
    entries.extend(scale * d for d in found)
    rank += len(entries)
    return tuple(smith_of_diagonal(entries)), rank


def _dense_smith_diagonal(rest: list[dict[int, int]]) -> list[int]:
    """The nonzero diagonal entries (made positive) of the Smith form of the sparse
    rows ``rest`` (columns without entries dropped), via flint's dense ``snf``."""
    cols = sorted({c for r in rest for c in r})
    where = {c: k for k, c in enumerate(cols)}
    m = fmpz_mat(len(rest), len(cols))
    for i, r in enumerate(rest):
        for c, v in r.items():
            m[i, where[c]] = v
    s = m.snf()
    out = []
    for k in range(min(s.nrows(), s.ncols())):
        d = abs(int(s[k, k]))
        if d:
            out.append(d)
    return out


def invariant_factors(diagram: Diagram) -> tuple[int, ...]:
    """Invariant factors of the colouring module of ``diagram``.

    The cokernel of the colouring matrix M is Z ⊕ H_1(Σ_2); its torsion-and-free part
    beyond the one Z is returned: the Smith diagonal entries d_i ≠ 1 in ascending
    order, then (columns − rank − 1) zeros.

    Parameters
    ----------
    diagram : Diagram

    Returns
    -------
    tuple of int
        E.g. ``(3,)`` for the trefoil, ``(2,)`` for the Hopf link, ``(0,)`` for the
        two-component unlink, ``()`` for the unknot.

    Notes
    -----
    ±1 pivots are eliminated first, each within a Markowitz-count limit that grows
    geometrically; each step is unimodular, so the Smith form is unchanged.  A common
    factor g of the remainder is split off (Smith(g·A) = g·Smith(A)) and the ±1 pivots
    of A eliminated in turn.  The small dense remainder goes to ``flint.fmpz_mat.snf``.  Results are cached per diagram (64 most recent).

    References
    ----------
    1. R. H. Crowell, R. H. Fox, introductory textbook (1963).
    2. H. J. S. Smith, Phil. Trans. R. Soc. London 151 (1861).
    """
    diag, rank, ncols = _smith(diagram)
    return diag + (0,) * max(ncols - rank - 1, 0)


def determinant(diagram: Diagram) -> int:
    """The determinant: product of the invariant factors (1 if none, 0 if any is 0).

    For a knot this is |Δ(−1)|, the order of H_1 of the double branched cover.

    Examples
    --------
    >>> from pipeline.diagrams.notation import parse
    >>> determinant(parse("conway:2 2"))    # figure-eight
    5
    """
    return prod(invariant_factors(diagram))


# ---------------------------------------------------------------------------- counts
def count_colorings(factors: tuple[int, ...] | list[int], n: int) -> int:
    """col_n = n · Π gcd(n, d_i) with gcd(n, 0) = n (Przytycki 1998, from memory)."""
    return n * prod(gcd(n, d) for d in factors)


def coloring_counts(diagram: Diagram, *, max_modulus: int = 16) -> dict[int, int]:
    """Number of Fox n-colourings (trivial ones included) for n = 2..max_modulus.

    Parameters
    ----------
    diagram : Diagram
    max_modulus : int, default 16

    Returns
    -------
    dict of int to int
        ``{n: col_n}``; e.g. the trefoil has ``col_3 = 9``.

    References
    ----------
    1. R. H. Fox (1962); R. H. Crowell, R. H. Fox (1963).
    2. J. H. Przytycki, Banach Center Publ. 42 (1998) (formula cited from memory).
    """
    factors = Counter(invariant_factors(diagram)).items()  # repeated factors: one gcd each
    return {n: n * prod(gcd(n, d) ** m for d, m in factors) for n in range(2, max_modulus + 1)}


def nontrivially_colorable(factors: tuple[int, ...] | list[int], n: int) -> bool:
    """True when there is a non-constant n-colouring, i.e. col_n > n.

    Equivalent to gcd(n, d_i) > 1 for some factor; for a knot, to gcd(n, det) ≠ 1.
    """
    return any(gcd(n, d) > 1 for d in factors)


def has_generating_coloring(factors: tuple[int, ...] | list[int], n: int) -> bool:
    """True when some n-colouring's colour differences generate all of Z/n.

    Such a colouring is a surjection H_1(Σ_2) ⊕ (free part) → Z/n.  The subgroup reached
    has order lcm_i gcd(n, d_i); for factors in a divisibility chain this is n exactly
    when n divides some d_i (gcd(n, 0) = n).  P(3, 3, −3) has 9 | det = 9 but factors
    (3, 3), so no generating 9-colouring.
    """
    return lcm(1, *(gcd(n, d) for d in factors)) == n if n > 1 else True
