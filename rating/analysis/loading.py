"""Loads on the deck turned into panel-point loads through simple-span stringers.

A wheel load between two floorbeams reaches them by the lever rule along the stringer; a
uniform load over part of a stringer span reaches them by its statics (common practice).
These loads reproduce the piecewise-linear influence lines exactly, so the full truss solved
under them gives the same member force as the influence line, at one vehicle position and for
every member at once (concurrent forces).
"""

from __future__ import annotations

from collections.abc import Sequence

import numpy as np

from rating.model import TrussGeometry


def axle_panel_loads(stations_ft: Sequence[float], axle_stations_ft: np.ndarray,
                     axle_loads_kip: Sequence[float]) -> np.ndarray:
    """Downward panel-point loads (n_stations, X) of X positions of an axle series, the axle
    stations given as (X, n_axles); axles off the bridge carry nothing to it."""
    s = np.asarray(stations_ft, dtype=float)
    x = np.atleast_2d(np.asarray(axle_stations_ft, dtype=float))
    w = np.broadcast_to(np.asarray(axle_loads_kip, dtype=float), x.shape)
    on = (x >= s[0]) & (x <= s[-1])
    k = np.clip(np.searchsorted(s, x, side="right") - 1, 0, s.size - 2)
    t = (x - s[k]) / (s[k + 1] - s[k])
    w = np.where(on, w, 0.0)
    col = np.broadcast_to(np.arange(x.shape[0])[:, None], x.shape)
    panel = np.zeros((s.size, x.shape[0]))
    np.add.at(panel, (k, col), w * (1.0 - t))
    np.add.at(panel, (k + 1, col), w * t)
    return panel


def axle_joint_loads(geometry: TrussGeometry, axle_stations_ft: Sequence[float],
                     axle_loads_kip: Sequence[float]) -> np.ndarray:
    """(n_joints, 2) downward panel-point loads from axles at ``axle_stations_ft``.

    Axles off the bridge carry nothing to it.
    """
    x = np.asarray(axle_stations_ft, dtype=float)[None, :]
    panel = axle_panel_loads(geometry.deck_stations_ft, x, axle_loads_kip)[:, 0]
    return _to_joints(geometry, panel)


def lane_panel_loads(stations_ft: Sequence[float], segments_ft: Sequence[tuple[float, float]],
                     w_klf: float) -> np.ndarray:
    """Downward panel-point loads (n_stations,) from a uniform load ``w_klf`` on the given
    segments."""
    s = np.asarray(stations_ft, dtype=float)
    panel = np.zeros(s.size)
    for a, b in segments_ft:
        a, b = max(a, s[0]), min(b, s[-1])
        if b <= a:
            continue
        for k in range(s.size - 1):  # a handful of panels; not a hot path
            lo, hi = max(a, s[k]), min(b, s[k + 1])
            if hi <= lo:
                continue
            length = s[k + 1] - s[k]
            load = w_klf * (hi - lo)
            centroid = (lo + hi) / 2.0
            t = (centroid - s[k]) / length
            panel[k] += load * (1.0 - t)
            panel[k + 1] += load * t
    return panel


def lane_joint_loads(geometry: TrussGeometry, segments_ft: Sequence[tuple[float, float]],
                     w_klf: float) -> np.ndarray:
    """(n_joints, 2) panel-point loads from a uniform load ``w_klf`` on the given segments."""
    return _to_joints(geometry, lane_panel_loads(geometry.deck_stations_ft, segments_ft, w_klf))


def _to_joints(geometry: TrussGeometry, panel_loads: np.ndarray) -> np.ndarray:
    P = np.zeros((len(geometry.joints), 2))
    idx = [geometry.joint_index[j] for j in geometry.deck_joints]
    P[idx, 1] = -panel_loads
    return P
