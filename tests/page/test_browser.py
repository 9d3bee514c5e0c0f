"""End-to-end test of the built page in headless Chromium.

Builds dist/ with build.py, serves it on a loopback port, opens it, waits for
the engine, and compares every figure on screen with calc.evaluate() run in
CPython on the same demo job. Also checks that the page asks nothing of any
other origin and fetches only files the build ships.
"""

from __future__ import annotations

import json
import math
import time
from urllib.parse import urlsplit

import pytest

from sitebuild.assemble import build
from sitebuild.common import CONTENT_SECURITY_POLICY, DIST_DIR, BuildError
from sitebuild.render import load_demos

from ..browser_support import (
    FAULT_ONCE_JS,
    PROBE_JS,
    compare_json,
    engine_config,
    launched_chromium,
    parse_shown_number,
    probe_worker,
    serve_directory,
)

BOOT_TIMEOUT_MS = 120_000  # generous: a cold Pyodide boot on a slow CI box


@pytest.fixture(scope="module")
def built_site():
    started = time.perf_counter()
    try:
        manifest = build()
    except BuildError as exc:
        pytest.fail(f"build.py could not build dist/: {exc}")
    seconds = time.perf_counter() - started
    print(f"\nbuild: {seconds:.1f} s, {manifest['total_bytes']} bytes in {len(manifest['files'])} files")
    demos = load_demos()
    with serve_directory(DIST_DIR) as base_url:
        yield {"manifest": manifest, "demos": demos, "url": base_url}


@pytest.fixture(scope="module")
def browser(chromium):
    with launched_chromium(chromium) as (browser, description):
        print(f"\nbrowser: {description}")
        yield browser


def _open(browser, url):
    """Open url in a fresh context; return (page, requests, console messages)."""
    context = browser.new_context()
    requests: list[str] = []
    # context-level events include the worker's fetches (Pyodide core, wheels).
    context.on("request", lambda request: requests.append(request.url))
    page = context.new_page()
    page.on("request", lambda request: requests.append(request.url))
    console: list[str] = []
    page.on("console", lambda message: console.append(f"{message.type}: {message.text}"))
    page.on("pageerror", lambda error: console.append(f"pageerror: {error}"))
    page.goto(url)
    return page, requests, console


def _wait_for_engine(page, console):
    page.wait_for_selector('body[data-engine="ready"], body[data-engine="failed"]', timeout=BOOT_TIMEOUT_MS)
    state = page.get_attribute("body", "data-engine")
    if state != "ready":
        pytest.fail(f"engine {state}: {page.inner_text('#status')}\nconsole:\n" + "\n".join(console))


def _assert_close(shown_text, expected, where):
    shown, tolerance = parse_shown_number(shown_text)
    assert math.isfinite(expected), f"{where}: engine gave {expected}"
    assert abs(shown - expected) <= tolerance * (1 + 1e-9), (
        f"{where}: page shows {shown_text}, CPython gives {expected} (tolerance {tolerance})"
    )


def test_demo_result_matches_cpython_and_stays_on_origin(built_site, browser):
    import calc

    page, requests, console = _open(browser, built_site["url"])
    started = time.perf_counter()
    _wait_for_engine(page, console)
    print(f"boot to first result: {time.perf_counter() - started:.2f} s "
          f"(page's own figure {page.get_attribute('body', 'data-boot-ms')} ms)")

    demo = built_site["demos"][0]["job"]
    # The same job through the same entry point in CPython: the reference.
    expected = calc.evaluate(demo)
    assert page.text_content("#job-name") == demo["name"]  # inserted as text, verbatim

    conditions = page.locator("#results .condition")
    assert conditions.count() == len(expected["conditions"]) > 0
    checked = 0
    for ci, condition in enumerate(expected["conditions"]):
        block = page.locator(f'#results .condition[data-condition="{ci}"]')
        assert block.locator(".condition-name").text_content() == condition["name"]
        # Tolerance: half a unit of the last digit shown, since the page rounds
        # the engine's value to the shown decimals (see parse_shown_number).
        for field in ("pump_flow_lpm", "pump_outlet_bar", "viscosity_cst"):
            _assert_close(block.locator(f'.condition-summary [data-field="{field}"]').text_content(),
                          condition[field], f"conditions[{ci}].{field}")
            checked += 1
        rows = block.locator("table.lines tbody tr")
        assert rows.count() == len(condition["lines"]) > 0
        for li, line in enumerate(condition["lines"]):
            row = block.locator(f'table.lines tbody tr[data-line="{li}"]')
            assert row.locator(".line-name").text_content() == line["name"]
            for field in ("velocity_max_m_s", "reynolds_min", "pressure_drop_bar"):
                _assert_close(row.locator(f'[data-field="{field}"]').text_content(),
                              line[field], f"conditions[{ci}].lines[{li}].{field}")
                checked += 1
    assert checked >= 6

    # Nothing outside the page's own origin, and only files the build ships.
    origin = urlsplit(built_site["url"])
    shipped = {entry["path"] for entry in built_site["manifest"]["files"]} | {"manifest.json"}
    assert requests, "no requests were recorded"
    foreign = sorted({u for u in requests if urlsplit(u)[:2] != origin[:2]})
    assert not foreign, f"requests left the page's origin: {foreign}"
    paths = {urlsplit(u).path.lstrip("/") or "index.html" for u in requests}
    assert paths <= shipped, f"requested but not in dist/: {sorted(paths - shipped)}"
    # Every Pyodide file the build copies is one the boot really loads.
    pyodide_shipped = {p for p in shipped if p.startswith("pyodide/")}
    assert pyodide_shipped == {p for p in paths if p.startswith("pyodide/")}
    assert not [m for m in console if "Content Security Policy" in m], console
    page.context.close()


