// A calculator page's side of job records: the "save to job" action and its form, and the
// single-calculation print (inputs as a table, the verdict, the job it belongs to, the link that
// reopens it). The jobs page itself lives in jobs-page.js, loaded only where it is shown.
import * as forms from "./forms.js";
import * as store from "./jobs-store.js";
import * as view from "./jobs-view.js";

const el = view.el;
const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

const now = () => new Date().toISOString();

// Called by fluxbook.js after every result shown: what a save would store, and the print copy.
export function afterResult(root, inputs, result) {
  root.fbLast = { inputs, result };
  fillPrint(root);
}

function sameInputs(a, b) {
  const keys = new Set([...Object.keys(a || {}), ...Object.keys(b || {})]);
  for (const key of keys) if (String(a?.[key] ?? "") !== String(b?.[key] ?? "")) return false;
  return true;
}

// --- save to job ----------------------------------------------------------------------------

function parts(root) {
  return {
    button: root.querySelector('[data-action="save"]'),
    form: root.querySelector(".fb-save"),
    message: root.querySelector(".fb-save__msg"),
  };
}

function say(root, ...content) {
  const { message } = parts(root);
  message.replaceChildren(...content.map((part) => (typeof part === "string" ? el("span", "", part) : part)));
  message.hidden = false;
}

export function wireSave(root) {
  const { button, form } = parts(root);
  if (!button || !form) return;
  const context = view.reopened();
  if (context && context.calculator === root.dataset.calculator && Number(root.dataset.index || 0) === 0 &&
      context.search === window.location.search) {
    root.fbJob = context; // opened from a saved record: its job shows on the print
  }
  button.addEventListener("click", () => openSave(root));
  form.addEventListener("submit", (event) => { event.preventDefault(); confirmSave(root); });
  form.querySelector('[data-action="save-cancel"]').addEventListener("click", () => closeSave(root));
  form.elements.job_name.addEventListener("change", () => {
    const job = (root.fbJobs || []).find((j) => store.sameName(j.name, form.elements.job_name.value));
    if (job && !form.elements.site.value) form.elements.site.value = job.site || "";
  });
}

function closeSave(root) {
  const { button, form } = parts(root);
  form.hidden = true;
  button.setAttribute("aria-expanded", "false");
  button.focus();
}

async function openSave(root) {
  const { button, form } = parts(root);
  if (root.dataset.state !== "done" || !root.fbLast) {
    say(root, "Nothing to save yet: save once the calculation shows a result.");
    return;
  }
  form.hidden = false;
  button.setAttribute("aria-expanded", "true");
  parts(root).message.hidden = true;
  try {
    root.fbJobs = await store.listJobs();
  } catch (error) {
    root.fbJobs = [];
    say(root, `Saved jobs cannot be opened on this device: ${error.message || error}`);
  }
  const list = form.querySelector("datalist");
  list.replaceChildren(...root.fbJobs.map((job) => { const o = el("option"); o.value = job.name; return o; }));
  const fields = form.elements;
  const start = root.fbJob || root.fbJobs[0];
  if (!fields.job_name.value && start) {
    fields.job_name.value = start.name;
    fields.site.value = start.site || "";
  }
  fields.job_name.focus();
  fields.job_name.select();
}

async function confirmSave(root) {
  const { form } = parts(root);
  const fields = form.elements;
  const name = fields.job_name.value.trim();
  if (!name) {
    fields.job_name.setAttribute("aria-invalid", "true");
    fields.job_name.focus();
    say(root, "Give the job a name, such as “Pump house panel change”, to save to it.");
    return;
  }
  fields.job_name.removeAttribute("aria-invalid");
  if (root.dataset.state !== "done" || !root.fbLast) {
    say(root, "Not saved: the calculation has no result just now (an input is wrong or it is still working).");
    return;
  }
  const { inputs, result } = root.fbLast;
  const { series, ...shown } = result; // the chart is drawn again when the record is reopened
  const record = {
    calculator: root.dataset.calculator,
    title: root.getAttribute("aria-label") || root.dataset.calculator,
    inputs: { ...inputs },
    note: fields.note.value.trim(),
    saved: now(),
    fluxbook_version: result.version,
    result: shown,
  };
  let saved;
  try {
    saved = await store.saveRecord({ name, site: fields.site.value }, record, record.saved);
  } catch (error) {
    say(root, `Not saved: ${error.message || error}. Nothing stored was changed.`);
    return;
  }
  root.fbJob = { job: saved.job.id, name: saved.job.name, site: saved.job.site, inputs: record.inputs };
  fields.note.value = "";
  closeSave(root);
  const kept = await view.storageKept(true);
  const link = el("a", "", "Open saved jobs");
  link.href = new URL("jobs/", view.SITE_ROOT).href;
  const count = saved.count === 1 ? "1 calculation" : `${saved.count} calculations`;
  say(root, `Saved to “${saved.job.name}” (${count}) on this device. `, link, ".",
    ...(kept === "granted" ? [] : [el("span", "fb-save__warn", view.STORAGE_WORDS[kept])]));
  root.dataset.saved = String(saved.record.id);
  fillPrint(root);
}

