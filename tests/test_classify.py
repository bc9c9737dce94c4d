"""Tests of pipeline.identify.classify and pipeline.identify.normal_forms: knot keys by theorem, checked
against the outside (Schubert, Bonahon-Siebenmann, torus-knot facts, published
coincidences) and against the Jones polynomial / colouring invariants of the diagrams."""

from __future__ import annotations

import itertools
import random
from fractions import Fraction
from math import gcd

import pytest

from pipeline.identify.classify import (KeyConflictError, build_knots_table, fingerprint, jones_orientation_set,
                               is_reduced, knot_key, mark_duplicates, normal_form)
from pipeline.diagrams.diagram import Diagram
from pipeline.invariants.alexander.fox import alexander_polynomial
from pipeline.invariants.coloring.spectrum import determinant, invariant_factors
from pipeline.invariants.signature import signature
from pipeline.invariants.jones.frontier import jones_polynomial
from pipeline.identify.normal_forms import montesinos_nf, pretzel_nf, torus_nf, two_bridge_nf
from pipeline.diagrams.notation import parse
from pipeline.invariants.poly import Laurent

from slow_routes import state_sum_jones


def key(notation: str) -> str:
    return knot_key({"notation": notation})["knot_key"]


def key_diagram(k: str) -> Diagram:
    """A diagram of a torus / two-bridge key, built from its own notation."""
    if k.startswith("2b:"):
        return parse("rational:" + k[3:])
    if k.startswith("torus:"):
        return parse(k)
    if k == "unknot":
        return parse("torus:1,2")
    raise AssertionError(k)


def jones_set(d: Diagram):
    return jones_orientation_set(d, jones_polynomial(d))


# ---------------------------------------------------------------------- torus
def test_torus_swap_mirror_and_trivial_cases():
    # Rolfsen ch. 7, Burde-Zieschang ch. 3 (SOURCES.md item 4): T(p,q) = T(q,p), T(-p,q) mirror
    for p, q in [(2, 3), (3, 4), (3, 5), (2, 7), (4, 6), (3, 3), (5, 7)]:
        assert key(f"torus:{p},{q}") == key(f"torus:{q},{p}") == key(f"torus:{-p},{-q}")
        nf = torus_nf(p, q)
        assert nf.mirror_key == key(f"torus:{-p},{q}") != nf.key
    for q in [2, 3, 7, -5]:       # SOURCES.md item 5: T(±1, q) is the unknot
        assert key(f"torus:1,{q}") == key(f"torus:-1,{q}") == key(f"torus:{q},1") == "unknot"


def test_torus_two_n_is_rational_n_over_one():
    # SOURCES.md item 5: T(2,n) = b(n, ±1); DESIGN pin torus:2,3 = rational:3/1 = conway:3
    assert key("torus:2,3") == key("rational:3/1") == key("conway:3") == "torus:2,3"
    for n in range(2, 30):
        assert key(f"torus:2,{n}") == key(f"rational:{n}/1") == key(f"rational:{n}/{1 - n}")
        assert key(f"torus:2,{-n}") == key(f"rational:{n}/-1")


def test_torus_braid_words_are_recognised():
    assert key("braid:1,2,1,2,1,2,1,2") == key("torus:3,4")
    assert key("braid:-1,-2,-3,-1,-2,-3,-1,-2,-3,-1,-2,-3,-1,-2,-3") == key("torus:-4,5")
    assert knot_key({"notation": "braid:1,2,2,1", "components": 1})["proof"] == "fingerprint only"


# ---------------------------------------------------------------------- two-bridge
def test_schubert_classification_for_alpha_up_to_60():
    # Schubert 1956 (SOURCES.md item 1): b(α,β) = b(α,β') iff β' ≡ β^{±1} (mod α); mirror b(α,−β);
    # amphichiral iff β² ≡ −1 (mod α)
    for alpha in range(2, 61):
        betas = [b for b in range(1, alpha) if gcd(alpha, b) == 1]
        classes = {frozenset({b, pow(b, -1, alpha)}) for b in betas}
        keys = {}
        for b in betas:
            nf = two_bridge_nf(alpha, b)
            assert nf.key == two_bridge_nf(alpha, pow(b, -1, alpha)).key
            assert nf.key == two_bridge_nf(alpha, b - alpha).key == two_bridge_nf(-alpha, -b).key
            assert nf.mirror_key == two_bridge_nf(alpha, -b).key
            assert nf.amphichiral == ((b * b + 1) % alpha == 0)
            assert nf.components == (1 if alpha % 2 else 2)
            keys.setdefault(nf.key, set()).add(b)
        assert len(keys) == len(classes)   # different classes, different keys


