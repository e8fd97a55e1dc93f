"""The moving-load search with many members at once: rows searched together must not change
one another's result.

The search stacks every direction of travel and every chunk of rows into one batch (with
opposing axles neglected, each chunk of 32 rows has its own breakpoints, padded to a common
width). The property tests of test_moving_exactness.py use at most three members, one chunk;
here lines of up to 40 members (both senses: up to 80 rows, three chunks per direction) are
checked against brute-force stepping of the vehicle (the same sum of axle effects evaluated
every ``step`` ft through InfluenceLines.evaluate, none of the engine's candidate logic): never
below the stepped extreme, and above it by no more than a step can miss, sum(P) x max|slope| x
step (closed form bound for a piecewise-linear function).
"""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from rating.analysis.influence import InfluenceLines
from rating.analysis.moving import Direction, axle_extremes
from rating.model.vehicles import AxleSpacing, Vehicle, VehicleCategory

LENGTHS = st.one_of(st.sampled_from([1.0, 2.0, 2.5, 4.0, 5.0, 10.0]),
                    st.floats(0.5, 9.0, allow_nan=False, allow_infinity=False))
SPACINGS = st.one_of(st.sampled_from([0.0, 1.0, 2.0, 4.0, 5.0]),
                     st.floats(0.2, 8.0, allow_nan=False, allow_infinity=False))
ORD = st.one_of(st.just(0.0), st.sampled_from([-1.0, -0.5, 0.5, 1.0]),
                st.floats(-2.0, 2.0, allow_nan=False, allow_infinity=False))


@st.composite
def many_lines(draw, min_members: int = 17, max_members: int = 40) -> InfluenceLines:
    """Lines zero at both ends, or non-zero at one end only (see test_moving_exactness.py)."""
    n = draw(st.integers(2, 8))
    steps = draw(st.lists(LENGTHS, min_size=n - 1, max_size=n - 1))
    s = np.concatenate(([0.0], np.cumsum(steps)))
    m = draw(st.integers(min_members, max_members))
    Y = np.array(draw(st.lists(st.lists(ORD, min_size=n, max_size=n),
                               min_size=m, max_size=m)), dtype=float)
    ends = draw(st.sampled_from(["zero", "zero", "left", "right"]))
    if ends != "left":
        Y[:, 0] = 0.0
    if ends != "right":
        Y[:, -1] = 0.0
    return InfluenceLines(tuple(f"M{i}" for i in range(m)), s, Y)


def _vehicle(loads, gaps) -> Vehicle:
    return Vehicle("T", "test", VehicleCategory.OWNER, tuple(loads), tuple(gaps),
                   sum(loads) / 2.0)


def _brute(lines: InfluenceLines, P: np.ndarray, offsets: list[np.ndarray], step: float,
           neglect: bool, signs: tuple[float, ...] = (1.0, -1.0)
           ) -> tuple[np.ndarray, np.ndarray]:
    """Stepped max and min over all positions (and the given offset sets); sign +1 is
    forward travel (axles at x - D), -1 reverse (axles at x + D)."""
    s = lines.stations_ft
    mx = np.zeros(len(lines.member_labels))  # vehicle off the bridge gives zero
    mn = np.zeros(len(lines.member_labels))
    for D in offsets:
        for sign in signs:
            lo = s[0] - 0.5 if sign > 0 else s[0] - D[-1] - 0.5
            hi = s[-1] + D[-1] + 0.5 if sign > 0 else s[-1] + 0.5
            x = np.arange(lo, hi, step)
            y = lines.evaluate(x[:, None] - sign * D[None, :])  # (m, n_pos, n_axles)
            up = np.maximum(y, 0.0) if neglect else y
            dn = np.minimum(y, 0.0) if neglect else y
            mx = np.maximum(mx, (up @ P).max(axis=1))
            mn = np.minimum(mn, (dn @ P).min(axis=1))
    return mx, mn


