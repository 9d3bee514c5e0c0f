"""Heat generated and rejected by the circuit, at any trial fluid temperature.

The model (stated assumptions; the sentences are repeated in ``thermal.method`` of the result):

* the steering does no net work, so all the hydraulic power the pump puts
  into the fluid becomes heat in the fluid: the pump raises its whole geometric
  flow (displacement x pump speed) from its inlet pressure to the pressure it
  works against (outlet plus the flow-control metering drop; the relief setting
  at full lock): the internal leakage, the flow the flow control recirculates or
  the relief passes, and the flow through the circuit and the feed line
  (``calc.physics.pump.pump_heat_w``); a starved pump has no excess to recirculate;
* with ``pump.overall_efficiency`` given, the mechanical (friction) losses on
  top of that hydraulic input, with mechanical = overall / volumetric efficiency,
  are added in full to the fluid (conservative: part of them leaves through the
  pump body and the belt); the leakage is not counted again;
* every line part that is a hose or a tube rejects heat from its outer
  surface to the air around it: inside film, wall conduction and outside film
  in series; fittings and devices are not counted (small surfaces). That air is
  the part's own ``local_air_temp_c`` (a part routed near an exhaust manifold or
  turbo) or else the job's under-hood air; a part in air hotter than the fluid
  gains heat (a negative rejection). Radiation from a hot surface nearby is not
  modelled. The cooler and the reservoir are in the job's under-hood air;
* the fluid in a part is taken at the bulk temperature and the part rejects
  ``C (1 - exp(-UA/C)) (T - T_air)`` with ``C`` the fluid's capacity rate
  (effectiveness-NTU with the air as an infinite reservoir, Cr = 0), so a
  line without flow (full lock) rejects nothing.

References
----------
.. [1] Bergman, T. L., Lavine, A. S., Incropera, F. P., DeWitt, D. P.
   Fundamentals of Heat and Mass Transfer, 7th ed. Wiley, 2011 (effectiveness-NTU).
"""
from __future__ import annotations

import math

from ht import effectiveness_from_NTU

from ..data.tables import tube_materials, typical_hose_walls
from ..physics.convection import h_inside_pipe
from ..physics.heat import cylinder_ua_per_m
from ..physics.pump import mechanical_loss_w, pump_heat_w
from ..physics.tabulated import interpolate_flat
from .circuit import BAR, LPM
from .line import part_bore_mm

__all__ = ["default_hose_wall_mm", "line_surface", "ThermalModel"]


def default_hose_wall_mm(bore_mm: float) -> float:
    """Typical hose wall thickness for a bore, [mm] (``calc/data/hoses.json``, from memory).

    Linear between the table's bores, held constant beyond its ends.

    Examples
    --------
    The table's 9.5 mm row, and its largest bore's wall beyond the table (table values, from memory):

    >>> default_hose_wall_mm(9.5), default_hose_wall_mm(100.0)
    (4.6, 6.3)
    """
    return interpolate_flat([(r["bore_mm"], r["wall_mm"]) for r in typical_hose_walls()], bore_mm)


def line_surface(p, th) -> dict | None:
    """The heat-exchanging surface of a hose or tube part; None for any other part.

    Parameters
    ----------
    p : mapping
        A prepared part (``kind``, bore, ``length_m``, ``roughness_mm``, a tube's ``od_mm`` and material,
        a hose's ``wall_mm``, ``local_air_temp_c``).
    th : mapping
        The job's thermal settings (``air_temp_c``, ``hose_conductivity_w_mk``).

    Returns
    -------
    dict or None
        ``d_i``, ``d_o`` [m], wall conductivity ``k`` [W/(m K)], ``length`` [m], relative roughness
        ``eD``, the air around it ``t_air`` [C] (its own, else the job's), ``local`` (its own or None)
        and ``wall_defaulted`` (a hose wall taken from the typical table).

    Examples
    --------
    A tube in its own 180 C air (low-carbon steel, 50 W/(m K) in the material table, from memory):

    >>> s = line_surface({"kind": "tube", "od_mm": 10.0, "wall_mm": 1.0, "length_m": 0.5,
    ...                   "roughness_mm": 0.0015, "material": "steel-low-carbon", "local_air_temp_c": 180.0},
    ...                  {"air_temp_c": 50.0, "hose_conductivity_w_mk": 0.25})
    >>> round(s["d_i"], 6), s["k"], s["t_air"], s["local"]
    (0.008, 50.0, 180.0, 180.0)
    """
    kind = p["kind"]
    if kind not in ("hose", "tube"):
        return None
    d_i = part_bore_mm(p) * 1e-3
    defaulted = False
    if kind == "hose":
        wall = p.get("wall_mm")
        if wall is None:
            wall, defaulted = default_hose_wall_mm(d_i * 1e3), True
        k_wall = th["hose_conductivity_w_mk"]
        d_o = d_i + 2.0 * wall * 1e-3
    else:
        d_o = p["od_mm"] * 1e-3
        k_wall = tube_materials()[p.get("material") or "steel-low-carbon"]["conductivity_w_mk"]
    local = p.get("local_air_temp_c")
    return {"kind": kind, "d_i": d_i, "d_o": d_o, "k": k_wall, "length": p["length_m"],
            "eD": p["roughness_mm"] * 1e-3 / d_i, "t_air": th["air_temp_c"] if local is None else local,
            "local": local, "wall_defaulted": defaulted}