@pytest.mark.parametrize("alpha,beta", [(5, 2), (7, 2), (7, 3), (9, 2), (11, 3), (13, 5), (14, 3), (17, 4)])
def test_two_bridge_keys_agree_with_jones_of_the_key_diagram(alpha, beta):
    d = parse(f"rational:{alpha}/{beta}")
    k = two_bridge_nf(alpha, beta)
    assert jones_set(key_diagram(k.key)) == jones_set(d)
    assert jones_set(key_diagram(k.mirror_key)) == jones_set(d.mirror())


def test_b14_3_and_b14_5_one_unoriented_link_with_different_diagram_jones():
    # Schubert: 3·5 ≡ 1 (mod 14), so one unoriented link; the given orientations differ
    a, b = parse("rational:14/3"), parse("rational:14/5")
    assert key("rational:14/3") == key("rational:14/5")
    assert jones_polynomial(a) != jones_polynomial(b)
    assert jones_set(a) == jones_set(b)
    ra = {"notation": "pd:x", "components": 2, "determinant": 14, "invariant_factors": [14],
          "jones": jones_polynomial(a), "diagram": a}
    rb = {**ra, "jones": jones_polynomial(b), "diagram": b}
    assert fingerprint(ra) == fingerprint(rb)


def test_figure_eight_amphichiral_and_trefoil_chiral():
    # 4_1 = conway 2 2 = b(5,2), 2² ≡ −1 (mod 5); 3_1 = b(3,1) (Rolfsen table, Schubert)
    f8 = knot_key({"notation": "conway:2 2", "components": 1})
    tre = knot_key({"notation": "conway:3", "components": 1})
    assert f8["amphichiral"] is True and f8["chirality"] == "amphichiral (normal form)"
    assert tre["amphichiral"] is False and tre["chirality"] == "chiral (normal form)"
    assert tre["mirror_key"] == key("torus:-2,3")
    # the invariants agree: V(4_1) symmetric, V(3_1) not
    assert jones_polynomial(parse("conway:2 2")).is_symmetric()
    assert not jones_polynomial(parse("conway:3")).is_symmetric()


# ---------------------------------------------------------------------- Montesinos / pretzel
def test_published_coincidences():
    # SOURCES.md item 5: P(−2,3,3) = T(3,4), P(−2,3,5) = T(3,5); mirrors likewise
    assert key("pretzel:-2,3,3") == key("torus:3,4") == key("pretzel:3,-2,3")
    assert key("pretzel:-2,3,5") == key("torus:3,5") == key("pretzel:5,3,-2")
    assert key("pretzel:2,-3,-3") == key("torus:-3,4")
    assert key("pretzel:2,-3,-5") == key("torus:-3,5")
    # checked by an invariant: the all-states Kauffman sum (slow route) on the pretzel diagrams
    assert state_sum_jones(parse("pretzel:-2,3,3")) == jones_polynomial(parse("torus:3,4"))
    assert jones_polynomial(parse("pretzel:-2,3,5")) == jones_polynomial(parse("torus:3,5"))


def test_montesinos_fraction_is_minus_the_rational_fraction():
    # code-base convention: montesinos:3 = rational:3/-1, pretzel:p,q = T(2,p+q)
    assert key("montesinos:3") == key("rational:3/-1") == key("torus:-2,3")
    for p, q in [(3, 4), (1, 4), (-5, 2), (3, 3)]:
        assert key(f"pretzel:{p},{q}") == key(f"torus:2,{p + q}") or abs(p + q) < 2
    assert key("pretzel:1,1,1,1,1") == key("torus:-2,5")


