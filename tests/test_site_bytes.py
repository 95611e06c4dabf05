"""Issue 12 on the build side: fewer shipped bytes for the same pages and code, the shared list
of conductor sizes, and the "not found" page that finds the site's root."""

import ast
import json
import re

import pytest

from build import forms, hooks, not_found, package_calc, paths, slim
from calc import units


def test_whitespace_collapses_outside_pre_and_scripts():
    html = ("<div>\n    <p>a   b</p>\n\n   </div><pre>x\n    y</pre><script>if (a)\n  b()</script>"
            "<textarea>one\n   two</textarea>")
    assert slim.collapse_whitespace(html) == (
        "<div>\n<p>a   b</p>\n</div><pre>x\n    y</pre><script>if (a)\n  b()</script>"
        "<textarea>one\n   two</textarea>")


def test_long_tables_leave_the_search_index_and_cells_lose_their_styles():
    rows = "".join(f'<tr><td style="text-align: left;">{n}</td><td style="text-align: right;">'
                   f"{n}.0</td></tr>" for n in range(slim.SEARCHED_TABLE_ROWS + 1))
    long_table = f"<table><thead><tr><th>n</th></tr></thead>{rows}</table>"
    short_table = "<table><tr><th>n</th></tr><tr><td>1</td></tr></table>"
    marked = slim.exclude_long_tables(long_table + short_table)
    assert marked.count("<table data-search-exclude>") == 1 and "<table><tr>" in marked
    compact = slim.compact_cells(long_table)
    assert 'style="' not in compact and compact.count('<td class="fb-r">') == slim.SEARCHED_TABLE_ROWS + 1


def test_the_shipped_calc_is_the_same_code_without_docstrings():
    source = (paths.CALC_DIR / "units.py").read_text(encoding="utf-8")
    shipped = package_calc.shipped_source(source).decode("utf-8")
    assert len(shipped) < 0.75 * len(source)
    assert '"""' not in shipped.split("\n", 1)[0]  # the module docstring is gone
    names = {n.name for n in ast.walk(ast.parse(source)) if isinstance(n, ast.FunctionDef)}
    assert names == {n.name for n in ast.walk(ast.parse(shipped)) if isinstance(n, ast.FunctionDef)}


def test_a_function_that_was_only_a_docstring_still_parses():
    shipped = package_calc.shipped_source('def f():\n    """Only words."""\n').decode("utf-8")
    assert shipped.strip() == "def f():\n    pass"


def test_uplot_ships_minified_as_a_module():
    for source, (_, name) in paths.VENDOR_MODULES.items():
        text = hooks.vendor_module(source, name)
        assert text.rstrip().endswith(f"export default {name};")
        assert len(text) < 0.4 * (paths.NODE_MODULES / "uplot/dist/uPlot.esm.js").stat().st_size


def test_the_shared_size_list_is_calc_units_list():
    text = forms.sizes_module()
    groups = json.loads(re.search(r"SIZE_GROUPS = (\[.*\]);", text).group(1))
    assert [s for g in groups for s in g["sizes"]] == list(units.SIZES)
    assert {g["system"] for g in groups} == set(units.DISPLAY_SYSTEMS)


def test_a_size_field_ships_its_chosen_size_only():
    html = forms.render_calculator("voltage-drop", _config())
    select = re.search(r'<select id="fb0-size".*?</select>', html).group(0)
    assert select.count("<option") == 1 and "data-sizes" in select


def _config():
    from build import team
    return team.TeamConfig()


PAGE = """<!doctype html><html><head><meta charset="utf-8"><link rel="stylesheet" href="/assets/a.css">
<script>__md_scope=new URL("/",location)</script></head><body><a href="/.">Home</a>
<a href="/calculators/x/">x</a><a href="https://example.org/">out</a><img src="/assets/i.svg">
<script id="__config" type="application/json">{"base": "/", "search": "/assets/s.js"}</script>
<script src="/assets/b.js"></script></body></html>"""


def test_the_not_found_page_links_from_the_root_it_finds():
    html = not_found.rebase(PAGE)
    assert not re.search(r'(href|src)="/(?!/)', html)  # nothing root-absolute is left
    assert 'href="assets/a.css"' in html and 'href="./"' in html and 'src="assets/b.js"' in html
    assert 'href="https://example.org/"' in html
    head = html.index("<head>")
    assert html.index(not_found.FIND_ROOT) < html.index('rel="stylesheet"')  # base before styles
    assert html.index("<meta charset") < html.index(not_found.FIND_ROOT) and head >= 0
    assert 'new URL(".",document.baseURI)' in html
    assert html.index(not_found.FIX_CONFIG) < html.index('src="assets/b.js"')


def test_a_changed_theme_page_stops_the_build():
    with pytest.raises(not_found.NotFoundPageError, match="changed shape"):
        not_found.rebase("<html><head></head></html>")
