"""Assembly checks of a line: its length and slack, the route's bends, typed bends, and whether its parts
fit together (end sizes, the ports' line ends, barbed ends on a pressure line, ends that seal)."""
from __future__ import annotations

from ..data.practice import METRIC_END_WINDOW
from ..data.tables import fitting_families
from ..model.assembly import end_fittings
from ..model.result import check
from ..physics.sizes import dash_of_mm
from ..system.adapters import mating_problem
from ..system.naming import part_ref
from ..system.sketch import limiting_bend_radius
from .case import LineCase, fix, label_for, part_path, said

__all__ = ["length_checks", "route_check", "bend_checks", "consistency_checks", "port_checks"]


def _cutoffs(case: LineCase) -> str:
    return " + ".join(f"{case.parts[i].get('cutoff_mm') or 0:g}" for i in case.assembly.end_places) or "0"


def _slack_words(case: LineCase) -> str:
    a, rset = case.assembly, case.job.ratings
    minus, plus = rset["length_change_minus_percent"], rset["length_change_plus_percent"]
    move = case.spec.get("engine_movement_mm") or 0.0
    return (f"the hose changes by +{plus:g} / -{minus:g} % under pressure (SAE J517, from memory)"
            + (f" and the engine moves {move:g} mm" if move else "")
            + f": it needs {a.slack_needed_mm:.0f} mm of slack")


def _route_length(case: LineCase) -> dict:
    a = case.assembly
    where = f"line {case.index + 1}"
    if a.source == "overall" and a.slack_mm < a.slack_needed_mm - 1e-9:
        out = check("length", "fail",
                    f"make the assembly {a.overall_needed_mm:.0f} mm long end to end: at {a.assembly_mm:.0f} mm it "
                    f"leaves {a.slack_mm:.0f} mm over the {a.route['length_mm']:.0f} mm route, and "
                    f"{_slack_words(case)}")
        out["fix"] = fix(f"lines[{case.index}].overall_length_mm", a.overall_needed_mm,
                         label_for("line", "overall_length_mm", where))
        return out
    typed = (f"; the {a.typed_mm:.0f} mm typed on the hose is not used" if a.typed_mm is not None
             and abs(a.typed_mm - a.hose_mm) > 0.5 else "")
    return check("length", "ok", f"cut the hose to {a.hose_mm:.0f} mm: the assembly is {a.assembly_mm:.0f} mm end to "
                                 f"end, {a.slack_mm:.0f} mm over the {a.route['length_mm']:.0f} mm route, and "
                                 f"{_slack_words(case)}; the cut-off allowances are {_cutoffs(case)} mm{typed}")


def length_checks(case: LineCase) -> list:
    """The assembly's cut length and slack, worked out once (``calc.system.assembly``)."""
    a = case.assembly
    if a.hose is None or a.hose_mm is None:
        return []
    if a.route is not None:
        return [_route_length(case)]
    move = case.spec.get("engine_movement_mm") or 0.0
    if a.source == "overall":
        typed = (f"; the {a.typed_mm:.0f} mm typed on the hose is not used" if a.typed_mm is not None
                 and abs(a.typed_mm - a.hose_mm) > 0.5 else "")
        said_ = (f"cut the hose to {a.hose_mm:.0f} mm: the assembly's {a.assembly_mm:.0f} mm end to end less the "
                 f"cut-off allowances {_cutoffs(case)} mm{typed}; {_slack_words(case)}")
    else:
        said_ = f"the hose is {a.hose_mm:.0f} mm long; {_slack_words(case)}"
    if move:
        return [check("length", "caution", said_ + "; give the line's measured route points to check that slack")]
    return [check("length", "ok", said_)]


def route_check(case: LineCase) -> dict | None:
    """The tightest radius the measured route forces against the minimum bend radius of the line's parts."""
    route = case.assembly.route
    if route is None:
        return None
    worst = limiting_bend_radius(case.part_ratings)
    tight = route["tightest_radius_mm"]
    desc = (f"the route is {route['length_mm']:.0f} mm through {len(case.spec['route_points_mm'])} points, "
            + (", ".join(f"{b['angle_deg']:.0f} deg at point {b['at_point'] + 1} (radius at most "
                         f"{b['max_radius_mm']:.0f} mm)" for b in route["bends"]) or "with no bends"))
    if tight is None:
        return check("route", "ok", desc)
    if worst is None:
        return check("route", "caution", desc + "; no minimum bend radius is known to compare with")
    mbr = worst["min_bend_radius_mm"]
    if tight < mbr:
        at = min(route["bends"], key=lambda b: b["max_radius_mm"])["at_point"]
        return check("route", "fail", f"move the points apart or reroute near point {at + 1}: the route forces a bend "
                                      f"of at most {tight:.0f} mm radius, under the {mbr:.0f} mm minimum of "
                                      f"{worst['label']}; {desc}")
    return check("route", "ok", f"{desc}; the tightest, {tight:.0f} mm, is at least the {mbr:.0f} mm minimum")


