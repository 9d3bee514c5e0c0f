"""Thread identification: rank the table threads against a caliper and a pitch-gauge reading.

The thread dimensions and the fitting ends that use each thread are data, in
``calc/data/threads.json`` (every row names its source; recalled values are
marked "from memory" and must be checked against the named standard before
anyone relies on them). This module is hand-written: no library we ship to
the browser carries thread tables. The tolerances are
``calc.data.practice.THREAD_TOLERANCE``.

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
* Pitch reading in mm over 6 mm (``METRIC_PITCH_MAX_MM``): no metric pitch is that coarse
  (ISO 261 ends at 6 mm, M68 and up, from memory), so a reading like "18" is read as threads
  per inch and the answer says so in words (common practice, no source).
* Seat or sealing face (optional, ``calc.data.tables.thread_seats``): a thread none of whose
  fitting ends has that seat is not counted as a match (like a taper that disagrees), and only
  the ends with that seat are offered for the port.
* Pitch: from a thread gauge (exact) in threads per inch or mm. Accepted within
  **1 %** of the table pitch (common practice, no source): 18 tpi (1.411 mm) and
  1.5 mm differ by 6 %, 19 and 18 tpi by 5 %, 20 tpi (1.270 mm) and 1.25 mm by
  1.6 %.

Threads that agree in diameter and pitch within these tolerances cannot be
told apart by calipers and a pitch gauge; the result says so (thread angle,
55 deg against 60 deg, and taper then decide).
"""

from __future__ import annotations

import math
import re
from fractions import Fraction
from functools import lru_cache

from ..data.practice import METRIC_PITCH_MAX_MM
from ..data.practice import THREAD_TOLERANCE as TOLERANCE
from ..data.tables import end_families, port_words, seal_words, thread_seats, threads
from ..model.schema import number_problem
from ..physics.threadform import basic_minor_diameter_mm
from .adapters import plan_for_port

__all__ = ["TOLERANCE", "READING_RANGES", "SEAT_KEYS", "read_pitch", "port_choices", "BadReading", "thread_table", "expected_reading_mm", "identify", "parse_length",
           "parse_pitch"]


class BadReading(ValueError):
    """A reading that is not a finite number in range; ``str()`` names the argument in one line."""


def thread_table() -> list[dict]:
    """All thread rows, each with the fitting ends that use it (``calc.data.tables.threads``).

    Examples
    --------
    >>> row = [t for t in thread_table() if t["designation"] == "9/16-18 UNF"][0]
    >>> round(row["major_mm"], 4), sorted({e["family"] for e in row["ends"]})
    (14.2875, ['banjo', 'jic-37', 'orb'])
    """
    return [dict(t) for t in threads().values()]


def expected_reading_mm(thread, male: bool = True) -> float:
    """Caliper reading expected on a thread, under the convention of this module.

    Parameters
    ----------
    thread : mapping
        A thread row (``calc.data.tables.threads``).
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

    >>> round(expected_reading_mm(threads()["1/4 BSPP"], male=False), 3)
    11.445
    """
    base = thread["gauge_major_mm"] if thread["tapered"] else thread["major_mm"]
    if male:
        return base
    return basic_minor_diameter_mm(base, thread["pitch_mm"], thread["form"])


def _window(thread, male: bool) -> tuple[float, float, float]:
    exp = expected_reading_mm(thread, male)
    under, over = ((TOLERANCE["male_under_mm"], TOLERANCE["male_over_mm"]) if male else
                   (TOLERANCE["female_under_mm"], TOLERANCE["female_over_mm"]))
    if thread["tapered"]:
        spread = thread["gauge_length_mm"] / 16.0
        under += spread
        over += spread
    return exp, exp - under, exp + over


def _seals_of(thread) -> list[str]:
    words = seal_words()
    out = []
    for e in thread["ends"]:
        w = words[e["seal"]]
        if w not in out:
            out.append(w)
    return out


def _uses_of(thread) -> list[str]:
    out = []
    for e in thread["ends"]:
        if e["family"] not in out:
            out.append(e["family"])
    return out


#: The readings ``identify`` takes, each between these bounds (exclusive): a caliper reading in mm, a pitch in mm.
#: A pitch in mm above ``METRIC_PITCH_MAX_MM`` is read as threads per inch, hence its wide range.
READING_RANGES = {"major_mm": (1.0, 200.0), "pitch_mm": (0.2, 100.0), "pitch_tpi": (2.0, 100.0)}
#: The answers to the seat question (``None``: not sure).
SEAT_KEYS = tuple(s["key"] for s in thread_seats())
_MALE_PORT_SEALS = ("flare-37", "cone-24")  # a stub on the component (calc.system.adapters)


