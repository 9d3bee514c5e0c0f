"""Selection stage: every tabulated hose class and dash size, recomputed for each line.

The line's hose parts are swapped for the candidate (its nominal bore; the parts keep their
length, bends, rise and roughness) and the line is recomputed with
``calc.system.line.compile_line`` and ``line_flow`` at every operating point's circuit flow
and fluid state (the same physics as the circuit, not an approximation). A candidate is
checked for the velocity band of the line's role (velocity in the hose; the fittings keep
their own bores), the line's pressure-drop budget, the pump inlet (feed lines), the pressure
and burst the line must hold, the temperature range, every bend's radius and the route's
forced radius, and suction (feed lines below atmospheric need a hose that does not collapse).
"""
from __future__ import annotations

import math
from dataclasses import dataclass

from ..data.practice import INLET_FLOOR_BAR, INLET_MIN_BAR, VELOCITY_BANDS_M_S
from ..data.tables import hose_classes
from ..system.circuit import BAR
from ..system.line import compile_line, line_flow

__all__ = ["SelectionSection", "selection_stage", "rank_candidates"]


@dataclass(frozen=True)
class SelectionSection:
    """Per line: ``candidates`` (the result's ``lines[].candidates``)."""

    candidates: tuple


@dataclass(frozen=True)
class _Need:
    """What a candidate for one line must meet, read once from the earlier sections."""

    role: str
    index: int
    budget: float | None
    design_factor: float
    required: float
    bends: tuple
    forced: float | None
    last_feed: bool
    t_max: float
    t_min: float
    p_min: float
    other_feed_bar: tuple = ()


def _drops(parts, hose_idx, bore, flows, states) -> list[float]:
    trial = [dict(p, bore_mm=bore) if i in hose_idx else p for i, p in enumerate(parts)]
    segs = compile_line(trial)
    return [line_flow(segs, qi, st.nu_m2_s, st.rho_kg_m3, detail=False)[0] / BAR for qi, st in zip(flows, states)]


def _judge(cls, row, need: _Need, dps, v: float, conditions) -> tuple[list, list]:
    """Failed checks and reasons of one candidate."""
    failed, reasons = [], []
    lo_v, hi_v = VELOCITY_BANDS_M_S[need.role]
    dp_max = max(dps)
    if v > hi_v:
        failed.append("velocity")
        reasons.append(f"velocity {v:.1f} m/s in the hose exceeds {hi_v:g} m/s for a {need.role} line")
    if need.budget is not None and dp_max > need.budget:
        failed.append("pressure drop")
        reasons.append(f"drop {dp_max:.2f} bar exceeds the {need.budget:g} bar budget")
    j = need.index
    if need.last_feed:
        p_in = min(-(o + d) for o, d in zip(need.other_feed_bar, dps))
        if p_in < INLET_MIN_BAR:
            failed.append("pump inlet")
            shown = max(p_in, INLET_FLOOR_BAR)
            reasons.append(f"the pump would starve: its inlet would fall below the {INLET_MIN_BAR} bar limit"
                           + (f" (to {shown:.2f} bar gauge)" if shown > INLET_FLOOR_BAR else " (to a vacuum)"))
    req = need.required
    if need.role == "return":
        req = max([need.required] + [c["lines"][j]["outlet_bar"] + d for c, d in zip(conditions, dps)])
    w, b = row["working_bar"], row["burst_bar"]
    if req > 0 and w < req:
        failed.append("pressure")
        reasons.append(f"working {w:.0f} bar is under the {req:.1f} bar the line must hold")
    if req > 0 and b / req < need.design_factor:
        failed.append("burst")
        reasons.append(f"burst {b:.0f} bar is {b / req:.1f}:1 over {req:.1f} bar, under {need.design_factor:g}:1")
    if (cls["temp_max_c"] is not None and need.t_max > cls["temp_max_c"]) or \
            (cls["temp_min_c"] is not None and need.t_min < cls["temp_min_c"]):
        failed.append("temperature")
        reasons.append(f"rated {cls['temp_min_c']:g} to {cls['temp_max_c']:g} C; the fluid runs "
                       f"{need.t_min:g} to {need.t_max:g} C")
    mbr = row["min_bend_radius_mm"]
    tight = min(list(need.bends) + ([need.forced] if need.forced is not None else []), default=None)
    if tight is not None and tight < mbr:
        failed.append("bend radius")
        reasons.append(f"minimum bend radius {mbr:g} mm is over the tightest bend {tight:.0f} mm")
    if need.role == "feed" and need.p_min < 0 and cls.get("suction") is False:
        failed.append("suction")
        reasons.append("not a suction hose; the line runs below atmospheric")
    return failed, reasons


