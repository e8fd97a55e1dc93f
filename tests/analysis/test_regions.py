"""The load paths of many loadings at once, from the regions of the active sets, against the
path walked one change of active set at a time.

Independent check: rating.analysis.path.load_path (itself checked against stepping the load
up and re-solving the tension-only truss from scratch, tests/analysis/test_path.py). Both
must give the same pieces: the same active sets, in the same order, on the same intervals
of lam (to the round-off of the consistency tolerance), with the same forces.
"""

from __future__ import annotations

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from rating.analysis.loading import axle_panel_loads
from rating.analysis.path import load_path
from rating.analysis.regions import PathStore, RegionTable
from rating.analysis.truss import TrussFamily, solve_tension_only
from rating.lrfr.engine import active_set_configurations
from rating.model.builders import build_truss

FORMS = {
    "8-panel Pratt, counters in 2 panels": build_truss("pratt", 8, 20.0, 25.0,
                                                       counter_panels=(4, 5)),
    "8-panel Pratt, counters in 4 panels": build_truss("pratt", 8, 20.0, 25.0,
                                                       counter_panels=(3, 4, 5, 6)),
    "10-panel Pratt, counters in 6 panels (beyond the full family)": build_truss(
        "pratt", 10, 18.0, 24.0, counter_panels=(3, 4, 5, 6, 7, 8)),
}


def _dead(g, w):
    P = np.zeros((len(g.joints), 2))
    for d in g.deck_joints:
        P[g.joint_index[d], 1] = w
    return P


def _assert_same_paths(table, pc, fam, P_d, dead, p, lam_max):
    for x in range(p.shape[1]):
        ref = list(load_path(fam, P_d, table.joint_loads(p[:, x]), lam_max=lam_max,
                             dead_state=dead))
        got = [j for j in range(pc.k.shape[1]) if pc.k[x, j] >= 0]
        assert [s.slack for s in ref] == [table.slack[pc.k[x, j]] for j in got], x
        for s, j in zip(ref, got, strict=True):
            assert pc.lo[x, j] == pytest.approx(s.lam_start, rel=1e-7, abs=1e-7)
            assert pc.hi[x, j] == pytest.approx(s.lam_end, rel=1e-7, abs=1e-7)
            assert np.allclose(pc.N_live[x, j], s.N_live, rtol=1e-9, atol=1e-9)
            assert np.allclose(pc.N_dead[x, j], s.N_dead, rtol=1e-9, atol=1e-9)


@pytest.mark.parametrize("form", list(FORMS))
@settings(max_examples=6, deadline=None)
@given(xs=st.lists(st.floats(-40.0, 200.0), min_size=1, max_size=10),
       load=st.floats(10.0, 80.0), w=st.floats(-20.0, -2.0))
def test_paths_from_regions_equal_the_walked_paths(form, xs, load, w):
    g = FORMS[form]
    fam = TrussFamily(g)
    P_d = _dead(g, w)
    dead = solve_tension_only(g, P_d, family=fam)
    table = RegionTable(fam, active_set_configurations(fam, dead.slack))
    X = np.array(xs)[:, None] - np.array([0.0, 14.0, 28.0])[None, :]
    p = axle_panel_loads(g.deck_stations_ft, X, [load / 4, load, load])
    pc = table.pieces("dead", P_d, dead, p, lam_max=60.0)
    _assert_same_paths(table, pc, fam, P_d, dead, p, 60.0)


@settings(max_examples=6, deadline=None)
@given(xs=st.lists(st.floats(-40.0, 200.0), min_size=1, max_size=10),
       need=st.floats(0.1, 1e3))
