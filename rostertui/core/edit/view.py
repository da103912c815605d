"""What the grid and the status line show, derived from a Session. Pure: no textual.

`GridView.build(session)` indexes everything once per change: the day columns,
one cover row per (shift, skill) of `[[cover]]` (entries with the same pair on
different days share a row), the people assigned per cover row and day, and
every violation of the check by the cell, person or cover cell it concerns. It reads
the grid the check was made on (`CheckResult.grid`), so a change builds one grid for
the check, the statistics and the view together; whether a request is granted is the
checker's verdict.
"""

from __future__ import annotations

from collections import defaultdict
from collections.abc import Callable
from dataclasses import dataclass, field
from datetime import date

from rostertui.core.check import Violation
from rostertui.core.check.builtin import cover_days
from rostertui.core.check.builtin import honoured as granted
from rostertui.core.check.grid import Grid
from rostertui.core.edit.session import Session
from rostertui.core.models.common import OFF, WEEKDAYS
from rostertui.core.models.requests import Leave, Request
from rostertui.core.models.staff import Person
from rostertui.core.stats import PersonStats
from rostertui.core.words import WEEKDAY_NAMES, number, weekday_day


@dataclass(frozen=True)
class DayColumn:
    index: int
    date: date
    weekday: str  # "Mo"
    weekend: bool
    holiday: bool
    week_start: bool  # a Monday that is not the first day: a separator goes before it

    @property
    def long(self) -> str:
        return weekday_day(self.date)


@dataclass(frozen=True)
class Need:
    """What the cover entries of one row ask on one day (combined when several apply)."""

    min: int | None = None
    max: int | None = None
    ideal: int | None = None

    def state(self, n: int) -> str:
        """"short"/"over" (hard min/max), "under"/"above" (away from ideal) or "ok"."""
        if self.min is not None and n < self.min:
            return "short"
        if self.max is not None and n > self.max:
            return "over"
        if self.ideal is not None and n < self.ideal:
            return "under"
        if self.ideal is not None and n > self.ideal:
            return "above"
        return "ok"

    def text(self) -> str:
        parts = [f"{k} {v}" for k, v in (("min", self.min), ("ideal", self.ideal),
                                          ("max", self.max)) if v is not None]
        return ", ".join(parts) or "no numbers"


def _merge(a: int | None, b: int | None, pick: Callable[[int, int], int]) -> int | None:
    return b if a is None else a if b is None else pick(a, b)


@dataclass
class CoverRow:
    shift: str
    skill: str | None
    needs: list[Need | None]
    assigned: list[int] = field(default_factory=list)

    @property
    def label(self) -> str:
        return self.shift if self.skill is None else f"{self.shift}·{self.skill}"


@dataclass
class GridView:
    days: list[DayColumn]
    people: list[Person]
    cover: list[CoverRow]
    cell_violations: dict[tuple[str, int], list[Violation]]
    person_violations: dict[str, list[Violation]]
    cover_violations: dict[tuple[int, int], list[Violation]]
    other_violations: list[Violation]
    leave: dict[tuple[str, int], Leave]
    requests: dict[tuple[str, int], list[Request]]

    @classmethod
    def build(cls, session: Session) -> GridView:
        ws = session.ws
        grid = session.check.grid or Grid(ws, session.roster)
        holidays = set(ws.unit.holidays)
        weekend = {WEEKDAYS.index(w) for w in ws.unit.weekend}
        days = [
            DayColumn(i, d, WEEKDAY_NAMES[d.weekday()][:2], d.weekday() in weekend, d in holidays,
                      i > 0 and d.weekday() == 0)
            for i, d in enumerate(ws.unit.dates)
        ]
        view = cls(days, list(ws.staff.person), _cover_rows(session, grid), {}, {}, {}, [],
                   {}, {})
        view._index_requests(session, grid)
        view._index_violations(session, grid)
        return view

    # -- indexing ---------------------------------------------------------------------------
    def _index_requests(self, session: Session, grid: Grid) -> None:
        for lv in session.ws.requests.leave:
            for d in lv.dates():
                if grid.in_period(d):
                    self.leave[lv.person, grid.index(d)] = lv
        for r in session.ws.requests.request:
            if grid.in_period(r.date):
                self.requests.setdefault((r.person, grid.index(r.date)), []).append(r)

    def _index_violations(self, session: Session, grid: Grid) -> None:
        cells: dict[tuple[str, int], list[Violation]] = defaultdict(list)
        rows = {(c.shift, c.skill): i for i, c in enumerate(self.cover)}
        for v in session.check.violations:
            if v.kind == "cover" and v.shift is not None:
                row = rows.get((v.shift, v.skill))
                for i in _days(v, grid):
                    if row is not None:
                        self.cover_violations.setdefault((row, i), []).append(v)
            elif v.person is None:
                self.other_violations.append(v)
            elif not v.dates:
                self.person_violations.setdefault(v.person, []).append(v)
            else:
                for i in _days(v, grid):
                    cells[v.person, i].append(v)
        self.cell_violations = dict(cells)

    # -- reading ----------------------------------------------------------------------------
    def severity(self, pid: str, day: int) -> str | None:
        """"hard", "soft" or None for a person's cell."""
        return _worst(self.cell_violations.get((pid, day)))

    def cover_severity(self, row: int, day: int) -> str | None:
        return _worst(self.cover_violations.get((row, day)))

    def person_severity(self, pid: str) -> str | None:
        return _worst(self.person_violations.get(pid))


