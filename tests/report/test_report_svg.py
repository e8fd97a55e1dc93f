"""The drawings: geometry checked by closed forms (a drawing to scale is a similarity
transform of the joint coordinates; an arrow drawn at a station maps linearly), and the
shading bands at their limits. SVG parsed with the standard library's XML parser."""

from __future__ import annotations

import math
import xml.etree.ElementTree as ET
from dataclasses import replace

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from rating.report.display import Display
from rating.report.svg import (
    RFBands,
    _f,
    _stagger,
    elevation_svg,
    governing_z_in,
    influence_svg,
    legend_svg,
    lowest_rating,
    packing_svg,
    with_zero_crossings,
)
from rating.results import PinResult, Position, RatingResults

NS = {"s": "http://www.w3.org/2000/svg"}
US = Display("US")


def _parse(markup: str) -> ET.Element:
    return ET.fromstring(str(markup))


def test_bands_at_their_limits() -> None:
    b = RFBands()
    assert [b.band(x).key for x in (0.2999, 0.3, 0.9999, 1.0, 1.1999, 1.2, math.inf)] == \
        ["b0", "b1", "b1", "b2", "b2", "b3", "b3"]
    assert b.band(None).key == "nr" and b.band(math.nan).key == "nr"
    assert RFBands((0.5, 0.9, 1.5)).band(0.6).key == "b1"


def test_elevation_is_the_truss_to_scale(results_us: RatingResults) -> None:
    """Closed form: every drawn member length / true length is one constant (similarity)."""
    root = _parse(elevation_svg(results_us, US))
    lines = root.findall(".//s:line[@class]", NS)
    members = [ln for ln in lines if ln.get("class", "").startswith("member")]
    assert len(members) == len(results_us.members)
    joints = {j.id: j for j in results_us.joints}
    ratios = []
    for m, ln in zip(results_us.members, members, strict=True):
        a, b = joints[m.joints[0]], joints[m.joints[1]]
        true = math.hypot(b.x - a.x, b.y - a.y)
        drawn = math.hypot(float(ln.get("x2")) - float(ln.get("x1")),
                           float(ln.get("y2")) - float(ln.get("y1")))
        ratios.append(drawn / true)
    assert max(ratios) - min(ratios) < 0.02 * min(ratios)  # 0.1 px rounding of coordinates
    # y grows downward in SVG: an upper chord joint is drawn above the lower chord
    assert float(members[0].get("y1")) > min(float(ln.get("y1")) for ln in members)


def test_elevation_shades_each_member_by_its_lowest_rf(results_us: RatingResults) -> None:
    root = _parse(elevation_svg(results_us, US))
    members = [ln for ln in root.findall(".//s:line", NS)
               if ln.get("class", "").startswith("member")]
    bands = RFBands()
    for m, ln in zip(results_us.members, members, strict=True):
        low = lowest_rating(m.ratings.items())
        expected = bands.band(low[1].rf if low else None)
        assert ln.get("class") == f"member {expected.key}"
        assert ln.get("stroke") == expected.colour
    # labels: every member id is written on the drawing
    texts = [t.text for t in root.findall(".//s:text", NS)]
    for m in results_us.members:
        assert any(t and t.startswith(m.id + " ") for t in texts), m.id
    # deck panel points and both bearings are marked
    assert len(root.findall(".//s:rect[@class='floorbeam']", NS)) == \
        sum(1 for j in results_us.joints if j.deck)
    kinds = sorted(g.get("class") for g in root.findall(".//s:g", NS))
    assert kinds == ["bearing pin", "bearing roller"]
    assert len(root.findall(".//s:circle[@class]", NS)) >= len(results_us.pins)


def test_legend_lists_every_band() -> None:
    root = _parse(legend_svg())
    texts = " | ".join(t.text or "" for t in root.findall(".//s:text", NS))
    for b in RFBands().bands:
        assert b.label in texts


def _axle_lines(root: ET.Element) -> list[ET.Element]:
    return [ln for ln in root.findall(".//s:line", NS) if ln.get("class") == "axle"]


