"""`balance` (rules.md, soft only): units = max minus min of a metric over the scope."""

from __future__ import annotations

from typing import TYPE_CHECKING

from ortools.sat.python import cp_model

from rostertui.core.models.rules import Balance
from rostertui.core.models.workspace import EffectiveRule
from rostertui.core.solver.counts import shift_count
from rostertui.core.solver.logic import ceil_div
from rostertui.core.solver.scaled_hours import Hours
from rostertui.core.solver.terms import ModelBuilder
from rostertui.core.solver.weekends import WeekendsWorked

if TYPE_CHECKING:
    from rostertui.core.solver.shared import Shared


def metric_of(b: ModelBuilder, metric: str, p: int, hours: Hours, ww: WeekendsWorked
              ) -> tuple[cp_model.LinearExpr | int, int, int]:
    """(expression, lowest, highest) of person p's balance metric; hours are scaled by
    `hours.scale`, every other metric is a count."""
    cells = b.cells
    if metric == "hours":
        return hours.of(p)
    if metric == "weekends":
        return ww.count(p)
    if metric == "shifts":
        return shift_count(b, p, None)
    if metric == "nights":
        return shift_count(b, p, cells.ws.select("@night"))
    return shift_count(b, p, frozenset([metric.removeprefix("shift:")]))


def balance(b: ModelBuilder, eff: EffectiveRule, shared: Shared) -> None:
    rule = eff.rule
    hours, ww = shared.hours, shared.weekends
    assert isinstance(rule, Balance) and rule.weight is not None
    if len(eff.people) < 2:
        return
    cells, model = b.cells, b.model
    metrics = [metric_of(b, rule.metric, cells.pindex[pid], hours, ww) for pid in eff.people]
    lo = min(m[1] for m in metrics)
    hi = max(m[2] for m in metrics)
    # top >= every value and low <= every value: the objective pulls them together,
    # and polishing makes them the exact max and min of the roster returned
    top = model.new_int_var(lo, hi, f"{rule.id}.max")
    low = model.new_int_var(lo, hi, f"{rule.id}.min")
    for expr, _mlo, _mhi in metrics:
        model.add(top >= expr)
        model.add(low <= expr)
    spread = model.new_int_var(0, hi - lo, f"{rule.id}.spread")
    model.add(spread == top - low)
    divisor = hours.scale if rule.metric == "hours" else 1
    units = ceil_div(model, spread, divisor, hi - lo, f"{rule.id}.units")
    b.add(rule.id, rule.kind, None, (), rule.weight, units)
