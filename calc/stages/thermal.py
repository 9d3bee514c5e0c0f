"""Thermal stage: heat per operating point, steady temperature, full-lock hold, cooler advice.

Besides the heat model of ``calc.system.thermal_model`` (whose assumptions it repeats in the
result's ``thermal.method``), this stage assumes one steady bulk temperature for the whole duty
cycle: the duty-weighted heat generated equals the duty-weighted heat rejected, each operating
point re-solved at the trial temperature so viscosity follows temperature.
"""
from __future__ import annotations

import math
import re
from dataclasses import dataclass

from ..checks.case import said
from ..data.practice import CURVE_OVER_LIMIT_K
from ..model.result import check, worst_verdict
from ..physics.lumped import STEADY_MAX_C, STEADY_TOL_K, adiabatic_warmup, seconds_to_reach, solve_steady, warmup
from ..system.circuit import LPM
from ..system.thermal_model import ThermalModel
from ..system.walls import METHOD as WALL_METHOD

__all__ = ["METHOD", "ThermalSection", "thermal_stage", "lowest_part_limit"]

METHOD = [
    "Temperature rise across a part: dT = dp / (rho cp), the whole pressure loss turned into heat in the "
    "fluid (elevation excluded).",
    "Heat generated: the pump's whole geometric flow (displacement x pump speed) times the pressure it works "
    "against (outlet plus the flow-control metering drop; the relief setting at full lock) less its inlet "
    "pressure, split into the internal leakage (1 - volumetric efficiency), the flow the flow control "
    "recirculates or the relief passes, and the flow through the circuit (metering orifice, lines, gear and "
    "feed line). With the pump's overall efficiency given, the mechanical losses on top, hydraulic input x "
    "(1/eta - 1) with the mechanical efficiency eta = overall / volumetric efficiency, are added in full; the "
    "leakage is not counted "
    "twice.",
    "Line rejection: inside film (Nu = 3.66 laminar, Gnielinski turbulent, linear in Re between 2000 and "
    "4000), wall conduction ln(do/di)/(2 pi k) and outside film in series; outside, natural convection by "
    "Churchill-Chu (horizontal cylinder) and forced convection by Churchill-Bernstein (cylinder in cross "
    "flow) combined as Nu^3 = Nu_forced^3 + Nu_free^3 (Churchill 1977); surface temperature iterated.",
    "Radiation is not counted: conservative, since a black hose in still air can radiate about as much as "
    "it loses by free convection when the surroundings are cooler (under a hood they often are not).",
    "Air properties from the 1976 standard atmosphere at sea level, offset to the film temperature "
    "(fluids.ATMOSPHERE_1976); air cp 1007 J/(kg K) (from memory).",
    "Each part rejects C (1 - exp(-UA/C)) (T - T_air), C = rho cp Q of the fluid through it (effectiveness-"
    "NTU, air side infinite); fittings and devices are not counted; lines without flow reject nothing.",
    "Reservoir: area x film coefficient x (T - T_air). Cooler 'rating': min(rating, C) x (T - T_air); "
    "cooler 'tube': a plain or finned tube in the air (same film correlations, annular fin efficiency by "
    "Schmidt's approximation, film coefficient of the bare tube on the fins), effectiveness-NTU with the "
    "fluid's capacity rate; the cooler carries the circuit flow.",
    f"Steady temperature: duty-weighted heat generated = duty-weighted heat rejected at one bulk "
    f"temperature, every operating point re-solved at the trial temperature; bracketed regula falsi "
    f"(Illinois) between the air temperature and {STEADY_MAX_C:g} C, to a bracket under {STEADY_TOL_K} K.",
    "Full-lock hold: at full lock no fluid moves outside the pump, so the fluid in the pump (the setting 'Fluid "
    "in the pump') and the part of its body that warms with it ('Pump body heat capacity') take the whole heat "
    "as one lump, with no heat leaving it (conservative): T = T0 + P t / C, the time that matters. Secondary: "
    "the whole fluid volume (the lines plus 'Fluid in pump, gear and reservoir') as one well-mixed lump, rho cp "
    "V, stepped by the "
    "exact solution of the locally linearised balance, with only the reservoir rejecting heat. Both start "
    "from the steady temperature (or the full-lock point's own temperature when there is none).",
    "Cooler advice: the rating (or tube length) that brings the steady temperature down to the fluid "
    "limit less the margin, computed with no cooler fitted.",
]


