"""Sparse Gaussian elimination with unit pivots, over Z and over Z/p.

The colouring matrix of a diagram has three nonzero entries per row (2, −1, −1) and is
the incidence pattern of a plane graph, so eliminating unit pivots one at a time keeps it
sparse.  Pivots are chosen by the Markowitz count (r − 1)(c − 1) — r, c the numbers
of nonzero entries in the pivot's row and column — which bounds the fill-in a step can
create: over Z/p greedily smallest first (priority queue), over Z (the hot path) by a
threshold sweep, any pivot whose count is within a limit that grows geometrically.

Over Z only pivots ±1 are taken: adding an integer multiple of one row to another and
then clearing the pivot's row by column operations are unimodular, so the Smith form of
the matrix is (1, …, 1) ⊕ (Smith form of what is left).  Over Z/p (p prime) every
nonzero entry is a unit; the pivot rows are kept so that the nullspace can be read off
by back-substitution.

References
----------
1. H. M. Markowitz, "The elimination form of the inverse and its application to
   linear programming", Management Science 3 (1957): the pivot count.
2. H. J. S. Smith, "On systems of linear indeterminate equations and congruences",
   Phil. Trans. R. Soc. London 151 (1861): the normal form kept by unimodular steps.
"""

from __future__ import annotations

import heapq
from dataclasses import dataclass, field
from typing import Optional, Union

__all__ = ["Elimination", "eliminate", "eliminate_units"]

Row = dict[int, int]


@dataclass
class Elimination:
    """What is left after eliminating unit pivots.

    Attributes
    ----------
    rest : list of dict
        The remaining nonzero rows (column -> entry); none of them has a unit entry
        (over Z: no ±1; over Z/p this list is empty).
    pivots : list of (dict, int)
        The pivot rows in elimination order as (tail, c): the row, normalised so that
        its pivot entry is 1, is e_c + tail (tail has no entry in column c).
    ncols : int
        Number of columns of the original matrix.
    """

    rest: list[Row]
    pivots: list[tuple[Row, int]] = field(default_factory=list)
    ncols: int = 0


def eliminate(rows: list[Row], ncols: int, modulus: Optional[int] = None) -> Elimination:
    """Eliminate unit pivots from a sparse matrix, fewest-fill-in first.

    Parameters
    ----------
    rows : list of dict
        Sparse rows, column index -> nonzero integer entry.  Not modified.
    ncols : int
        Number of columns.
    modulus : int, optional
        A prime p to work over Z/p; ``None`` (default) works over Z with pivots ±1.

    Returns
    -------
    Elimination
        The remaining rows and the pivot rows.

    Notes
    -----
    Over Z see :func:`eliminate_units`.  Over Z/p Markowitz counts are refreshed
    lazily: a popped candidate whose count has grown is pushed back, and the entries a pivot step changed are pushed with fresh counts
    (pushing whole rows would cost O(n) per step once a row has grown long).
    """
    if not modulus:
        rest, pivots = _eliminate_integer(rows, ncols)
        return Elimination(rest=rest, pivots=pivots, ncols=ncols)
    p = modulus
    work = [{c: v % p for c, v in r.items() if v % p} for r in rows]
    work = [r for r in work if r]
    col_rows: list[set[int]] = [set() for _ in range(ncols)]
    for i, r in enumerate(work):
        for c in r:
            col_rows[c].add(i)
    alive = [True] * len(work)
    heappush, heappop = heapq.heappush, heapq.heappop
    heap = [((len(r) - 1) * (len(col_rows[c]) - 1), i, c)
            for i, r in enumerate(work) for c in r]  # over Z/p every nonzero entry is a unit
    heapq.heapify(heap)
    pivots: list[tuple[Row, int]] = []
    while heap:
        cost, i, c = heappop(heap)
        if not alive[i]:
            continue
        r = work[i]
        v = r.get(c)
        if v is None:
            continue
        col = col_rows[c]
        actual = (len(r) - 1) * (len(col) - 1)
        if actual > cost:
            heappush(heap, (actual, i, c))
            continue
        alive[i] = False
        col.discard(i)
        del r[c]
        for c2 in r:
            col_rows[c2].discard(i)
        # the pivot row is e_c + tail once normalised to pivot 1
        if v != 1:
            inv = pow(v, -1, p)
            r = {c2: a * inv % p for c2, a in r.items()}
        items = list(r.items())
        for j in col:
            rj = work[j]
            f = rj.pop(c)
            for c2, a in items:
                nv = (rj.get(c2, 0) - f * a) % p
                if nv:
                    if c2 not in rj:
                        col_rows[c2].add(j)
                    rj[c2] = nv
                elif c2 in rj:
                    del rj[c2]
                    col_rows[c2].discard(j)
            if rj:  # only entries in the pivot row's columns changed: push those
                lr = len(rj) - 1
                for c2, _ in items:
                    w = rj.get(c2)
                    if w is not None:
                        heappush(heap, (lr * (len(col_rows[c2]) - 1), j, c2))
            else:
                alive[j] = False
        col.clear()
        pivots.append((r, c))
    rest = [work[i] for i in range(len(work)) if alive[i]]
    return Elimination(rest=rest, pivots=pivots, ncols=ncols)

