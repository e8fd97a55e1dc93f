"""The rating of one bridge: resistances, dead load, live-load envelopes, rating factors,
pins and posting, as typed outputs for :mod:`rating.results` to present.

Rating factors follow MBE 6A.4.2.1 (Eq. 6A.4.2.1-1) [value from memory; terms as Khan 2010,
p. 187, read]. Members whose force does not depend on which diagonal of a counter panel is
active are rated with the linear equation on their influence line. Members whose force does
(tension-only mains and counters, and the chords and verticals of those panels) are rated by
the live-load multiplier that brings them to their resistance with the active set consistent
at that load level (docs/tension-only.md), at every vehicle position that is critical for them
in any active set.
"""

from __future__ import annotations

import itertools
import math
from collections.abc import Sequence
from dataclasses import dataclass, field, replace

import numpy as np

from rating.analysis.deadload import DeadLoadResult, MemberWeight, dead_load
from rating.analysis.distribution import lateral_distribution
from rating.analysis.influence import InfluenceLines
from rating.analysis.moving import (
    Direction,
    Extreme,
    MemberEnvelope,
    envelope,
    panel_point_positions,
)
from rating.analysis.path import PathCache, member_load_multipliers
from rating.analysis.truss import (
    ActiveSetSolution,
    TrussFamily,
    members_cross,
    solve_tension_only,
)
from rating.capacity.member import MemberCapacity, member_capacity
from rating.capacity.sections import gross_area_as_built_in2
from rating.errors import InputError
from rating.lrfr.equation import SenseLoads, lower_beyond_round_off, rating_factor
from rating.lrfr.factors import (
    Factor,
    RatingLevel,
    dead_load_factors,
    dynamic_load_allowance,
    live_load_factor,
)
from rating.lrfr.liveload import position_key, position_live_loads
from rating.lrfr.pins import PinRating, rate_pin
from rating.lrfr.positions import panel_point_extremes
from rating.lrfr.posting import PostingAction, PostingResult, posting
from rating.model import (
    Bridge,
    EyebarSet,
    Finding,
    Member,
    RodSet,
    TrussGeometry,
    VehicleCategory,
)
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


@dataclass(frozen=True)
class CasePosting:
    case: str
    rf: float
    controlling: str  # member id or "pin at J"
    result: PostingResult
    screened_out: bool = False
    note: str = ""
    alike: tuple[str, ...] = ()  # others rated the same within round-off (mirror members)


@dataclass(frozen=True, eq=False)
class BridgeRating:
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


def active_set_configurations(family: TrussFamily, dead_slack: frozenset[str],
                              max_pairs: int = 4) -> tuple[frozenset[str], ...]:
    """The dead-load set and the sets with crossing tension-only pairs flipped.

    A pair is a slack and an active tension-only member that cross in one panel (a counter and
    its main). With up to ``max_pairs`` pairs every combination is formed; beyond that, every
    single flip and every double flip of two neighbouring panels (pairs whose bars share a
    joint): in a truss with one diagonal acting per panel a member's line depends on its own
    panel and, for a post between two counter panels, on both of them.
    """
    g = family.geometry
    t_only = [m for m in g.members if m.tension_only]
    pairs = []
    for a, b in itertools.combinations(t_only, 2):
        if (a.label in dead_slack) != (b.label in dead_slack) and members_cross(g, a, b):
            slack, active = (a, b) if a.label in dead_slack else (b, a)
            pairs.append((slack.label, active.label))
    if len(pairs) <= max_pairs:
        combos = itertools.chain.from_iterable(
            itertools.combinations(pairs, k) for k in range(1, len(pairs) + 1))
    else:
        def joints_of(pair: tuple[str, str]) -> set[str]:
            return {j for lab in pair for j in (g.member(lab).start, g.member(lab).end)}

        neighbours = [(a, b) for a, b in itertools.combinations(pairs, 2)
                      if joints_of(a) & joints_of(b)]
        combos = itertools.chain(((p,) for p in pairs), neighbours)
    configs = [dead_slack]
    for combo in combos:
        s = set(dead_slack)
        for slack, active in combo:
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
        im = dynamic_load_allowance(load.category, st.riding_surface, st.im_override)
        if load.category is VehicleCategory.DESIGN:
            for level, suffix in ((RatingLevel.INVENTORY, "INV"), (RatingLevel.OPERATING, "OPR")):
                g_ll = live_load_factor(load.category, level, st.adtt_one_direction,
                                        st.provision_set, None)
                cases.append(RatingCase(f"{load.id}-{suffix}", load, level, g_ll, im))
        else:
            g_ll = live_load_factor(load.category, RatingLevel.LEGAL, st.adtt_one_direction,
                                    st.provision_set, st.gamma_ll_override)
            cases.append(RatingCase(load.id, load, RatingLevel.LEGAL, g_ll, im))
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


