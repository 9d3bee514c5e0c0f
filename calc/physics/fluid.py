"""Fluid properties: viscosity by ASTM D341 (Walther), density with thermal expansion.

Temperatures are in kelvin where the name says ``_k`` and in degrees Celsius where it
says ``_c``; viscosities in cSt (mm^2/s) where the name says ``_cst``.

References
----------
.. [1] ASTM D341-20, Standard Practice for Viscosity-Temperature Equations and
   Charts for Liquid Petroleum or Hydrocarbon Products. ASTM International.
.. [2] ISO 3448:1992, Industrial liquid lubricants - ISO viscosity classification.
"""
from __future__ import annotations

import math

__all__ = ["T0", "NU_MIN_CST", "NU_MAX_CST", "walther_coefficients", "viscosity_cst", "density_kg_m3",
           "FluidState", "fluid_state"]

T0 = 273.15
#: Lowest viscosity ASTM D341 covers (0.21 cSt, from memory of D341-20); results are held there.
NU_MIN_CST = 0.21
#: Highest viscosity the engine accepts at an operating point, cSt (a fluid that no longer flows).
NU_MAX_CST = 1.0e6


def _z(nu_cst: float) -> float:
    # ASTM D341 Z with the low-viscosity correction term (from memory of D341-09/20).
    return nu_cst + 0.7 + math.exp(-1.47 - 1.84 * nu_cst - 0.51 * nu_cst * nu_cst)


def _nu_from_z(z: float) -> float:
    # Inverse of _z per ASTM D341 (from memory of D341-09/20); exact to ~0.01 cSt above 0.2 cSt.
    y = z - 0.7
    return y - math.exp(-0.7487 - 3.295 * y + 0.6119 * y * y - 0.3193 * y ** 3)


def walther_coefficients(t1_k: float, nu1_cst: float, t2_k: float, nu2_cst: float) -> tuple[float, float]:
    r"""Constants A, B of the ASTM D341 (Walther) viscosity-temperature line.

    .. math::
        \log_{10}\log_{10} Z = A - B \log_{10} T

    with :math:`Z = \nu + 0.7 + e^{-1.47 - 1.84\nu - 0.51\nu^2}` (:math:`\nu` in cSt, T in K).

    Parameters
    ----------
    t1_k, t2_k : float
        Temperatures of the two datasheet points, [K].
    nu1_cst, nu2_cst : float
        Kinematic viscosities at those temperatures, [cSt = mm^2/s].

    Returns
    -------
    A, B : float
        Walther constants, [-].

    Notes
    -----
    The line passes exactly through both points (two equations, two unknowns).

    Examples
    --------
    The line through 32 cSt at 40 C and 5.4 cSt at 100 C returns 32 cSt at 40 C (exact):

    >>> A, B = walther_coefficients(313.15, 32.0, 373.15, 5.4)
    >>> round(viscosity_cst(A, B, 313.15), 9)
    32.0

    References
    ----------
    .. [1] ASTM D341-20.
    """
    y1 = math.log10(math.log10(_z(nu1_cst)))
    y2 = math.log10(math.log10(_z(nu2_cst)))
    x1, x2 = math.log10(t1_k), math.log10(t2_k)
    B = (y1 - y2) / (x2 - x1)
    A = y1 + B * x1
    return A, B


def viscosity_cst(A: float, B: float, t_k: float) -> float:
    """Kinematic viscosity [cSt] at ``t_k`` [K] from the Walther constants.

    Parameters
    ----------
    A, B : float
        Walther constants from :func:`walther_coefficients`, [-].
    t_k : float
        Temperature, [K].

    Returns
    -------
    nu : float
        Kinematic viscosity, [cSt]; never below ``NU_MIN_CST``.

    Raises
    ------
    ValueError
        Where the line would give a viscosity beyond any flowing liquid.

    Notes
    -----
    ASTM D341 states the line is good from the cloud point to the initial boiling
    point, and down to 0.21 cSt (results are held at that floor). Extrapolating far
    below the lower datasheet point (cold start) is the usual practice and is what
    the standard's chart is for, but it is an estimate.

    Examples
    --------
    Both datasheet points are reproduced (exact):

    >>> A, B = walther_coefficients(313.15, 32.0, 373.15, 5.4)
    >>> round(viscosity_cst(A, B, 373.15), 9)
    5.4
    """
    inner = A - B * math.log10(t_k)
    if inner > 2.3:  # Z above 1e199: no liquid of this kind; refuse rather than overflow
        raise ValueError("viscosity beyond any flowing liquid at this temperature")
    z = 10.0 ** (10.0 ** inner)
    nu = _nu_from_z(z) if z < 3.0 else z - 0.7
    return max(nu, NU_MIN_CST)


