"""The rating of one bridge: resistances, dead load, live-load envelopes, rating factors,
pins and posting, as typed outputs for :mod:`rating.results` to present.

Rating factors follow MBE 6A.4.2.1 (Eq. 6A.4.2.1-1) [value from memory; terms as Khan 2010,
p. 187, read]. Members whose force does not depend on which diagonal of a counter panel is
active are rated with the linear equation on their influence line. Members whose force does
(tension-only mains and counters, and the chords and verticals of those panels) are rated by
the live-load multiplier that brings them to their resistance with the active set consistent
at that load level (docs/tension-only.md), the least over every position of the vehicle
driven across both ways (rating.lrfr.positions) and the points between them where the set at
the rating level changes (rating.lrfr.multiplier); the pins likewise (rating.lrfr.pins).
"""

from __future__ import annotations

import itertools
import math
from collections.abc import Callable, Iterator, Mapping, Sequence
from dataclasses import dataclass, field, replace

import numpy as np

from rating.analysis.deadload import DeadLoadResult, MemberWeight, dead_load
from rating.analysis.distribution import (
    SOURCE_ONE_VEHICLE,
    DistributionResult,
    lateral_distribution,
    one_vehicle_alone,
    wheels_text,
)
from rating.analysis.influence import InfluenceLines
from rating.analysis.moving import Extreme, MemberEnvelope, envelope
from rating.analysis.path import member_load_multiplier
from rating.analysis.regions import LAM_MAX, PathStore, RegionTable
from rating.analysis.truss import (
    ActiveSetSolution,
    TrussFamily,
    members_cross,
    solve_tension_only,
)
from rating.capacity.materials import NEAR_BOUNDARY_YEARS, older_steel
from rating.capacity.member import MemberCapacity, member_capacity
from rating.capacity.sections import gross_area_as_built_in2, section_properties
from rating.errors import ConvergenceError, InputError
from rating.lrfr.equation import SenseLoads, lower_beyond_round_off, rating_factor
from rating.lrfr.factors import (
    Factor,
    RatingLevel,
    dead_load_factors,
    dynamic_load_allowance,
    factored_dw,
    live_load_factor,
    provisions,
)
from rating.lrfr.liveload import live_joint_loads, position_key
from rating.lrfr.multiplier import first_crossings, first_of_least, kink_points, state_at
from rating.lrfr.pins import CHANGE_POINT_WINDOW, KINK_GRID, PinRating, rate_pins
from rating.lrfr.positions import (
    LoadPaths,
    PositionBatch,
    PositionSet,
    fixed_axles_only,
    run_key,
    runs_of,
)
from rating.lrfr.posting import PostingAction, PostingResult, posting, posting_load
from rating.lrfr.reported import reported_rf
from rating.lrfr.uframes import UFRAME_ASSUMPTION, UFRAME_FORCE_KLF, PonyChord, pony_chord
from rating.model import (
    BarState,
    Bridge,
    DeckPosition,
    EyebarSet,
    Finding,
    FindingRegion,
    Material,
    MaterialKind,
    Member,
    MemberRole,
    Pin,
    RodSet,
    TrussGeometry,
    UnitSystem,
    VehicleCategory,
)
from rating.units import TON_PER_TONNE
from rating.vehicles.library import RatingLoad, rating_load, rating_loads

SENSES = ((1, "tension"), (-1, "compression"))


@dataclass(frozen=True)
class RatingCase:
    """One rating entry: a rating load at a rating level with its factors."""

    id: str
    load: RatingLoad
    level: RatingLevel
    gamma_ll: Factor
    im: Factor

    @property
    def category(self) -> VehicleCategory:
        return self.load.category

    @property
    def postable(self) -> bool:
        return self.level is RatingLevel.LEGAL


@dataclass(frozen=True)
class LiveEffect:
    """Live-load force of one case in one member of one truss (DF applied), kip."""

    max: float
    min: float
    max_with_im: float
    min_with_im: float
    distribution_factor: float
    max_extreme: Extreme
    min_extreme: Extreme
    config: frozenset[str]  # slack members of the active set where the maximum was found
    min_config: frozenset[str] = frozenset()  # and where the minimum was found


@dataclass(frozen=True)
class MemberCaseRating:
    """One member's rating factor for one rating case (AASHTO MBE Eq. 6A.4.2.1-1): the
    governing sense and check, how it was found (linear or on the load path), the factors
    used and the vehicle position of the governing live-load effect."""

    member: str
    case: str
    rf: float
    sense: str
    check: str
    method: str
    gamma_dc: float
    gamma_dw: float
    gamma_ll: float
    im: float
    phi: float
    phi_c: float
    phi_s: float
    extreme: Extreme | None
    finding: Finding | None = None
    # on the load path (method "load multiplier"): the member's factored dead-load force and
    # its live-load force with IM and distribution (gamma_LL = 1), in the sense rated, with
    # the tension-only members slack as they are at the rating level: RF = (C - D) / (gamma_LL
    # x L) exactly (rating.lrfr.multiplier.state_at); None for a linear rating
    dead_at_rating: float | None = None
    live_at_rating: float | None = None
    slack_at_rating: tuple[str, ...] = ()


@dataclass(frozen=True)
class CasePosting:
    """The controlling member or pin of one rating case, its RF and the posting
    recommendation that follows from it (rating.lrfr.posting)."""

    case: str
    rf: float
    controlling: str  # member id or "pin at J"
    result: PostingResult
    screened_out: bool = False
    note: str = ""
    alike: tuple[str, ...] = ()  # others rated the same within round-off (mirror members)
    permit: str = ""  # a permit load's verdict (CARRIED, ...); "" for any other load


@dataclass(frozen=True, eq=False)
class BridgeRating:
    """Everything the rating of one bridge found: the model and analysis it used, every
    member's and pin's rating per case, the postings, warnings and assumptions."""

    bridge: Bridge
    geometry: TrussGeometry
    capacities: dict[str, MemberCapacity]
    dead: DeadLoadResult
    lines: InfluenceLines
    configs: tuple[frozenset[str], ...]
    lines_by_config: dict[frozenset[str], InfluenceLines]
    cases: tuple[RatingCase, ...]
    live: dict[tuple[str, str], LiveEffect]
    ratings: dict[tuple[str, str], MemberCaseRating]
    pins: tuple[PinRating, ...]
    postings: dict[str, CasePosting]
    distribution_factor: float
    distribution_note: str
    dependent_members: frozenset[str]
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...]
    provisions: tuple[str, ...] = field(default=())
    without: Mapping[str, WithoutMember] = field(default_factory=dict)  # a bent member the
    # ratings rest on -> what the members give without it (:func:`_without_bent`)
    conditions: tuple[Condition, ...] = ()  # other assumptions the ratings rest on, each
    # with what the trucks give without it (:func:`_hips_hinged`, :func:`_older_steel`)


@dataclass(frozen=True)
class Condition:
    """An assumption the ratings rest on that the engineer should confirm, with what the
    trucks give where it does not hold: ``holds`` words its confirmation ("the top chord is
    confirmed continuous out of plane at the hips (U1, U5)"), ``fails`` its opposite ("the
    top chord is hinged there")."""

    holds: str
    fails: str
    result: WithoutMember


@dataclass(frozen=True)
class WithoutMember:
    """What the members give for the trucks with one member out of service: the verdict
    ("a closure to consider", "a posting", "no restriction"), the lowest truck RF, its case
    and what controls it (None: no load path for the trucks at all)."""

    verdict: str
    rf: float | None = None
    case: str = ""
    controlling: str = ""
    bars: str = ""  # the bent bars left out ("bar 2"); "" for the whole member
    # the trucks posted lower (or closed, or posted where they were not) than in the
    # rating's own postings, where those were given (:func:`trucks_verdict`): each case with
    # its safe posting load here in whole units of the bridge's own (None: not posted)
    lowered: tuple[tuple[str, float | None], ...] = ()
    # the permits the rating's own postings find carried and this one does not
    permits_lost: tuple[str, ...] = ()

    def what(self, member: str) -> str:
        """What was left out, in words: "L3U4" or "the bent bar 2 of L3L4"."""
        return f"the bent {self.bars} of {member}" if self.bars else member


# --------------------------------------------------------------------------- set-up


def is_tension_only(member: Member, section: object) -> bool:
    """Eyebars and rods cannot push: tension-only (common practice)."""
    return member.tension_only or isinstance(section, EyebarSet | RodSet)


def rating_geometry(bridge: Bridge) -> TrussGeometry:
    """The bridge geometry with stiffness areas and tension-only flags from the sections."""
    g = bridge.geometry
    members = []
    for m in g.members:
        d = bridge.design_of(m.label)
        if d is None:
            raise InputError(f"member {m.label} has no section; every member needs one to be "
                             "rated")
        area = gross_area_as_built_in2(d.section)
        members.append(replace(m, tension_only=is_tension_only(m, d.section),
                               area_in2=max(area, 1e-3)))
    return replace(g, members=tuple(members))


def _across_weight_klf(g: TrussGeometry, m: Member, weight: MemberWeight,
                       detail_allowance: float) -> float:
    """The member's own weight per foot across its axis, kip/ft: gross area as built times
    unit weight, with the detail allowance of the dead load (rating.analysis.deadload), times
    the cosine of its slope (statics; 0 for a vertical member)."""
    a, b = g.joint(m.start), g.joint(m.end)
    cos = abs(b.x_ft - a.x_ft) / g.member_length_ft(m.label)
    return (weight.area_in2 / 144.0 * weight.unit_weight_pcf * (1.0 + detail_allowance) * cos
            / 1000.0)


def active_set_configurations(family: TrussFamily, dead_slack: frozenset[str],
                              max_pairs: int = 4) -> tuple[frozenset[str], ...]:
    """The dead-load set and the sets with crossing tension-only pairs flipped.

    A pair is a slack and an active tension-only member that cross in one panel (a counter and
    its main): its flip makes the slack one act and the active one slack. Where both members
    of a crossing pair act under dead load (a panel with no dead-load shear, as the middle
    panel of a symmetric truss with an odd number of panels: both take a share), each of them
    going slack is a flip of its own (the live load's shear puts one of them in compression).
    With up to ``max_pairs`` flips every combination is formed; beyond that, every single
    flip and every double flip of two neighbouring panels (flips whose bars share a joint):
    in a truss with one diagonal acting per panel a member's line depends on its own panel
    and, for a post between two counter panels, on both of them.
    """
    g = family.geometry
    t_only = [m for m in g.members if m.tension_only]
    pairs: list[tuple[str | None, str]] = []  # (made to act, made slack)
    for a, b in itertools.combinations(t_only, 2):
        if not members_cross(g, a, b):
            continue
        if (a.label in dead_slack) != (b.label in dead_slack):
            slack, active = (a, b) if a.label in dead_slack else (b, a)
            pairs.append((slack.label, active.label))
        elif a.label not in dead_slack:  # both act under dead load: either may let go
            pairs += [(None, a.label), (None, b.label)]
    if len(pairs) <= max_pairs:
        combos = itertools.chain.from_iterable(
            itertools.combinations(pairs, k) for k in range(1, len(pairs) + 1))
    else:
        def joints_of(pair: tuple[str | None, str]) -> set[str]:
            return {j for lab in pair if lab is not None
                    for j in (g.member(lab).start, g.member(lab).end)}

        neighbours = [(a, b) for a, b in itertools.combinations(pairs, 2)
                      if joints_of(a) & joints_of(b)]
        combos = itertools.chain(((p,) for p in pairs), neighbours)
    configs = [dead_slack]
    for combo in combos:
        s = set(dead_slack)
        for slack, active in combo:
            if slack is not None:
                s.discard(slack)
            s.add(active)
        fs = frozenset(s)
        if fs not in configs and family.is_stable(fs):
            configs.append(fs)
    return tuple(configs)