def test_page_reports_failure_readably(built_site, browser):
    """A missing engine wheel must give data-engine="failed" and a message, not a hang."""
    page_context = browser.new_context()
    page_context.route("**/wheels/linesmith-*.whl", lambda route: route.fulfill(status=404, body="gone"))
    # The engine snapshot would start without the wheel: take it away too, so the plain boot runs.
    page_context.route("**/engine.snapshot", lambda route: route.fulfill(status=404, body="gone"))
    page = page_context.new_page()
    page.goto(built_site["url"])
    page.wait_for_selector('body[data-engine="failed"]', timeout=BOOT_TIMEOUT_MS)
    message = page.inner_text("#status")
    assert "engine" in message.lower() and len(message) > 20, message
    assert page.locator("#results").is_hidden()
    page_context.close()


# --------------------------------------------------------------------------
# the engine in the browser against CPython, and recovery after a failure


@pytest.fixture(scope="module")
def probe(built_site, browser):
    """A page of the site's origin running a second instance of worker.js, driven directly."""
    context = browser.new_context()
    page = context.new_page()
    page.goto(built_site["url"] + "manifest.json")  # any document of the origin will do
    timings = page.evaluate(PROBE_JS, engine_config(built_site["manifest"]))
    print(f"\nprobe worker ready: {timings}")

    def call(request: dict) -> dict:
        reply = page.evaluate("(r) => window.__probe.call(r)", json.dumps(request))
        return json.loads(reply["response"])

    yield {"page": page, "call": call}
    context.close()


# Tolerance for CPython against Pyodide. Both run the same Python code on IEEE-754
# doubles; the only known source of difference is the C maths library (glibc here,
# musl in Emscripten), whose exp/log/pow may differ in the last bit, and iterative
# solvers can carry such a bit a little further. rel 1e-9 / abs 1e-12 is far
# below anything shown (3 significant decimals at most) and far above one bit.
REL_TOL = 1e-9
ABS_TOL = 1e-12


def test_every_demo_gives_the_same_numbers_in_pyodide_and_cpython(built_site, probe):
    from calc.edges.api import handle

    assert built_site["demos"], "no demo jobs"
    worst = 0.0
    for demo in built_site["demos"]:
        request = {"op": "evaluate", "job": demo["job"]}
        got = probe["call"](request)
        # Source: the same entry point run in CPython on the same request is the reference.
        want = json.loads(handle(json.dumps(request)))
        assert want["ok"], (demo["file"], want.get("errors"))
        diffs = compare_json(got, want, f"{demo['file']}", rel=REL_TOL, abs_tol=ABS_TOL)
        assert not diffs["problems"], "\n".join(diffs["problems"][:20])
        worst = max(worst, diffs["max_rel"])
    print(f"largest relative difference Pyodide vs CPython over {len(built_site['demos'])} demos: {worst:.3g}")


