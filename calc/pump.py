"""Belt-driven pump with flow control and relief.

References
----------
.. [1] Common practice for positive-displacement pumps: Q = V n eta_v.
"""
from __future__ import annotations

__all__ = ["delivered_flow_m3_s", "geometric_flow_m3_s"]


def geometric_flow_m3_s(displacement_cc_rev: float, engine_rpm: float, pulley_ratio: float) -> float:
    """Geometric flow [m^3/s] = displacement x pump speed.

    Examples
    --------
    >>> round(geometric_flow_m3_s(9.5, 750, 1.1) * 60000, 4)
    7.8375
    """
    return displacement_cc_rev * 1e-6 * engine_rpm * pulley_ratio / 60.0


def delivered_flow_m3_s(displacement_cc_rev: float, engine_rpm: float, pulley_ratio: float,
                        volumetric_efficiency: float, flow_limit_m3_s: float) -> tuple[float, float, bool]:
    """Flow the pump delivers to its outlet, capped by the flow-control valve.

    Q = V_d x n_engine x pulley ratio x eta_v, then min(Q, flow limit). The
    excess recirculates inside the pump and does not reach the lines.

    Parameters
    ----------
    displacement_cc_rev : float
        Displacement, [cm^3/rev].
    engine_rpm : float
        Crankshaft speed, [rev/min].
    pulley_ratio : float
        Pump speed over crank speed, [-].
    volumetric_efficiency : float
        Delivered over geometric flow, [-].
    flow_limit_m3_s : float
        Flow-control setting, [m^3/s].

    Returns
    -------
    flow_m3_s : float
        Delivered flow, [m^3/s].
    uncapped_m3_s : float
        Flow before the flow-control valve, [m^3/s].
    capped : bool
        Whether the flow-control valve is limiting.

    Examples
    --------
    9.5 cc/rev at 750 rpm, ratio 1.1, eta_v 0.9, cap 7.5 L/min:

    >>> q, q0, capped = delivered_flow_m3_s(9.5, 750, 1.1, 0.9, 7.5 / 60000)
    >>> round(q * 60000, 4), capped
    (7.0538, False)
    """
    q0 = geometric_flow_m3_s(displacement_cc_rev, engine_rpm, pulley_ratio) * volumetric_efficiency
    if q0 > flow_limit_m3_s:
        return flow_limit_m3_s, q0, True
    return q0, q0, False