# --------------------------------------------------------------------------- the rating


def rate_bridge(bridge: Bridge, vehicle_ids: Sequence[str] | None = None) -> BridgeRating:
    """Rate every member and pin of the bridge for every chosen rating load."""
    st = bridge.settings
    g = rating_geometry(bridge)
    warnings: list[str] = []
    assumptions: list[str] = []

    capacities: dict[str, MemberCapacity] = {}
    for m in g.members:
        d = bridge.design_of(m.label)
        cap = member_capacity(d, m.role, g.member_length_ft(m.label),
                              bridge.findings_for(m.label), m.tension_only)
        capacities[m.label] = cap
        warnings.extend(cap.warnings)
        assumptions.extend(cap.assumptions)

    weights = {m.label: MemberWeight(gross_area_as_built_in2(bridge.design_of(m.label).section),
                                     bridge.design_of(m.label).material.unit_weight_pcf)
               for m in g.members}
    out_of_service = frozenset(
        lab for lab, cap in capacities.items()
        if cap.removed and cap.factored_resistance("tension") == 0.0
        and cap.factored_resistance("compression") == 0.0)
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
    if dead.total.forced_compression:
        warnings.append("under dead load alone the tension-only members "
                        + ", ".join(sorted(dead.total.forced_compression))
                        + " would have to carry compression")

    configs = active_set_configurations(family, dead.slack_members)
    lines = {c: family.solver(c).influence_lines for c in configs}
    dependent = _dependent_members(lines)

    dist = lateral_distribution(bridge.cross_section, override=st.distribution_factor_override)
    df = dist.factor
    warnings.extend(dist.warnings)
    span = g.span_ft
    cases, notes = rating_cases(bridge, vehicle_ids, span)
    assumptions.extend(notes)
    dead_f = dead_load_factors(st.wearing_surface_measured)
    DC = {m.label: float(f) for m, f in zip(g.members, dead.member_forces_dc_kip, strict=True)}
    DW = {m.label: float(f) for m, f in zip(g.members, dead.member_forces_dw_kip, strict=True)}

    dead_states = factored_dead_states(family, dead, dead_f)
    paths = PathCache(family)
    live: dict[tuple[str, str], LiveEffect] = {}
    ratings: dict[tuple[str, str], MemberCaseRating] = {}
    envs = EnvelopeSet(lines, configs, dependent)
    distinct_rows = {m.label: envs.distinct([m.label], configs if m.label in dependent
                                            else configs[:1]) for m in g.members}
    panel_points_of = {c.load.id: panel_point_extremes(c.load, g.deck_stations_ft)
                       for c in cases}
    for case in cases:
        im = case.im.value
        member_envs: dict[str, list[MemberEnvelope]] = {}
        for m in g.members:
            lab = m.label
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
            member_envs[lab] = [e for e, _ in mine]
        # the members whose force depends on the counters' active set: every position, sense
        # and dead-load factor set of all of them followed together on the exact load path
        plans = {lab: _sense_plans(g.member(lab), capacities[lab], case, DC[lab], DW[lab],
                                   dead_f, df, envs_here, lab in dependent)
                 for lab, envs_here in member_envs.items()}
        panel_points = panel_points_of[case.load.id]
        tried = {lab: _multiplier_trials(g, case, plans[lab], dead_states, df, paths,
                                         panel_points)
                 for lab in plans if lab in dependent}
        found_of: dict[str, list] = {lab: [] for lab in tried}
        _follow_trials(g, {lab: list(ts) for lab, ts in tried.items()}, tried, found_of,
                       add=False)
        if panel_points:
            # the panel-point positions that can lower a rating, then the points between two
            # of them where the active set at the rating level changes
            screen = _PanelPointScreen(g, family, case, configs, dead_states, df,
                                       panel_points)
            for _ in range(3):
                # the sets met at the rating level join the bound; positions it can no longer
                # exclude are followed; until no new position is needed
                screen.add_states({seg.slack for fs in found_of.values() for _, seg in fs
                                   if seg is not None})
                more = {lab: screen.trials(lab, plans[lab], tried[lab],
                                           min((f[0] for f in found_of[lab]),
                                               default=math.inf), paths) for lab in tried}
                if not any(more.values()):
                    break
                _follow_trials(g, more, tried, found_of)
            more = {lab: _kink_trials(g, family, case, lab, tried[lab], found_of[lab], paths,
                                      dead_states, df, screen.index) for lab in tried}
            _follow_trials(g, more, tried, found_of)
        elif tried:
            # a load with a lane part or a variable spacing: the panel-point positions of the
            # governing vehicle (its spacing, direction and lane segments) beside its best
            # position, taken again around every position near the least, then the change
            # points between them, as for the axle loads above
            runs: dict = {}
            for _ in range(4):
                more = {lab: _local_panel_point_trials(g, case, tried[lab], found_of[lab],
                                                       paths, dead_states, df, runs)
                        for lab in tried}
                if not any(more.values()):
                    break
                _follow_trials(g, more, tried, found_of)
            vertex_index = {key: n for run in runs.values() for key, n in run[1].items()}
            more = {lab: _kink_trials(g, family, case, lab, tried[lab], found_of[lab], paths,
                                      dead_states, df, vertex_index) for lab in tried}
            _follow_trials(g, more, tried, found_of)
        lam_of = {lab: [lam for lam, _ in fs] for lab, fs in found_of.items()}
        for lab in plans:
            ratings[(lab, case.id)] = _rate_member(
                g.member(lab), capacities[lab], case, DC[lab], DW[lab], plans[lab],
                lab in dependent, tried.get(lab, []), lam_of.get(lab, []), dead_f)

    pins = tuple(
        rate_pin(pin, g, family, bridge, cases, configs, envs, dead, dead_f, df,
                 dead_states, dependent, paths, panel_points_of)
        for pin in bridge.pins)
    postings = _postings(cases, ratings, pins, g)
    for p in pins:
        warnings.extend(p.warnings)
    return BridgeRating(
        bridge=bridge, geometry=g, capacities=capacities, dead=dead, lines=lines[configs[0]],
        configs=configs, lines_by_config=lines, cases=cases, live=live, ratings=ratings, pins=pins,
        postings=postings, distribution_factor=df, distribution_note=dist.description,
        dependent_members=dependent,
        warnings=tuple(dict.fromkeys(warnings)), assumptions=tuple(dict.fromkeys(assumptions)),
        provisions=tuple(dict.fromkeys(
            [f.describe() for f in dead_f.values()]
            + [c.gamma_ll.describe() for c in cases] + [c.im.describe() for c in cases])),
    )


