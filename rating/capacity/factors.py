"""Condition factor phi_c and system factor phi_s of a member, as data with sources.

The tables live in ``factors.json`` beside this module (value, source and tag of each). The
member's condition comes from the lowest condition rating among its findings; the owner can
override either factor on the member (``MemberDesign.condition_factor/system_factor``).
"""

from __future__ import annotations

import json
import math
from collections.abc import Sequence
from dataclasses import dataclass
from functools import lru_cache
from importlib import resources

from rating.capacity.sections import section_kind
from rating.errors import InputError
from rating.model import EyebarSet, Finding, MemberDesign, RodSet, Section


@lru_cache(maxsize=1)
def factor_tables() -> dict:
    """The factor tables as shipped (read-only use)."""
    return json.loads(resources.files("rating.capacity").joinpath("factors.json").read_text())


def condition_factor(condition: str) -> float:
    """phi_c: good or satisfactory 1.00, fair 0.95, poor 0.85.

    MBE Table 6A.4.2.3-1. [value from memory]
    """
    values = factor_tables()["condition_factor"]["values"]
    key = condition.strip().lower()
    if key in ("good", "satisfactory"):
        key = "good or satisfactory"
    if key not in values:
        raise InputError(f"unknown member condition {condition!r}; use one of "
                         f"{', '.join(values)}")
    return float(values[key])


def condition_from_rating(rating: int, where: str = "") -> str:
    """Member condition from an NBI-style 0-9 rating: >= 6 good/satisfactory, 5 fair, <= 4 poor.

    NBI condition-rating scale mapped to MBE condition classes. [common practice]
    """
    if isinstance(rating, bool) or not isinstance(rating, int) or not 0 <= rating <= 9:
        raise InputError(f"condition rating must be a whole number 0 to 9, got {rating!r}",
                         where or None)
    t = factor_tables()["condition_from_rating"]
    if rating >= t["good_or_satisfactory_min"]:
        return "good or satisfactory"
    if rating >= t["fair_min"]:
        return "fair"
    return "poor"


def system_factor(row: str) -> float:
    """phi_s of a row of the system factor table.

    MBE Table 6A.4.2.4-1. [value from memory]
    """
    values = factor_tables()["system_factor"]["values"]
    if row not in values:
        raise InputError(f"unknown system factor row {row!r}")
    return float(values[row])


def system_factor_row(section: Section, carrying_count: int) -> str:
    """Row of the system factor table for a truss member section (our mapping).

    Mapping of sections to MBE Table 6A.4.2.4-1 rows. [common practice]
    """
    return factor_tables()["system_factor_by_section"][_section_key(section, carrying_count)]


def _section_key(section: Section, carrying_count: int) -> str:
    """The key of a section in the mapping to the system factor table ("eyebar set, one
    bar", "built-up", ...)."""
    kind = section_kind(section)
    if not isinstance(section, EyebarSet | RodSet):
        return kind
    word = "bar" if isinstance(section, EyebarSet) else "rod"
    return f"{kind}, {f'two or more {word}s' if carrying_count >= 2 else f'one {word}'}"


def _system_factor_reason(section: Section, carrying_count: int) -> str:
    """Why a bar or rod section takes the row it does (our mapping, common practice)."""
    why = factor_tables()["system_factor_by_section"]["why"]
    return why.get(_section_key(section, carrying_count), "")


def combined_factor(phi_c: float, phi_s: float, floor: float | None = None) -> float:
    """phi_c x phi_s, not less than 0.85.

    Khan 2010, p. 187: phi_c phi_s >= 0.85. [V]
    """
    lo = factor_tables()["product_floor"]["value"] if floor is None else floor
    return max(phi_c * phi_s, lo)


@dataclass(frozen=True)
class MemberFactors:
    """phi_c and phi_s of one member with where they came from."""

    phi_c: float
    phi_s: float
    condition: str
    condition_rating: int | None
    floor: float
    assumptions: tuple[str, ...]
    warnings: tuple[str, ...]

    @property
    def phi_cs(self) -> float:
        """phi_c phi_s with the 0.85 floor applied (Khan 2010, p. 187) [V]."""
        return max(self.phi_c * self.phi_s, self.floor)

    @property
    def floor_applied(self) -> bool:
        return self.phi_c * self.phi_s < self.floor


