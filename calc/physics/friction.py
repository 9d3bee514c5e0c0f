"""Darcy friction factor of a round pipe over all regimes, and the flow regime.

References
----------
.. [1] Colebrook, C. F. "Turbulent Flow in Pipes." J. ICE 11, 1939, 133-156.
.. [2] Clamond, D. "Efficient Resolution of the Colebrook Equation."
   Ind. Eng. Chem. Res. 48, 2009, 3665-3671.
"""
from __future__ import annotations

from fluids import friction_factor as _ff_fluids

__all__ = ["RE_LAMINAR", "RE_TURBULENT", "friction_factor", "regime"]

#: Upper end of laminar flow and lower end of turbulent flow in a round pipe (common practice).
RE_LAMINAR = 2000.0
RE_TURBULENT = 4000.0


def friction_factor(re: float, rel_roughness: float = 0.0) -> float:
    r"""Darcy friction factor for a round pipe over all regimes.

    .. math::
        f = 64/Re \quad (Re < 2000); \qquad
        \frac{1}{\sqrt f} = -2\log_{10}\left(\frac{\epsilon/D}{3.7}
        + \frac{2.51}{Re\sqrt f}\right) \quad (Re > 4000)

    with linear interpolation in Re between 2000 and 4000.

    Parameters
    ----------
    re : float
        Reynolds number, [-]; must be > 0.
    rel_roughness : float
        Relative roughness epsilon/D, [-]; Colebrook is fitted for 0 to 0.05.

    Returns
    -------
    f : float
        Darcy friction factor, [-].

    Notes
    -----
    Laminar: Hagen-Poiseuille (exact). Turbulent: Clamond's solution of Colebrook
    (``fluids.friction_factor``, Method='Clamond'). The band 2000-4000 is a stated
    engineering choice that keeps the drop continuous, not a measured law.

    Examples
    --------
    Hagen-Poiseuille, exact:

    >>> round(friction_factor(1000.0), 12)
    0.064

    Turbulent: the result satisfies Colebrook's equation itself (residual zero):

    >>> import math
    >>> f = friction_factor(1e5, 1e-4)
    >>> abs(1 / math.sqrt(f) + 2 * math.log10(1e-4 / 3.7 + 2.51 / (1e5 * math.sqrt(f)))) < 1e-9
    True

    References
    ----------
    .. [1] Colebrook, C. F. J. ICE 11, 1939, 133-156.
    .. [2] Clamond, D. Ind. Eng. Chem. Res. 48, 2009, 3665-3671.
    """
    if re < RE_LAMINAR:
        return 64.0 / re
    if re > RE_TURBULENT:
        return _ff_fluids(Re=re, eD=rel_roughness, Method="Clamond")
    f_lam = 64.0 / RE_LAMINAR
    f_turb = _ff_fluids(Re=RE_TURBULENT, eD=rel_roughness, Method="Clamond")
    w = (re - RE_LAMINAR) / (RE_TURBULENT - RE_LAMINAR)
    return f_lam + w * (f_turb - f_lam)


def regime(re: float) -> str:
    """Flow regime by Reynolds number: 'laminar', 'transitional' (2000-4000, flagged),
    'turbulent'; 'no flow' at Re = 0.

    Examples
    --------
    >>> regime(1500.0), regime(3000.0), regime(5000.0), regime(0.0)
    ('laminar', 'transitional', 'turbulent', 'no flow')
    """
    if re <= 0.0:
        return "no flow"
    if re < RE_LAMINAR:
        return "laminar"
    if re <= RE_TURBULENT:
        return "transitional"
    return "turbulent"
