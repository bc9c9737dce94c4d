"""Tests of pipeline.invariants.coloring against outside sources (SOURCES.md).

Three routes: published values and closed formulas (source beside each check);
sympy's determinant and Smith form on the same matrix; brute-force enumeration of
colourings straight from the diagram's arcs (no linear algebra).
"""

from __future__ import annotations

import itertools
import random
from functools import reduce
from math import gcd, prod

import pytest
from sympy import Matrix, ZZ
from sympy.matrices.normalforms import smith_normal_form

from pipeline.diagrams.notation import parse
from pipeline.invariants.coloring.spectrum import (
    coloring_counts,
    coloring_matrix,
    count_colorings,
    determinant,
    has_generating_coloring,
    invariant_factors,
    min_colors,
    nontrivially_colorable,
    witness_coloring,
)

PRIMES = (2, 3, 5, 7, 11, 13)


# ---------------------------------------------------------------- slow routes
def _relations(d):
    """(over, under_in, under_out) column indices per crossing, read from the arcs."""
    arc = d.arc_of_label
    return [(arc[d.over_labels(i)[0]], arc[x[0]], arc[x[2]]) for i, x in enumerate(d.pd)]


def _brute_colorings(d, n, *, first_zero=False):
    """Every Fox n-colouring (one colour per arc, then per free loop), by backtracking
    over the arcs and checking 2·over ≡ under_in + under_out once all three are set;
    with ``first_zero`` only those giving the first arc colour 0."""
    ncols = len(d.arcs) + d.free_loops
    rel = _relations(d)
    last = {}  # crossing relations checked when their highest column is assigned
    for r in rel:
        last.setdefault(max(r), []).append(r)
    out, x = [], [0] * ncols
    stack = [(0, 0)]
    while stack:
        k, v = stack.pop()
        if k == ncols:
            out.append(tuple(x))
            continue
        if v + 1 < n and not (first_zero and k == 0):
            stack.append((k, v + 1))
        x[k] = v
        if all((2 * x[o] - x[a] - x[b]) % n == 0 for o, a, b in last.get(k, ())):
            stack.append((k + 1, 0))
    return out


def _smith_chain(diagonal):
    """Normalise a diagonal to a divisibility chain by pairwise gcd/lcm (textbook)."""
    ds = [abs(x) for x in diagonal if x]
    for i in range(len(ds)):
        for j in range(i + 1, len(ds)):
            g = gcd(ds[i], ds[j])
            ds[i], ds[j] = g, ds[i] * ds[j] // g
    return ds


def _sympy_factors(d):
    """Invariant factors from sympy's Smith form of the same colouring matrix."""
    m = coloring_matrix(d)
    ncols = len(d.arcs) + d.free_loops
    if not m or not any(any(r) for r in m):
        return (0,) * max(ncols - 1, 0)
    s = smith_normal_form(Matrix(m), domain=ZZ)
    chain = _smith_chain([s[i, i] for i in range(min(s.shape))])
    return tuple(sorted(x for x in chain if x != 1)) + (0,) * (ncols - len(chain) - 1)


def _random_braid(rng):
    strands = rng.randint(2, 4)
    length = rng.randint(1, 8)
    return [rng.choice([1, -1]) * rng.randint(1, strands - 1) for _ in range(length)]


RANDOM_BRAIDS = [_random_braid(random.Random(seed)) for seed in range(300)]


# ---------------------------------------------------------------- published values
def test_determinant_of_two_bridge_is_alpha_for_every_alpha_up_to_99():
    # Schubert, "Knoten mit zwei Brücken" (1956); Burde–Zieschang ch. 12:
    # det b(α,β) = α and the colouring module is cyclic, invariant factors (α).
    for alpha in range(2, 100):
        for beta in range(1, alpha):
            if gcd(alpha, beta) != 1:
                continue
            d = parse(f"rational:{alpha}/{beta}")
            assert invariant_factors(d) == (alpha,), (alpha, beta)
            assert determinant(d) == alpha


def _pretzel_det(ps):
    # Kawauchi, survey monograph (1996) (memory): det = |Σ_i Π_{j≠i} p_j|.
    return abs(sum(prod(ps[:i] + ps[i + 1:]) for i in range(len(ps))))