#: Said when a part sits in its own air (``local_air_temp_c``).
LOCAL_AIR_METHOD = (
    "Parts with their own 'Air temperature around this part' (near an exhaust manifold, turbo or catalyst) exchange "
    "heat with that air, the cooler and the reservoir with the under-hood air; a part in air hotter than the fluid "
    "adds heat to it (a negative rejection), and the steady-temperature bracket starts at the coolest air of any "
    "surface. Radiation from the hot surface is not counted: it would add heat and make the wall hotter.")


@dataclass(frozen=True)
class ThermalSection:
    """``heat`` (per operating point: the result's heat keys) and ``thermal`` (the result's ``thermal``)."""

    heat: tuple
    thermal: dict


def _place_words(path: str) -> str:
    """'part 2 of line 1' for the path ``lines[0].parts[1].wall_mm``."""
    line, part = (int(n) + 1 for n in re.findall(r"\[(\d+)\]", path)[:2])
    return f"part {part} of line {line}"


def lowest_part_limit(job, ratings) -> tuple[float, str] | None:
    """The lowest temperature limit of any rated part (``ratings``: the lines' ratings), in words, or None."""
    best = None
    for ln, rating in zip(job.lines, ratings):
        for p in rating["parts"]:
            if p.get("max_temp_c") is not None and (best is None or p["max_temp_c"] < best[0]):
                best = (p["max_temp_c"], f"{p['label']} of line {ln.index + 1}")
    return best


def _weighted(model: ThermalModel, duty: list, t_c: float, with_cooler: bool = True) -> tuple[float, float, list]:
    heat = rej = 0.0
    parts = []
    for cond, w in duty:
        b = model.balance(cond, t_c, with_cooler=with_cooler)
        heat += w * b["heat_w"]
        rej += w * b["rejection"]["total_w"]
        parts.append(b)
    return heat, rej, parts


def _full_lock_condition(conds) -> tuple[dict, str]:
    for c in conds:
        if c["full_lock"]:
            return c, f"the operating point {said(c['name'])}"
    idle = min(conds, key=lambda c: c["engine_rpm"])
    return dict(idle, full_lock=True, name=idle["name"] + " (at full lock)"), \
        f"the slowest operating point {said(idle['name'])} with the wheel at full lock (no full-lock point given)"


def _rating_needed(caps: list, dt: float, deficit: float) -> float:
    """Smallest cooler rating [W/K] that rejects ``deficit`` duty-weighted (bisection)."""
    def rated(x):
        return sum(w * min(x, c) for w, c in caps) * dt - deficit

    lo, hi = 0.0, max(c for _, c in caps)
    for _ in range(60):
        mid = 0.5 * (lo + hi)
        lo, hi = (mid, hi) if rated(mid) < 0.0 else (lo, mid)
    return hi


def _tube_needed(caps: list, uam: list, dt: float, deficit: float) -> float | None:
    """Length [m] of the cooler tube that rejects ``deficit`` duty-weighted; None beyond 100 m."""
    def tubed(length):
        return sum(w * c * (1.0 - math.exp(-u * length / c)) for (w, c), u in zip(caps, uam) if c > 0) * dt \
            - deficit

    if tubed(100.0) < 0.0:
        return None
    lo, hi = 0.0, 100.0
    for _ in range(50):
        mid = 0.5 * (lo + hi)
        lo, hi = (mid, hi) if tubed(mid) < 0.0 else (lo, mid)
    return hi