def _check_number(name: str, value) -> float:
    lo, hi = READING_RANGES[name]
    reason = number_problem(value)
    if reason:
        raise BadReading(f"{name}: {reason}")
    if not lo < value < hi:
        raise BadReading(f"{name}: must be between {lo:g} and {hi:g}, got {value:g}")
    return float(value)


def _seat_ends(t, seat) -> list:
    """The thread's fitting ends that have the seat (all of them when the seat is not known)."""
    if seat is None:
        return list(t["ends"])
    row = next(s for s in thread_seats() if s["key"] == seat)
    return [e for e in t["ends"] if e["seal"] in row["seals"] or e["family"] in row["families"]]


def _a(words: str) -> str:
    return ("an " if words[0].lower() in "aeiou" else "a ") + words


def _port_gender(seal: str) -> str:
    return "male" if seal in _MALE_PORT_SEALS else "barb" if seal == "hose-barb" else "female"


def port_choices(t, male: bool, seat=None) -> list[dict]:
    """Ports of this thread a line end fits directly: per fitting end with the seat whose port has the
    measured gender, the port fields to write (``thread``, ``seal``, the line end's family and size)
    and the port in words. Each is checked with the adapter planner: it seals with no adapter.

    Examples
    --------
    >>> [c["text"] for c in port_choices(threads()["9/16-18 UNF"], male=False, seat="o-ring")]
    ['O-ring port for an O-ring boss stud -6 (SAE J1926)']
    """
    return [dict(c, port=dict(c["port"])) for c in _port_choices(t["designation"], male, seat)]


@lru_cache(maxsize=None)
def _port_choices(designation: str, male: bool, seat) -> tuple:
    """:func:`port_choices` of one thread, planned once (the tables do not change)."""
    t = threads()[designation]
    fams, words, out = end_families(), port_words(), []
    for e in _seat_ends(t, seat):
        if _port_gender(e["seal"]) != ("male" if male else "female"):
            continue
        size = ({"line_end_tube_od_mm": e["tube_od_mm"]} if e["family"].startswith("cone-24") else
                {"line_end_dash": e["dash"]} if e["dash"] is not None else {"line_end_thread": e["thread"]})
        port = {"thread": t["designation"], "seal": e["seal"], "line_end_family": e["family"],
                "line_end_dash": None, "line_end_tube_od_mm": None, "line_end_thread": None, **size}
        plan = plan_for_port(port)
        if not plan["ok"] or plan["adapters"]:
            continue
        std = fams[e["family"]]["standard"]
        out.append({"port": port, "family": e["family"], "seal": e["seal"],
                    "text": f"{words[e['seal']][0].upper()}{words[e['seal']][1:]} for {_a(fams[e['family']]['label'])} "
                            f"{e['size']}{f' ({std})' if std else ''}"})
    return tuple(out)


def _candidate(t, major_mm: float, pitch_mm: float, male: bool, tapered, seat=None) -> dict:
    """One thread row scored against the reading."""
    under, over = ((TOLERANCE["male_under_mm"], TOLERANCE["male_over_mm"]) if male else
                   (TOLERANCE["female_under_mm"], TOLERANCE["female_over_mm"]))
    exp, lo, hi = _window(t, male)
    err = major_mm - exp
    perr = pitch_mm - t["pitch_mm"]
    pn = abs(perr) / (TOLERANCE["pitch_percent"] / 100.0 * t["pitch_mm"])
    taper_ok = tapered is None or tapered == t["tapered"]
    seat_ends = _seat_ends(t, seat)
    seat_ok = seat is None or bool(seat_ends)
    within = lo <= major_mm <= hi and pn <= 1.0 and taper_ok and seat_ok
    # ranking uses the straight-thread tolerance for every thread, so that the wider
    # window of a tapered thread does not make it look a better fit than a straight one
    dn = err / over if err >= 0 else -err / under
    score = math.hypot(dn, pn) + (0.0 if taper_ok else 2.0) + (0.0 if seat_ok else 2.0)
    fams = end_families()
    return {
        "thread": t["designation"], "family": t["family"], "within": within,
        "tapered": t["tapered"],
        "expected_mm": round(exp, 3), "window_mm": [round(lo, 3), round(hi, 3)],
        "fit_error_mm": round(err, 3), "pitch_error_mm": round(perr, 4),
        "pitch_error_percent": round(100.0 * perr / t["pitch_mm"], 2),
        "taper_ok": taper_ok, "seat_ok": seat_ok, "score": round(score, 3),
        "uses": _uses_of(t),
        "ends": [f"{fams[e['family']]['label']} {e['size']}" + (f" ({fams[e['family']]['standard']})"
                 if fams[e["family"]]["standard"] else "") for e in t["ends"]],
        "seals": _seals_of(t), "source": t["source"],
        "port_choices": port_choices(t, male, seat),
    }


