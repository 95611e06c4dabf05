"""How long Fluxbook takes to a first result and to recompute, and how many bytes it stores.

    .venv/bin/python build/benchmark.py [--site DIR] [--runs N] [--changes N]

Builds the site into a temporary folder (or copies --site there), serves it on 127.0.0.1 with the
site's CSP (build/serve.py), drives headless Debian Chromium on calculators/transformer-currents/.
  bare       our own page (/__bench__/, only in the temporary copy): a module worker that calls
             loadPyodide() from the site's Pyodide folder, the floor for booting Pyodide this way.
  cold       fresh context (no HTTP cache, no service worker): navigation start to
             data-state="done", the first result; the service worker precaches meanwhile and
             the worker saves its engine snapshot after the result (its size and time shown).
  warm       same context once <html data-offline="stored"> and the snapshot is saved: server
             stopped, context offline, reload, twice: "snapshot" restores the saved engine,
             "normal" boots in full (the snapshot cache deleted first, so a new one is saved
             before the next reload); the order alternates from run to run. Each visit's
             data-engine-start is checked; says whether the service worker answered.
  settled    recompute and engine below run on a page that has settled: the first visit's
             offline copy stored and its snapshot saved, then a reload (the service worker
             answers, the engine restores) and SETTLE_S after its first result, by when the
             search index is built. On the first visit's page these runs would share the two
             cores with that one-time work and time it, not the engine.
  recompute  engine ready, --changes kva values filled in, each timed from the input event to
             data-state="done" with a new output; includes the page's debounce (DEBOUNCE_MS in
             fluxbook.js), also shown subtracted. p95 is nearest-rank.
  engine     per calculator (issue 12): engine.run(id, defaults, "na") from the page, --engine-runs
             times after one untimed run: the worker's round trip (JSON both ways, Python's
             validate, compute, format), no debounce. Target: p95 <= 16 ms for every calculator.
  bytes      every URL in sw.js's precache manifest: own files, Pyodide's folder, theme assets.
             Own text files are precached as gzipped twins (build/packed.py): "own" is what a
             device downloads and keeps; "plain" the same files unpacked, as a first page load
             fetches them before the service worker, also gzip-compressed (level 9, as a host
             that compresses sends them). Target (issue 12): own <= 1 MB.
Reading it: ms on the page's performance.now() clock (0 = navigation start), marked by a
MutationObserver from add_init_script (injected over the DevTools protocol: the CSP allows it).
"wall" is Python's clock around goto/reload + wait, the fallback if in-page marks are missing
(the report says so). "x bare" = a visit's median / the bare boot's median: near 1.0 means
Pyodide's own start is nearly all of the wait. Target (issue 12): a warm offline visit from the
snapshot reaches its first result in <= 0.25 x bare. One untimed bare boot warms the browser first;
runs are interleaved. The load average is printed: compare runs on the same idle machine.
"""

import argparse
import contextlib
import gzip
import math
import os
import re
import shutil
import statistics
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
if str(ROOT) not in sys.path:
    sys.path.insert(0, str(ROOT))

from playwright.sync_api import sync_playwright  # noqa: E402

from build.packed import read_list  # noqa: E402
from tests.browser.conftest import CHROMIUM, CHROMIUM_ARGS  # noqa: E402
from tests.conftest import build_site, serving  # noqa: E402

PAGE = "calculators/transformer-currents/"
DONE = '[data-calculator][data-state="done"]'
TIMEOUT_MS = 120000
BENCH = "__bench__"
SNAPSHOT_TARGET = 0.25  # warm snapshot start / bare loadPyodide(), at most
ENGINE_P95_TARGET_MS = 16  # per recompute, every calculator (issue 12)
OWN_BYTES_TARGET = 1_000_000  # our own shipped bytes (issue 12)
SNAPSHOT_CACHE = "fluxbook-engine-snapshot"
SETTLE_S = 2.0  # after a settled page's first result: the search index is built by then
# The page's own engine (same module URL, same instance): its state, e.g. the snapshot's news.
ENGINE_STATE_JS = """async () => {
  const script = document.querySelector('script[type=module][src*="fluxbook.js"]').src;
  const { engine } = await import(new URL("engine.js", script).href);
  return engine().state;
}"""
# Waits until the engine reports its snapshot saved (or not); the news, or null after 2 minutes.
WAIT_SNAPSHOT_JS = ENGINE_STATE_JS.replace("return engine().state;", """const until = Date.now() + 120000;
  while (Date.now() < until) {
    const news = engine().state.snapshot;
    if (news && news.state !== "failed") return news;
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
  return null;""")