def _cooler_needed(model: ThermalModel, duty: list, target_c: float) -> dict:
    """Cooler rating and tube length that hold the steady temperature at ``target_c`` (no cooler fitted)."""
    ta = model.t_air_c
    dt = target_c - ta
    heat, rej, parts = _weighted(model, duty, target_c, with_cooler=False)
    deficit = heat - rej
    out = {"w_per_k": 0.0, "tube_m": 0.0, "deficit_w": deficit, "possible": True, "message": ""}
    if deficit <= 0.0:
        out["message"] = (f"no cooler needed: the lines and reservoir alone hold the fluid at or under "
                          f"{target_c:.0f} C")
        return out
    if dt <= 0.0:
        out.update(w_per_k=None, tube_m=None, possible=False,
                   message=f"no cooler can help: the air ({ta:.0f} C) is not cooler than the target "
                           f"{target_c:.0f} C")
        return out
    st = model.circuit.state(target_c)
    caps = [(w, st.rho_kg_m3 * st.cp_j_kgk * b["circuit_flow_m3_s"]) for (_, w), b in zip(duty, parts)]
    ceiling = sum(w * c for w, c in caps) * dt
    if ceiling <= deficit:
        out.update(w_per_k=None, tube_m=None, possible=False,
                   message=f"no cooler in the return path can hold {target_c:.0f} C: even a perfect one would "
                           f"reject {ceiling:.0f} W of the {deficit:.0f} W needed (too little flow through it)")
        return out
    out["w_per_k"] = hi = _rating_needed(caps, dt, deficit)
    # the same duty as a length of the chosen (or default) cooler tube
    uam = [model.cooler_tube_ua_per_m(target_c, b["circuit_flow_m3_s"], cond["air_speed_m_s"], st)
           if b["circuit_flow_m3_s"] > 0 else 0.0 for (cond, _), b in zip(duty, parts)]
    out["tube_m"] = length = _tube_needed(caps, uam, dt, deficit)
    if length is None:
        out["message"] = (f"a cooler of at least {hi:.1f} W/K is needed; more than 100 m of the chosen tube "
                          "would be needed, so use a finned or packaged cooler")
    else:
        out["message"] = (f"a cooler of at least {hi:.1f} W/K is needed to hold {target_c:.0f} C, "
                          f"or about {length:.2f} m of the chosen cooler tube")
    return out


def _condition_heat(model: ThermalModel, job_conds, conditions) -> list[dict]:
    out = []
    for cond, op in zip(job_conds, conditions):
        b = model.balance(cond, op["fluid_temp_c"], op=op, detail=True)
        out.append({"heat_w": b["heat_w"], "heat_hydraulic_w": b["heat_hydraulic_w"],
                    "heat_pump_loss_w": b["heat_pump_loss_w"], "heat_detail": b["heat_detail"],
                    "heat_rejected_w": b["rejection"]["total_w"], "heat_rejected_detail": b["rejection"]})
    return out


