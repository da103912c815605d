"""Constraints built into every workspace (rules.md, "Built into every workspace",
"Always soft"): leave, requires, lock, cover min/max/ideal, requests.

Built-in violations use `leave`, `requires`, `lock`, `cover`, `request` as both
rule and kind, and have no source. "At most one shift per person per date" holds
by construction: a roster row has one code per date.
"""

from __future__ import annotations

from datetime import date
from typing import Any

from rostertui.core import words as fmt
from rostertui.core.check.grid import Grid
from rostertui.core.check.result import RequestOutcome, Violation
from rostertui.core.models.common import OFF, WEEKDAYS
from rostertui.core.models.requests import Request
from rostertui.core.models.roster import Roster
from rostertui.core.models.shifts import Cover
from rostertui.core.models.workspace import Workspace


def _hard(kind: str, person: str | None, d: date, units: int, message: str,
          **extra: Any) -> Violation:
    return Violation(rule=kind, kind=kind, hard=True, person=person, dates=(d,), units=units,
                     penalty=0, message=message, source=None, **extra)


def person_cells(ws: Workspace, grid: Grid) -> list[Violation]:
    """Leave and requires, per person (staff order) and date: no shift on a leave day;
    a shift with `requires` only for people holding all those skills."""
    out: list[Violation] = []
    for person in ws.staff.person:
        pid, skills = person.id, set(person.skills)
        leave, row = grid.leave[pid], grid.rows[pid]
        for i, code in enumerate(row):
            if code == OFF:
                continue
            d = grid.dates[i]
            if i in leave:
                out.append(_hard("leave", pid, d, 1, f"{code} on {fmt.day(d)}, a leave day"))
            needed = grid.shifts[code].requires
            if needed and not skills.issuperset(needed):
                out.append(_hard(
                    "requires", pid, d, 1, f"{code} on {fmt.day(d)} requires {', '.join(needed)}"
                ))
    return out


def check_locks(ws: Workspace, before: Roster, after: Roster) -> list[Violation]:
    """Hard `lock` violations: cells locked in `before` whose code differs in `after`.

    A person without a row is off every day; locked dates outside the period are ignored.
    """
    out: list[Violation] = []
    start, n = ws.unit.start, ws.unit.days
    for lock in before.lock:
        old_row, new_row = before.rows.get(lock.person, []), after.rows.get(lock.person, [])
        for d in sorted(set(lock.dates)):
            i = (d - start).days
            if not 0 <= i < n:
                continue
            old = old_row[i] if i < len(old_row) else OFF
            new = new_row[i] if i < len(new_row) else OFF
            if old != new:
                out.append(_hard(
                    "lock", lock.person, d, 1, f"locked {old} on {fmt.day(d)} changed to {new}"
                ))
    return out


def cover_days(cover: Cover, grid: Grid) -> list[int]:
    """Day indices a cover entry applies to: its dates, its weekdays, or every day."""
    if cover.dates is not None:
        return sorted({grid.index(d) for d in cover.dates if grid.in_period(d)})
    if cover.days is not None:
        wanted = {WEEKDAYS.index(w) for w in cover.days}
        return [i for i, d in enumerate(grid.dates) if d.weekday() in wanted]
    return list(range(grid.n))


def _cover(c: Cover, hard: bool, d: date, units: int, weight: int, text: str) -> Violation:
    penalty = 0 if hard else units * weight
    return Violation(
        rule="cover", kind="cover", hard=hard, person=None, dates=(d,), units=units,
        penalty=penalty, message=text, source=None, shift=c.shift, skill=c.skill,
    )


def cover(ws: Workspace, grid: Grid) -> list[Violation]:
    """Cover per entry and date: hard `min`/`max`, soft `ideal` (under_weight/over_weight
    per person short/over; a deviation with weight 0 is not reported). Below both
    `min` and `ideal` gives two entries."""
    out: list[Violation] = []
    people = [(p.id, set(p.skills)) for p in ws.staff.person]
    for c in ws.shifts.cover:
        holders = [pid for pid, skills in people if c.skill is None or c.skill in skills]
        label = c.shift if c.skill is None else f"{c.shift} ({c.skill})"
        for i in cover_days(c, grid):
            d = grid.dates[i]
            n = sum(1 for pid in holders if grid.rows[pid][i] == c.shift)
            head = f"{n} on {label} on {fmt.day(d)}"
            if c.min is not None and n < c.min:
                out.append(_cover(c, True, d, c.min - n, 0, f"{head}; at least {c.min}"))
            if c.max is not None and n > c.max:
                out.append(_cover(c, True, d, n - c.max, 0, f"{head}; at most {c.max}"))
            if c.ideal is not None:
                under, over = c.under_weight or 0, c.over_weight
                if n < c.ideal and under > 0:
                    out.append(_cover(c, False, d, c.ideal - n, under, f"{head}; ideal {c.ideal}"))
                elif n > c.ideal and over > 0:
                    out.append(_cover(c, False, d, n - c.ideal, over, f"{head}; ideal {c.ideal}"))
    return out


def honoured(r: Request, has: str) -> bool:
    """Whether a request is honoured by the code in its cell: want "off" -> off; want a
    code -> that code; avoid a code -> anything else."""
    if r.want == "off":
        return has == OFF
    if r.want is not None:
        return has == r.want
    return has != r.avoid


def request_outcomes(ws: Workspace, grid: Grid) -> list[RequestOutcome]:
    """Every request inside the period, in file order, and whether it is honoured."""
    out: list[RequestOutcome] = []
    for r in ws.requests.request:
        row = grid.rows.get(r.person)
        if row is None or not grid.in_period(r.date):
            continue
        i = grid.index(r.date)
        out.append(RequestOutcome(r, i, row[i], honoured(r, row[i])))
    return out


def requests(ws: Workspace, grid: Grid,
             outcomes: list[RequestOutcome] | None = None) -> list[Violation]:
    """`[[request]]`: penalty `weight` when not honoured (dates outside the period ignored)."""
    out: list[Violation] = []
    for o in outcomes if outcomes is not None else request_outcomes(ws, grid):
        if o.honoured:
            continue
        r, has, when = o.request, o.code, fmt.day(o.request.date)
        if r.want == "off":
            text = f"asked for the day off on {when}, has {has}"
        elif r.want is not None:
            text = f"asked for {r.want} on {when}, has {has}"
        else:
            text = f"asked not to work {r.avoid} on {when}, has {has}"
        out.append(Violation(
            rule="request", kind="request", hard=False, person=r.person, dates=(r.date,),
            units=1, penalty=r.weight, message=text, source=None,
        ))
    return out
