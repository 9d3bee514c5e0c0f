"""Fuzzing the engine over the job model with hypothesis.

Jobs are generated from the job model's own declaration (``calc.model.job.JOB``): mostly valid values
within each field's limits, sometimes a wrong type, NaN, infinity, a value out of range, a missing or
unknown key. Every generated job must either evaluate, with only finite numbers in the result, or
come back with field-named errors. No other exception, ever.
"""
import json
import math

from hypothesis import HealthCheck, given, settings, strategies as st

from calc import evaluate
from calc.edges.api import handle
from calc.model.schema import REQUIRED, Field, ListOf, Record, Variants
from calc.model.job import JOB

from .jobs import demo_job

BAD = st.sampled_from([None, "x", [], {}, True, math.nan, math.inf, -math.inf, -1.0, 0.0, 1e300, -1e9])


def _number(f: Field):
    lo = f.gt if f.gt is not None else f.ge
    hi = f.lt if f.lt is not None else f.le
    lo = -1e3 if lo is None else lo
    hi = 1e4 if hi is None else hi
    if f.kind == "integer":
        return st.integers(int(math.ceil(lo)) + (1 if f.gt is not None and float(lo).is_integer() else 0),
                           int(math.floor(hi)))
    return st.floats(lo, hi, exclude_min=f.gt is not None, exclude_max=f.lt is not None,
                     allow_nan=False, allow_infinity=False)


def _valid(f):
    if isinstance(f, Field):
        if f.kind in ("number", "integer"):
            return _number(f)
        if f.kind == "text":
            return st.text(max_size=30)
        if f.kind == "choice":
            return st.sampled_from(f.choices)
        if f.kind == "bool":
            return st.booleans()
        if f.kind == "points":
            pt = st.lists(st.floats(-2000, 2000, allow_nan=False), min_size=3, max_size=3)
            return st.lists(pt, min_size=2, max_size=6)
    if isinstance(f, ListOf):
        return st.lists(_value(f.item), min_size=max(f.min_items, 1), max_size=min(f.max_items, 4))
    if isinstance(f, Record):
        return _record(f)
    if isinstance(f, Variants):
        return st.sampled_from(sorted(f.variants)).flatmap(
            lambda tag: _record(f.variants[tag]).map(lambda d, tag=tag: {f.tag: tag, **d}))
    raise AssertionError(f)


def _value(f):
    return st.one_of(_valid(f), _valid(f), _valid(f), _valid(f), _valid(f), _valid(f), _valid(f), _valid(f),
                     _valid(f), BAD)


@st.composite
def _record_draw(draw, rec: Record):
    out = {}
    for f in rec.fields:
        required = getattr(f, "default", None) is REQUIRED
        present = draw(st.booleans()) if not required else draw(st.sampled_from([True] * 19 + [False]))
        if present:
            out[f.key] = draw(_value(f))
    if draw(st.integers(0, 30)) == 0:
        out["unexpected_key"] = 1
    return out


def _record(rec):
    return _record_draw(rec)


def _walk(obj, path="result"):
    if isinstance(obj, float):
        assert math.isfinite(obj), path
    elif isinstance(obj, dict):
        for k, v in obj.items():
            _walk(v, f"{path}.{k}")
    elif isinstance(obj, list):
        for i, v in enumerate(obj):
            _walk(v, f"{path}[{i}]")


def _check(job):
    res = evaluate(job)
    if res["ok"]:
        _walk(res)
        json.dumps(res, allow_nan=False)
    else:
        assert res["errors"]
        for e in res["errors"]:
            assert isinstance(e["path"], str) and e["message"]


@settings(max_examples=300, deadline=None, suppress_health_check=[HealthCheck.too_slow,
                                                                    HealthCheck.data_too_large])
@given(_record(JOB).map(lambda d: {**d, "version": 1}))
def test_generated_jobs_evaluate_or_name_their_errors(job):
    # Source: stated behaviour (issue: every generated job evaluates or returns field-named errors).
    _check(job)


@st.composite
def _demo_mutation(draw):
    """The demo job with one field of one part, line or section replaced by a drawn value."""
    job = demo_job()
    target = draw(st.sampled_from(["pump", "gear", "fluid", "part", "condition"]))
    if target == "part":
        ln = draw(st.sampled_from(job["lines"]))
        part = draw(st.sampled_from(ln["parts"]))
        key = draw(st.sampled_from(sorted(part)))
        if key != "kind":
            part[key] = draw(st.one_of(BAD, st.floats(-1e3, 1e5, allow_nan=False)))
    elif target == "condition":
        job["conditions"] = [{"name": "x", "engine_rpm": draw(st.floats(-10, 20000, allow_nan=False)),
                              "fluid_temp_c": draw(st.floats(-80, 250, allow_nan=False)),
                              "full_lock": draw(st.booleans())}]
    else:
        sec = job[target]
        if target == "fluid":
            sec.update({"visc_40c_cst": draw(st.floats(0.1, 20000, allow_nan=False)),
                        "visc_100c_cst": draw(st.floats(0.1, 2000, allow_nan=False))})
        else:
            key = draw(st.sampled_from(sorted(sec)))
            sec[key] = draw(st.one_of(BAD, st.floats(-1e3, 1e5, allow_nan=False)))
    return job


@settings(max_examples=300, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(_demo_mutation())
def test_mutated_demo_jobs_evaluate_or_name_their_errors(job):
    # Source: stated behaviour; mutations of a valid job reach deeper into the engine than random jobs.
    _check(job)


def test_api_survives_hostile_requests():
    # Source: stated behaviour (the worker always gets an answer it can show).
    nested = "[" * 100000 + "]" * 100000
    for req in ("", "{", "null", "[]", '{"op": 5}', '{"op": "evaluate"}', nested,
                json.dumps({"op": "evaluate", "job": {"version": 1, "name": "<script>alert(1)</script>"}}),
                "x" * 3_000_000):
        out = json.loads(handle(req))
        assert out["ok"] is False and out["errors"]
    job = demo_job()
    job["name"] = "<img src=x onerror=alert(1)>"
    out = json.loads(handle(json.dumps({"op": "evaluate", "job": job})))
    assert out["ok"] and out["result"]["job_name"] == job["name"]  # returned as plain text data
