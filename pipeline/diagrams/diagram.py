"""The one core type: an oriented link diagram given by a PD code.

PD convention (README.md, contract): edges carry positive integer labels, each on
exactly two crossing slots; along every component the labels are consecutive in the
direction of orientation (wrapping within the component).  A crossing is a 4-tuple
``(a, b, c, d)`` listed counterclockwise starting at the incoming under-strand ``a``
(``c`` is the outgoing under-strand).  The crossing is positive when the over-strand
runs from ``d`` to ``b`` and negative when it runs from ``b`` to ``d``.

A component's direction is read from its under-passages (``a -> c``).  A component
that never passes under is oriented by its labels when it has three or more edges;
with one or two edges the labels cannot tell, and the rule is that its smallest
label *enters* the first listed crossing it meets (a one-edge loop enters at ``d``).

Crossingless components (unknotted free loops, e.g. braid strands that never cross)
cannot be written in a PD code; :class:`Diagram` carries them as ``free_loops``.

References
----------
1. L. H. Kauffman, "State models and the Jones polynomial", Topology 26 (1987):
   diagrams as 4-valent plane graphs with over/under information.
2. R. H. Crowell, R. H. Fox, introductory textbook, Ginn (1963): arcs (over-strands)
   as the generators of the Wirtinger presentation.
"""

from __future__ import annotations

import json
from dataclasses import dataclass, field
from functools import cached_property
from typing import Iterable, Sequence

from ..errors import DiagramError
from .plane import check_planar, connected_pieces, slots_of, trace_faces

__all__ = ["Diagram", "Slot"]

#: A crossing slot: (crossing index, position 0..3 in the counterclockwise tuple).
Slot = tuple[int, int]


