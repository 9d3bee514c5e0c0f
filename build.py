"""Build the Linesmith calculator page into dist/ and, on request, serve it.

    python build.py                  build into dist/
    python build.py serve [--port N] build, then serve dist/ on 127.0.0.1

The build uses only the standard library and jinja2. It needs the network once:
Pyodide's core comes from ``npm pack`` and the fluids and ht wheels from
``pip download``; both land in the git-ignored folder ``.buildcache/`` and are
checked against the hashes pinned below, so later builds run offline.
"""

from __future__ import annotations

import argparse
import base64
import csv
import functools
import hashlib
import http.server
import io
import json
import os
import shutil
import subprocess
import sys
import tarfile
import tempfile
import time
import tomllib
import zipfile
from pathlib import Path

ROOT = Path(__file__).resolve().parent
CACHE_DIR = ROOT / ".buildcache"
DIST_DIR = ROOT / "dist"
SITE_DIR = ROOT / "site"

PYODIDE_VERSION = "314.0.7"
# The npm registry's "integrity" value for pyodide-314.0.7.tgz.
PYODIDE_INTEGRITY = (
    "sha512-0YvXxEhfEdpLfb/XkM2BFAeMROq0iMUX2bzzH9pOttyMcWkwq+HbE5uyuGD82LN7y2q+SNvi/6V5JEsOlD2R1A=="
)
# The files a boot with loadPyodide() plus loadPackage(<wheel URLs>) requests.
# Checked in the browser test: every request the page makes must be in dist/.
PYODIDE_FILES = (
    "pyodide.mjs",
    "pyodide.asm.mjs",
    "pyodide.asm.wasm",
    "python_stdlib.zip",
    "pyodide-lock.json",
)
# Wheels shipped to the browser beside our own, with their sha256 from the index.
WHEELS = {
    "fluids-1.3.1-py3-none-any.whl": "d9097efe57c910ac14b89a1984d5e7062ee9df1afc84e089d944fdd85404e361",
    "ht-1.2.0-py3-none-any.whl": "a4716bc3c8a9ef5e3dfff68d552232ba6f05c0edd3caa07fb72bee2306975ace",
}

# Only our own origin; 'wasm-unsafe-eval' lets the browser compile Pyodide's
# WebAssembly. Sent as a meta tag in the page and as a header by `serve`
# (a worker takes its policy from its own response headers, not the page's).
CONTENT_SECURITY_POLICY = (
    "default-src 'self'; script-src 'self' 'wasm-unsafe-eval'; worker-src 'self'; "
    "connect-src 'self'; img-src 'self'; style-src 'self'; font-src 'self'; "
    "object-src 'none'; base-uri 'none'; form-action 'self'"
)

# Zip entries get a fixed date so the same sources give the same wheel bytes.
_ZIP_DATE = (1980, 1, 1, 0, 0, 0)


class BuildError(Exception):
    """A problem the user can fix; the message is one plain sentence."""


# --------------------------------------------------------------------------
# hashing helpers


def _sha256_file(path: Path) -> str:
    h = hashlib.sha256()
    with open(path, "rb") as f:
        for block in iter(lambda: f.read(1 << 20), b""):
            h.update(block)
    return h.hexdigest()


def _integrity_of(path: Path) -> str:
    """Return the npm-style ``sha512-<base64>`` integrity string of a file."""
    h = hashlib.sha512()
    with open(path, "rb") as f:
        for block in iter(lambda: f.read(1 << 20), b""):
            h.update(block)
    return "sha512-" + base64.b64encode(h.digest()).decode("ascii")


# --------------------------------------------------------------------------
# Pyodide core