MARKS_JS = """const marks = (window.__fbBench = {});
new MutationObserver((records) => { const now = performance.now(); for (const r of records) {
  if (!r.target.matches || !r.target.matches("[data-calculator]")) continue;
  const key = r.attributeName.slice(5) + "_" + r.target.getAttribute(r.attributeName);
  if (!(key in marks)) marks[key] = now;
} }).observe(document, {subtree: true, attributes: true,
                        attributeFilter: ["data-state", "data-engine"]});"""
BARE_FILES = {
    "index.html": '<!doctype html><html lang="en"><meta charset="utf-8"><title>bare boot</title>'
                  '<script type="module" src="boot.js"></script>bare loadPyodide()\n',
    "boot.js": """const worker = new Worker(new URL("boot-worker.js", import.meta.url),
                            {type: "module"});
const end = (result) => { window.__bareBoot = {...result, ready: performance.now()};
                          document.documentElement.dataset.boot = "1"; };
worker.onmessage = (event) => end(event.data);
worker.onerror = (event) => end({error: event.message || "worker error"});
worker.postMessage({indexURL: new URL("../PYODIDE_DIR/", location.href).href});\n""",
    "boot-worker.js": """self.onmessage = async ({data: {indexURL}}) => {
  try {
    const {loadPyodide} = await import(new URL("pyodide.mjs", indexURL).href);
    const t0 = performance.now(), pyodide = await loadPyodide({indexURL, fullStdLib: false});
    self.postMessage({loadMs: performance.now() - t0, answer: pyodide.runPython("6 * 7")});
  } catch (error) { self.postMessage({error: String((error && error.message) || error)}); }
};\n""",
}
ARM_RECOMPUTE = """() => {
  const root = document.querySelector("[data-calculator]");
  const out = root.querySelector('[data-output="secondary_a"]');
  const before = out.textContent;
  window.__fbRec = new Promise((resolve, reject) => {
    let t0 = null, computing = false;
    const onInput = () => { if (t0 === null) t0 = performance.now(); };  // before the page's
    const observer = new MutationObserver((records) => {
      const state = root.dataset.state, t1 = performance.now();
      computing ||= state === "computing" || records.some((r) => r.oldValue === "computing");
      if (computing && (state === "done" || state === "error")) {
        stop(); resolve({t0, t1, state, before, text: out.textContent});
      }
    });
    const timer = setTimeout(() => { stop(); reject(new Error("no result in 30 s")); }, 30000);
    const stop = () => { clearTimeout(timer); observer.disconnect();
                         window.removeEventListener("input", onInput, true); };
    window.addEventListener("input", onInput, true);
    observer.observe(root, {attributes: true, attributeFilter: ["data-state"],
                            attributeOldValue: true});
  });
}"""


def prepare_site(args, workdir):
    """A site folder we may write into (a fresh build or a copy), with the bare page added."""
    site = workdir / "site"
    if args.site:
        shutil.copytree(args.site, site)  # about 15 MB
    else:
        completed = build_site(site)
        if completed.returncode != 0:
            sys.exit("mkdocs build failed:\n" + completed.stderr[-3000:])
    pyodide = max((site / "assets" / "vendor").glob("pyodide-*")).relative_to(site).as_posix()
    (site / BENCH).mkdir()
    for name, text in BARE_FILES.items():
        (site / BENCH / name).write_text(text.replace("PYODIDE_DIR", pyodide), encoding="utf-8")
    return site, pyodide


@contextlib.contextmanager
def fresh_page(browser, marks=False):
    """A page in a new context (empty cache, no service worker), closed on exit."""
    context = browser.new_context(viewport={"width": 360, "height": 780})
    context.set_default_timeout(TIMEOUT_MS)
    if marks:
        context.add_init_script(script=MARKS_JS)
    try:
        yield context, context.new_page()
    finally:
        context.close()


def bare_boot(browser, base):
    with fresh_page(browser) as (_, page):
        page.goto(base + BENCH + "/")
        page.wait_for_selector("html[data-boot]", state="attached")
        result = page.evaluate("() => window.__bareBoot")
    if result.get("error") or result.get("answer") != 42:
        sys.exit(f"bare Pyodide boot failed: {result}")
    return result


