"""Unit kinds and their display units, for the edges (report, page, job file).

The engine never converts; the report and the page do, with this one table.
Each unit kind maps to its metric and US display unit and the linear
conversion ``us = metric * factor + offset``.

Factors are exact by definition (NIST SP 811) unless noted: 1 in = 25.4 mm,
1 lbf = 4.4482216152605 N (so 1 psi = 6894.757293168 Pa), 1 US gal = 3.785411784 L.
"""
from __future__ import annotations

import re

from ..model.result import RESULT

__all__ = ["UNITS", "to_display", "label", "localize_text", "localize_result"]

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
    "dimensionless": ("", "", 1.0, 0.0),
    "temp_rate_k_s": ("K/s", "°F/s", 1.8, 0.0),
    # 1 BTU/F = 1055.05585262 J x 1.8 /K (International Table BTU)
    "heat_capacity_j_k": ("J/K", "BTU/°F", 1 / 1899.100534716, 0.0),
}


def to_display(value: float, kind: str, system: str = "metric") -> float:
    """Convert an engine value of unit ``kind`` to the display system.

    Examples
    --------
    100 bar is 1e7 / 6894.757 = 1450.38 psi and 100 C is 212 F (NIST SP 811, exact):

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


# -- sentences -------------------------------------------------------------------
# The engine's check messages carry metric figures ("106.2 bar", "-40 to 100 C", "+18 / -36 mm").
# For a US display the page asks for them converted: each figure followed by a metric unit is
# rewritten with the same conversions as above; ranges ("2-6 m/s", "-40 to 100 C", "9.53 x 0.89 mm")
# are converted figure by figure.
def _fmt(v: float, kind: str = "") -> str:
    if kind in ("temp_c", "temp_diff_c"):
        return f"{v:.0f}"
    a = abs(v)
    if a >= 100:
        return f"{v:.0f}"
    if a >= 10:
        return f"{v:.1f}"
    if a >= 1:
        return f"{v:.2f}"
    return f"{v:.3f}"


#: metric unit word in a sentence -> (unit kind, US word)
_SENTENCE_UNITS = {
    "bar": ("pressure_bar", "psi"), "L/min": ("flow_lpm", "gpm"), "m/s": ("speed_m_s", "ft/s"),
    "mm": ("length_mm", "in"), "m": ("length_m", "ft"), "C": ("temp_c", "F"), "°C": ("temp_c", "°F"),
    "K": ("temp_diff_c", "F"), "W/K": ("conductance_w_k", "BTU/(h·F)"), "W": ("power_w", "BTU/h"),
    "L": ("volume_l", "US gal"),
}
_NUM = r"[+-]?\d+(?:\.\d+)?"
_SEP = r"(?:\s*(?:to|/|-|x)\s*)"
_UNIT_ALT = "|".join(re.escape(u) for u in sorted(_SENTENCE_UNITS, key=len, reverse=True))
_FIGURE = re.compile(rf"(?<![\w.]){_NUM}(?:{_SEP}{_NUM})* (?:{_UNIT_ALT})(?![\w/·³²])")
_ONE = re.compile(_NUM)


#: The user's own words inside an engine sentence are quoted ‘like this’ (``calc.checks.case.said``).
_QUOTED = re.compile(r"(‘[^’]*’)")


def localize_text(text: str, system: str = "metric") -> str:
    """Rewrite the metric figures of an engine sentence in the display system; the user's own words, quoted
    ‘like this’, are left as they were written.

    Examples
    --------
    Each figure by the exact factors above (106.2 bar = 1540.3 psi, 100 C = 212 F, 4.4 m/s = 14.4 ft/s,
    8 mm = 0.315 in), shown to the same few significant figures:

    >>> localize_text("must hold 106.2 bar; the fluid runs -40 to 100 C", "us")
    'must hold 1540 psi; the fluid runs -40 to 212 F'
    >>> localize_text("velocity 4.4 m/s exceeds 2-6 m/s; use -6 or a larger bore (at least 8.0 mm)", "us")
    'velocity 14.4 ft/s exceeds 6.56-19.7 ft/s; use -6 or a larger bore (at least 0.315 in)'
    >>> localize_text("at ‘idle at 20 C’ (20 C)", "us")
    'at ‘idle at 20 C’ (68 F)'
    """
    if system != "us" or not isinstance(text, str):
        return text
    return "".join(part if _QUOTED.fullmatch(part) else _localize_figures(part) for part in _QUOTED.split(text))


def _localize_figures(text: str) -> str:

    def one(m):
        figure = m.group(0)
        num_part, unit = figure.rsplit(" ", 1)
        kind, us_word = _SENTENCE_UNITS[unit]

        def conv(n):
            v = float(n.group(0))
            out = _fmt(to_display(v, kind, "us"), kind)
            return ("+" + out) if n.group(0).startswith("+") and not out.startswith("-") else out
        # a range joined by "-" has its second figure unsigned ("2-6"): keep the joiner
        converted = re.sub(r"(?<=\d)-(?=\d)", " - ", num_part)
        converted = _ONE.sub(conv, converted).replace(" - ", "-")
        return f"{converted} {us_word}"
    return _FIGURE.sub(one, text)


def _localized(obj, decl, system: str):
    """A copy of ``obj`` with every value the declaration ``decl`` calls a sentence localized."""
    if decl is None:
        return obj
    if decl.kind == "sentence":
        return localize_text(obj, system) if isinstance(obj, str) else obj
    if decl.kind == "map" and isinstance(obj, dict):
        fields = {f.key: f for f in decl.fields}
        return {k: _localized(v, fields.get(k), system) for k, v in obj.items()}
    if decl.kind == "list" and isinstance(obj, list):
        return [_localized(v, decl.item, system) for v in obj]
    return obj


def localize_result(result: dict, system: str = "metric") -> dict:
    """The result with the figures inside its sentences in the display system.

    Which strings are sentences is read from the result declaration
    (``calc.model.result``): only the engine's own sentences are converted; names and other
    text are left as they are. Numbers stay in engine units (the page and the report convert
    them by their declared unit). Returns ``result`` itself for metric, else a new result.

    Examples
    --------
    >>> r = {"thermal": {"cooler_message": "a cooler of at least 12.0 W/K is needed"}, "job_name": "at 20 C"}
    >>> localize_result(r, "us")["thermal"]["cooler_message"], localize_result(r, "us")["job_name"]
    ('a cooler of at least 22.7 BTU/(h·F) is needed', 'at 20 C')
    """
    if system != "us":
        return result
    return _localized(result, RESULT, system)
