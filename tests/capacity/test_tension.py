"""Tension: LRFD yielding/fracture forms, AISC LRFD 1999 D3 pin-plate forms, eyebars, rods.

Sources beside each check. Hand values are worked in the comments (kip, in, ksi).
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from rating.capacity.sections import section_properties
from rating.capacity.tension import (
    _governing,
    fracture_nominal,
    pin_plate_effective_width_in,
    pin_plate_shear_nominal,
    pin_plate_tension_nominal,
    tension_checks,
    yielding_nominal,
)
from rating.model import (
    BarState,
    BuiltUpSection,
    EyebarSet,
    Finding,
    FindingRegion,
    Material,
    MaterialKind,
    MemberRole,
    PlatePart,
    RodEnd,
    RodSet,
)

STEEL = Material(MaterialKind.STEEL, F_y=26.0, F_u=52.0)


def checks(section, findings=(), **kw):
    r = section_properties(section, member="M", findings=findings, length_ft=20.0)
    return tension_checks(r, STEEL, **kw)


def by_name(result, word):
    (c,) = [c for c in result.checks if word in c.name]
    return c


def test_lrfd_yield_and_fracture_forms():
    # AASHTO LRFD 6.8.2.1, Eqs. 6.8.2.1-1/-2 [value from memory]; SSDH Sec. 13, Eqs. 13.11-13.12
    # [V]: P_ny = F_y A_g = 36 x 10 = 360; P_nu = F_u A_n U = 58 x 8.5 x 0.85 = 419.05
    assert yielding_nominal(10.0, 36.0) == pytest.approx(360.0)
    assert fracture_nominal(8.5, 58.0, 0.85) == pytest.approx(419.05)


def test_aisc_1999_d3_pin_plate_forms():
    # AISC LRFD 1999 D3.1(a) [V]: b_eff = 2t + 0.63 <= edge; P_n = 2 t b_eff F_u
    # t = 1, edge 4.5: b_eff = 2.63, P_n = 2 x 1 x 2.63 x 58 = 305.08
    assert pin_plate_effective_width_in(1.0, 4.5) == pytest.approx(2.63)
    assert pin_plate_tension_nominal(1.0, 4.5, 58.0) == pytest.approx(305.08)
    # t = 2, edge 3.0: 2t + 0.63 = 4.63 > 3.0, so b_eff = 3.0; P_n = 2 x 2 x 3 x 58 = 696
    assert pin_plate_tension_nominal(2.0, 3.0, 58.0) == pytest.approx(696.0)
    # AISC LRFD 1999 D3.1(b) [V]: A_sf = 2 t (a + d/2) = 2 x 1 x (4.5 + 2.5) = 14;
    # P_n = 0.6 A_sf F_u = 0.6 x 14 x 58 = 487.2
    assert pin_plate_shear_nominal(1.0, 4.5, 5.0, 58.0) == pytest.approx(487.2)


def test_eyebar_checks_against_d3_forms():
    e = EyebarSet(2, 6.0, 1.0, 15.0, 5.03)
    t = checks(e)
    body = by_name(t, "body yielding")
    # body: F_y A_body = 26 x 2 x 6 x 1 = 312 (LRFD 6.8.2.1-1; body as A_g, AISC 1999 D3.2)
    assert body.R_n_kip == pytest.approx(312.0) and body.phi == 0.95
    head = by_name(t, "through the pin hole")
    # edge = (15 - 5.03)/2 = 4.985 > 2.63: P_n = 2 bars x 2 x 1 x 2.63 x 52 = 547.04 (D3-1)
    assert head.R_n_kip == pytest.approx(2 * 2 * 1.0 * 2.63 * 52.0)
    assert head.phi == 0.75
    shear = by_name(t, "beyond")
    # a = 4.985, d = 5.03: A_sf = 2 x 1 x (4.985 + 2.515) = 15.0; 2 bars x 0.6 x 15 x 52 = 936
    assert shear.R_n_kip == pytest.approx(2 * 0.6 * 15.0 * 52.0)
    net = by_name(checks(e, head_as_pin_plate=False), "net section through")
    # LRFD 6.8.2.1-2 on the head: F_u (D_h - d) t per bar = 52 x 9.97 x 2 = 1036.88
    assert net.R_n_kip == pytest.approx(52.0 * 9.97 * 2) and net.phi == 0.80


def test_eyebar_head_loss_governs_at_its_location():
    e = EyebarSet(2, 6.0, 1.0, 15.0, 5.03)
    f = Finding("M", "bar 1", FindingRegion.HEAD, station_ft=19.5, remaining_thickness_in=0.5,
                where="Findings!D3")
    head = by_name(checks(e, (f,)), "through the pin hole")
    # bar 1 head 0.5 thick: b_eff = 1.63; 2 x 0.5 x 1.63 x 52 + 2 x 1 x 2.63 x 52
    assert head.R_n_kip == pytest.approx(2 * 0.5 * 1.63 * 52 + 2 * 1.0 * 2.63 * 52)
    assert head.finding is f and head.location.station_ft == 19.5
    body = by_name(checks(e, (f,)), "body yielding")
    assert body.finding is None  # head loss does not touch the body


def test_waddell_head_proportions():
    # Waddell, De Pontibus 1898, p. 176 [V]: through the hole >= 1.5 x body;
    # beyond the hole >= 0.65 x through the hole
    small = checks(EyebarSet(1, 6.0, 1.0, 12.0, 5.03))  # (12 - 5.03)/6 = 1.16 < 1.5
    assert any("1.16 x the body" in w for w in small.warnings)
    ok = checks(EyebarSet(1, 6.0, 1.0, 15.0, 5.03, head_beyond_hole_in=7.0))  # 7/9.97 = 0.70
    assert not any("Waddell" in w for w in ok.warnings)
    short = checks(EyebarSet(1, 6.0, 1.0, 15.0, 5.03, head_beyond_hole_in=3.0))  # 0.30
    assert any("0.30 of the section through the hole" in w for w in short.warnings)


def test_multi_bar_sum_over_bars_that_carry_load():
    e = EyebarSet(4, 6.0, 1.0, 15.0, 5.03)
    all4 = by_name(checks(e), "body yielding").R_n_kip
    loose = by_name(checks(e, (Finding("M", "bar 4", bar_state=BarState.BROKEN),)),
                    "body yielding")
    assert loose.R_n_kip == pytest.approx(0.75 * all4)  # 3 of 4 bars [common practice]
    none = checks(e, (Finding("M", "all", bar_state=BarState.MISSING),))
    assert by_name(none, "body yielding").R_n_kip == 0.0
    assert any("no bar or part is left" in w for w in none.warnings)


def test_loss_in_different_parts_of_different_bars_takes_each_bar_at_its_weakest():
    # Bar 1 has lost its head, bar 2 its body: each bar is no stronger than its weakest part
    # and the bars act side by side, so the set carries the sum of each bar's least factored
    # resistance (common practice), not the least of "every body" and "every head".
    e = EyebarSet(2, 6.0, 1.0, 15.0, 5.03)
    head_loss = Finding("M", "bar 1", FindingRegion.HEAD, remaining_thickness_in=0.3,
                        where="Findings!D3")
    body_loss = Finding("M", "bar 2", FindingRegion.BODY, remaining_thickness_in=0.4,
                        where="Findings!D4")
    r = checks(e, (head_loss, body_loss))
    # bar 1 head, AISC LRFD 1999 D3.1(a) [V]: b_eff = 2 x 0.3 + 0.63 = 1.23,
    #   P_n = 2 x 0.3 x 1.23 x 52 = 38.376, phi 0.75 -> 28.782 kip
    #   (its body: 0.95 x 26 x 6 x 1 = 148.2; beyond the hole: 0.75 x 0.6 x 2 x 0.3 x (4.985
    #   + 2.515) x 52 = 105.3)
    # bar 2 body, AASHTO LRFD 6.8.2.1-1 [value from memory]: 26 x 6 x 0.4 = 62.4, phi 0.95
    #   -> 59.28 kip (its head: 0.75 x 2 x 1 x 2.63 x 52 = 205.14)
    # the set: 28.782 + 59.28 = 88.062 kip, on R_n = 38.376 + 62.4 = 100.776 kip
    each = by_name(r, "each at their weakest")
    assert each.phi_R_n_kip == pytest.approx(28.782 + 59.28)
    assert each.R_n_kip == pytest.approx(38.376 + 62.4)
    assert "bar 1 head through the hole" in each.detail and "bar 2 body" in each.detail
    # the checks of one part over both bars are each far above it: body 0.95 x 26 x 6 x 1.4
    # = 207.48, heads 0.75 x (38.376 + 2 x 1 x 2.63 x 52) = 233.9
    assert by_name(r, "body yielding").phi_R_n_kip == pytest.approx(207.48)
    assert min(c.phi_R_n_kip for c in r.checks) == pytest.approx(88.062)


def test_rods_each_at_their_weakest_part():
    # rod 1 has lost half its diameter at the upset end, rod 2 half in its body: 1.5 in rods,
    # F_y 26, F_u 52 (AASHTO LRFD 6.8.2.1 [value from memory], phi_y 0.95, phi_u 0.80)
    rods = RodSet(2, 1.5, RodEnd.UPSET)
    end = Finding("M", "bar 1", FindingRegion.THREAD, percent_loss=50.0)
    body = Finding("M", "bar 2", FindingRegion.BODY, percent_loss=50.0)
    r = checks(rods, (end, body))
    full, half = math.pi / 4 * 1.5**2, math.pi / 4 * 0.75**2  # 1.7671, 0.4418 in2
    # rod 1: end 0.80 x 52 x 0.4418 = 18.38 (body 0.95 x 26 x 1.7671 = 43.65)
    # rod 2: body 0.95 x 26 x 0.4418 = 10.91 (end 0.80 x 52 x 1.7671 = 73.51)
    each = by_name(r, "rods each at their weakest")
    assert each.phi_R_n_kip == pytest.approx(0.80 * 52 * half + 0.95 * 26 * half)
    # the sums over both rods of one part are well above: body 0.95 x 26 x (full + half)
    assert by_name(r, "body yielding").phi_R_n_kip == pytest.approx(0.95 * 26 * (full + half))
    assert "rod 1 upset end" in each.detail and "rod 2 body" in each.detail


def test_no_each_bar_check_where_one_part_governs_every_bar():
    e = EyebarSet(2, 6.0, 1.0, 15.0, 5.03)
    both = Finding("M", "all", FindingRegion.BODY, remaining_thickness_in=0.5)
    assert not [c for c in checks(e, (both,)).checks if "weakest" in c.name]
    assert not [c for c in checks(e).checks if "weakest" in c.name]


def test_rods_threaded_upset_loop():
    # rods: threaded ends on the root area, upset ends on the body [common practice]
    thr = checks(RodSet(2, 1.5, RodEnd.THREADED, root_diameter_in=1.29))
    body = by_name(thr, "body yielding")
    root = by_name(thr, "thread root")
    assert body.R_n_kip == pytest.approx(26.0 * 2 * math.pi * 0.75**2)  # 91.89
    assert root.R_n_kip == pytest.approx(52.0 * 2 * math.pi / 4 * 1.29**2)  # 135.9
    ups = checks(RodSet(1, 1.5, RodEnd.UPSET))
    assert by_name(ups, "upset end").R_n_kip == pytest.approx(52.0 * math.pi * 0.75**2)
    loop = checks(RodSet(1, 1.25, RodEnd.LOOP))
    flagged = section_properties(RodSet(1, 1.25, RodEnd.LOOP), member="M").warnings
    assert any("VTRC 11-R13" in w for w in flagged)  # forge-welded loops flagged [V]
    assert by_name(loop, "forge line").phi == 0.80


def test_builtup_yield_fracture_and_slenderness_warning():
    s = BuiltUpSection(parts=(PlatePart("p", 8.0, 0.5),), hole_diameter_in=1.0,
                       holes_per_section=2, shear_lag_U=0.9)
    t = checks(s)
    assert by_name(t, "yielding").R_n_kip == pytest.approx(26 * 4.0)
    assert by_name(t, "fracture").R_n_kip == pytest.approx(52 * (4.0 - 2 * 1.0 * 0.5) * 0.9)
    r = section_properties(s, member="M", length_ft=20.0)
    # L/r = 240 / (0.5/sqrt(12)) = 1663 > 200 (AASHTO LRFD 6.8.4) [value from memory]
    w = tension_checks(r, STEEL, role=MemberRole.DIAGONAL, length_ft=20.0).warnings
    assert any("exceeds 200" in x for x in w)
    w2 = tension_checks(r, STEEL, role=MemberRole.SUB_TIE, length_ft=20.0).warnings
    assert any("exceeds 240" in x for x in w2)


class _Loc:
    """A stand-in location with a nominal resistance ``v``."""

    def __init__(self, v: float, k: int) -> None:
        self.v = v
        self.location = f"location {k}"


@pytest.mark.parametrize("values", [[3.0], [2.0, 1.0, 1.0, 4.0], [1.0, 1.0], [5.0, -0.0, 0.0],
                                    [2.0, math.nan, 1.0], [math.nan, 1.0], [1.0, math.inf]])
def test_governing_location_is_numpys_first_least(values):
    # the governing location is the one np.argmin picks (first on a tie, the first NaN),
    # found in plain Python for a handful of locations
    c = _governing("x", 1.0, "", [_Loc(v, k) for k, v in enumerate(values)], lambda s: s.v,
                   lambda s: "")
    k = int(np.argmin(np.array(values)))
    assert c.location == f"location {k}"
    assert math.copysign(1.0, c.R_n_kip) == math.copysign(1.0, values[k])
    assert c.R_n_kip == values[k] or (math.isnan(c.R_n_kip) and math.isnan(values[k]))


def test_loss_at_a_loop_is_said_to_be_rated_as_local():
    # Loss at a loop is checked for fracture only, as a local section (AASHTO LRFD 6.8.2.1
    # [value from memory]); a loop is a length of bar, and loss along it would make yielding
    # on the reduced section govern. A 1.25 in loop rod, 40 % of its diameter gone at the loop:
    # A = pi/4 (0.75)^2 = 0.4418 in2; fracture 0.80 x 52 x 0.4418 = 18.38 kip, yielding on it
    # 0.95 x 26 x 0.4418 = 10.91 kip: said, with that number.
    loss = Finding("M", "rod 1", FindingRegion.THREAD, percent_loss=40.0, where="Findings!B5")
    r = checks(RodSet(1, 1.25, RodEnd.LOOP), (loss,))
    assert min(c.phi_R_n_kip for c in r.checks) == pytest.approx(0.80 * 52 * 0.441786, rel=1e-4)
    (said,) = [w for w in r.warnings if "the loss at its loop" in w]
    assert "= 10.9 kip, against phi R_n = 18.4 kip as rated" in said
    # an upset end's thread root is a local section by its nature: nothing said
    r = checks(RodSet(1, 1.25, RodEnd.UPSET), (loss,))
    assert not [w for w in r.warnings if "the loss at its loop" in w]