def pyodide_tarball(cache_dir: Path = CACHE_DIR) -> Path:
    """Return the verified Pyodide tarball, fetching it with npm if not cached."""
    tarball = cache_dir / f"pyodide-{PYODIDE_VERSION}.tgz"
    if tarball.exists():
        if _integrity_of(tarball) == PYODIDE_INTEGRITY:
            return tarball
        tarball.unlink()  # damaged or foreign: fetch again below
    npm = shutil.which("npm")
    if npm is None:
        raise BuildError(
            f"Linesmith's build needs Node.js with npm once, to fetch Pyodide {PYODIDE_VERSION}: "
            "install Node.js (it includes npm) and run again."
        )
    cache_dir.mkdir(parents=True, exist_ok=True)
    with tempfile.TemporaryDirectory(dir=cache_dir) as tmp:
        proc = subprocess.run(
            [npm, "pack", f"pyodide@{PYODIDE_VERSION}", "--silent"],
            cwd=tmp, capture_output=True, text=True,
        )
        fetched = Path(tmp) / tarball.name
        if proc.returncode != 0 or not fetched.exists():
            detail = (proc.stderr.strip().splitlines() or ["no output"])[-1]
            raise BuildError(
                f"npm could not fetch Pyodide {PYODIDE_VERSION} ({detail}); "
                "check the network connection and run again."
            )
        got = _integrity_of(fetched)
        if got != PYODIDE_INTEGRITY:
            raise BuildError(
                f"The Pyodide {PYODIDE_VERSION} tarball from npm does not match the pinned "
                f"integrity value (got {got}); the build stops rather than ship it."
            )
        os.replace(fetched, tarball)
    return tarball


def trim_lockfile(data: bytes) -> bytes:
    """Pyodide's lock file without its package list (119 kB -> under 1 kB).

    The list names the packages loadPackage() could fetch; the page ships none of
    them (its three wheels are unpacked by worker.js), so every entry would point
    at a file that is not there. loadPyodide() still reads ``info`` (the Python
    and ABI version), which is kept as it is.
    """
    lock = json.loads(data)
    lock["packages"] = {}
    return (json.dumps(lock, sort_keys=True, separators=(",", ":")) + "\n").encode()


def copy_pyodide(tarball: Path, out_dir: Path) -> None:
    """Extract only PYODIDE_FILES from the verified tarball into out_dir."""
    out_dir.mkdir(parents=True, exist_ok=True)
    wanted = {f"package/{name}": name for name in PYODIDE_FILES}
    with tarfile.open(tarball, "r:gz") as tar:
        for member in tar:
            name = wanted.pop(member.name, None)
            if name is None or not member.isfile():
                continue
            src = tar.extractfile(member)
            if name == "pyodide-lock.json":
                (out_dir / name).write_bytes(trim_lockfile(src.read()))
                continue
            with open(out_dir / name, "wb") as dst:
                shutil.copyfileobj(src, dst, 1 << 20)
    if wanted:
        raise BuildError(f"The Pyodide tarball lacks {', '.join(sorted(wanted.values()))}.")


# --------------------------------------------------------------------------
# wheels


def third_party_wheels(cache_dir: Path = CACHE_DIR) -> list[Path]:
    """Return the verified fluids and ht wheels, downloading any not yet cached."""
    wheel_dir = cache_dir / "wheels"
    paths = []
    for filename, sha256 in WHEELS.items():
        path = wheel_dir / filename
        if path.exists() and _sha256_file(path) != sha256:
            path.unlink()
        if not path.exists():
            name, version = filename.split("-")[:2]
            wheel_dir.mkdir(parents=True, exist_ok=True)
            proc = subprocess.run(
                [sys.executable, "-m", "pip", "download", "--no-deps", "--only-binary=:all:",
                 "--disable-pip-version-check", "-q", "-d", str(wheel_dir), f"{name}=={version}"],
                capture_output=True, text=True,
            )
            if proc.returncode != 0 or not path.exists():
                raise BuildError(
                    f"Linesmith's build needs the {name} {version} wheel once from the Python "
                    "package index: connect to the network (pip must work) and run again."
                )
            if _sha256_file(path) != sha256:
                path.unlink()
                raise BuildError(
                    f"The downloaded {filename} does not match its pinned sha256; "
                    "the build stops rather than ship it."
                )
        paths.append(path)
    return paths


