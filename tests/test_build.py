"""The build pipeline: team settings, the embedding block, forms, the zip, the precache, the headers."""

import base64
import gzip
import hashlib
import json
import re
import zipfile
from io import BytesIO
from pathlib import Path

import pytest

from build import embed, forms, package_calc, packed, paths, release_files, team, theme_later
from calc import api

ROOT = paths.ROOT


# ---- team settings ------------------------------------------------------------------------

def test_missing_team_file_gives_north_american_defaults(tmp_path, monkeypatch):
    monkeypatch.delenv(paths.TEAM_FILE_ENV, raising=False)
    config = team.load(tmp_path / "absent.yml")
    assert config.region == "na" and config.voltage_drop == {"branch_pct": 3.0, "total_pct": 5.0}


def test_shipped_team_file_is_valid():
    assert team.load(paths.TEAM_FILE).region in team.REGIONS


def test_iec_region_changes_defaults_and_voltages():
    config = team.parse({"region": "iec"})
    item = api.get("transformer-currents").input("secondary_v")
    assert config.input_default("transformer-currents", item) == 400
    assert 230 in config.system_voltages and config.voltage_drop["other_pct"] == 5.0


def test_team_defaults_beat_region_defaults():
    config = team.parse({"region": "iec", "defaults": {"transformer-currents": {"kva": "630 kVA"}}})
    assert config.input_default("transformer-currents", api.get("transformer-currents").input("kva")) == "630 kVA"


@pytest.mark.parametrize("data, words", [
    ({"regoin": "na"}, "unknown setting 'regoin'"),
    ({"region": "eu"}, "region 'eu' is not one of"),
    ({"system_voltages": []}, "system_voltages"),
    ({"system_voltages": [480, -5]}, "system_voltages is -5"),
    ({"voltage_drop": {"branch_pct": 50}}, "voltage_drop.branch_pct is 50"),
    ({"region": "iec", "voltage_drop": {"branch_pct": 3}}, "not used in region iec"),
    ({"conductor_temp_c": "hot"}, "conductor_temp_c"),
    ({"organisation": 42}, "organisation must be text"),
    ({"defaults": {"no-such-calc": {}}}, "is not a calculator"),
    ({"defaults": {"transformer-currents": {"kva": "0"}}}, "defaults.transformer-currents.kva"),
    ({"defaults": {"transformer-currents": {"kvaa": 1}}}, "kvaa"),
    (["region", "na"], "expected key: value"),
])
def test_bad_team_settings_stop_with_a_message(data, words):
    with pytest.raises(team.TeamConfigError, match=re.escape(words)):
        team.parse(data, "team.yml")


def test_team_file_that_is_not_yaml(tmp_path):
    bad = tmp_path / "team.yml"
    bad.write_text("region: [na\n", encoding="utf-8")
    with pytest.raises(team.TeamConfigError, match="not valid YAML"):
        team.load(bad)


# ---- the embedding block ------------------------------------------------------------------

PAGE = """# Pump house

```fluxbook transformer-currents
# the pump house unit
kva: 300 kVA

secondary_v: 208 V
```

Text.

````markdown
```fluxbook transformer-currents
kva: 1
```
````
"""


def test_block_is_found_with_its_preset_and_a_shown_example_is_left_alone():
    markdown, blocks = embed.replace_blocks(PAGE, "pump.md")
    assert blocks == [("transformer-currents", {"kva": "300 kVA", "secondary_v": "208 V"})]
    assert markdown.count('data-slot="0"') == 1
    assert "```fluxbook transformer-currents\nkva: 1" in markdown  # inside the longer fence


@pytest.mark.parametrize("block, words", [
    ("```fluxbook nope\n```\n", "pump.md:1: unknown calculator 'nope'"),
    ("```fluxbook transformer-currents\nkva 300\n```\n", "pump.md:2: write one 'name: value'"),
    ("```fluxbook transformer-currents\nkva: 0\n```\n", "pump.md:1: transformer-currents: kva"),
    ("```fluxbook transformer-currents\nvolts: 4\n```\n", "unknown input 'volts'"),
])
def test_bad_blocks_stop_the_build_naming_page_and_line(block, words):
    with pytest.raises(embed.EmbedError, match=re.escape(words)):
        embed.parse_blocks(block, "pump.md")


