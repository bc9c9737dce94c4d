"""The report's table of knot types per crossing number, with how each key was proven.

One row per crossing number: the certified crossing number of the knots row when
there is one, otherwise the fewest crossings seen in a diagram of the key (shown as
``<= n``, an upper bound only).  The proof columns follow the key precedence of
:mod:`pipeline.identify.classify`, read off the key's form:

=================  ==============================================================
flype (alt)        ``alt:`` flype normal form (Menasco–Thistlethwaite 1993)
two-bridge         ``2b:`` and ``torus:±2,n`` (Schubert 1956)
torus              other ``torus:`` keys
Montesinos         ``mont:`` (Bonahon–Siebenmann)
sum / split        ``sum:``, ``chain:``, ``split:``, ``unlink``, ``unknot``
fingerprint only   fingerprints (no classification theorem)
=================  ==============================================================
"""

from __future__ import annotations

from collections import Counter, defaultdict
from typing import Any

__all__ = ["PROOF_COLUMNS", "proof_kind", "types_by_crossings", "knot_types_blocks"]

PROOF_COLUMNS = ("flype (alt)", "two-bridge", "torus", "Montesinos", "sum / split", "fingerprint only")


def proof_kind(key: str, proof: Any) -> str:
    """The proof column of a knot key (see the module table).

    Examples
    --------
    >>> proof_kind("torus:-2,5", "normal form"), proof_kind("alt:ab12", "normal form")
    ('two-bridge', 'flype (alt)')
    """
    if proof != "normal form":
        return "fingerprint only"
    head = key.split(":", 1)[0]
    if head == "alt":
        return "flype (alt)"
    if head == "2b" or key.startswith(("torus:2,", "torus:-2,")):
        return "two-bridge"
    if head == "torus":
        return "torus"
    if head == "mont":
        return "Montesinos"
    return "sum / split"


def types_by_crossings(keys: list, proofs: list, cns: list, seen: list, amph: list) -> tuple[list, list]:
    """(header, rows) of the per-crossing table from parallel knots-table columns."""
    table: dict = defaultdict(Counter)
    for k, p, cn, s, a in zip(keys, proofs, cns, seen, amph):
        if cn is not None:
            label = (0, int(cn), str(int(cn)))
        elif s is not None:
            label = (1, int(s), f"<= {int(s)}")
        else:
            label = (2, 0, "unknown")
        table[label][proof_kind(str(k), p)] += 1
        table[label]["amphichiral"] += a is True
    header = ["crossings", "knot types", *PROOF_COLUMNS, "amphichiral (proven)"]
    rows = []
    for label in sorted(table):
        cnt = table[label]
        rows.append([label[2], sum(cnt[c] for c in PROOF_COLUMNS), *[cnt[c] for c in PROOF_COLUMNS],
                     cnt["amphichiral"]])
    return header, rows


def knot_types_blocks(knots) -> list:
    """The report blocks (a paragraph and a table) for a knots-table frame."""
    from ..explore.claims import _plain

    def col(name: str) -> list:
        return [_plain(v) for v in knots[name].tolist()] if name in knots.columns else [None] * len(knots)

    header, rows = types_by_crossings(col("knot_key"), col("proof"), col("crossing_number"),
                                      col("min_crossings_seen"), col("amphichiral"))
    return [("p", "Knot types per crossing number (certified; `<= n`: fewest crossings seen) "
                  "and how each key was proven:"), ("table", header, rows)]
