"""A rolled shape's least radius and torsion properties on the Rolled sheet: read (US and SI),
and refused at their cells where one lacks what it needs. Invented test data (the small
bridge of inventory_helpers: section PV is a rolled I)."""

from __future__ import annotations

from pathlib import Path

import pytest
from inventory_helpers import cell, check, find, fresh

from rating.model import RolledShape
from rating.units import IN_PER_MM


def _rolled(**given) -> dict:
    d = fresh()
    d["tables"]["Rolled"][0].update(given)
    return d


def test_the_torsion_properties_are_read(tmp_path: Path) -> None:
    r = check(tmp_path, _rolled(J=0.17, C_w=52.0, x_o=0.0, y_o=0.0))
    assert r.errors == ()
    s = r.bridge.design_of("L2U2").section
    assert isinstance(s, RolledShape)
    assert (s.J_in4, s.C_w_in6, s.x_o_in, s.y_o_in, s.r_z_in) == (0.17, 52.0, 0.0, 0.0, None)
    assert s.symmetry == "doubly symmetric"


def test_a_blank_warping_constant_is_zero_with_J_and_said(tmp_path: Path) -> None:
    # a tee or an angle: C_w small, 0 conservative (it only adds to the torsional stiffness)
    from rating.capacity.sections import section_properties

    r = check(tmp_path, _rolled(J=0.17, x_o=0.0, y_o=0.8))
    assert r.errors == ()
    s = r.bridge.design_of("L2U2").section
    assert s.C_w_in6 is None and s.symmetry == "singly symmetric"
    rep = section_properties(s, member="L2U2", length_ft=18.0)
    assert rep.compression[0].torsion_tabulated == (0.17, 0.0, 0.0, 0.8)
    assert any("C_w not given; taken as 0" in a for a in rep.assumptions)


def test_si_values_are_converted(tmp_path: Path) -> None:
    d = _rolled(r_z=20.0, J=70000.0, C_w=8.5e8, x_o=0.0, y_o=10.0)
    d["bridge"]["units"] = "SI"
    d["tables"]["Rolled"][0].update(area=3445.0, r_x=82.8, r_y=21.3)
    d["tables"]["Vehicles"][0]["gross"] = None  # (its kip would be read as kN)
    r = check(tmp_path, d)
    assert r.errors == ()
    s = r.bridge.design_of("L2U2").section
    assert s.r_z_in == pytest.approx(20.0 * IN_PER_MM)
    assert s.J_in4 == pytest.approx(70000.0 * IN_PER_MM**4)
    assert s.C_w_in6 == pytest.approx(8.5e8 * IN_PER_MM**6)
    assert s.y_o_in == pytest.approx(10.0 * IN_PER_MM)


def test_a_least_radius_above_the_others_is_refused(tmp_path: Path) -> None:
    r = check(tmp_path, _rolled(r_z=1.0))  # r_y is 0.84
    find(r, cell("Rolled", 0, "r_z"), "the least radius of gyration r_z of section PV (1 in) "
         "exceeds the lesser of r_x and r_y (0.84 in)")


def test_a_warping_constant_without_J_is_refused(tmp_path: Path) -> None:
    r = check(tmp_path, _rolled(C_w=52.0))
    find(r, cell("Rolled", 0, "C_w"), "gives the warping constant C_w without the torsional "
         "constant J")


def test_J_without_the_shear_centre_is_refused(tmp_path: Path) -> None:
    r = check(tmp_path, _rolled(J=0.17, x_o=0.0))
    find(r, cell("Rolled", 0, "y_o"), "gives J but not the shear centre's distance y_o")


def test_a_bad_cell_is_said_once(tmp_path: Path) -> None:
    # a refused x_o is not said missing too, and the section's own check does not say it
    # again at the section id (a reviewer counted three errors for one bad cell)
    for given, key in (({"J": 0.17, "x_o": -0.5, "y_o": 0.0}, "x_o"),
                       ({"J": "a lot", "C_w": 40.0}, "J"),
                       ({"C_w": 40.0}, "C_w"),
                       ({"r_z": 1.0}, "r_z"),
                       ({"net_area": 9.0}, "net_area")):
        r = check(tmp_path, _rolled(**given))
        errors = [p.where for p in r.errors]
        assert errors == [cell("Rolled", 0, key)], (given, [p.format() for p in r.errors])


def test_a_J_no_section_could_have_is_refused(tmp_path: Path) -> None:
    # J cannot exceed the polar moment A (r_x^2 + r_y^2) = 5.34 (3.26^2 + 0.84^2) = 60.5 in4
    r = check(tmp_path, _rolled(J=499.0, x_o=0.0, y_o=0.0))
    find(r, cell("Rolled", 0, "J"), "exceeds its polar moment of inertia A (r_x^2 + r_y^2) = "
         "60.52 in4")


def test_torsion_properties_beside_r_z_are_said_unused(tmp_path: Path) -> None:
    r = check(tmp_path, _rolled(r_z=0.8, J=0.17, x_o=0.0, y_o=0.0))
    assert r.errors == ()
    find(r, cell("Rolled", 0, "J"), "its J, C_w and shear centre are not used",
         severity="warning")


def test_a_shape_off_both_axes_needs_r_z(tmp_path: Path) -> None:
    # an angle's shear centre (its heel) is off both geometric axes, which are then not
    # principal: rated on them it would buckle 37 % too high (a reviewer's L 4 x 4 x 1/2)
    r = check(tmp_path, _rolled(J=0.31, x_o=1.0, y_o=1.0))
    find(r, cell("Rolled", 0, "r_z"), "has its shear centre off both x and y")
    assert check(tmp_path, _rolled(r_z=0.8, J=0.31, x_o=1.0, y_o=1.0)).errors == ()


def test_the_least_radius_message_converts_in_si(tmp_path: Path) -> None:
    # each number with its own unit, so that an SI workbook reads it in mm
    d = _rolled(r_z=40.0)
    d["bridge"]["units"] = "SI"
    d["tables"]["Rolled"][0].update(area=3445.0, r_x=82.8, r_y=21.3)
    d["tables"]["Vehicles"][0]["gross"] = None
    r = check(tmp_path, d)
    find(r, cell("Rolled", 0, "r_z"), "(40 mm) exceeds the lesser of r_x and r_y (21.3 mm)")


def test_a_single_angle_needs_r_z(tmp_path: Path) -> None:
    # a reviewer's L 4 x 4 x 1/2 with r_x = r_y alone rated 2.4 times its resistance about r_z
    r = check(tmp_path, _rolled(designation="L 4 x 4 x 1/2", area=3.75, r_x=1.21, r_y=1.21))
    find(r, cell("Rolled", 0, "r_z"), "is an angle ('L 4 x 4 x 1/2'): give its least radius")
    ok = check(tmp_path, _rolled(designation="L 4 x 4 x 1/2", area=3.75, r_x=1.21, r_y=1.21,
                                 r_z=0.776), name="ok.xlsx")
    assert ok.errors == ()
    # two angles back to back are symmetric about their axes: nothing asked
    two = check(tmp_path, _rolled(designation="2L 4 x 4 x 1/2", area=7.5, r_x=1.21, r_y=1.8),
                name="two.xlsx")
    assert not [p for p in two.errors if p.where == cell("Rolled", 0, "r_z")]
