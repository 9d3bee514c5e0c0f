"""What every step of the build shares: folders, the error type, file hashes, the security policy."""

from __future__ import annotations

import base64
import hashlib
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
CACHE_DIR = ROOT / ".buildcache"
DIST_DIR = ROOT / "dist"
SITE_DIR = ROOT / "site"
DEMO_DIR = ROOT / "calc" / "data" / "demos"

# Only our own origin; 'wasm-unsafe-eval' lets the browser compile Pyodide's
# WebAssembly. Sent as a meta tag in the page and as a header by `serve`
# (a worker takes its policy from its own response headers, not the page's).
CONTENT_SECURITY_POLICY = (
    "default-src 'self'; script-src 'self' 'wasm-unsafe-eval'; worker-src 'self'; "
    "connect-src 'self'; img-src 'self'; style-src 'self'; font-src 'self'; "
    "object-src 'none'; base-uri 'none'; form-action 'self'"
)

# Zip entries get a fixed date so the same sources give the same bytes.
ZIP_DATE = (1980, 1, 1, 0, 0, 0)


class BuildError(Exception):
    """A problem the user can fix; the message is one plain sentence."""


def _digest_file(path: Path, h):
    with open(path, "rb") as f:
        for block in iter(lambda: f.read(1 << 20), b""):
            h.update(block)
    return h


def sha256_file(path: Path) -> str:
    """Return the hex sha256 of a file."""
    return _digest_file(path, hashlib.sha256()).hexdigest()


def integrity_of(path: Path) -> str:
    """Return the npm-style ``sha512-<base64>`` integrity string of a file."""
    return "sha512-" + base64.b64encode(_digest_file(path, hashlib.sha512()).digest()).decode("ascii")
