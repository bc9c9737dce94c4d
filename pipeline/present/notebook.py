"""Rich notebook views of a census: one diagram row as HTML.

>>> from pipeline import open_census                                   # doctest: +SKIP
>>> from pipeline.present.notebook import row_view
>>> row_view(open_census("harbour"), 12)                                # doctest: +SKIP

In Jupyter the returned :class:`RowView` displays itself (``_repr_html_``): the drawing
of the row's diagram with arc labels as in ``knotledger show``, its invariants with the
polynomials as formulas, its Fox colouring counts, chirality with the reason, and the
knot type with the proof of its key.  A ``Diagram`` draws itself too
(``Diagram._repr_svg_``, wired in :mod:`pipeline`).
"""

from __future__ import annotations

import html
import json
from dataclasses import dataclass
from fractions import Fraction
from typing import Any

from ..census.reader import Census, exact_int
from ..invariants.poly import Laurent

__all__ = ["RowView", "row_view", "poly_html"]

_STYLE = ("<style>.kl-row table{border-collapse:collapse}.kl-row td,.kl-row th{border:1px solid #ccc;"
          "padding:1px 6px;text-align:left}.kl-row .muted{color:#777}</style>")


def poly_html(poly: Laurent | None, var: str) -> str:
    """A Laurent polynomial as an HTML formula (exponents as superscripts, ``1/2`` kept
    exact); the same terms and signs as :meth:`Laurent.to_text`."""
    if poly is None:
        return '<span class="muted">not computed</span>'
    if not poly:
        return "0"
    out = []
    for n, (k, c) in enumerate(poly.terms):
        e = Fraction(k, 2)
        mono = "" if e == 0 else f"<i>{var}</i>" + ("" if e == 1 else f"<sup>{e}</sup>")
        body = str(abs(c)) if not mono else (mono if abs(c) == 1 else f"{abs(c)}{mono}")
        out.append(("\u2212" if c < 0 else "") + body if n == 0 else (" \u2212 " if c < 0 else " + ") + body)
    return "".join(out)


def _poly(text: Any) -> Laurent | None:
    return None if text is None else Laurent.from_json(json.loads(text))


@dataclass(frozen=True, repr=False)
class RowView:
    """One census row (:meth:`Census.row`), shown as HTML in a notebook."""

    row: dict

    def __repr__(self) -> str:
        return f"RowView(row {self.row.get('row_id')}: {self.row.get('notation')})"

    def _repr_html_(self) -> str:
        r, esc = self.row, html.escape
        try:
            from ..diagrams.notation import parse
            from .draw.svg import diagram_svg
            picture = diagram_svg(parse(r["notation"]))
        except Exception as err:  # a picture must never hide the numbers
            picture = f'<p class="muted">no drawing ({esc(type(err).__name__)}: {esc(str(err))})</p>'
        det = exact_int(r.get("determinant"), r.get("determinant_text"))
        factors = r.get("invariant_factors")
        knot = r.get("knot") or {}
        fields = [
            ("family", f"{r.get('family')} {r.get('params')}"),
            ("crossings / components / writhe", f"{r.get('crossings')} / {r.get('components')} / {r.get('writhe')}"),
            ("determinant", "not computed" if det is None else str(det)),
            ("invariant factors", ", ".join(map(str, factors)) if factors is not None and len(factors) else "none"),
            ("signature", r.get("signature")),
            ("Alexander Δ(t)", poly_html(_poly(r.get("alexander")), "t")),
            ("Conway ∇(z)", poly_html(_poly(r.get("conway")), "z")),
            ("Jones V(t)", poly_html(_poly(r.get("jones")), "t")),
            ("chirality", f"{r.get('chirality')} — {r.get('chirality_reason') or ''}"),
            ("knot key", f"{r.get('knot_key')} (mirror {r.get('mirror_key')})"),
            ("proof of the key", knot.get("proof") or r.get("knot_proof")),
            ("status", r.get("status")),
        ]
        safe = {"Alexander Δ(t)", "Conway ∇(z)", "Jones V(t)"}
        rows = "".join(f"<tr><th>{esc(k)}</th><td>{v if k in safe else esc(str(v))}</td></tr>" for k, v in fields)
        cols = "".join(f"<tr><td>{c['modulus']}</td><td>{esc(str(c.get('count_text') or c.get('count')))}</td>"
                       f"<td>{'' if c.get('min_colors') is None else c['min_colors']}</td></tr>"
                       for c in sorted(r.get("colorings") or [], key=lambda c: c["modulus"]))
        return (f'{_STYLE}<div class="kl-row"><h4>row {r.get("row_id")}: <code>{esc(str(r.get("notation")))}</code></h4>'
                f'<div style="display:flex;gap:1em;align-items:flex-start"><div>{picture}</div>'
                f"<div><table>{rows}</table><p>Fox colourings</p><table><tr><th>n</th><th>col<sub>n</sub></th>"
                f"<th>fewest colours</th></tr>{cols}</table></div></div></div>")


def row_view(census: Census, row_id: int) -> RowView:
    """The rich view of diagram row ``row_id`` of ``census`` (see the module docstring)."""
    return RowView(census.row(row_id))
