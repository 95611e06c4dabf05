// Charts of a result's series with uPlot (the site's own copy, minified). Each chart's shape is
// {title, x: {label, unit, values}, y: [{label, unit, values}], y_axis?: {label, unit},
//  marks: [{axis, value, label}]}. Values come in the series' units (SI, or a unit it names);
// the axes are shown in the page's unit system (issue 12): metres as feet on a North American
// page, Ω/m as Ω/kft or Ω/km, large or small values with a prefix (kW, ms), so tick labels stay
// short on a phone. Axis titles are text above and below the plot: never clipped.
import uPlot from "../vendor/uplot/uPlot.esm.min.js";

const LINE_COLOURS = ["--fb-chart-1", "--fb-chart-2", "--fb-chart-3", "--fb-chart-4"];
const FOOT = 0.3048; // m, exact
const KCMIL = Math.PI / 4 * 25.4e-6 ** 2 * 1000; // m², one thousand circular mils

// A series unit and the unit each system shows it in, with the factor from one to the other.
const SYSTEM_UNITS = {
  m: { na: ["ft", 1 / FOOT], iec: ["m", 1] },
  "Ω/m": { na: ["Ω/kft", 1000 * FOOT], iec: ["Ω/km", 1000] },
  "Ω/km": { na: ["Ω/kft", FOOT], iec: ["Ω/km", 1] },
  "m²": { na: ["kcmil", 1 / KCMIL], iec: ["mm²", 1e6] },
  "mm²": { na: ["kcmil", 1e-6 / KCMIL], iec: ["mm²", 1] },
};
// Units shown with an SI prefix when their values are large or small: [prefix, factor, from].
const PREFIXES = {
  W: [["M", 1e-6, 1e6], ["k", 1e-3, 1e3]],
  VA: [["M", 1e-6, 1e6], ["k", 1e-3, 1e3]],
  var: [["M", 1e-6, 1e6], ["k", 1e-3, 1e3]],
  J: [["M", 1e-6, 1e6], ["k", 1e-3, 1e3]],
  V: [["k", 1e-3, 1e4]],
  A: [["k", 1e-3, 1e4]],
  Hz: [["k", 1e-3, 1e4]],
};
const SUBMULTIPLES = { s: [["m", 1e3, 1e-3], ["µ", 1e6, 0]], A: [["m", 1e3, 0]], F: [["µ", 1e6, 1e-6], ["n", 1e9, 0]], H: [["m", 1e3, 1e-3], ["µ", 1e6, 0]] };

// How one axis is shown: its unit and the factor its values (and marks) are multiplied by.
export function axisScale(unit, values, system, lengths = null) {
  let shown = unit || "";
  let factor = 1;
  const own = shown === "m" && lengths ? lengths : system; // lengths follow what was typed
  const converted = SYSTEM_UNITS[shown] && SYSTEM_UNITS[shown][own];
  if (converted) [shown, factor] = converted;
  let largest = 0;
  for (const value of values) largest = Math.max(largest, Math.abs(value * factor));
  if (largest > 0 && PREFIXES[shown]) {
    const prefix = PREFIXES[shown].find(([, , from]) => largest >= from);
    if (prefix) return { unit: prefix[0] + shown, factor: factor * prefix[1] };
  }
  if (largest > 0 && largest < 1 && SUBMULTIPLES[shown]) {
    const prefix = SUBMULTIPLES[shown].find(([, , from]) => largest >= from);
    if (prefix) return { unit: prefix[0] + shown, factor: factor * prefix[1] };
  }
  return { unit: shown, factor };
}

// The colour scheme is set on <body> (data-md-color-scheme), so read the variables there.
function cssVar(name) {
  return getComputedStyle(document.body).getPropertyValue(name).trim() || "#333";
}

function title(label, unit) {
  return unit ? `${label} (${unit})` : label;
}

// Values spread over more than two decades, all positive: a log axis shows the case among them.
function wantsLog(values) {
  let low = Infinity;
  let high = 0;
  for (const value of values) {
    if (!(value > 0)) return false;
    low = Math.min(low, value);
    high = Math.max(high, value);
  }
  return high / low >= 100;
}

// The axis range takes in the data and the marks (a limit line, "this run"): the case is framed.
function rangeWithMarks(marks, log) {
  return (u, min, max) => {
    let low = min;
    let high = max;
    for (const value of marks) { low = Math.min(low, value); high = Math.max(high, value); }
    if (log) {
      return [10 ** Math.floor(Math.log10(low) + 1e-9), 10 ** Math.ceil(Math.log10(high) - 1e-9)];
    }
    if (low === high) { low -= Math.abs(low) * 0.1 || 1; high += Math.abs(high) * 0.1 || 1; }
    const pad = (high - low) * 0.05;
    return [low >= 0 && low - pad < 0 ? 0 : low - pad, high + pad];
  };
}

