"""Lumped heat balances: the temperature where heat in equals heat out, and warm-up in time.

Both are hand-written: no pure-Python library integrator or bracketed root finder runs in
the browser engine without scipy, and both are a few lines.

References
----------
.. [1] Bergman, T. L., Lavine, A. S., Incropera, F. P., DeWitt, D. P. Fundamentals of Heat
   and Mass Transfer, 7th ed. Wiley, 2011, sec. 5.3 (general lumped capacitance analysis).
.. [2] Dowell, M., Jarratt, P. "A modified regula falsi method for computing the root of an
   equation." BIT 11, 1971, 168-174 (the Illinois modification).
"""
from __future__ import annotations

import math

__all__ = ["STEADY_TOL_K", "STEADY_MAX_C", "solve_steady", "warmup", "adiabatic_warmup", "seconds_to_reach"]

#: Tolerance of the steady-temperature solve: the final bracket is narrower than this, [K].
STEADY_TOL_K = 0.05
#: Highest fluid temperature searched for a steady state, [C]; beyond it there is "no steady state".
STEADY_MAX_C = 250.0


def solve_steady(net_w, t_lo_c: float, t_hi_c: float, tol_k: float = STEADY_TOL_K, max_iter: int = 60
                 ) -> dict:
    """Temperature at which a net heat balance (generated - rejected) falls to zero.

    Bracketed regula falsi with the Illinois modification; each new point is kept
    at least ``tol_k / 2`` inside the bracket so the bracket closes. Never raises.

    Parameters
    ----------
    net_w : callable
        ``net_w(t_c)`` -> net heat into the fluid, [W]; positive at ``t_lo_c``.
    t_lo_c, t_hi_c : float
        Search interval, [C].
    tol_k : float
        Width of the final bracket, [K].
    max_iter : int
        Most evaluations inside the bracket.

    Returns
    -------
    dict
        ``{"status": "converged"|"none below"|"no heat"|"not converged"|"failed", "temp_c", "iterations",
        "message"}``; ``temp_c`` is None unless converged.

    Examples
    --------
    A linear balance, 500 W at 50 C falling 10 W/K, is zero at 100 C (exact):

    >>> r = solve_steady(lambda t: 500.0 - 10.0 * (t - 50.0), 50.0, 250.0)
    >>> r["status"], round(r["temp_c"], 1)
    ('converged', 100.0)
    """
    try:
        return _solve_steady(net_w, t_lo_c, t_hi_c, tol_k, max_iter)
    except (ArithmeticError, ValueError) as exc:  # a property or correlation out of its domain
        return {"status": "failed", "temp_c": None, "iterations": 0,
                "message": f"the steady-temperature solve failed ({type(exc).__name__}: {exc})"}


def _solve_steady(net_w, t_lo_c, t_hi_c, tol_k, max_iter):
    f_lo = net_w(t_lo_c)
    evals = 1
    if f_lo <= 0.0:
        return {"status": "no heat", "temp_c": t_lo_c, "iterations": evals,
                "message": "no net heat at the air temperature: the fluid settles at the air temperature"}
    f_hi = net_w(t_hi_c)
    evals += 1
    if f_hi > 0.0:
        return {"status": "none below", "temp_c": None, "iterations": evals,
                "message": f"no steady state below {t_hi_c:g} C: the circuit generates "
                           f"{f_hi:.0f} W more than it rejects even there"}
    lo, hi, side = t_lo_c, t_hi_c, 0
    for _ in range(max_iter):
        x = (lo * f_hi - hi * f_lo) / (f_hi - f_lo)
        if not lo < x < hi:
            x = 0.5 * (lo + hi)
        half = 0.5 * tol_k
        if hi - lo > tol_k:
            x = min(max(x, lo + half), hi - half)
        fx = net_w(x)
        evals += 1
        if fx == 0.0:
            return {"status": "converged", "temp_c": x, "iterations": evals, "message": ""}
        if fx > 0.0:
            lo, f_lo = x, fx
            if side == -1:
                f_hi *= 0.5
            side = -1
        else:
            hi, f_hi = x, fx
            if side == 1:
                f_lo *= 0.5
            side = 1
        if hi - lo <= tol_k:
            return {"status": "converged", "temp_c": 0.5 * (lo + hi), "iterations": evals, "message": ""}
    return {"status": "not converged", "temp_c": None, "iterations": evals,
            "message": f"the steady-temperature solve did not converge in {max_iter} steps "
                       f"(bracket {lo:.2f}-{hi:.2f} C)"}


