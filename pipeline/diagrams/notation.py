"""Parse and format diagram strings ``KIND:ARGS`` (README.md, contract).

=================================  ================================================
``pd:[[1,5,2,4],[3,1,4,6],...]``   PD code (JSON); ``pd:[...] loops=k`` adds k free loops
``dt:4 6 2``                       Dowker-Thistlethwaite code of a knot
``braid:1,1,1``                    closure of a braid word (i = σ_i, -i = σ_i⁻¹)
``torus:p,q``                      torus knot/link T(p, q)
``pretzel:p1,p2,...``              pretzel link P(p1, ..., pk)
``rational:α/β``                   two-bridge link b(α, β)
``conway:a1 a2 ... an``            rational link with fraction a1 + 1/(a2 + ...)
``montesinos:β1/α1,...,βr/αr``     Montesinos link; an integer n means n/1
``alt:N:I``                        the I-th prime alternating knot with N crossings
``altlink:N:I``                    the I-th prime alternating link (>= 2 components)
                                   with N crossings (links numbered on their own)
=================================  ================================================

``alt`` / ``altlink`` follow the documented order of
:mod:`pipeline.diagrams.families.alternating` (1 <= N <= 16; the index is checked
when the diagram is built, since that needs the enumeration).

Every parse error is a :class:`~pipeline.errors.NotationError` with a one-line
reason naming the offending token.
"""

from __future__ import annotations

import json
import re
from dataclasses import dataclass
from fractions import Fraction
from typing import Callable

from .diagram import Diagram
from ..errors import DiagramError, NotationError

__all__ = ["parse", "parse_notation", "Notation", "format_pd", "KINDS", "split_notation"]

MAX_CROSSINGS = 100_000  # refuse absurd parameters before building anything


def _ints(kind: str, text: str, *, sep: str = r"[,\s]+", allow_empty: bool = False) -> list[int]:
    text = text.strip()
    if not text:
        if allow_empty:
            return []
        raise NotationError(f"{kind}: no arguments given")
    out = []
    for tok in re.split(sep, text):
        if tok == "":
            raise NotationError(f"{kind}: empty entry in {text!r}")
        if not re.fullmatch(r"[+-]?\d+", tok):
            raise NotationError(f"{kind}: {tok!r} is not an integer")
        if len(tok.lstrip("+-")) > 9:
            raise NotationError(f"{kind}: {tok!r} is too large")
        out.append(int(tok))
    return out


def _check_size(kind: str, n: int) -> None:
    if n > MAX_CROSSINGS:
        raise NotationError(f"{kind}: the diagram would have {n} crossings (limit {MAX_CROSSINGS})")


def _fraction(kind: str, tok: str) -> Fraction:
    m = re.fullmatch(r"\s*([+-]?\d+)\s*(?:/\s*([+-]?\d+))?\s*", tok)
    if not m:
        raise NotationError(f"{kind}: {tok.strip()!r} is not an integer or a fraction β/α")
    num, den = int(m.group(1)), int(m.group(2) or 1)
    if den == 0:
        raise NotationError(f"{kind}: {tok.strip()!r} has denominator 0")
    return Fraction(num, den)


def _read_pd(args: str) -> tuple:
    m = re.fullmatch(r"\s*(.*?)\s*(?:loops\s*=\s*(\S+))?\s*", args, re.S)
    body, loops = m.group(1), m.group(2)
    try:
        data = json.loads(body)
    except (ValueError, RecursionError) as err:
        raise NotationError(f"pd: {body[:40]!r} is not a JSON list of 4-lists ({err.__class__.__name__})") from err
    if not isinstance(data, list):
        raise NotationError(f"pd: expected a JSON list of crossings, got {type(data).__name__}")
    free = 0
    if loops is not None:
        if not re.fullmatch(r"\d+", loops):
            raise NotationError(f"pd: loops={loops!r} is not a non-negative integer")
        free = int(loops)
    _check_size("pd", len(data))
    return (_frozen(data), free)


def _frozen(data: list):
    """A code of flat crossing lists as tuples (so a Notation is hashable); anything
    malformed is kept as read, for :meth:`Diagram.from_pd` to name the fault."""
    if all(isinstance(x, list) and not any(isinstance(v, list) for v in x) for x in data):
        return tuple(tuple(x) for x in data)
    return data


