"""Stage 2 — invariants: pure functions Diagram -> values, one module per invariant.

Takes in: a :class:`~pipeline.diagrams.Diagram` (and, for the fast routes, its notation).
Hands on: exact values — integers, :class:`~pipeline.invariants.poly.Laurent` polynomials —
and, through :func:`~pipeline.invariants.all.compute_all`, one census row.
Never touches files.

``coloring``   colouring matrix, invariant factors, determinant, colourings, witnesses
``alexander``  Alexander / Conway polynomials
``jones``      Jones polynomial (Kauffman bracket; frontier route and tangle route)
``signature``  signature (Goeritz matrix + Gordon–Litherland correction)
``bounds``     Arf invariant, linking numbers, genus and crossing-number bounds
``chirality``  chirality verdicts from Jones and signature
``checks``     per-row certification: relations between the invariants
``poly``       exact Laurent polynomials
"""

__all__ = ["alexander", "all", "bounds", "checks", "chirality", "coloring", "jones", "poly",
           "signature"]
