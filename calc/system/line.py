"""A line as hydraulic segments: compiled once from its parts, evaluated at any flow.

``compile_line`` turns a line's parts (job units) into SI segments, taking every
geometry-only coefficient from ``calc.physics.losses`` once; ``line_flow`` evaluates a
compiled line for one flow and one fluid state. It is the only routine the circuit,
hose selection and the thermal iteration call, so every figure comes from the same physics.

Each part's drop is its straight friction :math:`f (L/D) \\rho v^2/2`, its minor losses
:math:`K \\rho v^2/2` (bends, fitting body, entrance, exit), the loss of the bore change at its
inlet from the part before it, and :math:`\\rho g \\Delta z` for its rise.
"""
from __future__ import annotations

import math

from ..physics.convection import G
from ..physics.friction import RE_LAMINAR, friction_factor, regime
from ..physics.losses import (bend_loss_coefficients, contraction_k, device_drop_pa, entrance_coefficients,
                              exit_k, expansion_k, fitting_body_coefficients, laminar_bend_k)

__all__ = ["Segment", "part_bore_mm", "compile_line", "compile_line_memo", "line_flow", "signature"]

#: Relative roughness of a fitting's drilled passage: 1.5 um, drawn steel (from memory).
FITTING_ROUGHNESS_M = 1.5e-6


class Segment:
    """A part compiled to SI for repeated evaluation.

    Coefficients fixed by the geometry are taken from the physics once, so that each
    evaluation is K = k1/Re + k_inf + (bend_a + bend_b f): Rennels' bend coefficient is affine
    in f and Darby's 3-K is affine in 1/Re (both checked against fluids in the tests).
    """

    __slots__ = ("index", "kind", "d_m", "length_m", "eps_m", "bends", "rise_m", "shape",
                 "dp0_pa", "q0_m3_s", "nu0_m2_s", "scaling", "edge", "name", "wall_m",
                 "area_m2", "eps_d", "l_over_d", "bend_a", "bend_b", "k1", "k_inf")

    def __init__(self, index, kind, d_m=None, length_m=0.0, eps_m=0.0, bends=(), rise_m=0.0,
                 shape=None, dp0_pa=0.0, q0_m3_s=1.0, nu0_m2_s=None, scaling="inertial", edge="sharp",
                 name="", wall_m=None):
        self.index, self.kind, self.d_m, self.length_m, self.eps_m = index, kind, d_m, length_m, eps_m
        self.bends, self.rise_m, self.shape = tuple(bends), rise_m, shape
        self.dp0_pa, self.q0_m3_s, self.nu0_m2_s, self.scaling = dp0_pa, q0_m3_s, nu0_m2_s, scaling
        self.edge, self.name, self.wall_m = edge, name, wall_m
        self.area_m2 = 0.25 * math.pi * d_m * d_m if d_m else 0.0
        self.eps_d = eps_m / d_m if d_m else 0.0
        self.l_over_d = length_m / d_m if d_m else 0.0
        self.bend_a = self.bend_b = self.k1 = self.k_inf = 0.0
        if kind in ("hose", "tube"):
            for angle, rc in self.bends:
                a, b = bend_loss_coefficients(d_m, angle, rc)
                self.bend_a += a
                self.bend_b += b
        elif kind == "fitting":
            self.k1, self.k_inf = fitting_body_coefficients(shape, d_m)
        elif kind == "entrance":
            self.k1, self.k_inf = entrance_coefficients(edge, d_m, wall_m)


def part_bore_mm(part) -> float | None:
    """Flow bore of a prepared part, mm (a hose's bore is filled from its class by ``prepare``).

    Examples
    --------
    >>> part_bore_mm({"kind": "tube", "od_mm": 10.0, "wall_mm": 1.0})
    8.0
    """
    k = part["kind"]
    if k == "tube":
        return part["od_mm"] - 2.0 * part["wall_mm"]
    if k == "device":
        return None
    return part.get("bore_mm")


def _segment(i: int, p) -> Segment:
    k = p["kind"]
    if k in ("hose", "tube"):
        bends = tuple((b["angle_deg"], b["radius_mm"] * 1e-3) for b in p.get("bends") or ())
        return Segment(i, k, part_bore_mm(p) * 1e-3, p["length_m"], p["roughness_mm"] * 1e-3, bends, p["rise_m"])
    if k == "fitting":
        return Segment(i, k, p["bore_mm"] * 1e-3, p.get("passage_length_mm", 25.0) * 1e-3,
                       FITTING_ROUGHNESS_M, (), 0.0, p["shape"])
    if k == "device":
        nu0 = p["at_visc_cst"] * 1e-6 if p.get("at_visc_cst") else None
        return Segment(i, k, None, 0.0, 0.0, (), 0.0, None, p["dp_bar"] * 1e5, p["at_flow_lpm"] / 60000.0, nu0,
                       p["scaling"])
    if k == "entrance":
        wall = p.get("wall_mm")
        return Segment(i, k, p["bore_mm"] * 1e-3, edge=p["edge"], wall_m=None if wall is None else wall * 1e-3)
    if k == "exit":
        return Segment(i, k, p["bore_mm"] * 1e-3)
    raise ValueError(f"unknown part kind {k!r}")  # pragma: no cover - the validator admits no other kind


