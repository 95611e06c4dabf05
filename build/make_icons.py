#!/usr/bin/env python3
"""Render Fluxbook's app icons (PNG) from the hand-drawn SVG sources.

Run by hand when the SVG changes; the PNGs are committed.

    python3 build/make_icons.py            # uses /usr/bin/chromium
    CHROMIUM=/path/to/chromium python3 build/make_icons.py

Sources (in site_src/assets/icons/):
    icon.svg           rounded-square mark, transparent corners
    icon-maskable.svg  full-bleed background, mark inside the 80 % safe zone

Outputs (same folder):
    icon-192.png           192 x 192   from icon.svg
    icon-512.png           512 x 512   from icon.svg
    icon-maskable-512.png  512 x 512   from icon-maskable.svg
    apple-touch-icon.png   180 x 180   from icon-maskable.svg (iOS adds its
                                        own rounded corners and shows
                                        transparent pixels as black)
    favicon.png             48 x 48    from icon.svg

Each SVG is placed in a throw-away HTML page at exactly the target size and
screenshotted by headless Chromium with a transparent default background.
Nothing is fetched from the network: the page only references the local SVG
file, and Chromium runs with a fresh, temporary profile. After each render
the PNG header is read to confirm the pixel size; the script exits non-zero
if any size is wrong. Each PNG is then stored again losslessly (shrink_png): Chromium
filters every row, which suits photographs; these flat shapes compress a quarter smaller
unfiltered at zlib's level 9. The pixels are decoded again and compared before the file is
replaced.

Standard library only.
"""

from __future__ import annotations

import os
import struct
import subprocess
import sys
import tempfile
import zlib
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
ICONS = ROOT / "site_src" / "assets" / "icons"
CHROMIUM = os.environ.get("CHROMIUM", "/usr/bin/chromium")

# (output file, source SVG, edge length in px)
TARGETS = [
    ("icon-192.png", "icon.svg", 192),
    ("icon-512.png", "icon.svg", 512),
    ("icon-maskable-512.png", "icon-maskable.svg", 512),
    ("apple-touch-icon.png", "icon-maskable.svg", 180),
    ("favicon.png", "icon.svg", 48),
]

PAGE = """<!doctype html>
<html><head><meta charset="utf-8">
<style>
html, body {{ margin: 0; padding: 0; background: transparent; overflow: hidden; }}
img {{ display: block; width: {size}px; height: {size}px; }}
</style></head>
<body><img src="{src}" alt=""></body></html>
"""


def png_size(path: Path) -> tuple[int, int]:
    """Width and height from a PNG's IHDR chunk."""
    with path.open("rb") as fh:
        head = fh.read(24)
    if head[:8] != b"\x89PNG\r\n\x1a\n" or head[12:16] != b"IHDR":
        raise ValueError(f"{path} is not a PNG file")
    return struct.unpack(">II", head[16:24])


PNG_SIGNATURE = b"\x89PNG\r\n\x1a\n"
CHANNELS = {0: 1, 2: 3, 4: 2, 6: 4}  # PNG colour type -> bytes a pixel at 8 bits


def _chunks(data: bytes):
    at = len(PNG_SIGNATURE)
    while at < len(data):
        (length,) = struct.unpack(">I", data[at:at + 4])
        yield data[at + 4:at + 8], data[at + 8:at + 8 + length]
        at += 12 + length


def _chunk(kind: bytes, body: bytes) -> bytes:
    return struct.pack(">I", len(body)) + kind + body + struct.pack(">I", zlib.crc32(kind + body))


def _paeth(a: int, b: int, c: int) -> int:
    pa, pb, pc = abs(b - c), abs(a - c), abs(a + b - 2 * c)
    return a if pa <= pb and pa <= pc else (b if pb <= pc else c)


def png_pixels(data: bytes) -> tuple[bytes, list[bytes]]:
    """(IHDR body, unfiltered rows) of an 8-bit, non-interlaced PNG (what Chromium writes)."""
    if not data.startswith(PNG_SIGNATURE):
        raise ValueError("not a PNG file")
    chunks = list(_chunks(data))
    header = chunks[0][1]
    width, height, depth, colour, _, _, interlace = struct.unpack(">IIBBBBB", header)
    if depth != 8 or interlace or colour not in CHANNELS:
        raise ValueError(f"only 8-bit non-interlaced PNGs are handled (depth {depth}, "
                         f"colour type {colour}, interlace {interlace})")
    step = CHANNELS[colour]
    raw = zlib.decompress(b"".join(body for kind, body in chunks if kind == b"IDAT"))
    stride = width * step
    rows, previous = [], bytes(stride)
    for y in range(height):
        start = y * (stride + 1)
        kind, line = raw[start], bytearray(raw[start + 1:start + 1 + stride])
        for x in range(stride):
            left = line[x - step] if x >= step else 0
            up_left = previous[x - step] if x >= step else 0
            predictor = (0, left, previous[x], (left + previous[x]) // 2,
                         _paeth(left, previous[x], up_left))[kind]
            line[x] = (line[x] + predictor) & 0xFF
        rows.append(bytes(line))
        previous = line
    return header, rows


def shrink_png(data: bytes) -> bytes:
    """The same image, unfiltered and at zlib level 9, or `data` itself if that is no smaller.
    Raises ValueError if the new file's pixels differ (they never should)."""
    header, rows = png_pixels(data)
    body = zlib.compress(b"".join(b"\0" + row for row in rows), 9)
    smaller = PNG_SIGNATURE + _chunk(b"IHDR", header) + _chunk(b"IDAT", body) + _chunk(b"IEND", b"")
    if png_pixels(smaller) != (header, rows):
        raise ValueError("the re-stored PNG decodes to other pixels")
    return smaller if len(smaller) < len(data) else data


def render(svg: Path, out: Path, size: int, work: Path) -> None:
    page = work / f"{out.stem}.html"
    page.write_text(PAGE.format(size=size, src=svg.as_uri()), encoding="utf-8")
    cmd = [
        CHROMIUM,
        "--headless",
        "--no-sandbox",
        "--disable-gpu",
        "--disable-background-networking",
        "--disable-component-update",
        "--disable-sync",
        "--disable-extensions",
        "--no-first-run",
        "--hide-scrollbars",
        "--force-device-scale-factor=1",
        f"--user-data-dir={work / 'profile'}",
        f"--window-size={size},{size}",
        "--default-background-color=00000000",
        f"--screenshot={out}",
        page.as_uri(),
    ]
    subprocess.run(
        cmd,
        check=True,
        timeout=120,
        stdout=subprocess.DEVNULL,
        stderr=subprocess.DEVNULL,
    )


def main() -> int:
    failures = 0
    with tempfile.TemporaryDirectory(prefix="fluxbook-icons-") as tmp:
        work = Path(tmp)
        for name, source, size in TARGETS:
            svg = ICONS / source
            out = ICONS / name
            render(svg, out, size, work)
            out.write_bytes(shrink_png(out.read_bytes()))
            got = png_size(out)
            ok = got == (size, size)
            failures += not ok
            print(f"{'ok  ' if ok else 'FAIL'} {name:24s} {got[0]}x{got[1]}"
                  f" (want {size}x{size}) from {source}")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