def _project_metadata() -> dict:
    with open(ROOT / "pyproject.toml", "rb") as f:
        return tomllib.load(f)["project"]


def build_calc_wheel(out_dir: Path) -> Path:
    """Build the calc package into a pure-Python wheel with the standard library.

    Holds calc/**/*.py and calc/data/**/*.json (the package data declared in
    pyproject.toml). Entries carry a fixed date, so unchanged sources give a
    byte-identical wheel.
    """
    project = _project_metadata()
    name, version = project["name"], project["version"]
    dist_name = name.replace("-", "_")
    wheel_path = out_dir / f"{dist_name}-{version}-py3-none-any.whl"
    info = f"{dist_name}-{version}.dist-info"

    files = []
    calc_dir = ROOT / "calc"
    for path in sorted(calc_dir.rglob("*")):
        rel = path.relative_to(ROOT)
        if "__pycache__" in rel.parts or not path.is_file():
            continue
        if path.suffix == ".py" or (path.suffix == ".json" and "data" in rel.parts):
            files.append((rel.as_posix(), path.read_bytes()))
    if not any(n == "calc/api.py" for n, _ in files):
        raise BuildError("calc/api.py is missing: the page needs calc.api.handle to run the engine.")

    metadata = [
        "Metadata-Version: 2.1",
        f"Name: {name}",
        f"Version: {version}",
        f"Summary: {project.get('description', '')}",
        "License: MIT",
        f"Requires-Python: {project.get('requires-python', '>=3.11')}",
    ]
    metadata += [f"Requires-Dist: {dep}" for dep in project.get("dependencies", []) if not dep.startswith("jinja2")]
    files.append((f"{info}/METADATA", ("\n".join(metadata) + "\n").encode()))
    files.append((f"{info}/WHEEL", (
        "Wheel-Version: 1.0\nGenerator: linesmith-build\nRoot-Is-Purelib: true\nTag: py3-none-any\n"
    ).encode()))
    files.append((f"{info}/top_level.txt", b"calc\n"))
    license_path = ROOT / "LICENSE"
    if license_path.exists():
        files.append((f"{info}/licenses/LICENSE", license_path.read_bytes()))

    record = io.StringIO()
    writer = csv.writer(record, lineterminator="\n")
    for arcname, data in files:
        digest = base64.urlsafe_b64encode(hashlib.sha256(data).digest()).rstrip(b"=").decode()
        writer.writerow([arcname, f"sha256={digest}", len(data)])
    writer.writerow([f"{info}/RECORD", "", ""])
    files.append((f"{info}/RECORD", record.getvalue().encode()))

    out_dir.mkdir(parents=True, exist_ok=True)
    with zipfile.ZipFile(wheel_path, "w", zipfile.ZIP_DEFLATED) as zf:
        for arcname, data in files:
            zi = zipfile.ZipInfo(arcname, _ZIP_DATE)
            zi.compress_type = zipfile.ZIP_DEFLATED
            zi.external_attr = 0o644 << 16
            zf.writestr(zi, data)
    return wheel_path


def copy_wheel_licences(wheel: Path, out_dir: Path) -> list[str]:
    """Copy the licence files in a wheel's dist-info into out_dir/<project>/."""
    project = wheel.name.split("-")[0]
    copied = []
    with zipfile.ZipFile(wheel) as zf:
        for arcname in zf.namelist():
            parts = arcname.split("/")
            if len(parts) >= 2 and parts[0].endswith(".dist-info") and (
                "licenses" in parts[1:-1] or parts[-1].upper().startswith(("LICENSE", "COPYING", "AUTHORS"))
            ):
                target = out_dir / project / parts[-1]
                target.parent.mkdir(parents=True, exist_ok=True)
                target.write_bytes(zf.read(arcname))
                copied.append(f"{project}/{parts[-1]}")
    return copied


# --------------------------------------------------------------------------
# bytecode for the browser's Python

