"""The schedule page in Chromium (issue 14): a schedule with good rows, bad rows and an empty line
gives the same verdicts as the command line; bad rows name their row, column and value; the
progress bar, sort, filter, one row in full, CSV export, print and save to a job; 360 px wide
with no sideways scroll; and offline once visited. Expected verdicts come from calc.batch on
CPython, never typed in."""

import csv
import io

import pytest
from playwright.sync_api import expect

from calc import batch
from tests.conftest import serving
from tests.test_batch import MIXED_SCHEDULE, TEMPLATE

PAGE = "schedule/"


@pytest.fixture(scope="module")
def site(built_site):
    with serving(built_site) as (base, _):
        yield base


@pytest.fixture
def no_print_dialog(context):
    context.add_init_script(
        "window.print = () => { window.__printed = (window.__printed || 0) + 1; };")
    return context


def cli_records(text, region=None):
    return list(batch.run_rows("circuit-check", batch.read_rows(io.StringIO(text)), region,
                               processes=1))


def check_schedule(page, text, region=None):
    page.wait_for_selector('[data-schedule][data-engine="ready"]')
    page.fill('textarea[name="schedule_text"]', text)
    if region:
        page.select_option('select[name="region"]', region)
    page.click('[data-action="check"]')
    page.wait_for_selector('[data-schedule][data-state="done"]')


def table(page):
    return [(int(tr.get_attribute("data-row")), tr.get_attribute("data-verdict"),
             tr.get_attribute("data-governing")) for tr in page.query_selector_all("tr[data-row]")]


def test_same_verdicts_as_the_command_line(context, site):
    page = context.new_page()
    page.goto(site + PAGE)
    check_schedule(page, MIXED_SCHEDULE)
    expected = [(r["row"], r["verdict"] if r["ok"] else "rejected", r["governing"] or "")
                for r in cli_records(MIXED_SCHEDULE)]
    assert table(page) == expected
    rejected = page.text_content('tr[data-row="5"]')
    assert "current = twelve" in rejected and "enter" in rejected  # row, column, value, allowed
    assert "header names 10 columns" in page.text_content('tr[data-row="7"]')
    summary = page.locator("[data-summary]")
    expect(summary).to_contain_text("3 rejected (row 5, 6, 7)")
    progress = page.locator("[data-progress]")
    assert progress.get_attribute("value") == progress.get_attribute("max")


def test_iec_defaults_and_the_template(context, site):
    page = context.new_page()
    page.goto(site + PAGE)
    text = TEMPLATE.read_text(encoding="utf-8")
    check_schedule(page, text)
    assert table(page) == [(r["row"], r["verdict"], r["governing"]) for r in cli_records(text)]
    iec = "circuit,size,current,length\nP-1,2.5 mm2,13 A,25 m\nP-2,1.5 mm2,13 A,40 m\n"
    check_schedule(page, iec, region="iec")
    assert table(page) == [(r["row"], r["verdict"], r["governing"]) for r in cli_records(iec, "iec")]


def test_a_header_that_is_no_input_is_named(context, site):
    page = context.new_page()
    page.goto(site + PAGE)
    check_schedule_error = "circuit,volts\nA,120\n"
    page.wait_for_selector('[data-schedule][data-engine="ready"]')
    page.fill('textarea[name="schedule_text"]', check_schedule_error)
    page.click('[data-action="check"]')
    page.wait_for_selector('[data-schedule][data-state="error"]')
    expect(page.locator("[data-message]")).to_contain_text("'volts' is not an input of circuit-check")


def test_sort_filter_and_one_row_in_full(context, site):
    page = context.new_page()
    page.goto(site + PAGE)
    check_schedule(page, MIXED_SCHEDULE)
    page.click('[data-sort="verdict"]')
    verdicts = [v for _, v, _ in table(page)]
    assert verdicts[:3] == ["rejected"] * 3 and verdicts[-1] == "pass"
    assert page.get_attribute('th:has([data-sort="verdict"])', "aria-sort") == "ascending"
    page.click('[data-filter="fail"]')
    shown = page.query_selector_all("tr[data-row]:not([hidden])")
    assert [tr.get_attribute("data-verdict") for tr in shown] == ["fail"]
    page.click('[data-filter="all"]')
    page.click('tr[data-row="3"] [data-action="open"]')
    detail = page.locator("[data-detail]")
    expect(detail.locator('[data-check="fault_clearing"]')).to_be_visible()
    expect(detail).to_contain_text("Row 3: L-2 Dish receptacles")
    governing = page.get_attribute('tr[data-row="3"]', "data-governing")
    expect(detail.locator(".fb-verdict")).to_contain_text(governing)
    href = detail.locator("a", has_text="Open in the calculator").get_attribute("href")
    assert "calculators/circuit-check/" in href and "size=14+AWG" in href


def test_export_print_and_save_to_a_job(no_print_dialog, site):
    page = no_print_dialog.new_page()
    page.goto(site + PAGE)
    check_schedule(page, MIXED_SCHEDULE)
    with page.expect_download() as download:
        page.click('[data-action="export-csv"]')
    rows = list(csv.reader(io.StringIO(download.value.path().read_text(encoding="utf-8"))))
    assert rows[0] == batch.csv_header("circuit-check")
    assert [row[0] for row in rows[1:]] == ["2", "3", "5", "6", "7", "8"]
    page.click('[data-action="print"]')
    assert page.evaluate("window.__printed") == 1
    assert page.evaluate("document.documentElement.dataset.fbPrint") == "schedule"
    page.click('[data-action="save-job"]')
    page.fill('[data-save-form] [name="job_name"]', "School kitchen panel KP")
    page.click('[data-action="save-confirm"]')
    page.wait_for_selector('[data-schedule][data-saved="3"]')  # the three rows that computed
    saved = page.evaluate("""async () => {
        const script = document.querySelector('script[type=module][src*="schedule.js"]').src;
        const store = await import(new URL('jobs-store.js', script).href);
        const [job] = await store.listJobs();
        return {name: job.name, notes: job.records.map((r) => r.note),
                calculators: [...new Set(job.records.map((r) => r.calculator))],
                checks: job.records[0].result.checks.length};
    }""")
    assert saved["name"] == "School kitchen panel KP" and saved["calculators"] == ["circuit-check"]
    assert saved["notes"][0] == "L-1 Hall lights (schedule row 2)" and saved["checks"] >= 6


def test_phone_width_and_big_targets(context, site):
    page = context.new_page()
    page.goto(site + PAGE)
    check_schedule(page, MIXED_SCHEDULE)
    assert page.evaluate("document.documentElement.scrollWidth") <= 360
    for selector in ('[data-action="check"]', '[data-filter="fail"]', '[data-sort="row"]',
                     'tr[data-row="2"] [data-action="open"]', '[data-action="export-csv"]'):
        box = page.locator(selector).first.bounding_box()
        assert box["height"] >= 44 and box["width"] >= 44, selector


def test_works_offline_after_one_visit(browser, built_site):
    context = browser.new_context(viewport={"width": 360, "height": 780})
    context.set_default_timeout(60000)
    try:
        with serving(built_site) as (base, _):
            page = context.new_page()
            page.goto(base + PAGE)
            page.wait_for_selector('html[data-offline="stored"]')
            page.wait_for_selector('[data-schedule][data-engine="ready"]')
            context.set_offline(True)
            page.reload()
            check_schedule(page, MIXED_SCHEDULE)
            assert len(table(page)) == 6
    finally:
        context.close()
