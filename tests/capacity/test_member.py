"""member_capacity: the entry point, properties (loss, removed bars, SI round trip), bad input.

Property tests (hypothesis): more section loss never increases a resistance; a removed bar
never increases it; the same member given in SI and converted through rating.units has the
same resistance. Worked example values follow the provisions cited in rating.capacity.
"""

from __future__ import annotations

import math

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from rating.capacity.checks import Sense
from rating.capacity.member import member_capacity
from rating.capacity.sections import gross_area_as_built_in2
from rating.errors import InputError
from rating.model import (
    BarState,
    BuiltUpSection,
    ChannelPart,
    ChannelToes,
    ConnectorKind,
    Connectors,
    EyebarSet,
    Finding,
    FindingRegion,
    Material,
    MaterialKind,
    MemberDesign,
    MemberRole,
    PlatePart,
    RodEnd,
    RodSet,
)
from rating.units import from_core, to_core

STEEL = Material(MaterialKind.STEEL, F_y=26.0, F_u=52.0)
L = 24.0


def test_eyebar_chord_worked_example():
    design = MemberDesign("L2L3", EyebarSet(4, 6.0, 1.0, 15.0, 5.03), STEEL, where="Members!B8")
    fs = (Finding("L2L3", "bar 4", bar_state=BarState.LOOSE, where="Findings!A2"),
          Finding("L2L3", "bar 1", FindingRegion.BODY, station_ft=10.0,
                  remaining_thickness_in=0.75, condition_rating=5, where="Findings!A3"))
    mc = member_capacity(design, MemberRole.BOTTOM_CHORD, L, fs, True)
    g = mc.governing("tension")
    # bars 2, 3 full and bar 1 at 0.75 in at 10 ft: F_y A = 26 x 6 x (1 + 1 + 0.75) = 429
    assert g.name == "eyebar body yielding" and g.R_n_kip == pytest.approx(429.0)
    assert g.finding.where == "Findings!A3" and g.location.station_ft == 10.0
    # condition 5 -> fair 0.95; three bars left -> multiple eyebar 0.90; 0.855 >= 0.85
    assert (mc.phi_c, mc.phi_s) == (0.95, 0.90)
    assert mc.factored_resistance("tension") == pytest.approx(0.855 * 0.95 * 429.0)
    assert mc.factored_resistance(Sense.COMPRESSION) == 0.0
    assert mc.removed == ("bar 4",)
    assert mc.summary.A_g_in2 == pytest.approx(16.5) and mc.summary.A_g_as_built_in2 == 24.0
    assert any("bar 4 is loose" in w for w in mc.warnings)


def test_builtup_post_k_override_and_floor():
    post = BuiltUpSection(
        parts=(ChannelPart("C1", 10.0, 2.6, 0.38, 0.44, x_in=-4.0, toes=ChannelToes.LEFT),
               ChannelPart("C2", 10.0, 2.6, 0.38, 0.44, x_in=4.0, toes=ChannelToes.RIGHT)),
        connectors=Connectors(ConnectorKind.LACING, spacing_in=16.0))
    a = member_capacity(MemberDesign("U1L1", post, STEEL), MemberRole.VERTICAL, L, (), False)
    b = member_capacity(MemberDesign("U1L1", post, STEEL, K=0.75), MemberRole.VERTICAL, L, (),
                        False)
    assert a.summary.K == 0.875 and b.summary.K == 0.75
    # an end post's K is said to hold out of plane too, where the portal (not checked) holds it
    end = member_capacity(MemberDesign("L0U1", post, STEEL), MemberRole.END_POST, L, (), False)
    assert any("portal bracing, which is not checked here" in a_ for a_ in end.assumptions)
    assert not any("portal" in a_ for a_ in a.assumptions)
    assert b.factored_resistance("compression") > a.factored_resistance("compression")
    poor = member_capacity(MemberDesign("U1L1", post, STEEL), MemberRole.VERTICAL, L,
                           (Finding("U1L1", condition_rating=3),), False)
    assert poor.phi_cs == 0.85  # 0.85 x 0.90 = 0.765 raised to 0.85 (Khan 2010, p. 187)
    g = poor.governing("compression")
    assert poor.factored_resistance("compression") == pytest.approx(0.85 * g.phi_R_n_kip)


