"""Relaxation-induced neighbourhoods: free where the master LP and the roster disagree.

RINS (Danna, Rothberg & Le Pape 2005, "Exploring relaxation induced neighborhoods
to improve MIP solutions", Math. Programming 102) fixes every variable on which the
incumbent and the LP relaxation agree and solves the rest as a smaller problem. Here
the relaxation is the decomposition's master LP, far tighter than the compact
model's: a cell (person, day) agrees when the master's columns of that person put
the incumbent's code there with total weight 1. The rest is solved by CP-SAT on the
full model with the agreed cells fixed, started from the incumbent.

Where the LP is far from integral (column generation stopped early) the disagreement
is most of the roster, too much for one sub-solve; so a neighbourhood takes people
in random order, those whose LP rows are fractional first, with their disagreeing
cells, up to a cap on the cells freed; where LP and roster agree almost everywhere,
whole rows of people are freed as well, as in large neighbourhood search (Shaw 1998,
"Using constraint programming and local search methods to solve vehicle routing
problems", CP-98, LNCS 1520). The cap grows when a neighbourhood is searched to the
end without a gain and shrinks when one runs out of time (a common practice of LNS;
the factor 1.5 and the first cap are ours, not from a source).
"""

from __future__ import annotations

import random
import threading
import time
from collections.abc import Callable
from dataclasses import dataclass

from ortools.sat.python import cp_model

from rostertui.core.solver.decompose import Decomposition
from rostertui.core.solver.fixing import Values, fixed_copy, hint_solution, rows_of
from rostertui.core.solver.model import BuiltModel
from rostertui.core.solver.primal.watch import stop_on_cancel

AGREE = 1.0 - 1e-6  # an LP weight this close to 1 counts as integral
ROUND_CAP = 10.0  # seconds one neighbourhood may take
ROUND_MIN = 0.5  # no round is started with less time than this
START_SHARE = 0.2  # the first neighbourhood frees at most this share of the cells


@dataclass
class Incumbent:
    values: Values
    objective: int
    solution: list[int]  # every variable of the built model, for the hint


def marginals(dw: Decomposition) -> dict[tuple[int, int], dict[str, float]]:
    """Per (person, day), the master LP's weight of each code worked there."""
    found: dict[tuple[int, int], dict[str, float]] = {}
    for column, weight in zip(dw.columns, dw.weights, strict=False):
        if weight <= 1e-9:
            continue
        for d, code in enumerate(column.codes):
            cell = found.setdefault((column.person, d), {})
            cell[code] = cell.get(code, 0.0) + weight
    return found


def disagreement(built: BuiltModel, values: Values,
                 lp: dict[tuple[int, int], dict[str, float]]) -> set[tuple[int, int]]:
    """The cells where the incumbent's code does not have LP weight 1."""
    rows = rows_of(built, values)
    return {(p, d) for p, row in rows.items() for d, code in enumerate(row)
            if lp.get((p, d), {}).get(code, 0.0) < AGREE}


def fractional_people(dw: Decomposition) -> list[int]:
    """People none of whose columns has LP weight 1."""
    whole = {c.person for c, w in zip(dw.columns, dw.weights, strict=False) if w >= AGREE}
    return sorted({c.person for c in dw.columns} - whole)


class _Better(cp_model.CpSolverSolutionCallback):
    def __init__(self, built: BuiltModel, below: int, on_better: Callable[[Values, int], None],
                 stop: Callable[[int], bool]):
        super().__init__()
        self.built, self.below, self.on_better, self.stop = built, below, on_better, stop

    def on_solution_callback(self) -> None:
        objective = round(self.objective_value)
        if objective < self.below:
            self.below = objective
            values = {key: self.value(var) for key, var in self.built.cells.x.items()}
            self.on_better(values, objective)
        if self.stop(objective):
            self.stop_search()


def search(built: BuiltModel, dw: Decomposition, start: Incumbent, deadline: float, workers: int,
           seed: int, on_better: Callable[[Values, int], None],
           stop: Callable[[int], bool], cancel: threading.Event | None = None) -> Incumbent:
    """Neighbourhoods around the incumbent until `deadline` (time.monotonic()) or
    `stop(objective)` holds (cancel, or a roster that meets the bound). Every better
    roster goes to `on_better`; the best is returned."""
    lp = marginals(dw)
    rng = random.Random(seed)
    people = len(built.cells.people)
    fractional = fractional_people(dw)
    days = built.cells.n
    cells = people * days
    wide = START_SHARE  # the share of all cells a neighbourhood may free, adapted
    best = start
    round_no = 0
    while deadline - time.monotonic() >= ROUND_MIN and not stop(best.objective):
        round_no += 1
        free = _neighbourhood(rng, disagreement(built, best.values, lp), fractional,
                              people, days, max(days, int(wide * cells)))
        sub = fixed_copy(built, best.values, free)
        hint_solution(sub, best.solution)
        solver = cp_model.CpSolver()
        solver.parameters.max_time_in_seconds = min(ROUND_CAP, deadline - time.monotonic())
        solver.parameters.num_workers = max(1, workers)
        solver.parameters.random_seed = seed + round_no
        watch = _Better(built, best.objective, on_better, stop)
        with stop_on_cancel(solver, cancel):
            status = solver.solve(sub, watch)
        if watch.below < best.objective and status in (cp_model.OPTIMAL, cp_model.FEASIBLE):
            values = {key: solver.value(var) for key, var in built.cells.x.items()}
            best = Incumbent(values, round(solver.objective_value),
                             list(solver.response_proto.solution))
        elif status == cp_model.OPTIMAL:
            wide = min(1.0, wide * 1.5)  # searched to the end, no gain: look wider
        else:
            wide = max(1.0 / cells, wide / 1.5)  # out of time: look narrower
    return best


def _neighbourhood(rng: random.Random, disagree: set[tuple[int, int]], fractional: list[int],
                   people: int, days: int, most: int) -> set[tuple[int, int]]:
    """At most about `most` cells: people taken in random order, those the LP leaves
    fractional first, each with the cells where LP and roster disagree; when that is
    all agreed, whole rows of people instead."""
    by_person: dict[int, list[tuple[int, int]]] = {}
    for cell in disagree:
        by_person.setdefault(cell[0], []).append(cell)
    order = rng.sample(fractional, len(fractional))
    rest = [p for p in range(people) if p not in set(fractional)]
    order += rng.sample(rest, len(rest))
    free: set[tuple[int, int]] = set()
    for p in order:
        if len(free) >= most:
            break
        free.update(by_person.get(p, ()))
    for p in order:  # too little disagreement: free whole rows as well
        if len(free) >= most:
            break
        free.update((p, d) for d in range(days))
    return free
