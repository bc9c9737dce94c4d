"""Arrow schemas of the census tables (see schemas/README.md for every column)."""

from .tables import (COLORINGS, DIAGRAMS, KNOTS, REJECTS, SCHEMA_VERSION, SCHEMAS, TABLES,
                     POLYNOMIAL_TERMS, TERM)

__all__ = ["COLORINGS", "DIAGRAMS", "KNOTS", "REJECTS", "SCHEMA_VERSION", "SCHEMAS", "TABLES",
           "POLYNOMIAL_TERMS", "TERM"]
