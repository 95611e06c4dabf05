// The calculator worker: boots Pyodide from the site's own copy, unpacks calc.zip, imports
// calc.api and answers run requests with calc.api.run_json (JSON text in, JSON text out).
//
// Quick start: the first full boot on a device takes a memory snapshot of the engine right after
// importing calc (before any calculation) and, once the first result is out, stores it in Cache
// Storage without its pages of zeros and those the runtime's wasm writes itself when instantiated
// (snapshot-pages.js), with its checksum, keyed by Pyodide's folder and calc.zip's SHA-256. A
// later visit restores from it instead of booting. It is not gzipped: its pages are written into
// place as they are read, while Pyodide's scripts load and its wasm compiles, where un-gzipping
// took about 0.2 s of this thread first; a phone has the room. The checksum (snapshot-pages.js's
// sum64), checked before Pyodide is given the snapshot, stands in for gzip's check. Any failure
// to restore deletes it, marks this release's snapshot as failed (none is made again until a new
// release) and boots in full.
import * as messages from "./messages.js";
import * as pages from "./snapshot-pages.js";

const CALC_DIR = "/home/pyodide/fluxbook";
const SNAPSHOT_CACHE = "fluxbook-engine-snapshot";
const SNAPSHOT_IDLE_MS = 3000; // no calculation this long after ready: save the snapshot anyway
const CHECKSUM_HEADER = "X-Snapshot-Sum64"; // pages.sum64 of the stored bytes
const SIZE_HEADER = "X-Snapshot-Bytes";
const RUNTIME_HEADER = "X-Snapshot-Pyodide"; // the version of Pyodide that made it
const FORMAT_HEADER = "X-Snapshot-Format"; // pages.FORMAT: how it is stored
// Imported before the snapshot is taken, so a restored engine has nothing left to import.
const ENGINE_MODULES = ["calc.api", "calc.jobs", "calc.batch"];
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
let pendingSnapshot = null; // {bytes, base, store, pyodideVersion}: taken at boot, saved after the first result
let saveTimer = null;
let pendingFiles = null; // after a restore: puts calc's files back, once, after the first result

// Offline fallback (Firefox has been reported to let a worker's fetch bypass the service
// worker when offline): if the network fails, answer from the precache in Cache Storage.
const networkFetch = self.fetch.bind(self);
// Files Pyodide reads as it starts, asked for when the worker starts (prefetch below) rather
// than when Pyodide gets to them: URL -> a promise of the response, taken once.
const prefetched = new Map();
self.fetch = async (request, init) => {
  const url = String(request && request.url ? request.url : request);
  // The runtime's wasm, when it is compiled already (below): Pyodide's own request for it is
  // answered with nothing, as its instantiateStreaming is given the compiled module instead.
  if (compiled && url === compiledURL && (await compiled)) {
    return new Response(new Uint8Array(0), { headers: { "Content-Type": "application/wasm" } });
  }
  const early = prefetched.get(url);
  if (early) {
    prefetched.delete(url);
    const response = await early.catch(() => null);
    if (response && response.ok) return response; // else asked again, as Pyodide asked
  }
  try {
    return await networkFetch(request, init);
  } catch (error) {
    const cached = self.caches && (await self.caches.match(request, { ignoreSearch: true }));
    if (cached) return cached;
    throw error;
  }
};

// Pyodide wraps each JavaScript function it puts in the wasm table in a tiny module of its own
// (Emscripten's convertJsFunctionToWasm), compiled anew for each: about 260 on every start and
// restore, of a few dozen signatures. Equal bytes compile to an equal module, so a small
// module's compiled copy is kept by its bytes and each signature compiles once. Instances, which
// hold the functions, are still made one for each.
const TINY_MODULE_BYTES = 256;
if (self.WebAssembly && typeof WebAssembly.Module === "function" && typeof Proxy === "function") {
  const compiledTiny = new Map();
  WebAssembly.Module = new Proxy(WebAssembly.Module, {
    construct(target, args, newTarget) {
      const bytes = args[0];
      if (newTarget !== WebAssembly.Module || !(bytes instanceof Uint8Array) ||
          bytes.length > TINY_MODULE_BYTES) {
        return Reflect.construct(target, args, newTarget);
      }
      const key = String.fromCharCode.apply(null, bytes);
      let module = compiledTiny.get(key);
      if (!module) {
        module = Reflect.construct(target, args, newTarget);
        compiledTiny.set(key, module);
      }
      return module;
    },
  });
}

