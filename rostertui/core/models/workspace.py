"""The loaded workspace: every file's model plus the effective, resolved rule set."""

from __future__ import annotations

from dataclasses import dataclass, field
from datetime import date
from functools import cached_property
from pathlib import Path

from rostertui.core.errors import Problem
from rostertui.core.models.common import NIGHT_SELECTOR
from rostertui.core.models.history import History
from rostertui.core.models.requests import RequestsFile
from rostertui.core.models.roster import Roster
from rostertui.core.models.rules import Rule
from rostertui.core.models.shifts import Shift, ShiftsFile
from rostertui.core.models.staff import Person, Staff
from rostertui.core.models.unit import Unit


@dataclass(frozen=True)
class EffectiveRule:
    """A rule of the effective set: where it came from and whom it applies to."""

    rule: Rule
    origin: str  # "unit.toml" or the preset it came from
    people: tuple[str, ...]  # person ids in scope, in staff order

    @property
    def id(self) -> str:
        return self.rule.id

    @property
    def hard(self) -> bool:
        return self.rule.weight is None


@dataclass
class Workspace:
    """A validated workspace. Build it with `rostertui.core.io.load.load_workspace`."""

    unit: Unit
    staff: Staff
    shifts: ShiftsFile
    requests: RequestsFile = field(default_factory=RequestsFile)
    history: History | None = None
    roster: Roster | None = None
    rules: list[EffectiveRule] = field(default_factory=list)
    warnings: list[Problem] = field(default_factory=list)
    path: Path | None = None

    @cached_property
    def shift_by_code(self) -> dict[str, Shift]:
        return {s.code: s for s in self.shifts.shift}

    @cached_property
    def person_by_id(self) -> dict[str, Person]:
        return {p.id: p for p in self.staff.person}

    @property
    def person_ids(self) -> list[str]:
        return [p.id for p in self.staff.person]

    @property
    def dates(self) -> list[date]:
        return self.unit.dates

    def select(self, selector: str) -> frozenset[str]:
        """Shift codes a rule's selector names: one code, "@night", or "-" (off)."""
        if selector == NIGHT_SELECTOR:
            return frozenset(s.code for s in self.shifts.shift if s.is_night)
        return frozenset([selector])
