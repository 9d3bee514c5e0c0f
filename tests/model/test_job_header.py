"""The build sheet's header fields and the engine-movement fields are part of the job (version 1)."""
import json

from calc import evaluate
from calc.edges.jobfile import read_job_text
from calc.model.job import JOB_VERSION, describe_job
from calc.model.job_rules import validate_job

from ..jobs import demo_job, errors_of, simple_job

HEADER = {"customer": "Invented Customer Ltd", "vehicle": "invented hatchback, engine swap", "job_number": "J-0042",
          "date": "2026-12-02", "notes_on_sheet": True}


def test_header_fields_are_declared_with_labels():
    # Source: the job model (calc.model.job), read as the form and the docs read it.
    fields = {f["key"]: f for f in describe_job()["job"]["fields"]}
    assert [fields[k]["label"] for k in HEADER] == ["Customer", "Vehicle", "Job number", "Date",
                                                    "Print the notes on the build sheet"]
    assert fields["notes_on_sheet"]["default"] is False


def test_a_job_with_header_fields_stays_version_1_and_keeps_them_as_typed():
    # Source: stated behaviour (issue 14): job files stay version 1; user text is never converted.
    job = dict(simple_job(), **HEADER)
    out, problems, _ = validate_job(job)
    assert not problems and JOB_VERSION == 1
    assert {k: out[k] for k in HEADER} == HEADER


def test_a_file_saved_before_the_new_fields_still_opens_with_their_defaults():
    # Source: stated behaviour (issue 14): files saved today still open.
    job = demo_job()
    assert not any(k in job for k in HEADER)
    read, errors = read_job_text(json.dumps(job))
    assert not errors and evaluate(read)["ok"]
    out, problems, _ = validate_job(job)
    assert not problems and out["customer"] == "" and out["notes_on_sheet"] is False
    assert out["lines"][0]["engine_movement_axis"] == "z" and out["lines"][0]["engine_end"] == "start"


def test_a_bad_movement_direction_is_refused_by_its_field():
    # Source: the job model's choices (x, y, z).
    job = simple_job()
    job["lines"][0]["engine_movement_axis"] = "sideways"
    assert "lines[0].engine_movement_axis" in errors_of(evaluate(job))
