"""The test helper that reads Chromium's printed PDFs (tests/browser/pdf_text.py): a stream's data
is taken by its /Length, so compressed bytes that happen to end in a CR or to hold "endstream" or
"endobj" are read whole (a regex up to the first "endstream" once cut a job sheet's page short
and failed a clean-clone CI run)."""

import zlib

from tests.browser import pdf_text


def _pdf(objects):
    """A minimal PDF body: {number: (dictionary, stream bytes or None)}."""
    parts = [b"%PDF-1.4\n"]
    for number, (dictionary, data) in objects.items():
        parts.append(b"%d 0 obj\n" % number)
        if data is None:
            parts.append(dictionary + b"\nendobj\n")
        else:
            parts.append(dictionary.replace(b"LEN", b"%d" % len(data)) + b" stream\n" + data +
                         b"\nendstream\nendobj\n")
    return b"".join(parts)


def test_stream_data_is_read_by_its_length():
    awkward = b"BT (endstream) Tj (endobj) Tj ET\r"  # ends in CR; holds both keywords
    packed = zlib.compress(b"pump house panel PH-1 " * 50)
    pdf = _pdf({1: (b"<</Length LEN>>", awkward), 2: (b"<</Filter /FlateDecode /Length LEN>>", packed),
                3: (b"<</Type /Catalog>>", None)})
    objects = pdf_text._objects(pdf)
    assert sorted(objects) == [1, 2, 3]
    assert pdf_text._stream(objects[1]) == awkward
    assert pdf_text._stream(objects[2]) == b"pump house panel PH-1 " * 50
    assert b"/Catalog" in objects[3]


def test_a_length_given_by_reference_falls_back_to_the_end_of_line_before_endstream():
    data = b"q 1 0 0 1 0 0 cm Q"
    pdf = _pdf({4: (b"<</Length 5 0 R>>", data), 5: (b"%d" % len(data), None)})
    assert pdf_text._stream(pdf_text._objects(pdf)[4]) == data
