// Build sheet: what the shop cuts and crimps from, per line, plus a parts list.
// Shown only in print (and by the "Print build sheet" button).
import { badge, el } from "./util.js";
import { fmt, unitLabel } from "./units.js";
import { partDash } from "./declared.js";
import { cautionsList } from "./results.js";

const U = (k) => unitLabel(k);

// dash: the dash size the engine gives the part's size ("-6", "≈ -6" or ""); cutMm: the assembly's cut length
// of this hose, where the engine worked it out.
function partSpec(p, dash = "", cutMm = null) {
  if (p.kind === "hose") {
    const cls = p.class ? `${p.class}${p.dash ? ` -${p.dash}` : ""}` : "hose, class not named";
    const bore = typeof p.bore_mm === "number" ? `, bore ${fmt(p.bore_mm, "length_mm", [1, 3])} ${U("length_mm")}${dash ? ` (dash ${dash})` : ""}`
      : p.dash ? `, dash -${p.dash}` : "";
    const length = cutMm != null ? `cut to ${fmt(cutMm, "length_mm", [0, 2])} ${U("length_mm")}`
      : `length ${fmt(p.length_m, "length_m", [3, 2])} ${U("length_m")}`;
    return `Hose ${cls}${bore}, ${length}`;
  }
  if (p.kind === "tube") {
    return `Rigid tube ${p.material || "steel-low-carbon"}, ${fmt(p.od_mm, "length_mm", [2, 3])} x ${fmt(p.wall_mm, "length_mm", [2, 3])} ${U("length_mm")} `
      + `${dash ? `(OD dash ${dash}), ` : ""}length ${fmt(p.length_m, "length_m", [3, 2])} ${U("length_m")}`
      + ((p.bends || []).length ? `, ${(p.bends || []).length} bend(s) at ${(p.bends || []).map((b) => `${b.angle_deg ?? 90}° R${fmt(b.radius_mm, "length_mm", [0, 2])}`).join(", ")}` : "");
  }
  if (p.kind === "fitting") {
    const fam = p.family ? `${p.family}${p.dash ? ` -${p.dash}` : ""}` : "family not named";
    const end = p.end && p.end !== "inline" ? `, assembly ${p.end}` : "";
    const orient = typeof p.orientation_deg === "number" && p.orientation_deg !== 0 ? `, clocked ${p.orientation_deg}°` : "";
    return `Fitting ${p.shape || "straight"}, ${fam}, bore ${fmt(p.bore_mm, "length_mm", [1, 3])} ${U("length_mm")}${end}${orient}`
      + (p.cutoff_mm ? `, cut-off ${fmt(p.cutoff_mm, "length_mm", [0, 2])} ${U("length_mm")}` : "");
  }
  if (p.kind === "device") return `${p.is_cooler ? "Cooler" : "Series device"}: drop ${fmt(p.dp_bar, "pressure_bar")} ${U("pressure_bar")} at ${fmt(p.at_flow_lpm, "flow_lpm")} ${U("flow_lpm")}`;
  if (p.kind === "entrance") return `Reservoir outlet, bore ${fmt(p.bore_mm, "length_mm", [1, 3])} ${U("length_mm")}, ${p.edge || "sharp"} edge`;
  if (p.kind === "exit") return `Discharge into reservoir, bore ${fmt(p.bore_mm, "length_mm", [1, 3])} ${U("length_mm")}`;
  return p.kind;
}

function portText(port) {
  if (!port) return "not described";
  const bits = [port.label || "(port not named)"];
  if (port.thread) bits.push(`thread ${port.thread}`);
  if (port.seal) bits.push(`seal ${port.seal}`);
  if (port.line_end_family) {
    let size = "";
    if (port.line_end_dash) size = ` -${port.line_end_dash}`;
    else if (typeof port.line_end_tube_od_mm === "number") size = ` tube OD ${fmt(port.line_end_tube_od_mm, "length_mm", [0, 3])} ${U("length_mm")}`;
    else if (port.line_end_thread) size = ` ${port.line_end_thread}`;
    bits.push(`line end ${port.line_end_family}${size}`);
  }
  return bits.join("; ");
}

