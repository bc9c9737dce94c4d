"""Exact Laurent polynomials in two variables v, z with integer coefficients.

The HOMFLY-PT polynomial in the normalisation v⁻¹P(L₊) − vP(L₋) = zP(L₀), P(unknot) = 1
lies in Z[v^±1, z^±1]: every exponent is an integer (no square roots occur in this
normalisation).  Parity (common practice, from the skein relation by induction on
crossings and unlinking): for a c-component link every term v^a z^b has a ≡ c − 1 and
b ≡ c − 1 (mod 2), and b ≥ 1 − c.  JSON form: the list of ``[v-exponent, z-exponent,
coefficient]`` sorted by (v-exponent, z-exponent), nonzero coefficients only.
"""

from __future__ import annotations

from typing import Iterable, Mapping

from flint import fmpz_poly

from ..poly import Laurent

__all__ = ["HPoly", "DELTA"]


class HPoly:
    """An immutable Σ c_ab v^a z^b, stored as a sorted tuple of ((a, b), c) with c ≠ 0."""

    __slots__ = ("_terms",)

    def __init__(self, terms: Mapping[tuple[int, int], int] | Iterable[tuple[tuple[int, int], int]] = ()) -> None:
        items = terms.items() if isinstance(terms, Mapping) else terms
        acc: dict[tuple[int, int], int] = {}
        for (a, b), c in items:
            acc[(int(a), int(b))] = acc.get((int(a), int(b)), 0) + int(c)
        self._terms = tuple(sorted((k, c) for k, c in acc.items() if c))

    @classmethod
    def monomial(cls, a: int = 0, b: int = 0, c: int = 1) -> "HPoly":
        """c·v^a z^b."""
        return cls({(a, b): c})

    @classmethod
    def from_json(cls, data: list) -> "HPoly":
        """Inverse of :meth:`to_json`."""
        return cls(((int(a), int(b)), int(c)) for a, b, c in data)

    @property
    def terms(self) -> tuple[tuple[tuple[int, int], int], ...]:
        """(((v-exponent, z-exponent), coefficient), ...) sorted."""
        return self._terms

    def to_json(self) -> list[list[int]]:
        """[[v-exponent, z-exponent, coefficient], ...] sorted, nonzero only."""
        return [[a, b, c] for (a, b), c in self._terms]

    def to_text(self) -> str:
        """Human-readable form, e.g. ``2v^2 - v^4 + v^2z^2``."""
        if not self._terms:
            return "0"
        out = ""
        for k, ((a, b), c) in enumerate(self._terms):
            mono = "".join(f"{x}" if e == 1 else f"{x}^{e}" if e > 0 else f"{x}^({e})"
                           for x, e in (("v", a), ("z", b)) if e)
            mag = abs(c)
            body = str(mag) if not mono else (mono if mag == 1 else f"{mag}{mono}")
            sign = "-" if c < 0 else "+"
            out += (("-" if c < 0 else "") + body) if k == 0 else f" {sign} {body}"
        return out

    # arithmetic
    def __add__(self, other: "HPoly") -> "HPoly":
        return HPoly(list(self._terms) + list(other._terms))

    def __neg__(self) -> "HPoly":
        return HPoly((k, -c) for k, c in self._terms)

    def __sub__(self, other: "HPoly") -> "HPoly":
        return self + (-other)

    def __mul__(self, other: "HPoly | int") -> "HPoly":
        if isinstance(other, int):
            return HPoly((k, c * other) for k, c in self._terms)
        acc: dict[tuple[int, int], int] = {}
        for (a1, b1), c1 in self._terms:
            for (a2, b2), c2 in other._terms:
                k = (a1 + a2, b1 + b2)
                acc[k] = acc.get(k, 0) + c1 * c2
        return HPoly(acc)

    __rmul__ = __mul__

    def __pow__(self, k: int) -> "HPoly":
        out = HPoly.monomial()
        for _ in range(k):
            out = out * self
        return out

    def shift(self, a: int, b: int = 0) -> "HPoly":
        """Multiply by v^a z^b."""
        return HPoly(((x + a, y + b), c) for (x, y), c in self._terms)

    def __eq__(self, other: object) -> bool:
        return isinstance(other, HPoly) and self._terms == other._terms

    def __hash__(self) -> int:
        return hash(self._terms)

    def __repr__(self) -> str:
        return f"HPoly({self.to_text()})"

    def __bool__(self) -> bool:
        return bool(self._terms)

    # symmetries and specialisations
    def mirror(self) -> "HPoly":
        """P of the mirror image: v -> −v⁻¹ (z kept).

        From the skein relation: changing every crossing swaps the roles of L₊ and
        L₋, and v⁻¹P₊ − vP₋ = zP₀ becomes the same relation with v replaced by −v⁻¹.
        """
        return HPoly(((-a, b), -c if a % 2 else c) for (a, b), c in self._terms)

    def conway(self) -> Laurent:
        """∇(z) = P(v = 1, z), as a :class:`Laurent` in z (doubled exponents, like ∇ elsewhere)."""
        acc: dict[int, int] = {}
        for (_, b), c in self._terms:
            acc[2 * b] = acc.get(2 * b, 0) + c
        return Laurent(acc)

    def jones(self) -> Laurent:
        """V(t) = P(v = t, z = t^½ − t^−½), as a :class:`Laurent` in t (exact division).

        With s = t^½: v^a z^b = s^(2a − b)·(s² − 1)^b; negative b are cleared by
        multiplying with (s² − 1)^m and dividing it out exactly afterwards.
        """
        if not self._terms:
            return Laurent()
        m = max(0, -min(b for (_, b), _ in self._terms))
        low = min(2 * a - b for (a, b), _ in self._terms)
        total = fmpz_poly([])
        s2m1 = fmpz_poly([-1, 0, 1])
        for (a, b), c in self._terms:
            total += c * fmpz_poly([0] * (2 * a - b - low) + [1]) * s2m1 ** (b + m)
        q, r = divmod(total, s2m1 ** m)
        if r != 0:
            raise ArithmeticError(f"homfly: {self.to_text()} does not specialise to a Laurent polynomial")
        return Laurent({k + low: int(c) for k, c in enumerate(q.coeffs()) if c})


#: P of the two-component unlink: δ = (v⁻¹ − v)/z (skein relation on a kink).
DELTA = HPoly({(-1, -1): 1, (1, -1): -1})