def _steady(model: ThermalModel, duty: list, limits: dict, out: dict, checks: list) -> float | None:
    """Solve the steady temperature into ``out`` and its check into ``checks``; returns it."""
    ta, limit, target, margin, basis = (limits[k] for k in ("air", "limit", "target", "margin", "basis"))
    if not duty:
        out["steady"] = {"status": "no duty cycle", "message": "no duty cycle given (every operating point's share "
                         "of time is 0): give each its share of time to get a steady temperature"}
        checks.append(check("steady temperature", "caution", out["steady"]["message"]))
        return None
    # from the coolest air any surface sits in: below it every surface adds heat, so the net heat there is
    # positive whatever parts sit in hotter air (they only add more)
    res = solve_steady(lambda t: (lambda h, r, _: h - r)(*_weighted(model, duty, t)), model.t_air_min_c,
                       STEADY_MAX_C)
    out["steady"] = res
    steady = res["temp_c"]
    if res["status"] not in ("converged", "no heat"):
        checks.append(check("steady temperature", "fail", res["message"]
                            + ("; fit a cooler or cut the heat load" if res["status"] == "none below" else "")))
        return steady
    heat, rej, parts = _weighted(model, duty, steady)
    out["steady_heat_w"] = heat
    out["steady_rejected_w"] = rej
    out["steady_duty"] = [{"name": c["name"], "duty_percent": w * 100.0, "heat_w": b["heat_w"],
                           "heat_rejected_w": b["rejection"]["total_w"], "lines_w": b["rejection"]["lines_w"],
                           "reservoir_w": b["rejection"]["reservoir_w"], "cooler_w": b["rejection"]["cooler_w"]}
                          for (c, w), b in zip(duty, parts)]
    if steady > limit:
        checks.append(check("steady temperature", "fail", f"fit a cooler or cut the heat load: the fluid settles "
                                                          f"near {steady:.0f} C, above {basis}"))
    elif steady > target:
        checks.append(check("steady temperature", "caution", f"the fluid settles near {steady:.0f} C, within "
                                                             f"{margin:.0f} K of {basis}; a cooler is advised"))
    else:
        checks.append(check("steady temperature", "ok", f"the fluid settles near {steady:.0f} C with {ta:.0f} C air, "
                                                        f"at least {margin:.0f} K under {basis}"))
    return steady


def _bulk_rejection(model: ThermalModel, fl_cond, q_fl: float):
    """Heat the whole fluid rejects at full lock, as a function of its temperature."""
    if q_fl <= 0.0:  # no flow in the lines or a cooler: only the reservoir rejects, linear in T (fast path)
        ua_res = model.th["reservoir_area_m2"] * model.th["reservoir_h_w_m2k"]
        return lambda t: ua_res * (t - model.t_air_c)
    return lambda t: model.rejection(t, q_fl, fl_cond["air_speed_m_s"])["total_w"]


def _pump_lump(model: ThermalModel, t0: float, power: float, limit: float) -> dict:
    """The fluid in the pump with the part of its body that warms with it: one lump that takes the whole
    full-lock heat, since no fluid moves outside the pump (``calc.physics.lumped.adiabatic_warmup``)."""
    st = model.circuit.state(t0)
    cap = st.rho_kg_m3 * st.cp_j_kgk * model.th["pump_volume_l"] * 1e-3 + model.th["pump_heat_capacity_j_k"]
    return {"cap": cap, "seconds": seconds_to_reach(t0, limit, power, cap), "rate": power / cap}


def _full_lock_curve(t0, power, pump_cap, bulk_curve) -> list[dict]:
    return [{"t_s": p["t_s"], "pump_temp_c": adiabatic_warmup(t0, power, pump_cap, p["t_s"]),
             "bulk_temp_c": p["temp_c"]} for p in bulk_curve]


def _full_lock_check(start_from, t0, power, pump, bulk_wu, model, limit) -> dict:
    vol = model.volume_m3 * 1e3
    if pump["seconds"] is None:
        return check("full-lock hold", "ok", f"starting from {start_from} ({t0:.0f} C), the fluid in the pump does "
                                             f"not reach its limit {limit:.0f} C at full lock (no heat)")
    caution = "do not hold the wheel at full lock for more than a few seconds (common practice)"
    if pump["seconds"] <= 0.0:
        return check("full-lock hold", "caution", f"{caution}: the fluid already starts at {t0:.0f} C ({start_from}), "
                                                  f"at or above its limit {limit:.0f} C, and heats at "
                                                  f"{pump['rate']:.1f} K/s in the pump at full lock ({power:.0f} W)")
    bulk = bulk_wu["seconds_to_limit"]
    bulk_text = (f"mixed through all {vol:.2f} L it would take {bulk:.0f} s" if bulk is not None else
                 f"mixed through all {vol:.2f} L {bulk_wu['message'].replace('the fluid ', 'it ', 1)}")
    return check("full-lock hold", "caution",
                 f"{caution}: starting from "
                 f"{start_from} ({t0:.0f} C), the fluid in the pump reaches its limit {limit:.0f} C after "
                 f"{pump['seconds']:.0f} s ({power:.0f} W into {model.th['pump_volume_l']:.2f} L and the pump body, "
                 f"{pump['rate']:.1f} K/s); {bulk_text}")


