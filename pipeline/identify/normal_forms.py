"""Normal forms of torus, two-bridge, Montesinos and pretzel links: knot keys by theorem.

Every function returns a :class:`NormalForm`: a short key naming the *unoriented*
link type up to isotopy, the key of its mirror image, an amphichirality verdict
proved by the same theorem, and a certified crossing number where one is known.

Key syntax (our own)
--------------------
``unknot``; ``unlink:n``; ``torus:p,q`` (2 < p ≤ q, or ``torus:-p,q`` for the mirror;
``torus:2,n`` / ``torus:-2,n`` for T(2,n), n ≥ 2); ``2b:α/β`` (two-bridge, 0 < β < α,
β the smaller of β, β⁻¹ mod α); ``mont:e0:r1,...,rk`` (Montesinos, e0 the sum of the
tangle fractions, r_i the fractions mod 1 in the dihedrally smallest cyclic order);
``sum:K1#K2#...`` (connected sum of knots, summands sorted); ``chain:G0~L1~G1~...``
(a linear chain of two-bridge summands: link summands L_i joining components whose
knot summands G_i are listed as K1#K2, or ``O`` for an unknotted component; the chain
is read in the smaller of its two directions);
``split:A + B + ...`` (split union, pieces sorted).

Conventions of this code base (pinned in README.md and verified with the Jones
polynomial in tests/test_classify.py): ``rational:α/β`` is b(α, β) = N(T(α/β)) and
``rational:3/1`` = ``torus:2,3`` is the positive trefoil.  The Montesinos/pretzel
crossing picture is the mirror of the two-bridge one, so a Montesinos tangle
fraction f is the two-bridge tangle −f; ``pretzel:p1,..,pk`` = M(1/p1, …, 1/pk), a zero
entry being the ∞ tangle.

Theorems used
-------------
* Torus knots: T(p,q) = T(q,p) = T(−p,−q), mirror T(−p,q); T(±1,q) is the unknot;
  nontrivial torus knots are chiral [1, Thm 3.38–3.39 *(memory)*].  Crossing number
  min(p(q−1), q(p−1)) [2].  Torus links with 3 ≤ |p| ≤ |q|: same normal form, chiral
  (linking numbers of ≥ 3 parallel components, or chiral torus-knot components).
* Two-bridge: b(α,β) = b(α',β') (unoriented) iff α = α' and β' ≡ β^{±1} (mod α);
  mirror b(α,−β); amphichiral iff β² ≡ −1 (mod α) [3]; T(2,n) = b(n, 1).  Crossing
  number: the sum of the terms of the all-positive continued fraction of α/β, the
  crossing count of a reduced alternating diagram [4].
* Montesinos with at least three tangles with |α_i| ≥ 2: classified by e0 = Σ β_i/α_i
  and the cyclic sequence (β_i/α_i mod 1) up to rotation and reversal [5] (Burde–
  Zieschang prove it under Σ 1/α_i ≤ r − 2, i.e. outside r = 3 with (2,2,n), (2,3,3),
  (2,3,4), (2,3,5), which are stated by Bonahon–Siebenmann too [1, 12.28 *(memory)*]).
  With at most two non-integral tangles the link is two-bridge; we reduce it by moving
  twists from one tangle to the other (N(A + H_c S) = N(H_c A + S), likewise for
  vertical twists), which acts on the fraction (p, q) by (p + cq, q) and (p, q + cp).
* Published coincidences (tests/SOURCES.md, families item 5): P(−2,3,3) = T(3,4), P(−2,3,5) = T(3,5):
  those Montesinos classes are mapped to the torus keys.  Other elliptic Montesinos
  links might be torus links (e.g. types (2,2,n) against T(3,3)); no such coincidence
  is claimed and none is keyed.
* One ∞ tangle (a pretzel zero entry): N(∞ + S) = D(S) = connected sum of the D(T_j);
  D(T(f)) in the Montesinos picture is b(1/f); two or more ∞ tangles give a split link
  whose pieces are the segments between them.  Unique prime decomposition of knots
  [6]; for the chains of two-component summands the key records the chain (the
  components of a two-bridge link can be exchanged by a symmetry, knot summands slide
  along their component).

References
----------
1. G. Burde, H. Zieschang, *Knots*, de Gruyter (2003), ch. 3 and 12.
2. K. Murasugi, "On the braid index of alternating links", Trans. AMS 326 (1991).
3. H. Schubert, "Knoten mit zwei Brücken", Math. Z. 65 (1956).
4. L. Kauffman, "State models and the Jones polynomial"; K. Murasugi; M. Thistlethwaite,
   Topology 26 (1987).
5. F. Bonahon, L. Siebenmann, "New geometric splittings of classical knots and the
   classification and symmetries of arborescent knots" (monograph, 1979–2010).
6. H. Schubert, "Die eindeutige Zerlegbarkeit eines Knotens in Primknoten",
   Sitzungsber. Heidelb. Akad. Wiss. (1949).
"""

