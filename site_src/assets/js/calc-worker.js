// The calculator worker: boots Pyodide from the site's own copy, unpacks calc.zip, imports
// calc.api and answers run requests with calc.api.run_json (JSON text in, JSON text out).
import * as messages from "./messages.js";

const CALC_DIR = "/home/pyodide/fluxbook";
let runJson = null;
let started = false;
// The one ready promise, made at load: a run that arrives before the boot message waits for the
// boot instead of failing.
let bootDone;
let bootFailed;
const booted = new Promise((resolve, reject) => { bootDone = resolve; bootFailed = reject; });
booted.catch(() => {}); // each run reports the failure itself
let fatal = null; // set when the runtime can no longer be used

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

async function start({ indexURL, calcZipURL }) {
  self.postMessage(messages.stage("runtime"));
  const { loadPyodide } = await import(new URL("pyodide.mjs", indexURL).href);
  const pyodide = await loadPyodide({ indexURL, fullStdLib: false });
  self.postMessage(messages.stage("package"));
  const response = await fetch(calcZipURL, { cache: "no-cache" });
  if (!response.ok) throw new Error(`calc.zip: HTTP ${response.status}`);
  pyodide.unpackArchive(await response.arrayBuffer(), "zip", { extractDir: CALC_DIR });
  self.postMessage(messages.stage("import"));
  pyodide.runPython(`import sys\nif ${JSON.stringify(CALC_DIR)} not in sys.path: sys.path.insert(0, ${JSON.stringify(CALC_DIR)})`);
  const api = pyodide.pyimport("calc.api");
  runJson = api.run_json;
  const version = pyodide.pyimport("calc").__version__;
  self.postMessage(messages.stage("ready", version));
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
  if (message.type !== "run") return;
  try {
    await booted;
    if (fatal) throw fatal;
    const text = runJson(String(message.calculator), JSON.stringify(message.inputs));
    self.postMessage(messages.reply(message.id, JSON.parse(text)));
  } catch (error) {
    self.postMessage(messages.failure(message.id, error));
    if (!fatal && isFatal(error)) {
      fatal = error;
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