@pytest.mark.parametrize("direction", ["forward", "reverse"])
def test_influence_line_axles_at_their_stations(results_us: RatingResults,
                                                direction: str) -> None:
    line = next(il for il in results_us.influence_lines if il.member == "L2L3")
    axles = (40.0, 54.0, 68.0) if direction == "forward" else (70.0, 84.0, 98.0)
    loads = (8.0, 32.0, 32.0) if direction == "forward" else (8.0, 32.0, 32.0)
    pos = Position(front_axle_station=axles[-1] if direction == "forward" else axles[0],
                   direction=direction, spacings=(14.0, 14.0), axle_stations=axles,
                   axle_loads=loads, lane_segments=((20.0, 60.0), (60.0, 100.0)))
    v = results_us.vehicles[0]
    root = _parse(influence_svg(line, pos, v, US))
    arrows = _axle_lines(root)
    assert len(arrows) == 3
    xs = [float(a.get("x1")) for a in arrows]
    # linear map station -> x: equal station steps give equal pixel steps
    assert xs[1] - xs[0] == pytest.approx(xs[2] - xs[1], abs=0.15)
    # arrow length grows with the axle load (8 < 32)
    lengths = [float(a.get("y2")) - float(a.get("y1")) for a in arrows]
    assert lengths[0] < lengths[1] == pytest.approx(lengths[2])
    assert len(root.findall(".//s:rect[@class='lane']", NS)) == 2
    travel = next(ln for ln in root.findall(".//s:line", NS) if ln.get("class") == "travel")
    dx = float(travel.get("x2")) - float(travel.get("x1"))
    assert (dx > 0) == (direction == "forward")
    # the influence line passes through its ordinates: peak drawn at the station of the peak
    poly = root.find(".//s:polyline[@class='il']", NS)
    assert poly is not None
    pts = [tuple(map(float, p.split(","))) for p in poly.get("points").split()]
    top = min(pts, key=lambda p: p[1])  # SVG y down: the tension peak is the smallest y
    k = max(range(len(line.ordinates)), key=lambda i: line.ordinates[i])
    st0, st1 = line.stations[0], line.stations[-1]
    x_first = next(p[0] for p in pts[2:3])
    x_last = pts[-3][0]
    expected_x = x_first + (line.stations[k] - st0) / (st1 - st0) * (x_last - x_first)
    assert top[0] == pytest.approx(expected_x, abs=0.2)


def test_influence_line_without_position(results_us: RatingResults) -> None:
    line = results_us.influence_lines[0]
    root = _parse(influence_svg(line, None, None, US))
    assert _axle_lines(root) == []
    assert root.find(".//s:polyline[@class='il']", NS) is not None


def test_packing_drawn_to_scale(results_us: RatingResults) -> None:
    """Plate widths proportional to their thicknesses (one scale for the whole pin)."""
    pin: PinResult = results_us.pins[0]
    root = _parse(packing_svg(pin, US))
    rects = root.findall(".//s:rect", NS)[1:]  # the first is the pin itself
    assert len(rects) == len(pin.packing)
    scales = [float(r.get("width")) / row.thickness for r, row in zip(rects, pin.packing,
                                                                       strict=True)]
    assert max(scales) - min(scales) < 0.01 * max(scales) + 0.2
    # gaps: the left edge of each plate = previous right edge + gap * scale
    s = scales[0]
    for k in range(1, len(rects)):
        prev = float(rects[k - 1].get("x")) + float(rects[k - 1].get("width"))
        gap = float(rects[k].get("x")) - prev
        assert gap == pytest.approx(pin.packing[k].gap_before * s, abs=0.3)
    # the governing section, when the results give its distance, is marked to the same scale
    z_pin = replace(pin, governing_section="z = 2.0625 in from the first plate's outer face")
    gov = next(ln for ln in _parse(packing_svg(z_pin, US)).findall(".//s:line", NS)
               if ln.get("class") == "governing")
    assert float(gov.get("x1")) == pytest.approx(float(rects[0].get("x")) + 2.0625 * s,
                                                 abs=0.3)
    assert governing_z_in("section 3, between U1L2 and L1L2") is None
    # where bearing governs, its plate is marked (outlined, to the same scale), not a section
    b_pin = replace(z_pin, governing_item=2)
    b_root = _parse(packing_svg(b_pin, US))
    marks = [el for el in b_root.iter() if el.get("class") == "governing"]
    assert [el.tag.rsplit("}", 1)[-1] for el in marks] == ["rect"]
    assert float(marks[0].get("x")) == pytest.approx(float(rects[1].get("x")) - 2, abs=0.3)
    assert float(marks[0].get("width")) == pytest.approx(float(rects[1].get("width")) + 4,
                                                         abs=0.3)
    assert "bearing governs" in str(packing_svg(b_pin, US))
    empty = packing_svg(replace(pin, packing=()), US)
    assert "packing not given" in str(empty)


