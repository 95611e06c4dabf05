// Message shapes between a page and the calculator worker (one place, so both sides agree).
//
// page -> worker   {type: "boot", indexURL, calcZipURL, calcSha256, snapshot}   once, at start,
//                                                  as the worker's name (JSON) or a message
//                  {type: "run", id, calculator, inputs, display}
//                                                  inputs: {name: text or number}; display: the
//                                                  unit system of shown texts, "na" | "iec" | null
//                  {type: "call", id, name, argument}            a job function (calc.jobs.CALLS)
//                  {type: "batch", id, name, argument}           a schedule function
//                                                                (calc.batch.CALLS: parse, check)
// worker -> page   {type: "stage", stage, detail, start?}        start-up progress (STAGES);
//                                                                "ready" carries start (STARTS)
//                  {type: "reply", id, result}                   the contract's JSON, parsed
//                  {type: "reply", id, error: {type, message}}   the worker itself failed
//                  {type: "snapshot", state, detail}             the device's engine snapshot
//                                                                (SNAPSHOT_STATES), for status
// boot.snapshot: "use" (restore a saved snapshot, else boot and save one), "discard" (a restore
// never finished: delete the saved one, boot normally, save none for this release), "off".
// Calculators are named by registered id and inputs travel as JSON data: no Python source is
// ever built from what a user typed.

export const STAGES = Object.freeze({
  runtime: "Loading the Python runtime",
  restore: "Restoring the engine saved on this device",
  package: "Unpacking the calculators",
  import: "Importing the calculators",
  ready: "Ready",
  failed: "Failed",
});

// How a ready engine was started.
export const STARTS = Object.freeze({
  snapshot: "quick start from this device's snapshot",
  normal: "full start",
});

export const SNAPSHOT_STATES = Object.freeze({
  saved: "a snapshot of the engine was saved on this device for a quicker start next time",
  failed: "the saved snapshot could not be used; it was deleted and the engine started in full",
  unavailable: "no snapshot could be saved on this device",
});

export const boot = (indexURL, calcZipURL, { calcSha256 = "", snapshot = "use" } = {}) => ({
  type: "boot", indexURL, calcZipURL, calcSha256, snapshot,
});
export const run = (id, calculator, inputs, display = null) =>
  ({ type: "run", id, calculator, inputs, display });
export const call = (id, name, argument) => ({ type: "call", id, name, argument });
export const batch = (id, name, argument) => ({ type: "batch", id, name, argument });
export const stage = (name, detail = "", start = undefined) =>
  (start ? { type: "stage", stage: name, detail, start } : { type: "stage", stage: name, detail });
export const snapshot = (state, detail = "") => ({ type: "snapshot", state, detail });
export const reply = (id, result) => ({ type: "reply", id, result });
export const failure = (id, error) => ({
  type: "reply",
  id,
  error: { type: (error && error.name) || "Error", message: String((error && error.message) || error) },
});