def _read_braid(args: str) -> tuple:
    word = _ints("braid", args, allow_empty=False)
    _check_size("braid", len(word))
    return tuple(word)


def _read_torus(args: str) -> tuple:
    vals = _ints("torus", args)
    if len(vals) != 2:
        raise NotationError(f"torus: expected two parameters p,q, got {len(vals)}")
    p, q = vals
    _check_size("torus", abs(q) * max(abs(p) - 1, 0))
    return (p, q)


def _read_pretzel(args: str) -> tuple:
    vals = _ints("pretzel", args)
    _check_size("pretzel", sum(map(abs, vals)))
    return tuple(vals)


def _read_rational(args: str) -> tuple:
    from .families import two_bridge
    m = re.fullmatch(r"\s*([+-]?\d+)\s*/\s*([+-]?\d+)\s*", args)
    if not m:
        raise NotationError(f"rational: {args.strip()!r} is not of the form α/β")
    alpha, beta = int(m.group(1)), int(m.group(2))
    _check_size("rational", sum(map(abs, two_bridge.continued_fraction(alpha, beta))))
    return (alpha, beta)


def _read_conway(args: str) -> tuple:
    terms = _ints("conway", args)
    _check_size("conway", sum(map(abs, terms)))
    return tuple(terms)


def _read_montesinos(args: str) -> tuple:
    from .families import two_bridge
    if not args.strip():
        raise NotationError("montesinos: no tangles given")
    fr = [_fraction("montesinos", tok) for tok in args.split(",")]
    _check_size("montesinos", sum(sum(map(abs, two_bridge.continued_fraction(f.numerator, f.denominator))) for f in fr))
    return tuple(fr)


def _read_dt(args: str) -> tuple:
    code = _ints("dt", args)
    _check_size("dt", len(code))
    return tuple(code)


# --- begin: alt / altlink (issue 11) ---
def _read_alt(kind: str, args: str) -> tuple:
    from .families import alternating
    m = re.fullmatch(r"\s*(\d+)\s*:\s*(\d+)\s*", args)
    if not m:
        raise NotationError(f"{kind}: {args.strip()[:40]!r} is not N:I (crossings and a 1-based index)")
    n, i = int(m.group(1)), int(m.group(2))
    if not alternating.MIN_CROSSINGS <= n <= alternating.MAX_CROSSINGS:
        raise NotationError(f"{kind}: crossings {n} is outside [{alternating.MIN_CROSSINGS}, "
                            f"{alternating.MAX_CROSSINGS}]")
    if i < 1:
        raise NotationError(f"{kind}: index {i} must be at least 1")
    return (n, i)


def _build_alt(kind: str, n: int, i: int) -> Diagram:
    from .families import alternating
    if kind == "alt":
        return alternating.diagram(n, i)
    knots = len(alternating.codes(n))
    links = len(alternating.codes(n, links=True)) - knots
    if i > links:
        raise NotationError(f"altlink: index {i} is outside [1, {links}] for {n} crossings")
    return alternating.diagram(n, knots + i, links=True)
# --- end: alt / altlink ---


def _build(kind: str, args: tuple) -> Diagram:
    from . import dt
    if kind in ("alt", "altlink"):
        return _build_alt(kind, *args)
    from .families import braid, montesinos, pretzel, torus, two_bridge
    if kind == "pd":
        data, free = args
        return Diagram.from_pd(data, free_loops=free)
    if kind == "dt":
        return dt.diagram(list(args))
    if kind == "braid":
        return braid.diagram(list(args))
    if kind == "torus":
        return torus.diagram(*args)
    if kind == "pretzel":
        return pretzel.diagram(list(args))
    if kind == "rational":
        return two_bridge.diagram(*args)
    if kind == "conway":
        return two_bridge.conway_diagram(list(args))
    return montesinos.diagram(list(args))


