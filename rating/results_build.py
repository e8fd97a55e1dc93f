"""Assemble the one results object from the rating engine's outputs (no new engineering)."""

from __future__ import annotations

import math
from collections.abc import Mapping
from dataclasses import replace
from itertools import accumulate
from typing import NamedTuple

from rating import __version__
from rating.analysis.moving import Direction, Extreme
from rating.capacity.pins import PHI_B, PinCheck, PlateLoad
from rating.lrfr.engine import (
    CARRIED,
    NOT_OVER_RESTRICTED,
    SCREENING_LOADS,
    SHVS,
    BridgeRating,
    CasePosting,
    MemberCaseRating,
    RatingCase,
    WithoutMember,
    permit_conditions,
    trucks_verdict,
)
from rating.lrfr.factors import RatingLevel, dead_load_factors, factored_dw, provisions
from rating.lrfr.posting import PostingAction, least_posting_load
from rating.lrfr.posting import posting as legal_load_posting
from rating.lrfr.reported import reported_rf
from rating.model import Finding, RodSet, UnitSystem, VehicleCategory
from rating.results import (
    CLOSING_UNLESS,
    DECISION_NOTE,
    SCHEMA_VERSION,
    UNTIL_CONFIRMED,
    BridgeSummary,
    CheckSummary,
    Factors,
    FindingEcho,
    InfluenceLineData,
    JointResult,
    LiveLoadEffect,
    MemberResult,
    PackingRow,
    PinResult,
    Position,
    PostingResultEntry,
    Rating,
    RatingResults,
    Resistance,
    SectionSummary,
    VehicleResult,
    units_block,
)
from rating.units import TON_PER_TONNE, from_core, si_text

METHOD = ("LRFR: MBE 6A.4.2.1, RF = (C \u2212 \u03b3DC DC \u2212 \u03b3DW DW) / "
          "(\u03b3LL (LL + IM)), C = \u03c6c \u03c6s \u03c6 Rn (reduced for a member's "
          "own-weight bending where that governs)")

SINGLE_UNIT = {"TYPE-3", *SHVS}
COMBINATION = {"TYPE-3S2", "TYPE-3-3", "LEGAL-LANE"}


def finding_text(f: Finding | None, rod: bool = False) -> str:
    """A finding in a few words for tables: component, where, what is left, the cell. On a
    rod (``rod``) a percent loss is of the diameter: the loss of area it means is given too."""
    if f is None:
        return ""
    parts = [f"{f.member} {f.component}", f.region.value]
    if f.station_ft is not None:
        parts.append(f"at {f.station_ft:g} ft")
    if f.remaining_thickness_in is not None:
        parts.append(f"{f.remaining_thickness_in:g} in remaining")
    if f.percent_loss is not None and rod:
        area = 100.0 * (1.0 - (1.0 - f.percent_loss / 100.0) ** 2)
        parts.append(f"{f.percent_loss:g}% loss of diameter ({area:.0f}% of area)")
    elif f.percent_loss is not None:
        parts.append(f"{f.percent_loss:g}% loss")
    if f.bar_state.value != "sound":
        parts.append(f.bar_state.value)
    text = ", ".join(parts)
    return f"{text} ({f.where})" if f.where else text


def group_member_notes(lines: list[str] | tuple[str, ...]) -> tuple[str, ...]:
    """Fold "member X: text" lines with the same text into one "members X, Y: text" line, and
    "pin at joint X: text" lines into "pins at joints X, Y: text"."""
    kinds = (("member ", "member ", "members "),
             ("pin at joint ", "pin at joint ", "pins at joints "))
    order: list[tuple[int, str]] = []
    who: dict[tuple[int, str], list[str]] = {}
    for line in lines:
        head, sep, rest = line.partition(": ")
        kind = next((k for k, (p, _, _) in enumerate(kinds)
                     if sep and head.startswith(p) and " " not in head[len(p):]), -1)
        key = (kind, rest if kind >= 0 else line)
        if key not in who:
            who[key] = []
            order.append(key)
        if kind >= 0 and head[len(kinds[kind][0]):] not in who[key]:
            who[key].append(head[len(kinds[kind][0]):])
    out = []
    for kind, text in order:
        names = who[(kind, text)]
        if kind < 0:
            out.append(text)
        else:
            _, one, many = kinds[kind]
            out.append(f"{one if len(names) == 1 else many}{', '.join(names)}: {text}")
    return tuple(out)


def _position(ext: Extreme | None, load, memo: dict | None = None) -> Position | None:
    """Where the vehicle stands for ``ext``. With ``memo`` (one dict per results object)
    extremes that stand the vehicle at the same place give the same object (an extreme
    recurs for several members' cases and rating levels, and many stand the vehicle alike):
    the views then convert and write each position once."""
    if ext is None:
        return None
    at = ext.position
    if at is None and not ext.lane_segments_ft:
        return None
    if memo is None:
        return _new_position(ext, load)
    try:
        # a VehiclePosition's fields, its direction as a bool (an enum hashes in Python)
        key = ((at.front_axle_ft, at.direction is Direction.FORWARD, at.spacings_ft)
               if at is not None else None, ext.model, ext.lane_segments_ft, load.id)
        pos = memo.get(key)
        if pos is None:
            pos = memo[key] = _new_position(ext, load, memo)
    except TypeError:  # a part that cannot be a key: an object of its own
        pos = _new_position(ext, load)
    return pos


