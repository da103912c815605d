"""check_roster: every violation of a roster, walking the effective rule set (rules.md)."""

from __future__ import annotations

import importlib
from collections.abc import Callable

from rostertui.core.check import builtin
from rostertui.core.check.grid import Grid
from rostertui.core.check.result import CheckResult, Violation
from rostertui.core.models.roster import Roster
from rostertui.core.models.rules import RULE_FAMILY, RULE_KINDS, function_name
from rostertui.core.models.workspace import EffectiveRule, Workspace

Evaluator = Callable[[Workspace, EffectiveRule, Grid], list[Violation]]


def evaluator(kind: str) -> Evaluator:
    """A kind's evaluator: the function named like it in check/<its family>.py."""
    module = importlib.import_module(f"rostertui.core.check.{RULE_FAMILY[kind]}")
    found: Evaluator | None = getattr(module, function_name(kind), None)
    if found is None:
        raise LookupError(f"no {function_name(kind)}() in {module.__name__} for {kind!r}")
    return found


# One evaluator per rule kind of rules.md, "Kinds", in the union's order.
EVALUATORS: dict[str, Evaluator] = {kind: evaluator(kind) for kind in RULE_KINDS}


def check_roster(ws: Workspace, roster: Roster | None = None) -> CheckResult:
    """Check `roster` (default: the workspace's roster.toml) against every rule.

    A person without a row is off every day; without any roster everyone is off.
    Order of the report: leave/requires per person and date, the rules in the
    effective set's order, cover, requests. Locks are never broken in a single
    roster: a locked cell keeps its current value, which is the roster's own (cases
    503, 505, 507 and 509 hold locks and report none); `check_locks` compares a
    roster with the one it was solved from.
    """
    grid = Grid(ws, roster if roster is not None else ws.roster)
    outcomes = builtin.request_outcomes(ws, grid)
    found: list[Violation] = []
    found += builtin.person_cells(ws, grid)
    for eff in ws.rules:
        found += EVALUATORS[eff.rule.kind](ws, eff, grid)
    found += builtin.cover(ws, grid)
    found += builtin.requests(ws, grid, outcomes)
    return CheckResult(found, outcomes, grid)
