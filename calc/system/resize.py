"""A hose swapped for another class and size, with its own end fittings re-sized to match.

Works on the job as the user wrote it (``PreparedJob.raw``), so the edits it gives hold no planned
adapters and no filled-in defaults.
"""
from __future__ import annotations

from ..data.practice import METRIC_END_WINDOW
from ..data.tables import fitting_families, size_row
from ..model.assembly import end_fittings

__all__ = ["HOSE_OVERRIDES", "resized_line"]

#: A hose's own datasheet figures, dropped when it is swapped for a class from the tables.
HOSE_OVERRIDES = ("bore_mm", "working_bar", "burst_bar", "min_bend_radius_mm", "max_temp_c", "wall_mm")


def _metric_row(fam, bore_mm: float):
    lo, over = METRIC_END_WINDOW
    rows = [r for r in fam["sizes"] if r.get("dash") is not None and lo * bore_mm <= r["dash"] <= bore_mm + over]
    return min(rows, key=lambda r: r["dash"]) if rows else None


def resized_end(raw: dict, old_bore_mm: float, dash: int, bore_mm: float) -> dict:
    """A hose end fitting re-sized in its family for a hose of ``dash`` and ``bore_mm``.

    The size follows the family's own size system (sixteenths: the hose's dash; a metric family: the
    smallest size whose tube outside diameter suits the bore); the bore is the family's typical bore
    for that size, or, where the table has none, the old bore scaled with the hose's bore. A hose that
    keeps its bore keeps its ends as they are.

    Examples
    --------
    >>> resized_end({"kind": "fitting", "family": "jic-37", "dash": 6, "bore_mm": 6.5}, 9.52, 8, 12.7)["dash"]
    8
    """
    fam = fitting_families().get(raw.get("family"))
    out = dict(raw)
    if abs(bore_mm - old_bore_mm) < 1e-9:  # the hose keeps its bore: its ends stay as the user wrote them
        return out
    if fam is None or fam.get("rated_with_hose"):
        out["bore_mm"] = round(raw["bore_mm"] * bore_mm / old_bore_mm, 1)
        if fam is not None and raw.get("dash") is not None:
            out["dash"] = dash
        return out
    metric = "sixteenths" not in fam["size_basis"] and fam["size_basis"] != "hose dash size"
    row = _metric_row(fam, bore_mm) if metric else size_row(fam["sizes"], dash)
    if row is None:  # no size of this family suits the hose: keep the end and let the checks say so
        return out
    out["dash"] = row["dash"]
    out["bore_mm"] = row["bore_mm"] if row.get("bore_mm") else round(raw["bore_mm"] * bore_mm / old_bore_mm, 1)
    return out


def resized_line(raw_line: dict, old_bores: dict, cls: str, row) -> tuple[list, list]:
    """The user's parts with every hose swapped for class ``cls`` at size ``row``, and the port edits.

    Parameters
    ----------
    raw_line : mapping
        The line as the user wrote it.
    old_bores : dict
        Place -> the bore each hose has now, [mm] (its end fittings scale from it).
    cls : str
        The candidate hose class.
    row : mapping
        That class's size row (dash, bore_mm).

    Returns
    -------
    parts, port_edits
        The new parts list, and ``(end, key, value)`` for each port whose line end followed an end fitting
        that changed size.
    """
    parts = [dict(p) for p in raw_line["parts"]]
    kinds = [{"kind": p["kind"]} for p in parts]
    old = {i: dict(p) for i, p in enumerate(parts)}
    for k, p in enumerate(old.values()):
        if p["kind"] != "hose":
            continue
        hose = {key: v for key, v in p.items() if key not in HOSE_OVERRIDES}
        hose.update({"class": cls, "dash": row["dash"]})
        parts[k] = hose
        for i in end_fittings(kinds, k):
            parts[i] = resized_end(parts[i], old_bores[k], row["dash"], row["bore_mm"])
    return parts, _port_edits(raw_line, old, parts)


def _port_edits(raw_line: dict, old: dict, parts: list) -> list:
    edits = []
    for end, i in (("from_port", 0), ("to_port", len(parts) - 1)):
        port = raw_line.get(end)
        was, now = old[i], parts[i]
        if not port or now["kind"] != "fitting" or was.get("dash") == now.get("dash"):
            continue
        if port.get("line_end_family") == now.get("family") and port.get("line_end_dash") == was.get("dash"):
            edits.append((end, "line_end_dash", now.get("dash")))
    return edits