def test_pretzel_determinant_formula_for_every_three_tuple():
    # Kawauchi (1996) *(memory)*; zero entries included (Goeritz matrix derivation).
    for ps in itertools.product(range(-7, 8), repeat=3):
        d = parse("pretzel:" + ",".join(map(str, ps)))
        assert determinant(d) == _pretzel_det(list(ps)), ps


def _dihedral_representatives(values, k):
    """One k-tuple per class under rotation and reversal (P(p1,…,pk) is the same link
    drawn from another side, and the formula is symmetric), smallest in each class."""
    out = []
    for ps in itertools.product(values, repeat=k):
        turns = [ps[i:] + ps[:i] for i in range(k)]
        if ps == min(turns + [t[::-1] for t in turns]):
            out.append(list(ps))
    return out


def test_pretzel_determinant_formula_for_four_tuples():
    # Kawauchi (1996) *(memory)*.  Default run: a grid of [-7, 7] with both signs, 0 and
    # ±1, one tuple per rotation/reversal class; the full range is the slow test below.
    for ps in _dihedral_representatives([-7, -4, -2, -1, 0, 1, 3, 6], 4):
        d = parse("pretzel:" + ",".join(map(str, ps)))
        assert determinant(d) == _pretzel_det(ps), ps


@pytest.mark.slow
def test_pretzel_determinant_formula_for_every_four_tuple():
    # Kawauchi (1996) *(memory)*: every 4-tuple in [-7, 7]^4 up to rotation and reversal.
    for ps in _dihedral_representatives(range(-7, 8), 4):
        d = parse("pretzel:" + ",".join(map(str, ps)))
        assert determinant(d) == _pretzel_det(ps), ps


@pytest.mark.parametrize("p", range(2, 8))
def test_torus_knot_determinant(p):
    # Rolfsen, Knots and Links (1976) ch. 7: det T(p,q) = 1 if p, q both odd, else the
    # odd one of p, q; T(−p,q) is the mirror (same determinant).
    for q in range(2, 16):
        if gcd(p, q) != 1:
            continue
        expected = 1 if p % 2 and q % 2 else (q if p % 2 == 0 else p)
        assert determinant(parse(f"torus:{p},{q}")) == expected, (p, q)
        assert determinant(parse(f"torus:{-p},{q}")) == expected, (-p, q)


CONWAY_TABLE = {  # Rolfsen, Knots and Links, table *(memory)*
    "3_1": ("3", 3), "4_1": ("2 2", 5), "5_1": ("5", 5), "5_2": ("3 2", 7),
    "6_1": ("4 2", 9), "6_2": ("3 1 2", 11), "6_3": ("2 1 1 2", 13),
    "7_1": ("7", 7), "7_2": ("5 2", 11), "7_3": ("4 3", 13), "7_4": ("3 1 3", 15),
    "7_5": ("3 2 2", 17), "7_6": ("2 2 1 2", 19), "7_7": ("2 1 1 1 2", 21),
}


@pytest.mark.parametrize("name", sorted(CONWAY_TABLE))
def test_conway_notation_table_determinants(name):
    # Rolfsen, Knots and Links, table *(memory)*; two-bridge, so factors (det) (Schubert).
    notation, det = CONWAY_TABLE[name]
    d = parse(f"conway:{notation}")
    assert determinant(d) == det
    assert invariant_factors(d) == (det,)


def test_torus_knots_from_the_table():
    # Rolfsen table *(memory)*: 8_19 = T(3,4) det 3; 10_124 = T(3,5) det 1.
    assert determinant(parse("torus:3,4")) == 3
    assert determinant(parse("torus:3,5")) == 1
    # SOURCES.md coincidences: P(−2,3,3) = T(3,4), P(−2,3,5) = T(3,5) *(memory)*.
    assert determinant(parse("pretzel:-2,3,3")) == 3
    assert determinant(parse("pretzel:-2,3,5")) == 1


