"""knotledger: census tabulation and database builder for knots and links."""
from .diagrams.diagram import Diagram
from .errors import KnotLedgerError, NotationError, DiagramError, SpecError, BudgetExceeded
from .diagrams.notation import parse
from .census.reader import open_census

__version__ = "0.1.0"
__all__ = ["Diagram", "parse", "open_census", "KnotLedgerError", "NotationError", "DiagramError", "SpecError", "BudgetExceeded", "__version__"]


def _diagram_repr_svg(self: Diagram) -> str | None:
    """Notebook display hook: the drawing with arc and crossing labels, as in ``show``
    (:func:`pipeline.present.draw.svg.diagram_svg`; no matplotlib).  ``None`` (plain repr)
    for a diagram too large to draw.  Wired here because diagrams/ may not import present/."""
    from .present.draw.svg import diagram_svg
    try:
        return diagram_svg(self)
    except KnotLedgerError:
        return None


Diagram._repr_svg_ = _diagram_repr_svg
