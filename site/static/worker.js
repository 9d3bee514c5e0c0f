// Linesmith engine worker: starts Python with the engine and answers requests through
// calc.edges.api.handle(json) -> json. Two ways to start:
// - from the build's memory snapshot (config.snapshot; pyodide_snapshot.mjs): the runtime
//   with the engine already imported and warmed up is restored, checked inside Python to be
//   this build's engine (version and engine build hash), and answers at once; the wheels are
//   then unpacked again, off the critical path, because the file system is not in the snapshot
//   (a module first imported later needs them). Any failure falls back to the plain boot.
// - plainly: boot Pyodide, install the wheels shipped beside the page (fetched in parallel
//   with the boot, unpacked into site-packages: they are pure-Python wheels), import the engine.
// Every message in either direction is a JSON string:
//   page -> worker  {"type": "init", "pyodide": "./pyodide/", "wheels": [...],
//                    "bytecode": "./wheels/bytecode-cp314.zip" (optional),
//                    "snapshot": {url, engine_build, version, ...} (optional),
//                    "fallback": why an earlier worker's snapshot start was given up (optional)}
//                   {"type": "call", "id": N, "request": "<request JSON>"}
//   worker -> page  {"type": "progress", "percent": P, "text": "..."}
//                   {"type": "fallback", "reason": "..."}  the snapshot failed; booting plainly
//                   {"type": "ready", "timings_ms": {...}}
//                   {"type": "reply", "id": N, "response": "<response JSON>",
//                    "handle_ms": time spent in calc.edges.api.handle}
//                   {"type": "failed", "message": "..."}
import { loadPyodide } from "./pyodide/pyodide.mjs";
import { fetchSnapshot, restore } from "./pyodide_snapshot.mjs";

let handle = null;
let refilling = null; // after a restore, while the wheels are unpacked again: the promise of it

function send(message) {
  postMessage(JSON.stringify(message));
}

function progress(percent, text) {
  send({ type: "progress", percent, text });
}

function absolute(relative) {
  return new URL(relative, self.location.href).href;
}

async function fetchWheel(url) {
  const response = await fetch(url);
  if (!response.ok) throw new Error(`${url} answered ${response.status}`);
  return response.arrayBuffer();
}

async function fetchText(url) {
  const response = await fetch(url);
  if (!response.ok) throw new Error(`${url} answered ${response.status}`);
  return response.text();
}

// Unpack the wheels, the bytecode zip and linesmith_boot.py into site-packages.
function install(pyodide, wheelBuffers, bytecodeZip, bootModule) {
  const sitePackages = pyodide.pyimport("site").getsitepackages()[0];
  for (const buffer of wheelBuffers) {
    pyodide.unpackArchive(buffer, "wheel", { extractDir: sitePackages });
  }
  let bytecodeUsed = false;
  if (bytecodeZip) {
    try {
      pyodide.unpackArchive(bytecodeZip, "zip", { extractDir: sitePackages });
      bytecodeUsed = true;
    } catch (error) {
      // Only a speed-up: Python compiles the sources as usual.
    }
  }
  pyodide.FS.writeFile(`${sitePackages}/linesmith_boot.py`, bootModule);
  pyodide.pyimport("importlib").invalidate_caches();
  return bytecodeUsed;
}

function fetchEngineFiles(config) {
  const wheels = Promise.all(config.wheels.map((w) => fetchWheel(absolute(w))));
  wheels.catch(() => {}); // reported where awaited
  // linesmith_boot.py: lazy fluids and ht packages (only the submodules the
  // engine uses are imported). config.bytecode: the engine's start-up modules
  // compiled by build.py for this Python, so the browser does not compile them.
  const bootModule = fetchText(absolute("./linesmith_boot.py"));
  bootModule.catch(() => {});
  const bytecode = config.bytecode ? fetchWheel(absolute(config.bytecode)).catch(() => null) : Promise.resolve(null);
  return { wheels, bootModule, bytecode };
}

function sendReady(pyodide, timings) {
  // For tests and the browser benchmark (Playwright's worker.evaluate): the
  // runtime, to read its memory or to make the engine fail on purpose. Only
  // code already running in this worker can reach it.
  self.linesmithEngine = { pyodide, version: pyodide.version, refilled: refilling || Promise.resolve(false) };
  send({ type: "ready", timings_ms: timings });
}

