"""Job records in Chromium (issue 13): save, offline jobs page, reopen, job sheet, export,
delete, import; the single-calculation print; the store's upgrade from its previous schema.

The site is built with a team file that names the organisation, so the printed sheet must carry
it. Expected figures come from calc.api.run with the same inputs (CPython), never typed in.
"""

import io
import json
import re
import shutil
import zipfile
from urllib.parse import parse_qs, urlsplit

import pytest
from playwright.sync_api import expect

from build import package_calc, paths
from calc import __version__, api, jobs
from tests.browser import pdf_text
from tests.browser.conftest import wait_done
from tests.conftest import build_site, serving

ORGANISATION = "Hillside Dairy Electrical"
JOB = "Dairy barn milk room"
SITE = "Hillside dairy, parlour end"
# The bulk-tank compressor feeder and the barn's transformer (invented).
FEEDER = {"system": "3ph", "voltage": "480 V", "current": "42", "length": "210 ft", "size": "6 AWG"}
TRANSFORMER = {"kva": "112.5 kVA", "primary_v": "480 V", "secondary_v": "208 V"}


@pytest.fixture(scope="module")
def org_site(tmp_path_factory):
    folder = tmp_path_factory.mktemp("jobs-site")
    team = folder / "team.yml"
    team.write_text(f'organisation: "{ORGANISATION}"\nregion: na\n', encoding="utf-8")
    completed = build_site(folder / "site", team_file=team)
    assert completed.returncode == 0, completed.stderr[-3000:]
    return folder / "site"


@pytest.fixture
def no_print_dialog(context):
    # window.print() in headless Chromium leaves a print job open that blocks page.pdf(); the
    # print action must still run up to it, so only the dialog is replaced.
    context.add_init_script("window.print = () => { window.__printed = (window.__printed || 0) + 1; };")
    return context


def link(calculator, inputs):
    return f"calculators/{calculator}/?" + "&".join(f"{k}={v.replace(' ', '%20')}" for k, v in inputs.items())


def squash(text):
    return "".join(text.split())


def save(page, note, job_name=None, site=None):
    root = page.locator('[data-calculator][data-index="0"]')
    page.click('[data-action="save"]')
    expect(page.locator(".fb-save")).to_be_visible()
    if job_name is not None:
        page.fill('[name="job_name"]', job_name)
    if site is not None:
        page.fill('[name="site"]', site)
    page.fill('[name="note"]', note)
    page.click('[data-action="save-confirm"]')
    expect(root).to_have_attribute("data-saved", re.compile(r"\d+"))
    return page.text_content(".fb-save__msg")


def jobs_ready(page):
    page.wait_for_selector('[data-jobs-page][data-state="ready"][data-recheck="done"]')


def stored_records(page):
    """Every record in the store, as the page's own module reads it."""
    return page.evaluate("""async () => {
        const script = document.querySelector('script[type=module][src*="fluxbook.js"]').src;
        const store = await import(new URL('jobs-store.js', script).href);
        return (await store.listJobs()).map((job) => ({ name: job.name, site: job.site,
            records: job.records.map(({ id, job: _, position, ...record }) => record) }));
    }""")


