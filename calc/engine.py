"""Job evaluation: the circuit at every operating point, then the checks.

``evaluate(job)`` is the engine's one entry point: JSON-shaped dict in,
JSON-shaped dict out, no I/O. The steps are

1. validate the job against ``calc.model`` and fill its defaults;
2. build a ``Circuit`` (fluid resolved, every line compiled to SI segments);
3. solve each operating point (``Circuit.operating_point``);
4. run the per-line checks (velocity bands, pump inlet), then the ratings and
   thermal stages, which add their own sections to the result.

The circuit model (stated assumptions):

* lines of the same role are in series in the order listed: pump ->
  pressure lines -> gear valve -> return lines -> reservoir; feed lines run
  reservoir -> pump inlet; the reservoir is at 0 bar gauge;
* at neutral the pump outlet pressure is the sum of the pressure-line, gear
  and return-line drops at the delivered flow; if that exceeds the relief
  setting (cold fluid), the relief opens and the circuit flow is the flow at
  which the circuit drop equals the relief setting;
* at full lock the gear valve is closed: the lines carry no flow, the
  pressure lines stand at the relief setting and the whole delivered flow
  crosses the relief, which discharges inside the pump (so the feed line
  carries only the circuit flow);
* the gear valve drop scales with flow squared (orifice flow) from the
  stated neutral drop.
"""
from __future__ import annotations

import math

from . import fluid as fluidmod
from . import hydraulics as hyd
from .model import validate_job
from .pump import delivered_flow_m3_s
from .schema import Problem

__all__ = ["evaluate", "Circuit", "INLET_MIN_BAR"]

#: Lowest pump-inlet gauge pressure before aeration and cavitation (common practice, no source).
INLET_MIN_BAR = -0.2
LPM = 1.0 / 60000.0  # m^3/s per L/min
BAR = 1e5


