"""Benchmark: the page in Chromium against a bare Pyodide boot on the same build.

Usage: python bench/browser_bench.py [--runs 5] [--edits 50] [--out bench/results/browser.json]

Builds the site into a temporary folder (the shipped dist/ is untouched) with three
bench-only files added: bench-boot.html, a page whose worker only runs
loadPyodide() from ./pyodide/, the physical limit of this design. Serves it on
loopback with build.py's own server (counting the bytes it sends) and measures,
every cold run on a fresh browser profile (a new persistent context in a temp dir):

(a) bare Pyodide boot: navigation start to the boot page's data-engine="ready";
(b) cold start: navigation start to data-engine="ready" of the calculator (first
    result on screen), and its ratio to (a);
(c) warm start: a second visit once the service worker has stored the build;
(d) recalculation of the largest demo job over N edits: time inside the worker
    around calc.edges.api.handle and the round trip from the page; CPython's time of
    the same handle calls in this process, and the ratio;
(e) bytes sent by the server on the first visit (bodies and headers, no
    compression), and memory after start: the page's JS heap (CDP
    Performance.getMetrics JSHeapUsedSize), the worker's WebAssembly memory, and
    the proportional set size (PSS, /proc/<pid>/smaps_rollup) of all the
    browser's processes together.
Plus the import and compile cost of the engine inside Pyodide, to judge the
ideas in the issue (import less, precompiled bytecode).

Medians over the runs are written to the JSON file with the date, machine and
Chromium version. Not a test: figures are recorded, not asserted.
"""
from __future__ import annotations

import argparse
import functools
import http.server
import json
import os
import platform
import statistics
import sys
import tempfile
import threading
import time
from datetime import datetime, timezone
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))

from sitebuild.assemble import build  # noqa: E402
from sitebuild.fetch import PYODIDE_VERSION  # noqa: E402
from sitebuild.render import load_demos  # noqa: E402
from sitebuild.serve import SiteHandler  # noqa: E402
from tests.browser_support import (  # noqa: E402
    LAUNCH_ARGS, PROBE_JS, find_chromium, probe_worker)

TIMEOUT_MS = 180_000

BENCH_FILES = {
    "bench-boot.html": b"""<!doctype html>
<html lang="en"><head><meta charset="utf-8"><title>bare Pyodide boot (benchmark only)</title>
<script type="module" src="./bench-boot.js"></script></head><body data-engine="loading"></body></html>
""",
    "bench-boot.js": b"""const worker = new Worker("./bench-boot-worker.js", { type: "module" });
worker.onmessage = (event) => {
  document.body.dataset.workerMs = String(event.data);
  document.body.dataset.engine = "ready";
};
""",
    "bench-boot-worker.js": b"""import { loadPyodide } from "./pyodide/pyodide.mjs";
const t0 = performance.now();
await loadPyodide({ indexURL: new URL("./pyodide/", self.location.href).href });
postMessage(Math.round(performance.now() - t0));
""",
}

# performance.now() (ms since navigation start) at the moment body gets data-engine="ready".
READY_CLOCK = """
new MutationObserver(() => {
  if (document.body && document.body.dataset.engine === "ready" && window.__readyAt === undefined)
    window.__readyAt = performance.now();
}).observe(document, { subtree: true, attributes: true, attributeFilter: ["data-engine"], childList: true });
"""

