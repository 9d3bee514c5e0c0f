"""The pressure and temperature rating of each part of a line.

Methods
-------
* hose: maximum working pressure and minimum burst from the class table
  (SAE J517, EN 853; from memory) or the maker's datasheet; SAE J517 rates
  hose at a quarter of its minimum burst, so a burst below ``design factor x
  working`` lowers the usable working pressure to ``burst / design factor``;
* rigid tube: burst by Barlow with the outside diameter and by Lame's thick-wall
  hoop stress at the bore (``calc.physics.strength``); Barlow with the outside
  diameter is never higher than Lame, so it is the burst used (conservative);
  working = burst / tube design factor;
* fittings: working pressure per family and size from the table or the maker;
  a crimp stem is rated with its hose;
* temperature derating: linear interpolation in the table's
  ``[temperature, factor]`` pairs where the data gives one (only 6061-T6 tube).

References
----------
.. [1] SAE J517, Hydraulic Hose (from memory of its tables).
.. [2] EN 853, Rubber hoses and hose assemblies - Wire braid reinforced
   hydraulic type (from memory of its tables).
"""
from __future__ import annotations

import math

from ..data.practice import LOW_PRESSURE_BAR, PROOF_TEST_FACTOR, TABLE_ROUNDING
from ..data.tables import family_rating, fitting_families, seals, size_row, tube_materials
from ..physics.strength import barlow_burst_mpa, derate_factor, lame_burst_mpa

__all__ = ["BAR_PER_MPA", "PRESSURE_PARTS", "tube_rating", "hose_description", "part_ratings", "line_rating"]

BAR_PER_MPA = 10.0
#: Kinds of part that hold pressure (a reservoir entrance or exit carries none).
PRESSURE_PARTS = ("hose", "tube", "fitting", "device")


