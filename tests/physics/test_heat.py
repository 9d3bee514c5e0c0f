"""Heat: convection against correlations written out independently and handbook air properties,
resistances in series, fin efficiency against the exact solution, lumped balances against exact solutions."""
import math

import pytest

from calc.physics.convection import (air_properties, h_forced_cylinder, h_inside_pipe, h_natural_cylinder,
                                     h_outside_cylinder)
from calc.physics.heat import annular_fin_efficiency, cylinder_ua_per_m, temp_rise_c
from calc.physics.pump import mechanical_loss_w, pump_heat_w
from calc.physics.lumped import solve_steady, warmup

LPM = 1 / 60000
BAR = 1e5


def test_temp_rise_rule_of_thumb():
    # Source: dT = dp / (rho cp), exact; 0.57 K per 10 bar (common practice, no source).
    assert temp_rise_c(10 * BAR, 870.0, 1900.0) == pytest.approx(0.57, rel=0.10)
    assert temp_rise_c(-1.0, 870.0, 1900.0) == 0.0


def test_pump_heat_of_field_note_example():
    # Source: field notes (common practice): about 1 kW for 80 bar and 8 L/min crossing the relief; the energy
    # balance p Q = 80e5 x 8 / 60000 = 1067 W (exact).
    parts = pump_heat_w(8 * LPM, 8 * LPM, 0.0, 80 * BAR, 0.0)
    assert sum(parts) == pytest.approx(1000, rel=0.1)
    assert sum(parts) == pytest.approx(80 * BAR * 8 * LPM, rel=1e-12)


def test_pump_heat_splits_the_geometric_flow_without_counting_twice():
    # Source: first-law energy balance, exact: 20 L/min geometric, 18 L/min after leakage, 7.5 L/min to the
    # circuit, 32 bar internal and -0.1 bar at the inlet: leakage 2, bypass 10.5 and circuit 7.5 L/min, each
    # times 32.1 bar, adding up to the geometric flow times the pressure rise.
    leak, bypass, circuit = pump_heat_w(20 * LPM, 18 * LPM, 7.5 * LPM, 32 * BAR, -0.1 * BAR)
    assert leak == pytest.approx(2 * LPM * 32.1 * BAR, rel=1e-12)
    assert bypass == pytest.approx(10.5 * LPM * 32.1 * BAR, rel=1e-12)
    assert circuit == pytest.approx(7.5 * LPM * 32.1 * BAR, rel=1e-12)
    assert leak + bypass + circuit == pytest.approx(20 * LPM * 32.1 * BAR, rel=1e-12)
    # a starved pump has nothing to bypass
    assert pump_heat_w(20 * LPM, 18 * LPM, 5 * LPM, 32 * BAR, -0.2 * BAR, starved=True)[1] == 0.0
    # Source: definition of mechanical efficiency (shaft power = hydraulic input / eta_m): 25 % on top at 0.8.
    assert mechanical_loss_w(1000.0, 0.8) == pytest.approx(250.0, rel=1e-12)


# -- 3. convection -------------------------------------------------------------------
# Air at 1 atm, Incropera (Bergman et al., Fundamentals of Heat and Mass Transfer) Table A.4 (from memory):
# T [K]: (rho kg/m3, mu Pa s, k W/(m K), Pr)
AIR_TABLE = {300.0: (1.1614, 184.6e-7, 0.0263, 0.707), 350.0: (0.9950, 208.2e-7, 0.0300, 0.700),
             400.0: (0.8711, 230.1e-7, 0.0338, 0.690)}


@pytest.mark.parametrize("tk", sorted(AIR_TABLE))
def test_air_properties_vs_handbook_table(tk):
    rho, mu, k, cp, pr = air_properties(tk - 273.15)
    r_rho, r_mu, r_k, r_pr = AIR_TABLE[tk]
    # Source: Incropera Table A.4 (from memory); the 1976 atmosphere's Sutherland and k fits differ a little,
    # and the table's densities sit about 1.3 % under the ideal-gas value at 1 atm.
    assert rho == pytest.approx(r_rho, rel=0.02)
    assert mu == pytest.approx(r_mu, rel=0.01)
    assert k == pytest.approx(r_k, rel=0.03)
    assert pr == pytest.approx(r_pr, rel=0.02)


def _churchill_chu(ra, pr):
    # Churchill and Chu (1975), horizontal cylinder, written out here independently of ht.
    return (0.6 + 0.387 * ra ** (1 / 6) / (1 + (0.559 / pr) ** (9 / 16)) ** (8 / 27)) ** 2


