"""Small exact number and grouping helpers shared by several stages.

* :func:`is_prime`, :func:`primes_upto`, :func:`prime_factors` — exact integer
  arithmetic (primality by python-flint's ``fmpz.is_prime``, a proven test for the
  sizes used here: flint certifies primality, it does not return probable primes).
* :class:`UnionFind` — disjoint sets with path halving (Tarjan, "Efficiency of a good
  but not linear set union algorithm", J. ACM 22 (1975)); iterative, so no recursion
  depth limit on large diagrams.

This module sits below every stage (it imports nothing from the package).
"""

from __future__ import annotations

from typing import Hashable, Iterable

import flint

__all__ = ["is_prime", "primes_upto", "prime_factors", "UnionFind"]


def is_prime(n: int) -> bool:
    """True when the integer ``n`` is a prime (False for n < 2 and for non-integers).

    Examples
    --------
    >>> [n for n in range(20) if is_prime(n)]
    [2, 3, 5, 7, 11, 13, 17, 19]
    """
    if isinstance(n, bool) or not isinstance(n, int) or n < 2:
        return False
    return bool(flint.fmpz(n).is_prime())


def primes_upto(n: int) -> list[int]:
    """The primes p with 2 <= p <= n, ascending (sieve of Eratosthenes).

    Examples
    --------
    >>> primes_upto(16)
    [2, 3, 5, 7, 11, 13]
    """
    if n < 2:
        return []
    sieve = bytearray([1]) * (n + 1)
    sieve[0] = sieve[1] = 0
    p = 2
    while p * p <= n:
        if sieve[p]:
            sieve[p * p::p] = bytes(len(range(p * p, n + 1, p)))
        p += 1
    return [k for k in range(n + 1) if sieve[k]]


def prime_factors(n: int) -> list[int]:
    """The distinct primes dividing ``n`` (|n| >= 1), ascending; [] for ±1.

    Examples
    --------
    >>> prime_factors(360), prime_factors(97)
    ([2, 3, 5], [97])
    """
    n = abs(int(n))
    if n == 0:
        raise ValueError("prime_factors: 0 has no finite set of prime factors")
    if n == 1:
        return []
    return sorted(int(p) for p, _ in flint.fmpz(n).factor())


class UnionFind:
    """Disjoint sets over hashable items (an item is added on first mention).

    Examples
    --------
    >>> uf = UnionFind(range(4))
    >>> uf.union(0, 1), uf.union(2, 3), uf.union(1, 0)
    (True, True, False)
    >>> uf.find(1) == uf.find(0), uf.find(1) == uf.find(2), uf.count()
    (True, False, 2)
    """

    __slots__ = ("_parent",)

    def __init__(self, items: Iterable[Hashable] = ()) -> None:
        self._parent: dict = {x: x for x in items}

    def add(self, x: Hashable) -> None:
        """Make ``x`` a singleton set if it is new."""
        self._parent.setdefault(x, x)

    def find(self, x: Hashable) -> Hashable:
        """The representative of the set of ``x`` (adds ``x`` when new)."""
        parent = self._parent
        parent.setdefault(x, x)
        while parent[x] != x:
            parent[x] = parent[parent[x]]
            x = parent[x]
        return x

    def union(self, a: Hashable, b: Hashable) -> bool:
        """Merge the sets of ``a`` and ``b`` (the root of ``a`` goes under that of ``b``);
        True when they were different sets."""
        ra, rb = self.find(a), self.find(b)
        if ra == rb:
            return False
        self._parent[ra] = rb
        return True

    def __contains__(self, x: Hashable) -> bool:
        return x in self._parent

    def count(self) -> int:
        """Number of disjoint sets."""
        return len({self.find(x) for x in list(self._parent)})

    def groups(self) -> dict:
        """{root: [items in insertion order]} of every set."""
        out: dict = {}
        for x in list(self._parent):
            out.setdefault(self.find(x), []).append(x)
        return out
