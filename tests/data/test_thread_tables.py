"""Thread and fitting-end tables against the standards they come from (recalled, so marked "from memory")."""
import pytest

from calc.data.tables import ends, find_thread
from calc.model.job import SEAL_TYPES
from calc.system.threads import expected_reading_mm, thread_table

IN = 25.4  # mm per inch, exact by definition (international inch, 1959)


def _t(designation):
    row = find_thread(designation)
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
    assert expected_reading_mm(row, male=False) == pytest.approx(minor_mm, abs=0.002)


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
    # Source: ASME B1.20.1 (from memory): the major diameter grows 1:16 from the small end and reaches the pipe's
    # outside diameter past the gauge plane, within the effective thread length L2, so the OD lies above the
    # small-end major; the 0.2 mm over the gauge-plane major is a margin of 3.2 mm of thread past it at 1:16
    # (common practice, no source).
    assert (row["E0_in"] + 0.8 / tpi) * IN < row["major_mm"] < row["gauge_major_mm"] + 0.2


def test_metric_and_unified_minor_convention():
    # Source: ISO 724 (from memory): M16x1.5 internal basic minor D1 = 14.376 mm
    assert expected_reading_mm(_t("M16x1.5"), male=False) == pytest.approx(14.376, abs=0.001)
    # Source: ASME B1.1 (from memory): 3/4-16 UNF-2B minimum minor diameter 0.682 in
    assert expected_reading_mm(_t("3/4-16 UNF"), male=False) / IN == pytest.approx(0.682, abs=0.001)


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
    rows = [e for e in ends() if e["family"] == family and e["size"] == size]
    assert [e["thread"] for e in rows] == [thread]


def test_every_row_has_a_source_and_consistent_pitch():
    for t in thread_table():
        assert t["source"].strip(), t
        if t["tpi"]:
            assert t["pitch_mm"] == pytest.approx(IN / t["tpi"], abs=1e-5), t["designation"]
    for e in ends():
        assert e["source"].strip() and e["rating_source"].strip(), e
        assert e["seal"] in SEAL_TYPES, e
        assert e["thread"] is None or find_thread(e["thread"]) is not None, e
    designations = [t["designation"] for t in thread_table()]
    assert len(designations) == len(set(designations))
