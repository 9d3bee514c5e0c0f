"""Circuit stage: every operating point solved, with the hydraulic checks of each line.

Checks per line: the velocity band of the line's role (common practice), the laminar-turbulent
band (flagged), and the pump inlet (the last feed line: a starved pump fails). Checks of the
circuit: the relief setting against the pressure the circuit needs at neutral (a fail at a warm
operating point, a caution at cold start), and the gear valve's drop where it is an estimate.
Warnings: inputs outside the validity range of a method.
"""
from __future__ import annotations

import math
from dataclasses import dataclass

from ..data.practice import COLD_START_MAX_C, INLET_MIN_BAR, VELOCITY_BANDS_M_S
from ..physics.valve import ORIFICE_K1
from ..model.result import check
from ..model.schema import Problem
from ..system.circuit import LPM, Circuit
from ..system.naming import larger_size_advice, part_ref

__all__ = ["CircuitSection", "circuit_stage", "circuit_checks", "pump_curve", "largest_drops", "PUMP_CURVE_POINTS"]

#: A gear valve drop more than this far below its measured temperature is flagged as an estimate, K
#: (a stated choice).
GEAR_ESTIMATE_K = 20.0
#: Points of the delivered-flow curve for the page's plot (a display choice).
PUMP_CURVE_POINTS = 40


@dataclass(frozen=True)
class CircuitSection:
    """``model`` (the compiled circuit, for later stages to re-solve), ``conditions`` (one solved
    operating point per job condition), per-line ``checks`` and ``largest_drops`` (``{bar, at}``),
    ``circuit_checks`` (pump, relief and gear), ``validity_warnings`` and the ``pump_curve``."""

    model: Circuit
    conditions: tuple
    checks: tuple
    largest_drops: tuple
    circuit_checks: tuple
    validity_warnings: tuple
    pump_curve: dict


def _fastest(ln, conditions) -> tuple[dict, int, float]:
    """The operating point, the place in the line and the velocity of the line's fastest part."""
    best = None
    for c in conditions:
        for row in c["lines"][ln.index].get("parts", ()):
            if row["kind"] != "device" and (best is None or row["velocity_m_s"] > best[2]):
                best = (c, row["index"], row["velocity_m_s"])
    return best


def _velocity_check(ln, conditions) -> dict:
    lo, hi = VELOCITY_BANDS_M_S[ln.role]
    band = f"{lo:g}-{hi:g} m/s for a {ln.role} line (common practice)"
    fastest = _fastest(ln, conditions)
    if fastest is None or fastest[2] <= hi:
        v, at = (0.0, conditions[0]) if fastest is None else (fastest[2], fastest[0])
        return check("velocity", "ok", f"velocity at most {v:.1f} m/s ('{at['name']}'), within {band}")
    cond, k, v = fastest
    part = ln.parts[k]
    d_min = math.sqrt(4.0 * cond["lines"][ln.index]["flow_lpm"] * LPM / (math.pi * hi)) * 1e3
    said = (f"use {larger_size_advice(part, d_min)} to keep it under {hi:g} m/s: {part_ref(part)} is the fastest "
            f"part at {v:.1f} m/s ('{cond['name']}')")
    if v > 1.5 * hi:
        return check("velocity", "fail", f"{said}, far above the band of {band}")
    return check("velocity", "caution", f"{said}, above the band of {band}")


def _inlet_check(conditions) -> dict:
    starved = [c for c in conditions if c["pump_starved"]]
    if starved:
        worst = min(starved, key=lambda c: c["circuit_flow_lpm"] / max(c["demand_flow_lpm"], 1e-12))
        return check("pump inlet", "fail",
                     f"the pump is starved: use a larger or shorter feed line, or raise the reservoir. At "
                     f"'{worst['name']}' the feed line passes only {worst['circuit_flow_lpm']:.2f} of the "
                     f"{worst['demand_flow_lpm']:.2f} L/min the pump draws before its inlet falls to "
                     f"{INLET_MIN_BAR} bar, where the fluid aerates and the pump cavitates (common practice); the "
                     f"circuit gets only that flow" + (f" (starved also at {', '.join(repr(c['name']) for c in starved if c is not worst)})"
                                                       if len(starved) > 1 else ""))
    low = min(conditions, key=lambda c: c["pump_inlet_bar"])
    return check("pump inlet", "ok", f"pump inlet at least {low['pump_inlet_bar']:.2f} bar gauge ('{low['name']}'), "
                                     f"above {INLET_MIN_BAR} bar")


def hydraulic_checks(circuit: Circuit, conditions) -> list[list[dict]]:
    """Velocity-band, regime and pump-inlet checks per line over all operating points."""
    out = []
    for ln in circuit.lines:
        checks = [_velocity_check(ln, conditions)]
        trans = [c["name"] for c in conditions if c["lines"][ln.index]["transitional"]]
        if trans:
            checks.append(check("regime", "ok", "flagged: flow in the laminar-turbulent band (Re 2000-4000) at "
                                + ", ".join(f"'{n}'" for n in trans) + "; friction interpolated between the "
                                "laminar and Colebrook values there, so those drops are less certain"))
        if ln.role == "feed" and ln is circuit.by_role["feed"][-1]:
            checks.append(_inlet_check(conditions))
        out.append(checks)
    return out


