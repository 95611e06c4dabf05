#!/usr/bin/env bash
# Set up, build and serve Fluxbook on http://127.0.0.1:8000 (the README's first command).
# Safe to run again: it only installs what is missing or out of date.
set -euo pipefail
cd "$(dirname "$0")/.."
source build/setup.sh
echo "Fluxbook: building the site"
NO_MKDOCS_2_WARNING=1 .venv/bin/python -m mkdocs build --strict
exec .venv/bin/python build/serve.py --dir site --port "${PORT:-8000}"
