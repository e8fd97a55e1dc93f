"""Domain types: the bridge as plain frozen dataclasses, no I/O."""

from rating.model.bridge import (
    Bridge,
    BridgeInfo,
    CrossSection,
    MemberDesign,
    RatingSettings,
    RidingSurface,
    UnitSystem,
)
from rating.model.geometry import (
    DeckPosition,
    Joint,
    Member,
    MemberRole,
    Support,
    SupportKind,
    TrussGeometry,
)
from rating.model.inspection import BarState, Finding, FindingRegion
from rating.model.loads import DeadLoadBasis, DeadLoadItem, DeadLoadKind
from rating.model.materials import Material, MaterialKind
from rating.model.pins import PackingItem, Pin
from rating.model.sections import (
    CONNECTOR_WORDS,
    AnglePart,
    BuiltUpSection,
    ChannelPart,
    ChannelToes,
    ConnectorKind,
    Connectors,
    EyebarSet,
    Part,
    PlatePart,
    RodEnd,
    RodSet,
    RodShape,
    RolledShape,
    Section,
    connector_component,
)
from rating.model.vehicles import AxleSpacing, Vehicle, VehicleCategory

__all__ = [
    "CONNECTOR_WORDS", "AnglePart", "AxleSpacing", "BarState", "Bridge", "BridgeInfo",
    "BuiltUpSection",
    "ChannelPart", "ChannelToes", "ConnectorKind", "Connectors", "CrossSection",
    "DeadLoadBasis", "DeadLoadItem", "DeadLoadKind", "DeckPosition", "EyebarSet", "Finding",
    "FindingRegion", "Joint", "Material", "MaterialKind", "Member", "MemberDesign",
    "MemberRole", "PackingItem", "Part", "Pin", "PlatePart", "RatingSettings", "RidingSurface",
    "RodEnd", "RodSet", "RodShape", "RolledShape", "Section", "Support", "SupportKind",
    "TrussGeometry", "UnitSystem", "Vehicle", "VehicleCategory", "connector_component",
]