// Start from the build's memory snapshot; throws on any failure (the caller boots plainly).
async function snapshotBoot(config) {
  const t0 = performance.now();
  const snap = config.snapshot;
  progress(10, `Starting the engine from its stored image (about ${Math.round(13 + snap.bytes / 1e6)} MB on first visit)…`);
  let tFetched = 0;
  const bytes = fetchSnapshot(absolute(snap.url), snap.raw_bytes).then((b) => { tFetched = performance.now(); return b; });
  bytes.catch(() => {}); // reported by restore()
  const pyodide = await restore(absolute(config.pyodide), bytes, snap.pyodide);
  const tRestored = performance.now();
  if (pyodide.version !== snap.pyodide) throw new Error(`the runtime is Pyodide ${pyodide.version}, not ${snap.pyodide}`);
  const problem = pyodide.pyimport("linesmith_boot").snapshot_check(snap.version, snap.engine_build);
  if (problem) throw new Error(problem);
  handle = pyodide.pyimport("calc.edges.api").handle; // the message handler's engine, made anew
  const tChecked = performance.now();
  // The file system is not in the snapshot: unpack the wheels again once the page has its first
  // result. Until then a module first imported now would be missing; call() retries after this.
  const refilled = new Promise((resolve) => setTimeout(resolve, 0)).then(async () => {
    const files = fetchEngineFiles(config);
    install(pyodide, await files.wheels, await files.bytecode, await files.bootModule);
    return true;
  });
  refilling = refilled;
  refilled.catch(() => false).then(() => { refilling = null; });
  sendReady(pyodide, {
    snapshot: true,
    bytecode: Boolean(config.bytecode), // the snapshot's engine was imported from build.py's bytecode
    fetch: Math.round(tFetched - t0),
    restore: Math.round(tRestored - t0),
    check: Math.round(tChecked - tRestored),
    total: Math.round(tChecked - t0),
    epoch_start: Math.round(performance.timeOrigin + t0),
    epoch_ready: Math.round(performance.timeOrigin + tChecked),
  });
}

async function boot(config) {
  if (config.snapshot) {
    try {
      await snapshotBoot(config);
      return;
    } catch (error) {
      handle = null;
      config = { ...config, snapshot: null, fallback: String((error && error.message) || error).split("\n")[0] };
      send({ type: "fallback", reason: config.fallback });
    }
  }
  await plainBoot(config);
}

async function plainBoot(config) {
  const t0 = performance.now();
  progress(5, "Loading the Python runtime (about 13 MB on first visit)…");
  // The wheels download while the runtime boots; they are unpacked afterwards.
  const files = fetchEngineFiles(config);
  const pyodide = await loadPyodide({ indexURL: absolute(config.pyodide) });
  const tCore = performance.now();
  progress(70, "Installing the engine and its libraries…");
  const bytecodeUsed = install(pyodide, await files.wheels, await files.bytecode, await files.bootModule);
  pyodide.pyimport("linesmith_boot").prepare();
  const tWheels = performance.now();
  progress(85, "Starting the engine…");
  const api = pyodide.pyimport("calc.edges.api");
  handle = api.handle;
  const tImport = performance.now();
  sendReady(pyodide, {
      snapshot: false,
      fallback: config.fallback || null,
      core: Math.round(tCore - t0),
      wheels: Math.round(tWheels - tCore),
      import: Math.round(tImport - tWheels),
      total: Math.round(tImport - t0),
      bytecode: bytecodeUsed,
      // Wall-clock (epoch ms) start and end of the boot, to line it up with the page's timeline.
      epoch_start: Math.round(performance.timeOrigin + t0),
      epoch_ready: Math.round(performance.timeOrigin + tImport),
  });
}

function answer(request) {
  try {
    return handle(request);
  } catch (error) {
    // calc.edges.api.handle never raises an Exception by contract; this guards the
    // bridge itself (a BaseException, a runtime error): the page gets an error
    // reply it can show, and the next request is handled as usual.
    const text = String((error && error.message) || error).trim().split("\n").pop();
    return JSON.stringify({
      ok: false,
      internal: true,
      errors: [{ path: "", message: `internal error: ${text}` }],
      warnings: [],
    });
  }
}

async function call(id, request) {
  const t0 = performance.now();
  let response = answer(request);
  if (refilling && /"internal": ?true/.test(response)) {
    // Right after a restore a module not in the snapshot cannot be imported until the wheels
    // are unpacked again: answer once more when they are (only in that window).
    if (await refilling.catch(() => false)) response = answer(request);
  }
  send({ type: "reply", id, response, handle_ms: performance.now() - t0 });
}

self.onmessage = (event) => {
  let message;
  try {
    message = JSON.parse(event.data);
  } catch {
    return;
  }
  if (message.type === "init") {
    boot(message).catch((error) => {
      send({ type: "failed", message: `The engine could not start: ${String(error && error.message || error)}` });
    });
  } else if (message.type === "call") {
    if (handle === null) {
      send({ type: "reply", id: message.id, response: JSON.stringify({
        ok: false, errors: [{ path: "", message: "the engine is still starting" }] }) });
    } else {
      call(message.id, message.request);
    }
  }
};
