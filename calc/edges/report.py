"""The readable text report of an evaluated job (command line).

Every figure is shown in the unit its key is declared with in ``calc.model.result``, converted
to the display system by ``calc.edges.units``; the sentences are localized the same way.
"""
from __future__ import annotations

import math

from ..data.tables import fitting_families, tube_materials
from ..model.job import field_unit
from ..model.result import field_at
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

_COND = "conditions[]."
_LINE = "conditions[].lines[]."
_PART = "conditions[].lines[].parts[]."


class _Show:
    """Figures of the result in one display system, by their declared unit."""

    def __init__(self, units: str):
        self.units = units

    def num(self, v, path: str, fmt: str = "{:.2f}") -> str:
        return fmt.format(to_display(v, field_at(path).unit, self.units))

    def unit(self, path: str) -> str:
        return label(field_at(path).unit, self.units)

    def fig(self, v, path: str, fmt: str = "{:.2f}") -> str:
        """Number and unit: '1.98 gpm'."""
        return f"{self.num(v, path, fmt)} {self.unit(path)}"


#: Steps of a length to order, rounded up: the build sheet's shop precision for 'Hose and tube to order'
#: (site/static/js/precision.js; tests/edges/test_report.py holds the two to the same figures).
ORDER_LENGTH_STEP = {"metric": (0.01, 2), "us": (0.1, 1)}


def _order_length(total_mm: float, s: _Show) -> str:
    """A length to order, never shorter than the total, at the sheet's shop precision."""
    shown = to_display(total_mm / 1000.0, "length_m", s.units)
    step, decimals = ORDER_LENGTH_STEP[s.units]
    return f"{math.ceil(shown / step - 1e-9) * step:.{decimals}f} {label('length_m', s.units)}"


def _used_on(lines: list) -> str:
    return ("line " if len(lines) == 1 else "lines ") + ", ".join(str(i + 1) for i in lines)


def _order_lines(order: dict, s: _Show) -> list[str]:
    """The order list: hose per class and size, tube per material and size, fittings, adapters, devices."""
    if not order:
        return []
    families = fitting_families()
    size = "{:.3f}" if s.units == "us" else "{:.2f}"  # the sheet's bores and tube sizes: 0.001 in, 0.01 mm
    out = ["", "Order list (every line as built)"]
    for h in order["hoses"]:
        what = f"hose {h['class']} -{h['dash']}" if h["class"] else "hose, class not named"
        out.append(f"  {what}, bore {s.fig(h['bore_mm'], 'order.hoses[].bore_mm', size)}: "
                   f"{_order_length(h['total_mm'], s)} in {h['pieces']} piece{'s' * (h['pieces'] != 1)} "
                   f"({_used_on(h['lines'])})")
    for t in order["tubes"]:
        out.append(f"  tube {tube_materials()[t['material']]['name']}, {s.fig(t['od_mm'], 'order.tubes[].od_mm', size)}"
                   f" x {s.fig(t['wall_mm'], 'order.tubes[].wall_mm', size)}: {_order_length(t['total_mm'], s)} "
                   f"in {t['pieces']} piece{'s' * (t['pieces'] != 1)} ({_used_on(t['lines'])})")
    for f in order["fittings"]:
        fam = families[f["family"]]["name"] + (f" -{f['dash']}" if f["dash"] else "") if f["family"] else "family not named"
        out.append(f"  {f['count']} x fitting {fam}, {f['shape']}, bore {s.fig(f['bore_mm'], 'order.fittings[].bore_mm', size)} "
                   f"({_used_on(f['lines'])})")
    for a in order["adapters"]:
        out.append(f"  {a['count']} x adapter {a['name']} ({_used_on(a['lines'])})")
    for d in order["devices"]:
        out.append(f"  {d['count']} x {'cooler' if d['is_cooler'] else 'series device'} ({_used_on(d['lines'])})")
    return out


