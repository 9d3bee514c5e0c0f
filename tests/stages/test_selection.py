"""Hose candidates are whole assemblies: a candidate's verdict is the verdict its line gets once applied.

Source of every expected value here: the engine's own evaluation of the job with the candidate's edits
applied (an independent full run of prepare, ports, assembly, circuit and the line checks on the edited
job, not the selection stage's figures), and the stated listing rules of calc.stages.selection.
"""
import copy

import pytest

from calc import evaluate
from calc.model.edits import apply_edits

from ..jobs import demo_job, demo_paths, simple_job


def _failed(line):
    return [c["check"] for c in line["checks"] if c["verdict"] == "fail"]


def _demos():
    import json
    return {p.stem: json.loads(p.read_text(encoding="utf-8")) for p in demo_paths()}


DEMOS = _demos()
RESULTS = {name: evaluate(copy.deepcopy(job)) for name, job in DEMOS.items()}
CASES = [(name, j, k) for name, r in RESULTS.items() for j, ln in enumerate(r["lines"])
         for k in range(len(ln["candidates"]))]


@pytest.mark.parametrize("name,j,k", CASES, ids=[f"{n}-line{j + 1}-{k}" for n, j, k in CASES])
def test_a_candidate_applied_gets_the_verdict_it_was_listed_with(name, j, k):
    cand = RESULTS[name]["lines"][j]["candidates"][k]
    applied = evaluate(apply_edits(DEMOS[name], cand["apply"]))
    assert applied["ok"], applied.get("errors")
    line = applied["lines"][j]
    assert line["verdict"] == cand["verdict"]
    assert _failed(line) == cand["failed"]
    # the candidate's figures are the applied line's
    assert line["pressure_drop_max_bar"] == pytest.approx(cand["pressure_drop_bar"], rel=1e-9)
    assert line["rating"]["working_bar"] == cand["working_bar"]
    # a rejected candidate names each check it failed, in words, with that check's finding
    for name_ in cand["failed"]:
        assert " " in name_ or name_.isalpha()
    assert len(cand["reasons"]) == len(cand["failed"]) or cand["verdict"] != "fail"


def test_edits_hold_no_planned_adapters_and_no_filled_in_defaults():
    for name, r in RESULTS.items():
        for j, ln in enumerate(r["lines"]):
            for c in ln["candidates"]:
                for e in c["apply"]:
                    assert e["path"].startswith(f"lines[{j}].")
                    if e["path"] == f"lines[{j}].parts":
                        assert len(e["value"]) == len(DEMOS[name]["lines"][j]["parts"])
                        for new, old in zip(e["value"], DEMOS[name]["lines"][j]["parts"]):
                            assert set(new) - set(old) <= {"class", "dash"}  # nothing the user did not write


def test_the_lines_own_hose_is_listed_and_proposes_no_edit():
    # Source: stated rule: no advice proposes what is already chosen.
    for name, r in RESULTS.items():
        for j, ln in enumerate(r["lines"]):
            own = [c for c in ln["candidates"] if c["current"]]
            hoses = [p for p in DEMOS[name]["lines"][j]["parts"] if p["kind"] == "hose"]
            if hoses and all(h.get("class") for h in hoses) and len({(h["class"], h["dash"]) for h in hoses}) == 1:
                assert len(own) == 1, (name, j)
                assert own[0]["verdict"] == ln["verdict"]  # one verdict source: table and line agree
                plain = all(set(h) <= {"kind", "class", "dash", "length_m", "bends", "rise_m", "roughness_mm"}
                            for h in hoses)
                if plain:
                    assert own[0]["apply"] == [], (name, j)


def test_candidates_are_ranked_passing_first_then_smallest():
    for r in RESULTS.values():
        for ln in r["lines"]:
            cands = ln["candidates"]
            order = {"ok": 0, "caution": 1, "fail": 2}
            keys = [(order[c["verdict"]], len(c["failed"]), c["cautions"], c["bore_mm"]) for c in cands]
            assert keys == sorted(keys)


def test_the_smallest_passing_size_of_a_class_is_never_called_larger_than_needed():
    # Source: stated rule: a hose is larger than needed only when a smaller size of its class passes too.
    for r in RESULTS.values():
        for ln in r["lines"]:
            passing = [c for c in ln["candidates"] if c["verdict"] != "fail"]
            for cls in {c["class"] for c in passing}:
                smallest = min((c for c in passing if c["class"] == cls), key=lambda c: c["bore_mm"])
                assert smallest["note"] is None
            for c in passing:
                if c["note"]:
                    assert any(o["class"] == c["class"] and o["bore_mm"] < c["bore_mm"] for o in passing)


