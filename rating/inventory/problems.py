"""What the reader found wrong or assumed: problems with their Sheet!Cell, and the result."""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Literal

from rating.model import Bridge

Severity = Literal["error", "warning"]


@dataclass(frozen=True)
class Problem:
    """One finding of the workbook check.

    ``where`` is ``Sheet!Cell`` (e.g. ``Eyebars!D7``); ``message`` is a sentence a bridge
    engineer can act on. An error stops the rating; a warning is listed in the report.
    """

    severity: Severity
    where: str
    message: str

    def format(self) -> str:
        """One line for the terminal."""
        return f"{self.severity:<7} {self.where}: {self.message}"


@dataclass(frozen=True)
class WorkbookReading:
    """The bridge read from a workbook (``None`` when there are errors) and every problem.

    ``assumptions`` are the defaults the reader assumed; each is also listed as a warning.
    """

    bridge: Bridge | None
    problems: tuple[Problem, ...] = ()
    assumptions: tuple[str, ...] = ()

    @property
    def errors(self) -> tuple[Problem, ...]:
        return tuple(p for p in self.problems if p.severity == "error")

    @property
    def warnings(self) -> tuple[Problem, ...]:
        return tuple(p for p in self.problems if p.severity == "warning")


@dataclass
class ProblemLog:
    """Collects problems while one workbook is read (one instance per read, never shared)."""

    problems: list[Problem] = field(default_factory=list)
    assumptions: list[str] = field(default_factory=list)

    def error(self, where: str, message: str) -> None:
        self.problems.append(Problem("error", where, message))

    def warning(self, where: str, message: str) -> None:
        self.problems.append(Problem("warning", where, message))

    def assume(self, where: str, text: str) -> None:
        """A default the reader assumed: listed once as an assumption and as a warning."""
        if text not in self.assumptions:
            self.assumptions.append(text)
            self.problems.append(Problem("warning", where, "assumed: " + text))

    @property
    def has_errors(self) -> bool:
        return any(p.severity == "error" for p in self.problems)
