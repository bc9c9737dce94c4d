"""pipeline.numbers: primes and union-find against brute force (obviously-correct routes)."""

from __future__ import annotations

import random

import pytest

from pipeline.numbers import UnionFind, is_prime, prime_factors, primes_upto


def _trial_division(n: int) -> bool:
    return n >= 2 and all(n % d for d in range(2, int(n ** 0.5) + 1))


def test_is_prime_and_sieve_agree_with_trial_division():
    assert [n for n in range(-5, 3000) if is_prime(n)] == [n for n in range(-5, 3000) if _trial_division(n)]
    assert primes_upto(2999) == [n for n in range(3000) if _trial_division(n)]
    assert primes_upto(1) == [] and primes_upto(2) == [2]
    assert not is_prime(True) and not is_prime(7.0)
    # large values stay exact: 2^61 − 1 is a Mersenne prime, 2^61 + 1 is divisible by 3
    assert is_prime(2 ** 61 - 1) and not is_prime(2 ** 61 + 1)


@pytest.mark.parametrize("n", [1, 2, 12, 97, 360, 1001, 2 ** 10 * 3 ** 5, 999_983 * 2, -45])
def test_prime_factors_are_the_primes_dividing_n(n):
    assert prime_factors(n) == [p for p in range(2, abs(n) + 1) if _trial_division(p) and n % p == 0]


@pytest.mark.parametrize("seed", range(5))
def test_union_find_matches_graph_search(seed):
    rng = random.Random(seed)
    n = 60
    edges = [(rng.randrange(n), rng.randrange(n)) for _ in range(45)]
    uf = UnionFind(range(n))
    for a, b in edges:
        uf.union(a, b)
    adj = {v: set() for v in range(n)}
    for a, b in edges:
        adj[a].add(b)
        adj[b].add(a)
    comps, seen = [], set()
    for v in range(n):
        if v in seen:
            continue
        stack, comp = [v], []
        seen.add(v)
        while stack:
            u = stack.pop()
            comp.append(u)
            for w in adj[u] - seen:
                seen.add(w)
                stack.append(w)
        comps.append(sorted(comp))
    assert sorted(sorted(g) for g in uf.groups().values()) == sorted(comps)
    assert uf.count() == len(comps)
    for a, b in edges:
        assert uf.find(a) == uf.find(b)
