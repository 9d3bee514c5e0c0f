"""Pressure and temperature ratings, routing checks and hose selection per line.

Two stages of ``calc.engine.evaluate`` call this module:

* ``prepare(job)`` on the validated job, before the circuit is compiled: a
  hose part that names a class and dash size gets its bore and ratings from
  the part tables (the user's own figures win); an unknown class or a size the
  class lacks is a problem naming the field;
* ``assess(circuit, conditions, lines, job)`` after the operating points are
  solved: per line the rating of every part and of the assembly (the weakest
  part's), the checks (pressure, burst margin, temperature, bend radius, hose
  length change and slack, cut length, route) and the ranked hose candidates.

Methods
-------
* hose: maximum working pressure and minimum burst from the class table
  (SAE J517, EN 853; from memory) or the maker's datasheet; SAE J517 rates
  hose at a quarter of its minimum burst, so a burst below ``design factor x
  working`` lowers the usable working pressure to ``burst / design factor``;
* rigid tube: burst by Barlow with the outside diameter, ``P = 2 S t / D``,
  and by Lame's thick-wall hoop stress at the bore, ``P = S (D^2 - d^2) /
  (D^2 + d^2)``; Barlow with the outside diameter is never higher than Lame,
  so it is the burst used (conservative); working = burst / tube design factor;
* fittings: working pressure per family and size from the table or the maker;
  a crimp stem is rated with its hose;
* temperature derating: linear interpolation in the table's
  ``[temperature, factor]`` pairs where the data gives one (only 6061-T6 tube);
* candidates: every class and dash size in the hose tables, with the line's
  hose parts swapped for the candidate and the line recomputed by
  ``calc.hydraulics.line_flow`` at each operating point's own flow and fluid
  state (the same physics as the circuit, not an approximation).

References
----------
.. [1] SAE J517, Hydraulic Hose (from memory of its tables).
.. [2] EN 853, Rubber hoses and hose assemblies - Wire braid reinforced
   hydraulic type (from memory of its tables).
.. [3] Young, W. C., Budynas, R. G. Roark's Formulas for Stress and Strain,
   7th ed., McGraw-Hill, 2002: thick-walled cylinder under internal pressure
   (Lame) and the thin-wall hoop stress.
"""
from __future__ import annotations

import json
import math
from importlib import resources

from . import hydraulics as hyd
from .routing import route_geometry
from .schema import Problem

__all__ = ["hose_classes", "find_class", "tube_materials", "fitting_families", "barlow_burst_mpa",
           "lame_burst_mpa", "tube_rating", "derate_factor", "prepare", "part_ratings", "assess",
           "rank_candidates", "TEMP_CAUTION_K"]

BAR_PER_MPA = 10.0
#: Caution band below a temperature limit, K: ageing of rubber and oil roughly doubles per 10 K
#: (common practice, no source).
TEMP_CAUTION_K = 10.0
#: Below this gauge pressure a line's pressure rating is not checked against a required figure, bar
#: (a stated choice: feed and drain lines that stay near atmospheric).
LOW_PRESSURE_BAR = 1.0
#: Relative slack in the design-factor check for the rounding of tabulated bar figures (0.5 %).
_TABLE_ROUNDING = 0.005
_PRESSURE_PARTS = ("hose", "tube", "fitting", "device")
_CACHE: dict = {}


# -- part tables ------------------------------------------------------------------
def _load(name: str) -> dict:
    if name not in _CACHE:
        _CACHE[name] = json.loads((resources.files(__package__) / "data" / name).read_text(encoding="utf-8"))
    return _CACHE[name]


def _key(name: str) -> str:
    return " ".join(str(name).replace("-", " ").casefold().split())


def hose_classes() -> dict:
    """Hose classes from ``data/hoses.json`` by their name (``'SAE 100R2AT'`` ...)."""
    return {c["class"]: c for c in _load("hoses.json")["classes"]}


def find_class(name: str) -> dict | None:
    """The hose class named ``name``, ignoring case, spacing and the standard prefix.

    >>> find_class("100r2at")["class"], find_class("en 853 2sn")["standard"]
    ('SAE 100R2AT', 'EN 853')
    """
    k = _key(name)
    for cname, c in hose_classes().items():
        ck = _key(cname)
        if k == ck or ck.endswith(" " + k) and (ck.startswith("sae ") or ck.startswith("en 853 ")):
            return c
    return None


def tube_materials() -> dict:
    """Tube materials from ``data/tubes.json`` by key (``'steel-low-carbon'`` ...)."""
    return {m["material"]: m for m in _load("tubes.json")["materials"]}


def fitting_families() -> dict:
    """Fitting families from ``data/fittings.json`` by key (``'jic-37'`` ...)."""
    return {f["family"]: f for f in _load("fittings.json")["families"]}


def _seals() -> dict:
    return _load("fittings.json")["seals"]


def _size_row(rows: list, dash) -> dict | None:
    for r in rows:
        if r["dash"] == dash:
            return r
    return None


def _sizes_text(rows: list, metric: bool = False) -> str:
    return ", ".join((f"{r['dash']}" if metric else f"-{r['dash']}") for r in rows)


