// Linesmith page: the job form, live results from the engine worker, plots, build sheet,
// saved jobs. The job is kept in engine units; the unit switch changes only what is shown.
// Text from a job (names typed by a user) is always inserted with textContent.
import { clone, el, readJSON, setPath } from "./js/util.js";
import { getSystem, setSystem, unitLabel } from "./js/units.js";
import { assignStaticPaths, fillAll, initForm, localErrors, refreshAssemblyNotes, refreshDashes, resetPending, showErrors } from "./js/form.js";
import { compareBlock, renderPlots, renderProblems, renderResult, setCautions } from "./js/results.js";
import { renderSheet } from "./js/sheet.js";
import { readJobFile, saveFile, UNITS_KEY } from "./js/storage.js";
import { backup, backupJobs, createJob, deleteJob, duplicateJob, listJobs, migrateOldAutosave, openId, readJob,
  saveJob, setOpen, watchOtherTabs } from "./js/jobs.js";
import { makeHistory } from "./js/history.js";
import { followEdit, initWorkbench, lineSummaries, renderNav } from "./js/workbench.js";
import { initThreadFinder } from "./js/threads.js";

const body = document.body;
const statusText = document.getElementById("status-text");
const statusBar = document.getElementById("status-progress");
const resultsSection = document.getElementById("results");
const fileMessage = document.getElementById("file-message");

const DEBOUNCE_MS = 250;
const model = readJSON("linesmith-model");
const demos = readJSON("linesmith-demos");
const limits = readJSON("linesmith-limits"); // {job_file_max_bytes}: calc.edges.jobfile's
setCautions(readJSON("linesmith-cautions"));

const state = {
  job: null,
  jobId: null,       // the job's id in this browser's list (js/jobs.js)
  otherTab: null,    // another tab's newer save of this job, while the user has not chosen
  rev: 0,            // bumped on every edit of the job
  result: null,      // last result that computed
  resultRev: -1,
  errors: [],        // the engine's problems with the job (by field path)
  fault: null,       // the engine's own failure on the last evaluation, in words
  sweep: null,       // {rev, result | error}: the engine's drop-against-temperature curve
};

function setStatus(text, percent) {
  statusText.textContent = text;
  if (percent !== undefined) {
    statusBar.value = percent;
    statusBar.textContent = `${percent} %`;
  }
}

function fail(message, details = []) {
  body.dataset.engine = "failed";
  statusBar.hidden = true;
  statusText.textContent = message;
  statusText.className = "error";
  if (details.length) {
    const list = el("ul", { class: "error-list" });
    for (const line of details) list.append(el("li", {}, line));
    statusText.after(list);
  }
}

function showFileMessage(text, ok = false, details = []) {
  fileMessage.replaceChildren(el("p", {}, text));
  if (details.length) {
    const ul = el("ul");
    for (const d of details) ul.append(el("li", {}, d));
    fileMessage.append(ul);
  }
  const close = el("button", { type: "button", class: "dismiss" }, "Dismiss");
  close.addEventListener("click", () => { fileMessage.hidden = true; });
  fileMessage.append(close);
  fileMessage.className = ok ? "file-message ok" : "file-message bad";
  fileMessage.hidden = false;
}

// ---------------------------------------------------------------- engine worker

let worker = null;
let nextId = 1;
const pending = new Map();

function call(request) {
  const id = nextId++;
  return new Promise((resolve) => {
    pending.set(id, resolve);
    worker.postMessage(JSON.stringify({ type: "call", id, request: JSON.stringify(request) }));
  });
}

let timer = null;
let inflight = false;
let again = false;
let sweepTimer = null;

function schedule(delay = DEBOUNCE_MS) {
  body.dataset.jobRev = String(state.rev);
  clearTimeout(timer);
  timer = setTimeout(recalc, delay);
}

// calc.edges.api.handle answers a failure of the engine itself (not of the job) with one
// error of empty path and "internal error: ..."; the worker does the same for an
// exception that crosses the Python bridge. The next request is handled as usual.
function isEngineFault(error) {
  return !error.path && /^internal error\b/.test(error.message || "");
}

