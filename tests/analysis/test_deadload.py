"""Dead load: lumping, lever rule, DC/DW apart, against closed forms.

Closed forms (common practice): with simple-span stringers, panel-point loads from a uniform
load w give the simple-beam moment w x (L - x) / 2 at every panel point, so a chord force is
that moment over the depth; the lever rule shares a load at offset e from the centre line of
trusses s apart as 1/2 - e/s and 1/2 + e/s.
"""

from __future__ import annotations

import numpy as np
import pytest

from rating.analysis.deadload import MemberWeight, dead_load, lever_rule_share
from rating.errors import InputError
from rating.model import CrossSection, DeadLoadBasis, DeadLoadItem, DeadLoadKind
from rating.model.builders import build_truss

N, P, H = 8, 20.0, 25.0
L = N * P


@pytest.fixture(scope="module")
def g():
    return build_truss("pratt", N, P, H, counter_panels=(4, 5))


def weights(g, area=0.0):
    return {m.label: MemberWeight(area, 490.0) for m in g.members}


def test_uniform_deck_load_gives_beam_moment_over_depth(g):
    cs = CrossSection(truss_spacing_ft=18.0, roadway_width_ft=16.0)
    items = (DeadLoadItem("asphalt 2 in", DeadLoadKind.DW, DeadLoadBasis.PSF_DECK, 25.0),)
    r = dead_load(g, cs, items, weights(g))
    w = 25.0 * 16.0 / 1000.0 / 2.0  # klf per truss
    f = dict(zip([m.label for m in g.members], r.member_forces_dw_kip, strict=True))
    for i in range(2, N // 2 + 1):
        x = (i - 1) * P  # moment centre of bottom chord panel i is U(i-1)
        assert f[f"L{i - 1}L{i}"] == pytest.approx(w * x * (L - x) / 2.0 / H, rel=1e-9)
    assert np.allclose(r.member_forces_dc_kip, 0.0)
    assert "L3U4" in r.slack_members and "U4L5" in r.slack_members


def test_self_weight_with_detail_allowance(g):
    cs = CrossSection(18.0, 16.0)
    r = dead_load(g, cs, (), weights(g, area=12.0), detail_allowance=0.2,
                  detail_allowance_given=True)
    total_len = sum(g.member_length_ft(m.label) for m in g.members)
    expected = 12.0 / 144.0 * total_len * 490.0 / 1000.0 * 1.2
    assert r.self_weight_kip == pytest.approx(expected, rel=1e-12)
    # all of it reaches the supports: the sum of joint loads equals the weight
    assert -r.joint_loads_dc_kip[:, 1].sum() == pytest.approx(expected, rel=1e-12)
    assert not any("assumed" in a for a in r.assumptions)
    r2 = dead_load(g, cs, (), weights(g, area=12.0))
    assert any("15%" in a and "assumed" in a for a in r2.assumptions)


def test_lever_rule_and_heavier_truss_is_rated(g):
    assert lever_rule_share(3.0, 18.0) == pytest.approx((0.5 - 3 / 18, 0.5 + 3 / 18))
    cs = CrossSection(18.0, 16.0)
    items = (
        DeadLoadItem("utility pipe", DeadLoadKind.DW, DeadLoadBasis.PLF_BRIDGE, 60.0,
                     offset_ft=6.0),
        DeadLoadItem("floorbeam", DeadLoadKind.DC, DeadLoadBasis.KIP_PER_FLOORBEAM, 1.2),
    )
    r = dead_load(g, cs, items, weights(g))
    assert r.rated_truss == "right"
    shares = dict(r.share_by_item)
    assert shares["utility pipe"] == pytest.approx(0.5 + 6 / 18)
    dc_total = -r.joint_loads_dc_kip[:, 1].sum()
    assert dc_total == pytest.approx(1.2 * 0.5 * len(g.deck_joints))


def test_the_wearing_surface_is_kept_apart_within_dw(g):
    """DW is the wearing surface and the utilities (AASHTO LRFD 3.3.2 [value from memory]);
    the wearing surface (DW in psf of deck) is kept apart within it because a measured one
    takes its own load factor (MBE 6A.4.2.2 [value from memory]). Closed form: its chord
    forces are the beam moment of its own line load over the depth; DW is the sum."""
    cs = CrossSection(truss_spacing_ft=18.0, roadway_width_ft=16.0)
    items = (DeadLoadItem("asphalt 2 in", DeadLoadKind.DW, DeadLoadBasis.PSF_DECK, 25.0),
             DeadLoadItem("water main", DeadLoadKind.DW, DeadLoadBasis.PLF_BRIDGE, 60.0),
             DeadLoadItem("deck", DeadLoadKind.DC, DeadLoadBasis.PSF_DECK, 50.0))
    r = dead_load(g, cs, items, weights(g))
    f = dict(zip([m.label for m in g.members], r.member_forces_dw_surface_kip, strict=True))
    w = 25.0 * 16.0 / 1000.0 / 2.0  # klf per truss, the asphalt alone
    for i in range(2, N // 2 + 1):
        x = (i - 1) * P
        assert f[f"L{i - 1}L{i}"] == pytest.approx(w * x * (L - x) / 2.0 / H, rel=1e-9)
    alone = dead_load(g, cs, items[1:2], weights(g))
    assert np.allclose(r.member_forces_dw_kip - r.member_forces_dw_surface_kip,
                       alone.member_forces_dw_kip, rtol=1e-12, atol=1e-12)
    assert np.allclose(r.joint_loads_dw_kip - r.joint_loads_dw_surface_kip,
                       alone.joint_loads_dw_kip, rtol=1e-12, atol=1e-12)
    assert not np.any(alone.member_forces_dw_surface_kip)


def test_missing_section_is_named(g):
    w = weights(g)
    del w["U2U3"]
    with pytest.raises(InputError, match="U2U3"):
        dead_load(g, CrossSection(18.0, 16.0), (), w)


def test_deck_truss_loads_the_upper_chord():
    g = build_truss("pratt", 6, 20.0, 18.0, deck_position="deck")
    assert g.deck_joints[0] == "U0"
    r = dead_load(g, CrossSection(20.0, 18.0),
                  (DeadLoadItem("deck", DeadLoadKind.DC, DeadLoadBasis.PSF_DECK, 50.0),),
                  weights(g))
    loaded = {g.joints[i].label for i in np.nonzero(r.joint_loads_dc_kip[:, 1])[0]}
    assert loaded == set(g.deck_joints)


def test_the_rated_truss_is_named(g):
    """The heavier truss is rated, and the results say which (the lever rule puts a pipe
    6 ft right of the centre line mostly on the right truss: 0.5 + 6/18 of it)."""
    cs = CrossSection(18.0, 16.0)
    pipe = DeadLoadItem("pipe", DeadLoadKind.DW, DeadLoadBasis.PLF_BRIDGE, 60.0, offset_ft=6.0)
    r = dead_load(g, cs, (pipe,), weights(g))
    right = 60.0 / 1000.0 * L * (0.5 + 6 / 18)
    said = [a for a in r.assumptions if a.startswith("The right truss is rated")]
    assert said and f"{right:.1f} kip against {60.0 / 1000.0 * L - right:.1f} kip" in said[0]
    even = dead_load(g, cs, (), weights(g))
    assert any(a.startswith("The two trusses take the same share") for a in even.assumptions)
