"""Diagram facts and classical bounds a census user filters on.

=========================  ==============================================================
``is_reduced``             no nugatory crossing (a face meets itself at the crossing)
``crossing_number_bound``  (n, True) for a connected reduced alternating diagram
                           (Kauffman 1987, Murasugi 1987, Thistlethwaite 1987 [1]_),
                           else (n − #nugatory, False): an upper bound
``arf_invariant``          knots: 0 iff det ≡ ±1 (mod 8) (Levine 1966 [2]_, Murakami 1986 [3]_)
``linking_numbers``        links: half the sum of the signs of the crossings between two
                           components
``genus_lower_bound``      2g + c − 1 ≥ span Δ (knots: g ≥ span Δ / 2) (Seifert 1935 [4]_)
``four_genus_lower_bound`` knots: g₄ ≥ |σ| / 2 (Murasugi 1965 [5]_)
``slice_obstructed``       knots: slice ⇒ Δ = f(t)f(1/t) ⇒ det = f(−1)² is a square
                           (Fox–Milnor 1966 [6]_); True when det is not a square
``unknotting_lower_bound`` knots: u ≥ number of non-unit invariant factors (Wendt 1937 [7]_)
``bridge_lower_bound``     b ≥ number of non-unit invariant factors + 1 (Wendt 1937 [7]_:
                           the double branched cover of a b-bridge link has a Heegaard
                           splitting of genus b − 1)
=========================  ==============================================================

Free loops count as split components: a diagram with free loops is not connected.

References
----------
.. [1] L. H. Kauffman, "State models and the Jones polynomial", Topology 26 (1987);
   K. Murasugi, "Jones polynomials and classical conjectures" (knots),
   Topology 26 (1987); M. B. Thistlethwaite, "A spanning tree expansion of the Jones
   polynomial", Topology 26 (1987).
.. [2] J. Levine, "Polynomial invariants of knots of codimension two", Ann. of Math. 84 (1966).
.. [3] H. Murakami, "A recursive calculation of the Arf invariant of a link",
   J. Math. Soc. Japan 38 (1986).
.. [4] H. Seifert, "Über das Geschlecht von Knoten", Math. Ann. 110 (1935).
.. [5] K. Murasugi, "On a certain numerical invariant of link types", Trans. AMS 117 (1965).
.. [6] R. H. Fox, J. W. Milnor, "Singularities of 2-spheres in 4-space and cobordism
   of knots", Osaka J. Math. 3 (1966).
.. [7] H. Wendt, "Die gordische Auflösung von Knoten", Math. Z. 42 (1937).
"""

from __future__ import annotations

from math import ceil, isqrt
from typing import Any, Mapping, Optional, Sequence

from ..diagrams import simplify as _diagram_facts
from ..diagrams.diagram import Diagram
from .linking import linking_numbers
from .poly import Laurent
from .row import InvariantValues

__all__ = [
    "nugatory_crossings",
    "is_reduced",
    "is_connected",
    "crossing_number_bound",
    "arf_invariant",
    "linking_numbers",
    "genus_lower_bound",
    "four_genus_lower_bound",
    "slice_obstructed",
    "unknotting_lower_bound",
    "bridge_lower_bound",
    "all_bounds",
]


def nugatory_crossings(diagram: Diagram) -> list[int]:
    """Indices of the nugatory crossings: those where one face meets itself.

    See :func:`pipeline.diagrams.simplify.nugatory_crossings` (the one implementation).
    """
    return _diagram_facts.nugatory_crossings(diagram)


def is_reduced(diagram: Diagram) -> bool:
    """True when the diagram has no nugatory crossing."""
    return _diagram_facts.is_reduced(diagram)


def is_connected(diagram: Diagram) -> bool:
    """True for a diagram with one piece and no free loops (or a single free loop)."""
    return _diagram_facts.is_connected(diagram)


def crossing_number_bound(diagram: Diagram) -> tuple[int, bool]:
    """Crossing number: (value, certified).

    Certified (Kauffman–Murasugi–Thistlethwaite 1987) for a connected, reduced,
    alternating diagram: the crossing number is its number of crossings.  Otherwise
    an upper bound: the crossings minus the nugatory ones (each nugatory crossing is
    undone by turning one side of its separating circle over).

    Examples
    --------
    >>> from pipeline.diagrams.notation import parse
    >>> crossing_number_bound(parse("conway:2 2")), crossing_number_bound(parse("braid:1"))
    ((4, True), (0, False))
    """
    cn = _diagram_facts.alternating_crossing_number(diagram)
    if cn is not None:
        return cn, True
    return diagram.n_crossings - len(nugatory_crossings(diagram)), False


