"""Census spec files (TOML) and the deterministic work list they describe.

A spec names families of diagrams and the census options (README.md, "Spec file")::

    [census]
    name = "harbour-street-pretzels"
    max_modulus = 16        # colourings counted for n = 2..max_modulus
    chunk_size = 256        # diagrams per chunk (part of the census identity)
    jones_budget = 200000   # optional per-diagram budgets (see invariants)
    min_colors_budget = 10000
    homfly_budget = 20000   # HOMFLY-PT: diagrams expanded by the skein route (default 20000)
    khovanov_budget = 20000 # Khovanov: objects of the tangle complex (default 20000)
    timeout = 600           # optional: seconds per chunk before its rows are given up
    knots_only = false      # default for every family
    simplify_budget = 200000  # optional: most Reidemeister moves when simplifying a row
    flype_budget = 2000     # optional: most diagrams in one flype orbit (flype normal form)

    [[family]]
    kind = "torus"          # p, q: inclusive ranges [lo, hi] or single integers
    p = [2, 7]
    q = [2, 40]

Family kinds and their keys (``knots_only`` and a free-text ``name`` are allowed in
every family):

============  =====================================================================
torus         ``p``, ``q`` (0 is skipped); notation ``torus:p,q``
pretzel       ``length``, ``entries`` (range; 0 skipped unless ``zero = true``)
two_bridge    ``alpha`` (range); every β with 0 < β < α, gcd(α, β) = 1;
              notation ``rational:alpha/beta``
montesinos    either ``tangles = ["1/3", ["1/2", "-1/2"], "2/5"]`` (one entry per
              position: a fraction, or a list of fractions to choose from; the rows
              are the Cartesian product) or ``length = k`` with
              ``fractions = ["1/3", "2/5", ...]`` (every ordered k-tuple)
braid         ``word = "1^a -2^b 1^c"`` plus one range per letter, ``a = [1, 6]``;
              a token is ``G`` or ``G^E``, G a nonzero generator, E an integer or
              a letter; a negative exponent means the inverse generator
file          ``path`` (relative to the spec file), optional ``format``
              (``csv``, ``jsonl``, ``text``; default from the extension) and
              ``column`` (default ``diagram``)
alternating   ``crossings = [lo, hi]`` (inclusive, within [1, 16]) and optional
              ``links = true``: one row per prime alternating knot type (then link
              type) up to mirror image, in the order of
              :mod:`pipeline.diagrams.families.alternating`; notation ``alt:N:I``
              (links ``altlink:N:J``); params ``{"crossings": N, "index": I}`` with I
              the 1-based position among the knots then links of N crossings
============  =====================================================================

Budgets (``[census]``; a row over a budget keeps its other columns, gets the next
rule's key and says so in its key reason — never a guessed key): ``simplify_budget``
(default 200000 moves, :data:`pipeline.diagrams.simplify.DEFAULT_BUDGET`) and
``flype_budget`` (default 2000 orbit members, :data:`pipeline.diagrams.flype.FLYPE_BUDGET`).

The work list is the concatenation of the families in spec order; within a family
the order is the lexicographic order of the parameters as written.  ``row_id`` is the
position in that list; the same spec and input files always give the same list.
"""

from __future__ import annotations

import hashlib
import re
import tomllib
from dataclasses import dataclass, field
from pathlib import Path
from typing import Any, Optional

from ..errors import SpecError
from .worklist import (WorkItem, braid_components, count_items, iter_chunks, iter_items,
                       pretzel_is_knot)

__all__ = ["Spec", "Family", "WorkItem", "load_spec", "parse_spec", "iter_items",
           "iter_chunks", "count_items", "pretzel_is_knot", "braid_components"]

