"""The validator on hostile values: numbers beyond float range anywhere, booleans and text for numbers,
nested lists, explicit nulls, lone surrogates and odd keys. Each is refused with its field's path, or
accepted for what it means, never raised."""
import json

import pytest

from calc import evaluate
from calc.edges.report import text_report
from calc.model.schema import key_text, number_problem

from ..jobs import demo_job, errors_of, simple_job

HUGE = 10 ** 400  # an integer JSON can carry and no float can hold


def _route(*points):
    job = demo_job()
    job["lines"][0]["route_points_mm"] = [[0, 0, 0], *points]
    return job


@pytest.mark.parametrize("point, path, words", [
    ([HUGE, 0, 0], "lines[0].route_points_mm[1][0]", "far too large"),
    ([0, -HUGE, 0], "lines[0].route_points_mm[1][1]", "far too large"),
    ([0, 0, [1, 2]], "lines[0].route_points_mm[1][2]", "must be a number, got a list"),
    ([[1, [2, [3]]], 0, 0], "lines[0].route_points_mm[1][0]", "must be a number, got a list"),
    ([True, 0, 0], "lines[0].route_points_mm[1][0]", "must be a number, got true/false"),
    (["1,5", 0, 0], "lines[0].route_points_mm[1][0]", "must be a number, got text '1,5'"),
    ([float("nan"), 0, 0], "lines[0].route_points_mm[1][0]", "finite"),
    ([2e7, 0, 0], "lines[0].route_points_mm[1][0]", "within 1e+07 mm"),
    ([1, 2], "lines[0].route_points_mm[1]", "three finite numbers, got a list of 2"),
    (None, "lines[0].route_points_mm[1]", "three finite numbers, got null"),
])
def test_route_points_name_the_bad_coordinate(point, path, words):
    # Source: stated behaviour (issue 16): nested number lists are guarded like the scalar fields.
    errs = errors_of(evaluate(_route(point)))
    assert path in errs and words in errs[path], errs


@pytest.mark.parametrize("value, words", [
    (HUGE, "far too large"), (-HUGE, "far too large"), (True, "got true/false"), (False, "got true/false"),
    ("85,5", "got text '85,5'"), ([85], "got a list"), ([[85]], "got a list"), ({"bar": 85}, "got an object"),
])
def test_scalar_numbers_refuse_what_is_no_number(value, words):
    # Source: stated behaviour (issue 16): integers beyond float range, booleans, commas in numbers.
    job = simple_job()
    job["pump"]["relief_bar"] = value
    assert words in errors_of(evaluate(job))["pump.relief_bar"]


def test_number_problem_never_converts_a_huge_integer():
    # Source: exact: 10**400 is beyond the largest float (about 1.8e308), 10**12 is the stated limit.
    assert number_problem(HUGE) == "is far too large to be a real value"
    assert number_problem(10 ** 12) is None and number_problem(10 ** 12 + 1) is not None


def test_an_explicit_null_for_an_optional_field_means_not_given():
    # Source: stated behaviour (issue 16): null is the field left out, its default applies.
    job = demo_job()
    hose = next(k for k, p in enumerate(job["lines"][0]["parts"]) if p["kind"] == "hose")
    nulled = json.loads(json.dumps(job))
    nulled["lines"][0]["dp_budget_bar"] = None          # optional, no value
    nulled["lines"][0]["parts"][hose]["bends"] = None   # a list with a default
    nulled["pump"]["pulley_ratio"] = None               # a number with a default
    nulled["thermal"] = None                            # a record with a default
    for key, node in (("dp_budget_bar", job["lines"][0]), ("bends", job["lines"][0]["parts"][hose]),
                      ("pulley_ratio", job["pump"]), ("thermal", job)):
        node.pop(key, None)
    assert evaluate(nulled) == evaluate(job)


def test_an_explicit_null_for_a_required_field_is_refused():
    # Source: stated behaviour: a required value must be given.
    job = demo_job()
    job["pump"]["relief_bar"] = None
    job["lines"] = None
    errs = errors_of(evaluate(job))
    assert errs["pump.relief_bar"] == "must be a number, got null"
    assert errs["lines"] == "must be a list, got null"


@pytest.mark.parametrize("where", ["name", "notes", "lines.0.name", "conditions.0.name", "fluid.name"])
def test_a_lone_surrogate_in_text_is_refused_by_its_path(where):
    # Source: stated behaviour (issue 16): a lone surrogate would crash the text report; it is named instead.
    job = demo_job()
    job.setdefault("conditions", [{"name": "x", "engine_rpm": 800, "fluid_temp_c": 40}])
    *head, last = [int(p) if p.isdigit() else p for p in where.split(".")]
    node = job
    for key in head:
        node = node[key]
    node[last] = "before \ud800 after"
    path = where.replace(".0", "[0]")
    message = errors_of(evaluate(job))[path]
    assert "lone surrogate (\\ud800) at character 8" in message and "retype" in message


def test_paired_surrogates_are_characters_and_reach_the_report_unchanged():
    # Source: exact: U+1F527 is one character (a surrogate pair only in UTF-16 and JSON escapes).
    job = json.loads(json.dumps(demo_job()).replace('"name": "', '"name": "\\ud83d\\udd27 ', 1))
    res = evaluate(job)
    assert res["ok"] and res["job_name"].startswith("\U0001F527 ")
    assert "\U0001F527 " in text_report(res)


def test_odd_keys_are_named_printably():
    # Source: stated behaviour: a path names the key; what is no character is escaped, long keys cut.
    job = demo_job()
    job["pump"]["bad\ud800key"] = 1
    job["pump"]["k" * 100] = 1
    errs = errors_of(evaluate(job))
    assert errs["pump.bad\\ud800key"] == "is not a known key here"
    assert errs["pump." + "k" * 37 + "..."] == "is not a known key here"
    assert key_text("tab\there") == "tab\\there"