_READERS: dict[str, Callable[[str], tuple]] = {
    "pd": _read_pd,
    "dt": _read_dt,
    "braid": _read_braid,
    "torus": _read_torus,
    "pretzel": _read_pretzel,
    "rational": _read_rational,
    "conway": _read_conway,
    "montesinos": _read_montesinos,
    "alt": lambda args: _read_alt("alt", args),
    "altlink": lambda args: _read_alt("altlink", args),
}


@dataclass(frozen=True)
class Notation:
    """A parsed diagram string: its kind and its arguments as numbers.

    ``args`` by kind: ``pd`` (crossings as tuples, free loops); ``dt``, ``braid``,
    ``pretzel``, ``conway``: the integers; ``torus``: (p, q); ``rational``: (α, β);
    ``alt``, ``altlink``: (N, I);
    ``montesinos``: the tangle fractions β_i/α_i (:class:`~fractions.Fraction`).
    Build one with :func:`parse_notation`; :meth:`diagram` realises it.

    Examples
    --------
    >>> parse_notation("montesinos:1/3, -2").args
    (Fraction(1, 3), Fraction(-2, 1))
    >>> parse_notation("torus:2,3").diagram().writhe
    3
    """

    kind: str
    args: tuple

    def diagram(self) -> Diagram:
        """The :class:`Diagram` this notation describes (``parse(text)`` is
        ``parse_notation(text).diagram()``).

        Raises
        ------
        NotationError
            When the arguments have no diagram (e.g. a PD code that is not planar).
        """
        return _translating(self.kind, _text_of(self), lambda: _build(self.kind, self.args))


def _text_of(n: Notation) -> str:
    if n.kind == "pd":
        return json.dumps([list(x) if isinstance(x, tuple) else x for x in n.args[0]])
    if n.kind == "rational":
        return f"{n.args[0]}/{n.args[1]}"
    if n.kind in ("alt", "altlink"):
        return f"{n.args[0]}:{n.args[1]}"
    return ",".join(map(str, n.args))


def _translating(kind: str, shown: str, make: Callable):
    """Run ``make`` and turn a stray exception into a one-line NotationError."""
    try:
        return make()
    except NotationError:
        raise
    except RecursionError as err:
        raise NotationError(f"{kind}: input nested too deeply") from err
    except (ValueError, TypeError, OverflowError, KeyError, IndexError) as err:
        raise NotationError(f"{kind}: could not read {shown.strip()[:40]!r} ({err})") from err


KINDS: dict[str, Callable[[str], Diagram]] = {
    kind: (lambda args, kind=kind: _build(kind, _READERS[kind](args))) for kind in _READERS}


def split_notation(text: str) -> tuple[str, str]:
    """Split ``KIND:ARGS``; raise NotationError naming the kind if it is unknown."""
    if not isinstance(text, str):
        raise NotationError(f"diagram: expected a string KIND:ARGS, got {type(text).__name__}")
    kind, sep, args = text.strip().partition(":")
    kind = kind.strip().lower()
    if not sep:
        raise NotationError(f"diagram: {text.strip()[:40]!r} has no KIND: prefix (one of {', '.join(KINDS)})")
    if kind not in KINDS:
        raise NotationError(f"diagram: unknown kind {kind!r} (one of {', '.join(KINDS)})")
    return kind, args


def parse_notation(text: str) -> Notation:
    """Read a diagram string ``KIND:ARGS`` into a typed :class:`Notation` (no diagram built).

    Every size and syntax check of :func:`parse` happens here, so the tangle routes and
    the normal forms can use the numbers without building the diagram.

    Raises
    ------
    NotationError
        With a one-line reason naming the offending token; never anything else.
    """
    kind, args = split_notation(text)
    return Notation(kind, _translating(kind, args, lambda: _READERS[kind](args)))


def parse(text: str) -> Diagram:
    """Parse a diagram string ``KIND:ARGS`` into a :class:`Diagram`.

    Raises
    ------
    NotationError
        With a one-line reason naming the offending token; never anything else.

    Examples
    --------
    >>> parse("torus:2,3").writhe
    3
    """
    kind, args = split_notation(text)
    return _translating(kind, args, lambda: _build(kind, _READERS[kind](args)))


def format_pd(diagram: Diagram) -> str:
    """Format a diagram back to ``pd:`` notation."""
    return diagram.to_notation()