@pytest.mark.parametrize("kwargs, needle, where", [
    (dict(length_ft=-3.0), "length", "Members!B9"),
    (dict(K=0.0), "effective length factor", "Members!B9"),
    (dict(material=Material(MaterialKind.STEEL, -26.0, 52.0)), "F_y", "Members!B9"),
])
def test_bad_member_input(kwargs, needle, where):
    length = kwargs.pop("length_ft", L)
    d = MemberDesign("U1U2", EyebarSet(2, 6, 1, 15, 5.03), kwargs.pop("material", STEEL),
                     where="Members!B9", **kwargs)
    with pytest.raises(InputError) as ei:
        member_capacity(d, MemberRole.TOP_CHORD, length, (), True)
    assert ei.value.where == where and "member U1U2" in str(ei.value) and needle in str(ei.value)


def test_finding_errors_reach_the_caller_with_the_cell():
    d = MemberDesign("U1U2", EyebarSet(2, 6, 1, 15, 5.03), STEEL)
    f = Finding("U1U2", "bar 1", percent_loss=140.0, where="Findings!F6")
    with pytest.raises(InputError) as ei:
        member_capacity(d, MemberRole.TOP_CHORD, L, (f,), True)
    assert ei.value.where == "Findings!F6" and "member U1U2" in str(ei.value)


# ------------------------------------------------------------------------- properties


@st.composite
def sections(draw):
    kind = draw(st.sampled_from(["eyebar", "rod", "built-up"]))
    if kind == "eyebar":
        t = draw(st.floats(0.5, 2.0))
        w = draw(st.floats(3.0, 8.0 * t))
        hole = draw(st.floats(2.0, 7.0))
        head = hole + draw(st.floats(1.2, 3.0)) * w
        return EyebarSet(draw(st.integers(1, 4)), w, t, head, hole)
    if kind == "rod":
        d = draw(st.floats(0.75, 2.5))
        end = draw(st.sampled_from(list(RodEnd)))
        root = d * draw(st.floats(0.75, 0.95)) if end is RodEnd.THREADED else None
        return RodSet(draw(st.integers(1, 4)), d, end, root_diameter_in=root)
    d = draw(st.floats(6.0, 15.0))
    bf = draw(st.floats(2.0, 4.0))
    tw = draw(st.floats(0.25, 0.6))
    tf = draw(st.floats(0.3, 0.7))
    xs = draw(st.floats(2.0, 8.0))
    parts = [ChannelPart("C1", d, bf, tw, tf, x_in=-xs, toes=ChannelToes.LEFT),
             ChannelPart("C2", d, bf, tw, tf, x_in=xs, toes=ChannelToes.RIGHT)]
    if draw(st.booleans()):
        parts.append(PlatePart("cover", 2 * (xs + bf), draw(st.floats(0.3, 0.75)),
                               y_in=d / 2 + 0.5))
    conn = Connectors(ConnectorKind.LACING, spacing_in=draw(st.floats(8.0, 30.0)))
    holes = draw(st.integers(0, 4))
    return BuiltUpSection(tuple(parts), conn, hole_diameter_in=0.875 if holes else 0.0,
                          holes_per_section=holes)


def components(section):
    if isinstance(section, BuiltUpSection):
        return [p.label for p in section.parts] + ["all"]
    return [f"bar {i}" for i in range(1, section.count + 1)] + ["all"]


