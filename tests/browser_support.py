"""Browser helpers for the Playwright tests: find a Chromium, serve dist/, collect requests.

Kept out of conftest.py on purpose: only the browser tests import this.
"""

from __future__ import annotations

import os
import shutil
import threading
from contextlib import contextmanager
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent

LAUNCH_ARGS = [
    "--no-sandbox",
    "--disable-gpu",
    "--disable-background-networking",
    "--disable-component-update",
    "--disable-sync",
]

HOW_TO_INSTALL = (
    "No Chromium found for the browser tests. Install one: `python -m playwright install chromium`, "
    "or `apt-get install chromium` on Debian/Ubuntu; or set LINESMITH_CHROMIUM to the path of a "
    "Chromium executable. (`python -m pytest` tries the first two itself, see tests/browser_setup.py.)"
)

# Where a system Chromium is looked for, in this order (after $LINESMITH_CHROMIUM and Playwright's own).
SYSTEM_CHROMIUMS = ("/usr/bin/chromium", "/usr/bin/chromium-browser")


class NoChromium(RuntimeError):
    """No Chromium at any of the places find_chromium looks (as opposed to a bad $LINESMITH_CHROMIUM)."""


# Screenshots of the main page states, for a person to look at (not compared): $LINESMITH_SCREENS, else
# test-screens/ in the checkout (ignored by git), so a CI run on a clean clone leaves them beside its code.
SHOTS = Path(os.environ.get("LINESMITH_SCREENS") or Path(__file__).resolve().parents[1] / "test-screens")


def find_chromium(playwright) -> tuple[str | None, str]:
    """Return (executable_path or None for Playwright's own, description).

    Order: $LINESMITH_CHROMIUM, Playwright's managed Chromium, then SYSTEM_CHROMIUMS
    (/usr/bin/chromium, /usr/bin/chromium-browser). Raises NoChromium (a RuntimeError)
    with install instructions when none is there, and a plain RuntimeError when
    $LINESMITH_CHROMIUM names something that is not a file.
    """
    named = os.environ.get("LINESMITH_CHROMIUM")
    if named:
        path = shutil.which(named) or named
        if not Path(path).is_file():
            raise RuntimeError(f"LINESMITH_CHROMIUM={named!r} is not an executable file. " + HOW_TO_INSTALL)
        return path, f"LINESMITH_CHROMIUM ({path})"
    try:
        managed = playwright.chromium.executable_path
    except Exception:  # noqa: BLE001 - Playwright raises its own error types here
        managed = None
    if managed and Path(managed).is_file():
        return None, f"Playwright's managed Chromium ({managed})"
    for candidate in SYSTEM_CHROMIUMS:
        if Path(candidate).is_file():
            return candidate, candidate
    raise NoChromium(HOW_TO_INSTALL)


@contextmanager
def launched_chromium(chromium):
    """Launch the Chromium the session fixture ``chromium`` provides: yields ``(browser, description)``.

    ``chromium`` is a ``tests.browser_setup.Chromium`` (the fixture found or installed it
    before the first browser test, or failed that test with what to install; never a skip).
    """
    from playwright.sync_api import sync_playwright

    with sync_playwright() as playwright:
        browser = playwright.chromium.launch(executable_path=chromium.executable, args=LAUNCH_ARGS, headless=True)
        try:
            yield browser, chromium.description
        finally:
            browser.close()


@contextmanager
def serve_directory(directory: Path):
    """Serve directory on a free loopback port in a thread; yield the base URL."""
    from sitebuild.serve import make_server

    server = make_server(directory, port=0, quiet=True)
    thread = threading.Thread(target=server.serve_forever, name="linesmith-test-server", daemon=True)
    thread.start()
    host, port = server.server_address[:2]
    try:
        yield f"http://{host}:{port}/"
    finally:
        server.shutdown()
        server.server_close()
        thread.join(timeout=5)


def parse_shown_number(text: str) -> tuple[float, float]:
    """Return (value, tolerance) for a figure as shown on the page.

    The tolerance is half a unit of the last shown digit: the page rounds the
    engine's figure to that many decimals, so that is the largest honest gap.
    """
    text = text.strip()
    decimals = len(text.split(".", 1)[1]) if "." in text else 0
    return float(text), 0.5 * 10.0 ** (-decimals)


# --------------------------------------------------------------------------
# a probe: the page's own worker.js driven directly from a test or benchmark

