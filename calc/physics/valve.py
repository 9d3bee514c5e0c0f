"""The steering gear's open-centre valve at neutral: a pressure drop with a laminar and an inertial part.

The valve is taken as an orifice whose loss coefficient depends on its Reynolds number,
``K = K_inf + K1/Re``: the two-constant form of Hooper's 2-K method. In terms of flow it is

.. math::
    \\Delta p = \\rho (a \\nu Q + b Q^2)

so the drop rises with viscosity when the fluid is cold, where a drop scaled as flow squared alone
would not. The constants come from one measured point and the orifice's ``K1`` and ``K_inf``
(``valve_constants_one_point``), or from two measured points at different temperatures
(``valve_constants_two_points``). Hand-written: no library carries a valve model of this kind.

References
----------
.. [1] Hooper, W. B. "The 2-K Method Predicts Head Losses in Pipe Fittings." Chem. Eng., August 24,
   1981, 96-100 (the form K = K1/Re + K_inf).
.. [2] Merritt, H. E. Hydraulic Control Systems. Wiley, 1967, ch. 3 (orifice flow: Cd about 0.61 in
   turbulent flow; Cd = delta sqrt(Re) with delta about 0.2 in laminar flow; from memory).
"""
from __future__ import annotations

import math

__all__ = ["ORIFICE_K_INF", "ORIFICE_K1", "valve_drop_pa", "valve_constants_one_point",
           "valve_constants_two_points"]

#: Turbulent loss coefficient of a sharp orifice, 1/Cd^2 with Cd = 0.61 (Merritt 1967, from memory).
ORIFICE_K_INF = 1.0 / 0.61 ** 2
#: Laminar constant of a sharp orifice, 1/delta^2 with Cd = delta sqrt(Re), delta = 0.2 (Merritt 1967,
#: from memory): K = 25/Re at low Reynolds number.
ORIFICE_K1 = 1.0 / 0.2 ** 2


def valve_drop_pa(q_m3_s: float, nu_m2_s: float, rho_kg_m3: float, a: float, b: float) -> float:
    """Drop across the valve, ``rho (a nu Q + b Q^2)``.

    Parameters
    ----------
    q_m3_s : float
        Flow, [m^3/s].
    nu_m2_s, rho_kg_m3 : float
        Kinematic viscosity [m^2/s] and density [kg/m^3] of the fluid.
    a : float
        Laminar constant, [1/m^3].
    b : float
        Inertial constant, [1/m^4].

    Returns
    -------
    dp : float
        Drop, [Pa].

    Examples
    --------
    Exact arithmetic on the formula: 1 x (1 x 1 x 2 + 1 x 2^2) = 6:

    >>> valve_drop_pa(2.0, 1.0, 1.0, 1.0, 1.0)
    6.0
    """
    return rho_kg_m3 * (a * nu_m2_s * q_m3_s + b * q_m3_s * q_m3_s)


def _orifice_drop_pa(q, nu, rho, d, k1, k_inf):
    return 8.0 * rho * q * q * k_inf / (math.pi ** 2 * d ** 4) + 2.0 * rho * k1 * nu * q / (math.pi * d ** 3)


def valve_constants_one_point(dp0_pa: float, q0_m3_s: float, nu0_m2_s: float, rho0_kg_m3: float,
                              k1: float = ORIFICE_K1, k_inf: float = ORIFICE_K_INF) -> tuple[float, float]:
    r"""Constants (a, b) of an orifice that drops ``dp0_pa`` at ``q0_m3_s``, from its K1 and K_inf.

    With an equivalent bore d, :math:`K = K_\\infty + K_1/Re` gives
    :math:`\\Delta p = 8\\rho Q^2 K_\\infty/(\\pi^2 d^4) + 2\\rho K_1 \\nu Q/(\\pi d^3)`; d is solved
    (bisection, the drop falls as d grows) so the measured point is met exactly; then
    :math:`a = 2K_1/(\\pi d^3)`, :math:`b = 8K_\\infty/(\\pi^2 d^4)`.

    Parameters
    ----------
    dp0_pa : float
        Measured drop, [Pa]; > 0.
    q0_m3_s : float
        Flow at the measurement, [m^3/s]; > 0.
    nu0_m2_s, rho0_kg_m3 : float
        The fluid at the measurement, [m^2/s], [kg/m^3].
    k1, k_inf : float
        The orifice's laminar constant and turbulent coefficient, [-].

    Returns
    -------
    a, b : float
        [1/m^3], [1/m^4]; a = b = 0 for a zero drop.

    Examples
    --------
    The measured point is reproduced (exact to the bisection's 1e-12):

    >>> a, b = valve_constants_one_point(2e5, 7.5 / 60000, 10e-6, 850.0)
    >>> round(valve_drop_pa(7.5 / 60000, 10e-6, 850.0, a, b) / 2e5, 9)
    1.0
    """
    if dp0_pa <= 0.0:
        return 0.0, 0.0
    lo, hi = 1e-6, 1.0
    for _ in range(200):
        mid = math.sqrt(lo * hi)
        if _orifice_drop_pa(q0_m3_s, nu0_m2_s, rho0_kg_m3, mid, k1, k_inf) > dp0_pa:
            lo = mid
        else:
            hi = mid
        if hi / lo - 1.0 < 1e-13:
            break
    d = math.sqrt(lo * hi)
    return 2.0 * k1 / (math.pi * d ** 3), 8.0 * k_inf / (math.pi ** 2 * d ** 4)


def valve_constants_two_points(p1: tuple, p2: tuple) -> tuple[float, float] | None:
    """Constants (a, b) through two measured points ``(dp_pa, q_m3_s, nu_m2_s, rho_kg_m3)``.

    Solves ``dp/rho = a nu Q + b Q^2`` at both points (two linear equations).

    Returns
    -------
    (a, b) or None
        None when the points give no positive pair (not two different viscosities, or a drop that
        falls as the fluid gets colder).

    Examples
    --------
    Two points of Δp = ρ (2 ν Q + 3 Q²), hot and cold, give back a = 2, b = 3 (exact):

    >>> pts = [(850.0 * (2 * nu * q + 3 * q * q), q, nu, 850.0) for q, nu in ((1.0, 1.0), (0.5, 40.0))]
    >>> [round(c, 9) for c in valve_constants_two_points(*pts)]
    [2.0, 3.0]
    """
    (dp1, q1, nu1, r1), (dp2, q2, nu2, r2) = p1, p2
    m11, m12, y1 = nu1 * q1, q1 * q1, dp1 / r1
    m21, m22, y2 = nu2 * q2, q2 * q2, dp2 / r2
    det = m11 * m22 - m12 * m21
    if abs(det) < 1e-30 * max(abs(m11 * m22), abs(m12 * m21), 1e-300):
        return None
    a = (y1 * m22 - m12 * y2) / det
    b = (m11 * y2 - y1 * m21) / det
    if a < 0.0 or b < 0.0:
        return None
    return a, b
