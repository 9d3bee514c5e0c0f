// Build sheet: what the shop cuts and crimps from. A header from the job (customer, vehicle, job number,
// date), per line its cutting card (route sketch, cut length, ends, tag line with working and proof-test
// pressures), its parts in flow order with the adapters, its open points; then the order list and, once
// per sheet, the cautions and the disclaimer. Figures at shop precision (precision.js).
// Shown only in print (and by the "Print build sheet" button).
import { badge, el, readJSON } from "./util.js";
import { fmt, unitLabel } from "./units.js";
import { choiceWords, declared, partDash } from "./declared.js";
import { cautionsList } from "./results.js";
import { shop } from "./precision.js";
import { routeSketch } from "./sketch.js";

const JOB_FIELDS = new Map(readJSON("linesmith-model").job.fields.map((f) => [f.key, f]));
const jobLabel = (key) => JOB_FIELDS.get(key).label;
const fieldLabel = (record, key) => JOB_FIELDS.get(record).fields.find((f) => f.key === key).label;
const HEADER = ["name", "customer", "vehicle", "job_number", "date"];

function hoseName(p) {
  return p.class ? `${p.class}${p.dash ? ` -${p.dash}` : ""}` : "hose, class not named";
}

// dash: the dash size the engine gives the part's size ("-6", "≈ -6" or ""); cutMm: the assembly's cut length
// of this hose, where the engine worked it out.
export function partSpec(p, dash = "", cutMm = null) {
  if (p.kind === "hose") {
    const bore = typeof p.bore_mm === "number" ? `, bore ${shop(p.bore_mm, "bore")}${dash ? ` (dash ${dash})` : ""}`
      : p.dash ? `, dash -${p.dash}` : "";
    const length = cutMm != null ? `cut to ${shop(cutMm, "cut_length")}` : `length ${shop(p.length_m * 1000, "cut_length")}`;
    return `Hose ${hoseName(p)}${bore}, ${length}`;
  }
  if (p.kind === "tube") {
    const bends = (p.bends || []).map((b) => `${shop(b.angle_deg ?? 90, "angle")} R ${shop(b.radius_mm, "route_length")}`);
    return `Rigid tube ${p.material || "steel-low-carbon"}, ${shop(p.od_mm, "tube_size")} OD x ${shop(p.wall_mm, "tube_size")} wall `
      + `${dash ? `(OD dash ${dash}), ` : ""}length ${shop(p.length_m * 1000, "cut_length")}`
      + (bends.length ? `, ${bends.length} bend(s) at ${bends.join(", ")}` : "");
  }
  if (p.kind === "fitting") {
    const fam = p.family ? `${choiceWords("family", p.family)}${p.dash ? ` -${p.dash}` : ""}` : "family not named";
    const end = p.end && p.end !== "inline" ? `, assembly ${p.end}` : "";
    const orient = typeof p.orientation_deg === "number" && p.orientation_deg !== 0 ? `, clocked ${shop(p.orientation_deg, "angle")}` : "";
    return `Fitting ${p.shape || "straight"}, ${fam}, bore ${shop(p.bore_mm, "bore")}${end}${orient}`
      + (p.cutoff_mm ? `, cut-off ${shop(p.cutoff_mm, "route_length")}` : "");
  }
  if (p.kind === "device") return `${p.is_cooler ? "Cooler" : "Series device"}: drop ${shop(p.dp_bar, "pressure")} at ${fmt(p.at_flow_lpm, "flow_lpm")}`;
  if (p.kind === "entrance") return `Reservoir outlet, bore ${shop(p.bore_mm, "bore")}, ${p.edge || "sharp"} edge`;
  if (p.kind === "exit") return `Discharge into reservoir, bore ${shop(p.bore_mm, "bore")}`;
  return p.kind;
}

function portText(port) {
  if (!port) return "not described";
  const bits = [port.label || "(port not named)"];
  if (port.thread) bits.push(`thread ${port.thread}`);
  if (port.seal) bits.push(`seal: ${choiceWords("seal", port.seal)}`);
  if (port.line_end_family) {
    let size = "";
    if (port.line_end_dash) size = ` -${port.line_end_dash}`;
    else if (typeof port.line_end_tube_od_mm === "number") size = ` tube OD ${shop(port.line_end_tube_od_mm, "tube_size")}`;
    else if (port.line_end_thread) size = ` ${port.line_end_thread}`;
    bits.push(`line end ${choiceWords("line_end_family", port.line_end_family)}${size}`);
  }
  return bits.join("; ");
}

