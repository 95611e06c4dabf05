"""Answer first on a phone (issue 12): the summary in view at 360 x 780, units that follow the
user, the fold that never hides what counts, and each class of finding from the walk through
the pages (unit hints, what a technician types, number formats, charts at 360 px, the offline
words on a plain-HTTP host, the "not found" page under a sub-path).

Expected figures come from calc.api.run with the same inputs (CPython), never typed in.
"""

import re

import pytest
from playwright.sync_api import expect

from calc import api
from tests.browser.conftest import CHROMIUM, CHROMIUM_ARGS, ENGINE_TIMEOUT_MS, output, wait_done
from tests.conftest import serving

PHONE = {"width": 360, "height": 780}
# How much of the summary must be on screen: all of it (it is sticky at the bottom).
IN_VIEW_JS = """() => { const s = document.querySelector('[data-summary]');
  if (!s || s.hidden) return false;
  const r = s.getBoundingClientRect();
  return r.height > 0 && r.top >= 0 && r.bottom <= innerHeight + 0.5; }"""


@pytest.fixture(scope="module")
def site(built_site):
    with serving(built_site) as (base, _):
        yield base


def summary_in_view(page):
    return page.evaluate(IN_VIEW_JS)


def edit_last_input(page):
    """Change the form's last field the way a user would (opening the fold first)."""
    fold = page.locator(".fb-more")
    if fold.count() and not fold.first.evaluate("f => f.open"):
        fold.first.locator("summary").click()
    last = page.locator(".fb-form [name]").last
    last.evaluate("e => e.scrollIntoView({block: 'nearest'})")  # as far as a finger scrolls
    if last.evaluate("e => e.tagName") == "SELECT":
        values = last.evaluate("e => [...e.options].map(o => o.value)")
        current = last.input_value()
        last.select_option(next(v for v in values if v != current))
    else:
        last.fill("")
        last.press_sequentially("2")
    return last


# --- item 2: the answer first -----------------------------------------------------------------

@pytest.mark.parametrize("calculator_id", ["voltage-drop", "line-loss", "pf-correction",
                                           "back-emf", "transformer-size"])
def test_summary_is_in_view_after_the_first_result_and_after_editing_the_last_input(
        context, site, calculator_id):
    page = context.new_page()
    page.goto(site + f"calculators/{calculator_id}/")
    wait_done(page)
    assert summary_in_view(page)
    summary = page.locator("[data-summary]")
    expected = api.run(calculator_id, {})
    shown = summary.locator("[data-summary-output]")
    assert 1 <= shown.count() <= 3
    first = shown.first.get_attribute("data-summary-output")
    if first in expected["outputs"]:
        # the same figure the engine gives (the page's unit system may differ from CPython's
        # default, so compare the number's first figures)
        assert shown.first.text_content().split()[0][:2] == \
            expected["outputs"][first]["display"].split()[0][:2]
    # The verdict: the worst check, in words and with its own shape.
    statuses = [check["status"] for check in expected["checks"]]
    worst = next(s for s in ("fail", "warn", "pass") if s in statuses)
    expect(summary.locator(".fb-summary__verdict")).to_have_attribute("data-verdict", worst)
    assert summary.locator(".fb-summary__badge").text_content() in ("OK", "Check", "Not OK")
    last = edit_last_input(page)
    expect(page.locator("[data-calculator]")).to_have_attribute("data-state", re.compile("done|error"))
    wait_done(page)
    assert summary_in_view(page)
    # the field just edited is on screen, below the summary that sticks under the header
    assert last.evaluate("""e => { const r = e.getBoundingClientRect();
        const s = document.querySelector('[data-summary]').getBoundingClientRect();
        return r.top >= s.bottom - 1 && r.bottom <= innerHeight + 1; }""")


def test_tapping_the_summary_goes_to_the_full_result(context, site):
    page = context.new_page()
    page.goto(site + "calculators/voltage-drop/")
    wait_done(page)
    page.locator("[data-summary]").click()
    # the result's top comes to rest just below the summary (html scroll-padding-top)
    page.wait_for_function("""() => { const r = document.querySelector('.fb-result').getBoundingClientRect();
        const s = document.querySelector('[data-summary]').getBoundingClientRect();
        return r.top >= s.bottom - 2 && r.top < s.bottom + 60; }""")
    assert page.evaluate("document.activeElement.classList.contains('fb-result')")


