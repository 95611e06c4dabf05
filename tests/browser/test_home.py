"""The home page launches (issue 12, item 4): tiles by group with a question each, a filter that
finds a calculator by the words a technician uses (offline, without the Python engine), and the
calculations last opened on this device, one tap to reopen.
"""

import pytest
from playwright.sync_api import expect

from build import home
from calc import api
from tests.browser.conftest import output, wait_done
from tests.conftest import serving

# What a technician might type, and the calculator that must come first.
FIRST_MATCH = {
    "lights dim": "motor-start-dip",
    "the lights flicker when the compressor starts": "motor-start-dip",
    "GFCI": "gfci-check",
    "rcd trip time": "gfci-check",
    "breaker won't trip": "ground-fault-trip",
    "motor amps": "motor-current",
    "wire size": "wire-size",
    "resonance": "rlc-resonance",
    "kvar": "pf-correction",
    "buck boost": "buck-boost",
    "available fault current": "transformer-fault-current",
}
# ...and calculators that must be among the matches.
AMONG_MATCHES = {
    "kVA": {"transformer-currents", "transformer-size", "buck-boost"},
    "resonance": {"rlc-resonance", "pf-correction"},
    "breaker trip": {"ground-fault-trip", "gfci-check"},
    "dim": {"motor-start-dip"},
}


@pytest.fixture(scope="module")
def site(built_site):
    with serving(built_site) as (base, _):
        yield base


def test_every_calculator_has_a_question_and_words():
    lacking, unknown = home.missing_entries(api.list_calculators())
    assert not lacking, f"add a question and words for {lacking} to build/home.py"
    assert not unknown, f"build/home.py names calculators that are not registered: {unknown}"
    for calculator_id, question in home.QUESTIONS.items():
        assert question.endswith("?") and len(question) <= 70, (calculator_id, question)
        assert home.WORDS[calculator_id], calculator_id


def _no_engine(context):
    """The filter must not need the Python engine: refuse its files outright."""
    context.route("**/pyodide-*/**", lambda route: route.abort())
    context.route("**/calc.zip", lambda route: route.abort())


def _matches(page):
    return page.locator("[data-matches] .fb-tile").evaluate_all("els => els.map(e => e.dataset.tile)")


def test_home_shows_every_calculator_as_a_tile_by_group(context, site):
    page = context.new_page()
    page.goto(site)
    entries = api.list_calculators()
    tiles = page.locator("[data-groups] a.fb-tile")
    assert tiles.evaluate_all("els => els.map(e => e.dataset.tile)") == [e["id"] for e in entries]
    groups = page.locator("[data-groups] .fb-group h2").all_text_contents()
    assert [g.replace("¶", "").strip() for g in groups] == list(dict.fromkeys(e["group"] for e in entries))
    tile = page.locator('[data-groups] a.fb-tile[data-tile="motor-start-dip"]')
    expect(tile.locator(".fb-tile__question")).to_have_text("Will the lights dim when it starts?")
    for box in tiles.evaluate_all("els => els.map(e => e.getBoundingClientRect().height)"):
        assert box >= 44  # a gloved thumb's target
    tile.click()
    page.wait_for_url("**/calculators/motor-start-dip/")
    wait_done(page)


def test_the_filter_finds_a_calculator_by_the_words_a_technician_uses(context, site):
    _no_engine(context)
    page = context.new_page()
    page.goto(site)
    finder = page.locator("#fb-find")
    expect(finder).to_have_accessible_name("Find a calculator")
    for query, first in FIRST_MATCH.items():
        finder.fill(query)
        found = _matches(page)
        assert found and found[0] == first, (query, found)
        expect(page.locator("[data-groups]")).to_be_hidden()
        expect(page.locator(".fb-finder__count")).to_contain_text(f"for “{query}”")
    for query, wanted in AMONG_MATCHES.items():
        finder.fill(query)
        assert wanted <= set(_matches(page)), (query, _matches(page))
    finder.fill("lights dim")
    assert "conductor" not in _matches(page)  # the filter filters
    finder.fill("zzqx plover")
    assert _matches(page) == []
    expect(page.locator(".fb-finder__count")).to_contain_text("No calculator matches")
    expect(page.locator("[data-groups]")).to_be_visible()  # nothing found: browse instead
    finder.fill("")
    expect(page.locator("[data-matches]")).to_be_hidden()
    expect(page.locator("[data-groups]")).to_be_visible()
    assert page.evaluate("document.querySelectorAll('[data-calculator]').length") == 0


def test_enter_in_the_filter_opens_the_first_match(context, site):
    page = context.new_page()
    page.goto(site)
    page.locator("#fb-find").fill("lights dim")
    page.keyboard.press("Enter")
    page.wait_for_url("**/calculators/motor-start-dip/")
    wait_done(page)


def test_recent_calculations_are_listed_and_reopen_in_one_tap(context, site):
    page = context.new_page()
    page.goto(site)
    expect(page.locator("[data-recent]")).to_be_hidden()  # nothing opened yet on this device
    page.goto(site + "calculators/transformer-currents/?kva=150")
    wait_done(page)
    assert output(page, "secondary_a") == "416 A"  # 150 kVA / (√3 × 208 V)
    page.goto(site + "calculators/voltage-drop/")
    wait_done(page)
    page.goto(site)
    recent = page.locator("[data-recent] a.fb-recent__link")
    expect(recent).to_have_count(2)
    assert recent.evaluate_all("els => els.map(e => e.dataset.recent)") == [
        "calculators/voltage-drop/", "calculators/transformer-currents/"]  # newest first
    expect(recent.nth(1)).to_contain_text("Transformer currents")
    expect(recent.nth(1)).to_contain_text("150")
    assert "kva=150" in recent.nth(1).get_attribute("href")
    assert recent.nth(1).bounding_box()["height"] >= 44
    recent.nth(1).click()
    page.wait_for_url("**/calculators/transformer-currents/?*kva=150*")
    wait_done(page)
    assert page.input_value('[name="kva"]') == "150"
    assert output(page, "secondary_a") == "416 A"  # reopened, recomputed
    page.goto(site)
    page.get_by_role("button", name="Clear this list").click()
    expect(page.locator("[data-recent]")).to_be_hidden()
    page.reload()
    expect(page.locator("[data-recent]")).to_be_hidden()
