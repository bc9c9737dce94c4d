"""Slow, obviously-correct reference routes used only by the tests.

Nothing here is imported by the package.  Each function is a direct transcription
of a textbook definition, exponential in the number of crossings, meant for
diagrams with at most ~12 crossings.
"""

from __future__ import annotations

import itertools

from pipeline.invariants.poly import Laurent


def state_sum_bracket(diagram) -> dict[int, int]:
    """Kauffman bracket <D> as {exponent of A: coefficient}, by summing all 2^n states.

    L. H. Kauffman, "State models and the Jones polynomial", Topology 26 (1987):
    <D> = Σ_S A^{a(S) − b(S)} δ^{|S| − 1}, δ = −A² − A⁻².  The A-smoothing of a
    crossing (a, b, c, d) joins a–b and c–d; the B-smoothing joins a–d and b–c.
    """
    pd = diagram.pd
    total: dict[int, int] = {}
    delta = {2: -1, -2: -1}
    for state in itertools.product((0, 1), repeat=len(pd)):
        parent: dict[int, int] = {}

        def find(x):
            while parent.setdefault(x, x) != x:
                x = parent[x]
            return x

        for (a, b, c, d), s in zip(pd, state):
            pairs = ((a, b), (c, d)) if s == 0 else ((a, d), (b, c))
            for u, v in pairs:
                parent[find(u)] = find(v)
        loops = len({find(v) for x in pd for v in x}) + diagram.free_loops
        term = {state.count(0) - state.count(1): 1}
        for _ in range(loops - 1):
            nxt: dict[int, int] = {}
            for e, c in term.items():
                for e2, c2 in delta.items():
                    nxt[e + e2] = nxt.get(e + e2, 0) + c * c2
            term = nxt
        for e, c in term.items():
            total[e] = total.get(e, 0) + c
    return {e: c for e, c in total.items() if c}


def state_sum_jones(diagram) -> Laurent:
    """V(t) = (−A³)^(−w) <D> at A = t^(−1/4), from :func:`state_sum_bracket`."""
    w = diagram.writhe
    sign = -1 if w % 2 else 1
    out = {}
    for e, c in state_sum_bracket(diagram).items():
        e2 = e - 3 * w          # exponent of A in (−A³)^(−w)<D>
        assert e2 % 2 == 0, "bracket exponents have the parity of the writhe"
        out[-e2 // 2] = sign * c   # A^e2 = t^(−e2/4) = doubled exponent −e2/2
    return Laurent(out)
