// Finding your way round the page: a sticky list of sections (each line by its name), sections that
// fold, a one-line summary on each line of the form (the engine's verdict, hose, cut length and
// worst drop, as the last result gives them), the results of the line being edited brought into
// view on wide screens, and a Job / Results switch on narrow ones. Nothing here computes an
// engine quantity: the summaries quote the result.
import { el } from "./util.js";
import { fmt, unitLabel } from "./units.js";

const form = () => document.getElementById("job-form");
const WIDE = window.matchMedia("(min-width: 901px)");
const SECTIONS = [["fluid", "Fluid"], ["pump", "Pump"], ["gear", "Steering gear"], ["conditions", "Operating points"],
  ["lines", "Lines"], ["thread", "Thread finder"], ["ratings", "Rating settings"], ["thermal", "Thermal settings"]];

function sectionOf(key) {
  return key === "thread" ? document.getElementById("thread-panel") : form().querySelector(`:scope > fieldset.rec-${key}`);
}

// The list of sections, rebuilt when the lines change (their names are links too).
export function renderNav(job) {
  const nav = document.getElementById("section-nav");
  if (!nav) return;
  const ul = el("ul");
  for (const [key, words] of SECTIONS) {
    const target = sectionOf(key);
    if (!target) continue;
    target.id = target.id || `sec-${key}`;
    ul.append(el("li", {}, el("a", { href: `#${target.id}`, "data-nav": key }, words)));
    if (key === "lines") {
      const sub = el("ul");
      (job.lines || []).forEach((line, i) => {
        sub.append(el("li", {}, el("a", { href: "#", "data-nav-line": String(i) }, `${i + 1}. ${line.name || "(unnamed)"}`)));
      });
      ul.lastChild.append(sub);
    }
  }
  ul.append(el("li", {}, el("a", { href: "#results", "data-nav": "results" }, "Results")));
  ul.append(el("li", {}, el("a", { href: "#sheet-print", "data-nav": "sheet" }, "Build sheet (print)")));
  nav.replaceChildren(el("h2", { class: "visually-hidden" }, "Sections"), ul);
}

function goToLine(i) {
  const li = form().querySelectorAll(".rec-lines .list-items > li.item-line")[i];
  if (!li) return;
  unfold(li.closest("fieldset.rec"));
  li.dataset.folded = "false";
  li.scrollIntoView({ block: "start" });
  li.querySelector("input, select, textarea")?.focus({ preventScroll: true });
}

function unfold(section) {
  if (section && section.dataset.folded === "true") toggle(section);
}

function toggle(box) {
  const folded = box.dataset.folded !== "true";
  box.dataset.folded = String(folded);
  const button = box.querySelector(":scope > legend .fold, :scope > .item-head .fold");
  if (button) { button.setAttribute("aria-expanded", String(!folded)); button.textContent = folded ? "Show" : "Hide"; }
}

// Fold buttons on the top sections; line items get theirs as they are drawn (see lineSummaries).
export function addFolds() {
  for (const section of form().querySelectorAll(":scope > fieldset.rec")) {
    const legend = section.querySelector(":scope > legend");
    if (!legend || legend.querySelector(".fold")) continue;
    legend.append(" ", el("button", { type: "button", class: "fold", "aria-expanded": "true" }, "Hide"));
  }
}

// One line of words on each line of the form, from the last result for the job as it stands.
export function lineSummaries(result) {
  const items = form().querySelectorAll(".rec-lines .list-items > li.item-line");
  items.forEach((li, i) => {
    const head = li.querySelector(":scope > .item-head");
    if (!head.querySelector(".fold")) {
      head.querySelector(".item-tools").prepend(el("button", { type: "button", class: "fold", "aria-expanded": "true" }, "Hide"));
    }
    let p = li.querySelector(":scope > .line-summary");
    if (!p) { p = el("p", { class: "line-summary", "data-line-summary": String(i) }); head.after(p); }
    const line = result && result.lines && result.lines[i];
    if (!line) { p.textContent = "no result yet for this line"; delete p.dataset.verdict; return; }
    const hose = (line.parts || []).find((x) => x.kind === "hose" || x.kind === "tube");
    const cut = line.assembly && typeof line.assembly.hose_cut_mm === "number"
      ? `cut ${fmt(line.assembly.hose_cut_mm, "length_mm", [0, 2])} ${unitLabel("length_mm")}` : null;
    const drop = typeof line.pressure_drop_max_bar === "number"
      ? `worst drop ${fmt(line.pressure_drop_max_bar, "pressure_bar")} ${unitLabel("pressure_bar")} (${line.pressure_drop_max_at})` : null;
    p.dataset.verdict = line.verdict;
    p.textContent = [line.verdict.toUpperCase(), hose && hose.label, cut, drop].filter(Boolean).join(" · ");
  });
}

let lastEditedLine = null;

// After a result: on a wide screen, the card of the line just edited is brought into view.
export function followEdit() {
  if (lastEditedLine === null || !WIDE.matches) return;
  const card = document.querySelector(`#line-results [data-line-card="${lastEditedLine}"]`);
  lastEditedLine = null;
  if (card) card.scrollIntoView({ block: "nearest" });
}

function setView(view) {
  document.body.dataset.view = view;
  for (const b of document.querySelectorAll("#view-switch button")) b.setAttribute("aria-pressed", String(b.dataset.view === view));
}

export function initWorkbench() {
  addFolds();
  form().addEventListener("click", (event) => {
    const fold = event.target.closest("button.fold");
    if (fold) { toggle(fold.closest("li.item, fieldset.rec")); event.stopPropagation(); }
  }, true);
  form().addEventListener("change", (event) => {
    const li = event.target.closest && event.target.closest(".rec-lines .list-items > li.item-line");
    if (li) lastEditedLine = Number(li.dataset.index);
  });
  document.getElementById("section-nav")?.addEventListener("click", (event) => {
    const a = event.target.closest("a");
    if (!a) return;
    if (a.dataset.navLine !== undefined) { event.preventDefault(); setView("job"); goToLine(Number(a.dataset.navLine)); return; }
    const key = a.dataset.nav;
    if (key === "results") { setView("results"); return; }
    if (key === "sheet") { event.preventDefault(); document.getElementById("sheet-print").focus(); return; }
    setView("job");
    unfold(sectionOf(key));
  });
  for (const b of document.querySelectorAll("#view-switch button")) b.addEventListener("click", () => setView(b.dataset.view));
  setView("job");
}
