"""Braid route: HOMFLY-PT of a braid closure by a transfer matrix over the Hecke algebra.

Method (V. F. R. Jones, "Hecke algebra representations of braid groups and link
polynomials", Ann. of Math. 126 (1987); A. Ocneanu's trace, FYHLMO, Bull. AMS 12 (1985)).
In the skein algebra of the n-strand braids the relation v⁻¹σ − vσ⁻¹ = z gives the
Hecke relation g² = vz·g + v², g⁻¹ = v⁻²g − v⁻¹z.  H_n has the basis T_w (w ∈ S_n), with
T_w g_i = T_(w s_i) when ℓ(w s_i) > ℓ(w) and vz·T_w + v²·T_(w s_i) otherwise.  The
closure is a linear functional, the Ocneanu trace, fixed by tr(1_n) = δ^(n−1),
tr(x g_(n−1)^(±1)) = tr(x) for x ∈ H_(n−1) (Markov moves) and tr(xy) = tr(yx), where
δ = (v⁻¹ − v)/z is P of the two-component unlink.

The word is applied letter by letter to a vector of n! coefficients (the transfer
matrix), so the cost is n!·O(length) polynomial shifts and additions: polynomial in
the length for a fixed number of strands.  A negative letter is applied as
v²·g⁻¹ = g − vz, and v^(−2·#negative letters) is put back at the end.  Coefficients
are packed into one python-flint fmpz_poly by v^a z^b -> X^(a·K + b) with K above every
z-degree (Kronecker substitution), so a shift by a monomial is ``left_shift``.

Traces of basis elements: for w moving n−1 to position j < n−1, w = u·s_(n−2)⋯s_j with
u ∈ S_(n−1) and lengths adding, so tr(T_w) = tr(T_y T_u g_(n−2)) = tr(T_y T_u) with
y = s_(n−3)⋯s_j (cyclicity, then the Markov move), a trace on H_(n−1); w fixing n−1
gives δ·tr_(n−1)(T_w).
"""

from __future__ import annotations

from functools import lru_cache
from typing import Optional, Sequence

from flint import fmpz_poly

from ...errors import BudgetExceeded, NotationError
from .hpoly import DELTA, HPoly

__all__ = ["homfly_braid", "MAX_STRANDS"]

#: n! grows fast; beyond this many strands use the general route.
MAX_STRANDS = 7

Perm = tuple[int, ...]


def _reduced_word(w: Perm) -> list[int]:
    """A reduced word i_1 … i_l with w = s_(i_1)⋯s_(i_l) (right multiplication by s_i swaps positions i, i+1)."""
    w = list(w)
    out = []
    changed = True
    while changed:  # bubble sort w to the identity; the swaps reversed give w
        changed = False
        for i in range(len(w) - 1):
            if w[i] > w[i + 1]:
                w[i], w[i + 1] = w[i + 1], w[i]
                out.append(i)
                changed = True
    return out[::-1]


def _times_generator(vec: dict[Perm, HPoly], i: int) -> dict[Perm, HPoly]:
    out: dict[Perm, HPoly] = {}
    for w, c in vec.items():
        ws = list(w)
        ws[i], ws[i + 1] = ws[i + 1], ws[i]
        ws = tuple(ws)
        if w[i] < w[i + 1]:
            out[ws] = out.get(ws, HPoly()) + c
        else:
            out[w] = out.get(w, HPoly()) + c.shift(1, 1)
            out[ws] = out.get(ws, HPoly()) + c.shift(2)
    return out


@lru_cache(maxsize=None)
def basis_trace(w: Perm) -> HPoly:
    """Ocneanu trace tr(T_w) of a basis element of H_n, n = len(w) (module docstring)."""
    n = len(w)
    if n <= 1:
        return HPoly.monomial()
    j = w.index(n - 1)
    if j == n - 1:
        return DELTA * basis_trace(w[:-1])
    u = list(w)
    for k in range(j, n - 1):
        u[k], u[k + 1] = u[k + 1], u[k]
    # T_y T_u in H_(n-1), y = s_(n-3) ... s_j
    y = list(range(n - 1))
    for k in range(n - 3, j - 1, -1):
        y[k], y[k + 1] = y[k + 1], y[k]
    vec = {tuple(y): HPoly.monomial()}
    for i in _reduced_word(tuple(u[:-1])):
        vec = _times_generator(vec, i)
    total = HPoly()
    for x, c in vec.items():
        total = total + c * basis_trace(x)
    return total


def homfly_braid(word: Sequence[int], *, strands: Optional[int] = None,
                 budget: Optional[int] = None) -> HPoly:
    """HOMFLY-PT of the closure of a braid word (i = σ_i, −i = σ_i⁻¹), by the Hecke transfer matrix.

    Parameters
    ----------
    word : sequence of nonzero int
        The braid word, as in ``braid:`` notation.
    strands : int, optional
        Number of strands (default max|i| + 1; extra strands are unknotted free loops).
    budget : int, optional
        Bound on n!·length, the size of the transfer computation; over it raises
        ``BudgetExceeded('homfly', budget)``.

    Returns
    -------
    HPoly
        P(v, z) with v⁻¹P(L₊) − vP(L₋) = zP(L₀), P(unknot) = 1.
    """
    word = [int(g) for g in word]
    if any(g == 0 for g in word):
        raise NotationError("braid: generator 0 is not allowed (use i or -i with i >= 1)")
    n = max((abs(g) for g in word), default=0) + 1 if strands is None else int(strands)
    if n < max((abs(g) for g in word), default=0) + 1 or n < 1:
        raise NotationError(f"braid: {n} strands cannot carry the word")
    if n > MAX_STRANDS:
        raise BudgetExceeded("homfly", MAX_STRANDS)
    size = 1
    for k in range(2, n + 1):
        size *= k
    if budget is not None and size * max(len(word), 1) > budget:
        raise BudgetExceeded("homfly", budget)
    L = len(word)
    K = L + n * n + 2  # above every z-degree of coefficient times trace
    vz, v2 = K + 1, 2 * K
    one = fmpz_poly([1])
    vec: dict[Perm, fmpz_poly] = {tuple(range(n)): one}
    neg = 0
    for g in word:
        i = abs(g) - 1
        out: dict[Perm, fmpz_poly] = {}
        for w, c in vec.items():
            ws = list(w)
            ws[i], ws[i + 1] = ws[i + 1], ws[i]
            ws = tuple(ws)
            up = w[i] < w[i + 1]
            if g > 0:
                if up:
                    _acc(out, ws, c)
                else:
                    _acc(out, w, c.left_shift(vz))
                    _acc(out, ws, c.left_shift(v2))
            else:
                if up:
                    _acc(out, ws, c)
                    _acc(out, w, -c.left_shift(vz))
                else:
                    _acc(out, ws, c.left_shift(v2))
        vec = out
        neg += g < 0
    # tr(T_w)·v^(n−1) z^(n−1) is a polynomial in v, z: pack it the same way
    total = fmpz_poly([])
    for w, c in vec.items():
        t = basis_trace(w).shift(n - 1, n - 1)
        packed = fmpz_poly([])
        for (a, b), coef in t.terms:
            packed += coef * one.left_shift(a * K + b)
        total += c * packed
    terms = {}
    for e, coef in enumerate(total.coeffs()):
        if coef:
            a, b = divmod(e, K)
            terms[(a - (n - 1) - 2 * neg, b - (n - 1))] = int(coef)
    return HPoly(terms)


def _acc(out: dict, key, c: fmpz_poly) -> None:
    if key in out:
        out[key] = out[key] + c
    else:
        out[key] = c
