"""Bigon faces of a PD code and the twist regions they chain together.

A *bigon* is a face with two corners at two different crossings i, j: its edges are
the label at slot ``(i, s)`` (its twin is ``(j, t)``) and the label at ``(i, s − 1)``
(its twin is ``(j, t + 1)``), faces traced as in :func:`pipeline.diagrams.plane.trace_faces`.
The two edges lie on two strands P (slots s, t) and Q (slots s − 1, t + 1), each passing
through both crossings.  Odd slots are over-passages, so

* ``s ≡ t (mod 2)``: P is over (or under) at both corners — a *removable* bigon, the
  Reidemeister II configuration (K. Reidemeister, Abh. Math. Sem. Univ. Hamburg 5, 1927);
* otherwise over and under alternate around the bigon — a *twist* bigon.

Signs (common practice, checked in tests/test_homfly_twists.py): P and Q cross at i from
one side to the other and at j back, so the cross product of their directions changes
sign between i and j; a crossing's sign is that product taken (over, under).  A twist
bigon therefore joins two crossings of equal sign, a removable one two crossings of
opposite sign.

A *twist region* is a maximal chain of at least two crossings joined by twist bigons
(the crossings of one twist of two strands).  Every crossing has at most two twist-bigon
neighbours, at opposite corners (two bigons at adjacent corners share an edge, hence the
neighbour), so the chains are paths, or cycles when the whole piece is the closure of a
two-strand twist.  The chain is *parallel* when the two strands run through it the same
way (like σ^k in a braid) and *antiparallel* otherwise.

These functions read raw crossing tuples (slot 0 the incoming under-strand, as in the
README contract) and their signs, so callers can use them on PD codes whose labels are
not yet consecutive (the skein tree of :mod:`pipeline.invariants.homfly.skein`).
:func:`pipeline.diagrams.flype_circuits.twist_regions` is the same notion on the twin
arrays of alternating shadows (no orientation, no removable bigons).
"""

from __future__ import annotations

from typing import NamedTuple, Sequence

from .plane import slots_of

__all__ = ["Bigon", "TwistChain", "bigons", "twist_chains"]


class Bigon(NamedTuple):
    """A bigon face: edges at ``(i, s)``–``(j, t)`` and ``(i, s − 1)``–``(j, t + 1)``, i < j."""

    i: int
    s: int
    j: int
    t: int

    @property
    def removable(self) -> bool:
        """One strand over at both corners (a Reidemeister II bigon)."""
        return (self.s - self.t) % 2 == 0


class TwistChain(NamedTuple):
    """A twist region: ``crossings`` in chain order (consecutive ones share a bigon;
    when ``cyclic`` the last shares one with the first), ``parallel`` strands or not."""

    crossings: tuple[int, ...]
    cyclic: bool
    parallel: bool


def bigons(pd: Sequence[Sequence[int]]) -> list[Bigon]:
    """Every bigon face between two different crossings, once each, sorted.

    Examples
    --------
    >>> len(bigons([(1, 5, 2, 4), (3, 1, 4, 6), (5, 3, 6, 2)]))   # trefoil: three bigons
    3
    """
    where = slots_of(pd)

    def twin(i: int, s: int) -> tuple[int, int]:
        a, b = where[pd[i][s]]
        return b if a == (i, s) else a

    out = set()
    for i in range(len(pd)):
        for s in range(4):
            j, t = twin(i, s)
            if j == i:
                continue
            k, u = twin(j, (t + 1) % 4)
            if k == i and u == (s - 1) % 4:
                # the same face seen from j: edges (j, t+1)-(i, s-1) and (j, t)-(i, s)
                out.add(Bigon(i, s, j, t) if i < j else Bigon(j, (t + 1) % 4, i, (s - 1) % 4))
    return sorted(out)


def _incoming(x: Sequence[int], sign: int, s: int) -> bool:
    """Does the strand at slot s enter the crossing?  Slot 0, and the over-strand's
    entry: d (slot 3) when positive, b (slot 1) when negative."""
    return s == 0 or s == (3 if sign > 0 else 1)


def twist_chains(pd: Sequence[Sequence[int]], signs: Sequence[int], *,
                 found: list[Bigon] | None = None) -> list[TwistChain]:
    """The twist regions of at least two crossings, longest first (ties: smallest crossing).

    ``found`` may pass the result of :func:`bigons` already computed for ``pd``.
    """
    found = bigons(pd) if found is None else found
    nbr: dict[int, set[int]] = {}
    parallel: dict[int, bool] = {}
    for b in found:
        if b.removable:
            continue
        nbr.setdefault(b.i, set()).add(b.j)
        nbr.setdefault(b.j, set()).add(b.i)
        x = pd[b.i]
        parallel[b.i] = parallel[b.j] = (_incoming(x, signs[b.i], b.s)
                                         == _incoming(x, signs[b.i], (b.s - 1) % 4))
    seen: set[int] = set()
    out = []
    for c in sorted(nbr):
        if c in seen:
            continue
        ends = [e for e in _component(nbr, c) if len(nbr[e]) == 1]
        start = min(ends) if ends else c
        chain, prev, cur = [start], None, start
        while True:
            nxt = [n for n in sorted(nbr[cur]) if n != prev and n not in chain]
            if not nxt:
                break
            prev, cur = cur, nxt[0]
            chain.append(cur)
        seen.update(chain)
        out.append(TwistChain(tuple(chain), not ends and len(chain) > 2, parallel[start]))
    out.sort(key=lambda ch: (-len(ch.crossings), ch.crossings[0]))
    return out


def _component(nbr: dict[int, set[int]], c: int) -> list[int]:
    stack, seen = [c], {c}
    while stack:
        u = stack.pop()
        for w in nbr[u]:
            if w not in seen:
                seen.add(w)
                stack.append(w)
    return sorted(seen)
