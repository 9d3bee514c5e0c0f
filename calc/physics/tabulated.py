"""Reading a value from a table of measured or tabulated points.

Written by hand (a few lines): the engine may not import numpy in the browser, and ``numpy.interp``
does the same, with the same flat ends.
"""
from __future__ import annotations

__all__ = ["interpolate_flat"]


def interpolate_flat(rows, x: float) -> float:
    """A value read from rows ``[x, y]`` with x increasing: linear between rows, held at the first or
    last row's y beyond the table's ends.

    Used for the pump's flow table (flow against pump speed), temperature derating tables and the
    typical hose wall per bore.

    Parameters
    ----------
    rows : sequence of (float, float)
        Rows ``[x, y]``, x strictly increasing; at least one row.
    x : float
        Where to read.

    Returns
    -------
    y : float

    Examples
    --------
    A pump's flow table, 1000 rpm 8 L/min and 3000 rpm 6 L/min: 2000 rpm is half way, 7 L/min (exact);
    beyond the table the end values hold:

    >>> t = [[1000.0, 8.0], [3000.0, 6.0]]
    >>> interpolate_flat(t, 2000.0), interpolate_flat(t, 500.0), interpolate_flat(t, 5000.0)
    (7.0, 8.0, 6.0)
    """
    if x <= rows[0][0]:
        return rows[0][1]
    for (x0, y0), (x1, y1) in zip(rows, rows[1:]):
        if x <= x1:
            return y0 + (x - x0) / (x1 - x0) * (y1 - y0)
    return rows[-1][1]
