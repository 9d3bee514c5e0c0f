"""The job files every front end must treat alike: the command line, the JSON API and the page.

One table, run three ways: ``python -m calc evaluate FILE`` (tests/edges/test_job_files.py), the
API's ``open`` operation with the file's bytes (the same test file) and the page's "Open job file"
input (tests/page/test_page.py). Each case is a file's bytes and what must happen: it opens, or it
is refused with an error of the given path ("" for the file as a whole) whose message holds the
given words. A case that opens must give the same job and the same result everywhere.

Source of every expectation: stated behaviour (issue 16: the front ends accept and refuse the same
files; an explicit null for an optional field means "not given"; a byte-order mark is accepted;
every refusal names its field and never reads as an internal error).
"""
from __future__ import annotations

import json
from dataclasses import dataclass

from .jobs import demo_job

BOM = b"\xef\xbb\xbf"


@dataclass(frozen=True)
class Case:
    name: str          # the file's name (the page shows it)
    data: bytes        # the file's bytes
    path: str | None   # None: the file opens; else the path of the error it is refused with
    words: str = ""    # words that error's message holds
    job: dict | None = None  # the job a file that opens must give everywhere


def _text(job) -> str:
    return json.dumps(job, indent=1)


def _demo_with(edit, placeholder: str | None = None, literal: str = "") -> bytes:
    """The demo job edited by edit(job); a string value `placeholder` is then written as `literal`."""
    job = demo_job()
    edit(job)
    text = _text(job)
    if placeholder is not None:
        text = text.replace(json.dumps(placeholder), literal)
    return text.encode("utf-8")


def _set(path: str, value):
    """An edit setting the dotted path (list items by index) to value."""
    def edit(job):
        *head, last = [int(p) if p.isdigit() else p for p in path.split(".")]
        node = job
        for key in head:
            node = node[key]
        node[last] = value
    return edit


_NULLED = (("lines", 0, "dp_budget_bar"), ("lines", 0, "from_port"), ("pump", "overall_efficiency"), ("thermal",))


def _nulls(job):
    for *head, last in _NULLED:
        node = job
        for key in head:
            node = node[key]
        node[last] = None


def _not_given(job):
    """The demo job with the keys _nulls sets to null left out: what those nulls mean."""
    for *head, last in _NULLED:
        node = job
        for key in head:
            node = node[key]
        node.pop(last, None)
    return job


_DEMO = _text(demo_job()).encode("utf-8")
_MARK = "@value@"  # stands for a literal that json.dumps cannot write (NaN, huge integers, escapes)
_RELIEF = "pump.relief_bar"
_ROUTE = [[0, 0, 0], [_MARK, 0, 0]]

CASES = [
    Case("demo.json", _DEMO, None, job=demo_job()),
    Case("bom-crlf.json", BOM + _DEMO.replace(b"\n", b"\r\n"), None, job=demo_job()),
    Case("nulls.json", _demo_with(_nulls), None, job=_not_given(demo_job())),
    Case("empty.json", b"", "", "not valid JSON"),
    Case("cut-short.json", _DEMO[: len(_DEMO) // 2], "", "not valid JSON"),
    Case("python-literal.json", b"{'version': 1}", "", "not valid JSON"),
    Case("list.json", b"[1, 2, 3]", "", "must be a JSON object"),
    Case("deep.json", b"[" * 100_000 + b"]" * 100_000, "", "nested too deeply"),
    Case("huge.json", b'{"version": 1, "notes": "' + b"x" * 1_100_000 + b'"}', "", "under 1 MB"),
    Case("latin-1.json", _DEMO.replace(b'"name": "', b'"name": "M\xfcller ', 1), "", "not UTF-8"),
    Case("utf-16.json", _DEMO.decode("utf-8").encode("utf-16"), "", "not UTF-8"),
    Case("old.json", b'{"version": 7, "lines": []}', "version", "version 7"),
    Case("empty-job.json", b'{"version": 1}', "fluid", "is missing"),
    Case("nan.json", _demo_with(_set(_RELIEF, _MARK), _MARK, "NaN"), _RELIEF, "finite"),
    Case("infinity.json", _demo_with(_set(_RELIEF, _MARK), _MARK, "1e999"), _RELIEF, "finite"),
    Case("integer-400.json", _demo_with(_set(_RELIEF, _MARK), _MARK, "9" * 400), _RELIEF, "far too large"),
    Case("integer-5000.json", _demo_with(_set(_RELIEF, _MARK), _MARK, "9" * 5000), _RELIEF, "far too large"),
    Case("route-integer.json", _demo_with(_set("lines.0.route_points_mm", _ROUTE), _MARK, "1" + "0" * 400),
         "lines[0].route_points_mm[1][0]", "far too large"),
    Case("route-nested.json", _demo_with(_set("lines.0.route_points_mm", _ROUTE), _MARK, "[1, [2]]"),
         "lines[0].route_points_mm[1][0]", "must be a number"),
    Case("bool-number.json", _demo_with(_set(_RELIEF, True)), _RELIEF, "must be a number"),
    Case("comma-number.json", _demo_with(_set(_RELIEF, "85,5")), _RELIEF, "must be a number"),
    Case("null-required.json", _demo_with(_set(_RELIEF, None)), _RELIEF, "must be a number, got null"),
    Case("surrogate.json", _demo_with(_set("name", _MARK), _MARK, '"job \\ud800"'), "name", "lone surrogate"),
    Case("unknown-key.json", _demo_with(_set("pump.colour", "red")), "pump.colour", "not a known key"),
]
