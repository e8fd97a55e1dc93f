"""Browser check: headless Chromium opens each report, finds no console error, renders the
drawings, fits the printed page width and prints a PDF of the asked paper size.

Chromium is driven over the DevTools protocol on a pipe (cdp.py, standard library only).
Page sizes checked against ISO 216 (A4 = 210 x 297 mm = 595.28 x 841.89 pt) and ANSI/ASME
Y14.1 (Letter = 8.5 x 11 in = 612 x 792 pt); 1 pt = 1/72 in (PDF 1.7, ISO 32000-1, 8.3.2.3).
"""

from __future__ import annotations

import re
from collections.abc import Iterator
from pathlib import Path

import pytest
from cdp import Browser, find_chromium

from rating.batch import rate_folder
from rating.inventory.problems import Problem
from rating.pipeline import RateOutcome
from rating.report import render_report
from rating.results import RatingResults

CHROMIUM = find_chromium()
pytestmark = pytest.mark.skipif(
    CHROMIUM is None,
    reason="Chromium is not installed here (Debian: apt-get install chromium); the browser "
    "check of the HTML report cannot run")

# printable width of the page between the @page margins (13 mm each side), CSS px at 96/in
A4_CONTENT_PX = round((210 - 26) / 25.4 * 96)
LETTER_CONTENT_PX = round((8.5 * 25.4 - 26) / 25.4 * 96)

SIZES = """(() => {
  const out = {};
  for (const cls of ['elevation', 'legend', 'influence', 'packing']) {
    out[cls] = [...document.querySelectorAll('svg.' + cls)].map(s => {
      const r = s.getBoundingClientRect(); return [r.width, r.height];
    });
  }
  const body = document.body.getBoundingClientRect();
  const wide = [...document.querySelectorAll('body *')]
    .filter(e => e.getBoundingClientRect().right > body.right + 1)
    .map(e => e.tagName + ' ' + (e.getAttribute('class') || '') + ': '
         + (e.textContent || '').trim().slice(0, 60));
  out.overflow = wide;
  out.scroll = [document.documentElement.scrollWidth, document.documentElement.clientWidth];
  return out;
})()"""

# Every word of a table cell that the layout split over two lines (a break at a hyphen, an en
# dash or a slash is a normal one and is not counted): the words of the report's own
# vocabulary ("bottom chord", "compression", "(inventory)") must stay whole; only a long
# unbroken entry from the workbook (the pieces of a run given <wbr> breaks,
# rating.report.text.breakable) may be broken to keep the table on the page.
ROW_HEIGHTS = """[...document.querySelectorAll('table.index tr')].filter(
    tr => tr.querySelector('td.rf')).map(tr => {
  const cell = tr.querySelector('td.rf');
  return [cell.getBoundingClientRect().height,
          parseFloat(getComputedStyle(cell).lineHeight)
          || 1.2 * parseFloat(getComputedStyle(cell).fontSize)];
})"""

SPLIT_WORDS = r"""(() => {
  const out = [];
  const wbr = n => n !== null && n.nodeName === 'WBR';
  for (const cell of document.querySelectorAll('td, th')) {
    const walker = document.createTreeWalker(cell, NodeFilter.SHOW_TEXT);
    for (let n = walker.nextNode(); n; n = walker.nextNode()) {
      for (const m of n.data.matchAll(/[^\s\-\u2013\/]+/g)) {
        if ((m.index === 0 && wbr(n.previousSibling))
            || (m.index + m[0].length === n.data.length && wbr(n.nextSibling))) continue;
        const r = document.createRange();
        r.setStart(n, m.index);
        r.setEnd(n, m.index + m[0].length);
        const tops = new Set([...r.getClientRects()].filter(q => q.width > 0)
                             .map(q => Math.round(q.top)));
        if (tops.size > 1) out.push(m[0]);
      }
    }
  }
  return out;
})()"""
LONGEST_WHOLE_WORD = 14  # characters: "(Findings!B10)", "(single-unit", "Specialized"


