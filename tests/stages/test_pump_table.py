"""The pump's measured flow table, the pulley diameters, and the checks that match the pump to the gear."""
import copy

import numpy
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calc import evaluate
from calc.model.edits import apply_edits
from calc.model.prepared import prepare
from calc.physics.pump import pulley_ratio_from_diameters
from calc.physics.tabulated import interpolate_flat
from calc.system.circuit import LPM, Circuit

from ..jobs import demo_job, errors_of, simple_job

TABLE = [[600.0, 6.0], [1000.0, 8.5], [2000.0, 8.5], [3500.0, 6.5]]


def _with_table(table=TABLE, **pump):
    job = simple_job()
    job["pump"].pop("flow_limit_lpm")
    job["pump"].update(flow_table_rpm_lpm=copy.deepcopy(table), **pump)
    return job


def _checks(res, name):
    return [c for c in res["circuit"]["checks"] if c["check"] == name]


def _warnings(res):
    return {w["path"]: w["message"] for w in res["warnings"]}


# -- interpolation ----------------------------------------------------------------------------------------


@pytest.mark.parametrize("rpm, lpm", [
    (600.0, 6.0), (800.0, 7.25), (1500.0, 8.5), (2750.0, 7.5), (3500.0, 6.5),  # on rows and half-way between them
    (100.0, 6.0), (9000.0, 6.5),  # held flat beyond the ends
])
def test_flow_table_reading_against_hand_worked_values(rpm, lpm):
    # Source: hand-worked linear interpolation (exact): 800 rpm is half way from 600 to 1000, so 6 + 2.5 / 2 = 7.25;
    # 2750 rpm is half way from 2000 to 3500, so 8.5 - 2 / 2 = 7.5; beyond the ends the end rows hold (as stated).
    assert interpolate_flat(TABLE, rpm) == pytest.approx(lpm, abs=1e-12)


@given(st.floats(0.0, 10000.0))
def test_flow_table_reading_is_numpy_interp(rpm):
    # Source: numpy.interp (linear interpolation with the end values held beyond the ends), called directly.
    xs, ys = zip(*TABLE)
    assert interpolate_flat(TABLE, rpm) == pytest.approx(float(numpy.interp(rpm, xs, ys)), abs=1e-12)


def test_pulley_ratio_from_diameters_is_exact():
    # Source: a belt without slip has one linear speed on both pulleys: n_pump / n_crank = D_crank / D_pump (exact).
    assert pulley_ratio_from_diameters(168.0, 140.0) == pytest.approx(1.2, abs=1e-15)


def test_delivered_flow_reads_the_table_at_pump_speed():
    # Source: hand-worked (exact): 750 engine rpm x 168/140 pulleys = 900 pump rpm, between the 600 and 1000 rpm rows:
    # 6 + (300 / 400) x 2.5 = 7.875 L/min; the pump displaces 10 cc x 900 rpm = 9 L/min, 8.1 L/min at 0.9
    # volumetric efficiency, so the table's 7.875 is the smaller and is what it delivers.
    job = _with_table(crank_pulley_mm=168.0, pump_pulley_mm=140.0)
    job["pump"].pop("pulley_ratio")
    job["conditions"] = [{"name": "idle", "engine_rpm": 750, "fluid_temp_c": 80}]
    c = evaluate(job)["conditions"][0]
    assert c["pump_flow_lpm"] == pytest.approx(7.875, rel=1e-12)
    assert c["flow_control_limiting"] is True


def test_delivered_flow_is_the_smaller_of_table_and_pump():
    # Source: hand-worked (exact): at 500 engine rpm (ratio 1) the pump displaces 10 x 500 = 5 L/min, 4.5 at 0.9
    # efficiency, under the table's held 6 L/min: it delivers 4.5.
    job = _with_table()
    job["conditions"] = [{"name": "slow", "engine_rpm": 500, "fluid_temp_c": 80}]
    c = evaluate(job)["conditions"][0]
    assert c["pump_flow_lpm"] == pytest.approx(4.5, rel=1e-12)
    assert c["flow_control_limiting"] is False


