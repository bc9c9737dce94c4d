#!/usr/bin/env bash
# One command that sets up a fresh machine and runs the whole test suite.
set -euo pipefail
cd "$(dirname "$0")/.."
if [ ! -x .venv/bin/python ]; then
  python3 -m venv .venv
fi
.venv/bin/python -m pip install --quiet --upgrade pip
.venv/bin/python -m pip install --quiet -e ".[test]"
.venv/bin/python -m pytest tests "$@"