def timed(page, action):
    """Run action (goto/reload), wait for the first result: (done ms, engine ms, clock, wall ms)."""
    started = time.perf_counter()
    response = action()
    page.wait_for_selector(DONE)
    wall = (time.perf_counter() - started) * 1000
    marks = page.evaluate("() => window.__fbBench || null") or {}
    if "state_done" in marks:
        return (marks["state_done"], marks.get("engine_ready"), "page", wall), response
    return (wall, None, "wall", wall), response


def wait_snapshot_saved(page):
    news = page.evaluate(WAIT_SNAPSHOT_JS)
    if not news or news["state"] != "saved":
        sys.exit(f"the engine snapshot was not saved: {news}")
    return news["detail"]


def warm_visit(page, start):
    """Reload offline with a snapshot start or a normal one; (timing, from the service worker)."""
    if start == "normal":
        page.evaluate(f"caches.delete({SNAPSHOT_CACHE!r})")
    timing, response = timed(page, page.reload)
    used = page.get_attribute("[data-calculator]", "data-engine-start")
    if used != start:
        sys.exit(f"a warm visit meant to start from {start!r} started from {used!r}")
    if start == "normal":
        wait_snapshot_saved(page)  # for the next snapshot visit; not timed
    return timing, bool(response and response.from_service_worker)


def cold_and_warm(browser, site, order):
    """(cold, {start: warm timing}, [answered by the service worker], snapshot news)."""
    with fresh_page(browser, marks=True) as (context, page):
        with serving(site) as (base, _):
            cold, _ = timed(page, lambda: page.goto(base + PAGE))
            page.wait_for_selector('html[data-offline="stored"]', state="attached")
            saved = wait_snapshot_saved(page)
        context.set_offline(True)  # and the server is gone: set_offline misses the SW's fetches
        warm, from_sw = {}, []
        for start in order:
            warm[start], answered = warm_visit(page, start)
            from_sw.append(answered)
    return cold, warm, from_sw, saved


@contextlib.contextmanager
def settled_page(browser, base):
    """A page of PAGE that has settled (see "settled" above)."""
    with fresh_page(browser) as (context, page):
        page.goto(base + PAGE)
        page.wait_for_selector(DONE)
        page.wait_for_selector('html[data-offline="stored"]', state="attached")
        wait_snapshot_saved(page)
        page.reload()
        page.wait_for_selector(DONE)
        time.sleep(SETTLE_S)
        yield page


def recompute(browser, base, changes):
    latencies = []
    with settled_page(browser, base) as page:
        for i in range(changes):
            page.evaluate(ARM_RECOMPUTE)
            page.fill('[name="kva"]', str(20 + 5 * i))
            rec = page.evaluate("() => window.__fbRec")
            if rec["state"] != "done" or rec["text"] == rec["before"] or rec["t0"] is None:
                sys.exit(f"change {i} did not show a new result: {rec}")
            latencies.append(rec["t1"] - rec["t0"])
    return latencies


def precache_bytes(site, pyodide):
    """Sizes of the URLs in sw.js's precache manifest: (count, {group: bytes}); "own_gzip" is
    the own files gzip-compressed (level 9), "largest" the five largest own files."""
    urls = re.findall(r'\burl:"([^"]+)"', (site / "sw.js").read_text(encoding="utf-8"))
    packed = set(read_list(site))
    groups = dict.fromkeys(("own", "own_plain", "own_gzip", "vendored", "pyodide", "theme"), 0)
    own = []
    for url in urls:
        size = (site / url).stat().st_size
        plain = url.removesuffix(".gz") if url.removesuffix(".gz") in packed else url
        if url.startswith(pyodide + "/"):
            groups["pyodide"] += size
        elif url.startswith(("assets/javascripts/", "assets/stylesheets/")):
            groups["theme"] += size
        else:
            groups["own"] += size
            groups["own_plain"] += (site / plain).stat().st_size
            groups["own_gzip"] += len(gzip.compress((site / plain).read_bytes(), 9, mtime=0))
            groups["vendored"] += size if url.startswith("assets/vendor/") else 0
            own.append((size, url))
    groups["largest"] = sorted(own, reverse=True)[:5]
    return len(urls), groups


