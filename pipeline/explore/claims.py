"""``knotledger check DIR --claim EXPR``: test a conjectured formula on every census row.

The claim and the optional ``--where`` filter are written in the safe expression
language of :mod:`pipeline.explore.safe_expr` (Python-like syntax parsed with :mod:`ast`,
checked against a whitelist before any data is read, never passed to eval/exec).
Names are the family parameters from the ``params`` column (``p``, ``q``, ``p1``…,
``alpha``, ``beta``, ``t1``…; a parameter shadows a column of the same name) and the
scalar/list columns of ``diagrams`` (``determinant``, ``crossings``, ``components``,
``writhe``, ``signature``, ``family``, ``chirality``, ``status``, ``factors`` =
``invariant_factors`` as a list of ints, ``rasmussen_s``, ``kh_width``, ...).  Integers are exact: a column with a
``*_text`` twin (``determinant_text``) is read from the text.  Row functions read the
``colorings`` table: ``colorable(n)`` (col_n > n), ``colorings(n)`` (col_n),
``min_colors(p)``; ``alexander_at(x)`` and ``jones_at(x)`` evaluate the stored
polynomials exactly.

Each selected row is *held* (claim true), a *counterexample* (false) or *undecided*
(a null value was used).  Exit status: 0 all decided rows held, 1 a counterexample was
found, 2 no row selected or none decided (or a bad expression).

Example
-------
``knotledger check DIR --family pretzel --claim "determinant == abs(p1*p2 + p2*p3 + p1*p3)"``
tests the pretzel determinant formula (Kawauchi, survey monograph, 1996).
"""

from __future__ import annotations

import argparse
import json
import sys
from dataclasses import dataclass, field
from fractions import Fraction
from pathlib import Path
from typing import Any, Optional

from ..census.reader import Census, exact_int, open_census, parse_params
from ..errors import ClaimError
from .safe_expr import Expression, Null, compile_expression

__all__ = ["ClaimResult", "RowEnv", "census_rows", "check_claim", "format_result", "language_help",
           "add_arguments", "main"]

from pandas import NA as _NA

#: Short names for columns.
ALIASES = {"factors": "invariant_factors"}


def _plain(value: Any) -> Any:
    """A pandas/numpy cell as a plain exact Python value (None for nulls)."""
    kind = type(value)
    if kind is int or kind is str or kind is bool:
        return value
    if value is None or value is _NA:
        return None
    if isinstance(value, (list, tuple)):
        return tuple(_plain(v) for v in value)
    if hasattr(value, "tolist") and not isinstance(value, (str, bytes)):
        return _plain(value.tolist())
    try:
        import pandas as pd
        if pd.isna(value):
            return None
    except (TypeError, ValueError):
        pass
    if isinstance(value, bool):
        return value
    if isinstance(value, int):
        return int(value)
    return value


def _int_or_text(x: Any) -> Any:
    if isinstance(x, str):
        try:
            return int(x)
        except ValueError:
            return x
    return x


def _param_value(v: Any) -> Any:
    if isinstance(v, str):
        try:
            f = Fraction(v.strip())
        except (ValueError, ZeroDivisionError):
            return v
        return int(f) if f.denominator == 1 else f
    if isinstance(v, float):
        return None  # parameters are exact; a float would be a writer bug
    return v


def _column(df, name: str) -> list:
    """Exact Python values of a diagrams column (text twins preferred)."""
    col = df[name].tolist()
    text = f"{name}_text"
    if text in df.columns:
        texts = df[text].tolist()
        return [int(t) if type(t) is str else exact_int(_plain(v)) for v, t in zip(col, texts)]
    values = [_plain(v) for v in col]
    if name == "invariant_factors":
        return [None if v is None else tuple(_int_or_text(x) for x in v) for v in values]
    return values


class RowEnv:
    """The values one expression sees for one row (see :mod:`pipeline.explore.safe_expr`)."""

    __slots__ = ("values", "colorings", "polys")

    def __init__(self, values: dict, colorings: Optional[dict], polys: dict) -> None:
        self.values = values
        self.colorings = colorings
        self.polys = polys

    def value(self, name: str) -> Any:
        v = self.values.get(name)
        if v is None:
            raise Null()
        return v

    def call(self, fname: str, args: list) -> Any:
        if any(a is None for a in args):
            raise Null()
        (n,) = args
        if fname in ("alexander_at", "jones_at"):
            return _evaluate_poly(self.polys.get(fname[:-3]), n)
        if isinstance(n, bool) or not isinstance(n, int):
            raise ClaimError(f"{fname} needs an integer modulus, got {n!r}")
        entry = (self.colorings or {}).get(n)
        if entry is None:
            raise Null()
        count, fewest = entry
        if fname == "colorings":
            if count is None:
                raise Null()
            return count
        if fname == "colorable":
            if count is None:
                raise Null()
            return count > n
        if fewest is None:
            raise Null()
        return fewest


