// Message shapes between a page and the calculator worker (one place, so both sides agree).
//
// page -> worker   {type: "boot", indexURL, calcZipURL}         once, right after start
//                  {type: "run", id, calculator, inputs}         inputs: {name: text or number}
// worker -> page   {type: "stage", stage, detail}                start-up progress (STAGES)
//                  {type: "reply", id, result}                   the contract's JSON, parsed
//                  {type: "reply", id, error: {type, message}}   the worker itself failed
// Calculators are named by registered id and inputs travel as JSON data: no Python source is
// ever built from what a user typed.

export const STAGES = Object.freeze({
  runtime: "Loading the Python runtime",
  package: "Unpacking the calculators",
  import: "Importing the calculators",
  ready: "Ready",
  failed: "Failed",
});

export const boot = (indexURL, calcZipURL) => ({ type: "boot", indexURL, calcZipURL });
export const run = (id, calculator, inputs) => ({ type: "run", id, calculator, inputs });
export const stage = (name, detail = "") => ({ type: "stage", stage: name, detail });
export const reply = (id, result) => ({ type: "reply", id, result });
export const failure = (id, error) => ({
  type: "reply",
  id,
  error: { type: (error && error.name) || "Error", message: String((error && error.message) || error) },
});
