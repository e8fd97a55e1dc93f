"""Turning one cell's raw value into a typed value, or a sentence saying why it cannot be.

The unit edge lives here: a number read in the workbook's unit system is converted to the
column's US unit through :mod:`rating.units`, and nowhere else.
"""

from __future__ import annotations

import datetime as dt
import math
import re
import unicodedata
from dataclasses import dataclass

from rating import units
from rating.inventory.schema import YES_NO, Column, Kind
from rating.inventory.xlsx import PercentNumber

EXCEL_ERRORS = frozenset({"#DIV/0!", "#N/A", "#NAME?", "#NULL!", "#NUM!", "#REF!", "#VALUE!",
                          "#SPILL!", "#CALC!", "#GETTING_DATA", "#FIELD!", "#BLOCKED!",
                          "#CONNECT!", "#BUSY!", "#UNKNOWN!"})
_TRUE = frozenset({"yes", "y", "true", "1", "x"})
_FALSE = frozenset({"no", "n", "false", "0"})
_CONTROL = re.compile(r"[\x00-\x08\x0b\x0c\x0e-\x1f\x7f]")
_SPACES = re.compile(r"\s+")
_FILLERS = frozenset("\u034f\u115f\u1160\u17b4\u17b5\u3164\uffa0") | frozenset(
    chr(c) for c in range(0xFE00, 0xFE10))
"""Characters outside Unicode's format category that render empty (the combining grapheme
joiner, the Hangul fillers, variation selectors)."""


def _invisible(text: str) -> str | None:
    """The first character of ``text`` that shows nothing: Unicode's format category Cf (a
    zero-width space, a soft hyphen, a byte-order mark, the marks that set the direction of
    text) or a filler that renders empty. In an id it makes it differ from the same id typed
    elsewhere, with nothing to see."""
    return next((ch for ch in text if ch in _FILLERS
                 or unicodedata.category(ch) == "Cf"), None)
_LIST_SEPARATOR = re.compile(r"[,;]")
_LIST_NUMBER = re.compile(r"\d{1,3}")
# 1-1/4, 1 1/4, 3/4, optional trailing inch mark
_FRACTION = re.compile(r"^(?:(\d+)[\s-]+)?(\d+)\s*/\s*(\d+)$")


class Invalid:
    """A cell whose value cannot be used; ``message`` says why (without the place)."""

    __slots__ = ("message",)

    def __init__(self, message: str) -> None:
        self.message = message

    def __repr__(self) -> str:
        return f"Invalid({self.message!r})"


@dataclass(frozen=True)
class Parsed:
    """A usable value and, optionally, a warning about it (e.g. an unusual magnitude)."""

    value: object
    warning: str = ""


def is_blank(raw: object) -> bool:
    return raw is None or (isinstance(raw, str) and raw.strip() == "")


def describe(raw: object) -> str:
    """The raw value as an engineer would recognise it in the message."""
    if isinstance(raw, str):
        s = raw if len(raw) <= 40 else raw[:37] + "..."
        return f"the text {s!r}"
    if isinstance(raw, bool):
        return f"the logical value {'TRUE' if raw else 'FALSE'}"
    if isinstance(raw, dt.datetime | dt.date | dt.time):
        return f"the date/time {raw}"
    if isinstance(raw, int | float):
        try:
            return f"{raw:g}"
        except OverflowError:  # an integer beyond the range of a float
            return "a number too large to read"
    return f"a value of type {type(raw).__name__}"


def to_column_unit(value: float, col: Column, si: bool) -> float:
    """Convert a number as entered (SI when the workbook declares SI) to the column's US unit.

    NIST SP 811 Appendix B conversion factors, through rating.units. [exact by definition]
    """
    if si and col.si_unit and col.si_unit != col.unit:
        return units.from_core(units.to_core(value, col.si_unit), col.unit)
    return value


def from_column_unit(value: float, col: Column, si: bool) -> float:
    """The inverse of :func:`to_column_unit`, for quoting limits in the unit as entered."""
    if si and col.si_unit and col.si_unit != col.unit:
        return units.from_core(units.to_core(value, col.unit), col.si_unit)
    return value


def _number_from_text(text: str, unit: str) -> float | None:
    s = text.strip().replace("\u2212", "-")
    # the column's own unit, and the ways of writing inches where inches are asked for (an
    # inch mark in a millimetre column is not a number in millimetres)
    suffixes = (unit, '"', "''", "in.") if unit == "in" else (unit,)
    for suffix in suffixes:
        if suffix and s.lower().endswith(suffix.lower()) and len(s) > len(suffix):
            s = s[: -len(suffix)].strip()
            break
    try:
        return float(s)
    except ValueError:
        pass
    m = _FRACTION.match(s)
    if m:
        whole, num, den = m.groups()
        if int(den) == 0:
            return None
        return (int(whole) if whole else 0) + int(num) / int(den)
    return None


