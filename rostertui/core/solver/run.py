"""Run the solver: time limit, workers, seed, warm start, live progress, cancel.

The roster CP-SAT returns is then judged by the independent checker (the
referee): its penalty must equal the solver's objective and it must find no
hard violation. A mismatch raises RefereeError: a bug, never rounded away.
"""

from __future__ import annotations

import os
import threading
import time
from collections.abc import Callable
from dataclasses import dataclass, field
from datetime import date, timedelta

from ortools.sat.python import cp_model

from rostertui.core.check import CheckResult, check_roster
from rostertui.core.errors import RosterError
from rostertui.core.models.common import OFF
from rostertui.core.models.roster import Roster, SolveRecord
from rostertui.core.models.workspace import Workspace
from rostertui.core.solver.keep import Keep
from rostertui.core.solver.lp_bound import Relaxation
from rostertui.core.solver.model import Built, build_model


class RefereeError(RosterError):
    """The checker disagrees with the solver about a roster: a bug in one of them."""


@dataclass(frozen=True)
class SolveOptions:
    time_limit: float = 60.0
    workers: int = 0  # 0 = every core
    seed: int = 0
    warm_start: bool = True  # hint the search with the workspace's current roster
    lp_bound: bool = True  # a bound from the LP relaxation (GLOP), solved before the search
    lp_share: float = 0.2  # at most this share of the time limit for the LP
    log: bool = False


@dataclass(frozen=True)
class SolveProgress:
    elapsed: float
    penalty: int | None  # best roster found so far (None before the first)
    bound: int  # proven lower bound on the penalty
    changes: int | None = None  # repair: cells the best roster changes


@dataclass
class SolveOutcome:
    status: str  # optimal | feasible | infeasible | unknown
    roster: Roster | None
    objective: int | None
    bound: int | None
    seconds: float
    seed: int
    check: CheckResult | None = None
    build_seconds: float = 0.0
    first_seconds: float | None = None  # time to the first roster
    best_seconds: float | None = None  # time to the best roster
    history: list[SolveProgress] = field(default_factory=list)
    changes: int | None = None  # repair: cells changed from the reference roster

    @property
    def gap(self) -> float | None:
        if self.objective is None or self.bound is None:
            return None
        if self.objective == 0:
            return 0.0
        return max(0.0, (self.objective - self.bound) / abs(self.objective))


ProgressCallback = Callable[[SolveProgress], None]


class _Recorder(cp_model.CpSolverSolutionCallback):
    """Records each improving roster; prints nothing; stops the search on cancel."""

    def __init__(self, built: Built, started: float, on_progress: ProgressCallback | None,
                 cancel: threading.Event | None):
        super().__init__()
        self.built = built
        self.started = started
        self.on_progress = on_progress
        self.cancel = cancel
        self.best: dict[tuple[int, int, str], int] | None = None
        self.best_objective: int | None = None  # penalty + change cost (repair)
        self.best_changes = 0
        self.first_seconds: float | None = None
        self.best_seconds: float | None = None
        self.history: list[SolveProgress] = []
        self.lp_bound: int | None = None
        self.cp_bound = 0
        self.lock = threading.Lock()

    def on_solution_callback(self) -> None:
        elapsed = time.monotonic() - self.started
        objective = round(self.objective_value)
        if self.best_objective is None or objective <= self.best_objective:
            self.best = {key: self.value(var) for key, var in self.built.cells.x.items()}
            self.best_objective = objective
            self.best_changes = sum(self.boolean_value(lit) for lit in self.built.changes)
            self.best_seconds = elapsed
            if self.first_seconds is None:
                self.first_seconds = elapsed
        self.report(elapsed, round(self.best_objective_bound))
        if self.cancel is not None and self.cancel.is_set():
            self.stop_search()
        if self.lp_bound is not None and objective <= self.lp_bound:
            self.stop_search()  # proven optimal by the LP bound

    def report(self, elapsed: float, bound: int | None = None) -> None:
        with self.lock:
            if bound is not None:
                self.cp_bound = max(self.cp_bound, bound)
            best = max(self.cp_bound, self.lp_bound or 0)
            penalty = self.best_objective
            changes = None
            if self.built.keep is not None:  # show the penalty alone, not the change cost
                changes = self.best_changes
                cost = self.built.change_cost(changes)
                best = max(0, best - cost) if penalty is not None else 0
                penalty = penalty - cost if penalty is not None else None
            progress = SolveProgress(elapsed, penalty, best, changes)
            self.history.append(progress)
        if self.on_progress is not None:
            self.on_progress(progress)


