"""Permit loads: their load factors, their distribution and how they enter the decision.

Permit load factors: MBE Table 6A.4.5.4.2a-1 [value from memory, uncertain], shipped in
rating/lrfr/provisions.json; the distribution of a special permit (one vehicle alone in one
lane, the multiple presence factor of 1.20 divided out): MBE Table 6A.4.5.4.2a-1 and
C6A.4.5.4.2a [value from memory]; the lever rule is statics [common practice].
"""

from __future__ import annotations

import math
from dataclasses import replace

import pytest
from demo_bridge import make_pratt_bridge

from rating.analysis.distribution import lateral_distribution, one_vehicle_alone
from rating.errors import InputError
from rating.lrfr.engine import (
    CARRIED,
    NOT_AS_REQUESTED,
    NOT_OVER_RESTRICTED,
    permit_verdict,
    rate_bridge,
)
from rating.lrfr.factors import RatingLevel, live_load_factor, permit_live_load_factor
from rating.lrfr.posting import PostingAction
from rating.model import (
    AxleSpacing,
    CrossSection,
    Finding,
    FindingRegion,
    Vehicle,
    VehicleCategory,
)
from rating.results import DECISION_NOTE, permit_words
from rating.results_build import build_results
from rating.vehicles.library import as_rating_load, owner_vehicle

V = VehicleCategory
AXLES = (12.0, 20.0, 20.0, 20.0, 20.0)
GAPS = (AxleSpacing(12.0, 12.0), AxleSpacing(4.5, 4.5), AxleSpacing(4.5, 4.5),
        AxleSpacing(4.5, 4.5))


def _crane(category: VehicleCategory, vid: str = "CRANE", gamma_ll: float | None = None
           ) -> Vehicle:
    """An invented five-axle mobile crane, 92 kip over 25.5 ft (test data)."""
    return Vehicle(vid, "invented mobile crane", category, AXLES, GAPS, 46.0,
                   gamma_ll=gamma_ll)


# -------------------------------------------------------------- load factors (data as read)


@pytest.mark.parametrize("category, adtt, expected", [
    # MBE Table 6A.4.5.4.2a-1 [value from memory, uncertain]
    (V.PERMIT_ESCORTED, None, 1.15), (V.PERMIT_ESCORTED, 9000, 1.15),
    (V.PERMIT_SINGLE_TRIP, 100, 1.35), (V.PERMIT_SINGLE_TRIP, 1000, 1.40),
    (V.PERMIT_SINGLE_TRIP, 5000, 1.50), (V.PERMIT_SINGLE_TRIP, None, 1.50),
    (V.PERMIT_MULTIPLE_TRIPS, 100, 1.55), (V.PERMIT_MULTIPLE_TRIPS, 1000, 1.75),
    (V.PERMIT_MULTIPLE_TRIPS, 5000, 1.85), (V.PERMIT_MULTIPLE_TRIPS, None, 1.85),
    # below the least ADTT and above the largest the table's end values hold
    (V.PERMIT_SINGLE_TRIP, 20, 1.35), (V.PERMIT_MULTIPLE_TRIPS, 20000, 1.85),
])
def test_special_permit_load_factors(category, adtt, expected):
    f = permit_live_load_factor(category, adtt, 3.0)
    assert f.value == pytest.approx(expected)
    assert "6A.4.5.4.2a-1" in f.source and "memory" in f.tag


@pytest.mark.parametrize("ratio, adtt, expected", [
    # routine permits by weight ratio GVW/AL (up to 2.0, 2.0 to 3.0, 3.0 and over) and ADTT:
    # MBE Table 6A.4.5.4.2a-1 [value from memory, uncertain]
    (1.5, 5000, 1.80), (2.0, 5000, 1.80), (2.5, 5000, 1.60), (3.0, 5000, 1.40),
    (1.5, 1000, 1.60), (2.5, 1000, 1.40), (3.5, 1000, 1.20),
    (1.5, 100, 1.40), (2.5, 100, 1.35), (3.5, 100, 1.30),
    (math.inf, None, 1.40), (1.0, None, 1.80),
    # linear between the ADTT values: halfway from 1,000 to 5,000 (closed form)
    (2.5, 3000, 1.50),
])
def test_routine_permit_load_factors(ratio, adtt, expected):
    f = permit_live_load_factor(V.ROUTINE_PERMIT, adtt, ratio)
    assert f.value == pytest.approx(expected)
    assert "GVW/AL" in f.source


