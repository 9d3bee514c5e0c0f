"""Checks of the build (build.py, sitebuild/) that need no browser: manifest, wheel, missing-npm message."""

from __future__ import annotations

import hashlib
import re
import zipfile

import pytest

from sitebuild import assemble, bytecode, cli, fetch, wheel
from sitebuild.common import ROOT, SITE_DIR, BuildError


def test_missing_npm_gives_one_sentence(tmp_path, monkeypatch):
    # Nothing cached in tmp_path and no npm on PATH: a BuildError, not a traceback.
    monkeypatch.setattr(fetch.shutil, "which", lambda name: None)
    with pytest.raises(BuildError) as info:
        fetch.pyodide_tarball(tmp_path)
    message = str(info.value)
    assert "Node.js" in message and "npm" in message and fetch.PYODIDE_VERSION in message
    assert message.count(". ") == 0 and message.endswith(".")


def test_missing_npm_exit_status(tmp_path, monkeypatch, capsys):
    monkeypatch.setattr(fetch.shutil, "which", lambda name: None)
    # main() builds with build()'s defaults: point them at tmp_path, away from the real cache and dist/.
    monkeypatch.setattr(assemble.build, "__defaults__", (tmp_path / "dist", tmp_path, None))
    assert cli.main([]) == 1
    err = capsys.readouterr().err.strip()
    assert err.startswith("Linesmith's build needs Node.js with npm") and "\n" not in err


def test_calc_wheel_is_reproducible_and_complete(tmp_path):
    first = wheel.build_calc_wheel(tmp_path / "a")
    second = wheel.build_calc_wheel(tmp_path / "b")
    assert first.read_bytes() == second.read_bytes()
    names = zipfile.ZipFile(first).namelist()
    assert "calc/edges/api.py" in names and "calc/__init__.py" in names and "calc/checks/line.py" in names
    assert any(n.startswith("calc/data/demos/") and n.endswith(".json") for n in names)
    assert not any("__pycache__" in n for n in names)
    dist_name, version = first.name.split("-")[:2]
    assert f"{dist_name}-{version}.dist-info/RECORD" in names
    assert f"{dist_name}-{version}.dist-info/METADATA" in names


def test_manifest_lists_every_file_with_its_hash(tmp_path):
    manifest = assemble.build(tmp_path / "dist")
    dist = tmp_path / "dist"
    on_disk = {p.relative_to(dist).as_posix() for p in dist.rglob("*") if p.is_file()} - {"manifest.json"}
    assert {e["path"] for e in manifest["files"]} == on_disk
    for entry in manifest["files"]:
        data = (dist / entry["path"]).read_bytes()
        assert len(data) == entry["size"]
        assert hashlib.sha256(data).hexdigest() == entry["sha256"]
    for name, sha256 in fetch.WHEELS.items():
        # Source: sha256 values published by the package index for these files, pinned in sitebuild/fetch.py.
        assert hashlib.sha256((dist / "wheels" / name).read_bytes()).hexdigest() == sha256
    assert {p.name for p in (dist / "pyodide").iterdir()} == set(fetch.PYODIDE_FILES)


def test_lock_file_keeps_its_info_and_drops_the_package_list(tmp_path):
    import json
    import tarfile

    fetch.copy_pyodide(fetch.pyodide_tarball(), tmp_path)
    with tarfile.open(fetch.pyodide_tarball(), "r:gz") as tar:
        original = json.load(tar.extractfile("package/pyodide-lock.json"))
    trimmed = json.loads((tmp_path / "pyodide-lock.json").read_text())
    assert trimmed["info"] == original["info"] and trimmed["packages"] == {}
    assert original["packages"]  # there was something to drop


