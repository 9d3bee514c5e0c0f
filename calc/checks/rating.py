"""Rating checks of a line: the pressure it must hold, the design factor, burst, temperature range."""
from __future__ import annotations

from ..data.practice import LOW_PRESSURE_BAR, TEMP_CAUTION_K
from ..model.result import check
from ..system.naming import part_ref
from .case import LineCase, said

__all__ = ["pressure_checks", "temperature_checks", "suction_check"]


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