def _eliminate_integer(rows: list[Row], ncols: int) -> tuple[list[Row], list[tuple[Row, int]]]:
    """:func:`eliminate` over Z (pivots ±1) on a copy of ``rows``."""
    work = [{c: v for c, v in r.items() if v} for r in rows]
    col_rows: list[set[int]] = [set() for _ in range(ncols)]
    for i, r in enumerate(work):
        for c in r:
            col_rows[c].add(i)
    rest, pivots = eliminate_units(work, col_rows)
    return rest, [(r if v == 1 else {c2: -a for c2, a in r.items()}, c) for r, c, v in pivots]


def eliminate_units(work: list[Optional[Row]], col_rows: Union[list[set[int]], dict[int, set[int]]]
                    ) -> tuple[list[Row], list[tuple[Row, int, int]]]:
    """Eliminate ±1 pivots over Z in place, by a Markowitz threshold sweep.

    Parameters
    ----------
    work : list of dict
        Sparse integer rows without zero entries; modified in place (the caller owns
        them; eliminated and emptied rows are replaced by None).
    col_rows : list of set of int, or dict of int to set of int
        For each column (list index or dict key), the indices of the rows with a nonzero
        entry there; modified.

    Returns
    -------
    (list of dict, list of (dict, int, int))
        The remaining nonzero rows (none has a ±1 entry) and the pivot rows as
        (tail, c, v): the row was v·e_c + tail, v = ±1, at its pivot step.

    Notes
    -----
    Rows wait on a stack.  A row popped takes its ±1 entry in the shortest column as
    pivot when the Markowitz count (r − 1)(c − 1) is at most a limit (first 4, the count
    of a generic crossing row); otherwise it is parked.  Rows changed by a pivot step
    are pushed again.  When the stack runs dry the parked rows are swept again with the
    limit multiplied by 4, so every step's fill-in stays within the current limit, as in
    Markowitz's rule with a threshold, without a priority queue.  Each step is
    unimodular (Smith 1861).
    """
    pivots: list[tuple[Row, int, int]] = []
    stack = list(range(len(work) - 1, -1, -1))
    parked: list[int] = []
    limit = 4
    units = {1, -1}
    while True:
        pop, push = stack.pop, stack.append
        while stack:
            i = pop()
            r = work[i]
            if r is None:  # eliminated or emptied
                continue
            best = 0
            for c, v in r.items():
                if v in units:
                    k = len(col_rows[c])
                    if not best or k < best:
                        best = k
                        bc = c
            if not best:
                if not r:
                    work[i] = None
                continue
            if (len(r) - 1) * (best - 1) > limit:
                parked.append(i)
                continue
            work[i] = None
            v = r.pop(bc)  # the row is v·e_bc + r, and 1/v = v
            col = col_rows[bc]
            col.discard(i)
            for c2 in r:
                col_rows[c2].discard(i)
            for j in col:
                rj = work[j]
                f = rj.pop(bc) * v
                for c2, a in r.items():
                    if c2 in rj:
                        old = rj[c2] - f * a
                        if old:
                            rj[c2] = old
                        else:
                            del rj[c2]
                            col_rows[c2].discard(j)
                    else:
                        rj[c2] = -f * a
                        col_rows[c2].add(j)
                if rj:
                    push(j)
                else:
                    work[j] = None
            col.clear()
            pivots.append((r, bc, v))
        if not parked:
            break
        limit *= 4
        parked.reverse()
        stack, parked = parked, []
    return [r for r in work if r], pivots


