"""The pump's flow table on the page (Playwright, Chromium): an editable list of rows declared by the job
model, cells read in the shown units, a row being typed kept as a draft with its reason in words while the job
keeps its last complete table, the engine's errors shown on the cell's table in words, undo, and the table's
rows marked on the plot of delivered flow. Every figure read off the page is compared with calc (CPython) on
the same job. Screenshots (1280x720 and a 390 px phone) go to test-screens/ for a person to look at."""

from __future__ import annotations

import copy
import re

import calc
from calc.edges.units import UNITS

from .test_page import SHOTS, _job, _open_job, _settle, page, site  # noqa: F401  (module fixtures)

TABLE = 'fieldset[data-seg="pump"] [data-kind="table"]'
GPM_PER_LPM = UNITS["flow_lpm"][2]


def _truck(site):  # noqa: F811
    return copy.deepcopy(next(d["job"] for d in site["demos"] if d["file"] == "light-truck-high-flow.json"))


def _cells(pg):
    return pg.eval_on_selector_all(f"{TABLE} tbody tr", "(rows) => rows.map((r) => [...r.querySelectorAll('input')].map((i) => i.value))")


def _error(pg):
    return pg.locator('fieldset[data-seg="pump"] .fld-table .fld-error').text_content()


def _cell(pg, row, col):
    return pg.locator(f'{TABLE} input[data-cell="{row},{col}"]')


def _type(pg, row, col, text):
    """Type into a cell and leave it, as a user does (the table reads a cell on its change)."""
    _cell(pg, row, col).fill(text)
    _cell(pg, row, col).dispatch_event("change")


def _metric(pg):
    if pg.get_attribute("body", "data-units") != "metric":
        pg.check('input[name="units"][value="metric"]')
        _settle(pg)


def test_the_table_shows_the_jobs_rows_and_the_plot_marks_them(page, site):  # noqa: F811
    _metric(page)
    job = _truck(site)
    _open_job(page, job, "truck.json")
    assert _cells(page) == [[f"{r:g}", f"{q:g}"] for r, q in job["pump"]["flow_table_rpm_lpm"]]
    # Source: calc.evaluate (CPython) on the same job: the plot's marks are the engine's table rows.
    rows = calc.evaluate(copy.deepcopy(job))["pump_curve"]["table"]
    marks = page.locator('svg[data-chart="flow-vs-speed"] g[data-series="pump\'s flow table"] .mk')
    assert marks.count() == len(rows)
    note = page.locator('[data-readout="flow-vs-speed"] ~ .plot-note').text_content()
    for r in rows:
        assert f"{r['pump_rpm']:.0f} rpm pump ({r['engine_rpm']:.0f} rpm engine) {r['table_lpm']:.2f} L/min" in note
    SHOTS.mkdir(parents=True, exist_ok=True)
    page.set_viewport_size({"width": 1280, "height": 720})
    page.locator(TABLE).scroll_into_view_if_needed()
    page.screenshot(path=str(SHOTS / "flow-table-desktop.png"))
    page.locator('svg[data-chart="flow-vs-speed"]').scroll_into_view_if_needed()
    page.screenshot(path=str(SHOTS / "flow-table-plot-desktop.png"))
    page.set_viewport_size({"width": 1366, "height": 768})


def test_a_cell_edit_reaches_the_job_and_the_engine(page, site):  # noqa: F811
    _metric(page)
    job = _truck(site)
    _open_job(page, job, "truck.json")
    _type(page, 1, 1, "12.5")
    _settle(page)
    job["pump"]["flow_table_rpm_lpm"][1][1] = 12.5
    assert _job(page)["pump"]["flow_table_rpm_lpm"] == job["pump"]["flow_table_rpm_lpm"]
    # Source: calc.evaluate (CPython) on the job as edited: the mark of row 2 moves to 12.50 L/min.
    row = calc.evaluate(copy.deepcopy(job))["pump_curve"]["table"][1]
    assert f"{row['table_lpm']:.2f} L/min" in page.locator(".plot-note").first.text_content()


def test_bad_text_is_refused_with_the_cell_in_words_and_the_job_keeps_its_table(page, site):  # noqa: F811
    _metric(page)
    job = _truck(site)
    _open_job(page, job, "truck.json")
    _type(page, 2, 0, "2,000")
    msg = _error(page)
    assert msg.startswith("Pump speed in row 3: use a point for decimals: 2,000 was not taken")
    assert "the last complete table is kept" in msg
    assert _cell(page, 2, 0).get_attribute("aria-invalid") == "true"
    assert _cell(page, 2, 0).input_value() == "2,000"  # what was typed stays in the cell
    assert _job(page)["pump"]["flow_table_rpm_lpm"] == job["pump"]["flow_table_rpm_lpm"]
    _type(page, 2, 0, "2000")
    _settle(page)
    assert page.locator('fieldset[data-seg="pump"] .fld-table .fld-error').is_hidden()


