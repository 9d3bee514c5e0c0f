"""Darcy friction factor against an independent Colebrook solution and Moody chart readings."""
import math

import pytest

from calc.physics.friction import RE_LAMINAR, RE_TURBULENT, friction_factor


def _colebrook_reference(re, ed):
    # Colebrook (1939) solved independently here by fixed-point iteration on 1/sqrt(f).
    x = 8.0
    for _ in range(200):
        x = -2.0 * math.log10(ed / 3.7 + 2.51 * x / re)
    return 1.0 / (x * x)


@pytest.mark.parametrize("re", [5e3, 1e4, 1e5, 1e6, 1e7])
@pytest.mark.parametrize("ed", [0.0, 1e-5, 1e-4, 1e-3, 1e-2])
def test_colebrook_against_independent_solution(re, ed):
    # Source: Colebrook's equation, solved independently (exact to iteration tolerance).
    assert friction_factor(re, ed) == pytest.approx(_colebrook_reference(re, ed), rel=1e-9)


@pytest.mark.parametrize("re, ed, f_moody", [(1e5, 0.0, 0.0180), (1e6, 0.0, 0.0116), (1e5, 1e-3, 0.0222),
                                              (1e6, 1e-2, 0.0380)])


def test_colebrook_against_moody_chart_readings(re, ed, f_moody):
    # Source: Moody (1944) chart readings, as tabulated in common fluid-mechanics textbooks
    # (from memory, read to about 2 %).
    assert friction_factor(re, ed) == pytest.approx(f_moody, rel=0.03)


@pytest.mark.parametrize("re_edge", [RE_LAMINAR, RE_TURBULENT])
@pytest.mark.parametrize("ed", [0.0, 1e-4, 1e-3])
def test_drop_continuous_through_the_transition_band(re_edge, ed):
    # Source: stated method (linear interpolation of f in the band); continuity within 1e-6 relative.
    below = friction_factor(re_edge * (1 - 1e-9), ed)
    above = friction_factor(re_edge * (1 + 1e-9), ed)
    assert above == pytest.approx(below, rel=1e-6)
