"""Torsional and flexural-torsional buckling of built-up compression members.

Sources: AASHTO LRFD 6.9.4.1.3, Eqs. 6.9.4.1.3-1 (doubly symmetric), -2 (singly symmetric)
and -3 (unsymmetric, the cubic), with P_n from Eqs. 6.9.4.1.1-1 and -2 [value from memory],
written out here independently of rating.capacity.compression's eigenvalue form. The
section's J, C_w and shear centre are checked against sectionproperties in
tests/reference/test_sections_sectionproperties.py.
"""

from __future__ import annotations

import math
import re

import numpy as np
import pytest
from capacity_helpers import FY, LACED, SOLID, STEEL, E, chord
from hypothesis import given, settings
from hypothesis import strategies as st

from rating.capacity.compression import (
    G_OVER_E,
    TORSIONAL_NOTE,
    compression_checks,
    torsional_buckling_load,
)
from rating.capacity.sections import AreaProperties, section_properties
from rating.capacity.torsion import TorsionProperties, torsion_properties
from rating.model import PlatePart

G = G_OVER_E * E


def props(A=13.0, I_x=212.0, I_y=382.0, I_xy=0.0, J=0.78, C_w=4000.0, x_o=0.0,
          y_o=6.7) -> TorsionProperties:
    return TorsionProperties(AreaProperties(A, 0.0, 0.0, I_x, I_y, I_xy), J, x_o, y_o, C_w, 0)


def P_ez(tp: TorsionProperties, KL_z: float) -> float:
    return (math.pi**2 * E * tp.C_w_in6 / KL_z**2 + G * tp.J_in4) / tp.r_o_in**2


def eq_2(P_e: float, Pz: float, offset: float, r_o: float) -> float:
    """Eq. 6.9.4.1.3-2 written out: the lower root for a section whose shear centre lies
    ``offset`` from the centroid on its axis of symmetry, ``P_e`` the flexural load that
    couples with the twist. [value from memory]"""
    H = 1 - offset**2 / r_o**2
    return (P_e + Pz) / (2 * H) * (1 - math.sqrt(1 - 4 * P_e * Pz * H / (P_e + Pz) ** 2))


def test_a_singly_symmetric_section_by_eq_2():
    # symmetric about y (x_o = 0): Eq. 6.9.4.1.3-2 with P_ey
    tp = props()
    P_ex, P_ey, KL_z = 1700.0, 3000.0, 216.0
    Pz = P_ez(tp, KL_z)
    got, mode = torsional_buckling_load(tp, E, G, P_ex, P_ey, KL_z)
    assert got == pytest.approx(eq_2(P_ey, Pz, tp.y_o_in, tp.r_o_in), rel=1e-9)
    assert mode == "flexural-torsional"
    # symmetric about x (y_o = 0): the same form with P_ex
    tp = props(x_o=6.7, y_o=0.0)
    assert torsional_buckling_load(tp, E, G, P_ex, P_ey, KL_z)[0] == pytest.approx(
        eq_2(P_ex, Pz, tp.x_o_in, tp.r_o_in), rel=1e-9)


def test_a_doubly_symmetric_section_by_eq_1():
    # Eq. 6.9.4.1.3-1: P_e = (pi^2 E C_w / (K_z l)^2 + G J) A / (I_x + I_y); a flexural
    # mode below it is the flexural check's own, not the torsional mode's load
    tp = props(J=0.05, C_w=50.0, y_o=0.0)
    want = (math.pi**2 * E * 50.0 / 216.0**2 + G * 0.05) * 13.0 / (212.0 + 382.0)
    got, mode = torsional_buckling_load(tp, E, G, 5000.0, 6000.0, 216.0)
    assert got == pytest.approx(want, rel=1e-12) and mode == "torsional"
    assert torsional_buckling_load(tp, E, G, 10.0, 6000.0, 216.0)[0] == got


def test_a_flexural_mode_below_the_coupled_one_is_not_the_torsional_load():
    # symmetric about y (x_o = 0): flexure about x does not twist; with P_ex far below the
    # coupled root of Eq. 6.9.4.1.3-2 the torsional load is still that root (a reviewer saw
    # the flexural load named "flexural-torsional" in a note)
    tp = props()
    P_ex, P_ey, KL_z = 50.0, 3000.0, 216.0
    want = eq_2(P_ey, P_ez(tp, KL_z), tp.y_o_in, tp.r_o_in)
    assert want > P_ex
    got, mode = torsional_buckling_load(tp, E, G, P_ex, P_ey, KL_z)
    assert got == pytest.approx(want, rel=1e-9) and mode == "flexural-torsional"