function sheetHeader(job) {
  const head = el("header", { class: "sheet-head" });
  head.append(el("h2", { class: "sheet-title" }, "Build sheet"));
  const dl = el("dl", { class: "sheet-fields" });
  for (const key of HEADER) {
    const value = job[key];
    dl.append(el("dt", {}, key === "name" ? "Job" : jobLabel(key)),
      el("dd", { "data-head": key, class: value ? "" : "fill-in" }, value || "not given"));
  }
  head.append(dl);
  if (job.notes_on_sheet && job.notes) head.append(el("p", { class: "sheet-notes" }, el("strong", {}, `${jobLabel("notes")}: `), job.notes));
  return head;
}

// The pump and the gear as the lines were sized for them: drive, flow control (the setting or the pump's flow
// table), relief, and the gear's rating and need with the engine's verdicts on them.
function pumpGearSection(job, result) {
  const pump = job.pump || {}, gear = job.gear || {};
  const P = (key) => fieldLabel("pump", key), G = (key) => fieldLabel("gear", key);
  const given = (v, text) => (typeof v === "number" ? text : el("span", { class: "fill-in" }, "not given"));
  const curve = result.pump_curve || {};
  const drive = typeof pump.crank_pulley_mm === "number" && typeof pump.pump_pulley_mm === "number"
    ? `${shop(pump.crank_pulley_mm, "pulley")} crank, ${shop(pump.pump_pulley_mm, "pulley")} pump: ratio ${fmt(curve.pulley_ratio, "ratio")}`
    : `ratio ${fmt(curve.pulley_ratio, "ratio")}`;
  const table = curve.table || [];
  const flow = table.length
    ? `${P("flow_table_rpm_lpm")}: ` + table.map((r) => `${shop(r.pump_rpm, "speed", false)} rpm ${shop(r.table_lpm, "flow")}`).join("; ")
    : `${P("flow_limit_lpm")}: ${shop(pump.flow_limit_lpm, "flow")}`;
  const rows = [
    [P("displacement_cc_rev"), `${fmt(pump.displacement_cc_rev, "displacement_cc")} ${unitLabel("displacement_cc")}`],
    ["Drive", drive], ["Flow control", flow],
    [P("relief_bar"), shop(pump.relief_bar, "rating")],
    [G("rated_bar"), given(gear.rated_bar, shop(gear.rated_bar, "rating"))],
    [G("flow_needed_lpm"), given(gear.flow_needed_lpm, shop(gear.flow_needed_lpm, "flow"))],
  ];
  const box = el("section", { class: "sheet-pump" }, el("h3", {}, "Pump and steering gear"), kv(rows));
  const checks = ((result.circuit || {}).checks || []).filter((c) => ["relief setting", "gear rating", "gear flow", "flow-control setting"].includes(c.check));
  if (checks.length) {
    const ul = el("ul", { class: "sheet-checks" });
    for (const c of checks) ul.append(el("li", {}, badge(c.verdict), ` ${c.check}: ${c.message}`));
    box.append(ul);
  }
  return box;
}

function endsOf(line, r) {
  const parts = line.parts || [];
  const endFitting = (which) => {
    const marked = parts.find((p) => p.kind === "fitting" && p.end === which);
    const edge = which === "start" ? parts[0] : parts[parts.length - 1];
    return marked || (edge && edge.kind === "fitting" ? edge : null);
  };
  const ports = r.ports || {};
  return ["start", "end"].map((which) => {
    const port = which === "start" ? line.from_port : line.to_port;
    const plan = which === "start" ? ports.from_port : ports.to_port;
    const box = el("span", {}, portText(port));
    const f = endFitting(which);
    if (f) box.append(el("br"), `line fitting: ${partSpec(f)}; orientation ${shop(typeof f.orientation_deg === "number" ? f.orientation_deg : 0, "angle")}`);
    if (plan && Array.isArray(plan.adapters)) {
      if (plan.adapters.length === 0) box.append(el("br"), "adapters: none needed");
      for (const a of plan.adapters) {
        box.append(el("br"), `adapter: ${a.name}; bore ${shop(a.bore_mm, "bore")}; working `
          + (a.working_bar == null ? "unknown (maker's data)" : shop(a.working_bar, "rating")));
      }
    }
    if (plan && plan.message) box.append(el("br"), el("em", {}, plan.message));
    return [which === "start" ? "Start" : "End", box];
  });
}

function kv(rows) {
  const dl = el("dl", { class: "kv" });
  for (const [a, b] of rows) dl.append(el("dt", {}, a), el("dd", {}, b));
  return dl;
}