def factored_dead_states(family: TrussFamily, dead: DeadLoadResult, dead_f
                         ) -> dict[tuple[float, float], tuple[np.ndarray, ActiveSetSolution]]:
    """Factored dead-load joint loads and their tension-only states, maximum and minimum
    factor sets (AASHTO LRFD Table 3.4.1-2 [V]); the same for every vehicle position."""
    out = {}
    for gd, gw in ((dead_f["gamma_dc_max"].value, dead_f["gamma_dw_max"].value),
                   (dead_f["gamma_dc_min"].value, dead_f["gamma_dw_min"].value)):
        P = gd * dead.joint_loads_dc_kip + gw * dead.joint_loads_dw_kip
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
    gamma_dc: float
    gamma_dw: float


@dataclass(frozen=True)
class _Trial:
    """One load-multiplier search: a sense, a dead-load factor set and a vehicle position."""

    sense: int
    extreme: Extreme
    gamma_dc: float
    gamma_dw: float
    path: object  # rating.analysis.path.LazyPath
    capacity: float
    panel_point: bool = False  # an axle over a panel point (see _kink_trials)


def _trial(g: TrussGeometry, case: RatingCase, e: Extreme, sense: int,
           factors: tuple[float, float], capacity: float, dead_states, df: float,
           paths: PathCache, panel_point: bool = False) -> _Trial:
    """One load-multiplier search: the extreme's loading followed on the exact load path of
    its dead-load factor set (with gamma_LL = 1, shared through ``paths``)."""
    im = case.im.value
    P_dead, state = dead_states[factors]
    P_live = position_live_loads(paths, g, case.load, e, im, df)
    path = paths.segments((case.load.id, im, *factors, position_key(e)), P_dead, P_live,
                          state)
    return _Trial(sense, e, factors[0], factors[1], path, capacity, panel_point)