from __future__ import annotations

from dataclasses import dataclass
from fractions import Fraction
from math import gcd
from typing import Optional, Sequence

from ..numbers import UnionFind

__all__ = ["NormalForm", "unknot", "unlink", "two_bridge_nf", "torus_nf", "montesinos_nf",
           "pretzel_nf", "connected_sum_nf", "split_nf", "euclid_terms", "alternating_montesinos"]

CN_ALT = "reduced alternating diagram (Kauffman, Murasugi, Thistlethwaite 1987)"
CN_TORUS = "torus knot min(p(q-1), q(p-1)) (Murasugi, Trans. AMS 326, 1991)"
CN_2B = "two-bridge: sum of the all-positive continued fraction terms (reduced alternating, 1987)"


@dataclass(frozen=True)
class NormalForm:
    """A link type named by a normal form."""

    key: str
    mirror_key: str
    components: int
    amphichiral_reason: str          # the theorem behind the verdict
    crossing_number: Optional[int] = None
    crossing_number_source: Optional[str] = None

    @property
    def amphichiral(self) -> bool:
        return self.key == self.mirror_key

    def mirror(self) -> "NormalForm":
        return NormalForm(self.mirror_key, self.key, self.components, self.amphichiral_reason,
                          self.crossing_number, self.crossing_number_source)


def unknot() -> NormalForm:
    return NormalForm("unknot", "unknot", 1, "the unknot is amphichiral", 0, "unknot")


def unlink(n: int) -> NormalForm:
    if n == 1:
        return unknot()
    return NormalForm(f"unlink:{n}", f"unlink:{n}", n, "the unlink is amphichiral", 0, "unlink")


def euclid_terms(p: int, q: int) -> list[int]:
    """Continued fraction of p/q (q > 0) by floor division: first term any sign, rest ≥ 1."""
    out = []
    while q:
        a = p // q
        out.append(a)
        p, q = q, p - a * q
    return out


# ---------------------------------------------------------------------- two-bridge
def two_bridge_nf(alpha: int, beta: int) -> NormalForm:
    """b(α, β) by Schubert's classification (α ≥ 0 after sign normalisation).

    A fraction p/q is accepted in any sign: b(p, q) = b(−p, −q) (same tangle fraction).
    """
    if alpha < 0:
        alpha, beta = -alpha, -beta
    if gcd(alpha, beta) != 1:
        raise ValueError(f"two-bridge: gcd({alpha}, {beta}) != 1")
    if alpha == 0:
        return unlink(2)
    if alpha == 1:
        return unknot()
    comps = 1 if alpha % 2 else 2
    b = beta % alpha
    cls = {b, pow(b, -1, alpha)}
    mcls = {(-x) % alpha for x in cls}
    cn = sum(euclid_terms(alpha, b))
    reason = "Schubert: b(α,β) is amphichiral iff β² ≡ −1 (mod α)"
    if 1 in cls or (alpha - 1) in cls:   # T(2, ±α)
        if alpha == 2:
            key = mkey = "torus:2,2"
        else:
            key = ("torus:2," if 1 in cls else "torus:-2,") + str(alpha)
            mkey = "torus:-2," + str(alpha) if 1 in cls else "torus:2," + str(alpha)
        return NormalForm(key, mkey, comps, reason, cn, CN_2B)
    key = f"2b:{alpha}/{min(cls)}"
    mkey = f"2b:{alpha}/{min(mcls)}"
    return NormalForm(key, mkey, comps, reason, cn, CN_2B)


# ---------------------------------------------------------------------- torus
def torus_nf(p: int, q: int) -> NormalForm:
    """T(p, q) (p, q ≠ 0) by the torus normal form; T(2, n) through :func:`two_bridge_nf`."""
    if p == 0 or q == 0:
        raise ValueError("torus: p and q must be nonzero")
    s = 1 if (p > 0) == (q > 0) else -1
    a, b = sorted((abs(p), abs(q)))
    d = gcd(a, b)
    if a == 1:
        return unknot()
    if a == 2:
        return two_bridge_nf(b, s)
    key, mkey = f"torus:{s * a},{b}", f"torus:{-s * a},{b}"
    reason = ("torus knots other than the unknot are chiral (Burde-Zieschang 3.39)" if d == 1 else
              "torus links T(p,q), 3 <= p <= q, are chiral (linking numbers / chiral components)")
    if d == 1:
        return NormalForm(key, mkey, 1, reason, min(a * (b - 1), b * (a - 1)), CN_TORUS)
    return NormalForm(key, mkey, d, reason)


