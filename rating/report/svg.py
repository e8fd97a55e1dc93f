"""SVG drawings for the report: the truss elevation shaded by rating factor, influence lines
with the critical vehicle at its position, and the packing of a pin.

Every text that can come from a workbook (ids, names) is escaped here; the drawings are
returned as :class:`markupsafe.Markup` so the template inserts them as they are.
Drawing coordinates are in pixels of the SVG viewBox; numbers shown are converted by
:class:`~rating.report.display.Display` to the bridge's unit system.
"""

from __future__ import annotations

import math
import re
from collections.abc import Iterable, Sequence

import numpy as np
from markupsafe import Markup, escape

from rating.report.bands import Band as Band  # re-exported: the drawings' bands
from rating.report.bands import RFBands
from rating.report.display import Display
from rating.results import (
    InfluenceLineData,
    JointResult,
    MemberResult,
    PinResult,
    Position,
    Rating,
    RatingResults,
    VehicleResult,
)

WIDTH = 720.0
FONT = "font-family:'DejaVu Sans',Arial,Helvetica,sans-serif"


# ------------------------------------------------------------------ lowest rating

def lowest_rating(ratings: Iterable[tuple[str, Rating]]) -> tuple[str, Rating] | None:
    """(vehicle id, rating) with the lowest finite-or-infinite RF; ``None`` when none."""
    best: tuple[str, Rating] | None = None
    low = 0.0
    for vid, r in ratings:
        rf = r.rf
        if rf is None or rf != rf:  # not rated, or NaN
            continue
        if best is None or rf < low:
            best, low = (vid, r), rf
    return best


# ------------------------------------------------------------------ small SVG helpers

def esc(text: str) -> str:
    """``escape(text)``: a plain string with none of ``& < > ' "`` (most ids, names and
    numbers) is the same text, returned as it is (escaping it took a fair share of a
    report's time)."""
    if text.__class__ is str and not ("&" in text or "<" in text or ">" in text
                                      or "'" in text or '"' in text):
        return text
    return escape(text)


def _f(x: float) -> str:
    """Coordinate with 1 decimal (deterministic text, small files)."""
    if -1e5 < x < 1e5:  # the usual case, the same text as below, faster: "58", "-0.5"
        text = f"{x:.1f}"
        if text[-2:] == ".0":
            text = text[:-2]
            return "0" if text == "-0" else text
        return text
    v = round(float(x), 1) + 0.0
    return f"{v:g}" if abs(v) < 1e6 else f"{v:.1f}"


def _text(x: float, y: float, content: str, *, size: float = 9, anchor: str = "middle",
          cls: str = "", weight: str = "normal", fill: str = "#222", halo: bool = False,
          rotate: float | None = None) -> str:
    return _text_at(_f(x), _f(y), content, size, anchor, cls, weight, fill, halo, rotate)


def _text_at(fx: str, fy: str, content: str, size: float = 9, anchor: str = "middle",
             cls: str = "", weight: str = "normal", fill: str = "#222", halo: bool = False,
             rotate: float | None = None) -> str:
    """:func:`_text` at coordinates already written by :func:`_f` (shared by several)."""
    more = ""
    if weight != "normal":
        more += f' font-weight="{weight}"'
    if cls:
        more += f' class="{esc(cls)}"'
    if halo:
        more += ' stroke="#fff" stroke-width="3" paint-order="stroke" stroke-linejoin="round"'
    if rotate is not None:
        more += f' transform="rotate({rotate:g} {fx} {fy})"'
    return (f'<text x="{fx}" y="{fy}" font-size="{_SIZES.get(size) or format(size, "g")}" '
            f'text-anchor="{anchor}" fill="{fill}"{more}>{esc(content)}</text>')


_SIZES = {7.5: "7.5", 8: "8", 8.5: "8.5", 9: "9"}  # the font sizes used, written as by :g


def _svg(width: float, height: float, title: str, body: Sequence[str], cls: str) -> Markup:
    head = (f'<svg xmlns="http://www.w3.org/2000/svg" class="{cls}" role="img" '
            f'viewBox="0 0 {_f(width)} {_f(height)}" width="{_f(width)}" '
            f'height="{_f(height)}" preserveAspectRatio="xMidYMid meet" style="{FONT}">')
    return Markup(head + f"<title>{esc(title)}</title>" + "".join(body) + "</svg>")


