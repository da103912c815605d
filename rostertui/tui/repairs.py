"""Swaps and absences planned on the session's roster before anything changes. Pure.

A plan holds the new roster (and requests), the cells that change and the
`Impact` on the check: the violations the change would create and those it would
resolve. The session applies a plan as one undoable step; the UI shows it first.
"""

from __future__ import annotations

import dataclasses
from dataclasses import dataclass
from datetime import date

from rostertui.core.check import CheckResult, Violation, check_roster
from rostertui.core.errors import EditError
from rostertui.core.models.requests import RequestsFile
from rostertui.core.models.roster import Roster
from rostertui.core.models.workspace import Workspace
from rostertui.core.repair.absence import Absence, record_absence
from rostertui.core.repair.diff import CellDiff
from rostertui.core.repair.impact import Impact, impact
from rostertui.core.repair.swap import swap
from rostertui.core.words import day as day_text
from rostertui.core.words import span


@dataclass(frozen=True)
class SwapPlan:
    label: str
    cells: list[CellDiff]  # the cells that change, before and after
    roster: Roster
    impact: Impact


@dataclass(frozen=True)
class AbsencePlan:
    label: str
    absence: Absence
    roster: Roster
    impact: Impact

    @property
    def requests(self) -> RequestsFile:
        return self.absence.requests

    @property
    def cleared(self) -> list[CellDiff]:
        return self.absence.cleared

    @property
    def short(self) -> list[Violation]:
        """Hard cover breaches the absence opens: the cover now short."""
        return [v for v in self.impact.created if v.hard and v.kind == "cover"]


def date_of(ws: Workspace, day: int) -> date:
    if not 0 <= day < ws.unit.days:
        raise EditError(f"day {day + 1} is outside the period")
    return ws.unit.dates[day]


def swap_label(ws: Workspace, person: str, first: date, person2: str,
               second: date | None) -> str:
    name, name2 = ws.person_by_id[person].name, ws.person_by_id[person2].name
    if second is None or second == first:
        return f"swap {name} and {name2} on {day_text(first)}"
    if person == person2:
        return f"swap {name}'s {day_text(first)} and {day_text(second)}"
    return f"swap {name} and {name2} on {day_text(first)} and {day_text(second)}"


def plan_swap(ws: Workspace, roster: Roster, check: CheckResult, person: str, day: int,
              person2: str, day2: int | None = None) -> SwapPlan:
    """Exchange two cells (one person on two days, two people on one day) or, for two
    people on two days, both days' cells. Raises EditError (locked, same cell...)."""
    first = date_of(ws, day)
    second = date_of(ws, day2) if day2 is not None else None
    new, cells = swap(ws, roster, person, first, person2, second)
    after = check_roster(ws, new)
    label = swap_label(ws, person, first, person2, second)
    return SwapPlan(label, cells, new, impact(check, after))


def plan_absence(ws: Workspace, roster: Roster, check: CheckResult, person: str, first: date,
                 last: date | None = None, reason: str | None = None,
                 credit_hours: float | None = None) -> AbsencePlan:
    """Leave for `person` from `first` to `last`, their shifts then cleared. Raises
    EditError (unknown person, dates outside the period, a credit out of range)."""
    absence = record_absence(dataclasses.replace(ws, roster=roster), person, first, last,
                             reason or None, credit_hours)
    new = absence.roster or roster
    after = check_roster(dataclasses.replace(ws, requests=absence.requests), new)
    last = last or first
    when = day_text(first) if last == first else span(first, last)
    name = ws.person_by_id[person].name
    return AbsencePlan(f"{name} absent {when}", absence, new, impact(check, after))


MONTHS = {m.lower(): i + 1 for i, m in enumerate(
    ("Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"))}


def parse_day(ws: Workspace, text: str) -> date:
    """A date typed in a form: 2027-03-20, "20 Mar" (as the grid shows dates) or "20"
    (that day of the month, in the period). Raises EditError."""
    text = text.strip()
    try:
        return date.fromisoformat(text)
    except ValueError:
        pass
    parts = text.replace("/", " ").split()
    found: list[date] = []
    if parts and parts[0].isdigit() and len(parts) <= 2:
        month = MONTHS.get(parts[1][:3].lower()) if len(parts) == 2 else None
        if len(parts) == 1 or month is not None:
            found = [d for d in ws.unit.dates
                     if d.day == int(parts[0]) and month in (None, d.month)]
    if not found:
        raise EditError(f"{text!r} is not a date in the period: type 2027-03-20, 20 Mar or 20")
    return found[0]
