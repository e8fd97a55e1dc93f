"""Rating vehicles as data: axle loads front to rear (kip) and spacings (ft)."""

from __future__ import annotations

from dataclasses import dataclass
from enum import StrEnum


class VehicleCategory(StrEnum):
    DESIGN = "design"
    LEGAL = "legal"
    SPECIALIZED_HAULING = "specialized hauling"
    EMERGENCY = "emergency"
    OWNER = "owner"
    ROUTINE_PERMIT = "routine permit"
    PERMIT_ESCORTED = "single-trip permit (escorted)"
    PERMIT_SINGLE_TRIP = "single-trip permit"
    PERMIT_MULTIPLE_TRIPS = "multiple-trip permit"

    @property
    def is_permit(self) -> bool:
        """A permit load: rated for the permit's issue, never posted (MBE 6A.4.5 [value from
        memory])."""
        return self in _PERMITS

    @property
    def is_special_permit(self) -> bool:
        """A special (limited-crossing) permit, rated with one lane loaded and the multiple
        presence factor divided out (MBE 6A.4.5.4.2 [value from memory])."""
        return self in _PERMITS and self is not VehicleCategory.ROUTINE_PERMIT


_PERMITS = frozenset({VehicleCategory.ROUTINE_PERMIT, VehicleCategory.PERMIT_ESCORTED,
                      VehicleCategory.PERMIT_SINGLE_TRIP, VehicleCategory.PERMIT_MULTIPLE_TRIPS})


@dataclass(frozen=True)
class AxleSpacing:
    """Distance between two consecutive axles, ft; a range where the standard gives one."""

    min_ft: float
    max_ft: float

    @property
    def is_variable(self) -> bool:
        return self.max_ft > self.min_ft


@dataclass(frozen=True)
class Vehicle:
    """A series of axle loads with an optional uniform lane load (klf, never with IM).

    ``axle_scale`` multiplies the axles (e.g. 0.75 for the lane-type legal load);
    ``min_span_ft`` marks a load model that applies only to longer spans.
    ``gross_weight_tons`` is the weight W used for rating in tons and posting.
    ``gamma_ll``: the owner's live-load factor for this vehicle (None: by its category);
    ``im``: its dynamic load allowance (None: as the settings give for its category);
    ``wheel_gauge_ft``: its wheel lines' distance apart (None: the 6 ft of the design vehicles).
    """

    id: str
    name: str
    category: VehicleCategory
    axle_loads_kip: tuple[float, ...]
    spacings: tuple[AxleSpacing, ...]
    gross_weight_tons: float
    lane_load_klf: float = 0.0
    axle_scale: float = 1.0
    min_span_ft: float | None = None
    source: str = ""
    tag: str = ""
    where: str = ""
    gamma_ll: float | None = None
    im: float | None = None
    wheel_gauge_ft: float | None = None

    @property
    def axle_count(self) -> int:
        return len(self.axle_loads_kip)

    @property
    def axle_length_ft(self) -> float:
        """Distance from the first axle to the last, at the longest spacings, ft."""
        return float(sum(s.max_ft for s in self.spacings))
