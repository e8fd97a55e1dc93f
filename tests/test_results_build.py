"""What rating.results_build relies on to convert each wording once: an SI bridge's
"member X: words" lines convert as their two parts (no quantity reaches across ": "); an SI
bridge's posting in whole tonnes."""

from __future__ import annotations

import math
from dataclasses import replace
from pathlib import Path

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from rating.inventory.reader import read_workbook
from rating.lrfr.engine import rate_bridge
from rating.lrfr.posting import posting
from rating.results_build import build_results
from rating.units import TON_PER_TONNE, si_text

PONY_SI = Path(__file__).resolve().parents[1] / "sample_inventory" / "tc0903_pony_1903_si.xlsx"

# pieces that make quantities (and near misses) in the wording of warnings and assumptions
PIECES = st.sampled_from([
    "2.24803 in", "26 ksi", "-3.5 kip", "12 ft", "0.5 in2", "1/32 in", "'3 in'", "in", "ft",
    "tons", "10 tons", "kip-in", "1e-3 in", "-", ":", ": ", " ", "x", "(", ")", "2", "L2U3",
    "12in", "phi_c = 0.95", "B5", "5 ", "in:", "ft: ", "3:", "^2", "²",
])
WORDS = st.lists(PIECES, max_size=12).map("".join)


@settings(max_examples=400, deadline=None)
@given(label=WORDS, words=WORDS)
def test_member_line_converts_as_its_two_parts(label: str, words: str) -> None:
    line = f"member {label}: {words}"
    head, sep, rest = line.partition(": ")  # as build_results splits it
    assert si_text(line) == si_text(head + sep) + si_text(rest)


@pytest.fixture(scope="module")
def pony_rating():
    return rate_bridge(read_workbook(PONY_SI).bridge)


def test_si_posting_under_the_least_tonnes_is_a_closure(pony_rating):
    """Type 3, W = 25 tons = 22.68 t. RF 0.38: (22.68 / 0.7)(0.08) = 2.59 t, under the 3 tons
    (2.72 t) a bridge kept open must carry (MBE 6A.8.1 [value from memory]; equation MBE
    6A.8.3 as in Khan 2010 p. 187): the bridge-level recommendation says closing is to be
    considered. RF 0.39: 2.92 t, so it stays open and is posted for 2 t (rounded down once,
    in tonnes): the decision is on the safe load, the same in either unit."""
    cp = pony_rating.postings["TYPE-3"]
    edge = replace(cp, rf=0.38, result=posting(0.38, 25.0))
    rating = replace(pony_rating, postings={**pony_rating.postings, "TYPE-3": edge})
    res = build_results(rating)
    entry = res.posting["TYPE-3"]
    assert entry.action == "close" and entry.posting_tons is None
    assert "is 2.59 tonnes, less than the 3 tons (2.72 tonnes)" in entry.note
    assert res.recommendation.startswith("Consider closing the bridge")
    assert ("the safe posting load is less than 3 tons (2.72 tonnes) for AASHTO legal load "
            "Type 3 (RF 0.38"
            in res.recommendation)
    kept = replace(cp, rf=0.39, result=posting(0.39, 25.0))
    res = build_results(replace(pony_rating, postings={**pony_rating.postings, "TYPE-3": kept}))
    entry = res.posting["TYPE-3"]
    assert entry.action == "post" and entry.posting_tons / TON_PER_TONNE == pytest.approx(2.0)


def _with_case(rating, case_id: str, rf: float):
    """``rating`` with one case's controlling RF replaced (its posting worked again)."""
    cp = rating.postings[case_id]
    W = next(c.load.gross_weight_tons for c in rating.cases if c.id == case_id)
    return replace(rating, postings={**rating.postings,
                                     case_id: replace(cp, rf=rf, result=posting(rf, W))})


