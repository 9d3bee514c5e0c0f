"""Thread tables, thread identification and the adapter planner (calc.threads).

Dimensions are checked against the standards they come from (recalled, so
marked "from memory"); identification is checked by round trips and by the
pairs of sizes a fitter must tell apart; the planner against the sealing rules.
"""
from __future__ import annotations

import doctest
import json

import pytest
from hypothesis import given, settings, strategies as st

import calc.threads as th
from calc import model
from calc.schema import validate

IN = 25.4  # mm per inch, exact by definition (international inch, 1959)


def _t(designation):
    row = th.find_thread(designation)
    assert row is not None, designation
    return row


# -- the tables against the standards ---------------------------------------------
@pytest.mark.parametrize("designation, major_in, tpi", [
    ("9/16-18 UNF", 0.5625, 18),     # Source: ASME B1.1 (from memory)
    ("7/16-20 UNF", 0.4375, 20),     # Source: ASME B1.1 (from memory)
    ("3/8-24 UNF", 0.375, 24),       # Source: ASME B1.1 (from memory)
    ("5/8-18 UNF", 0.625, 18),       # Source: ASME B1.1 (from memory)
    ("3/4-16 UNF", 0.75, 16),        # Source: ASME B1.1 (from memory)
    ("7/8-14 UNF", 0.875, 14),       # Source: ASME B1.1 (from memory)
    ("1-1/16-12 UN", 1.0625, 12),    # Source: ASME B1.1 (from memory)
    ("1-5/16-12 UN", 1.3125, 12),    # Source: ASME B1.1 (from memory)
])
def test_unified_major_and_pitch(designation, major_in, tpi):
    row = _t(designation)
    assert row["major_mm"] == pytest.approx(major_in * IN, abs=1e-4)
    assert row["tpi"] == tpi
    assert row["pitch_mm"] == pytest.approx(IN / tpi, abs=1e-5)
    assert row["tapered"] is False


def test_9_16_18_unf_in_mm():
    # Source: ASME B1.1 (from memory): 9/16-18 UNF major 0.5625 in = 14.2875 mm, pitch 1/18 in = 1.4111 mm
    assert _t("9/16-18 UNF")["major_mm"] == pytest.approx(14.2875, abs=1e-4)
    assert _t("9/16-18 UNF")["pitch_mm"] == pytest.approx(1.4111, abs=1e-4)


@pytest.mark.parametrize("designation, major, pitch", [
    ("M10x1", 10, 1.0), ("M12x1.5", 12, 1.5), ("M14x1.5", 14, 1.5), ("M16x1.5", 16, 1.5),
    ("M18x1.5", 18, 1.5), ("M22x1.5", 22, 1.5), ("M27x2", 27, 2.0),
])  # Source: ISO 261 fine-pitch series (from memory)
def test_metric_fine(designation, major, pitch):
    row = _t(designation)
    assert (row["major_mm"], row["pitch_mm"], row["tapered"]) == (major, pitch, False)


@pytest.mark.parametrize("size, major_mm, tpi, minor_mm", [
    ("1/8", 9.728, 28, 8.566),      # Source: ISO 228-1 (from memory)
    ("1/4", 13.157, 19, 11.445),    # Source: ISO 228-1 (from memory)
    ("3/8", 16.662, 19, 14.950),    # Source: ISO 228-1 (from memory)
    ("1/2", 20.955, 14, 18.631),    # Source: ISO 228-1 (from memory)
    ("1", 33.249, 11, 30.291),      # Source: ISO 228-1 (from memory)
])
def test_bspp_major_pitch_and_minor(size, major_mm, tpi, minor_mm):
    row = _t(f"{size} BSPP")
    assert row["major_mm"] == pytest.approx(major_mm, abs=1e-3)
    assert row["tpi"] == tpi and row["tapered"] is False
    # the female reading convention: minor diameter of the Whitworth form, D - 1.280654 P
    assert th.expected_reading_mm(row, male=False) == pytest.approx(minor_mm, abs=0.002)


