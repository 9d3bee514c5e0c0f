"""The JSON API the browser worker calls."""
import pytest

from calc import evaluate

from ..jobs import demo_job


def test_sweep_gives_the_same_drops_as_evaluate():
    # Source: exact (the sweep is the same circuit solve without per-part detail).
    import json as _json
    from calc.edges.api import handle
    job = demo_job()
    job["conditions"] = [{"name": f"t{t}", "engine_rpm": 1500, "fluid_temp_c": t} for t in (-10, 30, 90)]
    full = evaluate(job)
    sw = _json.loads(handle(_json.dumps({"op": "sweep", "job": job})))
    assert sw["ok"]
    for a, b in zip(full["conditions"], sw["result"]["conditions"]):
        for la, lb in zip(a["lines"], b["lines"]):
            assert lb["pressure_drop_bar"] == pytest.approx(la["pressure_drop_bar"], rel=1e-12)


def test_drop_curve_spans_the_jobs_temperatures_at_its_fastest_running_point():
    # Source: exact (the curve is the sweep solve at the temperatures it reports).
    import json as _json
    from calc.edges.api import handle
    job = demo_job()
    job["conditions"] = [{"name": "cold", "engine_rpm": 900, "fluid_temp_c": -20},
                         {"name": "fast", "engine_rpm": 2500, "fluid_temp_c": 80},
                         {"name": "lock", "engine_rpm": 3000, "fluid_temp_c": 100, "full_lock": True}]
    out = _json.loads(handle(_json.dumps({"op": "drop_curve", "job": job})))
    assert out["ok"]
    curve = out["result"]
    assert curve["engine_rpm"] == 2500  # the fastest point not at full lock
    temps = [c["fluid_temp_c"] for c in curve["conditions"]]
    assert temps[0] == -20 and temps[-1] == 100 and len(temps) == 9
    sweep_job = dict(job, conditions=[{"name": c["name"], "engine_rpm": 2500, "fluid_temp_c": c["fluid_temp_c"]}
                                      for c in curve["conditions"]])
    sw = _json.loads(handle(_json.dumps({"op": "sweep", "job": sweep_job})))["result"]
    for a, b in zip(curve["conditions"], sw["conditions"]):
        for la, lb in zip(a["lines"], b["lines"]):
            assert la["pressure_drop_bar"] == pytest.approx(lb["pressure_drop_bar"], rel=1e-12)
    bad = _json.loads(handle(_json.dumps({"op": "drop_curve", "job": {"version": 1}})))
    assert not bad["ok"] and bad["errors"][0]["path"] == "fluid"


# -- every bad argument of every operation is named -----------------------------------------------
def _reply(request) -> dict:
    import json as _json
    from calc.edges.api import handle
    return _json.loads(handle(request if isinstance(request, str) else _json.dumps(request)))


_READING = {"major_mm": 14.2, "pitch_mm": 25.4 / 18}


def _thread(**args):
    return {"op": "thread", "args": {**_READING, **args}}