function checkMessage(line, name) {
  const c = (line.checks || []).find((x) => x.check === name);
  return c ? c : null;
}

export function renderSheet(job, result) {
  const sheet = document.getElementById("sheet");
  sheet.replaceChildren();
  sheet.append(el("h2", { class: "sheet-title" }, `Build sheet: ${job.name || "(unnamed job)"}`));
  if (job.notes) sheet.append(el("p", { class: "sheet-notes" }, job.notes));
  if (!result) {
    sheet.append(el("p", {}, "No result yet: the build sheet needs a job that computes."));
    return;
  }
  const P = U("pressure_bar");
  (job.lines || []).forEach((line, li) => {
    const r = (result.lines || [])[li] || { checks: [] };
    const sec = el("section", { class: "sheet-line", "data-sheet-line": String(li) });
    sec.append(el("h3", {}, badge(r.verdict || "caution"), ` Line ${li + 1}: `, el("span", {}, line.name || "(unnamed)"), ` (${line.role})`));
    const dl = el("dl", { class: "kv" });
    const row = (a, b) => dl.append(el("dt", {}, a), el("dd", {}, b));
    const parts = line.parts || [];
    const endFitting = (which) => {
      const marked = parts.find((p) => p.kind === "fitting" && p.end === which);
      const edge = which === "start" ? parts[0] : parts[parts.length - 1];
      return marked || (edge && edge.kind === "fitting" ? edge : null);
    };
    const endText = (port, which, plan) => {
      const box = el("span", {}, portText(port));
      const f = endFitting(which);
      if (f) box.append(el("br"), `line fitting: ${partSpec(f)}; orientation ${typeof f.orientation_deg === "number" ? f.orientation_deg : 0}°`);
      if (plan && Array.isArray(plan.adapters)) {
        if (plan.adapters.length === 0) box.append(el("br"), "adapters: none needed");
        for (const a of plan.adapters) {
          box.append(el("br"), `adapter: ${a.name}; bore ${fmt(a.bore_mm, "length_mm", [1, 3])} ${U("length_mm")}; working `
            + (a.working_bar == null ? "unknown (maker's data)" : `${fmt(a.working_bar, "pressure_bar", [0, 0])} ${P}`));
        }
      }
      if (plan && plan.message) box.append(el("br"), el("em", {}, plan.message));
      return box;
    };
    const ports = r.ports || {};
    row("Start", endText(line.from_port, "start", ports.from_port));
    row("End", endText(line.to_port, "end", ports.to_port));
    const a = r.assembly;
    const L = U("length_mm");
    if (a && a.hose_cut_mm != null) {
      row("Cut length", el("span", { "data-field": "hose_cut_mm" }, `${fmt(a.hose_cut_mm, "length_mm", [0, 2])} ${L}`,
        ` (part ${a.hose_part + 1}), ${fmt(a.overall_mm, "length_mm", [0, 2])} ${L} end to end`));
    }
    const lc = checkMessage(r, "length");
    if (lc) row("Length and slack", lc.message);
    if (r.rating) {
      const ra = r.rating;
      const v = (value, kind, field, dec, suffix = "") => (value == null ? el("span", { "data-field": field }, "unknown")
        : el("span", {}, el("span", { "data-field": field, class: "num" }, fmt(value, kind, dec)), suffix));
      row("Rating", el("span", {}, "working ", v(ra.working_bar, "pressure_bar", "working_bar", [0, 0], ` ${P}`),
        ", burst ", v(ra.burst_bar, "pressure_bar", "burst_bar", [0, 0], ` ${P}`),
        ", proof test ", v(ra.proof_test_bar, "pressure_bar", "proof_test_bar", [0, 0], ` ${P}`), " (2 × working)",
        "; must hold ", v(ra.required_bar, "pressure_bar", "required_bar", [1, 0], ` ${P}`), ` (${ra.required_basis})`));
      row("Margins", el("span", {}, "working / must hold ", v(ra.margin, null, "margin", 2),
        "; burst ", v(ra.burst_margin, null, "burst_margin", 1, ":1"), ` against ${ra.design_factor}:1`));
      row("Weakest part", ra.weakest_part ? ra.weakest_part.label : "none rated");
    }
    sec.append(dl);
    // in flow order as built: the user's parts by their number, the planned adapters by their end
    const ul = el("ul", { class: "sheet-parts" });
    for (const b of r.parts || []) {
      if (b.job_part === null) {
        ul.append(el("li", { "data-sheet-adapter": "" }, `Adapter: ${b.label.replace(/^the adapter /, "")}`));
        continue;
      }
      const p = (line.parts || [])[b.job_part] || {};
      const cut = a && a.hose_part === b.job_part ? a.hose_cut_mm : null;
      ul.append(el("li", { "data-sheet-part": String(b.job_part) }, `${b.job_part + 1}. ${partSpec(p, partDash(result, li, b.job_part), cut)}`));
    }
    sec.append(el("h4", {}, "Parts in flow order (hose, tube, fittings and adapters)"), ul);
    const bad = (r.checks || []).filter((c) => c.verdict !== "ok");
    if (bad.length) {
      const ul = el("ul", { class: "check-list" });
      for (const c of bad) ul.append(el("li", {}, badge(c.verdict), ` ${c.check}: ${c.message}`));
      sec.append(el("h4", {}, "Open points"), ul);
    }
    sec.append(cautionsList("cautions sheet-cautions"));
    sheet.append(sec);
  });
  // parts list for the whole job
  const tally = new Map();
  const add = (key, qty, unit) => {
    const cur = tally.get(key) || { qty: 0, unit };
    cur.qty += qty;
    tally.set(key, cur);
  };
  (job.lines || []).forEach((line, li) => {
    const asm = ((result.lines || [])[li] || {}).assembly;
    (line.parts || []).forEach((p, k) => {
      const length = asm && asm.hose_part === k && asm.hose_cut_mm != null ? asm.hose_cut_mm / 1000 : p.length_m || 0;
      if (p.kind === "hose") add(`Hose ${p.class ? `${p.class}${p.dash ? ` -${p.dash}` : ""}` : "(class not named)"}${typeof p.bore_mm === "number" ? `, bore ${fmt(p.bore_mm, "length_mm", [1, 3])} ${U("length_mm")}` : ""}`, length, "length_m");
      else if (p.kind === "tube") add(`Tube ${p.material || "steel-low-carbon"} ${fmt(p.od_mm, "length_mm", [2, 3])} x ${fmt(p.wall_mm, "length_mm", [2, 3])} ${U("length_mm")}`, p.length_m || 0, "length_m");
      else if (p.kind === "fitting") add(`Fitting ${p.shape || "straight"} ${p.family || "(family not named)"}${p.dash ? ` -${p.dash}` : ""}, bore ${fmt(p.bore_mm, "length_mm", [1, 3])} ${U("length_mm")}`, 1, "count");
      else if (p.kind === "device") add(p.is_cooler ? "Cooler" : "Series device", 1, "count");
    });
  });
  for (const r of result.lines || []) {
    for (const plan of Object.values(r.ports || {})) {
      for (const a of (plan && plan.adapters) || []) add(`Adapter ${a.name}`, 1, "count");
    }
  }
  const table = el("table", { class: "parts-list" });
  table.append(el("thead", {}, el("tr", {}, el("th", { scope: "col" }, "Item"), el("th", { scope: "col" }, "Quantity"))));
  const tb = el("tbody");
  for (const [key, { qty, unit }] of tally) {
    tb.append(el("tr", {}, el("td", {}, key), el("td", { class: "num" }, unit === "count" ? `${qty}` : `${fmt(qty, "length_m", [2, 2])} ${U("length_m")}`)));
  }
  table.append(tb);
  sheet.append(el("section", { class: "sheet-partslist" }, el("h3", {}, "Parts list for the whole job"), table));
  sheet.append(el("p", { class: "sheet-foot" }, "Engineering estimates from Linesmith. Check every rating against the maker's data, local codes and licensed practice before you build."));
}