def _stepper(power_w: float, rejected_w, heat_capacity_j_k: float):
    """One exponential step of the locally linearised balance (see ``warmup``)."""
    def step(t, dt):
        r0 = rejected_w(t)
        s = rejected_w(t + 0.5) - rejected_w(t - 0.5)
        if s > 0.0:
            t_eq = t + (power_w - r0) / s
            return t_eq + (t - t_eq) * math.exp(-s * dt / heat_capacity_j_k)
        return t + dt * (power_w - r0) / heat_capacity_j_k
    return step


def _curve(step, t0_c, limit_c, hold_s, n_points, substeps, curve_stop_c):
    curve = [{"t_s": 0.0, "temp_c": t0_c}]
    t_time, temp = 0.0, t0_c
    reached = 0.0 if t0_c >= limit_c else None
    dt = hold_s / (n_points * substeps)
    for _ in range(n_points):
        for _ in range(substeps):
            new = step(temp, dt)
            if reached is None and new >= limit_c > temp:
                reached = t_time + dt * (limit_c - temp) / (new - temp)
            temp, t_time = new, t_time + dt
        curve.append({"t_s": t_time, "temp_c": temp})
        if curve_stop_c is not None and temp > curve_stop_c:
            break
    return curve, t_time, temp, reached


def _search_limit(step, t_time, temp, limit_c, dt2, search_s, growth=1.2):
    """Step on past the curve until the limit is reached, the fluid levels off, or time runs out.

    The exponential step is stable at any size, so the step grows by ``growth`` each time (a
    slow creep over a day takes tens of steps, not hundreds of thousands); the step that crosses
    the limit is then bisected for the time at which it reaches it.
    """
    while t_time < search_s:
        new = step(temp, dt2)
        if new >= limit_c > temp:
            return t_time + _time_to(step, temp, limit_c, dt2)
        if new <= temp:  # levelled off below the limit
            return None
        temp, t_time = new, t_time + dt2
        dt2 *= growth
    return None


def _time_to(step, temp, limit_c, dt, iterations=40):
    """Time within one step from ``temp`` to ``limit_c`` (bisection on the step length)."""
    lo, hi = 0.0, dt
    for _ in range(iterations):
        mid = 0.5 * (lo + hi)
        lo, hi = (lo, mid) if step(temp, mid) >= limit_c else (mid, hi)
    return 0.5 * (lo + hi)


def _warmup_message(reached, levels, limit_c, search_s):
    if reached is not None:
        return (f"the fluid reaches its limit {limit_c:.0f} C after {reached:.0f} s at full lock"
                if reached > 0 else f"the fluid starts at or above its limit {limit_c:.0f} C")
    if levels is not None and levels <= limit_c:
        return f"the limit {limit_c:.0f} C is never reached: the fluid levels off near {levels:.0f} C"
    return f"the limit {limit_c:.0f} C is not reached within {search_s:.0f} s"


