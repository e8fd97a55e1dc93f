"""Torsion and warping properties of built-up sections (rating.capacity.torsion).

Sources: the exact St Venant torsional constant of a rectangle (Timoshenko and Goodier,
*Theory of Elasticity*, 3rd ed., 1970, Sec. 109, series solution; Roark's *Formulas for
Stress and Strain*, 7th ed., Table 10.7, case 4) [value from memory]; the thin-walled
channel's shear centre and warping constant (AISC Design Guide 9, *Torsional Analysis of
Structural Steel Members*, 1997, Appendix A) [value from memory]. The comparison with an
independent finite-element library is in tests/reference/test_sections_sectionproperties.py.
"""

from __future__ import annotations

import dataclasses
import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

import rating.capacity.torsion as torsion
from rating.capacity.sections import Rect, part_rectangles, section_properties
from rating.capacity.torsion import torsion_properties
from rating.model import BuiltUpSection, ChannelPart, ChannelToes, Finding, PlatePart


def plate(cx: float, cy: float, bx: float, by: float, label: str = "p") -> Rect:
    thick_x = bx < by
    return Rect(label, "plate", cx, cy, bx, by, thick_x, max(bx, by), min(bx, by), True)


def rects(*parts) -> list[Rect]:
    return [r for p in parts for r in part_rectangles(p)]


def test_a_rectangles_torsional_constant_is_the_series_solution():
    # Roark Table 10.7 case 4 [value from memory], a and b half the sides (a >= b):
    # J = a b^3 (16/3 - 3.36 b/a (1 - b^4 / (12 a^4))); within about 0.5 % of the exact
    # series for every a/b (Timoshenko and Goodier Sec. 109)
    for side, t in ((6.0, 0.5), (2.0, 2.0), (4.0, 1.0)):
        a, b = side / 2, t / 2
        J = a * b**3 * (16 / 3 - 3.36 * b / a * (1 - b**4 / (12 * a**4)))
        tp = torsion_properties([plate(0.0, 0.0, side, t)])
        assert tp.J_in4 == pytest.approx(J, rel=0.01)
        # a doubly symmetric section: its shear centre is its centroid
        assert (tp.x_s_in, tp.y_s_in) == pytest.approx((0.0, 0.0), abs=1e-9)
        assert tp.area.A_in2 == pytest.approx(side * t, rel=1e-12)


def test_a_thin_channels_shear_centre_and_warping_constant_are_the_thin_walled_ones():
    # AISC Design Guide 9 [value from memory], mid-line dimensions b' = b_f - t_w/2 and
    # h = d - t_f: e = 3 b'^2 t_f / (6 b' t_f + h t_w) from the web's mid-line, away from
    # the flanges; C_w = t_f b'^3 h^2 / 12 (3 b' t_f + 2 h t_w) / (6 b' t_f + h t_w)
    d, bf, tw, tf = 12.0, 3.0, 0.2, 0.2
    ch = ChannelPart("C", d, bf, tw, tf, x_in=0.0, y_in=0.0, toes=ChannelToes.RIGHT)
    tp = torsion_properties(rects(ch))
    b, h = bf - tw / 2, d - tf
    e = 3 * b**2 * tf / (6 * b * tf + h * tw)
    C_w = tf * b**3 * h**2 / 12 * (3 * b * tf + 2 * h * tw) / (6 * b * tf + h * tw)
    assert tp.x_s_in == pytest.approx(tw / 2 - e, abs=0.02 * e)  # the web's mid-line at tw/2
    assert tp.y_s_in == pytest.approx(0.0, abs=1e-9)
    assert tp.C_w_in6 == pytest.approx(C_w, rel=0.03)
    # J: the thin-walled sum of b t^3 / 3 over the walls, within the junctions' effect
    assert tp.J_in4 == pytest.approx((2 * b * tf**3 + h * tw**3) / 3, rel=0.10)


def test_the_mesh_is_fine_enough():
    """Halving the elements' least side moves J by under 0.5 % and C_w and the shear centre
    by far less, on the demo chord (two channels, a cover plate)."""
    chord = rects(ChannelPart("L", 10.0, 2.6, 0.24, 0.436, x_in=-5.125, toes=ChannelToes.LEFT),
                  ChannelPart("R", 10.0, 2.6, 0.24, 0.436, x_in=5.125, toes=ChannelToes.RIGHT),
                  PlatePart("cover", 14.0, 0.3125, y_in=5.15625))
    usual = torsion_properties(chord)
    fine_min = torsion.CELL_MIN_IN / 2
    try:
        torsion.CELL_MIN_IN = fine_min
        fine = torsion_properties(chord)
    finally:
        torsion.CELL_MIN_IN = fine_min * 2
    assert fine.elements > usual.elements
    assert usual.J_in4 == pytest.approx(fine.J_in4, rel=0.005)
    assert usual.C_w_in6 == pytest.approx(fine.C_w_in6, rel=1e-3)
    assert usual.y_s_in == pytest.approx(fine.y_s_in, abs=1e-3)


def test_sections_that_are_not_one_region_say_why():
    apart = [plate(0.0, 0.0, 4.0, 0.5, "a"), plate(0.0, 2.0, 4.0, 0.5, "b")]
    corner = [plate(0.0, 0.0, 2.0, 0.5, "a"), plate(2.25, 0.75, 2.5, 1.0, "b")]
    overlap = [plate(0.0, 0.0, 4.0, 0.5, "a"), plate(0.0, 0.1, 4.0, 0.5, "b")]
    assert torsion_properties(apart).startswith("the parts do not make one connected section")
    assert torsion_properties(corner).startswith("the parts do not make one connected section")
    assert torsion_properties(overlap) == "parts overlap"
    assert torsion_properties([]) == "no material left"


