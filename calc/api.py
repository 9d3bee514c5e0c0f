"""JSON-string entry point for the browser worker (and any other caller).

The worker sends one JSON request and receives one JSON response; no Python
source is assembled anywhere. Requests:

- ``{"op": "evaluate", "job": {...}, "units": "metric" | "us"}`` -> ``{"ok": true, "result": {...}}``
  (with ``"units": "us"`` the figures inside the sentences of checks and messages are
  given in US units; the numbers of the result stay in engine units) or
  ``{"ok": false, "errors": [...], "warnings": [...]}``;
- ``{"op": "sweep", "job": {...}}`` -> the hydraulics only at each operating point
  (``calc.engine.sweep``), for the page's plots;
- ``{"op": "thread", "args": {"major_mm", "pitch_mm", "male", "tapered"}}`` -> thread candidates;
- ``{"op": "describe"}`` -> ``{"ok": true, "model": {...}}``.

``handle`` never raises: an internal error comes back as an error response
naming the exception, so the page can show it and compute again next time.
"""
from __future__ import annotations

import json

__all__ = ["handle", "dispatch"]

MAX_REQUEST_CHARS = 2_000_000


def dispatch(request: dict) -> dict:
    """Handle a parsed request (see the module docstring)."""
    if not isinstance(request, dict):
        return _err("", "the request must be a JSON object")
    op = request.get("op")
    if op == "evaluate":
        from .engine import evaluate
        from .units import localize_result
        res = evaluate(request.get("job"))
        if not res.get("ok"):
            return {"ok": False, "errors": res["errors"], "warnings": res.get("warnings", [])}
        return {"ok": True, "result": localize_result(res, request.get("units", "metric"))}
    if op == "sweep":
        from .engine import sweep
        res = sweep(request.get("job"))
        if not res.get("ok"):
            return {"ok": False, "errors": res["errors"], "warnings": res.get("warnings", [])}
        return {"ok": True, "result": res}
    if op == "describe":
        from .model import describe_job
        return {"ok": True, "model": describe_job()}
    if op == "thread":
        from . import threads
        return {"ok": True, "result": threads.identify(**request.get("args", {}))}
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


def dumps(obj, **kw) -> str:
    """JSON text with no NaN or infinity (they become null, never expected from the engine)."""
    try:
        return json.dumps(obj, allow_nan=False, **kw)
    except ValueError:
        from .engine import finite
        return json.dumps(finite(obj), allow_nan=False, **kw)


def _err(path: str, message: str) -> dict:
    return {"ok": False, "errors": [{"path": path, "message": message}], "warnings": []}
