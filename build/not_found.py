"""The "page not found" page, styled wherever the site lives.

A host serves 404.html for any missing address, at that address: its links cannot be relative
to it, and MkDocs writes them root-absolute ("/assets/..."), which is wrong for a copy under a
sub-path (/tools/fluxbook/). So the build makes every such link relative and puts a small script
first in the head that finds the site's root and sets `<base href>` before anything loads: the
root this device recorded on an earlier visit (fluxbook.js keeps it in localStorage), else the
nearest folder above the address that holds the site's manifest.webmanifest (same-origin probes).
The theme's scope and configuration are pointed at that root as well.
"""

import re

ROOT_KEY = "fluxbook-root"  # localStorage key, written by site_src/assets/js/fluxbook.js
MARKER = "manifest.webmanifest"  # a file at the site's root that every build has

FIND_ROOT = (
    "(function(){var r=null;try{r=localStorage.getItem(%(key)s)}catch(e){}"
    "if(!r||location.href.indexOf(r)!==0||!/^https?:\\/\\/[^\"<>\\s]*\\/$/.test(r)){r=null;"
    "var p=location.pathname.split(\"/\");"
    "for(var n=p.length-1;n>0&&!r;n--){var d=p.slice(0,n).join(\"/\")+\"/\";"
    "try{var x=new XMLHttpRequest();x.open(\"HEAD\",d+%(marker)s,false);x.send();"
    "if(x.status===200&&!/html/.test(x.getResponseHeader(\"Content-Type\")||\"\"))"
    "r=location.origin+d}catch(e){}}}"
    "var b=document.createElement(\"base\");b.href=r||location.origin+\"/\";"
    "document.head.appendChild(b)})()"
) % {"key": f'"{ROOT_KEY}"', "marker": f'"{MARKER}"'}

# After the theme's configuration block, before its bundle reads it: base and search worker at
# the root found above.
FIX_CONFIG = (
    "(function(){var c=document.getElementById(\"__config\"),j=JSON.parse(c.textContent);"
    "j.base=document.baseURI;if(j.search)j.search=new URL(j.search.replace(/^\\//,\"\"),"
    "document.baseURI).href;c.textContent=JSON.stringify(j)})()"
)

_ROOT_ABSOLUTE = re.compile(r'(\s(?:href|src)=")/(?!/)([^"]*)"')
_CONFIG = re.compile(r'(<script id="__config" type="application/json">.*?</script>)', re.DOTALL)
_SCOPE = 'new URL("/",location)'


class NotFoundPageError(Exception):
    """404.html no longer has the shape this module rewrites (a theme update): say what."""


def rebase(html):
    """404.html with its links relative to the site's root, found in the browser.

    Raises
    ------
    NotFoundPageError
        When the page lacks the charset meta, the theme's configuration block or its scope
        script (a theme update changed them): the build stops rather than ship a broken page.
    """
    charset = '<meta charset="utf-8">'
    if charset not in html or not _CONFIG.search(html) or _SCOPE not in html:
        raise NotFoundPageError("404.html changed shape (charset, __config or __md_scope missing); "
                                "update build/not_found.py")
    html = _ROOT_ABSOLUTE.sub(lambda m: f'{m.group(1)}{m.group(2) or "."}"', html)
    html = html.replace('href="."', 'href="./"')
    html = html.replace(_SCOPE, 'new URL(".",document.baseURI)')
    html = html.replace(charset, f"{charset}<script>{FIND_ROOT}</script>", 1)
    return _CONFIG.sub(lambda m: f"{m.group(1)}<script>{FIX_CONFIG}</script>", html, count=1)
