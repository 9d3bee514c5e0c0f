"""Thread identification and the adapter planner.

Identification is checked by round trips and by the pairs of sizes a fitter must tell apart; the
planner against the sealing rules.
"""
import pytest
from hypothesis import given, settings, strategies as st

from calc.data.tables import ends, find_thread
from calc.model.job import PART, PORT
from calc.model.schema import validate
from calc.system.adapters import END_FAMILIES, adapter_parts, plan_adapters, plan_for_port
from calc.system.threads import expected_reading_mm, identify, parse_length, parse_pitch, thread_table

IN = 25.4  # mm per inch, exact by definition (international inch, 1959)


def _t(designation):
    row = find_thread(designation)
    assert row is not None, designation
    return row


# -- identification ---------------------------------------------------------------
THREADS = thread_table()


@settings(max_examples=150, deadline=None)
@given(t=st.sampled_from(THREADS), male=st.booleans())
def test_round_trip_nominal_identifies_itself_first(t, male):
    r = identify(expected_reading_mm(t, male), t["pitch_mm"], male=male, tapered=t["tapered"])
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
                if abs(expected_reading_mm(u, male) - expected_reading_mm(t, male)) < 0.45:
                    out.add(u["designation"])
    return out


SEPARABLE = [t for t in THREADS if not _twins(t)]


def test_only_the_pipe_thread_pairs_are_inseparable_by_calipers():
    # 1/2 and 3/4 NPT and BSPT share 14 tpi and differ by 0.13-0.27 mm at the gauge plane
    # (ASME B1.20.1, ISO 7-1, from memory): only the thread angle (60 vs 55 deg) separates them.
    twins = {t["designation"]: _twins(t) for t in THREADS if _twins(t)}
    assert twins == {"1/2 NPT": {"1/2 BSPT"}, "1/2 BSPT": {"1/2 NPT"},
                     "3/4 NPT": {"3/4 BSPT"}, "3/4 BSPT": {"3/4 NPT"}}
    r = identify(_t("3/4 NPT")["gauge_major_mm"], IN / 14, male=True, tapered=True)
    assert {c["thread"] for c in r["candidates"] if c["within"]} == {"3/4 NPT", "3/4 BSPT"}
    assert "thread angle" in r["message"]


@settings(max_examples=200, deadline=None)
@given(t=st.sampled_from(SEPARABLE), male=st.booleans(), frac=st.floats(0.0, 1.0))
def test_worn_or_tolerance_readings_still_identify_themselves(t, male, frac):
    # male readings anywhere from 0.30 mm under to 0.08 mm over; female from 0.08 under to 0.35 over
    # (inside the stated tolerance; common practice)
    lo, hi = (-0.30, 0.08) if male else (-0.08, 0.35)
    reading = expected_reading_mm(t, male) + lo + frac * (hi - lo)
    r = identify(reading, t["pitch_mm"], male=male, tapered=t["tapered"])
    assert r["candidates"][0]["thread"] == t["designation"]


def test_5_8_18_unf_and_m16x1_5_told_apart_by_pitch():
    # Source: ASME B1.1 / ISO 261 (from memory): 15.875 mm x 1.411 mm against 16 mm x 1.5 mm
    r = identify(15.85, parse_pitch("18tpi"))
    assert r["candidates"][0]["thread"] == "5/8-18 UNF"
    assert "M16x1.5" not in [c["thread"] for c in r["candidates"] if c["within"]]
    r = identify(15.85, parse_pitch("1.5mm"))
    assert r["candidates"][0]["thread"] == "M16x1.5"
    assert "5/8-18 UNF" not in [c["thread"] for c in r["candidates"] if c["within"]]


def test_9_16_18_unf_and_m14x1_5_told_apart_by_pitch():
    # Source: ASME B1.1 / ISO 261 (from memory): 14.29 mm x 18 tpi against 14 mm x 1.5 mm
    assert identify(14.1, IN / 18)["candidates"][0]["thread"] == "9/16-18 UNF"
    assert identify(14.1, 1.5)["candidates"][0]["thread"] == "M14x1.5"


