"""Vehicle positions tried on the exact load path besides the envelope positions."""

from __future__ import annotations

from rating.analysis.moving import Extreme, panel_point_positions
from rating.vehicles.library import RatingLoad


def panel_point_extremes(load: RatingLoad, stations_ft) -> tuple[Extreme, ...]:
    """Every position of the load's vehicle with an axle over a deck panel point, both
    directions, as extremes to follow on the load path; empty for a load with a lane part or
    a variable spacing (those keep the envelope positions alone)."""
    if len(load.models) != 1:
        return ()
    mo = load.models[0]
    v = mo.axles
    if v is None or mo.lane_load_klf or any(sp.min_ft != sp.max_ft for sp in v.spacings):
        return ()
    return tuple(Extreme(0.0, 0.0, mo.name, v.id, pos) for pos in
                 panel_point_positions(stations_ft, [sp.min_ft for sp in v.spacings]))
