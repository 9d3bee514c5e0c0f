"""The circuit at one operating point: pump flow, relief, node pressures along every line.

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

from dataclasses import dataclass

from ..model.fluid import state_of
from ..physics.pump import delivered_flow_m3_s
from .line import compile_line, line_flow

__all__ = ["LPM", "BAR", "CompiledLine", "Circuit", "solve_flow"]

LPM = 1.0 / 60000.0  # m^3/s per L/min
BAR = 1e5


@dataclass(frozen=True)
class CompiledLine:
    """A line as built (port adapters included) and compiled: ``index``, display ``name``, ``role``,
    ``parts`` in flow order and their ``segs``."""

    index: int
    name: str
    role: str
    parts: tuple
    segs: tuple


def solve_flow(f, q_hi: float) -> float:
    """Root of the increasing function ``f`` on [0, q_hi] by bisection (f(0) < 0 < f(q_hi)).

    Examples
    --------
    >>> round(solve_flow(lambda q: q * q - 2.0, 2.0), 6)
    1.414214
    """
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


class Circuit:
    """A prepared job's circuit, compiled once for repeated operating points.

    Parameters
    ----------
    job : calc.model.prepared.PreparedJob
        The prepared job.
    built_parts : sequence of sequences of Part
        Each line's parts in flow order as built, port adapters included (the ports stage).
    """

    def __init__(self, job, built_parts):
        self.job = job
        self.fluid = job.fluid
        self.pump = job.pump
        self.gear = job.gear
        self.lines = tuple(CompiledLine(ln.index, ln.name, ln.role, tuple(parts), tuple(compile_line(parts)))
                           for ln, parts in zip(job.lines, built_parts))
        self.by_role = {r: [ln for ln in self.lines if ln.role == r] for r in ("pressure", "return", "feed")}

    # -- pieces --------------------------------------------------------------
    def state(self, t_c: float):
        """The fluid's state at ``t_c`` [C]."""
        return state_of(self.fluid, t_c)

    def pump_flow(self, engine_rpm: float) -> tuple[float, float, bool]:
        """Delivered flow, flow before the flow control [m^3/s], and whether the flow control limits."""
        p = self.pump
        return delivered_flow_m3_s(p["displacement_cc_rev"], engine_rpm, p["pulley_ratio"],
                                   p["volumetric_efficiency"], p["flow_limit_lpm"] * LPM)

    def gear_drop_pa(self, q_m3_s: float) -> float:
        """The gear valve's drop at neutral, scaled as flow squared from its stated point, [Pa]."""
        q0 = self.gear["at_flow_lpm"] * LPM
        return self.gear["neutral_drop_bar"] * BAR * (q_m3_s / q0) ** 2

    def circuit_drop_pa(self, q_m3_s: float, st, per_line: dict | None = None) -> float:
        """Pump outlet gauge pressure needed to push ``q_m3_s`` round at neutral, Pa.

        ``per_line``, if given, receives each pressure and return line's drop by line index.
        """
        total = self.gear_drop_pa(q_m3_s)
        for role in ("pressure", "return"):
            for ln in self.by_role[role]:
                dp = line_flow(ln.segs, q_m3_s, st.nu_m2_s, st.rho_kg_m3, detail=False)[0]
                total += dp
                if per_line is not None:
                    per_line[ln.index] = dp
        return total

    # -- an operating point ----------------------------------------------------
    def _flows(self, cond: dict, st) -> tuple:
        """(pump flow, uncapped, capped, line flow, relief flow, outlet pressure, relief open, drops)."""
        relief_pa = self.pump["relief_bar"] * BAR
        q_pump, q_uncapped, capped = self.pump_flow(cond["engine_rpm"])
        dps: dict = {}
        if cond["full_lock"]:
            self.circuit_drop_pa(0.0, st, dps)
            return q_pump, q_uncapped, capped, 0.0, q_pump, relief_pa, True, dps
        p_out = self.circuit_drop_pa(q_pump, st, dps)
        if p_out <= relief_pa:
            return q_pump, q_uncapped, capped, q_pump, 0.0, p_out, False, dps
        q_lines = solve_flow(lambda q: self.circuit_drop_pa(q, st) - relief_pa, q_pump)
        self.circuit_drop_pa(q_lines, st, dps)
        return q_pump, q_uncapped, capped, q_lines, q_pump - q_lines, relief_pa, True, dps

    def operating_point(self, cond, t_c: float | None = None, detail: bool = True) -> dict:
        """Solve one operating point.

        Parameters
        ----------
        cond : mapping
            A validated condition (name, engine_rpm, fluid_temp_c, full_lock).
        t_c : float, optional
            Fluid temperature to use instead of the condition's own [C]
            (the thermal solver calls this with trial temperatures).
        detail : bool
            Include per-part and per-node results.
        """
        t = cond["fluid_temp_c"] if t_c is None else t_c
        st = self.state(t)
        q_pump, q_uncapped, capped, q_lines, q_relief, p_out, relief_open, dps = self._flows(cond, st)
        res = {"name": cond["name"], "engine_rpm": cond["engine_rpm"], "fluid_temp_c": t,
               "full_lock": cond["full_lock"], "viscosity_cst": st.nu_m2_s * 1e6,
               "density_kg_m3": st.rho_kg_m3, "pump_flow_lpm": q_pump / LPM,
               "pump_flow_uncapped_lpm": q_uncapped / LPM, "flow_control_limiting": capped,
               "circuit_flow_lpm": q_lines / LPM, "relief_flow_lpm": q_relief / LPM,
               "relief_open": relief_open, "pump_outlet_bar": p_out / BAR,
               "gear_drop_bar": (0.0 if cond["full_lock"] else self.gear_drop_pa(q_lines)) / BAR}
        lines_out = [None] * len(self.lines)
        p = p_out  # pressure side: node pressures from the pump outlet forward
        for ln in self.by_role["pressure"]:
            lines_out[ln.index] = r = self._line(ln, q_lines, st, p, detail, dps[ln.index])
            p = r["outlet_bar"] * BAR
        p = 0.0  # return side: node pressures from the reservoir (0 bar) backward
        for ln in reversed(self.by_role["return"]):
            dp = dps[ln.index]
            lines_out[ln.index] = self._line(ln, q_lines, st, p + dp, detail, dp)
            p += dp
        res["gear_outlet_bar"] = p / BAR
        p = 0.0  # feed side: from the reservoir (0 bar) forward to the pump inlet
        for ln in self.by_role["feed"]:
            lines_out[ln.index] = r = self._line(ln, q_lines, st, p, detail)
            p = r["outlet_bar"] * BAR
        res["pump_inlet_bar"] = p / BAR
        res["has_feed_line"] = bool(self.by_role["feed"])
        res["lines"] = lines_out
        return res

    def _line(self, ln: CompiledLine, q: float, st, p_in_pa: float, detail: bool, dp: float | None = None) -> dict:
        if not detail:  # the thermal iteration needs only the drops
            if dp is None:
                dp = line_flow(ln.segs, q, st.nu_m2_s, st.rho_kg_m3, detail=False)[0]
            return {"index": ln.index, "name": ln.name, "role": ln.role, "flow_lpm": q / LPM,
                    "pressure_drop_bar": dp / BAR, "inlet_bar": p_in_pa / BAR, "outlet_bar": (p_in_pa - dp) / BAR}
        dp, parts = line_flow(ln.segs, q, st.nu_m2_s, st.rho_kg_m3, detail=True)
        velocities = [pt["velocity_m_s"] for pt in parts if pt["kind"] != "device"]
        res_ = [pt["reynolds"] for pt in parts if pt["kind"] != "device" and pt["reynolds"] > 0]
        rhocp = st.rho_kg_m3 * st.cp_j_kgk
        out = {"index": ln.index, "name": ln.name, "role": ln.role, "flow_lpm": q / LPM,
               "velocity_max_m_s": max(velocities, default=0.0),
               "reynolds_min": min(res_, default=0.0), "reynolds_max": max(res_, default=0.0),
               "pressure_drop_bar": dp / BAR, "inlet_bar": p_in_pa / BAR, "outlet_bar": (p_in_pa - dp) / BAR,
               "temp_rise_c": max(dp - sum(pt["elevation_pa"] for pt in parts), 0.0) / rhocp,
               "transitional": any(pt["regime"] == "transitional" for pt in parts)}
        out["parts"], out["nodes"] = self._part_rows(ln, parts, p_in_pa, rhocp)
        return out

    @staticmethod
    def _part_rows(ln: CompiledLine, parts: list, p_in_pa: float, rhocp: float) -> tuple[list, list]:
        nodes = [{"after_part": -1, "pressure_bar": p_in_pa / BAR}]
        p = p_in_pa
        rows = []
        for pt in parts:
            p -= pt["dp_pa"]
            nodes.append({"after_part": pt["index"], "pressure_bar": p / BAR})
            src = ln.parts[pt["index"]]
            rows.append({"index": pt["index"], "job_part": src.place, "adapter": src.adapter, "kind": pt["kind"],
                         "velocity_m_s": pt["velocity_m_s"],
                         "reynolds": pt["reynolds"], "regime": pt["regime"],
                         "friction_factor": pt["friction_factor"], "k_minor": pt["k_minor"],
                         "pressure_drop_bar": pt["dp_pa"] / BAR,
                         "friction_bar": pt["friction_pa"] / BAR, "minor_bar": pt["minor_pa"] / BAR,
                         "transition_bar": pt["transition_pa"] / BAR,
                         "elevation_bar": pt["elevation_pa"] / BAR,
                         "temp_rise_c": max(pt["dp_pa"] - pt["elevation_pa"], 0.0) / rhocp})
        return rows, nodes
