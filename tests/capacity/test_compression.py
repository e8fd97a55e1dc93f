"""Compression: the LRFD curve against AISC 360-16 E3, hand values, K, built-up members, Q.

AISC 360-16 E3 (Eqs. E3-2 to E3-4) is the same column curve with phi = 0.90 [V, form];
AASHTO LRFD 6.9.4.1.1 uses phi_c = 0.95 [value from memory].
"""

from __future__ import annotations

import math

import pytest

from rating.capacity.compression import (
    compression_checks,
    effective_length_factor,
    modified_slenderness,
    nominal_compressive_resistance,
    unstiffened_Q,
    width_thickness_limit,
)
from rating.capacity.sections import section_properties
from rating.model import (
    BuiltUpSection,
    ChannelPart,
    ChannelToes,
    ConnectorKind,
    Connectors,
    EyebarSet,
    Finding,
    Material,
    MaterialKind,
    MemberRole,
    PlatePart,
    RodSet,
    RolledShape,
)

E, FY, AG = 29000.0, 36.0, 10.0


def aisc_360_16_e3_Fcr(KL_r: float, F_y: float, E: float) -> float:
    """AISC 360-16 Eqs. E3-2 to E3-4, written out here independently. [V, form]"""
    Fe = math.pi**2 * E / KL_r**2
    if KL_r <= 4.71 * math.sqrt(E / F_y):
        return 0.658 ** (F_y / Fe) * F_y
    return 0.877 * Fe


@pytest.mark.parametrize("KL_r", [10.0, 25.0, 50.0, 80.0, 100.0, 120.0, 150.0, 200.0, 250.0])
def test_curve_matches_aisc_360_16_e3(KL_r):
    # AISC 360-16 E3 [V]: phi_c P_n = 0.90 F_cr A_g; ours 0.95 P_n: ratio 0.95/0.90 exactly
    ours = 0.95 * nominal_compressive_resistance(AG, FY, E, KL_r)
    aisc = 0.90 * aisc_360_16_e3_Fcr(KL_r, FY, E) * AG
    assert ours / aisc == pytest.approx(0.95 / 0.90, rel=1e-12)


def test_curve_near_the_transition():
    # LRFD switches at P_e/P_o = 0.44 (P_o/P_e 2.273), AISC at 4.71 sqrt(E/F_y) (F_y/F_e 2.248):
    # in between the two branches differ by less than 0.2% (0.658^2.25 = 0.3900 vs
    # 0.877/2.25 = 0.3898) -- AISC 360-16 E3 [V] vs AASHTO LRFD 6.9.4.1.1 [value from memory]
    KL_r = 134.0  # F_y/F_e = 2.258, inside the band
    ours = nominal_compressive_resistance(AG, FY, E, KL_r)
    aisc = aisc_360_16_e3_Fcr(KL_r, FY, E) * AG
    assert ours == pytest.approx(aisc, rel=2e-3)


@pytest.mark.parametrize("KL_r, phi_Fcr", [
    # hand values, F_y 36 ksi, E 29000 ksi, phi_c 0.95 (AASHTO LRFD 6.9.4.1.1, value from memory):
    # 50: F_e = pi^2 29000/2500 = 114.49; 0.658^(36/114.49) 36 = 31.56; x 0.95 = 29.98 ksi
    (50.0, 29.98),
    # 100: F_e = 28.62; 36/28.62 = 1.2578; 0.658^1.2578 x 36 = 21.27; x 0.95 = 20.20 ksi
    (100.0, 20.20),
    # 150: F_e = 12.72; P_e/P_o = 0.353 < 0.44: 0.877 x 12.72 = 11.16; x 0.95 = 10.60 ksi
    (150.0, 10.60),
])
def test_hand_values_phi_095(KL_r, phi_Fcr):
    got = 0.95 * nominal_compressive_resistance(1.0, FY, E, KL_r)
    assert got == pytest.approx(phi_Fcr, abs=0.006)  # hand values rounded to 0.01 ksi


def test_vectorised_and_zero_length():
    v = nominal_compressive_resistance([10.0, 10.0, 0.0], FY, E, [0.0, 100.0, 50.0])
    assert v[0] == pytest.approx(360.0) and v[2] == 0.0


def test_effective_length_factors():
    # AASHTO LRFD 4.6.2.5 [value from memory]: pinned 0.875, riveted/bolted/welded 0.75
    assert effective_length_factor("pinned") == 0.875
    assert effective_length_factor("riveted") == 0.75
    with pytest.raises(ValueError):
        effective_length_factor("glued")


