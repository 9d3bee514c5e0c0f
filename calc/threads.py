"""Port threads: identify a thread from two measurements, and plan the adapters
between a port and the hose or tube end chosen for it.

The thread dimensions and the fitting ends that use each thread are data, in
``calc/data/threads.json`` (every row names its source; recalled values are
marked "from memory" and must be checked against the named standard before
anyone relies on them). This module is hand-written: no library we ship to
the browser carries thread tables or fitting-end rules.

Measurement convention (what the user gives)
--------------------------------------------
* Male thread: the **major diameter**, calipers across the crests. A real male
  thread reads a little under its basic major diameter: the class 2A / 6g
  tolerance puts it 0.03-0.27 mm under (for example 9/16-18 UNF-2A: major
  0.5611-0.5524 in; M16x1.5-6g: 15.968-15.732 mm, ASME B1.1 and ISO 965-1,
  from memory), crests are truncated and worn. Accepted: **0.35 mm under to
  0.10 mm over** the expected diameter (common practice, no source).
* Female thread: the **minor diameter**, inside calipers across the crests of
  the internal thread (the smallest bore of the threaded hole). The expected
  reading is the basic minor diameter of the thread form: ``D - 1.082532 P``
  for 60 deg threads (UN, metric; ASME B1.1, ISO 68-1), ``D - 1.280654 P`` for
  55 deg Whitworth-form threads (BSPP, BSPT; ISO 228-1, ISO 7-1) and
  ``gauge major - 1.6 P`` for NPT (truncated thread height 0.8 P, ASME
  B1.20.1). Internal minor diameters run large (6H / 2B minor tolerance about
  0.2-0.4 mm for these pitches, from memory). Accepted: **0.10 mm under to
  0.40 mm over** (common practice, no source).
* Tapered threads (NPT, BSPT; taper 1:16 on diameter): measure a male thread at
  its large end, at the last full thread; measure a female thread at its
  mouth. The expected reading is the diameter at the gauge plane; because the
  reading depends on where the jaws sit, the window is widened on both sides by
  ``gauge length / 16`` (the diameter change over the hand-tight engagement),
  0.25-0.65 mm for the sizes tabled.
* Pitch: from a thread gauge (exact) in threads per inch or mm. Accepted within
  **1 %** of the table pitch (common practice, no source): 18 tpi (1.411 mm) and
  1.5 mm differ by 6 %, 19 and 18 tpi by 5 %, 20 tpi (1.270 mm) and 1.25 mm by
  1.6 %.

Threads that agree in diameter and pitch within these tolerances cannot be
told apart by calipers and a pitch gauge; the result says so (thread angle,
55 deg against 60 deg, and taper then decide).

Ports and line ends (for ``plan_adapters``)
-------------------------------------------
A port is described by its thread and its seal type (``calc.model.SEAL_TYPES``).
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

import json
import math
import re
import sys
from fractions import Fraction
from functools import lru_cache
from pathlib import Path

from . import model

__all__ = ["TOLERANCE", "END_FAMILIES", "SEAL_WORDS", "PORT_WORDS", "thread_table", "end_table", "find_thread",
           "expected_reading_mm", "identify", "parse_length", "parse_pitch", "plan_adapters",
           "plan_for_port", "adapter_parts", "main_thread"]

_DATA = Path(__file__).resolve().parent / "data" / "threads.json"

#: Tolerances used by :func:`identify` (see the module docstring for the reasoning).
TOLERANCE = {
    "male_under_mm": 0.35, "male_over_mm": 0.10,
    "female_under_mm": 0.10, "female_over_mm": 0.40,
    "pitch_percent": 1.0,
    "taper_widening": "gauge length / 16 on both sides (tapered threads only)",
    "source": "common practice, no source; allowances after ASME B1.1 class 2A/2B and ISO 965-1 6g/6H (from memory)",
}

#: The end families known to the adapter planner, with label, standard and gender.
END_FAMILIES = {
    "jic-37": ("37 deg flare", "SAE J514", "female"),
    "orb": ("O-ring boss stud", "SAE J1926", "male"),
    "inverted-flare-45": ("45 deg inverted-flare tube nut", "SAE J512", "male"),
    "flare-45-sae": ("45 deg flare swivel", "SAE J512", "female"),
    "cone-24-l": ("24 deg cone, light series", "ISO 8434-1", "female"),
    "cone-24-s": ("24 deg cone, heavy series", "ISO 8434-1", "female"),
    "metric-oring-port": ("metric O-ring stud", "ISO 6149", "male"),
    "metric-washer-port": ("metric stud with washer", "ISO 9974", "male"),
    "bspp-port": ("BSPP stud with bonded washer", "ISO 1179", "male"),
    "pipe-npt": ("pipe thread", "ASME B1.20.1", "male"),
    "pipe-bspt": ("pipe thread", "ISO 7-1", "male"),
    "banjo": ("banjo and bolt", "common practice", "male"),
    "barb-clamp": ("hose barb with clamp", "common practice", "hose"),
}

#: The sealing method of each seal type, in words.
SEAL_WORDS = {
    "flare-37": "flare cone (37 deg)", "flare-45": "flare cone (45 deg)",
    "cone-24": "24 deg cone (cutting ring or O-ring)", "oring-boss": "O-ring",
    "metric-oring": "O-ring", "crush-washer": "crush washer (bonded or copper)",
    "pipe-taper": "thread sealant (tapered thread)", "hose-barb": "hose clamp on a barb",
    "unknown": "unknown",
}

#: What a port of each seal type is, in words.
PORT_WORDS = {
    "flare-37": "37 deg flare stub", "flare-45": "inverted-flare port", "cone-24": "24 deg cone stub",
    "oring-boss": "O-ring port", "metric-oring": "O-ring port", "crush-washer": "washer-face port",
    "pipe-taper": "tapered pipe port", "hose-barb": "barbed nipple", "unknown": "port",
}

_MINOR_FACTOR = {"60-deg": 1.082532, "55-deg": 1.280654, "60-deg-npt": 1.6}
_MALE_STUB_SEALS = ("flare-37", "cone-24")


class _Bad(ValueError):
    """Bad input; ``str()`` is a one-line message naming the argument."""


# -- tables -----------------------------------------------------------------
@lru_cache(maxsize=1)
def _load() -> dict:
    with open(_DATA, encoding="utf-8") as fh:
        doc = json.load(fh)
    threads = {t["designation"]: dict(t) for t in doc["threads"]}
    for t in threads.values():
        t["ends"] = []
    for e in doc["ends"]:
        if e["thread"] is not None:
            threads[e["thread"]]["ends"].append(e)
    return {"threads": threads, "ends": doc["ends"]}


def thread_table() -> list[dict]:
    """All thread rows, each with the fitting ends that use it.

    Returns
    -------
    list of dict
        Rows of ``calc/data/threads.json`` (``designation``, ``family``,
        ``form``, ``major_mm``, ``pitch_mm``, ``tpi``, ``tapered``, for tapered
        threads ``gauge_major_mm`` and ``gauge_length_mm``, ``source``) plus
        ``ends``: the end rows (family, size, seal, ...) that use the thread.

    Examples
    --------
    >>> row = [t for t in thread_table() if t["designation"] == "9/16-18 UNF"][0]
    >>> round(row["major_mm"], 4), sorted({e["family"] for e in row["ends"]})
    (14.2875, ['banjo', 'jic-37', 'orb'])
    """
    return [dict(t) for t in _load()["threads"].values()]


def end_table() -> list[dict]:
    """All fitting-end rows: family, size, thread, seal, working_bar, bore_mm, sources.

    Examples
    --------
    >>> [e["thread"] for e in end_table() if e["family"] == "cone-24-l" and e["size"] == "10L"]
    ['M16x1.5']
    """
    return [dict(e) for e in _load()["ends"]]


def _norm(text: str) -> str:
    s = text.strip().replace("\u00d7", "x").replace("X", "x")
    s = re.sub(r"\s+", " ", s)
    return s.upper()


def find_thread(designation: str) -> dict | None:
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
    for d, t in _load()["threads"].items():
        if _norm(d) in (key, key_tight):
            return dict(t)
    return None


def expected_reading_mm(thread: dict, male: bool = True) -> float:
    """Caliper reading expected on a thread, under the convention of this module.

    Parameters
    ----------
    thread : dict
        A row of :func:`thread_table`.
    male : bool
        True: major diameter of a male thread (at the gauge plane if tapered).
        False: minor diameter of a female thread (at the gauge plane if tapered).

    Returns
    -------
    float
        Diameter in mm.

    Examples
    --------
    ISO 228-1 lists the minor diameter of 1/4 BSPP as 11.445 mm (from memory):

    >>> round(expected_reading_mm(find_thread("1/4 BSPP"), male=False), 3)
    11.445
    >>> round(expected_reading_mm(find_thread("M16x1.5"), male=False), 3)   # ISO 724: D1 = 14.376
    14.376
    """
    base = thread["gauge_major_mm"] if thread["tapered"] else thread["major_mm"]
    if male:
        return base
    return base - _MINOR_FACTOR[thread["form"]] * thread["pitch_mm"]


# -- identification ---------------------------------------------------------
def _window(thread: dict, male: bool) -> tuple[float, float, float]:
    exp = expected_reading_mm(thread, male)
    under, over = ((TOLERANCE["male_under_mm"], TOLERANCE["male_over_mm"]) if male else
                   (TOLERANCE["female_under_mm"], TOLERANCE["female_over_mm"]))
    if thread["tapered"]:
        spread = thread["gauge_length_mm"] / 16.0
        under += spread
        over += spread
    return exp, exp - under, exp + over


def _seals_of(thread: dict) -> list[str]:
    out = []
    for e in thread["ends"]:
        w = SEAL_WORDS[e["seal"]]
        if w not in out:
            out.append(w)
    return out


def _uses_of(thread: dict) -> list[str]:
    out = []
    for e in thread["ends"]:
        if e["family"] not in out:
            out.append(e["family"])
    return out


def _check_number(name: str, value, lo: float, hi: float) -> float:
    if isinstance(value, bool) or not isinstance(value, (int, float)) or not math.isfinite(value):
        raise _Bad(f"{name}: must be a finite number, got {value!r}")
    if not lo < value < hi:
        raise _Bad(f"{name}: must be between {lo:g} and {hi:g}, got {value:g}")
    return float(value)


def identify(major_mm: float, pitch_mm: float, male: bool = True, tapered: bool | None = None) -> dict:
    """Rank the table threads against a caliper reading and a pitch-gauge reading.

    Parameters
    ----------
    major_mm : float
        Caliper reading in mm: for a male thread the major diameter across the
        crests; for a female thread the minor diameter across the crests of the
        internal thread (see the module docstring). Range 1-200 mm.
    pitch_mm : float
        Pitch in mm (25.4 / threads per inch). Range 0.2-10 mm.
    male : bool
        True for a male (external) thread, False for a female (internal) one.
    tapered : bool or None
        True if the thread looks tapered, False if straight, None if not known.
        A candidate whose taper disagrees is not counted as a match.

    Returns
    -------
    dict
        ``tolerance``: the tolerances used (:data:`TOLERANCE` plus the
        measurement convention); ``candidates``: every thread within tolerance,
        best first, then the two nearest threads outside it, each a dict with
        ``thread``, ``family``, ``within`` (bool), ``expected_mm`` and
        ``window_mm`` [low, high] (the accepted readings), ``fit_error_mm``
        (reading minus expected), ``pitch_error_mm`` (reading minus table),
        ``pitch_error_percent``, ``taper_ok``, ``score`` (distance in tolerance
        units: diameter error over the straight-thread tolerance of its side,
        pitch error over the pitch tolerance, combined as a hypotenuse, +2 for
        a taper mismatch; 0 = exact, lower is better; a tapered thread's wider
        window can hold readings scoring above 1), ``uses`` (end families), ``ends``
        (readable end names with size), ``seals`` (sealing methods in words),
        ``source``; ``match``: ``"good"`` or ``"none"``; ``message``: one or two
        sentences.

    Raises
    ------
    ValueError
        A reading that is not a finite number in range, naming the argument.

    Notes
    -----
    Hand-written nearest-match search over the table; the tolerances are
    common practice, the dimensions from the standards named in each row.

    Examples
    --------
    A male thread reading 14.2 mm with an 18 tpi gauge:

    >>> r = identify(14.2, 25.4 / 18)
    >>> r["match"], r["candidates"][0]["thread"], r["candidates"][0]["uses"]
    ('good', '9/16-18 UNF', ['jic-37', 'orb', 'banjo'])

    The same diameter with a 1.5 mm gauge is metric:

    >>> identify(13.95, 1.5)["candidates"][0]["thread"]
    'M14x1.5'

    A reading that fits nothing names the nearest two:

    >>> r = identify(11.5, 1.5)
    >>> r["match"], r["candidates"][0]["thread"], len(r["candidates"])
    ('none', 'M12x1.5', 2)
    """
    major_mm = _check_number("major_mm", major_mm, 1.0, 200.0)
    pitch_mm = _check_number("pitch_mm", pitch_mm, 0.2, 10.0)
    if tapered is not None and not isinstance(tapered, bool):
        raise _Bad(f"tapered: must be true, false or null, got {tapered!r}")
    under, over = ((TOLERANCE["male_under_mm"], TOLERANCE["male_over_mm"]) if male else
                   (TOLERANCE["female_under_mm"], TOLERANCE["female_over_mm"]))
    rows = []
    for t in _load()["threads"].values():
        exp, lo, hi = _window(t, male)
        err = major_mm - exp
        perr = pitch_mm - t["pitch_mm"]
        pn = abs(perr) / (TOLERANCE["pitch_percent"] / 100.0 * t["pitch_mm"])
        taper_ok = tapered is None or tapered == t["tapered"]
        within = lo <= major_mm <= hi and pn <= 1.0 and taper_ok
        # ranking uses the straight-thread tolerance for every thread, so that the wider
        # window of a tapered thread does not make it look a better fit than a straight one
        dn = err / over if err >= 0 else -err / under
        score = math.hypot(dn, pn) + (0.0 if taper_ok else 2.0)
        rows.append({
            "thread": t["designation"], "family": t["family"], "within": within,
            "tapered": t["tapered"],
            "expected_mm": round(exp, 3), "window_mm": [round(lo, 3), round(hi, 3)],
            "fit_error_mm": round(err, 3), "pitch_error_mm": round(perr, 4),
            "pitch_error_percent": round(100.0 * perr / t["pitch_mm"], 2),
            "taper_ok": taper_ok, "score": round(score, 3),
            "uses": _uses_of(t),
            "ends": [f"{END_FAMILIES[e['family']][0]} {e['size']} ({END_FAMILIES[e['family']][1]})"
                     for e in t["ends"]],
            "seals": _seals_of(t), "source": t["source"],
        })
    rows.sort(key=lambda c: (not c["within"], c["score"], c["thread"]))
    good = [c for c in rows if c["within"]]
    near = [c for c in rows if not c["within"]][:2]
    tol = dict(TOLERANCE)
    tol["measured"] = ("major diameter across the crests (male thread)" if male else
                       "minor diameter across the crests of the internal thread (female thread)")
    if tapered:
        tol["measured"] += "; tapered: at the large end of a male thread, at the mouth of a female one"
    if good:
        best = good[0]
        msg = (f"Best fit: {best['thread']} (diameter {best['fit_error_mm']:+.2f} mm from the expected "
               f"{best['expected_mm']:.2f} mm, pitch {best['pitch_error_percent']:+.1f} %).")
        if len(good) > 1:
            others = ", ".join(c["thread"] for c in good[1:])
            msg += (f" Also within tolerance: {others}; tell them apart by thread angle (55 deg BSP, "
                    f"60 deg UN/metric/NPT), taper, or a thread gauge of that family.")
        if tapered is None and any(c["tapered"] != best["tapered"] for c in good):
            msg += " Say whether the thread is tapered to narrow this down."
        return {"tolerance": tol, "candidates": good + near, "match": "good", "message": msg}

    def desc(c):
        return (f"{c['thread']} (diameter {c['fit_error_mm']:+.2f} mm, pitch {c['pitch_error_percent']:+.1f} %"
                f"{'' if c['taper_ok'] else ', taper differs'})")
    msg = (f"No thread in the tables fits within tolerance (diameter "
           f"-{tol['male_under_mm' if male else 'female_under_mm']:.2f}/"
           f"+{tol['male_over_mm' if male else 'female_over_mm']:.2f} mm, pitch +/-{tol['pitch_percent']:g} %). "
           f"Nearest: {' and '.join(desc(c) for c in near)}. Check the reading, the gauge and the taper.")
    return {"tolerance": tol, "candidates": near, "match": "none", "message": msg}


# -- parsing ----------------------------------------------------------------
def _number(s: str) -> Fraction:
    """'15.9', '5/8', '1-1/16', '1 1/16' -> exact Fraction."""
    s = s.strip()
    m = re.fullmatch(r"(?:(\d+)[-\s]+)?(\d+)/(\d+)", s)
    if m:
        if int(m.group(3)) == 0:
            raise ValueError("division by zero")
        return int(m.group(1) or 0) + Fraction(int(m.group(2)), int(m.group(3)))
    if not re.fullmatch(r"\d+\.?\d*|\.\d+", s):
        raise ValueError(s)
    return Fraction(s)


def parse_length(text: str) -> float:
    """Parse a caliper reading with its unit into mm.

    Parameters
    ----------
    text : str
        A number with ``mm`` or ``in`` (also ``inch``, ``"``); inches may be a
        fraction (``5/8in``, ``1-1/16in``). A unit is required.

    Returns
    -------
    float
        Length in mm (1 in = 25.4 mm exactly).

    Raises
    ------
    ValueError
        Text that is not a positive length with a unit.

    Examples
    --------
    >>> parse_length("15.9mm"), parse_length("0.625in"), parse_length("5/8 in")
    (15.9, 15.875, 15.875)
    >>> parse_length('1-1/16"')
    26.9875
    """
    if not isinstance(text, str):
        raise _Bad(f"must be text like '15.9mm' or '0.625in', got {text!r}")
    s = text.strip().lower()
    m = re.fullmatch(r"(.+?)\s*(mm|in|inch|inches|\")", s)
    if not m:
        raise _Bad(f"{text!r} is not a length with a unit (write it like '15.9mm' or '0.625in')")
    try:
        v = _number(m.group(1))
    except ValueError:
        raise _Bad(f"{text!r} is not a length with a unit (write it like '15.9mm' or '0.625in')") from None
    if v <= 0:
        raise _Bad(f"{text!r}: must be greater than 0")
    return float(v if m.group(2) == "mm" else v * Fraction("25.4"))


def parse_pitch(text: str) -> float:
    """Parse a pitch-gauge reading into mm.

    Parameters
    ----------
    text : str
        Threads per inch (``18tpi``, ``11.5 tpi``) or a pitch in mm (``1.5mm``).

    Returns
    -------
    float
        Pitch in mm (25.4 / tpi for inch gauges).

    Examples
    --------
    >>> round(parse_pitch("18tpi"), 4), parse_pitch("1.5mm")
    (1.4111, 1.5)
    """
    if not isinstance(text, str):
        raise _Bad(f"must be text like '18tpi' or '1.5mm', got {text!r}")
    s = text.strip().lower()
    m = re.fullmatch(r"(\d*\.?\d+)\s*(tpi|mm)", s)
    if not m:
        raise _Bad(f"{text!r} is not a pitch (write it like '18tpi' or '1.5mm')")
    v = float(m.group(1))
    if v <= 0:
        raise _Bad(f"{text!r}: must be greater than 0")
    return 25.4 / v if m.group(2) == "tpi" else v


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
            and e["family"] != "banjo" and END_FAMILIES[e["family"]][2] == want]


def _resolve_end(line_end: dict) -> dict:
    if not isinstance(line_end, dict):
        raise _Bad("line_end: must be an object with 'family' and a size")
    fam = line_end.get("family")
    if fam == "crimp-stem":
        raise _Bad("line_end.family: 'crimp-stem' is the hose side of a fitting; give the end that meets the "
                   "port (jic-37, orb, cone-24-l, ...)")
    if fam not in END_FAMILIES:
        raise _Bad(f"line_end.family: must be one of {', '.join(map(repr, END_FAMILIES))}, got {fam!r}")
    rows = [e for e in _load()["ends"] if e["family"] == fam]
    if line_end.get("thread") is not None:
        t = find_thread(line_end["thread"])
        if t is None:
            raise _Bad(f"line_end.thread: {line_end['thread']!r} is not in the thread tables")
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
        raise _Bad("line_end: give its size: 'dash', 'tube_od_mm' or 'thread'")
    if not pick:
        sizes = ", ".join(e["size"] for e in rows)
        raise _Bad(f"line_end: no {fam} end with {what} in the tables (sizes: {sizes})")
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
    label, std, _ = END_FAMILIES[e["family"]]
    return f"{label} {e['size']} ({std})"


def _refuse(msg: str) -> dict:
    return {"ok": False, "adapters": [], "message": msg}


def plan_adapters(port: dict, line_end: dict) -> dict:
    """The adapters needed between a port and a chosen hose or tube end.

    Parameters
    ----------
    port : dict
        ``{"thread": designation, "seal": one of calc.model.SEAL_TYPES}``
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
    A -6 37 deg flare hose end on an ISO 6149 M16x1.5 port needs one adapter:

    >>> p = plan_adapters({"thread": "M16x1.5", "seal": "metric-oring"}, {"family": "jic-37", "dash": 6})
    >>> p["ok"], [a["name"] for a in p["adapters"]], p["adapters"][0]["working_bar"]
    (True, ['M16x1.5 metric O-ring stud (ISO 6149) male to 37 deg flare -6 (SAE J514) male'], 250)

    A 3/8 in inverted-flare tube nut fits a 5/8-18 inverted-flare port directly:

    >>> plan_adapters({"thread": "5/8-18 UNF", "seal": "flare-45"}, {"family": "inverted-flare-45", "dash": 6})["adapters"]
    []

    A tapered thread cannot make an O-ring port:

    >>> plan_adapters({"thread": "1/4 NPT", "seal": "oring-boss"}, {"family": "orb", "dash": 4})["ok"]
    False
    """
    try:
        return _plan(port, line_end)
    except _Bad as exc:
        return _refuse(str(exc))


def _plan(port: dict, line_end: dict) -> dict:
    if not isinstance(port, dict):
        raise _Bad("port: must be an object with 'thread' and 'seal'")
    seal = port.get("seal")
    if seal not in model.SEAL_TYPES:
        raise _Bad(f"port.seal: must be one of {', '.join(map(repr, model.SEAL_TYPES))}, got {seal!r}")
    if seal == "unknown":
        raise _Bad("port.seal: the port's seal is not known; look for an O-ring spot face, a flare or cone "
                   "seat, a washer face or a tapered thread before planning the end")
    end = _resolve_end(line_end)
    efam = end["family"]
    elabel, estd, egender = END_FAMILIES[efam]

    if seal == "hose-barb":
        if efam == "barb-clamp":
            return {"ok": True, "adapters": [], "message": f"The hose {end['size']} pushes onto the barbed "
                    "nipple and is clamped; check that the barb suits the hose bore. Barbs are for low-pressure "
                    "return and feed lines only."}
        return _refuse(f"The port is a barbed nipple: only a clamped low-pressure hose fits it, not a "
                       f"{_end_text(end)}; replace the nipple with a threaded port fitting.")

    th = find_thread(port.get("thread")) if port.get("thread") is not None else None
    if th is None:
        raise _Bad(f"port.thread: {port.get('thread')!r} is not in the thread tables "
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
                           and END_FAMILIES[e["family"]][2] == egender})
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
    if mates and th["tapered"] != eth["tapered"]:
        pass  # taper against parallel of one size needs an adapter like any other pair
    return _one_adapter(th, seal, pgender, prow, end)


def _one_adapter(th: dict, seal: str, pgender: str, prow: list, end: dict, note: str = "") -> dict:
    efam = end["family"]
    elabel, estd, egender = END_FAMILIES[efam]
    t = th["designation"]
    from_gender = "male" if pgender == "female" else "female"
    to_gender = {"female": "male", "male": "female", "hose": "barb"}[egender]
    if prow:
        pname = f"{END_FAMILIES[prow[0]['family']][0]} ({END_FAMILIES[prow[0]['family']][1]})"
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
    """Plan the adapters for a job-model port record (``calc.model.PORT``).

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
        calc.model.FITTING_FAMILIES)}`` per adapter, in the order of the plan.

    Raises
    ------
    ValueError
        The plan was refused (its message is the error).

    Examples
    --------
    >>> plan = plan_adapters({"thread": "3/4-16 UNF", "seal": "oring-boss"}, {"family": "jic-37", "dash": 6})
    >>> adapter_parts(plan)
    [{'kind': 'fitting', 'bore_mm': 7.1, 'shape': 'straight', 'working_bar': 345, 'family': 'jic-37', 'dash': 6}]
    """
    if not plan.get("ok"):
        raise ValueError(plan.get("message", "the adapter plan was refused"))
    parts = []
    for a in plan["adapters"]:
        p = {"kind": "fitting", "bore_mm": a["bore_mm"], "shape": "straight"}
        if a["working_bar"] is not None:
            p["working_bar"] = a["working_bar"]
        if a["family"] in model.FITTING_FAMILIES:
            p["family"] = a["family"]
            if a["dash"] is not None:
                p["dash"] = a["dash"]
        parts.append(p)
    return parts


# -- command line -------------------------------------------------------------
def _parser_class():
    # argparse is imported here, not at module level: the browser engine never parses a
    # command line, and leaving it out keeps it out of the shipped start-up bytecode.
    import argparse

    class _Parser(argparse.ArgumentParser):
        def error(self, message):  # one line, no usage dump
            raise _Bad(message)
    return _Parser


def main_thread(argv: list[str]) -> int:
    """``python -m calc thread MAJOR PITCH [--male|--female] [--tapered|--straight] [--json]``.

    MAJOR is a caliper reading with its unit (``15.9mm``, ``0.625in``,
    ``5/8in``); for a female thread it is the minor diameter across the crests.
    PITCH is ``18tpi`` or ``1.5mm``. ``--json`` prints the candidate list, best
    first. Returns the exit status: 0 when something fits, 1 when nothing fits,
    2 for bad input (one line on stderr naming the argument).

    Examples
    --------
    >>> main_thread(["15.8mm", "18tpi", "--json"]) == 0   # doctest: +ELLIPSIS
    [...
    True
    """
    p = _parser_class()(prog="python -m calc thread", description="Identify a thread from a caliper and a pitch gauge.")
    p.add_argument("major", metavar="MAJOR", help="caliper reading, e.g. 15.9mm or 0.625in")
    p.add_argument("pitch", metavar="PITCH", help="pitch, e.g. 18tpi or 1.5mm")
    g = p.add_mutually_exclusive_group()
    g.add_argument("--male", dest="male", action="store_true", default=True)
    g.add_argument("--female", dest="male", action="store_false")
    t = p.add_mutually_exclusive_group()
    t.add_argument("--tapered", dest="tapered", action="store_const", const=True, default=None)
    t.add_argument("--straight", dest="tapered", action="store_const", const=False)
    p.add_argument("--json", action="store_true")
    try:
        args = p.parse_args(argv)
    except _Bad as exc:
        print(f"thread: {exc}", file=sys.stderr)
        return 2
    except SystemExit as exc:  # --help
        return int(exc.code or 0)
    try:
        major = parse_length(args.major)
    except _Bad as exc:
        print(f"thread: MAJOR: {exc}", file=sys.stderr)
        return 2
    try:
        pitch = parse_pitch(args.pitch)
    except _Bad as exc:
        print(f"thread: PITCH: {exc}", file=sys.stderr)
        return 2
    try:
        r = identify(major, pitch, male=args.male, tapered=args.tapered)
    except _Bad as exc:
        name = "MAJOR" if str(exc).startswith("major") else "PITCH"
        print(f"thread: {name}: {exc}", file=sys.stderr)
        return 2
    if args.json:
        print(json.dumps(r["candidates"], indent=1))
        return 0 if r["match"] == "good" else 1
    tol = r["tolerance"]
    side = "male" if args.male else "female"
    print(f"Reading: {major:.3f} mm ({major / 25.4:.4f} in), pitch {pitch:.4f} mm ({25.4 / pitch:.2f} tpi), {side}"
          + ("" if args.tapered is None else (", tapered" if args.tapered else ", straight")))
    print(f"Measured as: {tol['measured']}")
    u, o = (("male_under_mm", "male_over_mm") if args.male else ("female_under_mm", "female_over_mm"))
    print(f"Tolerance: diameter -{tol[u]:.2f}/+{tol[o]:.2f} mm (tapered: widened by gauge length/16), "
          f"pitch +/-{tol['pitch_percent']:g} % ({tol['source']})")
    print()
    print(f"{'thread':<14} {'fits':<5} {'diam mm':>8} {'pitch %':>8}  seals / used by")
    for c in r["candidates"]:
        print(f"{c['thread']:<14} {'yes' if c['within'] else 'no':<5} {c['fit_error_mm']:>+8.2f} "
              f"{c['pitch_error_percent']:>+8.1f}  {', '.join(c['seals']) or '-'}")
        if c["ends"]:
            print(f"{'':<38}{'; '.join(c['ends'])}")
    print()
    print(r["message"])
    print("Dimensions are recalled from the named standards: confirm against the standard or the maker's data.")
    return 0 if r["match"] == "good" else 1
