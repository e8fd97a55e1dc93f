"""Moving-load engine against closed forms and hand statics."""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from scipy import integrate

from rating.analysis.influence import InfluenceLines
from rating.analysis.moving import (
    Direction,
    VehiclePosition,
    adverse_areas,
    axle_extremes,
    axle_stations,
    concurrent_forces,
    concurrent_lane_forces,
    concurrent_with,
    envelope,
)
from rating.errors import InputError
from rating.model.vehicles import AxleSpacing, Vehicle, VehicleCategory
from rating.vehicles import rating_load, vehicle


def _veh(loads, gaps, vid="T", lane=0.0) -> Vehicle:
    sp = tuple(g if isinstance(g, AxleSpacing) else AxleSpacing(g, g) for g in gaps)
    return Vehicle(vid, vid, VehicleCategory.OWNER, tuple(loads), sp, sum(loads) / 2.0,
                   lane_load_klf=lane)


def _lines(stations, *rows) -> InfluenceLines:
    return InfluenceLines(tuple(f"M{i}" for i in range(len(rows))),
                          np.asarray(stations, dtype=float), np.asarray(rows, dtype=float))


def _beam_moment_lines(L: float, sections: np.ndarray) -> InfluenceLines:
    """Moment influence lines of a simply supported beam at each section, sampled at the
    sections themselves (exact: each line is linear between them, kink at its section)."""
    x = sections
    a = x[:, None]
    Y = np.where(x[None, :] <= a, x[None, :] * (L - a) / L, a * (L - x[None, :]) / L)
    return InfluenceLines(tuple(f"x={v:.4f}" for v in x), x, Y)


def _barre_absolute_max(P: np.ndarray, D: np.ndarray, L: float) -> float:
    """Absolute maximum moment of a simple beam under a moving series, by Barre's theorem:
    it occurs under a load placed so that the load and the resultant of all loads on the span
    are equidistant from midspan. Checked for every load; statics for the moment.
    """
    x_r = float(P @ D / P.sum())  # resultant, measured back from the front axle
    best = -np.inf
    for k in range(P.size):
        # front axle at f: load k at f - D[k], resultant at f - x_r; midspan bisects them
        f = L / 2.0 + (D[k] + x_r) / 2.0
        xs = f - D
        if xs.min() < 0 or xs.max() > L:
            continue  # Barre's placement assumes every load on the span
        R_left = float(P @ (L - xs)) / L
        xk = xs[k]
        left = xs < xk
        best = max(best, R_left * xk - float(P[left] @ (xk - xs[left])))
    return best


def test_barre_absolute_maximum_moment():
    # Hibbeler, Structural Analysis, ch. 6 "Absolute maximum shear and moment" (Barre's
    # theorem; section number value from memory). Beam 100 ft, loads 8/32/32 kip at 14/14 ft:
    # resultant 18.667 ft behind the front axle, so the governing section is at 47.667 ft and
    # every section on a 1/3 ft grid (which contains it) is a "member" of the fine beam.
    L = 100.0
    P = np.array([8.0, 32.0, 32.0])
    D = np.array([0.0, 14.0, 28.0])
    sections = np.arange(0, 301) * (L / 300.0)
    lines = _beam_moment_lines(L, sections)
    ex = axle_extremes(lines, _veh(P, [14.0, 14.0]))
    expected = _barre_absolute_max(P, D, L)
    assert ex.value_kip[0].max() == pytest.approx(expected, rel=1e-10)
    k = int(np.argmax(ex.value_kip[0]))
    assert sections[k] == pytest.approx(L / 2 - (18.0 + 2 / 3 - 14.0) / 2, abs=1e-9)
    # moment lines of a simple beam are never negative
    assert np.all(ex.value_kip[1] == 0.0)


def test_reverse_travel_governs_hand_statics():
    # Hand statics: line 0 at 0 ft, 1.0 at 90 ft, 0 at 100 ft; axles 10 kip (front), 30 kip
    # at 10 ft. Forward (front ahead at larger x): best 10 x 1 + 30 x 80/90 = 36.67 kip.
    # Reverse: rear axle over the peak, front axle 10 ft toward x = 0: 30 + 10 x 80/90 = 38.89.
    lines = _lines([0.0, 90.0, 100.0], [0.0, 1.0, 0.0])
    v = _veh([10.0, 30.0], [10.0])
    fwd = axle_extremes(lines, v, directions=[Direction.FORWARD])
    assert fwd.value_kip[0, 0] == pytest.approx(10 + 30 * 80 / 90)
    both = axle_extremes(lines, v)
    assert both.value_kip[0, 0] == pytest.approx(30 + 10 * 80 / 90)
    pos = both.position(0, 0)
    assert pos.direction is Direction.REVERSE
    assert pos.front_axle_ft == pytest.approx(80.0)
    assert axle_stations(pos) == pytest.approx([80.0, 90.0])


