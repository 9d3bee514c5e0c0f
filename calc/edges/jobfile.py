"""Reading a job file: the one reader behind the command line, the JSON API and the page.

``python -m calc evaluate FILE`` reads the file's bytes and calls :func:`read_job_bytes`; the page
hands the bytes of the file it opened to the engine (``{"op": "open", "file_base64": ...}`` in
``calc.edges.api``), which calls the same function. So a file is accepted or refused the same way,
with the same words, wherever it is opened:

- at most :data:`MAX_JOB_FILE_BYTES` bytes (a reader needs no more than one byte over the limit
  to know: the command line and the page read no more);
- UTF-8 text, with or without a byte-order mark (some editors write one);
- JSON nested at most :data:`MAX_NESTING` deep, read by :func:`loads`: ``NaN`` and ``Infinity`` are read as numbers, so the validator names
  the field that holds them; an integer of any length is read without error (one of more than
  :data:`LONGEST_INTEGER` digits as a stand-in of that many digits: far too large either way);
- a JSON object; everything else about it is the job model's to judge (``calc.model.job``).

Every refusal is ``{"path": "", "message": ...}``: the file as a whole, not a field of it.
"""
from __future__ import annotations

import json
import re
from itertools import accumulate
from typing import Any

__all__ = ["MAX_JOB_FILE_BYTES", "LONGEST_INTEGER", "MAX_NESTING", "TooDeep", "nesting_depth", "loads", "read_job_bytes", "read_job_text", "without_nulls"]

MAX_JOB_FILE_BYTES = 1_000_000
#: Digits kept of a JSON integer: far beyond any real value (the validator refuses over 1e12), far
#: under Python's 4300-digit limit on converting text to int.
LONGEST_INTEGER = 400
#: Deepest nesting of arrays and objects read (a job nests about eight deep).
MAX_NESTING = 64
_BOM = "\ufeff"
_STRING = re.compile(r'"(?:[^"\\]|\\.)*"?', re.S)
_NOT_BRACKET = re.compile(r"[^\[\]{}]+")
_STEP = {"[": 1, "{": 1, "]": -1, "}": -1}


def _integer(text: str) -> int:
    digits = text.lstrip("-")
    if len(digits) > LONGEST_INTEGER:
        text = text[:len(text) - len(digits)] + digits[:LONGEST_INTEGER]
    return int(text)


class TooDeep(ValueError):
    """JSON nested deeper than :data:`MAX_NESTING`."""


def nesting_depth(text: str) -> int:
    """How deep the arrays and objects of JSON text nest, found without recursion (brackets in strings
    do not count; an unterminated string runs to the end).

    Examples
    --------
    >>> nesting_depth('{"a": [[1], {"b": "[[[["}]}'), nesting_depth("[" * 100000)
    (3, 100000)
    """
    brackets = _NOT_BRACKET.sub("", _STRING.sub("", text))
    return max(accumulate(map(_STEP.__getitem__, brackets)), default=0)


def loads(text: str) -> Any:
    """JSON text to Python, the same way for a job file and a request.

    Nesting deeper than :data:`MAX_NESTING` is refused before parsing (``TooDeep``): a job nests
    about eight deep, and the parser's recursion must not reach the limits of the browser's stack,
    which lie elsewhere than CPython's.

    Examples
    --------
    >>> loads('{"a": NaN, "b": 1e999}')
    {'a': nan, 'b': inf}
    >>> len(str(loads("9" * 5000)))
    400
    """
    if nesting_depth(text) > MAX_NESTING:
        raise TooDeep(f"its values are nested more than {MAX_NESTING} deep")
    return json.loads(text, parse_int=_integer)


def _refused(message: str) -> tuple[None, list[dict]]:
    return None, [{"path": "", "message": message}]


def read_job_text(text: str) -> tuple[Any, list[dict]]:
    """``(job, [])`` for the text of a job file that holds a JSON object, else ``(None, [error])``.

    A leading byte-order mark is dropped. The job is returned as written (no defaults filled);
    ``calc.evaluate`` validates it.

    Examples
    --------
    >>> read_job_text('\\ufeff{"version": 1}')
    ({'version': 1}, [])
    >>> read_job_text("[1, 2]")[1][0]["message"]
    'the file does not hold a job: it must be a JSON object, not a list'
    """
    if text.startswith(_BOM):
        text = text[1:]
    if not text.strip():
        return _refused("the file is empty: it is not valid JSON")
    try:
        job = loads(text)
    except json.JSONDecodeError as exc:
        return _refused(f"the file is not valid JSON: {exc.msg} at line {exc.lineno}, column {exc.colno}")
    except (TooDeep, RecursionError):
        return _refused(f"the file is not valid JSON that can be read: its values are nested too deeply "
                        f"(more than {MAX_NESTING} levels)")
    if not isinstance(job, dict):
        kind = {list: "a list", str: "text", bool: "true or false", type(None): "null"}.get(type(job), "a number")
        return _refused(f"the file does not hold a job: it must be a JSON object, not {kind}")
    return job, []


def read_job_bytes(data: bytes) -> tuple[Any, list[dict]]:
    """``(job, [])`` for the bytes of a job file, else ``(None, [error])`` (see the module docstring).

    Examples
    --------
    >>> read_job_bytes(b'\\xef\\xbb\\xbf{"version": 1}')
    ({'version': 1}, [])
    >>> read_job_bytes(b'{"name": "\\xff"}')[1][0]["message"]
    'the file is not UTF-8 text (byte 11 is not UTF-8): save it as UTF-8'
    """
    if len(data) > MAX_JOB_FILE_BYTES:
        return _refused(f"the file is too large: a job file must be under {MAX_JOB_FILE_BYTES / 1e6:g} MB")
    try:
        text = data.decode("utf-8")
    except UnicodeDecodeError as exc:
        return _refused(f"the file is not UTF-8 text (byte {exc.start + 1} is not UTF-8): save it as UTF-8")
    return read_job_text(text)


def without_nulls(job):
    """The job without its explicit nulls: for a valid job the same job, as null means "not given".

    (A null where a value is required is refused by the validator, so this is applied only to a job
    that evaluated.)

    Examples
    --------
    >>> without_nulls({"a": None, "b": [{"c": None, "d": 1}], "e": 2})
    {'b': [{'d': 1}], 'e': 2}
    """
    if isinstance(job, dict):
        return {k: without_nulls(v) for k, v in job.items() if v is not None}
    if isinstance(job, list):
        return [without_nulls(v) for v in job]
    return job
