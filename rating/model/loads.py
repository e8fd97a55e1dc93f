"""Dead-load items other than the trusses' own weight."""

from __future__ import annotations

from dataclasses import dataclass
from enum import StrEnum


class DeadLoadKind(StrEnum):
    """LRFD load components: DC structural and attachments, DW wearing surface and utilities."""

    DC = "DC"
    DW = "DW"


class DeadLoadBasis(StrEnum):
    """How an item's intensity is given.

    PSF_DECK: psf over the deck width (deck slab, wearing surface), shared by the two trusses
    by the lever rule about ``offset_ft``.
    PLF_BRIDGE: lb per ft of bridge for the whole cross-section (stringers, railing both sides),
    shared by the lever rule about ``offset_ft`` from the bridge centre line.
    PLF_TRUSS: lb per ft along one truss line (its own railing, bracing), at deck level.
    KIP_PER_FLOORBEAM: kip for each floorbeam, whole cross-section, lever rule as above.
    """

    PSF_DECK = "psf of deck"
    PLF_BRIDGE = "plf of bridge"
    PLF_TRUSS = "plf per truss"
    KIP_PER_FLOORBEAM = "kip per floorbeam"


@dataclass(frozen=True)
class DeadLoadItem:
    """One dead load other than the trusses' own weight (deck, wearing surface, stringers,
    railing...): DC or DW, with its intensity in the unit of its basis (psf, plf or kip per
    floorbeam), its lever-rule offset (ft) and its workbook place."""

    description: str
    kind: DeadLoadKind
    basis: DeadLoadBasis
    intensity: float
    offset_ft: float = 0.0
    where: str = ""
