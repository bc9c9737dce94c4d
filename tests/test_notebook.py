"""Notebook views: the HTML view of one census row, and the executed demo notebook."""

from __future__ import annotations

import json
import re
from pathlib import Path

import pytest

from _census_fixture import shared_census
from pipeline.census.reader import exact_int, open_census
from pipeline.errors import QueryError
from pipeline.invariants.poly import Laurent
from pipeline.present.notebook import poly_html, row_view

NOTEBOOK = Path(__file__).resolve().parents[1] / "data_demo" / "saltmarsh_explore.ipynb"


def _text(fragment: str) -> str:
    return re.sub(r"<[^>]+>", "", fragment).replace("\u2212", "-")


def test_poly_html_is_the_published_figure_eight_jones_polynomial():
    # figure-eight knot: V(t) = t^-2 - t^-1 + 1 - t + t^2 (Jones, Bull. AMS 12, 1985; memory)
    v = Laurent.from_exponents([(-2, 1), (-1, -1), (0, 1), (1, -1), (2, 1)])
    assert poly_html(v, "t") == ("<i>t</i><sup>-2</sup> \u2212 <i>t</i><sup>-1</sup> + 1 \u2212 <i>t</i>"
                                 " + <i>t</i><sup>2</sup>")


@pytest.mark.parametrize("pairs", [[(0.5, -1), (2.5, -1)], [(-3, 7), (0, -1), (4, 12)], [(0, 1)], []])
def test_poly_html_says_what_to_text_says(pairs):
    p = Laurent.from_exponents(pairs)
    plain = p.to_text("t").replace("^", "").replace("(", "").replace(")", "")
    assert _text(poly_html(p, "t")) == plain


def test_row_view_shows_the_stored_row(tmp_path_factory):
    census = open_census(shared_census(tmp_path_factory))
    d = census.diagrams
    rid = int(d[d["notation"] == "torus:2,5"]["row_id"].iloc[0])
    page = row_view(census, rid)._repr_html_()
    r = d[d["row_id"] == rid].iloc[0]
    assert "torus:2,5" in page and "<svg" in page and page.count('class="arc"') == 5
    assert f"<td>{exact_int(r['determinant'], r['determinant_text'])}</td>" in page
    # every stored colouring count of the row is listed, by modulus
    col = census.colorings[census.colorings["row_id"] == rid]
    for m, c in zip(col["modulus"], col["count_text"]):
        assert f"<tr><td>{m}</td><td>{c}</td>" in page
    with pytest.raises(QueryError):
        census.row(10 ** 9)


def test_demo_notebook_is_executed_with_outputs_stored():
    nb = json.loads(NOTEBOOK.read_text(encoding="utf-8"))
    code = [c for c in nb["cells"] if c["cell_type"] == "code"]
    assert code and all(c.get("execution_count") for c in code)
    outputs = [o for c in code for o in c.get("outputs", [])]
    assert not [o for o in outputs if o.get("output_type") == "error"]
    kinds = {k for o in outputs for k in (o.get("data") or {})}
    assert {"image/svg+xml", "text/html"} <= kinds
    source = "".join("".join(c["source"]) for c in code)
    assert "import duckdb" in source and "import pandas" in source and "_repr_svg_" not in source
