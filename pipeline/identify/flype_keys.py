"""Keys of alternating diagrams: simplify, split into prime summands, flype normal form.

This module holds rules (a) and (c) of the key precedence of
:mod:`pipeline.identify.classify` (read that docstring first).

Rule (c): a reduced prime alternating diagram
---------------------------------------------
Let ``D`` be reduced, visibly prime and alternating with n crossings (after
:func:`pipeline.diagrams.simplify.simplify`).  Its flype class is a complete invariant
of the unoriented link (W. Menasco, M. Thistlethwaite, "The classification of
alternating links", Annals of Math. 138, 1993), computed by
:func:`pipeline.diagrams.flype.flype_codes` as ``(code, mirror_code)``.

*Two-bridge recognition first* (so one type gets one key): b(α, β) has determinant α,
a cyclic colouring module (invariant factors ``(α,)``; H₁ of the double branched cover
is Z/α), and a reduced alternating diagram ``rational:α/β`` (0 < β < α, all-positive
continued fraction) with the sum of the terms as crossing count.  If ``D`` were
b(α, β'), its crossing number n would equal that sum (Kauffman; Murasugi;
Thistlethwaite, Topology 26, 1987: both diagrams are reduced alternating), its Jones
polynomial would equal the candidate's, and by the flyping theorem the flype code of
``rational:α/β'`` would equal ``code``.  So we try every β (one per class
{β, β⁻¹, −β, −β⁻¹} mod α) with equal crossing sum (and, for knots, Jones polynomial
equal to the candidate's or to its mirror's) and compare flype codes: a match gives the
Schubert key :func:`pipeline.identify.normal_forms.two_bridge_nf` (H. Schubert,
Math. Z. 65, 1956); no match *proves* ``D`` is not two-bridge (the argument above,
read backwards) and the key is the flype key.

*Flype key* (text of this code base): ``alt:`` followed by the first 24 hex digits of
the sha256 of the UTF-8 flype code (the compositional ``ft:...`` code,
:func:`pipeline.diagrams.flype.flype_code`, computed without a search, so ``budget``
only bounds the reference routes); the mirror key is the same digest of the mirror
code.  Amphichiral iff both codes agree.
Crossing number certified = n (Kauffman, Murasugi, Thistlethwaite 1987).

Rule (a): split and composite diagrams
--------------------------------------
:func:`pipeline.diagrams.primality.decompose` (after simplification) gives the split
pieces and the visible summands of each piece.  When every summand is reduced
alternating (prime by W. Menasco, Topology 23, 1984) and is keyed by rule (c), a piece
of one component is keyed by :func:`~pipeline.identify.normal_forms.connected_sum_nf`
(unique prime decomposition of knots, H. Schubert, "Die eindeutige Zerlegbarkeit eines
Knotens in Primknoten", Sitzungsber. Heidelb. Akad. Wiss., 1949) and the pieces by
:func:`~pipeline.identify.normal_forms.split_nf` (a connected reduced alternating
diagram is non-split, Menasco 1984, so the pieces are the split components).  A
composite piece with several components is not keyed here (which components the
summands join is not recorded by a chain key in general): the row falls to the next rule.

Budgets: ``BudgetExceeded`` from simplify or a flype orbit never gives a key here; the
caller falls back to the next rule and the reason says so.
"""

from __future__ import annotations

import hashlib
from dataclasses import dataclass, field
from math import gcd
from typing import Optional

from ..diagrams.diagram import Diagram
from ..diagrams.flype import FLYPE_BUDGET, NotReducedAlternating, flype_code, flype_codes
from ..diagrams.simplify import DEFAULT_BUDGET as SIMPLIFY_BUDGET
from ..errors import BudgetExceeded
from .normal_forms import CN_ALT, NormalForm, connected_sum_nf, euclid_terms, split_nf, two_bridge_nf

__all__ = ["FLYPE_REASON", "SIMPLIFY_BUDGET", "FLYPE_BUDGET", "FAMILY_CHECK_CROSSINGS", "Structure", "flype_key",
           "alternating_nf", "two_bridge_of", "structure"]

FLYPE_REASON = ("flyping theorem: reduced prime alternating diagrams of one link are related by flypes "
                "(W. Menasco, M. Thistlethwaite, \"The classification of alternating links\", "
                "Annals of Math. 138, 1993)")
#: Family rows keyed by their normal form (rule (b)) get their flype code, for the
#: knots-table check only, up to this many crossings (flype orbits of long twist
#: regions, e.g. T(2, n), are slow to search; the key does not need the code).
FAMILY_CHECK_CROSSINGS = 12

