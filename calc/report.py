"""The readable text report of an evaluated job (command line)."""
from __future__ import annotations

import copy

from .units import label, localize_result, to_display

__all__ = ["text_report", "CAUTIONS"]

#: The cautions shown wherever a rating is shown (page, report, build sheet).
CAUTIONS = (
    "Never exceed the maker's rated working pressure of any part.",
    "A hose assembly is rated only as high as its weakest component: hose, fitting or adapter.",
    "A high-pressure fluid injection injury needs emergency medical care even when it looks minor.",
    "Depressurise the circuit and let the fluid cool before working on it.",
    "This tool does not replace the maker's data, local codes or licensed practice.",
)


def _u(v, kind, units, fmt="{:.2f}"):
    return fmt.format(to_display(v, kind, units))


def _rating_lines(ln: dict, units: str) -> list[str]:
    """The rating of one line: assembly working and burst, margin, weakest part."""
    r, P = ln["rating"], label("pressure_bar", units)

    def p(v):
        return "unknown" if v is None else f"{_u(v, 'pressure_bar', units, '{:.0f}')} {P}"
    out = [f"    rating: working {p(r['working_bar'])}, burst {p(r['burst_bar'])}, must hold "
           f"{_u(r['required_bar'], 'pressure_bar', units, '{:.1f}')} {P} ({r['required_basis']})"]
    wp = r["weakest_part"]
    if r["required_bar"] < 1.0:
        head = "    margin: not limiting, the line stays near atmospheric"
    else:
        margin = "unknown" if r["margin"] is None else f"{r['margin']:.2f}"
        burst = "unknown" if r["burst_margin"] is None else f"{r['burst_margin']:.1f}:1"
        head = (f"    margin {margin} (working / required), burst margin {burst} against "
                f"{r['design_factor']:g}:1")
    out.append(head + "; weakest part: " + (f"{wp['index']} {wp['description']}" if wp else "none rated")
               + (f"; unrated parts: {', '.join(map(str, r['unrated_parts']))}" if r["unrated_parts"] else ""))
    return out


def _candidate_lines(ln: dict, units: str, show: int = 5) -> list[str]:
    """Ranked hose candidates of one line: the passing ones, then why the first rejected ones fail."""
    cands = ln["candidates"]
    ok = [c for c in cands if c["verdict"] != "fail"]
    bad = [c for c in cands if c["verdict"] == "fail"]
    V, P = label("speed_m_s", units), label("pressure_bar", units)
    out = [f"    hose candidates: {len(ok)} pass, {len(bad)} rejected (smallest, then lightest first)"
           + ("" if ln["rating"].get("dp_budget_bar") is not None else
              "; no pressure-drop budget set (dp_budget_bar), so the drop does not limit the size")]
    for c in ok[:show]:
        out.append(f"      {c['verdict']:<7} {c['class']} -{c['dash']} ({c['bore_mm']:g} mm): v "
                   f"{_u(c['velocity_max_m_s'], 'speed_m_s', units)} {V}, drop "
                   f"{_u(c['pressure_drop_bar'], 'pressure_bar', units)} {P}"
                   + (f"; {'; '.join(c['reasons'])}" if c["reasons"] else ""))
    for c in bad[:max(0, show - len(ok[:show])) or 2]:
        out.append(f"      fail    {c['class']} -{c['dash']} ({c['bore_mm']:g} mm): {', '.join(c['failed'])}: "
                   + "; ".join(c["reasons"]))
    return out


