"""Field-definition machinery for the job model.

The job model (``calc.model.job``) is declared once with the classes here. The same
declaration drives four things: validation of a job (``validate``), the
defaults filled into a normalised job, the form the page renders at build time
(``describe``) and the field reference in the docs. Nothing else in the project
lists the fields of a job.

This is hand-written because the job model must carry, for every field, a
label, a unit kind, limits and help text that a page can render; general
validators (JSON Schema and the like) carry none of that in a form the page and
the command line can share, and the browser engine must stay dependency-light.
"""
from __future__ import annotations

import math
import re
from dataclasses import dataclass, field as dc_field
from typing import Any

__all__ = ["REQUIRED", "Field", "Record", "ListOf", "Variants", "Problem", "validate", "number_problem",
           "key_text"]


class _Required:
    def __repr__(self) -> str:  # pragma: no cover - repr only
        return "REQUIRED"


#: Marker for a field with no default: the user must give it.
REQUIRED = _Required()


@dataclass(frozen=True)
class Problem:
    """One thing wrong with a job: the field's path and the reason."""

    path: str
    message: str

    def as_dict(self) -> dict:
        return {"path": self.path, "message": self.message}

    def __str__(self) -> str:
        return f"{self.path}: {self.message}"


@dataclass(frozen=True)
class Field:
    """A scalar field of a record.

    Parameters
    ----------
    key : str
        JSON key; a physical quantity's key ends with its unit (``bore_mm``).
    label : str
        Visible label on the page.
    kind : str
        ``"number"``, ``"integer"``, ``"text"``, ``"choice"``, ``"bool"``,
        ``"points"`` (list of ``[x, y, z]`` triples), or ``"table"`` (rows of numbers, one per
        column of ``columns``).
    unit : str or None
        Unit kind for display conversion at the edges (see ``calc.edges.units``).
    default : Any
        Value filled in when the key is absent; ``REQUIRED`` if it must be given;
        ``None`` if it is optional with no value.
    gt, ge, lt, le : float or None
        Limits (exclusive and inclusive). A value outside is an error.
    warn_below, warn_above : float or None
        Soft limits: a value outside is accepted with a warning (a method's
        validity range, an unusual value for the trade).
    choices : tuple of str
        Allowed values of a ``"choice"`` field.
    help : str
        One or two sentences for the page and the docs.
    choice_words : tuple of (str, str) pairs, optional
        Words for people for the choices of a ``"choice"`` field (the choice itself is the key kept in
        the job); the form and the build sheet show these.
    columns : tuple of Field, optional
        The columns of a ``"table"`` field: each a number field with its own label, unit and limits; a
        row is a list with one value per column.
    min_rows, max_rows : int
        How many rows a ``"table"`` field may have.
    """

    key: str
    label: str
    kind: str = "number"
    unit: str | None = None
    default: Any = REQUIRED
    gt: float | None = None
    ge: float | None = None
    lt: float | None = None
    le: float | None = None
    warn_below: float | None = None
    warn_above: float | None = None
    choices: tuple = ()
    help: str = ""
    max_length: int = 200
    choice_words: tuple = ()
    columns: tuple = ()
    min_rows: int = 1
    max_rows: int = 50

    def describe(self) -> dict:
        d = {"key": self.key, "label": self.label, "kind": self.kind, "unit": self.unit,
             "help": self.help}
        d["required"] = self.default is REQUIRED
        d["default"] = None if self.default is REQUIRED else self.default
        for k in ("gt", "ge", "lt", "le", "warn_below", "warn_above"):
            v = getattr(self, k)
            if v is not None:
                d[k] = v
        if self.choices:
            d["choices"] = list(self.choices)
        if self.choice_words:
            d["choice_words"] = dict(self.choice_words)
        if self.columns:
            d.update(columns=[c.describe() for c in self.columns], min_rows=self.min_rows, max_rows=self.max_rows)
        return d

    # -- validation -------------------------------------------------------
    def check(self, value: Any, path: str, problems: list, warnings: list) -> Any:
        k = self.kind
        if k in ("number", "integer"):
            reason = number_problem(value)
            if reason is None and k == "integer" and value != int(value):
                reason = "must be a whole number"
            if reason:
                problems.append(Problem(path, reason))
                return None
            value = int(value) if k == "integer" else float(value)
            if self.gt is not None and not value > self.gt:
                problems.append(Problem(path, f"must be greater than {_num(self.gt)}"))
            elif self.ge is not None and not value >= self.ge:
                problems.append(Problem(path, f"must be at least {_num(self.ge)}"))
            elif self.lt is not None and not value < self.lt:
                problems.append(Problem(path, f"must be less than {_num(self.lt)}"))
            elif self.le is not None and not value <= self.le:
                problems.append(Problem(path, f"must be at most {_num(self.le)}"))
            else:
                if self.warn_below is not None and value < self.warn_below:
                    warnings.append(Problem(path, f"{_num(value)} is below the usual range "
                                                  f"(from {_num(self.warn_below)}); check it"))
                if self.warn_above is not None and value > self.warn_above:
                    warnings.append(Problem(path, f"{_num(value)} is above the usual range "
                                                  f"(up to {_num(self.warn_above)}); check it"))
            return value
        if k == "text":
            if not isinstance(value, str):
                problems.append(Problem(path, f"must be text, got {_kind_of(value)}"))
                return None
            if len(value) > self.max_length:
                problems.append(Problem(path, f"is longer than {self.max_length} characters"))
                return None
            lone = _LONE_SURROGATE.search(value)
            if lone:
                problems.append(Problem(path, f"holds a lone surrogate (\\u{ord(lone.group()):04x}) at character "
                                              f"{lone.start() + 1}, which is no character on its own: retype "
                                              "that character"))
                return None
            return value
        if k == "choice":
            if not isinstance(value, str) or value not in self.choices:
                problems.append(Problem(path, f"must be one of {', '.join(map(repr, self.choices))}, "
                                              f"got {_short(value)}"))
                return None
            return value
        if k == "bool":
            if not isinstance(value, bool):
                problems.append(Problem(path, f"must be true or false, got {_kind_of(value)}"))
                return None
            return value
        if k == "points":
            return _points(value, path, problems)
        if k == "table":
            return self._table(value, path, problems, warnings)
        raise AssertionError(f"unknown field kind {k}")  # pragma: no cover

    def _table(self, value, path: str, problems: list, warnings: list):
        """Rows of numbers, each cell checked by its column's field at ``path[row][column]``."""
        n = len(self.columns)
        words = ", ".join(c.label.lower() for c in self.columns)
        if not isinstance(value, list):
            problems.append(Problem(path, f"must be a list of rows [{words}], got {_kind_of(value)}"))
            return None
        if not self.min_rows <= len(value) <= self.max_rows:
            problems.append(Problem(path, f"needs {self.min_rows} to {self.max_rows} rows, got {len(value)}"))
            return None
        out, bad = [], len(problems)
        for i, row in enumerate(value):
            if not isinstance(row, list) or len(row) != n:
                problems.append(Problem(f"{path}[{i}]", f"must be a row of {n} numbers [{words}], got "
                                        + (f"a list of {len(row)}" if isinstance(row, list) else _kind_of(row))))
                continue
            out.append([c.check(v, f"{path}[{i}][{j}]", problems, warnings) for j, (c, v) in
                        enumerate(zip(self.columns, row))])
        return None if len(problems) > bad else out