def test_slots_are_filled_even_when_markdown_wrapped_them():
    html = '<p><div class="fb-slot" data-slot="0"></div></p><div class="fb-slot" data-slot="1"></div>'
    assert embed.fill_slots(html, lambda n: f"[{n}]") == "[0][1]"


# ---- forms --------------------------------------------------------------------------------

def test_form_has_every_input_output_and_hook():
    html = forms.render_calculator("transformer-currents", team.TeamConfig())
    assert 'data-calculator="transformer-currents"' in html and 'data-state="starting"' in html
    for item in api.get("transformer-currents").inputs:
        assert f'name="{item.name}"' in html
    for item in api.get("transformer-currents").outputs:
        assert f'data-output="{item.name}"' in html
    assert 'value="75"' in html and '<option value="3" selected>' in html


def test_form_escapes_preset_text():
    html = forms.render_calculator("transformer-currents", team.TeamConfig(),
                                   preset={"kva": '"><script>alert(1)</script>'})
    assert "<script>" not in html and "&lt;script&gt;" in html


def test_form_offers_the_team_voltages():
    html = forms.render_calculator("transformer-currents", team.parse({"system_voltages": [347, 600]}))
    assert '<option value="347 V">' in html and '<option value="600 V">' in html


# ---- the calc zip -------------------------------------------------------------------------

def test_calc_zip_is_reproducible_and_complete():
    first, second = package_calc.calc_zip_bytes(), package_calc.calc_zip_bytes()
    assert first == second
    names = zipfile.ZipFile(BytesIO(first)).namelist()
    expected = sorted("calc/" + p.relative_to(paths.CALC_DIR).as_posix() for p in package_calc.calc_sources())
    assert names == expected and "calc/api.py" in names
    assert all(info.date_time == package_calc.ZIP_TIMESTAMP for info in zipfile.ZipFile(BytesIO(first)).infolist())


# ---- the built site -----------------------------------------------------------------------

def test_pyodide_pin_matches_package_files():
    lock = json.loads((ROOT / "package-lock.json").read_text(encoding="utf-8"))
    assert lock["packages"]["node_modules/pyodide"]["version"] == paths.PYODIDE_VERSION
    assert json.loads((ROOT / "package.json").read_text())["dependencies"]["pyodide"] == paths.PYODIDE_VERSION


def _precache(site):
    """The site paths available offline: each URL in sw.js's manifest, and each packed file
    whose gzipped twin is there (build/packed.py; sw-unpack.js serves it)."""
    text = (site / paths.SERVICE_WORKER_FILE).read_text(encoding="utf-8")
    urls = set(re.findall(r'url:"([^"]+)"', text))
    return urls | {path for path in packed.read_list(site) if path + packed.SUFFIX in urls}




def test_precache_holds_every_file_the_site_needs(built_site):
    precached = _precache(built_site)
    for name in paths.PYODIDE_FILES:  # including the 9.6 MB wasm and the 2.5 MB stdlib zip
        assert f"{paths.PYODIDE_SITE_DIR}/{name}" in precached
    for needed in (paths.CALC_ZIP_SITE_PATH, "index.html", "calculators/transformer-currents/index.html",
                   "sitemap.xml", "search/search_index.json", "manifest.webmanifest",
                   "assets/js/calc-worker.js", "assets/vendor/uplot/uPlot.esm.min.js",
                   paths.SIZES_JS_SITE_PATH):
        assert needed in precached, needed
    assert paths.SERVER_HEADERS_FILE not in precached


def test_every_shipped_page_asset_is_precached(built_site):
    precached = _precache(built_site)
    for page in built_site.rglob("*.html"):
        text = page.read_text(encoding="utf-8")
        for ref in re.findall(r'(?:src|href)="([^"#?]+)"', text):
            if ref.startswith(("http:", "https:", "mailto:", "data:")) or ref.endswith("/"):
                continue
            target = (page.parent / ref).resolve()
            if target.is_file():
                assert target.relative_to(built_site.resolve()).as_posix() in precached, (page, ref)


