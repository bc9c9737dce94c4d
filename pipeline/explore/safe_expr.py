"""The small safe expression language of ``knotledger check`` and ``--where`` filters.

An expression is parsed with Python's :mod:`ast` (``mode="eval"``), every node is checked
against a whitelist *before any data is read*, and the tree is compiled into plain
closures.  Nothing is ever passed to ``eval`` or ``exec``.

Allowed
-------
* literals: integers, ``True``/``False``, strings, tuples/lists of these (for ``in``);
  no float literals (all arithmetic is exact: write 1/3, which is an exact fraction);
* names: family parameters (``p``, ``q``, ``p1``…, ``alpha``, ``beta``, ``t1``…) and
  table columns (``determinant``, ``crossings``, ``components``, ``writhe``,
  ``signature``, ``family``, ``chirality``, ``factors`` = ``invariant_factors`` …);
* arithmetic ``+ - * / // % **`` and unary ``-``/``+``; ``/`` gives an exact fraction;
  ``**`` needs an integer exponent of at most 4096 and a result of at most 10^6 bits;
* comparisons, chained (``0 < p < q``), ``in`` / ``not in``; ``and``, ``or``, ``not``;
  ``X if C else Y``;
* calls of the whitelisted functions in :data:`FUNCTIONS` (positional arguments only).

Everything else -- attribute access, subscripts, imports, lambdas, comprehensions,
f-strings, ``:=``, starred or keyword arguments, dunder names, calls of other names,
bit operators, float literals -- raises :class:`ClaimError` naming the construct.

Nulls: when a null value (a missing column value, a modulus outside the colourings
table, a division by zero) is *used* while evaluating, the whole expression is
undecided for that row (``and``/``or``/``if`` short-circuit as in Python, so an unused
branch does not matter).
"""

from __future__ import annotations

import ast
from fractions import Fraction
from typing import Any, Callable, Iterable

from ..errors import ClaimError
from .safe_functions import FUNCTIONS, ROW_FUNCTIONS, Null
from .safe_functions import as_number as _num
from .safe_functions import normalise as _norm

__all__ = ["Null", "FUNCTIONS", "ROW_FUNCTIONS", "Expression", "compile_expression"]

MAX_LENGTH = 5000
MAX_EXPONENT = 4096
MAX_BITS = 1_000_000

_REFUSED = {
    ast.Attribute: "attribute access (.name)", ast.Subscript: "subscript ([...])",
    ast.Lambda: "lambda", ast.ListComp: "comprehension", ast.SetComp: "comprehension",
    ast.DictComp: "comprehension", ast.GeneratorExp: "comprehension",
    ast.JoinedStr: "f-string", ast.FormattedValue: "f-string", ast.NamedExpr: "assignment expression (:=)",
    ast.Starred: "starred argument (*x)", ast.Dict: "dict literal", ast.Set: "set literal",
    ast.Await: "await", ast.Yield: "yield", ast.YieldFrom: "yield", ast.Slice: "slice",
    ast.keyword: "keyword argument",
}

_BINOPS = {ast.Add: "+", ast.Sub: "-", ast.Mult: "*", ast.Div: "/", ast.FloorDiv: "//",
           ast.Mod: "%", ast.Pow: "**"}
_CMPOPS = {ast.Eq: "==", ast.NotEq: "!=", ast.Lt: "<", ast.LtE: "<=", ast.Gt: ">",
           ast.GtE: ">=", ast.In: "in", ast.NotIn: "not in"}
_OP_NAMES = {ast.LShift: "<<", ast.RShift: ">>", ast.BitOr: "|", ast.BitXor: "^",
             ast.BitAnd: "&", ast.MatMult: "@", ast.Invert: "~", ast.Is: "is", ast.IsNot: "is not"}
_STATEMENTS = {ast.Import: "import statement", ast.ImportFrom: "import statement",
               ast.Assign: "assignment", ast.AugAssign: "assignment", ast.AnnAssign: "assignment",
               ast.FunctionDef: "function definition", ast.ClassDef: "class definition",
               ast.Delete: "del statement", ast.For: "for loop", ast.While: "while loop",
               ast.With: "with statement", ast.Raise: "raise statement", ast.Try: "try statement",
               ast.Global: "global statement", ast.If: "if statement", ast.Return: "return statement"}


