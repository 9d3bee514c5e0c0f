"""Browser tests of the route sketch, the printed build sheet and the plot readout (issue 14, items 5, 9, 10).

One build, one server, one Chromium for the module. Every figure read off the page is compared with
calc.evaluate() (or calc.pipeline.drop_curve) run in CPython on the same job, rounded at the shop precision
the README states (the rounding is exact arithmetic; inches from 25.4 mm/in exactly, psi from
14.5037738 psi/bar, NIST SP 811).
"""
from __future__ import annotations

import copy
import json
import math
import re
import time

import pytest
from playwright.sync_api import TimeoutError as PlaywrightTimeout

import calc
from calc.edges.report import CAUTIONS
from calc.edges.units import UNITS
from calc.pipeline import drop_curve
from sitebuild.assemble import build
from sitebuild.common import BuildError
from sitebuild.render import load_demos

from ..browser_support import SHOTS, launched_chromium, serve_directory

HEADER = {"customer": "Invented Customer Ltd", "vehicle": "invented light truck, pump swap", "job_number": "J-0042",
          "date": "2026-12-02"}
PSI_PER_BAR = UNITS["pressure_bar"][2]


@pytest.fixture(scope="module")
def site(tmp_path_factory):
    out = tmp_path_factory.mktemp("sheet") / "dist"
    try:
        build(out_dir=out)
    except BuildError as exc:
        pytest.fail(f"build.py could not build the page: {exc}")
    with serve_directory(out) as url:
        yield {"url": url, "demos": load_demos()}


@pytest.fixture(scope="module")
def browser(chromium):
    with launched_chromium(chromium) as (b, _):
        yield b


def _open(b, site, width=1280, height=720, touch=False):
    context = b.new_context(viewport={"width": width, "height": height}, has_touch=touch, is_mobile=touch)
    pg = context.new_page()
    errors: list[str] = []
    pg.on("pageerror", lambda e: errors.append(str(e)))
    pg.goto(site["url"])
    pg.wait_for_selector('body[data-engine="ready"]', timeout=120_000)
    pg.errors = errors
    return pg


@pytest.fixture(scope="module")
def page(browser, site):
    pg = _open(browser, site)
    yield pg
    assert not pg.errors, pg.errors
    pg.context.close()


def _settle(pg):
    pg.wait_for_function(
        "() => document.body.dataset.busy === 'false' && document.body.dataset.resultRev !== undefined"
        " && document.body.dataset.resultRev === document.body.dataset.jobRev", timeout=30_000)


def _open_job(pg, job, name="job.json"):
    pg.set_input_files("#job-open", files=[{"name": name, "mimeType": "application/json",
                                             "buffer": json.dumps(job).encode()}])
    pg.wait_for_selector(f"#file-message.ok:has-text('Opened {name}')", timeout=30_000)
    _settle(pg)
    pg.click("#file-message .dismiss")


def _units(pg, units):
    if pg.get_attribute("body", "data-units") != units:
        pg.check(f'input[name="units"][value="{units}"]')
        _settle(pg)


def _demo(site, name):
    return copy.deepcopy(next(d["job"] for d in site["demos"] if d["file"].startswith(name)))


def _truck(site, **extra):
    job = _demo(site, "light-truck-high-flow")
    job.update(HEADER, **extra)
    return job


def _sixteenths(mm, rounding=round):
    """mm as inches to the 1/16 in, written as the shop writes it ("63 5/8")."""
    n = rounding(mm / 25.4 * 16 - (1e-9 if rounding is math.ceil else 0))
    whole, num, den = n // 16, n % 16, 16
    while num and num % 2 == 0:
        num, den = num // 2, den // 2
    return (f"{whole} {num}/{den}" if whole else f"{num}/{den}") if num else f"{whole}"


# ------------------------------------------------------------------ item 5: route sketch

