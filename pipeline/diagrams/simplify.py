"""Simplify a diagram by Reidemeister moves: R1, R2, nugatory crossings, then an R3 search.

The method
----------
1. Greedy descent: every crossing is checked for a kink (R1) or a removable bigon
   (R2); a move re-checks only the crossings next to the edges it created.  When no
   R1/R2 move is left, nugatory crossings are removed (one side turned over).
2. R3 search: a seeded random walk over the non-alternating triangle faces
   (``random.Random(seed)``, so the result is a function of the input and the seed).
   An R3 move never changes the crossing count, and after each one the three
   crossings and their neighbours are checked for R1/R2 again, so the working
   diagram is always the smallest one found.  Candidate corners are kept in a pool
   refreshed around each move (a step costs time near the move, not a scan of the
   diagram; a picked corner is checked again).  The walk stops after ``patience``
   R3 moves in a row without a reduction (then nugatory crossings are checked once
   more and, if one was removed, the walk starts again) or when no triangle admits R3.

Moves: K. Reidemeister, "Elementare Begründung der Knotentheorie", Abh. Math. Sem.
Univ. Hamburg 5 (1927); every move is an isotopy, so the output is a diagram of the
same oriented link (each component keeps its orientation; a component that loses
all its crossings becomes a counted free loop).  The output is validated
(:meth:`Diagram.from_pd`) and its crossing signs are checked against the tracked ones.

Budget: ``budget`` bounds the number of moves (R1, R2, nugatory and R3 together).
When it runs out, the default is to return the smallest diagram found so far with
``complete = False`` (it is still a correct diagram of the same link, only perhaps
not as small as the search would make it); ``strict=True`` raises
``BudgetExceeded("simplify", budget)`` instead, for census rows that want the
``skipped: simplify budget N`` status.

Proof status: R-moves preserve the link (theorem above).  The output is certified
minimal (``minimal = True``) only when at most one piece has crossings and that piece
is reduced and alternating: such a diagram has the fewest crossings (L. H. Kauffman,
"State models and the Jones polynomial", Topology 26, 1987; K. Murasugi, Topology 26,
1987; M. B. Thistlethwaite, Topology 26, 1987), and free loops add no crossing.
Otherwise the search is a heuristic and claims nothing about minimality.
"""

from __future__ import annotations

import random
from dataclasses import dataclass, field

from ..errors import BudgetExceeded, DiagramError
from .diagram import Diagram
from .reidemeister import Work

__all__ = ["SimplifyResult", "simplify", "nugatory_crossings", "is_reduced", "is_connected",
           "alternating_crossing_number"]

DEFAULT_BUDGET = 200_000


@dataclass(frozen=True)
class SimplifyResult:
    """Result of :func:`simplify`.

    Attributes
    ----------
    diagram : Diagram
        The smallest diagram found (the input itself when nothing was removed).
    crossings_before : int
        Crossings of the input.
    moves : dict
        Counts per move kind: ``R1``, ``R2``, ``nugatory``, ``R3``.
    complete : bool
        False when the move budget ran out before the search finished.
    minimal : bool
        True when the output is certified to have the fewest crossings (see module notes).
    """

    diagram: Diagram
    crossings_before: int
    moves: dict = field(default_factory=dict)
    complete: bool = True
    minimal: bool = False

    @property
    def crossings(self) -> int:
        return self.diagram.n_crossings

    @property
    def smaller(self) -> bool:
        return self.diagram.n_crossings < self.crossings_before


class _Out(Exception):
    pass


class _Run:
    def __init__(self, w: Work, budget: int) -> None:
        self.w, self.budget = w, budget
        self.moves = {"R1": 0, "R2": 0, "nugatory": 0, "R3": 0}
        self.dirty: set[int] = set()     # crossings looked at by the last descent

    def count(self, kind: str) -> None:
        if sum(self.moves.values()) >= self.budget:
            raise _Out
        self.moves[kind] += 1

    def descend(self, todo) -> bool:
        """R1/R2 until none applies near ``todo``; True if anything was removed."""
        w, changed = self.w, False
        stack = sorted(todo, reverse=True)
        while stack:
            i = stack.pop()
            if i not in w.x:
                continue
            self.dirty.add(i)
            s = w.r1_at(i)
            if s is not None:
                self.count("R1")
                stack.extend(w.do_r1(i, s))
                changed = True
                continue
            m = w.r2_at(i)
            if m is not None:
                self.count("R2")
                stack.extend(w.do_r2(i, *m))
                changed = True
        return changed

    def reduce(self) -> None:
        """Greedy descent plus nugatory removal until nothing applies."""
        w = self.w
        self.descend(list(w.x))
        while True:
            nug = w.nugatory()
            if not nug:
                return
            self.count("nugatory")
            self.descend(w.do_nugatory(nug[0]))

    def r3_walk(self, rng: random.Random, patience: int) -> None:
        """Random R3 moves; candidate corners are kept in a pool that is refreshed
        around every move (a picked corner is checked again before it is used)."""
        w = self.w
        while True:
            idle = 0
            pool = [t[:2] for t in self._triangles()]
            in_pool = set(pool)
            while idle < patience and len(w):
                t = None
                while pool and t is None:
                    k = rng.randrange(len(pool))
                    c = pool[k]
                    pool[k] = pool[-1]
                    pool.pop()
                    in_pool.discard(c)
                    t = self._valid(*c)
                if t is None:
                    break
                self.count("R3")
                self.dirty = set()
                near = w.do_r3(*t)
                idle = 0 if self.descend(near) else idle + 1
                region = {c for c in near | self.dirty if c in w.x}
                for c in sorted(region | {n for c in region for n in w.neighbours(c)}):
                    for u in range(4):
                        if (c, u) not in in_pool and self._valid(c, u) is not None:
                            pool.append((c, u))
                            in_pool.add((c, u))
            nug = w.nugatory()
            if not nug:
                return
            self.count("nugatory")
            self.descend(w.do_nugatory(nug[0]))
            self.reduce()

    def _valid(self, i: int, s: int):
        w = self.w
        if i not in w.x:
            return None
        t = w.triangle_at(i, s)
        if t is None or not w.r3_ok(i, *t):
            return None
        return (i, *t)

    def _triangles(self) -> list:
        w, out, seen = self.w, [], set()
        for i in sorted(w.x):
            for s in range(4):
                t = w.triangle_at(i, s)
                if t is None:
                    continue
                x, j, y, k, z = t
                key = frozenset([(i, x), (j, y), (k, z)])
                if key in seen or not w.r3_ok(i, x, j, y, k, z):
                    continue
                seen.add(key)
                out.append((i, x, j, y, k, z))
        return out