def roster_from(built: Built, values: dict[tuple[int, int, str], int]) -> Roster:
    cells = built.cells
    rows = {pid: [OFF] * cells.n for pid in cells.people}
    for (p, d, code), v in values.items():
        if v:
            rows[cells.people[p]][d] = code
    locks = list(cells.ws.roster.lock) if cells.ws.roster is not None else []
    return Roster(start=cells.start, days=cells.n, rows=rows, lock=locks)


def _hint(built: Built) -> None:
    """Warm start from the workspace's current roster.

    The roster's cells alone leave CP-SAT to complete every auxiliary variable, which
    it often fails to do in time; so the roster is first fixed and solved (a matter
    of propagation), and the complete assignment becomes the hint. A roster that
    breaks a hard rule cannot be completed: its cells are hinted as they are.
    """
    roster = built.cells.ws.roster
    if roster is None:
        return
    cells = built.cells
    values: dict[tuple[int, int, str], int] = {}
    for key in cells.x:
        p, d, code = key
        row = roster.rows.get(cells.people[p])
        values[key] = int(row is not None and d < len(row) and row[d] == code)
    fixed = _fixed(built, values)
    solver = cp_model.CpSolver()
    solver.parameters.num_workers = 1
    solver.parameters.max_time_in_seconds = 10
    if solver.solve(fixed) in (cp_model.OPTIMAL, cp_model.FEASIBLE):
        for i in range(len(built.model.proto.variables)):
            var = built.model.get_int_var_from_proto_index(i)
            built.model.add_hint(var, solver.value(fixed.get_int_var_from_proto_index(i)))
    else:
        for key, var in cells.x.items():
            built.model.add_hint(var, values[key])


def _fixed(built: Built, values: dict[tuple[int, int, str], int]) -> cp_model.CpModel:
    fixed = built.model.clone()
    fixed.clear_hints()
    for key, var in built.cells.x.items():
        fixed.add(fixed.get_bool_var_from_proto_index(var.index) == values[key])
    return fixed