def test_route_sketch_in_the_line_card_has_three_views_and_every_bend_radius(page, site):
    job = _truck(site)
    _open_job(page, job, "truck.json")
    want = calc.evaluate(copy.deepcopy(job))["lines"][0]["sketch"]
    fig = page.locator('[data-line-card="0"] [data-sketch="0"]')
    assert [fig.locator("svg").nth(i).get_attribute("data-view") for i in range(3)] == ["top", "side", "front"]
    titles = fig.locator("svg .sketch-title").all_text_contents()
    assert titles == ["Top view: x to the right, y up", "Side view: x to the right, z up", "Front view: y to the right, z up"]
    # Source: exact geometry: 400 mm legs at right angles leave room for R = 400 / 2 / tan 45 deg = 200 mm
    # on the shared legs (calc.physics.route); the page shows the engine's radius at 1 mm.
    rest = want["positions"][0]
    labels = set(fig.locator(".sketch-bend-label").all_text_contents())  # each bend in the views that show it
    assert labels == {f"B{n + 1} R {round(b['radius_mm'])} mm" for n, b in enumerate(rest["bends"])}
    assert all(round(b["radius_mm"]) == 200 for b in rest["bends"])
    # the hose at rest and at both ends of the engine's 20 mm movement (10 mm each way)
    legend = fig.locator(".sketch-legend li").all_text_contents()
    assert len(legend) == 3 == len(want["positions"])
    assert legend[1].startswith("dashed: engine moved -10 mm along z") and legend[2].startswith("dotted: engine moved +10 mm along z")
    assert fig.locator('svg[data-view="side"] path.sketch-hose').count() == 3
    assert fig.locator(".sketch-caption [data-verdict]").first.text_content().strip() == "✓ OK"
    SHOTS.mkdir(parents=True, exist_ok=True)
    fig.scroll_into_view_if_needed()
    page.screenshot(path=str(SHOTS / "sketch-desktop-1280x720.png"))


def test_a_too_tight_bend_is_marked_in_words_as_well_as_colour(page, site):
    job = _truck(site)
    # Source: exact geometry: 60 mm legs at a right angle force R <= 60 mm, under the 178 mm minimum of
    # SAE 100R2AT -8 in the part tables (SAE J517, from memory).
    job["lines"][0]["route_points_mm"] = [[0, 0, 0], [60, 0, 0], [60, 60, 0]]
    _open_job(page, job, "tight.json")
    want = calc.evaluate(copy.deepcopy(job))["lines"][0]["sketch"]
    bend = want["positions"][0]["bends"][0]
    assert bend["verdict"] == "fail" and round(bend["radius_mm"]) == 60
    fig = page.locator('[data-line-card="0"] [data-sketch="0"]')
    bad = fig.locator('svg[data-view="top"] .sketch-bend-fail .sketch-bend-label')
    assert bad.text_content() == "B1 R 60 mm TOO TIGHT"
    words = fig.locator('.sketch-bends li[data-verdict="fail"]').first.text_content()
    assert "FAIL" in words and "too tight" in words and "178 mm minimum" in words
    colour = page.evaluate("() => getComputedStyle(document.querySelector('.sketch-bend-fail .sketch-bend-label')).fill")
    assert colour == "rgb(155, 0, 0)"  # the page's failing colour (--bad), beside the words
    fig.scroll_into_view_if_needed()
    page.screenshot(path=str(SHOTS / "sketch-too-tight-1280x720.png"))


def test_sketch_labels_follow_the_units_switch(page, site):
    job = _truck(site)
    _open_job(page, job, "truck.json")
    _units(page, "us")
    try:
        want = calc.evaluate(copy.deepcopy(job))["lines"][0]["sketch"]["positions"][0]["bends"][0]["radius_mm"]
        # Source: 200 mm / 25.4 mm/in = 7.874 in -> 7 7/8 in to the nearest 1/16 in (exact conversion)
        label = page.locator('[data-line-card="0"] svg[data-view="top"] .sketch-bend-label').first.text_content()
        assert label == f"B1 R {_sixteenths(want)} in" == "B1 R 7 7/8 in"
    finally:
        _units(page, "metric")


# ------------------------------------------------------------------ item 9: print

def _print(pg):
    pg.emulate_media(media="print")


def test_the_sheet_header_and_notes_come_from_the_job(page, site):
    job = _truck(site)
    _open_job(page, job, "truck.json")
    _print(page)
    try:
        for key, value in HEADER.items():
            assert page.locator(f'#sheet [data-head="{key}"]').text_content() == value
        labels = page.locator("#sheet .sheet-fields dt").all_text_contents()
        assert labels == ["Job", "Customer", "Vehicle", "Job number", "Date"]  # Source: calc.model.job labels
        assert page.locator("#sheet .sheet-notes").count() == 0  # notes stay off the sheet by default
    finally:
        page.emulate_media(media="screen")
    job["notes_on_sheet"] = True
    _open_job(page, job, "notes.json")
    assert job["notes"] in page.locator("#sheet .sheet-notes").text_content()
    # the form shows the new fields by their labels
    for label in ("Customer", "Vehicle", "Job number", "Date", "Print the notes on the build sheet",
                  "Direction of engine movement", "End on the engine"):
        assert page.locator(f'.fld-label:text-is("{label}")').count() >= 1, label


