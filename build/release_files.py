"""Files written beside the site for its hosts: the headers to send, and a checksum list."""

import base64
import gzip
import hashlib
import re
from pathlib import Path

from build import paths

# Inline <script> elements that the browser runs (Material's small bootstrap scripts); JSON
# data blocks (type="application/json") are not scripts and need no hash.
INLINE_SCRIPT = re.compile(r"<script(?P<attrs>[^>]*)>(?P<body>.*?)</script>", re.DOTALL)


def inline_script_hashes(site_dir):
    """CSP source expressions ('sha256-...') for every inline script in the built pages, sorted."""
    hashes = set()
    for page in sorted(Path(site_dir).rglob("*.html")):
        for match in INLINE_SCRIPT.finditer(page.read_text(encoding="utf-8")):
            attrs, body = match.group("attrs"), match.group("body")
            if "src=" in attrs or "application/json" in attrs or not body.strip():
                continue
            digest = hashlib.sha256(body.encode("utf-8")).digest()
            hashes.add("'sha256-" + base64.b64encode(digest).decode("ascii") + "'")
    return sorted(hashes)


def content_security_policy(site_dir):
    """The policy the site runs under: nothing leaves the origin; wasm may compile."""
    scripts = " ".join(["'self'", "'wasm-unsafe-eval'"] + inline_script_hashes(site_dir))
    return "; ".join([
        "default-src 'self'",
        f"script-src {scripts}",
        "style-src 'self' 'unsafe-inline'",  # the theme and the charts set style attributes
        "img-src 'self' data:",
        "font-src 'self'",
        "connect-src 'self'",
        "worker-src 'self'",
        "manifest-src 'self'",
        "object-src 'none'",
        "base-uri 'self'",
        "form-action 'self'",
    ])


def server_headers(site_dir):
    """Text of server-headers.txt: one `Header: value` a line, for a host to copy."""
    return (
        "# Headers to send with every response of this Fluxbook build (see README, Hosting).\n"
        "# .wasm files must also be served as Content-Type: application/wasm.\n"
        f"Content-Security-Policy: {content_security_policy(site_dir)}\n"
        "X-Content-Type-Options: nosniff\n"
        "Referrer-Policy: no-referrer\n"
    )


def write_server_headers(site_dir):
    (Path(site_dir) / paths.SERVER_HEADERS_FILE).write_text(server_headers(site_dir), encoding="utf-8")


def write_checksums(site_dir):
    """SHA256SUMS: `digest  path` for every shipped file, sorted by path (sha256sum -c reads it)."""
    site_dir = Path(site_dir)
    lines = []
    for file in sorted(p for p in site_dir.rglob("*") if p.is_file()):
        relative = file.relative_to(site_dir).as_posix()
        if relative == paths.CHECKSUMS_FILE:
            continue
        lines.append(f"{hashlib.sha256(file.read_bytes()).hexdigest()}  {relative}")
    (site_dir / paths.CHECKSUMS_FILE).write_text("\n".join(lines) + "\n", encoding="utf-8")
    return len(lines)


LASTMOD = re.compile(r"\s*<lastmod>[^<]*</lastmod>")


def strip_sitemap_dates(site_dir):
    """Drop the build date from sitemap.xml (and rewrite its .gz with no timestamp), so the same
    sources give the same files on any day and a rebuild offers no needless update."""
    sitemap = Path(site_dir) / "sitemap.xml"
    if not sitemap.exists():
        return
    text = LASTMOD.sub("", sitemap.read_text(encoding="utf-8"))
    sitemap.write_text(text, encoding="utf-8")
    (Path(site_dir) / "sitemap.xml.gz").write_bytes(gzip.compress(text.encode("utf-8"), mtime=0))
