"""Counting checks before any search, each reported in sentences.

* Cover: per cover entry and date, the people who could work it (the skill, the
  shift's `requires`, not on leave, not hard not-available, not locked to another
  cell) against its minimum; and per date, the minimums of all shifts together
  against the people free that day (one shift a day each).
* Hours and shift counts: a hard minimum against the most the period can hold for
  that person (days not on leave x their longest shift, plus leave credit).
* Locks alone: a roster of only the locked cells already breaks a hard rule that
  more shifts can only make worse (rest, stretches, maximums, leave, requires).
"""

from __future__ import annotations

from collections import defaultdict
from datetime import date
from fractions import Fraction

from rostertui.core.check import check_roster
from rostertui.core.check.grid import paid_hours
from rostertui.core.explain import words
from rostertui.core.explain.reasons import Reason, unique
from rostertui.core.models import rules as R
from rostertui.core.models.common import OFF, WEEKDAYS
from rostertui.core.models.roster import Roster
from rostertui.core.models.shifts import Cover
from rostertui.core.models.workspace import Workspace

MONOTONE = {"min-rest", "weekly-rest", "max-consecutive-days", "max-consecutive-shift",
            "max-shifts", "max-weekends", "max-average-weekly-hours", "not-available",
            "leave", "requires"}


class Availability:
    """Who is free for which shift on which date, and why the others are not."""

    def __init__(self, ws: Workspace):
        self.ws = ws
        self.leave: dict[tuple[str, date], int] = {}
        for i, lv in enumerate(ws.requests.leave):
            for d in lv.dates():
                self.leave.setdefault((lv.person, d), i)
        self.blocked: dict[tuple[str, date, str], str] = {}
        for eff in ws.rules:
            r = eff.rule
            if isinstance(r, R.NotAvailable) and r.weight is None:
                codes = ws.select(r.shift) if r.shift else set(ws.shift_by_code)
                for d in ws.unit.dates:
                    named = (r.days is None and r.dates is None
                             or WEEKDAYS[d.weekday()] in (r.days or [])
                             or d in (r.dates or []))
                    for pid in eff.people if named else ():
                        for code in codes:
                            self.blocked.setdefault((pid, d, code), r.id)
        self.locked: dict[tuple[str, date], str] = {}
        roster = ws.roster
        for lock in roster.lock if roster is not None else []:
            row = roster.rows.get(lock.person, []) if roster is not None else []
            for d in lock.dates:
                i = (d - ws.unit.start).days
                if 0 <= i < ws.unit.days:
                    self.locked[lock.person, d] = row[i] if i < len(row) else OFF

    def why_not(self, pid: str, d: date, code: str) -> str | None:
        """None when pid may work `code` on d, else the short reason."""
        if (pid, d) in self.leave:
            return "leave"
        rule = self.blocked.get((pid, d, code))
        if rule is not None:
            return rule
        lock = self.locked.get((pid, d))
        if lock is not None and lock != code:
            return "lock"
        return None

    def free_on(self, pid: str, d: date) -> bool:
        """pid could work some shift on d."""
        able = [c for c in self.ws.shift_by_code if self.able(pid, c)]
        return any(self.why_not(pid, d, c) is None for c in able)

    def able(self, pid: str, code: str) -> bool:
        skills = set(self.ws.person_by_id[pid].skills)
        return set(self.ws.shift_by_code[code].requires) <= skills


def prechecks(ws: Workspace) -> list[Reason]:
    av = Availability(ws)
    return [*_cover(ws, av), *_daily(ws, av), *_minimums(ws, av), *_locks_alone(ws)]


def _cover(ws: Workspace, av: Availability) -> list[Reason]:
    out = []
    for c in ws.shifts.cover:
        if not c.min:
            continue
        holders = [p.id for p in ws.staff.person
                   if (c.skill is None or c.skill in p.skills) and av.able(p.id, c.shift)]
        for i in cover_days_of(ws, c):
            d = ws.unit.dates[i]
            why = {pid: av.why_not(pid, d, c.shift) for pid in holders}
            free = [pid for pid in holders if why[pid] is None]
            if len(free) >= c.min:
                continue
            out.append(_short_reason(ws, c.shift, d, c, free, why))
    return out


def cover_days_of(ws: Workspace, c: Cover) -> list[int]:
    """Day indexes of the period a cover entry applies to."""
    dates = ws.unit.dates
    if c.dates is not None:
        return [i for i, d in enumerate(dates) if d in c.dates]
    if c.days is not None:
        wanted = {WEEKDAYS.index(w) for w in c.days}
        return [i for i, d in enumerate(dates) if d.weekday() in wanted]
    return list(range(len(dates)))


def _short_reason(ws: Workspace, code: str, d: date, c: Cover, free: list[str],
                  why: dict[str, str | None]) -> Reason:
    need = words.cover_need(ws, c)
    parts = [f"{words.shift(ws, code)} cover on {words.day(d)} needs {need}"]
    parts.append(f"only {len(free)} can work it" + (f": {words.people(ws, free)}" if free
                                                     else ""))
    by_why: dict[str, list[str]] = defaultdict(list)
    for pid, w in why.items():
        if w is not None:
            by_why[w].append(pid)
    rules = ["cover"]
    for w, pids in by_why.items():
        if w == "leave":
            parts.append(f"{words.people(ws, pids)} {'is' if len(pids) == 1 else 'are'} on leave")
        elif w == "lock":
            parts.append(f"{words.people(ws, pids)} {'is' if len(pids) == 1 else 'are'} "
                         "locked to another cell")
        else:
            parts.append(f"{words.people(ws, pids)} may not work it ({w})")
        rules.append(w)
    if not why:
        parts.append("nobody holds the skills it needs")
    return Reason("; ".join(parts) + ".", unique(rules), tuple(why), (d,), (code, c.skill))


