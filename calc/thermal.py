"""Fluid temperature: heat load, heat rejection, steady temperature, full-lock warm-up, cooler advice.

``assess(circuit, conditions)`` is the engine's thermal stage. It adds to every
solved operating point ``heat_w`` (heat generated), ``heat_hydraulic_w``,
``heat_pump_loss_w`` and ``heat_rejected_w`` (at that point's own fluid
temperature), and returns the ``thermal`` section of the result.

The model (stated assumptions; the sentences are repeated in
``thermal.method`` of the result):

* the steering does no net work, so all the hydraulic power the pump puts
  into the fluid becomes heat in the fluid: at neutral the circuit flow times
  the pump outlet pressure, plus the frictional loss of the feed line, plus
  the relief flow times the relief setting when the relief is open; at full
  lock the whole delivered flow times the relief setting;
* with ``pump.overall_efficiency`` given, the pump's own losses
  ``Q p_out (1/eta - 1)`` are added in full to the fluid (conservative: part
  of them leaves through the pump body and the belt);
* every line part that is a hose or a tube rejects heat from its outer
  surface to the under-hood air: inside film, wall conduction and outside film
  in series; fittings and devices are not counted (small surfaces);
* the fluid in a part is taken at the bulk temperature and the part rejects
  ``C (1 - exp(-UA/C)) (T - T_air)`` with ``C`` the fluid's capacity rate
  (effectiveness-NTU with the air as an infinite reservoir, Cr = 0), so a
  line without flow (full lock) rejects nothing;
* one steady bulk temperature for the whole duty cycle: the duty-weighted heat
  generated equals the duty-weighted heat rejected, each operating point
  re-solved at the trial temperature so viscosity follows temperature.

References
----------
.. [1] Churchill, S. W., Chu, H. H. S. "Correlating Equations for Laminar and
   Turbulent Free Convection from a Horizontal Cylinder." Int. J. Heat Mass
   Transfer 18, 1975, 1049-1053.
.. [2] Churchill, S. W., Bernstein, M. "A Correlating Equation for Forced
   Convection From Gases and Liquids to a Circular Cylinder in Crossflow."
   J. Heat Transfer 99, 1977, 300-306.
.. [3] Churchill, S. W. "A Comprehensive Correlating Equation for Laminar,
   Assisting, Forced and Free Convection." AIChE J. 23, 1977, 10-16.
.. [4] Gnielinski, V. "New Equations for Heat and Mass Transfer in Turbulent
   Pipe and Channel Flow." Int. Chem. Eng. 16, 1976, 359-368.
.. [5] Schmidt, T. E. "Heat Transfer Calculations for Extended Surfaces."
   Refrigerating Engineering 57, 1949, 351-357.
.. [6] Bergman, T. L., Lavine, A. S., Incropera, F. P., DeWitt, D. P.
   Fundamentals of Heat and Mass Transfer, 7th ed. Wiley, 2011 (lumped
   capacitance, effectiveness-NTU, thermal resistances in series).
"""
from __future__ import annotations

import math

from fluids import ATMOSPHERE_1976
from ht import (Nu_cylinder_Churchill_Bernstein, Nu_horizontal_cylinder_Churchill_Chu, effectiveness_from_NTU,
                laminar_T_const, turbulent_Gnielinski)

from . import hydraulics as hyd

__all__ = ["assess", "temp_rise_c", "hydraulic_heat_w", "air_properties", "h_natural_cylinder",
           "h_forced_cylinder", "h_outside_cylinder", "h_inside_pipe", "annular_fin_efficiency",
           "cylinder_ua_per_m", "default_hose_wall_mm", "solve_steady", "warmup", "ThermalModel",
           "HOSE_WALL_MM", "TUBE_CONDUCTIVITY_W_MK", "STEADY_TOL_K", "STEADY_MAX_C", "AIR_CP_J_KGK"]

T0 = 273.15
G = hyd.G
LPM = 1.0 / 60000.0
BAR = 1e5

#: Tolerance of the steady-temperature solve: the final bracket is narrower than this, [K].
STEADY_TOL_K = 0.05
#: Highest fluid temperature searched for a steady state, [C]; beyond it there is "no steady state".
STEADY_MAX_C = 250.0
#: The full-lock curve ends this far above the fluid's limit, [K].
CURVE_OVER_LIMIT_K = 25.0
#: Specific heat of air, [J/(kg K)]; 1007 at 300 K, 1006-1012 over 250-400 K (from memory of
#: Incropera Table A.4). The only air property not taken from fluids.ATMOSPHERE_1976.
AIR_CP_J_KGK = 1007.0

#: Typical hose wall thickness by bore, used when a hose part gives no ``wall_mm``:
#: (bore_mm, wall_mm, source). Half the difference of typical outside and inside diameters of
#: single-wire-braid hydraulic hose; interpolated linearly, held constant beyond the ends.
HOSE_WALL_MM = (
    (4.8, 4.0, "typical braided hydraulic hose (from memory)"),
    (6.4, 4.2, "typical braided hydraulic hose (from memory)"),
    (7.9, 4.4, "typical braided hydraulic hose (from memory)"),
    (9.5, 4.6, "typical braided hydraulic hose (from memory)"),
    (12.7, 4.8, "typical braided hydraulic hose (from memory)"),
    (15.9, 5.0, "typical braided hydraulic hose (from memory)"),
    (19.0, 5.5, "typical braided hydraulic hose (from memory)"),
    (25.4, 6.3, "typical braided hydraulic hose (from memory)"),
)

#: Thermal conductivity of rigid-tube materials near 300 K, [W/(m K)] (from memory, handbook values).
TUBE_CONDUCTIVITY_W_MK = {
    "steel-low-carbon": {"k_w_mk": 50.0, "source": "from memory (plain carbon steel, ~50)"},
    "stainless-304-annealed": {"k_w_mk": 16.0, "source": "from memory (AISI 304, ~15-16)"},
    "aluminium-6061-t6": {"k_w_mk": 167.0, "source": "from memory (6061-T6, ~167)"},
    "copper-nickel": {"k_w_mk": 40.0, "source": "from memory (90/10 copper-nickel, ~40-50)"},
}

