"""A person's shifts as real instants (rules.md, "Terms": clock times and real elapsed time).

Local dates and "HH:MM" clock times are read in the unit's IANA timezone with
`fold=0`: a time that does not exist or occurs twice at a DST change takes the
earlier offset ("Decisions on the fine print"). Instants are whole minutes since
the Unix epoch, so gaps are real elapsed time (a night across a DST change lasts
11 h or 13 h).
"""

from __future__ import annotations

from bisect import bisect_left
from datetime import date, datetime, timedelta
from typing import NamedTuple
from zoneinfo import ZoneInfo

from rostertui.core.models.common import clock_minutes
from rostertui.core.models.shifts import Shift


class Spell(NamedTuple):
    """One shift worked: day index (0 = period start, negative = history), code, instants."""

    day: int
    code: str
    start: int  # epoch minutes
    end: int  # epoch minutes


class Clock:
    """Converts the unit's local dates and clock times to epoch minutes, with caches."""

    def __init__(self, timezone: str, start: date, shifts: dict[str, Shift]):
        self.tz = ZoneInfo(timezone)
        self.start = start
        self.shifts = shifts
        self._midnights: dict[int, int] = {}
        self._spells: dict[tuple[int, str], Spell] = {}

    def date(self, day: int) -> date:
        return self.start + timedelta(days=day)

    def at(self, day: int, minute: int) -> int:
        """Epoch minutes of local clock `minute` after 00:00 on day index `day` (fold=0)."""
        d = self.date(day)
        local = datetime(d.year, d.month, d.day, minute // 60, minute % 60, tzinfo=self.tz)
        return int(local.timestamp()) // 60

    def midnight(self, day: int) -> int:
        """Local 00:00 of day index `day` (a day across DST is 23 or 25 h long)."""
        found = self._midnights.get(day)
        if found is None:
            found = self._midnights[day] = self.at(day, 0)
        return found

    def spell(self, day: int, code: str) -> Spell:
        """Shift `code` worked on day index `day`: its real start and end instants."""
        key = (day, code)
        found = self._spells.get(key)
        if found is None:
            shift = self.shifts[code]
            begin = clock_minutes(shift.start)
            finish = clock_minutes(shift.end)
            end_day = day + (1 if finish <= begin else 0)
            found = Spell(day, code, self.at(day, begin), self.at(end_day, finish))
            self._spells[key] = found
        return found


def spells_of(clock: Clock, codes: tuple[str, ...], first_day: int) -> list[Spell]:
    """Spells of a row of codes whose first item is day index `first_day`; "-" is off."""
    return [
        clock.spell(first_day + i, code) for i, code in enumerate(codes) if code != "-"
    ]


MAX_SPELL = 26 * 60  # a shift lasts at most 24 h of clock time, 25 h across DST


def longest_free(spells: list[Spell], starts: list[int], lo: int, hi: int) -> int:
    """Longest interval in [lo, hi) (epoch minutes) not covered by any spell.

    Only the part of a free interval inside [lo, hi) counts. `spells` are sorted by
    start and `starts` holds their start instants (for a binary search).
    """
    best = 0
    cursor = lo
    for s in spells[bisect_left(starts, lo - MAX_SPELL):]:
        if s.end <= lo:
            continue
        if s.start >= hi:
            break
        if s.start > cursor:
            best = max(best, s.start - cursor)
        cursor = max(cursor, s.end)
    return max(best, hi - cursor)
