"""Job model: validation messages name the field; defaults; the model describes itself."""
import json
import math

import pytest

from calc import evaluate
from calc.model.job import DEFAULT_CONDITIONS, JOB, describe_job
from calc.model.job_rules import validate_job

from ..jobs import demo_paths, simple_job


def errors(job):
    res = evaluate(job)
    assert res["ok"] is False
    return {e["path"]: e["message"] for e in res["errors"]}


def test_every_demo_job_is_valid_and_evaluates():
    # Source: exact (the demos must run); figures are checked in the other test files.
    for p in demo_paths():
        res = evaluate(json.loads(p.read_text()))
        assert res["ok"], (p.name, res.get("errors"))


@pytest.mark.parametrize("mutate, path, fragment", [
    (lambda j: j["lines"][0]["parts"][0].update(bore_mm=0), "lines[0].parts[0].bore_mm", "at least 0.5"),
    (lambda j: j["lines"][0]["parts"][0].update(bore_mm=-3), "lines[0].parts[0].bore_mm", "at least 0.5"),
    (lambda j: j["lines"][0]["parts"][0].update(bore_mm="wide"), "lines[0].parts[0].bore_mm", "number"),
    (lambda j: j["lines"][0]["parts"][0].update(bore_mm=math.nan), "lines[0].parts[0].bore_mm", "finite"),
    (lambda j: j["lines"][0]["parts"][0].update(length_m=math.inf), "lines[0].parts[0].length_m", "finite"),
    (lambda j: j["lines"][0]["parts"][0].pop("length_m"), "lines[0].parts[0].length_m", "missing"),
    (lambda j: j["lines"][0]["parts"][0].update(colour="red"), "lines[0].parts[0].colour", "not a known key"),
    (lambda j: j["lines"][0]["parts"][0].update(kind="pipe"), "lines[0].parts[0].kind", "one of"),
    (lambda j: j["lines"][0].update(parts=[]), "lines[0].parts", "at least 1"),
    (lambda j: j["lines"][0].update(role="suction"), "lines[0].role", "one of"),
    (lambda j: j["fluid"].update(preset="snake-oil"), "fluid.preset", "one of"),
    (lambda j: j["pump"].update(relief_bar=True), "pump.relief_bar", "number"),
    (lambda j: j.pop("pump"), "pump", "missing"),
    (lambda j: j.update(lines="none"), "lines", "list"),
])


def test_bad_input_names_the_field(mutate, path, fragment):
    # Source: stated behaviour of the validator (issue: every invalid field named with its path).
    job = simple_job()
    mutate(job)
    errs = errors(job)
    assert path in errs, errs
    assert fragment in errs[path]


def test_wrong_version_is_refused_clearly():
    # Source: stated behaviour.
    job = simple_job()
    job["version"] = 7
    assert "version 1" in errors(job)["version"]


def test_custom_fluid_needs_its_datasheet_values():
    # Source: stated behaviour.
    job = simple_job()
    job["fluid"] = {"name": "mine", "visc_40c_cst": 30.0}
    errs = errors(job)
    assert "fluid.visc_100c_cst" in errs and "fluid.density_15c_kg_m3" in errs
    job["fluid"] = {"visc_40c_cst": 30.0, "visc_100c_cst": 40.0, "density_15c_kg_m3": 860.0,
                    "specific_heat_j_kgk": 1950.0}
    assert "lower" in errors(job)["fluid.visc_100c_cst"]


def test_custom_fluid_evaluates():
    # Source: exact (the datasheet points are reproduced at 40 C).
    job = simple_job()
    job["fluid"] = {"name": "mine", "visc_40c_cst": 35.0, "visc_100c_cst": 7.4, "density_15c_kg_m3": 860.0,
                    "specific_heat_j_kgk": 1950.0}
    job["conditions"] = [{"name": "40", "engine_rpm": 800, "fluid_temp_c": 40.0}]
    res = evaluate(job)
    assert res["conditions"][0]["viscosity_cst"] == pytest.approx(35.0, rel=1e-9)


def test_tube_wall_must_be_under_half_the_diameter():
    # Source: geometry, exact.
    job = simple_job()
    job["lines"][0]["parts"].append({"kind": "tube", "od_mm": 8.0, "wall_mm": 4.0, "length_m": 0.3})
    assert "half" in errors(job)["lines[0].parts[1].wall_mm"]


