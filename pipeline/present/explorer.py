"""``DIR/explorer.html``: one self-contained page to look at a census in a browser.

Written by ``knotledger report DIR`` beside report.md (:func:`write_explorer`).  The page
needs no network: the data is embedded as JSON (gzip + base64 when it is larger than
``compress_over`` bytes, unpacked in the browser by the standard ``DecompressionStream``)
and the script is the hand-written one in :mod:`pipeline.present.explorer_page`.

What it shows:

- the knots table, one row per knot type (the ``knots`` table joined with the stored
  invariants of its smallest diagram): sortable by every column, filtered by a text
  search over keys and notations, numeric ranges on crossings, determinant and
  signature and a chirality and a proof selector; paged, so 100,000 rows stay quick
  (filtering and sorting touch plain arrays, only one page is put in the document);
- a card per knot type, built when its row is clicked: the drawing of its smallest
  diagram with arc labels as in ``knotledger show``, determinant, invariant factors,
  colouring counts, the Alexander, Conway and Jones polynomials as formulas, chirality
  with its reason, the proof of its key, and every diagram (row) of that type with its
  family and parameters;
- bar charts of the table (crossings, determinant, signature, chirality, proof) whose
  bars filter the table, and the report's PNG plots.

Drawings are precomputed for the ``draw_per_family`` knot types of fewest crossings in
each family (default :data:`DRAW_PER_FAMILY`; a type counts for every family it occurs
in), with :func:`pipeline.present.draw.svg.diagram_svg`; other cards name the
``knotledger draw`` command that draws them.  A drawing costs 10-40 ms (the Tutte
layout, growing with the crossings; reports/bench_explorer.md), so the drawings take at
most about a second per family and the rest of the page is linear in the rows: a census
of 10,000 knot types is written in seconds.
"""

from __future__ import annotations

import base64
import gzip
import html
import json
from collections import defaultdict
from fractions import Fraction
from pathlib import Path
from typing import Any, Iterable

from ..census.reader import Census, exact_int
from .explorer_page import PAGE
from .files import write_text_atomic

__all__ = ["DRAW_PER_FAMILY", "COMPRESS_OVER", "COLUMNS", "explorer_data", "explorer_html", "write_explorer"]

#: knot types drawn per family (those of fewest crossings), see the module docstring.
DRAW_PER_FAMILY = 30
#: embedded JSON larger than this many bytes is stored gzip-compressed.
COMPRESS_OVER = 1_000_000
#: rows listed on one card (the card says how many more there are).
MAX_CARD_ROWS = 60
#: fields of one knot record in the embedded data, in order (the script reads them by position).
COLUMNS = ("key", "mirror", "rep", "cr", "cr_source", "comp", "det", "sig", "chir", "chir_reason",
           "proof", "ndiag", "fams", "factors", "cols", "alex", "conway", "jones", "shared", "note",
           "rows", "svg", "search")


def _plain(v: Any) -> Any:
    from ..explore.claims import _plain as plain
    return plain(v)


def _poly(text: Any) -> list[list[str]] | None:
    """Stored polynomial JSON ``[[e, c], ...]`` as exact strings ``[["1/2", "-1"], ...]``
    (JavaScript numbers would round coefficients beyond 2^53)."""
    text = _plain(text)
    if text is None:
        return None
    pairs = json.loads(text, parse_float=str, parse_int=str)
    return [[str(Fraction(e)), str(int(c))] for e, c in pairs]


def _chirality(amph: Any) -> str:
    amph = _plain(amph)
    return "unknown" if amph is None else ("amphichiral" if amph else "chiral")


def _records(df, columns: Iterable[str]) -> list[dict]:
    cols = [c for c in columns if c in df.columns]
    values = [[_plain(v) for v in df[c].tolist()] for c in cols]
    return [dict(zip(cols, vals)) for vals in zip(*values)] if len(df) else []


