"""The vectorized pin model used by the rating (``PinModel``) against the one-state pin check
and the scalar multiplier of the same module, which build the loading item by item (Berg,
Safe Building, Parts 10-15 [V]; AASHTO LRFD 6.7.6.2.1 / 6.7.6.2.2 [value from memory]).

The two paths share only the packing layout; the statics and the search are written twice, so
agreement checks the vectorized projection (one matrix for every checked vector, linear in the
load multiplier) and its bracketing and regula falsi.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from rating.capacity.pins import MemberAction, PinModel, pin_check, pin_load_multiplier
from rating.model import Material, MaterialKind, PackingItem, Pin

STEEL = Material(MaterialKind.STEEL, F_y=30.0, F_u=60.0)
# a lower-chord joint of a Pratt truss: chord bars both ways, a diagonal, a hanger; directions
# from the joint toward each member's far end
DIRS = {"C1": (-1.0, 0.0), "C2": (1.0, 0.0), "D": (0.6, 0.8), "V": (0.0, 1.0)}


def joint_pin(thick: list[float], order: list[str], D: float = 4.0) -> Pin:
    items = tuple(PackingItem(m, t, 0.0625 if k else 0.0) for k, (m, t) in
                  enumerate(zip(order, thick, strict=True)))
    return Pin("L2", D, items, STEEL)


ORDER = ["C1", "D", "V", "C2", "V", "D", "C1"]  # symmetric about the truss plane
forces = st.floats(-120.0, 120.0, allow_nan=False)


def actions(N: dict[str, float]) -> list[MemberAction]:
    return [MemberAction(m, N[m], DIRS[m]) for m in DIRS]


def balancing(N: dict[str, float]) -> tuple[float, float]:
    fx = -sum(N[m] * DIRS[m][0] for m in DIRS)
    fy = -sum(N[m] * DIRS[m][1] for m in DIRS)
    return fx, fy


@settings(max_examples=40, deadline=None)
@given(n=st.lists(forces, min_size=4, max_size=4),
       t=st.lists(st.floats(0.5, 1.5), min_size=7, max_size=7))
def test_utilization_matches_the_one_state_check(n, t):
    N = dict(zip(DIRS, n, strict=True))
    pin = joint_pin(t, ORDER)
    model = PinModel(pin, list(DIRS), list(DIRS.values()))
    ext = balancing(N)
    F = model.point_forces(np.array(n), np.array(ext))
    u = float(model.utilization(F))
    ref = pin_check(pin, actions(N), external_kip=ext)
    # (abs: the one-state check names the first of the sections within 1e-9 of the most
    # utilized as governing, which for forces of a millionth of a kip is not the largest)
    assert u == pytest.approx(ref.utilization, rel=1e-9, abs=2e-9)
    u_fs, u_b = model.utilization_parts(F)
    assert float(u_fs) == pytest.approx(ref.utilization_flexure_shear, rel=1e-9, abs=2e-9)
    assert float(u_b) == pytest.approx(ref.utilization_bearing, rel=1e-9, abs=1e-12)


@settings(max_examples=40, deadline=None)
@given(n0=st.lists(st.floats(-20.0, 20.0), min_size=4, max_size=4),
       n1=st.lists(forces, min_size=4, max_size=4))
def test_multipliers_match_the_scalar_search(n0, n1):
    pin = joint_pin([1.0, 0.75, 0.5, 1.25, 0.5, 0.75, 1.0], ORDER)
    model = PinModel(pin, list(DIRS), list(DIRS.values()))
    N0, N1 = dict(zip(DIRS, n0, strict=True)), dict(zip(DIRS, n1, strict=True))
    F0 = model.point_forces(np.array(n0), np.array(balancing(N0)))
    F1 = model.point_forces(np.array(n1), np.array(balancing(N1)))
    lam = float(model.multipliers(F0, F1[None])[0])
    ref = pin_load_multiplier(pin, actions(N0), actions(N1), base_external_kip=balancing(N0),
                              added_external_kip=balancing(N1), lam_max=1e3)
    if math.isinf(ref):
        assert math.isinf(lam)
    else:
        assert lam == pytest.approx(ref, rel=1e-7, abs=1e-9)


def test_upper_limits_each_search_and_many_states_at_once():
    pin = joint_pin([1.0, 0.75, 0.5, 1.25, 0.5, 0.75, 1.0], ORDER)
    model = PinModel(pin, list(DIRS), list(DIRS.values()))
    rng = np.random.default_rng(7)
    n1 = rng.uniform(-80, 80, size=(25, 4))
    F0 = model.point_forces(np.zeros(4), np.zeros(2))
    F1 = model.point_forces(n1, np.stack([balancing(dict(zip(DIRS, r, strict=True)))
                                          for r in n1]))
    lam = model.multipliers(F0, F1)
    assert np.all(np.isfinite(lam)) and np.all(lam > 0)
    # each one alone gives the same; at lam the pin is at its limit
    for k in (0, 11, 24):
        assert model.multipliers(F0, F1[k:k + 1])[0] == pytest.approx(lam[k], rel=1e-12)
        assert float(model.utilization(F0 + lam[k] * F1[k])) == pytest.approx(1.0, rel=1e-9)
    # an upper limit below the crossing: not reached; above it: the same crossing
    up = model.multipliers(np.broadcast_to(F0, F1.shape), F1, upper=0.5 * lam)
    assert np.all(np.isinf(up))
    up = model.multipliers(np.broadcast_to(F0, F1.shape), F1, upper=2.0 * lam)
    assert up == pytest.approx(lam, rel=1e-9)


@settings(max_examples=30, deadline=None)
@given(n0=st.lists(st.floats(-40.0, 40.0), min_size=3, max_size=3),
       n1=st.lists(forces, min_size=3, max_size=3),
       d=st.floats(2.5, 6.0))
def test_pins_stacked_give_each_pin_its_own_checks_and_bounds(n0, n1, d):
    # padding a pin's checked vectors to the layout of a larger pin (more sections, more
    # plates) changes none of its utilizations and bounds: the stack is checked against
    # each pin's own model (common practice: a padded section carries nothing)
    from rating.capacity.pins import PinStack

    big = joint_pin([1.0, 0.75, 0.5, 1.25, 0.5, 0.75, 1.0], ORDER)
    dirs3 = {k: DIRS[k] for k in ("C1", "C2", "V")}
    small = Pin("L1", d, tuple(PackingItem(m, t, 0.0625 if k else 0.0) for k, (m, t) in
                                 enumerate(zip(["C1", "V", "C2"], [1.0, 0.5, 1.0],
                                               strict=True))), STEEL)
    models = [PinModel(big, list(DIRS), list(DIRS.values())),
              PinModel(small, list(dirs3), list(dirs3.values()))]
    stack = PinStack(models)
    N0 = [np.array(n0 + [0.5 * n0[0]]), np.array(n0)]
    N1 = [np.array(n1 + [-0.5 * n1[1]]), np.array(n1)]
    for i, (m, a, b) in enumerate(zip(models, N0, N1, strict=True)):
        dirs = DIRS if i == 0 else dirs3
        ext = [-(a[:, None] * np.array(list(dirs.values()))).sum(axis=0),
               -(b[:, None] * np.array(list(dirs.values()))).sum(axis=0)]
        G0 = m.project(m.point_forces(a, ext[0]))[None]
        G1 = m.project(m.point_forces(b, ext[1]))[None]
        which = np.array([i])
        for lam in (0.0, 0.3, 2.0):
            assert stack.utilization(stack.pad(i, G0 + lam * G1), which)[0] == \
                pytest.approx(float(m._utilization_projected(G0 + lam * G1)[0]), rel=1e-14)
        lo, up = stack.multiplier_bounds(stack.pad(i, G0), stack.pad(i, G1), which)
        lo1, up1 = m.multiplier_bounds(G0, G1)
        assert lo[0] == pytest.approx(lo1[0], rel=1e-14) and up[0] == pytest.approx(up1[0],
                                                                                   rel=1e-14)


def test_a_prepared_layout_gives_the_same_check_and_guards_its_members():
    # the layout worked out once (rating.capacity.pins.prepare_pin) and shared by the checks
    # of several load states: the same check as one worked out afresh; actions that do not
    # fit it (another order of the members) get their own
    from rating.capacity.pins import prepare_pin

    pin = joint_pin([1.0, 0.75, 0.5, 1.25, 0.5, 0.75, 1.0], ORDER)
    prepared = prepare_pin(pin, list(DIRS), list(DIRS.values()))
    N = {"C1": -40.0, "C2": 55.0, "D": 30.0, "V": -12.0}
    fresh = pin_check(pin, actions(N), external_kip=balancing(N))
    again = pin_check(pin, actions(N), external_kip=balancing(N), prepared=prepared)
    assert again == fresh
    turned = list(reversed(actions(N)))
    assert pin_check(pin, turned, external_kip=balancing(N), prepared=prepared) == \
        pin_check(pin, turned, external_kip=balancing(N))
    with pytest.raises(Exception, match="not a number"):
        pin_check(pin, actions({**N, "D": math.nan}), external_kip=balancing(N),
                  prepared=prepared)


@settings(max_examples=30, deadline=None)
@given(both=st.lists(forces, min_size=8, max_size=8))
def test_balanced_states_need_the_shears_from_one_side_only(both):
    # with the pin in balance the shears from the right are those from the left reversed
    # (statics); the model told so keeps only those, with the same checks and bounds
    graded = joint_pin([1.0, 0.75, 0.5, 1.25, 0.5, 0.75, 1.0], ORDER)
    full, half = (PinModel(graded, list(DIRS), list(DIRS.values()), balanced=b)
                  for b in (False, True))
    assert half._nv == 2 and full._nv == 4
    G = []
    for n in (both[:4], both[4:]):
        N = dict(zip(DIRS, n, strict=True))
        F = full.point_forces(np.array(n), np.array(balancing(N)))
        G.append((full.project(F)[None], half.project(F)[None]))
    for lam in (0.0, 0.7, 3.0):
        u_full = float(full._utilization_projected(G[0][0] + lam * G[1][0])[0])
        u_half = float(half._utilization_projected(G[0][1] + lam * G[1][1])[0])
        assert u_half == pytest.approx(u_full, rel=1e-12, abs=1e-14)
    lo_f, up_f = full.multiplier_bounds(G[0][0], G[1][0])
    lo_h, up_h = half.multiplier_bounds(G[0][1], G[1][1])
    assert lo_h[0] == pytest.approx(lo_f[0], rel=1e-12, abs=1e-14)
    assert up_h[0] == pytest.approx(up_f[0], rel=1e-12, abs=1e-14)
