"""The Diagram type: validation, orientation, signs, arcs, faces, mirror, free loops."""

from __future__ import annotations

import random

import pytest

from pipeline import Diagram, parse
from pipeline.errors import DiagramError
from slow_routes import state_sum_jones

TREFOIL_PD = [[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 2]]  # README.md: positive trefoil, writhe +3


def test_design_trefoil_example():
    d = Diagram.from_pd(TREFOIL_PD)
    assert d.signs == (1, 1, 1) and d.writhe == 3
    assert d.components == ((1, 2, 3, 4, 5, 6),)
    assert d.arcs == ((2, 3), (4, 5), (6, 1))
    assert len(d.faces) == 3 + 2
    assert d.is_alternating()


def test_sign_rule_over_strand_direction():
    # README.md: positive when the over-strand runs from d to b
    d = Diagram.from_pd(TREFOIL_PD)
    for i in range(3):
        a, b, c, dd = d.pd[i]
        assert d.over_labels(i) == (dd, b)
    m = d.mirror()
    assert m.signs == (-1, -1, -1)
    for i in range(3):
        a, b, c, dd = m.pd[i]
        assert m.over_labels(i) == (b, dd)


def test_mirror_is_involution_and_flips_jones():
    # Mirror image: V(t) -> V(1/t) (common practice; SOURCES.md)
    for text in ["torus:2,5", "pretzel:3,-2,5", "rational:7/3", "braid:1,-2,1,1,-2"]:
        d = parse(text)
        assert d.mirror().mirror() == d
        assert state_sum_jones(d.mirror()) == state_sum_jones(d).invert()


def test_kinks_and_one_crossing_diagrams():
    d = parse("braid:1")            # one kink on two strands: the unknot
    assert d.n_crossings == 1 and d.n_components == 1 and d.writhe == 1
    assert len(d.faces) == 3
    assert state_sum_jones(d).terms == ((0, 1),)


def test_components_that_never_pass_under():
    # A 2-component link where one component only passes over: the Hopf link
    d = parse("pd:[[4,2,3,1],[3,2,4,1]]")  # braid:1,-1: a 2-component unlink diagram
    assert d.n_components == 2
    comp_over_only = [c for c in d.components if not any(x[0] in c for x in d.pd)]
    assert comp_over_only == [(1, 2)], "one component passes only over"
    assert d.arcs == ((1, 2), (3,), (4,))   # the over-only component is one long arc


def test_split_pieces_and_free_loops():
    d = parse("pretzel:2,0,0,3")     # two zero entries: a split link (SOURCES.md item 5)
    assert d.free_loops == 1 and len(d.pieces) == 1
    assert len(parse("braid:1,1,3,3").pieces) == 2
    e = parse("braid:3")
    assert e.free_loops == 2 and e.n_components == 3


def test_relabel_keeps_diagram_shape():
    d = parse("pretzel:3,-2,5")
    r = d.relabel()
    assert r.signs == d.signs and len(r.faces) == len(d.faces)
    assert state_sum_jones(r) == state_sum_jones(d)


def test_hash_and_equality_are_structural():
    a, b = parse("torus:2,3"), parse("braid:1,1,1")
    assert a == b and hash(a) == hash(b) and len({a, b}) == 1


def test_immutability():
    d = parse("torus:2,3")
    with pytest.raises(Exception):
        d.pd = ()


@pytest.mark.parametrize("pd,match", [
    ([[1, 2, 3]], "has 3 labels"),
    ([[1, 2, 2, "x"]], "not an integer"),
    ([[-1, 2, 2, 1]], "not positive"),
    ([[1, 5, 2, 4], [3, 1, 4, 6], [5, 3, 6, 7]], "label 2 appears 1 time"),
    ([], "empty"),
    ([[2, 5, 1, 4], [3, 1, 4, 6], [5, 3, 6, 2]], "orientation"),
    ([[1, 4, 2, 5], [3, 1, 4, 6], [5, 3, 6, 2]], "not planar"),
], ids=["short", "non-int", "negative", "once", "empty", "orientation", "virtual"])
def test_invalid_pd_codes(pd, match):
    with pytest.raises(DiagramError, match=match):
        Diagram.from_pd(pd)


def _seifert_circles(d) -> int:
    """Circles of the oriented smoothing, by brute force: at each crossing (a, b, c, d)
    the incoming under-strand a joins the outgoing over-strand, the incoming over-strand
    joins c (labels are edges; an edge's head is where it arrives)."""
    nxt = {}
    for i, (a, b, c, e) in enumerate(d.pd):
        over_in, over_out = d.over_labels(i)
        nxt[a] = over_out
        nxt[over_in] = c
    seen, circles = set(), 0
    for start in nxt:
        if start not in seen:
            circles += 1
            x = start
            while x not in seen:
                seen.add(x)
                x = nxt[x]
    return circles


def _strands_used(word) -> int:
    """Strands of a braid word's closure that meet a crossing: runs of consecutive used
    generators i contribute (run length + 1) strands."""
    used = sorted({abs(g) for g in word})
    runs = sum(1 for k, g in enumerate(used) if k == 0 or g != used[k - 1] + 1)
    return len(used) + runs


def test_random_braid_closures_validate_and_count_faces():
    rng = random.Random(1)
    for _ in range(200):
        strands = rng.randint(2, 5)
        word = [rng.choice([-1, 1]) * rng.randint(1, strands - 1) for _ in range(rng.randint(1, 14))]
        d = parse("braid:" + ",".join(map(str, word)))
        assert d.n_crossings == len(word)
        assert d.writhe == sum(1 if g > 0 else -1 for g in word)
        # (Euler's c + 2 faces per piece is what validation itself enforces, so it is not
        # re-asserted here.)  Independent: a closed braid has one Seifert circle per strand
        # it uses, counted by brute force from the PD code (Yamada, Invent. Math. 89, 1987,
        # for the converse direction; the braid direction is common practice)
        assert _seifert_circles(d) == _strands_used(word)
        assert sum(len(a) for a in d.arcs) == 2 * d.n_crossings


# ---------------------------------------------------------------- crossing change, plane graph
@pytest.mark.parametrize("text", ["torus:2,5", "conway:3 1 2", "pretzel:2,-3,3", "braid:1,-2,1,-2"])
def test_change_crossings_flips_exactly_those_signs(text):
    from pipeline.invariants.alexander.fox import crossing_change
    d = parse(text)
    picked = list(range(0, d.n_crossings, 2))
    e = d.change_crossings(picked)
    assert [(-s if i in picked else s) for i, s in enumerate(d.signs)] == list(e.signs)
    assert e.change_crossings(picked) == d                  # an involution on the PD code
    assert d.mirror() == d.change_crossings(range(d.n_crossings))
    assert crossing_change(d, 1).signs[1] == -d.signs[1]


@pytest.mark.parametrize("text", ["torus:3,4", "dt:4 8 10 2 6", "pretzel:2,2,2", "pd:[[1,1,2,2]] loops=1"])
def test_faces_follow_euler_and_pieces_partition_the_crossings(text):
    # a connected plane 4-valent graph with c vertices has c + 2 faces (Euler: V − E + F = 2, E = 2V)
    from pipeline.diagrams.plane import connected_pieces, trace_faces
    d = parse(text)
    assert len(trace_faces(d.pd)) == sum(len(p) + 2 for p in d.pieces)
    assert sorted(i for p in connected_pieces(d.pd) for i in p) == list(range(d.n_crossings))
    slots = [s for f in d.faces for s in f]
    assert sorted(slots) == [(i, s) for i in range(d.n_crossings) for s in range(4)]
