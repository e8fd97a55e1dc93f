"""One resistance check of a member: what it is, where it governs and by which provision."""

from __future__ import annotations

from dataclasses import dataclass, field
from enum import StrEnum

from rating.capacity.sections import Location
from rating.model import Finding


class Sense(StrEnum):
    """The sense of axial force a check resists (tension positive project-wide)."""

    TENSION = "tension"
    COMPRESSION = "compression"


@dataclass(frozen=True)
class Check:
    """A nominal resistance ``R_n_kip`` with its resistance factor ``phi``.

    ``location`` is the governing location along the member for this check, with the
    findings acting there (``finding`` is the one that made it govern, None when as built).
    ``detail`` gives the quantities used, for the report.
    """

    name: str = field(metadata={"label": "Check", "unit": ""})
    sense: Sense = field(metadata={"label": "Sense", "unit": ""})
    phi: float = field(metadata={"label": "phi", "unit": ""})
    R_n_kip: float = field(metadata={"label": "R_n", "unit": "kip"})
    provision: str = field(metadata={"label": "Provision", "unit": ""})
    location: Location = field(default_factory=Location,
                               metadata={"label": "Governing location", "unit": ""})
    detail: str = field(default="", metadata={"label": "Quantities", "unit": ""})

    @property
    def phi_R_n_kip(self) -> float:
        """Factored resistance phi R_n (before the condition and system factors), kip."""
        return self.phi * self.R_n_kip

    @property
    def finding(self) -> Finding | None:
        return self.location.finding