def test_rows_are_added_typed_and_removed_with_undo(page, site):  # noqa: F811
    _metric(page)
    job = _truck(site)
    _open_job(page, job, "truck.json")
    n = len(job["pump"]["flow_table_rpm_lpm"])
    page.click(f"{TABLE} .add-row")
    assert len(_cells(page)) == n + 1
    assert f"row {n + 1} is not complete: type its pump speed and delivered flow" in _error(page)
    assert len(_job(page)["pump"]["flow_table_rpm_lpm"]) == n  # a draft row is not in the job
    _type(page, n, 0, "6000")
    _type(page, n, 1, "8.5")
    _settle(page)
    assert _job(page)["pump"]["flow_table_rpm_lpm"][-1] == [6000.0, 8.5]
    page.click(f'{TABLE} tr[data-row="0"] .remove-row')
    _settle(page)
    rows = _job(page)["pump"]["flow_table_rpm_lpm"]
    assert len(rows) == n and rows[0] == job["pump"]["flow_table_rpm_lpm"][1]
    page.click("#edit-undo")
    _settle(page)
    assert _job(page)["pump"]["flow_table_rpm_lpm"][0] == job["pump"]["flow_table_rpm_lpm"][0]


def test_the_engines_error_names_the_row_and_column(page, site):  # noqa: F811
    _metric(page)
    job = _truck(site)
    _open_job(page, job, "truck.json")
    _type(page, 2, 0, "900")  # below row 2's 1000 rpm
    _settle(page)
    job["pump"]["flow_table_rpm_lpm"][2][0] = 900
    # Source: calc.evaluate (CPython) on the same job: the engine's own words for that cell.
    err = next(e for e in calc.evaluate(copy.deepcopy(job))["errors"] if e["path"] == "pump.flow_table_rpm_lpm[2][0]")
    assert f"{err['label']}: {err['message']}" in _error(page)
    assert _cell(page, 2, 0).get_attribute("aria-invalid") == "true"


def test_us_units_show_gpm_and_read_gpm(page, site):  # noqa: F811
    job = _truck(site)
    _open_job(page, job, "truck.json")
    page.check('input[name="units"][value="us"]')
    _settle(page)
    assert "gpm" in page.locator(f"{TABLE} thead").text_content()
    shown = float(_cell(page, 1, 1).input_value())
    # Source: the engine's unit table (L/min -> US gpm, NIST SP 811), applied to the job's 13 L/min.
    assert abs(shown - 13.0 * GPM_PER_LPM) < 0.0006
    _type(page, 1, 1, "3")
    _settle(page)
    assert abs(_job(page)["pump"]["flow_table_rpm_lpm"][1][1] - 3 / GPM_PER_LPM) < 1e-9
    _metric(page)


def test_the_table_fits_a_phone(page, site):  # noqa: F811
    _metric(page)
    _open_job(page, _truck(site), "truck.json")
    page.set_viewport_size({"width": 390, "height": 844})
    try:
        page.locator(TABLE).scroll_into_view_if_needed()
        width = page.evaluate("() => document.documentElement.scrollWidth")
        assert width <= 390, width
        SHOTS.mkdir(parents=True, exist_ok=True)
        page.screenshot(path=str(SHOTS / "flow-table-phone-390.png"))
        assert re.search(r"Flow table", page.locator(".fld-table .fld-label").first.text_content())
    finally:
        page.set_viewport_size({"width": 1366, "height": 768})


def test_empty_fields_show_what_the_engine_uses(page, site):  # noqa: F811
    _metric(page)
    _open_job(page, _truck(site), "truck.json")
    # Source: calc.evaluate (CPython): the ratio used is 168 / 140 = 1.2 (exact), shown as the empty field's
    # placeholder; the flow-control setting is not used while the table is given.
    ratio = calc.evaluate(_truck(site))["pump_curve"]["pulley_ratio"]
    assert abs(ratio - 1.2) < 1e-12
    assert page.get_attribute('fieldset[data-seg="pump"] input[data-key="pulley_ratio"]', "placeholder") == "used: 1.2"
    assert page.get_attribute('fieldset[data-seg="pump"] input[data-key="flow_limit_lpm"]', "placeholder") == \
        "not used: the flow table below"


def test_the_build_sheet_shows_the_pump_and_the_gear(page, site):  # noqa: F811
    _metric(page)
    job = _truck(site)
    _open_job(page, job, "truck.json")
    page.emulate_media(media="print")
    try:
        text = page.locator("#sheet .sheet-pump").inner_text()
        assert "168 mm crank, 140 mm pump: ratio 1.20" in text
        # Source: the job's own table rows at shop precision (10 rpm, 0.1 L/min; README's table).
        assert "600 rpm 8.0 L/min; 1000 rpm 13.0 L/min; 2000 rpm 13.0 L/min; 3500 rpm 10.5 L/min; 5000 rpm 9.0 L/min" in text
        assert "Gear's maximum working pressure\n120 bar" in text and "9.5 L/min" in text
        # Source: calc.evaluate (CPython) on the same job: the engine's own verdict sentence on the gear.
        gear_flow = next(c for c in calc.evaluate(copy.deepcopy(job))["circuit"]["checks"] if c["check"] == "gear flow")
        assert gear_flow["message"] in text
        SHOTS.mkdir(parents=True, exist_ok=True)
        page.screenshot(path=str(SHOTS / "flow-table-sheet-print.png"), full_page=True)
    finally:
        page.emulate_media(media="screen")
