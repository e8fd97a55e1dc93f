"""Influence lines of member axial force for a unit load crossing the deck.

The floor system is simple-span stringers between floorbeams, so a wheel between two panel
points loads only those two floorbeams by the lever rule; every member influence line is
therefore piecewise linear between the deck panel points and zero off the bridge
(common practice; e.g. any structural-analysis text on influence lines for trusses).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np


@dataclass(frozen=True, eq=False)
class InfluenceLines:
    """All member influence lines of one truss, ready for the moving-load engine.

    ``stations_ft``: x of the deck panel points, strictly increasing, shape (n_points,).
    ``ordinates``: member force (kip, tension positive) for a 1-kip load at each station,
    shape (n_members, n_points), rows in the order of ``member_labels``. Between stations the
    line is linear; outside [stations_ft[0], stations_ft[-1]] it is zero.
    """

    member_labels: tuple[str, ...]
    stations_ft: np.ndarray
    ordinates: np.ndarray

    def __post_init__(self) -> None:
        if self.ordinates.shape != (len(self.member_labels), self.stations_ft.size):
            raise ValueError("ordinates must have shape (n_members, n_stations)")
        if np.any(np.diff(self.stations_ft) <= 0):
            raise ValueError("influence-line stations must be strictly increasing")

    def row(self, member: str) -> np.ndarray:
        return self.ordinates[self.member_labels.index(member)]

    def evaluate(self, x_ft: np.ndarray) -> np.ndarray:
        """Ordinates of every member at positions ``x_ft`` (any shape), zero off the bridge.

        Returns shape (n_members, *x_ft.shape).
        """
        x = np.asarray(x_ft, dtype=float)
        s = self.stations_ft
        flat = x.ravel()
        idx = np.clip(np.searchsorted(s, flat, side="right") - 1, 0, s.size - 2)
        t = (flat - s[idx]) / (s[idx + 1] - s[idx])
        on = (flat >= s[0]) & (flat <= s[-1])
        y = self.ordinates[:, idx] * (1.0 - t) + self.ordinates[:, idx + 1] * t
        y = np.where(on, y, 0.0)
        return y.reshape((len(self.member_labels), *x.shape))
