"""The theme's search over the lean index (build/slim.py): a technician's words still find the
calculator, including words the index keeps only in its unshown "words" field; on a calculator
page the index is built after the first result (build/search_later.py)."""

import json

import pytest
from playwright.sync_api import expect

from build import search_later, slim
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


def _worker_requests(context):
    """URLs of the stand-in and the theme's search worker as the page loads them (not the
    service worker's precaching)."""
    seen = []
    context.on("request", lambda request: seen.append(request.url)
               if request.service_worker is None and "/workers/search" in request.url else None)
    return seen


def _theme_worker_in(seen):
    return any(search_later.THEME_WORKER.search(url) for url in seen)


def test_the_search_index_waits_while_the_engine_starts_and_the_search_box_calls_it(browser, site):
    """build/search_later.py: with the engine still starting, the theme's worker is not loaded;
    the search box's focus loads it at once, and the search works."""
    context = browser.new_context(viewport={"width": 360, "height": 780})
    try:
        seen = _worker_requests(context)
        context.route("**/pyodide.asm.wasm", lambda route: None)  # the engine never starts
        page = context.new_page()
        page.goto(site + "calculators/voltage-drop/")
        for _ in range(100):  # the theme has started its search worker: the stand-in
            if any(url.endswith(search_later.WORKER_SITE_PATH) for url in seen):
                break
            page.wait_for_timeout(100)
        page.wait_for_timeout(2000)
        assert not _theme_worker_in(seen), seen
        page.click("label[for=__search]")
        page.keyboard.type("GFCI")
        # results follow each key typed: wait for the whole word's (a partial one's may show first)
        expect(page.locator('.md-search-result__item > a[href*="calculators/gfci-check/"]').first).to_be_visible()
        assert _theme_worker_in(seen) and page.get_attribute("[data-calculator]", "data-state") == "starting"
    finally:
        context.close()


def test_a_calculator_page_builds_the_search_index_after_its_first_result(browser, site):
    context = browser.new_context(viewport={"width": 360, "height": 780})
    try:
        seen = _worker_requests(context)
        page = context.new_page()
        page.goto(site + "calculators/motor-start-dip/")
        page.wait_for_selector('[data-calculator][data-state="done"]', timeout=ENGINE_TIMEOUT_MS)
        for _ in range(50):
            if _theme_worker_in(seen):
                break
            page.wait_for_timeout(100)
        assert _theme_worker_in(seen), seen
        page.click("label[for=__search]")
        page.keyboard.type("lights dim")
        expect(page.locator('.md-search-result__item > a[href*="motor-start-dip"]').first).to_be_visible()
    finally:
        context.close()