def solve(
    ws: Workspace,
    options: SolveOptions | None = None,
    on_progress: ProgressCallback | None = None,
    cancel: threading.Event | None = None,
    keep: Keep | None = None,
) -> SolveOutcome:
    """Build and solve; the returned roster is refereed by the checker.

    With `keep` (repair), each cell changed from `keep.rows` costs `keep.weight` on
    top of the penalty and the first `keep.frozen` days stay as they are. The
    outcome's objective and bound are still the rules.md penalty: the bound is then
    proven for rosters changing no more cells than the one returned.
    """
    options = options or SolveOptions()
    t0 = time.monotonic()
    built = build_model(ws, keep)
    build_seconds = time.monotonic() - t0
    if options.warm_start:
        _hint(built)
    started = time.monotonic()
    recorder = _Recorder(built, started, on_progress, cancel)
    if options.lp_bound and keep is None:
        recorder.report(0.0)  # something to show while the LP is solved
        # Before the search, not beside it: a GLOP thread next to the CP-SAT workers
        # cost 5-8 % of penalty on Curtois-Qu 10 and 12 at 60 s on 2 cores (seeds 1
        # and 2: 5051/5055 against 4843/4769 without, 4859/4762 with the LP first),
        # while the LP itself takes 0.1-1.5 s there (10.5 s on instance 12).
        recorder.lp_bound = Relaxation(built.model).solve(options.time_limit * options.lp_share)
        recorder.report(time.monotonic() - started)
    solver = cp_model.CpSolver()
    solver.parameters.max_time_in_seconds = max(
        0.01, options.time_limit - (time.monotonic() - started))
    solver.parameters.num_workers = options.workers or os.cpu_count() or 1
    solver.parameters.random_seed = options.seed
    solver.parameters.log_search_progress = options.log
    # A fuller LP in the search. Single 30 s runs on Curtois-Qu 5, 6, 7, 10 looked
    # 1-21 % better with it, but over 3 seeds at 20 s on 5, 9, 10 the medians are
    # within the noise (1249/1246, 481/476, 5277/5167 with/without): no measured gain
    # either way. Kept because BENCHMARKS.md was measured with it.
    solver.parameters.linearization_level = 2
    solver.best_bound_callback = lambda bound: recorder.report(
        time.monotonic() - started, round(bound))
    stop_watch = _watch_cancel(solver, cancel)
    try:
        code = solver.solve(built.model, recorder)
    finally:
        if stop_watch is not None:
            stop_watch.set()
    seconds = time.monotonic() - started
    status = {
        cp_model.OPTIMAL: "optimal",
        cp_model.FEASIBLE: "feasible",
        cp_model.INFEASIBLE: "infeasible",
        cp_model.MODEL_INVALID: "unknown",
    }.get(code, "unknown")
    outcome = SolveOutcome(status, None, None, None, seconds, options.seed,
                           build_seconds=build_seconds, history=recorder.history)
    if recorder.best is None:
        if status in ("optimal", "feasible"):
            status = "unknown"
        outcome.status = status
        return outcome
    roster = roster_from(built, recorder.best)
    total, changes = polish(built, recorder.best)
    bound = max(round(solver.best_objective_bound), recorder.lp_bound or 0)
    if recorder.lp_bound is not None and total < recorder.lp_bound:
        raise RefereeError(f"the LP bound {recorder.lp_bound} lies above the penalty "
                           f"{total} of a roster: the relaxation is wrong")
    if total <= bound:
        status = outcome.status = "optimal"
    cost = built.change_cost(changes)
    objective, bound = total - cost, max(0, bound - cost)
    if keep is not None:
        outcome.changes = changes
    roster.solve = SolveRecord(status=status, objective=objective, bound=min(bound, objective),
                               seconds=round(seconds, 3), seed=options.seed)
    outcome.roster, outcome.objective, outcome.bound = roster, objective, min(bound, objective)
    outcome.first_seconds, outcome.best_seconds = recorder.first_seconds, recorder.best_seconds
    past = ws.unit.start + timedelta(days=keep.frozen) if keep is not None else None
    outcome.check = referee(ws, roster, objective, past_before=past)
    return outcome


def polish(built: Built, values: dict[tuple[int, int, str], int]) -> tuple[int, int]:
    """The exact objective of a found roster under the model: fix every cell, minimise.

    Penalty variables are only bounded from below during the search (logic.py);
    with the roster fixed, the minimum brings each down to its exact value. Returns
    the objective (penalty plus any change cost) and the number of changed cells
    the objective counts (repair; 0 otherwise).
    """
    fixed = _fixed(built, values)
    solver = cp_model.CpSolver()
    solver.parameters.num_workers = 1
    solver.parameters.max_time_in_seconds = 60
    if solver.solve(fixed) != cp_model.OPTIMAL:
        raise RefereeError("the solver could not evaluate its own roster exactly")
    changes = sum(solver.boolean_value(lit) for lit in built.changes)
    return round(solver.objective_value), changes


def referee(ws: Workspace, roster: Roster, objective: int | None,
            past_before: date | None = None) -> CheckResult:
    """The checker's verdict on the solver's roster; disagreement is a bug.

    `past_before` (repair): days before it were fixed, so a cover shortfall there is
    the past's, not the solver's.
    """
    result = check_roster(ws, roster)
    wrong = [v for v in result.violations if v.hard and not (
        past_before is not None and v.kind == "cover" and all(d < past_before for d in v.dates))]
    if wrong:
        first = wrong[0]
        raise RefereeError(
            f"the solver returned a roster with {len(wrong)} hard violation(s), "
            f"e.g. {first.rule}: {first.message}")
    if objective is not None and result.penalty != objective:
        raise RefereeError(
            f"the solver's objective {objective} differs from the checker's penalty "
            f"{result.penalty} for the same roster")
    return result


def _watch_cancel(solver: cp_model.CpSolver, cancel: threading.Event | None
                  ) -> threading.Event | None:
    """Stop the search as soon as `cancel` is set, even between solutions."""
    if cancel is None:
        return None
    done = threading.Event()

    def watch() -> None:
        while not done.is_set():
            if cancel.wait(0.1):
                solver.stop_search()
                return

    threading.Thread(target=watch, daemon=True, name="rostertui-cancel").start()
    return done
