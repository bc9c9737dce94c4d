"""Tests of pipeline.identify.fingerprint: invariant fingerprints of rows without a normal form.

Outside facts: the Jones polynomial of a mirror image is V(1/t) and its signature −σ
(Jones, Bull. AMS 12, 1985; Murasugi, Trans. AMS 117, 1965); the figure-eight knot is
amphichiral, the trefoil is not (SOURCES.md); b(α,β) = b(α,β') when ββ' ≡ 1 (mod α)
(Schubert, Math. Z. 65, 1956) and [2 2] = 5/2 (Conway 1970), so those pairs of diagrams
are one knot and must share a fingerprint; the mutants P(2,3,3,5) and P(2,3,5,3) share
every invariant fingerprinted here (SOURCES.md families item 5).  The set of Jones
polynomials over all orientations is checked against brute force: reverse each subset of
components in the PD code and compute V of every resulting diagram.
"""

from __future__ import annotations

import itertools

import pytest

from pipeline import parse
from pipeline.diagrams.diagram import Diagram
from pipeline.identify.fingerprint import fingerprint, jones_orientation_set, mirror_fingerprint
from pipeline.invariants.all import compute_all
from pipeline.invariants.jones import jones_polynomial


def _row(d: Diagram) -> dict:
    r = compute_all(d, max_modulus=5)
    return {**r, "diagram": d}


def _fp(notation: str) -> str:
    return fingerprint(_row(parse(notation)))


def test_mirror_fingerprint_equals_the_fingerprint_of_the_mirror_diagram():
    for notation in ["rational:7/3", "torus:2,5", "pretzel:-2,3,7", "conway:3 1 2", "rational:8/3", "torus:3,3"]:
        d = parse(notation)
        assert mirror_fingerprint(_row(d)) == fingerprint(_row(d.mirror())), notation


def test_amphichiral_and_chiral_knots():
    fig8 = _row(parse("conway:2 2"))
    assert fingerprint(fig8) == mirror_fingerprint(fig8) == fingerprint(_row(parse("conway:2 2").mirror()))
    trefoil = _row(parse("torus:2,3"))
    assert fingerprint(trefoil) != mirror_fingerprint(trefoil)


def test_diagrams_of_one_knot_share_a_fingerprint():
    assert _fp("rational:7/3") == _fp("rational:7/5")        # 3·5 ≡ 1 (mod 7)
    assert _fp("rational:5/2") == _fp("conway:2 2")
    assert _fp("rational:3/1") == _fp("torus:2,3")
    assert _fp("rational:7/3") != _fp("rational:7/1")        # 5_2 ≠ 7_1 = T(2,7): Schubert


def test_mutants_share_the_fingerprint():
    assert _fp("pretzel:2,3,3,5") == _fp("pretzel:2,3,5,3")


def test_a_row_missing_an_invariant_gets_a_partial_fingerprint():
    row = _row(parse("torus:2,5"))
    assert fingerprint(row).startswith("fp:")
    partial = {**row, "jones": None}
    assert fingerprint(partial).startswith("fp-partial:") and fingerprint(partial) != fingerprint(row)


def _reverse(d: Diagram, comps: set[int]) -> Diagram:
    """The same diagram with the components ``comps`` reversed, relabelled so that labels
    increase along the new orientation; at a crossing where a reversed component is the
    under-strand, the tuple starts at its new incoming label (the old outgoing one)."""
    new = {}
    for k, comp in enumerate(d.components):
        m, n = comp[0], len(comp)
        assert list(comp) == list(range(m, m + n))              # parse labels consecutively
        for i, lab in enumerate(comp):
            new[lab] = m + ((n - i) % n) if k in comps else lab
    of = d.component_of_label
    return Diagram.from_pd([tuple(new[x] for x in ((c, dd, a, b) if of[a] in comps else (a, b, c, dd)))
                            for a, b, c, dd in d.pd])


@pytest.mark.parametrize("notation", ["torus:2,4", "torus:3,3", "conway:2 1 2", "pretzel:2,2,2",
                                      "pretzel:2,-4,2", "rational:12/5", "torus:2,6"])
def test_jones_orientation_set_against_brute_force_reversal(notation):
    d = parse(notation)
    c = len(d.components)
    brute = set()
    for r in range(c + 1):
        for sub in itertools.combinations(range(c), r):
            e = _reverse(d, set(sub))
            # the reversal really reversed exactly those components: a crossing changes
            # sign iff exactly one of its two strands was reversed
            of = d.component_of_label
            assert [e.signs[i] * d.signs[i] for i in range(len(d.pd))] == \
                [-1 if (of[a] in sub) != (of[b] in sub) else 1 for a, b, _, _ in d.pd]
            brute.add(tuple(map(tuple, jones_polynomial(e).to_json())))
    got = {tuple(map(tuple, p)) for p in jones_orientation_set(d, jones_polynomial(d))}
    assert got == brute