def test_jobs_round_trip_offline(browser, org_site, tmp_path):
    context = browser.new_context(viewport={"width": 360, "height": 780}, accept_downloads=True)
    context.set_default_timeout(60000)
    context.add_init_script("window.print = () => {};")
    try:
        # 1. Two calculators, two records, one job.
        with serving(org_site) as (base, _):
            page = context.new_page()
            page.goto(base + link("voltage-drop", FEEDER))
            wait_done(page)
            page.wait_for_selector('html[data-offline="stored"]')
            said = save(page, "Bulk tank compressor feeder", JOB, SITE)
            assert f"Saved to “{JOB}” (1 calculation) on this device." in said
            page.goto(base + link("transformer-currents", TRANSFORMER))
            wait_done(page)
            said = save(page, "Barn transformer", JOB)
            assert "(2 calculations)" in said
        # 2. The server is gone: the jobs page, the engine and the records all come from the device.
        context.set_offline(True)
        response = page.goto(base + "jobs/")
        assert response.from_service_worker
        jobs_ready(page)
        assert page.locator("[data-job]").count() == 1
        job = page.locator("[data-job]")
        assert JOB in job.text_content() and SITE in job.text_content()
        records = job.locator("[data-record]")
        assert records.count() == 2
        feeder_result = api.run("voltage-drop", FEEDER)
        transformer_result = api.run("transformer-currents", TRANSFORMER)
        for index, result in enumerate((feeder_result, transformer_result)):
            item = records.nth(index)
            assert item.get_attribute("data-calculator") == result["calculator"]
            assert item.get_attribute("data-recheck") == "same"
            first = next(iter(result["outputs"].values()))["display"]
            assert first in item.locator(".fb-rec__key").text_content()
        # The whole record, as saved: labelled inputs, results, checks, method.
        records.nth(0).locator('[data-action="details"]').click()
        body = records.nth(0).locator(".fb-rec__body")
        expect(body).to_be_visible()
        label = api.get("voltage-drop").input("length").label
        expect(body.locator(".fb-inputs-table")).to_contain_text(label)
        assert body.locator("[data-check]").count() == len(feeder_result["checks"])
        assert body.locator(".fb-sheet-steps li").count() == len(feeder_result["steps"])

        # 3. Reopen: the calculator gets the saved inputs back and computes them again.
        records.nth(0).locator('[data-action="reopen"]').click()
        page.wait_for_url("**/calculators/voltage-drop/**")
        wait_done(page)
        for name, value in FEEDER.items():
            assert page.input_value(f'.fb-form [name="{name}"]') == value
        for name, output in feeder_result["outputs"].items():
            assert page.text_content(f'[data-output="{name}"]') == output["display"]

        # 4. The job sheet: organisation, job, both records' key results, one record a page.
        page.goto(base + "jobs/")
        jobs_ready(page)
        job_id = page.get_attribute("[data-job]", "data-job")
        page.click('[data-action="sheet"]')
        page.wait_for_selector('[data-jobs-page][data-sheet="ready"]')
        assert f"sheet={job_id}" in page.url
        for paper in ("A4", "Letter"):
            pages = pdf_text.pages(page.pdf(format=paper))
            text = squash(" ".join(pages))
            assert squash(ORGANISATION) in squash(pages[0]) and squash(JOB) in text
            for result in (feeder_result, transformer_result):
                for output in result["outputs"].values():
                    assert squash(output["display"]) in text, (paper, output)
            # page breaks between records: the second record starts a page of its own
            starts = [i for i, t in enumerate(pages) if squash("2. Transformer currents") in squash(t)]
            assert starts and squash(pages[starts[0]]).startswith(squash("2. Transformer currents"))
            assert "Sign-off" in pages[-1] or squash("Sign-off") in squash(pages[-1])
            assert len(pages) <= 4, (paper, len(pages))

        # 5. Export, then delete (with undo), then import the export: identical records.
        page.goto(base + "jobs/")
        jobs_ready(page)
        before = stored_records(page)
        with page.expect_download() as download:
            page.click('[data-action="export"]')
        exported = tmp_path / download.value.suggested_filename
        download.value.save_as(exported)
        data = json.loads(exported.read_text(encoding="utf-8"))
        assert (data["format"], data["schema"]) == (jobs.FORMAT, jobs.SCHEMA_VERSION)
        for saved_record, typed in zip(data["job"]["records"], (FEEDER, TRANSFORMER)):
            assert {name: saved_record["inputs"][name] for name in typed} == typed  # as typed
        assert jobs.check_job(data)["problems"] == []
        with page.expect_download() as download:
            page.click('[data-action="export-csv"]')
        csv_text = open(download.value.path(), encoding="utf-8").read()
        assert feeder_result["outputs"]["drop_v"]["display"] in csv_text

        page.click('[data-action="delete"]')
        expect(page.locator("[data-job]")).to_have_count(0)
        page.click('[data-action="undo"]')
        expect(page.locator("[data-job]")).to_have_count(1)
        assert stored_records(page) == before
        page.click('[data-action="delete"]')
        expect(page.locator("[data-job]")).to_have_count(0)
        page.set_input_files('input[type="file"][name="import"]', str(exported))
        page.wait_for_selector('[data-import-message][data-status="done"]')
        expect(page.locator("[data-job] [data-record]")).to_have_count(2)
        assert stored_records(page) == before

        # 6. A corrupted file: a clear message naming the fault; the stored job untouched.
        broken = tmp_path / "broken.json"
        broken.write_text(exported.read_text(encoding="utf-8")[:400], encoding="utf-8")
        page.set_input_files('input[type="file"][name="import"]', str(broken))
        page.wait_for_selector('[data-import-message][data-status="error"]')
        message = page.text_content("[data-import-message]")
        assert "“broken.json” was not imported" in message and "not valid JSON" in message
        assert "nothing on this device was changed" in message
        assert stored_records(page) == before
        # A file of a newer schema and one naming an unknown calculator: refused, named.
        for change, words in ((lambda d: d.update(schema=jobs.SCHEMA_VERSION + 1), "newer Fluxbook"),
                              (lambda d: d["job"]["records"][0].update(calculator="flux-capacitor"),
                               "unknown calculator 'flux-capacitor'")):
            wrong = json.loads(exported.read_text(encoding="utf-8"))
            change(wrong)
            path = tmp_path / "wrong.json"
            path.write_text(json.dumps(wrong), encoding="utf-8")
            page.set_input_files('input[type="file"][name="import"]', str(path))
            expect(page.locator('[data-import-message][data-status="error"]')).to_contain_text(words)
            assert stored_records(page) == before

        # 7. The same job again: merge adds nothing twice; keep both makes a second job.
        page.set_input_files('input[type="file"][name="import"]', str(exported))
        page.click('[data-action="import-merge"]')
        page.wait_for_selector('[data-import-message][data-status="done"]')
        assert "0 calculations added, 2 already in the job" in page.text_content("[data-import-message]")
        assert stored_records(page) == before
        page.set_input_files('input[type="file"][name="import"]', str(exported))
        page.click('[data-action="import-both"]')
        page.wait_for_selector('[data-import-message][data-status="done"]')
        expect(page.locator("[data-job]")).to_have_count(2)
        names = sorted(job["name"] for job in stored_records(page))
        assert names == [JOB, f"{JOB} (imported)"]
    finally:
        context.close()


