"""Offline use: the service worker, its precache list, the web app manifest, cache replacement.

The browser tests build the site into a temporary folder (stamped with an extra
file so two builds differ), serve it on loopback and drive Chromium:

- after one visit, the page loads and computes with the network switched off,
  served by a plain static server (`python -m http.server`, as the README says);
- a second build replaces the first cleanly: while a page of the first build is
  open it is served only the first build's files, then the new worker takes over,
  and only the new build's cache is left; every response carries the page's
  Content-Security-Policy and no request leaves the origin;
- what the README says a plain static server loses: its worker runs with no policy.
"""
from __future__ import annotations

import json
import re
import struct
import subprocess
import sys
import time
from urllib.parse import urlsplit

import pytest

from sitebuild.assemble import build
from sitebuild.bytecode import BYTECODE_FILE
from sitebuild.common import CONTENT_SECURITY_POLICY

from ..browser_support import launched_chromium, serve_directory

BOOT_TIMEOUT_MS = 120_000
STAMP = "build-stamp.txt"

# Collects Content-Security-Policy violations of the page (the workers report theirs
# to the console, which the tests collect too).
CSP_LISTENER = """
window.__cspViolations = [];
document.addEventListener("securitypolicyviolation",
  (e) => window.__cspViolations.push(`${e.violatedDirective} ${e.blockedURI}`));
"""


def _sw_files(site):
    text = (site / "sw.js").read_text(encoding="utf-8")
    build_id = re.search(r'const BUILD = "([0-9a-f]{64})";', text).group(1)
    files = json.loads(re.search(r"const FILES = (\[.*?\]);\n", text).group(1))
    return build_id, files


# --------------------------------------------------------------------------
# without a browser


def test_precache_list_is_every_file_of_the_build(tmp_path):
    import base64
    import hashlib

    manifest = build(tmp_path / "site")
    site = tmp_path / "site"
    build_id, files = _sw_files(site)
    assert build_id == manifest["build"]
    listed = {f["path"] for f in files}
    on_disk = {p.relative_to(site).as_posix() for p in site.rglob("*") if p.is_file()}
    assert listed == on_disk - {"sw.js"}  # the browser keeps the worker script itself
    for f in files:
        if f["path"] == "manifest.json":
            assert f["integrity"] == ""  # written after sw.js; the worker checks its build field
            continue
        digest = hashlib.sha256((site / f["path"]).read_bytes()).digest()
        assert f["integrity"] == "sha256-" + base64.b64encode(digest).decode()


def test_build_hash_follows_the_content(tmp_path):
    a = build(tmp_path / "a")
    b = build(tmp_path / "b")
    c = build(tmp_path / "c", extra_files={STAMP: b"changed"})
    assert a["build"] == b["build"]  # same sources, same build: no needless reinstall
    assert c["build"] != a["build"]
    assert _sw_files(tmp_path / "a")[0] == a["build"] and _sw_files(tmp_path / "c")[0] == c["build"]


def _png_size(data: bytes) -> tuple[int, int]:
    assert data[:8] == b"\x89PNG\r\n\x1a\n" and data[12:16] == b"IHDR"
    return struct.unpack(">II", data[16:24])


def test_web_app_manifest_makes_the_page_installable(tmp_path):
    build(tmp_path / "site")
    site = tmp_path / "site"
    app = json.loads((site / "manifest.webmanifest").read_text(encoding="utf-8"))
    assert app["name"] and app["short_name"] == "Linesmith"
    assert app["start_url"] == "." and app["display"] == "standalone"
    assert re.fullmatch(r"#[0-9a-f]{6}", app["theme_color"]) and re.fullmatch(r"#[0-9a-f]{6}", app["background_color"])
    sizes = set()
    for icon in app["icons"]:
        data = (site / icon["src"]).read_bytes()  # every icon is shipped
        if icon["type"] == "image/png":
            w, h = _png_size(data)
            assert icon["sizes"] == f"{w}x{h}"
            sizes.add(w)
        else:
            assert data.lstrip().startswith(b"<svg")
    # Chromium's installability check wants a 192 px and a 512 px icon (common practice, no source).
    assert {192, 512} <= sizes
    html = (site / "index.html").read_text(encoding="utf-8")
    assert 'rel="manifest" href="./manifest.webmanifest"' in html
    assert 'src="./offline.js"' in html


