"""Slender stiffened elements: effective width b_e and Q_a against hand calculations.

Sources: AISC 360-10 E7.2, Eq. E7-18 (b_e) and Eq. E7-16 (Q_a = A_eff/A_g), with f = F_cr of
the member at Q = 1.0 [value from memory]; the column curve written out from AISC 360-10
Eqs. E3-2/E3-3 and E7-2 (Q F_y in place of F_y) [value from memory].
"""

from __future__ import annotations

import math

import pytest
from capacity_helpers import FY, STEEL, E
from hypothesis import given, settings
from hypothesis import strategies as st

from rating.capacity.compression import (
    compression_checks,
    nominal_compressive_resistance,
    stiffened_effective_width,
    stiffened_Q_a,
    unstiffened_Q,
)
from rating.capacity.sections import section_properties
from rating.model import (
    BuiltUpSection,
    ChannelPart,
    ChannelToes,
    ConnectorKind,
    Connectors,
    PlatePart,
)

CHANNELS = (ChannelPart("C1", 10.0, 2.6, 0.38, 0.44, x_in=-4.0, toes=ChannelToes.LEFT),
            ChannelPart("C2", 10.0, 2.6, 0.38, 0.44, x_in=4.0, toes=ChannelToes.RIGHT))
SOLID = Connectors(ConnectorKind.SOLID)


def aisc_Fcr(KL_r: float, QF_y: float, E: float) -> float:
    """AISC 360-10 Eqs. E7-2/E7-3 (E3-2/E3-3 with Q = 1), written out here. [value from memory]"""
    Fe = math.pi**2 * E / KL_r**2
    if KL_r <= 4.71 * math.sqrt(E / QF_y):
        return 0.658 ** (QF_y / Fe) * QF_y
    return 0.877 * Fe


def run(section: BuiltUpSection, L: float = 24.0):
    r = section_properties(section, member="M", length_ft=L)
    return r, compression_checks(r, STEEL, K=0.875, length_ft=L, connectors=section.connectors)


def test_effective_width_and_Q_a_of_one_plate_hand_calculation():
    # AISC 360-10 Eq. E7-18 [value from memory], b = 20 in, t = 0.25 in, f = 22 ksi:
    # sqrt(E/f) = sqrt(29000/22) = 36.3068; b/t = 80 >= 1.49 x 36.3068 = 54.10 (reduces);
    # b_e = 1.92 x 0.25 x 36.3068 x (1 - 0.34/80 x 36.3068) = 17.4273 x 0.845696 = 14.738 in
    assert stiffened_effective_width(20.0, 0.25, 22.0, E) == pytest.approx(14.738, abs=1e-3)
    # Eq. E7-16: A_g = 16.5 in2, A_eff = 16.5 - (20 - 14.738) x 0.25 = 15.1845; Q_a = 0.92027
    assert stiffened_Q_a(16.5, [20.0], [0.25], 22.0, E) == pytest.approx(0.92027, abs=1e-5)
    # b/t = 40 < 54.10: E7-18 does not apply, b_e = b, Q_a = 1
    assert stiffened_effective_width(10.0, 0.25, 22.0, E) == 10.0
    assert stiffened_Q_a(16.5, [10.0], [0.25], 22.0, E) == 1.0