DEFAULT_CHUNK_SIZE = 256
DEFAULT_MAX_MODULUS = 16
# ---- strength (issue 12): per-diagram budgets of HOMFLY-PT and Khovanov homology.
#: ``homfly_budget`` (default 20000): diagrams the HOMFLY-PT skein route may expand (and
#: the bound on n!·length of the braid route); over it the row says
#: ``skipped: homfly budget N``.  ``khovanov_budget`` (default 20000): objects the
#: Khovanov tangle complex may have after any crossing; over it the row says
#: ``skipped: khovanov budget N``.  0 skips the invariant on every row.
from ..invariants.all import DEFAULT_HOMFLY_BUDGET, DEFAULT_KHOVANOV_BUDGET  # noqa: E402
# ---- end strength
CENSUS_KEYS = {"name": str, "max_modulus": int, "chunk_size": int, "jones_budget": int,
               "min_colors_budget": int, "timeout": (int, float), "knots_only": bool,
               "description": str, "simplify_budget": int, "flype_budget": int,
               # strength (issue 12)
               "homfly_budget": int, "khovanov_budget": int}
COMMON_KEYS = {"kind", "knots_only", "name"}
KIND_KEYS = {
    "torus": {"p", "q"},
    "pretzel": {"length", "entries", "zero"},
    "two_bridge": {"alpha"},
    "montesinos": {"tangles", "length", "fractions"},
    "braid": {"word"},
    "file": {"path", "format", "column"},
    "alternating": {"crossings", "links"},
}
FILE_FORMATS = {".csv": "csv", ".jsonl": "jsonl", ".ndjson": "jsonl", ".txt": "text",
                ".text": "text"}


@dataclass(frozen=True)
class Family:
    """One validated [[family]] table."""
    index: int
    kind: str
    options: dict
    knots_only: bool
    base: Path = field(default=Path("."), compare=False)


@dataclass(frozen=True)
class Spec:
    """A validated census spec."""
    name: str
    max_modulus: int
    chunk_size: int
    jones_budget: Optional[int]
    min_colors_budget: Optional[int]
    timeout: Optional[float]
    families: tuple[Family, ...]
    text: str
    path: Optional[Path] = None
    simplify_budget: Optional[int] = None
    flype_budget: Optional[int] = None
    # ---- strength (issue 12): 0 skips the invariant on every row
    homfly_budget: Optional[int] = None
    khovanov_budget: Optional[int] = None
    # ---- end strength

    @property
    def sha256(self) -> str:
        return hashlib.sha256(self.text.encode()).hexdigest()

    def input_files(self) -> list[Path]:
        """Resolved paths of every file family, in spec order."""
        return [f.options["path"] for f in self.families if f.kind == "file"]


# ---------------------------------------------------------------- loading
def load_spec(path: str | Path) -> Spec:
    """Read and validate a spec file; raise :class:`SpecError` (one line) on any problem."""
    path = Path(path)
    try:
        text = path.read_text(encoding="utf-8")
    except OSError as err:
        raise SpecError(f"spec: cannot read {str(path)!r} ({err.strerror or err})") from err
    except UnicodeDecodeError as err:
        raise SpecError(f"spec: {str(path)!r} is not UTF-8 text") from err
    return parse_spec(text, base=path.parent, path=path)