class Circuit:
    """A validated job compiled for repeated evaluation.

    Parameters
    ----------
    job : dict
        A job normalised by ``calc.model.validate_job`` (fluid resolved).
    """

    def __init__(self, job: dict):
        self.job = job
        self.fluid = job["fluid"]
        self.pump = job["pump"]
        self.gear = job["gear"]
        self.lines = []
        for i, ln in enumerate(job["lines"]):
            self.lines.append({"index": i, "name": ln["name"] or f"line {i + 1}", "role": ln["role"],
                               "parts": ln["parts"], "segs": hyd.compile_line(ln["parts"])})
        self.by_role = {r: [ln for ln in self.lines if ln["role"] == r] for r in ("pressure", "return", "feed")}

    # -- pieces --------------------------------------------------------------
    def state(self, t_c: float) -> fluidmod.FluidState:
        return fluidmod.state(self.fluid, t_c)

    def pump_flow(self, engine_rpm: float) -> tuple[float, float, bool]:
        p = self.pump
        return delivered_flow_m3_s(p["displacement_cc_rev"], engine_rpm, p["pulley_ratio"],
                                   p["volumetric_efficiency"], p["flow_limit_lpm"] * LPM)

    def gear_drop_pa(self, q_m3_s: float) -> float:
        q0 = self.gear["at_flow_lpm"] * LPM
        return self.gear["neutral_drop_bar"] * BAR * (q_m3_s / q0) ** 2

    def circuit_drop_pa(self, q_m3_s: float, st: fluidmod.FluidState, per_line: dict | None = None) -> float:
        """Pump outlet gauge pressure needed to push ``q_m3_s`` round at neutral, Pa.

        ``per_line``, if given, receives each pressure and return line's drop by line index.
        """
        total = self.gear_drop_pa(q_m3_s)
        for role in ("pressure", "return"):
            for ln in self.by_role[role]:
                dp = hyd.line_flow(ln["segs"], q_m3_s, st.nu_m2_s, st.rho_kg_m3, detail=False)[0]
                total += dp
                if per_line is not None:
                    per_line[ln["index"]] = dp
        return total

    # -- an operating point ----------------------------------------------------
    def operating_point(self, cond: dict, t_c: float | None = None, detail: bool = True) -> dict:
        """Solve one operating point.

        Parameters
        ----------
        cond : dict
            A validated condition (engine_rpm, fluid_temp_c, full_lock).
        t_c : float, optional
            Fluid temperature to use instead of the condition's own [C]
            (the thermal solver calls this with trial temperatures).
        detail : bool
            Include per-part and per-node results.
        """
        t = cond["fluid_temp_c"] if t_c is None else t_c
        st = self.state(t)
        relief_pa = self.pump["relief_bar"] * BAR
        q_pump, q_uncapped, capped = self.pump_flow(cond["engine_rpm"])
        relief_open = False
        dps: dict = {}
        if cond["full_lock"]:
            q_lines, q_relief, p_out = 0.0, q_pump, relief_pa
            relief_open = True
            self.circuit_drop_pa(0.0, st, dps)
        else:
            p_out = self.circuit_drop_pa(q_pump, st, dps)
            q_lines, q_relief = q_pump, 0.0
            if p_out > relief_pa:
                q_lines = _solve_flow(lambda q: self.circuit_drop_pa(q, st) - relief_pa, q_pump)
                q_relief, p_out, relief_open = q_pump - q_lines, relief_pa, True
                self.circuit_drop_pa(q_lines, st, dps)
        res = {"name": cond["name"], "engine_rpm": cond["engine_rpm"], "fluid_temp_c": t,
               "full_lock": cond["full_lock"], "viscosity_cst": st.nu_m2_s * 1e6,
               "density_kg_m3": st.rho_kg_m3, "pump_flow_lpm": q_pump / LPM,
               "pump_flow_uncapped_lpm": q_uncapped / LPM, "flow_control_limiting": capped,
               "circuit_flow_lpm": q_lines / LPM, "relief_flow_lpm": q_relief / LPM,
               "relief_open": relief_open, "pump_outlet_bar": p_out / BAR,
               "gear_drop_bar": (0.0 if cond["full_lock"] else self.gear_drop_pa(q_lines)) / BAR}
        lines_out = [None] * len(self.lines)
        # pressure side: node pressures from the pump outlet forward
        p = p_out
        for ln in self.by_role["pressure"]:
            lines_out[ln["index"]] = r = self._line(ln, q_lines, st, p, detail, dps[ln["index"]])
            p = r["outlet_bar"] * BAR
        # return side: node pressures from the reservoir (0 bar) backward
        p = 0.0
        for ln in reversed(self.by_role["return"]):
            dp = dps[ln["index"]]
            lines_out[ln["index"]] = self._line(ln, q_lines, st, p + dp, detail, dp)
            p += dp
        res["gear_outlet_bar"] = p / BAR
        # feed side: from the reservoir (0 bar) forward to the pump inlet
        p = 0.0
        for ln in self.by_role["feed"]:
            lines_out[ln["index"]] = r = self._line(ln, q_lines, st, p, detail)
            p = r["outlet_bar"] * BAR
        res["pump_inlet_bar"] = p / BAR
        res["has_feed_line"] = bool(self.by_role["feed"])
        res["lines"] = lines_out
        return res

    def _line(self, ln: dict, q: float, st, p_in_pa: float, detail: bool, dp: float | None = None) -> dict:
        if not detail:  # the thermal iteration needs only the drops
            if dp is None:
                dp = hyd.line_flow(ln["segs"], q, st.nu_m2_s, st.rho_kg_m3, detail=False)[0]
            return {"index": ln["index"], "name": ln["name"], "role": ln["role"], "flow_lpm": q / LPM,
                    "pressure_drop_bar": dp / BAR, "inlet_bar": p_in_pa / BAR, "outlet_bar": (p_in_pa - dp) / BAR}
        dp, parts = hyd.line_flow(ln["segs"], q, st.nu_m2_s, st.rho_kg_m3, detail=True)
        velocities = [pt["velocity_m_s"] for pt in parts if pt["kind"] != "device"]
        res_ = [pt["reynolds"] for pt in parts if pt["kind"] != "device" and pt["reynolds"] > 0]
        rhocp = st.rho_kg_m3 * st.cp_j_kgk
        out = {"index": ln["index"], "name": ln["name"], "role": ln["role"], "flow_lpm": q / LPM,
               "velocity_max_m_s": max(velocities, default=0.0),
               "reynolds_min": min(res_, default=0.0), "reynolds_max": max(res_, default=0.0),
               "pressure_drop_bar": dp / BAR, "inlet_bar": p_in_pa / BAR, "outlet_bar": (p_in_pa - dp) / BAR,
               "temp_rise_c": max(dp - sum(pt["elevation_pa"] for pt in parts), 0.0) / rhocp,
               "transitional": any(pt["regime"] == "transitional" for pt in parts)}
        if detail:
            nodes = [{"after_part": -1, "pressure_bar": p_in_pa / BAR}]
            p = p_in_pa
            plist = []
            for pt in parts:
                p -= pt["dp_pa"]
                nodes.append({"after_part": pt["index"], "pressure_bar": p / BAR})
                src = ln["parts"][pt["index"]]
                plist.append({"index": pt["index"], "job_part": src.get("job_part", pt["index"]),
                              "adapter": src.get("adapter"), "kind": pt["kind"],
                              "velocity_m_s": pt["velocity_m_s"],
                              "reynolds": pt["reynolds"], "regime": pt["regime"],
                              "friction_factor": pt["friction_factor"], "k_minor": pt["k_minor"],
                              "pressure_drop_bar": pt["dp_pa"] / BAR,
                              "friction_bar": pt["friction_pa"] / BAR, "minor_bar": pt["minor_pa"] / BAR,
                              "transition_bar": pt["transition_pa"] / BAR,
                              "elevation_bar": pt["elevation_pa"] / BAR,
                              "temp_rise_c": max(pt["dp_pa"] - pt["elevation_pa"], 0.0) / rhocp})
            out["parts"] = plist
            out["nodes"] = nodes
        return out