// A tick-label axis as wide as its longest label, no wider.
function fitAxis(self, values, axisIndex, cycle) {
  const axis = self.axes[axisIndex];
  if (cycle > 1) return axis._size;
  let size = axis.ticks.size + axis.gap;
  const longest = (values || []).reduce((a, b) => (String(b).length > a.length ? String(b) : a), "");
  if (longest) {
    self.ctx.font = axis.font[0];
    size += self.ctx.measureText(longest).width / devicePixelRatio;
  }
  return Math.ceil(size) + 2;
}

// Reference lines (rated load, a limit, this run) with their labels kept apart: an x mark's
// label goes to the first row where it does not touch another, to the left of its line near the
// right edge; a y mark whose label would sit on another's goes to the right-hand side.
function marksPlugin(marks) {
  return {
    hooks: {
      draw: [(u) => {
        const ctx = u.ctx;
        const px = devicePixelRatio;
        const { left, top, width, height } = u.bbox;
        const row = 15 * px;
        const gap = 4 * px;
        ctx.save();
        ctx.strokeStyle = cssVar("--fb-chart-mark");
        ctx.setLineDash([6 * px, 4 * px]);
        ctx.lineWidth = 2 * px;
        ctx.font = `600 ${12 * px}px system-ui, sans-serif`;
        ctx.textBaseline = "alphabetic";
        const label = (text, x, y, align) => {
          const w = ctx.measureText(text).width;
          const x0 = align === "right" ? x - w : x;
          ctx.fillStyle = cssVar("--fb-paper");
          ctx.globalAlpha = 0.85;
          ctx.fillRect(x0 - 2 * px, y - 11 * px, w + 4 * px, 14 * px);
          ctx.globalAlpha = 1;
          ctx.fillStyle = cssVar("--fb-chart-mark");
          ctx.textAlign = "left";
          ctx.fillText(text, x0, y);
        };
        const xs = marks.filter((m) => m.axis === "x")
          .map((m) => ({ ...m, pos: u.valToPos(m.value, "x", true) }))
          .filter((m) => m.pos >= left - 1 && m.pos <= left + width + 1)
          .sort((a, b) => a.pos - b.pos);
        // x labels along the top, or along the bottom where a y mark runs near the top
        const yPositions = marks.filter((m) => m.axis === "y").map((m) => u.valToPos(m.value, "y", true));
        const xRows = Math.max(1, xs.length);
        const crowdedTop = yPositions.some((pos) => pos < top + row * (Math.min(xRows, 3) + 1));
        const crowdedBottom = yPositions.some((pos) => pos > top + height - row * (Math.min(xRows, 3) + 1));
        const atBottom = crowdedTop && !crowdedBottom;
        const rows = [];
        const boxes = []; // where each label went, for the tests (no two may overlap)
        for (const mark of xs) {
          ctx.beginPath();
          ctx.moveTo(mark.pos, top);
          ctx.lineTo(mark.pos, top + height);
          ctx.stroke();
          const w = ctx.measureText(mark.label).width;
          const right = mark.pos + gap + w <= left + width;
          const start = right ? mark.pos + gap : mark.pos - gap - w;
          let r = rows.findIndex((end) => end + gap < start);
          if (r < 0) { r = rows.length; rows.push(-Infinity); }
          rows[r] = start + w;
          const y = atBottom ? top + height - gap - row * r : top + row * (r + 1);
          label(mark.label, right ? start : mark.pos - gap, y, right ? "left" : "right");
          boxes.push({ label: mark.label, left: start, right: start + w, top: y - 11 * px, bottom: y + 3 * px });
        }
        const ys = marks.filter((m) => m.axis === "y")
          .map((m) => ({ ...m, pos: u.valToPos(m.value, "y", true) }))
          .filter((m) => m.pos >= top - 1 && m.pos <= top + height + 1)
          .sort((a, b) => a.pos - b.pos);
        let last = -Infinity;
        let lastSide = "right";
        for (const mark of ys) {
          ctx.beginPath();
          ctx.moveTo(left, mark.pos);
          ctx.lineTo(left + width, mark.pos);
          ctx.stroke();
          const side = mark.pos - last < row && lastSide === "left" ? "right" : "left";
          const y = mark.pos - gap < top + row ? mark.pos + row : mark.pos - gap;
          const w = ctx.measureText(mark.label).width;
          const x0 = side === "left" ? left + gap : left + width - gap - w;
          label(mark.label, side === "left" ? left + gap : left + width - gap, y, side);
          boxes.push({ label: mark.label, left: x0, right: x0 + w, top: y - 11 * px, bottom: y + 3 * px });
          last = mark.pos;
          lastSide = side;
        }
        u.root.closest(".fb-chart").fbMarkBoxes = boxes;
        ctx.restore();
      }],
    },
  };
}

