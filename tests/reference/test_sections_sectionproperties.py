"""Built-up section properties with and without loss against ``sectionproperties``: areas
and second moments, and the torsion and warping properties (J, C_w, shear centre).

Source of the reference: the sectionproperties library (PyPI, an independent finite-element
cross-section analysis). Its own channel and angle builders (root radius 0) give the as-built
geometry; after loss the thinned elements are drawn as rectangles on their mid-lines, the
loss model stated in rating.capacity.sections. Geometric properties of polygons are integrated
exactly by its quadratic triangles, so the tolerance is 1e-6 relative. The least elastic
section modulus about x (for own-weight bending, rating.capacity.interaction) is compared
with the lesser of its moduli to the top and bottom fibres, and that about y (a pony truss's
U-frame posts bent out of plane, rating.lrfr.uframes) with the lesser to the two sides.
"""

from __future__ import annotations

import pytest

sp_lib = pytest.importorskip("sectionproperties.pre.library")
from sectionproperties.analysis import Section  # noqa: E402

from rating.capacity.sections import part_rectangles, section_properties  # noqa: E402
from rating.capacity.torsion import torsion_properties  # noqa: E402
from rating.model import (  # noqa: E402
    AnglePart,
    BuiltUpSection,
    ChannelPart,
    ChannelToes,
    Finding,
    PlatePart,
)

D, BF, TW, TF = 10.0, 2.6, 0.38, 0.44  # channel
CHORD = BuiltUpSection(parts=(
    ChannelPart("C1", D, BF, TW, TF, x_in=-4.0, toes=ChannelToes.LEFT),
    ChannelPart("C2", D, BF, TW, TF, x_in=4.0, toes=ChannelToes.RIGHT),
    PlatePart("cover", 14.0, 0.5, y_in=5.25),
))

LEG, T = 3.5, 0.4375  # angle 3-1/2 x 3-1/2 x 7/16
POST = BuiltUpSection(parts=(
    PlatePart("web", 12.0, 0.5, vertical=True),
    AnglePart("A1", LEG, LEG, T, x_in=0.25, y_in=6.0, x_sign=1, y_sign=-1),
    AnglePart("A2", LEG, LEG, T, x_in=-0.25, y_in=6.0, x_sign=-1, y_sign=-1),
    AnglePart("A3", LEG, LEG, T, x_in=0.25, y_in=-6.0, x_sign=1, y_sign=1),
    AnglePart("A4", LEG, LEG, T, x_in=-0.25, y_in=-6.0, x_sign=-1, y_sign=1),
))


def rect(b, h, cx, cy):
    return sp_lib.rectangular_section(d=h, b=b).shift_section(cx - b / 2, cy - h / 2)


def reference(geom) -> dict[str, float]:
    geom.create_mesh(mesh_sizes=[1.0])
    s = Section(geom)
    s.calculate_geometric_properties()
    cx, cy = s.get_c()
    ixx, iyy, ixy = s.get_ic()
    rx, ry = s.get_rc()
    zxx_plus, zxx_minus, zyy_plus, zyy_minus = s.get_z()  # elastic moduli to the fibres
    return dict(A=s.get_area(), cx=cx, cy=cy, Ix=ixx, Iy=iyy, Ixy=ixy, rx=rx, ry=ry,
                Sx=min(zxx_plus, zxx_minus), Sy=min(zyy_plus, zyy_minus))


def ours(section, findings=()) -> dict[str, float]:
    r = section_properties(section, member="M", findings=findings)
    s = r.tension[-1]
    p = s.properties
    return dict(A=p.A_in2, cx=p.x_c_in, cy=p.y_c_in, Ix=p.I_x_in4, Iy=p.I_y_in4,
                Ixy=p.I_xy_in4, rx=s.r_x_in, ry=s.r_y_in, Sx=p.S_x_in3, Sy=p.S_y_in3)


def compare(a: dict[str, float], b: dict[str, float]) -> None:
    scale = {"A": a["A"], "cx": 1.0, "cy": 1.0, "Ix": a["Ix"], "Iy": a["Iy"],
             "Ixy": max(a["Ix"], a["Iy"]), "rx": a["rx"], "ry": a["ry"], "Sx": a["Sx"],
             "Sy": a["Sy"]}
    for k in a:
        assert abs(a[k] - b[k]) <= 1e-6 * scale[k], (k, a[k], b[k])


