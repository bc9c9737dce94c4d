"""Stage 6 — present: what a person reads and looks at.

Takes in: one diagram (``show``, ``draw``) or a census directory (``report``).
Hands on: a readable page or JSON, SVG/PNG drawings, report.md / report.html and plots.

Modules: :mod:`.show`, :mod:`.draw` (layout and rendering), :mod:`.report`, :mod:`.plots`.
"""

__all__ = ["draw", "plots", "report", "show"]
