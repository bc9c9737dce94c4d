"""Tests of pipeline.identify.normal_forms against the published classifications.

Two-bridge: b(α,β) and b(α,β') are the same unoriented link iff β' ≡ β^{±1} (mod α); the
mirror of b(α,β) is b(α,−β); b(α,β) is amphichiral iff β² ≡ −1 (mod α).  Source:
H. Schubert, "Knoten mit zwei Brücken", Math. Z. 65 (1956); Burde–Zieschang, *Knots*, ch. 12
(tests/SOURCES.md, families item 1).  Checked by brute force over all β, β' for α < 40.
Torus: T(p,q) = T(q,p), T(−p,q) is the mirror, T(2,n) = b(n,±1), T(±1,q) is the unknot
(Rolfsen, *Knots and Links*, ch. 7; SOURCES.md families items 4 and 5); crossing number
min(p(q−1), q(p−1)) (K. Murasugi, Trans. AMS 326, 1991).  Pretzels: P(−2,3,3) = T(3,4),
P(−2,3,5) = T(3,5) (SOURCES.md families item 5).
"""

from __future__ import annotations

from fractions import Fraction
from math import gcd

import pytest

from pipeline.identify.normal_forms import (euclid_terms, montesinos_nf, pretzel_nf, torus_nf,
                                            two_bridge_nf)

ALPHAS = range(3, 40)


def _units(alpha):
    return [b for b in range(1, alpha) if gcd(alpha, b) == 1]


@pytest.mark.parametrize("alpha", ALPHAS)
def test_schubert_same_link_iff_beta_prime_is_beta_or_its_inverse(alpha):
    for b in _units(alpha):
        same = {b, pow(b, -1, alpha)}
        for b2 in _units(alpha):
            assert (two_bridge_nf(alpha, b).key == two_bridge_nf(alpha, b2).key) == (b2 in same), (alpha, b, b2)
        # β is read mod α, and the fraction α/β may be given with both signs flipped
        assert two_bridge_nf(alpha, b + alpha).key == two_bridge_nf(alpha, b - 3 * alpha).key \
            == two_bridge_nf(-alpha, -b).key == two_bridge_nf(alpha, b).key


@pytest.mark.parametrize("alpha", ALPHAS)
def test_schubert_mirror_and_amphichirality(alpha):
    for b in _units(alpha):
        nf = two_bridge_nf(alpha, b)
        assert nf.mirror_key == two_bridge_nf(alpha, -b).key
        assert nf.amphichiral == ((b * b + 1) % alpha == 0), (alpha, b)
        assert nf.components == (1 if alpha % 2 else 2)


def test_known_amphichiral_two_bridge_knots():
    # 4_1 = b(5,2), 6_3 = b(13,5) amphichiral; 3_1 = b(3,1), 5_2 = b(7,3) chiral
    # *(memory: Rolfsen, Knots and Links, table; consistent with β² ≡ −1 mod α)*
    assert two_bridge_nf(5, 2).amphichiral and two_bridge_nf(13, 5).amphichiral
    assert not two_bridge_nf(3, 1).amphichiral and not two_bridge_nf(7, 3).amphichiral


def test_two_bridge_crossing_numbers_of_small_knots():
    # Rolfsen's table by Conway notation (SOURCES.md "Small knots"): the knot named n_k has
    # n crossings; its fraction is the continued fraction of the notation (Conway 1970)
    for notation, cn in [([3], 3), ([2, 2], 4), ([5], 5), ([3, 2], 5), ([4, 2], 6), ([3, 1, 2], 6),
                         ([2, 1, 1, 2], 6), ([5, 2], 7), ([3, 1, 3], 7), ([2, 1, 1, 1, 2], 7)]:
        f = Fraction(notation[-1])
        for a in reversed(notation[:-1]):
            f = a + 1 / f
        assert two_bridge_nf(f.numerator, f.denominator).crossing_number == cn, notation


def test_euclid_terms_reconstruct_the_fraction():
    for p in range(-30, 31):
        for q in range(1, 20):
            t = euclid_terms(p, q)
            f = Fraction(t[-1])
            for a in reversed(t[:-1]):
                f = a + 1 / f
            assert f == Fraction(p, q) and all(x >= 1 for x in t[1:])


@pytest.mark.parametrize("p", range(2, 9))
def test_torus_symmetry_mirror_and_crossing_number(p):
    for q in range(2, 12):
        nf = torus_nf(p, q)
        assert nf.key == torus_nf(q, p).key == torus_nf(-p, -q).key
        assert nf.mirror_key == torus_nf(-p, q).key == torus_nf(p, -q).key
        assert nf.components == gcd(p, q)
        if gcd(p, q) == 1:
            assert not nf.amphichiral                          # Burde–Zieschang 3.39
            assert nf.crossing_number == min(p * (q - 1), q * (p - 1))   # Murasugi 1991


def test_torus_coincidences():
    for n in range(3, 30, 2):
        assert torus_nf(2, n).key == two_bridge_nf(n, 1).key == two_bridge_nf(n, n - 1).mirror_key
    for q in range(-5, 6):
        if q:
            assert torus_nf(1, q).key == torus_nf(-1, q).key == "unknot"
    assert pretzel_nf([-2, 3, 3]).key == torus_nf(3, 4).key
    assert pretzel_nf([-2, 3, 5]).key == torus_nf(3, 5).key
    assert pretzel_nf([2, -3, -3]).key == torus_nf(-3, 4).key      # the mirrors


def test_montesinos_keys_are_invariant_under_cyclic_rotation_and_reversal():
    # Bonahon–Siebenmann: M(e; r1..rk) with k >= 3 is determined by the cyclic order of the
    # tangles up to rotation and reversal (Burde–Zieschang ch. 12)
    fr = [Fraction(1, 3), Fraction(2, 5), Fraction(-1, 7), Fraction(3, 4)]
    key = montesinos_nf(fr).key
    for k in range(len(fr)):
        rot = fr[k:] + fr[:k]
        assert montesinos_nf(rot).key == key and montesinos_nf(rot[::-1]).key == key
    # mutants P(2,3,3,5) and P(2,3,5,3): different cyclic orders, different keys
    assert pretzel_nf([2, 3, 3, 5]).key != pretzel_nf([2, 3, 5, 3]).key


def test_bad_parameters_are_refused():
    with pytest.raises(ValueError):
        two_bridge_nf(6, 4)
    with pytest.raises(ValueError):
        torus_nf(0, 3)