_FORWARD = Direction.FORWARD.value  # (an enum's value is a Python property)


def _new_position(ext: Extreme, load, memo: dict | None = None) -> Position:
    lane = _lane(ext.lane_segments_ft, memo)
    at = ext.position
    axles = _axles(load, ext.model, memo)
    if at is None or axles is None:
        return Position(0.0, "", (), (), (), ext.model, lane)
    front = float(at.front_axle_ft)
    spacings, offsets = _offsets(at.spacings_ft, memo)
    # as rating.analysis.moving.axle_stations, in plain floats (the same sums, term by term)
    if at.direction is Direction.FORWARD:
        stations = tuple([front - d for d in offsets])
    else:
        stations = tuple([front + d for d in offsets])
    way = _FORWARD if at.direction is Direction.FORWARD else at.direction.value
    return Position(front, way, spacings, stations, axles, ext.model, lane)


def _axles(load, model_name: str, memo: dict | None) -> tuple[float, ...] | None:
    """The axle loads of a load's model (``None``: no such model, or no axles); one tuple per
    model with ``memo``."""
    key = ("axles", load.id, model_name)
    if memo is not None and key in memo:
        return memo[key]
    model = next((m for m in load.models if m.name == model_name), None)
    v = model.axles if model is not None else None
    out = tuple([float(p) * v.axle_scale for p in v.axle_loads_kip]) if v is not None else None
    if memo is not None:
        memo[key] = out
    return out


def _lane(segments: tuple[tuple[float, float], ...], memo: dict | None
          ) -> tuple[tuple[float, float], ...]:
    """The lane-load segments in plain floats; one tuple for equal segments with ``memo`` (the
    JSON view writes a shared tuple once)."""
    key = ("lane", segments)
    hit = memo.get(key) if memo is not None else None
    if hit is None:
        hit = tuple([(float(a), float(b)) for a, b in segments])
        if memo is not None:
            memo[key] = hit
    return hit


def _offsets(spacings_ft: tuple[float, ...], memo: dict | None
             ) -> tuple[tuple[float, ...], tuple[float, ...]]:
    """The spacings in plain floats and each axle's distance behind the front axle (as
    rating.analysis.moving.axle_offsets_ft, term by term); once per set of spacings with
    ``memo``."""
    key = ("offsets", spacings_ft)
    hit = memo.get(key) if memo is not None else None
    if hit is None:
        spacings = tuple([float(s) for s in spacings_ft])
        hit = (spacings, (0.0, *accumulate(spacings)))
        if memo is not None:
            memo[key] = hit
    return hit


def _finding(f: Finding | None, text, memo: dict | None, rod: bool = False) -> str:
    """A finding's words (in the bridge's units); written once per finding with ``memo`` (a
    member's governing finding recurs in every case)."""
    if f is None:
        return ""
    if memo is None:
        return text(finding_text(f, rod))
    key = ("finding", id(f))
    hit = memo.get(key)
    if hit is None:
        hit = memo[key] = (text(finding_text(f, rod)), f)  # f kept alive with its id
    return hit[0]


_FLOAT_ONLY = frozenset((float,))


def _path_dw_factor(rating: BridgeRating, index: int) -> Mapping[float, float]:
    """For a rating on the load path of member ``index``: the nominal gamma_DW (the key of its
    factored dead state, rating.lrfr.engine._dead_states) -> the weighted gamma_DW its DW
    took, a wearing surface of measured thickness factored apart from the rest of DW
    (rating.lrfr.factors.factored_dw), weighted by the member's own DW forces from each, so
    that gamma_DC DC + gamma_DW DW of its DC and DW is the factored dead load where the dead
    state is the linear one (a reviewer's hand check failed on the nominal 1.50, and then on
    a whole-bridge weighting). Empty where there is no such surface in the member."""
    dead = rating.dead
    dw = float(dead.member_forces_dw_kip[index])
    surf = float(dead.member_forces_dw_surface_kip[index])
    if not surf or not dw:
        return {}
    f = dead_load_factors(rating.bridge.settings.wearing_surface_measured)
    return {f["gamma_dw_max"].value: float(factored_dw(dw, surf, f, "max")) / dw}


def _factors(r: MemberCaseRating, memo: dict | None) -> Factors:
    """The factors of one rating; one object for equal factors (plain floats) with ``memo``."""
    values = (r.gamma_dc, r.gamma_dw, r.gamma_ll, r.im, r.phi, r.phi_c, r.phi_s)
    if memo is None or _FLOAT_ONLY != set(map(type, values)):
        return Factors(*values)
    key = ("factors", values)
    hit = memo.get(key)
    if hit is None:
        hit = memo[key] = Factors(*values)
    return hit


