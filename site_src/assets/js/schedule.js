// The schedule page (schedule/): rows pasted from a spreadsheet or read from a CSV file are read
// by calc.batch in the worker, then checked there a chunk at a time, so the page stays
// responsive and a progress bar moves; the table of verdicts can be sorted, filtered, opened
// row by row, exported as CSV, printed, and saved to a job. Every text is set as text, never
// as HTML: the rows are data.
import { engine } from "./engine.js";
import * as store from "./jobs-store.js";
import * as view from "./jobs-view.js";

const el = view.el;
const CALCULATOR = "circuit-check";
const CHUNK_ROWS = 50; // rows a worker request checks: a progress step, a few tens of ms
const MAX_SAVED = 500; // = calc.jobs.MAX_RECORDS: a job file holds at most this many records
const UNITS_KEY = "fluxbook-units"; // the device's unit system (forms.js), for blank cells
const RANK = { fail: 3, warn: 2, pass: 1, none: 0, rejected: 4 };
const WORDS = { ...view.VERDICT_WORDS, rejected: "Rejected" };
const TEMPLATE_URL = new URL("schedules/school-kitchen-panel.csv", view.SITE_ROOT);

function part(root, selector) {
  return root.querySelector(selector);
}

function say(element, text, status = "") {
  element.textContent = text;
  element.hidden = !text;
  if (status) element.dataset.status = status;
  else delete element.dataset.status;
}

function deviceSystem() {
  try {
    const stored = localStorage.getItem(UNITS_KEY);
    return stored === "iec" || stored === "na" ? stored : null;
  } catch (error) {
    return null; // storage refused (a private window): North American defaults
  }
}

// --- reading and checking ----------------------------------------------------------------------

async function readText(root) {
  const file = part(root, 'input[name="schedule_file"]').files[0];
  if (file) return file.text();
  return part(root, 'textarea[name="schedule_text"]').value;
}

async function check(root) {
  if (root.dataset.state === "checking") return;
  const message = part(root, "[data-message]");
  say(message, "");
  const text = await readText(root);
  if (!text.trim()) {
    say(message, "Paste the rows of a schedule, or choose a CSV file, first (the template shows the columns).", "error");
    return;
  }
  root.dataset.state = "checking";
  part(root, '[data-action="check"]').disabled = true;
  const region = part(root, 'select[name="region"]').value;
  const progress = part(root, "[data-progress]");
  const status = part(root, "[data-progress-text]");
  part(root, "[data-progress-box]").hidden = false;
  progress.value = 0;
  say(status, "Reading the rows…");
  try {
    await engine().ready;
    const began = performance.now();
    const parsed = await engine().batch("parse", { calculator: CALCULATOR, text });
    if (!parsed.ok) throw new Error(parsed.errors.map((e) => e.message).join("; "));
    const rows = parsed.rows;
    root.fbRows = rows;
    root.fbRecords = [];
    progress.max = Math.max(rows.length, 1);
    startTable(root, rows.length);
    for (let at = 0; at < rows.length; at += CHUNK_ROWS) {
      const chunk = rows.slice(at, at + CHUNK_ROWS);
      const records = await engine().batch("check", { calculator: CALCULATOR, rows: chunk, region, display: region });
      if (!Array.isArray(records)) throw new Error(records.errors.map((e) => e.message).join("; "));
      root.fbRecords.push(...records);
      appendRows(root, records);
      progress.value = Math.min(at + chunk.length, rows.length);
      say(status, `Checked ${progress.value} of ${rows.length} circuits…`);
    }
    root.dataset.checkMs = String(Math.round(performance.now() - began));
    root.fbRegion = region;
    finishTable(root);
    say(status, `Checked ${rows.length} circuit${rows.length === 1 ? "" : "s"}.`);
    root.dataset.state = "done";
  } catch (error) {
    say(message, `The schedule could not be checked: ${error.message || error}`, "error");
    root.dataset.state = "error";
  } finally {
    part(root, '[data-action="check"]').disabled = false;
  }
}

// --- the table -----------------------------------------------------------------------------

function verdictOf(record) {
  return record.ok ? record.verdict || "none" : "rejected";
}

function problemText(record) {
  return record.errors.map((error) => {
    const where = error.column ? `${error.column}` + (error.value !== null && error.value !== undefined && error.value !== "" ? ` = ${error.value}` : "") : "row";
    return `${where}: ${error.message}`;
  }).join("; ");
}