def test_a_thinned_cover_plate_stays_riveted_to_the_channels():
    """Loss is taken off the free face of a plate riveted on one face only, for the torsion
    analysis (the other properties keep its mid-line): the section stays one region, with
    the same area."""
    chord = BuiltUpSection(parts=(
        ChannelPart("L", 10.0, 2.6, 0.24, 0.436, x_in=-5.125, toes=ChannelToes.LEFT),
        ChannelPart("R", 10.0, 2.6, 0.24, 0.436, x_in=5.125, toes=ChannelToes.RIGHT),
        PlatePart("cover", 14.0, 0.3125, y_in=5.15625)))
    loss = Finding("M", "cover", percent_loss=40.0)
    s = min(section_properties(chord, member="M", findings=(loss,), length_ft=18.0)
            .compression, key=lambda s: s.A_g_in2)
    (cover,) = [r for r in s.torsion_rects if r.part == "cover"]
    assert cover.by_in == pytest.approx(0.6 * 0.3125)
    assert cover.cy_in - cover.by_in / 2 == pytest.approx(5.0)  # on the flanges' tops
    tp = torsion_properties(s.torsion_rects)
    assert not isinstance(tp, str)
    assert tp.area.A_in2 == pytest.approx(s.A_g_in2, rel=1e-12)
    # and the same section as built is stiffer in torsion and warping
    built = torsion_properties(section_properties(chord, member="M", length_ft=18.0)
                               .compression[0].torsion_rects)
    assert tp.J_in4 < built.J_in4 and tp.C_w_in6 < built.C_w_in6


tees = st.tuples(st.floats(2.0, 10.0), st.floats(0.2, 1.0), st.floats(2.0, 10.0),
                 st.floats(0.2, 1.0), st.floats(-0.8, 0.8))


def tee(flange_b, flange_t, stem_d, stem_t, where) -> list[Rect]:
    """A flange on a stem, the stem at ``where`` of the flange's half-width off centre."""
    cx = where * (flange_b - stem_t) / 2
    return [plate(0.0, stem_d + flange_t / 2, flange_b, flange_t, "f"),
            plate(cx, stem_d / 2, stem_t, stem_d, "s")]


@settings(max_examples=25, deadline=None)
@given(shape=tees, dx=st.floats(-20.0, 20.0), dy=st.floats(-20.0, 20.0))
def test_moving_a_section_moves_its_centres_and_keeps_its_constants(shape, dx, dy):
    a = torsion_properties(tee(*shape))
    b = torsion_properties([dataclasses.replace(r, cx_in=r.cx_in + dx, cy_in=r.cy_in + dy)
                            for r in tee(*shape)])
    # the grid's lines are found again from the moved edges, whose round-off can add or drop
    # an element at a grading step: the two agree to the mesh's own accuracy (the J of the
    # demo chord moves by 0.4 % when the least element is halved: test_the_mesh_is_fine_enough)
    assert b.J_in4 == pytest.approx(a.J_in4, rel=2e-3)
    assert b.C_w_in6 == pytest.approx(a.C_w_in6, rel=2e-3, abs=1e-6)
    assert (b.x_s_in - dx, b.y_s_in - dy) == pytest.approx((a.x_s_in, a.y_s_in), abs=2e-3)
    assert (b.area.x_c_in - dx, b.area.y_c_in - dy) == pytest.approx(
        (a.area.x_c_in, a.area.y_c_in), abs=1e-7)


@settings(max_examples=25, deadline=None)
@given(shape=tees)
def test_a_mirrored_section_has_the_mirrored_shear_centre(shape):
    a = torsion_properties(tee(*shape))
    b = torsion_properties([dataclasses.replace(r, cx_in=-r.cx_in) for r in tee(*shape)])
    assert b.x_s_in == pytest.approx(-a.x_s_in, abs=1e-6)
    assert b.y_s_in == pytest.approx(a.y_s_in, abs=1e-6)
    assert b.area.I_xy_in4 == pytest.approx(-a.area.I_xy_in4, abs=1e-9)
    assert b.J_in4 == pytest.approx(a.J_in4, rel=1e-9)
    assert b.C_w_in6 == pytest.approx(a.C_w_in6, rel=1e-6, abs=1e-9)
    if shape[4] == 0.0:  # a symmetric tee: its shear centre on its axis
        assert abs(a.x_s_in) < 1e-6
    assert math.isfinite(a.r_o_in) and a.J_in4 > 0.0


@settings(max_examples=200, deadline=None)
@given(a=st.floats(-50.0, 50.0), length=st.floats(1e-3, 40.0), h_min=st.floats(0.01, 0.3))
def test_graded_lines_cover_the_interval_without_slivers(a, length, h_min):
    """The grid lines of one interval rise strictly to its end; no element is thinner than
    half the least side asked for (or the whole interval), none wider than the largest."""
    import numpy as np

    b = a + length
    lines = torsion._graded(a, b, h_min)
    sides = np.diff(np.concatenate([[a], lines]))
    assert lines[-1] == b and np.all(sides > 0)
    assert sides.min() >= min(0.5 * h_min, length) * (1 - 1e-9)
    assert sides.max() <= max(torsion.CELL_MAX_IN, h_min) * (1 + 1e-9)
