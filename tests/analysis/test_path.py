"""The exact load path and the load multiplier, against brute force.

Independent check (brute-force nonlinear analysis): step the live load up in small increments
and re-solve the tension-only truss from scratch at each step; the first step at which the
member reaches its capacity brackets the multiplier found by following the path.
"""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from rating.analysis.loading import axle_joint_loads
from rating.analysis.path import load_path, member_load_multiplier
from rating.analysis.truss import TrussFamily, solve_tension_only
from rating.model.builders import build_truss

G = build_truss("pratt", 8, 20.0, 25.0, counter_panels=(4, 5))
FAM = TrussFamily(G)


def dead_loads(w=-12.0):
    P = np.zeros((len(G.joints), 2))
    for d in G.deck_joints:
        P[G.joint_index[d], 1] = w
    return P


def brute_force(member, sense, C, P_d, P_l, step=0.005, lam_max=8.0):
    i = G.member_index[member]
    for lam in np.arange(0.0, lam_max, step):
        N = solve_tension_only(G, P_d + lam * P_l).solution.member_forces_kip[i]
        if sense * N >= C:
            return lam
    return np.inf


@settings(max_examples=10, deadline=None)
@given(x=st.floats(0.0, 160.0), load=st.floats(20.0, 80.0), C=st.floats(5.0, 120.0),
       member=st.sampled_from(["L3U4", "U3L4", "L4U4", "U4L5", "L3U3", "U3U4"]))
def test_multiplier_matches_brute_force(x, load, C, member):
    P_d = dead_loads()
    P_l = axle_joint_loads(G, [x, x - 14.0, x - 28.0], [load / 4, load, load])
    sense = -1 if member in ("L4U4", "L3U3", "U3U4") else 1
    lam, _ = member_load_multiplier(FAM, member, sense, C, P_d, P_l, lam_max=8.0)
    ref = brute_force(member, sense, C, P_d, P_l)
    if ref == 0.0:  # factored dead load alone reaches the capacity: RF <= 0
        assert lam <= 0.0
    elif np.isinf(ref):
        assert lam >= 8.0 - 0.005 or np.isinf(lam)
    else:
        assert ref - 0.005 - 1e-9 <= lam <= ref + 1e-9


def test_path_segments_are_consistent():
    P_d = dead_loads()
    P_l = axle_joint_loads(G, [60.0, 46.0, 32.0], [10.0, 40.0, 40.0])
    segs = list(load_path(FAM, P_d, P_l, lam_max=30.0))
    assert len(segs) >= 2  # the counter comes in as the live load grows
    for seg in segs:
        mid = 0.5 * (seg.lam_start + seg.lam_end)
        ref = solve_tension_only(G, P_d + mid * P_l).solution.member_forces_kip
        np.testing.assert_allclose(seg.forces(mid), ref, atol=1e-8)


def test_dead_load_alone_over_capacity_gives_negative_rf():
    P_d = dead_loads(-40.0)
    P_l = axle_joint_loads(G, [80.0], [30.0])
    lam, _ = member_load_multiplier(FAM, "L3L4", 1, 10.0, P_d, P_l)
    assert lam < 0


def test_member_unloaded_by_live_load_is_not_limited():
    P_d = dead_loads()
    P_l = axle_joint_loads(G, [100.0], [30.0])  # at L5: panel 4 shear not reversed
    lam, _ = member_load_multiplier(FAM, "L3U4", 1, 10.0, P_d, P_l, lam_max=50.0)
    assert lam == pytest.approx(np.inf) or lam > 50.0 - 1e-9


@settings(max_examples=25, deadline=None)
@given(x=st.floats(0.0, 160.0), load=st.floats(10.0, 80.0))
def test_no_piece_carries_a_tension_only_member_into_compression(x, load):
    # statics of a tension-only truss: on every piece of the path the active tension-only
    # members stay in tension, and the piece agrees with a fresh solution at its middle
    P_d = dead_loads()
    P_l = axle_joint_loads(G, [x, x - 14.0, x - 28.0], [load / 4, load, load])
    t_only = np.array([m.tension_only for m in G.members])
    for seg in load_path(FAM, P_d, P_l, lam_max=12.0):
        mid = 0.5 * (seg.lam_start + min(seg.lam_end, 12.0))
        N = seg.forces(mid)
        active = np.array([m.label not in seg.slack for m in G.members])
        assert np.all(N[t_only & active] >= -1e-6 * max(np.abs(N).max(), 1.0))
        ref = solve_tension_only(G, P_d + mid * P_l).solution.member_forces_kip
        np.testing.assert_allclose(N, ref, atol=1e-7 * max(np.abs(ref).max(), 1.0))


def test_main_just_past_zero_hands_over_to_its_counter():
    # one load at L3 reverses the shear of panel 4: past the point where the main U3L4 falls
    # to zero the counter L3U4 must take over (not the main kept in compression)
    P_d = dead_loads(-2.0)
    P_l = axle_joint_loads(G, [60.0], [1.0])
    segs = list(load_path(FAM, P_d, P_l, lam_max=200.0))
    change = next(s for s in segs if "U3L4" in s.slack)
    lam = change.lam_start * (1 + 1e-4)
    state = solve_tension_only(G, P_d + lam * P_l)
    assert "U3L4" in state.slack and "L3U4" not in state.slack
    assert not state.forced_compression


def test_live_load_scaled_gives_the_same_path_with_lam_scaled():
    # proportional loading: the path under c P_live is the path under P_live at lam / c, so
    # one path serves every rating level of a load (gamma_LL only scales it)
    P_d = dead_loads()
    P_l = axle_joint_loads(G, [90.0, 76.0, 62.0], [8.0, 32.0, 32.0])
    one = list(load_path(FAM, P_d, P_l, lam_max=40.0))
    c = 1.75
    scaled = list(load_path(FAM, P_d, c * P_l, lam_max=40.0 / c))
    assert [s.slack for s in one] == [s.slack for s in scaled]
    for a, b in zip(one, scaled, strict=True):
        assert b.lam_end == pytest.approx(a.lam_end / c, rel=1e-9)
        assert np.allclose(b.N_live, c * a.N_live, rtol=1e-9, atol=1e-9)


def test_trial_state_by_superposition_gives_the_same_solution():
    # the first trial of a tension-only solve may be handed in (forces and elongations of the
    # starting set by superposition); the result is the solve from scratch
    P_d = dead_loads()
    P_l = axle_joint_loads(G, [100.0, 86.0, 72.0], [8.0, 32.0, 32.0])
    dead = solve_tension_only(G, P_d, family=FAM)
    lt = FAM.solver(dead.slack)
    nd, ed = lt.forces_and_elongations(P_d)
    nl, el = lt.forces_and_elongations(P_l)
    for lam in (0.5, 2.0, 6.0):
        ref = solve_tension_only(G, P_d + lam * P_l, initial_slack=dead.slack, family=FAM)
        got = solve_tension_only(G, P_d + lam * P_l, initial_slack=dead.slack, family=FAM,
                                 trial=(nd + lam * nl, ed + lam * el))
        assert got.slack == ref.slack
        assert np.allclose(got.solution.member_forces_kip, ref.solution.member_forces_kip,
                           rtol=1e-10, atol=1e-9)