def test_imported_text_is_data_not_markup(context, org_site, tmp_path):
    hostile = '<img src=x onerror="window.__owned=1">'
    data = {"format": jobs.FORMAT, "schema": jobs.SCHEMA_VERSION, "fluxbook_version": __version__,
            "job": {"name": hostile, "site": hostile, "records": [{
                "calculator": "transformer-currents", "inputs": TRANSFORMER, "note": hostile,
                "result": jobs.without_chart(api.run("transformer-currents", TRANSFORMER))}]}}
    data["job"]["records"][0]["result"]["checks"][0]["message"] = hostile
    path = tmp_path / "hostile.json"
    path.write_text(json.dumps(data), encoding="utf-8")
    with serving(org_site) as (base, _):
        page = context.new_page()
        page.goto(base + "jobs/")
        page.wait_for_selector('[data-jobs-page][data-state="ready"]')
        page.set_input_files('input[type="file"][name="import"]', str(path))
        page.wait_for_selector('[data-import-message][data-status="done"]')
        jobs_ready(page)
        page.click('[data-action="details"]')
        page.click('[data-action="sheet"]')
        page.wait_for_selector('[data-jobs-page][data-sheet="ready"]')
        assert page.evaluate("window.__owned") is None
        assert page.locator("article img").count() == 0
        assert hostile in page.text_content("[data-job-sheet]")


