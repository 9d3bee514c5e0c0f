"""Ports stage: the adapters at each line's start and end ports, planned from the thread tables.

For a port that names the line end to meet it (``calc.model.job.PORT``), the plan of
``calc.system.adapters.plan_for_port`` is made; its adapters become fitting parts at the start
(``from_port``) or end (``to_port``) of the line as built, so they count in the hydraulics (as
restrictions) and in the weakest-part check. A plan that does not seal is a failed ``ports``
check with the reason, not an input error: the rest of the job still evaluates.
"""
from __future__ import annotations

from dataclasses import dataclass

from ..model.job import PART
from ..model.prepared import Part
from ..model.result import check
from ..model.schema import validate
from ..system.adapters import adapter_parts, plan_for_port

__all__ = ["PortsSection", "ports_stage"]

_ENDS = (("from_port", "start"), ("to_port", "end"))


@dataclass(frozen=True)
class PortsSection:
    """Per line: ``plans`` ``{"from_port": plan or None, "to_port": plan or None}``, ``built_parts``
    (the parts in flow order with the planned adapters) and ``checks``."""

    plans: tuple
    built_parts: tuple
    checks: tuple


def _adapters(plan: dict, label: str) -> list:
    out = []
    for a, raw in zip(plan["adapters"], adapter_parts(plan)):
        norm, problems, _ = validate(PART, raw)
        if problems:  # pragma: no cover - adapter_parts emits valid parts (tested in test_threads)
            continue
        out.append(Part(norm, None, adapter=f"{label}: {a['name']}"))
    return out


def _checks(spec, plans: dict) -> list:
    out = []
    for end, word in _ENDS:
        plan = plans[end]
        if plan is None:
            continue
        label = spec[end].get("label") or f"{word} port"
        if not plan["ok"]:
            out.append(check("ports", "fail", f"{label}: {plan['message']}"))
        elif plan["adapters"]:
            out.append(check("ports", "ok", f"{label}: {plan['message']}".strip()))
        else:
            out.append(check("ports", "ok", f"{label}: the line end fits the port directly. "
                                            f"{plan['message']}".strip()))
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
    plans, built, checks = [], [], []
    for ln in job.lines:
        parts = list(ln.parts)
        pl = {}
        for end, word in _ENDS:
            plan = plan_for_port(ln.spec[end])
            pl[end] = plan
            if not plan or not plan["ok"]:
                continue
            added = _adapters(plan, ln.spec[end].get("label") or f"{word} port")
            parts = added + parts if end == "from_port" else parts + added
        plans.append(pl)
        built.append(tuple(parts))
        checks.append(_checks(ln.spec, pl))
    return PortsSection(tuple(plans), tuple(built), tuple(checks))