@dataclass(frozen=True)
class ListOf:
    """A list of records (conditions, lines, parts, bends)."""

    key: str
    label: str
    item: Any  # Record or Variants
    default: Any = REQUIRED
    min_items: int = 0
    max_items: int = 200
    help: str = ""

    def describe(self) -> dict:
        return {"key": self.key, "label": self.label, "kind": "list", "help": self.help,
                "min_items": self.min_items, "max_items": self.max_items,
                "required": self.default is REQUIRED,
                "item": self.item.describe()}

    def check(self, value, path, problems, warnings):
        if not isinstance(value, list):
            problems.append(Problem(path, f"must be a list, got {_kind_of(value)}"))
            return None
        if len(value) < self.min_items:
            problems.append(Problem(path, f"needs at least {self.min_items} "
                                          f"{'entry' if self.min_items == 1 else 'entries'}"))
            return None
        if len(value) > self.max_items:
            problems.append(Problem(path, f"has more than {self.max_items} entries"))
            return None
        return [self.item.check(v, f"{path}[{i}]", problems, warnings) for i, v in enumerate(value)]


@dataclass(frozen=True)
class Record:
    """A JSON object with a fixed set of keys."""

    key: str
    label: str
    fields: tuple
    default: Any = REQUIRED
    help: str = ""

    def describe(self) -> dict:
        return {"key": self.key, "label": self.label, "kind": "record", "help": self.help,
                "required": self.default is REQUIRED,
                "fields": [f.describe() for f in self.fields]}

    def check(self, value, path, problems, warnings):
        if not isinstance(value, dict):
            problems.append(Problem(path or "job", f"must be an object, got {_kind_of(value)}"))
            return None
        known = {f.key: f for f in self.fields}
        out = {}
        for key in value:
            if key not in known:
                problems.append(Problem(_join(path, key_text(key)), "is not a known key here"))
        for f in self.fields:
            p = _join(path, f.key)
            given = f.key in value and not (value[f.key] is None and f.default is not REQUIRED)
            if given:  # an explicit null for an optional field means "not given"
                out[f.key] = f.check(value[f.key], p, problems, warnings)
            elif f.default is REQUIRED:
                problems.append(Problem(p, "is missing"))
            elif isinstance(f.default, (list, dict)):
                # mutable defaults are validated too, so nested defaults fill in
                out[f.key] = f.check(_copy(f.default), p, problems, warnings)
            else:
                out[f.key] = f.default
        return out