def test_lazy_packages_give_the_same_results_with_fewer_modules(tmp_path):
    """linesmith_boot.install_lazy_packages in a fresh CPython: same engine output, fewer imports."""
    import json
    import subprocess
    import sys

    boot = SITE_DIR / "static" / "linesmith_boot.py"
    script = tmp_path / "probe.py"
    script.write_text(
        "import json, sys\n"
        f"sys.path[:0] = [{str(boot.parent)!r}, {str(ROOT)!r}]\n"
        "import linesmith_boot\n"
        "table = json.loads(sys.argv[1])\n"
        "if table: linesmith_boot.install_lazy_packages(table)\n"
        "import calc.edges.api, pathlib\n"
        "out = [calc.edges.api.handle(json.dumps({'op': 'evaluate', 'job': json.loads(p.read_text())}))\n"
        f"       for p in sorted(pathlib.Path({str(ROOT / 'calc' / 'data' / 'demos')!r}).glob('*.json'))]\n"
        "mods = sorted(m for m in sys.modules if m.split('.')[0] in ('fluids', 'ht'))\n"
        "print(json.dumps({'out': out, 'mods': mods}))\n", encoding="utf-8")

    def run(table):
        proc = subprocess.run([sys.executable, str(script), json.dumps(table)], capture_output=True, text=True,
                              timeout=120)
        assert proc.returncode == 0, proc.stderr
        return json.loads(proc.stdout)

    # The table as the build derives it (sitebuild/compile_in_pyodide.py): which submodule defines each name calc imports.
    import fluids
    import ht
    table = {"fluids": {}, "ht": {}}
    for path in (ROOT / "calc").rglob("*.py"):
        import ast
        for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
            if isinstance(node, ast.ImportFrom) and node.level == 0 and node.module in table:
                package = {"fluids": fluids, "ht": ht}[node.module]
                for alias in node.names:
                    table[node.module][alias.name] = getattr(package, alias.name).__module__.split(".", 1)[1]
    whole, lazy = run({}), run(table)
    assert lazy["out"] == whole["out"]  # byte-identical JSON for every demo
    assert len(lazy["mods"]) < len(whole["mods"]) / 2, (len(lazy["mods"]), len(whole["mods"]))


def test_lazy_package_loads_whole_for_a_name_outside_its_table():
    import subprocess
    import sys

    boot_dir = SITE_DIR / "static"
    code = (f"import sys; sys.path.insert(0, {str(boot_dir)!r}); import linesmith_boot\n"
            "linesmith_boot.install_lazy_packages({'fluids': {'friction_factor': 'friction'}})\n"
            "import fluids\n"
            "assert 'fluids.geometry' not in sys.modules\n"
            "from fluids import friction_factor\n"
            "assert 'fluids.geometry' not in sys.modules\n"
            "from fluids import Reynolds  # not in the table: the real __init__ runs\n"
            "assert 'fluids.geometry' in sys.modules\n"
            "print(Reynolds(V=2.5, D=0.25, rho=1.1613, mu=1.9E-5))\n")
    proc = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True, timeout=60)
    assert proc.returncode == 0, proc.stderr
    # Source: fluids.core.Reynolds docstring example, 2.5 m/s, 0.25 m, rho 1.1613, mu 1.9e-5 -> 38200.65789473684.
    assert abs(float(proc.stdout) - 38200.65789473684) < 1e-6


def test_build_ships_bytecode_for_the_browser_when_node_is_there(tmp_path):
    import json
    import shutil

    if shutil.which("node") is None:
        pytest.fail("Node.js is needed for the build (it fetches Pyodide and compiles the engine's bytecode)")
    assemble.build(tmp_path / "site")
    site = tmp_path / "site"
    with zipfile.ZipFile(site / "wheels" / bytecode.BYTECODE_FILE) as zf:
        names = zf.namelist()
        table = json.loads(zf.read("linesmith-lazy-names.json"))
    # The engine's modules on the page's path have Python 3.14 bytecode (the browser's CPython;
    # 3.11's would be useless); the command line's (cli, report) need none.
    calc_modules = {"calc/__init__", "calc/edges/api", "calc/pipeline", "calc/model/job", "calc/model/schema",
                    "calc/checks/line", "calc/stages/selection", "calc/stages/thermal", "calc/system/circuit"}
    shipped = {n.replace("__pycache__/", "").split(".")[0] for n in names if n.startswith("calc/")}
    assert calc_modules <= shipped, sorted(calc_modules - shipped)
    assert all(n.endswith(".cpython-314.pyc") for n in names if n.startswith(("calc/", "fluids/", "ht/")))
    assert table["fluids"]["friction_factor"] == "friction"  # Source: fluids 1.3.1 defines it in fluids/friction.py
    config = json.loads(re.search(r'id="linesmith-config">(.*?)</script>', (site / "index.html").read_text()).group(1))
    assert config["bytecode"] == f"./wheels/{bytecode.BYTECODE_FILE}"
    assert "LAZY_NAMES = {}" not in (site / "linesmith_boot.py").read_text()


def test_build_package_stays_out_of_the_calc_wheel_and_install(tmp_path):
    """sitebuild/ is build-time only: not in our wheel, not in setuptools' package list."""
    import tomllib

    names = zipfile.ZipFile(wheel.build_calc_wheel(tmp_path)).namelist()
    tops = {n.split("/")[0] for n in names}
    assert len(tops) == 2 and "calc" in tops and all(t == "calc" or t.endswith(".dist-info") for t in tops), tops
    with open(ROOT / "pyproject.toml", "rb") as f:
        setuptools = tomllib.load(f)["tool"]["setuptools"]
    assert setuptools["packages"] == ["calc"]