SCHUBERT_REASON = ("two-bridge b({a}, {b}) recognised by its flype class (flyping theorem, "
                   "Menasco-Thistlethwaite 1993) and keyed by Schubert's classification (Math. Z. 65, 1956)")


def flype_key(code: str) -> str:
    """The flype key of a flype code: ``alt:`` + 24 hex digits of its sha256.

    Examples
    --------
    >>> flype_key("pd:[]")[:4]
    'alt:'
    """
    return "alt:" + hashlib.sha256(code.encode("utf-8")).hexdigest()[:24]


@dataclass
class Structure:
    """What rules (a) and (c) found for one diagram (see the module notes).

    ``nf`` is the key (None: no proof here, use the next rule); ``note`` says why not
    (a budget, a non-alternating summand, ...).
    """

    simplified: Optional[Diagram] = None
    simplify_moves: dict = field(default_factory=dict)
    simplified_smaller: bool = False
    prime: Optional[bool] = None
    prime_reason: Optional[str] = None
    summands: list = field(default_factory=list)          # [(pieces index, Diagram, nf or None)]
    flype_code: Optional[str] = None
    mirror_code: Optional[str] = None
    nf: Optional[NormalForm] = None
    rule: Optional[str] = None                            # "split/composite" or "alternating"
    key_reason: Optional[str] = None
    notes: list = field(default_factory=list)


def _jones_of_rational(a: int, b: int):
    from ..diagrams.notation import parse
    from ..invariants.jones.frontier import jones_from_bracket
    from ..invariants.jones.tangle_bracket import bracket_of_notation
    text = f"rational:{a}/{b}"
    return jones_from_bracket(bracket_of_notation(text), parse(text).writhe)


def two_bridge_of(diagram: Diagram, code: str, mirror_code: str, *, jones=None,
                  budget: int = FLYPE_BUDGET) -> Optional[tuple[int, int]]:
    """(α, β) with ``diagram`` = b(α, β), or None when it is proven not two-bridge.

    ``diagram`` is reduced prime alternating with flype codes ``(code, mirror_code)``;
    ``jones`` (a knot's Jones polynomial, optional) only prunes candidates.  Every
    candidate with equal determinant and crossing sum is compared by flype code (module
    notes: the comparison is exhaustive, so None is a proof).

    Raises
    ------
    BudgetExceeded
        A candidate's flype orbit is over ``budget`` (no verdict then).
    """
    from ..diagrams.notation import parse
    from ..invariants.coloring import spectrum as coloring
    if coloring.invariant_factors(diagram) != (alpha := coloring.determinant(diagram),) or alpha < 2:
        return None                                     # not cyclic: not two-bridge
    n = diagram.n_crossings
    knot = diagram.n_components == 1
    seen = set()
    for b in range(1, alpha):
        if gcd(alpha, b) != 1:
            continue
        inv = pow(b, -1, alpha)
        rep = min(b, inv, alpha - b, alpha - inv)
        if rep in seen:
            continue
        seen.add(rep)
        if sum(euclid_terms(alpha, rep)) != n:
            continue
        if knot and jones is not None:
            j = _jones_of_rational(alpha, rep)
            if jones != j and jones != j.invert():
                continue
        c = flype_code(parse(f"rational:{alpha}/{rep}"), budget=budget)
        if c == code:
            return alpha, rep
        if c == mirror_code:
            return alpha, -rep
    return None


def alternating_nf(diagram: Diagram, *, budget: int = FLYPE_BUDGET, jones=None,
                   codes: Optional[tuple[str, str]] = None) -> tuple[NormalForm, str, str, str]:
    """Rule (c) for a reduced prime alternating diagram: (normal form, code, mirror code, reason).

    Raises
    ------
    NotReducedAlternating
        The diagram does not qualify.
    BudgetExceeded
        A flype orbit (of the diagram or a two-bridge candidate) is over ``budget``.
    """
    code, mcode = codes if codes is not None else flype_codes(diagram, budget=budget)
    n = diagram.n_crossings
    tb = two_bridge_of(diagram, code, mcode, jones=jones, budget=budget)
    if tb is not None:
        nf = two_bridge_nf(*tb)
        return nf, code, mcode, SCHUBERT_REASON.format(a=tb[0], b=tb[1])
    # Not two-bridge (proven by two_bridge_of's exhaustive comparison): the flype key.
    amph = code == mcode
    reason = FLYPE_REASON + (": the mirror has the same flype class" if amph
                             else ": the mirror's flype class differs")
    nf = NormalForm(flype_key(code), flype_key(mcode), diagram.n_components, reason, n, CN_ALT)
    return nf, code, mcode, FLYPE_REASON + "; not two-bridge (no rational candidate has this flype class)"