def test_paths_completed_on_demand_are_the_walked_paths_as_far_as_needed(xs, need):
    # a path the family leaves is kept only as far as it covers it; completing it to a
    # needed load level gives the walked path at least that far
    g = FORMS["10-panel Pratt, counters in 6 panels (beyond the full family)"]
    fam = TrussFamily(g)
    P_d = _dead(g, -10.0)
    dead = solve_tension_only(g, P_d, family=fam)
    table = RegionTable(fam, active_set_configurations(fam, dead.slack))
    X = np.array(xs)[:, None] - np.array([0.0, 14.0, 28.0])[None, :]
    p = axle_panel_loads(g.deck_stations_ft, X, [10.0, 40.0, 40.0])
    store = PathStore(table, "dead", P_d, dead, p)
    store.complete(np.full(p.shape[1], need))
    pc = store.pieces
    assert np.all(pc.cover >= min(need, 1e3) * (1.0 - 1e-9))
    for x in range(p.shape[1]):
        ref = [s for s in load_path(fam, P_d, table.joint_loads(p[:, x]), lam_max=1e3,
                                    dead_state=dead) if s.lam_start < pc.cover[x] - 1e-7]
        got = [j for j in range(pc.k.shape[1]) if pc.k[x, j] >= 0 and pc.lo[x, j]
               < pc.cover[x] - 1e-7]
        assert [s.slack for s in ref] == [table.slack[pc.k[x, j]] for j in got], x
        for s, j in zip(ref, got, strict=True):
            assert pc.lo[x, j] == pytest.approx(s.lam_start, rel=1e-7, abs=1e-7)
            assert np.allclose(pc.N_live[x, j], s.N_live, rtol=1e-9, atol=1e-9)


def test_the_family_is_taught_the_sets_a_walk_meets():
    # both diagonals of a counter panel carry tension under some loads (the panel stretches
    # with the chord): such sets are outside the flips of the family; after one walk meets
    # them the regions cover the other paths
    g = FORMS["8-panel Pratt, counters in 4 panels"]
    fam = TrussFamily(g)
    P_d = _dead(g, -12.0)
    dead = solve_tension_only(g, P_d, family=fam)
    configs = active_set_configurations(fam, dead.slack)
    table = RegionTable(fam, configs)
    xs = np.linspace(-30.0, 190.0, 80)
    X = xs[:, None] - np.array([0.0, 14.0, 28.0])[None, :]
    p = axle_panel_loads(g.deck_stations_ft, X, [10.0, 40.0, 40.0])
    pc = table.pieces("dead", P_d, dead, p)
    assert len(table.slack) >= len(configs)
    assert pc.walked.sum() < 10  # a few walks teach the table what the others need
    _assert_same_paths(table, pc, fam, P_d, dead, p, 1e3)


@settings(max_examples=60, deadline=None)
@given(seed=st.integers(0, 2**32 - 1), K=st.integers(1, 4), X=st.integers(1, 6),
       C=st.integers(1, 5), zeros=st.floats(0.0, 0.5))
def test_intervals_of_the_sets_are_those_of_each_condition_in_turn(seed, K, X, C, zeros):
    """_intervals (extremes over the conditions taken across the loadings) against the
    closed form, one set, loading and condition at a time: a + lam b >= 0 holds for
    lam >= -a/b where b > 0, for lam <= -a/b where b < 0, everywhere or nowhere where b = 0."""
    from rating.analysis.regions import _intervals

    rng = np.random.default_rng(seed)
    A = rng.normal(size=(K, C))
    B = rng.normal(size=(K, C, X))
    B[rng.random(B.shape) < zeros] = 0.0
    lam_max = 50.0
    lo, hi = _intervals(A, B.transpose(0, 2, 1), lam_max)  # B as RegionTable makes it
    for k in range(K):
        for x in range(X):
            low, high, never = 0.0, lam_max, False
            for c in range(C):
                a, b = A[k, c], B[k, c, x]
                if b > 0:
                    low = max(low, -a / b)
                elif b < 0:
                    high = min(high, -a / b)
                elif a < 0:
                    never = True
            if never:
                assert lo[k, x] == np.inf and hi[k, x] == -np.inf
            else:
                assert lo[k, x] == low and hi[k, x] == high
