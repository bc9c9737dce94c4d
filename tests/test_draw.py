"""Tests for pipeline.present.draw: geometry of the layout, labels, colourings, files, command.

The geometry is checked from the outside: segment intersections by plain vectorised
orientation tests (not the module's own checker), crossing signs recomputed from the
drawn directions with the right-hand rule and compared with the PD signs and with the
published handedness pin (torus:2,3 is the positive trefoil, writhe +3, README.md), and
the labels compared with the rows of the colouring matrix rebuilt from the picture.
"""

from __future__ import annotations

import itertools
import math
import random
import re
import xml.etree.ElementTree as ET

import numpy as np
import pytest
from hypothesis import given, settings, strategies as st

from pipeline import parse
from pipeline.cli import main as cli_main
from pipeline.present.draw import draw_diagram, layout, residue_palette, stray_intersections
from pipeline.errors import KnotLedgerError

# ----------------------------------------------------------------------------- diagrams
_RNG = random.Random(20261202)


def _random_braid() -> str:
    k = _RNG.randint(2, 4)
    word = [_RNG.choice([1, -1]) * _RNG.randint(1, k - 1) for _ in range(_RNG.randint(1, 9))]
    return "braid:" + ",".join(map(str, word))


def _random_pretzel() -> str:
    return "pretzel:" + ",".join(str(_RNG.choice([-1, 1]) * _RNG.randint(1, 4)) for _ in range(_RNG.randint(2, 4)))


def _random_rational() -> str:
    while True:
        a = _RNG.randint(2, 40)
        b = _RNG.randint(1, a - 1)
        if math.gcd(a, b) == 1:
            return f"rational:{a}/{_RNG.choice([-1, 1]) * b}"


FIXED = [
    "torus:2,3",
    "pd:[[1,5,2,4],[3,1,4,6],[5,3,6,2]]",
    "pd:[[1,1,2,2]]",                         # one kink
    "pd:[[4,2,1,1],[2,4,3,3]]",                # two kinks
    "pd:[[1,3,2,4],[3,1,4,2]]",                # typed Hopf link (bigons)
    "pd:[[1,7,2,8],[12,6,7,1],[5,11,6,12],[10,2,11,3],[3,9,4,10],[8,4,9,5]]",  # typed 2-component link
    "rational:4/1", "rational:5/2", "dt:4 6 2", "dt:4 8 10 2 6",
    "pretzel:-2,3,3", "montesinos:1/3,2/5,-1/2",
    "braid:1,3", "braid:2,2", "braid:1,-1", "braid:1,1,1,3,3,3,3",
    "torus:3,4", "conway:2 1 2",
]
RANDOM = [_random_braid() for _ in range(10)] + [_random_pretzel() for _ in range(5)] + \
    [_random_rational() for _ in range(5)]


def _diagrams():
    out = []
    for text in FIXED + RANDOM:
        try:
            out.append(pytest.param(parse(text), id=text))
        except KnotLedgerError:
            if text in FIXED:
                raise
    return out


DIAGRAMS = _diagrams()


# ----------------------------------------------------------------------------- helpers
def _segments(polylines: dict) -> tuple[np.ndarray, list]:
    segs, owner = [], []
    for key, pts in polylines.items():
        for k in range(len(pts) - 1):
            segs.append((*pts[k], *pts[k + 1]))
            owner.append((key, k, len(pts) - 1))
    return np.array(segs, dtype=float).reshape(-1, 4), owner


def _proper_crossings(polylines: dict) -> list[tuple]:
    """Pairs of segments that cross at a point interior to both (strict orientation test)."""
    S, owner = _segments(polylines)
    if len(S) == 0:
        return []
    p, q = S[:, None, 0:2], S[:, None, 2:4]
    r, s = S[None, :, 0:2], S[None, :, 2:4]

    def orient(a, b, c):
        return (b[..., 0] - a[..., 0]) * (c[..., 1] - a[..., 1]) - (b[..., 1] - a[..., 1]) * (c[..., 0] - a[..., 0])

    o1, o2 = orient(p, q, r), orient(p, q, s)
    o3, o4 = orient(r, s, p), orient(r, s, q)
    eps = 1e-12
    hit = (o1 * o2 < -eps) & (o3 * o4 < -eps)
    out = []
    for a, b in zip(*np.nonzero(np.triu(hit, 1))):
        (k1, i1, _), (k2, i2, _) = owner[a], owner[b]
        if k1 == k2 and abs(i1 - i2) <= 1:
            continue
        out.append((owner[a], owner[b]))
    return out


