"""Array helpers of the pins' search against the plain computation they stand for (each row
on its own pin's projector; the largest shear and the vector lengths of
rating.capacity.pins), whatever the order of the states."""

from __future__ import annotations

import numpy as np
from hypothesis import given, settings
from hypothesis import strategies as st

from rating.capacity.pins import _largest_shears, vector_lengths
from rating.lrfr.pins import _Joints


@settings(max_examples=60, deadline=None)
@given(seed=st.integers(0, 2**32 - 1), n_pins=st.integers(1, 4), P=st.integers(0, 30),
       order=st.sampled_from(["sorted", "shuffled"]))
def test_projection_is_each_row_on_its_own_pin(seed, n_pins, P, order):
    rng = np.random.default_rng(seed)
    n, K = 5, 7
    T = rng.normal(size=(n_pins, n, 2 * K))
    N = rng.normal(size=(P, n))
    which = rng.integers(0, n_pins, P)
    if order == "sorted":
        which = np.sort(which)
    joints = _Joints(stack=None, cols=np.zeros((n_pins, n), dtype=int), T=T)
    G = joints.project(N, which)
    assert G.shape == (P, K, 2)
    for p in range(P):  # (one row at a time is summed by another kernel: round-off apart)
        np.testing.assert_allclose(G[p].reshape(-1), N[p] @ T[which[p]], rtol=1e-13,
                                   atol=1e-13)


@settings(max_examples=60, deadline=None)
@given(seed=st.integers(0, 2**32 - 1), n=st.integers(1, 6), nv=st.sampled_from([2, 4]),
       plates=st.integers(0, 3))
def test_largest_shear_and_lengths(seed, n, nv, plates):
    rng = np.random.default_rng(seed)
    G = rng.normal(size=(9, (2 + nv) * n + plates, 2)) * 100.0
    g = vector_lengths(G)
    np.testing.assert_allclose(g, np.linalg.norm(G, axis=-1), rtol=1e-15, atol=0.0)
    shears = g[:, 2 * n:(2 + nv) * n].reshape(9, nv, n)
    np.testing.assert_array_equal(_largest_shears(g, n, nv), shears.max(axis=1))


def test_a_spliced_chord_never_lowers_its_pins_rating_on_the_sample():
    # the Pratt sample's top-chord pins, their built-up chord given as spliced through the
    # joint: the chord's plates bring the resultant of its two members' forces, not each
    # one's (rating.capacity.pins); on these pins that rates each one at least as high
    from dataclasses import replace
    from pathlib import Path

    from rating.inventory.reader import read_workbook
    from rating.lrfr.engine import rate_bridge

    root = Path(__file__).resolve().parents[2]
    b = read_workbook(root / "sample_inventory" / "tc0417_pratt_1898.xlsx").bridge
    joints = ("U2", "U3")
    base = rate_bridge(b, ["TYPE-3"], what_if=False)
    pairs = {j: tuple(m.label for m in b.geometry.members_at(j)
                      if m.role.value == "top chord") for j in joints}
    assert all(len(pr) == 2 for pr in pairs.values())
    spliced = replace(b, pins=tuple(replace(p, spliced_chord=pairs[p.joint])
                                    if p.joint in joints else p for p in b.pins))
    r = rate_bridge(spliced, ["TYPE-3"], what_if=False)
    before = {p.joint: p.ratings["TYPE-3"].rf for p in base.pins}
    after = {p.joint: p.ratings["TYPE-3"].rf for p in r.pins}
    for j in joints:
        assert after[j] >= before[j] * (1 - 1e-9)
        assert any("spliced through the joint" in a for p in r.pins if p.joint == j
                   for a in p.assumptions)
        # and the splice itself, which now carries the chord's force, is said to be unrated
        assert any("the splice itself" in w and "is not rated here" in w
                   for p in r.pins if p.joint == j for w in p.warnings)
    assert any(after[j] > before[j] * 1.001 for j in joints)
    for j in before:  # the other pins as before
        if j not in joints:
            assert after[j] == before[j]