def test_negative_adtt_is_refused():
    with pytest.raises(InputError, match="negative"):
        permit_live_load_factor(V.PERMIT_SINGLE_TRIP, -5, 2.0)


def test_the_owners_factor_for_a_vehicle_is_used_as_given():
    f = live_load_factor(V.PERMIT_SINGLE_TRIP, RatingLevel.PERMIT, 1000, override=1.6)
    assert f.value == 1.6 and f.source == "owner override"


def test_weight_ratio_is_gross_weight_over_the_first_to_last_axle():
    # 46 tons = 92 kip over 12 + 3 x 4.5 = 25.5 ft (closed form)
    load = as_rating_load(_crane(V.ROUTINE_PERMIT))
    assert load.weight_ratio_kip_per_ft == pytest.approx(92.0 / 25.5)
    # a variable spacing counts at its longest (the lower ratio: the larger factor)
    v = owner_vehicle("V", "variable", (20.0, 20.0), [(4.0, 10.0)],
                      category=V.ROUTINE_PERMIT)
    assert as_rating_load(v).weight_ratio_kip_per_ft == pytest.approx(40.0 / 10.0)
    one = owner_vehicle("ONE", "one axle", (30.0,), [], category=V.ROUTINE_PERMIT)
    assert as_rating_load(one).weight_ratio_kip_per_ft == math.inf


def test_a_vehicles_live_load_factor_is_checked():
    with pytest.raises(InputError, match="live-load factor 5 is outside"):
        owner_vehicle("X", "x", (20.0, 20.0), [4.0], gamma_ll=5.0, where="Vehicles!G5")


# -------------------------------------------------------------- distribution


def test_special_permit_distribution_is_one_lane_without_multiple_presence():
    # trusses 17 ft apart, a 15 ft roadway 1 ft inside each: one design lane. The wheels
    # 2 ft from the left curb stand 3 ft and 9 ft from the left truss; the lever rule gives
    # (1 - 3/17) + (1 - 9/17) = 22/17 for the axle's two wheel lines, 11/17 of the axle
    # (statics, common practice). Legal loads: times 1.20 (one lane loaded, LRFD Table
    # 3.6.1.1.2-1 [value from memory]); the permit alone: times 1.0.
    cs = CrossSection(truss_spacing_ft=17.0, roadway_width_ft=15.0, left_curb_ft=1.0)
    dist = lateral_distribution(cs)
    assert dist.factor == pytest.approx(1.2 * 11.0 / 17.0)
    alone = one_vehicle_alone(dist)
    assert alone.factor == pytest.approx(11.0 / 17.0)
    assert alone.multiple_presence == 1.0 and alone.loaded_lanes == 1


def test_one_vehicle_alone_on_a_two_lane_roadway():
    # trusses 26 ft apart, roadway 24 ft from 1 to 25 ft: two lanes of 12 ft. One vehicle
    # in the lane at the left, wheels at 3 and 9 ft: (23 + 17) / 26 / 2 = 20/26 of an axle
    cs = CrossSection(truss_spacing_ft=26.0, roadway_width_ft=24.0, left_curb_ft=1.0)
    assert one_vehicle_alone(lateral_distribution(cs)).factor == pytest.approx(20.0 / 26.0)


# -------------------------------------------------------------- the rating


@pytest.fixture(scope="module")
def three_ways():
    """The same vehicle rated as an owner's legal load, a routine permit and a single-trip
    permit, on a Pratt truss with counters in two panels and a pin (the load path is
    followed for the counter panels)."""
    vehicles = (_crane(V.OWNER, "AS-LEGAL"), _crane(V.ROUTINE_PERMIT, "ROUTINE"),
                _crane(V.PERMIT_SINGLE_TRIP, "SINGLE"))
    bridge = replace(make_pratt_bridge(adtt_one_direction=1000.0), owner_vehicles=vehicles)
    return rate_bridge(bridge, ["AS-LEGAL", "ROUTINE", "SINGLE"])


