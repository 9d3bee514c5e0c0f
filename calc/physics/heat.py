"""Heat in the fluid and through a line's wall: throttling, fins, resistances in series.

References
----------
.. [1] Bergman, T. L., Lavine, A. S., Incropera, F. P., DeWitt, D. P.
   Fundamentals of Heat and Mass Transfer, 7th ed. Wiley, 2011 (thermal resistances in
   series, ch. 3; extended surfaces, ch. 3.6).
.. [2] Schmidt, T. E. "Heat Transfer Calculations for Extended Surfaces."
   Refrigerating Engineering 57, 1949, 351-357.
"""
from __future__ import annotations

import math

from .convection import h_outside_cylinder

__all__ = ["temp_rise_c", "annular_fin_efficiency", "cylinder_resistances_per_m", "cylinder_ua_per_m",
           "wall_temperatures_c"]


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
    A drop of rho cp x 1 K raises the fluid by 1 K (exact); 10 bar in mineral oil (870 kg/m^3,
    1900 J/(kg K)) gives about 0.6 K, near the 0.57 K per 10 bar of common practice:

    >>> temp_rise_c(870.0 * 1900.0, 870.0, 1900.0)
    1.0
    >>> abs(temp_rise_c(10e5, 870.0, 1900.0) - 0.57) < 0.05
    True

    References
    ----------
    .. [1] Energy balance of adiabatic throttling of an incompressible liquid, h = u + p/rho.
    """
    return max(dp_pa, 0.0) / (rho_kg_m3 * cp_j_kgk)


def annular_fin_efficiency(d_tube_m: float, d_fin_m: float, t_fin_m: float, k_fin_w_mk: float,
                           h_w_m2k: float) -> float:
    r"""Efficiency of a thin annular fin with an insulated tip, Schmidt's approximation.

    .. math::
        \eta = \frac{\tanh(m r_1 \phi)}{m r_1 \phi},\quad m = \sqrt{2h/(k t)},\quad
        \phi = (R - 1)(1 + 0.35 \ln R),\quad R = r_2/r_1

    Hand-written because ``ht.fin_efficiency_Kern_Kraus`` (the exact Bessel-function
    solution) needs scipy, which the browser engine does not have. Within a few
    per cent of the exact solution for R up to about 4.

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

    Returns
    -------
    eta : float
        Fin efficiency, [-].

    Examples
    --------
    The exact Bessel-function solution (``ht.fin_efficiency_Kern_Kraus``, evaluated with scipy)
    gives 0.841 for this fin; Schmidt's approximation is within 2 %:

    >>> abs(annular_fin_efficiency(0.0254, 0.05715, 3.8e-4, 200.0, 58.0) / 0.841 - 1) < 0.02
    True

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


def _outside_area_per_m(d_o_m: float, fins: dict | None) -> tuple[float, float]:
    if not fins:
        return math.pi * d_o_m, 0.0
    n = fins["per_m"]
    a_bare = math.pi * d_o_m * max(1.0 - n * fins["t_fin_m"], 0.0)
    return a_bare, n * 2.0 * 0.25 * math.pi * (fins["d_fin_m"] ** 2 - d_o_m ** 2)


def cylinder_resistances_per_m(d_i_m: float, d_o_m: float, k_wall_w_mk: float, t_fluid_c: float,
                               t_air_c: float, air_speed_m_s: float, h_inside_w_m2k: float,
                               fins: dict | None = None) -> tuple[float, float, float]:
    r"""The three thermal resistances per metre of a pipe or hose, fluid to air.

    .. math::
        R'_i = \frac{1}{h_i \pi d_i},\quad R'_w = \frac{\ln(d_o/d_i)}{2\pi k},\quad
        R'_o = \frac{1}{h_o (A'_{bare} + \eta_f A'_{fin})}

    The outside film ``h_o`` (``calc.physics.convection.h_outside_cylinder``) depends on the
    surface temperature, which is iterated (fixed point, to 0.01 K, at most 12 passes) with
    the surface where the resistances in series put it (:func:`wall_temperatures_c`). Works
    for air cooler or hotter than the fluid.

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
    r_inside, r_wall, r_outside : float
        Inside film, wall conduction and outside film per metre of length, [K m/W].

    Notes
    -----
    Steady conduction through resistances in series (exact for a constant-property
    cylinder wall); radiation is not included.

    Examples
    --------
    The wall term is the exact conduction resistance of a cylinder, ln(2)/(2 pi k) for a
    wall as thick as the bore's radius:

    >>> r_i, r_w, r_o = cylinder_resistances_per_m(0.01, 0.02, 0.25, 90.0, 50.0, 0.0, 50.0)
    >>> round(r_w * 2 * math.pi * 0.25 / math.log(2.0), 12), round(r_i * 50.0 * math.pi * 0.01, 12)
    (1.0, 1.0)

    References
    ----------
    .. [1] Bergman, Lavine, Incropera, DeWitt. Fundamentals of Heat and Mass Transfer, 7th ed.,
       2011, ch. 3 (resistances in series) and ch. 11.
    """
    r_in = 1.0 / (h_inside_w_m2k * math.pi * d_i_m)
    r_wall = math.log(d_o_m / d_i_m) / (2.0 * math.pi * k_wall_w_mk)
    a_bare, a_fin = _outside_area_per_m(d_o_m, fins)
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
            break
        ts = ts_new
    return r_in, r_wall, r_out


