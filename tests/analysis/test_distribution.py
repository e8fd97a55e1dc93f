"""Lever rule and multiple presence against hand statics."""

from __future__ import annotations

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from rating.analysis.distribution import (
    design_lane_count,
    lateral_distribution,
    lever_rule_fraction,
    multiple_presence_factor,
)
from rating.errors import InputError
from rating.model import CrossSection


def test_design_lanes_and_multiple_presence():
    # Design lanes INT(w / 12), two lanes for 20 to 24 ft [value from memory, AASHTO LRFD
    # 3.6.1.1.1]; multiple presence 1.20 / 1.00 / 0.85 / 0.65 [value from memory, AASHTO LRFD
    # Table 3.6.1.1.2-1].
    assert design_lane_count(9.0) == 1
    assert design_lane_count(17.9) == 1
    # for a rating, 18 to 20 ft carries two lanes as well [value from memory, MBE 6A.2.3.2]
    assert design_lane_count(18.0) == 2 and design_lane_count(19.5) == 2
    assert design_lane_count(18.0, two_lanes_18_to_20_ft=False) == 1
    assert design_lane_count(22.0) == 2
    assert design_lane_count(22.0, two_lanes_20_to_24_ft=False) == 1
    assert design_lane_count(36.0) == 3
    assert design_lane_count(50.0) == 4
    assert [multiple_presence_factor(k) for k in (1, 2, 3, 4, 6)] == [1.2, 1.0, 0.85, 0.65, 0.65]


def test_an_si_roadway_on_a_lane_limit_keeps_its_lanes():
    # 5.4864 m is 18 ft exactly, and the reader's conversion gives 17.999999999999996 ft: the
    # same bridge in SI lost its second lane (every RF about 19 % high). Widths are compared
    # to a millionth of a foot.
    from rating.units import to_core

    assert to_core(5.4864, "m") < 18.0  # (the conversion's round-off, as the reader makes it)
    assert design_lane_count(to_core(5.4864, "m")) == 2
    assert design_lane_count(to_core(7.3152, "m")) == 2  # 24 ft
    assert design_lane_count(to_core(3.6576 * 3, "m")) == 3  # 36 ft
    assert design_lane_count(17.99) == 1


def test_one_lane_hand_statics():
    # Hand statics (lever rule, simple floorbeam; common practice): trusses 16 ft apart,
    # roadway 14 ft centred (curbs at 1 and 15 ft). Wheels 2 ft from the curb and 6 ft apart
    # [value from memory, AASHTO LRFD 3.6.1.3.1]: at 3 and 9 ft. Share to the left truss
    # (13 + 7) / 16 / 2 = 0.625 of one vehicle; x 1.20 (one lane) = 0.75.
    r = lateral_distribution(CrossSection(16.0, 14.0))
    assert r.design_lanes == 1
    assert r.governing.loaded_lanes == 1
    assert r.governing.wheel_offsets_ft == pytest.approx((3.0, 9.0))
    assert r.governing.share == pytest.approx(0.625)
    assert r.factor == pytest.approx(0.75)
    assert r.basis == "lever rule"
    assert "0.750" in r.description


def test_two_lane_hand_statics():
    # Hand statics: trusses 26 ft apart, roadway 24 ft (curbs at 1 and 25 ft), two 12-ft lanes.
    # Lane 1 wheels at 3 and 9 ft, lane 2 at 15 and 21 ft. Two lanes: (23 + 17 + 11 + 5) / 26 / 2
    # = 1.0769 x 1.00; one lane: (23 + 17) / 26 / 2 = 0.7692 x 1.20 = 0.9231. Two lanes govern.
    r = lateral_distribution(CrossSection(26.0, 24.0))
    one = [c for c in r.cases if c.truss == "left" and c.loaded_lanes == 1][0]
    two = [c for c in r.cases if c.truss == "left" and c.loaded_lanes == 2][0]
    assert one.factor == pytest.approx(40 / 52 * 1.2)
    assert two.wheel_offsets_ft == pytest.approx((3.0, 9.0, 15.0, 21.0))
    assert two.factor == pytest.approx(56 / 52)
    assert r.governing.loaded_lanes == 2
    assert r.factor == pytest.approx(56 / 52)


def test_twenty_to_twenty_four_ft_roadway_two_half_width_lanes():
    # 22 ft roadway: two lanes of 11 ft [value from memory, AASHTO LRFD 3.6.1.1.1]. Trusses
    # 24 ft apart, curbs at 1 and 23 ft. Wheels at 3, 9 and 14, 20 ft: (21 + 15 + 10 + 4) / 24 / 2
    # = 1.0417 (two lanes, m = 1.00) against one lane (21 + 15) / 48 x 1.2 = 0.90.
    r = lateral_distribution(CrossSection(24.0, 22.0))
    assert r.design_lanes == 2 and r.lane_width_ft == pytest.approx(11.0)
    assert r.factor == pytest.approx(50 / 48)
    r1 = lateral_distribution(CrossSection(24.0, 22.0), two_lanes_20_to_24_ft=False)
    assert r1.design_lanes == 1
    assert r1.factor == pytest.approx(36 / 48 * 1.2)


