"""Practice constants: the trade's rules of thumb and the engine's stated choices, each with its basis.

Every check that compares with a limit of practice reads it here, so a limit has one home.
"""
from __future__ import annotations

__all__ = ["INLET_MIN_BAR", "INLET_FLOOR_BAR", "COLD_START_MAX_C", "VELOCITY_BANDS_M_S", "TEMP_CAUTION_K", "LOW_PRESSURE_BAR", "TABLE_ROUNDING",
           "CURVE_OVER_LIMIT_K", "THREAD_TOLERANCE", "METRIC_PITCH_MAX_MM", "DP_BUDGET_BAR", "PROOF_TEST_FACTOR", "METRIC_END_WINDOW"]

#: Lowest pump-inlet gauge pressure before aeration and cavitation, bar (common practice, no source).
INLET_MIN_BAR = -0.2
#: Lowest gauge pressure any fluid can reach: a vacuum, less the vapour pressure of hydraulic oil (well under
#: 0.01 bar absolute, from memory), from the standard atmosphere of 1.01325 bar (exact by definition).
INLET_FLOOR_BAR = -1.01325 + 0.01
#: An operating point at or below this fluid temperature is a cold start, where a relief that cracks open at
#: neutral is expected until the fluid warms, C (a stated choice).
COLD_START_MAX_C = 10.0

#: Velocity bands by line role, m/s (common practice, no single source): feed 0.6-1.2 m/s (2-4 ft/s),
#: return 1.5-3 m/s (5-10 ft/s), pressure 2-6 m/s (7-20 ft/s).
VELOCITY_BANDS_M_S = {"feed": (0.6, 1.2), "return": (1.5, 3.0), "pressure": (2.0, 6.0)}

#: Caution band below a temperature limit, K: ageing of rubber and oil roughly doubles per 10 K
#: (common practice, no source).
TEMP_CAUTION_K = 10.0

#: Below this gauge pressure a line's pressure rating is not checked against a required figure, bar
#: (a stated choice: feed and drain lines that stay near atmospheric).
LOW_PRESSURE_BAR = 1.0

#: Relative slack in the design-factor check for the rounding of tabulated bar figures (0.5 %, a stated
#: choice).
TABLE_ROUNDING = 0.005

#: The full-lock curve ends this far above the fluid's limit, K (a stated choice: the lumped model means
#: nothing far above the limit).
CURVE_OVER_LIMIT_K = 25.0

#: Pressure-drop budgets by line role, bar: (warm operating points, cold start). Common practice, no source:
#: a warm pressure line should lose no more than a few per cent of a typical 80-110 bar relief setting, a warm
#: return line a few bar (its drop is back-pressure on the gear's seals); at cold start drops several times
#: larger are accepted while the fluid warms. The feed line's budget is the pump-inlet limit. A line's own
#: budget fields override these.
DP_BUDGET_BAR = {"pressure": (5.0, 25.0), "return": (3.0, 10.0), "feed": (None, None)}

#: Proof-test pressure of a hose assembly as a multiple of its working pressure (common practice, no source:
#: assemblies are proof tested at twice their rated working pressure).
PROOF_TEST_FACTOR = 2.0

#: Tube outside diameter of a metric hose end against the hose's bore: from 0.9 x bore to bore + 7 mm
#: (common practice, no source: a hose takes ends one or two tube sizes over its bore).
METRIC_END_WINDOW = (0.9, 7.0)

#: A pitch reading in mm above this is no metric pitch and is read as threads per inch: the coarsest
#: pitch of ISO 261 is 6 mm (M68 and up, from memory), while inch gauges read 4 to 80 (common practice,
#: no source; a fitting thread of this size range never comes near 6 mm).
METRIC_PITCH_MAX_MM = 6.0

#: Tolerances of thread identification (see ``calc.system.threads`` for the reasoning).
THREAD_TOLERANCE = {
    "male_under_mm": 0.35, "male_over_mm": 0.10,
    "female_under_mm": 0.10, "female_over_mm": 0.40,
    "pitch_percent": 1.0,
    "taper_widening": "gauge length / 16 on both sides (tapered threads only)",
    "source": "common practice, no source; allowances after ASME B1.1 class 2A/2B and ISO 965-1 6g/6H (from memory)",
}
