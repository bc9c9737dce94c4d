"""DT codes: realisation rule and agreement with the diagram they were read from."""

from __future__ import annotations

import random

import pytest

from pipeline import parse
from pipeline.diagrams.dt import diagram as dt_diagram
from slow_routes import state_sum_jones


def dt_code_of(d) -> list[int]:
    """Read the DT code off a one-component diagram (test-side definition).

    Passages are numbered along the knot from edge 1; crossing with odd passage
    2i−1 gets the even partner, signed + when the odd passage is the over one.
    """
    (comp,) = d.components
    passage = {}            # (crossing) -> list of passage numbers
    over = {}
    for k, label in enumerate(comp, start=1):
        # label enters exactly one crossing slot along the orientation
        for i, x in enumerate(d.pd):
            a, b, c, dd = x
            ins = [0, 3 if d.signs[i] > 0 else 1]
            for s in ins:
                if x[s] == label and (i, s) not in over:
                    over[(i, s)] = k
    by_crossing = {}
    for (i, s), k in over.items():
        by_crossing.setdefault(i, []).append((k, s != 0))
    code = {}
    for i, passes in by_crossing.items():
        (k1, o1), (k2, o2) = sorted(passes)
        odd, even, odd_over = (k1, k2, o1) if k1 % 2 else (k2, k1, o2)
        code[odd] = even if odd_over else -even
    return [code[o] for o in sorted(code)]


def test_alternating_codes_realise_alternating_diagrams():
    for code in ([4, 6, 2], [4, 6, 8, 2], [6, 8, 10, 2, 4], [4, 8, 10, 2, 6]):
        assert dt_diagram(code).is_alternating()


def test_mirror_code_gives_mirror_jones():
    # A DT code fixes a knot up to mirror image; negating every entry changes every crossing.
    for code in ([4, 6, 2], [4, 8, 10, 2, 6], [6, 10, 12, 2, 4, 8]):
        v = state_sum_jones(dt_diagram(code))
        assert state_sum_jones(dt_diagram([-e for e in code])) == v.invert()


@pytest.mark.parametrize("text", ["rational:7/2", "rational:11/3", "rational:13/5", "conway:2 1 1 2",
                                  "pretzel:3,3,-2", "torus:2,5", "torus:3,4", "rational:17/5"])
def test_reading_and_realising_a_code_recovers_the_knot_up_to_mirror(text):
    # Prime diagrams have a unique planar realisation up to reflection (Dowker–Thistlethwaite 1983)
    d = parse(text)
    again = dt_diagram(dt_code_of(d))
    v, w = state_sum_jones(d), state_sum_jones(again)
    assert w in (v, v.invert())
    assert again.n_crossings == d.n_crossings


def test_random_knot_diagrams_round_trip_through_dt_up_to_mirror():
    rng = random.Random(5)
    done = 0
    while done < 25:
        word = [rng.choice([-1, 1]) * rng.randint(1, 2) for _ in range(rng.randint(3, 9))]
        d = parse("braid:" + ",".join(map(str, word)))
        if d.n_components != 1 or d.free_loops or len(d.pieces) != 1:
            continue
        again = dt_diagram(dt_code_of(d))
        v, w = state_sum_jones(d), state_sum_jones(again)
        # composite diagrams may realise with a summand reflected; compare the bracket span and V(1)
        assert w.span() == v.span() and w.at_one() == 1
        done += 1


def test_realisation_is_deterministic():
    # the first planar choice in the documented order: b_1 = 0 fixes the reflection.  A
    # second call in this process could be served from a cache and share its hash seed:
    # compare with a fresh interpreter under other hash seeds instead.
    import os
    import subprocess
    import sys
    from pathlib import Path
    first = dt_diagram([6, 8, 10, 2, 4]).to_notation()
    code = "from pipeline.diagrams.dt import diagram; print(diagram((6, 8, 10, 2, 4)).to_notation())"
    root = str(Path(__file__).resolve().parents[1])
    for seed in ("1", "2"):
        env = {**os.environ, "PYTHONHASHSEED": seed, "PYTHONPATH": root}
        out = subprocess.run([sys.executable, "-c", code], env=env, capture_output=True, text=True, check=True)
        assert out.stdout.strip() == first
