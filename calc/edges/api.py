"""JSON-string entry point for the browser worker (and any other caller).

The worker sends one JSON request and receives one JSON response; no Python
source is assembled anywhere. Requests:

- ``{"op": "evaluate", "job": {...}, "units": "metric" | "us"}`` -> ``{"ok": true, "result": {...}}``
  (with ``"units": "us"`` the figures inside the sentences of checks and messages are
  given in US units; the numbers of the result stay in engine units) or
  ``{"ok": false, "errors": [...], "warnings": [...]}``;
- ``{"op": "open", "file_base64": "...", "units": ...}`` -> a job file's bytes (base64) read by
  ``calc.edges.jobfile.read_job_bytes``, the reader of the command line, then evaluated:
  ``{"ok": true, "job": {...as written, less explicit nulls}, "result": {...}}`` or the errors;
- ``{"op": "sweep", "job": {...}}`` -> the hydraulics only at each operating point
  (``calc.pipeline.sweep``);
- ``{"op": "drop_curve", "job": {...}}`` -> pressure drop against fluid temperature for the
  page's plot: the sweep over the job's own temperature range (``calc.pipeline.drop_curve``);
- ``{"op": "thread", "args": {"major_mm", "pitch_mm" or "pitch_tpi", "male", "tapered", "seat"}}`` ->
  thread candidates (``calc.system.threads.identify``; ``male`` true when not given, ``tapered`` and
  ``seat`` null when not known; a ``pitch_mm`` over 6 is read as threads per inch, and said so);
- ``{"op": "describe"}`` -> ``{"ok": true, "model": {...}}`` (the job model).

A request with a key its operation does not take, or an argument of the wrong kind, is refused
with the argument's path (``units``, ``args.male``); the job's own problems keep the job's paths
(``pump.relief_bar``). ``handle`` never raises: a fault of the engine itself comes back as
``{"ok": false, "internal": true, "errors": [{"path": "", "message": "internal error: ..."}]}``
and its traceback is kept in :data:`FAULTS`, where the tests look for it. Only a fault of the
engine answers "internal error"; bad input never does.
"""
from __future__ import annotations

import base64
import binascii
import json
import math
import traceback
from collections import deque

from ..model.job import describe_job
from ..model.schema import REQUIRED, Field, Record, key_text
from ..pipeline import drop_curve, evaluate, sweep
from ..data.tables import thread_seats
from ..system.threads import READING_RANGES, SEAT_KEYS, BadReading, identify
from .jobfile import loads, read_job_bytes, without_nulls
from .units import localize_result

__all__ = ["handle", "dispatch", "dumps", "finite", "MAX_REQUEST_CHARS", "FAULTS", "THREAD_ARGS", "SEAT_LABELS", "OPERATIONS"]

MAX_REQUEST_CHARS = 2_000_000

#: Tracebacks of the last faults of the engine (never of bad input), newest last.
FAULTS: deque = deque(maxlen=20)

_UNITS = Field("units", "Display units", "choice", default="metric", choices=("metric", "us"))
_FILE = Field("file_base64", "Job file (base64)", "text", default=REQUIRED, max_length=MAX_REQUEST_CHARS)


def _reading(key: str, label: str, unit, default, help: str) -> Field:
    lo, hi = READING_RANGES[key]
    return Field(key, label, unit=unit, default=default, gt=lo, lt=hi, help=help)


#: The thread operation's arguments (limits from ``calc.system.threads.READING_RANGES``); the page
#: takes its labels and the seat answers from this declaration.
THREAD_ARGS = Record("args", "Thread reading", (
    _reading("major_mm", "Measured diameter", "length_mm", REQUIRED,
             "Male thread: the major diameter, calipers across the crests. Female thread: the minor diameter, "
             "the bore across the crests inside the port."),
    _reading("pitch_mm", "Pitch in mm", "length_mm", None,
             "Distance from crest to crest. A reading over 6 mm is read as threads per inch."),
    _reading("pitch_tpi", "Threads per inch", None, None, "Crests counted over one inch (inch thread gauge)."),
    Field("male", "Male thread (external)", "bool", default=True,
          help="Male: the thread is on the outside. Female: it is inside a port."),
    Field("tapered", "Looks tapered", "bool", default=None, help="Empty: not sure."),
    Field("seat", "Seat or sealing face", "choice", default=None, choices=SEAT_KEYS,
          help="What seals the joint besides the thread. Empty: not sure."),
))
#: The seat answers in words, by key (``calc.data.tables.thread_seats``).
SEAT_LABELS = {s["key"]: s["label"] for s in thread_seats()}

#: What a request must give with its operation, in words.
_NEEDS = {"job": "the job as a JSON object", "args": "major_mm and pitch_mm (or pitch_tpi)",
          "file_base64": "the job file's bytes in base64"}
#: Each operation and the keys its request takes besides "op".
OPERATIONS = {"evaluate": ("job", "units"), "open": ("file_base64", "units"), "sweep": ("job",),
              "drop_curve": ("job",), "thread": ("args",), "describe": ()}


