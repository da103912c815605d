"""A small set of hard items that cannot all hold together.

Every hard item has its own switch (solver/items.py). CP-SAT, asked to keep all
switches on as assumptions, proves the model infeasible and names a sufficient set
of them; that set is then shrunk by deletion: drop one item, solve with only the
rest on, and keep it dropped while the model stays infeasible. When the budget
runs out before every item was tried, the set still conflicts but may not be the
smallest (`minimal` says which). A set `cancel` event stops the search at once
(`stop_on_cancel`) and between deletion steps: the answer is then "unknown", or
the set found so far, not minimal.
"""

from __future__ import annotations

import threading
import time
from collections.abc import Callable
from dataclasses import dataclass

from ortools.sat.python import cp_model

from rostertui.core.models.workspace import Workspace
from rostertui.core.solver.items import HardItem, Items
from rostertui.core.solver.model import build_model
from rostertui.core.solver.primal.watch import stop_on_cancel


@dataclass
class Conflict:
    status: str  # "feasible" | "infeasible" | "unknown"
    items: list[HardItem]
    minimal: bool = False


Progress = Callable[[str], None]


def find_conflict(ws: Workspace, budget: float = 30.0, workers: int = 0,
                  on_progress: Progress | None = None,
                  cancel: threading.Event | None = None) -> Conflict:
    deadline = time.monotonic() + budget
    built = build_model(ws, explain=True)
    items = built.items
    assert items is not None
    model = built.model
    model.add_assumptions(list(items.switches.values()))
    solver = cp_model.CpSolver()
    solver.parameters.num_workers = 1  # assumptions need a single worker
    solver.parameters.max_time_in_seconds = max(1.0, budget / 2)
    with stop_on_cancel(solver, cancel):
        code = solver.solve(model)
    if code in (cp_model.OPTIMAL, cp_model.FEASIBLE):
        return Conflict("feasible", [])
    if code != cp_model.INFEASIBLE:
        return Conflict("unknown", [])
    index = items.by_index()
    core = [index[i] for i in solver.sufficient_assumptions_for_infeasibility() if i in index]
    if not core:
        model.clear_assumptions()
        alone = _infeasible(model, items, [], max(0.5, deadline - time.monotonic()), workers,
                            cancel)
        if alone:  # infeasible without any item: the background (skills, history) alone
            return Conflict("infeasible", [], minimal=True)
        core = list(items.switches)  # no core given: shrink from every item
    if on_progress:
        on_progress(f"{len(core)} items conflict; shrinking the set")
    kept, minimal = _shrink(built.model, items, core, deadline, workers, on_progress, cancel)
    return Conflict("infeasible", kept, minimal)


def _shrink(model: cp_model.CpModel, items: Items, core: list[HardItem], deadline: float,
            workers: int, on_progress: Progress | None,
            cancel: threading.Event | None = None) -> tuple[list[HardItem], bool]:
    """Deletion: drop each item in turn while the rest still conflict."""
    kept = list(core)
    model.clear_assumptions()
    for item in list(core):
        left = deadline - time.monotonic()
        if left <= 0.05 or (cancel is not None and cancel.is_set()):
            return kept, False
        trial = [k for k in kept if k != item]
        verdict = _infeasible(model, items, trial, left, workers, cancel)
        if verdict is None:
            return kept, False
        if verdict:
            kept = trial
            if on_progress:
                on_progress(f"{len(kept)} items still conflict")
    return kept, True


def _infeasible(model: cp_model.CpModel, items: Items, on: list[HardItem], limit: float,
                workers: int, cancel: threading.Event | None = None) -> bool | None:
    """True if the items `on` (the others off) cannot all hold; None when unknown."""
    trial = model.clone()
    chosen = set(on)
    for item, var in items.switches.items():
        trial.add(trial.get_bool_var_from_proto_index(var.index) == int(item in chosen))
    solver = cp_model.CpSolver()
    solver.parameters.num_workers = workers or 2
    solver.parameters.max_time_in_seconds = limit
    solver.parameters.stop_after_first_solution = True
    with stop_on_cancel(solver, cancel):
        code = solver.solve(trial)
    if code == cp_model.INFEASIBLE:
        return True
    if code in (cp_model.OPTIMAL, cp_model.FEASIBLE):
        return False
    return None