def _solve_flow(f, q_hi: float) -> float:
    """Root of the increasing function ``f`` on [0, q_hi] by bisection (f(0) < 0 < f(q_hi))."""
    lo, hi = 0.0, q_hi
    if f(lo) >= 0.0:
        return 0.0
    for _ in range(60):
        mid = 0.5 * (lo + hi)
        if f(mid) > 0.0:
            hi = mid
        else:
            lo = mid
        if hi - lo < 1e-9 * q_hi:
            break
    return 0.5 * (lo + hi)


# -- checks ---------------------------------------------------------------------
def _check(check: str, verdict: str, message: str) -> dict:
    return {"check": check, "verdict": verdict, "message": message}


def _bore_advice(q_m3_s: float, v_max_m_s: float) -> str:
    """'-8 or a larger bore (at least 11.3 mm)': the smallest dash size under ``v_max`` at ``q``."""
    d_mm = math.sqrt(4.0 * q_m3_s / (math.pi * v_max_m_s)) * 1e3
    dash = max(2, math.ceil(d_mm / (25.4 / 16.0) - 1e-9))
    return f"-{dash} or a larger bore (at least {d_mm:.1f} mm)"


def hydraulic_checks(circuit: Circuit, conditions: list[dict]) -> list[list[dict]]:
    """Velocity-band, regime and pump-inlet checks per line over all conditions."""
    out = []
    for ln in circuit.lines:
        j = ln["index"]
        checks = []
        lo, hi = hyd.VELOCITY_BANDS_M_S[ln["role"]]
        worst = max(conditions, key=lambda c: c["lines"][j]["velocity_max_m_s"])
        v = worst["lines"][j]["velocity_max_m_s"]
        band = f"{lo:g}-{hi:g} m/s for a {ln['role']} line (common practice)"
        fix = _bore_advice(worst["lines"][j]["flow_lpm"] * LPM, hi)
        if v > 1.5 * hi:
            checks.append(_check("velocity", "fail", f"use {fix}: velocity {v:.1f} m/s at "
                                                     f"'{worst['name']}' is far above {band}"))
        elif v > hi:
            checks.append(_check("velocity", "caution", f"consider {fix}: velocity {v:.1f} m/s at "
                                                        f"'{worst['name']}' exceeds {band}"))
        else:
            checks.append(_check("velocity", "ok", f"velocity at most {v:.1f} m/s ('{worst['name']}'), "
                                                   f"within {band}"))
        trans = [c["name"] for c in conditions if c["lines"][j]["transitional"]]
        if trans:
            checks.append(_check("regime", "ok", "flagged: flow in the laminar-turbulent band (Re 2000-4000) at "
                                 + ", ".join(f"'{n}'" for n in trans) + "; friction interpolated between the "
                                 "laminar and Colebrook values there, so those drops are less certain"))
        if ln["role"] == "feed" and ln is circuit.by_role["feed"][-1]:
            low = min(conditions, key=lambda c: c["pump_inlet_bar"])
            pin = low["pump_inlet_bar"]
            if pin < INLET_MIN_BAR:
                checks.append(_check("pump inlet", "fail",
                                     f"use a larger or shorter feed line, or raise the reservoir: pump inlet "
                                     f"{pin:.2f} bar gauge at '{low['name']}' is below {INLET_MIN_BAR} bar, "
                                     "where the fluid aerates and the pump cavitates (common practice)"))
            else:
                checks.append(_check("pump inlet", "ok", f"pump inlet at least {pin:.2f} bar gauge "
                                                         f"('{low['name']}'), above {INLET_MIN_BAR} bar"))
        out.append(checks)
    return out


