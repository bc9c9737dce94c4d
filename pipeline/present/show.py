"""``knotledger show DIAGRAM``: every invariant of one diagram, on one page or as JSON.

The readable page is laid out for checking by hand: the PD code, the arcs with their
edge labels, the colouring matrix entry by entry (columns a1..am for the arcs and
o1..ok for free loops, rows x1..xn for the crossings in PD order), the determinant and
invariant factors, the colouring counts, and for each prime p dividing the
determinant a witness p-colouring (checked at every crossing) with the fewest colours
used by a nontrivial p-colouring of this diagram.  Whatever else
:func:`pipeline.invariants.all.compute_all` returns (polynomials, signature,
chirality, checks, ...) is printed after that.

``--json`` prints one object (README.md, contract): at least ``crossings``,
``components``, ``writhe``, ``determinant``, ``invariant_factors``, ``colorings``
(modulus as a string -> count) plus every other key of the census row; polynomials
in the ``[[exponent, coefficient], ...]`` form; every integer exact.

When the diagram is simplified (:func:`pipeline.diagrams.simplify.simplify`) to fewer
crossings, the page prints the smaller diagram (crossings, moves, notation); it prints
the primality verdict with its reason and the keyed summands, and the reason of the
knot key (e.g. the flyping theorem).  ``--json`` carries the same as ``simplified``
(``crossings``, ``smaller``, ``moves``, ``notation``) and ``prime`` (``prime``,
``reason``, ``summands``), beside ``knot`` (with ``key_reason`` and ``flype_code``).
"""

from __future__ import annotations

import argparse
import json
import shlex
import sys
from fractions import Fraction
from math import isqrt
from typing import Any

from ..diagrams.diagram import Diagram
from ..invariants.coloring import spectrum as coloring
from ..diagrams.notation import parse

__all__ = ["add_arguments", "main", "collect", "render_page", "to_json_object"]

DENSE_MATRIX_COLUMNS = 40  # wider matrices are printed row by row, nonzero entries only
MAX_MODULUS_LIMIT = 1000


def _modulus(text: str) -> int:
    try:
        n = int(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"--max-modulus {text!r} is not an integer") from None
    if not 2 <= n <= MAX_MODULUS_LIMIT:
        raise argparse.ArgumentTypeError(f"--max-modulus {n} must be between 2 and {MAX_MODULUS_LIMIT}")
    return n


def _prime(text: str) -> int:
    try:
        p = int(text)
    except ValueError:
        raise argparse.ArgumentTypeError(f"--witness {text!r} is not an integer") from None
    if p < 2 or p > 10**6 or any(p % q == 0 for q in range(2, isqrt(p) + 1)):
        raise argparse.ArgumentTypeError(f"--witness {p} must be a prime below 10^6")
    return p


def add_arguments(parser: argparse.ArgumentParser) -> None:
    """Register the options of ``knotledger show``."""
    parser.add_argument("diagram", metavar="DIAGRAM", help="a diagram string KIND:ARGS, e.g. torus:2,3")
    parser.add_argument("--json", action="store_true", help="print one JSON object instead of the page")
    parser.add_argument("--max-modulus", type=_modulus, default=16, metavar="N",
                        help="count colourings for n = 2..N (default 16)")
    parser.add_argument("--witness", type=_prime, action="append", default=[], metavar="P",
                        help="also show a witness colouring mod the prime P (repeatable)")


# ------------------------------------------------------------------ collecting
#: Largest diagram on which ``show`` computes HOMFLY-PT and Khovanov homology.
SHOW_STRENGTH_MAX_CROSSINGS = 40