def _fmt(v: float) -> str:
    """Six significant digits, never an exponent where the number is a plain reading (a
    floorbeam's 20,811,600 mm4, not 2.08116e+07)."""
    if v != 0 and 1e-4 <= abs(v) < 1e11:
        digits = max(0, 5 - int(math.floor(math.log10(abs(v)))))
        text = f"{round(v, digits):.{digits}f}"
        return text.rstrip("0").rstrip(".") if "." in text else text
    return f"{v:.6g}"


_UNIT_NAMES = {"in": "inches", "ft": "feet"}
"""Units whose symbol reads as a word in a sentence ("a number in in")."""


def _unit_words(col: Column, si: bool) -> str:
    unit = col.unit_for(si)
    if not unit or unit == "%" or not unit[:1].isalpha():
        return ""  # (a percent, or a scale such as 0-9, is not a unit to give a number in)
    return f" in {_UNIT_NAMES.get(unit, unit)}"


def _unit_suffix(col: Column, si: bool) -> str:
    """The unit after a number (" in", " ksi"); none for a scale such as 0-9."""
    unit = col.unit_for(si)
    return f" {unit}" if unit and (unit[:1].isalpha() or unit == "%") else ""


def _not_a_number(raw: object, col: Column, si: bool) -> Invalid:
    found = f"must be a number{_unit_words(col, si)}; found {describe(raw)}"
    if isinstance(raw, dt.datetime | dt.date | dt.time) and not isinstance(raw, bool):
        return Invalid(found + " (is the cell formatted as a date?)")
    return Invalid(found)


def _out_of_range(v: float, core: float, col: Column, si: bool) -> Invalid | None:
    """Why ``core`` (``v`` as entered) is outside the hard limits of ``col``; None if inside."""
    if col.gt is not None and not core > col.gt:
        bound, limit = "greater than", col.gt
    elif col.ge is not None and not core >= col.ge:
        bound, limit = "at least", col.ge
    elif col.le is not None and not core <= col.le:
        bound, limit = "at most", col.le
    else:
        return None
    u = _unit_suffix(col, si)
    hint = ""
    if bound == "at most" and col.unit == "ksi" and not si:
        hint = " (is it in MPa? then set 'Units of this workbook' to SI on the Bridge sheet)"
    return Invalid(f"must be {bound} {_fmt(from_column_unit(limit, col, si))}{u}; "
                   f"found {_fmt(v)}{u}{hint}")


def _unusual(v: float, col: Column, si: bool, words: str, limit: float) -> str:
    """The warning for ``v`` beyond a soft limit; ``words`` e.g. "small (below"."""
    u = _unit_suffix(col, si)
    return (f"{_fmt(v)}{u} is unusually {words} {_fmt(from_column_unit(limit, col, si))}{u}); "
            "please confirm")


def parse_number(raw: object, col: Column, si: bool) -> Parsed | Invalid:
    shown_as_percent = isinstance(raw, PercentNumber)
    if isinstance(raw, int | float) and not isinstance(raw, bool):
        try:
            v = float(raw)
        except OverflowError:  # an integer beyond the range of a float
            v = math.inf
        if shown_as_percent and col.unit == "%":
            # a cell formatted as a percent shows its number a hundred times larger ("20%"
            # typed is 0.2 stored): a percent column reads what the cell shows
            v = round(v * 100.0, 9)
    elif isinstance(raw, str):
        got = _number_from_text(raw, col.unit_for(si))
        if got is None:
            return _not_a_number(raw, col, si)
        v = got
    else:
        return _not_a_number(raw, col, si)
    if not math.isfinite(v):
        return Invalid(f"must be a finite number{_unit_words(col, si)}; found {describe(raw)}")
    integer = col.kind is Kind.INTEGER
    if integer:
        if abs(v - round(v)) > 1e-9:
            return Invalid(f"must be a whole number; found {_fmt(v)}")
        v = float(round(v))
    core = to_column_unit(v, col, si)
    refused = _out_of_range(v, core, col, si)
    if refused is not None:
        return refused
    if (col.unit == "%" and 0.0 < v < 1.0 and not shown_as_percent
            and not (isinstance(raw, str) and "%" in raw)):
        # a fraction where the number of percent belongs (0.2 for 20 %) would pass for a loss
        # a hundred times too small (unconservative): refused, not guessed
        return Invalid(f"reads as {_fmt(v)} %, under one percent: the number of percent "
                       f"goes here, so for {_fmt(v * 100.0)} % type {_fmt(v * 100.0)}"
                       + ("; a loss under one percent is recorded as 0 or 1"
                          if col.key == "loss" else ""))
    value: object = int(core) if integer else core
    if col.warn_below is not None and core < col.warn_below:
        return Parsed(value, _unusual(v, col, si, "small (below", col.warn_below))
    if col.warn_above is not None and core > col.warn_above:
        return Parsed(value, _unusual(v, col, si, "large (above", col.warn_above))
    return Parsed(value)


