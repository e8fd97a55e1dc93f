"""Workbook text holding HTML or script is shown as text and stays inert (names, notes, ids,
photos, even text that lands in the CSS page footer)."""

from __future__ import annotations

import re
from pathlib import Path

import pytest
from htmlcheck import read
from hypothesis import given, settings
from hypothesis import strategies as st
from sample_results import IMG, SCRIPT

from rating.report import render_report
from rating.report.html import css_string
from rating.results import RatingResults


def test_markup_in_workbook_text_is_shown_as_text(results_hostile: RatingResults) -> None:
    html = render_report(results_hostile)
    doc = read(html)
    assert doc.errors == []
    names = [t for t, _ in doc.tags]
    assert "script" not in names and "img" not in names and "i" not in names
    assert "b" not in names  # the owner's <b>bold</b> stays text
    assert not any(k.startswith("on") for _, attrs in doc.tags for k in attrs)
    text = "".join(doc.text)
    assert SCRIPT in text  # shown, as the engineer typed it
    assert IMG in text
    assert "L0L1<i>" in text  # a member id with markup, in the tables and on the drawing
    assert 'Owner "&" <b>bold</b>' in text
    assert "</td></tr></table>" in text
    # the raw markup never appears unescaped in the file
    assert "<script" not in html and "<img" not in html and "<i>" not in html


def test_css_footer_cannot_close_the_style(results_hostile: RatingResults) -> None:
    html = render_report(results_hostile)
    style = re.search(r"<style>(.*?)</style>", html, re.S)
    assert style is not None
    assert "<" not in style.group(1)
    assert html.count("</style>") == 1
    assert css_string('a"</style>\\') == '"a\\000022 \\00003C \\00002F style\\00003E \\00005C "'


@settings(max_examples=300, deadline=None)
@given(text=st.text(st.characters(blacklist_characters="\x00", blacklist_categories=("Cs",)),
                    max_size=40))
def test_css_string_reads_back_as_the_text(text: str) -> None:
    """The footer string as a CSS tokenizer reads it (tinycss2, an independent implementation
    of CSS Syntax Level 3): the very text, spaces after escaped characters included ("River
    \u2014 load" once printed as "River \u2014load")."""
    tinycss2 = pytest.importorskip("tinycss2")
    tokens = tinycss2.parse_component_value_list(str(css_string(text)))
    assert [t.type for t in tokens] == ["string"]
    assert tokens[0].value == text


def test_markup_typed_into_a_real_workbook_stays_text(tmp_path: Path) -> None:
    """End to end: script and markup typed into a sample workbook's names and notes."""
    import openpyxl
    import pytest
    from report_support import SAMPLES

    from rating.pipeline import rate_workbook

    src = SAMPLES / "tc0903_pony_1903_si.xlsx"
    if not src.is_file():
        pytest.skip("sample workbook tc0903_pony_1903_si.xlsx not present")
    wb = openpyxl.load_workbook(src)
    wb["Bridge"]["B6"] = "Quarry Lane " + SCRIPT
    wb["Bridge"]["B8"] = 'Owner <b onclick="x()">bold</b>'
    f = wb["Findings"]
    col = {str(c.value).split(" [")[0]: c.column_letter for c in f[3] if c.value}
    f[f"{col['Photo']}5"] = IMG
    f[f"{col['Note']}5"] = "note " + SCRIPT
    path = tmp_path / "hostile.xlsx"
    wb.save(path)
    outcome = rate_workbook(path)
    assert outcome.results is not None, [p.format() for p in outcome.errors][:1]
    html = render_report(outcome.results)
    doc = read(html)
    assert doc.errors == []
    names = {t for t, _ in doc.tags}
    assert not names & {"script", "img", "b"}
    assert not any(k.startswith("on") for _, attrs in doc.tags for k in attrs)
    text = "".join(doc.text)
    assert "Quarry Lane " + SCRIPT in text and IMG in text and "note " + SCRIPT in text
    assert "<script" not in html and "<img" not in html
