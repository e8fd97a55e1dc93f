"""Section properties as built and after loss: closed forms, locations, removals, bad input.

Closed forms: rectangle b h^3 / 12 and the parallel-axis theorem (any mechanics of materials
text); channel and angle areas from their rectangles. Eyebar and rod areas from their
dimensions. The library cross-check is in tests/reference/test_sections_sectionproperties.py.

``section_properties`` works a built-up section out once per distinct state (parts gone, losses
acting) and shares it between the as-built, tension and compression builds; the last tests
rebuild every location from scratch by the rules of ``rating.capacity.sections`` (loss evenly
off both faces, a remaining thickness sets the depth of loss from the part's reference
element, removed parts out, bent parts out in compression) and expect the same to the bit.
"""

from __future__ import annotations

import math
from dataclasses import replace

import pytest

from rating.capacity.sections import (
    REMOVING_STATES,
    THREADED_ROOT_AREA_RATIO,
    AreaProperties,
    Rect,
    area_properties,
    gross_area_as_built_in2,
    part_rectangles,
    part_reference_thickness_in,
    section_properties,
)
from rating.errors import InputError
from rating.model import (
    AnglePart,
    BarState,
    BuiltUpSection,
    ChannelPart,
    ChannelToes,
    ConnectorKind,
    Connectors,
    EyebarSet,
    Finding,
    FindingRegion,
    PlatePart,
    RodEnd,
    RodSet,
    RodShape,
    RolledShape,
)

POST = BuiltUpSection(
    parts=(ChannelPart("C1", 10.0, 2.6, 0.38, 0.44, x_in=-4.0, toes=ChannelToes.LEFT),
           ChannelPart("C2", 10.0, 2.6, 0.38, 0.44, x_in=4.0, toes=ChannelToes.RIGHT)),
    connectors=Connectors(ConnectorKind.LACING, spacing_in=16.0),
    hole_diameter_in=0.875, holes_per_section=4)


def test_plate_closed_form():
    # rectangle b h^3/12 about its own axes (closed form)
    p = area_properties(part_rectangles(PlatePart("p", 12.0, 0.5)))
    assert p.A_in2 == pytest.approx(6.0)
    assert p.I_x_in4 == pytest.approx(12.0 * 0.5**3 / 12.0)
    assert p.I_y_in4 == pytest.approx(0.5 * 12.0**3 / 12.0)
    v = area_properties(part_rectangles(PlatePart("p", 12.0, 0.5, vertical=True)))
    assert v.I_x_in4 == pytest.approx(0.5 * 12.0**3 / 12.0)  # width along y: in-plane stiff


def test_parallel_axis_two_plates():
    # two 10 x 1 plates 8 in apart centre to centre: I_x = 2 (10 * 1/12 + 10 * 4^2)
    rects = part_rectangles(PlatePart("a", 10, 1, y_in=4)) + \
        part_rectangles(PlatePart("b", 10, 1, y_in=-4))
    p = area_properties(rects)
    assert p.y_c_in == pytest.approx(0.0)
    assert p.I_x_in4 == pytest.approx(2 * (10 / 12 + 10 * 16))
    assert p.r_x_in == pytest.approx(math.sqrt(p.I_x_in4 / 20))


@pytest.mark.parametrize("toes", list(ChannelToes))
def test_channel_area_any_orientation(toes):
    # A = d tw + 2 (bf - tw) tf (rectangles of the channel, closed form)
    c = ChannelPart("C", 12.0, 3.0, 0.4, 0.5, toes=toes)
    p = area_properties(part_rectangles(c))
    assert p.A_in2 == pytest.approx(12 * 0.4 + 2 * (3.0 - 0.4) * 0.5)
    # centroid from the back of the web: sum A x / A
    xbar = (12 * 0.4 * 0.2 + 2 * 2.6 * 0.5 * (0.4 + 1.3)) / p.A_in2
    off = {ChannelToes.RIGHT: (xbar, 0), ChannelToes.LEFT: (-xbar, 0),
           ChannelToes.UP: (0, xbar), ChannelToes.DOWN: (0, -xbar)}[toes]
    assert (p.x_c_in, p.y_c_in) == pytest.approx(off)