async function recalc() {
  if (body.dataset.engine === "failed" || !worker || body.dataset.engine === "loading" && !state.ready) return;
  if (inflight) { again = true; return; }
  inflight = true;
  body.dataset.busy = "true";
  const rev = state.rev;
  const job = clone(state.job);
  const t0 = performance.now();
  const reply = await call({ op: "evaluate", job, units: getSystem() });
  const ms = performance.now() - t0;
  inflight = false;
  if (again || rev !== state.rev) { // stale: a newer edit is waiting
    again = false;
    recalc();
    return;
  }
  body.dataset.lastCalcMs = String(Math.round(ms));
  if (reply.ok) {
    state.result = reply.result;
    state.resultJob = job;
    state.errors = [];
    state.fault = null;
  } else {
    const errors = reply.errors || [];
    const faults = errors.filter(isEngineFault);
    state.fault = faults.length ? faults.map((e) => e.message).join("; ") : null;
    state.errors = errors.filter((e) => !isEngineFault(e));
  }
  state.resultRev = rev;
  show();
  body.dataset.resultRev = String(rev);
  body.dataset.busy = "false";
  document.getElementById("results-state").textContent = reply.ok
    ? `(computed in ${Math.round(ms)} ms)`
    : state.fault ? "(not updated: the engine failed; edit the job to try again)" : "(not updated: fix the problems listed)";
  if (body.dataset.engine !== "ready" && state.result) {
    const seconds = ((performance.now() - state.started) / 1000).toFixed(1);
    setStatus(`Engine ready (first result in ${seconds} s).`, 100);
    statusBar.hidden = true;
    body.dataset.bootMs = String(Math.round(performance.now() - state.started));
    body.dataset.engine = "ready";
  } else if (body.dataset.engine !== "ready" && !reply.ok) {
    setStatus(state.fault ? "The engine failed on the first job; edit the job to try again."
      : "The job has problems; fix the fields marked in the form.", 100);
    body.dataset.engine = "ready";
  }
  if (reply.ok) {
    clearTimeout(sweepTimer);
    sweepTimer = setTimeout(() => runSweep(rev), 400);
  }
}

async function runSweep(rev) {
  if (inflight || rev !== state.rev || !state.result) return;
  inflight = true;
  const reply = await call({ op: "drop_curve", job: state.resultJob });
  inflight = false;
  if (again) { again = false; recalc(); }
  if (rev !== state.rev) return; // stale
  state.sweep = reply.ok ? { rev, result: reply.result }
    : { rev, error: (reply.errors || []).map((e) => `${e.path}: ${e.message}`).join("; ") };
  if (state.result) renderPlots(state.result, state.sweep);
  body.dataset.sweepRev = String(rev);
}

function show() {
  showErrors(state.errors);
  renderProblems(state.errors, localErrors(), state.fault);
  if (state.result) {
    renderResult(state.result, { applyEdits, applyCandidate });
    const sweep = state.sweep && state.sweep.rev === state.resultRev ? state.sweep : null;
    renderPlots(state.result, sweep);
    renderSheet(state.resultJob, state.result);
    refreshDashes();
    refreshAssemblyNotes();
    followEdit();
    showCompare();
  }
  lineSummaries(state.resultRev === state.rev ? state.result : null);
  if (state.result || state.errors.length) resultsSection.hidden = false;
}

// Autosave into this job's place in the list; paused while another tab's save waits for a choice.
function autosave() {
  if (state.otherTab || !state.jobId) return;
  if (!saveJob(state.jobId, state.job)) showFileMessage("This browser did not keep the last edit (its storage is full or off); save a job file to keep it.");
}

const history = makeHistory(({ canUndo, canRedo }) => {
  document.getElementById("edit-undo").disabled = !canUndo;
  document.getElementById("edit-redo").disabled = !canRedo;
});

function changed({ structural, recalc: needsCalc }) {
  if (needsCalc) {
    state.rev += 1;
    history.record(state.job);
    autosave();
    schedule();
  } else {
    renderProblems(state.errors, localErrors(), state.fault);
  }
  body.dataset.jobRev = String(state.rev);
  if (structural) body.dataset.structure = String(Number(body.dataset.structure || 0) + 1);
  renderNav(state.job); // line names are links in the section list
}

