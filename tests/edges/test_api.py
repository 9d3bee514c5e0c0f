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