def _parse(text: str, what: str) -> ast.Expression:
    if not isinstance(text, str) or not text.strip():
        raise ClaimError(f"{what}: empty expression")
    if len(text) > MAX_LENGTH:
        raise ClaimError(f"{what}: expression longer than {MAX_LENGTH} characters")
    try:
        return ast.parse(text.strip(), mode="eval")
    except SyntaxError as err:
        try:
            module = ast.parse(text.strip(), mode="exec")
        except (SyntaxError, RecursionError, ValueError):
            module = None
        if module is not None and module.body:
            stmt = module.body[0]
            name = _STATEMENTS.get(type(stmt), f"{type(stmt).__name__} statement")
            raise ClaimError(f"{what}: refused construct: {name} (only an expression is allowed)") from err
        col = f" at column {err.offset}" if err.offset else ""
        raise ClaimError(f"{what}: syntax error{col}: {err.msg}") from err
    except (RecursionError, ValueError, MemoryError) as err:
        raise ClaimError(f"{what}: expression too deeply nested or malformed") from err


def _validate(tree: ast.Expression, what: str) -> tuple[set[str], set[str], set]:
    """Check every node; return (names used as values, functions called, row-function
    arguments that are integer literals -- None among them when one is not)."""
    names: set[str] = set()
    calls: set[str] = set()
    row_args: set = set()
    call_funcs = set()
    for node in ast.walk(tree):
        if isinstance(node, ast.Call):
            call_funcs.add(id(node.func))
    for node in ast.walk(tree):
        kind = type(node)
        if kind in _REFUSED:
            raise ClaimError(f"{what}: refused construct: {_REFUSED[kind]}")
        if isinstance(node, (ast.operator, ast.unaryop, ast.cmpop)) and kind in _OP_NAMES:
            raise ClaimError(f"{what}: refused construct: operator {_OP_NAMES[kind]}")
        if isinstance(node, ast.Name):
            if node.id.startswith("__") or node.id.endswith("__") or "__" in node.id:
                raise ClaimError(f"{what}: refused construct: dunder name {node.id!r}")
            if id(node) in call_funcs:
                continue
            if node.id in FUNCTIONS or node.id in ROW_FUNCTIONS:
                raise ClaimError(f"{what}: function {node.id!r} used without a call")
            names.add(node.id)
        elif isinstance(node, ast.Call):
            if not isinstance(node.func, ast.Name):
                kind_name = _REFUSED.get(type(node.func), f"call of a {type(node.func).__name__}")
                raise ClaimError(f"{what}: refused construct: {kind_name}")
            fname = node.func.id
            if fname.startswith("__") or "__" in fname:
                raise ClaimError(f"{what}: refused construct: dunder name {fname!r}")
            if fname in FUNCTIONS:
                lo, hi = FUNCTIONS[fname][0], FUNCTIONS[fname][1]
            elif fname in ROW_FUNCTIONS:
                lo, hi = ROW_FUNCTIONS[fname][0], ROW_FUNCTIONS[fname][1]
            else:
                raise ClaimError(f"{what}: refused construct: call of {fname!r} (not a whitelisted function; "
                                 f"allowed: {', '.join(sorted(FUNCTIONS) + sorted(ROW_FUNCTIONS))})")
            if node.keywords:
                raise ClaimError(f"{what}: refused construct: keyword argument")
            n = len(node.args)
            if n < lo or (hi is not None and n > hi):
                raise ClaimError(f"{what}: {fname} takes {lo if lo == hi else f'{lo} or more'} "
                                 f"argument{'s' if (hi or 2) != 1 else ''}, got {n}")
            calls.add(fname)
            if fname in ROW_FUNCTIONS:
                arg = node.args[0] if node.args else None
                value = _constant_int(arg)
                row_args.add(value)
        elif isinstance(node, ast.Constant):
            v = node.value
            if isinstance(v, float):
                raise ClaimError(f"{what}: refused construct: float literal {v!r} (exact arithmetic only; write 1/3)")
            if not isinstance(v, (bool, int, str)):
                raise ClaimError(f"{what}: refused construct: {type(v).__name__} literal")
        elif isinstance(node, (ast.Expression, ast.BinOp, ast.UnaryOp, ast.BoolOp, ast.Compare,
                               ast.IfExp, ast.Tuple, ast.List, ast.Load, ast.And, ast.Or, ast.Not,
                               ast.USub, ast.UAdd)) or kind in _BINOPS or kind in _CMPOPS:
            continue
        else:
            raise ClaimError(f"{what}: refused construct: {kind.__name__}")
    return names, calls, row_args