def parse_spec(text: str, *, base: str | Path = ".", path: Optional[Path] = None) -> Spec:
    """Validate spec ``text``; file paths are resolved against ``base``."""
    where = path.name if path else "spec"
    try:
        data = tomllib.loads(text)
    except tomllib.TOMLDecodeError as err:
        raise SpecError(f"{where}: not valid TOML ({err})") from err
    loc = _Locator(text, where)
    for key in data:
        if key not in ("census", "family"):
            raise SpecError(f"{loc.top(key)}: unknown key {key!r} (expected [census] and [[family]] tables)")
    census = data.get("census", {})
    if not isinstance(census, dict):
        raise SpecError(f"{loc.top('census')}: 'census' must be a table [census]")
    for key, val in census.items():
        if key not in CENSUS_KEYS:
            raise SpecError(f"{loc.at('census', 0, key)}: unknown key {key!r} in [census] "
                            f"(known: {', '.join(sorted(CENSUS_KEYS))})")
        _check_type(loc.at("census", 0, key), key, val, CENSUS_KEYS[key])
    opts = {
        "max_modulus": census.get("max_modulus", DEFAULT_MAX_MODULUS),
        "chunk_size": census.get("chunk_size", DEFAULT_CHUNK_SIZE),
    }
    for key, lo in (("max_modulus", 2), ("chunk_size", 1), ("jones_budget", 0),
                    ("min_colors_budget", 0), ("timeout", 0), ("simplify_budget", 0),
                    ("flype_budget", 1),
                    ("homfly_budget", 0), ("khovanov_budget", 0)):  # strength (issue 12)
        if key in census and census[key] < lo + (key == "timeout") * 1e-9:
            raise SpecError(f"{loc.at('census', 0, key)}: {key} = {census[key]} must be "
                            f"{'positive' if key == 'timeout' else f'at least {lo}'}")
    families_raw = data.get("family", [])
    if not isinstance(families_raw, list) or not families_raw:
        raise SpecError(f"{where}: no [[family]] tables (a census needs at least one family)")
    default_knots = census.get("knots_only", False)
    fams = tuple(_family(i, raw, loc, Path(base), default_knots) for i, raw in enumerate(families_raw))
    return Spec(name=census.get("name", path.stem if path else "census"),
                max_modulus=opts["max_modulus"], chunk_size=opts["chunk_size"],
                jones_budget=census.get("jones_budget"),
                min_colors_budget=census.get("min_colors_budget"),
                timeout=float(census["timeout"]) if "timeout" in census else None,
                families=fams, text=text, path=path,
                simplify_budget=census.get("simplify_budget"), flype_budget=census.get("flype_budget"),
                # strength (issue 12)
                homfly_budget=census.get("homfly_budget", DEFAULT_HOMFLY_BUDGET),
                khovanov_budget=census.get("khovanov_budget", DEFAULT_KHOVANOV_BUDGET))


class _Locator:
    """Finds the line of ``key = ...`` inside the n-th [census] / [[family]] table."""

    def __init__(self, text: str, where: str) -> None:
        self.where = where
        self.lines: dict[tuple[str, int, str], int] = {}
        section, counts = ("", 0), {"census": -1, "family": -1}
        for no, line in enumerate(text.splitlines(), 1):
            s = line.strip()
            m = re.match(r"^\[\[\s*([A-Za-z0-9_.\-]+)\s*\]\]|^\[\s*([A-Za-z0-9_.\-]+)\s*\]", s)
            if m:
                name = m.group(1) or m.group(2)
                counts[name] = counts.get(name, -1) + 1
                section = (name, counts[name])
                self.lines.setdefault(("", 0, name), no)
                continue
            k = re.match(r'^\s*"?([A-Za-z0-9_\-]+)"?\s*=', line)
            if k:
                self.lines.setdefault((section[0], section[1], k.group(1)), no)

    def at(self, table: str, index: int, key: str) -> str:
        no = self.lines.get((table, index, key))
        return f"{self.where} line {no}" if no else self.where

    def top(self, key: str) -> str:
        return self.at("", 0, key)


def _check_type(where: str, key: str, val: Any, typ) -> None:
    ok = isinstance(val, typ) and not (isinstance(val, bool) and typ is not bool)
    if not ok:
        name = typ.__name__ if isinstance(typ, type) else " or ".join(t.__name__ for t in typ)
        raise SpecError(f"{where}: {key} = {val!r} must be {'a' if name != 'int' else 'an'} {name}")


def _range(where: str, key: str, val: Any) -> tuple[int, int]:
    if isinstance(val, int) and not isinstance(val, bool):
        return val, val
    if (isinstance(val, list) and len(val) == 2
            and all(isinstance(v, int) and not isinstance(v, bool) for v in val)):
        if val[0] > val[1]:
            raise SpecError(f"{where}: {key} = {val} is empty (lower bound above upper bound)")
        return val[0], val[1]
    raise SpecError(f"{where}: {key} = {val!r} must be an inclusive range [lo, hi] of integers "
                    "or one integer")


