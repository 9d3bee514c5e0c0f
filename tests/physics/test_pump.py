"""Pump delivery with the flow-control cap."""
import pytest

from calc.physics.pump import delivered_flow_m3_s

LPM = 1 / 60000


def test_pump_flow_and_cap():
    # Source: Q = V n eta_v (common practice), exact arithmetic.
    q, q0, capped = delivered_flow_m3_s(9.5, 750, 1.1, 0.9, 7.5 * LPM)
    assert q0 / LPM == pytest.approx(9.5e-3 * 750 * 1.1 * 0.9, rel=1e-12)
    assert not capped and q == q0
    q, q0, capped = delivered_flow_m3_s(9.5, 3000, 1.1, 0.9, 7.5 * LPM)
    assert capped and q / LPM == pytest.approx(7.5)
