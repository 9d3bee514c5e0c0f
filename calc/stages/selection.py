"""Selection stage: every tabulated hose class and dash size, as a whole assembly, for each line.

For each candidate the line is rebuilt as the user would build it (``calc.system.resize``): every
hose swapped for the candidate class and size, its datasheet overrides dropped, its own end
fittings re-sized in their family, and a port's line-end size moved with an end fitting it followed.
The ports are planned again, the assembly worked out again, every operating point solved again with
that line in the circuit (the same physics as the circuit stage), and the line judged by the same
checks as the line as built (``calc.checks.line.judge_line``). So a candidate's verdict and failed
checks are exactly those its line gets once its ``apply`` edits are made.

Work is shared: candidates whose compiled lines are equal (``calc.system.line.signature``: same
bores, lengths and bends) share one solution of the operating points.
"""
from __future__ import annotations

from dataclasses import dataclass

from ..checks.line import hydraulics_pass, judge_line
from ..data.frozen import thaw
from ..data.practice import VELOCITY_BANDS_M_S
from ..data.tables import hose_classes
from ..model.prepared import changed_part
from ..model.result import worst_verdict
from ..system.adapters import port_adapters
from ..system.assembly import assembly_of
from ..system.line import compile_line_memo, signature
from ..system.resize import resized_line

__all__ = ["SelectionSection", "selection_stage", "line_candidates"]

_ORDER = {"ok": 0, "caution": 1, "fail": 2}


@dataclass(frozen=True)
class SelectionSection:
    """Per line: ``candidates`` (the result's ``lines[].candidates``)."""

    candidates: tuple


@dataclass(frozen=True)
class _Line:
    """What stays the same over one line's candidates."""

    index: int
    raw: dict          # the line as the user wrote it (plain data)
    spec: object       # the line's fields, defaults filled
    old_bores: dict    # place of each hose -> its bore now, mm
    where: dict        # each end in words
    last_feed: bool
    hoses: tuple       # (class, dash) of each hose now
    parts: tuple       # the user's parts, prepared


def _edited_spec(spec, port_edits) -> dict:
    out = dict(spec)
    for end, key, value in port_edits:
        out[end] = dict(out[end], **{key: value})
    return out


def _given(value):
    """``value`` without the keys the user set to null (null means not given: an edit never writes one)."""
    if isinstance(value, dict):
        return {k: _given(v) for k, v in value.items() if v is not None}
    return [_given(v) for v in value] if isinstance(value, list) else value


def _edits(line: _Line, raw_parts: list, port_edits) -> list:
    j = line.index
    parts = _given(raw_parts)
    out = [] if parts == _given(line.raw["parts"]) else [{"path": f"lines[{j}].parts", "value": parts}]
    return out + [{"path": f"lines[{j}].{end}.{key}", "value": value} for end, key, value in port_edits]


def _solved(job, circuit, j: int, parts, cache: dict):
    segs = compile_line_memo(parts, cache.setdefault("segments", {}))
    key = ("solved", signature(segs))
    if key not in cache:
        trial = circuit.with_line(j, parts, segs)
        cache[key] = tuple(trial.operating_point(c, detail=j) for c in job.conditions)
    return cache[key]


def _prepared(line: _Line, raw_parts: list, cache: dict):
    """The candidate's parts prepared: the user's own where unchanged, the changed ones once per content
    (``calc.model.prepared.changed_part``)."""
    out, problems = list(line.parts), []
    for k, (new, old) in enumerate(zip(raw_parts, line.raw["parts"])):
        if new == old:
            continue
        changes = {key: new.get(key) for key in old.keys() | new.keys() if new.get(key) != old.get(key)}
        key = (k, tuple(sorted(changes.items())))
        hit = cache.get(key)
        if hit is None:
            hit = cache[key] = changed_part(line.parts[k], changes, line.index)
        out[k] = hit[0]
        problems.extend(hit[1])
    return tuple(out), problems


