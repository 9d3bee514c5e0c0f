"""Circuit stage: every operating point solved on the lines as built.

Checks of the circuit: the relief setting against the pressure the circuit needs at neutral (a
fail at a warm operating point, a caution at cold start), and the gear valve's drop where it is an
estimate. The lines' own checks read these operating points (``calc.checks``). Warnings: inputs
outside the validity range of a method.
"""
from __future__ import annotations

import math
from dataclasses import dataclass

from ..checks.case import fix, said
from ..data.practice import COLD_START_MAX_C
from ..model.job import field_label
from ..model.result import check
from ..model.schema import Problem
from ..physics.valve import ORIFICE_K1
from ..system.circuit import LPM, Circuit

__all__ = ["CircuitSection", "circuit_stage", "circuit_checks", "pump_curve", "largest_drops", "PUMP_CURVE_POINTS"]

#: A gear valve drop more than this far below its measured temperature is flagged as an estimate, K
#: (a stated choice).
GEAR_ESTIMATE_K = 20.0
#: A relief setting the engine proposes is the circuit's need rounded up to this step, bar (a stated choice).
RELIEF_STEP_BAR = 5.0
#: Points of the delivered-flow curve for the page's plot (a display choice).
PUMP_CURVE_POINTS = 40


@dataclass(frozen=True)
class CircuitSection:
    """``model`` (the compiled circuit, for later stages to re-solve), ``conditions`` (one solved
    operating point per job condition), per line ``largest_drops`` (``{bar, at}``),
    ``circuit_checks`` (pump, relief and gear), ``validity_warnings`` and the ``pump_curve``."""

    model: Circuit
    conditions: tuple
    largest_drops: tuple
    circuit_checks: tuple
    validity_warnings: tuple
    pump_curve: dict


def validity_warnings(circuit: Circuit, conditions, assemblies) -> list[Problem]:
    """Inputs outside the validity range of a method: warnings, not errors, on the user's own fields."""
    out = []
    for ln, a in zip(circuit.lines, assemblies):
        for s in ln.segs:
            place = ln.parts[s.index].place
            if place is None:  # a planned adapter: nothing the user typed
                continue
            path = f"lines[{ln.index}].parts[{place}]"
            if s.d_m and s.eps_m / s.d_m > 0.05:
                out.append(Problem(f"{path}.roughness_mm", "relative roughness above 0.05, beyond the range "
                                                            "Colebrook's equation was fitted to"))
            routed = a.route is not None and s.index == a.hose
            for k, (_, rc) in enumerate(s.bends):
                if rc / s.d_m < 1.0:
                    out.append(Problem(f"lines[{ln.index}].route_points_mm" if routed else f"{path}.bends[{k}].radius_mm",
                                       f"the radius of bend {k + 1} is under one bore: beyond the range of the "
                                       "rounded-bend method"))
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
        words = (f"at {said(c['name'])} ({c['fluid_temp_c']:g} C) the circuit needs {c['circuit_need_bar']:.1f} bar at "
                f"neutral to pass the pump's {c['pump_flow_lpm']:.2f} L/min, above the {relief:g} bar relief setting, "
                + (f"so the relief opens, and the starved pump gives the gear only {c['circuit_flow_lpm']:.2f} L/min "
                   "(see the feed line)" if c["pump_starved"] else
                   f"so the relief opens and the gear gets only {c['circuit_flow_lpm']:.2f} L/min"))
        if warm:
            out = check("relief setting", "fail", f"raise the relief setting or cut the circuit's drop: {words}")
            out["fix"] = fix("pump.relief_bar", float(RELIEF_STEP_BAR * math.ceil(c["circuit_need_bar"] / RELIEF_STEP_BAR
                                                                                  + 1e-9)),
                             field_label("pump", "relief_bar"))
            return out
        return check("relief setting", "caution", f"{words} until the fluid warms: the relief cracks open at cold start")
    if not running:
        return check("relief setting", "ok", "no operating point at neutral to compare with the relief setting")
    c = max(running, key=lambda x: x["circuit_need_bar"])
    return check("relief setting", "ok", f"the circuit needs at most {c['circuit_need_bar']:.1f} bar at neutral "
                                         f"({said(c['name'])}), under the {relief:g} bar relief setting")


def _gear_check(job, conditions) -> list[dict]:
    gear = job.gear
    if gear["cold_drop_bar"] is not None:
        return []
    cold = [c for c in conditions if not c["full_lock"] and c["fluid_temp_c"] < gear["at_temp_c"] - GEAR_ESTIMATE_K]
    if not cold:
        return []
    c = min(cold, key=lambda x: x["fluid_temp_c"])
    return [check("gear valve", "ok", f"flagged: the valve's drop at neutral at {said(c['name'])} ({c['fluid_temp_c']:g} C, "
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


def circuit_stage(job, assembly) -> CircuitSection:
    """Solve every operating point of the prepared job on the lines as built.

    Parameters
    ----------
    job : calc.model.prepared.PreparedJob
    assembly : calc.stages.assembly.AssemblySection
        The lines as built: port adapters, and the assemblies' derived lengths and bends.

    Returns
    -------
    CircuitSection
    """
    circuit = Circuit(job, assembly.built_parts)
    conditions = tuple(circuit.operating_point(c) for c in job.conditions)
    return CircuitSection(circuit, conditions, tuple(largest_drops(circuit, conditions)),
                          tuple(circuit_checks(job, conditions)),
                          tuple(validity_warnings(circuit, conditions, assembly.assemblies)),
                          pump_curve(circuit, job.conditions))