def regions(section):
    if isinstance(section, EyebarSet):
        return [FindingRegion.BODY, FindingRegion.HEAD]
    if isinstance(section, RodSet):
        return [FindingRegion.BODY, FindingRegion.THREAD]
    return [FindingRegion.BODY, FindingRegion.CONNECTION]


@st.composite
def findings_for(draw, section, n_max=3):
    out = []
    for _ in range(draw(st.integers(0, n_max))):
        out.append(Finding(
            "M", draw(st.sampled_from(components(section))),
            draw(st.sampled_from(regions(section))),
            station_ft=draw(st.one_of(st.none(), st.sampled_from([0.0, 6.0, 12.0, L]))),
            percent_loss=draw(st.floats(0.0, 80.0))))
    return tuple(out)


def capacities(section, findings, tension_only=None):
    t_only = isinstance(section, EyebarSet | RodSet) if tension_only is None else tension_only
    mc = member_capacity(MemberDesign("M", section, STEEL), MemberRole.DIAGONAL, L, findings,
                         t_only)
    return mc.factored_resistance("tension"), mc.factored_resistance("compression")


def not_more(a: float, b: float) -> bool:
    return b <= a * (1 + 1e-9) + 1e-9


@settings(max_examples=60, deadline=None)
@given(st.data())
def test_more_loss_never_increases_a_resistance(data):
    s = data.draw(sections())
    fs = data.draw(findings_for(s))
    base_t, base_c = capacities(s, fs)
    # deepen one recorded loss, or add a new one
    extra = data.draw(st.floats(0.5, 19.0))
    if fs and data.draw(st.booleans()):
        k = data.draw(st.integers(0, len(fs) - 1))
        f = fs[k]
        worse = Finding(f.member, f.component, f.region, f.station_ft,
                        percent_loss=min(f.percent_loss + extra, 99.0))
        fs2 = fs[:k] + (worse,) + fs[k + 1:]
    else:
        fs2 = fs + data.draw(findings_for(s, n_max=1)) + (
            Finding("M", "all", percent_loss=extra),)
    t2, c2 = capacities(s, fs2)
    assert not_more(base_t, t2)
    assert not_more(base_c, c2)


@settings(max_examples=40, deadline=None)
@given(st.data())
def test_a_removed_bar_never_increases_a_resistance(data):
    s = data.draw(sections())
    fs = data.draw(findings_for(s))
    comp = data.draw(st.sampled_from(components(s)))
    state = data.draw(st.sampled_from([BarState.LOOSE, BarState.MISSING, BarState.BROKEN,
                                       BarState.CRACKED]))
    t1, c1 = capacities(s, fs)
    t2, c2 = capacities(s, fs + (Finding("M", comp, bar_state=state),))
    assert not_more(t1, t2)
    assert not_more(c1, c2)


def si_round_trip(x: float, unit: str) -> float:
    """A core value written in SI and read back through rating.units (NIST SP 811 factors)."""
    si = {"in": "mm", "ksi": "MPa", "ft": "m"}[unit]
    return to_core(from_core(x, si), si)


