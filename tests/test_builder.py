"""Tests of pipeline.diagrams.builder: planar pieces and Conway's tangle calculus -> PD codes.

Outside facts: a rational tangle of fraction p/q closes (numerator closure) to the two-bridge
link b(p, q) of determinant |p| (Conway 1970; Kauffman–Lambropoulou, L'Enseignement Math. 49,
2003; SOURCES.md families items 1-2), a knot iff p is odd; the horizontal twist [n], n > 0,
is drawn so that it closes to the positive torus link T(2, n), whose Jones polynomial is
V = t^{(p−1)(q−1)/2} (1 − t^{p+1} − t^{q+1} + t^{p+q})/(1 − t²) for p = 2 (V. F. R. Jones,
Ann. of Math. 126, 1987; SOURCES.md families item 4): the positive trefoil has writhe +3 in
its reduced alternating diagram and V = t + t³ − t⁴ (Jones, Bull. AMS 12, 1985), the
positive Hopf link linking number ±1 (its sign depends on the orientation).  The signature of the positive trefoil is −2 in the
convention of SOURCES.md (families item 4, T(2,3): −2).
"""

from __future__ import annotations

import random
from fractions import Fraction

import pytest

from pipeline.diagrams.builder import PlanarBuilder, numerator_closure, rational_tangle, tangle_sum
from pipeline.diagrams.diagram import Diagram
from pipeline.invariants.coloring import determinant
from pipeline.invariants.jones import jones_polynomial
from pipeline.invariants.poly import Laurent
from pipeline.invariants.signature import signature


def _closed(terms, picture=1):
    b = PlanarBuilder()
    numerator_closure(rational_tangle(b, terms, picture))
    return b.diagram()


def _fraction(terms):
    f = Fraction(terms[-1])
    for a in reversed(terms[:-1]):
        f = a + 1 / f
    return f


def test_positive_trefoil_handedness_by_writhe_jones_and_signature():
    d = _closed([3])
    assert isinstance(d, Diagram) and d.n_crossings == 3
    assert d.writhe == 3 and d.is_alternating()
    assert jones_polynomial(d) == Laurent.from_exponents([(1, 1), (3, 1), (4, -1)])   # t + t^3 - t^4
    assert signature(d) == -2                                                    # T(2,3): −2
    mirror = _closed([3], picture=-1)
    assert mirror.writhe == -3 and jones_polynomial(mirror) == jones_polynomial(d).invert()


@pytest.mark.parametrize("n", [3, 5, 7, 9, 11])
def test_horizontal_twist_closes_to_the_positive_torus_knot(n):
    # Jones' formula is for torus knots (gcd(2, n) = 1); links depend on the orientation
    d = _closed([n])
    # Jones' formula for T(2, n) as a polynomial in t^(1/2): multiply out (1 - t^2) V
    s = Fraction(n - 1, 2)
    numer = Laurent.from_exponents([(s, 1), (s + 3, -1), (s + n + 1, -1), (s + n + 2, 1)])
    assert jones_polynomial(d) * Laurent.from_exponents([(0, 1), (2, -1)]) == numer
    assert d.writhe == n and len(d.components) == 1


def test_hopf_link_has_linking_number_of_absolute_value_one():
    d = _closed([2])
    comp = d.component_of_label
    cross = [i for i, x in enumerate(d.pd) if comp[x[0]] != comp[x[1]]]
    assert len(d.components) == 2 and len(cross) == 2 and abs(sum(d.signs[i] for i in cross)) == 2


def test_random_rational_tangles_close_to_determinant_numerator():
    rng = random.Random(1956)
    for _ in range(60):
        terms = [rng.randint(1, 4) for _ in range(rng.randint(1, 5))]
        f = _fraction(terms)
        d = _closed(terms)
        assert d.n_crossings == sum(terms)
        assert determinant(d) == f.numerator                   # det b(p, q) = |p|
        assert len(d.components) == (1 if f.numerator % 2 else 2)
        assert d.is_alternating()                              # all-positive terms: alternating


def test_sum_of_rational_tangles_is_a_pretzel_with_its_determinant():
    # P(p1, p2, p3) = N(1/p1 + 1/p2 + 1/p3); det = |p1p2 + p2p3 + p1p3| (SOURCES.md families item 3)
    for ps in [(3, 3, 3), (3, 5, 7), (-2, 3, 5), (2, 3, 3), (3, 3, -3)]:
        b = PlanarBuilder()
        numerator_closure(tangle_sum([rational_tangle(b, [0, p]) for p in ps]))
        d = b.diagram()
        p1, p2, p3 = ps
        assert determinant(d) == abs(p1 * p2 + p2 * p3 + p1 * p3), ps


def test_open_slots_and_double_joins_are_refused():
    b = PlanarBuilder()
    x = b.crossing(over_odd=True)
    b.join((x, 0), (x, 1))
    with pytest.raises(RuntimeError, match="joined twice"):
        b.join((x, 1), (x, 2))
    with pytest.raises(RuntimeError, match="left open"):
        b.diagram()