def explorer_data(census: Census, *, draw_per_family: int = DRAW_PER_FAMILY) -> dict:
    """The data the page embeds: knot records (:data:`COLUMNS`), SVG drawings, the census name."""
    d, k = census.diagrams, census.knots
    rows = _records(d, ("row_id", "family", "params", "notation", "crossings", "components", "determinant",
                        "determinant_text", "invariant_factors", "signature", "alexander", "conway", "jones",
                        "chirality", "chirality_reason", "knot_key", "status"))
    by_key: dict[str, list[dict]] = defaultdict(list)
    for r in rows:
        if r.get("knot_key") is not None:
            by_key[r["knot_key"]].append(r)
    cols_of: dict[int, list] = defaultdict(list)
    for r in _records(census.colorings, ("row_id", "modulus", "count", "count_text", "min_colors")):
        cols_of[r["row_id"]].append([r["modulus"], r.get("count_text") or str(r["count"]), r.get("min_colors")])
    knots = []
    for kr in _records(k, ("knot_key", "representative", "n_diagrams", "proof", "mirror_key", "amphichiral",
                           "amphichiral_reason", "min_crossings_seen", "crossing_number",
                           "crossing_number_source", "fingerprint_shared_with", "distinctness_note")):
        members = sorted(by_key.get(kr["knot_key"], []), key=lambda r: (r.get("crossings") or 0, r["row_id"]))
        rep = next((r for r in members if r["notation"] == kr.get("representative")), members[0] if members else {})
        det = exact_int(rep.get("determinant"), rep.get("determinant_text"))
        cn = kr.get("crossing_number")
        fams = sorted({r["family"] for r in members})
        knots.append([
            kr["knot_key"], kr.get("mirror_key"), rep.get("notation") or kr.get("representative"),
            cn if cn is not None else kr.get("min_crossings_seen"),
            kr.get("crossing_number_source") if cn is not None else "smallest diagram seen (an upper bound)",
            rep.get("components"), None if det is None else str(det), rep.get("signature"),
            _chirality(kr.get("amphichiral")), kr.get("amphichiral_reason"), kr.get("proof"),
            kr.get("n_diagrams"), ", ".join(fams), list(rep.get("invariant_factors") or ()),
            sorted(cols_of.get(rep.get("row_id"), [])),
            _poly(rep.get("alexander")), _poly(rep.get("conway")), _poly(rep.get("jones")),
            list(kr.get("fingerprint_shared_with") or ()), kr.get("distinctness_note"),
            [[r["row_id"], r["family"], r["params"], r["notation"], r.get("crossings"), r.get("chirality"),
              r.get("status")] for r in members[:MAX_CARD_ROWS]],
            -1,
            " ".join([kr["knot_key"], kr.get("mirror_key") or ""] + [r["notation"] for r in members]).lower(),
        ])
    svgs = _drawings(knots, draw_per_family)
    name = census.manifest.get("spec_name") or (census.manifest.get("census") or {}).get("name") or census.path.name
    return {"name": name, "columns": list(COLUMNS), "knots": knots, "svgs": svgs,
            "draw_per_family": draw_per_family, "n_rows": len(d)}


def _drawings(knots: list[list], per_family: int) -> list[str]:
    """Draw the smallest ``per_family`` knot types of each family; set each record's svg index."""
    from ..diagrams.notation import parse
    from .draw.svg import diagram_svg
    i_key, i_cr, i_fams, i_rep, i_svg = (COLUMNS.index(c) for c in ("key", "cr", "fams", "rep", "svg"))
    chosen: set[int] = set()
    fam_members: dict[str, list[int]] = defaultdict(list)
    for n, rec in enumerate(knots):
        for f in rec[i_fams].split(", "):
            fam_members[f].append(n)
    for members in fam_members.values():
        members.sort(key=lambda n: (knots[n][i_cr] if knots[n][i_cr] is not None else 10 ** 9, knots[n][i_key]))
        chosen.update(members[:per_family])
    svgs: list[str] = []
    for n in sorted(chosen):
        try:
            svg = diagram_svg(parse(knots[n][i_rep]), max_width=360)
        except Exception:  # a drawing must never break the page; the card says it is missing
            continue
        knots[n][i_svg] = len(svgs)
        svgs.append(svg)
    return svgs


def explorer_html(data: dict, *, plots: Iterable[tuple[str, Path]] = (), compress_over: int = COMPRESS_OVER) -> str:
    """The page for :func:`explorer_data`'s ``data``; ``plots`` are (caption, PNG path) pairs."""
    data = dict(data, plots=[[cap, base64.b64encode(Path(p).read_bytes()).decode("ascii")] for cap, p in plots])
    text = json.dumps(data, ensure_ascii=False, separators=(",", ":"))
    if len(text.encode("utf-8")) > compress_over:
        payload = base64.b64encode(gzip.compress(text.encode("utf-8"), compresslevel=6, mtime=0)).decode("ascii")
        block = f'<script id="kl-data" type="application/gzip-base64">{payload}</script>'
    else:
        safe = text.replace("</", "<\\/")  # no "</script>" inside the block
        block = f'<script id="kl-data" type="application/json">{safe}</script>'
    return PAGE.replace("@@TITLE@@", html.escape(f"knotledger explorer: {data['name']}")).replace("@@DATA@@", block)


def write_explorer(census: Census, path: Path, *, plots: Iterable[tuple[str, Path]] = (),
                   draw_per_family: int = DRAW_PER_FAMILY, compress_over: int = COMPRESS_OVER) -> Path:
    """Write the explorer page of ``census`` to ``path`` (atomically) and return ``path``."""
    page = explorer_html(explorer_data(census, draw_per_family=draw_per_family), plots=plots,
                         compress_over=compress_over)
    return write_text_atomic(path, page)