def test_variable_spacing_interior_value_hand_statics():
    # Hand statics: two unit peaks 30 ft apart (10 and 40 ft), zero elsewhere; HL-93 truck
    # 8/32/32 at 14 and 14-30 ft [V AASHTO LRFD 3.6.1.2.2]. Best: the middle 32-kip axle on one
    # peak and the rear 32-kip axle on the other, rear spacing 30 ft (the upper limit); the
    # front axle then stands 14 ft beyond the second peak, off the line: 32 + 32 = 64 kip.
    lines = _lines([0.0, 10.0, 20.0, 30.0, 40.0, 50.0], [0, 1, 0, 0, 1, 0])
    truck = vehicle("HL93-TRUCK")
    ex = axle_extremes(lines, truck)
    assert ex.value_kip[0, 0] == pytest.approx(64.0)
    assert ex.spacings_ft[0, 0, 1] == pytest.approx(30.0)
    # a peak distance inside the range: peaks 20 ft apart -> rear spacing 20 ft
    lines = _lines([0.0, 10.0, 20.0, 30.0, 40.0], [0, 1, 0, 1, 0])
    ex = axle_extremes(lines, truck)
    assert ex.value_kip[0, 0] == pytest.approx(64.0)
    assert ex.spacings_ft[0, 0, 1] == pytest.approx(20.0)
    pos = ex.position(0, 0)
    x = axle_stations(pos)
    assert sorted(x[1:]) == pytest.approx([10.0, 30.0])


def test_design_truck_at_midspan_uses_shortest_rear_spacing():
    # Closed form: midspan moment of a 100-ft simple beam, peak L/4 = 25 ft-kip/kip, slope 1/2;
    # middle axle over midspan, others 14 ft away: 32 x 25 + (8 + 32) x 18 = 1520 kip-ft.
    lines = _beam_moment_lines(100.0, np.array([0.0, 50.0, 100.0]))
    sub = InfluenceLines(("mid",), lines.stations_ft, lines.ordinates[1:2])
    ex = axle_extremes(sub, vehicle("HL93-TRUCK"))
    assert ex.value_kip[0, 0] == pytest.approx(1520.0)
    assert ex.spacings_ft[0, 0] == pytest.approx([14.0, 14.0])


def test_lane_load_equals_w_times_same_sign_area_closed_form():
    # Closed form (triangle areas, 1/2 x base x height): line 0, -0.4, +0.5, 0 at 0, 40, 50,
    # 100 ft; zero crossing at 40 + 10 x 0.4/0.9 ft. Positive area 0.5 x (50 - xc) x 0.5 +
    # 0.5 x 50 x 0.5; negative area 0.5 x 40 x 0.4 + 0.5 x (xc - 40) x 0.4.
    lines = _lines([0.0, 40.0, 50.0, 100.0], [0.0, -0.4, 0.5, 0.0])
    xc = 40 + 10 * 0.4 / 0.9
    pos_area = 0.5 * (50 - xc) * 0.5 + 0.5 * 50 * 0.5
    neg_area = 0.5 * 40 * 0.4 + 0.5 * (xc - 40) * 0.4
    pos, neg = adverse_areas(lines)
    assert pos[0] == pytest.approx(pos_area)
    assert neg[0] == pytest.approx(-neg_area)
    lane = Vehicle("LANE", "lane", VehicleCategory.OWNER, (), (), 0.0, lane_load_klf=0.64)
    env = envelope(lines, lane)
    e = env.of("M0")
    assert e.max.lane_kip == pytest.approx(0.64 * pos_area)
    assert e.min.lane_kip == pytest.approx(-0.64 * neg_area)
    assert e.max.axle_kip == 0.0 and e.max.position is None
    assert len(e.max.lane_segments_ft) == 1
    assert e.max.lane_segments_ft[0] == pytest.approx((xc, 100.0))
    # the same area by an independent library: scipy.integrate.quad on the line itself
    f = lambda x: max(float(lines.evaluate(np.array([x]))[0, 0]), 0.0)  # noqa: E731
    q, _ = integrate.quad(f, 0.0, 100.0, points=[40.0, xc, 50.0])
    assert pos[0] == pytest.approx(q, rel=1e-9)
    # and the lane load on those segments, put back through the lines, is the same force
    assert concurrent_lane_forces(lines, 0.64, e.max.lane_segments_ft)[0] == pytest.approx(
        e.max.lane_kip)


