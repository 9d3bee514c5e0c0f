"""The route sketch and the order list the engine puts in the result (lines[].sketch, order)."""
import math

import pytest

from calc import evaluate
from calc.physics.route import route_fillets
from calc.system.sketch import sketch_of

from ..jobs import simple_job


def _route_job(points, mbr_mm, movement_mm=0.0, axis="z", end="start"):
    job = simple_job()
    ln = job["lines"][0]
    ln["parts"][0].update(min_bend_radius_mm=mbr_mm, length_m=None)
    ln.update(route_points_mm=points, engine_movement_mm=movement_mm, engine_movement_axis=axis, engine_end=end)
    return job


def test_fillet_of_a_right_angle_runs_from_point_to_point():
    # Source: exact solution: a 90 deg corner with 100 mm legs takes at most R = 100 / tan(45 deg) = 100 mm,
    # whose tangent length R tan(45 deg) = 100 mm reaches both ends.
    b, = route_fillets([[0, 0, 0], [100, 0, 0], [100, 100, 0]])
    assert b["radius_mm"] == pytest.approx(100.0, rel=1e-12)
    assert b["tangent_in_mm"] == pytest.approx([0.0, 0.0, 0.0], abs=1e-9)
    assert b["tangent_out_mm"] == pytest.approx([100.0, 100.0, 0.0], abs=1e-9)
    assert b["corner_mm"] == [100.0, 0.0, 0.0]


def test_fillet_of_a_60_degree_turn_uses_the_shorter_leg():
    # Source: exact solution: a 60 deg turn with legs 100 and 300 mm: tangent length t = 100 mm (the shorter
    # leg), R = t / tan(30 deg) = 173.205 mm; the arc ends 100 mm along the outgoing leg (cos 60, sin 60).
    c60, s60 = 0.5, math.sqrt(3) / 2
    b, = route_fillets([[0, 0, 0], [100, 0, 0], [100 + 300 * c60, 300 * s60, 0]])
    assert b["angle_deg"] == pytest.approx(60.0, rel=1e-12)
    assert b["radius_mm"] == pytest.approx(100.0 / math.tan(math.radians(30)), rel=1e-12)
    assert b["tangent_in_mm"] == pytest.approx([0.0, 0.0, 0.0], abs=1e-9)
    assert b["tangent_out_mm"] == pytest.approx([100 + 100 * c60, 100 * s60, 0.0], rel=1e-12)


def test_sketch_shows_the_hose_at_both_ends_of_the_engine_movement():
    # Source: exact solution: a straight 300 mm run whose end moves 10 mm each way across it (y) is
    # sqrt(300^2 + 10^2) = 300.1666 mm long at both extremes.
    s = sketch_of({"route_points_mm": [[0, 0, 0], [300, 0, 0]], "engine_movement_mm": 20.0,
                   "engine_movement_axis": "y", "engine_end": "end"}, [])
    rest, minus, plus = s["positions"]
    assert rest["length_mm"] == pytest.approx(300.0) and rest["offset_mm"] == 0.0
    assert minus["offset_mm"] == -10.0 and plus["offset_mm"] == 10.0
    assert minus["points_mm"][-1] == [300.0, -10.0, 0.0] and plus["points_mm"][0] == [0.0, 0.0, 0.0]
    for p in (minus, plus):
        assert p["length_mm"] == pytest.approx(math.hypot(300.0, 10.0), rel=1e-12)


def test_without_movement_only_the_rest_position_is_drawn():
    # Source: the declared behaviour (no movement, nothing moves).
    s = sketch_of({"route_points_mm": [[0, 0, 0], [300, 0, 0]], "engine_movement_mm": 0.0}, [])
    assert [p["name"] for p in s["positions"]] == ["at rest"]


def test_a_bend_the_movement_tightens_fails_at_that_position_only():
    # Source: exact solution: 200 mm legs at a right angle allow R = 200 mm at rest; with the start moved
    # +10 mm along x the first leg is 190 mm, so R = 190 mm, under the hose's 195 mm minimum (a datasheet
    # figure given on the hose, invented); moved -10 mm the leg is 210 mm and R stays 200 mm.
    job = _route_job([[0, 0, 0], [200, 0, 0], [200, 200, 0]], 195.0, movement_mm=20.0, axis="x", end="start")
    res = evaluate(job)
    assert res["ok"], res.get("errors")
    s = res["lines"][0]["sketch"]
    by_name = {p["name"]: p for p in s["positions"]}
    assert by_name["at rest"]["bends"][0]["radius_mm"] == pytest.approx(200.0)
    assert by_name["at rest"]["bends"][0]["verdict"] == "ok"
    moved_in = by_name["engine moved +10 mm along x"]["bends"][0]
    assert moved_in["radius_mm"] == pytest.approx(190.0) and moved_in["verdict"] == "fail"
    assert moved_in["message"].startswith("too tight") and "195 mm minimum" in moved_in["message"]
    assert by_name["engine moved -10 mm along x"]["bends"][0]["radius_mm"] == pytest.approx(200.0)
    assert s["verdict"] == "fail" and s["min_bend_radius_mm"] == 195.0


def test_a_too_tight_route_bend_is_marked_in_the_sketch_as_in_the_route_check():
    # Source: exact solution: 60 mm legs force at most R = 60 mm, under a 150 mm minimum (invented datasheet).
    res = evaluate(_route_job([[0, 0, 0], [60, 0, 0], [60, 60, 0]], 150.0))
    ln = res["lines"][0]
    bend, = ln["sketch"]["positions"][0]["bends"]
    assert bend["verdict"] == "fail" and bend["radius_mm"] == pytest.approx(60.0)
    route, = [c for c in ln["checks"] if c["check"] == "route"]
    assert route["verdict"] == "fail"


def test_no_sketch_without_route_points():
    # Source: the declaration (null without route points).
    assert evaluate(simple_job())["lines"][0]["sketch"] is None


def test_order_list_adds_hose_lengths_per_class_and_dash_and_counts_fittings():
    # Source: exact arithmetic on the job's own lengths: two -6 hoses of one class, 0.8 m and 1.1 m,
    # make 1900 mm in 2 pieces; a -8 hose stays apart; two identical fittings count 2.
    job = simple_job()
    hose6 = {"kind": "hose", "class": "SAE 100R2AT", "dash": 6}
    fit = {"kind": "fitting", "bore_mm": 6.0, "family": "jic-37", "dash": 6}
    job["lines"][0]["parts"] = [dict(fit), dict(hose6, length_m=0.8), dict(fit)]
    job["lines"][1]["parts"] = [dict(hose6, length_m=1.1), {"kind": "hose", "class": "SAE 100R2AT", "dash": 8,
                                                              "length_m": 0.5}, {"kind": "exit", "bore_mm": 9.5}]
    res = evaluate(job)
    assert res["ok"], res.get("errors")
    hoses = {(h["class"], h["dash"]): h for h in res["order"]["hoses"]}
    assert hoses[("SAE 100R2AT", 6)]["total_mm"] == pytest.approx(1900.0)
    assert hoses[("SAE 100R2AT", 6)]["pieces"] == 2 and hoses[("SAE 100R2AT", 6)]["lines"] == [0, 1]
    assert hoses[("SAE 100R2AT", 8)]["total_mm"] == pytest.approx(500.0)
    fittings = res["order"]["fittings"]
    assert len(fittings) == 1 and fittings[0]["count"] == 2 and fittings[0]["family"] == "jic-37"
