"""The report's view of the results: rows and figures, already formatted for display.

Nothing here computes a rating: it picks, orders and formats what :mod:`rating.results`
holds, converting units through :class:`~rating.report.display.Display`. Text from the
workbook stays plain ``str`` (the template escapes it); drawings are ``Markup``.
"""

from __future__ import annotations

import math
import re
from collections.abc import Iterable, Mapping, Sequence
from dataclasses import dataclass, field
from typing import Any

from markupsafe import Markup

from rating.report import svg
from rating.report.display import DASH, NEG_INF, Display
from rating.report.since import SinceView, since_view
from rating.report.svg import esc
from rating.report.text import breakable
from rating.results import (
    CLOSING_UNLESS,
    DECISION_NOTE,
    EMERGENCY,
    MemberResult,
    PinResult,
    Position,
    PostingResultEntry,
    Rating,
    RatingResults,
    VehicleResult,
    overall_action,
    permit_words,
    reported_rf,
)

TAG_TEXT = {"V": "read in the source", "M": "value from memory", "CP": "common practice"}
LEVEL_TEXT = {"inventory": "inventory", "operating": "operating", "legal": "legal load"}


def level_text(v: VehicleResult) -> str:
    """The rating level as the report words it; an emergency vehicle, rated at the legal level
    with its own load factor, is named as one (it never closes a bridge); a permit by its
    type."""
    if v.rating_level == "permit":
        return v.category
    text = LEVEL_TEXT.get(v.rating_level, v.rating_level)
    return f"{text} (emergency vehicle)" if v.category == EMERGENCY else text


ACTION_TEXT = {"none": "no restriction", "post": "post", "close": "consider closing"}


def action_text(entry: PostingResultEntry | None, rating_level: str, d: Display,
                category: str = "") -> str:
    """What a rating case's posting outcome says, in the words of the report's summary (and
    of the command's printout, so the two never differ): the safe posting load in whole
    display units, "design-load rating" for HL-93, "permit: ..." for a permit load
    (rating.results.permit_words), "not posted" for a screening load rated
    below 1.0 (PostingResultEntry.not_posted_below_one), "consider barring" for an emergency
    vehicle that cannot be posted (the bridge is not closed for it:
    rating.results_build.recommendation)."""
    if entry is None:
        return DASH
    if entry.action == "close" and category == EMERGENCY:
        return "consider barring"
    if entry.action == "post" and entry.posting_tons is not None:
        amount = d.posting(entry.posting_tons)
        unit = d.unit("weight")
        return f"post for {amount} {unit}{'' if amount == '1' else 's'}"
    if rating_level in ("inventory", "operating") and entry.action == "none":
        return "design-load rating"
    if rating_level == "permit":
        return permit_words(entry)
    if entry.not_posted_below_one(rating_level):
        return "not posted"
    return ACTION_TEXT.get(entry.action, entry.action)


# ------------------------------------------------------------------ rows

@dataclass(frozen=True)
class Cell:
    """A formatted RF (or other value) with its band key for shading."""

    text: str
    band: str = ""


@dataclass(frozen=True)
class Control:
    """What controls one vehicle: a member or a pin, its rating and the posting entry."""

    vehicle: VehicleResult
    element: str
    kind: str  # "member" | "pin" | "" (named in the results but not found)
    rating: Rating | None
    entry: PostingResultEntry | None

    @property
    def rf(self) -> float | None:
        if self.entry is not None:
            return self.entry.rf
        return self.rating.rf if self.rating is not None else None


@dataclass(frozen=True)
class SummaryRow:
    """One vehicle's row of the report's summary table, formatted: the controlling member or
    pin, its check and RF, the rating RT, the action and the safe posting load."""

    vehicle: str
    vehicle_id: str
    level: str
    weight: str
    element: str
    check: str
    rf: Cell
    rating_tons: str
    action: str
    action_key: str
    posting: str
    note: str
    alike: str = ""  # others rated the same (mirror members of a symmetric truss)
    finding: str = ""  # the inspection finding behind the governing check, if any


@dataclass(frozen=True)
class MemberRow:
    """One member's row of the report's member table, formatted: length, DC and DW forces,
    factored tension and compression resistances, and its lowest RF with the vehicle, check,
    method and finding behind it."""

    id: str
    role: str
    tension_only: bool
    length: str
    dc: str
    dw: str
    phi_rt: str
    phi_rc: str
    rf: Cell
    vehicle: str
    check: str
    method: str
    finding: str
    factors: str = ""  # phi_c x phi_s of its resistance (the condition and system factors)
    factors_floor: bool = False  # their product is below 0.85, and 0.85 is taken


@dataclass(frozen=True)
class PathRow:
    """A member's lowest rating found on the load path, with what checks it by hand: the
    factored resistance C in the sense rated, the factored dead-load force D and the LL + IM
    L (gamma_LL = 1) in that sense with the tension-only members as they stand at the rating
    level (which are slack), gamma_LL and RF = (C - D) / (gamma_LL L)."""

    id: str
    vehicle: str
    sense: str
    capacity: str
    dead: str
    gamma_dead: str  # "gamma_DC / gamma_DW" of D
    live: str
    gamma_ll: str
    rf: Cell
    slack: str
    controls: str = ""  # the vehicle whose posting this rating sets ("" for none)
    both_act: str = ""  # crossing tension-only members both acting in this state: D and L
    # come from the stiffness of the truss, not from a section cut


