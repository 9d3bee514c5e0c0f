"""Job files through the command line and the JSON API: the shared table, and hostile requests.

The table (tests/job_file_cases.py) runs here through ``python -m calc evaluate FILE`` and the
API's ``open`` operation, and through the page in tests/page/test_page.py: every front end must
open the same files, giving the same job and result, and refuse the same files with the same
field-named error. Then the API's own cases: job text spliced into a request as the page did
before it sent the bytes, with nothing of the text executed.
"""
import base64
import json

import pytest

from calc import evaluate
from calc.edges.api import dumps, handle
from calc.edges.cli import main

from ..job_file_cases import CASES
from ..jobs import demo_job, demo_paths


def _api_open(data: bytes) -> dict:
    return json.loads(handle(json.dumps({"op": "open", "file_base64": base64.b64encode(data).decode("ascii")})))


def _cli(tmp_path, capsys, name: str, data: bytes) -> tuple[int, str, str]:
    path = tmp_path / name
    path.write_bytes(data)
    status = main(["evaluate", str(path), "--json"])
    out = capsys.readouterr()
    return status, out.out, out.err


def _assert_named(errors: list[dict], case) -> None:
    """The refusal the case names: an error of its path holding its words; never an engine fault."""
    for error in errors:
        assert isinstance(error["path"], str) and error["message"], error
        assert "internal error" not in error["message"] and "Traceback" not in error["message"], error
    assert any(e["path"] == case.path and case.words in e["message"] for e in errors), (case.name, errors)


@pytest.mark.parametrize("case", CASES, ids=[c.name for c in CASES])
def test_job_file_table_through_the_api_and_the_command_line(case, tmp_path, capsys):
    # Source: stated behaviour (issue 16): the front ends accept and refuse the same files.
    reply = _api_open(case.data)
    status, out, err = _cli(tmp_path, capsys, case.name, case.data)
    assert "Traceback" not in err
    if case.path is None:
        assert reply["ok"] is True and "internal" not in reply, reply.get("errors")
        assert reply["job"] == case.job  # what was written, explicit nulls read as "not given"
        want = json.loads(dumps(evaluate(case.job)))  # Source: calc.evaluate on that job is the reference
        assert reply["result"] == want
        assert status == 0 and json.loads(out) == want, err
        return
    assert reply["ok"] is False and "internal" not in reply
    _assert_named(reply["errors"], case)
    assert status == 2 and out == ""
    where = str(tmp_path / case.name) if case.path == "" else case.path
    assert any(line.startswith(f"{where}: ") and case.words in line for line in err.splitlines()), err


def test_every_demo_file_opens_through_the_api():
    # Source: exact (the demos must open as they are).
    for path in demo_paths():
        reply = _api_open(path.read_bytes())
        assert reply["ok"], (path.name, reply.get("errors"))
        assert reply["job"] == json.loads(path.read_text(encoding="utf-8"))


def test_an_explicit_null_means_not_given_in_the_evaluate_operation_too():
    # Source: stated behaviour (issue 16): null for an optional field is the field left out.
    job = demo_job()
    nulled = json.loads(json.dumps(job))
    nulled["lines"][0]["dp_budget_bar"] = None
    nulled["gear"]["cold_drop_bar"] = None
    nulled["conditions"] = None
    left_out = json.loads(json.dumps(job))
    left_out["lines"][0].pop("dp_budget_bar", None)
    left_out["gear"].pop("cold_drop_bar", None)
    left_out.pop("conditions", None)
    a = json.loads(handle(json.dumps({"op": "evaluate", "job": nulled})))
    b = json.loads(handle(json.dumps({"op": "evaluate", "job": left_out})))
    assert a["ok"] and a == b


def _request_text(job_text: str) -> str:
    # A job's text spliced into an evaluate request.
    return '{"op": "evaluate", "job": ' + job_text + "}"


def _errors(text: str) -> list[dict]:
    # (How fast hostile requests are refused is a matter for benchmarks, not timed tests; the api's
    # size cap, calc.edges.api.MAX_REQUEST_CHARS, is what bounds the work.)
    out = json.loads(handle(text))
    assert out["ok"] is False, "a broken job was accepted"
    assert "internal" not in out, out
    for error in out["errors"]:
        assert isinstance(error["path"], str) and error["message"]
        assert "Traceback" not in error["message"] and "internal error" not in error["message"], error
    return out["errors"]


def _demo_text() -> str:
    return json.dumps(demo_job(), indent=1)


@pytest.mark.parametrize("text, path", [
    ("", ""),                                      # empty request
    ('{"version": 1, "name": "x",', ""),           # cut short
    ("{'version': 1}", ""),                        # not JSON (Python literal)
    ("\ufeff" + '{"version": 1}', ""),             # a byte-order mark inside a request is not JSON
])
def test_malformed_requests_say_the_request_is_not_valid_json(text, path):
    # Source: stated behaviour (a request is JSON; files go through the open operation).
    errors = _errors(_request_text(text) if text else "")
    assert errors[0]["path"] == path and "not valid JSON" in errors[0]["message"]


def test_wrong_version_is_refused_by_name():
    # Source: stated behaviour (this build reads version 1).
    job = demo_job()
    for version, wanted in [(2, "version 1"), (0, "version 1"), ("1", "number"), (10 ** 400, "far too large")]:
        job["version"] = version
        errors = _errors(json.dumps({"op": "evaluate", "job": job}))
        assert errors[0]["path"] == "version" and wanted in errors[0]["message"], errors


def test_huge_and_non_finite_numbers_name_their_field():
    # Source: stated behaviour (issue 16): a number no real value can be is refused by its field's path.
    text = _demo_text()
    relief = json.dumps(demo_job()["pump"]["relief_bar"])
    for literal in ("1e999", "-1e999", "NaN", "Infinity", "1e308", "9" * 400, "-" + "9" * 5000):
        errors = _errors(_request_text(text.replace(f'"relief_bar": {relief}', f'"relief_bar": {literal}', 1)))
        assert [e["path"] for e in errors] == ["pump.relief_bar"], (literal[:20], errors)


def test_deeply_nested_values_are_refused():
    # Source: stated behaviour (never a traceback; the wrong type is named where it can be read).
    text = _demo_text()
    for depth in (50, 5000, 200_000):
        nested = "[" * depth + "1" + "]" * depth
        errors = _errors(_request_text(text.replace('"name": ', f'"name": {nested}, "x_name": ', 1)))
        # Moderate depth: the wrong type is named; extreme depth: refused while parsing.
        assert {e["path"] for e in errors} in ({"name", "x_name"}, {""}), errors


def test_enormous_requests_are_refused():
    # Source: stated limits (calc.edges.api.MAX_REQUEST_CHARS, 12 lines, 200 characters of a name).
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
    # Source: stated behaviour (names are returned verbatim as text for the page's textContent).
    job = demo_job()
    markup = '<img src=x onerror="alert(1)"><script>alert(2)</script>'
    job["name"] = markup
    job["lines"][0]["name"] = markup
    out = json.loads(handle(json.dumps({"op": "evaluate", "job": job})))
    assert out["ok"], out.get("errors")
    assert out["result"]["job_name"] == markup
    assert out["result"]["lines"][0]["name"] == markup
