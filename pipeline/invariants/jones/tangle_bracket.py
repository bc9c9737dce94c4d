"""Linear-time Kauffman bracket of rational tangles, two-bridge and Montesinos links.

The bracket of a 4-ended tangle T is a pair (f, g) of Laurent polynomials in A
with ``<T> = f·<[0]> + g·<[∞]>``, where ``[0]`` is the crossingless tangle with arcs
NW–NE and SW–SE and ``[∞]`` the one with arcs NW–SW and NE–SE [1, 2].  Placing
tangles side by side (``T + S``) or one above the other (``T * S``) and closing
act on the pairs by

* ``(f, g) + (f', g') = (f f', f g' + g f' + δ g g')``  (``[∞] + [∞]`` closes a loop),
* ``(f, g) * (f', g') = (f g' + g f' + δ f f', g g')``  (``[0] * [0]`` closes a loop),
* ``<N(T)> = δ f + g``  (the numerator closure of ``[0]`` is two loops),

with ``δ = −A² − A⁻²`` and ``<unknot> = 1``.  A single crossing is ``(A, A⁻¹)`` when
its A-smoothing is ``[0]`` and ``(A⁻¹, A)`` otherwise.  The functions below repeat
exactly the construction of :mod:`pipeline.diagrams.builder` (same twists, same order, same
crossing picture), so they return the bracket of the very diagram that
``parse("rational:...")``, ``parse("conway:...")``, ``parse("pretzel:...")`` or
``parse("montesinos:...")`` builds; the Jones polynomial then needs only that
diagram's writhe (:func:`pipeline.invariants.jones.frontier.jones_from_bracket`).  The tests
check every route against the general frontier programme.

Polynomials are ``(offset, fmpz_poly)`` pairs meaning ``A^offset · p(A)``; degrees
are bounded by 4·(crossings + 1), so every python-flint call is bounded.

References
----------
1. L. H. Kauffman, "State models and the Jones polynomial", Topology 26 (1987).
2. J. R. Goldman, L. H. Kauffman, "Rational tangles", Adv. Appl. Math. 18 (1997).
"""

from __future__ import annotations

from fractions import Fraction
from typing import Optional, Sequence

import flint

from ...diagrams.families import montesinos as _montesinos
from ...diagrams.families import two_bridge as _two_bridge
from ...diagrams.notation import Notation, parse_notation, split_notation
from ..poly import Laurent

__all__ = ["rational_tangle_bracket", "two_bridge_bracket", "montesinos_bracket", "bracket_of_notation"]

_Poly = tuple[int, flint.fmpz_poly]
_Pair = tuple[_Poly, _Poly]

_ZERO: _Poly = (0, flint.fmpz_poly([]))
_ONE: _Poly = (0, flint.fmpz_poly([1]))
_DELTA: _Poly = (-2, flint.fmpz_poly([-1, 0, 0, 0, -1]))


def _add(x: _Poly, y: _Poly) -> _Poly:
    (o1, p1), (o2, p2) = x, y
    if p1.is_zero():
        return y
    if p2.is_zero():
        return x
    if o1 <= o2:
        return o1, p1 + p2.left_shift(o2 - o1)
    return o2, p2 + p1.left_shift(o1 - o2)


def _mul(x: _Poly, y: _Poly) -> _Poly:
    return x[0] + y[0], x[1] * y[1]


def _tangle_sum(t: _Pair, s: _Pair) -> _Pair:
    (f, g), (f2, g2) = t, s
    return _mul(f, f2), _add(_add(_mul(f, g2), _mul(g, f2)), _mul(_DELTA, _mul(g, g2)))


def _shift(x: _Poly, k: int, sign: int = 1) -> _Poly:
    """±A^k · x."""
    return (x[0] + k, x[1] if sign > 0 else -x[1])


def _twist(t: _Pair, s: int, horizontal: bool) -> _Pair:
    """One half-twist: ``t + c`` (horizontal) or ``t * c`` (vertical) for the crossing
    c drawn by ``builder._crossing_tangle(s)``.  For s > 0 its under-strand runs
    SW–NE, so its A-smoothing (each under-strand end joined to the next slot
    counterclockwise) is SW–SE, NE–NW = [0]: c = (A^s, A^-s) for s = ±1.  The
    rules above then simplify, because
    A^s + δA^-s = −A^(−3s) and A^-s + δA^s = −A^(3s):

    * horizontal: (f, g) -> (A^s f, A^-s f − A^(−3s) g),
    * vertical:   (f, g) -> (A^s g − A^(3s) f, A^-s g).
    """
    f, g = t
    if horizontal:
        return _shift(f, s), _add(_shift(f, -s), _shift(g, -3 * s, -1))
    return _add(_shift(g, s), _shift(f, 3 * s, -1)), _shift(g, -s)