def test_angle_area_and_centroid():
    # A = t (Lx + Ly - t); centroid of an equal angle on its diagonal (closed form)
    a = AnglePart("L", 4.0, 4.0, 0.5)
    p = area_properties(part_rectangles(a))
    assert p.A_in2 == pytest.approx(0.5 * (4 + 4 - 0.5))
    assert p.x_c_in == pytest.approx(p.y_c_in)
    assert p.x_c_in == pytest.approx((4 * 0.5 * 2 + 3.5 * 0.5 * 0.25) / 3.75)
    m = area_properties(part_rectangles(AnglePart("L", 4.0, 4.0, 0.5, x_sign=-1, y_sign=-1)))
    assert (m.x_c_in, m.y_c_in) == pytest.approx((-p.x_c_in, -p.y_c_in))
    assert m.I_xy_in4 == pytest.approx(p.I_xy_in4)
    assert p.r_min_in < min(p.r_x_in, p.r_y_in)  # principal axis of an angle


def test_gross_area_as_built():
    assert gross_area_as_built_in2(EyebarSet(4, 6, 1.25, 15, 6.03)) == pytest.approx(30.0)
    assert gross_area_as_built_in2(RodSet(2, 1.5)) == pytest.approx(2 * math.pi * 0.75**2)
    assert gross_area_as_built_in2(RodSet(2, 1.5, shape=RodShape.SQUARE)) == pytest.approx(4.5)
    assert gross_area_as_built_in2(RolledShape("W8x31", 9.13, 3.47, 2.02)) == 9.13
    assert gross_area_as_built_in2(POST) == pytest.approx(
        2 * (10 * 0.38 + 2 * (2.6 - 0.38) * 0.44))


def test_eyebar_areas_and_head_loss_location():
    e = EyebarSet(2, 6.0, 1.0, 14.0, 5.03)
    f = Finding("L1L2", "bar 2", FindingRegion.HEAD, station_ft=0.5, percent_loss=20,
                where="Findings!B7")
    r = section_properties(e, member="L1L2", findings=(f,), length_ft=20)
    base, head = r.tension
    assert base.A_g_in2 == pytest.approx(12.0)
    assert base.A_n_in2 == pytest.approx(2 * (14 - 5.03) * 1.0)  # (D_h - d) t per bar
    assert head.location.region is FindingRegion.HEAD and head.location.station_ft == 0.5
    assert head.location.finding is f
    assert head.A_g_in2 == pytest.approx(12.0)  # head loss leaves the body alone
    assert head.A_n_in2 == pytest.approx((14 - 5.03) * (1.0 + 0.8))
    assert head.eyebars[0].beyond_hole_in == pytest.approx((14 - 5.03) / 2)
    assert r.compression == ()
    assert "Findings!B7" in head.location.describe()


def test_body_width_limited_to_8t():
    # AISC LRFD 1999 D3.2 [V]: body width taken not more than 8 t in calculation
    r = section_properties(EyebarSet(1, 8.0, 0.75, 16, 6.03), member="M")
    assert r.tension[0].A_g_in2 == pytest.approx(6.0 * 0.75)
    assert any("8 t" in w for w in r.warnings)


def test_rod_threaded_default_root_and_loss():
    r = section_properties(RodSet(2, 1.5, RodEnd.THREADED), member="U2L3",
                           findings=(Finding("U2L3", "bar 1", FindingRegion.THREAD,
                                             remaining_thickness_in=1.0),))
    body = 2 * math.pi * 0.75**2
    base, end = r.tension
    assert base.A_n_in2 == pytest.approx(THREADED_ROOT_AREA_RATIO * body)
    # remaining diameter at the thread of bar 1 is 1.0 in
    assert end.A_n_in2 == pytest.approx(math.pi / 4 + THREADED_ROOT_AREA_RATIO * body / 2)
    assert any("root" in a for a in r.assumptions)


