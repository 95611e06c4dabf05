"""Every registered calculator has a page, a test file and reference vectors (one registry feeds all)."""

import json

import pytest

from build import embed, paths
from calc import api

ROOT = paths.ROOT
# Suites that touch every calculator through the registry: they do not count as its tests.
GENERIC_TESTS = {"test_api.py", "test_completeness.py", "test_layout.py", "test_vectors.py",
                 "test_pyodide.py", "test_build.py", "test_docstrings.py", "test_reference.py"}


@pytest.mark.parametrize("calculator_id", list(api.REGISTRY))
def test_calculator_has_a_page_with_its_block(calculator_id):
    page = ROOT / "site_src" / "calculators" / f"{calculator_id}.md"
    assert page.exists(), f"add {page.relative_to(ROOT)}"
    blocks = embed.parse_blocks(page.read_text(encoding="utf-8"), page.name)
    assert [b[2] for b in blocks] == [calculator_id]


@pytest.mark.parametrize("calculator_id", list(api.REGISTRY))
def test_calculator_has_vectors_with_results_and_errors(calculator_id):
    path = ROOT / "tests" / "vectors" / f"{calculator_id}.json"
    data = json.loads(path.read_text(encoding="utf-8"))
    assert data["calculator"] == calculator_id
    assert any("expect" in v for v in data["vectors"]) and any("errors" in v for v in data["vectors"])


@pytest.mark.parametrize("calculator_id", list(api.REGISTRY))
def test_calculator_has_its_own_tests(calculator_id):
    """A domain test file (tests/test_<domain>.py) runs the calculator by its id."""
    quoted = (f'"{calculator_id}"', f"'{calculator_id}'")
    files = [p for p in (ROOT / "tests").glob("test_*.py") if p.name not in GENERIC_TESTS]
    assert any(q in p.read_text(encoding="utf-8") for p in files for q in quoted), (
        f"no tests/test_<domain>.py runs {calculator_id!r}")


def test_every_calculator_page_is_in_the_navigation():
    config = (ROOT / "mkdocs.yml").read_text(encoding="utf-8")
    for calculator_id in api.REGISTRY:
        assert f"calculators/{calculator_id}.md" in config
