// Rendering a result into a calculator's panel. Everything is set as text, never as HTML.
import { drawCharts, clearCharts } from "./charts.js";
import { VERDICT_WORDS, verdictOf } from "./jobs-view.js";
import { displaySystem, fieldLabel, firstBadField, lengthSystem } from "./forms.js";

const STATUS_WORDS = { pass: VERDICT_WORDS.pass, warn: VERDICT_WORDS.warn, fail: VERDICT_WORDS.fail };
const NOT_APPLICABLE = "does not apply to these inputs";

function fillList(list, items, render) {
  list.replaceChildren(...items.map(render));
}

function textItem(text) {
  const li = document.createElement("li");
  li.textContent = text;
  return li;
}

function stepItem(step) {
  const li = document.createElement("li");
  const text = document.createElement("span");
  text.className = "fb-step__text";
  text.textContent = step.text;
  const formula = document.createElement("code");
  formula.className = "fb-step__formula";
  formula.textContent = step.formula;
  const result = document.createElement("code");
  result.className = "fb-step__result";
  result.textContent = step.result;
  li.append(text, formula, result);
  return li;
}

function checkItem(check) {
  const li = document.createElement("li");
  li.className = `fb-check fb-check--${check.status}`;
  li.dataset.check = check.name;
  li.dataset.status = check.status;
  const badge = document.createElement("span");
  badge.className = "fb-check__badge";
  badge.textContent = STATUS_WORDS[check.status] || check.status;
  const message = document.createElement("span");
  message.textContent = check.message;
  li.append(badge, message);
  return li;
}

// --- the summary: the answer first (issue 12) ---------------------------------------------------

const VERDICT_ORDER = ["fail", "warn", "pass"];

function setVerdict(summary, status, badge, text) {
  const verdict = summary.querySelector(".fb-summary__verdict");
  verdict.className = `fb-summary__verdict fb-verdict--${status}`;
  verdict.dataset.verdict = status;
  summary.querySelector(".fb-summary__badge").textContent = badge;
  summary.querySelector(".fb-summary__text").textContent = text;
}

function fillSummary(root, result) {
  const summary = root.querySelector("[data-summary]");
  if (!summary) return;
  const status = verdictOf(result.checks);
  // The worst check speaks for the result; the plausibility check only when nothing else does.
  // A calculator that names its governing check (circuit-check) is taken at its word.
  const named = result.outputs.governing && result.outputs.governing.value;
  const governing = VERDICT_ORDER.includes(status)
    ? result.checks.find((check) => check.status === status && check.name === named) ||
      result.checks.find((check) => check.status === status && check.name !== "plausibility") ||
      result.checks.find((check) => check.status === status)
    : null;
  setVerdict(summary, status, VERDICT_WORDS[status],
    governing ? governing.message : "No pass/fail checks: read the results against your limits.");
  for (const value of summary.querySelectorAll("[data-summary-output]")) {
    const output = result.outputs[value.dataset.summaryOutput];
    value.textContent = output ? output.display : "n/a";
    // words (a governing check, a fix) wrap; a number with its unit stays on one line
    value.classList.toggle("fb-summary__value--words", !!output && typeof output.value === "string");
    value.closest(".fb-summary__out").hidden = !output;
  }
  summary.dataset.state = "result";
  delete summary.dataset.updating;
  summary.hidden = false;
}

function summaryProblem(root, errors) {
  const summary = root.querySelector("[data-summary]");
  if (!summary) return;
  const first = errors && errors[0];
  const text = first
    ? (first.field ? `${fieldLabel(root, first.field)}: ${first.message}` : first.message)
    : "No result yet.";
  setVerdict(summary, "error", "Fix input", text);
  for (const value of summary.querySelectorAll("[data-summary-output]")) {
    value.textContent = "—";
    value.closest(".fb-summary__out").hidden = false;
  }
  summary.dataset.state = "error";
  delete summary.dataset.updating;
  summary.hidden = false;
}

