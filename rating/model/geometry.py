"""Truss geometry as plain typed objects: joints, supports, members, deck panel points.

Units: joint coordinates in ft; member areas (used for stiffness only) in in^2.
Sign convention project-wide: axial force tension positive.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from enum import StrEnum
from functools import cached_property

from rating.errors import GeometryError


class MemberRole(StrEnum):
    """What a member does in the truss (trade names)."""

    TOP_CHORD = "top chord"
    BOTTOM_CHORD = "bottom chord"
    END_POST = "end post"
    VERTICAL = "vertical"
    HANGER = "hanger"
    DIAGONAL = "diagonal"
    COUNTER = "counter"
    SUB_STRUT = "sub-strut"
    SUB_TIE = "sub-tie"


class SupportKind(StrEnum):
    """A pin restrains both directions; a roller (expansion bearing) only the vertical."""

    PIN = "pin"
    ROLLER = "roller"


class DeckPosition(StrEnum):
    """Where the floor system sits: through and pony trusses carry it at the bottom chord."""

    THROUGH = "through"
    PONY = "pony"
    DECK = "deck"


@dataclass(frozen=True)
class Joint:
    """A pinned panel point; ``label`` is a trade label (L0..Ln, U1.., M.. sub-panel points)."""

    label: str
    x_ft: float
    y_ft: float


@dataclass(frozen=True)
class Support:
    """The bearing at a support joint: a pin (restrains both directions) or a roller (expansion
    bearing, vertical only)."""

    joint: str
    kind: SupportKind


@dataclass(frozen=True)
class Member:
    """A two-force member between two joints.

    ``tension_only`` marks counters, slender mains and rods that buckle out under compression.
    ``area_in2`` is only the stiffness area (indeterminate forms need relative stiffness).
    """

    label: str
    start: str
    end: str
    role: MemberRole
    tension_only: bool = False
    area_in2: float = 10.0


@dataclass(frozen=True)
class TrussGeometry:
    """One plane truss. ``deck_joints`` are the panel points the floorbeams load, in order of x.

    Construction validates the description and raises :class:`GeometryError` naming the item.
    """

    joints: tuple[Joint, ...]
    members: tuple[Member, ...]
    supports: tuple[Support, ...]
    deck_joints: tuple[str, ...]
    form: str = "explicit"
    deck_position: DeckPosition = DeckPosition.THROUGH

    def __post_init__(self) -> None:
        validate_geometry(self)

    @cached_property
    def joint_index(self) -> dict[str, int]:
        return {j.label: i for i, j in enumerate(self.joints)}

    @cached_property
    def member_index(self) -> dict[str, int]:
        return {m.label: i for i, m in enumerate(self.members)}

    def joint(self, label: str) -> Joint:
        return self.joints[self.joint_index[label]]

    def member(self, label: str) -> Member:
        return self.members[self.member_index[label]]

    def member_length_ft(self, label: str) -> float:
        m = self.member(label)
        a, b = self.joint(m.start), self.joint(m.end)
        return math.hypot(b.x_ft - a.x_ft, b.y_ft - a.y_ft)

    @cached_property
    def deck_stations_ft(self) -> tuple[float, ...]:
        """x of each deck panel point, ft, in order along the span."""
        return tuple(self.joint(j).x_ft for j in self.deck_joints)

    @property
    def span_ft(self) -> float:
        xs = self.deck_stations_ft
        return xs[-1] - xs[0]

    def members_at(self, joint: str) -> tuple[Member, ...]:
        return tuple(m for m in self.members if joint in (m.start, m.end))


def validate_geometry(g: TrussGeometry) -> None:
    """Refuse what is not a truss, naming the offending joint or member. Nothing is dropped."""
    seen: set[str] = set()
    for j in g.joints:
        if not j.label or not j.label.strip():
            raise GeometryError("a joint has an empty label")
        if j.label in seen:
            raise GeometryError(f"joint label {j.label!r} is used twice")
        if not (math.isfinite(j.x_ft) and math.isfinite(j.y_ft)):
            raise GeometryError(f"joint {j.label} has a coordinate that is not a finite number")
        seen.add(j.label)
    coords: dict[tuple[float, float], str] = {}
    for j in g.joints:
        key = (round(j.x_ft, 6), round(j.y_ft, 6))
        if key in coords:
            raise GeometryError(f"joints {coords[key]} and {j.label} are at the same point")
        coords[key] = j.label
    mseen: set[str] = set()
    pairs: dict[frozenset[str], str] = {}
    by_label = {j.label: j for j in g.joints}
    for m in g.members:
        if m.label in mseen:
            raise GeometryError(f"member label {m.label!r} is used twice")
        mseen.add(m.label)
        for end in (m.start, m.end):
            if end not in by_label:
                raise GeometryError(f"member {m.label} runs to joint {end!r}, which is not defined")
        if m.start == m.end:
            raise GeometryError(f"member {m.label} starts and ends at the same joint {m.start}")
        a, b = by_label[m.start], by_label[m.end]
        if math.hypot(b.x_ft - a.x_ft, b.y_ft - a.y_ft) < 1e-6:
            raise GeometryError(f"member {m.label} has zero length")
        if not (m.area_in2 > 0 and math.isfinite(m.area_in2)):
            raise GeometryError(f"member {m.label} has a stiffness area that is not positive")
        key = frozenset((m.start, m.end))
        if key in pairs:
            raise GeometryError(
                f"members {pairs[key]} and {m.label} both join {m.start} and {m.end}; "
                "describe a multi-bar member as one member with several bars"
            )
        pairs[key] = m.label
    if not g.supports:
        raise GeometryError("the truss has no supports")
    sup_seen: set[str] = set()
    for s in g.supports:
        if s.joint not in by_label:
            raise GeometryError(f"support at joint {s.joint!r}, which is not defined")
        if s.joint in sup_seen:
            raise GeometryError(f"joint {s.joint} has two supports")
        sup_seen.add(s.joint)
    if len(g.deck_joints) < 2:
        raise GeometryError("the truss needs at least two deck-level panel points")
    dseen: set[str] = set()
    prev_x = -math.inf
    for d in g.deck_joints:
        if d not in by_label:
            raise GeometryError(f"deck panel point {d!r} is not a defined joint")
        if d in dseen:
            raise GeometryError(f"deck panel point {d} is listed twice")
        dseen.add(d)
        if by_label[d].x_ft <= prev_x:
            raise GeometryError(f"deck panel points must run in increasing x; {d} does not")
        prev_x = by_label[d].x_ft
    used = {e for m in g.members for e in (m.start, m.end)}
    for j in g.joints:
        if j.label not in used:
            raise GeometryError(f"joint {j.label} has no member attached")
    x0, y0 = g.joints[0].x_ft, g.joints[0].y_ft
    far = max(g.joints, key=lambda j: math.hypot(j.x_ft - x0, j.y_ft - y0))
    dx, dy = far.x_ft - x0, far.y_ft - y0
    span = math.hypot(dx, dy)
    off_line = max(abs((j.x_ft - x0) * dy - (j.y_ft - y0) * dx) / span for j in g.joints)
    if off_line < 1e-6 * max(span, 1.0):
        raise GeometryError("all joints lie on one straight line; a truss needs depth")