def _planned(line: _Line, spec, user_parts, port_edits, cache: dict):
    """Port plans by the ports' edits (the candidates of one size share them), and the parts as built."""
    key = ("plans", tuple(port_edits))
    hit = cache.get(key)
    if hit is None:
        hit = cache[key] = port_adapters(spec, line.where)
    plans, start, end = hit
    return plans, start + tuple(user_parts) + end


@dataclass(frozen=True)
class _Built:
    """One candidate assembly of a line, built and solved: what its judging and its edits read."""

    raw_parts: list
    port_edits: list
    spec: dict
    user_parts: tuple
    plans: dict
    assembly: object
    solved: tuple


def _build(job, circuit, line: _Line, cls: dict, row: dict, cache: dict) -> _Built | None:
    key = ("built", cls["class"], row["dash"])
    if key not in cache:
        cache[key] = _built(job, circuit, line, cls, row, cache)
    return cache[key]


def _built(job, circuit, line: _Line, cls: dict, row: dict, cache: dict) -> _Built | None:
    raw_parts, port_edits = resized_line(line.raw, line.old_bores, cls["class"], row)
    user_parts, problems = _prepared(line, raw_parts, cache)
    if problems:  # pragma: no cover - the resized parts are the user's valid parts with table sizes
        return None
    spec = _edited_spec(line.spec, port_edits)
    plans, built = _planned(line, spec, user_parts, port_edits, cache)
    asm = assembly_of(spec, built, job.ratings)
    solved = _solved(job, circuit, line.index, asm.parts, cache)
    return _Built(raw_parts, port_edits, spec, user_parts, plans, asm, solved)


def _candidate(job, circuit, line: _Line, cls: dict, row: dict, cache: dict) -> dict | None:
    key = ("candidate", cls["class"], row["dash"])
    if key not in cache:
        cache[key] = _judged(job, circuit, line, cls, row, cache)
    return cache[key]


def _judged(job, circuit, line: _Line, cls: dict, row: dict, cache: dict) -> dict | None:
    j = line.index
    b = _build(job, circuit, line, cls, row, cache)
    if b is None:  # pragma: no cover - see _build
        return None
    case, checks = judge_line(job, j, b.spec, b.user_parts, b.plans, b.assembly, b.solved, line.last_feed,
                              cache.setdefault("ratings", {}))
    hose_rows = [r for res in case.results for r in res.get("parts", ()) if r["kind"] == "hose"]
    verdict = worst_verdict(checks)
    worst = max(range(len(b.solved)), key=lambda i: case.results[i]["pressure_drop_bar"])
    return {"class": cls["class"], "dash": row["dash"], "bore_mm": row["bore_mm"], "verdict": verdict,
            "failed": [c["check"] for c in checks if c["verdict"] == "fail"],
            "cautions": sum(c["verdict"] == "caution" for c in checks),
            "cautioned": sorted({c["check"] for c in checks if c["verdict"] == "caution"}),
            "reasons": [c["message"] for c in checks if c["verdict"] == "fail"]
            or [c["message"] for c in checks if c["verdict"] == "caution"],
            "velocity_max_m_s": max((r["velocity_m_s"] for r in hose_rows), default=0.0),
            "pressure_drop_bar": case.results[worst]["pressure_drop_bar"], "pressure_drop_at": b.solved[worst]["name"],
            "working_bar": case.rating["working_bar"], "hose_working_bar": row["working_bar"],
            "min_bend_radius_mm": row["min_bend_radius_mm"], "light_rank": cls["light_rank"],
            "source": row["source"], "current": all(h == (cls["class"], row["dash"]) for h in line.hoses),
            "note": None, "label": f"{cls['class']} -{row['dash']} on line {j + 1}",
            "apply": _edits(line, b.raw_parts, b.port_edits)}


