"""Shift counts over the period (rules.md, "Kinds": max-shifts, min-shifts)."""

from __future__ import annotations

from rostertui.core import words as fmt
from rostertui.core.check.grid import Grid
from rostertui.core.check.result import Violation, violation
from rostertui.core.models.common import OFF
from rostertui.core.models.rules import MaxShifts, MinShifts
from rostertui.core.models.workspace import EffectiveRule, Workspace


def _count(grid: Grid, pid: str, selected: frozenset[str] | None) -> int:
    row = grid.rows[pid]
    if selected is None:
        return sum(1 for c in row if c != OFF)
    return sum(1 for c in row if c in selected)


def _shift_counts(
    ws: Workspace, eff: EffectiveRule, grid: Grid, most: bool
) -> list[Violation]:
    rule = eff.rule
    assert isinstance(rule, MaxShifts | MinShifts)
    selector = rule.shift
    selected = ws.select(selector) if selector is not None else None
    label = "shifts" if selected is None else f"{fmt.codes(selected, grid.codes_order)} shifts"
    limit = rule.count
    out: list[Violation] = []
    for pid in eff.people:
        n = _count(grid, pid, selected)
        if most and n > limit:
            out.append(violation(eff, pid, (), n - limit, f"{n} {label}; at most {limit}"))
        elif not most and n < limit:
            out.append(violation(eff, pid, (), limit - n, f"{n} {label}; at least {limit}"))
    return out


def max_shifts(ws: Workspace, eff: EffectiveRule, grid: Grid) -> list[Violation]:
    """`max-shifts`: more such shifts (any shift without `shift`) than `count`."""
    return _shift_counts(ws, eff, grid, most=True)


def min_shifts(ws: Workspace, eff: EffectiveRule, grid: Grid) -> list[Violation]:
    """`min-shifts`: fewer such shifts than `count`."""
    return _shift_counts(ws, eff, grid, most=False)