@dataclass(frozen=True)
class Variants:
    """A record whose fields depend on a discriminator key (parts by ``kind``)."""

    key: str
    label: str
    tag: str
    variants: dict = dc_field(default_factory=dict)  # tag value -> Record
    help: str = ""
    default: Any = REQUIRED

    def describe(self) -> dict:
        return {"key": self.key, "label": self.label, "kind": "variants", "tag": self.tag,
                "help": self.help,
                "variants": {k: r.describe() for k, r in self.variants.items()}}

    def check(self, value, path, problems, warnings):
        if not isinstance(value, dict):
            problems.append(Problem(path, f"must be an object, got {_kind_of(value)}"))
            return None
        tag = value.get(self.tag)
        if tag is None:
            problems.append(Problem(_join(path, self.tag), "is missing"))
            return None
        if not isinstance(tag, str) or tag not in self.variants:
            problems.append(Problem(_join(path, self.tag),
                                    f"must be one of {', '.join(map(repr, self.variants))}, got {_short(tag)}"))
            return None
        rec = self.variants[tag]
        rest = {k: v for k, v in value.items() if k != self.tag}
        out = rec.check(rest, path, problems, warnings)
        if out is not None:
            out = {self.tag: tag, **out}
        return out


def validate(spec: Record, job: Any) -> tuple[Any, list[Problem], list[Problem]]:
    """Check ``job`` against ``spec``.

    Returns
    -------
    normalised : dict or None
        The job with defaults filled in (``None`` parts where a problem was found).
    problems : list of Problem
        Errors; the job must not be evaluated if there are any.
    warnings : list of Problem
        Accepted values outside a usual or validity range.
    """
    problems: list[Problem] = []
    warnings: list[Problem] = []
    out = spec.check(job, "", problems, warnings)
    return out, problems, warnings


# -- helpers --------------------------------------------------------------
_LONE_SURROGATE = re.compile("[\ud800-\udfff]")
#: Largest magnitude a job's number may have, and a route coordinate's (mm).
MAX_MAGNITUDE = 1e12
MAX_COORDINATE_MM = 1e7


def number_problem(value) -> str | None:
    """Why ``value`` is no usable number, or None when it is one.

    A JSON integer can be far beyond float range (``10**400``); it is compared as an integer and
    never converted, so no OverflowError can escape.

    Examples
    --------
    >>> number_problem(10 ** 400), number_problem(True), number_problem(2.5) is None
    ('is far too large to be a real value', 'must be a number, got true/false', True)
    """
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        return f"must be a number, got {_kind_of(value)}"
    if isinstance(value, int):
        return "is far too large to be a real value" if abs(value) > MAX_MAGNITUDE else None
    if not math.isfinite(value):
        return "must be a finite number (NaN and infinity are not allowed)"
    if abs(value) > MAX_MAGNITUDE:
        return "is far too large to be a real value"
    if value != 0 and abs(value) < 1e-9:
        return "is far too small to be a real value"
    return None


def _points(value, path: str, problems: list):
    """A list of [x, y, z] points in mm; every coordinate a finite number within 10 km of the datum."""
    if not isinstance(value, list):
        problems.append(Problem(path, f"must be a list of [x, y, z] points, got {_kind_of(value)}"))
        return None
    if len(value) > 500:
        problems.append(Problem(path, "has more than 500 points"))
        return None
    out = []
    for i, p in enumerate(value):
        if not isinstance(p, list) or len(p) != 3:
            problems.append(Problem(f"{path}[{i}]", "must be a point [x, y, z] of three finite numbers, got "
                                                    + (f"a list of {len(p)}" if isinstance(p, list) else _kind_of(p))))
            return None
        for j, c in enumerate(p):
            reason = number_problem(c)
            if reason is None and abs(c) > MAX_COORDINATE_MM:
                reason = f"must be within {MAX_COORDINATE_MM:g} mm of the datum"
            if reason:
                problems.append(Problem(f"{path}[{i}][{j}]", f"{reason} (a point is [x, y, z] in mm)"))
                return None
        out.append([float(c) for c in p])
    return out


def key_text(key: str) -> str:
    r"""A key as it may appear in a path: escapes for what is no character, cut to 40 characters.

    Examples
    --------
    >>> key_text("colour"), key_text("bad\ud800")
    ('colour', 'bad\\ud800')
    """
    text = key.encode("utf-8", "backslashreplace").decode("utf-8")
    text = "".join(ch if ch.isprintable() else ch.encode("unicode_escape").decode("ascii") for ch in text)
    return text if len(text) <= 40 else text[:37] + "..."


def _join(path: str, key: str) -> str:
    return f"{path}.{key}" if path else key


def _kind_of(v) -> str:
    if v is None:
        return "null"
    if isinstance(v, bool):
        return "true/false"
    if isinstance(v, (int, float)):
        return "a number"
    if isinstance(v, str):
        return f"text {_short(v)}"
    if isinstance(v, list):
        return "a list"
    if isinstance(v, dict):
        return "an object"
    return type(v).__name__  # pragma: no cover


def _short(v) -> str:
    s = repr(v)
    return s if len(s) <= 40 else s[:37] + "..."


def _num(x: float) -> str:
    return f"{x:g}"


def _copy(v):
    if isinstance(v, list):
        return [_copy(x) for x in v]
    if isinstance(v, dict):
        return {k: _copy(x) for k, x in v.items()}
    return v