def test_worker_recovers_after_an_engine_failure(built_site, probe):
    demo = built_site["demos"][0]["job"]
    request = {"op": "evaluate", "job": demo}
    probe_worker(probe["page"]).evaluate(FAULT_ONCE_JS)
    failed = probe["call"](request)
    assert failed["ok"] is False and failed["internal"] is True  # a fault of the engine, marked as such
    message = failed["errors"][0]["message"]
    assert "simulated engine fault" in message and "Traceback" not in message, message
    # The very next request computes again, with the same numbers as before the failure.
    again = probe["call"](request)
    assert again["ok"] is True, again.get("errors")
    # Source: CPython on the same request is the reference.
    from calc.edges.api import handle
    want = json.loads(handle(json.dumps(request)))
    assert not compare_json(again, want, rel=REL_TOL, abs_tol=ABS_TOL)["problems"]


def test_worker_answers_hostile_requests_and_keeps_working(built_site, probe):
    """Bad job files reach the engine as text; each gets a clear error and nothing breaks."""
    page = probe["page"]
    job = built_site["demos"][0]["job"]
    good = json.dumps({"op": "evaluate", "job": job})
    route = {**job, "lines": [{**job["lines"][0], "route_points_mm": [[0, 0, 0], [1, 2, 3]]}, *job["lines"][1:]]}
    for label, text in [
        ("malformed JSON", good[:-7]),
        ("wrong version", json.dumps({"op": "evaluate", "job": {**job, "version": 99}})),
        ("infinite number", good.replace('"version": 1', '"version": 1e999', 1)),
        ("deep nesting", '{"op": "evaluate", "job": ' + "[" * 100_000 + "]" * 100_000 + "}"),
        ("enormous", json.dumps({"op": "evaluate", "job": {**job, "name": "x" * 3_000_000}})),
        ("integer beyond float range in a route",
         json.dumps({"op": "evaluate", "job": route}).replace("[1, 2, 3]", "[" + "9" * 400 + ", 2, 3]", 1)),
        ("lone surrogate", json.dumps({"op": "evaluate", "job": {**job, "name": "a\ud800"}})),
        ("boolean for a number", json.dumps({"op": "evaluate", "job": {**job, "version": True}})),
        ("thread: text for male", json.dumps({"op": "thread", "args": {"major_mm": 14.2, "pitch_mm": 1.41,
                                                                       "male": "no"}})),
        ("thread: no arguments", json.dumps({"op": "thread"})),
        ("unknown units", json.dumps({"op": "evaluate", "job": job, "units": "imperial"})),
        ("job file not base64", json.dumps({"op": "open", "file_base64": "%%%"})),
    ]:
        reply = json.loads(page.evaluate("(r) => window.__probe.call(r)", text)["response"])
        assert reply["ok"] is False and reply["errors"], label
        assert "internal" not in reply, (label, reply)  # bad input is never a fault of the engine
        for error in reply["errors"]:
            assert isinstance(error["path"], str) and error["message"], (label, error)
            assert "Traceback" not in error["message"] and "internal error" not in error["message"], (label, error)
    assert probe["call"]({"op": "evaluate", "job": job})["ok"] is True


MARKUP_NAME = '<img src=x onerror="window.__linesmithInjected=1">'


def _tojson(value):
    # What jinja2's tojson filter writes for a string in the page.
    return (json.dumps(value).replace("<", "\\u003c").replace(">", "\\u003e")
            .replace("&", "\\u0026").replace("'", "\\u0027"))


def test_job_name_with_markup_is_shown_as_text(built_site, browser):
    """A job whose name is markup: the page shows the literal text; no element, no script."""
    demo = built_site["demos"][0]["job"]
    context = browser.new_context()

    def page_with_markup_name(route):
        html = route.fetch().text()
        assert _tojson(demo["name"]) in html, "the demo's name is not in the page's data"
        route.fulfill(status=200, content_type="text/html; charset=utf-8",
                      headers={"Content-Security-Policy": CONTENT_SECURITY_POLICY},
                      body=html.replace(_tojson(demo["name"]), _tojson(MARKUP_NAME)))

    context.route(built_site["url"], page_with_markup_name)
    page = context.new_page()
    console = []
    page.on("console", lambda message: console.append(f"{message.type}: {message.text}"))
    page.goto(built_site["url"])
    _wait_for_engine(page, console)
    assert page.evaluate("document.querySelectorAll('img[src=\"x\"], img[onerror]').length") == 0
    assert page.evaluate("window.__linesmithInjected") is None
    shown = page.evaluate("document.body.innerText + '\\n' + document.title")
    assert MARKUP_NAME in shown, "the name is not shown as literal text"
    context.close()
