# Sourced by build/serve.sh and tests/run.sh: a Python virtual environment with the pinned build
# tools, and the pinned npm packages (Pyodide, Workbox, uPlot) from package-lock.json.
need() { command -v "$1" >/dev/null 2>&1 || { echo "Fluxbook: $1 is required ($2)" >&2; exit 1; }; }
need python3 "CPython 3.11 or newer"
need node "Node.js 20 or newer"
need npm "comes with Node.js"
if [ ! -x .venv/bin/python ]; then
  echo "Fluxbook: creating the virtual environment .venv"
  python3 -m venv .venv
fi
.venv/bin/python -m pip install --quiet --disable-pip-version-check -r build/requirements-site.txt
if [ ! -f node_modules/.package-lock.json ] || ! cmp -s package-lock.json node_modules/.fluxbook-lock; then
  echo "Fluxbook: installing npm packages (npm ci)"
  npm ci --no-audit --no-fund --loglevel=error
  cp package-lock.json node_modules/.fluxbook-lock
fi