@settings(max_examples=60, deadline=None)
@given(ords=st.lists(st.floats(-3, 3, allow_nan=False), min_size=2, max_size=8))
def test_lane_area_matches_scipy_quad(ords):
    # Independent library: scipy.integrate.quad of max(y, 0), told where the kinks are
    # (panel points and zero crossings) so that it does not step over a thin sliver.
    s = np.arange(len(ords)) * 7.5
    lines = _lines(s, ords)
    pos, neg = adverse_areas(lines)
    y = np.asarray(ords)
    cross = [s[i] + 7.5 * y[i] / (y[i] - y[i + 1]) for i in range(len(y) - 1)
             if y[i] * y[i + 1] < 0]
    pts = sorted(set(s[1:-1]) | set(cross))
    f = lambda x: float(lines.evaluate(np.array([x]))[0, 0])  # noqa: E731
    qp = integrate.quad(lambda x: max(f(x), 0.0), s[0], s[-1], points=pts or None, limit=200)[0]
    qn = integrate.quad(lambda x: min(f(x), 0.0), s[0], s[-1], points=pts or None, limit=200)[0]
    assert pos[0] == pytest.approx(qp, abs=1e-7)
    assert neg[0] == pytest.approx(qn, abs=1e-7)


def test_hl93_truck_or_tandem_governs_by_line_length():
    # HL-93 = larger of (truck + lane) and (tandem + lane) [M AASHTO LRFD 3.6.1.3.1].
    # Short triangle (base 20 ft, peak 1): tandem 25 + 25 x 6/10 = 40 kip beats the truck's
    # 32 kip (its other axles 14 ft away, off the line). Long triangle (base 200 ft): truck.
    hl93 = rating_load("HL-93")
    short = _lines([0.0, 10.0, 20.0], [0.0, 1.0, 0.0])
    e = envelope(short, hl93).of("M0").max
    assert e.model == "design tandem + design lane"
    assert e.axle_kip == pytest.approx(40.0)
    assert e.lane_kip == pytest.approx(0.64 * 10.0)
    long = _lines([0.0, 100.0, 200.0], [0.0, 1.0, 0.0])
    e = envelope(long, hl93).of("M0").max
    assert e.model == "design truck + design lane"
    assert e.axle_kip == pytest.approx(32 + (8 + 32) * 86 / 100)
    assert e.total_kip(0.33) == pytest.approx(1.33 * e.axle_kip + 0.64 * 100.0)


def test_hl93_neglects_opposing_axles():
    # AASHTO LRFD 3.6.1.3.1: axles that do not contribute to the extreme are neglected
    # [value from memory]. Line -1 at 10 ft, +1 at 24 ft (shear-like): the truck's front axle
    # over +1 at 24 ft, the next 14 ft behind at 10 ft over -1: with neglect that axle counts 0.
    lines = _lines([0.0, 10.0, 24.0, 30.0], [0.0, -1.0, 1.0, 0.0])
    t = vehicle("HL93-TRUCK")
    full = axle_extremes(lines, t).value_kip[0, 0]
    clipped = axle_extremes(lines, t, neglect_opposing_axles=True).value_kip[0, 0]
    assert clipped >= full
    assert clipped == pytest.approx(32.0)  # one 32-kip axle alone over the +1 peak


def test_concurrent_forces_reproduce_each_extreme():
    # Superposition on the influence lines (closed form): the force of every member at the
    # critical position of member k equals member k's extreme.
    rng = np.random.default_rng(7)
    s = np.cumsum(np.r_[0.0, rng.uniform(5, 25, 8)])
    Y = rng.uniform(-1, 1, (6, s.size))
    Y[:, [0, -1]] = 0.0
    lines = InfluenceLines(tuple(f"M{i}" for i in range(6)), s, Y)
    for vid in ("HL93-TRUCK", "TYPE-3S2", "NRL"):
        v = vehicle(vid)
        ex = axle_extremes(lines, v)
        for sense in (0, 1):
            for k in range(6):
                pos = ex.position(sense, k)
                f = concurrent_forces(lines, v, pos)
                assert f.shape == (6,)
                assert f[k] == pytest.approx(ex.value_kip[sense, k], rel=1e-9, abs=1e-9)


def test_concurrent_with_splits_axle_and_lane():
    lines = _lines([0.0, 40.0, 50.0, 100.0], [0.0, -0.4, 0.5, 0.0], [0.0, 0.3, 0.6, 0.0])
    hl93 = rating_load("HL-93")
    env = envelope(lines, hl93)
    # M1 is positive everywhere, so no axle is neglected and superposition must give back
    # its extreme; axle and lane parts stay apart (IM applies to the axle part only).
    e = env.of("M1").max
    axle, lane = concurrent_with(lines, hl93, e)
    assert axle[1] == pytest.approx(e.axle_kip)
    assert lane[1] == pytest.approx(e.lane_kip)
    # M0 changes sign: its lane segments are its positive stretch only
    e0 = env.of("M0").max
    _, lane0 = concurrent_with(lines, hl93, e0)
    assert lane0[0] == pytest.approx(e0.lane_kip)


