"""Section properties of truss members as built and after the measured section loss.

Axes are the model's (``rating.model.sections``): x lies across the truss plane (out of
plane), y lies in the truss plane. ``I_x_in4`` = integral of (y - y_c)^2 dA, the second
moment about the centroidal x axis: it resists bending that deflects the member IN the truss
plane, so ``r_x_in`` (also ``r_in_plane_in``) governs in-plane buckling. ``I_y_in4`` =
integral of (x - x_c)^2 dA; ``r_y_in`` (``r_out_of_plane_in``) governs out-of-plane buckling.

How loss is applied (each choice is listed in the report's assumptions):

* Every part is a set of rectangles (a plate is one; a channel is a web and two flanges; an
  angle is two legs). Loss is taken evenly off both faces of each rectangle, so each keeps
  its mid-line.
* ``remaining_thickness_in`` on a built-up part is the remaining thickness of its reference
  element (plate: the plate; angle: the legs; channel: the web); the depth of loss it implies
  is taken off every element of the part. ``percent_loss`` reduces every element's
  thickness by that percentage.
* Eyebars lose thickness (body or head), not width. Rods lose diameter (``percent_loss`` is
  of the diameter; ``remaining_thickness_in`` is the remaining diameter or side).
* A rolled shape given by its properties loses area in proportion to ``percent_loss``; its
  radii of gyration are kept (thin walls thinned evenly keep r).
* A loose, missing, broken or cracked bar or part is removed for the whole member; a bent
  one is flagged and not counted in compression.

Each distinct (region, station) of the loss findings is a *location*. A finding without a
station covers its whole region and acts at every location of that region.
"""

from __future__ import annotations

import dataclasses
import math
import re
from collections.abc import Iterable, Sequence
from dataclasses import dataclass

import numpy as np

from rating.errors import InputError
from rating.model import (
    CONNECTOR_WORDS,
    AnglePart,
    BarState,
    BuiltUpSection,
    ChannelPart,
    ChannelToes,
    ConnectorKind,
    EyebarSet,
    Finding,
    FindingRegion,
    Part,
    PlatePart,
    RodEnd,
    RodSet,
    RodShape,
    RolledShape,
    Section,
    connector_component,
)

REMOVING_STATES = frozenset({BarState.LOOSE, BarState.MISSING, BarState.BROKEN,
                             BarState.CRACKED})
"""Bar states that take a bar out of the load path (common practice)."""

THREADED_ROOT_AREA_RATIO = 0.75
"""Root area / body area assumed for a threaded rod whose root diameter is not recorded.

AISC 360-10 Table J3.2, threaded parts: nominal tensile stress 0.75 F_u on the body area.
[value from memory]
"""

_BAR_RE = re.compile(r"^\s*(?:bar|eyebar|rod)\s*#?\s*(\d+)\s*$", re.IGNORECASE)
_STATION_TOL_FT = 1e-6


# --------------------------------------------------------------------------------------------
# rectangles and their properties
# --------------------------------------------------------------------------------------------


@dataclass(frozen=True)
class Rect:
    """One rectangle of a built-up part.

    ``bx_in`` is its extent along x, ``by_in`` along y, centred on (``cx_in``, ``cy_in``).
    ``thick_along_x`` says which extent is the thickness (loss reduces that one).
    ``b_in``/``t_in`` are the width and thickness used in the width-thickness ratio;
    ``stiffened`` is True for an element supported along both edges (web, plate).
    """

    part: str
    element: str
    cx_in: float
    cy_in: float
    bx_in: float
    by_in: float
    thick_along_x: bool
    b_in: float
    t_in: float
    stiffened: bool

    @property
    def area_in2(self) -> float:
        return self.bx_in * self.by_in

    def thinned(self, t_new: float) -> Rect:
        """The same rectangle with thickness ``t_new`` (mid-line kept)."""
        # the constructor directly: dataclasses.replace costs several times more
        if self.thick_along_x:
            return Rect(self.part, self.element, self.cx_in, self.cy_in, t_new, self.by_in,
                        True, self.b_in, t_new, self.stiffened)
        return Rect(self.part, self.element, self.cx_in, self.cy_in, self.bx_in, t_new,
                    False, self.b_in, t_new, self.stiffened)


@dataclass(frozen=True)
class AreaProperties:
    """Area, centroid and second moments of a set of rectangles (in, in^2, in^4).

    ``I_x_in4`` about the centroidal x axis (in-plane buckling), ``I_y_in4`` about the
    centroidal y axis (out-of-plane buckling), ``I_xy_in4`` the product of inertia;
    ``y_top_in``/``y_bottom_in`` and ``x_left_in``/``x_right_in`` the extreme fibres (for the
    section modulus and the section's symmetry).
    """

    A_in2: float
    x_c_in: float
    y_c_in: float
    I_x_in4: float
    I_y_in4: float
    I_xy_in4: float
    y_top_in: float = 0.0
    y_bottom_in: float = 0.0
    x_left_in: float = 0.0
    x_right_in: float = 0.0

    def symmetry(self, tol: float = 1e-3) -> str:
        """"doubly symmetric", "singly symmetric" or "unsymmetric": by where the centroid
        lies between the extreme fibres in each direction (within ``tol`` of the depth or
        width) and the product of inertia (common practice as a screen: a section with its
        centroid midway between its fibres is taken as symmetric about that axis)."""
        about_x = abs(self.y_c_in - 0.5 * (self.y_top_in + self.y_bottom_in)) <= tol * max(
            self.y_top_in - self.y_bottom_in, 1e-12)
        about_y = abs(self.x_c_in - 0.5 * (self.x_left_in + self.x_right_in)) <= tol * max(
            self.x_right_in - self.x_left_in, 1e-12)
        if abs(self.I_xy_in4) > tol * max(self.I_x_in4, self.I_y_in4, 1e-12):
            return "unsymmetric"
        return ("doubly symmetric" if about_x and about_y else
                "singly symmetric" if about_x or about_y else "unsymmetric")

    @property
    def S_x_in3(self) -> float:
        """The least elastic section modulus about the centroidal x axis (bending in the truss
        plane), I_x / c to the farther extreme fibre (common practice)."""
        c = max(self.y_top_in - self.y_c_in, self.y_c_in - self.y_bottom_in)
        return self.I_x_in4 / c if c > 0.0 else 0.0

    @property
    def S_y_in3(self) -> float:
        """The least elastic section modulus about the centroidal y axis (bending out of the
        truss plane), I_y / c to the farther extreme fibre (common practice)."""
        c = max(self.x_right_in - self.x_c_in, self.x_c_in - self.x_left_in)
        return self.I_y_in4 / c if c > 0.0 else 0.0

    @property
    def r_x_in(self) -> float:
        return math.sqrt(self.I_x_in4 / self.A_in2) if self.A_in2 > 0 else 0.0

    @property
    def r_y_in(self) -> float:
        return math.sqrt(self.I_y_in4 / self.A_in2) if self.A_in2 > 0 else 0.0

    @property
    def r_min_in(self) -> float:
        """Least radius of gyration about a principal axis."""
        if self.A_in2 <= 0:
            return 0.0
        avg = 0.5 * (self.I_x_in4 + self.I_y_in4)
        dif = math.hypot(0.5 * (self.I_x_in4 - self.I_y_in4), self.I_xy_in4)
        return math.sqrt(max(avg - dif, 0.0) / self.A_in2)


