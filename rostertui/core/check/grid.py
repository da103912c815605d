"""Everything the evaluators share, computed once per check: rows, history, hours, weekends.

Terms follow rules.md, "Terms": a person without a roster row is off every day;
history rows give the days just before the period (oldest first).
"""

from __future__ import annotations

import datetime
from collections import Counter
from datetime import date, timedelta
from fractions import Fraction

from rostertui.core.check.timeline import Clock, Spell, spells_of
from rostertui.core.models.common import OFF, WEEKDAYS
from rostertui.core.models.roster import Roster
from rostertui.core.models.shifts import Shift
from rostertui.core.models.workspace import Workspace


def exact(value: float) -> Fraction:
    """A TOML float as the decimal the user wrote (7.6 is 38/5, not 7.5999...)."""
    return Fraction(str(value))


def paid_hours(shift: Shift) -> Fraction:
    """Exact paid hours: `paid_hours`, or the nominal clock duration."""
    if shift.paid_hours is not None:
        return exact(shift.paid_hours)
    return Fraction(shift.minutes, 60)


def runs(flags: list[bool] | tuple[bool, ...]) -> list[tuple[int, int]]:
    """Maximal runs of True as (first index, last index), inclusive."""
    found: list[tuple[int, int]] = []
    first = -1
    for i, flag in enumerate(flags):
        if flag and first < 0:
            first = i
        elif not flag and first >= 0:
            found.append((first, i - 1))
            first = -1
    if first >= 0:
        found.append((first, len(flags) - 1))
    return found


class Grid:
    """The roster under check, precomputed once for fast evaluation of every rule."""

    def __init__(self, ws: Workspace, roster: Roster | None):
        self.ws = ws
        self.roster = roster
        self.start: date = ws.unit.start
        self.n: int = ws.unit.days
        self.dates: list[date] = ws.unit.dates
        self.shifts: dict[str, Shift] = ws.shift_by_code
        self.codes_order: list[str] = [s.code for s in ws.shifts.shift]
        self.clock = Clock(ws.unit.timezone, self.start, self.shifts)
        self.rows: dict[str, tuple[str, ...]] = self._rows(roster)
        history = ws.history.rows if ws.history is not None else {}
        self.hist: dict[str, tuple[str, ...]] = {
            pid: tuple(history.get(pid, ())) for pid in ws.person_ids
        }
        self.hours_before: dict[str, float] = (
            dict(ws.history.hours_before) if ws.history is not None else {}
        )
        self.hours_of_code = {code: paid_hours(s) for code, s in self.shifts.items()}
        self.night_codes = frozenset(c for c, s in self.shifts.items() if s.is_night)
        self.leave: dict[str, dict[int, Fraction]] = self._leave()
        self.weekends: list[tuple[int, int]] = self._weekends()
        self._spells: dict[str, tuple[list[Spell], list[int]]] = {}
        self._hours: dict[str, Fraction] = {}

    def _rows(self, roster: Roster | None) -> dict[str, tuple[str, ...]]:
        """One row of `n` codes per person; a person without a row is off every day."""
        given = roster.rows if roster is not None else {}
        rows: dict[str, tuple[str, ...]] = {}
        for pid in self.ws.person_ids:
            row = list(given.get(pid, ()))[: self.n]
            row += [OFF] * (self.n - len(row))
            unknown = [c for c in row if c != OFF and c not in self.shifts]
            if unknown:
                raise ValueError(f"roster row of {pid!r} holds unknown shift code {unknown[0]!r}")
            rows[pid] = tuple(row)
        return rows

    # -- dates -------------------------------------------------------------------------
    def date(self, day: int) -> date:
        """Date of a day index (0 = period start; negative = history)."""
        return self.start + timedelta(days=day)

    def index(self, d: datetime.date) -> int:
        return (d - self.start).days

    def in_period(self, d: datetime.date) -> bool:
        return 0 <= (d - self.start).days < self.n

    # -- leave and hours ---------------------------------------------------------------
    def _leave(self) -> dict[str, dict[int, Fraction]]:
        """Leave days inside the period and their credit (one credit per leave day; where
        two leave entries overlap, the larger credit)."""
        found: dict[str, dict[int, Fraction]] = {pid: {} for pid in self.rows}
        for leave in self.ws.requests.leave:
            days = found.get(leave.person)
            if days is None:
                continue
            credit = exact(leave.credit_hours) if leave.credit_hours is not None else Fraction(0)
            for d in leave.dates():
                i = self.index(d)
                if 0 <= i < self.n:
                    days[i] = max(days.get(i, Fraction(0)), credit)
        return found

    def paid(self, pid: str) -> Fraction:
        """Exact paid hours of the person's shifts in the period."""
        hours = self.hours_of_code
        counts = Counter(c for c in self.rows[pid] if c != OFF)
        return sum((hours[c] * k for c, k in counts.items()), Fraction(0))

    def hours(self, pid: str) -> Fraction:
        """Hours of a person (rules.md, "Terms"): paid hours + leave credit in the period."""
        found = self._hours.get(pid)
        if found is None:
            credit = sum(self.leave[pid].values(), Fraction(0))
            found = self._hours[pid] = self.paid(pid) + credit
        return found

    # -- weekends ----------------------------------------------------------------------
    def _weekends(self) -> list[tuple[int, int]]:
        """Maximal runs of weekend days and holidays inside the period (rules.md, "Weekends")."""
        weekend = {WEEKDAYS.index(w) for w in self.ws.unit.weekend}
        holidays = set(self.ws.unit.holidays)
        flags = [d.weekday() in weekend or d in holidays for d in self.dates]
        return runs(flags)

    def worked_weekends(self, pid: str) -> int:
        row = self.rows[pid]
        return sum(
            1 for a, b in self.weekends if any(row[i] != OFF for i in range(a, b + 1))
        )

    # -- history and instants ----------------------------------------------------------
    def full(self, pid: str) -> tuple[tuple[str, ...], int]:
        """History row + period row, and the index of the period start inside it."""
        hist = self.hist[pid]
        return hist + self.rows[pid], len(hist)

    def spells(self, pid: str) -> tuple[list[Spell], list[int]]:
        """The person's shifts (history included) as instants, sorted, and their starts."""
        found = self._spells.get(pid)
        if found is None:
            hist = self.hist[pid]
            spells = spells_of(self.clock, hist, -len(hist))
            spells += spells_of(self.clock, self.rows[pid], 0)
            found = self._spells[pid] = (spells, [s.start for s in spells])
        return found
