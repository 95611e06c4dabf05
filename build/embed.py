"""The Markdown block that puts a live calculator in a page, optionally with preset inputs.

    ```fluxbook transformer-currents
    kva: 300 kVA
    secondary_v: 208 V
    ```

One `name: value` a line; blank lines and lines starting with # are ignored. The values are
checked against the calculator's spec at build time, so a typo stops the build with its line.
"""

import re

from calc import api
from calc.errors import InputErrors

FENCE = re.compile(r"^(?P<fence>`{3,}|~{3,})(?P<info>.*)$")
OPENER = re.compile(r"^[ \t]*fluxbook[ \t]+(?P<id>[a-z0-9-]+)[ \t]*$")

SLOT = '<div class="fb-slot" data-slot="{n}"></div>'
SLOT_PATTERN = re.compile(r'(?:<p>)?<div class="fb-slot" data-slot="(\d+)"></div>(?:</p>)?')


class EmbedError(Exception):
    """A fluxbook block is wrong: the message names the page, the line and what is allowed."""


def _fenced_blocks(markdown):
    """Yield (start, end, first_line, fence info, body lines) of each top-level fenced block.

    A fence opened inside another fence is its content, not a block: a page can show the
    block's syntax in a longer fence without it turning into a calculator.
    """
    offset, open_block = 0, None
    for number, line in enumerate(markdown.splitlines(keepends=True), start=1):
        text = line.rstrip("\n").rstrip()
        match = FENCE.match(text)
        if open_block is None:
            if match:
                open_block = (offset, number, match.group("fence"), match.group("info"), [])
        elif match and not match.group("info").strip() and match.group("fence").startswith(
            open_block[2]
        ) and match.group("fence")[0] == open_block[2][0]:
            start, first, _, info, body = open_block
            yield start, offset + len(line), first, info, body
            open_block = None
        else:
            open_block[4].append((number, text))
        offset += len(line)


def parse_blocks(markdown, page="page"):
    """Find the calculator blocks of a page.

    Returns
    -------
    list of (start, end, calculator_id, preset)
        Character offsets of each block, its calculator id and its preset inputs (raw text).
    """
    blocks = []
    for start, end, first_line, info, body in _fenced_blocks(markdown):
        opener = OPENER.match(info)
        if not opener:
            continue
        calculator_id = opener.group("id")
        if calculator_id not in api.REGISTRY:
            raise EmbedError(
                f"{page}:{first_line}: unknown calculator {calculator_id!r}; "
                f"ids are: {', '.join(api.REGISTRY)}"
            )
        preset = {}
        for number, line in body:
            text = line.strip()
            if not text or text.startswith("#"):
                continue
            name, sep, value = text.partition(":")
            if not sep or not name.strip():
                raise EmbedError(f"{page}:{number}: write one 'name: value' a line, got {text!r}")
            preset[name.strip()] = value.strip()
        try:
            api.validate(api.get(calculator_id), preset)
        except InputErrors as errors:
            first = errors.errors[0]
            raise EmbedError(f"{page}:{first_line}: {calculator_id}: {first}") from None
        blocks.append((start, end, calculator_id, preset))
    return blocks


def replace_blocks(markdown, page="page"):
    """The page's Markdown with each block swapped for a slot, and the blocks in slot order."""
    blocks = parse_blocks(markdown, page)
    pieces, last = [], 0
    for n, (start, end, _, _) in enumerate(blocks):
        pieces.append(markdown[last:start])
        pieces.append("\n" + SLOT.format(n=n) + "\n")
        last = end
    pieces.append(markdown[last:])
    return "".join(pieces), [(calculator_id, preset) for _, _, calculator_id, preset in blocks]


def fill_slots(html, render):
    """Replace each slot in rendered HTML with render(n)."""
    return SLOT_PATTERN.sub(lambda m: render(int(m.group(1))), html)
