"""The text report: ratings, candidates and the cautions wherever a rating is shown."""
import json
from importlib import resources

from calc import evaluate


def _demo():
    return json.loads((resources.files("calc") / "data" / "demos" / "compact-hatch.json").read_text())


def test_report_shows_rating_candidates_and_cautions():
    from calc.edges.report import CAUTIONS, text_report
    text = text_report(evaluate(_demo()))
    assert "rating: working" in text and "weakest part" in text and "hose candidates" in text
    assert all(c in text for c in CAUTIONS)
