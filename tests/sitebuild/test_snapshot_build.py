"""The engine snapshot's build step (sitebuild/snapshot.py): cache keys, no Node.js, wrong Pyodide.

The checks here are of hashes and of Pyodide's snapshot header; the header's layout is read
from Pyodide's own code (pyodide.asm.mjs 314.0.7, API.makeSnapshot / API.restoreSnapshot:
uint32 words magic 1886286592, header size, JSON length, 0, then BUILD_ID as eight words).
"""
from __future__ import annotations

import gzip
import json
import re
import shutil
import struct

import pytest

from sitebuild import snapshot as snap
from sitebuild.assemble import build
from sitebuild.common import CACHE_DIR, sha256_file


@pytest.fixture(scope="module")
def site(tmp_path_factory):
    """One build with the snapshot (Node.js is part of this project's build, see the README)."""
    out = tmp_path_factory.mktemp("snapbuild") / "site"
    manifest = build(out)
    assert (out / snap.SNAPSHOT_FILE).exists(), "the build made no engine snapshot (is Node.js installed?)"
    return out, manifest


def _config(site_dir):
    html = (site_dir / "index.html").read_text(encoding="utf-8")
    return json.loads(re.search(r'<script type="application/json" id="linesmith-config">(.*?)</script>', html).group(1))


def _sw_files(site_dir):
    text = (site_dir / "sw.js").read_text(encoding="utf-8")
    return (re.search(r'const BUILD = "([0-9a-f]{64})";', text).group(1),
            json.loads(re.search(r"const FILES = (\[.*?\]);\n", text).group(1)))


def test_cache_key_follows_every_input_and_nothing_else(tmp_path, monkeypatch):
    key = snap.cache_key("a" * 64)
    assert snap.cache_key("a" * 64) == key  # the same inputs, the same key
    assert snap.cache_key("b" * 64) != key  # another engine build
    for script in ("NODE_SCRIPT", "WARMUP_SCRIPT"):
        changed = tmp_path / f"{script}.txt"
        changed.write_bytes(getattr(snap, script).read_bytes() + b"\n# changed")
        monkeypatch.setattr(snap, script, changed)
        assert snap.cache_key("a" * 64) != key, script
        monkeypatch.undo()


def test_engine_build_covers_pyodide_wheels_and_boot_module_only(site, tmp_path):
    site_dir, _ = site
    copy = tmp_path / "copy"
    shutil.copytree(site_dir, copy)
    base = snap.engine_build_hash(copy)
    assert base == _config(site_dir)["snapshot"]["engine_build"]
    (copy / "index.html").write_text("changed", encoding="utf-8")  # the page is not part of it
    (copy / snap.SNAPSHOT_FILE).write_bytes(b"changed")  # nor is the snapshot itself
    assert snap.engine_build_hash(copy) == base
    for rel in ("linesmith_boot.py", "wheels/bytecode-cp314.zip", "pyodide/pyodide-lock.json"):
        target = copy / rel
        original = target.read_bytes()
        target.write_bytes(original + b" ")
        assert snap.engine_build_hash(copy) != base, rel
        target.write_bytes(original)


def test_manifest_and_precache_carry_the_snapshot_and_the_build_hash_leaves_it_out(site, tmp_path):
    import base64
    import hashlib

    site_dir, manifest = site
    digest = sha256_file(site_dir / snap.SNAPSHOT_FILE)
    assert manifest["snapshot"] == {"path": snap.SNAPSHOT_FILE, "sha256": digest,
                                    "engine_build": _config(site_dir)["snapshot"]["engine_build"]}
    assert {"path": snap.SNAPSHOT_FILE, "size": (site_dir / snap.SNAPSHOT_FILE).stat().st_size,
            "sha256": digest} in manifest["files"]
    build_id, files = _sw_files(site_dir)
    entry = next(f for f in files if f["path"] == snap.SNAPSHOT_FILE)
    assert entry == {"path": snap.SNAPSHOT_FILE, "snapshot": True,
                     "integrity": "sha256-" + base64.b64encode(hashlib.sha256(
                         (site_dir / snap.SNAPSHOT_FILE).read_bytes()).digest()).decode()}
    # Other snapshot bytes, same build hash; the precache names the other bytes.
    other = build(tmp_path / "other", extra_files={snap.SNAPSHOT_FILE: b"other bytes"})
    assert other["build"] == manifest["build"]
    assert _sw_files(tmp_path / "other")[1] != files