# -- formulas ---------------------------------------------------------------------
def barlow_burst_mpa(tensile_mpa: float, od_mm: float, wall_mm: float) -> float:
    r"""Burst pressure of a tube by Barlow's formula with the outside diameter.

    .. math::
        P = \frac{2 S t}{D}

    Parameters
    ----------
    tensile_mpa : float
        Minimum tensile strength S of the tube material, [MPa].
    od_mm : float
        Outside diameter D, [mm].
    wall_mm : float
        Wall thickness t, [mm]; 0 < t < D/2.

    Returns
    -------
    p_mpa : float
        Pressure at which the thin-wall hoop stress reaches S, [MPa].

    Notes
    -----
    A thin-wall result (t/D up to about 0.1); with the outside diameter it is
    never higher than Lame's thick-wall value, so it is the conservative one.

    Examples
    --------
    3/8 in x 0.035 in steel tube, S = 310 MPa:

    >>> round(barlow_burst_mpa(310.0, 9.525, 0.889), 2)
    57.87

    References
    ----------
    .. [1] Young, W. C., Budynas, R. G. Roark's Formulas for Stress and
       Strain, 7th ed., 2002, thin-walled pressure vessels.
    """
    return 2.0 * tensile_mpa * wall_mm / od_mm


def lame_burst_mpa(tensile_mpa: float, od_mm: float, wall_mm: float) -> float:
    r"""Pressure at which Lame's hoop stress at the bore reaches the tensile strength.

    .. math::
        P = S \frac{D^2 - d^2}{D^2 + d^2}, \qquad d = D - 2t

    Parameters
    ----------
    tensile_mpa : float
        Minimum tensile strength S, [MPa].
    od_mm : float
        Outside diameter D, [mm].
    wall_mm : float
        Wall thickness t, [mm]; 0 < t < D/2.

    Returns
    -------
    p_mpa : float
        Internal pressure (no external pressure), [MPa].

    Notes
    -----
    Elastic thick-walled cylinder, open ends, any wall ratio. As t/D -> 0 it
    tends to Barlow's ``2 S t / d`` with the inside diameter.

    Examples
    --------
    >>> round(lame_burst_mpa(310.0, 9.525, 0.889), 2)
    63.15

    References
    ----------
    .. [1] Young, W. C., Budynas, R. G. Roark's Formulas for Stress and
       Strain, 7th ed., 2002, thick-walled cylinder, internal pressure.
    """
    d = od_mm - 2.0 * wall_mm
    return tensile_mpa * (od_mm * od_mm - d * d) / (od_mm * od_mm + d * d)


def derate_factor(table, t_c: float) -> float:
    """Factor on a rating at temperature ``t_c`` [C] from ``[[t_c, factor], ...]`` pairs.

    Linear between points, the first factor below the table, the last above
    it; 1.0 when there is no table.

    >>> derate_factor([[24, 1.0], [100, 0.935]], 62.0)
    0.9675
    """
    if not table:
        return 1.0
    pts = sorted((float(a), float(b)) for a, b in table)
    if t_c <= pts[0][0]:
        return pts[0][1]
    for (t0, f0), (t1, f1) in zip(pts, pts[1:]):
        if t_c <= t1:
            return f0 + (f1 - f0) * (t_c - t0) / (t1 - t0)
    return pts[-1][1]


def tube_rating(part: dict, design_factor: float = 4.0, t_c: float = 20.0) -> dict:
    """Burst and working pressure of a rigid tube part.

    Parameters
    ----------
    part : dict
        A validated tube part (od_mm, wall_mm, material, tensile_mpa, max_temp_c).
    design_factor : float
        Burst over working pressure, [-]; 4 is the usual basis (from memory of
        SAE J1065).
    t_c : float
        Temperature for the material's derating table, [C].

    Returns
    -------
    rating : dict
        tensile_mpa (derated), barlow_burst_bar, lame_burst_bar, burst_bar
        (the lower, Barlow), working_bar, max_temp_c, min_bend_radius_mm,
        source.

    Examples
    --------
    >>> r = tube_rating({"od_mm": 9.525, "wall_mm": 0.889, "material": "steel-low-carbon",
    ...                  "tensile_mpa": None, "max_temp_c": None})
    >>> round(r["burst_bar"], 1), round(r["working_bar"], 1)
    (578.7, 144.7)
    """
    mat = tube_materials()[part.get("material") or "steel-low-carbon"]
    user_s = part.get("tensile_mpa")
    s = user_s if user_s is not None else mat["tensile_mpa"]
    s *= derate_factor(mat.get("tensile_derating"), t_c) if user_s is None else 1.0
    od, t = part["od_mm"], part["wall_mm"]
    pb = barlow_burst_mpa(s, od, t) * BAR_PER_MPA
    pl = lame_burst_mpa(s, od, t) * BAR_PER_MPA
    tmax = part.get("max_temp_c")
    return {"tensile_mpa": s, "barlow_burst_bar": pb, "lame_burst_bar": pl, "burst_bar": min(pb, pl),
            "working_bar": min(pb, pl) / design_factor,
            "max_temp_c": tmax if tmax is not None else mat["max_temp_c"],
            "min_bend_radius_mm": mat["bend_radius_x_od"] * od,
            "source": "user" if user_s is not None else mat["source"],
            "bend_source": mat["bend_source"]}


