"""Adapter plans: the adapters between a port and the hose or tube end chosen for it.

The fitting ends and their threads are data, in ``calc/data/threads.json`` (every row names
its source; recalled values are marked "from memory" and must be checked against the named
standard before anyone relies on them). This module is hand-written: no library we ship to
the browser carries fitting-end rules.

Ports and line ends
-------------------
-------------------------------------------
A port is described by its thread and its seal type (``calc.model.job.SEAL_TYPES``).
A port in a component body is female, except a ``flare-37`` or ``cone-24`` port,
which is a male stub (a 37 deg flare or 24 deg cone nose) and a ``hose-barb``
port, which is a barbed nipple. A ``flare-45`` port is an SAE J512
inverted-flare port (female thread, 45 deg seat inside).

A line end is the end family of the hose or tube fitting the user chose, with
its size: ``dash`` (inch families), ``tube_od_mm`` (24 deg cone) or ``thread``
(metric O-ring studs, washer studs, banjo bolts, pipe threads). Genders of the
line ends: ``jic-37``, ``flare-45-sae``, ``cone-24-l``, ``cone-24-s`` are female
swivel nuts; all others are male (stud, tube nut, banjo bolt, pipe thread);
``barb-clamp`` is a hose pushed over a barb.
"""
from __future__ import annotations

from ..data.tables import end_families, ends, find_thread, fitting_families, port_words, seal_words, size_row
from ..model.job import FITTING_FAMILIES, PART, SEAL_TYPES
from ..model.prepared import Part
from ..model.schema import validate

__all__ = ["BadPlan", "END_FAMILIES", "SEAL_WORDS", "PORT_WORDS", "plan_adapters", "plan_for_port",
           "adapter_parts", "adapter_line_parts", "mating_problem", "LINE_ENDS", "port_adapters", "line_with_adapters"]

#: End families known to the planner: ``{family: {label, standard, gender}}`` (calc/data/threads.json).
END_FAMILIES = end_families()
#: The sealing method of each seal type, in words.
SEAL_WORDS = seal_words()
#: What a port of each seal type is, in words.
PORT_WORDS = port_words()
_MALE_STUB_SEALS = ("flare-37", "cone-24")


class BadPlan(ValueError):
    """A port or line end the planner cannot read; ``str()`` is one line naming the field."""


# -- adapter planning ---------------------------------------------------------
def _mate(a: dict, b: dict) -> bool:
    """Two threads screw together: same diameter (within 0.05 mm) and same pitch."""
    da = a["gauge_major_mm"] if a["tapered"] else a["major_mm"]
    db = b["gauge_major_mm"] if b["tapered"] else b["major_mm"]
    return abs(da - db) < 0.05 and abs(a["pitch_mm"] - b["pitch_mm"]) < 0.001 and a["form"] == b["form"]


def _seal_class(seal: str) -> str:
    return "oring" if seal in ("oring-boss", "metric-oring") else seal


def _port_gender(seal: str) -> str:
    if seal in _MALE_STUB_SEALS:
        return "male"
    if seal == "hose-barb":
        return "barb"
    return "female"


def _port_end_rows(thread: dict, seal: str) -> list[dict]:
    """End rows that could form the port side of an adapter: this thread, the port's seal,
    the gender that mates with the port, and not a banjo bolt."""
    want = "female" if _port_gender(seal) == "male" else "male"
    return [e for e in thread["ends"] if _seal_class(e["seal"]) == _seal_class(seal)
            and e["family"] != "banjo" and END_FAMILIES[e["family"]]["gender"] == want]