def test_output_cards_sit_two_or_three_to_a_row(context, site):
    page = context.new_page()
    page.goto(site + "calculators/line-loss/")
    wait_done(page)
    boxes = page.evaluate("""() => [...document.querySelectorAll('.fb-out:not([hidden])')]
        .map(c => { const r = c.getBoundingClientRect(); return [Math.round(r.top), r.height,
                    c.scrollHeight]; })""")
    rows = {}
    for top, _, _ in boxes:
        rows[top] = rows.get(top, 0) + 1
    assert max(rows.values()) in (2, 3)
    assert all(height <= scroll + 1 for _, height, scroll in boxes)  # no taller than content
    assert all(height < 150 for _, height, _ in boxes)


def test_the_result_never_goes_blank_between_two_answers(context, site):
    page = context.new_page()
    page.goto(site + "calculators/transformer-currents/")
    wait_done(page)
    page.evaluate("""() => { window.__seen = [];
        const out = document.querySelector('[data-output="secondary_a"]');
        new MutationObserver(() => window.__seen.push(out.textContent))
          .observe(out, {childList: true, characterData: true, subtree: true}); }""")
    for text in ("150", "225 kVA", "300"):
        page.fill('[name="kva"]', text)
        expect(page.locator('[data-output="secondary_a"]')).to_have_text(
            api.run("transformer-currents", {"kva": text})["outputs"]["secondary_a"]["display"])
    seen = page.evaluate("window.__seen")
    assert seen and all(text not in ("", "—") for text in seen), seen


# --- item 3: units that follow the user -------------------------------------------------------

def test_feet_typed_come_back_in_feet_in_outputs_steps_and_the_chart(context, site):
    page = context.new_page()
    page.goto(site + "calculators/ground-fault-trip/")
    wait_done(page)
    page.locator('[data-units-choice][value="iec"]').check()  # a metric display...
    page.fill('[name="length"]', "150 ft")  # ...and a length in feet
    expect(page.locator('[data-output="max_length"]')).to_contain_text("ft")
    wait_done(page)
    steps = page.text_content(".fb-steps")
    assert " ft" in steps and not re.search(r"\d m\b", steps)
    assert page.get_attribute(".fb-chart", "data-x-unit") == "ft"
    assert "(ft)" in page.text_content(".fb-chart__axis--x")


def test_the_switch_changes_the_system_and_is_remembered(context, site):
    page = context.new_page()
    page.goto(site + "calculators/ground-fault-trip/")
    wait_done(page)
    na = api.run("ground-fault-trip", {}, display="na")["outputs"]["max_length"]["display"]
    assert output(page, "max_length") == na and na.endswith(" ft")  # a North American team
    assert page.locator('.fb-field[data-field="length"] .fb-field__unit').text_content() == "ft"
    page.locator('[data-units-choice][value="iec"]').check()
    # the default "75 ft" is now shown as 22.86 m: the same run, in the system chosen
    expect(page.locator('[name="length"]')).to_have_value("22.86 m")
    iec = api.run("ground-fault-trip", {"length": "22.86 m"}, display="iec")["outputs"]["max_length"]
    expect(page.locator('[data-output="max_length"]')).to_have_text(iec["display"])
    assert page.locator('.fb-field[data-field="length"] .fb-field__unit').text_content() == "m"
    page.reload()
    wait_done(page)
    assert page.locator('[data-units-choice][value="iec"]').is_checked()
    assert output(page, "max_length").endswith(" m")
    conductor = context.new_page()  # the setting is the device's, on every page
    conductor.goto(site + "calculators/conductor/")
    assert conductor.locator('.fb-field[data-field="spacing_m"] .fb-field__unit').text_content() == "m"


