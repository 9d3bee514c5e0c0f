"""The pipeline: prepare the job, run the stages in order, assemble the result.

``evaluate(job)`` is the engine's one entry point: JSON-shaped dict in, JSON-shaped dict out,
no I/O. The result's shape is declared once, in ``calc.model.result``.
"""
from __future__ import annotations

from .data.tables import fitting_families
from .model.job import path_words
from .model.prepared import prepare
from .model.result import worst_verdict
from .physics.sizes import dash_of_mm
from .stages.assembly import assembly_record, assembly_stage
from .stages.circuit import circuit_stage
from .stages.lines import last_feed_line, lines_stage
from .stages.ports import ports_stage
from .stages.selection import selection_stage
from .stages.thermal import thermal_stage
from .system.circuit import Circuit
from .system.line import part_bore_mm
from .system.naming import part_ref
from .system.order import order_of
from .system.sketch import sketch_of

__all__ = ["evaluate", "sweep", "drop_curve", "run", "METHODS", "DROP_CURVE_STEPS"]

METHODS = (
    "Friction: 64/Re below Re 2000; Colebrook (Clamond's solution) above 4000; linear in Re between.",
    "Fittings: Darby 3-K; bends: Rennels less arc friction above Re 2000, and in laminar flow the curved "
    "arc's excess friction by White's correlation (none below Dean 11.6); bore changes: Hooper sharp "
    "contraction and expansion, on the upstream bore's Reynolds number; reservoir entrance: 160/Re plus "
    "the turbulent entrance coefficient (a projecting pipe by Rennels, from its wall thickness); exit: "
    "K = 2 laminar, 1 turbulent.",
    "Gear valve at neutral: an orifice whose loss is K = K_inf + K1/Re (Hooper's two-constant form), fitted to its measured drop, or to two measured drops at different temperatures.",
)
#: Fitting families sized by the dash size of their hose or tube (not by a tube diameter in mm).
FITTING_SIXTEENTHS = frozenset(k for k, f in fitting_families().items() if "mm" not in f["size_basis"])
_FLUID_KEYS = ("name", "preset", "visc_40c_cst", "visc_100c_cst", "density_15c_kg_m3", "specific_heat_j_kgk",
               "max_temp_c", "source")


def _worded(problems, job) -> list[dict]:
    """Problems with their field in words (``calc.model.job.path_words``) beside the path."""
    return [dict(p.as_dict(), label=path_words(p.path, job)) for p in problems]


def _refused(problems, warnings, job) -> dict:
    return {"ok": False, "errors": _worded(problems, job), "warnings": _worded(warnings, job)}


def _own_dash(p) -> int | None:
    """The dash size the part is sized by: a hose's, or a fitting's in a family sized in sixteenths."""
    if p["kind"] == "hose" or (p["kind"] == "fitting" and p.get("family") in FITTING_SIXTEENTHS):
        return p.get("dash")
    return None


def _part_row(k: int, p) -> dict:
    size = p["od_mm"] if p["kind"] == "tube" else part_bore_mm(p)
    dash, _, exact = dash_of_mm(size) if size else (None, None, False)
    if _own_dash(p) is not None:
        dash, exact = _own_dash(p), True
    return {"index": k, "job_part": p.place, "adapter": p.adapter, "label": part_ref(p), "kind": p["kind"],
            "size_mm": size, "dash": dash, "dash_exact": exact}


def _line(ln, stages, j: int, spec) -> dict:
    ports, assembly, circuit, lines, selection = stages
    drop = circuit.largest_drops[j]
    a = assembly.assemblies[j]
    return {"index": ln.index, "name": ln.name, "role": ln.role, "verdict": lines.verdicts[j],
            "pressure_drop_max_bar": drop["bar"], "pressure_drop_max_at": drop["at"], "checks": lines.checks[j],
            "ports": {"from_port": ports.plans[j]["from_port"], "to_port": ports.plans[j]["to_port"]},
            "parts": [_part_row(k, p) for k, p in enumerate(a.parts)], "assembly": assembly_record(a),
            "rating": lines.ratings[j], "walls": lines.walls[j], "sketch": sketch_of(spec, lines.ratings[j]["parts"]),
            "candidates": selection.candidates[j]}