def _good_message(good: list, tapered) -> str:
    best = good[0]
    msg = (f"Best fit: {best['thread']} (diameter {best['fit_error_mm']:+.2f} mm from the expected "
           f"{best['expected_mm']:.2f} mm, pitch {best['pitch_error_percent']:+.1f} %).")
    if len(good) > 1:
        others = ", ".join(c["thread"] for c in good[1:])
        msg += (f" Also within tolerance: {others}; tell them apart by thread angle (55 deg BSP, "
                f"60 deg UN/metric/NPT), taper, or a thread gauge of that family.")
    if tapered is None and any(c["tapered"] != best["tapered"] for c in good):
        msg += " Say whether the thread is tapered to narrow this down."
    return msg


def _none_message(near: list, tol: dict, male: bool) -> str:
    def desc(c):
        return (f"{c['thread']} (diameter {c['fit_error_mm']:+.2f} mm, pitch {c['pitch_error_percent']:+.1f} %"
                f"{'' if c['taper_ok'] else ', taper differs'}{'' if c['seat_ok'] else ', no end with that seat'})")
    return (f"No thread in the tables fits within tolerance (diameter "
            f"-{tol['male_under_mm' if male else 'female_under_mm']:.2f}/"
            f"+{tol['male_over_mm' if male else 'female_over_mm']:.2f} mm, pitch +/-{tol['pitch_percent']:g} %). "
            f"Nearest: {' and '.join(desc(c) for c in near)}. Check the reading, the gauge, the taper and the seat.")


def read_pitch(pitch_mm=None, pitch_tpi=None) -> tuple[float, str | None]:
    """The pitch in mm from a gauge reading given in mm or in threads per inch, and a sentence when a
    reading in mm was read as threads per inch.

    A reading in mm above ``METRIC_PITCH_MAX_MM`` (6 mm) is no metric pitch and is read as
    threads per inch (common practice, no source).

    Examples
    --------
    >>> round(read_pitch(18)[0], 4), read_pitch(18)[1]
    (1.4111, 'A pitch of 18 mm is coarser than any metric thread (ISO 261 ends at 6 mm), so 18 was read as 18 threads per inch (1.411 mm).')
    >>> read_pitch(1.5), round(read_pitch(pitch_tpi=20)[0], 3)
    ((1.5, None), 1.27)
    """
    if pitch_mm is None and pitch_tpi is None:
        raise BadReading("pitch_mm: is missing: give the pitch in mm or in threads per inch")
    if pitch_mm is not None and pitch_tpi is not None:
        raise BadReading("pitch_tpi: give the pitch once, in mm or in threads per inch, not both")
    if pitch_tpi is not None:
        return 25.4 / _check_number("pitch_tpi", pitch_tpi), None
    mm = _check_number("pitch_mm", pitch_mm)
    if mm <= METRIC_PITCH_MAX_MM:
        return mm, None
    return 25.4 / mm, (f"A pitch of {mm:g} mm is coarser than any metric thread (ISO 261 ends at "
                       f"{METRIC_PITCH_MAX_MM:g} mm), so {mm:g} was read as {mm:g} threads per inch "
                       f"({25.4 / mm:.3f} mm).")


