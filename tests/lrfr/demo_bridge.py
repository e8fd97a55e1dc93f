"""A hand-built demo bridge for the rating-engine tests (invented data, demo only)."""

from __future__ import annotations

import numpy as np

from rating.model import (
    Bridge,
    BridgeInfo,
    BuiltUpSection,
    ChannelPart,
    ChannelToes,
    ConnectorKind,
    Connectors,
    CrossSection,
    DeadLoadBasis,
    DeadLoadItem,
    DeadLoadKind,
    EyebarSet,
    Material,
    MaterialKind,
    MemberDesign,
    MemberRole,
    PackingItem,
    Pin,
    PlatePart,
    RatingSettings,
    RodEnd,
    RodSet,
)
from rating.model.builders import build_truss

STEEL = Material(MaterialKind.STEEL, F_y=30.0, F_u=60.0)


def laced_channels(depth: float, bf: float, tw: float, tf: float, gap: float,
                   cover: tuple[float, float] | None = None) -> BuiltUpSection:
    """Two channels, toes out, backs ``gap`` apart, optional cover plate on top."""
    parts = [
        ChannelPart("C-left", depth, bf, tw, tf, x_in=-gap / 2, y_in=0.0, toes=ChannelToes.LEFT),
        ChannelPart("C-right", depth, bf, tw, tf, x_in=gap / 2, y_in=0.0,
                    toes=ChannelToes.RIGHT),
    ]
    if cover is not None:
        w, t = cover
        parts.append(PlatePart("cover", w, t, x_in=0.0, y_in=depth / 2 + t / 2))
    return BuiltUpSection(tuple(parts), Connectors(ConnectorKind.LACING, spacing_in=18.0),
                          hole_diameter_in=0.875, holes_per_section=4, shear_lag_U=0.85)


def eyebars(n: int, w: float, t: float, pin: float) -> EyebarSet:
    return EyebarSet(n, w, t, head_diameter_in=2.3 * w, pin_hole_diameter_in=pin + 1 / 32)


def section_for(label: str, role: MemberRole):
    if role in (MemberRole.TOP_CHORD, MemberRole.END_POST):
        return laced_channels(12.0, 3.0, 0.39, 0.5, 10.0, cover=(16.0, 0.375))
    if role is MemberRole.VERTICAL:
        return laced_channels(8.0, 2.3, 0.31, 0.39, 6.0)
    if role is MemberRole.HANGER:
        return eyebars(2, 3.0, 0.75, 3.0)
    if role is MemberRole.COUNTER:
        return RodSet(1, 1.25, RodEnd.UPSET)
    if role is MemberRole.DIAGONAL:
        return eyebars(2, 4.0, 0.875, 4.5)
    if label in ("L3L4", "L4L5"):
        return eyebars(4, 5.0, 0.875, 4.0)
    if label in ("L2L3", "L5L6"):
        return eyebars(4, 4.0, 0.875, 4.5)
    return eyebars(2, 4.0, 0.875, 4.5)


def make_pratt_bridge(findings=(), pins=True, counter_panels=(4, 5), **settings) -> Bridge:
    g = build_truss("pratt", 8, 20.0, 24.0, counter_panels=counter_panels)
    designs = tuple(MemberDesign(m.label, section_for(m.label, m.role), STEEL)
                    for m in g.members)
    pin_list = ()
    if pins:
        # packing at L2 from the outside in, one side of the truss plane to the other
        pin_list = (Pin("L2", 4.5, (
            PackingItem("L2L3", 0.875), PackingItem("L2L3", 0.875),
            PackingItem("U1L2", 0.875), PackingItem("L1L2", 0.875),
            PackingItem("L2U2", 0.5), PackingItem("L2U2", 0.5, gap_before_in=1.0),
            PackingItem("L1L2", 0.875), PackingItem("U1L2", 0.875),
            PackingItem("L2L3", 0.875), PackingItem("L2L3", 0.875),
        ), material=STEEL),)
    return Bridge(
        info=BridgeInfo("DEMO-8P", "Demo eight-panel Pratt", year_built=1902),
        geometry=g,
        cross_section=CrossSection(truss_spacing_ft=18.0, roadway_width_ft=16.0),
        member_designs=designs,
        findings=tuple(findings),
        pins=pin_list,
        dead_loads=(
            DeadLoadItem("timber deck and stringers", DeadLoadKind.DC, DeadLoadBasis.PSF_DECK,
                         45.0),
            DeadLoadItem("floorbeam", DeadLoadKind.DC, DeadLoadBasis.KIP_PER_FLOORBEAM, 1.4),
            DeadLoadItem("asphalt overlay", DeadLoadKind.DW, DeadLoadBasis.PSF_DECK, 20.0),
            DeadLoadItem("railing", DeadLoadKind.DC, DeadLoadBasis.PLF_TRUSS, 25.0),
        ),
        settings=RatingSettings(**settings),
    )


def double_intersection_bridge(panels: int) -> Bridge:
    """A double-intersection truss of 18 ft panels, 26 ft deep, with eyebar diagonals and
    chords strong enough that a diagonal the live load reverses controls (invented test
    data)."""
    from dataclasses import replace

    g = build_truss("double intersection", panels, 18.0, 26.0)

    def section(m):
        if m.role in (MemberRole.TOP_CHORD, MemberRole.END_POST):
            return laced_channels(15.0, 3.4, 0.4, 0.65, 12.0, cover=(18.0, 0.5))
        if m.role is MemberRole.BOTTOM_CHORD:
            return eyebars(4, 6.0, 1.0, 5.0)
        return section_for(m.label, m.role)

    designs = tuple(MemberDesign(m.label, section(m), STEEL) for m in g.members)
    return replace(make_pratt_bridge(pins=False), geometry=g, member_designs=designs)


def tension_only_equilibrium(g, P: np.ndarray) -> bool:
    """Whether any member forces balance the joint loads ``P`` (n_joints, 2) with every
    tension-only member pulling (N >= 0): a linear program (scipy's linprog), independent of
    the engine's active-set solver (statics of a pin-jointed truss, common practice)."""
    from scipy.optimize import linprog

    fixed = {(g.joint_index[s.joint], 1) for s in g.supports} | {
        (g.joint_index[s.joint], 0) for s in g.supports if s.kind.value == "pin"}
    rows = [(j, d) for j in range(len(g.joints)) for d in (0, 1) if (j, d) not in fixed]
    at = {r: k for k, r in enumerate(rows)}
    A = np.zeros((len(rows), len(g.members)))
    for i, m in enumerate(g.members):
        a, b = g.joint(m.start), g.joint(m.end)
        u = np.array([b.x_ft - a.x_ft, b.y_ft - a.y_ft])
        u /= np.linalg.norm(u)
        for label, vec in ((m.start, u), (m.end, -u)):
            for d in (0, 1):
                k = at.get((g.joint_index[label], d))
                if k is not None:
                    A[k, i] += vec[d]
    rhs = np.array([-P[j, d] for j, d in rows])
    bounds = [(0, None) if m.tension_only else (None, None) for m in g.members]
    res = linprog(np.zeros(len(g.members)), A_eq=A, b_eq=rhs, bounds=bounds, method="highs")
    return res.status == 0
