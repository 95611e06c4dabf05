"""The stored layout of the engine snapshot (site_src/assets/js/snapshot-pages.js), run under
Node.js: packing drops exactly the pages of zeros and the whole pages equal to the runtime's
memory as instantiated (the base), unpacking gives the snapshot back byte for byte (at once or
chunk by chunk as a read delivers it, the base pages copied from the runtime's memory), the
checksum is the one the layout describes, and a damaged or cut copy, or another runtime's memory,
is refused with a reason. The layout and the checksum are read here a second time by an
independent reader in Python (unpack and sum64 below), written from the layout's description."""

import base64
import json
import random
import shutil
import struct
import subprocess

import numpy as np
import pytest

from tests.conftest import ROOT

pytestmark = pytest.mark.skipif(shutil.which("node") is None, reason="needs node")

MODULE = ROOT / "site_src" / "assets" / "js" / "snapshot-pages.js"
PAGE = 4096
MAGIC = b"FBS2"
HEAD = "<4sIIIIIII"  # magic, size, page, stored runs, base runs, base at, base sum (high, low)
HEAD_BYTES = struct.calcsize(HEAD)

# stdin: a list of cases, each {"op", ...} with bytes as base64:
#   pack {snapshot, base?, baseAt?} -> {stored}
#   unpack {stored, size, chunk?, memory?} -> {size, snapshot, plan, sum}: pushed in chunks of
#     `chunk` bytes (all at once without), the base pages filled from `memory` if given
#   sum {stored} -> {sum}
# prints {format, page, results}, a result {error} where the module threw.
HARNESS = r"""
const pages = await import(process.argv[1]);
const chunks = [];
for await (const chunk of process.stdin) chunks.push(chunk);
const bytes = (text) => new Uint8Array(Buffer.from(text, "base64"));
const text = (array) => Buffer.from(array.buffer, array.byteOffset, array.length).toString("base64");
const results = [];
for (const c of JSON.parse(Buffer.concat(chunks).toString("utf8"))) {
  try {
    if (c.op === "pack") {
      results.push({ stored: text(pages.pack(bytes(c.snapshot), c.base ? bytes(c.base) : null, c.baseAt ?? 0)) });
    } else if (c.op === "sum") {
      results.push({ sum: pages.sum64(bytes(c.stored)) });
    } else {
      const stored = bytes(c.stored);
      const target = new Uint8Array(c.size);
      const unpacker = new pages.Unpacker(target);
      const step = c.chunk || stored.length || 1;
      for (let at = 0; at < stored.length; at += step) unpacker.push(stored.slice(at, at + step));
      const plan = unpacker.finish();
      const sum = unpacker.checksum();
      if (c.memory) pages.fillBase(target, bytes(c.memory), plan);
      results.push({ size: pages.sizeOf(stored), snapshot: text(target), plan, sum });
    }
  } catch (error) { results.push({ error: String(error.message) }); }
}
console.log(JSON.stringify({ format: pages.FORMAT, page: pages.PAGE, results }));
"""


def b64(data):
    return base64.b64encode(data).decode("ascii")


def node(cases):
    encoded = [{key: b64(value) if isinstance(value, bytes) else value for key, value in case.items()}
               for case in cases]
    completed = subprocess.run(["node", "--input-type=module", "-e", HARNESS, MODULE.as_uri()],
                               input=json.dumps(encoded), capture_output=True, text=True,
                               timeout=120, check=True)
    out = json.loads(completed.stdout)
    assert out["page"] == PAGE and out["format"] == "fluxbook-pages-2"
    return out["results"]


def pack(snapshot, base=None, base_at=0):
    case = {"op": "pack", "snapshot": snapshot, "baseAt": base_at}
    if base is not None:
        case["base"] = base
    (result,) = node([case])
    return base64.b64decode(result["stored"])


def sum64(data):
    """The layout's checksum, from its description: over the 32-bit little-endian words (the last
    padded with zeros), A = sum of the words and B = sum of the running sums A, both modulo
    2^32; 16 hex digits, B's then A's."""
    padded = data + bytes(-len(data) % 4)
    words = np.frombuffer(padded, dtype="<u4").astype(np.uint64)
    a = np.cumsum(words, dtype=np.uint64)  # wraps modulo 2^64, a multiple of 2^32
    b = np.cumsum(a & np.uint64(0xFFFFFFFF), dtype=np.uint64)
    low = int(a[-1]) % 2**32 if len(words) else 0
    high = int(b[-1]) % 2**32 if len(words) else 0
    return f"{high:08x}{low:08x}"