def _arrow_marker(mid: str, colour: str) -> str:
    return (f'<marker id="{mid}" viewBox="0 0 10 10" refX="9" refY="5" markerWidth="7" '
            f'markerHeight="7" orient="auto-start-reverse"><path d="M0,0 L10,5 L0,10 z" '
            f'fill="{colour}"/></marker>')


# ------------------------------------------------------------------ elevation

def segments_cross(a: tuple[float, float], b: tuple[float, float],
                   c: tuple[float, float], d: tuple[float, float]) -> bool:
    """Whether segments ab and cd cross at a point inside both (not at an end)."""
    def side(p: tuple[float, float], q: tuple[float, float], r: tuple[float, float]) -> float:
        return (q[0] - p[0]) * (r[1] - p[1]) - (q[1] - p[1]) * (r[0] - p[0])

    d1, d2 = side(c, d, a), side(c, d, b)
    d3, d4 = side(a, b, c), side(a, b, d)
    return d1 * d2 < 0.0 and d3 * d4 < 0.0


def _label_fractions(members: Sequence[MemberResult], pos: dict[str, tuple[float, float]]
                     ) -> dict[str, float]:
    """Where along each member its label sits: mid-length, moved apart where members cross
    (counters and the main diagonal of their panel, whether they cross at mid-length as in a
    parallel-chord panel or off it under a sloping chord)."""
    ends = {m.id: (pos[m.joints[0]], pos[m.joints[1]]) for m in members}
    group = {m.id: m.id for m in members}  # union-find over the crossing pairs

    def root(i: str) -> str:
        while group[i] != i:
            group[i] = group[group[i]]
            i = group[i]
        return i

    for k, m in enumerate(members):
        for n in members[k + 1:]:
            if set(m.joints) & set(n.joints):
                continue
            if segments_cross(*ends[m.id], *ends[n.id]):
                group[root(m.id)] = root(n.id)
    crossing: dict[str, list[str]] = {}
    for m in members:
        crossing.setdefault(root(m.id), []).append(m.id)
    out: dict[str, float] = {}
    for ids in crossing.values():
        if len(ids) == 1:
            out[ids[0]] = 0.5
            continue
        placed: list[tuple[float, float]] = []
        for mid in ids:  # greedy: each label as far as possible from those already placed
            a, b = ends[mid]

            def spot(t: float, a: tuple[float, float] = a, b: tuple[float, float] = b
                     ) -> tuple[float, float]:
                return (a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t)

            best_t = max((0.25, 0.75, 0.38, 0.62), key=lambda t: min(
                (math.dist(spot(t), p) for p in placed), default=0.0))
            out[mid] = best_t
            placed.append(spot(best_t))
    return out


def _member_label(ax: float, ay: float, bx: float, by: float, t: float, content: str,
                  below: bool = False) -> str:
    """A label written along the member, just beside the line (below for a bottom chord)."""
    ang = math.degrees(math.atan2(by - ay, bx - ax))
    if ang >= 90:
        ang -= 180
    elif ang < -90:
        ang += 180
    # unit normal pointing "up" for the text's baseline
    rad = math.radians(ang)
    nx, ny = math.sin(rad), -math.cos(rad)
    off = -11.0 if below else 4.0
    lx = ax + (bx - ax) * t + nx * off
    ly = ay + (by - ay) * t + ny * off
    return _text(lx, ly, content, size=8, halo=True, cls="mlabel",
                 rotate=None if abs(ang) < 1e-9 else ang)


LABEL_EM = 0.6
"""Width of a label's character, in font sizes (8 px labels; DejaVu Sans digits and capitals
are about 0.6 em wide)."""


def _fitting(member: str, rf_text: str, ax: float, ay: float, bx: float, by: float) -> str:
    """A member's label, "L3L4 0.87", or its RF alone where the name and RF would run past
    the member's drawn length between its joints' pins (a truss of many panels): the member
    is then named by its joints beside it and in the member table."""
    room = math.hypot(bx - ax, by - ay) - 14.0  # (the pins' circles at both ends)
    full = f"{member} {rf_text}"
    return full if len(full) * LABEL_EM * 8 <= room else rf_text