@dataclass(frozen=True)
class LiveRow:
    """One member's row of a live-load table. ``cells``: for each vehicle, LL+IM max and min
    and the RF as HTML table cells (the largest table of the report: its cells, numbers and
    band keys only, are built here rather than one by one in the template)."""

    id: str
    cells: Markup


@dataclass(frozen=True)
class LiveTable:
    """One live-load table of the report: a few vehicles (its columns) and one row per member
    with LL+IM max and min and the RF of each vehicle."""

    vehicles: tuple[VehicleResult, ...]
    rows: tuple[LiveRow, ...]


@dataclass(frozen=True)
class PackingChunk:
    """Up to 12 plates of a pin's packing table: the cells of each of its rows as HTML."""

    order: Markup
    member: Markup
    thickness: Markup
    gap: Markup
    force_h: Markup = Markup("")  # the plates' forces on the pin at the rating load
    force_v: Markup = Markup("")


@dataclass(frozen=True)
class PinView:
    """One pin's block: its lowest rating, packing drawing and packing table (its rating
    factors by vehicle are in the pin tables)."""

    joint: str
    diameter: str
    governing_section: str
    lowest: Cell
    drawing: Markup
    warnings: tuple[str, ...]
    lowest_vehicle: str = ""
    lowest_check: str = ""
    packing_chunks: tuple[PackingChunk, ...] = ()
    mid_pin: str = ""  # the force from outside the bars at mid-pin, in words ("" if none)


@dataclass(frozen=True)
class PinRow:
    """A pin's row of the table of rating factors by vehicle; ``cells``: the pin and its RF
    cells as HTML."""

    joint: str
    cells: Markup


@dataclass(frozen=True)
class PinTable:
    """One table of pin rating factors: a few vehicles (its columns) and one row per pin."""

    vehicles: tuple[VehicleResult, ...]
    rows: tuple[PinRow, ...]


@dataclass(frozen=True)
class InfluenceView:
    """The influence-line figure of one controlling member: the critical vehicle, the vehicles
    it controls, RF, check, critical position, lane load, drawing and a note."""

    member: str
    role: str
    vehicle: str
    controls: str
    rf: Cell
    check: str
    position: str
    lane: str
    drawing: Markup
    note: str = ""


@dataclass(frozen=True)
class PinControlNote:
    """A pin that controls one or more vehicles, noted in place of an influence-line figure: its
    joint, the vehicles and its RF."""

    pin: str
    controls: str
    rf: Cell


@dataclass(frozen=True)
class FindingRow:
    """One inspection finding in the report's findings table, formatted in the report's units,
    with its workbook place."""

    member: str
    component: str
    region: str
    station: str
    remaining: str
    loss: str
    bar_state: str
    condition: str
    photo: str
    note: str
    where: str


@dataclass(frozen=True)
class VehicleRow:
    """One rating case in the report's vehicle table, formatted: category, level, weight, axle
    loads and spacings, lane load, gamma_LL, IM, source and tag."""

    id: str
    name: str
    category: str
    level: str
    weight: str
    axles: str
    spacings: str
    lane: str
    gamma_ll: str
    im: str
    source: str
    tag: str


@dataclass(frozen=True)
class SectionRow:
    """A member's governing section in the appendix; ``cells``: the member, A_g, A_n, F_y,
    F_u, length, K and KL/r as HTML table cells."""

    id: str
    cells: Markup


@dataclass(frozen=True)
class CheckRow:
    """One resistance check in the appendix; ``cells``: the member, check, sense, phi, R_n,
    factored resistance, provision, location and finding as HTML table cells (escaped);
    ``worked``: the quantities of a check worked back from an interaction, for a row of its
    own across the table ("" for none)."""

    member: str
    cells: Markup
    worked: Markup = Markup("")


@dataclass(frozen=True)
class Assumption:
    """One assumption listed in the report; ``from_memory`` marks a value from memory, to be
    confirmed against the owner's edition."""

    text: str
    from_memory: bool


@dataclass(frozen=True)
class Fact:
    """A labelled value shown in the report (bridge and method facts, lateral distribution)."""

    label: str
    value: str


@dataclass(frozen=True)
class Units:
    """The unit names of the report's numbers by dimension (kip or kN, ft or m, in or mm, ...)."""

    force: str
    length: str
    dimension: str
    area: str
    stress: str
    weight: str
    line_load: str