# Cost of the engine's imports and of compiling its Python sources, inside Pyodide.
IMPORT_COST_PY = r"""
import json, sys, time, pathlib, site, importlib, py_compile
import linesmith_boot
sp = pathlib.Path(site.getsitepackages()[0])
ours = lambda m: (getattr(sys.modules[m], "__file__", None) or "").startswith(str(sp))
at_ready = sorted(m for m in list(sys.modules) if ours(m))

def reimport(lazy):
    for m in [m for m in list(sys.modules) if m.split(".")[0] in ("calc", "fluids", "ht")]:
        del sys.modules[m]
    importlib.invalidate_caches()
    if lazy:
        linesmith_boot.install_lazy_packages()
    t = time.perf_counter(); import calc.edges.api
    n = sum(1 for m in sys.modules if m.split(".")[0] in ("fluids", "ht"))
    return {"ms": (time.perf_counter() - t) * 1e3, "fluids_ht_modules": n}

# Second imports in one interpreter (file reads are from memory either way):
# lazy or whole packages, with build.py's bytecode or compiling from source.
sys.dont_write_bytecode = True
shipped = any(sp.rglob("__pycache__/*.pyc"))
out = {"bytecode_shipped": shipped, "site_packages_modules_at_ready": len(at_ready)}
if shipped:
    out["lazy_with_bytecode"] = reimport(True)
for p in sp.rglob("__pycache__/*.pyc"):
    p.unlink()
out["lazy_from_source"] = reimport(True)
out["whole_from_source"] = reimport(False)
files = [pathlib.Path(sys.modules[m].__file__) for m in list(sys.modules)
         if ours(m) and sys.modules[m].__file__.endswith(".py")]
t = time.perf_counter()
for f in files:
    py_compile.compile(str(f), cfile=importlib.util.cache_from_source(str(f)), doraise=True,
                       invalidation_mode=py_compile.PycInvalidationMode.CHECKED_HASH)
out["compile_whole_set_ms"] = (time.perf_counter() - t) * 1e3
out["whole_with_bytecode"] = reimport(False)
json.dumps(out)
"""


class CountingHandler(SiteHandler):
    """The build's handler, adding up the bytes it writes (headers and bodies)."""

    def end_headers(self):
        super().end_headers()

    def flush_headers(self):
        if getattr(self, "_headers_buffer", None):
            self.server.sent_bytes += sum(len(b) for b in self._headers_buffer)
        super().flush_headers()

    def copyfile(self, source, outputfile):
        while True:
            block = source.read(1 << 16)
            if not block:
                break
            outputfile.write(block)
            self.server.sent_bytes += len(block)


def serve(site: Path):
    handler = functools.partial(CountingHandler, directory=str(site))
    server = http.server.ThreadingHTTPServer(("127.0.0.1", 0), handler)
    server.daemon_threads = True
    server.quiet = True
    server.sent_bytes = 0
    threading.Thread(target=server.serve_forever, daemon=True).start()
    return server, f"http://127.0.0.1:{server.server_address[1]}/"


def browser_pss_bytes(user_data_dir: str) -> int | None:
    """PSS of the browser whose command line names user_data_dir, with all its descendants."""
    procs = {}
    for entry in os.listdir("/proc"):
        if not entry.isdigit():
            continue
        try:
            with open(f"/proc/{entry}/stat") as f:
                ppid = int(f.read().rsplit(")", 1)[1].split()[1])
            with open(f"/proc/{entry}/cmdline", "rb") as f:
                cmd = f.read()
            procs[int(entry)] = (ppid, cmd)
        except OSError:
            continue
    roots = [pid for pid, (_, cmd) in procs.items() if f"--user-data-dir={user_data_dir}".encode() in cmd
             and b"--type=" not in cmd]
    if not roots:
        return None
    family = set(roots)
    grew = True
    while grew:
        grew = False
        for pid, (ppid, _) in procs.items():
            if ppid in family and pid not in family:
                family.add(pid)
                grew = True
    total = 0
    for pid in family:
        try:
            with open(f"/proc/{pid}/smaps_rollup") as f:
                for line in f:
                    if line.startswith("Pss:"):
                        total += int(line.split()[1]) * 1024
        except OSError:
            continue
    return total


def wait_ready(page):
    page.wait_for_selector('body[data-engine="ready"], body[data-engine="failed"]', timeout=TIMEOUT_MS,
                           state="attached")
    if page.get_attribute("body", "data-engine") != "ready":
        raise RuntimeError(f"engine failed: {page.inner_text('body')[:300]}")
    page.wait_for_function("window.__readyAt !== undefined", timeout=TIMEOUT_MS)
    return page.evaluate("() => window.__readyAt")