def rank_candidates(ln, need: _Need, conditions, states) -> list:
    """Rank every tabulated hose class and dash size for one compiled line (see the module docstring).

    Returns
    -------
    candidates : list of dict
        Passing candidates first, smallest bore then lightest construction
        (``light_rank``); then the rejected ones, fewest failed checks first.
        Each: class, dash, bore_mm, verdict ('ok', 'caution' for a bore below
        the velocity band, 'fail'), failed (check names), reasons,
        velocity_max_m_s, pressure_drop_bar, working_bar, min_bend_radius_mm.
        Empty for a line without hose.
    """
    parts = ln.parts
    hose_idx = [i for i, p in enumerate(parts) if p["kind"] == "hose"]
    if not hose_idx:
        return []
    lo_v, hi_v = VELOCITY_BANDS_M_S[need.role]
    flows = [c["demand_flow_lpm"] / 60000.0 for c in conditions]
    q_max = max(flows)
    hydro = {}  # bore -> drop per condition, bar
    out = []
    for cls in hose_classes().values():
        for row in cls["sizes"]:
            bore = row["bore_mm"]
            if bore not in hydro:
                hydro[bore] = _drops(parts, hose_idx, bore, flows, states)
            dps = hydro[bore]
            v = q_max / (0.25 * math.pi * (bore * 1e-3) ** 2)
            failed, reasons = _judge(cls, row, need, dps, v, conditions)
            verdict = "fail" if failed else "ok"
            out.append({"class": cls["class"], "dash": row["dash"], "bore_mm": bore, "verdict": verdict,
                        "failed": failed, "reasons": reasons, "velocity_max_m_s": v, "pressure_drop_bar": max(dps),
                        "working_bar": row["working_bar"], "min_bend_radius_mm": row["min_bend_radius_mm"],
                        "light_rank": cls["light_rank"], "source": row["source"]})
    _mark_oversized(out, lo_v, hi_v)
    out.sort(key=lambda c: (c["verdict"] == "fail", len(c["failed"]) if c["failed"] else 0, c["bore_mm"],
                            c["light_rank"], c["class"]))
    return out


def _mark_oversized(cands: list, lo_v: float, hi_v: float) -> None:
    """A passing candidate slower than the band is larger than needed only when a smaller size of its
    class passes too; the smallest that passes is never called oversized."""
    for c in cands:
        if c["verdict"] != "ok" or c["velocity_max_m_s"] >= lo_v:
            continue
        smaller = [o for o in cands if o["class"] == c["class"] and o["verdict"] != "fail" and o["bore_mm"] < c["bore_mm"]]
        if smaller:
            c["verdict"] = "caution"
            c["reasons"].append(f"velocity {c['velocity_max_m_s']:.2f} m/s is below the {lo_v:g}-{hi_v:g} m/s band: "
                                f"larger than needed (-{max(smaller, key=lambda o: o['bore_mm'])['dash']} passes too)")


def selection_stage(job, circuit, ratings) -> SelectionSection:
    """Hose candidates for every line.

    Parameters
    ----------
    job : calc.model.prepared.PreparedJob
    circuit : calc.stages.circuit.CircuitSection
    ratings : calc.stages.ratings.RatingsSection
        For each line's pressure to hold, temperatures, lowest pressure and route.
    """
    conditions = circuit.conditions
    model = circuit.model
    states = [model.state(c["fluid_temp_c"]) for c in conditions]
    feed = model.by_role["feed"]
    demand = [c["demand_flow_lpm"] / 60000.0 for c in conditions]
    feed_drop = {ln.index: [line_flow(ln.segs, q, st.nu_m2_s, st.rho_kg_m3, detail=False)[0] / BAR
                            for q, st in zip(demand, states)] for ln in feed}
    out = []
    for ln, rating in zip(model.lines, ratings.ratings):
        route = rating["route"]
        need = _Need(ln.role, ln.index, job.lines[ln.index].spec.get("dp_budget_bar"),
                     job.ratings["hose_design_factor"], rating["required_bar"],
                     tuple(b["radius_mm"] for p in ln.parts if p["kind"] == "hose" for b in p.get("bends") or ()),
                     route["tightest_radius_mm"] if route else None,
                     bool(ln.role == "feed" and feed and feed[-1] is ln),
                     rating["temp_max_c"], rating["temp_min_c"], rating["pressure_min_bar"],
                     tuple(sum(d[i] for k, d in feed_drop.items() if k != ln.index) for i in range(len(conditions))))
        out.append(rank_candidates(ln, need, conditions, states))
    return SelectionSection(tuple(out))
