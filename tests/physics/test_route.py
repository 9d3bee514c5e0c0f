"""Route geometry from measured points against exact geometry."""
import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calc.physics.route import route_geometry


def test_right_angle_route_known_corner():
    r = route_geometry([[0, 0, 0], [100, 0, 0], [100, 100, 0]])
    # Source: exact geometry: two 100 mm legs, polyline length 200 mm
    assert r["length_mm"] == pytest.approx(200.0, abs=1e-12)
    # Source: exact geometry: straight distance between the ends is 100 sqrt(2)
    assert r["straight_mm"] == pytest.approx(100.0 * math.sqrt(2.0), rel=1e-12)
    assert len(r["bends"]) == 1 and r["bends"][0]["at_point"] == 1
    # Source: exact geometry: perpendicular legs turn by 90 degrees
    assert r["bends"][0]["angle_deg"] == pytest.approx(90.0, abs=1e-9)
    # Source: exact geometry: tangent length R tan(45 deg) = R must fit in the 100 mm legs, so R = 100 mm
    assert r["tightest_radius_mm"] == pytest.approx(100.0, rel=1e-12)
    # Source: exact geometry: the rounded path is a quarter circle of radius 100 mm, length 50 pi
    assert r["length_filleted_mm"] == pytest.approx(50.0 * math.pi, rel=1e-12)


def test_straight_route_has_no_bends():
    r = route_geometry([[0, 0, 0], [30, 40, 0], [60, 80, 0], [90, 120, 0]])
    assert r["bends"] == [] and r["tightest_radius_mm"] is None
    # Source: exact geometry: collinear points 3-4-5, total 150 mm, equal to the straight distance
    assert r["length_mm"] == pytest.approx(150.0, rel=1e-12)
    assert r["straight_mm"] == pytest.approx(150.0, rel=1e-12)


def test_sixty_degree_turn_in_space():
    c, s = math.cos(math.radians(60)), math.sin(math.radians(60))
    # a 60 degree turn out of the x axis into the x-z plane, 100 mm legs
    r = route_geometry([[0, 0, 0], [100, 0, 0], [100 + 100 * c, 0, 100 * s]])
    # Source: exact geometry: the direction turns by 60 degrees
    assert r["bends"][0]["angle_deg"] == pytest.approx(60.0, abs=1e-9)
    # Source: exact geometry: R = 100 / tan(30 deg) = 100 sqrt(3)
    assert r["tightest_radius_mm"] == pytest.approx(100.0 * math.sqrt(3.0), rel=1e-9)


def test_shared_segment_is_split_between_corners():
    # a U-turn made of two right angles with a 100 mm middle leg and 300 mm outer legs
    r = route_geometry([[0, 0, 0], [300, 0, 0], [300, 100, 0], [0, 100, 0]])
    # Source: exact geometry: each corner may use half of the shared 100 mm leg, so R = 50 / tan(45 deg) = 50 mm
    assert [b["max_radius_mm"] for b in r["bends"]] == [pytest.approx(50.0), pytest.approx(50.0)]
    # Source: exact geometry: total turn of a U is 180 degrees
    assert r["total_turn_deg"] == pytest.approx(180.0)


def test_doubling_back_leaves_no_radius_and_duplicates_are_dropped():
    r = route_geometry([[0, 0, 0], [100, 0, 0], [100, 0, 0], [0, 0, 0]])
    # Source: exact geometry: a 180 degree reversal leaves no room for any arc
    assert r["bends"][0]["angle_deg"] == pytest.approx(180.0)
    assert r["tightest_radius_mm"] == 0.0
    assert r["bends"][0]["at_point"] == 1  # index in the user's list, the duplicate skipped


_coord = st.floats(min_value=-500, max_value=500, allow_nan=False)


@settings(max_examples=60, deadline=None)
@given(st.lists(st.tuples(_coord, _coord, _coord), min_size=2, max_size=8),
       st.floats(min_value=0, max_value=2 * math.pi), st.tuples(_coord, _coord, _coord))


def test_rigid_motion_invariance_and_length_bounds(pts, phi, shift):
    pts = [list(p) for p in pts]
    r0 = route_geometry(pts)
    c, s = math.cos(phi), math.sin(phi)
    moved = [[c * x - s * y + shift[0], s * x + c * y + shift[1], z + shift[2]] for x, y, z in pts]
    r1 = route_geometry(moved)
    # Source: exact geometry: lengths are invariant under rotation and translation
    assert r1["length_mm"] == pytest.approx(r0["length_mm"], rel=1e-9, abs=1e-6)
    # Source: triangle inequality: a path is never shorter than the straight distance between its ends
    assert r0["length_mm"] >= r0["straight_mm"] - 1e-9
    # Source: exact geometry: rounding corners never lengthens the path (arc R theta <= 2 R tan(theta/2))
    assert r0["length_filleted_mm"] <= r0["length_mm"] + 1e-9
