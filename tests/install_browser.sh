#!/usr/bin/env bash
# Install Debian's Chromium and its driver for the explorer's browser test
# (tests/test_explorer.py). Needs root (or sudo) and apt; where that is not possible it
# says so and exits 0, and the browser test is then skipped with that reason.
set -u
if command -v chromium >/dev/null 2>&1 && command -v chromedriver >/dev/null 2>&1; then
  exit 0
fi
if ! command -v apt-get >/dev/null 2>&1; then
  echo "install_browser: no apt-get here; the browser test will be skipped" >&2; exit 0
fi
SUDO=""
if [ "$(id -u)" != 0 ]; then
  if command -v sudo >/dev/null 2>&1 && sudo -n true 2>/dev/null; then SUDO="sudo -n"; else
    echo "install_browser: not root; the browser test will be skipped" >&2; exit 0; fi
fi
$SUDO apt-get update -qq >/dev/null 2>&1 || true
DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -qq chromium chromium-driver >/dev/null 2>&1 \
  || echo "install_browser: apt-get could not install chromium; the browser test will be skipped" >&2
exit 0