def collect(diagram: Diagram, *, max_modulus: int = 16, extra_primes: tuple[int, ...] = (),
            notation: str | None = None) -> dict:
    """The census row of ``diagram`` (:func:`~pipeline.invariants.all.compute_all`, exactly
    what a census stores), plus witnesses and fewest colours for ``extra_primes``."""
    from ..invariants.all import compute_all
    # HOMFLY-PT (skein route) and Khovanov homology are skipped, with the budget status,
    # on diagrams beyond SHOW_STRENGTH_MAX_CROSSINGS: a census sets its own budgets
    big = diagram.n_crossings > SHOW_STRENGTH_MAX_CROSSINGS
    row = dict(compute_all(diagram, max_modulus=max_modulus, notation=notation,
                           **({"homfly_budget": 0, "khovanov_budget": 0} if big else {})))
    if notation is not None:
        _add_knot_type(row, diagram, notation)
    if row.get("determinant") is None:  # the colouring part failed; the page says so
        return row
    row["witnesses"] = dict(row.get("witnesses") or {})
    row["min_colors"] = dict(row.get("min_colors") or {})
    for p in extra_primes:
        if p not in row["witnesses"]:
            w = coloring.witness_coloring(diagram, p)
            row["witnesses"][p] = None if w is None else list(w)
            row["min_colors"][p] = None if w is None else coloring.min_colors(diagram, p)
    return row


# ------------------------------------------------------------------ JSON
def _jsonable(value: Any) -> Any:
    if hasattr(value, "to_json"):
        return value.to_json()
    if isinstance(value, dict):
        return {str(k): _jsonable(v) for k, v in value.items()}
    if isinstance(value, (list, tuple)):
        return [_jsonable(v) for v in value]
    if isinstance(value, (set, frozenset)):
        return sorted(_jsonable(v) for v in value)
    if isinstance(value, Fraction):
        return str(value)
    if value is None or isinstance(value, (bool, int, float, str)):
        return value
    return str(value)


def _add_knot_type(row: dict, diagram: Diagram, notation: str) -> None:
    """The knot key a census would give this diagram typed into a file family, and the
    normal-form chirality verdict when a classification theorem decides it."""
    from ..identify.classify import knot_key
    try:
        got = knot_key({**row, "family": "file", "params": {}, "notation": notation, "diagram": diagram})
    except Exception as err:  # the page must still show every other invariant
        row["knot"] = {"error": f"{type(err).__name__}: {err}"}
        return
    row["knot"] = {k: got.get(k) for k in ("knot_key", "mirror_key", "proof", "key_rule", "key_reason",
                                            "amphichiral", "amphichiral_reason", "crossing_number",
                                            "crossing_number_source", "flype_code") if k in got}
    if got.get("chirality"):
        row["chirality"], row["chirality_reason"] = got["chirality"], got.get("chirality_reason")
    _add_structure(row, got)


# --- begin: simplification and primality (issue 11) ---
def _add_structure(row: dict, got: dict) -> None:
    """``simplified`` and ``prime`` of the page and of ``--json`` (from the knot key)."""
    if "simplified_crossings" not in got:
        return
    row["simplified"] = {"crossings": got["simplified_crossings"],
                         "smaller": got.get("simplified_notation") is not None,
                         "moves": got.get("simplify_moves") or {},
                         "notation": got.get("simplified_notation")}
    row["prime"] = {"prime": got.get("prime"), "reason": got.get("prime_reason"),
                    "summands": list(got.get("summands") or [])}


def _structure_lines(row: dict) -> list[str]:
    lines = []
    simp = row.get("simplified")
    if isinstance(simp, dict) and simp.get("smaller"):
        moves = ", ".join(f"{k} {v}" for k, v in simp["moves"].items() if v)
        lines += ["", f"Simplified diagram: {simp['crossings']} crossings (moves: {moves})",
                  f"  {simp['notation']}"]
    pr = row.get("prime")
    if isinstance(pr, dict):
        verdict = {True: "prime", False: "not prime", None: "unknown"}[pr.get("prime")]
        lines += ["", f"Primality: {verdict} ({pr.get('reason')})"]
        for sm in pr.get("summands") or []:
            lines.append(f"  summand (piece {sm['piece'] + 1}): {sm['crossings']} crossings, "
                         f"knot key {sm['knot_key']}")
    return lines
# --- end: simplification and primality ---