def _pump_lines(curve: dict, s: _Show) -> list[str]:
    """The pump's drive and flow control: the pulley ratio used, and the flow-control setting or the flow table."""
    if not curve:
        return []
    out = [f"    drive: pulley ratio {curve['pulley_ratio']:.3f} (pump : crank speed)"]
    if curve.get("table"):
        rows = ", ".join(f"{s.num(r['pump_rpm'], 'pump_curve.table[].pump_rpm', '{:.0f}')} rpm "
                         f"{s.fig(r['table_lpm'], 'pump_curve.table[].table_lpm')}" for r in curve["table"])
        out.append(f"    flow control: the pump's flow table (pump speed, flow): {rows}")
    elif curve.get("flow_limit_lpm") is not None:
        out.append(f"    flow control: setting {s.fig(curve['flow_limit_lpm'], 'pump_curve.flow_limit_lpm')}")
    return out


def _rating_lines(ln: dict, s: _Show) -> list[str]:
    """The rating of one line: assembly working and burst, proof test, margin, weakest part, drop budgets."""
    r = ln["rating"]

    def p(v, key, fmt="{:.0f}"):
        return "unknown" if v is None else s.fig(v, f"lines[].rating.{key}", fmt)
    out = [f"    rating: working {p(r['working_bar'], 'working_bar')}, burst {p(r['burst_bar'], 'burst_bar')}, "
           f"proof test {p(r['proof_test_bar'], 'proof_test_bar')} (2 x working, common practice); "
           f"must hold {p(r['required_bar'], 'required_bar', '{:.1f}')} ({r['required_basis']})"]
    wp = r["weakest_part"]
    if r["required_bar"] < 1.0:
        head = "    margin: not limiting, the line stays near atmospheric"
    else:
        margin = "unknown" if r["margin"] is None else f"{r['margin']:.2f}"
        burst = "unknown" if r["burst_margin"] is None else f"{r['burst_margin']:.1f}:1"
        head = (f"    margin {margin} (working / required), burst margin {burst} against "
                f"{r['design_factor']:g}:1")
    out.append(head + "; weakest part: " + (wp["label"] if wp else "none rated"))
    budgets = [f"{p(r[k], k, '{:g}')} {w}" for k, w in (("dp_budget_bar", "warm"), ("dp_budget_cold_bar", "at cold start"))
               if r[k] is not None]
    if budgets:
        out.append("    pressure-drop budget: " + ", ".join(budgets)
                   + f"; largest drop {s.fig(ln['pressure_drop_max_bar'], 'lines[].pressure_drop_max_bar')} at "
                     f"‘{ln['pressure_drop_max_at']}’")
    return out


def _assembly_lines(ln: dict, s: _Show) -> list[str]:
    """The hose assembly: cut length, end to end, slack, bends and where they come from."""
    a = ln["assembly"]
    if a["hose_cut_mm"] is None:
        return []
    a_ = "lines[].assembly."
    src = {"route": "from the route and the slack it needs", "overall": "from the overall length",
           "typed": "as typed"}[a["length_source"]]
    out = [f"    assembly: part {a['hose_part'] + 1} cut to {s.fig(a['hose_cut_mm'], a_ + 'hose_cut_mm', '{:.0f}')} "
           f"({src}), {s.fig(a['overall_mm'], a_ + 'overall_mm', '{:.0f}')} end to end with "
           f"{s.fig(a['cutoff_mm'], a_ + 'cutoff_mm', '{:.0f}')} of cut-off allowances"]
    if a["slack_mm"] is not None:
        out[-1] += (f"; slack {s.fig(a['slack_mm'], a_ + 'slack_mm', '{:.0f}')} over the route, "
                    f"{s.fig(a['slack_needed_mm'], a_ + 'slack_needed_mm', '{:.0f}')} needed")
    if a["bends"]:
        out.append("    bends" + (" (from the route)" if a["bends_from_route"] else "") + ": " + ", ".join(
            f"{b['angle_deg']:.0f} deg at {s.fig(b['radius_mm'], a_ + 'bends[].radius_mm', '{:.0f}')}"
            for b in a["bends"]))
    return out


