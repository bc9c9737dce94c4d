"""The compositional flype code (pipeline.diagrams.flype_tree) against the outside.

Reference: the whole flype orbit (the flyping theorem, W. Menasco, M. Thistlethwaite,
Annals of Math. 138, 1993, makes it the link type); here the orbit partition is the
connected components of the one-flype graph on all alternating diagrams of all prime
reduced shadows with n crossings (a flype keeps the shadow prime reduced with n
crossings, so the components are whole orbits).  Outside values: the counts of prime
alternating knots 1, 1, 2, 3, 7, 18, 41, 123 (J. Hoste, M. Thistlethwaite, J. Weeks,
"The first 1,701,936 knots", Math. Intelligencer 20, 1998); Schubert's classification
of two-bridge links (Math. Z. 65, 1956); the Bonahon–Siebenmann classification of
Montesinos links (tangles up to cyclic rotation and reversal, tests/SOURCES.md); the
Jones polynomial as an isotopy invariant.
"""

import random
from math import gcd

import networkx as nx
import pytest

from pipeline import parse
from pipeline.diagrams.canonical import turn_over_pd
from pipeline.diagrams.diagram import Diagram
from pipeline.diagrams.families.alternating import _shadows, random_diagram
from pipeline.diagrams.flype import (
    check_reduced_prime_alternating, diagram_of_code, flype_code, flype_codes, flypes, orbit_roots)
from pipeline.diagrams.flype_circuits import gathered_states
from pipeline.diagrams.flype_realize import medial, realize
from pipeline.diagrams.flype_tree import tree_codes, tree_codes_of
from pipeline.diagrams.shadow import (
    alternating_codes, alternating_over, n_components, prime_reduced, to_diagram)
from pipeline.errors import NotationError
from pipeline.invariants.jones import jones_polynomial
from test_flype import _shuffled



def _level(n):
    """Every prime reduced shadow with n crossings (the enumeration's depth-first route)."""
    return [tw for tw, _ in _shadows(n)]

def _all_diagrams(n):
    """{code0: (twins, over)}: every alternating diagram (both mirror images) of every
    prime reduced shadow with n crossings, up to sphere homeomorphism and turning over."""
    out = {}
    for tw in _level(n):
        tw = list(tw)
        over = alternating_over(tw)
        for o in (over, [not x for x in over]):
            out.setdefault(alternating_codes(tw, o)[0], (tw, o))
    return out


@pytest.mark.parametrize("n", [*range(3, 10), pytest.param(10, marks=pytest.mark.slow)])
def test_partition_equals_the_flype_orbits_on_every_diagram(n):
    diags = _all_diagrams(n)
    orbit = orbit_roots(diags)
    codes = {k: tree_codes_of(*st) for k, st in diags.items()}
    same_orbit, same_code = {}, {}
    for k in diags:
        same_orbit.setdefault(orbit[k], set()).add(codes[k][0])
        same_code.setdefault(codes[k][0], set()).add(orbit[k])
    assert all(len(s) == 1 for s in same_orbit.values())   # invariant on every orbit
    assert all(len(s) == 1 for s in same_code.values())    # separates the orbits
    for k, (tw, o) in diags.items():                      # the mirror's code is the mirror code
        mk = alternating_codes(tw, o)[1]
        if mk in codes:
            assert codes[mk][0] == codes[k][1]


@pytest.mark.parametrize("n, knots", [(3, 1), (4, 1), (5, 2), (6, 3), (7, 7), (8, 18), (9, 41),
                                      pytest.param(10, 123, marks=pytest.mark.slow)])
def test_knot_counts_up_to_mirror(n, knots):
    found = {min(tree_codes_of(list(tw), alternating_over(list(tw))))
             for tw in _level(n) if n_components(list(tw)) == 1}
    assert len(found) == knots   # Hoste–Thistlethwaite–Weeks 1998


def _flyped(d, rng, steps=4):
    e = d
    for _ in range(steps):
        nxt = list(flypes(e))
        if nxt:
            e = rng.choice(nxt)
    return e


STRUCTURED = ["conway:" + " ".join(["3", "2", "2"] * 6) + " 4", "pretzel:5,5,5,5,5,5,5,5",
              "montesinos:3/10,5/13,4/11,2/7", "conway:2 1 1 2 2 1 3 2 2 1 1 2 3"]


def test_code_is_invariant_under_flypes_relabelling_turning_over_and_mirror():
    rng = random.Random(3)
    pool = [random_diagram(n, seed=s) for n in (15, 20, 30, 40) for s in range(6)]
    pool += [parse(t) for t in STRUCTURED]          # orbits far over the orbit budget
    for d in pool:
        code = tree_codes(d)
        e = _flyped(d, rng)
        for v in (e, _shuffled(e, rng), Diagram.from_pd(turn_over_pd(e))):
            assert tree_codes(v) == code
        assert tree_codes(d.mirror()) == (code[1], code[0])


def _schubert(alpha, beta):
    b = beta % alpha
    return min(b, pow(b, -1, alpha))


@pytest.mark.parametrize("alpha", [29, 41, 55])
def test_two_bridge_codes_follow_schubert_beyond_the_orbit_budget(alpha):
    # b(α,β) = b(α,β') unoriented, mirror not identified, iff β' ≡ β^{±1} mod α (Schubert 1956)
    betas = [b for b in range(1, alpha) if gcd(alpha, b) == 1]
    codes = {b: flype_codes(parse(f"rational:{alpha}/{b}")) for b in betas}
    for b1 in betas:
        for b2 in betas:
            assert (codes[b1][0] == codes[b2][0]) == (_schubert(alpha, b1) == _schubert(alpha, b2))
            assert (codes[b1][0] == codes[b2][1]) == (_schubert(alpha, b1) == _schubert(alpha, -b2))


