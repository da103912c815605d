"""Hours rules (rules.md: hours, max-average-weekly-hours). Hours are exact scaled
integers (scaled_hours.py); only deviations round up."""

from __future__ import annotations

from fractions import Fraction
from typing import TYPE_CHECKING

from rostertui.core.models.rules import HoursRule, MaxAverageWeeklyHours
from rostertui.core.models.workspace import EffectiveRule
from rostertui.core.solver.counts import deviation
from rostertui.core.solver.logic import absolute, ceil_div
from rostertui.core.solver.scaled_hours import exact
from rostertui.core.solver.terms import ModelBuilder

if TYPE_CHECKING:
    from rostertui.core.solver.shared import Shared


def hours(b: ModelBuilder, eff: EffectiveRule, shared: Shared) -> None:
    rule = eff.rule
    hours = shared.hours
    assert isinstance(rule, HoursRule)
    s = hours.scale
    for pid in eff.people:
        expr, lo, hi = hours.of(b.cells.pindex[pid])
        if rule.max is not None:
            m = hours.scaled(exact(rule.max))
            deviation(b, eff, pid, expr - m, lo - m, hi - m, s)
        if rule.min is not None:
            m = hours.scaled(exact(rule.min))
            deviation(b, eff, pid, m - expr, m - hi, m - lo, s)
        if rule.target is not None and rule.weight is not None:
            t = hours.scaled(exact(rule.target))
            top = max(abs(lo - t), abs(hi - t))
            away = absolute(b.model, expr - t, lo - t, hi - t, f"{rule.id}.{pid}.away")
            units = ceil_div(b.model, away, s, top, f"{rule.id}.{pid}.target")
            b.add(rule.id, rule.kind, pid, (), rule.weight, units)


def max_average_weekly_hours(b: ModelBuilder, eff: EffectiveRule, shared: Shared) -> None:
    rule = eff.rule
    hours = shared.hours
    assert isinstance(rule, MaxAverageWeeklyHours)
    before = b.cells.ws.history.hours_before if b.cells.ws.history is not None else {}
    per_week = exact(rule.hours)
    for pid in eff.people:
        expr, lo, hi = hours.of(b.cells.pindex[pid])
        if pid in before:
            base = hours.scaled(exact(before[pid]))
            limit = hours.scaled(per_week * rule.weeks)
        else:
            base = 0
            limit = hours.scaled(per_week * Fraction(b.cells.n, 7))
        shift = base - limit
        deviation(b, eff, pid, expr + shift, lo + shift, hi + shift, hours.scale)
