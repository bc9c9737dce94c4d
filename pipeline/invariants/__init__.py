"""Invariants: pure functions Diagram -> values, one module per invariant.

``coloring``   colouring matrix, invariant factors, determinant, colourings, witnesses
``alexander``  Alexander / Conway polynomials
``jones``      Jones polynomial (Kauffman bracket)
``signature``  signature (Goeritz matrix + Gordon–Litherland correction)
``checks``     per-row certification: relations between the invariants

:func:`compute_all` (in :mod:`pipeline.invariants.all`) assembles one census row.
"""
