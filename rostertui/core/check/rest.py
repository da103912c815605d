"""Rest rules in real elapsed time (rules.md, "Kinds": min-rest, weekly-rest; fine print).

Instants come from `timeline`: DST-aware, fold=0. History shifts count; time
before the history row (or before the period without one) is rest.
"""

from __future__ import annotations

from rostertui.core import words as fmt
from rostertui.core.check.grid import Grid
from rostertui.core.check.result import Violation, violation
from rostertui.core.check.timeline import longest_free
from rostertui.core.models.common import clock_minutes
from rostertui.core.models.rules import MinRest, WeeklyRest
from rostertui.core.models.workspace import EffectiveRule, Workspace


def min_rest(ws: Workspace, eff: EffectiveRule, grid: Grid) -> list[Violation]:
    """`min-rest`: the gap from a shift's end to the next shift's start is below `hours`.

    Judged for every pair whose later shift is in the period (so the pair
    (last history day, first period day) too). Exactly `hours` passes; shifts
    that overlap give a negative rest.
    """
    rule = eff.rule
    assert isinstance(rule, MinRest)
    need = round(rule.hours * 60)
    out: list[Violation] = []
    for pid in eff.people:
        spells, _ = grid.spells(pid)
        for prev, nxt in zip(spells, spells[1:], strict=False):
            if nxt.day < 0:
                continue
            gap = nxt.start - prev.end
            if gap >= need:
                continue
            a, b = grid.shifts[prev.code], grid.shifts[nxt.code]
            end_day = prev.day + (1 if clock_minutes(a.end) <= clock_minutes(a.start) else 0)
            out.append(violation(
                eff, pid, (grid.date(prev.day), grid.date(nxt.day)), 1,
                f"{fmt.duration(gap)} rest between {prev.code} (ends {a.end} on "
                f"{fmt.day(grid.date(end_day))}) and {nxt.code} (starts {b.start} on "
                f"{fmt.day(grid.date(nxt.day))}); needs {fmt.number(rule.hours)} h",
            ))
    return out


def windows(grid: Grid, window_days: int, align: str) -> list[int]:
    """First day index of every weekly-rest window checked (it ends by the period end).

    `monday`: consecutive blocks from the Monday on or before the period start (may
    begin before the period); `period-start`: blocks from the period start;
    `rolling`: one window starting on every period day.
    """
    if align == "rolling":
        firsts = range(0, grid.n)
    else:
        first = -grid.start.weekday() if align == "monday" else 0
        firsts = range(first, grid.n, window_days)
    return [f for f in firsts if f + window_days <= grid.n]


def weekly_rest(ws: Workspace, eff: EffectiveRule, grid: Grid) -> list[Violation]:
    """`weekly-rest`: a window without an uninterrupted off-duty interval of `hours`.

    Only the part of an interval inside the window counts; window edges are local
    midnight (a window across DST lasts 167 or 169 h).
    """
    rule = eff.rule
    assert isinstance(rule, WeeklyRest)
    need = round(rule.hours * 60)
    days = rule.window_days
    firsts = windows(grid, days, rule.align)
    bounds = [(f, grid.clock.midnight(f), grid.clock.midnight(f + days)) for f in firsts]
    out: list[Violation] = []
    for pid in eff.people:
        spells, starts = grid.spells(pid)
        for first, lo, hi in bounds:
            longest = longest_free(spells, starts, lo, hi)
            if longest < need:
                a, b = grid.date(first), grid.date(first + days - 1)
                out.append(violation(
                    eff, pid, (a, b), 1,
                    f"longest rest {fmt.duration(longest)} in {fmt.span(a, b)}; "
                    f"needs {fmt.number(rule.hours)} h",
                ))
    return out
