"""Shading by rating factor: the bands of the report's drawing and tables and of the batch
index (our own legend)."""

from __future__ import annotations

import functools
from dataclasses import dataclass


@dataclass(frozen=True)
class Band:
    """One shading band of the RF legend: its key (the CSS class of shaded cells), its label,
    its colour, and the line width and dash pattern of the members drawn in it."""

    key: str
    label: str
    colour: str
    stroke_width: float
    dash: str = ""


@dataclass(frozen=True)
class RFBands:
    """Shading of members by their lowest rating factor (our own legend).

    ``edges`` are the band limits; the bands are RF < e0, e0 <= RF < e1, e1 <= RF < e2,
    RF >= e2, and "not rated". Lower bands are drawn heavier and in darker colours (the
    lightness falls band by band), so that a black-and-white print still tells them apart and
    ranks them the same way: a pin's circle, whose size does not change, by its grey alone.
    """

    edges: tuple[float, float, float] = (0.3, 1.0, 1.2)

    @functools.cached_property
    def bands(self) -> tuple[Band, ...]:
        a, b, c = (f"{e:g}" for e in self.edges)
        k0, k1, k2, k3, nr = _BAND_KEYS
        return (
            Band(k0, f"RF < {a}", "#8e1b1b", 6.0),
            Band(k1, f"{a} \u2264 RF < {b}", "#e0702a", 4.5),
            Band(k2, f"{b} \u2264 RF < {c}", "#d9b526", 3.2),
            Band(k3, f"RF \u2265 {c}", "#9cc3e4", 2.2),
            Band(nr, "not rated", "#9a9a9a", 1.6, "5 3"),
        )

    def band(self, rf: float | None) -> Band:
        """The band of a lowest RF (``None``: not rated; +inf: no live load, drawn as >= top)."""
        return self.bands[self._index(rf)]

    def key(self, rf: float | None) -> str:
        """The key of that band (``band(rf).key``), for shading a table cell."""
        return _BAND_KEYS[self._index(rf)]

    def _index(self, rf: float | None) -> int:
        if rf is None or (rf != rf and isinstance(rf, float)):  # not rated, or NaN
            return 4
        e0, e1, e2 = self.edges
        return 0 if rf < e0 else 1 if rf < e1 else 2 if rf < e2 else 3


_BAND_KEYS = ("b0", "b1", "b2", "b3", "nr")  # the CSS classes of the bands, lowest first
