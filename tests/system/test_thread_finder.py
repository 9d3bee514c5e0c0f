"""The thread finder's engine side: a female reading taken as the minor diameter, a pitch over 6 mm read
as threads per inch, and the seat question ranking and filtering the table threads."""
from __future__ import annotations

import pytest

from calc.data.tables import thread_seats, threads
from calc.system.threads import identify, port_choices, read_pitch

IN = 25.4  # mm per inch, exact (ISO 31 / NIST)


# -- a female reading is the minor diameter -------------------------------------------------------

def test_a_16_mm_bore_on_a_female_1_5_thread_is_nearest_m18x1_5_but_under_its_smallest_minor():
    # Source: ISO 68-1 basic profile, D1 = D - 1.082532 P; ISO 261 lists M18x1.5 and M16x1.5 (fine pitch);
    # M18x1.5: D1 = 18 - 1.623798 = 16.376 mm; M16x1.5: D1 = 14.376 mm. ISO 965-1 6H lets D1 run
    # large only (TD1 for P = 1.5 is 0.300 mm, from memory), so 16.0 mm is 0.376 mm under any M18x1.5 nut.
    r = identify(16.0, 1.5, male=False)
    first, second = r["candidates"][:2]
    assert first["thread"] == "M18x1.5" and second["thread"] == "M16x1.5"
    assert first["expected_mm"] == pytest.approx(18 - 1.082532 * 1.5, abs=5e-4)
    assert second["expected_mm"] == pytest.approx(16 - 1.082532 * 1.5, abs=5e-4)
    assert r["match"] == "none" and not first["within"]
    assert first["fit_error_mm"] == pytest.approx(16.0 - 16.376, abs=1e-3)
    assert "minor diameter" in r["tolerance"]["measured"]


@pytest.mark.parametrize("bore", [16.40, 16.50, 16.65])
def test_a_bore_inside_the_6h_minor_band_of_m18x1_5_identifies_it(bore):
    # Source: ISO 965-1 6H minor diameter of M18x1.5: 16.376 to 16.676 mm (TD1 = 0.300 mm, from memory);
    # the engine accepts 0.10 under to 0.40 over the basic minor (common practice, no source).
    r = identify(bore, 1.5, male=False)
    assert r["match"] == "good" and r["candidates"][0]["thread"] == "M18x1.5"


def test_the_same_16_mm_reading_on_a_male_thread_is_m16x1_5():
    # Source: ISO 261: M16x1.5 has a 16 mm basic major diameter; a male thread is measured across the crests.
    r = identify(16.0, 1.5, male=True)
    assert r["match"] == "good" and r["candidates"][0]["thread"] == "M16x1.5"
    assert "major diameter" in r["tolerance"]["measured"]


# -- a pitch over 6 mm is threads per inch ----------------------------------------------------------

@pytest.mark.parametrize("reading, tpi", [(18, 18), (20, 20), (11.5, 11.5), (24, 24), (8, 8)])
def test_a_pitch_over_6_mm_is_read_as_threads_per_inch(reading, tpi):
    # Source: exact, pitch = 25.4 mm / tpi; the 6 mm rule is common practice, no source (ISO 261's
    # coarsest pitch is 6 mm, from memory).
    mm, note = read_pitch(reading)
    assert mm == pytest.approx(IN / tpi, rel=1e-12)
    assert note and "threads per inch" in note and f"{reading:g} mm" in note


@pytest.mark.parametrize("reading", [0.75, 1.0, 1.5, 2.0, 3.0, 6.0])
def test_a_metric_pitch_stays_metric(reading):
    # Source: ISO 261 pitches (from memory); 6.0 mm is the limit itself and stays metric (common practice).
    assert read_pitch(reading) == (reading, None)


def test_18_in_the_pitch_box_finds_9_16_18_unf_as_18_tpi_does():
    # Source: ASME B1.1 (from memory): 9/16-18 UNF, major 0.5625 in = 14.2875 mm, 18 threads per inch.
    by_box = identify(14.2, 18)
    by_tpi = identify(14.2, pitch_tpi=18)
    assert by_box["candidates"][0]["thread"] == by_tpi["candidates"][0]["thread"] == "9/16-18 UNF"
    assert by_box["pitch_used_mm"] == pytest.approx(IN / 18, abs=1e-5)
    assert by_box["pitch_note"] and by_tpi["pitch_note"] is None
    assert [c["thread"] for c in by_box["candidates"]] == [c["thread"] for c in by_tpi["candidates"]]


