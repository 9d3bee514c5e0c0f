"""Rating checks of a line: the pressure it must hold, the design factor, burst, temperature range, and the
wall temperature of a hose or tube near a heat source."""
from __future__ import annotations

from ..data.practice import LOW_PRESSURE_BAR, TEMP_CAUTION_K
from ..model.result import check
from ..system.naming import part_ref
from .case import LineCase, said

__all__ = ["pressure_checks", "temperature_checks", "wall_judgements", "wall_checks", "suction_check"]


def _pressure(rating, prs) -> dict:
    required, basis = rating["required_bar"], rating["required_basis"]
    w, wp = rating["working_bar"], rating["weakest_part"]
    unrated = [r for r in prs if r["working_bar"] is None]
    missing = ("; no rating for " + ", ".join(r["label"] for r in unrated) + ": name a hose class and dash size, "
               "a fitting family and size, or give the part's rated working pressure from the maker's data"
               ) if unrated else ""
    if required < LOW_PRESSURE_BAR:
        return check("pressure", "ok", f"the line stays below {LOW_PRESSURE_BAR:g} bar gauge (at most {required:.2f} "
                                       "bar): the pressure rating is not what limits it (a feed hose must still "
                                       "resist collapse)")
    if w is None:
        return check("pressure", "caution", f"cannot rate the line: it must hold {required:.1f} bar ({basis}){missing}")
    if rating["margin"] < 1.0:
        return check("pressure", "fail", f"use a higher-rated part: {wp['label']} is rated {w:.0f} bar, below the "
                                         f"{required:.1f} bar the line must hold ({basis}); margin {rating['margin']:.2f}")
    return check("pressure", "caution" if unrated else "ok",
                 f"the weakest rated part, {wp['label']}, is rated {w:.0f} bar and holds the {required:.1f} bar the "
                 f"line must hold ({basis}): margin {rating['margin']:.2f}" + missing)


def _burst(rating, prs) -> dict:
    required = rating["required_bar"]
    low = [r for r in prs if r["burst_bar"] is not None and r["burst_bar"] / required < r["design_factor"]]
    if low:
        return check("burst", "fail", "; ".join(
            f"use a stronger part than {r['label']}: its burst {r['burst_bar']:.0f} bar is "
            f"{r['burst_bar'] / required:.1f}:1 over {required:.1f} bar, under the {r['design_factor']:g}:1 "
            "design factor" for r in low))
    if any(r["burst_bar"] is not None for r in prs):
        return check("burst", "ok", f"the lowest burst, {rating['burst_bar']:.0f} bar, is "
                                    f"{rating['burst_margin']:.1f}:1 over {required:.1f} bar, at least each part's "
                                    "design factor")
    return check("burst", "caution", "no part has a known burst pressure: give the hose's minimum burst pressure or "
                                     "name its class")


def pressure_checks(case: LineCase) -> list:
    """Pressure, design factor and burst of the line's parts against what the line must hold."""
    rating, prs = case.rating, case.part_ratings
    out = [_pressure(rating, prs)]
    for r in prs:
        for note in r["notes"]:
            if note.startswith("burst") and "design factor" in note:
                out.append(check("design factor", "caution", f"{r['label']}: {note}"))
    if rating["required_bar"] >= LOW_PRESSURE_BAR:
        out.append(_burst(rating, prs))
    return out


def _temperatures(case: LineCase):
    temps = [c["fluid_temp_c"] for c in case.conditions]
    t_max, t_min = max(temps), min(temps)
    return t_max, t_min, case.conditions[temps.index(t_max)]["name"]


