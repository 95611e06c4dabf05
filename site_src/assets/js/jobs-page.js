// The jobs page (jobs/): the jobs saved on this device, newest first, each with its records;
// rename, delete with undo, duplicate, reopen; export as JSON or CSV, import a job file; and the
// job sheet (jobs/?sheet=ID) laid out for printing. Works offline: the store is on the device,
// and the calculator engine (for rechecks and imports) comes from the service worker's cache.
import { engine } from "./engine.js";
import * as store from "./jobs-store.js";
import * as view from "./jobs-view.js";

const el = view.el;
const now = () => new Date().toISOString();
const meta = (name) => document.querySelector(`meta[name="${name}"]`)?.content || "";
const plural = (n, word) => `${n} ${word}${n === 1 ? "" : "s"}`;
const reports = new Map(); // record id -> the engine's recheck report, for this visit

function button(text, action, quiet = true) {
  const element = el("button", `fb-button${quiet ? " fb-button--quiet" : ""}`, text);
  element.type = "button";
  element.dataset.action = action;
  return element;
}

export async function showJobsPage(page) {
  if (page.fbShown) return;
  page.fbShown = true;
  showStorage(page, false);
  const sheet = Number(new URLSearchParams(window.location.search).get("sheet"));
  if (sheet) {
    await showSheet(page, sheet);
    return;
  }
  wireImport(page);
  await refresh(page);
}

async function showStorage(page, ask) {
  const line = page.querySelector("[data-storage-status]");
  const kept = await view.storageKept(ask);
  line.dataset.persisted = kept;
  const words = el("span", "", view.STORAGE_WORDS[kept]);
  if (kept === "refused" && !ask) {
    const again = button("Ask the browser to keep them", "persist");
    again.addEventListener("click", () => showStorage(page, true));
    line.replaceChildren(words, " ", again);
  } else {
    line.replaceChildren(words);
  }
}

// --- the list -------------------------------------------------------------------------------

async function refresh(page) {
  const list = page.querySelector("[data-jobs-list]");
  let jobs;
  try {
    jobs = await store.listJobs();
  } catch (error) {
    page.dataset.state = "error";
    list.replaceChildren(el("p", "fb-jobs__msg", `Saved jobs cannot be opened on this device: ${error.message || error}`));
    return;
  }
  if (!jobs.length) {
    list.replaceChildren(el("p", "fb-jobs__empty", "No jobs saved on this device yet. On any calculator, " +
      "press “Save to job” once it shows a result."));
  } else {
    list.replaceChildren(...jobs.map((job) => jobElement(page, job)));
  }
  page.dataset.state = "ready";
  page.dataset.jobs = String(jobs.length);
  recheckAll(page, jobs);
}

function jobElement(page, job) {
  const part = el("section", "fb-job");
  part.dataset.job = String(job.id);
  const head = el("div", "fb-job__head");
  head.append(el("h2", "fb-job__name", job.name));
  const facts = [job.site ? `Site: ${job.site}` : "", plural(job.records.length, "calculation"),
    job.created ? `started ${view.formatDate(job.created, false)}` : "",
    job.updated ? `last changed ${view.formatDate(job.updated)}` : ""].filter(Boolean);
  head.append(el("p", "fb-job__meta", facts.join(" · ")));
  if (job.notes) head.append(el("p", "fb-job__notes", job.notes));
  const actions = el("div", "fb-job__actions");
  const sheet = el("a", "fb-button", "Job sheet (print)");
  sheet.href = `?sheet=${job.id}`;
  sheet.dataset.action = "sheet";
  const exportJson = button("Export (.json)", "export");
  const exportCsv = button("Results (.csv)", "export-csv");
  const rename = button("Rename", "rename");
  const remove = button("Delete job", "delete");
  actions.append(sheet, exportJson, exportCsv, rename, remove);
  exportJson.addEventListener("click", () => exportJob(job, "json"));
  exportCsv.addEventListener("click", () => exportJob(job, "csv"));
  remove.addEventListener("click", () => removeJob(page, job));
  const form = renameForm(page, job);
  rename.addEventListener("click", () => { form.hidden = !form.hidden; if (!form.hidden) form.elements.rename_name.focus(); });
  const records = el("ol", "fb-records");
  job.records.forEach((record, index) => records.append(recordElement(page, job, record, index)));
  part.append(head, actions, form);
  if (job.records.length) part.append(records);
  else part.append(el("p", "fb-jobs__empty", "No calculations left in this job."));
  return part;
}

