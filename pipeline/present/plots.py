"""The PNG plots of ``knotledger report`` (matplotlib, Agg back-end, imported lazily).

Every function takes already-aggregated plain data and a path, draws one figure and
writes it; with no data it still writes a figure that says so, so the set of plot files
of a report is always the same (:data:`PLOTS`).
"""

from __future__ import annotations

from pathlib import Path
from typing import Sequence

__all__ = ["PLOTS", "legend_order", "histogram_by_family", "grouped_bars", "stacked_bars", "line_plot"]

#: file name -> title; every report writes all of them.
PLOTS = {
    "determinant_distribution.png": "Determinant distribution per family",
    "prime_colorability.png": "Fraction of each family that is nontrivially p-colourable",
    "min_colors.png": "Fewest colours of a nontrivial p-colouring (per diagram)",
    "knot_collapse.png": "Diagrams versus distinct knot types per family",
    "chirality.png": "Chirality verdicts per family",
    "timings.png": "Seconds per committed chunk",
    # ---- strength (issue 12)
    "kh_width.png": "Khovanov width (diagonals j − 2i carrying Kh over Q) per family",
    "chiral_by_invariant.png": "Share of rows each invariant proved chiral",
    # ---- end strength
}


def legend_order(names: Sequence[str]) -> list[str]:
    """Series names in reading order: runs of digits compare as numbers, so
    ``"3 colours" < "4 colours" < "10 colours"``."""
    import re

    def key(name: str) -> list:
        return [(0, int(tok), "") if tok.isdigit() else (1, 0, tok)
                for tok in re.findall(r"\d+|\D+", str(name))]
    return sorted(names, key=key)


def _pyplot():
    import matplotlib
    matplotlib.use("Agg", force=True)
    import matplotlib.pyplot as plt
    return plt


def _finish(fig, ax, path: Path, title: str, empty: bool) -> Path:
    if empty:
        ax.text(0.5, 0.5, "no data", ha="center", va="center", transform=ax.transAxes, fontsize=14)
        ax.set_xticks([])
        ax.set_yticks([])
    ax.set_title(title)
    fig.tight_layout()
    fig.savefig(path, dpi=90)
    _pyplot().close(fig)
    return path


def histogram_by_family(data: dict[str, Sequence[int]], path: Path, title: str, *, xlabel: str) -> Path:
    """One step histogram per family; log10 of the values when they span > 3 decades."""
    plt = _pyplot()
    fig, ax = plt.subplots(figsize=(7, 4))
    values = [v for vs in data.values() for v in vs]
    if values:
        import math
        top = max(values)
        positive = [v for v in values if v > 0]
        log = bool(positive) and (top > 10 ** 15 or (top > 1000 and min(positive) * 1000 < top))
        def scale(v):  # exact big ints: log10 of a Python int never overflows a float
            return (math.log10(v) if v > 0 else 0.0) if log else float(v)
        lo, hi = min(scale(v) for v in values), scale(top)
        if log or top > 60:
            width = (hi - lo) / 40 or 1.0
            bins = [lo + k * width for k in range(41)]
        else:
            bins = [x - 0.5 for x in range(int(min(values)), int(top) + 2)]
        for family, vs in sorted(data.items()):
            ax.hist([scale(v) for v in vs], bins=bins, histtype="step", linewidth=1.5,
                    label=f"{family} ({len(vs)})")
        ax.set_xlabel(f"log10 {xlabel} (0 for {xlabel} 0)" if log else xlabel)
        ax.set_ylabel("diagrams")
        ax.legend(fontsize=8)
    return _finish(fig, ax, path, title, not values)


def grouped_bars(groups: Sequence[str], series: dict[str, Sequence[float]], path: Path, title: str, *,
                 xlabel: str, ylabel: str) -> Path:
    """Bars for each group (x) and series (colour)."""
    plt = _pyplot()
    fig, ax = plt.subplots(figsize=(7, 4))
    n = max(len(series), 1)
    width = 0.8 / n
    for k, name in enumerate(legend_order(list(series))):
        vals = series[name]
        xs = [i + (k - (n - 1) / 2) * width for i in range(len(groups))]
        ax.bar(xs, vals, width=width, label=str(name))
    if groups and series:
        ax.set_xticks(range(len(groups)))
        ax.set_xticklabels([str(g) for g in groups])
        ax.set_xlabel(xlabel)
        ax.set_ylabel(ylabel)
        ax.legend(fontsize=8)
    return _finish(fig, ax, path, title, not (groups and series))


def stacked_bars(groups: Sequence[str], series: dict[str, Sequence[int]], path: Path, title: str, *,
                 ylabel: str) -> Path:
    """Stacked bars: one bar per group, one colour per series."""
    plt = _pyplot()
    fig, ax = plt.subplots(figsize=(7, 4))
    bottom = [0] * len(groups)
    for name in legend_order(list(series)):
        vals = series[name]
        ax.bar(range(len(groups)), vals, bottom=bottom, label=str(name))
        bottom = [b + v for b, v in zip(bottom, vals)]
    if groups and series:
        ax.set_xticks(range(len(groups)))
        ax.set_xticklabels([str(g) for g in groups], rotation=15)
        ax.set_ylabel(ylabel)
        ax.legend(fontsize=8)
    return _finish(fig, ax, path, title, not (groups and series))


def line_plot(xs: Sequence[float], ys: Sequence[float], path: Path, title: str, *, xlabel: str,
              ylabel: str) -> Path:
    """A simple marker plot."""
    plt = _pyplot()
    fig, ax = plt.subplots(figsize=(7, 3.5))
    if xs:
        ax.plot(xs, ys, "o-", markersize=3)
        ax.set_xlabel(xlabel)
        ax.set_ylabel(ylabel)
    return _finish(fig, ax, path, title, not xs)
