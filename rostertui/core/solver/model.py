"""Build the whole CP-SAT model of a workspace: cells, every rule family, one objective."""

from __future__ import annotations

from dataclasses import dataclass, field

from ortools.sat.python import cp_model

from rostertui.core.models import rules as R
from rostertui.core.models.workspace import Workspace
from rostertui.core.solver.balance import add_balance
from rostertui.core.solver.cells import Cells
from rostertui.core.solver.clock import ShiftClock
from rostertui.core.solver.counts import (
    add_average_hours,
    add_hours,
    add_not_available,
    add_shift_count,
)
from rostertui.core.solver.cover import add_cover
from rostertui.core.solver.hours import Hours
from rostertui.core.solver.keep import Keep, change_literals
from rostertui.core.solver.logic import Lit
from rostertui.core.solver.requests import add_requests
from rostertui.core.solver.rest import OffRuns, add_min_rest, add_weekly_rest
from rostertui.core.solver.sequences import add_forbidden_sequence
from rostertui.core.solver.stretches import add_max_stretch, add_min_stretch
from rostertui.core.solver.terms import Build
from rostertui.core.solver.weekends import (
    WeekendsWorked,
    add_complete_weekends,
    add_max_weekends,
)


@dataclass
class Built:
    model: cp_model.CpModel
    cells: Cells
    build: Build
    keep: Keep | None = None
    changes: list[Lit] = field(default_factory=list)  # repair: one per changed cell

    def change_cost(self, changes: int) -> int:
        return self.keep.weight * changes if self.keep is not None else 0


def build_model(ws: Workspace, keep: Keep | None = None) -> Built:
    """The model of `ws`; with `keep`, also a cost per cell changed from a reference
    roster, and the first `keep.frozen` days fixed (repair)."""
    model = cp_model.CpModel()
    cells = Cells(ws, model, frozen=keep.frozen if keep is not None else 0)
    b = Build(model, cells)
    if cells.lock_conflicts:  # a locked shift the cell cannot hold: no roster keeps it
        model.add_bool_or([])
    hours = Hours(cells)
    weekends = WeekendsWorked(b)
    clock = ShiftClock(ws)
    runs = OffRuns(b)
    add_cover(b)
    add_requests(b)
    for eff in ws.rules:
        rule = eff.rule
        if isinstance(rule, R.MinRest):
            add_min_rest(b, eff, clock, runs)
        elif isinstance(rule, R.WeeklyRest):
            add_weekly_rest(b, eff, clock)
        elif isinstance(rule, R.MaxConsecutiveDays | R.MaxConsecutiveShift):
            add_max_stretch(b, eff)
        elif isinstance(rule, R.MinConsecutiveDays | R.MinConsecutiveOff):
            add_min_stretch(b, eff)
        elif isinstance(rule, R.ForbiddenSequence):
            add_forbidden_sequence(b, eff)
        elif isinstance(rule, R.MaxShifts | R.MinShifts):
            add_shift_count(b, eff)
        elif isinstance(rule, R.HoursRule):
            add_hours(b, eff, hours)
        elif isinstance(rule, R.MaxAverageWeeklyHours):
            add_average_hours(b, eff, hours)
        elif isinstance(rule, R.MaxWeekends):
            add_max_weekends(b, eff, weekends)
        elif isinstance(rule, R.CompleteWeekends):
            add_complete_weekends(b, eff, weekends)
        elif isinstance(rule, R.NotAvailable):
            add_not_available(b, eff)
        elif isinstance(rule, R.Balance):
            add_balance(b, eff, hours, weekends)
        else:  # pragma: no cover - every kind of the union is handled above
            raise TypeError(f"no model for rule kind {rule.kind!r}")
    changes = change_literals(cells, keep) if keep is not None else []
    if keep is not None and changes:
        model.minimize(b.objective() + keep.weight * sum(changes))
    else:
        model.minimize(b.objective())
    return Built(model, cells, b, keep, changes)
