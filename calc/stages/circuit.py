"""Circuit stage: every operating point solved, with the hydraulic checks of each line.

Checks: the velocity band of the line's role (common practice), the laminar-turbulent band
(flagged), and the pump inlet pressure (the last feed line). Warnings: inputs outside the
validity range of a method, and operating points where the relief opens at neutral.
"""
from __future__ import annotations

import math
from dataclasses import dataclass

from ..data.practice import INLET_MIN_BAR, VELOCITY_BANDS_M_S
from ..model.result import check
from ..model.schema import Problem
from ..physics.sizes import SIXTEENTH_MM
from ..system.circuit import LPM, Circuit

__all__ = ["CircuitSection", "circuit_stage", "pump_curve", "largest_drops", "PUMP_CURVE_POINTS"]

#: Points of the delivered-flow curve for the page's plot (a display choice).
PUMP_CURVE_POINTS = 40


@dataclass(frozen=True)
class CircuitSection:
    """``model`` (the compiled circuit, for later stages to re-solve), ``conditions`` (one solved
    operating point per job condition), per-line ``checks`` and ``largest_drops`` (``{bar, at}``),
    ``validity_warnings``, ``relief_warnings`` and the ``pump_curve``."""

    model: Circuit
    conditions: tuple
    checks: tuple
    largest_drops: tuple
    validity_warnings: tuple
    relief_warnings: tuple
    pump_curve: dict


def _bore_advice(q_m3_s: float, v_max_m_s: float) -> str:
    """'-8 or a larger bore (at least 11.3 mm)': the smallest dash size under ``v_max`` at ``q``."""
    d_mm = math.sqrt(4.0 * q_m3_s / (math.pi * v_max_m_s)) * 1e3
    dash = max(2, math.ceil(d_mm / SIXTEENTH_MM - 1e-9))
    return f"-{dash} or a larger bore (at least {d_mm:.1f} mm)"


def _velocity_check(ln, conditions) -> dict:
    j = ln.index
    lo, hi = VELOCITY_BANDS_M_S[ln.role]
    worst = max(conditions, key=lambda c: c["lines"][j]["velocity_max_m_s"])
    v = worst["lines"][j]["velocity_max_m_s"]
    band = f"{lo:g}-{hi:g} m/s for a {ln.role} line (common practice)"
    fix = _bore_advice(worst["lines"][j]["flow_lpm"] * LPM, hi)
    if v > 1.5 * hi:
        return check("velocity", "fail", f"use {fix}: velocity {v:.1f} m/s at '{worst['name']}' is far above {band}")
    if v > hi:
        return check("velocity", "caution", f"consider {fix}: velocity {v:.1f} m/s at '{worst['name']}' exceeds "
                                            f"{band}")
    return check("velocity", "ok", f"velocity at most {v:.1f} m/s ('{worst['name']}'), within {band}")


def _inlet_check(conditions) -> dict:
    low = min(conditions, key=lambda c: c["pump_inlet_bar"])
    pin = low["pump_inlet_bar"]
    if pin < INLET_MIN_BAR:
        return check("pump inlet", "fail",
                     f"use a larger or shorter feed line, or raise the reservoir: pump inlet "
                     f"{pin:.2f} bar gauge at '{low['name']}' is below {INLET_MIN_BAR} bar, "
                     "where the fluid aerates and the pump cavitates (common practice)")
    return check("pump inlet", "ok", f"pump inlet at least {pin:.2f} bar gauge ('{low['name']}'), above "
                                     f"{INLET_MIN_BAR} bar")


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


def relief_warnings(conditions) -> list[Problem]:
    """Operating points where the circuit drop at neutral reaches the relief setting."""
    return [Problem("conditions", f"at '{c['name']}' the circuit drop at neutral reaches the relief setting: the "
                                  "relief is open and the lines carry only part of the pump's flow")
            for c in conditions if c["relief_open"] and not c["full_lock"]]


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
                          tuple(largest_drops(circuit, conditions)), tuple(validity_warnings(circuit, conditions)),
                          tuple(relief_warnings(conditions)), pump_curve(circuit, job.conditions))
