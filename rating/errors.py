"""The project's own exception types.

Every error a user can cause is one of these, with a message a bridge engineer understands and,
where the value came from a workbook, the ``Sheet!Cell`` where it sits.
"""

from __future__ import annotations


class PintrussError(Exception):
    """Base of every error pintruss raises on purpose."""


class InputError(PintrussError):
    """A value given by the user cannot be rated; ``where`` names its place (``Members!C7``)."""

    def __init__(self, message: str, where: str | None = None) -> None:
        self.message = message
        self.where = where
        super().__init__(f"{where}: {message}" if where else message)


class UsageError(InputError):
    """The command was misused: an output path that cannot be written as asked (a file that
    exists without --force, a folder, a folder that does not exist). Exit code 2."""


class GeometryError(InputError):
    """The truss as described is not a valid pin-jointed structure (bad labels, lengths...)."""


class InstabilityError(GeometryError):
    """The truss is a mechanism or has a loose joint: named joint, free direction."""

    def __init__(self, message: str, joint: str, direction: str, where: str | None = None) -> None:
        self.joint = joint
        self.direction = direction
        super().__init__(message, where)


class ConvergenceError(PintrussError):
    """An iterative method (e.g. the tension-only active set) did not settle; never hidden."""