@settings(max_examples=40, deadline=None)
@given(st.data())
def test_si_and_us_give_the_same_resistance(data):
    s = data.draw(sections())
    if isinstance(s, EyebarSet):
        si = EyebarSet(s.count, *(si_round_trip(v, "in") for v in
                                  (s.width_in, s.thickness_in, s.head_diameter_in,
                                   s.pin_hole_diameter_in)))
    elif isinstance(s, RodSet):
        si = RodSet(s.count, si_round_trip(s.diameter_in, "in"), s.end, s.shape,
                    None if s.root_diameter_in is None
                    else si_round_trip(s.root_diameter_in, "in"))
    else:
        parts = []
        for p in s.parts:
            if isinstance(p, ChannelPart):
                parts.append(ChannelPart(p.label, *(si_round_trip(v, "in") for v in (
                    p.depth_in, p.flange_width_in, p.web_thickness_in, p.flange_thickness_in,
                    p.x_in, p.y_in)), toes=p.toes))
            else:
                parts.append(PlatePart(p.label, *(si_round_trip(v, "in") for v in (
                    p.width_in, p.thickness_in, p.x_in, p.y_in))))
        c = s.connectors
        si = BuiltUpSection(tuple(parts), Connectors(c.kind, si_round_trip(c.spacing_in, "in")),
                            si_round_trip(s.hole_diameter_in, "in"), s.holes_per_section)
    mat_si = Material(STEEL.kind, si_round_trip(STEEL.F_y, "ksi"),
                      si_round_trip(STEEL.F_u, "ksi"), si_round_trip(STEEL.E, "ksi"))
    t_only = isinstance(s, EyebarSet | RodSet)
    us = member_capacity(MemberDesign("M", s, STEEL), MemberRole.DIAGONAL, L, (), t_only)
    metric = member_capacity(MemberDesign("M", si, mat_si), MemberRole.DIAGONAL,
                             si_round_trip(L, "ft"), (), t_only)
    for sense in ("tension", "compression"):
        a, b = us.factored_resistance(sense), metric.factored_resistance(sense)
        assert b == pytest.approx(a, rel=1e-9, abs=1e-9)
        # the resistance reported in kN reads back to the same kip
        assert to_core(from_core(b, "kN"), "kN") == pytest.approx(a, rel=1e-9, abs=1e-9)


@settings(max_examples=30, deadline=None)
@given(st.data())
def test_every_check_is_cited_and_located(data):
    s = data.draw(sections())
    fs = data.draw(findings_for(s))
    mc = member_capacity(MemberDesign("M", s, STEEL), MemberRole.DIAGONAL, L, fs,
                         isinstance(s, EyebarSet | RodSet))
    for c in mc.checks:
        assert c.provision and c.R_n_kip >= 0.0 and math.isfinite(c.R_n_kip)
        assert c.location.finding is None or c.location.finding in fs
    assert mc.factored_resistance("tension") >= 0.0


def test_a_corroded_slender_part_never_weakens_the_member():
    # regression (found by the property test above): a channel at 58 % loss has slender
    # flanges whose Q would lower the whole section below the section without that channel;
    # a part cannot weaken the member, so the section without it governs, and says so
    s = BuiltUpSection(
        parts=(ChannelPart("C1", 6.0, 4.0, 0.5, 0.3046875, x_in=-2.0, toes=ChannelToes.LEFT),
               ChannelPart("C2", 6.0, 4.0, 0.5, 0.3046875, x_in=2.0, toes=ChannelToes.RIGHT),
               PlatePart("cover", 12.0, 0.5, x_in=0.0, y_in=3.5)),
        connectors=Connectors(ConnectorKind.LACING, spacing_in=8.0))
    corroded = (Finding("M", "C2", percent_loss=58.0),)
    _, c_corroded = capacities(s, corroded)
    _, c_without = capacities(s, corroded + (Finding("M", "C2", bar_state=BarState.LOOSE),))
    assert c_without <= c_corroded * (1 + 1e-9)
    mc = member_capacity(MemberDesign("M", s, STEEL), MemberRole.DIAGONAL, L, corroded, False)
    assert any("C2 taken as not carrying compression" in a for a in mc.assumptions)


def test_as_built_gross_area_in_the_summary():
    # the summary takes a built-up member's as-built area from its as-built build: the same
    # sum of rectangle areas as gross_area_as_built_in2 (self-weight), to the bit
    s = BuiltUpSection(parts=(PlatePart("Cover", 14.0, 0.375, y_in=5.2),
                              ChannelPart("C1", 10.0, 2.6, 0.38, 0.44, x_in=-4.0,
                                          toes=ChannelToes.LEFT),
                              ChannelPart("C2", 10.0, 2.6, 0.38, 0.44, x_in=4.0)))
    fs = (Finding("M", "C1", percent_loss=30), Finding("M", "C2", bar_state=BarState.LOOSE))
    cap = member_capacity(MemberDesign("M", s, STEEL), MemberRole.TOP_CHORD, L, fs, False)
    assert cap.summary.A_g_as_built_in2 == gross_area_as_built_in2(s)


