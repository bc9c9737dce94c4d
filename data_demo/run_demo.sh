#!/usr/bin/env bash
# One command that sets up a fresh machine and runs the demo census end to end:
# install, run the census in data_demo/, then query, check, fit and report on it.
set -euo pipefail
cd "$(dirname "$0")/.."
if [ ! -x .venv/bin/python ]; then
  python3 -m venv .venv
fi
.venv/bin/python -m pip install --quiet --upgrade pip
.venv/bin/python -m pip install --quiet -e .
KL=.venv/bin/knotledger
OUT=${1:-demo_out}
if [ -f "$OUT/manifest.json" ]; then
  $KL run data_demo/saltmarsh_sevens.toml --out "$OUT" --jobs 2 --resume
else
  $KL run data_demo/saltmarsh_sevens.toml --out "$OUT" --jobs 2
fi
echo
echo "== diagrams and knot types per family"
$KL query "$OUT" "SELECT family, count(*) AS diagrams, count(DISTINCT knot_key) AS knot_types, max(crossings) AS max_crossings FROM diagrams GROUP BY family ORDER BY family"
echo
echo "== a published formula checked on every pretzel row"
$KL check "$OUT" --family pretzel --claim "determinant == abs(p1*p2 + p2*p3 + p1*p3)" || true
echo
echo "== a formula fitted in the two-bridge parameters"
$KL fit "$OUT" --family two_bridge --target determinant || true
echo
$KL report "$OUT"
echo "Report: $OUT/report.html (and $OUT/report.md)"
