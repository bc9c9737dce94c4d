"""Per-row relations of HOMFLY-PT, Khovanov homology, s and the Tristram–Levine function.

:func:`strength_checks` is called by :func:`pipeline.invariants.checks.run_checks`; like
every check there, a relation whose inputs are missing (skipped by a budget, or not
computed for this kind of row) is omitted, never reported as passed.  Notation as in
:mod:`pipeline.invariants.checks`; P is the HOMFLY-PT polynomial, Kh (Kh₂) the ranks of
Khovanov homology over Q (F₂), s Rasmussen's invariant, σ_ω the Tristram–Levine function.

==============================  ==========  ==========================================  =================================
name                            applies to  relation                                    source
==============================  ==========  ==========================================  =================================
homfly_jones                    all         P(t, t^½ − t^−½) = V                        Freyd et al. 1985; Jones 1987
homfly_conway                   all         P(1, z) = ∇(z)                              Freyd et al. 1985; Conway 1970
khovanov_euler_jones            all         Σ(−1)^i q^j Kh = (q + q⁻¹)V, t^½ = −q       Khovanov 2000; Bar-Natan 2002
khovanov_f2_euler_jones         all         the same over F₂                            Khovanov 2000; Bar-Natan 2002
khovanov_reduced_euler_jones    knots       Σ(−1)^i q^j Kh_red = V, t^½ = −q            Khovanov 2003
khovanov_f2_dominates           all         rank Kh₂^{i,j} ≥ rank Kh^{i,j}              universal coefficients (common
                                                                                        practice: Kh over Z is finitely
                                                                                        generated)
khovanov_lee_generators         knots       Kh^{0,s−1} ≠ 0 and Kh^{0,s+1} ≠ 0           Lee 2005; Rasmussen 2010
rasmussen_even                  knots       s is even                                   Rasmussen 2010
rasmussen_seifert_bound         knots       |s| ≤ 2g₄ ≤ n − #Seifert circles + 1        Rasmussen 2010; Seifert 1935
rasmussen_four_genus_agree      knots       max(|σ|, |s|)/2 ≤ n − #Seifert circles + 1  Murasugi 1965; Rasmussen 2010
                                            over 2 (stored lower bound ≤ upper bound)
tristram_levine_at_minus_one    all         σ_{−1} = σ                                  Tristram 1969; Levine 1969
khovanov_alternating_diagonals  reduced     Kh on the diagonals j − 2i = −σ ± 1         Lee 2005
                                alt. knots
khovanov_alternating_rank       reduced     Σ rank Kh = det + 1                         Lee 2005; Manolescu–Ozsváth 2008
                                alt. knots
rasmussen_alternating           reduced     s = −σ                                      Lee 2005; Rasmussen 2010
                                alt. knots
khovanov_uct                    ≤ 12        Kh₂^{i,j} = free^{i,j} + t₂^{i,j} +         universal coefficients: Hatcher
                                crossings   t₂^{i+1,j} (Kh over Z: free ranks = Kh,     2002, Thm. 3.2
                                            t₂ = number of even invariant factors)
khovanov_alternating_torsion    reduced     every torsion summand of Kh over Z is Z/2   Shumakovitch 2014
                                alt. knots
==============================  ==========  ==========================================  =================================

Signs: the project's σ has σ(positive trefoil) = −2 and s is normalised so that positive
torus knots have s = (p − 1)(q − 1) (Rasmussen), so for alternating knots s = −σ and the
two diagonals are j − 2i = s ± 1 (positive trefoil: ranks at (0,1), (0,3), (2,5), (3,9),
δ ∈ {1, 3}).  The genus bound uses the canonical Seifert surface of the diagram, of genus
(n − #circles + 1)/2 for a knot (Seifert's algorithm), which bounds g ≥ g₄ from above.
``khovanov_uct`` applies where Kh₂ has a run of its own (diagrams of at most
``INDEPENDENT_F2_CROSSINGS`` = 12 crossings, :mod:`pipeline.invariants.khovanov.data`);
above, Kh₂ is computed from Kh over Z by that relation, and checking it would be empty.

References
----------
1. P. Freyd, D. Yetter, J. Hoste, W. B. R. Lickorish, K. Millett, A. Ocneanu, Bull. AMS 12
   (1985); V. F. R. Jones, Ann. of Math. 126 (1987).
2. M. Khovanov, "A categorification of the Jones polynomial", Duke Math. J. 101 (2000);
   D. Bar-Natan, Algebr. Geom. Topol. 2 (2002); M. Khovanov, "Patterns in knot
   cohomology I", Experiment. Math. 12 (2003).
3. E. S. Lee, "An endomorphism of the Khovanov invariant", Adv. Math. 197 (2005).
4. J. Rasmussen, "Khovanov homology and the slice genus", Invent. Math. 182 (2010).
5. C. Manolescu, P. Ozsváth, "On the Khovanov and knot Floer homologies of
   quasi-alternating links", Proc. Gökova Geometry-Topology Conference (2008).
6. A. G. Tristram, Proc. Cambridge Philos. Soc. 66 (1969); J. Levine, Comment. Math.
   Helv. 44 (1969).
7. A. Hatcher, *Algebraic Topology*, Cambridge University Press (2002), Thm. 3.2 (universal
   coefficients, for a cochain complex of free abelian groups).
8. A. Shumakovitch, "Torsion of Khovanov homology", Fund. Math. 225 (2014): non-split
   alternating links have only Z/2 torsion.
"""

