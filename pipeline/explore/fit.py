"""``knotledger fit DIR --family KIND --target COLUMN``: propose a closed formula.

Exact polynomial fitting in the family parameters (the core is
:mod:`pipeline.explore.polyfit`).  For degree d = 0, 1, ..., D the
target is matched against every polynomial with rational coefficients in the monomials
of total degree <= d: a set of data points with linearly independent monomial vectors
and the monomials the data separates are chosen by exact row reduction over Q
(:class:`sympy.polys.matrices.DomainMatrix`), the square system is solved exactly, and
the polynomial is then verified on *every* row with exact integer/fraction arithmetic.
The first degree whose polynomial holds on every row -- and is over-determined, i.e.
checked on more points than it has unknowns -- is reported.

Since |Q| is not a polynomial (the pretzel determinant |p1p2 + p2p3 + p1p3|), when no
polynomial fits, the square of the target is fitted at degrees 0..2D; an exact fit that
factors as c·Q² (sympy's ``factor_list``) is reported as |Q| and re-verified row by row.

``--by-sign`` likewise fits each sign class (|p| is p or -p there: the crossing
number of a pretzel diagram is |p1| + |p2| + |p3|).  ``--by-parity`` fits each parity class of the parameters separately (the torus knot
determinant is q for p even, p for q even and 1 for p, q both odd; Rolfsen, *Knots and
Links*, ch. 7).  When the best polynomial of a class fails on a few rows it is still
printed with its support and the failing rows (a robust refit ignores the failing
points once or twice).

The target is a column of ``diagrams`` or any expression of the safe language of
:mod:`pipeline.explore.safe_expr` (e.g. ``abs(signature)``); ``--where`` filters rows likewise.
"""

from __future__ import annotations

import argparse
import sys
from collections import Counter, defaultdict
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any, Optional

from ..census.reader import Census, open_census
from .claims import census_rows
from ..errors import ClaimError, QueryError
from .polyfit import PolynomialFit, abs_root_failing, fit_polynomial, square_root
from .safe_expr import Null, compile_expression

__all__ = ["PolynomialFit", "ClassFit", "fit_polynomial", "fit_family", "add_arguments", "main"]


@dataclass
class ClassFit:
    """The outcome for one parity class (or all rows)."""

    label: str
    rows: list                   # info dicts of the fitted rows
    fit: Optional[PolynomialFit]
    squared: bool = False        # the fit is for target**2
    root: Any = None             # sympy Q with target = |Q|, when target**2 = Q**2
    failing: list = field(default_factory=list)   # info dicts of rows where the formula fails

    @property
    def exact(self) -> bool:
        return self.fit is not None and self.fit.points > self.fit.unknowns and not self.failing

    def formula(self, target: str) -> str:
        if self.fit is None:
            return "no rows"
        if self.root is not None:
            return f"{target} = |{self.root}|"
        lhs = f"{target}^2" if self.squared else target
        return f"{lhs} = {self.fit.expr()}"


def _fit_class(label: str, names: list, infos: list, points: list, values: list, max_degree: int) -> ClassFit:
    fit = fit_polynomial(points, values, names, max_degree=max_degree, robust=False)
    if fit is not None and fit.exact:
        return ClassFit(label, infos, fit)
    squares = [v * v for v in values]
    sq = fit_polynomial(points, squares, names, max_degree=2 * max_degree, robust=False)
    if sq is not None and sq.exact:
        root = square_root(sq)
        if root is not None:
            failing = abs_root_failing(root, names, points, values)
            if not failing:
                return ClassFit(label, infos, sq, squared=True, root=root)
        return ClassFit(label, infos, sq, squared=True)
    fit = fit_polynomial(points, values, names, max_degree=max_degree, robust=True)
    return ClassFit(label, infos, fit, failing=[infos[i] for i in (fit.failing if fit else [])])


