"""The prepared job: validated, defaults filled, part data from the tables, read-only.

``prepare(job)`` is the one way into the engine's stages. It validates the job against the
job model (``calc.model.job``), resolves the fluid, fills each hose part that names a class
and dash size from the hose tables (the user's own figures win) and freezes the whole job,
so no stage can edit what it was given.
"""
from __future__ import annotations

import json
from dataclasses import dataclass

from ..data.frozen import FrozenDict, freeze, thaw
from ..data.tables import find_class, fitting_families, hose_classes, size_row
from .job import PART
from .job_rules import validate_job
from .schema import Problem, validate

__all__ = ["Part", "PreparedLine", "PreparedJob", "prepare", "prepare_line_parts", "changed_part", "sizes_text"]

_HOSE_TABLE_FIELDS = ("bore_mm", "working_bar", "burst_bar", "min_bend_radius_mm", "max_temp_c")


class Part(FrozenDict):
    """One part of a line, read-only: the validated fields, plus where it came from.

    Attributes
    ----------
    place : int or None
        Its index in the user's own parts list; None for an adapter the port plan added.
    adapter : str or None
        For a planned adapter, its name with the port's label.
    hose_class : FrozenDict or None
        The hose class row of a hose part that names one.
    size_row : FrozenDict or None
        That class's row for the part's dash size.
    sources : FrozenDict
        Field -> where its value comes from ('user' or the table's source).
    """

    __slots__ = ("place", "adapter", "hose_class", "size_row", "sources")

    def __init__(self, fields, place=None, adapter=None, hose_class=None, size_row=None, sources=None):
        super().__init__(fields)
        set_ = object.__setattr__
        set_(self, "place", place)
        set_(self, "adapter", adapter)
        set_(self, "hose_class", hose_class)
        set_(self, "size_row", size_row)
        set_(self, "sources", FrozenDict(sources or {}))

    def __setattr__(self, name, value):
        raise TypeError("a prepared part is read-only")

    def __reduce__(self):
        return (Part, (dict(self), self.place, self.adapter, self.hose_class, self.size_row, self.sources))


@dataclass(frozen=True)
class PreparedLine:
    """A line of the prepared job: ``index`` in the user's list, display ``name``, ``role``,
    its ``parts`` (the user's, table data filled) and ``spec`` (every field of the line)."""

    index: int
    name: str
    role: str
    parts: tuple
    spec: FrozenDict


@dataclass(frozen=True)
class PreparedJob:
    """The job every stage reads: ``job`` (validated, defaults filled, fluid resolved, frozen),
    ``lines`` (``PreparedLine``), the validation ``warnings`` and ``raw``, the job as the user wrote it
    (frozen; edits the engine proposes are made on it, so they hold no filled-in defaults)."""

    job: FrozenDict
    lines: tuple
    warnings: tuple
    raw: FrozenDict

    @property
    def fluid(self) -> FrozenDict:
        return self.job["fluid"]

    @property
    def pump(self) -> FrozenDict:
        return self.job["pump"]

    @property
    def gear(self) -> FrozenDict:
        return self.job["gear"]

    @property
    def conditions(self) -> tuple:
        return self.job["conditions"]

    @property
    def ratings(self) -> FrozenDict:
        return self.job["ratings"]

    @property
    def thermal(self) -> FrozenDict:
        return self.job["thermal"]


def sizes_text(rows, metric: bool = False) -> str:
    """'-4, -5, -6' (or '6, 8, 10' for a metric size basis): the sizes of a table.

    Examples
    --------
    >>> sizes_text([{"dash": 4}, {"dash": 6}])
    '-4, -6'
    """
    return ", ".join((f"{r['dash']}" if metric else f"-{r['dash']}") for r in rows)


def _hose_part(p: dict, place: int, path: str, problems: list) -> Part:
    """A hose part with its bore and ratings filled from its class, where it names one."""
    src = {f: "user" for f in _HOSE_TABLE_FIELDS if p.get(f) is not None}
    name = p.get("class")
    if name is None:
        return Part(p, place, sources=src)
    cls = find_class(name)
    if cls is None:
        problems.append(Problem(f"{path}.class", f"unknown hose class {name!r}; the tables have: "
                                                 + ", ".join(hose_classes())))
        return Part(p, place, sources=src)
    if not cls["sizes"]:
        if p.get("bore_mm") is None:
            problems.append(Problem(f"{path}.bore_mm", f"is missing: {cls['class']} has no sizes in the part "
                                                       f"tables ({cls['note']})"))
        return Part(p, place, hose_class=cls, sources=src)
    dash = p.get("dash")
    if dash is None:
        problems.append(Problem(f"{path}.dash", f"is missing: {cls['class']} is rated per dash size; sizes: "
                                                f"{sizes_text(cls['sizes'])}"))
        return Part(p, place, hose_class=cls, sources=src)
    row = size_row(cls["sizes"], dash)
    if row is None:
        problems.append(Problem(f"{path}.dash", f"{cls['class']} has no -{dash}; sizes: "
                                                f"{sizes_text(cls['sizes'])}"))
        return Part(p, place, hose_class=cls, sources=src)
    filled = dict(p)
    for f, v in (("bore_mm", row["bore_mm"]), ("working_bar", row["working_bar"]),
                 ("burst_bar", row["burst_bar"]), ("min_bend_radius_mm", row["min_bend_radius_mm"]),
                 ("max_temp_c", cls["temp_max_c"])):
        if filled.get(f) is None and v is not None:
            filled[f] = float(v)
            src[f] = row["source"]
    return Part(filled, place, hose_class=cls, size_row=row, sources=src)


