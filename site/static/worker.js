// Linesmith engine worker: boots Pyodide, installs the wheels shipped beside
// the page (fetched in parallel with the boot, unpacked into site-packages:
// they are pure-Python wheels) and answers requests through
// calc.api.handle(json) -> json.
// Every message in either direction is a JSON string:
//   page -> worker  {"type": "init", "pyodide": "./pyodide/", "wheels": [...]}
//                   {"type": "call", "id": N, "request": "<request JSON>"}
//   worker -> page  {"type": "progress", "percent": P, "text": "..."}
//                   {"type": "ready", "timings_ms": {...}}
//                   {"type": "reply", "id": N, "response": "<response JSON>",
//                    "handle_ms": time spent in calc.api.handle}
//                   {"type": "failed", "message": "..."}
import { loadPyodide } from "./pyodide/pyodide.mjs";

let handle = null;
let runtime = null;
let bytecode = null; // {name, stored} once the build is known

// Bytecode cache. Pyodide compiles every imported .py file on each start
// (about 0.9 s for the engine, fluids and ht here; measured by
// bench/browser_bench.py). The browser's Python 3.14 bytecode cannot be made by
// the build's Python, so the worker makes it once, after the first result,
// and keeps it in Cache Storage beside the service worker's cache of the same
// build (deleted with it when a new build takes over). Checked-hash .pyc
// files: valid whatever the unpacked sources' timestamps, and Python checks
// each against its source's hash on import, so a stale one is never run.
const PYC_URL = "./__linesmith-bytecode__.zip";

async function openBytecodeCache() {
  if (!self.caches) return null;
  const response = await fetch(absolute("./manifest.json"));
  if (!response.ok) return null;
  const build = (await response.json()).build;
  if (!/^[0-9a-f]{64}$/.test(build)) return null;
  const name = `linesmith-${build}-bytecode`;
  const hit = await caches.match(absolute(PYC_URL), { cacheName: name }); // creates no cache
  return { name, stored: hit ? await hit.arrayBuffer() : null };
}

const PYC_WRITE = `
import importlib.util, io, py_compile, site, sys, zipfile
_sp = site.getsitepackages()[0]
_files = sorted({m.__file__ for m in list(sys.modules.values())
                 if (getattr(m, "__file__", None) or "").startswith(_sp) and m.__file__.endswith(".py")})
def _compile_one(i):
    py_compile.compile(_files[i], cfile=importlib.util.cache_from_source(_files[i]), doraise=True,
                       invalidation_mode=py_compile.PycInvalidationMode.CHECKED_HASH)
def _zip_all():
    out = io.BytesIO()
    with zipfile.ZipFile(out, "w", zipfile.ZIP_STORED) as zf:
        for f in _files:
            c = importlib.util.cache_from_source(f)
            zf.write(c, c[len(_sp):].lstrip("/"))
    return out.getvalue()
`;

async function storeBytecode() {
  // Once, after the first reply: compile the modules in use, one per task so
  // requests are answered in between, then keep them as one zip.
  if (!bytecode || bytecode.stored || bytecode.busy) return;
  bytecode.busy = true;
  try {
    const ns = runtime.toPy({});
    runtime.runPython(PYC_WRITE, { globals: ns });
    const count = ns.get("_files").length;
    const compileOne = ns.get("_compile_one");
    for (let i = 0; i < count; i++) {
      compileOne(i);
      await new Promise((resolve) => setTimeout(resolve, 0));
    }
    const proxy = ns.get("_zip_all")();
    const bytes = proxy.toJs();
    proxy.destroy();
    const cache = await caches.open(bytecode.name);
    await cache.put(absolute(PYC_URL), new Response(bytes, {
      headers: { "Content-Type": "application/zip" } }));
    bytecode.stored = true;
    ns.destroy();
  } catch (error) {
    // Only a speed-up: without it the next start compiles again.
  } finally {
    bytecode.busy = false;
  }
}

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

async function boot(config) {
  const t0 = performance.now();
  progress(5, "Loading the Python runtime (about 13 MB on first visit)…");
  // The wheels download while the runtime boots; they are unpacked afterwards.
  const wheels = Promise.all(config.wheels.map((w) => fetchWheel(absolute(w))));
  wheels.catch(() => {}); // reported below, once the runtime is up
  const pyc = openBytecodeCache().catch(() => null);
  const pyodide = await loadPyodide({ indexURL: absolute(config.pyodide) });
  const tCore = performance.now();
  progress(70, "Installing the engine and its libraries…");
  const sitePackages = pyodide.pyimport("site").getsitepackages()[0];
  for (const buffer of await wheels) {
    pyodide.unpackArchive(buffer, "wheel", { extractDir: sitePackages });
  }
  bytecode = await pyc;
  if (bytecode && bytecode.stored) {
    try {
      pyodide.unpackArchive(bytecode.stored, "zip", { extractDir: sitePackages });
    } catch (error) {
      bytecode.stored = null; // compile as usual, store afresh
    }
  }
  pyodide.pyimport("importlib").invalidate_caches();
  const tWheels = performance.now();
  progress(85, "Starting the engine…");
  const api = pyodide.pyimport("calc.api");
  handle = api.handle;
  runtime = pyodide;
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
      bytecode_cached: Boolean(bytecode && bytecode.stored),
    },
  });
}

function call(id, request) {
  let response;
  const t0 = performance.now();
  try {
    response = handle(request);
  } catch (error) {
    // calc.api.handle never raises an Exception by contract; this guards the
    // bridge itself (a BaseException, a runtime error): the page gets an error
    // reply it can show, and the next request is handled as usual.
    const text = String((error && error.message) || error).trim().split("\n").pop();
    response = JSON.stringify({
      ok: false,
      errors: [{ path: "", message: `internal error: ${text}` }],
      warnings: [],
    });
  }
  send({ type: "reply", id, response, handle_ms: performance.now() - t0 });
  if (bytecode && !bytecode.stored) setTimeout(storeBytecode, 0);
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
