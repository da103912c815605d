"""Plain words for dates, people, shifts, cover entries and rules."""

from __future__ import annotations

from collections.abc import Iterable
from datetime import date

from rostertui.core.models import rules as R
from rostertui.core.models.shifts import Cover
from rostertui.core.models.workspace import Workspace
from rostertui.core.words import weekday_day

day = weekday_day  # 'Mon 4 Mar', this module's name for it


def span(first: date, last: date) -> str:
    if first == last:
        return day(first)
    return f"{day(first)} to {day(last)}"


def person(ws: Workspace, pid: str) -> str:
    found = ws.person_by_id.get(pid)
    return f"{found.name} ({pid})" if found and found.name != pid else pid


def people(ws: Workspace, pids: Iterable[str]) -> str:
    names = [person(ws, p) for p in pids]
    if len(names) <= 1:
        return "".join(names)
    return ", ".join(names[:-1]) + " and " + names[-1]


def shift(ws: Workspace, code: str) -> str:
    found = ws.shift_by_code.get(code)
    return f"{found.name} ({code})" if found and found.name != code else code


def cover_need(ws: Workspace, c: Cover) -> str:
    """`at least 2 people with skill rn` / `at most 4 people`."""
    parts = []
    if c.min is not None:
        parts.append(f"at least {c.min}")
    if c.max is not None:
        parts.append(f"at most {c.max}")
    last = c.max if c.max is not None else c.min
    who = "person" if last == 1 else "people"
    skill = f" with skill {c.skill}" if c.skill else ""
    return f"{' and '.join(parts)} {who}{skill}"


def rule(r: R.Rule) -> str:
    """What a rule asks, in a few words (its id and source added by the caller)."""
    if isinstance(r, R.MinRest):
        return f"at least {r.hours:g} h rest between shifts"
    if isinstance(r, R.WeeklyRest):
        return f"an unbroken rest of {r.hours:g} h in every {r.window_days} days"
    if isinstance(r, R.MaxConsecutiveDays):
        return f"at most {r.days} working days in a row"
    if isinstance(r, R.MinConsecutiveDays):
        return f"at least {r.days} working days in a row"
    if isinstance(r, R.MinConsecutiveOff):
        return f"at least {r.days} days off in a row"
    if isinstance(r, R.MaxConsecutiveShift):
        return f"at most {r.count} {r.shift} shifts in a row"
    if isinstance(r, R.ForbiddenSequence):
        return f"no {' or '.join(r.then)} the day after {r.first}"
    if isinstance(r, R.MaxShifts | R.MinShifts):
        which = f"{r.shift} " if r.shift else ""
        most = "at most" if isinstance(r, R.MaxShifts) else "at least"
        return f"{most} {r.count} {which}shifts in the period"
    if isinstance(r, R.HoursRule):
        bounds = [f"at least {r.min:g} h" if r.min is not None else "",
                  f"at most {r.max:g} h" if r.max is not None else ""]
        return " and ".join(b for b in bounds if b) + " in the period"
    if isinstance(r, R.MaxAverageWeeklyHours):
        return f"at most {r.hours:g} h a week on average over {r.weeks} weeks"
    if isinstance(r, R.MaxWeekends):
        return f"at most {r.count} weekends worked"
    if isinstance(r, R.CompleteWeekends):
        return "whole weekends worked or whole weekends off"
    if isinstance(r, R.NotAvailable):
        what = f"no {r.shift} shift" if r.shift else "no shift"
        when = []
        if r.days:
            when.append("on " + ", ".join(r.days))
        if r.dates:
            when.append("on " + ", ".join(day(d) for d in r.dates))
        return what + (" " + " and ".join(when) if when else "")
    return r.kind  # balance: soft only, never in a conflict


def rule_with_source(r: R.Rule) -> str:
    source = f"; {r.source}" if r.source else ""
    return f"{r.id} ({rule(r)}{source})"
