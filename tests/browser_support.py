"""Browser helpers for the Playwright tests: find a Chromium, serve dist/, collect requests.

Kept out of conftest.py on purpose: only the browser tests import this.
"""

from __future__ import annotations

import importlib.util
import os
import shutil
import sys
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
    "No Chromium found for the browser tests. Install one: `apt-get install chromium` on "
    "Debian/Ubuntu, or `python -m playwright install chromium` elsewhere; or set "
    "LINESMITH_CHROMIUM to the path of a Chromium executable."
)


def load_build_module():
    """Import the repository's build.py as a module (it is a script, not a package)."""
    if "linesmith_build" in sys.modules:
        return sys.modules["linesmith_build"]
    spec = importlib.util.spec_from_file_location("linesmith_build", ROOT / "build.py")
    module = importlib.util.module_from_spec(spec)
    sys.modules["linesmith_build"] = module
    spec.loader.exec_module(module)
    return module


def find_chromium(playwright) -> tuple[str | None, str]:
    """Return (executable_path or None for Playwright's own, description).

    Order: $LINESMITH_CHROMIUM, Playwright's managed Chromium, /usr/bin/chromium.
    Raises RuntimeError with install instructions when none is usable.
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
    for candidate in ("/usr/bin/chromium", "/usr/bin/chromium-browser"):
        if Path(candidate).is_file():
            return candidate, candidate
    raise RuntimeError(HOW_TO_INSTALL)


@contextmanager
def serve_directory(directory: Path):
    """Serve directory on a free loopback port in a thread; yield the base URL."""
    build = load_build_module()
    server = build.make_server(directory, port=0, quiet=True)
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
