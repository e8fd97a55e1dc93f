"""Material of a member or pin as the rating uses it (ksi, pcf)."""

from __future__ import annotations

from dataclasses import dataclass
from enum import StrEnum


class MaterialKind(StrEnum):
    STEEL = "steel"
    WROUGHT_IRON = "wrought iron"


@dataclass(frozen=True)
class Material:
    """Strengths in ksi. ``basis`` says where the values come from (coupon tests, mill
    certificates, or a default by year of construction); ``assumed`` marks a default."""

    kind: MaterialKind
    F_y: float
    F_u: float
    E: float = 29000.0
    unit_weight_pcf: float = 490.0
    basis: str = "given"
    assumed: bool = False
