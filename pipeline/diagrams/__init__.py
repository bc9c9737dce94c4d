"""Stage 1 — diagrams: the one core type and every way to make one.

Takes in: a notation string ``KIND:ARGS`` (or family parameters).
Hands on: a validated :class:`Diagram` (PD code, components, signs, arcs, faces), or
the typed :class:`~.notation.Notation` of a string (:func:`parse_notation`) whose numbers
the fast routes and normal forms read.

Modules: :mod:`.diagram` (the type), :mod:`.plane` (faces, pieces, planarity of a
PD code), :mod:`.builder` (planar construction and tangle
calculus), :mod:`.notation` (parsing every notation), :mod:`.dt` (DT codes),
:mod:`.canonical` (the canonical text behind ``diagram_id``), :mod:`.bigons` (bigon
faces and twist regions of a PD code), :mod:`.families` (one
generator per family).  Imports nothing from the stages above.
"""

from .diagram import Diagram
from .notation import Notation, parse, parse_notation

__all__ = ["Diagram", "Notation", "parse", "parse_notation"]