def test_print_flows_lines_together_with_one_disclaimer_and_shop_precision(page, site):
    job = _truck(site)
    _open_job(page, job, "truck.json")
    want = calc.evaluate(copy.deepcopy(job))
    _print(page)
    try:
        body = page.locator("body").inner_text()
        assert body.count("Check every rating against the maker's data") == 1
        # end families in words from the job model (calc.data fittings table names), never their keys
        from calc.data.tables import fitting_families
        assert fitting_families()["jic-37"]["name"] in page.locator("#sheet").inner_text()
        assert "jic-37" not in page.locator("#sheet").inner_text()
        for caution in CAUTIONS:
            assert body.count(caution) == 1, caution
        style = page.evaluate("""() => {
          const cs = (q) => getComputedStyle(document.querySelector(q));
          return {lineBefore: cs('#sheet .sheet-line').breakBefore, lineInside: cs('#sheet .sheet-line').breakInside,
                  h3: cs('#sheet .sheet-line h3').breakAfter, h4: cs('#sheet .sheet-block h4').breakAfter,
                  card: cs('#sheet .cut-card').breakInside, block: cs('#sheet .sheet-block').breakInside};
        }""")
        assert style == {"lineBefore": "auto", "lineInside": "auto", "h3": "avoid", "h4": "avoid",
                         "card": "avoid", "block": "avoid"}
        # one cutting card per hose assembly, its tag line with working and proof-test pressures
        cards = [j for j, ln in enumerate(want["lines"]) if ln["assembly"]["hose_cut_mm"] is not None]
        assert page.locator("#sheet [data-cut-card]").count() == len(cards)
        for j in cards:
            ln, r = want["lines"][j], want["lines"][j]["rating"]
            tag = page.locator(f'#sheet [data-tag-line="{j}"]').text_content()
            # Source: shop precision (README): cut lengths to 1 mm (never shorter), ratings to 1 bar
            assert f"cut {math.ceil(ln['assembly']['hose_cut_mm'] - 1e-9)} mm" in tag
            assert f"working {round(r['working_bar'])} bar" in tag and f"proof test {round(r['proof_test_bar'])} bar" in tag
            assert "Never exceed the maker's rated working pressure" in page.locator(f'#sheet [data-cut-card="{j}"]').text_content()
        assert page.locator('#sheet [data-cut-card="0"] [data-sketch="0"] svg').count() == 3
        # the parts in flow order, adapters by their end, and the order list from the engine's totals
        assert page.locator('#sheet [data-sheet-line="0"] .sheet-parts > li').count() == len(want["lines"][0]["parts"])
        rows = page.locator("#sheet .sheet-order table").first.locator("tbody tr")
        assert rows.count() == len(want["order"]["hoses"])
        for i, h in enumerate(want["order"]["hoses"]):
            cells = rows.nth(i).locator("th, td").all_text_contents()
            # Source: the engine's total, to 0.01 m (never shorter)
            assert cells[0] == f"{h['class']} -{h['dash']}" and cells[2] == f"{math.ceil(h['total_mm'] / 10 - 1e-9) / 100:.2f} m"
        SHOTS.mkdir(parents=True, exist_ok=True)
        page.screenshot(path=str(SHOTS / "sheet-print.png"), full_page=True)
        pdf = page.pdf(path=str(SHOTS / "sheet-print.pdf"), format="A4")
        pages = len(re.findall(rb"/Type\s*/Page[^s]", pdf))
        print(f"\nbuild sheet of {len(want['lines'])} lines: {pages} A4 pages")
        # lines flow together: at most a page per line, and two for the job's own sections (header, pump and
        # gear, order list, cautions) - a stated layout budget
        assert 1 <= pages <= len(want["lines"]) + 2
    finally:
        page.emulate_media(media="screen")


def test_us_sheet_rounds_cut_lengths_to_sixteenths_and_ratings_to_5_psi(page, site):
    job = _truck(site)
    _open_job(page, job, "truck.json")
    _units(page, "us")
    want = calc.evaluate(copy.deepcopy(job))["lines"][0]
    try:
        tag = page.locator('#sheet [data-tag-line="0"]').text_content()
        cut = want["assembly"]["hose_cut_mm"]
        work = 5 * round(want["rating"]["working_bar"] * PSI_PER_BAR / 5)
        # Source: 25.4 mm/in and 14.5037738 psi/bar exactly (NIST SP 811); 1/16 in up, 5 psi nearest (README)
        assert f"cut {_sixteenths(cut, math.ceil)} in" in tag and f"working {work} psi" in tag
        assert f"proof test {5 * round(want['rating']['proof_test_bar'] * PSI_PER_BAR / 5)} psi" in tag
    finally:
        _units(page, "metric")