def test_pretzel_3_3_minus3_has_factors_3_3_and_27_three_colourings():
    # SOURCES.md, pretzel item *(memory)*: factors (3, 3), 27 Fox 3-colourings.
    d = parse("pretzel:3,3,-3")
    assert invariant_factors(d) == (3, 3)
    assert determinant(d) == 9
    assert coloring_counts(d)[3] == 27
    assert len(_brute_colorings(d, 3)) == 27
    # README.md: 9 | det but no colouring whose colours generate Z/9.
    assert nontrivially_colorable((3, 3), 9)
    assert not has_generating_coloring((3, 3), 9)
    assert has_generating_coloring((3, 3), 3)


def test_trefoil_and_figure_eight_colourings():
    # common practice: trefoil 9 three-colourings; figure-eight none nontrivial, 25 five-colourings.
    tref, fig8 = parse("torus:2,3"), parse("conway:2 2")
    assert coloring_counts(tref)[3] == 9
    assert coloring_counts(fig8)[3] == 3
    assert coloring_counts(fig8)[5] == 25
    assert len(_brute_colorings(fig8, 5)) == 25


def test_hopf_link_unlink_and_connected_sum():
    # README.md: Hopf link M = [[2,−2],[−2,2]], factors (2), det 2.
    hopf = parse("braid:1,1")
    assert coloring_matrix(hopf) == [[2, -2], [-2, 2]]
    assert invariant_factors(hopf) == (2,) and determinant(hopf) == 2
    # two-component unlink: factors (0), det 0 (common practice: split link).
    unlink = parse("braid:1,-1")
    assert invariant_factors(unlink) == (0,) and determinant(unlink) == 0
    # SOURCES.md item 5 *(memory)*: P(3,0,3) = T(2,3) # T(2,3), factors (3,3).
    assert invariant_factors(parse("pretzel:3,0,3")) == (3, 3)


def test_crossingless_diagrams_and_kinks():
    # A free loop is one zero column: one loop is the unknot (no factors, det 1),
    # k loops the k-component unlink (k − 1 zeros) — common practice.
    assert invariant_factors(parse("pd:[] loops=1")) == ()
    assert determinant(parse("pd:[] loops=1")) == 1
    assert invariant_factors(parse("pd:[] loops=3")) == (0, 0)
    assert coloring_counts(parse("pd:[] loops=3"), max_modulus=4)[4] == 64
    # A one-crossing kink: its row collapses to 0; still the unknot.
    kink = parse("pd:[[1,1,2,2]]")
    assert coloring_matrix(kink) == [[0]]
    assert invariant_factors(kink) == ()
    # Markov stabilisation adds a kink: the trefoil stays the trefoil (Markov 1936).
    for word in ("1,1,1,2", "1,1,1,-2", "1,1,1,2,3"):
        assert invariant_factors(parse(f"braid:{word}")) == (3,)


# ---------------------------------------------------------------- randomised vs slow routes
@pytest.mark.parametrize("word", RANDOM_BRAIDS[:150], ids=lambda w: ",".join(map(str, w)))
def test_counts_equal_brute_force_enumeration(word):
    d = parse("braid:" + ",".join(map(str, word)))
    counts = coloring_counts(d, max_modulus=6)
    ncols = len(d.arcs) + d.free_loops
    for n in range(2, 7):
        if n ** ncols > 200_000:
            continue
        assert counts[n] == len(_brute_colorings(d, n)), n


@pytest.mark.parametrize("word", RANDOM_BRAIDS, ids=lambda w: ",".join(map(str, w)))
def test_factors_and_determinant_equal_sympy(word):
    d = parse("braid:" + ",".join(map(str, word)))
    factors = invariant_factors(d)
    assert factors == _sympy_factors(d)
    if d.n_components == 1 and d.n_crossings:
        # Crowell–Fox (1963): for a knot, det = |any first minor| of the colouring matrix.
        m = Matrix(coloring_matrix(d))
        assert abs(m[1:, 1:].det()) == determinant(d)
    assert determinant(d) == prod(factors)


def test_family_members_equal_sympy():
    for text in ("torus:4,6", "torus:3,6", "torus:4,8", "pretzel:2,2,2,2", "pretzel:3,5,-7,2",
                 "montesinos:1/3,2/5,-1/2", "pretzel:" + ",".join(["3"] * 30)):
        d = parse(text)
        assert invariant_factors(d) == _sympy_factors(d), text