@pytest.fixture(scope="module")
def browser() -> Iterator[Browser]:
    assert CHROMIUM is not None
    b = Browser(CHROMIUM)
    try:
        yield b
    finally:
        b.close()


def _media_box(pdf: bytes) -> tuple[float, float]:
    m = re.search(rb"/MediaBox\s*\[\s*0\s+0\s+([\d.]+)\s+([\d.]+)\s*\]", pdf)
    assert m, "no MediaBox in the PDF"
    return float(m.group(1)), float(m.group(2))


def _check_page(browser: Browser, path: Path, content_px: int, paper_pt: tuple[float, float],
                shot: Path | None = None) -> None:
    page = browser.open(path, width=content_px, height=1100, print_media=True)
    try:
        sizes = page.evaluate(SIZES)
        assert sizes["elevation"] and all(w > 300 and h > 60 for w, h in sizes["elevation"])
        assert all(w > 300 and h > 20 for w, h in sizes["legend"])
        assert all(w > 300 and h > 100 for w, h in sizes["influence"])
        assert all(w > 300 and h > 50 for w, h in sizes["packing"])
        assert sizes["overflow"] == [], f"wider than the printed page: {sizes['overflow']}"
        assert sizes["scroll"][0] <= sizes["scroll"][1]
        split = [w for w in page.evaluate(SPLIT_WORDS) if len(w) <= LONGEST_WHOLE_WORD]
        assert split == [], f"words broken over two lines: {split}"
        pdf = page.pdf()
        if shot is not None:
            shot.write_bytes(page.screenshot())
        rep = page.report()
        assert rep.console_errors == [], rep.console_errors
        assert rep.exceptions == [], rep.exceptions
        # nothing fetched but the file itself: no network resources
        assert rep.requests == [path.resolve().as_uri()], rep.requests
        assert pdf.startswith(b"%PDF-") and len(pdf) > 10_000
        w, h = _media_box(pdf)
        assert w == pytest.approx(paper_pt[0], abs=1.0) and h == pytest.approx(paper_pt[1],
                                                                                abs=1.0)
    finally:
        page.close()


LETTER_PT = (612.0, 792.0)  # 8.5 x 11 in at 72 pt/in
A4_PT = (595.28, 841.89)  # 210 x 297 mm at 72/25.4 pt/mm


def test_detector_catches_a_broken_page(browser: Browser, tmp_path: Path) -> None:
    """Positive control: a page with a missing image and a script error is caught."""
    bad = tmp_path / "bad.html"
    bad.write_text('<!DOCTYPE html><html><body><img src="missing.png">'
                   '<script>console.error("boom"); notDefined();</script></body></html>')
    page = browser.open(bad)
    try:
        rep = page.report()
    finally:
        page.close()
    assert any("boom" in e for e in rep.console_errors)
    assert any("ERR_FILE_NOT_FOUND" in e for e in rep.console_errors)
    assert rep.exceptions
    assert any(r.endswith("missing.png") for r in rep.requests)


def _compared(results: RatingResults, tmp_path: Path) -> RatingResults:
    """``results`` compared with an earlier rating of the bridge (rating.previous) in which
    every member rated a third higher and SU4 was posted higher: the report's part "Since the
    previous rating" with both of its tables."""
    import json

    from rating.previous import previous_for
    from rating.results import results_json

    data = json.loads(results_json(results))
    data["bridge"]["inspection_date"] = "2021-05-10"
    data["posting"]["SU4"].update(rf=1.02, action="post", posting_tons=31.0)
    for m in data["members"]:
        for r in m["ratings"].values():
            if isinstance(r["rf"], float):
                r["rf"] *= 1.3
    path = tmp_path / "earlier.rating.json"
    path.write_text(json.dumps(data), encoding="utf-8")
    compared, why = previous_for(results, path)
    assert compared is not None and compared.previous is not None, why
    assert compared.previous.elements
    return compared