def test_no_page_loads_anything_from_another_origin(built_site):
    for page in built_site.rglob("*.html"):
        text = page.read_text(encoding="utf-8")
        assert not re.search(r'<(?:script|link|img|iframe)[^>]+(?:src|href)="(?:https?:)?//', text), page


def test_server_headers_allow_wasm_and_hash_every_inline_script(built_site):
    headers = (built_site / paths.SERVER_HEADERS_FILE).read_text(encoding="utf-8")
    assert "'wasm-unsafe-eval'" in headers and "'unsafe-eval'" not in headers.replace("'wasm-unsafe-eval'", "")
    for digest in release_files.inline_script_hashes(built_site):
        assert digest in headers


def test_checksums_cover_the_shipped_files(built_site):
    lines = (built_site / paths.CHECKSUMS_FILE).read_text(encoding="utf-8").splitlines()
    listed = {line.split("  ", 1)[1] for line in lines}
    assert paths.SERVICE_WORKER_FILE in listed and paths.CALC_ZIP_SITE_PATH in listed


def test_the_same_sources_build_the_same_bytes(built_site, tmp_path):
    from tests.conftest import build_site
    again = tmp_path / "again"
    assert build_site(again).returncode == 0
    assert (again / paths.CALC_ZIP_SITE_PATH).read_bytes() == (built_site / paths.CALC_ZIP_SITE_PATH).read_bytes()
    assert _precache(again) == _precache(built_site)
    for name in ("sitemap.xml", "sitemap.xml.gz"):  # no build date: the same bytes any day
        assert (again / name).read_bytes() == (built_site / name).read_bytes()
    assert "<lastmod>" not in (built_site / "sitemap.xml").read_text(encoding="utf-8")


def test_organisation_from_the_team_file_reaches_the_pages(tmp_path):
    from tests.conftest import build_site
    team_file = tmp_path / "team.yml"
    team_file.write_text("organisation: Dairy Barn Maintenance\nregion: iec\n", encoding="utf-8")
    site = tmp_path / "site"
    assert build_site(site, team_file).returncode == 0
    page = (site / "calculators/transformer-currents/index.html").read_text(encoding="utf-8")
    assert "Fluxbook · Dairy Barn Maintenance" in page
    # a voltage field takes letters ("400 V", "11 kV"): a text keyboard (issue 12)
    assert 'name="secondary_v" type="text" inputmode="text"' in page and 'value="400"' in page


def test_a_bad_team_file_fails_the_build(tmp_path):
    from tests.conftest import build_site
    team_file = tmp_path / "team.yml"
    team_file.write_text("region: mars\n", encoding="utf-8")
    completed = build_site(tmp_path / "site", team_file)
    assert completed.returncode != 0 and "region 'mars' is not one of" in completed.stderr


def test_a_file_too_large_to_precache_fails_the_build(tmp_path):
    from build import service_worker
    (tmp_path / "index.html").write_text("<p>hi</p>", encoding="utf-8")
    (tmp_path / "huge.wasm").write_bytes(b"\0" * (paths.PRECACHE_MAX_FILE_BYTES + 1))
    with pytest.raises(service_worker.ServiceWorkerError, match="huge.wasm"):
        service_worker.generate(tmp_path)


def test_service_worker_waits_for_the_user_and_cleans_old_caches(built_site):
    from build import service_worker
    options = service_worker.workbox_options(built_site)
    assert options["skipWaiting"] is False and options["cleanupOutdatedCaches"] is True
    text = (built_site / paths.SERVICE_WORKER_FILE).read_text(encoding="utf-8")
    assert "SKIP_WAITING" in text  # the page's "reload with the new version" message
    assert re.search(r'revision:"[0-9a-f]+"', text)  # entries are revisioned


