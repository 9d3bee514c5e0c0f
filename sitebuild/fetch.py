"""Third-party files the page ships: Pyodide's core and the fluids and ht wheels.

Each is fetched once with its ordinary client (``npm pack``, ``pip download``),
checked against the hash pinned here and kept in ``.buildcache/``, so later
builds run offline. A file whose hash does not match is never shipped.
"""

from __future__ import annotations

import json
import os
import shutil
import subprocess
import sys
import tarfile
import tempfile
import zipfile
from pathlib import Path

from .common import CACHE_DIR, BuildError, integrity_of, sha256_file

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


# --------------------------------------------------------------------------
# Pyodide core


def pyodide_tarball(cache_dir: Path = CACHE_DIR) -> Path:
    """Return the verified Pyodide tarball, fetching it with npm if not cached."""
    tarball = cache_dir / f"pyodide-{PYODIDE_VERSION}.tgz"
    if tarball.exists():
        if integrity_of(tarball) == PYODIDE_INTEGRITY:
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
        got = integrity_of(fetched)
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
# fluids and ht


def third_party_wheels(cache_dir: Path = CACHE_DIR) -> list[Path]:
    """Return the verified fluids and ht wheels, downloading any not yet cached."""
    wheel_dir = cache_dir / "wheels"
    paths = []
    for filename, sha256 in WHEELS.items():
        path = wheel_dir / filename
        if path.exists() and sha256_file(path) != sha256:
            path.unlink()
        if not path.exists():
            _download_wheel(path, sha256)
        paths.append(path)
    return paths


def _download_wheel(path: Path, sha256: str) -> None:
    """Fetch one pinned wheel into path's folder with pip; check it against sha256."""
    name, version = path.name.split("-")[:2]
    path.parent.mkdir(parents=True, exist_ok=True)
    proc = subprocess.run(
        [sys.executable, "-m", "pip", "download", "--no-deps", "--only-binary=:all:",
         "--disable-pip-version-check", "-q", "-d", str(path.parent), f"{name}=={version}"],
        capture_output=True, text=True,
    )
    if proc.returncode != 0 or not path.exists():
        raise BuildError(
            f"Linesmith's build needs the {name} {version} wheel once from the Python "
            "package index: connect to the network (pip must work) and run again."
        )
    if sha256_file(path) != sha256:
        path.unlink()
        raise BuildError(
            f"The downloaded {path.name} does not match its pinned sha256; "
            "the build stops rather than ship it."
        )


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
