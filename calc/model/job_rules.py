"""The rules of a job that span fields, and the job's validation: ``validate_job``.

The structure (every field's type, limits and default) is declared once in ``calc.model.job``; this module
adds the rules no single field can state (a fluid names a preset or gives its datasheet values; a tube wall
under half its diameter; duty shares adding to 100 %; ...), and ``gear_constants``, the valve fitted to the
gear's measured points.
"""
from __future__ import annotations

import math

from ..physics.fluid import NU_MAX_CST
from ..physics.pump import pulley_ratio_from_diameters
from ..physics.valve import valve_constants_one_point, valve_constants_two_points
from .assembly import assembly_hose
from .fluid import resolve_fluid, state_of
from .job import JOB, JOB_VERSION, PUMP
from .schema import Problem, validate

__all__ = ["validate_job", "gear_constants", "WALTHER_SLOPE_RANGE"]


def validate_job(job) -> tuple[dict | None, list[Problem], list[Problem]]:
    """Validate a job and fill its defaults.

    Checks the structure against ``JOB``, then the rules that span fields
    (a fluid either names a preset or gives its datasheet values; a tube wall
    under half its diameter; duty shares adding to 100 %; ...).

    Returns ``(normalised_job, problems, warnings)``; ``normalised_job`` is
    ``None`` when there are problems.

    Examples
    --------
    >>> _, problems, _ = validate_job({"version": 1})
    >>> [str(p) for p in problems][:2]
    ['fluid: is missing', 'pump: is missing']
    """
    version = job.get("version") if isinstance(job, dict) else None
    if isinstance(version, int) and not isinstance(version, bool) and version != JOB_VERSION \
            and abs(version) < 10 ** 12:
        return None, [Problem("version", f"this file is version {version}; this build reads job files of "
                                         f"version {JOB_VERSION}")], []
    out, problems, warnings = validate(JOB, job)
    if not problems:
        _cross_checks(out, problems, warnings)
    return (None if problems else out), problems, warnings


def _cross_checks(job: dict, problems: list, warnings: list) -> None:
    """The rules that span fields; ``job["fluid"]`` is replaced by its resolved record."""
    _fluid_checks(job, problems, warnings)
    if sum(1 for ln in job["lines"] if ln["role"] == "pressure") == 0:
        warnings.append(Problem("lines", "no pressure line listed: the circuit pressure at neutral is "
                                         "only the gear and return losses"))
    for i, ln in enumerate(job["lines"]):
        _line_checks(i, ln, problems)
    pump = job["pump"]
    _pulley_checks(pump, problems)
    _flow_table_checks(pump, problems, warnings)
    if pump["overall_efficiency"] is not None and pump["overall_efficiency"] > pump["volumetric_efficiency"]:
        problems.append(Problem("pump.overall_efficiency", "must be at most the volumetric efficiency (overall = "
                                                           "volumetric x mechanical efficiency)"))
    duty = [c["duty_percent"] for c in job["conditions"]]
    total = sum(duty)
    if total > 0 and abs(total - 100.0) > 0.01:
        problems.append(Problem("conditions", f"the shares of time (duty_percent) add up to {total:g} %, "
                                              "not 100 %"))
    _cooler_checks(job["thermal"]["cooler"], problems)
    _gear_checks(job["gear"], job["fluid"], problems)


#: Pulley diameters and a pulley ratio that differ by more than this share are two different drives, [-] (a
#: stated tolerance: a measured diameter is good to about 1 %).
PULLEY_TOLERANCE = 0.01


def _pulley_checks(pump: dict, problems: list) -> None:
    """The pulley ratio from the two diameters when it is not given (else 1); the two ways must agree."""
    crank, driven = pump["crank_pulley_mm"], pump["pump_pulley_mm"]
    if (crank is None) != (driven is None):
        missing = "pump_pulley_mm" if driven is None else "crank_pulley_mm"
        problems.append(Problem(f"pump.{missing}", "is missing: the pulley ratio needs both pulley diameters"))
        return
    from_diameters = None if crank is None else pulley_ratio_from_diameters(crank, driven)
    ratio_field = next(f for f in PUMP.fields if f.key == "pulley_ratio")
    if from_diameters is not None and not ratio_field.ge <= from_diameters <= ratio_field.le:
        problems.append(Problem("pump.pump_pulley_mm", f"with the {crank:g} mm crank pulley gives a pulley ratio of "
                                                       f"{from_diameters:.3g}, outside {ratio_field.ge:g} to "
                                                       f"{ratio_field.le:g}: check both diameters"))
        return
    if pump["pulley_ratio"] is None:
        pump["pulley_ratio"] = 1.0 if from_diameters is None else from_diameters
    elif from_diameters is not None and abs(from_diameters / pump["pulley_ratio"] - 1.0) > PULLEY_TOLERANCE:
        problems.append(Problem("pump.pulley_ratio", f"is {pump['pulley_ratio']:g}, but the pulley diameters "
                                                     f"({crank:g} mm crank, {driven:g} mm pump) give "
                                                     f"{from_diameters:.3f}: give one or the other"))


