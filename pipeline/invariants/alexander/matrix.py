"""The Alexander matrix of a diagram and its determinant over Z[t] up to units.

The Wirtinger presentation has one generator per arc and one relation per crossing.
With every generator sent to t, the Fox derivatives of the relation at a crossing
with over arc k, incoming under arc i and outgoing under arc j are

* ``(1 − t, t, −1)`` at ``(k, i, j)`` for a positive crossing,
* ``(1 − t, −1, t)`` for a negative one (the relation conjugates the other way;
  the row was multiplied by the unit −t to keep entries in Z[t]).

Entries add when arcs coincide (kinks).  Deleting one row and one column gives a
square matrix whose determinant is the Alexander polynomial up to a unit ±t^k.

The determinant is taken exactly in Z[t] (python-flint ``fmpz_poly``): first a sparse
elimination on monomial pivots ±t^k, which are units of Z[t^±1] — a row is multiplied
by the pivot before the other row is subtracted, so every step changes the
determinant by a unit only — chosen fewest-fill-in first (Markowitz count); what is
left without a monomial entry is a small dense block, finished by fraction-free
(Bareiss) elimination with exact polynomial division.

References
----------
1. J. W. Alexander, "Topological invariants of knots and links", Trans. AMS 30 (1928).
2. R. H. Fox, "Free differential calculus I", Ann. of Math. 57 (1953);
   R. H. Crowell, R. H. Fox, introductory textbook (1963), ch. VII–VIII.
3. H. M. Markowitz, "The elimination form of the inverse and its application to
   linear programming", Management Science 3 (1957).
4. E. H. Bareiss, "Sylvester's identity and multistep integer-preserving Gaussian
   elimination", Math. Comp. 22 (1968).
"""

from __future__ import annotations

import heapq

from flint import fmpz_poly

from ...diagrams.diagram import Diagram

__all__ = ["alexander_rows", "det_up_to_units", "alexander_minor_det"]

Row = dict[int, fmpz_poly]

_T = fmpz_poly([0, 1])
_ONE_MINUS_T = fmpz_poly([1, -1])
_MINUS_ONE = fmpz_poly([-1])


def alexander_rows(diagram: Diagram) -> tuple[list[Row], int]:
    """Rows of the Alexander matrix (one per crossing) and the number of arcs (columns).

    Column k is arc k of ``diagram.arcs``; free loops add no column.
    """
    arc = diagram.arc_of_label
    rows: list[Row] = []
    for i, x in enumerate(diagram.pd):
        over = arc[x[1]]
        entries = ((over, _ONE_MINUS_T), (arc[x[0]], _T), (arc[x[2]], _MINUS_ONE)) \
            if diagram.signs[i] > 0 else \
            ((over, _ONE_MINUS_T), (arc[x[0]], _MINUS_ONE), (arc[x[2]], _T))
        row: Row = {}
        for col, val in entries:
            v = row.get(col)
            row[col] = val if v is None else v + val
        rows.append({c: v for c, v in row.items() if not v.is_zero()})
    return rows, len(diagram.arcs)


def alexander_minor_det(diagram: Diagram) -> fmpz_poly:
    """det of the Alexander matrix with the last row and column 0 deleted, up to ±t^k.

    The diagram must be connected with as many arcs as crossings (every component
    passes under somewhere); callers handle the split cases first.
    """
    rows, ncols = alexander_rows(diagram)
    if ncols != len(rows):
        raise ValueError("the Alexander matrix is not square")
    minor = [{c - 1: v for c, v in r.items() if c} for r in rows[:-1]]
    return det_up_to_units(minor, ncols - 1)


def _monomial(p: fmpz_poly) -> int | None:
    """The exponent k when p = ±t^k, else None."""
    k = p.degree()
    c = p[k]
    if c != 1 and c != -1:
        return None
    if k == 0:
        return 0
    low = 0
    while p[low] == 0:
        low += 1
    return k if low == k else None


