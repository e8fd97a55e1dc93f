"""Exactness of the moving-load search against brute-force stepping.

Reference: the same sum of axle effects evaluated by stepping the vehicle 0.01 ft at a time
over every position (and, for a variable spacing, stepping the spacing too), both directions,
on hypothesis-generated piecewise-linear lines and axle series. The engine must never be below
the stepped extreme, and may exceed it only by what the step can miss: sum(P) x max|slope| x
step (closed form bound for a piecewise-linear function). Brute force is an independent check:
it uses only InfluenceLines.evaluate, none of the engine's candidate logic.

Lines are zero at both ends or non-zero at one end only (the end vertical of a deck truss);
a line non-zero at both ends admits isolated states with one axle exactly over each bearing,
which the engine counts (conservative) but no stepping can find; see test_moving.py.

The search stacks both directions and, with opposing axles neglected, every chunk of 32 rows
(members x sense; each chunk with its own breakpoints, padded to a common width) into one
batch: the tests with up to 40 members (three chunks per direction) check that rows searched
together do not change one another's result.
"""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from rating.analysis.influence import InfluenceLines
from rating.analysis.moving import Direction, axle_extremes
from rating.model.vehicles import AxleSpacing, Vehicle, VehicleCategory

LENGTHS = st.one_of(st.sampled_from([0.5, 1.0, 2.0, 2.5, 4.0, 5.0, 10.0]),
                    st.floats(0.3, 9.0, allow_nan=False, allow_infinity=False))
SPACINGS = st.one_of(st.sampled_from([0.5, 1.0, 2.0, 4.0, 5.0]),
                     st.floats(0.2, 8.0, allow_nan=False, allow_infinity=False))
ORD = st.one_of(st.just(0.0), st.floats(-2.0, 2.0, allow_nan=False, allow_infinity=False))
SPACINGS_0 = st.one_of(st.just(0.0), SPACINGS)  # with axles side by side


@st.composite
def lines_strategy(draw, max_members: int = 3, min_members: int = 1) -> InfluenceLines:
    n = draw(st.integers(2, 9))
    x0 = draw(st.sampled_from([0.0, -3.0, 1.5]))
    steps = draw(st.lists(LENGTHS, min_size=n - 1, max_size=n - 1))
    s = x0 + np.concatenate(([0.0], np.cumsum(steps)))
    m = draw(st.integers(min_members, max_members))
    Y = np.array(draw(st.lists(st.lists(ORD, min_size=n, max_size=n),
                               min_size=m, max_size=m)), dtype=float)
    ends = draw(st.sampled_from(["zero", "left", "right"]))
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
    """Stepped max and min over all positions (and the given offset sets), both directions
    (or those of ``signs``)."""
    s = lines.stations_ft
    mx = np.zeros(len(lines.member_labels))  # vehicle off the bridge gives zero
    mn = np.zeros(len(lines.member_labels))
    for D in offsets:
        for sign in signs:  # forward: axles at x - D; reverse: axles at x + D
            lo = s[0] - 0.5 if sign > 0 else s[0] - D[-1] - 0.5
            hi = s[-1] + D[-1] + 0.5 if sign > 0 else s[-1] + 0.5
            x = np.arange(lo, hi, step)
            y = lines.evaluate(x[:, None] - sign * D[None, :])  # (m, n_pos, n_axles)
            up = np.maximum(y, 0.0) if neglect else y
            dn = np.minimum(y, 0.0) if neglect else y
            mx = np.maximum(mx, (up @ P).max(axis=1))
            mn = np.minimum(mn, (dn @ P).min(axis=1))
    return mx, mn


def _round_off(lines: InfluenceLines, P: np.ndarray) -> float:
    """Floating-point allowance: 1e-9 of the largest possible effect."""
    return 1e-9 * (1.0 + float(P.sum()) * float(np.abs(lines.ordinates).max()))


def _max_slope(lines: InfluenceLines) -> float:
    return float(np.abs(np.diff(lines.ordinates, axis=1) / np.diff(lines.stations_ft)).max())


def _assert_stepped(ex, lines: InfluenceLines, P: np.ndarray, bmax: np.ndarray,
                    bmin: np.ndarray, miss_ft: float) -> None:
    """Never below the stepped extreme (brute-force stepping, independent evaluation), and
    above it by no more than what the stepping can miss: each axle within ``miss_ft`` of the
    optimum (closed-form bound above)."""
    eps = _round_off(lines, P)
    bound = P.sum() * _max_slope(lines) * miss_ft + eps
    assert np.all(ex.value_kip[0] >= bmax - eps)
    assert np.all(ex.value_kip[1] <= bmin + eps)
    assert np.all(ex.value_kip[0] - bmax <= bound)
    assert np.all(bmin - ex.value_kip[1] <= bound)