def chord_geometry():
    c2 = sp_lib.channel_section(d=D, b=BF, t_f=TF, t_w=TW, r=0, n_r=1).shift_section(4.0, -5.0)
    c1 = sp_lib.channel_section(d=D, b=BF, t_f=TF, t_w=TW, r=0, n_r=1) \
        .mirror_section(axis="y", mirror_point=(0, 0)).shift_section(-4.0, -5.0)
    return c1, c2


def test_chord_as_built():
    # sectionproperties, channels by its own builder + plate [independent library]
    c1, c2 = chord_geometry()
    geom = c1 + c2 + rect(14.0, 0.5, 0.0, 5.25)
    compare(reference(geom), ours(CHORD))


def test_chord_after_loss():
    # cover plate down to 0.30 in; channel C1 with 20% loss on every element (mid-lines kept)
    _, c2 = chord_geometry()
    tw, tf = 0.8 * TW, 0.8 * TF
    out = BF - TW
    web = rect(tw, D, -4.0 - TW / 2, 0.0)
    f1 = rect(out, tf, -4.0 - TW - out / 2, D / 2 - TF / 2)
    f2 = rect(out, tf, -4.0 - TW - out / 2, -D / 2 + TF / 2)
    geom = web + f1 + f2 + c2 + rect(14.0, 0.30, 0.0, 5.25)
    fs = (Finding("M", "cover", station_ft=8.0, remaining_thickness_in=0.30),
          Finding("M", "C1", station_ft=8.0, percent_loss=20.0))
    compare(reference(geom), ours(CHORD, fs))


def angle_geom(sx: int, sy: int, x: float, y: float, t: float = T):
    g = sp_lib.angle_section(d=LEG, b=LEG, t=t, r_r=0, r_t=0, n_r=1)
    if sx < 0:
        g = g.mirror_section(axis="y", mirror_point=(0, 0))
    if sy < 0:
        g = g.mirror_section(axis="x", mirror_point=(0, 0))
    return g.shift_section(x, y)


def post_geometry():
    """The post as built: four angles and a web plate [sectionproperties]."""
    geom = rect(0.5, 12.0, 0.0, 0.0)
    for sx, sy, x, y in ((1, -1, 0.25, 6.0), (-1, -1, -0.25, 6.0), (1, 1, 0.25, -6.0),
                         (-1, 1, -0.25, -6.0)):
        geom = geom + angle_geom(sx, sy, x, y)
    return geom


def test_post_as_built():
    compare(reference(post_geometry()), ours(POST))


def test_post_after_loss_unsymmetric():
    # web down to 0.35 in; angle A1 with 40% loss: legs thinned about their mid-lines, so the
    # section is no longer symmetric (product of inertia, shifted centroid)
    geom = rect(0.35, 12.0, 0.0, 0.0)
    for sx, sy, x, y in ((-1, -1, -0.25, 6.0), (1, 1, 0.25, -6.0), (-1, 1, -0.25, -6.0)):
        geom = geom + angle_geom(sx, sy, x, y)
    t = 0.6 * T
    # leg along +x from the heel (0.25, 6.0), thickness along -y; leg along -y, thickness +x
    geom = geom + rect(LEG, t, 0.25 + LEG / 2, 6.0 - T / 2)
    ly = LEG - T
    geom = geom + rect(t, ly, 0.25 + T / 2, 6.0 - T - ly / 2)
    fs = (Finding("M", "web", remaining_thickness_in=0.35),
          Finding("M", "A1", percent_loss=40.0))
    got = ours(POST, fs)
    # both findings run the whole length: the last location holds both
    r = section_properties(POST, member="M", findings=fs)
    assert len(r.tension) == 2 and len(r.tension[1].location.findings) == 2
    ref = reference(geom)
    compare(ref, got)
    assert abs(ref["Ixy"]) > 1e-3

# --------------------------------------------------------------------------------------------
# torsion and warping (rating.capacity.torsion): sectionproperties' warping analysis gives J,
# the shear centre and Gamma = C_w. rating.capacity.torsion works on a graded grid of bilinear
# elements, so the tolerances are those of two different meshes: J within 1.5 %, C_w within
# 1 %, the shear centre within 0.02 in. A thinned cover plate is drawn on the flanges it is
# riveted to (the torsion analysis's loss model, rating.capacity.sections).
# --------------------------------------------------------------------------------------------