def _fraction_text(where: str, key: str, tok: Any) -> str:
    """A Montesinos tangle entry as notation text: ``β/α`` or an integer (signs allowed
    on either side, as in ``montesinos:1/-3``); the denominator must be nonzero."""
    if isinstance(tok, int) and not isinstance(tok, bool):
        tok = str(tok)
    m = (re.fullmatch(r"\s*([+-]?\d+)\s*(?:/\s*([+-]?\d+)\s*)?", tok)
         if isinstance(tok, str) else None)
    if m is None:
        raise SpecError(f"{where}: {key} entry {tok!r} is not a fraction 'β/α' or an integer")
    if m.group(2) is not None and int(m.group(2)) == 0:
        raise SpecError(f"{where}: {key} entry {tok!r} has denominator 0")
    return tok.replace(" ", "")


def _family(i: int, raw: Any, loc: _Locator, base: Path, default_knots: bool) -> Family:
    head = loc.at("family", i, "kind")
    if not isinstance(raw, dict):
        raise SpecError(f"{loc.where}: family {i + 1} is not a table")
    kind = raw.get("kind")
    if kind is None:
        raise SpecError(f"{loc.where}: family {i + 1} has no 'kind' (one of {', '.join(KIND_KEYS)})")
    if kind not in KIND_KEYS:
        raise SpecError(f"{head}: unknown family kind {kind!r} (one of {', '.join(KIND_KEYS)})")
    at = lambda key: loc.at("family", i, key)  # noqa: E731
    allowed = COMMON_KEYS | KIND_KEYS[kind]
    letters: dict[str, tuple[int, int]] = {}
    if kind == "braid":
        word = raw.get("word")
        if not isinstance(word, str):
            raise SpecError(f"{at('word')}: braid family needs word = \"...\" (a string)")
        tokens = _braid_tokens(at("word"), word)
        names = [e for _, e in tokens if isinstance(e, str)]
        for name in dict.fromkeys(names):
            if name not in raw:
                raise SpecError(f"{at('word')}: braid word uses {name!r} but gives no range {name} = [lo, hi]")
            letters[name] = _range(at(name), name, raw[name])
        allowed = allowed | set(letters)
    for key in raw:
        if key not in allowed:
            raise SpecError(f"{at(key)}: unknown key {key!r} in {kind} family "
                            f"(known: {', '.join(sorted(allowed))})")
    knots_only = raw.get("knots_only", default_knots)
    _check_type(at("knots_only"), "knots_only", knots_only, bool)
    if "name" in raw:
        _check_type(at("name"), "name", raw["name"], str)
    opts: dict[str, Any] = {}
    if kind == "torus":
        for key in ("p", "q"):
            if key not in raw:
                raise SpecError(f"{head}: torus family needs {key} = [lo, hi]")
            opts[key] = _range(at(key), key, raw[key])
    elif kind == "pretzel":
        for key in ("length", "entries"):
            if key not in raw:
                raise SpecError(f"{head}: pretzel family needs {key}")
        _check_type(at("length"), "length", raw["length"], int)
        if raw["length"] < 1:
            raise SpecError(f"{at('length')}: length = {raw['length']} must be at least 1")
        opts["length"] = raw["length"]
        opts["entries"] = _range(at("entries"), "entries", raw["entries"])
        opts["zero"] = raw.get("zero", False)
        _check_type(at("zero"), "zero", opts["zero"], bool)
    elif kind == "two_bridge":
        if "alpha" not in raw:
            raise SpecError(f"{head}: two_bridge family needs alpha = [lo, hi]")
        opts["alpha"] = _range(at("alpha"), "alpha", raw["alpha"])
    elif kind == "montesinos":
        opts["positions"] = _montesinos_positions(raw, at, head)
    elif kind == "braid":
        opts["tokens"] = _braid_tokens(at("word"), raw["word"])
        opts["letters"] = letters
    elif kind == "file":
        opts.update(_file_options(raw, at, head, base))
    elif kind == "alternating":
        opts.update(_alternating_options(raw, at, head))
    return Family(i, kind, opts, knots_only, base)