def rating_cases(bridge: Bridge, ids: Sequence[str] | None, span_ft: float
                 ) -> tuple[tuple[RatingCase, ...], list[str]]:
    """The cases to rate, each with gamma_LL and IM; notes on what was left out and why."""
    st = bridge.settings
    notes: list[str] = []
    if ids is None:
        ids = st.vehicle_ids
    if ids is None:
        loads = list(rating_loads()) + [rating_load(v.id, bridge.owner_vehicles)
                                        for v in bridge.owner_vehicles]
    else:
        loads = [rating_load(i, bridge.owner_vehicles) for i in ids]
        chosen = {x.id for x in loads}
        if "NRL" in chosen:
            # the NRL is a screen for the single-unit SHVs (FHWA SHV Q&A, March 2014): where
            # it rates below 1.0 they are rated one by one, so they are rated with it
            added = [v for v in SHVS if v not in chosen]
            loads += [rating_load(v, bridge.owner_vehicles) for v in added]
            if added:
                notes.append(f"The NRL (notional rating load) is rated as a screen for the "
                             "single-unit specialized hauling vehicles (SHVs); "
                             f"{', '.join(added)} are rated with it (FHWA, Load Rating of "
                             "Specialized Hauling Vehicles, Q&A, March 2014).")
    cases: list[RatingCase] = []
    seen: set[str] = set()
    for load in loads:
        if load.id in seen:
            continue
        seen.add(load.id)
        if not load.applies_to(span_ft):
            notes.append(f"{load.name} ({load.id}) is not rated: it applies only to spans over "
                         f"{load.min_span_ft:g} ft and this span is {span_ft:g} ft.")
            continue
        # the owner's IM is for the loads rated at the legal level; the design-load rating
        # keeps the IM of LRFD 3.6.2.1 (MBE C6A.4.4.3 [value from memory]); one given with
        # an owner's vehicle is for that vehicle (an escorted permit at a crawl: MBE
        # 6A.4.5.5 [value from memory])
        im = dynamic_load_allowance(load.category, st.riding_surface,
                                    None if load.category is VehicleCategory.DESIGN
                                    else load.im if load.im is not None else st.im_override)
        if load.category is VehicleCategory.DESIGN:
            for level, suffix in ((RatingLevel.INVENTORY, "INV"), (RatingLevel.OPERATING, "OPR")):
                g_ll = live_load_factor(load.category, level, st.adtt_one_direction,
                                        st.provision_set, None)
                cases.append(RatingCase(f"{load.id}-{suffix}", load, level, g_ll, im))
        elif load.category.is_permit:
            # (the owner's gamma_LL on the Settings sheet is for the legal loads; a permit
            # takes its own, or the one given with the vehicle)
            g_ll = live_load_factor(load.category, RatingLevel.PERMIT, st.adtt_one_direction,
                                    st.provision_set, load.gamma_ll,
                                    weight_ratio_kip_per_ft=load.weight_ratio_kip_per_ft)
            cases.append(RatingCase(load.id, load, RatingLevel.PERMIT, g_ll, im))
        else:
            g_ll = live_load_factor(load.category, RatingLevel.LEGAL, st.adtt_one_direction,
                                    st.provision_set, load.gamma_ll if load.gamma_ll is not None
                                    else st.gamma_ll_override)
            cases.append(RatingCase(load.id, load, RatingLevel.LEGAL, g_ll, im))
    permits = [c.id for c in cases if c.category.is_permit and c.load.gamma_ll is None]
    if st.gamma_ll_override is not None and permits:
        notes.append(f"The owner's live-load factor ({st.gamma_ll_override:g}, Settings sheet) "
                     f"is for the legal loads: the permits ({', '.join(permits)}) take the "
                     "permit load factors (MBE Table 6A.4.5.4.2a-1 [value from memory]), or "
                     "the one given with the vehicle on the Vehicles sheet.")
    crawl = [c.id for c in cases if c.category is VehicleCategory.PERMIT_ESCORTED
             and c.im.value > 0.0]
    if crawl:
        p = provisions()["permit"]
        notes.append(f"The escorted permits ({', '.join(crawl)}) are rated with the dynamic "
                     f"load allowance of the legal loads; {p['im_note']} ({p['im_tag']}): "
                     "give 0 % with the vehicle on the Vehicles sheet where the escort holds "
                     "the crossing to a crawl.")
    if st.im_override is not None and any(
            c.load.category is VehicleCategory.DESIGN for c in cases):
        notes.append(f"The owner's dynamic load allowance ({st.im_override:.0%}) applies to the "
                     "loads rated at the legal level and the permits (but a vehicle's own); "
                     "the design-load rating (HL-93) keeps "
                     "IM = 33 % of AASHTO LRFD 3.6.2.1 (MBE C6A.4.4.3 reduces IM for legal "
                     "loads only [value from memory]).")
    return tuple(cases), notes


# --------------------------------------------------------------------------- live loads


class EnvelopeSet:
    """Envelopes of every member in every active set, found in one search per rating load.

    Members whose line does not change with the active set are searched once; the others once
    per distinct line (flipping a far panel's counter leaves most lines as they were), all
    rows stacked into one set of influence lines.
    """

    def __init__(self, lines: dict[frozenset[str], InfluenceLines],
                 configs: Sequence[frozenset[str]], dependent: frozenset[str]) -> None:
        base = lines[configs[0]]
        labels = list(base.member_labels)
        rows = [base.ordinates]
        self._label: dict[tuple[str, frozenset[str]], str] = {
            (lab, c): lab for lab in base.member_labels for c in configs}
        scale = max(float(np.abs(base.ordinates).max()), 1e-12)
        for lab in base.member_labels:
            if lab not in dependent:
                continue
            i = base.member_labels.index(lab)
            seen = [(base.ordinates[i], lab)]
            for k, c in enumerate(configs[1:], start=1):
                row = lines[c].ordinates[i]
                key = next((key for r, key in seen
                            if np.abs(r - row).max() <= 1e-12 * scale), None)
                if key is None:
                    key = f"{lab}\x00{k}"
                    seen.append((row, key))
                    labels.append(key)
                    rows.append(row[None, :])
                self._label[(lab, c)] = key
        self.lines = InfluenceLines(tuple(labels), base.stations_ft, np.vstack(rows))
        self._envelopes: dict[tuple[str, float], dict[str, MemberEnvelope]] = {}

    def of(self, load: RatingLoad, im: float, member: str, config: frozenset[str]
           ) -> MemberEnvelope:
        return self.of_row(load, im, self._label[(member, config)])

    def of_row(self, load: RatingLoad, im: float, row: str) -> MemberEnvelope:
        """The envelope of one stacked row (see :meth:`distinct`)."""
        key = (load.id, im)
        env = self._envelopes.get(key)
        if env is None:
            env = {e.member: e for e in envelope(self.lines, load, im=im).members}
            self._envelopes[key] = env
        return env[row]

    def row_of(self, member: str, config: frozenset[str]) -> str:
        """The stacked row that holds the member's line in ``config``."""
        return self._label[(member, config)]

    def distinct(self, members: Sequence[str], configs: Sequence[frozenset[str]]
                 ) -> list[tuple[str, frozenset[str]]]:
        """The distinct rows of ``members`` over ``configs`` (configs outer, members inner),
        each with the first config that has it: every envelope of them, once."""
        out, seen = [], set()
        for c in configs:
            for lab in members:
                row = self._label[(lab, c)]
                if row not in seen:
                    seen.add(row)
                    out.append((row, c))
        return out


LOOP_ROD_CONTROLS = "LOOP ROD CONTROLS"
DEAD_LOAD_PAST_RESISTANCE = "DEAD LOAD EXCEEDS RESISTANCE"


def _loop_rod_controls(warning: str, controlling: set[str]) -> str:
    """The forge-weld caution of a loop rod (rating.capacity.sections), and the caution that
    loss at its loop is rated as local (rating.capacity.tension), headed in capitals where
    that rod sets a posting, a closure or a barring, whatever check governs it: a crack at the
    forge line, not seen, would take the rod out, and loss along the loop would lower its
    rating; the decision rests on either."""
    head, sep, _ = warning.partition(": ")
    if not (sep and head.startswith("member ") and ("forge-welded loop rods" in warning
                                                     or "the loss at its loop" in warning)):
        return warning
    if head.removeprefix("member ") in controlling:
        return f"{LOOP_ROD_CONTROLS}: {warning}"
    return warning


def _dead_load_past_resistance(ratings: Mapping[tuple[str, str], MemberCaseRating],
                               cases: Sequence[RatingCase], pins: Sequence[PinRating]
                               ) -> list[str]:
    """Members whose factored resistance is below their factored dead load (RF below zero for
    some case, or -inf where no vehicle loads them), and pins whose check under factored dead
    load alone is past the limit: the rating equation gives no live load at all (MBE
    6A.4.2.1 [value from memory]); the truss stands today on what the rating does not
    count."""
    ids = {c.id for c in cases}
    members = sorted({lab for (lab, cid), r in ratings.items()
                      if cid in ids and r.rf < 0.0 and (math.isfinite(r.rf)
                                                        or r.method == DEAD_ALONE)})
    pins_past = [p.joint for p in pins if p.dead_check is not None
                 and p.dead_check.utilization >= 1.0]
    if not members and not pins_past:
        return []
    who = " and ".join(filter(None, (
        f"member(s) {', '.join(members)}" if members else "",
        f"the pin(s) at {', '.join(pins_past)}" if pins_past else "")))
    return [f"{DEAD_LOAD_PAST_RESISTANCE}: {who} cannot carry their "
            "factored dead load (rating factor below zero, or zero for a pin): the truss "
            "stands today only on "
            "what the rating does not count (dead loads lighter than taken, metal stronger or "
            "thicker than recorded, a load path not modelled). Check the measurements and the "
            "material, and consider closing at once until they are confirmed."]


BAR_WOULD_PUSH = "A BAR WOULD HAVE TO PUSH"


def _bars_that_would_push(g: TrussGeometry, ratings: Mapping[tuple[str, str], MemberCaseRating],
                          dependent: frozenset[str], controlling: set[str]) -> list[str]:
    """Tension-only members rated on the load path in compression (:func:`_sense_plans`):
    the truss cannot stand without them when the live load reverses them, so the rating ends
    where they would have to push. Said once, headed in capitals where one of them sets a
    posting, a closure or a barring."""
    bars = sorted({lab for (lab, _), r in ratings.items()
                   if lab in dependent and g.member(lab).tension_only
                   and r.sense == "compression" and r.method == "load multiplier"})
    if not bars:
        return []
    head = f"{BAR_WOULD_PUSH}: " if set(bars) & controlling else ""
    return [f"{head}member(s) {', '.join(bars)}: tension-only (bars that cannot push), yet "
            "when the live load reverses them the truss cannot stand without them (released, "
            "they leave a mechanism), so their ratings end where their force reaches zero "
            "('compression: tension-only member', on the load path). Another load path (a "
            "counter, a stiff member, the joints' actual details) would have to be shown by "
            "the engineer before any rating above that is relied on."]


TORSIONAL_BUCKLING = "TORSIONAL BUCKLING NOT CHECKED"
OPEN_SECTION = "LACING CLOSES THE SECTION"
ESTIMATED_LOSS = "ESTIMATED LOSS GOVERNS"
ESTIMATED_SECTION = "ESTIMATED SECTION GOVERNS"


def _estimated_loss_governs(ratings: Mapping[tuple[str, str], MemberCaseRating],
                            postings: Mapping[str, CasePosting], deciding: set[str]
                            ) -> list[str]:
    """A member that sets a posting, a closure or a barring whose governing finding's loss
    was estimated (judged by eye) rather than measured: the decision rests on that estimate,
    so it is headed in capitals (common practice: the loss that governs a posting is
    measured)."""
    found: dict[str, str] = {}
    for m, r in _deciding_ratings(ratings, postings, deciding):
        if r.finding is not None and r.finding.estimated:
            found.setdefault(m, r.finding.where or m)
    return [f"{ESTIMATED_LOSS}: member {m}: the section loss that sets its rating was estimated, "
            f"not measured ({where}); measure it before the posting is decided"
            for m, where in found.items()]


def _estimated_section_governs(ratings: Mapping[tuple[str, str], MemberCaseRating],
                               postings: Mapping[str, CasePosting], deciding: set[str],
                               bridge: Bridge) -> list[str]:
    """A member or pin that sets a posting, a closure or a barring whose dimensions the
    workbook records as estimated (not measured, not from plans): the decision rests on
    them, so it is headed in capitals (common practice: the section that governs a posting
    is measured)."""
    found: dict[str, str] = {}
    for m, _ in _deciding_ratings(ratings, postings, deciding):
        d = bridge.design_of(m)
        if d is not None and d.estimated_at:
            found.setdefault(m, d.estimated_at)
    said = [f"{ESTIMATED_SECTION}: member {m}: the dimensions of the section that sets its "
            f"rating are recorded as estimated ({where}), not measured or taken from plans; "
            "measure them before the posting is decided" for m, where in found.items()]
    pins = {f"pin at {p.joint}": p for p in bridge.pins}
    for who in dict.fromkeys(postings[cid].controlling for cid in sorted(deciding)):
        p = pins.get(who)
        if p is not None and p.estimated_at:
            said.append(f"{ESTIMATED_SECTION}: {who}: its dimensions (or those of a plate on "
                        f"it) are recorded as estimated ({p.estimated_at}), not measured or "
                        "taken from plans; measure them before the posting is decided")
    return said


def _deciding_ratings(ratings: Mapping[tuple[str, str], MemberCaseRating],
                      postings: Mapping[str, CasePosting], deciding: set[str]
                      ) -> Iterator[tuple[str, MemberCaseRating]]:
    """The member and its rating that sets each of the ``deciding`` cases (a posting, a
    closure or a barring), in the cases' order; a pin that sets one gives none."""
    for cid in sorted(deciding):
        member = postings[cid].controlling
        r = ratings.get((member, cid))
        if r is not None:
            yield member, r


def _torsional_not_checked(ratings: Mapping[tuple[str, str], MemberCaseRating],
                           capacities: Mapping[str, MemberCapacity],
                           postings: Mapping[str, CasePosting], deciding: set[str]
                           ) -> list[str]:
    """A member that sets a posting, a closure or a barring in compression whose torsional
    or flexural-torsional buckling (AASHTO LRFD 6.9.4.1.3 [value from memory]) either could
    not be checked (a singly symmetric or unsymmetric built-up section whose parts do not
    make one section, a rolled shape without its torsion properties or not shown to be
    doubly symmetric: rating.capacity.compression) or would govern if its lacing or battens
    did not close the section: the decision waits on the engineer's check."""
    found: dict[str, str] = {}
    for m, r in _deciding_ratings(ratings, postings, deciding):
        if capacities[m].open_section and r.sense == "compression":
            found.setdefault(m, capacities[m].open_section)
    said = []
    unchecked = [m for m, kind in found.items() if kind not in ("laced", "battened")]
    if unchecked:
        said.append(f"{TORSIONAL_BUCKLING}: member(s) {', '.join(unchecked)} set a posting, "
                    "closure or barring in compression and have a section that is not "
                    "doubly symmetric (or a rolled shape not shown to be), whose torsional "
                    "and flexural-torsional buckling (AASHTO LRFD 6.9.4.1.3 [value from "
                    "memory]) are not checked here; the engineer should check them before "
                    "the decision")
    open_ = [m for m, kind in found.items() if kind in ("laced", "battened")]
    if open_:
        said.append(f"{OPEN_SECTION}: member(s) {', '.join(open_)} set a posting, closure or "
                    "barring in compression with their lacing or battens taken as closing "
                    "the section; open, the section would buckle lower, in torsional or "
                    "flexural-torsional buckling (AASHTO LRFD 6.9.4.1.3 [value from memory]; "
                    "the member's notes give both resistances): the engineer should confirm "
                    "the lacing or battens from the inspection before the decision (recorded "
                    "out of action on the Findings sheet, they are rated open)")
    return said