def wall_temperatures_c(t_fluid_c: float, t_air_c: float, r_inside_k_w: float, r_wall_k_w: float,
                        r_outside_k_w: float) -> tuple[float, float]:
    r"""Inner and outer surface temperatures of a line's wall from three resistances in series.

    .. math::
        T_{in} = T_f - (T_f - T_a)\frac{R_i}{R_i + R_w + R_o},\quad
        T_{out} = T_a + (T_f - T_a)\frac{R_o}{R_i + R_w + R_o}

    The same steady heat flows through each resistance, so the fluid-to-air difference
    divides as the resistances do. With the air hotter than the fluid (a line routed past an
    exhaust manifold or turbo) the outer surface is the hottest point of the wall; with the
    fluid hotter, the inner surface, itself no hotter than the fluid.

    Parameters
    ----------
    t_fluid_c, t_air_c : float
        Fluid bulk and surrounding air temperatures, [C].
    r_inside_k_w, r_wall_k_w, r_outside_k_w : float
        Inside film, wall conduction and outside film resistances, [K/W] (or all per metre,
        [K m/W]: only their ratios count); each >= 0, their sum > 0.

    Returns
    -------
    t_inner_c, t_outer_c : float
        Temperatures of the wall's inner and outer surfaces, [C]; both lie between the fluid
        and air temperatures.

    Notes
    -----
    Steady conduction and convection only. Radiation is not included: a hot surface nearby
    (a manifold at several hundred C) radiates to the line and makes its wall facing it hotter
    than this estimate, which is then a lower bound there. The fluid is taken at its bulk
    temperature along the part.

    Examples
    --------
    Equal resistances put the outer surface a third of the way from the air to the fluid,
    the inner surface two thirds (exact for resistances in series):

    >>> wall_temperatures_c(90.0, 30.0, 1.0, 1.0, 1.0)
    (70.0, 50.0)

    No inside film resistance puts the inner surface at the fluid temperature (exact):

    >>> wall_temperatures_c(90.0, 300.0, 0.0, 1.0, 2.0)
    (90.0, 160.0)

    References
    ----------
    .. [1] Bergman, Lavine, Incropera, DeWitt. Fundamentals of Heat and Mass Transfer, 7th ed.,
       2011, sec. 3.3 (the composite cylinder wall, resistances in series).
    """
    total = r_inside_k_w + r_wall_k_w + r_outside_k_w
    dt = t_fluid_c - t_air_c
    return t_fluid_c - dt * r_inside_k_w / total, t_air_c + dt * r_outside_k_w / total


def cylinder_ua_per_m(d_i_m: float, d_o_m: float, k_wall_w_mk: float, t_fluid_c: float, t_air_c: float,
                      air_speed_m_s: float, h_inside_w_m2k: float, fins: dict | None = None
                      ) -> tuple[float, float]:
    r"""Overall conductance per metre of a pipe or hose, fluid to air.

    .. math::
        \frac{1}{UA'} = \frac{1}{h_i \pi d_i} + \frac{\ln(d_o/d_i)}{2\pi k}
        + \frac{1}{h_o (A'_{bare} + \eta_f A'_{fin})}

    The resistances of :func:`cylinder_resistances_per_m`, the outside film at its iterated
    surface temperature.

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

    Notes
    -----
    Steady conduction through resistances in series (exact for a constant-property
    cylinder wall); radiation is not included.

    Examples
    --------
    The surface temperature divides the fluid-to-air difference as the resistances do
    (exact for resistances in series): the outside film's share of the total.

    >>> from calc.physics.convection import h_outside_cylinder
    >>> ua, ts = cylinder_ua_per_m(0.00775, 0.00953, 50.0, 100.0, 50.0, 0.0, 60.0)
    >>> r_out = 1 / (h_outside_cylinder(0.00953, 0.0, ts, 50.0) * math.pi * 0.00953)
    >>> abs((ts - 50.0) / 50.0 - r_out * ua) < 2e-3
    True

    References
    ----------
    .. [1] Bergman, Lavine, Incropera, DeWitt. Fundamentals of Heat and Mass Transfer, 7th ed.,
       2011, ch. 3 (resistances in series) and ch. 11.
    """
    r_in, r_wall, r_out = cylinder_resistances_per_m(d_i_m, d_o_m, k_wall_w_mk, t_fluid_c, t_air_c,
                                                     air_speed_m_s, h_inside_w_m2k, fins)
    return 1.0 / (r_in + r_wall + r_out), wall_temperatures_c(t_fluid_c, t_air_c, r_in, r_wall, r_out)[1]