def _pin_section_text(chk: PinCheck, case_id: str, system: UnitSystem) -> str:
    """The governing pin section in words, in the bridge's units; where bearing governs, the
    plate that bears hardest first, with its force against its factored bearing resistance
    (AASHTO LRFD 6.7.6.2.2 [value from memory], rating.capacity.pins)."""
    si = system is UnitSystem.SI
    if si:
        z, M, V = (from_core(chk.governing.z_in, "mm"), from_core(chk.M_u_kip_in, "kN-m"),
                   from_core(chk.V_u_kip, "kN"))
        units = ("mm", "kN-m", "kN")
        z_text = f"{z:.0f}"
    else:
        z, M, V = chk.governing.z_in, chk.M_u_kip_in, chk.V_u_kip
        units = ("in", "kip-in", "kip")
        z_text = f"{z:.2f}"
    section = f"z = {z_text} {units[0]} from the first plate's outer face"
    forces = f"M = {M:.1f} {units[1]}, V = {V:.1f} {units[2]} ({case_id})"
    plate = _bearing_plate(chk)
    if plate is None:
        return f"flexure and shear govern at {section}: {forces}"
    t_text = (f"{from_core(plate.thickness_in, 'mm'):.1f} mm" if si
              else f"{plate.thickness_in:.3f} in")
    F, R = ((from_core(plate.F_kip, "kN"), from_core(plate.bearing_resistance_kip, "kN"))
            if si else (plate.F_kip, plate.bearing_resistance_kip))
    if abs(F - R) <= 1e-6 * R:
        F = R  # at the limit, to the root search's round-off: not printed a tenth apart
    # the F_y the resistance was worked with (the lower of pin and plate): phi_b 1.5 t D F_y
    F_y = plate.bearing_resistance_kip / (PHI_B * 1.5 * plate.thickness_in * chk.diameter_in)
    fy_text = f"{from_core(F_y, 'MPa'):.0f} MPa" if si else f"{F_y:.1f} ksi"
    return (f"bearing of item {plate.position} ({plate.member or 'filler'}, t = {t_text}) "
            f"governs: {F:.1f} {units[2]} against a factored bearing resistance of "
            f"{R:.1f} {units[2]} (phi_b 1.5 t D F_y, F_y = {fy_text}); flexure and shear at "
            f"{section}: {forces}")


def _mid_pin_force(chk: PinCheck | None) -> tuple[float, float]:
    """What balances the plates' forces where no floorbeam plate takes the force from outside
    the bars: it acts at mid-pin (rating.capacity.pins)."""
    if chk is None or not chk.plates:
        return (0.0, 0.0)
    h = -sum(pl.F_h_kip for pl in chk.plates)
    v = -sum(pl.F_v_kip for pl in chk.plates)
    scale = max(max(abs(pl.F_h_kip), abs(pl.F_v_kip)) for pl in chk.plates)
    return (h, v) if max(abs(h), abs(v)) > 1e-9 * max(scale, 1.0) else (0.0, 0.0)


def _bearing_plate(chk: PinCheck) -> PlateLoad | None:
    """The packing item whose bearing governs the pin check, or None where flexure and shear
    govern (the check's own comparison of the two utilizations)."""
    if chk.governing_plate is None or chk.utilization_bearing < chk.utilization_flexure_shear:
        return None
    return chk.governing_plate


class _ReportPosting(NamedTuple):
    """One case's posting as the report states it: the action, the safe posting load in
    whole units of the report's weight unit (None unless posted) and the note."""

    action: PostingAction
    load: float | None
    note: str


def _report_posting(cp: CasePosting, system: UnitSystem, W_tons: float) -> _ReportPosting:
    """The action, the safe posting load in whole units of the report's weight unit and the
    note of one case. An SI bridge is posted in whole tonnes by the same rule
    (rating.lrfr.posting.posting, MBE 6A.8.3) applied to W in tonnes: rounded down once, not
    tons converted and rounded again; a safe load under 3 tons (2.72 t) is a closure, as in
    tons (MBE 6A.8.1 [value from memory])."""
    res = cp.result
    if system is not UnitSystem.SI or res.action is PostingAction.NONE:
        return _ReportPosting(res.action, res.posting_tons, cp.note)
    si = legal_load_posting(cp.rf, W_tons / TON_PER_TONNE, "tonne")
    return _ReportPosting(si.action, si.posting_tons, si.reason or cp.note)


def _posting_entry(cp: CasePosting, report: _ReportPosting,
                   system: UnitSystem) -> PostingResultEntry:
    action, load, note = report
    if system is UnitSystem.SI and load is not None:
        load *= TON_PER_TONNE  # whole tonnes held in tons: the SI view shows whole tonnes
    return PostingResultEntry(rf=cp.rf, rating_tons=cp.result.rating_tons, posting_tons=load,
                              member=cp.controlling, action=action.value, note=note,
                              alike=cp.alike, permit=cp.permit)


