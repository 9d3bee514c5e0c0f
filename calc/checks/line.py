"""Every check of a line, in one function: the same for a line as built and for a candidate assembly."""
from __future__ import annotations

from ..system.naming import part_ref
from ..system.rating import line_rating
from .assembly import bend_checks, consistency_checks, length_checks, port_checks, route_check
from .case import LineCase
from .hydraulic import budget_check, budgets, inlet_check, regime_check, velocity_check
from .rating import pressure_checks, suction_check, temperature_checks, wall_checks

__all__ = ["line_checks", "judge_line", "hydraulics_pass"]


def line_checks(case: LineCase) -> list[dict]:
    """The checks of one line, in the order they are shown: ports and fit, hydraulics, ratings, geometry."""
    out = port_checks(case) + consistency_checks(case)
    out += [c for c in (velocity_check(case), regime_check(case), inlet_check(case), budget_check(case)) if c]
    out += pressure_checks(case) + temperature_checks(case) + wall_checks(case)
    out += [c for c in (suction_check(case),) if c]
    out += bend_checks(case) + length_checks(case)
    out += [c for c in (route_check(case),) if c]
    return out


def _case(job, j, spec, user_parts, plans, assembly, solved, last_feed, rating=None, prs=(), memo=None) -> LineCase:
    ln = job.lines[j]
    return LineCase(job, j, ln.name, ln.role, spec, tuple(user_parts), assembly.parts, plans, assembly, tuple(solved),
                    tuple(c["lines"][j] for c in solved), rating, tuple(prs), last_feed, memo)


def hydraulics_pass(job, j: int, spec, user_parts, plans: dict, assembly, solved, last_feed: bool) -> bool:
    """Whether line ``j`` as built passes the checks that read only its hydraulics: velocity, pressure-drop
    budget and pump inlet (the same functions ``line_checks`` runs; arguments as ``judge_line``)."""
    case = _case(job, j, spec, user_parts, plans, assembly, solved, last_feed)
    found = [velocity_check(case), budget_check(case), inlet_check(case)]
    return not any(c is not None and c["verdict"] == "fail" for c in found)


def judge_line(job, j: int, spec, user_parts, plans: dict, assembly, solved, last_feed: bool,
               memo: dict | None = None) -> tuple[LineCase, list]:
    """Rate line ``j`` as built and run its checks.

    Parameters
    ----------
    job : calc.model.prepared.PreparedJob
    j : int
        The line's place in the user's list, from 0.
    spec : mapping
        The line's fields (its ports, route, budgets).
    user_parts : sequence of Part
        The user's own parts, prepared.
    plans : dict
        The port plans (``calc.system.adapters.line_with_adapters``).
    assembly : calc.system.assembly.Assembly
        The line as built: its parts (adapters, derived length and bends) and its assembly.
    solved : sequence of dict
        Every operating point solved with this line as built (``Circuit.operating_point``).
    last_feed : bool
        Whether the line is the last feed line (the pump inlet is judged on it).
    memo : dict, optional
        Part ratings, labels and wall points kept between calls on one line (``calc.system.rating.part_ratings``,
        ``calc.system.walls.line_walls``).

    Returns
    -------
    case, checks
        The ``LineCase`` (its ``rating`` is the result's ``lines[].rating``) and the checks.
    """
    ln = job.lines[j]
    results = tuple(c["lines"][j] for c in solved)
    temps = [c["fluid_temp_c"] for c in solved]
    rating, prs = line_rating(assembly.parts, ln.role, job.ratings, job.pump["relief_bar"], results,
                              [c["name"] for c in solved], (max(temps), min(temps)), budgets(ln.role, spec), part_ref,
                              memo)
    case = _case(job, j, spec, user_parts, plans, assembly, solved, last_feed, rating, prs, memo)
    return case, line_checks(case)