METHOD = [
    "Temperature rise across a part: dT = dp / (rho cp), the whole pressure loss turned into heat in the "
    "fluid (elevation excluded).",
    "Heat generated: at neutral, circuit flow x pump outlet pressure + feed-line friction loss x flow + "
    "relief flow x relief setting when the relief is open; at full lock, delivered flow x relief setting. "
    "With pump.overall_efficiency given, the pump's losses Q p_out (1/eta - 1) are added in full.",
    "Line rejection: inside film (Nu = 3.66 laminar, Gnielinski turbulent, linear in Re between 2000 and "
    "4000), wall conduction ln(do/di)/(2 pi k) and outside film in series; outside, natural convection by "
    "Churchill-Chu (horizontal cylinder) and forced convection by Churchill-Bernstein (cylinder in cross "
    "flow) combined as Nu^3 = Nu_forced^3 + Nu_free^3 (Churchill 1977); surface temperature iterated.",
    "Radiation is not counted: conservative, since a black hose in still air can radiate about as much as "
    "it loses by free convection when the surroundings are cooler (under a hood they often are not).",
    "Air properties from the 1976 standard atmosphere at sea level, offset to the film temperature "
    "(fluids.ATMOSPHERE_1976); air cp 1007 J/(kg K) (from memory).",
    "Each part rejects C (1 - exp(-UA/C)) (T - T_air), C = rho cp Q of the fluid through it (effectiveness-"
    "NTU, air side infinite); fittings and devices are not counted; lines without flow reject nothing.",
    "Reservoir: area x film coefficient x (T - T_air). Cooler 'rating': min(rating, C) x (T - T_air); "
    "cooler 'tube': a plain or finned tube in the air (same film correlations, annular fin efficiency by "
    "Schmidt's approximation, film coefficient of the bare tube on the fins), effectiveness-NTU with the "
    "fluid's capacity rate; the cooler carries the circuit flow.",
    f"Steady temperature: duty-weighted heat generated = duty-weighted heat rejected at one bulk "
    f"temperature, every operating point re-solved at the trial temperature; bracketed regula falsi "
    f"(Illinois) between the air temperature and {STEADY_MAX_C:g} C, to a bracket under {STEADY_TOL_K} K.",
    "Full-lock hold: one well-mixed lump of the whole fluid volume (lines + other_volume_l), rho cp V, "
    "stepped by the exact solution of the locally linearised balance from the steady temperature (or the full-lock point's own temperature when there is "
    "no steady temperature). The lines and a flow-through cooler carry no flow at full lock, so only the "
    "reservoir rejects heat; the fluid in the pump heats faster than this average, so the time shown is "
    "an upper estimate.",
    "Cooler advice: the rating (or tube length) that brings the steady temperature down to the fluid "
    "limit less the margin, computed with no cooler fitted.",
]


# -- elementary relations -------------------------------------------------------------
def temp_rise_c(dp_pa: float, rho_kg_m3: float, cp_j_kgk: float) -> float:
    r"""Temperature rise of fluid throttled with no work done, :math:`\Delta T = \Delta p/(\rho c_p)`.

    Parameters
    ----------
    dp_pa : float
        Pressure lost, [Pa]; a negative drop gives 0.
    rho_kg_m3 : float
        Fluid density, [kg/m^3].
    cp_j_kgk : float
        Specific heat, [J/(kg K)].

    Returns
    -------
    dT : float
        Temperature rise, [K]. Valid for liquids (incompressible, adiabatic throttling).

    Examples
    --------
    10 bar across a valve in mineral oil (about 0.57 K per 10 bar, common practice):

    >>> round(temp_rise_c(10e5, 870.0, 1900.0), 3)
    0.605

    References
    ----------
    .. [1] Energy balance of adiabatic throttling of an incompressible liquid, h = u + p/rho.
    """
    return max(dp_pa, 0.0) / (rho_kg_m3 * cp_j_kgk)


def hydraulic_heat_w(circuit_flow_m3_s: float, outlet_pa: float, relief_flow_m3_s: float = 0.0,
                     relief_pa: float = 0.0, feed_loss_pa: float = 0.0) -> float:
    r"""Heat generated in the fluid by the pump's hydraulic power when no work is done.

    .. math::
        P = Q_c (p_{out} + \Delta p_{feed}) + Q_r p_{relief}

    Parameters
    ----------
    circuit_flow_m3_s : float
        Flow round the circuit, [m^3/s] (0 at full lock).
    outlet_pa : float
        Pump outlet gauge pressure, [Pa].
    relief_flow_m3_s : float
        Flow across the relief valve, [m^3/s].
    relief_pa : float
        Relief setting, [Pa].
    feed_loss_pa : float
        Friction and minor losses of the feed line (no elevation), [Pa].

    Returns
    -------
    heat_w : float
        Heat generated, [W].

    Examples
    --------
    Full lock, 8 L/min over an 80 bar relief (about 1 kW):

    >>> round(hydraulic_heat_w(0.0, 80e5, 8 / 60000, 80e5))
    1067
    """
    return circuit_flow_m3_s * (outlet_pa + feed_loss_pa) + relief_flow_m3_s * relief_pa


# -- air and film coefficients ------------------------------------------------------
_AIR_CACHE: dict[int, tuple[float, float, float]] = {}


def _air_at(tk: int) -> tuple[float, float, float]:
    got = _AIR_CACHE.get(tk)
    if got is None:
        a = ATMOSPHERE_1976(0.0, dT=tk - 288.15)
        got = _AIR_CACHE[tk] = (a.rho, a.mu, a.k)
    return got


def air_properties(t_c: float) -> tuple[float, float, float, float, float]:
    """Air at sea-level pressure and temperature ``t_c``: density, viscosity, conductivity, cp, Pr.

    Density, viscosity (Sutherland) and conductivity come from the 1976 standard
    atmosphere at 0 m altitude offset to the wanted temperature
    (``fluids.ATMOSPHERE_1976(0, dT=...)``, pure Python), cached at whole kelvin
    and interpolated linearly between; cp is 1007 J/(kg K) (from memory).

    Parameters
    ----------
    t_c : float
        Air (film) temperature, [C]; sensible for about -50 to 400 C.

    Returns
    -------
    rho_kg_m3, mu_pa_s, k_w_mk, cp_j_kgk, pr : float

    Examples
    --------
    >>> rho, mu, k, cp, pr = air_properties(26.85)
    >>> round(rho, 3), round(mu * 1e6, 2), round(k, 4), round(pr, 3)
    (1.177, 18.46, 0.0263, 0.708)

    (Incropera's Table A.4 at 300 K, from memory: 1.1614, 18.46, 0.0263, 0.707.)

    References
    ----------
    .. [1] U.S. Standard Atmosphere, 1976. NOAA/NASA/USAF, 1976.
    """
    tk = t_c + T0
    lo = math.floor(tk)
    w = tk - lo
    a, b = _air_at(lo), _air_at(lo + 1)
    rho = a[0] + w * (b[0] - a[0])
    mu = a[1] + w * (b[1] - a[1])
    k = a[2] + w * (b[2] - a[2])
    return rho, mu, k, AIR_CP_J_KGK, mu * AIR_CP_J_KGK / k