def _typed_bends(case: LineCase):
    a = case.assembly
    for i, p in enumerate(case.parts):
        if p["kind"] in ("hose", "tube") and p.get("bends") and not (a.route is not None and i == a.hose):
            yield i, p


def bend_checks(case: LineCase) -> list:
    """Bends typed on hoses and tubes against each part's minimum bend radius (the route's are the route check's)."""
    note = _ignored_note(case)
    found = _bend_check(case)
    return [c for c in (note, found) if c]


def _bend_check(case: LineCase) -> dict | None:
    by_index = {r["index"]: r for r in case.part_ratings}
    fails, unknown, n, first_fix = [], [], 0, None
    for i, p in _typed_bends(case):
        r, where = by_index[i], f"part {p.place + 1}"
        for m, b in enumerate(p["bends"]):
            n += 1
            mn = r["min_bend_radius_mm"]
            if mn is None:
                unknown.append(f"bend {m + 1} of {where}")
            elif b["radius_mm"] < mn * (1 - 1e-9):
                fails.append(f"bend {m + 1} of {r['label']} has a {b['radius_mm']:g} mm radius, under the {mn:.0f} mm "
                             "minimum")
                if first_fix is None:
                    first_fix = fix(part_path(case, p.place, f"bends[{m}].radius_mm"), float(round(mn + 0.49)),
                                    f"Centre-line radius of bend {m + 1} of {where}")
    if not n:
        return None
    if fails:
        out = check("bend radius", "fail", "bend the line wider or use a tighter-bending hose class: " + "; ".join(fails))
        out["fix"] = first_fix
        return out
    if unknown:
        return check("bend radius", "caution", "no minimum bend radius known for " + ", ".join(unknown)
                     + ": name the hose class or give its minimum bend radius")
    return check("bend radius", "ok", f"all {n} bends at or above their part's minimum radius")


def _ignored_note(case: LineCase) -> dict | None:
    a = case.assembly
    if not a.typed_bends_ignored:
        return None
    p = case.parts[a.hose]
    return check("bend radius", "ok", f"flagged: the bends typed on part {p.place + 1} are not used: the line's route "
                                      f"points give its {len(a.route['bends'])} bends")


def _size_of(p) -> tuple[int, float]:
    """A hose's or tube's dash size and size in mm (hose: bore; tube: outside diameter)."""
    if p["kind"] == "hose":
        cls = getattr(p, "hose_class", None)
        if cls is not None and p.get("dash") is not None:
            return p["dash"], p["bore_mm"]
        return dash_of_mm(p["bore_mm"])[0], p["bore_mm"]
    return dash_of_mm(p["od_mm"])[0], p["od_mm"]


def _end_size_problem(f, p) -> tuple[str, object] | None:
    """Why fitting ``f`` does not suit the size of the hose or tube ``p`` it ends, and the size it should be."""
    fam = fitting_families().get(f.get("family"))
    if fam is None or f.get("dash") is None or fam.get("rated_with_hose"):
        return None
    dash, mm = _size_of(p)
    if "sixteenths" in fam["size_basis"] or fam["size_basis"] == "hose dash size":
        return None if f["dash"] == dash else (f"-{dash}", dash)
    if p["kind"] == "tube":
        return None if abs(f["dash"] - mm) <= 0.2 else (f"{mm:g} mm", round(mm))
    lo, over = METRIC_END_WINDOW
    if lo * mm <= f["dash"] <= mm + over:
        return None
    sizes = sorted(r["dash"] for r in fam["sizes"] if r.get("dash") is not None and lo * mm <= r["dash"] <= mm + over)
    if not sizes:
        return f"{lo * mm:.1f}-{mm + over:.1f} mm", None
    words = f"{sizes[0]:g} mm" if len(sizes) == 1 else ", ".join(f"{d:g}" for d in sizes[:-1]) + f" or {sizes[-1]:g} mm"
    return words, sizes[0]


def _size_findings(case: LineCase) -> list:
    """Per fitting that does not suit a hose or tube it ends: ``(place, fitting, part, problem, reducer)``. A
    fitting between two of different sizes is taken as a reducer: it must suit one of them (the fix: the one
    before it)."""
    out = []
    parts = case.user_parts
    for i, f in enumerate(parts):
        if f["kind"] != "fitting":
            continue
        ends = [parts[k] for k in (i - 1, i + 1) if 0 <= k < len(parts) and parts[k]["kind"] in ("hose", "tube")]
        wrong = [(p, b) for p in ends if (b := _end_size_problem(f, p)) is not None]
        if wrong:
            out.append((i, f, *wrong[0], len(ends) == 2 and len(wrong) == 1, ends))
    return out


def _intended_dash(case: LineCase, place: int, fitting):
    """The size a fitting is to have: its own, or the size its end-size fix gives it."""
    for i, _, _, b, reducer, _ in _size_findings(case):
        if i == place and not reducer and b[1] is not None:
            return b[1]
    return fitting.get("dash")


