"""Cells that differ between two rosters, compared by person and date."""

from __future__ import annotations

from dataclasses import dataclass
from datetime import date
from typing import Any

from rostertui.core.models.common import OFF
from rostertui.core.models.roster import Roster
from rostertui.core.models.workspace import Workspace


@dataclass(frozen=True)
class CellDiff:
    person: str
    date: date
    before: str
    after: str

    def to_json(self) -> dict[str, Any]:
        return {"person": self.person, "date": self.date.isoformat(),
                "before": self.before, "after": self.after}


def code_on(roster: Roster | None, person: str, day: date) -> str:
    """The code a roster holds for a person on a date; off outside its rows or period."""
    if roster is None:
        return OFF
    row = roster.rows.get(person)
    i = (day - roster.start).days
    if row is None or not 0 <= i < len(row):
        return OFF
    return row[i]


def roster_diff(ws: Workspace, before: Roster | None, after: Roster | None) -> list[CellDiff]:
    """Changed cells over the unit's period, in staff order then date order.

    A person missing from a roster (or a roster that is None) is off; people no
    longer in staff.toml come last, so nothing that changed is left out.
    """
    people = list(ws.person_ids)
    extra = {*(before.rows if before else {}), *(after.rows if after else {})} - set(people)
    out: list[CellDiff] = []
    for pid in people + sorted(extra):
        for day in ws.unit.dates:
            a, b = code_on(before, pid, day), code_on(after, pid, day)
            if a != b:
                out.append(CellDiff(pid, day, a, b))
    return out
