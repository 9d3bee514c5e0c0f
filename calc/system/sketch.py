"""What the page's route sketch draws: the measured route with its bends, at rest and at both ends of the
engine's movement, each bend judged against the line's minimum bend radius.

The points are taken as measured with the engine at rest. The end on the engine (``engine_end`` of the
line) moves by half the engine movement each way along ``engine_movement_axis`` (a total travel of
``engine_movement_mm``); the other points stay. The bends at each position are the largest the route
leaves room for (``calc.physics.route``), so a movement that tightens a bend shows at that position.
"""
from __future__ import annotations

from ..physics.route import moved_route, route_fillets, route_geometry

__all__ = ["limiting_bend_radius", "sketch_of", "AXES"]

#: The coordinate each movement direction moves along.
AXES = {"x": 0, "y": 1, "z": 2}


def limiting_bend_radius(part_ratings) -> dict | None:
    """The hose or tube rating with the largest known minimum bend radius (the one a route must respect), or
    None when none is known."""
    known = [r for r in part_ratings if r["kind"] in ("hose", "tube") and r["min_bend_radius_mm"] is not None]
    return max(known, key=lambda r: r["min_bend_radius_mm"]) if known else None


def _bend(b: dict, limit: dict | None) -> dict:
    where = f"the bend at point {b['at_point'] + 1} turns {b['angle_deg']:.0f} deg at {b['radius_mm']:.0f} mm radius"
    if limit is None:
        verdict, words = "caution", f"{where}; no minimum bend radius is known to compare with"
    elif b["radius_mm"] < limit["min_bend_radius_mm"]:
        verdict, words = "fail", (f"too tight: {where}, under the {limit['min_bend_radius_mm']:.0f} mm minimum of "
                                  f"{limit['label']}")
    else:
        verdict, words = "ok", f"{where}, at least the {limit['min_bend_radius_mm']:.0f} mm minimum"
    return dict(b, verdict=verdict, message=words)


def _position(name: str, offset: float, points: list, limit) -> dict:
    return {"name": name, "offset_mm": offset, "points_mm": points,
            "length_mm": route_geometry(points)["length_mm"],
            "bends": [_bend(b, limit) for b in route_fillets(points)]}


def sketch_of(spec: dict, part_ratings) -> dict | None:
    """The result's ``lines[].sketch`` of a validated line ``spec`` and its parts' ratings; None without route
    points.

    Examples
    --------
    >>> s = sketch_of({"route_points_mm": [[0, 0, 0], [300, 0, 0]], "engine_movement_mm": 20.0,
    ...                "engine_movement_axis": "y", "engine_end": "end"}, [])
    >>> [p["name"] for p in s["positions"]], [round(p["length_mm"], 3) for p in s["positions"]]
    (['at rest', 'engine moved -10 mm along y', 'engine moved +10 mm along y'], [300.0, 300.167, 300.167])
    """
    points = spec.get("route_points_mm")
    if not points:
        return None
    limit = limiting_bend_radius(part_ratings)
    pts = [[float(c) for c in p] for p in points]
    move = spec.get("engine_movement_mm") or 0.0
    axis, end = spec.get("engine_movement_axis") or "z", spec.get("engine_end") or "start"
    positions = [_position("at rest", 0.0, pts, limit)]
    for sign in (-1.0, 1.0):
        if move > 0:
            off = sign * move / 2.0
            positions.append(_position(f"engine moved {off:+g} mm along {axis}", off,
                                       moved_route(pts, end, AXES[axis], off), limit))
    worst = [b for p in positions for b in p["bends"]]
    order = {"ok": 0, "caution": 1, "fail": 2}
    return {"movement_mm": move, "movement_axis": axis, "engine_end": end,
            "min_bend_radius_mm": None if limit is None else limit["min_bend_radius_mm"],
            "min_bend_radius_of": None if limit is None else limit["label"],
            "verdict": max((b["verdict"] for b in worst), key=order.__getitem__, default="ok"),
            "positions": positions}
