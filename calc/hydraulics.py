"""Pressure drop, velocity and Reynolds number in the parts of a line.

A line is a list of parts in flow order (hose, tube, fitting, device, reservoir
entrance and exit). ``compile_line`` turns the job's parts into SI segments
once; ``line_flow`` evaluates a compiled line for one flow and one fluid state
and is the only routine the rest of the engine (circuit, hose selection,
thermal iteration) calls, so every result comes from the same physics.

Methods (all from ``fluids`` except where stated):

* straight-run friction, Darcy: ``f = 64/Re`` for Re < 2000 (exact,
  Hagen-Poiseuille); Clamond's solution of Colebrook for Re > 4000
  (``fluids.friction_factor``, Method='Clamond'); in the transition band
  2000 <= Re <= 4000 the friction factor is interpolated linearly in Re between
  the laminar value at 2000 and the Colebrook value at 4000 (a stated
  engineering choice that keeps the drop continuous, not a measured law);
* bends: Rennels' rounded-bend coefficient (``fluids.bend_rounded``, which
  depends on Re through f) less the straight friction of the arc, because the
  arc is already in the part's length;
* fitting bodies: Darby 3-K (``fluids.Darby3K``) for elbows and tees, Reynolds
  dependent, with the bore in inches as Darby's nominal size (the small drilled
  passages of hydraulic fittings lie below the smallest pipe size of the
  correlation's data: an extrapolation, stated); a banjo is taken as two drilled 90 degree turns (common practice,
  no source);
* a change of bore between two consecutive parts: sharp contraction and sharp
  expansion by Hooper's Reynolds-dependent method (``fluids.contraction_sharp``,
  ``fluids.diffuser_sharp``, method='Hooper');
* reservoir entrance: K = 160/Re (the laminar term of Hooper's 2-K entrance
  loss, from memory of Hooper 1988) plus the turbulent coefficient from
  ``fluids`` (``entrance_sharp``, ``entrance_rounded`` with r = 0.15 D,
  ``entrance_distance`` for a projecting pipe);
* discharge into the reservoir: K = 1 in turbulent flow (``fluids.exit_normal``)
  and K = 2 in laminar flow (the kinetic-energy factor of the parabolic
  profile, noted in ``fluids.exit_normal``), linear in Re between 2000 and 4000;
* elevation: rho g dz;
* a device (cooler, series booster) with a measured drop: scaled as
  viscosity x flow ('viscous') or as flow squared ('inertial').

References
----------
.. [1] Hooper, W. B. "The 2-K Method Predicts Head Losses in Pipe Fittings."
   Chem. Eng., August 24, 1981, 96-100.
.. [2] Darby, R. "Correlate Pressure Drops through Fittings." Chem. Eng.,
   July 2001, 127-130.
.. [3] Rennels, D. C., Hudson, H. M. Pipe Flow: A Practical and Comprehensive
   Guide. Wiley, 2012.
.. [4] Clamond, D. "Efficient Resolution of the Colebrook Equation."
   Ind. Eng. Chem. Res. 48, 2009, 3665-3671.
"""
from __future__ import annotations

import math

from fluids import (Darby3K, bend_rounded, contraction_sharp, diffuser_sharp, entrance_distance,
                    entrance_rounded, entrance_sharp, exit_normal)
from fluids import friction_factor as _ff_fluids

__all__ = ["RE_LAMINAR", "RE_TURBULENT", "friction_factor", "regime", "compile_line", "line_flow",
           "Segment", "VELOCITY_BANDS_M_S", "G"]

G = 9.80665  # standard gravity, m/s^2 (CGPM 1901)
RE_LAMINAR = 2000.0
RE_TURBULENT = 4000.0

#: Velocity bands by line role, m/s (common practice, no single source).
VELOCITY_BANDS_M_S = {"feed": (0.6, 1.2), "return": (1.5, 3.0), "pressure": (2.0, 6.0)}

_DARBY = {
    "elbow-90": ("Elbow, 90°, threaded, standard, (r/D = 1)", 1),
    "elbow-45": ("Elbow, 45°, threaded standard, (r/D = 1)", 1),
    "tee-run": ("Tee, Run-through, threaded, (r/D = 1)", 1),
    "tee-branch": ("Tee, Through-branch, (as elbow), threaded, (r/D = 1)", 1),
    "banjo": ("Elbow, 90°, threaded, standard, (r/D = 1)", 2),
}
_FITTING_PASSAGE_M = 0.025  # default drilled passage length of a fitting (from memory, typical stem)


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

    Examples
    --------
    >>> round(friction_factor(1000.0), 6)
    0.064
    >>> round(friction_factor(1e5, 1e-4), 5)
    0.01851

    References
    ----------
    .. [1] Colebrook, C. F. "Turbulent Flow in Pipes." J. ICE 11, 1939, 133-156.
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
    """'laminar', 'transitional' (2000-4000, flagged) or 'turbulent'; 'no flow' at Re = 0."""
    if re <= 0.0:
        return "no flow"
    if re < RE_LAMINAR:
        return "laminar"
    if re <= RE_TURBULENT:
        return "transitional"
    return "turbulent"