def warmup(t0_c: float, power_w: float, rejected_w, heat_capacity_j_k: float, limit_c: float,
           hold_s: float, n_points: int = 50, substeps: int = 8, search_s: float = 86400.0,
           curve_stop_c: float | None = None) -> dict:
    r"""Lumped warm-up :math:`m c_p\, dT/dt = P - \dot Q_{rej}(T)`, stepped exponentially.

    Each step linearises the rejection about the current temperature,
    :math:`\dot Q_{rej} \approx R_0 + s (T - T_n)`, and advances by the exact
    solution of that linear equation,
    :math:`T_{n+1} = T_{eq} + (T_n - T_{eq}) e^{-s \Delta t/(m c_p)}`,
    :math:`T_{eq} = T_n + (P - R_0)/s`; an explicit Euler step when :math:`s \le 0`.
    The step is exact for a constant UA at any step size and never unstable.

    Parameters
    ----------
    t0_c : float
        Starting temperature, [C].
    power_w : float
        Heat generated, [W] (constant).
    rejected_w : callable
        ``rejected_w(t_c)`` -> heat rejected, [W]; non-decreasing in temperature.
    heat_capacity_j_k : float
        Lumped capacity :math:`m c_p`, [J/K].
    limit_c : float
        Limit temperature, [C].
    hold_s : float
        Length of the curve, [s].
    n_points : int
        The curve has ``n_points + 1`` points from 0 to ``hold_s``.
    substeps : int
        Steps between curve points.
    search_s : float
        How far past ``hold_s`` to look for the limit, [s].
    curve_stop_c : float, optional
        The curve ends at the first point above this temperature, [C] (the lumped model means
        nothing far above the fluid's limit).

    Returns
    -------
    dict
        ``{"curve": [{"t_s", "temp_c"}], "seconds_to_limit": float|None, "final_temp_c",
        "levels_off_c": float|None, "message", "curve_note"}``; the time to limit is interpolated
        linearly within a step.

    Examples
    --------
    Constant UA: the exact solution of the first-order equation.

    >>> r = warmup(60.0, 1000.0, lambda t: 2.0 * (t - 50.0), 4000.0, 120.0, 600.0)
    >>> exact = 50 + 500 + (60 - 50 - 500) * math.exp(-600 * 2.0 / 4000.0)
    >>> abs(r["curve"][-1]["temp_c"] - exact) < 1e-6
    True

    References
    ----------
    .. [1] Bergman, Lavine, Incropera, DeWitt. Fundamentals of Heat and Mass Transfer, 7th ed.,
       2011, sec. 5.3 (general lumped capacitance analysis).
    """
    step = _stepper(power_w, rejected_w, heat_capacity_j_k)
    curve, t_time, temp, reached = _curve(step, t0_c, limit_c, hold_s, n_points, substeps, curve_stop_c)
    final = temp
    # beyond the curve: where it levels off (rejection slope at the end), and the limit if it is reached
    slope = (rejected_w(temp + 1.0) - rejected_w(temp)) if heat_capacity_j_k > 0 else 0.0
    levels = temp + (power_w - rejected_w(temp)) / slope if slope > 0.0 else None
    if levels is not None and levels > STEADY_MAX_C:
        levels = None  # far beyond any fluid's range: "keeps rising" is the honest statement
    if reached is None and (levels is None or levels > limit_c):
        tau = heat_capacity_j_k / slope if slope > 0.0 else hold_s
        reached = _search_limit(step, t_time, temp, limit_c, max(hold_s / n_points, tau / 100.0), search_s)
    note = ""
    if curve_stop_c is not None and final > curve_stop_c and len(curve) <= n_points:
        # stopped early: spread the points over the shorter span for a readable plot
        curve = warmup(t0_c, power_w, rejected_w, heat_capacity_j_k, limit_c, curve[-1]["t_s"], n_points,
                       substeps, 0.0)["curve"]
        note = f"the curve stops at {curve[-1]['t_s']:.0f} s, past {curve_stop_c:.0f} C"
    return {"curve": curve, "seconds_to_limit": reached, "final_temp_c": final, "levels_off_c": levels,
            "message": _warmup_message(reached, levels, limit_c, search_s), "curve_note": note}


def adiabatic_warmup(t0_c: float, power_w: float, heat_capacity_j_k: float, t_s: float) -> float:
    r"""Temperature of a lump that keeps all the heat it gets: :math:`T = T_0 + P t / C`.

    Parameters
    ----------
    t0_c : float
        Starting temperature, [C].
    power_w : float
        Heat into the lump, [W] (constant).
    heat_capacity_j_k : float
        Its heat capacity, [J/K]; > 0.
    t_s : float
        Time, [s].

    Returns
    -------
    T : float
        [C].

    Notes
    -----
    The exact solution of :math:`C\, dT/dt = P` with no heat leaving: an upper bound on the temperature of
    a lump that also loses some heat.

    Examples
    --------
    2833 W into 750 J/K for 10 s from 80 C: 80 + 28330 / 750 = 117.77 C (exact):

    >>> round(adiabatic_warmup(80.0, 2833.0, 750.0, 10.0), 2)
    117.77
    """
    return t0_c + power_w * t_s / heat_capacity_j_k


def seconds_to_reach(t0_c: float, limit_c: float, power_w: float, heat_capacity_j_k: float) -> float | None:
    """Time for an adiabatic lump (:func:`adiabatic_warmup`) to reach ``limit_c`` [s]; 0 when it starts at or
    above it, None without heat.

    Examples
    --------
    >>> seconds_to_reach(80.0, 125.0, 2833.0, 750.0) == 45.0 * 750.0 / 2833.0
    True
    """
    if t0_c >= limit_c:
        return 0.0
    if power_w <= 0.0:
        return None
    return (limit_c - t0_c) * heat_capacity_j_k / power_w