@pytest.mark.parametrize("size, gauge_mm, tpi, gauge_len_mm", [
    ("1/8", 9.728, 28, 4.0), ("1/4", 13.157, 19, 6.0), ("3/8", 16.662, 19, 6.4),
    ("1/2", 20.955, 14, 8.2), ("3/4", 26.441, 14, 9.5),
])  # Source: ISO 7-1 gauge diameters and basic gauge lengths (from memory)
def test_bspt_gauge_plane(size, gauge_mm, tpi, gauge_len_mm):
    row = _t(f"{size} BSPT")
    assert row["tapered"] is True and row["tpi"] == tpi
    assert row["gauge_major_mm"] == pytest.approx(gauge_mm, abs=1e-3)
    assert row["gauge_length_mm"] == pytest.approx(gauge_len_mm, abs=1e-6)
    # Source: ISO 7-1 and ISO 228-1 (from memory): the gauge diameter equals the parallel major of the same size
    assert row["gauge_major_mm"] == pytest.approx(_t(f"{size} BSPP")["major_mm"], abs=1e-6)


@pytest.mark.parametrize("size, od_in, tpi", [
    ("1/8", 0.405, 27), ("1/4", 0.540, 18), ("3/8", 0.675, 18), ("1/2", 0.840, 14),
    ("3/4", 1.050, 14), ("1", 1.315, 11.5),
])  # Source: ASME B1.20.1 pipe outside diameters and threads per inch (from memory)
def test_npt_od_and_taper(size, od_in, tpi):
    row = _t(f"{size} NPT")
    assert row["major_mm"] == pytest.approx(od_in * IN, abs=1e-4)
    assert row["tpi"] == tpi and row["tapered"] is True
    # Source: ASME B1.20.1 (from memory): taper 1:16 on diameter, so E1 - E0 = L1 / 16
    assert row["E1_in"] - row["E0_in"] == pytest.approx(row["L1_in"] / 16, abs=2e-5)
    # Source: ASME B1.20.1 (from memory): truncated thread height 0.8 P, so major at the gauge plane = E1 + 0.8 P
    assert row["gauge_major_mm"] == pytest.approx((row["E1_in"] + 0.8 / tpi) * IN, abs=1e-3)
    # the pipe OD lies between the small-end major and the major at the gauge plane + a few turns
    assert (row["E0_in"] + 0.8 / tpi) * IN < row["major_mm"] < row["gauge_major_mm"] + 0.2


def test_metric_and_unified_minor_convention():
    # Source: ISO 724 (from memory): M16x1.5 internal basic minor D1 = 14.376 mm
    assert th.expected_reading_mm(_t("M16x1.5"), male=False) == pytest.approx(14.376, abs=0.001)
    # Source: ASME B1.1 (from memory): 3/4-16 UNF-2B minimum minor diameter 0.682 in
    assert th.expected_reading_mm(_t("3/4-16 UNF"), male=False) / IN == pytest.approx(0.682, abs=0.001)


@pytest.mark.parametrize("family, size, thread", [
    ("jic-37", "-4", "7/16-20 UNF"), ("jic-37", "-6", "9/16-18 UNF"), ("jic-37", "-8", "3/4-16 UNF"),
    ("jic-37", "-10", "7/8-14 UNF"), ("jic-37", "-12", "1-1/16-12 UN"), ("jic-37", "-16", "1-5/16-12 UN"),
    # Source: SAE J514 (from memory; field notes)
    ("orb", "-6", "9/16-18 UNF"), ("orb", "-8", "3/4-16 UNF"),   # Source: SAE J1926 uses the J514 threads (from memory)
    ("inverted-flare-45", "3/16 in tube", "3/8-24 UNF"), ("inverted-flare-45", "1/4 in tube", "7/16-24 UNS"),
    ("inverted-flare-45", "5/16 in tube", "1/2-20 UNF"), ("inverted-flare-45", "3/8 in tube", "5/8-18 UNF"),
    # Source: SAE J512 (from memory; field notes)
    ("cone-24-l", "6L", "M12x1.5"), ("cone-24-l", "8L", "M14x1.5"), ("cone-24-l", "10L", "M16x1.5"),
    ("cone-24-l", "12L", "M18x1.5"), ("cone-24-l", "15L", "M22x1.5"),
    ("cone-24-s", "6S", "M14x1.5"), ("cone-24-s", "8S", "M16x1.5"), ("cone-24-s", "10S", "M18x1.5"),
    ("cone-24-s", "12S", "M20x1.5"),
    # Source: ISO 8434-1 (from memory; field notes)
])
def test_fitting_end_threads(family, size, thread):
    rows = [e for e in th.end_table() if e["family"] == family and e["size"] == size]
    assert [e["thread"] for e in rows] == [thread]


