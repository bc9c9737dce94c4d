"""Stage 5 — explore: the morning after, over a finished census directory.

Takes in: a census directory (read through :mod:`pipeline.census.reader`).
Hands on: query results, claim verdicts with counterexamples, fitted formulas.

Modules: :mod:`.query` (read-only DuckDB SQL), :mod:`.claims` with :mod:`.safe_expr` and
:mod:`.safe_functions` (the claim language), :mod:`.fit` (formula fitting over a family)
with :mod:`.polyfit` (its exact polynomial-fitting core).
"""

__all__ = ["claims", "fit", "polyfit", "query", "safe_expr", "safe_functions"]