def _resolve_end(line_end: dict) -> dict:
    if not isinstance(line_end, dict):
        raise BadPlan("line_end: must be an object with 'family' and a size")
    fam = line_end.get("family")
    if fam == "crimp-stem":
        raise BadPlan("line_end.family: 'crimp-stem' is the hose side of a fitting; give the end that meets the "
                   "port (jic-37, orb, cone-24-l, ...)")
    if fam not in END_FAMILIES:
        raise BadPlan(f"line_end.family: must be one of {', '.join(map(repr, END_FAMILIES))}, got {fam!r}")
    rows = [e for e in ends() if e["family"] == fam]
    if line_end.get("thread") is not None:
        t = find_thread(line_end["thread"])
        if t is None:
            raise BadPlan(f"line_end.thread: {line_end['thread']!r} is not in the thread tables")
        pick = [e for e in rows if e["thread"] == t["designation"]]
        what = f"thread {t['designation']}"
    elif line_end.get("dash") is not None:
        pick = [e for e in rows if e["dash"] == line_end["dash"]]
        what = f"dash -{line_end['dash']}"
    elif line_end.get("tube_od_mm") is not None:
        pick = [e for e in rows if e["tube_od_mm"] is not None
                and abs(e["tube_od_mm"] - float(line_end["tube_od_mm"])) < 0.05]
        what = f"tube OD {line_end['tube_od_mm']:g} mm"
    else:
        raise BadPlan("line_end: give its size: 'dash', 'tube_od_mm' or 'thread'")
    if not pick:
        sizes = ", ".join(e["size"] for e in rows)
        raise BadPlan(f"line_end: no {fam} end with {what} in the tables (sizes: {sizes})")
    return pick[0]


_REASONS = {
    frozenset(("flare-37", "flare-45")):
        "a 45 deg flare on a 37 deg seat (or the reverse) touches on a thin ring instead of the cone face and "
        "leaks; the two families share threads in several sizes, so they screw together without sealing",
    frozenset(("oring", "pipe-taper")):
        "a tapered pipe thread in a straight O-ring port wedges on its flanks before anything squeezes the "
        "O-ring, so it leaks and can split the port",
    frozenset(("crush-washer", "pipe-taper")):
        "a tapered pipe thread in a straight port wedges on its flanks before it reaches the washer face, so "
        "the washer is never squeezed",
    frozenset(("oring", "flare-45")):
        "an inverted-flare tube nut has no seat in an O-ring port, and an O-ring stud has no 45 deg nose for "
        "an inverted-flare seat",
}


def _end_text(e: dict) -> str:
    label, std = END_FAMILIES[e["family"]]["label"], END_FAMILIES[e["family"]]["standard"]
    return f"{label} {e['size']} ({std})"


def _refuse(msg: str) -> dict:
    return {"ok": False, "adapters": [], "message": msg}


def plan_adapters(port: dict, line_end: dict) -> dict:
    """The adapters needed between a port and a chosen hose or tube end.

    Parameters
    ----------
    port : dict
        ``{"thread": designation, "seal": one of calc.SEAL_TYPES}``
        (``label`` and other keys are ignored). A ``hose-barb`` port needs no
        thread.
    line_end : dict
        ``{"family": one of END_FAMILIES, and one of "dash" (inch families and
        barbs), "tube_od_mm" (24 deg cone, inverted flare), "thread" (metric
        studs, banjo bolts, pipe threads)}``.

    Returns
    -------
    dict
        ``ok`` (bool): the joint can be made to seal; ``adapters``: list (empty
        when the end fits the port directly), each ``{"name", "from": {thread,
        seal, gender}, "to": {family, size, thread, seal, gender},
        "working_bar", "bore_mm", "family", "dash", "source"}`` where
        ``working_bar`` is the lower of the two ends' ratings (``None`` when the
        table has none) and ``bore_mm`` the smaller of their typical bores;
        ``message``: a sentence, saying why when ``ok`` is False.

    Notes
    -----
    Hand-written rules: straight threads seal with an O-ring, a washer, a
    flare or a cone, never on their flanks; tapered threads seal on their
    flanks with sealant; two ends that screw together seal only if their
    sealing faces are of the same kind. Ratings and bores are typical values
    (from memory or common practice, see each end row's ``rating_source``);
    the maker's data govern.

    Examples
    --------
    A -6 37 deg flare hose end on an ISO 6149 M16x1.5 port needs one adapter, rated as its weaker end, the
    stud's 250 bar (ISO 6149-2, from memory):

    >>> p = plan_adapters({"thread": "M16x1.5", "seal": "metric-oring"}, {"family": "jic-37", "dash": 6})
    >>> p["ok"], [a["name"] for a in p["adapters"]], p["adapters"][0]["working_bar"]
    (True, ['M16x1.5 metric O-ring stud (ISO 6149) male to 37 deg flare -6 (SAE J514) male'], 250.0)

    A 3/8 in inverted-flare tube nut fits a 5/8-18 inverted-flare port directly:

    >>> plan_adapters({"thread": "5/8-18 UNF", "seal": "flare-45"}, {"family": "inverted-flare-45", "dash": 6})["adapters"]
    []

    A tapered thread cannot make an O-ring port:

    >>> plan_adapters({"thread": "1/4 NPT", "seal": "oring-boss"}, {"family": "orb", "dash": 4})["ok"]
    False
    """
    try:
        return _plan(port, line_end)
    except BadPlan as exc:
        return _refuse(str(exc))