def _random_fracs(rng, k, nonint_max):
    out = []
    for _ in range(k):
        a = rng.randint(2, 7) if rng.random() < 0.8 else 1
        b = rng.choice([x for x in range(-7, 8) if x and gcd(x, a) == 1])
        out.append(Fraction(b, a))
    nonint = [f for f in out if f.denominator > 1][:nonint_max]
    ints = [f for f in out if f.denominator == 1]
    seq = nonint + ints
    rng.shuffle(seq)
    return seq


def test_reduction_to_two_bridge_agrees_with_jones():
    # ≤ 2 non-integral tangles: two-bridge (SOURCES.md item 5); the computed b(α,β) is
    # checked against the Jones polynomials (all orientations) of the Montesinos diagram
    rng = random.Random(5)
    checked = 0
    for _ in range(120):
        fr = _random_fracs(rng, rng.randint(1, 4), 2)
        name = "montesinos:" + ",".join(f"{f.numerator}/{f.denominator}" for f in fr)
        d = parse(name)
        nf = montesinos_nf(fr)
        assert nf.components == d.n_components
        if nf.key.startswith(("2b:", "torus:", "unknot")) and d.n_components <= 2:
            assert jones_set(key_diagram(nf.key)) == jones_set(d), name
            checked += 1
    assert checked > 80


def _dihedral(seq):
    n = len(seq)
    out = set()
    for s in (list(seq), list(seq)[::-1]):
        for i in range(n):
            out.add(tuple(s[i:] + s[:i]))
    return out


@pytest.mark.parametrize("entries", [(2, 3, 3, 5), (3, 5, 7, 9), (-2, 3, 5, 7), (3, -4, 5, 5, 7),
                                     (2, 2, 3, -3), (4, 3, 5, -6, 7)])
def test_pretzel_permutations_collapse_exactly_under_dihedral_symmetry(entries):
    # Bonahon-Siebenmann (SOURCES.md item 5): cyclic order up to rotation and reversal
    classes: dict[frozenset, set] = {}
    for perm in set(itertools.permutations(entries)):
        classes.setdefault(frozenset(_dihedral(perm)), set()).add(key("pretzel:" + ",".join(map(str, perm))))
    for keys in classes.values():
        assert len(keys) == 1
    all_keys = [next(iter(k)) for k in classes.values()]
    assert len(set(all_keys)) == len(all_keys)   # |p_i| ≥ 2: the other permutations differ


def test_pretzel_with_unit_entries_collapses_more():
    # entries ±1 are integer tangles: they slide, so non-dihedral permutations may agree
    assert key("pretzel:1,3,5,7") == key("pretzel:3,1,5,7") == key("pretzel:3,5,1,7")


def test_mutants_share_fingerprints_but_not_keys():
    # SOURCES.md item 5: P(2,3,3,5) and P(2,3,5,3) share every invariant yet differ
    a, b = parse("pretzel:2,3,3,5"), parse("pretzel:2,3,5,3")
    assert jones_polynomial(a) == jones_polynomial(b)
    assert invariant_factors(a) == invariant_factors(b)
    rows = []
    for i, (n, d) in enumerate([("pretzel:2,3,3,5", a), ("pretzel:2,3,5,3", b)]):
        row = {"row_id": i, "notation": n, "crossings": d.n_crossings, "components": 1,
               "determinant": determinant(d), "invariant_factors": list(invariant_factors(d)),
               "jones": jones_polynomial(d), "alexander": alexander_polynomial(d),
               "signature": signature(d)}
        # knot fingerprints also carry HOMFLY-PT and Kh ranks (Q, F₂); mutants share them
        # (HOMFLY-PT: mutation invariant by the skein relation; Kh over F₂: Bloom 2010,
        # Wehrli 2010)
        from pipeline.invariants.homfly import homfly_polynomial
        from pipeline.invariants.khovanov import khovanov_data
        kh = khovanov_data(d, budget=20_000)
        row.update(homfly=homfly_polynomial(d, notation=n), khovanov=kh.khovanov, khovanov_f2=kh.khovanov_f2)
        row.update(knot_key(row))
        rows.append(row)
    assert rows[0]["knot_key"] != rows[1]["knot_key"]
    assert rows[0]["fingerprint"] == rows[1]["fingerprint"] and rows[0]["fingerprint"].startswith("fp:")
    table = build_knots_table(rows)
    assert len(table) == 2
    assert table[0]["fingerprint_shared_with"] == [table[1]["knot_key"]]