def _note_oversized(cands: list, role: str) -> None:
    """A passing candidate slower than the band's floor is noted as larger than needed when a smaller size of
    its class passes too; the smallest that passes never is. The note does not change its verdict."""
    lo, hi = VELOCITY_BANDS_M_S[role]
    for c in cands:
        if c["verdict"] == "fail" or c["velocity_max_m_s"] >= lo:
            continue
        smaller = [o for o in cands if o["class"] == c["class"] and o["verdict"] == "ok" and o["bore_mm"] < c["bore_mm"]]
        if smaller:
            c["note"] = (f"larger than needed: {c['velocity_max_m_s']:.2f} m/s is below the {lo:g}-{hi:g} m/s band, "
                         f"and -{max(smaller, key=lambda o: o['bore_mm'])['dash']} passes too")


#: At most this many sizes of a class from the hydraulic threshold up: when they all fail, the class fails for
#: a reason a larger size does not cure (its rating, its bend radius), and the larger sizes are not listed.
SIZES_TRIED = 2


def _threshold_bore(job, circuit, line: _Line, cache: dict) -> float | None:
    """The smallest tabulated bore at which the line passes its hydraulic checks (velocity, drop budget, pump
    inlet; larger bores never worsen them, bar bore-change losses), or None when even the largest fails.
    Searched from the bore the line has now (the answer is usually next to it): down one bore at a time while
    they pass; or, when it fails, the largest bore, and if that passes, by bisection between the two."""
    rows = {}
    for cls in hose_classes().values():
        for row in cls["sizes"]:
            rows.setdefault(row["bore_mm"], (cls, row))
    bores = sorted(rows)

    def passes(i: int) -> bool:
        b = _build(job, circuit, line, *rows[bores[i]], cache)
        return b is not None and hydraulics_pass(job, line.index, b.spec, b.user_parts, b.plans, b.assembly,
                                                 b.solved, line.last_feed)
    now = min(line.old_bores.values())
    i = min(range(len(bores)), key=lambda k: abs(bores[k] - now))
    if passes(i):
        while i > 0 and passes(i - 1):
            i -= 1
        return bores[i]
    lo, hi = i, len(bores) - 1  # bores[lo] fails: if the largest passes, bisect between them
    if lo == hi or not passes(hi):
        return None
    while hi - lo > 1:
        mid = (lo + hi) // 2
        lo, hi = (lo, mid) if passes(mid) else (mid, hi)
    return bores[hi]


def _may_hold(job, line: _Line, cls: dict) -> bool:
    """Whether any size of the class is rated for what a pressure line must hold (the relief setting plus the
    surge allowance): a class that is not fails the pressure check at every size and is not listed, unless
    the line has it already. Return and feed lines, whose pressure depends on the hose, list every class."""
    if job.lines[line.index].role != "pressure" or any(h[0] == cls["class"] for h in line.hoses):
        return True
    need = job.pump["relief_bar"] * (1.0 + job.ratings["surge_percent"] / 100.0)
    return any(r["working_bar"] is None or r["working_bar"] >= need for r in cls["sizes"])


def _class_candidates(job, circuit, line: _Line, cls: dict, start_bore: float | None, cache: dict) -> list:
    """One class's candidates: its sizes from the line's hydraulic threshold up, until one passes and at most
    ``SIZES_TRIED`` of them (when they all fail, the class fails for a reason a larger size does not cure);
    none when no size of the class is that large. The line's own size always."""
    rows = sorted(cls["sizes"], key=lambda r: r["bore_mm"])
    first = next((i for i, r in enumerate(rows) if start_bore is not None and r["bore_mm"] >= start_bore),
                 len(rows))  # none large enough: only the line's own size
    out, passed = [], False
    for i, row in enumerate(rows):
        current = all(h == (cls["class"], row["dash"]) for h in line.hoses)
        if not ((first <= i < first + SIZES_TRIED and not passed) or current):
            continue
        c = _candidate(job, circuit, line, cls, row, cache)
        if c is None:  # pragma: no cover - see _build
            continue
        out.append(c)
        passed = passed or (i >= first and c["verdict"] != "fail")
    return out