def test_an_emergency_vehicle_that_cannot_be_posted_does_not_close_the_bridge(pony_rating):
    """An emergency vehicle with RF below 0.3, or a safe posting load under 3 tons, calls for
    barring such vehicles (and telling the emergency services), not for closing the bridge to
    all traffic (common practice; the owner's policy governs); a truck still closes it."""
    from rating.results import overall_action

    ev3 = next(c for c in pony_rating.cases if c.id == "EV3")
    res = build_results(_with_case(pony_rating, "EV3", 0.25))
    assert res.posting["EV3"].action == "close"  # the case's own outcome is kept
    # (the pony's own bent counter leads with a closure until it is confirmed to act: not this)
    assert not res.recommendation.startswith("Consider closing the bridge:")
    assert "An emergency vehicle cannot be posted: the rating factor is below 0.3 for " \
           f"{ev3.load.name} (RF 0.25" in res.recommendation
    assert "consider barring such vehicles from the bridge" in res.recommendation
    actions = [(res.posting[v.id].action, v.category) for v in res.vehicles
               if v.rating_level == "legal"]
    assert overall_action(actions) == "post"
    # with a truck under 0.3 as well, the bridge is to be considered for closing, and the
    # emergency vehicle is still named apart
    both = build_results(_with_case(_with_case(pony_rating, "EV3", 0.25), "TYPE-3", 0.2))
    assert both.recommendation.startswith("Consider closing the bridge: the rating factor is "
                                          "below 0.3 for AASHTO legal load Type 3 (RF 0.20")
    assert "An emergency vehicle cannot be posted" in both.recommendation
    assert overall_action([(both.posting[v.id].action, v.category) for v in both.vehicles
                           if v.rating_level == "legal"]) == "close"


def test_overall_action_from_each_vehicle() -> None:
    from rating.results import overall_action

    assert overall_action([]) == "none"
    assert overall_action([("none", "legal"), ("none", "emergency")]) == "none"
    assert overall_action([("post", "legal"), ("none", "emergency")]) == "post"
    assert overall_action([("none", "legal"), ("close", "emergency")]) == "post"
    assert overall_action([("close", "owner"), ("post", "emergency")]) == "close"


def test_si_posting_in_whole_tonnes_rounded_once(pony_rating):
    """Every posted load of the SI sample is (W_t / 0.7)(RF - 0.3) rounded down once, W in
    tonnes, RF as printed (not tons rounded down, converted and rounded again)."""
    res = build_results(pony_rating)
    posted = 0
    for case in pony_rating.cases:
        entry = res.posting[case.id]
        if entry.action != "post":
            continue
        posted += 1
        printed = math.floor(entry.rf * 100.0 + 1e-7) / 100.0
        tonnes = case.load.gross_weight_tons / TON_PER_TONNE
        assert entry.posting_tons / TON_PER_TONNE == pytest.approx(
            math.floor(tonnes / 0.7 * (printed - 0.3) + 1e-6)), case.id
    assert posted


def test_notes_of_members_and_of_pins_fold_by_their_text() -> None:
    from rating.results_build import group_member_notes

    lines = ["member A: rusty", "pin at joint L1: shared", "member B: rusty",
             "pin at joint L2: shared", "pin at joint L3: other", "plain note",
             "members C, D: already grouped"]
    assert group_member_notes(lines) == (
        "members A, B: rusty", "pins at joints L1, L2: shared", "pin at joint L3: other",
        "plain note", "members C, D: already grouped")


def test_the_lane_type_legal_load_lists_its_axles_as_they_act() -> None:
    """The lane-type legal load is 0.75 of the Type 3-3's axles plus 0.2 klf (MBE 6A.4.4.2.1
    [value from memory]): the results list the axles it puts on the bridge (they listed the
    Type 3-3's own)."""
    import sys

    sys.path.insert(0, str(Path(__file__).resolve().parent / "lrfr"))
    from demo_bridge import STEEL, make_pratt_bridge, section_for

    from rating.model import MemberDesign
    from rating.model.builders import build_truss

    g = build_truss("pratt", 10, 21.0, 28.0)  # 210 ft: the lane-type load applies
    designs = tuple(MemberDesign(m.label, section_for(m.label, m.role), STEEL)
                    for m in g.members)
    bridge = replace(make_pratt_bridge(pins=False), geometry=g, member_designs=designs)
    res = build_results(rate_bridge(bridge, ["LEGAL-LANE", "TYPE-3-3"]))
    lane = next(v for v in res.vehicles if v.id == "LEGAL-LANE")
    t33 = next(v for v in res.vehicles if v.id == "TYPE-3-3")
    assert lane.axle_loads == pytest.approx(tuple(0.75 * a for a in t33.axle_loads))
    assert lane.lane_load == pytest.approx(0.2)