def _plan(port: dict, line_end: dict) -> dict:
    if not isinstance(port, dict):
        raise BadPlan("port: must be an object with 'thread' and 'seal'")
    seal = port.get("seal")
    if seal not in SEAL_TYPES:
        raise BadPlan(f"port.seal: must be one of {', '.join(map(repr, SEAL_TYPES))}, got {seal!r}")
    if seal == "unknown":
        raise BadPlan("port.seal: the port's seal is not known; look for an O-ring spot face, a flare or cone "
                      "seat, a washer face or a tapered thread before planning the end")
    end = _resolve_end(line_end)
    efam = end["family"]
    egender = END_FAMILIES[efam]["gender"]

    if seal == "hose-barb":
        if efam == "barb-clamp":
            return {"ok": True, "adapters": [], "message": f"The hose {end['size']} pushes onto the barbed "
                    "nipple and is clamped; check that the barb suits the hose bore. Barbs are for low-pressure "
                    "return and feed lines only."}
        return _refuse(f"The port is a barbed nipple: only a clamped low-pressure hose fits it, not a "
                       f"{_end_text(end)}; replace the nipple with a threaded port fitting.")

    th = find_thread(port.get("thread")) if port.get("thread") is not None else None
    if th is None:
        raise BadPlan(f"port.thread: {port.get('thread')!r} is not in the thread tables "
                   "(identify it with the thread finder)")
    t = th["designation"]
    # the port itself must be able to seal
    if th["tapered"] and seal != "pipe-taper":
        return _refuse(f"A tapered pipe thread ({t}) cannot make a {SEAL_WORDS[seal]} port: an O-ring, washer, "
                       "flare or cone port has a straight thread, and a taper seals on its flanks with sealant. "
                       "Check the port: if the thread is tapered, its seal is 'pipe-taper'.")
    if not th["tapered"] and seal == "pipe-taper":
        if th["family"] == "BSPP":
            return _refuse(f"A parallel BSPP thread ({t}) does not seal on its flanks: it needs a bonded or "
                           "crush washer on the face, or an O-ring; choose 'crush-washer' or 'oring-boss'.")
        return _refuse(f"A straight {t} thread does not seal on its flanks; a port in this thread seals with an "
                       "O-ring, a washer, a flare or a cone.")
    if th["family"] == "BSPP" and seal not in ("crush-washer", "oring-boss", "metric-oring"):
        return _refuse(f"A BSPP port ({t}) seals only with a bonded or crush washer or an O-ring, not with a "
                       f"{SEAL_WORDS[seal]}.")
    pgender = _port_gender(seal)
    prow = _port_end_rows(th, seal)

    if efam == "barb-clamp":
        return _one_adapter(th, seal, pgender, prow, end,
                            note=" Barbs are for low-pressure return and feed lines only.")

    eth = find_thread(end["thread"])
    mates = _mate(th, eth)
    complementary = {pgender, egender} == {"male", "female"}
    if mates and complementary:
        ps, es = _seal_class(seal), _seal_class(end["seal"])
        if ps == es:
            extra = " Use thread sealant on the taper." if ps == "pipe-taper" else ""
            same = sorted({e["size"] for e in th["ends"] if _seal_class(e["seal"]) == ps
                           and e["family"] != "banjo" and e["family"] != efam
                           and END_FAMILIES[e["family"]]["gender"] == egender})
            if same:
                extra += (f" The {t} thread is also used by {', '.join(same)} of another series or family "
                          f"with the same seal: check that the port is {end['size']}.")
            return {"ok": True, "adapters": [],
                    "message": f"The {_end_text(end)} fits the {t} {PORT_WORDS[seal]} directly.{extra}"}
        reason = _REASONS.get(frozenset((ps, es)),
                              f"the sealing methods differ (port: {SEAL_WORDS[seal]}; line end: "
                              f"{SEAL_WORDS[end['seal']]}) and no standard pairs them")
        return _refuse(f"The {_end_text(end)} would screw onto the {t} {PORT_WORDS[seal]} but would not seal: {reason}. "
                       f"Use an end of the port's own kind, or an adapter from the port to this end.")
    return _one_adapter(th, seal, pgender, prow, end)


