"""Influence lines of a parallel-chord Pratt truss against the method of sections.

Closed form (textbook statics, method of sections — common practice):
- a chord force equals the simple-beam moment ordinate at its moment centre divided by the
  truss depth h: bottom chord of panel i (moment centre U(i-1) in the left half) N = +M/h,
  top chord (moment centre L(i) in the left half) N = -M/h, where for a unit load at a and a
  centre at c on span L, M = a(L-c)/L if a <= c else c(L-a)/L;
- a diagonal's vertical component equals the panel shear V: N = +V/sin(theta) for diagonals
  sloping down toward mid-span in the left half, N = -V/sin(theta) in the right half.
"""

from __future__ import annotations

import math

import numpy as np
import pytest

from rating.analysis.truss import influence_lines
from rating.model.builders import build_truss

N_PANELS, P, H = 10, 22.0, 26.0
L = N_PANELS * P


def beam_moment(a: np.ndarray, c: float) -> np.ndarray:
    return np.where(a <= c, a * (L - c) / L, c * (L - a) / L)


def panel_shear(a: np.ndarray, i: int) -> np.ndarray:
    """Shear in panel i (between points i-1 and i) for a unit load at a on the deck points."""
    left_end, right_end = (i - 1) * P, i * P
    r_left = (L - a) / L
    return np.where(a >= right_end - 1e-9, r_left, np.where(a <= left_end + 1e-9, r_left - 1, 0))


@pytest.fixture(scope="module")
def lines():
    return influence_lines(build_truss("pratt", N_PANELS, P, H))


def test_chords_equal_moment_over_depth(lines):
    a = lines.stations_ft
    for i in range(2, N_PANELS // 2 + 1):  # left half panels with a diagonal
        bottom = lines.row(f"L{i - 1}L{i}")
        np.testing.assert_allclose(bottom, beam_moment(a, (i - 1) * P) / H, atol=1e-9)
        top = lines.row(f"U{i - 1}U{i}")
        np.testing.assert_allclose(top, -beam_moment(a, i * P) / H, atol=1e-9)


def test_diagonals_equal_shear_over_sine(lines):
    a = lines.stations_ft
    sin_t = H / math.hypot(P, H)
    for i in range(2, N_PANELS):
        if 2 * i - 1 < N_PANELS:
            np.testing.assert_allclose(lines.row(f"U{i - 1}L{i}"), panel_shear(a, i) / sin_t,
                                       atol=1e-9)
        else:
            np.testing.assert_allclose(lines.row(f"L{i - 1}U{i}"), -panel_shear(a, i) / sin_t,
                                       atol=1e-9)


def test_hanger_carries_only_its_floorbeam(lines):
    # the hip vertical L1U1 of a through Pratt takes the floorbeam reaction at L1 alone
    row = lines.row("L1U1")
    expected = np.zeros_like(row)
    expected[1] = 1.0
    np.testing.assert_allclose(row, expected, atol=1e-9)


def test_a_member_a_unit_load_does_not_reach_has_a_line_of_exact_zeros():
    # Statics (common practice): on a deck truss the end panel's bottom chord L0L1 meets the
    # support and one vertical only, so with no load at L0 it carries nothing; the verticals
    # of an odd-panel double-intersection truss at mid-span are likewise unloaded. The solve
    # leaves about 1e-15 in such a member, and a rating divided by it was 1e15 or a sign
    # picked by round-off; the line is exactly zero.
    deck = influence_lines(build_truss("pratt", 6, 15.0, 12.0, "deck"))
    assert np.all(deck.row("L0L1") == 0.0) and np.all(deck.row("L5L6") == 0.0)
    assert np.abs(deck.row("L1L2")).max() > 0.1  # (a loaded chord keeps its line)
    double = influence_lines(build_truss("double intersection", 11, 20.0, 26.0))
    assert np.all(double.row("L5U5") == 0.0) and np.all(double.row("L6U6") == 0.0)


def test_round_off_is_measured_against_each_loading_on_its_own():
    from rating.analysis.truss import without_round_off

    N = np.array([[1e-15, 2.0e-3], [1.0, 1e-16], [-3.0, 4.0e-3]])
    np.testing.assert_array_equal(without_round_off(N),
                                  [[0.0, 2.0e-3], [1.0, 0.0], [-3.0, 4.0e-3]])
    np.testing.assert_array_equal(without_round_off(np.array([1e-14, 5.0])), [0.0, 5.0])
