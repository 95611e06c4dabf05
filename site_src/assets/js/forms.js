// Reading and writing a calculator's form, its field messages, and its share-link parameters.
// Values from a link are data: they are set as element values, never parsed as HTML or code.

export function fields(root) {
  return Array.from(root.querySelectorAll(".fb-form [name]"));
}

export function readInputs(root) {
  const inputs = {};
  for (const element of fields(root)) inputs[element.name] = element.value;
  return inputs;
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
    if (event.target.name) clearSiblings(event.target);
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
}