def test_default_conditions_are_filled():
    # Source: documented default set in calc.model (common practice).
    res = evaluate(simple_job())
    names = [c["name"] for c in res["conditions"]]
    assert names == [c["name"] for c in DEFAULT_CONDITIONS]
    temps = {c["name"]: c["fluid_temp_c"] for c in res["conditions"]}
    assert temps["cold start"] <= -20 and any(c["full_lock"] for c in res["conditions"])


def test_value_outside_usual_range_warns_not_fails():
    # Source: stated behaviour (a warning in the result, not a crash).
    job = simple_job()
    job["pump"]["relief_bar"] = 250.0
    res = evaluate(job)
    assert res["ok"] and any(w["path"] == "pump.relief_bar" for w in res["warnings"])


def test_unusual_types_never_raise():
    # Source: stated behaviour (never a traceback).
    for job in (None, [], "job", 3, {"version": "1"}, {"version": 1, "lines": [None]},
                {"version": 1, "fluid": [], "pump": {}, "gear": None, "lines": [{"parts": [{}]}]}):
        res = evaluate(job)
        assert res["ok"] is False and res["errors"]


def test_describe_job_carries_labels_units_defaults_and_help():
    # Source: stated design (one declaration drives form, validator and docs).
    d = describe_job()
    fields = {f["key"]: f for f in d["job"]["fields"]}
    pump = {f["key"]: f for f in fields["pump"]["fields"]}
    assert pump["relief_bar"]["unit"] == "pressure_bar" and pump["relief_bar"]["label"]
    assert pump["relief_bar"]["required"] is True and pump["relief_bar"]["ge"] == 1
    parts = fields["lines"]["item"]["fields"]
    part = next(f for f in parts if f["key"] == "parts")
    assert set(part["item"]["variants"]) >= {"hose", "tube", "fitting", "device", "entrance", "exit"}
    json.dumps(d)


def test_validate_returns_normalised_job_with_defaults():
    # Source: defaults declared in calc.model.
    norm, problems, _ = validate_job(simple_job())
    assert not problems
    assert norm["lines"][0]["parts"][0]["roughness_mm"] == 0.005
    assert norm["ratings"]["hose_design_factor"] == 4.0


def test_model_declares_every_key_once():
    # Source: design rule (one definition); keys within a record are unique.
    def walk(rec):
        keys = [f.key for f in rec.fields]
        assert len(keys) == len(set(keys)), rec.key
        for f in rec.fields:
            if hasattr(f, "fields"):
                walk(f)
            if hasattr(f, "item"):
                item = f.item
                for r in getattr(item, "variants", {}).values():
                    walk(r)
                if hasattr(item, "fields"):
                    walk(item)
    walk(JOB)


def test_implausible_fluid_slope_warns_and_real_fluids_do_not():
    # Source: ASTM D341 slopes B from recalled datasheet pairs (from memory): VG 32 with VI 100 (32 / 5.4 cSt),
    # a transmission-type fluid (34 / 7.2), a synthetic steering fluid (18 / 6), a silicone fluid (40 / 16) and a
    # low-VI naphthenic oil (32 / 4.2) all lie inside the stated bounds; 10 / 9.999 cSt (a typing slip) does not.
    def warned(v40, v100):
        job = simple_job()
        job["fluid"] = {"preset": "custom", "visc_40c_cst": v40, "visc_100c_cst": v100, "density_15c_kg_m3": 860,
                        "specific_heat_j_kgk": 1900}
        _, problems, warnings = validate_job(job)
        assert problems == []
        return [w for w in warnings if w.path == "fluid.visc_100c_cst"]
    for v40, v100 in ((32, 5.4), (34, 7.2), (18, 6.0), (40, 16.0), (32, 4.2)):
        assert warned(v40, v100) == [], (v40, v100)
    w = warned(10, 9.999)
    assert w and "slope" in w[0].message and "outside what real hydraulic fluids show" in w[0].message


def test_a_field_key_has_one_unit_wherever_it_is_declared():
    # Source: the project's key rule (keys carry their unit), on the job model's declaration itself; the
    # edges convert an edit's value by the unit of its last key (calc.model.job.field_unit).
    from calc.model.job import JOB
    from calc.model.schema import Field, ListOf, Record, Variants
    seen = {}

    def walk(spec):
        item = spec.item if isinstance(spec, ListOf) else spec
        for rec in (item.variants.values() if isinstance(item, Variants) else [item]):
            for f in getattr(rec, "fields", ()):
                if isinstance(f, Field):
                    assert seen.setdefault(f.key, f.unit) == f.unit, f.key
                else:
                    walk(f)
    walk(JOB)
    assert seen["length_m"] == "length_m" and seen["radius_mm"] == "length_mm"
