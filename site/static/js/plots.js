// Line charts as inline SVG, drawn from numbers: axes, ticks, unit labels, title.
// Series differ by dash pattern and marker shape, so they read in black and white.
import { svgEl as s } from "./util.js";

export function niceTicks(lo, hi, count = 5) {
  if (!(hi > lo)) { hi = lo + 1; lo -= 1; }
  const raw = (hi - lo) / count;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map((m) => m * mag).find((st) => st >= raw) || 10 * mag;
  const start = Math.floor(lo / step) * step;
  const ticks = [];
  for (let v = start; v <= hi + step * 1e-9; v += step) ticks.push(Number(v.toPrecision(12)));
  if (ticks[ticks.length - 1] < hi) ticks.push(Number((ticks[ticks.length - 1] + step).toPrecision(12)));
  return ticks;
}

const DASHES = ["", "6 4", "2 3", "10 3 2 3"];
const MARKS = ["circle", "square", "triangle", "diamond"];

function marker(shape, x, y) {
  const r = 3.2;
  if (shape === "circle") return s("circle", { cx: x, cy: y, r, class: "mk" });
  if (shape === "square") return s("rect", { x: x - r, y: y - r, width: 2 * r, height: 2 * r, class: "mk" });
  if (shape === "triangle") return s("path", { d: `M${x},${y - r - 1}L${x + r + 1},${y + r}L${x - r - 1},${y + r}Z`, class: "mk" });
  return s("path", { d: `M${x},${y - r - 1}L${x + r + 1},${y}L${x},${y + r + 1}L${x - r - 1},${y}Z`, class: "mk" });
}

/**
 * opts: {id, title, xLabel, yLabel, series: [{name, points: [[x, y], ...], markers, line, readout}],
 *        hlines: [{y, label}], width, height}
 * A series with line: false is drawn as marks only; one with readout: false is left out of plotFigure's
 * cursor and readout (marks at their own x, such as a table's rows, would be read at another x).
 */
export function lineChart(opts) {
  const W = opts.width || 460, H = opts.height || 260;
  const m = { l: 58, r: 26, t: 30, b: 44 + 16 * Math.ceil((opts.series.length + (opts.hlines || []).length) / 2) };
  const pts = opts.series.flatMap((se) => se.points);
  const xs = pts.map((p) => p[0]);
  const ys = pts.map((p) => p[1]).concat((opts.hlines || []).map((h) => h.y));
  if (opts.yZero) ys.push(0);
  const svg = s("svg", { viewBox: `0 0 ${W} ${H}`, class: "chart", role: "img", "data-chart": opts.id || "" });
  svg.append(s("title", {}, opts.title));
  svg.append(s("text", { x: W / 2, y: 16, class: "chart-title", "text-anchor": "middle" }, opts.title));
  if (!pts.length) {
    svg.append(s("text", { x: W / 2, y: H / 2, "text-anchor": "middle" }, "no data"));
    return svg;
  }
  const xt = niceTicks(Math.min(...xs), Math.max(...xs));
  const yt = niceTicks(Math.min(...ys), Math.max(...ys));
  const x0 = xt[0], x1 = xt[xt.length - 1], y0 = yt[0], y1 = yt[yt.length - 1];
  const pw = W - m.l - m.r, ph = H - m.t - m.b;
  const X = (v) => m.l + ((v - x0) / (x1 - x0)) * pw;
  const Y = (v) => m.t + ph - ((v - y0) / (y1 - y0)) * ph;
  const axes = s("g", { class: "axes" });
  for (const v of yt) {
    axes.append(s("line", { x1: m.l, x2: m.l + pw, y1: Y(v), y2: Y(v), class: "grid" }));
    axes.append(s("text", { x: m.l - 5, y: Y(v) + 4, "text-anchor": "end", class: "tick" }, fmtTick(v, yt)));
  }
  for (const v of xt) {
    axes.append(s("line", { x1: X(v), x2: X(v), y1: m.t + ph, y2: m.t + ph + 4, class: "axis" }));
    axes.append(s("text", { x: X(v), y: m.t + ph + 16, "text-anchor": "middle", class: "tick" }, fmtTick(v, xt)));
  }
  axes.append(s("rect", { x: m.l, y: m.t, width: pw, height: ph, class: "frame" }));
  axes.append(s("text", { x: m.l + pw / 2, y: m.t + ph + 32, "text-anchor": "middle", class: "axis-label" }, opts.xLabel));
  axes.append(s("text", { x: 12, y: m.t + ph / 2, "text-anchor": "middle", class: "axis-label",
    transform: `rotate(-90 12 ${m.t + ph / 2})` }, opts.yLabel));
  svg.append(axes);
  svg.__chart = { X, Y, m, pw, ph, x0, x1 };
  const legend = [];
  (opts.hlines || []).forEach((h) => {
    const g = s("g", { class: "hline" });
    g.append(s("line", { x1: m.l, x2: m.l + pw, y1: Y(h.y), y2: Y(h.y), "stroke-dasharray": "8 3 2 3", class: "limit" }));
    g.append(s("text", { x: m.l + pw - 4, y: Y(h.y) - 4, "text-anchor": "end", class: "limit-label" }, h.label));
    svg.append(g);
  });
  opts.series.forEach((se, i) => {
    const g = s("g", { class: "series", "data-series": se.name });
    const d = se.points.map((p, k) => `${k ? "L" : "M"}${X(p[0]).toFixed(1)},${Y(p[1]).toFixed(1)}`).join("");
    if (se.line !== false) g.append(s("path", { d, class: "line", "stroke-dasharray": DASHES[i % DASHES.length] }));
    if (se.markers !== false) for (const p of se.points) g.append(marker(MARKS[i % MARKS.length], X(p[0]), Y(p[1])));
    svg.append(g);
    legend.push([se.name, i, se.line !== false]);
  });
  // legend under the plot
  const lg = s("g", { class: "legend" });
  legend.forEach(([name, i, line], k) => {
    const lx = m.l + (k % 2) * (pw / 2), ly = m.t + ph + 48 + 16 * Math.floor(k / 2);
    if (line) lg.append(s("line", { x1: lx, x2: lx + 26, y1: ly - 4, y2: ly - 4, class: "line", "stroke-dasharray": DASHES[i % DASHES.length] }));
    lg.append(marker(MARKS[i % MARKS.length], lx + 13, ly - 4));
    lg.append(s("text", { x: lx + 32, y: ly, class: "legend-text" }, name));
  });
  svg.append(lg);
  return svg;
}

