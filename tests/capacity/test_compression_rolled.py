"""Rolled shapes in compression: an angle's least radius r_z, and torsional and
flexural-torsional buckling from tabulated J, C_w and shear centre (AASHTO LRFD 6.9.4.1.3
[value from memory]), written out here independently. The shapes are invented test data with
the proportions of a tee and an angle."""

from __future__ import annotations

import math

import pytest
from capacity_helpers import FY, STEEL, E

from rating.capacity.compression import (
    G_OVER_E,
    UNKNOWN_SYMMETRY,
    compression_checks,
    nominal_compressive_resistance,
)
from rating.capacity.sections import section_properties
from rating.errors import InputError
from rating.model import BarState, Finding, RolledShape

G = G_OVER_E * E

# a tee, symmetric about its y axis (stem in y): the shear centre at the flange, y_o from the
# centroid; J and C_w of its two plates (test data)
TEE = RolledShape("WT 6 x 13", 3.82, 1.75, 1.43, J_in4=0.13, C_w_in6=0.13, x_o_in=0.0,
                  y_o_in=1.41)
ANGLE = RolledShape("L 4 x 4 x 1/2", 3.75, 1.21, 1.21, r_z_in=0.776)


def run(section, findings=(), *, L=12.0, K=1.0):
    r = section_properties(section, member="M", findings=findings, length_ft=L)
    return compression_checks(r, STEEL, K=K, length_ft=L)


def on_curve(A: float, P_e: float) -> float:
    """P_n on the column curve at the slenderness whose Euler load is P_e."""
    return float(nominal_compressive_resistance(A, FY, E, math.pi * math.sqrt(E * A / P_e)))


def test_an_angle_buckles_about_its_least_axis():
    c = run(ANGLE, L=8.0)
    assert c.KL_r == pytest.approx(96.0 / 0.776)
    chk = c.checks[0]
    assert chk.name == "compression: flexural buckling"
    assert chk.R_n_kip == pytest.approx(float(nominal_compressive_resistance(
        3.75, FY, E, 96.0 / 0.776)), rel=1e-12)
    assert "least principal axis, r_z = 0.776 in" in chk.detail
    # its torsional buckling is named for a hand check (x and y are not principal)
    assert c.torsional_unchecked == UNKNOWN_SYMMETRY
    note = next(a for a in c.assumptions if "not shown to be doubly symmetric" in a)
    assert "x and y are not its principal axes" in note
    # the eccentricity of a single angle's connection is left to the engineer, said so
    assert any("AASHTO LRFD 6.9.4.4" in a and "r_z = 0.776 in" in a for a in c.assumptions)


def test_the_longer_effective_length_goes_with_r_z():
    # out of plane on U-frames 1.5 times the panel: r_z takes the longer length (conservative)
    r = section_properties(ANGLE, member="M", length_ft=8.0)
    c = compression_checks(r, STEEL, K=1.0, length_ft=8.0, KL_out_of_plane_ft=12.0)
    assert c.KL_r == pytest.approx(144.0 / 0.776)


def test_a_tee_in_flexural_torsional_buckling_by_eq_2():
    # Eq. 6.9.4.1.3-2 for a section symmetric about y, written out (x_o = 0: P_ey couples)
    L_in = 12.0 * 12.0
    A, rx, ry = TEE.area_in2, TEE.r_x_in, TEE.r_y_in
    P_ex = math.pi**2 * E * A / (L_in / rx) ** 2
    P_ey = math.pi**2 * E * A / (L_in / ry) ** 2
    r_o2 = TEE.y_o_in**2 + rx**2 + ry**2
    P_ez = (math.pi**2 * E * TEE.C_w_in6 / L_in**2 + G * TEE.J_in4) / r_o2
    H = 1.0 - TEE.y_o_in**2 / r_o2
    P_e = (P_ey + P_ez) / (2 * H) * (1 - math.sqrt(1 - 4 * P_ey * P_ez * H / (P_ey + P_ez) ** 2))
    assert P_e < min(P_ex, P_ey)  # (the data: the tee buckles in flexure and torsion)
    c = run(TEE)
    chk = c.checks[0]
    assert chk.name == "compression: flexural-torsional buckling"
    assert chk.R_n_kip == pytest.approx(on_curve(A, P_e), rel=1e-9)
    assert "J = 0.13 in4" in chk.detail and "y_o = 1.41 in" in chk.detail
    assert c.torsional_unchecked == ""
    assert any("as tabulated on the Rolled sheet" in a for a in c.assumptions)


def test_a_loss_thins_every_wall():
    # 20 % of the thickness: J with the cube, C_w in proportion, the shear centre stays
    r = section_properties(TEE, member="M", findings=(Finding("M", "all", percent_loss=20.0),),
                           length_ft=12.0)
    least = min(r.compression, key=lambda s: s.A_g_in2)
    J, C_w, x_o, y_o = least.torsion_tabulated
    assert J == pytest.approx(0.13 * 0.8**3) and C_w == pytest.approx(0.13 * 0.8)
    assert (x_o, y_o) == (0.0, 1.41)
    assert least.A_g_in2 == pytest.approx(3.82 * 0.8)


