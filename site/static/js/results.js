// Results: per-line verdicts, checks in words, tables per part and operating point,
// node pressures, rating with margins and cautions, hose candidates, thermal, plots.
import { badge, el } from "./util.js";
import { decimalsFor, fmt, fmtDiff, toShow, unitLabel } from "./units.js";
import { declared, editValue, heading } from "./declared.js";
import { plotFigure } from "./plots.js";
import { routeSketch } from "./sketch.js";

let CAUTIONS = [];
export function setCautions(list) { CAUTIONS = list; }

const U = (kind) => unitLabel(kind);
function numCell(tag, value, kind, field, decimals) {
  return el(tag, { class: "num", "data-field": field }, fmt(value, kind, decimals));
}

// A cell for a value of the result, converted by the unit the engine declares for its path.
function resCell(tag, value, path, field, decimals) {
  return numCell(tag, value, declared(path).unit, field, decimals);
}

export function cautionsList(cls = "cautions") {
  const box = el("div", { class: cls });
  box.append(el("p", { class: "cautions-title" }, "Cautions"));
  const ul = el("ul");
  for (const c of CAUTIONS) ul.append(el("li", {}, c));
  box.append(ul);
  return box;
}

function ratingBlock(rating) {
  const box = el("div", { class: "rating" });
  if (!rating) return box;
  const P = U("pressure_bar");
  const R = "lines[].rating.";
  const dl = el("dl", { class: "kv" });
  const row = (label, node) => dl.append(el("dt", {}, label), el("dd", {}, node));
  const pressure = (v, field, note = "") => el("span", {}, numCell("span", v, "pressure_bar", field, [1, 0]),
    v == null ? " (no rating known)" : ` ${P}${note}`);
  row(declared(`${R}working_bar`).label, pressure(rating.working_bar, "working_bar"));
  row(declared(`${R}burst_bar`).label, pressure(rating.burst_bar, "burst_bar"));
  row(declared(`${R}proof_test_bar`).label, pressure(rating.proof_test_bar, "proof_test_bar", " (2 × working, common practice)"));
  row(declared(`${R}required_bar`).label, el("span", {}, numCell("span", rating.required_bar, "pressure_bar", "required_bar", [1, 0]), ` ${P} (${rating.required_basis || ""})`));
  row(declared(`${R}margin`).label, el("span", {}, numCell("span", rating.margin, null, "margin", 2)));
  row(`Burst margin against ${rating.design_factor}:1`, el("span", {},
    numCell("span", rating.burst_margin, null, "burst_margin", 1), rating.burst_margin == null ? "" : ":1"));
  const wp = rating.weakest_part;
  row(declared(`${R}weakest_part`).label, wp ? wp.label : "none rated");
  const budget = (v, field) => (v == null ? "none" : el("span", {}, numCell("span", v, "pressure_bar", field, [1, 0]), ` ${P}`));
  row(declared(`${R}dp_budget_bar`).label, budget(rating.dp_budget_bar, "dp_budget_bar"));
  row(declared(`${R}dp_budget_cold_bar`).label, budget(rating.dp_budget_cold_bar, "dp_budget_cold_bar"));
  box.append(el("h4", {}, "Rating"), dl, cautionsList());
  return box;
}

// The hose assembly as the engine worked it out: cut length, end to end, slack, bends.
function assemblyBlock(line) {
  const a = line.assembly;
  if (!a || a.hose_cut_mm == null) return null;
  const A = "lines[].assembly.";
  const L = U("length_mm");
  const dl = el("dl", { class: "kv", "data-assembly": "" });
  const row = (label, node) => dl.append(el("dt", {}, label), el("dd", {}, node));
  const mm = (v, field) => el("span", {}, numCell("span", v, "length_mm", field, [0, 2]), ` ${L}`);
  const from = { route: "from the measured route and the slack it needs", overall: "from the overall length", typed: "as typed on the hose" };
  const hose = (line.parts || []).find((p) => p.job_part === a.hose_part);
  row(declared(`${A}hose_cut_mm`).label, el("span", {}, mm(a.hose_cut_mm, "hose_cut_mm"), ` (${hose ? hose.label : `part ${a.hose_part + 1}`}, ${from[a.length_source] || a.length_source})`));
  row(declared(`${A}overall_mm`).label, el("span", {}, mm(a.overall_mm, "overall_mm"), " including ", mm(a.cutoff_mm, "cutoff_mm"), " of cut-off allowances"));
  if (a.slack_mm != null) row(declared(`${A}slack_mm`).label, el("span", {}, mm(a.slack_mm, "slack_mm"), "; needed ", mm(a.slack_needed_mm, "slack_needed_mm")));
  else if (a.slack_needed_mm != null) row(declared(`${A}slack_needed_mm`).label, mm(a.slack_needed_mm, "slack_needed_mm"));
  if ((a.bends || []).length) {
    row(a.bends_from_route ? "Bends (from the route points)" : declared(`${A}bends`).label,
      a.bends.map((b) => `${fmt(b.angle_deg, "angle_deg", 0)}° at ${fmt(b.radius_mm, "length_mm", [0, 2])} ${L}`).join(", "));
  }
  return el("div", { class: "assembly" }, el("h4", {}, declared("lines[].assembly").label), dl);
}

