"""A first roster, when the workspace has none: CP-SAT stopped at its first solution.

`solve` asks for one before column generation (run.py), so that a roster shows
within seconds however long the bound takes, and so that RINS has a start where
column generation has not converged (the bundled demos at 60 s: each person's
pricing model holds rest, weekly rest and weekend rules over 28 days) and the pool
of rows cannot be mixed into a roster: before, the heuristics' share of the time
was lost there. With a decomposition the search is hinted with each person's
heaviest row of the master. The roster is scored exactly (fixing.evaluate).
"""

from __future__ import annotations

import threading
import time

from ortools.sat.python import cp_model

from rostertui.core.solver.decompose import Decomposition
from rostertui.core.solver.fixing import evaluate
from rostertui.core.solver.model import Built
from rostertui.core.solver.primal.rins import Incumbent
from rostertui.core.solver.primal.watch import stop_on_cancel

EVALUATE_CAP = 30.0  # seconds for the exact objective of the roster found


def first_roster(built: Built, dw: Decomposition | None, deadline: float, workers: int,
                 seed: int, cancel: threading.Event | None = None) -> Incumbent | None:
    """CP-SAT's first roster keeping every hard rule, by `deadline` (time.monotonic()),
    with its exact objective; None when none is found in time (or none exists)."""
    model = built.model.clone()
    model.clear_hints()
    heaviest = dw.heaviest() if dw is not None else {}
    if heaviest:
        hint = model.proto.solution_hint
        for (p, d, code), var in built.cells.x.items():
            row = heaviest.get(p)
            hint.vars.append(var.index)
            hint.values.append(int(row is not None and d < len(row) and row[d] == code))
    solver = cp_model.CpSolver()
    solver.parameters.max_time_in_seconds = max(0.05, deadline - time.monotonic())
    solver.parameters.num_workers = max(1, workers)
    solver.parameters.random_seed = seed
    solver.parameters.stop_after_first_solution = True
    with stop_on_cancel(solver, cancel):
        status = solver.solve(model)
    if status not in (cp_model.OPTIMAL, cp_model.FEASIBLE):
        return None
    values = {key: solver.value(var) for key, var in built.cells.x.items()}
    exact = evaluate(built, values, EVALUATE_CAP)
    if exact is None:
        return None
    return Incumbent(values, exact[0], exact[1])
