"""WCAG 2.2 AA on every page of the built site, checked in Chromium (issue 15).

axe-core comes from npm (pinned in package.json, a devDependency): Playwright injects it into
the page under test; it is never part of the built site. Every page, in both colour schemes, at
360 x 780 and 1280 x 900; each calculator after its first result and again with an error
showing. No violation of impact "serious" or "critical" of the WCAG 2.0/2.1/2.2 A and AA rules
may remain. Beside axe: a keyboard-only calculation, focus in sight at every Tab stop, 44 px
targets, reduced motion, and the screen-reader hooks of a calculator (labels with units, errors
tied to fields, live regions, chart text).

One browser context per scheme and size, one tab reused for every page, so the engine's memory
snapshot makes each calculator page start in well under a second after the first.
"""

import collections
import json
import os
import re
import time
from concurrent.futures import ThreadPoolExecutor
from urllib.parse import urlsplit

import pytest
from playwright.sync_api import expect, sync_playwright

from tests.browser.conftest import CHROMIUM, CHROMIUM_ARGS, ENGINE_TIMEOUT_MS, wait_done
from tests.conftest import ROOT, serving

AXE = ROOT / "node_modules" / "axe-core" / "axe.min.js"
WCAG_TAGS = ["wcag2a", "wcag2aa", "wcag21a", "wcag21aa", "wcag22aa"]
BLOCKING = ("serious", "critical")
SCHEMES = ["light", "dark"]
SCHEME_NAMES = {"light": "default", "dark": "slate"}  # Material's names for them
SIZES = [{"width": 360, "height": 780}, {"width": 1280, "height": 900}]
# Let the layout follow (two frames), then every running transition end: axe reads colours as
# they are drawn, and a half-faded navigation drawer is no colour a user reads.
SETTLE = """async () => {
  await new Promise((done) => requestAnimationFrame(() => requestAnimationFrame(done)));
  await Promise.all(document.getAnimations().filter((a) => a.effect?.getTiming().iterations !== Infinity)
    .map((a) => a.finished.catch(() => null)));
}"""
PAGE = "calculators/transformer-currents/"
BAD_VALUE = "twelve furlongs"  # refused by every quantity field: an error showing

AXE_RUN = """async ([context, tags]) => {
  const result = await axe.run(context || document, {
    runOnly: {type: "tag", values: tags}, resultTypes: ["violations"]});
  return result.violations.map((v) => ({id: v.id, impact: v.impact, help: v.help,
    nodes: v.nodes.map((n) => ({target: n.target.join(" "),
                                 summary: (n.failureSummary || "").split("\\n").slice(1).join(" ")}))}));
}"""


def built_pages(site_dir):
    """Every HTML page of the built site as a URL path: home, calculators, reference, jobs..."""
    pages = []
    for html in sorted(site_dir.rglob("*.html")):
        relative = html.relative_to(site_dir).as_posix()
        if relative.startswith("assets/"):
            continue
        pages.append(relative.removesuffix("index.html"))
    return pages


@pytest.fixture(scope="module")
def site(built_site):
    with serving(built_site) as (base, _):
        yield base


def test_axe_core_is_pinned_for_the_tests_only(built_site):
    package = json.loads((ROOT / "package.json").read_text(encoding="utf-8"))
    assert package["devDependencies"]["axe-core"][0].isdigit()  # an exact version, no range
    assert "axe-core" not in package.get("dependencies", {})
    assert AXE.exists(), "node_modules/axe-core is missing: run npm ci"
    shipped = [p for p in built_site.rglob("*") if "axe" in p.name.lower()]
    assert not shipped, shipped  # never part of the site


def test_the_site_has_the_pages_the_audit_walks(built_site):
    pages = built_pages(built_site)
    assert "" in pages and "jobs/" in pages and "safety/" in pages
    assert sum(p.startswith("calculators/") for p in pages) >= 22
    assert sum(p.startswith("reference/") for p in pages) >= 5


def _axe(page, context=None):
    if not page.evaluate("typeof window.axe !== 'undefined'"):
        page.add_script_tag(path=str(AXE))
    return page.evaluate(AXE_RUN, [context, WCAG_TAGS])


