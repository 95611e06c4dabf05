// A calculation drawn as a person reads it on paper or on the jobs page: an inputs table, the
// verdict, results, checks, method, sources and cautions. Shared by the jobs page, the job sheet
// and the single-calculation print. Every text is set with textContent, never as HTML: saved
// records and imported files are data only.

export const VERDICT_WORDS = { pass: "OK", warn: "Check", fail: "Not OK", none: "No checks" };
const STATUS_ORDER = ["pass", "warn", "fail"];
// sessionStorage: the saved record a calculator page was opened from (its job, for the print)
export const REOPENED_KEY = "fluxbook-reopened";
// How a declared unit reads beside a bare number (as calc.jobs._UNIT_SYMBOLS)
export const UNIT_SYMBOLS = { degC: "°C", ohm: "Ω" };

// The site's root, from this file's own address (assets/js/): right under any sub-path.
export const SITE_ROOT = new URL("../../", import.meta.url);

export function el(tag, className, text) {
  const element = document.createElement(tag);
  if (className) element.className = className;
  if (text !== undefined && text !== null) element.textContent = String(text);
  return element;
}

export function verdictOf(checks) {
  let worst = -1;
  for (const check of checks || []) worst = Math.max(worst, STATUS_ORDER.indexOf(check.status));
  return worst < 0 ? "none" : STATUS_ORDER[worst];
}

// "Not OK — The drop is 4.84 %, over the 3 % limit": the worst check speaks for the result.
export function verdictLine(checks, className = "fb-verdict") {
  const status = verdictOf(checks);
  const line = el("p", `${className} ${className}--${status}`);
  line.dataset.verdict = status;
  line.append(el("span", `${className}__badge`, VERDICT_WORDS[status]));
  const governing = (checks || []).find((check) => check.status === status);
  line.append(el("span", `${className}__text`, governing ? governing.message
    : "This calculation has no pass/fail checks; read the results against your own limits."));
  return line;
}

// rows: [{label, text}]; blank values are left out (they were not given).
export function inputsTable(rows, caption = "Inputs") {
  const table = el("table", "fb-inputs-table");
  table.append(el("caption", "", caption));
  const body = el("tbody");
  for (const row of rows) {
    if (!row.text) continue;
    const tr = el("tr");
    tr.append(el("th", "", row.label), el("td", "", row.text));
    tr.querySelector("th").scope = "row";
    body.append(tr);
  }
  table.append(body);
  return table;
}

export function outputsList(outputs) {
  const list = el("dl", "fb-sheet-outputs");
  for (const [name, output] of Object.entries(outputs || {})) {
    const item = el("div", "fb-sheet-outputs__item");
    const value = el("dd", "", output.display);
    value.dataset.output = name;
    item.append(el("dt", "", output.label), value);
    list.append(item);
  }
  return list;
}

export function checksList(checks) {
  const list = el("ul", "fb-sheet-checks");
  for (const check of checks || []) {
    const item = el("li", `fb-check fb-check--${check.status}`);
    item.dataset.check = check.name;
    item.dataset.status = check.status;
    item.append(el("span", "fb-check__badge", VERDICT_WORDS[check.status] || check.status),
      el("span", "", check.message));
    list.append(item);
  }
  return list;
}

export function stepsList(steps) {
  const list = el("ol", "fb-sheet-steps");
  for (const step of steps || []) {
    const item = el("li");
    item.append(el("span", "fb-step__text", step.text), el("code", "fb-step__formula", step.formula),
      el("code", "fb-step__result", step.result));
    list.append(item);
  }
  return list;
}

function section(title, content, className) {
  const part = el("section", `fb-sheet-part ${className || ""}`.trim());
  part.append(el("h4", "fb-sheet-part__title", title), content);
  return part;
}

function textList(items) {
  const list = el("ul");
  for (const item of items || []) list.append(el("li", "", item));
  return list;
}

export function formatDate(iso, withTime = true) {
  if (!iso) return "";
  const date = new Date(iso);
  if (Number.isNaN(date.getTime())) return String(iso);
  return withTime ? date.toLocaleString() : date.toLocaleDateString();
}

// Input rows of a record: labelled by calc.jobs (report.shown_inputs) once the engine has
// rechecked it, else by their names as saved.
export function recordInputRows(record, report) {
  if (report && report.shown_inputs && report.shown_inputs.length) return report.shown_inputs;
  return Object.entries(record.inputs || {}).map(([name, value]) => ({
    label: name, text: value === null || value === undefined ? "" : String(value),
  }));
}

