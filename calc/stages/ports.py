"""Ports stage: the adapters at each line's start and end ports, planned from the thread tables.

For a port that names the line end to meet it (``calc.model.job.PORT``), the plan of
``calc.system.adapters.plan_for_port`` is made; its adapters become fitting parts at the start
(``from_port``) or end (``to_port``) of the line as built, so they count in the hydraulics (as
restrictions) and in the weakest-part check. They are named by the end they sit at ("the adapter at
the pump end"), never numbered, so the user's part numbers do not shift. A plan that does not seal
is judged by the line's checks (``calc.checks.assembly.port_checks``); the job still evaluates.
"""
from __future__ import annotations

from dataclasses import dataclass

from ..system.adapters import LINE_ENDS, line_with_adapters
from ..system.naming import end_words

__all__ = ["PortsSection", "ports_stage", "ends_in_words"]


@dataclass(frozen=True)
class PortsSection:
    """Per line: ``plans`` ``{"from_port": plan or None, "to_port": plan or None}``, ``built_parts`` (the
    user's parts in flow order with the planned adapters) and ``where`` (each end in words)."""

    plans: tuple
    built_parts: tuple
    where: tuple


def ends_in_words(job) -> list[dict]:
    """Per line: ``{"from_port": words, "to_port": words}``, the ends as the adapters there are named."""
    out = []
    for ln in job.lines:
        same = [m for m in job.lines if m.role == ln.role]
        out.append({end: end_words(ln.role, end, same[0] is ln, same[-1] is ln) for end in LINE_ENDS})
    return out


def ports_stage(job) -> PortsSection:
    """Plan every line's port adapters and build each line's parts in flow order.

    Parameters
    ----------
    job : calc.model.prepared.PreparedJob

    Returns
    -------
    PortsSection
    """
    where = ends_in_words(job)
    plans, built = [], []
    for ln, w in zip(job.lines, where):
        plan, parts = line_with_adapters(ln.spec, ln.parts, w)
        plans.append(plan)
        built.append(parts)
    return PortsSection(tuple(plans), tuple(built), tuple(where))