def _daily(ws: Workspace, av: Availability) -> list[Reason]:
    """All of a date's minimums together (for everyone, and per skill) against the
    people free that day: one shift a day each."""
    out = []
    need: dict[tuple[date, str | None], dict[str, int]] = defaultdict(dict)
    for c in ws.shifts.cover:
        if c.min:
            for i in cover_days_of(ws, c):
                by_shift = need[ws.unit.dates[i], c.skill]
                by_shift[c.shift] = max(by_shift.get(c.shift, 0), c.min)
    for (d, skill), by_shift in sorted(need.items(), key=lambda kv: (kv[0][0], kv[0][1] or "")):
        if len(by_shift) < 2:
            continue  # one shift alone is the per-entry check
        total = sum(by_shift.values())
        pool = [p.id for p in ws.staff.person if skill is None or skill in p.skills]
        free = [pid for pid in pool if av.free_on(pid, d)]
        if len(free) >= total:
            continue
        each = ", ".join(f"{code} {n}" for code, n in by_shift.items())
        away = [pid for pid in pool if pid not in free]
        why = unique(["cover", *(av.why_not(pid, d, code) or "cover"
                                 for pid in away for code in by_shift)])
        with_skill = f" with skill {skill}" if skill else ""
        out.append(Reason(
            f"On {words.day(d)} the cover minimums need {total} people{with_skill} at once "
            f"({each}), but only {len(free)} {'is' if len(free) == 1 else 'are'} free that day"
            + (f": {words.people(ws, free)}" if free else "")
            + (f"; {words.people(ws, away)} {'is' if len(away) == 1 else 'are'} away "
               "(leave, locks or not-available)" if away else "") + ".",
            why, tuple(pool), (d,)))
    return out


def _minimums(ws: Workspace, av: Availability) -> list[Reason]:
    out = []
    hours = {code: paid_hours(s) for code, s in ws.shift_by_code.items()}
    credit: dict[tuple[str, date], Fraction] = {}
    for lv in ws.requests.leave:
        for d in lv.dates():
            if lv.credit_hours and ws.unit.in_period(d):
                old = credit.get((lv.person, d), Fraction(0))
                credit[lv.person, d] = max(old, Fraction(lv.credit_hours))
    for eff in ws.rules:
        r = eff.rule
        if r.weight is not None or not isinstance(r, R.HoursRule | R.MinShifts):
            continue
        for pid in eff.people:
            codes = [c for c in ws.shift_by_code if av.able(pid, c)]
            if isinstance(r, R.MinShifts) and r.shift:
                codes = [c for c in codes if c in ws.select(r.shift)]
            days = [d for d in ws.unit.dates
                    if any(av.why_not(pid, d, c) is None for c in codes)]
            away = ws.unit.days - len(days)
            if isinstance(r, R.MinShifts):
                if len(days) >= r.count:
                    continue
                msg = (f"{words.person(ws, pid)} must work {words.rule(r)} ({r.id}), but "
                       f"only {_days(len(days))} of the period are free for it ({away} on "
                       "leave, locked or not available).")
            else:
                if r.min is None:
                    continue
                most: Fraction | int
                most = sum(max((hours[c] for c in codes
                                if av.why_not(pid, d, c) is None), default=Fraction(0))
                           for d in days)
                most += sum(v for (p, _), v in credit.items() if p == pid)
                if most >= Fraction(r.min):
                    continue
                msg = (f"{words.person(ws, pid)} must work at least {r.min:g} h ({r.id}), but "
                       f"at most {float(most):g} h fit in the period ({_days(away)} on "
                       "leave, locked or not available).")
            out.append(Reason(msg, (r.id,), (pid,), ()))
    return out


def _days(n: int) -> str:
    return f"{n} day{'s' if n != 1 else ''}"


def _locks_alone(ws: Workspace) -> list[Reason]:
    """Hard breaches of a roster holding only the locked cells (all else off)."""
    roster = ws.roster
    if roster is None or not roster.lock:
        return []
    n = ws.unit.days
    rows = {pid: [OFF] * n for pid in ws.person_ids}
    locked_days: dict[str, set[date]] = defaultdict(set)
    for lock in roster.lock:
        row = roster.rows.get(lock.person, [])
        for d in lock.dates:
            i = (d - ws.unit.start).days
            if lock.person in rows and 0 <= i < n and i < len(row):
                rows[lock.person][i] = row[i]
                locked_days[lock.person].add(d)
    only = Roster(start=ws.unit.start, days=n, rows=rows, lock=roster.lock)
    out = []
    for v in check_roster(ws, only).violations:
        at_most = v.kind in ("hours", "cover") and "at most" in v.message
        if not v.hard or not (v.kind in MONOTONE or at_most):
            continue
        if v.person is not None and not (set(v.dates) & locked_days[v.person]) and v.dates:
            continue
        who = f"{words.person(ws, v.person)}: " if v.person else ""
        out.append(Reason(f"The locked cells alone break {v.rule}: {who}{v.message}.",
                          unique([v.rule, "lock"]),
                          (v.person,) if v.person else (), v.dates))
    return out
