"""Edits on a job: the engine's advice as data (``fix`` and a candidate's ``apply``), applied by path.

A path is in the validator's own syntax and indexes the user's own lists from 0:
``lines[0].parts[1].length_m``, ``lines[2].to_port.line_end_dash``, ``lines[1].parts``. Applying an
edit sets that field to the edit's value, creating the record on the way where it is missing
(a port record the user left out). Hand-written: a few lines, and no library reads this path syntax.
"""
from __future__ import annotations

import copy
import re

__all__ = ["parse_path", "apply_edits"]

_STEP = re.compile(r"([A-Za-z_][A-Za-z0-9_]*)|\[(\d+)\]")


def parse_path(path: str) -> list:
    """The steps of a path: keys (str) and list indices (int).

    Examples
    --------
    >>> parse_path("lines[0].parts[12].length_m")
    ['lines', 0, 'parts', 12, 'length_m']
    """
    steps, pos = [], 0
    for m in _STEP.finditer(path):
        if m.start() != pos and path[pos:m.start()] != ".":
            raise ValueError(f"not a field path: {path!r}")
        steps.append(m.group(1) if m.group(1) is not None else int(m.group(2)))
        pos = m.end()
    if not steps or pos != len(path):
        raise ValueError(f"not a field path: {path!r}")
    return steps


def apply_edits(job: dict, edits) -> dict:
    """A copy of ``job`` with each edit ``{"path", "value"}`` made in order (``job`` itself is left as it was).

    Examples
    --------
    >>> job = {"lines": [{"parts": [{"kind": "hose", "length_m": 1.0}]}]}
    >>> apply_edits(job, [{"path": "lines[0].parts[0].length_m", "value": 1.042},
    ...                   {"path": "lines[0].to_port.line_end_dash", "value": 8}])["lines"][0]
    {'parts': [{'kind': 'hose', 'length_m': 1.042}], 'to_port': {'line_end_dash': 8}}
    >>> job["lines"][0]["parts"][0]["length_m"]
    1.0
    """
    out = copy.deepcopy(job)
    for edit in edits:
        steps = parse_path(edit["path"])
        node = out
        for step, nxt in zip(steps, steps[1:]):
            if isinstance(step, str) and (step not in node or node[step] is None):
                node[step] = [] if isinstance(nxt, int) else {}
            node = node[step]
        node[steps[-1]] = copy.deepcopy(edit["value"])
    return out