def area_properties(rects: Sequence[Rect]) -> AreaProperties:
    """Area, centroid and second moments by the parallel-axis theorem (rectangles b h^3/12).

    Parallel-axis theorem, I = sum(I_own + A d^2), closed form. [common practice]
    """
    if not rects:
        return AreaProperties(0.0, 0.0, 0.0, 0.0, 0.0, 0.0)
    # a handful of rectangles: plain arithmetic (array set-up would cost more than the sums);
    # math.fsum is exact, so the sums do not depend on the order of the terms
    A = [r.bx_in * r.by_in for r in rects]
    At = math.fsum(A)
    if At <= 0.0:
        return AreaProperties(0.0, 0.0, 0.0, 0.0, 0.0, 0.0)
    pairs = list(zip(A, rects, strict=True))
    xc = math.fsum([a * r.cx_in for a, r in pairs]) / At
    yc = math.fsum([a * r.cy_in for a, r in pairs]) / At
    parts_x, parts_y, parts_xy = [], [], []
    for a, r in pairs:
        dx, dy = r.cx_in - xc, r.cy_in - yc
        bx, by = r.bx_in, r.by_in
        parts_x.append(bx * by**3 / 12.0 + a * dy**2)
        parts_y.append(by * bx**3 / 12.0 + a * dx**2)
        parts_xy.append(a * dx * dy)
    return AreaProperties(At, xc, yc, math.fsum(parts_x), math.fsum(parts_y),
                          math.fsum(parts_xy), max(r.cy_in + 0.5 * r.by_in for r in rects),
                          min(r.cy_in - 0.5 * r.by_in for r in rects),
                          min(r.cx_in - 0.5 * r.bx_in for r in rects),
                          max(r.cx_in + 0.5 * r.bx_in for r in rects))


def rect_extent(r: Rect) -> tuple[float, float, float, float]:
    """(x low, x high, y low, y high) of a rectangle."""
    return (r.cx_in - 0.5 * r.bx_in, r.cx_in + 0.5 * r.bx_in,
            r.cy_in - 0.5 * r.by_in, r.cy_in + 0.5 * r.by_in)


def touched_faces(r: Rect, rects: Sequence[Rect], tol_in: float = 1e-6) -> tuple[bool, bool]:
    """Whether another of ``rects`` shares a stretch of ``r``'s low and of its high
    thickness face (riveted to it, or the same part's next element), in that order."""
    x0, x1, y0, y1 = rect_extent(r)
    low = high = False
    for o in rects:
        if o is r:
            continue
        a0, a1, b0, b1 = rect_extent(o)
        if r.thick_along_x:
            if min(y1, b1) - max(y0, b0) <= tol_in:
                continue
            low = low or abs(a1 - x0) <= tol_in
            high = high or abs(a0 - x1) <= tol_in
        else:
            if min(x1, a1) - max(x0, a0) <= tol_in:
                continue
            low = low or abs(b1 - y0) <= tol_in
            high = high or abs(b0 - y1) <= tol_in
    return low, high


def _kept_against(r: Rect, t_new: float, faces: tuple[bool, bool]) -> Rect:
    """``r`` thinned to ``t_new`` for the torsion analysis: a rectangle that touches the rest
    of the section on one thickness face only keeps that face (its loss taken off the free
    face), so that the parts stay joined; otherwise its mid-line is kept, as for the other
    properties. The area is the same either way; the centroid moves by at most half the loss
    (common practice: loss is on the exposed faces)."""
    low, high = faces
    thin = r.thinned(t_new)
    if low == high:
        return thin
    shift = 0.5 * (r.t_in - t_new) * (1.0 if high else -1.0)
    if r.thick_along_x:
        return dataclasses.replace(thin, cx_in=r.cx_in + shift)
    return dataclasses.replace(thin, cy_in=r.cy_in + shift)


def _rects_area_in2(rects: Sequence[Rect]) -> float:
    """``area_properties(rects).A_in2`` without the centroid and second moments."""
    At = math.fsum([r.bx_in * r.by_in for r in rects])
    return 0.0 if At <= 0.0 else At


def part_reference_thickness_in(part: Part) -> float:
    """The thickness a ``remaining_thickness_in`` on this part refers to."""
    if isinstance(part, ChannelPart):
        return part.web_thickness_in
    return part.thickness_in


def part_rectangles(part: Part) -> tuple[Rect, ...]:
    """Decompose a plate, channel or angle into rectangles in the member's x-y plane."""
    if isinstance(part, PlatePart):
        if part.vertical:
            return (Rect(part.label, "plate", part.x_in, part.y_in, part.thickness_in,
                         part.width_in, True, part.width_in, part.thickness_in, True),)
        return (Rect(part.label, "plate", part.x_in, part.y_in, part.width_in,
                     part.thickness_in, False, part.width_in, part.thickness_in, True),)
    if isinstance(part, ChannelPart):
        d, bf, tw, tf = (part.depth_in, part.flange_width_in, part.web_thickness_in,
                         part.flange_thickness_in)
        x, y = part.x_in, part.y_in
        h_web = d - 2.0 * tf
        out = bf - tw  # flange length beyond the web
        if part.toes in (ChannelToes.RIGHT, ChannelToes.LEFT):
            s = 1.0 if part.toes is ChannelToes.RIGHT else -1.0
            web = Rect(part.label, "web", x + s * tw / 2, y, tw, d, True, h_web, tw, True)
            fx = x + s * (tw + out / 2)
            f1 = Rect(part.label, "flange 1", fx, y + d / 2 - tf / 2, out, tf, False, bf, tf,
                      False)
            f2 = Rect(part.label, "flange 2", fx, y - d / 2 + tf / 2, out, tf, False, bf, tf,
                      False)
        else:
            s = 1.0 if part.toes is ChannelToes.UP else -1.0
            web = Rect(part.label, "web", x, y + s * tw / 2, d, tw, False, h_web, tw, True)
            fy = y + s * (tw + out / 2)
            f1 = Rect(part.label, "flange 1", x + d / 2 - tf / 2, fy, tf, out, True, bf, tf,
                      False)
            f2 = Rect(part.label, "flange 2", x - d / 2 + tf / 2, fy, tf, out, True, bf, tf,
                      False)
        return (web, f1, f2)
    # angle: heel corner at (x, y)
    t, sx, sy = part.thickness_in, float(part.x_sign), float(part.y_sign)
    leg_x = Rect(part.label, "leg x", part.x_in + sx * part.leg_x_in / 2,
                 part.y_in + sy * t / 2, part.leg_x_in, t, False, part.leg_x_in, t, False)
    ly = part.leg_y_in - t
    leg_y = Rect(part.label, "leg y", part.x_in + sx * t / 2, part.y_in + sy * (t + ly / 2),
                 t, ly, True, part.leg_y_in, t, False)
    return (leg_x, leg_y)


# --------------------------------------------------------------------------------------------
# validation of the as-built section
# --------------------------------------------------------------------------------------------


def _pos(value: float | None, what: str, member: str, where: str, of: str = "") -> float:
    """``value`` as a float if it is a positive number; ``of`` prefixes ``what`` in the message."""
    if value is None or not isinstance(value, int | float) or not math.isfinite(value) \
            or value <= 0:
        # the message is built on failure only (validation runs for every member)
        name = f"{of} {what}" if of else what
        raise InputError(f"member {member}: {name} must be a positive number, got {value!r}",
                         where or None)
    return float(value)