def _size_below(job, circuit, line: _Line, start_bore: float | None, cache: dict) -> list:
    """Why not smaller: the tabulated size just under the hydraulic threshold, in the line's own class where it
    has that size (else the first class that does). Its hydraulics fail whatever the class."""
    below = [r["bore_mm"] for c in hose_classes().values() for r in c["sizes"]
             if start_bore is not None and r["bore_mm"] < start_bore]
    if not below:
        return []
    bore = max(below)
    own = [c for c in hose_classes().values() if any(c["class"] == h[0] for h in line.hoses)]
    for cls in own + list(hose_classes().values()):
        row = next((r for r in cls["sizes"] if r["bore_mm"] == bore), None)
        if row is not None:
            c = _candidate(job, circuit, line, cls, row, cache)
            return [c] if c is not None else []
    return []  # pragma: no cover - the bore came from the tables


def _largest(job, circuit, line: _Line, cache: dict) -> list:
    """When no tabulated size passes the line's hydraulics: the largest size, which fails them too, to show that
    the cure is not the hose (see the line's own checks)."""
    rows = [(r["bore_mm"], c, r) for c in hose_classes().values() for r in c["sizes"]]
    _, cls, row = max(rows, key=lambda x: x[0])
    c = _candidate(job, circuit, line, cls, row, cache)
    return [c] if c is not None else []


def line_candidates(job, circuit, line: _Line, solved_now=None) -> list:
    """Hose candidates for one line, as whole assemblies: each tabulated hose class at its smallest size that
    passes.

    Parameters
    ----------
    solved_now : (segments, operating points), optional
        The line as built and the operating points already solved with it: a candidate whose hydraulics
        are the same shares them.

    Returns
    -------
    list of dict
        The result's ``lines[].candidates``: passing candidates first (ok, then caution), fewest failed
        and caution checks, smallest bore, lightest construction (``light_rank``); then the rejected ones,
        fewest failed checks first. On a pressure line, classes rated under what it must hold are left out
        (``_may_hold``). Per class (``_class_candidates``): its sizes from the smallest bore at
        which the line's hydraulics pass, up to the first that passes (at most ``SIZES_TRIED``); the line's
        own size always; and once for the line, the size just under that bore (``_size_below``), or, when
        no size passes the hydraulics, the largest size (``_largest``). Empty for a line without hose.
    """
    if not line.hoses:
        return []
    cache: dict = {}
    if solved_now is not None:
        cache[("solved", signature(solved_now[0]))] = tuple(solved_now[1])
    start = _threshold_bore(job, circuit, line, cache)
    out = [c for cls in hose_classes().values() if cls["sizes"] and _may_hold(job, line, cls)
           for c in _class_candidates(job, circuit, line, cls, start, cache)]
    seen = {(c["class"], c["dash"]) for c in out}
    extra = _size_below(job, circuit, line, start, cache) if start is not None else _largest(job, circuit, line, cache)
    out += [c for c in extra if (c["class"], c["dash"]) not in seen]
    _note_oversized(out, job.lines[line.index].role)
    out.sort(key=lambda c: (_ORDER[c["verdict"]], len(c["failed"]), c["cautions"], c["bore_mm"], c["light_rank"],
                            c["class"]))
    return out


def _lines(job, ports, feed) -> list[_Line]:
    out = []
    for ln, where in zip(job.lines, ports.where):
        hoses = [p for p in ln.parts if p["kind"] == "hose"]
        out.append(_Line(ln.index, thaw(job.raw["lines"][ln.index]), ln.spec,
                         {p.place: p["bore_mm"] for p in hoses}, where, ln.index == feed,
                         tuple((p.get("class"), p.get("dash")) for p in hoses), ln.parts))
    return out


def selection_stage(job, ports, circuit, feed: int | None) -> SelectionSection:
    """Hose candidates for every line.

    Parameters
    ----------
    job : calc.model.prepared.PreparedJob
    ports : calc.stages.ports.PortsSection
        How each line's ends are named.
    circuit : calc.stages.circuit.CircuitSection
        The circuit, re-solved with each candidate in place of its line.
    feed : int or None
        The last feed line (``calc.stages.lines.last_feed_line``).
    """
    model = circuit.model
    return SelectionSection(tuple(line_candidates(job, model, line, (model.lines[line.index].segs, circuit.conditions))
                                  for line in _lines(job, ports, feed)))
