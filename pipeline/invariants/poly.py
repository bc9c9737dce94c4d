"""Exact Laurent polynomials in t^(1/2) with integer coefficients.

Exponents are stored doubled (``2·e``) so half-integer exponents of the Jones
polynomial of a link with an even number of components stay integers.  JSON form
(README.md, contract): a list of ``[exponent, coefficient]`` pairs sorted by
exponent, nonzero coefficients only; an exponent is an int, or a float ``k + 0.5``
for half-integers; coefficients are always Python ints.
"""

from __future__ import annotations

from fractions import Fraction
from typing import Iterable, Mapping

__all__ = ["Laurent"]


class Laurent:
    """An immutable Laurent polynomial Σ c_k t^(k/2), stored as {k: c_k} with c_k ≠ 0."""

    __slots__ = ("_terms",)

    def __init__(self, terms: Mapping[int, int] | Iterable[tuple[int, int]] = ()) -> None:
        items = terms.items() if isinstance(terms, Mapping) else terms
        acc: dict[int, int] = {}
        for k, c in items:
            if not isinstance(k, int) or isinstance(k, bool):
                raise TypeError(f"doubled exponent {k!r} must be an int")
            acc[k] = acc.get(k, 0) + int(c)
        self._terms = tuple(sorted((k, c) for k, c in acc.items() if c))

    # construction helpers
    @classmethod
    def from_exponents(cls, pairs: Iterable[tuple[Fraction | int, int]]) -> "Laurent":
        """From (exponent, coefficient) pairs with integer or half-integer exponents."""
        out = []
        for e, c in pairs:
            d = Fraction(e) * 2
            if d.denominator != 1:
                raise ValueError(f"exponent {e} is not a multiple of 1/2")
            out.append((int(d), c))
        return cls(out)

    @classmethod
    def from_json(cls, data: list) -> "Laurent":
        """Inverse of :meth:`to_json`."""
        return cls.from_exponents((Fraction(str(e)), int(c)) for e, c in data)

    @property
    def terms(self) -> tuple[tuple[int, int], ...]:
        """((doubled exponent, coefficient), ...) sorted by exponent."""
        return self._terms

    def exponents(self) -> list[Fraction]:
        return [Fraction(k, 2) for k, _ in self._terms]

    def to_json(self) -> list[list]:
        """[[exponent, coefficient], ...]; exponents int or k+0.5, coefficients int."""
        return [[k // 2 if k % 2 == 0 else k / 2, c] for k, c in self._terms]

    def to_text(self, var: str = "t") -> str:
        """Human-readable form, e.g. ``t + t^3 - t^4`` or ``-t^(1/2) - t^(5/2)``."""
        if not self._terms:
            return "0"
        parts = []
        for k, c in self._terms:
            e = Fraction(k, 2)
            mono = "" if e == 0 else (var if e == 1 else f"{var}^{e}" if e > 0 and e.denominator == 1
                                      else f"{var}^({e})")
            mag = abs(c)
            body = str(mag) if not mono else (mono if mag == 1 else f"{mag}{mono}")
            parts.append(("-" if c < 0 else "+", body))
        text = ("-" if parts[0][0] == "-" else "") + parts[0][1]
        for sgn, body in parts[1:]:
            text += f" {sgn} {body}"
        return text

    # arithmetic
    def __add__(self, other: "Laurent") -> "Laurent":
        return Laurent(list(self._terms) + list(other._terms))

    def __neg__(self) -> "Laurent":
        return Laurent((k, -c) for k, c in self._terms)

    def __sub__(self, other: "Laurent") -> "Laurent":
        return self + (-other)

    def __mul__(self, other: "Laurent | int") -> "Laurent":
        if isinstance(other, int):
            return Laurent((k, c * other) for k, c in self._terms)
        acc: dict[int, int] = {}
        for k1, c1 in self._terms:
            for k2, c2 in other._terms:
                acc[k1 + k2] = acc.get(k1 + k2, 0) + c1 * c2
        return Laurent(acc)

    __rmul__ = __mul__

    def shift(self, doubled: int) -> "Laurent":
        """Multiply by t^(doubled/2)."""
        return Laurent((k + doubled, c) for k, c in self._terms)

    def invert(self) -> "Laurent":
        """Substitute t -> 1/t."""
        return Laurent((-k, c) for k, c in self._terms)

    def __eq__(self, other: object) -> bool:
        return isinstance(other, Laurent) and self._terms == other._terms

    def __hash__(self) -> int:
        return hash(self._terms)

    def __repr__(self) -> str:
        return f"Laurent({self.to_text()})"

    def __bool__(self) -> bool:
        return bool(self._terms)

    # evaluation and shape
    def span(self) -> Fraction:
        """max exponent − min exponent (0 for the zero polynomial)."""
        if not self._terms:
            return Fraction(0)
        return Fraction(self._terms[-1][0] - self._terms[0][0], 2)

    def at_one(self) -> int:
        """Value at t = 1 (t^(1/2) = 1)."""
        return sum(c for _, c in self._terms)

    def is_symmetric(self) -> bool:
        """True when p(t) = p(1/t)."""
        return self == self.invert()
