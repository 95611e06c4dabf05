"""Every path and constant the build uses, named once."""

from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
CALC_DIR = ROOT / "calc"
NODE_MODULES = ROOT / "node_modules"
TEAM_FILE = ROOT / "team.yml"  # a team's defaults; FLUXBOOK_TEAM_FILE points elsewhere
TEAM_FILE_ENV = "FLUXBOOK_TEAM_FILE"

# Pyodide: the core files the browser needs (no package wheels: calc/ is standard-library only).
PYODIDE_VERSION = "314.0.7"  # must match package.json; checked by the build
PYODIDE_FILES = (
    "pyodide.mjs",
    "pyodide.asm.mjs",
    "pyodide.asm.wasm",
    "python_stdlib.zip",
    "pyodide-lock.json",
)
# Site-relative destinations. The Pyodide folder carries its version so an upgrade changes URLs.
PYODIDE_SITE_DIR = f"assets/vendor/pyodide-{PYODIDE_VERSION}"
CALC_ZIP_SITE_PATH = "assets/engine/calc.zip"
VENDOR_FILES = {  # node_modules source -> site path
    "uplot/dist/uPlot.min.css": "assets/vendor/uplot/uPlot.min.css",
    "workbox-window/build/workbox-window.prod.mjs": "assets/vendor/workbox/workbox-window.prod.mjs",
}

# Minified builds that ship only as a classic script `var NAME = ...;`, turned into an ES module
# by adding `export default NAME;` (uPlot publishes no minified ESM; 51 kB against 145 kB):
# node_modules source -> (site path, the global it defines).
VENDOR_MODULES = {
    "uplot/dist/uPlot.iife.min.js": ("assets/vendor/uplot/uPlot.esm.min.js", "uPlot"),
}
# The conductor sizes every size field offers, written once from calc.units (build/forms.py).
SIZES_JS_SITE_PATH = "assets/js/sizes.js"

# Files the build writes next to the site that the browser never needs (not precached).
SERVER_HEADERS_FILE = "server-headers.txt"  # the headers a host should send (CSP with hashes)
CHECKSUMS_FILE = "SHA256SUMS"  # SHA-256 of every shipped file, for release checks
SERVICE_WORKER_FILE = "sw.js"
SERVICE_WORKER_SITEMAP = "assets/js/sw-sitemap.js"  # imported by sw.js: sitemap for any host
SERVICE_WORKER_UNPACK = "assets/js/sw-unpack.js"  # imported by sw.js: serves packed files
PACKED_LIST_SITE_PATH = "assets/js/sw-packed-list.js"  # written by build/packed.py
SITE_URL_PLACEHOLDER = "https://fluxbook.invalid/"  # = site_url in mkdocs.yml
SERVICE_WORKER_SCRIPT = ROOT / "build" / "service_worker.mjs"

# workbox-build: files above 2 MiB are silently dropped by default; the wasm is 9.6 MB.
PRECACHE_MAX_FILE_BYTES = 12 * 1024 * 1024
PRECACHE_GLOB_IGNORES = (
    SERVICE_WORKER_FILE,
    SERVER_HEADERS_FILE,
    CHECKSUMS_FILE,
    "**/*.map",
    "assets/javascripts/lunr/**",  # search runs in English only: the language packs are not loaded
)