def _size_checks(case: LineCase) -> list:
    out = []
    for i, f, p, b, reducer, ends in _size_findings(case):
        if reducer:
            out.append(check("end size", "ok", f"flagged: {part_ref(f)} joins {part_ref(ends[0])} to "
                                               f"{part_ref(ends[1])}; {part_ref(p)} takes a {b[0]} end, so use a "
                                               "reducing fitting, or this end and a reducer"))
            continue
        c = check("end size", "fail", f"{part_ref(f)} ends {part_ref(p)}, which takes a {b[0]} end: fit the end of "
                                      "the hose's or tube's own size")
        if b[1] is not None:
            c["fix"] = fix(part_path(case, i, "dash"), b[1], label_for("fitting", "dash", f"part {i + 1}"))
        out.append(c)
    return out


def _line_end(case: LineCase, end: str):
    """The user's fitting at the start or end of the line (marked, or the first or last part)."""
    parts = case.user_parts
    mark = "start" if end == "from_port" else "end"
    marked = [i for i, p in enumerate(parts) if p["kind"] == "fitting" and p.get("end") == mark]
    i = marked[0] if marked else (0 if end == "from_port" else len(parts) - 1)
    return (i, parts[i]) if parts[i]["kind"] == "fitting" else (None, None)


def _port_end_checks(case: LineCase) -> list:
    """Each port's line end against the line's own end fitting there: family, and size (the size the fitting
    is to have, where its end-size check fixes it, so the two fixes agree)."""
    out = []
    fams = fitting_families()
    for end, word in (("from_port", "start"), ("to_port", "end")):
        port = case.spec[end]
        if not port or port.get("line_end_family") is None:
            continue
        i, f = _line_end(case, end)
        if f is None or f.get("family") not in fams:
            continue
        label = said(port.get("label")) if port.get("label") else f"the {word} port"
        where = f"the {word} port of line {case.index + 1}"
        if port["line_end_family"] != f["family"]:
            c = check("port end", "fail",
                      f"{label} is set to meet a {fams[port['line_end_family']]['label']} end, but the line's {word} "
                      f"is {part_ref(f)}: set the port's line end to {fams[f['family']]['label']}, or fit the end "
                      "the port is set for")
            c["fix"] = fix(f"lines[{case.index}].{end}.line_end_family", f["family"],
                           label_for(end, "line_end_family", where))
            out.append(c)
            continue
        dash = _intended_dash(case, i, f)
        metric = "mm" in fams[f["family"]]["size_basis"]
        key = "line_end_tube_od_mm" if metric else "line_end_dash"
        given = port.get(key)
        if given is None or dash is None or abs(given - dash) < 1e-9:
            continue
        size, now = (f"{dash:g} mm", f"{given:g} mm") if metric else (f"-{dash}", f"-{given}")
        c = check("port end", "fail", f"{label} is set to meet a {now} end, but the line's {word} end is to be "
                                      f"{size} ({part_ref(f)}): set the port's line end size to {size}")
        c["fix"] = fix(f"lines[{case.index}].{end}.{key}", dash, label_for(end, key, where))
        out.append(c)
    return out


def _pressure_end_checks(case: LineCase) -> list:
    if case.role != "pressure":
        return []
    return [check("pressure end", "fail", f"{part_ref(p)} must not be used on a pressure line: a clamped barb holds "
                                          "about 10 bar (common practice); use a crimped or reusable pressure fitting")
            for p in case.user_parts if p["kind"] == "fitting" and p.get("family") == "barb-clamp"]


def _sealing_checks(case: LineCase) -> list:
    out = []
    parts = case.user_parts
    for a, b in zip(parts, parts[1:]):
        if a["kind"] == b["kind"] == "fitting" and a.get("family") and b.get("family"):
            why = mating_problem(a["family"], a.get("dash"), b["family"], b.get("dash"))
            if why:
                out.append(check("sealing", "fail", f"{part_ref(a)} and {part_ref(b)} do not seal together: {why}; "
                                                    "use ends of one kind, or an adapter between them"))
    return out


def consistency_checks(case: LineCase) -> list:
    """Whether the line's parts fit together: end sizes, the ports' line ends, barbed ends on a pressure line and
    ends that seal. Each names both parts and the fix."""
    return _size_checks(case) + _port_end_checks(case) + _pressure_end_checks(case) + _sealing_checks(case)


def port_checks(case: LineCase) -> list:
    """The adapter plan at each port that names its line end."""
    out = []
    for end, word in (("from_port", "start"), ("to_port", "end")):
        plan = case.plans[end]
        if plan is None:
            continue
        label = said(case.spec[end].get("label")) if case.spec[end].get("label") else f"the {word} port"
        if not plan["ok"]:
            out.append(check("ports", "fail", f"{label}: {plan['message']}"))
        elif plan["adapters"]:
            out.append(check("ports", "ok", f"{label}: {plan['message']}".strip()))
        else:
            out.append(check("ports", "ok", f"{label}: the line end fits the port directly. {plan['message']}".strip()))
    return out