def test_recommendation_when_no_truck_was_rated() -> None:
    """Only emergency vehicles chosen (Settings or --vehicles): the recommendation says no
    truck legal load was rated; it said "every truck rated has a rating factor of at least
    1.0" with none rated (a reviewer's finding)."""
    bridge = read_workbook(PONY_SI).bridge
    res = build_results(rate_bridge(bridge, ["HL-93", "EV3"]))
    assert res.recommendation.startswith("No truck legal load was rated (the vehicles rated "
                                         "at the legal level: EV3)")
    assert "every truck rated" not in res.recommendation


def test_recommendation_for_a_closure_gives_the_other_trucks_postings(pony_rating):
    """A closure to consider (one truck below 0.3) with other trucks postable: they are given
    as what applies should the owner keep the bridge open, not as a posting beside it."""
    res = build_results(_with_case(pony_rating, "TYPE-3", 0.2))
    assert res.recommendation.startswith("Consider closing the bridge: the rating factor is "
                                         "below 0.3 for AASHTO legal load Type 3 (RF 0.20")
    assert ("Should the owner keep it open meanwhile, the trucks named here must not cross "
            "(no posting covers them), and the other trucks' safe posting loads are:"
            in res.recommendation)
    assert "Post the bridge" not in res.recommendation


def test_an_emergency_vehicle_barred_beside_one_posted(pony_rating):
    """EV3 cannot be posted, EV2 can: EV2's posting is given on its own, not as the sign of
    the class (a 9-ton sign would admit the heavier-axled EV3 the bridge cannot carry)."""
    res = build_results(_with_case(pony_rating, "EV3", 0.25))
    assert "An emergency vehicle cannot be posted: the rating factor is below 0.3" \
        in res.recommendation
    assert "Other emergency vehicles may be posted one by one: Emergency vehicle EV2 " \
        in res.recommendation
    assert "Emergency vehicles: post for" not in res.recommendation


def test_shvs_screened_out_are_trucks_rated() -> None:
    """The NRL and the SHVs it screens out (each at least 1.0) are trucks that were rated:
    the recommendation does not say none was (a reviewer's finding)."""
    import sys

    sys.path.insert(0, str(Path(__file__).resolve().parent / "lrfr"))
    from demo_bridge import make_pratt_bridge

    strong = make_pratt_bridge(pins=False, distribution_factor_override=0.2)
    res = build_results(rate_bridge(strong, ["NRL"]))
    assert not res.recommendation.startswith("No truck legal load was rated")
    assert res.recommendation.startswith("No load restriction is indicated for trucks")


def test_an_rf_past_any_rating_reads_in_the_recommendation_as_in_the_tables() -> None:
    """A member that cannot carry its dead load rates -inf: the recommendation wrote "RF
    -inf" where the tables print "\u2212\u221e"; both print it alike now."""
    import math

    from rating.results_build import _rf_words

    assert _rf_words(-math.inf) == "\u2212\u221e"
    assert _rf_words(0.456) == "0.45"  # (two decimals, rounded down, as printed)


def test_a_bent_member_that_would_lower_the_posting_makes_the_recommendation_conditional(
        pony_rating):
    """A bent counter the ratings rest on, without which the trucks would be posted lower
    (not closed): the headline is conditional on it, as for a closure (a reviewer would not
    sign a posting whose lower alternative is only in a warning). Without it no worse than
    the rating's own: nothing is added."""
    from rating.lrfr.engine import WithoutMember

    assert pony_rating.without["L2U3"].verdict == "a closure to consider"  # (the sample)
    # (the sample's own other condition, its loop rod, left out: the bent member alone here)
    lower = replace(pony_rating, conditions=(), without={"L2U3": WithoutMember(
        "a posting", 0.40, "SU4", "U2L3", lowered=(("SU4", 3.0),))})
    rec = build_results(lower).recommendation
    # the lower loads first: they apply until the member is confirmed to act (a reviewer
    # read the higher posting, printed first, as the one to sign)
    assert rec.startswith("Until L2U3 is confirmed to act (recorded bent), post the bridge "
                          "for lower loads (without L2U3, lowest truck RF 0.40 (SU4, U2L3); "
                          "posted lower: Specialized hauling vehicle SU4 3 tonnes (9 as "
                          "rated); members only, see the warning). If L2U3 is confirmed to "
                          "act (recorded bent): post the bridge.")
    # a lower RF that posts no truck lower changes nothing the engineer decides
    same = replace(pony_rating, conditions=(), without={"L2U3": WithoutMember(
        "a posting", 0.40, "SU4", "U2L3")})
    assert not build_results(same).recommendation.startswith(("Only if", "Until "))