def _fitting_size_problem(p: dict, path: str) -> Problem | None:
    fam = fitting_families()[p["family"]]
    if not fam["sizes"] or fam.get("working_bar") is not None or size_row(fam["sizes"], p["dash"]) is not None:
        return None  # a family rated for all its sizes (banjo, barb) takes any size
    metric = "mm" in fam["size_basis"]
    size = f"size {p['dash']}" if metric else f"-{p['dash']}"
    rows = [r for r in fam["sizes"] if r["dash"] is not None]
    return Problem(f"{path}.dash", f"{fam['name']} has no {size} in the tables; sizes: "
                                   f"{sizes_text(rows, metric)} ({fam['size_basis']}); or give working_bar")


def _prepare_parts(i: int, parts: list, problems: list, first: int = 0) -> tuple:
    out = []
    for k, p in enumerate(parts, first):
        path = f"lines[{i}].parts[{k}]"
        if p["kind"] == "hose":
            out.append(_hose_part(freeze(p), k, path, problems))
            continue
        if p["kind"] == "fitting" and p.get("family") and p.get("dash") is not None:
            problem = _fitting_size_problem(p, path)
            if problem is not None:
                problems.append(problem)
        out.append(Part(freeze(p), k))
    return tuple(out)


def prepare_line_parts(i: int, raw_parts, cache: dict | None = None, only=None) -> tuple[dict, list[Problem]]:
    """Parts of line ``i`` as the user would write them, validated and prepared (hose data from the tables).

    For parts the engine itself proposes (a candidate assembly): the same validation and table fill as
    ``prepare``, part by part. ``only``, when given, names the places to prepare; ``cache`` keeps each
    prepared part by its place and content, so the many candidates of one line prepare a part once.

    Returns
    -------
    parts, problems
        Place -> prepared ``Part``, and the problems found (empty for valid parts).
    """
    problems: list[Problem] = []
    out = {}
    for k in (range(len(raw_parts)) if only is None else only):
        raw = raw_parts[k]
        key = (k, json.dumps(raw, sort_keys=True)) if cache is not None else None
        hit = cache.get(key) if key is not None else None
        if hit is None:
            norm, probs, _ = validate(PART, thaw(raw))
            hit = (_prepare_parts(i, [norm], probs, first=k)[0] if not probs else None, tuple(probs))
            if key is not None:
                cache[key] = hit
        problems.extend(hit[1])
        out[k] = hit[0]
    return out, problems


def changed_part(part: Part, changes: dict, line: int) -> tuple[Part, list[Problem]]:
    """A prepared user part with some of its fields changed, prepared again: what ``prepare`` gives for the
    part written with those changes (a change to None takes the field back to its default, which is None
    for every field the engine changes: a hose's class, size and datasheet figures, a fitting's size and
    bore). Faster than ``prepare_line_parts`` for the engine's own edits: nothing is validated again.

    Examples
    --------
    >>> job, _, _ = prepare({"version": 1, "name": "x", "fluid": {"preset": "atf-typical"},
    ...                      "pump": {"displacement_cc_rev": 10, "relief_bar": 90, "flow_limit_lpm": 8},
    ...                      "gear": {"neutral_drop_bar": 2, "at_flow_lpm": 8},
    ...                      "lines": [{"name": "p", "role": "pressure", "parts": [
    ...                          {"kind": "hose", "class": "SAE 100R2AT", "dash": 6, "length_m": 1}]}]})
    >>> new, _ = changed_part(job.lines[0].parts[0], {"dash": 8}, 0)
    >>> new["bore_mm"], new.size_row["dash"]
    (12.7, 8)
    """
    fields = dict(part)
    if part["kind"] == "hose":  # the old class's figures go: only the user's own stay
        for f in _HOSE_TABLE_FIELDS:
            if part.sources.get(f) != "user":
                fields[f] = None
    fields.update(changes)
    problems: list[Problem] = []
    return _prepare_parts(line, [fields], problems, first=part.place)[0], problems


def prepare(job) -> tuple[PreparedJob | None, list[Problem], list[Problem]]:
    """Validate a job and prepare it for the stages.

    Parameters
    ----------
    job : dict
        A job document as parsed from JSON.

    Returns
    -------
    prepared : PreparedJob or None
        None when there are problems.
    problems : list of Problem
        Field-named errors: the job model's, then unknown hose classes, dash sizes a class lacks
        and fitting sizes a family lacks.
    warnings : list of Problem
        Accepted values outside a usual or validity range.

    Examples
    --------
    >>> job = {"version": 1, "fluid": {"preset": "iso-vg32"},
    ...        "pump": {"displacement_cc_rev": 10, "flow_limit_lpm": 8, "relief_bar": 85},
    ...        "gear": {"neutral_drop_bar": 2, "at_flow_lpm": 8},
    ...        "lines": [{"role": "pressure", "parts": [{"kind": "hose", "class": "SAE 100R2AT", "dash": 7,
    ...                                                   "length_m": 1}]}]}
    >>> [str(p) for p in prepare(job)[1]]
    ['lines[0].parts[0].dash: SAE 100R2AT has no -7; sizes: -4, -5, -6, -8, -10, -12, -16']
    """
    norm, problems, warnings = validate_job(job)
    if problems:
        return None, problems, warnings
    problems = []
    lines = []
    for i, ln in enumerate(norm["lines"]):
        parts = _prepare_parts(i, ln["parts"], problems)
        lines.append(PreparedLine(i, ln["name"] or f"line {i + 1}", ln["role"], parts, freeze(ln)))
    if problems:
        return None, problems, warnings
    return PreparedJob(freeze(norm), tuple(lines), tuple(warnings), freeze(job)), [], warnings