def unpack(stored, memory=None):
    """The snapshot from its stored copy, the base pages from memory (left zero without it):
    the layout read without the module under test. Also its stored and base runs."""
    magic, size, page, runs, base_runs, base_at, sum_high, sum_low = struct.unpack_from(HEAD, stored, 0)
    assert (magic, page) == (MAGIC, PAGE)
    pairs = [struct.unpack_from("<II", stored, HEAD_BYTES + 8 * i) for i in range(runs + base_runs)]
    stored_pairs, base_pairs = pairs[:runs], pairs[runs:]
    out = bytearray(size)
    at = HEAD_BYTES + 8 * len(pairs)
    for first, count in stored_pairs:
        start, end = first * PAGE, min((first + count) * PAGE, size)
        out[start:end] = stored[at:at + end - start]
        at += end - start
    assert at == len(stored)
    base_bytes = b""
    for first, count in base_pairs:
        start, end = first * PAGE, (first + count) * PAGE
        assert start >= base_at and end <= size
        if memory is not None:
            out[start:end] = memory[start - base_at:end - base_at]
        base_bytes += bytes(out[start:end])
    if memory is not None:
        assert sum64(base_bytes) == f"{sum_high:08x}{sum_low:08x}"
    return bytes(out), stored_pairs, base_pairs


def snapshot_like(seed, pages=40, tail=144):
    """Bytes shaped like an engine snapshot: a header page, runs of data pages and of zero pages,
    a page that is zero but for its last byte, and a short last page."""
    rng = random.Random(seed)
    chunks = []
    for index in range(pages):
        kind = rng.choice(["data", "zero", "zero", "last byte"]) if index else "data"
        if kind == "data":
            chunks.append(rng.randbytes(PAGE))
        elif kind == "zero":
            chunks.append(bytes(PAGE))
        else:
            chunks.append(bytes(PAGE - 1) + b"\x01")
    chunks.append(bytes(rng.getrandbits(8) | 1 for _ in range(tail)))
    return b"".join(chunks)


def with_base(seed, base_at=144):
    """(snapshot, memory): memory the runtime's at instantiation, the snapshot's heap at base_at
    on; some whole pages of the snapshot are the memory's unchanged (pages 1-2, 5, 9), others
    differ in one byte (page 3) or are zero in the snapshot, not in the memory (page 4)."""
    rng = random.Random(seed)
    memory = bytearray(rng.randbytes(12 * PAGE))
    snapshot = bytearray(base_at) + memory + bytes(6 * PAGE)
    for page in (6, 7, 8, 10, 11, 12):  # Python's heap since: other bytes
        snapshot[page * PAGE:(page + 1) * PAGE] = rng.randbytes(PAGE)
    snapshot[3 * PAGE + 100] ^= 0x40
    snapshot[4 * PAGE:5 * PAGE] = bytes(PAGE)
    return bytes(snapshot), bytes(memory)