# The browser runs CPython 3.14 (Pyodide), whose bytecode the build's Python
# cannot write. Pyodide itself can: build.py boots the very Pyodide it ships
# under Node.js (already needed to fetch it), installs the three wheels, imports
# what the engine imports at start (through linesmith_boot's lazy packages, as
# the browser does) and writes checked-hash .pyc files (Python checks each
# against its source's hash on import, so a stale one is never run). Compiling
# in the browser instead costs about 0.85 s of every start (bench/browser_bench.py).
# Cached in .buildcache/bytecode/ by the inputs' hashes.
BYTECODE_FILE = "bytecode-cp314.zip"
BYTECODE_IMPORTS = ("calc.api", "calc.engine", "calc.thermal")

_BYTECODE_NODE = r"""
import fs from "node:fs";
import path from "node:path";
import { pathToFileURL } from "node:url";
const [indexDir, outZip, code, boot, ...wheels] = process.argv.slice(2);
const { loadPyodide } = await import(pathToFileURL(path.join(indexDir, "pyodide.mjs")).href);
const py = await loadPyodide({ indexURL: indexDir + path.sep, stdout: () => {}, stderr: () => {} });
const sitePackages = py.pyimport("site").getsitepackages()[0];
for (const wheel of wheels) py.unpackArchive(new Uint8Array(fs.readFileSync(wheel)), "wheel", { extractDir: sitePackages });
py.FS.writeFile(path.posix.join(sitePackages, "linesmith_boot.py"), fs.readFileSync(boot, "utf8"));
const result = py.runPython(fs.readFileSync(code, "utf8"));
fs.writeFileSync(outZip, result.toJs());
"""

# Runs in Pyodide under Node.js: (1) from the full packages, which submodule defines each
# name calc imports from fluids and ht; (2) in a clean import state, the engine's start-up
# imports through linesmith_boot's lazy packages, and one evaluation of each demo job (which
# imports what the engine loads on first use); (3) those modules' bytecode, and the table,
# in one zip.
_BYTECODE_PY = """
import ast, importlib, importlib.util, io, json, pathlib, py_compile, site, sys, zipfile
from importlib._bootstrap_external import _code_to_timestamp_pyc
BOOT = set(sys.modules)  # a bare boot, plus what unpacking the wheels imported
sp = site.getsitepackages()[0]
importlib.invalidate_caches()
wanted = {}
for path in sorted(pathlib.Path(sp, "calc").glob("*.py")):
    for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
        if isinstance(node, ast.ImportFrom) and node.level == 0 and node.module in ("fluids", "ht"):
            wanted.setdefault(node.module, set()).update(a.name for a in node.names)
table = {}
for package, names in sorted(wanted.items()):
    module = importlib.import_module(package)
    table[package] = {n: getattr(module, n).__module__[len(package) + 1:] for n in sorted(names)
                      if getattr(getattr(module, n, None), "__module__", "").startswith(package + ".")}
for name in [m for m in sys.modules if m.split(".")[0] in ("fluids", "ht", "calc", "linesmith_boot")]:
    del sys.modules[name]
import linesmith_boot
linesmith_boot.install_lazy_packages(table)
for name in IMPORTS:
    importlib.import_module(name)
# The engine imports some modules on first use: evaluate every demo job, as the page does at start.
for demo in sorted(pathlib.Path(sp, "calc", "data", "demos").glob("*.json")):
    sys.modules["calc.api"].handle(json.dumps({"op": "evaluate", "job": json.loads(demo.read_text(encoding="utf-8"))}))
files = sorted({m.__file__ for m in list(sys.modules.values())
                if (getattr(m, "__file__", None) or "").startswith(sp) and m.__file__.endswith(".py")
                and not m.__file__.endswith("/linesmith_boot.py")})
# Standard-library modules the engine adds to a bare boot: Pyodide ships them as sources in
# its zip, so they too are compiled at every start. Sourceless .pyc files for them go to
# linesmith-stdlib/ (put first on sys.path by linesmith_boot.prepare); only whole top-level
# modules and packages that a bare boot has not imported.
boot_tops = {m.split(".")[0] for m in BOOT}
stdlib = {}
for name, module in sorted(sys.modules.items()):
    where = getattr(module, "__file__", None) or ""
    if name in BOOT or name.split(".")[0] in boot_tops or ".zip" not in where or where.startswith(sp):
        continue
    source = module.__loader__.get_source(name)
    if source is None:
        continue
    is_package = hasattr(module, "__path__")
    rel = name.replace(".", "/") + ("/__init__.pyc" if is_package else ".pyc")
    stdlib[rel] = _code_to_timestamp_pyc(compile(source, where, "exec", dont_inherit=True))
out = io.BytesIO()
with zipfile.ZipFile(out, "w") as zf:
    zi = zipfile.ZipInfo("linesmith-lazy-names.json", (1980, 1, 1, 0, 0, 0))
    zf.writestr(zi, json.dumps(table, sort_keys=True))
    for rel, data in sorted(stdlib.items()):
        zi = zipfile.ZipInfo("linesmith-stdlib/" + rel, (1980, 1, 1, 0, 0, 0))
        zi.compress_type = zipfile.ZIP_DEFLATED
        zf.writestr(zi, bytes(data), compresslevel=9)
    for f in files:
        c = importlib.util.cache_from_source(f)
        py_compile.compile(f, cfile=c, doraise=True, invalidation_mode=py_compile.PycInvalidationMode.CHECKED_HASH)
        zi = zipfile.ZipInfo(c[len(sp):].lstrip("/"), (1980, 1, 1, 0, 0, 0))
        zi.compress_type = zipfile.ZIP_DEFLATED
        with open(c, "rb") as fh:
            zf.writestr(zi, fh.read(), compresslevel=9)
out.getvalue()
"""
BOOT_MODULE = SITE_DIR / "static" / "linesmith_boot.py"
LAZY_MARK = "LAZY_NAMES = {}  # filled in by build.py"


