"""Route geometry from measured points: length, bend angles, forced radius.

The user measures points ``[x, y, z]`` (mm, from any datum) along the path a
line should take. The path is taken as the polyline through the points; at
every interior point the line turns by the angle between the two segments
that meet there. A bend of centre-line radius ``R`` turning by ``theta`` needs
a straight tangent run of ``R tan(theta/2)`` on each side of the corner. A
segment between two corners is shared by both (each may use half of it); the
first and the last segment belong wholly to their one corner. So the largest
radius the measured route leaves room for at a corner is

.. math::
    R_{max} = \\frac{\\min(a_{prev}, a_{next})}{\\tan(\\theta/2)}

where ``a`` is the straight length available on each side. A part whose
minimum bend radius exceeds ``R_max`` cannot follow the route: the route forces
a bend tighter than the part allows.

Hand-written vector geometry (dot products and norms): it is a few lines, it
must run in the browser engine where numpy is not available, and no
pure-Python library offers fillet sizing of a 3-D polyline.
"""
from __future__ import annotations

import math

__all__ = ["route_geometry", "MIN_TURN_DEG"]

#: Turns smaller than this are treated as straight (measurement noise), deg; a stated choice.
MIN_TURN_DEG = 1.0


def _sub(a, b):
    return (a[0] - b[0], a[1] - b[1], a[2] - b[2])


def _norm(v):
    return math.sqrt(v[0] * v[0] + v[1] * v[1] + v[2] * v[2])


def route_geometry(points_mm: list) -> dict:
    r"""Length, bends and the tightest radius forced by a measured route.

    Parameters
    ----------
    points_mm : list of [x, y, z]
        Measured points along the path, [mm]; at least two. Consecutive
        duplicates (closer than 1e-6 mm) are dropped.

    Returns
    -------
    route : dict
        ``length_mm`` (polyline length through the points),
        ``straight_mm`` (distance first point to last),
        ``length_filleted_mm`` (path length with every corner rounded at its
        largest radius, the shortest smooth path through the corners),
        ``bends`` (per interior point turning by at least ``MIN_TURN_DEG``:
        ``at_point`` index in ``points_mm``, ``angle_deg`` turned, ``max_radius_mm``),
        ``tightest_radius_mm`` (smallest ``max_radius_mm``; ``None`` for a
        straight route), ``total_turn_deg`` and ``method``.

    Notes
    -----
    Valid for any polyline; the corner model assumes each bend is a circular
    arc tangent to its two segments (how a bender or a hose forms it). A turn
    of 180 degrees (the route doubles back) leaves no room for any radius:
    ``max_radius_mm`` is 0.

    Examples
    --------
    A right-angle route with 100 mm legs: the corner can take at most a
    100 mm radius, since 100 / tan(45 deg) = 100.

    >>> r = route_geometry([[0, 0, 0], [100, 0, 0], [100, 100, 0]])
    >>> r["length_mm"], r["bends"][0]["angle_deg"], round(r["tightest_radius_mm"], 6)
    (200.0, 90.0, 100.0)

    References
    ----------
    .. [1] Elementary vector geometry: the angle between segments from their
       dot product; the tangent length of a circular fillet, R tan(theta/2).
    """
    pts, orig = [], []
    for k, p in enumerate(points_mm):
        q = (float(p[0]), float(p[1]), float(p[2]))
        if not pts or _norm(_sub(q, pts[-1])) > 1e-6:
            pts.append(q)
            orig.append(k)
    segs = [_sub(pts[i + 1], pts[i]) for i in range(len(pts) - 1)]
    lens = [_norm(s) for s in segs]
    length = sum(lens)
    straight = _norm(_sub(pts[-1], pts[0])) if len(pts) > 1 else 0.0
    corners = []  # (interior point index in pts, turn angle rad)
    for i in range(1, len(pts) - 1):
        a, b = segs[i - 1], segs[i]
        c = (a[0] * b[0] + a[1] * b[1] + a[2] * b[2]) / (lens[i - 1] * lens[i])
        theta = math.acos(max(-1.0, min(1.0, c)))
        if math.degrees(theta) >= MIN_TURN_DEG:
            corners.append((i, theta))
    corner_at = {i for i, _ in corners}
    bends = []
    filleted = length
    for i, theta in corners:
        # straight available before and after the corner: a segment shared with another corner gives half
        a_prev = lens[i - 1] * (0.5 if (i - 1) in corner_at else 1.0)
        a_next = lens[i] * (0.5 if (i + 1) in corner_at else 1.0)
        half = 0.5 * theta
        if math.pi - theta < 1e-9:
            r_max = 0.0
        else:
            r_max = min(a_prev, a_next) / math.tan(half)
        filleted += r_max * theta - 2.0 * r_max * math.tan(half)
        bends.append({"at_point": orig[i], "angle_deg": math.degrees(theta), "max_radius_mm": r_max})
    return {
        "length_mm": length,
        "straight_mm": straight,
        "length_filleted_mm": filleted,
        "bends": bends,
        "tightest_radius_mm": min((b["max_radius_mm"] for b in bends), default=None),
        "total_turn_deg": sum(b["angle_deg"] for b in bends),
        "method": "polyline through the measured points; each corner a circular arc tangent to its segments, "
                  "largest radius = available straight / tan(turn/2), a segment between two corners shared "
                  "half and half",
    }