def _point_segment_distance(pt, S: np.ndarray) -> np.ndarray:
    a, b = S[:, 0:2], S[:, 2:4]
    d = b - a
    L2 = np.maximum((d * d).sum(axis=1), 1e-300)
    t = np.clip(((np.asarray(pt) - a) * d).sum(axis=1) / L2, 0, 1)
    proj = a + t[:, None] * d
    return np.hypot(*(np.asarray(pt) - proj).T)


def _leaving_direction(geo: dict, i: int, s: int) -> tuple[float, float]:
    """Direction in which the drawn edge at slot (i, s) leaves crossing i."""
    for e in geo["edges"].values():
        if e["tail"] == (i, s):
            a, b = e["points"][0], e["points"][1]
            return (b[0] - a[0], b[1] - a[1])
        if e["head"] == (i, s):
            a, b = e["points"][-1], e["points"][-2]
            return (b[0] - a[0], b[1] - a[1])
    raise AssertionError(f"no edge at slot {(i, s)}")


def _touching_labels(geo: dict, i: int, tol: float = 1e-9) -> set[int]:
    X = geo["crossings"][i]
    return {v for v, e in geo["edges"].items() for pts in e["drawn"]
            if math.dist(pts[0], X) < tol or math.dist(pts[-1], X) < tol}


# ----------------------------------------------------------------------------- geometry
@pytest.mark.parametrize("diagram", DIAGRAMS)
def test_edges_meet_only_at_crossings(diagram):
    geo = layout(diagram)
    polys = {v: e["points"] for v, e in geo["edges"].items()}
    polys.update({("loop", k): lp["points"] for k, lp in enumerate(geo["loops"])})
    assert _proper_crossings(polys) == []
    # no vertex of one edge lies on another edge, except the shared crossing points
    S, owner = _segments(polys)
    crossings = geo["crossings"]
    for key, pts in polys.items():
        others = np.array([o[0] != key for o in owner])
        if not others.any():
            continue
        for pt in pts:
            if any(math.dist(pt, X) < 1e-12 for X in crossings):
                continue
            assert _point_segment_distance(pt, S[others]).min() > 1e-9, (key, pt)
    # the drawn pieces (gaps cut) touch only where an over-strand runs through its crossing
    drawn = {(v, k): pts for v, e in geo["edges"].items() for k, pts in enumerate(e["drawn"])}
    assert _proper_crossings(drawn) == []
    assert stray_intersections(polys, set(crossings)) == []


@pytest.mark.parametrize("diagram", DIAGRAMS)
def test_drawn_order_at_each_crossing_is_the_pd_order(diagram):
    """The four strands leave each crossing counterclockwise in the order a, b, c, d."""
    geo = layout(diagram)
    for i in range(diagram.n_crossings):
        ang = [math.atan2(*reversed(_leaving_direction(geo, i, s))) for s in range(4)]
        turns = [(ang[(s + 1) % 4] - ang[s]) % (2 * math.pi) for s in range(4)]
        assert all(t > 1e-6 for t in turns)
        assert math.isclose(sum(turns), 2 * math.pi, rel_tol=1e-9), (i, ang)


