// The engine's memory snapshot as the device stores it (issue 12: quick start): only the pages
// that hold something the runtime cannot give back. Half of a 31.5 MB snapshot is pages of zeros
// (free heap), and a tenth more is pages the runtime's wasm writes into its memory itself when it
// is instantiated (its data segments: tables, strings, static objects) and that Python has not
// changed since. Stored without either, the snapshot is read, checked and copied in well under
// half the time and takes well under half the room.
//
// Layout, little-endian 32-bit words: MAGIC, the snapshot's size in bytes, PAGE, the number of
// stored runs R, the number of base runs B, BASE_AT, the base pages' checksum (two words, high
// then low, see sum64); then R pairs (first page, page count) of the runs of stored pages, in
// order; then B pairs of the runs of base pages, in order; then the stored runs' bytes, one
// after another (the last page may be short: the snapshot ends there). Base pages are whole
// pages equal to the runtime's memory as it stood when instantiated (the base), BASE_AT bytes
// on in the snapshot (its own header comes before its heap). Everything else is zeros.
// calc-worker.js stores FORMAT and the stored copy's checksum (sum64) beside it.
//
// The checksum guards against damage in storage (a cut or garbled copy), not against tampering:
// whatever can write this site's storage can run its scripts. It is a Fletcher-style sum of
// the 32-bit words (the last one padded with zeros): A, the sum of the words, and B, the sum of
// the running sums A, both modulo 2^32, written as 16 hex digits, B's then A's. Any change to a
// single word, or to a run of bytes shorter than a word, changes it. It costs about a tenth of a
// SHA-256 of the same bytes, which here ran on the worker's own thread before every restore.

export const FORMAT = "fluxbook-pages-2";
export const PAGE = 4096;
const MAGIC = 0x32534246; // "FBS2"
const HEAD_WORDS = 8;

// [B, A] of sum64 over parts (Uint8Arrays at 4-byte-aligned offsets, read as one stream; every
// part but the last a whole number of words).
function sums(parts) {
  let a = 0;
  let b = 0;
  for (const bytes of parts) {
    const whole = bytes.length - (bytes.length % 4);
    const words = new Uint32Array(bytes.buffer, bytes.byteOffset, whole / 4);
    for (let i = 0; i < words.length; i++) {
      a = (a + words[i]) | 0;
      b = (b + a) | 0;
    }
    if (whole < bytes.length) {
      let word = 0;
      for (let i = whole; i < bytes.length; i++) word += bytes[i] * 2 ** (8 * (i - whole));
      a = (a + word) | 0;
      b = (b + a) | 0;
    }
  }
  return [b >>> 0, a >>> 0];
}

// The checksum of a stored copy (Uint8Array), as 16 hex digits.
export function sum64(stored) {
  return hex(sums([aligned(stored)]));
}

function hex(words) {
  return words.map((word) => word.toString(16).padStart(8, "0")).join("");
}

function aligned(bytes) {
  return bytes.byteOffset % 4 === 0 ? bytes : bytes.slice();
}

// Whether raw[start, end) is all zeros; words is raw as 32-bit words (raw's offset is aligned).
function zeros(raw, words, start, end) {
  const lastWord = end >> 2;
  for (let i = start >> 2; i < lastWord; i++) if (words[i] !== 0) return false;
  for (let i = lastWord << 2; i < end; i++) if (raw[i] !== 0) return false;
  return true;
}

// Whether the whole page at start of raw equals base from start - baseAt.
function sameAsBase(words, start, baseWords, baseAt) {
  if ((start - baseAt) % 4 !== 0) return false;
  const from = (start - baseAt) / 4;
  const count = PAGE / 4;
  if (from < 0 || from + count > baseWords.length) return false;
  const at = start / 4;
  for (let i = 0; i < count; i++) if (words[at + i] !== baseWords[from + i]) return false;
  return true;
}

