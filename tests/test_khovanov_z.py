"""Integral Khovanov homology (torsion) by the local algorithm over Z.

Outside checks (SOURCES.md):
* the brute-force cube of resolutions over Z (Smith form of every block by python-flint's
  dense ``fmpz_mat.snf``) on random diagrams of ≤ 7 crossings (a 7-crossing example pinned): the slow obvious route;
* Kh over Q (run over Q with fmpq, a different code path) = the free ranks;
* universal coefficients (A. Hatcher, *Algebraic Topology*, CUP 2002, Thm. 3.2): Kh over
  F₂ and F₃ from their own runs equal ``free + t_p^{i,j} + t_p^{i+1,j}``;
* T(2,n), n odd: Z/2 at (2k+1, n+4k) *(memory: M. Khovanov, Duke Math. J. 101 (2000),
  §6.2)*;
* positive trefoil: Z at (0,1), (0,3), (2,5), (3,9) and Z/2 at (3,7); figure-eight: Z at the
  six places of its rational homology and Z/2 at (−1,−3), (2,3) *(memory: D. Bar-Natan,
  AGT 2 (2002), tables; verified here by the cube)*;
* alternating knots have only Z/2 torsion (A. Shumakovitch, "Torsion of Khovanov
  homology", Fund. Math. 225 (2014)) *(memory)*;
* mirror: the complex of D* is the dual of that of D (M. Khovanov, Duke Math. J. 101
  (2000)), so free ranks go to (−i, −j) and torsion to (1 − i, −j) (derived in
  pipeline/invariants/khovanov/integral.py).
"""

from __future__ import annotations

import random

import pytest
from hypothesis import HealthCheck, example, given, settings

from pipeline.diagrams.families import braid
from pipeline.diagrams.notation import parse
from pipeline.errors import BudgetExceeded
from pipeline.invariants.khovanov import (cube_khovanov_z, integral_khovanov, khovanov_data, khovanov_homology,
                                          mirror_integral, ranks_from_json, torsion_from_json, torsion_to_json,
                                          uct_ranks)
from pipeline.invariants.khovanov import data as kh_data
from test_khovanov import braid_words  # the random braid words of the rational tests


def test_positive_trefoil_and_its_mirror():
    kh = integral_khovanov(parse("torus:2,3"))
    assert kh.free == {(0, 1): 1, (0, 3): 1, (2, 5): 1, (3, 9): 1}
    assert kh.torsion == {(3, 7): {2: 1}}
    assert (kh.free, kh.torsion) == cube_khovanov_z(parse("torus:2,3"))
    neg = integral_khovanov(parse("torus:-2,3"))
    assert neg.torsion == {(-2, -7): {2: 1}}      # (1 − 3, −7): the shift of the dual complex


