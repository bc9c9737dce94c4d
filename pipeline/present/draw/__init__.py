"""``knotledger draw``: a picture of a diagram labelled like its colouring matrix.

``knotledger draw DIAGRAM --out FILE.svg|FILE.png [--coloring P] [--no-labels]
[--arrows] [--signs]``

The layout is computed from the PD code alone (:mod:`pipeline.present.draw.geometry`, Tutte's
barycentric embedding of the diagram's own rotation system), so every notation, link and
split diagram is drawn the same way; :mod:`pipeline.present.draw.render` paints it with
matplotlib.  Arc ``a k`` is column k of the colouring matrix (``diagram.arcs[k-1]``) and
crossing ``x i`` is row i (the i-th PD tuple), exactly as ``knotledger show`` prints them.
"""

from __future__ import annotations

import argparse
import sys

from .geometry import layout
from .intersections import stray_intersections
from .render import draw_diagram, residue_palette, witness_for_picture

__all__ = ["draw_diagram", "layout", "stray_intersections", "residue_palette",
           "witness_for_picture", "add_arguments", "main"]


def add_arguments(parser: argparse.ArgumentParser) -> None:
    """Arguments of ``knotledger draw``."""
    parser.add_argument("diagram", metavar="DIAGRAM",
                        help="a diagram string KIND:ARGS, e.g. torus:2,3 or pd:[[1,5,2,4],...]")
    parser.add_argument("--out", required=True, metavar="FILE",
                        help="output picture, FILE.svg or FILE.png")
    parser.add_argument("--coloring", type=int, metavar="P", default=None,
                        help="paint the arcs by a witness Fox P-colouring (residue written on each arc)")
    parser.add_argument("--no-labels", dest="labels", action="store_false",
                        help="leave out the arc numbers a1..am and crossing numbers x1..xn")
    parser.add_argument("--arrows", action="store_true", help="one orientation arrow per arc")
    parser.add_argument("--signs", action="store_true", help="write the sign of every crossing")


def main(args: argparse.Namespace) -> int:
    """Run ``knotledger draw``; returns the exit code (errors are raised as KnotLedgerError)."""
    from ...diagrams.notation import parse

    diagram = parse(args.diagram)
    draw_diagram(diagram, args.out, coloring=args.coloring, labels=args.labels,
                 arrows=args.arrows, signs=args.signs)
    print(f"wrote {args.out} ({diagram.n_crossings} crossings, {len(diagram.arcs) + diagram.free_loops} arcs"
          + (f", {args.coloring}-colouring" if args.coloring is not None else "") + ")", file=sys.stdout)
    return 0