# -- stage: part data ----------------------------------------------------------------
def prepare(job: dict) -> list[Problem]:
    """Fill hose bores and ratings from the part tables; report bad names and sizes.

    Parameters
    ----------
    job : dict
        A job normalised by ``calc.model.validate_job``; changed in place.
        A hose part naming ``class`` and ``dash`` gets ``bore_mm``,
        ``working_bar``, ``burst_bar``, ``min_bend_radius_mm`` and
        ``max_temp_c`` from the table wherever the user left them empty, and
        an internal ``_rating`` record (table row and the source of each
        figure).

    Returns
    -------
    problems : list of Problem
        Unknown hose classes, dash sizes the class lacks, fitting sizes the
        family lacks, each naming its field by path.

    Examples
    --------
    >>> job = {"lines": [{"parts": [{"kind": "hose", "class": "SAE 100R2AT", "dash": 7, "bore_mm": None}]}]}
    >>> [str(p) for p in prepare(job)]
    ['lines[0].parts[0].dash: SAE 100R2AT has no -7; sizes: -4, -5, -6, -8, -10, -12, -16']
    """
    problems: list[Problem] = []
    fams = fitting_families()
    for i, ln in enumerate(job["lines"]):
        for k, p in enumerate(ln["parts"]):
            path = f"lines[{i}].parts[{k}]"
            if p["kind"] == "hose":
                _prepare_hose(p, path, problems)
            elif p["kind"] == "fitting" and p.get("family") and p.get("dash") is not None:
                fam = fams[p["family"]]
                if fam["sizes"] and _size_row(fam["sizes"], p["dash"]) is None:
                    metric = "mm" in fam["size_basis"]
                    size = f"size {p['dash']}" if metric else f"-{p['dash']}"
                    problems.append(Problem(f"{path}.dash", f"{fam['name']} has no {size} in the tables; sizes: "
                                                            f"{_sizes_text(fam['sizes'], metric)} "
                                                            f"({fam['size_basis']}); or give working_bar"))
    return problems


def _prepare_hose(p: dict, path: str, problems: list) -> None:
    src = {f: "user" for f in ("bore_mm", "working_bar", "burst_bar", "min_bend_radius_mm", "max_temp_c")
           if p.get(f) is not None}
    p["_rating"] = {"class": None, "row": None, "sources": src}
    name = p.get("class")
    if name is None:
        return
    cls = find_class(name)
    if cls is None:
        problems.append(Problem(f"{path}.class", f"unknown hose class {name!r}; the tables have: "
                                                 + ", ".join(hose_classes())))
        return
    p["_rating"]["class"] = cls
    if not cls["sizes"]:
        if p.get("bore_mm") is None:
            problems.append(Problem(f"{path}.bore_mm", f"is missing: {cls['class']} has no sizes in the part "
                                                       f"tables ({cls['note']})"))
        return
    dash = p.get("dash")
    if dash is None:
        problems.append(Problem(f"{path}.dash", f"is missing: {cls['class']} is rated per dash size; sizes: "
                                                f"{_sizes_text(cls['sizes'])}"))
        return
    row = _size_row(cls["sizes"], dash)
    if row is None:
        problems.append(Problem(f"{path}.dash", f"{cls['class']} has no -{dash}; sizes: "
                                                f"{_sizes_text(cls['sizes'])}"))
        return
    p["_rating"]["row"] = row
    for f, v in (("bore_mm", row["bore_mm"]), ("working_bar", row["working_bar"]),
                 ("burst_bar", row["burst_bar"]), ("min_bend_radius_mm", row["min_bend_radius_mm"]),
                 ("max_temp_c", cls["temp_max_c"])):
        if p.get(f) is None and v is not None:
            p[f] = float(v)
            src[f] = row["source"]


# -- per-part ratings ------------------------------------------------------------------
def _hose_desc(p: dict) -> str:
    r = p.get("_rating") or {}
    cls = r.get("class")
    if cls is not None and p.get("dash") is not None:
        return f"hose {cls['class']} -{p['dash']}"
    if p.get("class"):
        return f"hose {p['class']} ({p['bore_mm']:g} mm bore)"
    return f"hose {p['bore_mm']:g} mm bore, no class"


