"""One cell at a time: numbers (with fractions and units), choices, dates, lists, SI edge."""

from __future__ import annotations

import datetime as dt
import math

import pytest

from rating.inventory import schema as sc
from rating.inventory.cells import Invalid, Parsed, parse_value, to_column_unit
from rating.inventory.schema import Column, Kind

DIM = Column("t", "Thickness", Kind.NUMBER, unit="in", si_unit="mm", gt=0, le=6, warn_above=3)
COUNT = Column("n", "Bars", Kind.INTEGER, ge=1, le=16)
YES = Column("y", "Pack rust", Kind.YESNO)
KIND = sc.MATERIALS.column("kind")
WHEN = Column("d", "Inspection date", Kind.DATE)
PANELS = sc.BRIDGE.field_of("counter_panels")
IDS = sc.SETTINGS.field_of("vehicles")
LABEL = Column("m", "Member", Kind.LABEL, max_length=10)


def ok(raw: object, col: Column, si: bool = False) -> object:
    got = parse_value(raw, col, si)
    assert isinstance(got, Parsed), got
    return got.value


def bad(raw: object, col: Column, si: bool = False) -> str:
    got = parse_value(raw, col, si)
    assert isinstance(got, Invalid), got
    return got.message


@pytest.mark.parametrize("raw, value", [
    (0.875, 0.875), (1, 1.0), ("0.875", 0.875), ("7/8", 0.875), ("1-1/4", 1.25),
    ("1 1/4", 1.25), ('1-1/4"', 1.25), ("1.25 in", 1.25), ("  2 ", 2.0), ("\u22121", None),
])
def test_numbers_and_fractions(raw: object, value: float | None) -> None:
    if value is None:
        assert "greater than 0 in" in bad(raw, DIM)
    else:
        assert ok(raw, DIM) == pytest.approx(value)


@pytest.mark.parametrize("raw, needle", [
    ("one inch", "must be a number in inches; found the text 'one inch'"),
    ("1,25", "must be a number"), ("3/0", "must be a number"), (True, "logical value TRUE"),
    (dt.datetime(2024, 1, 2), "is the cell formatted as a date?"),
    (math.inf, "must be a finite number"), (math.nan, "must be a finite number"),
    (0, "must be greater than 0 in; found 0 in"), (7, "must be at most 6 in; found 7 in"),
    ("#VALUE!", "holds the spreadsheet error #VALUE!"),
])
def test_numbers_refused(raw: object, needle: str) -> None:
    assert needle in bad(raw, DIM)


def test_unusual_number_warns_but_is_used() -> None:
    got = parse_value(4.0, DIM, False)
    assert isinstance(got, Parsed) and got.value == 4.0
    assert "unusually large (above 3 in)" in got.warning


def test_si_dimension_converted_and_limits_quoted_in_mm() -> None:
    """25.4 mm = 1 in exactly (NIST SP 811 Appendix B)."""
    assert ok(25.4, DIM, si=True) == pytest.approx(1.0, rel=1e-15)
    assert "must be at most 152.4 mm; found 200 mm" in bad(200, DIM, si=True)


@pytest.mark.parametrize("unit, si, value, expected", [
    ("ksi", "MPa", 6.894757293168361, 1.0),  # 1 ksi = 6.894757 MPa (NIST SP 811 App. B)
    ("plf", "kN/m", 14.593902937206364e-3, 1.0),  # 1 lbf/ft = 14.5939 N/m (NIST SP 811)
    ("psf", "kPa", 47.88025898033584e-3, 1.0),  # 1 lbf/ft2 = 47.8803 Pa (NIST SP 811)
    ("kip", "kN", 4.4482216152605, 1.0),  # 1 kip = 4.448222 kN (NIST SP 811 App. B)
    ("ft", "m", 0.3048, 1.0),  # exact
    ("ton", "tonne", 0.90718474, 1.0),  # 1 short ton = 907.18474 kg (NIST SP 811)
    ("pcf", "kN/m3", 0.15708746384, 1.0),  # 1 lbf/ft3 = 157.0875 N/m3 (NIST SP 811)
])
def test_si_conversions(unit: str, si: str, value: float, expected: float) -> None:
    col = Column("q", "Quantity", Kind.NUMBER, unit=unit, si_unit=si)
    assert to_column_unit(value, col, si=True) == pytest.approx(expected, rel=1e-9)
    assert to_column_unit(value, col, si=False) == value


def test_mpa_hint_for_stress_in_us() -> None:
    assert "is it in MPa?" in bad(250.0, sc.MATERIALS.column("F_y"))