_ROWS = st.lists(st.tuples(st.floats(100.0, 8000.0), st.floats(0.5, 200.0)), min_size=2, max_size=8,
                 unique_by=lambda r: round(r[0]))


@settings(max_examples=60, deadline=None)
@given(rows=_ROWS, rpm=st.floats(0.0, 9000.0), ratio=st.floats(0.5, 2.0), eta=st.floats(0.5, 1.0))
def test_no_delivered_flow_exceeds_the_displaced_flow(rows, rpm, ratio, eta):
    # Source: conservation of volume (a positive-displacement pump delivers at most displacement x speed): whatever
    # the table says, delivered <= geometric flow = 10 cc x engine rpm x ratio. Rows above the displaced flow are
    # clipped to it first, since the validator refuses them.
    rows = sorted(rows)
    table = [[r, min(q, 10.0 * r / 1000.0)] for r, q in rows]
    job = _with_table(table, pulley_ratio=ratio, volumetric_efficiency=eta)
    prepared, problems, _ = prepare(job)
    assert problems == []
    circuit = Circuit(prepared, [ln.parts for ln in prepared.lines])
    q, _, _ = circuit.pump_flow(rpm)
    assert q / LPM <= 10.0 * rpm * ratio / 1000.0 * (1 + 1e-12)


def test_the_pump_curve_carries_the_table_at_engine_speed():
    # Source: hand-worked (exact): a row at 1000 pump rpm, with pulleys 168/140 (ratio 1.2), is turned by
    # 1000 / 1.2 = 833.3 engine rpm; the curve reaches past the last row (3500 / 1.2 = 2917 rpm, under 3000).
    job = _with_table(crank_pulley_mm=168.0, pump_pulley_mm=140.0)
    job["pump"].pop("pulley_ratio")
    curve = evaluate(job)["pump_curve"]
    assert curve["flow_limit_lpm"] is None
    assert [r["pump_rpm"] for r in curve["table"]] == [600.0, 1000.0, 2000.0, 3500.0]
    assert curve["table"][1]["engine_rpm"] == pytest.approx(1000.0 / 1.2, rel=1e-12)
    assert curve["points"][-1]["engine_rpm"] == 3300.0


def test_a_flat_setting_keeps_its_curve_and_no_table():
    # Source: stated behaviour: without a table the flat setting is the cap and the table list is empty.
    curve = evaluate(simple_job(flow_lpm=7.5))["pump_curve"]
    assert curve["flow_limit_lpm"] == 7.5 and curve["table"] == []


# -- validation ---------------------------------------------------------------------------------------------


def test_the_table_takes_the_place_of_the_setting():
    # Source: stated rule: one of the two is needed; with both, the setting is not used and a warning says so.
    job = simple_job()
    job["pump"].pop("flow_limit_lpm")
    assert "flow-control setting, or the pump's flow table" in errors_of(evaluate(job))["pump.flow_limit_lpm"]
    both = _with_table(flow_limit_lpm=7.5)
    res = evaluate(both)
    assert res["ok"] and "is not used" in _warnings(res)["pump.flow_limit_lpm"]


def test_speeds_must_rise_and_the_cell_is_named_in_words():
    # Source: stated rule (speeds strictly increasing); words from the job model's labels, counting from 1.
    res = evaluate(_with_table([[600, 6.0], [1000, 8.5], [1000, 8.0]]))
    err = [e for e in res["errors"] if e["path"] == "pump.flow_table_rpm_lpm[2][0]"][0]
    assert "above the speed of row 2 (1000 rpm)" in err["message"]
    assert err["label"] == "Pump speed in row 3 of Flow table (pump speed, delivered flow)"


def test_a_row_above_the_displaced_flow_is_refused_and_above_the_efficiency_warned():
    # Source: hand-worked (exact): 10 cc x 1000 rpm = 10 L/min displaced, 9 L/min at 0.9 volumetric efficiency.
    over = errors_of(evaluate(_with_table([[600, 5.0], [1000, 10.5]])))
    assert "more than the pump displaces at that speed (10.00 L/min" in over["pump.flow_table_rpm_lpm[1][1]"]
    res = evaluate(_with_table([[600, 5.0], [1000, 9.5]]))
    assert res["ok"] and "(9.00 L/min)" in _warnings(res)["pump.flow_table_rpm_lpm[1][1]"]


