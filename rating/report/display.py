"""Numbers as the report shows them: converted to the bridge's unit system, sensibly rounded.

The conversion uses the same field metadata (dimension) and the same unit table as the JSON
view (:mod:`rating.results`), so an SI bridge shows SI in the report and in its results file.
"""

from __future__ import annotations

import dataclasses
import math
from collections.abc import Callable, Sequence
from dataclasses import dataclass, field
from typing import Any

from rating.results import DISPLAY_UNITS, RatingResults, dimensions, reported_rf
from rating.units import from_core

DASH = "\u2014"  # shown where there is no number (no live load of that sense, not rated)
MINUS = "\u2212"
NEG_INF = "\u2212\u221e"  # RF = -inf

# decimals by dimension and unit system: (US, SI)
_DECIMALS: dict[str, tuple[int, int]] = {
    "force": (1, 1),
    "length": (2, 2),
    "dimension": (3, 1),
    "area": (2, 0),
    "stress": (1, 0),
    "weight": (1, 1),
    "line load": (3, 2),
}

# Display names of the units (the JSON view keeps the plain symbols).
_PRETTY = {"in2": "in\u00b2", "mm2": "mm\u00b2"}


def unit_system(results: RatingResults) -> str:
    """"SI" when the results were asked for in SI (kN), else "US" (as ``results_json``)."""
    return "SI" if results.units.get("force") == "kN" else "US"


def _is_number(x: Any) -> bool:
    return isinstance(x, int | float) and not isinstance(x, bool)


_FORMATS = tuple(f",.{k}f" for k in range(8))  # the format of each number of decimals
_PLAIN = tuple(f".{k}f" for k in range(8))  # the same without digit grouping


def _fixed(x: float, decimals: int, signed: bool = False) -> str:
    if -999.0 < x < 999.0 and 0 <= decimals < 8:
        # below 999 (however it rounds) there is no group separator: the plain format, faster
        text = format(x, _PLAIN[decimals])
    else:
        text = format(x, _FORMATS[decimals] if 0 <= decimals < 8 else f",.{decimals}f")
    if not text.strip("-0.,"):  # -0.0 and 0.000 print without a sign
        return text.lstrip("-")
    if text[0] == "-":
        return MINUS + text[1:]
    return ("+" + text) if signed else text


