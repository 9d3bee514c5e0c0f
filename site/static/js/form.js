// The job form: the build renders every field from the engine's job model; this module
// fills it from the job, writes edits back (engine units), and renders the lists
// (operating points, lines, parts, bends) from the <template> of their record kind.
import { clone, deletePath, el, getPath, parsePath, setPath } from "./util.js";
import { fmt, fromShow, getSystem, inputText, unitLabel, UNITS } from "./units.js";
import { resultPart } from "./declared.js";
import { outOfRange, readNumber } from "./numbers.js";
import { clearDrafts, fillTable, markCell, rowsAfterClick, tableEdit } from "./tablefield.js";

let model = null;       // describe_job()
let state = null;       // { job } owned by app.js
let onChange = () => {};
const pendingText = new Map(); // path -> text the user typed that is not yet a valid value
const pendingWhy = new Map();  // path -> why it was not taken, in words
const formEl = () => document.getElementById("job-form");

export function initForm(theModel, theState, changed) {
  model = theModel;
  state = theState;
  onChange = changed;
  const form = formEl();
  form.addEventListener("input", onInput);
  form.addEventListener("change", onInput);
  form.addEventListener("click", onClick);
  form.addEventListener("submit", (e) => e.preventDefault());
}

// ---------------------------------------------------------------- model look-ups

function recordOf(listKey, kind) {
  // the item record of a list, by key (and part kind)
  const find = (rec) => {
    for (const f of rec.fields || []) {
      if (f.kind === "list" && f.key === listKey) return f.item;
      if (f.kind === "record") { const r = find(f); if (r) return r; }
      if (f.kind === "list") {
        const it = f.item.kind === "variants" ? Object.values(f.item.variants) : [f.item];
        for (const r0 of it) { const r = find(r0); if (r) return r; }
      }
    }
    return null;
  };
  const item = find(model.job);
  if (item && item.kind === "variants") return kind ? item.variants[kind] : item;
  return item;
}

function listField(listKey) {
  const find = (rec) => {
    for (const f of rec.fields || []) {
      if (f.kind === "list" && f.key === listKey) return f;
      if (f.kind === "record") { const r = find(f); if (r) return r; }
      if (f.kind === "list") {
        const it = f.item.kind === "variants" ? Object.values(f.item.variants) : [f.item];
        for (const r0 of it) { const r = find(r0); if (r) return r; }
      }
    }
    return null;
  };
  return find(model.job);
}

// ---------------------------------------------------------------- paths

export function pathOf(node) {
  const segs = [];
  for (let cur = node; cur && cur !== formEl(); cur = cur.parentElement) {
    if (cur.dataset && cur.dataset.seg) segs.unshift(cur.dataset.seg);
  }
  if (node.dataset && node.dataset.key) segs.push(node.dataset.key);
  return segs.join(".");
}

// The value shown for a path: the job's own, or the model's default operating points
// when the job lists none (the engine uses those then).
function shownValue(path) {
  if (path.startsWith("conditions") && state.job.conditions === undefined) {
    return getPath({ conditions: model.default_conditions }, path);
  }
  return getPath(state.job, path);
}

function materialise(path) {
  if (path.startsWith("conditions") && state.job.conditions === undefined) {
    state.job.conditions = clone(model.default_conditions);
  }
}

// ---------------------------------------------------------------- filling

