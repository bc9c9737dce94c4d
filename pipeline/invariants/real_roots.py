"""Exact real-root isolation by Sturm sequences over python-flint ``fmpq_poly``.

C. Sturm, "Mémoire sur la résolution des équations numériques" (1835): the number of
distinct real roots of a squarefree f in (a, b] is V(a) − V(b), V the sign changes of the
Sturm sequence.  Used for the jump points of the Tristram–Levine signature function.
"""

from __future__ import annotations

from fractions import Fraction

from flint import fmpq, fmpq_poly, fmpz_poly

from ..errors import KnotLedgerError

__all__ = ["sturm", "changes", "isolate", "halve"]


def sturm(f: fmpz_poly) -> list:
    """Sturm sequence of a squarefree integer polynomial (exact, over Q)."""
    seq = [fmpq_poly(f), fmpq_poly(f).derivative()]
    while seq[-1].degree() > 0:
        r = -(seq[-2] % seq[-1])
        if r == 0:
            break
        seq.append(r)
    return seq


def changes(seq: list, x: Fraction) -> int:
    vals = [v for v in (p(fmpq(x.numerator, x.denominator)) for p in seq) if v != 0]
    return sum(1 for a, b in zip(vals, vals[1:]) if (a > 0) != (b > 0))


def isolate(seq: list) -> list[tuple[Fraction, Fraction]]:
    """Disjoint intervals [lo, hi] ⊂ [−2, 2], one per real root of ``seq[0]`` in [−2, 2]
    (Sturm's theorem: #roots in (a, b] = V(a) − V(b)); a rational root is returned as
    [r, r].  ``seq[0]`` is an irreducible factor, so of degree ≥ 2 it has no rational root
    and no bisection point is ever a root.  Exact rational arithmetic only (python-flint
    ``fmpq_poly``)."""
    f = seq[0]
    if f.degree() == 1:
        c0, c1 = (Fraction(int(c.p), int(c.q)) for c in f.coeffs())
        r = -c0 / c1
        return [(r, r)] if -2 <= r <= 2 else []
    out, todo = [], [(Fraction(-2), Fraction(2))]
    while todo:
        a, b = todo.pop()
        n = changes(seq, a) - changes(seq, b)           # roots in (a, b]
        if n == 1:
            out.append((a, b))
        elif n > 1:
            m = (a + b) / 2
            if f(fmpq(m.numerator, m.denominator)) == 0:
                raise KnotLedgerError("tristram_levine: a rational root of an irreducible factor")
            todo += [(a, m), (m, b)]
    return sorted(out)


def halve(seq: list, lo: Fraction, hi: Fraction) -> tuple[Fraction, Fraction]:
    """The half of [lo, hi] that holds the one root of ``seq[0]`` in it (Sturm count)."""
    m = (lo + hi) / 2
    if seq[0](fmpq(m.numerator, m.denominator)) == 0:
        return m, m
    return (lo, m) if changes(seq, lo) - changes(seq, m) == 1 else (m, hi)
