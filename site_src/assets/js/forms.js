// Reading and writing a calculator's form, its field messages, and its share-link parameters.
// Values from a link are data: they are set as element values, never parsed as HTML or code.
import { SIZE_GROUPS } from "./sizes.js";

// The unit system the page shows (issue 12): one setting for the device, else the team's region.
export const UNITS_KEY = "fluxbook-units";
export const SYSTEMS = ["na", "iec"];
// A bare number in a length field is read in the shown system's unit, as its label says.
const LENGTH_UNITS = { na: "ft", iec: "m" };
const LENGTH_METRES = { ft: 0.3048, m: 1 };
const BARE_NUMBER = /^\s*[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?\s*$/;
const LENGTH_TEXT = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(ft|m)\s*$/;

export function fields(root) {
  return Array.from(root.querySelectorAll(".fb-form [name]"));
}

export function storedSystem() {
  try {
    const stored = localStorage.getItem(UNITS_KEY);
    return SYSTEMS.includes(stored) ? stored : null;
  } catch (error) {
    return null; // storage refused (private mode): the team's region
  }
}

export function displaySystem(root) {
  return root.dataset.units || storedSystem() || root.dataset.region || "na";
}

export function readInputs(root) {
  const inputs = {};
  const lengthUnit = LENGTH_UNITS[displaySystem(root)];
  for (const element of fields(root)) {
    let value = element.value;
    if (element.dataset.dimension === "length" && BARE_NUMBER.test(value)) value = `${value.trim()} ${lengthUnit}`;
    inputs[element.name] = value;
  }
  return inputs;
}

// The system of the lengths given ("150 ft": na; "45 m": iec) when they agree, else null: as
// calc.api reads them, so the chart's length axis says what the steps say.
const LENGTH_SYSTEMS = [[/(ft|in|['′’"″”])$/, "na"], [/(m|mm|cm|km)$/, "iec"]];

export function lengthSystem(root) {
  const found = new Set();
  for (const [name, value] of Object.entries(readInputs(root))) {
    const element = root.querySelector(`.fb-form [name="${CSS.escape(name)}"]`);
    if (!element || element.dataset.dimension !== "length" || !value.trim()) continue;
    const rule = LENGTH_SYSTEMS.find(([pattern]) => pattern.test(value.replace(/\s+/g, "")));
    found.add(rule ? rule[1] : null);
  }
  return found.size === 1 ? [...found][0] : null;
}

function setValue(element, value) {
  if (element.tagName === "SELECT" && !Array.from(element.options).some((o) => o.value === value)) {
    element.add(new Option(value, value)); // an unlisted value is kept, and Python judges it
  }
  element.value = value;
}

// Several calculators on one page share the query string: the first one's inputs are plain
// names, the others' are prefixed "<index>.", e.g. ?kva=75&1.kva=500
function prefix(root) {
  const index = Number(root.dataset.index || 0);
  return index === 0 ? "" : `${index}.`;
}

// Alternatives (a load as current, power or kVA) share a data-group: once one holds a value,
// the others are emptied, so a default the user did not type never conflicts with one they did.
function groupSiblings(element) {
  const field = element.closest(".fb-field[data-group]");
  if (!field) return [];
  const root = element.closest("[data-calculator]");
  return Array.from(root.querySelectorAll(`.fb-field[data-group="${CSS.escape(field.dataset.group)}"] [name]`))
    .filter((other) => other !== element);
}

function clearSiblings(element) {
  if (!element.value.trim()) return;
  for (const other of groupSiblings(element)) if (other.value !== "") other.value = "";
}

export function linkGroups(root) {
  root.querySelector(".fb-form").addEventListener("input", (event) => {
    if (!event.target.name) return;
    delete event.target.dataset.auto; // typed by the user now: never converted by the switch
    clearSiblings(event.target);
  });
}

export function applyParams(root, search) {
  const params = new URLSearchParams(search);
  const own = prefix(root);
  let applied = 0;
  const set = [];
  for (const element of fields(root)) {
    const value = params.get(own + element.name);
    if (value !== null) { setValue(element, value); applied += 1; set.push(element); }
  }
  // A link that gives one alternative and not the others: the others do not keep defaults.
  for (const element of set) {
    if (groupSiblings(element).every((other) => !set.includes(other))) clearSiblings(element);
  }
  openFolds(root);
  return applied;
}

export function shareSearch(roots) {
  const params = new URLSearchParams();
  for (const root of roots) {
    const own = prefix(root);
    for (const [name, value] of Object.entries(readInputs(root))) params.set(own + name, value);
  }
  return "?" + params.toString();
}

// --- the fold ("More inputs") -----------------------------------------------------------------

// A field holds what the page started with: its default, or the default shown in the other
// unit system by the switch.
function atDefault(element) {
  const start = element.dataset.default;
  if (start === undefined) return true;
  const value = element.value.trim();
  return value === start.trim() || (element.dataset.auto !== undefined && value === element.dataset.auto);
}

// The fold opens whenever it holds an error or a value that differs from the default, so a
// shared link never hides what makes its calculation different, and no error goes unseen.
export function openFolds(root) {
  for (const fold of root.querySelectorAll(".fb-more")) {
    const bad = fold.querySelector(".fb-field--bad");
    const changed = Array.from(fold.querySelectorAll("[name]")).some((element) => !atDefault(element));
    if ((bad || changed) && !fold.open) fold.open = true;
  }
}

// --- conductor sizes and the unit system ------------------------------------------------------

// Size fields come with their chosen size only; the standard list is shared (sizes.js), the
// shown system's groups first.
function fillSizes(root, system) {
  for (const select of root.querySelectorAll("select[data-sizes]")) {
    const chosen = select.value;
    const groups = [...SIZE_GROUPS].sort((a, b) => (b.system === system) - (a.system === system));
    const listed = new Set(groups.flatMap((group) => group.sizes));
    const parts = groups.map((group) => {
      const optgroup = document.createElement("optgroup");
      optgroup.label = group.label;
      for (const size of group.sizes) optgroup.append(new Option(size, size, false, size === chosen));
      return optgroup;
    });
    if (chosen && !listed.has(chosen)) parts.unshift(new Option(chosen, chosen, false, true));
    select.replaceChildren(...parts);
    select.value = chosen;
  }
}

function trimNumber(value) {
  return String(Number(value.toPrecision(4)));
}

// A length field still at its starting value is shown in the chosen system ("100 ft" becomes
// "30.48 m"), so the switch changes what the page shows without changing the calculation.
function convertLengths(root, system) {
  const unit = LENGTH_UNITS[system];
  for (const element of root.querySelectorAll('.fb-form [data-dimension="length"]')) {
    const label = element.closest(".fb-field").querySelector(".fb-field__unit");
    if (label) label.textContent = unit;
    if (!atDefault(element)) continue;
    const match = LENGTH_TEXT.exec(element.dataset.default || "");
    if (!match) continue;
    if (match[2] === unit) {
      element.value = element.dataset.default;
      delete element.dataset.auto;
    } else {
      const converted = `${trimNumber(Number(match[1]) * LENGTH_METRES[match[2]] / LENGTH_METRES[unit])} ${unit}`;
      element.value = converted;
      element.dataset.auto = converted;
    }
  }
}

// The switch: every calculator on the page, and the setting kept on this device.
export function setSystem(root, system, { remember = false } = {}) {
  if (!SYSTEMS.includes(system)) return;
  root.dataset.units = system;
  for (const choice of root.querySelectorAll("[data-units-choice]")) choice.checked = choice.value === system;
  fillSizes(root, system);
  convertLengths(root, system);
  if (remember) {
    try { localStorage.setItem(UNITS_KEY, system); } catch (error) { /* kept for this page only */ }
  }
}

// Before a link's values are applied: sizes listed, lengths and the switch in the shown system.
export function prepare(root, onSystemChange) {
  setSystem(root, displaySystem(root));
  for (const choice of root.querySelectorAll("[data-units-choice]")) {
    choice.addEventListener("change", () => {
      if (choice.checked) onSystemChange(choice.value);
    });
  }
}

// --- messages ---------------------------------------------------------------------------------

export function clearMessages(root) {
  for (const field of root.querySelectorAll(".fb-field")) {
    field.classList.remove("fb-field--bad");
    const control = field.querySelector("[name]");
    if (control) control.removeAttribute("aria-invalid");
    const msg = field.querySelector(".fb-field__msg");
    msg.textContent = "";
    msg.hidden = true;
  }
  const general = root.querySelector(".fb-general-msg");
  general.textContent = "";
  general.hidden = true;
}

export function fieldLabel(root, name) {
  const field = root.querySelector(`.fb-field[data-field="${CSS.escape(name)}"] label`);
  if (!field) return name;
  const unit = field.querySelector(".fb-field__unit");
  return unit ? field.textContent.slice(0, -unit.textContent.length).trim() : field.textContent.trim();
}

export function showErrors(root, errors) {
  clearMessages(root);
  const general = [];
  for (const error of errors) {
    const field = error.field && root.querySelector(`.fb-field[data-field="${CSS.escape(error.field)}"]`);
    if (!field) { general.push(error.message); continue; }
    field.classList.add("fb-field--bad");
    field.querySelector("[name]").setAttribute("aria-invalid", "true");
    const msg = field.querySelector(".fb-field__msg");
    msg.textContent = msg.textContent ? `${msg.textContent} ${error.message}` : error.message;
    msg.hidden = false;
  }
  if (general.length) {
    const box = root.querySelector(".fb-general-msg");
    box.textContent = general.join(" ");
    box.hidden = false;
  }
  openFolds(root); // an error in a folded field is never hidden
}

// The first field with an error (for the summary's "fix this" tap), or null.
export function firstBadField(root) {
  const field = root.querySelector(".fb-field--bad [name]");
  return field || null;
}
