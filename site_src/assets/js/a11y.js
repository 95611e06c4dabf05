// Keyboard and screen-reader help that the theme and the calculator markup leave out (issue 15):
// tables that scroll sideways become named, focusable regions; Enter in a field computes at
// once; a chart gets its key numbers in text beside it; the result summary is the polite live
// region. Everything shown is set as text, never as HTML.

import { axisScale } from "./charts.js";
import { displaySystem, lengthSystem } from "./forms.js";

const NUMBER = new Intl.NumberFormat(undefined, { maximumSignificantDigits: 3 });

// --- tables that scroll sideways -------------------------------------------------------------

function tableName(wrap) {
  const caption = wrap.querySelector("caption");
  if (caption && caption.textContent.trim()) return caption.textContent.trim();
  // The nearest heading before the table names it.
  let node = wrap;
  while (node && node !== document.body) {
    let previous = node.previousElementSibling;
    while (previous) {
      if (/^H[1-6]$/.test(previous.tagName)) return previous.textContent.replace("¶", "").trim();
      previous = previous.previousElementSibling;
    }
    node = node.parentElement;
  }
  return "";
}

let scrollObserver = null;

function updateScrollable(wrap) {
  // Only a table wider than its box is a stop on the Tab path: arrow keys then scroll it.
  if (wrap.scrollWidth > wrap.clientWidth + 1) wrap.setAttribute("tabindex", "0");
  else wrap.removeAttribute("tabindex");
}

export function labelScrollRegions(scope = document) {
  const wraps = scope.querySelectorAll(".md-typeset__scrollwrap");
  if (!scrollObserver && "ResizeObserver" in window) {
    scrollObserver = new ResizeObserver((entries) => {
      for (const entry of entries) updateScrollable(entry.target);
    });
  }
  for (const wrap of wraps) {
    if (wrap.fbRegion) continue;
    wrap.fbRegion = true;
    const name = tableName(wrap);
    wrap.setAttribute("role", "region");
    wrap.setAttribute("aria-label", name ? `Table: ${name} (scrolls sideways)` : "Table (scrolls sideways)");
    updateScrollable(wrap);
    if (scrollObserver) scrollObserver.observe(wrap);
  }
}

// --- the theme's navigation drawer (phones, tablets) ------------------------------------------

// The header's menu button is a <label> for a hidden checkbox: no Tab stop, no role. Make it a
// button a keyboard can reach; opened from the keyboard, focus moves into the drawer, and Escape
// closes it and comes back. (The theme clicks a focused label on Enter.)
function wireDrawerButton() {
  const button = document.querySelector('.md-header label[for="__drawer"]');
  const drawer = document.getElementById("__drawer");
  if (!button || !drawer || button.fbWired) return;
  button.fbWired = true;
  button.setAttribute("tabindex", "0");
  button.setAttribute("role", "button");
  button.setAttribute("aria-label", "Menu: all pages");
  button.setAttribute("aria-controls", "__drawer");
  const sync = () => button.setAttribute("aria-expanded", String(drawer.checked));
  sync();
  let fromKeyboard = false;
  button.addEventListener("keydown", (event) => {
    if (event.key === "Enter" || event.key === " ") fromKeyboard = true;
    if (event.key === " ") { event.preventDefault(); button.click(); }
  });
  drawer.addEventListener("change", () => {
    sync();
    if (drawer.checked && fromKeyboard) {
      // after the drawer is visible again (visibility switches at once on opening)
      requestAnimationFrame(() => document.querySelector(".md-sidebar--primary a[href], .md-sidebar--primary [tabindex='0']")?.focus());
    }
    fromKeyboard = false;
  });
  // In the capture phase, before the theme's own keyboard handling can close it first.
  document.addEventListener("keydown", (event) => {
    if (event.key === "Escape" && drawer.checked) {
      drawer.click();
      button.focus();
    }
  }, true);
  // In the drawer a top-level section ("Calculators") is a label the theme leaves out of the Tab
  // order (on a wide screen it is a heading): make it a button a keyboard can open, as its
  // sub-sections already are.
  const drawerWidth = window.matchMedia("(max-width: 76.234375em)");
  const sections = () => document.querySelectorAll('.md-sidebar--primary label.md-nav__link[for^="__nav_"][tabindex=""], .md-sidebar--primary label.md-nav__link[data-fb-section]');
  const syncSections = () => {
    for (const label of sections()) {
      const toggle = document.getElementById(label.htmlFor);
      label.dataset.fbSection = "";
      if (drawerWidth.matches) {
        label.setAttribute("tabindex", "0");
        label.setAttribute("role", "button");
        if (toggle) label.setAttribute("aria-expanded", String(toggle.checked));
      } else {
        label.setAttribute("tabindex", "");
        label.removeAttribute("role");
        label.removeAttribute("aria-expanded");
      }
      if (toggle && !toggle.fbSynced) {
        toggle.fbSynced = true;
        toggle.addEventListener("change", () => {
          if (drawerWidth.matches) label.setAttribute("aria-expanded", String(toggle.checked));
        });
      }
    }
  };
  syncSections();
  drawerWidth.addEventListener("change", syncSections);
  // Tab past the drawer's last link closes it: focus never goes on behind the open drawer.
  document.querySelector(".md-sidebar--primary")?.addEventListener("focusout", (event) => {
    const next = event.relatedTarget;
    if (drawer.checked && next && !event.currentTarget.contains(next) && next !== button) drawer.click();
  });
}