def test_a_doubly_symmetric_shape_without_J_is_noted_not_flagged():
    shape = RolledShape("I 10 x 25 lb", 7.37, 4.07, 0.97, x_o_in=0.0, y_o_in=0.0)
    c = run(shape)
    assert c.torsional_unchecked == ""
    assert any("torsional buckling not checked" in a and "not given on the Rolled sheet" in a
               for a in c.assumptions)


def test_a_shape_of_unknown_symmetry_is_named_for_the_engineer():
    c = run(RolledShape("W8x31", 9.13, 3.47, 2.02))
    assert c.torsional_unchecked == UNKNOWN_SYMMETRY
    assert c.checks[0].name == "compression: flexural buckling"
    assert any("a rolled shape, not shown to be doubly symmetric, whose torsional" in a
               for a in c.assumptions)


@pytest.mark.parametrize("shape, needle", [
    (RolledShape("L", 3.75, 1.21, 1.21, r_z_in=1.3), "r_z 1.3 in exceeds r_x or r_y"),
    (RolledShape("T", 3.8, 1.7, 1.4, C_w_in6=0.1), "C_w given without J"),
    (RolledShape("T", 3.8, 1.7, 1.4, J_in4=0.1, x_o_in=0.0), "y_o (in) must be a number"),
    (RolledShape("T", 3.8, 1.7, 1.4, J_in4=-0.1, x_o_in=0.0, y_o_in=0.0),
     "J (in4) must be a positive number"),
])
def test_inconsistent_torsion_properties_are_refused(shape, needle):
    with pytest.raises(InputError, match="member M") as e:
        section_properties(shape, member="M", length_ft=10.0)
    assert needle in str(e.value)


def test_a_missing_rolled_member_is_not_flagged_for_torsion():
    # nothing left carries load: its resistance is zero, no torsional check is wanting
    c = run(TEE, (Finding("M", "all", bar_state=BarState.MISSING),))
    assert c.checks[0].R_n_kip == 0.0
    assert c.torsional_unchecked == ""
    assert not any("could not be checked" in a for a in c.assumptions)


def test_a_shape_off_both_axes_is_refused_without_r_z():
    # its x and y cannot be principal: rated on them an angle buckles too high
    with pytest.raises(InputError, match="without its least radius r_z"):
        section_properties(RolledShape("L", 3.75, 1.21, 1.21, J_in4=0.31, x_o_in=0.8,
                                       y_o_in=0.8), member="M", length_ft=8.0)


def test_a_singly_symmetric_shape_without_J_is_named_with_its_reason():
    c = run(RolledShape("C (test data)", 4.5, 3.9, 0.7, x_o_in=1.2, y_o_in=0.0))
    assert c.torsional_unchecked == "singly symmetric"
    assert any("a singly symmetric section whose torsional" in a
               and "J is not given on the Rolled sheet" in a for a in c.assumptions)


def test_an_unsymmetric_built_up_section_takes_its_article():
    from rating.model import AnglePart, BuiltUpSection, PlatePart

    apart = BuiltUpSection(parts=(PlatePart("p", 6.0, 0.5), AnglePart(
        "a", 3.0, 3.0, 0.375, x_in=5.0, y_in=4.0, x_sign=1, y_sign=1)))
    c = run(apart)
    assert c.torsional_unchecked == "unsymmetric"
    assert any("an unsymmetric section whose torsional" in a for a in c.assumptions)


def test_one_reason_is_said_once_for_every_location():
    c = run(ANGLE, (Finding("M", "all", station_ft=3.0, percent_loss=20.0),), L=8.0)
    (note,) = [a for a in c.assumptions if "not shown to be doubly symmetric" in a]
    assert note.count("x and y are not its principal axes") == 1


def test_the_note_gives_the_twisting_modes_load_not_a_flexural_one():
    # a rolled I (doubly symmetric) whose flexural buckling about y is far below its
    # torsional buckling: the note's "torsional" load is P_ez's, as Eq. 6.9.4.1.3-1 gives
    shape = RolledShape("I (test data)", 5.34, 3.26, 0.84, J_in4=0.17, C_w_in6=52.0,
                        x_o_in=0.0, y_o_in=0.0)
    c = run(shape, L=16.0)
    assert c.checks[0].name == "compression: flexural buckling"
    L_in = 16.0 * 12.0
    r_o2 = 3.26**2 + 0.84**2
    P_ez = (math.pi**2 * E * 52.0 / L_in**2 + G * 0.17) / r_o2  # kip (F_ez A)
    (note,) = [a for a in c.assumptions if "checked at each location" in a]
    assert f"least P_n = {on_curve(5.34, P_ez):.1f} kip (torsional)" in note