def part_ratings(parts: list[dict], rset: dict, t_max_c: float, t_min_c: float) -> list[dict]:
    """Rating of every pressure-bearing part of a line at the line's temperatures.

    Parameters
    ----------
    parts : list of dict
        The line's validated parts after ``prepare``.
    rset : dict
        The job's ``ratings`` settings (design factors).
    t_max_c, t_min_c : float
        Highest and lowest fluid temperature over the operating points, [C];
        ratings are derated at ``t_max_c`` where the data gives a derating.

    Returns
    -------
    ratings : list of dict
        Per part: index, kind, description, working_bar (None when unknown),
        burst_bar, design_factor, max_temp_c, min_temp_c, min_bend_radius_mm,
        source, notes. Reservoir entrance and exit carry no pressure and are
        left out.

    Examples
    --------
    >>> rset = {"hose_design_factor": 4.0, "tube_design_factor": 4.0}
    >>> fit = {"kind": "fitting", "bore_mm": 6.0, "family": "jic-37", "dash": 6, "working_bar": None,
    ...        "max_temp_c": None}
    >>> r = part_ratings([fit], rset, 100.0, -20.0)[0]
    >>> r["working_bar"], r["source"]
    (310.3, 'SAE J514 (from memory)')
    """
    hdf, tdf = rset["hose_design_factor"], rset["tube_design_factor"]
    fams, seals = fitting_families(), _seals()
    out = []
    for i, p in enumerate(parts):
        k = p["kind"]
        if k not in _PRESSURE_PARTS:
            continue
        r = {"index": i, "kind": k, "description": "", "working_bar": None, "burst_bar": None,
             "design_factor": hdf, "max_temp_c": None, "min_temp_c": None, "min_bend_radius_mm": None,
             "source": None, "notes": []}
        if k == "hose":
            info = p.get("_rating") or {"class": None, "sources": {}}
            cls = info["class"]
            r["description"] = _hose_desc(p)
            w, b = p.get("working_bar"), p.get("burst_bar")
            factor = derate_factor(cls.get("temp_derating") if cls else None, t_max_c)
            if w is not None:
                w *= factor
            if b is not None:
                b *= factor
            if w is not None and b is not None and b < hdf * w * (1.0 - _TABLE_ROUNDING):
                r["notes"].append(f"burst {b:.0f} bar is under {hdf:g} x the working {w:.0f} bar: working taken "
                                  f"as burst / {hdf:g} = {b / hdf:.0f} bar (design factor, SAE J517)")
                w = b / hdf
            r.update(working_bar=w, burst_bar=b, max_temp_c=p.get("max_temp_c"),
                     min_temp_c=cls["temp_min_c"] if cls else None,
                     min_bend_radius_mm=p.get("min_bend_radius_mm"),
                     source=info["sources"].get("working_bar"))
        elif k == "tube":
            tr = tube_rating(p, tdf, t_max_c)
            mat = p.get("material") or "steel-low-carbon"
            r.update(description=f"tube {p['od_mm']:g} x {p['wall_mm']:g} mm {mat}", working_bar=tr["working_bar"],
                     burst_bar=tr["burst_bar"], design_factor=tdf, max_temp_c=tr["max_temp_c"],
                     min_bend_radius_mm=tr["min_bend_radius_mm"], source=tr["source"],
                     barlow_burst_bar=tr["barlow_burst_bar"], lame_burst_bar=tr["lame_burst_bar"],
                     tensile_mpa=tr["tensile_mpa"])
            r["notes"].append(f"burst by Barlow with the outside diameter ({tr['barlow_burst_bar']:.0f} bar; Lame "
                              f"gives {tr['lame_burst_bar']:.0f} bar); minimum bend radius "
                              f"{tr['min_bend_radius_mm']:.0f} mm ({tr['bend_source']})")
        elif k == "fitting":
            fam = fams.get(p.get("family")) if p.get("family") else None
            r["description"] = (f"fitting {fam['name']} {'size ' if fam and 'mm' in fam['size_basis'] else '-'}"
                                f"{p['dash']}" if fam and p.get("dash") is not None else
                                f"fitting {fam['name']}" if fam else f"fitting {p['bore_mm']:g} mm bore, no family")
            if p.get("adapter"):
                r["description"] = f"adapter at {p['adapter']}"
            w, src = p.get("working_bar"), "user" if p.get("working_bar") is not None else None
            if w is None and fam is not None and fam.get("rated_with_hose"):
                hoses = [q.get("working_bar") for q in parts if q["kind"] == "hose" and q.get("working_bar")]
                if hoses:
                    w, src = min(hoses), "rated with its hose"
            elif w is None and fam is not None and p.get("dash") is not None:
                row = _size_row(fam["sizes"], p["dash"])
                if row is not None:
                    w, src = row["working_bar"], row["source"]
            seal = seals.get(fam["seal"]) if fam else None
            tmax = p.get("max_temp_c")
            if tmax is None and seal is not None:
                tmax = seal["max_temp_c"]
            r.update(working_bar=w, max_temp_c=tmax, min_temp_c=seal["min_temp_c"] if seal else None, source=src)
            if fam is not None and fam["seal"] == "metal" and p.get("max_temp_c") is None:
                r["notes"].append("metal-to-metal seat: no seal temperature limit of its own")
        else:  # device
            r.update(description="cooler" if p.get("is_cooler") else "series device",
                     working_bar=p.get("working_bar"), source="user" if p.get("working_bar") else None)
        out.append(r)
    return out


# -- stage: ratings ----------------------------------------------------------------------
def _check(check: str, verdict: str, message: str) -> dict:
    return {"check": check, "verdict": verdict, "message": message}


def _line_pressures(conditions: list, j: int) -> tuple[float, str, float]:
    """Highest and lowest pressure anywhere in line j over the conditions, bar gauge."""
    hi, hi_at, lo = -math.inf, "", math.inf
    for c in conditions:
        ln = c["lines"][j]
        ps = [n["pressure_bar"] for n in ln["nodes"]] if "nodes" in ln else [ln["inlet_bar"], ln["outlet_bar"]]
        if max(ps) > hi:
            hi, hi_at = max(ps), c["name"]
        lo = min(lo, min(ps))
    return hi, hi_at, lo