function field(label, name, value, multiline = false) {
  const wrap = el("label", "fb-jobs__field");
  wrap.append(el("span", "", label));
  const input = el(multiline ? "textarea" : "input");
  input.name = name;
  input.value = value || "";
  if (!multiline) input.type = "text";
  wrap.append(input);
  return wrap;
}

function renameForm(page, job) {
  const form = el("form", "fb-job__rename");
  form.hidden = true;
  form.noValidate = true;
  form.append(field("Job name", "rename_name", job.name), field("Site", "rename_site", job.site),
    field("Notes", "rename_notes", job.notes, true));
  const save = button("Save changes", "rename-confirm", false);
  save.type = "submit";
  const cancel = button("Cancel", "rename-cancel");
  const message = el("p", "fb-jobs__msg");
  message.setAttribute("role", "alert");
  const buttons = el("div", "fb-jobs__buttons");
  buttons.append(save, cancel);
  form.append(buttons, message);
  cancel.addEventListener("click", () => { form.hidden = true; });
  form.addEventListener("submit", async (event) => {
    event.preventDefault();
    const name = form.elements.rename_name.value.trim();
    if (!name) { message.textContent = "A job needs a name."; return; }
    try {
      await store.updateJob(job.id, { name, site: form.elements.rename_site.value.trim(),
        notes: form.elements.rename_notes.value.trim() }, now());
    } catch (error) {
      message.textContent = `Not changed: ${error.message || error}`;
      return;
    }
    await refresh(page);
  });
  return form;
}

function keyResults(record) {
  const outputs = Object.values((record.result && record.result.outputs) || {});
  return outputs.slice(0, 3).map((output) => output.display).join(" · ");
}

function recordElement(page, job, record, index) {
  const item = el("li", "fb-rec");
  item.dataset.record = String(record.id);
  item.dataset.calculator = record.calculator;
  const summary = el("div", "fb-rec__summary");
  summary.append(el("span", "fb-rec__title", `${index + 1}. ${record.title || record.calculator}`));
  const status = view.verdictOf(record.result ? record.result.checks : []);
  summary.append(el("span", `fb-rec__verdict fb-verdict--${status}`, view.VERDICT_WORDS[status]));
  if (record.note) summary.append(el("span", "fb-rec__note", record.note));
  summary.append(el("span", "fb-rec__key", keyResults(record)));
  const body = el("div", "fb-rec__body");
  body.id = `fb-record-${record.id}`;
  body.hidden = true;
  body.append(view.recordBody(record, reports.get(record.id)));
  const toggle = button("Details", "details");
  toggle.setAttribute("aria-expanded", "false");
  toggle.setAttribute("aria-controls", body.id);
  toggle.addEventListener("click", () => {
    body.hidden = !body.hidden;
    toggle.setAttribute("aria-expanded", String(!body.hidden));
    toggle.textContent = body.hidden ? "Details" : "Hide details";
  });
  const actions = el("div", "fb-rec__actions");
  const reopen = el("a", "fb-button", "Open in the calculator");
  reopen.dataset.action = "reopen";
  const setLink = () => {
    const url = view.reopenURL(record.calculator, record.inputs);
    reopen.href = url.href;
    return url;
  };
  setLink();
  reopen.addEventListener("click", () => {
    const url = setLink();
    view.rememberReopen({ calculator: record.calculator, search: url.search, job: job.id,
      record: record.id, name: job.name, site: job.site, inputs: record.inputs });
  });
  const duplicate = button("Duplicate", "duplicate");
  duplicate.addEventListener("click", async () => {
    const note = `Variant of ${record.note || record.title || record.calculator}`.slice(0, 1000);
    await store.duplicateRecord(record.id, note);
    await refresh(page);
  });
  const remove = button("Delete", "delete-record");
  remove.addEventListener("click", async () => {
    const snapshot = await store.deleteRecord(record.id);
    offerUndo(page, `Deleted “${record.title || record.calculator}” from “${job.name}”.`, snapshot);
    await refresh(page);
  });
  actions.append(reopen, toggle, duplicate, remove);
  item.append(summary, actions, body);
  item.fbRecord = record;
  item.fbSetLink = setLink;
  return item;
}

