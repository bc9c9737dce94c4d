"""Render a diagram picture (SVG or PNG) from :func:`pipeline.present.draw.geometry.layout`.

Labels are the colouring-matrix labels of ``knotledger show``: arc ``a k`` is
``diagram.arcs[k-1]`` (column k), free loops are the columns after the arcs, and crossing
``x i`` is the i-th PD tuple (row i).  With ``coloring=p`` every arc is painted by a
witness Fox p-colouring and its residue is written beside the arc number, so
2·over ≡ under₁ + under₂ (mod p) can be checked at each crossing by eye (Fox 1962).

References
----------
1. R. H. Fox, "A quick trip through ..." (survey article), in *Topology of 3-manifolds and related
   topics*, Prentice-Hall (1962): p-colourings of a diagram's arcs.
2. M. Okabe, K. Ito, "Color universal design" (2008): the eight-colour palette used for
   residues and components (distinguishable under the common colour-vision deficiencies).
"""

from __future__ import annotations

import math
import os
from pathlib import Path
from typing import Optional

from ...diagrams.diagram import Diagram
from ...errors import KnotLedgerError
from ...numbers import prime_factors
from .geometry import layout as _layout

__all__ = ["draw_diagram", "witness_for_picture", "residue_palette"]

#: Okabe-Ito colours (black left out: it is the casing colour), ordered for contrast.
_OKABE_ITO = ["#0072B2", "#E69F00", "#009E73", "#CC79A7", "#56B4E9", "#D55E00", "#F0E442"]
_INK = "#222222"
#: Largest diagram drawn (beyond this the layout takes many seconds and no label is readable).
MAX_DRAW_CROSSINGS = 2000


def residue_palette(p: int) -> list[str]:
    """One distinct colour-blind-safe colour per residue 0..p-1.

    Okabe-Ito colours for p <= 7; beyond that p evenly spaced samples of the cividis
    colour map (designed to be read under colour-vision deficiency).
    """
    if p <= len(_OKABE_ITO):
        return _OKABE_ITO[:p]
    from matplotlib import colormaps
    from matplotlib.colors import to_hex
    cmap = colormaps["cividis"]
    return [to_hex(cmap(k / (p - 1))) for k in range(p)]


