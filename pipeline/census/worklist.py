"""The deterministic work list of a census spec: families -> WorkItems, lazily.

The work list is the concatenation of the spec's families in spec order; within a
family the order is the lexicographic order of the parameters as written, so the same
spec and input files always give the same list and ``row_id`` (the position) is a
stable row key.  ``knots_only`` is decided from the parameters where a published rule
allows it (torus: gcd(p, q) = 1; pretzel: the parity rule; two-bridge: α odd; braid:
the permutation of the braid is one cycle; alternating: the enumeration separates knots
from links); otherwise the worker decides after
parsing (``WorkItem.check_knot``).  Nothing here builds a diagram.
"""

from __future__ import annotations

import itertools
import json
from math import gcd
from typing import Iterator, NamedTuple, Optional

__all__ = ["WorkItem", "iter_items", "iter_chunks", "count_items", "pretzel_is_knot",
           "braid_components"]


class WorkItem(NamedTuple):
    """One entry of the work list (what a worker needs to compute one row)."""
    row_id: int
    family: str          # the spec kind
    family_index: int    # position of the [[family]] table in the spec
    notation: str        # KIND:ARGS (raw text for file rows)
    params: str          # JSON text of the family parameters
    labels: Optional[str]  # JSON text of the extra file columns
    source: Optional[str]  # "file.csv:7" for file rows
    check_knot: bool     # knots_only that could not be decided from the parameters
    error: Optional[str] = None  # the row is malformed before parsing (becomes a reject)


def pretzel_is_knot(entries: tuple[int, ...]) -> bool:
    """P(p1..pk) is a knot iff exactly one p_i is even, or k and every p_i are odd
    (common practice; tests/SOURCES.md §3 — a zero entry counts as even)."""
    even = sum(1 for p in entries if p % 2 == 0)
    return even == 1 or (even == 0 and len(entries) % 2 == 1)


def braid_components(word: list[int]) -> int:
    """Number of components of the closure = cycles of the braid's permutation."""
    n = max((abs(g) for g in word), default=0) + 1
    perm = list(range(n))
    for g in word:
        i = abs(g) - 1
        perm[i], perm[i + 1] = perm[i + 1], perm[i]
    seen, cycles = set(), 0
    for s in range(n):
        if s not in seen:
            cycles += 1
            while s not in seen:
                seen.add(s)
                s = perm[s]
    return cycles


def _js(obj: dict) -> str:
    return json.dumps(obj, separators=(",", ":"), ensure_ascii=False)


def _family_entries(fam) -> Iterator[tuple]:
    """(notation, params, labels, source, check_knot, error) for one family, in order."""
    o, ko = fam.options, fam.knots_only
    if fam.kind == "torus":
        for p in range(o["p"][0], o["p"][1] + 1):
            for q in range(o["q"][0], o["q"][1] + 1):
                if p == 0 or q == 0 or (ko and gcd(p, q) != 1):
                    continue
                yield f"torus:{p},{q}", _js({"p": p, "q": q}), None, None, False, None
    elif fam.kind == "pretzel":
        vals = [v for v in range(o["entries"][0], o["entries"][1] + 1) if v != 0 or o["zero"]]
        for t in itertools.product(vals, repeat=o["length"]):
            if ko and not pretzel_is_knot(t):
                continue
            yield ("pretzel:" + ",".join(map(str, t)),
                   _js({f"p{i + 1}": v for i, v in enumerate(t)}), None, None, False, None)
    elif fam.kind == "two_bridge":
        for a in range(max(o["alpha"][0], 2), o["alpha"][1] + 1):
            if ko and a % 2 == 0:
                continue
            for b in range(1, a):
                if gcd(a, b) == 1:
                    yield f"rational:{a}/{b}", _js({"alpha": a, "beta": b}), None, None, False, None
    elif fam.kind == "montesinos":
        for t in itertools.product(*o["positions"]):
            yield ("montesinos:" + ",".join(t), _js({f"t{i + 1}": v for i, v in enumerate(t)}),
                   None, None, ko, None)
    elif fam.kind == "braid":
        names = list(o["letters"])
        ranges = [range(o["letters"][n][0], o["letters"][n][1] + 1) for n in names]
        for vals in itertools.product(*ranges):
            env = dict(zip(names, vals))
            word = []
            for g, e in o["tokens"]:
                k = env[e] if isinstance(e, str) else e
                word.extend([g if k > 0 else -g] * abs(k))
            if ko and word and braid_components(word) != 1:
                continue
            yield "braid:" + ",".join(map(str, word)), _js(env), None, None, False, None
    elif fam.kind == "alternating":
        yield from _alternating_entries(o, ko)
    elif fam.kind == "file":
        from .spec_files import read_rows
        for text, labels, source, error in read_rows(o["path"], o["format"], o["column"], o["relpath"]):
            yield text, "{}", labels, source, ko, error


def _alternating_entries(o: dict, knots_only: bool) -> Iterator[tuple]:
    """alt:N:I (then altlink:N:J) for N in the range, in the family's documented order."""
    from ..diagrams.families.alternating import codes
    for n in range(o["crossings"][0], o["crossings"][1] + 1):
        knots = len(codes(n))
        total = len(codes(n, links=True)) if o["links"] and not knots_only else knots
        for i in range(1, total + 1):
            text = f"alt:{n}:{i}" if i <= knots else f"altlink:{n}:{i - knots}"
            yield text, _js({"crossings": n, "index": i}), None, None, False, None


def iter_items(spec) -> Iterator[WorkItem]:
    """The deterministic work list, lazily (memory independent of the census size)."""
    row_id = 0
    for fam in spec.families:
        for notation, params, labels, source, check, error in _family_entries(fam):
            yield WorkItem(row_id, fam.kind, fam.index, notation, params, labels, source, check, error)
            row_id += 1


def iter_chunks(spec, chunk_size: Optional[int] = None) -> Iterator[tuple[int, list[WorkItem]]]:
    """(chunk index, items) for consecutive slices of ``chunk_size`` items."""
    size = chunk_size or spec.chunk_size
    it = iter_items(spec)
    j = 0
    while True:
        block = list(itertools.islice(it, size))
        if not block:
            return
        yield j, block
        j += 1


def count_items(spec) -> int:
    """Length of the work list (one pass, no diagrams built)."""
    return sum(1 for _ in iter_items(spec))