function fillInput(input) {
  const path = pathOf(input);
  input.dataset.path = path;
  const kind = input.dataset.kind;
  const unit = input.dataset.unit;
  const value = shownValue(path);
  const def = input.dataset.default;
  if (kind === "table") {
    fillTable(input, path, value);
    return;
  }
  if (kind === "bool") {
    input.checked = value === undefined ? def === "true" : Boolean(value);
    return;
  }
  if (kind === "choice") {
    input.value = value === undefined || value === null ? (def ?? "") : value;
    return;
  }
  if (pendingText.has(path)) {
    input.value = pendingText.get(path);
  } else if (kind === "points") {
    input.value = Array.isArray(value)
      ? value.map((p) => p.map((c) => inputText(c, unit)).join(", ")).join("\n") : "";
  } else if (kind === "number" || kind === "integer") {
    input.value = typeof value === "number" ? inputText(value, unit) : "";
    const preset = presetValue(path);
    const used = usedValue(path);
    input.placeholder = preset !== undefined ? `preset: ${inputText(preset, unit)}`
      : used !== undefined ? `used: ${inputText(used, unit)}`
      : path === "pump.flow_limit_lpm" && Array.isArray(getPath(state.job, "pump.flow_table_rpm_lpm")) ? "not used: the flow table below"
      : def !== undefined && def !== "" ? `default: ${inputText(Number(def), unit)}` : "";
  } else {
    input.value = typeof value === "string" ? value : "";
    input.placeholder = def ? `default: ${def}` : "";
  }
  updateDash(input);
}

// A field left empty whose value the engine works out (the pulley ratio from the two pulleys, or 1): the
// engine's figure from the last result, shown as the placeholder.
function usedValue(path) {
  if (path !== "pump.pulley_ratio") return undefined;
  const v = state.result && state.result.pump_curve && state.result.pump_curve.pulley_ratio;
  return typeof v === "number" ? v : undefined;
}

function presetValue(path) {
  // a fluid field left empty takes the chosen preset's value: show it as the placeholder
  const m = /^fluid\.(\w+)$/.exec(path);
  const preset = state.job && state.job.fluid && state.job.fluid.preset;
  const values = m && preset && model.fluid_preset_values && model.fluid_preset_values[preset];
  return values && typeof values[m[1]] === "number" ? values[m[1]] : undefined;
}

// The dash size beside a bore or outside diameter comes from the engine's last result, and only
// while that result was computed for the value now in the field.
function updateDash(input) {
  const out = input.closest(".fld")?.querySelector("output.dash");
  if (!out) return;
  const m = /^lines\[(\d+)\]\.parts\[(\d+)\]\.(\w+)$/.exec(input.dataset.path || "");
  const v = shownValue(input.dataset.path);
  const part = m && typeof v === "number" ? resultPart(state.result, Number(m[1]), Number(m[2])) : null;
  const fresh = part && typeof part.dash === "number" && part.size_mm === sizeOf(getPath(state.job, `lines[${m[1]}].parts[${m[2]}]`));
  out.textContent = fresh ? `dash ${part.dash_exact ? "" : "≈ "}-${part.dash}` : "";
}

// The size the engine reports for a part: a tube's outside diameter, otherwise its bore.
function sizeOf(part) {
  if (!part) return undefined;
  return part.kind === "tube" ? part.od_mm : part.bore_mm;
}

// After a new result: every dash size beside the form's diameters, and the placeholders that show the
// engine's figure for a field left empty (and the flow-control setting's, which follows the flow table).
export function refreshDashes() {
  for (const path of ["pump.pulley_ratio", "pump.flow_limit_lpm"]) {
    const input = formEl().querySelector(`[data-path="${path}"]`);
    if (input) fillInput(input);
  }
  for (const out of formEl().querySelectorAll("output.dash")) {
    const input = out.closest(".fld")?.querySelector("[data-key]");
    if (input) updateDash(input);
  }
}