// Make the engine's edits (a check's fix or a candidate's apply list) on the job, in order. The
// edits' paths index the user's own lists; their values are in engine units. One step can be undone.
function applyEdits(edits, words) {
  for (const e of edits) setPath(state.job, e.path, clone(e.value));
  loadJob(state.job);
  history.record(state.job);
  const undo = el("button", { type: "button", class: "undo-edit" }, "Undo");
  undo.addEventListener("click", stepBack);
  showFileMessage(`Done: ${words}.`, true);
  fileMessage.querySelector("p").append(" ", undo);
}

// A candidate applied: the line's figures before, and after once the engine has the new job.
function lineFigures(result, li) {
  const line = result && result.lines && result.lines[li];
  if (!line) return { row: null, margin: null };
  return { row: (line.candidates || []).find((c) => c.current) || null, margin: line.rating ? line.rating.margin : null };
}

function applyCandidate(edits, words, li) {
  const before = lineFigures(state.result, li);
  applyEdits(edits, words);
  state.compare = { li, before, rev: state.rev };
}

function showCompare() {
  const c = state.compare;
  if (!c || state.resultRev !== state.rev) return;
  state.compare = null;
  if (c.rev !== state.rev || fileMessage.hidden) return; // another edit came between
  fileMessage.querySelector("ul")?.remove();
  fileMessage.append(compareBlock(c.before, lineFigures(state.result, c.li)));
}

function stepBack() {
  const job = history.undo();
  if (job) { loadJob(job); showFileMessage("Undone: the last edit.", true); }
}

function stepForward() {
  const job = history.redo();
  if (job) { loadJob(job); showFileMessage("Redone: the edit that was undone.", true); }
}

function loadJob(job) {
  state.job = job;
  state.rev += 1;
  state.sweep = null;
  resetPending();
  fillAll();
  renderNav(job);
  document.getElementById("job-name").textContent = job.name || "(unnamed)";
  autosave();
  schedule(0);
}

// Open a job of the list, or a new one (a demo, a file, the template): it gets its own place in
// the list and never overwrites another.
function openJob(id) {
  const job = readJob(id);
  if (!job) return false;
  state.jobId = id;
  state.otherTab = null;
  setOpen(id);
  // another job's results must not stand under this one while it has none of its own
  state.result = null;
  state.resultJob = null;
  for (const where of ["summary", "line-results", "thermal-results", "plots", "results-body", "warnings", "sheet"]) {
    document.getElementById(where).replaceChildren();
  }
  loadJob(job);
  history.reset(job);
  renderJobsPanel();
  return true;
}

function openAsNew(job, words) {
  const id = createJob(job);
  if (!id) { showFileMessage("This browser cannot keep another job (its storage is full or off); save a job file instead."); return; }
  openJob(id);
  if (words) showFileMessage(words, true);
}

function newJob() {
  openAsNew(clone(readJSON("linesmith-new-job")),
    "A new job from the three-line template. Fill in the pump (displacement, flow-control setting or flow table, relief setting) and the steering gear; results come when they are given.");
}

function onOtherTab(theirs) {
  state.otherTab = theirs;
  showFileMessage("This job was changed in another tab. Autosave here is paused until you choose.", false);
  const take = el("button", { type: "button", class: "tab-take" }, "Use the other tab's version");
  const keep = el("button", { type: "button", class: "tab-keep" }, "Keep this tab's version");
  take.addEventListener("click", () => { state.otherTab = null; loadJob(theirs); history.record(theirs); showFileMessage("Now showing the other tab's version.", true); });
  keep.addEventListener("click", () => { state.otherTab = null; autosave(); showFileMessage("Kept this tab's version; it is saved over the other.", true); });
  fileMessage.querySelector("p").append(" ", take, " ", keep);
}

function renderJobsPanel() {
  const rows = document.getElementById("jobs-rows");
  rows.replaceChildren();
  for (const entry of listJobs()) {
    const when = entry.changed ? new Date(entry.changed).toLocaleString() : "";
    const open = el("button", { type: "button", "data-job-open": entry.id }, entry.id === state.jobId ? "Open now" : "Open");
    open.disabled = entry.id === state.jobId;
    const dup = el("button", { type: "button", "data-job-duplicate": entry.id }, "Duplicate");
    const del = el("button", { type: "button", "data-job-delete": entry.id }, "Delete");
    del.disabled = entry.id === state.jobId;
    open.addEventListener("click", () => openJob(entry.id));
    dup.addEventListener("click", () => { duplicateJob(entry.id); renderJobsPanel(); });
    del.addEventListener("click", () => {
      if (!window.confirm(`Delete the job "${entry.name}" from this browser? Save a job file first if you want to keep it.`)) return;
      deleteJob(entry.id);
      renderJobsPanel();
    });
    rows.append(el("tr", { "data-job-row": entry.id }, el("td", {}, entry.name), el("td", {}, when), el("td", {}, open, " ", dup, " ", del)));
  }
}

