"""The HTML, CSS and hand-written script of ``explorer.html`` (no library, no network).

:func:`pipeline.present.explorer.explorer_html` replaces ``@@TITLE@@`` and ``@@DATA@@``
(a ``<script id="kl-data">`` block).  The script keeps the knot records as arrays,
filters and sorts them in place of the document and renders one page of rows at a
time, so 100,000 knot types stay responsive; a card is built only when its row is
clicked.  Element ids (``q``, ``cr-min`` ... ``chir``, ``proof``, ``count``, ``knots``,
``card``) are what the browser test drives.
"""

from __future__ import annotations

__all__ = ["PAGE"]

_CSS = """
body{font-family:system-ui,sans-serif;margin:0;color:#222;background:#fafafa}
header{padding:.6em 1.2em;background:#234;color:#fff}header h1{font-size:1.25em;margin:0}
main{display:flex;gap:1em;padding:1em;align-items:flex-start}
#left{flex:1 1 60%;min-width:0;overflow-x:auto}#card{flex:0 0 30em;background:#fff;border:1px solid #ccc;padding:.8em;
position:sticky;top:.5em;max-height:95vh;overflow:auto}
#filters{display:flex;flex-wrap:wrap;gap:.4em 1em;margin-bottom:.6em}#filters label{font-size:.9em}
#filters input[type=number]{width:6em}#q{width:18em}
table{border-collapse:collapse;background:#fff;font-size:.9em}td,th{border:1px solid #ccc;padding:2px 6px}#rows td{white-space:nowrap}
th{cursor:pointer;background:#eef;user-select:none;white-space:nowrap}th.asc:after{content:" \\25B2"}
th.desc:after{content:" \\25BC"}tbody tr{cursor:pointer}tbody tr:hover{background:#ffd}
tbody tr.sel{background:#fe9}td.num{text-align:right;font-variant-numeric:tabular-nums}
#pager{margin:.5em 0}.chart{display:inline-block;margin:0 1em 1em 0;vertical-align:top}
.chart rect.bar{fill:#4a7ab5;cursor:pointer}.chart rect.bar:hover{fill:#e69f00}
.formula{font-family:"Times New Roman",serif;font-size:1.1em}dl{display:grid;grid-template-columns:11em 1fr;gap:.2em .6em}
dt{font-weight:600}dd{margin:0}figure{margin:.5em 0}img{max-width:100%}.muted{color:#777}
"""

