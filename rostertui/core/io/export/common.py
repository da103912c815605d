"""What every export format shares: the roster's cells with real instants, notes,
spreadsheet-safe fields, and a few formatting helpers.

Instants follow rules.md ("Terms", "Decisions on the fine print"): local dates and
clock times in the unit's IANA timezone, read with `fold=0`, a shift with
end <= start ending the next day. They come from the checker's `Clock`, so an
export and the checker never disagree on when a shift starts or ends.
"""

from __future__ import annotations

import hashlib
import re
import unicodedata
from dataclasses import dataclass
from datetime import date, datetime
from fractions import Fraction
from zoneinfo import ZoneInfo

from rostertui.core.check.grid import Grid
from rostertui.core.errors import RosterError
from rostertui.core.models.common import OFF
from rostertui.core.models.shifts import Shift
from rostertui.core.models.workspace import Workspace
from rostertui.core.words import number

# A spreadsheet reads a cell starting with one of these as a formula (or, for tab
# and carriage return, may drop the character and then read one).
FORMULA_STARTS = ("=", "+", "-", "@", "\t", "\r")


class NoRoster(RosterError):
    """The workspace has no roster.toml yet: there is nothing to export."""

    def __init__(self) -> None:
        super().__init__(
            "no roster yet: roster.toml is missing; build one with `rostertui solve` "
            "(or in the grid, then save) before exporting"
        )


def neutralise(text: str) -> str:
    """A CSV field safe from spreadsheet formula injection: a leading `'` when the text
    starts with = + - @ tab or CR. The off code "-" alone stays "-" (it means off)."""
    if text != OFF and text.startswith(FORMULA_STARTS):
        return "'" + text
    return text


@dataclass(frozen=True)
class Cell:
    """One shift worked: who, which date (its start date), which shift, when exactly."""

    person: str
    date: date
    shift: Shift
    start: datetime  # aware, in the unit's timezone
    end: datetime

    @property
    def code(self) -> str:
        return self.shift.code


def need_roster(ws: Workspace) -> Grid:
    """The checker's grid of the workspace's roster (staff order, missing rows off)."""
    if ws.roster is None:
        raise NoRoster()
    return Grid(ws, ws.roster)


def worked_cells(ws: Workspace, grid: Grid | None = None) -> list[Cell]:
    """Every worked cell of the roster, person by person (staff order), then by date."""
    grid = grid or need_roster(ws)
    tz = ZoneInfo(ws.unit.timezone)
    cells: list[Cell] = []
    for pid in ws.person_ids:
        for day, code in enumerate(grid.rows[pid]):
            if code == OFF:
                continue
            spell = grid.clock.spell(day, code)
            cells.append(Cell(
                pid, grid.dates[day], ws.shift_by_code[code],
                datetime.fromtimestamp(spell.start * 60, tz),
                datetime.fromtimestamp(spell.end * 60, tz),
            ))
    return cells


def notes(ws: Workspace) -> dict[tuple[str, date], list[str]]:
    """Free-text notes per (person, date) inside the period: leave reasons and request
    notes, in file order."""
    found: dict[tuple[str, date], list[str]] = {}
    unit = ws.unit
    for leave in ws.requests.leave:
        if leave.reason:
            for d in leave.dates():
                if unit.in_period(d):
                    found.setdefault((leave.person, d), []).append(f"leave: {leave.reason}")
    for r in ws.requests.request:
        if r.note and unit.in_period(r.date):
            found.setdefault((r.person, r.date), []).append(r.note)
    return found


def shift_times(shift: Shift) -> str:
    """ "22:00-07:00 (+1 day)" for a night, "07:00-15:00" otherwise."""
    night = " (+1 day)" if shift.end <= shift.start else ""
    return f"{shift.start}-{shift.end}{night}"


def hours_text(value: Fraction | float | int) -> str:
    """Hours without needless decimals: 7.5, 10, 91.25."""
    return number(value)


def unit_slug(ws: Workspace) -> str:
    """A stable, ASCII domain-like label for the unit (for iCalendar UIDs): a readable
    slug of the name plus a short hash of it, so two units never share UIDs."""
    name = ws.unit.name
    ascii_name = unicodedata.normalize("NFKD", name).encode("ascii", "ignore").decode()
    slug = re.sub(r"[^a-z0-9]+", "-", ascii_name.lower()).strip("-")[:40].strip("-") or "unit"
    digest = hashlib.sha256(name.encode("utf-8")).hexdigest()[:8]
    return f"{slug}-{digest}"