// After a new result: beside the assembly hose's length and bends, what the engine worked out from the
// line's route points or overall length (the field is then not used). Notes from an older result go.
export function refreshAssemblyNotes() {
  const form = formEl();
  for (const old of form.querySelectorAll(".assembly-note")) old.remove();
  ((state.result && state.result.lines) || []).forEach((line, li) => {
    const a = line.assembly;
    if (!a || a.hose_part == null) return;
    const base = `lines[${li}].parts[${a.hose_part}]`;
    const L = unitLabel("length_mm");
    const from = { route: "the line's route points and the slack it needs", overall: "the line's overall length" }[a.length_source];
    const length = form.querySelector(`[data-path="${CSS.escape(`${base}.length_m`)}"]`)?.closest(".fld");
    if (length && from && a.hose_cut_mm != null) {
      length.append(el("p", { class: "assembly-note small", "data-assembly-note": "length" },
        `Worked out from ${from}: cut to ${fmt(a.hose_cut_mm, "length_mm", [0, 2])} ${L}. A length typed here is not used.`));
    }
    const bends = form.querySelector(`[data-path="${CSS.escape(`${base}.bends`)}"]`);
    if (bends && a.bends_from_route) {
      const words = a.bends.map((b) => `${fmt(b.angle_deg, "angle_deg", 0)}° at ${fmt(b.radius_mm, "length_mm", [0, 2])} ${L}`).join(", ") || "none";
      bends.prepend(el("p", { class: "assembly-note small", "data-assembly-note": "bends" },
        `The route points give this hose's bends: ${words}. Bends typed here are for a line with no route points and are not used.`));
    }
  });
}

export function fillAll() {
  const form = formEl();
  for (const holder of form.querySelectorAll(".list")) {
    if (!holder.parentElement.closest(".list-items")) renderList(holder);
  }
  for (const input of form.querySelectorAll("[data-key]")) fillInput(input);
  refreshUnitLabels(document);
  document.getElementById("job-name").textContent = state.job.name || "(unnamed)";
}

export function refreshUnitLabels(root) {
  for (const span of root.querySelectorAll("[data-unit-label]")) span.textContent = unitLabel(span.dataset.unitLabel);
  for (const span of root.querySelectorAll(".conv[data-u]")) {
    span.textContent = inputText(Number(span.dataset.v), span.dataset.u);
  }
}

function listItems(path) {
  const v = shownValue(path);
  return Array.isArray(v) ? v : [];
}

function titleFor(itemKey, item, index) {
  if (itemKey === "condition") return `${index + 1}. ${item.name || "(unnamed point)"}`;
  if (itemKey === "line") return `Line ${index + 1}: ${item.name || "(unnamed)"} (${item.role || "no role"})`;
  if (itemKey === "bend") return `Bend ${index + 1}`;
  if (itemKey === "part") {
    const rec = recordOf("parts", item.kind);
    return `Part ${index + 1}: ${rec ? rec.label : item.kind}`;
  }
  return `${index + 1}`;
}

function renderList(holder) {
  const listKey = holder.dataset.list;
  const itemKey = holder.dataset.item;
  const base = pathOf(holder);
  const path = base ? `${base}.${listKey}` : listKey;
  const ol = holder.querySelector(":scope > .list-items");
  ol.replaceChildren();
  holder.dataset.path = path;
  listItems(path).forEach((item, i) => {
    const tplId = itemKey === "part" ? `tpl-part-${item && item.kind}` : `tpl-${itemKey}`;
    const tpl = document.getElementById(tplId) || document.getElementById("tpl-part-hose");
    const li = tpl.content.firstElementChild.cloneNode(true);
    li.dataset.seg = `${listKey}[${i}]`;
    li.dataset.index = String(i);
    ol.append(li);
    li.dataset.path = `${path}[${i}]`;
    li.querySelector(".item-title").textContent = titleFor(itemKey, item || {}, i);
    for (const sub of li.querySelectorAll(".list")) renderList(sub);
    for (const fs of li.querySelectorAll("fieldset[data-seg]")) fs.dataset.path = pathOf(fs);
    for (const input of li.querySelectorAll("[data-key]")) fillInput(input);
  });
  const field = listField(listKey);
  const n = listItems(path).length;
  const addButton = holder.querySelector(":scope > .list-add .add-item");
  if (addButton && field) addButton.disabled = n >= field.max_items;
  refreshUnitLabels(holder);
}

// ---------------------------------------------------------------- edits

