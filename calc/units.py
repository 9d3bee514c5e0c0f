"""Unit kinds and their display units, for the edges (report, page, job file).

The engine never converts; the report and the page do, with this one table.
Each unit kind maps to its metric and US display unit and the linear
conversion ``us = metric * factor + offset``.

Factors are exact by definition (NIST SP 811) unless noted: 1 in = 25.4 mm,
1 lbf = 4.4482216152605 N (so 1 psi = 6894.757293168 Pa), 1 US gal = 3.785411784 L.
"""
from __future__ import annotations

__all__ = ["UNITS", "to_display", "label"]

PSI_PER_BAR = 1e5 / 6894.757293168361
GPM_PER_LPM = 1.0 / 3.785411784

#: kind: (metric label, US label, factor, offset)
UNITS = {
    "length_mm": ("mm", "in", 1 / 25.4, 0.0),
    "length_m": ("m", "ft", 1 / 0.3048, 0.0),
    "pressure_bar": ("bar", "psi", PSI_PER_BAR, 0.0),
    "flow_lpm": ("L/min", "gpm", GPM_PER_LPM, 0.0),
    "temp_c": ("°C", "°F", 1.8, 32.0),
    "temp_diff_c": ("K", "°F", 1.8, 0.0),
    "speed_m_s": ("m/s", "ft/s", 1 / 0.3048, 0.0),
    "viscosity_cst": ("cSt", "cSt", 1.0, 0.0),
    "density_kg_m3": ("kg/m³", "lb/ft³", 1 / 16.01846337396, 0.0),
    "specific_heat_j_kgk": ("J/(kg·K)", "BTU/(lb·°F)", 1 / 4186.8, 0.0),
    "displacement_cc": ("cm³/rev", "in³/rev", 1 / 16.387064, 0.0),
    "power_w": ("W", "BTU/h", 3.412141633, 0.0),
    "conductance_w_k": ("W/K", "BTU/(h·°F)", 3.412141633 / 1.8, 0.0),
    "volume_l": ("L", "US gal", GPM_PER_LPM, 0.0),
    "area_m2": ("m²", "ft²", 1 / 0.09290304, 0.0),
    "stress_mpa": ("MPa", "ksi", 1e6 / 6894757.293168361, 0.0),
    "speed_rpm": ("rpm", "rpm", 1.0, 0.0),
    "ratio": ("", "", 1.0, 0.0),
    "percent": ("%", "%", 1.0, 0.0),
    "angle_deg": ("°", "°", 1.0, 0.0),
    "time_s": ("s", "s", 1.0, 0.0),
    "per_k": ("1/K", "1/°F", 1 / 1.8, 0.0),
    "conductivity_w_mk": ("W/(m·K)", "BTU/(h·ft·°F)", 0.5781759824, 0.0),
    "film_w_m2k": ("W/(m²·K)", "BTU/(h·ft²·°F)", 0.1761101838, 0.0),
    "count": ("", "", 1.0, 0.0),
}


def to_display(value: float, kind: str, system: str = "metric") -> float:
    """Convert an engine value of unit ``kind`` to the display system.

    Examples
    --------
    >>> round(to_display(100.0, "pressure_bar", "us"), 2)
    1450.38
    >>> to_display(100.0, "temp_c", "us")
    212.0
    """
    if system == "metric" or kind not in UNITS:
        return value
    _, _, f, o = UNITS[kind]
    return value * f + o


def label(kind: str, system: str = "metric") -> str:
    """Display label of a unit kind ('bar' or 'psi', ...)."""
    if kind not in UNITS:
        return ""
    return UNITS[kind][0 if system == "metric" else 1]
