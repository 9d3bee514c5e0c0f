"""A seeded mutation fuzzer over the demo jobs, shared by tests/test_fuzz.py and bench/fuzz_long.py.

Each job is a demo job with one to three mutations at random places: a hostile value (a wrong type,
NaN, infinity, an integer beyond float range, nested lists of numbers, a boolean or text with a
decimal comma for a number, a lone surrogate, markup, a very long text), a number scaled, jittered
or moved to or just past its field's declared limits (``calc.model.job.JOB``), a key removed, set to null or
added, a list item copied or dropped. The job goes to the engine as a request through
``calc.edges.api.handle``, the way the page sends it, by one of its operations; a job file's bytes
go through the "open" operation. What must hold for every job:

- the reply is JSON with ``ok``; no exception escapes and no reply is an internal error;
- a refusal carries errors, each with a path (text) and a message;
- an accepted job's result holds only finite numbers, encodes as strict JSON, and its text report
  (metric and US) encodes as UTF-8 and, with the command line's fallback, as ASCII.
"""
from __future__ import annotations

import base64
import copy
import json
import math
import random
import re
from collections import Counter
from dataclasses import dataclass, field

from calc.edges.api import handle
from calc.edges.cli import OUTPUT_ERRORS
from calc.edges.report import text_report
from calc.model.job import JOB
from calc.model.schema import Field, ListOf, Record, Variants

from .jobs import demo_paths

#: Hostile values a field may be given, whatever it expects.
HOSTILE = (
    None, True, False, "", "x", "1,5", "85,5", "12,7 mm", "1e999", "NaN", [], {}, [1.0], [[1, 2], [3, [4]]],
    [[0, 0, 0], [1, 2]], [[10 ** 400, 0, 0], [1, 2, 3]], math.nan, math.inf, -math.inf, -1.0, 0.0, -0.0, 5e-324,
    1e-12, 1e300, -1e9, 2 ** 53 + 1, 10 ** 13, 10 ** 400, -(10 ** 400), "\ud800", "a\udfffb", "\udc80" * 3,
    "<img src=x onerror=alert(1)>", "x" * 6000, "\u202e\u0000\ufeff", {"kind": "hose"},
)
NESTED = ([[1, 2], [3, [4]]], [[[5.0]]], [[1e400, 0, 0]], [[10 ** 400, 1, 2], [3, 4, 5]])
SCALES = (0.0, -1.0, 1e-6, 0.1, 0.5, 0.9, 1.1, 2.0, 10.0, 1e3, 1e6)
UNKNOWN_KEYS = ("colour", "bore_mm ", "Bore_mm", "k\ud800", "__proto__", "constructor", "x" * 60)


def demo_jobs() -> list[dict]:
    return [json.loads(p.read_text(encoding="utf-8")) for p in demo_paths()]


# -- where things are in a job -------------------------------------------------------------------------
def _places(obj, path=()):
    """Every (container, key, path) of a job, depth first."""
    items = obj.items() if isinstance(obj, dict) else enumerate(obj) if isinstance(obj, list) else ()
    for key, value in items:
        yield obj, key, (*path, key)
        yield from _places(value, (*path, key))


def field_at(path) -> Field | None:
    """The job model's scalar field at a path of a job (None for containers and unknown keys)."""
    node = JOB
    for key in path:
        if isinstance(node, ListOf):
            node = node.item
            continue  # key is the index
        if isinstance(node, Variants):
            return None  # the part's kind decides; scaled numbers need no limits
        if isinstance(node, Record):
            node = next((f for f in node.fields if f.key == key), None)
            if node is None:
                return None
        else:
            return None
    return node if isinstance(node, Field) else None


def _limit_values(f: Field, rng: random.Random):
    lims = [v for v in (f.gt, f.ge, f.lt, f.le) if v is not None]
    if not lims:
        return rng.choice((-1.0, 0.0, 1e12, -1e12))
    v = rng.choice(lims)
    return rng.choice((v, v + 1e-9 * max(1.0, abs(v)), v - 1e-9 * max(1.0, abs(v)), v * 2, int(v)))