// One cutting card per hose assembly: what to cut, how it runs, and the tag to hang on it.
function cuttingCard(line, li, r) {
  const a = r.assembly;
  if (!a || a.hose_cut_mm == null) return null;
  const hose = (line.parts || [])[a.hose_part] || {};
  const ra = r.rating || {};
  const card = el("div", { class: "cut-card", "data-cut-card": String(li) });
  card.append(el("h4", {}, `Cutting card: line ${li + 1} ‘`, el("span", {}, line.name || "(unnamed)"), "’"));
  const rows = [
    ["Hose", `${hoseName(hose)}${typeof hose.bore_mm === "number" ? `, bore ${shop(hose.bore_mm, "bore")}` : ""} (part ${a.hose_part + 1})`],
    [declared("lines[].assembly.hose_cut_mm").label, el("strong", {}, el("span", { "data-field": "hose_cut_mm" }, shop(a.hose_cut_mm, "cut_length", false)), ` ${unitLabel("length_mm")}`)],
    [declared("lines[].assembly.overall_mm").label, `${shop(a.overall_mm, "cut_length")}, with ${shop(a.cutoff_mm, "route_length")} of cut-off allowances`],
    ...endsOf(line, r),
  ];
  if (a.slack_mm != null) rows.push([declared("lines[].assembly.slack_mm").label, `${shop(a.slack_mm, "route_length")}; needed ${shop(a.slack_needed_mm, "route_length")}`]);
  card.append(kv(rows));
  const sketch = routeSketch(r.sketch, li);
  if (sketch) card.append(sketch);
  const proof = ra.proof_test_bar == null ? "no proof-test pressure (no rating known)" : `proof test ${shop(ra.proof_test_bar, "rating")}`;
  card.append(el("p", { class: "tag-line", "data-tag-line": String(li) }, el("strong", {}, "Tag: "),
    `line ${li + 1} ‘${line.name || "(unnamed)"}’, ${hoseName(hose)}, cut ${shop(a.hose_cut_mm, "cut_length")}; `,
    ra.working_bar == null ? "working pressure unknown (maker's data)" : `working ${shop(ra.working_bar, "rating")}`, `; ${proof}.`));
  card.append(el("p", { class: "card-caution" }, "⚠ Never exceed the maker's rated working pressure of any part; proof-test only "
    + "with the maker's procedure, behind a guard. The maker's data, local codes and licensed practice have the last word."));
  return card;
}

function ratingRows(ra) {
  const v = (value, field, q) => (value == null ? el("span", { "data-field": field }, "unknown")
    : el("span", {}, el("span", { "data-field": field, class: "num" }, shop(value, q, false)), ` ${unitLabel("pressure_bar")}`));
  return [
    ["Rating", el("span", {}, "working ", v(ra.working_bar, "working_bar", "rating"), ", burst ", v(ra.burst_bar, "burst_bar", "rating"),
      ", proof test ", v(ra.proof_test_bar, "proof_test_bar", "rating"), " (2 × working)",
      "; must hold ", v(ra.required_bar, "required_bar", "pressure"), ` (${ra.required_basis})`)],
    ["Margins", el("span", {}, "working / must hold ", el("span", { "data-field": "margin", class: "num" }, fmt(ra.margin, null, 2)),
      "; burst ", el("span", { "data-field": "burst_margin", class: "num" }, fmt(ra.burst_margin, null, 1)), `:1 against ${ra.design_factor}:1`)],
    ["Weakest part", ra.weakest_part ? ra.weakest_part.label : "none rated"],
  ];
}

// A part near a heat source on the sheet: the air around it and the engine's wall estimate and verdict.
function nearHeat(w) {
  const T = unitLabel("temp_c");
  const t = (v) => (v == null ? "unknown" : `${fmt(v, "temp_c", 0)} ${T}`);
  return el("span", { class: "near-heat", "data-near-heat": String(w.job_part) }, w.verdict ? badge(w.verdict) : "",
    ` Near heat: ${t(w.air_temp_c)} air around it; wall estimated up to ${t(w.hottest_c)} `
    + `(radiation not counted: hotter still near the source); limit ${t(w.limit_c)}`
    + `${w.limit_c == null ? "" : w.limit_basis === "fluid" ? " (fluid rating)" : " (wall)"}. `
    + "Keep it away from the heat, or fit a heat sleeve or shield.");
}

