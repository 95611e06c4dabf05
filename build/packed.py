"""Our text files kept gzipped on the device (issue 12, bytes): the service worker precaches a
gzipped twin of each (`<file>.gz`) instead of the file, and serves the file from it unpacked
(site_src/assets/js/sw-unpack.js), so a device downloads and keeps about a third of the bytes
whatever the host does. The plain files stay in the folder for a browser's first visit, before
the service worker, and for browsers without one.

Packed: the precached HTML, scripts, styles, JSON, SVG, web manifest and CSV outside Pyodide's
folder (its runtime is read on every start, and unpacking it would slow that), the theme's
included, where the twin saves at least MIN_SAVING bytes. Not packed: what the service worker itself imports, and sitemap.xml
(sw-sitemap.js answers it).
"""

import fnmatch
import gzip
import json
import re
from pathlib import Path, PurePosixPath

from build import paths

SUFFIX = ".gz"
MIN_SAVING = 512  # bytes; a smaller saving is not worth a twin
TYPES = {  # the Content-Type each packed file is served with, by its suffix
    ".html": "text/html; charset=utf-8",
    ".js": "text/javascript; charset=utf-8",
    ".mjs": "text/javascript; charset=utf-8",
    ".css": "text/css; charset=utf-8",
    ".json": "application/json",
    ".svg": "image/svg+xml",
    ".webmanifest": "application/manifest+json",
    ".csv": "text/csv; charset=utf-8",
}
NEVER = {  # site paths kept plain
    paths.SERVICE_WORKER_FILE, paths.SERVICE_WORKER_SITEMAP, paths.SERVICE_WORKER_UNPACK,
    paths.PACKED_LIST_SITE_PATH, "sitemap.xml",
}


def packable(site_path):
    """Whether a site path (posix, relative to the site's root) is one this build packs: a
    precached text file outside Pyodide's folder."""
    path = PurePosixPath(site_path)
    return (path.suffix in TYPES and site_path not in NEVER
            and not site_path.startswith(paths.PYODIDE_SITE_DIR + "/")
            and not any(fnmatch.fnmatch(site_path, pattern) for pattern in paths.PRECACHE_GLOB_IGNORES))


def twin(data):
    """The gzipped twin of a file's bytes: level 9, no time stamp, so rebuilds are identical."""
    return gzip.compress(data, compresslevel=9, mtime=0)


def pack(site_dir):
    """Write each packable file's twin and the list the service worker reads; {path: type}."""
    site_dir = Path(site_dir)
    packed = {}
    for file in sorted(site_dir.rglob("*")):
        site_path = file.relative_to(site_dir).as_posix()
        if not file.is_file() or not packable(site_path):
            continue
        data = file.read_bytes()
        gz = twin(data)
        if len(data) - len(gz) < MIN_SAVING:
            continue
        Path(str(file) + SUFFIX).write_bytes(gz)
        packed[site_path] = TYPES[file.suffix]
    (site_dir / paths.PACKED_LIST_SITE_PATH).write_text(list_script(packed), encoding="utf-8")
    return packed


_LIST = re.compile(r"self\.FLUXBOOK_PACKED = (\{.*\});", re.DOTALL)


def read_list(site_dir):
    """{site path: Content-Type} of a built site's packed files (the list sw.js imports)."""
    text = (Path(site_dir) / paths.PACKED_LIST_SITE_PATH).read_text(encoding="utf-8")
    return json.loads(_LIST.search(text).group(1))


def list_script(packed):
    """The script sw.js imports: which site paths have a twin, and their Content-Type."""
    return ("// Written by build/packed.py: the files the service worker keeps gzipped (<path>.gz)\n"
            "// and the Content-Type each is served with.\n"
            f"self.FLUXBOOK_PACKED = {json.dumps(packed, indent=0, sort_keys=True)};\n")