@pytest.mark.parametrize("word", RANDOM_BRAIDS[:100], ids=lambda w: ",".join(map(str, w)))
def test_mirror_image_has_the_same_colouring_spectrum(word):
    # common practice: the colouring module does not see the mirror.
    d = parse("braid:" + ",".join(map(str, word)))
    assert invariant_factors(d.mirror()) == invariant_factors(d)
    mirrored = parse("braid:" + ",".join(str(-g) for g in word))
    assert invariant_factors(mirrored) == invariant_factors(d)


def _check_witness(d, w, p):
    assert len(w) == len(d.arcs) + d.free_loops
    assert len(set(w)) > 1 and all(0 <= c < p for c in w)
    for o, a, b in _relations(d):  # Fox (1962): 2·over ≡ under_in + under_out
        assert (2 * w[o] - w[a] - w[b]) % p == 0


@pytest.mark.parametrize("word", RANDOM_BRAIDS, ids=lambda w: ",".join(map(str, w)))
def test_witness_exists_exactly_when_colourable_and_satisfies_every_crossing(word):
    d = parse("braid:" + ",".join(map(str, word)))
    factors = invariant_factors(d)
    for p in PRIMES:
        w = witness_coloring(d, p)
        assert (w is not None) == nontrivially_colorable(factors, p) == (count_colorings(factors, p) > p)
        if w is not None:
            _check_witness(d, w, p)


def test_witnesses_on_families():
    for text, p in (("torus:2,3", 3), ("conway:2 2", 5), ("pretzel:3,3,-3", 3), ("torus:2,1000", 5),
                    ("conway:" + " ".join(["2"] * 200), 2)):
        d = parse(text)
        if determinant(d) % p == 0:
            _check_witness(d, witness_coloring(d, p), p)
        else:
            assert witness_coloring(d, p) is None


@pytest.mark.parametrize("word", RANDOM_BRAIDS[:120], ids=lambda w: ",".join(map(str, w)))
def test_min_colors_equals_brute_force(word):
    d = parse("braid:" + ",".join(map(str, word)))
    for p in (2, 3, 5):
        if p ** (len(d.arcs) + d.free_loops) > 100_000:
            continue
        nontrivial = [c for c in _brute_colorings(d, p) if len(set(c)) > 1]
        expected = min((len(set(c)) for c in nontrivial), default=None)
        assert min_colors(d, p) == expected, p


def test_min_colors_on_named_knots_and_budget():
    # trefoil: every nontrivial 3-colouring uses all 3 colours (Fox 1962).
    assert min_colors(parse("torus:2,3"), 3) == 3
    # figure-eight, standard diagram: 4 arcs, a nontrivial 5-colouring needs 4 colours
    # (Satoh 2009 *(memory)*: 4 is the minimum over all diagrams; at least ⌊log2 5⌋ + 2 = 4).
    assert min_colors(parse("conway:2 2"), 5) == 4
    # P(3,0,3): 2-dimensional 3-colourings mod constants, 4 candidates; budget 3 is too small.
    assert min_colors(parse("pretzel:3,0,3"), 3, budget=3) is None
    assert min_colors(parse("pretzel:3,0,3"), 3, budget=4) == 3
    assert min_colors(parse("conway:2 2"), 3) is None  # no nontrivial 3-colouring


@pytest.mark.parametrize("text,n", [("pretzel:3,3,-3", 9), ("pretzel:3,3,-3", 3), ("torus:2,3", 3),
                                    ("braid:1,-1", 4), ("pretzel:2,2,2,2", 4), ("pretzel:2,2,2,2", 8)])
def test_generating_colouring_matches_brute_force(text, n):
    # A colouring "generates" Z/n when its colour differences generate Z/n (README).
    d = parse(text)
    found = any(reduce(gcd, (c - x[0] for c in x), n) == 1 for x in _brute_colorings(d, n, first_zero=True))
    assert has_generating_coloring(invariant_factors(d), n) == found


