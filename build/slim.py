"""Fewer bytes for the same pages (issue 12): what every visitor downloads and the device keeps.

- collapse_whitespace: the theme indents its HTML deeply; a run of blank space with a line break
  in it renders as one space anyway, so it is written as one line break. <pre>, <textarea>,
  <script>, <style> and <code> keep theirs.
- compact_cells: Markdown tables give every cell its alignment as a style attribute; left is
  the default and goes, right and centre become a short class (fluxbook.css).
- exclude_long_tables: the search index holds every page's text; a long table of figures (a
  reference page's rows of sizes and ohms) is found through its page's headings and words, not
  cell by cell, so such tables carry the theme's data-search-exclude.
"""

import re

_KEEP = re.compile(r"<(pre|textarea|script|style|code)\b.*?</\1>", re.DOTALL | re.IGNORECASE)
_BLANK_RUN = re.compile(r"[ \t]*\n\s*")
_TABLE = re.compile(r"<table>(.*?)</table>", re.DOTALL)

# A table with more rows than this is searched by its page's words, not its cells.
SEARCHED_TABLE_ROWS = 12


def collapse_whitespace(html):
    """HTML with every blank run that holds a line break written as one line break."""
    pieces, last = [], 0
    for kept in _KEEP.finditer(html):
        pieces.append(_BLANK_RUN.sub("\n", html[last:kept.start()]))
        pieces.append(kept.group(0))
        last = kept.end()
    pieces.append(_BLANK_RUN.sub("\n", html[last:]))
    return "".join(pieces)


def exclude_long_tables(html, rows=SEARCHED_TABLE_ROWS):
    """Mark each table of more than `rows` body rows data-search-exclude (the theme's search)."""
    def mark(match):
        if match.group(1).count("<tr") - 1 <= rows:
            return match.group(0)
        return f"<table data-search-exclude>{match.group(1)}</table>"
    return _TABLE.sub(mark, html)


_ALIGNED_CELL = re.compile(r'<(td|th) style="text-align: (left|right|center);">')
CELL_CLASSES = {"left": "", "right": ' class="fb-r"', "center": ' class="fb-c"'}


def compact_cells(html):
    """Table cells with their alignment as a class (right, centre) or none (left)."""
    return _ALIGNED_CELL.sub(lambda m: f"<{m.group(1)}{CELL_CLASSES[m.group(2)]}>", html)