def _constant_int(node: Any) -> Any:
    """The integer value of a literal (possibly negated) argument node, else None."""
    if isinstance(node, ast.UnaryOp) and isinstance(node.op, ast.USub):
        inner = _constant_int(node.operand)
        return None if inner is None else -inner
    if isinstance(node, ast.Constant) and isinstance(node.value, int) and not isinstance(node.value, bool):
        return node.value
    return None


def _pow(a: Any, b: Any) -> Any:
    a, b = _num(a, "**"), _num(b, "**")
    if isinstance(b, Fraction):
        if b.denominator != 1:
            raise ClaimError(f"** needs an integer exponent, got {b}")
        b = int(b)
    if abs(b) > MAX_EXPONENT:
        raise ClaimError(f"** exponent {b} exceeds the bound {MAX_EXPONENT}")
    size = a.bit_length() if isinstance(a, int) else max(a.numerator.bit_length(), a.denominator.bit_length())
    if size * abs(b) > MAX_BITS:
        raise ClaimError(f"** result would exceed {MAX_BITS} bits")
    if b < 0:
        if a == 0:
            raise Null()
        return _norm(Fraction(1) / Fraction(a) ** (-b))
    return a ** b


def _div(a: Any, b: Any) -> Any:
    a, b = _num(a, "/"), _num(b, "/")
    if b == 0:
        raise Null()
    return _norm(Fraction(a) / Fraction(b))


def _floordiv(a: Any, b: Any) -> Any:
    a, b = _num(a, "//"), _num(b, "//")
    if b == 0:
        raise Null()
    return a // b


def _modop(a: Any, b: Any) -> Any:
    a, b = _num(a, "%"), _num(b, "%")
    if b == 0:
        raise Null()
    return _norm(a % b)


_ARITH: dict[type, Callable[[Any, Any], Any]] = {
    ast.Add: lambda a, b: _norm(_num(a, "+") + _num(b, "+")),
    ast.Sub: lambda a, b: _norm(_num(a, "-") - _num(b, "-")),
    ast.Mult: lambda a, b: _norm(_num(a, "*") * _num(b, "*")),
    ast.Div: _div, ast.FloorDiv: _floordiv, ast.Mod: _modop, ast.Pow: _pow,
}


def _compare(op: type, a: Any, b: Any) -> bool:
    if op is ast.Eq:
        return a == b
    if op is ast.NotEq:
        return a != b
    if op in (ast.In, ast.NotIn):
        if not isinstance(b, (tuple, list, str)):
            raise ClaimError(f"'in' needs a list on the right, got {type(b).__name__}")
        return (a in b) == (op is ast.In)
    if isinstance(a, str) != isinstance(b, str) or isinstance(a, (tuple, list)) or isinstance(b, (tuple, list)):
        raise ClaimError(f"cannot order {type(a).__name__} and {type(b).__name__}")
    return {ast.Lt: a < b, ast.LtE: a <= b, ast.Gt: a > b, ast.GtE: a >= b}[op]


def _truth(v: Any) -> bool:
    if isinstance(v, (tuple, list, str)):
        raise ClaimError(f"a {type(v).__name__} is not a truth value")
    return bool(v)