def _thermal_lines(th: dict, units: str) -> list[str]:
    """The fluid-temperature section (calc.thermal)."""
    T, W, K = label("temp_c", units), label("power_w", units), label("conductance_w_k", units)

    def temp(v):
        return "n/a" if v is None else f"{_u(v, 'temp_c', units, '{:.1f}')} {T}"

    out = ["", f"Fluid temperature: [{th['verdict']}] {th['message']}",
           f"  air {temp(th['air_temp_c'])}, limit {temp(th['limit_c'])} ({th.get('limit_basis', 'fluid')}), "
           f"target {temp(th['target_c'])}"]
    st = th.get("steady", {})
    if th.get("steady_temp_c") is not None:
        out.append(f"  steady temperature {temp(th['steady_temp_c'])} (heat "
                   f"{_u(th.get('steady_heat_w', 0.0), 'power_w', units, '{:.0f}')} {W} duty-weighted; "
                   f"{st.get('iterations', 0)} evaluations)")
    else:
        out.append(f"  steady temperature: {st.get('message', 'not found')}")
    for d in th.get("steady_duty", []):
        out.append(f"    {d['name']:<22} {d['duty_percent']:5.1f} %  heat {_u(d['heat_w'], 'power_w', units, '{:7.0f}')} "
                   f"{W}  rejected {_u(d['heat_rejected_w'], 'power_w', units, '{:7.0f}')} {W} "
                   f"(lines {_u(d['lines_w'], 'power_w', units, '{:.0f}')}, reservoir "
                   f"{_u(d['reservoir_w'], 'power_w', units, '{:.0f}')}, cooler "
                   f"{_u(d['cooler_w'], 'power_w', units, '{:.0f}')})")
    fl = th.get("full_lock", {})
    out.append(f"  full-lock hold from {temp(fl.get('start_temp_c'))}: {fl.get('message', '')}")
    curve = th.get("full_lock_curve") or []
    if curve:
        step = max(1, len(curve) // 5)
        out.append("    " + ", ".join(f"{p['t_s']:.0f} s {_u(p['temp_c'], 'temp_c', units, '{:.0f}')}"
                                      for p in curve[::step]) + f" {T}"
                   + (f" ({fl['curve_note']})" if fl.get("curve_note") else ""))
    need = th.get("cooler_needed_w_per_k")
    out.append("  cooler: " + th.get("cooler_message", "")
               + (f" [{_u(need, 'conductance_w_k', units, '{:.1f}')} {K}]" if need else ""))
    for ch in th.get("checks", []):
        out.append(f"    [{ch['verdict']:^7}] {ch['check']}: {ch['message']}")
    return out


def text_report(res: dict, units: str = "metric") -> str:
    """Format an ``evaluate`` result as plain text tables.

    Parameters
    ----------
    res : dict
        A successful ``calc.evaluate`` result.
    units : str
        'metric' (bar, L/min, mm, C) or 'us' (psi, gpm, in, F).
    """
    res = localize_result(copy.deepcopy(res), units) if units == "us" else res
    P, Q, T, V = (label(k, units) for k in ("pressure_bar", "flow_lpm", "temp_c", "speed_m_s"))
    out = [f"Linesmith report: {res['job_name'] or '(unnamed job)'}",
           f"Fluid: {res['fluid']['name']} ({res['fluid']['source']})", ""]
    for c in res["conditions"]:
        out.append(f"== {c['name']}: {c['engine_rpm']:.0f} rpm, fluid {_u(c['fluid_temp_c'], 'temp_c', units, '{:.0f}')} {T}"
                   f"{', full lock' if c['full_lock'] else ''}; viscosity {c['viscosity_cst']:.1f} cSt, "
                   f"density {c['density_kg_m3']:.0f} kg/m3")
        out.append(f"   pump flow {_u(c['pump_flow_lpm'], 'flow_lpm', units)} {Q}"
                   f"{' (flow control limiting)' if c['flow_control_limiting'] else ''}, "
                   f"circuit flow {_u(c['circuit_flow_lpm'], 'flow_lpm', units)} {Q}, "
                   f"over relief {_u(c['relief_flow_lpm'], 'flow_lpm', units)} {Q}")
        out.append(f"   pump outlet {_u(c['pump_outlet_bar'], 'pressure_bar', units)} {P}, "
                   f"pump inlet {_u(c['pump_inlet_bar'], 'pressure_bar', units, '{:.3f}')} {P}"
                   + ("" if c.get("has_feed_line", True) else " (no feed line listed)"))
        if "heat_w" in c:
            out.append(f"   heat generated {_u(c['heat_w'], 'power_w', units, '{:.0f}')} {label('power_w', units)}"
                       + (f", rejected {_u(c['heat_rejected_w'], 'power_w', units, '{:.0f}')} "
                          f"{label('power_w', units)} at this temperature" if "heat_rejected_w" in c else ""))
        for ln in c["lines"]:
            out.append(f"   -- {ln['name']} ({ln['role']}): flow {_u(ln['flow_lpm'], 'flow_lpm', units)} {Q}, "
                       f"drop {_u(ln['pressure_drop_bar'], 'pressure_bar', units, '{:.3f}')} {P}, "
                       f"v max {_u(ln['velocity_max_m_s'], 'speed_m_s', units)} {V}, Re min {ln['reynolds_min']:.0f}, "
                       f"dT {ln['temp_rise_c']:.3f} K")
            out.append(f"      {'#':>3} {'part':<9} {'v ' + V:>10} {'Re':>8} {'regime':<13} {'drop ' + P:>11}")
            for pt in ln.get("parts", []):
                out.append(f"      {pt['index']:>3} {pt['kind']:<9} {_u(pt['velocity_m_s'], 'speed_m_s', units):>10} "
                           f"{pt['reynolds']:>8.0f} {pt['regime']:<13} "
                           f"{_u(pt['pressure_drop_bar'], 'pressure_bar', units, '{:.4f}'):>11}")
        out.append("")
    out.append("Checks per line")
    rated = False
    for ln in res["lines"]:
        out.append(f"  {ln['name']} ({ln['role']})")
        if "rating" in ln:
            rated = True
            out.extend(_rating_lines(ln, units))
        for ch in ln["checks"]:
            out.append(f"    [{ch['verdict']:^7}] {ch['check']}: {ch['message']}")
        if ln.get("candidates"):
            out.extend(_candidate_lines(ln, units))
    if res.get("thermal"):
        out.extend(_thermal_lines(res["thermal"], units))
    if res.get("warnings"):
        out.append("")
        out.append("Warnings")
        for w in res["warnings"]:
            out.append(f"  {w['path']}: {w['message']}")
    out.append("")
    out.append("Methods: " + " ".join(res.get("methods", [])))
    if rated:
        out.append("")
        out.append("Cautions")
        out.extend(f"  - {c}" for c in CAUTIONS)
    return "\n".join(out)
