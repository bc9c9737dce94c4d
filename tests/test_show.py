"""Tests of ``knotledger show``: the readable page, ``--json``, and bad input."""

from __future__ import annotations

import json
import subprocess
import sys

import pytest

from pipeline import cli
from pipeline.invariants.coloring.spectrum import coloring_matrix
from pipeline.diagrams.notation import parse


def _run(capsys, *argv):
    try:
        code = cli.main(["show", *argv])
    except SystemExit as exc:  # argparse usage errors
        code = exc.code
    out, err = capsys.readouterr()
    return code, out, err


def test_page_prints_the_colouring_matrix_entry_by_entry(capsys):
    code, out, err = _run(capsys, "torus:2,3")
    assert code == 0 and err == ""
    # The matrix rows of the page are the rows of coloring_matrix, labelled x1..x3
    # under column headers a1..a3 (Fox 1962: 2·over − under_in − under_out).
    lines = out.splitlines()
    header = next(i for i, line in enumerate(lines) if line.split() == ["a1", "a2", "a3"])
    for i, row in enumerate(coloring_matrix(parse("torus:2,3"))):
        assert lines[header + 1 + i].split() == [f"x{i + 1}", *map(str, row)]
    assert "determinant        3" in out
    assert "invariant factors  (3)" in out
    assert "p = 3:" in out and "a1=0 a2=1 a3=2" in out  # witness, normalised
    assert "knotledger draw torus:2,3 --out FILE.svg" in out


def test_page_colouring_table_matches_published_counts(capsys):
    # common practice: figure-eight has 25 five-colourings and no nontrivial 3-colouring.
    code, out, _ = _run(capsys, "conway:2 2")
    rows = {int(line.split()[0]): line.split() for line in out.splitlines()
            if line.strip() and line.split()[0].isdigit() and len(line.split()) == 4}
    assert rows[5][1] == "25" and rows[5][2] == "yes"
    assert rows[3][1] == "3" and rows[3][2] == "-"


def test_json_for_the_trefoil(capsys):
    code, out, err = _run(capsys, "torus:2,3", "--json")
    assert code == 0 and err == ""
    obj = json.loads(out)
    assert obj["crossings"] == 3 and obj["components"] == 1 and obj["writhe"] == 3
    assert obj["determinant"] == 3 and obj["invariant_factors"] == [3]
    # col_n = n·gcd(n,3) (Przytycki 1998, memory): 9 three-colourings (common practice).
    assert obj["colorings"] == {str(n): n * (3 if n % 3 == 0 else 1) for n in range(2, 17)}
    assert all(type(v) is int for v in obj["colorings"].values())
    assert obj["witnesses"] == {"3": [0, 1, 2]}
    if obj.get("jones") is not None:  # README.md: positive trefoil V = t + t^3 - t^4
        assert obj["jones"] == [[1, 1], [3, 1], [4, -1]]


def test_json_max_modulus_and_extra_witness(capsys):
    code, out, _ = _run(capsys, "pretzel:3,3,-3", "--json", "--max-modulus", "9", "--witness", "5")
    obj = json.loads(out)
    assert sorted(obj["colorings"], key=int) == [str(n) for n in range(2, 10)]
    assert obj["colorings"]["3"] == 27  # SOURCES.md (memory)
    assert obj["witnesses"]["5"] is None  # det 9: no nontrivial 5-colouring
    assert 9 not in obj["generating_moduli"] and 3 in obj["generating_moduli"]


def test_big_determinant_stays_exact_in_json(capsys):
    # Schubert (1956): det of the two-bridge link [2, 2, ..., 2] is its fraction's numerator.
    terms = ["2"] * 120
    code, out, _ = _run(capsys, "conway:" + " ".join(terms), "--json", "--max-modulus", "4")
    obj = json.loads(out)
    num, den = 1, 0  # α/β = 2 + 1/(2 + ...): numerator recurrence
    for _ in terms:
        num, den = 2 * num + den, num
    assert obj["determinant"] == num and num > 2 ** 63


@pytest.mark.parametrize("argv", [["torus:2,x"], ["nonsense"], ["pd:[[1,2,3]]"],
                                  ["torus:2,3", "--max-modulus", "1"], ["torus:2,3", "--witness", "9"]])