def _err(path: str, message: str) -> dict:
    return {"ok": False, "errors": [{"path": path, "message": message}], "warnings": []}


def _refused(res: dict) -> dict:
    return {"ok": False, "errors": res["errors"], "warnings": res.get("warnings", [])}


def _problems(request: dict) -> list[dict]:
    """What is wrong with the request itself (not with its job), each with its path."""
    op = request.get("op")
    if not isinstance(op, str) or op not in OPERATIONS:
        got = "nothing" if op is None else json.dumps(op)[:40]
        return [{"path": "op", "message": f"must be one of {', '.join(map(repr, OPERATIONS))}, got {got}"}]
    takes = OPERATIONS[op]
    out = [{"path": key_text(key), "message": f"is not a key of the {op!r} operation (it takes "
                                              f"{', '.join(takes) or 'nothing else'})"}
           for key in request if key != "op" and key not in takes]
    out += [{"path": key, "message": f"is missing: give {_NEEDS[key]}"}
            for key in takes if key in _NEEDS and key not in request]
    problems: list = []
    for key, spec in (("args", THREAD_ARGS), ("units", _UNITS), ("file_base64", _FILE)):
        if key in takes and key in request and (key in _NEEDS or request[key] is not None):
            spec.check(request[key], key, problems, [])  # units: null means "not given"
    return out + [p.as_dict() for p in problems]


def _open(request: dict) -> dict:
    try:
        data = base64.b64decode(request["file_base64"], validate=True)
    except (binascii.Error, ValueError):
        return _err("file_base64", "is not base64 text: give the file's bytes in base64")
    job, errors = read_job_bytes(data)
    if errors:
        return {"ok": False, "errors": errors, "warnings": []}
    res = evaluate(job)
    if not res.get("ok"):
        return _refused(res)
    return {"ok": True, "job": without_nulls(job), "result": localize_result(res, request.get("units") or "metric")}


def dispatch(request) -> dict:
    """Handle a parsed request (see the module docstring)."""
    if not isinstance(request, dict):
        return _err("", "the request must be a JSON object")
    problems = _problems(request)
    if problems:
        return {"ok": False, "errors": problems, "warnings": []}
    op = request["op"]
    if op == "evaluate":
        res = evaluate(request["job"])
        if not res.get("ok"):
            return _refused(res)
        return {"ok": True, "result": localize_result(res, request.get("units") or "metric")}
    if op in ("sweep", "drop_curve"):
        res = (sweep if op == "sweep" else drop_curve)(request["job"])
        return {"ok": True, "result": res} if res.get("ok") else _refused(res)
    if op == "open":
        return _open(request)
    if op == "thread":
        args = THREAD_ARGS.check(request["args"], "args", [], [])
        try:
            return {"ok": True, "result": identify(**args)}
        except BadReading as exc:  # both pitches or neither: named by the argument, never a fault
            key, _, message = str(exc).partition(": ")
            return _err(f"args.{key}", message)
    return {"ok": True, "model": describe_job()}


def _fault(exc: BaseException) -> str:
    FAULTS.append(traceback.format_exc())
    reply = _err("", f"internal error: {type(exc).__name__}: {exc}")
    return json.dumps({**reply, "internal": True})


def handle(request_json: str) -> str:
    """Parse a JSON request, dispatch it, return the JSON response.

    Examples
    --------
    >>> json.loads(handle('{"op": "evaluate", "job": {"version": 1}}'))["errors"][0]["path"]
    'fluid'
    >>> json.loads(handle('{"op": "thread", "args": {"major_mm": 14.2, "pitch_mm": 1.41, "male": "no"}}'))["errors"]
    [{'path': 'args.male', 'message': "must be true or false, got text 'no'"}]
    """
    try:
        if not isinstance(request_json, str) or len(request_json) > MAX_REQUEST_CHARS:
            return json.dumps(_err("", "the request is not text or is too large"))
        try:
            request = loads(request_json)
        except (ValueError, RecursionError) as exc:
            return json.dumps(_err("", f"the request is not valid JSON ({exc})"))
        return dumps(dispatch(request))
    except Exception as exc:  # the page must always get an answer it can show
        return _fault(exc)


def finite(obj):
    """Replace non-finite floats by None so a result is valid JSON.

    Never expected (the fuzz tests check that ``evaluate`` gives only finite
    numbers); the JSON edges fall back to it if encoding with ``allow_nan=False``
    ever fails, rather than emit NaN.

    Examples
    --------
    >>> finite({"a": [1.0, float("nan")]})
    {'a': [1.0, None]}
    """
    if isinstance(obj, float):
        return obj if math.isfinite(obj) else None
    if isinstance(obj, dict):
        return {k: finite(v) for k, v in obj.items()}
    if isinstance(obj, list):
        return [finite(v) for v in obj]
    return obj


def dumps(obj, **kw) -> str:
    """JSON text with no NaN or infinity (they become null, never expected from the engine)."""
    try:
        return json.dumps(obj, allow_nan=False, **kw)
    except ValueError:
        return json.dumps(finite(obj), allow_nan=False, **kw)
