"""Family generators: one module per family, each turning parameters into a Diagram.

Every module exposes ``diagram(...) -> Diagram`` built through :mod:`pipeline.diagrams.builder`,
so handedness is the geometric one of the construction, pinned by README.md:
``torus:2,3`` = ``conway:3`` = ``rational:3/1`` is the positive trefoil and
``pretzel:-2,3,3`` is ``torus:3,4``.
"""

from . import alternating, braid, montesinos, pretzel, torus, two_bridge

__all__ = ["alternating", "braid", "montesinos", "pretzel", "torus", "two_bridge"]
