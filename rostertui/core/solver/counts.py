"""Shift counts (rules.md: max-shifts, min-shifts), and `deviation`: how a count or
a sum over its limit becomes a hard constraint or whole units of penalty."""

from __future__ import annotations

from typing import TYPE_CHECKING

from ortools.sat.python import cp_model

from rostertui.core.models.rules import MaxShifts, MinShifts
from rostertui.core.models.workspace import EffectiveRule
from rostertui.core.solver.logic import bool_sum, ceil_div, excess
from rostertui.core.solver.terms import ModelBuilder

if TYPE_CHECKING:
    from rostertui.core.solver.shared import Shared


def shift_count(b: ModelBuilder, p: int, codes: frozenset[str] | None
                ) -> tuple[cp_model.LinearExpr | int, int, int]:
    """(expression, lowest, highest) of the number of such shifts in the period."""
    cells = b.cells
    wanted = frozenset(cells.codes) if codes is None else codes
    vars_, const = bool_sum(cells.on(p, d, wanted) for d in range(cells.n))
    return (sum(vars_) + const if vars_ else const), const, const + len(vars_)


def max_shifts(b: ModelBuilder, eff: EffectiveRule, shared: Shared) -> None:
    _shift_count(b, eff, most=True)


def min_shifts(b: ModelBuilder, eff: EffectiveRule, shared: Shared) -> None:
    _shift_count(b, eff, most=False)


def _shift_count(b: ModelBuilder, eff: EffectiveRule, most: bool) -> None:
    rule = eff.rule
    assert isinstance(rule, MaxShifts | MinShifts)
    codes = b.cells.ws.select(rule.shift) if rule.shift is not None else None
    for pid in eff.people:
        expr, lo, hi = shift_count(b, b.cells.pindex[pid], codes)
        over = (expr - rule.count, lo - rule.count, hi - rule.count) if most else \
            (rule.count - expr, rule.count - hi, rule.count - lo)
        deviation(b, eff, pid, *over, divisor=1)


def deviation(b: ModelBuilder, eff: EffectiveRule, pid: str, expr: cp_model.LinearExprT, lo: int,
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
