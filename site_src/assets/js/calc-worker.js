// The calculator worker: boots Pyodide from the site's own copy, unpacks calc.zip, imports
// calc.api and answers run requests with calc.api.run_json (JSON text in, JSON text out).
//
// Quick start: the first full boot on a device takes a memory snapshot of the engine right after
// importing calc.api (before any calculation) and, once the first result is out, stores it gzipped
// in Cache Storage, keyed by Pyodide's version and calc.zip's SHA-256. A later visit restores from
// it instead of booting. Any failure to restore deletes it, marks this release's snapshot as
// failed (none is made again until a new release) and boots in full.
import * as messages from "./messages.js";

const CALC_DIR = "/home/pyodide/fluxbook";
const SNAPSHOT_CACHE = "fluxbook-engine-snapshot";
const SNAPSHOT_IDLE_MS = 3000; // no calculation this long after ready: save the snapshot anyway
const COMPRESS_CHUNK_BYTES = 256 * 1024; // compression yields between chunks, so runs go first
const RESTORE_BUSY_MS = 30000; // a restore marked as begun this recently may be another tab's

let runJson = null;
let callJson = null; // calc.jobs.call_json: job files and saved records (issue 13)
let batchJson = null; // calc.batch.call_json: a schedule of circuits (issue 14)
let started = false;
// The one ready promise, made at load: a run that arrives before the boot message waits for the
// boot instead of failing.
let bootDone;
let bootFailed;
const booted = new Promise((resolve, reject) => { bootDone = resolve; bootFailed = reject; });
booted.catch(() => {}); // each run reports the failure itself
let fatal = null; // set when the runtime can no longer be used
let pendingSnapshot = null; // {bytes, store}: taken at boot, saved after the first result
let saveTimer = null;

// Offline fallback (Firefox has been reported to let a worker's fetch bypass the service
// worker when offline): if the network fails, answer from the precache in Cache Storage.
const networkFetch = self.fetch.bind(self);
self.fetch = async (request, init) => {
  try {
    return await networkFetch(request, init);
  } catch (error) {
    const cached = self.caches && (await self.caches.match(request, { ignoreSearch: true }));
    if (cached) return cached;
    throw error;
  }
};

// Pyodide 314.0.7 restores a snapshot into the wasm memory's compiled size (30 MiB) and throws
// "RangeError: offset is out of bounds" once the snapshot's heap grew past it (pyodide issue
// 6254: prepareSnapshot sets INITIAL_MEMORY, which the module never reads). While a restore is
// under way, grow the new instance's memory to the snapshot's heap before Emscripten makes its
// views of it. Only the instance whose exported memory is smaller than wanted is touched.
let heapWanted = 0;
for (const name of ["instantiateStreaming", "instantiate"]) {
  const original = self.WebAssembly && WebAssembly[name];
  if (typeof original !== "function") continue;
  WebAssembly[name] = async function (...args) {
    const result = await original.apply(this, args);
    const instance = result instanceof WebAssembly.Instance ? result : result && result.instance;
    const memory = instance && instance.exports && instance.exports.memory;
    if (heapWanted && memory instanceof WebAssembly.Memory && memory.buffer.byteLength < heapWanted) {
      memory.grow(Math.ceil((heapWanted - memory.buffer.byteLength) / 65536));
    }
    return result;
  };
}

// The snapshot on this device for one release, in Cache Storage under URLs of this copy of the
// site (never fetched): <key>.gz the gzipped snapshot, <key>.failed "a restore of it failed",
// <key>.restoring "a restore began at <time>" (left behind if the tab hung or crashed in it).
class SnapshotStore {
  static open({ calcZipURL, calcSha256, snapshot }, pyodideVersion) {
    const supported = self.caches && typeof CompressionStream === "function" &&
      typeof DecompressionStream === "function";
    if (!calcSha256 || snapshot === "off" || !supported) return null;
    return new SnapshotStore(new URL("engine-snapshot/", calcZipURL).href,
      `pyodide-${pyodideVersion}-calc-${calcSha256}`);
  }

  constructor(prefix, key) {
    this.prefix = prefix;
    this.url = `${prefix}${key}.gz`;
    this.failedURL = `${prefix}${key}.failed`;
    this.restoringURL = `${prefix}${key}.restoring`;
    this.opened = caches.open(SNAPSHOT_CACHE);
  }