def _evaluate_poly(text: Any, x: Any) -> Any:
    if text is None:
        raise Null()
    try:
        terms = json.loads(text) if isinstance(text, str) else text
        pairs = [(Fraction(str(e)), int(str(c))) for e, c in terms]
    except (ValueError, TypeError) as err:
        raise ClaimError(f"stored polynomial is not in the JSON pair form: {str(text)[:40]!r}") from err
    if isinstance(x, bool) or not isinstance(x, (int, Fraction)):
        raise ClaimError(f"polynomial evaluation needs a number, got {x!r}")
    x = Fraction(x)
    total = Fraction(0)
    for e, c in pairs:
        if e.denominator != 1:
            raise Null()
        if x == 0 and e < 0:
            raise Null()
        total += c * x ** int(e)
    return int(total) if total.denominator == 1 else total


def census_rows(census: Census, expressions: list[Expression], *, family: Optional[str] = None) -> list[tuple[dict, RowEnv]]:
    """Rows of ``diagrams`` (optionally one family) as (info, environment) pairs.

    Only the columns the expressions read are converted.  ``info`` holds ``row_id``,
    ``notation``, ``family`` and ``params`` for reporting.

    Raises
    ------
    ClaimError
        If an expression reads a name that is neither a column nor a parameter.
    """
    df = census.diagrams
    if df is None or len(df) == 0:
        return []
    if family is not None:
        df = df[df["family"] == family]
    names = set().union(*[e.names for e in expressions]) if expressions else set()
    functions = set().union(*[e.row_functions for e in expressions]) if expressions else set()
    params = [parse_params(t) for t in df["params"].tolist()] if "params" in df.columns else [{}] * len(df)
    param_names = set().union(*[p.keys() for p in params]) if params else set()
    known = set(param_names) | set(df.columns) | set(ALIASES)
    for e in expressions:
        e.check_names(known)
    columns = {}
    for name in sorted(names - param_names):
        columns[name] = _column(df, ALIASES.get(name, name))
    polys = {}
    for fname in functions & {"alexander_at", "jones_at"}:
        col = fname[:-3]
        polys[col] = [_plain(v) for v in df[col].tolist()] if col in df.columns else [None] * len(df)
    colorings = None
    if functions & {"colorable", "colorings", "min_colors"}:
        moduli = [e.row_function_moduli for e in expressions if e.row_functions]
        wanted = None if any(m is None for m in moduli) else set().union(*moduli)
        colorings = _colorings_index(census, set(_plain(v) for v in df["row_id"].tolist()), wanted)
    row_ids = [_plain(v) for v in df["row_id"].tolist()]
    notations = [_plain(v) for v in df["notation"].tolist()] if "notation" in df.columns else [None] * len(df)
    families = [_plain(v) for v in df["family"].tolist()] if "family" in df.columns else [None] * len(df)
    out = []
    for i, rid in enumerate(row_ids):
        values = {name: col[i] for name, col in columns.items()}
        for k, v in params[i].items():
            if k in names:
                values[k] = _param_value(v)
        env = RowEnv(values, colorings.get(rid, {}) if colorings is not None else None,
                     {k: v[i] for k, v in polys.items()})
        info = {"row_id": rid, "notation": notations[i], "family": families[i], "params": params[i]}
        out.append((info, env))
    return out


def _colorings_index(census: Census, row_ids: set, moduli: Optional[set]) -> dict:
    """row_id -> {modulus: (count, min_colors)} for the given rows (and moduli, if known)."""
    df = census.colorings
    index: dict = {}
    if df is None or len(df) == 0:
        return index
    if moduli is not None:
        df = df[df["modulus"].isin(sorted(moduli))]
    if len(row_ids) < len(census.diagrams):
        df = df[df["row_id"].isin(sorted(row_ids))]
    counts = _column(df, "count") if "count" in df.columns else [None] * len(df)
    fewest = [_plain(v) for v in df["min_colors"].tolist()] if "min_colors" in df.columns else [None] * len(df)
    for rid, n, c, m in zip(df["row_id"].tolist(), df["modulus"].tolist(), counts, fewest):
        index.setdefault(_plain(rid), {})[_plain(n)] = (c, m)
    return index


@dataclass
class ClaimResult:
    """Outcome of a claim over the selected rows."""

    claim: str
    family: Optional[str]
    where: Optional[str]
    selected: int = 0
    held: int = 0
    undecided: int = 0
    where_undecided: int = 0
    counterexamples: list = field(default_factory=list)
    n_counterexamples: int = 0

    @property
    def exit_code(self) -> int:
        if self.n_counterexamples:
            return 1
        return 2 if self.held == 0 else 0