function fmtTick(v, ticks) {
  const step = Math.abs(ticks[1] - ticks[0]) || 1;
  let dec = 0;
  while (dec < 4 && Math.abs(Math.round(step * 10 ** dec) - step * 10 ** dec) > 1e-6) dec += 1;
  return v.toFixed(dec);
}

// A plot with a readout of the values under the pointer or finger (pointer events, so mouse, pen and touch
// alike; arrow keys step along the points): a cursor line on the plot and the values in words below it,
// in the units the axes show, announced politely to screen readers.
// opts as lineChart's, plus xName / yName (what the axes show), xUnit / yUnit (shown units), xDec / yDec.
export function plotFigure(opts) {
  const svg = lineChart(opts);
  const fig = document.createElement("figure");
  fig.className = "plot";
  fig.append(svg);
  const readout = document.createElement("p");
  readout.className = "plot-readout";
  readout.setAttribute("aria-live", "polite");
  readout.dataset.readout = opts.id || "";
  readout.textContent = "Point at the plot, or touch it, to read its values.";
  fig.append(readout);
  if (opts.note) fig.append(Object.assign(document.createElement("p"), { className: "plot-note", textContent: opts.note }));
  const c = svg.__chart;
  if (!c) return fig;
  const read = opts.series.filter((se) => se.readout !== false);
  const xs = [...new Set(read.flatMap((se) => se.points.map((p) => p[0])))].sort((a, b) => a - b);
  const cursor = s("line", { y1: c.m.t, y2: c.m.t + c.ph, class: "cursor", visibility: "hidden" });
  svg.append(cursor);
  const dots = read.map(() => { const d = s("circle", { r: 4.5, class: "cursor-dot", visibility: "hidden" }); svg.append(d); return d; });
  const num = (v, dec) => (typeof v === "number" && Number.isFinite(v) ? v.toFixed(dec) : "–");
  let at = -1;
  const show = (i) => {
    at = Math.max(0, Math.min(xs.length - 1, i));
    const x = xs[at];
    cursor.setAttribute("x1", c.X(x)); cursor.setAttribute("x2", c.X(x)); cursor.setAttribute("visibility", "visible");
    const parts = read.map((se, k) => {
      const p = se.points.reduce((best, q) => (Math.abs(q[0] - x) < Math.abs(best[0] - x) ? q : best), se.points[0]);
      dots[k].setAttribute("cx", c.X(p[0])); dots[k].setAttribute("cy", c.Y(p[1])); dots[k].setAttribute("visibility", "visible");
      return `${se.name} ${num(p[1], opts.yDec ?? 2)} ${opts.yUnit || ""}`.trim();
    });
    readout.textContent = `${opts.xName || "x"} ${num(x, opts.xDec ?? 0)} ${opts.xUnit || ""}: ${parts.join("; ")}`.replace(/ +:/, ":");
  };
  const nearest = (ev) => {
    const pt = svg.createSVGPoint();
    pt.x = ev.clientX; pt.y = ev.clientY;
    const ctm = svg.getScreenCTM();
    if (!ctm) return;
    const local = pt.matrixTransform(ctm.inverse());
    const xv = c.x0 + ((local.x - c.m.l) / c.pw) * (c.x1 - c.x0);
    let best = 0;
    xs.forEach((x, i) => { if (Math.abs(x - xv) < Math.abs(xs[best] - xv)) best = i; });
    show(best);
  };
  svg.setAttribute("tabindex", "0");
  svg.addEventListener("pointermove", nearest);
  svg.addEventListener("pointerdown", nearest);
  svg.addEventListener("keydown", (ev) => {
    if (ev.key === "ArrowRight" || ev.key === "ArrowLeft") {
      ev.preventDefault();
      show(at < 0 ? 0 : at + (ev.key === "ArrowRight" ? 1 : -1));
    }
  });
  return fig;
}