PIN_BEARING_AS_BUILT = "PIN BEARING AS BUILT"
PACK_RUST_AT_PIN = "PACK RUST AT THE PIN"


def _pin_bearing_as_built(warning: str, joint: str, controlling: set[str]) -> str:
    """A pin that controls a posting, rated with the packing's plate thicknesses and gaps
    while section loss or pack rust is recorded at a bar's head or connection at its joint
    (rating.lrfr.pins._end_loss_notes): the posting may rest on metal that is no longer
    there, or on lever arms the rust has lengthened, so the warning is headed in capitals (it
    bears on the decision)."""
    if f"pin at {joint}" not in controlling:
        return warning
    if "has section loss recorded at its" in warning:
        return f"{PIN_BEARING_AS_BUILT}: {warning}"
    if "pack rust is recorded at member" in warning:
        return f"{PACK_RUST_AT_PIN}: {warning}"
    return warning


def _pony_top_chord(g: TrussGeometry, postings: Mapping[str, CasePosting],
                    on_uframes: bool = False) -> list[str]:
    """A pony truss has no top lateral bracing and holds its chord only by the U-frames of
    verticals and floorbeams (AASHTO LRFD 6.14.2.9 [value from memory]). With the floorbeam's
    moment of inertia given (``on_uframes``) the chord is rated on them (rating.lrfr.uframes)
    but the U-frames' own members are not checked; without it the chord is rated as braced at
    every panel point. Said for every pony truss; headed in capitals where such a member
    controls a rating case."""
    if g.deck_position is not DeckPosition.PONY:
        return []
    chord = [m.label for m in g.members
             if m.role in (MemberRole.TOP_CHORD, MemberRole.END_POST)]
    if not chord:
        return []
    if on_uframes:
        text = (f"the top chord and end posts ({', '.join(chord)}) are rated out of the truss "
                "plane as a column on the elastic U-frames of the verticals and floorbeams "
                "(their effective lengths are among the assumptions), but the U-frames' own "
                "members (the verticals in bending, the floorbeam connections) are not checked "
                "for the force that holds the chord (AASHTO LRFD 6.14.2.9 [value from "
                "memory]): the engineer should check them, the chord's continuity out of "
                "plane at the hips (its effect is among the assumptions) and its straightness "
                "in the field.")
    else:
        text = (f"the top chord and end posts ({', '.join(chord)}) are rated with an effective "
                "length of K times their length between panel points (K as given in the "
                "workbook, else the default), out of the truss plane as well. A pony truss has "
                "no top lateral bracing: its chord is held only by the U-frames of the "
                "verticals and floorbeams (AASHTO LRFD 6.14.2.9 [value from memory]), whose "
                "stiffness is not checked here: give the floorbeam's moment of inertia on the "
                "Bridge sheet to rate the chord on them (where it has verticals), or check the "
                "chord's lateral stability (a column on elastic supports) by hand and give the "
                "members' effective length factor in the workbook where that check makes it "
                "longer.")
    controls = sorted({p.controlling for p in postings.values()} & set(chord))
    if controls:
        return [f"PONY TRUSS TOP CHORD CONTROLS: {', '.join(controls)} control"
                f"{'s' if len(controls) == 1 else ''} a rating, and {text}"]
    return [f"pony truss: {text}"]


def _chord_on_uframes(g: TrussGeometry, bridge: Bridge, capacities: dict[str, MemberCapacity],
                      dead: DeadLoadResult, weights: Mapping[str, MemberWeight],
                      warnings: list[str], assumptions: list[str], gamma_dc: float,
                      torsion_found: dict | None = None,
                      open_sections: frozenset[str] = frozenset()) -> PonyChord | None:
    """A pony truss whose floorbeam's moment of inertia is given: its top chord and end posts
    rated out of the truss plane with the effective lengths of the chord on its U-frames
    (rating.lrfr.uframes; AASHTO LRFD 6.14.2.9 [value from memory]), in place of K L; their
    resistances, warnings and assumptions replaced in ``capacities``, ``warnings`` and
    ``assumptions``. Returns the analysis (None where there is none)."""
    I_fb = bridge.cross_section.floorbeam_I_in4
    if g.deck_position is not DeckPosition.PONY or not I_fb:
        return None
    force = dead.member_forces_dc_kip + dead.member_forces_dw_kip
    compression = {m.label: -float(f) for m, f in zip(g.members, force, strict=True)}
    S_y = {m.label: _least_S_y_in3(bridge, g, m.label) for m in g.members
           if m.role in (MemberRole.VERTICAL, MemberRole.HANGER)}
    chord = pony_chord(g, capacities, compression, bridge.cross_section.truss_spacing_ft, I_fb,
                       S_y_in3=S_y, height_ft=bridge.cross_section.uframe_height_ft,
                       hinged_at_hips=bool(bridge.cross_section.chord_hinged_at_hips))
    if chord is None:
        warnings.append("pony truss: the floorbeam's moment of inertia is given, but the "
                        "U-frames were not analysed: the top chord and end posts do not make "
                        "one path from bearing to bearing, one has no section left, or no "
                        "top-chord joint has a vertical with bending stiffness down to a "
                        "floorbeam (a chord held by inclined frames alone is not analysed). "
                        "The chord is rated as held at each panel point; check its lateral "
                        "stability by hand")
        return None
    st = bridge.settings
    for lab, KL_ft in chord.lengths_ft.items():
        m = g.member(lab)
        old = capacities[lab]
        new = member_capacity(bridge.design_of(lab), m.role, g.member_length_ft(lab),
                              bridge.findings_for(lab), m.tension_only,
                              own_weight_klf=_across_weight_klf(g, m, weights[lab],
                                                                st.detail_allowance),
                              gamma_dc=gamma_dc, KL_out_of_plane_ft=KL_ft,
                              torsion_found=torsion_found,
                              connectors_close=lab not in open_sections)
        capacities[lab] = new
        for said, was, now in ((warnings, old.warnings, new.warnings),
                               (assumptions, old.assumptions, new.assumptions)):
            said[:] = [w for w in said if w not in set(was) - set(now)] + [
                w for w in now if w not in was]
    assumptions.append(chord.assumption)
    over = [f"{f.upright} ({f.stress_ksi:.3g} ksi, F_y {f.F_y_ksi:.3g} ksi)"
            for f in chord.frames.values() if f.upright and f.stress_ksi > f.F_y_ksi > 0]
    if over:
        warnings.append(
            "U-FRAME POSTS PAST YIELD: the U-frame force of AASHTO LRFD 6.14.2.9 [value from "
            f"memory] ({UFRAME_FORCE_KLF:g} klf at the top chord's panel points) bends "
            f"{', '.join(over)} past yield at the foot: the U-frames may not hold the chord as "
            "its rating assumes; the engineer should check them and their floorbeam "
            "connections")
    return chord


def _hips_hinged(bridge: Bridge, cases: Sequence[RatingCase], chord: PonyChord | None,
                 against: Mapping[str, CasePosting] | None = None
                 ) -> tuple[tuple[str, ...], WithoutMember] | None:
    """A pony truss's chord on its U-frames whose hips' detail the Bridge sheet does not
    give is rated as continuous there; this rates the trucks (with the emergency vehicles
    and the permits) again with it hinged there
    (butted on the pin): the hips and what the trucks' ratings give. None where it does
    not apply."""
    trucks = _truck_ids(cases)
    if (chord is None or not chord.hips or not trucks
            or bridge.cross_section.chord_hinged_at_hips is not None):
        return None
    variant = replace(bridge, cross_section=replace(bridge.cross_section,
                                                    chord_hinged_at_hips=True))
    try:
        other = rate_bridge(variant, _sensitivity_ids(cases), what_if=False)
    except (InputError, ConvergenceError):
        return chord.hips, WithoutMember("a closure to consider")
    result = trucks_verdict(other.postings, other.cases, against=against,
                            metric=_metric(bridge))
    return None if result is None else (chord.hips, result)


def hips_text(hips: Sequence[str], r: WithoutMember, main: WithoutMember | None) -> str:
    """The warning of :func:`_hips_hinged`: headed in capitals where the chord hinged at the
    hips gives the trucks a posting or a closure."""
    return _sensitivity_warning(
        "CHORD AT THE HIPS NOT GIVEN", "pony truss",
        f"the pony truss's top chord and end posts are rated as continuous out of plane at "
        f"the hips ({', '.join(hips)}), the Bridge sheet not saying otherwise; hinged there "
        "(butted on the pin, no splice)", r, main,
        "Confirm the hips' detail in the field and give it on the Bridge sheet (Top chord at "
        "the hips, out of plane)")


def _sensitivity_warning(head: str, plain: str, what: str, r: WithoutMember,
                         main: WithoutMember | None, advice: str) -> str:
    """A sensitivity's warning: what was changed, what the trucks then give (verdict, lowest
    truck RF) against the rating's own, and the advice; headed ``head`` in capitals where
    the verdict is a posting or a closure (it bears on the decision), else ``plain``."""
    text = f"{what}, the trucks give {r.verdict}"
    if r.rf is not None:
        text += f": lowest truck RF {reported_rf(r.rf):.2f} ({r.case}, {r.controlling})"
    if main is not None and main.rf is not None:
        text += f", against {reported_rf(main.rf):.2f} ({main.case}, {main.controlling})"
    text += f". {advice}"
    return f"{plain if r.verdict == 'no restriction' else head}: {text}"


def _least_S_y_in3(bridge: Bridge, g: TrussGeometry, label: str) -> float:
    """A member's least elastic section modulus out of the truss plane along its length,
    after the recorded loss (0 for bars and rods): rating.capacity.sections."""
    d = bridge.design_of(label)
    rep = section_properties(d.section, member=label, findings=bridge.findings_for(label),
                             length_ft=g.member_length_ft(label), where=d.where)
    values = [s_.properties.S_y_in3 for s_ in rep.compression if s_.properties is not None]
    return min(values, default=0.0)


def _bent_tension_only_relied_on(g: TrussGeometry, bridge: Bridge,
                                 dependent: frozenset[str]) -> dict[str, str]:
    """A warning for each bent tension-only member (a counter, a slack-prone main) whose panel
    changes its load path with the live load: the rating counts it as fully effective in
    tension, and the ratings of the panel rest on it (common practice: a bowed rod takes load
    only once straightened; a seized turnbuckle cannot be adjusted)."""
    out = {}
    for m in g.members:
        if not (m.tension_only and m.label in dependent):
            continue
        bent = [f for f in bridge.findings_for(m.label) if f.bar_state is BarState.BENT]
        if not bent:
            continue
        where = ", ".join(dict.fromkeys(f.where for f in bent if f.where))
        bars = _bent_bars(bridge, m.label)
        said = (f"member {m.label} is recorded bent{f' ({where})' if where else ''} and is "
                "counted as fully effective in tension" if not bars else
                f"member {m.label} has {bars} recorded bent{f' ({where})' if where else ''}, "
                "counted as fully effective in tension")
        rests = ("the load path of its panel rests on it when the live load reverses the "
                 "panel's shear" if m.role in (MemberRole.COUNTER, MemberRole.DIAGONAL)
                 else "its force depends on which counters act, and its ratings rest on its "
                 "full section")
        out[m.label] = (
            f"BENT {m.role.value.upper()} RELIED ON: {said}; {rests}. If "
            f"{'it does' if not bars else 'the bent bars do'} not take load (a bowed bar or rod "
            "that does not straighten, a seized turnbuckle), the ratings of that panel may "
            "fall sharply. The engineer should confirm that "
            f"{'it acts' if not bars else 'they act'}, or rate without "
            f"{'it' if not bars else 'them'} by recording "
            f"{'its bars' if not bars else 'them'} as loose.")
    return out


def _bent_bars(bridge: Bridge, member: str) -> str:
    """The bent bars of a member in words ("bar 2", "bar 1, bar 3"); "" where they are the
    whole member (a finding on "all", or every bar of the set bent)."""
    bent = [f for f in bridge.findings_for(member) if f.bar_state is BarState.BENT]
    if any(f.component.strip().lower() == "all" for f in bent):
        return ""
    bars = list(dict.fromkeys(f.component.strip().lower() for f in bent))
    count = getattr(bridge.design_of(member).section, "count", None)
    return "" if count is None or len(bars) >= count else ", ".join(bars)


def _without_bent(member: str, bridge: Bridge, cases: Sequence[RatingCase],
                  capacities: Mapping[str, MemberCapacity] | None = None,
                  against: Mapping[str, CasePosting] | None = None
                  ) -> WithoutMember | None:
    """What the rating gives if a bent tension-only member the ratings rest on does not act:
    the members rated again with all its bars loose (out of service), for the trucks rated at
    the legal level, the emergency vehicles and the permits (:func:`_sensitivity_ids`; HL-93
    and the NRL left out). The pins are not rated again, so the RF given is an upper bound of
    that rating: where it already calls for closing, so would the full one. None where no
    truck is rated.
    ``capacities``: the members' resistances as rated, kept for every member but this one
    (their designs and findings are the same)."""
    trucks = _truck_ids(cases)
    if not trucks:
        return None
    bars = _bent_bars(bridge, member)
    loose = replace(bridge, pins=(), findings=bridge.findings + tuple(
        Finding(member, c, bar_state=BarState.LOOSE, where="(rated as if it did not act)")
        for c in (bars.split(", ") if bars else ["all"])))
    try:
        other = rate_bridge(loose, _sensitivity_ids(cases), what_if=False, capacities={
            lab: cap for lab, cap in (capacities or {}).items() if lab != member})
    except (InputError, ConvergenceError):
        return WithoutMember("a closure to consider", bars=bars)
    return trucks_verdict(other.postings, other.cases, bars, against, _metric(bridge))


