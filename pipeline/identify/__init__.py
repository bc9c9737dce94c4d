"""Stage 3 — identify: which knot or link type a diagram is, with a proof where one exists.

Takes in: a Diagram and its census row (invariants, notation, family parameters).
Hands on: knot keys (normal forms of the families, fingerprints otherwise), mirror keys,
proof status, and the rows of the knots table.

Modules: :mod:`.normal_forms` (torus, Schubert, Bonahon–Siebenmann keys),
:mod:`.fingerprint` (invariant fingerprints), :mod:`.classify` (key of a row),
:mod:`.knots_table` (the knots table: grouping, conflicts, crossing numbers, notes).  Imports diagrams and invariants only; never touches files.
"""

__all__ = ["classify", "fingerprint", "knots_table", "normal_forms"]