@pytest.mark.parametrize("diagram", DIAGRAMS)
def test_drawn_over_strand_and_sign_match_the_pd(diagram):
    geo = layout(diagram)
    for i, X in enumerate(geo["crossings"]):
        # only the over-strand's edges reach the crossing point; the under-strand has a gap
        assert _touching_labels(geo, i) == set(diagram.over_labels(i))
        a, c = diagram.pd[i][0], diagram.pd[i][2]
        for v in (a, c):
            if v in diagram.over_labels(i):  # the same edge passes over at this crossing too
                continue
            for pts in geo["edges"][v]["drawn"]:
                assert min(math.dist(p, X) for p in pts) >= 0.9 * geo["gaps"][i] > 0  # a visible gap
        # right-hand rule from the drawn directions: positive iff cross(over, under) > 0
        under = geo["directions"][i][2]          # leaving along c: the under-strand's direction
        v_in, v_out = diagram.over_labels(i)
        s_out = diagram.pd[i].index(v_out) if diagram.pd[i].count(v_out) == 1 else \
            next(s for s in (1, 3) if diagram.pd[i][s] == v_out and geo["edges"][v_out]["tail"] == (i, s))
        over = _leaving_direction(geo, i, s_out)
        sign = 1 if over[0] * under[1] - over[1] * under[0] > 0 else -1
        assert sign == diagram.signs[i]


@pytest.mark.parametrize("diagram", DIAGRAMS)
def test_edges_run_along_the_orientation(diagram):
    """Each drawn edge ends where the next edge of its component starts, straight across."""
    geo = layout(diagram)
    for comp in diagram.components:
        for v, w in zip(comp, comp[1:] + comp[:1]):
            (j, t), (k, u) = geo["edges"][v]["head"], geo["edges"][w]["tail"]
            assert j == k and u == (t + 2) % 4
            assert geo["edges"][v]["points"][-1] == geo["edges"][w]["points"][0] == geo["crossings"][j]


def test_positive_trefoil_is_drawn_right_handed():
    # README.md pin: torus:2,3 is the positive trefoil, writhe +3; the drawn crossings
    # must all be positive by the right-hand rule, and those of its mirror negative.
    d = parse("torus:2,3")
    for diag, expected in ((d, 1), (d.mirror(), -1)):
        geo = layout(diag)
        for i in range(3):
            v_in, v_out = diag.over_labels(i)
            s_out = next(s for s in (1, 3) if diag.pd[i][s] == v_out)
            over = _leaving_direction(geo, i, s_out)
            under = _leaving_direction(geo, i, 2)
            assert (1 if over[0] * under[1] - over[1] * under[0] > 0 else -1) == expected


# ----------------------------------------------------------------------------- labels
def _matrix_from_picture(diagram, geo) -> list[list[int]]:
    """Colouring-matrix rows rebuilt from the picture's arc labels: 2·over − under₁ − under₂."""
    ncols = len(diagram.arcs) + diagram.free_loops
    rows = []
    for i in range(diagram.n_crossings):
        row = [0] * ncols
        over = {geo["edges"][v]["arc"] for v in _touching_labels(geo, i)}
        assert len(over) == 1  # both over edges carry one arc label
        row[over.pop() - 1] += 2
        for s in (0, 2):
            row[geo["edges"][diagram.pd[i][s]]["arc"] - 1] -= 1
        rows.append(row)
    return rows


@pytest.mark.parametrize("diagram", DIAGRAMS)
def test_labels_are_the_matrix_labels(diagram):
    coloring = pytest.importorskip("pipeline.invariants.coloring.spectrum")
    geo = layout(diagram)
    for v, e in geo["edges"].items():
        assert e["arc"] == diagram.arc_of_label[v] + 1
    assert [lp["column"] for lp in geo["loops"]] == \
        list(range(len(diagram.arcs) + 1, len(diagram.arcs) + diagram.free_loops + 1))
    assert _matrix_from_picture(diagram, geo) == [list(r) for r in coloring.coloring_matrix(diagram)]


def _svg_texts(path) -> list[str]:
    root = ET.parse(path).getroot()
    return ["".join(t.itertext()).strip() for t in root.iter("{http://www.w3.org/2000/svg}text")]