def warping_reference(geom, mesh: float = 0.02) -> dict[str, float]:
    geom.create_mesh(mesh_sizes=[mesh])
    s = Section(geom)
    s.calculate_geometric_properties()
    s.calculate_warping_properties()
    x_s, y_s = s.get_sc()
    return dict(J=s.get_j(), C_w=s.get_gamma(), x_s=x_s, y_s=y_s)


def assert_matches(rects, ref):
    tp = torsion_properties(rects)
    assert not isinstance(tp, str), tp
    assert tp.J_in4 == pytest.approx(ref["J"], rel=0.015)
    assert tp.C_w_in6 == pytest.approx(ref["C_w"], rel=0.01, abs=1e-3)
    assert (tp.x_s_in, tp.y_s_in) == pytest.approx((ref["x_s"], ref["y_s"]), abs=0.02)


def torsion_rects(section, findings=()):
    """The rectangles of the section's least location for the torsion analysis."""
    return min(section_properties(section, member="M", findings=findings, length_ft=20.0)
               .compression, key=lambda s: s.A_g_in2).torsion_rects


def test_a_channel_in_torsion():
    ch = ChannelPart("C", D, BF, TW, TF, x_in=0.0, y_in=0.0, toes=ChannelToes.RIGHT)
    geom = sp_lib.channel_section(d=D, b=BF, t_f=TF, t_w=TW, r=0, n_r=1).shift_section(0, -D / 2)
    assert_matches(part_rectangles(ch), warping_reference(geom))


def test_the_chord_in_torsion():
    # singly symmetric: its shear centre lies far above the cover plate (an open section)
    c1, c2 = chord_geometry()
    ref = warping_reference(c1 + c2 + rect(14.0, 0.5, 0.0, 5.25))
    assert ref["y_s"] > D / 2 + 0.5
    assert_matches(torsion_rects(CHORD), ref)


def test_the_chord_with_its_cover_plate_thinned_in_torsion():
    # 30 % loss: 0.35 in left, on the flanges (the free face loses it)
    c1, c2 = chord_geometry()
    ref = warping_reference(c1 + c2 + rect(14.0, 0.35, 0.0, 5.175))
    assert_matches(torsion_rects(CHORD, (Finding("M", "cover", percent_loss=30.0),)), ref)


def test_a_closed_box_in_torsion():
    # cover plates on both sides: one cell, whose J is that of a closed section (the
    # warping function's boundary condition on the inner boundary too)
    box = BuiltUpSection(parts=CHORD.parts + (PlatePart("bottom", 14.0, 0.5, y_in=-5.25),))
    c1, c2 = chord_geometry()
    ref = warping_reference(c1 + c2 + rect(14.0, 0.5, 0.0, 5.25) + rect(14.0, 0.5, 0.0, -5.25),
                            mesh=0.05)
    assert ref["J"] > 100 * torsion_properties(torsion_rects(CHORD)).J_in4
    assert_matches(torsion_rects(box), ref)


def test_the_post_in_torsion():
    assert_matches(torsion_rects(POST), warping_reference(post_geometry()))


def test_a_single_angle_in_torsion():
    # unsymmetric about its own axes: the shear centre at the legs' meeting point
    ang = AnglePart("A", 4.0, 3.0, 0.5, x_in=0.0, y_in=0.0, x_sign=1, y_sign=1)
    geom = sp_lib.angle_section(d=3.0, b=4.0, t=0.5, r_r=0, r_t=0, n_r=1)
    assert_matches(part_rectangles(ang), warping_reference(geom))


