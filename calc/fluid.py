"""Fluid properties: viscosity by ASTM D341, density with thermal expansion.

All functions take SI temperatures in kelvin unless the name says ``_c``.

References
----------
.. [1] ASTM D341-20, Standard Practice for Viscosity-Temperature Equations and
   Charts for Liquid Petroleum or Hydrocarbon Products. ASTM International.
.. [2] ISO 3448:1992, Industrial liquid lubricants - ISO viscosity classification.
"""
from __future__ import annotations

import math

__all__ = ["PRESETS", "walther_coefficients", "viscosity_cst", "density_kg_m3", "resolve", "FluidState",
           "state"]

T0 = 273.15
#: Lowest viscosity ASTM D341 covers (0.21 cSt, from memory of D341-20); results are held there.
NU_MIN_CST = 0.21
#: Highest viscosity the engine accepts at an operating point, cSt (a fluid that no longer flows).
NU_MAX_CST = 1.0e6

#: Generic fluids. Every value is typical of the class, from memory, not a
#: product's data: use the fluid maker's datasheet for a real job.
PRESETS = {
    "atf-typical": {  # from memory: typical automatic-transmission-type fluid
        "name": "Typical transmission-type fluid (generic)",
        "visc_40c_cst": 34.0, "visc_100c_cst": 7.2, "density_15c_kg_m3": 855.0,
        "specific_heat_j_kgk": 1950.0, "expansion_per_k": 0.0007, "conductivity_w_mk": 0.135,
        "max_temp_c": 125.0, "source": "from memory",
    },
    "ps-mineral": {  # from memory: mineral power-steering fluid
        "name": "Mineral power-steering fluid (generic)",
        "visc_40c_cst": 36.0, "visc_100c_cst": 7.0, "density_15c_kg_m3": 870.0,
        "specific_heat_j_kgk": 1900.0, "expansion_per_k": 0.0007, "conductivity_w_mk": 0.13,
        "max_temp_c": 120.0, "source": "from memory",
    },
    "synthetic-low-visc": {  # from memory: low-viscosity synthetic steering fluid, high VI
        "name": "Low-viscosity synthetic fluid (generic)",
        "visc_40c_cst": 18.0, "visc_100c_cst": 6.0, "density_15c_kg_m3": 835.0,
        "specific_heat_j_kgk": 2100.0, "expansion_per_k": 0.0007, "conductivity_w_mk": 0.14,
        "max_temp_c": 135.0, "source": "from memory",
    },
    "iso-vg32": {  # 40 C value: ISO 3448 midpoint; 100 C value for VI near 100, from memory
        "name": "ISO VG 32 hydraulic oil (generic)",
        "visc_40c_cst": 32.0, "visc_100c_cst": 5.4, "density_15c_kg_m3": 870.0,
        "specific_heat_j_kgk": 1880.0, "expansion_per_k": 0.00065, "conductivity_w_mk": 0.13,
        "max_temp_c": 100.0, "source": "ISO 3448 (40 C); from memory (the rest)",
    },
    "iso-vg46": {  # 40 C value: ISO 3448 midpoint; 100 C value for VI near 100, from memory
        "name": "ISO VG 46 hydraulic oil (generic)",
        "visc_40c_cst": 46.0, "visc_100c_cst": 6.8, "density_15c_kg_m3": 875.0,
        "specific_heat_j_kgk": 1880.0, "expansion_per_k": 0.00065, "conductivity_w_mk": 0.13,
        "max_temp_c": 100.0, "source": "ISO 3448 (40 C); from memory (the rest)",
    },
}

#: Defaults for a custom fluid's optional values (from memory, mineral oil).
CUSTOM_DEFAULTS = {"expansion_per_k": 0.0007, "conductivity_w_mk": 0.13, "max_temp_c": 120.0}


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

    Examples
    --------
    >>> A, B = walther_coefficients(313.15, 32.0, 373.15, 5.4)
    >>> round(B, 3)
    3.747

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

    Valid within the liquid range of the fluid; ASTM D341 states the line is
    good from the cloud point to the initial boiling point, and down to
    0.21 cSt (results are held at that floor). Raises ``ValueError`` where the
    line would give a viscosity beyond any flowing liquid. Extrapolating far
    below the lower datasheet point (cold start) is the usual practice and
    is what the standard's chart is for, but it is an estimate.

    Examples
    --------
    >>> A, B = walther_coefficients(313.15, 32.0, 373.15, 5.4)
    >>> round(viscosity_cst(A, B, 313.15), 6)
    32.0
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

    Examples
    --------
    >>> round(density_kg_m3(870.0, 0.0007, 90.0), 2)
    826.6
    """
    return rho15_kg_m3 / (1.0 + beta_per_k * (t_c - 15.0))


def resolve(fluid: dict) -> dict:
    """Fill a validated fluid record from its preset; the user's own values win."""
    preset = fluid.get("preset")
    base = dict(PRESETS[preset]) if preset in PRESETS else {"name": "Custom fluid", "source": "user",
                                                            **CUSTOM_DEFAULTS}
    out = dict(base)
    for k, v in fluid.items():
        if v is not None and v != "":
            out[k] = v
    if preset in PRESETS and any(fluid.get(k) is not None for k in PRESETS[preset] if k not in ("name", "source")):
        out["source"] = base["source"] + "; user values where given"
    out["preset"] = preset
    A, B = walther_coefficients(40.0 + T0, out["visc_40c_cst"], 100.0 + T0, out["visc_100c_cst"])
    out["walther_a"], out["walther_b"] = A, B
    return out


class FluidState:
    """The fluid's state at one temperature (SI)."""

    __slots__ = ("t_c", "nu_m2_s", "rho_kg_m3", "mu_pa_s", "cp_j_kgk", "k_w_mk")

    def __init__(self, t_c, nu_m2_s, rho_kg_m3, cp_j_kgk, k_w_mk):
        self.t_c = t_c
        self.nu_m2_s = nu_m2_s
        self.rho_kg_m3 = rho_kg_m3
        self.mu_pa_s = nu_m2_s * rho_kg_m3
        self.cp_j_kgk = cp_j_kgk
        self.k_w_mk = k_w_mk


def state(fluid: dict, t_c: float) -> FluidState:
    """Fluid state at ``t_c`` [C] for a resolved fluid record (see ``resolve``).

    Examples
    --------
    >>> s = state(resolve({"preset": "iso-vg32"}), 40.0)
    >>> round(s.nu_m2_s * 1e6, 3)
    32.0
    """
    nu = viscosity_cst(fluid["walther_a"], fluid["walther_b"], t_c + T0) * 1e-6
    rho = density_kg_m3(fluid["density_15c_kg_m3"], fluid["expansion_per_k"], t_c)
    return FluidState(t_c, nu, rho, fluid["specific_heat_j_kgk"], fluid["conductivity_w_mk"])
