"""The part tables: one loader for every JSON table in ``calc/data/``, with lookups.

Tables (each row names its ``source``; recalled figures say "from memory"):

* ``hoses.json``: hose classes by standard and dash size, and typical hose walls by bore;
* ``tubes.json``: rigid-tube materials (strength, bend rule, wall conductivity);
* ``fittings.json``: the one list of fitting and port-end families: per size the thread, the
  seal, a typical bore and the one working pressure; and the seal materials;
* ``threads.json``: thread dimensions (the ends that use each thread come from ``fittings.json``);
* ``fluids.json``: generic fluid presets and the defaults of a custom fluid.

Every row is read-only (``calc.data.frozen``): the engine never edits a table.
"""
from __future__ import annotations

import json
import re
from functools import lru_cache
from importlib import resources

from .frozen import FrozenDict, freeze

__all__ = ["load", "hose_classes", "find_class", "typical_hose_walls", "tube_materials", "fitting_families",
           "seals", "threads", "ends", "find_thread", "fluid_presets", "custom_fluid_defaults", "size_row",
           "end_families", "seal_words", "port_words", "thread_seats", "family_rating", "starting_job"]


@lru_cache(maxsize=None)
def load(name: str) -> FrozenDict:
    """The table ``calc/data/<name>``, parsed once and read-only.

    Examples
    --------
    >>> load("tubes.json")["materials"][0]["material"]
    'steel-low-carbon'
    """
    text = (resources.files(__package__) / name).read_text(encoding="utf-8")
    return freeze(json.loads(text))


def _key(name: str) -> str:
    return " ".join(str(name).replace("-", " ").casefold().split())


@lru_cache(maxsize=1)
def hose_classes() -> FrozenDict:
    """Hose classes from ``hoses.json`` by their name (``'SAE 100R2AT'`` ...)."""
    return FrozenDict({c["class"]: c for c in load("hoses.json")["classes"]})


def find_class(name: str) -> FrozenDict | None:
    """The hose class named ``name``, ignoring case, spacing and the standard prefix.

    Examples
    --------
    >>> find_class("100r2at")["class"], find_class("en 853 2sn")["standard"]
    ('SAE 100R2AT', 'EN 853')
    """
    k = _key(name)
    for cname, c in hose_classes().items():
        ck = _key(cname)
        if k == ck or ck.endswith(" " + k) and (ck.startswith("sae ") or ck.startswith("en 853 ")):
            return c
    return None


def typical_hose_walls() -> tuple:
    """Typical hose wall by bore: rows ``{bore_mm, wall_mm, source}``, in order of bore."""
    return load("hoses.json")["typical_walls"]


@lru_cache(maxsize=1)
def tube_materials() -> FrozenDict:
    """Tube materials from ``tubes.json`` by key (``'steel-low-carbon'`` ...)."""
    return FrozenDict({m["material"]: m for m in load("tubes.json")["materials"]})


@lru_cache(maxsize=1)
def fitting_families() -> FrozenDict:
    """Fitting families from ``fittings.json`` by key (``'jic-37'`` ...)."""
    return FrozenDict({f["family"]: f for f in load("fittings.json")["families"]})


def seals() -> FrozenDict:
    """Seal materials (``nbr``, ``fkm``, ``metal``) with their temperature range."""
    return load("fittings.json")["seals"]


def size_row(rows, dash):
    """The row of ``rows`` whose ``dash`` is ``dash``, or None.

    Examples
    --------
    The -6 row of SAE 100R2AT: 3/8 in bore (SAE J517, from memory), kept as 9.52 mm in the table:

    >>> size_row(hose_classes()["SAE 100R2AT"]["sizes"], 6)["bore_mm"]
    9.52
    """
    for r in rows:
        if r["dash"] == dash:
            return r
    return None


def family_rating(fam, row=None):
    """The one working pressure of a fitting family at a size row: the row's, or the family's own
    figure where it does not vary by size (banjo bolts, barbs); None when neither is tabulated.

    Examples
    --------
    The table's figures (from memory): JIC -6 310.3 bar (SAE J514, the lower of two recalled figures), banjo
    bolts 160 bar for every size (from memory, low confidence):

    >>> fam = fitting_families()["jic-37"]
    >>> family_rating(fam, size_row(fam["sizes"], 6)), family_rating(fitting_families()["banjo"])
    (310.3, 160.0)
    """
    if fam.get("working_bar") is not None:
        return fam["working_bar"]
    return row.get("working_bar") if row is not None else None