def _compile(node: ast.AST) -> Callable[[Any], Any]:
    """Compile a validated node into a closure env -> value (no eval/exec)."""
    if isinstance(node, ast.Expression):
        return _compile(node.body)
    if isinstance(node, ast.Constant):
        value = node.value
        return lambda env: value
    if isinstance(node, ast.Name):
        name = node.id
        return lambda env: env.value(name)
    if isinstance(node, (ast.Tuple, ast.List)):
        parts = [_compile(e) for e in node.elts]
        return lambda env: tuple(p(env) for p in parts)
    if isinstance(node, ast.UnaryOp):
        inner = _compile(node.operand)
        if isinstance(node.op, ast.Not):
            return lambda env: not _truth(inner(env))
        if isinstance(node.op, ast.USub):
            return lambda env: -_num(inner(env), "unary -")
        return lambda env: _num(inner(env), "unary +")
    if isinstance(node, ast.BinOp):
        left, right, fn = _compile(node.left), _compile(node.right), _ARITH[type(node.op)]
        return lambda env: fn(left(env), right(env))
    if isinstance(node, ast.BoolOp):
        parts = [_compile(v) for v in node.values]
        if isinstance(node.op, ast.And):
            return lambda env: all(_truth(p(env)) for p in parts)
        return lambda env: any(_truth(p(env)) for p in parts)
    if isinstance(node, ast.Compare):
        first = _compile(node.left)
        rest = [(type(op), _compile(c)) for op, c in zip(node.ops, node.comparators)]

        def cmp(env):
            a = first(env)
            for op, c in rest:
                b = c(env)
                if not _compare(op, a, b):
                    return False
                a = b
            return True
        return cmp
    if isinstance(node, ast.IfExp):
        test, body, other = _compile(node.test), _compile(node.body), _compile(node.orelse)
        return lambda env: body(env) if _truth(test(env)) else other(env)
    if isinstance(node, ast.Call):
        fname = node.func.id
        args = [_compile(a) for a in node.args]
        if fname in ROW_FUNCTIONS:
            return lambda env: env.call(fname, [a(env) for a in args])
        impl = FUNCTIONS[fname][2]
        return lambda env: impl(*[a(env) for a in args])
    raise ClaimError(f"refused construct: {type(node).__name__}")  # unreachable after _validate


class Expression:
    """A validated, compiled expression.

    Attributes
    ----------
    text : str
        The source text.
    names : frozenset[str]
        Parameter/column names the expression reads.
    row_functions : frozenset[str]
        Row functions it calls (``colorable``, ``colorings``, ...).
    """

    def __init__(self, text: str, *, what: str = "claim") -> None:
        tree = _parse(text, what)
        names, calls, row_args = _validate(tree, what)
        self.text = text.strip()
        self.what = what
        self.names = frozenset(names)
        self.row_functions = frozenset(c for c in calls if c in ROW_FUNCTIONS)
        #: the moduli row functions are called with, or None if some are not literals
        self.row_function_moduli = None if None in row_args else frozenset(row_args)
        try:
            self._fn = _compile(tree)
        except RecursionError as err:
            raise ClaimError(f"{what}: expression too deeply nested") from err

    def evaluate(self, env: Any) -> Any:
        """Value of the expression on one row; raises :class:`Null` when undecided.

        ``env`` provides ``value(name)`` (raising :class:`Null` for a null) and
        ``call(function, args)`` for :data:`ROW_FUNCTIONS`.
        """
        try:
            return self._fn(env)
        except RecursionError as err:
            raise ClaimError(f"{self.what}: expression too deeply nested") from err

    def check_names(self, known: Iterable[str]) -> None:
        """Raise :class:`ClaimError` if the expression reads a name not in ``known``."""
        known = set(known)
        unknown = sorted(self.names - known)
        if unknown:
            raise ClaimError(f"{self.what}: unknown name {unknown[0]!r} (known: {', '.join(sorted(known))})")


def compile_expression(text: str, *, what: str = "claim") -> Expression:
    """Parse, validate and compile ``text``; see the module docstring for the language.

    Raises
    ------
    ClaimError
        Naming the refused construct, e.g. ``claim: refused construct: lambda``.
    """
    return Expression(text, what=what)