function lineSection(job, result, line, li) {
  const r = (result.lines || [])[li] || { checks: [] };
  const sec = el("section", { class: "sheet-line", "data-sheet-line": String(li) });
  sec.append(el("h3", {}, badge(r.verdict || "caution"), ` Line ${li + 1}: `, el("span", {}, line.name || "(unnamed)"), ` (${line.role})`));
  const card = cuttingCard(line, li, r);
  if (card) sec.append(card);
  else sec.append(kv(endsOf(line, r)));
  const lc = (r.checks || []).find((x) => x.check === "length");
  sec.append(kv([...(lc ? [["Length and slack", lc.message]] : []), ...(r.rating ? ratingRows(r.rating) : [])]));
  // in flow order as built: the user's parts by their number, the planned adapters by their end
  const ul = el("ul", { class: "sheet-parts" });
  const a = r.assembly;
  for (const b of r.parts || []) {
    if (b.job_part === null) {
      ul.append(el("li", { "data-sheet-adapter": "" }, `Adapter: ${b.label.replace(/^the adapter /, "")}`));
      continue;
    }
    const p = (line.parts || [])[b.job_part] || {};
    const cut = a && a.hose_part === b.job_part ? a.hose_cut_mm : null;
    const li_ = el("li", { "data-sheet-part": String(b.job_part) }, `${b.job_part + 1}. ${partSpec(p, partDash(result, li, b.job_part), cut)}`);
    const w = (r.walls || []).find((x) => x.job_part === b.job_part && (x.local_air_temp_c != null || x.verdict != null));
    if (w) li_.append(el("br"), nearHeat(w));
    ul.append(li_);
  }
  sec.append(el("div", { class: "sheet-block" }, el("h4", {}, "Parts in flow order (hose, tube, fittings and adapters)"), ul));
  const bad = (r.checks || []).filter((c) => c.verdict !== "ok");
  if (bad.length) {
    const ol = el("ul", { class: "check-list" });
    for (const c of bad) ol.append(el("li", {}, badge(c.verdict), ` ${c.check}: ${c.message}`));
    sec.append(el("div", { class: "sheet-block" }, el("h4", {}, "Open points"), ol));
  }
  return sec;
}

function table(caption, heads, rows) {
  const t = el("table", { class: "order-table" }, el("caption", {}, caption));
  t.append(el("thead", {}, el("tr", {}, ...heads.map((h) => el("th", { scope: "col" }, h)))));
  const tb = el("tbody");
  for (const cells of rows) tb.append(el("tr", {}, ...cells.map((c, i) => el(i ? "td" : "th", i ? { class: typeof c === "string" && /^\d/.test(c) ? "num" : "" } : { scope: "row" }, c))));
  t.append(tb);
  return t;
}

// The order list: the engine's totals (result.order), labelled by the result declaration.
function orderList(order) {
  const O = (k) => declared(`order.${k}`).label;
  const used = (x) => x.lines.map((j) => j + 1).join(", ");
  const box = el("section", { class: "sheet-partslist sheet-order" }, el("h3", {}, declared("order").label));
  const hoses = order.hoses.map((h) => [h.class ? `${h.class}${h.dash ? ` -${h.dash}` : ""}` : "class not named",
    shop(h.bore_mm, "bore"), shop(h.total_mm / 1000, "order_length"), `${h.pieces}`, used(h)]);
  if (hoses.length) box.append(table(O("hoses"), [O("hoses[].class"), O("hoses[].bore_mm"), O("hoses[].total_mm"), O("hoses[].pieces"), O("hoses[].lines")], hoses));
  const tubes = order.tubes.map((t) => [t.material, shop(t.od_mm, "tube_size"), shop(t.wall_mm, "tube_size"), shop(t.total_mm / 1000, "order_length"), `${t.pieces}`, used(t)]);
  if (tubes.length) box.append(table(O("tubes"), [O("tubes[].material"), O("tubes[].od_mm"), O("tubes[].wall_mm"), O("tubes[].total_mm"), O("tubes[].pieces"), O("tubes[].lines")], tubes));
  const fits = order.fittings.map((f) => [`${f.family ? choiceWords("family", f.family) : "family not named"}${f.dash ? ` -${f.dash}` : ""}`, f.shape, shop(f.bore_mm, "bore"), `${f.count}`, used(f)]);
  if (fits.length) box.append(table(O("fittings"), [O("fittings[].family"), O("fittings[].shape"), O("fittings[].bore_mm"), O("fittings[].count"), O("fittings[].lines")], fits));
  const ads = order.adapters.map((a) => [a.name, `${a.count}`, used(a)]);
  if (ads.length) box.append(table(O("adapters"), [O("adapters[].name"), O("adapters[].count"), O("adapters[].lines")], ads));
  const devs = order.devices.map((d) => [d.is_cooler ? "cooler" : "series device", `${d.count}`, used(d)]);
  if (devs.length) box.append(table(O("devices"), ["Device", O("devices[].count"), O("devices[].lines")], devs));
  return box;
}

export function renderSheet(job, result) {
  const sheet = document.getElementById("sheet");
  sheet.replaceChildren(sheetHeader(job));
  if (!result) {
    sheet.append(el("p", {}, "No result yet: the build sheet needs a job that computes."));
    return;
  }
  sheet.append(pumpGearSection(job, result));
  (job.lines || []).forEach((line, li) => sheet.append(lineSection(job, result, line, li)));
  if (result.order) sheet.append(orderList(result.order));
  const foot = el("footer", { class: "sheet-foot" });
  foot.append(cautionsList("cautions sheet-cautions"),
    el("p", { class: "sheet-disclaimer" }, "Engineering estimates from Linesmith. Check every rating against the maker's data, local codes and licensed practice before you build."));
  sheet.append(foot);
}
