"""Property tests (hypothesis): random geometries and loads stay in equilibrium.

Checks are statics (common practice): at every joint the member forces, applied loads and
reactions sum to zero; the reactions balance the applied loads in x, y and moment.
"""

from __future__ import annotations

import numpy as np
from hypothesis import given, settings
from hypothesis import strategies as st

from rating.analysis.truss import LinearTruss
from rating.model.builders import TrussForm, build_truss


@st.composite
def trusses(draw):
    form = draw(st.sampled_from([TrussForm.PRATT, TrussForm.PARKER, TrussForm.WARREN,
                                 TrussForm.WARREN_VERTICALS, TrussForm.DOUBLE_INTERSECTION,
                                 TrussForm.BALTIMORE]))
    if form is TrussForm.BALTIMORE:
        n = draw(st.sampled_from([6, 10, 14]))
    elif form is TrussForm.WARREN_VERTICALS:
        n = draw(st.sampled_from([4, 6, 8, 10]))
    elif form is TrussForm.DOUBLE_INTERSECTION:
        n = draw(st.integers(6, 14))
    else:
        n = draw(st.integers(3, 14))
    p = draw(st.floats(8.0, 35.0))
    if form is TrussForm.PARKER:
        h = [draw(st.floats(8.0, 40.0)) for _ in range(n - 1)]
    else:
        h = draw(st.floats(6.0, 40.0))
    deck = "deck" if form is TrussForm.PRATT and draw(st.booleans()) else "through"
    return build_truss(form, n, p, h, deck_position=deck)


@settings(max_examples=80, deadline=None)
@given(g=trusses(), seed=st.integers(0, 2**31 - 1))
def test_equilibrium_everywhere(g, seed):
    rng = np.random.default_rng(seed)
    P = rng.uniform(-50.0, 50.0, size=(len(g.joints), 2))
    sol = LinearTruss(g).solve(P)
    N = sol.member_forces_kip
    xy = np.array([(j.x_ft, j.y_ft) for j in g.joints])
    resid = P + sol.reactions_kip
    for m, n_m in zip(g.members, N, strict=True):
        a, b = g.joint_index[m.start], g.joint_index[m.end]
        e = (xy[b] - xy[a]) / np.linalg.norm(xy[b] - xy[a])
        resid[a] += n_m * e  # tension pulls joint a toward b
        resid[b] -= n_m * e
    scale = max(np.abs(P).max(), 1.0)
    np.testing.assert_allclose(resid, 0.0, atol=1e-7 * scale)
    R = sol.reactions_kip
    np.testing.assert_allclose(R.sum(axis=0), -P.sum(axis=0), atol=1e-7 * scale * len(P))
    moment = np.sum(xy[:, 0] * (P[:, 1] + R[:, 1]) - xy[:, 1] * (P[:, 0] + R[:, 0]))
    assert abs(moment) < 1e-6 * scale * len(P) * xy.max()