# --------------------------------------------------------------------------
# in the browser


@pytest.fixture(scope="module")
def browser(chromium):
    with launched_chromium(chromium) as (browser, _):
        yield browser


def _watch(context):
    """Record every request of the context (pages, workers, service worker) and console lines."""
    log = {"requests": [], "console": []}
    context.on("request", lambda request: log["requests"].append(request.url))
    context.add_init_script(CSP_LISTENER)
    return log


def _new_page(context, log):
    page = context.new_page()
    page.on("console", lambda m: log["console"].append(f"{m.type}: {m.text}"))
    page.on("pageerror", lambda e: log["console"].append(f"pageerror: {e}"))
    return page


def _wait(page, attribute, wanted, log, others=("failed",)):
    states = [wanted, *others]
    selector = ", ".join(f'body[data-{attribute}="{s}"]' for s in states)
    page.wait_for_selector(selector, timeout=BOOT_TIMEOUT_MS, state="attached")
    state = page.get_attribute("body", f"data-{attribute}")
    if state != wanted:
        pytest.fail(f"data-{attribute}={state!r}, wanted {wanted!r}: {page.inner_text('body')[:400]}\n"
                    + "\n".join(log["console"][-20:]))


def _assert_same_origin(log, base_url):
    origin = urlsplit(base_url)[:2]
    foreign = sorted({u for u in log["requests"] if urlsplit(u)[:2] != origin})
    assert log["requests"] and not foreign, f"requests left the origin: {foreign}"


@pytest.fixture()
def plain_static_server(tmp_path):
    """dist/ served by `python -m http.server -d DIR -b 127.0.0.1 PORT`, as the README says."""
    site = tmp_path / "site"
    build(site)
    proc = subprocess.Popen([sys.executable, "-u", "-m", "http.server", "-d", str(site), "-b", "127.0.0.1", "0"],
                            stdout=subprocess.PIPE, stderr=subprocess.DEVNULL, text=True)
    try:
        line = proc.stdout.readline()  # "Serving HTTP on 127.0.0.1 port N (http://127.0.0.1:N/) ..."
        port = re.search(r"port (\d+)", line).group(1)
        yield f"http://127.0.0.1:{port}/"
    finally:
        proc.terminate()
        proc.wait(timeout=10)


def test_page_loads_and_computes_offline_after_one_visit(browser, plain_static_server, tmp_path):
    url = plain_static_server
    plain_static_server_site = tmp_path / "site"
    context = browser.new_context()
    log = _watch(context)
    page = _new_page(context, log)
    page.goto(url)
    _wait(page, "engine", "ready", log)
    _wait(page, "offline", "ready", log)  # the whole build is stored
    keys = page.evaluate("caches.keys()")
    assert len(keys) == 1 and keys[0].startswith("linesmith-"), keys

    context.set_offline(True)
    started = time.perf_counter()
    page.reload()
    _wait(page, "engine", "ready", log)  # first result on screen, computed with no network
    timings = json.loads(page.get_attribute("body", "data-worker-timings") or "{}")
    print(f"\noffline reload to first result: {time.perf_counter() - started:.2f} s, worker {timings}")
    # The engine ran from the bytecode build.py compiled (when the build had Node.js to do it).
    assert timings.get("bytecode") is (plain_static_server_site / "wheels" / BYTECODE_FILE).exists(), timings
    assert page.evaluate("navigator.serviceWorker.controller !== null")
    # Truly offline: a file that is not part of the build cannot be fetched.
    assert page.evaluate("fetch('./not-in-the-build.txt').then(() => 'online', () => 'offline')") == "offline"
    assert page.evaluate("window.__cspViolations") == []
    _assert_same_origin(log, url)
    context.close()