def identify(major_mm: float, pitch_mm: float | None = None, male: bool = True, tapered: bool | None = None,
             seat: str | None = None, pitch_tpi: float | None = None) -> dict:
    """Rank the table threads against a caliper reading and a pitch-gauge reading.

    Parameters
    ----------
    major_mm : float
        Caliper reading in mm: for a male thread the major diameter across the
        crests; for a female thread the minor diameter across the crests of the
        internal thread (see the module docstring). Range 1-200 mm.
    pitch_mm : float or None
        Pitch in mm, range 0.2-100; a reading over 6 mm is read as threads per inch
        (:func:`read_pitch`). Give this or ``pitch_tpi``.
    pitch_tpi : float or None
        Pitch in threads per inch, range 2-100.
    male : bool
        True for a male (external) thread, False for a female (internal) one.
    tapered : bool or None
        True if the thread looks tapered, False if straight, None if not known.
        A candidate whose taper disagrees is not counted as a match.
    seat : str or None
        The seat or sealing face seen at the port (:data:`SEAT_KEYS`), None if not sure.
        A thread with no fitting end of that seat is not counted as a match; the
        candidates' ``port_choices`` keep only the ends with it.

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
        ``source``, ``seat_ok``, ``port_choices`` (:func:`port_choices`); ``match``: ``"good"`` or
        ``"none"``; ``message``: one or two sentences; ``pitch_used_mm`` and ``pitch_note`` (the
        sentence of :func:`read_pitch`, or None).

    Raises
    ------
    BadReading
        A reading that is not a finite number in range, naming the argument.

    Notes
    -----
    Hand-written nearest-match search over the table; the tolerances are
    common practice, the dimensions from the standards named in each row.

    Examples
    --------
    A male thread reading 14.2 mm with an 18 tpi gauge (9/16-18 UNF, major 14.29 mm, ASME B1.1):

    >>> r = identify(14.2, 25.4 / 18)
    >>> r["match"], r["candidates"][0]["thread"], r["candidates"][0]["uses"]
    ('good', '9/16-18 UNF', ['jic-37', 'orb', 'banjo'])

    The same diameter with a 1.5 mm gauge is metric (M14x1.5, ISO 261):

    >>> identify(13.95, 1.5)["candidates"][0]["thread"]
    'M14x1.5'

    A reading that fits nothing names the nearest two:

    >>> r = identify(11.5, 1.5)
    >>> r["match"], r["candidates"][0]["thread"], len(r["candidates"])
    ('none', 'M12x1.5', 2)
    """
    major_mm = _check_number("major_mm", major_mm)
    pitch_mm, pitch_note = read_pitch(pitch_mm, pitch_tpi)
    if seat is not None and seat not in SEAT_KEYS:
        raise BadReading(f"seat: must be one of {', '.join(SEAT_KEYS)} or null, got {_quoted(seat)}")
    if not isinstance(male, bool):
        raise BadReading(f"male: must be true or false, got {_quoted(male)}")
    if tapered is not None and not isinstance(tapered, bool):
        raise BadReading(f"tapered: must be true, false or null, got {_quoted(tapered)}")
    rows = [_candidate(t, major_mm, pitch_mm, male, tapered, seat) for t in threads().values()]
    rows.sort(key=lambda c: (not c["within"], c["score"], c["thread"]))
    good = [c for c in rows if c["within"]]
    near = [c for c in rows if not c["within"]][:2]
    tol = dict(TOLERANCE)
    tol["measured"] = ("major diameter across the crests (male thread)" if male else
                       "minor diameter across the crests of the internal thread (female thread)")
    if tapered:
        tol["measured"] += "; tapered: at the large end of a male thread, at the mouth of a female one"
    extra = {"pitch_used_mm": round(pitch_mm, 5), "pitch_note": pitch_note, "seat": seat}
    if good:
        return {"tolerance": tol, "candidates": good + near, "match": "good",
                "message": _good_message(good, tapered), **extra}
    return {"tolerance": tol, "candidates": near, "match": "none", "message": _none_message(near, tol, male), **extra}


# -- parsing ----------------------------------------------------------------
#: A reading above this (mm, tpi or inches) is no caliper or gauge reading; checked before any
#: conversion to float, so a 400-digit number cannot overflow.
_LARGEST_READING = 10 ** 6


def _quoted(text) -> str:
    """The reading as given, quoted, escapes for what is no character, long ones cut."""
    s = repr(text)
    return s if len(s) <= 40 else s[:37] + "..."


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
        raise BadReading(f"must be text like '15.9mm' or '0.625in', got {text!r}")
    s = text.strip().lower()
    m = re.fullmatch(r"(.+?)\s*(mm|in|inch|inches|\")", s)
    if not m:
        raise BadReading(f"{_quoted(text)} is not a length with a unit (write it like '15.9mm' or '0.625in')")
    try:
        v = _number(m.group(1))
    except ValueError:
        raise BadReading(f"{_quoted(text)} is not a length with a unit (write it like '15.9mm' or '0.625in')") from None
    if v <= 0:
        raise BadReading(f"{_quoted(text)}: must be greater than 0")
    if v > _LARGEST_READING:
        raise BadReading(f"{_quoted(text)} is far too large for a caliper reading (write it like '15.9mm')")
    if v < Fraction(1, _LARGEST_READING):
        raise BadReading(f"{_quoted(text)} is far too small for a caliper reading (write it like '15.9mm')")
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
        raise BadReading(f"must be text like '18tpi' or '1.5mm', got {text!r}")
    s = text.strip().lower()
    m = re.fullmatch(r"(\d*\.?\d+)\s*(tpi|mm)", s)
    if not m:
        raise BadReading(f"{_quoted(text)} is not a pitch (write it like '18tpi' or '1.5mm')")
    v = Fraction(m.group(1))
    if v <= 0:
        raise BadReading(f"{_quoted(text)}: must be greater than 0")
    if v > _LARGEST_READING:
        raise BadReading(f"{_quoted(text)} is far too large for a pitch (write it like '18tpi' or '1.5mm')")
    if v < Fraction(1, _LARGEST_READING):
        raise BadReading(f"{_quoted(text)} is far too small for a pitch (write it like '18tpi' or '1.5mm')")
    return float(Fraction("25.4") / v if m.group(2) == "tpi" else v)