def test_a_sensitivity_that_posts_another_truck_lower_makes_the_headline_conditional(
        pony_rating):
    """The lowest truck RF unchanged, but another truck posted lower without the bent member
    (``WithoutMember.lowered``, from rating.lrfr.engine.trucks_verdict against the rating's
    own postings): still conditional, naming the trucks (a reviewer's finding)."""
    from rating.lrfr.engine import WithoutMember

    main_rf = min(cp.rf for cid, cp in pony_rating.postings.items()
                  if cid in ("SU4", "SU5", "SU6", "SU7", "TYPE-3", "TYPE-3S2", "TYPE-3-3"))
    w = WithoutMember("a posting", main_rf, "SU6", "U2L3", lowered=(("TYPE-3S2", 12.0),))
    rec = build_results(replace(pony_rating, conditions=(), without={"L2U3": w})
                        ).recommendation
    assert rec.startswith("Until L2U3 is confirmed to act (recorded bent), post the bridge "
                          "for lower loads (without L2U3, lowest truck RF")
    assert ("posted lower: AASHTO legal load Type 3S2 12 tonnes (17 as rated); members only"
            in rec)


def test_two_bent_members_say_the_gravest_consequence(pony_rating):
    from rating.lrfr.engine import WithoutMember

    lower = WithoutMember("a posting", 0.40, "SU4", "U2L3", lowered=(("SU4", 3.0),))
    closing = WithoutMember("a closure to consider", 0.12, "SU7", "U1L2")
    rec = build_results(replace(pony_rating, conditions=(),
                                without={"L2U3": lower, "U1L2": closing})).recommendation
    # the closure first, for the member whose not acting would close the bridge alone (a
    # bent member is taken as not acting until it is confirmed to); the one that would only
    # lower the postings follows with its own clause (a reviewer found them joined)
    assert rec.startswith("Consider closing the bridge unless U1L2 is confirmed to act "
                          "(recorded bent): without U1L2, lowest truck RF 0.12 (SU7, U1L2); "
                          "members only, see the warning. Until L2U3 is confirmed to act "
                          "(recorded bent), post the bridge for lower loads (without L2U3, "
                          "lowest truck RF 0.40 (SU4, U2L3); posted lower: Specialized "
                          "hauling vehicle SU4 3 tonnes (9 as rated); members only, see the "
                          "warning). If L2U3 is confirmed to act (recorded bent) and U1L2 is "
                          "confirmed to act (recorded bent): post the bridge.")
    # (each condition rated on its own: said where there are several)
    assert "Each condition is rated on its own; where more than one of them fails, the loads " \
        "may be lower still" in rec


def test_trucks_verdict_names_the_trucks_posted_lower(pony_rating):
    from rating.lrfr.engine import trucks_verdict
    from rating.lrfr.posting import PostingAction

    own = pony_rating.postings
    cid = next(c for c, cp in own.items() if cp.result.action is PostingAction.POST
               and c == "TYPE-3S2")
    lower = dict(own)
    lower[cid] = replace(own[cid], rf=own[cid].rf - 0.1)
    (got,) = trucks_verdict(lower, pony_rating.cases, against=own).lowered
    assert got[0] == cid and got[1] < own[cid].result.posting_tons
    assert trucks_verdict(own, pony_rating.cases, against=own).lowered == ()
    assert trucks_verdict(lower, pony_rating.cases).lowered == ()