// Hoses and tubes near a heat source (lines[].walls): the air around each, its hottest wall and the verdict,
// as the engine gives them; shown for the parts that have their own air or whose wall the engine judged.
const WALL_SURFACE = { outer: "outer surface", inner: "inner surface", both: "whole wall, no flow" };
function wallsBlock(line) {
  const walls = (line.walls || []).filter((w) => w.local_air_temp_c != null || w.verdict != null);
  if (!walls.length) return null;
  const W = "lines[].walls[].";
  const T = U("temp_c");
  const table = el("table", { class: "walls-table" });
  table.append(el("thead", {}, el("tr", {}, ...[declared(`${W}label`).label, heading(`${W}air_temp_c`),
    heading(`${W}hottest_c`), heading(`${W}limit_c`), declared(`${W}verdict`).label].map((t) => el("th", { scope: "col" }, t)))));
  const tb = el("tbody");
  for (const w of walls) {
    const basis = w.limit_basis === "fluid" ? " (fluid rating)" : " (wall)";
    tb.append(el("tr", { "data-wall-part": String(w.job_part), "data-verdict": w.verdict || "" },
      el("th", { scope: "row" }, w.label),
      el("td", { class: "num" }, resCell("span", w.air_temp_c, `${W}air_temp_c`, "air_temp_c", 0),
        w.local_air_temp_c != null ? el("span", { class: "small" }, " its own") : ""),
      el("td", { class: "num" }, resCell("span", w.hottest_c, `${W}hottest_c`, "hottest_c", 0),
        el("span", { class: "small" }, ` ${WALL_SURFACE[w.hottest_surface] || w.hottest_surface}, at ${w.hottest_at}`)),
      el("td", { class: "num" }, w.limit_c == null ? "unknown" : resCell("span", w.limit_c, `${W}limit_c`, "limit_c", 0),
        el("span", { class: "small" }, w.limit_c == null ? "" : basis)),
      el("td", {}, w.verdict ? badge(w.verdict) : "–")));
  }
  table.append(tb);
  return el("div", { class: "walls", "data-walls": "" }, el("h4", {}, `${declared("lines[].walls").label} near heat`),
    el("div", { class: "table-wrap" }, table),
    el("p", { class: "small" }, "Estimated from the films and the wall in series; radiation from the hot surface is not "
      + "modelled, so the wall facing it runs hotter still. Keep lines away from exhaust heat, or sleeve or shield them, "
      + "and check the maker's rating."));
}

// The button that makes a check's edit: "Set Bore of part 1 to 8 mm".
function fixButton(fix, actions) {
  const text = `Set ${fix.label} to ${editValue(fix.path, fix.value)}`;
  const b = el("button", { type: "button", class: "fix-apply", "data-fix-path": fix.path }, text);
  b.addEventListener("click", () => actions.applyEdits([fix], text));
  return b;
}

function checkItem(c, actions) {
  const li = el("li", { "data-check": c.check, "data-verdict": c.verdict }, badge(c.verdict), " ", el("strong", {}, `${c.check}: `), c.message);
  if (c.fix && actions) li.append(" ", fixButton(c.fix, actions));
  return li;
}