def test_bad_input_exits_2_with_one_line(capsys, argv):
    code, out, err = _run(capsys, *argv)
    assert code == 2
    assert out == ""
    assert len(err.strip().splitlines()) == 1 and "Traceback" not in err


def test_bad_input_from_the_command_line_has_no_traceback():
    proc = subprocess.run([sys.executable, "-m", "pipeline", "show", "rational:4/2"],
                          capture_output=True, text=True)
    assert proc.returncode == 2
    assert proc.stdout == ""
    assert len(proc.stderr.strip().splitlines()) == 1 and "Traceback" not in proc.stderr


def test_page_writes_half_integer_exponents_in_brackets(capsys):
    # Positive Hopf link T(2,2): V(t) = -t^(1/2) - t^(5/2) and, up to the sign and units
    # of the normalisation, Δ(t) = t^(1/2) - t^(-1/2) *(memory: Jones, Bull. AMS 12, 1985)*.
    # A bare "t^5/2" reads as t^5 / 2, so half-integer exponents must be bracketed
    # (the form of Laurent.to_text); the page and --json must describe one polynomial.
    code, out, _ = _run(capsys, "torus:2,2")
    assert code == 0
    line = next(x for x in out.splitlines() if "Jones" in x and "V(t)" in x)
    assert line.split("=", 1)[1].strip() == "-t^(1/2) - t^(5/2)"
    alex = next(x for x in out.splitlines() if "Alexander" in x)
    assert "t^1/2" not in alex and "t^(1/2)" in alex
    code, js, _ = _run(capsys, "torus:2,2", "--json")
    assert json.loads(js)["jones"] == [[0.5, -1], [2.5, -1]]


def test_show_does_not_import_the_census_or_plotting_libraries():
    # start-up (issue 14): show of a small diagram must not load pandas, pyarrow, DuckDB
    # or matplotlib; the timing itself is in tests/benchmarks/bench_startup.py
    probe = ("import sys, io, contextlib\n"
             "from pipeline.cli import main\n"
             "with contextlib.redirect_stdout(io.StringIO()):\n"
             "    assert main(['show', 'torus:2,3']) == 0\n"
             "print(' '.join(m for m in ('pandas', 'pyarrow', 'duckdb', 'matplotlib') if m in sys.modules))\n")
    res = subprocess.run([sys.executable, "-c", probe], capture_output=True, text=True, check=True)
    assert res.stdout.strip() == ""


def test_page_prints_homfly_khovanov_s_and_the_signature_function(capsys):
    # positive trefoil: P = 2v² − v⁴ + v²z² (skein relation; tests/SOURCES.md), Kh over Q of
    # rank 1 at (0,1), (0,3), (2,5), (3,9) (Bar-Natan 2002, memory), s = 2 (Rasmussen 2010),
    # σ_ω jumps once, at ω = e^{2πi/6}, from 0 to −2 (the root of t² − t + 1 on the circle)
    code, out, _ = _run(capsys, "torus:2,3")
    assert code == 0
    assert "HOMFLY-PT  P(v,z) = 2v^2 + v^2z^2 - v^4" in out
    assert "(0,1) (0,3) (2,5) (3,9)" in out
    assert "torsion    of Kh over Z:\n             Z/2 at (3,7)" in out  # Khovanov 2000 §6.2 (memory)
    assert "s          2 (Rasmussen)" in out
    assert "values [0, -2] between jumps at θ/2π = 1/6 (σ_-1 = -2)" in out
    # the figure-eight: P = v⁻² − 1 − z² + v² (memory), amphichiral, so no jump
    code, out, _ = _run(capsys, "conway:2 2")
    assert "P(v,z) = v^(-2) - 1 - z^2 + v^2" in out and "between jumps at none" in out
    assert "Z/2 at (-1,-3) Z/2 at (2,3)" in out  # Bar-Natan 2002, tables (memory)
    # 5_2 = b(7,3): Δ = 2t − 3 + 2t⁻¹ (memory; det 7 = |Δ(−1)|), so ω + 1/ω = 3/2 exactly, an
    # angle that is no rational multiple of 2π: the jump is printed as the exact value of 2cos θ
    code, out, _ = _run(capsys, "rational:7/3")
    assert "Δ(t) = 2t^(-1) - 3 + 2t" in out and "between jumps at 2cos θ = 3/2 (" in out