def build(job) -> tuple["Circuit | None", dict | None, list, list, list]:
    """Validate a job and compile it: ``(circuit, normalised_job, problems, warnings, port_plans)``.

    The steps every caller needs before solving operating points: validation
    (``calc.model``), part data from the tables (``calc.ratings.prepare``) and
    the port adapters (``port_stage``). ``circuit`` is ``None`` when there are
    problems.
    """
    from . import ratings
    norm, problems, warnings = validate_job(job)
    if problems:
        return None, None, problems, warnings, []
    problems = ratings.prepare(norm)
    if problems:
        return None, None, problems, warnings, []
    plans = port_stage(norm)
    return Circuit(norm), norm, [], warnings, plans


def port_stage(job: dict) -> list[dict]:
    """Plan the adapters at each line's start and end ports and put them in the line.

    For a port that names the line end to meet it (``calc.model.PORT``), the
    adapter plan of ``calc.threads.plan_for_port`` is made; its adapters become
    fitting parts at the start (``from_port``) or end (``to_port``) of the line,
    so they count in the hydraulics (as restrictions) and in the weakest-part
    check. Every part of the evaluated line carries ``job_part``: its index in
    the user's list, or ``None`` for an adapter from a port plan (with
    ``adapter`` naming it). A plan that does not seal is a failed ``ports``
    check with the reason, not an input error: the rest of the job still
    evaluates.

    Returns
    -------
    list of dict
        Per line: ``{"from_port": plan or None, "to_port": plan or None}``.
    """
    from . import threads
    from .model import PART
    from .schema import validate

    out = []
    for ln in job["lines"]:
        parts = [dict(p, job_part=k) for k, p in enumerate(ln["parts"])]
        plans = {}
        for end in ("from_port", "to_port"):
            plan = threads.plan_for_port(ln[end])
            plans[end] = plan
            if not plan or not plan["ok"]:
                continue
            label = (ln[end].get("label") or ("start port" if end == "from_port" else "end port"))
            added = []
            for a, raw in zip(plan["adapters"], threads.adapter_parts(plan)):
                norm, problems, _ = validate(PART, raw)
                if problems:  # pragma: no cover - adapter_parts emits valid parts (tested in threads)
                    continue
                norm.update(job_part=None, adapter=f"{label}: {a['name']}")
                added.append(norm)
            parts = added + parts if end == "from_port" else parts + added
        ln["parts"] = parts
        out.append(plans)
    return out