def test_every_row_has_a_source_and_consistent_pitch():
    for t in th.thread_table():
        assert t["source"].strip(), t
        if t["tpi"]:
            assert t["pitch_mm"] == pytest.approx(IN / t["tpi"], abs=1e-5), t["designation"]
    for e in th.end_table():
        assert e["source"].strip() and e["rating_source"].strip(), e
        assert e["seal"] in model.SEAL_TYPES, e
        assert e["thread"] is None or th.find_thread(e["thread"]) is not None, e
    designations = [t["designation"] for t in th.thread_table()]
    assert len(designations) == len(set(designations))


# -- identification ---------------------------------------------------------------
THREADS = th.thread_table()


@settings(max_examples=150, deadline=None)
@given(t=st.sampled_from(THREADS), male=st.booleans())
def test_round_trip_nominal_identifies_itself_first(t, male):
    r = th.identify(th.expected_reading_mm(t, male), t["pitch_mm"], male=male, tapered=t["tapered"])
    best = r["candidates"][0]
    assert r["match"] == "good"
    assert best["thread"] == t["designation"] and best["within"] and best["fit_error_mm"] == 0


def _twins(t):
    """Threads a caliper and pitch gauge cannot separate from t: same pitch and taper, and an expected
    diameter within 0.45 mm (the tolerance band). Computed from the table, not from identify()."""
    out = set()
    for u in THREADS:
        if u is t or u["designation"] == t["designation"]:
            continue
        if abs(u["pitch_mm"] - t["pitch_mm"]) < 1e-6 and u["tapered"] == t["tapered"]:
            for male in (True, False):
                if abs(th.expected_reading_mm(u, male) - th.expected_reading_mm(t, male)) < 0.45:
                    out.add(u["designation"])
    return out


SEPARABLE = [t for t in THREADS if not _twins(t)]


def test_only_the_pipe_thread_pairs_are_inseparable_by_calipers():
    # 1/2 and 3/4 NPT and BSPT share 14 tpi and differ by 0.13-0.27 mm at the gauge plane
    # (ASME B1.20.1, ISO 7-1, from memory): only the thread angle (60 vs 55 deg) separates them.
    twins = {t["designation"]: _twins(t) for t in THREADS if _twins(t)}
    assert twins == {"1/2 NPT": {"1/2 BSPT"}, "1/2 BSPT": {"1/2 NPT"},
                     "3/4 NPT": {"3/4 BSPT"}, "3/4 BSPT": {"3/4 NPT"}}
    r = th.identify(_t("3/4 NPT")["gauge_major_mm"], IN / 14, male=True, tapered=True)
    assert {c["thread"] for c in r["candidates"] if c["within"]} == {"3/4 NPT", "3/4 BSPT"}
    assert "thread angle" in r["message"]


@settings(max_examples=200, deadline=None)
@given(t=st.sampled_from(SEPARABLE), male=st.booleans(), frac=st.floats(0.0, 1.0))
def test_worn_or_tolerance_readings_still_identify_themselves(t, male, frac):
    # male readings anywhere from 0.30 mm under to 0.08 mm over; female from 0.08 under to 0.35 over
    # (inside the stated tolerance; common practice)
    lo, hi = (-0.30, 0.08) if male else (-0.08, 0.35)
    reading = th.expected_reading_mm(t, male) + lo + frac * (hi - lo)
    r = th.identify(reading, t["pitch_mm"], male=male, tapered=t["tapered"])
    assert r["candidates"][0]["thread"] == t["designation"]


def test_5_8_18_unf_and_m16x1_5_told_apart_by_pitch():
    # Source: ASME B1.1 / ISO 261 (from memory): 15.875 mm x 1.411 mm against 16 mm x 1.5 mm
    r = th.identify(15.85, th.parse_pitch("18tpi"))
    assert r["candidates"][0]["thread"] == "5/8-18 UNF"
    assert "M16x1.5" not in [c["thread"] for c in r["candidates"] if c["within"]]
    r = th.identify(15.85, th.parse_pitch("1.5mm"))
    assert r["candidates"][0]["thread"] == "M16x1.5"
    assert "5/8-18 UNF" not in [c["thread"] for c in r["candidates"] if c["within"]]