def _rational_pair(terms: Sequence[int], picture: int) -> _Pair:
    """The pair of builder.rational_tangle(terms, picture), twist by twist."""
    n = len(terms)
    t: _Pair = (_ONE, _ZERO) if n % 2 == 1 else (_ZERO, _ONE)
    for k in range(n, 0, -1):
        a = terms[k - 1]
        s = picture * (1 if a > 0 else -1)
        for _ in range(abs(a)):
            t = _twist(t, s, k % 2 == 1)
    return t


def _closure(t: _Pair) -> Laurent:
    off, poly = _add(_mul(_DELTA, t[0]), t[1])
    return Laurent({2 * (off + j): int(c) for j, c in enumerate(poly.coeffs()) if c})


def rational_tangle_bracket(terms: Sequence[int], *, picture: int = 1) -> tuple[Laurent, Laurent]:
    """The bracket pair (f, g), ``<T> = f<[0]> + g<[∞]>``, of the rational tangle
    a1 + 1/(a2 + 1/(… + 1/an)) drawn as ``builder.rational_tangle`` draws it.

    Returns Laurent polynomials whose variable stands for A (doubled exponents).

    Examples
    --------
    >>> f, g = rational_tangle_bracket([1])
    >>> f.to_text("A"), g.to_text("A")
    ('A', 'A^(-1)')
    """
    f, g = _rational_pair([int(a) for a in terms], picture)
    return tuple(Laurent({2 * (p[0] + j): int(c) for j, c in enumerate(p[1].coeffs()) if c}) for p in (f, g))


def two_bridge_bracket(terms: Sequence[int]) -> Laurent:
    """<N(T)> for the rational tangle with Conway terms ``terms``: the bracket of the
    diagram of ``conway:a1 ... an`` (and of ``rational:α/β`` with the terms of
    ``two_bridge.continued_fraction(α, β)``), in O(n) pair operations.

    Examples
    --------
    >>> two_bridge_bracket([3]).to_text("A")
    'A^(-7) - A^(-3) - A^5'
    """
    return _closure(_rational_pair([int(a) for a in terms], _two_bridge.PICTURE))


def montesinos_bracket(fractions: Sequence[Optional[Fraction]]) -> Laurent:
    """<N(T1 + ⋯ + Tr)> for tangle fractions βi/αi (None is the ∞ tangle): the bracket of
    the diagram ``montesinos.diagram(fractions)`` builds (``pretzel:p1,...,pk`` is
    ``[1/p1, ..., 1/pk]``, a zero entry None), in O(crossings) pair operations.

    Examples
    --------
    >>> montesinos_bracket([Fraction(1, 1), Fraction(1, 2)]) == two_bridge_bracket([3])  # P(1,2) = T(2,3)
    True
    """
    total: Optional[_Pair] = None
    for fr in fractions:
        terms = [] if fr is None else _two_bridge.continued_fraction(fr.numerator, fr.denominator)
        pair = _rational_pair(terms, _montesinos.PICTURE)
        total = pair if total is None else _tangle_sum(total, pair)
    if total is None:
        raise ValueError("montesinos: no tangles given")
    return _closure(total)


def bracket_of_notation(text: "str | Notation") -> Optional[Laurent]:
    """The bracket of the diagram ``parse(text)`` builds, by the tangle route, for the
    kinds ``conway``, ``rational``, ``pretzel`` and ``montesinos``; None for any other
    kind (use :func:`pipeline.invariants.jones.frontier.kauffman_bracket` then).

    ``text`` is a diagram string or its parsed :class:`~pipeline.diagrams.notation.Notation`
    (:func:`~pipeline.diagrams.notation.parse_notation`); the numbers are the parser's,
    and the Jones polynomial is
    ``jones_from_bracket(bracket_of_notation(text), parse(text).writhe)``.

    Raises
    ------
    NotationError
        When the arguments cannot be read (as ``parse`` would).

    Examples
    --------
    >>> bracket_of_notation("pretzel:1,2") == bracket_of_notation("conway:3")
    True
    >>> bracket_of_notation("torus:2,3") is None
    True
    """
    n = text if isinstance(text, Notation) else None
    if n is None:
        kind, _ = split_notation(text)
        if kind not in _TANGLE_KINDS:
            return None
        n = parse_notation(text)
    if n.kind == "conway":
        return two_bridge_bracket(list(n.args))
    if n.kind == "rational":
        alpha, beta = n.args
        return two_bridge_bracket(_two_bridge.continued_fraction(alpha, beta) if beta else [])
    if n.kind == "pretzel":
        return montesinos_bracket([None if p == 0 else Fraction(1, p) for p in n.args])
    if n.kind == "montesinos":
        return montesinos_bracket(list(n.args))
    return None


_TANGLE_KINDS = ("conway", "rational", "pretzel", "montesinos")