# -- the seat question --------------------------------------------------------------------------------

def test_seat_answers_name_only_known_seals_and_families():
    # Source: stated behaviour: each answer of the seat question keeps ends of the fitting table.
    from calc.data.tables import end_families
    from calc.model.job import SEAL_TYPES

    for s in thread_seats():
        assert set(s["seals"]) <= set(SEAL_TYPES) and set(s["families"]) <= set(end_families())
        assert s["seals"] or s["families"]


def test_a_washer_face_or_sealant_tells_a_quarter_bspp_from_a_quarter_bspt():
    # Source: ISO 228-1 and ISO 7-1 (from memory): 1/4 BSPP and 1/4 BSPT share the 13.157 mm major diameter
    # and 19 threads per inch; ISO 1179 ports seal the parallel thread with a bonded washer, a taper
    # seals on its flanks with sealant. Calipers and a gauge cannot tell them apart; the seat can.
    plain = identify(13.1, pitch_tpi=19, male=True)
    assert {c["thread"] for c in plain["candidates"] if c["within"]} == {"1/4 BSPP", "1/4 BSPT"}
    washer = identify(13.1, pitch_tpi=19, male=True, seat="washer")
    assert [c["thread"] for c in washer["candidates"] if c["within"]] == ["1/4 BSPP"]
    taper = identify(13.1, pitch_tpi=19, male=True, seat="pipe-taper")
    assert [c["thread"] for c in taper["candidates"] if c["within"]] == ["1/4 BSPT"]
    assert not next(c for c in washer["candidates"] if c["thread"] == "1/4 BSPT")["seat_ok"]


def test_a_24_deg_cone_ranks_the_metric_thread_above_the_inch_one():
    # Source: ISO 8434-1 24 deg cone ends use metric threads (M14x1.5 on 6L/8S, from memory); SAE J514 37 deg
    # flare ends use UNF (9/16-18 on -6, from memory). A worn gauge reading of 1.45 mm lies between
    # 18 tpi (1.411 mm, exact 25.4/18) and 1.5 mm: neither fits, and the seat decides the order.
    assert identify(14.1, 1.45)["candidates"][0]["thread"] == "9/16-18 UNF"
    assert identify(14.1, 1.45, seat="flare-37")["candidates"][0]["thread"] == "9/16-18 UNF"
    cone = identify(14.1, 1.45, seat="cone-24")
    assert [c["thread"] for c in cone["candidates"]][:2] == ["M14x1.5", "9/16-18 UNF"]
    assert cone["candidates"][0]["seat_ok"] and not cone["candidates"][1]["seat_ok"]


def test_a_seat_no_end_of_the_thread_has_is_no_match_and_says_so():
    # Source: fittings.json (from memory): M14x1.5 carries 24 deg cone, metric O-ring and washer ends, no
    # inverted flare (SAE J512 inverted flare uses UNF threads).
    r = identify(13.95, 1.5, male=True, seat="inverted-flare")
    assert r["match"] == "none"
    m14 = next(c for c in r["candidates"] if c["thread"] == "M14x1.5")
    assert not m14["seat_ok"] and not m14["within"]
    assert "no end with that seat" in r["message"]


def test_port_choices_keep_the_seat_and_the_measured_gender():
    # Source: SAE J514 (from memory): -6 ends on 9/16-18 UNF are the 37 deg flare (a male stub on the
    # component) and the O-ring boss port (female); SAE J1926 ORB ports take the O-ring at the foot.
    t = threads()["9/16-18 UNF"]
    female_oring = port_choices(t, male=False, seat="o-ring")
    assert [(c["seal"], c["family"], c["port"]["line_end_dash"]) for c in female_oring] == [("oring-boss", "orb", 6)]
    male_any = port_choices(t, male=True)
    assert [(c["seal"], c["family"]) for c in male_any] == [("flare-37", "jic-37")]
    assert port_choices(t, male=True, seat="o-ring") == []


def test_every_port_choice_fits_its_line_end_with_no_adapter():
    # Source: stated behaviour: a port choice is the port and the line end that meets it directly, checked
    # with the adapter planner (calc.system.adapters, itself tested against the named standards).
    from calc.system.adapters import plan_for_port

    n = 0
    for t in threads().values():
        for male in (True, False):
            for c in port_choices(t, male):
                plan = plan_for_port({"label": "", **c["port"]})
                assert plan["ok"] and plan["adapters"] == [], (t["designation"], c)
                n += 1
    assert n > 40