def _rf_words(rf: float) -> str:
    """An RF in a sentence as the tables print it: two decimals, or "−∞" where no
    rating is possible (the member cannot carry its dead load, or has no resistance in the
    sense the live load acts)."""
    return "−∞" if rf == -math.inf else f"{reported_rf(rf):.2f}"


def recommendation(rating: BridgeRating, unit: str,
                   report: Mapping[str, _ReportPosting]) -> str:
    """The bridge-level recommendation (:func:`_recommendation`), made conditional where it
    rests on something that, where it does not hold, asks more of the engineer than the
    rating's own verdict (:func:`_consequence`: a closure to consider, a posting where none
    is, lower posting loads of a truck or an emergency vehicle, a permit no longer carried):
    a bent member that does not act
    (:func:`rating.lrfr.engine._without_bent`), or another condition of the rating
    (``rating.conditions``: a pony chord's hips, the steel's grade, the lacing, a loop's
    loss). What is not confirmed is taken as not holding: the recommendation leads with the
    closure a condition would give ("Consider closing the bridge unless ..."), then what
    applies until each other condition is confirmed ("Until ..., post the bridge for lower
    loads (...)"), and the rating's own outcome last ("If ... confirmed: post the bridge
    ..."); a reviewer would not sign a "post" headline with the closure, or a lower posting,
    only in a warning, nor read the higher posting first."""
    text = _recommendation(rating, unit, report)
    main = trucks_verdict(rating.postings, rating.cases)
    hinge = {m: w for m, w in rating.without.items() if _consequence(w, main)}
    vehicle_names = {c.id: c.load.name for c in rating.cases}

    def lowest(w: WithoutMember) -> str:
        return _lowest_words(w, vehicle_names, unit, report)

    others = [(c.holds, c.fails, lowest(c.result) + "; see the warning",
               _consequence(c.result, main))
              for c in rating.conditions if _consequence(c.result, main)]
    # (holds, fails, what the trucks give then, what the engineer should then consider)
    clauses: list[tuple[str, str, str, str]] = []
    # the bent members by what their not acting would call for: a clause for each (a member
    # that would only lower the postings is not joined to one that would close the bridge)
    groups: dict[str, dict[str, WithoutMember]] = {}
    for m, w in hinge.items():
        groups.setdefault(_consequence(w, main), {})[m] = w
    for consequence, group in groups.items():
        one = len(group) == 1
        names = ", ".join(w.what(m) for m, w in group.items())
        # (named where other clauses follow)
        who = names if others or len(groups) > 1 else "it" if one else "they"
        clauses.append((
            f"{names} {'is' if one else 'are'} confirmed to act (recorded bent)",
            f"{who} {'does' if one else 'do'} not act",
            "; ".join(f"without {w.what(m)}, {lowest(w)}" for m, w in group.items())
            + "; members only, see the warning", consequence))
    clauses += others
    if not clauses or text.startswith("Consider closing"):
        return text.removesuffix(DECISION_NOTE) + _permit_text(rating) + DECISION_NOTE
    holds = " and ".join(c[0] for c in clauses)
    # the permits last, after the conditions on the bridge's own posting, and on them too
    permits = _permit_text(rating, holds) + DECISION_NOTE
    # ("No load restriction is indicated for trucks: every truck ..." has its own colon)
    join = ", " if text.startswith("No load restriction") else ": "
    own = text[0].lower() + text[1:].removesuffix(DECISION_NOTE)
    closing = [c for c in clauses if c[3] == "consider closing the bridge"]
    rest = [c for c in clauses if c not in closing]
    # What is not confirmed is taken as not holding (a bent or loose bar is taken as carrying
    # no load until shown otherwise: common practice): the graver course first, a closure
    # ("Consider closing the bridge unless ..."), then what applies until each other
    # condition is confirmed ("Until ..., post the bridge for lower loads"), and the
    # rating's own outcome last, for the case every condition is confirmed (a reviewer read
    # the higher posting, printed first, as the one to sign)
    until = " ".join(f"{UNTIL_CONFIRMED}{h}, {then_do} ({then})." for h, _, then, then_do
                     in rest)
    own_case = f"If {holds}{join}" + own
    several = (" Each condition is rated on its own; where more than one of them fails, the "
               "loads may be lower still (the engineer's judgement).") if len(clauses) > 1 \
        else ""
    if closing:
        # (a bent member's words say "without it"; another condition's are said with "if")
        why = (closing[0][2] if len(closing) == 1 and closing[0][2].startswith("without ")
               else "; ".join(f"if {fails}, {then}" for _, fails, then, _ in closing))
        return (CLOSING_UNLESS + " and ".join(c[0] for c in closing) + f": {why}. "
                + (until + " " if until else "") + own_case + several + permits)
    return until + " " + own_case + several + permits


