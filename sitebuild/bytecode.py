"""Bytecode for the browser's Python, and the lazy-import table of linesmith_boot.py.

The browser runs CPython 3.14 (Pyodide), whose bytecode the build's Python
cannot write. Pyodide itself can: the build boots the very Pyodide it ships
under Node.js (already needed to fetch it), installs the three wheels, imports
what the engine imports at start (through linesmith_boot's lazy packages, as
the browser does) and writes checked-hash .pyc files (Python checks each
against its source's hash on import, so a stale one is never run). Compiling
in the browser instead costs about 0.85 s of every start (bench/browser_bench.py).

compile_in_pyodide.mjs (the Node.js side) and compile_in_pyodide.py (what runs
in Pyodide) sit beside this file. The result is cached in .buildcache/bytecode/
by the hash of every input, those two files included.
"""

from __future__ import annotations

import hashlib
import json
import os
import shutil
import subprocess
import tempfile
import zipfile
from pathlib import Path

from .common import CACHE_DIR, SITE_DIR, BuildError, sha256_file
from .fetch import PYODIDE_INTEGRITY

BYTECODE_FILE = "bytecode-cp314.zip"
# The modules the page imports at start; the engine's bytecode covers what they import.
BYTECODE_IMPORTS = ("calc.edges.api", "calc.pipeline")

NODE_SCRIPT = Path(__file__).with_name("compile_in_pyodide.mjs")
PYODIDE_SCRIPT = Path(__file__).with_name("compile_in_pyodide.py")
BOOT_MODULE = SITE_DIR / "static" / "linesmith_boot.py"
LAZY_MARK = "LAZY_NAMES = {}  # filled in by build.py"
TABLE_NAME = "linesmith-lazy-names.json"  # written by compile_in_pyodide.py
KEEP_CACHED = 4  # one zip per engine version: keep the few newest


def _cache_key(wheels: list[Path]) -> str:
    """Hash of every input of the compile: Pyodide, both scripts, the imports, boot module, wheels."""
    h = hashlib.sha256(PYODIDE_INTEGRITY.encode() + NODE_SCRIPT.read_bytes() + PYODIDE_SCRIPT.read_bytes()
                       + repr(BYTECODE_IMPORTS).encode() + BOOT_MODULE.read_bytes())
    for wheel in wheels:
        h.update(wheel.name.encode() + bytes.fromhex(sha256_file(wheel)))
    return h.hexdigest()


def _run_in_node(node: str, pyodide_dir: Path, wheels: list[Path], zipped: Path) -> bool:
    """Run the compile under Node.js into zipped; True when it wrote a zip."""
    command = [node, str(NODE_SCRIPT), str(pyodide_dir.resolve()), str(zipped), str(PYODIDE_SCRIPT),
               str(BOOT_MODULE), json.dumps(list(BYTECODE_IMPORTS)), *[str(w.resolve()) for w in wheels]]
    try:
        proc = subprocess.run(command, capture_output=True, text=True, timeout=300)
    except (OSError, subprocess.TimeoutExpired):
        return False
    return proc.returncode == 0 and zipped.exists() and zipfile.is_zipfile(zipped)


def compile_bytecode(pyodide_dir: Path, wheels: list[Path], out: Path, cache_dir: Path = CACHE_DIR) -> dict | None:
    """Write the engine's start-up modules as Python 3.14 bytecode (a zip of __pycache__ files).

    Returns the lazy-import table ({package: {name: submodule}}) for linesmith_boot.py, or
    None, writing nothing, when Node.js is missing or the compile fails: the page then
    works as before, compiling in the browser and importing the packages whole.
    """
    cached = cache_dir / "bytecode" / f"{_cache_key(wheels)}.zip"
    if not cached.exists():
        node = shutil.which("node")
        if node is None:
            return None
        cached.parent.mkdir(parents=True, exist_ok=True)
        with tempfile.TemporaryDirectory(dir=cached.parent) as tmp:
            zipped = Path(tmp) / "out.zip"
            if not _run_in_node(node, pyodide_dir, wheels, zipped):
                return None
            os.replace(zipped, cached)
        for stale in sorted(cached.parent.glob("*.zip"), key=lambda p: p.stat().st_mtime)[:-KEEP_CACHED]:
            stale.unlink(missing_ok=True)
    with zipfile.ZipFile(cached) as zf:
        table = json.loads(zf.read(TABLE_NAME))
    shutil.copyfile(cached, out)
    return table


def write_boot_module(out_dir: Path, table: dict | None) -> None:
    """Fill the lazy-import table into out_dir/linesmith_boot.py (empty table: plain imports)."""
    path = out_dir / "linesmith_boot.py"
    text = path.read_text(encoding="utf-8")
    if LAZY_MARK not in text:
        raise BuildError("site/static/linesmith_boot.py lacks its LAZY_NAMES line; restore it from git.")
    path.write_text(text.replace(LAZY_MARK, f"LAZY_NAMES = {json.dumps(table or {}, sort_keys=True)}", 1),
                    encoding="utf-8")
