"""The page starting from the engine snapshot, and every way that can fail.

The site is built once (with its snapshot), served on loopback and opened in Chromium:

- the restore path reaches ready, computes the same results as CPython's engine (the
  reference the plain boot is checked against in test_browser.py), and a module first
  imported after the restore (one the snapshot does not hold) imports once the worker has
  unpacked the wheels again; the second visit, served by the service worker, restores too;
- each failure (the snapshot missing, corrupt, of another Pyodide build, failing to
  restore, restored but of another engine build, hanging) ends in a plain boot that
  reaches ready, and the service worker then drops the snapshot (a 404 in its cache).

Faults are injected with Playwright routes on the first visit (no service worker yet).
"""
from __future__ import annotations

import gzip
import json
import re
import struct
import time

import pytest

from sitebuild.assemble import build
from sitebuild.snapshot import SNAPSHOT_FILE

from ..browser_support import compare_json, launched_chromium, serve_directory

BOOT_TIMEOUT_MS = 120_000
HANG_LIMIT_MS = 2_000


@pytest.fixture(scope="module")
def site(tmp_path_factory):
    out = tmp_path_factory.mktemp("snapshot-page") / "site"
    manifest = build(out)
    assert manifest.get("snapshot"), "the build made no engine snapshot (is Node.js installed?)"
    with serve_directory(out) as url:
        yield {"dir": out, "url": url, "manifest": manifest}


@pytest.fixture(scope="module")
def browser(chromium):
    with launched_chromium(chromium) as (browser, _):
        yield browser


def _open(browser, site, routes=()):
    context = browser.new_context()
    log = []
    for pattern, handler in routes:
        context.route(pattern, handler)
    page = context.new_page()
    page.on("console", lambda m: log.append(f"{m.type}: {m.text}"))
    page.goto(site["url"])
    return context, page, log


def _ready(page, log):
    page.wait_for_selector('body[data-engine="ready"], body[data-engine="failed"]',
                           timeout=BOOT_TIMEOUT_MS, state="attached")
    state = page.get_attribute("body", "data-engine")
    assert state == "ready", f"engine {state}: {page.inner_text('body')[:300]}\n" + "\n".join(log[-10:])
    return json.loads(page.get_attribute("body", "data-worker-timings") or "{}")


def _app_worker(page):
    for _ in range(100):
        for worker in page.workers:
            if worker.url.split("?")[0].endswith("/worker.js"):
                return worker
        time.sleep(0.05)
    raise AssertionError(f"no engine worker among {[w.url for w in page.workers]}")


def _engine_answer(worker, request):
    return json.loads(worker.evaluate(
        "(r) => self.linesmithEngine.pyodide.pyimport('calc.edges.api').handle(r)", json.dumps(request)))


def _snapshot_in_cache(page):
    """What the service worker's cache answers for the snapshot: its status, or None."""
    return page.evaluate("""async (path) => {
      for (const name of await caches.keys()) {
        const hit = await (await caches.open(name)).match(new URL(path, location.href).href);
        if (hit) return hit.status;
      }
      return null;
    }""", SNAPSHOT_FILE)


def test_restored_engine_is_ready_and_computes_as_cpython(browser, site):
    from calc.edges.api import handle
    from sitebuild.render import load_demos

    context, page, log = _open(browser, site)
    timings = _ready(page, log)
    assert timings.get("snapshot") is True, timings
    worker = _app_worker(page)
    for demo in load_demos():
        for request in ({"op": "evaluate", "job": demo["job"]}, {"op": "drop_curve", "job": demo["job"]}):
            got = _engine_answer(worker, request)
            # Source: the same entry point run in CPython on the same request is the reference.
            want = json.loads(handle(json.dumps(request)))
            assert want["ok"], want.get("errors")
            problems = compare_json(got, want, demo["file"], rel=1e-9, abs_tol=1e-12)["problems"]
            assert not problems, "\n".join(problems[:20])
    context.close()


def test_a_module_first_imported_after_the_restore_imports(browser, site):
    context, page, log = _open(browser, site)
    assert _ready(page, log).get("snapshot") is True
    worker = _app_worker(page)
    code = "import sys; 'fluids.safety_valve' in sys.modules"
    assert worker.evaluate("(c) => self.linesmithEngine.pyodide.runPython(c)", code) is False  # not in the snapshot
    assert worker.evaluate("async () => await self.linesmithEngine.refilled") is True
    name = worker.evaluate("(c) => self.linesmithEngine.pyodide.runPython(c)",
                           "import fluids.safety_valve as m; m.__name__")
    assert name == "fluids.safety_valve"
    context.close()