function rowElement(root, record) {
  const verdict = verdictOf(record);
  const tr = el("tr");
  tr.dataset.row = String(record.row);
  tr.dataset.verdict = verdict;
  tr.dataset.governing = record.governing || "";
  const open = el("button", "fb-schedule__open", record.circuit);
  open.type = "button";
  open.dataset.action = "open";
  open.setAttribute("aria-label", `Open ${record.circuit} (row ${record.row})`);
  open.addEventListener("click", () => openRow(root, record));
  const circuit = el("td");
  circuit.append(open);
  const badge = el("span", `fb-schedule__verdict fb-schedule__verdict--${verdict}`, WORDS[verdict] || verdict);
  const verdictCell = el("td");
  verdictCell.append(badge);
  const fix = record.ok ? (record.outputs.fix ? record.outputs.fix.display : "") : problemText(record);
  tr.append(el("td", "", record.row), circuit, verdictCell, el("td", "", record.governing || "—"),
    el("td", "fb-schedule__fix", fix));
  return tr;
}

function startTable(root, count) {
  part(root, "[data-results]").hidden = false;
  part(root, "[data-rows]").replaceChildren();
  part(root, "[data-detail]").hidden = true;
  part(root, "[data-caption]").textContent = `Circuits (${count})`;
  part(root, "[data-summary]").textContent = "";
  setFilter(root, "all");
  root.fbSort = { key: "row", descending: false };
  showSort(root);
}

function appendRows(root, records) {
  const body = part(root, "[data-rows]");
  const fragment = document.createDocumentFragment();
  const filter = root.fbFilter || "all";
  for (const record of records) {
    const tr = rowElement(root, record);
    tr.hidden = filter !== "all" && tr.dataset.verdict !== filter;
    fragment.append(tr);
  }
  body.append(fragment);
}

function finishTable(root) {
  const counts = { pass: 0, warn: 0, fail: 0, rejected: 0, none: 0 };
  for (const record of root.fbRecords) counts[verdictOf(record)] += 1;
  const parts = [`${counts.fail} not OK`, `${counts.warn} to check`, `${counts.pass} OK`];
  if (counts.rejected) parts.push(`${counts.rejected} rejected (row ${root.fbRecords.filter((r) => !r.ok).map((r) => r.row).join(", ")})`);
  const summary = part(root, "[data-summary]");
  summary.textContent = `${root.fbRecords.length} circuits: ${parts.join(", ")}.`;
  for (const [key, value] of Object.entries(counts)) summary.dataset[key] = String(value);
  if (root.fbSort.key !== "row" || root.fbSort.descending) sortTable(root); // else in order
}

const SORTERS = {
  row: (a, b) => a.row - b.row,
  circuit: (a, b) => a.circuit.localeCompare(b.circuit, undefined, { numeric: true }) || a.row - b.row,
  verdict: (a, b) => RANK[verdictOf(b)] - RANK[verdictOf(a)] || a.row - b.row,
  governing: (a, b) => (a.governing || "~").localeCompare(b.governing || "~") || a.row - b.row,
};

function sortTable(root) {
  const { key, descending } = root.fbSort;
  const body = part(root, "[data-rows]");
  const rows = new Map(Array.from(body.children).map((tr) => [Number(tr.dataset.row), tr]));
  const records = [...root.fbRecords].sort(SORTERS[key]);
  if (descending) records.reverse();
  body.append(...records.map((record) => rows.get(record.row)).filter(Boolean));
  showSort(root);
}

function showSort(root) {
  for (const button of root.querySelectorAll("[data-sort]")) {
    const active = button.dataset.sort === root.fbSort.key;
    button.closest("th").setAttribute("aria-sort", active ? (root.fbSort.descending ? "descending" : "ascending") : "none");
  }
}

function setFilter(root, filter) {
  root.fbFilter = filter;
  for (const button of root.querySelectorAll("[data-filter]")) {
    button.setAttribute("aria-pressed", String(button.dataset.filter === filter));
  }
  applyFilter(root);
}

function applyFilter(root) {
  const filter = root.fbFilter || "all";
  for (const tr of part(root, "[data-rows]").children) tr.hidden = filter !== "all" && tr.dataset.verdict !== filter;
}

// --- one row in full -------------------------------------------------------------------------