def port_checks(plans: list[dict], job: dict) -> list[list[dict]]:
    """A ``ports`` check per line end that names a port plan."""
    out = []
    for ln, pl in zip(job["lines"], plans):
        checks = []
        for end, word in (("from_port", "start"), ("to_port", "end")):
            plan = pl[end]
            if plan is None:
                continue
            label = ln[end].get("label") or f"{word} port"
            if not plan["ok"]:
                checks.append(_check("ports", "fail", f"{label}: {plan['message']}"))
            elif plan["adapters"]:
                checks.append(_check("ports", "ok", f"{label}: {plan['message']}".strip()))
            else:
                checks.append(_check("ports", "ok", f"{label}: the line end fits the port directly. "
                                                    f"{plan['message']}".strip()))
        out.append(checks)
    return out


def lowest_part_limit(lines: list[dict]) -> tuple[float, str] | None:
    """The lowest temperature limit of any rated part, with its description, or None."""
    best = None
    for ln in lines:
        for p in (ln.get("rating") or {}).get("parts", []):
            if p.get("max_temp_c") is not None and (best is None or p["max_temp_c"] < best[0]):
                best = (p["max_temp_c"], f"{ln['name']} part {p['index']} ({p['description']})")
    return best


def steady_part_checks(lines: list[dict], conditions: list[dict], thermal_section: dict) -> None:
    """Check each part's temperature limit against the steady fluid temperature too.

    The ratings stage judges the operating points' own temperatures; when the
    thermal stage finds the fluid settles hotter than any of them, each rated
    part's limit is checked against that steady temperature as well.
    """
    t = thermal_section.get("steady_temp_c") if thermal_section else None
    if t is None or not conditions or t <= max(c["fluid_temp_c"] for c in conditions):
        return
    for ln in lines:
        rating = ln.get("rating") or {}
        over = [p for p in rating.get("parts", []) if p.get("max_temp_c") is not None and p["max_temp_c"] < t]
        if over:
            names = ", ".join(f"part {p['index']} ({p['description']}, {p['max_temp_c']:g} C)" for p in over)
            ln["checks"].append(_check("temperature (steady)", "fail",
                                       f"add or enlarge a cooler, or use parts rated hotter: the fluid settles "
                                       f"at {t:.0f} C for this duty cycle, above the limit of {names}"))


def validity_warnings(circuit: Circuit, conditions: list[dict]) -> list[Problem]:
    """Inputs outside the validity range of a method: warnings, not errors."""
    out = []
    for ln in circuit.lines:
        for s in ln["segs"]:
            path = f"lines[{ln['index']}].parts[{s.index}]"
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


def finite(obj):
    """Replace non-finite floats by None so a result is valid JSON.

    Never expected (the fuzz tests check that ``evaluate`` gives only finite
    numbers); the JSON edges (``calc.api``, the command line) fall back to it
    if encoding with ``allow_nan=False`` ever fails, rather than emit NaN.
    """
    if isinstance(obj, float):
        return obj if math.isfinite(obj) else None
    if isinstance(obj, dict):
        return {k: finite(v) for k, v in obj.items()}
    if isinstance(obj, list):
        return [finite(v) for v in obj]
    return obj


def sweep(job) -> dict:
    """Hydraulics only, at each of the job's operating points: the cheap call behind the page's plots.

    Validation, part data and ports as ``evaluate``; then every operating point
    is solved without per-part detail, and neither the ratings nor the thermal
    stage runs. The page sends the job with a sweep of temperatures as its
    conditions to plot pressure drop against fluid temperature.

    Returns
    -------
    dict
        ``{"ok": True, "lines": [{"name", "role"}], "conditions": [{"name",
        "fluid_temp_c", "pump_outlet_bar", "pump_inlet_bar", "circuit_flow_lpm",
        "lines": [{"pressure_drop_bar", ...}]}]}`` or the errors as in ``evaluate``.
    """
    circuit, norm, problems, warnings, _ = build(job)
    if problems:
        return {"ok": False, "errors": [p.as_dict() for p in problems],
                "warnings": [w.as_dict() for w in warnings]}
    conds = [circuit.operating_point(c, detail=False) for c in norm["conditions"]]
    return {"ok": True, "lines": [{"name": ln["name"], "role": ln["role"]} for ln in circuit.lines],
            "conditions": [{k: c[k] for k in ("name", "fluid_temp_c", "viscosity_cst", "pump_outlet_bar",
                                              "pump_inlet_bar", "circuit_flow_lpm", "lines")} for c in conds]}