def test_9_16_18_unf_and_m14x1_5_told_apart_by_pitch():
    # Source: ASME B1.1 / ISO 261 (from memory): 14.29 mm x 18 tpi against 14 mm x 1.5 mm
    assert th.identify(14.1, IN / 18)["candidates"][0]["thread"] == "9/16-18 UNF"
    assert th.identify(14.1, 1.5)["candidates"][0]["thread"] == "M14x1.5"


def test_quarter_bspp_and_quarter_npt_told_apart_by_pitch_and_taper():
    # Source: ISO 228-1 / ASME B1.20.1 (from memory): 19 tpi against 18 tpi
    r = th.identify(13.1, IN / 19, tapered=False)
    assert r["candidates"][0]["thread"] == "1/4 BSPP"
    assert all(c["thread"] != "1/4 NPT" for c in r["candidates"] if c["within"])
    r = th.identify(13.6, IN / 18, tapered=True)
    assert r["candidates"][0]["thread"] == "1/4 NPT"
    assert all(not c["thread"].endswith(("BSPP", "BSPT")) for c in r["candidates"] if c["within"])
    # same size and pitch, parallel against tapered: only the taper decides (ISO 228-1 vs ISO 7-1)
    assert th.identify(13.1, IN / 19, tapered=True)["candidates"][0]["thread"] == "1/4 BSPT"
    unknown = th.identify(13.1, IN / 19)
    assert {c["thread"] for c in unknown["candidates"] if c["within"]} == {"1/4 BSPP", "1/4 BSPT"}
    assert "tapered" in unknown["message"]


def test_pitch_is_matched_tightly():
    # 18 tpi = 1.4111 mm; a 1.5 mm gauge is 6 % off and must not fit (pitch tolerance 1 %, common practice)
    r = th.identify(14.2875, 1.5)
    assert all(c["thread"] != "9/16-18 UNF" for c in r["candidates"] if c["within"])
    assert r["tolerance"]["pitch_percent"] == 1.0


def test_no_fit_names_the_nearest_two():
    r = th.identify(25.0, 3.0)
    assert r["match"] == "none" and len(r["candidates"]) == 2
    assert not any(c["within"] for c in r["candidates"])
    for c in r["candidates"]:
        assert c["thread"] in r["message"]
    assert "tolerance" in r["message"]


def test_candidate_shape_and_tolerance_statement():
    r = th.identify(14.2, IN / 18, male=False)
    assert set(r) == {"tolerance", "candidates", "match", "message"}
    assert "minor diameter" in r["tolerance"]["measured"]
    c = r["candidates"][0]
    for key in ("thread", "family", "fit_error_mm", "pitch_error_mm", "score", "uses", "seals", "source",
                "window_mm", "within"):
        assert key in c
    assert c["window_mm"][0] <= c["expected_mm"] <= c["window_mm"][1]


@pytest.mark.parametrize("args, name", [((float("nan"), 1.5), "major_mm"), ((-1.0, 1.5), "major_mm"),
                                        ((16.0, 0.0), "pitch_mm"), ((16.0, "1.5"), "pitch_mm")])
def test_identify_rejects_bad_numbers(args, name):
    with pytest.raises(ValueError, match=name):
        th.identify(*args)


# -- parsing ----------------------------------------------------------------------
@pytest.mark.parametrize("text, mm", [
    ("15.9mm", 15.9), ("15.9 mm", 15.9), ("0.625in", 15.875), ("5/8in", 15.875), ("5/8 in", 15.875),
    ('0.625"', 15.875), ("1-1/16in", 26.9875), ("1 1/16 inch", 26.9875), (".5in", 12.7),
])  # Source: 1 in = 25.4 mm exactly (international inch)
def test_parse_length(text, mm):
    assert th.parse_length(text) == pytest.approx(mm, abs=1e-9)


@pytest.mark.parametrize("text", ["15.9", "mm", "abc", "0mm", "-3mm", "1/0in", "15.9 furlongs", ""])
def test_parse_length_rejects(text):
    with pytest.raises(ValueError):
        th.parse_length(text)


@pytest.mark.parametrize("text, mm", [("18tpi", IN / 18), ("18 TPI", IN / 18), ("11.5tpi", IN / 11.5),
                                      ("1.5mm", 1.5), ("2 mm", 2.0)])