def test_team_wide_settings_start_the_matching_fields():
    config = team.parse({"voltage_drop": {"branch_pct": 2.0}, "conductor_temp_c": 90})
    calculator = api.get("voltage-drop")
    assert config.input_default("voltage-drop", calculator.input("max_drop_pct")) == 2.0
    assert config.input_default("voltage-drop", calculator.input("conductor_temp_c")) == 90.0
    html = forms.render_calculator("voltage-drop", config)
    assert 'name="max_drop_pct" type="text" inputmode="decimal" enterkeyhint="done" ' in html
    assert 'value="2"' in html and 'value="90"' in html


def test_advanced_inputs_fold_under_more_inputs():
    html = forms.render_calculator("voltage-drop", team.TeamConfig())
    more = html.index('<details class="fb-more">')
    assert html.index('name="length"') < more < html.index('name="sets"')


def test_text_inputs_offer_their_suggestions():
    html = forms.render_calculator("ground-fault-trip", team.parse({"region": "iec"}))
    assert 'name="breaker" type="text"' in html and 'value="B20"' in html
    assert '<option value="C32"></option>' in html


def test_the_placeholder_site_url_is_the_same_everywhere(built_site):
    config = (ROOT / "mkdocs.yml").read_text(encoding="utf-8")
    script = (ROOT / "site_src" / paths.SERVICE_WORKER_SITEMAP).read_text(encoding="utf-8")
    assert f"site_url: {paths.SITE_URL_PLACEHOLDER}" in config
    assert f'"{paths.SITE_URL_PLACEHOLDER}"' in script
    imported = (f'importScripts("{paths.PACKED_LIST_SITE_PATH}","{paths.SERVICE_WORKER_UNPACK}",'
                f'"{paths.SERVICE_WORKER_SITEMAP}")')  # before Workbox's handlers, in this order
    assert imported in (built_site / "sw.js").read_text(encoding="utf-8")
    for page in built_site.rglob("*.html"):
        assert paths.SITE_URL_PLACEHOLDER not in page.read_text(encoding="utf-8"), page


def test_the_device_keeps_our_text_files_gzipped(built_site):
    """Each packed file's twin unpacks to the file, and only the twin is precached."""
    listed = set(re.findall(r'url:"([^"]+)"', (built_site / paths.SERVICE_WORKER_FILE).read_text(encoding="utf-8")))
    types = packed.read_list(built_site)
    for page in ("index.html", "calculators/voltage-drop/index.html", "search/search_index.json",
                 "assets/css/fluxbook.css", "assets/js/fluxbook.js"):
        assert page in types, page
    for path, content_type in types.items():
        twin = built_site / (path + packed.SUFFIX)
        assert gzip.decompress(twin.read_bytes()) == (built_site / path).read_bytes(), path
        assert path + packed.SUFFIX in listed and path not in listed, path
        assert content_type == packed.TYPES[Path(path).suffix]
    kept = sum((built_site / (path + packed.SUFFIX)).stat().st_size for path in types)
    plain = sum((built_site / path).stat().st_size for path in types)
    assert kept < 0.4 * plain  # HTML and scripts gzip to about a third or less


def test_what_the_service_worker_needs_plain_stays_plain():
    for path in (paths.SERVICE_WORKER_FILE, paths.SERVICE_WORKER_SITEMAP, paths.SERVICE_WORKER_UNPACK,
                 paths.PACKED_LIST_SITE_PATH, "sitemap.xml", f"{paths.PYODIDE_SITE_DIR}/pyodide.asm.mjs",
                 "assets/javascripts/lunr/min/lunr.de.min.js", "assets/icons/icon-512.png",
                 paths.CALC_ZIP_SITE_PATH):
        assert not packed.packable(path), path
    for path in ("index.html", "assets/javascripts/bundle.0123abcd.min.js", "search/search_index.json",
                 "manifest.webmanifest", "schedules/school-kitchen-panel.csv", "assets/icons/icon.svg"):
        assert packed.packable(path), path


def test_a_twin_is_the_same_bytes_on_every_build():
    data = b"<p>pump house, panel PH-1</p>" * 100
    assert packed.twin(data) == packed.twin(data) and gzip.decompress(packed.twin(data)) == data


