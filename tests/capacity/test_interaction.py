"""Axial force left to a member bending under its own weight (rating.capacity.interaction),
against closed forms of the interaction equations of AASHTO LRFD 6.8.2.3 / 6.9.2.2 with the
moment magnifier of 4.5.3.2.2b [value from memory]: algebra on the published forms."""

from __future__ import annotations

import math

import pytest
from hypothesis import given
from hypothesis import strategies as st

from rating.capacity.interaction import (
    axial_limit_kip,
    interaction,
    magnifier,
    own_weight_moment_kip_in,
)


def test_own_weight_moment_is_w_l_squared_over_8():
    # 50 lb/ft over 20 ft: 0.05 x 400 / 8 = 2.5 kip-ft = 30 kip-in (statics)
    assert own_weight_moment_kip_in(0.05, 20.0) == pytest.approx(30.0, rel=1e-12)


def test_tension_large_axial_branch_closed_form():
    """P/P_r >= 0.2: P* = P_r (1 - 8/9 M/M_r) (Eq. 6.8.2.3-2 solved for P, no magnifier)."""
    P_r, M_u, M_r = 400.0, 60.0, 1200.0
    assert axial_limit_kip(P_r, M_u, M_r) == pytest.approx(P_r * (1 - 8 / 9 * 0.05), rel=1e-10)


def test_small_axial_branch_closed_form():
    """A moment of 95 % of M_r leaves P* = 2 P_r (1 - M/M_r) = 0.1 P_r, below 0.2 P_r, so
    Eq. 6.8.2.3-1 holds there."""
    P_r = 300.0
    assert axial_limit_kip(P_r, 950.0, 1000.0) == pytest.approx(0.1 * P_r, rel=1e-10)


def test_compression_with_the_magnifier_closed_form():
    """P/P_r + 8/9 m / (1 - P/P_e) = 1 is the quadratic P^2 - (P_e + P_r) P + P_r P_e (1 -
    8m/9) = 0; its lesser root (algebra on Eq. 6.9.2.2-2 with delta_b = 1 / (1 - P/P_e),
    C_m = 1, phi_K = 1)."""
    P_r, P_e, M_u, M_r = 345.7, 1319.0, 67.8, 1191.6
    m = M_u / M_r
    b = P_e + P_r
    closed = (b - math.sqrt(b * b - 4 * P_r * P_e * (1 - 8 * m / 9))) / 2
    got = axial_limit_kip(P_r, M_u, M_r, P_e)
    assert got == pytest.approx(closed, rel=1e-9)
    assert got < axial_limit_kip(P_r, M_u, M_r)  # the magnifier only lowers it


def test_a_moment_past_the_resistance_leaves_nothing():
    assert axial_limit_kip(100.0, 1000.0, 900.0) == 0.0
    assert axial_limit_kip(100.0, 0.0, 900.0) == 100.0
    assert axial_limit_kip(0.0, 10.0, 900.0) == 0.0


def test_the_magnifier():
    assert magnifier(0.0, 1000.0) == 1.0
    assert magnifier(500.0, 1000.0) == pytest.approx(2.0)
    assert magnifier(1000.0, 1000.0) == math.inf


@given(P_r=st.floats(1.0, 5e3), m=st.floats(0.0, 0.99), e=st.floats(1.05, 50.0),
       compression=st.booleans())
def test_the_limit_is_where_the_interaction_reaches_one(P_r, m, e, compression):
    M_r = 1000.0
    P_e = e * P_r if compression else None
    P = axial_limit_kip(P_r, m * M_r, M_r, P_e)
    assert 0.0 <= P <= P_r
    if 0.0 < P < P_r:
        assert interaction(P * (1 - 1e-9), m * M_r, P_r, M_r, P_e) <= 1.0 + 1e-9
        assert interaction(min(P * (1 + 1e-9) + 1e-9, P_r), m * M_r, P_r, M_r, P_e) >= 1.0 - 1e-6
    # more moment never leaves more axial force
    assert axial_limit_kip(P_r, min(m + 0.01, 1.0) * M_r, M_r, P_e) <= P + 1e-9 * P_r