def test_parse_pitch(text, mm):
    assert th.parse_pitch(text) == pytest.approx(mm, abs=1e-12)


@pytest.mark.parametrize("text", ["18", "1.5", "tpi", "0tpi", "x mm"])
def test_parse_pitch_rejects(text):
    with pytest.raises(ValueError):
        th.parse_pitch(text)


# -- adapter planner ---------------------------------------------------------------
def test_tapered_thread_into_oring_port_is_refused_with_a_reason():
    # a tapered male into a parallel O-ring port of the same size (1/4 BSPT into 1/4 BSPP, ISO 7-1 / ISO 228-1)
    p = th.plan_adapters({"thread": "1/4 BSPP", "seal": "oring-boss"}, {"family": "pipe-bspt", "thread": "1/4 BSPT"})
    assert p["ok"] is False and p["adapters"] == []
    assert "tapered" in p["message"] and "O-ring" in p["message"]
    # a port described as tapered with an O-ring seal cannot exist
    p = th.plan_adapters({"thread": "1/4 NPT", "seal": "oring-boss"}, {"family": "orb", "dash": 4})
    assert p["ok"] is False and "tapered" in p["message"].lower()


def test_45_flare_on_37_seat_is_refused():
    # SAE J514 -4 and SAE J512 -4 45 deg flare share 7/16-20 UNF (from memory)
    p = th.plan_adapters({"thread": "7/16-20 UNF", "seal": "flare-37"}, {"family": "flare-45-sae", "dash": 4})
    assert p["ok"] is False and "45 deg flare on a 37 deg seat" in p["message"]


def test_bspp_needs_a_washer_or_oring():
    p = th.plan_adapters({"thread": "1/4 BSPP", "seal": "pipe-taper"}, {"family": "jic-37", "dash": 6})
    assert p["ok"] is False and "washer" in p["message"] and "O-ring" in p["message"]
    p = th.plan_adapters({"thread": "1/4 BSPP", "seal": "flare-37"}, {"family": "jic-37", "dash": 6})
    assert p["ok"] is False


def test_straight_thread_cannot_seal_as_pipe_taper():
    p = th.plan_adapters({"thread": "M16x1.5", "seal": "pipe-taper"}, {"family": "jic-37", "dash": 6})
    assert p["ok"] is False and "flanks" in p["message"]


@pytest.mark.parametrize("port, end", [
    ({"thread": "9/16-18 UNF", "seal": "oring-boss"}, {"family": "orb", "dash": 6}),          # SAE J1926 -6
    ({"thread": "5/8-18 UNF", "seal": "flare-45"}, {"family": "inverted-flare-45", "dash": 6}),  # SAE J512 3/8 in
    ({"thread": "M16x1.5", "seal": "cone-24"}, {"family": "cone-24-l", "tube_od_mm": 10}),   # ISO 8434-1 10L
    ({"thread": "M14x1.5", "seal": "crush-washer"}, {"family": "banjo", "thread": "M14x1.5"}),
    ({"thread": "1/4 NPT", "seal": "pipe-taper"}, {"family": "pipe-npt", "thread": "1/4 NPT"}),
    ({"thread": "3/4-16 UNF", "seal": "flare-37"}, {"family": "jic-37", "dash": 8}),          # SAE J514 -8
])
def test_direct_fits_need_no_adapter(port, end):
    p = th.plan_adapters(port, end)
    assert p["ok"] is True and p["adapters"] == [], p["message"]


def test_one_adapter_takes_the_weaker_rating_and_smaller_bore():
    p = th.plan_adapters({"thread": "M16x1.5", "seal": "metric-oring"}, {"family": "jic-37", "dash": 6})
    assert p["ok"] and len(p["adapters"]) == 1
    a = p["adapters"][0]
    ends = th.end_table()
    stud = [e for e in ends if e["family"] == "metric-oring-port" and e["thread"] == "M16x1.5"][0]
    jic = [e for e in ends if e["family"] == "jic-37" and e["dash"] == 6][0]
    assert a["working_bar"] == min(stud["working_bar"], jic["working_bar"])
    assert a["bore_mm"] == min(stud["bore_mm"], jic["bore_mm"])
    assert a["from"]["thread"] == "M16x1.5" and a["to"]["thread"] == "9/16-18 UNF"
    assert a["source"]


