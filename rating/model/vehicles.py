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

    @property
    def axle_count(self) -> int:
        return len(self.axle_loads_kip)