def assess(circuit, conditions: list[dict], lines: list[dict], job: dict) -> list[Problem]:
    """Add ratings, rating checks and hose candidates to each result line.

    Parameters
    ----------
    circuit : calc.engine.Circuit
        The compiled circuit (for the fluid states and compiled lines).
    conditions : list of dict
        ``Circuit.operating_point`` results, one per operating point.
    lines : list of dict
        Result lines; each gets ``rating`` and ``candidates`` and more items
        in its ``checks``.
    job : dict
        The normalised job after ``prepare``.

    Returns
    -------
    warnings : list of Problem
        Notes on the job itself (a bore that differs from its class's table).

    Notes
    -----
    The pressure a line must hold: pressure lines, the relief setting plus the
    surge allowance (``ratings.surge_percent``); return and feed lines, the
    highest computed pressure anywhere in the line over all operating points,
    cold start included. Temperatures: the highest and lowest fluid
    temperature over the operating points (the thermal stage's steady
    temperature comes later and is not used here).

    Examples
    --------
    The demo's pressure line (85 bar relief, 25 % surge allowance):

    >>> import json, importlib.resources as ir
    >>> from calc.engine import evaluate
    >>> demo = json.loads((ir.files("calc") / "data" / "demos" / "compact-hatch.json").read_text())
    >>> r = evaluate(demo)["lines"][0]["rating"]
    >>> r["required_bar"], r["margin"] == r["working_bar"] / r["required_bar"]
    (106.25, True)
    """
    rset = job["ratings"]
    warnings: list[Problem] = []
    temps = [c["fluid_temp_c"] for c in conditions]
    t_max, t_min = max(temps), min(temps)
    t_max_at = conditions[temps.index(t_max)]["name"]
    states = [circuit.state(c["fluid_temp_c"]) for c in conditions]
    for ln_c, out in zip(circuit.lines, lines):
        j = ln_c["index"]
        jl = job["lines"][j]
        parts = jl["parts"]
        hi, hi_at, lo = _line_pressures(conditions, j)
        if jl["role"] == "pressure":
            required = job["pump"]["relief_bar"] * (1.0 + rset["surge_percent"] / 100.0)
            basis = (f"relief {job['pump']['relief_bar']:g} bar + {rset['surge_percent']:g} % surge allowance "
                     "(common practice)")
        else:
            required = max(hi, 0.0)
            basis = f"highest computed pressure in the line, at '{hi_at}'"
        prs = part_ratings(parts, rset, t_max, t_min)
        for k, p in enumerate(parts):
            row = (p.get("_rating") or {}).get("row")
            if p["kind"] == "hose" and row and (p["_rating"]["sources"].get("bore_mm") == "user") \
                    and abs(p["bore_mm"] - row["bore_mm"]) > 0.1 * row["bore_mm"]:
                warnings.append(Problem(f"lines[{j}].parts[{k}].bore_mm",
                                        f"{p['bore_mm']:g} mm differs from the nominal {row['bore_mm']:g} mm of "
                                        f"-{p['dash']}; the given bore is used"))
        rated = [r for r in prs if r["working_bar"] is not None]
        weakest = min(rated, key=lambda r: r["working_bar"]) if rated else None
        bursts = [r for r in prs if r["burst_bar"] is not None]
        working = weakest["working_bar"] if weakest else None
        burst = min(r["burst_bar"] for r in bursts) if bursts else None
        low = required < LOW_PRESSURE_BAR  # near atmospheric: a margin would mean nothing
        margin = working / required if (working is not None and not low) else None
        burst_margin = burst / required if (burst is not None and not low) else None
        route = route_geometry(jl["route_points_mm"]) if jl.get("route_points_mm") else None
        rating = {
            "working_bar": working, "burst_bar": burst,
            "design_factor": weakest["design_factor"] if weakest else rset["hose_design_factor"],
            "required_bar": required, "required_basis": basis, "margin": margin, "burst_margin": burst_margin,
            "weakest_part": ({"index": weakest["index"], "kind": weakest["kind"],
                              "description": weakest["description"], "working_bar": weakest["working_bar"]}
                             if weakest else None),
            "unrated_parts": [r["index"] for r in prs if r["working_bar"] is None],
            "temp_max_c": t_max, "temp_min_c": t_min, "pressure_min_bar": lo,
            "dp_budget_bar": jl.get("dp_budget_bar"),
            "parts": prs, "route": route,
        }
        checks = out["checks"]
        checks += _pressure_checks(rating, prs, required, basis)
        checks += _temperature_checks(prs, t_max, t_max_at, t_min)
        checks += _bend_checks(parts, prs)
        checks += _length_checks(jl, parts, rset, route, prs)
        out["rating"] = rating
        out["candidates"] = rank_candidates(circuit, conditions, states, ln_c, jl, job, required, route,
                                            t_max, t_min, lo)
    return warnings


