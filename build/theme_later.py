"""The theme's script on calculator pages, run after the first result (issue 12: quick start).

A warm offline visit to a calculator page spends its first half-second restoring the engine,
on a phone of few cores. The theme's bundle (mkdocs-material) runs meanwhile on the page's main
thread, 40-70 ms of it measured in a Chromium trace of such a reload here (2 cores), and starts
its search worker, which builds the lunr index in another 0.1-0.25 s. None of it is needed for a
result, and the theme's drawer and links work without it. Paired offline reloads of a
calculator page (24 pairs): the first result 80 ms sooner (median) with no bundle at all, and
33-48 ms sooner (paired median, three builds) with it run after the first result as here.

On a page with a calculator (page.meta["fluxbook_engine"]) the theme's script element becomes a
data block naming it (HELD_TYPE, its URL in DATA_ATTRIBUTE); site_src/assets/js/theme-later.js
runs it after the first result, at the user's first reach for the header, or a few seconds
later at the latest. Other pages keep the theme's script as it is.

Until it runs the page is as the theme serves a browser without scripts (<html class="no-js">),
which hides the search. The page's <html> also gets HTML_CLASS, under which fluxbook.css shows
the search button and box meanwhile: opening them runs the theme at once. And the theme's script
is what picks the colour scheme of the device (light or dark) when the user has chosen none: the
page would show light, then turn dark. So right after the theme's own palette script (which
applies a scheme the user chose) comes SCHEME_SCRIPT, which applies the device's, as the theme
will once it runs: the first palette entry whose media query matches.
"""

import html
import re

HELD_TYPE = "text/x-fluxbook-later"  # also in site_src/assets/js/theme-later.js
DATA_ATTRIBUTE = "data-fluxbook-theme"  # also there, as dataset.fluxbookTheme
HTML_CLASS = "fb-theme-later"  # also in site_src/assets/css/fluxbook.css
NO_SCRIPT_HTML = re.compile(r'<html(?P<attrs>[^>]*) class="no-js">')  # as the theme writes it
# The theme's inline script after its palette toggle, which applies a stored choice only.
PALETTE_SCRIPT = re.compile(r'<script>var palette=__md_get\("__palette"\);[^<]*</script>')
SCHEME_SCRIPT = (
    '<script>if(!__md_get("__palette")){var fbSchemes=document.querySelectorAll("[data-md-color-media]");'
    'for(var fbAt=0;fbAt<fbSchemes.length;fbAt++){var fbScheme=fbSchemes[fbAt];'
    'if(matchMedia(fbScheme.getAttribute("data-md-color-media")).matches){'
    '["media","scheme","primary","accent"].forEach(function(key){'
    'document.body.setAttribute("data-md-color-"+key,fbScheme.getAttribute("data-md-color-"+key))});break}}}'
    '</script>'
)
# The theme's bundle as its base.html writes it, page-relative; a new theme version that writes it
# otherwise stops the build (ThemeLaterError) rather than leaving the page without its theme.
BUNDLE_SCRIPT = re.compile(r'<script src="(?P<src>[^"<>]*assets/javascripts/bundle\.[0-9a-f]+\.min\.js)"></script>')


class ThemeLaterError(Exception):
    """The theme no longer writes its script as this module expects (a new mkdocs-material)."""


def hold_bundle(page_html):
    """The page with the theme's bundle script held back as a data block that names it."""
    found = list(BUNDLE_SCRIPT.finditer(page_html))
    if len(found) != 1:
        raise ThemeLaterError(f"expected the theme's bundle script once in the page, found it {len(found)} times")
    match = found[0]
    src = html.unescape(match.group("src"))
    held = f'<script type="{HELD_TYPE}" {DATA_ATTRIBUTE}="{html.escape(src, quote=True)}"></script>'
    page_html = page_html[:match.start()] + held + page_html[match.end():]
    marked, count = NO_SCRIPT_HTML.subn(rf'<html\g<attrs> class="no-js {HTML_CLASS}">', page_html, count=2)
    if count != 1:
        raise ThemeLaterError(f'expected <html class="no-js"> once in the page, found it {count} times')
    palette = list(PALETTE_SCRIPT.finditer(marked))
    if len(palette) != 1:
        raise ThemeLaterError(f"expected the theme's palette script once in the page, found it {len(palette)} times")
    return marked[:palette[0].end()] + SCHEME_SCRIPT + marked[palette[0].end():]


def held_bundle(page_html):
    """The bundle's page-relative URL a page holds back, or None if it runs the theme's script."""
    match = re.search(rf'<script type="{re.escape(HELD_TYPE)}" {DATA_ATTRIBUTE}="([^"]*)"></script>', page_html)
    return html.unescape(match.group(1)) if match else None
