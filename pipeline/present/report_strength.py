"""The report section of the issue-12 invariants: Khovanov width and chirality by invariant.

Called by :func:`pipeline.present.report.build_report` after the chirality section; the
blocks use the report's block format (``("h", level, text)``, ``("p", text)``,
``("table", header, rows)``, ``("img", title, file)``).
"""

from __future__ import annotations

from collections import Counter, defaultdict
from pathlib import Path
from typing import Any

from . import plots as rp

__all__ = ["strength_section", "STRENGTH_VERDICTS"]


def _plain(v: Any) -> Any:
    from ..explore.claims import _plain as plain
    return plain(v)


# ---- strength (issue 12): Khovanov width and the chirality share per invariant
STRENGTH_VERDICTS = ("jones", "signature", "homfly", "khovanov")


def strength_section(c, blocks: list, plots: Path) -> None:
    """Append the Khovanov-width table and plot and the chirality share per invariant."""
    d = c.diagrams
    blocks.append(("h", 2, "Khovanov width and chirality by invariant"))
    widths: dict = defaultdict(Counter)
    chiral: dict = defaultdict(Counter)
    rows: Counter = Counter()
    fam_col = d["family"].tolist() if "family" in d.columns else []
    w_col = d["kh_width"].tolist() if "kh_width" in d.columns else [None] * len(fam_col)
    c_col = d["chirality"].tolist() if "chirality" in d.columns else [None] * len(fam_col)
    for f, w, v in zip(fam_col, w_col, c_col):
        f, w, v = _plain(f), _plain(w), _plain(v)
        rows[f] += 1
        if w is not None:
            widths[f][f"width {int(w)}"] += 1
        for name in STRENGTH_VERDICTS:
            if v == f"chiral ({name})":
                chiral[f][name] += 1
    fams = sorted(rows)
    labels = sorted({k for cnt in widths.values() for k in cnt}, key=lambda t: int(t.split()[1]))
    blocks.append(("table", ["family"] + labels + ["not computed"],
                   [[f] + [widths[f][k] for k in labels] + [rows[f] - sum(widths[f].values())] for f in fams]))
    name = "kh_width.png"
    rp.stacked_bars(fams, {k: [widths[f][k] for f in fams] for k in labels}, plots / name, rp.PLOTS[name],
                    ylabel="diagrams")
    blocks.append(("img", rp.PLOTS[name], name))
    blocks.append(("p", "Share of each family's rows whose chirality verdict names the invariant "
                        "(the first of Jones, signature, HOMFLY-PT, Khovanov that decides):"))
    blocks.append(("table", ["family"] + [f"chiral ({n})" for n in STRENGTH_VERDICTS],
                   [[f] + [f"{chiral[f][n] / rows[f]:.3f}" for n in STRENGTH_VERDICTS] for f in fams]))
    name = "chiral_by_invariant.png"
    rp.grouped_bars(fams, {n: [chiral[f][n] / rows[f] for f in fams] for n in STRENGTH_VERDICTS},
                    plots / name, rp.PLOTS[name], xlabel="family", ylabel="share of rows")
    blocks.append(("img", rp.PLOTS[name], name))
# ---- end strength