def test_zero_entries_give_connected_sums_and_split_links():
    # SOURCES.md item 5: P(3,0,3) = T(2,3) # T(2,3), invariant factors (3,3), not two-bridge
    assert key("pretzel:3,0,3") == key("pretzel:0,3,3") == "sum:torus:2,3#torus:2,3"
    assert invariant_factors(parse("pretzel:3,0,3")) == (3, 3)
    assert key("pretzel:3,0,-3") != key("pretzel:3,0,3")
    assert knot_key({"notation": "pretzel:3,0,-3"})["amphichiral"] is True   # 3_1 # mirror 3_1
    # Jones is multiplicative under connected sum of knots: check the summand signs
    for a, b in [(3, 5), (3, -5), (-7, 3), (5, 0)]:
        nf = pretzel_nf([a, 0, b])
        d = parse(f"pretzel:{a},0,{b}")
        if b:
            assert jones_polynomial(d) == jones_polynomial(parse(f"torus:2,{a}")) * jones_polynomial(parse(f"torus:2,{b}"))
        assert nf.components == d.n_components
    # two zeros: split
    assert key("pretzel:0,3,0,5") == "split:torus:2,3 + torus:2,5" == key("pretzel:0,5,0,3")
    assert key("pretzel:0,0") == "unlink:2" and determinant(parse("pretzel:0,0")) == 0


# ---------------------------------------------------------------------- fingerprints
def _row(i, notation, d=None, **extra):
    d = d or parse(notation)
    r = {"row_id": i, "notation": notation, "crossings": d.n_crossings, "components": d.n_components,
         "determinant": determinant(d), "invariant_factors": list(invariant_factors(d)),
         "jones": jones_polynomial(d), "alexander": None, "signature": None, "diagram": d, **extra}
    return r


def _no_diagram(row):
    """The row without its Diagram: only the fingerprint can key it (with the diagram,
    a reduced alternating PD gets the flype / Schubert key, test_identify_alternating.py)."""
    return {k: v for k, v in row.items() if k != "diagram"}


def test_fingerprints_separate_mirrors_of_chiral_knots_only():
    t = parse("torus:2,3")
    a, b = (_no_diagram(_row(0, t.to_notation(), t)),
            _no_diagram(_row(1, t.mirror().to_notation(), t.mirror())))
    ka, kb = knot_key(a), knot_key(b)
    assert ka["proof"] == "fingerprint only" and ka["knot_key"] != kb["knot_key"]
    assert ka["mirror_key"] == kb["knot_key"] and ka["amphichiral"] is False
    f = parse("conway:2 2")
    c, e = (_no_diagram(_row(2, f.to_notation(), f)),
            _no_diagram(_row(3, f.mirror().to_notation(), f.mirror())))
    assert knot_key(c)["knot_key"] == knot_key(e)["knot_key"]
    assert knot_key(c)["amphichiral"] is None     # fingerprints never prove amphichirality


def test_partial_fingerprints_are_marked():
    r = {"notation": "pd:x", "components": 1, "determinant": 3, "invariant_factors": [3],
         "jones": None, "alexander": None, "signature": None}
    assert fingerprint(r).startswith("fp-partial:")


def test_build_knots_table_refuses_to_merge_different_invariants():
    rows = [{"row_id": 0, "notation": "torus:2,3", "crossings": 3, "components": 1, "determinant": 3},
            {"row_id": 1, "notation": "rational:3/1", "crossings": 3, "components": 1, "determinant": 5}]
    for r in rows:
        r.update(knot_key(r))
    with pytest.raises(KeyConflictError, match="differ in determinant"):
        build_knots_table(rows)


