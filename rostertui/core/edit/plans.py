"""Swaps and absences planned on a roster before anything changes. Pure.

The one swap -> check -> impact wiring, used by the editing session and by the
CLI's `swap` and `absent` verbs alike. A plan holds the new roster (and
requests), the cells that change and the `Impact` on the check: the violations
the change would create and those it would resolve. The session applies a plan
as one undoable step (the UI shows it first); the CLI writes it.
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
    roster: Roster | None  # None: there is no roster yet
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


def plan_swap(ws: Workspace, roster: Roster | None, person: str, first: date, person2: str,
              second: date | None = None, check: CheckResult | None = None) -> SwapPlan:
    """Exchange two cells (one person on two dates, two people on one date) or, for two
    people on two dates, both dates' cells. `check`: the roster's, when known. Raises
    EditError (no roster, locked, same cell...)."""
    new, cells = swap(ws, roster, person, first, person2, second)
    before = check if check is not None else check_roster(ws, roster)
    label = swap_label(ws, person, first, person2, second)
    return SwapPlan(label, cells, new, impact(before, check_roster(ws, new)))


def plan_absence(ws: Workspace, roster: Roster | None, person: str, first: date,
                 last: date | None = None, reason: str | None = None,
                 credit_hours: float | None = None,
                 check: CheckResult | None = None) -> AbsencePlan:
    """Leave for `person` from `first` to `last`, their shifts then cleared. `check`: the
    roster's, when known. Raises EditError (unknown person, dates outside the period, a
    credit out of range)."""
    absence = record_absence(dataclasses.replace(ws, roster=roster), person, first, last,
                             reason, credit_hours)
    before = check if check is not None else check_roster(ws, roster)
    new = absence.roster or roster
    after = check_roster(dataclasses.replace(ws, requests=absence.requests), new)
    last = last or first
    when = day_text(first) if last == first else span(first, last)
    name = ws.person_by_id[person].name
    return AbsencePlan(f"{name} absent {when}", absence, new, impact(before, after))
