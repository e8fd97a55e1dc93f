"""Numbers in the report: unit conversion and rounding.

Conversion factors checked against NIST SP 811 (2008), Appendix B.8/B.9 (exact or as
tabulated there): 1 ft = 0.3048 m (exact), 1 in = 25.4 mm (exact), 1 kip = 4.448222 kN,
1 ksi = 6.894757 MPa, 1 ton (short, 2000 lb) = 907.1847 kg, 1 kip/ft = 14.59390 kN/m.
"""

from __future__ import annotations

import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from rating.report.display import DASH, MINUS, NEG_INF, Display
from rating.results import FindingEcho, PostingResultEntry, SectionSummary

US, SI = Display("US"), Display("SI")


@pytest.mark.parametrize(("value", "dimension", "expected"), [
    (100.0, "force", "444.8"),  # NIST SP 811 B.9: 1 kip = 4.448222 kN
    (160.0, "length", "48.77"),  # 1 ft = 0.3048 m exactly: 48.768 m
    (0.625, "dimension", "15.9"),  # 1 in = 25.4 mm exactly: 15.875 mm
    (10.0, "area", "6,452"),  # 1 in2 = 645.16 mm2 exactly
    (36.0, "stress", "248"),  # NIST SP 811 B.9: 1 ksi = 6.894757 MPa: 248.2 MPa
    (40.0, "weight", "36.3"),  # 1 short ton = 0.9071847 t: 36.287 t
    (0.64, "line load", "9.34"),  # 1 kip/ft = 14.59390 kN/m: 9.340 kN/m
])
def test_si_conversion_against_nist(value: float, dimension: str, expected: str) -> None:
    assert SI.number(value, dimension) == expected


def test_us_is_unchanged_and_units_named() -> None:
    assert US.number(100.0, "force") == "100.0"
    assert (US.unit("force"), SI.unit("force")) == ("kip", "kN")
    assert (US.unit("area"), SI.unit("area")) == ("in\u00b2", "mm\u00b2")
    assert (US.unit("weight"), SI.unit("weight")) == ("ton", "tonne")


def test_rf_two_decimals_rounded_down_and_dash() -> None:
    """An RF just under 1.0 never prints as 1.00 (it would hide a posting)."""
    assert US.rf(0.996) == "0.99"
    assert US.rf(1.0) == "1.00"
    assert US.rf(0.30) == "0.30"  # 0.3 is not 0.29 through binary round-off
    assert US.rf(-0.154) == MINUS + "0.16"
    for v in (math.inf, math.nan, None):
        assert US.rf(v) == DASH
    assert US.rf(-math.inf) == NEG_INF  # cannot carry its dead load: not a dash


@settings(max_examples=200, deadline=None)
@given(st.floats(min_value=-5.0, max_value=50.0, allow_nan=False))
def test_rf_shown_never_exceeds_rf(rf: float) -> None:
    shown = float(US.rf(rf).replace(MINUS, "-").replace(",", ""))
    assert shown <= rf + 1e-6
    assert rf - shown < 0.01 + 1e-6


def test_forces_signed_with_true_minus_and_no_negative_zero() -> None:
    assert US.force(12.345, signed=True) == "+12.3"
    assert US.force(-12.345, signed=True) == MINUS + "12.3"
    assert US.force(-0.0, signed=True) == "0.0"
    assert US.force(-0.01) == "0.0"
    assert US.force(None) == DASH


def test_posting_rounded_down_after_conversion() -> None:
    """26 tons = 23.59 tonnes (NIST SP 811 B.9): posted as 23 tonnes, never 24."""
    assert US.posting(26.0) == "26"
    assert SI.posting(26.0) == "23"
    assert SI.posting(23.0 / 0.90718474) == "23"  # whole tonnes held in tons stay whole


def test_fields_formatted_by_their_own_metadata() -> None:
    s = SectionSummary(A_g=10.0, A_n=8.0, F_y=36.0, F_u=58.0, length=20.0, K=None, KL_r=None,
                       E=29000.0)
    assert SI.field(s, "length") == "6.10"
    assert SI.field(s, "F_y") == "248"
    assert SI.label(SectionSummary, "A_g") == "gross area (mm\u00b2)"
    f = FindingEcho("L1U1", "all", "body", station=None, remaining_thickness=0.5)
    assert SI.field(f, "station") == DASH
    assert SI.field(f, "remaining_thickness") == "12.7"
    p = PostingResultEntry(rf=0.5, rating_tons=10.0, posting_tons=None)
    assert US.field(p, "posting_tons") == DASH


def _fixed_as_written(x: float, decimals: int, signed: bool = False) -> str:
    """The report's fixed-point text as first written: grouped digits, minus sign, zero
    without a sign (the faster paths of Display must write the same)."""
    text = format(x, f",.{decimals}f")
    if not text.strip("-0.,"):
        return text.lstrip("-")
    if text[0] == "-":
        return MINUS + text[1:]
    return ("+" + text) if signed else text


NUMBERS = (st.floats(allow_nan=True, allow_infinity=True)
           | st.floats(-2000.0, 2000.0) | st.sampled_from([-999.0, 999.0, -998.96, 998.96,
                                                           999.5, -0.0, 0.004, -0.004]))


@settings(max_examples=400, deadline=None)
@given(value=NUMBERS, dimension=st.sampled_from([None, "force", "length", "dimension", "area"]),
       decimals=st.sampled_from([None, 0, 1, 2, 3]), signed=st.booleans(),
       system=st.sampled_from(["US", "SI"]))
def test_numbers_as_first_written(value: float, dimension: str | None, decimals: int | None,
                                  signed: bool, system: str) -> None:
    d = Display(system)
    if not math.isfinite(value):
        expected = DASH
    else:
        places = decimals if decimals is not None else \
            {"force": (1, 1), "length": (2, 2), "dimension": (3, 1), "area": (2, 0)}.get(
                dimension or "", (2, 2))[system == "SI"]
        expected = _fixed_as_written(d.convert(value, dimension), places, signed)
    assert d.number(value, dimension, decimals, signed) == expected
    assert d.formatter(dimension, decimals, signed)(value) == expected  # a table's own memo


@settings(max_examples=400, deadline=None)
@given(st.floats(-1e12, 1e12) | st.sampled_from([math.nan, math.inf, -math.inf, -0.0, -999.0,
                                                 999.0, 998.995, -998.995, 0.996, -0.001]))
def test_rf_as_first_written(rf: float) -> None:
    if math.isnan(rf) or rf == math.inf:
        expected = DASH
    elif rf == -math.inf:
        expected = NEG_INF
    else:
        expected = _fixed_as_written(math.floor(rf * 100.0 + 1e-7) / 100.0, 2)
    assert US.rf(rf) == expected == Display.rf_text(rf)
