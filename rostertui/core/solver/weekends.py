"""Weekend rules (rules.md: max-weekends, complete-weekends).

Weekends are maximal runs of weekend days and holidays inside the period.
"""

from __future__ import annotations

from typing import TYPE_CHECKING

from ortools.sat.python import cp_model

from rostertui.core.models.common import WEEKDAYS
from rostertui.core.models.rules import CompleteWeekends, MaxWeekends
from rostertui.core.models.workspace import EffectiveRule
from rostertui.core.solver.cells import Cells
from rostertui.core.solver.counts import deviation
from rostertui.core.solver.logic import Lit, any_of, bool_sum, forbid, negate
from rostertui.core.solver.terms import ModelBuilder

if TYPE_CHECKING:
    from rostertui.core.solver.shared import Shared


def weekends(cells: Cells) -> list[tuple[int, int]]:
    weekend = {WEEKDAYS.index(w) for w in cells.ws.unit.weekend}
    holidays = set(cells.ws.unit.holidays)
    flags = [cells.date(d).weekday() in weekend or cells.date(d) in holidays
             for d in range(cells.n)]
    found: list[tuple[int, int]] = []
    d = 0
    while d < cells.n:
        if flags[d]:
            e = d
            while e + 1 < cells.n and flags[e + 1]:
                e += 1
            found.append((d, e))
            d = e + 1
        else:
            d += 1
    return found


class WeekendsWorked:
    """One literal per (person, weekend): worked on any of its days (shared by rules)."""

    def __init__(self, b: ModelBuilder):
        self.b = b
        self.spans = weekends(b.cells)
        self._lits: dict[tuple[int, int], Lit] = {}

    def worked(self, p: int, k: int) -> Lit:
        found = self._lits.get((p, k))
        if found is None:
            a, z = self.spans[k]
            lits = [self.b.cells.works(p, d) for d in range(a, z + 1)]
            found = self._lits[p, k] = any_of(self.b.model, lits, f"wk[{p},{k}]")
        return found

    def count(self, p: int) -> tuple[cp_model.LinearExpr | int, int, int]:  # expression, bounds
        vars_, const = bool_sum(self.worked(p, k) for k in range(len(self.spans)))
        return (sum(vars_) + const if vars_ else const), const, const + len(vars_)


def max_weekends(b: ModelBuilder, eff: EffectiveRule, shared: Shared) -> None:
    rule = eff.rule
    ww = shared.weekends
    assert isinstance(rule, MaxWeekends)
    for pid in eff.people:
        expr, lo, hi = ww.count(b.cells.pindex[pid])
        deviation(b, eff, pid, expr - rule.count, lo - rule.count, hi - rule.count, 1)


def complete_weekends(b: ModelBuilder, eff: EffectiveRule, shared: Shared) -> None:
    rule = eff.rule
    ww = shared.weekends
    assert isinstance(rule, CompleteWeekends)
    cells = b.cells
    for pid in eff.people:
        p = cells.pindex[pid]
        for k, (a, z) in enumerate(ww.spans):
            if a == z:
                continue
            days = [cells.works(p, d) for d in range(a, z + 1)]
            if rule.weight is None:
                for d in range(a, z):
                    b.hard(forbid(b.model, [days[d - a], negate(days[d - a + 1])]))
                    b.hard(forbid(b.model, [negate(days[d - a]), days[d - a + 1]]))
            else:  # worked in part: some day worked and another not
                partial = b.model.new_bool_var(f"{rule.id}.{pid}.{k}")
                for d1 in days:
                    for d2 in days:
                        if d1 is not d2 and d1 is not False and d2 is not True:
                            b.model.add(partial >= (d1 if d1 is not True else 1)
                                        - (d2 if d2 is not False else 0))
                b.add(rule.id, rule.kind, pid, (cells.date(a), cells.date(z)), rule.weight,
                      partial)