def compile_bytecode(pyodide_dir: Path, wheels: list[Path], out: Path, cache_dir: Path = CACHE_DIR) -> dict | None:
    """Write the engine's start-up modules as Python 3.14 bytecode (a zip of __pycache__ files).

    Returns the lazy-import table ({package: {name: submodule}}) for linesmith_boot.py, or
    None, writing nothing, when Node.js is missing or the compile fails: the page then
    works as before, compiling in the browser and importing the packages whole.
    """
    h = hashlib.sha256(PYODIDE_INTEGRITY.encode() + _BYTECODE_NODE.encode() + _BYTECODE_PY.encode()
                       + repr(BYTECODE_IMPORTS).encode() + BOOT_MODULE.read_bytes())
    for wheel in wheels:
        h.update(wheel.name.encode() + bytes.fromhex(_sha256_file(wheel)))
    cached = cache_dir / "bytecode" / f"{h.hexdigest()}.zip"
    if not cached.exists():
        node = shutil.which("node")
        if node is None:
            return None
        cached.parent.mkdir(parents=True, exist_ok=True)
        with tempfile.TemporaryDirectory(dir=cached.parent) as tmp:
            script, code, zipped = Path(tmp) / "compile.mjs", Path(tmp) / "compile.py", Path(tmp) / "out.zip"
            script.write_text(_BYTECODE_NODE, encoding="utf-8")
            code.write_text(f"IMPORTS = {BYTECODE_IMPORTS!r}\n" + _BYTECODE_PY, encoding="utf-8")
            try:
                proc = subprocess.run([node, str(script), str(pyodide_dir.resolve()), str(zipped), str(code),
                                       str(BOOT_MODULE), *[str(w.resolve()) for w in wheels]],
                                      capture_output=True, text=True, timeout=300)
            except (OSError, subprocess.TimeoutExpired):
                return None
            if proc.returncode != 0 or not zipped.exists() or not zipfile.is_zipfile(zipped):
                return None
            os.replace(zipped, cached)
        # One zip per engine version: keep the few newest.
        for stale in sorted(cached.parent.glob("*.zip"), key=lambda p: p.stat().st_mtime)[:-4]:
            stale.unlink(missing_ok=True)
    with zipfile.ZipFile(cached) as zf:
        table = json.loads(zf.read("linesmith-lazy-names.json"))
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


