"""The wall-temperature check of a hose or tube near a heat source: its thresholds, its words, no edit, and the
hose candidates judged the same way."""
from types import SimpleNamespace

import pytest

from calc import evaluate
from calc.checks.rating import wall_checks, wall_judgements
from calc.data.practice import TEMP_CAUTION_K

from ..stages.test_walls import hot_job


def _case(kind, outer_c, limit_c, local_c=180.0, fluid_c=90.0, flow=True):
    """A line of one hose or tube whose wall estimate is given outright (the thresholds alone are under test)."""
    wall = {"index": 1, "job_part": 1, "label": f"part 2 ({kind})", "kind": kind, "local_air_temp_c": local_c,
            "air_temp_c": 50.0 if local_c is None else local_c, "hottest_c": outer_c, "hottest_at": "idle",
            "hottest_surface": "outer",
            "points": [{"name": "idle", "fluid_temp_c": fluid_c, "air_temp_c": 180.0, "flow": flow,
                        "inner_c": min(outer_c, fluid_c + 0.5 * (outer_c - fluid_c)), "outer_c": outer_c}]}
    # the under-hood air of the job: the points' 180 C where the part has no air of its own (its wall hotter
    # than the fluid must come from air hotter than the fluid)
    job = SimpleNamespace(thermal={"air_temp_c": 180.0 if local_c is None else 50.0})
    parts = ({"kind": "fitting"}, {"kind": kind, "local_air_temp_c": local_c})
    return SimpleNamespace(index=0, walls=[wall], own_air_walls=[wall] if local_c is not None else [],
                           conditions=({"name": "idle", "fluid_temp_c": fluid_c},),
                           part_ratings=({"index": 1, "max_temp_c": limit_c},), job=job, parts=parts)


@pytest.mark.parametrize("outer_c, verdict", [(121.5, "fail"), (121.0, "caution"), (111.5, "caution"),
                                              (111.0, "ok"), (100.0, "ok")])
def test_thresholds_against_the_limit(outer_c, verdict):
    # Source: the check's rule: over the limit fail, within TEMP_CAUTION_K (10 K, common practice, no source)
    # caution; a hose's limit is a fluid rating, so the higher of fluid (90 C) and wall is compared.
    assert TEMP_CAUTION_K == 10.0
    (w,) = wall_judgements(_case("hose", outer_c, 121.0))
    assert w["verdict"] == verdict and w["limit_basis"] == "fluid" and w["judged_c"] == outer_c


def test_a_fluid_rated_hose_compares_the_fluid_where_it_is_hotter_than_the_wall():
    # Source: the check's rule: max(fluid, wall) for a fluid rating (a hose in 20 C air, fluid at 125 C)
    (w,) = wall_judgements(_case("hose", 60.0, 121.0, local_c=20.0, fluid_c=125.0))
    assert w["judged_c"] == 125.0 and w["verdict"] == "fail"


def test_a_tube_compares_its_hottest_wall():
    # Source: the check's rule: a tube's limit is a metal temperature, the hottest surface is compared
    (w,) = wall_judgements(_case("tube", 150.0, 200.0))
    assert w["limit_basis"] == "wall" and w["judged_c"] == 150.0 and w["verdict"] == "ok"


def test_unknown_limit_is_a_caution_that_asks_for_it():
    (c,) = wall_checks(_case("hose", 150.0, None))
    assert c["verdict"] == "caution" and "maximum temperature" in c["message"]


def test_no_own_air_and_no_hotter_wall_is_left_to_the_fluid_check():
    # Source: the check's rule: without its own air a part is judged here only where its wall runs hotter than
    # the fluid (air hotter than the fluid)
    assert wall_checks(_case("hose", 80.0, 121.0, local_c=None)) == []
    assert [c["verdict"] for c in wall_checks(_case("hose", 95.0, 100.0, local_c=None))] == ["caution"]


def test_hose_by_a_300_c_manifold_fails_a_121_c_fluid_rating():
    r = evaluate(hot_job(local_c=300.0, limit_c=121.0))
    assert r["ok"], r.get("errors")
    line = r["lines"][0]
    (c,) = [c for c in line["checks"] if c["check"] == "wall temperature"]
    w = next(w for w in line["walls"] if w["job_part"] == 1)
    # Source: resistances in series (tests/physics/test_walls.py checks the figures against ht): with 300 C air
    # round 80-85 C fluid the outer surface lies between them, far above 121 C at idle in still air.
    assert 121.0 < w["hottest_c"] < 300.0 and w["hottest_surface"] == "outer"
    assert c["verdict"] == w["verdict"] == "fail"
    msg = c["message"]
    assert "part 2 (hose SAE 100R2AT -6) of line 1" in msg  # counted from 1 in the user's list
    for words in ("move the line", "heat sleeve or shield", "rated hotter", "300 C air", "121 C limit",
                  "rating is for the fluid", "radiation from the hot surface is not modelled", "lower bound"):
        assert words in msg
    assert "fix" not in c  # no one field carries "move the line"
    assert line["verdict"] == "fail"


def test_a_hose_clear_of_the_heat_passes_and_candidates_are_judged_alike():
    # 60 C air round the hose (just above the 50 C under-hood air): well under a 121 C fluid rating
    r = evaluate(hot_job(local_c=60.0, limit_c=121.0))
    line = r["lines"][0]
    (c,) = [c for c in line["checks"] if c["check"] == "wall temperature"]
    assert c["verdict"] == "ok" and "at least 10 K under its 121 C limit" in c["message"]
    hot = evaluate(hot_job(local_c=300.0))["lines"][0]
    # every candidate hose sits in the same 300 C air (the swap keeps the part's own air): none passes it
    assert hot["candidates"] and all("wall temperature" in cand["failed"] for cand in hot["candidates"])


def test_walls_are_not_worked_out_where_none_can_be_judged():
    # Source: a wall lies between the fluid and the air (resistances in series, exact): with no part in air of its
    # own and the under-hood air (50 C) under the fluid's highest (90 C), no wall can run hotter than the fluid,
    # so there is nothing to judge and the walls are not read at all.
    class NoWalls(SimpleNamespace):
        @property
        def walls(self):
            raise AssertionError("walls read")
    case = _case("hose", 80.0, 121.0, local_c=None)
    quiet = NoWalls(**{k: v for k, v in vars(case).items() if k not in ("walls", "own_air_walls")})
    quiet.job = SimpleNamespace(thermal={"air_temp_c": 50.0})
    assert wall_checks(quiet) == []


def test_the_checks_of_the_demos_equal_those_of_every_wall_judged():
    # Source: a wall lies between the fluid and the air (exact): working out only the parts in air of their own
    # when the under-hood air is no hotter than the fluid gives the same checks as judging every wall.
    from calc.model.prepared import prepare
    from calc.stages.assembly import assembly_stage
    from calc.stages.circuit import circuit_stage
    from calc.stages.lines import lines_stage
    from calc.stages.ports import ports_stage
    from ..jobs import demo_paths
    import json
    for path in demo_paths():
        job, problems, _ = prepare(json.loads(path.read_text(encoding="utf-8")))
        assert not problems
        ports = ports_stage(job)
        assembly = assembly_stage(job, ports)
        lines = lines_stage(job, ports, assembly, circuit_stage(job, assembly))
        for j, walls in enumerate(lines.walls):
            every = [(w["label"], w["verdict"], w["message"]) for w in walls if w["verdict"]]
            shown = [(c["message"]) for c in lines.checks[j] if c["check"] == "wall temperature"]
            assert shown == [m for _, _, m in every], path.name