def test_permits_take_their_factors_and_distribution(three_ways):
    r = three_ways
    case = {c.id: c for c in r.cases}
    assert case["AS-LEGAL"].level is RatingLevel.LEGAL
    assert case["ROUTINE"].level is RatingLevel.PERMIT
    assert case["SINGLE"].level is RatingLevel.PERMIT
    # ADTT 1,000; GVW/AL = 3.6 kip/ft: the routine permit's third column
    assert case["ROUTINE"].gamma_ll.value == pytest.approx(1.20)
    assert case["SINGLE"].gamma_ll.value == pytest.approx(1.40)
    assert case["AS-LEGAL"].gamma_ll.value == pytest.approx(1.30)  # MBE 2018 [M]
    m = r.geometry.members[0].label
    dist = lateral_distribution(r.bridge.cross_section)
    assert r.live[(m, "AS-LEGAL")].distribution_factor == pytest.approx(dist.factor)
    assert r.live[(m, "ROUTINE")].distribution_factor == pytest.approx(dist.factor)
    assert r.live[(m, "SINGLE")].distribution_factor == pytest.approx(
        one_vehicle_alone(dist).factor)
    assert r.distribution_factor == pytest.approx(dist.factor)
    assert any(a.startswith("SINGLE is rated with the permit vehicle alone in one lane")
               for a in r.assumptions)


def test_permit_ratings_scale_with_load_factor_and_distribution(three_ways):
    # The rating equation and the load path depend on the live load only through
    # RF x gamma_LL x DF x (the vehicle's forces): the same vehicle under other factors
    # rates in their inverse ratio, member by member and pin by pin, linear or on the load
    # path (closed form of MBE 6A.4.2.1 [value from memory]; the path of factored dead load
    # + lam x live load depends on lam x live load alone).
    r = three_ways
    case = {c.id: c for c in r.cases}

    def scale(cid):
        return case[cid].gamma_ll.value * r.live[(r.geometry.members[0].label,
                                                  cid)].distribution_factor

    for cid in ("ROUTINE", "SINGLE"):
        k = scale("AS-LEGAL") / scale(cid)
        for m in r.geometry.members:
            a, b = r.ratings[(m.label, "AS-LEGAL")].rf, r.ratings[(m.label, cid)].rf
            if math.isfinite(a):
                assert b == pytest.approx(k * a, rel=1e-6), (m.label, cid)
        for p in r.pins:
            assert p.ratings[cid].rf == pytest.approx(k * p.ratings["AS-LEGAL"].rf,
                                                      rel=1e-6)


def test_permits_are_never_posted_and_say_what_they_mean(three_ways):
    r = three_ways
    for cid, conditions in (("ROUTINE", "unlimited crossings, mixed with traffic"),
                            ("SINGLE", "one crossing, mixed with traffic")):
        cp = r.postings[cid]
        assert cp.result.action is PostingAction.NONE and cp.result.posting_tons is None
        assert cp.note.startswith("permit load (")
        assert conditions in cp.note
        assert cp.rf < 1.0 and cp.permit == NOT_AS_REQUESTED
    # the bridge's own decision rests on the legal load alone
    res = build_results(r)
    assert res.posting["AS-LEGAL"].action in ("none", "post", "close")
    # the permits come last, before the words that leave the decision to the engineer
    head, permits = res.recommendation.split(" Permit loads (for the permit's issue, not a "
                                             "posting): ")
    assert head.startswith("Post the bridge") and "routine permit" not in head
    assert permits.endswith(DECISION_NOTE)
    assert ", routine permit, RF 0.79 (L3U4): not as requested" in permits
    assert ", single-trip permit, RF 0.82 (L3U4): not as requested" in permits
    assert res.posting["SINGLE"].permit == NOT_AS_REQUESTED
    level = {v.id: v.rating_level for v in res.vehicles}
    assert level == {"AS-LEGAL": "legal", "ROUTINE": "permit", "SINGLE": "permit"}


def _rate_crane(category: VehicleCategory, vid: str, scale: float, findings=(),
                others: tuple[str, ...] = ()):
    """The demo Pratt (no pins) rated for the crane with its axles times ``scale``, and the
    loads ``others``."""
    v = replace(_crane(category, vid), axle_loads_kip=tuple(scale * a for a in AXLES),
                gross_weight_tons=46.0 * scale)
    return rate_bridge(replace(make_pratt_bridge(findings=findings, pins=False),
                               owner_vehicles=(v,)), [*others, vid])