# -- mutations --------------------------------------------------------------------------------------------
def _leaf(job, rng, numeric=False):
    places = [p for p in _places(job) if not isinstance(p[0][p[1]], (dict, list))
              and (not numeric or type(p[0][p[1]]) in (int, float) and abs(p[0][p[1]]) < 1e300)]
    return rng.choice(places) if places else None


def _hostile(job, rng):
    place = _leaf(job, rng) if rng.random() < 0.8 else rng.choice(list(_places(job)))
    if place:
        value = rng.choice(HOSTILE + NESTED) if rng.random() < 0.9 else f"{rng.uniform(0, 200):.2f}".replace(".", ",")
        place[0][place[1]] = copy.deepcopy(value)
    return "hostile"


def _scale(job, rng):
    place = _leaf(job, rng, numeric=True)
    if place:
        place[0][place[1]] = place[0][place[1]] * rng.choice(SCALES)
    return "scale"


def _jitter(job, rng):
    place = _leaf(job, rng, numeric=True)
    if place:
        place[0][place[1]] = place[0][place[1]] * rng.uniform(0.7, 1.3)
    return "jitter"


def _limit(job, rng):
    place = _leaf(job, rng, numeric=True)
    f = field_at(place[2]) if place else None
    if f is not None and f.kind in ("number", "integer"):
        place[0][place[1]] = _limit_values(f, rng)
    return "limit"


def _drop_key(job, rng):
    places = [p for p in _places(job) if isinstance(p[0], dict)]
    if places:
        container, key, _ = rng.choice(places)
        if rng.random() < 0.5:
            del container[key]
        else:
            container[key] = None  # null: "not given" for an optional field, refused for a required one
    return "drop"


def _add_key(job, rng):
    dicts = [job] + [p[0][p[1]] for p in _places(job) if isinstance(p[0][p[1]], dict)]
    rng.choice(dicts)[rng.choice(UNKNOWN_KEYS)] = rng.choice((1, "x", None))
    return "add key"


def _list_item(job, rng):
    lists = [p[0][p[1]] for p in _places(job) if isinstance(p[0][p[1]], list) and p[0][p[1]]]
    if lists:
        items = rng.choice(lists)
        if rng.random() < 0.5 or len(items) < 2:
            items.append(copy.deepcopy(rng.choice(items)))
        else:
            items.pop(rng.randrange(len(items)))
    return "list item"


def _text(job, rng):
    texts = [p for p in _places(job) if isinstance(p[0][p[1]], str) and p[1] in ("name", "notes", "label")]
    if texts:
        container, key, _ = rng.choice(texts)
        container[key] = rng.choice(("test at 20 C", "Müller's \U0001F527 car", "\ud800", "é" * 201,
                                     "<script>alert(1)</script>", "line\nbreak\ttab", ""))
    return "text"


MUTATIONS = ((_hostile, 25), (_scale, 15), (_jitter, 20), (_limit, 15), (_drop_key, 10), (_add_key, 5),
             (_list_item, 5), (_text, 5))


def mutate(job: dict, rng: random.Random) -> tuple[dict, list[str]]:
    """A mutated copy of job and the names of the mutations applied."""
    job = copy.deepcopy(job)
    funcs, weights = zip(*MUTATIONS)
    done = [rng.choices(funcs, weights)[0](job, rng) for _ in range(rng.choice((1, 1, 1, 1, 2, 3)))]
    return job, done


# -- what must hold ---------------------------------------------------------------------------------------
class FuzzFailure(AssertionError):
    """A reply or a result that breaks a rule of the module docstring."""


def non_finite(obj, path="result"):
    """Paths of the non-finite floats in obj."""
    if isinstance(obj, float):
        return [] if math.isfinite(obj) else [path]
    if isinstance(obj, dict):
        return [p for k, v in obj.items() for p in non_finite(v, f"{path}.{k}")]
    if isinstance(obj, list):
        return [p for i, v in enumerate(obj) for p in non_finite(v, f"{path}[{i}]")]
    return []