def to_json_object(diagram: Diagram, notation: str, row: dict) -> dict:
    """The ``--json`` object: notation, pd, arcs, then every key of the row (no timings)."""
    out: dict[str, Any] = {"notation": notation, "pd": diagram.to_notation(),
                           "arcs": [list(a) for a in diagram.arcs]}
    factors = row.get("invariant_factors")
    for key, value in row.items():
        if key != "timings":
            out[key] = _jsonable(value)
    if factors is not None and row.get("colorings"):
        out["generating_moduli"] = [n for n in sorted(row["colorings"])
                                    if coloring.has_generating_coloring(factors, n)]
    return out


# ------------------------------------------------------------------ page
def _poly_text(poly: Any, var: str) -> str:
    """A Laurent polynomial as text in ``var``: :meth:`~pipeline.invariants.poly.Laurent.to_text`
    (half-integer exponents bracketed, ``t^(5/2)``); anything else as ``str``."""
    to_text = getattr(poly, "to_text", None)
    return to_text(var) if to_text is not None else str(poly)


def _col_names(diagram: Diagram) -> list[str]:
    return [f"a{k + 1}" for k in range(len(diagram.arcs))] + [f"o{k + 1}" for k in range(diagram.free_loops)]


def _matrix_lines(diagram: Diagram) -> list[str]:
    names = _col_names(diagram)
    m = coloring.coloring_matrix(diagram)
    if not m:
        return ["  (no crossings: no rows)"]
    rows = [f"x{i + 1}" for i in range(len(m))]
    if len(names) <= DENSE_MATRIX_COLUMNS:
        w = max(3, max(len(n) for n in names) + 1, max(len(str(v)) for r in m for v in r) + 1)
        lw = max(len(r) for r in rows) + 2
        lines = [" " * lw + "".join(n.rjust(w) for n in names)]
        lines += [f"  {r}".ljust(lw) + "".join(str(v).rjust(w) for v in row) for r, row in zip(rows, m)]
        return lines
    lines = ["  (wide matrix: each row lists its nonzero entries)"]
    for r, row in zip(rows, m):
        terms = [f"{v:+d}·{names[c]}" for c, v in enumerate(row) if v]
        lines.append(f"  {r}: " + (" ".join(terms) if terms else "0"))
    return lines


def _wrap(items: list[str], indent: str, width: int = 96) -> list[str]:
    lines, cur = [], indent
    for it in items:
        if len(cur) + len(it) + 1 > width and cur.strip():
            lines.append(cur.rstrip())
            cur = indent
        cur += it + " "
    lines.append(cur.rstrip())
    return lines


def render_page(diagram: Diagram, notation: str, row: dict, *, max_modulus: int) -> str:
    """The readable page of ``knotledger show``."""
    names = _col_names(diagram)
    out = [f"== {notation.strip()} ==", f"  {diagram.to_notation()}", ""]
    comps = diagram.n_components
    out.append(f"crossings {diagram.n_crossings}   components {comps}"
               f" (free loops {diagram.free_loops})   writhe {diagram.writhe:+d}"
               + (f"   alternating {'yes' if row.get('alternating') else 'no'}" if diagram.n_crossings else ""))
    out += ["", "Crossings (a b c d counterclockwise from the incoming under-edge a; sign +: over runs d->b)"]
    arc = diagram.arc_of_label
    for i, x in enumerate(diagram.pd):
        o = arc[diagram.over_labels(i)[0]]
        out.append(f"  x{i + 1:<4} ({x[0]}, {x[1]}, {x[2]}, {x[3]})  {'+' if diagram.signs[i] > 0 else '-'}"
                   f"   over {names[o]}, under {names[arc[x[0]]]} -> {names[arc[x[2]]]}")
    out += ["", "Arcs (maximal over-strands; edge labels in orientation order)"]
    for k, a in enumerate(diagram.arcs):
        out.append(f"  {names[k]:<5} " + " ".join(map(str, a)))
    for k in range(diagram.free_loops):
        out.append(f"  o{k + 1:<4} free loop (no crossings; a zero column)")
    out += ["", "Colouring matrix M (row x_i = 2·over - under_in - under_out)"]
    out += _matrix_lines(diagram)
    out.append("")
    det, factors = row.get("determinant"), row.get("invariant_factors")
    if det is None:
        out.append(f"Colouring invariants not computed: {row.get('status', 'unknown reason')}")
    else:
        torsion = " ⊕ ".join(f"Z/{d}" if d else "Z" for d in factors)
        out.append(f"determinant        {det}")
        out.append(f"invariant factors  ({', '.join(map(str, factors))})"
                   f"    coker M = Z{' ⊕ ' + torsion if torsion else ''}")
        out += _colouring_table(row, factors)
        out += _witness_lines(row, names, det, max_modulus)
    out += _other_invariants(row)
    out += _structure_lines(row)
    quoted = shlex.quote(notation.strip())
    out += ["", f"status: {row.get('status', 'ok')}",
            f"To draw this diagram with its arcs labelled: knotledger draw {quoted} --out FILE.svg"]
    return "\n".join(out) + "\n"