def _flow_table_checks(pump: dict, problems: list, warnings: list) -> None:
    """A flow-control setting or a flow table; the table's speeds rising, its flows within the displacement."""
    table = pump["flow_table_rpm_lpm"]
    if table is None:
        if pump["flow_limit_lpm"] is None:
            problems.append(Problem("pump.flow_limit_lpm", "is missing: give the flow-control setting, or the "
                                                           "pump's flow table"))
        return
    if pump["flow_limit_lpm"] is not None:
        warnings.append(Problem("pump.flow_limit_lpm", "is not used: the pump's flow table gives the delivered "
                                                       "flow at each speed"))
    path = "pump.flow_table_rpm_lpm"
    for i, (rpm, lpm) in enumerate(table):
        if i and rpm <= table[i - 1][0]:
            problems.append(Problem(f"{path}[{i}][0]", f"must be above the speed of row {i} ({table[i - 1][0]:g} "
                                                       "rpm): the rows go from slow to fast"))
            continue
        displaced = pump["displacement_cc_rev"] * rpm / 1000.0
        if lpm > displaced * (1.0 + 1e-9):
            problems.append(Problem(f"{path}[{i}][1]", f"{lpm:g} L/min at {rpm:g} rpm is more than the pump "
                                                       f"displaces at that speed ({displaced:.2f} L/min = "
                                                       "displacement x pump speed): check the row or the "
                                                       "displacement"))
        elif lpm > displaced * pump["volumetric_efficiency"] * (1.0 + 1e-9):
            warnings.append(Problem(f"{path}[{i}][1]", f"{lpm:g} L/min at {rpm:g} rpm is more than the pump "
                                                       f"delivers there at its volumetric efficiency "
                                                       f"({displaced * pump['volumetric_efficiency']:.2f} L/min); "
                                                       "the engine uses the smaller: check the efficiency"))


#: ASTM D341 slopes B of real hydraulic fluids: about 4.5 for a low-VI naphthenic oil, 3.7 for VI-100 mineral
#: oil, 2.5 for synthetic steering fluids, 1.6 for silicone fluids (computed from recalled datasheet pairs,
#: from memory); outside this range two datasheet points are more likely a typing slip than a fluid.
WALTHER_SLOPE_RANGE = (1.2, 5.0)


def _fluid_checks(job: dict, problems: list, warnings: list) -> None:
    fl = job["fluid"]
    if fl["preset"] in (None, "custom"):
        for k in ("visc_40c_cst", "visc_100c_cst", "density_15c_kg_m3", "specific_heat_j_kgk"):
            if fl[k] is None:
                problems.append(Problem(f"fluid.{k}", "is missing (give it, or choose a preset)"))
    if fl["visc_40c_cst"] is not None and fl["visc_100c_cst"] is not None:
        if fl["visc_100c_cst"] >= fl["visc_40c_cst"]:
            problems.append(Problem("fluid.visc_100c_cst", "must be lower than the viscosity at 40 C"))
    if problems:
        return
    job["fluid"] = resolve_fluid(fl)
    slope = job["fluid"]["walther_b"]
    if not WALTHER_SLOPE_RANGE[0] <= slope <= WALTHER_SLOPE_RANGE[1]:
        warnings.append(Problem("fluid.visc_100c_cst",
                                f"{job['fluid']['visc_40c_cst']:g} cSt at 40 C and {job['fluid']['visc_100c_cst']:g} "
                                f"cSt at 100 C imply a viscosity-temperature slope (ASTM D341 constant B = "
                                f"{slope:.2f}) outside what real hydraulic fluids show (about "
                                f"{WALTHER_SLOPE_RANGE[0]:g} to {WALTHER_SLOPE_RANGE[1]:g}); check the datasheet values"))
    for i, c in enumerate(job["conditions"]):
        try:
            nu = state_of(job["fluid"], c["fluid_temp_c"]).nu_m2_s * 1e6
        except ValueError:
            nu = math.inf
        if nu > NU_MAX_CST:
            problems.append(Problem(f"conditions[{i}].fluid_temp_c",
                                    f"the fluid's viscosity at {c['fluid_temp_c']:g} C would be above "
                                    f"{NU_MAX_CST:,.0f} cSt: it would not flow (check the "
                                    "fluid's datasheet values)"))