// The link that reopens a record's calculator with its inputs (which recomputes it there).
export function reopenURL(calculator, inputs) {
  const url = new URL(`calculators/${encodeURIComponent(calculator)}/`, SITE_ROOT);
  const params = new URLSearchParams();
  for (const [name, value] of Object.entries(inputs || {})) {
    params.set(name, value === null || value === undefined ? "" : String(value));
  }
  url.search = params.toString();
  return url;
}

// What today's engine says of a saved record: same, different (both shown), or not computable.
export function recheckNote(report) {
  const note = el("div", "fb-recheck");
  if (!report) {
    note.dataset.recheck = "pending";
    note.append(el("p", "", "Rechecking with this version of Fluxbook…"));
    return note;
  }
  if (!report.ok) {
    note.dataset.recheck = "error";
    note.append(el("p", "fb-recheck__head", `Fluxbook ${report.version} cannot recompute this record; ` +
      "it is kept as saved:"));
    const list = el("ul");
    for (const error of report.errors || []) list.append(el("li", "", error.message));
    note.append(list);
    return note;
  }
  if (!report.differences.length) {
    note.dataset.recheck = "same";
    note.append(el("p", "", `Recomputed with Fluxbook ${report.version}: the same result.`));
    return note;
  }
  note.dataset.recheck = "differs";
  note.append(el("p", "fb-recheck__head", `Recomputed with Fluxbook ${report.version}, the result ` +
    "differs from the saved one (the method or data may have changed since):"));
  const table = el("table", "fb-recheck__table");
  const head = el("tr");
  head.append(el("th", "", ""), el("th", "", "Saved"), el("th", "", "Now"));
  table.append(head);
  for (const change of report.differences) {
    const row = el("tr");
    const label = change.kind === "check" ? `Check: ${change.label}` : change.label;
    const shown = (value) => (change.kind === "check" ? VERDICT_WORDS[value] || "—" : value) || "—";
    row.append(el("th", "", label), el("td", "", shown(change.saved)), el("td", "", shown(change.now)));
    table.append(row);
  }
  note.append(table);
  return note;
}

// Everything a record holds, in the order a reader wants it.
export function recordBody(record, report) {
  const body = el("div", "fb-sheet-record__body");
  const result = record.result;
  const saved = [record.saved ? `Saved ${formatDate(record.saved)}` : "Saved",
    record.fluxbook_version ? `with Fluxbook ${record.fluxbook_version}` : ""].filter(Boolean).join(" ");
  body.append(el("p", "fb-sheet-record__meta", saved));
  if (result) body.append(verdictLine(result.checks));
  body.append(inputsTable(recordInputRows(record, report)));
  if (!result) {
    body.append(el("p", "", "No result was saved with this record."));
  } else {
    body.append(section("Results", outputsList(result.outputs), "fb-sheet-part--results"));
    if (result.checks.length) body.append(section("Checks", checksList(result.checks)));
    body.append(section("Method", stepsList(result.steps), "fb-sheet-part--method"));
    for (const [key, title] of [["assumptions", "Assumptions"], ["sources", "Sources"],
      ["cautions", "Cautions"]]) {
      if (result[key] && result[key].length) {
        body.append(section(title, textList(result[key]), `fb-sheet-part--small fb-sheet-part--${key}`));
      }
    }
  }
  body.append(recheckNote(report));
  return body;
}

export function rememberReopen(context) {
  try {
    sessionStorage.setItem(REOPENED_KEY, JSON.stringify(context));
  } catch (error) { /* storage refused (a private window): the print just lacks the job line */ }
}

export function reopened() {
  try {
    return JSON.parse(sessionStorage.getItem(REOPENED_KEY) || "null");
  } catch (error) {
    return null;
  }
}

// Persistent storage: ask (only from a user's action, where browsers allow it) and say plainly
// what the browser answered.
export async function storageKept(ask) {
  const storage = navigator.storage;
  if (!storage || !storage.persisted) return "unknown";
  try {
    if (await storage.persisted()) return "granted";
    if (ask && storage.persist && await storage.persist()) return "granted";
  } catch (error) {
    return "unknown";
  }
  return "refused";
}

export const STORAGE_WORDS = {
  granted: "This browser has agreed to keep saved jobs on this device (persistent storage).",
  refused: "This browser has not agreed to keep saved jobs for good: it may clear them when the " +
    "device runs short of space, or (Safari) after about a week without a visit. Export the " +
    "jobs you need to keep.",
  unknown: "This browser does not say whether it will keep saved jobs; export the jobs you need " +
    "to keep.",
};