def _wall_lines(ln: dict, s: _Show) -> list[str]:
    """Hoses and tubes near a heat source: the air around each, its wall estimate per operating point, its limit."""
    w_ = "lines[].walls[]."
    out = []
    for w in ln.get("walls", []):
        if w["verdict"] is None and w["local_air_temp_c"] is None:
            continue

        def t(v, key):
            return "unknown" if v is None else s.fig(v, w_ + key, "{:.0f}")
        own = "its own" if w["local_air_temp_c"] is not None else "the under-hood air"
        basis = {"fluid": "a fluid-temperature rating", "wall": "a wall-temperature limit"}[w["limit_basis"]]
        where = {"outer": "outer surface", "inner": "inner surface", "both": "whole wall"}[w["hottest_surface"]]
        out.append(f"    wall near heat: {w['label']} in {t(w['air_temp_c'], 'air_temp_c')} air ({own}): hottest "
                   f"wall {t(w['hottest_c'], 'hottest_c')} ({where}, at ‘{w['hottest_at']}’); "
                   f"limit {t(w['limit_c'], 'limit_c')} ({basis}) [{w['verdict'] or 'not judged'}]")
        out.append("      outer surface: " + ", ".join(
            f"‘{pt['name']}’ {s.num(pt['outer_c'], w_ + 'points[].outer_c', '{:.0f}')}" + ("" if pt["flow"] else
                                                                                          " (no flow)")
            for pt in w["points"]) + f" {s.unit(w_ + 'points[].outer_c')}; radiation from the hot surface not "
                                     "modelled (the wall facing it runs hotter)")
    return out


def _fix_words(fx: dict, s: _Show) -> str:
    unit = field_unit(fx["path"])
    value = fx["value"]
    shown = f"{to_display(value, unit, s.units):.4g} {label(unit, s.units)}".strip() if unit else str(value)
    return f"        edit: set {fx['label']} to {shown}"


def _candidate_lines(ln: dict, s: _Show, show: int = 5) -> list[str]:
    """Hose candidates of one line as whole assemblies: the passing ones, then why the first rejected ones fail."""
    cands = ln["candidates"]
    ok = [c for c in cands if c["verdict"] != "fail"]
    bad = [c for c in cands if c["verdict"] == "fail"]
    c_ = "lines[].candidates[]."
    out = [f"    hose candidates (whole assemblies, ends re-sized): {len(ok)} pass, {len(bad)} rejected"]
    for c in ok[:show] + bad[:max(0, show - len(ok[:show])) or 2]:
        out.append(f"      [{c['verdict']:^7}] {c['class']} -{c['dash']} ({s.fig(c['bore_mm'], c_ + 'bore_mm')})"
                   + (" (the line's own)" if c["current"] else "")
                   + f": drop {s.fig(c['pressure_drop_bar'], c_ + 'pressure_drop_bar')} at ‘{c['pressure_drop_at']}’, "
                     f"v {s.fig(c['velocity_max_m_s'], c_ + 'velocity_max_m_s')}"
                   + (f"; fails {', '.join(c['failed'])}" if c["failed"] else "")
                   + (f"; {c['note']}" if c["note"] else ""))
    return out


