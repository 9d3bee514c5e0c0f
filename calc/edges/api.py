"""JSON-string entry point for the browser worker (and any other caller).

The worker sends one JSON request and receives one JSON response; no Python
source is assembled anywhere. Requests:

- ``{"op": "evaluate", "job": {...}, "units": "metric" | "us"}`` -> ``{"ok": true, "result": {...}}``
  (with ``"units": "us"`` the figures inside the sentences of checks and messages are
  given in US units; the numbers of the result stay in engine units) or
  ``{"ok": false, "errors": [...], "warnings": [...]}``;
- ``{"op": "sweep", "job": {...}}`` -> the hydraulics only at each operating point
  (``calc.pipeline.sweep``);
- ``{"op": "drop_curve", "job": {...}}`` -> pressure drop against fluid temperature for the
  page's plot: the sweep over the job's own temperature range (``calc.pipeline.drop_curve``);
- ``{"op": "thread", "args": {"major_mm", "pitch_mm", "male", "tapered"}}`` -> thread candidates;
- ``{"op": "describe"}`` -> ``{"ok": true, "model": {...}}`` (the job model).

``handle`` never raises: an internal error comes back as an error response
naming the exception, so the page can show it and compute again next time.
"""
from __future__ import annotations

import json
import math

from ..model.job import describe_job
from ..pipeline import drop_curve, evaluate, sweep
from ..system.threads import identify
from .units import localize_result

__all__ = ["handle", "dispatch", "dumps", "finite", "MAX_REQUEST_CHARS"]

MAX_REQUEST_CHARS = 2_000_000


def _refused(res: dict) -> dict:
    return {"ok": False, "errors": res["errors"], "warnings": res.get("warnings", [])}


def _thread(args) -> dict:
    return {"ok": True, "result": identify(**args)}


def dispatch(request: dict) -> dict:
    """Handle a parsed request (see the module docstring)."""
    if not isinstance(request, dict):
        return _err("", "the request must be a JSON object")
    op = request.get("op")
    if op == "evaluate":
        res = evaluate(request.get("job"))
        if not res.get("ok"):
            return _refused(res)
        return {"ok": True, "result": localize_result(res, request.get("units", "metric"))}
    if op in ("sweep", "drop_curve"):
        res = (sweep if op == "sweep" else drop_curve)(request.get("job"))
        return {"ok": True, "result": res} if res.get("ok") else _refused(res)
    if op == "describe":
        return {"ok": True, "model": describe_job()}
    if op == "thread":
        return _thread(request.get("args", {}))
    return _err("op", f"unknown operation {op!r}")


def handle(request_json: str) -> str:
    """Parse a JSON request, dispatch it, return the JSON response.

    Examples
    --------
    >>> json.loads(handle('{"op": "evaluate", "job": {"version": 1}}'))["errors"][0]["path"]
    'fluid'
    """
    try:
        if not isinstance(request_json, str) or len(request_json) > MAX_REQUEST_CHARS:
            return json.dumps(_err("", "the request is not text or is too large"))
        try:
            request = json.loads(request_json)
        except (ValueError, RecursionError) as exc:
            return json.dumps(_err("", f"the request is not valid JSON ({exc})"))
        return dumps(dispatch(request))
    except Exception as exc:  # the page must always get an answer it can show
        return json.dumps(_err("", f"internal error: {type(exc).__name__}: {exc}"))


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


def _err(path: str, message: str) -> dict:
    return {"ok": False, "errors": [{"path": path, "message": message}], "warnings": []}
