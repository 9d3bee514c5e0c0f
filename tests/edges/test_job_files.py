"""Job files as the page hands them to the engine: text a user opened, possibly broken or hostile.

Complements tests/test_fuzz.py (generated jobs over the model, hostile requests) with the file
cases of a saved job: each must come back as a clear error naming the field, in bounded time,
with nothing of the text executed. The page keeps the current job when a file is refused
(tested by the page's own tests).
"""
import json

import pytest

from calc.edges.api import handle

from ..jobs import demo_job, demo_paths


def _request_text(job_text: str) -> str:
    # The page wraps the file's text as the job of an evaluate request.
    return '{"op": "evaluate", "job": ' + job_text + "}"


def _errors(text: str) -> list[dict]:
    # (How fast hostile files are refused is a matter for benchmarks, not timed tests; the api's
    # size cap, calc.edges.api.MAX_REQUEST_CHARS, is what bounds the work.)
    out = json.loads(handle(text))
    assert out["ok"] is False, "a broken job file was accepted"
    for error in out["errors"]:
        assert isinstance(error["path"], str) and error["message"]
        assert "Traceback" not in error["message"] and "internal error" not in error["message"], error
    return out["errors"]


def _demo_text() -> str:
    return json.dumps(demo_job(), indent=1)


def test_every_demo_file_opens():
    for path in demo_paths():
        out = json.loads(handle(_request_text(path.read_text(encoding="utf-8"))))
        assert out["ok"], (path.name, out.get("errors"))


@pytest.mark.parametrize("text, path", [
    ("", ""),                                      # empty file
    ('{"version": 1, "name": "x",', ""),           # cut short
    ("{'version': 1}", ""),                        # not JSON (Python literal)
    ("\ufeff" + '{"version": 1}', ""),             # byte-order mark left in by an editor
])
def test_malformed_files_say_the_request_is_not_valid_json(text, path):
    errors = _errors(_request_text(text) if text else "")
    assert errors[0]["path"] == path and errors[0]["message"]


def test_wrong_version_is_refused_by_name():
    job = demo_job()
    for version, wanted in [(2, "version 1"), (0, "version 1"), ("1", "number")]:
        job["version"] = version
        errors = _errors(json.dumps({"op": "evaluate", "job": job}))
        assert errors[0]["path"] == "version" and wanted in errors[0]["message"], errors


def test_huge_and_non_finite_numbers_name_their_field():
    text = _demo_text()
    relief = json.dumps(demo_job()["pump"]["relief_bar"])
    for literal in ("1e999", "-1e999", "NaN", "Infinity", "1e308"):
        errors = _errors(_request_text(text.replace(f'"relief_bar": {relief}', f'"relief_bar": {literal}', 1)))
        assert [e["path"] for e in errors] == ["pump.relief_bar"], (literal, errors)
    # An integer too long for Python's int parser (over 4300 digits) is refused as bad JSON.
    errors = _errors(_request_text(text.replace(f'"relief_bar": {relief}', '"relief_bar": ' + "9" * 5000, 1)))
    assert errors[0]["path"] == ""


def test_integer_beyond_float_range_names_its_field():
    text = _demo_text()
    relief = json.dumps(demo_job()["pump"]["relief_bar"])
    errors = _errors(_request_text(text.replace(f'"relief_bar": {relief}', '"relief_bar": ' + "9" * 400, 1)))
    assert [e["path"] for e in errors] == ["pump.relief_bar"]


def test_deeply_nested_values_are_refused():
    text = _demo_text()
    for depth in (50, 5000, 200_000):
        nested = "[" * depth + "1" + "]" * depth
        errors = _errors(_request_text(text.replace('"name": ', f'"name": {nested}, "x_name": ', 1)))
        # Moderate depth: the wrong type is named; extreme depth: refused while parsing.
        assert {e["path"] for e in errors} in ({"name", "x_name"}, {""}), errors


def test_enormous_files_are_refused_quickly():
    job = demo_job()
    job["lines"] = job["lines"] * 3000  # about 2 MB of lines
    errors = _errors(json.dumps({"op": "evaluate", "job": job})[:1_999_000] + "}")
    assert errors
    job = demo_job()
    job["lines"] = job["lines"] * 500
    errors = _errors(json.dumps({"op": "evaluate", "job": job}))
    assert errors[0]["path"] == "lines" and "entries" in errors[0]["message"]
    job = demo_job()
    job["name"] = "x" * 100_000
    assert _errors(json.dumps({"op": "evaluate", "job": job}))[0]["path"] == "name"


def test_markup_in_names_is_data_not_code():
    job = demo_job()
    markup = '<img src=x onerror="alert(1)"><script>alert(2)</script>'
    job["name"] = markup
    job["lines"][0]["name"] = markup
    out = json.loads(handle(json.dumps({"op": "evaluate", "job": job})))
    assert out["ok"], out.get("errors")
    # Returned verbatim as text for the page to insert with textContent.
    assert out["result"]["job_name"] == markup
    assert out["result"]["lines"][0]["name"] == markup
