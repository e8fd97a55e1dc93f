"""Tension-only mains and counters by the active-set method, against hand statics.

Hand statics (method of sections, common practice): in panel 4 of an 8-panel Pratt with a
single load P at a panel point, the panel shear is V = R_left - (loads left of the panel);
the diagonal that V would stretch carries |V| / sin(theta) and the other one is slack.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from rating.analysis.truss import LinearTruss, joint_load_array, solve_tension_only
from rating.errors import ConvergenceError, InstabilityError
from rating.model.builders import build_truss

N, P_LEN, H, LOAD = 8, 20.0, 25.0, 40.0
SIN = H / math.hypot(P_LEN, H)


@pytest.fixture(scope="module")
def g():
    return build_truss("pratt", N, P_LEN, H, counter_panels=(4, 5))


def forces(g, sol):
    return dict(zip([m.label for m in g.members], sol.solution.member_forces_kip, strict=True))


def test_shear_reversal_puts_counter_in_tension(g):
    # load at L3, left of panel 4: V4 = 5/8 P - P = -3/8 P (reversed for a left-half panel)
    res = solve_tension_only(g, joint_load_array(g, {"L3": (0.0, -LOAD)}))
    f = forces(g, res)
    assert "U3L4" in res.slack
    assert f["U3L4"] == 0.0
    assert f["L3U4"] == pytest.approx(3 / 8 * LOAD / SIN, rel=1e-9)


def test_no_reversal_main_carries_counter_slack(g):
    # load at L5, right of panel 4: V4 = R_left = 3/8 P, the main is stretched
    res = solve_tension_only(g, joint_load_array(g, {"L5": (0.0, -LOAD)}))
    f = forces(g, res)
    assert "L3U4" in res.slack
    assert f["U3L4"] == pytest.approx(3 / 8 * LOAD / SIN, rel=1e-9)
    assert all(v >= -1e-9 for k, v in f.items()
               if g.member(k).tension_only)


def test_converged_state_is_consistent(g):
    rng = np.random.default_rng(3)
    P = np.zeros((len(g.joints), 2))
    for d in g.deck_joints:
        P[g.joint_index[d], 1] = -rng.uniform(0, 60)
    res = solve_tension_only(g, P)
    lt = LinearTruss(g, res.slack)
    sol = lt.solve(P)
    el = lt.elongation(sol.displacements)[:, 0]
    for i, m in enumerate(g.members):
        if m.tension_only and m.label not in res.slack:
            assert sol.member_forces_kip[i] >= -1e-9
        if m.label in res.slack:
            assert el[i] <= 1e-12  # a slack member is not being stretched


def test_missing_diagonal_names_a_joint_of_that_panel():
    g = build_truss("pratt", N, P_LEN, H)
    with pytest.raises(InstabilityError) as exc:
        LinearTruss(g, inactive=["U2L3"])  # the main diagonal of panel 3 (L2-L3)
    assert exc.value.joint in {"L2", "L3", "U2", "U3"}
    assert exc.value.joint in str(exc.value)


def test_tension_only_without_counter_is_reported_not_hidden():
    # mark an end-panel diagonal tension-only without a counter and reverse its shear
    g0 = build_truss("pratt", N, P_LEN, H)
    from rating.model import Member, TrussGeometry
    members = tuple(Member(m.label, m.start, m.end, m.role, m.label == "U1L2", m.area_in2)
                    for m in g0.members)
    g = TrussGeometry(g0.joints, members, g0.supports, g0.deck_joints)
    res = solve_tension_only(g, joint_load_array(g, {"L1": (0.0, -LOAD)}))
    assert "U1L2" in res.forced_compression
    assert forces(g, res)["U1L2"] < 0


def test_non_convergence_is_an_error(g):
    with pytest.raises(ConvergenceError):
        solve_tension_only(g, joint_load_array(g, {"L3": (0.0, -LOAD)}), max_iterations=1)
