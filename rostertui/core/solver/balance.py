"""`balance` (rules.md, soft only): units = max minus min of a metric over the scope."""

from __future__ import annotations

from rostertui.core.models.rules import Balance
from rostertui.core.models.workspace import EffectiveRule
from rostertui.core.solver.counts import shift_count
from rostertui.core.solver.hours import Hours
from rostertui.core.solver.logic import ceil_div
from rostertui.core.solver.terms import Build
from rostertui.core.solver.weekends import WeekendsWorked


def add_balance(b: Build, eff: EffectiveRule, hours: Hours, ww: WeekendsWorked) -> None:
    rule = eff.rule
    assert isinstance(rule, Balance) and rule.weight is not None
    if len(eff.people) < 2:
        return
    cells, model = b.cells, b.model
    metrics = []
    for pid in eff.people:
        p = cells.pindex[pid]
        if rule.metric == "hours":
            metrics.append(hours.of(p))
        elif rule.metric == "weekends":
            metrics.append(ww.count(p))
        elif rule.metric == "shifts":
            metrics.append(shift_count(b, p, None))
        elif rule.metric == "nights":
            metrics.append(shift_count(b, p, cells.ws.select("@night")))
        else:
            metrics.append(shift_count(b, p, frozenset([rule.metric.removeprefix("shift:")])))
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