def test_single_calculation_prints_on_two_pages_at_most(no_print_dialog, org_site):
    """Issue 13: voltage-drop printed on 8 Letter pages and transformer-fault-current on 9,
    with the inputs as empty-looking boxes. Now: an inputs table, the verdict, the results, and
    at most two pages with the chart; the link that reopens it; and its job when it has one."""
    with serving(org_site) as (base, _):
        page = no_print_dialog.new_page()
        for calculator in ("voltage-drop", "transformer-fault-current"):
            page.goto(base + f"calculators/{calculator}/")
            wait_done(page)
            result = api.run(calculator, {})
            for paper in ("Letter", "A4"):
                page.click('[data-action="print"]')
                assert page.get_attribute("html", "data-fb-print") == "calculation"
                pdf = page.pdf(format=paper)
                count = pdf_text.page_count(pdf)
                assert count <= (2 if "series" in result else 1), (calculator, paper, count)
                text = squash(" ".join(pdf_text.pages(pdf)))
                assert squash("Inputs") in text and squash("Reopen this calculation") in text
                for item in api.get(calculator).inputs[:3]:
                    assert squash(item.label) in text, item.label
                for output in result["outputs"].values():
                    assert squash(output["display"]) in text
                assert squash("Field notes") not in text  # the page's prose stays off the sheet
        # A calculation saved to a job prints with the job's name and site.
        page.goto(base + link("transformer-currents", TRANSFORMER))
        wait_done(page)
        save(page, "Barn transformer", JOB, SITE)
        page.click('[data-action="print"]')
        text = squash(" ".join(pdf_text.pages(page.pdf(format="A4"))))
        assert squash(f"Job: {JOB} · Site: {SITE}") in text


def test_jobs_page_and_save_form_at_phone_width(context, org_site):
    with serving(org_site) as (base, _):
        page = context.new_page()
        page.goto(base + link("transformer-currents", TRANSFORMER))
        wait_done(page)
        page.click('[data-action="save"]')
        page.click('[data-action="save-confirm"]')  # no job name yet
        expect(page.locator(".fb-save__msg")).to_contain_text("Give the job a name")
        assert page.get_attribute('[name="job_name"]', "aria-invalid") == "true"
        targets = page.locator('.fb-save button, .fb-save input, .fb-save textarea, [data-action="save"]')
        for index in range(targets.count()):
            assert targets.nth(index).bounding_box()["height"] >= 44
        save(page, "Pump house transformer", "Pump house", "North field")
        page.goto(base + "jobs/")
        jobs_ready(page)
        assert page.evaluate("document.documentElement.scrollWidth") <= 360
        actions = page.locator("[data-jobs-page] .fb-button, [data-jobs-page] input[type=file]")
        for index in range(actions.count()):
            box = actions.nth(index).bounding_box()
            if box:
                assert box["height"] >= 44 and box["x"] >= 0 and box["x"] + box["width"] <= 360
        status = page.locator("[data-storage-status]")
        assert status.get_attribute("data-persisted") in ("granted", "refused", "unknown")
        assert "keep saved jobs" in status.text_content()


# --- the store's upgrade ----------------------------------------------------------------------

def calc_zip_with_migration(tmp_path, entry):
    """calc.zip as the build makes it, with one entry added to calc.jobs.MIGRATIONS: the input
    it names was renamed in this (pretend) newer release."""
    copy = tmp_path / "calc"
    shutil.copytree(paths.CALC_DIR, copy, ignore=shutil.ignore_patterns("__pycache__"))
    source = (copy / "jobs.py").read_text(encoding="utf-8")
    assert "\nMIGRATIONS = {}\n" in source
    (copy / "jobs.py").write_text(source.replace("\nMIGRATIONS = {}\n", f"\nMIGRATIONS = {entry!r}\n"),
                                  encoding="utf-8")
    data = package_calc.calc_zip_bytes(copy)
    with zipfile.ZipFile(io.BytesIO(data)) as archive:
        assert repr(entry) in archive.read("calc/jobs.py").decode("utf-8")
    return data


