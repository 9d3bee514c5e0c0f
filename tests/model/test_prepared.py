"""The prepared job: part data from the tables, field-named problems, and a job no stage can edit."""
import json
from importlib import resources

import pytest

from calc import evaluate
from calc.model.prepared import prepare

from ..jobs import demo_job, errors_of, named_hose

PSI_BAR = 6894.757293168 / 1e5  # bar per psi; Source: NIST SP 811 (1 lbf/in2 = 6894.757 Pa)


_demo = demo_job
_named = named_hose


# -- prepare --------------------------------------------------------------------------------


def _errors(job):
    return errors_of(evaluate(job))


def test_prepare_fills_bore_and_ratings_from_the_class():
    job = _named(_demo())
    prepared, problems, _ = prepare(job)
    assert problems == []
    hose = prepared.lines[0].parts[1]
    # Source: SAE J517 100R2AT -6 (from memory): 3/8 in bore, 4000 psi, 5 in minimum bend radius
    assert hose["bore_mm"] == pytest.approx(9.525, abs=0.006)
    assert hose["working_bar"] == pytest.approx(4000 * PSI_BAR, abs=0.05)
    assert hose["min_bend_radius_mm"] == pytest.approx(127.0, abs=0.5)


def test_prepare_problems_name_the_field():
    job = _named(_demo(), dash=7)
    errs = _errors(job)
    # Source: calc/data/hoses.json, SAE J517 100R2AT sizes (from memory): -4, -5, -6, -8 ..., no -7.
    assert errs["lines[0].parts[1].dash"].startswith("SAE 100R2AT has no -7; sizes: -4, -5, -6")
    job = _named(_demo(), cls="SAE 100R99")
    assert "unknown hose class 'SAE 100R99'" in _errors(job)["lines[0].parts[1].class"]
    job = _named(_demo(), cls="SAE J190")
    assert "maker's datasheet" in _errors(job)["lines[0].parts[1].bore_mm"]
    job = _demo()
    job["lines"][0]["parts"][0].update(family="jic-37", dash=7)
    # Source: calc/data/fittings.json, SAE J514 37 deg flare sizes (from memory): -2 to -6, then -8; no -7.
    assert "sizes: -2, -3, -4, -5, -6, -8" in _errors(job)["lines[0].parts[0].dash"]


def test_prepared_job_cannot_be_edited():
    # Source: the stage rule (a stage edits nothing it was given): every container is read-only.
    prepared, problems, _ = prepare(_named(_demo()))
    assert problems == []
    with pytest.raises(TypeError):
        prepared.job["pump"]["relief_bar"] = 1.0
    with pytest.raises(TypeError):
        prepared.lines[0].parts[1]["bore_mm"] = 1.0
    with pytest.raises(TypeError):
        prepared.lines[0].parts[1].place = 3
    with pytest.raises(AttributeError):
        prepared.lines[0].parts[1].append({})
    with pytest.raises(Exception):
        prepared.lines[0].name = "x"  # a frozen dataclass
    assert isinstance(prepared.lines[0].parts, tuple) and isinstance(prepared.job["lines"], tuple)


def test_evaluate_leaves_the_callers_job_as_it_was():
    # Source: the stage rule; the job dict the caller passes is compared before and after (exact).
    for path in sorted((resources.files("calc") / "data" / "demos").iterdir()):
        job = json.loads(path.read_text())
        before = json.dumps(job, sort_keys=True)
        assert evaluate(job)["ok"]
        assert json.dumps(job, sort_keys=True) == before, path.name


def test_hose_from_its_class_records_where_each_figure_came_from():
    # Source: SAE J517 (from memory) table rows carry their source; the user's own figure is 'user'.
    job = _named(_demo())
    job["lines"][0]["parts"][1]["working_bar"] = 150.0
    prepared, _, _ = prepare(job)
    hose = prepared.lines[0].parts[1]
    assert hose.place == 1 and hose.adapter is None
    assert hose.hose_class["class"] == "SAE 100R2AT" and hose.size_row["dash"] == 6
    assert hose.sources["working_bar"] == "user"
    assert hose.sources["bore_mm"] == hose.size_row["source"]