function checksBlock(checks, actions) {
  const box = el("div", { class: "checks" });
  const bad = checks.filter((c) => c.verdict !== "ok");
  const good = checks.filter((c) => c.verdict === "ok");
  if (bad.length) {
    const ul = el("ul", { class: "check-list" });
    for (const c of bad) ul.append(checkItem(c, actions));
    box.append(ul);
  } else {
    box.append(el("p", {}, "Every check passes."));
  }
  if (good.length) {
    const det = el("details", { class: "passed" }, el("summary", {}, `${good.length} check${good.length > 1 ? "s" : ""} passed`));
    const ul = el("ul", { class: "check-list" });
    for (const c of good) ul.append(checkItem(c, actions));
    det.append(ul);
    box.append(det);
  }
  return box;
}

function partsTable(result, li) {
  const table = el("table", { class: "parts-table", "data-line": String(li) });
  const head = el("tr");
  const P = "conditions[].lines[].parts[].";
  for (const t of [declared(`${P}job_part`).label, heading(`${P}velocity_m_s`), heading(`${P}reynolds`),
    heading(`${P}regime`), heading(`${P}pressure_drop_bar`), heading(`${P}temp_rise_c`),
    `Pressure after (${unitLabel(declared("conditions[].lines[].nodes[].pressure_bar").unit)})`]) head.append(el("th", { scope: "col" }, t));
  table.append(el("thead", {}, head));
  result.conditions.forEach((cond, ci) => {
    const line = cond.lines[li];
    if (!line) return;
    const tb = el("tbody", { "data-condition": String(ci) });
    const inlet = (line.nodes || []).find((n) => n.after_part === -1);
    const hr = el("tr", { class: "cond-row" });
    hr.append(el("th", { colspan: "4", scope: "rowgroup" }, `${cond.name}: ${fmt(line.flow_lpm, "flow_lpm")} ${U("flow_lpm")}, ${fmt(cond.viscosity_cst, "viscosity_cst")} cSt`),
      resCell("td", line.pressure_drop_bar, "conditions[].lines[].pressure_drop_bar", "line_drop_bar", [3, 2]),
      el("td", { class: "num" }, fmtDiff(line.temp_rise_c, declared("conditions[].lines[].temp_rise_c").unit)),
      el("td", { class: "num" }, inlet ? `in ${fmt(inlet.pressure_bar, "pressure_bar")}` : ""));
    tb.append(hr);
    const built = (result.lines[li] || {}).parts || [];
    (line.parts || []).forEach((part, k) => {
      const node = (line.nodes || []).find((n) => n.after_part === k);
      const jobPart = part.job_part === undefined ? k : part.job_part;
      const tr = el("tr", { "data-part": String(k), "data-job-part": jobPart === null ? "adapter" : String(jobPart) });
      tr.append(el("th", { scope: "row" }, (built[k] || {}).label || part.kind),
        resCell("td", part.velocity_m_s, `${P}velocity_m_s`, "velocity_m_s"),
        resCell("td", part.reynolds, `${P}reynolds`, "reynolds", 0),
        el("td", { "data-field": "regime" }, part.regime || ""),
        resCell("td", part.pressure_drop_bar, `${P}pressure_drop_bar`, "pressure_drop_bar", [3, 2]),
        el("td", { class: "num", "data-field": "temp_rise_c" }, fmtDiff(part.temp_rise_c, declared(`${P}temp_rise_c`).unit, 3)),
        resCell("td", node ? node.pressure_bar : null, "conditions[].lines[].nodes[].pressure_bar", "node_bar"));
      tb.append(tr);
    });
    table.append(tb);
  });
  return el("div", { class: "table-wrap" }, table);
}