function parseInput(input) {
  const kind = input.dataset.kind;
  const unit = input.dataset.unit;
  const text = input.value.trim();
  if (kind === "bool") return { value: input.checked };
  if (kind === "choice" || kind === "text") return text === "" ? { empty: true } : { value: kind === "text" ? input.value : text };
  if (text === "") return { empty: true };
  if (kind === "points") {
    const points = [];
    for (const line of text.split(/\n+/)) {
      if (!line.trim()) continue;
      const nums = line.split(/[,;\s]+/).filter(Boolean).map(Number);
      if (nums.length !== 3 || nums.some((x) => !Number.isFinite(x))) {
        return { error: `each line needs three numbers x, y, z (in ${unitLabel(unit)}); "${line.trim()}" is not` };
      }
      points.push(nums.map((x) => fromShow(x, unit)));
    }
    return points.length ? { value: points } : { empty: true };
  }
  const read = readNumber(text);
  if (read.error) return { error: `${read.error}; the last valid value is kept` };
  if (kind === "integer" && !Number.isInteger(read.value)) return { error: `"${text}" is not a whole number; the last valid value is kept` };
  const value = kind === "integer" ? read.value : fromShow(read.value, unit);
  const range = outOfRange(value, input, (limit) => `${inputText(limit, unit)} ${unitLabel(unit)}`.trim());
  if (range) return { error: `${text} was not taken: it ${range}; the last valid value is kept` };
  return { value };
}

// A table field's cells were edited, or rows added or removed (``rows``, as typed): the job takes the table
// when every cell is a good number; else the draft stays in the form with its reason, as a typed field's does.
function onTableEdit(holder, rows) {
  const path = holder.dataset.path;
  const parsed = tableEdit(holder, rows);
  const errorP = holder.closest(".fld").querySelector(".fld-error");
  if (parsed.error) {
    if (rows) fillTable(holder, path, getPath(state.job, path));
    markCell(holder, parsed.cell);
    pendingText.set(path, "");
    pendingWhy.set(path, parsed.error);
    errorP.textContent = parsed.error; errorP.hidden = false; errorP.dataset.local = "1";
    onChange({ localErrors: localErrors(), structural: false, recalc: false });
    return;
  }
  pendingText.delete(path);
  pendingWhy.delete(path);
  if (errorP.dataset.local) { errorP.hidden = true; errorP.textContent = ""; delete errorP.dataset.local; }
  markCell(holder, null);
  if (parsed.empty) deletePath(state.job, path); else setPath(state.job, path, parsed.value);
  if (rows) fillTable(holder, path, getPath(state.job, path));
  onChange({ localErrors: localErrors(), structural: Boolean(rows), recalc: true });
}

function onInput(event) {
  const input = event.target;
  const table = input.dataset && input.dataset.cell !== undefined ? input.closest('[data-kind="table"]') : null;
  if (table) {
    if (event.type === "change" && !table.dataset.filling && table.contains(input)) onTableEdit(table);
    return;
  }
  if (!input.dataset || !input.dataset.key) return;
  const typed = ["text", "number", "integer", "points"].includes(input.dataset.kind);
  if (typed ? event.type === "change" : event.type === "input") return; // one event per edit
  const path = input.dataset.path || pathOf(input);
  const parsed = parseInput(input);
  const errorP = input.closest(".fld")?.querySelector(".fld-error");
  if (parsed.error) {
    pendingText.set(path, input.value);
    pendingWhy.set(path, parsed.error);
    if (errorP) { errorP.textContent = parsed.error; errorP.hidden = false; errorP.dataset.local = "1"; }
    input.setAttribute("aria-invalid", "true");
    onChange({ localErrors: localErrors(), structural: false, recalc: false });
    return;
  }
  pendingText.delete(path);
  pendingWhy.delete(path);
  if (errorP && errorP.dataset.local) { errorP.hidden = true; errorP.textContent = ""; delete errorP.dataset.local; }
  input.removeAttribute("aria-invalid");
  materialise(path);
  if (parsed.empty) deletePath(state.job, path); else setPath(state.job, path, parsed.value);
  updateDash(input);
  // keep item titles in step with names and roles
  const li = input.closest("li.item");
  if (li && (input.dataset.key === "name" || input.dataset.key === "role")) {
    const holder = li.closest(".list");
    li.querySelector(".item-title").textContent =
      titleFor(holder.dataset.item, getPath(state.job, li.dataset.path) || {}, Number(li.dataset.index));
  }
  if (path === "name") document.getElementById("job-name").textContent = state.job.name || "(unnamed)";
  if (path === "fluid.preset") { // the other fluid fields show the new preset's values as placeholders
    for (const other of formEl().querySelectorAll('[data-path^="fluid."]')) if (other !== input) fillInput(other);
  }
  onChange({ localErrors: localErrors(), structural: false, recalc: true });
}

