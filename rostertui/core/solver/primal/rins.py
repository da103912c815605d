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
problems", CP-98, LNCS 1520). The loop and its adaptive cap are lns.py's.
"""

from __future__ import annotations

import random
import threading
from collections.abc import Callable

from rostertui.core.solver.decompose import Decomposition
from rostertui.core.solver.fixing import Values, rows_of
from rostertui.core.solver.model import BuiltModel
from rostertui.core.solver.primal import lns
from rostertui.core.solver.primal.lns import Cell, Incumbent

AGREE = 1.0 - 1e-6  # an LP weight this close to 1 counts as integral

__all__ = ["Incumbent", "disagreement", "fractional_people", "marginals", "search"]


def marginals(dw: Decomposition) -> dict[Cell, dict[str, float]]:
    """Per (person, day), the master LP's weight of each code worked there."""
    found: dict[Cell, dict[str, float]] = {}
    for column, weight in zip(dw.columns, dw.weights, strict=False):
        if weight <= 1e-9:
            continue
        for d, code in enumerate(column.codes):
            cell = found.setdefault((column.person, d), {})
            cell[code] = cell.get(code, 0.0) + weight
    return found


def disagreement(built: BuiltModel, values: Values,
                 lp: dict[Cell, dict[str, float]]) -> set[Cell]:
    """The cells where the incumbent's code does not have LP weight 1."""
    rows = rows_of(built, values)
    return {(p, d) for p, row in rows.items() for d, code in enumerate(row)
            if lp.get((p, d), {}).get(code, 0.0) < AGREE}


def fractional_people(dw: Decomposition) -> list[int]:
    """People none of whose columns has LP weight 1."""
    whole = {c.person for c, w in zip(dw.columns, dw.weights, strict=False) if w >= AGREE}
    return sorted({c.person for c in dw.columns} - whole)


def search(built: BuiltModel, dw: Decomposition, start: Incumbent, deadline: float, workers: int,
           seed: int, on_better: Callable[[Values, int], None],
           stop: Callable[[int], bool], cancel: threading.Event | None = None) -> Incumbent:
    """Neighbourhoods where the master LP and the incumbent disagree (lns.search) until
    `deadline` or `stop(objective)`. Every better roster goes to `on_better`; the best
    is returned."""
    lp = marginals(dw)
    fractional = fractional_people(dw)
    people, days = len(built.cells.people), built.cells.n

    def choose(rng: random.Random, best: Incumbent, round_no: int, most: int) -> set[Cell]:
        return _neighbourhood(rng, disagreement(built, best.values, lp), fractional,
                              people, days, most)

    return lns.search(built, start, choose, deadline, workers, seed, on_better, stop, cancel)


def _neighbourhood(rng: random.Random, disagree: set[Cell], fractional: list[int],
                   people: int, days: int, most: int) -> set[Cell]:
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
