"""Minor losses in a line: each loss its own function, on numbers (SI).

Every coefficient K is on the velocity head of the bore named in the function
(:math:`\\Delta p = K \\rho v^2 / 2`). The geometry-only parts of a coefficient are
returned separately from the Reynolds-dependent part, so that a compiled line can take
them from fluids once and evaluate ``K = k1/Re + k_inf`` or ``K = a + b f`` at every flow.

Methods (all from ``fluids`` except where stated):

* bends: Rennels' rounded-bend coefficient (``fluids.bend_rounded``), less the
  straight friction of the arc, because the arc is already in the part's length; in laminar flow
  the excess friction of the curved arc by White's correlation (``laminar_bend_k``);
* fitting bodies: Darby 3-K (``fluids.Darby3K``) with the bore in inches as Darby's
  nominal size (an extrapolation below the smallest pipe size of the correlation's
  data, stated); a banjo is taken as two drilled 90 degree turns (common practice,
  no source);
* sharp contraction and expansion: Hooper's Reynolds-dependent methods
  (``fluids.contraction_sharp``, ``fluids.diffuser_sharp``, method='Hooper');
* reservoir entrance: K = 160/Re (the laminar term of Hooper's 2-K entrance loss, from
  memory of Hooper 1988) plus the turbulent coefficient from fluids;
* discharge into a reservoir: K = 1 turbulent (``fluids.exit_normal``), 2 laminar (the
  kinetic-energy factor of the parabolic profile, noted in ``fluids.exit_normal``), linear
  in Re between 2000 and 4000;
* a device with a measured drop, scaled with flow (hand-written: two scaling laws).

References
----------
.. [1] Hooper, W. B. "The 2-K Method Predicts Head Losses in Pipe Fittings."
   Chem. Eng., August 24, 1981, 96-100; "Calculate Head Loss Caused by Change in Pipe
   Size." Chem. Eng. 95, no. 16, November 7, 1988, 89.
.. [2] Darby, R. "Correlate Pressure Drops through Fittings." Chem. Eng.,
   July 2001, 127-130.
.. [3] Rennels, D. C., Hudson, H. M. Pipe Flow: A Practical and Comprehensive
   Guide. Wiley, 2012.
"""
from __future__ import annotations

import math

from fluids import (Darby3K, bend_rounded, contraction_sharp, diffuser_sharp, entrance_distance,
                    entrance_rounded, entrance_sharp, exit_normal, helical_laminar_fd_White)

from .friction import RE_LAMINAR, RE_TURBULENT

__all__ = ["DARBY_FITTINGS", "bend_loss_coefficients", "laminar_bend_k", "DEAN_STRAIGHT", "fitting_body_coefficients", "entrance_coefficients",
           "exit_k", "contraction_k", "expansion_k", "device_drop_pa"]

#: Fitting shape -> (Darby 3-K table entry, number of such turns); a banjo is two drilled 90 degree
#: turns (common practice, no source).
DARBY_FITTINGS = {
    "elbow-90": ("Elbow, 90°, threaded, standard, (r/D = 1)", 1),
    "elbow-45": ("Elbow, 45°, threaded standard, (r/D = 1)", 1),
    "tee-run": ("Tee, Run-through, threaded, (r/D = 1)", 1),
    "tee-branch": ("Tee, Through-branch, (as elbow), threaded, (r/D = 1)", 1),
    "banjo": ("Elbow, 90°, threaded, standard, (r/D = 1)", 2),
}


