"""Issue 12 on the build side: fewer shipped bytes for the same pages and code, the shared list
of conductor sizes, and the "not found" page that finds the site's root."""

import ast
import json
import re
import struct
import zlib

import pytest

from build import forms, hooks, make_icons, not_found, package_calc, paths, slim
from calc import units
from calc.calculators import CALCULATORS


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


FULL_INDEX = {
    "config": {"lang": ["en"], "separator": r"[\s\-]+", "pipeline": ["stopWordFilter"],
               "fields": {"title": {"boost": 1000.0}, "text": {"boost": 1.0}}},
    "docs": [
        {"location": "calculators/motor-current/", "title": "Motor current",
         "text": "<p>How many amps does this motor draw? The code letter of the nameplate "
                 "gives the locked-rotor kVA.</p>" + "<p>Locked-rotor kVA per hp, by code letter.</p>" * 20},
        {"location": "calculators/motor-current/#notes", "title": "Notes",
         "text": "<p>See the motor's own nameplate. " + "Its amps -&gt; the breaker; NEMA frames, code letter. " * 4 + "</p>"},
        {"location": "reference/motors/", "title": "Motors", "text": "<p>Code letters.</p>"},
    ],
}


def _page_words(index):
    words = {}
    for doc in index["docs"]:
        text = " ".join(doc.get(field, "") for field in ("title", "text", slim.WORDS_FIELD))
        words.setdefault(slim.page_of(doc["location"]), set()).update(
            key for key, _ in slim.search_words(slim.plain_text(text)))
    return words


def test_the_lean_search_index_keeps_every_word_of_every_page_once():
    lean = slim.lean_search_index(FULL_INDEX)
    assert _page_words(lean) == _page_words(FULL_INDEX)
    assert [d["location"] for d in lean["docs"]] == [d["location"] for d in FULL_INDEX["docs"]]
    assert [d["title"] for d in lean["docs"]] == [d["title"] for d in FULL_INDEX["docs"]]
    first, notes, _ = lean["docs"]
    assert first["text"] == "How many amps does this motor draw?"  # the lead: first sentence
    assert notes["text"] == "See the motor's own nameplate."
    first_words, notes_words = first[slim.WORDS_FIELD].split(), notes[slim.WORDS_FIELD].split()
    assert "gives" in first_words and "nameplate" not in first_words  # a lead of the page has it
    assert "letter" in first_words and "letter" not in notes_words  # once a page
    assert "amps" not in notes_words and "Amps" not in notes_words  # the first lead has it
    assert "NEMA" in notes_words and "&gt" not in notes[slim.WORDS_FIELD]
    assert lean["config"]["fields"][slim.WORDS_FIELD] == FULL_INDEX["config"]["fields"]["text"]
    assert len(json.dumps(lean)) < 0.5 * len(json.dumps(FULL_INDEX))


def test_a_lead_without_an_early_sentence_end_is_cut_at_a_word():
    text = "word " * 100
    cut = slim.lead(f"<p>{text}</p>")
    assert cut.endswith(" …") and len(cut) <= slim.LEAD_CHARS + 2 and "  " not in cut
    assert slim.lead("<p>Short <code>text</code>.</p>") == "Short text."


def test_the_built_search_index_is_lean(built_site):
    index = json.loads((built_site / slim.SEARCH_INDEX_FILE).read_text(encoding="utf-8"))
    assert slim.WORDS_FIELD in index["config"]["fields"]
    assert all(len(doc["text"]) <= slim.LEAD_CHARS + 2 and "<" not in doc["text"] for doc in index["docs"])
    locations = {doc["location"] for doc in index["docs"]}
    assert {f"calculators/{c.id}/" for c in CALCULATORS} <= locations


def _png(rows, filter_type):
    """An RGBA PNG of `rows` (lists of 4-byte pixels), every row stored with `filter_type` 1 (Sub)."""
    lines = b""
    for row in rows:
        flat = b"".join(row)
        lines += bytes([filter_type]) + bytes((flat[x] - (flat[x - 4] if x >= 4 else 0)) & 0xFF
                                              for x in range(len(flat)))
    header = struct.pack(">IIBBBBB", len(rows[0]), len(rows), 8, 6, 0, 0, 0)
    return (make_icons.PNG_SIGNATURE + make_icons._chunk(b"IHDR", header)
            + make_icons._chunk(b"IDAT", zlib.compress(lines, 1)) + make_icons._chunk(b"IEND", b""))


def test_icons_are_stored_again_with_the_same_pixels_and_fewer_bytes():
    teal, clear = b"\x0d\x3b\x45\xff", b"\x00\x00\x00\x00"
    rows = [[teal if (x - 16) ** 2 + (y - 16) ** 2 < 100 else clear for x in range(32)] for y in range(32)]
    original = _png(rows, 1)
    shrunk = make_icons.shrink_png(original)
    assert len(shrunk) < len(original)
    assert make_icons.png_pixels(shrunk) == make_icons.png_pixels(original)
    assert make_icons.png_pixels(original)[1][16] == b"".join(rows[16])  # the decoder itself
    with pytest.raises(ValueError, match="8-bit"):
        make_icons.png_pixels(original.replace(b"\x08\x06", b"\x10\x06", 1))


@pytest.mark.parametrize("name", ["favicon.png", "icon-192.png", "apple-touch-icon.png"])
def test_the_committed_icons_are_stored_small(name):
    data = (make_icons.ICONS / name).read_bytes()
    assert make_icons.shrink_png(data) == data  # nothing left to gain: make_icons.py stored it