# Starts site/static/worker.js (a second instance, "?probe" in its URL so it can
# be told apart in page.workers) with the given config and defines
# window.__probe.call(requestJson) -> {response, handle_ms, round_trip_ms}.
# Resolves with the worker's boot timings, rejects with its failure message.
PROBE_JS = """
async (config) => {
  const worker = new Worker("./worker.js?probe", { type: "module" });
  const pending = new Map();
  let nextId = 1;
  const ready = new Promise((resolve, reject) => {
    worker.onmessage = (event) => {
      const message = JSON.parse(event.data);
      if (message.type === "ready") resolve(message.timings_ms);
      else if (message.type === "failed") reject(new Error(message.message));
      else if (message.type === "reply") {
        const done = pending.get(message.id);
        pending.delete(message.id);
        if (done) done(message);
      }
    };
    worker.onerror = (event) => reject(new Error(event.message || "the worker could not start"));
  });
  window.__probe = {
    call(requestJson) {
      const id = nextId++;
      const t0 = performance.now();
      return new Promise((resolve) => {
        pending.set(id, (message) => resolve({
          response: message.response,
          handle_ms: message.handle_ms,
          round_trip_ms: performance.now() - t0,
        }));
        worker.postMessage(JSON.stringify({ type: "call", id, request: requestJson }));
      });
    },
  };
  worker.postMessage(JSON.stringify({ type: "init", ...config }));
  return await ready;
}
"""

# Run in a worker with Playwright's worker.evaluate: the next calc.api.handle
# call raises a BaseException (which handle's `except Exception` lets through),
# as a real Python-level failure inside Pyodide would; later calls run normally.
FAULT_ONCE_JS = """
() => self.linesmithEngine.pyodide.runPython(`
import calc.edges.api as _api
class SimulatedEngineFault(BaseException):
    pass
def _fail_once(request, _real=_api.dispatch):
    _api.dispatch = _real
    raise SimulatedEngineFault("simulated engine fault")
_api.dispatch = _fail_once
`)
"""


def engine_config(manifest: dict) -> dict:
    """The worker's init config for a built site: Pyodide folder, wheels (ours first), bytecode."""
    wheels = sorted((e["path"] for e in manifest["files"] if e["path"].startswith("wheels/")
                     and e["path"].endswith(".whl")), key=lambda p: (not p.startswith("wheels/linesmith-"), p))
    config = {"pyodide": "./pyodide/", "wheels": [f"./{w}" for w in wheels]}
    bytecode = [e["path"] for e in manifest["files"] if e["path"].startswith("wheels/") and e["path"].endswith(".zip")]
    if bytecode:
        config["bytecode"] = f"./{bytecode[0]}"  # as the build's page config passes it
    return config


def probe_worker(page):
    """The probe's Playwright Worker object (after PROBE_JS resolved)."""
    for worker in page.workers:
        if worker.url.endswith("worker.js?probe"):
            return worker
    raise AssertionError(f"probe worker not found among {[w.url for w in page.workers]}")


def compare_json(got, want, path="result", rel=1e-9, abs_tol=1e-12, diffs=None):
    """List the places where got differs from want: same shape, equal text, numbers close.

    Numbers compare with math.isclose(rel_tol=rel, abs_tol=abs_tol); booleans and
    integers exactly. Returns (problems, largest relative difference seen).
    """
    import math

    if diffs is None:
        diffs = {"problems": [], "max_rel": 0.0}
    if isinstance(want, bool) or want is None or isinstance(want, str):
        if got != want:
            diffs["problems"].append(f"{path}: {got!r} != {want!r}")
    elif isinstance(want, (int, float)):
        if isinstance(got, bool) or not isinstance(got, (int, float)):
            diffs["problems"].append(f"{path}: {got!r} is not a number like {want!r}")
        else:
            if want != got:
                scale = max(abs(want), abs(got))
                diffs["max_rel"] = max(diffs["max_rel"], abs(want - got) / scale if scale else 0.0)
            if not math.isclose(got, want, rel_tol=rel, abs_tol=abs_tol):
                diffs["problems"].append(f"{path}: {got!r} != {want!r}")
    elif isinstance(want, list):
        if not isinstance(got, list) or len(got) != len(want):
            diffs["problems"].append(f"{path}: list of {len(want)} expected, got {got!r:.80}")
        else:
            for i, (g, w) in enumerate(zip(got, want)):
                compare_json(g, w, f"{path}[{i}]", rel, abs_tol, diffs)
    elif isinstance(want, dict):
        if not isinstance(got, dict) or set(got) != set(want):
            diffs["problems"].append(f"{path}: keys differ: {sorted(set(got or {}) ^ set(want))}")
        else:
            for key in want:
                compare_json(got[key], want[key], f"{path}.{key}", rel, abs_tol, diffs)
    else:
        diffs["problems"].append(f"{path}: unexpected type {type(want).__name__}")
    return diffs

