"""The circuit stage: operating points and hydraulic checks of whole jobs."""
import pytest

from calc import evaluate

from ..jobs import demo_job, simple_job

LPM = 1 / 60000


def test_hydraulic_power_common_practice_formula():
    # Source: hydraulic power [hp] = p [psi] Q [gpm] / 1714 (common practice, no source);
    # 1 hp = 745.7 W (mechanical horsepower, NIST SP 811).
    res = evaluate(demo_job())
    c = res["conditions"][1]
    p_psi = c["pump_outlet_bar"] * 14.503773773
    q_gpm = c["circuit_flow_lpm"] / 3.785411784
    watts = c["pump_outlet_bar"] * 1e5 * c["circuit_flow_lpm"] * LPM
    assert watts / 745.6999 == pytest.approx(p_psi * q_gpm / 1714, rel=2e-3)


def test_transition_band_is_flagged_in_the_result():
    # Source: stated behaviour (regime reported; a caution names the conditions in the band).
    job = simple_job(bore_mm=6.0, flow_lpm=8.0)
    job["conditions"] = [{"name": "warm", "engine_rpm": 3000, "fluid_temp_c": 100}]
    res = evaluate(job)
    regimes = {p["regime"] for ln in res["conditions"][0]["lines"] for p in ln["parts"]}
    assert "transitional" in regimes
    assert any(c["check"] == "regime" for ln in res["lines"] for c in ln["checks"])


def test_method_validity_warnings():
    # Source: validity ranges stated in calc.physics.friction and calc.physics.losses (Colebrook fitted to eps/D <= 0.05; rounded
    # bends for r/D >= 1, from memory of Rennels 2012).
    job = simple_job()
    job["lines"][0]["parts"][0].update(roughness_mm=0.8, bends=[{"angle_deg": 90, "radius_mm": 5}])
    res = evaluate(job)
    paths = {w["path"] for w in res["warnings"]}
    assert "lines[0].parts[0].roughness_mm" in paths and "lines[0].parts[0].bends[0].radius_mm" in paths


def test_velocity_check_names_the_dash_size_to_use():
    # Source: v = Q / A (exact) with the common-practice 6 m/s ceiling for a pressure line: 10 L/min
    # needs a bore of at least sqrt(4 Q / (pi 6)) = 5.95 mm, i.e. -4 (6.35 mm).
    job = simple_job(bore_mm=4.0, flow_lpm=10.0)
    job["pump"]["displacement_cc_rev"] = 20.0
    job["conditions"] = [{"name": "run", "engine_rpm": 2000, "fluid_temp_c": 80}]
    res = evaluate(job)
    vel = next(c for c in res["lines"][0]["checks"] if c["check"] == "velocity")
    assert vel["verdict"] == "fail" and "use -4 or a larger bore (at least 5.9 mm)" in vel["message"]


def test_pump_curve_is_the_pump_model_over_the_plot_range():
    # Source: Q = V n r eta_v, capped at the flow-control setting (common practice); exact arithmetic.
    job = demo_job()
    res = evaluate(job)
    curve = res["pump_curve"]
    pump = job["pump"]
    assert curve["flow_limit_lpm"] == pump["flow_limit_lpm"]
    rpm_max = max([3000] + [c["engine_rpm"] for c in res["conditions"]]) * 1.1
    assert curve["points"][-1]["engine_rpm"] == pytest.approx(rpm_max, abs=0.5)
    for p in curve["points"]:
        q = pump["displacement_cc_rev"] * p["engine_rpm"] * pump.get("pulley_ratio", 1.0) * \
            pump.get("volumetric_efficiency", 0.9) / 1000.0
        assert p["delivered_lpm"] == pytest.approx(min(q, pump["flow_limit_lpm"]), rel=1e-12, abs=1e-12)


def test_parts_carry_their_size_and_dash():
    # Source: dash = diameter in sixteenths of an inch (SAE J517 hose bore, SAE J514 tube OD; exact).
    res = evaluate(demo_job())
    for ln in res["lines"]:
        for p in ln["parts"]:
            if p["kind"] == "device":
                assert p["size_mm"] is None and p["dash"] is None
                continue
            assert p["dash"] == round(p["size_mm"] / 25.4 * 16)
            assert p["dash_exact"] == (abs(p["size_mm"] / 25.4 * 16 - p["dash"]) <= 0.15)
    tube = [p for p in res["lines"][0]["parts"] if p["kind"] == "tube"][0]
    assert tube["size_mm"] == demo_job()["lines"][0]["parts"][tube["job_part"]]["od_mm"]
