// Charts of a result's series with uPlot (the site's own copy). Each chart's shape is
// {title, x: {label, unit, values}, y: [{label, unit, values}], y_axis?: {label, unit},
//  marks: [{axis, value, label}]}.
import uPlot from "../vendor/uplot/uPlot.esm.js";

const LINE_COLOURS = ["--fb-chart-1", "--fb-chart-2", "--fb-chart-3", "--fb-chart-4"];

// The colour scheme is set on <body> (data-md-color-scheme), so read the variables there.
function cssVar(name) {
  return getComputedStyle(document.body).getPropertyValue(name).trim() || "#333";
}

function axisLabel(part) {
  return part.unit ? `${part.label} (${part.unit})` : part.label;
}

// Vertical or horizontal reference lines (rated load, a limit) drawn over the plot.
function marksPlugin(marks) {
  return {
    hooks: {
      draw: [(u) => {
        const ctx = u.ctx;
        ctx.save();
        ctx.strokeStyle = cssVar("--fb-chart-mark");
        ctx.fillStyle = cssVar("--fb-chart-mark");
        ctx.setLineDash([6, 4]);
        ctx.lineWidth = 2 * devicePixelRatio;
        ctx.font = `${12 * devicePixelRatio}px system-ui, sans-serif`;
        ctx.textAlign = "left"; // uPlot leaves the axes' alignment set
        ctx.textBaseline = "alphabetic";
        for (const mark of marks) {
          ctx.beginPath();
          if (mark.axis === "x") {
            const x = u.valToPos(mark.value, "x", true);
            ctx.moveTo(x, u.bbox.top);
            ctx.lineTo(x, u.bbox.top + u.bbox.height);
            ctx.stroke();
            ctx.fillText(mark.label, x + 4 * devicePixelRatio, u.bbox.top + 14 * devicePixelRatio);
          } else {
            const y = u.valToPos(mark.value, "y", true);
            ctx.moveTo(u.bbox.left, y);
            ctx.lineTo(u.bbox.left + u.bbox.width, y);
            ctx.stroke();
            ctx.fillText(mark.label, u.bbox.left + 4 * devicePixelRatio, y - 4 * devicePixelRatio);
          }
        }
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

// A result's `series` is one chart or a list of them; each gets its own figure.
export function drawCharts(container, series) {
  clearCharts(container);
  if (!series) return;
  for (const chart of Array.isArray(series) ? series : [series]) {
    const figure = document.createElement("figure");
    figure.className = "fb-chart";
    const caption = document.createElement("figcaption");
    const holder = document.createElement("div");
    holder.className = "fb-chart__plot";
    figure.append(caption, holder);
    container.append(figure);
    drawChart(figure, chart);
  }
}

function drawChart(figure, series) {
  figure.querySelector("figcaption").textContent = series.title || "";
  const holder = figure.querySelector(".fb-chart__plot");
  const axisColour = cssVar("--fb-ink");
  const width = Math.max(holder.clientWidth || figure.clientWidth || 320, 280);
  const options = {
    width,
    height: Math.round(Math.min(360, Math.max(220, width * 0.6))),
    legend: { show: true, live: false }, // a key, not a read-out: no "--" placeholders
    cursor: { drag: { x: false, y: false } },
    scales: { x: { time: false } },
    axes: [
      { label: axisLabel(series.x), stroke: axisColour, grid: { stroke: cssVar("--fb-grid") } },
      { label: axisLabel(series.y_axis || series.y[0] || { label: "" }), stroke: axisColour,
        grid: { stroke: cssVar("--fb-grid") }, size: 60 },
    ],
    series: [
      { label: axisLabel(series.x) },
      ...series.y.map((line, i) => ({
        label: line.label,
        stroke: cssVar(LINE_COLOURS[i % LINE_COLOURS.length]),
        width: 3,
        dash: i % 2 ? [10, 5] : undefined, // told apart without colour too
        points: { show: false },
      })),
    ],
    plugins: [marksPlugin(series.marks || [])],
  };
  const data = [series.x.values, ...series.y.map((line) => line.values)];
  figure.fbPlot = new uPlot(options, data, holder);
  figure.fbResize = new ResizeObserver(() => {
    const w = Math.max(holder.clientWidth, 280);
    if (figure.fbPlot && Math.abs(figure.fbPlot.width - w) > 8) {
      figure.fbPlot.setSize({ width: w, height: Math.round(Math.min(360, Math.max(220, w * 0.6))) });
    }
  });
  figure.fbResize.observe(holder);
}