@pytest.mark.parametrize("which", ["US", "SI", "hostile", "previous"])
def test_sample_report_in_browser(browser: Browser, tmp_path: Path, which: str,
                                  results_us: RatingResults, results_si: RatingResults,
                                  results_hostile: RatingResults) -> None:
    results = (_compared(results_us, tmp_path) if which == "previous" else
               {"US": results_us, "SI": results_si, "hostile": results_hostile}[which])
    path = tmp_path / f"{which}.html"
    path.write_text(render_report(results), encoding="utf-8")
    if which == "SI":
        _check_page(browser, path, A4_CONTENT_PX, A4_PT)
    else:
        _check_page(browser, path, LETTER_CONTENT_PX, LETTER_PT)
    # on screen: a desktop window keeps every word whole; a narrower one (700 px, a tablet
    # held upright) still fits the tables
    for width, whole in ((1000, True), (700, False)):
        page = browser.open(path, width=width)
        try:
            sizes = page.evaluate(SIZES)
            assert sizes["overflow"] == [], f"wider than a {width} px window: {sizes['overflow']}"
            split = [w for w in page.evaluate(SPLIT_WORDS) if len(w) <= LONGEST_WHOLE_WORD]
            assert split == [] or not whole, f"words broken over two lines: {split}"
        finally:
            page.close()
    if which == "hostile":  # the script in the workbook text did not run
        page = browser.open(path)
        try:
            assert page.evaluate("document.scripts.length") == 0
            assert page.evaluate("document.images.length") == 0
            assert "<script>" in page.evaluate("document.body.innerText")
        finally:
            page.close()


def test_detector_catches_split_words(browser: Browser, tmp_path: Path) -> None:
    """Positive control: a narrow column that may break anywhere splits its words."""
    bad = tmp_path / "narrow.html"
    bad.write_text('<!DOCTYPE html><html><body><table style="width:60px"><tr>'
                   '<td style="overflow-wrap:anywhere">bottom chord</td><td>compression</td>'
                   '</tr></table></body></html>')
    page = browser.open(bad, width=200)
    try:
        split = page.evaluate(SPLIT_WORDS)
    finally:
        page.close()
    assert "bottom" in split or "chord" in split


def test_letter_report_also_fits_a4_width(browser: Browser, tmp_path: Path,
                                          results_us: RatingResults) -> None:
    """The layout fits both papers: a Letter report laid out at the A4 printable width."""
    path = tmp_path / "a4.html"
    path.write_text(render_report(results_us, paper="a4"), encoding="utf-8")
    _check_page(browser, path, A4_CONTENT_PX, A4_PT)


def test_workbook_reports_in_browser(browser: Browser,
                                    sample_reports: list[tuple[Path, str]]) -> None:
    """End to end: the report of every rateable sample workbook."""
    if not sample_reports:
        pytest.skip("no sample workbook could be rated (sample_inventory/ not ready)")
    for path, system in sample_reports:
        si = system == "SI"
        _check_page(browser, path, A4_CONTENT_PX if si else LETTER_CONTENT_PX,
                    A4_PT if si else LETTER_PT)


