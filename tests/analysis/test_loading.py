"""Panel-point loads from axles and lane loads reproduce the influence line.

Check (superposition, common practice): the member force under the panel-point loads equals
the sum of axle load x influence ordinate, and for a lane load w on [a, b] equals w x the
integral of the influence line over [a, b].
"""

import numpy as np
from scipy.integrate import quad

from rating.analysis.loading import axle_joint_loads, lane_joint_loads
from rating.analysis.truss import LinearTruss
from rating.model.builders import build_truss


def test_axles_and_lane_match_influence_lines():
    g = build_truss("pratt", 8, 20.0, 24.0)
    lt = LinearTruss(g)
    il = lt.influence_lines
    stations, loads = [-5.0, 13.0, 27.0, 31.0, 170.0], [8.0, 32.0, 32.0, 10.0, 5.0]
    N = lt.solve(axle_joint_loads(g, stations, loads)).member_forces_kip
    expected = (il.evaluate(np.array(stations)) * np.array(loads)).sum(axis=1)
    np.testing.assert_allclose(N, expected, atol=1e-9)
    seg = [(7.0, 53.0), (100.0, 131.5)]
    N_lane = lt.solve(lane_joint_loads(g, seg, 0.64)).member_forces_kip
    for i in (0, 5, 12, 20):
        ref = sum(quad(lambda x, i=i: float(il.evaluate(np.array([x]))[i, 0]), a, b,
                       points=list(il.stations_ft[(il.stations_ft > a) & (il.stations_ft < b)]),
                       limit=200)[0] for a, b in seg)
        assert abs(N_lane[i] - 0.64 * ref) < 1e-7