def route_fillets(points_mm: list) -> list:
    r"""Where each bend of a measured route starts and ends, with the route's largest radius at each corner.

    Parameters
    ----------
    points_mm : list of [x, y, z]
        Measured points along the path, [mm]; as ``route_geometry``.

    Returns
    -------
    bends : list of dict
        Per bend of ``route_geometry`` (same order): ``at_point``, ``angle_deg``, ``radius_mm`` (its
        ``max_radius_mm``), ``corner_mm`` (the measured corner point), ``tangent_in_mm`` and
        ``tangent_out_mm`` (where the arc leaves the incoming segment and meets the outgoing one, [mm]).

    Notes
    -----
    A circular arc of radius R tangent to both segments of a corner turning by theta touches each
    at the tangent length t = R tan(theta/2) from the corner: ``corner - t u_in`` and ``corner + t
    u_out`` for the unit directions u of the segments. At the largest radius t is the straight length
    available on the tighter side (see ``route_geometry``).

    Examples
    --------
    A right angle with 100 mm legs: the 100 mm arc runs from the first point to the last.

    >>> b = route_fillets([[0, 0, 0], [100, 0, 0], [100, 100, 0]])[0]
    >>> [round(v, 9) for v in b["tangent_in_mm"]], [round(v, 9) for v in b["tangent_out_mm"]]
    ([0.0, 0.0, 0.0], [100.0, 100.0, 0.0])
    """
    pts = [tuple(float(c) for c in p) for p in points_mm]
    out = []
    for b in route_geometry(points_mm)["bends"]:
        k = b["at_point"]
        corner = pts[k]
        prev = next(p for p in reversed(pts[:k]) if _norm(_sub(corner, p)) > 1e-6)
        nxt = next(p for p in pts[k + 1:] if _norm(_sub(p, corner)) > 1e-6)
        u_in, u_out = _sub(corner, prev), _sub(nxt, corner)
        n_in, n_out = _norm(u_in), _norm(u_out)
        t = b["max_radius_mm"] * math.tan(math.radians(b["angle_deg"]) / 2.0)
        out.append({"at_point": k, "angle_deg": b["angle_deg"], "radius_mm": b["max_radius_mm"],
                    "corner_mm": list(corner),
                    "tangent_in_mm": [corner[i] - t * u_in[i] / n_in for i in range(3)],
                    "tangent_out_mm": [corner[i] + t * u_out[i] / n_out for i in range(3)]})
    return out


def moved_route(points_mm: list, end: str, axis: int, offset_mm: float) -> list:
    """The route with one end point moved by ``offset_mm`` along coordinate ``axis`` (0, 1, 2 for x, y, z).

    ``end`` is 'start' (the first point moves) or 'end' (the last); the other points stay, so the
    segment next to the moving end stretches or shrinks: how a hose between an engine-mounted port and
    a body-mounted one follows the engine on its mounts.

    Examples
    --------
    >>> moved_route([[0, 0, 0], [300, 0, 0]], "end", 2, 10.0)
    [[0.0, 0.0, 0.0], [300.0, 0.0, 10.0]]
    """
    pts = [[float(c) for c in p] for p in points_mm]
    k = 0 if end == "start" else len(pts) - 1
    pts[k][axis] += offset_mm
    return pts
