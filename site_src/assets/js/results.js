// Rendering a result into a calculator's panel. Everything is set as text, never as HTML.
import { drawCharts, clearCharts } from "./charts.js";

const STATUS_WORDS = { pass: "OK", warn: "Check", fail: "Not OK" };

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

export function renderResult(root, result) {
  for (const element of root.querySelectorAll("[data-output]")) {
    const output = result.outputs[element.dataset.output];
    element.textContent = output ? output.display : "n/a";
    element.title = output ? `${output.value} ${output.unit}`.trim() : "does not apply to these inputs";
  }
  fillList(root.querySelector(".fb-checks"), result.checks, checkItem);
  fillList(root.querySelector(".fb-steps"), result.steps, stepItem);
  fillList(root.querySelector(".fb-assumptions"), result.assumptions, textItem);
  fillList(root.querySelector(".fb-sources"), result.sources, textItem);
  fillList(root.querySelector(".fb-cautions"), result.cautions, textItem);
  drawCharts(root.querySelector(".fb-charts"), result.series);
  const organisation = document.querySelector('meta[name="fluxbook-organisation"]')?.content;
  const record = [`Fluxbook ${result.version}`, result.calculator];
  if (organisation) record.push(organisation);
  record.push(`computed ${new Date().toLocaleString()}`);
  root.querySelector(".fb-record").textContent = record.join(" · ");
  root.querySelector(".fb-result").classList.remove("fb-result--stale");
}

export function clearResult(root) {
  for (const element of root.querySelectorAll("[data-output]")) {
    element.textContent = "—";
    element.removeAttribute("title");
  }
  for (const selector of [".fb-checks", ".fb-steps", ".fb-assumptions", ".fb-sources", ".fb-cautions"]) {
    root.querySelector(selector).replaceChildren();
  }
  clearCharts(root.querySelector(".fb-charts"));
  root.querySelector(".fb-record").textContent = "";
  root.querySelector(".fb-result").classList.add("fb-result--stale");
}