def test_quarter_bspp_and_quarter_npt_told_apart_by_pitch_and_taper():
    # Source: ISO 228-1 / ASME B1.20.1 (from memory): 19 tpi against 18 tpi
    r = identify(13.1, IN / 19, tapered=False)
    assert r["candidates"][0]["thread"] == "1/4 BSPP"
    assert all(c["thread"] != "1/4 NPT" for c in r["candidates"] if c["within"])
    r = identify(13.6, IN / 18, tapered=True)
    assert r["candidates"][0]["thread"] == "1/4 NPT"
    assert all(not c["thread"].endswith(("BSPP", "BSPT")) for c in r["candidates"] if c["within"])
    # same size and pitch, parallel against tapered: only the taper decides (ISO 228-1 vs ISO 7-1)
    assert identify(13.1, IN / 19, tapered=True)["candidates"][0]["thread"] == "1/4 BSPT"
    unknown = identify(13.1, IN / 19)
    assert {c["thread"] for c in unknown["candidates"] if c["within"]} == {"1/4 BSPP", "1/4 BSPT"}
    assert "tapered" in unknown["message"]


def test_pitch_is_matched_tightly():
    # 18 tpi = 1.4111 mm; a 1.5 mm gauge is 6 % off and must not fit (pitch tolerance 1 %, common practice)
    r = identify(14.2875, 1.5)
    assert all(c["thread"] != "9/16-18 UNF" for c in r["candidates"] if c["within"])
    assert r["tolerance"]["pitch_percent"] == 1.0


def test_no_fit_names_the_nearest_two():
    r = identify(25.0, 3.0)
    assert r["match"] == "none" and len(r["candidates"]) == 2
    assert not any(c["within"] for c in r["candidates"])
    for c in r["candidates"]:
        assert c["thread"] in r["message"]
    assert "tolerance" in r["message"]


def test_candidate_shape_and_tolerance_statement():
    r = identify(14.2, IN / 18, male=False)
    assert set(r) == {"tolerance", "candidates", "match", "message", "pitch_used_mm", "pitch_note", "seat"}
    assert "minor diameter" in r["tolerance"]["measured"]
    c = r["candidates"][0]
    for key in ("thread", "family", "fit_error_mm", "pitch_error_mm", "score", "uses", "seals", "source",
                "window_mm", "within", "seat_ok", "port_choices"):
        assert key in c
    assert c["window_mm"][0] <= c["expected_mm"] <= c["window_mm"][1]


@pytest.mark.parametrize("args, name", [((float("nan"), 1.5), "major_mm"), ((-1.0, 1.5), "major_mm"),
                                        ((16.0, 0.0), "pitch_mm"), ((16.0, "1.5"), "pitch_mm"),
                                        ((10 ** 400, 1.5), "major_mm"), ((16.0, -10 ** 400), "pitch_mm"),
                                        ((True, 1.5), "major_mm"), ((16.0, 1.5, "no"), "male"),
                                        ((16.0, 1.5, 1), "male"), ((16.0, 1.5, True, "yes"), "tapered")])


def test_identify_rejects_bad_numbers(args, name):
    # Source: stated behaviour: a bad reading is refused naming the argument ("male": "no" is not a male thread).
    with pytest.raises(ValueError, match=f"^{name}: "):
        identify(*args)


# -- parsing ----------------------------------------------------------------------


@pytest.mark.parametrize("text, mm", [
    ("15.9mm", 15.9), ("15.9 mm", 15.9), ("0.625in", 15.875), ("5/8in", 15.875), ("5/8 in", 15.875),
    ('0.625"', 15.875), ("1-1/16in", 26.9875), ("1 1/16 inch", 26.9875), (".5in", 12.7),
])  # Source: 1 in = 25.4 mm exactly (international inch)


def test_parse_length(text, mm):
    assert parse_length(text) == pytest.approx(mm, abs=1e-9)


@pytest.mark.parametrize("text", ["15.9", "mm", "abc", "0mm", "-3mm", "1/0in", "15.9 furlongs", "",
                                  "9" * 400 + "mm", "1/" + "9" * 400 + "in", "0." + "0" * 400 + "1mm", "15,9mm"])
def test_parse_length_rejects(text):
    # Source: stated behaviour: text that is no caliper reading is refused in one line (never OverflowError).
    with pytest.raises(ValueError) as info:
        parse_length(text)
    assert "\n" not in str(info.value) and len(str(info.value)) < 120


@pytest.mark.parametrize("text, mm", [("18tpi", IN / 18), ("18 TPI", IN / 18), ("11.5tpi", IN / 11.5),
                                      ("1.5mm", 1.5), ("2 mm", 2.0)])


def test_parse_pitch(text, mm):
    assert parse_pitch(text) == pytest.approx(mm, abs=1e-12)


