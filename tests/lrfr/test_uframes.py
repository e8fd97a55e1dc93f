"""A pony truss's top chord rated out of its plane on the U-frames of verticals and floorbeams
(rating.lrfr.uframes). The mechanics are checked in tests/analysis/test_uframe.py; here, what
the rating does with them, on the bundled pony sample (invented data)."""

from __future__ import annotations

import math
from dataclasses import replace
from pathlib import Path

import pytest

from rating.analysis.uframe import uframe_stiffness_kip_per_in
from rating.inventory.reader import read_workbook
from rating.lrfr.engine import rate_bridge
from rating.lrfr.reported import reported_rf
from rating.lrfr.uframes import UFRAME_ASSUMPTION, pony_chord
from rating.model import DeckPosition, MemberRole

ROOT = Path(__file__).resolve().parents[2]
CHORD = (MemberRole.TOP_CHORD, MemberRole.END_POST)


@pytest.fixture(scope="module")
def pony():
    b = read_workbook(ROOT / "sample_inventory" / "tc0903_pony_1903_si.xlsx")
    b = getattr(b, "bridge", b)
    assert b.geometry.deck_position is DeckPosition.PONY
    # read in mm4 from the SI workbook: 183,000,000 mm4 / 25.4^4 (NIST SP 811)
    assert b.cross_section.floorbeam_I_in4 == pytest.approx(183e6 / 25.4 ** 4)
    return b


def _with_floorbeam(b, I_in4):
    return replace(b, cross_section=replace(b.cross_section, floorbeam_I_in4=I_in4))


@pytest.fixture(scope="module")
def ratings(pony):
    """The sample rated for TYPE-3 without the floorbeam (chord held at each panel point),
    with it, and with a floorbeam ten times as stiff."""
    return {I: rate_bridge(_with_floorbeam(pony, I), ["TYPE-3"], what_if=False)
            for I in (None, pony.cross_section.floorbeam_I_in4,
                      10.0 * pony.cross_section.floorbeam_I_in4)}


def _buckling(cap):
    return next(c for c in cap.checks if c.name == "compression: flexural buckling")


def test_without_the_floorbeam_the_chord_is_held_at_each_panel_point(ratings):
    r = ratings[None]
    assert not any(a.startswith(UFRAME_ASSUMPTION) for a in r.assumptions)
    assert any("give the floorbeam's moment of inertia" in w for w in r.warnings)
    for m in r.geometry.members:
        if m.role in CHORD:
            assert "KL out of plane" not in _buckling(r.capacities[m.label]).detail


def test_on_its_u_frames_the_chord_is_longer_and_weaker_never_stronger(ratings, pony):
    base, on = ratings[None], ratings[pony.cross_section.floorbeam_I_in4]
    assert any(a.startswith(UFRAME_ASSUMPTION) for a in on.assumptions)
    for m in on.geometry.members:
        lab = m.label
        if m.role in CHORD:
            cap = on.capacities[lab]
            assert "KL out of plane" in _buckling(cap).detail
            assert cap.factored_resistance("compression") <= \
                base.capacities[lab].factored_resistance("compression") + 1e-9
            assert on.ratings[(lab, "TYPE-3")].rf <= base.ratings[(lab, "TYPE-3")].rf + 1e-9
        else:  # the other members are rated as before
            assert on.ratings[(lab, "TYPE-3")].rf == pytest.approx(
                base.ratings[(lab, "TYPE-3")].rf, rel=1e-12)


def test_a_stiffer_floorbeam_never_lowers_the_chord(ratings, pony):
    I = pony.cross_section.floorbeam_I_in4
    on, stiff = ratings[I], ratings[10.0 * I]
    for m in on.geometry.members:
        if m.role in CHORD:
            assert stiff.ratings[(m.label, "TYPE-3")].rf >= \
                on.ratings[(m.label, "TYPE-3")].rf - 1e-9


