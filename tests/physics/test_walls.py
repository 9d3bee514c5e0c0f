"""The wall temperature of a line from resistances in series: against an independent evaluation with ht's
correlations and fluids' standard atmosphere called directly, exact limits, and properties."""
import math

import pytest
from fluids import ATMOSPHERE_1976
from fluids.friction import friction_factor
from hypothesis import given, settings, strategies as st
from ht.conv_external import Nu_cylinder_Churchill_Bernstein
from ht.conv_free_immersed import Nu_horizontal_cylinder_Churchill_Chu
from ht.conv_internal import laminar_T_const, turbulent_Gnielinski

from calc.physics.heat import cylinder_resistances_per_m, wall_temperatures_c

G = 9.80665  # standard gravity (CGPM 1901)
AIR_CP = 1007.0  # air cp, J/(kg K), Incropera Table A.4 at 300 K (from memory)


def independent_wall(d_i, d_o, k_wall, t_f, t_a, v, h_i, passes=200):
    """Inner and outer surface temperatures written out here: air by fluids.ATMOSPHERE_1976 at the film
    temperature, free convection by ht's Churchill-Chu, forced by ht's Churchill-Bernstein, combined as
    Nu^3 = Nu_f^3 + Nu_n^3 (Churchill 1977), the surface iterated to convergence."""
    r_i = 1 / (h_i * math.pi * d_i)
    r_w = math.log(d_o / d_i) / (2 * math.pi * k_wall)
    ts = 0.5 * (t_f + t_a)
    for _ in range(passes):
        tf = 0.5 * (ts + t_a)
        air = ATMOSPHERE_1976(0.0, dT=tf + 273.15 - 288.15)
        nu = air.mu / air.rho
        pr = air.mu * AIR_CP / air.k
        gr = G * max(abs(ts - t_a), 1e-9) / (tf + 273.15) * d_o ** 3 / nu ** 2
        nu_n = Nu_horizontal_cylinder_Churchill_Chu(Pr=pr, Gr=gr)
        nu_f = Nu_cylinder_Churchill_Bernstein(Re=v * d_o / nu, Pr=pr) if v > 0 else 0.0
        h_o = (nu_n ** 3 + nu_f ** 3) ** (1 / 3) * air.k / d_o
        r_o = 1 / (h_o * math.pi * d_o)
        ts = t_a + (t_f - t_a) * r_o / (r_i + r_w + r_o)
    total = r_i + r_w + r_o
    return t_f - (t_f - t_a) * r_i / total, ts


# -6 hose: 9.5 mm bore, 4.6 mm wall (the typical-wall table, from memory), rubber 0.25 W/(m K) (from memory)
HOSE = (0.0095, 0.0095 + 2 * 0.0046, 0.25)
# fluid conductivity 0.13 W/(m K) (from memory, field notes)
H_LAMINAR = laminar_T_const() * 0.13 / 0.0095


@pytest.mark.parametrize("t_f, t_a, v", [(90.0, 300.0, 0.0), (90.0, 300.0, 3.0), (95.0, 180.0, 0.5),
                                         (100.0, 40.0, 0.0), (80.0, 50.0, 8.0)])
def test_hose_wall_vs_ht_correlations_called_directly(t_f, t_a, v):
    # Source: ht.conv_internal.laminar_T_const (Nu 3.66 inside), ht.conv_free_immersed.
    # Nu_horizontal_cylinder_Churchill_Chu and ht.conv_external.Nu_cylinder_Churchill_Bernstein outside, air by
    # fluids.ATMOSPHERE_1976, evaluated here independently; the engine stops its iteration at 0.01 K and
    # interpolates the air between whole kelvin, hence 0.01 K.
    inner, outer = wall_temperatures_c(t_f, t_a, *cylinder_resistances_per_m(*HOSE, t_f, t_a, v, H_LAMINAR))
    ref_inner, ref_outer = independent_wall(*HOSE, t_f, t_a, v, H_LAMINAR)
    assert outer == pytest.approx(ref_outer, abs=0.01)
    assert inner == pytest.approx(ref_inner, abs=0.01)