def fit_family(census: Census | str | Path, family: str, target: str, *, max_degree: int = 3,
               by_parity: bool = False, by_sign: bool = False, where: Optional[str] = None) -> tuple[list[str], list[ClassFit], int]:
    """Fit ``target`` over the integer parameters of ``family``.

    Returns
    -------
    (names, classes, skipped)
        Parameter names, one :class:`ClassFit` per parity class and/or sign class of
        the parameters (one class "all rows" without ``by_parity``/``by_sign``), and the number of rows skipped (target null or a
        non-integer parameter).

    Raises
    ------
    ClaimError
        For a bad target/where expression; QueryError if the family has no rows or no
        integer parameters.
    """
    target_expr = compile_expression(target, what="--target")
    where_expr = compile_expression(where, what="--where") if where else None
    if not isinstance(census, Census):
        census = open_census(census)
    exprs = [target_expr] + ([where_expr] if where_expr else [])
    rows = census_rows(census, exprs, family=family)
    if not rows:
        raise QueryError(f"fit: no rows of family {family!r}")
    keysets = Counter(tuple(sorted(k for k, v in info["params"].items()
                                   if isinstance(v, int) and not isinstance(v, bool))) for info, _ in rows)
    names = list(max(keysets, key=lambda k: (keysets[k], k)))
    if not names:
        raise QueryError(f"fit: family {family!r} has no integer parameters")
    classes: dict = defaultdict(lambda: ([], [], []))
    skipped = 0
    for info, env in rows:
        if where_expr is not None:
            try:
                if where_expr.evaluate(env) is not True:
                    continue
            except Null:
                continue
        params = info["params"]
        if not all(isinstance(params.get(n), int) and not isinstance(params.get(n), bool) for n in names):
            skipped += 1
            continue
        try:
            value = target_expr.evaluate(env)
        except Null:
            skipped += 1
            continue
        if isinstance(value, bool) or not isinstance(value, int):
            raise ClaimError(f"--target must be an integer, got {value!r} on row {info['row_id']}")
        point = tuple(params[n] for n in names)
        key = (tuple(x % 2 for x in point) if by_parity else ()) + (
            tuple((x > 0) - (x < 0) for x in point) if by_sign else ())
        infos, points, values = classes[key]
        infos.append(info)
        points.append(point)
        values.append(value)
    out = []
    for key in sorted(classes):
        infos, points, values = classes[key]
        label = _class_label(names, key, by_parity, by_sign)
        out.append(_fit_class(label, names, infos, points, values, max_degree))
    return names, out, skipped


def _class_label(names: list, key: tuple, by_parity: bool, by_sign: bool) -> str:
    parts = []
    k = len(names)
    if by_parity:
        parts += [f"{n} {'odd' if b else 'even'}" for n, b in zip(names, key[:k])]
    if by_sign:
        signs = key[k:] if by_parity else key
        parts += [f"{n} {'>' if s > 0 else '<' if s < 0 else '='} 0" for n, s in zip(names, signs)]
    return ", ".join(parts) or "all rows"


def format_fits(family: str, target: str, names: list, classes: list, skipped: int, *, limit: int = 10) -> str:
    """The readable summary printed by ``knotledger fit``."""
    n = sum(len(c.rows) for c in classes)
    lines = [f"fit {target} for family {family}: parameters {', '.join(names)}; {n} rows"
             + (f" ({skipped} skipped: null target or non-integer parameter)" if skipped else "")]
    for c in classes:
        f = c.fit
        lines.append(f"[{c.label}] {len(c.rows)} rows")
        if f is None:
            lines.append("  no rows")
            continue
        kind = "exact" if c.exact else "best candidate (NOT exact)"
        lines.append(f"  {kind}: {c.formula(target)}")
        note = "" if f.separated else "; the data does not separate every monomial of this degree"
        held = len(c.rows) - len(c.failing)
        lines.append(f"  degree {f.degree}{' in ' + target + '^2' if c.squared else ''}; determined by "
                     f"{f.unknowns} point{'s' if f.unknowns != 1 else ''}, support {held} of {len(c.rows)} rows ({f.points} distinct "
                     f"parameter points){note}")
        if f.points <= f.unknowns and not c.failing:
            lines.append("  not verified: as many unknowns as distinct points (add rows or lower --max-degree)")
        if c.failing:
            lines.append(f"  failing rows: {len(c.failing)}")
            for info in c.failing[:limit]:
                lines.append(f"    row {info['row_id']} {info['notation']} params {info['params']}")
        elif c.exact:
            lines.append("  failing rows: none")
    return "\n".join(lines) + "\n"


def add_arguments(parser: argparse.ArgumentParser) -> None:
    parser.add_argument("directory", metavar="DIR", help="census directory")
    parser.add_argument("--family", required=True, metavar="KIND", help="family (spec kind) to fit")
    parser.add_argument("--target", required=True, metavar="COLUMN",
                        help="integer column (or safe expression) to express in the parameters")
    parser.add_argument("--max-degree", type=int, default=3, metavar="D",
                        help="largest total degree tried (default 3; squares up to 2D)")
    parser.add_argument("--by-parity", action="store_true", help="fit each parity class of the parameters")
    parser.add_argument("--by-sign", action="store_true",
                        help="fit each sign class of the parameters (e.g. crossings = |p1| + |p2| + |p3|)")
    parser.add_argument("--where", metavar="EXPR", help="only rows where this expression is true")
    parser.add_argument("--limit", type=int, default=10, metavar="N", help="failing rows to list (default 10)")


def main(args: argparse.Namespace) -> int:
    if not 0 <= args.max_degree <= 8:
        raise QueryError(f"fit: --max-degree {args.max_degree} out of range (0..8)")
    names, classes, skipped = fit_family(args.directory, args.family, args.target,
                                         max_degree=args.max_degree, by_parity=args.by_parity,
                                         by_sign=args.by_sign,
                                         where=args.where)
    sys.stdout.write(format_fits(args.family, args.target, names, classes, skipped, limit=args.limit))
    return 0 if all(c.exact for c in classes) else 1