def test_the_springs_are_the_uprights_u_frames(ratings, pony):
    # each inner joint of the chord: the U-frame of its vertical (four laced angles), by the
    # statics of rating.analysis.uframe; the hip verticals of this truss are loop rods, which
    # hold nothing out of plane (no spring)
    r = ratings[pony.cross_section.floorbeam_I_in4]
    g = r.geometry
    compression = {m.label: -float(dc + dw) for m, dc, dw in zip(
        g.members, r.dead.member_forces_dc_kip, r.dead.member_forces_dw_kip, strict=True)}
    chord = pony_chord(g, r.capacities, compression, pony.cross_section.truss_spacing_ft,
                       pony.cross_section.floorbeam_I_in4)
    assert chord is not None
    for joint, frame in chord.frames.items():
        who, c = frame.upright, frame.spring_kip_per_in
        up = [m for m in g.members_at(joint) if m.role in (MemberRole.VERTICAL,
                                                            MemberRole.HANGER)]
        assert len(up) == 1
        s_ = r.capacities[up[0].label].summary
        if up[0].role is MemberRole.HANGER:
            assert (who, c) == ("", 0.0) and "no bending stiffness" in frame.why
            continue
        # AASHTO LRFD 6.14.2.9 [value from memory]: 0.30 klf at the top chord's panel
        # points, over the joint's share of the chord (a panel here), at the post's height
        panel = g.span_ft / (len(g.deck_joints) - 1)
        assert frame.force_kip == pytest.approx(0.30 * panel)
        assert frame.moment_kip_in == pytest.approx(frame.force_kip
                                                    * g.member_length_ft(who) * 12.0)
        expect = uframe_stiffness_kip_per_in(
            g.member_length_ft(up[0].label) * 12.0, pony.cross_section.truss_spacing_ft * 12.0,
            s_.E, s_.A_g_in2 * s_.r_out_of_plane_in ** 2, pony.cross_section.floorbeam_I_in4)
        assert who == up[0].label and c == pytest.approx(expect)
    # every chord member's length out of plane is at least K L, and what its check used
    for lab, KL_ft in chord.lengths_ft.items():
        cap = r.capacities[lab]
        assert KL_ft >= cap.summary.K * g.member_length_ft(lab) - 1e-9
        assert math.isfinite(KL_ft)


def test_a_through_truss_ignores_the_floorbeam():
    from demo_bridge import make_pratt_bridge

    b = make_pratt_bridge(pins=False)
    base = rate_bridge(b, ["TYPE-3"], what_if=False)
    with_fb = rate_bridge(_with_floorbeam(b, 800.0), ["TYPE-3"], what_if=False)
    assert not any(a.startswith(UFRAME_ASSUMPTION) for a in with_fb.assumptions)
    for key, rating in base.ratings.items():
        assert with_fb.ratings[key].rf == rating.rf


def test_a_warren_pony_without_verticals_is_not_analysed_and_says_so():
    # no top-chord joint has an upright down to a floorbeam: the chord is held by inclined
    # frames alone, which are not modelled; rated as before, and the warning says why
    from demo_bridge import STEEL, make_pratt_bridge, section_for

    from rating.model import MemberDesign
    from rating.model.builders import build_truss

    g = build_truss("warren", 6, 20.0, 12.0, deck_position="pony")
    designs = tuple(MemberDesign(m.label, section_for(m.label, m.role), STEEL)
                    for m in g.members)
    b = replace(make_pratt_bridge(pins=False), geometry=g, member_designs=designs)
    base = rate_bridge(b, ["TYPE-3"], what_if=False)
    on = rate_bridge(_with_floorbeam(b, 800.0), ["TYPE-3"], what_if=False)
    assert not any(a.startswith(UFRAME_ASSUMPTION) for a in on.assumptions)
    assert any("the U-frames were not analysed" in w for w in on.warnings)
    for key, rating in base.ratings.items():
        assert on.ratings[key].rf == rating.rf


def test_the_hips_continuity_is_said_with_what_a_hinge_there_would_give(ratings, pony):
    r = ratings[pony.cross_section.floorbeam_I_in4]
    text = next(a for a in r.assumptions if a.startswith(UFRAME_ASSUMPTION))
    assert "continuous in bending out of plane through its joints" in text
    assert "hinged there at the hips (U1, U5)" in text
    assert "U1: none (L1U1, of bars or rods, has no bending stiffness out of the truss " \
        "plane)" in text
    assert "0.3 klf at the top chord's panel points" in text