// Pyodide 314.0.7 restores a snapshot into the wasm memory's compiled size (30 MiB) and throws
// "RangeError: offset is out of bounds" once the snapshot's heap grew past it (pyodide issue
// 6254: prepareSnapshot sets INITIAL_MEMORY, which the module never reads). While a restore is
// under way, grow the new instance's memory to the snapshot's heap before Emscripten makes its
// views of it. Only the instance whose exported memory is smaller than wanted is touched.
//
// The runtime's wasm is compiled as soon as the worker starts (`compiled`), in parallel with
// looking the snapshot up and reading it: Pyodide itself compiles only once it holds the
// snapshot's bytes (or, in a full start, once its loader is in). Its instantiateStreaming is
// then given the compiled module.
//
// Pyodide waits for the snapshot's bytes before it builds its module (about 0.1 s of script), so
// it is handed an array of the stored size at once and the bytes are copied in when read;
// instantiation waits for that (`snapshotFilled`), and Pyodide reads the array only after it.
let heapWanted = 0;
let snapshotFilled = null; // a promise of {target, plan}: the array Pyodide was handed, the Unpacker's plan
let captureBase = false; // a boot that will take a snapshot: keep its memory as instantiated
let capturedBase = null; // that memory below the heap (Uint8Array), for pages.pack
let abortRestore = null; // during a restore: ends it with an error
let compiled = null; // Promise of pyodide.asm.wasm's WebAssembly.Module, or of null
let compiledURL = "";
const instantiateModule = self.WebAssembly && WebAssembly.instantiate;
for (const name of ["instantiateStreaming", "instantiate"]) {
  const original = self.WebAssembly && WebAssembly[name];
  if (typeof original !== "function") continue;
  WebAssembly[name] = async function (...args) {
    // Taken once, by the instantiation of the restore that was handed the array; a failed read
    // fails it, and that abandoned instance never runs (restore() falls back and says why).
    const waitFor = name === "instantiateStreaming" ? snapshotFilled : null;
    if (waitFor) snapshotFilled = null;
    const unpacked = waitFor ? await waitFor : null;
    const module = name === "instantiateStreaming" && compiled ? await compiled : null;
    let result;
    if (module) {
      Promise.resolve(args[0]).then((response) => response.body && response.body.cancel(), () => {});
      result = { module, instance: await instantiateModule.call(WebAssembly, module, args[1]) };
    } else {
      result = await original.apply(this, args);
    }
    const instance = result instanceof WebAssembly.Instance ? result : result && result.instance;
    const memory = instance && instance.exports && instance.exports.memory;
    if (memory instanceof WebAssembly.Memory) {
      // Pages the snapshot shares with the memory as instantiated were not stored: put back here,
      // before Pyodide copies the snapshot in (a mismatch fails the restore, which falls back).
      // Pyodide only logs a failed instantiation and waits: the restore is ended here instead.
      try {
        if (unpacked) pages.fillBase(unpacked.target, new Uint8Array(memory.buffer), unpacked.plan);
      } catch (error) {
        if (abortRestore) abortRestore(error);
        throw error;
      }
      if (captureBase) {
        captureBase = false;
        capturedBase = memoryBelowHeap(instance, memory);
      }
    }
    if (heapWanted && memory instanceof WebAssembly.Memory && memory.buffer.byteLength < heapWanted) {
      memory.grow(Math.ceil((heapWanted - memory.buffer.byteLength) / 65536));
    }
    return result;
  };
}

// The memory as instantiated, below the heap (`__heap_base`): the wasm's data segments, as
// Python will find them; null if the runtime does not say where its heap begins.
function memoryBelowHeap(instance, memory) {
  const heapBase = instance.exports.__heap_base;
  const end = heapBase instanceof WebAssembly.Global ? Number(heapBase.value) : 0;
  if (!(end > 0 && end <= memory.buffer.byteLength)) return null;
  return new Uint8Array(memory.buffer, 0, end).slice();
}

// The snapshot on this device for one release, in Cache Storage under URLs of this copy of the
// site (never fetched): <key>.bin the snapshot, <key>.failed "a restore of it failed",
// <key>.restoring "a restore began at <time>" (left behind if the tab hung or crashed in it).
// The key is known before Pyodide's loader is: the runtime's folder carries its version
// (build/paths.py), and the version that made the snapshot is checked once the loader is in.
class SnapshotStore {
  static open({ indexURL, calcZipURL, calcSha256, snapshot }) {
    const supported = Boolean(self.caches);
    if (!calcSha256 || snapshot === "off" || !supported) return null;
    const runtime = new URL(indexURL).pathname.split("/").filter(Boolean).pop() || "pyodide";
    return new SnapshotStore(new URL("engine-snapshot/", calcZipURL).href,
      `${runtime}-calc-${calcSha256}`);
  }