def _one_adapter(th: dict, seal: str, pgender: str, prow: list, end: dict, note: str = "") -> dict:
    efam = end["family"]
    elabel, estd, egender = (END_FAMILIES[efam][k] for k in ("label", "standard", "gender"))
    t = th["designation"]
    from_gender = "male" if pgender == "female" else "female"
    to_gender = {"female": "male", "male": "female", "hose": "barb"}[egender]
    if prow:
        fam = END_FAMILIES[prow[0]['family']]
        pname = f"{fam['label']} ({fam['standard']})"
    else:
        pname = f"{SEAL_WORDS[seal]} stud" if from_gender == "male" else f"{SEAL_WORDS[seal]} socket"
    name = f"{t} {pname} {from_gender} to {elabel} {end['size']} ({estd}) {to_gender}"
    ratings = [e["working_bar"] for e in prow if e["working_bar"] is not None]
    bores = [e["bore_mm"] for e in prow if e["bore_mm"] is not None]
    bore = min(bores + [end["bore_mm"]])
    if ratings and end["working_bar"] is not None:
        working = min(ratings + [end["working_bar"]])
        weak = end if end["working_bar"] <= min(ratings) else min(prow, key=lambda e: e["working_bar"])
        family, dash = weak["family"], weak["dash"]
    else:
        # the port-side end has no rating in the tables: do not guess, and do not let a
        # family table stand in for it
        working, family, dash = None, None, None
    sources = sorted({e["rating_source"] for e in prow + [end]})
    adapter = {
        "name": name,
        "from": {"thread": t, "seal": seal, "gender": from_gender},
        "to": {"family": efam, "size": end["size"], "thread": end["thread"], "seal": end["seal"],
               "gender": to_gender},
        "working_bar": working, "bore_mm": bore,
        "family": family, "dash": dash,
        "source": "; ".join(sources),
    }
    msg = f"One adapter: {name}."
    if working is None:
        msg += (f" The tables hold no rating for the port-side end ({SEAL_WORDS[seal]}, {t}): take the "
                "adapter's working pressure from the maker's data.")
    else:
        msg += f" Rated about {working:g} bar (typical, check the maker's data)."
    if len({e['family'] for e in prow}) > 1:
        msg += " More than one end family uses this port thread; the lower rating and smaller bore are used."
    return {"ok": True, "adapters": [adapter], "message": msg + note}


def plan_for_port(port: dict) -> dict | None:
    """Plan the adapters for a job-model port record (``calc.model.job.PORT``).

    Parameters
    ----------
    port : dict
        A normalised port record: ``thread``, ``seal``, ``line_end_family`` and
        one of ``line_end_dash``, ``line_end_tube_od_mm``, ``line_end_thread``.

    Returns
    -------
    dict or None
        The :func:`plan_adapters` result, or ``None`` when the record names no
        line end (nothing to plan).

    Examples
    --------
    >>> plan_for_port({"label": "gear inlet", "thread": "M16x1.5", "seal": "metric-oring",
    ...                "line_end_family": "metric-oring-port", "line_end_dash": None,
    ...                "line_end_tube_od_mm": None, "line_end_thread": "M16x1.5"})["adapters"]
    []
    """
    if not port or port.get("line_end_family") is None:
        return None
    end = {"family": port["line_end_family"], "dash": port.get("line_end_dash"),
           "tube_od_mm": port.get("line_end_tube_od_mm"), "thread": port.get("line_end_thread")}
    return plan_adapters({"thread": port.get("thread"), "seal": port.get("seal")}, end)