def test_new_build_replaces_the_cache_without_mixing_builds(browser, tmp_path):
    site = tmp_path / "site"
    first = build(site, extra_files={STAMP: b"first"})
    with serve_directory(site) as url:
        context = browser.new_context()
        log = _watch(context)
        page = _new_page(context, log)
        page.goto(url)
        _wait(page, "engine", "ready", log)
        _wait(page, "offline", "ready", log)

        # The service worker and the Pyodide worker run under the page's policy: it
        # comes with every response, also those answered from the cache.
        csp = CONTENT_SECURITY_POLICY
        for path in ("sw.js", "worker.js", "index.html", "pyodide/pyodide.mjs"):
            got = page.evaluate("(p) => fetch(p).then((r) => r.headers.get('content-security-policy'))", path)
            assert got == csp, path
        assert "'wasm-unsafe-eval'" in csp and "worker-src 'self'" in csp
        assert "'unsafe-eval'" not in csp and "'unsafe-inline'" not in csp and "http" not in csp

        second = build(site, extra_files={STAMP: b"second"})
        assert second["build"] != first["build"]
        page.reload()  # the update check finds the new sw.js; it installs beside the old one
        _wait(page, "engine", "ready", log)
        _wait(page, "offline", "update-waiting", log)
        stamp = "() => fetch('./build-stamp.txt').then((r) => r.text())"
        build_of = "() => fetch('./manifest.json').then((r) => r.json()).then((m) => m.build)"
        # The open page of the first build is still served the first build only.
        assert page.evaluate(stamp) == "first"
        assert page.evaluate(build_of) == first["build"]
        assert sorted(page.evaluate("caches.keys()")) == sorted(
            [f"linesmith-{first['build']}", f"linesmith-{second['build']}"])

        with page.expect_navigation():
            assert page.evaluate("window.linesmithOffline.applyUpdate()") is True
        _wait(page, "engine", "ready", log)
        _wait(page, "offline", "ready", log)
        assert page.evaluate("caches.keys()") == [f"linesmith-{second['build']}"]  # the old cache is gone
        assert page.evaluate(stamp) == "second"
        assert page.evaluate(build_of) == second["build"]
        assert page.evaluate("window.__cspViolations") == []
        assert not [m for m in log["console"] if "Content Security Policy" in m], log["console"]
        _assert_same_origin(log, url)
        context.close()


# What the README says a plain static server loses (checked below in the browser).
README_PLAIN_SERVER = ("A plain static server sends neither header, so the engine's worker runs with no "
                       "Content-Security-Policy")
_FOREIGN_FETCH = "(url) => fetch(url, {mode: 'no-cors'}).then(() => 'fetched', (e) => 'refused: ' + e.name)"


def _app_worker(page):
    page.wait_for_function("() => document.body.dataset.engine !== undefined", timeout=BOOT_TIMEOUT_MS)
    deadline = time.monotonic() + BOOT_TIMEOUT_MS / 1000
    while time.monotonic() < deadline:
        workers = [w for w in page.workers if urlsplit(w.url).path.endswith("/worker.js")]
        if workers:
            return workers[0]
        page.wait_for_timeout(50)
    pytest.fail("the page started no engine worker")


def test_a_plain_server_leaves_the_worker_without_its_policy_as_the_readme_says(browser, plain_static_server,
                                                                               tmp_path):
    # Source: stated behaviour (README "Using the calculator offline"; issue 16): a worker takes its
    # policy from its own response headers only. Under `python build.py serve` the worker cannot reach
    # another origin; under a plain static server it can, while the page (meta policy) still cannot.
    from pathlib import Path
    readme = " ".join((Path(__file__).resolve().parents[2] / "README.md").read_text(encoding="utf-8").split())
    assert README_PLAIN_SERVER in readme
    other = tmp_path / "other"
    other.mkdir()
    (other / "probe.txt").write_text("another origin", encoding="utf-8")
    import urllib.request
    with urllib.request.urlopen(plain_static_server + "worker.js", timeout=10) as response:
        assert response.headers["Content-Security-Policy"] is None and response.headers["X-Content-Type-Options"] is None
    with urllib.request.urlopen(plain_static_server + "wheels/", timeout=10) as response:
        assert b"Directory listing" in response.read()  # the README says a plain server lists folders
    with serve_directory(tmp_path / "site") as served, serve_directory(other) as foreign:
        for url, worker_gets in ((served, "refused: TypeError"), (plain_static_server, "fetched")):
            context = browser.new_context(service_workers="block")
            page = context.new_page()
            page.goto(url)
            worker = _app_worker(page)
            assert worker.evaluate(_FOREIGN_FETCH, foreign + "probe.txt") == worker_gets, url
            assert page.evaluate(_FOREIGN_FETCH, foreign + "probe.txt") == "refused: TypeError", url
            context.close()