def _blocking(violations, where, found):
    for violation in violations:
        if violation["impact"] in BLOCKING:
            for node in violation["nodes"]:
                found.append(f"{violation['id']} ({violation['impact']}) on {where}: "
                             f"{node['target']} — {node['summary'][:240]}")


def _show_an_error(page):
    """Type a refused value into the calculator's first quantity field; wait for its message."""
    field = page.locator('[data-calculator][data-index="0"] .fb-form input[data-unit]').first
    field.fill(BAD_VALUE)
    page.wait_for_selector('[data-calculator][data-index="0"][data-state="error"]')
    expect(page.locator('[data-calculator][data-index="0"] .fb-field__msg:visible').first).not_to_be_empty()


def _open(page, site, path):
    """Go to a page the way a user moves on: by a link, so Material's instant navigation swaps
    the content and the calculator engine stays booted. Waits until our page set-up has run."""
    target = urlsplit(site + path).path
    page.evaluate(MARK_STALE)
    if urlsplit(page.url).path == target:
        page.reload()  # a link to the page itself would not swap anything
    else:
        page.evaluate(CLICK_LINK, site + path)
    page.wait_for_selector('[data-md-component="container"]:not([data-fb-stale])', state="attached")
    page.wait_for_selector(f'html[data-fb-page="{target}"]', state="attached")


MARK_STALE = "document.querySelector('[data-md-component=\"container\"]').dataset.fbStale = '1'"
CLICK_LINK = """(url) => {
  const link = document.createElement("a");
  link.href = url;
  document.body.append(link);
  link.click();
  link.remove();
}"""


def _walk(site, pages, scheme):
    """Every page in one scheme, each at both sizes in turn; its own Chromium (one a thread).

    One context and one tab for the whole walk, so each calculator computes once a scheme and
    the engine boots once. axe is injected as a script tag, which the site's own CSP (rightly)
    refuses: the CSP is bypassed here only.
    """
    found, timings, checked = [], [], 0
    outside_nav = [p for p in pages if p.endswith(".html")]  # 404.html: not in the sitemap
    with sync_playwright() as playwright:
        browser = playwright.chromium.launch(executable_path=CHROMIUM, args=CHROMIUM_ARGS)
        context = browser.new_context(viewport=SIZES[0], color_scheme=scheme, bypass_csp=True)
        context.set_default_timeout(ENGINE_TIMEOUT_MS)
        page = context.new_page()

        def check(path, state, context_selector=None):
            nonlocal checked
            for size in SIZES:
                page.set_viewport_size(size)
                page.evaluate(SETTLE)
                where = f"{path or 'home'} ({scheme}, {size['width']} px{', ' + state if state else ''})"
                _blocking(_axe(page, context_selector), where, found)
                checked += 1

        try:
            page.goto(site)
            page.wait_for_selector('html[data-offline="stored"]')
            page.reload()  # now the service worker serves the sitemap: links move instantly
            for path in [p for p in pages if p not in outside_nav] + outside_nav:
                started = time.monotonic()
                if path in outside_nav:
                    page.goto(site + path)
                else:
                    _open(page, site, path)
                assert page.evaluate("document.body.dataset.mdColorScheme") == SCHEME_NAMES[scheme]
                if page.locator("[data-calculator]").count():
                    wait_done(page)
                    check(path, "first result")
                    _show_an_error(page)
                    check(path, "error showing", '[data-calculator][data-index="0"]')
                else:
                    check(path, "")
                timings.append((time.monotonic() - started, path))
        finally:
            browser.close()
    slowest = ", ".join(f"{p or 'home'} {t:.1f} s" for t, p in sorted(timings, reverse=True)[:3])
    print(f"axe, {scheme} scheme: {len(timings)} pages, {checked} checks in "
          f"{sum(t for t, _ in timings):.0f} s (slowest: {slowest})")
    return found, len(timings)


def test_no_serious_wcag_violation_on_any_page(built_site, site):
    pages = built_pages(built_site)
    only = os.environ.get("FLUXBOOK_A11Y_ONLY")  # "calculators/voltage-drop/,jobs/" while mending
    if only:
        pages = [p for p in pages if p in only.split(",")]
    # The two schemes walk side by side, one Chromium each: axe is the slow part, one core each.
    with ThreadPoolExecutor(max_workers=len(SCHEMES)) as pool:
        walks = list(pool.map(lambda scheme: _walk(site, pages, scheme), SCHEMES))
    found = [line for lines, _ in walks for line in lines]
    assert [walked for _, walked in walks] == [len(pages)] * len(SCHEMES)
    by_rule = collections.Counter(line.split(" ", 1)[0] for line in found)
    assert not found, (f"{len(found)} serious or critical WCAG violations ({dict(by_rule)}):\n"
                       + "\n".join(found))