@pytest.mark.parametrize("request_, path, words", [
    ({}, "op", "got nothing"),
    ({"op": 5}, "op", "must be one of"),
    ({"op": ["evaluate"]}, "op", "must be one of"),
    ({"op": "frobnicate"}, "op", "must be one of"),
    ([], "", "must be a JSON object"),
    ({"op": "evaluate"}, "job", "is missing"),
    ({"op": "evaluate", "job": None}, "job", "must be an object"),
    ({"op": "evaluate", "job": demo_job(), "units": "imperial"}, "units", "one of 'metric', 'us'"),
    ({"op": "evaluate", "job": demo_job(), "units": True}, "units", "one of 'metric', 'us'"),
    ({"op": "evaluate", "job": demo_job(), "jobs": []}, "jobs", "not a key of the 'evaluate' operation"),
    ({"op": "sweep", "job": demo_job(), "units": "us"}, "units", "not a key of the 'sweep' operation"),
    ({"op": "drop_curve"}, "job", "is missing"),
    ({"op": "describe", "job": {}}, "job", "not a key of the 'describe' operation"),
    ({"op": "open"}, "file_base64", "is missing"),
    ({"op": "open", "file_base64": 5}, "file_base64", "must be text"),
    ({"op": "open", "file_base64": "not base64!"}, "file_base64", "not base64"),
    ({"op": "open", "file_base64": "e30=", "units": "si"}, "units", "one of 'metric', 'us'"),
    ({"op": "thread"}, "args", "is missing"),
    ({"op": "thread", "args": [14.2, 1.41]}, "args", "must be an object"),
    ({"op": "thread", "args": {"pitch_mm": 1.41}}, "args.major_mm", "is missing"),
    (_thread(major_mm="14.2"), "args.major_mm", "must be a number"),
    (_thread(major_mm="14,2"), "args.major_mm", "must be a number"),
    (_thread(major_mm=True), "args.major_mm", "must be a number"),
    (_thread(major_mm=10 ** 400), "args.major_mm", "far too large"),
    (_thread(major_mm=[14.2]), "args.major_mm", "must be a number"),
    (_thread(major_mm=500), "args.major_mm", "less than 200"),
    (_thread(pitch_mm=0), "args.pitch_mm", "greater than 0.2"),
    (_thread(pitch_mm=None), "args.pitch_mm", "is missing: give the pitch in mm or in threads per inch"),
    (_thread(pitch_tpi=18), "args.pitch_tpi", "give the pitch once"),
    (_thread(pitch_mm=None, pitch_tpi=1), "args.pitch_tpi", "greater than 2"),
    (_thread(pitch_mm=None, pitch_tpi="18"), "args.pitch_tpi", "must be a number"),
    (_thread(pitch_mm=None, pitch_tpi=500), "args.pitch_tpi", "less than 100"),
    (_thread(pitch_mm=100), "args.pitch_mm", "less than 100"),
    (_thread(seat="45"), "args.seat", "must be one of 'flare-37'"),
    (_thread(seat=37), "args.seat", "must be one of"),
    (_thread(male="no"), "args.male", "true or false"),
    (_thread(male=0), "args.male", "true or false"),
    (_thread(tapered="yes"), "args.tapered", "true or false"),
    (_thread(handed="left"), "args.handed", "not a known key"),
    ('{"op": "thread", "args": {"major_mm": NaN, "pitch_mm": 1.41}}', "args.major_mm", "finite"),
    ('{"op": "thread", "args": {"major_mm": 14.2, "pitch_mm": 1e999}}', "args.pitch_mm", "finite"),
])
def test_every_bad_argument_of_every_operation_is_named(request_, path, words):
    # Source: stated behaviour (issue 16): a field-named error for every bad argument, never "internal error".
    out = _reply(request_)
    assert out["ok"] is False and "internal" not in out, out
    assert any(e["path"] == path and words in e["message"] for e in out["errors"]), out["errors"]
    assert not any("internal error" in e["message"] for e in out["errors"])


def test_thread_arguments_left_out_or_null_take_their_defaults():
    # Source: stated defaults (male when not given, taper not known) and null meaning "not given".
    given = _reply({"op": "thread", "args": {**_READING, "male": True, "tapered": None}})
    assert given["ok"] and _reply({"op": "thread", "args": dict(_READING)}) == given
    assert _reply(_thread(male=None)) == given
    female = _reply(_thread(male=False))
    assert female["ok"] and female != given


def test_a_fault_of_the_engine_is_marked_and_kept_for_the_tests(monkeypatch):
    # Source: stated behaviour: only a fault of the engine answers "internal error", marked and findable.
    from calc.edges import api

    def broken(job):
        raise ZeroDivisionError("simulated fault")
    monkeypatch.setattr(api, "evaluate", broken)
    out = _reply({"op": "evaluate", "job": demo_job()})
    assert out == {"ok": False, "internal": True, "warnings": [],
                   "errors": [{"path": "", "message": "internal error: ZeroDivisionError: simulated fault"}]}
    assert len(api.FAULTS) == 1 and "in broken" in api.FAULTS[0] and "ZeroDivisionError" in api.FAULTS[0]
    api.FAULTS.clear()  # made on purpose; tests/conftest.py fails any other test that leaves one