@lru_cache(maxsize=1)
def _end_rows() -> tuple:
    """Every size row of every family as a fitting-end row, with its family and its one rating."""
    out = []
    for fam in fitting_families().values():
        for row in fam["sizes"]:
            if row.get("seal") is None:
                continue  # a size only the fitting table knows (no thread: not a port end)
            src = row.get("source") or fam.get("rating_source")
            out.append(FrozenDict(row, family=fam["family"], working_bar=family_rating(fam, row),
                                  rating_source=src, source=fam["source"]))
    return tuple(out)


@lru_cache(maxsize=1)
def _thread_tables() -> FrozenDict:
    uses: dict[str, list] = {t["designation"]: [] for t in load("threads.json")["threads"]}
    for e in _end_rows():
        if e["thread"] is not None:
            uses[e["thread"]].append(e)
    return FrozenDict({t["designation"]: FrozenDict(t, ends=tuple(uses[t["designation"]]))
                       for t in load("threads.json")["threads"]})


def threads() -> FrozenDict:
    """Thread rows by designation, each with ``ends``: the fitting-end rows that use the thread.

    Examples
    --------
    >>> row = threads()["9/16-18 UNF"]
    >>> round(row["major_mm"], 4), sorted({e["family"] for e in row["ends"]})
    (14.2875, ['banjo', 'jic-37', 'orb'])
    """
    return _thread_tables()


def ends() -> tuple:
    """Every fitting-end row (a family's size rows with a thread or barb): family, size, dash, thread,
    seal, working_bar (the family's one figure), bore_mm, sources.

    Examples
    --------
    >>> [e["thread"] for e in ends() if e["family"] == "cone-24-l" and e["size"] == "10L"]
    ['M16x1.5']
    """
    return _end_rows()


def _norm(text: str) -> str:
    s = text.strip().replace("\u00d7", "x").replace("X", "x")
    s = re.sub(r"\s+", " ", s)
    return s.upper()


def find_thread(designation) -> FrozenDict | None:
    """The thread row for a designation (case and spacing ignored), or ``None``.

    Examples
    --------
    >>> find_thread("m16 x 1.5")["designation"]
    'M16x1.5'
    >>> find_thread("1/4 bspp")["tpi"]
    19
    >>> find_thread("M17x1") is None
    True
    """
    if not isinstance(designation, str):
        return None
    key = _norm(designation)
    key_tight = key.replace(" X ", "X").replace(" X", "X").replace("X ", "X")
    for d, t in threads().items():
        if _norm(d) in (key, key_tight):
            return t
    return None


@lru_cache(maxsize=1)
def fluid_presets() -> FrozenDict:
    """Generic fluids by preset key (``'atf-typical'`` ...), each with its values and ``source``.

    Examples
    --------
    >>> fluid_presets()["iso-vg32"]["visc_40c_cst"]
    32.0
    """
    return FrozenDict({p["preset"]: FrozenDict({k: v for k, v in p.items() if k != "preset"})
                       for p in load("fluids.json")["presets"]})


def custom_fluid_defaults() -> FrozenDict:
    """Values that fill the optional fields of a fluid given by its datasheet (mineral oil, from memory)."""
    return load("fluids.json")["custom_defaults"]["values"]


@lru_cache(maxsize=1)
def end_families() -> FrozenDict:
    """Fitting-end families of the adapter planner: ``{family: {label, standard, gender}}``, read from the
    one family table (``fittings.json``); the crimped hose stem is not a port end.

    Examples
    --------
    >>> end_families()["jic-37"]["standard"]
    'SAE J514'
    """
    return FrozenDict({k: FrozenDict(label=f["label"], standard=f["standard"], gender=f["gender"])
                       for k, f in fitting_families().items() if k != "crimp-stem"})


def seal_words() -> FrozenDict:
    """The sealing method of each port seal type, in words."""
    return load("threads.json")["seal_words"]


def thread_seats() -> tuple:
    """The answers to the thread finder's seat question: ``key``, ``label``, and the ``seals`` (seal
    types) and ``families`` (end families) of the fitting ends each answer keeps.

    >>> [s["key"] for s in thread_seats()][:3]
    ['flare-37', 'flare-45', 'inverted-flare']
    """
    return load("threads.json")["seats"]


def port_words() -> FrozenDict:
    """What a port of each seal type is, in words."""
    return load("threads.json")["port_words"]


def starting_job() -> dict:
    """A new job's starting point: one pressure, one return and one feed line of typical parts, and the
    pump and gear left empty for the user to fill in (their required fields are then named as missing).

    Examples
    --------
    >>> [line["role"] for line in starting_job()["lines"]]
    ['pressure', 'return', 'feed']
    """
    return json.loads((resources.files(__package__) / "templates" / "new-job.json").read_text(encoding="utf-8"))