# --------------------------------------------------------------------------
# page


def load_demos() -> list[dict]:
    """Return the demo jobs in calc/data/demos/, sorted by file name."""
    demos = []
    for path in sorted((ROOT / "calc" / "data" / "demos").glob("*.json")):
        with open(path, encoding="utf-8") as f:
            job = json.load(f)
        demos.append({"file": path.name, "job": job})
    return demos


def _page_model() -> dict:
    """The engine's job model, unit table and cautions, for the form and the page's script."""
    sys.path.insert(0, str(ROOT))
    try:
        from calc.model import describe_job
        from calc.report import CAUTIONS
        from calc.units import UNITS
    finally:
        sys.path.remove(str(ROOT))
    return {"model": describe_job(), "units": {k: list(v) for k, v in UNITS.items()},
            "cautions": list(CAUTIONS)}


def render_page(out_dir: Path, demos: list[dict], wheels: list[str], bytecode: str | None = None) -> None:
    import jinja2  # build-time only

    env = jinja2.Environment(
        loader=jinja2.FileSystemLoader(SITE_DIR / "templates"),
        autoescape=True,
        undefined=jinja2.StrictUndefined,
        keep_trailing_newline=True,
    )
    config = {"pyodide": "./pyodide/", "wheels": [f"./wheels/{w}" for w in wheels]}
    if bytecode:
        config["bytecode"] = f"./wheels/{bytecode}"  # passed on to worker.js by the page's init message
    html = env.get_template("index.html.j2").render(
        csp=CONTENT_SECURITY_POLICY,
        config=config,
        demos=demos,
        first_demo=demos[0]["job"] if demos else None,
        pyodide_version=PYODIDE_VERSION,
        **_page_model(),
    )
    (out_dir / "index.html").write_text(html, encoding="utf-8")


def _file_entries(out_dir: Path, skip: tuple[str, ...] = ("manifest.json",)) -> list[dict]:
    files = []
    for path in sorted(out_dir.rglob("*")):
        rel = path.relative_to(out_dir).as_posix()
        if path.is_file() and rel not in skip:
            files.append({"path": rel, "size": path.stat().st_size, "sha256": _sha256_file(path)})
    return files


def _hash_entries(entries: list[dict], salt: bytes = b"") -> str:
    h = hashlib.sha256(salt)
    for entry in entries:
        h.update(f"{entry['path']}\0{entry['size']}\0{entry['sha256']}\n".encode())
    return h.hexdigest()


# Placeholders in site/static/sw.js that write_service_worker fills in.
SW_BUILD_MARK = "__LINESMITH_BUILD__"
SW_FILES_MARK = "/*__LINESMITH_FILES__*/[]"


def write_service_worker(out_dir: Path) -> str:
    """Fill out_dir/sw.js with the build hash and the precache list; return the build hash.

    The precache list is every file of out_dir except sw.js itself (browsers keep
    the worker script apart) with its sha256 as a Subresource Integrity value;
    manifest.json, written afterwards, is listed without one (the service worker
    checks its ``build`` field instead). The build hash covers every listed file
    and the sw.js template, so it changes whenever any shipped byte changes, and
    it is the ``build`` value of manifest.json.
    """
    sw_path = out_dir / "sw.js"
    template = sw_path.read_text(encoding="utf-8")
    if SW_BUILD_MARK not in template or SW_FILES_MARK not in template:
        raise BuildError("site/static/sw.js lacks its build placeholders; restore them from git.")
    entries = _file_entries(out_dir, skip=("manifest.json", "sw.js"))
    build_id = _hash_entries(entries, salt=hashlib.sha256(template.encode()).digest())
    files = [{"path": e["path"],
              "integrity": "sha256-" + base64.b64encode(bytes.fromhex(e["sha256"])).decode("ascii")}
             for e in entries]
    files.append({"path": "manifest.json", "integrity": ""})
    text = template.replace(SW_BUILD_MARK, build_id, 1).replace(
        SW_FILES_MARK, json.dumps(files, separators=(",", ":")), 1)
    sw_path.write_text(text, encoding="utf-8")
    return build_id