def test_build_without_node_ships_no_snapshot_and_says_so(tmp_path, capsys):
    cache = tmp_path / "cache"
    cache.mkdir()
    for item in CACHE_DIR.iterdir():  # Pyodide, the wheels and the bytecode, but no snapshot
        if item.name != "snapshot":
            (shutil.copytree if item.is_dir() else shutil.copyfile)(item, cache / item.name)
    manifest = build(tmp_path / "site", cache_dir=cache, node=None)
    assert "Node.js is not installed" in capsys.readouterr().err
    assert not (tmp_path / "site" / snap.SNAPSHOT_FILE).exists()
    assert "snapshot" not in manifest and "snapshot" not in _config(tmp_path / "site")
    assert all(not f.get("snapshot") for f in _sw_files(tmp_path / "site")[1])


def _rewrite_header(gz_src, gz_dst, build_id=None, magic=None):
    raw = bytearray(gzip.decompress(gz_src.read_bytes()))
    if magic is not None:
        struct.pack_into("<I", raw, 0, magic)
    if build_id is not None:
        struct.pack_into("<8I", raw, 16, *[int(build_id[i:i + 8], 16) for i in range(0, 64, 8)])
    gz_dst.write_bytes(gzip.compress(bytes(raw), compresslevel=1))


def test_snapshot_of_another_pyodide_is_refused(site, tmp_path, capsys):
    site_dir, _ = site
    pyodide_dir = site_dir / "pyodide"
    real = site_dir / snap.SNAPSHOT_FILE
    shutil.copyfile(real, tmp_path / "real.gz")
    (tmp_path / "real.gz.json").write_text(json.dumps({"pyodide": "314.0.7"}), encoding="utf-8")
    assert snap.check_snapshot(tmp_path / "real.gz", pyodide_dir)["pyodide"] == "314.0.7"
    # Source: Pyodide's header layout (module docstring): the shipped BUILD_ID is the one in pyodide.mjs.
    assert snap.snapshot_build_id(real) == snap.pyodide_build_id(pyodide_dir)

    _rewrite_header(real, tmp_path / "other-build.gz", build_id="0" * 64)
    shutil.copyfile(tmp_path / "real.gz.json", tmp_path / "other-build.gz.json")
    with pytest.raises(snap.SnapshotRefused, match="made by Pyodide build 000000000000"):
        snap.check_snapshot(tmp_path / "other-build.gz", pyodide_dir)

    shutil.copyfile(real, tmp_path / "old.gz")
    (tmp_path / "old.gz.json").write_text(json.dumps({"pyodide": "0.27.7"}), encoding="utf-8")
    with pytest.raises(snap.SnapshotRefused, match="made by Pyodide 0.27.7"):
        snap.check_snapshot(tmp_path / "old.gz", pyodide_dir)

    _rewrite_header(real, tmp_path / "not.gz", magic=1)
    shutil.copyfile(tmp_path / "real.gz.json", tmp_path / "not.gz.json")
    with pytest.raises(snap.SnapshotRefused, match="wrong magic number"):
        snap.check_snapshot(tmp_path / "not.gz", pyodide_dir)

    # A refused snapshot in the cache is never shipped: deleted, the build goes on without it.
    stage = tmp_path / "stage"
    shutil.copytree(site_dir, stage)
    (stage / snap.SNAPSHOT_FILE).unlink()
    cache = tmp_path / "cache"
    cached = cache / "snapshot" / f"{snap.cache_key(snap.engine_build_hash(stage))}.gz"
    cached.parent.mkdir(parents=True)
    shutil.copyfile(tmp_path / "other-build.gz", cached)
    shutil.copyfile(tmp_path / "real.gz.json", f"{cached}.json")
    assert snap.add_snapshot(stage, cache, node=None) is None
    assert "refused" in capsys.readouterr().err
    assert not cached.exists() and not (stage / snap.SNAPSHOT_FILE).exists()