// A tap on the summary: the full result, or on an error the field to fix.
export function wireSummary(root) {
  const summary = root.querySelector("[data-summary]");
  if (!summary || summary.fbWired) return;
  summary.fbWired = true;
  // Focus scrolling keeps a field clear of the sticky summary: the page's top scroll padding
  // follows its height (CSS: --fb-summary-height).
  new ResizeObserver(() => {
    if (summary.offsetHeight) {
      document.documentElement.style.setProperty("--fb-summary-height", `${summary.offsetHeight}px`);
    }
  }).observe(summary);
  summary.addEventListener("click", (event) => {
    event.preventDefault();
    const reduce = window.matchMedia("(prefers-reduced-motion: reduce)").matches;
    const bad = root.dataset.state === "error" ? firstBadField(root) : null;
    const target = bad || root.querySelector(".fb-result");
    target.scrollIntoView({ behavior: reduce ? "auto" : "smooth", block: bad ? "center" : "start" });
    target.focus({ preventScroll: true });
  });
}

// --- the result ---------------------------------------------------------------------------------

export function renderResult(root, result) {
  for (const element of root.querySelectorAll("[data-output]")) {
    const output = result.outputs[element.dataset.output];
    element.textContent = output ? output.display : "n/a";
    element.title = output ? `${output.value} ${output.unit}`.trim() : NOT_APPLICABLE;
    // Outputs that do not apply are left out of the cards (the print leaves them out too).
    const card = element.closest(".fb-out");
    if (card) card.hidden = !output;
  }
  fillSummary(root, result);
  fillList(root.querySelector(".fb-checks"), result.checks, checkItem);
  fillList(root.querySelector(".fb-steps"), result.steps, stepItem);
  fillList(root.querySelector(".fb-assumptions"), result.assumptions, textItem);
  fillList(root.querySelector(".fb-sources"), result.sources, textItem);
  fillList(root.querySelector(".fb-cautions"), result.cautions, textItem);
  drawCharts(root.querySelector(".fb-charts"), result.series, displaySystem(root), lengthSystem(root));
  const organisation = document.querySelector('meta[name="fluxbook-organisation"]')?.content;
  const record = [`Fluxbook ${result.version}`, result.calculator];
  if (organisation) record.push(organisation);
  record.push(`computed ${new Date().toLocaleString()}`);
  root.querySelector(".fb-record").textContent = record.join(" · ");
  const panel = root.querySelector(".fb-result");
  panel.classList.remove("fb-result--stale", "fb-result--updating");
  panel.removeAttribute("aria-busy");
}

// While a new answer is worked out the last one stays, marked as updating: never a blank.
export function markUpdating(root) {
  const panel = root.querySelector(".fb-result");
  if (panel.classList.contains("fb-result--stale")) return; // nothing shown to keep
  panel.classList.add("fb-result--updating");
  panel.setAttribute("aria-busy", "true");
  const summary = root.querySelector("[data-summary]");
  if (summary) summary.dataset.updating = "";
}

// No result for these inputs (an error): no stale number beside a wrong input.
export function clearResult(root, errors) {
  for (const element of root.querySelectorAll("[data-output]")) {
    element.textContent = "—";
    element.removeAttribute("title");
    const card = element.closest(".fb-out");
    if (card) card.hidden = false;
  }
  for (const selector of [".fb-checks", ".fb-steps", ".fb-assumptions", ".fb-sources", ".fb-cautions"]) {
    root.querySelector(selector).replaceChildren();
  }
  clearCharts(root.querySelector(".fb-charts"));
  root.querySelector(".fb-record").textContent = "";
  const panel = root.querySelector(".fb-result");
  panel.classList.remove("fb-result--updating");
  panel.removeAttribute("aria-busy");
  panel.classList.add("fb-result--stale");
  summaryProblem(root, errors);
}
