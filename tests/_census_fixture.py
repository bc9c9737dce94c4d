"""A small real census for the query/claim/fit/report tests, built by ``knotledger run``.

The spec keeps the run short (a few hundred diagrams) while covering the three families
whose determinant formulas the tests rediscover: torus (both parities, knots and links),
3-pretzels with entries in [-3, 3] (P(3,3,-3) included) and two-bridge b(alpha, beta).
"""

from __future__ import annotations

from pathlib import Path

SPEC = """\
[census]
name = "test-conjectures"
max_modulus = 11

[[family]]
kind = "torus"
p = [2, 5]
q = [2, 9]

[[family]]
kind = "pretzel"
length = 3
entries = [-3, 3]

[[family]]
kind = "two_bridge"
alpha = [3, 21]
"""


def build_census(tmp: Path) -> Path:
    """Write the test census under ``tmp`` and return its directory."""
    from pipeline.cli import main
    out = tmp / "census"
    spec = tmp / "spec.toml"
    spec.write_text(SPEC)
    rc = main(["run", str(spec), "--out", str(out), "--jobs", "1"])
    assert rc == 0, "knotledger run failed on the test spec"
    return out


_CACHE: dict = {}


def shared_census(tmp_path_factory) -> Path:
    """One census per test session (built on first use; tests must not modify it)."""
    if "dir" not in _CACHE:
        _CACHE["dir"] = build_census(tmp_path_factory.mktemp("shared"))
    return _CACHE["dir"]