def _consequence(w: WithoutMember, main: WithoutMember | None) -> str:
    """What a sensitivity's verdict asks of the engineer where it is worse than the
    rating's own (""; where it is not): closing, a posting where none is, or lower posting
    loads (some truck or emergency vehicle posted lower than in the rating's own postings:
    ``w.lowered``), or permits no longer carried (``w.permits_lost``)."""
    if w.verdict == "a closure to consider":
        return "consider closing the bridge"
    if w.verdict == "a posting" and (main is None or main.verdict == "no restriction"):
        return "post the bridge"
    if w.lowered:  # (trucks, or emergency vehicles alone)
        return "post the bridge for lower loads"
    return "withhold the permits it would not carry" if w.permits_lost else ""


def _gravest(consequences: list[str]) -> str:
    """The gravest of several consequences (:func:`_consequence`): closing, then a posting
    where none is, then lower posting loads, then permits withheld."""
    return next(c for c in ("consider closing the bridge", "post the bridge",
                            "post the bridge for lower loads",
                            "withhold the permits it would not carry") if c in consequences)


def _lowest_words(w: WithoutMember, names: Mapping[str, str] | None = None,
                  unit: str = "ton", report: Mapping[str, _ReportPosting] | None = None
                  ) -> str:
    """A sensitivity's lowest truck RF, in words ("lowest truck RF 0.12 (SU7, U3L4)"; "no
    load path for the trucks" where there is none), and short of a closure, the trucks and
    emergency vehicles it posts lower with their posting loads beside the rating's own
    ("posted lower: AASHTO legal load Type 3 10 tons (15 as rated)") and the permits it
    would not carry."""
    if w.rf is None:
        return "no load path for the trucks"
    lower = ""
    if w.verdict != "a closure to consider":  # (a closure reaches every truck)
        def as_rated(cid: str) -> str:
            own = (report or {}).get(cid)
            return (f"{own.load:g} as rated" if own is not None and own.load is not None
                    else "not posted as rated")
        said = [f"{(names or {}).get(cid, cid)} "
                + (f"{load:g} {unit}s ({as_rated(cid)})" if load is not None
                   else "not to cross")
                for cid, load in w.lowered]
        lower = "; posted lower: " + ", ".join(said) if said else ""
        if w.permits_lost:
            lower += "; not carried: " + ", ".join((names or {}).get(cid, cid)
                                                   for cid in w.permits_lost)
    return f"lowest truck RF {reported_rf(w.rf):.2f} ({w.case}, {w.controlling}){lower}"


def _permit_text(rating: BridgeRating, condition: str = "") -> str:
    """The permits rated, each with its RF and verdict (rating.lrfr.engine.permit_verdict:
    carried by the truss members and pins under the conditions of its type; not as
    requested; not over a bridge restricted for the legal loads, MBE 6A.4.5 [value from
    memory]); ``condition``: what the bridge's own recommendation rests on, which a permit
    rests on too. A permit never posts or closes the bridge."""
    permits = [c for c in rating.cases if c.category.is_permit]
    if not permits:
        return ""
    parts = []
    for c in permits:
        cp = rating.postings[c.id]
        head = (f"{c.load.name}, {c.category.value}, RF {_rf_words(cp.rf)}"
                + (f" ({cp.controlling})" if cp.controlling else ""))
        if cp.permit == CARRIED:
            tail = ("the truss members and pins carry it ("
                    + permit_conditions(c.category, c.im.value) + ")"
                    + (f" only if {condition}" if condition else "")
                    + "; the floor system, deck and bearings are to be checked for it")
        elif cp.permit == NOT_OVER_RESTRICTED:
            tail = ("not over this bridge while it is restricted for the legal loads (MBE "
                    "6A.4.5 [value from memory])")
        else:
            tail = "not as requested"
        parts.append(f"{head}: {tail}")
    return (" Permit loads (for the permit's issue, not a posting): " + "; ".join(parts)
            + ".")


def _own_fleet(case: RatingCase, unit: str) -> str:
    """For a vehicle of the owner's Vehicles sheet, posted: that at its full weight it should
    not cross (the posting is its safe load; lightened to it, as the owner's policy allows)."""
    if case.category is not VehicleCategory.OWNER:
        return ""
    w = case.load.gross_weight_tons / (TON_PER_TONNE if unit == "tonne" else 1.0)
    return f" (an owner-specified vehicle of {w:.4g} {unit}s: not to cross at full weight)"


