"""Route and slack checks of whole jobs: the ratings stage reads the measured route."""
import copy
import json
from importlib import resources

import pytest

from calc import evaluate


def _demo():
    return json.loads((resources.files("calc") / "data" / "demos" / "compact-hatch.json").read_text())


def test_route_forcing_a_tight_bend_fails_the_line():
    job = _demo()
    hose = job["lines"][0]["parts"][1]
    hose.pop("bore_mm", None)
    hose.update({"class": "SAE 100R2AT", "dash": 6})
    job["lines"][0]["route_points_mm"] = [[0, 0, 0], [60, 0, 0], [60, 60, 0]]
    ln = evaluate(job)["lines"][0]
    route = [c for c in ln["checks"] if c["check"] == "route"]
    assert len(route) == 1 and route[0]["verdict"] == "fail"
    # Source: exact geometry (60 mm legs force at most 60 mm) against SAE J517 -6 minimum bend 5 in = 127 mm
    # (from memory)
    assert "at most 60 mm" in route[0]["message"] and "127 mm" in route[0]["message"]
    assert ln["rating"]["route"]["tightest_radius_mm"] == pytest.approx(60.0)


def test_route_with_room_passes_and_gives_slack():
    job = _demo()
    ln = job["lines"][0]
    ln["route_points_mm"] = [[0, 0, 0], [400, 0, 0], [400, 400, 0]]
    ln["overall_length_mm"] = 1000.0
    out = evaluate(job)["lines"][0]
    route = [c for c in out["checks"] if c["check"] == "route"][0]
    assert route["verdict"] in ("ok", "caution")
    slack = [c for c in out["checks"] if c["check"] == "length change"][0]
    # Source: exact arithmetic: 1000 mm assembly over an 800 mm route leaves 200 mm
    assert slack["verdict"] == "ok" and "200 mm slack" in slack["message"]
    short = copy.deepcopy(job)
    short["lines"][0]["overall_length_mm"] = 820.0
    short["lines"][0]["engine_movement_mm"] = 25.0
    bad = [c for c in evaluate(short)["lines"][0]["checks"] if c["check"] == "length change"][0]
    # Source: exact arithmetic: 4 % of 900 mm hose (SAE J517 allowance, from memory) + 25 mm = 61 mm needed,
    # 20 mm available, so 41 mm short
    assert bad["verdict"] == "fail" and "by 41 mm" in bad["message"]