def elevation_svg(results: RatingResults, display: Display,
                  bands: RFBands | None = None) -> Markup:
    """Elevation of one truss: members between joints shaded by their lowest RF, labelled,
    deck panel points (floorbeams) and bearings marked, pins shaded by their lowest RF."""
    bands = bands or RFBands()
    joints: dict[str, JointResult] = {j.id: j for j in results.joints}
    if not joints:
        return _svg(WIDTH, 40, "truss elevation (no joints)",
                    [_text(WIDTH / 2, 24, "no joint coordinates in the results")], "elevation")
    xs = np.array([j.x for j in joints.values()])
    ys = np.array([j.y for j in joints.values()])
    margin_x, top, bottom_room = 34.0, 40.0, 64.0
    dx = max(float(xs.max() - xs.min()), 1e-6)
    dy = float(ys.max() - ys.min())
    scale = (WIDTH - 2 * margin_x) / dx
    scale = min(scale, 260.0 / dy) if dy > 0 else scale
    draw_w = dx * scale
    x0 = (WIDTH - draw_w) / 2
    height = top + dy * scale + bottom_room

    # plain floats (numpy scalars make every sum and text of the drawing slower)
    x_min, y_max = float(xs.min()), float(ys.max())

    def px(j: JointResult) -> tuple[float, float]:
        return (x0 + (j.x - x_min) * scale, top + (y_max - j.y) * scale)

    pos = {jid: px(j) for jid, j in joints.items()}
    body: list[str] = []
    members = [m for m in results.members if m.joints[0] in pos and m.joints[1] in pos]
    fractions = _label_fractions(members, pos)
    lines: list[str] = []
    labels: list[str] = []
    for m in members:
        low = lowest_rating(m.ratings.items())
        band = bands.band(low[1].rf if low else None)
        (ax, ay), (bx, by) = pos[m.joints[0]], pos[m.joints[1]]
        width = band.stroke_width * (0.7 if m.role == "counter" else 1.0)
        dash = f' stroke-dasharray="{band.dash}"' if band.dash else ""
        rf_text = display.rf(low[1].rf) if low else "n.r."
        lines.append(
            f'<line class="member {band.key}" x1="{_f(ax)}" y1="{_f(ay)}" x2="{_f(bx)}" '
            f'y2="{_f(by)}" stroke="{band.colour}" stroke-width="{width:g}" '
            f'stroke-linecap="round"{dash}><title>{esc(m.id)} ({esc(m.role)}): lowest '
            f'RF {esc(rf_text)}</title></line>')
        t = fractions.get(m.id, 0.5)
        labels.append(_member_label(ax, ay, bx, by, t, _fitting(m.id, rf_text, ax, ay, bx, by),
                                    below=m.role == "bottom chord"))
    body.extend(lines)

    # deck panel points (floorbeams) and bearings
    y_low = max(p[1] for p in pos.values())
    for jid, j in joints.items():
        x, y = pos[jid]
        if j.deck and not j.support:  # a floorbeam hangs below the deck panel point
            body.append(f'<rect class="floorbeam" x="{_f(x - 4)}" y="{_f(y + 5)}" width="8" '
                        f'height="7" fill="#fff" stroke="#222" stroke-width="1.2">'
                        f'<title>deck panel point {esc(jid)} (floorbeam)</title></rect>')
        elif j.deck:
            body.append(f'<rect class="floorbeam" x="{_f(x - 3)}" y="{_f(y - 3)}" width="6" '
                        f'height="6" fill="#fff" stroke="#222" stroke-width="1.2">'
                        f'<title>deck panel point {esc(jid)} (floorbeam over the bearing)'
                        f'</title></rect>')
        if j.support:
            body.append(_bearing(x, y, j.support))
    pins = {p.joint: p for p in results.pins}
    for jid, (x, y) in pos.items():
        p = pins.get(jid)
        if p is not None:
            low = lowest_rating(p.ratings.items())
            band = bands.band(low[1].rf if low else None)
            rf_text = display.rf(low[1].rf) if low else "n.r."
            body.append(f'<circle class="pin {band.key}" cx="{_f(x)}" cy="{_f(y)}" r="5.5" '
                        f'fill="{band.colour}" stroke="#111" stroke-width="1.2"><title>pin '
                        f'{esc(jid)}: lowest RF {esc(rf_text)}</title></circle>')
        elif not joints[jid].deck:
            body.append(f'<circle class="joint" cx="{_f(x)}" cy="{_f(y)}" r="2.6" '
                        f'fill="#fff" stroke="#222" stroke-width="1"/>')
    body.extend(labels)
    for jid, (x, y) in pos.items():  # joint labels outside the truss
        below = y >= y_low - 1e-6 or joints[jid].support
        # (beneath a bearing's ground line: a roller's stands 6 px lower than a pin's)
        support = joints[jid].support
        jy = y + ((34 if support == "roller" else 28) if support else 22 if joints[jid].deck
                  else 14) if below else y - 9
        body.append(_text(x, jy, jid, size=8, fill="#555", cls="jlabel"))
    # span dimension line
    deck = sorted((j for j in joints.values() if j.deck), key=lambda j: j.x)
    yd = height - 14
    if len(deck) >= 2:
        xa, xb = pos[deck[0].id][0], pos[deck[-1].id][0]
        body.append(f'<line x1="{_f(xa)}" y1="{_f(yd)}" x2="{_f(xb)}" y2="{_f(yd)}" '
                    f'stroke="#555" stroke-width="0.8" marker-start="url(#dim)" '
                    f'marker-end="url(#dim)"/>')
        span = deck[-1].x - deck[0].x
        text = (f"span {display.length(span)} {display.unit('length')}, "
                f"{len(deck) - 1} panels")
        body.append(_text((xa + xb) / 2, yd - 3, text, size=8.5, fill="#333"))
    defs = "<defs>" + _arrow_marker("dim", "#555") + "</defs>"
    return _svg(WIDTH, height, "truss elevation shaded by lowest rating factor",
                [defs, *body], "elevation")


