"""knotledger report: Markdown + self-contained HTML + every plot file."""

from __future__ import annotations

import json
import re
import shutil
from pathlib import Path

import pytest

from _census_fixture import shared_census
from pipeline.census.reader import open_census
from pipeline.cli import main as cli
from pipeline.present.report import build_report, render_html, render_markdown
from pipeline.present.plots import PLOTS

PNG = b"\x89PNG\r\n\x1a\n"


@pytest.fixture(scope="module")
def report_dir(tmp_path_factory) -> Path:
    # a private copy: the report writes into the census directory
    src = shared_census(tmp_path_factory)
    dst = tmp_path_factory.mktemp("report") / "census"
    shutil.copytree(src, dst)
    assert cli(["report", str(dst)]) == 0
    return dst


def test_report_renders_and_every_plot_file_exists(report_dir):
    md = (report_dir / "report.md").read_text()
    page = (report_dir / "report.html").read_text()
    linked = re.findall(r"\]\(plots/([^)]+)\)", md)
    assert set(PLOTS) <= set(linked)
    for name in linked:
        data = (report_dir / "plots" / name).read_bytes()
        assert data.startswith(PNG) and len(data) > 1000, name
    # self-contained HTML: every image embedded, none linked
    assert page.count("data:image/png;base64,") == len(linked)
    assert "src='plots/" not in page
    for section in ("Determinants", "Colourability by prime", "Fewest colours", "Knot types",
                    "Chirality", "Certification failures", "Timings", "Rejects"):
        assert f"## {section}" in md and f"<h2>{section}</h2>" in page


def test_report_numbers_match_the_tables(report_dir):
    c = open_census(report_dir)
    md = (report_dir / "report.md").read_text()
    for family, n in c.diagrams["family"].value_counts().items():
        assert re.search(rf"\| {family} \| {n} \|", md), family
    # two-bridge determinants: det b(alpha, beta) = alpha (Schubert 1956), so min/max are the alpha range
    tb = c.diagrams[c.diagrams["family"] == "two_bridge"]
    dets = sorted(int(x) for x in tb["determinant"])
    assert f"| two_bridge | {len(dets)} | {dets[0]} |" in md


def test_report_mentions_mutants_and_fingerprint_limits(report_dir):
    md = (report_dir / "report.md").read_text()
    assert "P(2,3,3,5)" in md and "P(2,3,5,3)" in md and "fingerprints cannot separate" in md


def test_fewest_colours_of_knots_respect_the_published_bound(report_dir):
    # >= floor(log2 p) + 2 over all diagrams of a knot *(memory: Nakamura-Nakanishi-Satoh 2013)*
    c = open_census(report_dir)
    col = c.colorings.merge(c.diagrams[["row_id", "components"]], on="row_id")
    knots = col[(col["components"] == 1) & col["min_colors"].notna()]
    assert len(knots) > 0
    for p, m in zip(knots["modulus"], knots["min_colors"]):
        assert int(m) >= int(p).bit_length() + 1
    assert "WARNING" not in (report_dir / "report.md").read_text()


def test_report_on_an_empty_census_still_writes_every_plot(tmp_path, report_dir):
    empty = tmp_path / "empty"
    for table in ("diagrams", "colorings", "knots", "rejects"):
        (empty / table).mkdir(parents=True)
        for part in (report_dir / table).glob("part-schema*.parquet"):
            shutil.copy(part, empty / table / part.name)
    md, page, files = build_report(empty)
    assert {f.name for f in files} == set(PLOTS)
    assert all(f.read_bytes().startswith(PNG) for f in files)


def test_renderers_escape_cells():
    blocks = [("h", 1, "T"), ("table", ["a|b", "<x>"], [["1|2", "<script>"]])]
    assert "1\\|2" in render_markdown(blocks)
    assert "<script>" not in render_html(blocks, Path("."))


def test_knot_collapse_counts_match_schubert_classification(report_dir):
    # b(a, b) = b(a, b') iff b' = b^{+-1} mod a -- H. Schubert, Math. Z. 65 (1956); with
    # 0 < b < a the classes are the pairs {b, b^-1 mod a}.
    from math import gcd
    c = open_census(report_dir)
    tb = c.diagrams[c.diagrams["family"] == "two_bridge"]
    alphas = {int(json.loads(p)["alpha"]) for p in tb["params"]}
    classes = {(a, min(b, pow(b, -1, a))) for a in alphas for b in range(1, a) if gcd(a, b) == 1}
    md = (report_dir / "report.md").read_text()
    assert f"| two_bridge | {len(tb)} | {len(classes)} |" in md