@settings(max_examples=100, deadline=None)
@given(x_o=st.floats(0.1, 8.0), y_o=st.floats(0.1, 8.0), P_ex=st.floats(50.0, 5000.0),
       P_ey=st.floats(50.0, 5000.0), J=st.floats(0.01, 5.0), C_w=st.floats(0.0, 20000.0))
def test_an_unsymmetric_section_by_the_cubic(x_o, y_o, P_ex, P_ey, J, C_w):
    # Eq. 6.9.4.1.3-3: the least root of (P - P_ex)(P - P_ey)(P - P_ez)
    # - P^2 (P - P_ey)(x_o/r_o)^2 - P^2 (P - P_ex)(y_o/r_o)^2 = 0
    tp = props(J=J, C_w=C_w, x_o=x_o, y_o=y_o)
    Pz = P_ez(tp, 216.0)
    a, b = (x_o / tp.r_o_in) ** 2, (y_o / tp.r_o_in) ** 2
    cubic = np.polysub(np.polymul(np.polymul([1, -P_ex], [1, -P_ey]), [1, -Pz]),
                       np.polyadd(np.polymul([a, 0, 0], [1, -P_ey]),
                                  np.polymul([b, 0, 0], [1, -P_ex])))
    roots = np.roots(cubic)
    least = min(r.real for r in roots if abs(r.imag) < 1e-6 * abs(r) and r.real > 0)
    got = torsional_buckling_load(tp, E, G, P_ex, P_ey, 216.0)[0]
    assert got == pytest.approx(least, rel=1e-7)
    assert got <= min(P_ex, P_ey, Pz) * (1 + 1e-9)  # coupling only lowers it


@settings(max_examples=100, deadline=None)
@given(I_1=st.floats(20.0, 800.0), I_2=st.floats(20.0, 800.0), theta=st.floats(0.0, math.pi),
       u=st.floats(-6.0, 6.0), v=st.floats(-6.0, 6.0), J=st.floats(0.01, 5.0),
       C_w=st.floats(0.0, 20000.0))
def test_axes_that_are_not_principal_give_the_same_load(I_1, I_2, theta, u, v, J, C_w):
    """With one effective length for both axes, the buckling load of a section does not
    depend on the axes it is written in: the same section with I_xy (axes turned by theta)
    gives the principal axes' cubic root."""
    A, KL = 13.0, 200.0

    def euler(I: float) -> float:
        return math.pi**2 * E * I / KL**2

    principal = props(A=A, I_x=I_1, I_y=I_2, J=J, C_w=C_w, x_o=u, y_o=v)
    want = torsional_buckling_load(principal, E, G, euler(I_1), euler(I_2), KL)[0]
    c, s = math.cos(theta), math.sin(theta)
    I_x = I_1 * c * c + I_2 * s * s
    I_y = I_1 * s * s + I_2 * c * c
    I_xy = (I_2 - I_1) * s * c  # of y' = ... turned axes: integral of x y dA
    x_o, y_o = u * c - v * s, u * s + v * c
    turned = props(A=A, I_x=I_x, I_y=I_y, I_xy=I_xy, J=J, C_w=C_w, x_o=x_o, y_o=y_o)
    got = torsional_buckling_load(turned, E, G, euler(I_x), euler(I_y), KL)[0]
    assert got == pytest.approx(want, rel=1e-7)




def run(section, L: float = 18.0):
    r = section_properties(section, member="M", length_ft=L)
    return r, compression_checks(r, STEEL, K=0.875, length_ft=L,
                                 connectors=section.connectors)


