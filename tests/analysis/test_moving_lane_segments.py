"""The stretches of deck a lane load goes on (adverse_segments), found for every member at once.

Closed-form checks: the lane load on the stretches, integrated exactly on the piecewise-linear
line, is the same-sign area of the line (adverse_areas, triangle areas between zero crossings);
the stretches are in order, apart and of positive length; the line has the sign in every panel
of a stretch. All members at once must give what each member alone gives.
"""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from rating.analysis.influence import InfluenceLines
from rating.analysis.moving import (
    _adverse_segments_rows,
    adverse_areas,
    adverse_segments,
    concurrent_lane_forces,
)

ORD = st.one_of(st.just(0.0), st.sampled_from([-1.0, 1.0, 1e-13, -1e-11]),
                st.floats(-2.0, 2.0, allow_nan=False, allow_infinity=False,
                          allow_subnormal=False))


@st.composite
def lines_strategy(draw) -> InfluenceLines:
    n = draw(st.integers(2, 9))
    steps = draw(st.lists(st.floats(0.5, 30.0), min_size=n - 1, max_size=n - 1))
    s = draw(st.sampled_from([0.0, -40.0, 1e5])) + np.concatenate(([0.0], np.cumsum(steps)))
    m = draw(st.integers(1, 12))
    Y = np.array(draw(st.lists(st.lists(ORD, min_size=n, max_size=n), min_size=m, max_size=m)))
    return InfluenceLines(tuple(f"M{i}" for i in range(m)), s, Y)


@settings(max_examples=300, deadline=None)
@given(lines=lines_strategy(), sign=st.sampled_from([1.0, -1.0]))
def test_segments_of_all_members_at_once(lines, sign):
    s, Y = lines.stations_ft, lines.ordinates
    every = _adverse_segments_rows(s, Y, sign)
    pos, neg = adverse_areas(lines)
    for k, segs in enumerate(every):
        assert segs == adverse_segments(s, Y[k], sign)
        for a, b in segs:
            assert a < b
            # not of the other sign anywhere on the stretch (it may touch zero at a station)
            pts = np.concatenate(([a], s[(s > a) & (s < b)], [b]))
            long = np.diff(pts) > 1e-9 * (1.0 + abs(b))  # not a sliver of round-off at an end
            mids = 0.5 * (pts[:-1] + pts[1:])[long]
            assert np.all(sign * lines.evaluate(mids)[k] > 0.0)
        assert all(b0 < a1 for (_, b0), (a1, _) in zip(segs, segs[1:], strict=False))
        # the lane on the stretches is the same-sign area (closed form, adverse_areas), unless
        # round-off zeroed ordinates of less than 1e-12 of the line's largest
        big = np.abs(Y[k]).max()
        if np.all((Y[k] == 0.0) | (np.abs(Y[k]) > 1e-12 * big)):
            area = (pos if sign > 0 else neg)[k]
            force = concurrent_lane_forces(lines, 1.0, segs)[k]
            assert force == pytest.approx(area, rel=1e-9, abs=1e-9 * (1.0 + big * np.ptp(s)))


def test_a_panel_of_no_length_is_left_out():
    # Round-off: the zero crossing between -1 and 1e-11 falls on the next station (1e6 +
    # 0.001 ft), so that panel's stretch has no length; the line is positive on the next
    # panel only (down to its end, where it is zero).
    s = np.array([1e6 - 1.0, 1e6, 1e6 + 1e-3, 1e6 + 1.0])
    y = np.array([0.0, -1.0, 1e-11, 0.0])
    assert adverse_segments(s, y, 1.0) == ((s[2], s[3]),)
    assert adverse_segments(s, y, -1.0) == ((s[0], s[2]),)
