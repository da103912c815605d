"""How many days before a period its effective rules can see (rules.md, "Kinds" and
"Decisions on the fine print"), so that a history of that many days judges the period
exactly as the whole run of days would.

A shift belongs to its start date and lasts at most 24 h of clock time (26 h of real
time across a DST change), so a shift that starts on day d is over before 02:00 on day
d + 2. Per kind, with day 0 the period start:

* `min-rest`: a pair (previous shift, first shift of the period) breaks `hours` only if
  the previous shift ends less than `hours` before day 0; a shift that starts on day -k
  is over by 02:00 on day 2 - k, at least (k - 2) x 24 - 2 h before day 0, so
  1 + ceil((hours + 2) / 24) days suffice.
* `weekly-rest`: the earliest window checked starts on the Monday on or before the start
  (`monday`) or on day 0 (`period-start`, `rolling`); two more days catch the shifts that
  run into it.
* maximum stretches (`max-consecutive-days`, `max-consecutive-shift`): with `limit` days
  of history a stretch that reaches back further is already `limit` long before the
  period, so its units (days inside the period) come out the same.
* minimum stretches (`min-consecutive-days`, `min-consecutive-off`): a stretch reaching
  the first history day is open there, and with `days` of history it is long enough
  anyway.
* `forbidden-sequence`: the day before.
* `max-weekends`, `complete-weekends`: rules.md judges weekends inside the period only;
  the run of weekend days and holidays that ends the day before is kept all the same, so
  a reader of the history sees the whole weekend.
* `max-average-weekly-hours`: the part of the `weeks`-week window, ending at the period
  end, that lies before the period (7 x weeks - days), so the next period can compute
  its `hours_before` from rows.
* period-wide counts (`max-shifts`, `min-shifts`, `hours`, `not-available`,
  `balance`): none.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass
from datetime import date, timedelta

from rostertui.core.models.common import WEEKDAYS
from rostertui.core.models.rules import (
    ForbiddenSequence,
    MaxAverageWeeklyHours,
    MaxConsecutiveDays,
    MaxConsecutiveShift,
    MinConsecutiveDays,
    MinConsecutiveOff,
    MinRest,
    WeeklyRest,
)
from rostertui.core.models.workspace import EffectiveRule

SPILL_DAYS = 2  # a shift starting on day d is over before 02:00 on day d + 2


@dataclass(frozen=True)
class Need:
    """Days of history one rule needs before the period, and why, in words."""

    rule: str
    kind: str
    days: int
    why: str


def rule_need(rule: object, start: date, days: int) -> tuple[int, str] | None:
    """(days, why) for one rule of a period of `days` days from `start`; None: no need."""
    if isinstance(rule, MinRest):
        n = 1 + math.ceil((rule.hours + SPILL_DAYS) / 24)
        return n, f"the shift before a {rule.hours:g} h rest"
    if isinstance(rule, WeeklyRest):
        before = start.weekday() if rule.align == "monday" else 0
        where = "the Monday on or before the start" if before else "the period start"
        return before + SPILL_DAYS, f"the first {rule.window_days}-day window from {where}"
    if isinstance(rule, MaxConsecutiveDays | MinConsecutiveDays | MinConsecutiveOff):
        return rule.days, f"a stretch of {rule.days} days"
    if isinstance(rule, MaxConsecutiveShift):
        return rule.count, f"a stretch of {rule.count} {rule.shift} shifts"
    if isinstance(rule, ForbiddenSequence):
        return 1, "the day before"
    if isinstance(rule, MaxAverageWeeklyHours):
        n = 7 * rule.weeks - days
        if n <= 0:
            return None
        return n, f"the part of the {rule.weeks}-week window before the period"
    return None


def weekend_run_before(start: date, weekend: Sequence[str], holidays: list[date]) -> int:
    """Length of the run of weekend days and holidays that ends the day before `start`."""
    wanted = {WEEKDAYS.index(w) for w in weekend}
    known = set(holidays)
    n = 0
    day = start - timedelta(days=1)
    while n < 366 and (day.weekday() in wanted or day in known):
        n += 1
        day -= timedelta(days=1)
    return n


def needs(
    rules: list[EffectiveRule], start: date, days: int, weekend: Sequence[str],
    holidays: list[date],
) -> list[Need]:
    """What each rule of the effective set needs before a period of `days` from `start`
    (rules that need nothing are left out), longest first."""
    found: list[Need] = []
    for eff in rules:
        rule = eff.rule
        if rule.kind in ("max-weekends", "complete-weekends"):
            n = weekend_run_before(start, weekend, holidays)
            if n:
                found.append(Need(rule.id, rule.kind, n, "the weekend that ends the day before"))
            continue
        need = rule_need(rule, start, days)
        if need is not None and need[0] > 0:
            found.append(Need(rule.id, rule.kind, need[0], need[1]))
    return sorted(found, key=lambda n: -n.days)


def history_days(needs_found: list[Need]) -> int:
    """The longest look-back: how many days the history rows hold."""
    return max((n.days for n in needs_found), default=0)