from __future__ import annotations

from ..diagrams.diagram import Diagram
from ..diagrams.simplify import is_reduced
from .row import InvariantValues

__all__ = ["strength_checks", "seifert_circle_count", "STRENGTH_CHECK_NAMES"]

STRENGTH_CHECK_NAMES = (
    "homfly_jones", "homfly_conway", "khovanov_euler_jones", "khovanov_f2_euler_jones",
    "khovanov_reduced_euler_jones", "khovanov_f2_dominates", "khovanov_lee_generators",
    "rasmussen_even", "rasmussen_seifert_bound", "rasmussen_four_genus_agree",
    "tristram_levine_at_minus_one", "khovanov_alternating_diagonals",
    "khovanov_alternating_rank", "rasmussen_alternating", "khovanov_uct",
    "khovanov_alternating_torsion",
)


def seifert_circle_count(diagram: Diagram) -> int:
    """Number of Seifert circles of the oriented smoothing (free loops included).

    At every crossing the incoming under-edge continues along the outgoing over-edge and
    the incoming over-edge along the outgoing under-edge (H. Seifert, Math. Ann. 110
    (1935)); the circles are the cycles of that successor map on edge labels.
    """
    nxt: dict[int, int] = {}
    for i, (a, _, c, _) in enumerate(diagram.pd):
        o_in, o_out = diagram.over_labels(i)
        nxt[a] = o_out
        nxt[o_in] = c
    seen: set[int] = set()
    circles = 0
    for start in nxt:
        if start in seen:
            continue
        circles += 1
        e = start
        while e not in seen:
            seen.add(e)
            e = nxt[e]
    return circles + diagram.free_loops


def _euler_ok(ranks, jones) -> bool:
    from .khovanov import jones_from_khovanov
    try:
        return jones_from_khovanov(ranks) == jones
    except ArithmeticError:
        return False


def _reduced_euler(ranks) -> dict[int, int]:
    chi: dict[int, int] = {}
    for (i, j), r in ranks.items():
        chi[j] = chi.get(j, 0) + (-r if i % 2 else r)
    return {j: c for j, c in chi.items() if c}


def _jones_at_minus_q(jones) -> dict[int, int]:
    """V at t^½ = −q as {q-exponent: coefficient} (Laurent stores doubled exponents)."""
    return {e: (-c if e % 2 else c) for e, c in jones.terms if c}


def strength_checks(diagram: Diagram, values: InvariantValues, *, knot: bool) -> dict[str, bool]:
    """The relations of the module table whose inputs are present (name -> passed)."""
    out: dict[str, bool] = {}
    jones, conway, sig, det = values.jones, values.conway, values.signature, values.determinant
    P, kh, kh2, red, s = values.homfly, values.khovanov, values.khovanov_f2, values.khovanov_reduced, values.rasmussen_s
    if P is not None:
        if jones is not None:
            out["homfly_jones"] = P.jones() == jones
        if conway is not None:
            out["homfly_conway"] = P.conway() == conway
    if jones is not None:
        if kh is not None:
            out["khovanov_euler_jones"] = _euler_ok(kh, jones)
        if kh2 is not None:
            out["khovanov_f2_euler_jones"] = _euler_ok(kh2, jones)
        if knot and red is not None:
            out["khovanov_reduced_euler_jones"] = _reduced_euler(red) == _jones_at_minus_q(jones)
    if kh is not None and kh2 is not None:
        out["khovanov_f2_dominates"] = all(kh2.get(k, 0) >= r for k, r in kh.items())
    n = diagram.n_crossings
    if knot and s is not None:
        out["rasmussen_even"] = s % 2 == 0
        if kh is not None:
            out["khovanov_lee_generators"] = kh.get((0, s - 1), 0) > 0 and kh.get((0, s + 1), 0) > 0
        upper2 = n - seifert_circle_count(diagram) + 1  # 2 g(canonical surface)
        out["rasmussen_seifert_bound"] = abs(s) <= upper2
        if sig is not None:
            out["rasmussen_four_genus_agree"] = max(abs(sig), abs(s)) <= upper2
    tors = values.khovanov_torsion
    if kh is not None and kh2 is not None and tors is not None:
        from .khovanov.data import INDEPENDENT_F2_CROSSINGS
        from .khovanov.integral import uct_ranks
        if n <= INDEPENDENT_F2_CROSSINGS:
            out["khovanov_uct"] = uct_ranks(kh, tors, 2) == {k: r for k, r in kh2.items() if r}
    tl = values.tristram_levine
    if tl is not None and sig is not None:
        out["tristram_levine_at_minus_one"] = int(tl["at_minus_one"]) == sig
    if knot and n and diagram.is_alternating() and is_reduced(diagram) and sig is not None:
        if kh is not None:
            out["khovanov_alternating_diagonals"] = all(j - 2 * i in (-sig - 1, -sig + 1) for (i, j) in kh)
            if det is not None:
                out["khovanov_alternating_rank"] = sum(kh.values()) == det + 1
        if s is not None:
            out["rasmussen_alternating"] = s == -sig
    if knot and n and diagram.is_alternating() and is_reduced(diagram) and tors is not None:
        out["khovanov_alternating_torsion"] = all(set(ms) <= {2} for ms in tors.values())
    return out
