"""Belt-driven positive-displacement pump with a flow-control valve.

References
----------
.. [1] Common practice for positive-displacement pumps: Q = V n eta_v (the definition of
   volumetric efficiency as delivered over geometric flow).
"""
from __future__ import annotations

__all__ = ["geometric_flow_m3_s", "delivered_flow_m3_s", "pulley_ratio_from_diameters"]


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


def pulley_ratio_from_diameters(crank_pulley_mm: float, pump_pulley_mm: float) -> float:
    """Pump speed over crank speed for a belt drive, from the two pulleys' diameters.

    With no belt slip the belt speed is the same on both pulleys, so n_pump / n_crank = D_crank / D_pump.
    Use the pulleys' effective (pitch) diameters; the outside diameter of a V-ribbed pulley overstates
    both by about the same amount, so the ratio is little changed.

    Parameters
    ----------
    crank_pulley_mm : float
        Crankshaft pulley diameter, [mm].
    pump_pulley_mm : float
        Pump pulley diameter, [mm].

    Returns
    -------
    ratio : float
        Pump speed over crank speed, [-].

    Examples
    --------
    A 150 mm crank pulley driving a 125 mm pump pulley turns the pump 1.2 times crank speed (exact):

    >>> pulley_ratio_from_diameters(150.0, 125.0)
    1.2

    References
    ----------
    .. [1] Kinematics of a belt drive without slip (the belt's linear speed is common to both pulleys).
    """
    return crank_pulley_mm / pump_pulley_mm


def delivered_flow_m3_s(displacement_cc_rev: float, engine_rpm: float, pulley_ratio: float,
                        volumetric_efficiency: float, flow_limit_m3_s: float) -> tuple[float, float, bool]:
    """Flow the pump delivers to its outlet, capped by the flow-control valve.

    Q = V_d x n_engine x pulley ratio x eta_v, then min(Q, flow limit). The
    excess recirculates inside the pump and does not reach the lines. A pump
    whose flow control follows a measured table passes the table's flow at its
    speed as ``flow_limit_m3_s`` (``calc.physics.tabulated.interpolate_flat``).

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


def metering_drop_pa(dp_setting_pa: float, q_m3_s: float, flow_limit_m3_s: float) -> float:
    """Drop across the flow-control valve's metering orifice.

    The spool regulates the orifice's drop to its spring's setting while it limits the flow; below
    the setting the bypass is shut and the orifice drops as flow squared (orifice law).

    Parameters
    ----------
    dp_setting_pa : float
        The drop the spring holds while the valve limits, [Pa].
    q_m3_s : float
        Flow through the orifice to the pump's outlet, [m^3/s].
    flow_limit_m3_s : float
        The flow-control setting, [m^3/s].

    Returns
    -------
    dp : float
        [Pa].

    Examples
    --------
    Half the setting's flow: a quarter of the drop (orifice law, exact); at or above it, the setting:

    >>> metering_drop_pa(2e5, 4.0, 8.0), metering_drop_pa(2e5, 8.0, 8.0)
    (50000.0, 200000.0)
    """
    return dp_setting_pa * min(1.0, (q_m3_s / flow_limit_m3_s) ** 2)


def pump_heat_w(q_geometric_m3_s: float, q_volumetric_m3_s: float, q_circuit_m3_s: float,
                p_internal_pa: float, p_inlet_pa: float, starved: bool = False) -> tuple[float, float, float]:
    r"""Hydraulic heat of the pump's flows, split by where the energy is dissipated.

    A positive-displacement pump raises its whole geometric flow from its inlet pressure to its
    internal pressure; with no work done by the steering, all of that power becomes heat in the
    fluid:

    .. math::
        P = Q_g (p_{int} - p_{in}) = \underbrace{(Q_g - Q_v)\Delta p}_{leakage}
        + \underbrace{(Q_v - Q_c)\Delta p}_{flow\ control\ and\ relief}
        + \underbrace{Q_c \Delta p}_{metering,\ lines,\ gear,\ feed}

    Parameters
    ----------
    q_geometric_m3_s : float
        Displacement x pump speed, [m^3/s].
    q_volumetric_m3_s : float
        What the pump delivers before the flow control, volumetric efficiency x geometric, [m^3/s].
    q_circuit_m3_s : float
        Flow that leaves the pump's outlet for the circuit, [m^3/s].
    p_internal_pa : float
        Pressure the pump works against (outlet plus the metering drop; the relief setting at full
        lock), gauge, [Pa].
    p_inlet_pa : float
        Pump inlet pressure, gauge, [Pa].
    starved : bool
        The feed line passes less than the pump would draw: there is no excess for the flow control
        to recirculate; the pump pumps its leakage and what it gets.

    Returns
    -------
    leakage_w, bypass_w, circuit_w : float
        [W].

    Examples
    --------
    10 cm^3/rev at 2000 rpm is 20 L/min; held at an 85 bar relief with no flow to the circuit, all of
    it is heat: 85e5 x 20 / 60000 = 2833 W (energy balance, exact):

    >>> parts = pump_heat_w(20 / 60000, 18 / 60000, 0.0, 85e5, 0.0)
    >>> round(sum(parts), 3)
    2833.333

    References
    ----------
    .. [1] Energy balance of a positive-displacement pump with internal leakage and a bypassing flow
       control (first law, steady flow); common practice of hydraulic heat-load estimates.
    """
    dp = p_internal_pa - p_inlet_pa
    leakage = (q_geometric_m3_s - q_volumetric_m3_s) * dp
    bypass = 0.0 if starved else (q_volumetric_m3_s - q_circuit_m3_s) * dp
    return leakage, bypass, q_circuit_m3_s * dp


def mechanical_loss_w(hydraulic_input_w: float, mechanical_efficiency: float) -> float:
    """The pump's mechanical (friction) losses on top of its hydraulic input, as heat.

    With overall efficiency = volumetric x mechanical, the shaft delivers the geometric flow's
    hydraulic power divided by the mechanical efficiency; the rest is friction.

    Parameters
    ----------
    hydraulic_input_w : float
        Geometric flow x pressure rise, [W].
    mechanical_efficiency : float
        Torque efficiency, (0, 1].

    Returns
    -------
    loss : float
        [W].

    Examples
    --------
    >>> round(mechanical_loss_w(1000.0, 0.8), 9)
    250.0
    """
    return hydraulic_input_w * (1.0 / mechanical_efficiency - 1.0)
