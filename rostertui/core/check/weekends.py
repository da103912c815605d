"""Weekend rules (rules.md, "Terms": weekend; "Kinds": max-weekends, complete-weekends).

Weekends are the maximal runs of weekend days and holidays inside the period
(computed once in `Grid`): a holiday next to a weekend joins it, a lone weekday
holiday is a one-day weekend, a weekend cut by the period edge still counts.
"""

from __future__ import annotations

from rostertui.core import words as fmt
from rostertui.core.check.grid import Grid
from rostertui.core.check.result import Violation, violation
from rostertui.core.models.common import OFF
from rostertui.core.models.rules import MaxWeekends
from rostertui.core.models.workspace import EffectiveRule, Workspace


def max_weekends(ws: Workspace, eff: EffectiveRule, grid: Grid) -> list[Violation]:
    """`max-weekends`: more worked weekends (any day worked) than `count`."""
    rule = eff.rule
    assert isinstance(rule, MaxWeekends)
    limit = rule.count
    out: list[Violation] = []
    for pid in eff.people:
        worked = grid.worked_weekends(pid)
        if worked > limit:
            out.append(violation(
                eff, pid, (), worked - limit, f"{worked} weekends worked; at most {limit}"
            ))
    return out


def complete_weekends(ws: Workspace, eff: EffectiveRule, grid: Grid) -> list[Violation]:
    """`complete-weekends`: a weekend worked on some but not all of its days."""
    out: list[Violation] = []
    for pid in eff.people:
        row = grid.rows[pid]
        for a, b in grid.weekends:
            worked = sum(1 for i in range(a, b + 1) if row[i] != OFF)
            if 0 < worked < b - a + 1:
                first, last = grid.dates[a], grid.dates[b]
                out.append(violation(
                    eff, pid, (first, last), 1,
                    f"weekend {fmt.span(first, last)} worked in part",
                ))
    return out