def _rolled_torsion_valid(section: RolledShape, member: str, where: str) -> None:
    """A rolled shape's least radius and torsion properties, where given: positive (C_w,
    x_o and y_o at least zero), r_z the least radius, x_o and y_o with J."""
    if section.r_z_in is not None:
        rz = _pos(section.r_z_in, "rolled shape r_z (in)", member, where)
        if rz > min(section.r_x_in, section.r_y_in) * (1.0 + 1e-3) + 1e-6:
            raise InputError(f"member {member}: rolled shape r_z {rz:g} in exceeds r_x or "
                             "r_y; r_z is the least radius of gyration", where or None)
    if section.r_z_in is None and section.x_o_in and section.y_o_in:
        raise InputError(f"member {member}: rolled shape with its shear centre off both x and "
                         "y (an angle) given without its least radius r_z", where or None)
    if section.J_in4 is None:
        if section.C_w_in6 is not None:
            raise InputError(f"member {member}: rolled shape C_w given without J",
                             where or None)
        return
    _pos(section.J_in4, "rolled shape J (in4)", member, where)
    for name, v in (("C_w (in6)", section.C_w_in6), ("x_o (in)", section.x_o_in),
                    ("y_o (in)", section.y_o_in)):
        if v is None and name.startswith("C_w"):
            continue
        if v is None or not isinstance(v, int | float) or not math.isfinite(v) or v < 0:
            raise InputError(f"member {member}: rolled shape {name} must be a number of at "
                             f"least zero with J, got {v!r}", where or None)


def validate_section(section: Section, member: str, where: str = "") -> None:
    """Refuse dimensions that cannot describe a real section (negative, zero, inconsistent)."""
    if isinstance(section, EyebarSet):
        if not isinstance(section.count, int) or section.count < 1:
            raise InputError(f"member {member}: eyebar count must be a whole number of at "
                             f"least 1, got {section.count!r}", where or None)
        _pos(section.width_in, "eyebar body width (in)", member, where)
        _pos(section.thickness_in, "eyebar thickness (in)", member, where)
        d = _pos(section.pin_hole_diameter_in, "pin-hole diameter (in)", member, where)
        D = _pos(section.head_diameter_in, "eyebar head diameter (in)", member, where)
        if section.head_thickness_in is not None:
            _pos(section.head_thickness_in, "eyebar head thickness (in)", member, where)
        if D <= d:
            raise InputError(f"member {member}: eyebar head diameter {D:g} in is not larger "
                             f"than the pin hole {d:g} in", where or None)
        if section.head_beyond_hole_in is not None:
            a = _pos(section.head_beyond_hole_in, "head distance beyond the hole (in)",
                     member, where)
            if a > D - d:
                raise InputError(f"member {member}: head distance beyond the hole {a:g} in "
                                 f"exceeds the head diameter less the hole {D - d:g} in",
                                 where or None)
    elif isinstance(section, RodSet):
        if not isinstance(section.count, int) or section.count < 1:
            raise InputError(f"member {member}: rod count must be a whole number of at least "
                             f"1, got {section.count!r}", where or None)
        d = _pos(section.diameter_in, "rod diameter (in)", member, where)
        if section.root_diameter_in is not None:
            r = _pos(section.root_diameter_in, "rod thread root diameter (in)", member, where)
            if section.end is RodEnd.THREADED and r > d:
                raise InputError(f"member {member}: thread root diameter {r:g} in exceeds "
                                 f"the rod diameter {d:g} in of a plain threaded rod",
                                 where or None)
    elif isinstance(section, BuiltUpSection):
        _validated_rectangles(section, member, where)
    elif isinstance(section, RolledShape):
        A = _pos(section.area_in2, "rolled shape area (in2)", member, where)
        _pos(section.r_x_in, "rolled shape r_x (in)", member, where)
        _pos(section.r_y_in, "rolled shape r_y (in)", member, where)
        _rolled_torsion_valid(section, member, where)
        if section.net_area_in2 is not None:
            An = _pos(section.net_area_in2, "rolled shape net area (in2)", member, where)
            if An > A:
                raise InputError(f"member {member}: net area {An:g} in2 exceeds the gross "
                                 f"area {A:g} in2", where or None)
        if not (0.0 < section.shear_lag_U <= 1.0):
            raise InputError(f"member {member}: shear lag factor U must be in (0, 1], got "
                             f"{section.shear_lag_U!r}", where or None)
    else:
        raise InputError(f"member {member}: unknown section type {type(section).__name__}",
                         where or None)


def _validated_rectangles(section: BuiltUpSection, member: str,
                          where: str) -> tuple[tuple[Rect, ...], ...]:
    """``validate_section`` of a built-up section; the rectangles of each part, as built."""
    if not section.parts:
        raise InputError(f"member {member}: built-up section has no parts", where or None)
    labels: set[str] = set()
    for p in section.parts:
        key = p.label.strip().lower()
        if not key:
            raise InputError(f"member {member}: a part of the built-up section has no "
                             "label", where or None)
        if key in labels:
            raise InputError(f"member {member}: part label {p.label!r} is used twice",
                             where or None)
        labels.add(key)
        what = f"part {p.label}"
        for name in ("x_in", "y_in"):
            v = getattr(p, name)
            if not isinstance(v, int | float) or not math.isfinite(v):
                raise InputError(f"member {member}: {what} position {name} is not a "
                                 "finite number", where or None)
        if isinstance(p, PlatePart):
            _pos(p.width_in, "width (in)", member, where, what)
            _pos(p.thickness_in, "thickness (in)", member, where, what)
        elif isinstance(p, ChannelPart):
            d = _pos(p.depth_in, "depth (in)", member, where, what)
            bf = _pos(p.flange_width_in, "flange width (in)", member, where, what)
            tw = _pos(p.web_thickness_in, "web thickness (in)", member, where, what)
            tf = _pos(p.flange_thickness_in, "flange thickness (in)", member, where,
                      what)
            if 2 * tf >= d or tw >= bf:
                raise InputError(f"member {member}: {what} channel dimensions are "
                                 "inconsistent (flanges thicker than half the depth or "
                                 "web thicker than the flange width)", where or None)
        else:
            lx = _pos(p.leg_x_in, "leg along x (in)", member, where, what)
            ly = _pos(p.leg_y_in, "leg along y (in)", member, where, what)
            t = _pos(p.thickness_in, "thickness (in)", member, where, what)
            if t >= min(lx, ly):
                raise InputError(f"member {member}: {what} angle thickness {t:g} in is "
                                 "not less than its legs", where or None)
            if p.x_sign not in (1, -1) or p.y_sign not in (1, -1):
                raise InputError(f"member {member}: {what} leg directions must be +1 or "
                                 "-1", where or None)
    if section.hole_diameter_in < 0 or section.holes_per_section < 0:
        raise InputError(f"member {member}: rivet hole diameter and count cannot be "
                         "negative", where or None)
    if not (0.0 < section.shear_lag_U <= 1.0):
        raise InputError(f"member {member}: shear lag factor U must be in (0, 1], got "
                         f"{section.shear_lag_U!r}", where or None)
    c = section.connectors
    if c is not None:
        if c.spacing_in is not None:
            _pos(c.spacing_in, "connector spacing (in)", member, where)
        if c.r_i_in is not None:
            _pos(c.r_i_in, "component radius of gyration r_i (in)", member, where)
    by_part = tuple(part_rectangles(p) for p in section.parts)
    rects = [r for rs in by_part for r in rs]
    _no_overlap(rects, member, where)
    Ag = _rects_area_in2(rects)
    t_h = max(r.t_in for r in rects)
    if section.holes_per_section * section.hole_diameter_in * t_h >= Ag:
        raise InputError(f"member {member}: the rivet holes ({section.holes_per_section} "
                         f"x {section.hole_diameter_in:g} in) remove the whole section",
                         where or None)
    return by_part


