"""Reference pages generated at build time from calc/ (CPython, numpy where it vectorises).

Each module in this package defines PAGES = {"reference/<name>.md": function(team_config) -> str}.
The pages are computed with the same functions the calculators run, so a table and a live
result can never disagree. Modules are found by name; list each page in mkdocs.yml's nav.
"""

import importlib
import pkgutil


def pages():
    """{site path: builder} from every module of this package, sorted by path."""
    found = {}
    for module_info in sorted(pkgutil.iter_modules(__path__), key=lambda m: m.name):
        module = importlib.import_module(f"{__name__}.{module_info.name}")
        for path, builder in getattr(module, "PAGES", {}).items():
            if path in found:
                raise ValueError(f"reference page {path} is built by two modules")
            found[path] = builder
    return dict(sorted(found.items()))


def markdown_table(header, rows, align=None):
    """A Markdown table; `align` is a string of 'l'/'r' per column (default: first left)."""
    align = align or "l" + "r" * (len(header) - 1)
    rule = ["---:" if a == "r" else ":---" for a in align]
    lines = ["| " + " | ".join(header) + " |", "| " + " | ".join(rule) + " |"]
    lines += ["| " + " | ".join(str(cell) for cell in row) + " |" for row in rows]
    return "\n".join(lines)


GENERATED_NOTE = (
    "*Generated at build time from Fluxbook's calculation package; the live calculators use "
    "the same functions.*"
)
