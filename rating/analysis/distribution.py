"""Lateral distribution of a rating vehicle to one truss by the lever rule across the floorbeam.

The floorbeam spans between the two trusses as a simple beam (with cantilevers where the
roadway runs past a truss line); a wheel's share to a truss follows from statics. The share is
linear in the wheel's position, so the extreme share lies at a limit of the vehicles' transverse
positions: every loaded vehicle as close to the truss as the rules allow, in the lanes nearest
that truss. The factor returned is the fraction of ONE vehicle's axle loads (both wheel lines)
that goes to the truss, multiple presence included; multiply the one-truss forces of one
whole vehicle by it.

Coordinates across the bridge are ft from the left truss centre line, positive to the right.
The same factor serves the lane load: a 10-ft lane load pushed against the same curb or lane
edge has its centroid 5 ft from it, exactly where the centroid of the 6-ft wheel pair 2 ft from
the edge lies, and the lever rule is linear.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

from rating.errors import InputError
from rating.model.bridge import CrossSection

DEFAULT_MULTIPLE_PRESENCE: tuple[float, ...] = (1.20, 1.00, 0.85, 0.65)
"""Multiple presence factors for 1, 2, 3 and more loaded lanes, LRFD Table 3.6.1.1.2-1
[value from memory]."""

SOURCE_LANES = ("AASHTO LRFD 3.6.1.1.1 and MBE 6A.2.3.2 (design lanes; two on a roadway of 18 "
                "to 24 ft, each half its width) [value from memory]")
SOURCE_MPF = "AASHTO LRFD Table 3.6.1.1.2-1 (multiple presence) [value from memory]"
SOURCE_WHEELS = ("AASHTO LRFD 3.6.1.2.1 / 3.6.1.3.1 (6 ft wheel gauge; wheel not closer than "
                 "2 ft to the curb or lane edge) [value from memory]")
SOURCE_LEVER = "lever rule, statics of a simple-span floorbeam [common practice]"


@dataclass(frozen=True)
class LaneCase:
    """One loading across the floorbeam: ``loaded_lanes`` vehicles packed toward ``truss``.

    ``wheel_offsets_ft``: every wheel line, ft from the left truss. ``share``: sum of the
    vehicles' fractions to the truss (no multiple presence); ``factor`` = share x MPF.
    """

    truss: str
    loaded_lanes: int
    multiple_presence: float
    wheel_offsets_ft: tuple[float, ...]
    share: float
    factor: float


@dataclass(frozen=True)
class DistributionResult:
    """Governing fraction of one vehicle's axle loads carried by one truss.

    ``factor`` is the lever-rule value or the owner's override (``basis`` says which);
    ``governing`` the case that gives the lever-rule value; ``cases`` every case looked at.
    """

    factor: float
    basis: str
    lever_rule_factor: float
    governing: LaneCase
    cases: tuple[LaneCase, ...]
    design_lanes: int
    lane_width_ft: float
    roadway_width_ft: float
    truss_spacing_ft: float
    warnings: tuple[str, ...] = ()
    sources: tuple[str, ...] = (SOURCE_LEVER, SOURCE_LANES, SOURCE_MPF, SOURCE_WHEELS)

    @property
    def description(self) -> str:
        """One sentence for the report."""
        g = self.governing
        lanes = "one lane" if g.loaded_lanes == 1 else f"{g.loaded_lanes} lanes"
        text = (f"lever rule across the floorbeam, trusses {self.truss_spacing_ft:g} ft apart, "
                f"roadway {self.roadway_width_ft:g} ft, {self.design_lanes} design lane"
                f"{'s' if self.design_lanes != 1 else ''} of {self.lane_width_ft:g} ft: "
                f"{lanes} loaded toward the {g.truss} truss governs ({wheels_text(g)}), share "
                f"{g.share:.3f} x multiple presence {g.multiple_presence:g} = {g.factor:.3f}")
        if self.design_lanes == 2 and 18.0 <= self.roadway_width_ft < 20.0:
            text += (" (two lanes on a roadway of 18 to 20 ft, each half its width: MBE "
                     "6A.2.3.2 [value from memory]; an owner who rates such a bridge as one "
                     "lane gives the lane count in the workbook)")
        if self.basis == "owner override":
            text = (f"owner's distribution factor {self.factor:.3f} used "
                    f"(lever rule would give {self.lever_rule_factor:.3f}; {text})")
        return text


def wheels_text(case: LaneCase) -> str:
    """Where a lane case puts the wheel lines, in words ("wheel lines 3 and 9 ft from the left
    truss"), so that a reviewer can work the lever rule again."""
    offsets = [f"{w:.4g}" for w in case.wheel_offsets_ft]
    listed = ", ".join(offsets[:-1]) + f" and {offsets[-1]}" if len(offsets) > 1 else offsets[0]
    return f"wheel lines {listed} ft from the left truss"


def design_lane_count(roadway_width_ft: float, *, lane_width_ft: float = 12.0,
                      two_lanes_20_to_24_ft: bool = True,
                      two_lanes_18_to_20_ft: bool = True) -> int:
    """Number of design lanes: INT(roadway / 12 ft), at least one; 20 to 24 ft gives two
    (AASHTO LRFD 3.6.1.1.1), and for a rating 18 to 20 ft gives two as well, each half the
    roadway (MBE 6A.2.3.2; under 18 ft one lane). [value from memory]
    """
    # (to a millionth of a foot: an SI width is a converted number, 5.4864 m is 18 ft, not
    # 17.999999999999996 ft, which would lose the second lane)
    w = round(float(roadway_width_ft), 6)
    if two_lanes_20_to_24_ft and 20.0 <= w <= 24.0:
        return 2
    if two_lanes_18_to_20_ft and 18.0 <= w < 20.0:
        return 2
    return max(1, int(math.floor(w / lane_width_ft + 1e-9)))


def multiple_presence_factor(loaded_lanes: int,
                             factors: Sequence[float] = DEFAULT_MULTIPLE_PRESENCE) -> float:
    """Multiple presence factor m for the number of loaded lanes (the last value for more).

    AASHTO LRFD Table 3.6.1.1.2-1, 1.20 / 1.00 / 0.85 / 0.65. [value from memory]
    """
    if loaded_lanes < 1:
        raise InputError(f"the number of loaded lanes must be at least 1, got {loaded_lanes}")
    return float(factors[min(loaded_lanes, len(factors)) - 1])


def lever_rule_fraction(offset_ft: float, truss_spacing_ft: float) -> tuple[float, float]:
    """Fractions (left, right) of a wheel at ``offset_ft`` from the left truss.

    Lever rule, statics of a simple-span floorbeam with cantilevers. [common practice]
    """
    right = offset_ft / truss_spacing_ft
    return 1.0 - right, right


def _vehicle_centres(lane_width: float, lanes: int, edge: float, gauge: float,
                     toward_left: bool, roadway_left: float, roadway_right: float) -> list[float]:
    """Centre of each vehicle, nearest first, packed toward one side of the roadway."""
    half = min(edge + gauge / 2.0, lane_width / 2.0)
    out = []
    for k in range(lanes):
        if toward_left:
            out.append(roadway_left + k * lane_width + half)
        else:
            out.append(roadway_right - k * lane_width - half)
    return out


def lateral_distribution(
    cross_section: CrossSection,
    *,
    override: float | None = None,
    lane_width_ft: float = 12.0,
    wheel_gauge_ft: float = 6.0,
    wheel_to_edge_ft: float = 2.0,
    multiple_presence: Sequence[float] = DEFAULT_MULTIPLE_PRESENCE,
    two_lanes_20_to_24_ft: bool = True,
    two_lanes_18_to_20_ft: bool = True,
    prefer: str | None = None,
    where: str = "",
) -> DistributionResult:
    """Governing lever-rule fraction of one vehicle's axle loads to one truss, one-lane and
    multi-lane cases with multiple presence, or the owner's override.

    Lever rule; LRFD 3.6.1.1.1 and MBE 6A.2.3.2 lanes, LRFD Table 3.6.1.1.2-1 multiple
    presence. [value from memory]

    ``prefer`` ("left" or "right"): the truss named where both get the same share (a
    symmetric roadway), so that the live load is described for the truss rated for dead load.
    """
    S = float(cross_section.truss_spacing_ft)
    w = float(cross_section.roadway_width_ft)
    if not (math.isfinite(S) and S > 0):
        raise InputError(f"the truss spacing must be a positive distance, got {S:g} ft", where
                         or None)
    if not (math.isfinite(w) and w > 0):
        raise InputError(f"the roadway width must be a positive distance, got {w:g} ft", where
                         or None)
    if w < wheel_gauge_ft:
        raise InputError(f"the roadway is {w:g} ft wide, narrower than the {wheel_gauge_ft:g} ft "
                         "wheel gauge: no rating vehicle fits on it; check the cross-section",
                         where or None)
    left = float(cross_section.curb_left_ft)
    right = float(cross_section.curb_right_ft)
    warnings: list[str] = []
    if w < 2 * wheel_to_edge_ft + wheel_gauge_ft:
        warnings.append(
            f"roadway {w:g} ft is narrower than {2 * wheel_to_edge_ft + wheel_gauge_ft:g} ft: "
            f"the vehicle cannot keep {wheel_to_edge_ft:g} ft from both curbs and is centred "
            "on the roadway; check that the rating vehicles can use the bridge at all and how "
            "it is signed")
    if left < -1e-9 or right > S + 1e-9:
        warnings.append("the roadway runs past a truss line; wheels outside the trusses load "
                        "the floorbeam cantilever (lever rule with overhang)")
    if cross_section.lane_count_override is not None:
        n = int(cross_section.lane_count_override)
        if n < 1:
            raise InputError(f"the owner's lane count must be at least 1, got {n}", where or None)
        lane_w = min(lane_width_ft, w / n)
        design = design_lane_count(w, lane_width_ft=lane_width_ft,
                                   two_lanes_20_to_24_ft=two_lanes_20_to_24_ft,
                                   two_lanes_18_to_20_ft=two_lanes_18_to_20_ft)
        if n < design:
            warnings.append(
                f"the owner's lane count ({n}) is less than the {design} design lanes of a "
                f"{w:g} ft roadway (AASHTO LRFD 3.6.1.1.1, MBE 6A.2.3.2 [value from memory]): "
                "with fewer lanes loaded the trusses' share of the live load can be smaller "
                "than the roadway allows, and every rating higher; confirm that traffic is "
                "held to that many lanes (striping, the owner's policy)")
        if lane_w < 2 * wheel_to_edge_ft + wheel_gauge_ft:
            warnings.append(f"owner's {n} lanes on a {w:g} ft roadway are {lane_w:.1f} ft wide; "
                            "vehicles are centred in their lanes")
    else:
        n = design_lane_count(w, lane_width_ft=lane_width_ft,
                              two_lanes_20_to_24_ft=two_lanes_20_to_24_ft,
                              two_lanes_18_to_20_ft=two_lanes_18_to_20_ft)
        # two lanes on a roadway of 18 to 24 ft are each half of it (LRFD 3.6.1.1.1, MBE
        # 6A.2.3.2)
        lane_w = w / 2.0 if (n == 2 and w <= 24.0) else lane_width_ft
        lane_w = min(lane_w, w)

    cases = []
    for truss, toward_left in (("left", True), ("right", False)):
        centres = _vehicle_centres(lane_w, n, wheel_to_edge_ft, wheel_gauge_ft, toward_left,
                                   left, right)
        for k in range(1, n + 1):
            wheels = sorted(c + d * wheel_gauge_ft / 2.0 for c in centres[:k] for d in (-1, 1))
            fr = [lever_rule_fraction(x, S)[0 if toward_left else 1] for x in wheels]
            share = sum(fr) / 2.0  # each wheel line carries half of an axle
            mpf = multiple_presence_factor(k, multiple_presence)
            cases.append(LaneCase(truss, k, mpf, tuple(wheels), share, share * mpf))
    # the left truss first on a tie, or the one preferred
    order = sorted(cases, key=lambda c: c.truss != prefer) if prefer else cases
    governing = max(order, key=lambda c: round(c.factor, 12))
    lever = governing.factor
    basis = "lever rule"
    factor = lever
    if override is not None:
        if not (math.isfinite(override) and override > 0):
            raise InputError(f"the owner's distribution factor must be positive, got {override!r}",
                             where or None)
        factor = float(override)
        basis = "owner override"
        if factor < 0.9 * lever:
            warnings.append(f"the owner's distribution factor {factor:.3f} is more than 10% "
                            f"below the lever-rule value {lever:.3f}")
    return DistributionResult(factor, basis, lever, governing, tuple(cases), n, lane_w, w, S,
                              tuple(dict.fromkeys(warnings)))


SOURCE_ONE_VEHICLE = ("MBE Table 6A.4.5.4.2a-1 (DF: one lane for special permits) and MBE "
                      "C6A.4.5.4.2a (the multiple presence factor of 1.20 divided out for the "
                      "permit vehicle alone) [value from memory]")


def one_vehicle_alone(result: DistributionResult) -> LaneCase:
    """The share of one vehicle alone in one lane, with no multiple presence (m = 1.0), on
    the truss it loads most: the lever-rule one-lane case of ``result`` with its multiple
    presence factor divided out, for a special permit.

    MBE Table 6A.4.5.4.2a-1 and C6A.4.5.4.2a [value from memory]; lever rule [common
    practice].
    """
    one = [c for c in result.cases if c.loaded_lanes == 1]
    best = max(one, key=lambda c: round(c.share, 12))
    return LaneCase(best.truss, 1, 1.0, best.wheel_offsets_ft, best.share, best.share)
