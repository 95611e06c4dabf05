"""The stored layout of the engine snapshot (site_src/assets/js/snapshot-pages.js), run under
Node.js: packing drops exactly the pages of zeros, unpacking gives the snapshot back byte for
byte, and a damaged or cut copy is refused with a reason. The layout is read here a second time
by an independent reader in Python (unpack below), written from the layout's description."""

import base64
import json
import random
import shutil
import struct
import subprocess

import pytest

from tests.conftest import ROOT

pytestmark = pytest.mark.skipif(shutil.which("node") is None, reason="needs node")

MODULE = ROOT / "site_src" / "assets" / "js" / "snapshot-pages.js"
PAGE = 4096
MAGIC = b"FBS1"

# stdin: [["pack", base64 snapshot] | ["unpack", base64 stored, size]]; prints, for each,
# {stored} (base64), {size, snapshot} (base64) or {error}.
HARNESS = r"""
const pages = await import(process.argv[1]);
const chunks = [];
for await (const chunk of process.stdin) chunks.push(chunk);
const results = [];
for (const [op, data, size] of JSON.parse(Buffer.concat(chunks).toString("utf8"))) {
  const bytes = new Uint8Array(Buffer.from(data, "base64"));
  try {
    if (op === "pack") results.push({ stored: Buffer.from(pages.pack(bytes)).toString("base64") });
    else results.push({ size: pages.sizeOf(bytes), snapshot: Buffer.from(
      pages.unpackInto(bytes, new Uint8Array(size))).toString("base64") });
  } catch (error) { results.push({ error: String(error.message) }); }
}
console.log(JSON.stringify({ format: pages.FORMAT, page: pages.PAGE, results }));
"""


def node(cases):
    encoded = [[op, base64.b64encode(data).decode("ascii"), *rest] for op, data, *rest in cases]
    completed = subprocess.run(["node", "--input-type=module", "-e", HARNESS, MODULE.as_uri()],
                               input=json.dumps(encoded), capture_output=True, text=True,
                               timeout=60, check=True)
    out = json.loads(completed.stdout)
    assert out["page"] == PAGE
    return out["results"]


def pack(snapshot):
    (result,) = node([("pack", snapshot)])
    return base64.b64decode(result["stored"])


def unpack(stored):
    """The snapshot from its stored copy: the layout read without the module under test."""
    magic, size, page, runs = struct.unpack_from("<4sIII", stored, 0)
    assert (magic, page) == (MAGIC, PAGE)
    pairs = [struct.unpack_from("<II", stored, 16 + 8 * i) for i in range(runs)]
    out = bytearray(size)
    at = 16 + 8 * runs
    for first, count in pairs:
        start, end = first * PAGE, min((first + count) * PAGE, size)
        out[start:end] = stored[at:at + end - start]
        at += end - start
    assert at == len(stored)
    return bytes(out), pairs


def snapshot_like(seed, pages=40, tail=144):
    """Bytes shaped like an engine snapshot: a header page, runs of data pages and of zero pages,
    a page that is zero but for its last byte, and a short last page."""
    rng = random.Random(seed)
    chunks = []
    for index in range(pages):
        kind = rng.choice(["data", "zero", "zero", "last byte"]) if index else "data"
        if kind == "data":
            chunks.append(bytes(rng.getrandbits(8) for _ in range(PAGE)))
        elif kind == "zero":
            chunks.append(bytes(PAGE))
        else:
            chunks.append(bytes(PAGE - 1) + b"\x01")
    chunks.append(bytes(rng.getrandbits(8) | 1 for _ in range(tail)))
    return b"".join(chunks)


@pytest.mark.parametrize("seed", [1, 2, 3])
def test_packing_drops_the_zero_pages_and_unpacking_gives_the_snapshot_back(seed):
    snapshot = snapshot_like(seed)
    stored = pack(snapshot)
    restored, pairs = unpack(stored)
    assert restored == snapshot  # read by the independent reader
    kept = {page for first, count in pairs for page in range(first, first + count)}
    for page in range(-(-len(snapshot) // PAGE)):
        holds_something = any(snapshot[page * PAGE:(page + 1) * PAGE])
        assert (page in kept) == holds_something, page
    assert all(a[0] + a[1] < b[0] for a, b in zip(pairs, pairs[1:]))  # runs merged, in order
    (result,) = node([("unpack", stored, len(snapshot))])
    assert result["size"] == len(snapshot)
    assert base64.b64decode(result["snapshot"]) == snapshot  # and by the module itself


@pytest.mark.parametrize("snapshot", [bytes(3 * PAGE + 5), b"\x07" * (2 * PAGE), b"\x01\x02\x03"],
                         ids=["all zeros", "no zeros", "shorter than a page"])
def test_edge_shapes_round_trip(snapshot):
    stored = pack(snapshot)
    assert unpack(stored)[0] == snapshot
    (result,) = node([("unpack", stored, len(snapshot))])
    assert base64.b64decode(result["snapshot"]) == snapshot
    if not any(snapshot):
        assert len(stored) == 16  # the head alone


def test_a_damaged_or_cut_copy_is_refused_with_a_reason():
    snapshot = snapshot_like(7)
    stored = pack(snapshot)
    runs = struct.unpack_from("<I", stored, 12)[0]
    assert runs >= 2
    out_of_order = bytearray(stored)
    struct.pack_into("<II", out_of_order, 16 + 8, 0, 1)  # the second run back at page 0
    cases = [
        ("unpack", stored[: len(stored) // 2], len(snapshot)),  # cut short
        ("unpack", stored + b"\x00", len(snapshot)),  # a byte too many
        ("unpack", b"GZIP" + stored[4:], len(snapshot)),  # not this layout
        ("unpack", stored[:10], len(snapshot)),  # not even a head
        ("unpack", bytes(out_of_order), len(snapshot)),  # page list out of order
        ("unpack", stored, len(snapshot) + PAGE),  # another size than the entry says
    ]
    results = node(cases)
    messages = [result.get("error", "") for result in results]
    assert all(messages), results
    assert "cut short" in messages[0] and "longer" in messages[1] and "layout" in messages[2]
    assert "too short" in messages[3] and "damaged" in messages[4] and "bytes" in messages[5]
