"""Torsion and warping properties of built-up sections against ``sectionproperties``.

Source of the reference: the sectionproperties library (PyPI, an independent finite-element
cross-section analysis on triangles: its warping analysis gives the St Venant torsional
constant J, the shear centre and the warping constant Gamma = C_w). Its own channel and angle
builders (root radius 0) and rectangles give the geometry; a thinned cover plate is drawn on
the flanges it is riveted to (the torsion analysis's loss model, rating.capacity.sections).
rating.capacity.torsion works on a graded grid of bilinear elements, so the tolerances are
those of two different meshes: J within 1.5 %, C_w within 1 %, the shear centre within
0.02 in.
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
LEG, T = 3.5, 0.4375  # angle 3-1/2 x 3-1/2 x 7/16


def rect(b, h, cx, cy):
    return sp_lib.rectangular_section(d=h, b=b).shift_section(cx - b / 2, cy - h / 2)


def channel_pair():
    # toes out, backs 8 in apart (webs from |x| = 4 outwards)
    c = sp_lib.channel_section(d=D, b=BF, t_f=TF, t_w=TW, r=0, n_r=1)
    right = c.shift_section(4.0, -D / 2)
    left = c.mirror_section(axis="y", mirror_point=(0, 0)).shift_section(-4.0, -D / 2)
    return left + right


def reference(geom, mesh: float = 0.02) -> dict[str, float]:
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


def test_a_channel():
    ch = ChannelPart("C", D, BF, TW, TF, x_in=0.0, y_in=0.0, toes=ChannelToes.RIGHT)
    geom = sp_lib.channel_section(d=D, b=BF, t_f=TF, t_w=TW, r=0, n_r=1).shift_section(0, -D / 2)
    assert_matches(part_rectangles(ch), reference(geom))


def chord(cover_t: float = 0.5) -> BuiltUpSection:
    return BuiltUpSection(parts=(
        ChannelPart("C1", D, BF, TW, TF, x_in=-4.0, toes=ChannelToes.LEFT),
        ChannelPart("C2", D, BF, TW, TF, x_in=4.0, toes=ChannelToes.RIGHT),
        PlatePart("cover", 14.0, cover_t, y_in=D / 2 + cover_t / 2)))


def test_a_chord_of_two_channels_and_a_cover_plate():
    # singly symmetric: its shear centre lies far above the cover plate (an open section)
    s = section_properties(chord(), member="M", length_ft=20.0).compression[0]
    ref = reference(channel_pair() + rect(14.0, 0.5, 0.0, D / 2 + 0.25))
    assert ref["y_s"] > D / 2 + 0.5
    assert_matches(s.torsion_rects, ref)


def test_the_chord_with_its_cover_plate_thinned():
    # 30 % loss: 0.35 in left, on the flanges (the free face loses it)
    loss = Finding("M", "cover", percent_loss=30.0)
    s = min(section_properties(chord(), member="M", findings=(loss,), length_ft=20.0)
            .compression, key=lambda s: s.A_g_in2)
    ref = reference(channel_pair() + rect(14.0, 0.35, 0.0, D / 2 + 0.175))
    assert_matches(s.torsion_rects, ref)


def test_a_closed_box():
    # cover plates on both sides: one cell, whose J is that of a closed section (the
    # warping function's boundary condition on the inner boundary too)
    box = BuiltUpSection(parts=chord().parts + (PlatePart("bottom", 14.0, 0.5,
                                                          y_in=-D / 2 - 0.25),))
    s = section_properties(box, member="M", length_ft=20.0).compression[0]
    ref = reference(channel_pair() + rect(14.0, 0.5, 0.0, D / 2 + 0.25)
                    + rect(14.0, 0.5, 0.0, -D / 2 - 0.25), mesh=0.05)
    assert ref["J"] > 100 * torsion_properties(
        section_properties(chord(), member="M", length_ft=20.0).compression[0]
        .torsion_rects).J_in4
    assert_matches(s.torsion_rects, ref)


def test_a_web_plate_with_four_angles():
    post = BuiltUpSection(parts=(
        PlatePart("web", 12.0, 0.5, vertical=True),
        AnglePart("A1", LEG, LEG, T, x_in=0.25, y_in=6.0, x_sign=1, y_sign=-1),
        AnglePart("A2", LEG, LEG, T, x_in=-0.25, y_in=6.0, x_sign=-1, y_sign=-1),
        AnglePart("A3", LEG, LEG, T, x_in=0.25, y_in=-6.0, x_sign=1, y_sign=1),
        AnglePart("A4", LEG, LEG, T, x_in=-0.25, y_in=-6.0, x_sign=-1, y_sign=1)))
    s = section_properties(post, member="M", length_ft=20.0).compression[0]
    a = sp_lib.angle_section(d=LEG, b=LEG, t=T, r_r=0, r_t=0, n_r=1)
    geom = rect(0.5, 12.0, 0.0, 0.0)
    geom = geom + a.mirror_section(axis="x", mirror_point=(0, 0)).shift_section(0.25, 6.0)
    geom = geom + a.rotate_section(180, rot_point=(0, 0)).shift_section(-0.25, 6.0)
    geom = geom + a.shift_section(0.25, -6.0)
    geom = geom + a.mirror_section(axis="y", mirror_point=(0, 0)).shift_section(-0.25, -6.0)
    assert_matches(s.torsion_rects, reference(geom))


def test_a_single_angle():
    # unsymmetric about its own axes: the shear centre at the legs' meeting point
    ang = AnglePart("A", 4.0, 3.0, 0.5, x_in=0.0, y_in=0.0, x_sign=1, y_sign=1)
    geom = sp_lib.angle_section(d=3.0, b=4.0, t=0.5, r_r=0, r_t=0, n_r=1)
    assert_matches(part_rectangles(ang), reference(geom))


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
    assert_matches(rects, reference(geom, mesh=0.05))
