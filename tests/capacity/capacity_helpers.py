"""Test data the capacity tests share (invented): a mild steel of unknown grade, and a top
chord of two channels (toes out) with a cover plate, like the Pratt sample's."""

from __future__ import annotations

from rating.model import (
    BuiltUpSection,
    ChannelPart,
    ChannelToes,
    ConnectorKind,
    Connectors,
    Material,
    MaterialKind,
    PlatePart,
)

E, FY = 29000.0, 26.0
STEEL = Material(MaterialKind.STEEL, F_y=FY, F_u=52.0)

CHORD_CHANNELS = (
    ChannelPart("C-left", 10.0, 2.6, 0.24, 0.436, x_in=-5.125, toes=ChannelToes.LEFT),
    ChannelPart("C-right", 10.0, 2.6, 0.24, 0.436, x_in=5.125, toes=ChannelToes.RIGHT))
CHORD_COVER = PlatePart("cover", 14.0, 0.3125, y_in=5.15625)
LACED = Connectors(ConnectorKind.LACING, spacing_in=15.0)
SOLID = Connectors(ConnectorKind.SOLID)


def chord(connectors: Connectors = LACED, cover: PlatePart | None = CHORD_COVER
          ) -> BuiltUpSection:
    """The two channels with ``cover`` (None: none), joined by ``connectors``."""
    return BuiltUpSection(parts=CHORD_CHANNELS + ((cover,) if cover else ()),
                          connectors=connectors)