async function openRow(root, record) {
  const detail = part(root, "[data-detail]");
  const row = root.fbRows.find((r) => r.row === record.row);
  const back = el("button", "fb-button fb-button--quiet", "Back to the table");
  back.type = "button";
  back.addEventListener("click", () => {
    detail.hidden = true;
    const open = root.querySelector(`tr[data-row="${record.row}"] [data-action="open"]`);
    if (open) open.focus();
  });
  detail.replaceChildren(el("h2", "", `Row ${record.row}: ${record.circuit}`), el("p", "", "Working out the full result…"));
  detail.dataset.row = String(record.row);
  detail.hidden = false;
  detail.focus();
  const rows = view.inputsTable(Object.entries(row.inputs).map(([name, value]) => ({ label: name, text: String(value) })));
  if (!record.ok) {
    detail.replaceChildren(el("h2", "", `Row ${record.row}: ${record.circuit}`),
      el("p", "fb-schedule__problem", `Rejected: ${problemText(record)}`), rows, back);
    return;
  }
  let result;
  try {
    result = await engine().run(CALCULATOR, row.inputs, root.fbRegion);
  } catch (error) {
    detail.replaceChildren(el("h2", "", `Row ${record.row}`), el("p", "", `The result could not be worked out: ${error.message || error}`), back);
    return;
  }
  const link = el("a", "fb-button fb-button--quiet", "Open in the calculator");
  link.href = view.reopenURL(CALCULATOR, row.inputs).href;
  const body = [el("h2", "", `Row ${record.row}: ${record.circuit}`), governingLine(result), rows];
  if (result.ok) {
    body.push(el("h3", "", "Results"), view.outputsList(result.outputs), el("h3", "", "Checks"),
      view.checksList(result.checks), el("h3", "", "Method"), view.stepsList(result.steps));
  } else {
    body.push(el("p", "", result.errors.map((e) => e.message).join("; ")));
  }
  const actions = el("div", "fb-schedule__buttons");
  actions.append(back, link);
  body.push(actions);
  detail.replaceChildren(...body);
}

// The verdict as the schedule's table gives it: the governing check speaks, with its fix.
function governingLine(result) {
  if (!result.ok) return view.verdictLine([]);
  const governing = result.outputs.governing ? result.outputs.governing.value : null;
  const chosen = result.checks.find((check) => check.name === governing);
  if (!chosen) return view.verdictLine(result.checks);
  const line = view.verdictLine([chosen]);
  line.querySelector(".fb-verdict__text").textContent = `${chosen.name}: ${chosen.message}`;
  return line;
}

// --- export, print, save -----------------------------------------------------------------------

