"""The search's recorder: every better roster, from CP-SAT's callback or offered by a
heuristic, with the bounds known so far, reported as progress; and the watcher that
stops the search on cancel between solutions."""

from __future__ import annotations

import threading
import time

from ortools.sat.python import cp_model

from rostertui.core.solver.fixing import Values
from rostertui.core.solver.model import BuiltModel
from rostertui.core.solver.outcome import ProgressCallback, SolveProgress

SEARCH = "CP-SAT search"  # the method name of rosters the main search finds

# How often the cancel watcher looks between solutions: a cancel stops the search
# within about this long, well within the second a user waits for after Esc.
CANCEL_POLL = 0.1


class Recorder(cp_model.CpSolverSolutionCallback):
    """Records each improving roster; prints nothing; stops the search on cancel."""

    def __init__(self, built: BuiltModel, started: float, on_progress: ProgressCallback | None,
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
        self.dw_bound: int | None = None  # the decomposition's
        self.cp_bound = 0
        self.stage = "search"
        self.lock = threading.Lock()
        self.best_method: str | None = None
        self.improvements: list[tuple[float, int, str]] = []

    def on_solution_callback(self) -> None:
        elapsed = time.monotonic() - self.started
        objective = round(self.objective_value)
        if self.best_objective is None or objective <= self.best_objective:
            if self.best_objective is None or objective < self.best_objective:
                self._improved(elapsed, objective, SEARCH)
            self.best = {key: self.value(var) for key, var in self.built.cells.x.items()}
            self.best_objective = objective
            self.best_changes = sum(self.boolean_value(lit) for lit in self.built.changes)
            self.best_seconds = elapsed
            if self.first_seconds is None:
                self.first_seconds = elapsed
        self.report(elapsed, round(self.best_objective_bound))
        if self.cancel is not None and self.cancel.is_set():
            self.stop_search()
        if self.proven is not None and objective <= self.proven:
            self.stop_search()  # proven optimal by the LP or the decomposition bound

    def _improved(self, elapsed: float, objective: int, method: str) -> None:
        self.best_method = method
        self.improvements.append((round(elapsed, 3), objective, method))

    def offer(self, values: Values, objective: int, method: str) -> None:
        """A roster found outside the CP-SAT search (warm start, primal heuristics),
        its exact objective or an upper end of it; kept when it is better."""
        elapsed = time.monotonic() - self.started
        with self.lock:
            if self.best_objective is not None and objective >= self.best_objective:
                return
            self._improved(elapsed, objective, method)
            self.best, self.best_objective, self.best_seconds = values, objective, elapsed
            if self.first_seconds is None:
                self.first_seconds = elapsed
        self.report(elapsed)

    def should_stop(self, objective: int) -> bool:
        """Cancelled, or `objective` meets the proven bound."""
        return (self.cancel is not None and self.cancel.is_set()) or (
            self.proven is not None and objective <= self.proven)

    @property
    def proven(self) -> int | None:
        """The best bound proven before the search (LP, decomposition)."""
        found = [b for b in (self.lp_bound, self.dw_bound) if b is not None]
        return max(found) if found else None

    def report(self, elapsed: float, bound: int | None = None) -> None:
        with self.lock:
            if bound is not None:
                self.cp_bound = max(self.cp_bound, bound)
            best = max(self.cp_bound, self.proven or 0)
            penalty = self.best_objective
            changes = None
            if self.built.keep is not None:  # show the penalty alone, not the change cost
                changes = self.best_changes
                cost = self.built.change_cost(changes)
                best = max(0, best - cost) if penalty is not None else 0
                penalty = penalty - cost if penalty is not None else None
            progress = SolveProgress(elapsed, penalty, best, changes, self.stage,
                                     self.best_method)
            self.history.append(progress)
        if self.on_progress is not None:
            self.on_progress(progress)


def watch_cancel(solver: cp_model.CpSolver, cancel: threading.Event | None,
                  recorder: Recorder) -> threading.Event | None:
    """Stop the search as soon as `cancel` is set and there is a roster to keep, even
    between solutions. Cancelled before the first roster (say, while the bound was
    being proved), the search goes on to its first roster and stops there (the
    recorder does that), within the time limit."""
    if cancel is None:
        return None
    done = threading.Event()

    def watch() -> None:
        while not done.is_set():
            if cancel.wait(CANCEL_POLL):
                if recorder.best is not None:
                    solver.stop_search()
                    return
                done.wait(CANCEL_POLL)

    threading.Thread(target=watch, daemon=True, name="rostertui-cancel").start()
    return done
