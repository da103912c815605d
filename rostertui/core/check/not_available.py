"""`not-available` (rules.md, "Kinds"): no shift (or no such shift) on the named
weekdays or dates; neither named = every day."""

from __future__ import annotations

from rostertui.core import words as fmt
from rostertui.core.check.grid import Grid
from rostertui.core.check.result import Violation, violation
from rostertui.core.models.common import OFF, WEEKDAYS
from rostertui.core.models.rules import NotAvailable
from rostertui.core.models.workspace import EffectiveRule, Workspace


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