async function restoreBackup(file) {
  let data = null;
  try { data = JSON.parse(await file.text()); } catch { data = null; }
  const jobs = backupJobs(data);
  if (!jobs) { showFileMessage(`Not added: ${file.name} is not a backup of Linesmith jobs. Your jobs are unchanged.`); return; }
  let added = 0;
  for (const job of jobs) if (createJob(job)) added += 1;
  renderJobsPanel();
  showFileMessage(`Added ${added} of ${jobs.length} jobs from ${file.name}; your other jobs are unchanged.`, added === jobs.length);
}

function jobsToolbar() {
  const panel = document.getElementById("jobs-panel");
  const toggle = document.getElementById("jobs-open");
  const show = (open) => { panel.hidden = !open; toggle.setAttribute("aria-expanded", String(open)); if (open) renderJobsPanel(); };
  toggle.addEventListener("click", () => show(panel.hidden));
  document.getElementById("jobs-close").addEventListener("click", () => show(false));
  document.getElementById("job-new").addEventListener("click", newJob);
  document.getElementById("edit-undo").addEventListener("click", stepBack);
  document.getElementById("edit-redo").addEventListener("click", stepForward);
  document.addEventListener("keydown", (event) => {
    if (!(event.ctrlKey || event.metaKey) || event.key.toLowerCase() !== "z") return;
    if (event.target.closest && event.target.closest("input, textarea, select")) return; // the field's own undo
    event.preventDefault();
    if (event.shiftKey) stepForward(); else stepBack();
  });
  document.getElementById("jobs-backup").addEventListener("click", () => {
    const data = backup();
    saveFile({ ...data, name: `linesmith-backup-${new Date().toISOString().slice(0, 10)}` });
  });
  const restoreInput = document.getElementById("jobs-restore");
  restoreInput.addEventListener("change", () => {
    const file = restoreInput.files && restoreInput.files[0];
    restoreInput.value = "";
    if (file) restoreBackup(file);
  });
  watchOtherTabs(() => state.jobId, onOtherTab);
}

// ---------------------------------------------------------------- toolbar

function setUnits(system) {
  setSystem(system);
  body.dataset.units = getSystem();
  try { localStorage.setItem(UNITS_KEY, getSystem()); } catch { /* private mode */ }
  for (const r of document.querySelectorAll('input[name="units"]')) r.checked = r.value === getSystem();
  fillAll();
  if (state.result) show();
  recalc(); // the sentences of the checks come back with their figures in the new units
}

function toolbar() {
  for (const r of document.querySelectorAll('input[name="units"]')) {
    r.addEventListener("change", () => { if (r.checked) setUnits(r.value); });
  }
  document.getElementById("demo-load").addEventListener("click", () => {
    const i = Number(document.getElementById("demo-select").value);
    openAsNew(clone(demos[i].job), `Opened the demo job "${demos[i].job.name || demos[i].file}" as a new job; your other jobs are unchanged.`);
  });
  document.getElementById("job-save").addEventListener("click", () => saveFile(state.job));
  document.getElementById("sheet-print").addEventListener("click", () => window.print());
  const input = document.getElementById("job-open");
  input.addEventListener("change", async () => {
    const file = input.files && input.files[0];
    input.value = "";
    if (!file) return;
    if (!worker || body.dataset.engine !== "ready") { showFileMessage("Not opened: the engine is still starting; try again in a moment."); return; }
    const read = await readJobFile(file, limits.job_file_max_bytes);
    if (read.error) { showFileMessage(`Not opened: ${read.error} The current job is unchanged.`); return; }
    const reply = await call({ op: "open", file_base64: read.base64, units: getSystem() });
    if (!reply.ok) {
      const fault = (reply.errors || []).some(isEngineFault);
      showFileMessage(`Not opened: ${fault ? `the engine failed while reading ${file.name}` : `${file.name} has problems the engine reports below`}. The current job is unchanged.`, false,
        (reply.errors || []).map((e) => (e.path ? `${e.path}: ${e.message}` : e.message)));
      return;
    }
    openAsNew(reply.job, `Opened ${file.name} as a new job in this browser's list.`);
  });
  initThreadFinder({ call, getJob: () => state.job, applyEdits });
}

