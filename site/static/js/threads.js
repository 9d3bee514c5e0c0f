// The thread finder: a caliper and a pitch-gauge reading go to the engine's "thread" operation,
// which ranks the table threads; a chosen thread, its seal and the line end that meets it go into a
// line's port as edits (the page's applyEdits, with undo), and the engine re-plans the adapters.
// Labels come from the engine's declarations (the job model and the thread operation's arguments).
import { el, getPath, readJSON } from "./util.js";
import { getSystem, unitLabel } from "./units.js";

let page = null; // {call, getJob, applyEdits}: what the finder needs from the page
let target = null; // path of the port the finder works for, "lines[0].from_port", or null
const PORT_KEYS = ["from_port", "to_port"];

function declarations() {
  const args = {};
  for (const f of readJSON("linesmith-thread-args").fields) args[f.key] = f;
  const line = readJSON("linesmith-model").job.fields.find((f) => f.key === "lines").item;
  const ports = {};
  for (const f of line.fields) if (PORT_KEYS.includes(f.key)) ports[f.key] = f.label;
  return { args, ports };
}
let labels = null;

const $ = (id) => document.getElementById(id);

export function initThreadFinder(thePage) {
  page = thePage;
  labels = declarations();
  $("thr-go").addEventListener("click", identifyThread);
  $("thr-male").addEventListener("change", showGender);
  $("thread-finder-open").addEventListener("click", () => openFinder(null));
  document.addEventListener("click", (event) => {
    const button = event.target.closest && event.target.closest(".thr-find");
    if (!button) return;
    const fs = button.closest("fieldset[data-seg]");
    if (fs && fs.dataset.path) openFinder(fs.dataset.path);
  });
  showGender();
}

// "lines[0].from_port" -> "the start port of line 1 (pump to gear)"
function portWords(path) {
  const m = /^lines\[(\d+)\]\.(from_port|to_port)$/.exec(path || "");
  if (!m) return "";
  const i = Number(m[1]);
  const line = (page.getJob().lines || [])[i];
  const name = line && line.name ? ` (${line.name})` : "";
  return `${labels.ports[m[2]].toLowerCase()} of line ${i + 1}${name}`;
}

function portExists(path) {
  const m = /^lines\[(\d+)\]\.(from_port|to_port)$/.exec(path || "");
  return Boolean(m && (page.getJob().lines || [])[Number(m[1])]);
}

function openFinder(path) {
  if (path) target = path;
  const panel = $("thread-panel");
  showTarget();
  panel.scrollIntoView({ block: "start" });
  const port = target && portExists(target) ? getPath(page.getJob(), target) : null;
  if (path && port && port.thread) $("thr-out").replaceChildren(el("p", { class: "small" }, `This port has the thread ${port.thread} now.`));
  $("thr-male").focus({ preventScroll: true });
}

function showTarget() {
  if (target && !portExists(target)) target = null;
  $("thr-target").textContent = target
    ? `Finding the thread of the ${portWords(target)}.`
    : 'No port chosen: use "Find this port\'s thread" beside a port, or pick the port below the results.';
}

function male() { return $("thr-male").value === "true"; }

function showGender() {
  const gender = male() ? "male" : "female";
  $("thread-panel").dataset.gender = gender;
  const label = $("thr-major-label");
  label.textContent = label.dataset[gender];
}

// A reading as the user typed it: a plain decimal number with a point, or the reason it is not one.
function reading(id) {
  const text = $(id).value.trim();
  if (!text) return { error: "is empty: give the reading" };
  if (/^\d+,\d+$/.test(text)) return { error: `use a point for decimals: ${text} was not taken` };
  if (!/^(\d+\.?\d*|\.\d+)$/.test(text)) return { error: `${text} is not a number` };
  return { value: Number(text) };
}

function fieldError(id, text) {
  const p = $(`${id}-err`);
  p.textContent = text || "";
  p.hidden = !text;
  const input = $(id);
  if (input) { if (text) input.setAttribute("aria-invalid", "true"); else input.removeAttribute("aria-invalid"); }
}

const ERROR_FIELD = { "args.major_mm": "thr-major", "args.pitch_mm": "thr-pitch", "args.pitch_tpi": "thr-pitch", "args.seat": "thr-seat" };

function showEngineErrors(errors) {
  const general = [];
  for (const e of errors) {
    const key = (e.path || "").replace(/^args\./, "");
    const label = labels.args[key] ? labels.args[key].label : "";
    const mm = getSystem() === "us" && key === "major_mm" ? " (the limits are in mm)" : "";
    const words = `${label ? `${label}: ` : ""}${e.message}${mm}`;
    if (ERROR_FIELD[e.path]) fieldError(ERROR_FIELD[e.path], words); else general.push(words);
  }
  if (general.length) $("thr-out").append(el("p", { class: "error" }, general.join(" ")));
}

async function identifyThread() {
  const out = $("thr-out");
  out.replaceChildren();
  for (const id of ["thr-major", "thr-pitch", "thr-seat"]) fieldError(id, "");
  const diameter = reading("thr-major"), pitch = reading("thr-pitch");
  const tpi = $("thr-pitch-unit").value === "tpi";
  if (diameter.error) fieldError("thr-major", `${$("thr-major-label").textContent}: ${diameter.error}`);
  if (pitch.error) fieldError("thr-pitch", `${labels.args[tpi ? "pitch_tpi" : "pitch_mm"].label}: ${pitch.error}`);
  if (diameter.error || pitch.error) return;
  const taper = $("thr-taper").value, seat = $("thr-seat").value;
  const args = { major_mm: getSystem() === "us" ? diameter.value * 25.4 : diameter.value,
    male: male(), tapered: taper === "" ? null : taper === "true", seat: seat || null };
  args[tpi ? "pitch_tpi" : "pitch_mm"] = pitch.value;
  const reply = await page.call({ op: "thread", args });
  if (!reply.ok) { showEngineErrors(reply.errors || []); return; }
  renderAnswer(reply.result);
}