@pytest.mark.parametrize("text", ["18", "1.5", "tpi", "0tpi", "x mm", "9" * 400 + "tpi", "9" * 400 + "mm",
                                  "0." + "0" * 400 + "1tpi", "1,5mm"])
def test_parse_pitch_rejects(text):
    # Source: stated behaviour: text that is no pitch is refused in one line (never OverflowError or ZeroDivisionError).
    with pytest.raises(ValueError) as info:
        parse_pitch(text)
    assert "\n" not in str(info.value) and len(str(info.value)) < 120


# -- adapter planner ---------------------------------------------------------------


def test_tapered_thread_into_oring_port_is_refused_with_a_reason():
    # a tapered male into a parallel O-ring port of the same size (1/4 BSPT into 1/4 BSPP, ISO 7-1 / ISO 228-1)
    p = plan_adapters({"thread": "1/4 BSPP", "seal": "oring-boss"}, {"family": "pipe-bspt", "thread": "1/4 BSPT"})
    assert p["ok"] is False and p["adapters"] == []
    assert "tapered" in p["message"] and "O-ring" in p["message"]
    # a port described as tapered with an O-ring seal cannot exist
    p = plan_adapters({"thread": "1/4 NPT", "seal": "oring-boss"}, {"family": "orb", "dash": 4})
    assert p["ok"] is False and "tapered" in p["message"].lower()


def test_45_flare_on_37_seat_is_refused():
    # SAE J514 -4 and SAE J512 -4 45 deg flare share 7/16-20 UNF (from memory)
    p = plan_adapters({"thread": "7/16-20 UNF", "seal": "flare-37"}, {"family": "flare-45-sae", "dash": 4})
    assert p["ok"] is False and "45 deg flare on a 37 deg seat" in p["message"]


def test_bspp_needs_a_washer_or_oring():
    p = plan_adapters({"thread": "1/4 BSPP", "seal": "pipe-taper"}, {"family": "jic-37", "dash": 6})
    assert p["ok"] is False and "washer" in p["message"] and "O-ring" in p["message"]
    p = plan_adapters({"thread": "1/4 BSPP", "seal": "flare-37"}, {"family": "jic-37", "dash": 6})
    assert p["ok"] is False


def test_straight_thread_cannot_seal_as_pipe_taper():
    p = plan_adapters({"thread": "M16x1.5", "seal": "pipe-taper"}, {"family": "jic-37", "dash": 6})
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
    p = plan_adapters(port, end)
    assert p["ok"] is True and p["adapters"] == [], p["message"]


def test_one_adapter_takes_the_weaker_rating_and_smaller_bore():
    p = plan_adapters({"thread": "M16x1.5", "seal": "metric-oring"}, {"family": "jic-37", "dash": 6})
    assert p["ok"] and len(p["adapters"]) == 1
    a = p["adapters"][0]
    rows = ends()
    stud = [e for e in rows if e["family"] == "metric-oring-port" and e["thread"] == "M16x1.5"][0]
    jic = [e for e in rows if e["family"] == "jic-37" and e["dash"] == 6][0]
    # Source: stated rule: an adapter is rated as its weaker end and passes its smaller bore.
    assert a["working_bar"] == min(stud["working_bar"], jic["working_bar"])
    assert a["bore_mm"] == min(stud["bore_mm"], jic["bore_mm"])
    # Source: calc/data/fittings.json (from memory): the ISO 6149-2 M16x1.5 stud 250 bar (the lower of two recalled
    # figures) under the SAE J514 -6 end's 310.3 bar; the -6 end's 7.1 mm bore (typical of steel adapters) under
    # the stud's 9.0 mm.
    assert (stud["working_bar"], jic["working_bar"], a["working_bar"]) == (250.0, 310.3, 250.0)
    assert (stud["bore_mm"], jic["bore_mm"], a["bore_mm"]) == (9.0, 7.1, 7.1)
    assert a["from"]["thread"] == "M16x1.5" and a["to"]["thread"] == "9/16-18 UNF"
    assert a["source"]


def test_unrated_port_side_gives_no_rating():
    # Source: stated rule (no rating is invented): 5/8-18 UNF is not a SAE J1926 port size in the tables
    # (calc/data/fittings.json lists the J1926 ports from memory).
    p = plan_adapters({"thread": "5/8-18 UNF", "seal": "oring-boss"}, {"family": "jic-37", "dash": 6})
    assert p["ok"] and p["adapters"][0]["working_bar"] is None and "maker" in p["message"]
    assert "working_bar" not in adapter_parts(p)[0] and "family" not in adapter_parts(p)[0]