def _as_text(raw: object) -> str | Invalid:
    if isinstance(raw, str):
        return raw
    if isinstance(raw, bool):
        return Invalid(f"must be text; found {describe(raw)}")
    if isinstance(raw, int):
        return str(raw)
    if isinstance(raw, float):
        if not math.isfinite(raw):
            return Invalid(f"must be text; found {describe(raw)}")
        return str(int(raw)) if raw.is_integer() else f"{raw:g}"
    return Invalid(f"must be text; found {describe(raw)}")


def parse_text(raw: object, col: Column) -> Parsed | Invalid:
    t = _as_text(raw)
    if isinstance(t, Invalid):
        return t
    t = t.strip()
    if _CONTROL.search(t):
        return Invalid("contains control characters; retype the value")
    if len(t) > col.max_length:
        return Invalid(f"is {len(t)} characters long; at most {col.max_length} are read")
    if col.kind is Kind.LABEL:
        t = _SPACES.sub(" ", t)
        if "," in t:
            return Invalid(f"must be a single id without commas; found {describe(t)}")
        hidden = _invisible(t)
        if hidden:  # (pasted from a web page or a PDF: the id would match no other)
            return Invalid(f"contains an invisible character (U+{ord(hidden):04X}); "
                           "retype the id")
    return Parsed(t)


def norm_choice(text: str) -> str:
    return _SPACES.sub(" ", text.strip()).lower()


def parse_choice(raw: object, col: Column) -> Parsed | Invalid:
    options = col.choices if col.kind is Kind.CHOICE else YES_NO
    t = _as_text(raw)
    if isinstance(t, Invalid):
        if col.kind is Kind.YESNO and isinstance(raw, bool):
            return Parsed(bool(raw))
        return Invalid(f"must be one of: {', '.join(options)}; found {describe(raw)}")
    key = norm_choice(t)
    if col.kind is Kind.YESNO:
        if key in _TRUE:
            return Parsed(True)
        if key in _FALSE:
            return Parsed(False)
        return Invalid(f"must be yes or no; found {describe(raw)}")
    for c in col.choices:
        if norm_choice(c) == key:
            return Parsed(c)
    return Invalid(f"must be one of: {', '.join(options)}; found {describe(raw)}")


def parse_date(raw: object) -> Parsed | Invalid:
    if isinstance(raw, dt.datetime):
        return Parsed(raw.date())
    if isinstance(raw, dt.date):
        return Parsed(raw)
    if isinstance(raw, str):
        try:
            return Parsed(dt.date.fromisoformat(raw.strip()))
        except ValueError:
            pass
    return Invalid(f"must be a date (e.g. 2024-05-14); found {describe(raw)}")


def parse_list(raw: object, col: Column) -> Parsed | Invalid:
    t = _as_text(raw)
    if isinstance(t, Invalid):
        return Invalid(f"must be a list separated by commas; found {describe(raw)}")
    if _CONTROL.search(t):
        return Invalid("contains control characters; retype the value")
    items = [s.strip() for s in _LIST_SEPARATOR.split(t) if s.strip()]
    if col.kind is Kind.LABELLIST:
        hidden = _invisible(t)
        if hidden:
            return Invalid(f"contains an invisible character (U+{ord(hidden):04X}); "
                           "retype the ids")
        too_long = [s for s in items if len(s) > col.max_length]
        if too_long:
            return Invalid(f"has an id longer than {col.max_length} characters")
        return Parsed(tuple(items))
    out: list[int] = []
    for s in items:
        if not _LIST_NUMBER.fullmatch(s):
            return Invalid(f"must list whole numbers separated by commas (e.g. 4, 5); "
                           f"found {describe(s)}")
        out.append(int(s))
    return Parsed(tuple(out))


def parse_value(raw: object, col: Column, si: bool) -> Parsed | Invalid:
    """Parse a non-blank raw cell value for ``col``."""
    if isinstance(raw, str) and raw.strip() in EXCEL_ERRORS:
        return Invalid(f"holds the spreadsheet error {raw.strip()} (a formula result); "
                       "correct the formula or type the value")
    if col.kind in (Kind.NUMBER, Kind.INTEGER):
        return parse_number(raw, col, si)
    if col.kind in (Kind.TEXT, Kind.LABEL):
        return parse_text(raw, col)
    if col.kind in (Kind.CHOICE, Kind.YESNO):
        return parse_choice(raw, col)
    if col.kind is Kind.DATE:
        return parse_date(raw)
    return parse_list(raw, col)
