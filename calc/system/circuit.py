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
* a feed line that cannot pass the circuit flow with the pump inlet above its limit
  (``calc.data.practice.INLET_MIN_BAR``) starves the pump: the circuit then gets only the
  flow the feed line passes at the limit; no pressure is reported below a vacuum
  (``INLET_FLOOR_BAR``);
* the pump delivers its displacement x pump speed x volumetric efficiency, capped by the
  flow control: the flat setting, or the pump's flow table read at the pump's speed;
* the pump works against its outlet pressure plus the flow-control valve's metering
  drop, which scales as flow squared below the flow-control setting (the table's flow at
  that speed, with a table).
* the gear valve at neutral is an orifice whose loss rises when the fluid is
  cold (``calc.physics.valve``), fitted to its measured point (or two points).
"""
from __future__ import annotations

import copy
import dataclasses
import itertools
from dataclasses import dataclass

from fluids.numerics import brenth

from ..data.practice import INLET_FLOOR_BAR, INLET_MIN_BAR
from ..model.fluid import state_of
from ..model.job_rules import gear_constants
from ..physics.pump import delivered_flow_m3_s, geometric_flow_m3_s, metering_drop_pa
from ..physics.tabulated import interpolate_flat
from ..physics.valve import valve_drop_pa
from .line import compile_line, line_flow

__all__ = ["LPM", "BAR", "CompiledLine", "Circuit", "solve_flow"]

LPM = 1.0 / 60000.0  # m^3/s per L/min
BAR = 1e5


_KEYS = itertools.count()


@dataclass(frozen=True, eq=False)
class CompiledLine:
    """A line as built (port adapters included) and compiled: ``index``, display ``name``, ``role``,
    ``parts`` in flow order and their ``segs``; ``key`` tells compiled lines apart in the drop memo."""

    index: int
    name: str
    role: str
    parts: tuple
    segs: tuple
    key: int = dataclasses.field(default_factory=lambda: next(_KEYS))


def solve_flow(f, q_hi: float) -> float:
    """Root of the increasing function ``f`` on [0, q_hi] (f(0) < 0 < f(q_hi)), to 1e-9 of ``q_hi``.

    Brent's method with hyperbolic extrapolation (``fluids.numerics.brenth``, a pure-Python port of
    SciPy's): bracketed like bisection, so it cannot leave [0, q_hi], and in about a tenth of the
    evaluations. Returns 0 when ``f(0) >= 0`` and ``q_hi`` when ``f(q_hi) <= 0``.

    Examples
    --------
    >>> round(solve_flow(lambda q: q * q - 2.0, 2.0), 6)
    1.414214
    """
    f_lo = f(0.0)
    if f_lo >= 0.0:
        return 0.0
    f_hi = f(q_hi)
    if f_hi <= 0.0:
        return q_hi
    return brenth(f, 0.0, q_hi, xtol=1e-9 * q_hi, rtol=1e-12, fa=f_lo, fb=f_hi)


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
        self.gear_a, self.gear_b = gear_constants(job.gear, job.fluid)
        self._memo: dict = {}
        self._set_lines(tuple(CompiledLine(ln.index, ln.name, ln.role, tuple(parts), tuple(compile_line(parts)))
                              for ln, parts in zip(job.lines, built_parts)))

    def _set_lines(self, lines) -> None:
        self.lines = lines
        self.by_role = {r: [ln for ln in self.lines if ln.role == r] for r in ("pressure", "return", "feed")}

    def with_line(self, j: int, parts, segs=None) -> "Circuit":
        """The same circuit with line ``j`` built from ``parts`` (compiled as ``segs``, when given) instead: a
        candidate assembly. The other lines' drops already computed are shared, not computed again."""
        clone = copy.copy(self)
        old = self.lines[j]
        segs = tuple(compile_line(parts)) if segs is None else tuple(segs)
        clone._set_lines(tuple(CompiledLine(old.index, old.name, old.role, tuple(parts), segs)
                               if ln.index == j else ln for ln in self.lines))
        return clone

    def _drop(self, ln: CompiledLine, q_m3_s: float, st) -> float:
        key = (ln.key, q_m3_s, st.nu_m2_s, st.rho_kg_m3)
        dp = self._memo.get(key)
        if dp is None:
            dp = self._memo[key] = line_flow(ln.segs, q_m3_s, st.nu_m2_s, st.rho_kg_m3, detail=False)[0]
        return dp

    # -- pieces --------------------------------------------------------------
    def state(self, t_c: float):
        """The fluid's state at ``t_c`` [C] (kept: the candidates and the thermal iteration ask again)."""
        key = ("state", t_c)
        st = self._memo.get(key)
        if st is None:
            st = self._memo[key] = state_of(self.fluid, t_c)
        return st

    def flow_limit_m3_s(self, engine_rpm: float) -> float:
        """The most the flow control lets out at ``engine_rpm``: the pump's flow table read at its speed
        (``calc.physics.tabulated.interpolate_flat``), else the flat flow-control setting, [m^3/s]."""
        p = self.pump
        table = p.get("flow_table_rpm_lpm")
        if table:
            return interpolate_flat(table, engine_rpm * p["pulley_ratio"]) * LPM
        return p["flow_limit_lpm"] * LPM

    def pump_flow(self, engine_rpm: float) -> tuple[float, float, bool]:
        """Delivered flow, flow before the flow control [m^3/s], and whether the flow control limits."""
        p = self.pump
        return delivered_flow_m3_s(p["displacement_cc_rev"], engine_rpm, p["pulley_ratio"],
                                   p["volumetric_efficiency"], self.flow_limit_m3_s(engine_rpm))

    def gear_drop_pa(self, q_m3_s: float, st) -> float:
        """The gear valve's drop at neutral (``calc.physics.valve``: laminar and inertial parts), [Pa]."""
        return valve_drop_pa(q_m3_s, st.nu_m2_s, st.rho_kg_m3, self.gear_a, self.gear_b)

    def circuit_drop_pa(self, q_m3_s: float, st, per_line: dict | None = None) -> float:
        """Pump outlet gauge pressure needed to push ``q_m3_s`` round at neutral, Pa.

        ``per_line``, if given, receives each pressure and return line's drop by line index.
        """
        total = self.gear_drop_pa(q_m3_s, st)
        for role in ("pressure", "return"):
            for ln in self.by_role[role]:
                dp = self._drop(ln, q_m3_s, st)
                total += dp
                if per_line is not None:
                    per_line[ln.index] = dp
        return total

    def feed_inlet_pa(self, q_m3_s: float, st) -> float:
        """Pump inlet gauge pressure with ``q_m3_s`` drawn through the feed lines from the reservoir, Pa."""
        p = 0.0
        for ln in self.by_role["feed"]:
            p -= self._drop(ln, q_m3_s, st)
        return p

    def _starved_flow(self, q_m3_s: float, st) -> float | None:
        """The flow the feed lines pass with the inlet at its limit, when ``q_m3_s`` would take it lower."""
        limit = INLET_MIN_BAR * BAR
        if not self.by_role["feed"] or self.feed_inlet_pa(q_m3_s, st) >= limit:
            return None
        if self.feed_inlet_pa(0.0, st) < limit:
            return 0.0
        # The inlet falls with the flow, so the flow at the limit is one root whatever the flow asked for: kept
        # per feed lines and fluid state (a candidate on another line finds it again), found with the pump's
        # own flow as the bracket's top.
        key = ("starved", tuple(ln.key for ln in self.by_role["feed"]), st.nu_m2_s, st.rho_kg_m3)
        root = self._memo.get(key)
        if root is None or root >= q_m3_s:
            root = self._memo[key] = solve_flow(lambda q: limit - self.feed_inlet_pa(q, st), q_m3_s)
        return root

    # -- an operating point ----------------------------------------------------
    def _flows(self, cond, st) -> dict:
        """Pump and circuit flows, outlet pressure and relief at an operating point, starvation included."""
        relief_pa = self.pump["relief_bar"] * BAR
        q_pump, q_uncapped, capped = self.pump_flow(cond["engine_rpm"])
        f = {"q_pump": q_pump, "q_uncapped": q_uncapped, "capped": capped, "q_relief": 0.0, "relief_open": False,
             "need_pa": self.circuit_drop_pa(q_pump, st), "starved_q": None}
        if cond["full_lock"]:
            f.update(q_lines=0.0, q_relief=q_pump, p_out=relief_pa, relief_open=True)
        elif f["need_pa"] <= relief_pa:
            f.update(q_lines=q_pump, p_out=f["need_pa"])
        else:
            q_lines = solve_flow(lambda q: self.circuit_drop_pa(q, st) - relief_pa, q_pump)
            f.update(q_lines=q_lines, q_relief=q_pump - q_lines, p_out=relief_pa, relief_open=True)
        f["q_demand"] = f["q_lines"]
        starved = self._starved_flow(f["q_lines"], st)
        if starved is not None:
            f["starved_q"] = starved
            if not cond["full_lock"]:
                f.update(q_lines=starved, q_relief=0.0, relief_open=False, p_out=self.circuit_drop_pa(starved, st))
        return f

    def operating_point(self, cond, t_c: float | None = None, detail: bool = True) -> dict:
        """Solve one operating point.

        Parameters
        ----------
        cond : mapping
            A validated condition (name, engine_rpm, fluid_temp_c, full_lock).
        t_c : float, optional
            Fluid temperature to use instead of the condition's own [C]
            (the thermal solver calls this with trial temperatures).
        detail : bool or int
            Include per-part and per-node results: for every line (True), none (False); or an index:
            the result of that line only, with its detail (the other lines' entries are None).
        """
        t = cond["fluid_temp_c"] if t_c is None else t_c
        st = self.state(t)
        f = self._flows(cond, st)
        q_lines, p_out = f["q_lines"], f["p_out"]
        dps: dict = {}
        self.circuit_drop_pa(q_lines, st, dps)
        p = self.pump
        metering = metering_drop_pa(p["metering_drop_bar"] * BAR, q_lines, self.flow_limit_m3_s(cond["engine_rpm"]))
        res = {"name": cond["name"], "engine_rpm": cond["engine_rpm"], "fluid_temp_c": t,
               "full_lock": cond["full_lock"], "viscosity_cst": st.nu_m2_s * 1e6,
               "density_kg_m3": st.rho_kg_m3,
               "pump_geometric_lpm": geometric_flow_m3_s(p["displacement_cc_rev"], cond["engine_rpm"],
                                                         p["pulley_ratio"]) / LPM,
               "pump_flow_lpm": f["q_pump"] / LPM,
               "pump_flow_uncapped_lpm": f["q_uncapped"] / LPM, "flow_control_limiting": f["capped"],
               "circuit_flow_lpm": q_lines / LPM, "demand_flow_lpm": f["q_demand"] / LPM,
               "relief_flow_lpm": f["q_relief"] / LPM, "relief_open": f["relief_open"],
               "circuit_need_bar": f["need_pa"] / BAR, "pump_outlet_bar": p_out / BAR,
               "metering_drop_bar": metering / BAR, "pump_internal_bar": (p_out + metering) / BAR,
               "gear_drop_bar": (0.0 if cond["full_lock"] else self.gear_drop_pa(q_lines, st)) / BAR}
        res.update(self._line_results(q_lines, st, p_out, dps, detail))
        res["pump_starved"] = f["starved_q"] is not None
        res["feed_limit_flow_lpm"] = None if f["starved_q"] is None else f["starved_q"] / LPM
        return res

    def _line_results(self, q_lines: float, st, p_out: float, dps: dict, detail) -> dict:
        only = None if isinstance(detail, bool) else detail  # one line's result only (a candidate's)

        def put(ln, p_in_pa, dp):
            if only is None or ln.index == only:
                lines_out[ln.index] = self._line(ln, q_lines, st, p_in_pa, detail if only is None else True, dp)
            return p_in_pa - dp
        lines_out = [None] * len(self.lines)
        p = p_out  # pressure side: node pressures from the pump outlet forward
        for ln in self.by_role["pressure"]:
            p = put(ln, p, dps[ln.index])
        p = 0.0  # return side: node pressures from the reservoir (0 bar) backward
        for ln in reversed(self.by_role["return"]):
            dp = dps[ln.index]
            put(ln, p + dp, dp)
            p += dp
        out = {"gear_outlet_bar": p / BAR}
        p = 0.0  # feed side: from the reservoir (0 bar) forward to the pump inlet
        for ln in self.by_role["feed"]:
            p = put(ln, p, self._drop(ln, q_lines, st))
        out["pump_inlet_bar"] = max(p / BAR, INLET_FLOOR_BAR)
        out["has_feed_line"] = bool(self.by_role["feed"])
        out["lines"] = lines_out
        return out

    def _line(self, ln: CompiledLine, q: float, st, p_in_pa: float, detail: bool, dp: float | None = None) -> dict:
        if not detail:  # the thermal iteration needs only the drops
            if dp is None:
                dp = self._drop(ln, q, st)
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