def h_natural_cylinder(d_m: float, t_surface_c: float, t_air_c: float) -> float:
    r"""Free-convection film coefficient of a horizontal cylinder in still air (Churchill-Chu).

    .. math::
        Nu_D = \left(0.6 + \frac{0.387 Ra_D^{1/6}}{[1 + (0.559/Pr)^{9/16}]^{8/27}}\right)^2

    evaluated by ``ht.Nu_horizontal_cylinder_Churchill_Chu`` with air properties at
    the film temperature and :math:`\beta = 1/T_{film}` (ideal gas).

    Parameters
    ----------
    d_m : float
        Outside diameter, [m].
    t_surface_c, t_air_c : float
        Surface and air temperatures, [C].

    Returns
    -------
    h : float
        Film coefficient, [W/(m^2 K)]. Valid for Ra_D up to 1e12.

    Examples
    --------
    >>> round(h_natural_cylinder(0.019, 90.0, 50.0), 2)
    7.33

    References
    ----------
    .. [1] Churchill, S. W., Chu, H. H. S. Int. J. Heat Mass Transfer 18, 1975, 1049-1053.
    """
    tf = 0.5 * (t_surface_c + t_air_c)
    rho, mu, k, _, pr = air_properties(tf)
    nu = mu / rho
    dt = max(abs(t_surface_c - t_air_c), 1e-6)
    gr = G * dt / (tf + T0) * d_m ** 3 / (nu * nu)
    return Nu_horizontal_cylinder_Churchill_Chu(Pr=pr, Gr=gr) * k / d_m


def h_forced_cylinder(d_m: float, air_speed_m_s: float, t_surface_c: float, t_air_c: float) -> float:
    r"""Forced-convection film coefficient of a cylinder in air cross flow (Churchill-Bernstein).

    Evaluated by ``ht.Nu_cylinder_Churchill_Bernstein`` with air properties at the
    film temperature; 0 in still air.

    Parameters
    ----------
    d_m : float
        Outside diameter, [m].
    air_speed_m_s : float
        Approach air speed, [m/s].
    t_surface_c, t_air_c : float
        Surface and air temperatures, [C].

    Returns
    -------
    h : float
        Film coefficient, [W/(m^2 K)]. Valid for Re Pr > 0.2.

    Examples
    --------
    >>> round(h_forced_cylinder(0.019, 5.0, 90.0, 50.0), 1)
    55.5

    References
    ----------
    .. [1] Churchill, S. W., Bernstein, M. J. Heat Transfer 99, 1977, 300-306.
    """
    if air_speed_m_s <= 0.0:
        return 0.0
    rho, mu, k, _, pr = air_properties(0.5 * (t_surface_c + t_air_c))
    re = rho * air_speed_m_s * d_m / mu
    return Nu_cylinder_Churchill_Bernstein(Re=re, Pr=pr) * k / d_m


def h_outside_cylinder(d_m: float, air_speed_m_s: float, t_surface_c: float, t_air_c: float) -> float:
    r"""Mixed free and forced convection outside a horizontal cylinder.

    .. math::
        Nu^3 = Nu_{forced}^3 + Nu_{free}^3

    Churchill's (1977) combination for assisting flow with n = 3; the direction of
    the air relative to buoyancy under a hood is unknown, so this is a stated
    simplification. Returns the free-convection value in still air.

    Examples
    --------
    >>> h_n = h_natural_cylinder(0.019, 90.0, 50.0)
    >>> round(h_outside_cylinder(0.019, 0.0, 90.0, 50.0) / h_n, 6)
    1.0

    References
    ----------
    .. [1] Churchill, S. W. AIChE J. 23, 1977, 10-16.
    """
    hn = h_natural_cylinder(d_m, t_surface_c, t_air_c)
    hf = h_forced_cylinder(d_m, air_speed_m_s, t_surface_c, t_air_c)
    return (hn ** 3 + hf ** 3) ** (1.0 / 3.0)


def h_inside_pipe(d_m: float, q_m3_s: float, nu_m2_s: float, k_w_mk: float, pr: float,
                  rel_roughness: float = 0.0) -> float:
    r"""Inside film coefficient of fully developed pipe flow.

    Nu = 3.66 (laminar, constant wall temperature, ``ht.laminar_T_const``) below
    Re 2000; Gnielinski (``ht.turbulent_Gnielinski`` with the engine's friction
    factor) above 4000; linear in Re between. Ignoring the entry length
    underestimates the laminar coefficient (conservative).

    Parameters
    ----------
    d_m : float
        Bore, [m].
    q_m3_s : float
        Flow, [m^3/s]; 0 gives the laminar value.
    nu_m2_s, k_w_mk, pr : float
        Fluid kinematic viscosity [m^2/s], conductivity [W/(m K)], Prandtl number [-].
    rel_roughness : float
        Relative roughness, [-].

    Examples
    --------
    >>> round(h_inside_pipe(0.0095, 7.5 / 60000, 10e-6, 0.13, 130.0), 2)
    50.08

    References
    ----------
    .. [1] Gnielinski, V. Int. Chem. Eng. 16, 1976, 359-368.
    """
    nu_lam = laminar_T_const()
    re = 4.0 * q_m3_s / (math.pi * d_m * nu_m2_s) if q_m3_s > 0.0 else 0.0
    if re < hyd.RE_LAMINAR:
        nusselt = nu_lam
    else:
        re_t = max(re, hyd.RE_TURBULENT)
        nu_t = turbulent_Gnielinski(Re=re_t, Pr=pr, fd=hyd.friction_factor(re_t, rel_roughness))
        if re >= hyd.RE_TURBULENT:
            nusselt = nu_t
        else:
            w = (re - hyd.RE_LAMINAR) / (hyd.RE_TURBULENT - hyd.RE_LAMINAR)
            nusselt = nu_lam + w * (nu_t - nu_lam)
    return nusselt * k_w_mk / d_m


def annular_fin_efficiency(d_tube_m: float, d_fin_m: float, t_fin_m: float, k_fin_w_mk: float,
                           h_w_m2k: float) -> float:
    r"""Efficiency of a thin annular fin with an insulated tip, Schmidt's approximation.

    .. math::
        \eta = \frac{\tanh(m r_1 \phi)}{m r_1 \phi},\quad m = \sqrt{2h/(k t)},\quad
        \phi = (R - 1)(1 + 0.35 \ln R),\quad R = r_2/r_1

    Hand-written because ``ht.fin_efficiency_Kern_Kraus`` (the exact Bessel-function
    solution) needs scipy, which the browser engine does not have. Within a few
    per cent of the exact solution for R up to about 4 (tested).

    Parameters
    ----------
    d_tube_m, d_fin_m : float
        Fin root (tube outside) and fin outside diameters, [m].
    t_fin_m : float
        Fin thickness, [m].
    k_fin_w_mk : float
        Fin conductivity, [W/(m K)].
    h_w_m2k : float
        Film coefficient on the fin, [W/(m^2 K)].

    Examples
    --------
    >>> round(annular_fin_efficiency(0.0254, 0.05715, 3.8e-4, 200.0, 58.0), 3)
    0.831

    (The exact Bessel-function solution, ``ht.fin_efficiency_Kern_Kraus``, gives 0.841 here.)

    References
    ----------
    .. [1] Schmidt, T. E. Refrigerating Engineering 57, 1949, 351-357.
    """
    r1, r2 = 0.5 * d_tube_m, 0.5 * d_fin_m
    if r2 <= r1 or h_w_m2k <= 0.0:
        return 1.0
    ratio = r2 / r1
    phi = (ratio - 1.0) * (1.0 + 0.35 * math.log(ratio))
    x = math.sqrt(2.0 * h_w_m2k / (k_fin_w_mk * t_fin_m)) * r1 * phi
    return math.tanh(x) / x if x > 1e-12 else 1.0