def bend_loss_coefficients(d_m: float, angle_deg: float, rc_m: float) -> tuple[float, float]:
    r"""Coefficients of a rounded bend's loss, less its arc friction: :math:`K = a + b f`.

    Rennels' rounded-bend coefficient is affine in the Darcy friction factor f, so it is
    taken from ``fluids.bend_rounded`` at f = 0 and f = 1; the arc's own straight friction,
    :math:`f \theta R/D`, is taken off because the arc is already in the part's length.

    Parameters
    ----------
    d_m : float
        Bore, [m].
    angle_deg : float
        Angle turned, [degrees].
    rc_m : float
        Centre-line radius, [m]; Rennels' method is fitted for R/D of 1 and above.

    Returns
    -------
    a, b : float
        Coefficients, [-]; K = a + b f on the bore's velocity head.

    Examples
    --------
    Equal to fluids' own coefficient less the arc friction (exact, any f):

    >>> import math
    >>> from fluids import bend_rounded
    >>> a, b = bend_loss_coefficients(0.0095, 90.0, 0.05)
    >>> k = bend_rounded(Di=0.0095, angle=90.0, fd=0.03, rc=0.05, method="Rennels")
    >>> round(a + b * 0.03 - (k - 0.03 * math.radians(90.0) * 0.05 / 0.0095), 12)
    0.0

    References
    ----------
    .. [1] Rennels, D. C., Hudson, H. M. Pipe Flow, Wiley, 2012.
    """
    k0 = bend_rounded(Di=d_m, angle=angle_deg, fd=0.0, rc=rc_m, method="Rennels")
    k_1 = bend_rounded(Di=d_m, angle=angle_deg, fd=1.0, rc=rc_m, method="Rennels")
    return k0, k_1 - k0 - math.radians(angle_deg) * rc_m / d_m


#: Below this Dean number a laminar bend adds no loss to its arc's straight friction (White 1929, as
#: ``fluids.helical_laminar_fd_White`` applies it).
DEAN_STRAIGHT = 11.6


def laminar_bend_k(re: float, d_m: float, angle_deg: float, rc_m: float) -> float:
    r"""Extra loss of a bend in laminar flow: the curved arc's friction above a straight run's.

    .. math::
        K = (f_{curved} - f_{straight}) \frac{\theta R}{D}, \qquad f_{straight} = 64/Re

    with :math:`f_{curved}` from White's curved-pipe correlation (``fluids.helical_laminar_fd_White``,
    coil diameter 2R), which returns the straight value below Dean number 11.6.

    Parameters
    ----------
    re : float
        Reynolds number in the bore, [-]; laminar (under 2000).
    d_m : float
        Bore, [m].
    angle_deg : float
        Angle turned, [degrees].
    rc_m : float
        Centre-line radius, [m].

    Returns
    -------
    K : float
        Coefficient on the bore's velocity head, [-]; 0 at low Dean number.

    Notes
    -----
    White's correlation is stated for 11.6 < De < 2000 and coils with D/Dc from 0.0004 to 0.066 (R/D
    over 7.6); tighter bends use it beyond that curvature (stated). A turbulent bend correlation
    (Rennels) applied with f = 64/Re overstates a laminar bend's loss; this replaces it in laminar flow.
    The arc's straight friction is already in the part's length, so only the excess is added.

    Examples
    --------
    At Re 100 a 90 degree bend of radius 2 D has Dean number 100 / 2 = 50; the excess is White's ratio
    less one, times 64/Re, times the arc of pi/2 x 2 bores (exact arithmetic on the correlation):

    >>> import math
    >>> de = 100 * math.sqrt(0.01 / 0.04)
    >>> ratio = 1 / (1 - (1 - (11.6 / de) ** 0.45) ** (1 / 0.45))
    >>> round(laminar_bend_k(100.0, 0.01, 90.0, 0.02) / ((ratio - 1) * 0.64 * math.pi), 9)
    1.0
    >>> laminar_bend_k(10.0, 0.01, 90.0, 0.02)   # Dean 5: no extra loss
    0.0

    References
    ----------
    .. [1] White, C. M. "Streamline Flow through Curved Pipes." Proc. R. Soc. Lond. A 123, 1929, 645-663.
    """
    f_straight = 64.0 / re
    f_curved = helical_laminar_fd_White(Re=re, Di=d_m, Dc=2.0 * rc_m)
    return (f_curved - f_straight) * math.radians(angle_deg) * rc_m / d_m