def temperature_checks(case: LineCase) -> list:
    """Every part's temperature range against the fluid's over the operating points."""
    t_max, t_min, at = _temperatures(case)
    fails, cautions, unknown = [], [], []
    for r in case.part_ratings:
        if r["kind"] == "device":
            continue
        lim = r["max_temp_c"]
        if lim is None:
            if not any(n.startswith("metal-to-metal") for n in r["notes"]):
                unknown.append(r)
        elif t_max > lim:
            fails.append(f"{r['label']} is limited to {lim:g} C, the fluid reaches {t_max:g} C at {said(at)}")
        elif t_max > lim - TEMP_CAUTION_K:
            cautions.append(f"the fluid's {t_max:g} C ({said(at)}) is within {TEMP_CAUTION_K:g} K of the {lim:g} C "
                            f"limit of {r['label']}")
        lo = r["min_temp_c"]
        if lo is not None and t_min < lo:
            fails.append(f"{r['label']} is rated down to {lo:g} C only, the fluid starts at {t_min:g} C")
    out = []
    if fails:
        out.append(check("temperature", "fail", "use a part rated hotter (or colder), or lower the fluid temperature: "
                         + "; ".join(fails)))
    if cautions:
        out.append(check("temperature", "caution", "little margin: " + "; ".join(cautions)
                         + " (ageing roughly doubles per 10 K, common practice)"))
    if unknown:
        out.append(check("temperature", "caution", "no temperature limit for " + ", ".join(r["label"] for r in unknown)
                         + f": give the part's maximum temperature; the fluid reaches {t_max:g} C"))
    if not out:
        out.append(check("temperature", "ok", f"every part's limit is above the fluid's highest {t_max:g} C "
                                              f"({said(at)}) and below its lowest {t_min:g} C"))
    return out


#: How the wall estimate's limits are read, by kind of part.
_BASIS = {"hose": ("fluid", "a hose's temperature rating is for the fluid: the higher of the fluid and the wall "
                            "is compared"),
          "tube": ("wall", "a tube's limit is a metal temperature: the hottest point of the wall is compared")}
_ADVICE = "move the line away from the heat, add a heat sleeve or shield, or use a part rated hotter"
_RADIATION = ("radiation from the hot surface is not modelled, so the wall facing it runs hotter still: take the "
              "estimate as a lower bound there")


def _judged(wall: dict, flowing: bool | None = None) -> tuple[float, dict] | tuple[None, None]:
    """The temperature compared with the part's limit and the point where it is highest, over the points
    with flow (True), without (False) or all (None)."""
    fluid_rated = _BASIS[wall["kind"]][0] == "fluid"

    def at(pt):
        hot = max(pt["inner_c"], pt["outer_c"])
        return max(hot, pt["fluid_temp_c"]) if fluid_rated else hot
    points = [pt for pt in wall["points"] if flowing is None or pt["flow"] == flowing]
    if not points:
        return None, None
    pt = max(points, key=at)
    return at(pt), pt


def _wall_words(case: LineCase, wall: dict) -> str:
    """Where the part sits and its wall estimate: with the fluid flowing, and without flow where hotter."""
    out = f"{wall['label']} of line {case.index + 1} sits in {wall['air_temp_c']:g} C air"
    t_flow, pt = _judged(wall, True)
    if pt is not None:
        surface = "outer" if pt["outer_c"] >= pt["inner_c"] else "inner"
        out += f"; its wall is estimated at up to {t_flow:.0f} C while the fluid flows ({surface} surface, at " \
               f"{said(pt['name'])})"
    t_still, still = _judged(wall, False)
    if still is not None and (t_flow is None or t_still > t_flow):
        out += (f"{' and' if pt is not None else '; its wall is taken at'} {t_still:.0f} C with no flow (at "
                f"{said(still['name'])}: standing fluid warms to the air around it, as in a heat soak)")
    return out


