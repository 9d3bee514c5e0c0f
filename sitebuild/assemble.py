"""build(): every step in order, in a fresh folder that then replaces the old build."""

from __future__ import annotations

import os
import shutil
import tempfile
import time
from pathlib import Path

from .bytecode import BYTECODE_FILE, compile_bytecode, write_boot_module
from .common import CACHE_DIR, DEMO_DIR, DIST_DIR, ROOT, SITE_DIR, BuildError
from .fetch import copy_pyodide, copy_wheel_licences, pyodide_tarball, third_party_wheels
from .render import load_demos, render_page
from .service_worker import write_manifest, write_service_worker
from .snapshot import add_snapshot
from .wheel import build_calc_wheel


def _copy_site_files(stage: Path, demos: list[dict]) -> None:
    """site/static/, the demo jobs, the web app manifest and our icons."""
    for path in sorted((SITE_DIR / "static").rglob("*")):
        if path.is_file():
            target = stage / path.relative_to(SITE_DIR / "static")
            target.parent.mkdir(parents=True, exist_ok=True)
            shutil.copyfile(path, target)
    (stage / "demos").mkdir()
    for demo in demos:
        shutil.copyfile(DEMO_DIR / demo["file"], stage / "demos" / demo["file"])
    # Installable web app: the manifest and our own icons.
    shutil.copyfile(SITE_DIR / "manifest.webmanifest", stage / "manifest.webmanifest")
    (stage / "icons").mkdir()
    for icon in sorted((SITE_DIR / "icons").glob("icon*")):
        shutil.copyfile(icon, stage / "icons" / icon.name)


def _copy_licences(stage: Path, other_wheels: list[Path]) -> None:
    """site/licenses/, our licence and notices, and the licence files of the shipped wheels."""
    licences = stage / "licenses"
    shutil.copytree(SITE_DIR / "licenses", licences)
    for name in ("LICENSE", "THIRD_PARTY_NOTICES.md"):
        if (ROOT / name).exists():
            shutil.copyfile(ROOT / name, licences / (name if name != "LICENSE" else "LICENSE-linesmith.txt"))
    for wheel in other_wheels:
        copy_wheel_licences(wheel, licences)


def _write_extra_files(stage: Path, extra_files: dict[str, bytes] | None) -> None:
    """Write {relative path: bytes} into stage (tests and benchmarks only)."""
    for rel, data in (extra_files or {}).items():
        target = stage / rel
        target.parent.mkdir(parents=True, exist_ok=True)
        target.write_bytes(data)


def _fill_stage(stage: Path, tarball: Path, other_wheels: list[Path],
                cache_dir: Path, extra_files: dict[str, bytes] | None, node: str | None) -> dict:
    """Write the whole site into stage; return its manifest."""
    copy_pyodide(tarball, stage / "pyodide")
    wheel_dir = stage / "wheels"
    wheel_dir.mkdir()
    calc_wheel = build_calc_wheel(wheel_dir)
    for wheel in other_wheels:
        shutil.copyfile(wheel, wheel_dir / wheel.name)

    demos = load_demos()
    if not demos:
        raise BuildError("calc/data/demos/ holds no demo job; the page needs one to show a result.")
    _copy_site_files(stage, demos)
    _copy_licences(stage, other_wheels)

    lazy_names = compile_bytecode(stage / "pyodide", [calc_wheel, *other_wheels],
                                  wheel_dir / BYTECODE_FILE, cache_dir)
    write_boot_module(stage, lazy_names)
    # After everything it is made of (pyodide/, wheels/, linesmith_boot.py), before the page.
    snapshot = add_snapshot(stage, cache_dir, node) if lazy_names is not None else None
    render_page(stage, demos, [calc_wheel.name] + [w.name for w in other_wheels],
                BYTECODE_FILE if lazy_names is not None else None, snapshot)
    _write_extra_files(stage, extra_files)
    build_id = write_service_worker(stage)
    return write_manifest(stage, build_id, snapshot)


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
          extra_files: dict[str, bytes] | None = None, *, node: str | None = "auto") -> dict:
    """Build the static site into out_dir and return its manifest.

    The site is assembled in a fresh folder beside out_dir and then moved into
    place, so a half-finished build never replaces a working one. extra_files
    ({relative path: bytes}) are added to the site before the precache list and
    manifest are written: the offline tests stamp builds with them, the browser
    benchmark adds its bare-boot page to a temporary build. The shipped dist/
    is built without any. node is the Node.js that makes the engine's memory
    snapshot ("auto": the one on PATH; None: build without a snapshot).
    """
    out_dir = Path(out_dir).resolve()
    tarball = pyodide_tarball(cache_dir)
    other_wheels = third_party_wheels(cache_dir)

    out_dir.parent.mkdir(parents=True, exist_ok=True)
    stage = Path(tempfile.mkdtemp(prefix=f".{out_dir.name}-new-", dir=out_dir.parent))
    try:
        stage.chmod(0o755)  # mkdtemp makes it private; a served folder should not be
        manifest = _fill_stage(stage, tarball, other_wheels, cache_dir, extra_files, node)
        _swap_into_place(stage, out_dir)
    except BaseException:
        shutil.rmtree(stage, ignore_errors=True)
        raise
    return manifest