def test_slender_cover_plate_reduces_the_built_up_member():
    # a closed box (cover plates on both sides: its torsional buckling does not govern, so
    # the flexural check is the one under test)
    section = BuiltUpSection(parts=CHANNELS + (PlatePart("cover", 20.0, 0.25, y_in=5.125),
                                               PlatePart("bottom", 20.0, 0.25, y_in=-5.125)),
                             connectors=SOLID)
    r, c = run(section)
    s = r.compression[0]
    KL_r = 0.875 * 288.0 / min(s.r_x_in, s.r_y_in)  # solid member: no modified slenderness
    assert c.KL_r == pytest.approx(KL_r)
    # hand: f = F_cr(Q = 1) (AISC 360-10 E7.2); cover b/t = 20/0.25 = 80 > 1.40 sqrt(E/F_y)
    # = 46.8; b_e by Eq. E7-18; Q_a = A_eff/A_g (Eq. E7-16); channel flanges 2.6/0.44 = 5.9
    # and webs 9.12/0.38 = 24.0 are nonslender, so Q_s = 1 and Q = Q_a
    f = aisc_Fcr(KL_r, FY, E)
    root = math.sqrt(E / f)
    b_e = min(1.92 * 0.25 * root * (1 - 0.34 / 80.0 * root), 20.0)
    Q = (s.A_g_in2 - 2 * (20.0 - b_e) * 0.25) / s.A_g_in2
    assert c.Q == pytest.approx(Q, rel=1e-12)
    (chk,) = c.checks
    assert chk.name == "compression: flexural buckling"
    # P_n = F_cr(Q) A_g, AISC 360-10 E7-2 form; KL/r ~ 65.5 is far from the curve's transition
    assert chk.R_n_kip == pytest.approx(aisc_Fcr(KL_r, Q * FY, E) * s.A_g_in2, rel=1e-9)
    # lower than the same member without the reduction (Q = 1), AASHTO LRFD 6.9.4.1.1
    assert chk.R_n_kip < nominal_compressive_resistance(s.A_g_in2, FY, E, KL_r) * 0.99
    assert f"Q = Q_s Q_a = 1.000 x {Q:.3f} = {Q:.3f}" in chk.detail
    w = [w for w in c.warnings if "slender stiffened" in w]
    assert len(w) == 1 and f"b_e = {b_e:.2f} in of 20 in" in w[0] and f"Q_a = A_eff/A_g = {Q:.3f}" \
        in w[0] and "Eq. E7-18" in w[0] and "not computed" not in w[0]


@pytest.mark.parametrize("flange_t", [0.44, 0.12])
def test_no_slender_stiffened_element_leaves_the_resistance_unchanged(flange_t):
    # a 0.75 in cover: b/t = 26.7 < 46.8; flanges 0.44 (Q_s = 1) or 0.12 (b/t 21.7: Q_s < 1 by
    # AISC 360-10 Eq. E7-5 / LRFD 6.9.4.2.2 [value from memory]): P_n uses Q_s alone
    parts = (ChannelPart("C1", 10.0, 2.6, 0.38, flange_t, x_in=-4.0, toes=ChannelToes.LEFT),
             ChannelPart("C2", 10.0, 2.6, 0.38, flange_t, x_in=4.0, toes=ChannelToes.RIGHT),
             PlatePart("cover", 20.0, 0.75, y_in=5.375),
             PlatePart("bottom", 20.0, 0.75, y_in=-5.375))  # a closed box (as above)
    r, c = run(BuiltUpSection(parts=parts, connectors=SOLID))
    Q_s = float(unstiffened_Q(2.6 / flange_t, FY, E))
    assert c.Q == Q_s
    assert c.checks[0].R_n_kip == nominal_compressive_resistance(
        r.compression[0].A_g_in2, FY, E, c.KL_r, Q_s)
    assert f"Q = {Q_s:.3f}, F_y" in c.checks[0].detail
    assert not any("slender stiffened" in w for w in c.warnings)


@settings(max_examples=200, deadline=None)
@given(lam=st.floats(5.0, 300.0), grow=st.floats(0.0, 100.0), t=st.floats(0.1, 1.5),
       f=st.floats(0.5, 50.0), other=st.floats(0.0, 50.0))
def test_Q_a_in_0_1_and_non_increasing_with_b_t(lam, grow, t, f, other):
    # Eq. E7-18 [value from memory]: b_e/b = 1.92 x (1 - 0.34 x), x = sqrt(E/f)/(b/t) <= 1/1.49,
    # rises with x, so b_e/b falls as b/t grows; Q_a = A_eff/A_g (Eq. E7-16) with other
    # nonslender area beside the plate
    def Q_a(b_t: float) -> float:
        b = b_t * t
        return stiffened_Q_a(b * t + other, [b], [t], f, E)

    q1, q2 = Q_a(lam), Q_a(lam + grow)
    assert 0.0 < q1 <= 1.0 and 0.0 < q2 <= 1.0
    assert q2 <= q1 * (1 + 1e-12)