  constructor(prefix, key) {
    this.prefix = prefix;
    this.url = `${prefix}${key}.bin`;
    this.failedURL = `${prefix}${key}.failed`;
    this.restoringURL = `${prefix}${key}.restoring`;
  }

  get opened() { // for writes, opened when first needed
    if (!this.openedCache) this.openedCache = caches.open(SNAPSHOT_CACHE);
    return this.openedCache;
  }

  // {saved: Response or null, mayMake}: what this boot may do.
  async look() {
    // Straight from Cache Storage by the cache's name: a round trip fewer than opening it first,
    // while the page's own requests keep the browser's storage busy.
    const [saved, failed, restoring] = await Promise.all([this.url, this.failedURL,
      this.restoringURL].map((url) => caches.match(url, { cacheName: SNAPSHOT_CACHE })));
    if (failed) {
      if (saved) await (await this.opened).delete(this.url);
      return { saved: null, mayMake: false };
    }
    // Stored by another version of this worker, in another layout: not used; a new one is made.
    if (saved && saved.headers.get(FORMAT_HEADER) !== pages.FORMAT) {
      await this.discard().catch(() => {});
      return { saved: null, mayMake: true };
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

  // Made by another Pyodide under the same folder name: not used, and a new one may be made.
  async discard() {
    await (await this.opened).delete(this.url);
  }

  async markFailed(reason) {
    const cache = await this.opened;
    await cache.delete(this.url);
    await cache.put(this.failedURL, new Response(reason));
    await cache.delete(this.restoringURL);
  }

  // bytes: the snapshot; base: the memory as instantiated (or null). Stored without its pages of
  // zeros and those equal to base. Its size as stored, in bytes.
  async save(bytes, base, pyodideVersion) {
    const stored = pages.pack(bytes, base, heapAt(bytes));
    const checksum = pages.sum64(stored);
    const cache = await this.opened;
    await cache.put(this.url, new Response(stored, { headers: {
      "Content-Type": "application/octet-stream", [CHECKSUM_HEADER]: checksum,
      [SIZE_HEADER]: String(bytes.length), [RUNTIME_HEADER]: pyodideVersion,
      [FORMAT_HEADER]: pages.FORMAT } }));
    return stored.length;
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
  // The snapshot is looked up first: its read is the longest of what a restore waits for, and
  // the browser's storage answers in the order it was asked.
  let store = null;
  let looking = null;
  try {
    store = SnapshotStore.open(options);
    if (store && options.snapshot !== "discard") looking = store.look();
  } catch (error) { // Cache Storage refused (private mode, storage off): no snapshot this visit
    store = null;
    self.postMessage(messages.snapshot("unavailable", describe(error)));
  }
  if (looking) looking.catch(() => {}); // awaited below
  // Then all at once: the loader, the runtime's JavaScript (loadPyodide imports the same module
  // later and finds it loaded) and its wasm. calc.zip waits until the look says whether a
  // snapshot is there: a restore needs its files only after the first result.
  const loader = import(new URL("pyodide.mjs", indexURL).href);
  const runtimeScript = import(new URL("pyodide.asm.mjs", indexURL).href);
  runtimeScript.catch(() => {}); // loadPyodide imports it again and reports a failure
  prefetch(indexURL);
  compiled = compileRuntime(indexURL); // a restore and a full start both take it
  let calcZip = null;
  const calcZipBytes = () => {
    calcZip ||= fetchCalcZip(calcZipURL);
    return calcZip;
  };

  let plan = { saved: null, mayMake: false };
  try {
    if (store && options.snapshot === "discard") {
      await store.markFailed("a restore from it did not finish in time");
      self.postMessage(messages.snapshot("failed", "a restore from it did not finish in time"));
    } else if (looking) {
      plan = await looking;
      if (plan.failed) self.postMessage(messages.snapshot("failed", plan.failed));
    }
  } catch (error) { // Cache Storage refused the look: no snapshot this visit
    store = null;
    plan = { saved: null, mayMake: false };
    self.postMessage(messages.snapshot("unavailable", describe(error)));
  }
  if (!plan.saved) calcZipBytes().catch(() => {}); // a full start: awaited below, reported there
  if (store) store.pruneOthers().catch(() => {});
  // Read while the loader and the runtime load, and the wasm compiles.
  const reading = plan.saved ? readSnapshot(plan.saved) : null;

  const { loadPyodide, version: pyodideVersion } = await loader;
  if (plan.saved && plan.saved.headers.get(RUNTIME_HEADER) !== pyodideVersion) {
    await store.discard().catch(() => {});
    plan = { saved: null, mayMake: true };
  }
  if (plan.saved) {
    self.postMessage(messages.stage("restore"));
    try {
      const pyodide = await restore(loadPyodide, indexURL, reading, store, calcZipBytes);
      ready(pyodide, "snapshot");
      putFilesBack(SNAPSHOT_IDLE_MS);
      return;
    } catch (error) {
      const reason = describe(error);
      console.warn(`Fluxbook: the engine snapshot could not be restored (${reason}); starting in full.`);
      await store.markFailed(reason).catch(() => {});
      self.postMessage(messages.snapshot("failed", reason));
      self.postMessage(messages.stage("runtime"));
    }
  }

  const makeSnapshot = Boolean(store && plan.mayMake);
  captureBase = makeSnapshot;
  const pyodide = await loadPyodide({ indexURL, fullStdLib: false, _makeSnapshot: makeSnapshot });
  self.postMessage(messages.stage("package"));
  pyodide.unpackArchive(await calcZipBytes(), "zip", { extractDir: CALC_DIR });
  self.postMessage(messages.stage("import"));
  pyodide.runPython(`import sys\nif ${JSON.stringify(CALC_DIR)} not in sys.path: sys.path.insert(0, ${JSON.stringify(CALC_DIR)})\nimport ${ENGINE_MODULES.join(", ")}`);
  if (makeSnapshot) {
    // Before any calculation and before JavaScript holds any Python object: the smallest heap.
    try {
      pyodide.runPython("import gc\ngc.collect()");
      pendingSnapshot = { bytes: pyodide.makeMemorySnapshot(), base: capturedBase, store, pyodideVersion };
    } catch (error) {
      self.postMessage(messages.snapshot("unavailable", describe(error)));
    }
  }
  captureBase = false;
  capturedBase = null;
  ready(pyodide, "normal");
  scheduleSave(SNAPSHOT_IDLE_MS);
}

// The standard library and the package list, which Pyodide reads before it restores or boots
// (its fetches take these responses): read while the loader loads, not after.
function prefetch(indexURL) {
  for (const name of ["python_stdlib.zip", "pyodide-lock.json"]) {
    const url = new URL(name, indexURL).href;
    const response = networkFetch(url, { credentials: "same-origin" });
    response.catch(() => {}); // Pyodide asks again and reports a failure
    prefetched.set(url, response);
  }
}

// Pyodide's wasm, compiled now; null where this browser cannot (Pyodide then compiles it itself).
async function compileRuntime(indexURL) {
  if (typeof WebAssembly.compileStreaming !== "function") return null;
  const url = new URL("pyodide.asm.wasm", indexURL).href;
  compiledURL = url;
  try {
    return await WebAssembly.compileStreaming(networkFetch(url, { credentials: "same-origin" }));
  } catch (error) {
    console.warn(`Fluxbook: compiling the runtime ahead failed (${describe(error)}); Pyodide will.`);
    return null;
  }
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

// The stored snapshot written into an array of the snapshot's size as its bytes are read:
// {snapshot, unpacked}, unpacked a promise of pages.Unpacker's plan once every stored page is in
// and the checksum matches (snapshot null if the entry does not say its size and checksum).
function readSnapshot(saved) {
  const expected = saved.headers.get(CHECKSUM_HEADER);
  const size = Number(saved.headers.get(SIZE_HEADER));
  let unpacked;
  let snapshot = null;
  if (!expected || !Number.isSafeInteger(size) || size < 8 || !saved.body) {
    unpacked = Promise.reject(new Error("the stored snapshot does not give its size and checksum"));
  } else {
    snapshot = new Uint8Array(size); // zeros, but for the stored pages written in as they come
    unpacked = (async () => {
      const unpacker = new pages.Unpacker(snapshot);
      const reader = saved.body.getReader();
      for (let chunk = await reader.read(); !chunk.done; chunk = await reader.read()) {
        unpacker.push(chunk.value);
      }
      const plan = unpacker.finish();
      if (unpacker.checksum() !== expected) {
        throw new Error("the stored snapshot is damaged (its checksum does not match)");
      }
      return plan;
    })();
  }
  unpacked.catch(() => {}); // restore() reports a failure
  return { snapshot, unpacked };
}

// reading: readSnapshot's answer; calcZip: a promise of calc.zip's bytes, asked for when called.
async function restore(loadPyodide, indexURL, reading, store, calcZip) {
  const { snapshot } = reading;
  if (!snapshot) await reading.unpacked; // throws why
  const began = store.beginRestore().catch(() => {});
  const filled = reading.unpacked.then((plan) => {
    heapWanted = snapshot.length - heapAt(snapshot);
    if (plan.runs.length && plan.baseAt !== heapAt(snapshot)) {
      throw new Error("the stored snapshot's base pages are not placed where its heap begins");
    }
    return { target: snapshot, plan };
  });
  // A failed read ends the restore at once (Pyodide, whose instantiation it fails, would wait).
  const readFailed = filled.then(() => new Promise(() => {}));
  let readFailure = null;
  filled.catch((error) => { readFailure = error; });
  // Settled when Pyodide asks for it: refused once the read has failed (loadPyodide then fails
  // before it builds anything), else the array, whose instantiation waits for the bytes.
  const offered = { then(resolve, reject) {
    if (readFailure) { reject(readFailure); return; }
    snapshotFilled = filled;
    resolve(snapshot);
  } };
  const aborted = new Promise((resolve, reject) => { abortRestore = reject; });
  let pyodide;
  try {
    pyodide = await Promise.race([
      loadPyodide({ indexURL, fullStdLib: false, _loadSnapshot: offered }), readFailed, aborted]);
  } finally {
    heapWanted = 0;
    abortRestore = null;
  }
  // In one call (each is compiled first): draw a new seed (the snapshot fixed the random state at
  // the moment it was taken), import calc.api (already imported: fails only on a broken
  // restore) and say whether every engine module is in.
  const complete = pyodide.runPython(`import random, sys\nrandom.seed()\nimport calc.api\n` +
    `all(name in sys.modules for name in ${JSON.stringify(ENGINE_MODULES)})`);
  // The file system is not in the snapshot. Every engine module was imported before it was
  // taken and runs without its file, but a traceback's source lines need them: calc's files go
  // back after the first result (or a quiet spell), off the path to it. A snapshot without one
  // of the modules (made by another version of this worker) needs them now.
  const unpack = async () => {
    try {
      pyodide.unpackArchive(await calcZip(), "zip", { extractDir: CALC_DIR });
    } catch (error) {
      console.warn(`Fluxbook: calc.zip could not be unpacked after the restore (${describe(error)}).`);
    }
  };
  if (complete) pendingFiles = unpack;
  else await unpack();
  began.then(() => store.endRestore()).catch(() => {});
  return pyodide;
}

function putFilesBack(delay) {
  if (pendingFiles) setTimeout(() => { const put = pendingFiles; pendingFiles = null; if (put) put(); }, delay);
}

// Where the wasm heap begins in a snapshot: its header's second word, the header's own length.
function heapAt(snapshot) {
  return new DataView(snapshot.buffer, snapshot.byteOffset, snapshot.byteLength).getUint32(4, true);
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
    const stored = await taken.store.save(taken.bytes, taken.base, taken.pyodideVersion);
    self.postMessage(messages.snapshot("saved", `${(taken.bytes.length / 1e6).toFixed(1)} MB, ` +
      `${(stored / 1e6).toFixed(1)} MB stored, in ${Math.round(performance.now() - began)} ms`));
  } catch (error) { // quota exceeded, storage cleared meanwhile: a full start next time
    self.postMessage(messages.snapshot("unavailable", describe(error)));
  }
}

// Boots once, from the worker's name or from a "boot" message, whichever comes first.
function boot(message) {
  if (started) return;
  started = true;
  start(message).then(bootDone, (error) => {
    self.postMessage(messages.stage("failed", describe(error)));
    bootFailed(error);
  });
}

self.onmessage = async (event) => {
  const message = event.data;
  if (message.type === "boot") {
    boot(message);
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
    putFilesBack(0);
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

// The page names the worker with its boot message (engine-start.html, engine.js), so the boot
// starts as soon as this module has run. A posted message is handed over only once the page's
// main thread has heard that the module ran, and that thread is busy with the page's own
// scripts just then: about 70 ms later in a trace of a calculator page's reload.
try {
  const named = self.name ? JSON.parse(self.name) : null;
  if (named && named.type === "boot") boot(named);
} catch (error) {
  // a name that is not a boot message: wait for the message
}
