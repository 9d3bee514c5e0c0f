"""Belt-driven positive-displacement pump with a flow-control valve.

References
----------
.. [1] Common practice for positive-displacement pumps: Q = V n eta_v (the definition of
   volumetric efficiency as delivered over geometric flow).
"""
from __future__ import annotations

__all__ = ["geometric_flow_m3_s", "delivered_flow_m3_s"]


def geometric_flow_m3_s(displacement_cc_rev: float, engine_rpm: float, pulley_ratio: float) -> float:
    """Geometric flow = displacement x pump speed, with pump speed = engine speed x pulley ratio.

    Parameters
    ----------
    displacement_cc_rev : float
        Displacement, [cm^3/rev].
    engine_rpm : float
        Crankshaft speed, [rev/min].
    pulley_ratio : float
        Pump speed over crank speed, [-].

    Returns
    -------
    q : float
        Geometric flow, [m^3/s].

    Examples
    --------
    10 cm^3/rev at 2000 rpm pump speed is 20 L/min (exact):

    >>> round(geometric_flow_m3_s(10.0, 2000.0, 1.0) * 60000, 9)
    20.0
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
    10 cm^3/rev at 1000 rpm and 0.9 volumetric efficiency gives 9 L/min, under a 12 L/min cap (exact):

    >>> q, q0, capped = delivered_flow_m3_s(10.0, 1000.0, 1.0, 0.9, 12 / 60000)
    >>> round(q * 60000, 9), capped
    (9.0, False)
    """
    q0 = geometric_flow_m3_s(displacement_cc_rev, engine_rpm, pulley_ratio) * volumetric_efficiency
    if q0 > flow_limit_m3_s:
        return flow_limit_m3_s, q0, True
    return q0, q0, False
