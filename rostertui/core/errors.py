"""One error hierarchy for the core, free of CLI and UI types."""

from __future__ import annotations

from dataclasses import dataclass


@dataclass(frozen=True)
class Problem:
    """One thing wrong (or worth a warning) in a user's file."""

    file: str
    key: str
    message: str
    line: int | None = None

    def __str__(self) -> str:
        where = self.file
        if self.key:
            where += f": {self.key}"
        if self.line is not None:
            where += f" (line {self.line})"
        return f"{where}: {self.message}"


class RosterError(Exception):
    """Base of every error the core raises on purpose."""


class InputError(RosterError):
    """The workspace could not be read; holds every problem found in the run."""

    def __init__(self, problems: list[Problem]):
        self.problems = list(problems)
        super().__init__(self.summary())

    def summary(self) -> str:
        n = len(self.problems)
        head = f"{n} problem{'s' if n != 1 else ''} in the input:"
        return "\n".join([head, *(f"  {p}" for p in self.problems)])


class EditError(RosterError):
    """A change to a roster that cannot be made (unknown person, date outside the
    period, a locked cell); the message says why, in words."""