def _user_index(part, k: int) -> int:
    """The part's index in the user's list; a planned adapter keeps its place in the built line."""
    return k if part.place is None else part.place


class ThermalModel:
    """Heat generated and rejected by a compiled ``calc.system.circuit.Circuit``.

    Parameters
    ----------
    circuit : calc.system.circuit.Circuit
        The compiled circuit.
    cooler : mapping, optional
        Overrides the job's ``thermal.cooler`` record (for advice and tests).
    """

    def __init__(self, circuit, cooler=None):
        self.circuit = circuit
        th = circuit.job.thermal
        self.th = th
        self.t_air_c = th["air_temp_c"]
        self.cooler = dict(th["cooler"] if cooler is None else cooler)
        self.eta_o = circuit.pump.get("overall_efficiency")
        self.eta_v = circuit.pump["volumetric_efficiency"]
        self.surfaces = []
        self.volume_m3 = th["other_volume_l"] * 1e-3
        self.notes = []
        for ln in circuit.lines:
            for k, p in enumerate(ln.parts):
                self._add_part(ln, k, p)
        #: The coolest air any surface sits in, [C]: no steady temperature lies below it.
        self.t_air_min_c = min([self.t_air_c] + [s["t_air"] for s in self.surfaces])

    def _add_part(self, ln, k: int, p) -> None:
        surface = line_surface(p, self.th)
        if surface is not None:
            if surface["wall_defaulted"]:
                self.notes.append(f"lines[{ln.index}].parts[{_user_index(p, k)}].wall_mm")
            self.surfaces.append(dict(surface, line=ln.index, part=k))
            self.volume_m3 += 0.25 * math.pi * surface["d_i"] * surface["d_i"] * p["length_m"]
        elif p["kind"] == "fitting":
            self.volume_m3 += 0.25 * math.pi * (p["bore_mm"] * 1e-3) ** 2 * p.get("passage_length_mm", 25.0) * 1e-3

    # -- heat generated ------------------------------------------------------------
    def heat_detail(self, op: dict) -> dict:
        """Heat generated at a solved operating point by where it arises [W]: ``leakage_w``, ``bypass_w``
        (flow control and relief), ``circuit_w`` (metering, lines, gear, feed) and ``mechanical_w``."""
        leak, bypass, circuit = pump_heat_w(op["pump_geometric_lpm"] * LPM, op["pump_flow_uncapped_lpm"] * LPM,
                                            op["circuit_flow_lpm"] * LPM, op["pump_internal_bar"] * BAR,
                                            op["pump_inlet_bar"] * BAR, op["pump_starved"])
        hydraulic = leak + bypass + circuit
        mech = mechanical_loss_w(hydraulic, self.eta_o / self.eta_v) if self.eta_o else 0.0
        return {"leakage_w": leak, "bypass_w": bypass, "circuit_w": circuit, "mechanical_w": mech}

    def heat(self, op: dict) -> tuple[float, float]:
        """(hydraulic heat, mechanical losses) [W] of a solved operating point."""
        d = self.heat_detail(op)
        return d["leakage_w"] + d["bypass_w"] + d["circuit_w"], d["mechanical_w"]

    # -- heat rejected ------------------------------------------------------------
    def rejection(self, t_c: float, q_m3_s: float, air_speed_m_s: float, with_cooler: bool = True,
                  detail: bool = False) -> dict:
        """Heat rejected [W] at bulk temperature ``t_c`` with circuit flow ``q_m3_s``.

        Each hose and tube exchanges heat with its own air (``line_surface``): a part in air hotter than
        the fluid adds heat (its ``heat_w`` is negative); the reservoir and the cooler use the job's air.
        With ``detail``, ``parts`` lists each line surface with its conductance, heat, outer surface
        temperature and air temperature."""
        st = self.circuit.state(t_c)
        dt = t_c - self.t_air_c
        cap = st.rho_kg_m3 * st.cp_j_kgk * q_m3_s
        pr = st.mu_pa_s * st.cp_j_kgk / st.k_w_mk
        lines_w = 0.0
        parts = [] if detail else None
        if cap > 0.0:
            same = {}  # parts of one geometry in one air share their UA per metre (exact: same inputs)
            for s in self.surfaces:
                ta = s["t_air"]
                if t_c == ta:
                    continue
                key = (s["d_i"], s["d_o"], s["k"], s["eD"], ta)
                if key not in same:
                    h_i = h_inside_pipe(s["d_i"], q_m3_s, st.nu_m2_s, st.k_w_mk, pr, s["eD"])
                    same[key] = cylinder_ua_per_m(s["d_i"], s["d_o"], s["k"], t_c, ta, air_speed_m_s, h_i)
                ua_m, ts = same[key]
                ua = ua_m * s["length"]
                w = cap * (1.0 - math.exp(-ua / cap)) * (t_c - ta)
                lines_w += w
                if detail:
                    parts.append({"line": s["line"], "part": s["part"], "ua_w_k": ua, "heat_w": w,
                                  "surface_temp_c": ts, "air_temp_c": ta, "outside_mm": s["d_o"] * 1e3})
        reservoir_w = self.th["reservoir_area_m2"] * self.th["reservoir_h_w_m2k"] * dt
        cooler_w = self.cooler_w(t_c, q_m3_s, air_speed_m_s, st) if with_cooler else 0.0
        out = {"lines_w": lines_w, "reservoir_w": reservoir_w, "cooler_w": cooler_w,
               "total_w": lines_w + reservoir_w + cooler_w}
        if detail:
            out["parts"] = parts
        return out

    def cooler_tube_ua_per_m(self, t_c: float, q_m3_s: float, air_speed_m_s: float, st=None,
                             cooler=None) -> float:
        """UA per metre [W/(m K)] of the cooler's tube (plain or finned)."""
        c = self.cooler if cooler is None else cooler
        st = st or self.circuit.state(t_c)
        d_o = c["tube_od_mm"] * 1e-3
        d_i = d_o - 2.0 * c["tube_wall_mm"] * 1e-3
        v = c["air_speed_m_s"] if c.get("air_speed_m_s") is not None else air_speed_m_s
        pr = st.mu_pa_s * st.cp_j_kgk / st.k_w_mk
        h_i = h_inside_pipe(d_i, q_m3_s, st.nu_m2_s, st.k_w_mk, pr, 1.5e-6 / d_i)
        fins = None
        if c.get("fins_per_inch") and c.get("fin_od_mm"):
            fins = {"per_m": c["fins_per_inch"] / 0.0254, "d_fin_m": c["fin_od_mm"] * 1e-3,
                    "t_fin_m": c.get("fin_thickness_mm", 0.4) * 1e-3,
                    "k_fin_w_mk": c.get("fin_conductivity_w_mk", 200.0)}
        ua, _ = cylinder_ua_per_m(d_i, d_o, c.get("tube_conductivity_w_mk", 50.0), t_c, self.t_air_c, v, h_i,
                                  fins)
        return ua

    def cooler_w(self, t_c: float, q_m3_s: float, air_speed_m_s: float, st=None) -> float:
        """Heat rejected by the job's cooler [W]."""
        c = self.cooler
        if c["type"] == "none" or q_m3_s <= 0.0:
            return 0.0
        st = st or self.circuit.state(t_c)
        cap = st.rho_kg_m3 * st.cp_j_kgk * q_m3_s
        dt = t_c - self.t_air_c
        if c["type"] == "rating":
            return min(c["w_per_k"], cap) * dt
        ua = self.cooler_tube_ua_per_m(t_c, q_m3_s, air_speed_m_s, st) * c["tube_length_m"]
        return effectiveness_from_NTU(ua / cap, 0.0, "counterflow") * cap * dt

    # -- a condition at a trial temperature -----------------------------------------------
    def balance(self, cond, t_c: float, op: dict | None = None, with_cooler: bool = True,
                detail: bool = False) -> dict:
        """Heat generated and rejected at ``cond`` with the fluid at ``t_c``."""
        if op is None:
            op = self.circuit.operating_point(cond, t_c=t_c, detail=False)
        d = self.heat_detail(op)
        hyd_w = d["leakage_w"] + d["bypass_w"] + d["circuit_w"]
        rej = self.rejection(t_c, op["circuit_flow_lpm"] * LPM, cond["air_speed_m_s"], with_cooler, detail)
        return {"heat_w": hyd_w + d["mechanical_w"], "heat_hydraulic_w": hyd_w, "heat_pump_loss_w": d["mechanical_w"],
                "heat_detail": d, "circuit_flow_m3_s": op["circuit_flow_lpm"] * LPM, "rejection": rej}
