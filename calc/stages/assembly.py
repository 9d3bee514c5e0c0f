"""Assembly stage: each line's hose assembly, its cut length and bends worked out once.

From the line as the ports stage built it and the line's route points or overall length
(``calc.system.assembly.assembly_of``): the hose's cut length (route plus the slack it needs,
less the end fittings' cut-off allowances) and, with a route, the bends the route forces. The
parts it returns are the ones the hydraulics, the ratings and the checks read.
"""
from __future__ import annotations

from dataclasses import dataclass

from ..system.assembly import assembly_of

__all__ = ["AssemblySection", "assembly_stage", "assembly_record"]


@dataclass(frozen=True)
class AssemblySection:
    """Per line: ``assemblies`` (``calc.system.assembly.Assembly``; its ``parts`` are the line as built)."""

    assemblies: tuple

    @property
    def built_parts(self) -> tuple:
        return tuple(a.parts for a in self.assemblies)


def assembly_stage(job, ports) -> AssemblySection:
    """Work out every line's assembly from its parts as built (``ports.built_parts``).

    Parameters
    ----------
    job : calc.model.prepared.PreparedJob
    ports : calc.stages.ports.PortsSection

    Returns
    -------
    AssemblySection
    """
    return AssemblySection(tuple(assembly_of(ln.spec, parts, job.ratings)
                                 for ln, parts in zip(job.lines, ports.built_parts)))


def assembly_record(a) -> dict:
    """The result's ``lines[].assembly`` of an ``Assembly`` (see ``calc.model.result``)."""
    hose = a.parts[a.hose] if a.hose is not None else None
    return {"hose_part": None if hose is None else hose.place, "length_source": a.source,
            "hose_cut_mm": a.hose_mm, "typed_mm": a.typed_mm, "cutoff_mm": a.cutoff_mm, "overall_mm": a.assembly_mm,
            "slack_mm": a.slack_mm, "slack_needed_mm": a.slack_needed_mm, "overall_needed_mm": a.overall_needed_mm,
            "bends": [] if hose is None else [{"angle_deg": b["angle_deg"], "radius_mm": b["radius_mm"]}
                                               for b in hose.get("bends") or ()],
            "bends_from_route": a.route is not None and hose is not None,
            "typed_bends_ignored": a.typed_bends_ignored, "route": a.route}