def _offsets_stepped(gaps: list[float], k: int, extra: float, step: float
                     ) -> list[np.ndarray]:
    """Axle offsets with gap k stepped from its lower limit over ``extra``."""
    offsets = []
    for g in np.arange(gaps[k], gaps[k] + extra + 1e-12, step):
        gg = list(gaps)
        gg[k] = g
        offsets.append(np.concatenate(([0.0], np.cumsum(gg))))
    return offsets


def _fixed_spacing_test(name: str, examples: int, members: tuple[int, int],
                        spacings: st.SearchStrategy, max_axles: int, step: float):
    """Property test: a rigid series stepped at ``step`` on lines of ``members`` (least,
    most) members, with and without opposing axles."""
    def test(lines, loads, data, neglect):
        gaps = data.draw(st.lists(spacings, min_size=len(loads) - 1, max_size=len(loads) - 1))
        v = _vehicle(loads, [AxleSpacing(g, g) for g in gaps])
        ex = axle_extremes(lines, v, neglect_opposing_axles=neglect)
        P = np.asarray(loads)
        bmax, bmin = _brute(lines, P, [np.concatenate(([0.0], np.cumsum(gaps)))], step, neglect)
        _assert_stepped(ex, lines, P, bmax, bmin, step)

    test.__name__ = test.__qualname__ = name
    return settings(max_examples=examples, deadline=None,
                    suppress_health_check=[HealthCheck.too_slow])(given(
        lines=lines_strategy(max_members=members[1], min_members=members[0]),
        loads=st.lists(st.floats(0.5, 40.0, allow_nan=False), min_size=1, max_size=max_axles),
        data=st.data(), neglect=st.booleans())(test))


def _variable_spacing_test(name: str, examples: int, members: tuple[int, int],
                           spacings: st.SearchStrategy, step: float):
    """Property test: a series with one variable gap, position and gap stepped at ``step``."""
    def test(lines, loads, data, neglect):
        gaps = data.draw(st.lists(spacings, min_size=len(loads) - 1, max_size=len(loads) - 1))
        k = data.draw(st.integers(0, len(gaps) - 1))
        extra = data.draw(st.one_of(st.sampled_from([1.0, 2.0, 4.0]), st.floats(0.1, 4.0)))
        spacing = [AxleSpacing(g, g) for g in gaps]
        spacing[k] = AxleSpacing(gaps[k], gaps[k] + extra)
        ex = axle_extremes(lines, _vehicle(loads, spacing), neglect_opposing_axles=neglect)
        P = np.asarray(loads)
        bmax, bmin = _brute(lines, P, _offsets_stepped(gaps, k, extra, step), step, neglect)
        # position and spacing both stepped: each axle is within 2 steps of the optimum
        _assert_stepped(ex, lines, P, bmax, bmin, 2 * step)
        # the spacing reported is inside the range
        assert np.all(ex.spacings_ft[..., k] >= gaps[k] - 1e-5)
        assert np.all(ex.spacings_ft[..., k] <= gaps[k] + extra + 1e-5)

    test.__name__ = test.__qualname__ = name
    return settings(max_examples=examples, deadline=None,
                    suppress_health_check=[HealthCheck.too_slow])(given(
        lines=lines_strategy(max_members=members[1], min_members=members[0]),
        loads=st.lists(st.floats(0.5, 40.0, allow_nan=False), min_size=2, max_size=4),
        data=st.data(), neglect=st.booleans())(test))


test_fixed_spacing_never_below_and_within_step = _fixed_spacing_test(
    "test_fixed_spacing_never_below_and_within_step", 1000, (1, 3), SPACINGS, 6, 0.01)
test_variable_spacing_never_below_and_within_step = _variable_spacing_test(
    "test_variable_spacing_never_below_and_within_step", 150, (1, 2), SPACINGS, 0.05)


def test_zero_crossing_within_round_off_of_a_station_is_the_station():
    # regression (found by the property test above): one member's zero crossing 1.7e-8 ft
    # from a station, in the same search as another member, put a near-duplicate breakpoint
    # there; the second member's exact maximum came out 2e-8 below the stepped one
    s = np.array([0.0, 5.0, 5.5, 6.0, 6.5, 11.5])
    Y = np.array([[0, 0, 6.76794576e-08, -2, 0, 0], [0, 1, 1, 0, 0, 0]], dtype=float)
    lines = InfluenceLines(("M0", "M1"), s, Y)
    gaps = [0.5, 4.0, 0.5, 0.5]
    v = _vehicle([1.0] * 5, [AxleSpacing(g, g) for g in gaps])
    ex = axle_extremes(lines, v, neglect_opposing_axles=True)
    P = np.ones(5)
    bmax, bmin = _brute(lines, P, [np.concatenate(([0.0], np.cumsum(gaps)))], 0.01, True)
    eps = _round_off(lines, P)
    assert np.all(ex.value_kip[0] >= bmax - eps)
    assert np.all(ex.value_kip[1] <= bmin + eps)