def _wall_judgement(case: LineCase, wall: dict, limit, t_max: float) -> dict:
    basis, basis_words = _BASIS[wall["kind"]]
    judged = _judged(wall)[0]
    out = {"limit_c": limit, "limit_basis": basis, "judged_c": judged, "verdict": None, "message": None}
    if wall["local_air_temp_c"] is None and (judged <= t_max or limit is None):
        return out  # the fluid-temperature check already judges this part, or asks for its limit
    words = _wall_words(case, wall)
    if limit is None:
        out.update(verdict="caution", message=f"no temperature limit for {wall['label']} of line {case.index + 1}: "
                                              f"give the part's maximum temperature from the maker's data; {words}; "
                                              f"{_RADIATION}")
    elif judged > limit:
        out.update(verdict="fail", message=f"{_ADVICE}: {words}, above its {limit:g} C limit ({basis_words}); "
                                           f"{_RADIATION}")
    elif judged > limit - TEMP_CAUTION_K:
        out.update(verdict="caution", message=f"little margin: {words}, within {TEMP_CAUTION_K:g} K of its {limit:g} C "
                                              f"limit ({basis_words}); {_ADVICE}; {_RADIATION}")
    else:
        out.update(verdict="ok", message=f"{words}, at least {TEMP_CAUTION_K:g} K under its {limit:g} C limit "
                                         f"({basis_words}); {_RADIATION}")
    return out


def wall_judgements(case: LineCase) -> list[dict]:
    """Each hose and tube's wall estimate (``LineCase.walls``) against its temperature limit.

    A part is judged here when it has its own air temperature, or when its wall runs hotter than the
    fluid's highest temperature (air hotter than the fluid) and its limit is known; otherwise ``verdict``
    is None and the fluid-temperature check (``temperature_checks``) judges it, or asks for its limit, as
    before. The compared temperature is
    the higher of the fluid and the wall for a hose (its rating is for the fluid), the hottest point of
    the wall for a tube. Over the limit: fail; within ``TEMP_CAUTION_K``: caution.

    Returns
    -------
    list of dict
        ``LineCase.walls`` rows with ``limit_c``, ``limit_basis`` ('fluid' or 'wall'), ``judged_c``,
        ``verdict`` and ``message`` added.
    """
    return _judge_walls(case, case.walls)


def _judge_walls(case: LineCase, walls) -> list[dict]:
    limits = {r["index"]: r["max_temp_c"] for r in case.part_ratings}
    t_max = _temperatures(case)[0]
    return [dict(w, **_wall_judgement(case, w, limits.get(w["index"]), t_max)) for w in walls]


def wall_checks(case: LineCase) -> list:
    """One check per hose or tube whose wall ``wall_judgements`` judges (a part near a heat source).

    With the under-hood air no hotter than the fluid's highest temperature, only the parts in air of their
    own can be judged (a wall lies between the fluid and the air at every point, so no other wall runs hotter
    than the fluid's highest): the walls of the others are not worked out (the candidates of a line are
    judged often).
    """
    own = [p for p in case.parts if p["kind"] in ("hose", "tube") and p.get("local_air_temp_c") is not None]
    if case.job.thermal["air_temp_c"] > _temperatures(case)[0]:
        walls = case.walls
    elif not own:
        return []
    else:
        walls = case.own_air_walls
    return [check("wall temperature", w["verdict"], w["message"]) for w in _judge_walls(case, walls) if w["verdict"]]


def suction_check(case: LineCase) -> dict | None:
    """A feed line below atmospheric pressure against its hoses' classes: a class the tables mark as not for
    suction can collapse (``suction`` in the hose table)."""
    low = case.rating["pressure_min_bar"]
    if case.role != "feed" or low >= 0.0:
        return None
    weak = [p for p in case.parts if p["kind"] == "hose" and getattr(p, "hose_class", None) is not None
            and p.hose_class.get("suction") is False]
    if not weak:
        return None
    return check("suction", "fail", "use a suction-rated hose class (with a wire helix or braid): "
                 + ", ".join(part_ref(p) for p in weak) + f" is not for suction, and the line runs down to {low:.2f} "
                 "bar gauge, where it can collapse")