function candidatesBlock(cands, li, actions) {
  const det = el("details", { class: "candidates" });
  const ok = cands.filter((c) => c.verdict !== "fail");
  det.append(el("summary", {}, `Hose candidates: ${ok.length} of ${cands.length} pass as whole assemblies (ends re-sized, ports re-planned)`));
  const table = el("table", { class: "cand-table" });
  const head = el("tr");
  const C = "lines[].candidates[].";
  for (const t of [heading(`${C}label`), heading(`${C}bore_mm`), heading(`${C}verdict`),
    heading(`${C}pressure_drop_bar`), heading(`${C}velocity_max_m_s`), heading(`${C}working_bar`),
    heading(`${C}reasons`), ""]) head.append(el("th", { scope: "col" }, t));
  table.append(el("thead", {}, head));
  const tb = el("tbody");
  cands.forEach((c, i) => {
    const why = [...(c.failed.length ? [`fails ${c.failed.join(", ")}`] : []),
      ...(!c.failed.length && (c.cautioned || []).length ? [`cautions: ${c.cautioned.join(", ")}`] : []),
      ...(c.note ? [c.note] : [])];
    const act = el("td");
    if (c.current) act.append(el("span", { class: "small" }, "the line's own"));
    else if (actions) {
      const b = el("button", { type: "button", class: "cand-apply", "data-candidate-apply": String(i) }, "Use this hose");
      b.addEventListener("click", () => (actions.applyCandidate || actions.applyEdits)(c.apply, `Use ${c.class} -${c.dash} on line ${li + 1}`, li));
      act.append(b);
    }
    const reasons = el("details", { class: "why" }, el("summary", {}, why.length ? why.join("; ") : (c.verdict === "ok" ? "passes" : "cautions")));
    for (const r of c.reasons || []) reasons.append(el("p", { class: "small" }, r));
    tb.append(el("tr", { "data-candidate": String(i), "data-verdict": c.verdict },
      el("th", { scope: "row" }, `${c.class} -${c.dash}`),
      resCell("td", c.bore_mm, `${C}bore_mm`, "bore_mm", [2, 3]), el("td", {}, badge(c.verdict)),
      el("td", { class: "num" }, resCell("span", c.pressure_drop_bar, `${C}pressure_drop_bar`, "pressure_drop_bar", [2, 1]),
        el("span", { class: "small" }, ` at ${c.pressure_drop_at}`)),
      resCell("td", c.velocity_max_m_s, `${C}velocity_max_m_s`, "velocity_max_m_s"),
      resCell("td", c.working_bar, `${C}working_bar`, "working_bar", [0, 0]),
      el("td", {}, reasons), act));
  });
  table.append(tb);
  det.append(el("div", { class: "table-wrap" }, table));
  return det;
}

function circuitCard(result, actions) {
  const c = result.circuit;
  const card = el("article", { class: `line-card circuit-card verdict-${c.verdict}`, "data-circuit-card": "" });
  card.append(el("h3", { class: "line-title" }, badge(c.verdict), " ", el("span", {}, declared("circuit").label)));
  card.append(checksBlock(c.checks || [], actions));
  return card;
}

function lineCards(result, actions) {
  const box = document.getElementById("line-results");
  box.replaceChildren();
  if (result.circuit) box.append(circuitCard(result, actions));
  (result.lines || []).forEach((line, li) => {
    const verdict = line.verdict;
    const card = el("article", { class: `line-card verdict-${verdict}`, "data-line-card": String(li) });
    card.append(el("h3", { class: "line-title" }, badge(verdict), ` Line ${li + 1}: `, el("span", { class: "line-card-name" }, line.name || `line ${li + 1}`), ` (${line.role})`));
    card.append(checksBlock(line.checks || [], actions));
    const asm = assemblyBlock(line);
    if (asm) card.append(asm);
    const sketch = routeSketch(line.sketch, li);
    if (sketch) card.append(el("h4", {}, declared("lines[].sketch").label), sketch);
    card.append(ratingBlock(line.rating));
    const walls = wallsBlock(line);
    if (walls) card.append(walls);
    card.append(el("h4", {}, "Per part and operating point"), partsTable(result, li));
    if (line.candidates && line.candidates.length) card.append(candidatesBlock(line.candidates, li, actions));
    box.append(card);
  });
}

function thermalBlock(result) {
  const box = document.getElementById("thermal-results");
  box.replaceChildren();
  const th = result.thermal;
  const card = el("article", { class: "thermal-card" });
  card.append(el("h3", {}, th ? badge(th.verdict) : badge("caution"), " Fluid temperature"));
  if (!th) {
    card.append(el("p", {}, "This engine build returns no thermal section; the heat per operating point is shown below."));
    box.append(card);
    return;
  }
  const dl = el("dl", { class: "kv" });
  const row = (label, node) => dl.append(el("dt", {}, label), el("dd", {}, node));
  const T = U("temp_c");
  row("Steady temperature", th.steady_temp_c == null ? "not found" : el("span", {}, numCell("span", th.steady_temp_c, "temp_c", "steady_temp_c"), ` ${T}`));
  row("Fluid limit", el("span", {}, numCell("span", th.limit_c, "temp_c", "limit_c"), ` ${T}`));
  row("Full lock: fluid in the pump reaches the limit after", th.full_lock_seconds_to_limit == null ? "not reached"
    : el("span", {}, numCell("span", th.full_lock_seconds_to_limit, "time_s", "full_lock_seconds_to_limit"), " s"));
  const bulk = th.full_lock && th.full_lock.bulk_seconds_to_limit;
  row("Full lock: whole fluid, mixed, after", bulk == null ? "not reached"
    : el("span", {}, numCell("span", bulk, "time_s", "bulk_seconds_to_limit"), " s"));
  row("Cooler needed", th.cooler_needed_w_per_k == null ? "–" : (th.cooler_needed_w_per_k === 0 ? "none"
    : el("span", {}, numCell("span", th.cooler_needed_w_per_k, "conductance_w_k", "cooler_needed_w_per_k"), ` ${U("conductance_w_k")}`)));
  card.append(dl, checksBlock(th.checks || []));
  box.append(card);
}

