"""The engine's memory snapshot on the device (issue 12): a later visit restores from it.

The first full boot takes a snapshot right after importing calc and stores it without its pages
of zeros and those the runtime's wasm writes itself when instantiated (snapshot-pages.js;
tests/test_snapshot_pages.py) in Cache Storage ("fluxbook-engine-snapshot"), with its checksum,
its size, the stored layout and the Pyodide version that made it in headers, keyed by Pyodide's
folder and calc.zip's SHA-256. These tests read and plant entries
there from the page, then check which start the calculator root reports (data-engine-start) and
that it still computes.
"""

import base64
import struct
import warnings

import pytest
from playwright.sync_api import expect

from tests.browser.conftest import ENGINE_TIMEOUT_MS, output, wait_done
from tests.conftest import serving
from tests.test_snapshot_pages import HEAD_BYTES, sum64, unpack

PAGE = "calculators/transformer-currents/"
CACHE = "fluxbook-engine-snapshot"
HEAP_COMPILED = 30 * 1024 * 1024  # Pyodide 314.0.7's wasm memory before it grows (issue 6254)
SAVE_TIMEOUT_MS = 120000  # a cold boot, then the snapshot's checksum and storing it
CHECKSUM = "X-Snapshot-Sum64"
LAYOUT = "fluxbook-pages-2"
SIZE = "X-Snapshot-Bytes"
RUNTIME = "X-Snapshot-Pyodide"
FORMAT = "X-Snapshot-Format"

# Every entry URL of the snapshot cache.
KEYS_JS = f"""async () => {{
  const cache = await caches.open("{CACHE}");
  return (await cache.keys()).map((request) => request.url);
}}"""
# Waits for a saved snapshot (an entry ending in .bin other than `except`); its URL, size and
# the headers it was stored with.
WAIT_SAVED_JS = f"""async ([except_, timeoutMs]) => {{
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {{
    const cache = await caches.open("{CACHE}");
    const found = (await cache.keys()).find((r) => r.url.endsWith(".bin") && r.url !== except_);
    if (found) {{
      const response = await cache.match(found);
      return {{ url: found.url, size: (await response.clone().arrayBuffer()).byteLength,
               headers: Object.fromEntries(response.headers.entries()) }};
    }}
    await new Promise((resolve) => setTimeout(resolve, 250));
  }}
  return null;
}}"""
# The stored bytes of one entry, as base64.
READ_JS = f"""async (url) => {{
  const response = await (await caches.open("{CACHE}")).match(url);
  const bytes = new Uint8Array(await response.arrayBuffer());
  let text = "";
  for (let i = 0; i < bytes.length; i += 0x8000) {{
    text += String.fromCharCode.apply(null, bytes.subarray(i, i + 0x8000));
  }}
  return btoa(text);
}}"""
# Stores what `source` (a same-origin URL the test routes) answers under entry `url`, with
# `headers`.
PLANT_JS = f"""async ([source, url, headers]) => {{
  const body = await (await fetch(source)).blob();
  const cache = await caches.open("{CACHE}");
  await cache.put(url, new Response(body, {{ headers }}));
}}"""
# The engine module the page itself uses (same URL, same instance): its state.
ENGINE_STATE_JS = """async () => {
  const script = document.querySelector('script[type=module][src*="fluxbook.js"]').src;
  const { engine } = await import(new URL("engine.js", script).href);
  return engine().state;
}"""
PLANTED = "__snapshot_test__/planted.bin"


def new_context(browser):
    context = browser.new_context(viewport={"width": 360, "height": 780})
    context.set_default_timeout(ENGINE_TIMEOUT_MS)
    return context


def wait_saved(page, except_url=""):
    saved = page.evaluate(WAIT_SAVED_JS, [except_url, SAVE_TIMEOUT_MS])
    assert saved, "no engine snapshot was saved after the first result"
    return saved


def start_of(page):
    return page.get_attribute("[data-calculator]", "data-engine-start")