function addTo(runs, page) {
  const last = runs[runs.length - 1];
  if (last && last[0] + last[1] === page) last[1] += 1;
  else runs.push([page, 1]);
}

// The bytes of raw in [first, count] runs of whole pages, as parts for sums().
function runParts(raw, runs) {
  return runs.map(([first, count]) => raw.subarray(first * PAGE, (first + count) * PAGE));
}

// A snapshot (Uint8Array) as stored: a new Uint8Array. base (optional): the runtime's memory
// from address 0 as it stood when instantiated, whose byte 0 lies at baseAt in the snapshot;
// whole pages equal to it are not stored.
export function pack(snapshot, base = null, baseAt = 0) {
  if (!Number.isSafeInteger(baseAt) || baseAt < 0) throw new Error(`baseAt must be a whole number of bytes, not ${baseAt}`);
  const raw = aligned(snapshot);
  const words = new Uint32Array(raw.buffer, raw.byteOffset, raw.length >> 2);
  const baseBytes = base ? aligned(base) : null;
  const baseWords = baseBytes ? new Uint32Array(baseBytes.buffer, baseBytes.byteOffset, baseBytes.length >> 2) : null;
  const size = raw.length;
  const runs = [];
  const baseRuns = [];
  let dataBytes = 0;
  for (let page = 0; page * PAGE < size; page++) {
    const start = page * PAGE;
    const end = Math.min(start + PAGE, size);
    if (zeros(raw, words, start, end)) continue;
    if (baseWords && end - start === PAGE && sameAsBase(words, start, baseWords, baseAt)) {
      addTo(baseRuns, page);
      continue;
    }
    addTo(runs, page);
    dataBytes += end - start;
  }
  const headBytes = (HEAD_WORDS + 2 * (runs.length + baseRuns.length)) * 4;
  const stored = new Uint8Array(headBytes + dataBytes);
  const head = new DataView(stored.buffer);
  [MAGIC, size, PAGE, runs.length, baseRuns.length, baseAt, ...sums(runParts(raw, baseRuns))]
    .forEach((word, i) => head.setUint32(4 * i, word, true));
  [...runs, ...baseRuns].forEach(([first, count], i) => {
    head.setUint32(4 * (HEAD_WORDS + 2 * i), first, true);
    head.setUint32(4 * (HEAD_WORDS + 2 * i) + 4, count, true);
  });
  let at = headBytes;
  for (const [first, count] of runs) {
    const bytes = raw.subarray(first * PAGE, Math.min((first + count) * PAGE, size));
    stored.set(bytes, at);
    at += bytes.length;
  }
  return stored;
}

// Writes a stored copy into target (a zero-filled Uint8Array of the snapshot's size) as its
// bytes arrive: push() each chunk in order, then finish(). Either throws, saying why, if the
// copy is not a whole one in this layout.
export class Unpacker {
  constructor(target) {
    this.target = target;
    this.pending = new Uint8Array(0); // the head, until it is whole
    this.head = null; // {bytes, size, runs, baseRuns, baseAt, baseSum}
    this.run = 0; // the stored run being written
    this.inRun = 0; // bytes of it written
  }

  push(chunk) {
    let bytes = chunk;
    if (!this.head) {
      const joined = new Uint8Array(this.pending.length + chunk.length);
      joined.set(this.pending);
      joined.set(chunk, this.pending.length);
      const length = headLength(joined);
      if (length === null || joined.length < length) {
        this.pending = joined;
        return;
      }
      this.head = readHead(joined.slice(0, length), this.target.length);
      this.pending = null;
      bytes = joined.subarray(length);
    }
    const { runs, size } = this.head;
    let at = 0;
    while (at < bytes.length) {
      if (this.run >= runs.length) throw new Error("the stored snapshot is longer than its page list");
      const [first, count] = runs[this.run];
      const start = first * PAGE;
      const length = Math.min((first + count) * PAGE, size) - start;
      const n = Math.min(length - this.inRun, bytes.length - at);
      this.target.set(bytes.subarray(at, at + n), start + this.inRun);
      at += n;
      this.inRun += n;
      if (this.inRun === length) {
        this.run += 1;
        this.inRun = 0;
      }
    }
  }