// --- single-calculation print --------------------------------------------------------------

// The form as it reads: label and value of every field that holds one (the live twin of
// calc.jobs.shown_inputs, which labels saved records).
function formRows(root) {
  const rows = [];
  for (const field of root.querySelectorAll(".fb-form .fb-field")) {
    const control = field.querySelector("[name]");
    const label = field.querySelector("label");
    if (!control) continue;
    const words = label ? Array.from(label.childNodes)
      .filter((node) => !(node.classList && node.classList.contains("fb-field__unit")))
      .map((node) => node.textContent).join("").trim() : control.name;
    let text = control.tagName === "SELECT"
      ? (control.selectedOptions[0] ? control.selectedOptions[0].textContent : control.value)
      : control.value.trim();
    const unit = control.dataset.unit;
    if (unit && control.tagName !== "SELECT" && NUMBER.test(text)) text += ` ${view.UNIT_SYMBOLS[unit] || unit}`;
    rows.push({ label: words || control.name, text });
  }
  return rows;
}

function printPart(root, className, before) {
  let part = root.querySelector(`:scope > .${className}`);
  if (!part) {
    part = el("div", `fb-print ${className}`);
    part.setAttribute("aria-hidden", "true"); // a copy of what the page shows, for paper only
    root.insertBefore(part, before);
  }
  return part;
}

export function fillPrint(root) {
  const head = printPart(root, "fb-print-head", root.querySelector(".fb-form"));
  const content = [];
  const job = root.fbJob;
  if (job) {
    const where = [`Job: ${job.name}`, job.site ? `Site: ${job.site}` : ""].filter(Boolean).join(" · ");
    const changed = sameInputs(job.inputs, forms.readInputs(root)) ? "" : " (inputs changed since it was saved)";
    content.push(el("p", "fb-print-job", where + changed));
  }
  content.push(view.inputsTable(formRows(root)));
  if (root.dataset.state === "done" && root.fbLast) {
    content.push(view.verdictLine(root.fbLast.result.checks));
  } else {
    content.push(el("p", "fb-verdict", "No result: an input needs attention (see the messages on the page)."));
  }
  head.replaceChildren(...content);
  const foot = printPart(root, "fb-print-foot", root.querySelector(".fb-actions"));
  foot.replaceChildren(el("p", "", "Reopen this calculation: "), el("p", "fb-print-link", window.location.href));
}

// The print action: this calculation alone (the page's prose and other calculators left out).
export function printCalculation(root) {
  fillPrint(root);
  document.documentElement.dataset.fbPrint = "calculation";
  for (const other of document.querySelectorAll("[data-calculator][data-printing]")) delete other.dataset.printing;
  root.dataset.printing = "";
  window.print();
}

// Paper shows every section, folded or not (browsers without ::details-content need the open).
window.addEventListener("beforeprint", () => {
  for (const root of document.querySelectorAll("[data-calculator]")) if (root.fbWired) fillPrint(root);
  for (const section of document.querySelectorAll("details.fb-section:not([open])")) {
    section.open = true;
    section.dataset.printOpened = "";
  }
});
window.addEventListener("afterprint", () => {
  delete document.documentElement.dataset.fbPrint;
  for (const root of document.querySelectorAll("[data-calculator][data-printing]")) delete root.dataset.printing;
  for (const section of document.querySelectorAll("details.fb-section[data-print-opened]")) {
    section.open = false;
    delete section.dataset.printOpened;
  }
});

// --- the jobs page --------------------------------------------------------------------------

// Called on every page (Material's document$): shows the jobs page where it is.
export function initPage() {
  delete document.documentElement.dataset.fbView;
  delete document.documentElement.dataset.fbPrint;
  const page = document.querySelector("[data-jobs-page]");
  if (!page) return;
  import("./jobs-page.js").then((module) => module.showJobsPage(page), (error) => {
    page.dataset.state = "error";
    page.querySelector("[data-jobs-list]").textContent = `The jobs page could not start: ${error.message || error}`;
  });
}
