"""The built site in Chromium: typing, results, share links, offline, origin, updates, hosting.

The site runs under the Content-Security-Policy its build writes, so waits use Playwright's
locator assertions (a string predicate would need 'unsafe-eval').
"""

import re
from urllib.parse import urlsplit

import pytest
from playwright.sync_api import expect

from tests.browser.conftest import output, wait_done
from tests.conftest import build_site, serving

PAGE = "calculators/transformer-currents/"


@pytest.fixture(scope="module")
def site(built_site):
    with serving(built_site) as (base, _):
        yield base


def test_typing_inputs_gives_a_result(context, site):
    page = context.new_page()
    page.goto(site + PAGE)
    wait_done(page)
    assert output(page, "secondary_a") == "208 A"  # 75 kVA / (√3 × 208 V), computed
    page.fill('[name="kva"]', "150 kVA")
    expect(page.locator('[data-output="secondary_a"]')).to_have_text("416 A")
    assert page.locator(".fb-steps li").count() >= 3
    assert page.locator(".fb-cautions li").count() >= 3
    assert page.locator(".fb-sources li").count() >= 1
    assert page.locator('.fb-check[data-check="rating"][data-status="pass"]').count() == 1
    assert page.locator(".fb-chart canvas").count() >= 1  # the series is drawn


def test_engine_state_is_visible(context, site):
    page = context.new_page()
    page.goto(site + PAGE)
    root = page.locator("[data-calculator]")
    assert root.get_attribute("data-state") in ("starting", "ready", "computing", "done")
    wait_done(page)
    assert root.get_attribute("data-engine") == "ready"
    assert "ready" in page.text_content(".fb-engine__text")


def test_share_link_restores_inputs_and_computes(context, site):
    page = context.new_page()
    page.goto(site + PAGE + "?kva=300&phases=1&primary_v=7.2%20kV&secondary_v=240")
    wait_done(page)
    assert page.input_value('[name="kva"]') == "300"
    assert page.input_value('[name="phases"]') == "1"
    assert output(page, "secondary_a") == "1.25 kA"  # 300 kVA / 240 V = 1250 A, computed
    page.fill('[name="kva"]', "25")
    page.wait_for_url("**kva=25**")
    reopened = context.new_page()
    reopened.goto(page.url)
    wait_done(reopened)
    assert output(reopened, "secondary_a") == "104 A"  # 25 kVA / 240 V, computed


def test_link_values_are_data_not_markup(context, site):
    page = context.new_page()
    hostile = "%3Cimg%20src%3Dx%20onerror%3D%22window.__owned%3D1%22%3E"
    page.goto(site + PAGE + "?kva=" + hostile)
    page.wait_for_selector('[data-calculator][data-state="error"]')
    assert page.evaluate("window.__owned") is None
    assert page.locator(".fb-calc img").count() == 0
    message = page.text_content('.fb-field[data-field="kva"] .fb-field__msg')
    assert "<img" in message  # shown back as text


def test_bad_input_shows_a_field_message(context, site):
    page = context.new_page()
    page.goto(site + PAGE)
    wait_done(page)
    page.fill('[name="primary_v"]', "75 kVA")
    page.wait_for_selector('[data-calculator][data-state="error"]')
    message = page.locator('.fb-field[data-field="primary_v"] .fb-field__msg')
    assert message.is_visible()
    assert "voltage" in message.text_content()
    assert page.get_attribute('[name="primary_v"]', "aria-invalid") == "true"
    assert output(page, "secondary_a") == "—"  # no stale number beside a wrong input
    assert "Traceback" not in page.content()
    page.fill('[name="primary_v"]', "480 V")
    wait_done(page)
    assert not message.is_visible()


def test_no_request_leaves_the_origin(context, site):
    seen = []
    context.on("request", lambda request: seen.append(request.url))
    page = context.new_page()
    page.goto(site)
    page.click('article a[href*="transformer-currents"]')  # instant navigation
    wait_done(page)
    page.fill('[name="kva"]', "45")
    expect(page.locator('[data-output="secondary_a"]')).to_have_text("125 A")
    origin = "{0.scheme}://{0.netloc}/".format(urlsplit(site))
    outside = [url for url in seen if not url.startswith((origin, "data:", "blob:"))]
    assert seen and not outside


