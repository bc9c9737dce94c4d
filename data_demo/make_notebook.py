"""Write and execute data_demo/saltmarsh_explore.ipynb (outputs stored in the file).

Run from the repository root with the package importable and the dev-only tools
installed (``pip install nbformat nbclient ipykernel``)::

    PYTHONPATH=$PWD python data_demo/make_notebook.py
"""

from __future__ import annotations

import os
from pathlib import Path

import nbformat
from nbclient import NotebookClient

HERE = Path(__file__).resolve().parent
md, code = nbformat.v4.new_markdown_cell, nbformat.v4.new_code_cell

CELLS = [
    md("# The Saltmarsh Lane Knot Circle looks at a census\n\n"
       "An invented reading group (no real people) wants to see which small pretzel and two-bridge "
       "knots are 7-colourable and how few colours the family's own diagram needs. This notebook runs "
       "a small census in their scenario, opens it with **pandas** and **DuckDB**, and draws diagrams "
       "inline: a `Diagram` displays itself as a picture with the arc labels of `knotledger show`."),
    code('import contextlib\nimport io\nimport tempfile\nfrom pathlib import Path\n\n'
         'from pipeline import open_census, parse\nfrom pipeline.cli import main as knotledger\n\n'
         'SPEC = """\n[census]\nname = "saltmarsh-small"\nmax_modulus = 11\n\n'
         '[[family]]\nkind = "pretzel"\nlength = 3\nentries = [-7, 7]\nknots_only = true\n\n'
         '[[family]]\nkind = "two_bridge"\nalpha = [3, 35]\nknots_only = true\n"""\n'
         'work = Path(tempfile.mkdtemp())\n(work / "small.toml").write_text(SPEC)\n'
         'with contextlib.redirect_stderr(io.StringIO()) as log:  # progress lines\n'
         '    assert knotledger(["run", str(work / "small.toml"), "--out", str(work / "census"), "--jobs", "1"]) == 0\n'
         'print(log.getvalue().splitlines()[-1].replace(str(work), "."))'),
    md("## With pandas\n`open_census` reads the four tables as DataFrames (exact integers stay exact)."),
    code('import pandas as pd\n\ncensus = open_census(work / "census")\n'
         'diagrams = census.diagrams\nknots = census.knots\ncolorings = census.colorings\n'
         'print(len(diagrams), "diagrams,", len(knots), "knot types")\n'
         'diagrams[["row_id", "family", "notation", "crossings", "determinant", "signature", "chirality"]].head(8)'),
    code('sevens = colorings[(colorings.modulus == 7) & colorings.nontrivial]\n'
         'pd.crosstab(diagrams.set_index("row_id").loc[sevens.row_id, "family"].values, sevens.min_colors.values,\n'
         '            rownames=["family"], colnames=["fewest colours of a nontrivial 7-colouring"])'),
    md("## With DuckDB\nDuckDB queries the same DataFrames in SQL."),
    code('import duckdb\n\nduckdb.sql("""\n'
         '    SELECT d.family, count(DISTINCT d.knot_key) AS knot_types,\n'
         '           count(*) FILTER (WHERE c.nontrivial) AS seven_colourable_diagrams\n'
         '    FROM diagrams d JOIN colorings c USING (row_id)\n'
         '    WHERE c.modulus = 7 GROUP BY d.family ORDER BY d.family\n""").df()'),
    md("## Diagrams drawn inline\nThe last value of a cell that is a `Diagram` is drawn (arcs a1..am are "
       "the columns of the colouring matrix, crossings x1..xn its rows)."),
    code('parse("pretzel:-2,3,7")'),
    md("## One census row\n`row_view` shows one row: drawing, invariants, polynomials as formulas, "
       "colourings, chirality and the proof of the knot key."),
    code('from pipeline.present.notebook import row_view\n\n'
         'rid = int(diagrams.loc[diagrams.notation == "pretzel:-2,3,7", "row_id"].iloc[0])\n'
         'row_view(census, rid)'),
]


def main() -> None:
    nb = nbformat.v4.new_notebook(cells=CELLS)
    nb.metadata["kernelspec"] = {"name": "python3", "display_name": "Python 3", "language": "python"}
    os.environ.setdefault("PYTHONPATH", str(HERE.parent))
    NotebookClient(nb, timeout=600, kernel_name="python3", resources={"metadata": {"path": str(HERE)}}).execute()
    out = HERE / "saltmarsh_explore.ipynb"
    nbformat.write(nb, out)
    print(f"wrote {out.relative_to(HERE.parent)}")


if __name__ == "__main__":
    main()
