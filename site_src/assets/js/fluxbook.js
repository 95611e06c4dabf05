// Page entry: wires every calculator on the page to the shared engine. Material's instant
// navigation swaps pages without reloading, so set-up runs from document$ on every page.
import { engine, STAGES, STARTS } from "./engine.js";
import * as forms from "./forms.js";
import { renderResult, clearResult, markUpdating, wireSummary } from "./results.js";
import { startOffline, onOffline, reportStorage } from "./pwa.js";
import * as jobs from "./jobs.js"; // save to job, the single-calculation print, the jobs page
import * as home from "./home.js"; // the home launcher and the recent calculations (issue 12)
import * as a11y from "./a11y.js"; // scroll regions, Enter computes, chart key numbers (issue 15)
import * as theme from "./theme-later.js"; // the theme's script, run after the first result (issue 12)

const DEBOUNCE_MS = 120; // issue 12: at most 150 ms from the last keystroke to the run
const OFFLINE_WORDS = {
  checking: "",
  stored: " · stored for offline use",
  unsupported: " · this browser cannot keep it offline",
  insecure: " · to keep it for offline use, open it at an https:// address (or localhost)",
};

function setState(root, state) {
  root.dataset.state = state;
}

function engineText(stage, detail, start) {
  // engine start (issue 12): say which start was used
  if (stage === "ready") return "Calculator engine ready" + (STARTS[start] ? ` (${STARTS[start]})` : "");
  if (stage === "failed" && engineWasReady) {
    return `Calculator engine stopped (${detail}). Reload the page to start it again.`;
  }
  if (stage === "failed") {
    return `Calculator engine failed to start (${detail}). Reload the page; if it keeps failing, ` +
      "open it once while online.";
  }
  return `Calculator engine starting: ${STAGES[stage] || stage}…`;
}

function showEngine(root, { stage, detail, start }) {
  const status = root.querySelector(".fb-engine__text");
  const engineState = stage === "ready" ? "ready" : stage === "failed" ? "failed" : "starting";
  root.dataset.engine = engineState;
  if (start) root.dataset.engineStart = start; // engine start (issue 12): "snapshot" | "normal"
  status.dataset.base = engineText(stage, detail, start);
  status.textContent = status.dataset.base + (engineState === "ready" ? OFFLINE_WORDS[root.fbOffline] || "" : "");
  if (engineState === "failed") setState(root, "error");
}

function updateLink(roots) {
  const search = forms.shareSearch(roots);
  if (search !== window.location.search) {
    history.replaceState(history.state, "", window.location.pathname + search + window.location.hash);
  }
}

async function compute(root, roots) {
  const sequence = (root.fbSequence || 0) + 1;
  root.fbSequence = sequence;
  setState(root, "computing");
  markUpdating(root); // the last result stays, marked, until the new one replaces it
  const inputs = forms.readInputs(root);
  let result;
  try {
    result = await engine().run(root.dataset.calculator, inputs, forms.displaySystem(root));
  } catch (error) {
    if (sequence !== root.fbSequence) return;
    const failure = [{ field: null, message: `The calculation could not run: ${error.message || error}` }];
    clearResult(root, failure);
    forms.showErrors(root, failure);
    setState(root, "error");
    return;
  }
  if (sequence !== root.fbSequence) return; // a newer input change is on its way
  if (result.ok) {
    forms.clearMessages(root);
    renderResult(root, result);
    a11y.describeCharts(root, result);
    jobs.afterResult(root, inputs, result);
    setState(root, "done");
  } else {
    forms.showErrors(root, result.errors);
    clearResult(root, result.errors);
    setState(root, "error");
  }
  updateLink(roots);
  if (result.ok) home.remember(root); // after the link holds these inputs
}

function copyLink(root) {
  const note = root.querySelector(".fb-actions__note");
  const url = window.location.href;
  const fallback = () => {
    // No clipboard (plain http on an internal server): show the link to copy by hand.
    const field = document.createElement("input");
    field.className = "fb-link-field";
    field.readOnly = true;
    field.value = url;
    note.replaceChildren(field);
    field.select();
  };
  if (navigator.clipboard && window.isSecureContext) {
    navigator.clipboard.writeText(url).then(() => { note.textContent = "Link copied."; }, fallback);
  } else {
    fallback();
  }
}

function wire(root, roots) {
  if (root.fbWired) return;
  root.fbWired = true;
  forms.prepare(root, (system) => {
    for (const each of roots) forms.setSystem(each, system, { remember: true });
    for (const each of roots) if (each.fbWired && each.dataset.state !== "starting") compute(each, roots);
  });
  forms.applyParams(root, window.location.search);
  forms.linkGroups(root);
  wireSummary(root);
  let timer = null;
  const schedule = () => {
    clearTimeout(timer);
    timer = setTimeout(() => compute(root, roots), DEBOUNCE_MS);
  };
  const form = root.querySelector(".fb-form");
  form.addEventListener("input", schedule);
  form.addEventListener("change", schedule);
  form.addEventListener("submit", (event) => { event.preventDefault(); compute(root, roots); });
  root.querySelector('[data-action="copy-link"]').addEventListener("click", () => copyLink(root));
  root.querySelector('[data-action="print"]').addEventListener("click", () => jobs.printCalculation(root));
  jobs.wireSave(root);
  a11y.wireCalculator(root);
  const running = engine();
  root.fbOffline = offlineState;
  listenToEngine(running);
  showEngine(root, running.state);
  running.ready.then(() => {
    showEngine(root, running.state);
    if (root.dataset.state === "starting") setState(root, "ready");
    compute(root, roots).finally(theme.loadTheme);
  }, theme.loadTheme);
}

// One stage listener for the whole visit (it outlives instant navigation): it shows the engine's
// state, including a failure after it was ready, on whichever calculators are showing.
let engineListening = false;
let engineWasReady = false;

function listenToEngine(running) {
  if (engineListening) return;
  engineListening = true;
  running.onStage((state) => {
    if (state.stage === "ready") engineWasReady = true;
    for (const root of currentRoots) if (root.fbWired) showEngine(root, state);
  });
}

// Instant navigation replaces the page's elements but not this module: one offline listener
// serves whatever page is showing, instead of one left behind per page visited.
let currentRoots = [];
let offlineState = "checking";

function initPage() {
  jobs.initPage();
  home.initPage();
  a11y.initPage();
  currentRoots = Array.from(document.querySelectorAll("[data-calculator]"));
  for (const root of currentRoots) wire(root, currentRoots);
  const report = document.querySelector("[data-offline-report]");
  if (report) reportStorage(report);
}

onOffline((state) => {
  offlineState = state;
  for (const root of currentRoots) {
    root.fbOffline = state;
    if (root.fbWired) showEngine(root, engine().state);
  }
  const report = document.querySelector("[data-offline-report]");
  if (report) reportStorage(report);
});
startOffline();
// The site's root, for the "not found" page served at any address (build/not_found.py).
try { localStorage.setItem("fluxbook-root", new URL("../../", import.meta.url).href); } catch (error) { /* no storage */ }
if (window.document$ && typeof window.document$.subscribe === "function") {
  window.document$.subscribe(initPage);
} else {
  // No theme yet (a calculator page runs it after its first result: theme-later.js), or none.
  initPage();
  theme.whenLoaded((document$) => {
    if (!document$ || typeof document$.subscribe !== "function") return;
    let replay = true; // the theme's stream first gives this page again: it is set up already
    document$.subscribe(() => {
      if (replay) replay = false;
      else initPage();
    });
  });
  theme.wireTriggers();
}