def test_off_centre_roadway_governs_nearer_truss():
    # Hand statics: trusses 20 ft apart, 12-ft roadway from 6 to 18 ft (sidewalk on the left).
    # Toward the right truss: wheels at 16 and 10 ft, share (16 + 10) / 20 / 2 = 0.65 x 1.2.
    r = lateral_distribution(CrossSection(20.0, 12.0, left_curb_ft=6.0))
    assert r.governing.truss == "right"
    assert r.factor == pytest.approx(0.65 * 1.2)


def test_narrow_roadways_warn_or_refuse():
    r = lateral_distribution(CrossSection(14.0, 9.0))
    assert r.design_lanes == 1
    assert any("narrower than 10 ft" in w for w in r.warnings)
    # 9 ft roadway centred: vehicle centred on the roadway, wheels at 4 and 10 ft: share 0.5
    assert r.governing.wheel_offsets_ft == pytest.approx((4.0, 10.0))
    assert r.factor == pytest.approx(0.5 * 1.2)
    with pytest.raises(InputError, match="wheel gauge"):
        lateral_distribution(CrossSection(14.0, 5.0), where="Bridge!C12")
    with pytest.raises(InputError, match="truss spacing"):
        lateral_distribution(CrossSection(0.0, 12.0))


def test_owner_override_and_lane_count_override():
    r = lateral_distribution(CrossSection(16.0, 14.0), override=0.8)
    assert r.factor == 0.8 and r.basis == "owner override"
    assert r.lever_rule_factor == pytest.approx(0.75)
    assert "owner" in r.description
    low = lateral_distribution(CrossSection(16.0, 14.0), override=0.5)
    assert any("below the lever-rule" in w for w in low.warnings)
    with pytest.raises(InputError):
        lateral_distribution(CrossSection(16.0, 14.0), override=-1.0)
    two = lateral_distribution(CrossSection(26.0, 18.0, lane_count_override=2))
    assert two.design_lanes == 2 and two.lane_width_ft == pytest.approx(9.0)
    assert not any("less than the" in w for w in two.warnings)
    # one lane on a 44 ft roadway (3 design lanes, AASHTO LRFD 3.6.1.1.1 [value from memory])
    # raised a reviewer's Type 3 RF from 0.74 to 1.11 without a word
    one = lateral_distribution(CrossSection(48.0, 44.0, lane_count_override=1))
    assert any("the owner's lane count (1) is less than the 3 design lanes of a 44 ft "
               "roadway" in w for w in one.warnings)


@settings(max_examples=100, deadline=None)
@given(S=st.floats(10, 40), frac=st.floats(0.3, 1.0))
def test_shares_to_both_trusses_sum_to_vehicles(S, frac):
    # Statics: the two floorbeam reactions carry the whole load, so for the same placement the
    # shares to the left and right trusses add up to the number of vehicles (common practice).
    w = max(6.5, S * frac)
    x = 0.3 * S
    left, right = lever_rule_fraction(x, S)
    assert left + right == pytest.approx(1.0)
    r = lateral_distribution(CrossSection(S, w))
    for c in r.cases:
        other = sum(lever_rule_fraction(x, S)[1 if c.truss == "left" else 0]
                    for x in c.wheel_offsets_ft) / 2.0
        assert c.share + other == pytest.approx(c.loaded_lanes)


def test_eighteen_to_twenty_ft_roadway_two_half_width_lanes():
    # 18 ft roadway: two lanes of 9 ft for a rating [value from memory, MBE 6A.2.3.2]. Trusses
    # 20 ft apart, curbs at 1 and 19 ft. A 9 ft lane cannot keep a 6 ft gauge 2 ft from both
    # its edges, so each vehicle is centred in its lane: wheels at 2.5, 8.5 and 11.5, 17.5 ft.
    # Two lanes: (17.5 + 11.5 + 8.5 + 2.5) / 20 / 2 = 1.000 x m 1.00 (hand statics; the two
    # vehicles together are symmetric about the centre line: one vehicle to each truss);
    # one lane, wheels 2 ft from the curb at 3 and 9 ft: (17 + 11) / 40 x 1.2 = 0.840. Two
    # lanes govern.
    r = lateral_distribution(CrossSection(20.0, 18.0))
    assert r.design_lanes == 2 and r.lane_width_ft == pytest.approx(9.0)
    two = [c for c in r.cases if c.truss == "left" and c.loaded_lanes == 2][0]
    assert two.wheel_offsets_ft == pytest.approx((2.5, 8.5, 11.5, 17.5))
    assert r.factor == pytest.approx(1.0)
    assert "MBE 6A.2.3.2" in r.description
    # the owner's lane count still governs (a bridge signed and rated as one lane)
    one = lateral_distribution(CrossSection(20.0, 18.0, lane_count_override=1))
    assert one.design_lanes == 1 and one.factor == pytest.approx(0.84)
    assert "MBE 6A.2.3.2" not in one.description


def test_a_tie_names_the_truss_rated_for_dead_load():
    # a centred roadway gives both trusses the same share (hand statics above): the live load
    # is described for the truss the dead load rates; an off-centre one keeps its own truss
    left = lateral_distribution(CrossSection(16.0, 14.0))
    right = lateral_distribution(CrossSection(16.0, 14.0), prefer="right")
    assert left.governing.truss == "left" and right.governing.truss == "right"
    assert right.factor == left.factor and "toward the right truss" in right.description
    off = lateral_distribution(CrossSection(20.0, 12.0, left_curb_ft=6.0), prefer="left")
    assert off.governing.truss == "right"