def test_a_barbed_return_candidate_is_never_ok_when_the_line_holds_more_than_the_barb():
    # Source: the return-line case: clamped barbs hold about 10 bar (common practice, no source); cold fluid
    # through a long -5 return drives the line's pressure over that, so no candidate with those ends passes the
    # pressure check, whatever the hose.
    job = simple_job()
    ret = job["lines"][1]
    ret["parts"] = [{"kind": "fitting", "bore_mm": 5.0, "family": "barb-clamp", "dash": 5},
                    {"kind": "hose", "class": "SAE 100R6", "dash": 5, "length_m": 3.0},
                    {"kind": "fitting", "bore_mm": 5.0, "family": "barb-clamp", "dash": 5},
                    {"kind": "exit", "bore_mm": 5.0}]
    job["conditions"] = [{"name": "cold start", "engine_rpm": 900, "fluid_temp_c": -20},
                         {"name": "warm", "engine_rpm": 2000, "fluid_temp_c": 80}]
    res = evaluate(job)
    line = res["lines"][1]
    assert line["rating"]["required_bar"] > 10.0 and "pressure" in _failed(line)
    for c in line["candidates"]:
        if c["bore_mm"] <= 7.94:
            assert c["verdict"] == "fail", c["label"]
        applied = evaluate(apply_edits(job, c["apply"]))["lines"][1]
        assert applied["verdict"] == c["verdict"] and _failed(applied) == c["failed"]


def test_a_small_hose_with_a_large_cold_drop_fails_the_default_budget():
    # Source: the default budgets (common practice, no source): 25 bar at cold start on a pressure line.
    job = simple_job(bore_mm=6.35, length_m=3.0)
    job["lines"][0]["parts"][0] = {"kind": "hose", "class": "SAE 100R2AT", "dash": 4, "length_m": 3.0}
    job["conditions"] = [{"name": "cold start", "engine_rpm": 900, "fluid_temp_c": -20},
                         {"name": "warm", "engine_rpm": 2000, "fluid_temp_c": 80}]
    res = evaluate(job)
    line = res["lines"][0]
    cold = res["conditions"][0]["lines"][0]["pressure_drop_bar"]
    assert cold > 25.0
    budget = [c for c in line["checks"] if c["check"] == "pressure drop"][0]
    assert budget["verdict"] == "fail" and "over its 25 bar budget at cold start" in budget["message"]
    assert line["rating"]["dp_budget_bar"] == 5.0 and line["rating"]["dp_budget_cold_bar"] == 25.0
    minus4 = [c for c in line["candidates"] if c["dash"] == 4]
    assert minus4 and all("pressure drop" in c["failed"] for c in minus4)
    # the user may set the budget: with 40 bar at cold start the drop passes
    job["lines"][0]["dp_budget_cold_bar"] = 40.0
    again = evaluate(job)["lines"][0]
    assert [c["verdict"] for c in again["checks"] if c["check"] == "pressure drop"] != ["fail"] or cold > 40.0


def test_every_class_shows_its_smallest_passing_size_and_the_one_below():
    # Source: stated listing rule of calc.stages.selection (_class_candidates).
    for r in RESULTS.values():
        for ln in r["lines"]:
            by_class = {}
            for c in ln["candidates"]:
                by_class.setdefault(c["class"], []).append(c)
            for cls, cs in by_class.items():
                passing = sorted((c for c in cs if c["verdict"] != "fail"), key=lambda c: c["bore_mm"])
                if passing:
                    smaller = [c for c in cs if c["bore_mm"] < passing[0]["bore_mm"]]
                    assert all(c["verdict"] == "fail" for c in smaller)


def test_a_candidates_hose_friction_is_hagen_poiseuille_at_cold_start():
    # Source: Hagen-Poiseuille, exact for laminar flow: the hose loses 32 nu rho L v / D^2 in friction, with the
    # candidate's tabulated bore (SAE J517 / EN 853, from memory), the demo return hose's 1.2 m and the circuit
    # flow at cold start; viscosity and density are the engine's fluid model's (held against ASTM D341 in
    # tests/physics/test_fluid.py). The candidate's own largest drop is the applied job's (consistency).
    import math
    job = DEMOS["compact-hatch"]
    for cand in RESULTS["compact-hatch"]["lines"][1]["candidates"]:
        res = evaluate(apply_edits(job, cand["apply"]))
        cold = res["conditions"][0]
        hose = next(p for p in cold["lines"][1]["parts"] if p["kind"] == "hose")
        assert hose["regime"] == "laminar"
        d = cand["bore_mm"] / 1000
        v = cold["circuit_flow_lpm"] / 60000 / (math.pi / 4 * d ** 2)
        hp = 32 * cold["viscosity_cst"] * 1e-6 * cold["density_kg_m3"] * 1.2 * v / d ** 2 / 1e5
        assert hose["friction_bar"] == pytest.approx(hp, rel=1e-9)
        assert max(c["lines"][1]["pressure_drop_bar"] for c in res["conditions"]) == pytest.approx(
            cand["pressure_drop_bar"], rel=1e-12)