def test_knots_table_columns_and_crossing_numbers():
    names = ["torus:3,4", "pretzel:-2,3,3", "torus:4,3", "rational:7/2", "rational:7/4", "conway:3 1 3",
             "torus:3,5", "pretzel:-2,3,5"]
    rows = [_row(i, n) for i, n in enumerate(names)]
    for r in rows:
        r.update(knot_key(r))
    table = {t["knot_key"]: t for t in build_knots_table(rows)}
    t34 = table["torus:3,4"]
    assert t34["n_diagrams"] == 3 and t34["proof"] == "normal form" and t34["amphichiral"] is False
    # fewest crossings (8 for the closed braid and for the pretzel), ties by row_id
    assert t34["representative"] == "torus:3,4" and t34["min_crossings_seen"] == 8
    # Murasugi 1991: c(T(3,4)) = 8 (8_19), c(T(3,5)) = 10 (10_124) (SOURCES.md table, memory)
    assert t34["crossing_number"] == 8 and table["torus:3,5"]["crossing_number"] == 10
    # 5_2 = conway 3 2 = 7/2, 7_4 = conway 3 1 3 = 15/4 (Rolfsen table, memory)
    assert table[key("rational:7/2")]["crossing_number"] == 5
    assert table[key("conway:3 1 3")]["crossing_number"] == 7
    assert table[key("rational:7/2")]["n_diagrams"] == 2   # 4 ≡ 2⁻¹ (mod 7)


def test_reduced_alternating_crossing_number_for_pd_rows():
    d = parse("conway:2 1 1 2")                  # 6_3, reduced alternating, 6 crossings
    r = _row(0, d.to_notation(), d)
    k = knot_key(r)
    # a PD of a two-bridge knot now gets the Schubert key (rule (c) of classify)
    assert k["proof"] == "normal form" and k["crossing_number"] == 6
    assert k["knot_key"] == key("conway:2 1 1 2")
    kink = parse("braid:1,1,1,2")              # σ2 once: a nugatory crossing
    k = knot_key(_no_diagram(_row(1, kink.to_notation(), kink)))
    assert k["crossing_number"] is None          # no diagram: nothing certifies
    k = knot_key(_row(1, kink.to_notation(), kink))
    # with the diagram it simplifies (R1) to the reduced alternating trefoil
    assert k["knot_key"] == "torus:2,3" and k["crossing_number"] == 3


def test_mark_duplicates():
    rows = [{"row_id": 5, "diagram_id": "a"}, {"row_id": 2, "diagram_id": "b"}, {"row_id": 3, "diagram_id": "a"},
            {"row_id": 1, "diagram_id": "a"}, {"row_id": 4, "diagram_id": None}]
    assert mark_duplicates(rows) == [1, None, 1, None, None]


# ---------------------------------------------------------------------- property test
def _census_rows(limit_crossings=14):
    names = []
    for p in range(2, 5):
        for q in range(-7, 8):
            if abs(q) > 1 and abs(q) * (p - 1) <= limit_crossings:
                names.append(f"torus:{p},{q}")
    for a in range(1, 26):
        names += [f"rational:{a}/{b}" for b in range(-a + 1, a) if gcd(a, b) == 1]
    for k in (3, 4):
        for t in itertools.product([-3, -2, -1, 0, 1, 2, 3], repeat=k):
            if sum(map(abs, t)) <= 10:
                names.append("pretzel:" + ",".join(map(str, t)))
    rng = random.Random(7)
    for _ in range(150):
        fr = _random_fracs(rng, 3, 3)
        names.append("montesinos:" + ",".join(f"{f.numerator}/{f.denominator}" for f in fr))
    return names


