"""Repair: solve again, changing as few cells as possible, never touching the past.

The reference is the roster as it stands (the published version plus the swaps
and absences recorded since), so an agreed swap is kept rather than undone. Days
before `from` keep their codes; cover shortfalls there are the past's and are
reported, not charged to the repair. Each changed cell costs the unit's
`[repair] change_weight` (default 1000) on top of the rules.md penalty.
"""

from __future__ import annotations

import dataclasses
import threading
from dataclasses import dataclass
from datetime import date, datetime
from zoneinfo import ZoneInfo

from rostertui.core.check import CheckResult, Violation, check_roster
from rostertui.core.errors import EditError
from rostertui.core.models.workspace import Workspace
from rostertui.core.repair.diff import roster_diff
from rostertui.core.repair.fixes import ChangedCell, attribute
from rostertui.core.repair.impact import impact
from rostertui.core.repair.rows import normalised
from rostertui.core.solver.keep import Keep
from rostertui.core.solver.outcome import ProgressCallback, SolveOptions, SolveOutcome
from rostertui.core.solver.run import solve


@dataclass
class RepairOutcome:
    outcome: SolveOutcome
    start_from: date  # first day the repair could change
    before: CheckResult  # the roster before the repair
    changed: list[ChangedCell]  # cells the repair changed, with what each fixed
    past: list[Violation]  # hard breaches before `start_from`, left as they were

    @property
    def after(self) -> CheckResult | None:
        return self.outcome.check


def default_from(ws: Workspace, today: date | None = None) -> date:
    """Today (where the unit is, unless given) when it lies in the period, else the
    period's first day."""
    today = today or today_in(ws)
    return today if ws.unit.in_period(today) else ws.unit.start


def today_in(ws: Workspace) -> date:
    """Today's date in the unit's timezone."""
    return datetime.now(ZoneInfo(ws.unit.timezone)).date()


def repair(ws: Workspace, start_from: date, options: SolveOptions | None = None,
           on_progress: ProgressCallback | None = None,
           cancel: threading.Event | None = None) -> RepairOutcome:
    """Re-solve `ws` staying as close as possible to its current roster."""
    if ws.roster is None:
        raise EditError("there is no roster.toml to repair: solve first")
    unit = ws.unit
    if start_from > unit.end:
        raise EditError(f"--from {start_from} is after the period ends ({unit.end}): "
                        "nothing left to repair")
    start_from = max(start_from, unit.start)
    current = normalised(ws, ws.roster)
    ws = dataclasses.replace(ws, roster=current)
    before = check_roster(ws, current)
    keep = Keep(rows=current.rows, frozen=(start_from - unit.start).days,
                weight=unit.repair.change_weight)
    outcome = solve(ws, options, on_progress, cancel, keep=keep)
    past = [v for v in before.violations
            if v.hard and v.dates and all(d < start_from for d in v.dates)]
    if outcome.roster is None or outcome.check is None:
        return RepairOutcome(outcome, start_from, before, [], past)
    fixed = impact(before, outcome.check).resolved
    changed = attribute(roster_diff(ws, current, outcome.roster), fixed)
    return RepairOutcome(outcome, start_from, before, changed, past)