def adapter_parts(plan: dict) -> list[dict]:
    """The adapters of a plan as job-model ``fitting`` parts.

    Parameters
    ----------
    plan : dict
        A result of :func:`plan_adapters` with ``ok`` true.

    Returns
    -------
    list of dict
        ``{"kind": "fitting", "bore_mm", "shape": "straight", "working_bar"
        (when known), "family" and "dash" (when the family is one of
        calc.FITTING_FAMILIES)}`` per adapter, in the order of the plan.

    Raises
    ------
    ValueError
        The plan was refused (its message is the error).

    Examples
    --------
    >>> plan = plan_adapters({"thread": "3/4-16 UNF", "seal": "oring-boss"}, {"family": "jic-37", "dash": 6})
    >>> adapter_parts(plan)
    [{'kind': 'fitting', 'bore_mm': 7.1, 'shape': 'straight', 'working_bar': 310.3, 'family': 'jic-37', 'dash': 6}]
    """
    if not plan.get("ok"):
        raise ValueError(plan.get("message", "the adapter plan was refused"))
    parts = []
    for a in plan["adapters"]:
        p = {"kind": "fitting", "bore_mm": a["bore_mm"], "shape": "straight"}
        if a["working_bar"] is not None:
            p["working_bar"] = a["working_bar"]
        if a["family"] in FITTING_FAMILIES:
            p["family"] = a["family"]
            if a["dash"] is not None:
                p["dash"] = a["dash"]
        parts.append(p)
    return parts


def adapter_line_parts(plan: dict, label: str) -> list:
    """The adapters of an accepted plan as prepared line parts, named for the port ``label``.

    Each is a validated fitting part (``calc.model.job.PART``) with no place in the user's list.
    """
    out = []
    for a, raw in zip(plan["adapters"], adapter_parts(plan)):
        norm, problems, _ = validate(PART, raw)
        if problems:  # pragma: no cover - adapter_parts emits valid parts (tested in tests/system)
            continue
        out.append(Part(norm, None, adapter=f"{label}: {a['name']}"))
    return out


def _family_seal(family: str, dash) -> str | None:
    fam = fitting_families().get(family)
    if fam is None:
        return None
    row = size_row(fam["sizes"], dash) if dash is not None else None
    seals = {r["seal"] for r in ([row] if row else fam["sizes"]) if r.get("seal")}
    return _seal_class(seals.pop()) if len(seals) == 1 else None


def mating_problem(family_a: str, dash_a, family_b: str, dash_b) -> str | None:
    """Why two fittings of these families, joined end to end, would not seal; None when nothing is known
    against them. Hand-written rule: sealing faces of different kinds never seal (the same pairs the
    adapter planner refuses).

    Examples
    --------
    >>> mating_problem("jic-37", 6, "flare-45-sae", 6).startswith("a 45 deg flare on a 37 deg seat")
    True
    >>> mating_problem("jic-37", 6, "jic-37", 6) is None
    True
    """
    a, b = _family_seal(family_a, dash_a), _family_seal(family_b, dash_b)
    if a is None or b is None or a == b:
        return None
    return _REASONS.get(frozenset((a, b)))



#: The two ends of a line, in its flow order.
LINE_ENDS = ("from_port", "to_port")


def port_adapters(spec, where: dict) -> tuple[dict, tuple, tuple]:
    """Plan the adapters at both ports of a line.

    Parameters
    ----------
    spec : mapping
        The line (``calc.model.job.LINE``): its ``from_port`` and ``to_port``.
    where : dict
        ``{"from_port": words, "to_port": words}``: each end in words ("pump end"), naming its adapters.

    Returns
    -------
    plans, start, end
        ``{"from_port": plan or None, "to_port": plan or None}`` (``plan_for_port``), and the adapters of
        each accepted plan as prepared parts, for the start and for the end of the line.
    """
    plans, added = {}, {}
    for end in LINE_ENDS:
        plan = plan_for_port(spec[end])
        plans[end] = plan
        added[end] = tuple(adapter_line_parts(plan, where[end])) if plan and plan["ok"] else ()
    return plans, added["from_port"], added["to_port"]


def line_with_adapters(spec, parts, where: dict) -> tuple[dict, tuple]:
    """The port plans of a line (``port_adapters``) and its parts in flow order with their adapters: the
    start port's before the user's ``parts``, the end port's after them."""
    plans, start, end = port_adapters(spec, where)
    return plans, start + tuple(parts) + end