def simplify(diagram: Diagram, *, seed: int = 0, budget: int = DEFAULT_BUDGET,
             patience: int | None = None, r3: bool = True, strict: bool = False) -> SimplifyResult:
    """Reduce ``diagram`` by R1, R2, nugatory removal and a seeded R3 search.

    Parameters
    ----------
    diagram : Diagram
        Any valid diagram (links, split diagrams and free loops included).
    seed : int
        Seed of the R3 walk (``random.Random(seed)``); same input and seed, same output.
    budget : int
        Most moves of all kinds together.
    patience : int, optional
        R3 moves in a row without a reduction before the walk stops
        (default ``max(20, 2 * crossings)``).
    r3 : bool
        False skips the R3 search (R1, R2 and nugatory removal only).
    strict : bool
        Over budget: False returns the best diagram so far with ``complete=False``;
        True raises ``BudgetExceeded("simplify", budget)``.

    Returns
    -------
    SimplifyResult

    Examples
    --------
    >>> from pipeline.diagrams.notation import parse
    >>> simplify(parse("braid:1,-1")).diagram.n_crossings
    0
    >>> simplify(parse("torus:2,3")).diagram.n_crossings
    3
    """
    if not isinstance(diagram, Diagram):
        raise DiagramError(f"simplify: expected a Diagram, got {type(diagram).__name__}")
    for name, v in (("budget", budget), ("patience", 0 if patience is None else patience)):
        if isinstance(v, bool) or not isinstance(v, int) or v < 0:
            raise DiagramError(f"simplify: {name} {v!r} must be a non-negative integer")
    run = _Run(Work(diagram), budget)
    pat = max(20, 2 * diagram.n_crossings) if patience is None else int(patience)
    complete = True
    try:
        run.reduce()
        if r3:
            run.r3_walk(random.Random(seed), pat)
    except _Out:
        if strict:
            raise BudgetExceeded("simplify", budget) from None
        complete = False
    if sum(run.moves.values()) == 0:
        out = diagram
    else:
        out = run.w.to_diagram()
    return SimplifyResult(out, diagram.n_crossings, run.moves, complete, _certified(out))


# ---------------------------------------------------------------------- diagram facts
def nugatory_crossings(diagram: Diagram) -> list[int]:
    """Indices of the nugatory crossings: those where one face meets itself.

    A crossing is nugatory iff a circle in the plane meets the diagram only in it,
    iff removing it disconnects its piece of the diagram graph, iff two opposite corners
    of the crossing belong to the same face (adjacent corners never do: they lie on
    opposite sides of an edge).
    """
    out = set()
    for face in diagram.faces:
        seen = set()
        for (j, _) in face:
            if j in seen:
                out.add(j)
            seen.add(j)
    return sorted(out)


def is_reduced(diagram: Diagram) -> bool:
    """True when the diagram has no nugatory crossing."""
    return not nugatory_crossings(diagram)


def is_connected(diagram: Diagram) -> bool:
    """True for a diagram with one piece and no free loops (or a single free loop)."""
    if diagram.n_crossings == 0:
        return diagram.free_loops == 1
    return len(diagram.pieces) == 1 and diagram.free_loops == 0


def alternating_crossing_number(diagram: Diagram) -> int | None:
    """The crossing number when ``diagram`` is connected, reduced and alternating with
    at least one crossing (Kauffman, Murasugi, Thistlethwaite, Topology 26, 1987), else None."""
    if diagram.n_crossings and is_connected(diagram) and diagram.is_alternating() \
            and is_reduced(diagram):
        return diagram.n_crossings
    return None


def _certified(d: Diagram) -> bool:
    if d.n_crossings == 0:
        return True
    return len(d.pieces) == 1 and d.is_alternating() and is_reduced(d)