def test_bad_modulus_is_refused():
    with pytest.raises(ValueError, match="not a prime"):
        witness_coloring(parse("torus:2,3"), 9)
    with pytest.raises(ValueError, match="not a prime"):
        min_colors(parse("torus:2,3"), 1)


@pytest.mark.parametrize("seed", range(40))
def test_sparse_euclidean_diagonalisation_equals_sympy_smith_form(seed):
    # The stage used when more than DENSE_LIMIT rows survive the ±1 pivots, checked on
    # random sparse integer matrices against sympy's Smith form (Smith 1861).
    from pipeline.invariants.coloring.sparse_elimination import diagonalise, smith_of_diagonal

    rng = random.Random(seed)
    nrows, ncols = rng.randint(1, 7), rng.randint(1, 7)
    rows = [{c: rng.choice([-9, -6, -4, -3, -2, 2, 3, 4, 6, 8, 12])
             for c in rng.sample(range(ncols), rng.randint(0, min(3, ncols)))} for _ in range(nrows)]
    found, rest = diagonalise(rows)
    assert rest == []
    dense = Matrix([[r.get(c, 0) for c in range(ncols)] for r in rows])
    s = smith_normal_form(dense, domain=ZZ) if any(rows) else dense
    chain = _smith_chain([s[i, i] for i in range(min(s.shape))])
    assert smith_of_diagonal(found) == sorted(x for x in chain if x != 1)
    assert len(found) == len(chain)  # the rank


@pytest.mark.parametrize("seed", range(40))
def test_unit_pivot_sweep_keeps_the_smith_form_of_random_matrices(seed):
    # The ±1 pivot stage (Markowitz threshold sweep) on random sparse integer matrices
    # with many unit entries: Smith(M) = (1, ..., 1) ⊕ Smith(rest), compared with
    # sympy's Smith form of M (Smith 1861).
    from pipeline.invariants.coloring.sparse_elimination import eliminate_units

    rng = random.Random(1000 + seed)
    nrows, ncols = rng.randint(1, 9), rng.randint(1, 9)
    rows = [{c: rng.choice([-3, -2, -1, -1, 1, 1, 2, 3, 4, 6])
             for c in rng.sample(range(ncols), rng.randint(0, min(4, ncols)))} for _ in range(nrows)]
    dense = Matrix([[r.get(c, 0) for c in range(ncols)] for r in rows])
    col_rows = [set() for _ in range(ncols)]
    for i, r in enumerate(rows):
        for c in r:
            col_rows[c].add(i)
    rest, pivots = eliminate_units([dict(r) for r in rows], col_rows)
    assert all(v not in (1, -1) and v for r in rest for v in r.values())
    s_all = smith_normal_form(dense, domain=ZZ) if any(rows) else dense
    expected = _smith_chain([s_all[i, i] for i in range(min(s_all.shape))])
    if rest:
        m_rest = Matrix([[r.get(c, 0) for c in range(ncols)] for r in rest])
        s_rest = smith_normal_form(m_rest, domain=ZZ)
        got = [1] * len(pivots) + [s_rest[i, i] for i in range(min(s_rest.shape))]
    else:
        got = [1] * len(pivots)
    assert sorted(_smith_chain(got)) == sorted(expected)


@pytest.mark.parametrize("seed", range(20))
def test_smith_order_of_a_diagonal_equals_sympy(seed):
    # Both branches (entries already a divisibility chain, and the coprime base) against
    # sympy's Smith form of the diagonal matrix (Smith 1861).
    from sympy import diag

    from pipeline.invariants.coloring.sparse_elimination import smith_of_diagonal

    rng = random.Random(2000 + seed)
    pool = [-1, 1, 2, 3, 4, 6, 8, 9, 12, 18, 36, 5, 60] if seed % 2 else [-1, 1, 3, -3, 9, 27, 54]
    entries = [rng.choice(pool) for _ in range(rng.randint(1, 7))]
    s = smith_normal_form(diag(*entries), domain=ZZ)
    assert smith_of_diagonal(entries) == sorted(abs(s[i, i]) for i in range(len(entries)) if abs(s[i, i]) != 1)
