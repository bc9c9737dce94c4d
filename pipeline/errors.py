"""The project's exceptions: one base class and a few meaningful subclasses.

Every message is one line that names the offending token and the rule it breaks,
e.g. ``pd: label 7 appears 3 times (each label must appear exactly twice)``.
"""

from __future__ import annotations

__all__ = [
    "KnotLedgerError",
    "NotationError",
    "DiagramError",
    "SpecError",
    "BudgetExceeded",
    "QueryError",
    "ClaimError",
]


class KnotLedgerError(Exception):
    """Base class of every error knotledger raises on purpose."""


class NotationError(KnotLedgerError, ValueError):
    """A diagram string (``KIND:ARGS``) could not be parsed."""


class DiagramError(NotationError):
    """A PD code is malformed, inconsistently oriented, or not planar."""


class SpecError(KnotLedgerError, ValueError):
    """A census spec file has an unknown, missing or ill-typed key."""


class BudgetExceeded(KnotLedgerError):
    """A per-diagram computation budget was exceeded; the row is skipped, not failed."""

    def __init__(self, what: str, budget: int) -> None:
        super().__init__(f"skipped: {what} budget {budget}")
        self.what = what
        self.budget = budget


class QueryError(KnotLedgerError, ValueError):
    """An SQL query was refused (not read-only) or failed."""


class ClaimError(KnotLedgerError, ValueError):
    """A claim or filter expression uses a construct outside the safe language."""