def test_second_visit_restores_from_the_service_workers_copy(browser, site):
    context, page, log = _open(browser, site)
    assert _ready(page, log).get("snapshot") is True
    page.wait_for_selector('body[data-offline="ready"]', timeout=BOOT_TIMEOUT_MS, state="attached")
    assert _snapshot_in_cache(page) == 200
    page.reload()
    timings = _ready(page, log)
    assert timings.get("snapshot") is True and page.evaluate("() => navigator.serviceWorker.controller !== null")
    context.close()


def _raw_snapshot(site):
    return bytearray(gzip.decompress((site["dir"] / SNAPSHOT_FILE).read_bytes()))


def _serve_bytes(body):
    return lambda route: route.fulfill(status=200, body=body, content_type="application/octet-stream")


def _patched_snapshot(site, offset, words):
    raw = _raw_snapshot(site)
    struct.pack_into(f"<{len(words)}I", raw, offset, *words)
    return _serve_bytes(gzip.compress(bytes(raw), compresslevel=1))


def _patched_page(replace):
    """The page as the browser navigates to it, changed (the service worker's copy is not)."""
    def handler(route):
        if not route.request.is_navigation_request():
            return route.continue_()
        response = route.fetch()
        route.fulfill(response=response, body=replace(response.text()))
    return handler


def _hang(route):
    """Never answered for the engine worker: its fetch hangs, so does the restore waiting for it."""
    if route.request.service_worker:
        route.continue_()  # the service worker's precache gets the real file


FAILURES = {
    "missing": lambda site: [(f"**/{SNAPSHOT_FILE}", lambda r: r.fulfill(status=404, body="not here"))],
    "corrupt": lambda site: [(f"**/{SNAPSHOT_FILE}", _serve_bytes(b"not a gzip stream " * 64))],
    # Source: header layout of Pyodide 314.0.7's API.makeSnapshot (sitebuild/snapshot.py): words 4-11 BUILD_ID.
    "stale, of another Pyodide build": lambda site: [(f"**/{SNAPSHOT_FILE}", _patched_snapshot(site, 16, [0] * 8))],
    # Word 0 is the magic number: Pyodide's restore throws.
    "restore error": lambda site: [(f"**/{SNAPSHOT_FILE}", _patched_snapshot(site, 0, [1]))],
    # Restores, but the page is of another engine build: the check inside Python refuses it.
    "build check fails": lambda site: [("**/", _patched_page(
        lambda html: html.replace(site["manifest"]["snapshot"]["engine_build"], "0" * 64)))],
    "hang": lambda site: [(f"**/{SNAPSHOT_FILE}", _hang), ("**/", _patched_page(
        lambda html: re.sub(r'"limit_ms": ?\d+', f'"limit_ms": {HANG_LIMIT_MS}', html)))],
}
EXPECTED_REASON = {
    "missing": "404", "corrupt": "", "stale, of another Pyodide build": "build id mismatch",
    "restore error": "magic number", "build check fails": "engine build", "hang": "took longer than 2 s",
}


@pytest.mark.parametrize("failure", list(FAILURES))
def test_each_snapshot_failure_boots_plainly_and_the_service_worker_drops_it(browser, site, failure):
    context, page, log = _open(browser, site, FAILURES[failure](site))
    timings = _ready(page, log)
    assert timings.get("snapshot") is False, timings
    assert EXPECTED_REASON[failure].lower() in (timings.get("fallback") or "").lower(), timings
    # The plain boot computes: the first result is on screen.
    assert page.evaluate("() => document.body.dataset.engine") == "ready"
    page.wait_for_selector('body[data-offline="ready"]', timeout=BOOT_TIMEOUT_MS, state="attached")
    deadline = time.monotonic() + 20
    while _snapshot_in_cache(page) != 404 and time.monotonic() < deadline:
        time.sleep(0.2)
    assert _snapshot_in_cache(page) == 404  # dropped: later visits boot plainly without fetching it
    context.close()
