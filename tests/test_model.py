"""Job model: validation messages name the field; defaults; the model describes itself."""
import json
import math
import subprocess
import sys

import pytest

from calc import evaluate
from calc.model import DEFAULT_CONDITIONS, JOB, describe_job, validate_job

from .jobs import demo_job, demo_paths, simple_job


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


def test_cli_invalid_job_exits_2_with_one_line_per_problem(tmp_path):
    # Source: stated behaviour of the command line.
    job = simple_job()
    job["lines"][0]["parts"][0]["bore_mm"] = 0
    job["pump"]["relief_bar"] = -1
    f = tmp_path / "bad.json"
    f.write_text(json.dumps(job))
    r = subprocess.run([sys.executable, "-m", "calc", "evaluate", str(f)], capture_output=True, text=True)
    assert r.returncode == 2
    lines = r.stderr.strip().splitlines()
    assert "lines[0].parts[0].bore_mm: must be at least 0.5" in lines
    assert any(ln.startswith("pump.relief_bar:") for ln in lines)
    assert "Traceback" not in r.stderr


def test_cli_json_and_text(tmp_path):
    # Source: the CLI prints the same result as calc.evaluate (exact).
    f = tmp_path / "job.json"
    f.write_text(json.dumps(demo_job()))
    r = subprocess.run([sys.executable, "-m", "calc", "evaluate", str(f), "--json"], capture_output=True,
                       text=True)
    assert r.returncode == 0
    out = json.loads(r.stdout)
    ref = evaluate(demo_job())
    assert out["conditions"][0]["pump_outlet_bar"] == pytest.approx(ref["conditions"][0]["pump_outlet_bar"])
    for key in ("name", "viscosity_cst", "density_kg_m3", "pump_flow_lpm", "pump_outlet_bar", "pump_inlet_bar"):
        assert key in out["conditions"][0]
    ln = out["conditions"][0]["lines"][0]
    for key in ("name", "role", "velocity_max_m_s", "reynolds_min", "pressure_drop_bar", "parts"):
        assert key in ln
    for key in ("velocity_m_s", "reynolds", "regime", "pressure_drop_bar"):
        assert key in ln["parts"][0]
    r = subprocess.run([sys.executable, "-m", "calc", "evaluate", str(f), "--units", "us"], capture_output=True,
                       text=True)
    assert r.returncode == 0 and "psi" in r.stdout and "gpm" in r.stdout
    r = subprocess.run([sys.executable, "-m", "calc", "evaluate", str(tmp_path / "none.json")],
                       capture_output=True, text=True)
    assert r.returncode == 1 and "cannot read" in r.stderr


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


def test_method_validity_warnings():
    # Source: validity ranges stated in calc.hydraulics (Colebrook fitted to eps/D <= 0.05; rounded
    # bends for r/D >= 1, from memory of Rennels 2012).
    job = simple_job()
    job["lines"][0]["parts"][0].update(roughness_mm=0.8, bends=[{"angle_deg": 90, "radius_mm": 5}])
    res = evaluate(job)
    paths = {w["path"] for w in res["warnings"]}
    assert "lines[0].parts[0].roughness_mm" in paths and "lines[0].parts[0].bends[0].radius_mm" in paths


def test_markdown_field_reference_lists_every_scalar_field():
    # Source: design rule (docs read the one declaration): every field path appears once.
    from calc.cli import model_markdown
    md = model_markdown(describe_job())
    for path in ("`pump.relief_bar`", "`lines[].parts[].bore_mm`", "`conditions[].fluid_temp_c`",
                 "`thermal.air_temp_c`"):
        assert path in md


def test_velocity_check_names_the_dash_size_to_use():
    # Source: v = Q / A (exact) with the common-practice 6 m/s ceiling for a pressure line: 10 L/min
    # needs a bore of at least sqrt(4 Q / (pi 6)) = 5.95 mm, i.e. -4 (6.35 mm).
    job = simple_job(bore_mm=4.0, flow_lpm=10.0)
    job["pump"]["displacement_cc_rev"] = 20.0
    job["conditions"] = [{"name": "run", "engine_rpm": 2000, "fluid_temp_c": 80}]
    res = evaluate(job)
    vel = next(c for c in res["lines"][0]["checks"] if c["check"] == "velocity")
    assert vel["verdict"] == "fail" and "use -4 or a larger bore (at least 5.9 mm)" in vel["message"]


def test_sweep_gives_the_same_drops_as_evaluate():
    # Source: exact (the sweep is the same circuit solve without per-part detail).
    import json as _json
    from calc.api import handle
    job = demo_job()
    job["conditions"] = [{"name": f"t{t}", "engine_rpm": 1500, "fluid_temp_c": t} for t in (-10, 30, 90)]
    full = evaluate(job)
    sw = _json.loads(handle(_json.dumps({"op": "sweep", "job": job})))
    assert sw["ok"]
    for a, b in zip(full["conditions"], sw["result"]["conditions"]):
        for la, lb in zip(a["lines"], b["lines"]):
            assert lb["pressure_drop_bar"] == pytest.approx(la["pressure_drop_bar"], rel=1e-12)


def test_sentences_in_us_units():
    # Source: exact conversions (NIST SP 811: 1 psi = 6894.757 Pa, 1 in = 25.4 mm, F = 1.8 C + 32).
    from calc.units import localize_result, localize_text
    assert localize_text("must hold 100 bar at 100 C", "us") == "must hold 1450 psi at 212 F"
    assert localize_text("radius 127 mm is under 254 mm", "us") == "radius 5.00 in is under 10.0 in"
    assert localize_text("use -8 or a larger bore", "us") == "use -8 or a larger bore"
    assert localize_text("must hold 100 bar", "metric") == "must hold 100 bar"
    res = evaluate(demo_job())
    us = localize_result(json.loads(json.dumps(res)), "us")
    msgs = [c["message"] for ln in us["lines"] for c in ln["checks"]]
    assert all(" bar" not in m for m in msgs)
    assert us["conditions"][0]["pump_outlet_bar"] == res["conditions"][0]["pump_outlet_bar"]