ENGINE_TIMES_JS = ENGINE_STATE_JS.replace("return engine().state;", """const running = engine();
  await running.ready;
  const [ids, runs] = args;
  const times = {};
  for (const id of ids) {
    const first = await running.run(id, {}, "na");  // untimed: the first run imports lazily
    if (!first.ok) return {error: id + ": " + JSON.stringify(first.errors)};
    times[id] = [];
    for (let i = 0; i < runs; i++) {
      const t0 = performance.now();
      await running.run(id, {}, "na");
      times[id].push(performance.now() - t0);
    }
  }
  return times;""").replace("async () =>", "async (args) =>")


def engine_times(browser, base, runs):
    """{calculator id: [ms per run]}: the engine's round trip per recompute, every calculator."""
    from calc import api  # the registry: the same ids the worker allows
    with settled_page(browser, base) as page:
        times = page.evaluate(ENGINE_TIMES_JS, [list(api.REGISTRY), runs])
    if "error" in times:
        sys.exit(f"a calculator's defaults did not compute: {times['error']}")
    return times


def p95(values):
    return sorted(values)[max(0, math.ceil(0.95 * len(values)) - 1)]  # nearest rank


def line(label, values, bare=None):
    values = list(values)
    text = f"  {label:<33}median {statistics.median(values):6.0f} ms   runs: "
    text += ", ".join(f"{v:.0f}" for v in values)
    return text + (f"   = {statistics.median(values) / bare:.2f} x bare" if bare else "")


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    parser.add_argument("--site", help="a built site (default: build one into a temp folder)")
    parser.add_argument("--runs", type=int, default=3, help="bare/cold/warm repetitions (3)")
    parser.add_argument("--changes", type=int, default=30, help="input changes to time (30)")
    parser.add_argument("--engine-runs", type=int, default=20,
                        help="timed runs per calculator for the engine figures (20)")
    args = parser.parse_args(argv)
    if args.site and not (Path(args.site) / "sw.js").exists():
        parser.error(f"{args.site} is not a built site (no sw.js)")
    bare, cold, from_sw, saved = [], [], [], []
    warm = {"snapshot": [], "normal": []}
    with contextlib.ExitStack() as stack:
        workdir = Path(stack.enter_context(tempfile.TemporaryDirectory(prefix="fluxbook-bench-")))
        site, pyodide = prepare_site(args, workdir)
        count, groups = precache_bytes(site, pyodide)
        if not count:
            sys.exit("no precache manifest found in sw.js")
        found = re.search(r"DEBOUNCE_MS\s*=\s*(\d+)",
                          (site / "assets/js/fluxbook.js").read_text(encoding="utf-8"))
        debounce = int(found.group(1)) if found else 250
        playwright = stack.enter_context(sync_playwright())
        browser = playwright.chromium.launch(executable_path=CHROMIUM, args=CHROMIUM_ARGS)
        stack.callback(browser.close)
        with serving(site) as (base, _):
            bare_boot(browser, base)  # warm-up, not counted
        for run in range(args.runs):  # interleaved, so a slow spell of the machine hits all
            with serving(site) as (base, _):
                bare.append(bare_boot(browser, base))
            order = ("snapshot", "normal") if run % 2 == 0 else ("normal", "snapshot")
            cold_run, warm_run, answered, news = cold_and_warm(browser, site, order)
            cold.append(cold_run)
            for start, timing in warm_run.items():
                warm[start].append(timing)
            from_sw.extend(answered)
            saved.append(news)
        with serving(site) as (base, _):
            latencies = recompute(browser, base, args.changes)
            engine = engine_times(browser, base, args.engine_runs)
        version = browser.version

    load = ", ".join(f"{v:.1f}" for v in os.getloadavg())
    clocks = {r[2] for r in cold + warm["snapshot"] + warm["normal"]}
    median_bare = statistics.median(b["ready"] for b in bare)
    med, top = statistics.median(latencies), p95(latencies)
    total = groups["own"] + groups["pyodide"] + groups["theme"]
    print(f"Fluxbook benchmark: headless Chromium {version}, {os.cpu_count()} CPUs, "
          f"load average {load}, {args.runs} run(s)\n"
          f"Site: {args.site or 'fresh mkdocs build --strict'}; page {PAGE}")
    print("Clock: page performance.now() from navigation start (MutationObserver, init script)"
          if clocks == {"page"} else f"Clock: WALL CLOCK used for some visits: {sorted(clocks)}")
    print("\nBare loadPyodide() in a module worker (own page, same origin and CSP, no cache)")
    print(line("navigation -> Pyodide ready", (b["ready"] for b in bare)))
    print(line("loadPyodide() call alone", (b["loadMs"] for b in bare)))
    for title, rows in (
        ("Cold first visit (fresh context: empty cache, no service worker; full start)", cold),
        ("Warm offline visit, snapshot start (server stopped, offline, reload)", warm["snapshot"]),
        ("Warm offline visit, normal start (snapshot deleted first)", warm["normal"]),
    ):
        print("\n" + title)
        print(line("navigation -> first result", (r[0] for r in rows), median_bare))
        if clocks == {"page"}:
            print(line("navigation -> engine ready", (r[1] or 0 for r in rows), median_bare))
        print(line("wall clock (goto/reload + wait)", (r[3] for r in rows)))
    print(f"  navigation answered by the service worker: {sum(from_sw)}/{len(from_sw)} visits")
    snap = statistics.median(r[0] for r in warm["snapshot"])
    normal = statistics.median(r[0] for r in warm["normal"])
    ratio = snap / median_bare
    print(f"\nSnapshot start: first result {snap:.0f} ms = {ratio:.2f} x bare loadPyodide() "
          f"({median_bare:.0f} ms), {snap / normal:.2f} x the normal warm start ({normal:.0f} ms); "
          f"target <= {SNAPSHOT_TARGET:.2f} x bare: {'met' if ratio <= SNAPSHOT_TARGET else 'NOT MET'}")
    print(f"  snapshot saved after the cold visit's first result: {'; '.join(saved)}")
    print(f"\nRecompute per input change ({len(latencies)} kva values, settled page, page clock)\n"
          f"  {'input event -> new result':<33}median {med:6.0f} ms   p95 {top:4.0f} ms"
          f"   (min {min(latencies):.0f}, max {max(latencies):.0f})\n"
          f"  {'of which debounce (DEBOUNCE_MS)':<33}       {debounce:6d} ms\n"
          f"  {'minus the debounce':<33}median {med - debounce:6.0f} ms"
          f"   p95 {top - debounce:4.0f} ms")
    print(f"\nEngine time per recompute, every calculator ({args.engine_runs} runs each, defaults, "
          f"\"na\" display; worker round trip, page clock, settled page), slowest first")
    slowest = sorted(engine.items(), key=lambda item: -p95(item[1]))
    for calculator_id, times in slowest:
        flag = "" if p95(times) <= ENGINE_P95_TARGET_MS else "   OVER"
        print(f"  {calculator_id:<33}median {statistics.median(times):6.1f} ms   "
              f"p95 {p95(times):6.1f} ms   max {max(times):6.1f} ms{flag}")
    over = [c for c, t in engine.items() if p95(t) > ENGINE_P95_TARGET_MS]
    print(f"  target p95 <= {ENGINE_P95_TARGET_MS} ms on every calculator: "
          + ("met" if not over else f"NOT MET ({len(over)}: {', '.join(over)})"))
    print(f"\nPrecached bytes ({count} URLs in sw.js's manifest; sent uncompressed by serve.py)")
    for label, size in (
        ("total", total),
        ("own, as precached: downloaded and kept (text files as .gz twins)", groups["own"]),
        ("  of which vendored libraries (uPlot, workbox-window)", groups["vendored"]),
        ("  own, plain (unpacked: a first page load, before the worker)", groups["own_plain"]),
        ("  own, plain gzip-compressed (as a compressing host sends them)", groups["own_gzip"]),
        (f"Pyodide ({pyodide}/)", groups["pyodide"]),
        ("theme (mkdocs-material: assets/javascripts, assets/stylesheets)", groups["theme"]),
    ):
        print(f"  {label:<66}{size / 1e6:6.2f} MB {size:>12,} B")
    print("  largest own files: " + ", ".join(f"{url} {size / 1e3:.0f} kB"
                                             for size, url in groups["largest"]))
    for label, size in (("as precached (downloaded and kept)", groups["own"]),
                        ("plain", groups["own_plain"]), ("plain, gzip-compressed", groups["own_gzip"])):
        verdict = "met" if size <= OWN_BYTES_TARGET else "NOT MET"
        print(f"  target own <= {OWN_BYTES_TARGET / 1e6:.0f} MB, {label}: {size / 1e6:.2f} MB, {verdict}")

if __name__ == "__main__":
    main()