def _no_overlap(rects: Sequence[Rect], member: str, where: str,
                tol_in: float = 1e-3) -> None:
    """Two parts cannot share metal: an overlap (a position or a leg mistyped) would count
    its area twice, so it is refused, naming the parts and how far they overlap."""
    ext = [rect_extent(r) for r in rects]
    for i, (a0, a1, b0, b1) in enumerate(ext):
        for j in range(i + 1, len(ext)):
            c0, c1, d0, d1 = ext[j]
            over_x = min(a1, c1) - max(a0, c0)
            over_y = min(b1, d1) - max(b0, d0)
            if over_x > tol_in and over_y > tol_in:
                p, q = rects[i], rects[j]
                raise InputError(
                    f"member {member}: parts {p.part} ({p.element}) and {q.part} "
                    f"({q.element}) overlap by {over_x:.3g} in x {over_y:.3g} in; two parts "
                    "cannot share metal (its area would count twice): check their positions "
                    "and sizes", where or None)


# --------------------------------------------------------------------------------------------
# as-built areas
# --------------------------------------------------------------------------------------------


def rod_area_in2(diameter_in: float | np.ndarray, shape: RodShape = RodShape.ROUND):
    """Area of a round (pi d^2 / 4) or square (d^2) rod. [closed form]"""
    if shape is RodShape.SQUARE:
        return np.asarray(diameter_in) ** 2 if isinstance(diameter_in, np.ndarray) \
            else diameter_in**2
    return math.pi / 4.0 * (np.asarray(diameter_in) ** 2 if isinstance(diameter_in, np.ndarray)
                            else diameter_in**2)


def gross_area_as_built_in2(section: Section) -> float:
    """Gross area of the whole member as built (all bars and parts), in^2, for self-weight."""
    if isinstance(section, EyebarSet):
        return section.count * section.width_in * section.thickness_in
    if isinstance(section, RodSet):
        return section.count * float(rod_area_in2(section.diameter_in, section.shape))
    if isinstance(section, BuiltUpSection):
        return _rects_area_in2([r for p in section.parts for r in part_rectangles(p)])
    return section.area_in2


# --------------------------------------------------------------------------------------------
# locations and the section at each
# --------------------------------------------------------------------------------------------


@dataclass(frozen=True)
class Location:
    """Where along the member a set of properties holds.

    ``region`` None is the member as built apart from removed bars (the baseline);
    ``station_ft`` None means the finding(s) cover the whole length of the region.
    ``findings`` act here, the one removing most thickness first, removed-bar findings last.
    """

    region: FindingRegion | None = None
    station_ft: float | None = None
    findings: tuple[Finding, ...] = ()

    @property
    def finding(self) -> Finding | None:
        """The finding that makes this location what it is (None: as built)."""
        return self.findings[0] if self.findings else None

    def describe(self) -> str:
        if self.region is None:
            base = "whole member"
        elif self.station_ft is None:
            base = f"{self.region.value}, whole length"
        else:
            base = f"{self.region.value} at {self.station_ft:g} ft"
        f = self.finding
        if f is not None and f.where:
            base += f" ({f.where})"
        return base


@dataclass(frozen=True)
class EyebarAtLocation:
    """One load-carrying eyebar at a location (in)."""

    label: str
    width_in: float  # body width used in calculation (<= 8 t as built)
    thickness_in: float  # body thickness here
    head_thickness_in: float  # head thickness here
    head_diameter_in: float
    hole_diameter_in: float
    beyond_hole_in: float  # distance from hole edge to head edge along the bar

    @property
    def body_area_in2(self) -> float:
        return self.width_in * self.thickness_in

    @property
    def through_hole_area_in2(self) -> float:
        """Net section of the head through the pin hole, both sides: (D_h - d) t_h."""
        return (self.head_diameter_in - self.hole_diameter_in) * self.head_thickness_in

    @property
    def beyond_hole_area_in2(self) -> float:
        """Net section of the head beyond the hole, along the bar: a t_h."""
        return self.beyond_hole_in * self.head_thickness_in

    @property
    def side_edge_in(self) -> float:
        """Distance from hole edge to head edge square to the force (concentric head)."""
        return (self.head_diameter_in - self.hole_diameter_in) / 2.0


@dataclass(frozen=True)
class RodAtLocation:
    """One load-carrying rod at a location (in)."""

    label: str
    body_diameter_in: float
    end_diameter_in: float  # thread root (threaded, or upset when recorded) or body
    shape: RodShape

    @property
    def body_area_in2(self) -> float:
        return float(rod_area_in2(self.body_diameter_in, self.shape))

    @property
    def end_area_in2(self) -> float:
        return float(rod_area_in2(self.end_diameter_in, self.shape))


@dataclass(frozen=True)
class ElementAtLocation:
    """A plate element for the width-thickness check: b, t after loss (in)."""

    part: str
    element: str
    b_in: float
    t_in: float
    stiffened: bool


@dataclass(frozen=True)
class SectionAtLocation:
    """Properties of what is left at one location.

    ``A_g_in2``: gross area of the load-carrying material (eyebars and rods: the body).
    ``A_n_in2``: net area for fracture (built-up: rivet holes deducted; rolled: the net area;
    eyebars: the head through the pin hole; rods: the end (root) area).
    ``r_x_in``: in-plane radius of gyration; ``r_y_in``: out-of-plane (see module doc).
    ``modified_axis``: "x" or "y", the axis on which the connectors work (built-up laced or
    battened members), else None. ``r_i_in``: least r of one component between connectors.
    ``torsion_rects``: a built-up section's rectangles for its torsion and warping analysis
    (``rating.capacity.torsion``): as ``properties``, except that a thinned rectangle riveted
    to another part on one face only keeps that face (see ``_kept_against``).
    ``r_z_in``: a rolled shape's least radius about a principal axis where x and y are not
    principal (None: they are). ``torsion_tabulated``: a rolled shape's (J in4, C_w in6, x_o
    in, y_o in) after the loss, where given; ``rolled_symmetry`` its symmetry
    (rating.model.RolledShape.symmetry).
    """

    location: Location
    A_g_in2: float
    A_n_in2: float
    r_x_in: float = 0.0
    r_y_in: float = 0.0
    properties: AreaProperties | None = None
    eyebars: tuple[EyebarAtLocation, ...] = ()
    rods: tuple[RodAtLocation, ...] = ()
    elements: tuple[ElementAtLocation, ...] = ()
    r_i_in: float | None = None
    modified_axis: str | None = None
    shear_lag_U: float = 1.0
    torsion_rects: tuple[Rect, ...] = ()
    r_z_in: float | None = None
    torsion_tabulated: tuple[float, float, float, float] | None = None
    rolled_symmetry: str = ""

    @property
    def r_in_plane_in(self) -> float:
        return self.r_x_in

    @property
    def r_out_of_plane_in(self) -> float:
        return self.r_y_in

    @property
    def r_least_in(self) -> float:
        r = min(self.r_x_in, self.r_y_in)
        return r if self.r_z_in is None else min(r, self.r_z_in)


@dataclass(frozen=True)
class SectionReport:
    """Section as built and at every location, for tension and for compression.

    ``tension[0]`` and ``compression[0]`` are the baseline (whole member, removed bars out).
    ``compression`` is empty for eyebars and rods (they carry no compression).
    ``removed`` and ``bent`` list (component, finding). ``carrying_count`` counts the bars or
    parts that still carry load.
    """

    member: str
    section: Section
    kind: str
    as_built: SectionAtLocation
    tension: tuple[SectionAtLocation, ...]
    compression: tuple[SectionAtLocation, ...]
    removed: tuple[tuple[str, Finding], ...]
    bent: tuple[tuple[str, Finding], ...]
    carrying_count: int
    total_count: int
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...]
    # findings on a built-up member's lacing or battens (not a part: they change how the
    # parts act together, rating.capacity.compression), in the order recorded
    connector_findings: tuple[Finding, ...] = ()

    @property
    def connectors_defective(self) -> tuple[Finding, ...]:
        """The connector findings that leave the lacing or battens out of action: a bar
        loose, missing, broken, cracked or bent."""
        return tuple(f for f in self.connector_findings
                     if f.bar_state in REMOVING_STATES or f.bar_state is BarState.BENT)


