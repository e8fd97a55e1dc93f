"""Inspection findings: what the inspector measured and saw on each member."""

from __future__ import annotations

from dataclasses import dataclass
from enum import StrEnum


class BarState(StrEnum):
    """State of one bar or part. A loose, missing, broken or cracked bar carries no load
    (common practice); a bent bar is flagged and, in compression, not counted."""

    SOUND = "sound"
    LOOSE = "loose"
    MISSING = "missing"
    BENT = "bent"
    BROKEN = "broken"
    CRACKED = "cracked"


class FindingRegion(StrEnum):
    """Where along the member the finding sits."""

    BODY = "body"  # the shank of an eyebar or rod, or along a built-up member
    HEAD = "head"  # eyebar head / around the pin hole
    THREAD = "thread"  # threaded or upset end of a rod, or the loop's forge line
    CONNECTION = "connection"  # pin plate or riveted end of a built-up member


@dataclass(frozen=True)
class Finding:
    """One recorded finding.

    ``component`` names a bar (``"bar 2"``), a part label of a built-up member, or ``"all"``.
    Loss is given either as ``remaining_thickness_in`` or as ``percent_loss`` (of thickness,
    or of diameter for a rod). ``condition_rating`` is the NBI-style 0-9 member rating.
    ``where`` is the workbook place it came from (``Findings!A12``) for messages.
    ``estimated``: the loss was judged by eye, not measured.
    """

    member: str
    component: str = "all"
    region: FindingRegion = FindingRegion.BODY
    station_ft: float | None = None
    remaining_thickness_in: float | None = None
    percent_loss: float | None = None
    bar_state: BarState = BarState.SOUND
    pack_rust: bool = False
    condition_rating: int | None = None
    photo: str = ""
    note: str = ""
    where: str = ""
    estimated: bool = False