def fitting_body_coefficients(shape: str, d_m: float) -> tuple[float, float]:
    r"""Darby 3-K coefficients of a fitting body: :math:`K = k_1/Re + k_\infty`.

    Parameters
    ----------
    shape : str
        A key of :data:`DARBY_FITTINGS`; any other shape (straight, bulkhead) has no body loss
        of its own and gives (0, 0).
    d_m : float
        Bore of the fitting's passage, [m].

    Returns
    -------
    k1, k_inf : float
        Coefficients, [-], on the passage's velocity head.

    Notes
    -----
    Darby's size term uses the nominal size in inches; fluids maps a bore to NPS by the
    Schedule 40 table, which goes negative below 1/8 NPS, so the bore in inches is passed
    as the nominal size (small drilled fittings, an extrapolation: stated).

    Examples
    --------
    The coefficients reproduce ``fluids.Darby3K`` at any Reynolds number (exact):

    >>> from fluids import Darby3K
    >>> k1, k_inf = fitting_body_coefficients("elbow-90", 0.006)
    >>> name = "Elbow, 90°, threaded, standard, (r/D = 1)"
    >>> round(k1 / 500.0 + k_inf - Darby3K(Re=500.0, name=name, NPS=0.006 / 0.0254), 12)
    0.0

    References
    ----------
    .. [1] Darby, R. Chem. Eng., July 2001, 127-130.
    """
    if shape not in DARBY_FITTINGS:
        return 0.0, 0.0
    name, n = DARBY_FITTINGS[shape]
    nps = d_m / 0.0254
    c = Darby3K(Re=1e300, name=name, NPS=nps)
    return n * (Darby3K(Re=1.0, name=name, NPS=nps) - c), n * c


#: Wall of a projecting outlet pipe when none is given, as a fraction of its bore: a thin wall (a stated
#: default; Rennels' coefficient is 0.92 there, against 0.57 for a flush or thick-walled outlet).
PROJECTING_WALL_OF_BORE = 0.01


def entrance_coefficients(edge: str, d_m: float, wall_m: float | None = None) -> tuple[float, float]:
    r"""Loss of flow entering a line from a reservoir: :math:`K = 160/Re + k_\infty`.

    Parameters
    ----------
    edge : str
        'sharp' (flush, square edge: ``fluids.entrance_sharp``), 'rounded' (radius 0.15 D,
        ``fluids.entrance_rounded``) or 'projecting' (a pipe standing into the reservoir, a
        re-entrant or Borda inlet: ``fluids.entrance_distance``, Rennels' method, which depends on
        the pipe's wall thickness).
    d_m : float
        Bore, [m].
    wall_m : float, optional
        Wall thickness of a projecting pipe, [m]; without it a thin wall,
        ``PROJECTING_WALL_OF_BORE`` x bore.

    Returns
    -------
    k1, k_inf : float
        160 (the laminar term of Hooper's 2-K entrance loss, from memory of Hooper 1988) and the
        turbulent coefficient, [-].

    Notes
    -----
    Rennels: K = 1.12 - 22 t/d + 216 (t/d)^2 + 80 (t/d)^3 for t/d < 0.05, the flush value 0.57 above:
    a thick-walled projecting pipe loses as little as a flush one.

    Examples
    --------
    A sharp flush entrance has the turbulent coefficient 0.57 (``fluids.entrance_sharp``); a thin
    projecting one 0.92, Rennels' formula at t/d = 0.01: 1.12 - 0.22 + 0.0216 + 0.00008:

    >>> entrance_coefficients("sharp", 0.01)
    (160.0, 0.57)
    >>> round(entrance_coefficients("projecting", 0.01)[1], 5)
    0.92168
    """
    if edge == "rounded":
        k_inf = entrance_rounded(Di=d_m, rc=0.15 * d_m)
    elif edge == "projecting":
        t = wall_m if wall_m is not None else PROJECTING_WALL_OF_BORE * d_m
        k_inf = entrance_distance(Di=d_m, t=t, method="Rennels")
    else:
        k_inf = entrance_sharp()
    return 160.0, k_inf


def exit_k(re: float) -> float:
    """Loss coefficient of a discharge into a reservoir, by Reynolds number.

    Parameters
    ----------
    re : float
        Reynolds number in the discharging bore, [-].

    Returns
    -------
    K : float
        2 in laminar flow (Re <= 2000: the kinetic-energy factor of the parabolic profile),
        1 in turbulent flow (Re >= 4000, ``fluids.exit_normal``), linear in Re between, [-].

    Examples
    --------
    >>> exit_k(1000.0), exit_k(3000.0), exit_k(5000.0)
    (2.0, 1.5, 1.0)
    """
    k_turb = exit_normal()
    if re <= RE_LAMINAR:
        return 2.0
    if re >= RE_TURBULENT:
        return k_turb
    return 2.0 + (re - RE_LAMINAR) / (RE_TURBULENT - RE_LAMINAR) * (k_turb - 2.0)


