"""Air properties and film coefficients: free and forced convection outside a cylinder,
fully developed flow inside a pipe.

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
.. [5] U.S. Standard Atmosphere, 1976. NOAA/NASA/USAF, 1976.
"""
from __future__ import annotations

import math

from fluids import ATMOSPHERE_1976
from ht import Nu_cylinder_Churchill_Bernstein, Nu_horizontal_cylinder_Churchill_Chu, laminar_T_const, \
    turbulent_Gnielinski

from .friction import RE_LAMINAR, RE_TURBULENT, friction_factor

__all__ = ["G", "AIR_CP_J_KGK", "air_properties", "h_natural_cylinder", "h_forced_cylinder",
           "h_outside_cylinder", "h_inside_pipe"]

T0 = 273.15
G = 9.80665  # standard gravity, m/s^2 (CGPM 1901)
#: Specific heat of air, [J/(kg K)]; 1007 at 300 K, 1006-1012 over 250-400 K (from memory of
#: Incropera Table A.4). The only air property not taken from fluids.ATMOSPHERE_1976.
AIR_CP_J_KGK = 1007.0

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
    At 300 K, against Incropera's Table A.4 (from memory: mu 18.46e-6 Pa s, k 0.0263 W/(m K),
    Pr 0.707):

    >>> rho, mu, k, cp, pr = air_properties(26.85)
    >>> abs(mu * 1e6 - 18.46) < 0.05, abs(k - 0.0263) < 0.0002, abs(pr - 0.707) < 0.005
    (True, True, True)

    References
    ----------
    .. [1] U.S. Standard Atmosphere, 1976. NOAA/NASA/USAF, 1976.
    .. [2] Bergman, Lavine, Incropera, DeWitt. Fundamentals of Heat and Mass Transfer, 7th ed.,
       2011, Table A.4.
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
    The published formula written out gives the same coefficient:

    >>> rho, mu, k, cp, pr = air_properties(70.0)
    >>> ra = 9.80665 * 40.0 / (70.0 + 273.15) * 0.019 ** 3 / (mu / rho) ** 2 * pr
    >>> nu_d = (0.6 + 0.387 * ra ** (1 / 6) / (1 + (0.559 / pr) ** (9 / 16)) ** (8 / 27)) ** 2
    >>> round(h_natural_cylinder(0.019, 90.0, 50.0) / (nu_d * k / 0.019), 9)
    1.0

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

    .. math::
        Nu_D = 0.3 + \frac{0.62 Re^{1/2} Pr^{1/3}}{[1 + (0.4/Pr)^{2/3}]^{1/4}}
        \left[1 + \left(\frac{Re}{282000}\right)^{5/8}\right]^{4/5}

    evaluated by ``ht.Nu_cylinder_Churchill_Bernstein`` with air properties at the
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
    The published formula written out gives the same coefficient:

    >>> rho, mu, k, cp, pr = air_properties(70.0)
    >>> re = rho * 5.0 * 0.019 / mu
    >>> nu_d = 0.3 + 0.62 * re ** 0.5 * pr ** (1 / 3) / (1 + (0.4 / pr) ** (2 / 3)) ** 0.25 * (
    ...     1 + (re / 282000) ** (5 / 8)) ** 0.8
    >>> round(h_forced_cylinder(0.019, 5.0, 90.0, 50.0) / (nu_d * k / 0.019), 9)
    1.0

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
        Film coefficient, [W/(m^2 K)].

    Examples
    --------
    In still air it is the free-convection coefficient (exact, to rounding of the cube root):

    >>> round(h_outside_cylinder(0.019, 0.0, 90.0, 50.0) / h_natural_cylinder(0.019, 90.0, 50.0), 12)
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
    factor) above 4000; linear in Re between.

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

    Returns
    -------
    h : float
        Film coefficient, [W/(m^2 K)].

    Notes
    -----
    Ignoring the entry length underestimates the laminar coefficient (conservative for
    heat rejection).

    Examples
    --------
    Laminar flow (Re 1675): Nu = 3.66 for a constant wall temperature (exact, Graetz limit):

    >>> round(h_inside_pipe(0.0095, 7.5 / 60000, 10e-6, 0.13, 130.0) * 0.0095 / 0.13, 4)
    3.66

    References
    ----------
    .. [1] Gnielinski, V. Int. Chem. Eng. 16, 1976, 359-368.
    """
    nu_lam = laminar_T_const()
    re = 4.0 * q_m3_s / (math.pi * d_m * nu_m2_s) if q_m3_s > 0.0 else 0.0
    if re < RE_LAMINAR:
        nusselt = nu_lam
    else:
        re_t = max(re, RE_TURBULENT)
        nu_t = turbulent_Gnielinski(Re=re_t, Pr=pr, fd=friction_factor(re_t, rel_roughness))
        if re >= RE_TURBULENT:
            nusselt = nu_t
        else:
            w = (re - RE_LAMINAR) / (RE_TURBULENT - RE_LAMINAR)
            nusselt = nu_lam + w * (nu_t - nu_lam)
    return nusselt * k_w_mk / d_m