@pytest.mark.parametrize("table, path, words", [
    ([[600, 5.0]], "pump.flow_table_rpm_lpm", "needs 2 to 40 rows"),
    ([[600, 5.0], [1000]], "pump.flow_table_rpm_lpm[1]", "must be a row of 2 numbers"),
    ([[600, 5.0], [1000, -1]], "pump.flow_table_rpm_lpm[1][1]", "must be greater than 0"),
    ([[600, 5.0], [1000, "8"]], "pump.flow_table_rpm_lpm[1][1]", "must be a number"),
    ("600 5", "pump.flow_table_rpm_lpm", "must be a list of rows [pump speed, delivered flow]"),
])
def test_malformed_tables_are_named(table, path, words):
    # Source: stated rules of the table field (rows of two numbers, within the columns' declared limits).
    assert words in errors_of(evaluate(_with_table(table)))[path]


def test_pulley_diameters_give_the_ratio_and_must_agree_with_one_given():
    # Source: D_crank / D_pump (exact); a mismatch over 1 % is two different drives (stated tolerance).
    job = simple_job()
    job["pump"].pop("pulley_ratio")
    job["pump"].update(crank_pulley_mm=150.0, pump_pulley_mm=125.0)
    job["conditions"] = [{"name": "idle", "engine_rpm": 500, "fluid_temp_c": 80}]
    assert evaluate(job)["conditions"][0]["pump_geometric_lpm"] == pytest.approx(10.0 * 500 * 1.2 / 1000, rel=1e-12)
    job["pump"]["pulley_ratio"] = 1.0
    assert "give one or the other" in errors_of(evaluate(job))["pump.pulley_ratio"]
    del job["pump"]["pump_pulley_mm"], job["pump"]["pulley_ratio"]
    assert "needs both pulley diameters" in errors_of(evaluate(job))["pump.pump_pulley_mm"]


# -- pump and gear matching -----------------------------------------------------------------------------------


def test_relief_above_the_gears_rating_fails_and_its_fix_settles():
    # Source: stated rule: the relief setting must not exceed the gear's maximum working pressure.
    job = simple_job(relief_bar=110.0)
    job["gear"]["rated_bar"] = 100.0
    (c,) = _checks(evaluate(job), "gear rating")
    assert c["verdict"] == "fail" and "gear's 100 bar" in c["message"]
    assert c["fix"]["path"] == "pump.relief_bar" and c["fix"]["value"] == 100.0
    (after,) = _checks(evaluate(apply_edits(job, [c["fix"]])), "gear rating")
    assert after["verdict"] == "ok"


def test_too_little_flow_when_parking_is_a_caution_with_the_pulley_fix():
    # Source: hand-worked (exact): 10 cc x 600 rpm x 1.0 x 0.9 = 5.4 L/min at the slowest point, under an 6 L/min
    # need; the ratio that gives 6 is 6 / 5.4 = 1.111, rounded up to 1.12 (giving 6.05 L/min).
    job = simple_job(flow_lpm=8.0)
    job["gear"]["flow_needed_lpm"] = 6.0
    job["conditions"] = [{"name": "parking", "engine_rpm": 600, "fluid_temp_c": 80},
                         {"name": "road", "engine_rpm": 2000, "fluid_temp_c": 80}]
    (c,) = _checks(evaluate(job), "gear flow")
    assert c["verdict"] == "caution" and "5.40 L/min" in c["message"] and "‘parking’" in c["message"]
    assert c["fix"] == {"path": "pump.pulley_ratio", "value": 1.12, "label": "Pulley ratio (pump : crank speed)"}
    (after,) = _checks(evaluate(apply_edits(job, [c["fix"]])), "gear flow")
    assert after["verdict"] == "ok"


