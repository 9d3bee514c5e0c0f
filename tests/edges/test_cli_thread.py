"""The thread command: ``python -m calc thread MAJOR PITCH``."""
import json

import pytest

from calc.edges.cli import main_thread


# -- command line -------------------------------------------------------------------


def test_cli_json(capsys):
    assert main_thread(["15.9mm", "18tpi", "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    assert isinstance(out, list) and out
    assert out[0]["thread"] == "5/8-18 UNF"   # Source: ASME B1.1 (from memory), 0.625 in x 18 tpi
    for c in out:
        assert isinstance(c["thread"], str) and isinstance(c["uses"], list)
        assert isinstance(c["fit_error_mm"], (int, float))


def test_cli_female_tapered_text(capsys):
    # 1/4 NPT internal minor at the gauge plane: E1 - 0.8 P = 0.44719 in (ASME B1.20.1, from memory)
    assert main_thread(["0.447in", "18tpi", "--female", "--tapered"]) == 0
    out = capsys.readouterr().out
    assert "Tolerance" in out and "1/4 NPT" in out and "thread sealant" in out


@pytest.mark.parametrize("argv, name", [(["15.9", "18tpi"], "MAJOR"), (["15.9mm", "18"], "PITCH"),
                                        (["15.9mm"], "PITCH"), (["15.9mm", "18tpi", "--male", "--female"], "female"),
                                        (["500mm", "18tpi"], "MAJOR"), ([("9" * 400) + "mm", "18tpi"], "MAJOR"),
                                        (["15.9mm", ("9" * 400) + "tpi"], "PITCH"),
                                        (["15.9mm", "0." + "0" * 400 + "1tpi"], "PITCH"),
                                        (["1/" + "9" * 400 + "in", "18tpi"], "MAJOR"), (["15,9mm", "18tpi"], "MAJOR")])


def test_cli_bad_input_exit_2(argv, name, capsys):
    # Source: stated behaviour of the command line: bad input exits 2 with one line naming the argument.
    assert main_thread(argv) == 2
    err = capsys.readouterr().err
    assert len(err.strip().splitlines()) == 1 and name in err


def test_cli_no_fit_exit_1(capsys):
    assert main_thread(["25mm", "3mm", "--json"]) == 1
    assert len(json.loads(capsys.readouterr().out)) == 2


def test_cli_huge_reading_in_a_fresh_process_exits_2_without_a_traceback():
    # Source: stated behaviour (issue 16: `python -m calc thread <400 digits>mm 18tpi` gave an OverflowError).
    import subprocess
    import sys
    r = subprocess.run([sys.executable, "-m", "calc", "thread", "9" * 400 + "mm", "18tpi"],
                       capture_output=True, text=True, timeout=60)
    assert r.returncode == 2 and "Traceback" not in r.stderr
    assert r.stderr.startswith("thread: MAJOR: ") and "far too large" in r.stderr and len(r.stderr.splitlines()) == 1