def test_store_upgrade_from_schema_1_keeps_every_record(browser, org_site, tmp_path):
    """Records stored under the store's schema 1 (records inside their job), one of them under
    an input name a migration has since renamed, read after the upgrade with nothing lost."""
    old_name = "run_length"
    zip_bytes = calc_zip_with_migration(tmp_path, {("voltage-drop", old_name): "length"})
    feeder = {(old_name if k == "length" else k): v for k, v in FEEDER.items()}
    saved = [
        {"calculator": "voltage-drop", "title": "Voltage drop", "inputs": feeder,
         "note": "Bulk tank compressor feeder", "saved": "2026-06-01T07:30:00.000Z",
         "fluxbook_version": "0.0.9", "result": jobs.without_chart(api.run("voltage-drop", FEEDER))},
        {"calculator": "transformer-currents", "title": "Transformer currents", "inputs": TRANSFORMER,
         "note": "Barn transformer", "saved": "2026-06-01T07:41:00.000Z",
         "fluxbook_version": "0.0.9",
         "result": jobs.without_chart(api.run("transformer-currents", TRANSFORMER))},
    ]
    old_job = {"name": JOB, "site": SITE, "notes": "Stored by an older Fluxbook",
               "created": "2026-06-01T07:00:00.000Z", "updated": "2026-06-01T07:41:00.000Z",
               "records": saved}
    # No service worker: every file comes from the server, and calc.zip from the route.
    context = browser.new_context(viewport={"width": 360, "height": 780}, service_workers="block")
    context.set_default_timeout(60000)
    context.route("**/assets/engine/calc.zip",
                  lambda route: route.fulfill(body=zip_bytes, content_type="application/zip"))
    try:
        with serving(org_site) as (base, _):
            page = context.new_page()
            page.goto(base)  # a page that does not open the store
            page.evaluate("""(job) => new Promise((resolve, reject) => {
                const open = indexedDB.open("fluxbook", 1);
                open.onupgradeneeded = () => open.result.createObjectStore("jobs", { keyPath: "id", autoIncrement: true });
                open.onsuccess = () => {
                    const tx = open.result.transaction("jobs", "readwrite");
                    tx.objectStore("jobs").add(job);
                    tx.oncomplete = () => { open.result.close(); resolve(); };
                    tx.onerror = () => reject(tx.error);
                };
                open.onerror = () => reject(open.error);
            })""", old_job)
            page.goto(base + "jobs/")
            jobs_ready(page)
            records = page.locator("[data-job] [data-record]")
            assert records.count() == 2
            assert page.evaluate("""() => new Promise((resolve) => {
                const open = indexedDB.open("fluxbook");
                open.onsuccess = () => { resolve(open.result.version); open.result.close(); };
            })""") == 2
            stored = stored_records(page)[0]
            assert (stored["name"], stored["site"]) == (JOB, SITE)
            # The renamed input now carries its new name, its value untouched; all else as saved.
            assert stored["records"][0]["inputs"] == FEEDER
            for kept, original in zip(stored["records"], saved):
                assert {k: v for k, v in kept.items() if k != "inputs"} == \
                    {k: v for k, v in original.items() if k != "inputs"}
            assert [records.nth(i).get_attribute("data-recheck") for i in range(2)] == ["same", "same"]
            reopen = records.nth(0).locator('[data-action="reopen"]').get_attribute("href")
            query = parse_qs(urlsplit(reopen).query)
            assert query["length"] == [FEEDER["length"]] and old_name not in query
            page.goto(reopen)
            wait_done(page)
            assert page.input_value('.fb-form [name="length"]') == FEEDER["length"]
            expected = api.run("voltage-drop", FEEDER)["outputs"]["drop_v"]["display"]
            assert page.text_content('[data-output="drop_v"]') == expected
    finally:
        context.close()