_JS = r"""
"use strict";
const F = {};
let D = null, K = [], view = [], sortCol = null, sortDir = 1, page = 0, detBig = [];
const COLS = [["key", "knot key"], ["rep", "smallest diagram"], ["cr", "crossings"], ["comp", "components"],
  ["det", "determinant"], ["sig", "signature"], ["chir", "chirality"], ["proof", "proof"], ["ndiag", "diagrams"],
  ["fams", "families"]];
const NUMERIC = new Set(["cr", "comp", "sig", "ndiag"]);
const $ = id => document.getElementById(id);
function esc(s) { return String(s ?? "").replace(/[&<>"']/g, c => ({"&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;"}[c])); }

async function loadData() {
  const el = $("kl-data");
  if (el.type === "application/json") return JSON.parse(el.textContent);
  const bin = Uint8Array.from(atob(el.textContent.trim()), c => c.charCodeAt(0));
  const stream = new Blob([bin]).stream().pipeThrough(new DecompressionStream("gzip"));
  return JSON.parse(await new Response(stream).text());
}

function cmpNull(a, b) { return (a === null) - (b === null); }
function comparator(col) {
  const i = F[col];
  let base;
  if (col === "det") base = (x, y) => cmpNull(x[i], y[i]) || (x[i] === null ? 0 : (x[i].length - y[i].length) || (x[i] < y[i] ? -1 : x[i] > y[i] ? 1 : 0));
  else if (NUMERIC.has(col)) base = (x, y) => cmpNull(x[i], y[i]) || (x[i] === null ? 0 : x[i] - y[i]);
  else base = (x, y) => String(x[i] ?? "").localeCompare(String(y[i] ?? ""));
  const k = F.key;
  return (x, y) => sortDir * base(x, y) || (x[k] < y[k] ? -1 : x[k] > y[k] ? 1 : 0);
}

function num(id) { const v = $(id).value.trim(); return v === "" ? null : Number(v); }
function big(id) { const v = $(id).value.trim(); if (v === "") return null; try { return BigInt(v); } catch (e) { return null; } }
function within(v, lo, hi) { return (lo === null || (v !== null && v >= lo)) && (hi === null || (v !== null && v <= hi)); }

function apply() {
  const words = $("q").value.toLowerCase().split(/\s+/).filter(Boolean);
  const cr = [num("cr-min"), num("cr-max")], sig = [num("sig-min"), num("sig-max")], det = [big("det-min"), big("det-max")];
  const chir = $("chir").value, proof = $("proof").value;
  view = [];
  for (let n = 0; n < K.length; n++) {
    const r = K[n];
    if (chir && r[F.chir] !== chir) continue;
    if (proof && r[F.proof] !== proof) continue;
    if (!within(r[F.cr], cr[0], cr[1]) || !within(r[F.sig], sig[0], sig[1])) continue;
    if ((det[0] !== null || det[1] !== null) && !within(detBig[n], det[0], det[1])) continue;
    if (words.length && !words.every(w => r[F.search].includes(w))) continue;
    view.push(n);
  }
  if (sortCol) { const c = comparator(sortCol); view.sort((a, b) => c(K[a], K[b])); }
  page = 0;
  render();
}

function render() {
  const size = Number($("page-size").value), pages = Math.max(1, Math.ceil(view.length / size));
  page = Math.min(page, pages - 1);
  const rows = view.slice(page * size, (page + 1) * size).map(n => {
    const r = K[n];
    return `<tr data-n="${n}" data-key="${esc(r[F.key])}">` + COLS.map(([c]) =>
      `<td class="${NUMERIC.has(c) || c === "det" ? "num" : ""}" data-col="${c}">${esc(r[F[c]] ?? "")}</td>`).join("") + "</tr>";
  });
  $("rows").innerHTML = rows.join("");
  $("count").textContent = `${view.length} of ${K.length} knot types`;
  $("page-info").textContent = `page ${page + 1} of ${pages}`;
  document.querySelectorAll("#knots th").forEach(th => {
    th.className = th.dataset.col === sortCol ? (sortDir > 0 ? "asc" : "desc") : "";
  });
}

function sup(e) { return e === "1" ? "" : `<sup>${esc(e)}</sup>`; }
function formula(pairs, v) {
  if (pairs === null || pairs === undefined) return '<span class="muted">not computed</span>';
  if (!pairs.length) return "0";
  return '<span class="formula">' + pairs.map(([e, c], k) => {
    const neg = c.startsWith("-"), mag = neg ? c.slice(1) : c;
    const mono = e === "0" ? "" : `<i>${v}</i>${sup(e)}`;
    const body = mono === "" ? mag : (mag === "1" ? mono : mag + mono);
    return (k === 0 ? (neg ? "\u2212" : "") : (neg ? " \u2212 " : " + ")) + body;
  }).join("") + "</span>";
}

function showCard(n) {
  const r = K[n];
  document.querySelectorAll("#rows tr.sel").forEach(tr => tr.classList.remove("sel"));
  const tr = document.querySelector(`#rows tr[data-n="${n}"]`);
  if (tr) tr.classList.add("sel");
  const pic = r[F.svg] >= 0 ? D.svgs[r[F.svg]] :
    `<p class="muted">Not drawn in this page (only the ${D.draw_per_family} knot types of fewest crossings per family are); ` +
    `draw it with <code>knotledger draw '${esc(r[F.rep])}' --out FILE.svg</code>.</p>`;
  const factors = r[F.factors].length ? r[F.factors].map(esc).join(", ") : "none (trivial)";
  const cols = r[F.cols].map(([m, c, f]) => `<tr><td class="num">${m}</td><td class="num">${esc(c)}</td><td class="num">${f ?? ""}</td></tr>`).join("");
  const shared = r[F.shared].length ? `<dt>same fingerprint as</dt><dd>${r[F.shared].map(esc).join(", ")}</dd>` : "";
  const note = r[F.note] ? `<dt>note</dt><dd>${esc(r[F.note])}</dd>` : "";
  const rows = r[F.rows].map(([id, fam, par, nt, cr, ch, st]) =>
    `<tr><td class="num">${id}</td><td>${esc(fam)}</td><td>${esc(par)}</td><td>${esc(nt)}</td><td class="num">${cr ?? ""}</td><td>${esc(ch)}</td><td>${esc(st)}</td></tr>`).join("");
  const more = r[F.ndiag] > r[F.rows].length ? `<p class="muted">${r[F.ndiag] - r[F.rows].length} more rows: query the census.</p>` : "";
  $("card").innerHTML = `<h2>${esc(r[F.key])}</h2><div class="drawing">${pic}</div>
<p>smallest diagram <code>${esc(r[F.rep])}</code></p><dl>
<dt>crossings</dt><dd>${r[F.cr] ?? "?"} <span class="muted">(${esc(r[F.cr_source])})</span></dd>
<dt>components</dt><dd>${r[F.comp] ?? "?"}</dd>
<dt>determinant</dt><dd>${esc(r[F.det] ?? "not computed")}</dd>
<dt>invariant factors</dt><dd>${factors}</dd>
<dt>signature</dt><dd>${r[F.sig] ?? "not computed"}</dd>
<dt>Alexander &Delta;(t)</dt><dd>${formula(r[F.alex], "t")}</dd>
<dt>Conway &nabla;(z)</dt><dd>${formula(r[F.conway], "z")}</dd>
<dt>Jones V(t)</dt><dd>${formula(r[F.jones], "t")}</dd>
<dt>chirality</dt><dd>${esc(r[F.chir])}${r[F.chir_reason] ? " \u2014 " + esc(r[F.chir_reason]) : ""}</dd>
<dt>mirror key</dt><dd>${esc(r[F.mirror])}</dd>
<dt>proof of the key</dt><dd>${esc(r[F.proof])}</dd>${shared}${note}</dl>
<h3>Fox colourings</h3><table><tr><th>n</th><th>col<sub>n</sub></th><th>fewest colours</th></tr>${cols}</table>
<h3>Diagrams of this type (${r[F.ndiag]})</h3><table><tr><th>row</th><th>family</th><th>parameters</th><th>notation</th><th>crossings</th><th>chirality</th><th>status</th></tr>${rows}</table>${more}`;
  $("card").hidden = false;
}

function setFilter(values) {
  for (const id of ["q", "cr-min", "cr-max", "det-min", "det-max", "sig-min", "sig-max", "chir", "proof"]) $(id).value = values[id] ?? "";
  apply();
  $("knots").scrollIntoView();
}

function chart(title, entries, filterOf) {
  const w = Math.max(160, 26 * entries.length + 40), h = 150, top = Math.max(1, ...entries.map(e => e[1]));
  const bars = entries.map(([label, count], k) => {
    const bh = Math.round(100 * count / top), x = 30 + 26 * k;
    return `<g><rect class="bar" data-label="${esc(label)}" x="${x}" y="${115 - bh}" width="20" height="${bh}"><title>${esc(label)}: ${count} (click to filter)</title></rect>` +
      `<text x="${x + 10}" y="130" font-size="9" text-anchor="middle">${esc(String(label).slice(0, 6))}</text></g>`;
  }).join("");
  const div = document.createElement("div");
  div.className = "chart";
  div.innerHTML = `<div><b>${esc(title)}</b></div><svg width="${w}" height="${h}"><line x1="28" y1="115" x2="${w}" y2="115" stroke="#999"/>${bars}</svg>`;
  div.querySelectorAll("rect.bar").forEach((rect, k) => rect.addEventListener("click", () => setFilter(filterOf(entries[k][0]))));
  $("charts").appendChild(div);
}

function counts(col, limit) {
  const m = new Map();
  for (const r of K) { const v = r[F[col]]; if (v !== null) m.set(v, (m.get(v) || 0) + 1); }
  let e = [...m.entries()];
  e.sort((a, b) => col === "det" ? (a[0].length - b[0].length || (a[0] < b[0] ? -1 : 1)) : (typeof a[0] === "number" ? a[0] - b[0] : String(a[0]).localeCompare(String(b[0]))));
  return limit ? e.slice(0, limit) : e;
}

function charts() {
  chart("knot types by crossings", counts("cr"), v => ({"cr-min": v, "cr-max": v}));
  chart("knot types by determinant (30 smallest values)", counts("det", 30), v => ({"det-min": v, "det-max": v}));
  chart("knot types by signature", counts("sig"), v => ({"sig-min": v, "sig-max": v}));
  chart("chirality", counts("chir"), v => ({"chir": v}));
  chart("proof of the key", counts("proof"), v => ({"proof": v}));
  $("plots").innerHTML = D.plots.map(([cap, b64]) => `<figure><img alt="${esc(cap)}" src="data:image/png;base64,${b64}"><figcaption>${esc(cap)}</figcaption></figure>`).join("");
}

function options(id, col) {
  const vals = [...new Set(K.map(r => r[F[col]]).filter(v => v !== null))].sort();
  $(id).innerHTML = '<option value="">any</option>' + vals.map(v => `<option>${esc(v)}</option>`).join("");
}

async function main() {
  D = await loadData();
  D.columns.forEach((c, i) => { F[c] = i; });
  K = D.knots;
  detBig = K.map(r => r[F.det] === null ? null : BigInt(r[F.det]));
  $("title").textContent = `knotledger explorer: ${D.name}`;
  $("summary").textContent = `${K.length} knot types from ${D.n_rows} diagrams.`;
  $("knots").querySelector("thead").innerHTML = "<tr>" + COLS.map(([c, t]) => `<th data-col="${c}">${esc(t)}</th>`).join("") + "</tr>";
  options("chir", "chir");
  options("proof", "proof");
  document.querySelectorAll("#knots th").forEach(th => th.addEventListener("click", () => {
    const c = th.dataset.col;
    sortDir = sortCol === c ? -sortDir : 1;
    sortCol = c;
    apply();
  }));
  for (const id of ["q", "cr-min", "cr-max", "det-min", "det-max", "sig-min", "sig-max"]) $(id).addEventListener("input", apply);
  for (const id of ["chir", "proof"]) $(id).addEventListener("change", apply);
  $("page-size").addEventListener("change", render);
  $("prev").addEventListener("click", () => { page = Math.max(0, page - 1); render(); });
  $("next").addEventListener("click", () => { page += 1; render(); });
  $("reset").addEventListener("click", () => setFilter({}));
  $("rows").addEventListener("click", ev => { const tr = ev.target.closest("tr"); if (tr) showCard(Number(tr.dataset.n)); });
  charts();
  apply();
  document.body.dataset.ready = "1";
}
main();
"""