def write_manifest(out_dir: Path, build_id: str | None = None) -> dict:
    """Write out_dir/manifest.json: every file with size and sha256, and a build hash.

    build_id is the hash write_service_worker put into sw.js; without one, the
    hash of the listed files is used.
    """
    files = _file_entries(out_dir)
    manifest = {
        "version": 1,
        "build": build_id or _hash_entries(files),
        "pyodide": PYODIDE_VERSION,
        "total_bytes": sum(e["size"] for e in files),
        "files": files,
    }
    (out_dir / "manifest.json").write_text(json.dumps(manifest, indent=1) + "\n", encoding="utf-8")
    return manifest


def _swap_into_place(stage: Path, out_dir: Path, attempts: int = 20) -> None:
    """Move stage to out_dir, moving any previous build aside first.

    Retries briefly when another build swaps the same folder at the same moment.
    """
    for attempt in range(attempts):
        old = out_dir.with_name(f".{out_dir.name}-old-{os.getpid()}-{time.monotonic_ns()}")
        try:
            if out_dir.exists():
                os.replace(out_dir, old)
            os.replace(stage, out_dir)
        except OSError:
            if attempt == attempts - 1:
                raise
            time.sleep(0.05)
            continue
        finally:
            if old.exists():
                shutil.rmtree(old, ignore_errors=True)
        return


def build(out_dir: Path = DIST_DIR, cache_dir: Path = CACHE_DIR,
          extra_files: dict[str, bytes] | None = None) -> dict:
    """Build the static site into out_dir and return its manifest.

    The site is assembled in a fresh folder beside out_dir and then moved into
    place, so a half-finished build never replaces a working one. extra_files
    ({relative path: bytes}) are added to the site before the precache list and
    manifest are written: the offline tests stamp builds with them, the browser
    benchmark adds its bare-boot page to a temporary build. The shipped dist/
    is built without any.
    """
    out_dir = Path(out_dir).resolve()
    tarball = pyodide_tarball(cache_dir)
    other_wheels = third_party_wheels(cache_dir)

    out_dir.parent.mkdir(parents=True, exist_ok=True)
    stage = Path(tempfile.mkdtemp(prefix=f".{out_dir.name}-new-", dir=out_dir.parent))
    try:
        stage.chmod(0o755)  # mkdtemp makes it private; a served folder should not be
        copy_pyodide(tarball, stage / "pyodide")
        wheel_dir = stage / "wheels"
        wheel_dir.mkdir()
        calc_wheel = build_calc_wheel(wheel_dir)
        for wheel in other_wheels:
            shutil.copyfile(wheel, wheel_dir / wheel.name)

        for path in sorted((SITE_DIR / "static").rglob("*")):
            if path.is_file():
                target = stage / path.relative_to(SITE_DIR / "static")
                target.parent.mkdir(parents=True, exist_ok=True)
                shutil.copyfile(path, target)

        demos = load_demos()
        if not demos:
            raise BuildError("calc/data/demos/ holds no demo job; the page needs one to show a result.")
        (stage / "demos").mkdir()
        for demo in demos:
            shutil.copyfile(ROOT / "calc" / "data" / "demos" / demo["file"], stage / "demos" / demo["file"])

        licences = stage / "licenses"
        shutil.copytree(SITE_DIR / "licenses", licences)
        for name in ("LICENSE", "THIRD_PARTY_NOTICES.md"):
            if (ROOT / name).exists():
                shutil.copyfile(ROOT / name, licences / (name if name != "LICENSE" else "LICENSE-linesmith.txt"))
        for wheel in other_wheels:
            copy_wheel_licences(wheel, licences)

        # Installable web app: the manifest and our own icons.
        shutil.copyfile(SITE_DIR / "manifest.webmanifest", stage / "manifest.webmanifest")
        (stage / "icons").mkdir()
        for icon in sorted((SITE_DIR / "icons").glob("icon*")):
            shutil.copyfile(icon, stage / "icons" / icon.name)

        lazy_names = compile_bytecode(stage / "pyodide", [calc_wheel, *other_wheels],
                                      wheel_dir / BYTECODE_FILE, cache_dir)
        write_boot_module(stage, lazy_names)
        render_page(stage, demos, [calc_wheel.name] + [w.name for w in other_wheels],
                    BYTECODE_FILE if lazy_names is not None else None)
        for rel, data in (extra_files or {}).items():
            target = stage / rel
            target.parent.mkdir(parents=True, exist_ok=True)
            target.write_bytes(data)
        build_id = write_service_worker(stage)
        manifest = write_manifest(stage, build_id)

        _swap_into_place(stage, out_dir)
    except BaseException:
        shutil.rmtree(stage, ignore_errors=True)
        raise
    return manifest


