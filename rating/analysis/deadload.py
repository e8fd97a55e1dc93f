"""Dead load of one truss: self-weight, floor system, deck, wearing surface, attachments.

DC (structural components and attachments) and DW (wearing surface and utilities) are kept
apart for their different load factors (AASHTO LRFD Table 3.4.1-2 [V]).

Lumping (common practice): each member's weight, increased by the detail allowance for pins,
lacing, rivets and connection plates, goes half to each end joint; floor-system and deck
loads reach the deck panel points through simple-span stringers (half of each adjacent panel);
a floorbeam's own weight goes to its panel point. Loads across the bridge are shared between
the two trusses by the lever rule about the item's offset from the bridge centre line.
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass

import numpy as np

from rating.analysis.distribution import lever_rule_fraction
from rating.analysis.truss import ActiveSetSolution, TrussFamily, solve_tension_only
from rating.errors import InputError
from rating.model import (
    CrossSection,
    DeadLoadBasis,
    DeadLoadItem,
    DeadLoadKind,
    TrussGeometry,
)

IN2_PER_FT2 = 144.0
LB_PER_KIP = 1000.0


@dataclass(frozen=True)
class MemberWeight:
    """Gross area as built (in^2) and unit weight (pcf) of one member."""

    area_in2: float
    unit_weight_pcf: float


@dataclass(frozen=True, eq=False)
class DeadLoadResult:
    """Dead-load joint loads and member forces of the rated truss (kip, tension positive)."""

    joint_loads_dc_kip: np.ndarray  # (n_joints, 2)
    joint_loads_dw_kip: np.ndarray
    total: ActiveSetSolution  # DC + DW together: decides which tension-only members are slack
    member_forces_dc_kip: np.ndarray  # (n_members,) on the active set of the total
    member_forces_dw_kip: np.ndarray
    # the part of DW that is the wearing surface (DW given in psf of deck), within the DW
    # above: its load factor may differ from the rest of DW (utilities), MBE 6A.4.2.2
    joint_loads_dw_surface_kip: np.ndarray
    member_forces_dw_surface_kip: np.ndarray
    rated_truss: str  # "left" or "right": the one with the larger dead-load share
    share_by_item: tuple[tuple[str, float], ...]  # (description, share to the rated truss)
    self_weight_kip: float  # one truss, details included
    assumptions: tuple[str, ...]

    @property
    def slack_members(self) -> frozenset[str]:
        return self.total.slack


def lever_rule_share(offset_ft: float, truss_spacing_ft: float) -> tuple[float, float]:
    """Shares (left, right) of a load at ``offset_ft`` right of the centre line.

    Statics of a simply supported floorbeam between the trusses (common practice).
    """
    return lever_rule_fraction(offset_ft + truss_spacing_ft / 2.0, truss_spacing_ft)


def tributary_lengths_ft(geometry: TrussGeometry) -> np.ndarray:
    """Half of each adjacent panel at every deck panel point (simple-span stringers)."""
    x = np.array(geometry.deck_stations_ft)
    panels = np.diff(x)
    trib = np.zeros_like(x)
    trib[:-1] += panels / 2.0
    trib[1:] += panels / 2.0
    return trib


def _item_line_load_klf(item: DeadLoadItem, deck_width_ft: float) -> float | None:
    """Whole-bridge line load of an item in klf, or None for per-floorbeam items."""
    if item.basis is DeadLoadBasis.PSF_DECK:
        return item.intensity * deck_width_ft / LB_PER_KIP
    if item.basis in (DeadLoadBasis.PLF_BRIDGE, DeadLoadBasis.PLF_TRUSS):
        return item.intensity / LB_PER_KIP
    return None


def dead_load(
    geometry: TrussGeometry,
    cross_section: CrossSection,
    items: tuple[DeadLoadItem, ...],
    member_weights: Mapping[str, MemberWeight],
    detail_allowance: float = 0.15,
    detail_allowance_given: bool = False,
    family: TrussFamily | None = None,
) -> DeadLoadResult:
    """Dead-load forces in the more heavily loaded truss, DC and DW apart.

    ``detail_allowance`` is the fraction added to the bare member weight for pins, lacing,
    rivets and plates (default 0.15, common practice; listed as an assumption when assumed).
    """
    if not 0.0 <= detail_allowance <= 1.0:
        raise InputError(f"detail allowance {detail_allowance} must lie between 0 and 1")
    missing = [m.label for m in geometry.members if m.label not in member_weights]
    if missing:
        raise InputError("no section given for members " + ", ".join(missing)
                         + "; their self-weight cannot be computed")
    nj = len(geometry.joints)
    deck_width = cross_section.deck_width_ft or cross_section.roadway_width_ft
    spacing = cross_section.truss_spacing_ft
    trib = tributary_lengths_ft(geometry)
    deck_idx = np.array([geometry.joint_index[j] for j in geometry.deck_joints])

    # per truss side: [left, right] joint loads by kind
    loads = {k: np.zeros((2, nj, 2)) for k in DeadLoadKind}
    surface = np.zeros((2, nj, 2))  # the wearing surface: DW in psf of deck
    shares: list[tuple[str, float, float]] = []
    for item in items:
        if item.basis is DeadLoadBasis.PLF_TRUSS:
            left, right = 1.0, 1.0  # on each truss line
        else:
            left, right = lever_rule_share(item.offset_ft, spacing)
        shares.append((item.description, left, right))
        w = _item_line_load_klf(item, deck_width)
        per_point = w * trib if w is not None else np.full(trib.shape, item.intensity)
        for side, share in ((0, left), (1, right)):
            loads[item.kind][side, deck_idx, 1] -= share * per_point
            if is_wearing_surface(item):
                surface[side, deck_idx, 1] -= share * per_point

    self_weight = np.zeros((nj, 2))
    total_self = 0.0
    for m in geometry.members:
        mw = member_weights[m.label]
        wt = (mw.area_in2 / IN2_PER_FT2 * geometry.member_length_ft(m.label)
              * mw.unit_weight_pcf / LB_PER_KIP * (1.0 + detail_allowance))
        total_self += wt
        for end in (m.start, m.end):
            self_weight[geometry.joint_index[end], 1] -= wt / 2.0
    totals = [loads[DeadLoadKind.DC][s].sum() + loads[DeadLoadKind.DW][s].sum() for s in (0, 1)]
    side = 0 if totals[0] <= totals[1] else 1  # loads are negative: more negative = heavier
    rated = "left" if side == 0 else "right"
    P_dc = loads[DeadLoadKind.DC][side] + self_weight
    P_dw = loads[DeadLoadKind.DW][side]
    # The active set follows the total dead load; DC and DW are then split on that set.
    fam = family if family is not None else TrussFamily(geometry)
    total = solve_tension_only(geometry, P_dc + P_dw, family=fam)
    lt = fam.solver(total.slack)
    assumptions = []
    if not detail_allowance_given:
        assumptions.append(
            f"Truss self-weight increased by {detail_allowance:.0%} for pins, lacing, rivets "
            "and connection plates (assumed; common practice).")
    assumptions.append(
        "Dead load reaches the truss at the deck panel points through simple-span stringers; "
        "member self-weight is lumped half to each end joint (common practice).")
    heavier, lighter = -totals[side], -totals[1 - side]
    if heavier > lighter * (1.0 + 1e-9):
        assumptions.append(
            f"The {rated} truss is rated: it takes the larger share of the deck's dead load "
            f"({heavier:.1f} kip against {lighter:.1f} kip, the trusses' own weight apart).")
    else:
        assumptions.append(
            "The two trusses take the same share of the deck's dead load; the left one is "
            "rated (they are alike).")
    return DeadLoadResult(
        joint_loads_dc_kip=P_dc, joint_loads_dw_kip=P_dw, total=total,
        member_forces_dc_kip=lt.solve(P_dc).member_forces_kip,
        member_forces_dw_kip=lt.solve(P_dw).member_forces_kip,
        joint_loads_dw_surface_kip=surface[side],
        member_forces_dw_surface_kip=lt.solve(surface[side]).member_forces_kip,
        rated_truss=rated, share_by_item=tuple((d, (lft, rgt)[side]) for d, lft, rgt in shares),
        self_weight_kip=total_self, assumptions=tuple(assumptions),
    )


def is_wearing_surface(item: DeadLoadItem) -> bool:
    """A DW item spread over the deck in psf is the wearing surface (LRFD 3.3.2: DW is the
    wearing surface and utilities; utilities are given per foot of bridge or truss)."""
    return item.kind is DeadLoadKind.DW and item.basis is DeadLoadBasis.PSF_DECK
