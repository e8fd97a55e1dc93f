"""Rating vehicles: the shipped library (data with sources), owner vehicles, rating loads."""

from rating.vehicles.library import (
    LoadModel,
    RatingLoad,
    as_rating_load,
    library,
    make_vehicle,
    owner_vehicle,
    rating_load,
    rating_loads,
    vehicle,
)

__all__ = [
    "LoadModel", "RatingLoad", "as_rating_load", "library", "make_vehicle", "owner_vehicle",
    "rating_load", "rating_loads", "vehicle",
]
