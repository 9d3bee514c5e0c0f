"""The engine's memory snapshot: made at build time under Node.js, restored by the page's worker.

The page's worker can start from a snapshot of a Pyodide runtime that has the engine
loaded and warmed up (``site/static/pyodide_snapshot.mjs``), instead of booting Python and
importing the engine at every visit. The build makes it with the very Pyodide it ships:
make_snapshot.mjs boots it under Node.js with ``_makeSnapshot``, unpacks the wheels and the
bytecode zip, runs snapshot_warmup.py (every engine module imported, every API operation
run once on the demos) and gzips ``makeMemorySnapshot()``.

The *engine build* hash covers exactly what the snapshot is made of: every file of
``pyodide/`` and ``wheels/`` and the filled-in ``linesmith_boot.py``. The snapshot records
it (``linesmith_boot.SNAPSHOT_OF``), the page's config carries it, and the worker compares
the two after a restore. The build hash of sw.js and the manifest leaves the snapshot file
out, so neither hash refers to the other.

The snapshot is cached in ``.buildcache/snapshot/`` by the engine build and the hashes of
both scripts. Without Node.js, or when making it fails, the build goes on without one and
says so: the page then boots as before. A snapshot whose header names another Pyodide build
than the one shipped is refused (never shipped).
"""

from __future__ import annotations

import gzip
import hashlib
import json
import os
import re
import shutil
import struct
import subprocess
import sys
import tempfile
from pathlib import Path

from .common import CACHE_DIR, sha256_file
from .fetch import PYODIDE_VERSION

SNAPSHOT_FILE = "engine.snapshot"  # gzip inside; a name no server would send with Content-Encoding
NODE_SCRIPT = Path(__file__).with_name("make_snapshot.mjs")
WARMUP_SCRIPT = Path(__file__).with_name("snapshot_warmup.py")
KEEP_CACHED = 3
TIMEOUT_S = 600
# How long the page lets a snapshot start take before it ends that worker and boots plainly
# (start.js). A restore here takes about 1.5 s from the worker's creation, a plain boot 4-5 s.
RESTORE_LIMIT_MS = 10_000
# Pyodide's snapshot header (pyodide.asm.mjs 314.0.7, API.makeSnapshot): uint32 words, little
# endian: magic, header size, JSON length, 0, then the runtime's BUILD_ID as eight words.
SNAPSHOT_MAGIC = 1886286592
HEADER_BYTES = 48
BUILD_ID_RE = re.compile(rb'BUILD_ID:"([0-9a-f]{64})"')


class SnapshotRefused(Exception):
    """The snapshot does not belong to the shipped Pyodide; the message says why."""


def engine_build_hash(stage: Path) -> str:
    """sha256 over every file of pyodide/ and wheels/ and the boot module, by path."""
    h = hashlib.sha256(b"linesmith-engine-build-1\n")
    files = sorted([*(stage / "pyodide").rglob("*"), *(stage / "wheels").rglob("*"), stage / "linesmith_boot.py"])
    for path in files:
        if path.is_file():
            h.update(f"{path.relative_to(stage).as_posix()}\0{sha256_file(path)}\n".encode())
    return h.hexdigest()


def cache_key(engine_build: str) -> str:
    """The snapshot's inputs: the engine build and both scripts that make it."""
    h = hashlib.sha256(engine_build.encode())
    for script in (NODE_SCRIPT, WARMUP_SCRIPT):
        h.update(hashlib.sha256(script.read_bytes()).digest())
    return h.hexdigest()


def pyodide_build_id(pyodide_dir: Path) -> str:
    """The BUILD_ID the shipped pyodide.mjs stamps into (and demands of) a snapshot."""
    found = BUILD_ID_RE.search((pyodide_dir / "pyodide.mjs").read_bytes())
    if not found:
        raise SnapshotRefused("the shipped pyodide.mjs names no BUILD_ID; this Pyodide cannot restore snapshots")
    return found.group(1).decode("ascii")


def snapshot_build_id(gz_path: Path) -> str:
    """The Pyodide BUILD_ID recorded in a gzip-compressed snapshot's header."""
    try:
        with gzip.open(gz_path, "rb") as f:
            header = f.read(HEADER_BYTES)
    except (OSError, EOFError) as exc:
        raise SnapshotRefused(f"the snapshot is not readable gzip ({exc})") from None
    if len(header) < HEADER_BYTES or struct.unpack_from("<I", header)[0] != SNAPSHOT_MAGIC:
        raise SnapshotRefused("the file is not a Pyodide memory snapshot (wrong magic number)")
    return "".join(f"{w:08x}" for w in struct.unpack_from("<8I", header, 16))