@pytest.mark.parametrize("text", ["torus:2,3", "braid:1,1,3,-2,3", "braid:2,2,2"])
def test_svg_carries_every_arc_and_crossing_label(tmp_path, text):
    d = parse(text)
    out = tmp_path / "d.svg"
    draw_diagram(d, out, arrows=True, signs=True)
    texts = _svg_texts(out)
    arcs = {t for t in texts if re.fullmatch(r"a\d+", t)}
    xs = {t for t in texts if re.fullmatch(r"x\d+", t)}
    assert arcs == {f"a{k}" for k in range(1, len(d.arcs) + d.free_loops + 1)}
    assert xs == {f"x{i}" for i in range(1, d.n_crossings + 1)}
    assert sum(t in ("+", "\u2212") for t in texts) == d.n_crossings


def test_no_labels_leaves_text_out(tmp_path):
    out = tmp_path / "d.svg"
    draw_diagram(parse("torus:2,5"), out, labels=False)
    assert not [t for t in _svg_texts(out) if re.fullmatch(r"[ax]\d+", t)]


# ----------------------------------------------------------------------------- colourings
def _brute_force_nontrivial(matrix: list[list[int]], p: int) -> bool:
    """Slow route: does any non-constant vector mod p satisfy every row?"""
    ncols = len(matrix[0])
    for x in itertools.product(range(p), repeat=ncols):
        if len(set(x)) > 1 and all(sum(a * b for a, b in zip(r, x)) % p == 0 for r in matrix):
            return True
    return False


@pytest.mark.parametrize("text,p", [("torus:2,3", 3), ("dt:4 6 8 2", 5), ("pretzel:3,3,-3", 3),
                                    ("rational:4/1", 2), ("torus:2,9", 9), ("braid:1,1,1,3,3,3", 3),
                                    ("braid:2,2,2", 3)])
def test_drawn_witness_colouring_satisfies_every_crossing(tmp_path, text, p):
    d = parse(text)
    out = tmp_path / "c.svg"
    draw_diagram(d, out, coloring=p)
    root = ET.parse(out).getroot()
    ns = "{http://www.w3.org/2000/svg}"
    residue = {}
    for t in _svg_texts(out):
        m = re.fullmatch(r"a(\d+)=(\d+)", t)
        if m:
            residue[int(m.group(1))] = int(m.group(2))
    assert set(residue) == set(range(1, len(d.arcs) + d.free_loops + 1))
    assert len(set(residue.values())) > 1 and all(0 <= r < p for r in residue.values())
    geo = layout(d)
    for i in range(d.n_crossings):  # 2·over ≡ under₁ + under₂ (mod p), Fox 1962
        over = {geo["edges"][v]["arc"] for v in _touching_labels(geo, i)}.pop()
        u1, u2 = (geo["edges"][d.pd[i][s]]["arc"] for s in (0, 2))
        assert (2 * residue[over] - residue[u1] - residue[u2]) % p == 0
    # every strand is painted with its residue's palette colour
    pal = residue_palette(p)
    for g in root.iter(f"{ns}g"):
        m = re.fullmatch(r"edge-(\d+)", g.get("id", ""))
        if m:
            style = " ".join(e.get("style", "") for e in g.iter(f"{ns}path"))
            col = pal[residue[geo["edges"][int(m.group(1))]["arc"]]].lower()
            assert f"stroke: {col}" in style


@pytest.mark.parametrize("text,p", [("dt:4 6 8 2", 3), ("torus:2,3", 5), ("torus:2,3", 4)])
def test_no_nontrivial_colouring_is_a_one_line_error(tmp_path, text, p):
    d = parse(text)
    from pipeline.invariants.coloring.spectrum import coloring_matrix
    assert not _brute_force_nontrivial(coloring_matrix(d), p)  # the slow route agrees
    out = tmp_path / "c.png"
    with pytest.raises(KnotLedgerError, match=rf"no nontrivial {p}-colouring"):
        draw_diagram(d, out, coloring=p)
    assert not out.exists()


def test_palette_has_one_distinct_colour_per_residue():
    for p in (2, 3, 5, 7, 11, 23):
        pal = residue_palette(p)
        assert len(pal) == p == len(set(pal))


