"""Counting rules over the period (rules.md, "Kinds": max/min-shifts, hours,
max-average-weekly-hours, not-available; fine print on hours).

Hours are summed exactly (fractions of the decimals written in the files); only
the deviation is rounded up to whole hours.
"""

from __future__ import annotations

import math
from fractions import Fraction

from rostertui.core import words as fmt
from rostertui.core.check.grid import Grid, exact
from rostertui.core.check.result import Violation, violation
from rostertui.core.models.common import OFF, WEEKDAYS
from rostertui.core.models.rules import (
    HoursRule,
    MaxAverageWeeklyHours,
    MaxShifts,
    MinShifts,
    NotAvailable,
)
from rostertui.core.models.workspace import EffectiveRule, Workspace


def _count(grid: Grid, pid: str, selected: frozenset[str] | None) -> int:
    row = grid.rows[pid]
    if selected is None:
        return sum(1 for c in row if c != OFF)
    return sum(1 for c in row if c in selected)


def _shift_counts(
    ws: Workspace, eff: EffectiveRule, grid: Grid, most: bool
) -> list[Violation]:
    rule = eff.rule
    assert isinstance(rule, MaxShifts | MinShifts)
    selector = rule.shift
    selected = ws.select(selector) if selector is not None else None
    label = "shifts" if selected is None else f"{fmt.codes(selected, grid.codes_order)} shifts"
    limit = rule.count
    out: list[Violation] = []
    for pid in eff.people:
        n = _count(grid, pid, selected)
        if most and n > limit:
            out.append(violation(eff, pid, (), n - limit, f"{n} {label}; at most {limit}"))
        elif not most and n < limit:
            out.append(violation(eff, pid, (), limit - n, f"{n} {label}; at least {limit}"))
    return out


def max_shifts(ws: Workspace, eff: EffectiveRule, grid: Grid) -> list[Violation]:
    """`max-shifts`: more such shifts (any shift without `shift`) than `count`."""
    return _shift_counts(ws, eff, grid, most=True)


def min_shifts(ws: Workspace, eff: EffectiveRule, grid: Grid) -> list[Violation]:
    """`min-shifts`: fewer such shifts than `count`."""
    return _shift_counts(ws, eff, grid, most=False)


def up(value: Fraction) -> int:
    """A deviation in whole hours, rounded up."""
    return math.ceil(value)


def hours(ws: Workspace, eff: EffectiveRule, grid: Grid) -> list[Violation]:
    """`hours`: outside [min, max], or (soft only) away from `target`.

    A soft rule with bounds and a target can give two violations per person.
    """
    rule = eff.rule
    assert isinstance(rule, HoursRule)
    lo = exact(rule.min) if rule.min is not None else None
    hi = exact(rule.max) if rule.max is not None else None
    target = rule.target
    aim = exact(target) if target is not None and not eff.hard else None
    out: list[Violation] = []
    for pid in eff.people:
        h = grid.hours(pid)
        shown = f"{fmt.number(h)} h in the period"
        if hi is not None and h > hi:
            out.append(violation(eff, pid, (), up(h - hi), f"{shown}; at most {fmt.number(hi)} h"))
        if lo is not None and h < lo:
            out.append(violation(eff, pid, (), up(lo - h), f"{shown}; at least {fmt.number(lo)} h"))
        if aim is not None and h != aim:
            out.append(violation(
                eff, pid, (), up(abs(h - aim)), f"{shown}; target {fmt.number(aim)} h"
            ))
    return out


def max_average_weekly_hours(ws: Workspace, eff: EffectiveRule, grid: Grid) -> list[Violation]:
    """`max-average-weekly-hours`: the average over the reference period exceeds `hours`.

    With `hours_before` in history: hours_before + period hours > hours x weeks;
    otherwise: period hours > hours x days / 7. Units: hours over, rounded up.
    """
    rule = eff.rule
    assert isinstance(rule, MaxAverageWeeklyHours)
    per_week = exact(rule.hours)
    weeks = rule.weeks
    out: list[Violation] = []
    for pid in eff.people:
        h = grid.hours(pid)
        if pid in grid.hours_before:
            before = exact(grid.hours_before[pid])
            total, span, limit = before + h, Fraction(weeks), per_week * weeks
            detail = f" ({fmt.number(before)} h before the period + {fmt.number(h)} h in it)"
        else:
            total, span = h, Fraction(grid.n, 7)
            limit, detail = per_week * span, ""
        if total > limit:
            avg = float(total / span)
            out.append(violation(
                eff, pid, (), up(total - limit),
                f"{fmt.number(total)} h over {fmt.number(span)} weeks{detail} = {avg:.2f} h/week; "
                f"at most {fmt.number(per_week)} h/week",
            ))
    return out


def not_available(ws: Workspace, eff: EffectiveRule, grid: Grid) -> list[Violation]:
    """`not-available`: works (that shift) on the named weekdays/dates; neither = every day."""
    rule = eff.rule
    assert isinstance(rule, NotAvailable)
    weekdays = {WEEKDAYS.index(w) for w in rule.days or []}
    dates = set(rule.dates or [])
    every_day = rule.days is None and rule.dates is None
    selector = rule.shift
    selected = ws.select(selector) if selector is not None else None
    days = [
        i for i, d in enumerate(grid.dates)
        if every_day or d.weekday() in weekdays or d in dates
    ]
    out: list[Violation] = []
    for pid in eff.people:
        row = grid.rows[pid]
        for i in days:
            code = row[i]
            if code != OFF and (selected is None or code in selected):
                out.append(violation(
                    eff, pid, (grid.dates[i],), 1,
                    f"{code} on {fmt.day(grid.dates[i])}, not available",
                ))
    return out