def _steady_lines(th: dict, s: _Show, temp) -> list[str]:
    st = th.get("steady", {})
    if th.get("steady_temp_c") is not None:
        out = [f"  steady temperature {temp(th['steady_temp_c'])} (heat "
               f"{s.fig(th.get('steady_heat_w', 0.0), 'thermal.steady_heat_w', '{:.0f}')} duty-weighted; "
               f"{st.get('iterations', 0)} evaluations)"]
    else:
        out = [f"  steady temperature: {st.get('message', 'not found')}"]
    d_ = "thermal.steady_duty[]."
    for d in th.get("steady_duty", []):
        out.append(f"    {d['name']:<22} {d['duty_percent']:5.1f} %  heat {s.fig(d['heat_w'], d_ + 'heat_w', '{:7.0f}')}"
                   f"  rejected {s.fig(d['heat_rejected_w'], d_ + 'heat_rejected_w', '{:7.0f}')} "
                   f"(lines {s.num(d['lines_w'], d_ + 'lines_w', '{:.0f}')}, reservoir "
                   f"{s.num(d['reservoir_w'], d_ + 'reservoir_w', '{:.0f}')}, cooler "
                   f"{s.num(d['cooler_w'], d_ + 'cooler_w', '{:.0f}')})")
    return out


def _thermal_lines(th: dict, s: _Show) -> list[str]:
    """The fluid-temperature section (calc.stages.thermal)."""
    def temp(v):
        return "n/a" if v is None else s.fig(v, "thermal.limit_c", "{:.1f}")

    out = ["", f"Fluid temperature: [{th['verdict']}] {th['message']}",
           f"  air {temp(th['air_temp_c'])}, limit {temp(th['limit_c'])} ({th.get('limit_basis', 'fluid')}), "
           f"target {temp(th['target_c'])}"]
    out.extend(_steady_lines(th, s, temp))
    fl = th.get("full_lock", {})
    tl = th.get("full_lock_seconds_to_limit")
    out.append(f"  full-lock hold from {temp(fl.get('start_temp_c'))}: the fluid in the pump "
               + (f"reaches the limit after {tl:.0f} s" if tl is not None else "does not reach the limit")
               + f"; whole fluid, mixed: {fl.get('message', '')}")
    curve = th.get("full_lock_curve") or []
    if curve:
        c_ = "thermal.full_lock_curve[]."
        step = max(1, len(curve) // 5)
        out.append("    in the pump: " + ", ".join(f"{p['t_s']:.1f} s {s.num(p['pump_temp_c'], c_ + 'pump_temp_c', '{:.0f}')}"
                                                   for p in curve[::step]) + f" {s.unit(c_ + 'pump_temp_c')}")
    need = th.get("cooler_needed_w_per_k")
    out.append("  cooler: " + th.get("cooler_message", "")
               + (f" [{s.fig(need, 'thermal.cooler_needed_w_per_k', '{:.1f}')}]" if need else ""))
    for ch in th.get("checks", []):
        out.append(f"    [{ch['verdict']:^7}] {ch['check']}: {ch['message']}")
    return out


def _condition_lines(c: dict, s: _Show) -> list[str]:
    out = [f"== {c['name']}: {c['engine_rpm']:.0f} rpm, fluid {s.fig(c['fluid_temp_c'], _COND + 'fluid_temp_c', '{:.0f}')}"
           f"{', full lock' if c['full_lock'] else ''}; viscosity {c['viscosity_cst']:.1f} cSt, "
           f"density {s.fig(c['density_kg_m3'], _COND + 'density_kg_m3', '{:.0f}')}",
           f"   pump flow {s.fig(c['pump_flow_lpm'], _COND + 'pump_flow_lpm')}"
           f"{' (flow control limiting)' if c['flow_control_limiting'] else ''}, "
           f"circuit flow {s.fig(c['circuit_flow_lpm'], _COND + 'circuit_flow_lpm')}, "
           f"over relief {s.fig(c['relief_flow_lpm'], _COND + 'relief_flow_lpm')}",
           f"   pump outlet {s.fig(c['pump_outlet_bar'], _COND + 'pump_outlet_bar')}, "
           f"pump inlet {s.fig(c['pump_inlet_bar'], _COND + 'pump_inlet_bar', '{:.3f}')}"
           + ("" if c.get("has_feed_line", True) else " (no feed line listed)")]
    if "heat_w" in c:
        out.append(f"   heat generated {s.fig(c['heat_w'], _COND + 'heat_w', '{:.0f}')}"
                   + (f", rejected {s.fig(c['heat_rejected_w'], _COND + 'heat_rejected_w', '{:.0f}')} "
                      "at this temperature" if "heat_rejected_w" in c else ""))
    v_unit, p_unit = s.unit(_PART + "velocity_m_s"), s.unit(_PART + "pressure_drop_bar")
    for ln in c["lines"]:
        out.append(f"   -- {ln['name']} ({ln['role']}): flow {s.fig(ln['flow_lpm'], _LINE + 'flow_lpm')}, "
                   f"drop {s.fig(ln['pressure_drop_bar'], _LINE + 'pressure_drop_bar', '{:.3f}')}, "
                   f"v max {s.fig(ln['velocity_max_m_s'], _LINE + 'velocity_max_m_s')}, "
                   f"Re min {ln['reynolds_min']:.0f}, "
                   f"dT {s.fig(ln['temp_rise_c'], _LINE + 'temp_rise_c', '{:.3f}')}")
        out.append(f"      {'#':>3} {'part':<9} {'v ' + v_unit:>10} {'Re':>8} {'regime':<13} {'drop ' + p_unit:>11}")
        for pt in ln.get("parts", []):
            place = "adapter" if pt["job_part"] is None else str(pt["job_part"] + 1)
            out.append(f"      {place:>3} {pt['kind']:<9} {s.num(pt['velocity_m_s'], _PART + 'velocity_m_s'):>10} "
                       f"{pt['reynolds']:>8.0f} {pt['regime']:<13} "
                       f"{s.num(pt['pressure_drop_bar'], _PART + 'pressure_drop_bar', '{:.4f}'):>11}")
    return out + [""]


def text_report(res: dict, units: str = "metric") -> str:
    """Format an ``evaluate`` result as plain text tables.

    Parameters
    ----------
    res : dict
        A successful ``calc.evaluate`` result.
    units : str
        'metric' (bar, L/min, mm, C) or 'us' (psi, gpm, in, F).
    """
    res = localize_result(res, units)
    s = _Show(units)
    out = [f"Linesmith report: {res['job_name'] or '(unnamed job)'}",
           f"Fluid: {res['fluid']['name']} ({res['fluid']['source']})", ""]
    for c in res["conditions"]:
        out.extend(_condition_lines(c, s))
    circuit = res.get("circuit")
    if circuit:
        out.append(f"Pump, relief and gear: [{circuit['verdict']}]")
        out.extend(_pump_lines(res.get("pump_curve") or {}, s))
        for ch in circuit["checks"]:
            out.append(f"    [{ch['verdict']:^7}] {ch['check']}: {ch['message']}")
            if ch.get("fix"):
                out.append(_fix_words(ch["fix"], s))
        out.append("")
    out.append("Checks per line")
    rated = False
    for ln in res["lines"]:
        out.append(f"  Line {ln['index'] + 1}: {ln['name']} ({ln['role']}) [{ln['verdict']}]")
        if "rating" in ln:
            rated = True
            out.extend(_rating_lines(ln, s))
        out.extend(_assembly_lines(ln, s))
        out.extend(_wall_lines(ln, s))
        for ch in ln["checks"]:
            out.append(f"    [{ch['verdict']:^7}] {ch['check']}: {ch['message']}")
            if ch.get("fix"):
                out.append(_fix_words(ch["fix"], s))
        if ln.get("candidates"):
            out.extend(_candidate_lines(ln, s))
    if res.get("thermal"):
        out.extend(_thermal_lines(res["thermal"], s))
    out.extend(_order_lines(res.get("order") or {}, s))
    if res.get("warnings"):
        out.append("")
        out.append("Warnings")
        for w in res["warnings"]:
            out.append(f"  {w['label']}: {w['message']}")
    out.append("")
    out.append("Methods: " + " ".join(res.get("methods", [])))
    if rated:
        out.append("")
        out.append("Cautions")
        out.extend(f"  - {c}" for c in CAUTIONS)
    return "\n".join(out)