def section_kind(section: Section) -> str:
    if isinstance(section, EyebarSet):
        return "eyebar set"
    if isinstance(section, RodSet):
        return "rod set"
    if isinstance(section, BuiltUpSection):
        return "built-up"
    return "rolled shape"


def describe_finding(f: Finding) -> str:
    """Short words for a finding in a message: component, region and station."""
    at = f" at {f.station_ft:g} ft" if f.station_ft is not None else ""
    return f"finding on {f.component!r} ({f.region.value}{at})"


def _err(member: str, f: Finding, text: str) -> InputError:
    return InputError(f"member {member}, {describe_finding(f)}: {text}", f.where or None)


@dataclass(frozen=True)
class _Loss:
    """One section-loss finding as applied to a member: the components it names, its normalised
    region, its station (ft; None: the whole region) and the fraction of reference thickness
    left (for ordering)."""

    finding: Finding
    components: tuple[str, ...]  # resolved component keys
    region: FindingRegion  # normalised region
    station_ft: float | None
    fraction_left: float  # remaining / reference (for ordering)


def _components(section: Section, member: str) -> dict[str, str]:
    """Lower-case key -> display name of every component a finding may name."""
    if isinstance(section, EyebarSet | RodSet):
        word = "bar" if isinstance(section, EyebarSet) else "rod"
        return {f"bar {i}": f"{word} {i}" for i in range(1, section.count + 1)}
    if isinstance(section, BuiltUpSection):
        return {p.label.strip().lower(): p.label for p in section.parts}
    return {section.designation.strip().lower() or "shape": section.designation or "shape"}


def _resolve(section: Section, member: str, f: Finding) -> tuple[str, ...]:
    comps = _components(section, member)
    name = (f.component or "all").strip()
    if name.lower() in ("all", ""):
        return tuple(comps)
    if isinstance(section, EyebarSet | RodSet):
        m = _BAR_RE.match(name)
        if m and f"bar {int(m.group(1))}" in comps:
            return (f"bar {int(m.group(1))}",)
        word = "bars" if isinstance(section, EyebarSet) else "rods"
        raise _err(member, f, f"there is no component {name!r}; this member has {word} 1 to "
                              f"{len(comps)} (name one as '{word[:-1]} 2', or 'all')")
    key = name.lower()
    if key in comps:
        return (key,)
    known = ", ".join(repr(v) for v in comps.values())
    raise _err(member, f, f"there is no component {name!r} in this section (parts: {known}, "
                          "or 'all')")


def _normal_region(section: Section, member: str, f: Finding) -> FindingRegion:
    r = f.region
    if isinstance(section, EyebarSet):
        if r is FindingRegion.THREAD:
            raise _err(member, f, "an eyebar has no thread; record the loss at the body or "
                                  "the head")
        return FindingRegion.HEAD if r is FindingRegion.CONNECTION else r
    if isinstance(section, RodSet):
        return FindingRegion.BODY if r is FindingRegion.BODY else FindingRegion.THREAD
    if r in (FindingRegion.HEAD, FindingRegion.THREAD):
        raise _err(member, f, f"a {section_kind(section)} member has no {r.value}; record the "
                              "loss at the body or the connection")
    return r


def _reference_thickness(section: Section, comp: str, region: FindingRegion) -> float:
    """The as-built dimension a remaining thickness on ``comp`` in ``region`` refers to."""
    if isinstance(section, EyebarSet):
        if region is FindingRegion.HEAD:
            return section.head_thickness_in or section.thickness_in
        return section.thickness_in
    if isinstance(section, RodSet):
        if region is FindingRegion.BODY:
            return section.diameter_in
        return _end_diameter(section)
    if isinstance(section, BuiltUpSection):
        part = next(p for p in section.parts if p.label.strip().lower() == comp)
        return part_reference_thickness_in(part)
    raise AssertionError("rolled shapes take percent loss only")  # pragma: no cover


def _end_diameter(section: RodSet) -> float:
    """Diameter that governs the rod end (as built)."""
    if section.root_diameter_in is not None:
        return section.root_diameter_in
    if section.end is RodEnd.THREADED:
        return section.diameter_in * math.sqrt(THREADED_ROOT_AREA_RATIO)
    return section.diameter_in


def _check_loss(section: Section, member: str, f: Finding, comps: tuple[str, ...],
                region: FindingRegion, warnings: list[str]) -> float:
    """Validate the loss values of ``f``; return the fraction of thickness left (ordering)."""
    rem, pct = f.remaining_thickness_in, f.percent_loss
    for name, v in (("remaining thickness", rem), ("percent loss", pct)):
        if v is not None and (not isinstance(v, int | float) or not math.isfinite(v)):
            raise _err(member, f, f"{name} {v!r} is not a number")
    if pct is not None:
        if pct < 0:
            raise _err(member, f, f"percent loss {pct:g}% is negative")
        if pct > 100:
            raise _err(member, f, f"percent loss {pct:g}% is more than the whole thickness")
    if rem is not None and rem < 0:
        raise _err(member, f, f"remaining thickness {rem:g} in is negative")
    if isinstance(section, RolledShape):
        if rem is not None and pct is None:
            raise _err(member, f, "a rolled shape is given by its properties only; record the "
                                  "loss as a percent of thickness, not a remaining thickness")
        return 1.0 - (pct or 0.0) / 100.0
    if rem is None:
        return 1.0 - (pct or 0.0) / 100.0
    refs = {_reference_thickness(section, c, region) for c in comps}
    if len(refs) > 1:
        shown = ", ".join(f"{t:g}" for t in sorted(refs))
        raise _err(member, f, f"a remaining thickness for several parts of different thickness "
                              f"({shown} in) is ambiguous; give a percent loss or name one part")
    t_ref = refs.pop()
    what = "diameter" if isinstance(section, RodSet) else "thickness"
    if rem > t_ref * (1 + 1e-9):
        warnings.append(f"member {member}: {describe_finding(f)} records a remaining {what} of "
                        f"{rem:g} in, more than the {t_ref:g} in as built; no loss is taken "
                        "there (check the record)")
        rem = t_ref
    if pct is not None and abs(t_ref * (1 - pct / 100.0) - rem) > 0.02 * t_ref + 0.005:
        raise _err(member, f, f"the remaining {what} {rem:g} in and the percent loss {pct:g}% "
                              f"disagree for the {t_ref:g} in as built; give one of them")
    return rem / t_ref


def _left(t_elem: float, t_ref: float, f: Finding) -> float:
    """Thickness of an element after finding ``f`` (depth of loss, or percent)."""
    if f.remaining_thickness_in is not None:
        depth = max(t_ref - min(f.remaining_thickness_in, t_ref), 0.0)
        return max(t_elem - depth, 0.0)
    return t_elem * (1.0 - (f.percent_loss or 0.0) / 100.0)


END_REGION = 0.25
"""A head, thread or connection finding further than this fraction of the member's length from
both ends is said to be out of place (a head is at an end; common practice)."""


