"""The engine's outputs for every demo job, byte for byte against tests/golden/.

The golden files were recorded with ``python tests/golden/record.py`` before the engine was
restructured (issue 11); a restructure must leave them identical. A deliberate change of
behaviour re-records them and says why in the commit. Source: the engine's own earlier output
(a regression check, not a check of the physics; those are in the other test modules).
"""
from __future__ import annotations

import importlib.util
from pathlib import Path

import pytest

GOLDEN = Path(__file__).resolve().parent / "golden"
_spec = importlib.util.spec_from_file_location("golden_record", GOLDEN / "record.py")
record = importlib.util.module_from_spec(_spec)
_spec.loader.exec_module(record)

OUTPUTS = record.all_outputs()


@pytest.mark.parametrize("name", sorted(OUTPUTS))
def test_output_matches_golden(name):
    want = (GOLDEN / name).read_text(encoding="utf-8")
    got = OUTPUTS[name]
    if got != want:
        a, b = want.splitlines(), got.splitlines()
        first = next((i for i, (x, y) in enumerate(zip(a, b)) if x != y), min(len(a), len(b)))
        pytest.fail(f"{name} differs from the golden file at line {first + 1}:\n"
                    f"  golden: {a[first] if first < len(a) else '(end)'}\n"
                    f"  now:    {b[first] if first < len(b) else '(end)'}\n"
                    "Re-record with `python tests/golden/record.py` only for a deliberate change.")


def test_every_demo_has_golden_files():
    demos = sorted(p.stem for p in record.DEMOS.glob("*.json"))
    assert demos, "no demo jobs"
    for stem in demos:
        for suffix in (".result.json", ".report.txt", ".report-us.txt", ".api-us.json", ".sweep.json"):
            assert (GOLDEN / f"{stem}{suffix}").exists(), f"{stem}{suffix} missing"
