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
    const indexURL = document.querySelector('meta[name="fluxbook-pyodide"]').content;
    const calcZipURL = document.querySelector('meta[name="fluxbook-calc-zip"]').content;
    this.worker = new Worker(new URL("./calc-worker.js", import.meta.url), { type: "module" });
    this.ready = new Promise((resolve, reject) => {
      const timer = setTimeout(() => {
        this.setStage("failed", "the engine did not start within 2 minutes");
        reject(new Error("engine start timed out"));
      }, BOOT_TIMEOUT_MS);
      this.worker.addEventListener("message", (event) => {
        const message = event.data;
        if (message.type === "stage") {
          this.setStage(message.stage, message.detail);
          if (message.stage === "ready") { clearTimeout(timer); resolve(message.detail); }
          if (message.stage === "failed") { clearTimeout(timer); reject(new Error(message.detail)); }
        } else if (message.type === "reply") {
          const waiter = this.pending.get(message.id);
          if (!waiter) return;
          this.pending.delete(message.id);
          if (message.error) waiter.reject(message.error);
          else waiter.resolve(message.result);
        }
      });
      this.worker.addEventListener("error", (event) => {
        clearTimeout(timer);
        this.setStage("failed", event.message || "the worker could not start");
        reject(new Error(event.message || "worker error"));
      });
    });
    this.ready.catch(() => {}); // failures are shown through the stage listeners
    // Absolute URLs: the worker resolves relative ones against its own location.
    this.worker.postMessage(messages.boot(new URL(indexURL, document.baseURI).href,
      new URL(calcZipURL, document.baseURI).href));
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

  async run(calculator, inputs) {
    await this.ready;
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