def _sense_plans(m: Member, cap: MemberCapacity, case: RatingCase, DC: float, DW: float,
                 dead_f, df: float, envs, dependent: bool) -> list[_SensePlan]:
    """The senses in which the vehicle loads the member (tension, compression), each with its
    extremes over the active sets and its factored resistance; dead-load factors by the sign
    of the dead load in that sense (AASHTO LRFD Table 3.4.1-2 [V])."""
    im = case.im.value
    plans = []
    for sense, name in SENSES:
        extremes = tuple(e.max if sense > 0 else e.min for e in envs)
        ll = tuple(sense * df * e.total_kip(im) for e in extremes)
        if max(ll) <= 0:
            continue  # the vehicle does not load the member this way
        if sense < 0 and m.tension_only and dependent:
            continue  # a tension-only member goes slack instead; not rated in compression
        g_dc = dead_f["gamma_dc_max"].value if sense * DC > 0 else dead_f["gamma_dc_min"].value
        g_dw = dead_f["gamma_dw_max"].value if sense * DW > 0 else dead_f["gamma_dw_min"].value
        plans.append(_SensePlan(sense, name, extremes, ll, cap.factored_resistance(name),
                                cap.governing(name), g_dc, g_dw))
    return plans


def _multiplier_trials(g: TrussGeometry, case: RatingCase, plans: list[_SensePlan],
                       dead_states, df: float, paths: PathCache,
                       panel_points: tuple[Extreme, ...] = ()) -> list[_Trial]:
    """Every load-multiplier search of one member: each sense, each dead-load factor set (whether
    the dead load adds to or relieves the effect at the rating level is not known beforehand,
    a slack counter carries none: both are tried, AASHTO LRFD 3.4.1 [V]) and each critical
    position. The path is followed under the live load with gamma_LL = 1, so one path serves
    every rating level of the load (lam scales by 1 / gamma_LL).

    ``panel_points`` only marks the trials that stand on a panel-point position (see
    :class:`_PanelPointScreen`).
    """
    out = []
    on_panel_points = {position_key(e) for e in panel_points}
    for pl in plans:
        unique = {position_key(e): e for e in pl.extremes
                  if e.position is not None or e.lane_segments_ft}
        for fs in dead_states:
            for key, e in unique.items():
                out.append(_trial(g, case, e, pl.sense, fs, pl.capacity, dead_states, df,
                                  paths, key in on_panel_points))
    return out


def _follow_trials(g: TrussGeometry, more: dict[str, list[_Trial]],
                   tried: dict[str, list[_Trial]], found_of: dict[str, list],
                   add: bool = True) -> None:
    """Follow the trials in ``more`` on their load paths, all together, and keep what each
    found beside it (``add``: the trials are new, append them to ``tried`` too)."""
    flat = [(lab, t) for lab, ts in more.items() for t in ts]
    found = member_load_multipliers([(t.path, g.member_index[lab], t.sense, t.capacity)
                                     for lab, t in flat])
    for (lab, t), f in zip(flat, found, strict=True):
        if add:
            tried[lab].append(t)
        found_of[lab].append(f)