function conditionBlocks(result) {
  // one block per operating point (kept for the engine-boot browser test's selectors)
  const body = document.getElementById("results-body");
  body.replaceChildren();
  (result.conditions || []).forEach((condition, ci) => {
    const block = el("article", { class: "condition", "data-condition": String(ci) });
    block.append(el("h4", { class: "condition-name" }, condition.name));
    const summary = el("dl", { class: "condition-summary" });
    for (const [field, dec] of [["pump_flow_lpm"], ["pump_outlet_bar", [2, 1]], ["pump_inlet_bar", [2, 1]],
      ["viscosity_cst"], ["heat_w"]]) {
      if (condition[field] === undefined) continue;
      const row = declared(`conditions[].${field}`);
      const dd = el("dd");
      dd.append(numCell("span", condition[field], row.unit, field, dec), ` ${U(row.unit)}`);
      summary.append(el("dt", {}, row.label), dd);
    }
    summary.append(el("dt", {}, declared("conditions[].relief_open").label), el("dd", {}, condition.relief_open ? "open" : "closed"));
    block.append(summary);
    const table = el("table", { class: "lines" });
    const head = el("tr");
    const L = "conditions[].lines[].";
    for (const text of [heading(`${L}name`), heading(`${L}role`), heading(`${L}velocity_max_m_s`), heading(`${L}reynolds_min`),
      heading(`${L}pressure_drop_bar`), heading(`${L}temp_rise_c`)]) head.append(el("th", { scope: "col" }, text));
    table.append(el("thead", {}, head), el("tbody"));
    (condition.lines || []).forEach((line, li) => {
      const row = el("tr", { "data-line": String(li) });
      row.append(el("th", { scope: "row", class: "line-name" }, line.name), el("td", {}, line.role),
        resCell("td", line.velocity_max_m_s, `${L}velocity_max_m_s`, "velocity_max_m_s"),
        resCell("td", line.reynolds_min, `${L}reynolds_min`, "reynolds_min", 0),
        resCell("td", line.pressure_drop_bar, `${L}pressure_drop_bar`, "pressure_drop_bar", [3, 2]),
        el("td", { class: "num", "data-field": "temp_rise_c" }, fmtDiff(line.temp_rise_c, declared(`${L}temp_rise_c`).unit, 3)));
      table.tBodies[0].append(row);
    });
    block.append(el("div", { class: "table-wrap" }, table));
    body.append(block);
  });
}

function warningsBlock(result) {
  const box = document.getElementById("warnings");
  box.replaceChildren();
  const w = result.warnings || [];
  if (!w.length) return;
  box.append(el("h3", {}, "Warnings"));
  const ul = el("ul", { class: "warn-list" });
  for (const x of w) ul.append(el("li", { "data-warning-path": x.path || "" }, x.label ? `${x.label}: ${x.message}` : x.message));
  box.append(ul);
}

