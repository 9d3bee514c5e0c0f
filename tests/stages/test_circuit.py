"""The circuit stage: operating points and hydraulic checks of whole jobs."""
import math
import re

import pytest

from calc import evaluate

from ..jobs import demo_job, simple_job

LPM = 1 / 60000


def test_hydraulic_power_common_practice_formula():
    # Source: hydraulic power [hp] = p [psi] x Q [gpm] / 1714 (common practice, no source; 1714 rounds 1714.25);
    # 1 hp = 745.7 W, 1 psi = 6894.757 Pa, 1 US gal = 3.785411784 L (NIST SP 811). The figures are the job's own:
    # at full lock the pump's whole geometric flow, 10 cm3/rev x 2000 rpm x 1.0 = 20 L/min (exact), works against
    # the 85 bar relief from 0 bar at the inlet (no feed line listed).
    job = simple_job(relief_bar=85.0)
    job["conditions"] = [{"name": "lock", "engine_rpm": 2000, "fluid_temp_c": 80, "full_lock": True}]
    c = evaluate(job)["conditions"][0]
    hp = (85e5 / 6894.757293168) * (20.0 / 3.785411784) / 1714
    assert c["heat_hydraulic_w"] == pytest.approx(hp * 745.69987, rel=1e-3)


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


def test_velocity_check_advises_a_tabulated_hose_for_a_fast_hose():
    # Source: v = Q / A (exact) with the common-practice 6 m/s ceiling for a pressure line: 10 L/min
    # needs a bore of at least sqrt(4 Q / (pi 6)) = 5.95 mm; the smallest tabulated bore over it is a -4 hose
    # (6.35 mm, SAE J517 / EN 853, from memory).
    job = simple_job(bore_mm=4.0, flow_lpm=10.0)
    job["pump"]["displacement_cc_rev"] = 20.0
    job["conditions"] = [{"name": "run", "engine_rpm": 2000, "fluid_temp_c": 80}]
    res = evaluate(job)
    vel = next(c for c in res["lines"][0]["checks"] if c["check"] == "velocity")
    assert vel["verdict"] == "fail"
    assert vel["message"].startswith("use a -4 hose (") and "6.35 mm bore" in vel["message"]
    assert "part 1 (4 mm hose) is the fastest part at 13.3 m/s" in vel["message"]


def test_velocity_check_names_the_fast_fitting_not_the_hose():
    # Source: the light-truck demo's return line: its first part, a 9 mm fitting, is faster than its -8 hose;
    # v = Q / A at 13 L/min is 3.4 m/s in 9 mm, over the 3 m/s top of the return band (common practice).
    res = evaluate(demo_job("light-truck-high-flow"))
    vel = next(c for c in res["lines"][1]["checks"] if c["check"] == "velocity")
    assert vel["verdict"] == "caution"
    assert "part 1 (9 mm fitting) is the fastest part at 3.4 m/s" in vel["message"]
    assert vel["message"].startswith("use a fitting with a bore of at least 9.6 mm")
    for ln in res["lines"]:  # never a dash size no table has, never the size already fitted
        for c in ln["checks"]:
            if c["check"] == "velocity":
                assert " -7 " not in c["message"] and "consider" not in c["message"]


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
    # A hose or a fitting of a family sized in sixteenths carries its own dash size (a -6 flare end has a 6 mm
    # bore: its size is still -6).
    job = demo_job()
    res = evaluate(job)
    for ln, spec in zip(res["lines"], job["lines"]):
        for p in ln["parts"]:
            if p["kind"] == "device":
                assert p["size_mm"] is None and p["dash"] is None
                continue
            own = spec["parts"][p["job_part"]].get("dash") if p["job_part"] is not None else None
            if own is not None and spec["parts"][p["job_part"]].get("family") != "cone-24-l":
                assert p["dash"] == own and p["dash_exact"]
                continue
            assert p["dash"] == round(p["size_mm"] / 25.4 * 16)
            assert p["dash_exact"] == (abs(p["size_mm"] / 25.4 * 16 - p["dash"]) <= 0.15)
    assert res["lines"][0]["parts"][0]["dash"] == 6 and res["lines"][0]["parts"][0]["size_mm"] == 6.0
    tube = [p for p in res["lines"][0]["parts"] if p["kind"] == "tube"][0]
    assert tube["size_mm"] == demo_job()["lines"][0]["parts"][tube["job_part"]]["od_mm"]