@dataclass(frozen=True)
class ReportView:
    """Everything the report template shows, formatted for display; built by :func:`build_view`
    from the results."""

    title: str
    bridge_facts: tuple[Fact, ...]
    method_facts: tuple[Fact, ...]
    units: Units
    system: str
    summary: tuple[SummaryRow, ...]
    recommendation: str
    worst_action: str
    elevation: Markup
    legend: Markup
    influence: tuple[InfluenceView, ...]
    pin_controls: tuple[PinControlNote, ...]
    members: tuple[MemberRow, ...]
    path_rows: tuple[PathRow, ...]
    every_path_row: tuple[PathRow, ...]
    live_tables: tuple[LiveTable, ...]
    pins: tuple[PinView, ...]
    findings: tuple[FindingRow, ...]
    vehicles: tuple[VehicleRow, ...]
    assumptions: tuple[Assumption, ...]
    distribution: tuple[Fact, ...]
    warnings: tuple[str, ...]
    sections: tuple[SectionRow, ...]
    checks: tuple[CheckRow, ...]
    has_dash: bool
    paper: str
    paper_note: str
    generator: str
    schema_version: str
    source_file: str
    footer: str
    band_labels: tuple[svg.Band, ...] = field(default=())
    has_neg_inf: bool = False
    pin_tables: tuple[PinTable, ...] = ()
    decision_warnings: tuple[str, ...] = ()  # repeated in the recommendation box
    has_permits: bool = False  # a permit load was rated: the review block has its line
    since: SinceView | None = None  # compared with the previous rating (rating.previous)
    verify: tuple[str, ...] = ()  # provisions named beside a value recalled from memory
    recommendation_parts: tuple[str, ...] = ()  # the recommendation in paragraphs
    # (:func:`paragraphs`): its lead, then the alternatives, the emergency vehicles, the
    # permits
    verify_vehicles: tuple[str, ...] = ()  # vehicles whose axles are recalled from memory


# ------------------------------------------------------------------ helpers

def _pin_key(element: str) -> str:
    """The joint of a pin named "pin L2", "pin at L2" or "L2"."""
    m = re.match(r"^\s*pin\s+(?:at\s+)?(\S+)\s*$", element, re.IGNORECASE)
    return m.group(1) if m else element.strip()


def controls(results: RatingResults) -> tuple[Control, ...]:
    """The controlling member or pin of each vehicle: the posting entry's when given, else
    the lowest RF over members and pins."""
    members = {m.id: m for m in results.members}
    pins = {p.joint: p for p in results.pins}
    out: list[Control] = []
    for v in results.vehicles:
        entry = results.posting.get(v.id)
        element, kind, rating = "", "", None
        if entry is not None and entry.member:
            element = entry.member
            if element in members:
                kind, rating = "member", members[element].ratings.get(v.id)
            elif _pin_key(element) in pins:
                kind = "pin"
                rating = pins[_pin_key(element)].ratings.get(v.id)
        else:
            best: tuple[float, str, str, Rating] | None = None
            for m in results.members:
                r = m.ratings.get(v.id)
                if r is not None and not math.isnan(r.rf) and (best is None or r.rf < best[0]):
                    best = (r.rf, m.id, "member", r)
            for p in results.pins:
                r = p.ratings.get(v.id)
                if r is not None and not math.isnan(r.rf) and (best is None or r.rf < best[0]):
                    best = (r.rf, f"pin {p.joint}", "pin", r)
            if best is not None:
                _, element, kind, rating = best
        out.append(Control(v, element, kind, rating, entry))
    return tuple(out)


def _cell(d: Display, bands: svg.RFBands, rf: float | None) -> Cell:
    # build_view remembers each cell: the text need not be remembered by Display too
    return Cell(d.rf_text(rf), bands.key(rf))


def _id_cell(text: str) -> str:
    """HTML of the first cell of a row, an element's id (escaped)."""
    return f'<td class="id">{esc(text)}</td>'


def _num_cells(texts: Iterable[str]) -> str:
    """HTML of table cells of numbers (or other text, escaped), as the template wrote them."""
    return "".join([f'<td class="num">{esc(t)}</td>' for t in texts])


def _rf_cells(cells: Iterable[Cell]) -> str:
    """HTML of RF table cells shaded by band (numbers and band keys only: nothing to
    escape)."""
    return "".join([f'<td class="rf {c.band}">{c.text}</td>' for c in cells])


def _crossing_tension_only(results: RatingResults) -> list[tuple[str, str]]:
    """The pairs of tension-only members that cross in a panel (a counter and its main), from
    the joints' coordinates."""
    at = {j.id: (j.x, j.y) for j in results.joints}
    t_only = [m for m in results.members if m.tension_only]
    return [(a.id, b.id) for k, a in enumerate(t_only) for b in t_only[k + 1:]
            if not set(a.joints) & set(b.joints)
            and svg.segments_cross(at[a.joints[0]], at[a.joints[1]],
                                   at[b.joints[0]], at[b.joints[1]])]


def _capitalized(text: str) -> str:
    """The text with its first letter in capitals ("parker through truss" -> "Parker ...")."""
    return text[:1].upper() + text[1:]


_WORKED_OUT = "with own-weight bending"
"""The checks whose quantities the appendix prints under their name: their R_n is worked
back from an interaction (rating.capacity.own_weight), not read from one formula; the
others' quantities are in the results file (``detail``) and mostly in the sections table."""

_OWN_LENGTH = "(U-frames)"
"""In a check's quantities: a length out of plane found apart (a pony truss's chord on its
U-frames, rating.lrfr.uframes), which the sections table's K and length do not give; the
appendix prints those quantities too."""


def _worked(name: str, detail: str) -> bool:
    """Whether the appendix prints a check's quantities under it."""
    return bool(detail) and (name.endswith(_WORKED_OUT) or _OWN_LENGTH in detail)