def cylinder_ua_per_m(d_i_m: float, d_o_m: float, k_wall_w_mk: float, t_fluid_c: float, t_air_c: float,
                      air_speed_m_s: float, h_inside_w_m2k: float, fins: dict | None = None
                      ) -> tuple[float, float]:
    r"""Overall conductance per metre of a pipe or hose, fluid to air.

    .. math::
        \frac{1}{UA'} = \frac{1}{h_i \pi d_i} + \frac{\ln(d_o/d_i)}{2\pi k}
        + \frac{1}{h_o (A'_{bare} + \eta_f A'_{fin})}

    The outside film depends on the surface temperature, which is iterated
    (fixed point, to 0.01 K, at most 12 passes).

    Parameters
    ----------
    d_i_m, d_o_m : float
        Inside and outside diameters, [m].
    k_wall_w_mk : float
        Wall conductivity, [W/(m K)].
    t_fluid_c, t_air_c : float
        Bulk fluid and air temperatures, [C].
    air_speed_m_s : float
        Air speed across the pipe, [m/s].
    h_inside_w_m2k : float
        Inside film coefficient, [W/(m^2 K)] (see ``h_inside_pipe``).
    fins : dict, optional
        ``{"per_m", "d_fin_m", "t_fin_m", "k_fin_w_mk"}`` for an annular-finned tube.

    Returns
    -------
    ua_w_mk : float
        Conductance per metre, [W/(m K)].
    t_surface_c : float
        Outer surface (fin root) temperature, [C].

    Examples
    --------
    A steel tube 9.53 x 0.89 mm with oil at 100 C in still air at 50 C:

    >>> ua, ts = cylinder_ua_per_m(0.00775, 0.00953, 50.0, 100.0, 50.0, 0.0, 60.0)
    >>> round(ua, 3), round(ts, 1)
    (0.232, 92.1)

    References
    ----------
    .. [1] Bergman, Lavine, Incropera, DeWitt. Fundamentals of Heat and Mass Transfer, 7th ed.,
       2011, ch. 3 (resistances in series) and ch. 11.
    """
    r_in = 1.0 / (h_inside_w_m2k * math.pi * d_i_m)
    r_wall = math.log(d_o_m / d_i_m) / (2.0 * math.pi * k_wall_w_mk)
    if fins:
        n = fins["per_m"]
        a_bare = math.pi * d_o_m * max(1.0 - n * fins["t_fin_m"], 0.0)
        a_fin = n * 2.0 * 0.25 * math.pi * (fins["d_fin_m"] ** 2 - d_o_m ** 2)
    else:
        a_bare, a_fin = math.pi * d_o_m, 0.0
    dt = t_fluid_c - t_air_c
    ts = t_air_c + 0.8 * dt
    r_out = 0.0
    for _ in range(12):
        h_o = h_outside_cylinder(d_o_m, air_speed_m_s, ts, t_air_c)
        if fins:
            eta = annular_fin_efficiency(d_o_m, fins["d_fin_m"], fins["t_fin_m"], fins["k_fin_w_mk"], h_o)
            r_out = 1.0 / (h_o * (a_bare + eta * a_fin))
        else:
            r_out = 1.0 / (h_o * a_bare)
        ts_new = t_air_c + dt * r_out / (r_in + r_wall + r_out)
        if abs(ts_new - ts) < 0.01:
            ts = ts_new
            break
        ts = ts_new
    return 1.0 / (r_in + r_wall + r_out), ts


def default_hose_wall_mm(bore_mm: float) -> float:
    """Typical hose wall thickness for a bore, [mm], from ``HOSE_WALL_MM`` (from memory).

    Examples
    --------
    >>> default_hose_wall_mm(9.5)
    4.6
    >>> default_hose_wall_mm(100.0)
    6.3
    """
    rows = HOSE_WALL_MM
    if bore_mm <= rows[0][0]:
        return rows[0][1]
    for (b0, w0, _), (b1, w1, _) in zip(rows, rows[1:]):
        if bore_mm <= b1:
            return w0 + (bore_mm - b0) / (b1 - b0) * (w1 - w0)
    return rows[-1][1]


# -- solvers ---------------------------------------------------------------------
def solve_steady(net_w, t_lo_c: float, t_hi_c: float, tol_k: float = STEADY_TOL_K, max_iter: int = 60
                 ) -> dict:
    """Temperature at which a net heat balance (generated - rejected) falls to zero.

    Bracketed regula falsi with the Illinois modification; each new point is kept
    at least ``tol_k / 2`` inside the bracket so the bracket closes. Never raises.

    Parameters
    ----------
    net_w : callable
        ``net_w(t_c)`` -> net heat into the fluid, [W]; positive at ``t_lo_c``.
    t_lo_c, t_hi_c : float
        Search interval, [C].
    tol_k : float
        Width of the final bracket, [K].

    Returns
    -------
    dict
        ``{"status": "converged"|"none below"|"no heat"|"not converged"|"failed", "temp_c", "iterations",
        "message"}``; ``temp_c`` is None unless converged.

    Examples
    --------
    >>> r = solve_steady(lambda t: 500.0 - 10.0 * (t - 50.0), 50.0, 250.0)
    >>> r["status"], round(r["temp_c"], 1)
    ('converged', 100.0)
    """
    try:
        return _solve_steady(net_w, t_lo_c, t_hi_c, tol_k, max_iter)
    except (ArithmeticError, ValueError) as exc:  # a property or correlation out of its domain
        return {"status": "failed", "temp_c": None, "iterations": 0,
                "message": f"the steady-temperature solve failed ({type(exc).__name__}: {exc})"}


