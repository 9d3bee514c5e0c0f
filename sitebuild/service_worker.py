"""The offline files: sw.js's precache list and build hash, and dist/manifest.json."""

from __future__ import annotations

import base64
import hashlib
import json
from pathlib import Path

from .common import BuildError, sha256_file
from .fetch import PYODIDE_VERSION
from .snapshot import SNAPSHOT_FILE

# Placeholders in site/static/sw.js that write_service_worker fills in.
SW_BUILD_MARK = "__LINESMITH_BUILD__"
SW_FILES_MARK = "/*__LINESMITH_FILES__*/[]"


def _file_entries(out_dir: Path, skip: tuple[str, ...] = ("manifest.json",)) -> list[dict]:
    """{path, size, sha256} of every file under out_dir but those in skip, sorted by path."""
    files = []
    for path in sorted(out_dir.rglob("*")):
        rel = path.relative_to(out_dir).as_posix()
        if path.is_file() and rel not in skip:
            files.append({"path": rel, "size": path.stat().st_size, "sha256": sha256_file(path)})
    return files


def _hash_entries(entries: list[dict], salt: bytes = b"") -> str:
    """One sha256 over the entries' paths, sizes and hashes (after salt)."""
    h = hashlib.sha256(salt)
    for entry in entries:
        h.update(f"{entry['path']}\0{entry['size']}\0{entry['sha256']}\n".encode())
    return h.hexdigest()


def write_service_worker(out_dir: Path) -> str:
    """Fill out_dir/sw.js with the build hash and the precache list; return the build hash.

    The precache list is every file of out_dir except sw.js itself (browsers keep
    the worker script apart) with its sha256 as a Subresource Integrity value;
    manifest.json, written afterwards, is listed without one (the service worker
    checks its ``build`` field instead). The build hash covers every listed file
    and the sw.js template, so it changes whenever any shipped byte changes, and
    it is the ``build`` value of manifest.json. The engine snapshot is listed (marked
    ``snapshot``: the service worker keeps the build without it when it is bad) but left
    out of the build hash: the snapshot records the engine build hash instead
    (sitebuild/snapshot.py), so the two hashes never refer to each other.
    """
    sw_path = out_dir / "sw.js"
    template = sw_path.read_text(encoding="utf-8")
    if SW_BUILD_MARK not in template or SW_FILES_MARK not in template:
        raise BuildError("site/static/sw.js lacks its build placeholders; restore them from git.")
    entries = _file_entries(out_dir, skip=("manifest.json", "sw.js"))
    build_id = _hash_entries([e for e in entries if e["path"] != SNAPSHOT_FILE],
                             salt=hashlib.sha256(template.encode()).digest())
    files = [{"path": e["path"],
              "integrity": "sha256-" + base64.b64encode(bytes.fromhex(e["sha256"])).decode("ascii"),
              **({"snapshot": True} if e["path"] == SNAPSHOT_FILE else {})}
             for e in entries]
    files.append({"path": "manifest.json", "integrity": ""})
    text = template.replace(SW_BUILD_MARK, build_id, 1).replace(
        SW_FILES_MARK, json.dumps(files, separators=(",", ":")), 1)
    sw_path.write_text(text, encoding="utf-8")
    return build_id


def write_manifest(out_dir: Path, build_id: str | None = None, snapshot: dict | None = None) -> dict:
    """Write out_dir/manifest.json: every file with size and sha256, and a build hash.

    build_id is the hash write_service_worker put into sw.js; without one, the
    hash of the listed files is used. snapshot (the engine snapshot's page config, or
    None) adds {"snapshot": {path, sha256, engine_build}}.
    """
    files = _file_entries(out_dir)
    manifest = {
        "version": 1,
        "build": build_id or _hash_entries(files),
        "pyodide": PYODIDE_VERSION,
        "total_bytes": sum(e["size"] for e in files),
        "files": files,
    }
    if snapshot:
        manifest["snapshot"] = {"path": SNAPSHOT_FILE, "sha256": snapshot["sha256"],
                                "engine_build": snapshot["engine_build"]}
    (out_dir / "manifest.json").write_text(json.dumps(manifest, indent=1) + "\n", encoding="utf-8")
    return manifest
