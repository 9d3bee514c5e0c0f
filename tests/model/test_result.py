"""The result declaration covers every key of every result, with the right kind, unit and nullability.

Source: the declaration itself (calc.model.result) against results of the demo jobs and of jobs
built to reach the result's other shapes (no duty cycle, relief open, a failed port plan, a
rigid tube, a tube cooler, no volume): every key must be declared, and every value must be of
its declared kind.
"""
import copy
import json
import subprocess
import sys

import pytest

from calc import evaluate
from calc.edges.units import UNITS
from calc.model.job import DEFAULT_CONDITIONS
from calc.model.result import KINDS, VERDICTS, describe_result, field_at, result_fields

from ..jobs import demo_job, demo_paths, simple_job


def _variants():
    jobs = [json.loads(p.read_text(encoding="utf-8")) for p in demo_paths()]
    j = simple_job(relief_bar=20.0)  # cold: the relief opens at neutral; no duty cycle
    j["conditions"] = [{"name": "frozen", "engine_rpm": 2000, "fluid_temp_c": -35.0}]
    j["lines"][0]["parts"][0]["bends"] = [{"angle_deg": 90, "radius_mm": 5}]  # under one bore: a warning
    jobs.append(j)
    j = simple_job(relief_bar=2.0)  # warm, and still over the relief: a failed check with a fix
    j["conditions"] = [{"name": "warm", "engine_rpm": 2000, "fluid_temp_c": 40.0}]
    jobs.append(j)
    j = simple_job()
    j["lines"][0]["parts"].append({"kind": "tube", "od_mm": 9.53, "wall_mm": 0.89, "length_m": 0.5,
                                   "bends": [{"angle_deg": 90, "radius_mm": 30}]})
    j["lines"][0]["from_port"] = {"thread": "1/4 NPT", "seal": "oring-boss", "line_end_family": "orb",
                                  "line_end_dash": 4}
    j["thermal"] = {"cooler": {"type": "tube", "tube_length_m": 1.0, "fins_per_inch": 8, "fin_od_mm": 22.0}}
    j["conditions"] = [{"name": "run", "engine_rpm": 2000, "fluid_temp_c": 80, "duty_percent": 100}]
    jobs.append(j)
    j = simple_job()
    j["lines"] = [{"name": "p", "role": "pressure", "parts": [{"kind": "device", "dp_bar": 1.0, "at_flow_lpm": 7.5}]}]
    j["thermal"] = {"other_volume_l": 0.0}
    jobs.append(j)
    j = demo_job()
    j["conditions"] = [dict(c, duty_percent=0.0) for c in DEFAULT_CONDITIONS]
    j["conditions"][-1]["duty_percent"] = 100.0  # all at full lock: no steady state below the bound
    jobs.append(j)
    return jobs


RESULTS = [evaluate(copy.deepcopy(j)) for j in _variants()]


def _walk(obj, path, seen):
    decl = field_at(path) if path else None
    if path:
        assert decl is not None, f"result key {path!r} is not declared in calc.model.result"
        seen.add(path)
        if obj is None:
            assert decl.nullable, f"{path} is null but not declared nullable"
            return
        _check_kind(obj, decl, path)
        if decl.kind == "value":  # a job field's value (a number, text or parts): the job model declares it
            return
    if isinstance(obj, dict):
        for k, v in obj.items():
            _walk(v, f"{path}.{k}" if path else k, seen)
    elif isinstance(obj, list):
        for v in obj:
            if isinstance(v, dict):
                for k, x in v.items():
                    _walk(x, f"{path}[].{k}", seen)
            else:
                _walk(v, f"{path}[]", seen)


def _check_kind(v, decl, path):
    kind = decl.kind
    if kind == "number":
        assert isinstance(v, (int, float)) and not isinstance(v, bool), path
    elif kind == "count":
        assert isinstance(v, int) and not isinstance(v, bool), path
    elif kind == "flag":
        assert isinstance(v, bool), path
    elif kind == "value":
        assert isinstance(v, (int, float, str, list, dict)) and not isinstance(v, bool), path
    elif kind in ("text", "sentence", "path"):
        assert isinstance(v, str), path
    elif kind == "verdict":
        assert v in VERDICTS, path
    elif kind == "list":
        assert isinstance(v, list), path
    elif kind == "map":
        assert isinstance(v, dict), path


def test_the_variants_evaluate():
    assert all(r["ok"] for r in RESULTS), [r.get("errors") for r in RESULTS if not r["ok"]]


@pytest.mark.parametrize("i", range(len(RESULTS)))
def test_every_result_key_is_declared_with_its_kind(i):
    _walk(RESULTS[i], "", set())


def test_the_variants_reach_most_of_the_declaration():
    # Source: the declaration should describe results that occur, not keys no job produces.
    seen = set()
    for r in RESULTS:
        _walk(r, "", seen)
    declared = {f.key for f in result_fields()}
    never = sorted(declared - seen)
    assert never == [], never


def test_every_declared_field_has_a_known_kind_unit_and_label():
    for f in result_fields():
        assert f.kind in KINDS, f.key
        assert f.label, f.key
        if f.kind == "number":
            assert f.unit in UNITS, f.key
        else:
            assert f.unit in (None, "count"), f.key


def test_describe_result_prints_the_declaration_as_json():
    # Source: the command line reads the one declaration (exact).
    r = subprocess.run([sys.executable, "-m", "calc", "describe", "--result", "--json"], capture_output=True,
                       text=True, timeout=60)
    assert r.returncode == 0, r.stderr
    rows = json.loads(r.stdout)
    assert rows == describe_result()
    assert {"path", "kind", "unit", "nullable", "label", "help"} == set(rows[0])
    assert any(row["path"] == "conditions[].lines[].parts[].velocity_m_s" and row["unit"] == "speed_m_s"
               for row in rows)
    md = subprocess.run([sys.executable, "-m", "calc", "describe", "--result", "--markdown"], capture_output=True,
                        text=True, timeout=60)
    assert md.returncode == 0 and "`thermal.full_lock.pump_rate_k_s`" in md.stdout