def test_a_bare_length_is_read_in_the_unit_its_label_shows(context, site):
    page = context.new_page()
    page.goto(site + "calculators/voltage-drop/")
    wait_done(page)
    assert page.locator('.fb-field[data-field="length"] .fb-field__unit').text_content() == "ft"
    page.fill('[name="length"]', "150")
    page.wait_for_url("**length=150+ft**")
    wait_done(page)
    assert output(page, "drop_pct") == api.run("voltage-drop", {"length": "150 ft"}, display="na")[
        "outputs"]["drop_pct"]["display"]


# --- item 6: the fold -------------------------------------------------------------------------

def test_an_error_in_a_folded_field_opens_the_fold_and_shows_its_message(context, site):
    page = context.new_page()
    page.goto(site + "calculators/voltage-drop/?sets=50%25")
    page.wait_for_selector('[data-calculator][data-state="error"]')
    assert page.locator(".fb-more").evaluate("f => f.open")
    message = page.locator('.fb-field[data-field="sets"] .fb-field__msg')
    expect(message).to_be_visible()
    expect(page.locator("[data-summary] .fb-summary__text")).to_contain_text("Parallel sets")
    page.locator("[data-summary]").click()  # the summary takes the user to the field to fix
    expect(page.locator('[name="sets"]')).to_be_focused()


def test_a_link_with_folded_values_opens_the_fold(context, site):
    page = context.new_page()
    page.goto(site + "calculators/voltage-drop/?sets=2")
    wait_done(page)
    assert page.locator(".fb-more").evaluate("f => f.open")
    plain = context.new_page()
    plain.goto(site + "calculators/voltage-drop/")
    wait_done(plain)
    assert not plain.locator(".fb-more").evaluate("f => f.open")  # defaults: nothing to show


# --- item 6: unit hints and what a technician types --------------------------------------------

def test_fields_name_their_units_in_the_trade_s_symbols(context, site):
    page = context.new_page()
    page.goto(site + "calculators/voltage-drop/")
    assert page.get_attribute('[name="sets"]', "title") == "A plain number, no unit"
    assert "85 %" in page.get_attribute('[name="pf"]', "title")
    assert page.get_attribute('[name="length"]', "inputmode") == "text"  # letters for "ft"
    labels = page.text_content(".fb-form")
    assert "degC" not in labels and "\u00b0C" in labels
    emf = context.new_page()
    emf.goto(site + "calculators/back-emf/")
    assert "ohm" not in emf.text_content(".fb-form label[for$='armature_r']")
    assert "\u03a9" in emf.text_content(".fb-form label[for$='armature_r']")


def test_the_foot_mark_is_read_as_feet(context, site):
    page = context.new_page()
    page.goto(site + "calculators/voltage-drop/")
    wait_done(page)
    page.fill('[name="length"]', "100'")
    wait_done(page)
    expect(page.locator('[data-output="drop_pct"]')).to_have_text(
        api.run("voltage-drop", {"length": "100 ft"}, display="na")["outputs"]["drop_pct"]["display"])
    assert page.locator(".fb-field--bad").count() == 0


def test_speed_takes_r_per_min(context, site):
    page = context.new_page()
    page.goto(site + "calculators/back-emf/")
    wait_done(page)
    for text in ("1750 rpm", "1750 r/min"):
        page.fill('[name="speed_ref"]', text)
        wait_done(page)
        assert page.locator(".fb-field--bad").count() == 0


# --- item 6: numbers -----------------------------------------------------------------------------

def test_a_standard_rating_keeps_its_figures(context, site):
    page = context.new_page()
    page.goto(site + "calculators/transformer-size/?load_kva=90&load_kw=&load_a=&growth_pct=25")
    wait_done(page)
    assert output(page, "rating") == "112.5 kVA"  # 90 kVA × 1.25 = 112.5 kVA, a standard rating


def test_money_and_phasors_have_one_format(context, site):
    page = context.new_page()
    page.goto(site + "calculators/line-loss/")
    wait_done(page)
    money = [output(page, name) for name in ("annual_cost", "alt_annual_cost", "annual_saving")]
    assert all(re.fullmatch(r"-?\d{1,4}\.\d\d|-?\d{1,3}(\u202f\d{3})+\.\d\d", m) for m in money), money
    rlc = context.new_page()
    rlc.goto(site + "calculators/rlc-resonance/")
    wait_done(rlc)
    assert not re.search(r"\de-\d", rlc.text_content(".fb-steps"))