def plant(context, page, base, url, body, headers):
    """Store body in the snapshot cache under url with headers, from a page of the site."""
    context.route(base + PLANTED, lambda route: route.fulfill(
        body=body, headers={"Content-Type": "application/octet-stream"}))
    page.evaluate(PLANT_JS, [base + PLANTED, url, headers])


def stored_headers(saved, body=None, **change):
    """The saved snapshot's headers; with body, its checksum and size are body's; change
    replaces any (None: left out)."""
    headers = {name: saved["headers"][name.lower()] for name in (CHECKSUM, SIZE, RUNTIME, FORMAT)}
    if body is not None:
        headers[CHECKSUM] = sum64(body)
    headers.update(change)
    return {name: value for name, value in headers.items() if value is not None}


@pytest.fixture(scope="module")
def site(built_site):
    with serving(built_site) as (base, _):
        yield base


@pytest.fixture(scope="module")
def saved(browser, site):
    """A first visit's snapshot: {"url", "size", "headers", "bytes"} (bytes: as stored)."""
    context = new_context(browser)
    try:
        page = context.new_page()
        page.goto(site + PAGE)
        wait_done(page)
        assert start_of(page) == "normal"
        snapshot = wait_saved(page)
        snapshot["bytes"] = base64.b64decode(page.evaluate(READ_JS, snapshot["url"]))
    finally:
        context.close()
    return snapshot


def test_second_offline_visit_restores_from_the_snapshot(browser, built_site):
    context = new_context(browser)
    try:
        with serving(built_site) as (base, _):
            page = context.new_page()
            page.goto(base + PAGE)
            wait_done(page)
            assert start_of(page) == "normal"
            assert "full start" in page.text_content(".fb-engine__text")
            page.wait_for_selector('html[data-offline="stored"]', state="attached")
            snapshot = wait_saved(page)
        # The server is gone: page, Pyodide and the snapshot all come from this device.
        context.set_offline(True)
        response = page.reload()
        assert response.from_service_worker
        wait_done(page)
        assert start_of(page) == "snapshot"
        assert "snapshot" in page.text_content(".fb-engine__text")
        assert output(page, "secondary_a") == "208 A"  # 75 kVA / (√3 × 208 V), computed
        page.fill('[name="kva"]', "112.5")
        expect(page.locator('[data-output="secondary_a"]')).to_have_text("312 A")
        assert page.evaluate(KEYS_JS).count(snapshot["url"]) == 1  # kept for the next visit
    finally:
        context.close()


def test_the_full_calc_package_snapshot_fits_and_restores(saved, browser, site):
    """The snapshot of the whole calc package, restored in a fresh worker of a new visit.

    Pyodide 314.0.7 cannot restore a heap grown past its compiled 30 MiB (issue 6254); the worker
    grows the memory first. This test fails if a grown calc package's snapshot stops restoring,
    and says how close it is to the limit.
    """
    stored = saved["bytes"]
    assert len(stored) == saved["size"]
    assert saved["headers"][CHECKSUM.lower()] == sum64(stored)
    assert saved["headers"][FORMAT.lower()] == LAYOUT
    raw, _, base_pages = unpack(stored)
    assert saved["headers"][SIZE.lower()] == str(len(raw))
    # Neither its pages of zeros nor those the runtime gives back on instantiation are stored.
    assert base_pages and len(stored) < 0.5 * len(raw)
    heap = len(raw) - struct.unpack_from("<I", raw, 4)[0]  # the header's second word: its length
    print(f"engine snapshot: {len(raw):,} B ({len(stored):,} B stored), heap {heap:,} B = "
          f"{heap / HEAP_COMPILED:.3f} x the compiled 30 MiB")
    if heap > HEAP_COMPILED:
        warnings.warn(f"the engine snapshot's heap ({heap:,} B) is past Pyodide's compiled 30 MiB: "
                      "it restores only through calc-worker.js's memory growth (pyodide issue 6254)")
    context = new_context(browser)
    try:
        page = context.new_page()
        page.goto(site)  # no calculator here: nothing boots yet
        plant(context, page, site, saved["url"], saved["bytes"], stored_headers(saved))
        page.goto(site + PAGE)
        wait_done(page)
        assert start_of(page) == "snapshot"
        assert output(page, "secondary_a") == "208 A"  # 75 kVA / (√3 × 208 V), computed
    finally:
        context.close()