def validity_warnings(circuit: Circuit, conditions) -> list[Problem]:
    """Inputs outside the validity range of a method: warnings, not errors."""
    out = []
    for ln in circuit.lines:
        for s in ln.segs:
            path = f"lines[{ln.index}].parts[{s.index}]"
            if s.d_m and s.eps_m / s.d_m > 0.05:
                out.append(Problem(f"{path}.roughness_mm", "relative roughness above 0.05, beyond the range "
                                                            "Colebrook's equation was fitted to"))
            for k, (_, rc) in enumerate(s.bends):
                if rc / s.d_m < 1.0:
                    out.append(Problem(f"{path}.bends[{k}].radius_mm", "bend radius under one bore: beyond the "
                                                                       "range of the rounded-bend method"))
    for i, c in enumerate(conditions):
        if c["viscosity_cst"] < 2.0:
            out.append(Problem(f"conditions[{i}].fluid_temp_c", f"viscosity {c['viscosity_cst']:.2f} cSt is "
                                                                "under 2 cSt, where ASTM D341 is least certain"))
        if not -40.0 <= c["fluid_temp_c"] <= 150.0:
            out.append(Problem(f"conditions[{i}].fluid_temp_c", "far outside the 40-100 C datasheet points: "
                                                                "the viscosity is an extrapolation"))
    return out


def _relief_check(job, conditions) -> dict:
    relief = job.pump["relief_bar"]
    running = [c for c in conditions if not c["full_lock"]]
    over = [c for c in running if c["circuit_need_bar"] > relief]
    warm = [c for c in over if c["fluid_temp_c"] > COLD_START_MAX_C]
    if warm or over:
        c = max(warm or over, key=lambda x: x["circuit_need_bar"])
        said = (f"at '{c['name']}' ({c['fluid_temp_c']:g} C) the circuit needs {c['circuit_need_bar']:.1f} bar at "
                f"neutral to pass the pump's {c['pump_flow_lpm']:.2f} L/min, above the {relief:g} bar relief setting, "
                + (f"so the relief opens, and the starved pump gives the gear only {c['circuit_flow_lpm']:.2f} L/min "
                   "(see the feed line)" if c["pump_starved"] else
                   f"so the relief opens and the gear gets only {c['circuit_flow_lpm']:.2f} L/min"))
        if warm:
            return check("relief setting", "fail", f"raise the relief setting or cut the circuit's drop: {said}")
        return check("relief setting", "caution", f"{said} until the fluid warms: the relief cracks open at cold start")
    if not running:
        return check("relief setting", "ok", "no operating point at neutral to compare with the relief setting")
    c = max(running, key=lambda x: x["circuit_need_bar"])
    return check("relief setting", "ok", f"the circuit needs at most {c['circuit_need_bar']:.1f} bar at neutral "
                                         f"('{c['name']}'), under the {relief:g} bar relief setting")


def _gear_check(job, conditions) -> list[dict]:
    gear = job.gear
    if gear["cold_drop_bar"] is not None:
        return []
    cold = [c for c in conditions if not c["full_lock"] and c["fluid_temp_c"] < gear["at_temp_c"] - GEAR_ESTIMATE_K]
    if not cold:
        return []
    c = min(cold, key=lambda x: x["fluid_temp_c"])
    return [check("gear valve", "ok", f"flagged: the valve's drop at neutral at '{c['name']}' ({c['fluid_temp_c']:g} C, "
                                      f"{c['gear_drop_bar']:.1f} bar) is an estimate from the one point measured at "
                                      f"{gear['at_temp_c']:g} C, an orifice whose laminar constant (K1 = "
                                      f"{ORIFICE_K1:g}) is from memory; measure the drop cold and give it as the "
                                      "second measured point")]


def circuit_checks(job, conditions) -> list[dict]:
    """The pump's and the gear's checks: the relief setting against the circuit's need, the valve estimate."""
    return [_relief_check(job, conditions)] + _gear_check(job, conditions)


def largest_drops(circuit: Circuit, conditions) -> list[dict]:
    """Per line: its largest pressure drop over the operating points, and where it occurs."""
    out = []
    for ln in circuit.lines:
        worst = max(conditions, key=lambda c: c["lines"][ln.index]["pressure_drop_bar"])
        out.append({"bar": worst["lines"][ln.index]["pressure_drop_bar"], "at": worst["name"]})
    return out


def pump_curve(circuit: Circuit, conditions) -> dict:
    """Delivered flow from 0 to 1.1 x the fastest operating point (at least 3000 rpm), for the plot."""
    rpm_max = math.floor(max([3000.0] + [c["engine_rpm"] for c in conditions]) * 1.1 + 0.5)
    points = []
    for i in range(PUMP_CURVE_POINTS + 1):
        rpm = rpm_max * i / PUMP_CURVE_POINTS
        points.append({"engine_rpm": rpm, "delivered_lpm": circuit.pump_flow(rpm)[0] / LPM})
    return {"flow_limit_lpm": circuit.pump["flow_limit_lpm"], "points": points}


def circuit_stage(job, ports) -> CircuitSection:
    """Solve every operating point of the prepared job on the lines as the ports stage built them.

    Parameters
    ----------
    job : calc.model.prepared.PreparedJob
    ports : calc.stages.ports.PortsSection

    Returns
    -------
    CircuitSection
    """
    circuit = Circuit(job, ports.built_parts)
    conditions = tuple(circuit.operating_point(c) for c in job.conditions)
    return CircuitSection(circuit, conditions, tuple(hydraulic_checks(circuit, conditions)),
                          tuple(largest_drops(circuit, conditions)), tuple(circuit_checks(job, conditions)),
                          tuple(validity_warnings(circuit, conditions)), pump_curve(circuit, job.conditions))