def section_properties(section: Section, *, member: str, findings: Sequence[Finding] = (),
                       length_ft: float | None = None, where: str = "") -> SectionReport:
    """Properties of the section as built and at every location of the loss findings.

    Closed-form section properties (rectangles, parallel-axis theorem). [common practice]
    """
    if isinstance(section, BuiltUpSection):
        work: _BuiltUpWork | None = _BuiltUpWork(section,
                                                 _validated_rectangles(section, member, where))
    else:
        validate_section(section, member, where)
        work = None
    warnings: list[str] = []
    assumptions: list[str] = []
    comps = _components(section, member)
    removed: dict[str, Finding] = {}
    bent: dict[str, Finding] = {}
    losses: list[_Loss] = []
    joined: list[Finding] = []  # on the lacing or battens
    for f in findings:
        if f.member != member:
            raise _err(member, f, f"the finding belongs to member {f.member!r}, not {member!r}")
        if f.station_ft is not None:
            if not isinstance(f.station_ft, int | float) or not math.isfinite(f.station_ft) \
                    or f.station_ft < -_STATION_TOL_FT or (
                        length_ft is not None and f.station_ft > length_ft + _STATION_TOL_FT):
                span = f"0 to {length_ft:g} ft" if length_ft is not None else "0 or more"
                raise _err(member, f, f"station {f.station_ft!r} ft is off the member "
                                      f"(stations run {span} from its start joint)")
            if (length_ft and f.region is not FindingRegion.BODY
                    and min(f.station_ft, length_ft - f.station_ft) > END_REGION * length_ft):
                warnings.append(
                    f"member {member}: a finding at its {f.region.value} "
                    f"({f.where or describe_finding(f)}) is {f.station_ft:g} ft along the "
                    f"{length_ft:g} ft member, far from both ends, where a head, thread or "
                    "connection is: it is rated as recorded (at that end region's check), so "
                    "check its region and its station")
        if isinstance(section, BuiltUpSection) and (f.component or "").strip().lower() \
                not in comps and connector_component(section.connectors, f.component or ""):
            joined.append(f)
            continue
        cs = _resolve(section, member, f)
        if f.bar_state in REMOVING_STATES:
            for c in cs:
                removed.setdefault(c, f)
            continue
        if f.bar_state is BarState.BENT:
            for c in cs:
                bent.setdefault(c, f)
        if f.pack_rust:
            warnings.append(f"member {member}: pack rust recorded ({describe_finding(f)}); "
                            "it can spread and bend the bars or parts; check for distortion")
        if f.remaining_thickness_in is None and f.percent_loss is None:
            continue
        region = _normal_region(section, member, f)
        frac = _check_loss(section, member, f, cs, region, warnings)
        station = None if f.station_ft is None else round(float(f.station_ft), 6)
        losses.append(_Loss(f, cs, region, station, frac))

    for c, f in removed.items():
        warnings.append(f"member {member}: {comps[c]} is {f.bar_state.value} "
                        f"({f.where or describe_finding(f)}) and is taken as carrying no load")
    one = len(comps) == 1
    bars = isinstance(section, EyebarSet | RodSet)
    for c, f in bent.items():
        if not bars:  # a part of a member that pushes
            warnings.append(
                f"member {member}: {comps[c]} is bent ({f.where or describe_finding(f)}); it "
                "is left out of the member's compression resistance (a bowed part of a "
                "column carries little until straightened; the member's buckling with its bow "
                "is not worked here, so the engineer should judge it, e.g. from the measured "
                "bow) and counted in tension at its full resistance")
            continue
        warnings.append(f"member {member}: {comps[c]} is bent ({f.where or describe_finding(f)})"
                        "; it is counted in tension at its full resistance (the bend is not in "
                        "the numbers: " + (f"a bowed {comps[c].split()[0]} takes load only "
                                           "once straightened" if one else
                                           "it may take less than its share of the member's "
                                           "force until straightened")
                        + ")")
    _connector_notes(section, member, joined, warnings, assumptions)
    removal_findings = tuple(dict.fromkeys(removed.values()))

    keys: list[tuple[FindingRegion, float | None]] = []
    for lo in losses:
        k = (lo.region, lo.station_ft)
        if k not in keys:
            keys.append(k)
    locations: list[tuple[Location, list[_Loss]]] = [(Location(None, None, removal_findings),
                                                      [])]
    for region, station in keys:
        acting = [lo for lo in losses if lo.region is region
                  and (lo.station_ft == station or lo.station_ft is None)]
        acting.sort(key=lambda lo: lo.fraction_left)
        fs = tuple(dict.fromkeys(lo.finding for lo in acting)) + removal_findings
        locations.append((Location(region, station, fs), acting))

    # a built-up section shares its as-built geometry and repeated states between the builds
    builder = work.at if work is not None else _BUILDERS[type(section)]
    as_built = builder(section, member, Location(None, None, ()), [], frozenset(), frozenset(),
                       warnings, assumptions, record=False)
    gone = frozenset(removed)
    tension = tuple(builder(section, member, loc, acting, gone, frozenset(), warnings,
                            assumptions, record=(i == 0))
                    for i, (loc, acting) in enumerate(locations))
    if isinstance(section, BuiltUpSection | RolledShape):
        gone_c = gone | frozenset(bent)
        compression = tuple(builder(section, member, loc, acting, gone_c, frozenset(),
                                    warnings, assumptions, record=False)
                            for loc, acting in locations)
    else:
        compression = ()
    assumptions.extend(_loss_assumptions(section, bool(losses)))
    return SectionReport(member, section, section_kind(section), as_built, tension, compression,
                         tuple(removed.items()), tuple(bent.items()),
                         len(comps) - len(gone), len(comps),
                         tuple(dict.fromkeys(warnings)), tuple(dict.fromkeys(assumptions)),
                         tuple(joined))


def _connector_notes(section: Section, member: str, joined: Sequence[Finding],
                     warnings: list[str], assumptions: list[str]) -> None:
    """What findings on a built-up member's lacing or battens do to its rating (common
    practice, as judged here): a bar out of action (loose, missing, broken, cracked or bent)
    no longer closes the section nor ties the parts where it was, so the member is rated as an
    open section in torsional buckling and with twice the connector spacing in its modified
    slenderness (rating.capacity.compression); a loss alone is not rated (lacing and battens
    are not checked)."""
    if not joined:
        return
    # (only a member with such connectors has such findings: rating.model.connector_component)
    word = CONNECTOR_WORDS[section.connectors.kind][0]
    is_, it, does, its, them = (("is", "it", "does", "its", "it") if word == "lacing" else
                                ("are", "they", "do", "their", "them"))
    out = [f for f in joined if f.bar_state in REMOVING_STATES or f.bar_state is BarState.BENT]
    if out:
        said = ", ".join(f"{f.bar_state.value} ({f.where or describe_finding(f)})" for f in out)
        warnings.append(
            f"member {member}: its {word} {is_} recorded {said}: {it} {is_} taken as no longer "
            "closing "
            "the section nor tying the parts there, so the member is rated as an open section "
            "in torsional and flexural-torsional buckling (AASHTO LRFD 6.9.4.1.3 [value from "
            "memory]) and with twice the connector spacing in its modified slenderness (one "
            "connection lost; where more are out, give the distance between sound "
            "connectors as the spacing on the BuiltUp sheet) [common practice]")
    for f in joined:
        if f.pack_rust:
            warnings.append(f"member {member}: pack rust recorded ({describe_finding(f)}); "
                            "it can spread and bend the bars or parts; check for distortion")
        if f not in out and (f.remaining_thickness_in is not None
                             or f.percent_loss is not None):
            assumptions.append(
                f"member {member}: the loss recorded on its {word} "
                f"({f.where or describe_finding(f)}) is not rated: {word} {is_} not checked, "
                f"and {is_} taken as still tying the parts; if {it} no longer {does}, record "
                f"{its} bar state (broken, missing, loose or bent) to rate the member without "
                f"{them}")


