"""The Arrow schema of every census table: the one source of truth the writer uses.

:mod:`pipeline.census.store` builds every Parquet part with ``pa.Table.from_pylist(rows,
schema=SCHEMAS[table])`` so a column that is not declared here cannot be written, and a
value of the wrong type is an error at write time, not a surprise at query time.
schemas/README.md documents every column, its type and its exactness choice.

Exactness (README.md): an integer that can outgrow int64 (determinants, invariant
factors, colouring counts) is stored twice — an int64 column that SQL can filter on
(null when the value does not fit) beside a decimal text column that is always exact.
Polynomials are stored as the contract JSON text (``[[exponent, coefficient], ...]``)
beside a list of ``{e2: doubled exponent, c: coefficient as decimal text}`` structs;
HOMFLY-PT likewise (``[[v, z, coefficient], ...]`` beside ``{v, z, c}`` structs).
"""

from __future__ import annotations

import pyarrow as pa

__all__ = [
    "SCHEMA_VERSION", "TERM", "POLYNOMIAL_TERMS", "HOMFLY_TERM", "HOMFLY_TERMS", "DIAGRAMS", "COLORINGS", "KNOTS",
    "REJECTS", "SCHEMAS", "TABLES", "INT64_MIN", "INT64_MAX",
]

#: Bumped whenever a column is added, removed or changes type.
SCHEMA_VERSION = "3"   # 2: simplified_*, prime*, flype_code (issue 11); homfly, khovanov, ..., tristram_levine (issue 12); 3: khovanov_torsion

INT64_MIN, INT64_MAX = -(2 ** 63), 2 ** 63 - 1

#: One term of a Laurent polynomial in t^(1/2): doubled exponent and exact coefficient.
TERM = pa.struct([pa.field("e2", pa.int32(), nullable=False),
                  pa.field("c", pa.string(), nullable=False)])
POLYNOMIAL_TERMS = pa.list_(TERM)
# ---- strength (issue 12)
#: One term of the HOMFLY-PT polynomial: v- and z-exponents and the exact coefficient.
HOMFLY_TERM = pa.struct([pa.field("v", pa.int32(), nullable=False),
                         pa.field("z", pa.int32(), nullable=False),
                         pa.field("c", pa.string(), nullable=False)])
HOMFLY_TERMS = pa.list_(HOMFLY_TERM)
# ---- end strength


def _f(name: str, typ: pa.DataType, nullable: bool = True) -> pa.Field:
    return pa.field(name, typ, nullable=nullable)


DIAGRAMS = pa.schema([
    _f("row_id", pa.int64(), False),
    _f("diagram_id", pa.string()),
    _f("family", pa.string(), False),
    _f("family_index", pa.int32(), False),
    _f("params", pa.string(), False),
    _f("labels", pa.string()),
    _f("source", pa.string()),
    _f("notation", pa.string(), False),
    _f("mirror_by_convention", pa.bool_()),
    _f("crossings", pa.int32()),
    _f("components", pa.int32()),
    _f("free_loops", pa.int32()),
    _f("writhe", pa.int32()),
    _f("alternating", pa.bool_()),
    _f("determinant", pa.int64()),
    _f("determinant_text", pa.string()),
    _f("invariant_factors", pa.list_(pa.string())),
    _f("invariant_factors_int", pa.list_(pa.int64())),
    _f("signature", pa.int32()),
    _f("nullity", pa.int32()),
    _f("alexander", pa.string()),
    _f("alexander_terms", POLYNOMIAL_TERMS),
    _f("conway", pa.string()),
    _f("conway_terms", POLYNOMIAL_TERMS),
    _f("jones", pa.string()),
    _f("jones_terms", POLYNOMIAL_TERMS),
    # ---- strength (issue 12)
    _f("homfly", pa.string()),
    _f("homfly_terms", HOMFLY_TERMS),
    _f("khovanov", pa.string()),
    _f("khovanov_f2", pa.string()),
    _f("khovanov_reduced", pa.string()),
    _f("rasmussen_s", pa.int32()),
    _f("kh_width", pa.int32()),
    _f("tristram_levine", pa.string()),
    _f("khovanov_torsion", pa.string()),
    # ---- end strength
    _f("chirality", pa.string()),
    _f("chirality_reason", pa.string()),
    _f("knot_key", pa.string()),
    _f("mirror_key", pa.string()),
    _f("knot_proof", pa.string()),
    # --- begin: simplification / primality / flype columns (issue 11) ---
    _f("simplified_crossings", pa.int32()),
    _f("simplified_notation", pa.string()),
    _f("prime", pa.bool_()),
    _f("prime_reason", pa.string()),
    _f("flype_code", pa.string()),
    # --- end: simplification / primality / flype columns ---
    _f("status", pa.string(), False),
    _f("checks", pa.string()),
    _f("checks_failed", pa.list_(pa.string())),
    _f("extras", pa.string()),
])

COLORINGS = pa.schema([
    _f("row_id", pa.int64(), False),
    _f("modulus", pa.int32(), False),
    _f("count", pa.int64()),
    _f("count_text", pa.string(), False),
    _f("nontrivial", pa.bool_(), False),
    _f("min_colors", pa.int32()),
])

KNOTS = pa.schema([
    _f("knot_key", pa.string(), False),
    _f("representative", pa.string()),
    _f("n_diagrams", pa.int64(), False),
    _f("n_distinct_diagrams", pa.int64()),
    _f("proof", pa.string()),
    _f("mirror_key", pa.string()),
    _f("amphichiral", pa.bool_()),
    _f("amphichiral_reason", pa.string()),
    _f("min_crossings_seen", pa.int32()),
    _f("crossing_number", pa.int32()),
    _f("crossing_number_source", pa.string()),
    _f("fingerprint_shared_with", pa.list_(pa.string())),
    _f("distinctness_note", pa.string()),
    # --- begin: flype code of the type (issue 11) ---
    _f("flype_code", pa.string()),
    # --- end: flype code of the type ---
    _f("extras", pa.string()),
])

REJECTS = pa.schema([
    _f("row_id", pa.int64(), False),
    _f("family", pa.string(), False),
    _f("family_index", pa.int32(), False),
    _f("source", pa.string(), False),
    _f("text", pa.string()),
    _f("reason", pa.string(), False),
])

#: table name -> schema, in the order the tables are documented.
SCHEMAS: dict[str, pa.Schema] = {
    "diagrams": DIAGRAMS,
    "colorings": COLORINGS,
    "knots": KNOTS,
    "rejects": REJECTS,
}
TABLES = tuple(SCHEMAS)