def _vehicle_label(v: VehicleResult | None, vid: str) -> str:
    return v.name if v is not None and v.name else vid


def _position_text(p: Position | None, d: Display) -> str:
    if p is None:
        return "position not reported"
    way = ("toward increasing station" if p.direction != "reverse"
           else "toward decreasing station")
    text = (f"front axle at {d.length(p.front_axle_station)} {d.unit('length')}, "
            f"travelling {way}")
    if p.spacings:
        text += f"; axle spacings {d.series(p.spacings, 'length')} {d.unit('length')}"
    if p.load_model:
        text += f"; load model: {p.load_model}"
    return text


def _position_for(member: MemberResult, vid: str, rating: Rating | None) -> Position | None:
    if rating is not None and rating.position is not None:
        return rating.position
    ll = member.live_load.get(vid)
    if ll is None:
        return None
    if rating is not None and rating.sense == "compression":
        return ll.min_position or ll.max_position
    return ll.max_position or ll.min_position


def _fmt_plain(value: Any) -> str:
    if isinstance(value, bool):
        return "yes" if value else "no"
    if isinstance(value, float):
        return DASH if not math.isfinite(value) else f"{value:.3g}"
    if isinstance(value, Mapping):
        return "; ".join(f"{k}: {_fmt_plain(v)}" for k, v in value.items())
    if isinstance(value, list | tuple):
        return ", ".join(_fmt_plain(v) for v in value)
    return DASH if value is None else str(value)


def _dedupe(items: Sequence[str]) -> tuple[str, ...]:
    seen: dict[str, None] = {}
    for it in items:
        seen.setdefault(it, None)
    return tuple(seen)


def _named_parts(line: str) -> list[tuple[str, str, str]]:
    """(kind, "X", text) for each member or pin named by a "member X: text", "members X, Y:
    text", "pin at joint X: text" or "pins at joints X, Y: text" line (as
    rating.results_build.group_member_notes writes them); an empty list for other lines."""
    head, sep, rest = line.partition(": ")
    for word, kind in (("member ", "member"), ("members ", "member"),
                       ("pin at joint ", "pin"), ("pins at joints ", "pin")):
        if sep and head.startswith(word):
            return [(kind, name, rest) for name in head[len(word):].split(", ")]
    return []


def _with_own_warnings(general: Sequence[str], own: Sequence[str]) -> tuple[str, ...]:
    """The results' warnings, then each member's or pin's own warning that they do not
    already say (a warning shared by several members is there once as "members X, Y:
    text"), each line once."""
    said = {part for line in general for part in _named_parts(line)}
    extra = [w for w in own
             if not (parts := _named_parts(w)) or not all(pt in said for pt in parts)]
    return _dedupe([*general, *extra])


PAPERS = {"letter": ("letter", "Letter (8.5 \u00d7 11 in)"), "a4": ("A4", "A4 (210 \u00d7 297 mm)")}


def paper_for(system: str, paper: str | None) -> str:
    """The paper asked for: ``letter``, ``a4`` or ``auto`` (left to the print dialog);
    ``None`` picks Letter for US customary units and A4 for SI."""
    if paper is None:
        return "a4" if system == "SI" else "letter"
    return paper.strip().lower()


# ------------------------------------------------------------------ the view