def _sensitivity_ids(cases: Sequence[RatingCase]) -> list[str]:
    """The loads a sensitivity rates again: the trucks (:func:`_truck_ids`), the emergency
    vehicles and the permits, whose lower ratings also ask the engineer for a condition
    (:func:`trucks_verdict`); not HL-93 or the NRL screen."""
    return list(dict.fromkeys(c.load.id for c in cases
                              if (c.postable and c.load.id not in SCREENING_LOADS)
                              or c.category.is_permit))


def _truck_ids(cases: Sequence[RatingCase]) -> list[str]:
    """The loads rated at the legal level that decide a posting or closure for trucks (not
    the emergency vehicles, HL-93, the permits or the NRL screen)."""
    return list(dict.fromkeys(c.load.id for c in cases if c.postable
                              and c.category is not VehicleCategory.EMERGENCY
                              and c.load.id not in SCREENING_LOADS))


def trucks_verdict(postings: Mapping[str, CasePosting], cases: Sequence[RatingCase],
                   bars: str = "", against: Mapping[str, CasePosting] | None = None,
                   metric: bool = False) -> WithoutMember | None:
    """What the trucks' ratings give: "a closure to consider", "a posting" or "no
    restriction", with the lowest truck RF, its case and what controls it (None: no truck
    rated, or none with a finite RF); with ``against`` (the rating's own postings), the
    trucks and emergency vehicles whose posting is worse than there (:func:`_worse_posting`;
    ``metric``: the bridge's signs are in tonnes), and the permits carried there and not
    here."""
    trucks = set(_truck_ids(cases))
    legal = [cp for cp in postings.values() if math.isfinite(cp.rf) and cp.case in trucks]
    if not legal:
        return None
    low = min(legal, key=lambda cp: cp.rf)
    closing = [cp for cp in legal if cp.result.action is PostingAction.CLOSE]
    verdict = ("a closure to consider" if closing else "a posting" if any(
        cp.result.action is PostingAction.POST for cp in legal) else "no restriction")
    if not against:
        return WithoutMember(verdict, low.rf, low.case, low.controlling, bars)
    weight = {c.id: c.load.gross_weight_tons for c in cases}
    posted = trucks | {c.id for c in cases if c.category is VehicleCategory.EMERGENCY}
    lowered = tuple((cid, _sign(cp, weight[cid], metric)) for cid, cp in postings.items()
                    if cid in posted and cid in against
                    and _worse_posting(cp, against[cid], weight[cid], metric))
    lost = tuple(cid for cid, cp in postings.items() if cp.permit and cid in against
                 and against[cid].permit == CARRIED and cp.permit != CARRIED)
    return WithoutMember(verdict, low.rf, low.case, low.controlling, bars, lowered, lost)


def _sign(cp: CasePosting, W_tons: float, metric: bool) -> float | None:
    """The safe posting load of a posted case in whole units of the bridge's own (tonnes for
    an SI bridge: rating.lrfr.posting.posting_load, MBE 6A.8.3 [value from memory]); None
    where it is not posted."""
    if cp.result.action is not PostingAction.POST:
        return None
    return posting_load(cp.rf, W_tons / TON_PER_TONNE if metric else W_tons)


def _metric(bridge: Bridge) -> bool:
    """The bridge's posting signs are in tonnes (an SI workbook)."""
    return bridge.settings.units is UnitSystem.SI


_ACTION_RANK = {PostingAction.NONE: 0, PostingAction.POST: 1, PostingAction.CLOSE: 2}


def _worse_posting(a: CasePosting, b: CasePosting, W_tons: float, metric: bool) -> bool:
    """Posting ``a`` restricts the truck more than ``b``: a graver action (posted where it
    was not, closed where it was posted), or a lower safe posting load in whole units of the
    bridge's own (tonnes for an SI bridge, whose signs are worked in tonnes:
    rating.results_build._report_posting; MBE 6A.8.3 [value from memory])."""
    ra, rb = _ACTION_RANK[a.result.action], _ACTION_RANK[b.result.action]
    if ra != rb:
        return ra > rb
    if a.result.action is not PostingAction.POST:
        return False
    return _sign(a, W_tons, metric) < _sign(b, W_tons, metric)


LACING_WINDOW = 1.25
"""A member whose laced or battened section is taken as closed, with a truck rating that,
estimated with its open section, falls within this factor of that truck's controlling RF,
has the bridge's members rated again with those sections open (:func:`_lacing_open`). The
estimate is the rating equation with the open resistance at the closed rating's forces
(exact for a linear rating; on the load path, at the rating level, where the active set may
differ below it): a window of judgement, not a proven bound (common practice for a
screen)."""


def _open_estimate(r: MemberCaseRating, cap: MemberCapacity,
                   cap_open: MemberCapacity | float, dead: tuple[float, float, float],
                   gamma_ll: float, dead_f) -> float:
    """The member's RF for one case with its open section, estimated from its rating with the
    closed one (see ``LACING_WINDOW``): MBE Eq. 6A.4.2.1-1 [value from memory]. ``cap_open``:
    the open capacity, or a factor on the closed resistance."""
    C = cap.factored_resistance("compression")
    C_open = (C * cap_open if isinstance(cap_open, float)
              else cap_open.factored_resistance("compression"))
    if r.dead_at_rating is not None and r.live_at_rating:
        return (C_open - r.dead_at_rating) / (gamma_ll * r.live_at_rating)
    DC, DW, DWs = dead
    D = rating_factor(C, SenseLoads(-DC, -DW, 1.0, DW_surface=-DWs), gamma_ll,
                      dead_f).factored_dead_kip
    return r.rf * (C_open - D) / (C - D) if C - D > 0.0 else -math.inf


def _lacing_open(bridge: Bridge, g: TrussGeometry, cases: Sequence[RatingCase],
                 capacities: Mapping[str, MemberCapacity],
                 ratings: Mapping[tuple[str, str], MemberCaseRating],
                 postings: Mapping[str, CasePosting], pins: Sequence[PinRating],
                 chord: PonyChord | None, weights: Mapping[str, MemberWeight], dead_f,
                 dead: tuple[Mapping[str, float], Mapping[str, float], Mapping[str, float]],
                 torsion_found: dict | None = None) -> LacingOpen | None:
    """What the trucks give if the lacing or battens the ratings take as closing the members'
    open sections do not (loose, broken or missing, or judged unable to carry the shear
    across the open face): the members rated again with those sections open (AASHTO LRFD
    6.9.4.1.3 [value from memory]), for the trucks rated at the legal level, the emergency
    vehicles and the permits (:func:`_sensitivity_ids`), where an estimate says it may change
    a verdict (``LACING_WINDOW``); the other members and the
    pins are as rated (an open section changes its own member's resistance alone). None
    where no such member, no truck, or no estimate near the controlling RF."""
    # (rating.capacity.compression flags such a member where its open form buckles lower)
    flagged = tuple(lab for lab, cap in capacities.items()
                    if cap.open_section in ("laced", "battened"))
    trucks = _truck_ids(cases)
    if not flagged or not trucks:
        return None
    checked = _sensitivity_ids(cases)  # (the trucks, emergency vehicles and permits)
    by_id = {c.id: c for c in cases}

    def near(lab: str, cid: str, open_cap: MemberCapacity | float) -> bool:
        r = ratings.get((lab, cid))
        if r is None or r.sense != "compression" or not 0.0 < r.rf < math.inf:
            return False
        est = _open_estimate(r, capacities[lab], open_cap, tuple(d[lab] for d in dead),
                             by_id[cid].gamma_ll.value, dead_f)
        return est < LACING_WINDOW * postings[cid].rf

    # a first look with the open resistance at its least (the closed one times the ratio of
    # the plain buckling resistances: own-weight bending lowers it less), which needs no
    # open capacity; where that is far from every controlling RF, so is the estimate
    flagged = tuple(lab for lab in flagged if any(
        near(lab, cid, capacities[lab].open_ratio) for cid in checked))
    if not flagged:
        return None
    st = bridge.settings
    lengths = chord.lengths_ft if chord is not None else {}
    open_caps = {lab: member_capacity(
        bridge.design_of(lab), g.member(lab).role, g.member_length_ft(lab),
        bridge.findings_for(lab), g.member(lab).tension_only,
        own_weight_klf=_across_weight_klf(g, g.member(lab), weights[lab], st.detail_allowance),
        gamma_dc=dead_f["gamma_dc_max"].value, KL_out_of_plane_ft=lengths.get(lab),
        torsion_found=torsion_found, connectors_close=False) for lab in flagged}
    if not any(near(lab, cid, open_caps[lab]) for lab in flagged for cid in checked):
        return None
    try:
        other = rate_bridge(replace(bridge, pins=()), checked, what_if=False,
                            capacities={**capacities, **open_caps},
                            open_sections=frozenset(flagged),
                            rated_members=frozenset(flagged))
    except (InputError, ConvergenceError):
        return LacingOpen(flagged, WithoutMember("a closure to consider"), True, None)
    merged = _merged_postings(other.postings, flagged, ratings, pins, postings)
    result = trucks_verdict(merged, other.cases, against=postings, metric=_metric(bridge))
    if result is None:
        return None
    least = min(((other.ratings[(lab, cid)].rf, cid, lab) for cid in trucks for lab in flagged
                 if (lab, cid) in other.ratings), default=None)
    return LacingOpen(flagged, result, bool(result.lowered or result.permits_lost), least)


def _merged_postings(changed: Mapping[str, CasePosting], members: Sequence[str],
                     ratings: Mapping[tuple[str, str], MemberCaseRating],
                     pins: Sequence[PinRating], postings: Mapping[str, CasePosting]
                     ) -> dict[str, CasePosting]:
    """The postings of a rating of ``members`` alone (``changed``: their resistances changed,
    nothing else) merged with the rating's own: the other members and the pins are as rated,
    so where one of them is below the changed members, the rating's own posting holds (its
    controlling member or pin is that one)."""
    merged = {}
    for cid, cp in changed.items():
        rest = min([r.rf for (lab, c), r in ratings.items() if c == cid and lab not in members]
                   + [p.ratings[cid].rf for p in pins if cid in p.ratings], default=math.inf)
        merged[cid] = postings[cid] if rest < cp.rf else cp
    return merged


@dataclass(frozen=True)
class LacingOpen:
    """:func:`_lacing_open`'s finding: the members taken as closed by their lacing or battens,
    what the trucks give with them open, whether that changes the posting of a truck or an
    emergency vehicle (its action or load) or a permit's verdict, and the least of those
    members' truck RFs open (RF, case, member)."""

    members: tuple[str, ...]
    result: WithoutMember
    lowered: bool
    least: tuple[float, str, str] | None


def lacing_text(o: LacingOpen, main: WithoutMember | None) -> str:
    """The warning of :func:`_lacing_open` where the open sections change a posting of a
    truck or an emergency vehicle, or a permit's verdict:
    headed in capitals where they give the trucks a posting or a closure, said plainly
    otherwise."""
    return _sensitivity_warning(
        "LACING RELIED ON", "lacing relied on",
        f"the sections of members {', '.join(o.members)} are open but for their lacing or "
        "battens, which the rating takes as closing them. Rated with them open "
        "(torsional and flexural-torsional buckling, AASHTO LRFD 6.9.4.1.3 [value from "
        "memory]), the other members and the pins as rated", o.result, main,
        "The engineer should confirm the lacing or battens sound from the inspection; "
        "recorded out of action on the Findings sheet, they are rated open")


def lacing_note(o: LacingOpen) -> str:
    """The assumption of :func:`_lacing_open` where the open sections change no posting of
    a truck or an emergency vehicle, nor a permit's verdict."""
    least = ("" if o.least is None else f"; the least of their truck RFs open is "
             f"{reported_rf(o.least[0]):.2f} ({o.least[1]}, {o.least[2]})")
    return (f"Members {', '.join(o.members)}: rated again with their sections open (their "
            "lacing or battens not closing them; AASHTO LRFD 6.9.4.1.3 [value from memory]), "
            "no posting of a truck or an emergency vehicle changes, nor a permit's verdict"
            + least)


@dataclass(frozen=True)
class OlderSteel:
    """The members and pins rated again with the steel of the row before a boundary of the
    steel-by-year table (rating.capacity.materials.older_steel): the members and pins that
    took the default by year, that steel, the boundary year, and what the trucks' ratings
    give."""

    members: tuple[str, ...]
    pins: tuple[str, ...]
    material: Material
    boundary: int
    result: WithoutMember


def _by_year(material: Material | None) -> bool:
    """A steel taken by year of construction (rating.capacity.materials.default_material)."""
    return (material is not None and material.assumed and material.kind is MaterialKind.STEEL
            and material.basis.startswith("default by year ("))


def _older_steel(bridge: Bridge, cases: Sequence[RatingCase],
                 capacities: Mapping[str, MemberCapacity],
                 against: Mapping[str, CasePosting] | None = None) -> OlderSteel | None:
    """A bridge built within a few years after a boundary of MBE Table 6A.6.2.1-1 [value from
    memory] whose members or pins take the steel by year may be of the older steel (rolled or
    ordered before the boundary; common practice): rated again with it, members and pins, for
    the trucks at the legal level, the emergency vehicles and the permits. None where it does
    not apply."""
    older = older_steel(bridge.info.year_built)
    trucks = _truck_ids(cases)
    if older is None or not trucks:
        return None
    mat, edge = older
    by_year = tuple(d.member for d in bridge.member_designs if _by_year(d.material))
    pins = tuple(p.joint for p in bridge.pins if _by_year(p.material))
    if not by_year and not pins:
        return None
    variant = replace(
        bridge,
        pins=tuple(replace(p, material=mat) if p.joint in pins else p for p in bridge.pins),
        member_designs=tuple(replace(d, material=mat) if d.member in by_year else d
                             for d in bridge.member_designs))
    try:
        other = rate_bridge(variant, _sensitivity_ids(cases), what_if=False, capacities={
            lab: cap for lab, cap in capacities.items() if lab not in by_year})
    except (InputError, ConvergenceError):
        return OlderSteel(by_year, pins, mat, edge, WithoutMember("a closure to consider"))
    result = trucks_verdict(other.postings, other.cases, against=against,
                            metric=_metric(bridge))
    return None if result is None else OlderSteel(by_year, pins, mat, edge, result)


