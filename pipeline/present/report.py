"""``knotledger report DIR``: a summary of a census as Markdown, HTML and PNG plots.

Writes ``DIR/report.md`` (plots linked from ``DIR/plots/``), ``DIR/report.html``
(self-contained: the same plots embedded as base64 PNG), ``DIR/plots/*.png`` and
``DIR/explorer.html`` (the interactive page of :mod:`pipeline.present.explorer`).
Sections: overview; determinant distribution per family; which primes colour which
fraction of each family; fewest-colours statistics per prime; knot-collapse counts
(diagrams versus knot types, per family and across families); chirality verdicts;
certification failures (``checks_failed``); timings (from the manifest); rejects; and
pictures of a few diagrams when :mod:`pipeline.present.draw` is available
(:func:`diagram_pictures`, the hook for the drawing code).

The report is built as a small list of blocks (heading, paragraph, table, image) and
rendered twice, so the Markdown and HTML always say the same thing.
"""

from __future__ import annotations

import argparse
import base64
import html
import json
import sys
from collections import Counter, defaultdict
from pathlib import Path
from typing import Any

from . import plots as rp
from .explorer import write_explorer
from .report_types import knot_types_blocks
from .files import write_text_atomic
from .report_strength import strength_section
from ..census.reader import Census, exact_int, open_census
from ..errors import QueryError
from ..numbers import primes_upto

__all__ = ["build_report", "diagram_pictures", "render_markdown", "render_html", "add_arguments", "main"]

MAX_LISTED = 20


def _plain(v: Any) -> Any:
    from ..explore.claims import _plain as plain
    return plain(v)


def _dets(df) -> list:
    if "determinant" not in df.columns:
        return [None] * len(df)
    texts = df["determinant_text"].tolist() if "determinant_text" in df.columns else [None] * len(df)
    return [exact_int(_plain(v), _plain(t)) for v, t in zip(df["determinant"].tolist(), texts)]


# ------------------------------------------------------------------ sections
def _overview(c: Census, blocks: list) -> None:
    d, m = c.diagrams, c.manifest
    name = m.get("spec_name") or (m.get("census") or {}).get("name") or c.path.name
    blocks.append(("h", 1, f"Census report: {name}"))
    blocks.append(("p", f"Directory `{c.path.name}`; {len(d)} diagrams, {len(c.colorings)} colouring rows, "
                        f"{len(c.knots)} knot types, {len(c.rejects)} rejects."))
    if len(d):
        fam = Counter(_plain(v) for v in d["family"])
        status = Counter(_plain(v) for v in d["status"]) if "status" in d.columns else Counter()
        rows = [[f, n, sum(1 for ff, s in zip(d["family"], d["status"]) if ff == f and s == "ok")
                 if "status" in d.columns else ""] for f, n in sorted(fam.items())]
        blocks.append(("table", ["family", "diagrams", "status ok"], rows))
        other = {s: n for s, n in status.items() if s != "ok"}
        if other:
            blocks.append(("p", "Rows not ok: " + "; ".join(f"{s}: {n}" for s, n in sorted(other.items(), key=str))))