def _churchill_bernstein(re, pr):
    # Churchill and Bernstein (1977), cylinder in cross flow, written out here independently of ht.
    return 0.3 + 0.62 * re ** 0.5 * pr ** (1 / 3) / (1 + (0.4 / pr) ** (2 / 3)) ** 0.25 * \
        (1 + (re / 282000) ** (5 / 8)) ** (4 / 5)


@pytest.mark.parametrize("d_m,ts_c,ta_c", [(0.019, 103.7, 50.0), (0.0095, 96.85, 56.85), (0.03, 126.85, 26.85)])
def test_natural_convection_vs_churchill_chu_written_out(d_m, ts_c, ta_c):
    tf_k = 0.5 * (ts_c + ta_c) + 273.15
    rho, mu, k, pr = AIR_TABLE[min(AIR_TABLE, key=lambda t: abs(t - tf_k))]
    assert abs(min(AIR_TABLE, key=lambda t: abs(t - tf_k)) - tf_k) < 1.0
    nu = mu / rho
    ra = 9.80665 * (ts_c - ta_c) / tf_k * d_m ** 3 / nu ** 2 * pr
    h_ref = _churchill_chu(ra, pr) * k / d_m
    # Source: Churchill-Chu (1975) written out, air properties from Incropera Table A.4 (from memory).
    assert h_natural_cylinder(d_m, ts_c, ta_c) == pytest.approx(h_ref, rel=0.03)


@pytest.mark.parametrize("d_m,v", [(0.019, 1.0), (0.0095, 5.0), (0.025, 15.0)])
def test_forced_convection_vs_churchill_bernstein_written_out(d_m, v):
    ts_c, ta_c = 126.85, 26.85  # film 350 K
    rho, mu, k, pr = AIR_TABLE[350.0]
    re = rho * v * d_m / mu
    h_ref = _churchill_bernstein(re, pr) * k / d_m
    # Source: Churchill-Bernstein (1977) written out, air properties from Incropera Table A.4 (from memory).
    assert h_forced_cylinder(d_m, v, ts_c, ta_c) == pytest.approx(h_ref, rel=0.03)
    hn = h_natural_cylinder(d_m, ts_c, ta_c)
    hf = h_forced_cylinder(d_m, v, ts_c, ta_c)
    # Source: Churchill (1977) combination with n = 3, exact.
    assert h_outside_cylinder(d_m, v, ts_c, ta_c) == pytest.approx((hn ** 3 + hf ** 3) ** (1 / 3), rel=1e-12)


def test_series_resistances_of_a_hose_wall():
    d_i, d_o, k_wall, h_i = 0.0095, 0.0187, 0.25, 50.0
    ua, ts = cylinder_ua_per_m(d_i, d_o, k_wall, 100.0, 50.0, 2.0, h_i)
    h_o = h_outside_cylinder(d_o, 2.0, ts, 50.0)
    r = 1 / (h_i * math.pi * d_i) + math.log(d_o / d_i) / (2 * math.pi * k_wall) + 1 / (h_o * math.pi * d_o)
    # Source: thermal resistances in series for a cylindrical wall (Incropera ch. 3), exact.
    assert ua == pytest.approx(1 / r, rel=2e-3)
    # Source: the surface temperature divides the drop in proportion to the resistances (exact).
    assert (ts - 50.0) == pytest.approx(50.0 * (1 / (h_o * math.pi * d_o)) * ua, rel=5e-3)


def test_inside_film_laminar_value():
    # Source: fully developed laminar flow, constant wall temperature, Nu = 3.66 (Incropera eq. 8.55).
    assert h_inside_pipe(0.01, 5 * LPM, 20e-6, 0.13, 200.0) == pytest.approx(3.66 * 0.13 / 0.01, rel=1e-3)


@pytest.mark.parametrize("d_fin_mm,h", [(57.15, 58.0), (22.0, 40.0), (40.0, 100.0), (30.0, 10.0)])
def test_fin_efficiency_vs_exact_bessel_solution(d_fin_mm, h):
    pytest.importorskip("scipy")
    import ht
    args = (0.0254 if d_fin_mm > 30 else 0.00953, d_fin_mm * 1e-3, 4e-4, 200.0, h)
    # Source: exact annular-fin solution with insulated tip (Kern and Kraus) as implemented in ht (needs scipy).
    assert annular_fin_efficiency(*args) == pytest.approx(ht.fin_efficiency_Kern_Kraus(*args), abs=0.03)


def test_solver_reports_non_convergence():
    r = solve_steady(lambda t: 1.0 - (t / 100.0) ** 5, 0.0, 200.0, max_iter=1)
    assert r["status"] == "not converged" and r["temp_c"] is None and "did not converge" in r["message"]
    # Source: exact root of a linear balance, 100 C.
    assert solve_steady(lambda t: 100.0 - t, 0.0, 200.0)["temp_c"] == pytest.approx(100.0, abs=0.05)