def build_view(results: RatingResults, *, paper: str | None = None,
               bands: svg.RFBands | None = None, vehicles_per_table: int = 4) -> ReportView:
    """Everything the template shows, formatted."""
    from rating.report.display import display_for

    d = display_for(results)
    bands = bands or svg.RFBands()
    b = results.bridge
    vmap = {v.id: v for v in results.vehicles}
    units = Units(d.unit("force"), d.unit("length"), d.unit("dimension"), d.unit("area"),
                  d.unit("stress"), d.unit("weight"), d.unit("line load"))
    has_dash = False
    has_neg_inf = False
    rf_cells: dict[float | None, Cell] = {}  # one per RF shown (they repeat in the tables)

    def rf_cell(rf: float | None) -> Cell:
        nonlocal has_dash, has_neg_inf
        c = rf_cells.get(rf)
        if c is None:  # the flags follow from the text: set once per cell
            c = rf_cells[rf] = _cell(d, bands, rf)
            has_dash = has_dash or c.text == DASH
            has_neg_inf = has_neg_inf or c.text == NEG_INF
        return c

    bridge_facts = tuple(Fact(k, v) for k, v in (
        ("Structure", b.id),
        ("Bridge", b.name),
        ("Location", b.location),
        ("Owner", b.owner),
        ("Year built", str(b.year_built) if b.year_built else ""),
        ("Truss", _capitalized(" ".join(
            x for x in (b.form, b.deck_position and f"{b.deck_position} truss") if x))),
        ("Span", f"{d.field(b, 'span')} {units.length}, {b.panel_count} panels"
         if b.panel_count else f"{d.field(b, 'span')} {units.length}"),
        ("Truss spacing / roadway", f"{d.field(b, 'truss_spacing')} / "
         f"{d.field(b, 'roadway_width')} {units.length}"),
        ("Inspection", ", ".join(x for x in (b.inspection_date or "", b.inspector) if x)),
    ) if v)
    method_facts = tuple(Fact(k, v) for k, v in (
        ("Method", results.method),
        ("Provision set", results.provision_set),
        ("Units", "SI" if d.system == "SI" else "US customary"),
        ("Workbook", b.source_file),
        ("Made with", results.generator),  # (which program and version made these numbers)
    ) if v)

    ctl = controls(results)
    summary: list[SummaryRow] = []
    for c in ctl:
        v = c.vehicle
        entry = c.entry
        rf = c.rf
        rt = entry.rating_tons if entry is not None else (
            reported_rf(rf) * v.gross_weight if rf is not None and math.isfinite(rf) else None)
        action_key = entry.action if entry is not None else ""
        action = action_text(entry, v.rating_level, d, v.category)
        posting = DASH
        if entry is not None and entry.action == "post" and entry.posting_tons is not None:
            posting = f"{d.posting(entry.posting_tons)} {units.weight}"
        note = entry.note if entry is not None else ""
        if v.rating_level in ("inventory", "operating") and action_key == "none":
            note = "" if "design" in note.lower() else note
        summary.append(SummaryRow(
            vehicle=_vehicle_label(v, v.id), vehicle_id=v.id,
            level=level_text(v),
            weight=d.field(v, "gross_weight"), element=c.element or DASH,
            check=(c.rating.check if c.rating is not None else ""),
            rf=rf_cell(rf), rating_tons=d.weight(rt), action=action, action_key=action_key,
            posting=posting, note=note,
            alike=", ".join(entry.alike) if entry is not None else "",
            finding=c.rating.finding if c.rating is not None else ""))
    worst = overall_action((c.entry.action, c.vehicle.category) for c in ctl
                           if c.entry is not None)
    if results.recommendation.startswith(CLOSING_UNLESS):
        worst = "close"  # (the box leads with the closure: it is shaded as one)

    # influence lines of the controlling members (one figure per member, critical vehicle)
    members = {m.id: m for m in results.members}
    lines = {il.member: il for il in results.influence_lines}
    deck = tuple(sorted(j.x for j in results.joints if j.deck))
    by_element: dict[str, list[Control]] = {}
    for c in ctl:
        if c.element and c.kind in ("member", "pin"):
            by_element.setdefault(c.element, []).append(c)
    influence: list[InfluenceView] = []
    pin_notes: list[PinControlNote] = []
    for element, cs in by_element.items():
        finite = [c for c in cs if c.rf is not None and not math.isnan(c.rf)]
        crit = min(finite, key=lambda c: c.rf or 0.0) if finite else cs[0]
        names = ", ".join(_vehicle_label(c.vehicle, c.vehicle.id) for c in cs)
        if crit.kind == "pin":
            pin_notes.append(PinControlNote(_pin_key(element), names, rf_cell(crit.rf)))
            continue
        m = members[element]
        line = lines.get(element)
        pos = _position_for(m, crit.vehicle.id, crit.rating)
        if line is None:
            drawing = Markup("")
        else:
            drawing = svg.influence_svg(line, pos, crit.vehicle, d, deck_stations=deck)
        lane = ""
        if pos is not None and pos.lane_segments and crit.vehicle.lane_load:
            lane = (f"lane load {d.field(crit.vehicle, 'lane_load')} {units.line_load} on "
                    + ", ".join(f"{d.length(a)}\u2013{d.length(b_)}"
                                for a, b_ in pos.lane_segments) + f" {units.length}")
        note = ""
        if crit.rating is not None and crit.rating.method == "load multiplier":
            note = ("This member is rated by the load multiplier on the exact load path "
                    "(tension-only members change which diagonals act as the load grows), so "
                    "its force is not the linear line drawn")
            if line is not None and not any(abs(o) > 1e-9 for o in line.ordinates):
                note += ": the line is zero because the member is slack in the truss as drawn"
            note += "; the vehicle is shown where it governs."
        elif (crit.rating is not None and crit.rating.sense == "compression"
              and m.tension_only):
            note = ("The vehicle reverses this tension-only member: it would have to push, "
                    "which its bars cannot, and no counter in its panel takes over. The rating "
                    "factor is the live-load level at which its (minimum-factored) dead-load "
                    "tension is used up.")
        influence.append(InfluenceView(
            member=element, role=m.role, vehicle=_vehicle_label(crit.vehicle, crit.vehicle.id),
            controls=names, rf=rf_cell(crit.rf),
            check=crit.rating.check if crit.rating else "", position=_position_text(pos, d),
            lane=lane, drawing=drawing, note=note))

    # member table; the ratings on the load path: each member's lowest, and each that sets a
    # posting (a reviewer checks the postings from these)
    rows: list[MemberRow] = []
    path_rows: list[PathRow] = []
    sets_posting = {(e.member, vid) for vid, e in results.posting.items()
                    if vmap.get(vid) is not None and vmap[vid].rating_level == "legal"
                    and e.action in ("post", "close")}
    # (a member out of service is left out of the analysis: it acts in no state)
    gone = {m.id for m in results.members if m.ratings and all(
        r.check.startswith("out of service") for r in m.ratings.values())}
    crossing = [(a, b) for a, b in _crossing_tension_only(results)
                if a not in gone and b not in gone]
    every_path_row: list[PathRow] = []  # every rating on the load path (the appendix)

    def path_row(m: MemberResult, vid: str) -> PathRow | None:
        r_ = m.ratings[vid]
        if r_.dead_at_rating is None or r_.live_at_rating is None or m.resistance is None:
            return None
        cap = (m.resistance.tension if r_.sense == "tension" else m.resistance.compression)
        f_ = r_.factors
        acting = [f"{a}, {b}" for a, b in crossing
                  if a not in r_.slack_at_rating and b not in r_.slack_at_rating]
        return PathRow(
            id=m.id, vehicle=vid, sense=r_.sense, capacity=d.force(cap),
            dead=d.force(r_.dead_at_rating, signed=True),
            gamma_dead=(f"{d.number(f_.gamma_dc, None, 2)} / {d.number(f_.gamma_dw, None, 2)}"
                        if f_ else DASH),
            live=d.force(r_.live_at_rating),
            gamma_ll=d.number(f_.gamma_ll, None, 2) if f_ else DASH,
            rf=rf_cell(r_.rf), slack=", ".join(r_.slack_at_rating) or "none",
            controls=vid if (m.id, vid) in sets_posting else "",
            both_act="; ".join(acting))

    for m in results.members:
        low = svg.lowest_rating(m.ratings.items())
        every = {vid: path_row(m, vid) for vid in m.ratings}
        every_path_row += [r for r in every.values() if r is not None]
        wanted = ([low[0]] if low is not None else []) + [
            vid for vid in m.ratings if (m.id, vid) in sets_posting
            and (low is None or vid != low[0])]
        path_rows += [r for vid in wanted if (r := every[vid]) is not None]
        rt_ = m.resistance.tension if m.resistance else None
        rc_ = m.resistance.compression if m.resistance else None
        finding = ""
        if low is not None:
            finding = low[1].finding
        rows.append(MemberRow(
            id=m.id, role=m.role, tension_only=m.tension_only,
            length=d.field(m.section, "length") if m.section else DASH,
            dc=d.force(m.dead_load.get("DC"), signed=True),
            dw=d.force(m.dead_load.get("DW"), signed=True),
            # (a tension-only member has no compression resistance: a dash, not 0.0)
            phi_rt=d.force(rt_),
            phi_rc=DASH if m.tension_only and not rc_ else d.force(rc_),
            rf=rf_cell(low[1].rf if low else None),
            vehicle=low[0] if low else "not rated",
            check=(low[1].check if low and low[1].check.startswith(low[1].sense)
                   else f"{low[1].sense}: {low[1].check}" if low and low[1].check
                   else (low[1].sense if low else "")),
            method=low[1].method if low else "",
            finding=finding,
            factors=(f"{d.number(low[1].factors.phi_c, None, 2)} \u00d7 "
                     f"{d.number(low[1].factors.phi_s, None, 2)}"
                     if low and low[1].factors else DASH),
            # (their product below 0.85: 0.85 is taken, MBE 6A.4.2.1, Eq. 6A.4.2.1-3)
            factors_floor=bool(low and low[1].factors
                               and low[1].factors.phi_c * low[1].factors.phi_s < 0.85 - 1e-9)))

    # live load and RF per vehicle, in tables of a few vehicles each
    live_tables: list[LiveTable] = []
    vs = results.vehicles
    step = max(1, vehicles_per_table)
    force = d.formatter("force", signed=True)
    for k in range(0, len(vs), step):
        chunk = tuple(vs[k:k + step])
        lrows = []
        for m in results.members:
            cells = []
            live_of, rating_of = m.live_load.get, m.ratings.get
            for v in chunk:
                ll = live_of(v.id)
                r = rating_of(v.id)
                hi = force(ll.max_with_im) if ll else DASH
                lo = force(ll.min_with_im) if ll else DASH
                rf = rf_cell(r.rf if r else None)
                # (a rating on the load path: its forces are those of the truss at the
                # rating level, in the appendix, not the envelope beside it)
                on_path = "*" if r is not None and r.dead_at_rating is not None else ""
                # numbers and band keys only, as Display and RFBands write them: nothing
                # to escape
                cells.append(f'<td class="num">{hi}</td><td class="num">{lo}</td>'
                             f'<td class="rf {rf.band}">{rf.text}{on_path}</td>')
            lrows.append(LiveRow(m.id, Markup("".join(cells))))
        live_tables.append(LiveTable(chunk, tuple(lrows)))

    pins = tuple(_pin_view(p, d, bands, vmap, rf_cell) for p in results.pins)
    pin_tables: list[PinTable] = []
    step_p = max(1, 2 * vehicles_per_table)
    for k in range(0, len(vs) if results.pins else 0, step_p):
        chunk = tuple(vs[k:k + step_p])
        prow = tuple(PinRow(p.joint, Markup(_id_cell(p.joint) + _rf_cells(
            rf_cell(p.ratings[v.id].rf if v.id in p.ratings else None) for v in chunk)))
            for p in results.pins)
        pin_tables.append(PinTable(chunk, prow))

    findings = tuple(FindingRow(
        member=f.member, component=f.component, region=f.region,
        station=d.field(f, "station"),
        remaining=d.field(f, "remaining_thickness") + (
            " estimated" if f.estimated and f.percent_loss is None
            and f.remaining_thickness is not None else ""),
        loss=DASH if f.percent_loss is None else f"{f.percent_loss:g}%" + (
            " estimated" if f.estimated else ""),
        bar_state=f.bar_state, condition=DASH if f.condition_rating is None
        else str(f.condition_rating), photo=f.photo, note=f.note, where=f.where)
        for f in results.findings)

    vehicles = tuple(VehicleRow(
        id=v.id, name=v.name, category=v.category,
        level=level_text(v),
        weight=d.field(v, "gross_weight"), axles=d.series(v.axle_loads, "force"),
        spacings=" / ".join(d.length(a) if math.isclose(a, b_) else
                            f"{d.length(a)}\u2013{d.length(b_)}" for a, b_ in v.spacings),
        lane=d.field(v, "lane_load") if v.lane_load else DASH,
        gamma_ll=f"{v.gamma_ll:.2f}" if v.gamma_ll else DASH,
        im=f"{v.im * 100:.0f}%" if v.im else DASH, source=v.source,
        tag=TAG_TEXT.get(v.tag, v.tag)) for v in vs)

    assumptions = [Assumption(a, _from_memory(a)) for a in results.assumptions]
    for v in vs:
        if v.tag == "M":
            assumptions.append(Assumption(
                f"Vehicle {v.name or v.id}: axle loads and spacings ({v.source or 'no source'}"
                "), value from memory.", True))

    warnings = _with_own_warnings(results.warnings, [
        *(w for m in results.members for w in m.warnings),
        *(w for p in results.pins for w in p.warnings)])

    # the appendix's tables, the longest of the report, as HTML cells (a cell at a time in
    # the template cost as much as the rest of the report's text)
    sections = tuple(SectionRow(m.id, Markup(_id_cell(m.id) + _num_cells((
        d.field(m.section, "A_g"), d.field(m.section, "A_n"),
        d.field(m.section, "F_y"), d.field(m.section, "F_u"), d.field(m.section, "length"),
        DASH if m.section.K is None else f"{m.section.K:.3f}",
        DASH if m.section.KL_r is None else f"{m.section.KL_r:.1f}"))))
        for m in results.members if m.section is not None)
    checks = tuple(CheckRow(m.id, Markup(
        f'<td class="id">{esc(m.id)}</td><td>{esc(c.name)}</td><td>{esc(c.sense)}</td>'
        f'<td class="num">{esc(f"{c.phi:.2f}")}</td><td class="num">{esc(d.field(c, "R_n"))}'
        f'</td><td class="num">{esc(d.field(c, "factored"))}</td><td>{esc(c.provision)}</td>'
        f"<td>{breakable(c.location)}</td><td>{breakable(c.finding)}</td>"),
        breakable(c.detail) if _worked(c.name, c.detail) else Markup(""))
        for m in results.members if m.resistance for c in m.resistance.checks)

    p = paper_for(d.system, paper)
    if p == "auto":
        paper_note = ("The page size is left to the print dialog; the layout fits both "
                      "Letter and A4.")
    else:
        other = "a4" if p == "letter" else "letter"
        paper_note = (
            f"This report asks the printer for {PAPERS[p][1]}: "
            + ("US customary units print on Letter, SI units on A4. "
               if paper is None else "chosen when the report was made. ")
            + f"The layout fits both sizes. For {PAPERS[other][1]} paper, make the report "
            f"with paper size \u201c{other}\u201d (or \u201cauto\u201d to choose in the "
            "print dialog), or print this one scaled to fit the page.")
    footer = f"{b.id} {b.name}".strip() + " \u2014 load rating for review by the licensed " \
        "engineer in responsible charge"
    return ReportView(
        has_permits=any(v.rating_level == "permit" for v in results.vehicles),
        title=f"Load rating report \u2014 {b.name or b.id}",
        bridge_facts=bridge_facts, method_facts=method_facts, units=units, system=d.system,
        summary=tuple(summary),
        # the box's own paragraph says the decision is the engineer's, in more words
        recommendation=results.recommendation.removesuffix(DECISION_NOTE),
        worst_action=worst,
        elevation=svg.elevation_svg(results, d, bands), legend=svg.legend_svg(bands),
        influence=tuple(influence), pin_controls=tuple(pin_notes), members=tuple(rows),
        path_rows=tuple(path_rows), every_path_row=tuple(every_path_row),
        live_tables=tuple(live_tables), pins=pins, findings=findings, vehicles=vehicles,
        assumptions=tuple(assumptions),
        distribution=tuple(Fact(str(k), _fmt_plain(v)) for k, v in results.distribution.items()),
        warnings=warnings, sections=sections, checks=checks, has_dash=has_dash, paper=p,
        paper_note=paper_note, generator=results.generator,
        schema_version=results.schema_version, source_file=b.source_file, footer=footer,
        band_labels=bands.bands, has_neg_inf=has_neg_inf, pin_tables=tuple(pin_tables),
        decision_warnings=results.decision_warnings,
        recommendation_parts=paragraphs(results.recommendation.removesuffix(DECISION_NOTE)),
        verify=to_verify([*results.assumptions, *results.warnings, results.recommendation,
                          *{c.provision for m in results.members if m.resistance
                            for c in m.resistance.checks}]),
        verify_vehicles=tuple(v.id for v in results.vehicles if _from_memory(v.tag)),
        since=since_view(results, d, rf_cell, lambda vid: action_text(
            results.posting.get(vid), vmap[vid].rating_level, d, vmap[vid].category)))


