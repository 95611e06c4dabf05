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
if any size is wrong.

Standard library only.
"""

from __future__ import annotations

import os
import struct
import subprocess
import sys
import tempfile
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
            got = png_size(out)
            ok = got == (size, size)
            failures += not ok
            print(f"{'ok  ' if ok else 'FAIL'} {name:24s} {got[0]}x{got[1]}"
                  f" (want {size}x{size}) from {source}")
    return 1 if failures else 0


if __name__ == "__main__":
    sys.exit(main())