def test_modified_slenderness_chen():
    # Chen, Structural Engineering Handbook, Sec. 31.9 [V]: sqrt(60^2 + (24/0.8)^2) = 67.08
    assert modified_slenderness(60.0, 24.0, 0.8) == pytest.approx(math.sqrt(3600 + 900))


def test_unstiffened_Q_regions():
    # AASHTO LRFD 6.9.4.2.2 / AISC 360-10 E7-4..E7-6 [value from memory], F_y 36:
    # limits 0.56 sqrt(E/F_y) = 15.89, 1.03 sqrt(E/F_y) = 29.23
    assert unstiffened_Q(10.0, FY, E) == 1.0
    # b/t 20: 1.415 - 0.74 x 20 x sqrt(36/29000) = 0.8935
    assert unstiffened_Q(20.0, FY, E) == pytest.approx(0.8935, abs=1e-4)
    # b/t 40: 0.69 x 29000 / (36 x 1600) = 0.3474
    assert unstiffened_Q(40.0, FY, E) == pytest.approx(0.3474, abs=1e-4)
    assert width_thickness_limit(False, "flange", FY, E) == pytest.approx(15.894, abs=1e-3)


def test_legs_of_angles_standing_apart_take_the_single_angle_form():
    # The angles of a laced four-angle post stand apart: their legs are "other unstiffened
    # elements", k = 0.45 (AASHTO LRFD Table 6.9.4.2.1-1; AISC 360-10 E7.1(c), Eqs. E7-10 to
    # E7-12) [value from memory], not the flanges' 0.56. F_y 36, E 29,000:
    # limits 0.45 sqrt(E/F_y) = 12.772, 0.91 sqrt(E/F_y) = 25.828
    assert width_thickness_limit(False, "leg x", FY, E) == pytest.approx(12.772, abs=1e-3)
    assert unstiffened_Q(12.0, FY, E, leg=True) == 1.0
    # b/t 14 is within the flanges' limit but past the legs': 1.34 - 0.76 x 14 x
    # sqrt(36/29000) = 0.96512
    assert unstiffened_Q(14.0, FY, E) == 1.0
    assert unstiffened_Q(14.0, FY, E, leg=True) == pytest.approx(0.96512, abs=1e-4)
    # b/t 20: 1.34 - 0.76 x 20 x 0.035233 = 0.80446; b/t 30: 0.53 x 29000 / (36 x 900)
    # = 0.47438
    assert unstiffened_Q(20.0, FY, E, leg=True) == pytest.approx(0.80446, abs=1e-4)
    assert unstiffened_Q(30.0, FY, E, leg=True) == pytest.approx(0.47438, abs=1e-4)
    assert width_thickness_limit(True, "web", FY, E) == pytest.approx(1.49 * math.sqrt(E / FY))


STEEL = Material(MaterialKind.STEEL, F_y=26.0, F_u=52.0)
POST = BuiltUpSection(
    parts=(ChannelPart("C1", 10.0, 2.6, 0.38, 0.44, x_in=-4.0, toes=ChannelToes.LEFT),
           ChannelPart("C2", 10.0, 2.6, 0.38, 0.44, x_in=4.0, toes=ChannelToes.RIGHT)),
    connectors=Connectors(ConnectorKind.LACING, spacing_in=16.0))


def run(section, findings=(), *, K=0.875, L=24.0, role=MemberRole.VERTICAL, tension_only=False):
    r = section_properties(section, member="M", findings=findings, length_ft=L)
    conn = section.connectors if isinstance(section, BuiltUpSection) else None
    return compression_checks(r, STEEL, K=K, length_ft=L, role=role, tension_only=tension_only,
                              connectors=conn)


def test_builtup_post_modified_slenderness_governs_out_of_plane():
    c = run(POST)
    r = section_properties(POST, member="M").tension[0]
    klr_x = 0.875 * 288 / r.r_x_in
    klr_y = math.hypot(0.875 * 288 / r.r_y_in, 16.0 / r.r_i_in)  # Chen Sec. 31.9 [V]
    assert c.KL_r == pytest.approx(max(klr_x, klr_y))
    (chk,) = c.checks
    assert chk.R_n_kip == pytest.approx(nominal_compressive_resistance(
        r.A_g_in2, 26.0, 29000.0, c.KL_r))
    assert chk.phi == 0.95