function offerUndo(page, text, snapshot) {
  const bar = page.querySelector("[data-undo]");
  const undo = button("Undo", "undo", false);
  undo.addEventListener("click", async () => {
    bar.hidden = true;
    await store.restore(snapshot);
    await refresh(page);
  });
  bar.replaceChildren(el("span", "", text), undo);
  bar.hidden = false;
}

async function removeJob(page, job) {
  const snapshot = await store.deleteJob(job.id);
  offerUndo(page, `Deleted the job “${job.name}” and its ${plural(job.records.length, "calculation")}.`, snapshot);
  await refresh(page);
}

// Each record recomputed by today's engine (calc.jobs.recheck): same, differs, or cannot; older
// input names it reports renamed are written back to the store (values untouched).
async function recheckAll(page, jobs) {
  const sequence = (page.fbRecheck || 0) + 1;
  page.fbRecheck = sequence;
  page.dataset.recheck = "pending";
  const running = engine();
  try {
    await running.ready;
  } catch (error) {
    page.dataset.recheck = "failed";
    return;
  }
  for (const job of jobs) {
    for (const record of job.records) {
      if (page.fbRecheck !== sequence) return; // the list was drawn again
      const report = await recheckOne(record);
      if (!report) continue;
      const item = page.querySelector(`[data-record="${record.id}"]`);
      if (!item) continue;
      const body = item.querySelector(".fb-sheet-record__body");
      body.replaceWith(view.recordBody(record, report));
      item.dataset.recheck = report.ok ? (report.differences.length ? "differs" : "same") : "error";
      item.fbSetLink();
    }
  }
  if (page.fbRecheck === sequence) page.dataset.recheck = "done";
}

async function recheckOne(record) {
  if (reports.has(record.id)) return reports.get(record.id);
  const fields = {};
  for (const name of store.RECORD_FIELDS) if (record[name] !== undefined) fields[name] = record[name];
  let report;
  try {
    report = await engine().call("recheck", fields);
  } catch (error) {
    return null;
  }
  if (report.renamed && report.renamed.length) {
    record.inputs = report.inputs;
    await store.updateRecord(record.id, { inputs: report.inputs });
  }
  reports.set(record.id, report);
  return report;
}

// --- export ---------------------------------------------------------------------------------

function fileName(job, extension) {
  const slug = job.name.normalize("NFKD").replace(/[^A-Za-z0-9]+/g, "-").replace(/^-|-$/g, "")
    .toLowerCase().slice(0, 60) || "job";
  return `fluxbook-${slug}-${now().slice(0, 10)}.${extension}`;
}

function download(name, text, type) {
  const url = URL.createObjectURL(new Blob([text], { type }));
  const link = el("a");
  link.href = url;
  link.download = name;
  link.hidden = true;
  document.body.append(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(url), 60000);
}

async function exportJob(job, kind) {
  const fresh = (await store.getJob(job.id)) || job;
  if (kind === "csv") {
    download(fileName(fresh, "csv"), store.jobCsv(fresh, view.verdictOf), "text/csv");
  } else {
    const file = store.jobFile(fresh, meta("fluxbook-version"), now());
    download(fileName(fresh, "json"), JSON.stringify(file, null, 1) + "\n", "application/json");
  }
}

// --- import ---------------------------------------------------------------------------------

function wireImport(page) {
  const input = page.querySelector('input[type="file"][name="import"]');
  input.addEventListener("change", async () => {
    const file = input.files && input.files[0];
    if (!file) return;
    await importFile(page, file);
    input.value = "";
  });
}