def _bearing(x: float, y: float, kind: str) -> str:
    """Pin bearing: a triangle; expansion (roller) bearing: a triangle on rollers."""
    tri = (f'<path d="M{_f(x)},{_f(y + 5)} L{_f(x - 8)},{_f(y + 17)} L{_f(x + 8)},{_f(y + 17)} '
           f'z" fill="#fff" stroke="#222" stroke-width="1.2"/>')
    base = y + 17
    if kind == "roller":
        extra = "".join(f'<circle cx="{_f(x + dx)}" cy="{_f(base + 3)}" r="2.6" fill="#fff" '
                        f'stroke="#222" stroke-width="1"/>' for dx in (-5, 0, 5))
        ground = base + 6
    else:
        extra = ""
        ground = base
    hatch = f'<line x1="{_f(x - 11)}" y1="{_f(ground)}" x2="{_f(x + 11)}" y2="{_f(ground)}" ' \
            'stroke="#222" stroke-width="1.2"/>'
    what = "expansion bearing (roller)" if kind == "roller" else "fixed bearing (pin)"
    return f'<g class="bearing {esc(kind)}"><title>{what}</title>{tri}{extra}{hatch}</g>'


def legend_svg(bands: RFBands | None = None) -> Markup:
    """The legend of the elevation: RF bands, pins, floorbeams, bearings."""
    bands = bands or RFBands()
    body: list[str] = []
    x = 6.0
    for b in bands.bands:
        dash = f' stroke-dasharray="{b.dash}"' if b.dash else ""
        body.append(f'<line x1="{_f(x)}" y1="11" x2="{_f(x + 26)}" y2="11" stroke="{b.colour}" '
                    f'stroke-width="{b.stroke_width:g}" stroke-linecap="round"{dash}/>')
        body.append(_text(x + 32, 14.5, b.label, size=9, anchor="start"))
        x += 36 + 6.2 * len(b.label) + 10
    y2 = 32.0
    body.append(f'<circle cx="12" cy="30" r="5" fill="{bands.bands[3].colour}" stroke="#111" '
                'stroke-width="1.2"/>')
    body.append(_text(22, y2 + 1.5, "pin rated (shaded by its lowest RF)", size=9,
                      anchor="start"))
    body.append('<rect x="215" y="26" width="8" height="8" fill="#fff" stroke="#222" '
                'stroke-width="1.2"/>')
    body.append(_text(229, y2 + 1.5, "deck panel point (floorbeam)", size=9, anchor="start"))
    body.append(_bearing(396, 20, "pin").replace("<title>fixed bearing (pin)</title>", ""))
    body.append(_text(410, y2 + 1.5, "fixed bearing", size=9, anchor="start"))
    body.append(_bearing(494, 20, "roller")
                .replace("<title>expansion bearing (roller)</title>", ""))
    body.append(_text(508, y2 + 1.5, "expansion bearing", size=9, anchor="start"))
    # (an upper joint drawn as a small hollow circle: no pin of it rated)
    body.append('<circle cx="612" cy="30" r="2.6" fill="#fff" stroke="#222" '
                'stroke-width="1"/>')
    body.append(_text(620, y2 + 1.5, "joint, no pin rated", size=9, anchor="start"))
    return _svg(WIDTH, 46, "legend: rating factor bands", body, "legend")


