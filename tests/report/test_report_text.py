"""rating.report.text.breakable: workbook text escaped, long unbroken runs given places to
break (HTML Living Standard, the wbr element), nothing else changed."""

from __future__ import annotations

import html

from hypothesis import given
from hypothesis import strategies as st
from markupsafe import Markup, escape

from rating.report.text import LONG_RUN, RUN_PIECE, breakable


def test_short_text_is_only_escaped() -> None:
    assert breakable("bottom chord") == "bottom chord"
    assert breakable("bar <2> & 'x'") == escape("bar <2> & 'x'")


def test_a_long_run_gets_a_break_every_piece() -> None:
    path = "IMG_2027_north_truss_L1U1_lower_eye.jpg"  # 39 characters, no space
    out = str(breakable("photo " + path))
    assert out.startswith("photo ")
    pieces = out[len("photo "):].split("<wbr>")
    assert "".join(pieces) == path
    assert all(len(p) <= RUN_PIECE for p in pieces)


def test_a_long_hyphenated_word_breaks_after_its_hyphens() -> None:
    # "emergency-vehicle" (17 characters) once printed as "emergency-ve / hicle"
    assert str(breakable("86,000 lb emergency-vehicle limit")) == (
        "86,000 lb emergency-<wbr>vehicle limit")
    out = str(breakable("x-" + "y" * 30))
    assert out.startswith("x-<wbr>") and out.count("<wbr>") == 3  # then 12 + 12 + 6


def test_words_up_to_the_limit_are_left_whole() -> None:
    word = "x" * LONG_RUN
    assert "<wbr>" not in str(breakable(f"{word} {word}"))


def test_markup_is_returned_as_it_is() -> None:
    m = Markup("<b>L1U1</b>")
    assert breakable(m) is m


def test_markup_in_a_long_run_stays_text() -> None:
    out = str(breakable('<img src="http://example.invalid/x.png" onerror="alert(1)">'))
    assert "<img" not in out and "&lt;img" in out
    # the breaks never fall inside an escaped character
    assert html.unescape(out.replace("<wbr>", "")) == (
        '<img src="http://example.invalid/x.png" onerror="alert(1)">')


@given(st.text(alphabet=st.characters(codec="utf-8", exclude_categories=("Cs",)),
               max_size=120))
def test_the_text_shown_is_the_text_given(text: str) -> None:
    out = str(breakable(text))
    assert html.unescape(out.replace("<wbr>", "")) == text
    # no run longer than the limit is left without a place to break
    for run in out.replace("<wbr>", " ").split():
        assert len(html.unescape(run)) <= LONG_RUN