function renderAnswer(res) {
  const out = $("thr-out");
  if (res.pitch_note) out.append(el("p", { class: "thr-note", id: "thr-pitch-note" }, res.pitch_note));
  out.append(el("p", { class: res.match === "good" ? "thr-msg ok" : "thr-msg bad", id: "thr-message" }, res.message));
  const unit = unitLabel("length_mm");
  const table = el("table", { class: "thr-table" });
  table.append(el("thead", {}, el("tr", {}, ...["Thread", "Fits", `Diameter off by (${unit})`, "Pitch off by (%)",
    "Seat", "Fitting ends that use it"].map((t) => el("th", { scope: "col" }, t)))));
  const tb = el("tbody");
  for (const c of res.candidates || []) {
    const off = getSystem() === "us" ? (c.fit_error_mm / 25.4).toFixed(4) : c.fit_error_mm.toFixed(2);
    const fits = c.within ? "yes" : "no (nearest)";
    const seat = res.seat ? (c.seat_ok ? "has that seat" : "no end with that seat") : (c.seals || []).join("; ");
    tb.append(el("tr", { class: c.within ? "thr-fit" : "thr-near" }, el("td", {}, c.thread), el("td", {}, fits),
      el("td", { class: "num" }, off), el("td", { class: "num" }, c.pitch_error_percent.toFixed(1)),
      el("td", {}, seat), el("td", {}, (c.ends || []).join("; "))));
  }
  table.append(tb);
  out.append(el("div", { class: "table-scroll" }, table));
  if (res.tolerance) {
    out.append(el("p", { class: "small" }, `Measured: ${res.tolerance.measured}. Tolerance: ${res.tolerance.source}.`));
  }
  out.append(portPicker(res.candidates || []));
}

// Put a thread, its seal and the line end that meets it into a line's start or end port, as one
// edit that can be undone. The engine plans the adapters on the next evaluation.
function portPicker(candidates) {
  const box = el("div", { class: "thr-use" });
  const lines = page.getJob().lines || [];
  if (!candidates.length || !lines.length) return box;
  const threadSel = el("select", { id: "thr-use-thread" },
    ...candidates.map((c, i) => el("option", { value: String(i) }, `${c.thread}${c.within ? "" : " (does not fit)"}`)));
  const endSel = el("select", { id: "thr-use-end" });
  const portSel = el("select", { id: "thr-use-port" });
  lines.forEach((ln, i) => {
    for (const end of PORT_KEYS) {
      const path = `lines[${i}].${end}`;
      portSel.append(el("option", { value: path, selected: path === target }, portWords(path)));
    }
  });
  const direct = el("input", { type: "checkbox", id: "thr-use-direct" });
  const syncDirect = () => {
    const port = getPath(page.getJob(), portSel.value);
    direct.checked = !(port && port.line_end_family);
  };
  const fillEnds = () => {
    const c = candidates[Number(threadSel.value)];
    endSel.replaceChildren(...(c.port_choices || []).map((p, k) => el("option", { value: String(k) }, p.text)),
      el("option", { value: "" }, "the thread only (choose the seal and the line end yourself)"));
  };
  threadSel.addEventListener("change", fillEnds);
  portSel.addEventListener("change", () => { target = portSel.value; showTarget(); syncDirect(); });
  fillEnds();
  syncDirect();
  const go = el("button", { type: "button", id: "thr-use-go" }, "Use for this port");
  go.addEventListener("click", () => useForPort(candidates[Number(threadSel.value)], endSel.value, portSel.value, direct.checked));
  box.append(
    el("div", { class: "fld" }, el("label", { class: "fld-main" }, el("span", { class: "fld-label" }, "Thread"), el("span", { class: "fld-input" }, threadSel))),
    el("div", { class: "fld" }, el("label", { class: "fld-main" }, el("span", { class: "fld-label" }, "Port and seat"), el("span", { class: "fld-input" }, endSel))),
    el("div", { class: "fld" }, el("label", { class: "fld-main" }, el("span", { class: "fld-label" }, "Port"), el("span", { class: "fld-input" }, portSel))),
    el("div", { class: "fld" }, el("label", { class: "fld-check" }, direct, " Also set the line end to the one that meets this port directly (no adapter); leave it clear to keep the line end and let the engine plan the adapter")),
    go);
  return box;
}

function useForPort(c, endIndex, path, direct) {
  if (!c || !portExists(path)) return;
  const choice = endIndex === "" ? null : c.port_choices[Number(endIndex)];
  const edits = [{ path: `${path}.thread`, value: c.thread }];
  let words = `thread ${c.thread}`;
  if (choice) {
    edits.push({ path: `${path}.seal`, value: choice.port.seal });
    words = `${choice.text}, thread ${c.thread}`;
    if (direct) {
      for (const key of ["line_end_family", "line_end_dash", "line_end_tube_od_mm", "line_end_thread"]) {
        edits.push({ path: `${path}.${key}`, value: choice.port[key] });
      }
      words += ", with the line end that meets it";
    }
  }
  target = path;
  page.applyEdits(edits, `${words} for the ${portWords(path)}`);
  showTarget();
}