def _loss_assumptions(section: Section, any_loss: bool) -> list[str]:
    if not any_loss:
        return []
    if isinstance(section, BuiltUpSection):
        return ["Section loss on a built-up part is taken evenly off both faces of each of its "
                "elements; a remaining thickness sets the depth of loss from the part's "
                "reference element (plate, angle legs, channel web) and that depth is taken "
                "off every element of the part.",
                "A local loss is applied over the whole member for buckling (the least section "
                "governs; conservative)."]
    if isinstance(section, EyebarSet):
        return ["Eyebar section loss reduces thickness only (width as built)."]
    if isinstance(section, RodSet):
        return ["Rod section loss reduces the diameter (percent loss is of the diameter)."]
    return ["Loss on a rolled shape reduces its area in proportion; its radii of gyration "
            "are kept."]


def _min_left(t_elem: float, t_ref: float, acting: Sequence[_Loss], comp: str,
              region: FindingRegion | None = None) -> float:
    t = t_elem
    for lo in acting:
        if comp in lo.components and (region is None or lo.region is region):
            t = min(t, _left(t_elem, t_ref, lo.finding))
    return t


def _eyebar_at(section: EyebarSet, member: str, loc: Location, acting: Sequence[_Loss],
               gone: frozenset[str], _bent: frozenset[str], warnings: list[str],
               assumptions: list[str], *, record: bool) -> SectionAtLocation:
    t0 = section.thickness_in
    th0 = section.head_thickness_in or t0
    w_eff = min(section.width_in, 8.0 * t0)
    D, d = section.head_diameter_in, section.pin_hole_diameter_in
    a = section.head_beyond_hole_in if section.head_beyond_hole_in is not None else (D - d) / 2
    if record:
        if section.width_in > 8.0 * t0:
            warnings.append(f"member {member}: eyebar body width {section.width_in:g} in is more "
                            f"than 8 t = {8 * t0:g} in; {w_eff:g} in is used in calculation "
                            "(AISC LRFD 1999 D3.2)")
        if section.head_beyond_hole_in is None:
            assumptions.append(f"member {member}: eyebar heads taken as round and concentric "
                               f"with the hole, so the head beyond the hole is "
                               f"(D_h - d)/2 = {a:g} in; enter the measured distance to check "
                               "the beyond-hole proportion")
    bars = []
    for i in range(1, section.count + 1):
        c = f"bar {i}"
        if c in gone:
            continue
        t = _min_left(t0, t0, acting, c, FindingRegion.BODY)
        th = _min_left(th0, th0, acting, c, FindingRegion.HEAD)
        bars.append(EyebarAtLocation(c, w_eff, t, th, D, d, a))
    Ag = sum(b.body_area_in2 for b in bars)
    An = sum(b.through_hole_area_in2 for b in bars)
    return SectionAtLocation(loc, Ag, An, eyebars=tuple(bars))


def _rod_at(section: RodSet, member: str, loc: Location, acting: Sequence[_Loss],
            gone: frozenset[str], _bent: frozenset[str], warnings: list[str],
            assumptions: list[str], *, record: bool) -> SectionAtLocation:
    d0 = section.diameter_in
    e0 = _end_diameter(section)
    if record:
        if section.end is RodEnd.THREADED and section.root_diameter_in is None:
            assumptions.append(f"member {member}: thread root diameter not recorded; root area "
                               f"taken as {THREADED_ROOT_AREA_RATIO:g} of the body area (AISC "
                               "360-10 Table J3.2 threaded-part form, value from memory); "
                               "measure the root")
            warnings.append(f"member {member}: threaded rod without a recorded root diameter "
                            "(an assumed root area is used)")
        if section.end is RodEnd.UPSET and section.root_diameter_in is None:
            assumptions.append(f"member {member}: upset rod ends taken as stronger than the "
                               "body (no upset thread root recorded); loss at an end is "
                               "applied to the body diameter there")
        if section.end is RodEnd.LOOP:
            warnings.append(f"member {member}: forge-welded loop rods crack at the forge line, "
                            "a frequent flaw (VTRC 11-R13); inspect the welds closely, the "
                            "rating assumes they are sound unless a finding says otherwise")
    rods = []
    for i in range(1, section.count + 1):
        c = f"bar {i}"
        if c in gone:
            continue
        db = _min_left(d0, d0, acting, c, FindingRegion.BODY)
        de = _min_left(e0, e0, acting, c, FindingRegion.THREAD)
        rods.append(RodAtLocation(c, db, de, section.shape))
    Ag = sum(r.body_area_in2 for r in rods)
    An = sum(r.end_area_in2 for r in rods)
    return SectionAtLocation(loc, Ag, An, rods=tuple(rods))


def _open_axis(part_props: Iterable[AreaProperties], whole: AreaProperties) -> str:
    """The axis on which the connectors work: the one whose I owes most to part offsets."""
    own_x = own_y = 0.0
    for p in part_props:
        own_x += p.I_x_in4
        own_y += p.I_y_in4
    share_x = 1.0 - own_x / whole.I_x_in4 if whole.I_x_in4 > 0 else 0.0
    share_y = 1.0 - own_y / whole.I_y_in4 if whole.I_y_in4 > 0 else 0.0
    return "x" if share_x >= share_y else "y"


@dataclass(frozen=True)
class _BuiltUpState:
    """What is left of a built-up section with some parts gone and some losses acting.

    ``zeroed`` lists (part label, element, as-built thickness) of the elements the losses
    take away whole; ``main_only`` says r_i came from the channels and angles alone.
    """

    zeroed: tuple[tuple[str, str, float], ...]
    props: AreaProperties
    A_n_in2: float
    elements: tuple[ElementAtLocation, ...]
    r_i_in: float | None
    modified_axis: str | None
    main_only: bool
    torsion_rects: tuple[Rect, ...]


