"""Stretch rules (rules.md: max/min-consecutive-days, min-consecutive-off,
max-consecutive-shift), over history + period.

A stretch reaching the first day of the person's history row (the period start
without history) is open at its start; one touching the period end is open at its
end. Maximum rules: units = min(length - limit, days inside the period), which is
the number of period days ending a run of more than `limit` member days. Minimum
rules: days short, for each closed stretch (every stretch with edges = "closed").
"""

from __future__ import annotations

from collections.abc import Callable
from typing import TYPE_CHECKING

from rostertui.core.models.common import OFF
from rostertui.core.models.rules import (
    MaxConsecutiveDays,
    MaxConsecutiveShift,
    MinConsecutiveDays,
    MinConsecutiveOff,
)
from rostertui.core.models.workspace import EffectiveRule
from rostertui.core.solver.logic import Lit, breach, forbid, negate
from rostertui.core.solver.terms import ModelBuilder

if TYPE_CHECKING:
    from rostertui.core.solver.shared import Shared

Member = Callable[[int, int], Lit]  # (person index, day index) -> literal


def _member(b: ModelBuilder, eff: EffectiveRule) -> Member:
    cells, rule = b.cells, eff.rule
    if isinstance(rule, MaxConsecutiveShift):
        codes = frozenset(cells.ws.select(rule.shift))
        return lambda p, d: cells.on(p, d, codes)
    if isinstance(rule, MinConsecutiveOff):
        return lambda p, d: _off(b, p, d)
    return cells.works


def _off(b: ModelBuilder, p: int, d: int) -> Lit:
    if d < 0:
        return b.cells.history_code(p, d) == OFF
    return negate(b.cells.works(p, d))


def max_consecutive_days(b: ModelBuilder, eff: EffectiveRule, shared: Shared) -> None:
    _max_stretch(b, eff)


def max_consecutive_shift(b: ModelBuilder, eff: EffectiveRule, shared: Shared) -> None:
    _max_stretch(b, eff)


def min_consecutive_days(b: ModelBuilder, eff: EffectiveRule, shared: Shared) -> None:
    _min_stretch(b, eff)


def min_consecutive_off(b: ModelBuilder, eff: EffectiveRule, shared: Shared) -> None:
    _min_stretch(b, eff)


def _max_stretch(b: ModelBuilder, eff: EffectiveRule) -> None:
    rule = eff.rule
    assert isinstance(rule, MaxConsecutiveDays | MaxConsecutiveShift)
    limit = rule.days if isinstance(rule, MaxConsecutiveDays) else rule.count
    member = _member(b, eff)
    cells = b.cells
    for pid in eff.people:
        p = cells.pindex[pid]
        for t in range(cells.n):
            window = [member(p, d) for d in range(t - limit, t + 1)]
            if any(w is False for w in window):
                continue
            if rule.weight is None:
                b.hard(forbid(b.model, window))
            else:
                dates = (cells.date(max(t - limit, 0)), cells.date(t))
                b.add(rule.id, rule.kind, pid, dates, rule.weight, breach(b.model, window))


def _min_stretch(b: ModelBuilder, eff: EffectiveRule) -> None:
    rule = eff.rule
    assert isinstance(rule, MinConsecutiveDays | MinConsecutiveOff)
    member = _member(b, eff)
    cells = b.cells
    closed = rule.edges == "closed"
    for pid in eff.people:
        p = cells.pindex[pid]
        first = -len(cells.history[p])  # first day of the history row (0 without one)
        for a in range(first, cells.n):
            for length in range(1, rule.days):
                z = a + length - 1
                if z < 0 or z >= cells.n:
                    continue
                opens = a == first or z == cells.n - 1
                if opens and not closed:
                    continue
                lits = [member(p, d) for d in range(a, z + 1)]
                if a > first:
                    lits.append(negate(member(p, a - 1)))
                if z < cells.n - 1:
                    lits.append(negate(member(p, z + 1)))
                if any(x is False for x in lits):
                    continue
                if rule.weight is None:
                    b.hard(forbid(b.model, lits))
                else:
                    b.add(rule.id, rule.kind, pid, (cells.date(max(a, 0)), cells.date(z)),
                          rule.weight * (rule.days - length), breach(b.model, lits))