def _worst(found: list[Violation] | None) -> str | None:
    if not found:
        return None
    return "hard" if any(v.hard for v in found) else "soft"


def _days(v: Violation, grid: Grid) -> list[int]:
    """Day indices a violation concerns: two dates are a span (a stretch, a weekend,
    a pair of shifts), otherwise the dates themselves; only days in the period."""
    if len(v.dates) == 2:
        first, last = sorted(v.dates)
        found: range | list[int] = range(grid.index(first), grid.index(last) + 1)
    else:
        found = [grid.index(d) for d in v.dates]
    return [i for i in found if 0 <= i < grid.n]


def _cover_rows(session: Session, grid: Grid) -> list[CoverRow]:
    rows: dict[tuple[str, str | None], CoverRow] = {}
    for c in session.ws.shifts.cover:
        row = rows.setdefault((c.shift, c.skill), CoverRow(c.shift, c.skill, [None] * grid.n))
        for i in cover_days(c, grid):
            old = row.needs[i] or Need()
            row.needs[i] = Need(_merge(old.min, c.min, max), _merge(old.max, c.max, min),
                                _merge(old.ideal, c.ideal, max))
    skills = {p.id: set(p.skills) for p in session.ws.staff.person}
    for row in rows.values():
        holders = [pid for pid in grid.rows if row.skill is None or row.skill in skills[pid]]
        row.assigned = [sum(1 for pid in holders if grid.rows[pid][i] == row.shift)
                        for i in range(grid.n)]
    return list(rows.values())


# -- words for the status line ---------------------------------------------------------------
def hours_text(p: PersonStats) -> str:
    """ "156.5 h of 120-165, target 150"."""
    band = ""
    if p.hours_min is not None or p.hours_max is not None:
        lo = number(p.hours_min) if p.hours_min is not None else "0"
        hi = number(p.hours_max) if p.hours_max is not None else "..."
        band = f" of {lo}-{hi}"
    target = f", target {number(p.hours_target)}" if p.hours_target is not None else ""
    return f"{number(p.hours)} h{band}{target}"


def person_summary(session: Session, pid: str) -> str:
    p = session.stats.person(pid)
    asked = p.requests_asked
    weekends = session.stats.weekends_in_period
    parts = [hours_text(p), f"{p.nights} nights", f"{p.weekends}/{weekends} weekends"]
    if asked:
        parts.append(f"requests {p.requests_granted}/{asked} granted")
    return " · ".join(parts)


def request_text(r: Request, code: str) -> str:
    what = "the day off" if r.want == "off" else r.want if r.want else f"not {r.avoid}"
    note = f", {r.note}" if r.note else ""
    verdict = "granted" if granted(r, code) else "NOT granted"
    return f"asks {what} (weight {r.weight}{note}): {verdict}"


def cell_text(session: Session, view: GridView, pid: str, day: int) -> str:
    """One line about a person's cell: day, person, shift, lock, leave, requests."""
    person = session.ws.person_by_id[pid]
    code = session.code(pid, day)
    parts = [view.days[day].long, f"{person.name} ({', '.join(person.skills) or 'no skills'})"]
    if code == OFF:
        parts.append("off")
    else:
        s = session.ws.shift_by_code[code]
        parts.append(f"{code} {s.name} {s.start}-{s.end} {number(s.hours)} h")
    if session.locked(pid, day):
        parts.append("locked")
    leave = view.leave.get((pid, day))
    if leave is not None:
        parts.append(f"on leave ({leave.reason})" if leave.reason else "on leave")
    parts += [request_text(r, code) for r in view.requests.get((pid, day), [])]
    return " · ".join(parts)


def cover_text(view: GridView, row: int, day: int) -> str:
    c = view.cover[row]
    need = c.needs[day]
    who = f"cover {c.shift}" + (f" ({c.skill})" if c.skill else "")
    if need is None:
        return f"{view.days[day].long} · {who}: no cover entry this day"
    n = c.assigned[day]
    return f"{view.days[day].long} · {who}: {n} assigned; {need.text()}"