def test_a_starved_pump_fails_and_no_pressure_goes_below_a_vacuum():
    # Source: Hagen-Poiseuille (exact): a feed line of one hose, laminar, with no minor losses, passes
    # Q = 0.2e5 pi D^4 / (128 mu L) with the inlet at the -0.2 bar limit (common practice).
    from calc.model.fluid import resolve_fluid, state_of
    job = simple_job()
    job["lines"].append({"name": "feed", "role": "feed",
                         "parts": [{"kind": "hose", "bore_mm": 4.0, "length_m": 3.0}]})
    job["conditions"] = [{"name": "cold", "engine_rpm": 900, "fluid_temp_c": -20.0}]
    res = evaluate(job)
    c = res["conditions"][0]
    st = state_of(resolve_fluid({"preset": "ps-mineral"}), -20.0)
    q_star = 0.2e5 * math.pi * 0.004 ** 4 / (128 * st.nu_m2_s * st.rho_kg_m3 * 3.0)
    assert c["pump_starved"] and c["circuit_flow_lpm"] == pytest.approx(q_star / LPM, rel=1e-6)
    assert c["feed_limit_flow_lpm"] == pytest.approx(q_star / LPM, rel=1e-6)
    assert c["pump_inlet_bar"] == pytest.approx(-0.2, abs=1e-6)
    assert c["demand_flow_lpm"] > c["circuit_flow_lpm"]
    inlet = next(ch for ch in res["lines"][2]["checks"] if ch["check"] == "pump inlet")
    assert inlet["verdict"] == "fail" and "the pump is starved" in inlet["message"]
    for p in (n["pressure_bar"] for ln in c["lines"] for n in ln["nodes"]):
        assert p >= -1.01325  # Source: a gauge pressure cannot go below a vacuum (standard atmosphere, exact)
    for cand in res["lines"][2]["candidates"]:  # candidates at the cold point never print an impossible inlet
        for r in cand["reasons"]:
            for num in re.findall(r"(-?\d+\.\d+) bar gauge", r):
                assert float(num) >= -1.01325


def test_relief_below_the_warm_circuit_need_fails_and_at_cold_start_cautions():
    # Source: stated behaviour: the circuit's need at neutral is the pump outlet pressure for the pump's whole
    # flow; a relief set under it at a warm point starves the gear of flow.
    job = simple_job(relief_bar=2.0)
    job["conditions"] = [{"name": "warm", "engine_rpm": 2000, "fluid_temp_c": 60.0}]
    res = evaluate(job)
    relief = next(c for c in res["circuit"]["checks"] if c["check"] == "relief setting")
    c = res["conditions"][0]
    assert c["circuit_need_bar"] > 2.0 and c["relief_open"]
    assert relief["verdict"] == "fail" and f"{c['circuit_need_bar']:.1f} bar" in relief["message"]
    assert "2 bar relief setting" in relief["message"] and f"{c['circuit_flow_lpm']:.2f} L/min" in relief["message"]
    job["conditions"] = [{"name": "cold start", "engine_rpm": 900, "fluid_temp_c": -20.0}]
    res = evaluate(job)
    relief = next(c for c in res["circuit"]["checks"] if c["check"] == "relief setting")
    assert relief["verdict"] == "caution" and "until the fluid warms" in relief["message"]
    assert res["circuit"]["verdict"] == "caution"


def test_gear_valve_drop_rises_when_cold_and_two_points_are_met_exactly():
    # Source: calc.physics.valve's two-constant orifice, which meets its measured point exactly; with a second
    # point both are met exactly (two linear equations).
    from calc.model.fluid import resolve_fluid, state_of
    job = simple_job()
    job["gear"] = {"neutral_drop_bar": 2.0, "at_flow_lpm": 7.5, "at_temp_c": 80.0}
    job["conditions"] = [{"name": "hot", "engine_rpm": 2000, "fluid_temp_c": 80.0},
                         {"name": "cold", "engine_rpm": 2000, "fluid_temp_c": -20.0}]
    res = evaluate(job)
    hot, cold = res["conditions"]
    assert hot["circuit_flow_lpm"] == pytest.approx(7.5) and hot["gear_drop_bar"] == pytest.approx(2.0, rel=1e-9)
    rho = [state_of(resolve_fluid({"preset": "ps-mineral"}), t).rho_kg_m3 for t in (80.0, -20.0)]
    q2 = (cold["circuit_flow_lpm"] / 7.5) ** 2 * rho[1] / rho[0]
    assert cold["gear_drop_bar"] > 2.0 * q2  # more than the flow-squared scaling would give when cold
    assert any(c["check"] == "gear valve" and "estimate" in c["message"] for c in res["circuit"]["checks"])
    job["gear"].update(cold_drop_bar=6.0, cold_at_temp_c=-20.0)
    res = evaluate(job)
    assert res["conditions"][1]["gear_drop_bar"] == pytest.approx(6.0, rel=1e-9)
    assert res["conditions"][0]["gear_drop_bar"] == pytest.approx(2.0, rel=1e-9)
    assert not any(c["check"] == "gear valve" for c in res["circuit"]["checks"])
    job["gear"].update(cold_drop_bar=0.5)  # colder yet lower: no valve behaves so
    bad = evaluate(job)
    assert not bad["ok"] and bad["errors"][0]["path"] == "gear.cold_drop_bar"