def test_a_posting_lower_in_tonnes_only_is_lower_for_an_si_bridge(pony_rating):
    """An SI bridge's signs are worked in whole tonnes: an RF that lowers the tonnes sign
    but not the tons one (or the other way) is judged in tonnes (MBE 6A.8.3 [value from
    memory], rounded down once in the bridge's unit)."""
    from rating.lrfr.engine import trucks_verdict
    from rating.lrfr.posting import posting_load

    own = pony_rating.postings
    cid = "TYPE-3"
    W = next(c.load.gross_weight_tons for c in pony_rating.cases if c.id == cid)
    # two RFs 0.01 apart, both posted, whose signs differ in tonnes but not in tons
    pairs = [(r / 100 + 0.01, r / 100) for r in range(40, 99)
             if posting_load(r / 100 + 0.01, W) == posting_load(r / 100, W)
             and posting_load(r / 100 + 0.01, W / TON_PER_TONNE)
             > posting_load(r / 100, W / TON_PER_TONNE)]
    hi, lo = pairs[0]
    main = {**own, cid: replace(own[cid], rf=hi, result=posting(hi, W))}
    other = {**own, cid: replace(own[cid], rf=lo, result=posting(lo, W))}
    (got,) = trucks_verdict(other, pony_rating.cases, against=main, metric=True).lowered
    assert got == (cid, posting_load(lo, W / TON_PER_TONNE))
    assert trucks_verdict(other, pony_rating.cases, against=main).lowered == ()


def test_the_sensitivities_compare_with_the_ratings_own_postings_in_its_unit(monkeypatch):
    """End to end through rate_bridge: the bent member's sensitivity is compared with the
    rating's own postings (``lowered``), for this SI bridge in tonnes (a reviewer found that
    leaving the comparison out failed no test)."""
    import rating.lrfr.engine as engine

    seen = []
    real = engine._worse_posting

    def spy(a, b, W_tons, metric):
        seen.append(metric)
        return real(a, b, W_tons, metric)

    monkeypatch.setattr(engine, "_worse_posting", spy)
    rated = rate_bridge(read_workbook(PONY_SI).bridge, ["TYPE-3", "SU4", "SU7"])
    assert rated.without["L2U3"].lowered
    assert seen and all(seen)


PRATT = PONY_SI.parent / "tc0417_pratt_1898.xlsx"


def test_emergency_vehicles_and_permits_rest_on_a_sensitivity_too():
    """A sensitivity that leaves the trucks unrestricted but posts an emergency vehicle
    lower, or no longer carries a permit, still makes the headline conditional (a reviewer's
    1906 bridge: the older steel took EV3 from 1.06 to 0.90 and the crane permit from carried
    to not as requested, under an unconditional "no load restriction"). End to end: the
    older steel rated again for the emergency vehicles too."""
    import sys

    from rating.lrfr.engine import CARRIED, Condition, WithoutMember

    sys.path.insert(0, str(Path(__file__).resolve().parent / "lrfr"))
    from test_engine import _by_year

    r = rate_bridge(_by_year(1906), ["TYPE-3", "SU4", "EV3"])
    (cond,) = r.conditions
    assert "EV3" in dict(cond.result.lowered)
    rec = build_results(r).recommendation
    assert "Emergency vehicle EV3 22 tons (27 as rated)" in rec

    rated = rate_bridge(read_workbook(PRATT).bridge, ["TYPE-3", "EV3", "TAM-CRANE"],
                        what_if=False)
    carried = replace(rated, postings={**rated.postings, "TAM-CRANE": replace(
        rated.postings["TAM-CRANE"], permit=CARRIED)})
    ev_only = WithoutMember("no restriction", 1.2, "TYPE-3", "L1U1", lowered=(("EV3", 5.0),))
    lost = WithoutMember("no restriction", 1.2, "TYPE-3", "L1U1", permits_lost=("TAM-CRANE",))
    for w, then in ((ev_only, "post the bridge for lower loads"),
                    (lost, "withhold the permits it would not carry")):
        text = build_results(replace(carried, conditions=(Condition(
            "the steel is confirmed of the later grade", "the steel is the older grade", w),))
                             ).recommendation
        assert text.startswith(f"Until the steel is confirmed of the later grade, {then} (")
        assert ". If the steel is confirmed of the later grade, no load restriction" in text
    assert "not carried: mobile crane to Hollis Mill" in text
    assert "only if the steel is confirmed of the later grade" in text  # (the permit's own)
