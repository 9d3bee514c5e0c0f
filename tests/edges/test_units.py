"""Display units: exact conversions, sentences converted at the edge, numbers left in engine units."""
import json
import re

from calc import evaluate
from calc.edges.units import localize_result

from ..jobs import demo_job


def test_sentences_in_us_units():
    # Source: exact conversions (NIST SP 811: 1 psi = 6894.757 Pa, 1 in = 25.4 mm, F = 1.8 C + 32).
    from calc.edges.units import localize_result, localize_text
    assert localize_text("must hold 100 bar at 100 C", "us") == "must hold 1450 psi at 212 F"
    assert localize_text("radius 127 mm is under 254 mm", "us") == "radius 5.00 in is under 10.0 in"
    assert localize_text("use -8 or a larger bore", "us") == "use -8 or a larger bore"
    assert localize_text("must hold 100 bar", "metric") == "must hold 100 bar"
    # the user's own words, quoted, are never converted
    assert localize_text("at ‘idle at 20 C’ the line holds 100 bar", "us") == "at ‘idle at 20 C’ the line holds 1450 psi"
    res = evaluate(demo_job())
    us = localize_result(json.loads(json.dumps(res)), "us")
    msgs = [c["message"] for ln in us["lines"] for c in ln["checks"]]
    assert not [m for m in msgs if re.search(r"\d bar\b", m)]  # ("hose barb" is a name, not a unit)
    assert us["conditions"][0]["pump_outlet_bar"] == res["conditions"][0]["pump_outlet_bar"]


def test_which_strings_are_sentences_comes_from_the_result_declaration():
    # Source: exact conversion 1 in = 25.4 mm (NIST SP 811): the tube 9.53 x 0.89 mm is 0.375 x 0.035 in; the
    # declaration (calc.model.result) names a part's description and notes as sentences, the user's names as
    # text (a hand-kept key list missed them).
    import calc.edges.units as units
    job = demo_job()
    job["name"] = "test at 20 C"
    res = evaluate(job)
    tube = [p for p in res["lines"][0]["rating"]["parts"] if p["kind"] == "tube"][0]
    assert tube["description"].startswith("tube 9.53 x 0.89 mm") and " bar" in tube["notes"][0]
    us = localize_result(res, "us")
    tube_us = [p for p in us["lines"][0]["rating"]["parts"] if p["kind"] == "tube"][0]
    assert tube_us["description"].startswith("tube 0.375 x 0.035 in")
    assert " psi" in tube_us["notes"][0] and " bar" not in tube_us["notes"][0]
    assert us["job_name"] == "test at 20 C"
    assert [c["name"] for c in us["conditions"]] == [c["name"] for c in res["conditions"]]
    assert not hasattr(units, "_TEXT_KEYS")
    assert localize_result(res, "metric") is res
    assert tube["description"].startswith("tube 9.53 x 0.89 mm")  # the input is not edited
