"""The theme's search over the lean index (build/slim.py): a technician's words still find the
calculator, including words the index keeps only in its unshown "words" field; on a calculator
page the theme's script, and so its search, runs after the first result (build/theme_later.py)."""

import contextlib
import json
import re

import pytest
from playwright.sync_api import expect

from build import slim
from tests.browser.conftest import ENGINE_TIMEOUT_MS
from tests.conftest import serving


@pytest.fixture(scope="module")
def site(built_site):
    with serving(built_site) as (base, _):
        yield base


def _expect_found(browser, site, query, page_path):
    """Typing query in the search box lists page_path. The theme searches as keys are typed, so
    a partial query's results may show first: this waits for the link itself."""
    context = browser.new_context(viewport={"width": 1280, "height": 900})
    try:
        page = context.new_page()
        page.goto(site)
        page.click("input.md-search__input")
        page.keyboard.type(query)
        link = page.locator(f'.md-search-result__item > a[href*="{page_path}"]')
        expect(link.first).to_be_visible()
    finally:
        context.close()


@pytest.mark.parametrize("query, page", [
    ("code letter", "calculators/motor-current/"),
    ("GFCI", "calculators/gfci-check/"),
    ("voltage drop", "calculators/voltage-drop/"),
    ("kVA", "calculators/transformer-size/"),
])
def test_a_technician_s_words_find_the_calculator(browser, site, query, page):
    _expect_found(browser, site, query, page)


def test_a_word_kept_only_in_the_words_field_is_found(browser, built_site, site):
    index = json.loads((built_site / slim.SEARCH_INDEX_FILE).read_text(encoding="utf-8"))
    shown = " ".join(doc["title"] + " " + doc["text"] for doc in index["docs"]).lower()
    # a word of one calculator page that no title or lead anywhere holds
    page, word = next((doc["location"], word) for doc in index["docs"]
                      if doc["location"].startswith("calculators/")
                      for word in doc.get(slim.WORDS_FIELD, "").split()
                      if word.isalpha() and len(word) > 6 and word.lower() not in shown)
    _expect_found(browser, site, word, slim.page_of(page))


@contextlib.contextmanager
def _phone(browser, **options):
    """A new context at a phone's size, closed after."""
    context = browser.new_context(viewport={"width": 360, "height": 780}, **options)
    try:
        yield context
    finally:
        context.close()


def _theme_ran(page):
    return page.evaluate("typeof window.document$ !== 'undefined'")


def _wait_theme(page, timeout=30000):
    page.wait_for_function("() => typeof window.document$ !== 'undefined'", timeout=timeout)


def test_while_the_engine_starts_the_theme_waits_and_the_search_box_runs_it(browser, site):
    """build/theme_later.py: with the engine still starting, the theme's script has not run and
    its search worker is not loaded, but its search button shows; opening the search box runs it
    at once, and a technician's word typed straight away is searched."""
    with _phone(browser) as context:
        seen = []
        context.on("request", lambda request: seen.append(request.url)
                   if request.service_worker is None and "/workers/search" in request.url else None)
        context.route("**/pyodide.asm.wasm", lambda route: None)  # the engine never starts
        page = context.new_page()
        page.goto(site + "calculators/voltage-drop/")
        page.wait_for_load_state("load")  # the page's modules have run; the theme's script waits
        search = page.locator(".md-header__button[for=__search]")
        expect(search).to_be_visible()  # shown meanwhile (fluxbook.css), at a phone's width
        assert not _theme_ran(page) and not seen, seen
        search.click()
        page.keyboard.type("GFCI")
        # results follow each key typed: wait for the whole word's (a partial one's may show first)
        expect(page.locator('.md-search-result__item > a[href*="calculators/gfci-check/"]').first).to_be_visible()
        assert _theme_ran(page) and seen
        assert page.get_attribute("[data-calculator]", "data-state") == "starting"


def test_after_the_first_result_the_theme_runs_its_search_and_its_instant_navigation(browser, site):
    with _phone(browser) as context:
        page = context.new_page()
        page.goto(site + "calculators/motor-start-dip/")
        page.wait_for_selector('html[data-offline="stored"]', timeout=ENGINE_TIMEOUT_MS)
        page.reload()  # the service worker now serves the sitemap the instant navigation follows
        page.wait_for_selector('[data-calculator][data-state="done"]', timeout=ENGINE_TIMEOUT_MS)
        _wait_theme(page, 5000)
        page.click("label[for=__search]")
        page.keyboard.type("lights dim")
        expect(page.locator('.md-search-result__item > a[href*="motor-start-dip"]').first).to_be_visible()
        page.keyboard.press("Escape")
        # the theme's instant navigation: the next calculator opens in this page, whose engine
        # answers it without starting again, and the new page is wired as if loaded
        page.evaluate("window.__pumpHouse = 'still here'")
        page.locator('a[href$="voltage-drop/"]').first.evaluate("link => link.click()")
        page.wait_for_selector('[data-calculator="voltage-drop"][data-state="done"]', timeout=ENGINE_TIMEOUT_MS)
        assert page.evaluate("window.__pumpHouse") == "still here"
        page.fill('[data-calculator="voltage-drop"] [name="length"]', "150 ft")  # wired: it computes
        expect(page).to_have_url(re.compile(r"voltage-drop/\?.*length=150"))


def test_a_page_without_a_calculator_runs_the_theme_at_once(browser, site):
    with _phone(browser) as context:
        page = context.new_page()
        page.goto(site + "safety/")
        page.wait_for_load_state("domcontentloaded")
        assert _theme_ran(page)


def test_when_the_engine_fails_the_theme_still_runs(browser, site):
    with _phone(browser) as context:
        context.route("**/pyodide.asm.wasm", lambda route: route.abort())
        context.route("**/pyodide.asm.mjs", lambda route: route.abort())
        page = context.new_page()
        page.goto(site + "calculators/voltage-drop/")
        page.wait_for_selector('[data-calculator][data-engine="failed"]', timeout=ENGINE_TIMEOUT_MS)
        _wait_theme(page, 5000)


@pytest.mark.parametrize("device, scheme", [("dark", "slate"), ("light", "default")])
def test_the_device_s_colour_scheme_shows_before_the_theme_runs(browser, site, device, scheme):
    """build/theme_later.py: the device's light or dark scheme from the first paint, as the
    theme gives it once it runs; no light page turning dark (or back) on a phone at night."""
    with _phone(browser, color_scheme=device) as context:
        context.route("**/pyodide.asm.wasm", lambda route: None)  # the engine never starts
        page = context.new_page()
        page.goto(site + "calculators/voltage-drop/")
        page.wait_for_load_state("load")
        assert not _theme_ran(page)
        assert page.get_attribute("body", "data-md-color-scheme") == scheme
        page.locator(".md-header__button[for=__search]").click()  # runs the theme
        _wait_theme(page)
        page.wait_for_timeout(300)
        assert page.get_attribute("body", "data-md-color-scheme") == scheme