def witness_for_picture(diagram: Diagram, p: int) -> tuple[int, ...]:
    """A non-constant Fox p-colouring, one colour per colouring-matrix column.

    For a prime p this is :func:`pipeline.invariants.coloring.spectrum.witness_coloring`; for a
    composite p a witness q-colouring for a prime q | p, multiplied by p/q, is a
    non-constant p-colouring (one exists iff gcd(p, det) ≠ 1, i.e. iff such a q exists).

    Raises
    ------
    KnotLedgerError
        If p < 2 or the diagram has no non-constant p-colouring.
    """
    from ...invariants.coloring.spectrum import determinant, witness_coloring

    if isinstance(p, bool) or not isinstance(p, int) or p < 2:
        raise KnotLedgerError(f"coloring: modulus {p!r} must be an integer >= 2")
    for q in prime_factors(p):
        w = witness_coloring(diagram, q)
        if w is not None:
            return tuple((p // q) * c % p for c in w)
    raise KnotLedgerError(
        f"coloring: this diagram has no nontrivial {p}-colouring "
        f"(determinant {determinant(diagram)} is coprime to {p})")


def _corner_offset(dirs, k: int) -> tuple[float, float]:
    """Unit bisector of the corner between strand directions k and k+1."""
    a, b = dirs[k], dirs[(k + 1) % 4]
    x, y = a[0] + b[0], a[1] + b[1]
    r = math.hypot(x, y)
    if r < 1e-9:
        return (-a[1], a[0])
    return (x / r, y / r)


def _widest_corner(dirs) -> int:
    def ang(k):
        a, b = dirs[k], dirs[(k + 1) % 4]
        t = math.atan2(b[1], b[0]) - math.atan2(a[1], a[0])
        return t % (2 * math.pi)
    return max(range(4), key=ang)


def _point_along(pts, frac: float) -> tuple[int, tuple[float, float]]:
    """Segment index and point at fraction ``frac`` of the polyline's length."""
    lens = [math.dist(pts[k], pts[k + 1]) for k in range(len(pts) - 1)]
    goal, run = frac * sum(lens), 0.0
    for k, ln in enumerate(lens):
        if run + ln >= goal and ln > 0:
            f = (goal - run) / ln
            return k, (pts[k][0] + f * (pts[k + 1][0] - pts[k][0]), pts[k][1] + f * (pts[k + 1][1] - pts[k][1]))
        run += ln
    return len(pts) - 2, pts[-1]


def label_pieces(geo: dict) -> dict[int, list]:
    """Column (1-based arc number, then free loops) -> the polyline its label is put on:
    the longest drawn piece of the arc, or the loop itself."""
    best: dict[int, list] = {}
    for e in geo["edges"].values():
        for pts in e["drawn"]:
            if len(pts) >= 2 and (e["arc"] not in best or _length(pts) > _length(best[e["arc"]])):
                best[e["arc"]] = pts
    for lp in geo["loops"]:
        best[lp["column"]] = lp["points"]
    return best


def _length(pts) -> float:
    return sum(math.dist(pts[k], pts[k + 1]) for k in range(len(pts) - 1))


def draw_diagram(diagram: Diagram, path, *, coloring: Optional[int] = None, labels: bool = True,
                 arrows: bool = False, signs: bool = False) -> None:
    """Write a picture of ``diagram`` to ``path`` (SVG or PNG, chosen by the suffix).

    Parameters
    ----------
    diagram : Diagram
    path : str or Path
        Output file ending in ``.svg`` or ``.png``.
    coloring : int, optional
        Paint the arcs by a witness Fox colouring modulo this number and write each
        arc's residue beside its number.
    labels : bool, default True
        Arc numbers ``a1..am`` and crossing numbers ``x1..xn`` as in the colouring matrix.
    arrows : bool, default False
        One orientation arrow per arc.
    signs : bool, default False
        The sign (+ or −) of every crossing.

    Raises
    ------
    KnotLedgerError
        Unknown suffix, missing output directory, more than ``MAX_DRAW_CROSSINGS``
        crossings, a write failure, or no nontrivial colouring modulo ``coloring``.

    Examples
    --------
    >>> from pipeline import parse
    >>> draw_diagram(parse("torus:2,3"), "trefoil.svg", coloring=3)  # doctest: +SKIP
    """
    path = Path(path)
    suffix = path.suffix.lower()
    if suffix not in (".svg", ".png"):
        raise KnotLedgerError(f"draw: output {str(path)!r} must end in .svg or .png")
    if not path.parent.is_dir():
        raise KnotLedgerError(f"draw: directory {str(path.parent)!r} of the output does not exist")
    if diagram.n_crossings > MAX_DRAW_CROSSINGS:
        raise KnotLedgerError(f"draw: {diagram.n_crossings} crossings is more than a picture can show "
                              f"(limit {MAX_DRAW_CROSSINGS})")
    colours = witness_for_picture(diagram, coloring) if coloring is not None else None
    geo = _layout(diagram)

    import matplotlib
    matplotlib.use("Agg", force=False)
    import matplotlib.pyplot as plt
    from matplotlib.patches import FancyArrowPatch

    m = len(diagram.arcs)
    if colours is not None:
        pal = residue_palette(coloring)
        column_colour = [pal[c] for c in colours]
    else:
        comp_pal = [_INK] if len(diagram.components) + diagram.free_loops <= 1 else _OKABE_ITO
        column_colour = [None] * (m + diagram.free_loops)
        for v, e in geo["edges"].items():
            column_colour[e["arc"] - 1] = comp_pal[e["component"] % len(comp_pal)]
        for k, lp in enumerate(geo["loops"]):
            column_colour[lp["column"] - 1] = comp_pal[(len(diagram.components) + k) % len(comp_pal)]

    x0, y0, x1, y1 = geo["bounds"]
    w, h = x1 - x0, y1 - y0
    n = max(diagram.n_crossings, 1)
    inch = min(16.0, max(4.0, 2.2 * math.sqrt(n) + 2.0))
    scale = inch / max(w, h, 1e-9)
    fig_w, fig_h = max(2.5, w * scale + 1.0), max(2.5, h * scale + 1.0 + (0.4 if coloring else 0.0))
    fontsize = 9 if n <= 30 else 7
    lw = 2.4 if n <= 60 else 1.6

    rc = {"svg.fonttype": "none", "svg.hashsalt": "knotledger"}
    with matplotlib.rc_context(rc):
        fig, ax = plt.subplots(figsize=(fig_w, fig_h))
        try:
            ax.set_aspect("equal")
            ax.axis("off")
            pad = 0.08 * max(w, h) + 0.2
            ax.set_xlim(x0 - pad, x1 + pad)
            ax.set_ylim(y0 - pad, y1 + pad)
            strands = [(f"edge-{v}", e["drawn"], column_colour[e["arc"] - 1]) for v, e in geo["edges"].items()]
            strands += [(f"loop-{lp['column']}", [lp["points"]], column_colour[lp["column"] - 1]) for lp in geo["loops"]]
            for gid, pieces, col in strands:
                for pts in pieces:
                    xs, ys = [p[0] for p in pts], [p[1] for p in pts]
                    if colours is not None:
                        ax.plot(xs, ys, color=_INK, lw=lw + 1.6, solid_capstyle="butt", zorder=1)
                    ax.plot(xs, ys, color=col, lw=lw, solid_capstyle="butt", zorder=2, gid=gid)
            # one label / arrow per arc, on its longest drawn piece
            best = label_pieces(geo)
            box = dict(boxstyle="round,pad=0.15", fc="white", lw=1.2)
            for col, pts in sorted(best.items()):
                if arrows:
                    k, p = _point_along(pts, 0.3)
                    d = _unit_vec(pts[k], pts[k + 1])
                    eps = 0.004 * max(w, h)  # a very short shaft: only the head shows
                    ax.add_patch(FancyArrowPatch((p[0] - eps * d[0], p[1] - eps * d[1]), (p[0] + eps * d[0], p[1] + eps * d[1]),
                                                 arrowstyle="-|>", mutation_scale=18, fc=_INK, ec=_INK, lw=0.6,
                                                 shrinkA=0, shrinkB=0, zorder=4))
                if labels or colours is not None:
                    _, p = _point_along(pts, 0.5)
                    text = f"a{col}" if labels else ""
                    if colours is not None:
                        text = f"{text}={colours[col - 1]}" if labels else f"{colours[col - 1]}"
                    ax.text(p[0], p[1], text, fontsize=fontsize, ha="center", va="center", zorder=5,
                            bbox=dict(box, ec=column_colour[col - 1] or _INK), gid=f"arc-{col}")
            for i, X in enumerate(geo["crossings"]):
                dirs = geo["directions"][i]
                k = _widest_corner(dirs)
                if labels:
                    o = _corner_offset(dirs, k)
                    ax.annotate(f"x{i + 1}", X, xytext=(11 * o[0], 11 * o[1]), textcoords="offset points",
                                fontsize=fontsize - 1, color="#555555", style="italic", ha="center",
                                va="center", zorder=6, gid=f"crossing-{i + 1}")
                if signs:
                    o = _corner_offset(dirs, (k + 2) % 4)
                    ax.annotate("+" if diagram.signs[i] > 0 else "\u2212", X, xytext=(10 * o[0], 10 * o[1]),
                                textcoords="offset points", fontsize=fontsize, color="#8B0000",
                                ha="center", va="center", zorder=6)
            if colours is not None:
                ax.set_title(f"Fox {coloring}-colouring: 2\u00b7over \u2261 under\u2081 + under\u2082 (mod {coloring})",
                             fontsize=fontsize + 1)
            try:
                fig.savefig(path, format=suffix[1:], bbox_inches="tight", dpi=150,
                            metadata={"Date": None} if suffix == ".svg" else None)
            except OSError as err:
                raise KnotLedgerError(f"draw: cannot write {str(path)!r}: {err.strerror or err}") from err
        except BaseException:
            if path.exists():
                os.remove(path)
            raise
        finally:
            plt.close(fig)


def _unit_vec(a, b) -> tuple[float, float]:
    x, y = b[0] - a[0], b[1] - a[1]
    r = math.hypot(x, y) or 1.0
    return (x / r, y / r)