def test_a_chord_bending_under_its_own_weight_hand_check():
    """A laced chord (two 10 in channels and a 14 x 1/2 in cover) 24 ft long carrying 60 lb/ft
    across it: M_u = 1.25 x 0.06 x 24^2 / 8 = 5.4 kip-ft (statics); P_r = phi_c phi_s phi_c
    P_n of the buckling check, M_r = phi_c phi_s F_y S_x; the axial limit is the lesser root of
    the quadratic of AASHTO LRFD Eq. 6.9.2.2-2 with delta_b = 1 / (1 - P/P_e) (4.5.3.2.2b,
    C_m = 1, phi_K = 1) [value from memory]; in tension P_r (1 - 8/9 M_u / M_r) (Eq.
    6.8.2.3-2)."""
    from rating.capacity.own_weight import OWN_WEIGHT_CHECKS
    from rating.capacity.sections import section_properties

    chord = BuiltUpSection(
        parts=(ChannelPart("C1", 10.0, 2.6, 0.38, 0.44, x_in=-4.0, toes=ChannelToes.LEFT),
               ChannelPart("C2", 10.0, 2.6, 0.38, 0.44, x_in=4.0, toes=ChannelToes.RIGHT),
               PlatePart("cover", 14.0, 0.5, y_in=5.25)),
        connectors=Connectors(ConnectorKind.LACING, spacing_in=16.0))
    design = MemberDesign("U1U2", chord, STEEL)
    plain = member_capacity(design, MemberRole.TOP_CHORD, L, (), False)
    mc = member_capacity(design, MemberRole.TOP_CHORD, L, (), False, own_weight_klf=0.06)
    p = section_properties(chord, member="U1U2").compression[0].properties
    phi_cs = mc.phi_cs
    buck = plain.governing("compression")
    P_r = phi_cs * buck.phi_R_n_kip
    M_u = 1.25 * 0.06 * L**2 / 8 * 12
    M_r = phi_cs * 1.0 * STEEL.F_y * p.S_x_in3
    P_e = math.pi**2 * STEEL.E * p.I_x_in4 / (0.875 * L * 12) ** 2
    m = M_u / M_r
    b = P_e + P_r
    P_star = (b - math.sqrt(b * b - 4 * P_r * P_e * (1 - 8 * m / 9))) / 2
    assert P_star / P_r >= 0.2
    g = mc.governing("compression")
    assert g.name == OWN_WEIGHT_CHECKS[0]
    assert mc.factored_resistance("compression") == pytest.approx(P_star, rel=1e-9)
    assert "M_u = 64.8 kip-in" in g.detail and "6.9.2.2" in g.provision
    # the interaction worked at the answer, so a checker need not solve it
    assert "P/P_r + 8/9 x delta_b x M_u/M_r = " in g.detail and " = 1.000 (" in g.detail
    t = mc.governing("tension")
    assert t.name == OWN_WEIGHT_CHECKS[1]
    base = min(c.phi_R_n_kip for c in plain.checks_in("tension")) * phi_cs
    assert mc.factored_resistance("tension") == pytest.approx(base * (1 - 8 / 9 * m),
                                                              rel=1e-9)
    assert any("under their own weight" in a for a in mc.assumptions)
    assert "w = 60 plf across the member" in g.detail
    # nothing across it (a vertical), or bars that cannot bend it: no such check
    assert [c.name for c in plain.checks] == [
        c.name for c in mc.checks if c.name not in OWN_WEIGHT_CHECKS]
    bars = member_capacity(MemberDesign("L1L2", EyebarSet(2, 4.0, 1.0, 9.0, 4.0), STEEL),
                           MemberRole.BOTTOM_CHORD, L, (), True, own_weight_klf=0.05)
    assert not any(c.name in OWN_WEIGHT_CHECKS for c in bars.checks)


