"""Counting rules (rules.md: max/min-shifts, hours, max-average-weekly-hours,
not-available). Hours are exact scaled integers; only deviations round up."""

from __future__ import annotations

from fractions import Fraction

from ortools.sat.python import cp_model

from rostertui.core.models.rules import (
    HoursRule,
    MaxAverageWeeklyHours,
    MaxShifts,
    MinShifts,
    NotAvailable,
)
from rostertui.core.models.workspace import EffectiveRule
from rostertui.core.solver.hours import Hours, exact
from rostertui.core.solver.logic import absolute, bool_sum, ceil_div, excess, forbid
from rostertui.core.solver.terms import Build


def shift_count(b: Build, p: int, codes: frozenset[str] | None) -> tuple[cp_model.LinearExpr | int,
                                                                        int, int]:
    """(expression, lowest, highest) of the number of such shifts in the period."""
    cells = b.cells
    wanted = frozenset(cells.codes) if codes is None else codes
    vars_, const = bool_sum(cells.on(p, d, wanted) for d in range(cells.n))
    return (sum(vars_) + const if vars_ else const), const, const + len(vars_)


def add_shift_count(b: Build, eff: EffectiveRule) -> None:
    rule = eff.rule
    assert isinstance(rule, MaxShifts | MinShifts)
    codes = b.cells.ws.select(rule.shift) if rule.shift is not None else None
    most = isinstance(rule, MaxShifts)
    for pid in eff.people:
        expr, lo, hi = shift_count(b, b.cells.pindex[pid], codes)
        over = (expr - rule.count, lo - rule.count, hi - rule.count) if most else \
            (rule.count - expr, rule.count - hi, rule.count - lo)
        deviation(b, eff, pid, *over, divisor=1)


def deviation(b: Build, eff: EffectiveRule, pid: str, expr: cp_model.LinearExprT, lo: int,
               hi: int, divisor: int) -> None:
    """Hard: expr <= 0. Soft: units = ceil(max(0, expr) / divisor)."""
    rule = eff.rule
    if hi <= 0:
        return
    if rule.weight is None:
        if isinstance(expr, int):  # a constant: holds, or breaks whatever is rostered
            b.hard(b.model.add_bool_or([]) if expr > 0 else None)
        else:
            b.hard(b.model.add(expr <= 0))
        return
    name = f"{rule.id}.{pid}"
    if isinstance(expr, int):
        units: cp_model.IntVar | int = -(-max(0, expr) // divisor)
    else:
        over = excess(b.model, expr, lo, hi, name)
        units = ceil_div(b.model, over, divisor, hi, f"{name}.h")
    b.add(rule.id, rule.kind, pid, (), rule.weight, units)


def add_hours(b: Build, eff: EffectiveRule, hours: Hours) -> None:
    rule = eff.rule
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


def add_average_hours(b: Build, eff: EffectiveRule, hours: Hours) -> None:
    rule = eff.rule
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


def add_not_available(b: Build, eff: EffectiveRule) -> None:
    """Soft part, and the hard part when explaining: otherwise hard not-available cells
    have no variable at all (cells.py)."""
    rule = eff.rule
    assert isinstance(rule, NotAvailable)
    cells = b.cells
    if rule.weight is None and not cells.relaxed:
        return
    codes = cells.ws.select(rule.shift) if rule.shift else frozenset(cells.codes)
    for pid in eff.people:
        p = cells.pindex[pid]
        for d in cells.not_available_days(rule):
            works = cells.on(p, d, frozenset(codes))
            if rule.weight is None:
                b.hard(forbid(b.model, [works]))
            else:
                b.add(rule.id, rule.kind, pid, (cells.date(d),), rule.weight, works)
