"""Stage 2 — invariants: pure functions Diagram -> values, one module per invariant.

Takes in: a :class:`~pipeline.diagrams.Diagram` (and, for the fast routes, its notation).
Hands on: exact values — integers, :class:`~pipeline.invariants.poly.Laurent` polynomials —
and, through :func:`~pipeline.invariants.all.compute_row`, one typed census row
(:class:`~pipeline.invariants.row.CensusRow`; ``compute_all`` is its ``to_record()`` dict).
Never touches files.

``coloring``   colouring matrix, invariant factors, determinant, colourings, witnesses
``alexander``  Alexander / Conway polynomials
``jones``      Jones polynomial (Kauffman bracket; frontier route and tangle route)
``signature``  signature (Goeritz matrix + Gordon–Litherland correction)
``linking``    linking numbers and their changes under reversing sublinks
``bounds``     Arf invariant, genus and crossing-number bounds (re-exports linking numbers)
``chirality``  chirality verdicts from Jones and signature
``checks``     per-row certification: relations between the invariants
``poly``       exact Laurent polynomials
``row``        the typed census row and the adapter from stored rows
"""

__all__ = ["alexander", "all", "bounds", "checks", "chirality", "coloring", "jones", "linking",
           "poly", "row", "signature"]