def test_bad_line_end_and_port_are_refused_with_the_field():
    assert "line_end.family" in plan_adapters({"thread": "M16x1.5", "seal": "metric-oring"},
                                                 {"family": "quick-coupler", "dash": 6})["message"]
    assert "dash -7" in plan_adapters({"thread": "M16x1.5", "seal": "metric-oring"},
                                         {"family": "jic-37", "dash": 7})["message"]
    assert "port.thread" in plan_adapters({"thread": "M17x1", "seal": "metric-oring"},
                                             {"family": "jic-37", "dash": 6})["message"]
    assert "port.seal" in plan_adapters({"thread": "M16x1.5", "seal": "glue"},
                                           {"family": "jic-37", "dash": 6})["message"]


def test_adapter_parts_are_valid_fitting_parts():
    p = plan_adapters({"thread": "3/4-16 UNF", "seal": "oring-boss"}, {"family": "cone-24-l", "tube_od_mm": 10})
    parts = adapter_parts(p)
    assert len(parts) == 1
    for part in parts:
        _, problems, _ = validate(PART, part)
        assert problems == []
        assert part["kind"] == "fitting" and part["bore_mm"] > 0
    with pytest.raises(ValueError):
        adapter_parts(plan_adapters({"thread": "1/4 NPT", "seal": "oring-boss"},
                                          {"family": "orb", "dash": 4}))


def test_job_model_port_offers_the_planner_end_families():
    field = [f for f in PORT.fields if f.key == "line_end_family"][0]
    assert set(field.choices) == set(END_FAMILIES)


def test_plan_for_port_reads_a_job_port_record():
    port, problems, _ = validate(PORT, {"thread": "M16x1.5", "seal": "metric-oring",
                                               "line_end_family": "jic-37", "line_end_dash": 6})
    assert problems == []
    p = plan_for_port(port)
    assert p["ok"] and len(p["adapters"]) == 1
    assert plan_for_port(None) is None


PORTS = [{"thread": "M16x1.5", "seal": "metric-oring"}, {"thread": "3/4-16 UNF", "seal": "oring-boss"},
         {"thread": "9/16-18 UNF", "seal": "oring-boss"}, {"thread": "1/4 NPT", "seal": "pipe-taper"},
         {"thread": "M14x1.5", "seal": "crush-washer"}, {"thread": "1/4 BSPP", "seal": "crush-washer"}]


def test_every_adapter_is_rated_as_its_family_table_says():
    # Source: calc/data/fittings.json, the one home of each family's rating per size (from memory):
    # an adapter takes the lower of its two ends' figures, and a fitting part of that family and size
    # is rated with the same figure.
    from calc.data.tables import family_rating, fitting_families, size_row
    from calc.system.rating import part_ratings
    fams = fitting_families()
    planned = 0
    for port in PORTS:
        for e in ends():
            size = {"thread": e["thread"]} if e["dash"] is None else {"dash": e["dash"]}
            if e["family"].startswith("cone-24"):
                size = {"tube_od_mm": e["tube_od_mm"]}
            plan = plan_adapters(port, {"family": e["family"], **size})
            if not plan["ok"] or not plan["adapters"]:
                continue
            a = plan["adapters"][0]
            port_rows = [r for r in ends() if r["thread"] == find_thread(port["thread"])["designation"]
                         and r["seal"].replace("metric-oring", "oring-boss") == port["seal"].replace("metric-oring", "oring-boss")
                         and r["family"] != "banjo"]
            end_rating = family_rating(fams[e["family"]], e)
            ratings = [family_rating(fams[r["family"]], r) for r in port_rows]
            if a["working_bar"] is None:
                continue
            planned += 1
            assert a["working_bar"] == min([end_rating] + [r for r in ratings if r is not None]), a["name"]
            part = adapter_parts(plan)[0]
            if part.get("family") and part.get("dash") is not None:
                row = size_row(fams[part["family"]]["sizes"], part["dash"])
                assert family_rating(fams[part["family"]], row) == a["working_bar"], a["name"]
            rated = part_ratings([dict(part, max_temp_c=None, cutoff_mm=0.0, end="inline")],
                                 {"hose_design_factor": 4.0, "tube_design_factor": 4.0}, 80.0, -20.0)[0]
            assert rated["working_bar"] == a["working_bar"], a["name"]
    assert planned >= 20
