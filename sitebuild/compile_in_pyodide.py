"""Runs inside Pyodide under Node.js: the engine's start-up modules as Python 3.14 bytecode.

compile_in_pyodide.mjs unpacks the shipped wheels and linesmith_boot.py into
site-packages, runs this file and calls ``main(imports)``. That (1) finds, from
the full packages, which submodule defines each name calc imports from fluids
and ht; (2) in a clean import state, imports ``imports`` through linesmith_boot's
lazy packages and evaluates each demo job once (which imports what the engine
loads on first use); (3) returns those modules' bytecode, and the table, in one
zip. Only the standard library; nothing here runs in the build's own Python.

This file must import no more than it does now: ``main`` takes the modules
already imported at its start as a bare boot, and a module imported here would
drop out of the standard-library bytecode it ships.
"""
import ast
import importlib
import importlib.util
import io
import json
import pathlib
import py_compile
import site
import sys
import zipfile
from importlib._bootstrap_external import _code_to_timestamp_pyc

PACKAGES = ("fluids", "ht")
ZIP_DATE = (1980, 1, 1, 0, 0, 0)
TABLE_NAME = "linesmith-lazy-names.json"  # read back by sitebuild/bytecode.py


def lazy_table(sp):
    """{package: {name: submodule}} for every name calc/**/*.py imports from fluids or ht."""
    wanted = {}
    for path in sorted(pathlib.Path(sp, "calc").rglob("*.py")):
        for node in ast.walk(ast.parse(path.read_text(encoding="utf-8"))):
            if isinstance(node, ast.ImportFrom) and node.level == 0 and node.module in PACKAGES:
                wanted.setdefault(node.module, set()).update(a.name for a in node.names)
    table = {}
    for package, names in sorted(wanted.items()):
        module = importlib.import_module(package)
        table[package] = {n: getattr(module, n).__module__[len(package) + 1:] for n in sorted(names)
                          if getattr(getattr(module, n, None), "__module__", "").startswith(package + ".")}
    return table


def import_as_the_page_does(sp, table, imports):
    """Forget fluids, ht and calc; import ``imports`` lazily and evaluate every demo job."""
    for name in [m for m in sys.modules if m.split(".")[0] in (*PACKAGES, "calc", "linesmith_boot")]:
        del sys.modules[name]
    import linesmith_boot  # only in Pyodide's site-packages, written there by the .mjs side
    linesmith_boot.install_lazy_packages(table)
    for name in imports:
        importlib.import_module(name)
    # The engine imports some modules on first use: evaluate every demo job, as the page does at start.
    for demo in sorted(pathlib.Path(sp, "calc", "data", "demos").glob("*.json")):
        job = json.loads(demo.read_text(encoding="utf-8"))
        sys.modules["calc.edges.api"].handle(json.dumps({"op": "evaluate", "job": job}))


def site_package_sources(sp):
    """The .py files in site-packages that are imported now, but for linesmith_boot.py."""
    return sorted({m.__file__ for m in list(sys.modules.values())
                   if (getattr(m, "__file__", None) or "").startswith(sp) and m.__file__.endswith(".py")
                   and not m.__file__.endswith("/linesmith_boot.py")})


def stdlib_bytecode(boot, sp):
    """Sourceless .pyc bytes of the standard-library modules the engine adds to a bare boot.

    Pyodide ships them as sources in its zip, so they too are compiled at every start.
    They go to linesmith-stdlib/ (put first on sys.path by linesmith_boot.prepare); only
    whole top-level modules and packages that a bare boot has not imported.
    """
    boot_tops = {m.split(".")[0] for m in boot}
    stdlib = {}
    for name, module in sorted(sys.modules.items()):
        where = getattr(module, "__file__", None) or ""
        if name in boot or name.split(".")[0] in boot_tops or ".zip" not in where or where.startswith(sp):
            continue
        source = module.__loader__.get_source(name)
        if source is None:
            continue
        is_package = hasattr(module, "__path__")
        rel = name.replace(".", "/") + ("/__init__.pyc" if is_package else ".pyc")
        stdlib[rel] = _code_to_timestamp_pyc(compile(source, where, "exec", dont_inherit=True))
    return stdlib


def bytecode_zip(sp, table, stdlib, sources):
    """The zip: the table, the standard-library .pyc files, checked-hash .pyc files of sources."""
    out = io.BytesIO()
    with zipfile.ZipFile(out, "w") as zf:
        zf.writestr(zipfile.ZipInfo(TABLE_NAME, ZIP_DATE), json.dumps(table, sort_keys=True))
        for rel, data in sorted(stdlib.items()):
            zi = zipfile.ZipInfo("linesmith-stdlib/" + rel, ZIP_DATE)
            zi.compress_type = zipfile.ZIP_DEFLATED
            zf.writestr(zi, bytes(data), compresslevel=9)
        for f in sources:
            c = importlib.util.cache_from_source(f)
            py_compile.compile(f, cfile=c, doraise=True,
                               invalidation_mode=py_compile.PycInvalidationMode.CHECKED_HASH)
            zi = zipfile.ZipInfo(c[len(sp):].lstrip("/"), ZIP_DATE)
            zi.compress_type = zipfile.ZIP_DEFLATED
            with open(c, "rb") as fh:
                zf.writestr(zi, fh.read(), compresslevel=9)
    return out.getvalue()


def main(imports):
    """Import ``imports`` (module names) as the page does; return the bytecode zip's bytes."""
    boot = set(sys.modules)  # a bare boot, plus what unpacking the wheels imported
    sp = site.getsitepackages()[0]
    importlib.invalidate_caches()
    table = lazy_table(sp)
    import_as_the_page_does(sp, table, imports)
    sources = site_package_sources(sp)
    return bytecode_zip(sp, table, stdlib_bytecode(boot, sp), sources)