def _montesinos_positions(raw: dict, at, head: str) -> list[list[str]]:
    if "tangles" in raw:
        if "length" in raw or "fractions" in raw:
            raise SpecError(f"{at('tangles')}: give either tangles or length + fractions, not both")
        tangles = raw["tangles"]
        if not isinstance(tangles, list) or not tangles:
            raise SpecError(f"{at('tangles')}: tangles must be a non-empty list")
        out = []
        for t in tangles:
            choices = t if isinstance(t, list) else [t]
            if not choices:
                raise SpecError(f"{at('tangles')}: an empty list of choices in tangles")
            out.append([_fraction_text(at("tangles"), "tangles", c) for c in choices])
        return out
    if "length" not in raw or "fractions" not in raw:
        raise SpecError(f"{head}: montesinos family needs tangles = [...] or length + fractions")
    _check_type(at("length"), "length", raw["length"], int)
    if raw["length"] < 1:
        raise SpecError(f"{at('length')}: length = {raw['length']} must be at least 1")
    if not isinstance(raw["fractions"], list) or not raw["fractions"]:
        raise SpecError(f"{at('fractions')}: fractions must be a non-empty list")
    pool = [_fraction_text(at("fractions"), "fractions", c) for c in raw["fractions"]]
    return [pool] * raw["length"]


def _braid_tokens(where: str, word: str) -> list[tuple[int, int | str]]:
    tokens = []
    for tok in word.replace(",", " ").split():
        m = re.fullmatch(r"([+-]?\d+)(?:\^(?:([+-]?\d+)|([A-Za-z_]\w*)))?", tok)
        if not m or int(m.group(1)) == 0:
            raise SpecError(f"{where}: braid word token {tok!r} is not G, G^E or G^letter "
                            "(G a nonzero integer)")
        exp: int | str = int(m.group(2)) if m.group(2) else (m.group(3) or 1)
        if isinstance(exp, str) and exp in COMMON_KEYS | {"word"}:
            raise SpecError(f"{where}: {exp!r} cannot be used as an exponent letter")
        tokens.append((int(m.group(1)), exp))
    if not tokens:
        raise SpecError(f"{where}: braid word is empty")
    return tokens


def _alternating_options(raw: dict, at, head: str) -> dict:
    from ..diagrams.families.alternating import MAX_CROSSINGS, MIN_CROSSINGS
    if "crossings" not in raw:
        raise SpecError(f"{head}: alternating family needs crossings = [lo, hi]")
    lo, hi = _range(at("crossings"), "crossings", raw["crossings"])
    if lo < MIN_CROSSINGS or hi > MAX_CROSSINGS:
        raise SpecError(f"{at('crossings')}: crossings = {raw['crossings']} must lie within "
                        f"[{MIN_CROSSINGS}, {MAX_CROSSINGS}]")
    links = raw.get("links", False)
    _check_type(at("links"), "links", links, bool)
    return {"crossings": (lo, hi), "links": links}


def _file_options(raw: dict, at, head: str, base: Path) -> dict:
    if "path" not in raw:
        raise SpecError(f"{head}: file family needs path = \"...\"")
    _check_type(at("path"), "path", raw["path"], str)
    path = (base / raw["path"]).resolve()
    if not path.is_file():
        raise SpecError(f"{at('path')}: input file {raw['path']!r} not found (paths are relative to the spec file)")
    fmt = raw.get("format", FILE_FORMATS.get(path.suffix.lower()))
    if fmt not in ("csv", "jsonl", "text"):
        raise SpecError(f"{at('format') if 'format' in raw else at('path')}: cannot tell the format of "
                        f"{raw['path']!r}; set format = \"csv\", \"jsonl\" or \"text\"")
    column = raw.get("column", "diagram")
    _check_type(at("column"), "column", column, str)
    if fmt == "csv":
        import csv
        with path.open(newline="", encoding="utf-8") as fh:
            header = next(csv.reader(fh), [])
        if column not in header:
            raise SpecError(f"{at('path')}: {raw['path']!r} has no column {column!r} (header: {', '.join(header)})")
    return {"path": path, "format": fmt, "column": column, "relpath": raw["path"]}
