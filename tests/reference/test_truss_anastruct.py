"""Member forces against anaStruct, an independent general 2-D FE library (PyPI: anastruct).

Source of the reference: anaStruct's own frame/truss solver, built here from the same joints,
members and supports. Tolerance 1e-6 relative to the largest force in the case.
"""

from __future__ import annotations

import numpy as np
import pytest

anastruct = pytest.importorskip("anastruct")
from anastruct import SystemElements  # noqa: E402

from rating.analysis.truss import LinearTruss  # noqa: E402
from rating.model import SupportKind, TrussGeometry  # noqa: E402
from rating.model.builders import build_truss  # noqa: E402


def anastruct_forces(g: TrussGeometry, P: np.ndarray) -> np.ndarray:
    ss = SystemElements()
    for m in g.members:
        a, b = g.joint(m.start), g.joint(m.end)
        ss.add_truss_element([[a.x_ft, a.y_ft], [b.x_ft, b.y_ft]], EA=m.area_in2 * 29000.0)
    node = {j.label: ss.find_node_id([j.x_ft, j.y_ft]) for j in g.joints}
    for s in g.supports:
        if s.kind is SupportKind.PIN:
            ss.add_support_hinged(node[s.joint])
        else:
            ss.add_support_roll(node[s.joint], direction="x")
    for j, (fx, fy) in zip(g.joints, P, strict=True):
        if fx or fy:
            ss.point_load(node[j.label], Fx=float(fx), Fy=float(fy))
    ss.solve()
    return np.array([ss.get_element_results(i + 1)["Nmax"] for i in range(len(g.members))])


FORMS = [
    ("pratt", 8, 24.0, 22.0),
    ("parker", 10, 22.0, [18.0, 22.0, 25.0, 27.0, 28.0, 27.0, 25.0, 22.0, 18.0]),
    ("warren", 6, 20.0, 14.0),
    ("warren with verticals", 8, 18.0, 16.0),
    ("pennsylvania", 14, 20.0, [24.0, 24.0, 28.0, 31.0, 33.0, 34.0, 34.5, 35.0, 34.5, 34.0,
                                33.0, 31.0, 28.0, 24.0, 24.0]),
    ("baltimore", 10, 20.0, 30.0),
    ("double intersection", 10, 18.0, 24.0),
]


@pytest.mark.parametrize("form, n, p, h", FORMS, ids=[f[0] for f in FORMS])
def test_forces_match_anastruct(form, n, p, h):
    g = build_truss(form, n, p, h)
    rng = np.random.default_rng(7)
    # vary stiffness so indeterminate forms are a real check
    members = tuple(type(m)(m.label, m.start, m.end, m.role, m.tension_only,
                            float(rng.uniform(4.0, 30.0))) for m in g.members)
    g = TrussGeometry(g.joints, members, g.supports, g.deck_joints, g.form, g.deck_position)
    lt = LinearTruss(g)
    cases = []
    P1 = np.zeros((len(g.joints), 2))  # uniform panel loads on the deck
    for d in g.deck_joints:
        P1[g.joint_index[d], 1] = -10.0
    cases.append(P1)
    P2 = np.zeros_like(P1)  # one concentrated load off-centre
    P2[g.joint_index[g.deck_joints[2]], 1] = -50.0
    cases.append(P2)
    P3 = rng.uniform(-20, 20, size=P1.shape)  # random loads, both directions, every joint
    cases.append(P3)
    for P in cases:
        ours = lt.solve(P).member_forces_kip
        ref = anastruct_forces(g, P)
        np.testing.assert_allclose(ours, ref, rtol=0, atol=1e-6 * np.abs(ref).max())