def _full_lock(model: ThermalModel, job_conds, steady, limit: float, out: dict, checks: list) -> None:
    circuit = model.circuit
    fl_cond, fl_from = _full_lock_condition(job_conds)
    t0 = steady if steady is not None else fl_cond["fluid_temp_c"]
    start_from = "the steady temperature" if steady is not None else f"the temperature of {fl_from}"
    op = circuit.operating_point(fl_cond, t_c=t0, detail=False)
    power = sum(model.heat(op))
    cap = circuit.state(t0).rho_kg_m3 * model.volume_m3 * circuit.fluid["specific_heat_j_kgk"]
    pump = _pump_lump(model, t0, power, limit)
    stop = limit + CURVE_OVER_LIMIT_K
    span = model.th["full_lock_hold_s"] if pump["seconds"] is None else min(
        model.th["full_lock_hold_s"], seconds_to_reach(t0, stop, power, pump["cap"]) or 0.0) or 1.0
    bulk = warmup(t0, power, _bulk_rejection(model, fl_cond, op["circuit_flow_lpm"] * LPM), cap, limit, span,
                  curve_stop_c=None) if cap > 0.0 else {"curve": [], "seconds_to_limit": None, "levels_off_c": None,
                                                        "message": "no fluid volume listed outside the pump"}
    out["full_lock"] = {"condition": fl_from, "start_temp_c": t0, "start_from": start_from, "heat_w": power,
                        "pump_volume_l": model.th["pump_volume_l"], "pump_heat_capacity_j_k": pump["cap"],
                        "pump_rate_k_s": pump["rate"], "volume_l": model.volume_m3 * 1e3, "heat_capacity_j_k": cap,
                        "bulk_seconds_to_limit": bulk["seconds_to_limit"], "levels_off_c": bulk["levels_off_c"],
                        "message": bulk["message"]}
    out["full_lock_seconds_to_limit"] = pump["seconds"]
    out["full_lock_curve"] = _full_lock_curve(t0, power, pump["cap"], bulk["curve"])
    checks.append(_full_lock_check(start_from, t0, power, pump, bulk, model, limit))


def _cooler_advice(model: ThermalModel, duty: list, target: float, steady, out: dict, checks: list) -> None:
    if duty:
        need = _cooler_needed(model, duty, target)
    else:
        need = {"w_per_k": None, "tube_m": None, "possible": None, "message": "no cooler advice without a duty cycle"}
    out["cooler_needed_w_per_k"] = need["w_per_k"]
    out["cooler_needed_tube_m"] = need["tube_m"]
    c = model.cooler
    out["cooler_tube"] = {"od_mm": c["tube_od_mm"], "wall_mm": c["tube_wall_mm"],
                          "fins_per_inch": c["fins_per_inch"], "fin_od_mm": c["fin_od_mm"]}
    msg = need["message"]
    if need["w_per_k"]:
        if c["type"] == "rating":
            msg += f"; the cooler given is {c['w_per_k']:.1f} W/K"
        elif c["type"] == "tube":
            msg += f"; the cooler given is {c['tube_length_m']:.2f} m of that tube"
    out["cooler_message"] = msg
    if need["possible"] is None:  # no duty cycle
        verdict = "caution"
    elif not need["possible"]:
        verdict = "fail"
    elif need["w_per_k"] == 0.0:
        verdict = "ok"
    else:  # a cooler is needed: fine if the one fitted already holds the target
        verdict = "ok" if c["type"] != "none" and steady is not None and steady <= target else "caution"
    checks.append(check("cooler", verdict, msg))
    for ln in model.circuit.lines:
        for k, p in enumerate(ln.parts):
            if p["kind"] == "device" and p.get("is_cooler") and c["type"] == "none":
                checks.append(check("cooler", "caution", f"part {p.place + 1} of line {ln.index + 1} is marked as a "
                                                         "cooler, but the cooler settings give no rating or tube: "
                                                         "its heat rejection is not counted"))