def _recommendation(rating: BridgeRating, unit: str,
                    report: Mapping[str, _ReportPosting]) -> str:
    """The bridge-level recommendation, always worded for the engineer's decision;
    ``report``: each case's action and posting load in the report's unit
    (:func:`_report_posting`).

    Closing is considered from the trucks (the legal loads, the SHVs and the owner's
    vehicles): RF below 0.3, or a safe posting load under the 3 tons a bridge kept open must
    carry (MBE 6A.8.3 and 6A.8.1 [value from memory]). Emergency vehicles are said apart: one
    that cannot be posted does not close the bridge to all traffic but calls for barring such
    vehicles, for the owner to arrange with the emergency services (common practice; the
    owner's policy governs); where one is barred the others' postings are given one by one,
    not as one sign for the class."""
    legal = [c for c in rating.cases if c.postable and c.load.id not in SCREENING_LOADS
             and not rating.postings[c.id].screened_out]
    screens = [c for c in rating.cases if c.postable and c.load.id in SCREENING_LOADS]
    ev_all = [c for c in legal if c.category is VehicleCategory.EMERGENCY]
    trucks_all = [c for c in legal if c.category is not VehicleCategory.EMERGENCY]
    closing = [c for c in trucks_all if report[c.id].action is PostingAction.CLOSE]
    ev_barred = [c for c in ev_all if report[c.id].action is PostingAction.CLOSE]
    posted = [c for c in legal if report[c.id].action is PostingAction.POST]
    trucks = [c for c in posted if c.category is not VehicleCategory.EMERGENCY]
    ev_posted = [c for c in posted if c.category is VehicleCategory.EMERGENCY]
    tons = provisions()["posting"]["least_tons"]
    least = (f"{tons:g} tons" if unit == "ton"
             else f"{tons:g} tons ({least_posting_load('tonne'):.2f} tonnes)")
    tail = DECISION_NOTE

    def names(cs: list[RatingCase]) -> str:
        return ", ".join(f"{c.load.name} (RF {_rf_words(rating.postings[c.id].rf)}, "
                         f"{rating.postings[c.id].controlling})" for c in cs)

    def why(cs: list[RatingCase]) -> str:
        low_rf = [c for c in cs if reported_rf(rating.postings[c.id].rf) < 0.3]
        light = [c for c in cs if c not in low_rf]
        return "; ".join(([f"the rating factor is below 0.3 for {names(low_rf)}"] if low_rf
                          else []) + ([f"the safe posting load is less than {least} for "
                                       f"{names(light)}"] if light else []))

    def amount(c: RatingCase) -> float:
        load = report[c.id].load
        assert load is not None  # posted
        return load

    def each(cs: list[RatingCase]) -> str:
        return "; ".join(f"{c.load.name} {amount(c):g} {unit}s" + _own_fleet(c, unit)
                         for c in cs)

    # emergency vehicles: one sign for the class only where every one of them can be posted
    ev_text = ""
    if ev_barred:
        ev_text = ((" Emergency vehicles that cannot be posted: " if len(ev_barred) > 1 else
                    " An emergency vehicle cannot be posted: ") + why(ev_barred) + "; consider "
                   "barring such vehicles from the bridge and telling the emergency services "
                   "which route to take (common practice; the owner's policy governs).")
        if ev_posted:
            ev_text += f" Other emergency vehicles may be posted one by one: {each(ev_posted)}."
    elif ev_posted:
        low = min(ev_posted, key=amount)
        ev_text = (f" Emergency vehicles: post for {amount(low):g} {unit}s (from "
                   f"{low.load.name}), separately from the truck limit (common practice; the "
                   "owner's policy governs).")

    if closing:
        text = "Consider closing the bridge: " + why(closing) + "."
        if trucks:
            text += (" Should the owner keep it open meanwhile, the trucks named here must not "
                     "cross (no posting covers them), and the other trucks' safe posting loads "
                     f"are: {each(trucks)}.")
        return text + ev_text + tail
    if not any(c.postable and c.category is not VehicleCategory.EMERGENCY
               for c in rating.cases):  # (a screened SHV or the NRL was rated: not this)
        chosen = ", ".join(c.load.id for c in rating.cases if c.postable) or "none"
        text = ("No truck legal load was rated (the vehicles rated at the legal level: "
                f"{chosen}), so this run indicates no posting for trucks; rate the legal "
                "loads before deciding on one.")
        return text + ev_text + tail
    if not trucks:
        below = [c for c in screens if reported_rf(rating.postings[c.id].rf) < 1.0]
        text = ("No load restriction is indicated for trucks: every truck rated has a rating "
                "factor of at least 1.0")
        if below:
            text += (f" ({names(below)} is a screening load below 1.0: the single-unit "
                     "specialized hauling vehicles (SHVs) "
                     "were rated one by one instead, each at least 1.0)")
        return text + "." + ev_text + tail

    groups = []
    for title, ids in (("single-unit trucks", SINGLE_UNIT), ("combination trucks", COMBINATION)):
        sel = [c for c in trucks if c.load.id in ids]
        if sel:
            low = min(sel, key=amount)
            groups.append(f"{title} {amount(low):g} {unit}s (from {low.load.name})")
    groups += [f"{c.load.name} {amount(c):g} {unit}s" + _own_fleet(c, unit) for c in trucks
               if c.load.id not in SINGLE_UNIT | COMBINATION]
    single = min(trucks, key=amount)
    text = ("Post the bridge. Safe posting loads by vehicle class: " + "; ".join(groups)
            + f". A single weight limit for trucks would be {amount(single):g} {unit}s (from "
            f"{single.load.name}, controlled by {rating.postings[single.id].controlling}).")
    return text + ev_text + tail