def _solve_steady(net_w, t_lo_c, t_hi_c, tol_k, max_iter):
    f_lo = net_w(t_lo_c)
    evals = 1
    if f_lo <= 0.0:
        return {"status": "no heat", "temp_c": t_lo_c, "iterations": evals,
                "message": "no net heat at the air temperature: the fluid settles at the air temperature"}
    f_hi = net_w(t_hi_c)
    evals += 1
    if f_hi > 0.0:
        return {"status": "none below", "temp_c": None, "iterations": evals,
                "message": f"no steady state below {t_hi_c:g} C: the circuit generates "
                           f"{f_hi:.0f} W more than it rejects even there"}
    lo, hi, side = t_lo_c, t_hi_c, 0
    for _ in range(max_iter):
        x = (lo * f_hi - hi * f_lo) / (f_hi - f_lo)
        if not lo < x < hi:
            x = 0.5 * (lo + hi)
        half = 0.5 * tol_k
        if hi - lo > tol_k:
            x = min(max(x, lo + half), hi - half)
        fx = net_w(x)
        evals += 1
        if fx == 0.0:
            return {"status": "converged", "temp_c": x, "iterations": evals, "message": ""}
        if fx > 0.0:
            lo, f_lo = x, fx
            if side == -1:
                f_hi *= 0.5
            side = -1
        else:
            hi, f_hi = x, fx
            if side == 1:
                f_lo *= 0.5
            side = 1
        if hi - lo <= tol_k:
            return {"status": "converged", "temp_c": 0.5 * (lo + hi), "iterations": evals, "message": ""}
    return {"status": "not converged", "temp_c": None, "iterations": evals,
            "message": f"the steady-temperature solve did not converge in {max_iter} steps "
                       f"(bracket {lo:.2f}-{hi:.2f} C)"}


def warmup(t0_c: float, power_w: float, rejected_w, heat_capacity_j_k: float, limit_c: float,
           hold_s: float, n_points: int = 50, substeps: int = 8, search_s: float = 86400.0,
           curve_stop_c: float | None = None) -> dict:
    r"""Lumped warm-up :math:`m c_p\, dT/dt = P - \dot Q_{rej}(T)`, stepped exponentially.

    Each step linearises the rejection about the current temperature,
    :math:`\dot Q_{rej} \approx R_0 + s (T - T_n)`, and advances by the exact
    solution of that linear equation,
    :math:`T_{n+1} = T_{eq} + (T_n - T_{eq}) e^{-s \Delta t/(m c_p)}`,
    :math:`T_{eq} = T_n + (P - R_0)/s`; an explicit Euler step when :math:`s \le 0`.
    The step is exact for a constant UA at any step size and never unstable
    (hand-written: no library integrator runs without scipy).

    Parameters
    ----------
    t0_c : float
        Starting temperature, [C].
    power_w : float
        Heat generated, [W] (constant).
    rejected_w : callable
        ``rejected_w(t_c)`` -> heat rejected, [W]; non-decreasing in temperature.
    heat_capacity_j_k : float
        Lumped capacity :math:`m c_p`, [J/K].
    limit_c : float
        Limit temperature, [C].
    hold_s : float
        Length of the curve, [s].
    n_points : int
        The curve has ``n_points + 1`` points from 0 to ``hold_s``.
    substeps : int
        Steps between curve points.
    search_s : float
        How far past ``hold_s`` to look for the limit, [s].
    curve_stop_c : float, optional
        The curve ends at the first point above this temperature, [C] (the lumped model means
        nothing far above the fluid's limit).

    Returns
    -------
    dict
        ``{"curve": [{"t_s", "temp_c"}], "seconds_to_limit": float|None, "final_temp_c",
        "levels_off_c": float|None, "message", "curve_note"}``; the time to limit is interpolated linearly within
        a step.

    Examples
    --------
    Constant UA: compare with the exact solution.

    >>> r = warmup(60.0, 1000.0, lambda t: 2.0 * (t - 50.0), 4000.0, 120.0, 600.0)
    >>> exact = 50 + 500 + (60 - 50 - 500) * math.exp(-600 * 2.0 / 4000.0)
    >>> abs(r["curve"][-1]["temp_c"] - exact) < 1e-6
    True

    References
    ----------
    .. [1] Bergman, Lavine, Incropera, DeWitt. Fundamentals of Heat and Mass Transfer, 7th ed.,
       2011, sec. 5.3 (general lumped capacitance analysis).
    """
    def step(t, dt):
        r0 = rejected_w(t)
        s = rejected_w(t + 0.5) - rejected_w(t - 0.5)
        if s > 0.0:
            t_eq = t + (power_w - r0) / s
            return t_eq + (t - t_eq) * math.exp(-s * dt / heat_capacity_j_k)
        return t + dt * (power_w - r0) / heat_capacity_j_k

    curve = [{"t_s": 0.0, "temp_c": t0_c}]
    t_time, temp = 0.0, t0_c
    reached = 0.0 if t0_c >= limit_c else None
    dt = hold_s / (n_points * substeps)
    for _ in range(n_points):
        for _ in range(substeps):
            new = step(temp, dt)
            if reached is None and new >= limit_c > temp:
                reached = t_time + dt * (limit_c - temp) / (new - temp)
            temp, t_time = new, t_time + dt
        curve.append({"t_s": t_time, "temp_c": temp})
        if curve_stop_c is not None and temp > curve_stop_c:
            break
    final = temp
    # beyond the curve: where it levels off (rejection slope at the end), and the limit if it is reached
    slope = (rejected_w(temp + 1.0) - rejected_w(temp)) if heat_capacity_j_k > 0 else 0.0
    levels = temp + (power_w - rejected_w(temp)) / slope if slope > 0.0 else None
    if levels is not None and levels > STEADY_MAX_C:
        levels = None  # far beyond any fluid's range: "keeps rising" is the honest statement
    if reached is None and (levels is None or levels > limit_c):
        tau = heat_capacity_j_k / slope if slope > 0.0 else hold_s
        dt2 = max(hold_s / n_points, tau / 100.0)
        while t_time < search_s:
            new = step(temp, dt2)
            if new >= limit_c > temp:
                reached = t_time + dt2 * (limit_c - temp) / (new - temp)
                break
            if new <= temp:  # levelled off below the limit
                break
            temp, t_time = new, t_time + dt2
    if reached is not None:
        msg = (f"the fluid reaches its limit {limit_c:.0f} C after {reached:.0f} s at full lock"
               if reached > 0 else f"the fluid starts at or above its limit {limit_c:.0f} C")
    elif levels is not None and levels <= limit_c:
        msg = f"the limit {limit_c:.0f} C is never reached: the fluid levels off near {levels:.0f} C"
    else:
        msg = f"the limit {limit_c:.0f} C is not reached within {search_s:.0f} s"
    if curve_stop_c is not None and final > curve_stop_c and len(curve) <= n_points:
        # stopped early: spread the points over the shorter span for a readable plot
        curve = warmup(t0_c, power_w, rejected_w, heat_capacity_j_k, limit_c, curve[-1]["t_s"], n_points,
                       substeps, 0.0)["curve"]
        note = f"the curve stops at {curve[-1]['t_s']:.0f} s, past {curve_stop_c:.0f} C"
    else:
        note = ""
    return {"curve": curve, "seconds_to_limit": reached, "final_temp_c": final, "levels_off_c": levels,
            "message": msg, "curve_note": note}


