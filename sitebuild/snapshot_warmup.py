"""Runs inside Pyodide under Node.js just before the memory snapshot: warm the engine up.

make_snapshot.mjs unpacks the shipped wheels, the bytecode zip and linesmith_boot.py into
site-packages (as the page's worker does), runs this file and calls ``main(engine_build)``.
That (1) runs ``linesmith_boot.prepare()`` as the worker does; (2) imports every module of
the ``calc`` package; (3) runs every operation of ``calc.edges.api`` once on every demo job,
in both unit systems, a refused job and a refused request included, so that whatever the
engine imports on first use is in the snapshot; (4) records the engine build this snapshot
belongs to in ``linesmith_boot`` (checked by the worker after a restore). fluids and ht keep
their lazy stand-ins: a name the warm-up did not use loads its submodule late, from the
wheels the worker unpacks again after a restore. Only the standard library and the engine.
"""
import base64
import gc
import importlib
import json
import pathlib
import pkgutil
import site
import sys

# One request of every operation of calc/edges/api.py (OPERATIONS) besides those made per demo.
THREAD_REQUEST = {"op": "thread", "args": {"major_mm": 15.9, "pitch_mm": 1.41, "male": True}}
BAD_JOB = {"version": 1, "lines": []}  # refused: exercises the validator's error paths


def import_engine():
    """Import calc and every one of its submodules (not its command line's ``__main__``)."""
    import calc
    names = [m.name for m in pkgutil.walk_packages(calc.__path__, "calc.") if not m.name.endswith("__main__")]
    for name in names:
        importlib.import_module(name)
    return len(names)


def run_every_operation(handle, demo_dir):
    """Every operation once per demo job (evaluate in both unit systems); return the count.

    Opening a job file goes through the same evaluation, so it runs on the first demo only;
    a collection after each request keeps the heap inside the runtime's initial memory,
    which a restore cannot grow (see make_snapshot.mjs).
    """
    def ask(request):
        json.loads(handle(json.dumps(request)))
        gc.collect()

    count = 0
    for n, path in enumerate(sorted(pathlib.Path(demo_dir).glob("*.json"))):
        raw = path.read_bytes()
        job = json.loads(raw)
        requests = [{"op": "evaluate", "job": job}, {"op": "evaluate", "job": job, "units": "us"},
                    {"op": "sweep", "job": job}, {"op": "drop_curve", "job": job}]
        if n == 0:
            requests.append({"op": "open", "file_base64": base64.b64encode(raw).decode("ascii")})
        for request in requests:
            ask(request)
            count += 1
    for request in (THREAD_REQUEST, {"op": "describe"}, {"op": "evaluate", "job": BAD_JOB},
                    {"op": "no-such-op"}):
        ask(request)
        count += 1
    return count


def main(engine_build):
    """Warm the engine up and record engine_build; return what was done (for the build's log)."""
    import linesmith_boot  # written into site-packages by make_snapshot.mjs
    prepared = linesmith_boot.prepare()
    modules = import_engine()
    api = sys.modules["calc.edges.api"]
    sp = site.getsitepackages()[0]
    requests = run_every_operation(api.handle, pathlib.Path(sp, "calc", "data", "demos"))
    faults = len(api.FAULTS)
    if faults:
        raise RuntimeError(f"the engine faulted during the warm-up: {api.FAULTS[-1]}")
    import calc
    linesmith_boot.SNAPSHOT_OF = {"engine_build": engine_build, "version": calc.__version__}
    gc.collect()
    return {"calc_modules": modules, "requests": requests, "lazy": list(prepared["lazy"]),
            "modules_loaded": len(sys.modules)}