def test_close_axle_labels_are_lifted_apart() -> None:
    xs = [100.0, 110.0, 120.0, 300.0, 305.0]
    lifts = _stagger(xs, min_gap=24.0, step=9.0)
    assert lifts[0] == 0.0 and lifts[3] == 0.0
    for i in range(len(xs)):
        for j in range(i):
            if abs(xs[i] - xs[j]) < 24.0:
                assert lifts[i] != lifts[j]


@settings(max_examples=300, deadline=None)
@given(st.floats(allow_nan=True, allow_infinity=True) | st.floats(-2e5, 2e5)
       | st.integers(-10**6, 10**6).map(lambda k: k / 10 + 0.05))
def test_coordinates_written_as_rounded_to_a_tenth(x: float) -> None:
    """A coordinate's text is that of the value rounded to 0.1 in Python's general format
    (6 significant digits, no trailing zeros, no negative zero)."""
    v = round(float(x), 1) + 0.0
    assert _f(x) == (f"{v:g}" if abs(v) < 1e6 else f"{v:.1f}")


@settings(max_examples=200, deadline=None)
@given(ys=st.lists(st.floats(-2.0, 2.0), min_size=2, max_size=12))
def test_zero_crossings_added_where_the_line_changes_sign(ys: list[float]) -> None:
    """Closed form: between two points of opposite sign a line crosses zero at
    x0 + (x1 - x0) y0 / (y0 - y1); with those points added no two neighbours have opposite
    signs, and the line through the new points is the same line (same ordinates at every
    old point, in order)."""
    xs = [float(i) for i in range(len(ys))]
    nx, ny = with_zero_crossings(xs, ys)
    assert all(not (a < 0.0 < b or b < 0.0 < a) for a, b in zip(ny, ny[1:], strict=False))
    assert nx == sorted(nx) and len(nx) == len(ny)
    given_points = list(zip(xs, ys, strict=True))
    assert [p for p in zip(nx, ny, strict=True) if p in given_points] == given_points
    for x, y in zip(nx, ny, strict=True):
        assert y == pytest.approx(float(np.interp(x, xs, ys)), abs=1e-12)


def test_influence_shading_ends_where_the_line_crosses_zero(results_us: RatingResults) -> None:
    """A line that changes sign between panel points (a diagonal): the tension shading ends
    at the zero crossing (closed form: 20 + 20 x 0.6 / 0.8 = 35 ft), not at the next panel
    point (it ran a panel too far), and the compression shading starts there."""
    line = replace(results_us.influence_lines[0], stations=(0.0, 20.0, 40.0, 60.0),
                   ordinates=(0.0, 0.6, -0.2, 0.0))
    root = _parse(influence_svg(line, None, None, US))
    il = root.find(".//s:polyline[@class='il']", NS)
    pts = [tuple(map(float, q.split(","))) for q in il.get("points").split()]
    zero_y = pts[0][1]  # the line starts on the axis
    x_at_0, x_at_60 = pts[1][0], pts[-2][0]  # stations 0 and 60: station -> x is linear

    def x_of(station: float) -> float:
        return x_at_0 + (x_at_60 - x_at_0) * station / 60.0

    def points(fill: str) -> list[tuple[float, float]]:
        poly = next(q for q in root.findall(".//s:polygon", NS) if q.get("fill") == fill)
        return [tuple(map(float, q.split(","))) for q in poly.get("points").split()]

    tension, compression = points("#f3c9b8"), points("#c3d6ea")
    assert max(x for x, y in tension if y < zero_y - 1e-6) <= x_of(20.0) + 0.2
    assert any(abs(x - x_of(35.0)) <= 0.2 and abs(y - zero_y) <= 0.1 for x, y in tension)
    assert min(x for x, y in compression if y > zero_y + 1e-6) >= x_of(35.0) + 1.0
    assert any(abs(x - x_of(35.0)) <= 0.2 for x, _ in compression)


