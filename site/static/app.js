// Linesmith page: the job form, live results from the engine worker, plots, build sheet,
// saved jobs. The job is kept in engine units; the unit switch changes only what is shown.
// Text from a job (names typed by a user) is always inserted with textContent.
import { clone, el, readJSON, setPath } from "./js/util.js";
import { getSystem, setSystem, unitLabel } from "./js/units.js";
import { assignStaticPaths, fillAll, initForm, localErrors, refreshAssemblyNotes, refreshDashes, resetPending, showErrors } from "./js/form.js";
import { renderPlots, renderProblems, renderResult, setCautions } from "./js/results.js";
import { renderSheet } from "./js/sheet.js";
import { autosave, readJobFile, restore, saveFile, UNITS_KEY } from "./js/storage.js";
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
    renderResult(state.result, { applyEdits });
    const sweep = state.sweep && state.sweep.rev === state.resultRev ? state.sweep : null;
    renderPlots(state.result, sweep);
    renderSheet(state.resultJob, state.result);
    refreshDashes();
    refreshAssemblyNotes();
  }
  if (state.result || state.errors.length) resultsSection.hidden = false;
}

function changed({ structural, recalc: needsCalc }) {
  if (needsCalc) {
    state.rev += 1;
    autosave(state.job);
    schedule();
  } else {
    renderProblems(state.errors, localErrors(), state.fault);
  }
  body.dataset.jobRev = String(state.rev);
  if (structural) body.dataset.structure = String(Number(body.dataset.structure || 0) + 1);
}

// Make the engine's edits (a check's fix or a candidate's apply list) on the job, in order. The
// edits' paths index the user's own lists; their values are in engine units. One step can be undone.
function applyEdits(edits, words) {
  const before = clone(state.job);
  for (const e of edits) setPath(state.job, e.path, clone(e.value));
  loadJob(state.job);
  const undo = el("button", { type: "button", class: "undo-edit" }, "Undo");
  undo.addEventListener("click", () => {
    loadJob(before);
    showFileMessage(`Undone: ${words}.`, true);
  });
  showFileMessage(`Done: ${words}.`, true);
  fileMessage.querySelector("p").append(" ", undo);
}

function loadJob(job) {
  state.job = job;
  state.rev += 1;
  state.sweep = null;
  resetPending();
  fillAll();
  autosave(state.job);
  schedule(0);
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
    loadJob(clone(demos[i].job));
    showFileMessage(`Loaded the demo job "${demos[i].job.name || demos[i].file}".`, true);
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
    loadJob(reply.job);
    showFileMessage(`Opened ${file.name}.`, true);
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

  const restored = restore();
  state.job = restored || clone(demos.length ? demos[0].job : readJSON("linesmith-demo"));
  state.restored = Boolean(restored);
  assignStaticPaths();
  initForm(model, state, changed);
  fillAll();
  toolbar();
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