function summaryBlock(result) {
  const box = document.getElementById("summary");
  box.replaceChildren();
  const table = el("table", { class: "summary-table" });
  table.append(el("caption", { class: "visually-hidden" }, "Verdict per line"));
  table.append(el("thead", {}, el("tr", {}, ...["Line", heading("lines[].verdict"), "Not passing",
    heading("lines[].pressure_drop_max_bar"), heading("lines[].rating.margin")].map((t) => el("th", { scope: "col" }, t)))));
  const tb = el("tbody");
  (result.lines || []).forEach((line, li) => {
    const bad = (line.checks || []).filter((c) => c.verdict !== "ok").map((c) => `${c.check} (${c.verdict})`);
    tb.append(el("tr", { "data-summary-line": String(li) },
      el("th", { scope: "row" }, `Line ${li + 1}: ${line.name || `line ${li + 1}`} (${line.role})`),
      el("td", {}, badge(line.verdict)),
      el("td", {}, bad.length ? bad.join(", ") : "none"),
      resCell("td", line.pressure_drop_max_bar, "lines[].pressure_drop_max_bar", "max_drop_bar", [2, 1]),
      resCell("td", line.rating ? line.rating.margin : null, "lines[].rating.margin", "margin", 2)));
  });
  if (result.circuit) {
    const bad = (result.circuit.checks || []).filter((c) => c.verdict !== "ok").map((c) => `${c.check} (${c.verdict})`);
    tb.append(el("tr", { "data-summary-line": "circuit" }, el("th", { scope: "row" }, declared("circuit").label.toLowerCase()),
      el("td", {}, badge(result.circuit.verdict)), el("td", {}, bad.length ? bad.join(", ") : "none"), el("td"), el("td")));
  }
  if (result.thermal) {
    const bad = (result.thermal.checks || []).filter((c) => c.verdict !== "ok").map((c) => `${c.check} (${c.verdict})`);
    tb.append(el("tr", { "data-summary-line": "thermal" }, el("th", { scope: "row" }, "fluid temperature"),
      el("td", {}, badge(result.thermal.verdict)), el("td", {}, bad.length ? bad.join(", ") : "none"), el("td"), el("td")));
  }
  table.append(tb);
  box.append(table);
}

// actions: {applyEdits(edits, words)} to make an engine's edit (a fix or a candidate), or null.
export function renderResult(result, actions = null) {
  summaryBlock(result);
  lineCards(result, actions);
  thermalBlock(result);
  conditionBlocks(result);
  warningsBlock(result);
}

// fault: the engine's own failure on the last evaluation (a sentence), or null.
export function renderProblems(errors, localErrors, fault = null) {
  const box = document.getElementById("problems");
  box.replaceChildren();
  const all = [...(localErrors || []), ...(errors || [])];
  box.hidden = all.length === 0 && !fault;
  if (fault) {
    box.append(el("p", { class: "problems-title engine-fault" },
      `The engine failed on this job (${fault}). The results below are for the last job that computed; `
      + "your next edit asks the engine again. If it keeps failing, save the job file and reload the page."));
  }
  if (!all.length) return;
  const shown = document.getElementById("line-results").childElementCount > 0;
  box.append(el("p", { class: "problems-title" }, `${all.length} problem${all.length > 1 ? "s" : ""} in the job; `
    + (shown ? "the results below are for the last job that computed:" : "results come once they are put right:")));
  const ul = el("ul");
  for (const e of all) ul.append(el("li", { "data-problem-path": e.path || "" }, e.label || e.path ? `${e.label || e.path}: ${e.message}` : e.message));
  box.append(ul);
}

// ---------------------------------------------------------------- plots