def test_batch_index_in_browser(browser: Browser, tmp_path: Path,
                                sample_outcomes: list[RateOutcome]) -> None:
    """The batch index of the sample workbooks and a broken one: a column for every vehicle
    of every bridge, on landscape Letter and A4 pages, words whole; on screen the table scrolls
    in a narrow window, the page does not."""
    rated = {o.workbook.name: o for o in sample_outcomes if o.results is not None}
    if not rated:
        pytest.skip("no sample workbook could be rated (sample_inventory/ not ready)")
    folder = tmp_path / "inspections"
    folder.mkdir()
    for name in [*rated, "broken.xlsx"]:
        (folder / name).write_bytes(b"stand-in: the ratings come from the samples")

    def rate(path: Path, vehicle_ids: list[str] | None = None) -> RateOutcome:
        if path.name in rated:
            return rated[path.name]
        return RateOutcome(path, None, (Problem("error", "Members!C7", "no section"),))

    # compared with an earlier batch (an earlier inspection, one posting higher then): the
    # index's rows carry what changed since
    import json

    earlier = rate_folder(folder, tmp_path / "earlier", workers=1, rate=rate)
    first = next(r for r in earlier.rows if r.rated)
    path = tmp_path / "earlier" / first.results_file
    data = json.loads(path.read_text(encoding="utf-8"))
    data["bridge"]["inspection_date"] = "2019-06-01"
    for entry in data["posting"].values():
        if entry["action"] == "post":
            entry["posting_tons"] += 5.0
    path.write_text(json.dumps(data), encoding="utf-8")
    summary = rate_folder(folder, tmp_path / "out", workers=1, rate=rate,
                          previous=tmp_path / "earlier")
    assert any(r.since.startswith("Since the rating of the inspection of 2019-06-01")
               for r in summary.rows)
    index = summary.index_path
    # the printable widths of landscape Letter (11 in) and A4 (297 mm), 13 mm margins
    for content_px in (round((11 * 25.4 - 26) / 25.4 * 96), round((297 - 26) / 25.4 * 96)):
        page = browser.open(index, width=content_px, height=800, print_media=True)
        try:
            sizes = page.evaluate(SIZES)
            assert sizes["overflow"] == [], f"wider than the page: {sizes['overflow']}"
            split = [w for w in page.evaluate(SPLIT_WORDS) if len(w) <= LONGEST_WHOLE_WORD]
            assert split == [], f"words broken over two lines: {split}"
            # each bridge's ratings stay one short row (the RF and its member), its
            # recommendation across the table beneath them; a narrow column beside the
            # vehicles made each row many lines tall (one bridge per printed page)
            rows = page.evaluate(ROW_HEIGHTS)
            assert len(rows) == len(rated), rows
            for ratings_px, line_px in rows:
                assert ratings_px < 3.5 * line_px, rows
            w, h = _media_box(page.pdf())
            assert w > h  # landscape (the paper is the printer's; the CSS asks for none)
            rep = page.report()
            assert rep.console_errors == [] and rep.exceptions == []
            assert rep.requests == [index.resolve().as_uri()]
        finally:
            page.close()
    for width in (1400, 1000):
        page = browser.open(index, width=width)
        try:
            sizes = page.evaluate(SIZES)
            assert sizes["scroll"][0] <= sizes["scroll"][1]  # the page does not scroll sideways
            if width == 1400:
                assert sizes["overflow"] == []
            assert "broken.xlsx" in page.evaluate("document.body.innerText")
        finally:
            page.close()


PHONE = """(() => {
  const dd = [...document.querySelectorAll('.facts dd')].map(e => e.getBoundingClientRect().width);
  return {page: [document.documentElement.scrollWidth, document.documentElement.clientWidth],
          narrowest_fact: Math.min(...dd),
          tables: [...document.querySelectorAll('table')].map(t => getComputedStyle(t).overflowX)};
})()"""


def test_report_on_a_phone(browser: Browser, tmp_path: Path, results_si: RatingResults) -> None:
    """A 420 px window (a phone): the page itself does not scroll sideways, the facts keep a
    readable width (two columns of them squeezed each value to about 30 px, a letter a
    line), and each table scrolls on its own."""
    path = tmp_path / "phone.html"
    path.write_text(render_report(results_si), encoding="utf-8")
    page = browser.open(path, width=420, height=900)
    try:
        got = page.evaluate(PHONE)
    finally:
        page.close()
    assert got["page"][0] <= got["page"][1], got["page"]
    assert got["narrowest_fact"] >= 150, got["narrowest_fact"]
    assert set(got["tables"]) == {"auto"}