def test_an_open_chord_without_lacing_buckles_in_flexure_and_torsion():
    """Two channels and a cover plate with nothing across the open face (a solid member:
    no lacing or battens): the open section's flexural-torsional buckling governs, by hand
    from Eq. 6.9.4.1.3-2 and Eqs. 6.9.4.1.1-1/-2."""
    section = chord(SOLID)
    r, c = run(section)
    s = r.compression[0]
    tp = torsion_properties(s.torsion_rects)
    KL = 0.875 * 18.0 * 12.0
    P_ex = math.pi**2 * E * s.A_g_in2 / (KL / s.r_x_in) ** 2
    P_ey = math.pi**2 * E * s.A_g_in2 / (KL / s.r_y_in) ** 2
    assert abs(tp.x_o_in) < 1e-6 and tp.y_o_in > 5.0
    P_e = eq_2(P_ey, P_ez(tp, 18.0 * 12.0), tp.y_o_in, tp.r_o_in)  # K_z = 1.0 over the panel
    P_o = FY * s.A_g_in2
    P_n = 0.658 ** (P_o / P_e) * P_o if P_o / P_e <= 2.25 else 0.877 * P_e
    (chk,) = c.checks
    assert chk.name == "compression: flexural-torsional buckling"
    assert chk.R_n_kip == pytest.approx(P_n, rel=1e-9)
    assert "6.9.4.1.3" in chk.provision and f"J = {tp.J_in4:.4g} in4" in chk.detail
    # the flexural resistance it replaces is said beside it, and is higher
    flexural = 0.658 ** (P_o / min(P_ex, P_ey)) * P_o
    assert f"flexural buckling alone P_n = {flexural:.1f} kip" in chk.detail
    assert P_n < 0.8 * flexural
    assert c.torsional_unchecked == ""
    assert any(a.startswith("member M: torsional and flexural-torsional buckling (AASHTO")
               for a in c.assumptions)
    assert TORSIONAL_NOTE in c.assumptions


def test_a_laced_chord_is_taken_as_closed_and_its_open_form_said():
    """The same chord with lacing across its open face: the rating takes the lacing as
    closing the section (flexural buckling governs), and a warning gives the open section's
    lower resistance for the engineer's judgement of the lacing."""
    laced, solid = chord(LACED), chord(SOLID)
    _, c = run(laced)
    (chk,) = c.checks
    assert chk.name == "compression: flexural buckling"
    assert c.torsional_unchecked == "laced"
    (w,) = [w for w in c.warnings if "closing the section" in w]
    assert "the engineer judges the lacing" in w and "component 'lacing'" in w
    # the numbers in the member's note (the warning reads the same for every member)
    (a,) = [a for a in c.assumptions if "with the lacing closing the section" in a]
    assert f"flexural buckling P_n = {chk.R_n_kip:.1f} kip" in a
    open_P_n = float(re.search(r"least P_n = ([0-9.]+) kip \(flexural-torsional\)", a)[1])
    assert f"{100 * (1 - open_P_n / chk.R_n_kip):.0f} % lower" in a
    # open, with the lacing's modified slenderness apart, it is the solid member's value
    solid_P_n = run(solid)[1].checks[0].R_n_kip
    assert open_P_n == pytest.approx(solid_P_n, rel=0.05) and open_P_n < chk.R_n_kip


def test_a_section_whose_parts_do_not_touch_is_named_for_the_engineer():
    # the cover plate drawn 1/2 in above the flanges: no single section to analyse
    apart = chord(SOLID, PlatePart("cover", 14.0, 0.3125, y_in=5.65625))
    _, c = run(apart)
    assert c.checks[0].name == "compression: flexural buckling"
    assert c.torsional_unchecked == "singly symmetric"
    (said,) = [a for a in c.assumptions if a.startswith("member M: a singly symmetric")]
    assert "could not be checked at whole member: the parts do not make one" in said
    assert "the engineer should check them by hand" in said


def test_two_laced_channels_say_nothing_of_torsion():
    # doubly symmetric, joined by lacing alone: nothing to check, nothing to say
    _, c = run(chord(LACED, None))
    assert c.torsional_unchecked == ""
    assert not [a for a in c.assumptions if "6.9.4.1.3" in a and a.startswith("member M")]
    assert not [w for w in c.warnings if "6.9.4.1.3" in w]


def test_a_chord_without_its_cover_plate_is_two_laced_channels():
    """A cover plate recorded loose is out of the section for the whole member: what is rated
    is two laced channels, doubly symmetric, with nothing to say of torsion."""
    from rating.model import BarState, Finding

    laced = chord(LACED)
    r = section_properties(laced, member="M", length_ft=18.0,
                           findings=(Finding("M", "cover", bar_state=BarState.LOOSE),))
    c = compression_checks(r, STEEL, K=0.875, length_ft=18.0, connectors=laced.connectors)
    assert r.compression[0].properties.symmetry() == "doubly symmetric"
    assert c.torsional_unchecked == ""
    assert not [a for a in c.assumptions if "6.9.4.1.3" in a and a.startswith("member M")]


