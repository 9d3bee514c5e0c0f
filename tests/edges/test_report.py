"""The text report: ratings, candidates and the cautions wherever a rating is shown."""
import json
from importlib import resources

from calc import evaluate

from ..jobs import demo_job


def _demo():
    return json.loads((resources.files("calc") / "data" / "demos" / "compact-hatch.json").read_text())


def test_report_shows_rating_candidates_and_cautions():
    from calc.edges.report import CAUTIONS, text_report
    text = text_report(evaluate(_demo()))
    assert "rating: working" in text and "weakest part" in text and "hose candidates" in text
    assert all(c in text for c in CAUTIONS)


def test_the_report_ends_with_the_order_list_of_the_engine():
    # Source: calc.evaluate's order list for the same job (the engine's totals), to order never shorter: 0.695 m
    # of -6 hose is 0.70 m to 0.01 m; words for end families from the fittings table (calc/data/fittings.json).
    from calc.data.tables import fitting_families
    from calc.edges.report import text_report
    res = evaluate(demo_job("swap-remote-reservoir"))
    text = text_report(res, "metric")
    order = text.split("Order list (every line as built)\n", 1)[1].split("\n\n", 1)[0].splitlines()
    hose = res["order"]["hoses"][0]
    assert order[0] == f"  hose {hose['class']} -{hose['dash']}, bore 9.52 mm: 0.70 m in 1 piece (line 1)"
    assert hose["total_mm"] == 695.0
    assert any(fitting_families()["jic-37"]["name"] in ln for ln in order) and not any("jic-37" in ln for ln in order)
    assert len(order) == sum(len(v) for v in res["order"].values())


def test_the_reports_order_lengths_round_as_the_build_sheet_does():
    # Source: the project's one shop-precision table (site/static/js/precision.js, stated in the README): the
    # report's steps for lengths to order are the sheet's 'order_length' row.
    import re
    from pathlib import Path
    from calc.edges.report import ORDER_LENGTH_STEP
    js = (Path(__file__).resolve().parents[2] / "site/static/js/precision.js").read_text(encoding="utf-8")
    row = re.search(r'order_length: \{[^}]*metric: \{ step: ([\d.]+) \}, us: \{ step: ([\d.]+) \}, mode: "up"', js)
    assert row and (ORDER_LENGTH_STEP["metric"][0], ORDER_LENGTH_STEP["us"][0]) == (float(row[1]), float(row[2]))
