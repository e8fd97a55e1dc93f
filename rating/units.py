"""The one place where unit systems are converted.

The core works in US customary units: kip, ft (geometry, stations, spans), in (section
dimensions), ksi (stresses), klf (line loads), psf/plf (dead-load intensities), short tons
(vehicle weights). SI input (kN, m, mm, MPa, kN/m, kPa, tonne) is converted at the edges.
Conversion factors are exact by definition (NIST SP 811, Appendix B).
"""

from __future__ import annotations

import math
import re
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
    # section modulus
    "in3": Quantity("section modulus", "in3", 1.0),
    "mm3": Quantity("section modulus", "in3", IN_PER_MM**3),
    # moment of inertia
    "in4": Quantity("moment of inertia", "in4", 1.0),
    "mm4": Quantity("moment of inertia", "in4", IN_PER_MM**4),
    # warping constant
    "in6": Quantity("warping constant", "in6", 1.0),
    "mm6": Quantity("warping constant", "in6", IN_PER_MM**6),
    # spring stiffness (a U-frame's)
    "kip/in": Quantity("spring stiffness", "kip/in", 1.0),
    "kN/mm": Quantity("spring stiffness", "kip/in", KIP_PER_KN / IN_PER_MM),
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
              "psf": "kPa", "pcf": "kN/m3", "ton": "tonne", "kip-in": "kN-m", "in3": "mm3",
              "in4": "mm4", "in6": "mm6", "kip/in": "kN/mm"}


# Quantities written in core units inside message text ("pin 2.99213 in", "E = 27000 ksi"),
# as the capacity and rating layers word their warnings and assumptions.
_TEXT_CORE_UNITS = {"kip-in": "kip-in", "kip/in": "kip/in", "in6": "in6", "in4": "in4",
                    "kip": "kip",
                    "ksi": "ksi", "klf": "klf", "plf": "plf", "psf": "psf", "pcf": "pcf",
                    "in3": "in3", "in2": "in2", "in^2": "in2", "in²": "in2", "ft": "ft",
                    "in": "in", "tons": "ton", "ton": "ton"}
_SI_TEXT_NAME = {"tonne": "tonnes"}
_TEXT_QUANTITY = re.compile(
    r"(?<![\w./^'\"-])(-?\d+(?:\.\d+)?(?:[eE][-+]?\d+)?)( ?)"
    r"(kip-in|kip/in|kip|ksi|klf|plf|psf|pcf|in6|in4|in3|in2|in\^2|in²|ft|in|tons|ton)"
    r"(?![\w²^/-])")


def _si_number(x: float) -> str:
    """Four significant digits, never an exponent (a reading, not a computation)."""
    if x == 0.0 or not math.isfinite(x):
        return f"{x:g}"
    if abs(x) >= 1000.0:
        digits = 3 - int(math.floor(math.log10(abs(x))))
        return f"{round(x, digits):.0f}"
    return f"{x:.4g}"


def si_text(text: str) -> str:
    """``text`` with every quantity written in a core (US) unit restated in SI.

    For the warnings and assumptions of an SI bridge: "pin 2.99213 in" becomes "pin 76 mm".
    A fraction ("1/32 in", a code's own wording) and a quoted value ('3 in', the user's own
    words) are left as they stand.
    """
    def one(m: re.Match[str]) -> str:
        unit = _TEXT_CORE_UNITS[m.group(3)]
        core = to_core(float(m.group(1)), unit)
        si = SI_OF_CORE[core_unit_of(unit)]
        value = from_core(core, si)
        name = _SI_TEXT_NAME.get(si, si) if m.group(3) == "tons" else si
        return f"{_si_number(value)}{m.group(2) or ' '}{name}"

    return _TEXT_QUANTITY.sub(one, text)