def test_report_lists_keys_shared_across_families(report_dir):
    # T(2,n) = b(n, +-1) -- Rolfsen, Knots and Links; SOURCES.md "Coincidences across families"
    md = (report_dir / "report.md").read_text()
    m = re.search(r"(\d+) knot keys occur in more than one family", md)
    assert m and int(m.group(1)) > 0
    assert re.search(r"\(([a-z_]+, )*torus(, [a-z_]+)*\)", md) and "two_bridge" in md


def test_determinant_histogram_handles_integers_beyond_float_range(tmp_path):
    from pipeline.present import plots as rp
    out = rp.histogram_by_family({"two_bridge": [3, 5, 10 ** 83, 10 ** 400], "torus": [0, 1]},
                                 tmp_path / "h.png", "t", xlabel="determinant")
    assert out.read_bytes().startswith(PNG)


def test_legend_order_is_numeric():
    from pipeline.present.plots import legend_order
    names = ["10 colours", "3 colours", "4 colours", "12 colours", "5 colours"]
    assert legend_order(names) == ["3 colours", "4 colours", "5 colours", "10 colours", "12 colours"]
    assert legend_order(["knot keys", "diagrams"]) == ["diagrams", "knot keys"]


def test_fewest_colours_legend_is_drawn_in_numeric_order(tmp_path, report_dir, monkeypatch):
    # the labels handed to matplotlib's legend, read back from the figure itself
    import matplotlib
    matplotlib.use("Agg", force=True)
    import matplotlib.pyplot as plt
    from pipeline.present import plots as rp
    seen = {}
    real_finish = rp._finish

    def spy(fig, ax, path, title, empty):
        seen[Path(path).name] = [t.get_text() for t in (ax.get_legend().get_texts() if ax.get_legend() else [])]
        return real_finish(fig, ax, path, title, empty)
    monkeypatch.setattr(rp, "_finish", spy)
    rp.grouped_bars(["5", "7"], {"10 colours": [0, 1], "3 colours": [2, 0], "4 colours": [1, 1]},
                    tmp_path / "m.png", "t", xlabel="p", ylabel="n")
    assert seen["m.png"] == ["3 colours", "4 colours", "10 colours"]
    plt.close("all")


def test_report_prints_the_census_path_relative_to_the_working_directory(report_dir, capsys, monkeypatch):
    monkeypatch.chdir(report_dir.parent)
    assert cli(["report", "census"]) == 0
    out = capsys.readouterr().out
    assert str(report_dir.parent) not in out and "census/report.md" in out
    monkeypatch.chdir(report_dir / "plots")  # the census is not below the working directory
    assert cli(["report", str(report_dir)]) == 0
    out = capsys.readouterr().out
    assert str(report_dir.parent) not in out and "census/report.md" in out
    assert str(report_dir.parent) not in (report_dir / "report.md").read_text()


def test_report_writes_the_explorer_page_with_every_knot_type(report_dir):
    page = (report_dir / "explorer.html").read_text()
    import base64
    import gzip
    m = re.search(r'<script id="kl-data" type="application/(json|gzip-base64)">(.*?)</script>', page, re.S)
    text = m.group(2) if m.group(1) == "json" else gzip.decompress(base64.b64decode(m.group(2))).decode()
    data = json.loads(text)
    assert len(data["plots"]) == len(re.findall(r"\]\(plots/", (report_dir / "report.md").read_text()))
    assert sorted(r[0] for r in data["knots"]) == sorted(open_census(report_dir).knots["knot_key"])
    assert "<script src=" not in page and "<link " not in page  # self-contained


# ---- strength (issue 12): Khovanov width and the chirality share per invariant
def test_report_has_kh_width_and_chirality_share_matching_the_table(report_dir):
    from pipeline.census.reader import open_census
    text = (report_dir / "report.md").read_text()
    assert "kh_width.png" in text and "chiral_by_invariant.png" in text
    assert (report_dir / "plots" / "kh_width.png").stat().st_size > 0
    d = open_census(report_dir).diagrams
    # the width table counts every row with a computed width, per family
    for fam, grp in d.groupby("family"):
        widths = grp["kh_width"].dropna().astype(int).value_counts()
        for w, n in widths.items():
            assert f"width {w}" in text
        share = (grp["chirality"] == "chiral (jones)").sum() / len(grp)
        assert f"{share:.3f}" in text
