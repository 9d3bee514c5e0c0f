"""A job's fluid record resolved from its preset (``calc/data/fluids.json``) and the user's values."""
from __future__ import annotations

from ..data.tables import custom_fluid_defaults, fluid_presets
from ..physics.fluid import T0, FluidState, fluid_state, walther_coefficients

__all__ = ["resolve_fluid", "state_of"]


def resolve_fluid(fluid: dict) -> dict:
    """Fill a validated fluid record from its preset; the user's own values win.

    Returns a new dict with every property filled, ``source`` saying where the values come
    from, and the Walther constants ``walther_a``, ``walther_b`` of its two viscosity points.

    Examples
    --------
    >>> f = resolve_fluid({"preset": "iso-vg32", "visc_40c_cst": None})
    >>> f["visc_40c_cst"], f["source"]
    (32.0, 'ISO 3448 (40 C); from memory (the rest)')
    """
    presets = fluid_presets()
    preset = fluid.get("preset")
    base = dict(presets[preset]) if preset in presets else {"name": "Custom fluid", "source": "user",
                                                           **custom_fluid_defaults()}
    out = dict(base)
    for k, v in fluid.items():
        if v is not None and v != "":
            out[k] = v
    if preset in presets and any(fluid.get(k) is not None for k in presets[preset] if k not in ("name", "source")):
        out["source"] = base["source"] + "; user values where given"
    out["preset"] = preset
    A, B = walther_coefficients(40.0 + T0, out["visc_40c_cst"], 100.0 + T0, out["visc_100c_cst"])
    out["walther_a"], out["walther_b"] = A, B
    return out


def state_of(fluid, t_c: float) -> FluidState:
    """The state of a resolved fluid record at ``t_c`` [C] (``calc.physics.fluid.fluid_state``).

    Examples
    --------
    >>> s = state_of(resolve_fluid({"preset": "iso-vg32"}), 40.0)
    >>> round(s.nu_m2_s * 1e6, 9)
    32.0
    """
    return fluid_state(fluid["walther_a"], fluid["walther_b"], fluid["density_15c_kg_m3"], fluid["expansion_per_k"],
                       fluid["specific_heat_j_kgk"], fluid["conductivity_w_mk"], t_c)