def test_steel_tube_wall_in_turbulent_flow_vs_ht_gnielinski():
    # Source: ht.conv_internal.turbulent_Gnielinski with fluids.friction.friction_factor (Re 6000, Pr 150,
    # smooth drawn tube) for the inside film; outside as above; 3/8 x 0.035 in tube, steel 50 W/(m K) (from
    # memory). A thin metal wall: both surfaces within a fraction of a kelvin of each other.
    d_i, d_o = 0.00775, 0.009525
    h_i = turbulent_Gnielinski(Re=6000.0, Pr=150.0, fd=friction_factor(Re=6000.0, eD=1.5e-6 / d_i)) * 0.13 / d_i
    inner, outer = wall_temperatures_c(85.0, 250.0, *cylinder_resistances_per_m(d_i, d_o, 50.0, 85.0, 250.0, 2.0,
                                                                                 h_i))
    ref_inner, ref_outer = independent_wall(d_i, d_o, 50.0, 85.0, 250.0, 2.0, h_i)
    assert (inner, outer) == pytest.approx((ref_inner, ref_outer), abs=0.01)
    assert 0.0 < outer - inner < 0.5


def test_inner_surface_at_the_fluid_temperature_when_the_inside_film_vanishes():
    # Source: resistances in series, exact: with h_i -> infinity (R_i -> 0) the inner surface is at the fluid
    # temperature; R_i = 1 / (1e12 x pi x 9.5 mm) leaves it within 1e-6 K.
    inner, outer = wall_temperatures_c(90.0, 300.0, *cylinder_resistances_per_m(*HOSE, 90.0, 300.0, 0.0, 1e12))
    assert inner == pytest.approx(90.0, abs=1e-6)
    assert 90.0 < outer < 300.0
    # Source: exact, with no inside resistance at all
    assert wall_temperatures_c(90.0, 300.0, 0.0, 1.0, 3.0) == (90.0, 142.5)


@settings(max_examples=200, deadline=None)
@given(st.floats(0.01, 10.0), st.floats(0.0, 10.0), st.floats(0.01, 10.0), st.floats(-40.0, 150.0),
       st.floats(-50.0, 400.0))
def test_property_drops_divide_as_the_resistances(r_i, r_w, r_o, t_f, t_a):
    # Source: resistances in series, exact: the same heat through each, so each drop is R_k / sum(R) of the whole.
    inner, outer = wall_temperatures_c(t_f, t_a, r_i, r_w, r_o)
    total = r_i + r_w + r_o
    span = t_f - t_a
    assert t_f - inner == pytest.approx(span * r_i / total, abs=1e-9)
    assert inner - outer == pytest.approx(span * r_w / total, abs=1e-9)
    assert outer - t_a == pytest.approx(span * r_o / total, abs=1e-9)


@settings(max_examples=150, deadline=None)
@given(st.floats(0.003, 0.04), st.floats(0.0005, 0.008), st.floats(0.1, 60.0), st.floats(-30.0, 150.0),
       st.floats(-40.0, 400.0), st.floats(0.0, 15.0), st.floats(5.0, 5000.0))
def test_property_wall_lies_between_fluid_and_air(d_i, wall, k_wall, t_f, t_a, v, h_i):
    # Source: resistances in series, exact: each surface divides the fluid-to-air difference, so
    # fluid >= inner >= outer >= air when the fluid is hotter, and the reverse when the air is.
    inner, outer = wall_temperatures_c(t_f, t_a, *cylinder_resistances_per_m(d_i, d_i + 2 * wall, k_wall, t_f,
                                                                             t_a, v, h_i))
    lo, hi = min(t_f, t_a), max(t_f, t_a)
    eps = 1e-9
    assert lo - eps <= outer <= hi + eps and lo - eps <= inner <= hi + eps
    if t_f >= t_a:
        assert t_f + eps >= inner >= outer - eps
    else:
        assert t_f - eps <= inner <= outer + eps