class _BuiltUpWork:
    """The work on one built-up section that ``section_properties`` shares between builds.

    The as-built rectangles, the thickest element and the connectors' axis do not depend on
    the location; the same parts gone with the same losses acting (the as-built, tension and
    compression builds of a location, as a rule) give the same state, worked out once. It
    lives for one ``section_properties`` call only (no state outlives it); the key of a state
    is the identity of its ``_Loss`` objects, which live as long as the call.
    """

    __slots__ = ("section", "parts", "t_h0", "_part_props", "_whole", "_axis", "_states",
                 "_faces")

    def __init__(self, section: BuiltUpSection,
                 rectangles: Sequence[tuple[Rect, ...]]) -> None:
        """``rectangles``: ``part_rectangles`` of each part (validation has made them)."""
        self.section = section
        # (key, part, reference thickness, as-built rectangles), in the order of the parts
        self.parts = tuple((p.label.strip().lower(), p, part_reference_thickness_in(p), rects)
                           for p, rects in zip(section.parts, rectangles, strict=True))
        self.t_h0 = max(r.t_in for _, _, _, rects in self.parts for r in rects)
        self._part_props: dict[str, AreaProperties] = {}
        self._whole: AreaProperties | None = None
        self._axis: str | None = None
        self._states: dict[tuple[frozenset[str], tuple[int, ...]], _BuiltUpState] = {}
        self._faces: dict[Rect, tuple[bool, bool]] | None = None

    def _touched_faces(self) -> dict[Rect, tuple[bool, bool]]:
        # which thickness faces of each as-built rectangle another rectangle touches
        if self._faces is None:
            rects = [r for _, _, _, rs in self.parts for r in rs]
            self._faces = {r: touched_faces(r, rects) for r in rects}
        return self._faces

    def _as_built_part_props(self, key: str, rects: tuple[Rect, ...]) -> AreaProperties:
        props = self._part_props.get(key)
        if props is None:
            props = self._part_props[key] = area_properties(rects)
        return props

    def _whole_as_built(self) -> AreaProperties:
        if self._whole is None:
            self._whole = area_properties([r for _, _, _, rects in self.parts for r in rects])
        return self._whole

    def _open_axis(self) -> str:
        # the axis the connectors work on is a property of the member as built
        if self._axis is None:
            self._axis = _open_axis((self._as_built_part_props(k, rects)
                                     for k, _, _, rects in self.parts), self._whole_as_built())
        return self._axis

    def state(self, acting: Sequence[_Loss], gone: frozenset[str]) -> _BuiltUpState:
        """The section with the parts ``gone`` out and the losses ``acting`` applied."""
        key = (gone, tuple(id(lo) for lo in acting))
        st = self._states.get(key)
        if st is None:
            st = self._states[key] = self._compute(acting, gone)
        return st

    def _compute(self, acting: Sequence[_Loss], gone: frozenset[str]) -> _BuiltUpState:
        section = self.section
        zeroed: list[tuple[str, str, float]] = []
        # kept parts: (key, part, rectangles left, as built?)
        kept: list[tuple[str, Part, tuple[Rect, ...], bool]] = []
        torsion: list[Rect] = []
        for key, p, t_ref, rects0 in self.parts:
            if key in gone:
                continue
            if not any(key in lo.components for lo in acting):
                kept.append((key, p, rects0, True))  # no loss on this part: as built
                torsion.extend(rects0)
                continue
            rects = []
            for r in rects0:
                t_new = _min_left(r.t_in, t_ref, acting, key)
                if t_new <= 0.0:
                    zeroed.append((p.label, r.element, r.t_in))
                if t_new > 0.0:
                    # _min_left gives back the as-built thickness itself when nothing is lost
                    if t_new is r.t_in:
                        rects.append(r)
                        torsion.append(r)
                    else:
                        rects.append(r.thinned(t_new))
                        torsion.append(_kept_against(r, t_new, self._touched_faces()[r]))
            if rects:
                kept.append((key, p, tuple(rects), False))
        all_rects = [r for _, _, rects, _ in kept for r in rects]
        whole = len(kept) == len(self.parts) and all(k[3] for k in kept)
        props = self._whole_as_built() if whole else area_properties(all_rects)
        Ag = props.A_in2
        # holes through the thickest element, at its as-built thickness (conservative)
        An = max(Ag - section.holes_per_section * section.hole_diameter_in * self.t_h0, 0.0)
        elements = tuple(ElementAtLocation(r.part, r.element, r.b_in, r.t_in, r.stiffened)
                         for r in all_rects)
        c = section.connectors
        r_i = None
        axis = None
        main_only = False
        if c is not None and c.kind is not ConnectorKind.SOLID and len(kept) >= 2 and Ag > 0:
            axis = self._open_axis()
            if c.r_i_in is not None:
                r_i = c.r_i_in
            else:
                main = [k for k in kept if isinstance(k[1], ChannelPart | AnglePart)] or kept
                r_i = min((self._as_built_part_props(k, rects) if as_built
                           else area_properties(rects)).r_min_in
                          for k, _, rects, as_built in main)
                main_only = len(main) < len(kept)
        return _BuiltUpState(tuple(zeroed), props, An, elements, r_i, axis, main_only,
                             tuple(torsion))

    def at(self, section: BuiltUpSection, member: str, loc: Location,
           acting: Sequence[_Loss], gone: frozenset[str], _bent: frozenset[str],
           warnings: list[str], assumptions: list[str], *, record: bool) -> SectionAtLocation:
        """The section at ``loc`` (the builder signature of ``_BUILDERS``)."""
        st = self.state(acting, gone)
        for label, element, t_in in st.zeroed:
            warnings.append(f"member {member}: the loss recorded on part {label} takes "
                            f"away its whole {element} ({t_in:g} in) at {loc.describe()}")
        if record and section.holes_per_section:
            assumptions.append(f"member {member}: each of the {section.holes_per_section} "
                               f"rivet holes ({section.hole_diameter_in:g} in) is deducted "
                               f"through the thickest element at its as-built thickness "
                               f"({self.t_h0:g} in) for the net area (conservative where "
                               "that element has lost thickness)")
        if record and st.r_i_in is not None and section.connectors.r_i_in is None:
            assumptions.append(f"member {member}: r_i (one component between connectors) "
                               "taken as the least principal r of its "
                               + ("channels and angles" if st.main_only else "parts")
                               + " after loss")
        props = st.props
        return SectionAtLocation(loc, props.A_in2, st.A_n_in2, props.r_x_in, props.r_y_in,
                                 props, elements=st.elements, r_i_in=st.r_i_in,
                                 modified_axis=st.modified_axis,
                                 shear_lag_U=section.shear_lag_U,
                                 torsion_rects=st.torsion_rects)


def _rolled_at(section: RolledShape, member: str, loc: Location, acting: Sequence[_Loss],
               gone: frozenset[str], _bent: frozenset[str], warnings: list[str],
               assumptions: list[str], *, record: bool) -> SectionAtLocation:
    key = next(iter(_components(section, member)))
    if key in gone:
        return SectionAtLocation(loc, 0.0, 0.0, section.r_x_in, section.r_y_in,
                                 shear_lag_U=section.shear_lag_U, r_z_in=section.r_z_in,
                                 rolled_symmetry=section.symmetry)
    left = 1.0
    for lo in acting:
        left = min(left, 1.0 - (lo.finding.percent_loss or 0.0) / 100.0)
    A = section.area_in2 * left
    An = (section.net_area_in2 if section.net_area_in2 is not None else section.area_in2) * left
    if record and section.net_area_in2 is None:
        assumptions.append(f"member {member}: rolled shape net area not given; taken equal to "
                           "the gross area")
    if record and section.J_in4 is not None and section.C_w_in6 is None:
        assumptions.append(f"member {member}: rolled shape warping constant C_w not given; "
                           "taken as 0 (conservative for torsional buckling)")
    return SectionAtLocation(loc, A, An, section.r_x_in, section.r_y_in,
                             shear_lag_U=section.shear_lag_U, r_z_in=section.r_z_in,
                             torsion_tabulated=rolled_torsion_after_loss(section, left),
                             rolled_symmetry=section.symmetry)


def rolled_torsion_after_loss(section: RolledShape, left: float
                              ) -> tuple[float, float, float, float] | None:
    """A rolled shape's (J, C_w, x_o, y_o) with every wall thinned to ``left`` of its
    thickness (a percent loss over the whole shape, as its area): J = sum b t^3 / 3 goes
    with left^3, C_w of thin open walls with left, the shear centre stays (thin-walled
    open sections, e.g. Salmon and Johnson, *Steel Structures*, Ch. 8 [value from memory];
    common practice). None where J is not given."""
    if section.J_in4 is None or section.x_o_in is None or section.y_o_in is None:
        return None
    return (section.J_in4 * left ** 3, (section.C_w_in6 or 0.0) * left, section.x_o_in,
            section.y_o_in)


# a built-up section is built by its _BuiltUpWork (section_properties makes one per call)
_BUILDERS = {EyebarSet: _eyebar_at, RodSet: _rod_at, RolledShape: _rolled_at}
