"""End-to-end test of the built page in headless Chromium.

Builds dist/ with build.py, serves it on a loopback port, opens it, waits for
the engine, and compares every figure on screen with calc.evaluate() run in
CPython on the same demo job. Also checks that the page asks nothing of any
other origin and fetches only files the build ships.
"""

from __future__ import annotations

import math
import time
from urllib.parse import urlsplit

import pytest

from .browser_support import (
    LAUNCH_ARGS,
    find_chromium,
    load_build_module,
    parse_shown_number,
    serve_directory,
)

BOOT_TIMEOUT_MS = 120_000  # generous: a cold Pyodide boot on a slow CI box


@pytest.fixture(scope="module")
def built_site():
    build = load_build_module()
    started = time.perf_counter()
    try:
        manifest = build.build()
    except build.BuildError as exc:
        pytest.fail(f"build.py could not build dist/: {exc}")
    seconds = time.perf_counter() - started
    print(f"\nbuild: {seconds:.1f} s, {manifest['total_bytes']} bytes in {len(manifest['files'])} files")
    demos = build.load_demos()
    with serve_directory(build.DIST_DIR) as base_url:
        yield {"build": build, "manifest": manifest, "demos": demos, "url": base_url}


@pytest.fixture(scope="module")
def browser():
    from playwright.sync_api import sync_playwright

    with sync_playwright() as playwright:
        try:
            executable, description = find_chromium(playwright)
        except RuntimeError as exc:
            pytest.fail(str(exc), pytrace=False)
        print(f"\nbrowser: {description}")
        browser = playwright.chromium.launch(executable_path=executable, args=LAUNCH_ARGS, headless=True)
        try:
            yield browser
        finally:
            browser.close()


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
    shipped = {entry["path"] for entry in built_site["manifest"]["files"]}
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
    page = page_context.new_page()
    page.goto(built_site["url"])
    page.wait_for_selector('body[data-engine="failed"]', timeout=BOOT_TIMEOUT_MS)
    message = page.inner_text("#status")
    assert "engine" in message.lower() and len(message) > 20, message
    assert page.locator("#results").is_hidden()
    page_context.close()