@dataclass(frozen=True, eq=False)
class Diagram:
    """An oriented link diagram: a validated PD code plus a number of free loops.

    Build one with :meth:`from_pd` (validates) or from a notation string with
    :func:`pipeline.diagrams.notation.parse`.  Instances are immutable; every derived
    property is computed once on first use.  Equality and hashing are by the PD
    tuple and the loop count as given (relabelled copies are different objects;
    see :mod:`pipeline.identify.classify` for the relabelling-invariant ``diagram_id``).

    Attributes
    ----------
    pd : tuple of 4-tuples of int
        The crossings, each ``(a, b, c, d)`` in the contract convention.
    free_loops : int
        Number of crossingless unknotted components.
    """

    pd: tuple[tuple[int, int, int, int], ...]
    free_loops: int = 0
    _cache: dict = field(default_factory=dict, repr=False, compare=False)

    # ------------------------------------------------------------------ building
    @classmethod
    def from_pd(cls, pd: Iterable[Sequence[int]], *, free_loops: int = 0) -> "Diagram":
        """Validate a PD code and return the diagram.

        Raises
        ------
        DiagramError
            One-line reason: wrong tuple length, non-integer or non-positive
            label, a label not used exactly twice, inconsistent orientation,
            an empty diagram, or a non-planar (virtual) code.
        """
        crossings = []
        for i, x in enumerate(pd):
            if isinstance(x, (str, bytes)) or not hasattr(x, "__len__"):
                raise DiagramError(f"pd: crossing {i + 1} is {x!r}, not a list of 4 labels")
            if len(x) != 4:
                raise DiagramError(
                    f"pd: crossing {i + 1} {list(x)} has {len(x)} labels (each crossing needs exactly 4)")
            row = []
            for v in x:
                if isinstance(v, bool) or not isinstance(v, int):
                    raise DiagramError(f"pd: label {v!r} in crossing {i + 1} is not an integer")
                if v <= 0:
                    raise DiagramError(f"pd: label {v} in crossing {i + 1} is not positive")
                row.append(int(v))
            crossings.append(tuple(row))
        if isinstance(free_loops, bool) or not isinstance(free_loops, int) or free_loops < 0:
            raise DiagramError(f"pd: free loop count {free_loops!r} must be a non-negative integer")
        if not crossings and free_loops == 0:
            raise DiagramError("pd: the diagram is empty (no crossings and no free loops)")
        d = cls(tuple(crossings), free_loops)
        d._validate()
        return d

    def __eq__(self, other: object) -> bool:
        return isinstance(other, Diagram) and self.pd == other.pd and self.free_loops == other.free_loops

    def __hash__(self) -> int:
        return hash((self.pd, self.free_loops))

    def __repr__(self) -> str:
        return f"Diagram({self.to_notation()})"

    # ------------------------------------------------------------------ basics
    @property
    def n_crossings(self) -> int:
        """Number of crossings."""
        return len(self.pd)

    @property
    def n_components(self) -> int:
        """Number of link components, free loops included."""
        return len(self.components) + self.free_loops

    @property
    def labels(self) -> tuple[int, ...]:
        """The edge labels, sorted."""
        return self._get("labels", lambda: tuple(sorted({v for x in self.pd for v in x})))

    def _get(self, key, make):
        c = self._cache
        if key not in c:
            c[key] = make()
        return c[key]

    @cached_property
    def _slots_of(self) -> dict[int, list[Slot]]:
        return slots_of(self.pd)

    def twin(self, slot: Slot) -> Slot:
        """The other end of the edge at ``slot``."""
        i, s = slot
        a, b = self._slots_of[self.pd[i][s]]
        return b if a == slot else a

    # ------------------------------------------------------------------ orientation
    @cached_property
    def _traversal(self) -> tuple[tuple[tuple[Slot, ...], ...], dict[int, bool]]:
        """Walk every component; return entry slots per component and, per crossing,
        whether the over-strand enters at ``d`` (i.e. the crossing is positive)."""
        pd = self.pd
        entered: dict[Slot, int] = {}  # entry slot -> component index
        comps: list[tuple[Slot, ...]] = []

        def walk(start: Slot) -> tuple[Slot, ...]:
            path, slot = [], start
            while True:
                if slot in entered:
                    raise DiagramError(
                        f"pd: inconsistent orientation at label {pd[slot[0]][slot[1]]} "
                        f"(a strand is entered twice at crossing {slot[0] + 1})")
                entered[slot] = len(comps)
                path.append(slot)
                i, s = slot
                nxt = self.twin((i, (s + 2) % 4))
                if nxt == start:
                    return tuple(path)
                slot = nxt

        # components that pass under: start at the first listed under-passage
        for i in range(len(pd)):
            if (i, 0) not in entered:
                comps.append(walk((i, 0)))
        # over-only components
        seen_labels = {pd[i][s] for (i, s) in entered}
        for v in self.labels:
            if v in seen_labels:
                continue
            comp_labels = self._component_labels(v)
            start = self._over_only_entry(comp_labels)
            path = walk(start)
            comps.append(path)
            seen_labels.update(pd[i][s] for (i, s) in path)
        over_from_d = {}
        for i, x in enumerate(pd):
            if (i, 0) in entered and (i, 2) in entered:
                raise DiagramError(
                    f"pd: inconsistent orientation at crossing {i + 1} {list(x)} "
                    f"(the under-strand must enter at the first label {x[0]})")
            d_in, b_in = (i, 3) in entered, (i, 1) in entered
            if d_in == b_in:
                raise DiagramError(
                    f"pd: inconsistent orientation at crossing {i + 1} {list(x)} (over-strand entered twice)")
            over_from_d[i] = d_in
        return tuple(comps), over_from_d

    def _component_labels(self, v: int) -> list[int]:
        """Labels of the component through label v, found by following strands."""
        out, stack, seen = [], [v], {v}
        while stack:
            u = stack.pop()
            out.append(u)
            for (i, s) in self._slots_of[u]:
                w = self.pd[i][(s + 2) % 4]
                if w not in seen:
                    seen.add(w)
                    stack.append(w)
        return sorted(out)

    def _over_only_entry(self, comp_labels: list[int]) -> Slot:
        m = comp_labels[0]
        ends = sorted(self._slots_of[m])
        if len(comp_labels) >= 3:
            # labels fix the direction: m enters the crossing where m+1 leaves
            succ = comp_labels[1]
            for (i, s) in ends:
                if self.pd[i][(s + 2) % 4] == succ:
                    return (i, s)
            raise DiagramError(f"pd: labels of the component through {m} are not consecutive")
        if len(comp_labels) == 1:
            (i, s1), (_, s2) = ends
            return (i, s1 if s1 == 3 else s2)  # one-edge loop over one crossing enters at d
        return ends[0]

    def _validate(self) -> None:
        pd = self.pd
        counts: dict[int, int] = {}
        for x in pd:
            for v in x:
                counts[v] = counts.get(v, 0) + 1
        for v in sorted(counts):
            if counts[v] != 2:
                raise DiagramError(
                    f"pd: label {v} appears {counts[v]} time{'s' if counts[v] != 1 else ''} "
                    f"(each label must appear exactly twice)")
        comps, _ = self._traversal
        # labels consecutive along each component in the direction of travel
        for path in comps:
            seq = [pd[i][s] for (i, s) in path]  # label entering each visited slot
            ordered = sorted(seq)
            if ordered != list(range(ordered[0], ordered[0] + len(ordered))):
                raise DiagramError(
                    f"pd: labels {ordered} of one component are not consecutive integers")
            lo, n = ordered[0], len(ordered)
            for k in range(n):
                if seq[(k + 1) % n] != lo + ((seq[k] - lo + 1) % n):
                    raise DiagramError(
                        f"pd: inconsistent orientation: label {seq[k]} is followed by "
                        f"{seq[(k + 1) % n]} along its component (labels must increase "
                        f"along the orientation read from the under-strands a -> c)")
        check_planar(pd, self.pieces, self.faces)

    @property
    def pieces(self) -> list[list[int]]:
        """Connected pieces (split components of the diagram), as crossing indices."""
        return self._get("pieces", lambda: connected_pieces(self.pd, self._slots_of))

    # ------------------------------------------------------------------ derived data
    @property
    def components(self) -> tuple[tuple[int, ...], ...]:
        """Edge labels of each component with crossings, in orientation order.

        Components are listed in order of their smallest label; free loops are not
        included (see ``free_loops``).
        """
        def make():
            comps, _ = self._traversal
            out = [tuple(self.pd[i][s] for (i, s) in path) for path in comps]
            out = [tuple(c[c.index(min(c)):] + c[:c.index(min(c))]) for c in out]
            return tuple(sorted(out))
        return self._get("components", make)

    @property
    def component_of_label(self) -> dict[int, int]:
        """Map edge label -> index into :attr:`components`."""
        return self._get("component_of_label",
                         lambda: {v: k for k, c in enumerate(self.components) for v in c})

    @property
    def signs(self) -> tuple[int, ...]:
        """Crossing signs (+1 when the over-strand runs d -> b, -1 when b -> d)."""
        return self._get("signs", lambda: tuple(1 if self._traversal[1][i] else -1
                                               for i in range(len(self.pd))))

    @property
    def writhe(self) -> int:
        """Sum of the crossing signs."""
        return sum(self.signs)

    def over_labels(self, i: int) -> tuple[int, int]:
        """(incoming, outgoing) labels of the over-strand at crossing ``i``."""
        a, b, c, d = self.pd[i]
        return (d, b) if self.signs[i] > 0 else (b, d)

    @property
    def arcs(self) -> tuple[tuple[int, ...], ...]:
        """Arcs (maximal over-strands) as tuples of edge labels in orientation order.

        An arc starts at the outgoing under-strand ``c`` of a crossing and ends at the
        incoming under-strand ``a`` of the next; a component that never passes under
        is one arc.  Arcs are numbered by their first label, so arc numbers are
        stable and match the columns of :func:`pipeline.invariants.coloring.spectrum.coloring_matrix`.
        """
        def make():
            ends = {x[0] for x in self.pd}  # labels that end an arc
            out = []
            for comp in self.components:
                n = len(comp)
                starts = [k for k in range(n) if comp[k - 1] in ends]
                if not starts:
                    out.append(comp)
                    continue
                for j, k in enumerate(starts):
                    stop = starts[(j + 1) % len(starts)]
                    length = (stop - k) % n or n
                    out.append(tuple(comp[(k + t) % n] for t in range(length)))
            return tuple(sorted(out))
        return self._get("arcs", make)

    @property
    def arc_of_label(self) -> dict[int, int]:
        """Map edge label -> arc index (0-based)."""
        return self._get("arc_of_label", lambda: {v: k for k, a in enumerate(self.arcs) for v in a})

    @property
    def faces(self) -> tuple[tuple[Slot, ...], ...]:
        """Faces of the diagram's plane graph, each a cycle of crossing slots.

        A face is traced by leaving a crossing along the edge at slot ``(i, s)``,
        arriving at its twin ``(j, t)`` and turning to the next slot
        counterclockwise ``(j, t+1)``; each face is listed from its smallest slot.
        """
        return self._get("faces", lambda: trace_faces(self.pd, self._slots_of))

    # ------------------------------------------------------------------ operations
    def mirror(self) -> "Diagram":
        """The mirror image (every crossing changed), same labels and orientation."""
        return self.change_crossings(range(len(self.pd)))

    def change_crossings(self, indices: Iterable[int]) -> "Diagram":
        """The diagram with the crossings ``indices`` switched (over and under exchanged),
        labels and orientation kept: the under-strand a -> c becomes the over-strand, so
        the tuple is rotated to start at the new incoming under-strand."""
        new = list(self.pd)
        signs = self.signs
        for i in set(indices):
            a, b, c, d = new[i]
            new[i] = (d, a, b, c) if signs[i] > 0 else (b, c, d, a)
        return Diagram.from_pd(new, free_loops=self.free_loops)

    def relabel(self) -> "Diagram":
        """The same diagram with labels 1..2n assigned component by component."""
        m, k = {}, 1
        for comp in self.components:
            for v in comp:
                m[v] = k
                k += 1
        return Diagram.from_pd([tuple(m[v] for v in x) for x in self.pd], free_loops=self.free_loops)

    def to_notation(self) -> str:
        """The ``pd:`` notation string (``pd:[...] loops=k`` when there are free loops)."""
        text = "pd:" + json.dumps([list(x) for x in self.pd], separators=(",", ":"))
        if self.free_loops:
            text += f" loops={self.free_loops}"
        return text

    def is_alternating(self) -> bool:
        """True when over and under alternate along every component (free loops ignored)."""
        for path in self._traversal[0]:
            kinds = [s % 2 for (_, s) in path]  # 0 = under (a), 1 = over (b/d)
            if any(kinds[k] == kinds[k - 1] for k in range(len(kinds))):
                return False
        return True
