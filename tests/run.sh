#!/usr/bin/env bash
# Install the test dependencies and run the whole suite (the README's second command; CI runs it).
#   CPython unit tests, the same vectors inside Pyodide under Node.js, and browser tests in
#   Debian's Chromium against the built site. Extra arguments go to pytest.
set -euo pipefail
cd "$(dirname "$0")/.."
missing=()
command -v chromium >/dev/null 2>&1 || missing+=(chromium)
command -v ngspice >/dev/null 2>&1 || missing+=(ngspice)
if [ ${#missing[@]} -gt 0 ]; then
  echo "Fluxbook: installing ${missing[*]} from the system package manager"
  SUDO=""; [ "$(id -u)" -eq 0 ] || SUDO="sudo"
  $SUDO apt-get update -qq
  DEBIAN_FRONTEND=noninteractive $SUDO apt-get install -y -qq "${missing[@]}" >/dev/null
fi
source build/setup.sh
.venv/bin/python -m pip install --quiet --disable-pip-version-check -r tests/requirements.txt
export NO_MKDOCS_2_WARNING=1
exec .venv/bin/python -m pytest "$@"
