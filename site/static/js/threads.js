// The thread finder: a caliper and a pitch-gauge reading go to the engine's "thread" operation,
// which ranks the table threads; a chosen thread can be written into a line's port.
import { el } from "./util.js";
import { getSystem, unitLabel } from "./units.js";

let page = null; // {call, getJob, fillAll, changed}: what the finder needs from the page

export function initThreadFinder(thePage) {
  page = thePage;
  document.getElementById("thr-go").addEventListener("click", identifyThread);
}

async function identifyThread() {
  const out = document.getElementById("thr-out");
  out.replaceChildren();
  const majorText = document.getElementById("thr-major").value.trim().replace(",", ".");
  const pitchText = document.getElementById("thr-pitch").value.trim().replace(",", ".");
  const major = Number(majorText), pitch = Number(pitchText);
  if (!majorText || !Number.isFinite(major) || major <= 0 || !pitchText || !Number.isFinite(pitch) || pitch <= 0) {
    out.append(el("p", { class: "error" }, "Give the measured diameter and the pitch as positive numbers."));
    return;
  }
  const majorMm = getSystem() === "us" ? major * 25.4 : major;
  const pitchMm = document.getElementById("thr-pitch-unit").value === "tpi" ? 25.4 / pitch : pitch;
  const taper = document.getElementById("thr-taper").value;
  const args = { major_mm: majorMm, pitch_mm: pitchMm, male: document.getElementById("thr-male").value === "true",
    tapered: taper === "" ? null : taper === "true" };
  const reply = await page.call({ op: "thread", args });
  if (!reply.ok) {
    out.append(el("p", { class: "error" }, (reply.errors || []).map((e) => `${e.path}: ${e.message}`).join("; ")));
    return;
  }
  const res = reply.result;
  const table = el("table", { class: "thr-table" });
  table.append(el("thead", {}, el("tr", {}, ...["Thread", "Fits", `Diameter off by (${unitLabel("length_mm")})`, "Used by", "Seals"].map((t) => el("th", { scope: "col" }, t)))));
  const tb = el("tbody");
  for (const c of res.candidates || []) {
    const off = getSystem() === "us" ? (c.fit_error_mm / 25.4).toFixed(4) : c.fit_error_mm.toFixed(2);
    tb.append(el("tr", {}, el("td", {}, c.thread), el("td", {}, c.within ? "yes" : "no (nearest)"), el("td", { class: "num" }, off),
      el("td", {}, (c.ends || []).join("; ")), el("td", {}, (c.seals || []).join("; "))));
  }
  table.append(tb);
  out.append(table);
  if (res.tolerance) out.append(el("p", { class: "small" }, `Tolerance: ${res.tolerance.source || ""}`));
  out.append(portPicker(res.candidates || []));
}

// Put an identified thread into a line's start or end port (the user then picks the seal and line end).
function portPicker(candidates) {
  const box = el("div", { class: "thr-use" });
  const lines = page.getJob().lines || [];
  if (!candidates.length || !lines.length) return box;
  const threadSel = el("select", { id: "thr-use-thread", "aria-label": "Thread to use" },
    ...candidates.map((c, i) => el("option", { value: String(i) }, c.thread)));
  const portSel = el("select", { id: "thr-use-port", "aria-label": "Port to give it to" });
  lines.forEach((ln, i) => {
    for (const [end, word] of [["from_port", "start port"], ["to_port", "end port"]]) {
      portSel.append(el("option", { value: `${i}:${end}` }, `${ln.name || `line ${i + 1}`}: ${word}`));
    }
  });
  const go = el("button", { type: "button", id: "thr-use-go" }, "Use for this port");
  go.addEventListener("click", () => {
    const c = candidates[Number(threadSel.value)];
    const [i, end] = portSel.value.split(":");
    const line = page.getJob().lines[Number(i)];
    if (!c || !line) return;
    line[end] = { ...(line[end] || {}), thread: c.thread };
    page.fillAll();
    page.changed({ structural: true, recalc: true });
    go.textContent = `Used: ${c.thread}`;
  });
  box.append(el("label", {}, "Thread ", threadSel), " ", el("label", {}, "for ", portSel), " ", go);
  return box;
}