# ---------------------------------------------------------------------- sums and splits
def connected_sum_nf(summands: Sequence[NormalForm]) -> NormalForm:
    """A linear chain S1 # S2 # ... of knots and two-component links (in this order)."""
    parts = [s for s in summands if s.key != "unknot"]
    if not parts:
        return unknot()
    if len(parts) == 1:
        return parts[0]

    def text(seq: Sequence[NormalForm]) -> str:
        groups: list[list[str]] = [[]]
        links: list[str] = []
        for s in seq:
            if s.components == 1:
                groups[-1].append(s.key)
            else:
                links.append(s.key)
                groups.append([])
        if not links:
            return "sum:" + "#".join(sorted(groups[0]))
        fwd = []
        for g, l in zip(groups, links + [None]):
            fwd.append("#".join(sorted(g)) or "O")
            if l is not None:
                fwd.append(l)
        return "chain:" + min("~".join(fwd), "~".join(fwd[::-1]))

    comps = 1 + sum(s.components - 1 for s in parts)
    cn = None
    if all(s.crossing_number_source in (CN_2B, CN_ALT) for s in parts):
        cn = sum(s.crossing_number for s in parts)
    return NormalForm(text(parts), text([s.mirror() for s in parts]), comps,
                      "unique prime decomposition (Schubert 1949): amphichiral iff the summands "
                      "are closed under mirroring", cn, CN_ALT if cn is not None else None)


def split_nf(pieces: Sequence[NormalForm]) -> NormalForm:
    """Split union of the pieces (the split components of a link are unique)."""
    if all(p.key.startswith(("unknot", "unlink")) for p in pieces):
        return unlink(sum(p.components for p in pieces))
    key = "split:" + " + ".join(sorted(p.key for p in pieces))
    mkey = "split:" + " + ".join(sorted(p.mirror_key for p in pieces))
    return NormalForm(key, mkey, sum(p.components for p in pieces),
                      "split components are unique: amphichiral iff the pieces are closed under mirroring")


# ---------------------------------------------------------------------- Montesinos
def _transfer(x: tuple[int, int], g: Fraction) -> tuple[int, int]:
    """Fraction (as a pair) of N(T(x) + T(g)), two-bridge picture, by moving the twists
    of T(g) onto T(x): horizontal (p, q) -> (p + c q, q), vertical (p, q) -> (p, q + c p)."""
    terms = euclid_terms(g.numerator, g.denominator)
    if len(terms) % 2 == 0:
        terms = terms[:-1] + [terms[-1] - 1, 1]
    p, q = x
    for k, c in enumerate(terms):
        if k % 2 == 0:
            p += c * q
        else:
            q += c * p
    return p, q


def _segment_nf(fracs: Sequence[Fraction]) -> NormalForm:
    """D-closure of a sum of Montesinos tangles: the chain of the b(1/f)."""
    summands = []
    for f in fracs:
        summands.append(two_bridge_nf(f.denominator, f.numerator))  # fraction 1/f
    return connected_sum_nf(summands)


def _dihedral_min(seq: list[Fraction]) -> list[Fraction]:
    n = len(seq)
    cands = []
    for s in (seq, seq[::-1]):
        for i in range(n):
            cands.append(s[i:] + s[:i])
    return min(cands)


def _fr(x: Fraction) -> str:
    return str(x.numerator) if x.denominator == 1 else f"{x.numerator}/{x.denominator}"


def montesinos_nf(fractions: Sequence[Optional[Fraction]]) -> NormalForm:
    """M(f1, ..., fr) in the Montesinos picture of this code base (None = the ∞ tangle)."""
    fr = [None if f is None else Fraction(f) for f in fractions]
    if not fr:
        raise ValueError("montesinos: no tangles")
    if any(f is None for f in fr):
        k = fr.index(None)
        rot = fr[k + 1:] + fr[:k + 1]          # starts after an ∞, ends with it
        segs, cur = [], []
        for f in rot:
            if f is None:
                segs.append(cur)
                cur = []
            else:
                cur.append(f)
        pieces = [_segment_nf(s) for s in segs]
        return pieces[0] if len(pieces) == 1 else split_nf(pieces)
    nonint = [f for f in fr if f.denominator != 1]
    n = sum(f for f in fr if f.denominator == 1)
    if len(nonint) <= 2:
        g = [-f for f in nonint]
        if not g:
            return two_bridge_nf(int(-n), 1)
        x = -n + g[0]
        p, q = x.numerator, x.denominator
        if len(g) == 2:
            p, q = _transfer((p, q), g[1])
        return two_bridge_nf(p, q)
    nf = _bs_nf(fr)
    return _COINCIDENCES.get(nf.key, nf)