class _PanelPointScreen:
    """Which panel-point positions can lower a load-multiplier rating, for one case.

    On the load path the member's multiplier is not the ratio of linear effects, so the
    positions critical for its lines need not hold the least multiplier. In the piece of the
    path where the member reaches its resistance the active set S is fixed and the forces are
    N_dead(S) + lam N_live(S, x), so lam(x) = (C - N_dead(S)) / N_live(S, x). Hence
    lam(x) >= LB(x), the least of that ratio over the active sets the paths can reach: the
    sets of the counter panels searched for the envelopes, and every set met at the rating
    level on the paths followed so far (``add_states``). Between two neighbouring panel-point
    positions every axle stays within its stringer span, N_live(S, x) is linear in x and lam(x)
    in one set is monotone, so there lam >= min(LB) of the two ends: a position is followed on
    the exact path when its bound or a neighbour's is below the least multiplier found so far.
    """

    def __init__(self, g: TrussGeometry, family: TrussFamily, case: RatingCase,
                 configs: Sequence[frozenset[str]], dead_states, df: float,
                 panel_points: tuple[Extreme, ...]) -> None:
        self.g, self.family, self.case, self.df = g, family, case, df
        self.dead_states = dead_states
        self.points = panel_points
        self.keys = [position_key(e) for e in panel_points]
        self.index = {k: n for n, k in enumerate(self.keys)}
        mo = case.load.models[0]
        v = mo.axles
        self._P_axles = (1.0 + case.im.value) * df * np.asarray(v.axle_loads_kip) * v.axle_scale
        # axle stations of every position (n, axles): forward x - d, reverse x + d
        d = np.concatenate(([0.0], np.cumsum(panel_points[0].position.spacings_ft)))
        front = np.array([e.position.front_axle_ft for e in panel_points])
        sign = np.array([1.0 if e.position.direction is Direction.FORWARD else -1.0
                         for e in panel_points])
        self._X = front[:, None] - sign[:, None] * d[None, :]
        n = len(panel_points)
        self._same_dir = np.array([panel_points[k].position.direction
                                   == panel_points[k + 1].position.direction
                                   for k in range(n - 1)], dtype=bool)
        # per active set: the live force of every member at every position (gamma_LL = 1)
        # and the dead-load solution of each factor set
        self._states: list[frozenset[str]] = []
        self._F = np.zeros((0, len(g.members), n))
        self._dead = {fs: np.zeros((0, len(g.members))) for fs in dead_states}
        self.add_states(configs)

    def add_states(self, states) -> None:
        new = [S for S in dict.fromkeys(states)
               if S not in self._states and self.family.is_stable(S)]
        if not new:
            return
        F, dead = [], {fs: [] for fs in self.dead_states}
        for S in new:
            lt = self.family.solver(S)
            F.append(lt.influence_lines.evaluate(self._X) @ self._P_axles)  # (members, n)
            for fs, (P, _) in self.dead_states.items():
                dead[fs].append(lt.forces_and_elongations(P)[0])
        self._states.extend(new)
        self._F = np.concatenate([self._F, np.stack(F)])  # (states, members, n)
        self._dead = {fs: np.concatenate([self._dead[fs], np.stack(d)])
                      for fs, d in dead.items()}

    def bound(self, member: str, sense: int, capacity: float, fs: tuple[float, float]
              ) -> np.ndarray:
        i = self.g.member_index[member]
        f = sense * self._F[:, i, :]  # (states, n)
        head = (capacity - sense * self._dead[fs][:, i])[:, None]
        with np.errstate(divide="ignore", invalid="ignore"):
            lam = np.where(f > 0, head / np.where(f > 0, f, 1.0), np.inf)
        return lam.min(axis=0) if lam.size else np.full(len(self.points), np.inf)

    def trials(self, member: str, plans: list[_SensePlan], have: list[_Trial], best: float,
               paths: PathCache) -> list[_Trial]:
        """The panel-point trials that can lower ``best`` (lam with gamma_LL = 1) and are not
        among ``have`` already."""
        present = {(t.sense, t.gamma_dc, t.gamma_dw, position_key(t.extreme)) for t in have}
        out = []
        for pl in plans:
            for fs in self.dead_states:
                low = self.bound(member, pl.sense, pl.capacity, fs) < best * (1.0 - 1e-9)
                pick = low.copy()
                pick[:-1] |= low[1:] & self._same_dir
                pick[1:] |= low[:-1] & self._same_dir
                for k in np.flatnonzero(pick):
                    if (pl.sense, fs[0], fs[1], self.keys[k]) in present:
                        continue
                    out.append(_trial(self.g, self.case, self.points[k], pl.sense, fs,
                                      pl.capacity, self.dead_states, self.df, paths, True))
        return out


