"""Every registered calculator has a page, a test file and reference vectors (one registry feeds all)."""

import json

import pytest

from build import embed, paths
from calc import api

ROOT = paths.ROOT
MODULE_OF = {calculator.id: calculator.compute.__module__.split(".")[-1] for calculator in api.REGISTRY.values()}


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
def test_calculator_module_has_a_test_file(calculator_id):
    path = ROOT / "tests" / f"test_{MODULE_OF[calculator_id]}.py"
    assert path.exists() and calculator_id in path.read_text(encoding="utf-8")


def test_every_calculator_page_is_in_the_navigation():
    config = (ROOT / "mkdocs.yml").read_text(encoding="utf-8")
    for calculator_id in api.REGISTRY:
        assert f"calculators/{calculator_id}.md" in config