def member_condition(findings: Sequence[Finding]) -> tuple[int | None, Finding | None]:
    """The lowest condition rating among the findings and the finding that records it."""
    low: tuple[int, Finding] | None = None
    for f in findings:
        if f.condition_rating is None:
            continue
        condition_from_rating(f.condition_rating, f.where)  # validates 0-9
        if low is None or f.condition_rating < low[0]:
            low = (f.condition_rating, f)
    return (low[0], low[1]) if low else (None, None)


def _owner(value: float | None, what: str, design: MemberDesign) -> float | None:
    if value is None:
        return None
    if not isinstance(value, int | float) or not math.isfinite(value) or not 0 < value <= 1.0:
        raise InputError(f"member {design.member}: owner's {what} must be more than 0 and not "
                         f"more than 1.0, got {value!r}", design.where or None)
    return float(value)


def member_factors(design: MemberDesign, findings: Sequence[Finding], carrying_count: int,
                   *, floor: float | None = None) -> MemberFactors:
    """phi_c from the member's findings (or owner), phi_s from its section (or owner).

    MBE Tables 6A.4.2.3-1 and 6A.4.2.4-1 [value from memory]; floor Khan 2010 p. 187 [V].
    """
    tabs = factor_tables()
    lo = tabs["product_floor"]["value"] if floor is None else floor
    assumptions: list[str] = []
    warnings: list[str] = []
    m = design.member
    rating, f = member_condition(findings)
    owner_c = _owner(design.condition_factor, "condition factor", design)
    if owner_c is not None:
        phi_c = owner_c
        condition = "owner"
        assumptions.append(f"member {m}: condition factor phi_c = {phi_c:g} set by the owner")
    elif rating is None:
        condition = "good or satisfactory"
        phi_c = condition_factor(condition)
        assumptions.append(f"member {m}: no condition rating recorded; taken as good or "
                           f"satisfactory, phi_c = {phi_c:g} "
                           f"({tabs['condition_factor']['source']}, "
                           f"{tabs['condition_factor']['tag']})")
    else:
        condition = condition_from_rating(rating, f.where if f else "")
        phi_c = condition_factor(condition)
        assumptions.append(f"member {m}: condition rating {rating} "
                           f"({f.where if f and f.where else 'lowest recorded'}) -> {condition},"
                           f" phi_c = {phi_c:g} ({tabs['condition_factor']['source']}, "
                           f"{tabs['condition_factor']['tag']}; rating mapped by "
                           f"{tabs['condition_from_rating']['source'].split(' (')[0]}, "
                           f"{tabs['condition_from_rating']['tag']})")
    if rating is not None and rating <= tabs["condition_from_rating"]["serious_max"]:
        warnings.append(f"SERIOUS CONDITION: member {m}: condition rating {rating} (serious or "
                        "worse, NBI scale): its rating allows for it only through phi_c; a member "
                        "in this condition calls for the engineer's decision on repair, "
                        "restriction or closure beyond what its rating factor says")
    owner_s = _owner(design.system_factor, "system factor", design)
    if owner_s is not None:
        phi_s = owner_s
        assumptions.append(f"member {m}: system factor phi_s = {phi_s:g} set by the owner")
    else:
        row = system_factor_row(design.section, carrying_count)
        phi_s = system_factor(row)
        why = _system_factor_reason(design.section, carrying_count)
        assumptions.append(f"member {m}: system factor phi_s = {phi_s:g} ({row}"
                           f"{f': {why}' if why else ''}; "
                           f"{tabs['system_factor']['source']}, {tabs['system_factor']['tag']};"
                           " section mapping common practice)")
    if phi_c * phi_s < lo:
        assumptions.append(f"member {m}: phi_c x phi_s = {phi_c * phi_s:.3f} raised to the "
                           f"floor {lo:g} (MBE 6A.4.2.1 [value from memory]; Khan 2010, "
                           "p. 187)")
    return MemberFactors(phi_c, phi_s, condition, rating, lo, tuple(assumptions),
                         tuple(warnings))