// ---------------------------------------------------------------- update notice

// offline.js marks body[data-offline="update-waiting"] once a newer build is stored;
// the notice offers to switch to it now (window.linesmithOffline.applyUpdate()).
function watchUpdates() {
  const notice = document.getElementById("update-notice");
  const sync = () => { notice.hidden = body.dataset.offline !== "update-waiting"; };
  document.getElementById("update-apply").addEventListener("click", () => {
    const offline = window.linesmithOffline;
    // applyUpdate reloads once the new build has taken over; with none waiting, a plain reload.
    if (!offline || !offline.applyUpdate()) location.reload();
  });
  new MutationObserver(sync).observe(body, { attributes: true, attributeFilter: ["data-offline"] });
  sync();
}

// ---------------------------------------------------------------- start

// The worker is created by start.js, a classic script in <head> that runs before the page body
// is parsed: Pyodide boots in its own thread while the page arrives and this module renders the
// form. Here the page adopts it; the messages it sent meanwhile are handled after the synchronous
// start-up below has finished (so state.job and the form exist by then), in order, then live ones.
function startWorker() {
  const early = self.linesmithEarly || { worker: null, messages: [], error: "the start script did not run" };
  worker = early.worker;
  if (!worker) {
    fail(`This browser cannot start the engine worker (${early.error}).`);
    return;
  }
  state.started = early.started;

  const onError = (message) => fail(`The engine worker stopped: ${message}.`);
  const onMessage = (event) => {
    const message = JSON.parse(event.data);
    // The worker starts before the form: if the page failed meanwhile, its message stays.
    if (body.dataset.engine === "failed" && message.type !== "reply") return;
    if (message.type === "progress") {
      setStatus(message.text, message.percent);
    } else if (message.type === "failed") {
      fail(message.message);
    } else if (message.type === "reply") {
      if (typeof message.handle_ms === "number") body.dataset.handleMs = message.handle_ms.toFixed(1);
      const resolve = pending.get(message.id);
      pending.delete(message.id);
      if (resolve) resolve(JSON.parse(message.response));
    } else if (message.type === "ready") {
      body.dataset.workerTimings = JSON.stringify(message.timings_ms);
      setStatus(state.restored ? "Calculating the job saved in this browser…" : "Calculating the demo job…", 95);
      state.ready = true;
      schedule(0);
    }
  };
  setTimeout(() => { // after the start-up below: take over, then replay what arrived meanwhile
    worker.onmessage = onMessage;
    worker.onerror = (event) => { event.preventDefault(); onError(event.message || "it could not be loaded"); };
    for (const event of early.messages.splice(0)) onMessage(event);
    if (early.error) onError(early.error);
  }, 0);
}

function startEngine() {
  startWorker();

  let saved = null;
  try { saved = localStorage.getItem(UNITS_KEY); } catch { /* private mode */ }
  if (saved === "us") { setSystem("us"); body.dataset.units = "us"; }
  for (const r of document.querySelectorAll('input[name="units"]')) r.checked = r.value === getSystem();

  migrateOldAutosave();
  let id = openId() || (listJobs()[0] || {}).id || null;
  state.restored = Boolean(id);
  if (!id) id = createJob(clone(demos.length ? demos[0].job : readJSON("linesmith-demo")));
  state.jobId = id;
  if (id) setOpen(id);
  state.job = (id && readJob(id)) || clone(demos.length ? demos[0].job : readJSON("linesmith-demo"));
  history.reset(state.job);
  assignStaticPaths();
  initForm(model, state, changed);
  fillAll();
  toolbar();
  jobsToolbar();
  renderNav(state.job);
  initWorkbench();
  watchUpdates();
  performance.mark("linesmith-form-built");
}

// For tests and for a look in the console: the job as JSON text, exactly as kept.
window.linesmith = Object.freeze({ jobJSON: () => JSON.stringify(state.job) });

try {
  startEngine();
} catch (error) {
  fail(`The page could not start: ${error.message}`);
}
