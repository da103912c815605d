"""Stretch rules (rules.md, "Terms": stretch; "Kinds"; fine print).

A stretch is a maximal run of working days, days off, or days on one shift type,
judged over history + period. Only stretches with a day in the period are judged.
A stretch reaching the first day of the person's history row (or the period start
when there is none) is open at its start; one touching the period end is open at
its end. Open stretches are exempt from minimum rules unless `edges = "closed"`;
maximum rules charge only the stretch's days inside the period.
"""

from __future__ import annotations

from collections.abc import Callable

from rostertui.core import words as fmt
from rostertui.core.check.grid import Grid, runs
from rostertui.core.check.result import Violation, violation
from rostertui.core.models.common import OFF
from rostertui.core.models.rules import (
    MaxConsecutiveDays,
    MaxConsecutiveShift,
    MinConsecutiveDays,
    MinConsecutiveOff,
)
from rostertui.core.models.workspace import EffectiveRule, Workspace

Stretch = tuple[int, int, int, bool]  # first day index, last day index, days in period, open


def stretches(grid: Grid, pid: str, member: Callable[[str], bool]) -> list[Stretch]:
    """Stretches of days whose code satisfies `member`, with a day in the period.

    Day indices are relative to the period start (negative = history).
    """
    full, offset = grid.full(pid)
    last = len(full) - 1
    found: list[Stretch] = []
    for a, b in runs([member(code) for code in full]):
        if b < offset:
            continue
        inside = b - max(a, offset) + 1
        found.append((a - offset, b - offset, inside, a == 0 or b == last))
    return found


def _too_long(
    eff: EffectiveRule, grid: Grid, member: Callable[[str], bool], limit: int,
    what: Callable[[int], str],
) -> list[Violation]:
    """Maximum rule: units = min(length - limit, the stretch's days inside the period)."""
    out: list[Violation] = []
    for pid in eff.people:
        for a, b, inside, _open in stretches(grid, pid, member):
            length = b - a + 1
            if length > limit:
                units = min(length - limit, inside)
                out.append(violation(
                    eff, pid, (grid.date(a), grid.date(b)), units,
                    f"{what(length)}; at most {limit}",
                ))
    return out


def _too_short(
    eff: EffectiveRule, grid: Grid, member: Callable[[str], bool], limit: int, what: str,
    closed_edges: bool,
) -> list[Violation]:
    """Minimum rule: units = days short, per closed stretch (all with edges = "closed")."""
    out: list[Violation] = []
    for pid in eff.people:
        for a, b, _inside, is_open in stretches(grid, pid, member):
            length = b - a + 1
            if length < limit and (closed_edges or not is_open):
                out.append(violation(
                    eff, pid, (grid.date(a), grid.date(b)), limit - length,
                    f"{length} {what} in a row; at least {limit}",
                ))
    return out


def _working(code: str) -> bool:
    return code != OFF


def _off(code: str) -> bool:
    return code == OFF


def max_consecutive_days(ws: Workspace, eff: EffectiveRule, grid: Grid) -> list[Violation]:
    """`max-consecutive-days`: a working stretch longer than `days`."""
    rule = eff.rule
    assert isinstance(rule, MaxConsecutiveDays)
    return _too_long(eff, grid, _working, rule.days, lambda n: f"{n} working days in a row")


def min_consecutive_days(ws: Workspace, eff: EffectiveRule, grid: Grid) -> list[Violation]:
    """`min-consecutive-days`: a closed working stretch shorter than `days`."""
    rule = eff.rule
    assert isinstance(rule, MinConsecutiveDays)
    return _too_short(eff, grid, _working, rule.days, "working days", rule.edges == "closed")


def min_consecutive_off(ws: Workspace, eff: EffectiveRule, grid: Grid) -> list[Violation]:
    """`min-consecutive-off`: a closed stretch of days off shorter than `days`."""
    rule = eff.rule
    assert isinstance(rule, MinConsecutiveOff)
    return _too_short(eff, grid, _off, rule.days, "days off", rule.edges == "closed")


def max_consecutive_shift(ws: Workspace, eff: EffectiveRule, grid: Grid) -> list[Violation]:
    """`max-consecutive-shift`: a stretch of days on `shift` (code or "@night") over `count`."""
    rule = eff.rule
    assert isinstance(rule, MaxConsecutiveShift)
    selected = ws.select(rule.shift)
    label = fmt.codes(selected, grid.codes_order)
    return _too_long(
        eff, grid, selected.__contains__, rule.count, lambda n: f"{n} {label} shifts in a row"
    )
