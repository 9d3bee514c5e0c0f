"""Our own wheel: the calc package as a pure-Python wheel, built with the standard library.

Only ``calc/`` goes in (its ``*.py`` files and the JSON package data declared in
pyproject.toml); this build package never does. Entries carry a fixed date, so
unchanged sources give a byte-identical wheel.
"""

from __future__ import annotations

import base64
import csv
import hashlib
import io
import tomllib
import zipfile
from pathlib import Path

from .common import ROOT, ZIP_DATE, BuildError

PACKAGE = "calc"


def _project_metadata() -> dict:
    with open(ROOT / "pyproject.toml", "rb") as f:
        return tomllib.load(f)["project"]


def _package_files() -> list[tuple[str, bytes]]:
    """(archive name, bytes) of calc/**/*.py and calc/data/**/*.json, sorted."""
    files = []
    for path in sorted((ROOT / PACKAGE).rglob("*")):
        rel = path.relative_to(ROOT)
        if "__pycache__" in rel.parts or not path.is_file():
            continue
        if path.suffix == ".py" or (path.suffix == ".json" and "data" in rel.parts):
            files.append((rel.as_posix(), path.read_bytes()))
    if not any(n == "calc/edges/api.py" for n, _ in files):
        raise BuildError("calc/edges/api.py is missing: the page needs calc.edges.api.handle to run the engine.")
    return files


def _dist_info_files(project: dict, info: str) -> list[tuple[str, bytes]]:
    """METADATA, WHEEL, top_level.txt and the licence of the wheel's dist-info folder."""
    metadata = [
        "Metadata-Version: 2.1",
        f"Name: {project['name']}",
        f"Version: {project['version']}",
        f"Summary: {project.get('description', '')}",
        "License: MIT",
        f"Requires-Python: {project.get('requires-python', '>=3.11')}",
    ]
    metadata += [f"Requires-Dist: {dep}" for dep in project.get("dependencies", []) if not dep.startswith("jinja2")]
    files = [(f"{info}/METADATA", ("\n".join(metadata) + "\n").encode())]
    files.append((f"{info}/WHEEL", (
        "Wheel-Version: 1.0\nGenerator: linesmith-build\nRoot-Is-Purelib: true\nTag: py3-none-any\n"
    ).encode()))
    files.append((f"{info}/top_level.txt", f"{PACKAGE}\n".encode()))
    license_path = ROOT / "LICENSE"
    if license_path.exists():
        files.append((f"{info}/licenses/LICENSE", license_path.read_bytes()))
    return files


def _record(files: list[tuple[str, bytes]], info: str) -> tuple[str, bytes]:
    """The RECORD entry listing every file with its urlsafe-base64 sha256 and size."""
    record = io.StringIO()
    writer = csv.writer(record, lineterminator="\n")
    for arcname, data in files:
        digest = base64.urlsafe_b64encode(hashlib.sha256(data).digest()).rstrip(b"=").decode()
        writer.writerow([arcname, f"sha256={digest}", len(data)])
    writer.writerow([f"{info}/RECORD", "", ""])
    return f"{info}/RECORD", record.getvalue().encode()


def build_calc_wheel(out_dir: Path) -> Path:
    """Build the calc package into out_dir as a pure-Python wheel; return its path."""
    project = _project_metadata()
    dist_name = project["name"].replace("-", "_")
    wheel_path = out_dir / f"{dist_name}-{project['version']}-py3-none-any.whl"
    info = f"{dist_name}-{project['version']}.dist-info"

    files = _package_files() + _dist_info_files(project, info)
    files.append(_record(files, info))

    out_dir.mkdir(parents=True, exist_ok=True)
    with zipfile.ZipFile(wheel_path, "w", zipfile.ZIP_DEFLATED) as zf:
        for arcname, data in files:
            zi = zipfile.ZipInfo(arcname, ZIP_DATE)
            zi.compress_type = zipfile.ZIP_DEFLATED
            zi.external_attr = 0o644 << 16
            zf.writestr(zi, data)
    return wheel_path
