"""Tests of pipeline.invariants.poly.Laurent: exact Laurent polynomials in t^(1/2).

The reference is sympy (a slow, independent route): every random Laurent polynomial is
also built as a sympy expression in s = t^(1/2), and sums, products, t -> 1/t, shifts and
values at t = 1 are compared term by term *(common practice: sympy as a reference
implementation of polynomial arithmetic)*.
"""

from __future__ import annotations

import json
from fractions import Fraction

import pytest
import sympy
from hypothesis import given, strategies as st

from pipeline.invariants.poly import Laurent

S = sympy.Symbol("s")          # s = t^(1/2): Laurent's doubled exponents are powers of s

terms = st.lists(st.tuples(st.integers(-12, 12), st.integers(-40, 40)), max_size=8)


def _sym(p: Laurent):
    return sympy.Add(*[c * S ** k for k, c in p.terms]) if p.terms else sympy.Integer(0)


def _from_sym(expr) -> dict:
    """{doubled exponent: coefficient} of a Laurent expression in s (via s^N · expr)."""
    expr = sympy.expand(expr)
    if expr == 0:
        return {}
    n = 40
    poly = sympy.Poly(sympy.expand(expr * S ** n), S)
    return {e - n: int(c) for (e,), c in poly.terms() if c}


@given(terms, terms)
def test_sum_difference_product_agree_with_sympy(a, b):
    p, q = Laurent(a), Laurent(b)
    assert dict((p + q).terms) == _from_sym(_sym(p) + _sym(q))
    assert dict((p - q).terms) == _from_sym(_sym(p) - _sym(q))
    assert dict((p * q).terms) == _from_sym(_sym(p) * _sym(q))


@given(terms, st.integers(-7, 7), st.integers(-9, 9))
def test_scalar_shift_invert_and_value_at_one_agree_with_sympy(a, n, k):
    p = Laurent(a)
    assert dict((p * n).terms) == dict((n * p).terms) == _from_sym(n * _sym(p))
    assert dict(p.shift(k).terms) == _from_sym(S ** k * _sym(p))
    assert dict(p.invert().terms) == _from_sym(_sym(p).subs(S, 1 / S))
    assert p.at_one() == _sym(p).subs(S, 1)
    assert p.is_symmetric() == (sympy.expand(_sym(p) - _sym(p).subs(S, 1 / S)) == 0)


@given(terms)
def test_json_round_trip_and_the_contract_form(a):
    p = Laurent(a)
    data = p.to_json()
    # README.md contract: sorted by exponent, nonzero int coefficients, k or k + 0.5 exponents
    assert [Fraction(str(e)) for e, _ in data] == sorted(Fraction(str(e)) for e, _ in data)
    assert all(isinstance(c, int) and c for _, c in data)
    assert all(isinstance(e, int) or (e * 2) % 2 == 1 for e, _ in data)
    assert Laurent.from_json(json.loads(json.dumps(data))) == p
    # exponents in t are the doubled exponents halved (against the sympy form in s)
    assert {Fraction(k, 2): c for k, c in _from_sym(_sym(p)).items()} == dict(zip(p.exponents(), dict(p.terms).values()))


@given(terms)
def test_span_is_degree_range_in_t(a):
    p = Laurent(a)
    d = _from_sym(_sym(p))
    assert p.span() == (Fraction(max(d) - min(d), 2) if d else 0)


def test_to_text_of_the_jones_polynomial_of_the_hopf_link():
    # V(Hopf) = -t^(1/2) - t^(5/2) (Jones, Bull. AMS 12, 1985): the exponent 5/2 is bracketed
    v = Laurent.from_exponents([(Fraction(1, 2), -1), (Fraction(5, 2), -1)])
    assert v.to_text() == "-t^(1/2) - t^(5/2)"
    # the trefoil's V = -t^-4 + t^-3 + t^-1 for the left-handed one (Jones 1985)
    assert Laurent.from_exponents([(-4, -1), (-3, 1), (-1, 1)]).to_text() == "-t^(-4) + t^(-3) + t^(-1)"


def test_bad_exponents_are_refused():
    with pytest.raises(ValueError, match="multiple of 1/2"):
        Laurent.from_exponents([(Fraction(1, 3), 1)])
    with pytest.raises(TypeError, match="must be an int"):
        Laurent([(1.0, 1)])