def _colouring_table(row: dict, factors: list[int]) -> list[str]:
    counts = row.get("colorings") or {}
    lines = ["", "Fox colourings (col_n = n · Π gcd(n, d_i), constant colourings included)",
             f"  {'n':>4}  {'col_n':>12}  {'non-constant':<13} generating"]
    for n in sorted(counts):
        c = counts[n]
        lines.append(f"  {n:>4}  {c:>12}  {'yes' if c > n else '-':<13} "
                     f"{'yes' if coloring.has_generating_coloring(factors, n) else '-'}")
    return lines


def _witness_lines(row: dict, names: list[str], det: int, max_modulus: int) -> list[str]:
    witnesses = row.get("witnesses") or {}
    fewest = row.get("min_colors") or {}
    lines = ["", f"Witness colourings (each prime p <= {max_modulus} dividing det, and any asked for; "
             "checked at every crossing)"]
    if not witnesses:
        lines.append("  none: no prime in range divides the determinant")
    for p in sorted(witnesses):
        w = witnesses[p]
        if w is None:
            lines.append(f"  p = {p}: no nontrivial {p}-colouring")
            continue
        f = fewest.get(p)
        few = f"{f}" if f is not None else "not computed (over the min_colors budget)"
        lines.append(f"  p = {p}: uses {len(set(w))} colours; fewest in a nontrivial {p}-colouring "
                     f"of this diagram: {few}")
        lines += _wrap([f"{names[k]}={c}" for k, c in enumerate(w)], "      ")
    return lines


def _homfly_text(value) -> str:
    """v⁻¹P(L₊) − vP(L₋) = zP(L₀) terms as text, e.g. ``2v^2 + v^2z^2 - v^4``."""
    terms = value.to_json() if hasattr(value, "to_json") else value
    out = []
    for a, b, c in terms:
        mono = "".join(f"{x}" if e == 1 else f"{x}^{e}" if e >= 0 else f"{x}^({e})"
                       for x, e in (("v", a), ("z", b)) if e)
        coeff = "" if mono and abs(c) == 1 else str(abs(c))
        out.append(("- " if c < 0 else "+ ") + coeff + mono)
    text = " ".join(out)
    return (text[2:] if text.startswith("+ ") else "-" + text[2:]) if out else "0"