def test_rod_upset_root_given_and_percent_of_diameter():
    r = section_properties(RodSet(1, 2.0, RodEnd.UPSET, root_diameter_in=2.2), member="H",
                           findings=(Finding("H", "all", percent_loss=10, station_ft=3),))
    base, body = r.tension
    assert base.A_n_in2 == pytest.approx(math.pi * 1.1**2)
    assert body.A_g_in2 == pytest.approx(math.pi * 0.9**2)  # 10% of the diameter


def test_builtup_loss_depth_applies_to_every_element():
    c = ChannelPart("C", 10.0, 2.6, 0.4, 0.5)
    s = BuiltUpSection(parts=(c,))
    r = section_properties(s, member="M", findings=(Finding("M", "C",
                                                            remaining_thickness_in=0.3),))
    # depth of loss 0.1 in off the web and off both flanges
    expected = 10 * 0.3 + 2 * (2.6 - 0.4) * 0.4
    assert r.tension[1].A_g_in2 == pytest.approx(expected)


def test_percent_loss_on_all_and_stations():
    f1 = Finding("M", "all", percent_loss=10, where="F!A1")  # whole length
    f2 = Finding("M", "C1", station_ft=6.0, percent_loss=30, where="F!A2")
    f3 = Finding("M", "C2", region=FindingRegion.CONNECTION, station_ft=0.0, percent_loss=50,
                 where="F!A3")
    r = section_properties(POST, member="M", findings=(f1, f2, f3), length_ft=24)
    locs = {(s.location.region, s.location.station_ft): s for s in r.tension}
    a0 = r.tension[0].A_g_in2
    whole = locs[(FindingRegion.BODY, None)]
    at6 = locs[(FindingRegion.BODY, 6.0)]
    conn = locs[(FindingRegion.CONNECTION, 0.0)]
    assert whole.A_g_in2 == pytest.approx(0.9 * a0)
    # at 6 ft: C1 has the larger of 10% and 30% -> 30%; C2 keeps the whole-length 10%
    assert at6.A_g_in2 == pytest.approx(0.5 * a0 * (0.7 + 0.9))
    assert at6.location.findings[0] is f2  # most loss first
    assert f1 in at6.location.findings
    assert conn.A_g_in2 == pytest.approx(0.5 * a0 * (1.0 + 0.5))  # body loss not at the end
    assert conn.location.finding is f3
    assert at6.r_y_in < r.tension[0].r_y_in or at6.r_x_in < r.tension[0].r_x_in


def test_net_area_holes_and_axes():
    r = section_properties(POST, member="M")
    s = r.tension[0]
    assert s.A_n_in2 == pytest.approx(s.A_g_in2 - 4 * 0.875 * 0.44)
    # channels 8 in apart along x: out-of-plane axis owes its I to the offsets
    assert s.modified_axis == "y"
    assert s.r_in_plane_in == s.r_x_in and s.r_out_of_plane_in == s.r_y_in
    assert s.r_i_in == pytest.approx(
        area_properties(part_rectangles(POST.parts[0])).r_min_in)


def test_loose_bar_removed_and_bent_bar_flagged():
    e = EyebarSet(4, 6.0, 1.0, 14.0, 5.03)
    r = section_properties(e, member="L2L3", findings=(
        Finding("L2L3", "bar 3", bar_state=BarState.LOOSE, where="F!A9"),))
    assert r.tension[0].A_g_in2 == pytest.approx(18.0)
    assert r.carrying_count == 3 and r.total_count == 4
    assert any("bar 3 is loose" in w and "F!A9" in w for w in r.warnings)
    b = section_properties(POST, member="M", findings=(
        Finding("M", "C2", bar_state=BarState.BENT),))
    assert b.tension[0].A_g_in2 == pytest.approx(b.as_built.A_g_in2)
    assert b.compression[0].A_g_in2 == pytest.approx(b.as_built.A_g_in2 / 2)
    # a part of a member that pushes: said to be out of its compression resistance, and the
    # buckling with the bow left to the engineer (a bar's wording, "counted in tension",
    # misled a reviewer on an end post)
    (said,) = [w for w in b.warnings if "is bent" in w]
    assert "left out of the member's compression resistance" in said
    assert "the engineer should judge it" in said