_PARAGRAPH = re.compile(r"(?<=\.) (?=If |Until |Each condition |Permit loads )")
"""Where the recommendation's sentences start a new part: what applies until a condition is
confirmed, the outcome once it is, the permits. (The emergency vehicles' words stay with the
outcome they belong to.)"""


def paragraphs(text: str) -> tuple[str, ...]:
    """The recommendation in parts for the box (a reader found one bold block of twenty
    lines): its lead, then what applies until each condition is confirmed, the outcome once
    it is, and the permits; the same words, joined by spaces they read as before."""
    return tuple(_PARAGRAPH.split(text)) if text else ()


_PROVISION = re.compile(
    r"\b(?:(MBE|AASHTO LRFD)\s+((?:Tables?|Eqs?\.|Article)\s+)?(\d[\w.]*(?:-\d+\w*)?)"
    r"|(AISC 360-\d+)\s+([A-K]\d[\w.]*(?:\([a-z]\))?))")
"""A provision named in a text: "MBE Table 6A.4.2.2-1", "AASHTO LRFD 6.9.4.1.1", "AISC
360-10 E7.1(c)"."""

_MEMORY_MARK = re.compile(r"from memory|\[M\]|\(M\)")


def to_verify(texts: Iterable[str]) -> tuple[str, ...]:
    """The provisions named in ``texts`` (the assumptions, the warnings, the checks'
    provisions, the recommendation) whose value is marked recalled from memory: each
    reference with a mark before the next reference, once each, in article order. The list
    the signing engineer checks against the owner's editions (a reader's finding: the marks
    were scattered through a report of sixty pages)."""
    found = set()
    for text in texts:
        refs = list(_PROVISION.finditer(text))
        for k, m in enumerate(refs):
            end = refs[k + 1].start() if k + 1 < len(refs) else len(text)
            if _MEMORY_MARK.search(text, m.end(), end):
                name = (f"{m.group(1)} {m.group(2) or ''}{m.group(3)}" if m.group(1)
                        else f"{m.group(4)} {m.group(5)}")
                found.add(name.rstrip("."))
    return tuple(sorted(found, key=lambda t: [int(x) if x.isdigit() else x
                                              for x in re.split(r"(\d+)", t)]))


