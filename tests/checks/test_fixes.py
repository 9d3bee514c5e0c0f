"""Advice as edits: every fix names a field the user typed, in the validator's path syntax, once, with a label
in words counting from 1; applying every fix of a result once leaves no fix on the same fields.

Source: the rules of the advice (calc.checks), checked against independent evaluations of the edited jobs;
the geometry and arithmetic of each case is exact (v = Q / A, L = (R + M - c) / (1 - m)).
"""
import copy
import re

from calc import evaluate
from calc.model.edits import apply_edits

from ..jobs import demo_paths, simple_job


def _fixes(res):
    out = [c["fix"] for ln in res["lines"] for c in ln["checks"] if c.get("fix")]
    return out + [c["fix"] for c in res["circuit"]["checks"] if c.get("fix")]


def _many_fixes_job():
    """One job whose result advises an edit of every kind (invented numbers)."""
    job = simple_job(relief_bar=6.0)  # warm, the circuit needs more than 6 bar: raise the relief
    job["conditions"] = [{"name": "warm", "engine_rpm": 2500, "fluid_temp_c": 60.0},
                         {"name": "hot", "engine_rpm": 900, "fluid_temp_c": 90.0}]
    job["pump"]["flow_limit_lpm"] = 12.0
    job["lines"][0].update(route_points_mm=[[0, 0, 0], [500, 0, 0], [500, 500, 0]], overall_length_mm=900.0,
                           engine_movement_mm=20.0,
                           to_port={"thread": "9/16-18 UNF", "seal": "oring-boss", "line_end_family": "flare-45-sae",
                                    "line_end_dash": 6})
    job["lines"][0]["parts"] = [
        {"kind": "fitting", "bore_mm": 7.1, "family": "jic-37", "dash": 8, "end": "start", "cutoff_mm": 30},
        {"kind": "hose", "class": "SAE 100R2AT", "dash": 6, "length_m": 1.0},
        {"kind": "fitting", "bore_mm": 7.1, "family": "jic-37", "dash": 6, "end": "end", "cutoff_mm": 30}]
    job["lines"][1]["parts"][0] = {"kind": "hose", "class": "SAE 100R6", "dash": 4, "length_m": 0.8,
                                   "bends": [{"angle_deg": 90, "radius_mm": 40}]}
    job["lines"][1]["parts"][1]["bore_mm"] = 6.35
    return job


def test_the_fixes_of_a_result_settle_in_one_step():
    job = _many_fixes_job()
    res = evaluate(job)
    fixes = _fixes(res)
    paths = [f["path"] for f in fixes]
    kinds = {re.sub(r"\[\d+\]", "[]", p) for p in paths}
    # every kind of fix this job calls for is there
    assert {"pump.relief_bar", "lines[].overall_length_mm", "lines[].parts[].dash", "lines[].to_port.line_end_family",
            "lines[].parts[].bends[].radius_mm"} <= kinds, kinds
    assert len(paths) == len(set(paths))  # one fix per path
    after = evaluate(apply_edits(job, fixes))
    assert after["ok"], after.get("errors")
    again = [f for f in _fixes(after) if f["path"] in paths]
    assert again == []


def test_fix_labels_are_words_counting_from_1_and_paths_index_the_users_lists():
    job = _many_fixes_job()
    for f in _fixes(evaluate(job)):
        assert "_" not in f["label"] and "[" not in f["label"], f
        steps = re.findall(r"\[(\d+)\]", f["path"])
        if f["path"].startswith("lines["):
            line = int(steps[0])
            assert f"line {line + 1}" in f["label"] or "part" in f["label"]
            if ".parts[" in f["path"]:
                part = int(steps[1])
                assert part < len(job["lines"][line]["parts"])  # the user's own list, no adapters inserted
                assert f"part {part + 1}" in f["label"]


def test_no_advice_is_by_nothing_and_none_proposes_what_is_already_chosen():
    jobs = [_many_fixes_job()] + [__import__("json").loads(p.read_text(encoding="utf-8")) for p in demo_paths()]
    for job in jobs:
        res = evaluate(copy.deepcopy(job))
        for ln in res["lines"]:
            for c in ln["checks"]:
                assert not re.search(r"\bby -?0 mm\b", c["message"]), c["message"]
        for f in _fixes(res):
            node = job
            for step in re.findall(r"[A-Za-z_]+|\d+", f["path"]):
                node = node[int(step)] if step.isdigit() else (node or {}).get(step)
                if node is None:
                    break
            assert node != f["value"], f