def test_each_u_frame_force_is_worked_to_a_stress_and_warned_past_yield(ratings, pony):
    # M / S_y at the post's foot, S_y its least section modulus out of plane after loss
    # (rating.capacity.sections, checked against sectionproperties in tests/reference)
    from rating.capacity.sections import section_properties
    from rating.model import Finding, FindingRegion

    r = ratings[pony.cross_section.floorbeam_I_in4]
    g = r.geometry
    compression = {m.label: -float(dc + dw) for m, dc, dw in zip(
        g.members, r.dead.member_forces_dc_kip, r.dead.member_forces_dw_kip, strict=True)}

    def least_S(label):
        d = pony.design_of(label)
        rep = section_properties(d.section, member=label, findings=pony.findings_for(label),
                                 length_ft=g.member_length_ft(label))
        return min(s.properties.S_y_in3 for s in rep.compression if s.properties)

    chord = pony_chord(g, r.capacities, compression, pony.cross_section.truss_spacing_ft,
                       pony.cross_section.floorbeam_I_in4,
                       S_y_in3={m.label: least_S(m.label) for m in g.members
                                if m.role is MemberRole.VERTICAL})
    framed = [f for f in chord.frames.values() if f.upright]
    assert framed
    for f in framed:
        assert f.stress_ksi == pytest.approx(f.moment_kip_in / least_S(f.upright))
        assert 0 < f.stress_ksi < f.F_y_ksi  # the sample's posts: within yield
    assert not any("U-frame force" in w for w in r.warnings)
    # a fifth of each angle of post L2U2 gone: past yield, and said
    worn = tuple(Finding("L2U2", a, FindingRegion.BODY, percent_loss=20.0, where="test")
                 for a in ("A-1", "A-2", "A-3", "A-4"))
    r2 = rate_bridge(replace(pony, findings=pony.findings + worn), ["TYPE-3"], what_if=False)
    assert any(w.startswith("U-FRAME POSTS PAST YIELD: the U-frame force of AASHTO LRFD "
                            "6.14.2.9") and "bends L2U2 (" in w for w in r2.warnings)


def test_a_taller_u_frame_is_softer(ratings, pony):
    # the floorbeam hung below the bottom chord: the frame's height is longer than the post
    # and the spring softer, so the chord no stronger (statics of the U-frame)
    I = pony.cross_section.floorbeam_I_in4
    on = ratings[I]
    post = on.geometry.member_length_ft("L2U2")
    tall = replace(pony, cross_section=replace(pony.cross_section, uframe_height_ft=post + 1.0))
    r = rate_bridge(tall, ["TYPE-3"], what_if=False)
    text = next(a for a in r.assumptions if a.startswith(UFRAME_ASSUMPTION))
    assert f"the frame's height {post + 1.0:.5g} ft as given" in text
    for m in r.geometry.members:
        if m.role in CHORD:
            assert r.ratings[(m.label, "TYPE-3")].rf <= on.ratings[(m.label, "TYPE-3")].rf


def test_a_chord_hinged_at_its_hips_is_rated_so(ratings, pony):
    # the Bridge sheet can give the chord as hinged out of plane at the hips (butted on the
    # pin): the rating uses it, and says what continuity there would give
    I = pony.cross_section.floorbeam_I_in4
    on = ratings[I]
    hinged = replace(pony, cross_section=replace(pony.cross_section, chord_hinged_at_hips=True))
    r = rate_bridge(hinged, ["TYPE-3"], what_if=False)
    text = next(a for a in r.assumptions if a.startswith(UFRAME_ASSUMPTION))
    assert "hinged out of plane at the hips (U1, U5), as the Bridge sheet gives" in text
    assert "continuous there too, it would buckle at" in text
    lower = 0
    for m in r.geometry.members:
        if m.role in CHORD:
            a, b = r.ratings[(m.label, "TYPE-3")].rf, on.ratings[(m.label, "TYPE-3")].rf
            assert a <= b + 1e-9
            lower += a < b
    assert lower  # the end posts and the top chord's ends lose their hold at the hips


