"""Build the whole CP-SAT model of a workspace: cells, every rule family, one objective."""

from __future__ import annotations

import dataclasses
from dataclasses import dataclass, field

from ortools.sat.python import cp_model

from rostertui.core.models import rules as R
from rostertui.core.models.workspace import EffectiveRule, Workspace
from rostertui.core.solver.balance import add_balance
from rostertui.core.solver.cells import Cells
from rostertui.core.solver.clock import ShiftClock
from rostertui.core.solver.counts import (
    add_average_hours,
    add_hours,
    add_not_available,
    add_shift_count,
)
from rostertui.core.solver.cover import CoverSwitch, add_cover
from rostertui.core.solver.hours import Hours
from rostertui.core.solver.items import HardItem, Items, add_leave_and_locks
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
    gaps: list[tuple[int, int, cp_model.IntVar | int]] = field(default_factory=list)
    items: Items | None = None  # explain: the switch of every hard item

    def change_cost(self, changes: int) -> int:
        return self.keep.weight * changes if self.keep is not None else 0


def build_model(ws: Workspace, keep: Keep | None = None, explain: bool = False,
                gap_weight: int | None = None) -> Built:
    """The model of `ws`.

    `keep` (repair): a cost per cell changed from a reference roster, and the first
    `keep.frozen` days fixed. `explain`: every hard item gets its own switch
    (`Built.items`); soft rules and the objective are left out. `gap_weight`: cover
    minimums become penalties of that weight per person short (`Built.gaps`).
    """
    model = cp_model.CpModel()
    cells = Cells(ws, model, frozen=keep.frozen if keep is not None else 0, relaxed=explain)
    items = Items(model) if explain else None
    b = Build(model, cells)
    if cells.lock_conflicts:  # a locked shift the cell cannot hold: no roster keeps it
        model.add_bool_or([])
    hours = Hours(cells)
    weekends = WeekendsWorked(b)
    clock = ShiftClock(ws)
    runs = OffRuns(b)
    cover_switch = None
    if items is not None:
        add_leave_and_locks(b, items)
        cover_switch = _cover_switch(ws, cells, items)
    gaps = add_cover(b, cover_switch, gap_weight)
    add_requests(b)
    for eff in ws.rules:
        if items is None:
            _add_rule(b, eff, clock, runs, hours, weekends)
        elif eff.rule.weight is None:  # explain: one switch per rule and person
            for pid in eff.people:
                b.enforce = items.switch(HardItem("rule", eff.rule.id, pid))
                _add_rule(b, dataclasses.replace(eff, people=(pid,)), clock, runs, hours,
                          weekends)
            b.enforce = None
    changes = change_literals(cells, keep) if keep is not None else []
    if gap_weight is not None:
        model.minimize(sum(gap_weight * short for _, _, short in gaps))
    elif keep is not None and changes:
        model.minimize(b.objective() + keep.weight * sum(changes))
    elif items is None:
        model.minimize(b.objective())
    return Built(model, cells, b, keep, changes, gaps, items)


def _cover_switch(ws: Workspace, cells: Cells, items: Items) -> CoverSwitch:
    def switch(k: int, d: int) -> Lit:
        return items.switch(HardItem("cover", "cover", None, (cells.date(d),), cover=k))
    return switch


def _add_rule(b: Build, eff: EffectiveRule, clock: ShiftClock, runs: OffRuns, hours: Hours,
              weekends: WeekendsWorked) -> None:
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