def _laced_chord(angles: bool = False) -> BuiltUpSection:
    from rating.model import AnglePart

    parts = (ChannelPart("C1", 10.0, 2.6, 0.38, 0.44, x_in=-4.0, toes=ChannelToes.LEFT),
             ChannelPart("C2", 10.0, 2.6, 0.38, 0.44, x_in=4.0, toes=ChannelToes.RIGHT),
             PlatePart("cover", 14.0, 0.5, y_in=5.25))
    if angles:
        parts += (AnglePart("A1", 6.0, 6.0, 0.5, x_in=-4.0, y_in=-5.0, x_sign=-1, y_sign=-1),
                  AnglePart("A2", 6.0, 6.0, 0.5, x_in=4.0, y_in=-5.0, x_sign=1, y_sign=-1))
    return BuiltUpSection(parts=parts, connectors=Connectors(ConnectorKind.LACING,
                                                             spacing_in=16.0))


def _own(mc, sense: str):
    from rating.capacity.own_weight import OWN_WEIGHT_CHECKS

    name = OWN_WEIGHT_CHECKS[0 if sense == "compression" else 1]
    return next(c for c in mc.checks if c.name == name)


def test_own_weight_magnifier_takes_k_in_the_truss_plane():
    """An owner's K of 2.0 (an end post whose portal sways out of plane) is not the member's
    K in the truss plane, where it is held at both pins: P_e takes K at most 1.0 (AASHTO LRFD
    4.5.3.2.2b [value from memory]; a reviewer saw P_e fall from 1,319 to 252 kip)."""
    chord = _laced_chord()
    at_two = member_capacity(MemberDesign("L0U1", chord, STEEL, K=2.0), MemberRole.END_POST,
                             L, (), False, own_weight_klf=0.06)
    at_one = member_capacity(MemberDesign("L0U1", chord, STEEL, K=1.0), MemberRole.END_POST,
                             L, (), False, own_weight_klf=0.06)
    a, b = _own(at_two, "compression"), _own(at_one, "compression")
    assert "in-plane K = 1;" in a.detail and "in-plane K = 1;" in b.detail
    assert a.detail.split("P_e = ")[1].split(" ")[0] == b.detail.split("P_e = ")[1].split(" ")[0]
    # M_r as printed carries phi_c phi_s, so the printed numbers reproduce it
    assert "M_r = " in a.detail and "phi_c phi_s 0.9 x phi_f 1 x F_y x S_x" in a.detail


def test_own_weight_is_checked_where_the_moment_is():
    """The moment of a uniform load is 4 x (L - x) / L^2 of its mid-length value at x
    (statics): heavy loss 0.5 ft from a pin meets a twentieth of it, the same loss at
    mid-length all of it; the check names the location that governs (a reviewer found the
    least section anywhere put with the mid-length moment: 11 % low in tension)."""
    chord = _laced_chord()
    near = (Finding("U1U2", "C1", FindingRegion.BODY, station_ft=0.5, percent_loss=50.0),)
    mid = (Finding("U1U2", "C1", FindingRegion.BODY, station_ft=L / 2, percent_loss=50.0),)
    design = MemberDesign("U1U2", chord, STEEL)
    a = member_capacity(design, MemberRole.BOTTOM_CHORD, L, near, False, own_weight_klf=0.4)
    b = member_capacity(design, MemberRole.BOTTOM_CHORD, L, mid, False, own_weight_klf=0.4)
    ta, tb = _own(a, "tension"), _own(b, "tension")
    assert ta.phi_R_n_kip > tb.phi_R_n_kip * 1.02
    assert tb.location.station_ft == L / 2 and "(at mid-length;" in tb.detail
    from rating.capacity.own_weight import moment_factor
    assert moment_factor(tb.location, L) == pytest.approx(1.0)
    assert moment_factor(near_location(0.5), L) == pytest.approx(4 * 0.5 * 23.5 / L**2)