def test_a_permit_below_one_is_not_as_requested():
    # the same crane three times as heavy: below 1.0 on this truss
    r = _rate_crane(V.PERMIT_MULTIPLE_TRIPS, "HEAVY", 3.0)
    cp = r.postings["HEAVY"]
    assert cp.rf < 1.0 and cp.result.action is PostingAction.NONE
    assert "should not cross as requested" in cp.note
    assert "fewer than 100 crossings" in cp.note
    res = build_results(r)
    assert permit_words(res.posting["HEAVY"]) == "permit: not as requested"
    # no truck legal load was rated: no posting indicated for trucks, and the permit said
    assert res.recommendation.startswith("No truck legal load was rated")
    assert ", multiple-trip permit, RF" in res.recommendation
    assert "not as requested" in res.recommendation


def test_permit_verdicts_follow_the_rf_as_printed_and_the_bridge():
    # MBE 6A.4.5 [value from memory]: RF at least 1.0 as printed; none over a bridge that is
    # itself restricted for the legal loads
    assert permit_verdict(V.PERMIT_SINGLE_TRIP, 1.0, 0.33)[0] == CARRIED
    assert permit_verdict(V.PERMIT_SINGLE_TRIP, 0.999, 0.33)[0] == NOT_AS_REQUESTED  # 0.99
    assert permit_verdict(V.PERMIT_SINGLE_TRIP, 1.2, 0.33, True)[0] == NOT_OVER_RESTRICTED
    assert permit_verdict(V.PERMIT_SINGLE_TRIP, 0.8, 0.33, True)[0] == NOT_AS_REQUESTED
    assert permit_verdict(V.ROUTINE_PERMIT, -math.inf, 0.33)[0] == NOT_AS_REQUESTED
    crawl = permit_verdict(V.PERMIT_ESCORTED, 1.5, 0.0)[1]
    assert "escorted, no other vehicle on the bridge, held to a crawl" in crawl
    assert "held to a crawl" not in permit_verdict(V.PERMIT_ESCORTED, 1.5, 0.2)[1]


def test_a_vehicles_own_live_load_factor_comes_before_the_settings_override():
    legal = _crane(V.OWNER, "MINE", gamma_ll=1.55)
    bridge = replace(make_pratt_bridge(pins=False, gamma_ll_override=1.40),
                     owner_vehicles=(legal, _crane(V.OWNER, "OTHER")))
    r = rate_bridge(bridge, ["MINE", "OTHER"])
    case = {c.id: c for c in r.cases}
    assert case["MINE"].gamma_ll.value == 1.55
    assert case["OTHER"].gamma_ll.value == 1.40
    # a permit keeps its own factor whatever the Settings override of the legal loads
    permit = _crane(V.PERMIT_ESCORTED, "ESC")
    r = rate_bridge(replace(bridge, owner_vehicles=(permit,)), ["ESC"])
    assert r.cases[0].gamma_ll.value == pytest.approx(1.15)
    assert any(a.startswith("The owner's live-load factor (1.4, Settings sheet) is for the "
                            "legal loads: the permits (ESC)") for a in r.assumptions)


def test_a_vehicles_own_dynamic_load_allowance_is_used():
    # an escorted permit held to a crawl may be rated without IM (MBE 6A.4.5.5 [value from
    # memory]); without one given, it takes the legal loads' and the report says so
    crawl = replace(_crane(V.PERMIT_ESCORTED, "CRAWL"), im=0.0)
    plain = _crane(V.PERMIT_ESCORTED, "PLAIN")
    bridge = replace(make_pratt_bridge(pins=False, im_override=0.2),
                     owner_vehicles=(crawl, plain))
    r = rate_bridge(bridge, ["CRAWL", "PLAIN"])
    case = {c.id: c for c in r.cases}
    assert case["CRAWL"].im.value == 0.0 and case["PLAIN"].im.value == 0.2
    note = next(a for a in r.assumptions if a.startswith("The escorted permits"))
    assert "(PLAIN)" in note and "CRAWL" not in note and "6A.4.5.5" in note
    # the axle forces alone carry IM: RF x (1 + IM) is the same for both (closed form)
    for m in r.geometry.members:
        a, b = r.ratings[(m.label, "CRAWL")].rf, r.ratings[(m.label, "PLAIN")].rf
        if math.isfinite(a):
            assert a == pytest.approx(1.2 * b, rel=1e-6)
    with pytest.raises(InputError, match="dynamic load allowance 1.5 is outside"):
        owner_vehicle("X", "x", (20.0, 20.0), [4.0], im=1.5)