function importSay(page, status, ...lines) {
  const box = page.querySelector("[data-import-message]");
  box.dataset.status = status;
  box.replaceChildren(...lines.map((line) => (typeof line === "string" ? el("p", "", line) : line)));
  box.hidden = false;
}

// "job.records[1].inputs.kva" -> "record 2, input kva": where a problem is, in plain words.
function place(where) {
  return where.replace(/^job\.records\[(\d+)\]/, (_, n) => `record ${Number(n) + 1}`)
    .replace(/\.inputs\./, ", input ").replace(/^job\./, "job ").replace(/^file$/, "the file")
    .replace(/\./g, " › ");
}

function problemList(problems) {
  const list = el("ul");
  for (const problem of problems.slice(0, 6)) list.append(el("li", "", `${place(problem.where)}: ${problem.message}`));
  if (problems.length > 6) list.append(el("li", "", `and ${problems.length - 6} more`));
  return list;
}

async function importFile(page, file) {
  const name = file.name || "the file";
  importSay(page, "checking", `Checking “${name}”…`);
  let info;
  let checked;
  try {
    info = await engine().call("format", null);
    if (file.size > info.max_file_bytes) {
      importSay(page, "error", `“${name}” was not imported: ${(file.size / 1e6).toFixed(1)} MB is too large ` +
        `for a job file (at most ${info.max_file_bytes / 1e6} MB). Nothing on this device was changed.`);
      return;
    }
    checked = await engine().call("check_job", await file.text());
  } catch (error) {
    importSay(page, "error", `“${name}” could not be checked: the calculator engine is not running ` +
      `(${error.message || error}). Reload the page and try again. Nothing on this device was changed.`);
    return;
  }
  const refused = checked.problems.filter((problem) => problem.kind === "file");
  if (!checked.job || refused.length) {
    importSay(page, "error", `“${name}” was not imported; nothing on this device was changed. What is wrong:`,
      problemList(refused.length ? refused : checked.problems));
    return;
  }
  let jobs;
  try {
    jobs = await store.listJobs();
  } catch (error) {
    importSay(page, "error", `Saved jobs cannot be opened on this device: ${error.message || error}`);
    return;
  }
  const same = jobs.find((job) => store.sameName(job.name, checked.job.name));
  let choice = { mode: "new", name: checked.job.name };
  if (same) {
    choice = await askMerge(page, checked.job.name, same, jobs);
    if (!choice) {
      importSay(page, "cancelled", `Import of “${name}” cancelled; nothing was changed.`);
      return;
    }
  }
  let stored;
  try {
    stored = await store.importJob(checked.job, choice, now());
  } catch (error) {
    importSay(page, "error", `“${name}” was not imported: ${error.message || error}. Nothing on this device was changed.`);
    return;
  }
  const lines = [`Imported “${stored.job.name}” from “${name}”: ${plural(stored.added, "calculation")} added` +
    (stored.skipped ? `, ${stored.skipped} already in the job.` : ".")];
  const notComputable = checked.problems.filter((problem) => problem.kind === "input");
  if (notComputable.length) {
    lines.push("Kept as saved, but this version cannot recompute them:", problemList(notComputable));
  }
  for (const notice of checked.notices) lines.push(notice);
  importSay(page, "done", ...lines);
  await refresh(page);
}

// A job of that name is here already: add to it, or keep both. Resolves to the choice or null.
function askMerge(page, name, same, jobs) {
  const box = page.querySelector("[data-import-choice]");
  return new Promise((resolve) => {
    let copyName = `${name} (imported)`;
    for (let n = 2; jobs.some((job) => store.sameName(job.name, copyName)); n += 1) copyName = `${name} (imported ${n})`;
    const merge = button(`Add its calculations to “${same.name}”`, "import-merge", false);
    const both = button(`Keep both (import as “${copyName}”)`, "import-both");
    const cancel = button("Cancel", "import-cancel");
    const finish = (choice) => { box.hidden = true; box.replaceChildren(); resolve(choice); };
    merge.addEventListener("click", () => finish({ mode: "merge", into: same.id }));
    both.addEventListener("click", () => finish({ mode: "new", name: copyName }));
    cancel.addEventListener("click", () => finish(null));
    box.replaceChildren(el("p", "", `A job named “${same.name}” is already on this device.`), merge, both, cancel);
    box.hidden = false;
    merge.focus();
  });
}