def _simplify(diagram: Diagram, budget: int, st: Structure) -> Diagram:
    from ..diagrams.simplify import simplify
    try:
        r = simplify(diagram, seed=0, budget=budget, strict=True)
    except BudgetExceeded as err:
        st.notes.append(f"{err} (the diagram as given is used)")
        return diagram
    st.simplify_moves = dict(r.moves)
    st.simplified_smaller = r.smaller
    return r.diagram


def structure(diagram: Diagram, *, simplify_budget: int = SIMPLIFY_BUDGET,
              flype_budget: int = FLYPE_BUDGET, jones=None, key: bool = True) -> Structure:
    """Simplify, decompose and key ``diagram`` by rules (a) and (c).

    ``jones`` is the Jones polynomial of ``diagram`` (optional, prunes the two-bridge
    candidates of a knot; a knot invariant, so valid for the simplified summand too).
    ``key=False`` (a family row keyed by its normal form): rule (a) and the crossingless
    case still key, but a prime alternating diagram only gets its flype codes (for the
    knots-table check, up to :data:`FAMILY_CHECK_CROSSINGS` crossings), no key.  Never
    raises for a budget: the notes say what ran out.
    """
    from ..diagrams.primality import decompose
    st = Structure()
    s = _simplify(diagram, simplify_budget, st)
    st.simplified = s
    dec = decompose(s, simplify_first=True, budget=simplify_budget)
    st.prime, st.prime_reason = dec.prime, dec.reason
    pieces = dec.pieces
    if len(pieces) == 1 and len(pieces[0]) == 1:
        d = pieces[0][0].diagram
        if d.n_crossings == 0 and d.n_components == 1:
            st.nf, st.rule = two_bridge_nf(1, 0), "simplified"
            st.key_reason = "Reidemeister moves (Reidemeister 1927) reach a crossingless diagram of one loop"
        elif d.n_crossings and pieces[0][0].prime:
            _rule_c(st, d, flype_budget, jones, key)
        return st
    _rule_a(st, pieces, flype_budget)
    return st


def _rule_c(st: Structure, d: Diagram, budget: int, jones, key: bool) -> None:
    """Rule (c) on the one prime summand ``d``; ``key=False``: only its flype codes."""
    try:
        if not key:
            if d.n_crossings <= FAMILY_CHECK_CROSSINGS:
                st.flype_code, st.mirror_code = flype_codes(d, budget=budget)
            return
        nf, code, mcode, reason = alternating_nf(d, budget=budget, jones=jones)
    except BudgetExceeded as err:
        st.notes.append(f"{err}: no flype normal form")
        return
    except NotReducedAlternating as err:
        st.notes.append(str(err))
        return
    st.flype_code, st.mirror_code, st.nf, st.rule, st.key_reason = code, mcode, nf, "alternating", reason


def _rule_a(st: Structure, pieces, budget: int) -> None:
    piece_nfs = []
    for k, piece in enumerate(pieces):
        nfs = []
        for sm in piece:
            d = sm.diagram
            if d.n_crossings == 0:
                if d.n_components != 1:
                    st.notes.append("a crossingless summand of several loops")
                    return
                nfs.append(two_bridge_nf(1, 0))      # the unknot
                continue
            if not sm.prime:
                st.notes.append("a summand is not reduced alternating: no key from its summands")
                return
            try:
                nf = alternating_nf(d, budget=budget)[0]
            except BudgetExceeded as err:
                st.notes.append(f"{err}: a summand has no flype normal form")
                return
            st.summands.append((k, d, nf))
            nfs.append(nf)
        if len(nfs) > 1 and any(nf.components != 1 for nf in nfs):
            st.notes.append("a composite piece with several components: not keyed from its summands")
            return
        piece_nfs.append(nfs[0] if len(nfs) == 1 else connected_sum_nf(nfs))
    st.nf = piece_nfs[0] if len(piece_nfs) == 1 else split_nf(piece_nfs)
    st.rule = "split/composite"
    parts = []
    if any(len(p) > 1 for p in pieces):
        parts.append("unique prime decomposition of knots (H. Schubert, Sitzungsber. Heidelb. Akad. "
                     "Wiss., 1949) over prime summands keyed by the flyping theorem (Menasco-"
                     "Thistlethwaite 1993; reduced alternating summands are prime, Menasco 1984)")
    if len(pieces) > 1:
        parts.append("split components are unique; each piece keyed by its summands")
    st.key_reason = "; ".join(parts)