def test_a_permit_at_or_above_one_can_be_carried_and_the_floor_is_named():
    r = _rate_crane(V.PERMIT_SINGLE_TRIP, "LIGHT", 0.5)
    cp = r.postings["LIGHT"]
    assert cp.rf >= 1.0 and cp.result.action is PostingAction.NONE and cp.permit == CARRIED
    assert "can carry this permit" in cp.note and "floor system" in cp.note
    text = build_results(r).recommendation
    assert (", single-trip permit, RF" in text and ": the truss members and pins carry it "
            "(one crossing, mixed with traffic); the floor system, deck and bearings are to "
            "be checked for it." in text)


def test_no_permit_over_a_bridge_posted_for_the_legal_loads():
    # the light crane carried by the truss, but the Type 3 posts this demo bridge when its
    # diagonals have lost half their section (invented findings): the permit is not issued
    # over a posted bridge (MBE 6A.4.5 [value from memory])
    worn = [Finding(m, "all", FindingRegion.BODY, percent_loss=55.0, where="test")
            for m in ("U2L3", "L5U6")]
    r = _rate_crane(V.PERMIT_SINGLE_TRIP, "LIGHT", 0.3, worn, ("TYPE-3",))
    assert r.postings["TYPE-3"].result.action is not PostingAction.NONE
    cp = r.postings["LIGHT"]
    assert cp.rf >= 1.0 and cp.permit == NOT_OVER_RESTRICTED
    assert "not issued over such a bridge" in cp.note
    assert ("not over this bridge while it is restricted for the legal loads"
            in build_results(r).recommendation)


def test_a_vehicles_own_wheel_gauge_has_its_own_lever_rule():
    # the demo Pratt: trusses 18 ft apart, a 16 ft roadway from 1 ft: one 12 ft lane. A
    # crane of 9 ft gauge cannot keep 2 ft from both lane edges, so it is centred in the
    # lane: wheels 2.5 ft and 11.5 ft from the truss, ((18 - 2.5) + (18 - 11.5)) / 36 =
    # 22/36 of an axle (lever rule, statics); the 6 ft gauge, 2 ft from the curb, gives
    # ((18 - 3) + (18 - 9)) / 36 = 24/36
    wide = replace(_crane(V.PERMIT_SINGLE_TRIP, "WIDE"), wheel_gauge_ft=9.0)
    narrow = _crane(V.PERMIT_SINGLE_TRIP, "NARROW")
    legal = replace(_crane(V.OWNER, "WIDE-LEGAL"), wheel_gauge_ft=9.0)
    r = rate_bridge(replace(make_pratt_bridge(pins=False),
                            owner_vehicles=(wide, narrow, legal)),
                    ["WIDE", "NARROW", "WIDE-LEGAL"])
    m = r.geometry.members[0].label
    assert r.live[(m, "WIDE")].distribution_factor == pytest.approx(22.0 / 36.0)
    assert r.live[(m, "NARROW")].distribution_factor == pytest.approx(24.0 / 36.0)
    # a legal vehicle of that gauge: one lane loaded with its multiple presence, 1.20
    assert r.live[(m, "WIDE-LEGAL")].distribution_factor == pytest.approx(1.2 * 22.0 / 36.0)
    note = next(a for a in r.assumptions if a.startswith("WIDE is rated with its wheel gauge "
                                                         "of 9 ft (lever rule"))
    # the wheel lines where the lever rule put them, for the reviewer to work it again
    assert "the permit vehicle alone in one lane, as near the left truss as the lane rules " \
        "allow (wheel lines 2.5 and 11.5 ft from the left truss)" in note
    # a gauge the roadway cannot hold is refused, naming the vehicle and its place
    too_wide = replace(_crane(V.OWNER, "TOO-WIDE"), wheel_gauge_ft=17.0, where="Vehicles!B9")
    with pytest.raises(InputError, match="vehicle TOO-WIDE: the roadway is 16 ft wide") as e:
        rate_bridge(replace(make_pratt_bridge(pins=False), owner_vehicles=(too_wide,)),
                    ["TOO-WIDE"])
    assert e.value.where == "Vehicles!B9"
