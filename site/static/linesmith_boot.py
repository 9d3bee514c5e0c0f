"""Start-up helper of the browser engine: site/static/worker.js imports it in Pyodide.

``fluids`` and ``ht`` import every one of their submodules in their package
``__init__`` (54 modules together); the engine uses names from 7 of them. With
``install_lazy_packages`` the two packages start empty and each name the engine
imports (``from fluids import Darby3K``) loads only the submodule that defines it;
any other name loads the whole package as usual, so nothing can go missing.
The engine then imports 20 of those modules instead of 54, which shortens the
browser's start and the bytecode shipped for it (bench/browser_bench.py).

``LAZY_NAMES`` maps package -> {name: submodule}; build.py fills it in from the
shipped wheels themselves (running them in Pyodide). Empty means: plain imports.

``prepare`` also puts ``linesmith-stdlib/`` (beside this file, unpacked from
build.py's bytecode zip) first on ``sys.path``: compiled copies of the standard
library modules the engine imports that a bare Pyodide boot does not, which
Pyodide otherwise compiles from the sources in its zip at every start.
"""
import importlib
import importlib.util
import os
import sys

STDLIB_BYTECODE = os.path.join(os.path.dirname(os.path.abspath(__file__)), "linesmith-stdlib")


def prepare():
    """Everything the worker runs before importing the engine; returns what it did."""
    done = {"lazy": install_lazy_packages(), "stdlib_bytecode": False}
    if os.path.isdir(STDLIB_BYTECODE) and STDLIB_BYTECODE not in sys.path:
        sys.path.insert(0, STDLIB_BYTECODE)
        importlib.invalidate_caches()
        done["stdlib_bytecode"] = True
    return done

LAZY_NAMES = {}  # filled in by build.py

#: Set by the build's snapshot warm-up (sitebuild/snapshot_warmup.py) just before the memory
#: snapshot: {"engine_build": ..., "version": ...}. None in a plain boot.
SNAPSHOT_OF = None


def snapshot_check(version, engine_build):
    """After a restore: "" when this runtime is the snapshot of this engine build, else why not."""
    if SNAPSHOT_OF is None:
        return "the runtime holds no engine snapshot"
    import calc
    if calc.__version__ != version or SNAPSHOT_OF.get("version") != version:
        return f"the snapshot holds engine {calc.__version__}, the page is of engine {version}"
    if SNAPSHOT_OF.get("engine_build") != engine_build:
        return f"the snapshot is of engine build {str(SNAPSHOT_OF.get('engine_build'))[:12]}, " \
               f"the page of {engine_build[:12]}"
    return ""


def install_lazy_packages(table=None):
    """Put lazy stand-ins for the packages in ``table`` into ``sys.modules``; return their names."""
    installed = []
    for package, names in (LAZY_NAMES if table is None else table).items():
        if package in sys.modules:
            continue
        spec = importlib.util.find_spec(package)
        if spec is None or spec.submodule_search_locations is None:
            continue
        module = importlib.util.module_from_spec(spec)
        module.__getattr__ = _resolver(package, module, spec, dict(names))
        sys.modules[package] = module
        installed.append(package)
    return installed


def _resolver(package, module, spec, names):
    def __getattr__(attr):
        submodule = names.get(attr)
        if submodule is not None:
            value = getattr(importlib.import_module(f"{package}.{submodule}"), attr)
            setattr(module, attr, value)
            return value
        if attr.startswith("__") and attr.endswith("__"):
            raise AttributeError(attr)
        # Any other name: run the package's own __init__ now, into this module.
        del module.__getattr__
        spec.loader.exec_module(module)
        return getattr(module, attr)
    return __getattr__
