"""knotledger: census tabulation and database builder for knots and links."""
from .diagrams.diagram import Diagram
from .errors import KnotLedgerError, NotationError, DiagramError, SpecError, BudgetExceeded
from .diagrams.notation import parse
from .census.reader import open_census

__version__ = "0.1.0"
__all__ = ["Diagram", "parse", "open_census", "KnotLedgerError", "NotationError", "DiagramError", "SpecError", "BudgetExceeded", "__version__"]