def test_band_colours_darken_with_lower_rf() -> None:
    """In a black-and-white print the bands keep their order: the luma of each colour
    (ITU-R BT.601 weights 0.299, 0.587, 0.114) falls from the top band to the lowest, by a
    margin a grey print shows (common practice for print legibility: about 10 of 255)."""
    def luma(colour: str) -> float:
        r, g, b = (int(colour[i:i + 2], 16) for i in (1, 3, 5))
        return 0.299 * r + 0.587 * g + 0.114 * b

    rated = RFBands().bands[:4]  # lowest band first
    lumas = [luma(b.colour) for b in rated]
    assert all(hi - lo >= 10.0 for lo, hi in zip(lumas, lumas[1:], strict=False)), lumas
    # the pins' circles (fill only: same size in every band) use these colours
    legend = str(legend_svg())
    assert f'fill="{rated[3].colour}"' in legend


def test_labels_of_crossing_members_move_apart_under_a_sloping_chord() -> None:
    """A counter and the main diagonal of a panel under a sloping top chord cross off their
    mid-lengths (their midpoints differ): their labels still move apart along each member;
    members that meet only at a joint keep theirs at mid-length."""
    from rating.report.svg import _label_fractions
    from rating.results import MemberResult

    pos = {"L3": (0.0, 100.0), "L4": (40.0, 100.0), "U3": (0.0, 40.0), "U4": (40.0, 20.0)}
    members = [MemberResult("L3U4", "diagonal", ("L3", "U4"), False, {}),
               MemberResult("U3L4", "counter", ("U3", "L4"), True, {}),
               MemberResult("L3L4", "bottom chord", ("L3", "L4"), False, {}),
               MemberResult("U3U4", "top chord", ("U3", "U4"), False, {})]
    t = _label_fractions(members, pos)
    assert t["L3L4"] == t["U3U4"] == 0.5
    assert t["L3U4"] != 0.5 and t["U3L4"] != 0.5

    def spot(mid: str) -> tuple[float, float]:
        a, b = (pos[j] for j in next(m.joints for m in members if m.id == mid))
        return (a[0] + (b[0] - a[0]) * t[mid], a[1] + (b[1] - a[1]) * t[mid])

    assert math.dist(spot("L3U4"), spot("U3L4")) > 20.0


def test_a_label_too_long_for_its_member_gives_the_rf_alone():
    """On a truss of many panels a chord's name and RF ran over the pins and its neighbours'
    labels (a reviewer's 16-panel truss): where "L10L11 0.28" is longer than the member's
    drawn length between its pins, the label is the RF alone (the member table names it)."""
    from rating.report.svg import LABEL_EM, _fitting

    assert _fitting("L10L11", "0.28", 0.0, 0.0, 40.7, 0.0) == "0.28"
    assert _fitting("L3L4", "0.87", 0.0, 0.0, 90.0, 0.0) == "L3L4 0.87"
    # (at 8 px, "L3L4 0.87" is 9 x 0.6 x 8 = 43.2 px: it fits in 43.2 + 14 px)
    assert _fitting("L3L4", "0.87", 0.0, 0.0, 9 * LABEL_EM * 8 + 14.0, 0.0) == "L3L4 0.87"
    assert _fitting("L3L4", "0.87", 0.0, 0.0, 9 * LABEL_EM * 8 + 13.9, 0.0) == "0.87"
