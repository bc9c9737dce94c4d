"""A diagram picture as SVG text, written directly from the layout (no matplotlib).

:func:`diagram_svg` is the quick route for web pages and notebooks (the explorer's
knot cards, ``Diagram._repr_svg_``): the same coordinates as ``knotledger draw``
(:func:`pipeline.present.draw.geometry.layout`, Tutte's barycentric embedding), the same
gaps in the under-strands and the same labels as ``knotledger show`` -- arc ``a k`` is
column k of the colouring matrix (``diagram.arcs[k-1]``), free loops are the columns
after the arcs, crossing ``x i`` is the i-th PD tuple -- but written as a few hundred
bytes of SVG per crossing in milliseconds.  :func:`pipeline.present.draw.draw_diagram`
remains the route for files (PNG, colourings, arrows, signs).
"""

from __future__ import annotations

import math

from ...diagrams.diagram import Diagram
from ...errors import KnotLedgerError
from .geometry import layout
from .render import MAX_DRAW_CROSSINGS, _INK, _OKABE_ITO, _corner_offset, _point_along, _widest_corner, label_pieces

__all__ = ["diagram_svg"]


def _fmt(v: float) -> str:
    return f"{v:.1f}".rstrip("0").rstrip(".")


def diagram_svg(diagram: Diagram, *, labels: bool = True, max_width: int = 420) -> str:
    """The picture of ``diagram`` as one ``<svg>`` element (a string).

    Parameters
    ----------
    diagram : Diagram
    labels : bool, default True
        Arc numbers ``a1..am`` and crossing numbers ``x1..xn`` as in ``knotledger show``.
    max_width : int, default 420
        Width in pixels the picture is scaled to fit (small diagrams are drawn smaller).

    Returns
    -------
    str
        ``<svg xmlns=... viewBox=...>...</svg>``: one ``<path class="strand">`` per drawn
        piece of an edge or free loop, one ``<text class="arc">`` per arc and one
        ``<text class="crossing">`` per crossing when ``labels``.

    Raises
    ------
    KnotLedgerError
        More than ``MAX_DRAW_CROSSINGS`` crossings.

    Examples
    --------
    >>> from pipeline import parse
    >>> svg = diagram_svg(parse("torus:2,3"))
    >>> svg.startswith("<svg") and svg.count('class="arc"'), svg.count('class="crossing"')
    (3, 3)

    Notes
    -----
    Layout by W. T. Tutte, "How to draw a graph", Proc. London Math. Soc. (3) 13 (1963);
    see :mod:`pipeline.present.draw.geometry`.
    """
    if diagram.n_crossings > MAX_DRAW_CROSSINGS:
        raise KnotLedgerError(f"draw: {diagram.n_crossings} crossings is more than a picture can show "
                              f"(limit {MAX_DRAW_CROSSINGS})")
    geo = layout(diagram)
    x0, y0, x1, y1 = geo["bounds"]
    w, h = max(x1 - x0, 1e-9), max(y1 - y0, 1e-9)
    n = max(diagram.n_crossings, 1)
    width = min(max_width, 140 + 40 * math.sqrt(n) * 2)
    pad = 22.0
    s = (width - 2 * pad) / max(w, h)
    W, H = w * s + 2 * pad, h * s + 2 * pad

    def pt(p) -> tuple[float, float]:  # y grows downwards in SVG
        return pad + (p[0] - x0) * s, pad + (y1 - p[1]) * s

    single = len(diagram.components) + diagram.free_loops <= 1
    m = len(diagram.arcs)
    colour = [_INK] * (m + diagram.free_loops)
    if not single:
        for e in geo["edges"].values():
            colour[e["arc"] - 1] = _OKABE_ITO[e["component"] % len(_OKABE_ITO)]
        for k, lp in enumerate(geo["loops"]):
            colour[lp["column"] - 1] = _OKABE_ITO[(len(diagram.components) + k) % len(_OKABE_ITO)]
    out = [f'<svg xmlns="http://www.w3.org/2000/svg" class="knotledger-diagram" width="{_fmt(W)}" '
           f'height="{_fmt(H)}" viewBox="0 0 {_fmt(W)} {_fmt(H)}" font-family="sans-serif">',
           f"<title>{diagram.n_crossings} crossings, {len(diagram.components)} components</title>"]
    strands = [(e["arc"], pts) for _, e in sorted(geo["edges"].items()) for pts in e["drawn"]]
    strands += [(lp["column"], lp["points"]) for lp in geo["loops"]]
    for col, pts in strands:
        d = "M" + " L".join(f"{_fmt(a)},{_fmt(b)}" for a, b in map(pt, pts))
        out.append(f'<path class="strand" data-arc="{col}" d="{d}" fill="none" stroke="{colour[col - 1]}" '
                   f'stroke-width="2.4"/>')
    if labels:
        best = label_pieces(geo)
        for col, pts in sorted(best.items()):
            x, y = pt(_point_along(pts, 0.5)[1])
            text = f"a{col}" if col <= m else f"o{col - m}"
            out.append(f'<rect x="{_fmt(x - 4 - 3.3 * len(text))}" y="{_fmt(y - 7)}" width="{_fmt(8 + 6.6 * len(text))}" '
                       f'height="14" rx="4" fill="white" stroke="{colour[col - 1]}"/>'
                       f'<text class="arc" x="{_fmt(x)}" y="{_fmt(y + 4)}" font-size="11" '
                       f'text-anchor="middle">{text}</text>')
        for i, X in enumerate(geo["crossings"]):
            dirs = geo["directions"][i]
            o = _corner_offset(dirs, _widest_corner(dirs))
            x, y = pt(X)
            out.append(f'<text class="crossing" x="{_fmt(x + 13 * o[0])}" y="{_fmt(y - 13 * o[1] + 4)}" '
                       f'font-size="10" font-style="italic" fill="#555555" text-anchor="middle">x{i + 1}</text>')
    out.append("</svg>")
    return "\n".join(out)