def check_snapshot(gz_path: Path, pyodide_dir: Path) -> dict:
    """Refuse a snapshot made by another Pyodide than the one in pyodide_dir; return its info."""
    info_path = Path(f"{gz_path}.json")
    info = json.loads(info_path.read_text(encoding="utf-8")) if info_path.exists() else {}
    if info.get("pyodide") != PYODIDE_VERSION:
        raise SnapshotRefused(f"the snapshot was made by Pyodide {info.get('pyodide')}, "
                              f"the page ships {PYODIDE_VERSION}")
    made_by, shipped = snapshot_build_id(gz_path), pyodide_build_id(pyodide_dir)
    if made_by != shipped:
        raise SnapshotRefused(f"the snapshot was made by Pyodide build {made_by[:12]}, "
                              f"the page ships build {shipped[:12]}")
    return info


def _make(node: str, stage: Path, engine_build: str, out: Path) -> str:
    """Run make_snapshot.mjs into out (and out.json); "" on success, else what went wrong."""
    wheels = sorted((stage / "wheels").glob("*.whl"), key=lambda p: (not p.name.startswith("linesmith-"), p.name))
    archives = [*wheels, *sorted((stage / "wheels").glob("*.zip"))]
    command = [node, str(NODE_SCRIPT), str((stage / "pyodide").resolve()), str(out), str(WARMUP_SCRIPT),
               str(stage / "linesmith_boot.py"), engine_build, *[str(a.resolve()) for a in archives]]
    try:
        proc = subprocess.run(command, capture_output=True, text=True, timeout=TIMEOUT_S)
    except (OSError, subprocess.TimeoutExpired) as exc:
        return f"Node.js did not finish ({exc})"
    if proc.returncode != 0 or not out.exists():
        # Node prints the failing line of Pyodide's minified source too: keep the short lines.
        lines = [ln.strip() for ln in (proc.stderr or proc.stdout).splitlines() if 0 < len(ln.strip()) < 300]
        errors = [ln for ln in lines if "Error" in ln] or lines
        return f"Node.js failed ({errors[-1] if errors else f'exit status {proc.returncode}'})"
    return ""


def _say(message: str) -> None:
    print(f"Engine snapshot: {message}", file=sys.stderr)


def add_snapshot(stage: Path, cache_dir: Path = CACHE_DIR, node: str | None = "auto") -> dict | None:
    """Put the engine's snapshot into stage; return its page config, or None without one.

    node: the Node.js executable ("auto": the one on PATH; None: as if there were none).
    The config ({url, engine_build, version, sha256, bytes}) goes into the page's config.
    """
    engine_build = engine_build_hash(stage)
    cached = cache_dir / "snapshot" / f"{cache_key(engine_build)}.gz"
    if not cached.exists():
        node = shutil.which("node") if node == "auto" else node
        if node is None:
            _say("skipped: Node.js is not installed; the page boots without it (about 3 s slower).")
            return None
        cached.parent.mkdir(parents=True, exist_ok=True)
        with tempfile.TemporaryDirectory(dir=cached.parent) as tmp:
            out = Path(tmp) / "snapshot.gz"
            problem = _make(node, stage, engine_build, out)
            if problem:
                _say(f"skipped: {problem}; the page boots without it.")
                return None
            os.replace(Path(f"{out}.json"), Path(f"{cached}.json"))
            os.replace(out, cached)
        for stale in sorted(cached.parent.glob("*.gz"), key=lambda p: p.stat().st_mtime)[:-KEEP_CACHED]:
            stale.unlink(missing_ok=True)
            Path(f"{stale}.json").unlink(missing_ok=True)
    try:
        check_snapshot(cached, stage / "pyodide")
    except SnapshotRefused as exc:
        _say(f"refused: {exc}; the page boots without it.")
        cached.unlink(missing_ok=True)
        return None
    shutil.copyfile(cached, stage / SNAPSHOT_FILE)
    import calc  # build time: the engine's version, as the snapshot recorded it
    info = json.loads(Path(f"{cached}.json").read_text(encoding="utf-8"))
    return {"url": f"./{SNAPSHOT_FILE}", "engine_build": engine_build, "version": calc.__version__,
            "pyodide": PYODIDE_VERSION, "sha256": sha256_file(cached), "bytes": cached.stat().st_size,
            "raw_bytes": info["bytes_raw"],
            "limit_ms": RESTORE_LIMIT_MS}
