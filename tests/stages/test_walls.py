"""Lines near a heat source, through the whole engine: the part's own air in the heat balance and the steady
temperature, the cooler and reservoir in the job's air, and the wall estimate in the result."""
import copy

import pytest

from calc import evaluate
from calc.physics.lumped import STEADY_TOL_K

from ..jobs import demo_job, simple_job


def hot_job(local_c=300.0, limit_c=121.0):
    """A pressure hose routed past an exhaust manifold (invented); part 1 of line 1 is the hose."""
    job = simple_job()
    job["lines"][0]["parts"] = [
        {"kind": "fitting", "bore_mm": 6.5, "family": "jic-37", "dash": 6},
        {"kind": "hose", "class": "SAE 100R2AT", "dash": 6, "length_m": 0.8, "max_temp_c": limit_c,
         "local_air_temp_c": local_c},
        {"kind": "fitting", "bore_mm": 6.5, "family": "jic-37", "dash": 6}]
    job["conditions"] = [
        {"name": "idle", "engine_rpm": 800, "fluid_temp_c": 85, "duty_percent": 60, "air_speed_m_s": 0.5},
        {"name": "cruise", "engine_rpm": 2200, "fluid_temp_c": 80, "duty_percent": 40, "air_speed_m_s": 4.0}]
    job["thermal"] = {"air_temp_c": 50.0, "reservoir_area_m2": 0.05, "reservoir_h_w_m2k": 10.0}
    return job


def test_part_in_hotter_air_gains_heat_and_the_reservoir_keeps_the_jobs_air():
    r = evaluate(hot_job())
    assert r["ok"], r.get("errors")
    for cond in r["conditions"]:
        det = cond["heat_rejected_detail"]
        hot = next(p for p in det["parts"] if p["line"] == 0 and p["part"] == 1)
        # Source: effectiveness-NTU with the air as an infinite reservoir (Bergman et al. ch. 11), exact in sign:
        # heat leaves the fluid as C eps (T - T_air), negative for 300 C air round 80-85 C fluid.
        assert hot["air_temp_c"] == 300.0 and hot["heat_w"] < 0.0
        assert cond["fluid_temp_c"] < hot["surface_temp_c"] < 300.0
        # Source: the reservoir model, exact: area x film coefficient x (T - under-hood air)
        assert det["reservoir_w"] == pytest.approx(0.05 * 10.0 * (cond["fluid_temp_c"] - 50.0), rel=1e-12)
        others = [p for p in det["parts"] if p is not hot]
        assert others and all(p["air_temp_c"] == 50.0 for p in others)


def test_steady_temperature_rises_with_a_part_in_hot_air_and_still_balances():
    base = evaluate(hot_job(local_c=None))["thermal"]
    hot = evaluate(hot_job())["thermal"]
    assert base["steady"]["status"] == hot["steady"]["status"] == "converged"
    # Source: first-law balance, sign exact: a surface that adds heat can only raise the steady temperature.
    assert hot["steady_temp_c"] > base["steady_temp_c"] + 1.0
    # Source: consistency of the solver (both sides the engine's): heat in = heat out within the bracket
    # tolerance times the balance's slope (a few W/K).
    assert hot["steady_heat_w"] == pytest.approx(hot["steady_rejected_w"], abs=STEADY_TOL_K * 20)
    assert any(m.startswith("Parts with their own 'Air temperature around this part'") for m in hot["method"])
    assert not any(m.startswith("Parts with their own") for m in base["method"])


def test_steady_bracket_starts_at_the_coolest_air_of_any_surface():
    # A long tube in air at -30 C (a line run outside the engine bay, invented) cools the fluid below the 50 C
    # under-hood air: the bracket must start at -30 C, not at 50 C (where it used to say "no net heat").
    job = simple_job()
    job["lines"][0]["parts"].append({"kind": "tube", "od_mm": 9.525, "wall_mm": 0.889, "length_m": 6.0,
                                     "local_air_temp_c": -30.0})
    job["conditions"] = [{"name": "run", "engine_rpm": 1500, "fluid_temp_c": 40, "duty_percent": 100,
                          "air_speed_m_s": 5}]
    job["thermal"] = {"air_temp_c": 50.0}
    th = evaluate(job)["thermal"]
    assert th["steady"]["status"] == "converged"
    assert -30.0 < th["steady_temp_c"] < 50.0
    # Source: consistency of the solver, as above
    assert th["steady_heat_w"] == pytest.approx(th["steady_rejected_w"], abs=STEADY_TOL_K * 40)


def test_outer_wall_is_the_surface_the_heat_balance_uses():
    # Source: declared once: the wall estimate and the heat balance use the same resistances in series
    # (calc.system.walls and calc.system.thermal_model), so at a point with flow the outer surface equals the
    # surface temperature of the heat rejected, to the iteration's 0.01 K.
    r = evaluate(demo_job("swap-remote-reservoir"))
    for ln in r["lines"]:
        for w in ln["walls"]:
            for ci, pt in enumerate(w["points"]):
                if not pt["flow"]:
                    continue
                det = next(p for p in r["conditions"][ci]["heat_rejected_detail"]["parts"]
                           if p["line"] == ln["index"] and p["part"] == w["index"])
                assert pt["outer_c"] == pytest.approx(det["surface_temp_c"], abs=0.01)


def test_demos_without_a_local_air_judge_no_wall():
    # Source: the check's rule (no own air, wall no hotter than the fluid: the fluid check judges the part).
    for name in ("compact-hatch", "light-truck-high-flow"):
        r = evaluate(demo_job(name))
        assert all(w["verdict"] is None and w["local_air_temp_c"] is None for ln in r["lines"] for w in ln["walls"])
        assert not any(c["check"] == "wall temperature" for ln in r["lines"] for c in ln["checks"])
    swap = evaluate(demo_job("swap-remote-reservoir"))
    judged = [(ln["index"], w["job_part"]) for ln in swap["lines"] for w in ln["walls"] if w["verdict"]]
    assert judged == [(0, 1)]  # the pressure hose past the manifold, and only it