LOOP_LOSS_LOCAL = "the loss at its loop"
"""The words of rating.capacity.tension's caution that a loop rod's loss at its loop is rated
as a local section (fracture only), found in a member's capacity warnings."""


def _loop_loss_along(bridge: Bridge, cases: Sequence[RatingCase],
                     capacities: Mapping[str, MemberCapacity],
                     ratings: Mapping[tuple[str, str], MemberCaseRating],
                     pins: Sequence[PinRating], against: Mapping[str, CasePosting],
                     again: Callable[[Sequence[str], Bridge],
                                     dict[tuple[str, str], MemberCaseRating] | None]
                     | None = None
                     ) -> tuple[tuple[str, ...], WithoutMember] | None:
    """Loop rods whose loss at the loop is rated as a local section, where yielding would be
    lower if it ran along the bar around the pin (rating.capacity.tension): rated again with
    that loss recorded on the body, for the trucks at the legal level, the emergency vehicles
    and the permits (the engineer judges where the loss lies: common practice). Those rods
    alone are rated again: a finding changes its own member's resistance and nothing else
    (the truss's stiffness is its sections as built, the pins' bearing the Packing sheet's),
    and the others' ratings and the pins' are merged with theirs. ``again`` rates rods off
    the load path on the rating's own live and dead loads (rate_bridge's); others are rated
    by a rating of those rods alone. The members and what the trucks then give; None where
    no rod is so."""
    members = tuple(sorted(lab for lab, cap in capacities.items()
                           if any(LOOP_LOSS_LOCAL in w for w in cap.warnings)))
    if not members or not _truck_ids(cases):
        return None
    variant = replace(bridge, findings=tuple(
        replace(f, region=FindingRegion.BODY)
        if f.member in members and f.region is FindingRegion.THREAD else f
        for f in bridge.findings))
    ids = _sensitivity_ids(cases)
    quick = again(members, variant) if again is not None else None
    if quick is not None:
        chosen = tuple(c for c in cases if c.load.id in ids)
        kept = {c.id for c in chosen}
        merged = _postings(chosen, {**{k: r for k, r in ratings.items() if k[1] in kept},
                                    **{k: r for k, r in quick.items() if k[1] in kept}},
                           pins, rating_geometry(bridge))
        result = trucks_verdict(merged, chosen, against=against, metric=_metric(bridge))
        return None if result is None else (members, result)
    try:
        other = rate_bridge(replace(variant, pins=()), ids, what_if=False,
                            capacities={lab: cap for lab, cap in capacities.items()
                                        if lab not in members},
                            rated_members=frozenset(members))
    except (InputError, ConvergenceError):
        return members, WithoutMember("a closure to consider")
    merged = _merged_postings(other.postings, members, ratings, pins, against)
    result = trucks_verdict(merged, other.cases, against=against, metric=_metric(bridge))
    return None if result is None else (members, result)


def loop_loss_text(members: Sequence[str], result: WithoutMember,
                   main: WithoutMember | None) -> str:
    """The warning of :func:`_loop_loss_along`: headed in capitals where the loss along the
    loops gives the trucks a posting or a closure."""
    names = ", ".join(members)
    return _sensitivity_warning(
        "LOOP LOSS MAY RUN ALONG THE BAR", "loop loss along the bar",
        f"with the loss recorded at the loops of {names} taken along the bar around the pin "
        "(yielding on the reduced section) instead of as a local section", result, main,
        "The engineer judges where the loss lies; a closer look at the loops, or the loss "
        "recorded on the body, would settle it")


def older_steel_text(o: OlderSteel, year: int, main: WithoutMember | None) -> str:
    """The warning of :func:`_older_steel`: headed in capitals where the older steel gives the
    trucks a posting or a closure (the posting, or its load, then rests on the steel's grade);
    said plainly where it leaves them unrestricted."""
    parts = ([f"{len(o.members)} member{'s' if len(o.members) != 1 else ''}"]
             if o.members else []) + (
        [f"{len(o.pins)} pin{'s' if len(o.pins) != 1 else ''}"] if o.pins else [])
    return _sensitivity_warning(
        "STEEL GRADE NEAR A TABLE BOUNDARY", "steel near a table boundary",
        f"the bridge was built in {year}, within the {NEAR_BOUNDARY_YEARS} years "
        f"{o.boundary}-{o.boundary + NEAR_BOUNDARY_YEARS - 1} after the {o.boundary} "
        "boundary of MBE Table 6A.6.2.1-1 [value from memory]; its "
        f"{' and '.join(parts)} taking the steel by year may be of the older steel "
        f"(F_y = {o.material.F_y:g} ksi, F_u = {o.material.F_u:g} ksi). Rated so", o.result,
        main,
        "Coupon tests, or mill records, would settle the grade")


def without_text(member: str, w: WithoutMember) -> str:
    """The sentence a bent member's warning ends with (:func:`_without_bent`)."""
    if w.rf is None:
        return (f" Rated as if {w.what(member)} did not act, the truss has no load path for "
                "these loads: consider closing.")
    return (f" Rated as if {w.what(member)} did not act ({'its bars' if not w.bars else 'as'}"
            f" loose), the members give {w.verdict}: "
            f"lowest truck RF {reported_rf(w.rf):.2f} ({w.case}, {w.controlling}); the pins "
            "were not rated again, so this RF is the most that rating could give.")


def _case_distribution(cases: Sequence[RatingCase], dist: DistributionResult,
                       of_gauge: Callable[[float], DistributionResult]
                       ) -> tuple[dict[str, float], list[str]]:
    """Each case's fraction of one vehicle to one truss, and notes on the ones that differ
    from the bridge's ``dist``: a vehicle with its own wheel gauge has its own lever rule
    (``of_gauge``); a special permit is rated with one vehicle alone in one lane, the multiple
    presence factor divided out (MBE Table 6A.4.5.4.2a-1, C6A.4.5.4.2a [value from memory]);
    a routine permit, like every other load, with the governing lever-rule case. The owner's
    distribution factor, where given, serves every case as given."""
    out: dict[str, float] = {}
    notes: list[str] = []
    own: dict[float, DistributionResult] = {}
    override = dist.basis == "owner override"
    for c in cases:
        gauge = c.load.wheel_gauge_ft
        if gauge is not None and not override and gauge not in own:
            try:
                own[gauge] = of_gauge(gauge)
            except InputError as e:
                where = next((m.axles.where for m in c.load.models if m.axles), None)
                raise InputError(f"vehicle {c.load.id}: {e.message}", where or e.where) from None
        d = dist if gauge is None or override else own[gauge]
        out[c.id] = d.factor
        why = [] if d is dist else [f"its wheel gauge of {gauge:g} ft (lever rule, "
                                    f"{wheels_text(d.governing)})"]
        if c.category.is_special_permit:
            alone = one_vehicle_alone(d)
            if override:
                notes.append(
                    f"Special permit {c.id} takes the owner's distribution factor "
                    f"{dist.factor:.3f} as given; the permit rules load one lane with the "
                    f"multiple presence factor divided out (lever rule: {alone.share:.3f}; "
                    f"{SOURCE_ONE_VEHICLE}).")
                continue
            out[c.id] = alone.factor
            why.append(f"the permit vehicle alone in one lane, as near the {alone.truss} truss "
                       f"as the lane rules allow ({wheels_text(alone)}), with no multiple "
                       f"presence ({SOURCE_ONE_VEHICLE})")
        if why:
            notes.append(f"{c.id} is rated with {' and '.join(why)}: distribution factor "
                         f"{out[c.id]:.3f}, where the other loads take {dist.factor:.3f}.")
    return out, notes


PUSH_ROUND_OFF = 1e-8
"""The push (a fraction of the largest dead-load force) at which a tension-only member in
forced compression is taken to have to carry compression (:func:`_sense_plans`)."""


SCREENING_LOADS = frozenset({"NRL"})
"""Loads rated as a screen, not posted (the NRL: FHWA SHV Q&A, March 2014)."""


def _dependent_members(lines: dict[frozenset[str], InfluenceLines]) -> frozenset[str]:
    """Members whose influence line changes with the active set of the counter panels."""
    rows = [il.ordinates for il in lines.values()]
    base = rows[0]
    scale = max(float(np.abs(base).max()), 1e-12)
    labels = next(iter(lines.values())).member_labels
    dep = set()
    for r in rows[1:]:
        diff = np.abs(r - base).max(axis=1) > 1e-9 * scale
        dep |= {labels[i] for i in np.nonzero(diff)[0]}
    return frozenset(dep)


LANE_RUN_REACH_PANELS = 2.0
"""For a load with a lane part or a variable axle spacing (HL-93), the members rated on the
load path search the vehicle (spacing, lane segments) of each model that gives one of them
that model's least multiplier among the envelope positions, over this many of the longest
panels each side of where it stands there, not over the whole deck: a window of judgement,
not a proven bound (common practice for a screen); a bar's push is searched over the whole
deck on every member's pattern (:func:`_push_runs_chosen`). On the bundled samples the whole
deck gives the same ratings; on a reviewer's 140 random bridges (every form, 4 to 16 panels)
it gives at most 2.2 % lower (a pin, HL-93, RF 4.7) and 1.3 % (LEGAL-LANE, RF 14), none
controlling (tests/lrfr/test_lane_run_reach.py); before the pushes were searched so it gave
up to 60 % lower on double-intersection trusses."""


SERVICE_II_NOTE = (
    "Every load is rated at the strength limit state. The Service II check that MBE Table "
    "6A.4.2.2-1 gives for steel [value from memory] limits the permanent deformation of "
    "flexural members (their flange stresses, AASHTO LRFD 6.10.4.2 [value from memory]); the "
    "truss members rated here carry axial force (with their own-weight bending combined at "
    "the strength limit state), and the floor system, where it would apply, is not rated "
    "here.")
"""Said once in a rating (common practice for the members of a pin-connected truss)."""


def _screens_said(g: TrussGeometry, pins: Sequence[Pin], cases: Sequence[RatingCase],
                  dependent: frozenset[str]) -> list[str]:
    """The screens of judgement that narrow the searches on the load path, said where they
    act: the reach of a lane load's or variable spacing's runs (:data:`LANE_RUN_REACH_PANELS`)
    and, for the pins at joints with members on the load path, the window and grid of the
    search between positions (rating.lrfr.pins). A reviewer signs numbers whose search was
    narrowed, so the report says how and how far it was checked (common practice)."""
    if not dependent:
        return []
    said = []
    if any(not fixed_axles_only(c.load) for c in cases):
        said.append(
            "On the load path (members whose force depends on which tension-only members act) "
            "a load with a lane part or a variable axle spacing (HL-93) is driven, in the "
            "vehicle chosen for each member (its spacing and lane segments), over "
            f"{LANE_RUN_REACH_PANELS:g} of the longest panels each side of where that member's "
            "multiplier is least among the envelope positions (over the whole deck for a bar "
            "that would have to push): a screen of judgement, not a proven bound (common "
            "practice). On the bundled samples the whole deck gives the same ratings; on test "
            "bridges it gave some ratings up to 2.2 % lower, none of them controlling.")
    if any(set(m.label for m in g.members_at(p.joint)) & dependent for p in pins):
        said.append(
            "Pins at joints with members on the load path are searched between neighbouring "
            "vehicle positions (where the pin reaches its limit as a counter's force passes "
            f"zero) where their multiplier is within {CHANGE_POINT_WINDOW:g} times the load's "
            f"least, on a grid of {KINK_GRID} steps between the two positions: screens of "
            "judgement, not proven bounds (common practice). On the bundled samples a window "
            "of 3.0 and a grid of 256 give the same ratings (to 1e-6).")
    return said


# --------------------------------------------------------------------------- the rating


