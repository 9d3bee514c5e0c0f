"""Parts in words, the way a fabricator names them: "part 2 (hose SAE 100R2AT -6)".

Numbers count from 1 in the user's own list of a line's parts; an adapter the port plan added
is named by its port, never by a number, so it never shifts the user's numbers.
"""
from __future__ import annotations

import math

from ..data.tables import fitting_families, hose_classes
from .line import part_bore_mm

__all__ = ["part_words", "part_ref", "larger_size_advice", "end_words"]

#: What lies at each end of a line of each role, the first of its role at the start and the last at the end.
_END_DEVICES = {"pressure": ("pump", "gear"), "return": ("gear", "reservoir"), "feed": ("reservoir", "pump")}


def end_words(role: str, end: str, first: bool, last: bool) -> str:
    """The end of a line in words, for naming the adapters there: "pump end", "gear end", or, between two
    lines of one role, "start of the line" and "end of the line".

    Examples
    --------
    >>> end_words("pressure", "from_port", True, True), end_words("return", "to_port", True, False)
    ('pump end', 'end of the line')
    """
    start, finish = _END_DEVICES[role]
    if end == "from_port":
        return f"{start} end" if first else "start of the line"
    return f"{finish} end" if last else "end of the line"


def _mm(v: float) -> str:
    return f"{v:.1f}".rstrip("0").rstrip(".")


def part_words(p) -> str:
    """The part in words: "hose SAE 100R2AT -6", "9 mm fitting", "9.53 x 0.89 mm tube".

    Examples
    --------
    >>> part_words({"kind": "fitting", "bore_mm": 9.0, "family": None})
    '9 mm fitting'
    >>> part_words({"kind": "tube", "od_mm": 9.53, "wall_mm": 0.89})
    '9.53 x 0.89 mm tube'
    """
    k = p["kind"]
    cls = getattr(p, "hose_class", None)
    if k == "hose":
        if cls is not None and p.get("dash") is not None:
            return f"hose {cls['class']} -{p['dash']}"
        return f"{_mm(p['bore_mm'])} mm hose" + (f" {p['class']}" if p.get("class") else "")
    if k == "tube":
        return f"{p['od_mm']:g} x {p['wall_mm']:g} mm tube"
    if k == "fitting":
        fam = fitting_families().get(p.get("family")) if p.get("family") else None
        size = "" if fam is None or p.get("dash") is None else f" {p['dash']}" if "mm" in fam["size_basis"] \
            else f" -{p['dash']}"
        return f"{_mm(p['bore_mm'])} mm fitting" + (f" ({fam['label']}{size})" if fam else "")
    if k == "entrance":
        return f"{_mm(p['bore_mm'])} mm reservoir outlet"
    if k == "exit":
        return f"{_mm(p['bore_mm'])} mm discharge into the reservoir"
    return "cooler" if p.get("is_cooler") else "series device"


def part_ref(p) -> str:
    """The part named for a message: "part 2 (hose SAE 100R2AT -6)", or "the adapter at the pump outlet".

    Examples
    --------
    >>> class P(dict): place, adapter = 1, None
    >>> part_ref(P(kind="fitting", bore_mm=9.0))
    'part 2 (9 mm fitting)'
    """
    if getattr(p, "place", None) is None and getattr(p, "adapter", None):
        where, _, name = p.adapter.partition(": ")
        return f"the adapter at the {where} ({name})" if name else f"the adapter at the {where}"
    if getattr(p, "place", None) is None:
        return part_words(p)
    return f"part {p.place + 1} ({part_words(p)})"


def _hose_rows(p) -> list:
    cls = getattr(p, "hose_class", None)
    classes = [cls] if cls is not None and cls["sizes"] else list(hose_classes().values())
    return sorted(((r["bore_mm"], c["class"], r["dash"]) for c in classes for r in c["sizes"]))


def larger_size_advice(p, d_min_mm: float) -> tuple[str, str | None, object]:
    """What to fit instead of part ``p`` for a bore of at least ``d_min_mm``: a size the tables have, or,
    where none fits or the tables hold no sizes of its kind, the bore it needs.

    Returns
    -------
    words, key, value
        The advice in words, and the field of the part to set and its value (``key`` None where no
        single field carries it out).

    Examples
    --------
    >>> larger_size_advice({"kind": "tube", "od_mm": 6.35, "wall_mm": 0.71}, 7.0)[0]
    'a tube with a bore of at least 7.0 mm (the tables hold no tube sizes)'
    """
    k = p["kind"]
    bore = math.ceil(d_min_mm * 10.0 - 1e-9) / 10.0
    need = f"a bore of at least {bore:.1f} mm"
    if k == "hose":
        rows = [r for r in _hose_rows(p) if r[0] >= d_min_mm]
        if not rows:
            return f"a hose with {need}; no hose in the tables is that large", None, None
        row_bore, cls, dash = rows[0]
        if getattr(p, "hose_class", None) is not None:
            return f"a -{dash} hose ({cls}, {row_bore:g} mm bore)", "dash", dash
        return f"a -{dash} hose ({row_bore:g} mm bore, for example {cls})", "bore_mm", row_bore
    if k == "fitting":
        fam = fitting_families().get(p.get("family")) if p.get("family") else None
        rows = sorted((r for r in (fam["sizes"] if fam else ()) if r.get("bore_mm") and r["bore_mm"] >= d_min_mm
                       and r.get("dash") is not None), key=lambda r: r["bore_mm"])
        if rows:
            return (f"a fitting with {need} (a {rows[0]['size']} {fam['label']} end is about {rows[0]['bore_mm']:g} mm)",
                    "bore_mm", bore)
        return f"a fitting with {need}", "bore_mm", bore
    if k == "tube":
        return f"a tube with {need} (the tables hold no tube sizes)", None, None
    if k == "entrance":
        return f"a reservoir outlet with {need}", "bore_mm", bore
    if k == "exit":
        return f"a return into the reservoir with {need}", "bore_mm", bore
    return f"a part with {need}", None, None


def bore_of(p) -> float | None:
    """The part's flow bore, mm (``calc.system.line.part_bore_mm``)."""
    return part_bore_mm(p)