# ------------------------------------------------------------------ item 10: plot readout

def _readout(pg, chart):
    return pg.locator(f'[data-readout="{chart}"]').text_content()


def _tap_left_end(pg, chart):
    """Tap near the left end of a plot and return its readout. The results may be drawn again just after the
    tap (a result arriving for the unit switch), which puts a fresh readout in its place: then tap again."""
    for _ in range(3):
        svg = pg.locator(f'svg[data-chart="{chart}"]')
        svg.scroll_into_view_if_needed()
        box = svg.bounding_box()
        pg.touchscreen.tap(box["x"] + 60, box["y"] + box["height"] * 0.3)
        try:
            pg.wait_for_function("(c) => !document.querySelector(`[data-readout=\"${c}\"]`).textContent.startsWith('Point at')",
                                 arg=chart, timeout=5_000)
        except PlaywrightTimeout:  # the readout was drawn again: tap the new plot
            continue
        break
    return _readout(pg, chart)


def test_plot_readout_follows_the_pointer_and_the_keys(page, site):
    job = _truck(site)
    _open_job(page, job, "truck.json")
    page.wait_for_selector('svg[data-chart="drop-vs-temp"]', timeout=30_000)
    curve = drop_curve(copy.deepcopy(job))
    svg = page.locator('svg[data-chart="drop-vs-temp"]')
    assert page.locator('[data-readout="drop-vs-temp"]').get_attribute("aria-live") == "polite"
    svg.focus()
    page.keyboard.press("ArrowRight")
    page.keyboard.press("ArrowRight")
    text = _readout(page, "drop-vs-temp")
    c = curve["conditions"][1]
    # Source: calc.pipeline.drop_curve in CPython: the second temperature of the curve and every line's drop
    assert text.startswith(f"fluid temperature {c['fluid_temp_c']:.1f} °C:")
    for ln, row in zip(curve["lines"], c["lines"]):
        assert f"{ln['name']} {row['pressure_drop_bar']:.2f} bar" in text
    box = svg.bounding_box()
    page.mouse.move(box["x"] + box["width"] - 30, box["y"] + box["height"] * 0.3)  # far right of the plot
    last = curve["conditions"][-1]
    assert _readout(page, "drop-vs-temp").startswith(f"fluid temperature {last['fluid_temp_c']:.1f} °C:")
    assert page.locator('svg[data-chart="drop-vs-temp"] .cursor').get_attribute("visibility") == "visible"


def test_plot_readout_works_with_a_finger_on_a_phone_in_us_units(browser, site):
    pg = _open(browser, site, 390, 844, touch=True)
    try:
        job = _truck(site)
        _open_job(pg, job, "truck.json")
        _units(pg, "us")
        pg.click('#view-switch button[data-view="results"]')  # a phone shows one pane at a time
        pg.wait_for_selector('svg[data-chart="flow-vs-speed"]', timeout=30_000)
        text = _tap_left_end(pg, "flow-vs-speed")
        points = calc.evaluate(copy.deepcopy(job))["pump_curve"]["points"]
        m = re.fullmatch(r"engine speed (\d+) rpm: delivered flow (\d+\.\d{3}) gpm", text)
        assert m, text
        # Source: calc.evaluate's pump curve in CPython, converted by the engine's unit table (L/min -> US gpm):
        # the finger near the left end reads one of the lowest computed points, speed and flow together.
        at = next(p for p in points if f"{p['engine_rpm']:.0f}" == m[1])
        assert m[2] == f"{at['delivered_lpm'] * UNITS['flow_lpm'][2]:.3f}"
        assert points.index(at) < len(points) // 4
        SHOTS.mkdir(parents=True, exist_ok=True)
        pg.screenshot(path=str(SHOTS / "plot-readout-phone-390.png"))
        fig = pg.locator('[data-line-card="0"] [data-sketch="0"]')
        fig.scroll_into_view_if_needed()
        assert fig.bounding_box()["width"] <= 390  # the three views stack inside a phone's width
        pg.screenshot(path=str(SHOTS / "sketch-phone-390.png"))
        assert not pg.errors, pg.errors
    finally:
        pg.context.close()
