"""Ratings stage: the rating of every part and of each assembly, and the checks that read them.

Per line: the pressure it must hold (pressure lines: the relief setting plus the surge
allowance; return and feed lines: the highest computed pressure anywhere in the line, cold
start included), the weakest part, the margins, and the checks: pressure, design factor,
burst, temperature, bend radius, hose length change and slack, cut length, route.
Temperatures are the highest and lowest fluid temperature over the operating points (the
thermal stage's steady temperature is checked there).
"""
from __future__ import annotations

import math
from dataclasses import dataclass

from ..data.practice import LOW_PRESSURE_BAR, TEMP_CAUTION_K
from ..model.result import check
from ..model.schema import Problem
from ..physics.route import route_geometry
from ..system.rating import part_ratings

__all__ = ["RatingsSection", "ratings_stage"]


@dataclass(frozen=True)
class RatingsSection:
    """Per line: ``ratings`` (the result's ``lines[].rating``) and ``checks``; and ``warnings``."""

    ratings: tuple
    checks: tuple
    warnings: tuple


def _line_pressures(conditions, j: int) -> tuple[float, str, float]:
    """Highest and lowest pressure anywhere in line j over the conditions, bar gauge."""
    hi, hi_at, lo = -math.inf, "", math.inf
    for c in conditions:
        ln = c["lines"][j]
        ps = [n["pressure_bar"] for n in ln["nodes"]] if "nodes" in ln else [ln["inlet_bar"], ln["outlet_bar"]]
        if max(ps) > hi:
            hi, hi_at = max(ps), c["name"]
        lo = min(lo, min(ps))
    return hi, hi_at, lo


def _bore_warnings(j: int, parts) -> list[Problem]:
    out = []
    for k, p in enumerate(parts):
        row = p.size_row
        if p["kind"] == "hose" and row and p.sources.get("bore_mm") == "user" \
                and abs(p["bore_mm"] - row["bore_mm"]) > 0.1 * row["bore_mm"]:
            out.append(Problem(f"lines[{j}].parts[{k}].bore_mm",
                               f"{p['bore_mm']:g} mm differs from the nominal {row['bore_mm']:g} mm of "
                               f"-{p['dash']}; the given bore is used"))
    return out


def _rating(job, ln, conditions, t_max: float, t_min: float) -> tuple[dict, list]:
    """The line's ``rating`` record and its part ratings."""
    rset = job.ratings
    j = ln.index
    hi, hi_at, lo = _line_pressures(conditions, j)
    if ln.role == "pressure":
        required = job.pump["relief_bar"] * (1.0 + rset["surge_percent"] / 100.0)
        basis = f"relief {job.pump['relief_bar']:g} bar + {rset['surge_percent']:g} % surge allowance (common practice)"
    else:
        required = max(hi, 0.0)
        basis = f"highest computed pressure in the line, at '{hi_at}'"
    prs = part_ratings(ln.parts, rset, t_max, t_min)
    rated = [r for r in prs if r["working_bar"] is not None]
    weakest = min(rated, key=lambda r: r["working_bar"]) if rated else None
    bursts = [r for r in prs if r["burst_bar"] is not None]
    working = weakest["working_bar"] if weakest else None
    burst = min(r["burst_bar"] for r in bursts) if bursts else None
    low = required < LOW_PRESSURE_BAR  # near atmospheric: a margin would mean nothing
    spec = job.lines[j].spec
    rating = {
        "working_bar": working, "burst_bar": burst,
        "design_factor": weakest["design_factor"] if weakest else rset["hose_design_factor"],
        "required_bar": required, "required_basis": basis,
        "margin": working / required if (working is not None and not low) else None,
        "burst_margin": burst / required if (burst is not None and not low) else None,
        "weakest_part": ({"index": weakest["index"], "kind": weakest["kind"],
                          "description": weakest["description"], "working_bar": weakest["working_bar"]}
                         if weakest else None),
        "unrated_parts": [r["index"] for r in prs if r["working_bar"] is None],
        "temp_max_c": t_max, "temp_min_c": t_min, "pressure_min_bar": lo,
        "dp_budget_bar": spec.get("dp_budget_bar"),
        "parts": prs, "route": route_geometry(spec["route_points_mm"]) if spec.get("route_points_mm") else None,
    }
    return rating, prs