  // {saved: Response or null, mayMake}: what this boot may do.
  async look() {
    const cache = await this.opened;
    const [saved, failed, restoring] = await Promise.all(
      [this.url, this.failedURL, this.restoringURL].map((url) => cache.match(url)));
    if (failed) {
      if (saved) await cache.delete(this.url);
      return { saved: null, mayMake: false };
    }
    if (restoring) {
      const began = Number(await restoring.text());
      if (Date.now() - began < RESTORE_BUSY_MS) return { saved: null, mayMake: false };
      await this.markFailed("the last restore from it never finished");
      return { saved: null, mayMake: false, failed: "the last restore from it never finished" };
    }
    return { saved: saved || null, mayMake: !saved };
  }

  async beginRestore() {
    const cache = await this.opened;
    await cache.put(this.restoringURL, new Response(String(Date.now())));
  }

  async endRestore() {
    await (await this.opened).delete(this.restoringURL);
  }

  async markFailed(reason) {
    const cache = await this.opened;
    await cache.delete(this.url);
    await cache.put(this.failedURL, new Response(reason));
    await cache.delete(this.restoringURL);
  }

  async save(gzipped, rawBytes) {
    const cache = await this.opened;
    await cache.put(this.url, new Response(gzipped, { headers: {
      "Content-Type": "application/gzip", "X-Snapshot-Bytes": String(rawBytes) } }));
  }

  // Entries of other releases of this copy of the site go as soon as this one boots.
  async pruneOthers() {
    const cache = await this.opened;
    const ours = new Set([this.url, this.failedURL, this.restoringURL]);
    for (const request of await cache.keys()) {
      if (request.url.startsWith(this.prefix) && !ours.has(request.url)) await cache.delete(request);
    }
  }
}

async function start(options) {
  const { indexURL, calcZipURL } = options;
  self.postMessage(messages.stage("runtime"));
  const { loadPyodide, version: pyodideVersion } =
    await import(new URL("pyodide.mjs", indexURL).href);
  const calcZip = fetchCalcZip(calcZipURL);
  calcZip.catch(() => {}); // awaited below; a failure there is reported there

  let store = null;
  let plan = { saved: null, mayMake: false };
  try {
    store = SnapshotStore.open(options, pyodideVersion);
    if (store && options.snapshot === "discard") {
      await store.markFailed("a restore from it did not finish in time");
      self.postMessage(messages.snapshot("failed", "a restore from it did not finish in time"));
    } else if (store) {
      plan = await store.look();
      if (plan.failed) self.postMessage(messages.snapshot("failed", plan.failed));
    }
  } catch (error) { // Cache Storage refused (private mode, storage off): no snapshot this visit
    store = null;
    self.postMessage(messages.snapshot("unavailable", describe(error)));
  }
  if (store) store.pruneOthers().catch(() => {});

  if (plan.saved) {
    self.postMessage(messages.stage("restore"));
    try {
      const pyodide = await restore(loadPyodide, indexURL, plan.saved, store, calcZip);
      return ready(pyodide, "snapshot");
    } catch (error) {
      const reason = describe(error);
      console.warn(`Fluxbook: the engine snapshot could not be restored (${reason}); starting in full.`);
      await store.markFailed(reason).catch(() => {});
      self.postMessage(messages.snapshot("failed", reason));
      self.postMessage(messages.stage("runtime"));
    }
  }

  const makeSnapshot = Boolean(store && plan.mayMake);
  const pyodide = await loadPyodide({ indexURL, fullStdLib: false, _makeSnapshot: makeSnapshot });
  self.postMessage(messages.stage("package"));
  pyodide.unpackArchive(await calcZip, "zip", { extractDir: CALC_DIR });
  self.postMessage(messages.stage("import"));
  pyodide.runPython(`import sys\nif ${JSON.stringify(CALC_DIR)} not in sys.path: sys.path.insert(0, ${JSON.stringify(CALC_DIR)})\nimport calc.api`);
  if (makeSnapshot) {
    // Before any calculation and before JavaScript holds any Python object: the smallest heap.
    try {
      pyodide.runPython("import gc\ngc.collect()");
      pendingSnapshot = { bytes: pyodide.makeMemorySnapshot(), store };
    } catch (error) {
      self.postMessage(messages.snapshot("unavailable", describe(error)));
    }
  }
  ready(pyodide, "normal");
  scheduleSave(SNAPSHOT_IDLE_MS);
}

async function fetchCalcZip(url) {
  const response = await fetch(url, { cache: "no-cache" });
  if (!response.ok) throw new Error(`calc.zip: HTTP ${response.status}`);
  return response.arrayBuffer();
}

function ready(pyodide, start) {
  runJson = pyodide.pyimport("calc.api").run_json;
  callJson = pyodide.pyimport("calc.jobs").call_json;
  batchJson = pyodide.pyimport("calc.batch").call_json;
  const version = pyodide.pyimport("calc").__version__;
  self.postMessage(messages.stage("ready", version, start));
}