def test_with_pulley_diameters_the_fix_is_a_smaller_pump_pulley():
    # Source: hand-worked (exact): ratio needed 1.111 with a 150 mm crank pulley: pump pulley at most
    # 150 / 1.111 = 135 mm, rounded down to 135 mm (ratio 1.111, 6.0 L/min).
    job = simple_job(flow_lpm=8.0)
    job["pump"].pop("pulley_ratio")
    job["pump"].update(crank_pulley_mm=150.0, pump_pulley_mm=150.0)
    job["gear"]["flow_needed_lpm"] = 6.0
    job["conditions"] = [{"name": "parking", "engine_rpm": 600, "fluid_temp_c": 80}]
    (c,) = _checks(evaluate(job), "gear flow")
    assert c["fix"]["path"] == "pump.pump_pulley_mm" and c["fix"]["value"] == 135.0
    assert _checks(evaluate(apply_edits(job, [c["fix"]])), "gear flow")[0]["verdict"] == "ok"


def test_a_setting_far_above_the_need_is_a_caution_with_a_lower_setting():
    # Source: common practice, no source: more than 50 % above the gear's need is flagged; the advice is the need
    # plus 20 %, rounded up to half a litre: 6 x 1.2 = 7.2 -> 7.5 L/min.
    job = simple_job(flow_lpm=12.0)
    job["pump"]["displacement_cc_rev"] = 16.0
    job["gear"]["flow_needed_lpm"] = 6.0
    (c,) = _checks(evaluate(job), "flow-control setting")
    assert c["verdict"] == "caution" and "12 L/min" in c["message"] and "common practice" in c["message"]
    assert c["fix"]["path"] == "pump.flow_limit_lpm" and c["fix"]["value"] == 7.5
    assert _checks(evaluate(apply_edits(job, [c["fix"]])), "flow-control setting") == []


def test_a_table_far_above_the_need_is_a_caution_without_a_one_field_fix():
    # Source: common practice, no source (the same 50 % threshold on the table's highest flow).
    job = _with_table([[600, 5.0], [1000, 9.0], [3000, 9.0]])
    job["gear"]["flow_needed_lpm"] = 5.0
    (c,) = _checks(evaluate(job), "flow-control setting")
    assert c["verdict"] == "caution" and "table's highest flow, 9 L/min" in c["message"] and "fix" not in c


def test_gear_fields_left_empty_add_no_checks():
    # Source: stated behaviour: without the gear's rating and need, the circuit's checks are as before.
    names = {c["check"] for c in evaluate(simple_job())["circuit"]["checks"]}
    assert names.isdisjoint({"gear rating", "gear flow", "flow-control setting"})


def test_the_demos_use_the_new_fields():
    # Source: stated (the issue asks one demo with a flow table and pulley diameters, one with the gear's figures).
    truck = demo_job("light-truck-high-flow")
    assert truck["pump"]["flow_table_rpm_lpm"] and "crank_pulley_mm" in truck["pump"]
    res = evaluate(truck)
    assert res["ok"] and res["pump_curve"]["table"]
    swap = evaluate(demo_job("swap-remote-reservoir"))
    assert {c["check"] for c in swap["circuit"]["checks"]} >= {"gear rating", "gear flow"}


def test_pulley_diameters_must_give_a_ratio_within_its_limits():
    # Source: the job model's limits of the pulley ratio (0.05 to 5); 600 / 100 = 6 is outside (exact).
    job = simple_job()
    job["pump"].pop("pulley_ratio")
    job["pump"].update(crank_pulley_mm=600.0, pump_pulley_mm=100.0)
    assert "pulley ratio of 6, outside 0.05 to 5" in errors_of(evaluate(job))["pump.pump_pulley_mm"]


def test_the_text_report_shows_the_drive_and_the_flow_table():
    # Source: the job's own rows (600 rpm 8 L/min ...) and 168 / 140 = 1.2 (exact), in the report's words.
    from calc.edges.report import text_report
    text = text_report(evaluate(demo_job("light-truck-high-flow")), "metric")
    assert "drive: pulley ratio 1.200 (pump : crank speed)" in text
    assert "flow control: the pump's flow table (pump speed, flow): 600 rpm 8.00 L/min, 1000 rpm 13.00 L/min" in text
    assert "gear rating: the 110 bar relief setting is within the gear's 120 bar maximum working pressure" in text