def _pressure_checks(rating, prs) -> list:
    required, basis = rating["required_bar"], rating["required_basis"]
    out = []
    w, wp = rating["working_bar"], rating["weakest_part"]
    unrated = [r for r in prs if r["working_bar"] is None]
    missing = ("; no rating for " + ", ".join(f"part {r['index']} ({r['description']})" for r in unrated)
               + ": name a hose class and dash size, a fitting family and size, or give working_bar "
               "from the maker's data") if unrated else ""
    if required < LOW_PRESSURE_BAR:
        out.append(check("pressure", "ok", f"the line stays below {LOW_PRESSURE_BAR:g} bar gauge (at most "
                                           f"{required:.2f} bar): the pressure rating is not what limits it "
                                           "(a feed hose must still resist collapse)"))
    elif w is None:
        out.append(check("pressure", "caution", f"cannot rate the line: it must hold {required:.1f} bar "
                                                f"({basis}){missing}"))
    elif rating["margin"] < 1.0:
        out.append(check("pressure", "fail",
                         f"use a higher-rated part: part {wp['index']} ({wp['description']}) is rated "
                         f"{w:.0f} bar, below the {required:.1f} bar the line must hold ({basis}); "
                         f"margin {rating['margin']:.2f}"))
    else:
        out.append(check("pressure", "caution" if unrated else "ok",
                         f"weakest rated part {wp['index']} ({wp['description']}) {w:.0f} bar holds the "
                         f"{required:.1f} bar the line must hold ({basis}): margin {rating['margin']:.2f}"
                         + missing))
    for r in prs:
        for note in r["notes"]:
            if note.startswith("burst") and "design factor" in note:
                out.append(check("design factor", "caution", f"part {r['index']} ({r['description']}): {note}"))
    if required >= LOW_PRESSURE_BAR:
        out.extend(_burst_checks(rating, prs))
    return out


def _burst_checks(rating, prs) -> list:
    required = rating["required_bar"]
    low = [r for r in prs if r["burst_bar"] is not None and r["burst_bar"] / required < r["design_factor"]]
    if low:
        return [check("burst", "fail", "; ".join(
            f"use a stronger part {r['index']} ({r['description']}): burst {r['burst_bar']:.0f} bar is "
            f"{r['burst_bar'] / required:.1f}:1 over {required:.1f} bar, under the {r['design_factor']:g}:1 "
            "design factor" for r in low))]
    if any(r["burst_bar"] is not None for r in prs):
        return [check("burst", "ok", f"lowest burst {rating['burst_bar']:.0f} bar is {rating['burst_margin']:.1f}:1 "
                                     f"over {required:.1f} bar, at least each part's design factor")]
    return [check("burst", "caution", "no part has a known burst pressure: give burst_bar or a hose class")]