def test_remaining_more_than_as_built_is_a_warning():
    r = section_properties(POST, member="M", findings=(
        Finding("M", "C1", remaining_thickness_in=0.40),))
    assert r.tension[1].A_g_in2 == pytest.approx(r.as_built.A_g_in2)
    assert any("more than the 0.38 in as built" in w for w in r.warnings)


def test_rolled_shape_percent_loss():
    s = RolledShape("W8x31", 9.13, 3.47, 2.02, net_area_in2=8.0)
    r = section_properties(s, member="M", findings=(Finding("M", "W8x31", percent_loss=20),))
    assert r.tension[1].A_g_in2 == pytest.approx(0.8 * 9.13)
    assert r.tension[1].A_n_in2 == pytest.approx(0.8 * 8.0)
    assert r.tension[1].r_x_in == 3.47


@pytest.mark.parametrize("finding, needle", [
    (Finding("L1L2", "bar 1", percent_loss=120, where="Findings!E4"),
     "more than the whole thickness"),
    (Finding("L1L2", "bar 1", remaining_thickness_in=-0.1, where="Findings!E4"), "negative"),
    (Finding("L1L2", "bar 1", percent_loss=-5, where="Findings!E4"), "negative"),
    (Finding("L1L2", "bar 9", percent_loss=5, where="Findings!E4"), "bars 1 to 2"),
    (Finding("L1L2", "web", percent_loss=5, where="Findings!E4"), "no component 'web'"),
    (Finding("L1L2", "bar 1", FindingRegion.THREAD, percent_loss=5, where="Findings!E4"),
     "no thread"),
    (Finding("L1L2", "bar 1", station_ft=30.0, percent_loss=5, where="Findings!E4"),
     "off the member"),
    (Finding("L0L1", "bar 1", percent_loss=5, where="Findings!E4"), "belongs to member"),
    (Finding("L1L2", "bar 1", remaining_thickness_in=0.5, percent_loss=10,
             where="Findings!E4"), "disagree"),
])
def test_bad_findings_name_member_and_cell(finding, needle):
    e = EyebarSet(2, 6.0, 1.0, 14.0, 5.03)
    with pytest.raises(InputError) as ei:
        section_properties(e, member="L1L2", findings=(finding,), length_ft=20)
    assert ei.value.where == "Findings!E4"
    assert "member L1L2" in str(ei.value) and needle in str(ei.value)


def test_ambiguous_remaining_on_all_parts():
    s = BuiltUpSection(parts=(PlatePart("web", 12, 0.5), PlatePart("cover", 14, 0.375,
                                                                   y_in=3)))
    with pytest.raises(InputError, match="ambiguous"):
        section_properties(s, member="M", findings=(Finding("M", "all",
                                                            remaining_thickness_in=0.3),))


def test_builtup_region_head_refused():
    with pytest.raises(InputError, match="has no head"):
        section_properties(POST, member="M", findings=(
            Finding("M", "C1", FindingRegion.HEAD, percent_loss=5),))