@pytest.mark.parametrize("damage", ["garbled", "not a snapshot", "truncated", "no checksum",
                                    "another base"])
def test_a_corrupt_snapshot_is_deleted_and_the_page_still_computes(saved, browser, site, damage):
    good = saved["bytes"]
    headers = stored_headers(saved)  # the good snapshot's checksum
    if damage == "garbled":  # bytes flipped in the middle, which Pyodide would restore: the checksum fails
        middle = len(good) // 2
        body = good[:middle] + bytes(b ^ 0xFF for b in good[middle:middle + 4096]) + good[middle + 4096:]
    elif damage == "not a snapshot":  # the wrong bytes with their own checksum: not the layout
        body = b"Fluxbook test: not an engine snapshot. " * 50000
        headers = stored_headers(saved, body)
    elif damage == "truncated":  # shorter than its page list says
        body = good[: len(good) // 2]
    elif damage == "no checksum":  # good bytes nothing vouches for
        body, headers = good, stored_headers(saved, **{CHECKSUM: None})
    else:  # stored against another runtime's memory: its base pages' checksum is not this one's
        head = bytearray(good[:HEAD_BYTES])
        struct.pack_into("<I", head, HEAD_BYTES - 4, struct.unpack_from("<I", head, HEAD_BYTES - 4)[0] ^ 1)
        body = bytes(head) + good[HEAD_BYTES:]
        headers = stored_headers(saved, body)
    context = new_context(browser)
    try:
        page = context.new_page()
        page.goto(site)
        plant(context, page, site, saved["url"], body, headers)
        page.goto(site + PAGE)
        wait_done(page)
        assert start_of(page) == "normal"
        assert output(page, "secondary_a") == "208 A"  # computed by the full start
        keys = page.evaluate(KEYS_JS)
        assert saved["url"] not in keys  # the corrupt one is gone
        assert saved["url"].removesuffix(".bin") + ".failed" in keys  # and not made again
        state = page.evaluate(ENGINE_STATE_JS)
        assert state["snapshot"]["state"] == "failed", state
        if damage == "another base":  # refused as it restored, not given up on as hung
            assert "differs" in state["snapshot"]["detail"], state
        page.reload()  # the next visit starts in full, without trying it again
        wait_done(page)
        assert start_of(page) == "normal"
    finally:
        context.close()


def test_a_snapshot_of_another_calc_zip_is_not_used_and_is_replaced(saved, browser, site):
    context = new_context(browser)
    try:
        page = context.new_page()
        page.goto(site)
        page_sha = page.get_attribute('meta[name="fluxbook-calc-zip-sha256"]', "content")
        assert len(page_sha) == 64 and page_sha in saved["url"]
        other = saved["url"].replace(page_sha, "0" * 64)  # a good snapshot of another release
        plant(context, page, site, other, saved["bytes"], stored_headers(saved))
        page.goto(site + PAGE)
        wait_done(page)
        assert start_of(page) == "normal"  # a working snapshot, but not of this calc.zip
        mine = wait_saved(page, except_url=other)
        assert mine["url"] == saved["url"]  # this release makes its own
        assert other not in page.evaluate(KEYS_JS)  # and the other release's is deleted
    finally:
        context.close()


# A throwaway worker the test serves (routed, same origin): a snapshot of the engine whose heap
# has grown past 30 MiB (20 MB of ballast), taken the way calc-worker.js takes it, except that
# only calc.api is imported: the restore must also put calc's files back at once for the rest.
BALLAST_WORKER = """
import * as pages from "../assets/js/snapshot-pages.js";
self.onmessage = async ({ data: { indexURL, calcZipURL } }) => {
  try {
    const { loadPyodide, version } = await import(new URL("pyodide.mjs", indexURL).href);
    const pyodide = await loadPyodide({ indexURL, fullStdLib: false, _makeSnapshot: true });
    const zip = await (await fetch(calcZipURL)).arrayBuffer();
    pyodide.unpackArchive(zip, "zip", { extractDir: "/home/pyodide/fluxbook" });
    pyodide.runPython(`import sys\\nsys.path.insert(0, "/home/pyodide/fluxbook")\\nimport calc.api
import builtins\\nbuiltins._test_ballast = [bytes(1000) + str(i).encode() for i in range(20000)]
import gc\\ngc.collect()`);
    const raw = pyodide.makeMemorySnapshot();
    const stored = pages.pack(raw);
    self.postMessage({ stored, size: raw.length, sum: pages.sum64(stored), version, format: pages.FORMAT });
  } catch (error) { self.postMessage({ error: String(error && error.stack || error) }); }
};
"""
# Makes the ballast snapshot in that worker and stores it under entry `url`; its raw size.
MAKE_BALLAST_JS = """async ([workerURL, url]) => {
  const meta = (name) => new URL(document.querySelector(`meta[name="${name}"]`).content,
                                 document.baseURI).href;
  const worker = new Worker(workerURL, { type: "module" });
  const made = await new Promise((resolve) => {
    worker.onmessage = (event) => resolve(event.data);
    worker.onerror = (event) => resolve({ error: event.message || "worker error" });
    worker.postMessage({ indexURL: meta("fluxbook-pyodide"), calcZipURL: meta("fluxbook-calc-zip") });
  });
  worker.terminate();
  if (made.error) return made;
  await (await caches.open("fluxbook-engine-snapshot")).put(url, new Response(made.stored, { headers: {
    "X-Snapshot-Sum64": made.sum, "X-Snapshot-Bytes": String(made.size),
    "X-Snapshot-Pyodide": made.version, "X-Snapshot-Format": made.format } }));
  return { raw: made.size };
}"""


def test_a_snapshot_whose_heap_grew_past_30_mib_restores(saved, browser, site):
    """Pyodide issue 6254: the worker must grow the wasm memory before restoring such a heap."""
    worker_url = site + "__snapshot_test__/ballast-worker.js"
    context = new_context(browser)
    try:
        context.route(worker_url, lambda route: route.fulfill(
            body=BALLAST_WORKER, headers={"Content-Type": "text/javascript"}))
        page = context.new_page()
        page.goto(site)  # no calculator here: the page's own engine does not boot
        made = page.evaluate(MAKE_BALLAST_JS, [worker_url, saved["url"]])
        assert "error" not in made, made
        assert made["raw"] > HEAP_COMPILED + 16 * 1024 * 1024  # well past the compiled heap
        page.goto(site + PAGE)
        wait_done(page)
        # restored, not fallen back to a full start
        assert start_of(page) == "snapshot", page.evaluate(ENGINE_STATE_JS)
        page.fill('[name="kva"]', "150 kVA")
        expect(page.locator('[data-output="secondary_a"]')).to_have_text("416 A")  # computed
    finally:
        context.close()


def test_a_restore_that_hangs_is_given_up_and_the_page_still_computes(saved, browser, site):
    """The page gives a restore RESTORE_TIMEOUT_MS (engine.js), then starts a fresh worker."""
    context = browser.new_context(service_workers="block")  # every request reaches the routes
    context.set_default_timeout(ENGINE_TIMEOUT_MS)
    held = []

    def wasm(route):
        if not held:
            held.append(route)  # the restoring worker's wasm never arrives: it hangs
        else:
            route.continue_()

    try:
        page = context.new_page()
        page.goto(site)
        plant(context, page, site, saved["url"], saved["bytes"], stored_headers(saved))
        context.route("**/pyodide.asm.wasm", wasm)
        page.goto(site + PAGE)
        page.wait_for_selector('[data-calculator][data-state="done"]', timeout=3 * ENGINE_TIMEOUT_MS)
        assert held, "the restore never asked for the wasm"
        assert start_of(page) == "normal"
        assert output(page, "secondary_a") == "208 A"  # computed by the full start
        keys = page.evaluate(KEYS_JS)
        assert saved["url"] not in keys and saved["url"].removesuffix(".bin") + ".failed" in keys
        state = page.evaluate(ENGINE_STATE_JS)
        assert state["snapshot"]["state"] == "failed", state
    finally:
        context.close()


def test_a_snapshot_of_another_pyodide_is_not_used_and_is_replaced(saved, browser, site):
    """The key names Pyodide's folder; the version that made the snapshot is checked as well."""
    context = new_context(browser)
    try:
        page = context.new_page()
        page.goto(site)
        plant(context, page, site, saved["url"], saved["bytes"],
              stored_headers(saved, **{RUNTIME: "0.0.1"}))
        page.goto(site + PAGE)
        wait_done(page)
        assert start_of(page) == "normal"  # a good heap, but of another runtime
        mine = wait_saved(page)
        assert mine["url"] == saved["url"]
        assert mine["headers"][RUNTIME.lower()] == saved["headers"][RUNTIME.lower()] != "0.0.1"
    finally:
        context.close()


@pytest.mark.parametrize("layout", [None, "fluxbook-pages-1"], ids=["whole", "zero pages only"])
def test_a_snapshot_stored_by_an_earlier_worker_is_not_used_and_is_replaced(saved, browser, site, layout):
    """Earlier calc-worker.js versions stored the snapshot whole, with no layout named, then
    without its zero pages only; a device may hold one under the same key (calc.zip unchanged):
    it starts in full and stores a new one."""
    raw, _, _ = unpack(saved["bytes"])
    context = new_context(browser)
    try:
        page = context.new_page()
        page.goto(site)
        plant(context, page, site, saved["url"], raw, stored_headers(saved, raw, **{FORMAT: layout}))
        page.goto(site + PAGE)
        wait_done(page)
        assert start_of(page) == "normal"
        assert output(page, "secondary_a") == "208 A"
        mine = wait_saved(page)
        assert mine["url"] == saved["url"]
        assert mine["headers"][FORMAT.lower()] == LAYOUT
        assert saved["url"].removesuffix(".bin") + ".failed" not in page.evaluate(KEYS_JS)
    finally:
        context.close()


# Where the inline engine start (site_src/overrides/partials/engine-start.html) sits among the
# head's elements (-1: none), and where the first stylesheet does: the start must come first.
INLINE_START_JS = """() => Array.from(document.head.children).findIndex((element) =>
  element.tagName === "SCRIPT" && !element.src && element.textContent.includes("fluxbookEngineStart"))"""
FIRST_STYLESHEET_JS = """() => Array.from(document.head.children).findIndex((element) =>
  element.matches('link[rel="stylesheet"]'))"""
# The engine the page uses: was it started from the head (engine-start.html) and adopted?
STARTED_EARLY_JS = ENGINE_STATE_JS.replace("return engine().state;",
                                           "return Boolean(engine().startedEarly);")


def test_a_calculator_page_starts_its_engine_from_the_head(browser, site):
    """engine-start.html boots the worker before the page's styles load and its modules run;
    engine.js adopts it with every message it sent meanwhile, so the page hears it is ready
    and computes."""
    context = new_context(browser)
    try:
        page = context.new_page()
        page.goto(site)  # the home page has no calculator: nothing boots from its head
        assert page.evaluate(INLINE_START_JS) == -1
        assert page.evaluate("() => window.fluxbookEngineStart === undefined")
        page.goto(site + PAGE)
        assert 0 <= page.evaluate(INLINE_START_JS) < page.evaluate(FIRST_STYLESHEET_JS)
        wait_done(page)
        assert page.evaluate(STARTED_EARLY_JS) is True
        assert output(page, "secondary_a") == "208 A"
        assert "Calculator engine ready" in page.text_content(".fb-engine__text")
    finally:
        context.close()
