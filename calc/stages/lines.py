"""Lines stage: every line rated and judged as built, by the one set of line checks.

Per line: the pressure it must hold, its weakest part and margins (``calc.system.rating``), and
every check of ``calc.checks.line.line_checks``: ports and fit, hydraulics, ratings, bends and
length. The selection stage judges each candidate assembly with the same function, so the two
always agree. The line's verdict is the worst of its checks. Per line also the wall temperature of
each hose and tube and its verdict (``calc.checks.rating.wall_judgements``, the same judgement the
wall-temperature check gives).
"""
from __future__ import annotations

from dataclasses import dataclass

from ..checks.line import judge_line
from ..checks.rating import wall_judgements
from ..model.result import worst_verdict
from ..model.schema import Problem

__all__ = ["LinesSection", "lines_stage", "last_feed_line"]


@dataclass(frozen=True)
class LinesSection:
    """Per line: ``ratings`` (the result's ``lines[].rating``), ``checks``, ``verdicts`` and ``walls`` (the
    result's ``lines[].walls``); and ``warnings``."""

    ratings: tuple
    checks: tuple
    verdicts: tuple
    warnings: tuple
    walls: tuple


def last_feed_line(job) -> int | None:
    """Index of the feed line nearest the pump (the pump inlet is judged on it), or None."""
    feed = [ln.index for ln in job.lines if ln.role == "feed"]
    return feed[-1] if feed else None


def _bore_warnings(j: int, parts) -> list[Problem]:
    out = []
    for p in parts:
        row = p.size_row
        if p["kind"] == "hose" and row and p.sources.get("bore_mm") == "user" \
                and abs(p["bore_mm"] - row["bore_mm"]) > 0.1 * row["bore_mm"]:
            out.append(Problem(f"lines[{j}].parts[{p.place}].bore_mm",
                               f"{p['bore_mm']:g} mm differs from the nominal {row['bore_mm']:g} mm of "
                               f"-{p['dash']}; the given bore is used"))
    return out


def lines_stage(job, ports, assembly, circuit) -> LinesSection:
    """Rate and judge every line as built over the solved operating points.

    Parameters
    ----------
    job : calc.model.prepared.PreparedJob
    ports : calc.stages.ports.PortsSection
        The port plans.
    assembly : calc.stages.assembly.AssemblySection
        The lines as built.
    circuit : calc.stages.circuit.CircuitSection
        The solved operating points.

    Returns
    -------
    LinesSection
    """
    feed = last_feed_line(job)
    ratings, checks, warnings, walls = [], [], [], []
    for ln, plans, a in zip(job.lines, ports.plans, assembly.assemblies):
        case, found = judge_line(job, ln.index, ln.spec, ln.parts, plans, a, circuit.conditions, ln.index == feed)
        ratings.append(case.rating)
        checks.append(found)
        walls.append(wall_judgements(case))
        warnings.extend(_bore_warnings(ln.index, ln.parts))
    return LinesSection(tuple(ratings), tuple(checks), tuple(worst_verdict(c) for c in checks), tuple(warnings),
                        tuple(walls))