@pytest.mark.parametrize("section, needle", [
    (EyebarSet(2, -6.0, 1.0, 14.0, 5.03), "body width"),
    (EyebarSet(2, 6.0, 1.0, 5.0, 5.03), "not larger than the pin hole"),
    (EyebarSet(0, 6.0, 1.0, 14.0, 5.03), "count"),
    (RodSet(1, 0.0), "rod diameter"),
    (RodSet(1, 1.0, RodEnd.THREADED, root_diameter_in=1.2), "exceeds the rod diameter"),
    (BuiltUpSection(parts=(PlatePart("p", 10, -0.5),)), "part p thickness"),
    (BuiltUpSection(parts=(ChannelPart("c", 10, 3, 0.4, 5.5),)), "inconsistent"),
    (BuiltUpSection(parts=(AnglePart("a", 3, 3, 3.5),)), "not less than its legs"),
    (BuiltUpSection(parts=(PlatePart("p", 10, 0.5), PlatePart("P", 10, 0.5))), "used twice"),
    (BuiltUpSection(parts=(PlatePart("p", 2, 0.5),), hole_diameter_in=1, holes_per_section=2),
     "remove the whole section"),
    (RolledShape("W", 9.0, 3.0, 2.0, net_area_in2=10.0), "exceeds the gross"),
])
def test_bad_sections(section, needle):
    with pytest.raises(InputError) as ei:
        section_properties(section, member="U3U4", where="Sections!C12")
    assert ei.value.where == "Sections!C12"
    assert "member U3U4" in str(ei.value) and needle in str(ei.value)


CHORD = BuiltUpSection(
    parts=(PlatePart("Cover", 16.0, 0.5, y_in=6.25),
           ChannelPart("C1", 12.0, 3.0, 0.4, 0.5, x_in=-6.0, toes=ChannelToes.LEFT),
           ChannelPart("C2", 12.0, 3.0, 0.4, 0.5, x_in=6.0, toes=ChannelToes.RIGHT),
           AnglePart("L1", 3.0, 3.0, 0.375, x_in=-6.0, y_in=-6.0, x_sign=1, y_sign=1)),
    connectors=Connectors(ConnectorKind.LACING, spacing_in=18.0),
    hole_diameter_in=0.875, holes_per_section=4)

FINDINGS = (
    Finding("M", "all", percent_loss=10, where="F!A1"),
    Finding("M", "C1", station_ft=6.0, remaining_thickness_in=0.25, where="F!A2"),
    Finding("M", "C1", station_ft=6.0, percent_loss=15, where="F!A3"),
    Finding("M", "C2", FindingRegion.CONNECTION, station_ft=0.0, percent_loss=100, where="F!A4"),
    Finding("M", "L1", bar_state=BarState.BENT, where="F!A5"),
    Finding("M", "Cover", station_ft=12.0, remaining_thickness_in=0.3, where="F!A6"),
)


def _plain_area_properties(rects: list[Rect]) -> AreaProperties:
    """I = sum(b h^3 / 12 + A d^2) in plain left-to-right sums (textbook form)."""
    A = sum(r.bx_in * r.by_in for r in rects)
    xc = sum(r.bx_in * r.by_in * r.cx_in for r in rects) / A
    yc = sum(r.bx_in * r.by_in * r.cy_in for r in rects) / A
    Ix = sum(r.bx_in * r.by_in**3 / 12 + r.bx_in * r.by_in * (r.cy_in - yc) ** 2 for r in rects)
    Iy = sum(r.by_in * r.bx_in**3 / 12 + r.bx_in * r.by_in * (r.cx_in - xc) ** 2 for r in rects)
    Ixy = sum(r.bx_in * r.by_in * (r.cx_in - xc) * (r.cy_in - yc) for r in rects)
    return AreaProperties(A, xc, yc, Ix, Iy, Ixy)


def _left(r: Rect, t_ref: float, f: Finding) -> float:
    if f.remaining_thickness_in is not None:
        return max(r.t_in - max(t_ref - min(f.remaining_thickness_in, t_ref), 0.0), 0.0)
    return r.t_in * (1.0 - f.percent_loss / 100.0)