  // What fillBase needs: {runs, baseAt, sum}, the base runs, where the base begins and their sum.
  finish() {
    if (!this.head) {
      if (this.pending.length < HEAD_WORDS * 4) throw new Error("the stored snapshot is too short to be one");
      throw new Error("the stored snapshot's page list is cut short");
    }
    if (this.run < this.head.runs.length) throw new Error("the stored snapshot is cut short");
    return { runs: this.head.baseRuns, baseAt: this.head.baseAt, sum: this.head.baseSum };
  }

  // The stored copy's checksum (sum64), from the target: call after finish().
  checksum() {
    const { bytes, runs, size } = this.head;
    return hex(sums([bytes, ...runs.map(([first, count]) =>
      this.target.subarray(first * PAGE, Math.min((first + count) * PAGE, size)))]));
  }
}

// The snapshot's size in bytes as the stored copy gives it (or throws if it is not one).
export function sizeOf(stored) {
  const length = headLength(stored);
  if (length === null || stored.length < length) throw new Error("the stored snapshot is too short to be one");
  return readHead(stored.subarray(0, length), null).size;
}

// Copies the base pages (Unpacker's plan) from memory, the runtime's memory as it stands when
// instantiated, into target, the snapshot unpacked; throws if they are not the bytes the
// snapshot was stored against.
export function fillBase(target, memory, plan) {
  for (const [first, count] of plan.runs) {
    const start = first * PAGE;
    const end = (first + count) * PAGE;
    if (end - plan.baseAt > memory.length) throw new Error("the runtime's memory is smaller than the snapshot's base pages");
    target.set(memory.subarray(start - plan.baseAt, end - plan.baseAt), start);
  }
  if (hex(sums(runParts(target, plan.runs))) !== plan.sum) {
    throw new Error("the runtime's memory at start differs from the one the snapshot was stored against");
  }
  return target;
}

// The head's length in bytes from its first words, or null if fewer than those have come;
// throws if the bytes are not this layout.
function headLength(bytes) {
  if (bytes.length < HEAD_WORDS * 4) return null;
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (view.getUint32(0, true) !== MAGIC || view.getUint32(8, true) !== PAGE) {
    throw new Error(`the stored snapshot is not in the ${FORMAT} layout`);
  }
  return (HEAD_WORDS + 2 * (view.getUint32(12, true) + view.getUint32(16, true))) * 4;
}

// The whole head (bytes, its own copy), checked; size: the target's length (null: any).
function readHead(bytes, size) {
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const word = (i) => view.getUint32(4 * i, true);
  const head = { bytes, size: word(1), runs: [], baseRuns: [], baseAt: word(5),
    baseSum: hex([word(6), word(7)]) };
  if (size !== null && head.size !== size) throw new Error(`the stored snapshot is of ${head.size} bytes, not ${size}`);
  const [runs, baseRuns] = [word(3), word(4)];
  let next = 0; // the first page a stored run may start at
  for (let i = 0; i < runs; i++) {
    const [first, count] = [word(HEAD_WORDS + 2 * i), word(HEAD_WORDS + 2 * i + 1)];
    if (first < next || count < 1 || first * PAGE >= head.size) {
      throw new Error("the stored snapshot's page list is damaged");
    }
    head.runs.push([first, count]);
    next = first + count;
  }
  next = 0;
  for (let i = runs; i < runs + baseRuns; i++) {
    const [first, count] = [word(HEAD_WORDS + 2 * i), word(HEAD_WORDS + 2 * i + 1)];
    if (first < next || count < 1 || (first + count) * PAGE > head.size || first * PAGE < head.baseAt) {
      throw new Error("the stored snapshot's list of base pages is damaged");
    }
    head.baseRuns.push([first, count]);
    next = first + count;
  }
  return head;
}