def _determinants(c: Census, blocks: list, plots: Path) -> None:
    d = c.diagrams
    blocks.append(("h", 2, "Determinants"))
    by_family: dict = defaultdict(list)
    for f, det in zip(d["family"].tolist() if len(d) else [], _dets(d)):
        if det is not None:
            by_family[_plain(f)].append(det)
    rows = []
    for f, vs in sorted(by_family.items()):
        s = sorted(vs)
        rows.append([f, len(s), s[0], s[len(s) // 2], s[-1], s.count(0), s.count(1)])
    blocks.append(("table", ["family", "rows", "min", "median", "max", "det = 0", "det = 1"], rows))
    name = "determinant_distribution.png"
    rp.histogram_by_family(by_family, plots / name, rp.PLOTS[name], xlabel="determinant")
    blocks.append(("img", rp.PLOTS[name], name))


def _colourability(c: Census, blocks: list, plots: Path) -> None:
    d, col = c.diagrams, c.colorings
    blocks.append(("h", 2, "Colourability by prime"))
    blocks.append(("p", "A diagram is nontrivially n-colourable when col_n > n (Fox); for a prime p this "
                        "holds iff p divides the determinant. Fractions are of the rows of each family."))
    fam_of = {int(r): _plain(f) for r, f in zip(d["row_id"], d["family"])} if len(d) else {}
    is_knot = ({int(r): _plain(k) == 1 for r, k in zip(d["row_id"], d["components"])}
               if len(d) and "components" in d.columns else {})
    link_fewest: dict = defaultdict(Counter)
    size = Counter(fam_of.values())
    max_mod = int(col["modulus"].max()) if len(col) else 0
    primes = primes_upto(max_mod)
    hits: dict = defaultdict(Counter)
    fewest: dict = defaultdict(Counter)
    if len(col):
        counts = col["count_text"].tolist() if "count_text" in col.columns else col["count"].tolist()
        mins = col["min_colors"].tolist() if "min_colors" in col.columns else [None] * len(col)
        for rid, n, cnt, mc in zip(col["row_id"].tolist(), col["modulus"].tolist(), counts, mins):
            n = int(n)
            if n not in primes:
                continue
            cnt = _plain(cnt)
            if cnt is not None and int(cnt) > n:
                hits[n][fam_of.get(int(rid))] += 1
            mc = _plain(mc)
            if mc is not None:
                (fewest if is_knot.get(int(rid)) else link_fewest)[n][int(mc)] += 1
    families = sorted(size)
    rows = [[p] + [f"{hits[p][f] / size[f]:.3f}" for f in families] for p in primes]
    blocks.append(("table", ["prime"] + families, rows))
    name = "prime_colorability.png"
    rp.grouped_bars([str(p) for p in primes], {f: [hits[p][f] / size[f] for p in primes] for f in families},
                    plots / name, rp.PLOTS[name], xlabel="prime p", ylabel="fraction p-colourable")
    blocks.append(("img", rp.PLOTS[name], name))

    blocks.append(("h", 2, "Fewest colours"))
    blocks.append(("p", "For each prime p, the distribution of the fewest distinct colours in a nontrivial "
                        "p-colouring of the stored knot diagram (where it was computed). Over all diagrams "
                        "of a knot the minimum is at least floor(log2 p) + 2 (Nakamura, Nakanishi, Satoh, "
                        "Yokohama Math. J. 59, 2013, from memory); one fixed diagram can need more. "
                        "Links are not covered by that bound and are counted apart below."))
    values = sorted({v for p, cnt in fewest.items() if p > 2 for v in cnt})
    rows = [[p, sum(fewest[p].values()), min(fewest[p]) if fewest[p] else "",
             p.bit_length() + 1] + [fewest[p][v] for v in values] for p in primes if fewest[p] and p > 2]
    blocks.append(("table", ["prime", "diagrams", "fewest seen", "lower bound"] + [f"{v} colours" for v in values], rows))
    below = [p for p in primes if p > 2 and fewest[p] and min(fewest[p]) < p.bit_length() + 1]
    if below:
        blocks.append(("p", "WARNING: knot diagrams below the published lower bound for p = "
                            + ", ".join(map(str, below)) + " (check the min_colors computation)."))
    if any(link_fewest.values()):
        blocks.append(("p", "Links: " + "; ".join(
            f"p = {p}: {sum(link_fewest[p].values())} diagrams, fewest {min(link_fewest[p])}"
            for p in primes if link_fewest[p]) + "."))
    name = "min_colors.png"
    shown = [p for p in primes if fewest[p] and p > 2]
    rp.grouped_bars([str(p) for p in shown], {f"{v} colours": [fewest[p][v] for p in shown] for v in values},
                    plots / name, rp.PLOTS[name], xlabel="prime p", ylabel="diagrams")
    blocks.append(("img", rp.PLOTS[name], name))


def _knot_types(c: Census, blocks: list, plots: Path) -> None:
    d = c.diagrams
    blocks.append(("h", 2, "Knot types"))
    keys = d["knot_key"].tolist() if "knot_key" in d.columns and len(d) else []
    fams = d["family"].tolist() if len(d) else []
    per: dict = defaultdict(set)
    across: dict = defaultdict(set)
    for f, k in zip(fams, keys):
        k = _plain(k)
        if k is not None:
            per[_plain(f)].add(k)
            across[k].add(_plain(f))
    fam_rows = Counter(_plain(f) for f in fams)
    rows = [[f, fam_rows[f], len(per[f])] for f in sorted(fam_rows)]
    total = len({_plain(k) for k in keys if _plain(k) is not None})
    rows.append(["all families", len(d), total])
    blocks.append(("table", ["family", "diagrams", "distinct knot keys"], rows))
    k = c.knots
    if len(k) and "proof" in k.columns:
        proofs = Counter(str(_plain(v)) for v in k["proof"].tolist())
        amph = Counter(str(_plain(v)) for v in k["amphichiral"].tolist()) if "amphichiral" in k.columns else Counter()
        blocks.append(("p", f"knots table: {len(k)} knot types; proof: "
                            + ", ".join(f"{p} {n}" for p, n in sorted(proofs.items()))
                            + ("; amphichiral: " + ", ".join(f"{a} {n}" for a, n in sorted(amph.items())) if amph else "")
                            + "."))
        blocks += knot_types_blocks(k)   # issue 11: per crossing number, how proven
    shared = sorted((k, sorted(fs)) for k, fs in across.items() if len(fs) > 1)
    blocks.append(("p", f"{len(shared)} knot keys occur in more than one family"
                        + (": " + "; ".join(f"{k} ({', '.join(fs)})" for k, fs in shared[:MAX_LISTED]) if shared else ".")))
    blocks.append(("p", "Note: keys proved by a normal form name a knot type; keys from fingerprints only "
                        "(invariants) can merge distinct knots. In particular mutants such as P(2,3,3,5) and "
                        "P(2,3,5,3) share Jones, Alexander and colouring invariants yet are different knots "
                        "(Bonahon-Siebenmann classification of Montesinos links), so fingerprints cannot separate them."))
    if not keys or total == 0:
        blocks.append(("p", "No knot keys are stored in this census."))
    name = "knot_collapse.png"
    groups = sorted(fam_rows)
    rp.grouped_bars(groups, {"diagrams": [fam_rows[f] for f in groups], "knot keys": [len(per[f]) for f in groups]},
                    plots / name, rp.PLOTS[name], xlabel="family", ylabel="count")
    blocks.append(("img", rp.PLOTS[name], name))


def _chirality(c: Census, blocks: list, plots: Path) -> None:
    d = c.diagrams
    blocks.append(("h", 2, "Chirality"))
    table: dict = defaultdict(Counter)
    if "chirality" in d.columns:
        for f, v in zip(d["family"].tolist(), d["chirality"].tolist()):
            table[_plain(f)][_plain(v) or "null"] += 1
    verdicts = sorted({v for cnt in table.values() for v in cnt})
    fams = sorted(table)
    blocks.append(("table", ["family"] + verdicts, [[f] + [table[f][v] for v in verdicts] for f in fams]))
    name = "chirality.png"
    rp.stacked_bars(fams, {v: [table[f][v] for f in fams] for v in verdicts}, plots / name, rp.PLOTS[name],
                    ylabel="diagrams")
    blocks.append(("img", rp.PLOTS[name], name))


def _certification(c: Census, blocks: list) -> None:
    d = c.diagrams
    blocks.append(("h", 2, "Certification failures"))
    failed: Counter = Counter()
    examples = []
    if "checks_failed" in d.columns:
        for rid, note, checks in zip(d["row_id"].tolist(), d["notation"].tolist(), d["checks_failed"].tolist()):
            checks = _plain(checks) or ()
            for ch in checks:
                failed[ch] += 1
            if checks and len(examples) < MAX_LISTED:
                examples.append([_plain(rid), _plain(note), ", ".join(checks)])
    if not failed:
        blocks.append(("p", "Every stored consistency check passed on every row."))
        return
    blocks.append(("table", ["check", "rows failing"], sorted(failed.items())))
    blocks.append(("table", ["row_id", "notation", "failed checks"], examples))


def _timings(c: Census, blocks: list, plots: Path) -> None:
    m = c.manifest
    blocks.append(("h", 2, "Timings"))
    runs = m.get("timings") or []
    if isinstance(runs, list) and runs:
        blocks.append(("table", ["run", "jobs", "seconds", "resume"],
                       [[i + 1, r.get("jobs", ""), r.get("seconds", ""), r.get("resume", "")] for i, r in enumerate(runs)
                        if isinstance(r, dict)]))
    chunks = m.get("chunks") or {}
    xs, ys = [], []
    items = 0
    if isinstance(chunks, dict):
        for k in sorted(chunks, key=lambda s: int(s) if str(s).isdigit() else 0):
            ch = chunks[k]
            if isinstance(ch, dict) and isinstance(ch.get("seconds"), (int, float)):
                xs.append(int(k) if str(k).isdigit() else len(xs))
                ys.append(ch["seconds"])
                items += int(ch.get("items") or 0)
    if ys:
        rate = items / sum(ys) if sum(ys) else 0
        blocks.append(("p", f"{len(ys)} chunks, {sum(ys):.1f} worker seconds, {items} diagrams "
                            f"({rate:.1f} diagrams per worker second); slowest chunk {max(ys):.2f} s."))
    else:
        blocks.append(("p", "The manifest records no chunk timings."))
    name = "timings.png"
    rp.line_plot(xs, ys, plots / name, rp.PLOTS[name], xlabel="chunk", ylabel="seconds")
    blocks.append(("img", rp.PLOTS[name], name))


def _rejects(c: Census, blocks: list) -> None:
    r = c.rejects
    blocks.append(("h", 2, "Rejects"))
    if not len(r):
        blocks.append(("p", "No input was rejected."))
        return
    reasons = Counter(str(_plain(x)).split(":")[0] for x in r["reason"].tolist())
    blocks.append(("table", ["reason", "inputs"], sorted(reasons.items())))
    src = r["source"].tolist() if "source" in r.columns else [""] * len(r)
    text = r["text"].tolist() if "text" in r.columns else [""] * len(r)
    blocks.append(("table", ["source", "input", "reason"],
                   [[_plain(s), _plain(t), _plain(x)] for s, t, x in list(zip(src, text, r["reason"].tolist()))[:MAX_LISTED]]))


def diagram_pictures(census: Census, plots: Path, *, classes: int = 2) -> list[tuple[str, str]]:
    """Pictures of representative knots: for every family, the smallest-crossing knot of
    each of its ``classes`` smallest determinant classes (det ≥ 3; ties by row_id).

    Each is drawn by :func:`pipeline.present.draw.draw_diagram` with a witness p-colouring, p the
    smallest prime dividing the determinant; returns ``(caption, file name)`` pairs for
    the pictures actually written (``[]`` for an empty census).
    """
    from .draw import draw_diagram
    from ..diagrams.notation import parse
    d = census.diagrams
    if not len(d):
        return []
    best: dict = {}
    for rid, fam, note, cr, comp, det in zip(d["row_id"].tolist(), d["family"].tolist(),
                                             d["notation"].tolist(), d["crossings"].tolist(),
                                             d["components"].tolist(), _dets(d)):
        if det is None or det < 3 or _plain(comp) != 1:
            continue
        key = (str(fam), det)
        cand = (int(cr), _plain(rid), _plain(note))
        if key not in best or cand < best[key]:
            best[key] = cand
    out = []
    for fam in sorted({f for f, _ in best}):
        for det in sorted(dt for f, dt in best if f == fam)[:classes]:
            cr, rid, note = best[(fam, det)]
            p = next(q for q in range(2, det + 1) if det % q == 0)
            name = f"diagram_{fam}_det{det}.png"
            try:
                draw_diagram(parse(note), plots / name, coloring=p)
            except Exception:  # a picture must never break the report
                continue
            out.append((f"{fam}, det {det}: {note} ({cr} crossings), a {p}-colouring", name))
    return out


def build_report(directory: str | Path) -> tuple[Path, Path, list[Path]]:
    """Write report.md, report.html and plots/*.png for a census; return their paths."""
    census = open_census(directory)
    plots = census.path / "plots"
    plots.mkdir(exist_ok=True)
    blocks: list = []
    _overview(census, blocks)
    _determinants(census, blocks, plots)
    _colourability(census, blocks, plots)
    _knot_types(census, blocks, plots)
    _chirality(census, blocks, plots)
    strength_section(census, blocks, plots)  # issue 12 (report_strength.py)
    _certification(census, blocks)
    _timings(census, blocks, plots)
    _rejects(census, blocks)
    pictures = diagram_pictures(census, plots)
    if pictures:
        blocks.append(("h", 2, "Diagrams"))
        blocks += [("img", cap, name) for cap, name in pictures]
    md, page = census.path / "report.md", census.path / "report.html"
    write_text_atomic(md, render_markdown(blocks))
    write_text_atomic(page, render_html(blocks, plots))
    files = [plots / b[2] for b in blocks if b[0] == "img"]
    write_explorer(census, census.path / "explorer.html", plots=[(b[1], plots / b[2]) for b in blocks if b[0] == "img"])
    return md, page, files


def _md_cell(v: Any) -> str:
    return str("" if v is None else v).replace("|", "\\|").replace("\n", " ")


def render_markdown(blocks: list) -> str:
    """The blocks as Markdown (images linked from plots/)."""
    out = []
    for b in blocks:
        if b[0] == "h":
            out.append("#" * b[1] + " " + b[2])
        elif b[0] == "p":
            out.append(b[1])
        elif b[0] == "table":
            head, rows = b[1], b[2]
            out.append("| " + " | ".join(map(_md_cell, head)) + " |\n|" + "---|" * len(head))
            out[-1] += "".join("\n| " + " | ".join(map(_md_cell, r)) + " |" for r in rows)
        elif b[0] == "img":
            out.append(f"![{b[1]}](plots/{b[2]})")
    return "\n\n".join(out) + "\n"


def render_html(blocks: list, plots: Path) -> str:
    """The blocks as one self-contained HTML page (plots embedded as base64 PNG)."""
    esc = html.escape
    out = ["<!DOCTYPE html>", "<html><head><meta charset='utf-8'><title>knotledger report</title>",
           "<style>body{font-family:sans-serif;max-width:60em;margin:2em auto}table{border-collapse:collapse}"
           "td,th{border:1px solid #bbb;padding:2px 6px;text-align:right}img{max-width:100%}</style></head><body>"]
    for b in blocks:
        if b[0] == "h":
            out.append(f"<h{b[1]}>{esc(b[2])}</h{b[1]}>")
        elif b[0] == "p":
            out.append(f"<p>{esc(b[1])}</p>")
        elif b[0] == "table":
            out.append("<table><tr>" + "".join(f"<th>{esc(str(h))}</th>" for h in b[1]) + "</tr>")
            out += ["<tr>" + "".join(f"<td>{esc(str('' if v is None else v))}</td>" for v in r) + "</tr>" for r in b[2]]
            out.append("</table>")
        elif b[0] == "img":
            data = base64.b64encode((plots / b[2]).read_bytes()).decode("ascii")
            out.append(f"<figure><img alt='{esc(b[1])}' src='data:image/png;base64,{data}'>"
                       f"<figcaption>{esc(b[1])}</figcaption></figure>")
    out.append("</body></html>")
    return "\n".join(out) + "\n"


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("directory", metavar="DIR", help="census directory")


def shown_path(path: Path) -> str:
    """``path`` relative to the working directory when below it, else its bare name."""
    try:
        return str(Path(path).resolve().relative_to(Path.cwd().resolve()))
    except ValueError:
        return Path(path).name


def main(args: argparse.Namespace) -> int:
    md, page, files = build_report(args.directory)
    where = shown_path(md.parent)
    sys.stdout.write(f"wrote {where}/report.md, report.html, explorer.html and {len(files)} plots in {where}/plots\n")
    return 0