def _bs_nf(fr: list[Fraction]) -> NormalForm:
    def key(fs: list[Fraction]) -> str:
        e0 = sum(fs, Fraction(0))
        res = _dihedral_min([f - (f.numerator // f.denominator) for f in fs if f.denominator != 1])
        return f"mont:{_fr(e0)}:" + ",".join(_fr(r) for r in res)

    comps = _montesinos_components(fr)
    return NormalForm(key(fr), key([-f for f in fr]), comps,
                      "Bonahon-Siebenmann: amphichiral iff e0 = 0 and the mirrored cyclic "
                      "sequence is a rotation or reversal of it")


def _montesinos_components(fr: list[Fraction]) -> int:
    """Number of components of N(T1 + ... + Tr), from the connectivity of tangle ends.

    The ends of a rational tangle p/q are joined according to parity: (p even, q odd)
    like the 0 tangle NW-NE, (p odd, q even) like ∞ NW-SW, both odd like 1 NW-SE.
    """
    # ends: for tangle i, NW=4i, NE=4i+1, SW=4i+2, SE=4i+3
    r = len(fr)
    ends = UnionFind(range(4 * r))
    union = ends.union

    for i, f in enumerate(fr):
        p, q = f.numerator % 2, f.denominator % 2
        nw, ne, sw, se = 4 * i, 4 * i + 1, 4 * i + 2, 4 * i + 3
        if p == 0 and q == 1:
            union(nw, ne); union(sw, se)
        elif p == 1 and q == 0:
            union(nw, sw); union(ne, se)
        else:
            union(nw, se); union(ne, sw)
    for i in range(r - 1):
        union(4 * i + 1, 4 * (i + 1))          # NE_i - NW_{i+1}
        union(4 * i + 3, 4 * (i + 1) + 2)      # SE_i - SW_{i+1}
    union(0, 4 * (r - 1) + 1)                  # numerator closure
    union(2, 4 * (r - 1) + 3)
    return ends.count()


def pretzel_nf(entries: Sequence[int]) -> NormalForm:
    """P(p1, ..., pk) = M(1/p1, ..., 1/pk); a zero entry is the ∞ tangle."""
    return montesinos_nf([None if p == 0 else Fraction(1, p) for p in entries])


def alternating_montesinos(fractions: Sequence[Optional[Fraction]]) -> Optional[list[Fraction]]:
    """The tangles of a reduced alternating Montesinos diagram of M(f1, ..., fr), or None.

    With the residues 0 < r_i < 1 of the k >= 3 non-integral tangles (in the given
    cyclic order) and the integer e = Σ f_i − Σ r_i, M(f) = M(r_1 + e, r_2, ..., r_k):
    all tangles positive when e >= 0; when e <= −k, M(r_1 − 1 + e + k, r_2 − 1, ...) has
    all tangles negative.  Moving integers between tangles is an isotopy (Montesinos;
    Burde–Zieschang ch. 12).  Such a diagram (rational tangles of one sign, each an
    alternating continued fraction) is reduced alternating.  For −k < e < 0 (and for an
    ∞ tangle or fewer than three non-integral tangles) None: the reduced Montesinos
    diagram then has tangles of both signs, and a link with a reduced non-alternating
    Montesinos diagram is not alternating (W. B. R. Lickorish, M. B. Thistlethwaite,
    "Some links with non-trivial polynomials and their crossing-numbers", Comment.
    Math. Helv. 63 (1988) *(memory)*).

    Examples
    --------
    >>> alternating_montesinos([Fraction(4, 3), Fraction(-1, 3), Fraction(1, 2)])
    [Fraction(1, 3), Fraction(2, 3), Fraction(1, 2)]
    """
    if not fractions or any(f is None for f in fractions):
        return None
    fr = [Fraction(f) for f in fractions]
    res = [f - (f.numerator // f.denominator) for f in fr if f.denominator != 1]
    k = len(res)
    if k < 3:
        return None
    e = sum(fr, Fraction(0)) - sum(res, Fraction(0))
    if e >= 0:
        return [res[0] + e] + res[1:]
    if e <= -k:
        return [res[0] - 1 + e + k] + [r - 1 for r in res[1:]]
    return None


_COINCIDENCES: dict[str, NormalForm] = {}
for _entries, (_p, _q) in (((-2, 3, 3), (3, 4)), ((-2, 3, 5), (3, 5))):
    _m = _bs_nf([Fraction(1, e) for e in _entries])
    _COINCIDENCES[_m.key] = torus_nf(_p, _q)
    _COINCIDENCES[_m.mirror_key] = torus_nf(-_p, _q)
