"""The service worker's server of packed files (site_src/assets/js/sw-unpack.js), run under
Node.js with stand-ins for the service worker's scope, Cache Storage and network: which requests
it answers, and that what it answers is the file (build/packed.py writes the twins)."""

import base64
import gzip
import json
import shutil
import subprocess

import pytest

from build import paths
from tests.conftest import ROOT

pytestmark = pytest.mark.skipif(shutil.which("node") is None, reason="needs node")

SCOPE = "https://tools.example/fluxbook/"
PAGE = "<!doctype html><title>Pump house</title><p>Panel PH-1, feeder 3</p>\n" * 40
STYLE = "body { color: #0d3b45 }\n" * 80

# Loads the script with stand-ins, sends each request in argv[2] through its fetch listener and
# prints, for each, null (not answered) or {status, type, body, network}.
HARNESS = r"""
import { readFileSync } from "node:fs";
const [source, cases, stored] = [readFileSync(process.argv[1], "utf8"), JSON.parse(process.argv[2]),
                                 JSON.parse(process.argv[3])];
const listeners = [];
const self = { FLUXBOOK_PACKED: JSON.parse(process.argv[4]), registration: { scope: process.argv[5] },
               addEventListener: (type, listener) => type === "fetch" && listeners.push(listener) };
// Stored twins by URL with their headers, as Workbox keeps them (a revision query the lookup
// must ignore), in its precache, named after the scope; argv[6] "no precache": none by that name.
const match = async (url, options) => {
  const entry = stored[options && options.ignoreSearch ? url.split("?")[0] : url];
  return entry && new Response(Buffer.from(entry[0], "base64"), { headers: { "X-Kept": "yes", ...entry[1] } });
};
const precacheName = "fluxbook-precache-v2-" + process.argv[5];
const caches = { match, has: async (name) => name === precacheName && process.argv[6] !== "no precache",
                 open: async (name) => ({ match: name === precacheName ? match : async () => undefined }) };
let network = 0;
const fetch = async () => { network += 1; return new Response("from the network"); };
new Function("self", "caches", "fetch", source)(self, caches, fetch);
const results = [];
for (const [method, url] of cases) {
  let answer = null;
  const event = { request: { method, url }, respondWith: (promise) => { answer = promise; } };
  for (const listener of listeners) listener(event);
  if (!answer) { results.push(null); continue; }
  const before = network;
  const response = await answer;
  results.push({ status: response.status, type: response.headers.get("Content-Type"),
                 kept: response.headers.get("X-Kept"), body: await response.text(),
                 network: network > before });
}
console.log(JSON.stringify(results));
"""


def run(cases, stored, packed, precache="precache"):
    """stored: {url: body} or {url: (body, headers)}."""
    stored = {url: entry if isinstance(entry, tuple) else (entry, {}) for url, entry in stored.items()}
    completed = subprocess.run(
        ["node", "--input-type=module", "-e", HARNESS,
         str(ROOT / "site_src" / paths.SERVICE_WORKER_UNPACK), json.dumps(cases),
         json.dumps({url: [base64.b64encode(body).decode(), headers]
                     for url, (body, headers) in stored.items()}),
         json.dumps(packed), SCOPE, precache],
        capture_output=True, text=True, check=False, timeout=60)
    assert completed.returncode == 0, completed.stderr
    return json.loads(completed.stdout)


PACKED = {"index.html": "text/html; charset=utf-8",
          "calculators/voltage-drop/index.html": "text/html; charset=utf-8",
          "assets/css/fluxbook.css": "text/css; charset=utf-8"}


@pytest.mark.parametrize("precache", ["precache", "no precache"])
def test_a_packed_file_is_served_unpacked_with_its_type(precache):
    stored = {SCOPE + "calculators/voltage-drop/index.html.gz": gzip.compress(PAGE.encode()),
              SCOPE + "index.html.gz": gzip.compress(PAGE.encode()),
              SCOPE + "assets/css/fluxbook.css.gz": gzip.compress(STYLE.encode())}
    folder, share, home, style = run([
        ["GET", SCOPE + "calculators/voltage-drop/"],
        ["GET", SCOPE + "calculators/voltage-drop/?length=150%20ft&load_a=32"],  # a share link
        ["GET", SCOPE],
        ["GET", SCOPE + "assets/css/fluxbook.css?v=2"],
    ], stored, PACKED, precache)
    for answer in (folder, share, home):
        assert answer == {"status": 200, "type": "text/html; charset=utf-8", "kept": "yes",
                          "body": PAGE, "network": False}
    assert style["body"] == STYLE and style["type"] == "text/css; charset=utf-8"


def test_a_twin_a_host_already_unpacked_is_served_as_it_is():
    """A host that sends the .gz with Content-Encoding: gzip leaves it unpacked in the cache."""
    stored = {SCOPE + "index.html.gz": (PAGE.encode(), {"Content-Encoding": "gzip"})}
    (answer,) = run([["GET", SCOPE + "index.html"]], stored, PACKED)
    assert answer["body"] == PAGE and answer["type"] == "text/html; charset=utf-8"


def test_what_it_does_not_hold_is_left_to_the_network_or_to_workbox():
    not_stored, other_file, other_site, posted, outside = run([
        ["GET", SCOPE + "index.html"],  # packed, but its twin is not stored yet: the network
        ["GET", SCOPE + "assets/engine/calc.zip"],  # not packed: Workbox's precache answers
        ["GET", "https://elsewhere.example/fluxbook/index.html"],
        ["POST", SCOPE + "index.html"],
        ["GET", "https://tools.example/other/index.html"],  # same host, outside the scope
    ], {}, PACKED)
    assert not_stored == {"status": 200, "type": "text/plain;charset=UTF-8", "kept": None,
                          "body": "from the network", "network": True}
    assert other_file is None and other_site is None and posted is None and outside is None
