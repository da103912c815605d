"""Hours rules over the period (rules.md, "Kinds": hours, max-average-weekly-hours;
fine print on hours).

Hours are summed exactly (fractions of the decimals written in the files); only
the deviation is rounded up to whole hours.
"""

from __future__ import annotations

import math
from fractions import Fraction

from rostertui.core import words as fmt
from rostertui.core.check.grid import Grid, exact
from rostertui.core.check.result import Violation, violation
from rostertui.core.models.rules import HoursRule, MaxAverageWeeklyHours
from rostertui.core.models.workspace import EffectiveRule, Workspace


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