class Segment:
    """A part compiled to SI for repeated evaluation."""

    __slots__ = ("index", "kind", "d_m", "length_m", "eps_m", "bends", "rise_m", "shape",
                 "dp0_pa", "q0_m3_s", "nu0_m2_s", "scaling", "edge", "name",
                 "area_m2", "eps_d", "l_over_d", "bend_a", "bend_b", "k1", "k_inf")

    def __init__(self, index, kind, d_m=None, length_m=0.0, eps_m=0.0, bends=(), rise_m=0.0,
                 shape=None, dp0_pa=0.0, q0_m3_s=1.0, nu0_m2_s=None, scaling="inertial", edge="sharp",
                 name=""):
        self.index, self.kind, self.d_m, self.length_m, self.eps_m = index, kind, d_m, length_m, eps_m
        self.bends, self.rise_m, self.shape = tuple(bends), rise_m, shape
        self.dp0_pa, self.q0_m3_s, self.nu0_m2_s, self.scaling = dp0_pa, q0_m3_s, nu0_m2_s, scaling
        self.edge, self.name = edge, name
        # Coefficients fixed by the geometry, taken from fluids once here so that each
        # evaluation is K = k1/Re + k_inf + (bend_a + bend_b f): Rennels' bend coefficient is
        # affine in f and Darby's 3-K is affine in 1/Re (both checked against fluids in the tests).
        self.area_m2 = 0.25 * math.pi * d_m * d_m if d_m else 0.0
        self.eps_d = eps_m / d_m if d_m else 0.0
        self.l_over_d = length_m / d_m if d_m else 0.0
        self.bend_a = self.bend_b = self.k1 = self.k_inf = 0.0
        if kind in ("hose", "tube"):
            for angle, rc in self.bends:
                k0 = bend_rounded(Di=d_m, angle=angle, fd=0.0, rc=rc, method="Rennels")
                k_1 = bend_rounded(Di=d_m, angle=angle, fd=1.0, rc=rc, method="Rennels")
                self.bend_a += k0
                self.bend_b += k_1 - k0 - math.radians(angle) * rc / d_m  # less the arc's own friction
        elif kind == "fitting" and shape in _DARBY:
            name_, n = _DARBY[shape]
            # Darby's size term uses the nominal size in inches; fluids maps a bore to NPS by
            # the Schedule 40 table, which goes negative below 1/8 NPS, so the bore in inches
            # is passed as the nominal size (small drilled fittings).
            nps = d_m / 0.0254
            c = Darby3K(Re=1e300, name=name_, NPS=nps)
            self.k_inf = n * c
            self.k1 = n * (Darby3K(Re=1.0, name=name_, NPS=nps) - c)
        elif kind == "entrance":
            self.k1 = 160.0
            self.k_inf = _entrance_k(edge, d_m)


def part_bore_mm(part: dict) -> float | None:
    """Flow bore of a validated part, mm (hose bore filled from its class by ratings)."""
    k = part["kind"]
    if k == "tube":
        return part["od_mm"] - 2.0 * part["wall_mm"]
    if k == "device":
        return None
    return part.get("bore_mm")


def compile_line(parts: list[dict]) -> list[Segment]:
    """Compile a line's validated parts (job units) into SI segments.

    Hose parts must carry ``bore_mm`` (the ratings module fills it from a named
    class and dash size before this is called).
    """
    segs = []
    for i, p in enumerate(parts):
        k = p["kind"]
        if k in ("hose", "tube"):
            bends = tuple((b["angle_deg"], b["radius_mm"] * 1e-3) for b in p.get("bends") or ())
            segs.append(Segment(i, k, part_bore_mm(p) * 1e-3, p["length_m"], p["roughness_mm"] * 1e-3,
                                bends, p["rise_m"]))
        elif k == "fitting":
            segs.append(Segment(i, k, p["bore_mm"] * 1e-3, p.get("passage_length_mm", 25.0) * 1e-3,
                                1.5e-6, (), 0.0, p["shape"]))
        elif k == "device":
            nu0 = p["at_visc_cst"] * 1e-6 if p.get("at_visc_cst") else None
            segs.append(Segment(i, k, None, 0.0, 0.0, (), 0.0, None, p["dp_bar"] * 1e5,
                                p["at_flow_lpm"] / 60000.0, nu0, p["scaling"]))
        elif k == "entrance":
            segs.append(Segment(i, k, p["bore_mm"] * 1e-3, edge=p["edge"]))
        elif k == "exit":
            segs.append(Segment(i, k, p["bore_mm"] * 1e-3))
        else:  # pragma: no cover - the validator admits no other kind
            raise ValueError(f"unknown part kind {k!r}")
    return segs


def _entrance_k(edge: str, d: float) -> float:
    if edge == "rounded":
        return entrance_rounded(Di=d, rc=0.15 * d)
    if edge == "projecting":
        return entrance_distance(Di=d, t=0.05 * d)
    return entrance_sharp()