# ------------------------------------------------------------------ influence line

def _stagger(xs: Sequence[float], min_gap: float, step: float) -> list[float]:
    """Vertical lift of each label so that labels closer than ``min_gap`` px along x do
    not overlap: each takes the lowest level not used by a near neighbour already placed."""
    placed: list[tuple[float, int]] = []
    lifts = []
    for x in xs:
        busy = {lvl for px, lvl in placed if abs(px - x) < min_gap}
        lvl = next(k for k in range(len(xs) + 1) if k not in busy)
        placed.append((x, lvl))
        lifts.append(lvl * step)
    return lifts


def influence_svg(line: InfluenceLineData, position: Position | None,
                  vehicle: VehicleResult | None, display: Display, *,
                  deck_stations: Sequence[float] = ()) -> Markup:
    """Influence line of one member with the vehicle's axles drawn at their stations as
    arrows sized by load, the direction of travel and the lane-load segments."""
    st = np.asarray(line.stations, dtype=float)
    y = np.asarray(line.ordinates, dtype=float)
    if st.size < 2:
        return _svg(WIDTH, 40, f"influence line of {line.member} (not available)",
                    [_text(WIDTH / 2, 24, "influence line not available")], "influence")
    axle_x = np.asarray(position.axle_stations if position else (), dtype=float)
    axle_p = np.asarray(position.axle_loads if position else (), dtype=float)
    lo = float(min(st[0], axle_x.min() if axle_x.size else st[0]))
    hi = float(max(st[-1], axle_x.max() if axle_x.size else st[-1]))
    # the same values as plain floats for the drawing (numpy scalars make it slower)
    stations, ordinates = st.tolist(), y.tolist()
    axle_at, axle_load = axle_x.tolist(), axle_p.tolist()
    pad = 0.03 * (hi - lo)
    lo, hi = lo - pad, hi + pad
    left, right = 62.0, 16.0
    sx = (WIDTH - left - right) / (hi - lo)

    def X(s: float) -> float:
        return left + (s - lo) * sx

    deck_y = 120.0
    y_pos = max(float(np.max(y)), 0.0)
    y_neg = max(-float(np.min(y)), 0.0)
    room = 118.0  # px between the top and the bottom of the line
    scale_y = room / ((y_pos + y_neg) or 1.0)
    top_y = deck_y + 26.0
    zero_y = top_y + y_pos * scale_y
    sy = scale_y
    amp_top, amp_bottom = zero_y - top_y, top_y + room - zero_y

    def Y(v: float) -> float:
        return zero_y - v * sy

    body: list[str] = ["<defs>", _arrow_marker("axle", "#222"), _arrow_marker("travel", "#333"),
                       '<pattern id="lanehatch" width="6" height="6" patternUnits="userSpaceOn'
                       'Use" patternTransform="rotate(45)"><line x1="0" y1="0" x2="0" y2="6" '
                       'stroke="#6b8e23" stroke-width="2"/></pattern>', "</defs>"]
    # lane-load segments on the deck
    if position and position.lane_segments:
        for a, b in position.lane_segments:
            body.append(f'<rect class="lane" x="{_f(X(a))}" y="{_f(deck_y - 9)}" '
                        f'width="{_f(max(X(b) - X(a), 0.5))}" height="8" '
                        f'fill="url(#lanehatch)" stroke="#6b8e23" stroke-width="0.8"/>')
    # the deck and its panel points
    body.append(f'<line x1="{_f(X(stations[0]))}" y1="{_f(deck_y)}" '
                f'x2="{_f(X(stations[-1]))}" y2="{_f(deck_y)}" stroke="#222" stroke-width="2"/>')
    for s in (deck_stations or stations):
        body.append(f'<line x1="{_f(X(s))}" y1="{_f(deck_y)}" x2="{_f(X(s))}" '
                    f'y2="{_f(deck_y + 5)}" stroke="#222" stroke-width="1"/>')
    for s in (stations[0], stations[-1]):
        body.append(f'<path d="M{_f(X(s))},{_f(deck_y + 1)} l-6,10 l12,0 z" fill="#fff" '
                    f'stroke="#222" stroke-width="1"/>')
    # axles: arrows sized by load, pointing down onto the deck
    if axle_x.size:
        pmax = float(axle_p.max()) if axle_p.size else 1.0
        label_lift = _stagger([X(s) for s in axle_at], min_gap=24.0, step=9.0)
        for k, (s, p) in enumerate(zip(axle_at, axle_load, strict=False)):
            length = 14.0 + 46.0 * (p / pmax if pmax > 0 else 0.0)
            on = stations[0] - 1e-9 <= s <= stations[-1] + 1e-9
            colour = "#222" if on else "#9a9a9a"
            body.append(f'<line class="axle" x1="{_f(X(s))}" y1="{_f(deck_y - 11 - length)}" '
                        f'x2="{_f(X(s))}" y2="{_f(deck_y - 11)}" stroke="{colour}" '
                        f'stroke-width="2" marker-end="url(#axle)"><title>axle {k + 1}: '
                        f'{esc(display.force(p))} {display.unit("force")} at '
                        f'{esc(display.length(s))} {display.unit("length")}</title></line>')
            body.append(_text(X(s), deck_y - 14 - length - label_lift[k],
                              display.force(float(p)), size=8, fill=colour))
            if on:  # drop line to the influence line
                v = float(np.interp(s, st, y))
                body.append(f'<line x1="{_f(X(s))}" y1="{_f(deck_y + 2)}" x2="{_f(X(s))}" '
                            f'y2="{_f(Y(v))}" stroke="#888" stroke-width="0.7" '
                            f'stroke-dasharray="2 2"/>')
                body.append(f'<circle cx="{_f(X(s))}" cy="{_f(Y(v))}" r="2.4" fill="#222"/>')
        # direction of travel
        d = 1.0 if (position and position.direction != "reverse") else -1.0
        xa = float(axle_x.min() if d > 0 else axle_x.max())
        xb = float(axle_x.max() if d > 0 else axle_x.min())
        ty = 20.0
        x1, x2 = X(xa), X(xb) + d * 30
        x1, x2 = min(max(x1, left), WIDTH - right), min(max(x2, left), WIDTH - right)
        body.append(f'<line class="travel" x1="{_f(x1)}" y1="{_f(ty)}" x2="{_f(x2)}" '
                    f'y2="{_f(ty)}" stroke="#333" stroke-width="1.5" '
                    f'marker-end="url(#travel)"/>')
        body.append(_text((x1 + x2) / 2, ty - 5, "direction of travel", size=8.5,
                          fill="#333"))
    body.append(_text(6, deck_y - 40, f"axles ({display.unit('force')})", size=8,
                      anchor="start", fill="#555"))
    # the influence line
    xs_line, ys_line = with_zero_crossings([lo, stations[0], *stations, stations[-1], hi],
                                           [0.0, 0.0, *ordinates, 0.0, 0.0])
    pts = " ".join(f"{_f(X(a))},{_f(Y(b))}" for a, b in zip(xs_line, ys_line, strict=True))
    # (with the zero crossings among the points, clipping each point to one sign shades
    # exactly the stretch of that sign)
    pos_poly = " ".join(f"{_f(X(a))},{_f(Y(max(b, 0.0)))}" for a, b in
                        zip(xs_line, ys_line, strict=True))
    neg_poly = " ".join(f"{_f(X(a))},{_f(Y(min(b, 0.0)))}" for a, b in
                        zip(xs_line, ys_line, strict=True))
    body.append(f'<polygon points="{pos_poly}" fill="#f3c9b8" stroke="none"/>')
    body.append(f'<polygon points="{neg_poly}" fill="#c3d6ea" stroke="none"/>')
    body.append(f'<line x1="{_f(X(lo))}" y1="{_f(zero_y)}" x2="{_f(X(hi))}" y2="{_f(zero_y)}" '
                f'stroke="#555" stroke-width="0.8"/>')
    body.append(f'<polyline class="il" points="{pts}" fill="none" stroke="#222" '
                f'stroke-width="1.6"/>')
    k_max, k_min = int(np.argmax(y)), int(np.argmin(y))
    tiny = 1e-6 * float(np.max(np.abs(y)) or 1.0)
    if ordinates[k_max] > tiny:
        body.append(_text(X(stations[k_max]), Y(ordinates[k_max]) - 4,
                          display.number(ordinates[k_max], None, 3, signed=True), size=8,
                          halo=True))
    if ordinates[k_min] < -tiny:
        body.append(_text(X(stations[k_min]), Y(ordinates[k_min]) + 11,
                          display.number(ordinates[k_min], None, 3, signed=True), size=8,
                          halo=True))
    if amp_top > 8:
        body.append(_text(6, zero_y - amp_top / 2, "tension +", size=8, anchor="start",
                          fill="#8a3b1e"))
    if amp_bottom > 8:
        body.append(_text(6, zero_y + amp_bottom / 2 + 3, "compression \u2212", size=8,
                          anchor="start", fill="#2a5a8a"))
    # station ticks, below the label of the least ordinate where there is one
    ty = max(zero_y, top_y + room) + 16 + (11 if ordinates[k_min] < -tiny else 0)
    tick_top, tick_bottom, tick_text = _f(zero_y - 3), _f(zero_y + 3), _f(ty)
    for s in stations:
        x = _f(X(s))
        body.append(f'<line x1="{x}" y1="{tick_top}" x2="{x}" y2="{tick_bottom}" '
                    f'stroke="#555" stroke-width="0.8"/>')
        body.append(_text_at(x, tick_text, display.number(s, "length", 1), 7.5,
                             fill="#555"))
    body.append(_text(WIDTH - right, ty + 13, f"station ({display.unit('length')})", size=8,
                      anchor="end", fill="#555"))
    height = ty + 20
    who = vehicle.name if vehicle else "vehicle"
    return _svg(WIDTH, height, f"influence line of member {line.member} with {who}",
                body, "influence")


