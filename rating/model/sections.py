"""Member cross-sections as built, by dimensions (inches). No properties computed here.

The capacity layer turns these into areas and radii of gyration after section loss. Parts of a
built-up member are placed in the member's own cross-section plane: x across the truss plane
(out of plane), y in the truss plane, origin anywhere (the capacity layer finds the centroid).
"""

from __future__ import annotations

from dataclasses import dataclass
from enum import StrEnum


class RodEnd(StrEnum):
    """How a rod's end is made; it decides the area that governs tension (common practice)."""

    UPSET = "upset"  # enlarged before threading: the body governs
    THREADED = "threaded"  # plain thread cut into the body: the root area governs
    LOOP = "loop"  # forge-welded eye: body area, forge line flagged


class RodShape(StrEnum):
    ROUND = "round"
    SQUARE = "square"


class ChannelToes(StrEnum):
    """Direction the flanges of a channel point, in the section's x-y plane."""

    LEFT = "left"
    RIGHT = "right"
    UP = "up"
    DOWN = "down"


class ConnectorKind(StrEnum):
    LACING = "lacing"
    BATTEN = "batten"
    SOLID = "solid"  # continuous cover plate / web: parts act as one


@dataclass(frozen=True)
class EyebarSet:
    """``count`` identical forged eyebars side by side (a chord or main diagonal panel).

    ``head_diameter_in`` is the outside diameter of the forged head; ``pin_hole_diameter_in``
    the bored hole. ``head_thickness_in`` defaults to the body thickness.
    ``head_beyond_hole_in`` is the measured distance from the edge of the hole to the end of
    the head along the bar; None takes the head as concentric with the hole, (D_h - d)/2.
    """

    count: int
    width_in: float
    thickness_in: float
    head_diameter_in: float
    pin_hole_diameter_in: float
    head_thickness_in: float | None = None
    head_beyond_hole_in: float | None = None


@dataclass(frozen=True)
class RodSet:
    """``count`` rods (hangers, counters, lateral rods). ``root_diameter_in`` for threaded ends."""

    count: int
    diameter_in: float
    end: RodEnd = RodEnd.UPSET
    shape: RodShape = RodShape.ROUND
    root_diameter_in: float | None = None


@dataclass(frozen=True)
class PlatePart:
    """A flat plate, centroid at (x_in, y_in). ``width_in`` runs along y when ``vertical``."""

    label: str
    width_in: float
    thickness_in: float
    x_in: float = 0.0
    y_in: float = 0.0
    vertical: bool = False


@dataclass(frozen=True)
class ChannelPart:
    """A channel by dimensions; (x_in, y_in) is the centre of the back of its web."""

    label: str
    depth_in: float
    flange_width_in: float
    web_thickness_in: float
    flange_thickness_in: float
    x_in: float = 0.0
    y_in: float = 0.0
    toes: ChannelToes = ChannelToes.RIGHT


@dataclass(frozen=True)
class AnglePart:
    """An angle by dimensions; (x_in, y_in) is the outer heel corner.

    ``leg_x_in`` runs along +x when ``x_sign`` is +1 (along -x when -1); likewise ``leg_y_in``.
    """

    label: str
    leg_x_in: float
    leg_y_in: float
    thickness_in: float
    x_in: float = 0.0
    y_in: float = 0.0
    x_sign: int = 1
    y_sign: int = 1


Part = PlatePart | ChannelPart | AnglePart


@dataclass(frozen=True)
class Connectors:
    """How the parts of a built-up compression member are tied together.

    ``spacing_in`` is the distance ``a`` between connector lines (lacing points or battens);
    ``r_i_in`` the least radius of gyration of one component between them (computed by the
    capacity layer from the parts when not given).
    """

    kind: ConnectorKind
    spacing_in: float | None = None
    r_i_in: float | None = None
    snug_tight: bool = True


CONNECTOR_WORDS = {ConnectorKind.LACING: ("lacing", "lacing bars", "lacing bar"),
                   ConnectorKind.BATTEN: ("battens", "batten", "batten plates",
                                          "batten plate")}
"""The words a finding may use for a built-up member's lacing or battens (the first is the
name a finding keeps)."""


def connector_component(connectors: Connectors | None, name: str) -> str | None:
    """The finding component for ``name`` if it names these connectors ("lacing" or
    "battens"), else None (a part's name, or connectors the member does not have)."""
    if connectors is None:
        return None
    words = CONNECTOR_WORDS.get(connectors.kind, ())
    return words[0] if name.strip().lower() in words else None


@dataclass(frozen=True)
class BuiltUpSection:
    """Plates, channels and angles riveted together (laced or battened posts and chords).

    ``holes_per_section`` rivet holes of ``hole_diameter_in`` are deducted for the net area;
    ``shear_lag_U`` applies to fracture on the net section.
    """

    parts: tuple[Part, ...]
    connectors: Connectors | None = None
    hole_diameter_in: float = 0.0
    holes_per_section: int = 0
    shear_lag_U: float = 1.0


@dataclass(frozen=True)
class RolledShape:
    """A rolled shape given by its tabulated properties (no part geometry).

    ``r_x_in``/``r_y_in`` about the axes of in-plane and out-of-plane buckling; ``r_z_in``
    the least radius about a principal axis where those are not principal (an angle), None
    where they are. For torsional and flexural-torsional buckling, optionally: ``J_in4``,
    ``C_w_in6`` and the shear centre's distances from the centroid along x and y
    (``x_o_in``, ``y_o_in``; 0 on an axis of symmetry), None where not given.
    """

    designation: str
    area_in2: float
    r_x_in: float
    r_y_in: float
    net_area_in2: float | None = None
    shear_lag_U: float = 1.0
    r_z_in: float | None = None
    J_in4: float | None = None
    C_w_in6: float | None = None
    x_o_in: float | None = None
    y_o_in: float | None = None

    @property
    def symmetry(self) -> str:
        """"doubly symmetric", "singly symmetric" or "unsymmetric" by the shear centre's
        distances from the centroid along the principal axes x and y; "" where they are not
        given, or x and y are not principal (r_z given)."""
        if self.x_o_in is None or self.y_o_in is None or self.r_z_in is not None:
            return ""
        on_axes = (self.x_o_in == 0.0) + (self.y_o_in == 0.0)
        # (off both axes the reader asks for r_z: x and y are then not principal)
        return ("doubly symmetric", "singly symmetric", "unsymmetric")[2 - on_axes]


Section = EyebarSet | RodSet | BuiltUpSection | RolledShape