@pytest.mark.parametrize("n", [3, 5, 7, 9, 11])
def test_two_strand_torus_knots_have_the_published_torsion(n):
    # T(2,n), n odd: Z/2 at (2k+1, n+4k), k = 1 … (n−1)/2 *(memory: M. Khovanov, Duke Math.
    # J. 101 (2000), §6.2)*; the free part is the rational homology of test_khovanov.py
    kh = integral_khovanov(parse(f"torus:2,{n}"))
    assert kh.torsion == {(2 * k + 1, n + 4 * k): {2: 1} for k in range(1, (n - 1) // 2 + 1)}


def test_figure_eight():
    kh = integral_khovanov(parse("conway:2 2"))
    assert kh.free == {(-2, -5): 1, (-1, -1): 1, (0, -1): 1, (0, 1): 1, (1, 1): 1, (2, 5): 1}
    assert kh.torsion == {(-1, -3): {2: 1}, (2, 3): {2: 1}}
    assert (kh.free, kh.torsion) == cube_khovanov_z(parse("conway:2 2"))


@settings(max_examples=25, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(braid_words(max_len=6))
@example(([1], 2))                      # a kink
@example(([1, 1], 4))                   # Hopf link and two free loops
@example(([1, 1, 1, 2, -1, 2, 2], 3))
@example(([1, 2, 1, 2, 1, 2], 3))       # a positive 3-braid (T(3,3)-like link)
def test_local_route_matches_the_integral_cube(wb):
    word, strands = wb
    d = braid.diagram(word, strands=strands)
    if d.n_crossings == 0:
        return
    kh = integral_khovanov(d)
    assert (kh.free, kh.torsion) == cube_khovanov_z(d)


@pytest.mark.parametrize("text", ["rational:7/3", "rational:13/5", "montesinos:1/2,1/3,-1/2",
                                  "conway:3 -2 2", "pretzel:-1,2,3"])
def test_local_route_matches_the_integral_cube_on_other_families(text):
    d = parse(text)
    kh = integral_khovanov(d)
    assert (kh.free, kh.torsion) == cube_khovanov_z(d)


@settings(max_examples=30, deadline=None)
@given(braid_words(max_len=12))
@example(([1, -2, 1, -2, 1, -2, 1, -2], 3))
def test_free_part_is_kh_over_q_and_universal_coefficients_give_f2_and_f3(wb):
    word, strands = wb
    d = braid.diagram(word, strands=strands)
    kh = integral_khovanov(d)
    assert kh.free == khovanov_homology(d)                       # the run over Q (fmpq)
    for p in (2, 3):
        assert uct_ranks(kh.free, kh.torsion, p) == khovanov_homology(d, field=p)
    assert kh.over_f2() == khovanov_homology(d, field=2)


def _random_alternating_knots(n: int, seed: int) -> list[str]:
    rng = random.Random(seed)
    out: list[str] = []
    while len(out) < n:
        kind = rng.randrange(3)
        if kind == 0:    # two-bridge: Conway notation with positive entries is alternating
            text = "conway:" + " ".join(str(rng.randint(1, 3)) for _ in range(rng.randint(2, 4)))
        elif kind == 1:  # pretzel with entries of one sign
            sign = rng.choice((1, -1))
            text = "pretzel:" + ",".join(str(sign * rng.randint(1, 5)) for _ in range(3))
        else:            # (σ1 σ2⁻¹)^k
            text = "braid:" + ",".join(["1,-2"] * rng.randint(2, 6))
        d = parse(text)
        if d.n_components == 1 and d.is_alternating() and 3 <= d.n_crossings <= 14:
            out.append(text)
    return out


@pytest.mark.parametrize("text", _random_alternating_knots(12, 2026))
def test_alternating_knots_have_only_z2_torsion(text):
    d = parse(text)
    kh = integral_khovanov(d)
    assert kh.torsion, text                                 # nontrivial alternating knots have some
    assert all(set(ms) == {2} for ms in kh.torsion.values()), (text, kh.torsion)


@settings(max_examples=20, deadline=None)
@given(braid_words(max_len=10))
@example(([1, 1, 1], 2))
def test_mirror_over_z(wb):
    word, strands = wb
    d = braid.diagram(word, strands=strands)
    assert integral_khovanov(d.mirror()) == mirror_integral(integral_khovanov(d))


def test_json_form_and_census_data():
    kh = integral_khovanov(parse("braid:1,-2,1,-2,1,-2"))
    js = torsion_to_json(kh.torsion)
    assert js == sorted(js) and all(len(e) == 4 and e[2] > 1 and e[3] > 0 for e in js)
    assert torsion_from_json(js) == kh.torsion
    d = parse("torus:3,4")
    a, b = khovanov_data(d, independent_f2=True), khovanov_data(d, independent_f2=False)
    assert a.khovanov_f2 == b.khovanov_f2 and a.f2_independent and not b.f2_independent
    assert torsion_from_json(a.khovanov_torsion) == integral_khovanov(d).torsion
    assert ranks_from_json(a.khovanov) == khovanov_homology(d)
    assert khovanov_data(parse("torus:2,2")).khovanov_torsion == []     # Hopf link: torsion-free


def test_torsion_over_budget_keeps_the_other_columns(monkeypatch):
    real = kh_data.reduced_complex

    def fake(diagram, one, **kw):
        if kw.get("modulus") == 0:
            raise BudgetExceeded("khovanov", 7)
        return real(diagram, one, **kw)

    monkeypatch.setattr(kh_data, "reduced_complex", fake)
    d = parse("torus:2,5")
    out = khovanov_data(d, budget=10_000)
    assert out.khovanov_torsion is None and out.skipped == ("skipped: khovanov budget 7 (integral)",)
    assert ranks_from_json(out.khovanov) == khovanov_homology(d)
    assert ranks_from_json(out.khovanov_f2) == khovanov_homology(d, field=2)
    assert out.rasmussen_s == 4 and out.f2_independent