// A field in words for messages: its label, then the items it sits in as the form titles them
// ("Bore, in Part 2: Hose of Line 1: pump to gear"), counting from 1 as the form does.
function shownLabel(path) {
  const target = findByPath(path);
  const label = target && target.closest(".fld")?.querySelector(".fld-label");
  if (!label) return "this field";
  const places = [];
  for (let li = target.closest("li.item"); li; li = li.parentElement.closest("li.item")) {
    const title = li.querySelector(":scope > .item-head .item-title, .item-title");
    if (title) places.push(title.textContent.trim());
  }
  return places.length ? `${label.textContent.trim()}, in ${places.join(" of ")}` : label.textContent.trim();
}

export function localErrors() {
  return [...pendingText.keys()].map((path) => ({ path, label: shownLabel(path),
    message: pendingWhy.get(path) || "the text typed here is not a valid value; the last valid value is kept" }));
}

export function resetPending() {
  pendingText.clear();
  pendingWhy.clear();
  clearDrafts();
  for (const p of formEl().querySelectorAll(".fld-error[data-local]")) { p.hidden = true; p.textContent = ""; delete p.dataset.local; }
}

function clearPending(prefix) {
  clearDrafts(prefix);
  for (const key of [...pendingText.keys()]) if (key.startsWith(prefix)) { pendingText.delete(key); pendingWhy.delete(key); }
}

function newItem(itemKey, list, kind) {
  if (itemKey === "condition") {
    const last = list[list.length - 1];
    return { ...clone(last || { engine_rpm: 1000, fluid_temp_c: 40 }), name: "new point", duty_percent: 0, full_lock: false };
  }
  if (itemKey === "line") return { name: `line ${list.length + 1}`, role: "return", parts: [{ kind: "hose" }] };
  if (itemKey === "bend") return {};
  if (itemKey === "part") {
    const part = { kind };
    const rec = recordOf("parts", kind);
    const hasBore = rec.fields.some((f) => f.key === "bore_mm");
    const neighbour = [...list].reverse().find((p) => p && typeof p.bore_mm === "number");
    if (hasBore && neighbour) part.bore_mm = neighbour.bore_mm;
    return part;
  }
  return {};
}

function onClick(event) {
  const button = event.target.closest("button");
  if (!button || !formEl().contains(button)) return;
  const table = button.closest('[data-kind="table"]');
  if (table) {
    const rows = rowsAfterClick(table, button);
    if (!rows) return;
    onTableEdit(table, rows);
    if (button.classList.contains("add-row")) table.querySelector("tbody tr:last-child input")?.focus();
    else table.querySelector(".add-row").focus();
    return;
  }
  const holder = button.closest(".list");
  if (!holder) return;
  const listPath = holder.dataset.path;
  const field = listField(holder.dataset.list);
  if (button.classList.contains("add-item")) {
    materialise(listPath);
    let list = getPath(state.job, listPath);
    if (!Array.isArray(list)) { list = []; setPath(state.job, listPath, list); }
    if (list.length >= field.max_items) return;
    const kind = holder.querySelector(":scope > .list-add .add-kind")?.value;
    list.push(newItem(holder.dataset.item, list, kind));
  } else {
    const li = button.closest("li.item");
    if (!li || li.closest(".list") !== holder) return;
    materialise(listPath);
    const list = getPath(state.job, listPath);
    const i = Number(li.dataset.index);
    if (button.classList.contains("remove-item")) {
      if (list.length <= field.min_items) {
        const err = holder.querySelector(":scope > .box-error");
        err.textContent = `${field.label} needs at least ${field.min_items} ${field.min_items === 1 ? "entry" : "entries"}; this one stays.`;
        err.hidden = false;
        return;
      }
      const item = list[i];
      const holdsData = item && typeof item === "object" && Object.keys(item).some((k) => k !== "kind");
      const title = li.querySelector(".item-title")?.textContent.trim() || "this entry";
      if (holdsData && ["lines", "parts"].includes(holder.dataset.list)
          && !window.confirm(`Remove ${title}? What it holds goes with it (Undo brings it back).`)) return;
      list.splice(i, 1);
      if (list.length === 0 && holder.dataset.list === "bends") deletePath(state.job, listPath);
    } else if (button.classList.contains("move-up") && i > 0) {
      [list[i - 1], list[i]] = [list[i], list[i - 1]];
    } else if (button.classList.contains("move-down") && i < list.length - 1) {
      [list[i + 1], list[i]] = [list[i], list[i + 1]];
    } else {
      return;
    }
  }
  clearPending(listPath);
  renderList(holder);
  onChange({ localErrors: localErrors(), structural: true, recalc: true });
}