def rate_bridge(bridge: Bridge, vehicle_ids: Sequence[str] | None = None, *,
                what_if: bool = True,
                capacities: Mapping[str, MemberCapacity] | None = None,
                open_sections: frozenset[str] = frozenset(),
                rated_members: frozenset[str] | None = None) -> BridgeRating:
    """Rate every member and pin of the bridge for every chosen rating load.

    ``what_if``: for each bent tension-only member the ratings rest on, rate the members
    again without it and say what that gives (:func:`_without_bent`); off for that rating
    itself. ``capacities``: resistances already found for members of this geometry with
    the same designs and findings (that rating's, :func:`_without_bent`). ``open_sections``:
    members whose lacing or battens are taken as not closing their sections
    (:func:`_lacing_open`). ``rated_members``: rate only these members (the others have no
    rating, and the postings are theirs and the pins' alone); None: all."""
    known = dict(capacities or {})
    st = bridge.settings
    g = rating_geometry(bridge)
    warnings: list[str] = []
    assumptions: list[str] = []

    dead_f = dead_load_factors(st.wearing_surface_measured)
    weights = {m.label: MemberWeight(gross_area_as_built_in2(bridge.design_of(m.label).section),
                                     bridge.design_of(m.label).material.unit_weight_pcf)
               for m in g.members}
    capacities: dict[str, MemberCapacity] = {}
    # the torsion analysis of each distinct section after loss, shared by the members
    torsion_found: dict = {}

    def capacity_of(m: Member, of: Bridge) -> MemberCapacity:
        """The member's resistance with the design and findings of ``of`` (this bridge, or a
        what-if of it with other findings)."""
        return member_capacity(of.design_of(m.label), m.role, g.member_length_ft(m.label),
                               of.findings_for(m.label), m.tension_only,
                               own_weight_klf=_across_weight_klf(g, m, weights[m.label],
                                                                 st.detail_allowance),
                               gamma_dc=dead_f["gamma_dc_max"].value,
                               torsion_found=torsion_found,
                               connectors_close=m.label not in open_sections)

    for m in g.members:
        design = bridge.design_of(m.label)
        cap = known.get(m.label)
        if cap is None:
            cap = capacity_of(m, bridge)
        capacities[m.label] = cap
        warnings.extend(cap.warnings)
        assumptions.extend(cap.assumptions)
        if design.estimated_at:
            assumptions.append(f"member {m.label}: its section's dimensions are recorded as "
                               "estimated (not measured or taken from plans) and rated as "
                               "given")

    out_of_service = frozenset(
        lab for lab, cap in capacities.items()
        if cap.carries_nothing())
    family = TrussFamily(g, excluded=out_of_service)
    if out_of_service:
        names = ", ".join(sorted(out_of_service))
        if family.is_stable(()):
            warnings.insert(0, (
                f"OUT OF SERVICE: member(s) {names} have every bar loose, missing, broken or "
                "cracked; they are left out of the analysis and the rest of the truss is rated "
                "without them. Repair is a matter for the engineer in responsible charge."))
        else:
            warnings.insert(0, (
                f"OUT OF SERVICE: member(s) {names} have every bar loose, missing, broken or "
                "cracked and the truss cannot stand without them; they are kept in the "
                "analysis with zero resistance, so the rating calls for closing."))
            family = TrussFamily(g)
            out_of_service = frozenset()
    dead = dead_load(g, bridge.cross_section, bridge.dead_loads, weights,
                     st.detail_allowance, st.detail_allowance_given, family=family)
    assumptions.extend(dead.assumptions)
    chord = _chord_on_uframes(g, bridge, capacities, dead, weights, warnings, assumptions,
                              dead_f["gamma_dc_max"].value, torsion_found, open_sections)
    if dead.total.forced_compression:
        warnings.append("under dead load alone the tension-only members "
                        + ", ".join(sorted(dead.total.forced_compression))
                        + " would have to carry compression (the truss cannot stand with "
                        "them slack): an eyebar, a rod or a member marked tension-only cannot "
                        "push. Check each one's section and its tension-only entry on the "
                        "Members sheet (a post or a chord given a bar's section?)")

    configs = active_set_configurations(family, dead.slack_members)
    lines = {c: family.solver(c).influence_lines for c in configs}
    dependent = _dependent_members(lines)
    # (after any OUT OF SERVICE notice: a reviewer reads these first)
    at = sum(1 for w in warnings if w.startswith("OUT OF SERVICE"))
    bent_relied_on = _bent_tension_only_relied_on(g, bridge, dependent)
    warnings[at:at] = list(bent_relied_on.values())
    if dependent:
        assumptions.append(
            "On the load path (members whose force depends on which tension-only members act) "
            "the dead-load factors are taken together, all at their maximum or all at their "
            "minimum, whichever gives the lower rating (AASHTO LRFD 3.4.1 [value from "
            "memory]); DC and DW are not mixed (maximum of one with minimum of the other). "
            "They reach a truss at the same panel points, so their effects rarely differ in "
            "sense (common practice); where a member's DC and DW differ in sign, check it by "
            "hand.")

    dist = lateral_distribution(bridge.cross_section, override=st.distribution_factor_override,
                                prefer=dead.rated_truss)
    if dist.governing.truss != dead.rated_truss:
        assumptions.append(
            f"The dead load is that of the {dead.rated_truss} truss (the heavier) and the live "
            f"load that of the {dist.governing.truss} truss (the larger share): the two are "
            "combined, conservative where they differ (common practice); rating each truss on "
            "its own would give a closer result.")
    warnings.extend(dist.warnings)
    span = g.span_ft
    cases, notes = rating_cases(bridge, vehicle_ids, span)
    assumptions.extend(notes)
    if cases:
        assumptions.append(SERVICE_II_NOTE)
    assumptions.extend(_screens_said(g, bridge.pins, cases, dependent))
    df_of, notes = _case_distribution(cases, dist, lambda gauge: lateral_distribution(
        bridge.cross_section, override=st.distribution_factor_override,
        prefer=dead.rated_truss, wheel_gauge_ft=gauge))
    assumptions.extend(notes)
    if st.wearing_surface_measured:
        if np.any(dead.joint_loads_dw_surface_kip):
            assumptions.append(
                "gamma_DW = 1.25 for the wearing surface (the DW given in psf of deck), whose "
                "thickness was field measured (MBE 6A.4.2.2 [value from memory]); the rest of "
                "DW (utilities) keeps 1.50. A member's gamma_DW shown with its rating is the "
                "weighted value of the two, so gamma_DW x DW is the factored DW.")
        else:
            warnings.append(
                "the wearing surface's thickness is recorded as field measured, but no DW is "
                "given in psf of deck (the wearing surface): gamma_DW = 1.50 is used for all DW")
    DC = {m.label: float(f) for m, f in zip(g.members, dead.member_forces_dc_kip, strict=True)}
    DW = {m.label: float(f) for m, f in zip(g.members, dead.member_forces_dw_kip, strict=True)}
    DWs = {m.label: float(f) for m, f in zip(g.members, dead.member_forces_dw_surface_kip,
                                              strict=True)}

    # a push of round-off size: above the regions' consistency tolerance (1e-11 of the
    # largest dead-load force), far below any force that matters
    push_kip = PUSH_ROUND_OFF * max([1.0] + [abs(DC[lab]) + abs(DW[lab]) for lab in DC])
    dead_states = factored_dead_states(family, dead, dead_f)
    table = RegionTable(family, configs)
    live: dict[tuple[str, str], LiveEffect] = {}
    ratings: dict[tuple[str, str], MemberCaseRating] = {}
    envs = EnvelopeSet(lines, configs, dependent)
    distinct_rows = {m.label: envs.distinct([m.label], configs if m.label in dependent
                                            else configs[:1]) for m in g.members}
    plans_of: dict[str, dict[str, list[_SensePlan]]] = {}
    resist = {lab: _resistances(cap) for lab, cap in capacities.items()}
    for case in cases:
        im, df = case.im.value, df_of[case.id]
        member_envs: dict[str, list[MemberEnvelope]] = {}
        for m in g.members:
            lab = m.label
            if rated_members is not None and lab not in rated_members:
                continue  # (a what-if of some members: the others' live loads are not used)
            # one envelope per distinct line of the member over the active sets, each with
            # the first set that has it (the same maxima as searching every set)
            mine = [(envs.of_row(case.load, im, row), c) for row, c in distinct_rows[lab]]
            best_max = max(((e.max, c) for e, c in mine), key=lambda t: t[0].total_kip(im))
            best_min = min(((e.min, c) for e, c in mine), key=lambda t: t[0].total_kip(im))
            live[(lab, case.id)] = LiveEffect(
                df * best_max[0].value_kip, df * best_min[0].value_kip,
                df * best_max[0].total_kip(im), df * best_min[0].total_kip(im), df,
                best_max[0], best_min[0], best_max[1], best_min[1])
            if lab in out_of_service:
                ratings[(lab, case.id)] = MemberCaseRating(
                    lab, case.id, math.inf, "", "out of service: every bar loose, missing, "
                    "broken or cracked; left out of the analysis", "linear", 0.0, 0.0,
                    case.gamma_ll.value, im, 0.0, capacities[lab].phi_c,
                    capacities[lab].phi_s, None)
                continue
            if rated_members is None or lab in rated_members:
                member_envs[lab] = [e for e, _ in mine]
        plans = {lab: _sense_plans(g.member(lab), resist[lab], case, df, envs_here,
                                   lab in dependent, push_kip)
                 for lab, envs_here in member_envs.items()}
        plans_of[case.id] = plans
        for lab, pl in plans.items():
            if lab not in dependent:
                ratings[(lab, case.id)] = _rate_linear(g.member(lab), capacities[lab], case,
                                                       DC[lab], DW[lab], DWs[lab], pl, dead_f)
    # The members whose force depends on the counters' active set, and the pins: every
    # position of every rating load on its exact load path, all at once (one load at one IM
    # serves all its rating levels: lam is found with gamma_LL = 1)
    groups: dict[tuple[str, float, float], list[RatingCase]] = {}
    for case in cases:
        groups.setdefault((case.load.id, case.im.value, df_of[case.id]), []).append(case)
    group_cases = [tuple(gc) for gc in groups.values()]
    group_plans = [plans_of[gc[0].id] for gc in group_cases]
    batch = PositionBatch([_positions(g, gc[0], df_of[gc[0].id], envs, distinct_rows, pl,
                                      dependent, table, dead_states)
                           for gc, pl in zip(group_cases, group_plans, strict=True)])
    stores = {fs: PathStore(table, fs, P, state, batch.p)
              for fs, (P, state) in dead_states.items()}
    on_path = _member_multipliers(g, stores, batch, group_plans, dependent)
    for gi, (gc, plans) in enumerate(zip(group_cases, group_plans, strict=True)):
        for case in gc:
            for lab, pls in plans.items():
                if lab in dependent and not pls:  # (the vehicle does not load it)
                    ratings[(lab, case.id)] = _dead_alone(g.member(lab), capacities[lab], case,
                                                          DC[lab], DW[lab], DWs[lab], dead_f)
                elif lab in dependent:
                    r = _rate_on_path(g.member(lab), capacities[lab], case, pls,
                                      [on_path[(gi, lab, pl.sense)] for pl in pls],
                                      lambda k: table.slack[k])
                    if (r.sense == "compression" and g.member(lab).tension_only
                            and 0.0 < r.rf < math.inf and not _push_confirmed(
                                family, g, lab, r, case, df_of[case.id], push_kip,
                                dead_states)):
                        # the regions' path forced the bar where the exact path does not:
                        # rated by its tension alone, as before such bars were rated to push
                        pull = [pl for pl in pls if pl.sense > 0]
                        r = _rate_on_path(g.member(lab), capacities[lab], case, pull,
                                          [on_path[(gi, lab, pl.sense)] for pl in pull],
                                          lambda k: table.slack[k])
                    ratings[(lab, case.id)] = r
    fs_max = (dead_f["gamma_dc_max"].value, dead_f["gamma_dw_max"].value)
    load_paths = LoadPaths(tuple(group_cases), batch, stores[fs_max])
    pins = rate_pins(bridge.pins, g, bridge, dead, dead_f, load_paths, dependent)
    if pins:
        assumptions.append(
            "Pins are rated with phi_c = phi_s = 1.0: the condition and system factors of MBE "
            "6A.4.2.3 and 6A.4.2.4 [value from memory] are given for members, and a pin inside "
            "its packing cannot be inspected; the condition of the bars at a joint is not "
            "carried to its pin. Where a joint is in poor condition (pack rust, worn or loose "
            "bars), the engineer may scale the pin's rating by the members' phi_c phi_s.")
        assumptions.extend(f"pin at joint {p.joint}: its dimensions (or those of a plate on it) "
                           "are recorded as estimated (not measured or taken from plans) and "
                           "rated as given" for p in bridge.pins if p.estimated_at)
    postings = _postings(cases, ratings, pins, g)
    warnings.extend(_pony_top_chord(g, postings, on_uframes=any(
        a.startswith(UFRAME_ASSUMPTION) for a in assumptions)))
    # what sets a posting, a closure or a barring (not a rating of 1.0 or more, nor a screen)
    deciding = {cid for cid, cp in postings.items()
                if any(c.id == cid and c.postable for c in cases) and not cp.screened_out
                and cp.result.action in (PostingAction.POST, PostingAction.CLOSE)}
    controlling = {postings[cid].controlling for cid in deciding}
    warnings.extend(_bars_that_would_push(g, ratings, dependent, controlling))
    warnings.extend(_torsional_not_checked(ratings, capacities, postings, deciding))
    warnings.extend(_estimated_loss_governs(ratings, postings, deciding))
    warnings.extend(_estimated_section_governs(ratings, postings, deciding, bridge))
    for p in pins:
        warnings.extend(_pin_bearing_as_built(w, p.joint, controlling) for w in p.warnings)
        assumptions.extend(p.assumptions)
    warnings[:] = [_loop_rod_controls(w, controlling) for w in warnings]
    without: dict[str, WithoutMember] = {}
    conditions: list[Condition] = []
    if what_if:
        # a bent member's rating leaves the pins out: its postings are compared with the
        # members' own, like with like (a truck a pin controls would hide a lower member)
        members_only = _postings(cases, ratings, (), g) if bent_relied_on else {}
        for member, text in bent_relied_on.items():
            w = _without_bent(member, bridge, cases, capacities, members_only)
            if w is not None:
                without[member] = w
                warnings[warnings.index(text)] = text + without_text(member, w)
        main = trucks_verdict(postings, cases)
        older = _older_steel(bridge, cases, capacities, postings)
        if older is not None and bridge.info.year_built is not None:
            warnings.append(older_steel_text(older, bridge.info.year_built, main))
            conditions.append(Condition(
                "the steel is confirmed of the later grade (coupon tests or mill records)",
                f"the steel is the older grade (F_y {older.material.F_y:g} ksi)",
                older.result))
        lacing = _lacing_open(bridge, g, cases, capacities, ratings, postings, pins, chord,
                              weights, dead_f, (DC, DW, DWs), torsion_found)
        if lacing is not None and lacing.lowered:
            # (it says with numbers what the head of a deciding laced member says in words)
            warnings[:] = [w for w in warnings if not w.startswith(OPEN_SECTION)]
            warnings.append(lacing_text(lacing, main))
            members = ", ".join(lacing.members)
            conditions.append(Condition(
                f"the lacing or battens of {members} are confirmed sound (they close the "
                "sections)", f"the sections of {members} are open", lacing.result))
        elif lacing is not None:
            assumptions.append(lacing_note(lacing))

        def linear_again(labs: Sequence[str], variant: Bridge
                         ) -> dict[tuple[str, str], MemberCaseRating] | None:
            """The ratings of members off the load path with the findings of ``variant``: the
            same live loads and dead loads, their resistances alone changed (None where one
            of them is on the load path, or out of service)."""
            if any(lab in dependent or lab in out_of_service for lab in labs):
                return None
            out = {}
            for lab in labs:
                m = g.member(lab)
                cap = capacity_of(m, variant)
                res = _resistances(cap)
                for case in cases:
                    pls = [replace(pl, capacity=res[pl.name][0], check=res[pl.name][1])
                           for pl in plans_of[case.id][lab]]
                    out[(lab, case.id)] = _rate_linear(m, cap, case, DC[lab], DW[lab],
                                                       DWs[lab], pls, dead_f)
            return out

        loops = _loop_loss_along(bridge, cases, capacities, ratings, pins, postings,
                                 again=linear_again)
        if loops is not None:
            warnings.append(loop_loss_text(*loops, main))
            names = ", ".join(loops[0])
            conditions.append(Condition(
                f"the loss at the loop{'s' if len(loops[0]) > 1 else ''} of {names} is "
                "confirmed local (not along the bar around the pin)",
                f"the loss at the loop{'s' if len(loops[0]) > 1 else ''} of {names} runs "
                "along the bar", loops[1]))
        hips = _hips_hinged(bridge, cases, chord, postings)
        if hips is not None:
            warnings.append(hips_text(*hips, main))
            conditions.append(Condition(
                "the top chord is confirmed continuous out of plane at the hips "
                f"({', '.join(hips[0])})",
                f"the top chord is hinged at the hips ({', '.join(hips[0])})", hips[1]))
    at = sum(1 for w in warnings if w.startswith("OUT OF SERVICE"))
    warnings[at:at] = _dead_load_past_resistance(ratings, cases, pins)
    return BridgeRating(
        bridge=bridge, geometry=g, capacities=capacities, dead=dead, lines=lines[configs[0]],
        configs=configs, lines_by_config=lines, cases=cases, live=live, ratings=ratings, pins=pins,
        postings=postings, distribution_factor=dist.factor,
        distribution_note=dist.description,
        dependent_members=dependent,
        warnings=tuple(dict.fromkeys(warnings)), assumptions=tuple(dict.fromkeys(assumptions)),
        provisions=tuple(dict.fromkeys(
            [f.describe() for f in dead_f.values()]
            + [c.gamma_ll.describe() for c in cases] + [c.im.describe() for c in cases])),
        without=without, conditions=tuple(conditions),
    )


