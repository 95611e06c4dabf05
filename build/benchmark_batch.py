"""How long a schedule of circuits takes: the command line and the browser page (issue 14).

    .venv/bin/python build/benchmark_batch.py [--rows N] [--page-rows N] [--runs N] [--site DIR]
                                              [--skip-browser]

  cli      `python -m calc batch FILE.csv` on --rows circuits (default 10,000; target: under 5 s
           on a 2-core machine), wall clock from process start to exit, on the machine's cores
           and on one (CALC_BATCH_PROCESSES is not read: --processes 1 runs run_rows in-process
           here for the comparison), with the CPU time of the process and its workers.
  page     schedule/ in headless Chromium: --page-rows circuits (default 1,000; target: under
           3 s once the engine is ready) pasted and checked, from the click to data-state="done"
           (the page's own data-check-ms, and Python's clock), and the longest main-thread task
           meanwhile (a PerformanceObserver on "longtask"; the page stays responsive when it is
           short).
The rows are invented: the school kitchen template (site_src/schedules/) repeated with lengths
and loads varied by a seeded generator, so most rows differ. The load average is printed:
compare runs on the same idle machine.
"""

import argparse
import csv
import os
import random
import resource
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
if str(ROOT) not in sys.path:
    sys.path.insert(0, str(ROOT))

TEMPLATE = ROOT / "site_src" / "schedules" / "school-kitchen-panel.csv"
CLI_TARGET_S = 5.0
PAGE_TARGET_S = 3.0
SEED = 14


def schedule_text(count, seed=SEED):
    """`count` invented circuits: the template's rows with varied lengths and loads."""
    rng = random.Random(seed)
    with TEMPLATE.open(encoding="utf-8", newline="") as handle:
        header, *body = list(csv.reader(handle))
    length, current = header.index("length"), header.index("current")
    out = [",".join(header)]
    for n in range(count):
        row = list(body[n % len(body)])
        row[0] = f"C-{n + 1:05d} {row[0].split(' ', 1)[1]}"
        row[length] = f"{rng.randint(10, 200)} ft"
        if row[current]:
            row[current] = f"{rng.uniform(3, 24):.1f} A"
        out.append(",".join(f'"{cell}"' if "," in cell else cell for cell in row))
    return "\n".join(out) + "\n"


def bench_cli(rows, runs):
    with tempfile.TemporaryDirectory() as folder:
        path = Path(folder) / "schedule.csv"
        path.write_text(schedule_text(rows), encoding="utf-8")
        walls, cpus = [], []
        for _ in range(runs):
            before = resource.getrusage(resource.RUSAGE_CHILDREN)
            began = time.perf_counter()
            completed = subprocess.run([sys.executable, "-m", "calc", "batch", str(path)],
                                       cwd=ROOT, capture_output=True, text=True, check=False)
            walls.append(time.perf_counter() - began)
            after = resource.getrusage(resource.RUSAGE_CHILDREN)
            cpus.append(after.ru_utime - before.ru_utime + after.ru_stime - before.ru_stime)
            lines = completed.stdout.count("\n")
            if lines != rows:
                raise SystemExit(f"the command printed {lines} lines for {rows} rows: "
                                 f"{completed.stderr[-500:]}")
        from calc import batch  # the same rows on one process, here, for the comparison

        began = time.perf_counter()
        with path.open(encoding="utf-8") as handle:
            count = sum(1 for _ in batch.run_rows("circuit-check", batch.read_rows(handle),
                                                  processes=1))
        single = time.perf_counter() - began
    median = statistics.median(walls)
    verdict = "met" if median < CLI_TARGET_S else "NOT met"
    print(f"cli   {rows} rows on {os.cpu_count()} cores: median {median:.2f} s "
          f"(runs {', '.join(f'{w:.2f}' for w in walls)}), CPU {statistics.median(cpus):.2f} s, "
          f"{1e3 * median / rows:.3f} ms a row; one process in-process {single:.2f} s for "
          f"{count} rows; target < {CLI_TARGET_S:g} s: {verdict}")


LONGTASKS_JS = """window.__fbLongest = 0; new PerformanceObserver((list) => {
  for (const entry of list.getEntries()) {
    window.__fbLongest = Math.max(window.__fbLongest, entry.duration);
  }
}).observe({type: "longtask", buffered: false});"""


def bench_page(rows, runs, site_dir):
    from playwright.sync_api import sync_playwright

    from tests.browser.conftest import CHROMIUM, CHROMIUM_ARGS
    from tests.conftest import build_site, serving

    with tempfile.TemporaryDirectory() as folder:
        if site_dir is None:
            site_dir = Path(folder) / "site"
            completed = build_site(site_dir)
            if completed.returncode != 0:
                raise SystemExit(completed.stderr[-2000:])
        text = schedule_text(rows)
        with serving(Path(site_dir)) as (base, _), sync_playwright() as playwright:
            browser = playwright.chromium.launch(executable_path=CHROMIUM, args=CHROMIUM_ARGS)
            context = browser.new_context(viewport={"width": 360, "height": 780})
            context.set_default_timeout(180000)
            page = context.new_page()
            page.goto(base + "schedule/")
            page.wait_for_selector('[data-schedule][data-engine="ready"]')
            page.fill('textarea[name="schedule_text"]', text)
            timings = []
            for _ in range(runs + 1):  # the first run warms the worker's imports; not counted
                page.evaluate(LONGTASKS_JS)
                began = time.perf_counter()
                page.click('[data-action="check"]')
                page.wait_for_selector('[data-schedule][data-state="checking"]', timeout=10000)
                page.wait_for_selector('[data-schedule][data-state="done"]')
                wall = time.perf_counter() - began
                own = int(page.get_attribute("[data-schedule]", "data-check-ms")) / 1e3
                longest = page.evaluate("window.__fbLongest")
                shown = page.locator("tr[data-row]").count()
                timings.append((own, wall, longest, shown))
            browser.close()
    counted = timings[1:]
    own = statistics.median(t[0] for t in counted)
    print(f"page  {rows} rows: median {own:.2f} s from the click (page clock; Python's "
          f"{statistics.median(t[1] for t in counted):.2f} s), runs "
          f"{', '.join(f'{t[0]:.2f}' for t in counted)}; longest main-thread task "
          f"{max(t[2] for t in counted):.0f} ms; {counted[-1][3]} rows shown; first run "
          f"{timings[0][0]:.2f} s; target < {PAGE_TARGET_S:g} s: "
          f"{'met' if own < PAGE_TARGET_S else 'NOT met'}")


def main(argv=None):
    parser = argparse.ArgumentParser(description=__doc__.split("\n\n")[0])
    parser.add_argument("--rows", type=int, default=10000)
    parser.add_argument("--page-rows", type=int, default=1000)
    parser.add_argument("--runs", type=int, default=3)
    parser.add_argument("--site", type=Path, default=None, help="a built site to serve")
    parser.add_argument("--skip-browser", action="store_true")
    args = parser.parse_args(argv)
    load = ", ".join(f"{x:.2f}" for x in os.getloadavg())
    print(f"load average {load} on {os.cpu_count()} cores")
    bench_cli(args.rows, args.runs)
    if not args.skip_browser:
        bench_page(args.page_rows, args.runs, args.site)


if __name__ == "__main__":
    main()
