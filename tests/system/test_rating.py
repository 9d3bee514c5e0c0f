"""Part ratings: tube rating by Barlow and Lame with the design factor and derating."""
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calc.system.rating import tube_rating


@settings(max_examples=80, deadline=None)
@given(st.floats(min_value=3.0, max_value=50.0), st.floats(min_value=0.01, max_value=0.49),
       st.floats(min_value=0.01, max_value=0.49), st.floats(min_value=50, max_value=1500))


def test_thicker_wall_never_lowers_a_tube_rating(od, f1, f2, s):
    t1, t2 = sorted((f1 * od, f2 * od))
    lo = tube_rating({"od_mm": od, "wall_mm": t1, "material": "steel-low-carbon", "tensile_mpa": s,
                              "max_temp_c": None})
    hi = tube_rating({"od_mm": od, "wall_mm": t2, "material": "steel-low-carbon", "tensile_mpa": s,
                              "max_temp_c": None})
    # Source: both formulas increase with t for fixed D (d(2St/D)/dt > 0; (D^2-d^2)/(D^2+d^2) rises as d falls)
    assert hi["working_bar"] >= lo["working_bar"] * (1 - 1e-12)
    # Source: exact inequality D (D + d) >= D^2 + d^2 for d <= D: Barlow with outside D never exceeds Lame
    assert lo["barlow_burst_bar"] <= lo["lame_burst_bar"] * (1 + 1e-12)


def test_tube_design_factor_and_derating():
    part = {"od_mm": 9.525, "wall_mm": 0.889, "material": "aluminium-6061-t6", "tensile_mpa": None,
            "max_temp_c": None}
    cold = tube_rating(part, 4.0, 20.0)
    hot = tube_rating(part, 4.0, 149.0)
    # Source: working = burst / design factor, 4:1 basis (from memory of SAE J1065)
    assert cold["working_bar"] == pytest.approx(cold["burst_bar"] / 4.0, rel=1e-12)
    # Source: data/tubes.json derating for 6061-T6 (from memory: 234 / 310 MPa at 149 C, factor 0.755)
    assert hot["tensile_mpa"] == pytest.approx(290.0 * 0.755, rel=1e-12)