def test_works_offline_after_one_visit(browser, built_site):
    context = browser.new_context(viewport={"width": 360, "height": 780})
    context.set_default_timeout(60000)
    try:
        with serving(built_site) as (base, _):
            page = context.new_page()
            page.goto(base + PAGE)
            wait_done(page)
            page.wait_for_selector('html[data-offline="stored"]')
        # The server is gone: everything must now come from the service worker.
        context.set_offline(True)
        response = page.reload()
        assert response.from_service_worker
        wait_done(page)
        page.fill('[name="kva"]', "112.5")
        expect(page.locator('[data-output="secondary_a"]')).to_have_text("312 A")
    finally:
        context.close()


def test_update_prompt_appears_and_reloads_on_request(browser, tmp_path):
    old, new = tmp_path / "old", tmp_path / "new"
    assert build_site(old).returncode == 0
    team = tmp_path / "team.yml"
    team.write_text("organisation: Pump House Crew\n", encoding="utf-8")
    assert build_site(new, team_file=team).returncode == 0
    current = tmp_path / "current"
    current.symlink_to(old, target_is_directory=True)
    context = browser.new_context()
    context.set_default_timeout(60000)
    try:
        with serving(current) as (base, _):
            page = context.new_page()
            page.goto(base + PAGE)
            wait_done(page)
            page.wait_for_selector('html[data-offline="stored"]')
            current.unlink()
            current.symlink_to(new, target_is_directory=True)  # the team publishes a new build
            page.reload()  # still the old version, from the cache; the browser finds the new one
            page.wait_for_selector(".fb-update")
            assert "Pump House Crew" not in page.title()  # nothing swapped without asking
            page.click('[data-action="update-now"]')
            expect(page).to_have_title(re.compile("Pump House Crew"))
            wait_done(page)
    finally:
        context.close()


def test_hosted_under_a_sub_path(browser, built_site):
    context = browser.new_context()
    context.set_default_timeout(60000)
    try:
        with serving(built_site, prefix="/tools/fluxbook/") as (base, _):
            assert base.endswith("/tools/fluxbook/")
            page = context.new_page()
            page.goto(base + PAGE + "?kva=500&primary_v=4160&secondary_v=480")
            wait_done(page)
            assert output(page, "secondary_a") == "601 A"  # 500 kVA / (√3 × 480 V), computed
            scope = page.evaluate("navigator.serviceWorker.ready.then(r => r.scope)")
            assert scope == base
    finally:
        context.close()


def test_engine_failure_is_shown(context, site):
    context.route("**/calc.zip", lambda route: route.abort())
    page = context.new_page()
    page.goto(site + PAGE)
    page.wait_for_selector('[data-calculator][data-engine="failed"]')
    assert "failed" in page.text_content(".fb-engine__text")
    assert page.get_attribute("[data-calculator]", "data-state") == "error"


# The page's own engine module, resolved as fluxbook.js resolves "./engine.js": the same URL, so
# the same module instance and the same worker.
SCRIPT_SRC = "document.querySelector('script[type=module][src*=\"fluxbook.js\"]').src"
ENGINE_MODULE = f"new URL('engine.js', {SCRIPT_SRC}).href"


def test_worker_death_after_ready_rejects_pending_runs_and_shows_it(context, site):
    """Issue 10: a worker that dies after it was ready must not leave a run waiting for ever."""
    page = context.new_page()
    page.goto(site + PAGE)
    wait_done(page)
    outcome = page.evaluate(f"""async () => {{
        const {{ engine }} = await import({ENGINE_MODULE});
        const running = engine();
        const pending = running.run("transformer-currents", {{}})
            .then(() => "answered", (error) => "rejected: " + error.message);
        // Let the run be posted, then end the worker the way an uncaught error does.
        await Promise.resolve(); await Promise.resolve();
        running.worker.dispatchEvent(new ErrorEvent("error", {{ message: "simulated crash" }}));
        const later = await running.run("transformer-currents", {{}})
            .then(() => "answered", (error) => "rejected: " + error.message);
        return [await pending, later];
    }}""")
    assert outcome == ["rejected: simulated crash", "rejected: simulated crash"]
    root = page.locator("[data-calculator]")
    expect(root).to_have_attribute("data-engine", "failed")
    assert "stopped (simulated crash)" in page.text_content(".fb-engine__text")
    page.fill('[name="kva"]', "150 kVA")  # a new input after the death: an error, not a hang
    expect(root).to_have_attribute("data-state", "error")
    expect(page.locator(".fb-general-msg")).to_contain_text("could not run")