def _limits(job, model: ThermalModel, part_limit) -> dict:
    limit = job.fluid["max_temp_c"]
    basis = f"the fluid's limit {limit:.0f} C"
    if part_limit is not None and part_limit[0] < limit:
        limit = part_limit[0]
        basis = f"the limit {limit:.0f} C of {part_limit[1]}, the lowest of the circuit's parts"
    margin = model.th["limit_margin_c"]
    return {"limit": limit, "basis": basis, "margin": margin, "target": limit - margin, "air": model.t_air_c}


def _steady_part_check(job, ratings, conditions, steady) -> list:
    """Each rated part's limit against the steady temperature, where the fluid settles hotter than every
    operating point's own temperature (the lines' checks judged those)."""
    if steady is None or not conditions or steady <= max(c["fluid_temp_c"] for c in conditions):
        return []
    over = [f"{p['label']} of line {ln.index + 1} ({p['max_temp_c']:g} C)" for ln, rating in zip(job.lines, ratings)
            for p in rating["parts"] if p.get("max_temp_c") is not None and p["max_temp_c"] < steady]
    if not over:
        return []
    return [check("part limits", "fail", f"add or enlarge a cooler, or use parts rated hotter: the fluid settles at "
                                         f"{steady:.0f} C for this duty cycle, above the limit of " + ", ".join(over))]


def thermal_stage(job, circuit, ratings) -> ThermalSection:
    """Heat per operating point, steady temperature, full-lock hold and cooler advice.

    Never raises on a prepared job: a solve that fails is reported in the result.

    Parameters
    ----------
    job : calc.model.prepared.PreparedJob
    circuit : calc.stages.circuit.CircuitSection
    ratings : sequence of dict
        Each line's rating (``calc.stages.lines.LinesSection.ratings``): its parts' temperature limits.

    Returns
    -------
    ThermalSection
    """
    model = ThermalModel(circuit.model)
    job_conds = job.conditions
    lim = _limits(job, model, lowest_part_limit(job, ratings))
    heat = _condition_heat(model, job_conds, circuit.conditions)
    checks = []
    out = {"limit_c": lim["limit"], "limit_basis": lim["basis"], "target_c": lim["target"],
           "margin_c": lim["margin"], "air_temp_c": lim["air"], "method": list(METHOD),
           "hose_wall_defaulted": list(model.notes)}
    out["method"].append(WALL_METHOD)
    if any(s["local"] is not None for s in model.surfaces):
        out["method"].append(LOCAL_AIR_METHOD)
    if model.notes:
        out["method"].append("Hose walls not given (" + ", ".join(_place_words(p) for p in model.notes) + ") use a "
                             "typical wall for the bore (from memory, braided hydraulic hose); give the hose wall "
                             "thickness from the datasheet.")
    duty = [(c, c["duty_percent"] / 100.0) for c in job_conds if c["duty_percent"] > 0.0]
    steady = _steady(model, duty, lim, out, checks)
    out["steady_temp_c"] = steady
    _full_lock(model, job_conds, steady, lim["limit"], out, checks)
    _cooler_advice(model, duty, lim["target"], steady, out, checks)
    checks.extend(_steady_part_check(job, ratings, circuit.conditions, steady))
    out["checks"] = checks
    verdict = worst_verdict(checks)
    out["verdict"] = verdict
    out["message"] = checks[0]["message"] if verdict == "ok" else next(c for c in checks if c["verdict"] == verdict)[
        "message"]
    return ThermalSection(tuple(heat), out)