def _pressure_checks(rating, prs, required, basis) -> list:
    out = []
    w, wp = rating["working_bar"], rating["weakest_part"]
    unrated = [r for r in prs if r["working_bar"] is None]
    missing = ("; no rating for " + ", ".join(f"part {r['index']} ({r['description']})" for r in unrated)
               + ": name a hose class and dash size, a fitting family and size, or give working_bar "
               "from the maker's data") if unrated else ""
    if required < LOW_PRESSURE_BAR:
        out.append(_check("pressure", "ok", f"the line stays below {LOW_PRESSURE_BAR:g} bar gauge (at most "
                                            f"{required:.2f} bar): the pressure rating is not what limits it "
                                            "(a feed hose must still resist collapse)"))
    elif w is None:
        out.append(_check("pressure", "caution", f"cannot rate the line: it must hold {required:.1f} bar "
                                                 f"({basis}){missing}"))
    elif rating["margin"] < 1.0:
        out.append(_check("pressure", "fail",
                          f"use a higher-rated part: part {wp['index']} ({wp['description']}) is rated "
                          f"{w:.0f} bar, below the {required:.1f} bar the line must hold ({basis}); "
                          f"margin {rating['margin']:.2f}"))
    else:
        out.append(_check("pressure", "caution" if unrated else "ok",
                          f"weakest rated part {wp['index']} ({wp['description']}) {w:.0f} bar holds the "
                          f"{required:.1f} bar the line must hold ({basis}): margin {rating['margin']:.2f}"
                          + missing))
    for r in prs:
        for note in r["notes"]:
            if note.startswith("burst") and "design factor" in note:
                out.append(_check("design factor", "caution", f"part {r['index']} ({r['description']}): {note}"))
    if required >= LOW_PRESSURE_BAR:
        low = [r for r in prs if r["burst_bar"] is not None and r["burst_bar"] / required < r["design_factor"]]
        known = [r for r in prs if r["burst_bar"] is not None]
        if low:
            out.append(_check("burst", "fail", "; ".join(
                f"use a stronger part {r['index']} ({r['description']}): burst {r['burst_bar']:.0f} bar is "
                f"{r['burst_bar'] / required:.1f}:1 over {required:.1f} bar, under the {r['design_factor']:g}:1 "
                "design factor" for r in low)))
        elif known:
            bm = rating["burst_margin"]
            out.append(_check("burst", "ok", f"lowest burst {rating['burst_bar']:.0f} bar is {bm:.1f}:1 over "
                                             f"{required:.1f} bar, at least each part's design factor"))
        else:
            out.append(_check("burst", "caution", "no part has a known burst pressure: give burst_bar or a hose "
                                                  "class"))
    return out


def _temperature_checks(prs, t_max, t_max_at, t_min) -> list:
    fails, cautions, unknown = [], [], []
    for r in prs:
        if r["kind"] == "device":
            continue
        lim = r["max_temp_c"]
        if lim is None:
            if not any(n.startswith("metal-to-metal") for n in r["notes"]):
                unknown.append(r)
        elif t_max > lim:
            fails.append(f"part {r['index']} ({r['description']}) is limited to {lim:g} C, the fluid reaches "
                         f"{t_max:g} C at '{t_max_at}'")
        elif t_max > lim - TEMP_CAUTION_K:
            cautions.append(f"the fluid's {t_max:g} C ('{t_max_at}') is within {TEMP_CAUTION_K:g} K of the "
                            f"{lim:g} C limit of part {r['index']} ({r['description']})")
        lo = r["min_temp_c"]
        if lo is not None and t_min < lo:
            fails.append(f"part {r['index']} ({r['description']}) is rated down to {lo:g} C only, the fluid "
                         f"starts at {t_min:g} C")
    out = []
    if fails:
        out.append(_check("temperature", "fail", "use a part rated hotter (or colder), or lower the fluid "
                                                 "temperature: " + "; ".join(fails)))
    if cautions:
        out.append(_check("temperature", "caution", "little margin: " + "; ".join(cautions)
                          + " (ageing roughly doubles per 10 K, common practice)"))
    if unknown:
        out.append(_check("temperature", "caution", "no temperature limit for " + ", ".join(
            f"part {r['index']} ({r['description']})" for r in unknown) + f": give max_temp_c; the fluid "
            f"reaches {t_max:g} C"))
    if not out:
        out.append(_check("temperature", "ok", f"every part's limit is above the fluid's highest {t_max:g} C "
                                               f"('{t_max_at}') and below its lowest {t_min:g} C"))
    return out


def _bend_checks(parts, prs) -> list:
    by_index = {r["index"]: r for r in prs}
    fails, unknown, n = [], [], 0
    for i, p in enumerate(parts):
        if p["kind"] not in ("hose", "tube") or not p.get("bends"):
            continue
        mn = by_index[i]["min_bend_radius_mm"]
        for m, b in enumerate(p["bends"]):
            n += 1
            if mn is None:
                unknown.append(f"part {i} bend {m}")
            elif b["radius_mm"] < mn * (1 - 1e-9):
                what = ("a tighter-bending hose class (for example SAE 100R16)" if p["kind"] == "hose"
                        else "a bender die of that radius")
                fails.append(f"part {i} ({by_index[i]['description']}) bend {m}: radius {b['radius_mm']:g} mm is "
                             f"under the minimum {mn:.0f} mm; use at least {mn:.0f} mm or {what}")
    if not n:
        return []
    if fails:
        return [_check("bend radius", "fail", "; ".join(fails))]
    if unknown:
        return [_check("bend radius", "caution", "no minimum bend radius known for " + ", ".join(unknown)
                       + ": name the hose class or give min_bend_radius_mm")]
    return [_check("bend radius", "ok", f"all {n} bends at or above their part's minimum radius")]


