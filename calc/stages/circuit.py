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


#: A flow-control setting more than this share above the gear's need is flagged: more heat and a lighter feel
#: than the gear was built for (common practice, no source).
FLOW_OVER_NEED = 0.5
#: What the advice proposes instead: the gear's need with this margin, rounded to half a litre (common practice,
#: no source).
FLOW_MARGIN = 0.2


def _gear_rating_check(job) -> list[dict]:
    rated, relief = job.gear["rated_bar"], job.pump["relief_bar"]
    if rated is None:
        return []
    if relief > rated:
        out = check("gear rating", "fail", f"lower the relief setting to at most the gear's {rated:g} bar: the pump's "
                                           f"{relief:g} bar relief setting is above the gear's maximum working "
                                           "pressure, so at full lock the gear is held above its rating")
        out["fix"] = fix("pump.relief_bar", float(rated), field_label("pump", "relief_bar"))
        return [out]
    return [check("gear rating", "ok", f"the {relief:g} bar relief setting is within the gear's {rated:g} bar "
                                       "maximum working pressure")]


def _half_litre_up(lpm: float) -> float:
    return float(math.ceil(lpm * 2.0 - 1e-9) / 2.0)


def _parking_fix(job, c, need: float) -> dict | None:
    """The one edit that brings the pump's flow at the slowest point up to the gear's need, or None."""
    pump, uncapped = job.pump, c["pump_flow_uncapped_lpm"]
    if pump.get("flow_table_rpm_lpm"):
        return None  # the table's own flow limits: another pump (or its maker's setting), not one field
    if c["flow_control_limiting"] or uncapped >= need:
        return fix("pump.flow_limit_lpm", _half_litre_up(need), field_label("pump", "flow_limit_lpm"))
    ratio = pump["pulley_ratio"] * need / uncapped
    if pump["pump_pulley_mm"] is not None:
        return fix("pump.pump_pulley_mm", float(math.floor(pump["crank_pulley_mm"] / ratio + 1e-9)),
                   field_label("pump", "pump_pulley_mm"))
    return fix("pump.pulley_ratio", float(math.ceil(ratio * 100.0 - 1e-9) / 100.0), field_label("pump", "pulley_ratio"))


def _parking_flow_check(job, conditions, need: float) -> dict:
    """The pump's flow at the slowest operating point against the gear's need for full assist."""
    c = min(conditions, key=lambda x: x["engine_rpm"])
    if c["pump_flow_lpm"] >= need * (1.0 - 1e-9):  # a fix that gives the need exactly settles (rounding)
        return check("gear flow", "ok", f"the pump delivers {c['pump_flow_lpm']:.2f} L/min at the slowest operating "
                                        f"point, {said(c['name'])}, at least the {need:g} L/min the gear needs")
    if job.pump.get("flow_table_rpm_lpm"):
        why = ("the pump's flow table: a smaller pump pulley turns the pump faster at idle, where its table may give "
               "more, or use a pump with more flow at that speed")
    elif c["flow_control_limiting"]:
        why = "the flow-control setting: raise it"
    else:
        why = "the pump's displacement and pulley ratio: a smaller pump pulley or a larger pump"
    out = check("gear flow", "caution", f"assist falls off when parking: at {said(c['name'])} ({c['engine_rpm']:g} "
                                        f"rpm) the pump delivers {c['pump_flow_lpm']:.2f} L/min, less than the "
                                        f"{need:g} L/min the gear needs for full assist (limited by {why})")
    f = _parking_fix(job, c, need)
    if f:
        out["fix"] = f
    return out


def _setting_over_need_check(job, need: float) -> list[dict]:
    """A flow-control setting (or a flow table's highest flow) far above the gear's need."""
    table = job.pump.get("flow_table_rpm_lpm")
    setting = max(r[1] for r in table) if table else job.pump["flow_limit_lpm"]
    if setting <= need * (1.0 + FLOW_OVER_NEED):
        return []
    what = "the flow table's highest flow" if table else "the flow-control setting"
    msg = (f"{what}, {setting:g} L/min, is more than {FLOW_OVER_NEED:.0%} above the {need:g} L/min the gear needs: "
           "more heat in the fluid and a lighter feel than the gear was built for (common practice, no source)")
    out = check("flow-control setting", "caution", ("use a pump set nearer the gear's need: " if table else
                                                     "lower the setting: ") + msg)
    if not table:
        out["fix"] = fix("pump.flow_limit_lpm", _half_litre_up(need * (1 + FLOW_MARGIN)),
                         field_label("pump", "flow_limit_lpm"))
    return [out]


def _gear_flow_checks(job, conditions) -> list[dict]:
    need = job.gear["flow_needed_lpm"]
    if need is None or not conditions:
        return []
    return [_parking_flow_check(job, conditions, need)] + _setting_over_need_check(job, need)


def circuit_checks(job, conditions) -> list[dict]:
    """The pump's and the gear's checks: the relief setting against the circuit's need and the gear's rating, the
    pump's flow against the gear's need, the valve estimate."""
    return ([_relief_check(job, conditions)] + _gear_rating_check(job) + _gear_flow_checks(job, conditions)
            + _gear_check(job, conditions))


def largest_drops(circuit: Circuit, conditions) -> list[dict]:
    """Per line: its largest pressure drop over the operating points, and where it occurs."""
    out = []
    for ln in circuit.lines:
        worst = max(conditions, key=lambda c: c["lines"][ln.index]["pressure_drop_bar"])
        out.append({"bar": worst["lines"][ln.index]["pressure_drop_bar"], "at": worst["name"]})
    return out


def pump_curve(circuit: Circuit, conditions) -> dict:
    """Delivered flow from 0 to 1.1 x the fastest operating point (at least 3000 rpm, and the flow table's last
    row), for the plot; the flow table's rows at the engine speeds that turn the pump at their speeds."""
    pump = circuit.pump
    ratio, table = pump["pulley_ratio"], pump.get("flow_table_rpm_lpm") or ()
    fastest = max([3000.0] + [c["engine_rpm"] for c in conditions] + [r[0] / ratio for r in table])
    rpm_max = math.floor(fastest * 1.1 + 0.5)
    points = []
    for i in range(PUMP_CURVE_POINTS + 1):
        rpm = rpm_max * i / PUMP_CURVE_POINTS
        points.append({"engine_rpm": rpm, "delivered_lpm": circuit.pump_flow(rpm)[0] / LPM})
    rows = [{"engine_rpm": r[0] / ratio, "pump_rpm": r[0], "table_lpm": r[1]} for r in table]
    return {"flow_limit_lpm": None if table else pump["flow_limit_lpm"], "pulley_ratio": ratio, "points": points,
            "table": rows}


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
