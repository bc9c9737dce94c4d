"""Stage 1 — diagrams: the one core type and every way to make one.

Takes in: a notation string ``KIND:ARGS`` (or family parameters).
Hands on: a validated :class:`Diagram` (PD code, components, signs, arcs, faces).

Modules: :mod:`.diagram` (the type), :mod:`.builder` (planar construction and tangle
calculus), :mod:`.notation` (parsing every notation), :mod:`.dt` (DT codes),
:mod:`.canonical` (the canonical text behind ``diagram_id``), :mod:`.families` (one
generator per family).  Imports nothing from the stages above.
"""

from .diagram import Diagram
from .notation import parse

__all__ = ["Diagram", "parse"]
