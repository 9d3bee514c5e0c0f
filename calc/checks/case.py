"""The line a check judges, and the words and edits checks share."""
from __future__ import annotations

from dataclasses import dataclass
from functools import cached_property

from ..model.job import field_label
from ..system.naming import part_ref
from ..system.walls import line_walls

__all__ = ["LineCase", "said", "fix", "part_path", "label_for", "user_part"]


@dataclass(frozen=True)
class LineCase:
    """One line as built, with what the checks read.

    ``index`` is the line's place in the user's list (from 0); ``parts`` are the parts as built (port
    adapters and the assembly's derived length and bends included); ``user_parts`` the user's own;
    ``conditions`` the operating points (name, fluid temperature, flows, pump inlet, starved) and
    ``results`` this line's result at each; ``rating`` its rating and ``part_ratings`` its parts';
    ``walls`` (worked out when first read) the wall temperatures of its hoses and tubes
    (``calc.system.walls.line_walls``).
    """

    job: object
    index: int
    name: str
    role: str
    spec: object
    user_parts: tuple
    parts: tuple
    plans: dict
    assembly: object
    conditions: tuple
    results: tuple
    rating: dict
    part_ratings: tuple
    last_feed: bool
    memo: dict | None = None

    @cached_property
    def walls(self) -> list:
        """Each hose and tube of the line as built with its wall temperatures (``calc.system.walls``); ``memo``
        (shared by the candidates of one line) keeps the wall points already worked out."""
        return line_walls(self.job, self.parts, self.conditions, self.index, self.memo)

    @cached_property
    def own_air_walls(self) -> list:
        """``walls`` of the hoses and tubes in air of their own (``local_air_temp_c``) only."""
        return line_walls(self.job, self.parts, self.conditions, self.index, self.memo,
                          only=lambda p: p.get("local_air_temp_c") is not None)


def said(text: str) -> str:
    """User text quoted for a sentence: ‘like this’ (the unit conversion never touches it).

    Examples
    --------
    >>> said("cold start")
    '‘cold start’'
    """
    return f"‘{text}’"


def part_path(case: LineCase, place: int, key: str | None = None) -> str:
    """The validator's path of a user part's field: ``lines[0].parts[1].length_m``."""
    base = f"lines[{case.index}].parts[{place}]"
    return f"{base}.{key}" if key else base


def label_for(record: str, key: str, where: str) -> str:
    """A field's label with where it is: "Overall assembly length of line 1"."""
    return f"{field_label(record, key)} of {where}"


def fix(path: str, value, label: str) -> dict:
    """An edit that carries out a check's advice: set the job's field at ``path`` to ``value``.

    Examples
    --------
    >>> fix("lines[0].parts[1].length_m", 1.042, "Length of part 2")
    {'path': 'lines[0].parts[1].length_m', 'value': 1.042, 'label': 'Length of part 2'}
    """
    return {"path": path, "value": value, "label": label}


def user_part(case: LineCase, place: int) -> str:
    """A user part in words: "part 2 (hose SAE 100R2AT -6)"."""
    return part_ref(case.user_parts[place])