export function renderPlots(result, sweep) {
  const box = document.getElementById("plots");
  box.replaceChildren();
  box.append(el("h3", {}, "Plots"));
  const grid = el("div", { class: "plot-grid" });
  const P = U("pressure_bar"), T = U("temp_c"), Q = U("flow_lpm");
  if (sweep && sweep.result) {
    const r = sweep.result;
    const series = (r.lines || []).map((line, li) => ({
      name: line.name || `line ${li + 1}`,
      points: r.conditions.map((c) => [toShow(c.fluid_temp_c, "temp_c"), toShow(c.lines[li].pressure_drop_bar, "pressure_bar")]),
    }));
    grid.append(plotFigure({
      id: "drop-vs-temp", title: `Pressure drop against fluid temperature (${r.engine_rpm} rpm)`,
      xLabel: `fluid temperature (${T})`, yLabel: `pressure drop (${P})`, series, yZero: true,
      xName: "fluid temperature", xUnit: T, xDec: decimalsFor("temp_c"), yUnit: P, yDec: decimalsFor("pressure_bar"),
    }));
  } else {
    grid.append(el("figure", { class: "plot plot-wait" }, el("p", {}, sweep && sweep.error
      ? `Pressure drop against temperature: ${sweep.error}` : "Pressure drop against temperature: computing…")));
  }
  const curve = result.pump_curve;
  if (curve && Array.isArray(curve.points)) {
    const table = Array.isArray(curve.table) ? curve.table : [];
    const series = [{ name: "delivered flow", points: curve.points.map((p) => [p.engine_rpm, toShow(p.delivered_lpm, "flow_lpm")]), markers: false }];
    if (table.length) {
      series.push({ name: "pump's flow table", points: table.map((r) => [r.engine_rpm, toShow(r.table_lpm, "flow_lpm")]), line: false, readout: false });
    }
    grid.append(plotFigure({
      id: "flow-vs-speed", title: "Delivered flow against engine speed",
      xLabel: "engine speed (rpm)", yLabel: `delivered flow (${Q})`, markers: false, series,
      hlines: curve.flow_limit_lpm == null ? [] : [{ y: toShow(curve.flow_limit_lpm, "flow_lpm"), label: `flow-control cap ${fmt(curve.flow_limit_lpm, "flow_lpm")} ${Q}` }],
      yZero: true, xName: "engine speed", xUnit: "rpm", xDec: 0, yUnit: Q, yDec: decimalsFor("flow_lpm"),
      note: table.length ? "Marks: the pump's flow table, each row at the engine speed that turns the pump at its speed: "
        + table.map((r) => `${fmt(r.pump_rpm, "speed_rpm")} rpm pump (${fmt(r.engine_rpm, "speed_rpm")} rpm engine) ${fmt(r.table_lpm, "flow_lpm")} ${Q}`).join("; ")
        + ". The line never rises above what the pump displaces." : "",
    }));
  }
  const th = result.thermal;
  if (th && Array.isArray(th.full_lock_curve) && th.full_lock_curve.length) {
    const C = "thermal.full_lock_curve[].";
    grid.append(plotFigure({
      xName: "time held", xUnit: "s", xDec: 1, yUnit: T, yDec: decimalsFor("temp_c"),
      id: "temp-vs-time", title: "Fluid temperature at full lock",
      xLabel: "time held at full lock (s)", yLabel: `fluid temperature (${T})`,
      series: [
        { name: declared(`${C}pump_temp_c`).label.toLowerCase(), points: th.full_lock_curve.map((p) => [p.t_s, toShow(p.pump_temp_c, "temp_c")]), markers: false },
        { name: declared(`${C}bulk_temp_c`).label.toLowerCase(), points: th.full_lock_curve.map((p) => [p.t_s, toShow(p.bulk_temp_c, "temp_c")]), markers: false },
      ],
      hlines: [{ y: toShow(th.limit_c, "temp_c"), label: `fluid limit ${fmt(th.limit_c, "temp_c")} ${T}` }],
    }));
  } else {
    grid.append(el("figure", { class: "plot plot-wait" }, el("p", {}, "Fluid temperature at full lock: this engine build gives no full-lock curve.")));
  }
  box.append(grid);
}

// Before and after a candidate was applied: the engine's figures for the line's own hose row
// (candidates[].current) and its rating margin, from the result before and the result after.
export function compareBlock(before, after) {
  const C = "lines[].candidates[].";
  const rows = [[`${C}pressure_drop_bar`, (x) => x.row && x.row.pressure_drop_bar, [2, 1]],
    [`${C}velocity_max_m_s`, (x) => x.row && x.row.velocity_max_m_s],
    [`${C}working_bar`, (x) => x.row && x.row.working_bar, [0, 0]],
    ["lines[].rating.margin", (x) => x.margin]];
  const table = el("table", { class: "compare" });
  table.append(el("thead", {}, el("tr", {}, el("th", { scope: "col" }, "Line figure"), el("th", { scope: "col" }, "Before"), el("th", { scope: "col" }, "After"))));
  const tb = el("tbody");
  for (const [path, get, decimals] of rows) {
    const kind = declared(path).unit;
    tb.append(el("tr", { "data-compare": path.split(".").pop() }, el("th", { scope: "row" }, heading(path)),
      el("td", { class: "num" }, fmt(get(before), kind, decimals)), el("td", { class: "num" }, fmt(get(after), kind, decimals))));
  }
  table.append(tb);
  return el("div", { class: "compare-wrap" }, table,
    el("p", { class: "small" }, "Mass is not compared: the hose tables give no mass per metre."));
}