def _local_panel_point_trials(g: TrussGeometry, case: RatingCase, trials: list[_Trial],
                              found: list[tuple[float, object]], paths: PathCache,
                              dead_states, df: float, runs: dict) -> list[_Trial]:
    """For a load with a lane part or a variable spacing: the panel-point positions of the
    vehicle of the member's best trial (same model, spacing, lane segments and dead-load
    factors), in both directions, three each side of it (and of the same stretch of deck
    driven the other way) and of every such position within 8 % of the least, not followed
    yet. ``runs`` keeps each vehicle's positions and their order, by direction."""
    lams = [lam for lam, _ in found]
    finite = [k for k, lam in enumerate(lams) if math.isfinite(lam) and lam >= 0.0]
    if not finite:
        return []
    k_best = min(finite, key=lambda k: lams[k])
    best, t_best = lams[k_best], trials[k_best]
    e = t_best.extreme
    mo = next((m for m in case.load.models if m.name == e.model), None)
    if e.position is None or mo is None or mo.axles is None:
        return []
    length = float(sum(e.position.spacings_ft))
    fs = (t_best.gamma_dc, t_best.gamma_dw)
    out = []
    for direction in (Direction.FORWARD, Direction.REVERSE):
        run_key = (e.model, direction, e.position.spacings_ft, e.lane_segments_ft)
        if run_key not in runs:
            pts = [replace(e, position=pos) for pos in
                   panel_point_positions(g.deck_stations_ft, e.position.spacings_ft)
                   if pos.direction is direction]
            runs[run_key] = (pts, {position_key(q): n for n, q in enumerate(pts)})
        pts, index = runs[run_key]
        if not pts:
            continue
        fronts = np.array([q.position.front_axle_ft for q in pts])
        x = e.position.front_axle_ft
        if direction is not e.position.direction:  # the same stretch, driven the other way
            x = x + length if direction is Direction.FORWARD else x - length
        centres = {int(np.argmin(np.abs(fronts - x)))}
        have: set[int] = set()
        for t, lam in zip(trials, lams, strict=True):
            n = index.get(position_key(t.extreme))
            if n is not None and (t.sense, t.gamma_dc, t.gamma_dw) == (t_best.sense, *fs):
                have.add(n)
                if math.isfinite(lam) and lam <= 1.08 * best:
                    centres.add(n)
        for n in sorted({c + d for c in centres for d in range(-3, 4)}):
            if not 0 <= n < len(pts) or n in have:
                continue
            have.add(n)
            out.append(_trial(g, case, pts[n], t_best.sense, fs, t_best.capacity,
                              dead_states, df, paths, True))
    return out