def test_end_jump_one_sided_limit_and_isolated_state():
    # Deck-truss end vertical: -1 at the bearing station 0, zero from the next panel point.
    # Max: the vehicle just off (0); min: one 20-kip axle exactly over the bearing, -20 kip.
    lines = _lines([0.0, 20.0, 40.0], [-1.0, 0.0, 0.0])
    v = _veh([20.0, 20.0], [4.0])
    ex = axle_extremes(lines, v)
    assert ex.value_kip[1, 0] == pytest.approx(-20.0 - 20.0 * 16 / 20)
    # a line positive at both ends with a vehicle exactly as long as the bridge: one axle
    # over each bearing at once is a real (isolated) state; the engine counts it.
    lines = _lines([0.0, 10.0], [1.0, 1.0])
    ex = axle_extremes(lines, _veh([5.0, 7.0], [10.0]))
    assert ex.value_kip[0, 0] == pytest.approx(12.0)
    # an end jump that reduces the effect is avoided: the position reported moves just off
    lines = _lines([0.0, 10.0, 20.0], [-1.0, 1.0, 0.0])
    v = _veh([10.0, 10.0], [10.0])
    ex = axle_extremes(lines, v, directions=[Direction.FORWARD])
    assert ex.value_kip[0, 0] == pytest.approx(10.0)
    pos = ex.position(0, 0)
    assert concurrent_forces(lines, v, pos)[0] == pytest.approx(10.0, abs=1e-4)


def test_axles_sharing_a_tie_group_over_an_end_jump():
    # Deck-truss end vertical: -1 at the bearing station 0, zero from the next panel point
    # (20 ft). Two 20-kip axles at zero spacing (one point load of 40 kip) with a third 10-kip
    # axle 4 ft behind. Hand statics, forward travel (axles at x - d): the pair at x, the third
    # at x - 4, on the deck for x >= 4: -40 (1 - x/20) - 10 (1 - (x - 4)/20), least at x = 4:
    # -32 - 10 = -42 kip (the pair alone over the bearing gives -40). Reverse travel: the pair
    # exactly over the bearing and the third axle 4 ft in: -40 - 10 x 16/20 = -48 kip.
    lines = _lines([0.0, 20.0, 40.0], [-1.0, 0.0, 0.0], [0.0, 1.0, 0.0])
    v = _veh([20.0, 20.0, 10.0], [0.0, 4.0])
    fwd = axle_extremes(lines, v, directions=[Direction.FORWARD])
    assert fwd.value_kip[1, 0] == pytest.approx(-42.0)
    both = axle_extremes(lines, v)
    assert both.value_kip[1, 0] == pytest.approx(-48.0)
    assert both.position(1, 0).direction is Direction.REVERSE
    # the member without a jump, in the same search: 40 kip over its peak, 10 x 16/20 behind
    assert both.value_kip[0, 1] == pytest.approx(40.0 + 10.0 * 16.0 / 20.0)


def test_lane_type_legal_load_applies_only_over_200_ft():
    # Lane-type legal load for spans over 200 ft: 0.75 x Type 3-3 + 0.2 klf [M MBE 6A.4.4.2.1].
    legal = rating_load("LEGAL-LANE")
    short = _lines([0.0, 100.0, 200.0], [0.0, 1.0, 0.0])
    long = _lines([0.0, 150.0, 300.0], [0.0, 1.0, 0.0])
    assert not envelope(short, legal).applies
    env = envelope(long, legal)
    assert env.applies
    e = env.of("M0").max
    plain = axle_extremes(long, vehicle("TYPE-3-3")).value_kip[0, 0]
    assert e.axle_kip == pytest.approx(0.75 * plain)
    assert e.lane_kip == pytest.approx(0.2 * 150.0)


def test_errors_name_the_vehicle():
    lines = _lines([0.0, 10.0], [0.0, 1.0])
    two_var = _veh([10, 10, 10], [AxleSpacing(4, 8), AxleSpacing(4, 8)], vid="PERMIT-9")
    with pytest.raises(InputError, match="PERMIT-9"):
        axle_extremes(lines, two_var)
    bad = Vehicle("BAD-1", "bad", VehicleCategory.OWNER, (10.0, 10.0), (), 10.0)
    with pytest.raises(InputError, match="BAD-1"):
        axle_extremes(lines, bad)
    with pytest.raises(InputError, match="spacings"):
        concurrent_forces(lines, _veh([1, 1], [4.0]),
                          VehiclePosition(1.0, Direction.FORWARD, ()))