def density_kg_m3(rho15_kg_m3: float, beta_per_k: float, t_c: float) -> float:
    r"""Density with thermal expansion, :math:`\rho = \rho_{15} / (1 + \beta (T - 15))`.

    Parameters
    ----------
    rho15_kg_m3 : float
        Density at 15 C, [kg/m^3].
    beta_per_k : float
        Volumetric expansion coefficient, [1/K]; about 0.00065-0.0007 for mineral oil (from memory).
    t_c : float
        Temperature, [C].

    Returns
    -------
    rho : float
        Density, [kg/m^3].

    Notes
    -----
    Constant expansion coefficient, so valid over the liquid range where it holds
    (about -40 to 150 C for hydraulic oils).

    Examples
    --------
    At 15 C the reference density is returned (exact); 90 C with beta 0.0007 /K divides it by 1.0525:

    >>> density_kg_m3(870.0, 0.0007, 15.0)
    870.0
    >>> round(density_kg_m3(870.0, 0.0007, 90.0) * 1.0525, 9)
    870.0
    """
    return rho15_kg_m3 / (1.0 + beta_per_k * (t_c - 15.0))


class FluidState:
    """The fluid's state at one temperature (SI): ``t_c``, ``nu_m2_s``, ``rho_kg_m3``, ``mu_pa_s``,
    ``cp_j_kgk``, ``k_w_mk``."""

    __slots__ = ("t_c", "nu_m2_s", "rho_kg_m3", "mu_pa_s", "cp_j_kgk", "k_w_mk")

    def __init__(self, t_c, nu_m2_s, rho_kg_m3, cp_j_kgk, k_w_mk):
        self.t_c = t_c
        self.nu_m2_s = nu_m2_s
        self.rho_kg_m3 = rho_kg_m3
        self.mu_pa_s = nu_m2_s * rho_kg_m3
        self.cp_j_kgk = cp_j_kgk
        self.k_w_mk = k_w_mk


def fluid_state(walther_a: float, walther_b: float, rho15_kg_m3: float, beta_per_k: float,
                cp_j_kgk: float, k_w_mk: float, t_c: float) -> FluidState:
    """Fluid state at ``t_c`` [C] from its Walther constants and its datasheet values.

    Parameters
    ----------
    walther_a, walther_b : float
        Walther constants, [-] (:func:`walther_coefficients`).
    rho15_kg_m3 : float
        Density at 15 C, [kg/m^3].
    beta_per_k : float
        Volumetric expansion coefficient, [1/K].
    cp_j_kgk : float
        Specific heat, [J/(kg K)] (taken constant).
    k_w_mk : float
        Thermal conductivity, [W/(m K)] (taken constant).
    t_c : float
        Temperature, [C].

    Returns
    -------
    FluidState

    Examples
    --------
    The datasheet point the line was fitted through comes back at 40 C (exact):

    >>> A, B = walther_coefficients(313.15, 32.0, 373.15, 5.4)
    >>> s = fluid_state(A, B, 870.0, 0.00065, 1880.0, 0.13, 40.0)
    >>> round(s.nu_m2_s * 1e6, 9)
    32.0
    """
    nu = viscosity_cst(walther_a, walther_b, t_c + T0) * 1e-6
    rho = density_kg_m3(rho15_kg_m3, beta_per_k, t_c)
    return FluidState(t_c, nu, rho, cp_j_kgk, k_w_mk)