def diagonalise(rows: list[Row], *, max_nnz: Optional[int] = None) -> tuple[list[int], list[Row]]:
    """Bring a sparse integer matrix towards diagonal form by Euclidean steps.

    Repeatedly takes the entry of smallest absolute value a (fewest fill-in among
    ties), reduces its column by row operations and its row by column operations
    (remainders mod a); when a is alone in its row and column it is split off as a
    diagonal entry.  Every step is unimodular, so the matrix stays equivalent to
    diag(found) ⊕ rest.

    Parameters
    ----------
    rows : list of dict
        Sparse integer rows; not modified.
    max_nnz : int, optional
        Stop early (returning the rest) when the number of nonzero entries exceeds
        this; the caller finishes the rest densely.

    Returns
    -------
    (list of int, list of dict)
        The diagonal entries split off (not yet in Smith order) and the remaining rows.
    """
    work = [dict(r) for r in rows if r]
    col_rows: dict[int, set[int]] = {}
    for i, r in enumerate(work):
        for c in r:
            col_rows.setdefault(c, set()).add(i)
    alive = [True] * len(work)
    nnz = sum(len(r) for r in work)
    heap: list[tuple[int, int, int, int]] = []

    def push(i: int) -> None:
        r = work[i]
        lr = len(r) - 1
        for c, v in r.items():
            heapq.heappush(heap, (abs(v), lr * (len(col_rows[c]) - 1), i, c))

    for i in range(len(work)):
        push(i)
    diag: list[int] = []
    while heap:
        if max_nnz is not None and nnz > max_nnz:
            break
        av, cost, i, c = heapq.heappop(heap)
        if not alive[i]:
            continue
        r = work[i]
        a = r.get(c)
        if a is None or abs(a) != av:
            continue
        actual = (len(r) - 1) * (len(col_rows[c]) - 1)
        if actual > cost:
            heapq.heappush(heap, (av, actual, i, c))
            continue
        reduced = False
        for j in sorted(col_rows[c]):
            if j == i:
                continue
            rj = work[j]
            q = rj[c] // a
            for c2, b in r.items():
                nv = rj.get(c2, 0) - q * b
                if nv:
                    if c2 not in rj:
                        col_rows[c2].add(j)
                        nnz += 1
                    rj[c2] = nv
                elif c2 in rj:
                    del rj[c2]
                    col_rows[c2].discard(j)
                    nnz -= 1
            if c in rj:
                reduced = True
            if rj:
                push(j)
            else:
                alive[j] = False
        if reduced:
            push(i)
            continue
        for c2 in [k for k in r if k != c]:  # column operations touch only row i now
            nb = r[c2] - (r[c2] // a) * a
            if nb:
                r[c2] = nb
            else:
                del r[c2]
                col_rows[c2].discard(i)
                nnz -= 1
        if len(r) == 1:
            diag.append(a)
            alive[i] = False
            col_rows[c].discard(i)
            nnz -= 1
        else:
            push(i)
    rest = [work[i] for i in range(len(work)) if alive[i]]
    return diag, rest


def smith_of_diagonal(entries: list[int]) -> list[int]:
    """Smith invariant factors (≠ 1, ascending) of a diagonal matrix with nonzero entries.

    Uses a coprime base of the entries (no integer factorisation): for each base
    element b, the exponents of b in the entries are sorted, and the k-th largest
    invariant factor collects the k-th largest exponent of every b.  When the distinct
    entries, sorted, already divide one another they are the factors as they stand.
    """
    from collections import Counter
    from math import gcd

    counts = Counter(abs(d) for d in entries if abs(d) != 1)
    if not counts:
        return []
    distinct = sorted(counts)
    if all(b % a == 0 for a, b in zip(distinct, distinct[1:])):  # already a divisibility chain
        return [d for d in distinct for _ in range(counts[d])]
    base: list[int] = []
    for v in counts:
        stack = [v]
        while stack:
            y = stack.pop()
            if y == 1:
                continue
            for k, b in enumerate(base):
                g = gcd(b, y)
                if g > 1:
                    base.pop(k)
                    stack.extend((b // g, g, y // g))
                    break
            else:
                base.append(y)
    n = sum(counts.values())
    factors = [1] * n  # factors[k]: the k-th largest invariant factor
    for b in base:
        exps: list[int] = []
        for v, m in counts.items():
            e = 0
            while v % b == 0:
                v //= b
                e += 1
            exps.extend([e] * m)
        exps.sort(reverse=True)
        for k, e in enumerate(exps):
            if e == 0:
                break
            factors[k] *= b ** e
    return sorted(f for f in factors if f != 1)