def run(job) -> dict:
    """Run the stages on a prepared job and assemble the result (see ``calc.model.result``).

    Parameters
    ----------
    job : calc.model.prepared.PreparedJob

    Returns
    -------
    dict
        The result, every figure in SI or with its unit in the key.
    """
    ports = ports_stage(job)                          # adapter plans: they become parts of the lines
    assembly = assembly_stage(job, ports)             # cut lengths and route bends, worked out once
    circuit = circuit_stage(job, assembly)            # operating points, node pressures, relief and gear
    lines = lines_stage(job, ports, assembly, circuit)  # ratings and every check of each line
    selection = selection_stage(job, ports, circuit, last_feed_line(job))  # whole-assembly hose candidates
    thermal = thermal_stage(job, circuit, lines.ratings)  # heat, steady temperature, full lock, cooler
    stages = (ports, assembly, circuit, lines, selection)
    out_lines = [_line(ln, stages, j, job.lines[j].spec) for j, ln in enumerate(circuit.model.lines)]
    warnings = [*job.warnings, *circuit.validity_warnings, *lines.warnings]
    return {
        "ok": True,
        "job_name": job.job["name"],
        "fluid": {k: job.fluid[k] for k in _FLUID_KEYS},
        "conditions": [{**op, **heat} for op, heat in zip(circuit.conditions, thermal.heat)],
        "circuit": {"verdict": worst_verdict(circuit.circuit_checks), "checks": list(circuit.circuit_checks)},
        "lines": out_lines,
        "thermal": thermal.thermal,
        "warnings": _worded(warnings, job.raw),
        "methods": list(METHODS),
        "pump_curve": circuit.pump_curve,
        "order": order_of(assembly.built_parts, ports.plans),
    }


def evaluate(job) -> dict:
    """Evaluate a job.

    Parameters
    ----------
    job : dict
        A job document (see ``calc.model.job``), as parsed from JSON.

    Returns
    -------
    result : dict
        ``{"ok": False, "errors": [{"path", "message"}], "warnings": [...]}``
        for an invalid job; otherwise the result declared in ``calc.model.result``.

    Examples
    --------
    >>> import json, importlib.resources as ir
    >>> demo = json.loads((ir.files("calc") / "data" / "demos" / "compact-hatch.json").read_text())
    >>> r = evaluate(demo)
    >>> r["ok"], [c["name"] for c in r["conditions"]]  # the job gives none: the four default points
    (True, ['cold start', 'hot idle', 'highway', 'full lock hot'])
    """
    prepared, problems, warnings = prepare(job)
    if problems:
        return _refused(problems, warnings, job)
    return run(prepared)


def _solve_without_detail(prepared, conditions) -> dict:
    circuit = Circuit(prepared, assembly_stage(prepared, ports_stage(prepared)).built_parts)
    conds = [circuit.operating_point(c, detail=False) for c in conditions]
    return {"ok": True, "lines": [{"name": ln.name, "role": ln.role} for ln in circuit.lines],
            "conditions": [{k: c[k] for k in ("name", "fluid_temp_c", "viscosity_cst", "pump_outlet_bar",
                                              "pump_inlet_bar", "circuit_flow_lpm", "lines")} for c in conds]}


def sweep(job) -> dict:
    """Hydraulics only, at each of the job's operating points: the cheap call for curves.

    Preparation and ports as ``evaluate``; then every operating point is solved without per-part
    detail, and neither the ratings nor the thermal stage runs.

    Returns
    -------
    dict
        ``{"ok": True, "lines": [{"name", "role"}], "conditions": [{"name",
        "fluid_temp_c", "viscosity_cst", "pump_outlet_bar", "pump_inlet_bar", "circuit_flow_lpm",
        "lines": [{"pressure_drop_bar", ...}]}]}`` or the errors as in ``evaluate``.
    """
    prepared, problems, warnings = prepare(job)
    if problems:
        return _refused(problems, warnings, job)
    return _solve_without_detail(prepared, prepared.conditions)


#: Intervals of the drop-against-temperature curve (a display choice).
DROP_CURVE_STEPS = 8


def drop_curve(job) -> dict:
    """Pressure drop of every line against fluid temperature: the page's plot, computed here.

    The temperatures run from the job's coldest operating point to its hottest (at least 20 K
    wide) in ``DROP_CURVE_STEPS`` steps, at the speed of its fastest operating point not at full
    lock (of any, if all are); each point is solved as by ``sweep``.

    Returns
    -------
    dict
        ``sweep``'s answer over those temperatures, plus ``engine_rpm``; or the errors as in
        ``evaluate``.

    Examples
    --------
    >>> import json, importlib.resources as ir
    >>> demo = json.loads((ir.files("calc") / "data" / "demos" / "compact-hatch.json").read_text())
    >>> r = drop_curve(demo)  # the default points: -20 C cold start to 100 C at full lock, 2500 rpm highway
    >>> len(r["conditions"]), r["conditions"][0]["fluid_temp_c"], r["conditions"][-1]["fluid_temp_c"], r["engine_rpm"]
    (9, -20.0, 100.0, 2500.0)
    """
    prepared, problems, warnings = prepare(job)
    if problems:
        return _refused(problems, warnings, job)
    conds = prepared.conditions
    temps = [c["fluid_temp_c"] for c in conds]
    lo = min(temps)
    hi = max(temps + [lo + 20.0])
    rpm = max(c["engine_rpm"] for c in ([c for c in conds if not c["full_lock"]] or conds))
    points = [{"name": f"sweep {i}", "engine_rpm": rpm, "full_lock": False,
               "fluid_temp_c": round(lo + (hi - lo) * i / DROP_CURVE_STEPS, 3)} for i in range(DROP_CURVE_STEPS + 1)]
    return dict(_solve_without_detail(prepared, points), engine_rpm=rpm)
