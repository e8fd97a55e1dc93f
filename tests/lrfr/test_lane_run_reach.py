"""The stretch of deck searched for loads with a lane part or a variable spacing on the load
path (rating.lrfr.engine.LANE_RUN_REACH_PANELS) is a screen of judgement, not a proven bound:
on the bundled samples the whole deck gives the same ratings (common practice: a screen is
checked against a wider one on the cases at hand)."""

from __future__ import annotations

from pathlib import Path

import pytest

import rating.lrfr.engine as engine_module
from rating.inventory.reader import read_workbook
from rating.lrfr.engine import rate_bridge

SAMPLES = Path(__file__).resolve().parents[2] / "sample_inventory"
LANE_LOADS = ["HL-93", "LEGAL-LANE"]


def rfs(rated) -> dict[tuple[str, str], float]:
    members = {key: r.rf for key, r in rated.ratings.items()}
    pins = {(p.joint, cid): r.rf for p in rated.pins for cid, r in p.ratings.items()}
    return members | pins


@pytest.mark.parametrize("book", ["tc0903_pony_1903_si.xlsx", "tc0417_pratt_1898.xlsx",
                                  "tc0622_parker_1907.xlsx"])
def test_the_whole_deck_gives_the_same_ratings_of_lane_loads(book, monkeypatch):
    bridge = read_workbook(SAMPLES / book).bridge
    usual = rate_bridge(bridge, LANE_LOADS)
    assert usual.dependent_members, "the sample must have members rated on the load path"
    monkeypatch.setattr(engine_module, "LANE_RUN_REACH_PANELS", 1000.0)
    whole = rfs(rate_bridge(bridge, LANE_LOADS))
    assert whole.keys() == rfs(usual).keys()
    for key, rf in rfs(usual).items():
        assert whole[key] == pytest.approx(rf, rel=1e-12), key


def _parker_five_panels():
    """A 5-panel Parker with counters in panels 2 and 4 (invented test data; a reviewer's
    random bridge): its hanger L1U1's least HL-93 multiplier on the path is the design
    tandem's, where among the envelope positions the truck's was least."""
    from dataclasses import replace

    from demo_bridge import laced_channels, make_pratt_bridge

    from rating.model import (
        EyebarSet,
        Material,
        MaterialKind,
        MemberDesign,
        RatingSettings,
        RodEnd,
        RodSet,
    )
    from rating.model.builders import build_truss

    steel = Material(MaterialKind.STEEL, F_y=26.0, F_u=48.0, E=29000.0)

    def bars(w, t, D, d):
        return EyebarSet(2, w, t, D, d)

    chord = laced_channels(6.0, 2.56, 0.38, 0.44, 4.8, cover=(9.92, 0.375))
    post = laced_channels(6.0, 2.56, 0.38, 0.44, 4.8)
    sections = {
        "L0L1": bars(3.5, 0.625, 9.25, 3.90625), "L1L2": bars(4.5, 0.625, 11.0, 4.03125),
        "L2L3": bars(3.0, 0.875, 8.75, 4.03125), "L3L4": bars(3.0, 0.875, 8.75, 4.03125),
        "L4L5": bars(3.5, 0.875, 9.5, 4.15625), "U1U2": chord, "U2U3": chord, "U3U4": chord,
        "L0U1": laced_channels(9.0, 3.34, 0.47, 0.56, 7.2, cover=(13.88, 0.375)),
        "L5U4": laced_channels(7.0, 2.82, 0.41, 0.48, 5.6, cover=(11.24, 0.375)),
        "L1U1": bars(5.0, 0.875, 11.75, 4.03125), "L2U2": post, "L3U3": post,
        "L4U4": bars(4.5, 0.75, 11.0, 4.03125), "U1L2": bars(3.5, 0.625, 9.5, 4.03125),
        "L1U2": RodSet(1, 1.5, RodEnd.UPSET), "U2L3": bars(3.0, 0.625, 8.75, 4.03125),
        "L2U3": bars(3.0, 0.625, 8.75, 4.03125), "L3U4": bars(3.0, 0.875, 8.75, 4.03125),
        "U3L4": RodSet(1, 1.75, RodEnd.UPSET)}
    g = build_truss("parker", 5, 16.0, [28.49, 33.39, 33.39, 28.49], counter_panels=(2, 4))
    base = make_pratt_bridge(pins=False)
    return replace(base, geometry=g,
                   member_designs=tuple(MemberDesign(m, s, steel) for m, s in sections.items()),
                   cross_section=replace(base.cross_section, truss_spacing_ft=26.0,
                                         roadway_width_ft=24.0),
                   settings=RatingSettings(adtt_one_direction=500.0))


def test_each_models_least_is_searched_not_only_the_least_models(monkeypatch):
    """Among the envelope positions the hanger's least HL-93 multiplier was the truck's, so
    only the truck's run was searched on the path; the design tandem's run holds the least
    there: the default gave L1U1 1.72 against 1.56 over the whole deck (10 % high). Each
    model's least now has its run (within 0.5 % of the whole deck)."""
    bridge = _parker_five_panels()
    usual = rate_bridge(bridge, ["HL-93"], what_if=False)
    monkeypatch.setattr(engine_module, "LANE_RUN_REACH_PANELS", 1000.0)
    whole = rate_bridge(bridge, ["HL-93"], what_if=False)
    for cid in ("HL-93-INV", "HL-93-OPR"):
        a, b = usual.ratings[("L1U1", cid)].rf, whole.ratings[("L1U1", cid)].rf
        assert b <= a <= b * 1.005, (cid, a, b)


