"""Which part of a line is its hose assembly: the hose its measured route and overall length describe.

A line's route points and its overall assembly length describe one flexible assembly: the line's
only hose, or, in a line with several, the hose between the fittings marked as the assembly's
start and end. That hose's length can be derived from them rather than typed.
"""
from __future__ import annotations

__all__ = ["assembly_hose", "end_fittings"]


def assembly_hose(parts) -> int | None:
    """Index (in ``parts``) of the line's hose assembly, or None when the line has none or it is not clear.

    Examples
    --------
    >>> assembly_hose([{"kind": "fitting", "end": "start"}, {"kind": "hose"}, {"kind": "fitting", "end": "end"},
    ...                {"kind": "tube"}])
    1
    >>> assembly_hose([{"kind": "hose"}, {"kind": "hose"}]) is None
    True
    """
    hoses = [k for k, p in enumerate(parts) if p["kind"] == "hose"]
    if len(hoses) == 1:
        return hoses[0]
    starts = [k for k, p in enumerate(parts) if p["kind"] == "fitting" and p.get("end") == "start"]
    ends = [k for k, p in enumerate(parts) if p["kind"] == "fitting" and p.get("end") == "end"]
    if len(starts) == 1 and len(ends) == 1:
        inside = [k for k in hoses if starts[0] < k < ends[0]]
        if len(inside) == 1:
            return inside[0]
    return None


def end_fittings(parts, k: int) -> list[int]:
    """The fittings that end part ``k`` (a hose or tube): the fittings directly before and after it.

    Examples
    --------
    >>> end_fittings([{"kind": "fitting"}, {"kind": "hose"}, {"kind": "exit"}], 1)
    [0]
    """
    return [i for i in (k - 1, k + 1) if 0 <= i < len(parts) and parts[i]["kind"] == "fitting"]