_KINDS = (("lone surrogate", r"lone surrogate"), ("not valid JSON", r"not valid JSON"),
          ("not UTF-8", r"not UTF-8"), ("missing", r"is missing"), ("wrong type", r"must be (a number|text|"
          r"true or false|a list|an object)|three finite numbers"),
          ("not finite", r"finite number"), ("far too large or small", r"far too (large|small)"),
          ("outside limits", r"must be (at least|at most|greater than|less than|within)"),
          ("unknown key", r"not a (known key|key of)"), ("unknown choice", r"must be one of"),
          ("too long", r"longer than"), ("list length", r"needs at least|has more than"),
          ("version", r"version"), ("table lookup", r"has no -|unknown hose class|sizes:"))


def error_kind(message: str) -> str:
    """The kind of a refusal, for the fuzz figures; 'rule across fields' for the cross-field rules."""
    for kind, pattern in _KINDS:
        if re.search(pattern, message):
            return kind
    return "rule across fields"


def _check_refusal(reply, kinds: Counter):
    errors = reply.get("errors")
    if not errors:
        raise FuzzFailure(f"a refusal without errors: {reply}")
    for e in errors:
        if not isinstance(e.get("path"), str) or not isinstance(e.get("message"), str) or not e["message"]:
            raise FuzzFailure(f"an error without path or message: {e}")
        if "internal error" in e["message"] or "Traceback" in e["message"]:
            raise FuzzFailure(f"bad input reached an engine fault: {e}")
        kinds[error_kind(e["message"])] += 1


def _check_result(result, op: str):
    bad = non_finite(result)
    if bad:
        raise FuzzFailure(f"non-finite figures in the {op} result: {bad[:5]}")
    json.dumps(result, allow_nan=False)
    if op in ("evaluate", "open"):
        for units in ("metric", "us"):
            report = text_report(result, units=units)
            report.encode("utf-8")  # raises on a lone surrogate
            report.encode("ascii", OUTPUT_ERRORS)


def _request(job, op: str) -> str:
    if op == "open":
        data = json.dumps(job, indent=1).encode("utf-8", "surrogatepass")
        return json.dumps({"op": "open", "file_base64": base64.b64encode(data).decode("ascii")})
    return json.dumps({"op": op, "job": job})


@dataclass
class Tally:
    """The figures of a fuzz run."""

    tried: int = 0
    valid: int = 0
    refused: int = 0
    finite_checked: int = 0
    by_op: Counter = field(default_factory=Counter)
    by_mutation: Counter = field(default_factory=Counter)
    error_kinds: Counter = field(default_factory=Counter)
    failures: list = field(default_factory=list)


def check_job(job, op: str, tally: Tally) -> None:
    """Send job by op; count it; raise FuzzFailure on anything the rules forbid."""
    reply = json.loads(handle(_request(job, op)))
    tally.tried += 1
    tally.by_op[op] += 1
    if reply.get("internal"):
        raise FuzzFailure(f"internal error: {reply['errors']}")
    if reply.get("ok") is True:
        tally.valid += 1
        _check_result(reply["result"], op)
        tally.finite_checked += 1
    elif reply.get("ok") is False:
        tally.refused += 1
        _check_refusal(reply, tally.error_kinds)
    else:
        raise FuzzFailure(f"a reply without ok: {reply}")


OPS = (("evaluate", 80), ("open", 10), ("sweep", 5), ("drop_curve", 5))


def run(n: int, seed: int, keep_going: bool = False) -> Tally:
    """n mutated demo jobs from random.Random(seed); with keep_going, failures are collected, not raised."""
    rng = random.Random(seed)
    demos = demo_jobs()
    ops, weights = zip(*OPS)
    tally = Tally()
    for _ in range(n):
        job, done = mutate(rng.choice(demos), rng)
        tally.by_mutation.update(done)
        op = rng.choices(ops, weights)[0]
        try:
            check_job(job, op, tally)
        except Exception as exc:  # noqa: BLE001 - a fuzz run records every failure, of any kind
            if not keep_going:
                raise
            tally.failures.append({"op": op, "mutations": done, "error": f"{type(exc).__name__}: {exc}"[:500],
                                   "job": json.dumps(job)[:2000]})
    return tally
