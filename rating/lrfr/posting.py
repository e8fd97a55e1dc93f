"""Posting: from the rating factor of a legal load to the recommended action."""

from __future__ import annotations

import math
from dataclasses import dataclass
from enum import StrEnum

from rating.lrfr.factors import provisions


class PostingAction(StrEnum):
    NONE = "none"
    POST = "post"
    CLOSE = "close"


@dataclass(frozen=True)
class PostingResult:
    """The posting outcome for one legal load (MBE 6A.8.3): RF, rating RT = RF x W and safe
    posting load (None unless posted), in the unit of W given; the action and its source."""

    rf: float
    rating_tons: float  # RT = RF x W
    posting_tons: float | None  # safe posting load, whole tons (or tonnes) rounded down
    action: PostingAction
    source: str


def safe_posting_load(rf: float, gross_weight: float, lower_rf: float = 0.3) -> float:
    """Safe posting load = (W / 0.7) (RF - 0.3), for 0.3 <= RF < 1.0.

    MBE 6A.8.3, Eq. 6A.8.3-1 [Khan 2010, p. 187, read; article number from memory].
    """
    return gross_weight / 0.7 * (rf - lower_rf)


def posting(rf: float, gross_weight: float) -> PostingResult:
    """Action for one legal vehicle; ``gross_weight`` in the report's weight unit.

    RF >= 1: no restriction; 0.3 <= RF < 1: post at the safe posting load rounded down to a
    whole unit; RF < 0.3: consider closing (owner's policy governs). MBE 6A.8.3 [value from
    memory; equation read in Khan 2010, p. 187].
    """
    p = provisions()["posting"]
    low = p["lower_rf"]
    rt = rf * gross_weight if math.isfinite(rf) else math.inf
    if rf >= 1.0:
        return PostingResult(rf, rt, None, PostingAction.NONE, p["source"])
    if rf >= low:
        load = math.floor(safe_posting_load(rf, gross_weight, low) + 1e-9)
        return PostingResult(rf, rt, float(load), PostingAction.POST, p["source"])
    return PostingResult(rf, rt, None, PostingAction.CLOSE, p["close_source"])
