"""The next period's history.toml from what was worked: rows and `hours_before`.

The days worked are the old period's roster (after swaps and absences) and, before it,
the old history rows. Hours are counted as the checker counts them (`check.grid`): a
day in the old period holds the paid hours of its shift plus the leave credit of that
day (rules.md, "Terms": hours; "Leave credit counts on every leave day in the period");
a history day holds the paid hours of its code, since history rows record shifts only.

`hours_before` (rules.md, `max-average-weekly-hours`) is the hours in the part of the
`weeks`-week window, ending at the new period's end, that lies before the new start.
Where the window reaches back before every known day, the unknown days are estimated
(see `Basis`), never guessed silently.
"""

from __future__ import annotations

import math
from dataclasses import dataclass
from datetime import date, timedelta
from fractions import Fraction
from typing import Literal

from rostertui.core.check.grid import Grid, exact
from rostertui.core.models.common import OFF
from rostertui.core.models.roster import Roster
from rostertui.core.models.rules import MaxAverageWeeklyHours
from rostertui.core.models.workspace import Workspace

# exact: every day of the window before the new start is known.
# share: the window reaches before the old history rows; the old hours_before holds
#   those days' hours, spread evenly over its unknown days, and the share of the days
#   still in the window is kept.
# limit: nothing is known of those days; each counts at the rule's weekly limit / 7,
#   so the average is judged over the known days only, as rules.md judges a person
#   without hours_before.
Basis = Literal["exact", "share", "limit"]


@dataclass(frozen=True)
class HoursBefore:
    """One person's `hours_before` for the next period and how it was found."""

    person: str
    hours: float  # rounded up to 1/100 h, the resolution of the files
    basis: Basis
    rule: str  # the averaging rule it serves
    weeks: int
    window_first: date  # first day of the window
    unknown_days: int  # days of the window before every known day

    def reason(self) -> str:
        """How the figure was found, in words."""
        if self.basis == "exact":
            return "exact"
        if self.basis == "share":
            return (f"{self.unknown_days} days before the history rows estimated as their "
                    "share of the old hours_before")
        return f"{self.unknown_days} days before anything known counted at the weekly limit"

    def describe(self) -> str:
        return f"{self.hours:g} h ({self.reason()})"


def round_up(value: Fraction) -> float:
    """Hours at the files' resolution (1/100 h), rounded up: never below the truth."""
    return math.ceil(value * 100) / 100


def history_rows(ws: Workspace, roster: Roster, days: int,
                 grid: Grid | None = None) -> dict[str, list[str]]:
    """The last `days` days of old history + old roster per person (fewer when less is
    known), oldest first; a person without a roster row was off every day. `grid`: the
    roster's, when the caller has it already."""
    if days <= 0:
        return {}
    grid = grid or Grid(ws, roster)
    out: dict[str, list[str]] = {}
    for pid in ws.person_ids:
        full, _ = grid.full(pid)
        out[pid] = list(full[-days:])
    return out


class _Days:
    """Hours per known day of one person: index 0 = the old period start."""

    def __init__(self, grid: Grid, pid: str):
        self.hist = grid.hist[pid]
        self.row = grid.rows[pid]
        self.credit = grid.leave[pid]
        self.hours = grid.hours_of_code

    @property
    def first_known(self) -> int:
        return -len(self.hist)

    def hours_on(self, i: int) -> Fraction:
        if i >= 0:
            code = self.row[i]
            paid = self.hours[code] if code != OFF else Fraction(0)
            return paid + self.credit.get(i, Fraction(0))
        code = self.hist[len(self.hist) + i]
        return self.hours[code] if code != OFF else Fraction(0)

    def total(self, first: int, last: int) -> Fraction:
        """Hours of the known days in [first, last] (day indices)."""
        lo = max(first, self.first_known)
        return sum((self.hours_on(i) for i in range(lo, last + 1)), Fraction(0))


def _rule_for(ws: Workspace, pid: str) -> MaxAverageWeeklyHours | None:
    """The averaging rule whose window `hours_before` serves: the longest window."""
    found = [e.rule for e in ws.rules
             if isinstance(e.rule, MaxAverageWeeklyHours) and pid in e.people]
    if not found:
        return None
    return max(found, key=lambda r: (r.weeks, -r.hours))


def mixed_windows(ws: Workspace) -> list[str]:
    """People under averaging rules of different `weeks`: one hours_before serves only
    the longest window (history.toml holds one number per person)."""
    out = []
    for pid in ws.person_ids:
        weeks = {e.rule.weeks for e in ws.rules
                 if isinstance(e.rule, MaxAverageWeeklyHours) and pid in e.people}
        if len(weeks) > 1:
            out.append(pid)
    return out


def hours_before(ws: Workspace, roster: Roster, new_days: int,
                 grid: Grid | None = None) -> dict[str, HoursBefore]:
    """`hours_before` of the period that follows the workspace's, for each person under a
    `max-average-weekly-hours` rule whose window reaches before the new start. `grid`:
    the roster's, when the caller has it already."""
    grid = grid or Grid(ws, roster)
    old_n = ws.unit.days
    old_before = ws.history.hours_before if ws.history is not None else {}
    out: dict[str, HoursBefore] = {}
    for pid in ws.person_ids:
        rule = _rule_for(ws, pid)
        if rule is None:
            continue
        window = 7 * rule.weeks
        # day indices from the old start: the new period is [old_n, old_n + new_days)
        first = old_n + new_days - window
        if first >= old_n:
            continue  # the window lies inside the new period: no hours_before
        days = _Days(grid, pid)
        known = days.total(first, old_n - 1)
        unknown = max(0, days.first_known - first)
        basis: Basis = "exact"
        value = known
        if unknown:
            old_first = old_n - window  # the old period's window, same rule
            if pid in old_before and old_first < days.first_known:
                seen = days.total(old_first, -1)
                rest = max(Fraction(0), exact(old_before[pid]) - seen)
                value += rest * unknown / (days.first_known - old_first)
                basis = "share"
            else:
                value += exact(rule.hours) * unknown / 7
                basis = "limit"
        out[pid] = HoursBefore(
            pid, round_up(value), basis, rule.id, rule.weeks,
            ws.unit.start + timedelta(days=first), unknown,
        )
    return out
