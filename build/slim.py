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

import html
import json
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


# --- the search index -------------------------------------------------------------------------
# The theme's search (lunr, in a worker) downloads search/search_index.json whole: one record a
# page section, with the section's full text, 260 kB for the whole site. A search result shows
# the title and two or three lines of text; what a search needs beyond that is each word, once.
# So a record keeps its location and title, a lead of its text (the first sentence, at most
# LEAD_CHARS), and the page's other words once each, in a field the worker indexes but does not
# show (the theme indexes every field named in the index's config).

SEARCH_INDEX_FILE = "search/search_index.json"  # where the theme's search plugin writes it
LEAD_CHARS = 160
WORDS_FIELD = "words"
_TAG = re.compile(r"<[^>]+>")
_SPACE = re.compile(r"\s+")
_BEFORE_STOP = re.compile(r" ([.,;:!?])")  # "<code>x</code>." reads "x.", not "x ."
_TOKEN = re.compile(r"[^\s\-]+")  # the index's own separator, [\s\-]+
_EDGE = "\"'.,;:!?()[]{}…"
# lunr's English stop words the theme's pipeline drops anyway; no use shipping them.
STOP_WORDS = frozenset(
    "a an and are as at be but by for if in into is it its no not of on or such that the their "
    "then there these they this to was will with".split())


def plain_text(markup):
    """A search record's text without its tags, on one line (entities stay escaped)."""
    return _BEFORE_STOP.sub(r"\1", _SPACE.sub(" ", _TAG.sub(" ", markup))).strip()


def lead(markup, limit=LEAD_CHARS):
    """The first sentence of a record's text, or its first words up to `limit` characters."""
    text = plain_text(markup)
    if len(text) <= limit:
        return text
    sentence = re.match(rf"(.{{20,{limit - 1}}}?[.!?])\s", text)
    if sentence:
        return sentence.group(1)
    return text[:limit].rsplit(" ", 1)[0] + " …"


def search_words(text):
    """The words lunr would index in `text` (escaped HTML), as (key, word): the key lower-case,
    the word unescaped with its edges trimmed; numbers, stop words and markup left out."""
    for token in _TOKEN.findall(html.unescape(text)):
        word = token.strip(_EDGE)
        key = word.lower()
        if key not in STOP_WORDS and re.search("[a-z]", key) and not re.search("[<>&]", key):
            yield key, word


def page_of(location):
    return location.split("#", 1)[0]


def lean_search_index(index):
    """The theme's search index with each record's text cut to its lead, and every word of a
    page that neither a title nor a lead holds kept once, on the record where it first came."""
    docs = index["docs"]
    leads = [lead(doc.get("text", "")) for doc in docs]
    known = {}
    for doc, text in zip(docs, leads):
        seen = known.setdefault(page_of(doc["location"]), set())
        seen.update(key for key, _ in search_words(plain_text(doc["title"]) + " " + text))
    lean = []
    for doc, text in zip(docs, leads):
        seen = known[page_of(doc["location"])]
        words = []
        for key, word in search_words(plain_text(doc.get("text", ""))):
            if key not in seen:
                seen.add(key)
                words.append(word)
        record = {**doc, "text": text}
        if words:
            record[WORDS_FIELD] = " ".join(words)
        lean.append(record)
    config = dict(index["config"])
    config["fields"] = {**config["fields"], WORDS_FIELD: dict(config["fields"]["text"])}
    return {"config": config, "docs": lean}


def write_lean_search_index(path):
    """Rewrite the theme's search/search_index.json (after the search plugin wrote it) lean."""
    index = json.loads(path.read_text(encoding="utf-8"))
    text = json.dumps(lean_search_index(index), ensure_ascii=False, separators=(",", ":"))
    path.write_text(text, encoding="utf-8")
    return len(text.encode("utf-8"))
