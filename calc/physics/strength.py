"""Wall strength of rigid tube: Barlow and Lame burst pressures, temperature derating.

References
----------
.. [1] Young, W. C., Budynas, R. G. Roark's Formulas for Stress and Strain,
   7th ed., McGraw-Hill, 2002: thick-walled cylinder under internal pressure
   (Lame) and the thin-wall hoop stress.
"""
from __future__ import annotations

from .tabulated import interpolate_flat

__all__ = ["barlow_burst_mpa", "lame_burst_mpa", "derate_factor"]


def barlow_burst_mpa(tensile_mpa: float, od_mm: float, wall_mm: float) -> float:
    r"""Burst pressure of a tube by Barlow's formula with the outside diameter.

    .. math::
        P = \frac{2 S t}{D}

    Parameters
    ----------
    tensile_mpa : float
        Minimum tensile strength S of the tube material, [MPa].
    od_mm : float
        Outside diameter D, [mm].
    wall_mm : float
        Wall thickness t, [mm]; 0 < t < D/2.

    Returns
    -------
    p_mpa : float
        Pressure at which the thin-wall hoop stress reaches S, [MPa].

    Notes
    -----
    A thin-wall result (t/D up to about 0.1); with the outside diameter it is
    never higher than Lame's thick-wall value, so it is the conservative one.

    Examples
    --------
    3/8 in x 0.035 in steel tube, S = 310 MPa: 2 x 310 x 0.889 / 9.525 = 57.87 MPa (exact):

    >>> round(barlow_burst_mpa(310.0, 9.525, 0.889), 2)
    57.87

    References
    ----------
    .. [1] Young, W. C., Budynas, R. G. Roark's Formulas for Stress and
       Strain, 7th ed., 2002, thin-walled pressure vessels.
    """
    return 2.0 * tensile_mpa * wall_mm / od_mm


def lame_burst_mpa(tensile_mpa: float, od_mm: float, wall_mm: float) -> float:
    r"""Pressure at which Lame's hoop stress at the bore reaches the tensile strength.

    .. math::
        P = S \frac{D^2 - d^2}{D^2 + d^2}, \qquad d = D - 2t

    Parameters
    ----------
    tensile_mpa : float
        Minimum tensile strength S, [MPa].
    od_mm : float
        Outside diameter D, [mm].
    wall_mm : float
        Wall thickness t, [mm]; 0 < t < D/2.

    Returns
    -------
    p_mpa : float
        Internal pressure (no external pressure), [MPa].

    Notes
    -----
    Elastic thick-walled cylinder, open ends, any wall ratio. As t/D -> 0 it
    tends to Barlow's ``2 S t / d`` with the inside diameter.

    Examples
    --------
    A thin wall tends to Barlow with the inside diameter (exact limit):

    >>> round(lame_burst_mpa(310.0, 100.0, 0.0001) / (2 * 310.0 * 0.0001 / 99.9998), 5)
    1.0

    References
    ----------
    .. [1] Young, W. C., Budynas, R. G. Roark's Formulas for Stress and
       Strain, 7th ed., 2002, thick-walled cylinder, internal pressure.
    """
    d = od_mm - 2.0 * wall_mm
    return tensile_mpa * (od_mm * od_mm - d * d) / (od_mm * od_mm + d * d)


def derate_factor(table, t_c: float) -> float:
    """Factor on a rating at temperature ``t_c`` [C] from ``[[t_c, factor], ...]`` pairs.

    Parameters
    ----------
    table : sequence of [temperature C, factor] or None
        A derating table from the part data.
    t_c : float
        Temperature, [C].

    Returns
    -------
    factor : float
        Linear between points, the first factor below the table, the last above
        it; 1.0 when there is no table, [-].

    Examples
    --------
    Halfway between two points (exact linear interpolation):

    >>> derate_factor([[24, 1.0], [100, 0.935]], 62.0)
    0.9675
    """
    if not table:
        return 1.0
    return interpolate_flat(sorted((float(a), float(b)) for a, b in table), t_c)
