"""Assembly consistency: ends that do not suit their hose, ports set for another end, barbs on a pressure line,
ends that do not seal. Each FAILs, names both parts and carries the fix; the job still computes.

Source: the fitting families' own size systems (SAE J514 and SAE J512 sizes in sixteenths of an inch, ISO
8434-1 by tube outside diameter, from memory of the standards), the sealing rule that faces of different kinds
never seal (common practice, no source), and the barb limit of about 10 bar (common practice, no source).
"""
import copy

from calc import evaluate
from calc.model.edits import apply_edits

from ..jobs import simple_job


def _job():
    job = simple_job()
    job["lines"][0]["parts"] = [
        {"kind": "fitting", "bore_mm": 7.1, "family": "jic-37", "dash": 6, "end": "start", "cutoff_mm": 30},
        {"kind": "hose", "class": "SAE 100R2AT", "dash": 6, "length_m": 1.0},
        {"kind": "fitting", "bore_mm": 7.1, "family": "jic-37", "dash": 6, "end": "end", "cutoff_mm": 30}]
    return job


def _checks(job, name, line=0):
    res = evaluate(job)
    assert res["ok"], res.get("errors")
    return [c for c in res["lines"][line]["checks"] if c["check"] == name], res


def test_a_consistent_assembly_raises_none_of_them():
    for name in ("end size", "port end", "pressure end", "sealing"):
        found, _ = _checks(_job(), name)
        assert found == [], name


def test_ends_of_another_size_than_their_hose_fail_with_the_size_to_fit():
    job = _job()
    job["lines"][0]["parts"][1]["dash"] = 4  # -6 ends on a -4 hose
    found, res = _checks(job, "end size")
    assert [c["verdict"] for c in found] == ["fail", "fail"]
    assert found[0]["message"].startswith("part 1 (") and "ends part 2 (hose SAE 100R2AT -4)" in found[0]["message"]
    assert "takes a -4 end" in found[0]["message"]
    assert [c["fix"]["path"] for c in found] == ["lines[0].parts[0].dash", "lines[0].parts[2].dash"]
    assert [c["fix"]["value"] for c in found] == [4, 4] and found[0]["fix"]["label"] == "Size (dash) of part 1"
    assert res["lines"][0]["verdict"] == "fail"
    fixed, _ = _checks(apply_edits(job, [c["fix"] for c in found]), "end size")
    assert fixed == []


def test_a_metric_end_is_sized_by_the_tube_outside_diameter():
    # Source: ISO 8434-1 24 deg cones are sized by the tube's outside diameter in mm (from memory); a hose takes
    # ends one or two tube sizes over its bore (common practice, no source): a -6 (9.52 mm bore) hose takes a 10,
    # 12 or 15 mm light-series end (8.6 to 16.5 mm), not a 6 mm one.
    job = _job()
    for k in (0, 2):
        job["lines"][0]["parts"][k].update(family="cone-24-l", dash=12)
    assert _checks(job, "end size")[0] == []
    for k in (0, 2):
        job["lines"][0]["parts"][k]["dash"] = 6
    found, _ = _checks(job, "end size")
    assert len(found) == 2 and all(c["verdict"] == "fail" for c in found)
    assert "which takes a 10, 12 or 15 mm end" in found[0]["message"]
    assert found[0]["fix"]["value"] == 10


def test_a_port_set_for_another_end_family_fails_and_names_the_fix():
    job = _job()
    job["lines"][0]["to_port"] = {"label": "gear inlet", "thread": "5/8-18 UNF", "seal": "flare-45",
                                  "line_end_family": "flare-45-sae", "line_end_dash": 6}
    found, res = _checks(job, "port end")
    assert len(found) == 1 and found[0]["verdict"] == "fail"
    msg = found[0]["message"]
    assert msg.startswith("‘gear inlet’ is set to meet a 45 deg flare swivel end") and "part 3 (" in msg
    assert found[0]["fix"] == {"path": "lines[0].to_port.line_end_family", "value": "jic-37",
                               "label": "Line end of the end port of line 1"}
    fixed, _ = _checks(apply_edits(job, [found[0]["fix"]]), "port end")
    assert fixed == []


def test_a_port_set_for_another_end_size_takes_the_size_the_end_is_to_have():
    job = _job()
    job["lines"][0]["to_port"] = {"thread": "9/16-18 UNF", "seal": "oring-boss", "line_end_family": "jic-37",
                                  "line_end_dash": 8}
    found, _ = _checks(job, "port end")
    assert len(found) == 1 and found[0]["fix"]["path"] == "lines[0].to_port.line_end_dash"
    assert found[0]["fix"]["value"] == 6
    # with the end itself of the wrong size too, the port's fix is the hose's size, so both fixes agree
    job["lines"][0]["parts"][2]["dash"] = 8
    res = evaluate(job)
    fixes = [c["fix"] for c in res["lines"][0]["checks"] if c.get("fix")]
    assert {f["path"]: f["value"] for f in fixes} == {"lines[0].parts[2].dash": 6, "lines[0].to_port.line_end_dash": 6}
    after = evaluate(apply_edits(job, fixes))
    assert not [c for c in after["lines"][0]["checks"] if c.get("fix")]


def test_a_barbed_end_on_a_pressure_line_is_a_failed_check_not_a_refusal():
    job = _job()
    job["lines"][0]["parts"][2].update(family="barb-clamp", dash=6)
    found, res = _checks(job, "pressure end")
    assert len(found) == 1 and found[0]["verdict"] == "fail"
    assert found[0]["message"].startswith("part 3 (") and "must not be used on a pressure line" in found[0]["message"]
    ret = copy.deepcopy(job)
    ret["lines"][0]["parts"][2]["family"] = "jic-37"
    ret["lines"][1]["parts"].insert(0, {"kind": "fitting", "bore_mm": 7.5, "family": "barb-clamp", "dash": 6})
    assert _checks(ret, "pressure end", line=1)[0] == []


def test_two_ends_that_do_not_seal_together_fail_naming_both():
    job = _job()
    parts = job["lines"][0]["parts"]
    parts.insert(3, {"kind": "fitting", "bore_mm": 7.1, "family": "flare-45-sae", "dash": 6})
    found, _ = _checks(job, "sealing")
    assert len(found) == 1 and found[0]["verdict"] == "fail"
    msg = found[0]["message"]
    assert msg.startswith("part 3 (") and "and part 4 (" in msg and "do not seal together" in msg


def test_a_budget_on_only_one_side_is_stated_alone():
    # Source: found by the fuzzer (tests/fuzzing.py): a feed line has no default budget, so a warm budget set
    # by the user stands alone, and the message must say just that one.
    job = _job()
    job["lines"].append({"name": "feed", "role": "feed", "dp_budget_bar": 2.0, "parts": [
        {"kind": "entrance", "bore_mm": 16.0}, {"kind": "hose", "class": "SAE 100R4", "dash": 12, "length_m": 0.5}]})
    found, _ = _checks(job, "pressure drop", line=2)
    assert len(found) == 1 and found[0]["message"].endswith("is within the budget (2 bar warm)")
