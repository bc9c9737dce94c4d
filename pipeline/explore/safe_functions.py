"""The whitelisted functions of the safe expression language (:mod:`pipeline.explore.safe_expr`).

Each function takes exact values (int, :class:`fractions.Fraction`, bool, str, tuples)
and returns exact values; a type error raises :class:`ClaimError`, an undefined value
(a zero modulus, the square root of a negative number) raises :class:`Null`, which makes
the row undecided.
"""

from __future__ import annotations

from fractions import Fraction
from math import gcd, isqrt, lcm, prod
from typing import Any, Callable

from ..errors import ClaimError
from ..numbers import is_prime

__all__ = ["Null", "FUNCTIONS", "ROW_FUNCTIONS", "as_number", "as_integer", "normalise"]


class Null(Exception):
    """Internal signal: a null value was used, so the row is undecided."""


def as_number(x: Any, what: str) -> Any:
    if isinstance(x, bool) or isinstance(x, (int, Fraction)):
        return x
    raise ClaimError(f"{what} needs numbers, got {type(x).__name__} {str(x)[:40]!r}")


def as_integer(x: Any, what: str) -> int:
    x = as_number(x, what)
    if isinstance(x, Fraction):
        if x.denominator != 1:
            raise ClaimError(f"{what} needs integers, got {x}")
        return int(x)
    return int(x)


def normalise(x: Any) -> Any:
    if isinstance(x, Fraction) and x.denominator == 1:
        return int(x)
    return x


def _seq(args: tuple) -> tuple:
    if len(args) == 1 and isinstance(args[0], (tuple, list)):
        return tuple(args[0])
    return args


def _is_prime(n: Any) -> bool:
    return is_prime(as_integer(n, "is_prime"))


def _divides(a: Any, b: Any) -> bool:
    a, b = as_integer(a, "divides"), as_integer(b, "divides")
    return b == 0 if a == 0 else b % a == 0


def _mod(a: Any, n: Any) -> int:
    a, n = as_integer(a, "mod"), as_integer(n, "mod")
    if n == 0:
        raise Null()
    return a % n


def _is_square(n: Any) -> bool:
    n = as_integer(n, "is_square")
    return n >= 0 and isqrt(n) ** 2 == n


def _isqrt(n: Any) -> int:
    n = as_integer(n, "isqrt")
    if n < 0:
        raise Null()
    return isqrt(n)


def _sign(x: Any) -> int:
    x = as_number(x, "sign")
    return (x > 0) - (x < 0)


def _fraction_part(name: str, part: str) -> Callable:
    def f(x: Any) -> int:
        return getattr(Fraction(as_number(x, name)), part)
    return f


def _minmax(fn: Callable, name: str) -> Callable:
    def f(*args: Any) -> Any:
        vals = _seq(args)
        if not vals:
            raise ClaimError(f"{name} of an empty list")
        return fn(vals)
    return f


#: name -> (min args, max args or None, implementation, one-line description)
FUNCTIONS: dict[str, tuple[int, Any, Callable, str]] = {
    "abs": (1, 1, lambda x: abs(as_number(x, "abs")), "absolute value"),
    "gcd": (1, None, lambda *a: gcd(*[as_integer(x, "gcd") for x in _seq(a)]), "greatest common divisor"),
    "lcm": (1, None, lambda *a: lcm(*[as_integer(x, "lcm") for x in _seq(a)]), "least common multiple"),
    "min": (1, None, _minmax(min, "min"), "smallest argument (or element of one list)"),
    "max": (1, None, _minmax(max, "max"), "largest argument (or element of one list)"),
    "mod": (2, 2, _mod, "mod(a, n) = a mod n in 0..n-1 for n > 0"),
    "divides": (2, 2, _divides, "divides(a, b): a divides b"),
    "is_prime": (1, 1, _is_prime, "n is a prime number"),
    "is_square": (1, 1, _is_square, "n is a perfect square"),
    "isqrt": (1, 1, _isqrt, "integer square root"),
    "odd": (1, 1, lambda n: as_integer(n, "odd") % 2 == 1, "n is odd"),
    "even": (1, 1, lambda n: as_integer(n, "even") % 2 == 0, "n is even"),
    "sign": (1, 1, _sign, "-1, 0 or 1"),
    "numerator": (1, 1, _fraction_part("numerator", "numerator"), "numerator of a fraction"),
    "denominator": (1, 1, _fraction_part("denominator", "denominator"), "denominator of a fraction"),
    "len": (1, 1, lambda s: len(s) if isinstance(s, (tuple, list, str)) else _bad("len", s), "length of a list"),
    "prod": (1, 1, lambda s: prod(as_integer(x, "prod") for x in _seq((s,))), "product of a list"),
    "sum": (1, 1, lambda s: sum(as_number(x, "sum") for x in _seq((s,))), "sum of a list"),
}

#: Functions that read the current row beyond its plain columns (provided by the row
#: environment): name -> (min args, max args, description).
ROW_FUNCTIONS: dict[str, tuple[int, int, str]] = {
    "colorable": (1, 1, "colorable(n): col_n > n, i.e. a nontrivial Fox n-colouring (colorings table)"),
    "colorings": (1, 1, "colorings(n): number of Fox n-colourings, trivial ones included (colorings table)"),
    "min_colors": (1, 1, "min_colors(p): fewest colours of a nontrivial p-colouring of this diagram"),
    "alexander_at": (1, 1, "alexander_at(x): the stored Alexander polynomial at an integer/fraction x"),
    "jones_at": (1, 1, "jones_at(x): the stored Jones polynomial at x (null if half-integer exponents)"),
}


def _bad(name: str, value: Any):
    raise ClaimError(f"{name} needs a list, got {type(value).__name__}")
