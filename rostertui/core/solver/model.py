"""Build the whole CP-SAT model of a workspace: cells, every rule family, one objective."""

from __future__ import annotations

import dataclasses
import importlib
from collections.abc import Callable
from dataclasses import dataclass, field

from ortools.sat.python import cp_model

from rostertui.core.models.rules import RULE_FAMILY, RULE_KINDS, function_name
from rostertui.core.models.workspace import EffectiveRule, Workspace
from rostertui.core.solver.cells import Cells
from rostertui.core.solver.cover import CoverSwitch, add_cover
from rostertui.core.solver.items import HardItem, Items, add_leave_and_locks
from rostertui.core.solver.keep import Keep, change_literals
from rostertui.core.solver.logic import Lit
from rostertui.core.solver.requests import add_requests
from rostertui.core.solver.scaled_hours import Hours
from rostertui.core.solver.shared import Shared
from rostertui.core.solver.terms import ModelBuilder
from rostertui.core.solver.weekends import WeekendsWorked

Encoder = Callable[[ModelBuilder, EffectiveRule, Shared], None]


def encoder(kind: str) -> Encoder:
    """A kind's encoder: the function named like it in solver/<its family>.py."""
    module = importlib.import_module(f"rostertui.core.solver.{RULE_FAMILY[kind]}")
    found: Encoder | None = getattr(module, function_name(kind), None)
    if found is None:
        raise LookupError(f"no {function_name(kind)}() in {module.__name__} for {kind!r}")
    return found


# One encoder per rule kind of rules.md, "Kinds", in the union's order.
ENCODERS: dict[str, Encoder] = {kind: encoder(kind) for kind in RULE_KINDS}


@dataclass
class BuiltModel:
    model: cp_model.CpModel
    cells: Cells
    builder: ModelBuilder
    keep: Keep | None = None
    changes: list[Lit] = field(default_factory=list)  # repair: one per changed cell
    gaps: list[tuple[int, int, cp_model.IntVar | int]] = field(default_factory=list)
    items: Items | None = None  # explain: the switch of every hard item
    hours: Hours | None = None  # hour expressions per person (balance, the decomposition)
    weekends: WeekendsWorked | None = None  # weekends worked per person

    def change_cost(self, changes: int) -> int:
        return self.keep.weight * changes if self.keep is not None else 0


def build_model(ws: Workspace, keep: Keep | None = None, explain: bool = False,
                gap_weight: int | None = None) -> BuiltModel:
    """The model of `ws`.

    `keep` (repair): a cost per cell changed from a reference roster, and the first
    `keep.frozen` days fixed. `explain`: every hard item gets its own switch
    (`BuiltModel.items`); soft rules and the objective are left out. `gap_weight`: cover
    minimums become penalties of that weight per person short (`BuiltModel.gaps`).
    """
    model = cp_model.CpModel()
    cells = Cells(ws, model, frozen=keep.frozen if keep is not None else 0, relaxed=explain)
    items = Items(model) if explain else None
    b = ModelBuilder(model, cells)
    if cells.lock_conflicts:  # a locked shift the cell cannot hold: no roster keeps it
        model.add_bool_or([])
    shared = Shared.of(b)
    cover_switch = None
    if items is not None:
        add_leave_and_locks(b, items)
        cover_switch = _cover_switch(ws, cells, items)
    gaps = add_cover(b, cover_switch, gap_weight)
    add_requests(b)
    for eff in ws.rules:
        encode = ENCODERS[eff.rule.kind]
        if items is None:
            encode(b, eff, shared)
        elif eff.rule.weight is None:  # explain: one switch per rule and person
            for pid in eff.people:
                b.enforce = items.switch(HardItem("rule", eff.rule.id, pid))
                encode(b, dataclasses.replace(eff, people=(pid,)), shared)
            b.enforce = None
    changes = change_literals(cells, keep) if keep is not None else []
    if gap_weight is not None:
        model.minimize(sum(gap_weight * short for _, _, short in gaps))
    elif keep is not None and changes:
        model.minimize(b.objective() + keep.weight * sum(changes))
    elif items is None:
        model.minimize(b.objective())
    return BuiltModel(model, cells, b, keep, changes, gaps, items, shared.hours, shared.weekends)


def _cover_switch(ws: Workspace, cells: Cells, items: Items) -> CoverSwitch:
    def switch(k: int, d: int) -> Lit:
        return items.switch(HardItem("cover", "cover", None, (cells.date(d),), cover=k))
    return switch


# -- how long build_model takes, told before building -----------------------------------
# Seconds per unit of size, measured on the development machine (x86_64, 2 cores,
# Python 3.11, OR-Tools 9.15) by `bench/bench_limit.py --calibrate`. First each rule
# kind alone on 400 people x 28 days (the clinic's rules, tests/tui/bigws.py, and
# bench/generate.py's), less the build without rules: min-rest and weekly-rest cost
# 35-48 us per person and day, the stretch rules 21-35, max-consecutive-shift 11-22,
# every other kind 2-17. Their sum overcounts what rules share (off runs, hours,
# weekends), so the rates below are those relative costs scaled (x 0.76) and the
# base rate (per possible person-day-shift cell: the cells, cover and requests) fitted
# by least squares on 18 units from 18 to 2014 people (the clinic's rules, generated
# units, Curtois-Qu 3-20). On units that build in more than 0.5 s the estimate fell
# within -25 % to +60 % of the measured build over two runs (the build itself varies
# by 20 % between runs on this shared machine; 2014 people x 28 days: 11.1 s
# estimated, 9.9-12.3 s measured); the tiny ones (under 0.2 s) come out up to twice.
BUILD_PER_CELL = 4.5e-6
BUILD_PER_RULE_DAY: dict[str, float] = {  # per person in scope and day not on leave
    "min-rest": 34e-6,
    "weekly-rest": 34e-6,
    "max-consecutive-days": 27e-6,
    "min-consecutive-days": 27e-6,
    "min-consecutive-off": 27e-6,
    "max-consecutive-shift": 15e-6,
}
BUILD_PER_OTHER_RULE_DAY = 9e-6  # every other kind: counts, hours, weekends, sequences


@dataclass(frozen=True)
class BuildEstimate:
    """The size of a workspace's model and about how long building it takes."""

    people: int
    days: int
    codes: int  # shift types
    cells: int  # (person, day, shift) cells that may hold the shift
    rule_people: int  # effective rule x person pairs
    seconds: float


def estimate_build(ws: Workspace) -> BuildEstimate:
    """About how long `build_model(ws)` takes on the development machine, from the
    model's size alone (nothing is built: this takes milliseconds)."""
    n = ws.unit.days
    leave: dict[str, set[int]] = {}
    for lv in ws.requests.leave:
        for d in lv.dates():
            i = (d - ws.unit.start).days
            if 0 <= i < n:
                leave.setdefault(lv.person, set()).add(i)
    days = {p.id: n - len(leave.get(p.id, ())) for p in ws.staff.person}
    cells = 0
    for p in ws.staff.person:
        skills = set(p.skills)
        cells += days[p.id] * sum(1 for s in ws.shifts.shift if set(s.requires) <= skills)
    seconds = BUILD_PER_CELL * cells
    pairs = 0
    for eff in ws.rules:
        rate = BUILD_PER_RULE_DAY.get(eff.rule.kind, BUILD_PER_OTHER_RULE_DAY)
        seconds += rate * sum(days.get(pid, 0) for pid in eff.people)
        pairs += len(eff.people)
    return BuildEstimate(len(ws.staff.person), n, len(ws.shifts.shift), cells, pairs, seconds)