def _length_checks(jl, parts, rset, route, prs) -> list:
    out = []
    hoses = [(i, p) for i, p in enumerate(parts) if p["kind"] == "hose"]
    hose_mm = sum(p["length_m"] for _, p in hoses) * 1000.0
    move = jl.get("engine_movement_mm") or 0.0
    plus, minus = rset["length_change_plus_percent"], rset["length_change_minus_percent"]
    if hoses:
        shrink, grow = hose_mm * minus / 100.0, hose_mm * plus / 100.0
        need = shrink + move
        msg = (f"hose {hose_mm:.0f} mm changes by +{grow:.0f} / -{shrink:.0f} mm under pressure "
               f"(+{plus:g} % / -{minus:g} %, SAE J517, from memory)")
        if move:
            msg += f"; with {move:g} mm engine movement leave at least {need:.0f} mm slack"
        else:
            msg += f"; leave at least {need:.0f} mm slack"
        if route is not None:
            assembly = jl.get("overall_length_mm") or (
                sum(p["length_m"] for p in parts if p["kind"] in ("hose", "tube")) * 1000.0)
            slack = assembly - route["length_mm"]
            if slack < need:
                out.append(_check("length change", "fail",
                                  f"lengthen the assembly by {need - slack:.0f} mm: it is {assembly:.0f} mm over a "
                                  f"{route['length_mm']:.0f} mm route, {slack:.0f} mm slack; " + msg))
            else:
                out.append(_check("length change", "ok", f"{slack:.0f} mm slack over the {route['length_mm']:.0f} mm "
                                                         f"route; " + msg))
        else:
            out.append(_check("length change", "caution" if move else "ok",
                              msg + ("; give route_points_mm to check the slack" if move else "")))
    total = jl.get("overall_length_mm")
    if total:
        ends = [(i, p) for i, p in enumerate(parts) if p["kind"] == "fitting" and p.get("end") in ("start", "end")]
        cut_off = sum(p["cutoff_mm"] for _, p in ends)
        cut = total - cut_off
        if cut <= 0:
            out.append(_check("cut length", "fail", f"the cut-off allowances ({cut_off:g} mm) are not less than "
                                                    f"the overall length {total:g} mm: check both"))
        elif not ends:
            out.append(_check("cut length", "caution", f"cut length {cut:.0f} mm = the overall length: mark the end "
                                                       "fittings (end: start / end) and give their cutoff_mm"))
        else:
            msg = (f"cut the hose to {cut:.0f} mm: overall {total:g} mm less the cut-off allowances "
                   + " + ".join(f"{p['cutoff_mm']:g}" for _, p in ends) + " mm")
            if len(hoses) == 1 and abs(cut - hose_mm) > max(10.0, 0.02 * cut):
                out.append(_check("cut length", "caution", msg + f"; the pressure drop used {hose_mm:.0f} mm of "
                                                                 f"hose: set length_m to {cut / 1000:.3f}"))
            else:
                out.append(_check("cut length", "ok", msg))
    if route is not None:
        mins = [(r["index"], r["min_bend_radius_mm"]) for r in prs if r["kind"] in ("hose", "tube")]
        known = [m for m in mins if m[1] is not None]
        tight = route["tightest_radius_mm"]
        desc = (f"route {route['length_mm']:.0f} mm through {len(jl['route_points_mm'])} points "
                f"(end to end {route['straight_mm']:.0f} mm), "
                + (", ".join(f"{b['angle_deg']:.0f} deg at point {b['at_point']} (radius at most "
                             f"{b['max_radius_mm']:.0f} mm)" for b in route["bends"]) or "no bends"))
        if tight is None:
            out.append(_check("route", "ok", desc))
        elif not known:
            out.append(_check("route", "caution", desc + "; no minimum bend radius known to compare"))
        else:
            idx, worst = max(known, key=lambda m: m[1])
            if tight < worst:
                at = min(route["bends"], key=lambda b: b["max_radius_mm"])["at_point"]
                out.append(_check("route", "fail", f"move the points apart or reroute near point {at}: the route "
                                                   f"forces a bend of at most {tight:.0f} mm radius, under part "
                                                   f"{idx}'s minimum {worst:.0f} mm; " + desc))
            else:
                out.append(_check("route", "ok", desc + f"; tightest forced radius {tight:.0f} mm is at least the "
                                                        f"{worst:.0f} mm minimum"))
    return out


