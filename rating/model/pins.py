"""Pins and the packing of bars on them."""

from __future__ import annotations

from dataclasses import dataclass

from rating.model.materials import Material


@dataclass(frozen=True)
class PackingItem:
    """One plate on the pin, in order from one end of the pin to the other.

    ``member`` is the member whose bar or pin plate this is, or ``None`` for a filler/spacer.
    ``gap_before_in`` is clear space before this plate (after the previous one).
    A member's force is shared among its plates on the pin in proportion to their thickness.
    """

    member: str | None
    thickness_in: float
    gap_before_in: float = 0.0


@dataclass(frozen=True)
class Pin:
    """The pin at a joint: its diameter (in), the plates on it in order (packing), its material
    (None: not recorded, a default is assumed and listed) and its workbook place."""

    joint: str
    diameter_in: float
    packing: tuple[PackingItem, ...]
    material: Material | None = None
    where: str = ""
    spliced_chord: tuple[str, str] | None = None  # the two chord members spliced through
    # the joint: their plates bring only the resultant of their forces into the pin
    estimated_at: str = ""  # where its dimensions, or a plate's on it, are recorded as
    # estimated (the Pins row first, then the Packing rows in order; "": none is)