// --- the job sheet --------------------------------------------------------------------------

async function showSheet(page, id) {
  page.dataset.view = "sheet";
  document.documentElement.dataset.fbView = "sheet";
  const sheet = page.querySelector("[data-job-sheet]");
  sheet.hidden = false;
  const back = el("a", "fb-button fb-button--quiet", "Back to saved jobs");
  back.href = new URL("jobs/", view.SITE_ROOT).href;
  let job;
  try {
    job = await store.getJob(id);
  } catch (error) {
    sheet.replaceChildren(el("p", "fb-jobs__msg", `Saved jobs cannot be opened: ${error.message || error}`), back);
    page.dataset.state = "error";
    return;
  }
  if (!job) {
    sheet.replaceChildren(el("p", "fb-jobs__msg", "That job is not on this device (it may have been deleted)."), back);
    page.dataset.state = "ready";
    return;
  }
  const print = button("Print or save as PDF", "print-sheet", false);
  print.addEventListener("click", () => window.print());
  const tools = el("div", "fb-sheet__tools");
  tools.append(print, back);
  const draw = () => sheet.replaceChildren(tools, sheetElement(job));
  draw();
  page.dataset.state = "ready";
  page.dataset.sheet = "drawing";
  try {
    await engine().ready;
    for (const record of job.records) await recheckOne(record);
  } catch (error) { /* shown as saved, with input names instead of labels */ }
  draw();
  page.dataset.sheet = "ready";
}

function sheetElement(job) {
  const sheet = el("article", "fb-sheet");
  sheet.dataset.sheetJob = String(job.id);
  const head = el("header", "fb-sheet__head");
  const organisation = meta("fluxbook-organisation");
  if (organisation) head.append(el("p", "fb-sheet__org", organisation));
  head.append(el("h2", "fb-sheet__title", "Job sheet"));
  const facts = el("dl", "fb-sheet__facts");
  const fact = (term, value) => {
    if (!value) return;
    const item = el("div");
    item.append(el("dt", "", term), el("dd", "", value));
    facts.append(item);
  };
  fact("Job", job.name);
  fact("Site", job.site);
  fact("Date", view.formatDate(now(), false));
  fact("Job started", view.formatDate(job.created, false));
  fact("Calculations", String(job.records.length));
  fact("Fluxbook", meta("fluxbook-version"));
  head.append(facts);
  if (job.notes) head.append(el("p", "fb-sheet__notes", job.notes));
  sheet.append(head);
  job.records.forEach((record, index) => {
    const part = el("section", "fb-sheet-record");
    part.dataset.record = String(record.id);
    const title = el("h3", "fb-sheet-record__title", `${index + 1}. ${record.title || record.calculator}`);
    part.append(title);
    if (record.note) part.append(el("p", "fb-sheet-record__note", record.note));
    part.append(view.recordBody(record, reports.get(record.id)));
    const link = el("p", "fb-sheet-record__link", `Reopen: ${view.reopenURL(record.calculator, record.inputs).href}`);
    part.append(link);
    sheet.append(part);
  });
  sheet.append(signOff());
  return sheet;
}

function signOff() {
  const block = el("section", "fb-signoff");
  block.append(el("h3", "fb-signoff__title", "Sign-off"));
  for (const label of ["Calculated by", "Checked by", "Signature", "Date"]) {
    const line = el("div", "fb-signoff__line");
    line.append(el("span", "fb-signoff__label", label), el("span", "fb-signoff__blank"));
    block.append(line);
  }
  block.append(el("p", "fb-signoff__note", "Planning estimates from Fluxbook: check them against the " +
    "installation, the applicable code and the equipment's data before relying on them."));
  return block;
}