async function restore(loadPyodide, indexURL, saved, store, calcZip) {
  const began = store.beginRestore().catch(() => {});
  const bytes = gunzip(saved).then((snapshot) => {
    // The header's second word is its own length; the rest is the wasm heap.
    heapWanted = snapshot.length - new DataView(snapshot.buffer, snapshot.byteOffset).getUint32(4, true);
    return snapshot;
  });
  bytes.catch(() => {}); // loadPyodide awaits it and reports the failure
  let pyodide;
  try {
    pyodide = await loadPyodide({ indexURL, fullStdLib: false, _loadSnapshot: bytes });
  } finally {
    heapWanted = 0;
  }
  // The snapshot fixed the random state at the moment it was taken: draw a new seed.
  pyodide.runPython("import random\nrandom.seed()");
  // The file system is not in the snapshot. Imported modules run without their files, but a
  // lazy import or a traceback's source lines need them: put calc's files back.
  try {
    pyodide.unpackArchive(await calcZip, "zip", { extractDir: CALC_DIR });
  } catch (error) {
    console.warn(`Fluxbook: calc.zip could not be unpacked after the restore (${describe(error)}).`);
  }
  pyodide.runPython("import calc.api"); // already imported: fails only on a broken restore
  began.then(() => store.endRestore()).catch(() => {});
  return pyodide;
}

async function gunzip(response) {
  const stream = response.body.pipeThrough(new DecompressionStream("gzip"));
  return new Uint8Array(await new Response(stream).arrayBuffer());
}

async function gzip(bytes) {
  const stream = new CompressionStream("gzip");
  const writer = stream.writable.getWriter();
  const compressed = new Response(stream.readable).blob();
  for (let at = 0; at < bytes.length; at += COMPRESS_CHUNK_BYTES) {
    await writer.write(bytes.subarray(at, at + COMPRESS_CHUNK_BYTES));
    await new Promise((resolve) => setTimeout(resolve, 0)); // let a waiting run go first
  }
  await writer.close();
  return compressed;
}

// The snapshot is saved after the first result (or after a quiet spell), never before a result.
function scheduleSave(delay) {
  if (!pendingSnapshot) return;
  clearTimeout(saveTimer);
  saveTimer = setTimeout(saveSnapshot, delay);
}

async function saveSnapshot() {
  const taken = pendingSnapshot;
  pendingSnapshot = null;
  if (!taken) return;
  try {
    const began = performance.now();
    const gzipped = await gzip(taken.bytes);
    await taken.store.save(gzipped, taken.bytes.length);
    const mb = (bytes) => `${(bytes / 1e6).toFixed(1)} MB`;
    self.postMessage(messages.snapshot("saved", `${mb(taken.bytes.length)}, ${mb(gzipped.size)} ` +
      `gzipped, in ${Math.round(performance.now() - began)} ms`));
  } catch (error) { // quota exceeded, storage cleared meanwhile: a full start next time
    self.postMessage(messages.snapshot("unavailable", describe(error)));
  }
}

self.onmessage = async (event) => {
  const message = event.data;
  if (message.type === "boot") {
    if (!started) {
      started = true;
      start(message).then(bootDone, (error) => {
        self.postMessage(messages.stage("failed", describe(error)));
        bootFailed(error);
      });
    }
    return;
  }
  if (message.type !== "run" && message.type !== "call" && message.type !== "batch") return;
  try {
    await booted;
    if (fatal) throw fatal;
    const text = message.type === "call"
      ? callJson(String(message.name), JSON.stringify(message.argument ?? null))
      : message.type === "batch"
        ? batchJson(String(message.name), JSON.stringify(message.argument ?? null))
        : runJson(String(message.calculator), JSON.stringify(message.inputs),
          // undefined reaches Python as None; null would arrive as pyodide's jsnull
          message.display === "na" || message.display === "iec" ? message.display : undefined);
    self.postMessage(messages.reply(message.id, JSON.parse(text)));
    scheduleSave(0);
  } catch (error) {
    self.postMessage(messages.failure(message.id, error));
    if (!fatal && isFatal(error)) {
      fatal = error;
      pendingSnapshot = null; // never keep a snapshot of a runtime that failed
      self.postMessage(messages.stage("failed", `the Python runtime stopped: ${describe(error)}`));
    }
  }
};

function describe(error) {
  return String(error && error.message ? error.message : error);
}

// Pyodide marks itself unusable after a fatal error (out of memory, a WebAssembly trap): every
// later call would fail the same way, so the page is told the engine is gone.
function isFatal(error) {
  return Boolean(error) && (error.name === "FatalPyodideError" ||
    /fatally failed|Pyodide has suffered a fatal error/i.test(describe(error)));
}