def tube_rating(part, design_factor: float = 4.0, t_c: float = 20.0) -> dict:
    """Burst and working pressure of a rigid tube part.

    Parameters
    ----------
    part : mapping
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
        source, bend_source.

    Examples
    --------
    3/8 in x 0.035 in low-carbon steel (310 MPa, SAE J525 from memory): Barlow 578.7 bar, and a
    quarter of it to work at:

    >>> r = tube_rating({"od_mm": 9.525, "wall_mm": 0.889, "material": "steel-low-carbon",
    ...                  "tensile_mpa": None, "max_temp_c": None})
    >>> round(r["burst_bar"], 1), round(r["working_bar"] * 4 / r["burst_bar"], 12)
    (578.7, 1.0)
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


def hose_description(p) -> str:
    """'hose SAE 100R2AT -6', or the bore and class given, in words.

    Examples
    --------
    >>> hose_description({"kind": "hose", "class": None, "bore_mm": 9.5})
    'hose 9.5 mm bore, no class'
    """
    cls = getattr(p, "hose_class", None)
    if cls is not None and p.get("dash") is not None:
        return f"hose {cls['class']} -{p['dash']}"
    if p.get("class"):
        return f"hose {p['class']} ({p['bore_mm']:g} mm bore)"
    return f"hose {p['bore_mm']:g} mm bore, no class"


def _hose(p, r: dict, hdf: float, t_max_c: float) -> None:
    cls = getattr(p, "hose_class", None)
    sources = getattr(p, "sources", {})
    r["description"] = hose_description(p)
    w, b = p.get("working_bar"), p.get("burst_bar")
    factor = derate_factor(cls.get("temp_derating") if cls else None, t_max_c)
    if w is not None:
        w *= factor
    if b is not None:
        b *= factor
    if w is not None and b is not None and b < hdf * w * (1.0 - TABLE_ROUNDING):
        r["notes"].append(f"burst {b:.0f} bar is under {hdf:g} x the working {w:.0f} bar: working taken "
                          f"as burst / {hdf:g} = {b / hdf:.0f} bar (design factor, SAE J517)")
        w = b / hdf
    r.update(working_bar=w, burst_bar=b, max_temp_c=p.get("max_temp_c"),
             min_temp_c=cls["temp_min_c"] if cls else None,
             min_bend_radius_mm=p.get("min_bend_radius_mm"), source=sources.get("working_bar"))


def _tube(p, r: dict, tdf: float, t_max_c: float) -> None:
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


def _fitting(p, parts, r: dict) -> None:
    fam = fitting_families().get(p.get("family")) if p.get("family") else None
    r["description"] = (f"fitting {fam['name']} {'size ' if fam and 'mm' in fam['size_basis'] else '-'}"
                        f"{p['dash']}" if fam and p.get("dash") is not None else
                        f"fitting {fam['name']}" if fam else f"fitting {p['bore_mm']:g} mm bore, no family")
    if getattr(p, "adapter", None):
        r["description"] = f"adapter at {p.adapter}"
    w, src = p.get("working_bar"), "user" if p.get("working_bar") is not None else None
    if w is None and fam is not None and fam.get("rated_with_hose"):
        hoses = [q.get("working_bar") for q in parts if q["kind"] == "hose" and q.get("working_bar")]
        if hoses:
            w, src = min(hoses), "rated with its hose"
    elif w is None and fam is not None and fam.get("working_bar") is not None:
        w, src = fam["working_bar"], fam["rating_source"]
    elif w is None and fam is not None and p.get("dash") is not None:
        row = size_row(fam["sizes"], p["dash"])
        if row is not None:
            w, src = family_rating(fam, row), row["source"]
    seal = seals().get(fam["seal_material"]) if fam else None
    tmax = p.get("max_temp_c")
    if tmax is None and seal is not None:
        tmax = seal["max_temp_c"]
    r.update(working_bar=w, max_temp_c=tmax, min_temp_c=seal["min_temp_c"] if seal else None, source=src)
    if fam is not None and fam["seal_material"] == "metal" and p.get("max_temp_c") is None:
        r["notes"].append("metal-to-metal seat: no seal temperature limit of its own")


def part_ratings(parts, rset, t_max_c: float, t_min_c: float, memo: dict | None = None) -> list[dict]:
    """Rating of every pressure-bearing part of a line at the line's temperatures.

    Parameters
    ----------
    parts : sequence of mappings
        The line's parts in flow order (prepared; port adapters included).
    rset : mapping
        The job's ``ratings`` settings (design factors).
    t_max_c, t_min_c : float
        Highest and lowest fluid temperature over the operating points, [C];
        ratings are derated at ``t_max_c`` where the data gives a derating.
    memo : dict, optional
        Kept between calls with the same settings and temperatures (the hose candidates of one line): a
        part seen before, at the same place and beside hoses of the same ratings, is not rated again. It
        holds the part itself beside its rating, so the part's identity stays its own.

    Returns
    -------
    ratings : list of dict
        Per part: index, kind, description, working_bar (None when unknown),
        burst_bar, design_factor, max_temp_c, min_temp_c, min_bend_radius_mm,
        source, notes. Reservoir entrance and exit carry no pressure and are
        left out.

    Examples
    --------
    A -6 37 deg flare fitting takes its family's rating from the table (SAE J514, from memory):

    >>> rset = {"hose_design_factor": 4.0, "tube_design_factor": 4.0}
    >>> fit = {"kind": "fitting", "bore_mm": 6.0, "family": "jic-37", "dash": 6, "working_bar": None,
    ...        "max_temp_c": None}
    >>> r = part_ratings([fit], rset, 100.0, -20.0)[0]
    >>> r["working_bar"], r["source"].startswith("SAE J514 (from memory)")
    (310.3, True)
    """
    hdf, tdf = rset["hose_design_factor"], rset["tube_design_factor"]
    hoses = tuple(q.get("working_bar") for q in parts if q["kind"] == "hose")
    out = []
    for i, p in enumerate(parts):
        k = p["kind"]
        if k not in PRESSURE_PARTS:
            continue
        key = (id(p), i, hoses if k == "fitting" else None)
        hit = memo.get(key) if memo is not None else None
        if hit is not None:
            out.append(dict(hit[1], notes=list(hit[1]["notes"])))
            continue
        r = {"index": i, "kind": k, "description": "", "working_bar": None, "burst_bar": None,
             "design_factor": hdf, "max_temp_c": None, "min_temp_c": None, "min_bend_radius_mm": None,
             "source": None, "notes": []}
        if k == "hose":
            _hose(p, r, hdf, t_max_c)
        elif k == "tube":
            _tube(p, r, tdf, t_max_c)
        elif k == "fitting":
            _fitting(p, parts, r)
        else:  # device
            r.update(description="cooler" if p.get("is_cooler") else "series device",
                     working_bar=p.get("working_bar"), source="user" if p.get("working_bar") else None)
        if memo is not None:
            memo[key] = (p, dict(r, notes=list(r["notes"])))
        out.append(r)
    return out


def _line_pressures(results, names) -> tuple[float, str, float]:
    """Highest and lowest pressure anywhere in a line over the operating points, bar gauge."""
    hi, hi_at, lo = -math.inf, "", math.inf
    for ln, name in zip(results, names):
        ps = [n["pressure_bar"] for n in ln["nodes"]] if "nodes" in ln else [ln["inlet_bar"], ln["outlet_bar"]]
        if max(ps) > hi:
            hi, hi_at = max(ps), name
        lo = min(lo, min(ps))
    return hi, hi_at, lo


def _summary(r) -> dict | None:
    if r is None:
        return None
    return {"index": r["index"], "kind": r["kind"], "description": r["description"], "label": r["label"],
            "working_bar": r["working_bar"]}


def line_rating(parts, role: str, rset, relief_bar: float, results, names, temps: tuple, budgets: tuple,
                label_of, memo: dict | None = None) -> tuple[dict, list]:
    """The rating of a line as built: the pressure it must hold, its weakest part and its margins.

    Parameters
    ----------
    parts : sequence of Part
        The line's parts as built, in flow order.
    role : str
        'pressure', 'return' or 'feed'.
    rset : mapping
        The job's rating settings.
    relief_bar : float
        The pump's relief setting, [bar].
    results, names : sequences
        The line's result (``calc.system.circuit``) and the operating point's name, per operating point.
    temps : (t_max, t_min)
        Highest and lowest fluid temperature over the operating points, [C].
    budgets : (warm, cold)
        The line's pressure-drop budgets, [bar] (None where none applies).
    label_of : callable
        ``label_of(part)`` -> the part in words, for the result.
    memo : dict, optional
        As ``part_ratings``'s (the hose candidates of one line share it).

    Returns
    -------
    rating, part_ratings : dict, list

    Notes
    -----
    The pressure a line must hold: a pressure line, the relief setting plus the surge allowance
    (``ratings.surge_percent``, common practice); a return or feed line, the highest computed pressure
    anywhere in it over the operating points, cold start included. The proof-test pressure is
    ``PROOF_TEST_FACTOR`` x the assembly's working pressure (common practice, no source).
    """
    hi, hi_at, lo = _line_pressures(results, names)
    if role == "pressure":
        required = relief_bar * (1.0 + rset["surge_percent"] / 100.0)
        basis = f"relief {relief_bar:g} bar + {rset['surge_percent']:g} % surge allowance (common practice)"
    else:
        required = max(hi, 0.0)
        basis = f"the highest pressure computed in the line, at ‘{hi_at}’"
    prs = part_ratings(parts, rset, temps[0], temps[1], memo)
    for r in prs:
        p = parts[r["index"]]
        hit = memo.get(("label", id(p))) if memo is not None else None
        if hit is None:
            hit = (p, label_of(p))
            if memo is not None:
                memo[("label", id(p))] = hit
        r["label"] = hit[1]
    rated = [r for r in prs if r["working_bar"] is not None]
    weakest = min(rated, key=lambda r: r["working_bar"]) if rated else None
    bursts = [r["burst_bar"] for r in prs if r["burst_bar"] is not None]
    working = weakest["working_bar"] if weakest else None
    burst = min(bursts) if bursts else None
    low = required < LOW_PRESSURE_BAR  # near atmospheric: a margin would mean nothing
    rating = {
        "working_bar": working, "burst_bar": burst,
        "design_factor": weakest["design_factor"] if weakest else rset["hose_design_factor"],
        "required_bar": required, "required_basis": basis,
        "margin": working / required if (working is not None and not low) else None,
        "burst_margin": burst / required if (burst is not None and not low) else None,
        "proof_test_bar": PROOF_TEST_FACTOR * working if working is not None else None,
        "weakest_part": _summary(weakest),
        "unrated_parts": [r["index"] for r in prs if r["working_bar"] is None],
        "temp_max_c": temps[0], "temp_min_c": temps[1], "pressure_min_bar": lo,
        "dp_budget_bar": budgets[0], "dp_budget_cold_bar": budgets[1],
        "parts": prs,
    }
    return rating, prs