# ----------------------------------------------------------------------------- files and command
def test_png_is_a_valid_image(tmp_path):
    import matplotlib.image as mpimg
    out = tmp_path / "p.png"
    draw_diagram(parse("pretzel:3,5,7"), out, coloring=71, arrows=True, signs=True)  # det 71
    assert out.read_bytes()[:8] == b"\x89PNG\r\n\x1a\n"
    img = mpimg.imread(out)
    assert img.ndim == 3 and img.shape[0] > 100 and img.shape[1] > 100
    assert img[..., :3].std() > 0.01  # something was drawn


@pytest.mark.parametrize("text,name,match", [
    ("torus:2,3", "x.pdf", r"must end in \.svg or \.png"),
    ("torus:2,3", "missing/x.svg", r"directory .* does not exist"),
    ("torus:2,2001", "x.svg", r"2001 crossings is more than a picture can show \(limit 2000\)"),
], ids=["suffix", "directory", "too-large"])
def test_bad_output_or_size_is_a_one_line_error(tmp_path, text, name, match):
    with pytest.raises(KnotLedgerError, match=match):
        draw_diagram(parse(text), tmp_path / name)
    assert not (tmp_path / name).exists()


def test_command_writes_the_file_and_reports_bad_input_in_one_line(tmp_path, capsys):
    out = tmp_path / "k.svg"
    assert cli_main(["draw", "torus:2,3", "--out", str(out), "--coloring", "3", "--arrows", "--signs"]) == 0
    ET.parse(out)
    capsys.readouterr()
    for argv in (["draw", "pd:[[1,2", "--out", str(tmp_path / "b.svg")],
                 ["draw", "torus:2,3", "--out", str(tmp_path / "b.pdf")],
                 ["draw", "torus:2,3", "--out", str(tmp_path / "b.svg"), "--coloring", "5"],
                 ["draw", "torus:2,3", "--out", str(tmp_path / "b.svg"), "--coloring", "1"]):
        assert cli_main(argv) == 2
        err = capsys.readouterr().err
        assert err.count("\n") == 1 and "Traceback" not in err


def test_free_loops_and_split_pieces_are_laid_out_apart():
    d = parse("braid:1,1,1,4,4")  # a trefoil piece, a Hopf piece, one free loop (strand 3)
    geo = layout(d)
    assert d.free_loops == 1 and len(geo["loops"]) == 1 and len(d.pieces) == 2
    boxes = []
    for piece in d.pieces:
        pts = [p for v, e in geo["edges"].items() if e["tail"][0] in piece for p in e["points"]]
        boxes.append((min(p[0] for p in pts), max(p[0] for p in pts)))
    lp = geo["loops"][0]
    boxes.append((lp["center"][0] - lp["radius"], lp["center"][0] + lp["radius"]))
    boxes.sort()
    assert all(boxes[k][1] < boxes[k + 1][0] for k in range(len(boxes) - 1))


def test_layout_of_a_large_closure_is_planar():
    # a 60-crossing closed 4-braid: larger than the random cases, same guarantees
    word = [1, 2, -3, 2, 1, 3, -2, 1, 3, 2] * 6
    d = parse("braid:" + ",".join(map(str, word)))
    geo = layout(d)
    polys = {v: e["points"] for v, e in geo["edges"].items()}
    assert _proper_crossings(polys) == []


def test_smoothing_that_goes_astray_falls_back_to_the_straight_embedding(monkeypatch):
    # force every smoothed edge through two far-away points: all edges then meet off the
    # crossings, and the layout must fall back to Tutte's straight (planar) polylines
    import pipeline.present.draw.geometry as geometry

    def wild(P, d0, d3):
        return [P[0], (50.0, 50.0), (-50.0, 60.0), P[3]]

    monkeypatch.setattr(geometry, "_smooth", wild)
    d = parse("pretzel:3,-2,5")
    geo = geometry.layout(d)
    for e in geo["edges"].values():
        assert (50.0, 50.0) not in e["points"] and len(e["points"]) == 4
    assert _proper_crossings({v: e["points"] for v, e in geo["edges"].items()}) == []
    for i in range(d.n_crossings):
        ang = [math.atan2(*reversed(_leaving_direction(geo, i, s))) for s in range(4)]
        assert math.isclose(sum((ang[(s + 1) % 4] - ang[s]) % (2 * math.pi) for s in range(4)), 2 * math.pi)