# -- the circuit's thermal model -------------------------------------------------------
class ThermalModel:
    """Heat generated and rejected by a compiled ``calc.engine.Circuit``.

    Parameters
    ----------
    circuit : calc.engine.Circuit
        The compiled circuit (job validated, fluid resolved).
    cooler : dict, optional
        Overrides the job's ``thermal.cooler`` record (for advice and tests).
    """

    def __init__(self, circuit, cooler: dict | None = None):
        self.circuit = circuit
        th = circuit.job["thermal"]
        self.th = th
        self.t_air_c = th["air_temp_c"]
        self.cooler = dict(th["cooler"] if cooler is None else cooler)
        self.relief_pa = circuit.pump["relief_bar"] * BAR
        self.eta_o = circuit.pump.get("overall_efficiency")
        self.surfaces = []
        self.volume_m3 = th["other_volume_l"] * 1e-3
        self.feed_rise = {}
        self.notes = []
        for ln in circuit.lines:
            rise = 0.0
            for k, p in enumerate(ln["parts"]):
                kind = p["kind"]
                rise += p.get("rise_m", 0.0) or 0.0
                if kind in ("hose", "tube"):
                    d_i = hyd.part_bore_mm(p) * 1e-3
                    if kind == "hose":
                        wall = p.get("wall_mm")
                        if wall is None:
                            wall = default_hose_wall_mm(d_i * 1e3)
                            self.notes.append(f"lines[{ln['index']}].parts[{_job_index(p, k)}].wall_mm")
                        k_wall = th["hose_conductivity_w_mk"]
                        d_o = d_i + 2.0 * wall * 1e-3
                    else:
                        d_o = p["od_mm"] * 1e-3
                        k_wall = TUBE_CONDUCTIVITY_W_MK.get(p.get("material"), {"k_w_mk": 50.0})["k_w_mk"]
                    self.surfaces.append({"line": ln["index"], "part": k, "kind": kind, "d_i": d_i, "d_o": d_o,
                                          "k": k_wall, "length": p["length_m"],
                                          "eD": p["roughness_mm"] * 1e-3 / d_i})
                    self.volume_m3 += 0.25 * math.pi * d_i * d_i * p["length_m"]
                elif kind == "fitting":
                    self.volume_m3 += 0.25 * math.pi * (p["bore_mm"] * 1e-3) ** 2 * \
                        p.get("passage_length_mm", 25.0) * 1e-3
            if ln["role"] == "feed":
                self.feed_rise[ln["index"]] = rise

    # -- heat generated ------------------------------------------------------------
    def heat(self, op: dict) -> tuple[float, float]:
        """(hydraulic heat, pump losses) [W] of a solved operating point."""
        q_c = op["circuit_flow_lpm"] * LPM
        q_r = op["relief_flow_lpm"] * LPM
        p_out = op["pump_outlet_bar"] * BAR
        feed = 0.0
        if q_c > 0.0:
            for j, rise in self.feed_rise.items():
                ln = op["lines"][j]
                feed += max(ln["pressure_drop_bar"] * BAR - op["density_kg_m3"] * G * rise, 0.0)
        hyd_w = hydraulic_heat_w(q_c, p_out, q_r, self.relief_pa if q_r > 0.0 else 0.0, feed)
        loss = 0.0
        if self.eta_o:
            loss = op["pump_flow_lpm"] * LPM * p_out * (1.0 / self.eta_o - 1.0)
        return hyd_w, loss

    # -- heat rejected ------------------------------------------------------------
    def rejection(self, t_c: float, q_m3_s: float, air_speed_m_s: float, with_cooler: bool = True,
                  detail: bool = False) -> dict:
        """Heat rejected [W] at bulk temperature ``t_c`` with circuit flow ``q_m3_s``."""
        st = self.circuit.state(t_c)
        ta = self.t_air_c
        dt = t_c - ta
        cap = st.rho_kg_m3 * st.cp_j_kgk * q_m3_s
        pr = st.mu_pa_s * st.cp_j_kgk / st.k_w_mk
        lines_w = 0.0
        parts = [] if detail else None
        if cap > 0.0 and dt != 0.0:
            same = {}  # parts of one geometry share their UA per metre (exact: same inputs)
            for s in self.surfaces:
                key = (s["d_i"], s["d_o"], s["k"], s["eD"])
                if key not in same:
                    h_i = h_inside_pipe(s["d_i"], q_m3_s, st.nu_m2_s, st.k_w_mk, pr, s["eD"])
                    same[key] = cylinder_ua_per_m(s["d_i"], s["d_o"], s["k"], t_c, ta, air_speed_m_s, h_i)
                ua_m, ts = same[key]
                ua = ua_m * s["length"]
                w = cap * (1.0 - math.exp(-ua / cap)) * dt
                lines_w += w
                if detail:
                    parts.append({"line": s["line"], "part": s["part"], "ua_w_k": ua, "heat_w": w,
                                  "surface_temp_c": ts, "outside_mm": s["d_o"] * 1e3})
        reservoir_w = self.th["reservoir_area_m2"] * self.th["reservoir_h_w_m2k"] * dt
        cooler_w = self.cooler_w(t_c, q_m3_s, air_speed_m_s, st) if with_cooler else 0.0
        out = {"lines_w": lines_w, "reservoir_w": reservoir_w, "cooler_w": cooler_w,
               "total_w": lines_w + reservoir_w + cooler_w}
        if detail:
            out["parts"] = parts
        return out

    def cooler_tube_ua_per_m(self, t_c: float, q_m3_s: float, air_speed_m_s: float, st=None,
                             cooler: dict | None = None) -> float:
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
    def balance(self, cond: dict, t_c: float, op: dict | None = None, with_cooler: bool = True,
                detail: bool = False) -> dict:
        """Heat generated and rejected at ``cond`` with the fluid at ``t_c``."""
        if op is None:
            op = self.circuit.operating_point(cond, t_c=t_c, detail=False)
        hyd_w, loss = self.heat(op)
        rej = self.rejection(t_c, op["circuit_flow_lpm"] * LPM, cond["air_speed_m_s"], with_cooler, detail)
        return {"heat_w": hyd_w + loss, "heat_hydraulic_w": hyd_w, "heat_pump_loss_w": loss,
                "circuit_flow_m3_s": op["circuit_flow_lpm"] * LPM, "rejection": rej}


def _job_index(part: dict, k: int):
    """The part's index in the user's list (parts added by a port plan carry ``job_part``)."""
    j = part.get("job_part", k)
    return k if j is None else j


def _weighted(model: ThermalModel, duty: list, t_c: float, with_cooler: bool = True) -> tuple[float, float, list]:
    heat = rej = 0.0
    parts = []
    for cond, w in duty:
        b = model.balance(cond, t_c, with_cooler=with_cooler)
        heat += w * b["heat_w"]
        rej += w * b["rejection"]["total_w"]
        parts.append(b)
    return heat, rej, parts