def _kink_trials(g: TrussGeometry, family: TrussFamily, case: RatingCase, member: str,
                 trials: list[_Trial], found: list[tuple[float, object]], paths: PathCache,
                 dead_states, df: float, vertex_index: dict) -> list[_Trial]:
    """Positions between two neighbouring panel-point positions where the active set at the
    rating level changes (a counter taking over just as the member reaches its resistance):
    there the multiplier can have a minimum that no panel-point position shows.

    Between the two positions every axle stays in its stringer span, so in the active set S
    found at either end the member force and the force (or stretch) of each tension-only bar
    whose state differs at the other end are linear in the station t and in lam: the member
    at its resistance and that bar at zero are two equations, linear in lam and lam t, solved
    exactly (Cramer's rule). A point is followed on the exact load path, like any other
    position, when its lam so found is below the least lam found so far (a point that cannot
    lower the rating is not followed).
    """
    im = case.im.value
    i = g.member_index[member]
    best = min((lam for lam, _ in found), default=math.inf)
    if not math.isfinite(best):
        return []
    by_run: dict[tuple, dict[int, int]] = {}
    for k, t in enumerate(trials):
        if t.panel_point:
            e = t.extreme
            v = vertex_index.get(position_key(e))
            if v is None:
                continue
            # one run per direction and per axle spacing and lane (their own positions)
            by_run.setdefault((t.sense, t.gamma_dc, t.gamma_dw, e.position.direction,
                               e.model, e.position.spacings_ft, e.lane_segments_ft),
                              {})[v] = k
    out: list[_Trial] = []
    seen: set[tuple] = set()
    for (sense, gd, gw, direction, *_), at in by_run.items():
        P_dead = dead_states[(gd, gw)][0]
        for v in sorted(at):
            if v + 1 not in at:
                continue  # only neighbouring panel-point positions (no station between)
            ka, kb = at[v], at[v + 1]
            (_, seg_a), (_, seg_b) = found[ka], found[kb]
            if seg_a is None or seg_b is None or seg_a.slack == seg_b.slack:
                continue
            ea, eb = trials[ka].extreme, trials[kb].extreme
            xa, xb = ea.position.front_axle_ft, eb.position.front_axle_ft
            ka_key = (case.load.id, im, position_key(ea))
            kb_key = (case.load.id, im, position_key(eb))
            Pa = position_live_loads(paths, g, case.load, ea, im, df)
            Pb = position_live_loads(paths, g, case.load, eb, im, df)
            switching = [family.labels.index(lab) for lab in seg_a.slack ^ seg_b.slack]
            C = trials[ka].capacity
            for S in (seg_a.slack, seg_b.slack):
                n_d, e_d = paths.solved(S, ("dead", gd, gw), P_dead)
                n_a, e_a = paths.solved(S, ka_key, Pa)
                n_b, e_b = paths.solved(S, kb_key, Pb)
                a1, b1 = sense * n_a[i], sense * (n_b[i] - n_a[i])
                c1 = C - sense * n_d[i]
                for j in switching:
                    if family.labels[j] in S:  # slack in S: it comes in when stretched
                        a2, b2, c2 = e_a[j], e_b[j] - e_a[j], -e_d[j]
                    else:  # active in S: it goes slack at zero force
                        a2, b2, c2 = n_a[j], n_b[j] - n_a[j], -n_d[j]
                    det = a1 * b2 - a2 * b1
                    if abs(det) <= 1e-12 * max(abs(a1 * b2), abs(a2 * b1), 1e-300):
                        continue
                    u = (c1 * b2 - c2 * b1) / det  # lam
                    w = (a1 * c2 - a2 * c1) / det  # lam * t
                    if not 0.0 < u < best * (1.0 - 1e-9):
                        continue
                    t_k = w / u
                    if not 0.0 < t_k < 1.0:
                        continue
                    x = round(xa + t_k * (xb - xa), 9)
                    if (x, gd, gw, direction, ea.lane_segments_ft) in seen:
                        continue
                    seen.add((x, gd, gw, direction, ea.lane_segments_ft))
                    e = replace(ea, position=replace(ea.position, front_axle_ft=x))
                    out.append(_trial(g, case, e, sense, (gd, gw), C, dead_states, df, paths))
    return out


