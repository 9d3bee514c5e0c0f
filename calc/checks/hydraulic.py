"""Hydraulic checks of a line: velocity band, laminar-turbulent band, pump inlet, pressure-drop budget."""
from __future__ import annotations

import math

from ..data.practice import COLD_START_MAX_C, DP_BUDGET_BAR, INLET_MIN_BAR, VELOCITY_BANDS_M_S
from ..model.result import check
from ..system.circuit import LPM
from ..system.naming import larger_size_advice, part_ref
from .case import LineCase, fix, label_for, part_path, said

__all__ = ["velocity_check", "regime_check", "inlet_check", "budget_check", "budgets"]


def _fastest(case: LineCase):
    best = None
    for c, res in zip(case.conditions, case.results):
        for row in res.get("parts", ()):
            if row["kind"] != "device" and (best is None or row["velocity_m_s"] > best[2]):
                best = (c, res, row["velocity_m_s"], row["index"])
    return best


def velocity_check(case: LineCase) -> dict:
    """The fastest part against the velocity band of the line's role (common practice)."""
    lo, hi = VELOCITY_BANDS_M_S[case.role]
    band = f"{lo:g}-{hi:g} m/s for a {case.role} line (common practice)"
    fastest = _fastest(case)
    if fastest is None or fastest[2] <= hi:
        v, at = (0.0, case.conditions[0]) if fastest is None else (fastest[2], fastest[0])
        return check("velocity", "ok", f"velocity at most {v:.1f} m/s ({said(at['name'])}), within {band}")
    cond, res, v, k = fastest
    part = case.parts[k]
    d_min = math.sqrt(4.0 * res["flow_lpm"] * LPM / (math.pi * hi)) * 1e3
    words, key, value = larger_size_advice(part, d_min)
    out = check("velocity", "fail" if v > 1.5 * hi else "caution",
                f"use {words} to keep it under {hi:g} m/s: {part_ref(part)} is the fastest part at {v:.1f} m/s "
                f"({said(cond['name'])}), {'far ' if v > 1.5 * hi else ''}above the band of {band}")
    if part["kind"] == "hose":  # a new hose size re-sizes its ends and bend radii: a candidate's edits do that
        out["message"] += "; the hose candidates re-size its ends with it"
    elif key is not None and part.place is not None:
        out["fix"] = fix(part_path(case, part.place, key), value, label_for(part["kind"], key,
                                                                           f"part {part.place + 1}"))
    return out


def regime_check(case: LineCase) -> dict | None:
    """Flags the operating points whose flow is in the laminar-turbulent band (an ok check)."""
    trans = [c["name"] for c, r in zip(case.conditions, case.results) if r["transitional"]]
    if not trans:
        return None
    return check("regime", "ok", "flagged: flow in the laminar-turbulent band (Re 2000-4000) at "
                 + ", ".join(said(n) for n in trans) + "; friction interpolated between the laminar and Colebrook "
                 "values there, so those drops are less certain")


def inlet_check(case: LineCase) -> dict | None:
    """The pump inlet, on the last feed line: a starved pump fails."""
    if not case.last_feed:
        return None
    starved = [c for c in case.conditions if c["pump_starved"]]
    if starved:
        worst = min(starved, key=lambda c: c["circuit_flow_lpm"] / max(c["demand_flow_lpm"], 1e-12))
        also = [said(c["name"]) for c in starved if c is not worst]
        return check("pump inlet", "fail",
                     f"the pump is starved: use a larger or shorter feed line, or raise the reservoir. At "
                     f"{said(worst['name'])} the feed line passes only {worst['circuit_flow_lpm']:.2f} of the "
                     f"{worst['demand_flow_lpm']:.2f} L/min the pump draws before its inlet falls to "
                     f"{INLET_MIN_BAR} bar, where the fluid aerates and the pump cavitates (common practice); the "
                     "circuit gets only that flow" + (f" (starved also at {', '.join(also)})" if also else ""))
    low = min(case.conditions, key=lambda c: c["pump_inlet_bar"])
    return check("pump inlet", "ok", f"pump inlet at least {low['pump_inlet_bar']:.2f} bar gauge "
                                     f"({said(low['name'])}), above {INLET_MIN_BAR} bar")


def budgets(role: str, spec) -> tuple:
    """The line's pressure-drop budgets (warm, cold start), [bar]: its own or its role's default."""
    warm, cold = DP_BUDGET_BAR[role]
    return (spec.get("dp_budget_bar") if spec.get("dp_budget_bar") is not None else warm,
            spec.get("dp_budget_cold_bar") if spec.get("dp_budget_cold_bar") is not None else cold)


def _over(case: LineCase, warm: float | None, cold: float | None) -> list:
    over = []
    for c, r in zip(case.conditions, case.results):
        is_cold = c["fluid_temp_c"] <= COLD_START_MAX_C
        budget = cold if is_cold else warm
        if budget is not None and r["pressure_drop_bar"] > budget:
            over.append((c, r["pressure_drop_bar"], budget, is_cold))
    return over


def budget_check(case: LineCase) -> dict | None:
    """The line's largest drop at warm points and at cold start against its budgets."""
    warm, cold = budgets(case.role, case.spec)
    if warm is None and cold is None:
        return None
    over = _over(case, warm, cold)
    if over:
        c, dp, budget, is_cold = max(over, key=lambda o: o[1] / o[2])
        return check("pressure drop", "fail",
                     f"use a larger bore or a shorter line (see the hose candidates): the line drops {dp:.1f} bar at "
                     f"{said(c['name'])}, over its {budget:g} bar budget {'at cold start' if is_cold else 'when warm'}"
                     " (common practice unless you set the budget)")
    worst = max(zip(case.conditions, case.results), key=lambda cr: cr[1]["pressure_drop_bar"])
    limits = [f"{b:g} bar {w}" for b, w in ((warm, "warm"), (cold, "at cold start")) if b is not None]
    noun = "budgets" if len(limits) > 1 else "budget"
    return check("pressure drop", "ok", f"the largest drop, {worst[1]['pressure_drop_bar']:.1f} bar at "
                                        f"{said(worst[0]['name'])}, is within the {noun} ({', '.join(limits)})")
