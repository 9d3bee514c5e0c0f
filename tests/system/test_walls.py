"""Wall temperatures of a line's hoses and tubes at an operating point: the inside film from the flow, against ht
called directly; the stated no-flow rule; the outer surface the thermal model uses."""
import math

import pytest
from ht.conv_internal import laminar_T_const

from calc.model.fluid import resolve_fluid, state_of
from calc.system.thermal_model import line_surface
from calc.system.walls import wall_point

from ..physics.test_walls import independent_wall

LPM = 1 / 60000
TH = {"air_temp_c": 50.0, "hose_conductivity_w_mk": 0.25}
HOSE = {"kind": "hose", "bore_mm": 9.5, "wall_mm": 4.6, "length_m": 0.7, "roughness_mm": 0.005,
        "local_air_temp_c": 300.0}


def test_hose_by_a_manifold_at_an_operating_point_vs_ht():
    # Source: ht.conv_internal.laminar_T_const (Nu 3.66; Re = 4Q/(pi d nu) about 1500 here, laminar) for the
    # inside film with the fluid's own conductivity, and the outside by ht and fluids as in
    # tests/physics/test_walls.py, written out independently; 0.01 K for the engine's iteration tolerance.
    fluid = resolve_fluid({"preset": "ps-mineral"})
    st = state_of(fluid, 90.0)
    q = 7.5 * LPM
    assert 4 * q / (math.pi * 0.0095 * st.nu_m2_s) < 2000
    surface = line_surface(HOSE, TH)
    assert surface["t_air"] == 300.0  # its own air, not the job's 50 C
    inner, outer = wall_point(surface, 90.0, q, 1.0, st)
    h_i = laminar_T_const() * st.k_w_mk / 0.0095
    ref = independent_wall(0.0095, 0.0095 + 2 * 0.0046, 0.25, 90.0, 300.0, 1.0, h_i)
    assert (inner, outer) == pytest.approx(ref, abs=0.01)
    assert 90.0 < inner < outer < 300.0  # the outer surface is the hottest point of the wall


def test_without_a_local_air_the_part_uses_the_jobs_air():
    # Source: the job model's rule, exact: an empty 'Air temperature around this part' is the under-hood air.
    surface = line_surface(dict(HOSE, local_air_temp_c=None), TH)
    assert surface["t_air"] == 50.0 and surface["local"] is None


def test_standing_fluid_is_taken_at_the_hotter_of_fluid_and_air():
    # Source: the stated conservative heat-soak rule (no flow: standing fluid warms to the air around a hot
    # part, or holds its own temperature), common practice, no source.
    surface = line_surface(HOSE, TH)
    assert wall_point(surface, 90.0, 0.0, 0.5, None) == (300.0, 300.0)
    cool = line_surface(dict(HOSE, local_air_temp_c=20.0), TH)
    assert wall_point(cool, 90.0, 0.0, 0.5, None) == (90.0, 90.0)
