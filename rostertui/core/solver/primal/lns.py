"""Large neighbourhood search around the best roster: free some cells, re-solve the rest.

Large neighbourhood search (Shaw 1998, "Using constraint programming and local search
methods to solve vehicle routing problems", CP-98, LNCS 1520; Pisinger & Ropke 2010,
"Large neighborhood search", Handbook of Metaheuristics, 2nd ed.) keeps the incumbent
fixed but for a neighbourhood, which CP-SAT re-solves on the full model, started from
the incumbent; a better roster becomes the incumbent. The loop here is shared: RINS
(rins.py) chooses its neighbourhoods from the master LP, `blind` below from the
roster's own structure, for when there is no converged master to read:

- **people**: whole rows of a few people taken at random (their shifts change hands
  among them: rest, stretches and weekends of those people re-planned together);
- **days**: every person over a window of consecutive days (cover re-planned there,
  each person's rules held by the fixed days around it).

The size adapts: the share of cells freed grows by 1.5 when a neighbourhood is
searched to the end without a gain and shrinks by 1.5 when one runs out of time (a
common practice of LNS; the factor and the first share are ours, not from a source).
"""

from __future__ import annotations

import random
import threading
import time
from collections.abc import Callable
from dataclasses import dataclass

from ortools.sat.python import cp_model

from rostertui.core.solver.fixing import Values, fixed_copy, hint_solution
from rostertui.core.solver.model import BuiltModel
from rostertui.core.solver.primal.watch import stop_on_cancel

ROUND_CAP = 10.0  # seconds one neighbourhood may take (RINS)
# blind neighbourhoods: seconds per person of the unit, within these ends. Measured on
# the clinic demo (14 people) and Curtois-Qu 12 (60), 30-40 s from CP-SAT's first
# roster, one run each: the clinic 627 with 0.3 s rounds, 706-727 with 0.15, 0.5 and
# 1.0 s; instance 12 6019 with 1.0 s rounds, 7140 with 0.3 s. The rule between the two
# is ours.
BLIND_PER_PERSON, BLIND_LEAST, BLIND_MOST = 0.02, 0.3, 2.0
ROUND_MIN = 0.5  # no round is started with less time than this
START_SHARE = 0.2  # the first neighbourhood frees at most this share of the cells

Cell = tuple[int, int]  # (person index, day index)


@dataclass
class Incumbent:
    values: Values
    objective: int
    solution: list[int]  # every variable of the built model, for the hint


# (random source, the incumbent, the round's number, at most this many cells) -> cells
Chooser = Callable[[random.Random, Incumbent, int, int], set[Cell]]


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


def search(built: BuiltModel, start: Incumbent, choose: Chooser, deadline: float, workers: int,
           seed: int, on_better: Callable[[Values, int], None],
           stop: Callable[[int], bool], cancel: threading.Event | None = None,
           round_cap: float = ROUND_CAP) -> Incumbent:
    """Neighbourhoods chosen by `choose` around the incumbent until `deadline`
    (time.monotonic()) or `stop(objective)` holds (cancel, or a roster that meets the
    bound), each searched for at most `round_cap` seconds. Every better roster goes to
    `on_better`; the best is returned."""
    rng = random.Random(seed)
    cells = len(built.cells.people) * built.cells.n
    wide = START_SHARE  # the share of all cells a neighbourhood may free, adapted
    best = start
    round_no = 0
    least = min(ROUND_MIN, round_cap)
    while deadline - time.monotonic() >= least and not stop(best.objective):
        if cancel is not None and cancel.is_set():
            break
        round_no += 1
        free = choose(rng, best, round_no, max(built.cells.n, int(wide * cells)))
        sub = fixed_copy(built, best.values, free)
        hint_solution(sub, best.solution)
        solver = cp_model.CpSolver()
        solver.parameters.max_time_in_seconds = min(round_cap, deadline - time.monotonic())
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


def blind_round(built: BuiltModel) -> float:
    """Seconds for one blind neighbourhood (BLIND_PER_PERSON)."""
    return min(BLIND_MOST, max(BLIND_LEAST, BLIND_PER_PERSON * len(built.cells.people)))


def people_rows(rng: random.Random, order: list[int], days: int, most: int) -> set[Cell]:
    """Whole rows of the people in `order` until about `most` cells (at least one row)."""
    free: set[Cell] = set()
    for p in order:
        if free and len(free) + days > most:
            break
        free.update((p, d) for d in range(days))
    return free


def day_window(rng: random.Random, people: int, days: int, most: int) -> set[Cell]:
    """Every person over a window of consecutive days holding about `most` cells; when
    even one day of everyone is more than that, a random part of the people on one day."""
    width = max(1, min(days, most // max(1, people)))
    first = rng.randrange(days - width + 1)
    who = range(people) if width > 1 or people <= most else rng.sample(range(people), most)
    return {(p, d) for p in who for d in range(first, first + width)}


def blind(built: BuiltModel) -> Chooser:
    """Neighbourhoods from the roster's structure alone: people's rows and day windows
    in turn (module docstring)."""
    people, days = len(built.cells.people), built.cells.n

    def choose(rng: random.Random, best: Incumbent, round_no: int, most: int) -> set[Cell]:
        if round_no % 2:
            return people_rows(rng, rng.sample(range(people), people), days, most)
        return day_window(rng, people, days, most)

    return choose