def _strength_lines(row: dict) -> list[str]:
    """HOMFLY-PT, Khovanov ranks and torsion, Rasmussen's s and σ_ω jumps (the census columns)."""
    lines = []
    if "homfly" in row:
        P = row["homfly"]
        lines.append(f"  HOMFLY-PT  P(v,z) = {_homfly_text(P) if P is not None else 'not computed'}")
    if "khovanov" in row:
        kh = row["khovanov"]
        if kh is None:
            lines.append("  Khovanov   not computed")
        else:
            ranks = [f"({i},{j}):{r}" if r != 1 else f"({i},{j})" for i, j, r in kh]
            head = f"  Khovanov   over Q, (i,j):rank, width {row.get('kh_width')}: "
            lines += [head.rstrip()] + _wrap(ranks, " " * 13)
    if "khovanov_torsion" in row:
        tors = row["khovanov_torsion"]
        if tors is None:
            lines.append("  torsion    of Kh over Z: not computed")
        elif not tors:
            lines.append("  torsion    of Kh over Z: none")
        else:
            parts = [(f"Z/{m}" if c == 1 else f"(Z/{m})^{c}") + f" at ({i},{j})" for i, j, m, c in tors]
            lines += ["  torsion    of Kh over Z:"] + _wrap(parts, " " * 13)
    if row.get("rasmussen_s") is not None:
        lines.append(f"  s          {row['rasmussen_s']} (Rasmussen)")
    tl = row.get("tristram_levine")
    if tl is not None:
        data = tl.to_json() if hasattr(tl, "to_json") else tl
        # a jump at a root of unity has its angle; otherwise the exact isolating interval
        # of x = ω + 1/ω = 2cos θ (a root of an integer factor of Δ, Sturm sequences)
        angles = [f"θ/2π = {j['angle']}" if j.get("angle") else
                  f"2cos θ = {j['interval'][0]}" if j["interval"][0] == j["interval"][1] else
                  f"2cos θ in [{j['interval'][0]}, {j['interval'][1]}]" for j in data.get("jumps", [])]
        lines.append(f"  σ_ω        values {list(data.get('values', []))} between jumps at "
                     f"{'; '.join(angles) or 'none'} (σ_-1 = {data.get('at_minus_one')})")
    return lines


def _other_invariants(row: dict) -> list[str]:
    lines = []
    for key, label, var in (("alexander", "Alexander  Δ(t)", "t"), ("conway", "Conway     ∇(z)", "z"),
                            ("jones", "Jones      V(t)", "t")):
        if key in row:
            value = row[key]
            lines.append(f"  {label} = {_poly_text(value, var) if value is not None else 'not computed'}")
    lines += _strength_lines(row)
    for key in ("signature", "nullity"):
        if key in row:
            lines.append(f"  {key:<10} {row[key] if row[key] is not None else 'not computed'}")
    if "chirality" in row:
        reason = row.get("chirality_reason")
        lines.append(f"  chirality  {row['chirality']}" + (f" ({reason})" if reason else ""))
    knot = row.get("knot")
    if isinstance(knot, dict) and knot.get("knot_key"):
        cn = knot.get("crossing_number")
        lines.append(f"  knot key   {knot['knot_key']} ({knot.get('proof')}; mirror {knot.get('mirror_key')})")
        if knot.get("key_reason"):
            wrapped = _wrap(knot["key_reason"].split(" "), " " * 13)
            lines += ["  key reason " + wrapped[0].strip()] + wrapped[1:]
        if cn is not None:
            lines.append(f"  crossing number {cn} ({knot.get('crossing_number_source')})")
    bounds = row.get("bounds")
    if isinstance(bounds, dict) and bounds:
        items = [f"{k} {v}," for k, v in bounds.items()]
        items[-1] = items[-1].rstrip(",")
        wrapped = _wrap(items, " " * 13)
        lines += ["  bounds     " + wrapped[0].strip()] + wrapped[1:]
    checks = row.get("checks")
    if isinstance(checks, dict) and checks:
        failed = sorted(k for k, ok in checks.items() if not ok)
        lines.append(f"  checks     {len(checks) - len(failed)} passed, {len(failed)} failed"
                     + (": " + ", ".join(failed) if failed else ""))
    return (["", "Other invariants"] + lines) if lines else []


# ------------------------------------------------------------------ entry point
def main(args: argparse.Namespace) -> int:
    """Run ``knotledger show``; returns the exit code (0)."""
    diagram = parse(args.diagram)
    primes = tuple(dict.fromkeys(args.witness))
    row = collect(diagram, max_modulus=args.max_modulus, extra_primes=primes, notation=args.diagram)
    if args.json:
        obj = to_json_object(diagram, args.diagram.strip(), row)
        sys.stdout.write(json.dumps(obj, ensure_ascii=False) + "\n")
    else:
        sys.stdout.write(render_page(diagram, args.diagram, row, max_modulus=args.max_modulus))
    return 0
