"""Fairness (rules.md, "Kinds": balance; "Scope": fewer than two people never violated).

Units are the spread (max minus min) of the metric over the people in scope;
a spread of hours is rounded up. Always soft (a balance rule without weight is
an input error).
"""

from __future__ import annotations

import math
from fractions import Fraction

from rostertui.core import words as fmt
from rostertui.core.check.grid import Grid
from rostertui.core.check.result import Violation, violation
from rostertui.core.models.common import OFF
from rostertui.core.models.rules import Balance
from rostertui.core.models.workspace import EffectiveRule, Workspace


def metric_value(grid: Grid, metric: str, pid: str) -> Fraction | int:
    """A person's value of a balance metric over the period."""
    row = grid.rows[pid]
    if metric == "shifts":
        return sum(1 for c in row if c != OFF)
    if metric == "hours":
        return grid.hours(pid)
    if metric == "weekends":
        return grid.worked_weekends(pid)
    if metric == "nights":
        return sum(1 for c in row if c in grid.night_codes)
    code = metric.removeprefix("shift:")
    return sum(1 for c in row if c == code)


def balance(ws: Workspace, eff: EffectiveRule, grid: Grid) -> list[Violation]:
    """`balance`: the metric differs between people in scope; units = max - min."""
    rule = eff.rule
    assert isinstance(rule, Balance)
    metric = rule.metric
    people = eff.people
    if len(people) < 2:
        return []
    values = [metric_value(grid, metric, pid) for pid in people]
    top, low = max(values), min(values)
    if top == low:
        return []
    hi_pid, lo_pid = people[values.index(top)], people[values.index(low)]
    unit = " h" if metric == "hours" else ""
    return [violation(
        eff, None, (), math.ceil(top - low),
        f"{metric}: {fmt.number(top)}{unit} for {hi_pid}, {fmt.number(low)}{unit} for {lo_pid}",
    )]
