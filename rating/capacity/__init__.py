"""Member and pin resistances after section loss; every provision cited in its docstring.

Entry points: ``member_capacity`` (one member, all checks, phi_c and phi_s) and ``pin_check``
(one pin under the concurrent member forces of one load state).
"""

from rating.capacity.checks import Check, Sense
from rating.capacity.member import MemberCapacity, SectionSummary, member_capacity
from rating.capacity.pins import (
    MemberAction,
    PinCheck,
    pin_actions,
    pin_check,
    pin_load_multiplier,
)
from rating.capacity.sections import (
    Location,
    SectionReport,
    gross_area_as_built_in2,
    section_properties,
)

__all__ = [
    "Check", "Location", "MemberAction", "MemberCapacity", "PinCheck", "SectionReport",
    "SectionSummary", "Sense", "gross_area_as_built_in2", "member_capacity", "pin_actions",
    "pin_check", "pin_load_multiplier", "section_properties",
]