function cell(value) {
  let text = value === null || value === undefined ? "" : String(value);
  if (typeof value !== "number" && /^[=+\-@\t\r]/.test(text)) text = "'" + text;
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

async function exportCsv(root) {
  if (!root.fbRecords || !root.fbRecords.length) return;
  const { columns } = await engine().batch("columns", { calculator: CALCULATOR });
  const lines = [columns.join(",")];
  for (const record of root.fbRecords) {
    lines.push(columns.map((column) => {
      if (column === "errors") return cell(record.errors.map((e) => `${e.column || "row"}: ${e.message}`).join("; "));
      if (column === "ok") return record.ok ? "yes" : "no";
      if (column in record && column !== "outputs") return cell(record[column]);
      const output = record.outputs[column];
      return output === undefined ? "" : cell(output.value);
    }).join(","));
  }
  const blob = new Blob([lines.join("\n") + "\n"], { type: "text/csv" });
  const link = el("a");
  link.href = URL.createObjectURL(blob);
  link.download = "schedule-check.csv";
  document.body.append(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(link.href), 10000);
}

function printTable() {
  document.documentElement.dataset.fbPrint = "schedule";
  window.print();
}

window.addEventListener("afterprint", () => {
  if (document.documentElement.dataset.fbPrint === "schedule") delete document.documentElement.dataset.fbPrint;
});

function toggleSave(root, open) {
  const form = part(root, "[data-save-form]");
  form.hidden = !open;
  part(root, '[data-action="save-job"]').setAttribute("aria-expanded", String(open));
  if (open) form.elements.job_name.focus();
}

async function save(root) {
  const form = part(root, "[data-save-form]");
  const note = part(root, "[data-save-message]");
  const name = form.elements.job_name.value.trim();
  if (!name) {
    form.elements.job_name.setAttribute("aria-invalid", "true");
    say(note, "Give the job a name, such as “School kitchen panel KP”, to save to it.", "error");
    return;
  }
  form.elements.job_name.removeAttribute("aria-invalid");
  const checked = root.fbRecords.filter((record) => record.ok);
  const kept = checked.slice(0, MAX_SAVED);
  const rows = new Map(root.fbRows.map((row) => [row.row, row]));
  say(note, `Saving ${kept.length} circuits…`);
  try {
    let saved = null;
    for (let at = 0; at < kept.length; at += CHUNK_ROWS) {
      const chunk = kept.slice(at, at + CHUNK_ROWS).map((record) => rows.get(record.row));
      const full = await engine().batch("check", { calculator: CALCULATOR, rows: chunk, region: root.fbRegion, display: root.fbRegion, full: true });
      for (const record of full) {
        if (!record.ok) continue;
        const stamp = new Date().toISOString();
        saved = await store.saveRecord({ name, site: form.elements.site.value }, {
          calculator: CALCULATOR, title: "Check a whole circuit", inputs: { ...rows.get(record.row).inputs },
          note: `${record.circuit} (schedule row ${record.row})`, saved: stamp,
          fluxbook_version: record.result.version, result: record.result,
        }, stamp);
      }
      say(note, `Saving… ${Math.min(at + CHUNK_ROWS, kept.length)} of ${kept.length}`);
    }
    const left = root.fbRecords.length - kept.length;
    const link = el("a", "", "Open saved jobs");
    link.href = new URL("jobs/", view.SITE_ROOT).href;
    note.replaceChildren(`Saved ${kept.length} circuits to “${saved ? saved.job.name : name}” on this device` +
      (left ? ` (${left} not saved: rejected rows, or beyond ${MAX_SAVED} a job)` : "") + ". ", link, ".");
    note.hidden = false;
    note.dataset.status = "done";
    root.dataset.saved = String(kept.length);
    toggleSave(root, false);
  } catch (error) {
    say(note, `Not all saved: ${error.message || error}.`, "error");
  }
}

// --- wiring ----------------------------------------------------------------------------------

async function fillTemplate(root) {
  try {
    const response = await fetch(TEMPLATE_URL);
    part(root, 'textarea[name="schedule_text"]').value = await response.text();
    part(root, 'input[name="schedule_file"]').value = "";
  } catch (error) {
    say(part(root, "[data-message]"), `The template could not be read: ${error.message || error}`, "error");
  }
}

function wire(root) {
  if (root.fbWired) return;
  root.fbWired = true;
  root.fbRecords = [];
  root.fbRows = [];
  const region = deviceSystem();
  if (region) part(root, 'select[name="region"]').value = region;
  part(root, "[data-schedule-form]").addEventListener("submit", (event) => { event.preventDefault(); check(root); });
  part(root, '[data-action="template"]').addEventListener("click", () => fillTemplate(root));
  for (const button of root.querySelectorAll("[data-filter]")) {
    button.addEventListener("click", () => setFilter(root, button.dataset.filter));
  }
  for (const button of root.querySelectorAll("[data-sort]")) {
    button.addEventListener("click", () => {
      const key = button.dataset.sort;
      root.fbSort = { key, descending: root.fbSort && root.fbSort.key === key ? !root.fbSort.descending : false };
      sortTable(root);
    });
  }
  part(root, '[data-action="export-csv"]').addEventListener("click", () => exportCsv(root));
  part(root, '[data-action="print"]').addEventListener("click", printTable);
  part(root, '[data-action="save-job"]').addEventListener("click", () => toggleSave(root, part(root, "[data-save-form]").hidden));
  part(root, '[data-action="save-cancel"]').addEventListener("click", () => toggleSave(root, false));
  part(root, "[data-save-form]").addEventListener("submit", (event) => { event.preventDefault(); save(root); });
  root.dataset.state = "idle";
  engine().ready.then(() => { root.dataset.engine = "ready"; }, () => { root.dataset.engine = "failed"; });
}

function init() {
  const root = document.querySelector("[data-schedule]");
  if (root) wire(root);
}

if (window.document$ && typeof window.document$.subscribe === "function") {
  window.document$.subscribe(init);
} else {
  init();
}
