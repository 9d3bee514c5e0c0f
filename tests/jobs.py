"""Job builders shared by the tests (invented scenarios, demo data only)."""
import copy
import json
from pathlib import Path

DEMOS = Path(__file__).resolve().parent.parent / "calc" / "data" / "demos"


def demo_paths():
    return sorted(DEMOS.glob("*.json"))


def demo_job(name="compact-hatch"):
    return json.loads((DEMOS / f"{name}.json").read_text(encoding="utf-8"))


def simple_job(bore_mm=9.5, flow_lpm=7.5, relief_bar=85.0, length_m=1.0):
    """One pressure line of a single hose and a short return; invented numbers."""
    return copy.deepcopy({
        "version": 1, "name": "test circuit",
        "fluid": {"preset": "ps-mineral"},
        "pump": {"displacement_cc_rev": 10.0, "pulley_ratio": 1.0, "volumetric_efficiency": 0.9,
                 "flow_limit_lpm": flow_lpm, "relief_bar": relief_bar},
        "gear": {"neutral_drop_bar": 2.0, "at_flow_lpm": 7.5},
        "lines": [
            {"name": "pressure", "role": "pressure",
             "parts": [{"kind": "hose", "bore_mm": bore_mm, "length_m": length_m}]},
            {"name": "return", "role": "return",
             "parts": [{"kind": "hose", "bore_mm": 9.5, "length_m": 1.0}, {"kind": "exit", "bore_mm": 9.5}]},
        ],
    })


def named_hose(job, line=0, part=1, cls="SAE 100R2AT", dash=6):
    """The job with one hose part naming a class and dash size instead of a bore."""
    p = job["lines"][line]["parts"][part]
    p.pop("bore_mm", None)
    p.update({"class": cls, "dash": dash})
    return job


def errors_of(result):
    """A refused result's errors by path."""
    assert not result["ok"]
    return {e["path"]: e["message"] for e in result["errors"]}
