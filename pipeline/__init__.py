"""knotledger: census tabulation and database builder for knots and links."""
from .diagram import Diagram
from .errors import KnotLedgerError, NotationError, DiagramError, SpecError, BudgetExceeded
from .notation import parse
from .census_api import open_census

__version__ = "0.1.0"
__all__ = ["Diagram", "parse", "open_census", "KnotLedgerError", "NotationError", "DiagramError", "SpecError", "BudgetExceeded", "__version__"]