def _from_memory(text: str) -> bool:
    t = text.lower()
    return "from memory" in t or "[m]" in t or "(m)" in t


def _packing_text(d: Display, value: float) -> str:
    """A plate's thickness or gap: inches to three places, or four where the fourth is not
    zero (plates and gaps are sixteenths: 0.0625 and 0.6875 are echoed as recorded, not as
    0.062 and 0.688); millimetres to one place."""
    if d.system != "US":
        return d.number(value, "dimension")
    text = d.number(value, "dimension", 4)
    return text[:-1] if text[-1:] == "0" and text[-5:-4] == "." else text


def _pin_view(p: PinResult, d: Display, bands: svg.RFBands, vmap: Mapping[str, VehicleResult],
              rf_cell: Any) -> PinView:
    low = svg.lowest_rating(p.ratings.items())
    rows = p.packing
    orders = [str(k + 1) for k in range(len(rows))]
    names = [r.member or "filler" for r in rows]
    thick = [_packing_text(d, r.thickness) for r in rows]
    gaps = [_packing_text(d, r.gap_before) for r in rows]
    # a last, shorter row of plates is padded to the width of the others (one table: the
    # columns line up)
    width = 12 if len(rows) > 12 else len(rows)
    lines = [orders, names, thick, gaps]
    if len(p.plate_forces) == len(rows) and rows:
        # (signed: a reviewer sums them to the moments and shears printed)
        lines += [[d.number(fh + 0.0, "force", 1, signed=True) for fh, _ in p.plate_forces],
                  [d.number(fv + 0.0, "force", 1, signed=True) for _, fv in p.plate_forces]]
    chunks = tuple(PackingChunk(*(Markup(_num_cells(
        [*texts[k:k + 12], *[""] * (width - len(texts[k:k + 12]))]))
        for texts in lines))
        for k in range(0, len(rows), 12))
    return PinView(p.joint, d.field(p, "diameter"), p.governing_section,
                   rf_cell(low[1].rf if low else None), svg.packing_svg(p, d), p.warnings,
                   lowest_vehicle=_vehicle_label(vmap.get(low[0]), low[0]) if low else "",
                   lowest_check=low[1].check if low else "", packing_chunks=chunks,
                   mid_pin=_mid_pin_text(p, d))


def _mid_pin_text(p: PinResult, d: Display) -> str:
    h, v = p.mid_pin_force
    if not (h or v) or not p.plate_forces:
        return ""
    unit = d.unit("force")
    return (f"{d.number(h + 0.0, 'force', 1, signed=True)} {unit} horizontal and "
            f"{d.number(v + 0.0, 'force', 1, signed=True)} {unit} vertical")