def test_warmup_matches_analytic_first_order_solution():
    t0, ta, p, ua, mcp = 80.0, 50.0, 1000.0, 0.4, 1800.0
    r = warmup(t0, p, lambda t: ua * (t - ta), mcp, 125.0, 600.0)
    assert len(r["curve"]) == 51
    for pt in r["curve"]:
        # Source: exact solution T(t) = Ta + P/UA + (T0 - Ta - P/UA) exp(-t UA/(m cp)).
        exact = ta + p / ua + (t0 - ta - p / ua) * math.exp(-pt["t_s"] * ua / mcp)
        assert pt["temp_c"] == pytest.approx(exact, abs=1e-6)
    # Source: the same exact solution solved for T = 125 C.
    t_exact = -mcp / ua * math.log((125.0 - ta - p / ua) / (t0 - ta - p / ua))
    assert r["seconds_to_limit"] == pytest.approx(t_exact, abs=0.05)


def test_warmup_levels_off_below_limit():
    r = warmup(60.0, 100.0, lambda t: 5.0 * (t - 50.0), 2000.0, 125.0, 600.0)
    assert r["seconds_to_limit"] is None
    # Source: exact asymptote Ta + P/UA = 70 C.
    assert r["levels_off_c"] == pytest.approx(70.0, abs=1e-6)
    assert "never reached" in r["message"]


def test_warmup_with_nonlinear_rejection_vs_fine_rk4():
    # Rejection like free convection, Q = a (T - Ta)^1.25; reference: classical RK4 written out here with
    # 20000 steps (converged to well under 0.01 K).
    ta, p, a, mcp, t0, hold = 50.0, 800.0, 0.3, 2500.0, 60.0, 900.0

    def rej(t):
        return a * abs(t - ta) ** 1.25 * (1 if t >= ta else -1)

    def f(t):
        return (p - rej(t)) / mcp

    n, t, h = 20000, t0, hold / 20000
    for _ in range(n):
        k1 = f(t)
        k2 = f(t + 0.5 * h * k1)
        k3 = f(t + 0.5 * h * k2)
        k4 = f(t + h * k3)
        t += h / 6 * (k1 + 2 * k2 + 2 * k3 + k4)
    r = warmup(t0, p, rej, mcp, 500.0, hold)
    # Source: independent RK4 integration of the same lumped equation (fine steps).
    assert r["curve"][-1]["temp_c"] == pytest.approx(t, abs=0.05)


def test_warmup_is_stable_for_a_tiny_volume_and_big_rejection():
    r = warmup(80.0, 1000.0, lambda t: 2000.0 * (t - 50.0), 100.0, 125.0, 8000.0)
    # Source: exact asymptote Ta + P/UA = 50.5 C, reached within a few time constants (0.05 s).
    assert all(math.isfinite(p["temp_c"]) for p in r["curve"])
    assert r["curve"][-1]["temp_c"] == pytest.approx(50.5, abs=1e-9)


def test_warmup_past_the_curve_finds_a_slow_creep_in_few_steps():
    # Source: exact solution of C dT/dt = P - R0 with constant rejection R0: T = T0 + (P - R0) t / C, so the limit
    # is reached at t = (limit - T0) C / (P - R0). The search past the curve once took 10^5-10^6 steps here.
    calls = []

    def rejected(t):
        calls.append(t)
        return 995.0

    r = warmup(60.0, 1000.0, rejected, 4000.0, 125.0, 5.0)
    exact = (125.0 - 60.0) * 4000.0 / (1000.0 - 995.0)  # 52,000 s, within the day searched
    assert r["seconds_to_limit"] == pytest.approx(exact, rel=1e-9)
    assert len(calls) < 2000


def test_warmup_past_the_curve_matches_the_exact_crossing_time():
    # Source: exact first-order solution, T = Teq + (T0 - Teq) exp(-t UA / C), Teq = Ta + P / UA; solved for the
    # time at which T reaches the limit (Bergman et al., sec. 5.3).
    t0, p, ua, ta, mcp, limit = 60.0, 1000.0, 7.0, 50.0, 40000.0, 170.0
    r = warmup(t0, p, lambda t: ua * (t - ta), mcp, limit, 60.0)
    teq = ta + p / ua
    exact = -mcp / ua * math.log((limit - teq) / (t0 - teq))
    assert exact > 60.0 and r["seconds_to_limit"] == pytest.approx(exact, rel=1e-6)