def arf_invariant(determinant: int) -> Optional[int]:
    """Arf invariant of a knot from its determinant: 0 iff det ≡ ±1 (mod 8).

    Levine 1966 / Murakami 1986: Arf(K) = 0 iff Δ(−1) ≡ ±1 (mod 8); since
    det = |Δ(−1)| and the condition is symmetric under sign, det suffices.
    Returns None when det is even (not a knot's determinant: Arf undefined here).
    """
    if determinant % 2 == 0:
        return None
    return 0 if determinant % 8 in (1, 7) else 1


def genus_lower_bound(alexander: Laurent, components: int = 1) -> int:
    """Seifert genus bound from the Conway-normalised Alexander polynomial.

    A Seifert surface of genus g of a c-component link gives a Seifert matrix of size
    2g + c − 1, so span Δ ≤ 2g + c − 1 and g ≥ ⌈(span Δ − c + 1) / 2⌉ (knots:
    g ≥ span Δ / 2).  Δ = 0 gives 0.
    """
    if not alexander:
        return 0
    excess = alexander.span() - components + 1
    return max(0, ceil(excess / 2))


def four_genus_lower_bound(signature: int) -> int:
    """Knots: g₄ ≥ |σ| / 2 (Murasugi 1965)."""
    return abs(signature) // 2


def slice_obstructed(determinant: int) -> bool:
    """Knots: True when det is not a perfect square, which proves the knot is not slice.

    Fox–Milnor 1966: a slice knot has Δ(t) = f(t) f(t⁻¹), hence det = |Δ(−1)| = f(−1)².
    """
    d = abs(determinant)
    return isqrt(d) ** 2 != d


def _nonunit(factors: Sequence[int]) -> int:
    return sum(1 for f in factors if f != 1)


def unknotting_lower_bound(invariant_factors: Sequence[int]) -> int:
    """Knots: u(K) ≥ number of non-unit invariant factors (Wendt 1937).

    The factors are those of the colouring module (README.md): for a knot they are
    the invariant factors of H₁(Σ₂), and a crossing change alters a presentation
    matrix of H₁(Σ₂) in one row, so u(K) ≥ its minimal number of generators.
    """
    return _nonunit(invariant_factors)


def bridge_lower_bound(invariant_factors: Sequence[int]) -> int:
    """b(L) ≥ (number of non-unit invariant factors, zeros included) + 1 (Wendt 1937)."""
    return _nonunit(invariant_factors) + 1


def all_bounds(diagram: Diagram, values: "InvariantValues | Mapping[str, Any]") -> dict[str, Any]:
    """Every fact and bound above that the available values allow (census row part).

    Keys: ``alternating``, ``reduced``, ``nugatory``, ``crossing_number``,
    ``crossing_number_certified``, and when the inputs are present: ``linking_numbers``
    (links; JSON-friendly ``{"i-j": lk}``), ``arf`` (knots), ``genus_lower_bound``,
    ``four_genus_lower_bound`` (knots), ``slice_obstructed`` (knots),
    ``unknotting_lower_bound`` (knots), ``bridge_lower_bound``.

    ``values`` is an :class:`~pipeline.invariants.row.InvariantValues` (a mapping is read
    through :meth:`~pipeline.invariants.row.InvariantValues.from_record`).
    """
    values = InvariantValues.coerce(values)
    out: dict[str, Any] = {}
    c = diagram.n_components if values.components is None else values.components
    out["alternating"] = diagram.is_alternating()
    nug = nugatory_crossings(diagram)
    out["reduced"] = not nug
    out["nugatory"] = len(nug)
    out["crossing_number"], out["crossing_number_certified"] = crossing_number_bound(diagram)
    if c > 1:
        out["linking_numbers"] = {f"{i}-{j}": v for (i, j), v in linking_numbers(diagram).items()}
    det, factors = values.determinant, values.invariant_factors
    alex, sig = values.alexander, values.signature
    if c == 1 and det is not None:
        out["arf"] = arf_invariant(det)
        out["slice_obstructed"] = slice_obstructed(det)
    if alex is not None:
        out["genus_lower_bound"] = genus_lower_bound(alex, c)
    if c == 1 and sig is not None:
        out["four_genus_lower_bound"] = four_genus_lower_bound(sig)
    if factors is not None:
        if c == 1:
            out["unknotting_lower_bound"] = unknotting_lower_bound(factors)
        out["bridge_lower_bound"] = bridge_lower_bound(factors)
    return out
