// The page side of the engine: one worker for the whole visit (instant navigation keeps it),
// a ready promise, and replies matched to requests by id.
import * as messages from "./messages.js";

const BOOT_TIMEOUT_MS = 120000; // a slow phone can take tens of seconds; a hang must still end

class Engine {
  constructor() {
    this.nextId = 1;
    this.pending = new Map();
    this.listeners = new Set();
    this.state = { stage: "runtime", detail: "" };
    this.failure = null; // set once the worker has failed: every later run is refused at once
    const indexURL = document.querySelector('meta[name="fluxbook-pyodide"]').content;
    const calcZipURL = document.querySelector('meta[name="fluxbook-calc-zip"]').content;
    this.worker = new Worker(new URL("./calc-worker.js", import.meta.url), { type: "module" });
    this.ready = new Promise((resolve, reject) => {
      this.rejectReady = reject;
      const timer = setTimeout(() => this.fail("the engine did not start within 2 minutes"),
        BOOT_TIMEOUT_MS);
      this.clearBootTimer = () => clearTimeout(timer);
      this.worker.addEventListener("message", (event) => {
        const message = event.data;
        if (message.type === "stage") {
          if (message.stage === "failed") { this.fail(message.detail); return; }
          this.setStage(message.stage, message.detail);
          if (message.stage === "ready") { clearTimeout(timer); resolve(message.detail); }
        } else if (message.type === "reply") {
          const waiter = this.pending.get(message.id);
          if (!waiter) return;
          this.pending.delete(message.id);
          if (message.error) waiter.reject(message.error);
          else waiter.resolve(message.result);
        }
      });
      // An uncaught error in the worker, before or after it was ready, ends it: say so.
      this.worker.addEventListener("error", (event) => {
        this.fail(event.message || "the worker stopped with an error");
      });
      this.worker.addEventListener("messageerror", () => {
        this.fail("the worker sent a message the page could not read");
      });
    });
    this.ready.catch(() => {}); // failures are shown through the stage listeners
    // Absolute URLs: the worker resolves relative ones against its own location.
    this.worker.postMessage(messages.boot(new URL(indexURL, document.baseURI).href,
      new URL(calcZipURL, document.baseURI).href));
  }

  // The worker cannot answer any more (it failed to start, or died after it was ready): show
  // the failure and reject every run still waiting, so no page waits for ever.
  fail(detail) {
    if (this.failure) return;
    this.failure = new Error(detail);
    this.clearBootTimer();
    this.rejectReady(this.failure);
    this.setStage("failed", detail);
    for (const waiter of this.pending.values()) waiter.reject(this.failure);
    this.pending.clear();
  }

  setStage(stage, detail) {
    this.state = { stage, detail };
    for (const listener of this.listeners) listener(this.state);
  }

  onStage(listener) {
    this.listeners.add(listener);
    listener(this.state);
    return () => this.listeners.delete(listener);
  }

  // A run asked for before the engine is ready waits for it; after a failure it is refused.
  async run(calculator, inputs) {
    await this.ready;
    if (this.failure) throw this.failure;
    const id = this.nextId++;
    return new Promise((resolve, reject) => {
      this.pending.set(id, { resolve, reject });
      this.worker.postMessage(messages.run(id, calculator, inputs));
    });
  }
}

let shared = null;

export function engine() {
  if (!shared) shared = new Engine();
  return shared;
}

export const STAGES = messages.STAGES;
