// Route sketch: the engine's route (lines[].sketch) drawn in three views, top, side and front, with each
// bend marked by its radius, a too-tight bend in the failing style (in words as well), and the hose at
// both ends of the engine's movement. The engine gives every point, radius and verdict; this module only
// projects and draws them.
import { badge, el, svgEl as s } from "./util.js";
import { shop } from "./precision.js";


// Each view: its name, the two coordinates it shows (across, up) and their names.
export const VIEWS = [
  { id: "top", title: "Top view", axes: [0, 1], names: ["x", "y"] },
  { id: "side", title: "Side view", axes: [0, 2], names: ["x", "z"] },
  { id: "front", title: "Front view", axes: [1, 2], names: ["y", "z"] },
];
const STYLES = ["rest", "moved-a", "moved-b"];
const DASH = { rest: "", "moved-a": "7 4", "moved-b": "2 3" };

// The SVG path of one position: straight runs, each bend a curve from where it starts to where it ends.
function pathOf(pos, P) {
  const bends = new Map(pos.bends.map((b) => [b.at_point, b]));
  const pts = pos.points_mm;
  let d = `M${P(pts[0])}`;
  for (let k = 1; k < pts.length; k++) {
    const b = bends.get(k);
    d += b ? `L${P(b.tangent_in_mm)}Q${P(b.corner_mm)} ${P(b.tangent_out_mm)}` : `L${P(pts[k])}`;
  }
  return d;
}

function view(sk, v, W, H) {
  const [a, b] = v.axes;
  const all = sk.positions.flatMap((p) => p.points_mm);
  const lo = [Math.min(...all.map((q) => q[a])), Math.min(...all.map((q) => q[b]))];
  const hi = [Math.max(...all.map((q) => q[a])), Math.max(...all.map((q) => q[b]))];
  const m = 34, span = Math.max(hi[0] - lo[0], hi[1] - lo[1], 1);
  const k = Math.min((W - 2 * m) / Math.max(hi[0] - lo[0], span * 1e-3), (H - 2 * m - 14) / Math.max(hi[1] - lo[1], span * 1e-3));
  const cx = (W - k * (hi[0] - lo[0])) / 2, cy = (H + 14 + k * (hi[1] - lo[1])) / 2;
  const X = (q) => cx + k * (q[a] - lo[0]), Y = (q) => cy - k * (q[b] - lo[1]);
  const P = (q) => `${X(q).toFixed(1)},${Y(q).toFixed(1)}`;
  const svg = s("svg", { viewBox: `0 0 ${W} ${H}`, class: "sketch-view", role: "img", "data-view": v.id });
  const label = `${v.title}: ${v.names[0]} to the right, ${v.names[1]} up`;
  svg.append(s("title", {}, label));
  svg.append(s("text", { x: 6, y: 13, class: "sketch-title" }, label));
  svg.append(s("rect", { x: 0.5, y: 0.5, width: W - 1, height: H - 1, class: "sketch-frame" }));
  // axis arrows in the corner
  svg.append(s("path", { d: `M10,${H - 10}h22m-4,-3l4,3l-4,3M10,${H - 10}v-22m-3,4l3,-4l3,4`, class: "sketch-axes" }));
  svg.append(s("text", { x: 35, y: H - 7, class: "sketch-small" }, v.names[0]), s("text", { x: 6, y: H - 35, class: "sketch-small" }, v.names[1]));
  sk.positions.slice().reverse().forEach((pos) => {
    const i = sk.positions.indexOf(pos);
    svg.append(s("path", { d: pathOf(pos, P), class: `sketch-hose sketch-${STYLES[i]}`, "stroke-dasharray": DASH[STYLES[i]], "data-position": String(i) }));
  });
  const rest = sk.positions[0];
  const pts = rest.points_mm;
  svg.append(s("circle", { cx: X(pts[0]), cy: Y(pts[0]), r: 3.5, class: "sketch-end" }));
  svg.append(s("rect", { x: X(pts[pts.length - 1]) - 3.5, y: Y(pts[pts.length - 1]) - 3.5, width: 7, height: 7, class: "sketch-end" }));
  svg.append(s("text", { x: X(pts[0]) + 6, y: Y(pts[0]) - 6, class: "sketch-small" }, "start"));
  svg.append(s("text", { x: X(pts[pts.length - 1]) + 6, y: Y(pts[pts.length - 1]) - 6, class: "sketch-small" }, "end"));
  const placed = [];
  rest.bends.forEach((bd, n) => {
    // a bend seen edge-on in this view (its arc a point or a straight stroke) is marked in the views that show it
    const chord = Math.hypot(X(bd.tangent_in_mm) - X(bd.tangent_out_mm), Y(bd.tangent_in_mm) - Y(bd.tangent_out_mm));
    const turn = Math.abs((X(bd.corner_mm) - X(bd.tangent_in_mm)) * (Y(bd.tangent_out_mm) - Y(bd.corner_mm))
      - (Y(bd.corner_mm) - Y(bd.tangent_in_mm)) * (X(bd.tangent_out_mm) - X(bd.corner_mm)));
    if (chord < 4 || turn < 4) return;
    // the middle of the drawn curve, where its mark goes; the label beside it, clear of the others
    const mid = [0, 1, 2].map((c) => 0.25 * bd.tangent_in_mm[c] + 0.5 * bd.corner_mm[c] + 0.25 * bd.tangent_out_mm[c]);
    const bad = bd.verdict === "fail";
    const g = s("g", { class: `sketch-bend sketch-bend-${bd.verdict}`, "data-bend": String(n), "data-verdict": bd.verdict });
    g.append(s("circle", { cx: X(mid), cy: Y(mid), r: bad ? 5 : 3, class: "sketch-bend-mark" }));
    const right = X(mid) < W * 0.55;
    let ty = Y(mid) + 13;
    while (placed.some((p) => Math.abs(p - ty) < 11) && ty < H - 4) ty += 11;
    placed.push(ty);
    g.append(s("text", { x: X(mid) + (right ? 7 : -7), y: ty, class: "sketch-bend-label", "text-anchor": right ? "start" : "end" },
      `B${n + 1} R ${shop(bd.radius_mm, "route_length")}${bad ? " TOO TIGHT" : ""}`));
    svg.append(g);
  });
  return svg;
}

