"""Posting: from the rating factor of a legal load to the recommended action."""

from __future__ import annotations

import math
from dataclasses import dataclass
from enum import StrEnum

from rating.lrfr.factors import provisions
from rating.lrfr.reported import reported_rf
from rating.units import TON_PER_TONNE


class PostingAction(StrEnum):
    NONE = "none"
    POST = "post"
    CLOSE = "close"


@dataclass(frozen=True)
class PostingResult:
    """The posting outcome for one legal load (MBE 6A.8.3): RF, rating RT = RF x W and safe
    posting load (None unless posted), in the unit of W given; the action and its source."""

    rf: float
    rating_tons: float  # RT = RF x W, RF as reported (two decimals, rounded down)
    posting_tons: float | None  # safe posting load, whole tons (or tonnes) rounded down
    action: PostingAction
    source: str
    reason: str = ""  # why, where the action is not read off the RF alone


def safe_posting_load(rf: float, gross_weight: float, lower_rf: float = 0.3) -> float:
    """Safe posting load = (W / 0.7) (RF - 0.3), for 0.3 <= RF < 1.0.

    MBE 6A.8.3, Eq. 6A.8.3-1 [Khan 2010, p. 187, read; article number from memory].
    """
    return gross_weight / 0.7 * (rf - lower_rf)


def posting_load(rf: float, gross_weight: float) -> float:
    """The safe posting load in whole units of ``gross_weight``, rounded down, worked from the
    RF as reported (:func:`reported_rf`). MBE 6A.8.3, Eq. 6A.8.3-1 [value from memory;
    equation read in Khan 2010, p. 187]."""
    low = provisions()["posting"]["lower_rf"]
    return float(math.floor(safe_posting_load(reported_rf(rf), gross_weight, low) + 1e-9))


def least_posting_load(unit: str = "ton") -> float:
    """The least gross weight a bridge kept open must carry, in ``unit`` ("ton" or "tonne"):
    3 tons (MBE 6A.8.1 [value from memory]); a safe posting load below it is a closure."""
    tons = float(provisions()["posting"]["least_tons"])
    return tons if unit == "ton" else tons / TON_PER_TONNE


def posting(rf: float, gross_weight: float, unit: str = "ton") -> PostingResult:
    """Action for one legal vehicle; ``gross_weight`` in the weight unit named by ``unit``.

    RF >= 1: no restriction; 0.3 <= RF < 1: post at the safe posting load rounded down to a
    whole unit (MBE 6A.8.3, Eq. 6A.8.3-1 [value from memory; equation read in Khan 2010,
    p. 187]), or consider closing where that is less than 3 tons, the least gross weight a
    bridge kept open must carry (MBE 6A.8.1 [value from memory]); RF < 0.3: consider closing
    (MBE 6A.8.3; owner's policy governs). The thresholds, RT and the posting load take the RF
    as reported (:func:`reported_rf`); ``rf`` is kept as computed.
    """
    p = provisions()["posting"]
    shown = reported_rf(rf)
    rt = shown * gross_weight  # infinite with the RF (no live load: +inf; no rating: -inf)
    if shown >= 1.0:
        return PostingResult(rf, rt, None, PostingAction.NONE, p["source"])
    if shown >= p["lower_rf"]:
        # whether the bridge can carry the least weight is judged on the safe load itself;
        # only the sign is rounded down (in tonnes a whole unit is coarse beside 2.72 t)
        safe = safe_posting_load(shown, gross_weight, p["lower_rf"])
        least = least_posting_load(unit)
        if safe >= least - 1e-9:
            load = posting_load(rf, gross_weight)
            note = "" if load >= least - 1e-9 else (
                f"the safe posting load, {safe:.2f} {unit}s, is at least the "
                f"{p['least_tons']:g} tons ({least:.2f} {unit}s) a bridge kept open must "
                f"carry; the sign is rounded down to whole {unit}s")
            return PostingResult(rf, rt, load, PostingAction.POST, p["source"], note)
        in_unit = "" if unit == "ton" else f" ({least:.2f} {unit}s)"
        return PostingResult(rf, rt, None, PostingAction.CLOSE, p["least_source"], (
            f"the safe posting load (W / 0.7) \u00d7 (RF \u2212 0.3) is {safe:.2f} {unit}s, "
            f"less than the {p['least_tons']:g} tons{in_unit} a bridge kept open must carry "
            "(MBE 6A.8.1 [value from memory])"))
    return PostingResult(rf, rt, None, PostingAction.CLOSE, p["close_source"])
