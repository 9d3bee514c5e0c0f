"""The order list of a job: what to buy to build every line as it is built.

Hoses by class and dash size (the assembly hose at its worked-out cut length, other hoses at their own
length), tubes by material and size, the user's fittings by family, size and shape, and the adapters the
port plans add, each counted once per place it is used.
"""
from __future__ import annotations

__all__ = ["order_of"]


def _add(groups: dict, key: tuple, row: dict, length_mm: float | None = None) -> None:
    cur = groups.setdefault(key, dict(row, total_mm=0.0, pieces=0, lines=[]) if length_mm is not None
                            else dict(row, count=0, lines=[]))
    if length_mm is not None:
        cur["total_mm"] += length_mm
        cur["pieces"] += 1
    else:
        cur["count"] += 1
    return cur


def _line_parts(j: int, parts, hoses: dict, tubes: dict, fittings: dict, devices: dict) -> None:
    for p in parts:
        if p.adapter is not None:
            continue  # counted from the port plans, by name
        kind = p["kind"]
        if kind == "hose":
            row = _add(hoses, (p.get("class"), p.get("dash"), round(p["bore_mm"], 3)),
                       {"class": p.get("class"), "dash": p.get("dash"), "bore_mm": p["bore_mm"]}, p["length_m"] * 1000.0)
        elif kind == "tube":
            row = _add(tubes, (p["material"], p["od_mm"], p["wall_mm"]),
                       {"material": p["material"], "od_mm": p["od_mm"], "wall_mm": p["wall_mm"]}, p["length_m"] * 1000.0)
        elif kind == "fitting":
            row = _add(fittings, (p.get("family"), p.get("dash"), p["shape"], p["bore_mm"]),
                       {"family": p.get("family"), "dash": p.get("dash"), "shape": p["shape"], "bore_mm": p["bore_mm"]})
        elif kind == "device":
            row = _add(devices, (bool(p["is_cooler"]),), {"is_cooler": bool(p["is_cooler"])})
        else:
            continue
        if j not in row["lines"]:
            row["lines"].append(j)


def order_of(built_parts, plans) -> dict:
    """The result's ``order`` from each line's parts as built and its port plans.

    Parameters
    ----------
    built_parts : sequence of sequences of calc.model.prepared.Part
        Per line, its parts as built (the assembly hose at its cut length).
    plans : sequence of dict
        Per line, ``{"from_port": plan or None, "to_port": plan or None}`` (``calc.stages.ports``).

    Returns
    -------
    dict
        ``hoses`` (class, dash, bore_mm, total_mm, pieces, lines), ``tubes`` (material, od_mm, wall_mm,
        total_mm, pieces, lines), ``fittings`` (family, dash, shape, bore_mm, count, lines), ``adapters``
        (name, count, lines) and ``devices`` (is_cooler, count, lines); ``lines`` count from 0.
    """
    hoses, tubes, fittings, devices, adapters = {}, {}, {}, {}, {}
    for j, (parts, plan) in enumerate(zip(built_parts, plans)):
        _line_parts(j, parts, hoses, tubes, fittings, devices)
        for end in ("from_port", "to_port"):
            for a in (plan.get(end) or {}).get("adapters") or ():
                row = _add(adapters, (a["name"],), {"name": a["name"]})
                if j not in row["lines"]:
                    row["lines"].append(j)
    return {"hoses": list(hoses.values()), "tubes": list(tubes.values()), "fittings": list(fittings.values()),
            "adapters": list(adapters.values()), "devices": list(devices.values())}
