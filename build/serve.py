"""Serve a built site on 127.0.0.1 the way a team's server should: right types, the site's headers.

    python build/serve.py [--dir site] [--port 8000] [--prefix /tools/fluxbook/]

--prefix serves the site under a sub-path, to check that a copy hosted there works.
"""

import argparse
import functools
import http.server
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
if str(ROOT) not in sys.path:
    sys.path.insert(0, str(ROOT))

from build import paths  # noqa: E402

# Types a host must get right: a wasm served as anything else can hang the engine's start.
TYPES = {
    ".wasm": "application/wasm",
    ".mjs": "text/javascript",
    ".js": "text/javascript",
    ".json": "application/json",
    ".webmanifest": "application/manifest+json",
    ".svg": "image/svg+xml",
    ".zip": "application/zip",
}


def read_headers(site_dir):
    """The `Header: value` lines of the build's server-headers.txt (comments skipped)."""
    headers = []
    path = Path(site_dir) / paths.SERVER_HEADERS_FILE
    if path.exists():
        for line in path.read_text(encoding="utf-8").splitlines():
            if line.strip() and not line.startswith("#"):
                name, _, value = line.partition(":")
                headers.append((name.strip(), value.strip()))
    return headers


class SiteHandler(http.server.SimpleHTTPRequestHandler):
    extensions_map = {**http.server.SimpleHTTPRequestHandler.extensions_map, **TYPES}

    def __init__(self, *args, site_headers=(), prefix="/", **kwargs):
        self.site_headers = site_headers
        self.prefix = prefix
        super().__init__(*args, **kwargs)

    def translate_path(self, path):
        if self.prefix != "/":
            if not path.startswith(self.prefix):
                return str(Path(self.directory) / "__outside_prefix__")
            path = "/" + path[len(self.prefix):]
        return super().translate_path(path)

    def send_error(self, code, message=None, explain=None):
        # A missing address gets the site's own 404.html, as a team's server is set up to do.
        page = Path(self.directory) / "404.html"
        if code != 404 or not page.exists() or self.command != "GET":
            return super().send_error(code, message, explain)
        body = page.read_bytes()
        self.send_response(404, message)
        self.send_header("Content-Type", "text/html; charset=utf-8")
        self.send_header("Content-Length", str(len(body)))
        self.end_headers()
        self.wfile.write(body)

    def end_headers(self):
        for name, value in self.site_headers:
            self.send_header(name, value)
        self.send_header("Cache-Control", "no-cache")  # revalidate: a rebuild shows at once
        super().end_headers()

    def log_message(self, format, *args):  # quiet unless asked
        if self.server.verbose:
            super().log_message(format, *args)


def make_server(site_dir, port=8000, prefix="/", verbose=False, host="127.0.0.1"):
    """An HTTP server for site_dir (not yet serving); port 0 picks a free port."""
    prefix = "/" + prefix.strip("/") + "/" if prefix.strip("/") else "/"
    handler = functools.partial(
        SiteHandler, directory=str(site_dir), site_headers=read_headers(site_dir), prefix=prefix
    )
    server = http.server.ThreadingHTTPServer((host, port), handler)
    server.verbose = verbose
    server.daemon_threads = True
    server.base_url = f"http://{host}:{server.server_port}{prefix}"
    return server


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--dir", default=str(ROOT / "site"), help="the built site (default: site/)")
    parser.add_argument("--port", type=int, default=8000)
    parser.add_argument("--prefix", default="/", help="serve under this sub-path")
    parser.add_argument("--verbose", action="store_true", help="log every request")
    args = parser.parse_args(argv)
    if not (Path(args.dir) / "index.html").exists():
        parser.error(f"{args.dir} has no index.html: build the site first")
    server = make_server(args.dir, args.port, args.prefix, args.verbose)
    print(f"Fluxbook: serving {args.dir} on {server.base_url}  (Ctrl+C stops)")
    try:
        server.serve_forever()
    except KeyboardInterrupt:
        pass
    finally:
        server.server_close()


if __name__ == "__main__":
    main()
