"""The command line: exit statuses, one line per problem, JSON and text, the field reference."""
import json
import subprocess
import sys
from pathlib import Path

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


def _run_ascii(*args):
    import os
    env = {**os.environ, "PYTHONIOENCODING": "ascii"}
    return subprocess.run([sys.executable, "-m", "calc", *args], capture_output=True, env=env, timeout=120)


@pytest.mark.parametrize("units, golden", [("metric", "report.txt"), ("us", "report-us.txt")])
def test_report_on_an_ascii_terminal_writes_plain_ascii_units(units, golden):
    # Source: stated behaviour (issue 16): with PYTHONIOENCODING=ascii the report degrades to ASCII units;
    # the reference is the recorded UTF-8 report (tests/golden) with each sign written as plain ASCII.
    from pathlib import Path
    demo = Path(__file__).resolve().parents[2] / "calc" / "data" / "demos" / "compact-hatch.json"
    r = _run_ascii("evaluate", str(demo), "--units", units)
    assert r.returncode == 0, r.stderr.decode("ascii", "replace")
    out = r.stdout.decode("ascii")  # raises if a byte is not ASCII
    recorded = (Path(__file__).resolve().parents[1] / "golden" / f"compact-hatch.{golden}").read_text(encoding="utf-8")
    plain = recorded.replace("°", "deg ").replace("³", "3").replace("²", "2").replace("·", " ")
    plain = plain.replace("‘", "'").replace("’", "'")  # the quotes around the user's own words
    assert out.replace("\r\n", "\n") == plain
    assert ("deg C" if units == "metric" else "deg F") in out


def test_names_on_an_ascii_terminal_are_escaped_not_lost(tmp_path):
    # Source: stated behaviour: what the user typed is never lost; a letter the terminal lacks is escaped.
    job = demo_job()
    job["name"] = "Müller's car"
    f = tmp_path / "job.json"
    f.write_text(json.dumps(job), encoding="utf-8")
    r = _run_ascii("evaluate", str(f))
    assert r.returncode == 0
    assert "Linesmith report: M\\xfcller's car" in r.stdout.decode("ascii")
    job["pump"]["relief_bar"] = "85 °"
    f.write_text(json.dumps(job), encoding="utf-8")
    r = _run_ascii("evaluate", str(f))
    assert r.returncode == 2 and "Traceback" not in r.stderr.decode("ascii")
    assert "pump.relief_bar: must be a number, got text '85 deg '" in r.stderr.decode("ascii")


def test_describe_on_an_ascii_terminal(tmp_path):
    # Source: stated behaviour: every command's output degrades the same way.
    r = _run_ascii("describe", "--markdown")
    assert r.returncode == 0 and "deg C" in r.stdout.decode("ascii")


def test_a_reader_that_goes_away_gets_no_traceback():
    # Source: stated behaviour (a report piped into a reader that stops early, like `| head -1`): no Python
    # traceback on stderr; Python's documented recipe for SIGPIPE (signal module notes).
    demo = Path(__file__).resolve().parents[2] / "calc" / "data" / "demos" / "swap-remote-reservoir.json"
    # the JSON result is far larger than a pipe's buffer (64 KiB on Linux), so the writer meets the closed pipe
    p = subprocess.Popen([sys.executable, "-m", "calc", "evaluate", str(demo), "--json"], stdout=subprocess.PIPE,
                         stderr=subprocess.PIPE, cwd=Path(__file__).resolve().parents[2])
    assert p.stdout.read(1) == b"{"
    p.stdout.close()  # the reader goes away with most of the report unread
    err = p.stderr.read().decode()
    assert p.wait(timeout=60) == 1  # Python's recipe exits 1
    assert "Traceback" not in err and "BrokenPipeError" not in err, err