def evaluate(job) -> dict:
    """Evaluate a job.

    Parameters
    ----------
    job : dict
        A job document (see ``calc.model``), as parsed from JSON.

    Returns
    -------
    result : dict
        ``{"ok": False, "errors": [{"path", "message"}], "warnings": [...]}``
        for an invalid job; otherwise ``{"ok": True, "job_name", "fluid",
        "conditions": [...], "lines": [...], "warnings": [...],
        "methods": [...]}``, every figure in SI or with its unit in the key.

    Examples
    --------
    >>> import json, importlib.resources as ir
    >>> demo = json.loads((ir.files("calc") / "data" / "demos" / "compact-hatch.json").read_text())
    >>> r = evaluate(demo)
    >>> r["ok"], len(r["conditions"]) > 0
    (True, True)
    """
    circuit, norm, problems, warnings, plans = build(job)
    if problems:
        return {"ok": False, "errors": [p.as_dict() for p in problems],
                "warnings": [w.as_dict() for w in warnings]}
    from . import ratings, thermal
    conditions = [circuit.operating_point(c) for c in norm["conditions"]]
    checks = hydraulic_checks(circuit, conditions)
    warnings.extend(validity_warnings(circuit, conditions))
    pchecks = port_checks(plans, norm)
    lines = [{"index": ln["index"], "name": ln["name"], "role": ln["role"],
              "checks": pchecks[ln["index"]] + checks[ln["index"]],
              "ports": {"from_port": plans[ln["index"]]["from_port"], "to_port": plans[ln["index"]]["to_port"]},
              "parts": [{"index": k, "job_part": p.get("job_part"), "adapter": p.get("adapter"), "kind": p["kind"]}
                        for k, p in enumerate(ln["parts"])]}
             for ln in circuit.lines]
    # -- stage: ratings (calc.ratings.assess adds lines[j].rating, checks and candidates) --
    warnings.extend(ratings.assess(circuit, conditions, lines, norm))
    # -- stage: thermal (calc.thermal.assess adds conditions[i].heat_w and result["thermal"]) --
    thermal_section = thermal.assess(circuit, conditions, part_limit=lowest_part_limit(lines))
    steady_part_checks(lines, conditions, thermal_section)
    for c in conditions:
        if c["relief_open"] and not c["full_lock"]:
            warnings.append(Problem("conditions", f"at '{c['name']}' the circuit drop at neutral reaches the "
                                                  "relief setting: the relief is open and the lines carry "
                                                  "only part of the pump's flow"))
    fl = circuit.fluid
    result = {
        "ok": True,
        "job_name": norm["name"],
        "fluid": {k: fl[k] for k in ("name", "preset", "visc_40c_cst", "visc_100c_cst", "density_15c_kg_m3",
                                     "specific_heat_j_kgk", "max_temp_c", "source")},
        "conditions": conditions,
        "lines": lines,
        "thermal": thermal_section,
        "warnings": [w.as_dict() for w in warnings],
        "methods": [
            "Friction: 64/Re below Re 2000; Colebrook (Clamond's solution) above 4000; linear in Re between.",
            "Fittings: Darby 3-K; bends: Rennels less arc friction; bore changes: Hooper sharp contraction "
            "and expansion; reservoir entrance: 160/Re plus the turbulent entrance coefficient; exit: K = 2 "
            "laminar, 1 turbulent.",
            "Gear valve drop scaled as flow squared from its stated neutral drop.",
        ],
    }
    return result