def _line_checks(i: int, ln: dict, problems: list) -> None:
    for k, p in enumerate(ln["parts"]):
        path = f"lines[{i}].parts[{k}]"
        if p["kind"] == "tube" and p["wall_mm"] * 2 >= p["od_mm"]:
            problems.append(Problem(f"{path}.wall_mm", "must be less than half the outside diameter"))
        if p["kind"] == "hose" and p["bore_mm"] is None and (p["class"] is None or p["dash"] is None):
            problems.append(Problem(f"{path}.bore_mm", "is missing (give a bore, or a hose class and "
                                                       "dash size)"))
        if p["kind"] == "device" and p["scaling"] == "viscous" and p["at_visc_cst"] is None:
            problems.append(Problem(f"{path}.at_visc_cst", "is missing (viscous scaling needs the "
                                                           "viscosity at which the drop was measured)"))
        if p["kind"] == "hose" and p["length_m"] is None and not (
                k == assembly_hose(ln["parts"]) and (ln["route_points_mm"] or ln["overall_length_mm"])):
            problems.append(Problem(f"{path}.length_m", "is missing: give the hose's length, or the line's route "
                                                        "points or overall assembly length for its assembly hose"))
    if ln["route_points_mm"] is not None and len(ln["route_points_mm"]) == 1:
        problems.append(Problem(f"lines[{i}].route_points_mm", "needs at least two points"))


def _cooler_checks(cooler: dict, problems: list) -> None:
    if cooler["type"] == "rating" and cooler["w_per_k"] is None:
        problems.append(Problem("thermal.cooler.w_per_k", "is missing (the cooler type is 'rating')"))
    if cooler["type"] == "tube" and cooler["tube_length_m"] is None:
        problems.append(Problem("thermal.cooler.tube_length_m", "is missing (the cooler type is 'tube')"))
    if cooler["type"] == "tube" and cooler["tube_wall_mm"] * 2 >= cooler["tube_od_mm"]:
        problems.append(Problem("thermal.cooler.tube_wall_mm", "must be less than half the outside diameter"))
    if cooler["fins_per_inch"] > 0:
        if cooler["fin_od_mm"] is None:
            problems.append(Problem("thermal.cooler.fin_od_mm", "is missing (fins_per_inch is more than 0)"))
        elif cooler["fin_od_mm"] <= cooler["tube_od_mm"]:
            problems.append(Problem("thermal.cooler.fin_od_mm", "must be larger than the tube outside "
                                                                "diameter"))
        if cooler["fin_thickness_mm"] * cooler["fins_per_inch"] >= 25.4:
            problems.append(Problem("thermal.cooler.fin_thickness_mm", "the fins would fill the tube: fin "
                                                                       "thickness x fins per inch must be "
                                                                       "under 25.4 mm"))


def _gear_checks(gear: dict, fluid: dict, problems: list) -> None:
    if gear["cold_drop_bar"] is None:
        return
    if gear["cold_at_temp_c"] is None:
        problems.append(Problem("gear.cold_at_temp_c", "is missing (a second measured drop needs its fluid "
                                                       "temperature)"))
    elif abs(gear["cold_at_temp_c"] - gear["at_temp_c"]) < 10.0:
        problems.append(Problem("gear.cold_at_temp_c", "must be at least 10 K from the first measurement's "
                                                       "temperature, so the two points tell viscosity apart"))
    elif "walther_a" in fluid and gear_constants(gear, fluid) is None:
        problems.append(Problem("gear.cold_drop_bar", "the two measured drops give no valve whose drop rises "
                                                      "with viscosity: check both points and their temperatures"))


def gear_constants(gear, fluid) -> tuple[float, float] | None:
    """The valve's constants (a, b) of ``calc.physics.valve`` for a validated gear record and a resolved
    fluid: through both measured points when a second is given, else the orifice model through the
    one point; None when two points give no positive pair."""
    st0 = state_of(fluid, gear["at_temp_c"])
    q0 = gear["at_flow_lpm"] / 60000.0
    p0 = (gear["neutral_drop_bar"] * 1e5, q0, st0.nu_m2_s, st0.rho_kg_m3)
    if gear.get("cold_drop_bar") is None:
        return valve_constants_one_point(*p0)
    st1 = state_of(fluid, gear["cold_at_temp_c"])
    q1 = (gear.get("cold_at_flow_lpm") or gear["at_flow_lpm"]) / 60000.0
    return valve_constants_two_points(p0, (gear["cold_drop_bar"] * 1e5, q1, st1.nu_m2_s, st1.rho_kg_m3))

