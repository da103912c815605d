"""Real instants of shifts in the unit's timezone, for the rest rules.

Written apart from the checker's own on purpose: the checker referees the solver,
so the two must not share the code that could make both wrong the same way.
Local times are read with fold=0 (the earlier offset) as rules.md decides.
"""

from __future__ import annotations

from datetime import datetime, timedelta
from functools import lru_cache
from zoneinfo import ZoneInfo

from rostertui.core.models.common import clock_minutes
from rostertui.core.models.workspace import Workspace


class ShiftClock:
    def __init__(self, ws: Workspace):
        self.tz = ZoneInfo(ws.unit.timezone)
        self.start = ws.unit.start
        self.times = {
            s.code: (clock_minutes(s.start), clock_minutes(s.end)) for s in ws.shifts.shift
        }
        self.instant = lru_cache(maxsize=None)(self._instant)
        self.span = lru_cache(maxsize=None)(self._span)

    def _instant(self, day: int, minute: int) -> int:
        """Epoch minutes of the local clock `minute` on day index `day`."""
        d = self.start + timedelta(days=day)
        local = datetime(d.year, d.month, d.day, minute // 60, minute % 60, tzinfo=self.tz)
        return int(local.timestamp()) // 60

    def midnight(self, day: int) -> int:
        return self.instant(day, 0)

    def _span(self, day: int, code: str) -> tuple[int, int]:
        """(start, end) in epoch minutes of shift `code` worked on day index `day`."""
        begin, finish = self.times[code]
        end_day = day + 1 if finish <= begin else day
        return self.instant(day, begin), self.instant(end_day, finish)