def _rebuilt(section: BuiltUpSection, findings: tuple[Finding, ...], out: frozenset[str]):
    """The rectangles left at a location, each part from scratch."""
    kept: dict[str, tuple[object, list[Rect]]] = {}
    for p in section.parts:
        key = p.label.lower()
        if key in out:
            continue
        t_ref = part_reference_thickness_in(p)
        rects = []
        for r in part_rectangles(p):
            t = r.t_in
            for f in findings:
                if f.bar_state in REMOVING_STATES or f.component.lower() not in ("all", key):
                    continue
                if f.remaining_thickness_in is None and f.percent_loss is None:
                    continue
                t = min(t, _left(r, t_ref, f))
            if t > 0.0:
                rects.append(r.thinned(t))
        if rects:
            kept[key] = (p, rects)
    return kept


@pytest.mark.parametrize("findings", [(), FINDINGS, FINDINGS[:2] + FINDINGS[4:],
                                      FINDINGS + (Finding("M", "C2", bar_state=BarState.LOOSE),)])
def test_every_location_matches_a_build_from_scratch(findings):
    r = section_properties(CHORD, member="M", findings=findings, length_ft=24.0)
    removed = frozenset(c for c, _ in r.removed)
    bent = frozenset(c for c, _ in r.bent)
    whole = {p.label.lower(): part_rectangles(p) for p in CHORD.parts}
    t_h0 = max(r_.t_in for rs in whole.values() for r_ in rs)
    own = [area_properties(rs) for rs in whole.values()]
    as_built = area_properties([r_ for rs in whole.values() for r_ in rs])
    share_x = 1 - sum(p.I_x_in4 for p in own) / as_built.I_x_in4
    share_y = 1 - sum(p.I_y_in4 for p in own) / as_built.I_y_in4
    axis = "x" if share_x >= share_y else "y"
    builds = [(s, removed) for s in r.tension] + [(s, removed | bent) for s in r.compression]
    builds.append((r.as_built, frozenset()))
    for s, out in builds:
        kept = _rebuilt(CHORD, s.location.findings, out)
        rects = [r_ for _, rs in kept.values() for r_ in rs]
        props = area_properties(rects)
        assert s.properties == props, s.location.describe()
        assert (s.A_g_in2, s.r_x_in, s.r_y_in) == (props.A_in2, props.r_x_in, props.r_y_in)
        assert s.A_n_in2 == max(props.A_in2 - 4 * 0.875 * t_h0, 0.0)
        assert [(e.part, e.element, e.b_in, e.t_in) for e in s.elements] == \
            [(r_.part, r_.element, r_.b_in, r_.t_in) for r_ in rects]
        assert s.modified_axis == (axis if len(kept) >= 2 else None)
        main = [k for k, (p, _) in kept.items() if isinstance(p, ChannelPart | AnglePart)] \
            or list(kept)
        r_i = min(area_properties(kept[k][1]).r_min_in for k in main) if len(kept) >= 2 \
            else None
        assert s.r_i_in == r_i
        # the closed form in plain sums agrees to rounding
        plain = _plain_area_properties(rects)
        for name in ("A_in2", "x_c_in", "y_c_in", "I_x_in4", "I_y_in4"):
            assert getattr(props, name) == pytest.approx(getattr(plain, name), rel=1e-12,
                                                         abs=1e-9)


def test_a_whole_element_lost_is_said_at_its_location():
    r = section_properties(CHORD, member="M", findings=FINDINGS, length_ft=24.0)
    assert len(r.tension) == 5  # whole member; body: whole length, 6 ft, 12 ft; connection
    said = [w for w in r.warnings if "takes away its whole" in w]
    # C2 at the connection: web and both flanges, once each although built twice (bent L1
    # makes the compression build differ)
    assert len(said) == 3 and all("part C2" in w and "F!A4" in w for w in said)


