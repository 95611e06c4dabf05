"""The text and page count of a PDF that Chromium printed (page.pdf), without a PDF library.

Chromium's PDFs (Skia) draw text with Type0 fonts whose ToUnicode CMaps map glyph codes back
to characters; this reads those maps and the text operators of each page's content streams.
Good enough to ask "does the printed sheet say X", which is all the tests need; it is not a
general PDF reader (no encryption, object streams or cross-reference streams: Skia writes none).
"""

import re
import zlib

OBJECT = re.compile(rb"(\d+) 0 obj(.*?)endobj", re.S)
STREAM = re.compile(rb"stream\r?\n(.*?)\r?\nendstream", re.S)
REFERENCE = rb"(\d+) 0 R"


def _objects(pdf):
    return {int(number): body for number, body in OBJECT.findall(pdf)}


def _stream(body):
    match = STREAM.search(body)
    if not match:
        return b""
    data = match.group(1)
    return zlib.decompress(data) if b"/FlateDecode" in body.split(b"stream", 1)[0] else data


def _hex_units(text, width):
    text = re.sub(rb"\s", b"", text)
    return [int(text[i:i + width], 16) for i in range(0, len(text), width)]


def _cmap(data):
    """{glyph code: text} from a ToUnicode CMap, and the code width in hex digits."""
    table, width = {}, 4
    for block in re.findall(rb"beginbfchar(.*?)endbfchar", data, re.S):
        for code, text in re.findall(rb"<([0-9A-Fa-f]+)>\s*<([0-9A-Fa-f]+)>", block):
            width = len(code)
            table[int(code, 16)] = bytes.fromhex(text.decode()).decode("utf-16-be", "replace")
    for block in re.findall(rb"beginbfrange(.*?)endbfrange", data, re.S):
        for low, high, start in re.findall(
                rb"<([0-9A-Fa-f]+)>\s*<([0-9A-Fa-f]+)>\s*<([0-9A-Fa-f]+)>", block):
            width = len(low)
            first = int(start, 16)
            for offset, code in enumerate(range(int(low, 16), int(high, 16) + 1)):
                table[code] = chr(first + offset)
    return table, width


def _fonts(objects, page_body):
    """{font resource name: (cmap, width)} for one page."""
    resources = page_body
    match = re.search(rb"/Resources\s+" + REFERENCE, page_body)
    if match:
        resources = objects[int(match.group(1))]
    fonts = {}
    font_dict = re.search(rb"/Font\s*<<(.*?)>>", resources, re.S)
    if not font_dict:
        return fonts
    for name, number in re.findall(rb"/(\w+)\s+" + REFERENCE, font_dict.group(1)):
        font = objects.get(int(number), b"")
        to_unicode = re.search(rb"/ToUnicode\s+" + REFERENCE, font)
        if to_unicode:
            fonts[name] = _cmap(_stream(objects[int(to_unicode.group(1))]))
    return fonts


TOKENS = re.compile(rb"/(\w+)\s+[\d.]+\s+Tf|<([0-9A-Fa-f\s]*)>|(T\*|Td|TD|Tm|ET|')")


def _page_text(objects, body):
    fonts = _fonts(objects, body)
    contents = re.search(rb"/Contents\s+(?:" + REFERENCE + rb"|\[([^\]]*)\])", body)
    if not contents:
        return ""
    numbers = [contents.group(1)] if contents.group(1) else re.findall(REFERENCE, contents.group(2))
    data = b"".join(_stream(objects[int(n)]) for n in numbers)
    parts, table, width = [], {}, 4
    for font, hex_text, operator in TOKENS.findall(data):
        if font:
            table, width = fonts.get(font, ({}, 4))
        elif operator:
            parts.append(" ")  # a new line or position: words must not run together
        else:
            parts.append("".join(table.get(code, "") for code in _hex_units(hex_text, width)))
    return re.sub(r"\s+", " ", "".join(parts)).strip()


def pages(pdf):
    """The text of each page, in page order (the Pages tree's Kids order)."""
    objects = _objects(pdf)
    page_numbers = [n for n, body in objects.items() if re.search(rb"/Type\s*/Page\b", body)]
    kids = []
    for body in objects.values():
        if re.search(rb"/Type\s*/Pages\b", body):
            kids += [int(n) for n in re.findall(REFERENCE, re.search(rb"/Kids\s*\[([^\]]*)\]",
                                                                       body).group(1))]
    order = [n for n in kids if n in page_numbers] or sorted(page_numbers)
    return [_page_text(objects, objects[n]) for n in order]


def page_count(pdf):
    return len(re.findall(rb"/Type\s*/Page\b", pdf))