def _check(lines, P, ex, bmax, bmin, step_bound):
    eps = 1e-9 * (1.0 + float(P.sum()) * float(np.abs(lines.ordinates).max()))
    slope = float(np.abs(np.diff(lines.ordinates, axis=1) / np.diff(lines.stations_ft)).max())
    bound = float(P.sum()) * slope * step_bound + eps
    assert np.all(ex.value_kip[0] >= bmax - eps)  # never below the stepped extreme
    assert np.all(ex.value_kip[1] <= bmin + eps)
    assert np.all(ex.value_kip[0] - bmax <= bound)  # within what the step can miss
    assert np.all(bmin - ex.value_kip[1] <= bound)


@settings(max_examples=120, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(lines=many_lines(),
       loads=st.lists(st.floats(0.5, 40.0, allow_nan=False), min_size=1, max_size=5),
       data=st.data(), neglect=st.booleans())
def test_many_members_fixed_spacing_against_stepping(lines, loads, data, neglect):
    gaps = data.draw(st.lists(SPACINGS, min_size=len(loads) - 1, max_size=len(loads) - 1))
    v = _vehicle(loads, [AxleSpacing(g, g) for g in gaps])
    ex = axle_extremes(lines, v, neglect_opposing_axles=neglect)
    P = np.asarray(loads)
    step = 0.02
    bmax, bmin = _brute(lines, P, [np.concatenate(([0.0], np.cumsum(gaps)))], step, neglect)
    _check(lines, P, ex, bmax, bmin, step)


@settings(max_examples=40, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(lines=many_lines(max_members=24),
       loads=st.lists(st.floats(0.5, 40.0, allow_nan=False), min_size=2, max_size=4),
       data=st.data(), neglect=st.booleans())
def test_many_members_variable_spacing_against_stepping(lines, loads, data, neglect):
    gaps = data.draw(st.lists(SPACINGS, min_size=len(loads) - 1, max_size=len(loads) - 1))
    k = data.draw(st.integers(0, len(gaps) - 1))
    extra = data.draw(st.one_of(st.sampled_from([1.0, 2.0, 4.0]), st.floats(0.1, 4.0)))
    spacing = [AxleSpacing(g, g) for g in gaps]
    spacing[k] = AxleSpacing(gaps[k], gaps[k] + extra)
    ex = axle_extremes(lines, _vehicle(loads, spacing), neglect_opposing_axles=neglect)
    P = np.asarray(loads)
    step = 0.1
    offsets = []
    for g in np.arange(gaps[k], gaps[k] + extra + 1e-12, step):
        gg = list(gaps)
        gg[k] = g
        offsets.append(np.concatenate(([0.0], np.cumsum(gg))))
    bmax, bmin = _brute(lines, P, offsets, step, neglect)
    # position and spacing both stepped: each axle is within 2 steps of the optimum
    _check(lines, P, ex, bmax, bmin, 2 * step)
    assert np.all(ex.spacings_ft[..., k] >= gaps[k] - 1e-5)
    assert np.all(ex.spacings_ft[..., k] <= gaps[k] + extra + 1e-5)


@settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(lines=many_lines(),
       loads=st.lists(st.floats(0.5, 40.0, allow_nan=False), min_size=1, max_size=4),
       data=st.data(), reverse=st.booleans())
def test_one_direction_against_stepping(lines, loads, data, reverse):
    gaps = data.draw(st.lists(SPACINGS, min_size=len(loads) - 1, max_size=len(loads) - 1))
    v = _vehicle(loads, [AxleSpacing(g, g) for g in gaps])
    d = Direction.REVERSE if reverse else Direction.FORWARD
    ex = axle_extremes(lines, v, neglect_opposing_axles=True, directions=[d])
    assert not np.any(ex.reverse[ex.found] != reverse)
    P = np.asarray(loads)
    step = 0.02
    bmax, bmin = _brute(lines, P, [np.concatenate(([0.0], np.cumsum(gaps)))], step, True,
                        (-1.0,) if reverse else (1.0,))
    _check(lines, P, ex, bmax, bmin, step)


@settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(lines=many_lines(min_members=2, max_members=30),
       loads=st.lists(st.floats(0.5, 40.0, allow_nan=False), min_size=1, max_size=5),
       data=st.data())
def test_critical_position_of_a_member_does_not_depend_on_the_others(lines, loads, data):
    # All axles counted: every member is searched over the same breakpoints (the stations),
    # alone or with the others, and must find the same critical position.
    gaps = data.draw(st.lists(SPACINGS, min_size=len(loads) - 1, max_size=len(loads) - 1))
    v = _vehicle(loads, [AxleSpacing(g, g) for g in gaps])
    every = axle_extremes(lines, v)
    for k in range(0, len(lines.member_labels), 7):
        one = axle_extremes(InfluenceLines((lines.member_labels[k],), lines.stations_ft,
                                           lines.ordinates[k:k + 1]), v)
        for sense in (0, 1):
            assert one.position(sense, 0) == every.position(sense, k)
            assert one.value_kip[sense, 0] == pytest.approx(every.value_kip[sense, k],
                                                            rel=1e-12, abs=1e-12)


def test_axles_sharing_a_tie_group_over_an_end_jump():
    # Deck-truss end vertical: -1 at the bearing station 0, zero from the next panel point
    # (20 ft). Two 20-kip axles at zero spacing (one point load of 40 kip) with a third 10-kip
    # axle 4 ft behind. Hand statics, forward travel (axles at x - d): the pair at x, the third
    # at x - 4, on the deck for x >= 4: -40 (1 - x/20) - 10 (1 - (x - 4)/20), least at x = 4:
    # -32 - 10 = -42 kip (the pair alone over the bearing gives -40). Reverse travel: the pair
    # exactly over the bearing and the third axle 4 ft in: -40 - 10 x 16/20 = -48 kip.
    s = [0.0, 20.0, 40.0]
    lines = InfluenceLines(("EV", "D"), np.asarray(s), np.array([[-1.0, 0.0, 0.0],
                                                                 [0.0, 1.0, 0.0]]))
    v = _vehicle([20.0, 20.0, 10.0], [AxleSpacing(0.0, 0.0), AxleSpacing(4.0, 4.0)])
    fwd = axle_extremes(lines, v, directions=[Direction.FORWARD])
    assert fwd.value_kip[1, 0] == pytest.approx(-42.0)
    both = axle_extremes(lines, v)
    assert both.value_kip[1, 0] == pytest.approx(-48.0)
    assert both.position(1, 0).direction is Direction.REVERSE
    # the member without a jump, in the same search: 40 kip over its peak, 10 x 16/20 behind
    assert both.value_kip[0, 1] == pytest.approx(40.0 + 10.0 * 16.0 / 20.0)


@settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(lines=many_lines(min_members=2, max_members=30),
       loads=st.lists(st.floats(0.5, 40.0, allow_nan=False), min_size=1, max_size=5),
       data=st.data())
def test_minimum_from_the_search_of_the_maximum(lines, loads, data):
    # A rigid series with all axles counted searches lines that do not jump at the bridge
    # ends once for both senses (the search of -y is that of y negated, exactly); one line
    # that jumps (a deck truss's end vertical) makes every line of the set searched once per
    # sense. Both ways must find the same critical positions.
    gaps = data.draw(st.lists(SPACINGS, min_size=len(loads) - 1, max_size=len(loads) - 1))
    v = _vehicle(loads, [AxleSpacing(g, g) for g in gaps])
    s = lines.stations_ft
    Y = lines.ordinates.copy()
    Y[:, [0, -1]] = 0.0
    end = np.zeros((1, s.size))
    end[0, 0] = -1.0
    once = axle_extremes(InfluenceLines(lines.member_labels, s, Y), v)
    twice = axle_extremes(InfluenceLines(lines.member_labels + ("END",), s,
                                         np.vstack((Y, end))), v)
    for k in range(len(lines.member_labels)):
        for sense in (0, 1):
            assert once.position(sense, k) == twice.position(sense, k)
            assert once.value_kip[sense, k] == pytest.approx(twice.value_kip[sense, k],
                                                             rel=1e-12, abs=1e-12)
