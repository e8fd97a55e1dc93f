"""The report's view of the comparison with the previous rating (rating.previous), formatted:
each case's outcome then and now, and the members and pins whose ratings moved.

Nothing here compares anything: it formats rating.results.SincePrevious.
"""

from __future__ import annotations

import math
from collections.abc import Callable, Mapping
from dataclasses import dataclass
from typing import Protocol

from rating.previous import RF_CHANGE, direction, posting_words, truck_state
from rating.report.display import DASH, Display
from rating.results import EMERGENCY, RatingResults, VehicleChange, VehicleResult, reported_rf

ELEMENT_ROWS = 20
"""The members and pins shown in the report's table of ratings that moved (the largest falls
first); the results file holds them all."""


class Shaded(Protocol):
    """An RF as printed with its band key for shading: the report's own cells
    (rating.report.view.Cell)."""

    text: str
    band: str


@dataclass(frozen=True)
class VehicleChangeRow:
    """One case's row: RF, controlling member and outcome then and now, and the change."""

    vehicle: str
    rf_then: Shaded
    rf_now: Shaded
    member_then: str
    member_now: str
    outcome_then: str
    outcome_now: str
    change: str
    worse: bool


@dataclass(frozen=True)
class ElementChangeRow:
    """A member or pin whose lowest RF moved: the case, RF then and now, the move in per cent
    and the findings on it then and now."""

    element: str
    case: str
    rf_then: Shaded
    rf_now: Shaded
    move: str
    findings_then: str
    findings_now: str
    lower: bool


@dataclass(frozen=True)
class SinceView:
    """Everything the report's "Since the previous rating" part shows."""

    headline: str
    source: str
    notes: tuple[str, ...]
    vehicles: tuple[VehicleChangeRow, ...]
    elements: tuple[ElementChangeRow, ...]
    more_elements: int
    threshold: str
    trucks: str = ""  # the trucks' outcome then and now, in words
    recommendation_before: str = ""  # the previous rating's recommendation, as it read


def _outcome_then(c: VehicleChange, v: VehicleResult, d: Display, unit: str) -> str:
    """The previous outcome in the summary's words (rating.report.view.action_text), a
    posting load as it was posted (``unit``, the previous rating's weight unit)."""
    action, posting = c.action_before, c.posting_before
    if c.rf_before is None:
        return DASH
    if v.rating_level == "permit":
        return f"permit: {action}" if action else "permit: not known"
    if v.rating_level in ("inventory", "operating"):
        return "design-load rating"
    if action == "post" and posting is not None:
        return f"post for {posting_words(posting, d.unit('weight'), unit)}"
    if action == "close":
        return "consider barring" if v.category == EMERGENCY else "consider closing"
    if math.isfinite(c.rf_before) and reported_rf(c.rf_before) < 1.0:
        return "not posted"  # a screening load below 1.0 (as PostingResultEntry says it)
    return "no restriction"


def since_view(results: RatingResults, d: Display, rf_cell: Callable[[float | None], Shaded],
               outcome_now: Callable[[str], str]) -> SinceView | None:
    """The comparison formatted, or None where the rating was not compared with another.
    ``rf_cell`` formats an RF with its band (the report's own cells); ``outcome_now`` gives
    a case's outcome in the summary's words."""
    since = results.previous
    if since is None:
        return None
    vmap: Mapping[str, VehicleResult] = {v.id: v for v in results.vehicles}
    weight = d.unit("weight")
    then_unit = since.weight_unit_before or weight

    rows = []
    for c in since.vehicles:
        v = vmap.get(c.vehicle)
        if v is None:
            continue
        rows.append(VehicleChangeRow(
            vehicle=v.id, rf_then=rf_cell(c.rf_before), rf_now=rf_cell(c.rf_now),
            member_then=c.member_before or DASH, member_now=c.member_now or DASH,
            outcome_then=_outcome_then(c, v, d, then_unit),
            outcome_now=outcome_now(v.id), change=c.change,
            worse=direction(c, v.rating_level, d.unit("weight"), then_unit) < 0))
    elements = []
    for e in since.elements[:ELEMENT_ROWS]:
        if not e.moved:
            move = f"within {RF_CHANGE * 100:g} %"
        elif math.isfinite(e.rf_before) and math.isfinite(e.rf_now) \
                and reported_rf(e.rf_before) > 0:
            # (from the RFs as printed beside it, so that it checks by hand)
            ratio = reported_rf(e.rf_now) / reported_rf(e.rf_before)
            move = f"{(ratio - 1.0) * 100.0:+.0f} %".replace("-", "\u2212")
        else:
            move = "lower" if e.rf_now < e.rf_before else "higher"
        case = e.case if e.case_before in ("", e.case) else f"{e.case_before} / {e.case}"
        elements.append(ElementChangeRow(
            e.element, case, rf_cell(e.rf_before), rf_cell(e.rf_now), move,
            "; ".join(e.findings_before) or "none recorded",
            ("; ".join(e.findings_now) or "none recorded") if e.findings_changed
            else "unchanged", e.moved and e.rf_now < e.rf_before))
    made = f", made with {since.generator}" if since.generator else ""
    return SinceView(
        headline=since.headline,
        source=(f"the results file {since.file} (inspection of "
                f"{since.inspection_date or 'an unknown date'}{made})"),
        notes=since.notes, vehicles=tuple(rows), elements=tuple(elements),
        more_elements=max(0, len(since.elements) - ELEMENT_ROWS),
        threshold=f"{RF_CHANGE * 100:g} %",
        recommendation_before=since.recommendation_before,
        trucks=(f"Trucks rated both times (the legal loads other than emergency vehicles): "
                f"{truck_state(since.trucks_before, since.limit_before, weight, then_unit)}"
                f" then; {truck_state(since.trucks_now, since.limit_now, weight)} now."
                if since.trucks_now else ""))