def _strip(row: Row) -> None:
    """Divide a row by the largest power of t dividing all its entries (a unit)."""
    low = None
    for v in row.values():
        j = 0
        while v[j] == 0:
            j += 1
        low = j if low is None else min(low, j)
        if low == 0:
            return
    if low:
        for c in row:
            row[c] = row[c].right_shift(low)


def det_up_to_units(rows: list[Row], n: int) -> fmpz_poly:
    """Determinant over Z[t] of a square sparse matrix, up to a unit ±t^k.

    Parameters
    ----------
    rows : list of dict
        ``n`` rows, each a map column -> nonzero ``fmpz_poly`` (columns 0..n−1).
        The rows are consumed (modified).
    n : int
        Size of the matrix.

    Returns
    -------
    fmpz_poly
        det(M) · u for some unit u = ±t^k (0 when M is singular).
    """
    if n == 0:
        return fmpz_poly([1])
    rows = [dict(r) for r in rows]
    cols: list[set[int]] = [set() for _ in range(n)]
    for i, r in enumerate(rows):
        for c in r:
            cols[c].add(i)
    alive = [True] * len(rows)
    heap: list[tuple[int, int, int, int]] = []

    def push(i: int) -> None:
        r = rows[i]
        best = None
        for c, v in r.items():
            if _monomial(v) is not None:
                cost = (len(r) - 1) * (len(cols[c]) - 1)
                if best is None or cost < best[0]:
                    best = (cost, c)
        if best is not None:
            heapq.heappush(heap, (best[0], len(r), i, best[1]))

    for i in range(len(rows)):
        if not rows[i]:
            return fmpz_poly()
        push(i)
    while heap:
        _, size, p, c = heapq.heappop(heap)
        if not alive[p] or c not in rows[p] or _monomial(rows[p][c]) is None:
            continue
        prow = rows[p]
        piv = prow[c]
        alive[p] = False
        for cc in prow:
            cols[cc].discard(p)
        for i in list(cols[c]):
            r = rows[i]
            a = r.pop(c)
            cols[c].discard(i)
            for cc in list(r):
                r[cc] = r[cc] * piv
            for cc, v in prow.items():
                if cc == c:
                    continue
                w = r.get(cc)
                new = -(a * v) if w is None else w - a * v
                if new.is_zero():
                    if w is not None:
                        del r[cc]
                        cols[cc].discard(i)
                else:
                    if w is None:
                        cols[cc].add(i)
                    r[cc] = new
            if not r:
                return fmpz_poly()
            _strip(r)
            push(i)
    rest = [rows[i] for i in range(len(rows)) if alive[i]]
    if not rest:
        return fmpz_poly([1])
    used = sorted({c for r in rest for c in r})
    if len(used) < len(rest):
        return fmpz_poly()
    index = {c: k for k, c in enumerate(used)}
    dense = [[fmpz_poly()] * len(used) for _ in rest]
    for i, r in enumerate(rest):
        for c, v in r.items():
            dense[i][index[c]] = v
    return _bareiss(dense)


def _bareiss(m: list[list[fmpz_poly]]) -> fmpz_poly:
    """Fraction-free determinant over Z[t] (up to sign), exact polynomial division."""
    n = len(m)
    m = [row[:] for row in m]
    prev = fmpz_poly([1])
    for k in range(n - 1):
        best = None
        for i in range(k, n):
            if not m[i][k].is_zero() and (best is None or m[i][k].degree() < m[best][k].degree()):
                best = i
        if best is None:
            return fmpz_poly()
        if best != k:
            m[k], m[best] = m[best], m[k]
        pk = m[k][k]
        for i in range(k + 1, n):
            mik = m[i][k]
            for j in range(k + 1, n):
                m[i][j] = (m[i][j] * pk - mik * m[k][j]) // prev
            m[i][k] = fmpz_poly()
        prev = pk
    return m[n - 1][n - 1]