def test_montesinos_codes_follow_the_classification():
    # M(r1, ..., rk), k >= 3: the tangles up to cyclic rotation and reversal fix the type
    # (Bonahon–Siebenmann, tests/SOURCES.md); all r_i in (0, 1) distinct, so the dihedral
    # class of the sequence is the type
    from itertools import permutations
    tangles = ["1/3", "2/5", "3/7", "3/8"]
    codes = {}
    for perm in permutations(tangles):
        codes[perm] = flype_code(parse("montesinos:" + ",".join(perm)))

    def dihedral(seq):
        rots = [seq[i:] + seq[:i] for i in range(len(seq))]
        return min(rots + [r[::-1] for r in rots])

    for p in codes:
        for q in codes:
            assert (codes[p] == codes[q]) == (dihedral(p) == dihedral(q))


def _k4_with_a_circuit(flip_x, flip_y):
    """The 6-crossing basic polyhedron (Tait graph K4) with one crossing replaced by a
    tangle holding a flype circuit: a chain 0 -e- p -X- q -e- r -Y- 1 with two real edges
    (an even twist region in the dual), X, Y bonds of paths; X / Y reflected on request."""
    edges = [(0, 2), (0, 3), (1, 2), (1, 3), (2, 3), (0, 4), (5, 6)]
    nxt = [7]
    pieces = []
    for (a, b), lens in (((4, 5), (2, 3, 4)), ((6, 1), (2, 3, 5))):
        start = len(edges)
        for length in lens:
            path = [a] + list(range(nxt[0], nxt[0] + length - 1)) + [b]
            nxt[0] += length - 1
            edges += list(zip(path, path[1:]))
        pieces.append((set(range(start, len(edges))), a, b))
    g = nx.Graph(edges)
    ok, emb = nx.check_planarity(g)
    idx = {frozenset(e): i for i, e in enumerate(edges)}
    rot = [[idx[frozenset((w, u))] for u in emb.neighbors_cw_order(w)] for w in range(nxt[0])]
    for flip, (piece, a, b) in zip((flip_x, flip_y), pieces):
        if flip:                                   # reflect the piece, poles kept
            inner = {v for e in piece for v in edges[e]} - {a, b}
            for w in inner:
                rot[w].reverse()
            for w in (a, b):
                r = rot[w]
                s = next(i for i in range(len(r)) if r[i] not in piece and r[(i + 1) % len(r)] in piece)
                r = r[s + 1:] + r[:s + 1]
                m = sum(1 for e in r if e in piece)
                rot[w] = r[:m][::-1] + r[m:]
    tw = medial(edges, rot)
    return tw, alternating_over(tw)


def test_even_twist_region_in_a_circuit_inside_a_basic_polyhedron():
    from pipeline.diagrams.flype import _codes_of, _fewest_regions, _orbit_states
    found = {}
    for fx in (0, 1):
        for fy in (0, 1):
            tw, o = _k4_with_a_circuit(fx, fy)
            assert prime_reduced(tw)
            d = to_diagram(tw, o)
            states = _orbit_states(d, 10_000)
            orbit = _codes_of(_fewest_regions(states))
            assert _codes_of(gathered_states(tw, o, 10_000)) == orbit   # the gathered route agrees here
            assert {tree_codes_of(*st) for st in states.values()} == {tree_codes_of(tw, o)}
            found[(fx, fy)] = (orbit, tree_codes_of(tw, o))
    for a in found:
        for b in found:
            assert (found[a][0] == found[b][0]) == (found[a][1] == found[b][1])
    assert len({v[1] for v in found.values()}) == 2    # reflecting X alone is another knot


def test_realize_rebuilds_a_member_of_the_class():
    rng = random.Random(8)
    pool = [random_diagram(n, seed=s) for n in (8, 12, 25) for s in range(5)]
    pool += [parse(t) for t in STRUCTURED[:3]] + [parse("conway:5"), parse("conway:2 2")]
    for d in pool:
        for code, e in zip(tree_codes(d), (d, d.mirror())):
            r = diagram_of_code(code)
            check_reduced_prime_alternating(r)
            assert r.n_crossings == e.n_crossings and flype_code(r) == code
            if e.n_components == 1 and e.n_crossings <= 25:
                assert jones_polynomial(r) == jones_polynomial(e)
    assert realize(flype_code(_flyped(pool[0], rng))) .n_crossings == 8


@pytest.mark.parametrize("bad", ["ft:", "ft:P2[S2[]", "ft:Q1", "pd-ish", "ft:R[1.0^,|,0.0]x"])
def test_malformed_codes_are_refused_in_one_line(bad):
    with pytest.raises(NotationError) as info:
        realize(bad)
    assert "\n" not in str(info.value)


def test_code_survives_reidemeister_moves_followed_by_simplification():
    # R-moves change the diagram, not the link: once simplification gives a reduced
    # alternating diagram back (it must have n crossings, Kauffman/Murasugi/Thistlethwaite
    # 1987), its code must be the original's exactly (flyping theorem).
    from _moves import complicate
    from pipeline.diagrams.simplify import simplify
    back = 0
    for seed in range(240):
        n = 5 + seed % 10
        d = random_diagram(n, seed=seed)
        big = complicate(d, 2 + seed % 3, seed)
        r = simplify(big, seed=seed).diagram
        assert r.n_crossings >= n
        if r.n_crossings == n and r.is_alternating():
            back += 1
            assert flype_code(r) == flype_code(d), (n, seed)
    assert back >= 150   # most complicated diagrams come back to a reduced alternating one