def factored_dead_states(family: TrussFamily, dead: DeadLoadResult, dead_f
                         ) -> dict[tuple[float, float], tuple[np.ndarray, ActiveSetSolution]]:
    """Factored dead-load joint loads and their tension-only states, maximum and minimum
    factor sets (AASHTO LRFD Table 3.4.1-2 [V]); the same for every vehicle position."""
    out = {}
    for gd, gw, bound in ((dead_f["gamma_dc_max"].value, dead_f["gamma_dw_max"].value, "max"),
                          (dead_f["gamma_dc_min"].value, dead_f["gamma_dw_min"].value, "min")):
        # (keyed by the nominal factors; a measured wearing surface takes its own within DW)
        P = gd * dead.joint_loads_dc_kip + factored_dw(
            dead.joint_loads_dw_kip, dead.joint_loads_dw_surface_kip, dead_f, bound)
        out[(gd, gw)] = (P, solve_tension_only(family.geometry, P, family=family))
    return out


@dataclass(frozen=True)
class _SensePlan:
    """One sense a member is rated in for one case: its extremes and resistance."""

    sense: int
    name: str
    extremes: tuple[Extreme, ...]
    ll: tuple[float, ...]
    capacity: float
    check: object


def _sense_plans(m: Member, resist: Mapping[str, tuple[float, object]], case: RatingCase,
                 df: float, envs, dependent: bool, push_kip: float = 0.0) -> list[_SensePlan]:
    """The senses in which the vehicle loads the member (tension, compression), each with its
    extremes over the active sets and its factored resistance and governing check
    (``resist`` by sense name, :func:`_resistances`). The dead-load factors follow from the
    sign of the dead load in the sense rated (rating.lrfr.equation.rating_factor).

    A tension-only member on the load path goes slack rather than push, so its force never
    turns to compression, unless the truss cannot stand without it: then it is in forced
    compression (rating.analysis.regions.RegionTable._can_let_go), which a bar cannot carry;
    the truss is a mechanism from there on. Its compression is rated against ``push_kip``, a
    push of round-off size (not zero: a slack member's force is zero all along), so that
    the least lam at which it would have to push limits its rating (common practice: an
    eyebar or rod has no compression resistance)."""
    im = case.im.value
    plans = []
    for sense, name in SENSES:
        extremes = tuple(e.max if sense > 0 else e.min for e in envs)
        ll = tuple(sense * df * e.total_kip(im) for e in extremes)
        if max(ll) <= 0:
            continue  # the vehicle does not load the member this way
        capacity, check = resist[name]
        if sense < 0 and m.tension_only and dependent:
            capacity = push_kip  # (its compression resistance is zero)
        plans.append(_SensePlan(sense, name, extremes, ll, capacity, check))
    return plans


def _resistances(cap: MemberCapacity) -> dict[str, tuple[float, object]]:
    """The member's factored resistance and governing check in each sense (the same for
    every rating case)."""
    return {name: (cap.factored_resistance(name), cap.governing(name)) for _, name in SENSES}


