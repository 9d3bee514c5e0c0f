"""The assembly from a measured route: its bends, its cut length and slack, and the advice that settles."""
import copy
import json
from importlib import resources

import pytest

from calc import evaluate
from calc.model.edits import apply_edits


def _demo():
    return json.loads((resources.files("calc") / "data" / "demos" / "compact-hatch.json").read_text())


def _check(line, name):
    return [c for c in line["checks"] if c["check"] == name]


def test_route_forcing_a_tight_bend_fails_the_line():
    job = _demo()
    job["lines"][0]["route_points_mm"] = [[0, 0, 0], [60, 0, 0], [60, 60, 0]]
    ln = evaluate(job)["lines"][0]
    route = _check(ln, "route")
    assert len(route) == 1 and route[0]["verdict"] == "fail"
    # Source: exact geometry (60 mm legs force at most 60 mm) against SAE J517 -6 minimum bend 5 in = 127 mm
    # (from memory); points count from 1 for the user
    assert "at most 60 mm" in route[0]["message"] and "127 mm" in route[0]["message"]
    assert "near point 2" in route[0]["message"]
    assert ln["assembly"]["route"]["tightest_radius_mm"] == pytest.approx(60.0)


def test_route_bends_are_the_bends_the_hydraulics_and_the_bend_check_use():
    # Source: exact geometry: two 90 deg corners with 400 mm legs; the typed 140 mm bend is not used.
    job = _demo()
    ln = job["lines"][0]
    ln["route_points_mm"] = [[0, 0, 0], [400, 0, 0], [400, 400, 0], [800, 400, 0]]
    out = evaluate(job)["lines"][0]
    a = out["assembly"]
    assert a["bends_from_route"] and a["typed_bends_ignored"]
    assert [b["angle_deg"] for b in a["bends"]] == pytest.approx([90.0, 90.0])
    assert [b["radius_mm"] for b in a["bends"]] == pytest.approx([200.0, 200.0])
    note = [c for c in _check(out, "bend radius") if "not used" in c["message"]]
    assert note and note[0]["verdict"] == "ok" and "part 2" in note[0]["message"]
    # the hydraulics use the route's bends: removing the typed bend changes nothing
    job2 = copy.deepcopy(job)
    job2["lines"][0]["parts"][1]["bends"] = []
    again = evaluate(job2)
    assert again["lines"][0]["pressure_drop_max_bar"] == pytest.approx(out["pressure_drop_max_bar"], rel=1e-12)


def test_route_with_room_passes_and_gives_slack():
    job = _demo()
    ln = job["lines"][0]
    ln["route_points_mm"] = [[0, 0, 0], [400, 0, 0], [400, 400, 0]]
    ln["overall_length_mm"] = 1000.0
    out = evaluate(job)["lines"][0]
    assert _check(out, "route")[0]["verdict"] in ("ok", "caution")
    length = _check(out, "length")[0]
    # Source: exact arithmetic: 1000 mm assembly over an 800 mm route leaves 200 mm; the hose is cut to 1000 less
    # the 28 + 30 mm cut-off allowances = 942 mm
    assert length["verdict"] == "ok" and "200 mm over the 800 mm route" in length["message"]
    assert out["assembly"]["slack_mm"] == pytest.approx(200.0) and out["assembly"]["hose_cut_mm"] == 942.0


def test_a_short_assembly_gets_one_length_that_settles():
    job = _demo()
    ln = job["lines"][0]
    ln["route_points_mm"] = [[0, 0, 0], [400, 0, 0], [400, 400, 0]]
    ln["overall_length_mm"] = 820.0
    ln["engine_movement_mm"] = 25.0
    bad = _check(evaluate(job)["lines"][0], "length")[0]
    # Source: exact arithmetic: the cut length L solves L + c = R + m L + M with R = 800 mm route, c = 58 mm of
    # cut-off allowances, m = 4 % shrink (SAE J517 allowance, from memory), M = 25 mm movement:
    # L = (800 + 25 - 58) / 0.96 = 798.96, so 799 mm and 857 mm end to end
    assert bad["verdict"] == "fail" and bad["message"].startswith("make the assembly 857 mm long end to end")
    assert bad["fix"] == {"path": "lines[0].overall_length_mm", "value": 857,
                          "label": "Overall assembly length of line 1"}
    fixed = evaluate(apply_edits(job, [bad["fix"]]))["lines"][0]
    after = _check(fixed, "length")[0]
    assert after["verdict"] == "ok" and not after.get("fix")
    assert fixed["assembly"]["slack_mm"] >= fixed["assembly"]["slack_needed_mm"]
    assert "by 0 mm" not in after["message"]


def test_with_route_points_the_cut_length_comes_from_the_route():
    job = _demo()
    ln = job["lines"][0]
    ln.pop("overall_length_mm")
    ln["parts"][1].pop("length_m")  # the assembly hose may leave its length to the route
    ln["route_points_mm"] = [[0, 0, 0], [400, 0, 0], [400, 400, 0]]
    res = evaluate(job)
    assert res["ok"], res.get("errors")
    a = res["lines"][0]["assembly"]
    # Source: exact arithmetic as above with the demo's 12 mm movement: (800 + 12 - 58) / 0.96 = 785.4 -> 786 mm
    assert a["length_source"] == "route" and a["hose_cut_mm"] == 786.0
    assert a["overall_mm"] == 844.0 and a["slack_mm"] == pytest.approx(44.0)
    assert a["slack_mm"] >= a["slack_needed_mm"] == pytest.approx(0.04 * 786 + 12)
    # the hydraulics use that length and the route's bends: the same hose typed so, with no route, drops the same
    typed = copy.deepcopy(job)
    del typed["lines"][0]["route_points_mm"]
    typed["lines"][0]["parts"][1].update(length_m=0.786, bends=a["bends"])
    same = evaluate(typed)
    for c1, c2 in zip(res["conditions"], same["conditions"]):
        assert c1["lines"][0]["pressure_drop_bar"] == pytest.approx(c2["lines"][0]["pressure_drop_bar"], rel=1e-12)


def test_a_hose_with_no_length_and_no_route_is_refused_by_its_label():
    job = _demo()
    ln = job["lines"][0]
    ln.pop("overall_length_mm")
    ln["parts"][1].pop("length_m")
    res = evaluate(job)
    assert not res["ok"]
    assert [e["path"] for e in res["errors"]] == ["lines[0].parts[1].length_m"]