def _temperature_checks(prs, t_max, t_max_at, t_min) -> list:
    fails, cautions, unknown = [], [], []
    for r in prs:
        if r["kind"] == "device":
            continue
        lim = r["max_temp_c"]
        if lim is None:
            if not any(n.startswith("metal-to-metal") for n in r["notes"]):
                unknown.append(r)
        elif t_max > lim:
            fails.append(f"part {r['index']} ({r['description']}) is limited to {lim:g} C, the fluid reaches "
                         f"{t_max:g} C at '{t_max_at}'")
        elif t_max > lim - TEMP_CAUTION_K:
            cautions.append(f"the fluid's {t_max:g} C ('{t_max_at}') is within {TEMP_CAUTION_K:g} K of the "
                            f"{lim:g} C limit of part {r['index']} ({r['description']})")
        lo = r["min_temp_c"]
        if lo is not None and t_min < lo:
            fails.append(f"part {r['index']} ({r['description']}) is rated down to {lo:g} C only, the fluid "
                         f"starts at {t_min:g} C")
    out = []
    if fails:
        out.append(check("temperature", "fail", "use a part rated hotter (or colder), or lower the fluid "
                                                "temperature: " + "; ".join(fails)))
    if cautions:
        out.append(check("temperature", "caution", "little margin: " + "; ".join(cautions)
                         + " (ageing roughly doubles per 10 K, common practice)"))
    if unknown:
        out.append(check("temperature", "caution", "no temperature limit for " + ", ".join(
            f"part {r['index']} ({r['description']})" for r in unknown) + f": give max_temp_c; the fluid "
            f"reaches {t_max:g} C"))
    if not out:
        out.append(check("temperature", "ok", f"every part's limit is above the fluid's highest {t_max:g} C "
                                              f"('{t_max_at}') and below its lowest {t_min:g} C"))
    return out


def _bend_checks(parts, prs) -> list:
    by_index = {r["index"]: r for r in prs}
    fails, unknown, n = [], [], 0
    for i, p in enumerate(parts):
        if p["kind"] not in ("hose", "tube") or not p.get("bends"):
            continue
        mn = by_index[i]["min_bend_radius_mm"]
        for m, b in enumerate(p["bends"]):
            n += 1
            if mn is None:
                unknown.append(f"part {i} bend {m}")
            elif b["radius_mm"] < mn * (1 - 1e-9):
                what = ("a tighter-bending hose class (for example SAE 100R16)" if p["kind"] == "hose"
                        else "a bender die of that radius")
                fails.append(f"part {i} ({by_index[i]['description']}) bend {m}: radius {b['radius_mm']:g} mm is "
                             f"under the minimum {mn:.0f} mm; use at least {mn:.0f} mm or {what}")
    if not n:
        return []
    if fails:
        return [check("bend radius", "fail", "; ".join(fails))]
    if unknown:
        return [check("bend radius", "caution", "no minimum bend radius known for " + ", ".join(unknown)
                      + ": name the hose class or give min_bend_radius_mm")]
    return [check("bend radius", "ok", f"all {n} bends at or above their part's minimum radius")]


def _slack_check(spec, parts, rset, route) -> list:
    hoses = [p for p in parts if p["kind"] == "hose"]
    if not hoses:
        return []
    hose_mm = sum(p["length_m"] for p in hoses) * 1000.0
    move = spec.get("engine_movement_mm") or 0.0
    plus, minus = rset["length_change_plus_percent"], rset["length_change_minus_percent"]
    shrink, grow = hose_mm * minus / 100.0, hose_mm * plus / 100.0
    need = shrink + move
    msg = (f"hose {hose_mm:.0f} mm changes by +{grow:.0f} / -{shrink:.0f} mm under pressure "
           f"(+{plus:g} % / -{minus:g} %, SAE J517, from memory)")
    msg += (f"; with {move:g} mm engine movement leave at least {need:.0f} mm slack" if move
            else f"; leave at least {need:.0f} mm slack")
    if route is None:
        return [check("length change", "caution" if move else "ok",
                      msg + ("; give route_points_mm to check the slack" if move else ""))]
    assembly = spec.get("overall_length_mm") or (
        sum(p["length_m"] for p in parts if p["kind"] in ("hose", "tube")) * 1000.0)
    slack = assembly - route["length_mm"]
    if slack < need:
        return [check("length change", "fail",
                      f"lengthen the assembly by {need - slack:.0f} mm: it is {assembly:.0f} mm over a "
                      f"{route['length_mm']:.0f} mm route, {slack:.0f} mm slack; " + msg)]
    return [check("length change", "ok", f"{slack:.0f} mm slack over the {route['length_mm']:.0f} mm route; " + msg)]


