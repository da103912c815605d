"""check_roster: every violation of a roster, walking the effective rule set (rules.md)."""

from __future__ import annotations

from collections.abc import Callable

from rostertui.core.check import balance, builtin, counts, rest, stretches, weekends
from rostertui.core.check.grid import Grid
from rostertui.core.check.result import CheckResult, Violation
from rostertui.core.models.roster import Roster
from rostertui.core.models.workspace import EffectiveRule, Workspace

Evaluator = Callable[[Workspace, EffectiveRule, Grid], list[Violation]]

# One evaluator per rule kind of rules.md, "Kinds".
EVALUATORS: dict[str, Evaluator] = {
    "min-rest": rest.min_rest,
    "weekly-rest": rest.weekly_rest,
    "max-consecutive-days": stretches.max_consecutive_days,
    "min-consecutive-days": stretches.min_consecutive_days,
    "min-consecutive-off": stretches.min_consecutive_off,
    "max-consecutive-shift": stretches.max_consecutive_shift,
    "forbidden-sequence": stretches.forbidden_sequence,
    "max-shifts": counts.max_shifts,
    "min-shifts": counts.min_shifts,
    "hours": counts.hours,
    "max-average-weekly-hours": counts.max_average_weekly_hours,
    "max-weekends": weekends.max_weekends,
    "complete-weekends": weekends.complete_weekends,
    "not-available": counts.not_available,
    "balance": balance.balance,
}


def check_roster(ws: Workspace, roster: Roster | None = None) -> CheckResult:
    """Check `roster` (default: the workspace's roster.toml) against every rule.

    A person without a row is off every day; without any roster everyone is off.
    Order of the report: leave/requires per person and date, locks, the rules in
    the effective set's order, cover, requests.
    """
    grid = Grid(ws, roster if roster is not None else ws.roster)
    outcomes = builtin.request_outcomes(ws, grid)
    found: list[Violation] = []
    found += builtin.person_cells(ws, grid)
    found += builtin.locks(ws, grid)
    for eff in ws.rules:
        found += EVALUATORS[eff.rule.kind](ws, eff, grid)
    found += builtin.cover(ws, grid)
    found += builtin.requests(ws, grid, outcomes)
    return CheckResult(found, outcomes, grid)