// On a phone the theme's search is a panel over the page, opened when its field takes focus. Tab
// out of it left the panel open over the page, hiding the focused element: close it when focus
// leaves the search.
function wireSearchPanel() {
  const search = document.querySelector(".md-search");
  const toggle = document.getElementById("__search");
  if (!search || !toggle || search.fbWired) return;
  search.fbWired = true;
  // The results' scroll box is no Tab stop of its own (its links are): closed, it is not seen.
  search.querySelector(".md-search__scrollwrap")?.setAttribute("tabindex", "-1");
  search.addEventListener("focusout", (event) => {
    if (toggle.checked && !search.contains(event.relatedTarget)) {
      toggle.checked = false;
      toggle.dispatchEvent(new Event("change"));
    }
  });
}

export function initPage() {
  wireDrawerButton();
  wireSearchPanel();
  labelScrollRegions();
  // The theme wraps its tables from the same page event; catch any it wraps after us. Then say
  // which page is set up (a hook for tests, like the calculators' data-state).
  requestAnimationFrame(() => {
    labelScrollRegions();
    document.documentElement.dataset.fbPage = window.location.pathname;
  });
}

// --- a calculator -----------------------------------------------------------------------------

export function wireCalculator(root) {
  const form = root.querySelector(".fb-form");
  if (form && !form.fbEnter) {
    form.fbEnter = true;
    // A form with many fields and no submit button ignores Enter: make Enter compute now.
    form.addEventListener("keydown", (event) => {
      const target = event.target;
      if (event.key !== "Enter" || event.isComposing || target.tagName !== "INPUT") return;
      event.preventDefault();
      form.requestSubmit();
    });
  }
  liveSummary(root);
}

// The answer-first summary ([data-summary]) is what a screen reader should hear when a result
// updates, politely and whole; the full result panel (steps, sources...) would be far too much
// to hear on every keystroke. The summary is a link (a tap opens the full result), so it keeps
// its role: only the live-region attributes are added.
function liveSummary(root) {
  const summary = root.querySelector("[data-summary]");
  if (!summary) return;
  if (!summary.hasAttribute("aria-live")) summary.setAttribute("aria-live", "polite");
  if (!summary.hasAttribute("aria-atomic")) summary.setAttribute("aria-atomic", "true");
  const result = root.querySelector(".fb-result");
  if (result && !summary.contains(result)) result.removeAttribute("aria-live");
}

// --- charts: the key numbers in text ---------------------------------------------------------

function withUnit(value, unit) {
  return unit ? `${NUMBER.format(value)} ${unit}` : NUMBER.format(value);
}

function valueAt(xs, ys, x) {
  const points = xs.map((px, i) => [px, ys[i]]).filter(([px, py]) => Number.isFinite(px) && Number.isFinite(py));
  if (!points.length) return null;
  points.sort((a, b) => a[0] - b[0]);
  if (x <= points[0][0]) return points[0][1];
  for (let i = 1; i < points.length; i += 1) {
    const [x1, y1] = points[i];
    if (x <= x1) {
      const [x0, y0] = points[i - 1];
      return x1 === x0 ? y1 : y0 + ((y1 - y0) * (x - x0)) / (x1 - x0);
    }
  }
  return points[points.length - 1][1];
}

// The chart's key numbers in words, in the units its axes show (charts.js's axisScale): each
// limit line's value, and at the case's mark the value of every line there. A chart without
// marks gives each line's range.
export function chartText(chart, system = "iec", lengths = null) {
  const yPart = chart.y_axis || chart.y[0] || { label: "", unit: "" };
  const x = axisScale(chart.x.unit, chart.x.values, system, lengths);
  const y = axisScale(yPart.unit, chart.y.flatMap((line) => line.values), system, lengths);
  const parts = [];
  for (const mark of chart.marks || []) {
    if (mark.axis === "x") {
      const lines = chart.y.map((line) => {
        const at = valueAt(chart.x.values, line.values, mark.value);
        return at === null ? "" : `${line.label} ${withUnit(at * y.factor, y.unit)}`;
      }).filter(Boolean);
      parts.push(`${mark.label} at ${chart.x.label.toLowerCase()} ${withUnit(mark.value * x.factor, x.unit)}` +
        (lines.length ? `: ${lines.join(", ")}` : ""));
    } else {
      const value = mark.value * y.factor;
      parts.push(mark.label.includes(NUMBER.format(value)) ? mark.label : `${mark.label}: ${withUnit(value, y.unit)}`);
    }
  }
  if (!parts.length) {
    for (const line of chart.y) {
      const ys = line.values.filter(Number.isFinite).map((v) => v * y.factor);
      if (ys.length) {
        parts.push(`${line.label} from ${withUnit(Math.min(...ys), y.unit)} to ${withUnit(Math.max(...ys), y.unit)}`);
      }
    }
  }
  return parts.length ? `Key numbers: ${parts.join("; ")}.` : "";
}

export function describeCharts(root, result) {
  const container = root.querySelector(".fb-charts");
  if (!container || !result.series) return;
  const charts = Array.isArray(result.series) ? result.series : [result.series];
  const figures = container.querySelectorAll("figure");
  charts.forEach((chart, i) => {
    const figure = figures[i];
    if (!figure || figure.querySelector(".fb-chart__key")) return;
    const text = chartText(chart, displaySystem(root), lengthSystem(root));
    if (!text) return;
    const key = document.createElement("p");
    key.className = "fb-chart__key";
    key.textContent = text;
    figure.append(key);
  });
}