def build_results(rating: BridgeRating, extra_warnings: tuple[str, ...] = (),
                  extra_assumptions: tuple[str, ...] = ()) -> RatingResults:
    b = rating.bridge
    g = rating.geometry
    system = b.settings.units

    positions: dict = {}

    si_texts: dict[str, str] = {}  # the same wording recurs (checks' locations, findings)

    def text(t: str) -> str:
        # our own wording quotes core units; an SI bridge reads them in SI
        if system is not UnitSystem.SI:
            return t
        out = si_texts.get(t)
        if out is None:
            head, sep, rest = t.partition(": ")
            if sep and rest and head.startswith("member "):
                # "member X: words", the same words for many members: converted once (no
                # quantity reaches across ": ", so the parts convert as the whole)
                out = text(head + sep) + text(rest)
            else:
                out = si_text(t)
            si_texts[t] = out
        return out

    support = {s.joint: s.kind.value for s in g.supports}
    deck = set(g.deck_joints)
    joints = tuple(JointResult(j.label, j.x_ft, j.y_ft, j.label in deck, support.get(j.label))
                   for j in g.joints)
    vehicles = []
    for case in rating.cases:
        load = case.load
        axles = next((m.axles for m in load.models if m.axles is not None), None)
        lane = max((m.lane_load_klf for m in load.models), default=0.0)
        vehicles.append(VehicleResult(
            id=case.id, name=load.name + (f" ({case.level.value})" if case.level in (
                RatingLevel.INVENTORY, RatingLevel.OPERATING) else ""),
            category=load.category.value, gross_weight=load.gross_weight_tons,
            # the axles as they act (the lane-type legal load takes 0.75 of the Type 3-3's)
            axle_loads=tuple(float(a) * axles.axle_scale for a in axles.axle_loads_kip)
            if axles else (),
            spacings=tuple((s.min_ft, s.max_ft) for s in axles.spacings) if axles else (),
            lane_load=lane, source=load.source, tag=load.tag, rating_level=case.level.value,
            gamma_ll=case.gamma_ll.value, im=case.im.value))
    idx = g.member_index
    members = []
    cases = [(case.id, case.load, case.im.value) for case in rating.cases]
    live_of, rating_of = rating.live, rating.ratings
    for m in g.members:
        cap = rating.capacities[m.label]
        rod = isinstance(rating.bridge.design_of(m.label).section, RodSet)
        i = idx[m.label]
        path_dw = _path_dw_factor(rating, i)  # (the member's own, for every case)
        live = {}
        ratings = {}
        for cid, load, im in cases:
            e = live_of[(m.label, cid)]
            hi, lo = e.max_extreme, e.min_extreme
            at_hi, at_lo = _position(hi, load, positions), _position(lo, load, positions)
            live[cid] = LiveLoadEffect(e.max, e.min, e.max_with_im, e.min_with_im,
                                       e.distribution_factor, im, at_hi, at_lo)
            r = rating_of[(m.label, cid)]
            ext = r.extreme  # most often one of the two extremes, placed just above
            at = at_hi if ext is hi else at_lo if ext is lo else _position(ext, load, positions)
            if r.method == "load multiplier" and r.gamma_dw in path_dw:
                r = replace(r, gamma_dw=path_dw[r.gamma_dw])
            ratings[cid] = Rating(r.rf, r.sense, r.check, _factors(r, positions), r.method, at,
                                  _finding(r.finding, text, positions, rod),
                                  r.dead_at_rating, r.live_at_rating, r.slack_at_rating)
        s = cap.summary
        phi_cs = cap.phi_cs
        checks = tuple(
            CheckSummary(c.name, c.sense.value, c.phi, c.R_n_kip, phi_cs * c.phi_R_n_kip,
                         c.provision, text(c.location.describe()),
                         text(finding_text(c.finding, rod)), text(c.detail))
            for c in cap.checks)
        t = cap.governing("tension")
        c_ = cap.governing("compression")
        members.append(MemberResult(
            id=m.label, role=m.role.value, joints=(m.start, m.end), tension_only=m.tension_only,
            dead_load={"DC": float(rating.dead.member_forces_dc_kip[i]),
                       "DW": float(rating.dead.member_forces_dw_kip[i])},
            live_load=live,
            section=SectionSummary(s.A_g_in2, s.A_n_in2, s.F_y, s.F_u, s.length_ft, s.K,
                                   s.KL_r if math.isfinite(s.KL_r) else None, s.E),
            resistance=Resistance(
                tension=cap.factored_resistance("tension") if t is not None else None,
                compression=cap.factored_resistance("compression") if c_ is not None else None,
                checks=checks),
            ratings=ratings, warnings=tuple(map(text, cap.warnings))))
    pins = []
    for p in rating.pins:
        pr = {}
        governing, gov_chk, gov_case = "", None, ""
        worst = math.inf
        for cid, load, _ in cases:
            r = p.ratings[cid]
            pr[cid] = Rating(r.rf, "pin", r.check, None, "load multiplier",
                             _position(r.extreme, load, positions))
            if r.rf < worst and r.at_rating is not None:
                worst, gov_chk, gov_case = r.rf, r.at_rating, cid
        if gov_chk is not None:
            governing = _pin_section_text(gov_chk, gov_case, system)
        pins.append(PinResult(
            joint=p.joint, diameter=p.pin.diameter_in,
            packing=tuple(PackingRow(it.member, it.thickness_in, it.gap_before_in)
                          for it in p.pin.packing),
            governing_section=governing,
            governing_z=gov_chk.governing.z_in if gov_chk else None,
            governing_M=gov_chk.M_u_kip_in if gov_chk else None,
            governing_V=gov_chk.V_u_kip if gov_chk else None, governing_case=gov_case,
            governing_item=(plate.position if gov_chk is not None
                            and (plate := _bearing_plate(gov_chk)) is not None else None),
            plate_forces=(tuple((pl.F_h_kip, pl.F_v_kip) for pl in gov_chk.plates)
                          if gov_chk is not None else ()),
            mid_pin_force=_mid_pin_force(gov_chk),
            ratings=pr, warnings=tuple(map(text, p.warnings))))
    unit = "tonne" if system is UnitSystem.SI else "ton"
    weight_tons = {c.id: c.load.gross_weight_tons for c in rating.cases}
    report = {cid: _report_posting(cp, system, weight_tons[cid])
              for cid, cp in rating.postings.items()}
    posting = {cid: _posting_entry(cp, report[cid], system)
               for cid, cp in rating.postings.items()}
    # influence lines of the controlling members, for the drawings
    # (drawn with the active set in which the controlling extreme was found)
    controlling: dict[str, object] = {}
    for cid, cp in rating.postings.items():
        lab = cp.controlling
        if lab and not lab.startswith("pin") and lab not in controlling:
            r = rating.ratings[(lab, cid)]
            e = rating.live[(lab, cid)]
            controlling[lab] = e.min_config if r.sense == "compression" else e.config
    ils = []
    for lab, cfg in controlling.items():
        lines = rating.lines_by_config.get(cfg, rating.lines)
        ils.append(InfluenceLineData(lab, tuple(float(x) for x in lines.stations_ft),
                                     tuple(float(y) for y in lines.row(lab))))
    ils = tuple(ils)
    info = b.info
    findings = tuple(FindingEcho(
        f.member, f.component, f.region.value, f.station_ft, f.remaining_thickness_in,
        f.percent_loss, f.bar_state.value, f.condition_rating, f.photo, f.note, f.where,
        f.estimated)
        for f in b.findings)
    p = provisions()
    assumptions = list(rating.assumptions) + list(extra_assumptions)
    assumptions += [f"Provision used: {text}" for text in rating.provisions]
    assumptions.append(f"Lateral distribution: {rating.distribution_note}.")
    floor = p["capacity_floor"]
    assumptions.append(f"Capacity: phi_c phi_s not less than {floor['phi_c_phi_s_min']} "
                       f"({floor['source']}).")
    assumptions.append(f"Posting: {p['posting']['source']} ({p['posting']['tag']}).")
    assumptions.append("Scope: the truss members and their pins are rated; the floor system "
                       "(stringers, floorbeams), the deck, bearings, substructure, connections "
                       "other than pins, bracing and fatigue are not (they need their own "
                       "ratings; the bridge's posting is the lowest of all).")
    assumptions = [text(a) for a in assumptions]
    return RatingResults(
        schema_version=SCHEMA_VERSION,
        bridge=BridgeSummary(
            id=info.structure_id, name=info.name, span=g.span_ft, location=info.location,
            owner=info.owner, year_built=info.year_built,
            inspection_date=info.inspection_date.isoformat() if info.inspection_date else None,
            inspector=info.inspector, form=g.form, deck_position=g.deck_position.value,
            panel_count=len(g.deck_joints) - 1,
            truss_spacing=b.cross_section.truss_spacing_ft,
            roadway_width=b.cross_section.roadway_width_ft, source_file=b.source_file),
        units=units_block(system.value),
        method=METHOD,
        provision_set=b.settings.provision_set,
        joints=joints, vehicles=tuple(vehicles), members=tuple(members), pins=tuple(pins),
        posting=posting, recommendation=recommendation(rating, unit, report),
        warnings=group_member_notes([text(w) for w in list(rating.warnings)
                                     + list(extra_warnings)]),
        assumptions=group_member_notes(assumptions),
        findings=findings, influence_lines=ils,
        distribution={"factor": rating.distribution_factor,
                      "description": text(rating.distribution_note)},
        generator=f"pintruss {__version__}",
    )