function clearChart(figure) {
  if (figure.fbPlot) { figure.fbPlot.destroy(); figure.fbPlot = null; }
  if (figure.fbResize) { figure.fbResize.disconnect(); figure.fbResize = null; }
}

export function clearCharts(container) {
  for (const figure of container.querySelectorAll(".fb-chart")) clearChart(figure);
  container.replaceChildren();
}

function textLine(className, text) {
  const line = document.createElement("p");
  line.className = className;
  line.textContent = text;
  return line;
}

// A result's `series` is one chart or a list of them; each gets its own figure.
export function drawCharts(container, series, system = "iec", lengths = null) {
  clearCharts(container);
  if (!series) return;
  for (const chart of Array.isArray(series) ? series : [series]) {
    const figure = document.createElement("figure");
    figure.className = "fb-chart";
    const holder = document.createElement("div");
    holder.className = "fb-chart__plot";
    figure.append(document.createElement("figcaption"), holder);
    container.append(figure);
    drawChart(figure, chart, system, lengths);
  }
}

function plotHeight(width) {
  return Math.round(Math.min(340, Math.max(220, width * 0.62)));
}

function drawChart(figure, series, system, lengths) {
  const holder = figure.querySelector(".fb-chart__plot");
  figure.querySelector("figcaption").textContent = series.title || "";
  const yPart = series.y_axis || series.y[0] || { label: "", unit: "" };
  const x = axisScale(series.x.unit, series.x.values, system, lengths);
  const y = axisScale(yPart.unit, series.y.flatMap((line) => line.values), system, lengths);
  const xs = series.x.values.map((v) => v * x.factor);
  const lines = series.y.map((line) => line.values.map((v) => v * y.factor));
  const marks = (series.marks || []).map((m) => ({ ...m, value: m.value * (m.axis === "x" ? x.factor : y.factor) }));
  const xLog = wantsLog(xs);
  const yLog = wantsLog(lines.flat()) && marks.every((m) => m.axis !== "y" || m.value > 0);
  figure.insertBefore(textLine("fb-chart__axis fb-chart__axis--y", title(yPart.label, y.unit)), holder);
  figure.append(textLine("fb-chart__axis fb-chart__axis--x", title(series.x.label, x.unit) + (xLog ? ", log scale" : "")));
  figure.dataset.xUnit = x.unit;
  figure.dataset.yUnit = y.unit;
  const axisColour = cssVar("--fb-ink");
  const grid = { stroke: cssVar("--fb-grid"), width: 1 };
  const font = "12px system-ui, sans-serif";
  const width = Math.max(holder.clientWidth || figure.clientWidth || 320, 260);
  const options = {
    width,
    height: plotHeight(width),
    legend: { show: series.y.length > 1, live: false }, // a key, not a read-out
    cursor: { drag: { x: false, y: false } },
    padding: [8, 22, 0, 0], // room for the last tick label on the right
    scales: {
      x: { time: false, distr: xLog ? 3 : 1, range: rangeWithMarks(marks.filter((m) => m.axis === "x").map((m) => m.value), xLog) },
      y: { distr: yLog ? 3 : 1, range: rangeWithMarks(marks.filter((m) => m.axis === "y").map((m) => m.value), yLog) },
    },
    axes: [
      { stroke: axisColour, grid, ticks: grid, font, space: 56, size: 30 },
      { stroke: axisColour, grid, ticks: grid, font, space: 30, size: fitAxis },
    ],
    series: [
      { label: title(series.x.label, x.unit) },
      ...series.y.map((line, i) => ({
        label: line.label,
        stroke: cssVar(LINE_COLOURS[i % LINE_COLOURS.length]),
        width: 3,
        dash: i % 2 ? [10, 5] : undefined, // told apart without colour too
        points: { show: false },
      })),
    ],
    plugins: [marksPlugin(marks)],
  };
  figure.fbPlot = new uPlot(options, [xs, ...lines], holder);
  figure.fbResize = new ResizeObserver(() => {
    const w = Math.max(holder.clientWidth, 260);
    if (figure.fbPlot && Math.abs(figure.fbPlot.width - w) > 8) {
      figure.fbPlot.setSize({ width: w, height: plotHeight(w) });
    }
  });
  figure.fbResize.observe(holder);
}