PAGE = """<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8"><title>@@TITLE@@</title>
<meta name="viewport" content="width=device-width, initial-scale=1">
<style>""" + _CSS + """</style></head><body>
<header><h1 id="title">knotledger explorer</h1><div id="summary"></div></header>
<main><div id="left">
<div id="filters">
<label>search keys and notations <input id="q" type="search" placeholder="e.g. pretzel 2b:"></label>
<label>crossings <input id="cr-min" type="number"> to <input id="cr-max" type="number"></label>
<label>determinant <input id="det-min" type="number" min="0"> to <input id="det-max" type="number" min="0"></label>
<label>signature <input id="sig-min" type="number"> to <input id="sig-max" type="number"></label>
<label>chirality <select id="chir"></select></label>
<label>proof <select id="proof"></select></label>
<button id="reset" type="button">clear filters</button>
</div>
<div id="pager"><span id="count"></span> &middot; <button id="prev" type="button">&larr;</button>
<span id="page-info"></span> <button id="next" type="button">&rarr;</button>
<label>rows per page <select id="page-size"><option>25</option><option selected>50</option><option>100</option>
<option>500</option></select></label></div>
<table id="knots"><thead></thead><tbody id="rows"></tbody></table>
<h2>Charts (click a bar to filter the table)</h2><div id="charts"></div>
<h2>Report plots</h2><div id="plots"></div>
</div>
<aside id="card" hidden></aside></main>
@@DATA@@
<script>""" + _JS + """</script></body></html>
"""