def test_calculator_pages_hold_the_theme_s_script_back(built_site):
    """build/theme_later.py: a calculator page names the theme's bundle in a data block the
    browser does not run (theme-later.js runs it); other pages run it as the theme wrote it."""
    calculator = (built_site / "calculators/voltage-drop/index.html").read_text(encoding="utf-8")
    home_page = (built_site / "index.html").read_text(encoding="utf-8")
    held = theme_later.held_bundle(calculator)
    assert held and held.startswith("../../assets/javascripts/bundle.")
    assert not theme_later.BUNDLE_SCRIPT.search(calculator)  # nothing runs it from the page
    assert theme_later.held_bundle(home_page) is None
    assert f'class="no-js {theme_later.HTML_CLASS}"' in calculator and theme_later.HTML_CLASS not in home_page
    css = (ROOT / "site_src/assets/css/fluxbook.css").read_text(encoding="utf-8")
    assert f"html.no-js.{theme_later.HTML_CLASS} .md-search" in css  # its search shows meanwhile
    (running,) = theme_later.BUNDLE_SCRIPT.findall(home_page)
    assert running == held.removeprefix("../../")  # the same file, from either page
    assert (built_site / running).is_file()
    precached = (built_site / "sw.js").read_text(encoding="utf-8")
    assert f'"{running}.gz"' in precached and '"assets/js/theme-later.js.gz"' in precached  # offline
    module = (ROOT / "site_src/assets/js/theme-later.js").read_text(encoding="utf-8")
    assert f'script[type="{theme_later.HELD_TYPE}"][{theme_later.DATA_ATTRIBUTE}]' in module
    assert "dataset.fluxbookTheme" in module and theme_later.DATA_ATTRIBUTE == "data-fluxbook-theme"
    assert calculator.count(theme_later.SCHEME_SCRIPT) == 1 and theme_later.SCHEME_SCRIPT not in home_page
    # the CSP lets the scheme script run: its hash is among the inline scripts'
    digest = base64.b64encode(hashlib.sha256(theme_later.SCHEME_SCRIPT.removeprefix("<script>")
                              .removesuffix("</script>").encode("utf-8")).digest()).decode("ascii")
    assert f"'sha256-{digest}'" in release_files.inline_script_hashes(built_site)


PALETTE = '<script>var palette=__md_get("__palette");if(palette&&palette.color){}</script>'


def test_holding_the_script_back_changes_that_element_and_the_html_class_alone():
    page = ('<!doctype html><html lang="en" class="no-js"><head></head><body><form>palette</form>' + PALETTE +
            '<p>dairy barn <script> & </p>\n<script src="../../assets/javascripts/bundle.0123abcd.min.js">'
            '</script>\n<script src="../../assets/js/fluxbook.js" type="module"></script></body></html>')
    out = theme_later.hold_bundle(page)
    assert out == page.replace(
        '<script src="../../assets/javascripts/bundle.0123abcd.min.js"></script>',
        f'<script type="{theme_later.HELD_TYPE}" {theme_later.DATA_ATTRIBUTE}='
        '"../../assets/javascripts/bundle.0123abcd.min.js"></script>',
    ).replace('class="no-js"', f'class="no-js {theme_later.HTML_CLASS}"').replace(
        PALETTE, PALETTE + theme_later.SCHEME_SCRIPT)
    assert theme_later.held_bundle(out) == "../../assets/javascripts/bundle.0123abcd.min.js"


BUNDLE = '<script src="assets/javascripts/bundle.0123abcd.min.js"></script>'


@pytest.mark.parametrize("page, words", [
    ('<html class="no-js"><body>pump house</body></html>' + PALETTE, "bundle script once in the page, found it 0"),
    ('<html class="no-js">' + PALETTE + BUNDLE * 2, "bundle script once in the page, found it 2"),
    ('<html class="no-js">' + PALETTE + '<script src="assets/javascripts/bundle.min.js" defer></script>',
     "found it 0"),
    ("<html>" + PALETTE + BUNDLE, 'no-js"> once in the page, found it 0'),
    ('<html class="no-js">' + BUNDLE, "palette script once in the page, found it 0"),
])
def test_a_theme_that_changed_stops_the_build(page, words):
    with pytest.raises(theme_later.ThemeLaterError, match=words):
        theme_later.hold_bundle(page)