def with_zero_crossings(xs: list[float], ys: list[float]) -> tuple[list[float], list[float]]:
    """The points of a piecewise-linear line with a point of ordinate 0 added wherever it
    changes sign between two points (linear interpolation), so that a shape clipped to one
    sign ends where the line crosses zero."""
    out_x, out_y = [xs[0]], [ys[0]]
    for x0, y0, x1, y1 in zip(xs, ys, xs[1:], ys[1:], strict=False):
        if (y0 < 0.0 < y1) or (y1 < 0.0 < y0):
            out_x.append(x0 + (x1 - x0) * y0 / (y0 - y1))
            out_y.append(0.0)
        out_x.append(x1)
        out_y.append(y1)
    return out_x, out_y


# ------------------------------------------------------------------ pin packing

def packing_svg(pin: PinResult, display: Display) -> Markup:
    """The packing of one pin drawn to scale along the pin: plates in order with their
    thickness and the gaps between them, fillers hatched; what governs the pin marked (the
    plate whose bearing governs, else the section where flexure and shear do)."""
    rows = pin.packing
    if not rows:
        return _svg(WIDTH, 30, f"pin {pin.joint}: packing not given",
                    [_text(WIDTH / 2, 20, "packing not given")], "packing")
    total = sum(r.gap_before + r.thickness for r in rows)
    left, right = 30.0, 30.0
    s = (WIDTH - left - right) / max(total, 1e-6)
    s = min(s, 60.0)
    x = left + ((WIDTH - left - right) - total * s) / 2
    pin_y, pin_h = 92.0, 18.0
    body = ['<defs><pattern id="fillhatch" width="5" height="5" patternUnits="userSpaceOnUse" '
            'patternTransform="rotate(45)"><line x1="0" y1="0" x2="0" y2="5" stroke="#777" '
            'stroke-width="1.4"/></pattern></defs>']
    body.append(f'<rect x="{_f(x - 12)}" y="{_f(pin_y - pin_h / 2)}" '
                f'width="{_f(total * s + 24)}" height="{_f(pin_h)}" fill="#e8e8e8" '
                f'stroke="#444" stroke-width="1"/>')
    first_face = x + rows[0].gap_before * s
    plate_y, unit = _f(pin_y - 34), display.unit("dimension")
    name_y, order_y = _f(pin_y - 40), _f(pin_y + 47)
    for k, r in enumerate(rows):
        x += r.gap_before * s
        w = max(r.thickness * s, 1.0)
        fill = "url(#fillhatch)" if r.member is None else "#cfdbe6"
        name = r.member or "filler"
        body.append(f'<rect x="{_f(x)}" y="{plate_y}" width="{_f(w)}" height="68" '
                    f'fill="{fill}" stroke="#222" stroke-width="1"><title>{k + 1}: '
                    f'{esc(name)}, {esc(display.field(r, "thickness"))} '
                    f'{unit}</title></rect>')
        mid = _f(x + w / 2)
        body.append(_text_at(mid, name_y, name, 8, "start", rotate=-60))
        body.append(_text_at(mid, order_y, str(k + 1), 8, fill="#555"))
        if pin.governing_item == k + 1:  # bearing of this plate governs
            body.append(f'<rect class="governing" x="{_f(x - 2)}" y="{_f(pin_y - 36)}" '
                        f'width="{_f(w + 4)}" height="72" fill="none" stroke="#8e1b1b" '
                        f'stroke-width="2"><title>bearing governs</title></rect>')
            body.append(_text(x + w / 2, pin_y + 60, "bearing governs", size=8,
                              fill="#8e1b1b"))
        x += r.thickness * s
    z = pin.governing_z if pin.governing_z is not None else governing_z_in(
        pin.governing_section)
    if pin.governing_item is None and z is not None and 0.0 <= z <= total + 1e-9:
        gx = first_face + z * s
        body.append(f'<line class="governing" x1="{_f(gx)}" y1="{_f(pin_y - 44)}" '
                    f'x2="{_f(gx)}" y2="{_f(pin_y + 38)}" stroke="#8e1b1b" stroke-width="1.6" '
                    f'stroke-dasharray="4 2"><title>governing section</title></line>')
        body.append(_text(gx, pin_y + 60, "governing section", size=8, fill="#8e1b1b"))
    body.append(_text(WIDTH / 2, pin_y + 76,
                      f"pin {pin.joint}, diameter {display.field(pin, 'diameter')} "
                      f"{display.unit('dimension')}; plates in order along the pin "
                      f"(numbers as in the table)", size=8.5, fill="#333"))
    return _svg(WIDTH, pin_y + 84, f"packing of pin {pin.joint}", body, "packing")


_GOVERNING_Z = re.compile(r"\bz\s*=\s*([0-9]+(?:\.[0-9]+)?)\s*in\b")


def governing_z_in(text: str) -> float | None:
    """Distance of the governing section from the first plate's outer face, in, when the
    results' governing-section text gives it as "z = 1.23 in ..."; else ``None``."""
    m = _GOVERNING_Z.search(text or "")
    return float(m.group(1)) if m else None