def compile_line(parts) -> list[Segment]:
    """Compile a line's parts (job units, hoses with their bore) into SI segments.

    Parameters
    ----------
    parts : sequence of mappings
        Validated parts in flow order (``calc.model.job.PART``), hose bores filled.

    Returns
    -------
    list of Segment

    Examples
    --------
    >>> [s.kind for s in compile_line([{"kind": "entrance", "bore_mm": 10.0, "edge": "sharp"},
    ...                                {"kind": "exit", "bore_mm": 10.0}])]
    ['entrance', 'exit']
    """
    return [_segment(i, p) for i, p in enumerate(parts)]


def _segment_key(i: int, p):
    """What a part's segment depends on (its place and its hydraulic fields), hashable."""
    return (i,) + tuple((k, tuple(tuple(sorted(b.items())) for b in v) if k == "bends" else v)
                        for k, v in sorted(p.items()) if k in _HYDRAULIC_FIELDS)


#: The fields a part's segment reads (``_segment``).
_HYDRAULIC_FIELDS = frozenset(("kind", "bore_mm", "od_mm", "wall_mm", "length_m", "roughness_mm", "bends", "rise_m",
                               "passage_length_mm", "shape", "dp_bar", "at_flow_lpm", "at_visc_cst", "scaling", "edge"))


def compile_line_memo(parts, memo: dict) -> list[Segment]:
    """``compile_line`` with each segment kept in ``memo`` by its part's place and hydraulic fields: the hose
    candidates of one line share their unchanged parts' segments (a segment is never changed once made)."""
    out = []
    for i, p in enumerate(parts):
        key = _segment_key(i, p)
        seg = memo.get(key)
        if seg is None:
            seg = memo[key] = _segment(i, p)
        out.append(seg)
    return out


_SIGNATURE = ("kind", "d_m", "length_m", "eps_m", "bends", "rise_m", "shape", "dp0_pa", "q0_m3_s", "nu0_m2_s",
              "scaling", "edge", "wall_m")


def signature(segs) -> tuple:
    """What the hydraulics of a compiled line depends on, hashable: two lines with equal signatures have
    equal drops at every flow and fluid state (the hose selection shares their solutions).

    Examples
    --------
    >>> a = compile_line([{"kind": "exit", "bore_mm": 10.0}])
    >>> signature(a) == signature(compile_line([{"kind": "exit", "bore_mm": 10.0}]))
    True
    """
    return tuple(tuple(getattr(s, k) for k in _SIGNATURE) for s in segs)


def _bends_k(s: Segment, re: float, fd: float) -> float:
    """Minor loss of a part's bends: White's curved-pipe excess in laminar flow, Rennels above."""
    if re < RE_LAMINAR:
        return sum(laminar_bend_k(re, s.d_m, angle, rc) for angle, rc in s.bends)
    return max(s.bend_a + s.bend_b * fd, 0.0)


def _bore_change_pa(prev_d: float, d: float, q_m3_s: float, nu_m2_s: float, rho_kg_m3: float, dyn: float) -> float:
    """Loss of a sharp change of bore from ``prev_d`` to ``d`` (Hooper), [Pa].

    Both of Hooper's methods take the Reynolds number of the upstream bore; the contraction's K is
    on the downstream (this part's) velocity head ``dyn``, the expansion's on the upstream one.
    """
    vu = q_m3_s / (0.25 * math.pi * prev_d * prev_d)
    re_up = vu * prev_d / nu_m2_s
    if prev_d > d:
        return contraction_k(prev_d, d, re_up) * dyn
    return expansion_k(prev_d, d, re_up) * 0.5 * rho_kg_m3 * vu * vu


def line_flow(segs: list[Segment], q_m3_s: float, nu_m2_s: float, rho_kg_m3: float,
              detail: bool = True) -> tuple[float, list | None]:
    r"""Pressure drop along a compiled line at one flow and fluid state.

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
    Hagen-Poiseuille gives :math:`128 \mu L Q / (\pi D^4)` (exact).

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
            minor = device_drop_pa(s.dp0_pa, q_m3_s, s.q0_m3_s, nu_m2_s, s.nu0_m2_s, s.scaling)
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
                    k_minor += _bends_k(s, re, fd)
                elif kind == "exit":
                    k_minor += exit_k(re)
                minor = k_minor * dyn
                if prev_d is not None and abs(prev_d - d) > 0.02 * d:
                    trans = _bore_change_pa(prev_d, d, q_m3_s, nu_m2_s, rho_kg_m3, dyn)
            prev_d = d if s.kind != "exit" else None
        if s.rise_m:
            elev = rho_kg_m3 * G * s.rise_m
        dp = fric + minor + trans + elev
        total += dp
        if detail:
            out.append({"index": s.index, "kind": s.kind, "velocity_m_s": v, "reynolds": re,
                        "regime": regime(re) if s.kind != "device" else ("no flow" if q_m3_s <= 0 else "device"),
                        "friction_factor": fd, "k_minor": k_minor, "friction_pa": fric, "minor_pa": minor,
                        "transition_pa": trans, "elevation_pa": elev, "dp_pa": dp})
    return total, out