# --- item 6: charts at 360 px ---------------------------------------------------------------------

@pytest.mark.parametrize("calculator_id", ["switching-transient", "ground-fault-trip",
                                           "supply-mismatch", "pf-correction", "voltage-drop"])
def test_chart_labels_do_not_overlap_and_axis_titles_are_whole(context, site, calculator_id):
    page = context.new_page()
    page.goto(site + f"calculators/{calculator_id}/")
    wait_done(page)
    for figure in page.locator(".fb-chart").all():
        figure.scroll_into_view_if_needed()
        boxes = figure.evaluate("f => f.fbMarkBoxes || []")
        for i, a in enumerate(boxes):
            for b in boxes[i + 1:]:
                apart = a["right"] <= b["left"] or b["right"] <= a["left"] or \
                    a["bottom"] <= b["top"] or b["bottom"] <= a["top"]
                assert apart, (calculator_id, a["label"], b["label"])
        for axis in figure.locator(".fb-chart__axis").all():
            assert axis.evaluate("e => e.scrollWidth <= e.clientWidth + 1 && e.textContent.length > 0")


@pytest.mark.parametrize("calculator_id", ["transformer-size", "transformer-fault-current"])
def test_wide_axes_frame_the_case(context, site, calculator_id):
    page = context.new_page()
    page.goto(site + f"calculators/{calculator_id}/")
    wait_done(page)
    scale = page.locator(".fb-chart").first.evaluate(
        "f => ({distr: f.fbPlot.scales.x.distr, min: f.fbPlot.scales.x.min, max: f.fbPlot.scales.x.max})")
    assert scale["distr"] == 3  # log: 3 kVA to 10 MVA (or 10 MVA to 10 GVA) all readable
    series = api.run(calculator_id, {})["series"]
    for mark in series["marks"]:
        if mark["axis"] == "x":
            assert scale["min"] <= mark["value"] <= scale["max"]


# --- item 6: a plain-HTTP internal host, and the "not found" page under a sub-path ---------------

def test_a_plain_http_host_is_told_it_needs_https_for_offline_use(browser, built_site):
    # An internal host name over plain HTTP: not a secure context (localhost would be).
    with serving(built_site) as (base, server):
        port = server.server_port
        intranet = browser.browser_type.launch(executable_path=CHROMIUM, args=CHROMIUM_ARGS + [
            "--host-resolver-rules=MAP fluxbook-intranet.test 127.0.0.1"])
        try:
            context = intranet.new_context(viewport=PHONE)
            context.set_default_timeout(ENGINE_TIMEOUT_MS)
            page = context.new_page()
            page.goto(f"http://fluxbook-intranet.test:{port}/calculators/transformer-currents/")
            wait_done(page)
            assert page.evaluate("window.isSecureContext") is False
            expect(page.locator("html")).to_have_attribute("data-offline", "insecure")
            expect(page.locator(".fb-engine__text")).to_contain_text("https://")
            expect(page.locator(".fb-engine__text")).to_contain_text("localhost")
        finally:
            intranet.close()


def test_the_not_found_page_is_styled_under_a_sub_path(browser, built_site):
    context = browser.new_context(viewport=PHONE)
    context.set_default_timeout(ENGINE_TIMEOUT_MS)
    try:
        with serving(built_site, prefix="/tools/fluxbook/") as (base, _):
            page = context.new_page()
            response = page.goto(base + "calculators/no-such-calculator/")
            assert response.status == 404
            expect(page.locator("h1")).to_have_text("Page not found")
            header = page.evaluate("getComputedStyle(document.querySelector('.md-header')).backgroundColor")
            assert header == "rgb(13, 59, 69)"  # the theme's teal: our stylesheet loaded
            home = page.get_by_role("link", name="Go to the home page")
            assert home.evaluate("a => a.href") == base  # the copy's root, not the server's
    finally:
        context.close()