# --- keyboard, focus, targets, motion ------------------------------------------------------------

FOCUS = """() => {
  const el = document.activeElement;
  if (!el || el === document.body) return null;
  // The theme's colour switch is a 0-size radio: its label shows the ring.
  const shown = el.matches(".md-option") ? el.nextElementSibling : el;
  const style = getComputedStyle(shown);
  const box = shown.getBoundingClientRect();
  const ring = style.outlineStyle !== "none" && parseFloat(style.outlineWidth) >= 2;
  const inView = box.width > 0 && box.height > 0 && box.bottom > 0 && box.right > 0
    && box.top < innerHeight && box.left < innerWidth;
  // the middle of the part of it on the screen
  const x = (Math.max(box.left, 0) + Math.min(box.right, innerWidth)) / 2;
  const y = (Math.max(box.top, 0) + Math.min(box.bottom, innerHeight)) / 2;
  const top = document.elementFromPoint(x, y);
  const uncovered = !!top && (shown.contains(top) || top.contains(shown)
    || [...(el.labels || [])].some((label) => label.contains(top)));
  return {name: el.getAttribute("name") || "", tag: el.tagName.toLowerCase(), ring, inView, uncovered,
          cover: top && !uncovered ? top.tagName.toLowerCase() + "." + top.className : "",
          text: (el.getAttribute("aria-label") || el.textContent || el.value || "").trim().slice(0, 40)};
}"""


def _tab(page, backwards=False):
    page.keyboard.press("Shift+Tab" if backwards else "Tab")
    page.evaluate(SETTLE)  # a drawer or search panel closing has finished moving
    return page.evaluate(FOCUS)


def _hidden_focus(stop):
    return stop and not (stop["ring"] and stop["inView"] and stop["uncovered"])


@pytest.mark.parametrize("width,height", [(s["width"], s["height"]) for s in SIZES])
def test_a_calculation_by_keyboard_alone_with_focus_always_in_sight(browser, site, width, height):
    context = browser.new_context(viewport={"width": width, "height": height})  # the site's own CSP
    context.set_default_timeout(ENGINE_TIMEOUT_MS)
    try:
        page = context.new_page()
        page.goto(site + PAGE)
        wait_done(page)
        stops = []
        for _ in range(80):  # reach the first field with Tab alone
            stops.append(_tab(page))
            if stops[-1] and stops[-1]["name"] == "kva":
                break
        assert stops[-1]["name"] == "kva", stops
        assert stops[0]["text"] == "Skip to content", stops[0]  # the first stop skips the menus
        page.evaluate("document.querySelector('.fb-form').addEventListener('submit', "
                      "() => { window.fbSubmits = (window.fbSubmits || 0) + 1; })")
        page.keyboard.type("150 kVA")  # Tab selected the old value: typing replaces it
        page.keyboard.press("Enter")
        expect(page.locator('[data-output="secondary_a"]')).to_have_text("416 A")  # 150 kVA, √3 × 208 V
        assert page.evaluate("window.fbSubmits") == 1  # Enter computed at once
        assert page.url.startswith(site + PAGE)  # and did not leave the page
        # On through the rest of the page, and back: every stop shows where focus is.
        for _ in range(150):
            stop = _tab(page)
            stops.append(stop)
            if stop is None or stop["text"] == "Skip to content":
                break
        stops += [_tab(page, backwards=True) for _ in range(10)]
        hidden = [stop for stop in stops if _hidden_focus(stop)]
        assert not hidden, f"{len(hidden)} Tab stops without a visible focus ring in view: {hidden}"
        tags = {stop["tag"] for stop in stops if stop}
        assert {"input", "select", "button", "summary", "a"} <= tags, tags  # the walk covered them
    finally:
        context.close()


