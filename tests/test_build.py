"""Checks of build.py that need no browser: manifest, wheel, missing-npm message."""

from __future__ import annotations

import hashlib
import zipfile

import pytest

from .browser_support import load_build_module

build = load_build_module()


def test_missing_npm_gives_one_sentence(tmp_path, monkeypatch):
    # Nothing cached in tmp_path and no npm on PATH: a BuildError, not a traceback.
    monkeypatch.setattr(build.shutil, "which", lambda name: None)
    with pytest.raises(build.BuildError) as info:
        build.pyodide_tarball(tmp_path)
    message = str(info.value)
    assert "Node.js" in message and "npm" in message and build.PYODIDE_VERSION in message
    assert message.count(". ") == 0 and message.endswith(".")


def test_missing_npm_exit_status(tmp_path, monkeypatch, capsys):
    monkeypatch.setattr(build.shutil, "which", lambda name: None)
    monkeypatch.setattr(build, "CACHE_DIR", tmp_path)
    monkeypatch.setattr(build.build, "__defaults__", (tmp_path / "dist", tmp_path, None))
    assert build.main([]) == 1
    err = capsys.readouterr().err.strip()
    assert err.startswith("Linesmith's build needs Node.js with npm") and "\n" not in err


def test_calc_wheel_is_reproducible_and_complete(tmp_path):
    first = build.build_calc_wheel(tmp_path / "a")
    second = build.build_calc_wheel(tmp_path / "b")
    assert first.read_bytes() == second.read_bytes()
    names = zipfile.ZipFile(first).namelist()
    assert "calc/api.py" in names and "calc/__init__.py" in names
    assert any(n.startswith("calc/data/demos/") and n.endswith(".json") for n in names)
    assert not any("__pycache__" in n for n in names)
    dist_name, version = first.name.split("-")[:2]
    assert f"{dist_name}-{version}.dist-info/RECORD" in names
    assert f"{dist_name}-{version}.dist-info/METADATA" in names


def test_manifest_lists_every_file_with_its_hash(tmp_path):
    manifest = build.build(tmp_path / "dist")
    dist = tmp_path / "dist"
    on_disk = {p.relative_to(dist).as_posix() for p in dist.rglob("*") if p.is_file()} - {"manifest.json"}
    assert {e["path"] for e in manifest["files"]} == on_disk
    for entry in manifest["files"]:
        data = (dist / entry["path"]).read_bytes()
        assert len(data) == entry["size"]
        assert hashlib.sha256(data).hexdigest() == entry["sha256"]
    for name, sha256 in build.WHEELS.items():
        # Source: sha256 values published by the package index for these files, pinned in build.py.
        assert hashlib.sha256((dist / "wheels" / name).read_bytes()).hexdigest() == sha256
    assert {p.name for p in (dist / "pyodide").iterdir()} == set(build.PYODIDE_FILES)