def test_a_bent_bar_is_said_to_be_counted_at_full_resistance() -> None:
    """A bent bar is counted in tension at its full resistance (the bend is not in the
    numbers); a single rod is not said to take "less than its share" (it has no other bar to
    share with: a reviewer's finding)."""
    from rating.capacity.sections import section_properties
    from rating.model import BarState, Finding, RodEnd, RodSet

    one = section_properties(RodSet(1, 1.25, RodEnd.UPSET), member="L3U4",
                             findings=(Finding("L3U4", "rod 1", bar_state=BarState.BENT),))
    said = [w for w in one.warnings if "is bent" in w]
    assert said and "at its full resistance" in said[0] and "bowed rod" in said[0]
    assert "its share" not in said[0] and "compression" not in said[0]  # (a rod never is)
    two = section_properties(RodSet(2, 1.25, RodEnd.UPSET), member="L3U4",
                             findings=(Finding("L3U4", "rod 1", bar_state=BarState.BENT),))
    assert any("less than its share" in w for w in two.warnings)


def test_a_head_finding_at_mid_member_is_said_to_be_out_of_place() -> None:
    """A head (thread, connection) is at an end: a finding there recorded 14 ft along a 28 ft
    member was accepted without a word, and governed (a reviewer's finding)."""
    e = EyebarSet(2, 6.0, 1.0, 15.0, 5.03)
    mid = Finding("M", "bar 1", FindingRegion.HEAD, station_ft=14.0, remaining_thickness_in=0.5,
                  where="F!A7")
    r = section_properties(e, member="M", findings=(mid,), length_ft=28.0)
    assert any("a finding at its head (F!A7) is 14 ft along the 28 ft member, far from both "
               "ends" in w for w in r.warnings)
    end = replace(mid, station_ft=0.5)
    assert not [w for w in section_properties(e, member="M", findings=(end,),
                                              length_ft=28.0).warnings if "far from" in w]


def test_the_symmetry_of_a_section_from_its_rectangles():
    """Where the centroid lies between the extreme fibres tells the axes of symmetry (a
    screen; common practice): a plate is doubly symmetric, a tee singly, an angle
    unsymmetric (its product of inertia is not zero)."""
    from rating.capacity.sections import Rect, area_properties

    def rect(cx, cy, bx, by):
        return Rect("p", "plate", cx, cy, bx, by, False, bx, by, True)

    assert area_properties([rect(0, 0, 10, 1)]).symmetry() == "doubly symmetric"
    tee = [rect(0, 0, 8, 1), rect(0, -4.5, 1, 8)]
    assert area_properties(tee).symmetry() == "singly symmetric"
    angle = [rect(2, 0, 4, 0.5), rect(0.25, -2.25, 0.5, 4)]
    assert area_properties(angle).symmetry() == "unsymmetric"
    p = area_properties(tee)
    assert (p.x_left_in, p.x_right_in, p.y_top_in, p.y_bottom_in) == (-4.0, 4.0, 0.5, -8.5)


def test_parts_that_share_metal_are_refused():
    """A cover plate drawn into the channels' flanges (its position mistyped) would count the
    shared metal twice: refused, naming both parts and the overlap."""
    channels = (ChannelPart("C1", 10.0, 2.6, 0.38, 0.44, x_in=-4.0, toes=ChannelToes.LEFT),
                ChannelPart("C2", 10.0, 2.6, 0.38, 0.44, x_in=4.0, toes=ChannelToes.RIGHT))
    sunk = BuiltUpSection(parts=channels + (PlatePart("cover", 14.0, 0.5, y_in=5.0),))
    with pytest.raises(InputError) as ei:
        section_properties(sunk, member="U1U2", where="BuiltUp!B6")
    assert ei.value.where == "BuiltUp!B6"
    assert "parts C1 (web) and cover (plate) overlap by 0.38 in x 0.25 in" in str(ei.value)
    # on the flanges, touching them: accepted
    on = BuiltUpSection(parts=channels + (PlatePart("cover", 14.0, 0.5, y_in=5.25),))
    assert section_properties(on, member="U1U2").as_built.A_g_in2 > 0