def test_unrated_port_side_gives_no_rating():
    # 5/8-18 UNF is not a SAE J1926 port size in the tables: no rating is invented
    p = th.plan_adapters({"thread": "5/8-18 UNF", "seal": "oring-boss"}, {"family": "jic-37", "dash": 6})
    assert p["ok"] and p["adapters"][0]["working_bar"] is None and "maker" in p["message"]
    assert "working_bar" not in th.adapter_parts(p)[0] and "family" not in th.adapter_parts(p)[0]


def test_bad_line_end_and_port_are_refused_with_the_field():
    assert "line_end.family" in th.plan_adapters({"thread": "M16x1.5", "seal": "metric-oring"},
                                                 {"family": "quick-coupler", "dash": 6})["message"]
    assert "dash -7" in th.plan_adapters({"thread": "M16x1.5", "seal": "metric-oring"},
                                         {"family": "jic-37", "dash": 7})["message"]
    assert "port.thread" in th.plan_adapters({"thread": "M17x1", "seal": "metric-oring"},
                                             {"family": "jic-37", "dash": 6})["message"]
    assert "port.seal" in th.plan_adapters({"thread": "M16x1.5", "seal": "glue"},
                                           {"family": "jic-37", "dash": 6})["message"]


def test_adapter_parts_are_valid_fitting_parts():
    p = th.plan_adapters({"thread": "3/4-16 UNF", "seal": "oring-boss"}, {"family": "cone-24-l", "tube_od_mm": 10})
    parts = th.adapter_parts(p)
    assert len(parts) == 1
    for part in parts:
        _, problems, _ = validate(model.PART, part)
        assert problems == []
        assert part["kind"] == "fitting" and part["bore_mm"] > 0
    with pytest.raises(ValueError):
        th.adapter_parts(th.plan_adapters({"thread": "1/4 NPT", "seal": "oring-boss"},
                                          {"family": "orb", "dash": 4}))


def test_job_model_port_offers_the_planner_end_families():
    field = [f for f in model.PORT.fields if f.key == "line_end_family"][0]
    assert set(field.choices) == set(th.END_FAMILIES)


def test_plan_for_port_reads_a_job_port_record():
    port, problems, _ = validate(model.PORT, {"thread": "M16x1.5", "seal": "metric-oring",
                                               "line_end_family": "jic-37", "line_end_dash": 6})
    assert problems == []
    p = th.plan_for_port(port)
    assert p["ok"] and len(p["adapters"]) == 1
    assert th.plan_for_port(None) is None


# -- command line -------------------------------------------------------------------
def test_cli_json(capsys):
    assert th.main_thread(["15.9mm", "18tpi", "--json"]) == 0
    out = json.loads(capsys.readouterr().out)
    assert isinstance(out, list) and out
    assert out[0]["thread"] == "5/8-18 UNF"   # Source: ASME B1.1 (from memory), 0.625 in x 18 tpi
    for c in out:
        assert isinstance(c["thread"], str) and isinstance(c["uses"], list)
        assert isinstance(c["fit_error_mm"], (int, float))


def test_cli_female_tapered_text(capsys):
    # 1/4 NPT internal minor at the gauge plane: E1 - 0.8 P = 0.44719 in (ASME B1.20.1, from memory)
    assert th.main_thread(["0.447in", "18tpi", "--female", "--tapered"]) == 0
    out = capsys.readouterr().out
    assert "Tolerance" in out and "1/4 NPT" in out and "thread sealant" in out


@pytest.mark.parametrize("argv, name", [(["15.9", "18tpi"], "MAJOR"), (["15.9mm", "18"], "PITCH"),
                                        (["15.9mm"], "PITCH"), (["15.9mm", "18tpi", "--male", "--female"], "female"),
                                        (["500mm", "18tpi"], "MAJOR")])
def test_cli_bad_input_exit_2(argv, name, capsys):
    assert th.main_thread(argv) == 2
    err = capsys.readouterr().err
    assert len(err.strip().splitlines()) == 1 and name in err


def test_cli_no_fit_exit_1(capsys):
    assert th.main_thread(["25mm", "3mm", "--json"]) == 1
    assert len(json.loads(capsys.readouterr().out)) == 2


def test_doctests():
    res = doctest.testmod(th, optionflags=doctest.ELLIPSIS)
    assert res.attempted > 10 and res.failed == 0
