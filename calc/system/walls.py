"""The wall temperature of each hose and tube of a line, at every operating point.

The model (stated assumptions; the sentence is repeated in ``thermal.method`` of the result):

* the wall sits between the fluid at the operating point's temperature and the air around
  the part (its own ``local_air_temp_c``, a part routed near an exhaust manifold or turbo,
  or else the job's under-hood air): inside film, wall conduction and outside film in series,
  the same resistances the thermal model uses for the heat the part exchanges
  (``calc.physics.heat.cylinder_resistances_per_m``), so the outer surface here is the surface
  temperature of ``conditions[].heat_rejected_detail``;
* a line without flow (full lock) holds standing fluid, which warms toward the air around a
  hot part or holds its own temperature (heat soak): both surfaces are taken at the hotter
  of the fluid and the air (conservative);
* radiation is not modelled: a hot surface nearby (a manifold at several hundred C) radiates
  to the line and makes its wall facing it hotter than this estimate, which is a lower bound
  there.

References
----------
.. [1] Bergman, T. L., Lavine, A. S., Incropera, F. P., DeWitt, D. P. Fundamentals of Heat and
   Mass Transfer, 7th ed. Wiley, 2011, sec. 3.3 (the composite cylinder wall).
"""
from __future__ import annotations

from ..model.fluid import state_of
from ..physics.convection import h_inside_pipe
from ..physics.heat import cylinder_resistances_per_m, wall_temperatures_c
from .circuit import LPM
from .naming import part_ref
from .thermal_model import line_surface

__all__ = ["METHOD", "wall_point", "line_walls"]

METHOD = ("Wall temperature of each hose and tube: the same inside film, wall conduction and outside film in "
          "series put the inner and outer surfaces between the fluid (at the operating point's temperature) and "
          "the air around the part (its own 'Air temperature around this part', else the under-hood air); with "
          "no flow through the line (full lock) both are taken at the hotter of the fluid and that air (heat "
          "soak, conservative). Radiation from a hot surface nearby is not modelled: the wall facing a manifold "
          "or turbo runs hotter than the estimate, a lower bound there.")


def wall_point(surface: dict, t_fluid_c: float, q_m3_s: float, air_speed_m_s: float, st) -> tuple[float, float]:
    """Inner and outer surface temperatures [C] of one line surface (``line_surface``) at one point.

    Parameters
    ----------
    surface : dict
        The part's surface (``calc.system.thermal_model.line_surface``), with its air ``t_air``.
    t_fluid_c : float
        Fluid temperature, [C].
    q_m3_s : float
        Flow through the part, [m^3/s]; 0: standing fluid (both surfaces at the hotter of the fluid
        and the air).
    air_speed_m_s : float
        Air speed across the part, [m/s].
    st : calc.physics.fluid.FluidState
        The fluid's state at ``t_fluid_c``.

    Returns
    -------
    t_inner_c, t_outer_c : float

    Examples
    --------
    Standing fluid in 300 C air is taken at the air temperature (the stated heat-soak rule):

    >>> wall_point({"t_air": 300.0}, 90.0, 0.0, 0.5, None)
    (300.0, 300.0)
    """
    t_air = surface["t_air"]
    if q_m3_s <= 0.0:
        hot = max(t_fluid_c, t_air)
        return hot, hot
    pr = st.mu_pa_s * st.cp_j_kgk / st.k_w_mk
    h_i = h_inside_pipe(surface["d_i"], q_m3_s, st.nu_m2_s, st.k_w_mk, pr, surface["eD"])
    r = cylinder_resistances_per_m(surface["d_i"], surface["d_o"], surface["k"], t_fluid_c, t_air, air_speed_m_s,
                                   h_i)
    return wall_temperatures_c(t_fluid_c, t_air, *r)


def _surface(pt: dict) -> str:
    if pt["outer_c"] == pt["inner_c"]:
        return "both"
    return "outer" if pt["outer_c"] > pt["inner_c"] else "inner"


def _state(fluid, t_c: float, memo: dict):
    key = ("fluid state", t_c)
    if key not in memo:
        memo[key] = state_of(fluid, t_c)
    return memo[key]


def line_walls(job, parts, solved, j: int, memo: dict | None = None, only=None) -> list[dict]:
    """Every hose and tube of line ``j`` as built, with its wall temperatures at each operating point.

    Parameters
    ----------
    job : calc.model.prepared.PreparedJob
        Its fluid, thermal settings and operating points (their air speeds).
    parts : sequence of Part
        The line's parts as built (port adapters included).
    solved : sequence of dict
        Every operating point solved (``Circuit.operating_point``), in the order of ``job.conditions``.
    j : int
        The line's place in the user's list, from 0.
    memo : dict, optional
        Fluid states and wall points kept between calls (the candidates of one line share it).
    only : callable, optional
        Which parts to work out (``only(part)``); every hose and tube when None.

    Returns
    -------
    list of dict
        Per hose or tube: ``index`` (place in the line as built), ``job_part``, ``label``, ``kind``,
        ``local_air_temp_c`` (None: the job's air), ``air_temp_c``, ``hottest_c`` with ``hottest_at`` (the
        operating point) and ``hottest_surface`` ('inner', 'outer', or 'both' without flow), and ``points``: per operating point
        ``name``, ``fluid_temp_c``, ``air_temp_c``, ``flow``, ``inner_c``, ``outer_c``.
    """
    memo = {} if memo is None else memo
    out = []
    for k, p in enumerate(parts):
        if only is not None and not only(p):
            continue
        surface = line_surface(p, job.thermal)
        if surface is None:
            continue
        points = []
        for cond, op in zip(job.conditions, solved):
            t_f = op["fluid_temp_c"]
            q = op["lines"][j]["flow_lpm"] * LPM
            key = ("wall", surface["d_i"], surface["d_o"], surface["k"], surface["eD"], surface["t_air"], t_f, q,
                   cond["air_speed_m_s"])  # the same part at the same point: the same wall (exact)
            got = memo.get(key)
            if got is None:
                got = memo[key] = wall_point(surface, t_f, q, cond["air_speed_m_s"], _state(job.fluid, t_f, memo))
            inner, outer = got
            points.append({"name": op["name"], "fluid_temp_c": t_f, "air_temp_c": surface["t_air"], "flow": q > 0.0,
                           "inner_c": inner, "outer_c": outer})
        hot = max(points, key=lambda pt: max(pt["inner_c"], pt["outer_c"]))
        out.append({"index": k, "job_part": p.place, "label": part_ref(p), "kind": p["kind"],
                    "local_air_temp_c": surface["local"], "air_temp_c": surface["t_air"],
                    "hottest_c": max(hot["inner_c"], hot["outer_c"]), "hottest_at": hot["name"],
                    "hottest_surface": _surface(hot), "points": points})
    return out