def launch(playwright, executable, profile):
    context = playwright.chromium.launch_persistent_context(
        profile, executable_path=executable, args=LAUNCH_ARGS, headless=True)
    context.add_init_script(READY_CLOCK)
    return context


def largest_demo(demos):
    return max(demos, key=lambda d: len(json.dumps(d["job"])))


def edited_jobs(job, n):
    """n edits of the job as a user makes them: the first hose or tube length, step by step."""
    import copy
    jobs = []
    for i in range(n):
        j = copy.deepcopy(job)
        for line in j["lines"]:
            part = next((p for p in line["parts"] if "length_m" in p), None)
            if part:
                part["length_m"] = round(part["length_m"] * (1 + 0.002 * (i + 1)), 6)
                break
        jobs.append(j)
    return jobs


def pct(values, q):
    values = sorted(values)
    return values[min(len(values) - 1, int(round(q * (len(values) - 1))))]


def machine() -> dict:
    model = ""
    try:
        with open("/proc/cpuinfo") as f:
            model = next((line.split(":", 1)[1].strip() for line in f if line.startswith("model name")), "")
    except OSError:
        pass
    mem = None
    try:
        with open("/proc/meminfo") as f:
            mem = int(next(line for line in f if line.startswith("MemTotal")).split()[1]) * 1024
    except (OSError, StopIteration):
        pass
    return {"cpu": model or platform.processor(), "cores": os.cpu_count(), "memory_bytes": mem,
            "os": platform.platform(), "python": platform.python_version()}


def timing_medians(runs, key):
    """Median of every numeric field of the worker's ready timings (the boot's phases)."""
    names = [k for k, v in runs[0][key].items()
             if isinstance(v, (int, float)) and not isinstance(v, bool) and not k.startswith("epoch_")]
    return {k: statistics.median(r[key][k] for r in runs if isinstance(r[key].get(k), (int, float)))
            for k in names if all(isinstance(r[key].get(k), (int, float)) for r in runs)}


