// The engine's memory snapshot as the device stores it (issue 12: quick start): only the pages
// that hold something. Half of a 31.5 MB snapshot is pages of zeros (free heap), so stored
// without them it is read, checked and copied in half the time and takes half the room.
//
// Layout, little-endian 32-bit words: MAGIC, the snapshot's size in bytes, PAGE, the number of
// runs R; then R pairs (first page, page count) of the runs of pages that are not all zeros, in
// order; then those runs' bytes, one after another (the last page may be short: the snapshot
// ends there). Everything else is zeros. calc-worker.js stores FORMAT beside it.

export const FORMAT = "fluxbook-pages-1";
export const PAGE = 4096;
const MAGIC = 0x31534246; // "FBS1"
const HEAD_WORDS = 4;

// Whether raw[start, end) is all zeros; words is raw as 32-bit words (raw's offset is aligned).
function zeros(raw, words, start, end) {
  const lastWord = end >> 2;
  for (let i = start >> 2; i < lastWord; i++) if (words[i] !== 0) return false;
  for (let i = lastWord << 2; i < end; i++) if (raw[i] !== 0) return false;
  return true;
}

// A snapshot (Uint8Array) as stored: a new Uint8Array.
export function pack(snapshot) {
  const raw = snapshot.byteOffset % 4 === 0 ? snapshot : snapshot.slice();
  const words = new Uint32Array(raw.buffer, raw.byteOffset, raw.length >> 2);
  const size = raw.length;
  const runs = [];
  let dataBytes = 0;
  for (let page = 0; page * PAGE < size; page++) {
    const start = page * PAGE;
    const end = Math.min(start + PAGE, size);
    if (zeros(raw, words, start, end)) continue;
    const last = runs[runs.length - 1];
    if (last && last[0] + last[1] === page) last[1] += 1;
    else runs.push([page, 1]);
    dataBytes += end - start;
  }
  const headBytes = (HEAD_WORDS + 2 * runs.length) * 4;
  const stored = new Uint8Array(headBytes + dataBytes);
  const head = new DataView(stored.buffer);
  [MAGIC, size, PAGE, runs.length].forEach((word, i) => head.setUint32(4 * i, word, true));
  let at = headBytes;
  runs.forEach(([first, count], i) => {
    head.setUint32(4 * (HEAD_WORDS + 2 * i), first, true);
    head.setUint32(4 * (HEAD_WORDS + 2 * i) + 4, count, true);
    const bytes = raw.subarray(first * PAGE, Math.min((first + count) * PAGE, size));
    stored.set(bytes, at);
    at += bytes.length;
  });
  return stored;
}

// The snapshot's size in bytes as the stored copy gives it (or throws if it is not one).
export function sizeOf(stored) {
  return readHead(stored).size;
}

// Writes the stored snapshot into target (a zero-filled Uint8Array of its size); throws, saying
// why, if stored is not a whole copy in this layout.
export function unpackInto(stored, target) {
  const { size, runs } = readHead(stored);
  if (target.length !== size) throw new Error(`the stored snapshot is of ${size} bytes, not ${target.length}`);
  const view = new DataView(stored.buffer, stored.byteOffset, stored.byteLength);
  let at = (HEAD_WORDS + 2 * runs) * 4;
  let next = 0; // the first page a run may start at
  for (let i = 0; i < runs; i++) {
    const first = view.getUint32(4 * (HEAD_WORDS + 2 * i), true);
    const count = view.getUint32(4 * (HEAD_WORDS + 2 * i) + 4, true);
    const start = first * PAGE;
    const end = Math.min((first + count) * PAGE, size);
    if (first < next || count < 1 || start >= size || at + (end - start) > stored.length) {
      throw new Error("the stored snapshot's page list is damaged or cut short");
    }
    target.set(stored.subarray(at, at + (end - start)), start);
    at += end - start;
    next = first + count;
  }
  if (at !== stored.length) throw new Error("the stored snapshot is longer than its page list");
  return target;
}

function readHead(stored) {
  if (!(stored instanceof Uint8Array) || stored.length < HEAD_WORDS * 4) {
    throw new Error("the stored snapshot is too short to be one");
  }
  const view = new DataView(stored.buffer, stored.byteOffset, stored.byteLength);
  const [magic, size, page, runs] = [0, 1, 2, 3].map((i) => view.getUint32(4 * i, true));
  if (magic !== MAGIC || page !== PAGE) throw new Error(`the stored snapshot is not in the ${FORMAT} layout`);
  if ((HEAD_WORDS + 2 * runs) * 4 > stored.length) throw new Error("the stored snapshot's page list is cut short");
  return { size, runs };
}