def _cut_check(spec, parts) -> list:
    total = spec.get("overall_length_mm")
    if not total:
        return []
    hoses = [p for p in parts if p["kind"] == "hose"]
    hose_mm = sum(p["length_m"] for p in hoses) * 1000.0
    ends = [p for p in parts if p["kind"] == "fitting" and p.get("end") in ("start", "end")]
    cut_off = sum(p["cutoff_mm"] for p in ends)
    cut = total - cut_off
    if cut <= 0:
        return [check("cut length", "fail", f"the cut-off allowances ({cut_off:g} mm) are not less than "
                                            f"the overall length {total:g} mm: check both")]
    if not ends:
        return [check("cut length", "caution", f"cut length {cut:.0f} mm = the overall length: mark the end "
                                               "fittings (end: start / end) and give their cutoff_mm")]
    msg = (f"cut the hose to {cut:.0f} mm: overall {total:g} mm less the cut-off allowances "
           + " + ".join(f"{p['cutoff_mm']:g}" for p in ends) + " mm")
    if len(hoses) == 1 and abs(cut - hose_mm) > max(10.0, 0.02 * cut):
        return [check("cut length", "caution", msg + f"; the pressure drop used {hose_mm:.0f} mm of "
                                                     f"hose: set length_m to {cut / 1000:.3f}")]
    return [check("cut length", "ok", msg)]


def _route_check(spec, route, prs) -> list:
    if route is None:
        return []
    known = [(r["index"], r["min_bend_radius_mm"]) for r in prs
             if r["kind"] in ("hose", "tube") and r["min_bend_radius_mm"] is not None]
    tight = route["tightest_radius_mm"]
    desc = (f"route {route['length_mm']:.0f} mm through {len(spec['route_points_mm'])} points "
            f"(end to end {route['straight_mm']:.0f} mm), "
            + (", ".join(f"{b['angle_deg']:.0f} deg at point {b['at_point']} (radius at most "
                         f"{b['max_radius_mm']:.0f} mm)" for b in route["bends"]) or "no bends"))
    if tight is None:
        return [check("route", "ok", desc)]
    if not known:
        return [check("route", "caution", desc + "; no minimum bend radius known to compare")]
    idx, worst = max(known, key=lambda m: m[1])
    if tight < worst:
        at = min(route["bends"], key=lambda b: b["max_radius_mm"])["at_point"]
        return [check("route", "fail", f"move the points apart or reroute near point {at}: the route forces a "
                                       f"bend of at most {tight:.0f} mm radius, under part {idx}'s minimum "
                                       f"{worst:.0f} mm; " + desc)]
    return [check("route", "ok", desc + f"; tightest forced radius {tight:.0f} mm is at least the {worst:.0f} mm "
                                        "minimum")]


def ratings_stage(job, circuit) -> RatingsSection:
    """Rate every line as built (``circuit.model.lines``) over the solved operating points.

    Parameters
    ----------
    job : calc.model.prepared.PreparedJob
    circuit : calc.stages.circuit.CircuitSection

    Returns
    -------
    RatingsSection
    """
    conditions = circuit.conditions
    temps = [c["fluid_temp_c"] for c in conditions]
    t_max, t_min = max(temps), min(temps)
    t_max_at = conditions[temps.index(t_max)]["name"]
    ratings, checks, warnings = [], [], []
    for ln in circuit.model.lines:
        spec = job.lines[ln.index].spec
        rating, prs = _rating(job, ln, conditions, t_max, t_min)
        warnings.extend(_bore_warnings(ln.index, ln.parts))
        route = rating["route"]
        checks.append(_pressure_checks(rating, prs) + _temperature_checks(prs, t_max, t_max_at, t_min)
                      + _bend_checks(ln.parts, prs) + _slack_check(spec, ln.parts, job.ratings, route)
                      + _cut_check(spec, ln.parts) + _route_check(spec, route, prs))
        ratings.append(rating)
    return RatingsSection(tuple(ratings), tuple(checks), tuple(warnings))