def test_integers() -> None:
    assert ok(2.0, COUNT) == 2 and isinstance(ok(2.0, COUNT), int)
    assert "must be a whole number; found 2.5" in bad(2.5, COUNT)
    assert "must be at least 1" in bad(0, COUNT)


@pytest.mark.parametrize("raw, value", [("yes", True), ("Y", True), ("TRUE", True), (1, True),
                                        (True, True), ("no", False), ("n", False), (0, False),
                                        (False, False)])
def test_yes_no(raw: object, value: bool) -> None:
    assert ok(raw, YES) is value


def test_yes_no_refused() -> None:
    assert "must be yes or no; found the text 'maybe'" in bad("maybe", YES)


def test_choice_normalised() -> None:
    assert ok("  Wrought   IRON ", KIND) == "wrought iron"
    assert "must be one of: steel, wrought iron; found the text 'cast iron'" in bad(
        "cast iron", KIND)


def test_dates() -> None:
    assert ok(dt.datetime(2024, 5, 14, 9, 30), WHEN) == dt.date(2024, 5, 14)
    assert ok("2024-05-14", WHEN) == dt.date(2024, 5, 14)
    assert "must be a date" in bad(45000, WHEN)
    assert "must be a date" in bad("14/05/2024", WHEN)


def test_lists() -> None:
    assert ok("4, 5", PANELS) == (4, 5)
    assert ok("4;5", PANELS) == (4, 5)
    assert ok(4, PANELS) == (4,)
    assert "must list whole numbers" in bad("4, x", PANELS)
    assert ok("HL-93, SU4", IDS) == ("HL-93", "SU4")


def test_text_and_labels() -> None:
    assert ok(12, LABEL) == "12"
    assert ok(" L0  L1 ", LABEL) == "L0 L1"
    assert ok("橋-1", LABEL) == "橋-1"
    assert "control characters" in bad("L0\x07", LABEL)
    assert "at most 10 are read" in bad("x" * 11, LABEL)
    assert "must be text" in bad(True, LABEL)
    assert "without commas" in bad("L0L1, L1L2", LABEL)


def test_integer_beyond_the_range_of_a_float_is_refused_not_a_crash() -> None:
    huge = 10**400  # what a number cell of 401 digits reads as
    assert "must be a finite number in inches; found a number too large to read" in bad(huge, DIM)
    assert "must be a date" in bad(huge, WHEN)
    assert "at most 10 are read" in bad(huge, LABEL)
    assert ok(12, LABEL) == "12"


def test_a_scale_is_not_written_as_a_unit() -> None:
    """A condition rating (0 to 9) out of range reads "must be at most 9; found 12", not
    "at most 9 0-9; found 12 0-9"; a length reads "in inches", not "in in"."""
    from rating.inventory import schema as sc
    from rating.inventory.cells import parse_number

    cond = next(c for c in sc.FINDINGS.columns if c.key == "condition")
    got = parse_number(12, cond, False)
    assert got.message == "must be at most 9; found 12"
    remaining = next(c for c in sc.FINDINGS.columns if c.key == "remaining")
    assert parse_number("thin", remaining, False).message == \
        "must be a number in inches; found the text 'thin'"
    assert parse_number("thin", remaining, True).message == \
        "must be a number in mm; found the text 'thin'"


@pytest.mark.parametrize("raw", ['1"', "1 in", "1''", "1 in."])
def test_an_inch_mark_in_a_millimetre_column_is_not_a_number_of_millimetres(raw: str) -> None:
    """An SI workbook's thickness written with an inch mark is refused (it read as 1 mm);
    the same text in a US workbook is one inch, and "38 mm" there is refused as before."""
    assert f"must be a number in mm; found the text {raw!r}" in bad(raw, DIM, si=True)
    assert ok(raw, DIM) == pytest.approx(1.0)
    assert ok("25 mm", DIM, si=True) == pytest.approx(25.0 / 25.4)
    assert "must be a number in inches" in bad("38 mm", DIM)


@pytest.mark.parametrize("hidden", ["\u200b", "\ufeff", "\u00ad", "\u2060", "\u202e",
                                    "\u2066", "\u180e", "\u034f", "\ufe0f"])
def test_an_id_with_an_invisible_character_is_refused_naming_it(hidden: str) -> None:
    """An id pasted with a zero-width space (or a soft hyphen, a byte-order mark) matches no
    other id while looking the same; it is refused at its cell, with the character named (a
    prober found "member L1L2 is not a member" with nothing to see)."""
    assert f"invisible character (U+{ord(hidden):04X})" in bad("L1L2" + hidden, LABEL)
    assert "invisible character" in bad(f"SU4, T{hidden}YPE-3", IDS)
    assert ok(" L1L2 ", LABEL) == "L1L2"