@dataclass(frozen=True, eq=False)
class _OnPath:
    """One member and sense on the load paths of every position of one load: lam (gamma_LL
    = 1) at each candidate, block by block for each dead-load factor set (the maximum first),
    each block over the same positions ``rows`` (indices of :attr:`_Candidates`)."""

    lam: np.ndarray
    rows: np.ndarray
    factor_sets: tuple[tuple[float, float], ...]
    candidates: _Candidates
    dead: np.ndarray  # the member's factored dead-load and live-load forces in the sense
    live: np.ndarray  # rated at each candidate's crossing, and the active set there (index
    sets: np.ndarray  # in the region table; -1 for none): rating.lrfr.multiplier.state_at

    def factors(self, k: int) -> tuple[float, float]:
        return self.factor_sets[k // self.rows.size]

    def extreme(self, k: int) -> Extreme:
        return self.candidates.extreme(int(self.rows[k % self.rows.size]))


@dataclass(frozen=True, eq=False)
class _Candidates:
    """The positions of the batch followed by the points added between them."""

    batch: PositionBatch
    extra: list[Extreme]

    def extreme(self, j: int) -> Extreme:
        n = self.batch.size
        return self.batch.extreme(j) if j < n else self.extra[j - n]


def _positions(g: TrussGeometry, case: RatingCase, df: float, envs: EnvelopeSet,
               distinct_rows: dict, plans: dict[str, list[_SensePlan]],
               dependent: frozenset[str], table: RegionTable, dead_states
               ) -> PositionSet:
    """The positions of one load searched on the load path: the runs of its vehicle, then
    the envelope positions of every member in every distinct active set (critical for some
    member or for a pin's members) not on a run.

    For a load with a lane part or a variable spacing (HL-93) the runs are those of the
    vehicle (spacing, lane segments) of each model at which each member rated on the path has
    its least multiplier among that model's envelope positions, both ways, over
    :data:`LANE_RUN_REACH_PANELS` panels each side of where it stands there (over the whole
    deck for a bar's push, :func:`_sense_plans`)."""
    im = case.im.value
    loose: dict[tuple, Extreme] = {}
    for m in g.members:
        for row, _ in distinct_rows[m.label]:
            me = envs.of_row(case.load, im, row)
            for e in (me.max, me.min):
                if e.position is not None or e.lane_segments_ft:
                    loose.setdefault(position_key(e), e)
    loose_list = list(loose.values())
    if fixed_axles_only(case.load):
        return PositionSet(g.deck_stations_ft, case.load, im, df, loose_list,
                           runs_of(case.load, ()))
    ps = PositionSet(g.deck_stations_ft, case.load, im, df, loose_list, ())
    _, member, sense, cap = _requests(g, [plans], dependent)
    if not member.size or not ps.size:
        return ps
    lam = np.min([first_crossings(table.pieces(fs, P, state, ps.p), member, sense, cap)[0]
                  for fs, (P, state) in dead_states.items()], axis=0)
    # each model's least for each member (the design tandem's run as well as the truck's):
    # the least among the envelope positions can be one model's while another's run holds
    # the least on the path (a reviewer found a hanger 10 % high so)
    models = [ps.extreme(i).model for i in range(ps.size)]
    of_model = [np.array([i for i, mo in enumerate(models) if mo == name], dtype=int)
                for name in dict.fromkeys(models)]
    # a bar that would have to push (:func:`_sense_plans`) is searched over the whole deck:
    # where it pushes depends on which sets the path meets, not on its envelope (a reviewer's
    # bar rated 1.60 within the reach and 0.60 over the whole deck)
    push = [bool(sense[r] < 0) and g.members[int(member[r])].tension_only
            for r in range(member.size)]
    chosen: tuple[list[Extreme], list[Extreme]] = ([], [])
    for r in range(member.size):
        chosen[push[r]].extend(ps.extreme(int(ix[first_of_least(lam[ix, r])]))
                               for ix in of_model if np.isfinite(lam[ix, r]).any())
    reach = LANE_RUN_REACH_PANELS * float(np.diff(g.deck_stations_ft).max())
    if any(push):
        chosen[True].extend(_push_runs_chosen(g, case, df, table, dead_states,
                                              chosen[True] + chosen[False], member, sense,
                                              cap, np.asarray(push)))
    whole = runs_of(case.load, chosen[True], math.inf)
    done = {run_key(w) for w in whole}
    near = [run for run in runs_of(case.load, chosen[False], reach) if run_key(run) not in done]
    return PositionSet(g.deck_stations_ft, case.load, im, df, loose_list, whole + near,
                       loose_loads=ps.p)


def _push_runs_chosen(g: TrussGeometry, case: RatingCase, df: float, table: RegionTable,
                      dead_states, extremes: list[Extreme], member: np.ndarray,
                      sense: np.ndarray, cap: np.ndarray, push: np.ndarray) -> list[Extreme]:
    """For the bars that would have to push (``push``, over the requests ``member``,
    ``sense``, ``cap``): one position of each whole-deck run of the vehicles (spacing, lane
    segments) among ``extremes`` on which some bar's push is reached at a position.

    Where a bar pushes depends on which tension-only members the loading lets go, and a lane
    pattern chosen for another member can be the one that does it (a reviewer's hanger rated
    0.79 for HL-93 on its own patterns, 0.60 on another member's). Every pattern is driven
    over the whole deck for these requests alone, on the paths the region table knows (no
    walk: a screen), and the runs where a push is reached join the search, whose least can
    lie between two of their positions (common practice for a screen; the rating is then
    confirmed on the walked path, :func:`_push_confirmed`)."""
    runs = runs_of(case.load, extremes, math.inf)
    ps = PositionSet(g.deck_stations_ft, case.load, case.im.value, df, (), runs)
    if not ps.size:
        return []
    rq = np.flatnonzero(push)
    lam = np.min([first_crossings(table.pieces(fs, P, state, ps.p, walk=False), member[rq],
                                  sense[rq], cap[rq])[0]
                  for fs, (P, state) in dead_states.items()], axis=0)
    reached = np.isfinite(lam).any(axis=1)
    out = {run_key(ps.extreme(i)): ps.extreme(i) for i in np.flatnonzero(reached).tolist()}
    return list(out.values())


def _requests(g: TrussGeometry, group_plans: list[dict[str, list[_SensePlan]]],
              dependent: frozenset[str]
              ) -> tuple[list[tuple[str, int]], np.ndarray, np.ndarray, np.ndarray]:
    """Every (member, sense) rated on the load path for any of the loads, in order: the
    keys, member indices, senses (+1/-1) and factored resistances."""
    req: dict[tuple[str, int], float] = {}
    for plans in group_plans:
        for lab, pls in plans.items():
            if lab in dependent:
                for pl in pls:
                    req.setdefault((lab, pl.sense), pl.capacity)
    keys = list(req)
    return (keys, np.array([g.member_index[lab] for lab, _ in keys], dtype=int),
            np.array([s_ for _, s_ in keys], dtype=float),
            np.array(list(req.values()), dtype=float))


def _member_multipliers(g: TrussGeometry, stores: dict[tuple[float, float], PathStore],
                        batch: PositionBatch, group_plans: list[dict[str, list[_SensePlan]]],
                        dependent: frozenset[str]) -> dict[tuple[int, str, int], _OnPath]:
    """lam of every dependent member in every sense it is rated in, for each load (its index
    in the batch), at every position of the load and at the points between neighbouring
    positions that can lower it (rating.lrfr.multiplier), both dead-load factor sets: whether
    the dead load adds to or relieves the effect at the rating level is not known beforehand,
    a slack counter carries none, so both are tried (AASHTO LRFD 3.4.1 [V])."""
    keys, member, sense, cap = _requests(g, group_plans, dependent)
    if not keys:
        return {}
    n_groups = len(group_plans)
    used = np.zeros((n_groups, len(keys)), dtype=bool)
    for gi, plans in enumerate(group_plans):
        for r, (lab, s_) in enumerate(keys):
            used[gi, r] = lab in plans and any(pl.sense == s_ for pl in plans[lab])
    def least() -> np.ndarray:
        best = np.full((n_groups, len(keys)), -np.inf)
        for gi in range(n_groups):
            rows = batch.rows(gi)
            if rows.stop > rows.start:
                low = np.min([v[rows].min(axis=0) for v in lam.values()], axis=0)
                best[gi] = np.where(used[gi], low, -np.inf)
        return best

    def crossings(pc) -> tuple[np.ndarray, np.ndarray, np.ndarray, np.ndarray]:
        lam_, slot = first_crossings(pc, member, sense, cap)
        return (lam_, *state_at(pc, slot, member, sense))

    found = {fs: crossings(st.pieces) for fs, st in stores.items()}
    lam = {fs: f[0] for fs, f in found.items()}
    best = least()
    # a path the family covers only so far is walked on where the member's limit, not met
    # on the part known, could lie below the least found
    for fs, st in stores.items():
        at = best[batch.group]
        unknown = np.isinf(lam[fs]) & (st.pieces.cover[:, None] < at)
        need = np.where(unknown, np.where(np.isfinite(at), at * (1.0 + 1e-6), LAM_MAX),
                        0.0).max(axis=1, initial=0.0)
        if st.complete(need):
            found[fs] = crossings(st.pieces)
            lam[fs] = found[fs][0]
    best = least()
    pairs, ts = [], []
    per_interval = best[batch.group[batch.intervals[:, 0]]] if batch.intervals.size else best[:0]
    for st in stores.values():
        i, t = kink_points(st.pieces, batch.intervals, member, sense, cap, per_interval)
        pairs.append(batch.intervals[i])
        ts.append(t)
    extra: list[Extreme] = []
    extra_group = np.zeros(0, dtype=int)
    if any(t.size for t in ts):
        p_new, extra, extra_group = batch.between(np.concatenate(pairs), np.concatenate(ts))
        for fs, st in stores.items():
            more = crossings(st.more(p_new))
            found[fs] = tuple(np.concatenate([a, b]) for a, b in  # type: ignore[assignment]
                              zip(found[fs], more, strict=True))
    cands = _Candidates(batch, extra)
    order = tuple(found)
    out: dict[tuple[int, str, int], _OnPath] = {}
    for gi in range(n_groups):
        rows = np.concatenate([np.arange(batch.size)[batch.rows(gi)],
                               batch.size + np.flatnonzero(extra_group == gi)])
        lam_s, dead_s, live_s, set_s = (np.concatenate([found[fs][i][rows] for fs in order],
                                                       axis=0) for i in range(4))
        for r, (lab, s_) in enumerate(keys):
            if used[gi, r]:
                out[(gi, lab, s_)] = _OnPath(lam_s[:, r], rows, order, cands, dead_s[:, r],
                                             live_s[:, r], set_s[:, r])
    return out


def _rate_linear(m: Member, cap: MemberCapacity, case: RatingCase, DC: float, DW: float,
                 DWs: float, plans: list[_SensePlan], dead_f) -> MemberCaseRating:
    """The member's rating for one case by the linear equation on its envelope, where its line
    does not depend on the counters' active set (MBE 6A.4.2.1 [value from memory])."""
    best: MemberCaseRating | None = None
    for pl in plans:
        k = int(np.argmax(pl.ll))
        r = rating_factor(pl.capacity, SenseLoads(pl.sense * DC, pl.sense * DW, pl.ll[k],
                                                  DW_surface=pl.sense * DWs),
                          case.gamma_ll.value, dead_f)
        cand = _record(m, cap, case, pl, r.rf, "linear", r.gamma_dc, r.gamma_dw,
                       pl.extremes[k])
        if best is None or cand.rf < best.rf:
            best = cand
    return best if best is not None else _dead_alone(m, cap, case, DC, DW, DWs, dead_f)


DEAD_ALONE = "dead load alone"
"""The method of a member the vehicle does not load whose factored dead load is past its
resistance: its RF is -inf (C - D < 0 over no live load)."""


def _dead_alone(m: Member, cap: MemberCapacity, case: RatingCase, DC: float, DW: float,
                DWs: float, dead_f) -> MemberCaseRating:
    """A member the vehicle does not load: "not loaded" (RF +inf), unless its factored dead
    load alone is past its resistance in the sense it acts, where no live load at all can be
    carried: RF -inf (MBE 6A.4.2.1 [value from memory], C - gamma_D D < 0 with LL = 0)."""
    for sense, name in SENSES:
        r = rating_factor(cap.factored_resistance(name),
                          SenseLoads(sense * DC, sense * DW, 0.0, DW_surface=sense * DWs),
                          case.gamma_ll.value, dead_f)
        if r.factored_dead_kip > 0.0 and lower_beyond_round_off(r.capacity_kip,
                                                                 r.factored_dead_kip):
            pl = _SensePlan(sense, name, (), (0.0,), r.capacity_kip, cap.governing(name))
            return _record(m, cap, case, pl, -math.inf, DEAD_ALONE, r.gamma_dc, r.gamma_dw,
                           None)
    return _not_loaded(cap, m.label, case)


def _push_confirmed(family: TrussFamily, g: TrussGeometry, member: str, r: MemberCaseRating,
                    case: RatingCase, df: float, push_kip: float, dead_states) -> bool:
    """Whether the exact load path, walked a change of active set at a time
    (rating.analysis.path), has the tension-only ``member`` pushing where its rating says it
    would (:func:`_sense_plans`): the regions' paths are found from the intervals of the
    sets the family has met, and where a bar is in forced compression in one of them they
    can take it where the walk does not (a reviewer found ratings of half the walk's so).
    Common practice: the exact path is the reference."""
    if r.extreme is None:
        return True
    P_dead, state = dead_states[(r.gamma_dc, r.gamma_dw)]
    P_live = live_joint_loads(g, case.load, r.extreme, case.im.value, df)
    lam = r.rf * case.gamma_ll.value
    walked, _ = member_load_multiplier(family, member, -1, push_kip, P_dead, P_live,
                                       lam_max=lam * 1.01 + 1e-6, dead_state=state)
    return walked <= lam * (1.0 + 1e-6) + 1e-9


def _rate_on_path(m: Member, cap: MemberCapacity, case: RatingCase, plans: list[_SensePlan],
                  found: list[_OnPath],
                  slack_of: Callable[[int], frozenset[str]]
                  ) -> MemberCaseRating:
    """The member's rating for one case: the least live-load multiplier over its candidates
    (found with gamma_LL = 1). Where the factored dead load alone is past the resistance the
    multiplier is the (negative) extrapolation (C - dead) / live, and the rating is the one
    with the largest live-load effect, the least negative, as the linear equation gives it (a
    position barely loading the member would give -inf)."""
    g_ll = case.gamma_ll.value
    best: MemberCaseRating | None = None
    for pl, op in zip(plans, found, strict=True):
        lam = op.lam
        past = lam < 0.0
        if past.any():
            finite = past & np.isfinite(lam)
            k = (int(np.flatnonzero(finite)[np.argmax(lam[finite])]) if finite.any()
                 else int(np.flatnonzero(past)[0]))
        else:
            k = first_of_least(lam)
            if not math.isfinite(lam[k]):
                continue
        g_dc, g_dw = op.factors(k)
        cand = replace(_record(m, cap, case, pl, float(lam[k]) / g_ll, "load multiplier",
                               g_dc, g_dw, op.extreme(k)),
                       dead_at_rating=float(op.dead[k]) if op.sets[k] >= 0 else None,
                       live_at_rating=float(op.live[k]) if op.sets[k] >= 0 else None,
                       slack_at_rating=tuple(sorted(slack_of(int(op.sets[k]))))
                       if op.sets[k] >= 0 else ())
        if best is None or cand.rf < best.rf:
            best = cand
    return best if best is not None else _not_loaded(cap, m.label, case)


def _record(m: Member, cap: MemberCapacity, case: RatingCase, pl: _SensePlan, rf: float,
            method: str, g_dc: float, g_dw: float, ext: Extreme | None) -> MemberCaseRating:
    check = pl.check
    return MemberCaseRating(
        m.label, case.id, float(rf), pl.name,
        check.name if check is not None else "no compression resistance", method, g_dc, g_dw,
        case.gamma_ll.value, case.im.value, check.phi if check is not None else 0.0,
        cap.phi_c, cap.phi_s, ext, check.finding if check is not None else None)


def _not_loaded(cap: MemberCapacity, label: str, case: RatingCase) -> MemberCaseRating:
    return MemberCaseRating(label, case.id, math.inf, "", "not loaded by this vehicle",
                            "linear", 0.0, 0.0, case.gamma_ll.value, case.im.value, 0.0,
                            cap.phi_c, cap.phi_s, None)


def _postings(cases, ratings, pins, g) -> dict[str, CasePosting]:
    out: dict[str, CasePosting] = {}
    nrl_ok = None
    for case in cases:
        rf, who = math.inf, ""
        rated = [(m.label, ratings[(m.label, case.id)]) for m in g.members
                 if (m.label, case.id) in ratings]
        for lab, r in rated:
            if lower_beyond_round_off(r.rf, rf):
                rf, who = r.rf, lab
        for p in pins:
            r = p.ratings.get(case.id)
            if r is not None and lower_beyond_round_off(r.rf, rf):
                rf, who = r.rf, f"pin at {p.joint}"
        alike = ()
        if math.isfinite(rf):
            alike = tuple(
                [lab for lab, r in rated if lab != who and not lower_beyond_round_off(rf, r.rf)]
                + [f"pin at {p.joint}" for p in pins if f"pin at {p.joint}" != who
                   and p.ratings.get(case.id) is not None
                   and not lower_beyond_round_off(rf, p.ratings[case.id].rf)])
        W = case.load.gross_weight_tons
        result = posting(rf, W)
        if not case.postable:
            result = replace(result, posting_tons=None, action=PostingAction.NONE)
            out[case.id] = CasePosting(case.id, rf, who, result, note=(
                f"design-load rating at the {case.level.value} level; posting is decided from "
                "the legal loads"), alike=alike)
            continue
        out[case.id] = CasePosting(case.id, rf, who, result, note=result.reason, alike=alike)
        if case.load.id == "NRL":
            nrl_ok = rf >= 1.0
            if not nrl_ok:  # a screening load: the SHVs themselves are rated and posted
                out[case.id] = CasePosting(
                    case.id, rf, who, replace(result, posting_tons=None,
                                              action=PostingAction.NONE),
                    note=("screening load: with RF below 1.0 the single-unit specialized hauling "
                          "vehicles (SHVs) are rated "
                          "and posted one by one (FHWA SHV Q&A, March 2014)"), alike=alike)
    # the permits, once the legal loads are known: none over a bridge restricted for them
    restricted = any(out[c.id].result.action in (PostingAction.POST, PostingAction.CLOSE)
                     and not out[c.id].screened_out for c in cases if c.postable
                     and c.category is not VehicleCategory.EMERGENCY)
    for case in cases:
        if case.category.is_permit:
            verdict, note = permit_verdict(case.category, out[case.id].rf, case.im.value,
                                           restricted)
            out[case.id] = replace(out[case.id], note=note, permit=verdict)
    if nrl_ok:
        for cid, cp in out.items():
            if cid not in SHVS:
                continue
            if cp.rf >= 1.0:
                out[cid] = replace(cp, screened_out=True, note=(
                    "NRL rating factor is at least 1.0, so this single-unit SHV need not be "
                    "rated (FHWA SHV Q&A, March 2014); shown for information."))
            else:  # the NRL does not cover it here (e.g. a member the load reverses)
                out[cid] = replace(cp, note=(
                    "rated below 1.0 although the NRL rates at least 1.0: the NRL does not "
                    "cover this SHV for the member that controls it, so it is posted on its "
                    "own" + (f"; {cp.note}" if cp.note else "")))
    return out


CARRIED, NOT_AS_REQUESTED, NOT_OVER_RESTRICTED = (
    "can be carried", "not as requested", "not over a bridge restricted for legal loads")
"""A permit load's verdict: its RF at least 1.0 as printed and the bridge carrying the legal
loads; below 1.0; at least 1.0 on a bridge that is itself to be posted or closed for the
legal loads (MBE 6A.4.5 [value from memory])."""


def permit_conditions(category: VehicleCategory, im: float) -> str:
    """The conditions a permit type is rated under (MBE Table 6A.4.5.4.2a-1 [value from
    memory]); an escorted permit rated without IM is held to a crawl (MBE 6A.4.5.5)."""
    text = provisions()["permit"][category.value]["conditions"]
    if category is VehicleCategory.PERMIT_ESCORTED and im == 0.0:
        text += ", held to a crawl (rated without dynamic load allowance)"
    return text


def permit_verdict(category: VehicleCategory, rf: float, im: float,
                   restricted: bool = False) -> tuple[str, str]:
    """What a permit load's rating factor says of the permit, for the engineer's decision,
    as (verdict, note): at least 1.0 as printed, the truss members and pins carry it under
    the conditions of its type; below, not as requested; and none is issued over a bridge
    that is itself to be posted or closed for the legal loads (``restricted``; MBE 6A.4.5
    [value from memory], the owner's policy governs). A permit never posts or closes."""
    kind = f"permit load ({category.value}; {permit_conditions(category, im)})"
    if reported_rf(rf) >= 1.0 and restricted:
        return NOT_OVER_RESTRICTED, (
            f"{kind}: RF at least 1.0, but the bridge itself is to be posted or closed for the "
            "legal loads, and a permit is not issued over such a bridge (MBE 6A.4.5 [value "
            "from memory]; the owner's policy governs)")
    if reported_rf(rf) >= 1.0:
        return CARRIED, (
            f"{kind}: RF at least 1.0, so the truss members and pins can carry this permit "
            "under those conditions; the floor system, deck and bearings, not rated here, "
            "must be checked for it too, and issuing it is the owner's decision")
    escort = "" if category is VehicleCategory.PERMIT_ESCORTED else "an escort, "
    return NOT_AS_REQUESTED, (
        f"{kind}: RF below 1.0, so this permit should not cross as requested; a lighter or "
        f"longer vehicle, {escort}or other conditions are for the engineer in responsible "
        "charge to consider (no posting follows from a permit)")


SHVS = ("SU4", "SU5", "SU6", "SU7")
"""The single-unit specialized hauling vehicles the NRL screens (FHWA SHV Q&A, March 2014)."""