def _full_lock_condition(conds: list) -> tuple[dict, str]:
    for c in conds:
        if c["full_lock"]:
            return c, f"the operating point '{c['name']}'"
    idle = min(conds, key=lambda c: c["engine_rpm"])
    return dict(idle, full_lock=True, name=idle["name"] + " (at full lock)"), \
        f"the slowest operating point '{idle['name']}' with the wheel at full lock (no full-lock point given)"


def _check(check: str, verdict: str, message: str) -> dict:
    return {"check": check, "verdict": verdict, "message": message}


def _cooler_needed(model: ThermalModel, duty: list, target_c: float) -> dict:
    """Cooler rating and tube length that hold the steady temperature at ``target_c`` (no cooler fitted)."""
    ta = model.t_air_c
    dt = target_c - ta
    heat, rej, parts = _weighted(model, duty, target_c, with_cooler=False)
    deficit = heat - rej
    out = {"w_per_k": 0.0, "tube_m": 0.0, "deficit_w": deficit, "possible": True, "message": ""}
    if deficit <= 0.0:
        out["message"] = (f"no cooler needed: the lines and reservoir alone hold the fluid at or under "
                          f"{target_c:.0f} C")
        return out
    if dt <= 0.0:
        out.update(w_per_k=None, tube_m=None, possible=False,
                   message=f"no cooler can help: the air ({ta:.0f} C) is not cooler than the target "
                           f"{target_c:.0f} C")
        return out
    st = model.circuit.state(target_c)
    caps = [(w, st.rho_kg_m3 * st.cp_j_kgk * b["circuit_flow_m3_s"]) for (_, w), b in zip(duty, parts)]
    ceiling = sum(w * c for w, c in caps) * dt
    if ceiling <= deficit:
        out.update(w_per_k=None, tube_m=None, possible=False,
                   message=f"no cooler in the return path can hold {target_c:.0f} C: even a perfect one would "
                           f"reject {ceiling:.0f} W of the {deficit:.0f} W needed (too little flow through it)")
        return out

    def rated(x):
        return sum(w * min(x, c) for w, c in caps) * dt - deficit

    lo, hi = 0.0, max(c for _, c in caps)
    for _ in range(60):
        mid = 0.5 * (lo + hi)
        lo, hi = (mid, hi) if rated(mid) < 0.0 else (lo, mid)
    out["w_per_k"] = hi
    # the same duty as a length of the chosen (or default) cooler tube
    uam = [model.cooler_tube_ua_per_m(target_c, b["circuit_flow_m3_s"], cond["air_speed_m_s"], st)
           if b["circuit_flow_m3_s"] > 0 else 0.0 for (cond, _), b in zip(duty, parts)]

    def tubed(length):
        return sum(w * c * (1.0 - math.exp(-u * length / c)) for (w, c), u in zip(caps, uam) if c > 0) * dt \
            - deficit

    if tubed(100.0) < 0.0:
        out["tube_m"] = None
        out["message"] = (f"a cooler of at least {hi:.1f} W/K is needed; more than 100 m of the chosen tube "
                          "would be needed, so use a finned or packaged cooler")
    else:
        lo, hi_l = 0.0, 100.0
        for _ in range(50):
            mid = 0.5 * (lo + hi_l)
            lo, hi_l = (mid, hi_l) if tubed(mid) < 0.0 else (lo, mid)
        out["tube_m"] = hi_l
        out["message"] = (f"a cooler of at least {hi:.1f} W/K is needed to hold {target_c:.0f} C, "
                          f"or about {hi_l:.2f} m of the chosen cooler tube")
    return out


