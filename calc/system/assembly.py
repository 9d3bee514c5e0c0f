"""A line's hose assembly as built: its length and bends, derived once from the measured route.

The hose assembly (``calc.model.assembly.assembly_hose``) runs between its end fittings, whose
cut-off allowances (the length each fitting adds beyond the cut hose end) add to the cut hose to
give the assembly's end-to-end length. The route and the overall length decide the hose's length:

* with route points, the assembly must cover the route plus the slack it needs: the hose shrinks
  under pressure by ``length_change_minus_percent`` of its length and the engine moves by
  ``engine_movement_mm``, so the shortest cut length L solves ``L + c = R + m L + M``:
  ``L = (R + M - c) / (1 - m)`` (rounded up to the millimetre); a measured overall length, where
  given, is kept when it is at least that long;
* with an overall length and no route, the cut length is the overall less the cut-off allowances;
* otherwise the hose's own typed length.

With route points the bends the route forces (angle and the largest radius it leaves room for)
are the assembly hose's bends: the ones the hydraulics uses and the bend checks read; bends typed
on that hose are not used then.
"""
from __future__ import annotations

import math
from dataclasses import dataclass

from ..model.assembly import assembly_hose, end_fittings
from ..model.prepared import Part
from ..physics.route import route_geometry

__all__ = ["Assembly", "assembly_of"]


@dataclass(frozen=True)
class Assembly:
    """A line's assembly as built (see the module docstring); lengths in mm, ``None`` where unknown."""

    hose: int | None            # place in the built parts of the assembly hose
    route: dict | None          # calc.physics.route.route_geometry of the measured points
    source: str                 # where the hose length comes from: route, overall, typed, none
    hose_mm: float | None       # cut length of the assembly hose (its flow length)
    typed_mm: float | None      # the length the user typed on it
    cutoff_mm: float            # cut-off allowances of its end fittings
    end_places: tuple           # places of those end fittings
    assembly_mm: float | None   # end to end: hose + cut-off allowances
    slack_mm: float | None      # assembly less the route
    slack_needed_mm: float | None
    overall_needed_mm: float | None  # the shortest overall length that holds the slack (with a route)
    typed_bends_ignored: bool
    parts: tuple                # the built parts with the derived length and bends


def _ends(parts, k) -> list[int]:
    marked = [i for i, p in enumerate(parts) if p["kind"] == "fitting" and p.get("end") in ("start", "end")]
    return marked or end_fittings(parts, k)


def _route_bends(route) -> tuple:
    return tuple({"angle_deg": b["angle_deg"], "radius_mm": max(b["max_radius_mm"], 0.5)} for b in route["bends"])


def assembly_of(spec, parts, rset) -> Assembly:
    """The assembly of a line as built from its ``parts`` (port adapters included), its line ``spec`` and the
    job's rating settings ``rset`` (length change under pressure)."""
    route = route_geometry(spec["route_points_mm"]) if spec.get("route_points_mm") else None
    k = assembly_hose(parts)
    none = Assembly(None, route, "none", None, None, 0.0, (), None, None, None, None, False, tuple(parts))
    if k is None:
        return none
    hose = parts[k]
    ends = tuple(_ends(parts, k))
    cut_off = sum(parts[i].get("cutoff_mm") or 0.0 for i in ends)
    typed = None if hose.get("length_m") is None else hose["length_m"] * 1000.0
    move = spec.get("engine_movement_mm") or 0.0
    shrink = rset["length_change_minus_percent"] / 100.0
    overall = spec.get("overall_length_mm")
    needed = None
    if route is not None:
        need_cut = math.ceil((route["length_mm"] + move - cut_off) / (1.0 - shrink) - 1e-9)
        needed = need_cut + cut_off
        hose_mm, source = ((overall - cut_off, "overall") if overall else (float(need_cut), "route"))
    elif overall:
        hose_mm, source = overall - cut_off, "overall"
    elif typed is not None:
        hose_mm, source = typed, "typed"
    else:  # the validator asks for a length or a route; nothing to build from
        return none
    assembly_mm = hose_mm + cut_off
    slack = assembly_mm - route["length_mm"] if route is not None else None
    fields = dict(hose, length_m=max(hose_mm, 1.0) / 1000.0)
    ignored = False
    if route is not None:
        ignored = bool(hose.get("bends"))
        fields["bends"] = _route_bends(route)
    built = list(parts)
    built[k] = Part(fields, hose.place, hose.adapter, hose.hose_class, hose.size_row, hose.sources)
    return Assembly(k, route, source, hose_mm, typed, cut_off, ends, assembly_mm, slack,
                    shrink * hose_mm + move, needed, ignored, tuple(built))