# ---------------------------------------------------------------------------------------------
# many members: several chunks of rows (with padded breakpoints) in one batch of searches

test_many_members_fixed_spacing_against_stepping = _fixed_spacing_test(
    "test_many_members_fixed_spacing_against_stepping", 120, (17, 40), SPACINGS_0, 5, 0.02)
test_many_members_variable_spacing_against_stepping = _variable_spacing_test(
    "test_many_members_variable_spacing_against_stepping", 40, (17, 24), SPACINGS_0, 0.1)


@settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(lines=lines_strategy(max_members=40, min_members=17),
       loads=st.lists(st.floats(0.5, 40.0, allow_nan=False), min_size=1, max_size=4),
       data=st.data(), reverse=st.booleans())
def test_one_direction_against_stepping(lines, loads, data, reverse):
    gaps = data.draw(st.lists(SPACINGS_0, min_size=len(loads) - 1, max_size=len(loads) - 1))
    v = _vehicle(loads, [AxleSpacing(g, g) for g in gaps])
    d = Direction.REVERSE if reverse else Direction.FORWARD
    ex = axle_extremes(lines, v, neglect_opposing_axles=True, directions=[d])
    assert not np.any(ex.reverse[ex.found] != reverse)
    P = np.asarray(loads)
    step = 0.02
    bmax, bmin = _brute(lines, P, [np.concatenate(([0.0], np.cumsum(gaps)))], step, True,
                        (-1.0,) if reverse else (1.0,))
    _assert_stepped(ex, lines, P, bmax, bmin, step)


def _assert_same_positions(a, b, rows_b: list[int], eps: float) -> None:
    """Member k of ``a`` has the critical positions of member rows_b[k] of ``b``; the values
    agree to round-off (BLAS sums a row's product differently by its place in the matrix).
    An effect within ``eps`` of zero may count as none in one and not in the other: "none"
    is 1e-12 of the largest effect of the whole set of lines."""
    for k, kb in enumerate(rows_b):
        for sense in (0, 1):
            va, vb = a.value_kip[sense, k], b.value_kip[sense, kb]
            if a.found[sense, k] and b.found[sense, kb]:
                assert a.position(sense, k) == b.position(sense, kb)
                assert va == pytest.approx(vb, rel=1e-12, abs=1e-12)
            else:
                assert abs(va) <= eps and abs(vb) <= eps


@settings(max_examples=80, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(lines=lines_strategy(max_members=30, min_members=2),
       loads=st.lists(st.floats(0.5, 40.0, allow_nan=False), min_size=1, max_size=5),
       data=st.data())
def test_critical_position_of_a_member_does_not_depend_on_the_others(lines, loads, data):
    # All axles counted: every member is searched over the same breakpoints (the stations),
    # alone or with the others, and must find the same critical positions. For lines that do
    # not jump at the bridge ends the search of y gives the minimum too (the search of -y is
    # that of y negated, exactly); one line that jumps (a deck truss's end vertical) makes
    # every line of the set searched once per sense: the same positions again.
    gaps = data.draw(st.lists(SPACINGS_0, min_size=len(loads) - 1, max_size=len(loads) - 1))
    v = _vehicle(loads, [AxleSpacing(g, g) for g in gaps])
    s, m = lines.stations_ft, len(lines.member_labels)
    eps = _round_off(lines, np.asarray(loads))
    every = axle_extremes(lines, v)
    for k in range(0, m, 7):
        one = InfluenceLines(lines.member_labels[k:k + 1], s, lines.ordinates[k:k + 1])
        _assert_same_positions(axle_extremes(one, v), every, [k], eps)
    Y = lines.ordinates.copy()
    Y[:, [0, -1]] = 0.0
    end = np.zeros((1, s.size))
    end[0, 0] = -1.0
    once = axle_extremes(InfluenceLines(lines.member_labels, s, Y), v)
    twice = axle_extremes(InfluenceLines(lines.member_labels + ("END",), s,
                                         np.vstack((Y, end))), v)
    _assert_same_positions(once, twice, list(range(m)), eps)