@pytest.mark.parametrize("seed", [1, 2, 3])
def test_packing_drops_the_zero_pages_and_unpacking_gives_the_snapshot_back(seed):
    snapshot = snapshot_like(seed)
    stored = pack(snapshot)
    restored, pairs, base_pairs = unpack(stored)
    assert restored == snapshot and base_pairs == []  # read by the independent reader
    kept = {page for first, count in pairs for page in range(first, first + count)}
    for page in range(-(-len(snapshot) // PAGE)):
        holds_something = any(snapshot[page * PAGE:(page + 1) * PAGE])
        assert (page in kept) == holds_something, page
    assert all(a[0] + a[1] < b[0] for a, b in zip(pairs, pairs[1:]))  # runs merged, in order
    results = node([{"op": "unpack", "stored": stored, "size": len(snapshot)},
                    {"op": "unpack", "stored": stored, "size": len(snapshot), "chunk": 1000}])
    for result in results:
        assert result["size"] == len(snapshot)
        assert base64.b64decode(result["snapshot"]) == snapshot  # and by the module itself
        assert result["sum"] == sum64(stored)


def test_pages_equal_to_the_runtimes_memory_are_not_stored_and_come_back_from_it():
    snapshot, memory = with_base(4)
    stored = pack(snapshot, memory, 144)
    _, pairs, base_pairs = unpack(stored)
    # Page 0 holds the snapshot's header; 3 differs by a byte, 4 is zero, the tail is Python's.
    assert base_pairs == [(1, 2), (5, 1), (9, 1)]
    stored_pages = {page for first, count in pairs for page in range(first, first + count)}
    assert stored_pages == {0, 3, 6, 7, 8, 10, 11, 12}
    assert len(stored) < len(pack(snapshot)) - 3 * PAGE  # the three base pages are not in it
    restored, _, _ = unpack(stored, memory)
    assert restored == snapshot  # the independent reader, base pages from the memory
    results = node([{"op": "unpack", "stored": stored, "size": len(snapshot), "memory": memory,
                     "chunk": chunk} for chunk in (1, 3, 4096, 5000, None)])
    for result in results:
        assert "error" not in result, result
        assert base64.b64decode(result["snapshot"]) == snapshot
        assert result["plan"]["baseAt"] == 144 and result["sum"] == sum64(stored)


def test_another_runtimes_memory_is_refused():
    snapshot, memory = with_base(5)
    stored = pack(snapshot, memory, 144)
    other = bytearray(memory)
    other[PAGE + 7] ^= 1  # one byte of a base page differs
    results = node([
        {"op": "unpack", "stored": stored, "size": len(snapshot), "memory": bytes(other)},
        {"op": "unpack", "stored": stored, "size": len(snapshot), "memory": memory[:5 * PAGE]},
    ])
    assert "differs" in results[0].get("error", ""), results[0]
    assert "smaller" in results[1].get("error", ""), results[1]


@pytest.mark.parametrize("data", [b"", b"\x01", b"\x01\x02\x03\x04\x05", bytes(range(256)) * 64,
                                  b"\xff" * 4099], ids=["empty", "a byte", "a word and a byte",
                                                        "16 KiB", "carries"])
def test_the_checksum_is_the_one_the_layout_describes(data):
    (result,) = node([{"op": "sum", "stored": data}])
    assert result["sum"] == sum64(data)


def test_the_checksum_sees_a_word_moved_or_changed():
    rng = random.Random(6)
    data = bytearray(rng.randbytes(8 * PAGE))
    swapped = bytearray(data)
    swapped[0:4], swapped[4:8] = data[4:8], data[0:4]  # same words, other order
    flipped = bytearray(data)
    flipped[5 * PAGE + 3] ^= 0x80
    sums = [r["sum"] for r in node([{"op": "sum", "stored": bytes(x)} for x in (data, swapped, flipped)])]
    assert len(set(sums)) == 3


@pytest.mark.parametrize("snapshot", [bytes(3 * PAGE + 5), b"\x07" * (2 * PAGE), b"\x01\x02\x03"],
                         ids=["all zeros", "no zeros", "shorter than a page"])
def test_edge_shapes_round_trip(snapshot):
    stored = pack(snapshot)
    assert unpack(stored)[0] == snapshot
    (result,) = node([{"op": "unpack", "stored": stored, "size": len(snapshot)}])
    assert base64.b64decode(result["snapshot"]) == snapshot
    if not any(snapshot):
        assert len(stored) == HEAD_BYTES  # the head alone


def test_a_damaged_or_cut_copy_is_refused_with_a_reason():
    snapshot, memory = with_base(7)
    stored = pack(snapshot, memory, 144)
    _, size, _, runs, base_runs, *_ = struct.unpack_from(HEAD, stored, 0)
    assert runs >= 2 and base_runs >= 2
    out_of_order = bytearray(stored)
    struct.pack_into("<II", out_of_order, HEAD_BYTES + 8, 0, 1)  # the second run back at page 0
    bad_base = bytearray(stored)
    struct.pack_into("<II", bad_base, HEAD_BYTES + 8 * runs, 0, 1)  # a base page over the header
    cases = [
        (stored[: len(stored) // 2], len(snapshot)),  # cut short
        (stored + b"\x00", len(snapshot)),  # a byte too many
        (b"GZIP" + stored[4:], len(snapshot)),  # not this layout
        (stored[:10], len(snapshot)),  # not even a head
        (bytes(out_of_order), len(snapshot)),  # page list out of order
        (stored, len(snapshot) + PAGE),  # another size than the entry says
        (bytes(bad_base), len(snapshot)),  # base pages where the snapshot's header is
        (stored[:HEAD_BYTES + 4], len(snapshot)),  # the head, its page list cut
    ]
    results = node([{"op": "unpack", "stored": data, "size": size_, "chunk": 777}
                    for data, size_ in cases])
    messages = [result.get("error", "") for result in results]
    assert all(messages), results
    assert "cut short" in messages[0] and "longer" in messages[1] and "layout" in messages[2]
    assert "too short" in messages[3] and "damaged" in messages[4] and "bytes" in messages[5]
    assert "base pages is damaged" in messages[6] and "cut short" in messages[7]
    assert size == len(snapshot)