def near_location(station_ft: float):
    from rating.capacity.sections import Location

    return Location(FindingRegion.BODY, station_ft)


def test_a_moment_past_the_resistance_is_said_and_is_not_out_of_service():
    """Where the own-weight moment alone reaches M_r no axial force is left (the interaction
    at P = 0 is past 1.0); that is said, and it is not the member's bars all being out (a
    reviewer saw the OUT OF SERVICE test fire on it)."""
    design = MemberDesign("U1U2", _laced_chord(), STEEL)
    fs = (Finding("U1U2", "C1", bar_state=BarState.BROKEN),)
    mc = member_capacity(design, MemberRole.TOP_CHORD, L, fs, False, own_weight_klf=30.0)
    assert mc.factored_resistance("compression") == 0.0
    assert mc.factored_resistance("tension") == 0.0
    assert not mc.carries_nothing()
    assert any("own-weight moment alone" in w and "can carry no axial force" in w
               for w in mc.warnings)


def test_a_rolled_shape_says_its_own_weight_bending_is_not_checked():
    from rating.capacity.own_weight import OWN_WEIGHT_CHECKS
    from rating.model import RolledShape

    design = MemberDesign("U1U2", RolledShape("W12x50", 14.6, 5.18, 1.96), STEEL)
    mc = member_capacity(design, MemberRole.TOP_CHORD, L, (), False, own_weight_klf=0.05)
    assert not any(c.name in OWN_WEIGHT_CHECKS for c in mc.checks)
    assert any("member U1U2: its bending under its own weight (50 plf across it) is not "
               "checked" in a for a in mc.assumptions)


def test_a_member_all_but_vertical_gets_no_own_weight_check():
    from rating.capacity.own_weight import OWN_WEIGHT_CHECKS

    mc = member_capacity(MemberDesign("U1L1", _laced_chord(), STEEL), MemberRole.VERTICAL, L,
                         (), False, own_weight_klf=1e-7)
    assert not any(c.name in OWN_WEIGHT_CHECKS for c in mc.checks)


def test_own_weight_uses_the_section_the_buckling_check_used():
    """Angles so corroded that the chord is rated without them (a part cannot weaken the
    member): the own-weight check takes I_x and S_x of that same section, not of the one with
    the thinned angles (a reviewer saw P_e of 1,958 kip for 1,229)."""
    from rating.capacity.sections import section_properties

    chord = _laced_chord(angles=True)
    fs = (Finding("U1U2", "A1", percent_loss=80.0), Finding("U1U2", "A2", percent_loss=80.0))
    mc = member_capacity(MemberDesign("U1U2", chord, STEEL), MemberRole.TOP_CHORD, L, fs,
                         False, own_weight_klf=0.08)
    assert any("taken as not carrying compression" in a for a in mc.assumptions)
    out = fs + (Finding("U1U2", "A1", bar_state=BarState.LOOSE),
                Finding("U1U2", "A2", bar_state=BarState.LOOSE))
    p = section_properties(chord, member="U1U2", findings=out).compression[0].properties
    K = 0.875
    P_e = math.pi**2 * STEEL.E * p.I_x_in4 / (K * L * 12) ** 2
    c = _own(mc, "compression")
    assert _number_after("P_e = ", c.detail) == pytest.approx(P_e, rel=5e-4)
    assert _number_after("S_x = ", c.detail) == pytest.approx(p.S_x_in3, rel=5e-4)
    assert not any(f.bar_state is BarState.LOOSE for f in c.location.findings)


def _number_after(label: str, text: str) -> float:
    return float(text.split(label)[1].split(" ")[0])