def test_a_chord_that_is_a_mechanism_out_of_plane_has_no_buckling_strength(pony):
    # hinged at the hips, with posts L2U2 and L4U4 broken: the top chord between the hips is
    # held by the one U-frame at U3 and turns about it, the end posts being links pinned at
    # both ends: a mechanism out of plane (statics), so no buckling strength at all
    from rating.model import BarState, Finding, FindingRegion

    gone = tuple(Finding(lab, "all", FindingRegion.BODY, bar_state=BarState.BROKEN,
                         where="test") for lab in ("L2U2", "L4U4"))
    b = replace(pony, findings=pony.findings + gone,
                cross_section=replace(pony.cross_section, chord_hinged_at_hips=True))
    r = rate_bridge(b, ["TYPE-3"], what_if=False)
    text = next(a for a in r.assumptions if a.startswith(UFRAME_ASSUMPTION))
    assert "the chord is a mechanism out of plane and has no buckling strength" in text
    for m in r.geometry.members:
        if m.role in CHORD:
            assert r.capacities[m.label].factored_resistance("compression") < 1e-6
    # continuous at the hips, the same chord stands
    cont = rate_bridge(replace(b, cross_section=replace(b.cross_section,
                                                        chord_hinged_at_hips=False)),
                       ["TYPE-3"], what_if=False)
    assert all(cont.capacities[m.label].factored_resistance("compression") > 1.0
               for m in cont.geometry.members if m.role in CHORD)


def test_hips_not_given_are_rated_hinged_too_and_said_where_they_decide(pony):
    # the sample gives its hips as continuous: no such rating; not given, the trucks are
    # rated again with the chord hinged there, and where that posts or closes the warning
    # is headed in capitals, with the lowest truck RF of that rating
    given = rate_bridge(pony, ["TYPE-3", "SU4"])
    assert pony.cross_section.chord_hinged_at_hips is False
    assert not any("at the hips (U1, U5), the Bridge sheet not" in w for w in given.warnings)
    blank = replace(pony, cross_section=replace(pony.cross_section, chord_hinged_at_hips=None))
    r = rate_bridge(blank, ["TYPE-3", "SU4"])
    w = next(w for w in r.warnings if "at the hips (U1, U5), the Bridge sheet not" in w)
    hinged = rate_bridge(replace(pony, cross_section=replace(
        pony.cross_section, chord_hinged_at_hips=True)), ["TYPE-3", "SU4"], what_if=False)
    low = min((hinged.postings[c] for c in ("TYPE-3", "SU4")), key=lambda cp: cp.rf)
    assert f"lowest truck RF {reported_rf(low.rf):.2f} ({low.case}, {low.controlling})" in w
    assert w.startswith("CHORD AT THE HIPS NOT GIVEN:")
    hips = next(c for c in r.conditions if "hips" in c.holds)
    assert hips.result.lowered  # (compared with the rating's own postings, truck by truck)
    for key, rating in given.ratings.items():  # (the rating itself is the continuous one)
        assert r.ratings[key].rf == rating.rf


def test_where_hinged_hips_would_close_the_bridge_the_recommendation_leads_with_it(pony):
    # the SI pony, hips not given: with them hinged the trucks give a closure to consider,
    # so the recommendation's headline rests on their continuity, as on the bent counter
    from rating.results_build import build_results

    blank = replace(pony, cross_section=replace(pony.cross_section, chord_hinged_at_hips=None))
    res = build_results(rate_bridge(blank))
    text = res.recommendation
    assert text.startswith("Consider closing the bridge unless L2U3 is confirmed to act "
                           "(recorded bent) and the top chord is confirmed continuous out of "
                           "plane at the hips (U1, U5): if L2U3 does not act, without L2U3")
    assert "; if the top chord is hinged at the hips (U1, U5), lowest truck RF" in text
    # (the sample's loop rod L1U1 is a condition too, one that would lower the postings)
    assert ". If L2U3 is confirmed to act (recorded bent) and the loss at the loop of L1U1 is " \
        "confirmed local (not along the bar around the pin) and the top chord is confirmed " \
        "continuous out of plane at the hips (U1, U5): post the bridge" in text
