// Linesmith engine worker: boots Pyodide, installs the wheels shipped beside
// the page and answers requests through calc.api.handle(json) -> json.
// Every message in either direction is a JSON string:
//   page -> worker  {"type": "init", "pyodide": "./pyodide/", "wheels": [...]}
//                   {"type": "call", "id": N, "request": "<request JSON>"}
//   worker -> page  {"type": "progress", "percent": P, "text": "..."}
//                   {"type": "ready", "timings_ms": {...}}
//                   {"type": "reply", "id": N, "response": "<response JSON>"}
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

async function boot(config) {
  const t0 = performance.now();
  progress(5, "Loading the Python runtime (about 13 MB on first visit)…");
  const pyodide = await loadPyodide({ indexURL: absolute(config.pyodide) });
  const tCore = performance.now();
  progress(70, "Installing the engine and its libraries…");
  // By URL: all wheels are fetched in parallel and installed without any index.
  await pyodide.loadPackage(config.wheels.map(absolute), {
    messageCallback: () => {},
    errorCallback: (text) => console.warn(text),
  });
  const tWheels = performance.now();
  progress(85, "Starting the engine…");
  const api = pyodide.pyimport("calc.api");
  handle = api.handle;
  const tImport = performance.now();
  send({
    type: "ready",
    timings_ms: {
      core: Math.round(tCore - t0),
      wheels: Math.round(tWheels - tCore),
      import: Math.round(tImport - tWheels),
      total: Math.round(tImport - t0),
    },
  });
}

function call(id, request) {
  let response;
  try {
    response = handle(request);
  } catch (error) {
    // calc.api.handle never raises by contract; this guards the bridge itself.
    response = JSON.stringify({
      ok: false,
      errors: [{ path: "", message: `internal error: ${String(error && error.message || error)}` }],
    });
  }
  send({ type: "reply", id, response });
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