# -- selection ------------------------------------------------------------------------------
def rank_candidates(circuit, conditions, states, ln_c, jl, job, required, route, t_max, t_min, p_min) -> list:
    """Rank every tabulated hose class and dash size for one line.

    The line's hose parts are swapped for the candidate (its nominal bore; the
    parts keep their length, bends, rise and roughness) and the line is
    recomputed with ``hydraulics.compile_line`` and ``line_flow`` at every
    operating point's circuit flow and fluid state. A candidate is checked for
    the velocity band of the line's role (velocity in the hose; the fittings
    keep their own bores), the line's pressure-drop budget, the pump inlet
    (feed lines), the pressure and burst the line must hold, the temperature
    range, every bend's radius and the route's forced radius, and suction
    (feed lines below atmospheric need a hose that does not collapse).

    Returns
    -------
    candidates : list of dict
        Passing candidates first, smallest bore then lightest construction
        (``light_rank``); then the rejected ones, fewest failed checks first.
        Each: class, dash, bore_mm, verdict ('ok', 'caution' for a bore below
        the velocity band, 'fail'), failed (check names), reasons,
        velocity_max_m_s, pressure_drop_bar, working_bar, min_bend_radius_mm.
        Empty for a line without hose.

    Examples
    --------
    >>> import json, importlib.resources as ir
    >>> from calc.engine import evaluate
    >>> demo = json.loads((ir.files("calc") / "data" / "demos" / "compact-hatch.json").read_text())
    >>> best = evaluate(demo)["lines"][1]["candidates"][0]
    >>> best["verdict"] in ("ok", "caution"), best["failed"], best["class"] in hose_classes()
    (True, [], True)
    """
    parts = jl["parts"]
    hose_idx = [i for i, p in enumerate(parts) if p["kind"] == "hose"]
    if not hose_idx:
        return []
    from .engine import INLET_MIN_BAR
    role = jl["role"]
    j = ln_c["index"]
    lo_v, hi_v = hyd.VELOCITY_BANDS_M_S[role]
    budget = jl.get("dp_budget_bar")
    hdf = job["ratings"]["hose_design_factor"]
    q = [c["circuit_flow_lpm"] / 60000.0 for c in conditions]
    q_max = max(q)
    bends = [b["radius_mm"] for i in hose_idx for b in parts[i].get("bends") or ()]
    forced = route["tightest_radius_mm"] if route else None
    is_last_feed = role == "feed" and circuit.by_role["feed"] and circuit.by_role["feed"][-1] is ln_c
    hydro = {}  # bore -> (dp per condition in bar)
    out = []
    for cls in hose_classes().values():
        for row in cls["sizes"]:
            bore = row["bore_mm"]
            if bore not in hydro:
                trial = [dict(p, bore_mm=bore) if i in hose_idx else p for i, p in enumerate(parts)]
                segs = hyd.compile_line(trial)
                hydro[bore] = [hyd.line_flow(segs, qi, st.nu_m2_s, st.rho_kg_m3, detail=False)[0] / 1e5
                               for qi, st in zip(q, states)]
            dps = hydro[bore]
            dp_max = max(dps)
            v = q_max / (0.25 * math.pi * (bore * 1e-3) ** 2)
            failed, reasons = [], []
            if v > hi_v:
                failed.append("velocity")
                reasons.append(f"velocity {v:.1f} m/s in the hose exceeds {hi_v:g} m/s for a {role} line")
            if budget is not None and dp_max > budget:
                failed.append("pressure drop")
                reasons.append(f"drop {dp_max:.2f} bar exceeds the {budget:g} bar budget")
            if is_last_feed:
                p_in = min(c["pump_inlet_bar"] + c["lines"][j]["pressure_drop_bar"] - d
                           for c, d in zip(conditions, dps))
                if p_in < INLET_MIN_BAR:
                    failed.append("pump inlet")
                    reasons.append(f"pump inlet {p_in:.2f} bar gauge is below {INLET_MIN_BAR} bar")
            req = required
            if role == "return":
                req = max([required] + [c["lines"][j]["outlet_bar"] + d for c, d in zip(conditions, dps)])
            w, b = row["working_bar"], row["burst_bar"]
            if req > 0 and w < req:
                failed.append("pressure")
                reasons.append(f"working {w:.0f} bar is under the {req:.1f} bar the line must hold")
            if req > 0 and b / req < hdf:
                failed.append("burst")
                reasons.append(f"burst {b:.0f} bar is {b / req:.1f}:1 over {req:.1f} bar, under {hdf:g}:1")
            if (cls["temp_max_c"] is not None and t_max > cls["temp_max_c"]) or \
                    (cls["temp_min_c"] is not None and t_min < cls["temp_min_c"]):
                failed.append("temperature")
                reasons.append(f"rated {cls['temp_min_c']:g} to {cls['temp_max_c']:g} C; the fluid runs "
                               f"{t_min:g} to {t_max:g} C")
            mbr = row["min_bend_radius_mm"]
            tight = min(bends + ([forced] if forced is not None else []), default=None)
            if tight is not None and tight < mbr:
                failed.append("bend radius")
                reasons.append(f"minimum bend radius {mbr:g} mm is over the tightest bend {tight:.0f} mm")
            if role == "feed" and p_min < 0 and cls.get("suction") is False:
                failed.append("suction")
                reasons.append("not a suction hose; the line runs below atmospheric")
            verdict = "fail" if failed else "ok"
            if not failed and v < lo_v:
                verdict = "caution"
                reasons.append(f"velocity {v:.2f} m/s is below the {lo_v:g}-{hi_v:g} m/s band: larger than needed")
            out.append({"class": cls["class"], "dash": row["dash"], "bore_mm": bore, "verdict": verdict,
                        "failed": failed, "reasons": reasons, "velocity_max_m_s": v, "pressure_drop_bar": dp_max,
                        "working_bar": w, "min_bend_radius_mm": mbr, "light_rank": cls["light_rank"],
                        "source": row["source"]})
    out.sort(key=lambda c: (c["verdict"] == "fail", len(c["failed"]) if c["failed"] else 0, c["bore_mm"],
                            c["light_rank"], c["class"]))
    return out
