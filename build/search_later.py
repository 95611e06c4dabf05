"""The theme's search on calculator pages, loaded after the first result (issue 12: quick start).

The theme (mkdocs-material) starts its search worker as soon as a page loads and sends it the
whole search index, which the worker builds into a lunr index: 0.1-0.25 s of one core, measured
here (a Chromium trace of a calculator page reloaded offline) in the middle of the engine's
restore from its snapshot, on a machine of two cores. Interleaved reloads with and without it:
the first result 110 ms sooner (median of 18 each) without it.

On a calculator page the theme's config names a stand-in worker instead (WORKER_SITE_PATH,
beside the theme's own, from search_later_worker.js). It holds the theme's messages and loads
the theme's worker when the page posts "load" on CHANNEL (fluxbook.js: after the first result,
or when the search box gets the focus), or a few seconds after the index arrived at the latest.
Other pages keep the theme's worker as it is.
"""

import json
import re
from pathlib import Path, PurePosixPath

THEME_WORKERS = "assets/javascripts/workers/"
THEME_WORKER = re.compile(r"search\.[0-9a-f]+\.min\.js")
WORKER_NAME = "search-later.js"
WORKER_SITE_PATH = THEME_WORKERS + WORKER_NAME
CHANNEL = "fluxbook-search"  # also in site_src/assets/js/fluxbook.js
TEMPLATE = Path(__file__).with_name("search_later_worker.js")
# The theme's config block in a page, and its "search" entry: the worker's URL, page-relative.
CONFIG_BLOCK = re.compile(r'(<script id="__config" type="application/json">)(.*?)(</script>)', re.DOTALL)


class SearchLaterError(Exception):
    """The theme no longer looks as this module expects (a new mkdocs-material): check it."""


def theme_worker_name(paths):
    """The file name of the theme's search worker, among the site's file paths (POSIX, relative)."""
    found = sorted(
        PurePosixPath(path).name for path in paths
        if str(path).startswith(THEME_WORKERS) and THEME_WORKER.fullmatch(PurePosixPath(path).name)
    )
    if len(found) != 1:
        raise SearchLaterError(f"expected one theme search worker in {THEME_WORKERS}, found {found}")
    return found[0]


def worker_script(theme_worker):
    """The stand-in worker's text, loading theme_worker (a name in the same folder)."""
    if not THEME_WORKER.fullmatch(theme_worker):
        raise SearchLaterError(f"not a theme search worker's name: {theme_worker!r}")
    text = TEMPLATE.read_text(encoding="utf-8")
    for placeholder, value in (("__THEME_WORKER__", theme_worker), ("__CHANNEL__", CHANNEL)):
        if placeholder not in text:
            raise SearchLaterError(f"{TEMPLATE.name} has no {placeholder}")
        text = text.replace(placeholder, value)
    return text


def point_config(html):
    """The page with the theme's config naming the stand-in worker instead of the theme's own;
    only the worker's file name changes, the rest of the block stays as the theme wrote it."""
    match = CONFIG_BLOCK.search(html)
    if not match:
        raise SearchLaterError("the page has no theme config block (script#__config)")
    url = json.loads(match.group(2)).get("search")
    if not isinstance(url, str) or not THEME_WORKER.fullmatch(url.rsplit("/", 1)[-1]):
        raise SearchLaterError(f"the theme config's search worker is {url!r}")
    quoted = json.dumps(url)  # as it stands in the block: a path holds nothing tojson escapes
    pointed = json.dumps(url[:len(url) - len(url.rsplit("/", 1)[-1])] + WORKER_NAME)
    if match.group(2).count(quoted) != 1:
        raise SearchLaterError(f"the theme config names {url!r} more than once or not as written")
    block = match.group(1) + match.group(2).replace(quoted, pointed) + match.group(3)
    return html[:match.start()] + block + html[match.end():]