def test_only_free_loops_are_drawn_as_labelled_circles(tmp_path):
    d = parse("pd:[] loops=2")
    geo = layout(d)
    assert [lp["column"] for lp in geo["loops"]] == [1, 2] and geo["edges"] == {}
    out = tmp_path / "o.svg"
    draw_diagram(d, out, coloring=2)  # loops colour independently: a nontrivial 2-colouring
    res = dict(re.fullmatch(r"a(\d)=(\d)", t).groups() for t in _svg_texts(out) if t.startswith("a"))
    assert set(res) == {"1", "2"} and set(res.values()) == {"0", "1"}


@settings(max_examples=25, deadline=None)
@given(st.lists(st.integers(-4, 4).filter(bool), min_size=1, max_size=12))
def test_random_braid_closures_are_drawn_faithfully(word):
    d = parse("braid:" + ",".join(map(str, word)))
    geo = layout(d)
    assert _proper_crossings({v: e["points"] for v, e in geo["edges"].items()}) == []
    for i in range(d.n_crossings):
        ang = [math.atan2(*reversed(_leaving_direction(geo, i, s))) for s in range(4)]
        assert math.isclose(sum((ang[(s + 1) % 4] - ang[s]) % (2 * math.pi) for s in range(4)), 2 * math.pi)
        assert _touching_labels(geo, i) == set(d.over_labels(i))
    assert len(geo["loops"]) == d.free_loops


def test_svg_text_has_one_label_per_arc_and_crossing_and_the_layout_strands():
    # The quick SVG route (explorer cards, notebooks) must carry the labels of `show`:
    # arcs a1..am (colouring-matrix columns) and crossings x1..xn (PD rows), and one
    # path per drawn piece of the layout; the output is well-formed XML.
    import xml.etree.ElementTree as ET
    from pipeline.present.draw.svg import diagram_svg
    ns = "{http://www.w3.org/2000/svg}"
    for text in ("torus:2,3", "conway:2 2", "torus:2,4", "pretzel:-2,3,7"):
        d = parse(text)
        root = ET.fromstring(diagram_svg(d))
        arcs = sorted(t.text for t in root.iter(f"{ns}text") if t.get("class") == "arc")
        xs = sorted(t.text for t in root.iter(f"{ns}text") if t.get("class") == "crossing")
        assert arcs == sorted(f"a{k + 1}" for k in range(len(d.arcs)))
        assert xs == sorted(f"x{i + 1}" for i in range(d.n_crossings))
        paths = [p for p in root.iter(f"{ns}path") if p.get("class") == "strand"]
        geo = layout(d)
        assert len(paths) == sum(len(e["drawn"]) for e in geo["edges"].values()) + len(geo["loops"])
        # every arc of the diagram is painted by at least one path
        assert {int(p.get("data-arc")) for p in paths} == set(range(1, len(d.arcs) + 1))
        w, h = float(root.get("width")), float(root.get("height"))
        for p in paths:
            for x, y in re.findall(r"(-?[\d.]+),(-?[\d.]+)", p.get("d")):
                assert 0 <= float(x) <= w and 0 <= float(y) <= h


def test_repr_svg_draws_a_diagram_without_loading_matplotlib():
    import subprocess
    import sys
    probe = ("import sys\nfrom pipeline import parse\nsvg = parse('torus:2,3')._repr_svg_()\n"
             "print(svg.count('class=\"arc\"'), 'matplotlib' in sys.modules)\n")
    res = subprocess.run([sys.executable, "-c", probe], capture_output=True, text=True, check=True)
    assert res.stdout.split() == ["3", "False"]