def check_claim(census: Census | str | Path, claim: str, *, family: Optional[str] = None,
                where: Optional[str] = None, limit: int = 10) -> ClaimResult:
    """Test ``claim`` on every selected row of a census.

    Both expressions are parsed and validated before the census is opened, so a refused
    construct never touches any data.

    Returns
    -------
    ClaimResult
        Counts of selected/held/undecided rows and the first ``limit`` counterexamples
        (each with ``row_id``, ``notation``, ``family``, ``params`` and ``values`` of the
        names the claim reads).

    Raises
    ------
    ClaimError
        For a refused construct, an unknown name, or a claim that is not true/false.
    """
    claim_expr = compile_expression(claim, what="claim")
    where_expr = compile_expression(where, what="--where") if where is not None else None
    if not isinstance(census, Census):
        census = open_census(census)
    exprs = [claim_expr] + ([where_expr] if where_expr else [])
    result = ClaimResult(claim=claim_expr.text, family=family, where=where)
    for info, env in census_rows(census, exprs, family=family):
        if where_expr is not None:
            try:
                keep = where_expr.evaluate(env)
            except Null:
                result.where_undecided += 1
                continue
            if not isinstance(keep, bool):
                raise ClaimError(f"--where must be true or false, got {keep!r} on row {info['row_id']}")
            if not keep:
                continue
        result.selected += 1
        try:
            verdict = claim_expr.evaluate(env)
        except Null:
            result.undecided += 1
            continue
        if not isinstance(verdict, bool):
            raise ClaimError(f"claim must be true or false (a comparison), got {verdict!r} on row {info['row_id']}")
        if verdict:
            result.held += 1
        else:
            result.n_counterexamples += 1
            if len(result.counterexamples) < limit:
                shown = {n: env.values.get(n) for n in sorted(claim_expr.names)}
                result.counterexamples.append({**info, "values": shown})
    return result


def _show(v: Any) -> str:
    if isinstance(v, tuple):
        return "(" + ", ".join(str(x) for x in v) + ")"
    return "null" if v is None else str(v)


def format_result(r: ClaimResult) -> str:
    """The readable summary printed by ``knotledger check``."""
    scope = []
    if r.family:
        scope.append(f"family = {r.family}")
    if r.where:
        scope.append(f"where {r.where}")
    lines = [f"claim: {r.claim}",
             f"selected: {r.selected} rows" + (f" ({'; '.join(scope)})" if scope else "")]
    if r.where_undecided:
        lines.append(f"  not selected: {r.where_undecided} rows where --where was undecided (null)")
    lines += [f"held: {r.held}",
              f"undecided: {r.undecided} (a null value in the claim)",
              f"counterexamples: {r.n_counterexamples}"]
    for c in r.counterexamples:
        vals = ", ".join(f"{k}={_show(v)}" for k, v in c["values"].items())
        params = json.dumps(c["params"], separators=(",", ":"))
        lines.append(f"  row {c['row_id']} [{c['family']} {params}] {c['notation']}  {vals}")
    if r.n_counterexamples > len(r.counterexamples):
        lines.append(f"  ... and {r.n_counterexamples - len(r.counterexamples)} more")
    if r.selected == 0:
        lines.append("no row selected")
    elif r.held == 0 and not r.n_counterexamples:
        lines.append("no row decided (every selected row used a null value)")
    elif not r.n_counterexamples:
        lines.append("verdict: held on every decided row")
    else:
        lines.append("verdict: FALSE (counterexamples above)")
    return "\n".join(lines) + "\n"


def language_help() -> str:
    """A short reference of the expression language (printed by ``check --help``)."""
    from .safe_expr import FUNCTIONS, ROW_FUNCTIONS
    funcs = "; ".join(f"{n}: {FUNCTIONS[n][3]}" for n in sorted(FUNCTIONS))
    rows = "; ".join(f"{ROW_FUNCTIONS[n][2]}" for n in sorted(ROW_FUNCTIONS))
    return ("Expressions: integers, strings, True/False, tuples; names of family parameters (p, q, p1.., "
            "alpha, beta, t1..) and diagrams columns (determinant, crossings, components, writhe, "
            "signature, family, chirality, factors = invariant factors as a list, ...); + - * / // % ** "
            "(exact; / gives a fraction), comparisons (chained), in, and/or/not, X if C else Y. "
            f"Functions: {funcs}. Row functions: {rows}. Anything else (attribute access, subscripts, "
            "imports, lambdas, comprehensions, dunder names, other calls) is refused. A null value used "
            "while evaluating makes the row undecided. Exit status: 0 held, 1 counterexample, 2 no row "
            "selected/decided or bad input.")


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.epilog = language_help()
    parser.add_argument("directory", metavar="DIR", help="census directory")
    parser.add_argument("--claim", required=True, metavar="EXPR",
                        help="formula to test on every selected row, e.g. 'determinant == alpha'")
    parser.add_argument("--family", metavar="KIND", help="only rows of this family (spec kind)")
    parser.add_argument("--where", metavar="EXPR", help="only rows where this expression is true")
    parser.add_argument("--limit", type=int, default=10, metavar="N",
                        help="counterexamples to list (default 10)")


def main(args: argparse.Namespace) -> int:
    result = check_claim(args.directory, args.claim, family=args.family, where=args.where,
                         limit=max(0, args.limit))
    sys.stdout.write(format_result(result))
    return result.exit_code
