"""The bridge as the rating sees it: geometry, members with sections, findings, pins, loads,
the roadway cross-section and the rating settings. Plain data, no I/O."""

from __future__ import annotations

import datetime as dt
from dataclasses import dataclass, field
from enum import StrEnum

from rating.model.geometry import TrussGeometry
from rating.model.inspection import Finding
from rating.model.loads import DeadLoadItem
from rating.model.materials import Material
from rating.model.pins import Pin
from rating.model.sections import Section
from rating.model.vehicles import Vehicle


class RidingSurface(StrEnum):
    """Riding-surface condition for the reduced legal-load IM (MBE C6A.4.4.3) [M]."""

    SMOOTH = "smooth"
    MINOR = "minor deviations"
    MAJOR = "major deviations"


class UnitSystem(StrEnum):
    US = "US"
    SI = "SI"


@dataclass(frozen=True)
class BridgeInfo:
    """Identification of the bridge and its inspection as recorded in the workbook: structure
    id, name, location, owner, year built, inspection date and inspector."""

    structure_id: str
    name: str
    location: str = ""
    owner: str = ""
    year_built: int | None = None
    inspection_date: dt.date | None = None
    inspector: str = ""


@dataclass(frozen=True)
class CrossSection:
    """Roadway across the floorbeam, ft. Curb offsets are measured from the left truss
    centre line; when not given the roadway is centred between the trusses."""

    truss_spacing_ft: float
    roadway_width_ft: float
    left_curb_ft: float | None = None
    lane_count_override: int | None = None
    deck_width_ft: float | None = None
    floorbeam_I_in4: float | None = None  # strong axis, one floorbeam (a pony truss's U-frames)
    uframe_height_ft: float | None = None  # floorbeam to top chord (None: each vertical's)
    chord_hinged_at_hips: bool | None = None  # a pony truss's chord out of plane at its hips
    # (None: not given, taken as continuous)

    @property
    def curb_left_ft(self) -> float:
        if self.left_curb_ft is not None:
            return self.left_curb_ft
        return (self.truss_spacing_ft - self.roadway_width_ft) / 2.0

    @property
    def curb_right_ft(self) -> float:
        return self.curb_left_ft + self.roadway_width_ft


@dataclass(frozen=True)
class MemberDesign:
    """A member's section and material; ``K`` overrides the effective length factor,
    ``condition_factor`` and ``system_factor`` override the tabulated ones.
    ``estimated_at``: where the workbook records the section's dimensions as estimated (not
    measured or from plans), "" where it does not."""

    member: str
    section: Section
    material: Material
    K: float | None = None
    condition_factor: float | None = None
    system_factor: float | None = None
    where: str = ""
    estimated_at: str = ""


@dataclass(frozen=True)
class RatingSettings:
    """Owner's choices for this rating. ``None`` means use the provision's value."""

    vehicle_ids: tuple[str, ...] | None = None
    provision_set: str = "MBE 2018"
    adtt_one_direction: float | None = None
    riding_surface: RidingSurface | None = None
    wearing_surface_measured: bool = False
    im_override: float | None = None
    gamma_ll_override: float | None = None
    distribution_factor_override: float | None = None
    detail_allowance: float = 0.15
    detail_allowance_given: bool = False
    units: UnitSystem = UnitSystem.US


@dataclass(frozen=True)
class Bridge:
    """The whole bridge as the rating sees it: identification, truss geometry, roadway
    cross-section, member sections and materials, findings, pins, dead loads, owner vehicles,
    rating settings and the source workbook."""

    info: BridgeInfo
    geometry: TrussGeometry
    cross_section: CrossSection
    member_designs: tuple[MemberDesign, ...]
    findings: tuple[Finding, ...] = ()
    pins: tuple[Pin, ...] = ()
    dead_loads: tuple[DeadLoadItem, ...] = ()
    owner_vehicles: tuple[Vehicle, ...] = ()
    settings: RatingSettings = field(default_factory=RatingSettings)
    source_file: str = ""

    def design_of(self, member: str) -> MemberDesign | None:
        for d in self.member_designs:
            if d.member == member:
                return d
        return None

    def findings_for(self, member: str) -> tuple[Finding, ...]:
        return tuple(f for f in self.findings if f.member == member)
