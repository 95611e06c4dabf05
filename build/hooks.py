"""MkDocs hooks: thin calls into the tested build modules (see DEVELOPERS.md, "The build")."""

import json
import re
import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
if str(ROOT) not in sys.path:  # MkDocs loads this file by path; calc/ and build/ live beside it
    sys.path.insert(0, str(ROOT))

from mkdocs.exceptions import PluginError  # noqa: E402
from mkdocs.structure.files import File  # noqa: E402
from mkdocs.utils import get_relative_url  # noqa: E402

from build import embed, forms, home, not_found, package_calc, paths, reference, release_files, service_worker, slim, team, theme_later  # noqa: E402,E501
from build import packed as packed_files  # noqa: E402
from calc import __version__  # noqa: E402

CALCULATOR_LIST_MARKER = "<!-- fluxbook:calculator-list -->"

_state = {"config": None, "blocks": {}}


def on_config(config):
    try:
        settings = team.load()
    except team.TeamConfigError as error:
        raise PluginError(str(error)) from None
    _check_pyodide_version()
    _state["config"] = settings
    _state["calc_zip"] = package_calc.calc_zip_bytes()  # one archive for the file and its checksum
    config.extra["fluxbook"] = {
        **settings.for_page(),
        "version": __version__,
        "pyodide_dir": paths.PYODIDE_SITE_DIR + "/",
        "calc_zip": paths.CALC_ZIP_SITE_PATH,
        # Keys the engine's memory snapshot on the device: a new calc.zip never restores an old one.
        "calc_zip_sha256": package_calc.sha256(_state["calc_zip"]),
    }
    if settings.organisation:
        config.site_name = f"Fluxbook · {settings.organisation}"
    return config


def _check_pyodide_version():
    package = paths.NODE_MODULES / "pyodide" / "package.json"
    if not package.exists():
        raise PluginError("node_modules/pyodide is missing: run `npm ci` first")
    found = json.loads(package.read_text(encoding="utf-8"))["version"]
    if found != paths.PYODIDE_VERSION:
        raise PluginError(f"pyodide {found} is installed; the build expects {paths.PYODIDE_VERSION}")


def on_files(files, config):
    for path, builder in reference.pages().items():
        files.append(File.generated(config, path, content=builder(_state["config"])))
    files.append(File.generated(config, paths.CALC_ZIP_SITE_PATH, content=_state["calc_zip"]))
    for name in paths.PYODIDE_FILES:
        source = paths.NODE_MODULES / "pyodide" / name
        files.append(File.generated(config, f"{paths.PYODIDE_SITE_DIR}/{name}", abs_src_path=str(source)))
    for source, destination in paths.VENDOR_FILES.items():
        files.append(File.generated(config, destination, abs_src_path=str(paths.NODE_MODULES / source)))
    for source, (destination, name) in paths.VENDOR_MODULES.items():
        files.append(File.generated(config, destination, content=vendor_module(source, name)))
    files.append(File.generated(config, paths.SIZES_JS_SITE_PATH, content=forms.sizes_module()))
    return files


def vendor_module(source, name):
    """A minified classic script that defines the global `name`, as an ES module exporting it."""
    text = (paths.NODE_MODULES / source).read_text(encoding="utf-8")
    if not re.match(rf"(/\*.*?\*/\s*)?var {re.escape(name)}\s*=", text, re.DOTALL):
        raise PluginError(f"{source} no longer starts by defining var {name}: check the vendored build")
    return text.rstrip() + f"\nexport default {name};\n"


def on_page_markdown(markdown, page, config, files):
    if CALCULATOR_LIST_MARKER in markdown:
        markdown = markdown.replace(CALCULATOR_LIST_MARKER, _calculator_list(page))
    try:
        markdown, blocks = embed.replace_blocks(markdown, page.file.src_uri)
    except embed.EmbedError as error:
        raise PluginError(str(error)) from None
    _state["blocks"][page.file.src_uri] = blocks
    if blocks:  # a calculator page starts its engine from the head (site_src/overrides/main.html)
        page.meta["fluxbook_engine"] = True
    return markdown


def _calculator_list(page):
    """The home page's launcher: filter, recent calculations, tiles by group (build/home.py)."""
    try:
        return home.launcher(lambda url: get_relative_url(url, page.url))
    except home.HomeDataError as error:
        raise PluginError(str(error)) from None


def on_page_content(html, page, config, files):
    html = slim.compact_cells(slim.exclude_long_tables(html))  # found by their page's words
    blocks = _state["blocks"].get(page.file.src_uri, [])
    if not blocks:
        return html
    settings = _state["config"]
    return embed.fill_slots(
        html,
        lambda n: forms.render_calculator(blocks[n][0], settings, preset=blocks[n][1], index=n),
    )


def _rebase_not_found(page):
    """404.html styled under any sub-path (build/not_found.py), before the CSP hashes its scripts."""
    if not page.exists():
        return
    try:
        page.write_text(not_found.rebase(page.read_text(encoding="utf-8")), encoding="utf-8")
    except not_found.NotFoundPageError as error:
        raise PluginError(str(error)) from None


CANONICAL_LINK = re.compile(r'\s*<link rel="canonical" href="[^"]*">')


def on_post_page(output, page, config):
    if page.meta.get("fluxbook_engine"):  # the theme's script runs after the first result
        try:
            output = theme_later.hold_bundle(output)
        except theme_later.ThemeLaterError as error:
            raise PluginError(f"{page.file.src_uri}: {error}") from None
    # The canonical URL would carry the placeholder site_url; the copy's real address is unknown.
    return slim.collapse_whitespace(CANONICAL_LINK.sub("", output))


def on_post_build(config):
    site_dir = Path(config.site_dir)
    _rebase_not_found(site_dir / "404.html")
    slim.write_lean_search_index(site_dir / slim.SEARCH_INDEX_FILE)  # the search plugin's, made lean
    release_files.strip_sitemap_dates(site_dir)
    release_files.write_server_headers(site_dir)
    packed = packed_files.pack(site_dir)  # after every file it packs is written
    try:
        precache = service_worker.generate(site_dir, packed)  # last: every other file is written
    except service_worker.ServiceWorkerError as error:
        raise PluginError(str(error)) from None
    shipped = release_files.write_checksums(site_dir)
    print(
        f"fluxbook: precached {precache['count']} files, {precache['size'] / 1e6:.1f} MB; "
        f"{shipped} files listed in {paths.CHECKSUMS_FILE}",
        file=sys.stderr,
    )