def test_loss_reduces_area_and_r_and_governs():
    f = Finding("M", "all", station_ft=12.0, percent_loss=25, where="Findings!C5")
    c = run(POST, (f,))
    assert c.checks[0].finding is f
    assert c.checks[0].R_n_kip < run(POST).checks[0].R_n_kip


def test_tension_only_members_have_zero_compression():
    for s in (EyebarSet(2, 6, 1, 15, 5.03), RodSet(2, 1.25)):
        c = run(s)
        assert c.checks[0].R_n_kip == 0.0 and "tension-only" in c.checks[0].name
        assert any("carry no compression" in a for a in c.assumptions)
    c = run(POST, tension_only=True)
    assert c.checks[0].R_n_kip == 0.0


def test_slenderness_limits_are_warnings():
    # AASHTO LRFD 6.9.3 [value from memory]: 120 primary, 140 secondary
    long = run(POST, L=60.0)  # KL/r = 173
    assert long.KL_r > 140 and any("exceeds 120" in w for w in long.warnings)
    sec = run(POST, L=60.0, role=MemberRole.SUB_STRUT)
    assert any("exceeds 140" in w for w in sec.warnings)
    assert not any("exceeds" in w for w in run(POST, L=24.0).warnings)


def test_slender_flange_and_slender_plate_reduce_Q():
    thin = BuiltUpSection(parts=(
        ChannelPart("C1", 10.0, 4.0, 0.3, 0.12, x_in=-4.0, toes=ChannelToes.LEFT),
        ChannelPart("C2", 10.0, 4.0, 0.3, 0.12, x_in=4.0, toes=ChannelToes.RIGHT),
        PlatePart("cover", 20.0, 0.25, y_in=5.125)))
    c = run(thin, L=10.0)
    # flange b/t = 4/0.12 = 33.3, between 0.56 sqrt(E/F_y) = 18.7 and 1.03 sqrt(E/F_y) = 34.4
    # (F_y 26): Q_s = 1.415 - 0.74 (b/t) sqrt(F_y/E) (AISC 360-10 E7-5) [value from memory]
    q = 1.415 - 0.74 * (4.0 / 0.12) * math.sqrt(26.0 / 29000.0)
    # cover b/t = 80 > 1.40 sqrt(E/F_y) = 46.8: b_e by AISC 360-10 Eq. E7-18 with f = F_cr at
    # Q = 1 (AISC 360-16 E3 written out above), Q_a = A_eff/A_g (Eq. E7-16) [value from memory]
    f = aisc_360_16_e3_Fcr(c.KL_r, 26.0, 29000.0)
    s = math.sqrt(29000.0 / f)
    b_e = 1.92 * 0.25 * s * (1 - 0.34 / 80.0 * s)
    A_g = section_properties(thin, member="M").compression[0].A_g_in2
    q_a = 1 - (20.0 - b_e) * 0.25 / A_g
    assert c.Q == pytest.approx(q * q_a)
    assert any("Q_a = A_eff/A_g" in w and "cover plate b/t = 80.0 > 46.8" in w
               for w in c.warnings)
    assert f"Q = Q_s Q_a = {q:.3f} x {q_a:.3f}" in c.checks[0].detail


def test_rolled_shape_compression():
    s = RolledShape("W8x31", 9.13, 3.47, 2.02)
    c = run(s, L=20.0, K=1.0)
    assert c.KL_r == pytest.approx(240.0 / 2.02)
    assert any("nonslender" in a for a in c.assumptions)


def test_lacing_itself_is_not_rated_and_says_so():
    # the lacing bars are taken as sound (common practice); the assumption says so, for the
    # engineer to weigh against the inspection
    c = run(POST)
    assert any("lacing bars or plates and their rivets are not checked" in a
               for a in c.assumptions)
    solid = BuiltUpSection(parts=POST.parts, connectors=Connectors(ConnectorKind.SOLID))
    assert not any("lacing bars" in a for a in run(solid).assumptions)


def test_a_built_up_members_elements_take_their_own_form():
    from rating.capacity.compression import element_Q
    from rating.capacity.sections import ElementAtLocation

    leg = ElementAtLocation("A-1", "leg x", 14.0, 1.0, False)
    flange = ElementAtLocation("C-left", "flange", 14.0, 1.0, False)
    assert element_Q(leg, FY, E) == pytest.approx(0.96512, abs=1e-4)  # (above)
    assert element_Q(flange, FY, E) == 1.0