def test_the_lane_type_legal_load_on_a_span_over_200_ft(monkeypatch):
    """The samples' spans are 190 ft or less, so the lane-type legal load (spans over 200 ft,
    MBE 6A.4.4.2.1 [value from memory]) never ran in the test above: a 208 ft Pratt with
    counters, the whole deck against the default, within 1 % (common practice for a screen;
    a reviewer saw 1.3 % at most on such spans)."""
    from dataclasses import replace

    from demo_bridge import make_pratt_bridge

    from rating.model.builders import build_truss

    base = make_pratt_bridge(pins=False)
    bridge = replace(base, geometry=build_truss("pratt", 8, 26.0, 28.0, counter_panels=(4, 5)))
    usual = rate_bridge(bridge, ["LEGAL-LANE"], what_if=False)
    assert [c.id for c in usual.cases] == ["LEGAL-LANE"] and usual.dependent_members
    monkeypatch.setattr(engine_module, "LANE_RUN_REACH_PANELS", 1000.0)
    whole = rate_bridge(bridge, ["LEGAL-LANE"], what_if=False)
    for key, r in usual.ratings.items():
        b = whole.ratings[key].rf
        if 0 < b < 1e9:
            assert b <= r.rf * (1 + 1e-9) and r.rf <= b * 1.01, (key, r.rf, b)


@pytest.mark.parametrize("panels", [9, 10])
def test_a_bars_push_is_found_on_another_members_lane_pattern(panels, monkeypatch):
    """Where a bar would have to push (rating.lrfr.engine._sense_plans) depends on which
    tension-only members the loading lets go, and the lane pattern that does it can be one
    chosen for another member: on double-intersection trusses with eyebar diagonals
    (invented test data; a reviewer's random bridge showed the same) the default search gave
    HL-93 inventory RFs 18 % (9 panels, U3L5) and 36 % (10 panels) above the whole deck's.
    Every member's pattern is now driven over the whole deck for the bars' pushes, and the
    runs where one is reached are searched: the same ratings as the whole deck. The lowest
    push rating is checked by an independent linear program (scipy's linprog, statics of a
    pin-jointed truss): just below it some equilibrium has every bar pulling, just above none
    has."""
    from demo_bridge import double_intersection_bridge, tension_only_equilibrium

    from rating.lrfr.liveload import live_joint_loads

    bridge = double_intersection_bridge(panels)
    usual = rate_bridge(bridge, ["HL-93"], what_if=False)
    monkeypatch.setattr(engine_module, "LANE_RUN_REACH_PANELS", 1000.0)
    whole = rate_bridge(bridge, ["HL-93"], what_if=False)
    assert any(r.check == "compression: tension-only member" and 0 < r.rf < 1e9
               for r in whole.ratings.values())
    for key, r in usual.ratings.items():
        assert r.rf == pytest.approx(whole.ratings[key].rf, rel=1e-9), key
    pushes = [r for (_, cid), r in usual.ratings.items() if cid == "HL-93-INV"
              and r.check == "compression: tension-only member" and 0 < r.rf < 1e9]
    low = min(pushes, key=lambda r: r.rf)
    case = next(c for c in usual.cases if c.id == "HL-93-INV")
    g, d = usual.geometry, usual.dead
    P_dead = low.gamma_dc * d.joint_loads_dc_kip + low.gamma_dw * d.joint_loads_dw_kip
    P_live = case.gamma_ll.value * live_joint_loads(g, case.load, low.extreme, case.im.value,
                                                    usual.distribution_factor)
    assert tension_only_equilibrium(g, P_dead + 0.99 * low.rf * P_live)
    assert not tension_only_equilibrium(g, P_dead + 1.01 * low.rf * P_live)


def test_the_screens_are_said_where_they_act():
    """The report says how the searches on the load path were narrowed, where they were: a
    lane load's or a variable spacing's runs, and the pins' search between positions."""
    bridge = read_workbook(SAMPLES / "tc0417_pratt_1898.xlsx").bridge
    lane = "a load with a lane part or a variable axle spacing (HL-93) is driven"
    pins = "Pins at joints with members on the load path are searched between"
    rated = rate_bridge(bridge, ["HL-93", "TYPE-3"], what_if=False)
    assert rated.dependent_members
    assert any(lane in a and "over 2 of the longest panels" in a for a in rated.assumptions)
    assert any(pins in a and "within 1.1 times" in a and "grid of 64 steps" in a
               for a in rated.assumptions)
    # fixed axles alone: only the pins' screens act
    trucks = rate_bridge(bridge, ["TYPE-3"], what_if=False)
    assert not any(lane in a for a in trucks.assumptions)
    assert any(pins in a for a in trucks.assumptions)


def test_no_screen_is_said_without_a_load_path():
    from dataclasses import replace

    from demo_bridge import make_pratt_bridge

    from rating.model.builders import build_truss

    base = make_pratt_bridge(pins=True)
    bridge = replace(base, geometry=build_truss("pratt", 8, 18.0, 24.0))  # (no counters)
    rated = rate_bridge(bridge, ["HL-93"], what_if=False)
    assert not rated.dependent_members and rated.pins
    assert not any("screen of judgement" in a or "screens of judgement" in a
                   for a in rated.assumptions)
