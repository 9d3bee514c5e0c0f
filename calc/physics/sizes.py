"""Dash sizes: the trade's size numbers in sixteenths of an inch.

A hose's dash size is its inside diameter in sixteenths of an inch; a rigid tube's is its
outside diameter in sixteenths (SAE J517, SAE J514; common practice of the trade).
"""
from __future__ import annotations

__all__ = ["SIXTEENTH_MM", "dash_of_mm", "bore_mm_of_dash"]

#: One sixteenth of an inch, [mm] (1 in = 25.4 mm exactly, NIST SP 811).
SIXTEENTH_MM = 25.4 / 16.0
#: A diameter within this many sixteenths of a whole dash counts as that size (a stated choice).
DASH_NEAR_SIXTEENTHS = 0.15


def dash_of_mm(mm: float) -> tuple[int, float, bool]:
    """Nearest dash size of a diameter.

    Parameters
    ----------
    mm : float
        Inside diameter of a hose or outside diameter of a tube, [mm]; > 0.

    Returns
    -------
    dash : int
        Nearest whole dash size, [sixteenths of an inch].
    sixteenths : float
        The diameter in sixteenths of an inch, [-].
    near : bool
        Whether the diameter is within ``DASH_NEAR_SIXTEENTHS`` of that size.

    Examples
    --------
    3/8 in (9.525 mm) is -6 exactly; 10 mm is nearest -6 but not close to it:

    >>> dash, sixteenths, near = dash_of_mm(9.525)
    >>> dash, round(sixteenths, 9), near
    (6, 6.0, True)
    >>> dash_of_mm(10.0)[0], dash_of_mm(10.0)[2]
    (6, False)
    """
    sixteenths = mm * 16.0 / 25.4
    dash = round(sixteenths)
    return dash, sixteenths, abs(sixteenths - dash) <= DASH_NEAR_SIXTEENTHS


def bore_mm_of_dash(dash: float) -> float:
    """Nominal diameter of a dash size, [mm].

    Examples
    --------
    >>> round(bore_mm_of_dash(6), 9)
    9.525
    """
    return dash * 25.4 / 16.0
