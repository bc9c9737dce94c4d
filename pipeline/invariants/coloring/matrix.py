"""The colouring matrix of a diagram (README.md, contract).

One row per crossing (PD order), one column per arc (maximal over-strand, in
``diagram.arcs`` order) and then one zero column per free loop.  The row of a crossing
is 2·over − under_in − under_out, so at a kink it collapses to (1, −1), (2, −2) or 0
(R. H. Fox, "A quick trip" (1962), in *Topology of 3-Manifolds and Related
Topics*, Prentice-Hall).  Both the Smith form (:mod:`.spectrum`) and the mod-p
colourings (:mod:`.mod_p`) start from these sparse rows.
"""

from __future__ import annotations

from ...diagrams.diagram import Diagram

__all__ = ["coloring_matrix"]


def _sparse_matrix(diagram: Diagram) -> tuple[list[dict[int, int]], int]:
    """Rows of the colouring matrix as {column: entry} dicts, and the column count."""
    rows, col_rows = _rows_and_columns(diagram)
    return rows, len(col_rows)


def coloring_matrix(diagram: Diagram) -> list[list[int]]:
    """The colouring matrix M of ``diagram`` as a dense list of rows.

    Parameters
    ----------
    diagram : Diagram

    Returns
    -------
    list of list of int
        Row i is crossing i (PD order): 2 in the over-arc's column, −1 in the columns of
        the incoming and outgoing under-arcs (entries add up at kinks).  Columns are the
        arcs in ``diagram.arcs`` order, then one zero column per free loop.

    Examples
    --------
    >>> from pipeline.diagrams.notation import parse
    >>> coloring_matrix(parse("braid:1,1"))   # Hopf link
    [[2, -2], [-2, 2]]
    """
    rows, ncols = _sparse_matrix(diagram)
    out = []
    for r in rows:
        dense = [0] * ncols
        for c, v in r.items():
            dense[c] = v
        out.append(dense)
    return out


def _rows_and_columns(diagram: Diagram) -> tuple[list[dict[int, int]], list[set[int]]]:
    """:func:`_sparse_matrix` rows (no zero entries, empty rows kept) and, per column,
    the set of rows with an entry there; built in one pass over the PD code."""
    arc = diagram.arc_of_label
    col_rows: list[set[int]] = [set() for _ in range(len(diagram.arcs) + diagram.free_loops)]
    rows = []
    for i, ((a, b, c, d), sign) in enumerate(zip(diagram.pd, diagram.signs)):
        over = arc[d if sign > 0 else b]
        ua, uc = arc[a], arc[c]
        if over != ua and over != uc and ua != uc:
            rows.append({over: 2, ua: -1, uc: -1})
            col_rows[over].add(i)
            col_rows[ua].add(i)
            col_rows[uc].add(i)
            continue
        row: dict[int, int] = {}
        for col, v in ((over, 2), (ua, -1), (uc, -1)):  # a kink: entries add up
            row[col] = row.get(col, 0) + v
        row = {k: v for k, v in row.items() if v}
        for col in row:
            col_rows[col].add(i)
        rows.append(row)
    return rows, col_rows
