"""The ratings stage: checks and margins of whole jobs against standards, exact results and properties."""
import json

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calc import evaluate

from ..jobs import demo_job, errors_of, named_hose

PSI_BAR = 6894.757293168 / 1e5  # bar per psi; Source: NIST SP 811 (1 lbf/in2 = 6894.757 Pa)


_demo = demo_job
_named = named_hose


def _errors(job):
    return errors_of(evaluate(job))


def _check(line, name):
    return [c for c in line["checks"] if c["check"] == name]


def test_user_figures_override_the_table():
    job = _named(_demo())
    job["lines"][0]["parts"][1].update(working_bar=50.0, burst_bar=400.0)
    ln = evaluate(job)["lines"][0]
    hose = [p for p in ln["rating"]["parts"] if p["index"] == 1][0]
    assert hose["working_bar"] == 50.0 and hose["source"] == "user"
    # Source: weakest part rule: the 50 bar hose is under the tube and fittings, so it is the assembly's rating
    assert ln["rating"]["weakest_part"]["index"] == 1 and ln["rating"]["working_bar"] == 50.0
    # Source: 85 bar relief x 1.25 surge (common practice) = 106.25 bar, over 50 bar: fail
    assert _check(ln, "pressure")[0]["verdict"] == "fail"
    assert ln["rating"]["required_bar"] == pytest.approx(106.25)


def test_barbed_fitting_on_a_pressure_line_fails_its_check_and_the_job_still_computes():
    # Source: a clamped barb holds about 10 bar (common practice, no source): never on a pressure line.
    job = _demo()
    job["lines"][0]["parts"][0].update(family="barb-clamp", dash=6)
    res = evaluate(job)
    assert res["ok"]
    end = _check(res["lines"][0], "pressure end")
    assert [c["verdict"] for c in end] == ["fail"]
    assert end[0]["message"].startswith("part 1 (") and "hose barb with clamp -6" in end[0]["message"]
    assert "crimped or reusable pressure fitting" in end[0]["message"]
    assert res["lines"][0]["verdict"] == "fail"
    ok = _demo()
    ok["lines"][1]["parts"][0].update(family="barb-clamp", dash=6)
    assert not _check(evaluate(ok)["lines"][1], "pressure end")


# -- checks -----------------------------------------------------------------------------------


def test_temperature_and_bend_failures_say_what_to_change():
    job = _named(_demo())
    job["lines"][0]["parts"][1]["bends"] = [{"angle_deg": 90, "radius_mm": 60}]
    job["conditions"] = [{"name": "hot", "engine_rpm": 800, "fluid_temp_c": 115.0, "full_lock": True}]
    ln = evaluate(job)["lines"][0]
    bend = _check(ln, "bend radius")[0]
    # Source: SAE J517 100R2AT -6 minimum bend radius 5 in = 127 mm (from memory)
    assert bend["verdict"] == "fail" and "60 mm radius, under the 127 mm minimum" in bend["message"]
    assert bend["message"].startswith("bend the line wider") and "bend 1 of part 2 (hose SAE 100R2AT -6)" in bend["message"]
    # the fix sets that bend's radius to the minimum, and names it by its place counting from 1
    assert bend["fix"] == {"path": "lines[0].parts[1].bends[0].radius_mm", "value": 127.0,
                           "label": "Centre-line radius of bend 1 of part 2"}
    temp = [c for c in _check(ln, "temperature") if c["verdict"] == "fail"][0]
    # Source: SAE J517 hose temperature limit +100 C for petroleum fluids (from memory)
    assert "limited to 100 C" in temp["message"] and temp["message"].startswith("use a part rated hotter")


def test_cut_length_from_overall_less_cutoffs():
    job = _demo()
    ln = job["lines"][0]
    ln["overall_length_mm"] = 965.0
    ln["parts"][0].update(end="start", cutoff_mm=30.0)
    ln["parts"][2].update(end="end", cutoff_mm=35.0)
    res = evaluate(job)["lines"][0]
    cut = _check(res, "length")[0]
    # Source: exact arithmetic 965 - 30 - 35 = 900 mm, equal to the 0.9 m hose
    assert "cut the hose to 900 mm" in cut["message"] and "typed on the hose is not used" not in cut["message"]
    assert res["assembly"]["hose_cut_mm"] == 900.0 and res["assembly"]["length_source"] == "overall"
    # a different typed length is not used, and the message says so (no loop for the user to close)
    job["lines"][0]["parts"][1]["length_m"] = 1.2
    again = evaluate(job)["lines"][0]
    assert again["assembly"]["hose_cut_mm"] == 900.0
    assert "the 1200 mm typed on the hose is not used" in _check(again, "length")[0]["message"]
    assert not _check(again, "length")[0].get("fix")


def _relief_margin(relief):
    job = _named(_demo())
    job["pump"]["relief_bar"] = relief
    return evaluate(job)["lines"][0]["rating"]


@settings(max_examples=25, deadline=None)
@given(st.floats(min_value=30, max_value=300), st.floats(min_value=30, max_value=300))
def test_higher_pressure_never_improves_a_margin(r1, r2):
    lo, hi = sorted((r1, r2))
    a, b = _relief_margin(lo), _relief_margin(hi)
    # Source: margin = rating / required with required rising in the relief setting (definition)
    assert b["margin"] <= a["margin"] * (1 + 1e-12)
    assert b["burst_margin"] <= a["burst_margin"] * (1 + 1e-12)


@settings(max_examples=25, deadline=None)
@given(st.lists(st.floats(min_value=20, max_value=700), min_size=4, max_size=4))
def test_weakest_part_rating_is_the_assembly_rating(ws):
    job = _named(_demo())
    parts = job["lines"][0]["parts"]
    for k, w in zip((0, 1, 2, 4), ws):
        parts[k]["working_bar"] = w
    rating = evaluate(job)["lines"][0]["rating"]
    all_w = [p["working_bar"] for p in rating["parts"]]
    # Source: an assembly is rated as its weakest component (SAE J517 assembly practice, field notes)
    assert rating["working_bar"] == min(all_w)
    assert rating["weakest_part"]["working_bar"] == min(all_w)
    assert rating["margin"] == pytest.approx(min(all_w) / rating["required_bar"], rel=1e-12)


def test_demo_result_carries_rating_checks_and_candidates():
    res = evaluate(_demo())
    assert res["ok"]
    for ln in res["lines"]:
        r = ln["rating"]
        for k in ("working_bar", "burst_bar", "design_factor", "required_bar", "margin", "weakest_part"):
            assert k in r
        assert ln["checks"] and all({"check", "verdict", "message"} <= set(c) <= {"check", "verdict", "message", "fix"}
                                    for c in ln["checks"])
        assert all(c["verdict"] in ("ok", "caution", "fail") for c in ln["checks"])
        assert isinstance(ln["candidates"], list)
        for c in ln["candidates"]:
            assert {"class", "dash", "bore_mm", "verdict", "failed"} <= set(c)
    press = res["lines"][0]["rating"]
    # Source: 85 bar relief plus the 25 % surge allowance (common practice, no source)
    assert press["required_bar"] == pytest.approx(106.25)
    # Source: Barlow 2 x 310 MPa x 0.89 / 9.53 mm (SAE J525 tensile, from memory) / 4 design factor
    assert press["working_bar"] == pytest.approx(2 * 310 * 0.89 / 9.53 * 10 / 4, rel=1e-9)
    assert press["weakest_part"]["kind"] == "tube"
    json.dumps(res, allow_nan=False)