def _random_chords(n: int, seed: int = 7):
    """Chords of two channels (toes out or in) and a cover plate, some with a second cover
    plate (a closed box) or one web thinned from its free face: period-like proportions."""
    import random

    rnd = random.Random(seed)
    for _ in range(n):
        d = rnd.choice([7.0, 8.0, 10.0, 12.0, 15.0])
        bf, tw, tf = rnd.uniform(2.0, 3.5), rnd.uniform(0.2, 0.6), rnd.uniform(0.3, 0.65)
        gap, out = rnd.uniform(6.0, 14.0), rnd.random() < 0.7
        boxes = []  # (x0, x1, y0, y1)
        for s in (-1, 1):
            x = s * gap / 2
            web = sorted((x, x + s * tw)) if out else sorted((x, x - s * tw))
            fl = sorted((x + s * tw, x + s * bf)) if out else sorted((x - s * tw, x - s * bf))
            boxes += [(*web, -d / 2, d / 2), (*fl, d / 2 - tf, d / 2),
                      (*fl, -d / 2, -d / 2 + tf)]
        span = max(b[1] for b in boxes) - min(b[0] for b in boxes)
        w, t = rnd.uniform(1.0, 1.15) * span, rnd.uniform(0.25, 0.6)
        kind = rnd.choice(["cover", "two covers", "thinned web"])
        boxes.append((-w / 2, w / 2, d / 2, d / 2 + t))
        if kind == "two covers":
            boxes.append((-w / 2, w / 2, -d / 2 - t, -d / 2))
        if kind == "thinned web":
            x0, x1, y0, y1 = boxes[0]
            left = rnd.uniform(0.5, 0.9) * (x1 - x0)
            boxes[0] = (x0, x0 + left, y0, y1) if out else (x1 - left, x1, y0, y1)
        yield [tuple(round(v, 4) for v in b) for b in boxes]


@pytest.mark.parametrize("boxes", list(_random_chords(6)))
def test_random_chords(boxes):
    """Seeded random chords (40 of them checked once, 2026-12-05: J within 0.4 %, C_w within
    0.5 %, the shear centre within 0.001 in of sectionproperties at a 0.02 in mesh)."""
    from rating.capacity.sections import Rect

    rects = [Rect(f"p{k}", "e", (x0 + x1) / 2, (y0 + y1) / 2, x1 - x0, y1 - y0,
                  x1 - x0 < y1 - y0, max(x1 - x0, y1 - y0), min(x1 - x0, y1 - y0), True)
             for k, (x0, x1, y0, y1) in enumerate(boxes)]
    geom = None
    for x0, x1, y0, y1 in boxes:
        r = rect(x1 - x0, y1 - y0, (x0 + x1) / 2, (y0 + y1) / 2)
        geom = r if geom is None else geom + r
    assert_matches(rects, warping_reference(geom, mesh=0.05))


@pytest.mark.parametrize("loss", [0.0, 20.0])
def test_a_tee_given_as_a_rolled_shape_buckles_as_its_plates(loss):
    # sectionproperties' radii, J, C_w and shear centre of a tee of two plates, entered as a
    # rolled shape's tabulated properties, give the flexural-torsional resistance that the
    # program's own analysis of the same plates gives (the two meshes' tolerances); after a
    # loss over the whole shape too (rating.capacity.sections.rolled_torsion_after_loss: J
    # with the cube of the thickness left, C_w in proportion, the radii kept), within 1 %
    from rating.capacity.compression import compression_checks
    from rating.model import Finding, Material, MaterialKind, RolledShape

    steel = Material(MaterialKind.STEEL, F_y=26.0, F_u=52.0)  # (test data)

    flange = PlatePart("flange", 6.0, 0.5, y_in=0.25)
    stem = PlatePart("stem", 5.0, 0.5, y_in=-2.5, vertical=True)
    geom = rect(6.0, 0.5, 0.0, 0.25) + rect(0.5, 5.0, 0.0, -2.5)
    ref = warping_reference(geom, mesh=0.01)
    props = reference(rect(6.0, 0.5, 0.0, 0.25) + rect(0.5, 5.0, 0.0, -2.5))
    tee = RolledShape("tee of plates", props["A"], props["rx"], props["ry"], J_in4=ref["J"],
                      C_w_in6=ref["C_w"], x_o_in=round(abs(ref["x_s"] - props["cx"]), 4),
                      y_o_in=abs(ref["y_s"] - props["cy"]))
    plates = BuiltUpSection(parts=(flange, stem))

    def resistance(section):
        lost = (Finding("M", "all", percent_loss=loss),) if loss else ()
        r = section_properties(section, member="M", findings=lost, length_ft=10.0)
        return compression_checks(r, steel, K=1.0, length_ft=10.0).checks[0]

    rolled, built = resistance(tee), resistance(plates)
    assert rolled.name == built.name == "compression: flexural-torsional buckling"
    assert rolled.R_n_kip == pytest.approx(built.R_n_kip, rel=0.005 if not loss else 0.01)