def test_a_run_sent_before_boot_waits_for_the_boot(context, site):
    """Issue 10: the worker answers a run that reaches it before its boot message."""
    page = context.new_page()
    page.goto(site + PAGE)
    wait_done(page)
    reply = page.evaluate("""async () => {
        const script = document.querySelector('script[type=module][src*="fluxbook.js"]').src;
        const worker = new Worker(new URL("calc-worker.js", script), { type: "module" });
        const answered = new Promise((resolve) => worker.addEventListener("message", (event) => {
            if (event.data.type === "reply") resolve(event.data);
        }));
        worker.postMessage({ type: "run", id: 7, calculator: "transformer-currents",
                             inputs: { kva: "75 kVA", secondary_v: "208 V" } });
        const meta = (name) => new URL(document.querySelector(`meta[name="${name}"]`).content,
                                       document.baseURI).href;
        worker.postMessage({ type: "boot", indexURL: meta("fluxbook-pyodide"),
                             calcZipURL: meta("fluxbook-calc-zip") });
        const reply = await answered;
        worker.terminate();
        return reply;
    }""")
    assert reply["id"] == 7 and "error" not in reply, reply
    assert reply["result"]["ok"] is True, reply
    # 75 kVA / (√3 × 208 V) = 208.2 A, computed
    assert reply["result"]["outputs"]["secondary_a"]["value"] == pytest.approx(208.18, rel=1e-4)


def test_phone_width_has_no_sideways_scroll(context, site):
    page = context.new_page()
    page.goto(site + PAGE)
    wait_done(page)
    assert page.evaluate("document.documentElement.scrollWidth") <= 360
    height = page.evaluate("document.querySelector('[name=kva]').getBoundingClientRect().height")
    assert height >= 44  # a gloved finger's target (WCAG 2.5.5 asks 44 CSS px)


def test_dark_scheme_follows_the_device(browser, site):
    context = browser.new_context(color_scheme="dark")
    context.set_default_timeout(60000)
    try:
        page = context.new_page()
        page.goto(site + PAGE)
        wait_done(page)
        assert page.get_attribute("body", "data-md-color-scheme") == "slate"
        background = page.evaluate("getComputedStyle(document.body).backgroundColor")
        red, green, blue = [int(x) for x in background[background.index("(") + 1:-1].split(",")[:3]]
        assert red + green + blue < 150
    finally:
        context.close()


def test_home_page_reports_offline_storage(context, site):
    page = context.new_page()
    page.goto(site)
    expect(page.locator("[data-offline-report]")).to_contain_text("stored on this device")
    expect(page.locator("[data-offline-report]")).to_contain_text("Storage used by this site")


def test_every_calculator_page_computes_its_defaults(browser, site):
    # Once the service worker holds the site, links move by instant navigation and the engine
    # stays booted: one calculator worker for the whole tour. Each page's default inputs must
    # give a result, with no page error and no console error.
    from calc import api
    context = browser.new_context(viewport={"width": 1280, "height": 900})
    context.set_default_timeout(60000)
    problems, workers = [], []
    try:
        page = context.new_page()
        page.goto(site + PAGE)
        wait_done(page)
        page.wait_for_selector('html[data-offline="stored"]')
        page.on("pageerror", lambda error: problems.append(str(error)))
        page.on("console", lambda m: problems.append(m.text) if m.type == "error" else None)
        page.on("worker", lambda worker: workers.append(worker.url))
        page.reload()  # now controlled by the service worker
        wait_done(page)
        # the theme, whose instant navigation this tour takes, runs after the first result
        page.wait_for_function("() => typeof window.document$ !== 'undefined'")
        for calculator_id in api.REGISTRY:
            page.locator(f'nav a[href$="calculators/{calculator_id}/"]').first.dispatch_event("click")
            page.wait_for_selector(f'[data-calculator="{calculator_id}"][data-state="done"]')
            assert page.locator(".fb-out__value").first.text_content() not in ("—", ""), calculator_id
            assert page.locator(".fb-general-msg").is_hidden(), calculator_id
    finally:
        context.close()
    assert not problems, problems
    assert len([url for url in workers if url.endswith("calc-worker.js")]) == 1, workers


def test_sitemap_is_rewritten_to_the_copy_s_own_address(browser, built_site):
    from build import paths
    assert paths.SITE_URL_PLACEHOLDER in (built_site / "sitemap.xml").read_text(encoding="utf-8")
    context = browser.new_context()
    context.set_default_timeout(60000)
    try:
        with serving(built_site, prefix="/tools/fluxbook/") as (base, _):
            page = context.new_page()
            page.goto(base)
            page.wait_for_selector('html[data-offline="stored"]')
            page.reload()
            text = page.evaluate("fetch('sitemap.xml').then(r => r.text())")
            assert paths.SITE_URL_PLACEHOLDER not in text and f"<loc>{base}calculators/" in text
    finally:
        context.close()