def test_the_menu_drawer_opens_from_the_keyboard_on_a_phone(context, site):
    page = context.new_page()  # 360 x 780: the navigation is a drawer
    page.goto(site + "safety/")
    page.locator('.md-header label[for="__drawer"]').focus()
    assert page.evaluate(FOCUS)["ring"]
    expect(page.locator('.md-header label[for="__drawer"]')).to_have_attribute("aria-expanded", "false")
    page.keyboard.press("Enter")
    expect(page.locator('.md-header label[for="__drawer"]')).to_have_attribute("aria-expanded", "true")
    page.evaluate(SETTLE)
    stop = page.evaluate(FOCUS)
    assert stop["tag"] == "a" and not _hidden_focus(stop), stop  # focus went into the open drawer
    for _ in range(8):  # on to the Calculators section, never onto anything hidden behind it
        stop = _tab(page)
        assert not _hidden_focus(stop), stop
        if stop["text"].startswith("Calculators"):
            break
    assert stop["text"].startswith("Calculators"), stop  # a section a keyboard can open
    section = page.locator('.md-sidebar--primary label.md-nav__link[data-fb-section]').first
    expect(section).to_have_attribute("aria-expanded", "false")
    page.keyboard.press("Enter")
    expect(section).to_have_attribute("aria-expanded", "true")
    page.evaluate(SETTLE)
    stop = _tab(page)
    assert not _hidden_focus(stop), stop  # into the opened section
    page.keyboard.press("Escape")
    expect(page.locator('.md-header label[for="__drawer"]')).to_have_attribute("aria-expanded", "false")
    assert page.evaluate("document.activeElement.getAttribute('for')") == "__drawer"


TARGETS = """() => {
  const small = [];
  const controls = document.querySelectorAll(
    "a[href], button, input:not([type=hidden]), select, textarea, summary, [role=button], [tabindex='0']");
  for (const el of controls) {
    if (el.closest("[hidden], [aria-hidden=true]")) continue;
    const style = getComputedStyle(el);
    if (style.visibility === "hidden" || style.display === "none" || Number(style.opacity) === 0) continue;
    // A radio or check box is tapped through its label, a link in a sentence is exempt (WCAG 2.5.8).
    const target = el.matches("input[type=radio], input[type=checkbox]") && el.closest("label") || el;
    if (el.matches(".md-option")) continue;  // the theme's 0-size colour radio: its label is the target
    if (el.matches("a") && style.display === "inline" && el.parentElement.closest("p, li, td, th, dd")) continue;
    const box = target.getBoundingClientRect();
    if (!box.width || !box.height || box.right <= 0 || box.left >= innerWidth) continue;
    if (box.width < 44 || box.height < 44) {
      small.push(`${el.tagName.toLowerCase()}.${el.className} "${(el.textContent || el.name || "").trim().slice(0, 30)}" ${Math.round(box.width)}x${Math.round(box.height)}`);
    }
  }
  return small;
}"""


@pytest.mark.parametrize("width,height", [(s["width"], s["height"]) for s in SIZES])
def test_every_target_is_at_least_44_px(browser, site, width, height):
    context = browser.new_context(viewport={"width": width, "height": height})
    context.set_default_timeout(ENGINE_TIMEOUT_MS)
    small = []
    try:
        page = context.new_page()
        for path in ["", "calculators/voltage-drop/", "reference/conductors/", "jobs/", "safety/"]:
            page.goto(site + path)
            if page.locator("[data-calculator]").count():
                wait_done(page)
                page.locator("details.fb-more > summary").first.click()  # the folded fields too
            small += [f"{path or 'home'}: {item}" for item in page.evaluate(TARGETS)]
    finally:
        context.close()
    assert not small, f"{len(small)} targets under 44 px at {width} px:\n" + "\n".join(small)


def test_motion_stops_for_those_who_ask(browser, site):
    context = browser.new_context(viewport={"width": 360, "height": 780}, reduced_motion="reduce")
    context.set_default_timeout(ENGINE_TIMEOUT_MS)
    moving = """() => [...document.querySelectorAll("*")].filter((el) => {
      const style = getComputedStyle(el);
      const longest = (list) => Math.max(...list.split(",").map((t) => parseFloat(t) * (t.trim().endsWith("ms") ? 1 : 1000)));
      return longest(style.transitionDuration) > 1 || (style.animationName !== "none" && longest(style.animationDuration) > 1)
        || style.scrollBehavior === "smooth";
    }).map((el) => el.tagName.toLowerCase() + "." + el.className).slice(0, 10)"""
    try:
        page = context.new_page()
        page.goto(site + "calculators/voltage-drop/")
        wait_done(page)
        assert page.evaluate(moving) == []
    finally:
        context.close()
    context = browser.new_context(viewport={"width": 360, "height": 780})  # and the check can fail
    try:
        page = context.new_page()
        page.goto(site + "safety/")
        assert page.evaluate(moving) != []
    finally:
        context.close()


