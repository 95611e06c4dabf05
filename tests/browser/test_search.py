"""The theme's search over the lean index (build/slim.py): a technician's words still find the
calculator, including words the index keeps only in its unshown "words" field."""

import json
from urllib.parse import urlsplit

import pytest
from playwright.sync_api import expect

from build import slim
from tests.conftest import serving


@pytest.fixture(scope="module")
def site(built_site):
    with serving(built_site) as (base, _):
        yield base


def _results(browser, site, query):
    context = browser.new_context(viewport={"width": 1280, "height": 900})
    page = context.new_page()
    page.goto(site)
    page.click("input.md-search__input")
    page.keyboard.type(query)  # the theme searches as keys are typed
    links = page.locator(".md-search-result__item > a")
    expect(links.first).to_be_visible()
    hrefs = links.evaluate_all("all => all.map(a => a.href)")
    context.close()
    return [urlsplit(href).path for href in hrefs]


@pytest.mark.parametrize("query, page", [
    ("code letter", "calculators/motor-current/"),
    ("GFCI", "calculators/gfci-check/"),
    ("voltage drop", "calculators/voltage-drop/"),
    ("kVA", "calculators/transformer-size/"),
])
def test_a_technician_s_words_find_the_calculator(browser, site, query, page):
    assert any(href.endswith(page) for href in _results(browser, site, query))


def test_a_word_kept_only_in_the_words_field_is_found(browser, built_site, site):
    index = json.loads((built_site / slim.SEARCH_INDEX_FILE).read_text(encoding="utf-8"))
    shown = " ".join(doc["title"] + " " + doc["text"] for doc in index["docs"]).lower()
    # a word of one calculator page that no title or lead anywhere holds
    page, word = next((doc["location"], word) for doc in index["docs"]
                      if doc["location"].startswith("calculators/")
                      for word in doc.get(slim.WORDS_FIELD, "").split()
                      if word.isalpha() and len(word) > 6 and word.lower() not in shown)
    assert any(href.endswith(slim.page_of(page)) for href in _results(browser, site, word))