def _rate_member(m: Member, cap: MemberCapacity, case: RatingCase, DC: float, DW: float,
                 plans: list[_SensePlan], dependent: bool, trials: list[_Trial],
                 lams: list[float], dead_f) -> MemberCaseRating:
    """The member's rating for one case: the linear equation (MBE 6A.4.2.1 [value from
    memory]) where its line does not depend on the counters' active set, else the least live
    load multiplier of its trials (``lams``, found with gamma_LL = 1)."""
    im = case.im.value
    g_ll = case.gamma_ll.value
    best: MemberCaseRating | None = None
    for pl in plans:
        check = pl.check
        phi = check.phi if check is not None else 0.0
        check_name = check.name if check is not None else "no compression resistance"
        finding = check.finding if check is not None else None
        g_dc, g_dw = pl.gamma_dc, pl.gamma_dw
        mine = [(t, lam) for t, lam in zip(trials, lams, strict=True) if t.sense == pl.sense]
        if not dependent:
            k = int(np.argmax(pl.ll))
            r = rating_factor(pl.capacity, SenseLoads(pl.sense * DC, pl.sense * DW, pl.ll[k]),
                              g_ll, dead_f)
            rf, method, ext = r.rf, "linear", pl.extremes[k]
        else:
            rf, ext = math.inf, None
            # Where the factored dead load alone is past the resistance the multiplier is the
            # (negative) extrapolation (C - dead) / live, and the rating is the one with the
            # largest live-load effect, the least negative, as the linear equation gives it
            # (a position barely loading the member would give -inf); else the least.
            past = [(t, lam_1) for t, lam_1 in mine if lam_1 < 0.0]
            if past:
                finite = [(t, lam_1) for t, lam_1 in past if math.isfinite(lam_1)]
                t, lam_1 = max(finite, key=lambda q: q[1]) if finite else past[0]
                rf, ext, g_dc, g_dw = lam_1 / g_ll, t.extreme, t.gamma_dc, t.gamma_dw
            for t, lam_1 in ([] if past else mine):
                lam = lam_1 / g_ll
                if lower_beyond_round_off(lam, rf):
                    rf, ext, g_dc, g_dw = lam, t.extreme, t.gamma_dc, t.gamma_dw
            method = "load multiplier"
            if ext is None:
                continue
        cand = MemberCaseRating(m.label, case.id, float(rf), pl.name, check_name, method, g_dc,
                                g_dw, g_ll, im, phi, cap.phi_c, cap.phi_s, ext, finding)
        if best is None or cand.rf < best.rf:
            best = cand
    if best is None:
        return MemberCaseRating(m.label, case.id, math.inf, "", "not loaded by this vehicle",
                                "linear", 0.0, 0.0, g_ll, im, 0.0, cap.phi_c, cap.phi_s, None)
    return best


def _postings(cases, ratings, pins, g) -> dict[str, CasePosting]:
    out: dict[str, CasePosting] = {}
    nrl_ok = None
    for case in cases:
        rf, who = math.inf, ""
        for m in g.members:
            r = ratings[(m.label, case.id)]
            if lower_beyond_round_off(r.rf, rf):
                rf, who = r.rf, m.label
        for p in pins:
            r = p.ratings.get(case.id)
            if r is not None and lower_beyond_round_off(r.rf, rf):
                rf, who = r.rf, f"pin at {p.joint}"
        alike = ()
        if math.isfinite(rf):
            alike = tuple(
                [m.label for m in g.members if m.label != who
                 and not lower_beyond_round_off(rf, ratings[(m.label, case.id)].rf)]
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
        out[case.id] = CasePosting(case.id, rf, who, result, alike=alike)
        if case.load.id == "NRL":
            nrl_ok = rf >= 1.0
            if not nrl_ok:  # a screening load: the SHVs themselves are rated and posted
                out[case.id] = CasePosting(
                    case.id, rf, who, replace(result, posting_tons=None,
                                              action=PostingAction.NONE),
                    note=("screening load: with RF below 1.0 the single-unit SHVs are rated "
                          "and posted one by one (FHWA SHV Q&A, March 2014)"), alike=alike)
    if nrl_ok:
        for cid, cp in out.items():
            if cid in ("SU4", "SU5", "SU6", "SU7"):
                out[cid] = replace(cp, screened_out=True, note=(
                    "NRL rating factor is at least 1.0, so this single-unit SHV need not be "
                    "rated (FHWA SHV Q&A, March 2014); shown for information."))
    return out
