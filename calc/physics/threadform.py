"""Thread form: the basic minor diameter of an internal thread, what inside calipers read.

References
----------
.. [1] ASME B1.1, Unified Inch Screw Threads; ISO 68-1, ISO general purpose screw threads,
   basic profile (60 deg form: thread height H = 0.866025 P, minor = major - 1.082532 P).
.. [2] ISO 228-1, Pipe threads where pressure-tight joints are not made on the threads
   (55 deg Whitworth form: minor = major - 1.280654 P).
.. [3] ASME B1.20.1, Pipe Threads, General Purpose, Inch (NPT: truncated thread height 0.8 P).
"""
from __future__ import annotations

__all__ = ["MINOR_FACTOR", "basic_minor_diameter_mm"]

#: Thread form -> major-to-minor difference per unit pitch, [-] (the standards above).
MINOR_FACTOR = {"60-deg": 1.082532, "55-deg": 1.280654, "60-deg-npt": 1.6}


def basic_minor_diameter_mm(major_mm: float, pitch_mm: float, form: str) -> float:
    """Basic minor diameter of an internal thread, ``D - factor x P``.

    Parameters
    ----------
    major_mm : float
        Basic major diameter (at the gauge plane for a tapered thread), [mm].
    pitch_mm : float
        Pitch, [mm].
    form : str
        A key of :data:`MINOR_FACTOR`: '60-deg' (UN, metric), '55-deg' (BSPP, BSPT) or
        '60-deg-npt'.

    Returns
    -------
    d1 : float
        Minor diameter, [mm].

    Examples
    --------
    ISO 724 lists D1 = 14.376 mm for M16x1.5; ISO 228-1 lists 11.445 mm for 1/4 BSPP
    (13.157 mm major, 19 tpi) (both from memory):

    >>> round(basic_minor_diameter_mm(16.0, 1.5, "60-deg"), 3)
    14.376
    >>> round(basic_minor_diameter_mm(13.157, 25.4 / 19, "55-deg"), 3)
    11.445
    """
    return major_mm - MINOR_FACTOR[form] * pitch_mm