# --- what a screen reader is told ------------------------------------------------------------------

def test_tables_that_scroll_sideways_are_named_regions_a_keyboard_can_scroll(context, site):
    page = context.new_page()  # 360 px: the conductor tables are wider than the screen
    page.goto(site + "reference/conductors/")
    page.wait_for_selector("html[data-fb-page]", state="attached")
    regions = page.locator(".md-typeset__scrollwrap")
    assert regions.count() >= 5
    scrolling = 0
    for i in range(regions.count()):
        region = regions.nth(i)
        wide = region.evaluate("el => el.scrollWidth > el.clientWidth + 1")
        assert (region.get_attribute("tabindex") == "0") == wide
        if wide:
            scrolling += 1
            assert region.get_attribute("role") == "region"
            assert region.get_attribute("aria-label").startswith("Table: ")
            assert len(region.get_attribute("aria-label")) > len("Table:  (scrolls sideways)")
    assert scrolling >= 5
    first = page.locator('.md-typeset__scrollwrap[tabindex="0"]').first
    first.focus()
    page.keyboard.press("ArrowRight")
    page.keyboard.press("ArrowRight")
    expect(first).not_to_have_js_property("scrollLeft", 0)


def test_a_calculator_tells_a_screen_reader_what_it_shows(context, site):
    page = context.new_page()
    page.goto(site + "calculators/voltage-drop/")
    wait_done(page)
    root = page.locator('[data-calculator="voltage-drop"]')
    # The engine's status and the answer are polite live regions: announced, focus left alone.
    assert root.locator(".fb-engine").get_attribute("aria-live") == "polite"
    summary = root.locator("[data-summary]")
    assert summary.count() == 1, "the answer-first summary [data-summary] (issue 12) is missing"
    assert summary.get_attribute("aria-live") == "polite"
    assert root.locator(".fb-result").get_attribute("aria-live") is None  # not the whole result too
    # Every field is labelled, and the label says the unit.
    fields = root.locator(".fb-form [name]:not([type=radio])")
    for i in range(fields.count()):
        field = fields.nth(i)
        label = field.evaluate("el => el.labels.length ? el.labels[0].textContent.trim() : ''")
        assert label, field.get_attribute("name")
        unit = field.evaluate("el => el.labels[0].querySelector('.fb-field__unit')?.textContent.trim() || ''")
        if field.get_attribute("data-unit"):
            assert unit and label.endswith(unit), (field.get_attribute("name"), label)
    # The folded fields: a disclosure the keyboard opens (its state is the element's own).
    fold = root.locator("details.fb-more")
    fold.locator("summary").focus()
    page.keyboard.press("Enter")
    expect(fold).to_have_js_property("open", True)
    # An error is tied to its field.
    field = root.locator('[name="length"]')
    field.fill(BAD_VALUE)
    page.wait_for_selector('[data-calculator="voltage-drop"][data-state="error"]')
    assert field.get_attribute("aria-invalid") == "true"
    message = root.locator('.fb-field[data-field="length"] .fb-field__msg')
    expect(message).to_be_visible()
    assert message.get_attribute("id") in field.get_attribute("aria-describedby").split()
    expect(field).to_have_accessible_description(re.compile(re.escape(message.text_content().strip()[:20])))
    # Verdicts carry words, not colour alone.
    field.fill("100 ft")
    wait_done(page)
    for badge in root.locator(".fb-check__badge").all_text_contents():
        assert badge.strip() in ("OK", "Check", "Not OK"), badge
    # Charts: the key numbers in text beside each one, in the units the axes show.
    keys = root.locator(".fb-chart .fb-chart__key")
    expect(keys).to_have_count(root.locator(".fb-chart").count())
    expect(keys.first).to_contain_text("This run at one-way length 100 ft")
    expect(keys.first).to_contain_text("3 % limit")