// "at rest" or "engine moved +10 mm along z", in the shown units.
function positionName(sk, pos) {
  if (!pos.offset_mm) return "at rest";
  return `engine moved ${pos.offset_mm > 0 ? "+" : "-"}${shop(Math.abs(pos.offset_mm), "route_length")} along ${sk.movement_axis}`;
}

// The sketch figure of one line's result (its `sketch`), or null when the line has no route points.
export function routeSketch(sk, lineIndex) {
  if (!sk || !sk.positions || !sk.positions.length) return null;
  const fig = el("figure", { class: `sketch verdict-${sk.verdict}`, "data-sketch": String(lineIndex) });
  const views = el("div", { class: "sketch-views" });
  for (const v of VIEWS) views.append(view(sk, v, 300, 220));
  fig.append(views);
  const cap = el("figcaption", { class: "sketch-caption" });
  const legend = el("ul", { class: "sketch-legend" });
  sk.positions.forEach((pos, i) => {
    legend.append(el("li", { "data-position": String(i) },
      el("span", { class: `sketch-key sketch-key-${STYLES[i]}`, "aria-hidden": "true" }),
      `${i === 0 ? "solid" : i === 1 ? "dashed" : "dotted"}: ${positionName(sk, pos)}, route ${shop(pos.length_mm, "route_length")}`));
  });
  cap.append(el("p", {}, badge(sk.verdict), sk.min_bend_radius_mm == null
    ? " No minimum bend radius is known for this line's hoses and tubes."
    : ` Minimum bend radius ${shop(sk.min_bend_radius_mm, "route_length")} (${sk.min_bend_radius_of}).`), legend);
  const bends = el("ul", { class: "sketch-bends" });
  sk.positions.forEach((pos, i) => pos.bends.forEach((bd, n) => {
    const atRest = sk.positions[0].bends[n];
    if (i > 0 && atRest && atRest.verdict === bd.verdict) return; // moved positions: only a bend whose verdict changes
    bends.append(el("li", { "data-verdict": bd.verdict, "data-position": String(i) }, badge(bd.verdict), ` B${n + 1}${i ? ` (${positionName(sk, pos)})` : ""}: ${bd.message}`));
  }));
  if (bends.childElementCount) cap.append(bends);
  fig.append(cap);
  return fig;
}