def assess(circuit, conditions: list[dict], warnings: list | None = None,
           part_limit: tuple[float, str] | None = None) -> dict:
    """The thermal stage: heat per operating point, steady temperature, full-lock hold, cooler advice.

    Adds ``heat_w``, ``heat_hydraulic_w``, ``heat_pump_loss_w``, ``heat_rejected_w`` and
    ``heat_rejected_detail`` to each solved operating point in ``conditions`` (at that
    point's own temperature; negative when the fluid is colder than the air, which then
    warms it) and returns the ``thermal`` section of the result.
    Never raises on a validated job: a solve that fails is reported in the result.

    Parameters
    ----------
    circuit : calc.engine.Circuit
        The compiled circuit.
    conditions : list of dict
        The solved operating points, in the job's order (``Circuit.operating_point``).
    warnings : list, optional
        Unused; reserved for validity warnings.

    Returns
    -------
    thermal : dict
        ``steady_temp_c``, ``full_lock_seconds_to_limit``, ``full_lock_curve``,
        ``cooler_needed_w_per_k``, ``cooler_needed_tube_m``, ``limit_c``, ``target_c``,
        ``air_temp_c``, ``verdict``, ``message``, ``checks``, ``method`` and details.

    Examples
    --------
    >>> import json, importlib.resources as ir
    >>> from calc.engine import build
    >>> c, job, _, _, _ = build(json.loads((ir.files("calc") / "data" / "demos" /
    ...                                     "compact-hatch.json").read_text()))
    >>> th = assess(c, [c.operating_point(x) for x in job["conditions"]])
    >>> th["verdict"] in ("ok", "caution", "fail"), th["steady_temp_c"] > th["air_temp_c"]
    (True, True)
    """
    model = ThermalModel(circuit)
    job_conds = circuit.job["conditions"]
    fl = circuit.fluid
    limit = fl["max_temp_c"]
    limit_basis = f"the fluid's limit {limit:.0f} C"
    if part_limit is not None and part_limit[0] < limit:
        limit = part_limit[0]
        limit_basis = f"the limit {limit:.0f} C of {part_limit[1]}, the lowest of the circuit's parts"
    margin = model.th["limit_margin_c"]
    target = limit - margin
    ta = model.t_air_c
    for cond, op in zip(job_conds, conditions):
        b = model.balance(cond, op["fluid_temp_c"], op=op, detail=True)
        op["heat_w"] = b["heat_w"]
        op["heat_hydraulic_w"] = b["heat_hydraulic_w"]
        op["heat_pump_loss_w"] = b["heat_pump_loss_w"]
        op["heat_rejected_w"] = b["rejection"]["total_w"]
        op["heat_rejected_detail"] = b["rejection"]
    checks = []
    out = {"limit_c": limit, "limit_basis": limit_basis, "target_c": target, "margin_c": margin, "air_temp_c": ta,
           "method": list(METHOD), "hose_wall_defaulted": list(model.notes)}
    if model.notes:
        out["method"].append("Hose walls not given (" + ", ".join(model.notes) + ") use a typical wall for the "
                             "bore (from memory, braided hydraulic hose); give wall_mm from the datasheet.")
    # -- steady temperature ------------------------------------------------------
    duty = [(c, c["duty_percent"] / 100.0) for c in job_conds if c["duty_percent"] > 0.0]
    steady = None
    if not duty:
        out["steady"] = {"status": "no duty cycle", "message": "no duty cycle given (every duty_percent is 0): "
                         "give each operating point its share of time to get a steady temperature"}
        checks.append(_check("steady temperature", "caution", out["steady"]["message"]))
    else:
        res = solve_steady(lambda t: (lambda h, r, _: h - r)(*_weighted(model, duty, t)), ta, STEADY_MAX_C)
        out["steady"] = res
        steady = res["temp_c"]
        if res["status"] in ("converged", "no heat"):
            heat, rej, parts = _weighted(model, duty, steady)
            out["steady_heat_w"] = heat
            out["steady_rejected_w"] = rej
            out["steady_duty"] = [{"name": c["name"], "duty_percent": w * 100.0, "heat_w": b["heat_w"],
                                   "heat_rejected_w": b["rejection"]["total_w"],
                                   "lines_w": b["rejection"]["lines_w"],
                                   "reservoir_w": b["rejection"]["reservoir_w"],
                                   "cooler_w": b["rejection"]["cooler_w"]}
                                  for (c, w), b in zip(duty, parts)]
            if steady > limit:
                checks.append(_check("steady temperature", "fail",
                                     f"fit a cooler or cut the heat load: the fluid settles near {steady:.0f} C, "
                                     f"above {limit_basis}"))
            elif steady > target:
                checks.append(_check("steady temperature", "caution",
                                     f"the fluid settles near {steady:.0f} C, within {margin:.0f} K of "
                                     f"{limit_basis}; a cooler is advised"))
            else:
                checks.append(_check("steady temperature", "ok",
                                     f"the fluid settles near {steady:.0f} C with {ta:.0f} C air, at least "
                                     f"{margin:.0f} K under {limit_basis}"))
        else:
            checks.append(_check("steady temperature", "fail", res["message"]
                                 + ("; fit a cooler or cut the heat load" if res["status"] == "none below" else "")))
    out["steady_temp_c"] = steady
    # -- full-lock hold ------------------------------------------------------------
    fl_cond, fl_from = _full_lock_condition(job_conds)
    t0 = steady if steady is not None else fl_cond["fluid_temp_c"]
    start_from = "the steady temperature" if steady is not None else f"the temperature of {fl_from}"
    op = circuit.operating_point(fl_cond, t_c=t0, detail=False)
    power = sum(model.heat(op))
    rho0 = circuit.state(t0).rho_kg_m3
    cap = rho0 * model.volume_m3 * fl["specific_heat_j_kgk"]
    q_fl = op["circuit_flow_lpm"] * LPM
    hold = model.th["full_lock_hold_s"]
    if cap <= 0.0:
        wu = {"curve": [], "seconds_to_limit": None, "levels_off_c": None, "curve_note": "",
              "message": "no fluid volume listed (give thermal.other_volume_l): the warm-up cannot be estimated"}
    elif q_fl <= 0.0:  # no flow in the lines or a cooler: only the reservoir rejects, linear in T (fast path)
        ua_res = model.th["reservoir_area_m2"] * model.th["reservoir_h_w_m2k"]

        def rejected(t):
            return ua_res * (t - ta)
    else:
        def rejected(t):
            return model.rejection(t, q_fl, fl_cond["air_speed_m_s"])["total_w"]
    if cap > 0.0:
        wu = warmup(t0, power, rejected, cap, limit, hold, curve_stop_c=limit + CURVE_OVER_LIMIT_K)
    out["full_lock"] = {"condition": fl_from, "start_temp_c": t0, "start_from": start_from, "heat_w": power,
                        "volume_l": model.volume_m3 * 1e3, "heat_capacity_j_k": cap,
                        "levels_off_c": wu["levels_off_c"], "message": wu["message"],
                        "curve_note": wu["curve_note"]}
    out["full_lock_seconds_to_limit"] = wu["seconds_to_limit"]
    out["full_lock_curve"] = wu["curve"]
    tl = wu["seconds_to_limit"]
    if cap <= 0.0:
        checks.append(_check("full-lock hold", "caution", wu["message"]))
    elif tl is not None and tl < hold:
        checks.append(_check("full-lock hold", "caution",
                             f"do not hold the wheel at full lock for long: starting from {start_from} "
                             f"({t0:.0f} C), {wu['message']} ({power:.0f} W into {model.volume_m3 * 1e3:.2f} L)"))
    else:
        checks.append(_check("full-lock hold", "ok", f"starting from {start_from} ({t0:.0f} C), {wu['message']} "
                                                     f"within a {hold:.0f} s hold"))
    # -- cooler advice ------------------------------------------------------------------
    if duty:
        need = _cooler_needed(model, duty, target)
    else:
        need = {"w_per_k": None, "tube_m": None, "possible": None,
                "message": "no cooler advice without a duty cycle"}
    out["cooler_needed_w_per_k"] = need["w_per_k"]
    out["cooler_needed_tube_m"] = need["tube_m"]
    c = model.cooler
    out["cooler_tube"] = {"od_mm": c["tube_od_mm"], "wall_mm": c["tube_wall_mm"],
                          "fins_per_inch": c["fins_per_inch"], "fin_od_mm": c["fin_od_mm"]}
    msg = need["message"]
    if need["w_per_k"]:
        if c["type"] == "rating":
            msg += f"; the cooler given is {c['w_per_k']:.1f} W/K"
        elif c["type"] == "tube":
            msg += f"; the cooler given is {c['tube_length_m']:.2f} m of that tube"
    out["cooler_message"] = msg
    if need["possible"] is None:  # no duty cycle
        verdict = "caution"
    elif not need["possible"]:
        verdict = "fail"
    elif need["w_per_k"] == 0.0:
        verdict = "ok"
    else:  # a cooler is needed: fine if the one fitted already holds the target
        verdict = "ok" if c["type"] != "none" and steady is not None and steady <= target else "caution"
    checks.append(_check("cooler", verdict, msg))
    for ln in circuit.lines:
        for k, p in enumerate(ln["parts"]):
            if p["kind"] == "device" and p.get("is_cooler") and c["type"] == "none":
                checks.append(_check("cooler", "caution",
                                     f"lines[{ln['index']}].parts[{_job_index(p, k)}] is marked as a cooler but "
                                     "thermal.cooler "
                                     "gives no rating or tube: its heat rejection is not counted"))
    out["checks"] = checks
    order = {"ok": 0, "caution": 1, "fail": 2}
    worst = max(checks, key=lambda ch: order[ch["verdict"]])
    out["verdict"] = worst["verdict"]
    out["message"] = checks[0]["message"] if worst["verdict"] == "ok" else worst["message"]
    return out