def test_lacing_recorded_out_of_action_leaves_the_chord_open():
    """A lacing bar recorded missing (component 'lacing' on the Findings sheet): the chord is
    rated as the open section it then is (its flexural-torsional buckling governs, as for the
    solid member) with twice the connector spacing in its modified slenderness; nothing is
    said of the lacing closing it."""
    from rating.model import BarState, Finding

    laced = chord(LACED)
    out = Finding("M", "lacing", station_ft=6.0, bar_state=BarState.MISSING,
                  where="Findings!B9")
    r = section_properties(laced, member="M", length_ft=18.0, findings=(out,))
    assert r.connectors_defective == (out,)
    assert any("its lacing is recorded missing (Findings!B9)" in w for w in r.warnings)
    c = compression_checks(r, STEEL, K=0.875, length_ft=18.0, connectors=laced.connectors)
    (chk,) = c.checks
    assert chk.name == "compression: flexural-torsional buckling"
    assert c.torsional_unchecked == ""
    assert not [w for w in c.warnings if "the rating takes the lacing as closing" in w]
    assert any("a = 30 in" in a for a in c.assumptions)
    # sound lacing: closed, flexural buckling, higher
    _, sound = run(laced)
    assert sound.checks[0].name == "compression: flexural buckling"
    assert chk.R_n_kip < sound.checks[0].R_n_kip


@pytest.mark.parametrize("own_weight_klf", [0.0, 0.05, 0.2])
@pytest.mark.parametrize("length_ft", [12.0, 18.0, 30.0])
def test_the_open_resistance_is_at_least_the_closed_one_times_the_open_ratio(
        own_weight_klf, length_ft):
    """The lacing screen of rating.lrfr.engine takes the closed resistance times the ratio of
    the plain buckling resistances as the open one's least: own-weight bending (AASHTO LRFD
    6.9.2.2 [value from memory]) lowers a weaker member's axial limit less, not more."""
    from rating.capacity.member import member_capacity
    from rating.model import MemberDesign, MemberRole

    design = MemberDesign("M", chord(LACED), STEEL)
    args = (design, MemberRole.TOP_CHORD, length_ft, (), False)
    closed = member_capacity(*args, own_weight_klf=own_weight_klf)
    opened = member_capacity(*args, own_weight_klf=own_weight_klf, connectors_close=False)
    assert closed.open_section == "laced" and 0.0 < closed.open_ratio < 1.0
    plain = {c.name: c.R_n_kip for c in opened.checks if c.name.startswith("compression: f")}
    assert closed.open_ratio == pytest.approx(
        plain["compression: flexural-torsional buckling"]
        / next(c.R_n_kip for c in closed.checks if c.name == "compression: flexural buckling"),
        rel=1e-12)
    assert opened.factored_resistance("compression") >= \
        closed.factored_resistance("compression") * closed.open_ratio * (1 - 1e-12)


def test_a_battened_chord_is_treated_as_a_laced_one_in_its_own_words():
    from rating.model import BarState, ConnectorKind, Connectors, Finding

    battened = chord(Connectors(ConnectorKind.BATTEN, spacing_in=30.0))
    _, c = run(battened)
    assert c.torsional_unchecked == "battened" and c.checks[0].name.endswith("flexural buckling")
    (w,) = [w for w in c.warnings if "closing the section" in w]
    assert "the rating takes the battens as closing the section" in w
    assert "which carry the shear" in w and "bent battens leave it open" in w
    bent = Finding("M", "battens", bar_state=BarState.BENT, where="Findings!B7")
    r = section_properties(battened, member="M", length_ft=18.0, findings=(bent,))
    assert any("its battens are recorded bent (Findings!B7): they are taken as no longer "
               "closing the section" in x for x in r.warnings)
    c = compression_checks(r, STEEL, K=0.875, length_ft=18.0, connectors=battened.connectors)
    assert c.checks[0].name == "compression: flexural-torsional buckling"