def _velocity_re(q, d, nu):
    a = 0.25 * math.pi * d * d
    v = q / a
    return v, v * d / nu


def line_flow(segs: list[Segment], q_m3_s: float, nu_m2_s: float, rho_kg_m3: float,
              detail: bool = True) -> tuple[float, list | None]:
    r"""Pressure drop along a compiled line at one flow and fluid state.

    Each part's drop is its straight friction :math:`f (L/D) \rho v^2/2`, its
    minor losses :math:`K \rho v^2/2` (bends, fitting body, entrance, exit),
    the loss of the bore change at its inlet from the part before it, and
    :math:`\rho g \Delta z` for its rise.

    Parameters
    ----------
    segs : list of Segment
        From ``compile_line``.
    q_m3_s : float
        Volumetric flow, [m^3/s]; 0 gives only the static (elevation) terms.
    nu_m2_s : float
        Kinematic viscosity, [m^2/s].
    rho_kg_m3 : float
        Density, [kg/m^3].
    detail : bool
        When False only the total is returned (faster; used by iterations).

    Returns
    -------
    dp_pa : float
        Total pressure drop inlet to outlet, [Pa] (positive: pressure falls).
    parts : list of dict or None
        Per part: velocity_m_s, reynolds, regime, friction_factor, k_minor,
        friction_pa, minor_pa, transition_pa, elevation_pa, dp_pa.

    Examples
    --------
    Laminar flow of 12 cSt oil, 8 L/min through 1 m of 9.5 mm hose:
    Hagen-Poiseuille gives :math:`128 \mu L Q / (\pi D^4)`.

    >>> segs = compile_line([{"kind": "hose", "bore_mm": 9.5, "length_m": 1.0, "roughness_mm": 0.005,
    ...                       "bends": [], "rise_m": 0.0}])
    >>> dp, _ = line_flow(segs, 8 / 60000, 12e-6, 850.0)
    >>> round(dp / (128 * 12e-6 * 850 * 1.0 * (8 / 60000) / (math.pi * 0.0095 ** 4)), 9)
    1.0
    """
    total = 0.0
    out = [] if detail else None
    prev_d = None
    for s in segs:
        d = s.d_m
        fric = minor = trans = elev = 0.0
        v = re = fd = k_minor = 0.0
        if s.kind == "device":
            if q_m3_s > 0.0:
                ratio = q_m3_s / s.q0_m3_s
                if s.scaling == "viscous":
                    nu_ratio = nu_m2_s / s.nu0_m2_s if s.nu0_m2_s else 1.0
                    minor = s.dp0_pa * ratio * nu_ratio
                else:
                    minor = s.dp0_pa * ratio * ratio
            prev_d = None
        else:
            if q_m3_s > 0.0:
                v = q_m3_s / s.area_m2
                re = v * d / nu_m2_s
                dyn = 0.5 * rho_kg_m3 * v * v
                fd = friction_factor(re, s.eps_d)
                kind = s.kind
                if kind != "entrance" and kind != "exit" and s.length_m > 0.0:
                    fric = fd * s.l_over_d * dyn
                k_minor = s.k1 / re + s.k_inf
                if s.bends:
                    k_minor += max(s.bend_a + s.bend_b * fd, 0.0)
                elif kind == "exit":
                    k_turb = exit_normal()
                    if re <= RE_LAMINAR:
                        k_minor += 2.0
                    elif re >= RE_TURBULENT:
                        k_minor += k_turb
                    else:
                        k_minor += 2.0 + (re - RE_LAMINAR) / (RE_TURBULENT - RE_LAMINAR) * (k_turb - 2.0)
                minor = k_minor * dyn
                if prev_d is not None and abs(prev_d - d) > 0.02 * d:
                    if prev_d > d:  # contraction, K on the downstream (this) velocity
                        trans = contraction_sharp(Di1=prev_d, Di2=d, Re=re, method="Hooper") * dyn
                    else:  # expansion, K on the upstream velocity
                        vu, reu = _velocity_re(q_m3_s, prev_d, nu_m2_s)
                        trans = diffuser_sharp(Di1=prev_d, Di2=d, Re=reu, method="Hooper") * \
                            0.5 * rho_kg_m3 * vu * vu
            prev_d = d if s.kind not in ("exit",) else None
        if s.rise_m:
            elev = rho_kg_m3 * G * s.rise_m
        dp = fric + minor + trans + elev
        total += dp
        if detail:
            out.append({"index": s.index, "kind": s.kind, "velocity_m_s": v, "reynolds": re,
                        "regime": regime(re) if s.kind != "device" else ("no flow" if q_m3_s <= 0 else
                                                                            "device"),
                        "friction_factor": fd, "k_minor": k_minor, "friction_pa": fric, "minor_pa": minor,
                        "transition_pa": trans, "elevation_pa": elev, "dp_pa": dp})
    return total, out
