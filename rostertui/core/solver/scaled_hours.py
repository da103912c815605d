"""Hours as exact integers: every value in the files times one common scale.

rules.md sums hours exactly and rounds only the deviation up to whole hours. The
files hold decimals (7.5, 41.8, 5.75) and averaging limits bring sevenths
(48 x days / 7), so all hour values are multiplied by the least common multiple
of their denominators; "rounded up" is then an exact ceiling division by it.
"""

from __future__ import annotations

import math
from fractions import Fraction

from ortools.sat.python import cp_model

from rostertui.core.models.rules import HoursRule, MaxAverageWeeklyHours
from rostertui.core.models.workspace import Workspace
from rostertui.core.solver.cells import Cells

MAX_SCALE = 10**6


def exact(value: float) -> Fraction:
    return Fraction(str(value))


def paid(ws: Workspace, code: str) -> Fraction:
    shift = ws.shift_by_code[code]
    return exact(shift.paid_hours) if shift.paid_hours is not None else Fraction(shift.minutes, 60)


class Hours:
    """Scaled hour expressions per person: paid hours of shifts plus leave credit."""

    def __init__(self, cells: Cells):
        self.cells = cells
        ws = cells.ws
        self.paid = {code: paid(ws, code) for code in cells.codes}
        self.credit = self._credit()
        values: list[Fraction] = [*self.paid.values(), *self.credit.values(),
                                  Fraction(cells.n, 7)]
        for eff in ws.rules:
            rule = eff.rule
            if isinstance(rule, HoursRule):
                values += [exact(v) for v in (rule.min, rule.max, rule.target) if v is not None]
            elif isinstance(rule, MaxAverageWeeklyHours):
                values += [exact(rule.hours), exact(rule.hours) * Fraction(cells.n, 7)]
        if ws.history is not None:
            values += [exact(v) for v in ws.history.hours_before.values()]
        scale = 1
        for v in values:
            scale = math.lcm(scale, v.denominator)
            if scale > MAX_SCALE:
                raise ValueError("hour values need a finer scale than the solver supports")
        self.scale = scale
        self._expr: dict[int, tuple[cp_model.LinearExpr | int, int, int]] = {}

    def _credit(self) -> dict[str, Fraction]:
        """Leave credit per person in the period (one credit per leave day, the largest)."""
        cells = self.cells
        per_day: dict[tuple[str, int], Fraction] = {}
        for lv in cells.ws.requests.leave:
            credit = exact(lv.credit_hours) if lv.credit_hours is not None else Fraction(0)
            for d in lv.dates():
                i = (d - cells.start).days
                if 0 <= i < cells.n:
                    key = (lv.person, i)
                    per_day[key] = max(per_day.get(key, Fraction(0)), credit)
        total: dict[str, Fraction] = {}
        for (pid, _), credit in per_day.items():
            total[pid] = total.get(pid, Fraction(0)) + credit
        return total

    def scaled(self, value: Fraction) -> int:
        scaled = value * self.scale
        assert scaled.denominator == 1
        return int(scaled)

    def of(self, p: int) -> tuple[cp_model.LinearExpr | int, int, int]:
        """(expression, lowest, highest) of person p's scaled hours in the period."""
        found = self._expr.get(p)
        if found is None:
            cells = self.cells
            const = self.scaled(self.credit.get(cells.people[p], Fraction(0)))
            terms = []
            top = const
            for d in range(cells.n):
                best = 0
                for code, var in cells.cell(p, d):
                    w = self.scaled(self.paid[code])
                    terms.append(w * var)
                    best = max(best, w)
                top += best
            expr = sum(terms) + const if terms else const
            found = self._expr[p] = (expr, const, top)
        return found
