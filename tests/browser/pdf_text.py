"""The text and page count of a PDF that Chromium printed (page.pdf), without a PDF library.

Chromium's PDFs (Skia) draw text with Type0 fonts whose ToUnicode CMaps map glyph codes back
to characters; this reads those maps and the text operators of each page's content streams.
Good enough to ask "does the printed sheet say X", which is all the tests need; it is not a
general PDF reader (no encryption, object streams or cross-reference streams: Skia writes none).
"""

import re
import zlib

OBJECT_START = re.compile(rb"(\d+) 0 obj")
LENGTH = re.compile(rb"/Length (\d+)(?! \d+ R)")  # a direct length, not a reference
REFERENCE = rb"(\d+) 0 R"


def _data_start(body, keyword):
    """Where a stream's data begins: after "stream" and its end of line (CR LF or LF)."""
    start = keyword + len(b"stream")
    return start + (2 if body[start:start + 2] == b"\r\n" else 1)


def _objects(pdf):
    """{number: body}. A stream's data is skipped by its /Length: compressed bytes may hold
    "endobj" or "endstream" by chance (a regex up to the first one once cut a page short)."""
    objects, at = {}, 0
    while match := OBJECT_START.search(pdf, at):
        start = match.end()
        end = pdf.find(b"endobj", start)
        keyword = pdf.find(b"stream", start)
        length = LENGTH.search(pdf, start, keyword) if 0 <= keyword < end else None
        if length:
            end = pdf.find(b"endobj", _data_start(pdf, keyword) + int(length.group(1)))
        if end < 0:
            break
        objects[int(match.group(1))] = pdf[start:end]
        at = end + len(b"endobj")
    return objects


def _stream(body):
    keyword = body.find(b"stream")
    if keyword < 0:
        return b""
    start = _data_start(body, keyword)
    length = LENGTH.search(body, 0, keyword)
    if length:
        data = body[start:start + int(length.group(1))]
    else:  # up to the end of line before endstream, which is not part of the data
        data = body[start:body.rfind(b"endstream")]
        data = data[:-2] if data.endswith(b"\r\n") else data[:-1] if data.endswith((b"\n", b"\r")) else data
    return zlib.decompress(data) if b"/FlateDecode" in body[:keyword] else data


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
