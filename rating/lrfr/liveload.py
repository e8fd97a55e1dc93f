"""Panel-point loads of the loading that produced one live-load extreme."""

from __future__ import annotations

import numpy as np

from rating.analysis.loading import axle_joint_loads, lane_joint_loads
from rating.analysis.moving import Extreme, axle_stations
from rating.model import TrussGeometry
from rating.vehicles.library import RatingLoad


def live_joint_loads(g: TrussGeometry, load: RatingLoad, ext: Extreme, im: float,
                     df: float, gamma_ll: float = 1.0) -> np.ndarray:
    """Panel-point loads (kip, one truss) of the loading that produced ``ext``, with IM on axles."""
    P = np.zeros((len(g.joints), 2))
    model = next((mo for mo in load.models if mo.name == ext.model), None)
    if model is None:
        return P
    if model.axles is not None and ext.position is not None:
        v = model.axles
        loads = np.asarray(v.axle_loads_kip) * v.axle_scale
        P += (1.0 + im) * axle_joint_loads(g, axle_stations(ext.position), loads)
    if ext.lane_klf and ext.lane_segments_ft:
        P += lane_joint_loads(g, ext.lane_segments_ft, ext.lane_klf)
    return gamma_ll * df * P


def position_key(e: Extreme) -> tuple:
    """What makes one loading of a rating load: its model, position and lane segments."""
    return (e.model, e.position, e.lane_segments_ft)