def main() -> int:
    ap = argparse.ArgumentParser()
    ap.add_argument("--runs", type=int, default=5)
    ap.add_argument("--edits", type=int, default=50)
    ap.add_argument("--out", default=str(ROOT / "bench" / "results" / "browser.json"))
    args = ap.parse_args()

    from playwright.sync_api import sync_playwright
    from calc.edges.api import handle

    tmp = Path(tempfile.mkdtemp(prefix="linesmith-bench-"))
    site = tmp / "site"
    manifest = build(site, extra_files=BENCH_FILES)
    server, url = serve(site)
    demos = load_demos()
    demo = largest_demo(demos)
    jobs = edited_jobs(demo["job"], args.edits)

    runs = []
    with sync_playwright() as p:
        executable, description = find_chromium(p)
        b = p.chromium.launch(executable_path=executable, args=LAUNCH_ARGS, headless=True)
        chromium_version = b.version
        b.close()
        for run in range(args.runs):
            r = {}
            # (a) bare boot on a fresh profile
            profile = str(tmp / f"profile-{run}-bare")
            ctx = launch(p, executable, profile)
            page = ctx.new_page()
            page.goto(url + "bench-boot.html")
            r["bare_boot_ms"] = wait_ready(page)
            r["bare_worker_ms"] = float(page.get_attribute("body", "data-worker-ms"))
            ctx.close()

            # (b) cold start of the calculator on a fresh profile
            profile = str(tmp / f"profile-{run}-page")
            ctx = launch(p, executable, profile)
            page = ctx.new_page()
            server.sent_bytes = 0
            page.goto(url)
            r["cold_ms"] = wait_ready(page)
            r["first_visit_bytes_to_ready"] = server.sent_bytes
            r["worker_timings_ms"] = json.loads(page.get_attribute("body", "data-worker-timings") or "{}")
            # Where the time outside the worker's boot goes: before the page starts the
            # worker, and after the engine is ready (first evaluation, rendering).
            origin = page.evaluate("() => performance.timeOrigin")
            if "epoch_start" in r["worker_timings_ms"]:
                r["worker_started_after_navigation_ms"] = r["worker_timings_ms"]["epoch_start"] - origin
                r["first_result_after_worker_ready_ms"] = r["cold_ms"] - (r["worker_timings_ms"]["epoch_ready"] - origin)
            time.sleep(0.5)
            cdp = ctx.new_cdp_session(page)
            cdp.send("Performance.enable")
            metrics = {m["name"]: m["value"] for m in cdp.send("Performance.getMetrics")["metrics"]}
            r["page_js_heap_used_bytes"] = metrics.get("JSHeapUsedSize")
            app_worker = next((w for w in page.workers if w.url.split("?")[0].endswith("/worker.js")), None)
            r["worker_wasm_memory_bytes"] = app_worker.evaluate(
                "() => self.linesmithEngine ? self.linesmithEngine.pyodide._module.HEAP8.length : null") \
                if app_worker else None
            r["browser_pss_bytes"] = browser_pss_bytes(profile)
            page.wait_for_selector('body[data-offline="ready"], body[data-offline="failed"]',
                                   timeout=TIMEOUT_MS, state="attached")
            r["offline_state"] = page.get_attribute("body", "data-offline")
            time.sleep(0.3)
            r["first_visit_bytes_with_precache"] = server.sent_bytes
            time.sleep(0.3)
            page.close()

            # (c) warm start: second visit, served by the service worker
            page = ctx.new_page()
            server.sent_bytes = 0
            page.goto(url)
            r["warm_ms"] = wait_ready(page)
            r["warm_visit_bytes"] = server.sent_bytes
            r["warm_worker_timings_ms"] = json.loads(page.get_attribute("body", "data-worker-timings") or "{}")

            if run == 0:
                # (d) recalculation and the import costs, in a probe worker on this page
                # The probe starts as the page does: from the engine snapshot when the build has one.
                config = json.loads(page.evaluate("() => document.getElementById('linesmith-config').textContent"))
                page.evaluate(PROBE_JS, config)
                probe = probe_worker(page)
                probe.evaluate("async () => { await self.linesmithEngine.refilled; }")  # files back after a restore
                first = page.evaluate("(r) => window.__probe.call(r)",
                                      json.dumps({"op": "evaluate", "job": jobs[0]}))
                browser_handle, round_trip = [], []
                for job in jobs:
                    reply = page.evaluate("(r) => window.__probe.call(r)", json.dumps({"op": "evaluate", "job": job}))
                    assert json.loads(reply["response"])["ok"]
                    browser_handle.append(reply["handle_ms"])
                    round_trip.append(reply["round_trip_ms"])
                cpython = []
                handle(json.dumps({"op": "evaluate", "job": jobs[0]}))
                for job in jobs:
                    text = json.dumps({"op": "evaluate", "job": job})
                    t0 = time.perf_counter()
                    handle(text)
                    cpython.append((time.perf_counter() - t0) * 1e3)
                recalc = {
                    "job": demo["file"], "edits": len(jobs),
                    "first_call_after_import_ms": first["handle_ms"],
                    "worker_handle_ms": {"median": statistics.median(browser_handle), "p95": pct(browser_handle, 0.95)},
                    "page_round_trip_ms": {"median": statistics.median(round_trip), "p95": pct(round_trip, 0.95)},
                    "cpython_handle_ms": {"median": statistics.median(cpython), "p95": pct(cpython, 0.95)},
                }
                recalc["ratio_browser_to_cpython"] = (recalc["worker_handle_ms"]["median"]
                                                      / recalc["cpython_handle_ms"]["median"])
                recalc["probe_started_from_snapshot"] = bool(config.get("snapshot"))
                # Last: it re-imports the engine in the probe (after the recalculation figures).
                costs = json.loads(probe.evaluate(
                    "(code) => self.linesmithEngine.pyodide.runPython(code)", IMPORT_COST_PY))
            ctx.close()
            runs.append(r)
            print(f"run {run + 1}: bare {r['bare_boot_ms']:.0f} ms, cold {r['cold_ms']:.0f} ms, "
                  f"warm {r['warm_ms']:.0f} ms, {r['first_visit_bytes_to_ready'] / 1e6:.2f} MB", flush=True)
    server.shutdown()

    med = lambda key: statistics.median(r[key] for r in runs)  # noqa: E731
    result = {
        "date": datetime.now(timezone.utc).isoformat(timespec="seconds"),
        "machine": machine(),
        "chromium": chromium_version,
        "browser": description,
        "pyodide": PYODIDE_VERSION,
        "build": manifest["build"],
        "runs": len(runs),
        "bare_pyodide_boot_ms": med("bare_boot_ms"),
        "cold_start_to_first_result_ms": med("cold_ms"),
        "cold_over_bare": med("cold_ms") / med("bare_boot_ms"),
        "cold_over_bare_per_run": [r["cold_ms"] / r["bare_boot_ms"] for r in runs],
        "warm_start_to_first_result_ms": med("warm_ms"),
        "worker_timings_ms_median": timing_medians(runs, "worker_timings_ms"),
        "warm_worker_timings_ms_median": timing_medians(runs, "warm_worker_timings_ms"),
        "snapshot_used_cold_runs": sum(bool(r["worker_timings_ms"].get("snapshot")) for r in runs),
        "snapshot_used_warm_runs": sum(bool(r["warm_worker_timings_ms"].get("snapshot")) for r in runs),
        "warm_over_bare": med("warm_ms") / med("bare_boot_ms"),
        "warm_over_bare_per_run": [r["warm_ms"] / r["bare_boot_ms"] for r in runs],
        "bytecode_shipped": all(r["worker_timings_ms"].get("bytecode") for r in runs),
        "cold_start_parts_ms_median": {
            "worker_started_after_navigation": med("worker_started_after_navigation_ms"),
            "worker_boot_total": statistics.median(r["worker_timings_ms"]["total"] for r in runs),
            "first_result_after_worker_ready": med("first_result_after_worker_ready_ms"),
            "bare_page_worker_boot": med("bare_worker_ms"),
        },
        "recalculation": recalc,
        "first_visit_bytes_to_first_result": med("first_visit_bytes_to_ready"),
        "first_visit_bytes_including_precache": med("first_visit_bytes_with_precache"),
        "warm_visit_bytes": med("warm_visit_bytes"),
        "site_bytes": manifest["total_bytes"],
        "memory_after_start": {
            "page_js_heap_used_bytes": med("page_js_heap_used_bytes"),
            "worker_wasm_memory_bytes": med("worker_wasm_memory_bytes"),
            "browser_pss_bytes_all_processes": med("browser_pss_bytes"),
            "how": "page JS heap: CDP Performance.getMetrics JSHeapUsedSize; worker: Pyodide's "
                   "WebAssembly memory (HEAP8.length); PSS: /proc/<pid>/smaps_rollup summed over the "
                   "browser process and its descendants",
        },
        "pyodide_import_costs": costs,
        "per_run": runs,
    }
    out = Path(args.out)
    out.parent.mkdir(parents=True, exist_ok=True)
    out.write_text(json.dumps(result, indent=1) + "\n", encoding="utf-8")
    summary = {k: result[k] for k in ("bare_pyodide_boot_ms", "cold_start_to_first_result_ms", "cold_over_bare",
                                      "warm_start_to_first_result_ms", "first_visit_bytes_to_first_result",
                                      "first_visit_bytes_including_precache")}
    print(json.dumps(summary, indent=1))
    print(json.dumps(recalc, indent=1))
    print(json.dumps(result["memory_after_start"], indent=1))
    print(json.dumps(costs, indent=1))
    import shutil
    shutil.rmtree(tmp, ignore_errors=True)
    return 0


if __name__ == "__main__":
    sys.exit(main())