@dataclass(frozen=True)
class Display:
    """Formatting rules of one report: unit system and precision.

    A report shows the same values many times (axle loads, stations, rating factors): each
    float is formatted once per rule and remembered in ``_texts`` (a memo of this object's
    pure functions, not part of its value)."""

    system: str = "US"
    _texts: dict[tuple[Any, ...], str] = field(default_factory=dict, init=False, repr=False,
                                               compare=False)

    # ------------------------------------------------------------------ units
    def unit(self, dimension: str) -> str:
        """Display unit of a dimension (``kip``/``kN``, ``ft``/``m``, ...)."""
        us, si = DISPLAY_UNITS[dimension]
        return _PRETTY.get(si if self.system == "SI" else us,
                           si if self.system == "SI" else us)

    def convert(self, value: float, dimension: str | None) -> float:
        """Core-unit value to the display unit of ``dimension`` (no rounding)."""
        if dimension is None or self.system == "US" or not math.isfinite(value):
            return value
        return from_core(float(value), DISPLAY_UNITS[dimension][1])

    # ------------------------------------------------------------------ numbers
    def number(self, value: float | None, dimension: str | None = None,
               decimals: int | None = None, signed: bool = False) -> str:
        """A quantity converted and rounded; ``None``/NaN/infinite as a dash."""
        if type(value) is float:  # the usual case, remembered (ints and bools are not)
            key = (value, dimension, decimals, signed)
            text = self._texts.get(key)
            if text is None:
                text = self._texts[key] = self._number(value, dimension, decimals, signed)
            return text
        return self._number(value, dimension, decimals, signed)

    def formatter(self, dimension: str | None = None, decimals: int | None = None,
                  signed: bool = False) -> Callable[[float | None], str]:
        """``number`` with these rules, for a long run of values (a table): its own memo of
        texts by value."""
        texts: dict[float, str] = {}
        number = self._number
        # the rules of _number worked out once: decimals, and the SI unit to convert to
        places = _DECIMALS.get(dimension or "", (2, 2))[1 if self.system == "SI" else 0] \
            if decimals is None else decimals
        si = DISPLAY_UNITS[dimension][1] if dimension is not None and self.system != "US" \
            else None

        def text(value: float | None) -> str:
            if type(value) is float:
                out = texts.get(value)
                if out is None:
                    if math.isfinite(value):
                        out = _fixed(value if si is None else from_core(value, si), places,
                                     signed)
                    else:
                        out = DASH
                    texts[value] = out
                return out
            return number(value, dimension, decimals, signed)

        return text

    def _number(self, value: float | None, dimension: str | None, decimals: int | None,
                signed: bool) -> str:
        if type(value) is not float and (value is None or not _is_number(value)):
            return DASH
        if not math.isfinite(value):
            return DASH
        if decimals is None:
            pair = _DECIMALS.get(dimension or "", (2, 2))
            decimals = pair[1] if self.system == "SI" else pair[0]
        x = float(value)
        if dimension is not None and self.system != "US":  # as convert(), finite here
            x = from_core(x, DISPLAY_UNITS[dimension][1])
        return _fixed(x, decimals, signed)

    def force(self, value: float | None, signed: bool = False) -> str:
        return self.number(value, "force", None, signed)

    def length(self, value: float | None) -> str:
        return self.number(value, "length", None, False)

    def weight(self, value: float | None) -> str:
        return self.number(value, "weight", None, False)

    def rf(self, value: float | None) -> str:
        """Rating factor to 2 decimals, rounded down (0.996 shows 0.99, never 1.00);
        +inf (no live-load effect) and missing as a dash; -inf (the member cannot carry
        its dead load, or has no resistance in the sense loaded) as minus infinity."""
        if type(value) is float:
            key = ("rf", value)
            text = self._texts.get(key)
            if text is None:
                text = self._texts[key] = self.rf_text(value)
            return text
        return self.rf_text(value)

    @staticmethod
    def rf_text(value: float | None) -> str:
        """:meth:`rf` without remembering the text."""
        if type(value) is float and -999.0 < value < 999.0:
            # the usual case, as below: rounded down to a multiple of 0.01 that is not -0.0,
            # so the text is the plain format with the minus sign of the report
            x = reported_rf(value)
            return format(x, ".2f") if x >= 0.0 else MINUS + format(-x, ".2f")
        if value is None or not _is_number(value) or math.isnan(value):
            return DASH
        if math.isinf(value):
            return DASH if value > 0 else NEG_INF
        return _fixed(reported_rf(float(value)), 2)

    def posting(self, value: float | None) -> str:
        """A safe posting load in whole display units, rounded down (never up)."""
        if value is None or not _is_number(value) or not math.isfinite(value):
            return DASH
        return _fixed(float(math.floor(self.convert(float(value), "weight") + 1e-6)), 0)

    def series(self, values: Sequence[float], dimension: str | None,
               decimals: int | None = None) -> str:
        return " / ".join(self.number(v, dimension, decimals) for v in values)

    def field(self, obj: Any, name: str, signed: bool = False) -> str:
        """A dataclass field formatted by its own metadata (dimension)."""
        return self.number(getattr(obj, name), dimensions(type(obj))[name], None, signed)

    def label(self, obj: Any, name: str) -> str:
        """Column header of a field: its metadata label with the display unit."""
        f = {f.name: f for f in dataclasses.fields(obj)}[name]
        meta = f.metadata or {}
        label = meta.get("label", name)
        dim = meta.get("dimension")
        return f"{label} ({self.unit(dim)})" if dim else label


def display_for(results: RatingResults) -> Display:
    return Display(unit_system(results))