def test_equal_keys_imply_equal_invariants_on_a_census():
    # property: the normal forms never merge rows whose invariants differ
    # (determinant / invariant factors always; Jones for knots; all-orientation Jones sets for links)
    rows = []
    for i, n in enumerate(_census_rows()):
        d = parse(n)
        if d.n_crossings > 14:
            continue
        r = _row(i, n, d)
        r.update(knot_key(r))
        if d.n_components > 1:
            r["jones_orientations"] = frozenset(Laurent.from_json(p) for p in jones_set(d))
        rows.append(r)
    assert len(rows) > 2000
    by_key: dict[str, list] = {}
    for r in rows:
        by_key.setdefault(r["knot_key"], []).append(r)
    for k, members in by_key.items():
        ref = members[0]
        for r in members[1:]:
            assert (r["determinant"], r["invariant_factors"], r["components"]) == \
                (ref["determinant"], ref["invariant_factors"], ref["components"]), (k, ref["notation"], r["notation"])
            if r["components"] == 1:
                assert r["jones"] == ref["jones"], (k, ref["notation"], r["notation"])
            else:
                assert r["jones_orientations"] == ref["jones_orientations"], (k, ref["notation"], r["notation"])
        # the mirror key names the mirror: its invariants are the mirrored ones
        mk = members[0]["mirror_key"]
        if mk in by_key and ref["components"] == 1:
            assert by_key[mk][0]["jones"] == ref["jones"].invert()
        if mk in by_key and ref["components"] > 1:
            assert by_key[mk][0]["jones_orientations"] == {p.invert() for p in ref["jones_orientations"]}
        # proven amphichiral => mirror-symmetric invariants (Jones set over orientations)
        if ref["amphichiral"]:
            assert ref["jones_orientations" if ref["components"] > 1 else "jones"] == (
                {p.invert() for p in ref["jones_orientations"]} if ref["components"] > 1
                else ref["jones"].invert()), k
        # certified crossing number vs the reduced-alternating count (Kauffman-Murasugi-
        # Thistlethwaite 1987): a connected reduced alternating diagram has exactly c crossings
        for r in members:
            d = r["diagram"]
            if (r["crossing_number"] is not None and d.is_alternating() and is_reduced(d)
                    and len(d.pieces) == 1 and not d.free_loops):
                assert d.n_crossings == r["crossing_number"], (k, r["notation"])
    table = build_knots_table(rows)                 # raises on any conflict
    assert sum(t["n_diagrams"] for t in table) == len(rows)
    assert all(t["proof"] == "normal form" for t in table)


def test_knots_table_reads_rows_as_stored_by_the_worker():
    # the worker stores invariant factors as text, Jones as JSON text, the knot fields in extras
    import json
    rows = []
    for i, n in enumerate(["rational:7/2", "rational:7/4", "torus:2,3"]):
        d = parse(n)
        r = _row(i, n, d)
        k = knot_key(r)
        stored = {"row_id": i, "notation": n, "crossings": d.n_crossings, "components": 1,
                  "determinant": None, "determinant_text": str(r["determinant"]),
                  "invariant_factors": [str(x) for x in r["invariant_factors"]],
                  "jones": json.dumps(r["jones"].to_json()), "knot_key": k["knot_key"],
                  "mirror_key": k["mirror_key"], "knot_proof": k["proof"],
                  "extras": json.dumps({"knot": {x: k[x] for x in ("amphichiral", "amphichiral_reason",
                                                                   "crossing_number", "crossing_number_source",
                                                                   "fingerprint")}})}
        rows.append(stored)
    table = {t["knot_key"]: t for t in build_knots_table(rows)}
    t = table[key("rational:7/2")]
    assert t["n_diagrams"] == 2 and t["proof"] == "normal form" and t["crossing_number"] == 5
    assert t["amphichiral"] is False
    rows[1]["determinant_text"] = "9"
    with pytest.raises(KeyConflictError):
        build_knots_table(rows)


def test_montesinos_keys_are_invariant_under_isotopies_and_match_jones():
    # Moving an integer between tangles (f_i + n, f_j − n), rotating and reversing the order
    # are isotopies (Montesinos 1973; Burde-Zieschang ch. 12): same key, same Jones.
    # Amphichiral keys must have symmetric Jones; different e0 or orders give different keys.
    rng = random.Random(11)
    checked = 0
    for _ in range(40):
        fr = [Fraction(rng.choice([1, -1, 2, -2, 3]), rng.choice([2, 3, 5])) for _ in range(3)]
        fr = [f for f in fr if f.denominator > 1]
        if len(fr) < 3:
            continue
        n = rng.choice([1, -1, 2])
        moved = [fr[0] + n, fr[1] - n, fr[2]]
        variants = [moved, moved[::-1], moved[1:] + moved[:1]]
        base = montesinos_nf(fr)
        d = parse("montesinos:" + ",".join(f"{f.numerator}/{f.denominator}" for f in fr))
        for v in variants:
            assert montesinos_nf(v).key == base.key
            dv = parse("montesinos:" + ",".join(f"{f.numerator}/{f.denominator}" for f in v))
            assert jones_set(dv) == jones_set(d)
        if d.n_components == 1 and base.amphichiral:
            assert jones_polynomial(d).is_symmetric()
        checked += 1
        shifted = montesinos_nf([fr[0] + 1, fr[1], fr[2]])        # e0 changes by 1
        assert shifted.key != base.key
    assert checked > 20


