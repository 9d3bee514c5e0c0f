"""The command line: exit statuses, one line per problem, JSON and text, the field reference."""
import json
import subprocess
import sys

import pytest

from calc import evaluate
from calc.model.job import describe_job

from ..jobs import demo_job, simple_job


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


def test_markdown_field_reference_lists_every_scalar_field():
    # Source: design rule (docs read the one declaration): every field path appears once.
    from calc.edges.cli import model_markdown
    md = model_markdown(describe_job())
    for path in ("`pump.relief_bar`", "`lines[].parts[].bore_mm`", "`conditions[].fluid_temp_c`",
                 "`thermal.air_temp_c`"):
        assert path in md
