"""Pins: packing statics (closed forms and an anaStruct beam model), the LRFD interaction,
the EN 1993-1-8 Table 3.10 cross-check, the load multiplier, and bad input.

Loading method: Berg, Safe Building, "Rivets, Riveting and Pins", Parts 10-15 [V] -- each
bar's force at its mid-thickness, components taken separately and combined.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from rating.capacity.pins import (
    MemberAction,
    en_bearing_resistance,
    en_interaction,
    en_moment_resistance,
    en_shear_resistance,
    lrfd_bearing_nominal,
    lrfd_flexure_shear,
    pin_actions,
    pin_check,
    pin_load_multiplier,
)
from rating.errors import InputError
from rating.model import (
    EyebarSet,
    Joint,
    Material,
    MaterialKind,
    Member,
    MemberDesign,
    MemberRole,
    PackingItem,
    Pin,
    Support,
    SupportKind,
    TrussGeometry,
)

PIN_STEEL = Material(MaterialKind.STEEL, F_y=30.0, F_u=60.0)


def clevis(a: float, b: float, c: float, D: float = 4.0) -> Pin:
    """Outer plates ``a`` (member A, both sides), inner plate ``b`` (member B), gaps ``c``."""
    return Pin("L2", D, (PackingItem("A", a), PackingItem("B", b, c), PackingItem("A", a, c)),
               PIN_STEEL, where="Pins!A4")


def test_clevis_against_en_1993_1_8_closed_form():
    # EN 1993-1-8 3.13.2, Table 3.10 [V]: M_Ed = F_Ed (b + 4c + 2a)/8 for the inner plate's
    # load spread over its thickness. Berg's loading puts it at mid-thickness, which adds
    # F b / 8 (closed form): M = F/2 (a/2 + c + b/2) = F (2a + 4c + 2b)/8.
    a, b, c, F = 1.0, 2.0, 0.25, 100.0
    r = pin_check(clevis(a, b, c), [MemberAction("A", F, (-1.0, 0.0)),
                                    MemberAction("B", F, (1.0, 0.0))])
    en_form = F * (b + 4 * c + 2 * a) / 8.0
    assert r.M_u_kip_in == pytest.approx(en_form + F * b / 8.0)
    assert r.governing.z_in == pytest.approx(a + c + b / 2)  # at the middle plate
    assert r.V_u_kip == pytest.approx(F / 2)
    assert r.residual_force_kip == pytest.approx((0.0, 0.0))
    assert not r.warnings


def test_two_level_symmetric_closed_form_and_vector_sum():
    # outer pair of member O pulls left with P, inner pair of member I pulls right with P,
    # at half-distances e_o = 3 and e_i = 1 from the centre: between the inner plates
    # M = P/2 (e_o - e_i) (closed form). A vertical pair on the same plates adds its own
    # moment square to it; the combined moment is their vector sum (Berg, Part 12).
    P, Q = 80.0, 60.0
    pk = (PackingItem("O", 1.0), PackingItem("I", 1.0, 1.0), PackingItem("I", 1.0, 0.0),
          PackingItem("O", 1.0, 1.0))
    # mids at 0.5, 2.5, 3.5, 5.5: centre 3.0, e_o = 2.5, e_i = 0.5
    pin = Pin("U3", 5.0, pk, PIN_STEEL)
    horiz = pin_check(pin, [MemberAction("O", P, (-1, 0)), MemberAction("I", P, (1, 0))])
    assert horiz.M_u_kip_in == pytest.approx(P / 2 * (2.5 - 0.5))
    both = pin_check(pin, [MemberAction("O", math.hypot(P, Q), (-P, Q)),
                           MemberAction("I", math.hypot(P, Q), (P, -Q))])
    mid = [s for s in both.sections if abs(s.z_in - 2.5) < 1e-9][0]
    assert mid.M_h_kip_in == pytest.approx(-P / 2 * 2.0)
    assert mid.M_v_kip_in == pytest.approx(Q / 2 * 2.0)
    assert mid.M_kip_in == pytest.approx(math.hypot(P, Q) / 2 * 2.0)


def balanced_unsymmetric():
    """Five members on an unsymmetric packing; D and E solved so forces AND moments balance."""
    t = [1.25, 0.75, 1.0, 1.5, 0.875, 1.0, 0.625]
    members = ["A", "B", "A", "C", "D", "E", "B"]
    gaps = [0.0, 0.125, 0.25, 0.0, 0.5, 0.125, 0.0]
    pk = tuple(PackingItem(m, tt, g) for m, tt, g in zip(members, t, gaps, strict=True))
    z, z0 = [], 0.0
    for tt, g in zip(t, gaps, strict=True):
        z0 += g
        z.append(z0 + tt / 2)
        z0 += tt
    z = np.array(z)
    given_F = {"A": np.array([-120.0, 35.0]), "B": np.array([70.0, -90.0]),
               "C": np.array([30.0, 110.0])}
    # plate forces of A, B, C shared by thickness
    Fp = np.zeros((len(t), 2))
    for m, F in given_F.items():
        idx = [i for i, x in enumerate(members) if x == m]
        w = np.array([t[i] for i in idx])
        Fp[idx] = (w / w.sum())[:, None] * F[None, :]
    iD, iE = members.index("D"), members.index("E")
    # sum F = 0 and sum F z = 0 per component: [1 1; zD zE] [FD FE]^T = -[sum F; sum F z]
    A = np.array([[1.0, 1.0], [z[iD], z[iE]]])
    rhs = -np.array([Fp.sum(axis=0), (Fp * z[:, None]).sum(axis=0)])
    sol = np.linalg.solve(A, rhs)
    forces = dict(given_F, D=sol[0], E=sol[1])
    actions = [MemberAction(m, float(np.linalg.norm(F)), tuple(F / np.linalg.norm(F)))
               for m, F in forces.items()]
    Fp[iD], Fp[iE] = sol[0], sol[1]
    return Pin("L4", 6.0, pk, PIN_STEEL), actions, z, Fp


def anastruct_moments(z: np.ndarray, F: np.ndarray) -> np.ndarray:
    """|M| at each load point of the pin as a beam in anaStruct [independent FE library].

    Supports at the first and last load points; every other load applied; the reactions
    must then equal the two omitted loads (equilibrium).
    """
    from anastruct import SystemElements

    ss = SystemElements(EI=1e6, EA=1e9)
    for k in range(len(z) - 1):
        ss.add_element([[z[k], 0.0], [z[k + 1], 0.0]])
    ss.add_support_hinged(1)
    ss.add_support_roll(len(z), direction="x")
    for k in range(1, len(z) - 1):
        ss.point_load(k + 1, Fy=float(F[k]))
    ss.solve()
    r1 = ss.get_node_results_system(1)["Fy"]
    rn = ss.get_node_results_system(len(z))["Fy"]
    assert abs(abs(r1) - abs(F[0])) < 1e-6 * np.abs(F).sum()
    assert abs(abs(rn) - abs(F[-1])) < 1e-6 * np.abs(F).sum()
    M = [0.0] + [abs(float(ss.get_element_results(k + 1, verbose=True)["M"][-1]))
                 for k in range(len(z) - 1)]
    return np.array(M)


def test_unsymmetric_packing_against_anastruct_beam():
    anastruct = pytest.importorskip("anastruct")  # noqa: F841
    pin, actions, z, Fp = balanced_unsymmetric()
    r = pin_check(pin, actions)
    assert not r.warnings  # balanced in force and moment
    Mh = anastruct_moments(z, Fp[:, 0])
    Mv = anastruct_moments(z, Fp[:, 1])
    secs = sorted(r.sections, key=lambda s: s.z_in)
    ours_h = np.abs([s.M_h_kip_in for s in secs])
    ours_v = np.abs([s.M_v_kip_in for s in secs])
    scale = np.abs(Fp).sum() * (z[-1] - z[0])
    assert np.allclose(ours_h, Mh, atol=1e-6 * scale)
    assert np.allclose(ours_v, Mv, atol=1e-6 * scale)
    assert np.allclose([s.M_kip_in for s in secs], np.hypot(Mh, Mv), atol=1e-6 * scale)


def test_interaction_lrfd_and_en_values():
    D, Fy, Fu = 4.0, 30.0, 60.0
    # AASHTO LRFD 6.7.6.2.1-1 [value from memory]: 6 x 200/(64 x 30) + (2.2 x 60/(16 x 30))^3
    # = 0.625 + 0.275^3 = 0.6458
    assert lrfd_flexure_shear(200.0, 60.0, D, Fy) == pytest.approx(0.625 + 0.275**3)
    # LRFD 6.7.6.2.2 [value from memory]: 1.5 t D F_y = 1.5 x 1.25 x 4 x 30 = 225
    assert lrfd_bearing_nominal(1.25, D, Fy) == pytest.approx(225.0)
    # EN 1993-1-8 Table 3.10 [V], gamma_M0 1.00, gamma_M2 1.25 [value from memory]:
    # M_Rd = 1.5 (pi 64/32) 30 = 282.74; F_v,Rd = 0.6 (pi 16/4) 60/1.25 = 361.91;
    # F_b,Rd = 1.5 x 1.25 x 4 x 30 = 225
    M_Rd, Fv = en_moment_resistance(D, Fy), en_shear_resistance(D, Fu)
    assert M_Rd == pytest.approx(282.743, abs=1e-3)
    assert Fv == pytest.approx(361.911, abs=1e-3)
    assert en_bearing_resistance(1.25, D, Fy) == pytest.approx(225.0)
    assert en_interaction(200.0, 60.0, M_Rd, Fv) == pytest.approx(
        (200 / 282.743) ** 2 + (60 / 361.911) ** 2, rel=1e-5)


def test_result_carries_both_forms_and_utilization():
    r = pin_check(clevis(1.0, 2.0, 0.25), [MemberAction("A", 300.0, (-1, 0)),
                                           MemberAction("B", 300.0, (1, 0))])
    g = r.governing
    assert r.flexure_shear == pytest.approx(lrfd_flexure_shear(g.M_kip_in, g.V_kip, 4.0, 30.0))
    assert r.utilization_flexure_shear == pytest.approx(r.flexure_shear / 0.95)
    # bearing: outer plate 150 kip on 1.5 x 1 x 4 x 30 = 180
    assert r.utilization_bearing == pytest.approx(150.0 / 180.0)
    assert r.utilization == max(r.utilization_flexure_shear, r.utilization_bearing)
    assert r.en.interaction == pytest.approx(en_interaction(
        g.M_kip_in, g.V_kip, r.en.M_Rd_kip_in, r.en.F_v_Rd_kip))
    assert any("cross-check only" in a for a in r.assumptions)


def test_floorbeam_load_at_its_plates_or_mid_length():
    # hanger H pulls up with R; the floorbeam hangs R down from the pin
    R = 50.0
    pk = (PackingItem("H", 1.0), PackingItem("floorbeam", 0.75, 0.5), PackingItem("H", 1.0, 0.5))
    pin = Pin("L1", 3.5, pk, PIN_STEEL)
    r = pin_check(pin, [MemberAction("H", R, (0, 1))], external_kip=(0.0, -R))
    fb = r.plates[1]
    assert fb.F_v_kip == pytest.approx(-R) and r.residual_force_kip == pytest.approx((0, 0))
    # closed form: M = R/2 (0.5 + 0.5 + 0.375) at the middle
    assert r.M_u_kip_in == pytest.approx(R / 2 * 1.375)
    nofb = Pin("L1", 3.5, (PackingItem("H", 1.0), PackingItem("H", 1.0, 1.75)), PIN_STEEL)
    r2 = pin_check(nofb, [MemberAction("H", R, (0, 1))], external_kip=(0.0, -R))
    assert r2.M_u_kip_in == pytest.approx(R / 2 * 1.375)
    assert any("mid-length" in a for a in r2.assumptions)


def test_out_of_balance_is_warned():
    r = pin_check(clevis(1.0, 2.0, 0.25), [MemberAction("A", 100.0, (-1, 0)),
                                           MemberAction("B", 90.0, (1, 0))])
    assert any("do not balance" in w for w in r.warnings)


def test_load_multiplier_reaches_the_limit():
    pin = clevis(1.0, 2.0, 0.25)
    base = [MemberAction("A", 40.0, (-1, 0)), MemberAction("B", 40.0, (1, 0))]
    live = [MemberAction("A", 100.0, (-1, 0)), MemberAction("B", 100.0, (1, 0))]
    lam = pin_load_multiplier(pin, base, live)
    at = [MemberAction(a.member, a.force_kip + lam * b.force_kip, a.direction)
          for a, b in zip(base, live, strict=True)]
    assert pin_check(pin, at).utilization == pytest.approx(1.0, abs=1e-9)
    assert pin_load_multiplier(pin, base, [MemberAction("A", 0, (-1, 0)),
                                           MemberAction("B", 0, (1, 0))]) == math.inf


@settings(max_examples=40, deadline=None)
@given(st.floats(0.1, 10.0), st.floats(-500.0, 500.0), st.floats(-500.0, 500.0))
def test_moments_scale_with_load(lam, fx, fy):
    # statics is linear: forces x lam gives moments and shears x lam (closed form)
    pin, actions, _, _ = balanced_unsymmetric()
    r1 = pin_check(pin, actions, external_kip=None)
    scaled = [MemberAction(a.member, a.force_kip * lam, a.direction) for a in actions]
    r2 = pin_check(pin, scaled)
    assert r2.M_u_kip_in == pytest.approx(lam * r1.M_u_kip_in, rel=1e-9)
    # an external load with no floorbeam item acts at mid-length and is out of balance
    r3 = pin_check(pin, actions, external_kip=(fx, fy))
    assert r3.M_u_kip_in >= 0.0
    scale = np.abs([(p.F_h_kip, p.F_v_kip) for p in r3.plates]).sum() + abs(fx) + abs(fy)
    if math.hypot(fx, fy) > 1.01e-3 * scale + 0.01:  # the tolerance of the balance check
        assert any("do not balance" in w for w in r3.warnings)


def truss_joint():
    js = (Joint("L0", 0, 0), Joint("L1", 20, 0), Joint("L2", 40, 0), Joint("U1", 20, 20))
    ms = (Member("L0L1", "L0", "L1", MemberRole.BOTTOM_CHORD),
          Member("L1L2", "L1", "L2", MemberRole.BOTTOM_CHORD),
          Member("L0U1", "L0", "U1", MemberRole.END_POST),
          Member("U1L2", "U1", "L2", MemberRole.END_POST),
          Member("L1U1", "L1", "U1", MemberRole.HANGER))
    return TrussGeometry(js, ms, (Support("L0", SupportKind.PIN),
                                  Support("L2", SupportKind.ROLLER)), ("L0", "L1", "L2"))


def test_pin_actions_from_geometry():
    g = truss_joint()
    acts = pin_actions(g, "L1", {"L0L1": 10.0, "L1L2": 10.0, "L1U1": 5.0})
    d = {a.member: a.direction for a in acts}
    assert d["L0L1"] == pytest.approx((-1, 0)) and d["L1U1"] == pytest.approx((0, 1))
    with pytest.raises(InputError, match="does not meet at this joint"):
        pin_actions(g, "L1", {"L0L1": 1.0, "L1L2": 1.0, "L1U1": 1.0, "L0U1": 1.0})
    with pytest.raises(InputError, match="no force given"):
        pin_actions(g, "L1", {"L0L1": 1.0})


def test_bad_pins_name_the_joint_and_cell():
    acts = [MemberAction("A", 10.0, (-1, 0)), MemberAction("B", 10.0, (1, 0))]
    bad_member = Pin("L2", 4.0, (PackingItem("A", 1.0), PackingItem("X", 2.0),
                                 PackingItem("A", 1.0)), PIN_STEEL, where="Pins!A4")
    with pytest.raises(InputError) as ei:
        pin_check(bad_member, acts)
    assert ei.value.where == "Pins!A4"
    assert "names member 'X', which does not meet at this joint" in str(ei.value)
    missing = Pin("L2", 4.0, (PackingItem("A", 1.0), PackingItem("A", 1.0)), PIN_STEEL)
    with pytest.raises(InputError, match="have no plate in the packing"):
        pin_check(missing, acts)
    neg = Pin("L2", 4.0, (PackingItem("A", -1.0), PackingItem("B", 1.0)), PIN_STEEL)
    with pytest.raises(InputError, match="positive number"):
        pin_check(neg, acts)
    with pytest.raises(InputError, match="diameter"):
        pin_check(Pin("L2", 0.0, (PackingItem("A", 1.0), PackingItem("B", 1.0))), acts)


def test_pin_and_hole_fit():
    acts = [MemberAction("A", 10.0, (-1, 0)), MemberAction("B", 10.0, (1, 0))]
    designs = {"A": MemberDesign("A", EyebarSet(2, 4.0, 1.0, 11.0, 4.03), PIN_STEEL),
               "B": MemberDesign("B", EyebarSet(1, 4.0, 2.0, 11.0, 4.03), PIN_STEEL)}
    ok = pin_check(clevis(1.0, 2.0, 0.25, D=4.0), acts, designs=designs)
    assert not any("1/32" in w for w in ok.warnings)
    with pytest.raises(InputError, match="larger than the pin hole of member A"):
        pin_check(clevis(1.0, 2.0, 0.25, D=4.5), acts, designs=designs)
    with pytest.raises(InputError, match="smaller than the pin hole of member A"):
        pin_check(clevis(1.0, 2.0, 0.25, D=3.0), acts, designs=designs)  # (1.03 in: data)
    worn = pin_check(clevis(1.0, 2.0, 0.25, D=3.9), acts, designs=designs)
    assert any("1/32" in w for w in worn.warnings)  # AISC LRFD 1999 D3.2 [V]
    assert not any(w.startswith("PIN WORN") for w in worn.warnings)
    # a pin worn 0.53 in under its hole is rated, with a warning that bears on the decision
    # (a worn pin is an inspection finding; it was refused as a data error)
    far = pin_check(clevis(1.0, 2.0, 0.25, D=3.5), acts, designs=designs)
    (said,) = [w for w in far.warnings if w.startswith("PIN WORN: pin at joint")]
    assert "holes of members A, B (4.03 in) by up to 0.530 in" in said  # (once for the pin)
    assert "the engineer should inspect it" in said
    weak = {k: MemberDesign(k, v.section, Material(MaterialKind.WROUGHT_IRON, 24.0, 48.0))
            for k, v in designs.items()}
    r = pin_check(clevis(1.0, 2.0, 0.25, D=4.0), acts, designs=weak)
    # bearing on the lower of plate and pin F_y: 1.5 x 1 x 4 x 24 = 144
    assert r.plates[0].bearing_resistance_kip == pytest.approx(144.0)


def test_pin_without_material_uses_default_and_says_so():
    pin = Pin("L2", 4.0, (PackingItem("A", 1.0), PackingItem("B", 1.0)))
    r = pin_check(pin, [MemberAction("A", 1.0, (-1, 0)), MemberAction("B", 1.0, (1, 0))])
    assert r.F_y == 26.0 and any("pin material not recorded" in a for a in r.assumptions)


def test_multiplier_found_when_the_limit_lies_just_inside_lam_max():
    # regression: a crossing between the last doubling step and lam_max must not be missed
    from rating.capacity.pins import MemberAction, pin_check, pin_load_multiplier
    from rating.model import Material, MaterialKind, PackingItem, Pin

    pin = Pin("J", 4.0, (PackingItem("A", 1.0), PackingItem("B", 1.0), PackingItem("A", 1.0)),
                material=Material(MaterialKind.STEEL, 36.0, 58.0))
    base = [MemberAction("A", 0.0, (1.0, 0.0)), MemberAction("B", 0.0, (-1.0, 0.0))]
    added = [MemberAction("A", 50.0, (1.0, 0.0)), MemberAction("B", 50.0, (-1.0, 0.0))]
    lam = pin_load_multiplier(pin, base, added)
    assert math.isfinite(lam)
    assert pin_load_multiplier(pin, base, added, lam_max=lam * 1.05) == pytest.approx(lam)
    assert math.isinf(pin_load_multiplier(pin, base, added, lam_max=lam * 0.95))
    at = [MemberAction(a.member, lam * a.force_kip, a.direction) for a in added]
    assert pin_check(pin, at).utilization == pytest.approx(1.0, rel=1e-6)


def test_a_chord_spliced_through_the_joint_brings_only_its_resultant():
    # chord members C1 (to the left) and C2 (to the right) in compression of 100 and 120
    # kip, their plates alternating on the pin, with a hanger H pulling up 20 kip and the
    # floorbeam's 20 kip down at mid-pin. Butted on the pin, each plate brings its member's
    # force; spliced through the joint, the chord's plates bring only the resultant, 20 kip
    # toward the right shared by thickness (statics), so the pin's moment is that of a
    # pin carrying the 20 kip alone on those plates
    pk = (PackingItem("C1", 0.75), PackingItem("C2", 0.75), PackingItem("H", 1.0),
          PackingItem("C2", 0.75), PackingItem("C1", 0.75))
    acts = [MemberAction("C1", -100.0, (-1, 0)), MemberAction("C2", -120.0, (1, 0)),
            MemberAction("H", 20.0, (0, 1))]
    butted = pin_check(Pin("U2", 4.0, pk, PIN_STEEL), acts, external_kip=(20.0, -20.0))
    spliced = pin_check(Pin("U2", 4.0, pk, PIN_STEEL, spliced_chord=("C1", "C2")), acts,
                        external_kip=(20.0, -20.0))
    assert spliced.M_u_kip_in < butted.M_u_kip_in
    assert any("spliced through the joint" in a for a in spliced.assumptions)
    # the chord's plates: a quarter each of the resultant (equal thickness), 100 - 120 =
    # -20 kip along x from the members' pull on the pin (N u: C1 pushes +100 x, C2 -120 x)
    chord = [p for p in spliced.plates if p.member in ("C1", "C2")]
    assert all(p.F_h_kip == pytest.approx(-20.0 / 4.0) for p in chord)
    assert all(p.F_v_kip == pytest.approx(0.0) for p in chord)
    assert spliced.residual_force_kip == pytest.approx((0.0, 0.0))