def test_distinctness_notes():
    rows = [_row(i, n) for i, n in enumerate(["pretzel:2,3,3,5", "pretzel:2,3,5,3", "torus:3,3", "pretzel:2,2,-2"])]
    t = parse("torus:2,3")
    rows.append(_no_diagram(_row(4, t.to_notation(), t)))   # a PD without diagram: fingerprint only
    rows.append(_row(5, "torus:2,3"))
    for r in rows:
        r.update(knot_key(r))
    table = {x["knot_key"]: x for x in build_knots_table(rows)}
    assert "by the classification theorem" in table[key("pretzel:2,3,3,5")]["distinctness_note"]
    # same invariants as T(3,3) (all orientations): not claimed either way
    assert table[key("pretzel:2,2,-2")]["fingerprint_shared_with"] == ["torus:3,3"]
    assert "not proven" in table["torus:3,3"]["distinctness_note"]
    fp = knot_key(rows[4])["knot_key"]
    assert table[fp]["distinctness_note"].startswith("possibly the same type as torus:2,3")


def test_a_normal_form_contradicting_the_diagram_is_not_used():
    # components of T(3,4) are 1; a row claiming 2 is inconsistent: fall back to invariants
    k = knot_key({"notation": "torus:3,4", "components": 2, "determinant": 3, "invariant_factors": [3]})
    assert k["proof"] == "fingerprint only"
    assert knot_key({"notation": "torus:3,4", "components": 1})["proof"] == "normal form"


def test_small_montesinos_cases_do_not_claim_distinctness():
    # Elliptic cases (2,2,n), (2,3,3), (2,3,4), (2,3,5) lie outside the hypotheses of some
    # statements of the Bonahon–Siebenmann classification: no distinctness is claimed there.
    from pipeline.identify.knots_table import _distinctness_note, _small_montesinos
    assert _small_montesinos("mont:1/6:1/2,1/3,1/3") and _small_montesinos("mont:0:1/2,1/2,1/9")
    assert not _small_montesinos("mont:1/105:1/3,1/5,1/7") and not _small_montesinos("2b:7/3")
    row = {"knot_key": "mont:1/6:1/2,1/3,1/3", "proof": "normal form"}
    note = _distinctness_note(row, ["mont:5/6:1/2,2/3,1/3"], {"mont:5/6:1/2,2/3,1/3": "normal form"})
    assert "not proven" in note and "by the classification theorem" not in note


@pytest.mark.parametrize("seed", range(4))
def test_duplicate_of_python_equals_the_sql_view_and_brute_force(seed):
    # the one Python duplicate_of against the SQL column of explore/query.py (duckdb) and
    # the definition read literally (smallest other row_id with the same diagram_id)
    import random

    import duckdb
    import pandas as pd

    from pipeline.explore.query import _VIEW_COLUMNS
    from pipeline.identify.classify import duplicate_of
    rng = random.Random(seed)
    ids = rng.sample(range(1000), 40)
    dids = [rng.choice(["a", "b", "c", "d", None]) for _ in ids]
    py = duplicate_of(ids, dids)
    brute = [None if d is None or min(r2 for r2, d2 in zip(ids, dids) if d2 == d) == r
             else min(r2 for r2, d2 in zip(ids, dids) if d2 == d) for r, d in zip(ids, dids)]
    frame = pd.DataFrame({"row_id": ids, "diagram_id": dids})
    sql = duckdb.sql(f"SELECT row_id, duplicate_of FROM (SELECT {_VIEW_COLUMNS['diagrams']} FROM frame)").fetchall()
    by_row = {r: (None if v is None else int(v)) for r, v in sql}
    assert py == brute == [by_row[r] for r in ids]
