"""The one place where unit systems are converted.

The core works in US customary units: kip, ft (geometry, stations, spans), in (section
dimensions), ksi (stresses), klf (line loads), psf/plf (dead-load intensities), short tons
(vehicle weights). SI input (kN, m, mm, MPa, kN/m, kPa, tonne) is converted at the edges.
Conversion factors are exact by definition (NIST SP 811, Appendix B).
"""

from __future__ import annotations

from dataclasses import dataclass

LB_PER_KIP = 1000.0
FT_PER_M = 1.0 / 0.3048
IN_PER_MM = 1.0 / 25.4
KN_PER_KIP = 4.4482216152605
KIP_PER_KN = 1.0 / KN_PER_KIP
KSI_PER_MPA = 1.0 / 6.894757293168361
KLF_PER_KN_PER_M = KIP_PER_KN / FT_PER_M
PSF_PER_KPA = 1000.0 / 47.88025898033584
PCF_PER_KN_PER_M3 = 1000.0 / 157.08746384
TON_PER_TONNE = 1.0 / 0.90718474
KIP_PER_TON = 2.0


@dataclass(frozen=True)
class Quantity:
    """What a unit measures and its factor to the core unit."""

    dimension: str
    core_unit: str
    factor: float


# unit symbol -> (dimension, factor to core unit)
_UNITS: dict[str, Quantity] = {
    # length along the bridge / geometry
    "ft": Quantity("length", "ft", 1.0),
    "m": Quantity("length", "ft", FT_PER_M),
    # section dimensions
    "in": Quantity("dimension", "in", 1.0),
    "mm": Quantity("dimension", "in", IN_PER_MM),
    # area
    "in2": Quantity("area", "in2", 1.0),
    "mm2": Quantity("area", "in2", IN_PER_MM**2),
    # force
    "kip": Quantity("force", "kip", 1.0),
    "kN": Quantity("force", "kip", KIP_PER_KN),
    # stress
    "ksi": Quantity("stress", "ksi", 1.0),
    "MPa": Quantity("stress", "ksi", KSI_PER_MPA),
    # line load
    "klf": Quantity("line load", "klf", 1.0),
    "kN/m": Quantity("line load", "klf", KLF_PER_KN_PER_M),
    "plf": Quantity("line load", "klf", 1.0 / LB_PER_KIP),
    # surface load
    "psf": Quantity("surface load", "psf", 1.0),
    "kPa": Quantity("surface load", "psf", PSF_PER_KPA),
    # unit weight
    "pcf": Quantity("unit weight", "pcf", 1.0),
    "kN/m3": Quantity("unit weight", "pcf", PCF_PER_KN_PER_M3),
    # moment (pins)
    "kip-in": Quantity("moment", "kip-in", 1.0),
    "kN-m": Quantity("moment", "kip-in", KIP_PER_KN * 1000.0 * IN_PER_MM),
    # vehicle weight
    "ton": Quantity("weight", "ton", 1.0),
    "tonne": Quantity("weight", "ton", TON_PER_TONNE),
}


def to_core(value: float, unit: str) -> float:
    """Convert ``value`` given in ``unit`` to the core unit of its dimension."""
    try:
        return value * _UNITS[unit].factor
    except KeyError:
        raise ValueError(f"unknown unit {unit!r}; known: {', '.join(_UNITS)}") from None


def from_core(value: float, unit: str) -> float:
    """Convert a core-unit ``value`` to ``unit`` (for SI reports)."""
    try:
        return value / _UNITS[unit].factor
    except KeyError:
        raise ValueError(f"unknown unit {unit!r}; known: {', '.join(_UNITS)}") from None


def core_unit_of(unit: str) -> str:
    return _UNITS[unit].core_unit


def known_units() -> tuple[str, ...]:
    return tuple(_UNITS)


# The SI counterpart of each core unit, for reports in SI.
SI_OF_CORE = {"ft": "m", "in": "mm", "in2": "mm2", "kip": "kN", "ksi": "MPa", "klf": "kN/m",
              "psf": "kPa", "pcf": "kN/m3", "ton": "tonne", "kip-in": "kN-m"}
