"""Playwright for Python driving Debian's Chromium (no browser download is possible here)."""

import shutil

import pytest

CHROMIUM = shutil.which("chromium") or "/usr/bin/chromium"
CHROMIUM_ARGS = [
    "--disable-gpu",
    "--disable-background-networking",  # the closed network refuses Chromium's own calls
    "--disable-component-update",
    "--disable-sync",
    "--no-first-run",
]
ENGINE_TIMEOUT_MS = 60000  # Pyodide boots in 2-4 s here; generous for a loaded CI machine


def pytest_collection_modifyitems(items):
    for item in items:
        if "tests/browser/" in str(item.fspath).replace("\\", "/"):
            item.add_marker(pytest.mark.browser)


@pytest.fixture(scope="session")
def browser():
    sync_api = pytest.importorskip("playwright.sync_api")
    with sync_api.sync_playwright() as playwright:
        launched = playwright.chromium.launch(executable_path=CHROMIUM, args=CHROMIUM_ARGS)
        yield launched
        launched.close()


@pytest.fixture
def context(browser):
    ctx = browser.new_context(viewport={"width": 360, "height": 780})
    ctx.set_default_timeout(ENGINE_TIMEOUT_MS)
    yield ctx
    ctx.close()


def wait_done(page, index=0):
    page.wait_for_selector(f'[data-calculator][data-index="{index}"][data-state="done"]')


def output(page, name):
    return page.text_content(f'[data-output="{name}"]')