# --------------------------------------------------------------------------
# serving


class SiteHandler(http.server.SimpleHTTPRequestHandler):
    """Static handler for dist/ with the page's security policy as headers."""

    extensions_map = {
        **http.server.SimpleHTTPRequestHandler.extensions_map,
        ".mjs": "text/javascript",
        ".js": "text/javascript",
        ".wasm": "application/wasm",
        ".json": "application/json",
        ".whl": "application/zip",
        ".md": "text/plain; charset=utf-8",
        ".svg": "image/svg+xml",
        ".png": "image/png",
        ".webmanifest": "application/manifest+json",
        ".txt": "text/plain; charset=utf-8",
    }

    def end_headers(self):
        self.send_header("Content-Security-Policy", CONTENT_SECURITY_POLICY)
        self.send_header("X-Content-Type-Options", "nosniff")
        self.send_header("Cache-Control", "no-cache")
        super().end_headers()

    def log_message(self, format, *args):  # noqa: A002 - signature fixed by http.server
        if getattr(self.server, "quiet", False):
            return
        super().log_message(format, *args)


def make_server(directory: Path = DIST_DIR, port: int = 8000, quiet: bool = False):
    """Return a threaded HTTP server for directory on 127.0.0.1:port (0 = any free port)."""
    handler = functools.partial(SiteHandler, directory=str(directory))
    server = http.server.ThreadingHTTPServer(("127.0.0.1", port), handler)
    server.daemon_threads = True
    server.quiet = quiet
    return server


def main(argv: list[str] | None = None) -> int:
    parser = argparse.ArgumentParser(description="Build (and optionally serve) the Linesmith page.")
    sub = parser.add_subparsers(dest="command")
    serve = sub.add_parser("serve", help="build, then serve dist/ on 127.0.0.1")
    serve.add_argument("--port", type=int, default=8000, help="port to listen on (default 8000)")
    args = parser.parse_args(argv)

    started = time.perf_counter()
    try:
        manifest = build()
    except BuildError as exc:
        print(exc, file=sys.stderr)
        return 1
    seconds = time.perf_counter() - started
    print(f"Built dist/ in {seconds:.1f} s: {len(manifest['files'])} files, "
          f"{manifest['total_bytes'] / 1e6:.1f} MB, build {manifest['build'][:12]}")

    if args.command == "serve":
        try:
            server = make_server(DIST_DIR, args.port)
        except OSError as exc:
            print(f"Cannot listen on 127.0.0.1:{args.port} ({exc.strerror}); "
                  "pick another port with --port N.", file=sys.stderr)
            return 1
        host, port = server.server_address[:2]
        print(f"Linesmith is at http://{host}:{port}/  (press Ctrl+C to stop)", flush=True)
        try:
            server.serve_forever()
        except KeyboardInterrupt:
            print("\nStopped.")
        finally:
            server.server_close()
    return 0


if __name__ == "__main__":
    sys.exit(main())