def contraction_k(d1_m: float, d2_m: float, re_upstream: float) -> float:
    """Sharp contraction from bore ``d1_m`` to the smaller ``d2_m`` by Hooper's method.

    Parameters
    ----------
    d1_m, d2_m : float
        Upstream (larger) and downstream bores, [m].
    re_upstream : float
        Reynolds number of the upstream (larger) bore: Hooper's method, as
        ``fluids.contraction_sharp`` implements it, takes the Reynolds number and friction factor
        of the original pipe; it also switches between its laminar and turbulent forms there.

    Returns
    -------
    K : float
        Coefficient on the downstream (smaller bore's) velocity head, [-].

    Examples
    --------
    Equal to fluids' own value (exact):

    >>> from fluids import contraction_sharp
    >>> contraction_k(0.012, 0.006, 1658.0) == contraction_sharp(Di1=0.012, Di2=0.006, Re=1658.0, method="Hooper")
    True
    """
    return contraction_sharp(Di1=d1_m, Di2=d2_m, Re=re_upstream, method="Hooper")


def expansion_k(d1_m: float, d2_m: float, re_upstream: float) -> float:
    """Sharp expansion from bore ``d1_m`` to the larger ``d2_m`` by Hooper's method.

    Parameters
    ----------
    d1_m, d2_m : float
        Upstream (smaller) and downstream bores, [m].
    re_upstream : float
        Reynolds number in the upstream bore, [-].

    Returns
    -------
    K : float
        Coefficient on the upstream (smaller bore's) velocity head, [-].

    Examples
    --------
    Below Re 4000 Hooper (1988) gives K = 2 (1 - (d1/d2)^4): 1.875 for a doubling of the bore:

    >>> round(expansion_k(0.006, 0.012, 1000.0), 12)
    1.875
    """
    return diffuser_sharp(Di1=d1_m, Di2=d2_m, Re=re_upstream, method="Hooper")


def device_drop_pa(dp0_pa: float, q_m3_s: float, q0_m3_s: float, nu_m2_s: float, nu0_m2_s: float | None,
                   scaling: str) -> float:
    r"""Pressure drop of a device (cooler, series valve) scaled from one measured point.

    .. math::
        \Delta p = \Delta p_0 \frac{Q}{Q_0}\frac{\nu}{\nu_0} \ \text{(viscous)}, \qquad
        \Delta p = \Delta p_0 \left(\frac{Q}{Q_0}\right)^2 \ \text{(inertial)}

    Parameters
    ----------
    dp0_pa : float
        Measured drop, [Pa].
    q_m3_s, q0_m3_s : float
        Flow now and at the measurement, [m^3/s].
    nu_m2_s, nu0_m2_s : float
        Viscosity now and at the measurement, [m^2/s]; with no measured viscosity the viscous
        law scales with flow only.
    scaling : str
        'viscous' (laminar passages: Hagen-Poiseuille scaling) or 'inertial' (orifices).

    Returns
    -------
    dp : float
        Drop, [Pa]; 0 at no flow.

    Notes
    -----
    Hand-written: these are the two limiting laws of passage flow (exact for a purely
    laminar passage and for a pure orifice), not a library correlation.

    Examples
    --------
    Twice the flow: twice the drop (viscous), four times the drop (inertial):

    >>> device_drop_pa(1e5, 2.0, 1.0, 1e-5, 1e-5, "viscous"), device_drop_pa(1e5, 2.0, 1.0, 1e-5, None, "inertial")
    (200000.0, 400000.0)
    """
    if q_m3_s <= 0.0:
        return 0.0
    ratio = q_m3_s / q0_m3_s
    if scaling == "viscous":
        nu_ratio = nu_m2_s / nu0_m2_s if nu0_m2_s else 1.0
        return dp0_pa * ratio * nu_ratio
    return dp0_pa * ratio * ratio
