"""Port adapters in a job: they join the line's hydraulics and weakest-part check; bad pairs are refused."""
import pytest

from calc import evaluate
from calc.system.adapters import plan_for_port

from ..jobs import simple_job


def _job_with_port(port):
    job = simple_job()
    job["lines"][0]["from_port"] = port
    job["lines"][0]["parts"] = [
        {"kind": "fitting", "bore_mm": 7.0, "shape": "straight", "family": "jic-37", "dash": 6},
        {"kind": "hose", "class": "SAE 100R2AT", "dash": 6, "length_m": 1.0},
    ]
    return job


ORB_TO_JIC = {"label": "pump outlet", "thread": "3/4-16 UNF", "seal": "oring-boss",
              "line_end_family": "jic-37", "line_end_dash": 6}


def test_adapter_joins_the_line_as_a_part_with_the_planned_bore():
    # Source: the adapter plan of calc.system.adapters (SAE J1926 port to SAE J514 end, from memory); the
    # engine must put exactly that adapter, with its bore, at the start of the line.
    plan = plan_for_port({**ORB_TO_JIC, "line_end_tube_od_mm": None, "line_end_thread": None})
    assert plan["ok"] and len(plan["adapters"]) == 1
    res = evaluate(_job_with_port(ORB_TO_JIC))
    parts = res["conditions"][1]["lines"][0]["parts"]
    assert parts[0]["adapter"] and parts[0]["job_part"] is None
    assert [p["job_part"] for p in parts[1:]] == [0, 1]
    # Source: v = Q / A (exact) through the adapter's bore: 7.1 mm, the smaller of its ends, the SAE J514 -6 end's
    # (calc/data/fittings.json: typical of steel adapters, from memory).
    q = res["conditions"][1]["lines"][0]["flow_lpm"] / 60000
    bore = 7.1e-3
    assert plan["adapters"][0]["bore_mm"] == 7.1
    assert parts[0]["velocity_m_s"] == pytest.approx(q / (3.141592653589793 / 4 * bore ** 2), rel=1e-12)
    checks = [c for c in res["lines"][0]["checks"] if c["check"] == "ports"]
    assert checks and checks[0]["verdict"] == "ok"


def test_adapter_counts_in_the_weakest_part():
    # Source: stated rule (an assembly is rated as its weakest component). The ISO 6149 adapter
    # (about 250 bar, from memory) is below the SAE 100R2AT -6 hose (4000 psi = 275.8 bar, SAE J517,
    # from memory), so the adapter must be named the weakest part.
    port = {"label": "gear inlet", "thread": "M16x1.5", "seal": "metric-oring", "line_end_family": "jic-37",
            "line_end_dash": 6}
    res = evaluate(_job_with_port(port))
    rating = res["lines"][0]["rating"]
    adapter_rating = res["lines"][0]["ports"]["from_port"]["adapters"][0]["working_bar"]
    hose = next(p for p in rating["parts"] if p["kind"] == "hose")
    assert adapter_rating == 250.0 and hose["working_bar"] == pytest.approx(4000 * 6894.757293168 / 1e5, abs=0.05)
    assert rating["working_bar"] == adapter_rating
    assert rating["weakest_part"]["index"] == 0  # the adapter leads the evaluated line


def test_a_pair_that_does_not_seal_is_a_failed_check_with_the_reason():
    # Source: common practice (a tapered pipe thread does not seal in a straight-thread O-ring port).
    port = {"label": "gear inlet", "thread": "1/4 NPT", "seal": "oring-boss", "line_end_family": "jic-37",
            "line_end_dash": 6}
    res = evaluate(_job_with_port(port))
    assert res["ok"]
    fails = [c for c in res["lines"][0]["checks"] if c["check"] == "ports" and c["verdict"] == "fail"]
    assert fails and "gear inlet" in fails[0]["message"]
    assert all(p["adapter"] is None for p in res["conditions"][0]["lines"][0]["parts"])


def test_no_line_end_means_no_plan():
    # Source: stated behaviour (only a port that names the line end meeting it is planned).
    job = _job_with_port({"label": "pump outlet", "thread": "3/4-16 UNF", "seal": "oring-boss"})
    res = evaluate(job)
    assert res["lines"][0]["ports"]["from_port"] is None
    assert not [c for c in res["lines"][0]["checks"] if c["check"] == "ports"]
