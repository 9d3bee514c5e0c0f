// Linesmith engine worker: boots Pyodide, installs the wheels shipped beside
// the page (fetched in parallel with the boot, unpacked into site-packages:
// they are pure-Python wheels) and answers requests through
// calc.edges.api.handle(json) -> json.
// Every message in either direction is a JSON string:
//   page -> worker  {"type": "init", "pyodide": "./pyodide/", "wheels": [...],
//                    "bytecode": "./wheels/bytecode-cp314.zip" (optional)}
//                   {"type": "call", "id": N, "request": "<request JSON>"}
//   worker -> page  {"type": "progress", "percent": P, "text": "..."}
//                   {"type": "ready", "timings_ms": {...}}
//                   {"type": "reply", "id": N, "response": "<response JSON>",
//                    "handle_ms": time spent in calc.edges.api.handle}
//                   {"type": "failed", "message": "..."}
import { loadPyodide } from "./pyodide/pyodide.mjs";

let handle = null;

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

async function boot(config) {
  const t0 = performance.now();
  progress(5, "Loading the Python runtime (about 13 MB on first visit)…");
  // The wheels download while the runtime boots; they are unpacked afterwards.
  const wheels = Promise.all(config.wheels.map((w) => fetchWheel(absolute(w))));
  wheels.catch(() => {}); // reported below, once the runtime is up
  // linesmith_boot.py: lazy fluids and ht packages (only the submodules the
  // engine uses are imported). config.bytecode: the engine's start-up modules
  // compiled by build.py for this Python, so the browser does not compile them.
  const bootModule = fetchText(absolute("./linesmith_boot.py"));
  bootModule.catch(() => {});
  const bytecode = config.bytecode ? fetchWheel(absolute(config.bytecode)).catch(() => null) : null;
  const pyodide = await loadPyodide({ indexURL: absolute(config.pyodide) });
  const tCore = performance.now();
  progress(70, "Installing the engine and its libraries…");
  const sitePackages = pyodide.pyimport("site").getsitepackages()[0];
  for (const buffer of await wheels) {
    pyodide.unpackArchive(buffer, "wheel", { extractDir: sitePackages });
  }
  let bytecodeUsed = false;
  const bytecodeZip = await bytecode;
  if (bytecodeZip) {
    try {
      pyodide.unpackArchive(bytecodeZip, "zip", { extractDir: sitePackages });
      bytecodeUsed = true;
    } catch (error) {
      // Only a speed-up: Python compiles the sources as usual.
    }
  }
  pyodide.FS.writeFile(`${sitePackages}/linesmith_boot.py`, await bootModule);
  pyodide.pyimport("importlib").invalidate_caches();
  pyodide.pyimport("linesmith_boot").prepare();
  const tWheels = performance.now();
  progress(85, "Starting the engine…");
  const api = pyodide.pyimport("calc.edges.api");
  handle = api.handle;
  // For tests and the browser benchmark (Playwright's worker.evaluate): the
  // runtime, to read its memory or to make the engine fail on purpose. Only
  // code already running in this worker can reach it.
  self.linesmithEngine = { pyodide, version: pyodide.version };
  const tImport = performance.now();
  send({
    type: "ready",
    timings_ms: {
      core: Math.round(tCore - t0),
      wheels: Math.round(tWheels - tCore),
      import: Math.round(tImport - tWheels),
      total: Math.round(tImport - t0),
      bytecode: bytecodeUsed,
      // Wall-clock (epoch ms) start and end of the boot, to line it up with the page's timeline.
      epoch_start: Math.round(performance.timeOrigin + t0),
      epoch_ready: Math.round(performance.timeOrigin + tImport),
    },
  });
}

function call(id, request) {
  let response;
  const t0 = performance.now();
  try {
    response = handle(request);
  } catch (error) {
    // calc.edges.api.handle never raises an Exception by contract; this guards the
    // bridge itself (a BaseException, a runtime error): the page gets an error
    // reply it can show, and the next request is handled as usual.
    const text = String((error && error.message) || error).trim().split("\n").pop();
    response = JSON.stringify({
      ok: false,
      internal: true,
      errors: [{ path: "", message: `internal error: ${text}` }],
      warnings: [],
    });
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
