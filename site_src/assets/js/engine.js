// The page side of the engine: one worker for the whole visit (instant navigation keeps it),
// a ready promise, and replies matched to requests by id.
import * as messages from "./messages.js";

const BOOT_TIMEOUT_MS = 120000; // a slow phone can take tens of seconds; a hang must still end
// A restore from the device's snapshot takes well under a second here and a few on a slow phone.
// One that has not finished by then is taken as hung: a fresh worker discards the snapshot and
// starts in full.
const RESTORE_TIMEOUT_MS = 20000;

class Engine {
  constructor() {
    this.nextId = 1;
    this.pending = new Map();
    this.listeners = new Set();
    // start: "snapshot" or "normal" once ready; snapshot: the last news of the device's snapshot.
    this.state = { stage: "runtime", detail: "", start: "", snapshot: null };
    this.failure = null; // set once the worker has failed: every later run is refused at once
    const meta = (name) => document.querySelector(`meta[name="${name}"]`);
    // Absolute URLs: the worker resolves relative ones against its own location.
    const absolute = (name) => new URL(meta(name).content, document.baseURI).href;
    this.indexURL = absolute("fluxbook-pyodide");
    this.calcZipURL = absolute("fluxbook-calc-zip");
    const sha = meta("fluxbook-calc-zip-sha256");
    this.calcSha256 = sha ? sha.content : ""; // none: no snapshot (keyed by it)
    this.ready = new Promise((resolve, reject) => {
      this.resolveReady = resolve;
      this.rejectReady = reject;
    });
    this.ready.catch(() => {}); // failures are shown through the stage listeners
    const timer = setTimeout(() => this.fail("the engine did not start within 2 minutes"),
      BOOT_TIMEOUT_MS);
    this.clearBootTimer = () => clearTimeout(timer);
    this.restoreTimer = null;
    // Started from the page's head (engine-start.html): take it over with what it has said so far.
    const early = window.fluxbookEngineStart;
    window.fluxbookEngineStart = null;
    if (early && early.worker) this.adopt(early);
    else this.spawn("use");
  }

  // Start a worker and boot it; snapshot: "use", or "discard" after a restore that hung.
  spawn(snapshot) {
    // The boot message as the worker's name: it boots as soon as its module runs (calc-worker.js).
    const boot = messages.boot(this.indexURL, this.calcZipURL, { calcSha256: this.calcSha256, snapshot });
    const worker = new Worker(new URL("./calc-worker.js", import.meta.url),
      { type: "module", name: JSON.stringify(boot) });
    this.listen(worker);
  }

  // A worker booted before this module ran: listen to it, then hear the events it kept, in order
  // (nothing is dispatched in between: this runs in one task).
  adopt(early) {
    const handlers = this.listen(early.worker);
    early.release();
    for (const event of early.events) handlers[event.type](event);
    this.startedEarly = true;
  }

  // The worker's messages and errors go to this engine; returns the handlers by event type.
  listen(worker) {
    this.worker = worker;
    const handlers = {};
    handlers.message = (event) => {
      if (worker !== this.worker) return; // a worker given up on
      const message = event.data;
      if (message.type === "stage") this.onStageMessage(message);
      else if (message.type === "snapshot") {
        this.setState({ snapshot: { state: message.state, detail: message.detail } });
      } else if (message.type === "reply") {
        const waiter = this.pending.get(message.id);
        if (!waiter) return;
        this.pending.delete(message.id);
        if (message.error) waiter.reject(message.error);
        else waiter.resolve(message.result);
      }
    };
    // An uncaught error in the worker, before or after it was ready, ends it: say so.
    handlers.error = (event) => {
      if (worker === this.worker) this.fail(event.message || "the worker stopped with an error");
    };
    handlers.messageerror = () => {
      if (worker === this.worker) this.fail("the worker sent a message the page could not read");
    };
    for (const [type, handler] of Object.entries(handlers)) worker.addEventListener(type, handler);
    return handlers;
  }

  onStageMessage(message) {
    if (message.stage === "failed") { this.fail(message.detail); return; }
    clearTimeout(this.restoreTimer);
    if (message.stage === "restore") {
      this.restoreTimer = setTimeout(() => this.restoreHung(), RESTORE_TIMEOUT_MS);
    }
    this.setState({ stage: message.stage, detail: message.detail, start: message.start || "" });
    if (message.stage === "ready") { this.clearBootTimer(); this.resolveReady(message.detail); }
  }

  // No run is ever sent before ready, so a hung worker can be replaced without losing one.
  restoreHung() {
    if (this.failure || this.state.stage !== "restore") return;
    this.worker.terminate();
    this.setState({ stage: "runtime", detail: "", snapshot: { state: "failed",
      detail: "a restore from it did not finish in time" } });
    this.spawn("discard");
  }

  // The worker cannot answer any more (it failed to start, or died after it was ready): show
  // the failure and reject every run still waiting, so no page waits for ever.
  fail(detail) {
    if (this.failure) return;
    this.failure = new Error(detail);
    this.clearBootTimer();
    clearTimeout(this.restoreTimer);
    this.rejectReady(this.failure);
    this.setState({ stage: "failed", detail });
    for (const waiter of this.pending.values()) waiter.reject(this.failure);
    this.pending.clear();
  }

  setState(change) {
    this.state = { ...this.state, ...change };
    for (const listener of this.listeners) listener(this.state);
  }

  onStage(listener) {
    this.listeners.add(listener);
    listener(this.state);
    return () => this.listeners.delete(listener);
  }

  // A run asked for before the engine is ready waits for it; after a failure it is refused.
  // display: the unit system of the shown texts ("na" or "iec"; issue 12), values stay SI.
  async run(calculator, inputs, display = null) {
    return this.request((id) => messages.run(id, calculator, inputs, display));
  }

  // A job function of calc.jobs by name (calc.jobs.CALLS), JSON data in and out, as run.
  async call(name, argument) {
    return this.request((id) => messages.call(id, name, argument));
  }

  // A schedule function of calc.batch by name (calc.batch.CALLS), JSON data in and out, as run:
  // the schedule page sends its rows a chunk at a time, so the page stays responsive.
  async batch(name, argument) {
    return this.request((id) => messages.batch(id, name, argument));
  }

  async request(makeMessage) {
    await this.ready;
    if (this.failure) throw this.failure;
    const id = this.nextId++;
    return new Promise((resolve, reject) => {
      this.pending.set(id, { resolve, reject });
      this.worker.postMessage(makeMessage(id));
    });
  }
}

let shared = null;

export function engine() {
  if (!shared) shared = new Engine();
  return shared;
}

export const STAGES = messages.STAGES;
export const STARTS = messages.STARTS;