// part kind switch: keep the keys the new kind also has
formEl().addEventListener("change", (event) => {
  const select = event.target;
  if (!select.classList || !select.classList.contains("part-kind")) return;
  const li = select.closest("li.item");
  const holder = li.closest(".list");
  const part = getPath(state.job, li.dataset.path) || {};
  const rec = recordOf("parts", select.value);
  const keys = new Set(rec.fields.map((f) => f.key));
  const next = { kind: select.value };
  for (const [k, v] of Object.entries(part)) if (keys.has(k)) next[k] = v;
  setPath(state.job, li.dataset.path, next);
  clearPending(li.dataset.path);
  renderList(holder);
  onChange({ localErrors: localErrors(), structural: true, recalc: true });
});

// ---------------------------------------------------------------- errors by path

export function showErrors(errors) {
  const form = formEl();
  for (const p of form.querySelectorAll(".fld-error:not([data-local]), .box-error")) { p.hidden = true; p.textContent = ""; }
  for (const input of form.querySelectorAll("[aria-invalid]")) {
    if (!pendingText.has(input.dataset.path)) input.removeAttribute("aria-invalid");
  }
  for (let e of errors || []) {
    const target = findByPath(e.path);
    if (!target) continue;
    if (target.matches("[data-key], [data-cell]")) {
      const p = target.closest(".fld").querySelector(".fld-error");
      if (p.dataset.local) continue;
      if (target.matches("[data-cell]")) e = { ...e, message: `${e.label}: ${e.message}` };
      // the engine words its limits in engine units; say so when another unit is shown
      const unit = target.dataset.unit;
      const note = unit && getSystem() !== "metric" && unitLabel(unit, "metric") !== unitLabel(unit)
        ? ` (engine units: ${unitLabel(unit, "metric")}; see "about" for the limits in ${unitLabel(unit)})` : "";
      const msg = e.message + note;
      p.textContent = p.textContent ? `${p.textContent}; ${msg}` : msg;
      p.hidden = false;
      target.setAttribute("aria-invalid", "true");
    } else {
      const p = target.querySelector(":scope > .box-error");
      if (!p) continue;
      p.textContent = p.textContent ? `${p.textContent}; ${e.message}` : `${e.label || e.path}: ${e.message}`;
      p.hidden = false;
    }
  }
}

// The form element for a path, or its nearest shown ancestor.
export function findByPath(path) {
  const form = formEl();
  let p = path || "";
  for (;;) {
    const hit = form.querySelector(`[data-path="${CSS.escape(p)}"]`);
    if (hit) return hit;
    if (!p) return null;
    const segs = parsePath(p);
    segs.pop();
    p = segs.map((s, i) => (typeof s === "number" ? `[${s}]` : (i ? "." : "") + s)).join("");
  }
}

export function assignStaticPaths() {
  for (const fs of formEl().querySelectorAll("fieldset[data-seg]")) fs.dataset.path = pathOf(fs);
}

export { UNITS };
