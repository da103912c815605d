"""A first roster, when the workspace has none: CP-SAT stopped at its first solution.

`solve` asks for one before the bounds (run.py), so that a roster shows within
seconds however long they take. It is kept as the best so far, but neither the
search nor RINS starts from it: both did worse from it than from their own start
(BENCHMARKS.md, "The first roster ..."). The roster is scored exactly
(fixing.evaluate).
"""

from __future__ import annotations

import threading
import time

from ortools.sat.python import cp_model

from rostertui.core.solver.fixing import evaluate
from rostertui.core.solver.model import BuiltModel
from rostertui.core.solver.primal.portfolio import EVALUATE_CAP
from rostertui.core.solver.primal.rins import Incumbent
from rostertui.core.solver.primal.watch import stop_on_cancel


def first_roster(built: BuiltModel, deadline: float, workers: int, seed: int,
                 cancel: threading.Event | None = None) -> Incumbent | None:
    """CP-SAT's first roster keeping every hard rule, by `deadline` (time.monotonic()),
    with its exact objective; None when none is found in time (or none exists)."""
    model = built.model.clone()
    model.clear_hints()
    solver = cp_model.CpSolver()
    solver.parameters.max_time_in_seconds = max(0.05, deadline - time.monotonic())
    solver.parameters.num_workers = max(1, workers)
    solver.parameters.random_seed = seed
    solver.parameters.stop_after_first_solution = True
    # One worker alone searches depth-first with the LP, slow to a first solution;
    # interleaved, it also runs the first-solution heuristics (feasibility jump) that
    # two or more workers run beside it. On the clinic demo (seed 0): 0.47 s against
    # 6.8 s; Curtois-Qu 12: 2.0 s against none in 20 s (one run each).
    solver.parameters.interleave_search = workers <= 1
    with stop_on_cancel(solver, cancel):
        status = solver.solve(model)
    if status not in (cp_model.OPTIMAL, cp_model.FEASIBLE):
        return None
    values = {key: solver.value(var) for key, var in built.cells.x.items()}
    exact = evaluate(built, values, EVALUATE_CAP)
    if exact is None:
        return None
    return Incumbent(values, exact[0], exact[1])
